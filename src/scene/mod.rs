//! The scene: everything inside the field, as screen-independent tangent-plane
//! offsets (east, north) in radians about the field centre, plus the
//! orientation of the instrument. Built once per scenario change; every pan,
//! zoom or resize re-renders from it (see `crate::render::draw`).
//!
//! Projection: gnomonic (TAN; Calabretta & Greisen 2002, A&A 395, 1077), so a
//! straight line on screen is a great circle on the sky, as in an eyepiece.

pub mod build;
pub mod compose;
pub mod skylight;

use crate::orient::SkyToScreen;
use crate::sky::Equatorial;
use glam::{DMat2, DVec2};
use serde::{Deserialize, Serialize};

/// Gnomonic projection of `p` about `center`: standard coordinates
/// (ξ east, η north) in radians (Calabretta & Greisen 2002, TAN).
/// `None` for points 90° or more from the centre (not on the tangent plane).
pub fn gnomonic(center: Equatorial, p: Equatorial) -> Option<DVec2> {
    let (sd0, cd0) = libm::sincos(center.dec_rad);
    let (sd, cd) = libm::sincos(p.dec_rad);
    let (sda, cda) = libm::sincos(p.ra_rad - center.ra_rad);
    let cosc = sd0 * sd + cd0 * cd * cda;
    if cosc <= 1e-9 {
        return None;
    }
    Some(DVec2::new(cd * sda / cosc, (cd0 * sd - sd0 * cd * cda) / cosc))
}

/// Inverse gnomonic projection: standard coordinates (ξ, η) back to RA/Dec.
pub fn gnomonic_inverse(center: Equatorial, off: DVec2) -> Equatorial {
    let (sd0, cd0) = libm::sincos(center.dec_rad);
    let den = cd0 - off.y * sd0;
    let ra = center.ra_rad + libm::atan2(off.x, den);
    let dec = libm::atan2(sd0 + off.y * cd0, libm::sqrt(off.x * off.x + den * den));
    Equatorial { ra_rad: crate::math::rem_euclid(ra, core::f64::consts::TAU), dec_rad: dec }
}

/// Local Jacobian of the projection at `p`: columns are the tangent-plane
/// images of a unit step east and a unit step north on the sky at `p`
/// (so a position angle θ, north through east, points along J·(sin θ, cos θ)).
pub fn local_frame(center: Equatorial, p: Equatorial) -> Option<DMat2> {
    const EPS: f64 = 1e-6;
    let o = gnomonic(center, p)?;
    let cosd = libm::cos(p.dec_rad).max(1e-9);
    let e = gnomonic(center, Equatorial { ra_rad: p.ra_rad + EPS / cosd, dec_rad: p.dec_rad })?;
    let n = if p.dec_rad + EPS < core::f64::consts::FRAC_PI_2 {
        gnomonic(center, Equatorial { ra_rad: p.ra_rad, dec_rad: p.dec_rad + EPS })? - o
    } else {
        o - gnomonic(center, Equatorial { ra_rad: p.ra_rad, dec_rad: p.dec_rad - EPS })?
    };
    Some(DMat2::from_cols((e - o) / EPS, n / EPS))
}

/// The edge of what the instrument shows, in tangent-plane radians.
#[derive(Clone, Debug, PartialEq)]
pub enum FieldEdge {
    /// Eyepiece field stop: a circle of this true-field radius.
    Circle { radius_rad: f64 },
    /// Sensor frame: a convex polygon (corners in order) in sky offsets.
    Polygon { corners: Vec<DVec2> },
}

/// What the composer is told about the field edge.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub enum FieldShape {
    Circle { radius_rad: f64 },
    /// A sensor `width_rad` × `height_rad` on the sky; at rotation 0 its width
    /// runs along screen right in the instrument's own view; rotation turns it
    /// counter-clockwise on that screen.
    Sensor { width_rad: f64, height_rad: f64, rotation_rad: f64 },
}

/// Kinds of label, so the page can style them.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum LabelKind {
    Target,
    Star,
    Dso,
    Body,
    Satellite,
    North,
    East,
    Zenith,
    Drift,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SceneStar {
    /// Tangent-plane offset (east, north), radians.
    pub offset: DVec2,
    pub vmag: f32,
    pub bv: f32,
}

