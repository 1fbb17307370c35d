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
    pub rgba: [u8; 4],
    pub word4: u128,
    pub lin: [f32; 3],
}

impl Background {
    pub fn new(rgba: [u8; 4], luts: &Luts) -> Background {
        let w = u32::from_ne_bytes(rgba) as u128;
        Background { rgba, word4: w | w << 32 | w << 64 | w << 96, lin: [luts.s2l[rgba[0] as usize], luts.s2l[rgba[1] as usize], luts.s2l[rgba[2] as usize]] }
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
///
/// `LANES` (3 or 4): how many of the four pixels to write; the caller
/// passes 3 when the fourth weight is zero (its bytes would stay as they are).
#[cfg(target_arch = "x86_64")]
#[inline(always)]
pub(crate) fn add4_fn<const LANES: usize>(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts, bg: &Background) {
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
            for (j, i) in idx.iter().enumerate().take(LANES) {
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
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr) => {
        $crate::render::lanes::add4!($p, $w, $ky, $colour, $luts, $bg; 4)
    };
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr; $lanes:literal) => {{
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
            if $lanes > 3 {
                p[12 + ch] = l2s[u32x4_extract_lane::<3>(idx) as usize & 4095];
            }
        }
    }};
}

/// Elsewhere [`add4!`] calls [`add4_fn`], which inlines.
#[cfg(not(target_arch = "wasm32"))]
macro_rules! add4 {
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr) => {
        $crate::render::lanes::add4_fn::<4>($p, $w, $ky, $colour, $luts, $bg)
    };
    ($p:expr, $w:expr, $ky:expr, $colour:expr, $luts:expr, $bg:expr; $lanes:literal) => {
        $crate::render::lanes::add4_fn::<$lanes>($p, $w, $ky, $colour, $luts, $bg)
    };
}
pub(crate) use add4;

#[cfg(not(any(target_arch = "x86_64", target_arch = "wasm32")))]
#[inline(always)]
pub(crate) fn add4_fn<const LANES: usize>(p: &mut [u8; 16], w: &[f32; 4], ky: f32, colour: [f32; 3], luts: &Luts, _bg: &Background) {
    for (p, w) in p.chunks_exact_mut(4).zip(w.iter()).take(LANES) {
        super::raster::add_px(p, &luts.s2l, &luts.l2s, colour, kept(ky * w));
    }
}

/// The field edge over four pixels of one row: the dark outside the edge,
/// then the rim, each blended in linear light with its coverage and
/// quantised to bytes in between, exactly as [`rim1`] does one pixel (same
/// operations per lane; the square root is IEEE's). Work that cannot change
/// a byte is left out, group by group:
/// - both coverages 0 in every lane: nothing changes (every byte round-trips
///   through the tables), the group is left as it is;
/// - the dark's coverage 0 in every lane: its blend gives each pixel's own
///   bytes back, so the rim is blended onto the decoded pixel directly;
/// - the dark's coverage 1 in every lane, where that is known to give the
///   outside colour's bytes from any byte (`fill`): the rim is blended onto
///   that colour's light, without reading the pixels;
/// - otherwise the dark's quantised light goes to the light of its byte in
///   one lookup (`Luts::q2l`), as the byte itself is not stored.
///
/// Four pixels still holding the frame's background decode to its light
/// without table reads; and when a pixel holds the background (nearly every
/// pixel of the edge: stars seldom sit on it), its shading is read from
/// [`RimPlain`], by its distance from the edge to 1/1024 px.
#[derive(Clone, Debug)]
pub(crate) struct RimShade {
    /// Edge centre x and radius, px.
    pub cx: f32,
    pub r: f32,
    /// Half the rim's width plus half a pixel.
    pub hw5: f32,
    pub out: [f32; 3],
    pub rim: [f32; 3],
    /// The outside colour's bytes decoded: the light of any pixel after a
    /// full blend to `out`, when `fill`.
    pub out_lin: [f32; 3],
    /// Whether a full blend to `out` gives the outside colour's bytes from
    /// every byte ([`full_blend_is_fill`]).
    pub fill: bool,
    /// The shading of a pixel holding the background `bg`.
    pub plain: RimPlain,
}

