//! Image orientation: how an optical train and its mount turn and mirror the sky.
//!
//! Convention shared by every module: a sky offset is a tangent-plane vector
//! (east, north) in radians; the screen frame is (right, up) as the observer
//! sees it. The naked eye facing the sky, and a chart, show north up and east
//! LEFT: that is the matrix [[-1, 0], [0, 1]] (determinant −1). A train that
//! mirrors the image has determinant +1 in this convention.
//!
//! How it is found: the train's folds in 3-D (`optics::fold`), placed on the
//! mount in a local east-north-zenith world frame built from the altitude
//! and parallactic angle, then read in the observer's frame: an eye (head
//! upright, looking back into the beam), a phone held to the eye's place, or
//! a camera's rows and columns. The transform is orthonormal (scale 1): the
//! view applies magnification itself.

use crate::optics::fold::{self, perpendicular, turn_left, LightPath, TubeFrame};
use crate::optics::train::*;
use crate::optics::validate::{check, validate, OpticsError};
use glam::{DMat2, DVec2, DVec3};
use serde::{Deserialize, Serialize};

/// The 2×2 map from sky offsets (east, north) to screen (right, up).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SkyToScreen {
    pub m: DMat2,
}

impl SkyToScreen {
    /// North up, east left: the chart and naked-eye view.
    pub fn chart() -> Self {
        SkyToScreen { m: DMat2::from_cols_array(&[-1.0, 0.0, 0.0, 1.0]) }
    }
    /// Screen position of a sky offset (east, north).
    pub fn apply(&self, sky: DVec2) -> DVec2 {
        self.m * sky
    }
    /// True if the view is a mirror image of the sky (determinant +1 here).
    pub fn is_mirrored(&self) -> bool {
        self.m.determinant() > 0.0
    }
}

/// Where the target stands and how the user has turned things, at one moment.
#[derive(Clone, Copy, Debug, Default, PartialEq, Serialize, Deserialize)]
pub struct MountState {
    /// Parallactic angle q: position angle of the zenith at the target,
    /// measured from north through east (Meeus, Astronomical Algorithms ch. 14).
    pub parallactic_rad: f64,
    /// Altitude of the target (true or apparent: the small difference does not matter here).
    pub alt_rad: f64,
    /// Overrides the train's pier side (e.g. after a meridian flip tonight).
    #[serde(default)]
    pub pier_side: Option<PierSide>,
    /// Extra turn of the whole picture, anticlockwise on screen (head tilt, image rotation).
    #[serde(default)]
    pub user_rotation_rad: f64,
    /// Declination of the target: needed only for a coudé-type focus (it fixes
    /// where the polar axis points relative to the target).
    #[serde(default)]
    pub dec_rad: Option<f64>,
}

/// Who reads the image at the end of the train.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Reader {
    Eye,
    Phone,
    Camera,
}

/// The whole placed geometry: sky basis, light path, reader's frame.
#[derive(Clone, Debug, PartialEq)]
pub struct Geometry {
    /// Unit vectors in the world frame (x east, y north, z zenith).
    pub target: DVec3,
    pub sky_east: DVec3,
    pub sky_north: DVec3,
    pub zenith: DVec3,
    pub tube: TubeFrame,
    pub path: LightPath,
    pub reader: Reader,
    /// Reader's frame: looking along `view`, `up` and `right` = view × up.
    pub view: DVec3,
    pub up: DVec3,
    pub right: DVec3,
    /// −1 for a camera's readout (a sensor image is shown turned 180° from the
    /// eyepiece view), +1 otherwise.
    pub readout_sign: f64,
    /// Bottom-up row order shown top-down flips the picture vertically.
    pub flip_rows: bool,
    pub user_rotation_rad: f64,
}

fn check_state(s: &MountState) -> Result<(), OpticsError> {
    let tau = 2.0 * std::f64::consts::PI;
    check("mount_state.parallactic_rad", s.parallactic_rad, -2.0 * tau, 2.0 * tau, " rad")?;
    check("mount_state.alt_rad", s.alt_rad, -std::f64::consts::FRAC_PI_2, std::f64::consts::FRAC_PI_2, " rad")?;
    check("mount_state.user_rotation_rad", s.user_rotation_rad, -2.0 * tau, 2.0 * tau, " rad")?;
    if let Some(d) = s.dec_rad {
        check("mount_state.dec_rad", d, -std::f64::consts::FRAC_PI_2, std::f64::consts::FRAC_PI_2, " rad")?;
    }
    Ok(())
}

/// Head upright: the zenith's direction across the line of sight (looking
/// straight up or down, the tube's sky end, then its top, stands in).
fn head_up(zenith: DVec3, tube: &TubeFrame, view: DVec3) -> DVec3 {
    perpendicular(zenith, view)
        .or_else(|| perpendicular(tube.axis, view))
        .or_else(|| perpendicular(tube.top, view))
        .unwrap_or(tube.left)
}