/// How a deep-sky object is drawn.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum DsoLook {
    Galaxy,
    /// Emission, reflection, H II, supernova remnant: a soft flat glow.
    Nebula,
    PlanetaryNebula,
    GlobularCluster,
    /// Its stars come from the star catalog; drawn as a dashed outline.
    OpenCluster,
    DarkNebula,
    /// Anything else: outline only.
    Other,
}

#[derive(Clone, Debug, PartialEq)]
pub struct SceneDso {
    pub offset: DVec2,
    /// Semi-major and semi-minor axes as tangent-plane vectors (radians).
    pub semi_major: DVec2,
    pub semi_minor: DVec2,
    pub look: DsoLook,
    /// Mean surface brightness inside the outline, V mag/arcsec².
    pub surf_br_mag_arcsec2: f32,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum BodyLook {
    Sun,
    Moon,
    Mercury,
    Venus,
    Mars,
    Jupiter,
    Saturn,
    Uranus,
    Neptune,
    /// A planetary satellite (Jupiter's moons): drawn as a point or tiny disc.
    Satellite,
}

/// Saturn-type rings: tilt of the ring plane towards the observer.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Rings {
    /// Saturnicentric latitude of the observer (B), radians; > 0: the north
    /// face of the rings (and the north pole) is tipped towards us.
    pub tilt_rad: f64,
}

#[derive(Clone, Debug, PartialEq)]
pub struct SceneBody {
    pub look: BodyLook,
    pub offset: DVec2,
    /// Apparent equatorial semi-diameter, radians.
    pub radius_rad: f64,
    /// Apparent polar / equatorial radius (1 for a sphere).
    pub polar_ratio: f64,
    /// Unit tangent-plane vector towards the body's north pole.
    pub pole_dir: DVec2,
    /// Unit tangent-plane vector towards the bright limb.
    pub bright_limb_dir: DVec2,
    /// Sun–body–observer angle, radians (0 = full).
    pub phase_angle_rad: f64,
    pub vmag: f32,
    pub rings: Option<Rings>,
}

/// A direction and the time the target takes to leave an undriven field.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Drift {
    /// Unit tangent-plane vector of the apparent motion of the sky.
    pub dir: DVec2,
    pub rate_rad_s: f64,
    pub time_to_exit_s: f64,
}

#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct Markers {
    /// Unit tangent-plane vector towards the zenith (None: not known).
    pub zenith_dir: Option<DVec2>,
    pub drift: Option<Drift>,
}

/// Sky light behind the field.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct SkyLight {
    /// Natural sky surface brightness including moonlight, V mag/arcsec².
    pub sky_mag_arcsec2: f64,
    /// Extra dimming of every surface brightness in the instrument (mag ≥ 0),
    /// e.g. from an exit pupil smaller than the eye's pupil.
    pub dimming_mag: f64,
    /// Share of the sky light that is moonlight, 0..1 (tints the sky).
    pub moon_share: f64,
}

