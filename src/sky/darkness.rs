//! Darkness of a night and atmospheric extinction.
//! - Astronomical darkness: the Sun's centre below −18° (common practice), from the
//!   low-precision Sun of [`crate::sky::riseset`]. At the June solstice it cannot
//!   happen above latitude 90° − 23.44° − 18° ≈ 48.56° (geometry of the solstice Sun).
//! - Extinction: Δm = k·X, X the Kasten & Young (1989) air mass, k in mag per air
//!   mass; default 0.2 mag/airmass for V at a lowland site (common practice).

use crate::sky::refraction::airmass;
use crate::sky::riseset::{twilight, RiseSetError, Twilight};
use crate::sky::Site;

/// Default V-band extinction coefficient, mag per air mass (common practice, lowland site).
pub const DEFAULT_EXTINCTION_K_MAG: f64 = 0.2;
/// Sun altitude that ends astronomical twilight, degrees.
pub const ASTRONOMICAL_DARK_SUN_ALT_DEG: f64 = -18.0;

/// How dark a night gets.
#[derive(Clone, Debug, PartialEq)]
pub struct NightDarkness {
    /// True when the Sun's centre goes below −18° in the 24 h window.
    pub astronomical_darkness: bool,
    /// Start and end of astronomical darkness (UTC Julian dates), when it happens.
    pub dark_from_utc_jd: Option<f64>,
    pub dark_until_utc_jd: Option<f64>,
    /// Lowest altitude of the Sun's centre, radians.
    pub min_sun_alt_rad: f64,
    pub twilight: Twilight,
}

/// Does astronomical darkness happen at all in the 24 h from `start_utc_jd`
/// (pass local noon), and when.
pub fn night_darkness(site: &Site, start_utc_jd: f64) -> Result<NightDarkness, RiseSetError> {
    let tw = twilight(site, start_utc_jd)?;
    let dark = tw.min_sun_alt_rad < ASTRONOMICAL_DARK_SUN_ALT_DEG.to_radians();
    Ok(NightDarkness {
        astronomical_darkness: dark,
        dark_from_utc_jd: if dark { tw.astronomical_dusk_utc_jd } else { None },
        dark_until_utc_jd: if dark { tw.astronomical_dawn_utc_jd } else { None },
        min_sun_alt_rad: tw.min_sun_alt_rad,
        twilight: tw,
    })
}

/// Extinction in magnitudes for an air mass: Δm = k·X (k in mag per air mass).
pub fn extinction_mag(airmass: f64, k_mag_per_airmass: f64) -> f64 {
    k_mag_per_airmass * airmass
}

/// Magnitude above the atmosphere → magnitude seen at an apparent altitude
/// (infinity below the horizon's reach of the air-mass formula).
pub fn extincted_mag(mag: f64, apparent_alt_rad: f64, k_mag_per_airmass: f64) -> f64 {
    mag + extinction_mag(airmass(apparent_alt_rad), k_mag_per_airmass)
}
