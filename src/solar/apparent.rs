//! Apparent topocentric places: light time, gravitational deflection by the
//! Sun, Jupiter and Saturn, annual + diurnal aberration, then the sky core's
//! GCRS → true-equator-and-equinox-of-date matrix (IAU 2006/2000B).

use super::ephemeris::AU_KM;
use super::geometry::{astrometric, body_barycentric, earth_barycentric, ra_dec_rad, tdb_from_tt, C_AU_DAY};
use super::{BodyId, SolarError};
use crate::sky::Equatorial;
use glam::{DMat3, DVec3};

const AU_M: f64 = AU_KM * 1000.0;
/// Earth rotation rate, rad/s (IERS Conventions 2010, nominal).
const EARTH_OMEGA_RAD_S: f64 = 7.292_115_146_706_979e-5;
/// Schwarzschild radius of the Sun, 2GM/c², in AU (IAU 2015 nominal GM).
const SUN_SRS_AU: f64 = 1.974_125_743_36e-8;

/// An apparent place and the geometry the physical ephemeris needs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Apparent {
    /// Apparent RA/Dec, true equator and equinox of date.
    pub ra_dec: Equatorial,
    /// Apparent direction, unit vector, GCRS axes.
    pub dir_gcrs: DVec3,
    /// Observer → body at the light-emission time, ICRF, AU (no aberration).
    pub astrometric_au: DVec3,
    /// Sun → body at the light-emission time, ICRF, AU.
    pub heliocentric_au: DVec3,
    pub light_time_days: f64,
    /// TDB of observation.
    pub tdb_jd: f64,
    /// GCRS → true-of-date matrix used (row 3 is the celestial pole of date).
    pub npb: DMat3,
}

impl Apparent {
    /// Observer → body distance at the light-emission time, AU.
    pub fn distance_au(&self) -> f64 {
        self.astrometric_au.length()
    }
    /// The true celestial pole of date as an ICRF/GCRS unit vector.
    pub fn pole_of_date(&self) -> DVec3 {
        self.npb.row(2)
    }
}

/// Relativistic light deflection by one mass (IERS Conventions / Kaplan et al.
/// 1989 form, as in NOVAS grav_vec): `p` observer→body, `pe` deflector→observer, AU.
fn deflection(p: DVec3, pe: DVec3, reciprocal_mass: f64) -> DVec3 {
    let pmag = p.length();
    let q = p + pe;
    let (qmag, emag) = (q.length(), pe.length());
    if pmag == 0.0 || qmag == 0.0 || emag == 0.0 {
        return DVec3::ZERO;
    }
    let (ph, qh, eh) = (p / pmag, q / qmag, pe / emag);
    let (pdq, qde, edp) = (ph.dot(qh), qh.dot(eh), eh.dot(ph));
    // The deflector is the target, or exactly in line with it: no deflection.
    if edp.abs() > 0.999_999_999_99 {
        return DVec3::ZERO;
    }
    let fac1 = SUN_SRS_AU / (emag * reciprocal_mass);
    (eh * pdq - qh * edp) * (fac1 / (1.0 + qde) * pmag)
}

/// Aberration of light for an observer moving at `v_au_day` (special-relativistic
/// form, Kaplan et al. 1989 / NOVAS aberration), `p` observer→body AU.
fn aberration(p: DVec3, v_au_day: DVec3, light_time_days: f64) -> DVec3 {
    let p1mag = light_time_days * C_AU_DAY;
    let vemag = v_au_day.length();
    if p1mag == 0.0 || vemag == 0.0 {
        return p;
    }
    let beta = vemag / C_AU_DAY;
    let cosd = p.dot(v_au_day) / (p1mag * vemag);
    let gammai = (1.0 - beta * beta).sqrt();
    let pp = beta * cosd;
    let q = (1.0 + pp / (1.0 + gammai)) * light_time_days;
    (p * gammai + v_au_day * q) / (1.0 + pp)
}

/// Apparent place of `body` from an observer at `site_gcrs_m` (metres from the
/// geocentre, GCRS) moving at `site_gcrs_m_s` relative to the geocentre, at TT
/// `tt_jd`, with `npb` the GCRS → true-of-date matrix for that TT.
pub fn apparent_from_site_gcrs(
    eph: &super::Ephemeris,
    body: BodyId,
    tt_jd: f64,
    npb: &DMat3,
    site_gcrs_m: DVec3,
    site_gcrs_m_s: DVec3,
) -> Result<Apparent, SolarError> {
    if !tt_jd.is_finite() {
        return Err(SolarError::NotFinite { field: "tt_jd" });
    }
    let tdb = tdb_from_tt(tt_jd);
    let (pe, ve) = earth_barycentric(eph, tdb)?;
    let obs = pe + site_gcrs_m / AU_M;
    let obs_v = ve + site_gcrs_m_s * (86_400.0 / AU_M);
    let (ast, lt) = astrometric(eph, body, tdb, obs)?;
    let (sun, _) = body_barycentric(eph, BodyId::Sun, tdb - lt)?;
    let (body_bary, _) = body_barycentric(eph, body, tdb - lt)?;
    let mut p = ast;
    // Deflectors at the observation time: their motion during the light's
    // passage shifts the deflection by far less than 0.001″ here.
    for (d, rm) in [(BodyId::Sun, 1.0), (BodyId::Jupiter, 1_047.348_6), (BodyId::Saturn, 3_497.898)] {
        let (dp, _) = body_barycentric(eph, d, tdb)?;
        p += deflection(p, obs - dp, rm);
    }
    let p = aberration(p, obs_v, lt);
    let dir = p.normalize();
    let (ra, dec) = ra_dec_rad(*npb * dir);
    Ok(Apparent {
        ra_dec: Equatorial { ra_rad: ra, dec_rad: dec },
        dir_gcrs: dir,
        astrometric_au: ast,
        heliocentric_au: body_bary - sun,
        light_time_days: lt,
        tdb_jd: tdb,
        npb: *npb,
    })
}

/// Site position (m) and velocity (m/s) in the GCRS from its true-of-date
/// position: v = ω ẑ × r (Earth rotation), both rotated by npbᵀ.
pub fn site_gcrs_from_of_date(npb: &DMat3, site_of_date_m: DVec3) -> (DVec3, DVec3) {
    let r = site_of_date_m;
    let v = DVec3::new(-EARTH_OMEGA_RAD_S * r.y, EARTH_OMEGA_RAD_S * r.x, 0.0);
    let t = npb.transpose();
    (t * r, t * v)
}
