//! The renderer: draws a `Scene` into an RGBA8 (sRGB) buffer for a given
//! screen size, pixel ratio, pan, zoom and colour mode, and returns the text
//! labels the page draws on top. It knows nothing about where the scene's
//! data came from. Pixel-deciding math uses `libm`, so native and wasm agree
//! byte for byte.
//!
//! Screen convention: buffer pixel (i, j) covers [i, i+1) × [j, j+1); the
//! field centre sits at the buffer centre plus pan; screen "up" is −y.

pub mod background;
pub mod bench;
pub mod bodies;
pub mod colour;
pub mod markers;
pub mod raster;
pub mod shapes;
pub mod stars;

pub use crate::scene::LabelKind;
use crate::orient::SkyToScreen;
use crate::scene::{FieldEdge, Scene};
use glam::{DMat2, DVec2};
use serde::{Deserialize, Serialize};
use std::fmt;

/// An RGBA8 pixel buffer, rows top to bottom, sRGB, opaque.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Frame {
    pub width: u32,
    pub height: u32,
    pub rgba: Vec<u8>,
}

impl Frame {
    pub fn new(width: u32, height: u32) -> Frame {
        Frame { width, height, rgba: vec![0; width as usize * height as usize * 4] }
    }

    /// Resizes (reusing the allocation) to `width` × `height`.
    pub fn resize(&mut self, width: u32, height: u32) {
        self.width = width;
        self.height = height;
        self.rgba.resize(width as usize * height as usize * 4, 0);
    }

    /// RGBA of pixel (x, y).
    pub fn pixel(&self, x: u32, y: u32) -> [u8; 4] {
        let i = (y as usize * self.width as usize + x as usize) * 4;
        [self.rgba[i], self.rgba[i + 1], self.rgba[i + 2], self.rgba[i + 3]]
    }
}

/// How to show the scene on this screen.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ViewParams {
    /// Buffer size in device pixels.
    pub width_px: u32,
    pub height_px: u32,
    /// Device pixels per CSS pixel: star sizes, line widths and marker sizes scale with it.
    pub dpr: f32,
    /// Red only, for dark-adapted eyes.
    pub night_mode: bool,
    /// Show north up, east left (as a chart) instead of the instrument's view.
    pub chart_view: bool,
    /// Offset of the field centre from the buffer centre, device pixels (right, down).
    pub pan_x_px: f32,
    pub pan_y_px: f32,
    /// Multiplies the fitted scale (1 = the field fills the shorter side).
    pub zoom: f32,
    /// Fixed scale instead of fitting (side-by-side views at one angular scale).
    pub px_per_rad: Option<f64>,
}

impl Default for ViewParams {
    fn default() -> Self {
        ViewParams { width_px: 512, height_px: 512, dpr: 1.0, night_mode: false, chart_view: false, pan_x_px: 0.0, pan_y_px: 0.0, zoom: 1.0, px_per_rad: None }
    }
}

/// A text label for the page: position in buffer (device) pixels.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Label {
    pub text: String,
    pub x_px: f32,
    pub y_px: f32,
    pub kind: LabelKind,
}

/// Why a frame could not be drawn.
#[derive(Clone, Debug, PartialEq)]
pub enum RenderError {
    Size { width_px: u32, height_px: u32 },
    Dpr(f32),
    Zoom(f32),
    Pan,
    Scale(f64),
}

pub const MAX_SIDE_PX: u32 = 8192;

impl fmt::Display for RenderError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            RenderError::Size { width_px, height_px } => write!(f, "view size {width_px}×{height_px} px: width and height must each be 1 to {MAX_SIDE_PX} pixels"),
            RenderError::Dpr(d) => write!(f, "device pixel ratio {d}: must be between 0.5 and 8"),
            RenderError::Zoom(z) => write!(f, "zoom {z}: must be between 0.01 and 1000"),
            RenderError::Pan => write!(f, "pan: must be a finite number of pixels"),
            RenderError::Scale(s) => write!(f, "fixed scale {s} px/rad: must be a positive finite number"),
        }
    }
}

impl std::error::Error for RenderError {}

/// Colour mode: the normal view or red only.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Palette {
    night: bool,
}

impl Palette {
    /// Maps a linear colour; night mode keeps its luminance (Rec. 709 weights) in red.
    #[inline]
    pub fn map(&self, c: [f32; 3]) -> [f32; 3] {
        if self.night {
            [0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2], 0.0, 0.0]
        } else {
            c
        }
    }
}

/// Sky offsets → buffer pixels for one view.
#[derive(Clone, Copy, Debug)]
pub struct ViewTransform {
    /// Sky (east, north) radians → pixel delta (x right, y down).
    pub m: DMat2,
    pub cx: f64,
    pub cy: f64,
    pub px_per_rad: f64,
}

