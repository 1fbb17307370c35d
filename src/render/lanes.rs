//! Star light added to four pixels at a time. For each pixel and channel
//! the bytes written are exactly those of the one-pixel path
//! (`raster::add_px` with `kept(k)`): the same IEEE single-precision
//! operations in the same order (k = ky·w, the threshold, v + c·k, clamp,
//! ·4095 + 2²³), only four lanes wide. The tables are read one entry at a
//! time. x86-64 always has SSE2; in wasm the star stamps are compiled with
//! simd128 (the engine validates the module when it loads it, so an engine
//! without SIMD refuses the module rather than running it); anything else
//! takes the one-pixel path. Inputs are finite (no NaN), where every min/max
//! flavour agrees.

use super::raster::Luts;

/// Light below this (linear) is not added: less than a third of one display
/// level at black.
pub(crate) const MIN_LIGHT: f32 = 1.0 / 2048.0;

/// `k`, or 0 when it is below [`MIN_LIGHT`]: adding zero light leaves a pixel's
/// bytes as they are (the sRGB tables round-trip every byte, tested in
/// raster.rs), so rows are drawn whole without a branch per pixel.
#[inline(always)]
pub(crate) fn kept(k: f32) -> f32 {
    if k >= MIN_LIGHT { k } else { 0.0 }
}

/// The colour the frame was filled with, as four pixels' bytes and as
/// linear light (its bytes decoded): a group of four pixels still holding it
/// needs no table reads to decode.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Background {
    pub word4: u128,
    pub lin: [f32; 3],
}

impl Background {
    pub fn new(rgba: [u8; 4], luts: &Luts) -> Background {
        let w = u32::from_ne_bytes(rgba) as u128;
        Background { word4: w | w << 32 | w << 64 | w << 96, lin: [luts.s2l[rgba[0] as usize], luts.s2l[rgba[1] as usize], luts.s2l[rgba[2] as usize]] }
    }
}

/// Adds `colour · kept(ky · w[i])` to pixel i of the RGBA8 row segment `seg`
/// for every i < w.len(). `seg` holds 4·w.len() bytes; groups of four go
/// four lanes wide, the rest one by one. A macro, so that in wasm it lands
/// inside the calling (simd128) stamp rather than in a call per row.
macro_rules! add_row {
    ($seg:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr) => {{
        let seg: &mut [u8] = $seg;
        let w: &[f32] = $w;
        let (ky, colour): (f32, [f32; 3]) = ($ky, $colour);
        let luts: &$crate::render::raster::Luts = $luts;
        let bg: &$crate::render::lanes::Background = $bg;
        let n4 = w.len() / 4 * 4;
        let (seg4, seg1) = seg.split_at_mut((n4 * 4).min(seg.len()));
        for (p, w) in seg4.chunks_exact_mut(16).zip(w.chunks_exact(4)) {
            if let (Ok(p), Ok(w)) = (<&mut [u8; 16]>::try_from(p), <&[f32; 4]>::try_from(w)) {
                $crate::render::lanes::add4!(p, w, ky, colour, luts, bg);
            }
        }
        for (p, w) in seg1.chunks_exact_mut(4).zip(w[n4..].iter()) {
            $crate::render::raster::add_px(p, &luts.s2l, &luts.l2s, colour, $crate::render::lanes::kept(ky * w));
        }
    }};
}
pub(crate) use add_row;

/// Adds `colour · kept(ky · w[i])` to the four RGBA8 pixels of `p`
/// (use [`add4!`], which also covers wasm).
#[cfg(target_arch = "x86_64")]
#[inline(always)]
pub(crate) fn add4_fn(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts, bg: &Background) {
    use core::arch::x86_64::*;
    let (s2l, l2s) = (&luts.s2l, &luts.l2s);
    // Four background pixels decode to the background's light.
    let plain = u128::from_ne_bytes(*p) == bg.word4;
    // SAFETY: SSE2 is part of the x86-64 baseline; the loads and stores
    // below read `w` (4 f32) and write `idx` (4 u32), both in bounds.
    unsafe {
        let k = _mm_mul_ps(_mm_set1_ps(ky), _mm_loadu_ps(w.as_ptr()));
        let k = _mm_and_ps(k, _mm_cmpge_ps(k, _mm_set1_ps(MIN_LIGHT)));
        for ch in 0..3 {
            let v = if plain {
                _mm_set1_ps(bg.lin[ch])
            } else {
                _mm_setr_ps(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize])
            };
            let lin = _mm_add_ps(v, _mm_mul_ps(_mm_set1_ps(colour[ch]), k));
            let lin = _mm_min_ps(_mm_max_ps(lin, _mm_setzero_ps()), _mm_set1_ps(1.0));
            let q = _mm_add_ps(_mm_mul_ps(lin, _mm_set1_ps(4095.0)), _mm_set1_ps(8_388_608.0));
            let mut idx = [0u32; 4];
            _mm_storeu_si128(idx.as_mut_ptr() as *mut __m128i, _mm_castps_si128(q));
            for (j, i) in idx.iter().enumerate() {
                p[4 * j + ch] = l2s[(i & 4095) as usize];
            }
        }
    }
}

