//! Sky background and surface brightness → display light.
//!
//! Display mapping (ours, stated): a surface brightness S (V mag/arcsec², as
//! seen in the instrument) is shown with linear light 10^(−0.4 (S − 16)),
//! so 16 mag/arcsec² is white, a dark country sky (21.5) a faint glow, a
//! city sky (18.5) dark grey. Deep-sky objects use the same scale, so their
//! contrast against the sky is the true ratio of surface brightnesses.

use crate::scene::SkyLight;

/// Surface brightness shown as full white, mag/arcsec².
pub const WHITE_MAG_ARCSEC2: f64 = 16.0;

/// Linear display light of a surface brightness.
pub fn surface_light(mag_arcsec2: f64) -> f32 {
    libm::pow(10.0, -0.4 * (mag_arcsec2 - WHITE_MAG_ARCSEC2)).min(1.0) as f32
}

/// Linear RGB of the sky behind the field: a neutral night tint, turning blue
/// as moonlight (scattered sunlight) dominates.
pub fn sky_colour(sky: &SkyLight) -> [f32; 3] {
    let l = surface_light(sky.sky_mag_arcsec2 + sky.dimming_mag.max(0.0));
    let m = sky.moon_share.clamp(0.0, 1.0) as f32;
    let dark = [0.80f32, 0.86, 1.0];
    let moon = [0.55f32, 0.72, 1.0];
    let mut c = [0.0; 3];
    for k in 0..3 {
        c[k] = dark[k] * (1.0 - m) + moon[k] * m;
    }
    // Normalise the tint to unit luminance (Rec. 709 weights) so `l` is the luminance.
    let y = 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
    [l * c[0] / y, l * c[1] / y, l * c[2] / y]
}

/// Colour of everything outside the field stop (the dark of the eyepiece).
pub const OUTSIDE: [f32; 3] = [0.0008, 0.0008, 0.001];
