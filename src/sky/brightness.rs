//! Brightness of the sky at a target, V band: the one implementation of the
//! moonlight model of Krisciunas & Schaefer (1991, PASP 103, 1033; "K&S" below),
//! its air-mass gradient of the moonless sky, and a rough twilight term of ours.
//! The planner (`plan::schedule`) and the view (`scene`, `engine::compose`) both
//! call these functions, so a card and the picture see the same sky.
//!
//! Units: angles in radians at this module's edges (the K&S fits are written in
//! degrees and are converted inside); sky brightness in V mag/arcsec² (`mu`) or
//! nanolamberts (`nl`; K&S add light in nL).

use core::f64::consts::{FRAC_PI_2, LN_10};

/// Smallest Moon–target separation the scattering fit is used at: 10°.
///
/// K&S's fit of the aerosol (Mie) scattering, f_M(ρ) = 10^(6.15 − ρ/40), is stated
/// for ρ ≳ 10°. Nearer the Moon we hold f(ρ) at its 10° value rather than extend
/// the fit: the true aureole rises much more steeply than that exponential (roughly
/// as ρ⁻², from memory) and by how much depends on haze, dew on the optics and the
/// instrument's own scattered light, none of which we know. Holding keeps f
/// continuous and monotone and gives a floor for the sky there: within 10° of the
/// Moon the sky is at least this bright, and verdicts there lean optimistic (said in
/// DEVELOPERS.md).
pub const MIN_SCATTERING_ANGLE_RAD: f64 = 10.0 * (core::f64::consts::PI / 180.0);

/// Air mass X(Z) = (1 − 0.96 sin²Z)^−½ (Krisciunas & Schaefer 1991 eq. 3), Z = 90° − alt;
/// `alt_rad` is held at 0 below the horizon (X = 5 there); NaN stays NaN.
pub fn ks_airmass(alt_rad: f64) -> f64 {
    let z = FRAC_PI_2 - if alt_rad < 0.0 { 0.0 } else { alt_rad };
    let s = libm::sin(z);
    1.0 / libm::sqrt(1.0 - 0.96 * s * s)
}

/// V mag/arcsec² → nanolamberts: B = 34.08 exp(20.7233 − 0.92104 V) (Krisciunas & Schaefer 1991 eq. 1).
/// +∞ gives 0 nL.
pub fn mu_to_nl(mu: f64) -> f64 {
    34.08 * libm::exp(20.7233 - 0.92104 * mu)
}

/// Nanolamberts → V mag/arcsec² (Krisciunas & Schaefer 1991 eq. 1 inverted).
///
/// No light (b ≤ 0) is +∞ mag/arcsec²: exact, and every user of a sky brightness
/// takes it (display light 10^(−0.4·∞) = 0; `engine::compose::display_sky_mu` and
/// `drawn_mean_mu` pass a non-finite sky through). NaN stays NaN rather than becoming
/// a made-up faint sky, so bad input shows.
pub fn nl_to_mu(b_nl: f64) -> f64 {
    if b_nl <= 0.0 {
        return f64::INFINITY;
    }
    (20.7233 - libm::log(b_nl / 34.08)) / 0.92104
}

/// Moon's V magnitude at phase angle α (Sun–Moon–observer; 0 = full):
/// m = −12.73 + 0.026|α| + 4×10⁻⁹ α⁴, α in degrees (Krisciunas & Schaefer 1991 eq. 9).
/// |α| is held at 180° (a phase angle cannot exceed it); NaN stays NaN.
pub fn moon_vmag(phase_angle_rad: f64) -> f64 {
    let a = phase_angle_rad.abs().to_degrees();
    let a = if a > 180.0 { 180.0 } else { a };
    -12.73 + 0.026 * a + 4.0e-9 * (a * a) * (a * a)
}

/// Scattering function f(ρ) = 10^5.36 (1.06 + cos²ρ) + 10^(6.15 − ρ/40), ρ in degrees
/// (Krisciunas & Schaefer 1991 eq. 21: Rayleigh plus Mie terms); ρ = |separation|
/// held in [10°, 180°] (see [`MIN_SCATTERING_ANGLE_RAD`]).
pub fn scattering(separation_rad: f64) -> f64 {
    let r = separation_rad.abs();
    let r = r.clamp(MIN_SCATTERING_ANGLE_RAD, core::f64::consts::PI);
    let c = libm::cos(r);
    exp10(5.36) * (1.06 + c * c) + exp10(6.15 - r.to_degrees() / 40.0)
}