/// wasm: the body is expanded in place by [`add4!`] inside the stamps, which
/// are compiled with simd128 (a function without the feature would not take
/// the intrinsics inline, and one with it is not always inlined).
#[cfg(target_arch = "wasm32")]
macro_rules! add4 {
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr) => {{
        use core::arch::wasm32::*;
        let p: &mut [u8; 16] = $p;
        let w: &[f32; 4] = $w;
        let (ky, colour): (f32, [f32; 3]) = ($ky, $colour);
        let luts: &$crate::render::raster::Luts = $luts;
        let bg: &$crate::render::lanes::Background = $bg;
        let (s2l, l2s) = (&luts.s2l, &luts.l2s);
        let plain = u128::from_ne_bytes(*p) == bg.word4;
        let k = f32x4_mul(f32x4_splat(ky), f32x4(w[0], w[1], w[2], w[3]));
        let k = v128_and(k, f32x4_ge(k, f32x4_splat($crate::render::lanes::MIN_LIGHT)));
        for ch in 0..3 {
            let v = if plain {
                f32x4_splat(bg.lin[ch])
            } else {
                f32x4(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize])
            };
            let lin = f32x4_add(v, f32x4_mul(f32x4_splat(colour[ch]), k));
            let lin = f32x4_pmin(f32x4_pmax(lin, f32x4_splat(0.0)), f32x4_splat(1.0));
            let q = f32x4_add(f32x4_mul(lin, f32x4_splat(4095.0)), f32x4_splat(8_388_608.0));
            let idx = v128_and(q, u32x4_splat(4095));
            p[ch] = l2s[u32x4_extract_lane::<0>(idx) as usize & 4095];
            p[4 + ch] = l2s[u32x4_extract_lane::<1>(idx) as usize & 4095];
            p[8 + ch] = l2s[u32x4_extract_lane::<2>(idx) as usize & 4095];
            p[12 + ch] = l2s[u32x4_extract_lane::<3>(idx) as usize & 4095];
        }
    }};
}

/// Elsewhere [`add4!`] calls [`add4_fn`], which inlines.
#[cfg(not(target_arch = "wasm32"))]
macro_rules! add4 {
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr) => {
        $crate::render::lanes::add4_fn($p, $w, $ky, $colour, $luts, $bg)
    };
}
pub(crate) use add4;

#[cfg(not(any(target_arch = "x86_64", target_arch = "wasm32")))]
#[inline(always)]
pub(crate) fn add4_fn(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts, _bg: &Background) {
    for (p, w) in p.chunks_exact_mut(4).zip(w.iter()) {
        super::raster::add_px(p, &luts.s2l, &luts.l2s, colour, kept(ky * w));
    }
}

/// The field edge over four pixels of one row: the dark outside the edge,
/// then the rim, each blended in linear light with its coverage and
/// quantised to bytes in between, exactly as [`rim1`] does one pixel (same
/// operations per lane; the square root is IEEE's).
#[derive(Clone, Copy, Debug)]
pub(crate) struct RimShade {
    /// Edge centre x and radius, px.
    pub cx: f32,
    pub r: f32,
    /// Half the rim's width plus half a pixel.
    pub hw5: f32,
    pub out: [f32; 3],
    pub rim: [f32; 3],
}

