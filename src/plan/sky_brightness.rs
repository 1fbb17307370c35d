//! Sky brightness at a target: a named dark-sky class or a measured zenith
//! value, darkened/brightened with air mass, plus moonlight (Krisciunas &
//! Schaefer 1991, PASP 103, 1033) and a rough twilight term.

use crate::json::{self, tagged};
use serde::{Deserialize, Deserializer, Serialize};

/// Our own dark-sky scale. Zenith V brightness per class, mag/arcsec²: values
/// from memory of commonly quoted sky-meter readings for such places (approximate).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum SkyClass {
    RemoteWilderness,
    DarkCountryside,
    Countryside,
    VillageEdge,
    Suburb,
    BrightSuburb,
    Town,
    CityCentre,
}

impl SkyClass {
    pub const ALL: [SkyClass; 8] = [
        SkyClass::RemoteWilderness,
        SkyClass::DarkCountryside,
        SkyClass::Countryside,
        SkyClass::VillageEdge,
        SkyClass::Suburb,
        SkyClass::BrightSuburb,
        SkyClass::Town,
        SkyClass::CityCentre,
    ];

    /// Zenith sky brightness on a moonless night, V mag/arcsec² (from memory, approximate).
    pub fn zenith_mu(self) -> f64 {
        match self {
            SkyClass::RemoteWilderness => 21.9,
            SkyClass::DarkCountryside => 21.6,
            SkyClass::Countryside => 21.2,
            SkyClass::VillageEdge => 20.6,
            SkyClass::Suburb => 19.9,
            SkyClass::BrightSuburb => 19.2,
            SkyClass::Town => 18.6,
            SkyClass::CityCentre => 17.8,
        }
    }

    /// Plain description for the form.
    pub fn words(self) -> &'static str {
        match self {
            SkyClass::RemoteWilderness => "remote wilderness: Milky Way casts shadows",
            SkyClass::DarkCountryside => "dark countryside: Milky Way full of detail",
            SkyClass::Countryside => "countryside: Milky Way plain, glow on the horizon",
            SkyClass::VillageEdge => "edge of a village: Milky Way weak overhead",
            SkyClass::Suburb => "suburb: Milky Way barely seen",
            SkyClass::BrightSuburb => "bright suburb: sky grey, only bright stars",
            SkyClass::Town => "town: sky orange-grey",
            SkyClass::CityCentre => "city centre: only the brightest stars",
        }
    }
}

// `Deserialize` by the names `Serialize` writes (one shared reader: `json::unit_variant`).
json::unit_variants!(SkyClass {
    RemoteWilderness = "remote-wilderness",
    DarkCountryside = "dark-countryside",
    Countryside = "countryside",
    VillageEdge = "village-edge",
    Suburb = "suburb",
    BrightSuburb = "bright-suburb",
    Town = "town",
    CityCentre = "city-centre",
});

/// Zenith brightness as the user gives it. (`Deserialize` by hand: see `crate::json`.)
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(rename_all = "kebab-case", tag = "by")]
pub enum SkyBrightness {
    Measured { zenith_mu: f64 },
    Class { class: SkyClass },
}

