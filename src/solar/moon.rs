//! The Moon for the eyepiece: optical libration, the position angle of its
//! axis, the selenographic colongitude of the Sun (Meeus 1998 ch. 53, optical
//! part, in vector form with the IAU 2006 mean ecliptic of date), the age since
//! new moon and the phase name.

use super::apparent::Apparent;
use super::geometry::geocentric_astrometric;
use super::physical::position_angle_rad;
use super::{BodyId, Ephemeris, SolarError};
use crate::sky::frames::{bp_matrix, mean_obliquity_rad};
use glam::DVec3;
use serde::{Deserialize, Serialize};

/// Inclination of the mean lunar equator to the ecliptic (Meeus 1998 ch. 53).
const I_RAD: f64 = 1.542_42 * core::f64::consts::PI / 180.0;
const TAU: f64 = 2.0 * core::f64::consts::PI;
/// Mean synodic month, days (common practice).
pub const SYNODIC_MONTH_DAYS: f64 = 29.530_589;

/// What the Moon shows tonight.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MoonFace {
    /// Optical libration in longitude (+ east limb turned toward us) and latitude (+ north).
    pub libration_lon_rad: f64,
    pub libration_lat_rad: f64,
    /// Position angle of the Moon's north pole, from celestial north of date through east.
    pub axis_pa_rad: f64,
    /// Selenographic colongitude of the Sun (0 ≈ first quarter, 90° full, 180° last quarter).
    pub colongitude_rad: f64,
    /// Selenographic latitude of the subsolar point.
    pub subsolar_lat_rad: f64,
}

/// Mean longitude of the ascending node Ω and argument of latitude F, rad
/// (Meeus 1998 eqs. 47.7 and 47.5).
fn node_and_f_rad(tdb_jd: f64) -> (f64, f64) {
    let t = (tdb_jd - 2_451_545.0) / 36_525.0;
    let om = 125.044_547_9 - 1_934.136_289_1 * t + 0.002_075_4 * t * t + t * t * t / 467_441.0;
    let f = 93.272_095_0 + 483_202.017_523_3 * t - 0.003_653_9 * t * t - t * t * t / 3_526_000.0;
    (crate::math::rem_euclid(om.to_radians(), TAU), crate::math::rem_euclid(f.to_radians(), TAU))
}

fn to_ecliptic_of_date(v_gcrs: DVec3, tt_jd: f64) -> DVec3 {
    let m = bp_matrix(tt_jd) * v_gcrs;
    let (s, c) = libm::sincos(mean_obliquity_rad(tt_jd));
    DVec3::new(m.x, c * m.y + s * m.z, -s * m.y + c * m.z)
}

fn from_ecliptic_of_date(v: DVec3, tt_jd: f64) -> DVec3 {
    let (s, c) = libm::sincos(mean_obliquity_rad(tt_jd));
    let m = DVec3::new(v.x, c * v.y - s * v.z, s * v.y + c * v.z);
    bp_matrix(tt_jd).transpose() * m
}

/// Selenographic longitude/latitude of the point facing `from_toward_moon`'s
/// origin (Meeus eqs. 53.1, optical libration), direction in the ecliptic of date.
fn selenographic(u_ecl: DVec3, om: f64, f: f64) -> (f64, f64) {
    let lam = libm::atan2(u_ecl.y, u_ecl.x);
    let beta = libm::asin(u_ecl.z.clamp(-1.0, 1.0));
    let w = lam - om;
    let (sw, cw) = libm::sincos(w);
    let (sb, cb) = libm::sincos(beta);
    let (si, ci) = libm::sincos(I_RAD);
    let a = libm::atan2(sw * cb * ci - sb * si, cw * cb);
    let l = crate::math::rem_euclid(a - f + core::f64::consts::PI, TAU) - core::f64::consts::PI;
    let b = libm::asin((-sw * cb * si - sb * ci).clamp(-1.0, 1.0));
    (l, b)
}

/// Libration, axis and colongitude from the Moon's apparent place (any observer:
/// topocentric libration differs from geocentric by up to ~1°).
pub fn moon_face(moon: &Apparent) -> MoonFace {
    let tt = moon.tdb_jd; // TT vs TDB: < 2 ms, irrelevant here
    let (om, f) = node_and_f_rad(moon.tdb_jd - moon.light_time_days);
    let u = to_ecliptic_of_date(moon.astrometric_au.normalize(), tt);
    let (l, b) = selenographic(u, om, f);
    let h = to_ecliptic_of_date(moon.heliocentric_au.normalize(), tt);
    let (l0, b0) = selenographic(h, om, f);
    // Mean lunar pole in the ecliptic of date (Cassini: equator node at Ω + 180°).
    let (so, co) = libm::sincos(om);
    let (si, ci) = libm::sincos(I_RAD);
    let pole = from_ecliptic_of_date(DVec3::new(-si * so, si * co, ci), tt);
    MoonFace {
        libration_lon_rad: l,
        libration_lat_rad: b,
        axis_pa_rad: position_angle_rad(moon.dir_gcrs, pole, moon.pole_of_date()),
        colongitude_rad: crate::math::rem_euclid(core::f64::consts::FRAC_PI_2 - l0, TAU),
        subsolar_lat_rad: b0,
    }
}

/// Geocentric elongation of the Moon from the Sun in ecliptic longitude, 0..2π.
fn elongation_lon_rad(eph: &Ephemeris, tt_jd: f64) -> Result<f64, SolarError> {
    let (m, _) = geocentric_astrometric(eph, BodyId::Moon, tt_jd)?;
    let (s, _) = geocentric_astrometric(eph, BodyId::Sun, tt_jd)?;
    let (m, s) = (to_ecliptic_of_date(m, tt_jd), to_ecliptic_of_date(s, tt_jd));
    Ok(crate::math::rem_euclid(libm::atan2(m.y, m.x) - libm::atan2(s.y, s.x), TAU))
}

/// Age of the Moon, days since the last new moon (geocentric conjunction in
/// ecliptic longitude, found by Newton iteration on the DE421 fits).
pub fn moon_age_days(eph: &Ephemeris, tt_jd: f64) -> Result<f64, SolarError> {
    let rate = TAU / SYNODIC_MONTH_DAYS;
    let mut t = tt_jd - elongation_lon_rad(eph, tt_jd)? / rate;
    for _ in 0..5 {
        let d = elongation_lon_rad(eph, t)?;
        let d = if d > core::f64::consts::PI { d - TAU } else { d };
        t -= d / rate;
        if d.abs() < 1e-7 {
            break;
        }
    }
    // The iteration may land on the following new moon for a Moon just before new.
    if t > tt_jd {
        t -= SYNODIC_MONTH_DAYS;
    }
    Ok(tt_jd - t)
}

/// The eight phase names (common practice), by elongation bins of 45° centred on 0°, 90°, 180°, 270°.
pub fn phase_name(elongation_lon_rad: f64) -> &'static str {
    const NAMES: [&str; 8] = [
        "new moon",
        "waxing crescent",
        "first quarter",
        "waxing gibbous",
        "full moon",
        "waning gibbous",
        "last quarter",
        "waning crescent",
    ];
    let k = ((crate::math::rem_euclid(elongation_lon_rad, TAU) / TAU * 8.0 + 0.5) as usize) % 8;
    NAMES[k]
}

/// Phase name and age (days) of the Moon at TT.
pub fn moon_phase(eph: &Ephemeris, tt_jd: f64) -> Result<(&'static str, f64), SolarError> {
    Ok((phase_name(elongation_lon_rad(eph, tt_jd)?), moon_age_days(eph, tt_jd)?))
}
