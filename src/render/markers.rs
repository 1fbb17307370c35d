//! The field edge (the dark outside the field stop or sensor, and its rim)
//! and the markers: north and east, the zenith, and the drift direction with
//! the time the target takes to leave an undriven field.

use super::lanes::{full_blend_is_fill, rim1, rim4, RimShade};
use super::raster::Canvas;
use super::{background, Label, Palette, ViewTransform};
use crate::scene::{FieldEdge, LabelKind, Scene};
use glam::DVec2;

const RIM: [f32; 3] = [0.30, 0.33, 0.40];
const NORTH: [f32; 3] = [0.95, 0.40, 0.30];
const EAST: [f32; 3] = [0.35, 0.75, 0.95];
const ZENITH: [f32; 3] = [0.55, 0.90, 0.45];
const DRIFT: [f32; 3] = [0.95, 0.80, 0.35];

/// A circular field edge on screen: centre, radius and the rows' spans.
/// Shading is exact where it matters and skipped where it cannot change a
/// byte: pixels nearer the centre than `ri` get neither the dark nor the rim
/// (both coverages ≤ 0), and pixels beyond `ro` are filled with the outside
/// colour (its coverage is 1 and the rim's 0 there).
pub(crate) struct CircleEdge {
    cx: f32,
    cy: f32,
    ro: f32,
    ri: f32,
    /// The per-pixel shading, made once a frame (not once a band).
    shade: RimShade,
}

/// Keeps the spans clear of pixels whose shading is not a no-op or a fill
/// by more than any float rounding of the distances involved.
const EDGE_MARGIN_PX: f32 = 1.0 / 16.0;

impl CircleEdge {
    /// `bg`: the frame's background (see [`RimShade`]).
    pub fn new(radius_rad: f64, t: &ViewTransform, dpr: f32, pal: &Palette, bg: [u8; 4]) -> CircleEdge {
        let half_w = rim_half_width(dpr);
        let r = (radius_rad * t.px_per_rad) as f32;
        // Both coverages vanish for d ≤ −(half_w + 0.5); beyond d ≥ half_w + 0.5
        // the rim's vanishes and the dark's is 1, which writes the outside
        // colour's bytes whatever the pixel held, when `full_dark_is_fill`.
        let reach = half_w + 0.5 + EDGE_MARGIN_PX;
        let fill = full_dark_is_fill(pal);
        let ro = if fill { r + reach } else { r + half_w + 1.5 };
        let (cx, cy) = (t.cx as f32, t.cy as f32);
        let shade = RimShade::new(cx, r, half_w + 0.5, pal.map(background::OUTSIDE), pal.map(RIM), fill, bg, super::raster::luts());
        CircleEdge { cx, cy, ro, ri: (r - reach).max(0.0), shade }
    }

    /// Pixels [xl, xr) of row y lie within `ro` of the centre; `None`: none do.
    #[inline]
    pub fn span(&self, y: usize, w: usize) -> Option<(usize, usize)> {
        let dy = y as f32 + 0.5 - self.cy;
        if !(dy.abs() < self.ro) {
            return None;
        }
        let ho = super::raster::sqrt(self.ro * self.ro - dy * dy);
        Some((span_start(self.cx - ho), span_end(self.cx + ho, w)))
    }
}

/// Half the rim's width, px.
fn rim_half_width(dpr: f32) -> f32 {
    0.75 * dpr
}

/// Whether blending any pixel fully (coverage 1) to the outside colour gives
/// exactly the outside colour's bytes, channel by channel (checked over every
/// byte value, once per palette).
fn full_dark_is_fill(pal: &Palette) -> bool {
    use std::sync::OnceLock;
    static CHECK: [OnceLock<bool>; 2] = [OnceLock::new(), OnceLock::new()];
    *CHECK[pal.night as usize].get_or_init(|| full_blend_is_fill(pal.map(background::OUTSIDE), super::raster::luts()))
}

