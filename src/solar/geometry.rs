//! Geometric and astrometric positions from the ephemeris: barycentric states,
//! the Earth from the Earth–Moon barycentre, TDB from TT, light-time iteration.

use super::ephemeris::{Ephemeris, Series};
use super::{BodyId, SolarError};
use glam::DVec3;

/// Speed of light in AU per day (IAU 2012 AU, c = 299792.458 km/s).
pub const C_AU_DAY: f64 = 299_792.458 * 86_400.0 / super::AU_KM;

/// TDB − TT in days: the two leading periodic terms (Fairhead & Bretagnon 1990,
/// as in USNO Circular 179 eq. 2.6); error below 30 µs.
pub fn tdb_minus_tt_days(tt_jd: f64) -> f64 {
    let g = (357.53 + 0.985_600_28 * (tt_jd - 2_451_545.0)).to_radians();
    (0.001_657 * libm::sin(g) + 0.000_014 * libm::sin(2.0 * g)) / 86_400.0
}

/// TDB Julian date from a TT Julian date.
pub fn tdb_from_tt(tt_jd: f64) -> f64 {
    tt_jd + tdb_minus_tt_days(tt_jd)
}

/// Barycentric position (AU) and velocity (AU/day) of the Earth's centre at TDB:
/// EMB − Moon/(1 + EMRAT), as DE421 defines the Earth.
pub fn earth_barycentric(eph: &Ephemeris, tdb_jd: f64) -> Result<(DVec3, DVec3), SolarError> {
    let (pb, vb) = eph.state(Series::EarthMoonBarycentre, tdb_jd)?;
    let (pm, vm) = eph.state(Series::Moon, tdb_jd)?;
    let f = 1.0 / (1.0 + eph.emrat());
    Ok((pb - pm * f, vb - vm * f))
}

/// Barycentric position (AU) and velocity (AU/day) of a body at TDB. Mars to
/// Neptune are their system barycentres (DE421 holds no planet centres there;
/// Jupiter's centre is within ~250 km of its barycentre, < 0.1″ from Earth).
pub fn body_barycentric(eph: &Ephemeris, body: BodyId, tdb_jd: f64) -> Result<(DVec3, DVec3), SolarError> {
    let s = match body {
        BodyId::Moon => {
            let (pb, vb) = eph.state(Series::EarthMoonBarycentre, tdb_jd)?;
            let (pm, vm) = eph.state(Series::Moon, tdb_jd)?;
            let f = eph.emrat() / (1.0 + eph.emrat());
            return Ok((pb + pm * f, vb + vm * f));
        }
        BodyId::Sun => Series::Sun,
        BodyId::Mercury => Series::Mercury,
        BodyId::Venus => Series::Venus,
        BodyId::Mars => Series::Mars,
        BodyId::Jupiter => Series::Jupiter,
        BodyId::Saturn => Series::Saturn,
        BodyId::Uranus => Series::Uranus,
        BodyId::Neptune => Series::Neptune,
    };
    Ok(eph.state(s, tdb_jd)?)
}

/// Astrometric place: the body's barycentric position at the time light left it,
/// minus the observer's barycentric position at `tdb_jd` (iterated light time,
/// as in the Explanatory Supplement 1992 §3.32). Returns (vector AU, light time days).
pub fn astrometric(eph: &Ephemeris, body: BodyId, tdb_jd: f64, observer_bary_au: DVec3) -> Result<(DVec3, f64), SolarError> {
    let mut lt = 0.0;
    let mut v = DVec3::ZERO;
    for _ in 0..4 {
        let (p, _) = body_barycentric(eph, body, tdb_jd - lt)?;
        v = p - observer_bary_au;
        lt = v.length() / C_AU_DAY;
    }
    Ok((v, lt))
}

/// Astrometric (ICRF) position of a body seen from the Earth's centre at TT.
pub fn geocentric_astrometric(eph: &Ephemeris, body: BodyId, tt_jd: f64) -> Result<(DVec3, f64), SolarError> {
    if !tt_jd.is_finite() {
        return Err(SolarError::NotFinite { field: "tt_jd" });
    }
    let tdb = tdb_from_tt(tt_jd);
    let (e, _) = earth_barycentric(eph, tdb)?;
    astrometric(eph, body, tdb, e)
}

/// Right ascension (0..2π) and declination of a vector.
pub fn ra_dec_rad(v: DVec3) -> (f64, f64) {
    let r = v.length();
    let mut ra = libm::atan2(v.y, v.x);
    if ra < 0.0 {
        ra += 2.0 * core::f64::consts::PI;
    }
    (ra, libm::asin(v.z / r))
}
