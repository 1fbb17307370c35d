//! Finder models: straight-through magnifying finder, right-angle finder,
//! unit-power reflex sight with rings, binoculars. Each gives its field, its
//! limiting magnitude and its view orientation as an `orient::SkyToScreen`.
//!
//! Orientation is built in two steps: the naked-eye view of that part of the
//! sky with the zenith (or whatever the caller calls "up") at the top, then
//! the finder's own optical parity in the observer's screen frame. This is
//! finder-specific closed form; tests/find_orient_xcheck.rs checks it equal
//! to the optics module's general 3-D fold model (`orient::orientation`) for
//! each finder expressed as a train (`Finder::to_train`).

use super::{check, FindError};
use crate::optics::train::Train;
use crate::orient::SkyToScreen;
use glam::{DMat2, DVec2};
use crate::json::{self, tagged};
use serde::{Deserialize, Deserializer, Serialize};

/// The prism or mirror in a right-angle finder. (`Deserialize`: `json::unit_variants!` below.)
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PrismKind {
    /// Roof (Amici) prism: image erect and correct, as by eye.
    Erect,
    /// Plain mirror or right-angle prism: right way up but mirror-reversed
    /// left–right (eyepiece turned in the vertical plane, as usually mounted).
    Mirror,
}

/// The kind of finder. (`Deserialize` by hand below: see `crate::json`.)
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum FinderKind {
    /// Objective + eyepiece, no erecting optics: the view is turned 180°.
    StraightThrough,
    /// Objective + diagonal + eyepiece.
    RightAngle { prism: PrismKind },
    /// Unit power: a projected target of concentric rings on a window.
    /// `ring_radii_deg` are the rings' angular radii on the sky (inputs, no presets).
    ReflexSight { ring_radii_deg: Vec<f64> },
    /// Porro or roof prism binoculars: erect and correct.
    Binoculars,
}

json::unit_variants!(PrismKind { Erect = "erect", Mirror = "mirror" });

impl<'de> Deserialize<'de> for FinderKind {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        #[derive(Deserialize)]
        struct RightAngle {
            prism: PrismKind,
        }
        #[derive(Deserialize)]
        struct ReflexSight {
            ring_radii_deg: Vec<f64>,
        }
        tagged(d, "type", &["straight_through", "right_angle", "reflex_sight", "binoculars"], |name, v| {
            Ok(match name {
                "straight_through" => FinderKind::StraightThrough,
                "right_angle" => FinderKind::RightAngle { prism: json::from_value::<RightAngle>(v)?.prism },
                "reflex_sight" => FinderKind::ReflexSight { ring_radii_deg: json::from_value::<ReflexSight>(v)?.ring_radii_deg },
                "binoculars" => FinderKind::Binoculars,
                _ => return Err(json::unlisted(name)),
            })
        })
    }
}

/// A finder as the user describes it. For a reflex sight, `aperture_mm` and
/// `magnification` are ignored (unit power) and `true_field_deg` is the
/// window's field.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct FinderSpec {
    pub kind: FinderKind,
    pub aperture_mm: f64,
    pub magnification: f64,
    pub true_field_deg: f64,
}

/// A validated finder.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Finder {
    pub spec: FinderSpec,
    field_radius_rad: f64,
}

/// Light transmission of a finder's or binocular's glass (from memory: about
/// 80 % for simple coated optics), and a reflex sight's window (about 90 %).
pub const GLASS_TRANSMISSION: f64 = 0.8;
pub const WINDOW_TRANSMISSION: f64 = 0.9;

/// Where the main telescope's field sits in the finder view: centre and
/// radius in finder-view units (right, up), the finder's field edge = 1.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct FieldMarker {
    pub centre_right: f64,
    pub centre_up: f64,
    pub radius: f64,
}

/// Everything a renderer needs to draw a finder view.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FinderView {
    pub orientation: [f64; 4],
    pub field_radius_rad: f64,
    pub limiting_mag: f64,
    /// Reflex-sight rings in finder-view units (window edge = 1); empty otherwise.
    pub rings: Vec<f64>,
    pub main_field: FieldMarker,
    pub orientation_words: &'static str,
}