/// Darkens everything outside the field and draws its rim, anti-aliased.
/// Row spans: pixels far from the edge are filled or skipped whole; only a
/// band about the edge is shaded per pixel.
#[cfg_attr(target_arch = "wasm32", target_feature(enable = "simd128"))]
pub(crate) fn field_mask(cv: &mut Canvas, scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette, rows: (usize, usize), edge: Option<&CircleEdge>) {
    let out = pal.map(background::OUTSIDE);
    let rim = pal.map(RIM);
    let out8 = super::raster::to_rgba8(out);
    let half_w = rim_half_width(dpr);
    let band = half_w + 1.5;
    match &scene.field {
        FieldEdge::Circle { radius_rad } => {
            let own;
            let e = match edge {
                Some(e) => e,
                None => {
                    own = CircleEdge::new(*radius_rad, t, dpr, pal, cv.bg.rgba);
                    &own
                }
            };
            let (cx, cy, ri) = (e.cx, e.cy, e.ri);
            let (g, luts, bg) = (&e.shade, cv.luts, cv.bg);
            // The outside runs from the end of one row's span to the start of
            // the next row's: filled as one run (fewer, longer fills).
            let w = cv.w;
            let mut run = rows.0 * w;
            for y in rows.0..rows.1.min(cv.h) {
                let Some((xl, xr)) = e.span(y, cv.w) else {
                    continue;
                };
                let dy = y as f32 + 0.5 - cy;
                // xl may lie past the row's end (all of it outside), xr never does.
                let xl_in = xl.min(w);
                cv.fill_run(run, y * w + xl_in, out8);
                run = y * w + xr.max(xl_in);
                let (il, ir) = if dy.abs() < ri {
                    let hi = super::raster::sqrt(ri * ri - dy * dy);
                    (span_end(cx - hi, cv.w).max(xl), span_start(cx + hi).min(xr))
                } else {
                    (xr, xr)
                };
                // Shaded spans, and how far a group of four may run past each:
                // into the inner gap (no-ops there), or past xr (filled after).
                let spans = if il < ir { [(xl, il.min(xr), ir), (ir, xr, w)] } else { [(xl, xr, w), (xr, xr, w)] };
                let row = y * w * 4;
                for (a, b, limit) in spans {
                    let mut x = a;
                    while x < b {
                        if x + 4 <= limit {
                            if let Ok(p) = <&mut [u8; 16]>::try_from(&mut cv.px[row + x * 4..row + x * 4 + 16]) {
                                rim4!(p, x, dy, g, luts, &bg);
                            }
                            x += 4;
                        } else {
                            rim1(&mut cv.px[row + x * 4..row + x * 4 + 4], x, dy, g, luts);
                            x += 1;
                        }
                    }
                }
            }
            cv.fill_run(run, rows.1.min(cv.h) * w, out8);
        }
        FieldEdge::Polygon { corners } => {
            let pts: Vec<(f32, f32)> = corners.iter().map(|c| t.to_px(*c)).collect();
            let poly: Vec<DVec2> = pts.iter().map(|p| DVec2::new(p.0 as f64, p.1 as f64)).collect();
            for y in rows.0..rows.1.min(cv.h) {
                let yc = y as f32 + 0.5;
                // Inside span of this row, and the x-ranges within `band` of an edge.
                let (inside, near) = polygon_row(&pts, yc, band);
                let mut x = 0usize;
                while x < cv.w {
                    let xc = x as f32 + 0.5;
                    let is_near = near.iter().any(|&(a, b)| xc >= a && xc <= b);
                    if is_near {
                        let d = crate::scene::polygon_signed_distance(&poly, DVec2::new(xc as f64, yc as f64)) as f32;
                        edge_pixel(cv, x, y, d, half_w, out, rim);
                        x += 1;
                        continue;
                    }
                    // Run to the next near range or the end, filling if outside.
                    let next = near.iter().filter(|&&(a, _)| a > xc).map(|&(a, _)| span_start(a)).min().unwrap_or(cv.w).max(x + 1);
                    let in_row = inside.is_some_and(|(a, b)| xc >= a && xc <= b);
                    if !in_row {
                        cv.fill_span(y, x, next, out8);
                    }
                    x = next;
                }
            }
        }
    }
}

/// `x − 0.5` held within ±2²⁴ (NaN to the low end): there every float has
/// its floor and ceiling in i32, and pixel indices beyond 2²⁴ lie past any
/// frame's edge (frames are at most `MAX_SIDE_PX` wide), so the spans below
/// are those of the float floor and ceiling. Integer arithmetic: these run
/// four times a row, and a float floor plus a saturating float → usize cast
/// took about 30 instructions each.
#[inline]
fn centre_offset(x: f32) -> f32 {
    const LIM: f32 = 16_777_216.0;
    let v = x - 0.5;
    let v = if v > -LIM { v } else { -LIM };
    if v < LIM { v } else { LIM }
}

