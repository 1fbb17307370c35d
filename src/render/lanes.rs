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

use super::raster::{add_px, Luts};

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

/// Adds `colour · kept(ky · w[i])` to pixel i of the RGBA8 row segment `seg`
/// for every i < w.len(). `seg` holds 4·w.len() bytes; groups of four go
/// four lanes wide, the rest one by one.
#[cfg_attr(target_arch = "wasm32", target_feature(enable = "simd128"))]
#[cfg_attr(not(target_arch = "wasm32"), inline(always))]
#[cfg_attr(target_arch = "wasm32", inline)]
pub(crate) fn add_row(seg: &mut [u8], w: &[f32], ky: f32, colour: [f32; 3], luts: &Luts) {
    let n4 = w.len() / 4 * 4;
    let (seg4, seg1) = seg.split_at_mut((n4 * 4).min(seg.len()));
    for (p, w) in seg4.chunks_exact_mut(16).zip(w.chunks_exact(4)) {
        if let (Ok(p), Ok(w)) = (<&mut [u8; 16]>::try_from(p), <&[f32; 4]>::try_from(w)) {
            add4(p, w, ky, colour, luts);
        }
    }
    for (p, w) in seg1.chunks_exact_mut(4).zip(w[n4..].iter()) {
        add_px(p, &luts.s2l, &luts.l2s, colour, kept(ky * w));
    }
}

/// Adds `colour · kept(ky · w[i])` to the four RGBA8 pixels of `p`.
#[cfg(target_arch = "x86_64")]
#[inline(always)]
pub(crate) fn add4(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts) {
    use core::arch::x86_64::*;
    let (s2l, l2s) = (&luts.s2l, &luts.l2s);
    // SAFETY: SSE2 is part of the x86-64 baseline; the loads and stores
    // below read `w` (4 f32) and write `idx` (4 u32), both in bounds.
    unsafe {
        let k = _mm_mul_ps(_mm_set1_ps(ky), _mm_loadu_ps(w.as_ptr()));
        let k = _mm_and_ps(k, _mm_cmpge_ps(k, _mm_set1_ps(MIN_LIGHT)));
        for ch in 0..3 {
            let v = _mm_setr_ps(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]);
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

#[cfg(target_arch = "wasm32")]
#[target_feature(enable = "simd128")]
#[inline]
pub(crate) fn add4(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts) {
    use core::arch::wasm32::*;
    let (s2l, l2s) = (&luts.s2l, &luts.l2s);
    let k = f32x4_mul(f32x4_splat(ky), f32x4(w[0], w[1], w[2], w[3]));
    let k = v128_and(k, f32x4_ge(k, f32x4_splat(MIN_LIGHT)));
    for ch in 0..3 {
        let v = f32x4(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]);
        let lin = f32x4_add(v, f32x4_mul(f32x4_splat(colour[ch]), k));
        let lin = f32x4_pmin(f32x4_pmax(lin, f32x4_splat(0.0)), f32x4_splat(1.0));
        let q = f32x4_add(f32x4_mul(lin, f32x4_splat(4095.0)), f32x4_splat(8_388_608.0));
        let idx = v128_and(q, u32x4_splat(4095));
        p[ch] = l2s[u32x4_extract_lane::<0>(idx) as usize & 4095];
        p[4 + ch] = l2s[u32x4_extract_lane::<1>(idx) as usize & 4095];
        p[8 + ch] = l2s[u32x4_extract_lane::<2>(idx) as usize & 4095];
        p[12 + ch] = l2s[u32x4_extract_lane::<3>(idx) as usize & 4095];
    }
}

#[cfg(not(any(target_arch = "x86_64", target_arch = "wasm32")))]
#[inline(always)]
pub(crate) fn add4(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts) {
    for (p, w) in p.chunks_exact_mut(4).zip(w.iter()) {
        add_px(p, &luts.s2l, &luts.l2s, colour, kept(ky * w));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The four-lane path writes the bytes of the one-pixel path, over every
    /// byte value, weights either side of the threshold and light that clips.
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
                    for base in (0..256).step_by(5) {
                        let mut a: Vec<u8> = (0..20).map(|i| ((base + 37 * i) % 256) as u8).collect();
                        let mut b = a.clone();
                        add_row(&mut a, &w, ky, c, luts);
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
