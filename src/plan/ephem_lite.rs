//! Planning-grade positions for the planner's inner loop: sidereal time,
//! the Sun and the Moon to a few arcminutes (twilight, moonlight, Moon phase
//! and separation). Apparent places for drawing come from `sky`/`solar`;
//! these only decide minutes and sky brightness, cheaply.

use crate::sky::{Equatorial, Horizontal, Site};
use core::f64::consts::TAU;

const J2000_JD: f64 = 2_451_545.0;

fn norm_deg(x: f64) -> f64 {
    let r = libm::fmod(x, 360.0);
    if r < 0.0 {
        r + 360.0
    } else {
        r
    }
}

fn sind(x: f64) -> f64 {
    libm::sin(x.to_radians())
}

fn cosd(x: f64) -> f64 {
    libm::cos(x.to_radians())
}

/// Greenwich mean sidereal time, rad (IAU 1982 expression, Meeus 1998 eq. 12.4); UT1 taken as UTC.
pub fn gmst_rad(utc_jd: f64) -> f64 {
    let d = utc_jd - J2000_JD;
    let t = d / 36_525.0;
    let deg = 280.460_618_37 + 360.985_647_366_29 * d + 0.000_387_933 * t * t - t * t * t / 38_710_000.0;
    norm_deg(deg).to_radians()
}

/// Mean obliquity, deg (Astronomical Almanac low-precision formula).
fn obliquity_deg(d: f64) -> f64 {
    23.439 - 0.000_000_4 * d
}

fn ecliptic_to_equatorial(lon_deg: f64, lat_deg: f64, eps_deg: f64) -> Equatorial {
    let (sl, cl) = (sind(lon_deg), cosd(lon_deg));
    let (sb, cb) = (sind(lat_deg), cosd(lat_deg));
    let (se, ce) = (sind(eps_deg), cosd(eps_deg));
    let x = cb * cl;
    let y = cb * sl * ce - sb * se;
    let z = cb * sl * se + sb * ce;
    let mut ra = libm::atan2(y, x);
    if ra < 0.0 {
        ra += TAU;
    }
    Equatorial { ra_rad: ra, dec_rad: libm::asin(z.clamp(-1.0, 1.0)) }
}

/// The Sun, geocentric, equator and equinox of date, with ecliptic longitude
/// (Astronomical Almanac low-precision formulae, about 0.01° for 1950–2050).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SunLite {
    pub equ: Equatorial,
    pub ecl_lon_deg: f64,
    pub distance_au: f64,
}

/// Low-precision Sun (Astronomical Almanac, section C "low precision formulas for the Sun").
pub fn sun_lite(jd: f64) -> SunLite {
    let d = jd - J2000_JD;
    let l = norm_deg(280.460 + 0.985_647_4 * d);
    let g = norm_deg(357.528 + 0.985_600_3 * d);
    let lam = l + 1.915 * sind(g) + 0.020 * sind(2.0 * g);
    let r = 1.000_14 - 0.016_71 * cosd(g) - 0.000_14 * cosd(2.0 * g);
    SunLite { equ: ecliptic_to_equatorial(lam, 0.0, obliquity_deg(d)), ecl_lon_deg: norm_deg(lam), distance_au: r }
}

/// The Moon, geocentric, of date, with horizontal parallax (Astronomical
/// Almanac low-precision formulae, section D: about 0.3° in longitude, 0.2° in latitude; coefficients from memory).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct MoonLite {
    pub equ: Equatorial,
    pub ecl_lon_deg: f64,
    pub ecl_lat_deg: f64,
    pub parallax_deg: f64,
}

/// Low-precision Moon (Astronomical Almanac, section D).
pub fn moon_lite(jd: f64) -> MoonLite {
    let t = (jd - J2000_JD) / 36_525.0;
    let lam = 218.32 + 481_267.881 * t + 6.29 * sind(135.0 + 477_198.87 * t) - 1.27 * sind(259.3 - 413_335.36 * t)
        + 0.66 * sind(235.7 + 890_534.22 * t)
        + 0.21 * sind(269.9 + 954_397.74 * t)
        - 0.19 * sind(357.5 + 35_999.05 * t)
        - 0.11 * sind(186.5 + 966_404.03 * t);
    let beta = 5.13 * sind(93.3 + 483_202.02 * t) + 0.28 * sind(228.2 + 960_400.89 * t)
        - 0.28 * sind(318.3 + 6_003.15 * t)
        - 0.17 * sind(217.6 - 407_332.21 * t);
    let par = 0.9508 + 0.0518 * cosd(135.0 + 477_198.87 * t) + 0.0095 * cosd(259.3 - 413_335.36 * t)
        + 0.0078 * cosd(235.7 + 890_534.22 * t)
        + 0.0028 * cosd(269.9 + 954_397.74 * t);
    let lam = norm_deg(lam);
    MoonLite {
        equ: ecliptic_to_equatorial(lam, beta, obliquity_deg(jd - J2000_JD)),
        ecl_lon_deg: lam,
        ecl_lat_deg: beta,
        parallax_deg: par,
    }
}