/// Place the train on its mount and find the reader's frame.
pub fn geometry(train: &Train, state: &MountState) -> Result<Geometry, OpticsError> {
    validate(train)?;
    check_state(state)?;
    let (h, q) = (state.alt_rad, state.parallactic_rad);
    // Target due north at altitude h (the azimuth does not change orientation).
    let target = DVec3::new(0.0, libm::cos(h), libm::sin(h));
    let zenith = DVec3::Z;
    let to_zenith = DVec3::new(0.0, -libm::sin(h), libm::cos(h));
    // Direction at position angle +90° from `to_zenith` (x × target turns PA by +90°).
    let pa90 = to_zenith.cross(target);
    let sky_north = libm::cos(q) * to_zenith - libm::sin(q) * pa90;
    let sky_east = libm::sin(q) * to_zenith + libm::cos(q) * pa90;
    let top = match train.mount {
        Mount::AltAz => to_zenith,
        Mount::Equatorial { pier_side } => match state.pier_side.unwrap_or(pier_side) {
            PierSide::West => sky_north,
            PierSide::East => -sky_north,
        },
    };
    let tube = TubeFrame::new(target, top);
    let coude = matches!(&train.instrument, Instrument::Telescope(t) if t.design == Design::Coude);
    let pole = match (coude, state.dec_rad) {
        (false, _) => None,
        // The elevated pole lies 90° − δ from the target toward north.
        (true, Some(d)) => Some(libm::sin(d) * target + libm::cos(d) * sky_north),
        (true, None) => return Err(OpticsError::MissingField { field: "mount_state.dec_rad (a coudé-type focus needs the target's declination)" }),
    };
    let path = fold::build_with_pole(train, &tube, pole);
    let view = -path.dir;
    let (reader, up, readout_sign, flip_rows) = if let Some(cam) = train.camera() {
        let u0 = perpendicular(tube.top, view).or_else(|| perpendicular(tube.axis, view)).unwrap_or(tube.left);
        let up = turn_left(u0, view, cam.rotation_deg.to_radians());
        (Reader::Camera, up, -1.0, cam.row_order == RowOrder::BottomUp)
    } else {
        let head = head_up(zenith, &tube, view);
        match train.phone() {
            Some(ph) => (Reader::Phone, turn_left(head, view, ph.rotation_deg.to_radians()), 1.0, false),
            None => (Reader::Eye, head, 1.0, false),
        }
    };
    let right = view.cross(up);
    Ok(Geometry {
        target,
        sky_east,
        sky_north,
        zenith,
        tube,
        path,
        reader,
        view,
        up,
        right,
        readout_sign,
        flip_rows,
        user_rotation_rad: state.user_rotation_rad,
    })
}

impl Geometry {
    /// The same placement with another light path read by an upright eye
    /// (for testing arbitrary fold geometries).
    pub fn with_path(mut self, path: LightPath) -> Geometry {
        self.view = -path.dir;
        self.up = head_up(self.zenith, &self.tube, self.view);
        self.right = self.view.cross(self.up);
        self.path = path;
        self.reader = Reader::Eye;
        self.readout_sign = 1.0;
        self.flip_rows = false;
        self
    }

    /// Screen (right, up) of a world direction as the reader sees it, before
    /// readout and user turns: gnomonic projection onto the reader's frame.
    fn project(&self, seen: DVec3) -> DVec2 {
        let z = seen.dot(self.view);
        DVec2::new(seen.dot(self.right), seen.dot(self.up)) / z
    }

    fn finish(&self, p: DVec2) -> DVec2 {
        let mut p = p * self.readout_sign;
        if self.flip_rows {
            p.y = -p.y;
        }
        DMat2::from_angle(self.user_rotation_rad) * p
    }

    /// The linear sky-to-screen transform.
    pub fn transform(&self) -> SkyToScreen {
        let l = self.path.map;
        let col = |s: DVec3| {
            let seen = l * s;
            self.finish(DVec2::new(seen.dot(self.right), seen.dot(self.up)))
        };
        SkyToScreen { m: DMat2::from_cols(col(self.sky_east), col(self.sky_north)) }
    }

    /// Trace sky points (east, north offsets in rad, any size below 90°) ray by
    /// ray through the folds to the screen (tangent-plane units, scale 1).
    pub fn trace(&self, sky: &[DVec2]) -> Vec<DVec2> {
        sky.iter()
            .map(|s| {
                let rho = s.length();
                let dir = if rho > 0.0 {
                    let off = (s.x * self.sky_east + s.y * self.sky_north) / rho;
                    libm::cos(rho) * self.target + libm::sin(rho) * off
                } else {
                    self.target
                };
                // Light travels −dir; the reader looks back along the outgoing ray.
                let seen = -(self.path.map * -dir);
                self.finish(self.project(seen))
            })
            .collect()
    }
}

