//! One body as a public night sees it: the apparent place plus its physical
//! ephemeris, in one value for the scene, the plan and the panels.

use super::apparent::Apparent;
use super::physical::{bright_limb_pa_rad, diameter_arcsec, illuminated_fraction, phase_angle_rad, visual_magnitude};
use super::BodyId;
use crate::sky::Equatorial;
use serde::{Deserialize, Serialize};

/// A body's topocentric apparent place (true equator and equinox of date) and
/// its look: size, phase, bright-limb direction and brightness.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct BodyState {
    pub body: BodyId,
    pub topocentric: Equatorial,
    pub distance_au: f64,
    pub light_time_days: f64,
    pub diameter_arcsec: f64,
    /// Sun–body–observer angle (0 for the Sun itself).
    pub phase_angle_rad: f64,
    pub illuminated_fraction: f64,
    /// Position angle of the bright limb's midpoint, from north through east.
    pub bright_limb_pa_rad: f64,
    pub vmag: f64,
    /// Angular distance from the Sun as seen by the observer.
    pub elongation_rad: f64,
}

/// Assemble a body's state from its apparent place and the Sun's (same observer, same instant).
pub fn body_state_from(body: BodyId, a: &Apparent, sun: &Apparent) -> BodyState {
    let (phase, limb) = if body == BodyId::Sun { (0.0, 0.0) } else { (phase_angle_rad(a), bright_limb_pa_rad(a, sun)) };
    let c = a.dir_gcrs.cross(sun.dir_gcrs).length();
    BodyState {
        body,
        topocentric: a.ra_dec,
        distance_au: a.distance_au(),
        light_time_days: a.light_time_days,
        diameter_arcsec: diameter_arcsec(body, a.distance_au()),
        phase_angle_rad: phase,
        illuminated_fraction: illuminated_fraction(phase),
        bright_limb_pa_rad: limb,
        vmag: visual_magnitude(body, a),
        elongation_rad: libm::atan2(c, a.dir_gcrs.dot(sun.dir_gcrs)),
    }
}