impl RimShade {
    /// `fill`: [`full_blend_is_fill`] of `out` (the caller may have it at
    /// hand); `bg`: the frame's background, whose pixels are shaded from a
    /// table (made once for these colours and width, then kept).
    #[allow(clippy::too_many_arguments)]
    pub fn new(cx: f32, r: f32, hw5: f32, out: [f32; 3], rim: [f32; 3], fill: bool, bg: [u8; 4], luts: &Luts) -> RimShade {
        let out_lin = [0, 1, 2].map(|k| luts.s2l[super::raster::enc(&luts.l2s, out[k]) as usize]);
        let plain = RimPlain::for_colours(bg, hw5, out, rim, luts);
        RimShade { cx, r, hw5, out, rim, out_lin, fill, plain }
    }
}

/// Steps of [`RimPlain`]'s table: 1/1024 px of distance from the edge. The
/// coverages are linear in the distance, so rounding moves each by at most
/// 1/2048: within one display level even where the rim fades into the dark,
/// where sRGB is steepest (tested; 1/256 px gave up to 3 levels there).
pub(crate) const RIM_STEPS: f32 = 1024.0;

/// The field edge's shading of a pixel holding the frame's background, by
/// its signed distance d from the edge (out positive): the bytes of the
/// exact blends ([`rim_at`]) at d rounded to 1/[`RIM_STEPS`] px, over
/// d in [−reach, reach]; beyond that the shading no longer changes (both
/// coverages 0 inside, the dark's 1 and the rim's 0 outside), so the ends
/// serve. Alpha is the background's.
#[derive(Clone, Debug)]
pub(crate) struct RimPlain {
    /// The background the table was made for.
    pub bg: Background,
    pub reach: f32,
    /// The last index, as a float (for clamping).
    pub last: f32,
    pub px: std::rc::Rc<[u32]>,
}

/// Tables of [`RimPlain`] by (background, rim half-width, colours): a few
/// at most (day and night, a pixel ratio or two).
type RimKey = [u32; 8];
thread_local! {
    static RIM_PLAIN: std::cell::RefCell<Vec<(RimKey, std::rc::Rc<[u32]>)>> = const { std::cell::RefCell::new(Vec::new()) };
}

impl RimPlain {
    /// The table for this background, rim and colours (from the cache when made before).
    pub fn for_colours(bg: [u8; 4], hw5: f32, out: [f32; 3], rim: [f32; 3], luts: &Luts) -> RimPlain {
        let reach = (if hw5 > 0.5 { hw5 } else { 0.5 }) + 1.0 / RIM_STEPS;
        let n = (2.0 * reach * RIM_STEPS) as usize + 2;
        let key: RimKey = [u32::from_ne_bytes(bg), hw5.to_bits(), out[0].to_bits(), out[1].to_bits(), out[2].to_bits(), rim[0].to_bits(), rim[1].to_bits(), rim[2].to_bits()];
        let build = || -> std::rc::Rc<[u32]> {
            (0..n)
                .map(|i| {
                    let d = i as f32 / RIM_STEPS - reach;
                    let mut p = bg;
                    rim_at(&mut p, d, hw5, out, rim, luts);
                    u32::from_ne_bytes(p)
                })
                .collect()
        };
        let px = RIM_PLAIN.with(|c| match c.try_borrow_mut() {
            Ok(mut list) => {
                if let Some((_, t)) = list.iter().find(|(k, _)| *k == key) {
                    return t.clone();
                }
                let t = build();
                if list.len() >= 4 {
                    list.remove(0);
                }
                list.push((key, t.clone()));
                t
            }
            Err(_) => build(),
        });
        RimPlain { bg: Background::new(bg, luts), reach, last: (px.len().max(1) - 1) as f32, px }
    }

    /// The table index for distance `d` (the lanes of [`rim4!`] compute the same).
    #[inline(always)]
    pub fn index(&self, d: f32) -> usize {
        let t = (d + self.reach) * RIM_STEPS + 0.5;
        let t = if t > 0.0 { t } else { 0.0 };
        let t = if t < self.last { t } else { self.last };
        t as i32 as usize
    }
}

