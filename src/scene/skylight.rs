//! Sky brightness behind the field: moonlight added to the natural sky, and
//! the dimming of surface brightness in an instrument. The sky model itself
//! (Krisciunas & Schaefer 1991 moonlight, twilight) is `crate::sky::brightness`,
//! shared with the planner.

use crate::sky::brightness::{mu_to_nl, nl_to_mu};

/// Combines a natural sky (mag/arcsec²) with moonlight (nL): returns the total
/// sky brightness (mag/arcsec²) and the Moon's share of it (0..1).
pub fn sky_with_moon(dark_sky_mag_arcsec2: f64, moon_nl: f64) -> (f64, f64) {
    let dark = mu_to_nl(dark_sky_mag_arcsec2);
    let total = dark + moon_nl.max(0.0);
    (nl_to_mu(total), if total > 0.0 { moon_nl.max(0.0) / total } else { 0.0 })
}

/// Dimming of surface brightness in a telescope, magnitudes: none while the
/// exit pupil fills the eye's pupil, else 5·log10(eye / exit) (common practice:
/// no instrument raises surface brightness; a smaller exit pupil lowers it as its area).
pub fn exit_pupil_dimming_mag(exit_pupil_mm: f64, eye_pupil_mm: f64) -> f64 {
    if !(exit_pupil_mm > 0.0) || !(eye_pupil_mm > 0.0) || exit_pupil_mm >= eye_pupil_mm {
        return 0.0;
    }
    5.0 * libm::log10(eye_pupil_mm / exit_pupil_mm)
}
