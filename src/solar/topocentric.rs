//! Topocentric apparent places for a site and instant: the sky core's WGS84
//! site position (GAST rotation) and IAU 2006/2000B NPB matrix, fed into
//! `apparent.rs`; plus the body state and horizon coordinates built on them.

use super::apparent::{apparent_from_site_gcrs, Apparent};
use super::state::{body_state_from, BodyState};
use super::{BodyId, Ephemeris, SolarError};
use crate::sky::frames::npb_matrix;
use crate::sky::horizon::{observer_position_of_date_m, observer_velocity_of_date_m_s, to_horizontal};
use crate::sky::{Horizontal, Site};
use crate::time::Instant;
use glam::{DMat3, DVec3};

fn check(t: &Instant, site: &Site) -> Result<(), SolarError> {
    if !(t.tt_jd.is_finite() && t.ut1_jd.is_finite()) {
        return Err(SolarError::NotFinite { field: "instant" });
    }
    crate::sky::horizon::validate_site(site).map_err(|_| SolarError::BadSite)
}

/// The frame of one instant and site: NPB matrix and the site's GCRS position/velocity.
fn site_frame(t: &Instant, site: &Site) -> Result<(DMat3, DVec3, DVec3), SolarError> {
    check(t, site)?;
    let npb = npb_matrix(t.tt_jd);
    let m = npb.transpose();
    Ok((npb, m * observer_position_of_date_m(site, t), m * observer_velocity_of_date_m_s(site, t)))
}

/// Topocentric apparent place (true equator and equinox of date) of a body.
pub fn apparent_place(eph: &Ephemeris, body: BodyId, t: &Instant, site: &Site) -> Result<Apparent, SolarError> {
    let (npb, r, v) = site_frame(t, site)?;
    apparent_from_site_gcrs(eph, body, t.tt_jd, &npb, r, v)
}

/// A body's topocentric apparent place and physical ephemeris.
pub fn body_apparent(eph: &Ephemeris, body: BodyId, t: &Instant, site: &Site) -> Result<BodyState, SolarError> {
    let a = apparent_place(eph, body, t, site)?;
    let sun = if body == BodyId::Sun { a } else { apparent_place(eph, BodyId::Sun, t, site)? };
    Ok(body_state_from(body, &a, &sun))
}

/// All nine bodies at one instant (the Sun's place computed once).
pub fn all_bodies(eph: &Ephemeris, t: &Instant, site: &Site) -> Result<[BodyState; 9], SolarError> {
    let (npb, r, v) = site_frame(t, site)?;
    let sun = apparent_from_site_gcrs(eph, BodyId::Sun, t.tt_jd, &npb, r, v)?;
    let mut out = [body_state_from(BodyId::Sun, &sun, &sun); 9];
    for (o, b) in out.iter_mut().zip(BodyId::ALL).skip(1) {
        *o = body_state_from(b, &apparent_from_site_gcrs(eph, b, t.tt_jd, &npb, r, v)?, &sun);
    }
    Ok(out)
}

/// Altitude/azimuth of a body (geometric: no refraction).
pub fn body_horizontal(eph: &Ephemeris, body: BodyId, t: &Instant, site: &Site) -> Result<Horizontal, SolarError> {
    Ok(to_horizontal(apparent_place(eph, body, t, site)?.ra_dec, site, t))
}

/// All bodies every `step_minutes` from `start` for `hours` (e.g. a night in
/// 5-minute steps: the planner's track and the bench's workload).
pub fn night_track(eph: &Ephemeris, start: &Instant, site: &Site, step_minutes: f64, hours: f64) -> Result<Vec<[BodyState; 9]>, SolarError> {
    if !(step_minutes.is_finite() && hours.is_finite() && step_minutes >= 0.5 && hours >= 0.0 && hours <= 48.0) {
        return Err(SolarError::NotFinite { field: "night track step (≥ 0.5 min) or length (0–48 h)" });
    }
    let n = (hours * 60.0 / step_minutes).floor() as usize + 1;
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let d = i as f64 * step_minutes / 1440.0;
        // All three scales advance together (ΔT drifts < 1 ms in 48 h; a leap
        // second inside the track would shift only the UTC labels, by 1 s).
        let t = Instant { utc_jd: start.utc_jd + d, tt_jd: start.tt_jd + d, ut1_jd: start.ut1_jd + d };
        out.push(all_bodies(eph, &t, site)?);
    }
    Ok(out)
}

/// Galilean moons at an instant (geocentric; offsets barely depend on the site).
pub fn galilean_moons_at(eph: &Ephemeris, t: &Instant) -> Result<[super::jupiter::MoonOffset; 4], SolarError> {
    if !t.tt_jd.is_finite() {
        return Err(SolarError::NotFinite { field: "instant" });
    }
    super::jupiter::galilean_moons(eph, t.tt_jd, npb_matrix(t.tt_jd).row(2))
}

/// Saturn's ring geometry seen from a site.
pub fn saturn_rings_at(eph: &Ephemeris, t: &Instant, site: &Site) -> Result<super::saturn::RingGeometry, SolarError> {
    Ok(super::saturn::saturn_rings(&apparent_place(eph, BodyId::Saturn, t, site)?))
}

/// The Moon's libration, axis and colongitude seen from a site, with its phase name and age (days).
pub fn moon_at(eph: &Ephemeris, t: &Instant, site: &Site) -> Result<(super::moon::MoonFace, &'static str, f64), SolarError> {
    let face = super::moon::moon_face(&apparent_place(eph, BodyId::Moon, t, site)?);
    let (name, age) = super::moon::moon_phase(eph, t.tt_jd)?;
    Ok((face, name, age))
}

/// A Galilean-moon event with its UTC time.
#[derive(Clone, Copy, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct TimedMoonEvent {
    pub event: super::jupiter_events::MoonEvent,
    pub utc_jd: f64,
}

/// Galilean-moon events between two instants (at most 3 days), with UTC times
/// (TT − UTC taken from `start`; it does not change within a night).
pub fn jupiter_moon_events(eph: &Ephemeris, start: &Instant, end: &Instant) -> Result<Vec<TimedMoonEvent>, SolarError> {
    let off = start.tt_jd - start.utc_jd;
    Ok(super::jupiter_events::moon_events(eph, start.tt_jd, end.tt_jd)?
        .into_iter()
        .map(|event| TimedMoonEvent { event, utc_jd: event.tt_jd - off })
        .collect())
}

/// UTC Julian dates when a System II longitude (the Great Red Spot's, set by
/// the user) crosses Jupiter's central meridian between two instants.
pub fn red_spot_transits_utc(eph: &Ephemeris, start: &Instant, end: &Instant, grs_lon_ii_rad: f64) -> Result<Vec<f64>, SolarError> {
    let off = start.tt_jd - start.utc_jd;
    Ok(super::jupiter::grs_transits_tt(eph, start.tt_jd, end.tt_jd, grs_lon_ii_rad)?.into_iter().map(|t| t - off).collect())
}
