//! Horizon coordinates: hour angle, altitude/azimuth, parallactic angle, and the
//! observer's geocentric position of date. WGS84 geodetic site (ERFA `eraGd2gce`),
//! polar motion taken as zero (≤ 0.5″ effect, IERS bulletins not carried offline).

use glam::DVec3;
use std::fmt;

use crate::sky::{Equatorial, Horizontal, Site};
use crate::time::{gast_rad, wrap_2pi, Instant};

/// WGS84 equatorial radius, metres.
pub const WGS84_A_M: f64 = 6_378_137.0;
/// WGS84 flattening.
pub const WGS84_F: f64 = 1.0 / 298.257_223_563;
/// Earth's rotation rate, rad/s (ERFA: 1.00273781191135448 turns per UT1 day).
pub const EARTH_ROTATION_RAD_S: f64 = 1.002_737_811_911_354_48 * std::f64::consts::TAU / 86_400.0;

/// A site field out of range or not a number.
#[derive(Clone, Debug, PartialEq)]
pub enum SiteError {
    LatitudeDeg(f64),
    LongitudeDeg(f64),
    ElevationM(f64),
}

impl fmt::Display for SiteError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SiteError::LatitudeDeg(v) => write!(f, "site latitude {v}° is out of range: use -90 to +90 degrees"),
            SiteError::LongitudeDeg(v) => write!(f, "site longitude {v}° is out of range: use -180 to +180 degrees (east positive)"),
            SiteError::ElevationM(v) => write!(f, "site elevation {v} m is out of range: use -500 to 9000 metres"),
        }
    }
}

impl std::error::Error for SiteError {}

/// A checked site from degrees (latitude geodetic WGS84, longitude east-positive) and metres.
pub fn site_from_deg(lat_deg: f64, lon_deg: f64, elev_m: f64) -> Result<Site, SiteError> {
    let site = Site { lat_rad: lat_deg.to_radians(), lon_rad: lon_deg.to_radians(), elev_m };
    validate_site(&site)?;
    Ok(site)
}

/// Check a site's fields (latitude ±90°, longitude ±180°, elevation −500…9000 m).
pub fn validate_site(site: &Site) -> Result<(), SiteError> {
    let lat = site.lat_rad.to_degrees();
    let lon = site.lon_rad.to_degrees();
    if !(lat.is_finite() && (-90.0..=90.0).contains(&lat)) {
        return Err(SiteError::LatitudeDeg(lat));
    }
    if !(lon.is_finite() && (-180.0..=180.0).contains(&lon)) {
        return Err(SiteError::LongitudeDeg(lon));
    }
    if !(site.elev_m.is_finite() && (-500.0..=9000.0).contains(&site.elev_m)) {
        return Err(SiteError::ElevationM(site.elev_m));
    }
    Ok(())
}

/// Local hour angle (west-positive, wrapped to (−π, π]) of an apparent right
/// ascension (true equinox of date) at an east-positive longitude.
pub fn hour_angle_rad(ra_rad: f64, lon_rad: f64, t: &Instant) -> f64 {
    let h = wrap_2pi(gast_rad(t) + lon_rad - ra_rad);
    if h > std::f64::consts::PI { h - std::f64::consts::TAU } else { h }
}

/// Hour angle and declination → (altitude, azimuth from north through east),
/// spherical trigonometry as ERFA `eraHd2ae`.
pub fn hd_to_horizontal(ha_rad: f64, dec_rad: f64, lat_rad: f64) -> Horizontal {
    let (sh, ch) = libm::sincos(ha_rad);
    let (sd, cd) = libm::sincos(dec_rad);
    let (sp, cp) = libm::sincos(lat_rad);
    let x = -ch * cd * sp + sd * cp;
    let y = -sh * cd;
    let z = ch * cd * cp + sd * sp;
    let r = (x * x + y * y).sqrt();
    let az = if r != 0.0 { wrap_2pi(libm::atan2(y, x)) } else { 0.0 };
    Horizontal { alt_rad: libm::atan2(z, r), az_rad: az }
}

/// Altitude/azimuth → (hour angle, declination), as ERFA `eraAe2hd`.
pub fn horizontal_to_hd(h: Horizontal, lat_rad: f64) -> (f64, f64) {
    let (sa, ca) = libm::sincos(h.az_rad);
    let (se, ce) = libm::sincos(h.alt_rad);
    let (sp, cp) = libm::sincos(lat_rad);
    let x = -ca * ce * sp + se * cp;
    let y = -sa * ce;
    let z = ca * ce * cp + se * sp;
    let r = (x * x + y * y).sqrt();
    let ha = if r != 0.0 { libm::atan2(y, x) } else { 0.0 };
    (ha, libm::atan2(z, r))
}