/// The dark outside the edge, then the rim, blended onto one pixel at
/// signed distance `d` from the edge (each in linear light with its
/// coverage, quantised to bytes in between).
#[inline(always)]
pub(crate) fn rim_at(p: &mut [u8], d: f32, hw5: f32, out: [f32; 3], rim: [f32; 3], luts: &Luts) {
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, out, (d + 0.5).clamp(0.0, 1.0));
    super::raster::blend_px(p, &luts.s2l, &luts.l2s, rim, (hw5 - d.abs()).clamp(0.0, 1.0));
}

/// Whether blending any pixel fully (coverage 1) to the linear colour `c`
/// gives exactly `c`'s bytes, channel by channel (checked over every byte).
pub(crate) fn full_blend_is_fill(c: [f32; 3], luts: &Luts) -> bool {
    use super::raster::enc;
    (0..3).all(|k| {
        let want = enc(&luts.l2s, c[k]);
        luts.s2l.iter().all(|&v| enc(&luts.l2s, v + (c[k] - v) * 1.0) == want)
    })
}

/// Shades pixels x..x+4 of a row whose centre lies `dy` below the edge
/// centre (`p` holds their 16 bytes); `bg` is the frame's background.
#[cfg(target_arch = "x86_64")]
#[inline(always)]
pub(crate) fn rim4_fn(p: &mut [u8; 16], x: usize, dy: f32, g: &RimShade, luts: &Luts, bg: &Background) {
    use core::arch::x86_64::*;
    // Columns go to floats as 32-bit integers, four by one instruction (the
    // same value, so the same float, as `x as f32`); wider frames, which no
    // buffer holds in practice, go one pixel at a time.
    if x > (i32::MAX - 3) as usize {
        for (j, p) in p.chunks_exact_mut(4).enumerate() {
            rim1(p, x + j, dy, g, luts);
        }
        return;
    }
    let (s2l, l2s, q2l) = (&luts.s2l, &luts.l2s, &luts.q2l);
    // SAFETY: SSE2 is part of the x86-64 baseline; `idx` is 4 u32 in bounds.
    unsafe {
        let xf = _mm_cvtepi32_ps(_mm_add_epi32(_mm_set1_epi32(x as i32), _mm_setr_epi32(0, 1, 2, 3)));
        let dx = _mm_sub_ps(_mm_add_ps(xf, _mm_set1_ps(0.5)), _mm_set1_ps(g.cx));
        let d = _mm_sub_ps(_mm_sqrt_ps(_mm_add_ps(_mm_mul_ps(dx, dx), _mm_set1_ps(dy * dy))), _mm_set1_ps(g.r));
        let (zero, one) = (_mm_setzero_ps(), _mm_set1_ps(1.0));
        // Four background pixels: each from the table (as `rim1` does one).
        let word = u128::from_ne_bytes(*p);
        if word == g.plain.bg.word4 {
            let t = _mm_add_ps(_mm_mul_ps(_mm_add_ps(d, _mm_set1_ps(g.plain.reach)), _mm_set1_ps(RIM_STEPS)), _mm_set1_ps(0.5));
            let t = _mm_min_ps(_mm_max_ps(t, zero), _mm_set1_ps(g.plain.last));
            let mut idx = [0u32; 4];
            _mm_storeu_si128(idx.as_mut_ptr() as *mut __m128i, _mm_cvttps_epi32(t));
            let tab: &[u32] = &g.plain.px;
            if let Some(top) = tab.len().checked_sub(1) {
                // Indices are clamped to the table already; `min` only spares the checks.
                let at = |k: u32| tab[(k as usize).min(top)] as i32;
                let v = _mm_setr_epi32(at(idx[0]), at(idx[1]), at(idx[2]), at(idx[3]));
                _mm_storeu_si128(p.as_mut_ptr() as *mut __m128i, v);
            }
            return;
        }
        // Some pixels the background, some not: one by one.
        if (0..4).any(|j| (word >> (32 * j)) as u32 == u32::from_ne_bytes(g.plain.bg.rgba)) {
            for (j, q) in p.chunks_exact_mut(4).enumerate() {
                rim1(q, x + j, dy, g, luts);
            }
            return;
        }
        let a1 = _mm_min_ps(_mm_max_ps(_mm_add_ps(d, _mm_set1_ps(0.5)), zero), one);
        let ad = _mm_andnot_ps(_mm_set1_ps(-0.0), d);
        let a2 = _mm_min_ps(_mm_max_ps(_mm_sub_ps(_mm_set1_ps(g.hw5), ad), zero), one);
        let no_dark = _mm_movemask_ps(_mm_cmpeq_ps(a1, zero)) == 15;
        if no_dark && _mm_movemask_ps(_mm_cmpeq_ps(a2, zero)) == 15 {
            return;
        }
        // The quantised index of light v + (c − v)·a, four lanes (through
        // memory: fewer instructions than taking the lanes out one by one).
        let idx = |v: __m128, c: f32, a: __m128| -> [u32; 4] {
            let lin = _mm_add_ps(v, _mm_mul_ps(_mm_sub_ps(_mm_set1_ps(c), v), a));
            let lin = _mm_min_ps(_mm_max_ps(lin, zero), one);
            let q = _mm_add_ps(_mm_mul_ps(lin, _mm_set1_ps(4095.0)), _mm_set1_ps(8_388_608.0));
            let mut idx = [0u32; 4];
            _mm_storeu_si128(idx.as_mut_ptr() as *mut __m128i, _mm_castps_si128(q));
            idx
        };
        // Each channel's light after the dark's blend and its quantisation.
        let v1: [__m128; 3] = if g.fill && _mm_movemask_ps(_mm_cmpeq_ps(a1, one)) == 15 {
            g.out_lin.map(|c| _mm_set1_ps(c))
        } else {
            let v = if u128::from_ne_bytes(*p) == bg.word4 {
                bg.lin.map(|c| _mm_set1_ps(c))
            } else {
                [0, 1, 2].map(|ch| _mm_setr_ps(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]))
            };
            if no_dark {
                v
            } else {
                [0, 1, 2].map(|ch| {
                    let i = idx(v[ch], g.out[ch], a1).map(|i| (i & 4095) as usize);
                    _mm_setr_ps(q2l[i[0]], q2l[i[1]], q2l[i[2]], q2l[i[3]])
                })
            }
        };
        // Bytes stored one by one: a store each, where putting them together
        // for one wide store takes a shift and an or each as well.
        for (ch, v1) in v1.iter().enumerate() {
            for (j, i) in idx(*v1, g.rim[ch], a2).iter().enumerate() {
                p[4 * j + ch] = l2s[(i & 4095) as usize];
            }
        }
    }
}