/// The first pixel whose centre is at or right of `x`, or 0.
#[inline]
fn span_start(x: f32) -> usize {
    let v = centre_offset(x);
    let t = v as i32;
    // t truncates towards zero: one up when v lies above it.
    (t + ((t as f32) < v) as i32).max(0) as usize
}

/// One past the last pixel whose centre is at or left of `x`, at most `w`.
#[inline]
fn span_end(x: f32, w: usize) -> usize {
    let v = centre_offset(x);
    let t = v as i32;
    // floor(v) + 1: t is one too high when v lies below it.
    ((t + 1 - ((t as f32) > v) as i32).max(0) as usize).min(w)
}

/// The dark and the rim over one pixel at signed distance `d` from the edge.
/// A coverage of 0 leaves the bytes as they are (the sRGB tables round-trip
/// every byte), so both blends run without a branch.
#[inline(always)]
fn edge_pixel(cv: &mut Canvas, x: usize, y: usize, d: f32, half_w: f32, out: [f32; 3], rim: [f32; 3]) {
    let i = cv.idx(x, y);
    let luts = cv.luts;
    let p = &mut cv.px[i..i + 4];
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, out, (d + 0.5).clamp(0.0, 1.0));
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, rim, (half_w + 0.5 - d.abs()).clamp(0.0, 1.0));
}

/// For a convex polygon (pixel coords): the inside x-span on row `yc` and the
/// x-ranges within `band` of each edge.
fn polygon_row(pts: &[(f32, f32)], yc: f32, band: f32) -> (Option<(f32, f32)>, Vec<(f32, f32)>) {
    let n = pts.len();
    let mut lo = f32::INFINITY;
    let mut hi = f32::NEG_INFINITY;
    let mut near = Vec::with_capacity(n);
    for i in 0..n {
        let a = pts[i];
        let b = pts[(i + 1) % n];
        if (a.1 - yc) * (b.1 - yc) <= 0.0 && a.1 != b.1 {
            let x = a.0 + (yc - a.1) / (b.1 - a.1) * (b.0 - a.0);
            lo = lo.min(x);
            hi = hi.max(x);
        }
        // x-extent of the segment between rows yc ± band, grown by band.
        let (y0, y1) = (yc - band, yc + band);
        let (ta, tb) = if (b.1 - a.1).abs() < 1e-6 {
            if a.1 >= y0 && a.1 <= y1 { (0.0, 1.0) } else { continue }
        } else {
            let t0 = (y0 - a.1) / (b.1 - a.1);
            let t1 = (y1 - a.1) / (b.1 - a.1);
            let (t0, t1) = (t0.min(t1).max(0.0), t0.max(t1).min(1.0));
            if t0 > t1 { continue } else { (t0, t1) }
        };
        let xa = a.0 + ta * (b.0 - a.0);
        let xb = a.0 + tb * (b.0 - a.0);
        near.push((xa.min(xb) - band, xa.max(xb) + band));
    }
    (if lo <= hi { Some((lo, hi)) } else { None }, near)
}

/// Human wording of a duration: "45 s", "3 min 20 s", "1 h 05 min".
pub fn format_duration(s: f64) -> String {
    if !s.is_finite() {
        return "never".to_string();
    }
    let s = s.max(0.0).round() as u64;
    if s < 60 {
        format!("{s} s")
    } else if s < 3600 {
        format!("{} min {:02} s", s / 60, s % 60)
    } else {
        format!("{} h {:02} min", s / 3600, (s % 3600) / 60)
    }
}

