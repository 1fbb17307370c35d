//! 3-D fold geometry of a light path: each mirror or prism face a reflection
//! matrix (a roof counts as two faces), each real image a half-turn about the
//! beam. Composed, they map a ray's direction on entry to its direction on exit.
//!
//! Why this is enough for orientation: an ideal optical train is, for the
//! direction of a field ray relative to the chief ray, a product of plane
//! reflections (a powered mirror acts on the chief ray like a plane mirror at
//! its vertex) and point inversions at each real intermediate image; scale
//! (magnification) does not change parity or rotation.

use super::train::*;
use glam::{DMat3, DVec3};

/// The tube's own frame in world coordinates: `axis` toward the sky, `top`
/// the reference side, `left` = top × axis (the left side seen from behind
/// looking toward the sky).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TubeFrame {
    pub axis: DVec3,
    pub top: DVec3,
    pub left: DVec3,
}

impl TubeFrame {
    pub fn new(axis: DVec3, top: DVec3) -> Self {
        let axis = axis.normalize();
        let top = (top - top.dot(axis) * axis).normalize();
        TubeFrame { axis, top, left: top.cross(axis) }
    }
}

/// One optical event.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Op {
    /// A reflecting surface with this unit normal.
    Mirror(DVec3),
    /// A real image: field directions turn 180° about the beam.
    Focus,
}

/// Reflection in a plane with unit normal n: R = I − 2 n nᵀ (Householder).
pub fn reflection(n: DVec3) -> DMat3 {
    DMat3::IDENTITY - 2.0 * outer(n, n)
}

/// Half-turn about unit axis a: 2 a aᵀ − I (Rodrigues' formula at 180°).
pub fn half_turn(a: DVec3) -> DMat3 {
    2.0 * outer(a, a) - DMat3::IDENTITY
}

fn outer(a: DVec3, b: DVec3) -> DMat3 {
    DMat3::from_cols(a * b.x, a * b.y, a * b.z)
}

/// The unit part of `v` perpendicular to unit `d`, if it is not (nearly) parallel.
pub fn perpendicular(v: DVec3, d: DVec3) -> Option<DVec3> {
    let p = v - v.dot(d) * d;
    let len = p.length();
    if len > 1e-9 {
        Some(p / len)
    } else {
        None
    }
}

/// Turn unit vector `u0` (perpendicular to the view direction `view`) by
/// `angle_rad` toward the left of an observer looking along `view`.
pub fn turn_left(u0: DVec3, view: DVec3, angle_rad: f64) -> DVec3 {
    libm::cos(angle_rad) * u0 + libm::sin(angle_rad) * u0.cross(view)
}

/// A light path being built: the ops so far, their composed map, the beam's
/// current direction of travel.
#[derive(Clone, Debug, PartialEq)]
pub struct LightPath {
    pub ops: Vec<Op>,
    pub map: DMat3,
    /// Direction the light travels now (unit).
    pub dir: DVec3,
}

impl LightPath {
    /// Light arriving from the sky, travelling down the tube (−axis).
    pub fn entering(frame: &TubeFrame) -> Self {
        LightPath { ops: Vec::new(), map: DMat3::IDENTITY, dir: -frame.axis }
    }

    /// Reflect off a face with this normal (any length but zero).
    pub fn mirror(&mut self, normal: DVec3) {
        let n = normal.normalize();
        let r = reflection(n);
        self.map = r * self.map;
        self.dir = (r * self.dir).normalize();
        self.ops.push(Op::Mirror(n));
    }

    /// Form a real image: field directions turn 180° about the beam.
    pub fn focus(&mut self) {
        self.map = half_turn(self.dir) * self.map;
        self.ops.push(Op::Focus);
    }

    /// One flat face turning the beam into direction `out` (not equal to the beam).
    pub fn fold_to(&mut self, out: DVec3) {
        self.mirror(self.dir - out.normalize());
    }

