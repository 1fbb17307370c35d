//! Apparent place of a catalog star: space motion and parallax to the date
//! (ERFA `eraPmpx`), light deflection by the Sun (ERFA `eraLd`/`eraLdsun`),
//! relativistic annual (+ optional diurnal) aberration (ERFA `eraAb`), then the
//! IAU 2006/2000B NPB matrix → right ascension and declination of the true
//! equator and equinox of date. Same chain as ERFA's `eraAtciq` but equinox-based.

use glam::{DMat3, DVec3};

use crate::sky::earth_ephem::{earth_state, EarthState};
use crate::sky::frames::{npb_matrix, ra_dec_of, unit_vector, ARCSEC_RAD};
use crate::sky::horizon::observer_velocity_of_date_m_s;
use crate::sky::{Equatorial, Site};
use crate::time::Instant;

/// Astronomical unit, metres (IAU 2012).
pub const AU_M: f64 = 149_597_870_700.0;
/// Speed of light, AU per day.
pub const C_AU_DAY: f64 = 299_792_458.0 * 86_400.0 / AU_M;
/// Schwarzschild radius of the Sun, AU (ERFA `ERFA_SRS`).
pub const SUN_SCHWARZSCHILD_AU: f64 = 1.974_125_743_36e-8;
const JULIAN_YEAR_DAYS: f64 = 365.25;

/// A star's catalog place and space motion at the catalog's epoch (ICRS).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CatalogPlace {
    pub ra_rad: f64,
    pub dec_rad: f64,
    /// Proper motion in right ascension times cos δ, mas per Julian year.
    pub pm_ra_cosdec_mas_yr: f64,
    pub pm_dec_mas_yr: f64,
    /// Parallax, mas (0 or negative: treated as very distant, no parallax).
    pub parallax_mas: f64,
    /// Radial velocity, km/s (0 when unknown).
    pub rv_km_s: f64,
}

impl From<&crate::sky::catalog::Star> for CatalogPlace {
    /// A catalog-file star (no radial velocity carried: 0). Gaia-tier stars carry no
    /// proper motion or parallax, so their place is the J2016 one: typical G < 10 proper
    /// motions of 10–50 mas/yr leave ~0.1–0.7″ by 2030 (the bar that allows).
    fn from(s: &crate::sky::catalog::Star) -> Self {
        CatalogPlace {
            ra_rad: s.ra_rad,
            dec_rad: s.dec_rad,
            pm_ra_cosdec_mas_yr: s.pm_ra_cosdec_mas_yr as f64,
            pm_dec_mas_yr: s.pm_dec_mas_yr as f64,
            parallax_mas: s.parallax_mas as f64,
            rv_km_s: 0.0,
        }
    }
}

/// Julian epoch (e.g. 1991.25) → TT Julian date.
pub fn jyear_to_jd(epoch_jyear: f64) -> f64 {
    crate::time::J2000_JD + (epoch_jyear - 2000.0) * JULIAN_YEAR_DAYS
}

/// Space motion and parallax: BCRS coordinate direction of the star seen from an
/// observer at barycentric position `observer_bary_au`, at `tt_jd` (ERFA `eraPmpx`,
/// linear space motion with the Rømer light-time term).
pub fn astrometric_direction(place: &CatalogPlace, epoch_jyear: f64, tt_jd: f64, observer_bary_au: DVec3) -> DVec3 {
    const VF: f64 = 86_400.0 * 365_250.0 / AU_M; // km/s → AU/yr (with the parallax in rad)
    const AULTY: f64 = AU_M / 299_792_458.0 / 86_400.0 / JULIAN_YEAR_DAYS;
    let p0 = unit_vector(place.ra_rad, place.dec_rad);
    let pmt = (tt_jd - jyear_to_jd(epoch_jyear)) / JULIAN_YEAR_DAYS;
    let dt = pmt + p0.dot(observer_bary_au) * AULTY;
    let pxr = place.parallax_mas.max(0.0) * 1e-3 * ARCSEC_RAD;
    let cd = libm::cos(place.dec_rad);
    let pr = if cd.abs() > 1e-12 { place.pm_ra_cosdec_mas_yr * 1e-3 * ARCSEC_RAD / cd } else { 0.0 };
    let pd = place.pm_dec_mas_yr * 1e-3 * ARCSEC_RAD;
    let w = VF * place.rv_km_s * pxr;
    let (sr, cr) = libm::sincos(place.ra_rad);
    let pdz = pd * p0.z;
    let pm = DVec3::new(-pr * p0.y - pdz * cr + w * p0.x, pr * p0.x - pdz * sr + w * p0.y, pd * cd + w * p0.z);
    (p0 + dt * pm - pxr * observer_bary_au).normalize()
}

/// Light deflection by the Sun (ERFA `eraLd`, bm = 1 solar mass): `p` unit vector
/// observer→source, `q` unit vector Sun→source,
/// `e` unit vector Sun→observer, `em_au` Sun–observer distance, `dlim` limiter.
pub fn deflect_by_sun(p: DVec3, q: DVec3, e: DVec3, em_au: f64, dlim: f64) -> DVec3 {
    let qdqpe = q.dot(q + e);
    let w = SUN_SCHWARZSCHILD_AU / em_au / qdqpe.max(dlim);
    p + w * p.cross(e.cross(q))
}

