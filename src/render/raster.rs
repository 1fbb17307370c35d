//! Pixel primitives on an RGBA8 sRGB buffer. Light is added and blended in
//! linear light through lookup tables (sRGB transfer function, IEC 61966-2-1),
//! touching only the pixels a primitive covers.

use std::sync::OnceLock;

const L2S_N: usize = 4096;

pub(crate) struct Luts {
    pub s2l: [f32; 256],
    pub l2s: [u8; L2S_N],
    /// `s2l[l2s[i]]`: a quantised light index straight to the light of the
    /// byte it encodes to, for a blend whose byte is blended again before it
    /// is stored (the field edge's dark, then its rim): one lookup instead of
    /// two dependent ones. 16 KB, beside the 5 KB of the other two, still
    /// well inside a first-level data cache.
    pub q2l: [f32; L2S_N],
}

/// sRGB decode (IEC 61966-2-1).
pub fn srgb_to_linear(c: f32) -> f32 {
    if c <= 0.04045 {
        c / 12.92
    } else {
        libm::powf((c + 0.055) / 1.055, 2.4)
    }
}

/// sRGB encode (IEC 61966-2-1).
pub fn linear_to_srgb(l: f32) -> f32 {
    if l <= 0.003_130_8 {
        l * 12.92
    } else {
        1.055 * libm::powf(l, 1.0 / 2.4) - 0.055
    }
}

pub(crate) fn luts() -> &'static Luts {
    static L: OnceLock<Luts> = OnceLock::new();
    L.get_or_init(|| {
        let mut s2l = [0.0f32; 256];
        for (i, v) in s2l.iter_mut().enumerate() {
            *v = srgb_to_linear(i as f32 / 255.0);
        }
        let mut l2s = [0u8; L2S_N];
        for (i, v) in l2s.iter_mut().enumerate() {
            let l = i as f32 / (L2S_N - 1) as f32;
            *v = (linear_to_srgb(l) * 255.0 + 0.5).clamp(0.0, 255.0) as u8;
        }
        let mut q2l = [0.0f32; L2S_N];
        for (q, &b) in q2l.iter_mut().zip(l2s.iter()) {
            *q = s2l[b as usize];
        }
        Luts { s2l, l2s, q2l }
    })
}

#[inline(always)]
pub(crate) fn enc(l2s: &[u8; L2S_N], lin: f32) -> u8 {
    // Round to an index by the 2^23 trick (adding 2^23 leaves the rounded
    // integer in the low mantissa bits): no saturating float→int checks.
    // lin in [0, 1] keeps it ≤ 4095; the mask lets the bounds check go.
    let v = lin.clamp(0.0, 1.0) * (L2S_N - 1) as f32 + 8_388_608.0;
    l2s[(v.to_bits() & (L2S_N as u32 - 1)) as usize]
}

/// Adds linear light `c · k` to one RGBA pixel.
#[inline(always)]
pub(crate) fn add_px(p: &mut [u8], s2l: &[f32; 256], l2s: &[u8; L2S_N], c: [f32; 3], k: f32) {
    p[0] = enc(l2s, s2l[p[0] as usize] + c[0] * k);
    p[1] = enc(l2s, s2l[p[1] as usize] + c[1] * k);
    p[2] = enc(l2s, s2l[p[2] as usize] + c[2] * k);
}

/// Blends one RGBA pixel towards linear colour `c` by a coverage already in
/// [0, 1] ([`Canvas::blend`] without its early return: a coverage of 0
/// writes the same bytes back, every byte round-trips through the tables).
#[inline(always)]
pub(crate) fn blend_px(p: &mut [u8], s2l: &[f32; 256], l2s: &[u8; L2S_N], c: [f32; 3], a: f32) {
    for k in 0..3 {
        let v = s2l[p[k] as usize];
        p[k] = enc(l2s, v + (c[k] - v) * a);
    }
}

/// Linear RGB colour → RGBA8 (opaque).
pub fn to_rgba8(c: [f32; 3]) -> [u8; 4] {
    let l = &luts().l2s;
    [enc(l, c[0]), enc(l, c[1]), enc(l, c[2]), 255]
}

/// A mutable view of the frame's pixels.
pub(crate) struct Canvas<'a> {
    pub w: usize,
    pub h: usize,
    pub px: &'a mut [u8],
    pub luts: &'static Luts,
    /// Whole rows of the last two fill colours: a span is filled by one
    /// block copy from them (one call out of wasm, one `memcpy` natively).
    fill_rows: [([u8; 4], Vec<u8>); 2],
    /// The background the stamps may find unchanged (see `lanes::Background`).
    pub bg: super::lanes::Background,
}