impl Default for SkyLight {
    fn default() -> Self {
        SkyLight { sky_mag_arcsec2: 21.0, dimming_mag: 0.0, moon_share: 0.0 }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct SceneLabel {
    pub offset: DVec2,
    pub text: String,
    pub kind: LabelKind,
}

/// Everything the renderer needs; independent of screen size, pan and zoom.
#[derive(Clone, Debug, PartialEq)]
pub struct Scene {
    pub center: Equatorial,
    /// Instrument view: sky (east, north) → screen (right, up).
    pub orient: SkyToScreen,
    pub field: FieldEdge,
    pub stars: Vec<SceneStar>,
    pub dsos: Vec<SceneDso>,
    pub bodies: Vec<SceneBody>,
    pub markers: Markers,
    pub sky: SkyLight,
    /// Faintest star drawn (the brightness scale is anchored here).
    pub mag_limit: f32,
    pub labels: Vec<SceneLabel>,
    /// Guide lines over the view (a finder's view: the main scope's field, a star-hop route).
    pub overlays: Vec<Overlay>,
}

/// A guide line drawn over the sky, in tangent-plane offsets (radians).
#[derive(Clone, Debug, PartialEq)]
pub enum Overlay {
    /// A circle, e.g. the main telescope's field inside a finder's view.
    Ring { center: DVec2, radius_rad: f64 },
    /// A polyline through the points, e.g. a star-hop route.
    Path { points: Vec<DVec2> },
}

impl Scene {
    /// An empty scene about `center` with the given field and orientation.
    pub fn new(center: Equatorial, field: FieldShape, orient: SkyToScreen, mag_limit: f32) -> Scene {
        Scene {
            center,
            orient,
            field: field_edge(field, orient),
            stars: Vec::new(),
            dsos: Vec::new(),
            bodies: Vec::new(),
            markers: Markers::default(),
            sky: SkyLight::default(),
            mag_limit,
            labels: Vec::new(),
            overlays: Vec::new(),
        }
    }

    /// Radius (radians) of a circle about the centre that holds the field.
    pub fn field_reach_rad(&self) -> f64 {
        match &self.field {
            FieldEdge::Circle { radius_rad } => *radius_rad,
            FieldEdge::Polygon { corners } => corners.iter().map(|c| c.length()).fold(0.0, f64::max),
        }
    }

    /// Whether a tangent-plane offset lies inside the field grown by `margin_rad`.
    pub fn in_field(&self, off: DVec2, margin_rad: f64) -> bool {
        match &self.field {
            FieldEdge::Circle { radius_rad } => off.length() <= radius_rad + margin_rad,
            FieldEdge::Polygon { corners } => polygon_signed_distance(corners, off) <= margin_rad,
        }
    }

    /// Adds a star (apparent place) if it falls in the field and is bright enough.
    pub fn add_star(&mut self, p: Equatorial, vmag: f32, bv: f32) -> bool {
        if !(vmag <= self.mag_limit) {
            return false;
        }
        match gnomonic(self.center, p) {
            Some(off) if self.in_field(off, self.field_reach_rad() * 0.02) => {
                self.stars.push(SceneStar { offset: off, vmag, bv: if bv.is_finite() { bv } else { 0.6 } });
                true
            }
            _ => false,
        }
    }

    /// Adds a deep-sky object of true size `major_rad` × `minor_rad` (full
    /// axes) at position angle `pa_rad` (north through east) if it overlaps the field.
    pub fn add_dso(&mut self, p: Equatorial, major_rad: f64, minor_rad: f64, pa_rad: f64, look: DsoLook, surf_br_mag_arcsec2: f32, label: Option<&str>) -> bool {
        let Some(off) = gnomonic(self.center, p) else { return false };
        let Some(j) = local_frame(self.center, p) else { return false };
        let major = major_rad.max(0.0) * 0.5;
        let minor = if minor_rad > 0.0 { minor_rad.min(major_rad) * 0.5 } else { major };
        if !self.in_field(off, major) {
            return false;
        }
        let (s, c) = libm::sincos(pa_rad);
        let semi_major = j * DVec2::new(s, c) * major;
        let semi_minor = j * DVec2::new(c, -s) * minor;
        self.dsos.push(SceneDso { offset: off, semi_major, semi_minor, look, surf_br_mag_arcsec2 });
        if let Some(t) = label {
            self.labels.push(SceneLabel { offset: off, text: t.to_string(), kind: LabelKind::Dso });
        }
        true
    }

    /// Adds a labelled point (bright-star names, the target).
    pub fn add_label(&mut self, p: Equatorial, text: &str, kind: LabelKind) {
        if let Some(off) = gnomonic(self.center, p) {
            if self.in_field(off, 0.0) {
                self.labels.push(SceneLabel { offset: off, text: text.to_string(), kind });
            }
        }
    }

    /// Turns a position angle (north through east) at the field centre into a
    /// unit tangent-plane vector.
    pub fn pa_dir(pa_rad: f64) -> DVec2 {
        let (s, c) = libm::sincos(pa_rad);
        DVec2::new(s, c)
    }

    /// Sets the drift of an undriven mount: the sky moves west at the
    /// sidereal rate × cos δ (common practice: 15.04″/s at the equator); the
    /// time to exit is from the centre to the field edge along that direction.
    pub fn set_sidereal_drift(&mut self) {
        const SIDEREAL_RAD_S: f64 = 7.292_115_855_3e-5; // Earth's rotation rate (IERS)
        let rate = SIDEREAL_RAD_S * libm::cos(self.center.dec_rad).abs();
        let dir = DVec2::new(-1.0, 0.0);
        let dist = self.exit_distance_rad(dir);
        let t = if rate > 0.0 { dist / rate } else { f64::INFINITY };
        self.markers.drift = Some(Drift { dir, rate_rad_s: rate, time_to_exit_s: t });
    }

    /// Distance from the centre to the field edge along unit vector `dir`.
    pub fn exit_distance_rad(&self, dir: DVec2) -> f64 {
        match &self.field {
            FieldEdge::Circle { radius_rad } => *radius_rad,
            FieldEdge::Polygon { corners } => {
                let mut best = f64::INFINITY;
                let n = corners.len();
                for i in 0..n {
                    let a = corners[i];
                    let b = corners[(i + 1) % n];
                    let e = b - a;
                    let den = dir.perp_dot(e);
                    if den.abs() < 1e-15 {
                        continue;
                    }
                    let t = a.perp_dot(e) / den;
                    let u = a.perp_dot(dir) / den;
                    if t > 0.0 && (-1e-12..=1.0 + 1e-12).contains(&u) {
                        best = best.min(t);
                    }
                }
                if best.is_finite() { best } else { 0.0 }
            }
        }
    }
}

/// The field edge on the sky for a field shape seen through `orient`.
pub fn field_edge(shape: FieldShape, orient: SkyToScreen) -> FieldEdge {
    match shape {
        FieldShape::Circle { radius_rad } => FieldEdge::Circle { radius_rad: radius_rad.abs() },
        FieldShape::Sensor { width_rad, height_rad, rotation_rad } => {
            let (s, c) = libm::sincos(rotation_rad);
            let rot = DMat2::from_cols(DVec2::new(c, s), DVec2::new(-s, c));
            let inv = if orient.m.determinant().abs() > 1e-12 { orient.m.inverse() } else { DMat2::IDENTITY };
            let (hw, hh) = (width_rad.abs() * 0.5, height_rad.abs() * 0.5);
            let corners = [(-hw, -hh), (hw, -hh), (hw, hh), (-hw, hh)]
                .iter()
                .map(|&(x, y)| inv * (rot * DVec2::new(x, y)))
                .collect();
            FieldEdge::Polygon { corners }
        }
    }
}

/// Signed distance from `p` to a convex polygon (negative inside); exact
/// along edges, slightly short near corners (fine for masks and culling).
pub fn polygon_signed_distance(corners: &[DVec2], p: DVec2) -> f64 {
    let n = corners.len();
    if n < 3 {
        return f64::INFINITY;
    }
    // Orientation of the polygon decides which side is inside.
    let mut area = 0.0;
    for i in 0..n {
        area += corners[i].perp_dot(corners[(i + 1) % n]);
    }
    let sign = if area >= 0.0 { 1.0 } else { -1.0 };
    let mut d = f64::NEG_INFINITY;
    for i in 0..n {
        let a = corners[i];
        let e = corners[(i + 1) % n] - a;
        let len = e.length();
        if len <= 0.0 {
            continue;
        }
        // Outward normal of a counter-clockwise polygon is (e.y, -e.x).
        let nrm = DVec2::new(e.y, -e.x) * (sign / len);
        d = d.max((p - a).dot(nrm));
    }
    d
}

/// Mean surface brightness (mag/arcsec²) of an object of total magnitude
/// `vmag` spread over an ellipse of full axes `major_arcmin` × `minor_arcmin`
/// (common practice: m + 2.5 log10(area in arcsec²)).
pub fn mean_surface_brightness(vmag: f64, major_arcmin: f64, minor_arcmin: f64) -> f64 {
    let minor = if minor_arcmin > 0.0 { minor_arcmin } else { major_arcmin };
    let area = core::f64::consts::PI * 0.25 * (major_arcmin * 60.0) * (minor * 60.0);
    vmag + 2.5 * libm::log10(area.max(1e-6))
}