impl Finder {
    /// Validate a finder description (ranges say what the trade sells, with room).
    pub fn new(spec: FinderSpec) -> Result<Finder, FindError> {
        check("finder true field", spec.true_field_deg, 0.2, 60.0, "between 0.2° and 60°")?;
        match &spec.kind {
            FinderKind::ReflexSight { ring_radii_deg } => {
                if ring_radii_deg.is_empty() {
                    return Err(FindError::Empty { field: "reflex sight ring radii" });
                }
                if ring_radii_deg.len() > 8 {
                    return Err(FindError::OutOfRange {
                        field: "number of reflex sight rings",
                        value: ring_radii_deg.len() as f64,
                        allowed: "from 1 to 8",
                    });
                }
                for &r in ring_radii_deg {
                    check("reflex sight ring radius", r, 0.05, 15.0, "between 0.05° and 15°")?;
                }
            }
            _ => {
                check("finder aperture", spec.aperture_mm, 5.0, 200.0, "between 5 mm and 200 mm")?;
                check("finder magnification", spec.magnification, 1.0, 50.0, "between 1× and 50×")?;
            }
        }
        let field_radius_rad = match &spec.kind {
            // Hops with a reflex sight are sized by its outer ring, not the window.
            FinderKind::ReflexSight { ring_radii_deg } => {
                ring_radii_deg.iter().cloned().fold(0.0, f64::max).to_radians()
            }
            _ => (spec.true_field_deg / 2.0).to_radians(),
        };
        Ok(Finder { spec, field_radius_rad })
    }

    /// Radius of the field that a hop must fit in: the true field's radius,
    /// or a reflex sight's outer ring.
    pub fn field_radius_rad(&self) -> f64 {
        self.field_radius_rad
    }

    /// Faintest star visible through the finder. Light-grasp gain over the
    /// dark-adapted eye, 5·log10(D_eff / pupil) with D_eff = min(D, M·pupil)
    /// (common practice), less the glass loss −2.5·log10(T).
    pub fn limiting_mag(&self, naked_eye_limit_mag: f64, eye_pupil_mm: f64) -> Result<f64, FindError> {
        check("naked-eye limiting magnitude", naked_eye_limit_mag, 0.0, 8.5, "between 0 and 8.5")?;
        check("eye pupil", eye_pupil_mm, 2.0, 9.0, "between 2 mm and 9 mm")?;
        let loss = |t: f64| -2.5 * libm::log10(t);
        Ok(match self.spec.kind {
            FinderKind::ReflexSight { .. } => naked_eye_limit_mag - loss(WINDOW_TRANSMISSION),
            _ => crate::optics::figures::limiting_mag(
                naked_eye_limit_mag,
                self.spec.aperture_mm,
                self.spec.magnification,
                eye_pupil_mm,
                GLASS_TRANSMISSION,
            ),
        })
    }

    /// The finder's optical parity in the observer's screen frame (right, up),
    /// applied after the naked-eye view.
    pub fn parity(&self) -> DMat2 {
        match self.spec.kind {
            FinderKind::StraightThrough => DMat2::from_cols_array(&[-1.0, 0.0, 0.0, -1.0]),
            FinderKind::RightAngle { prism: PrismKind::Mirror } => DMat2::from_cols_array(&[-1.0, 0.0, 0.0, 1.0]),
            FinderKind::RightAngle { prism: PrismKind::Erect }
            | FinderKind::ReflexSight { .. }
            | FinderKind::Binoculars => DMat2::IDENTITY,
        }
    }

    /// Orientation of the finder view. `up_pa_rad` is the position angle
    /// (from north through east) of the sky direction the observer calls up:
    /// for a finder on an alt-azimuth mount, the zenith, i.e. the parallactic
    /// angle. View = parity · R(−up_pa) · chart.
    pub fn orientation(&self, up_pa_rad: f64) -> SkyToScreen {
        SkyToScreen { m: self.parity() * naked_eye(up_pa_rad).m }
    }