impl<'de> Deserialize<'de> for SkyBrightness {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        #[derive(Deserialize)]
        struct Measured {
            zenith_mu: f64,
        }
        #[derive(Deserialize)]
        struct Class {
            class: SkyClass,
        }
        tagged(d, "by", &["measured", "class"], |name, v| {
            Ok(match name {
                "measured" => SkyBrightness::Measured { zenith_mu: json::from_value::<Measured>(v)?.zenith_mu },
                "class" => SkyBrightness::Class { class: json::from_value::<Class>(v)?.class },
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

impl SkyBrightness {
    pub fn zenith_mu(&self) -> f64 {
        match self {
            SkyBrightness::Measured { zenith_mu } => *zenith_mu,
            SkyBrightness::Class { class } => class.zenith_mu(),
        }
    }
}

/// Night-sky B−V used for the scotopic colour correction (from memory: the
/// moonless and the light-polluted sky are both reddish, about 1.0).
pub const SKY_BV: f64 = 1.0;

/// Air mass X(Z) = (1 − 0.96 sin²Z)^−½ (Krisciunas & Schaefer 1991 eq. 3); `alt_rad` clamped at 0.
pub fn ks_airmass(alt_rad: f64) -> f64 {
    let z = core::f64::consts::FRAC_PI_2 - alt_rad.max(0.0);
    let s = libm::sin(z);
    1.0 / libm::sqrt(1.0 - 0.96 * s * s)
}

/// V mag/arcsec² → nanolamberts (Krisciunas & Schaefer 1991 eq. 1 inverse: B = 34.08 exp(20.7233 − 0.92104 V)).
pub fn mu_to_nl(mu: f64) -> f64 {
    34.08 * libm::exp(20.7233 - 0.92104 * mu)
}

/// nanolamberts → V mag/arcsec² (Krisciunas & Schaefer 1991 eq. 1).
pub fn nl_to_mu(b_nl: f64) -> f64 {
    if b_nl <= 0.0 {
        return f64::INFINITY;
    }
    (20.7233 - libm::log(b_nl / 34.08)) / 0.92104
}

/// Moon's V magnitude at phase angle `phase_angle_deg` (Krisciunas & Schaefer 1991 eq. 9).
pub fn moon_vmag(phase_angle_deg: f64) -> f64 {
    let a = phase_angle_deg.abs();
    -12.73 + 0.026 * a + 4.0e-9 * a * a * a * a
}

/// Scattering function f(ρ) (Krisciunas & Schaefer 1991 eq. 21); ρ held at ≥ 10°,
/// the smallest separation the fit covers.
pub fn ks_scattering(rho_deg: f64) -> f64 {
    let rho = rho_deg.clamp(10.0, 180.0);
    let c = libm::cos(rho.to_radians());
    exp10(5.36) * (1.06 + c * c) + exp10(6.15 - rho / 40.0)
}

/// Moonlight added to the sky at a target, nL (Krisciunas & Schaefer 1991 eq. 15):
/// B = f(ρ)·I*·10^(−0.4 k X(Zm))·[1 − 10^(−0.4 k X(Z))], I* = 10^(−0.4(m + 16.57)).
pub fn moonlight_nl(phase_angle_deg: f64, moon_target_sep_deg: f64, moon_alt_rad: f64, target_alt_rad: f64, k_mag: f64) -> f64 {
    if moon_alt_rad <= 0.0 {
        return 0.0;
    }
    let i_star = exp10(-0.4 * (moon_vmag(phase_angle_deg) + 16.57));
    let att_moon = exp10(-0.4 * k_mag * ks_airmass(moon_alt_rad));
    let scat = 1.0 - exp10(-0.4 * k_mag * ks_airmass(target_alt_rad));
    ks_scattering(moon_target_sep_deg) * i_star * att_moon * scat
}

/// Moonless sky brightness at altitude, nL (Krisciunas & Schaefer 1991 eq. 2: B_zen·10^(−0.4k(X−1))·X).
pub fn dark_sky_nl(zenith_mu: f64, target_alt_rad: f64, k_mag: f64) -> f64 {
    let x = ks_airmass(target_alt_rad);
    mu_to_nl(zenith_mu) * exp10(-0.4 * k_mag * (x - 1.0)) * x
}

/// Rough twilight sky term, nL: zenith twilight fades about 1.15 mag/arcsec² per
/// degree of solar depression from about 5 mag/arcsec² at sunset (from memory, approximate;
/// it matters only between sunset and about −16°). Sun above the horizon: daylight.
pub fn twilight_nl(sun_alt_rad: f64) -> f64 {
    let h = sun_alt_rad.to_degrees();
    let mu = if h >= 0.0 { 4.0 } else { 5.0 + 1.15 * (-h) };
    mu_to_nl(mu)
}

/// Everything that lights the sky at one target at one moment.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct SkyAt {
    pub zenith_mu: f64,
    pub k_mag: f64,
    pub target_alt_rad: f64,
    pub sun_alt_rad: f64,
    pub moon_alt_rad: f64,
    pub moon_phase_angle_deg: f64,
    pub moon_sep_deg: f64,
}

/// Total sky brightness at the target, V mag/arcsec² (sum of the three terms above).
pub fn sky_mu_at(s: &SkyAt) -> f64 {
    let b = dark_sky_nl(s.zenith_mu, s.target_alt_rad, s.k_mag)
        + moonlight_nl(s.moon_phase_angle_deg, s.moon_sep_deg, s.moon_alt_rad, s.target_alt_rad, s.k_mag)
        + twilight_nl(s.sun_alt_rad);
    nl_to_mu(b)
}

/// Extinction of the object's light, mag: k·X (Krisciunas & Schaefer 1991 air mass).
pub fn extinction_mag(k_mag: f64, alt_rad: f64) -> f64 {
    k_mag * ks_airmass(alt_rad)
}

/// 10^x through exp (cheaper than pow in the inner loop).
#[inline]
fn exp10(x: f64) -> f64 {
    libm::exp(x * core::f64::consts::LN_10)
}