/// wasm: expanded in place by [`rim4!`] inside the (simd128) field mask,
/// as [`rim4_fn`] (lanes are taken out one by one here: one instruction
/// each in wasm).
#[cfg(target_arch = "wasm32")]
macro_rules! rim4 {
    ($p:expr, $x:expr, $dy:expr, $g:expr, $luts:expr, $bg:expr) => {{
        use core::arch::wasm32::*;
        let p: &mut [u8; 16] = $p;
        let (x, dy): (usize, f32) = ($x, $dy);
        let g: &$crate::render::lanes::RimShade = $g;
        let luts: &$crate::render::raster::Luts = $luts;
        let bg: &$crate::render::lanes::Background = $bg;
        let (s2l, l2s, q2l) = (&luts.s2l, &luts.l2s, &luts.q2l);
        if x > (i32::MAX - 3) as usize {
            for (j, p) in p.chunks_exact_mut(4).enumerate() {
                $crate::render::lanes::rim1(p, x + j, dy, g, luts);
            }
        } else {
            let xf = f32x4_convert_i32x4(i32x4_add(i32x4_splat(x as i32), i32x4(0, 1, 2, 3)));
            let dx = f32x4_sub(f32x4_add(xf, f32x4_splat(0.5)), f32x4_splat(g.cx));
            let d = f32x4_sub(f32x4_sqrt(f32x4_add(f32x4_mul(dx, dx), f32x4_splat(dy * dy))), f32x4_splat(g.r));
            let (zero, one) = (f32x4_splat(0.0), f32x4_splat(1.0));
            let word = u128::from_ne_bytes(*p);
            let bgw = u32::from_ne_bytes(g.plain.bg.rgba);
            if word == g.plain.bg.word4 {
                // Four background pixels: each from the table (as `rim1` does one).
                let t = f32x4_add(f32x4_mul(f32x4_add(d, f32x4_splat(g.plain.reach)), f32x4_splat($crate::render::lanes::RIM_STEPS)), f32x4_splat(0.5));
                let t = f32x4_pmin(f32x4_splat(g.plain.last), f32x4_pmax(zero, t));
                let i = i32x4_trunc_sat_f32x4(t);
                let tab: &[u32] = &g.plain.px;
                if let Some(top) = tab.len().checked_sub(1) {
                    // Indices are clamped to the table already; `min` only spares the checks.
                    let at = |k: u32| tab[(k as usize).min(top)];
                    let v = u32x4(at(u32x4_extract_lane::<0>(i)), at(u32x4_extract_lane::<1>(i)), at(u32x4_extract_lane::<2>(i)), at(u32x4_extract_lane::<3>(i)));
                    // SAFETY: `p` is 16 writable bytes; v128 stores need no alignment.
                    unsafe { v128_store(p.as_mut_ptr() as *mut v128, v) };
                }
            } else if (word as u32) == bgw || ((word >> 32) as u32) == bgw || ((word >> 64) as u32) == bgw || ((word >> 96) as u32) == bgw {
                // Some pixels the background, some not: one by one.
                for (j, q) in p.chunks_exact_mut(4).enumerate() {
                    $crate::render::lanes::rim1(q, x + j, dy, g, luts);
                }
            } else {
            let a1 = f32x4_pmin(f32x4_pmax(f32x4_add(d, f32x4_splat(0.5)), zero), one);
            let a2 = f32x4_pmin(f32x4_pmax(f32x4_sub(f32x4_splat(g.hw5), f32x4_abs(d)), zero), one);
            let no_dark = i32x4_all_true(f32x4_eq(a1, zero));
            // Both coverages 0 everywhere: the group stays as it is.
            if !(no_dark && i32x4_all_true(f32x4_eq(a2, zero))) {
                // The quantised light v + (c − v)·a, four lanes; its bits
                // hold the table index in the low 12.
                let idx = |v: v128, c: f32, a: v128| -> v128 {
                    let lin = f32x4_add(v, f32x4_mul(f32x4_sub(f32x4_splat(c), v), a));
                    let lin = f32x4_pmin(f32x4_pmax(lin, zero), one);
                    f32x4_add(f32x4_mul(lin, f32x4_splat(4095.0)), f32x4_splat(8_388_608.0))
                };
                // Arrays written out (not `array::map`), so that nothing here
                // rests on a generic function being inlined into the simd128 mask.
                let splat3 = |c: [f32; 3]| [f32x4_splat(c[0]), f32x4_splat(c[1]), f32x4_splat(c[2])];
                let decode = |ch: usize| f32x4(s2l[p[ch] as usize], s2l[p[4 + ch] as usize], s2l[p[8 + ch] as usize], s2l[p[12 + ch] as usize]);
                let dark = |v: v128, ch: usize| {
                    let i = idx(v, g.out[ch], a1);
                    f32x4(
                        q2l[u32x4_extract_lane::<0>(i) as usize & 4095],
                        q2l[u32x4_extract_lane::<1>(i) as usize & 4095],
                        q2l[u32x4_extract_lane::<2>(i) as usize & 4095],
                        q2l[u32x4_extract_lane::<3>(i) as usize & 4095],
                    )
                };
                let v1: [v128; 3] = if g.fill && i32x4_all_true(f32x4_eq(a1, one)) {
                    splat3(g.out_lin)
                } else {
                    let v = if u128::from_ne_bytes(*p) == bg.word4 { splat3(bg.lin) } else { [decode(0), decode(1), decode(2)] };
                    if no_dark {
                        v
                    } else {
                        [dark(v[0], 0), dark(v[1], 1), dark(v[2], 2)]
                    }
                };
                for (ch, v1) in v1.iter().enumerate() {
                    let i = idx(*v1, g.rim[ch], a2);
                    p[ch] = l2s[u32x4_extract_lane::<0>(i) as usize & 4095];
                    p[4 + ch] = l2s[u32x4_extract_lane::<1>(i) as usize & 4095];
                    p[8 + ch] = l2s[u32x4_extract_lane::<2>(i) as usize & 4095];
                    p[12 + ch] = l2s[u32x4_extract_lane::<3>(i) as usize & 4095];
                }
            }
            }
        }
    }};
}