/// Draws the compass (north, east), the zenith and drift ticks at the field
/// edge, and returns their labels.
pub(crate) fn draw_markers(cv: &mut Canvas, scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette) -> Vec<Label> {
    let mut labels = Vec::new();
    let w = 1.5 * dpr;
    let len = 30.0 * dpr;
    // Compass in the lower-left corner: arrows along north and east.
    let o = (14.0 * dpr + len, cv.h as f32 - 14.0 * dpr - len);
    for (dir, col, text, kind, l) in [
        (DVec2::new(0.0, 1.0), NORTH, "N", LabelKind::North, len),
        (DVec2::new(1.0, 0.0), EAST, "E", LabelKind::East, len * 0.7),
    ] {
        let d = t.dir_px(dir);
        let tip = (o.0 + d.0 * l, o.1 + d.1 * l);
        let c = pal.map(col);
        cv.line(o, tip, w, c, 1.0);
        cv.arrow_head(tip, d, 7.0 * dpr, w, c);
        labels.push(Label { text: text.into(), x_px: tip.0 + d.0 * 8.0 * dpr, y_px: tip.1 + d.1 * 8.0 * dpr, kind });
    }
    let reach = |dir: DVec2| scene.exit_distance_rad(dir);
    if let Some(z) = scene.markers.zenith_dir {
        let d = t.dir_px(z);
        let e = t.to_px(z.normalize_or_zero() * reach(z.normalize_or_zero()));
        let c = pal.map(ZENITH);
        // A tick just outside the edge pointing outwards.
        let a = (e.0 + d.0 * 3.0 * dpr, e.1 + d.1 * 3.0 * dpr);
        let b = (e.0 + d.0 * 16.0 * dpr, e.1 + d.1 * 16.0 * dpr);
        cv.line(a, b, w, c, 1.0);
        cv.arrow_head(b, d, 6.0 * dpr, w, c);
        labels.push(Label { text: "zenith".into(), x_px: b.0 + d.0 * 10.0 * dpr, y_px: b.1 + d.1 * 10.0 * dpr, kind: LabelKind::Zenith });
    }
    if let Some(dr) = scene.markers.drift {
        let d = t.dir_px(dr.dir);
        let e = t.to_px(dr.dir.normalize_or_zero() * reach(dr.dir.normalize_or_zero()));
        let c = pal.map(DRIFT);
        let a = (e.0 - d.0 * 18.0 * dpr, e.1 - d.1 * 18.0 * dpr);
        let b = (e.0 - d.0 * 3.0 * dpr, e.1 - d.1 * 3.0 * dpr);
        cv.line(a, b, w, c, 1.0);
        cv.arrow_head(b, d, 6.0 * dpr, w, c);
        labels.push(Label {
            text: format!("leaves field in {}", format_duration(dr.time_to_exit_s)),
            x_px: e.0 + d.0 * 10.0 * dpr,
            y_px: e.1 + d.1 * 10.0 * dpr,
            kind: LabelKind::Drift,
        });
    }
    labels
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The integer span ends are the float ones (float ceiling and floor,
    /// saturating casts) for every x whose span end is a pixel index below
    /// 2²⁴, and both are at least that beyond; NaN and infinities included.
    #[test]
    fn span_ends_match_the_float_forms() {
        use super::super::raster::{ceil_f, floor_f};
        let (old_start, old_end) = (|x: f32| ceil_f(x - 0.5) as usize, |x: f32, w: usize| ((floor_f(x - 0.5) + 1.0) as usize).min(w));
        let mut xs = vec![f32::NAN, f32::INFINITY, f32::NEG_INFINITY, 0.0, -0.0, 0.5, -0.5, 1e30, -1e30, 16_777_216.5, 16_777_217.0, -16_777_216.0, 3e9, -3e9];
        let mut x = -20_000.0f32;
        while x < 20_000.0 {
            // Steps that hit halves, integers and values between.
            xs.extend([x, x + 0.5, x - 0.5, f32::from_bits(x.to_bits() + 1), f32::from_bits(x.to_bits().wrapping_sub(1))]);
            x += 0.731;
        }
        let big = 1usize << 24;
        for &x in &xs {
            for w in [1usize, 640, 8192, 1 << 30] {
                let (a, b) = (span_start(x), old_start(x));
                assert!(a == b || (a >= big && b >= big), "start {x}: {a} vs {b}");
                let (a, b) = (span_end(x, w), old_end(x, w));
                assert!(a == b || (a >= big && b >= big), "end {x} w {w}: {a} vs {b}");
            }
        }
    }

    /// With the outside colour of both palettes, a full blend towards it gives
    /// its bytes from any pixel, so the mask may fill past the rim instead of
    /// shading (checked against a direct blend of every byte here too).
    #[test]
    fn full_dark_blend_is_a_fill_in_both_palettes() {
        let l = super::super::raster::luts();
        for night in [false, true] {
            let pal = Palette { night };
            assert!(full_dark_is_fill(&pal), "night {night}");
            let out = pal.map(background::OUTSIDE);
            let out8 = super::super::raster::to_rgba8(out);
            for b in 0..=255u8 {
                let mut px = [b, b, b, 255];
                let mut cv = Canvas::new(1, 1, &mut px);
                cv.blend(0, out, 1.0);
                assert_eq!(px, out8, "night {night} byte {b}");
            }
        }
    }
}