/// Moonlight added to the sky at a target, nL (Krisciunas & Schaefer 1991 eqs. 15, 20):
/// B = f(ρ)·I*·10^(−0.4 k X(Zm))·[1 − 10^(−0.4 k X(Z))], I* = 10^(−0.4 (m + 16.57)).
/// `phase_angle_rad`: Sun–Moon–observer angle; `separation_rad`: Moon to target;
/// altitudes of the Moon and the target; `k_mag`: extinction per air mass.
/// Zero while the Moon is below the horizon (alt ≤ 0).
pub fn moonlight_nl(phase_angle_rad: f64, separation_rad: f64, moon_alt_rad: f64, target_alt_rad: f64, k_mag: f64) -> f64 {
    if moon_alt_rad <= 0.0 {
        return 0.0;
    }
    let i_star = exp10(-0.4 * (moon_vmag(phase_angle_rad) + 16.57));
    let through_to_moon = exp10(-0.4 * k_mag * ks_airmass(moon_alt_rad));
    let scattered_towards_us = 1.0 - exp10(-0.4 * k_mag * ks_airmass(target_alt_rad));
    scattering(separation_rad) * i_star * through_to_moon * scattered_towards_us
}

/// Moonless sky at altitude, nL: B_zen·10^(−0.4 k (X − 1))·X (Krisciunas & Schaefer 1991 eq. 2),
/// brighter towards the horizon; `zenith_mu` the zenith value in mag/arcsec².
pub fn dark_sky_nl(zenith_mu: f64, target_alt_rad: f64, k_mag: f64) -> f64 {
    let x = ks_airmass(target_alt_rad);
    mu_to_nl(zenith_mu) * exp10(-0.4 * k_mag * (x - 1.0)) * x
}

/// Rough twilight or daylight sky, nL (ours): the zenith twilight fades about 1.15
/// mag/arcsec² per degree of solar depression from about 5 mag/arcsec² at sunset
/// (from memory, approximate; it matters only between sunset and about −16°, and
/// falls smoothly on, with no cut at −18°). Sun above the horizon: daylight, 4 mag/arcsec².
pub fn twilight_nl(sun_alt_rad: f64) -> f64 {
    let h = sun_alt_rad.to_degrees();
    let mu = if h >= 0.0 { 4.0 } else { 5.0 + 1.15 * (-h) };
    mu_to_nl(mu)
}

/// Everything that lights the sky at one target at one moment (radians).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkyAt {
    /// Moonless zenith sky of the site, V mag/arcsec².
    pub zenith_mu: f64,
    /// Extinction, mag per air mass.
    pub k_mag: f64,
    pub target_alt_rad: f64,
    pub sun_alt_rad: f64,
    pub moon_alt_rad: f64,
    /// Sun–Moon–observer angle (0 = full Moon).
    pub moon_phase_angle_rad: f64,
    /// Moon to target.
    pub moon_separation_rad: f64,
}

/// The sky's light at a target in its three parts, nL.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkyNl {
    /// The moonless night sky with its air-mass gradient ([`dark_sky_nl`]).
    pub dark: f64,
    /// Moonlight ([`moonlight_nl`]).
    pub moon: f64,
    /// Twilight or daylight ([`twilight_nl`]).
    pub twilight: f64,
}

impl SkyNl {
    pub fn total(&self) -> f64 {
        self.dark + self.moon + self.twilight
    }
}

/// The three parts of the sky's light at `s` (the sum of the terms above).
pub fn sky_nl(s: &SkyAt) -> SkyNl {
    SkyNl {
        dark: dark_sky_nl(s.zenith_mu, s.target_alt_rad, s.k_mag),
        moon: moonlight_nl(s.moon_phase_angle_rad, s.moon_separation_rad, s.moon_alt_rad, s.target_alt_rad, s.k_mag),
        twilight: twilight_nl(s.sun_alt_rad),
    }
}

/// Total sky brightness at the target, V mag/arcsec².
pub fn sky_mu(s: &SkyAt) -> f64 {
    nl_to_mu(sky_nl(s).total())
}

/// 10^x through exp (cheaper than pow in the planner's inner loop).
#[inline]
fn exp10(x: f64) -> f64 {
    libm::exp(x * LN_10)
}
