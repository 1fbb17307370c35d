//! Small spherical-geometry helpers shared by the find module.
//!
//! Positions are `Equatorial` in one frame chosen by the caller (the catalog's
//! frame for star hops); everything here is frame-independent geometry.

use crate::sky::{Equatorial, Horizontal};
use glam::{DMat2, DVec3};

/// Unit vector of an equatorial direction (x toward RA 0, z toward the pole).
pub fn unit(p: Equatorial) -> DVec3 {
    let (sd, cd) = (libm::sin(p.dec_rad), libm::cos(p.dec_rad));
    let (sa, ca) = (libm::sin(p.ra_rad), libm::cos(p.ra_rad));
    DVec3::new(cd * ca, cd * sa, sd)
}

/// Angular separation, Vincenty's formula for the sphere (stable at all
/// separations), as used in ERFA `eraSeps`-style routines.
pub fn sep_rad(a: Equatorial, b: Equatorial) -> f64 {
    let ua = unit(a);
    let ub = unit(b);
    let c = ua.cross(ub).length();
    let d = ua.dot(ub);
    libm::atan2(c, d)
}

/// Position angle of `to` seen from `from`, measured from north through east,
/// in [0, 2π) (spherical position angle, as ERFA `eraPas`).
pub fn pa_rad(from: Equatorial, to: Equatorial) -> f64 {
    let dra = to.ra_rad - from.ra_rad;
    let y = libm::sin(dra) * libm::cos(to.dec_rad);
    let x = libm::sin(to.dec_rad) * libm::cos(from.dec_rad)
        - libm::cos(to.dec_rad) * libm::sin(from.dec_rad) * libm::cos(dra);
    let pa = if x == 0.0 && y == 0.0 { 0.0 } else { libm::atan2(y, x) };
    wrap_2pi(pa)
}

/// Gnomonic (tangent-plane) offset of `p` about `centre`, as (east, north) in
/// radians: the standard gnomonic projection (ERFA `eraTpxes`). Returns None
/// for points 90° or more from the centre.
pub fn offset_en_rad(centre: Equatorial, p: Equatorial) -> Option<(f64, f64)> {
    let dra = p.ra_rad - centre.ra_rad;
    let (sd, cd) = (libm::sin(p.dec_rad), libm::cos(p.dec_rad));
    let (sd0, cd0) = (libm::sin(centre.dec_rad), libm::cos(centre.dec_rad));
    let denom = sd * sd0 + cd * cd0 * libm::cos(dra);
    if denom <= 1e-9 {
        return None;
    }
    let xi = cd * libm::sin(dra) / denom;
    let eta = (sd * cd0 - cd * sd0 * libm::cos(dra)) / denom;
    Some((xi, eta))
}

/// The point at angular distance `dist` from `from` along position angle `pa`
/// (direct spherical problem; inverse of `sep_rad`/`pa_rad`).
pub fn offset_by(from: Equatorial, pa: f64, dist: f64) -> Equatorial {
    let (s0, c0) = (libm::sin(from.dec_rad), libm::cos(from.dec_rad));
    let (sd, cd) = (libm::sin(dist), libm::cos(dist));
    let sin_dec = s0 * cd + c0 * sd * libm::cos(pa);
    let dec = libm::asin(sin_dec.clamp(-1.0, 1.0));
    let y = libm::sin(pa) * sd * c0;
    let x = cd - s0 * sin_dec;
    Equatorial { ra_rad: wrap_2pi(from.ra_rad + libm::atan2(y, x)), dec_rad: dec }
}

/// Horizontal → the same spherical geometry as an `Equatorial`-shaped pair
/// (azimuth as longitude, altitude as latitude) for separations. Note that
/// azimuth grows north → east, i.e. to the RIGHT for an observer facing the sky.
pub fn hz_as_sph(h: Horizontal) -> Equatorial {
    Equatorial { ra_rad: h.az_rad, dec_rad: h.alt_rad }
}

/// The zenith as an equatorial direction: RA = local sidereal time, Dec =
/// geodetic latitude (the definition of the zenith's equatorial place; the
/// deflection of the vertical is ignored). Use the same frame as the stars.
pub fn zenith_equatorial(local_sidereal_rad: f64, lat_rad: f64) -> Equatorial {
    Equatorial { ra_rad: wrap_2pi(local_sidereal_rad), dec_rad: lat_rad }
}

/// Counter-clockwise rotation of the screen plane by `theta`.
pub fn rot2(theta: f64) -> DMat2 {
    let (s, c) = (libm::sin(theta), libm::cos(theta));
    DMat2::from_cols_array(&[c, s, -s, c])
}

pub fn wrap_2pi(a: f64) -> f64 {
    let t = core::f64::consts::TAU;
    let r = libm::fmod(a, t);
    if r < 0.0 {
        r + t
    } else {
        r
    }
}

/// Wrap to (−π, π].
pub fn wrap_pi(a: f64) -> f64 {
    let r = wrap_2pi(a);
    if r > core::f64::consts::PI {
        r - core::f64::consts::TAU
    } else {
        r
    }
}