    /// Plain words for the orientation relative to the naked eye.
    pub fn orientation_words(&self) -> &'static str {
        match self.spec.kind {
            FinderKind::StraightThrough => "upside down: turned 180° from the naked-eye view",
            FinderKind::RightAngle { prism: PrismKind::Mirror } => "right way up but mirror-reversed left–right",
            FinderKind::RightAngle { prism: PrismKind::Erect } => "as seen by eye: right way up and not mirrored",
            FinderKind::ReflexSight { .. } => "as seen by eye: unit power, the rings lie on the sky",
            FinderKind::Binoculars => "as seen by eye: right way up and not mirrored",
        }
    }

    /// The main telescope's field inside the finder view. `offset_en_rad` is
    /// where the main scope points relative to the finder's centre (east,
    /// north; zero when aligned).
    pub fn main_field_marker(&self, main_true_field_rad: f64, offset_en_rad: (f64, f64), up_pa_rad: f64) -> Result<FieldMarker, FindError> {
        check("main telescope true field", main_true_field_rad, 1e-5, 1.0, "between 0.0006° and 57° (in radians, above 0)")?;
        check("finder offset east", offset_en_rad.0, -0.5, 0.5, "within ±0.5 rad")?;
        check("finder offset north", offset_en_rad.1, -0.5, 0.5, "within ±0.5 rad")?;
        let r = self.view_radius_rad();
        let c = self.orientation(up_pa_rad).m * DVec2::new(offset_en_rad.0, offset_en_rad.1) / r;
        Ok(FieldMarker { centre_right: c.x, centre_up: c.y, radius: main_true_field_rad / 2.0 / r })
    }

    /// This finder as an optics train on an alt-azimuth mount, for the
    /// general orientation model (`orient::orientation`, `orient::report`):
    /// the right-angle finder's eyepiece points toward the tube's top.
    pub fn to_train(&self) -> Train {
        use crate::optics::train as t;
        let finder = |erecting| {
            t::Instrument::Finder(t::Finder {
                aperture_mm: self.spec.aperture_mm,
                magnification: self.spec.magnification,
                true_field_deg: self.spec.true_field_deg,
                erecting,
                transmission: GLASS_TRANSMISSION,
            })
        };
        let diagonal = |prism| t::Accessory::StarDiagonal(t::StarDiagonal { prism, rotation_deg: 0.0, transmission: None });
        let (instrument, accessories) = match self.spec.kind {
            FinderKind::StraightThrough => (finder(false), vec![]),
            FinderKind::RightAngle { prism: PrismKind::Mirror } => (finder(false), vec![diagonal(t::DiagonalKind::Mirror90)]),
            FinderKind::RightAngle { prism: PrismKind::Erect } => (finder(false), vec![diagonal(t::DiagonalKind::ErectingRoof90)]),
            FinderKind::ReflexSight { .. } => (t::Instrument::NakedEye(t::NakedEye { field_deg: self.spec.true_field_deg }), vec![]),
            FinderKind::Binoculars => (
                t::Instrument::Binoculars(t::Binoculars {
                    aperture_mm: self.spec.aperture_mm,
                    magnification: self.spec.magnification,
                    true_field_deg: Some(self.spec.true_field_deg),
                    apparent_field_deg: None,
                    eye_relief_mm: None,
                    transmission: GLASS_TRANSMISSION,
                }),
                vec![],
            ),
        };
        Train { name: String::new(), instrument, accessories, mount: t::Mount::AltAz }
    }

    /// Radius of what the eye sees through the finder (a reflex sight's window).
    pub fn view_radius_rad(&self) -> f64 {
        (self.spec.true_field_deg / 2.0).to_radians()
    }

    /// The data to draw this finder's view.
    pub fn view(&self, up_pa_rad: f64, main_true_field_rad: f64, offset_en_rad: (f64, f64), naked_eye_limit_mag: f64) -> Result<FinderView, FindError> {
        let m = self.orientation(up_pa_rad).m;
        let rings = match &self.spec.kind {
            FinderKind::ReflexSight { ring_radii_deg } => {
                ring_radii_deg.iter().map(|r| r.to_radians() / self.view_radius_rad()).collect()
            }
            _ => Vec::new(),
        };
        Ok(FinderView {
            orientation: m.to_cols_array(),
            field_radius_rad: self.view_radius_rad(),
            limiting_mag: self.limiting_mag(naked_eye_limit_mag, 7.0)?,
            rings,
            main_field: self.main_field_marker(main_true_field_rad, offset_en_rad, up_pa_rad)?,
            orientation_words: self.orientation_words(),
        })
    }
}

/// The naked-eye view with the sky direction at position angle `up_pa_rad`
/// at the top: the chart [[-1,0],[0,1]] turned by −up_pa (`orient::naked_eye_view`).
pub fn naked_eye(up_pa_rad: f64) -> SkyToScreen {
    crate::orient::naked_eye_view(up_pa_rad)
}