    /// A roof (two faces at 90°, edge in the plane of the fold) turning the
    /// beam into `out`: the fold of a single face plus a flip across the fold plane.
    pub fn roof_fold_to(&mut self, out: DVec3) {
        let out = out.normalize();
        let n = (self.dir - out).normalize();
        let edge = (self.dir + out).normalize();
        let m = edge.cross(n);
        self.mirror(n + m);
        self.mirror(n - m);
    }

    /// A Porro prism pair (four faces): the beam leaves parallel to how it came,
    /// the image turned 180° about the beam.
    pub fn porro_pair(&mut self, frame: &TubeFrame) {
        let d = self.dir;
        // First prism: down to −top, back along −d; roof edge along `left`.
        self.fold_to(-frame.top);
        self.fold_to(-d);
        // Second prism: sideways to −left, then onward along d; edge along `top`.
        self.fold_to(-frame.left);
        self.fold_to(d);
    }

    /// Number of reflections so far.
    pub fn reflections(&self) -> u32 {
        self.ops.iter().filter(|o| matches!(o, Op::Mirror(_))).count() as u32
    }
}

/// The light path of a whole train in the given tube frame.
pub fn build(train: &Train, frame: &TubeFrame) -> LightPath {
    build_with_pole(train, frame, None)
}

/// As `build`, with the direction of the mount's polar axis (toward the
/// elevated pole) for a coudé focus; without it the tube's top stands in
/// (same folds and reflection count, different angle).
pub fn build_with_pole(train: &Train, frame: &TubeFrame, pole: Option<DVec3>) -> LightPath {
    let mut p = LightPath::entering(frame);
    let a = frame.axis;
    match &train.instrument {
        Instrument::NakedEye(_) => {}
        Instrument::Binoculars(_) => {
            p.focus();
            p.porro_pair(frame);
        }
        Instrument::Finder(f) => {
            p.focus();
            if f.erecting {
                p.porro_pair(frame);
            }
        }
        Instrument::Telescope(t) => match t.design {
            Design::Refractor => p.focus(),
            Design::Newtonian { focuser_angle_deg } => {
                p.mirror(a);
                p.focus();
                let out = turn_left(frame.top, a, focuser_angle_deg.to_radians());
                p.fold_to(out);
            }
            Design::ClassicalCassegrain | Design::SchmidtCassegrain | Design::MaksutovCassegrain => {
                p.mirror(a);
                p.mirror(a);
                p.focus();
            }
            Design::PrimeFocus => {
                p.mirror(a);
                p.focus();
            }
            Design::Nasmyth { port } => {
                p.mirror(a);
                p.mirror(a);
                let side = match port {
                    Port::Left => frame.left,
                    Port::Right => -frame.left,
                };
                p.fold_to(side);
                p.focus();
            }
            Design::Coude => {
                p.mirror(a);
                p.mirror(a);
                // Out along the declination axis, then down the polar axis.
                p.fold_to(frame.left);
                let pole = pole.and_then(|q| perpendicular(q, frame.left)).unwrap_or(frame.top);
                p.fold_to(-pole);
                p.focus();
            }
        },
    }
    if let Some(d) = train.diagonal() {
        add_diagonal(&mut p, frame, d);
    }
    p
}

/// A star diagonal at its rotation: the eyepiece end swung from the tube's top
/// side (or, if the beam runs along it, from the sky end) toward the left.
fn add_diagonal(p: &mut LightPath, frame: &TubeFrame, d: &StarDiagonal) {
    if d.prism == DiagonalKind::None {
        return;
    }
    let beam = p.dir;
    let r0 = perpendicular(frame.top, beam)
        .or_else(|| perpendicular(frame.axis, beam))
        .unwrap_or(frame.left);
    let w = turn_left(r0, -beam, d.rotation_deg.to_radians());
    let dev = d.prism.deviation_deg().to_radians();
    let out = libm::cos(dev) * beam + libm::sin(dev) * w;
    if d.prism.is_roof() {
        p.roof_fold_to(out);
    } else {
        p.fold_to(out);
    }
}