impl<'a> Canvas<'a> {
    pub fn new(w: usize, h: usize, px: &'a mut [u8]) -> Self {
        let luts = luts();
        Canvas { w, h, px, luts, fill_rows: [([0; 4], Vec::new()), ([0; 4], Vec::new())], bg: super::lanes::Background::new([0, 0, 0, 255], luts) }
    }

    /// A row of `rgba`, `w` pixels long.
    fn fill_row(&mut self, rgba: [u8; 4]) -> usize {
        let n = self.w * 4;
        if let Some(k) = self.fill_rows.iter().position(|(c, r)| *c == rgba && r.len() == n) {
            return k;
        }
        // Replace the older one: slot 1 moves to slot 0.
        self.fill_rows.swap(0, 1);
        let (c, r) = &mut self.fill_rows[1];
        *c = rgba;
        r.clear();
        r.resize(n, 0);
        fill_short(r, rgba);
        1
    }



    /// Fills pixels [x0, x1) of row y.
    #[inline]
    pub fn fill_span(&mut self, y: usize, x0: usize, x1: usize, rgba: [u8; 4]) {
        let x1 = x1.min(self.w);
        if x0 >= x1 || y >= self.h {
            return;
        }
        let row = y * self.w * 4;
        if x1 - x0 < 64 {
            fill_short(&mut self.px[row + x0 * 4..row + x1 * 4], rgba);
            return;
        }
        let k = self.fill_row(rgba);
        self.px[row + x0 * 4..row + x1 * 4].copy_from_slice(&self.fill_rows[k].1[x0 * 4..x1 * 4]);
    }

    /// Fills pixels [a, b) of the whole buffer (row-major), however many rows
    /// that crosses: short runs by direct stores, long ones by block copies
    /// of a prepared row.
    pub fn fill_run(&mut self, a: usize, b: usize, rgba: [u8; 4]) {
        let b = b.min(self.w * self.h);
        if a >= b {
            return;
        }
        if b - a < 64 {
            fill_short(&mut self.px[a * 4..b * 4], rgba);
            return;
        }
        let k = self.fill_row(rgba);
        let pat = &self.fill_rows[k].1;
        let run = &mut self.px[a * 4..b * 4];
        let first = pat.len().min(run.len());
        run[..first].copy_from_slice(&pat[..first]);
        // Then double what is done: a few long copies for many rows.
        let mut done = first;
        while done < run.len() {
            let m = done.min(run.len() - done);
            run.copy_within(0..m, done);
            done += m;
        }
    }

    /// Adds linear light `c * k` to pixel (x, y); no bounds check on purpose-
    /// callers clip.
    #[inline(always)]
    pub fn add(&mut self, idx: usize, c: [f32; 3], k: f32) {
        add_px(&mut self.px[idx..idx + 3], &self.luts.s2l, &self.luts.l2s, c, k);
    }

    /// Blends pixel towards linear colour `c` by coverage `a` (0..1).
    #[inline(always)]
    pub fn blend(&mut self, idx: usize, c: [f32; 3], a: f32) {
        if a <= 0.0 {
            return;
        }
        let s2l = &self.luts.s2l;
        let l2s = &self.luts.l2s;
        let p = &mut self.px[idx..idx + 3];
        for k in 0..3 {
            let v = s2l[p[k] as usize];
            p[k] = enc(l2s, v + (c[k] - v) * a.min(1.0));
        }
    }

    /// Multiplies pixel light by `f` (dark nebulae, shadows).
    #[inline(always)]
    pub fn scale(&mut self, idx: usize, f: f32) {
        let s2l = &self.luts.s2l;
        let l2s = &self.luts.l2s;
        let p = &mut self.px[idx..idx + 3];
        for k in 0..3 {
            p[k] = enc(l2s, s2l[p[k] as usize] * f);
        }
    }

    #[inline(always)]
    pub fn idx(&self, x: usize, y: usize) -> usize {
        (y * self.w + x) * 4
    }

