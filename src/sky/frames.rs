//! Celestial frames: IAU 2006 precession (Fukushima–Williams angles) + IAU 2000B
//! nutation → the NPB matrix from GCRS to the true equator and equinox of date;
//! mean obliquity; equation of the equinoxes. Ports of ERFA `eraPfw06`, `eraObl06`,
//! `eraFw2m`, `eraPn06` (ERFA is BSD-licensed, derived from IAU SOFA).
//!
//! Matrices act on column vectors: `v_date = npb_matrix(tt) * v_gcrs`.

use glam::{DMat3, DVec3};

pub use crate::sky::earth_ephem::{earth_state, earth_velocity_au_day, EarthState};
pub use crate::sky::nutation::{ee_complementary_rad, nutation_2000b_rad};

/// One arcsecond in radians.
pub const ARCSEC_RAD: f64 = std::f64::consts::PI / 648_000.0;

fn centuries(tt_jd: f64) -> f64 {
    (tt_jd - crate::time::J2000_JD) / crate::time::DAYS_PER_CENTURY
}

/// Mean obliquity of the ecliptic, IAU 2006 (Hilton et al. 2006; ERFA `eraObl06`).
pub fn mean_obliquity_rad(tt_jd: f64) -> f64 {
    let t = centuries(tt_jd);
    (84381.406 + t * (-46.836769 + t * (-0.0001831 + t * (0.00200340 + t * (-0.000000576 - 0.0000000434 * t)))))
        * ARCSEC_RAD
}

/// Fukushima–Williams bias+precession angles (γ̄, φ̄, ψ̄, ε_A), IAU 2006
/// (Capitaine et al. 2003 P03; ERFA `eraPfw06`), radians.
pub fn fw_angles_rad(tt_jd: f64) -> (f64, f64, f64, f64) {
    let t = centuries(tt_jd);
    let gamb = -0.052928 + t * (10.556378 + t * (0.4932044 + t * (-0.00031238 + t * (-0.000002788 + 0.0000000260 * t))));
    let phib = 84381.412819 + t * (-46.811016 + t * (0.0511268 + t * (0.00053289 + t * (-0.000000440 - 0.0000000176 * t))));
    let psib = -0.041775 + t * (5038.481484 + t * (1.5584175 + t * (-0.00018522 + t * (-0.000026452 - 0.0000000148 * t))));
    (gamb * ARCSEC_RAD, phib * ARCSEC_RAD, psib * ARCSEC_RAD, mean_obliquity_rad(tt_jd))
}

/// Build a matrix from its rows.
fn rows(r: [[f64; 3]; 3]) -> DMat3 {
    DMat3::from_cols_array_2d(&r).transpose()
}

/// ERFA-style frame rotation about x (rotates the frame by +a).
pub fn rot_x(a: f64) -> DMat3 {
    let (s, c) = libm::sincos(a);
    rows([[1.0, 0.0, 0.0], [0.0, c, s], [0.0, -s, c]])
}

/// ERFA-style frame rotation about z (rotates the frame by +a).
pub fn rot_z(a: f64) -> DMat3 {
    let (s, c) = libm::sincos(a);
    rows([[c, s, 0.0], [-s, c, 0.0], [0.0, 0.0, 1.0]])
}

/// Fukushima–Williams angles → rotation matrix (ERFA `eraFw2m`):
/// R = Rx(−ε)·Rz(−ψ)·Rx(φ)·Rz(γ).
pub fn fw_to_matrix(gamb: f64, phib: f64, psi: f64, eps: f64) -> DMat3 {
    rot_x(-eps) * rot_z(-psi) * rot_x(phib) * rot_z(gamb)
}

/// Bias-precession matrix GCRS → mean equator and equinox of date, IAU 2006.
pub fn bp_matrix(tt_jd: f64) -> DMat3 {
    let (g, p, s, e) = fw_angles_rad(tt_jd);
    fw_to_matrix(g, p, s, e)
}

/// NPB matrix GCRS → true equator and equinox of date: IAU 2006 precession
/// (Fukushima–Williams) with IAU 2000B nutation (as ERFA `eraPn06` fed by `eraNut00b`).
pub fn npb_matrix(tt_jd: f64) -> DMat3 {
    let (g, p, s, e) = fw_angles_rad(tt_jd);
    let (dpsi, deps) = nutation_2000b_rad(tt_jd);
    fw_to_matrix(g, p, s + dpsi, e + deps)
}

/// Equation of the equinoxes (GAST − GMST), radians: Δψ(2000B)·cos ε_A(2006)
/// plus the complementary terms (ERFA `eraEe00` + `eraEect00` structure).
pub fn equation_of_equinoxes_rad(tt_jd: f64) -> f64 {
    let (dpsi, _) = nutation_2000b_rad(tt_jd);
    dpsi * libm::cos(mean_obliquity_rad(tt_jd)) + ee_complementary_rad(tt_jd)
}

/// Unit vector of a right ascension and declination.
pub fn unit_vector(ra_rad: f64, dec_rad: f64) -> DVec3 {
    let (sd, cd) = libm::sincos(dec_rad);
    let (sr, cr) = libm::sincos(ra_rad);
    DVec3::new(cd * cr, cd * sr, sd)
}

/// Right ascension in [0, 2π) and declination of a (not necessarily unit) vector.
pub fn ra_dec_of(v: DVec3) -> (f64, f64) {
    let rxy = (v.x * v.x + v.y * v.y).sqrt();
    let ra = if rxy == 0.0 { 0.0 } else { crate::time::wrap_2pi(libm::atan2(v.y, v.x)) };
    let dec = if v.z == 0.0 && rxy == 0.0 { 0.0 } else { libm::atan2(v.z, rxy) };
    (ra, dec)
}