/// Shades pixels x..x+4 of a row whose centre lies `dy` below the edge
/// centre (`p` holds their 16 bytes).
#[cfg(target_arch = "x86_64")]
#[inline(always)]
pub(crate) fn rim4_fn(p: &mut [u8; 16], x: usize, dy: f32, g: &RimShade, luts: &Luts) {
    use core::arch::x86_64::*;
    let (s2l, l2s) = (&luts.s2l, &luts.l2s);
    // SAFETY: SSE2 is part of the x86-64 baseline; `idx` is 4 u32 in bounds.
    unsafe {
        let xf = _mm_setr_ps(x as f32, (x + 1) as f32, (x + 2) as f32, (x + 3) as f32);
        let dx = _mm_sub_ps(_mm_add_ps(xf, _mm_set1_ps(0.5)), _mm_set1_ps(g.cx));
        let d = _mm_sub_ps(_mm_sqrt_ps(_mm_add_ps(_mm_mul_ps(dx, dx), _mm_set1_ps(dy * dy))), _mm_set1_ps(g.r));
        let (zero, one) = (_mm_setzero_ps(), _mm_set1_ps(1.0));
        let a1 = _mm_min_ps(_mm_max_ps(_mm_add_ps(d, _mm_set1_ps(0.5)), zero), one);
        let ad = _mm_andnot_ps(_mm_set1_ps(-0.0), d);
        let a2 = _mm_min_ps(_mm_max_ps(_mm_sub_ps(_mm_set1_ps(g.hw5), ad), zero), one);
        let enc = |lin: __m128| -> [u32; 4] {
            let lin = _mm_min_ps(_mm_max_ps(lin, zero), one);
            let q = _mm_add_ps(_mm_mul_ps(lin, _mm_set1_ps(4095.0)), _mm_set1_ps(8_388_608.0));
            let mut idx = [0u32; 4];
            _mm_storeu_si128(idx.as_mut_ptr() as *mut __m128i, _mm_castps_si128(q));
            idx.map(|i| l2s[(i & 4095) as usize] as u32)
        };
        for ch in 0..3 {
            let v = _mm_setr_ps(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]);
            let b1 = enc(_mm_add_ps(v, _mm_mul_ps(_mm_sub_ps(_mm_set1_ps(g.out[ch]), v), a1)));
            let v1 = _mm_setr_ps(s2l[b1[0] as usize], s2l[b1[1] as usize], s2l[b1[2] as usize], s2l[b1[3] as usize]);
            let b2 = enc(_mm_add_ps(v1, _mm_mul_ps(_mm_sub_ps(_mm_set1_ps(g.rim[ch]), v1), a2)));
            for (j, b) in b2.iter().enumerate() {
                p[4 * j + ch] = *b as u8;
            }
        }
    }
}

/// wasm: expanded in place by [`rim4!`] inside the (simd128) field mask.
#[cfg(target_arch = "wasm32")]
macro_rules! rim4 {
    ($p:expr, $x:expr, $dy:expr, $g:expr, $luts:expr) => {{
        use core::arch::wasm32::*;
        let p: &mut [u8; 16] = $p;
        let (x, dy): (usize, f32) = ($x, $dy);
        let g: &$crate::render::lanes::RimShade = $g;
        let luts: &$crate::render::raster::Luts = $luts;
        let (s2l, l2s) = (&luts.s2l, &luts.l2s);
        let xf = f32x4(x as f32, (x + 1) as f32, (x + 2) as f32, (x + 3) as f32);
        let dx = f32x4_sub(f32x4_add(xf, f32x4_splat(0.5)), f32x4_splat(g.cx));
        let d = f32x4_sub(f32x4_sqrt(f32x4_add(f32x4_mul(dx, dx), f32x4_splat(dy * dy))), f32x4_splat(g.r));
        let (zero, one) = (f32x4_splat(0.0), f32x4_splat(1.0));
        let a1 = f32x4_pmin(f32x4_pmax(f32x4_add(d, f32x4_splat(0.5)), zero), one);
        let a2 = f32x4_pmin(f32x4_pmax(f32x4_sub(f32x4_splat(g.hw5), f32x4_abs(d)), zero), one);
        let enc = |lin: v128| -> [u32; 4] {
            let lin = f32x4_pmin(f32x4_pmax(lin, zero), one);
            let q = f32x4_add(f32x4_mul(lin, f32x4_splat(4095.0)), f32x4_splat(8_388_608.0));
            let i = v128_and(q, u32x4_splat(4095));
            [
                l2s[u32x4_extract_lane::<0>(i) as usize & 4095] as u32,
                l2s[u32x4_extract_lane::<1>(i) as usize & 4095] as u32,
                l2s[u32x4_extract_lane::<2>(i) as usize & 4095] as u32,
                l2s[u32x4_extract_lane::<3>(i) as usize & 4095] as u32,
            ]
        };
        for ch in 0..3 {
            let v = f32x4(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]);
            let b1 = enc(f32x4_add(v, f32x4_mul(f32x4_sub(f32x4_splat(g.out[ch]), v), a1)));
            let v1 = f32x4(s2l[b1[0] as usize], s2l[b1[1] as usize], s2l[b1[2] as usize], s2l[b1[3] as usize]);
            let b2 = enc(f32x4_add(v1, f32x4_mul(f32x4_sub(f32x4_splat(g.rim[ch]), v1), a2)));
            for (j, b) in b2.iter().enumerate() {
                p[4 * j + ch] = *b as u8;
            }
        }
    }};
}