    /// Anti-aliased line of width `w` px from a to b (pixel coordinates, y down).
    pub fn line(&mut self, a: (f32, f32), b: (f32, f32), w: f32, c: [f32; 3], alpha: f32) {
        let half = w * 0.5;
        let x0 = (a.0.min(b.0) - half - 1.0).floor().max(0.0) as usize;
        let y0 = (a.1.min(b.1) - half - 1.0).floor().max(0.0) as usize;
        let x1 = ((a.0.max(b.0) + half + 1.0).ceil().max(0.0) as usize).min(self.w);
        let y1 = ((a.1.max(b.1) + half + 1.0).ceil().max(0.0) as usize).min(self.h);
        let (dx, dy) = (b.0 - a.0, b.1 - a.1);
        let len2 = (dx * dx + dy * dy).max(1e-12);
        for y in y0..y1 {
            let py = y as f32 + 0.5;
            for x in x0..x1 {
                let px = x as f32 + 0.5;
                let t = (((px - a.0) * dx + (py - a.1) * dy) / len2).clamp(0.0, 1.0);
                let (ex, ey) = (px - a.0 - t * dx, py - a.1 - t * dy);
                let d = sqrt(ex * ex + ey * ey);
                let cov = (half + 0.5 - d).clamp(0.0, 1.0);
                if cov > 0.0 {
                    let i = self.idx(x, y);
                    self.blend(i, c, cov * alpha);
                }
            }
        }
    }

    /// A filled triangle-ish arrow head: tip at `tip`, pointing along unit `dir`.
    pub fn arrow_head(&mut self, tip: (f32, f32), dir: (f32, f32), size: f32, w: f32, c: [f32; 3]) {
        let (nx, ny) = (-dir.1, dir.0);
        let base = (tip.0 - dir.0 * size, tip.1 - dir.1 * size);
        let l = (base.0 + nx * size * 0.5, base.1 + ny * size * 0.5);
        let r = (base.0 - nx * size * 0.5, base.1 - ny * size * 0.5);
        self.line(l, tip, w, c, 1.0);
        self.line(r, tip, w, c, 1.0);
    }
}

/// Fills an RGBA8 slice with one colour: one pixel, then the filled part
/// copied onto the rest in doubling blocks (a few large memcpys).
pub fn fill_rgba(px: &mut [u8], rgba: [u8; 4]) {
    let n = px.len() / 4 * 4;
    if n == 0 {
        return;
    }
    px[..4].copy_from_slice(&rgba);
    let mut done = 4;
    while done < n {
        let m = done.min(n - done);
        px.copy_within(0..m, done);
        done += m;
    }
}

/// Fills an RGBA8 slice with one colour, 16 bytes per store.
#[inline]
pub(crate) fn fill_short(px: &mut [u8], rgba: [u8; 4]) {
    let w = u32::from_ne_bytes(rgba) as u128;
    let pat = (w | w << 32 | w << 64 | w << 96).to_ne_bytes();
    let mut blocks = px.chunks_exact_mut(16);
    for b in &mut blocks {
        b.copy_from_slice(&pat);
    }
    for c in blocks.into_remainder().chunks_exact_mut(4) {
        c.copy_from_slice(&rgba);
    }
}

/// Square root. IEEE 754 makes it correctly rounded on every target (one
/// instruction: `sqrtss`, wasm `f32.sqrt`), so it gives the same bits as
/// `libm::sqrtf`, which on wasm is the same function done in software.
#[inline(always)]
pub(crate) fn sqrt(x: f32) -> f32 {
    x.sqrt()
}

/// `a.max(b)` when `b` is a number: a compare and a select (in wasm,
/// `f32::max` is a library call for its NaN rule; here a NaN `a` gives `b`
/// just as `f32::max` does).
#[inline(always)]
pub(crate) fn max_f(a: f32, b: f32) -> f32 {
    if a > b { a } else { b }
}

/// `v.floor()` as a float, exact, without a library call on targets lacking a
/// rounding instruction: floats of magnitude ≥ 2²³ (and NaN) are already
/// integral. The sign of a zero result may differ, which no caller sees.
/// (The field edge's spans now use integer forms, tested against these.)
#[cfg_attr(not(test), allow(dead_code))]
#[inline(always)]
pub(crate) fn floor_f(v: f32) -> f32 {
    if v.abs() < 8_388_608.0 {
        let f = v as i32 as f32;
        if f > v { f - 1.0 } else { f }
    } else {
        v
    }
}

/// `v.ceil()` as a float (see [`floor_f`]).
#[cfg_attr(not(test), allow(dead_code))]
#[inline(always)]
pub(crate) fn ceil_f(v: f32) -> f32 {
    -floor_f(-v)
}

