//! Physical ephemeris: apparent diameter, phase, bright limb, visual magnitude,
//! and the IAU rotation poles (Archinal et al. 2018) the ring and moon code use.

use super::apparent::Apparent;
use super::BodyId;
use super::AU_KM;
use glam::DVec3;

/// IAU 2015 radii, km (Archinal et al. 2018): Sun and Moon mean, planets equatorial.
pub fn radius_km(body: BodyId) -> f64 {
    match body {
        BodyId::Sun => 695_700.0,
        BodyId::Moon => 1_737.4,
        BodyId::Mercury => 2_440.53,
        BodyId::Venus => 6_051.8,
        BodyId::Mars => 3_396.19,
        BodyId::Jupiter => 71_492.0,
        BodyId::Saturn => 60_268.0,
        BodyId::Uranus => 25_559.0,
        BodyId::Neptune => 24_764.0,
    }
}

/// Unit vector (ICRF) of a body's north pole of rotation, IAU WGCCRE 2015
/// (Archinal et al. 2018), leading terms; `tdb_jd` TDB. None for the Sun/Moon.
pub fn pole_icrf(body: BodyId, tdb_jd: f64) -> Option<DVec3> {
    let t = (tdb_jd - 2_451_545.0) / 36_525.0;
    let (a, d) = match body {
        BodyId::Mercury => (281.0103 - 0.0328 * t, 61.4155 - 0.0049 * t),
        BodyId::Venus => (272.76, 67.16),
        BodyId::Mars => (317.269_202 - 0.109_275_47 * t, 54.432_516 - 0.058_271_05 * t),
        BodyId::Jupiter => (268.056_595 - 0.006_499 * t, 64.495_303 + 0.002_413 * t),
        BodyId::Saturn => (40.589 - 0.036 * t, 83.537 - 0.004 * t),
        BodyId::Uranus => (257.311, -15.175),
        BodyId::Neptune => {
            let n = (357.85 + 52.316 * t).to_radians();
            (299.36 + 0.70 * libm::sin(n), 43.46 - 0.51 * libm::cos(n))
        }
        BodyId::Sun | BodyId::Moon => return None,
    };
    let (a, d) = (a.to_radians(), d.to_radians());
    Some(DVec3::new(libm::cos(d) * libm::cos(a), libm::cos(d) * libm::sin(a), libm::sin(d)))
}

/// Angular diameter, arcsec: 2 asin(R / distance).
pub fn diameter_arcsec(body: BodyId, distance_au: f64) -> f64 {
    let s = (radius_km(body) / (distance_au * AU_KM)).min(1.0);
    2.0 * libm::asin(s).to_degrees() * 3600.0
}

/// Phase angle Sun–body–observer, rad (0 = fully lit).
pub fn phase_angle_rad(a: &Apparent) -> f64 {
    let (h, p) = (a.heliocentric_au, a.astrometric_au);
    libm::atan2(h.cross(p).length(), h.dot(p))
}

/// Illuminated fraction of the disc of a sphere, (1 + cos i) / 2.
pub fn illuminated_fraction(phase_angle_rad: f64) -> f64 {
    0.5 * (1.0 + libm::cos(phase_angle_rad))
}

/// Position angle (from north through east, 0..2π) of the point `to` as seen
/// from `from`, both unit vectors in one frame whose pole is `pole`.
pub fn position_angle_rad(from: DVec3, to: DVec3, pole: DVec3) -> f64 {
    let east = pole.cross(from).normalize_or_zero();
    let north = from.cross(east);
    let pa = libm::atan2(to.dot(east), to.dot(north));
    if pa < 0.0 {
        pa + 2.0 * core::f64::consts::PI
    } else {
        pa
    }
}

/// Position angle of the midpoint of the bright limb (Meeus 1998 eq. 48.5):
/// the direction of the Sun from the body on the sky, of-date north.
pub fn bright_limb_pa_rad(body: &Apparent, sun: &Apparent) -> f64 {
    position_angle_rad(body.dir_gcrs, sun.dir_gcrs, body.pole_of_date())
}

/// Planetocentric latitude (rad) of the point below `toward` (a unit vector from
/// the body) for a body with unit pole `pole`.
pub fn sub_latitude_rad(pole: DVec3, toward: DVec3) -> f64 {
    libm::asin(pole.dot(toward.normalize()).clamp(-1.0, 1.0))
}

