//! Rise, culmination and set of the Sun, the Moon and the planets through the
//! sky core's root finder (`sky::riseset`), on topocentric apparent altitudes.
//! Horizons (common practice, as almanacs use): the Sun's centre at −50′, the
//! Moon's centre at −34′ minus its topocentric semidiameter, planets at −34′.

use super::topocentric::apparent_place;
use super::physical::radius_km;
use super::{BodyId, Ephemeris, SolarError, AU_KM};
use crate::sky::horizon::to_horizontal;
use crate::sky::riseset::{rise_transit_set, RiseSetError, RiseTransitSet, STAR_HORIZON_RAD, SUNRISE_HORIZON_RAD};
use crate::sky::Site;
use crate::time::Instant;

/// Altitude of the body's centre above its rise/set horizon, rad (NaN when the
/// instant cannot be built or is outside the ephemeris).
fn alt_above_horizon(eph: &Ephemeris, body: BodyId, site: &Site, utc_jd: f64) -> f64 {
    let Ok(t) = Instant::from_utc_jd(utc_jd) else { return f64::NAN };
    let Ok(a) = apparent_place(eph, body, &t, site) else { return f64::NAN };
    let alt = to_horizontal(a.ra_dec, site, &t).alt_rad;
    let horizon = match body {
        BodyId::Sun => SUNRISE_HORIZON_RAD,
        BodyId::Moon => STAR_HORIZON_RAD - libm::asin(radius_km(BodyId::Moon) / (a.distance_au() * AU_KM)),
        _ => STAR_HORIZON_RAD,
    };
    alt - horizon
}

/// Rise, culmination and set between two UTC Julian dates (at most 40 days).
pub fn body_rise_transit_set(
    eph: &Ephemeris,
    body: BodyId,
    site: &Site,
    start_utc_jd: f64,
    end_utc_jd: f64,
) -> Result<RiseTransitSet, SolarError> {
    for jd in [start_utc_jd, end_utc_jd] {
        if !jd.is_finite() {
            return Err(SolarError::NotFinite { field: "rise/set window" });
        }
        // A clear coverage error before the root finder sees NaN.
        let t = Instant::from_utc_jd(jd).map_err(|_| SolarError::Window { start_utc_jd, end_utc_jd })?;
        if !(t.tt_jd >= eph.start_jd() && t.tt_jd <= eph.end_jd()) {
            return Err(SolarError::OutOfCoverage { tt_jd: t.tt_jd, start_jd: eph.start_jd(), end_jd: eph.end_jd() });
        }
    }
    rise_transit_set(|t| alt_above_horizon(eph, body, site, t), start_utc_jd, end_utc_jd, 0.0).map_err(|e| match e {
        RiseSetError::Site(_) => SolarError::BadSite,
        _ => SolarError::Window { start_utc_jd, end_utc_jd },
    })
}