impl ViewTransform {
    /// Buffer pixel coordinates of a tangent-plane offset.
    #[inline]
    pub fn to_px(&self, off: DVec2) -> (f32, f32) {
        let d = self.m * off;
        ((self.cx + d.x) as f32, (self.cy + d.y) as f32)
    }

    /// Pixel direction (unit, y down) of a tangent-plane direction.
    pub fn dir_px(&self, dir: DVec2) -> (f32, f32) {
        let d = (self.m * dir).normalize_or_zero();
        (d.x as f32, d.y as f32)
    }
}

/// The orientation in use: the instrument's, or the chart's.
pub fn active_orientation(scene: &Scene, view: &ViewParams) -> SkyToScreen {
    if view.chart_view { SkyToScreen::chart() } else { scene.orient }
}

/// Builds the view transform: fits the field to the shorter side (94 %), times zoom.
pub fn view_transform(scene: &Scene, view: &ViewParams) -> ViewTransform {
    let o = active_orientation(scene, view).m;
    let flip = DMat2::from_cols(DVec2::new(1.0, 0.0), DVec2::new(0.0, -1.0));
    let (w, h) = (view.width_px as f64, view.height_px as f64);
    let s = match view.px_per_rad {
        Some(s) => s,
        None => {
            let (bw, bh) = match &scene.field {
                FieldEdge::Circle { radius_rad } => (2.0 * radius_rad, 2.0 * radius_rad),
                FieldEdge::Polygon { corners } => {
                    let mut mx = DVec2::ZERO;
                    for c in corners {
                        mx = mx.max((o * *c).abs());
                    }
                    (2.0 * mx.x, 2.0 * mx.y)
                }
            };
            let fit = (w / bw.max(1e-12)).min(h / bh.max(1e-12)) * 0.94;
            fit * view.zoom as f64
        }
    };
    ViewTransform { m: flip * o * s, cx: w * 0.5 + view.pan_x_px as f64, cy: h * 0.5 + view.pan_y_px as f64, px_per_rad: s }
}

fn check(view: &ViewParams) -> Result<(), RenderError> {
    if view.width_px == 0 || view.height_px == 0 || view.width_px > MAX_SIDE_PX || view.height_px > MAX_SIDE_PX {
        return Err(RenderError::Size { width_px: view.width_px, height_px: view.height_px });
    }
    if !(view.dpr >= 0.5 && view.dpr <= 8.0) {
        return Err(RenderError::Dpr(view.dpr));
    }
    if !(view.zoom >= 0.01 && view.zoom <= 1000.0) {
        return Err(RenderError::Zoom(view.zoom));
    }
    if !view.pan_x_px.is_finite() || !view.pan_y_px.is_finite() || view.pan_x_px.abs() > 1e6 || view.pan_y_px.abs() > 1e6 {
        return Err(RenderError::Pan);
    }
    if let Some(s) = view.px_per_rad {
        if !(s > 0.0 && s.is_finite()) {
            return Err(RenderError::Scale(s));
        }
    }
    Ok(())
}

/// Draws `scene` into `frame` (resized to the view) and returns the labels.
/// Order: sky, deep-sky glows, stars, bodies, the dark outside the field
/// edge, the edge, markers.
pub fn draw(scene: &Scene, view: &ViewParams, frame: &mut Frame) -> Result<Vec<Label>, RenderError> {
    check(view)?;
    frame.resize(view.width_px, view.height_px);
    let pal = Palette { night: view.night_mode };
    let t = view_transform(scene, view);
    let mut cv = raster::Canvas::new(view.width_px as usize, view.height_px as usize, &mut frame.rgba);
    let sky8 = raster::to_rgba8(pal.map(background::sky_colour(&scene.sky)));
    let stars = prepare_stars(scene, &t, view.dpr, &pal, cv.h);
    // Bands of rows, each finished while it sits in cache: sky, glows, stars,
    // bodies, the dark outside the field and its rim.
    let mut wx = Vec::with_capacity(256);
    let small = stars::SmallPsf::new(view.dpr);
    let mut next = 0usize;
    let mut active: Vec<u32> = Vec::new();
    let mut y = 0usize;
    while y < cv.h {
        let rows = (y, (y + BAND_ROWS).min(cv.h));
        cv.fill_rows(rows, sky8);
        shapes::draw_dsos(&mut cv, scene, &t, &pal, rows);
        while next < stars.len() && (stars[next].y0 as usize) < rows.1 {
            active.push(next as u32);
            next += 1;
        }
        active.retain(|&k| stars[k as usize].y1 as usize > rows.0);
        for &k in &active {
            let s = &stars[k as usize];
            if small.fits(s.look) {
                stars::stamp_small(&mut cv, s.x, s.y, s.look.flux, s.colour, rows, &small);
            } else {
                stars::stamp(&mut cv, s.x, s.y, s.look, s.colour, rows, &mut wx);
            }
        }
        bodies::draw_bodies(&mut cv, scene, &t, view.dpr, &pal, rows);
        markers::field_mask(&mut cv, scene, &t, view.dpr, &pal, rows);
        y = rows.1;
    }
    shapes::draw_outlines(&mut cv, scene, &t, view.dpr, &pal);
    draw_overlays(&mut cv, scene, &t, view.dpr, &pal);
    let mut labels = markers::draw_markers(&mut cv, scene, &t, view.dpr, &pal);
    labels.extend(object_labels(scene, &t, view));
    Ok(labels)
}