/// Elsewhere [`rim4!`] calls [`rim4_fn`].
#[cfg(not(target_arch = "wasm32"))]
macro_rules! rim4 {
    ($p:expr, $x:expr, $dy:expr, $g:expr, $luts:expr, $bg:expr) => {
        $crate::render::lanes::rim4_fn($p, $x, $dy, $g, $luts, $bg)
    };
}
pub(crate) use rim4;

/// One pixel at a time (targets without SSE2 or simd128).
#[cfg(not(any(target_arch = "x86_64", target_arch = "wasm32")))]
#[inline(always)]
pub(crate) fn rim4_fn(p: &mut [u8; 16], x: usize, dy: f32, g: &RimShade, luts: &Luts, _bg: &Background) {
    for (j, p) in p.chunks_exact_mut(4).enumerate() {
        rim1(p, x + j, dy, g, luts);
    }
}

/// One pixel of [`rim4!`].
#[inline(always)]
pub(crate) fn rim1(p: &mut [u8], x: usize, dy: f32, g: &RimShade, luts: &Luts) {
    let dx = x as f32 + 0.5 - g.cx;
    let d = super::raster::sqrt(dx * dx + dy * dy) - g.r;
    if p.len() == 4 && p[..4] == g.plain.bg.rgba {
        if let Some(v) = g.plain.px.get(g.plain.index(d)) {
            p.copy_from_slice(&v.to_ne_bytes());
            return;
        }
    }
    rim_at(p, d, g.hw5, g.out, g.rim, luts);
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
                        // Three lanes written, the fourth's weight zero: the same bytes.
                        let w3 = [w[0], w[1], w[2], 0.0];
                        let (mut a3, mut b3) = (a.clone(), a.clone());
                        if let Ok(g) = <&mut [u8; 16]>::try_from(&mut a3[..16]) {
                            add4!(g, &w3, ky, c, luts, &bg; 3);
                        }
                        for (p, w) in b3.chunks_exact_mut(4).zip(w3.iter()) {
                            add_px(p, &luts.s2l, &luts.l2s, c, kept(ky * w));
                        }
                        assert_eq!(a3, b3, "three lanes: colour {c:?} ky {ky} w {w3:?}");
                        n += 1;
                    }
                }
            }
        }
        assert!(n > 1000);
    }

    /// A background pixel's shading from the table is the exact blends'
    /// within one display level, from well inside the edge to well outside,
    /// for day and night colours and rim widths at pixel ratios 1 to 3; and
    /// the table is made once and found again.
    #[test]
    fn rim_table_matches_the_exact_shading() {
        let luts = super::super::raster::luts();
        let mut worst = 0u8;
        let mut n = 0;
        for (out, rim, sky) in [([0.0f32, 0.0, 0.0], [0.30f32, 0.33, 0.40], [9u8, 10, 14, 255]), ([0.0, 0.0, 0.0], [0.31, 0.0, 0.0], [7, 0, 0, 255]), ([0.02, 0.01, 0.0], [0.9, 0.6, 0.3], [40, 45, 60, 255])] {
            for hw5 in [1.25f32, 2.0, 2.75] {
                let t = RimPlain::for_colours(sky, hw5, out, rim, luts);
                let again = RimPlain::for_colours(sky, hw5, out, rim, luts);
                assert!(std::rc::Rc::ptr_eq(&t.px, &again.px));
                for k in -4000..4000 {
                    let d = k as f32 / 997.0;
                    let mut exact = sky;
                    rim_at(&mut exact, d, hw5, out, rim, luts);
                    let got = t.px[t.index(d)].to_ne_bytes();
                    worst = worst.max((0..4).map(|c| exact[c].abs_diff(got[c])).max().unwrap_or(0));
                    n += 1;
                }
            }
        }
        assert!(n > 50_000);
        assert!(worst <= 1, "table differs from the exact shading by {worst} levels");
    }

    /// The four-lane field edge writes the bytes of the one-pixel path over
    /// distances from well inside to well outside the edge, several rim
    /// widths, outside colours for which a full blend is a fill and one for
    /// which it is not, on groups holding the background, groups with one
    /// pixel off it, and groups of varied bytes (alpha included, which is
    /// kept). Every shortcut of the group path is taken many times.
    #[test]
    fn rim_four_lanes_match_one_pixel() {
        let luts = super::super::raster::luts();
        let pals = [super::super::Palette { night: false }, super::super::Palette { night: true }];
        // (outside, rim): the frame's own, then a made-up outside colour.
        let mut colours: Vec<([f32; 3], [f32; 3])> = pals.iter().map(|p| (p.map(super::super::background::OUTSIDE), p.map([0.30, 0.33, 0.40]))).collect();
        colours.push(([0.3, 0.55, 0.07], [0.9, 0.2, 0.6]));
        // And one for which a full blend is not a fill: a light just by a
        // quantisation half-step, where v + (c − v) may round across it.
        let mut off_step = (1..4095).flat_map(|k| [-1i32, 0, 1].map(|u| f32::from_bits(((k as f32 + 0.5) / 4095.0).to_bits().wrapping_add_signed(u))));
        if let Some(c) = off_step.find(|&c| !full_blend_is_fill([c, 0.2, 0.01], luts)) {
            colours.push(([c, 0.2, 0.01], [0.3, 0.33, 0.4]));
        }
        let mut seed = 0x9E37_79B9_7F4A_7C15u64;
        let mut byte = || {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 24) as u8
        };
        // Groups by what the lanes' coverages are: [no-op, no dark, all dark, mixed].
        let mut kinds = [0usize; 4];
        let (mut fills, mut not_fills, mut n) = (0, 0, 0);
        for &(out, rim) in &colours {
            let can_fill = full_blend_is_fill(out, luts);
            if can_fill { fills += 1 } else { not_fills += 1 }
            for fill in [can_fill, false] {
                for (cx, r, hw5) in [(37.3f32, 20.0f32, 1.25f32), (40.0, 33.77, 2.0), (36.6, 5.1, 0.875), (38.1, 0.4, 1.25)] {
                    let sky = [byte() % 40, byte() % 40, byte() % 60, 255];
                    let bg = Background::new(sky, luts);
                    let g = RimShade::new(cx, r, hw5, out, rim, fill, sky, luts);
                    let mut dy = -(r + 3.0) + 0.173;
                    while dy < r + 3.0 {
                        for x in 0..80 {
                            for case in 0..3 {
                                let mut a = [0u8; 16];
                                for (j, p) in a.chunks_exact_mut(4).enumerate() {
                                    let keep = case == 0 || (case == 1 && j != 2);
                                    let px = if keep { sky } else { [byte(), byte(), byte(), byte()] };
                                    p.copy_from_slice(&px);
                                }
                                let mut b = a;
                                rim4!(&mut a, x, dy, &g, luts, &bg);
                                for (j, p) in b.chunks_exact_mut(4).enumerate() {
                                    rim1(p, x + j, dy, &g, luts);
                                }
                                assert_eq!(a, b, "x {x} dy {dy} case {case} out {out:?} fill {fill} r {r} hw5 {hw5}");
                                n += 1;
                            }
                            // What the group path did, from the coverages.
                            let cov = |j: usize| {
                                let dx = (x + j) as f32 + 0.5 - cx;
                                let d = super::super::raster::sqrt(dx * dx + dy * dy) - r;
                                ((d + 0.5).clamp(0.0, 1.0), (hw5 - d.abs()).clamp(0.0, 1.0))
                            };
                            let c: Vec<(f32, f32)> = (0..4).map(cov).collect();
                            let k = if c.iter().all(|&(a1, a2)| a1 == 0.0 && a2 == 0.0) {
                                0
                            } else if c.iter().all(|&(a1, _)| a1 == 0.0) {
                                1
                            } else if fill && c.iter().all(|&(a1, _)| a1 == 1.0) {
                                2
                            } else {
                                3
                            };
                            kinds[k] += 1;
                        }
                        dy += 0.5;
                    }
                }
            }
        }
        assert!(fills >= 2 && not_fills >= 1, "fills {fills} not {not_fills}");
        assert!(kinds.iter().all(|&k| k > 500), "{kinds:?}");
        assert!(n > 100_000, "{n}");
    }
}