/// Relativistic aberration (ERFA `eraAb`): natural direction `p` (unit), observer's
/// barycentric velocity in AU/day, Sun–observer distance in AU → proper direction.
pub fn aberrate(p: DVec3, v_au_day: DVec3, sun_dist_au: f64) -> DVec3 {
    let v = v_au_day / C_AU_DAY;
    let bm1 = (1.0 - v.length_squared()).sqrt();
    let pdv = p.dot(v);
    let w1 = 1.0 + pdv / (1.0 + bm1);
    let w2 = SUN_SCHWARZSCHILD_AU / sun_dist_au;
    (p * bm1 + w1 * v + w2 * (v - pdv * p)).normalize()
}

/// Astrometric (BCRS/GCRS-axes) direction → apparent direction in the true equator
/// and equinox of date: solar light deflection (`source_from_sun` = unit Sun→source,
/// None for a star at infinity), aberration with Earth's barycentric velocity plus
/// `extra_vel_au_day` (observer's diurnal velocity in GCRS axes, or zero), then NPB.
/// For the solar-system module: pass its own Earth state and source geometry.
pub fn apparent_direction(
    astrometric: DVec3,
    source_from_sun: Option<DVec3>,
    earth: &EarthState,
    extra_vel_au_day: DVec3,
    tt_jd: f64,
) -> DVec3 {
    apparent_with(astrometric, source_from_sun, earth, extra_vel_au_day, &npb_matrix(tt_jd))
}

fn apparent_with(astrometric: DVec3, source_from_sun: Option<DVec3>, earth: &EarthState, extra_vel_au_day: DVec3, npb: &DMat3) -> DVec3 {
    let p = astrometric.normalize();
    let em = earth.helio_pos_au.length();
    let e = earth.helio_pos_au / em;
    let dlim = 1e-6 / (em * em).max(1.0); // ERFA eraLdsun limiter
    let q = source_from_sun.unwrap_or(p);
    let deflected = deflect_by_sun(p, q, e, em, dlim).normalize();
    let aberrated = aberrate(deflected, earth.bary_vel_au_day + extra_vel_au_day, em);
    *npb * aberrated
}

/// A GCRS astrometric direction of a distant source → apparent direction of date
/// (deflection + annual aberration + NPB), Earth state from the truncated EPV00.
pub fn gcrs_to_apparent(dir_gcrs: DVec3, tt_jd: f64) -> DVec3 {
    apparent_direction(dir_gcrs, None, &earth_state(tt_jd), DVec3::ZERO, tt_jd)
}

/// Everything the apparent-place chain needs at one instant (and optionally one site),
/// computed once: use it to place many stars (a field of thousands) cheaply.
#[derive(Clone, Copy, Debug)]
pub struct ApparentContext {
    pub tt_jd: f64,
    /// Observer's state: Earth's, shifted by the site's geocentric offset when at a site.
    pub observer: EarthState,
    /// Observer's diurnal velocity, GCRS axes, AU/day (zero when geocentric).
    pub diurnal_vel_au_day: DVec3,
    /// GCRS → true equator and equinox of date.
    pub npb: DMat3,
}

impl ApparentContext {
    /// Geocentric observer.
    pub fn geocentric(t: &Instant) -> Self {
        ApparentContext { tt_jd: t.tt_jd, observer: earth_state(t.tt_jd), diurnal_vel_au_day: DVec3::ZERO, npb: npb_matrix(t.tt_jd) }
    }

    /// Observer at a site: adds the geocentric offset (parallax) and diurnal aberration
    /// (≤ 0.32″), as ERFA `eraAtco13` does before refraction.
    pub fn at_site(t: &Instant, site: &Site) -> Self {
        let npb = npb_matrix(t.tt_jd);
        let to_gcrs = npb.transpose();
        let obs_pos_au = to_gcrs * crate::sky::horizon::observer_position_of_date_m(site, t) / AU_M;
        let diurnal = to_gcrs * observer_velocity_of_date_m_s(site, t) * 86_400.0 / AU_M;
        let mut observer = earth_state(t.tt_jd);
        observer.helio_pos_au += obs_pos_au;
        observer.bary_pos_au += obs_pos_au;
        ApparentContext { tt_jd: t.tt_jd, observer, diurnal_vel_au_day: diurnal, npb }
    }

    /// Apparent place (true equator and equinox of date) of a catalog star.
    pub fn place(&self, p: &CatalogPlace, epoch_jyear: f64) -> Equatorial {
        let dir = astrometric_direction(p, epoch_jyear, self.tt_jd, self.observer.bary_pos_au);
        let (ra_rad, dec_rad) = ra_dec_of(self.direction(dir));
        Equatorial { ra_rad, dec_rad }
    }

    /// Apparent direction of date of a distant source's astrometric (GCRS-axes) direction.
    pub fn direction(&self, astrometric: DVec3) -> DVec3 {
        apparent_with(astrometric, None, &self.observer, self.diurnal_vel_au_day, &self.npb)
    }
}

/// Geocentric apparent place of a catalog star (true equator and equinox of date).
pub fn star_apparent(place: &CatalogPlace, epoch_jyear: f64, t: &Instant) -> Equatorial {
    ApparentContext::geocentric(t).place(place, epoch_jyear)
}

/// Topocentric apparent place of a catalog star at a site (adds the observer's
/// geocentric offset to the parallax and diurnal aberration, ≤ 0.32″; as ERFA
/// `eraAtco13` does before refraction).
pub fn star_apparent_at_site(place: &CatalogPlace, epoch_jyear: f64, t: &Instant, site: &Site) -> Equatorial {
    ApparentContext::at_site(t, site).place(place, epoch_jyear)
}