/// Guide lines (finder views): the main field as a ring, the star-hop route as a path, in amber.
fn draw_overlays(cv: &mut raster::Canvas, scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette) {
    let colour = pal.map([1.0, 0.55, 0.15]);
    let w = 1.4 * dpr;
    let px = |o: DVec2| {
        let p = t.to_px(o);
        (p.0, p.1)
    };
    for o in &scene.overlays {
        match o {
            crate::scene::Overlay::Ring { center, radius_rad } => {
                if !(center.is_finite() && radius_rad.is_finite() && *radius_rad > 0.0) {
                    continue;
                }
                const N: usize = 72;
                let at = |k: usize| {
                    let a = k as f64 * std::f64::consts::TAU / N as f64;
                    px(*center + DVec2::new(libm::cos(a), libm::sin(a)) * *radius_rad)
                };
                for k in 0..N {
                    cv.line(at(k), at(k + 1), w, colour, 0.9);
                }
            }
            crate::scene::Overlay::Path { points } => {
                for pair in points.windows(2) {
                    if pair[0].is_finite() && pair[1].is_finite() {
                        cv.line(px(pair[0]), px(pair[1]), w, colour, 0.8);
                    }
                }
            }
        }
    }
}

/// Rows per band: 16 rows of a 1024-px frame are 64 KB, well inside L2.
const BAND_ROWS: usize = 16;

struct PreparedStar {
    x: f32,
    y: f32,
    look: stars::StarLook,
    colour: [f32; 3],
    /// Rows the stamp covers: [y0, y1).
    y0: u32,
    y1: u32,
}

/// Stars in view with their pixel position and look, ordered by first row
/// (a counting sort, stable, so the order is deterministic).
fn prepare_stars(scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette, h: usize) -> Vec<PreparedStar> {
    // Cull against the field: nothing outside it survives the mask.
    let reach = scene.field_reach_rad() * t.px_per_rad + 40.0 * dpr as f64;
    let reach2 = (reach * reach) as f32;
    let (cx, cy) = (t.cx as f32, t.cy as f32);
    let mut count = vec![0u32; h + 1];
    let mut tmp = Vec::with_capacity(scene.stars.len());
    for s in &scene.stars {
        let (x, y) = t.to_px(s.offset);
        let (dx, dy) = (x - cx, y - cy);
        if !(dx * dx + dy * dy <= reach2) {
            continue;
        }
        let look = stars::star_look(s.vmag, scene.mag_limit, dpr);
        let r = stars::stamp_radius_px(look);
        if y + r < 0.0 || y - r >= h as f32 {
            continue;
        }
        let y0 = ((y - r).floor().max(0.0) as usize).min(h - 1);
        let y1 = ((y + r).floor() + 1.0).clamp(1.0, h as f32) as u32;
        count[y0 + 1] += 1;
        tmp.push(PreparedStar { x, y, look, colour: pal.map(colour::star_colour(s.bv)), y0: y0 as u32, y1 });
    }
    for i in 0..h {
        count[i + 1] += count[i];
    }
    let mut slot = vec![0u32; tmp.len()];
    for (k, p) in tmp.iter().enumerate() {
        let c = &mut count[p.y0 as usize];
        slot[k] = *c;
        *c += 1;
    }
    let mut out: Vec<Option<PreparedStar>> = (0..tmp.len()).map(|_| None).collect();
    for (k, p) in tmp.into_iter().enumerate() {
        out[slot[k] as usize] = Some(p);
    }
    out.into_iter().flatten().collect()
}

fn object_labels(scene: &Scene, t: &ViewTransform, view: &ViewParams) -> Vec<Label> {
    let gap = 6.0 * view.dpr;
    scene
        .labels
        .iter()
        .filter(|l| scene.in_field(l.offset, 0.0))
        .map(|l| {
            let (x, y) = t.to_px(l.offset);
            Label { text: l.text.clone(), x_px: x + gap, y_px: y - gap, kind: l.kind }
        })
        .filter(|l| l.x_px >= 0.0 && l.y_px >= 0.0 && l.x_px < view.width_px as f32 && l.y_px < view.height_px as f32)
        .collect()
}