/// Orientation of the view through `train` at this moment.
pub fn orientation(train: &Train, state: &MountState) -> Result<SkyToScreen, OpticsError> {
    Ok(geometry(train, state)?.transform())
}

/// Reflections in the whole train: odd means a mirror image (a camera's
/// bottom-up rows add one more flip).
pub fn reflection_count(train: &Train) -> u32 {
    let frame = TubeFrame::new(DVec3::Y, DVec3::Z);
    fold::build(train, &frame).reflections()
}

/// The naked-eye view of the same sky: zenith up, the sky unmirrored.
pub fn naked_eye_view(parallactic_rad: f64) -> SkyToScreen {
    SkyToScreen { m: DMat2::from_angle(-parallactic_rad) * SkyToScreen::chart().m }
}

/// Unit sky offset (east, north) toward the zenith: position angle q.
pub fn zenith_sky(parallactic_rad: f64) -> DVec2 {
    DVec2::new(libm::sin(parallactic_rad), libm::cos(parallactic_rad))
}

/// Where the zenith, north and east point on screen (unit vectors, right/up).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ScreenMarks {
    pub zenith: [f64; 2],
    pub north: [f64; 2],
    pub east: [f64; 2],
}

pub fn marks(view: &SkyToScreen, parallactic_rad: f64) -> ScreenMarks {
    let unit = |v: DVec2| {
        let u = v.normalize_or_zero();
        [u.x, u.y]
    };
    ScreenMarks {
        zenith: unit(view.apply(zenith_sky(parallactic_rad))),
        north: unit(view.apply(DVec2::Y)),
        east: unit(view.apply(DVec2::X)),
    }
}

/// The orientation in numbers and words, relative to the naked-eye view.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Description {
    pub mirrored: bool,
    /// Turn relative to the naked-eye view (after un-mirroring left–right),
    /// anticlockwise positive, in (−180°, 180°].
    pub rotation_deg: f64,
    pub marks: ScreenMarks,
    pub text: String,
}

/// Eight screen directions, by angle anticlockwise from straight up.
pub fn direction_words(v: [f64; 2]) -> &'static str {
    const NAMES: [&str; 8] = ["top", "upper left", "left", "lower left", "bottom", "lower right", "right", "upper right"];
    let ang = libm::atan2(-v[0], v[1]).to_degrees(); // anticlockwise from up
    let k = libm::round(crate::math::rem_euclid(ang, 360.0) / 45.0) as usize % 8;
    NAMES[k]
}

/// Say the orientation in plain words: "upside down", "mirror-reversed
/// left–right", "rotated 37° anticlockwise, zenith at upper left, north at top".
pub fn describe(view: &SkyToScreen, parallactic_rad: f64) -> Description {
    let eye = naked_eye_view(parallactic_rad).m;
    let rel = view.m * eye.inverse();
    let mirrored = view.is_mirrored();
    // rel = Rot(θ) (unmirrored) or Rot(θ)·diag(−1, 1) (mirrored left–right first).
    let c0 = if mirrored { -rel.x_axis } else { rel.x_axis };
    let mut rot = libm::atan2(c0.y, c0.x).to_degrees();
    if rot <= -180.0 + 1e-9 {
        rot += 360.0;
    }
    let r = libm::round(rot);
    let turn = |deg: f64| {
        if deg > 0.0 {
            format!("rotated {deg:.0}° anticlockwise")
        } else {
            format!("rotated {:.0}° clockwise", -deg)
        }
    };
    let body = match (mirrored, r.abs() as i64) {
        (false, 0) => "upright, as the naked eye sees it".to_string(),
        (false, 180) => "upside down (turned 180°)".to_string(),
        (false, _) => turn(r),
        (true, 0) => "mirror-reversed left–right".to_string(),
        (true, 180) => "mirror-reversed top–bottom".to_string(),
        (true, _) => format!("mirror-reversed left–right and {}", turn(r)),
    };
    let marks = marks(view, parallactic_rad);
    let text = format!(
        "{body}, zenith at {}, north at {}",
        direction_words(marks.zenith),
        direction_words(marks.north)
    );
    Description { mirrored, rotation_deg: rot, marks, text }
}

/// Everything the page and the view need about the orientation, as plain data.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct OrientationReport {
    /// Column-major `[right·east, up·east, right·north, up·north]`:
    /// screen (right, up) = m · (east, north).
    pub m: [f64; 4],
    /// Reflections in the light path (odd: mirror image).
    pub reflections: u32,
    pub description: Description,
}

/// Orientation of `train` now: transform, reflection count, words and marks.
pub fn report(train: &Train, state: &MountState) -> Result<OrientationReport, OpticsError> {
    let g = geometry(train, state)?;
    let t = g.transform();
    Ok(OrientationReport {
        m: t.m.to_cols_array(),
        reflections: g.path.reflections(),
        description: describe(&t, state.parallactic_rad),
    })
}
