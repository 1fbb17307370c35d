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
mod lanes;
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
    // Per-frame lists live in a reused scratch: fresh large allocations each
    // frame cost page faults natively (the allocator hands big blocks back to
    // the system). A nested call (none today) gets its own.
    SCRATCH.with(|cell| match cell.try_borrow_mut() {
        Ok(mut s) => draw_with(scene, view, frame, &mut s),
        Err(_) => draw_with(scene, view, frame, &mut Scratch::default()),
    })
}

/// Lists reused from frame to frame (see [`draw`]).
#[derive(Default)]
struct Scratch {
    /// Stars in view, by first row.
    stars: Vec<PreparedStar>,
    unsorted: Vec<PreparedStar>,
    count: Vec<u32>,
    wx: Vec<f32>,
    /// Look and colour of each scene star as last computed, with the inputs
    /// they came from (see [`star_look_memo`]).
    memo: Vec<StarMemo>,
    memo_key: (u32, u32, bool),
    /// Star weight tables by width, kept while the pixel ratio stays.
    psf: stars::PsfTables,
}

#[derive(Clone, Copy)]
struct StarMemo {
    known: bool,
    vmag_bits: u32,
    bv_bits: u32,
    look: stars::StarLook,
    colour: [f32; 3],
}

/// A star's look and display colour: a pure function of its magnitude and
/// B−V, the magnitude limit, the pixel ratio and the palette. Redrawing the
/// same scene (pan, zoom) finds them in the memo when every input matches
/// bit for bit; anything else recomputes them.
#[inline]
fn star_look_memo(memo: &mut [StarMemo], i: usize, s: &crate::scene::SceneStar, mag_limit: f32, dpr: f32, pal: &Palette) -> (stars::StarLook, [f32; 3]) {
    let (vb, bb) = (s.vmag.to_bits(), s.bv.to_bits());
    if let Some(m) = memo.get(i) {
        if m.known && m.vmag_bits == vb && m.bv_bits == bb {
            return (m.look, m.colour);
        }
    }
    star_look_fresh(memo, i, s, mag_limit, dpr, pal)
}

/// [`star_look_memo`] when the memo lacks the star: out of line, so that the
/// loop over stars keeps its registers.
#[cold]
#[inline(never)]
fn star_look_fresh(memo: &mut [StarMemo], i: usize, s: &crate::scene::SceneStar, mag_limit: f32, dpr: f32, pal: &Palette) -> (stars::StarLook, [f32; 3]) {
    let (vb, bb) = (s.vmag.to_bits(), s.bv.to_bits());
    let look = stars::star_look(s.vmag, mag_limit, dpr);
    let colour = pal.map(colour::star_colour(s.bv));
    if let Some(m) = memo.get_mut(i) {
        *m = StarMemo { known: true, vmag_bits: vb, bv_bits: bb, look, colour };
    }
    (look, colour)
}

thread_local! {
    static SCRATCH: std::cell::RefCell<Scratch> = std::cell::RefCell::new(Scratch::default());
}