/// Moon phase from the two low-precision places: phase angle (deg, 0 = full),
/// illuminated fraction and whether it is waxing. Phase angle ≈ 180° − elongation
/// (the Sun's distance ≫ the Moon's; error under 0.2°).
pub fn moon_phase(sun: &SunLite, moon: &MoonLite) -> (f64, f64, bool) {
    let c = cosd(moon.ecl_lat_deg) * cosd(moon.ecl_lon_deg - sun.ecl_lon_deg);
    let elong = libm::acos(c.clamp(-1.0, 1.0)).to_degrees();
    let phase = 180.0 - elong;
    let frac = 0.5 * (1.0 + cosd(phase));
    let waxing = norm_deg(moon.ecl_lon_deg - sun.ecl_lon_deg) < 180.0;
    (phase, frac, waxing)
}

/// Precomputed site trigonometry for fast alt/az.
#[derive(Clone, Copy, Debug)]
pub struct SiteTrig {
    pub sin_lat: f64,
    pub cos_lat: f64,
    pub lon_rad: f64,
}

impl SiteTrig {
    pub fn new(site: &Site) -> Self {
        SiteTrig { sin_lat: libm::sin(site.lat_rad), cos_lat: libm::cos(site.lat_rad), lon_rad: site.lon_rad }
    }
}

/// Altitude and azimuth (from north through east) from hour angle and
/// declination, spherical astronomy (Meeus 1998 eqs. 13.5–13.6, azimuth from north); no refraction.
pub fn horizontal_from_ha(ha_rad: f64, sin_dec: f64, cos_dec: f64, st: &SiteTrig) -> Horizontal {
    let (sh, ch) = (libm::sin(ha_rad), libm::cos(ha_rad));
    let sin_alt = st.sin_lat * sin_dec + st.cos_lat * cos_dec * ch;
    let alt = libm::asin(sin_alt.clamp(-1.0, 1.0));
    let y = -cos_dec * sh;
    let x = sin_dec * st.cos_lat - cos_dec * ch * st.sin_lat;
    let mut az = libm::atan2(y, x);
    if az < 0.0 {
        az += TAU;
    }
    Horizontal { alt_rad: alt, az_rad: az }
}

/// Horizontal place of an equatorial (of date) direction at local sidereal time `lst_rad`.
pub fn horizontal(equ: &Equatorial, lst_rad: f64, st: &SiteTrig) -> Horizontal {
    horizontal_from_ha(lst_rad - equ.ra_rad, libm::sin(equ.dec_rad), libm::cos(equ.dec_rad), st)
}

/// Local sidereal time, rad.
pub fn lst_rad(utc_jd: f64, st: &SiteTrig) -> f64 {
    libm::fmod(gmst_rad(utc_jd) + st.lon_rad + TAU, TAU)
}

/// Topocentric Moon altitude: geocentric altitude lowered by parallax·cos(alt) (Meeus 1998 ch. 40, first order).
pub fn moon_topocentric_alt_rad(geo_alt_rad: f64, parallax_deg: f64) -> f64 {
    geo_alt_rad - parallax_deg.to_radians() * libm::cos(geo_alt_rad)
}

/// Angular separation of two equatorial directions, rad (haversine form).
pub fn separation_rad(a: &Equatorial, b: &Equatorial) -> f64 {
    let sd = libm::sin(0.5 * (b.dec_rad - a.dec_rad));
    let sr = libm::sin(0.5 * (b.ra_rad - a.ra_rad));
    let h = sd * sd + libm::cos(a.dec_rad) * libm::cos(b.dec_rad) * sr * sr;
    2.0 * libm::asin(libm::sqrt(h.clamp(0.0, 1.0)))
}
