//! Saturn's rings as seen from the observer: tilt toward the Earth (B) and the
//! Sun (B′) and the position angle of the ring axis, from the IAU pole of
//! Saturn (Archinal et al. 2018) and the DE421 geometry (the method of Meeus
//! 1998 ch. 45 with vectors: the ring plane is Saturn's equator).

use super::apparent::Apparent;
use super::physical::{pole_icrf, position_angle_rad, sub_latitude_rad};
use super::{BodyId, AU_KM};
use glam::DVec3;
use serde::{Deserialize, Serialize};

/// Outer edge of the A ring, km (common practice: 136,780 km).
pub const RING_A_OUTER_KM: f64 = 136_780.0;

/// The apparent ring ellipse.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct RingGeometry {
    /// Saturnicentric latitude of the observer above the ring plane; + means the
    /// north face of the rings is seen.
    pub earth_tilt_rad: f64,
    /// Saturnicentric latitude of the Sun (the lit face is north when +).
    pub sun_tilt_rad: f64,
    /// Position angle of Saturn's north pole (the ring's minor axis), from
    /// celestial north of date through east.
    pub axis_pa_rad: f64,
    /// Outer A ring: major and minor axes, arcsec.
    pub major_axis_arcsec: f64,
    pub minor_axis_arcsec: f64,
}

/// Ring geometry from Saturn's apparent place (any observer).
pub fn saturn_rings(saturn: &Apparent) -> RingGeometry {
    let pole = pole_icrf(BodyId::Saturn, saturn.tdb_jd - saturn.light_time_days).unwrap_or(DVec3::Z);
    let b = sub_latitude_rad(pole, -saturn.astrometric_au);
    let bs = sub_latitude_rad(pole, -saturn.heliocentric_au);
    let p = position_angle_rad(saturn.dir_gcrs, pole, saturn.pole_of_date());
    let major = 2.0 * libm::atan(RING_A_OUTER_KM / (saturn.distance_au() * AU_KM)).to_degrees() * 3600.0;
    RingGeometry {
        earth_tilt_rad: b,
        sun_tilt_rad: bs,
        axis_pa_rad: p,
        major_axis_arcsec: major,
        minor_axis_arcsec: major * libm::sin(b).abs(),
    }
}