fn draw_with(scene: &Scene, view: &ViewParams, frame: &mut Frame, sc: &mut Scratch) -> Result<Vec<Label>, RenderError> {
    frame.resize(view.width_px, view.height_px);
    let pal = Palette { night: view.night_mode };
    let t = view_transform(scene, view);
    let mut cv = raster::Canvas::new(view.width_px as usize, view.height_px as usize, &mut frame.rgba);
    let sky8 = raster::to_rgba8(pal.map(background::sky_colour(&scene.sky)));
    cv.bg = lanes::Background::new(sky8, cv.luts);
    sc.psf.ready(view.dpr);
    prepare_stars(scene, &t, view.dpr, &pal, (cv.w, cv.h), sc);
    let Scratch { stars, wx, psf, .. } = sc;
    let edge = match &scene.field {
        FieldEdge::Circle { radius_rad } => Some(markers::CircleEdge::new(*radius_rad, &t, view.dpr, &pal, sky8)),
        FieldEdge::Polygon { .. } => None,
    };
    // Bands of rows, each finished while it sits in cache. Per pixel the
    // order is: sky, deep-sky glows, stars (in `stars` order), bodies, the
    // dark outside the field and its rim. Bands are readied (sky, glows) a
    // little ahead, so that each star is drawn whole, once, when its first
    // band comes up; it is clipped to the bands its rows [y0, y1) fall in.
    let h = cv.h;
    let mut ready = 0usize;
    let mut ready_to = |cv: &mut raster::Canvas, to: usize| {
        while ready < to {
            let rows = (ready, (ready + BAND_ROWS).min(h));
            match edge.as_ref() {
                // The sky only where the field mask leaves pixels to show: it
                // fills everything outside each row's span with the outside
                // colour, whatever the pixel held (stars and glows drawn there
                // first are covered).
                // Three pixels past the span's end too: the edge's last group
                // of four may run past it (the outside fill covers them
                // after), and groups still holding the sky are shaded from a
                // table (`lanes::RimPlain`) rather than pixel by pixel.
                Some(e) => {
                    for y in rows.0..rows.1 {
                        if let Some((xl, xr)) = e.span(y, cv.w) {
                            cv.fill_span(y, xl, xr + 3, sky8);
                        }
                    }
                }
                None => cv.fill_run(rows.0 * cv.w, rows.1 * cv.w, sky8),
            }
            shapes::draw_dsos(cv, scene, &t, &pal, rows);
            ready = rows.1;
        }
    };
    let mut next = 0usize;
    let mut y = 0usize;
    while y < h {
        let rows = (y, (y + BAND_ROWS).min(h));
        // The stars whose first row is in this band, and the bands they reach.
        let (first, mut need) = (next, rows.1);
        while let Some(s) = stars.get(next) {
            if s.y0 as usize >= rows.1 {
                break;
            }
            need = need.max(band_end(s.y1 as usize, h));
            next += 1;
        }
        ready_to(&mut cv, need);
        stamp_stars(&mut cv, &stars[first..next], psf, wx);
        bodies::draw_bodies(&mut cv, scene, &t, view.dpr, &pal, rows);
        markers::field_mask(&mut cv, scene, &t, view.dpr, &pal, rows, edge.as_ref());
        y = rows.1;
    }
    shapes::draw_outlines(&mut cv, scene, &t, view.dpr, &pal);
    draw_overlays(&mut cv, scene, &t, view.dpr, &pal);
    let mut labels = markers::draw_markers(&mut cv, scene, &t, view.dpr, &pal);
    labels.extend(object_labels(scene, &t, view));
    Ok(labels)
}

/// First row of the band holding row y.
fn band_start(y: usize) -> usize {
    y / BAND_ROWS * BAND_ROWS
}

/// End of the band holding row y − 1 (clipped to the frame height h).
fn band_end(y: usize, h: usize) -> usize {
    (y.div_ceil(BAND_ROWS) * BAND_ROWS).min(h)
}