/// Visual magnitude. Planets: Mallama & Hilton 2018 ("Computing apparent
/// planetary magnitudes for The Astronomical Almanac"), eqs. 2–17, Mars without
/// its rotation/season terms (±0.06 mag). Moon: Allen (1973) phase law
/// V = −12.73 + 0.026|i| + 4e-9 i⁴ at 1 AU / 384400 km, scaled by 5 log10(rΔ)
/// (from memory). Sun: V = −26.74 at 1 AU (common practice).
pub fn visual_magnitude(body: BodyId, a: &Apparent) -> f64 {
    let r = a.heliocentric_au.length();
    let d = a.distance_au();
    let i = phase_angle_rad(a).to_degrees();
    let dist = 5.0 * libm::log10(r * d);
    match body {
        BodyId::Sun => -26.74 + 5.0 * libm::log10(d),
        BodyId::Moon => {
            let d0 = 384_400.0 / AU_KM;
            -12.73 + 0.026 * i + 4e-9 * i.powi(4) + 5.0 * libm::log10(r * d / d0)
        }
        BodyId::Mercury => {
            -0.613 + dist + 6.3280e-02 * i - 1.6336e-03 * i.powi(2) + 3.3644e-05 * i.powi(3) - 3.4265e-07 * i.powi(4)
                + 1.6893e-09 * i.powi(5)
                - 3.0334e-12 * i.powi(6)
        }
        BodyId::Venus => {
            if i < 163.7 {
                -4.384 + dist - 1.044e-03 * i + 3.687e-04 * i.powi(2) - 2.814e-06 * i.powi(3) + 8.938e-09 * i.powi(4)
            } else {
                236.05828 + dist - 2.81914 * i + 8.39034e-03 * i.powi(2)
            }
        }
        BodyId::Mars => {
            if i <= 50.0 {
                -1.601 + dist + 2.267e-02 * i - 1.302e-04 * i * i
            } else {
                -0.367 + dist - 0.02573 * i + 0.0003445 * i * i
            }
        }
        BodyId::Jupiter => {
            if i <= 12.0 {
                -9.395 + dist - 3.7e-04 * i + 6.16e-04 * i * i
            } else {
                let x = i / 180.0;
                let f = ((((-1.876 * x + 2.809) * x - 0.062) * x - 0.363) * x - 1.507) * x + 1.0;
                -9.428 + dist - 2.5 * libm::log10(f)
            }
        }
        BodyId::Saturn => {
            // Eq. 10 (globe + rings): sub-latitudes of the Sun and the observer.
            let pole = pole_icrf(body, a.tdb_jd).unwrap_or(DVec3::Z);
            let bs = sub_latitude_rad(pole, -a.heliocentric_au).to_degrees();
            let be = sub_latitude_rad(pole, -a.astrometric_au).to_degrees();
            let b = if bs * be >= 0.0 { (bs * be).sqrt() } else { 0.0 };
            let sb = libm::sin(b.to_radians());
            if i <= 6.5 && b <= 27.0 {
                -8.914 - 1.825 * sb + 0.026 * i - 0.378 * sb * libm::exp(-2.25 * i) + dist
            } else {
                // Eq. 12, globe alone, outside the rings' formula range.
                -8.94 + 2.446e-4 * i + 2.672e-4 * i * i - 1.506e-6 * i.powi(3) + 4.767e-9 * i.powi(4) + dist
            }
        }
        BodyId::Uranus => {
            let pole = pole_icrf(body, a.tdb_jd).unwrap_or(DVec3::Z);
            let bs = sub_latitude_rad(pole, -a.heliocentric_au).to_degrees();
            let be = sub_latitude_rad(pole, -a.astrometric_au).to_degrees();
            let lat = (bs.abs() + be.abs()) / 2.0;
            let ph = if i > 3.1 { (1.045e-4 * i + 6.587e-3) * i } else { 0.0 };
            -7.110 + dist - 0.00084 * lat + ph
        }
        BodyId::Neptune => {
            let year = 2000.0 + (a.tdb_jd - 2_451_545.0) / 365.25;
            let m0 = (-6.89 - 0.0054 * (year - 1980.0)).clamp(-7.00, -6.89);
            let ph = if i > 1.9 { 7.944e-3 * i + 9.617e-5 * i * i } else { 0.0 };
            m0 + dist + ph
        }
    }
}
