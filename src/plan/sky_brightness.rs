//! The planner's sky inputs: a named dark-sky class or a measured zenith value,
//! the night sky's colour, and the extinction of a target's light. The sky
//! brightness at a target (air-mass gradient, moonlight after Krisciunas &
//! Schaefer 1991, twilight) is computed by `crate::sky::brightness`, the one
//! implementation the view uses too.

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

/// Extinction of the object's light, mag: k·X (Krisciunas & Schaefer 1991 air mass),
/// from the altitude (`sky::darkness::extinction_mag` takes an air mass instead).
pub fn extinction_at_alt_mag(k_mag: f64, alt_rad: f64) -> f64 {
    k_mag * crate::sky::brightness::ks_airmass(alt_rad)
}