/// Elsewhere [`rim4!`] calls [`rim4_fn`].
#[cfg(not(target_arch = "wasm32"))]
macro_rules! rim4 {
    ($p:expr, $x:expr, $dy:expr, $g:expr, $luts:expr) => {
        $crate::render::lanes::rim4_fn($p, $x, $dy, $g, $luts)
    };
}
pub(crate) use rim4;

/// One pixel at a time (targets without SSE2 or simd128).
#[cfg(not(any(target_arch = "x86_64", target_arch = "wasm32")))]
#[inline(always)]
pub(crate) fn rim4_fn(p: &mut [u8; 16], x: usize, dy: f32, g: &RimShade, luts: &Luts) {
    for (j, p) in p.chunks_exact_mut(4).enumerate() {
        rim1(p, x + j, dy, g, luts);
    }
}

/// One pixel of [`rim4!`].
#[inline(always)]
pub(crate) fn rim1(p: &mut [u8], x: usize, dy: f32, g: &RimShade, luts: &Luts) {
    let dx = x as f32 + 0.5 - g.cx;
    let d = super::raster::sqrt(dx * dx + dy * dy) - g.r;
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, g.out, (d + 0.5).clamp(0.0, 1.0));
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, g.rim, (g.hw5 - d.abs()).clamp(0.0, 1.0));
}

#[cfg(test)]
mod tests {
    use super::super::raster::add_px;
    use super::*;

    /// The four-lane path writes the bytes of the one-pixel path, over every
    /// byte value, weights either side of the threshold and light that clips,
    /// on pixels that hold the background colour and on pixels that do not.
    #[test]
    fn four_lanes_match_one_pixel() {
        let luts = super::super::raster::luts();
        let colours = [[1.0, 0.8, 0.55], [0.6, 0.75, 1.0], [0.9, 0.0, 0.0], [0.0, 0.0, 0.0]];
        let weights = [0.0, 1e-4, 0.01, 0.2, 0.37, 0.5, 0.9, 1.0];
        let kys = [0.0, MIN_LIGHT, 0.003, 0.05, 0.3, 1.0, 7.5, 300.0];
        let mut n = 0;
        for c in colours {
            for &ky in &kys {
                for w0 in 0..weights.len() {
                    let w = [weights[w0], weights[(w0 + 3) % 8], weights[(w0 + 5) % 8], weights[(w0 + 6) % 8], weights[(w0 + 1) % 8]];
                    for base in (0..512).step_by(5) {
                        // Half the cases: five copies of one pixel, the background.
                        let plain = base >= 256;
                        let mut a: Vec<u8> = (0..20).map(|i| ((base + if plain { 37 * (i % 4) } else { 37 * i }) % 256) as u8).collect();
                        let bg = Background::new(if plain { [a[0], a[1], a[2], a[3]] } else { [1, 2, 3, 255] }, luts);
                        let mut b = a.clone();
                        add_row!(&mut a, &w, ky, c, luts, &bg);
                        for (p, w) in b.chunks_exact_mut(4).zip(w.iter()) {
                            add_px(p, &luts.s2l, &luts.l2s, c, kept(ky * w));
                        }
                        assert_eq!(a, b, "colour {c:?} ky {ky} w {w:?}");
                        n += 1;
                    }
                }
            }
        }
        assert!(n > 1000);
    }
}