/// Apparent place (true equator and equinox of date) → geometric altitude/azimuth
/// at the site, no refraction (hour angle from GAST, see [`hd_to_horizontal`]).
pub fn to_horizontal(app: Equatorial, site: &Site, t: &Instant) -> Horizontal {
    let ha = hour_angle_rad(app.ra_rad, site.lon_rad, t);
    hd_to_horizontal(ha, app.dec_rad, site.lat_rad)
}

/// Altitude/azimuth at the site → apparent place (true equator and equinox of date).
pub fn from_horizontal(h: Horizontal, site: &Site, t: &Instant) -> Equatorial {
    let (ha, dec) = horizontal_to_hd(h, site.lat_rad);
    Equatorial { ra_rad: wrap_2pi(gast_rad(t) + site.lon_rad - ha), dec_rad: dec }
}

/// Parallactic angle (angle at the target from the north celestial pole to the
/// zenith, positive when the zenith lies east of north), as ERFA `eraHd2pa`.
pub fn parallactic_angle_rad(hour_angle_rad: f64, dec_rad: f64, lat_rad: f64) -> f64 {
    let (sp, cp) = libm::sincos(lat_rad);
    let (sd, cd) = libm::sincos(dec_rad);
    let (sh, ch) = libm::sincos(hour_angle_rad);
    let sqsz = cp * sh;
    let cqsz = sp * cd - cp * sd * ch;
    if sqsz != 0.0 || cqsz != 0.0 { libm::atan2(sqsz, cqsz) } else { 0.0 }
}

/// The site's geocentric position on the rotating Earth (ITRS = TIRS with zero
/// polar motion), metres: WGS84 geodetic → Cartesian (ERFA `eraGd2gce`).
pub fn site_itrs_m(site: &Site) -> DVec3 {
    let (sp, cp) = libm::sincos(site.lat_rad);
    let w = (1.0 - WGS84_F) * (1.0 - WGS84_F);
    let d = cp * cp + w * sp * sp;
    let ac = WGS84_A_M / d.sqrt();
    let as_ = w * ac;
    let r = (ac + site.elev_m) * cp;
    let (sl, cl) = libm::sincos(site.lon_rad);
    DVec3::new(r * cl, r * sl, (as_ + site.elev_m) * sp)
}

/// Observer's geocentric position in the true equator and equinox of date, metres
/// (ITRS vector rotated by GAST; for topocentric parallax of the Moon and planets).
pub fn observer_position_of_date_m(site: &Site, t: &Instant) -> DVec3 {
    let p = site_itrs_m(site);
    let (s, c) = libm::sincos(gast_rad(t));
    DVec3::new(c * p.x - s * p.y, s * p.x + c * p.y, p.z)
}

/// Observer's geocentric velocity from Earth's rotation, true equator and equinox of
/// date, m/s (ω × r; for diurnal aberration).
pub fn observer_velocity_of_date_m_s(site: &Site, t: &Instant) -> DVec3 {
    let p = observer_position_of_date_m(site, t);
    DVec3::new(-EARTH_ROTATION_RAD_S * p.y, EARTH_ROTATION_RAD_S * p.x, 0.0)
}

/// Local apparent sidereal time and latitude at one instant, computed once, for
/// turning many apparent places into alt/az (same results as [`to_horizontal`]).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct HorizonFrame {
    pub last_rad: f64,
    pub lat_rad: f64,
}

impl HorizonFrame {
    pub fn new(site: &Site, t: &Instant) -> Self {
        HorizonFrame { last_rad: wrap_2pi(gast_rad(t) + site.lon_rad), lat_rad: site.lat_rad }
    }

    /// Hour angle (west-positive, (−π, π]) of an apparent right ascension.
    pub fn hour_angle_rad(&self, ra_rad: f64) -> f64 {
        let h = wrap_2pi(self.last_rad - ra_rad);
        if h > std::f64::consts::PI { h - std::f64::consts::TAU } else { h }
    }

    /// Apparent place → geometric alt/az (no refraction).
    pub fn to_horizontal(&self, app: Equatorial) -> Horizontal {
        hd_to_horizontal(self.hour_angle_rad(app.ra_rad), app.dec_rad, self.lat_rad)
    }

    /// Alt/az → apparent place.
    pub fn from_horizontal(&self, h: Horizontal) -> Equatorial {
        let (ha, dec) = horizontal_to_hd(h, self.lat_rad);
        Equatorial { ra_rad: wrap_2pi(self.last_rad - ha), dec_rad: dec }
    }
}