/// Floor of a float as i32, saturating (NaN gives 0), without a libm call:
/// wasm has a floor instruction; the x86-64 baseline has none, so there it
/// is the truncation, one less when that rounded up.
#[cfg(target_arch = "wasm32")]
#[inline(always)]
pub(crate) fn floor_i32(v: f32) -> i32 {
    v.floor() as i32
}

/// See the wasm form above: the same value for every input.
#[cfg(not(target_arch = "wasm32"))]
#[inline(always)]
pub(crate) fn floor_i32(v: f32) -> i32 {
    let i = v as i32;
    if (i as f32) > v { i.saturating_sub(1) } else { i }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// `floor_i32` is the saturating integer floor: over pixel coordinates in
    /// 1/64 steps, values next to every integer, the extremes and NaN.
    #[test]
    fn floor_i32_is_the_saturating_floor() {
        // Rust float-to-int casts saturate, and take NaN to 0.
        let want = |v: f32| libm::floorf(v) as i32 as i64;
        let mut vals: Vec<f32> = (-70_000..70_000).map(|k| k as f32 / 64.0).collect();
        for k in [-3i32, -1, 0, 1, 2, 1000, 8_388_607, 16_777_215] {
            let f = k as f32;
            vals.extend([f, f32::from_bits(f.to_bits() + 1), f32::from_bits(f.to_bits().wrapping_sub(1)), -f]);
        }
        vals.extend([3e9, -3e9, 2_147_483_648.0, -2_147_483_648.0, f32::MAX, f32::MIN, f32::INFINITY, f32::NEG_INFINITY, f32::NAN, -0.0, 1e-30, -1e-30]);
        for v in vals {
            assert_eq!(floor_i32(v) as i64, want(v), "{v:e}");
        }
    }

    /// Every byte decodes and encodes back to itself, so adding zero light
    /// (the stamps' and the rim's branch-free paths) leaves a pixel as it is.
    #[test]
    fn every_byte_round_trips() {
        let l = luts();
        for b in 0..=255u8 {
            assert_eq!(enc(&l.l2s, l.s2l[b as usize]), b, "byte {b}");
            assert_eq!(enc(&l.l2s, l.s2l[b as usize] + 0.0 * 0.7), b, "byte {b} plus zero");
        }
    }

    /// The library-free floor, ceiling and square root give the bits of the
    /// library ones over pixel-scale values, halves, negatives and huge values.
    #[test]
    fn floor_ceil_sqrt_match_the_library() {
        let mut v = vec![0.0f32, -0.0, 0.5, -0.5, 1.0, -1.0, 8_388_607.5, -8_388_607.5, 8_388_608.0, 1e30, -1e30, f32::INFINITY];
        let mut x = -5000.0f32;
        while x < 5000.0 {
            v.push(x);
            x += 0.173;
        }
        for &x in &v {
            assert_eq!(floor_f(x), libm::floorf(x), "floor {x}");
            assert_eq!(ceil_f(x), libm::ceilf(x), "ceil {x}");
            assert_eq!(sqrt(x.abs()).to_bits(), libm::sqrtf(x.abs()).to_bits(), "sqrt {x}");
        }
        assert!(floor_f(f32::NAN).is_nan() && ceil_f(f32::NAN).is_nan());
    }

    /// A span fill writes the colour exactly over [x0, x1) and nothing else,
    /// for the short path and the copied-row path, after colour changes.
    #[test]
    fn fill_span_writes_only_its_span() {
        let (w, h) = (300usize, 3usize);
        let mut px = vec![7u8; w * h * 4];
        let mut cv = Canvas::new(w, h, &mut px);
        let spans = [(1, 0, 5, [1, 2, 3, 255]), (1, 10, 290, [4, 5, 6, 255]), (2, 3, 200, [1, 2, 3, 255]), (0, 250, 400, [9, 9, 9, 255]), (2, 299, 300, [4, 5, 6, 255])];
        for &(y, x0, x1, c) in &spans {
            cv.fill_span(y, x0, x1, c);
        }
        let mut want = vec![7u8; w * h * 4];
        for &(y, x0, x1, c) in &spans {
            for x in x0..x1.min(w) {
                want[(y * w + x) * 4..(y * w + x) * 4 + 4].copy_from_slice(&c);
            }
        }
        assert_eq!(px, want);
    }
}
