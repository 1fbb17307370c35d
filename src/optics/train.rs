//! The optical train: instrument, accessories in light-path order, mount.
//!
//! Plain serde data (snake_case JSON, `kind`/`type` tags). Nothing here is
//! trusted: `validate::validate` checks every number before any figure or
//! orientation is computed.

use crate::json::{self, tagged};
use serde::{Deserialize, Deserializer, Serialize};

/// One way of looking: an instrument, its accessories front to back, its mount.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Train {
    #[serde(default)]
    pub name: String,
    pub instrument: Instrument,
    /// Light-path order: a full-aperture solar filter first, the eyepiece,
    /// camera or phone last.
    #[serde(default)]
    pub accessories: Vec<Accessory>,
    #[serde(default)]
    pub mount: Mount,
}

/// What gathers the light. (`Deserialize` by hand below: see `crate::json`.)
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Instrument {
    /// The naked eye: the 1× reference.
    NakedEye(NakedEye),
    Telescope(Telescope),
    Binoculars(Binoculars),
    /// A small finder with its own fixed eyepiece.
    Finder(Finder),
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct NakedEye {
    /// The part of the sky the view shows around the target.
    #[serde(default = "default_naked_field_deg")]
    pub field_deg: f64,
}

fn default_naked_field_deg() -> f64 {
    100.0
}

impl Default for NakedEye {
    fn default() -> Self {
        NakedEye { field_deg: default_naked_field_deg() }
    }
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Telescope {
    pub design: Design,
    pub aperture_mm: f64,
    pub focal_length_mm: f64,
    /// Diameter of the central obstruction (secondary mirror or its holder).
    #[serde(default)]
    pub obstruction_mm: f64,
    /// Reflectivity of each mirror (aluminium about 0.88–0.92, enhanced
    /// coatings up to 0.97: typical values, from memory).
    #[serde(default = "default_mirror_reflectivity")]
    pub mirror_reflectivity: f64,
    /// Transmission of the objective lens or the corrector plate / meniscus.
    #[serde(default = "default_glass_transmission")]
    pub glass_transmission: f64,
}

pub(crate) fn default_mirror_reflectivity() -> f64 {
    0.90
}
pub(crate) fn default_glass_transmission() -> f64 {
    0.95
}

/// The optical design, which fixes the folds of the light path. (`Deserialize` below.)
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum Design {
    /// Objective lens, eyepiece straight behind it.
    Refractor,
    /// Concave primary, flat secondary sending the beam out of the side.
    Newtonian {
        /// Where the focuser sits around the tube: 0 = on the tube's top side,
        /// 90 = on its left side, seen from behind looking toward the sky.
        #[serde(default)]
        focuser_angle_deg: f64,
    },
    /// Concave primary, convex secondary, focus behind the primary.
    ClassicalCassegrain,
    /// Cassegrain with a full-aperture Schmidt corrector plate.
    SchmidtCassegrain,
    /// Cassegrain with a full-aperture Maksutov meniscus.
    MaksutovCassegrain,
    /// A camera at the focus of the primary mirror, inside the tube.
    PrimeFocus,
    /// Cassegrain with a flat tertiary sending the beam out along the mount's
    /// second axis (altitude axis on an alt-az mount; declination axis on an equatorial).
    Nasmyth {
        #[serde(default)]
        port: Port,
    },
    /// Coudé-type: Cassegrain, a flat on the declination axis, a flat on the
    /// polar axis sending the beam down it to a fixed room (equatorial mounts only).
    Coude,
}

impl Design {
    /// Number of reflections in the telescope itself (before accessories).
    pub fn mirror_count(&self) -> u32 {
        match self {
            Design::Refractor => 0,
            Design::PrimeFocus => 1,
            Design::Newtonian { .. }
            | Design::ClassicalCassegrain
            | Design::SchmidtCassegrain
            | Design::MaksutovCassegrain => 2,
            Design::Nasmyth { .. } => 3,
            Design::Coude => 4,
        }
    }
    /// Whether a lens or full-aperture corrector is in the beam.
    pub fn has_glass(&self) -> bool {
        matches!(self, Design::Refractor | Design::SchmidtCassegrain | Design::MaksutovCassegrain)
    }
    /// A short plain name for words and advice.
    pub fn label(&self) -> &'static str {
        match self {
            Design::Refractor => "refractor",
            Design::Newtonian { .. } => "Newtonian",
            Design::ClassicalCassegrain => "Cassegrain",
            Design::SchmidtCassegrain => "Schmidt-type Cassegrain",
            Design::MaksutovCassegrain => "Maksutov-type Cassegrain",
            Design::PrimeFocus => "prime-focus camera",
            Design::Nasmyth { .. } => "Nasmyth-type folded telescope",
            Design::Coude => "coudé-type folded telescope",
        }
    }
}

/// Which side of the tube the Nasmyth beam leaves, seen from behind looking
/// toward the sky.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Port {
    #[default]
    Left,
    Right,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Binoculars {
    pub aperture_mm: f64,
    pub magnification: f64,
    /// Stated true field; preferred over the apparent field when given.
    #[serde(default)]
    pub true_field_deg: Option<f64>,
    #[serde(default)]
    pub apparent_field_deg: Option<f64>,
    #[serde(default)]
    pub eye_relief_mm: Option<f64>,
    /// Whole-instrument transmission (typical 0.8–0.9, from memory).
    #[serde(default = "default_binocular_transmission")]
    pub transmission: f64,
}

pub(crate) fn default_binocular_transmission() -> f64 {
    0.85
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Finder {
    pub aperture_mm: f64,
    pub magnification: f64,
    pub true_field_deg: f64,
    /// Built-in erecting prisms (upright, unreversed view when straight).
    #[serde(default)]
    pub erecting: bool,
    #[serde(default = "default_binocular_transmission")]
    pub transmission: f64,
}

/// One item in the light path after the instrument's own optics. (`Deserialize` below.)
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Accessory {
    StarDiagonal(StarDiagonal),
    Barlow(FocalModifier),
    Reducer(FocalModifier),
    Filter(Filter),
    Eyepiece(Eyepiece),
    Camera(Camera),
    /// A phone camera held to the eyepiece (afocal).
    Phone(Phone),
}

impl Accessory {
    pub fn label(&self) -> &'static str {
        match self {
            Accessory::StarDiagonal(_) => "star diagonal",
            Accessory::Barlow(_) => "Barlow lens",
            Accessory::Reducer(_) => "focal reducer",
            Accessory::Filter(_) => "filter",
            Accessory::Eyepiece(_) => "eyepiece",
            Accessory::Camera(_) => "camera",
            Accessory::Phone(_) => "phone",
        }
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum DiagonalKind {
    /// No fold (the slot left empty); kept so a form can offer "none".
    None,
    /// A flat mirror at 45°, beam turned 90°.
    Mirror90,
    /// A right-angle prism (one internal reflection), beam turned 90°.
    Prism90,
    /// An erecting roof prism turning the beam 45°.
    ErectingRoof45,
    /// An erecting roof prism turning the beam 90°.
    ErectingRoof90,
}

impl DiagonalKind {
    /// Deviation of the beam in degrees.
    pub fn deviation_deg(self) -> f64 {
        match self {
            DiagonalKind::None => 0.0,
            DiagonalKind::ErectingRoof45 => 45.0,
            _ => 90.0,
        }
    }
    pub fn is_roof(self) -> bool {
        matches!(self, DiagonalKind::ErectingRoof45 | DiagonalKind::ErectingRoof90)
    }
    /// Typical transmission (from memory: dielectric mirror 0.97+, prisms about 0.95).
    pub fn default_transmission(self) -> f64 {
        match self {
            DiagonalKind::None => 1.0,
            DiagonalKind::Mirror90 => 0.95,
            DiagonalKind::Prism90 => 0.95,
            DiagonalKind::ErectingRoof45 | DiagonalKind::ErectingRoof90 => 0.90,
        }
    }
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StarDiagonal {
    pub prism: DiagonalKind,
    /// Where the eyepiece end points around the incoming beam: 0 = toward the
    /// tube's top side, 90 = its left side, seen from behind looking toward the sky.
    #[serde(default)]
    pub rotation_deg: f64,
    #[serde(default)]
    pub transmission: Option<f64>,
}

/// A Barlow lens (factor > 1) or focal reducer (factor < 1).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct FocalModifier {
    /// The factor printed on it, valid at its design spacing from the focus.
    pub factor: f64,
    /// Focal length of its lens (magnitude); needed only with extra spacing.
    #[serde(default)]
    pub lens_focal_length_mm: Option<f64>,
    /// Extra distance between the lens and the focus beyond its design spacing.
    #[serde(default)]
    pub extra_spacing_mm: f64,
    #[serde(default = "default_lens_transmission")]
    pub transmission: f64,
}

pub(crate) fn default_lens_transmission() -> f64 {
    0.96
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum FilterKind {
    /// Neutral density or "Moon" filter.
    Neutral,
    /// Narrow or broad band-pass nebula filter.
    NebulaBandPass,
    /// Full-aperture solar filter: must cover the front of the instrument.
    Solar,
    Colour,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Filter {
    pub filter: FilterKind,
    /// Fraction of visible light passed (solar film about 1e-5).
    pub transmission: f64,
}

#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
pub enum Barrel {
    #[default]
    #[serde(rename = "1.25in")]
    In125,
    #[serde(rename = "2in")]
    In2,
}

impl Barrel {
    /// Largest field stop the barrel lets through (common practice: about
    /// 27 mm for 1.25″ and 46 mm for 2″).
    pub fn max_field_stop_mm(self) -> f64 {
        match self {
            Barrel::In125 => 27.0,
            Barrel::In2 => 46.0,
        }
    }
    pub fn label(self) -> &'static str {
        match self {
            Barrel::In125 => "1.25″",
            Barrel::In2 => "2″",
        }
    }
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Eyepiece {
    pub focal_length_mm: f64,
    pub apparent_field_deg: f64,
    #[serde(default)]
    pub field_stop_mm: Option<f64>,
    #[serde(default)]
    pub eye_relief_mm: Option<f64>,
    #[serde(default)]
    pub barrel: Barrel,
    #[serde(default = "default_eyepiece_transmission")]
    pub transmission: f64,
}

pub(crate) fn default_eyepiece_transmission() -> f64 {
    0.95
}

/// How an image file stores its rows.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum RowOrder {
    #[default]
    TopDown,
    BottomUp,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Camera {
    pub sensor_width_mm: f64,
    pub sensor_height_mm: f64,
    pub pixel_pitch_um: f64,
    pub pixels_x: u32,
    pub pixels_y: u32,
    /// Turn of the sensor's top side around the beam: 0 = toward the tube's
    /// top, 90 = its left, seen from behind looking toward the sky.
    #[serde(default)]
    pub rotation_deg: f64,
    #[serde(default)]
    pub row_order: RowOrder,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Phone {
    /// The real (not "equivalent") focal length of the phone's lens.
    pub lens_focal_length_mm: f64,
    #[serde(default)]
    pub pixel_pitch_um: Option<f64>,
    /// Tilt of the phone's top from the observer's head-up, toward the left.
    #[serde(default)]
    pub rotation_deg: f64,
}

#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PierSide {
    /// Tube on the west side of the pier (usual when pointing east).
    #[default]
    West,
    /// Tube on the east side of the pier (after a meridian flip).
    East,
}

/// How the tube is carried. (`Deserialize` below.)
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Mount {
    /// Alt-azimuth (including the rocker base of a Dobsonian).
    #[default]
    AltAz,
    Equatorial {
        #[serde(default)]
        pier_side: PierSide,
    },
}

impl Train {
    /// The eyepiece, if the train has one.
    pub fn eyepiece(&self) -> Option<&Eyepiece> {
        self.accessories.iter().find_map(|a| match a {
            Accessory::Eyepiece(e) => Some(e),
            _ => None,
        })
    }
    pub fn camera(&self) -> Option<&Camera> {
        self.accessories.iter().find_map(|a| match a {
            Accessory::Camera(c) => Some(c),
            _ => None,
        })
    }
    pub fn phone(&self) -> Option<&Phone> {
        self.accessories.iter().find_map(|a| match a {
            Accessory::Phone(p) => Some(p),
            _ => None,
        })
    }
    pub fn diagonal(&self) -> Option<&StarDiagonal> {
        self.accessories.iter().find_map(|a| match a {
            Accessory::StarDiagonal(d) => Some(d),
            _ => None,
        })
    }
}

// The tagged enums' `Deserialize`, by tag (see `crate::json`): the JSON of serde's derive
// with the attributes above (tests/json_formats.rs compares the two).

impl<'de> Deserialize<'de> for Instrument {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        tagged(d, "kind", &["naked_eye", "telescope", "binoculars", "finder"], |name, v| {
            Ok(match name {
                "naked_eye" => Instrument::NakedEye(json::from_value(v)?),
                "telescope" => Instrument::Telescope(json::from_value(v)?),
                "binoculars" => Instrument::Binoculars(json::from_value(v)?),
                "finder" => Instrument::Finder(json::from_value(v)?),
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

impl<'de> Deserialize<'de> for Design {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        #[derive(Deserialize)]
        struct Newtonian {
            #[serde(default)]
            focuser_angle_deg: f64,
        }
        #[derive(Deserialize)]
        struct Nasmyth {
            #[serde(default)]
            port: Port,
        }
        const VARIANTS: &[&str] =
            &["refractor", "newtonian", "classical_cassegrain", "schmidt_cassegrain", "maksutov_cassegrain", "prime_focus", "nasmyth", "coude"];
        tagged(d, "type", VARIANTS, |name, v| {
            Ok(match name {
                "refractor" => Design::Refractor,
                "newtonian" => Design::Newtonian { focuser_angle_deg: json::from_value::<Newtonian>(v)?.focuser_angle_deg },
                "classical_cassegrain" => Design::ClassicalCassegrain,
                "schmidt_cassegrain" => Design::SchmidtCassegrain,
                "maksutov_cassegrain" => Design::MaksutovCassegrain,
                "prime_focus" => Design::PrimeFocus,
                "nasmyth" => Design::Nasmyth { port: json::from_value::<Nasmyth>(v)?.port },
                "coude" => Design::Coude,
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

impl<'de> Deserialize<'de> for Accessory {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        tagged(d, "kind", &["star_diagonal", "barlow", "reducer", "filter", "eyepiece", "camera", "phone"], |name, v| {
            Ok(match name {
                "star_diagonal" => Accessory::StarDiagonal(json::from_value(v)?),
                "barlow" => Accessory::Barlow(json::from_value(v)?),
                "reducer" => Accessory::Reducer(json::from_value(v)?),
                "filter" => Accessory::Filter(json::from_value(v)?),
                "eyepiece" => Accessory::Eyepiece(json::from_value(v)?),
                "camera" => Accessory::Camera(json::from_value(v)?),
                "phone" => Accessory::Phone(json::from_value(v)?),
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

impl<'de> Deserialize<'de> for Mount {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        #[derive(Deserialize)]
        struct Equatorial {
            #[serde(default)]
            pier_side: PierSide,
        }
        tagged(d, "kind", &["alt_az", "equatorial"], |name, v| {
            Ok(match name {
                "alt_az" => Mount::AltAz,
                "equatorial" => Mount::Equatorial { pier_side: json::from_value::<Equatorial>(v)?.pier_side },
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

// The unit-only enums' `Deserialize` (one shared reader, see `json::unit_variant`), with
// the names their `Serialize` derive writes.
json::unit_variants!(Port { Left = "left", Right = "right" });
json::unit_variants!(DiagonalKind { None = "none", Mirror90 = "mirror90", Prism90 = "prism90", ErectingRoof45 = "erecting_roof45", ErectingRoof90 = "erecting_roof90" });
json::unit_variants!(FilterKind { Neutral = "neutral", NebulaBandPass = "nebula_band_pass", Solar = "solar", Colour = "colour" });
json::unit_variants!(Barrel { In125 = "1.25in", In2 = "2in" });
json::unit_variants!(RowOrder { TopDown = "top_down", BottomUp = "bottom_up" });
json::unit_variants!(PierSide { West = "west", East = "east" });