/// Stamps `stars` (their bands readied), each clipped to the bands its rows
/// [y0, y1) fall in. In wasm compiled with simd128, so the stamps inline here.
#[cfg_attr(target_arch = "wasm32", target_feature(enable = "simd128"))]
fn stamp_stars(cv: &mut raster::Canvas, list: &[PreparedStar], psf: &stars::PsfTables, wx: &mut Vec<f32>) {
    let h = cv.h;
    let Some(base) = psf.base() else {
        return;
    };
    for s in list {
        let clip = (band_start(s.y0 as usize), band_end(s.y1 as usize, h));
        if let Some((at, t)) = s.table.and_then(|at| Some((at, psf.get(at.k)?))) {
            stars::stamp_table(cv, at, s.look.flux, s.colour, clip, t);
        } else if base.fits(s.look) {
            stars::stamp_small(cv, s.x, s.y, s.look.flux, s.colour, clip, base);
        } else {
            stars::stamp(cv, s.x, s.y, s.look, s.colour, clip, wx);
        }
    }
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

#[derive(Clone, Copy)]
struct PreparedStar {
    x: f32,
    y: f32,
    look: stars::StarLook,
    colour: [f32; 3],
    /// Rows the stamp covers: [y0, y1) (frames are at most 8192 rows).
    y0: u16,
    y1: u16,
    /// Where its width's weight tables place it, when its rows lie whole
    /// inside the frame (nearly every star): drawn by [`stars::stamp_table`].
    table: Option<stars::TablePlace>,
}

/// Stars in view with their pixel position and look, ordered by first row
/// (a counting sort, stable, so the order is deterministic), into `sc.stars`.
fn prepare_stars(scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette, (w, h): (usize, usize), sc: &mut Scratch) {
    // Cull against the field: nothing outside it survives the mask.
    let reach = scene.field_reach_rad() * t.px_per_rad + 40.0 * dpr as f64;
    let reach2 = (reach * reach) as f32;
    let (cx, cy) = (t.cx as f32, t.cy as f32);
    let count = &mut sc.count;
    count.clear();
    count.resize(h + 1, 0);
    let key = (scene.mag_limit.to_bits(), dpr.to_bits(), pal.night);
    if sc.memo_key != key || sc.memo.len() != scene.stars.len() {
        sc.memo_key = key;
        sc.memo.clear();
        let stale = StarMemo { known: false, vmag_bits: 0, bv_bits: 0, look: stars::StarLook { flux: 0.0, sigma_px: 0.0, reach_px: 0.0 }, colour: [0.0; 3] };
        sc.memo.resize(scene.stars.len(), stale);
    }
    let memo = &mut sc.memo;
    let psf = &mut sc.psf;
    let tmp = &mut sc.unsorted;
    tmp.clear();
    let hf = h as f32;
    for (i, s) in scene.stars.iter().enumerate() {
        let (x, y) = t.to_px(s.offset);
        let (dx, dy) = (x - cx, y - cy);
        if !(dx * dx + dy * dy <= reach2) {
            continue;
        }
        let (look, colour) = star_look_memo(memo, i, s, scene.mag_limit, dpr, pal);
        let r = stars::stamp_radius_px(look);
        if y + r < 0.0 || y - r >= hf {
            continue;
        }
        // y is within the field's reach of the centre, so the integer floors fit in i32.
        // The rows the stamp draws: from the weight tables' phase for stars
        // drawn from them (and base-width stars at the frame's sides, which
        // `stamp_small` draws from them), else the stamp's own.
        let placed = psf.table_for(look).map(|(k, t)| (k, t.place(x, y, w, k)));
        let (a, b, table) = match placed {
            Some((_, (a, b, Some(at)))) => (a, b, Some(at)),
            Some((0, (a, b, None))) => (a, b, None),
            _ => {
                let (a, b) = stars::stamp_span(y, r);
                (a, b, None)
            }
        };
        let y0 = (a.max(0) as usize).min(h - 1);
        let y1 = b.clamp(1, h as i32) as u16;
        count[y0 + 1] += 1;
        tmp.push(PreparedStar { x, y, look, colour, y0: y0 as u16, y1, table });
    }
    for i in 0..h {
        count[i + 1] += count[i];
    }
    // Each star goes straight to its slot (drawing reads them in order, so
    // they are best laid out that way). Every slot is written once: the
    // counts add up to tmp.len().
    let Some(&first) = tmp.first() else {
        sc.stars.clear();
        return;
    };
    sc.stars.clear();
    sc.stars.resize(tmp.len(), first);
    for p in tmp.iter() {
        let c = &mut count[p.y0 as usize];
        if let Some(slot) = sc.stars.get_mut(*c as usize) {
            *slot = *p;
        }
        *c += 1;
    }
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

#[cfg(test)]
mod tests {
    use super::*;

    /// A frame drawn on a fresh thread (empty scratch and memo).
    fn fresh(scene: &Scene, view: &ViewParams) -> Frame {
        let (scene, view) = (scene.clone(), *view);
        std::thread::spawn(move || {
            let mut f = Frame::default();
            draw(&scene, &view, &mut f).map(|_| f).unwrap_or_default()
        })
        .join()
        .unwrap_or_default()
    }

    /// Redrawing after the scene's stars changed (magnitude, colour, count,
    /// palette, pixel ratio) gives the frame a first draw gives: the memo of
    /// looks never serves a stale entry.
    #[test]
    fn star_memo_follows_every_input() {
        let mut scene = bench::rich_field_scene();
        scene.stars.truncate(800);
        let mut view = ViewParams { width_px: 300, height_px: 300, ..ViewParams::default() };
        let mut f = Frame::default();
        let mut check = |scene: &Scene, view: &ViewParams| {
            draw(scene, view, &mut f).unwrap();
            let want = fresh(scene, view);
            assert!(!want.rgba.is_empty());
            assert!(f == want, "redraw differs from a first draw");
        };
        check(&scene, &view);
        check(&scene, &view);
        scene.stars[17].vmag -= 3.0;
        scene.stars[400].bv = 1.7;
        check(&scene, &view);
        scene.stars.swap(3, 500);
        check(&scene, &view);
        scene.stars.truncate(700);
        check(&scene, &view);
        scene.mag_limit = 12.0;
        check(&scene, &view);
        view.night_mode = true;
        check(&scene, &view);
        view.dpr = 2.0;
        check(&scene, &view);
    }
}
