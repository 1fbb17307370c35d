//! Frame cost against the floor of filling and copying the same buffer.
//!
//! The bench field is a synthetic stand-in for a rich Milky Way field, made
//! deterministically (no files in the library): 6000 stars uniformly over a
//! 1° radius field, magnitudes 4–13.5 with counts rising as 10^(0.35 m)
//! (the slope of star counts near the galactic plane, from memory), B−V
//! spread over −0.2..1.8, a circular field edge, compass, zenith and drift.

use super::{draw, raster, Frame, ViewParams};
use crate::orient::SkyToScreen;
use crate::scene::{FieldShape, Scene, SceneStar};
use crate::sky::Equatorial;
use glam::{DMat2, DVec2};

pub const BENCH_SIDE_PX: u32 = 1024;
pub const BENCH_STARS: usize = 6000;

/// The bench scene (see module doc).
pub fn rich_field_scene() -> Scene {
    let r = 1f64.to_radians();
    let (s, c) = libm::sincos(0.6);
    let orient = SkyToScreen { m: DMat2::from_cols(DVec2::new(c, s), DVec2::new(-s, c)) * SkyToScreen::chart().m };
    let mut scene = Scene::new(Equatorial { ra_rad: 5.2, dec_rad: 0.7 }, FieldShape::Circle { radius_rad: r }, orient, 13.5);
    let mut state: u64 = 0x2545_F491_4F6C_DD1D;
    let mut next = || {
        // xorshift64*: a fixed, portable sequence.
        state ^= state >> 12;
        state ^= state << 25;
        state ^= state >> 27;
        (state.wrapping_mul(0x2545_F491_4F6C_DD1D) >> 11) as f64 / (1u64 << 53) as f64
    };
    while scene.stars.len() < BENCH_STARS {
        let (x, y) = (next() * 2.0 - 1.0, next() * 2.0 - 1.0);
        if x * x + y * y > 1.0 {
            continue;
        }
        let m = (13.5 + libm::log10(next().max(1e-12)) / 0.35).max(4.0);
        let bv = -0.2 + 2.0 * next();
        scene.stars.push(SceneStar { offset: DVec2::new(x * r, y * r), vmag: m as f32, bv: bv as f32 });
    }
    scene.markers.zenith_dir = Some(DVec2::new(0.6, 0.8));
    scene.set_sidereal_drift();
    scene
}

fn median(v: &mut [f64]) -> f64 {
    v.sort_by(|a, b| a.total_cmp(b));
    if v.is_empty() { 0.0 } else { v[v.len() / 2] }
}

/// Bench results, ns. Minima are shown beside medians because on a shared,
/// loaded machine preemption inflates the longer frame more than the floor.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BenchFigures {
    pub median_frame_ns: f64,
    pub median_floor_ns: f64,
    pub min_frame_ns: f64,
    pub min_floor_ns: f64,
}

/// Medians (ns) of drawing the bench frame and of the floor (fill the
/// 1024² buffer with the sky colour, then copy it out, as a blit would),
/// timed with `now_ns` (performance.now()×1e6 in wasm, a monotonic clock natively).
pub fn frame_vs_floor_with_clock(iterations: usize, now_ns: &mut dyn FnMut() -> f64) -> (f64, f64) {
    let f = figures_with_clock(iterations, now_ns);
    (f.median_frame_ns, f.median_floor_ns)
}

/// Medians and minima of the bench (see [`frame_vs_floor_with_clock`]).
pub fn figures_with_clock(iterations: usize, now_ns: &mut dyn FnMut() -> f64) -> BenchFigures {
    let scene = rich_field_scene();
    let view = ViewParams { width_px: BENCH_SIDE_PX, height_px: BENCH_SIDE_PX, ..ViewParams::default() };
    let mut frame = Frame::new(BENCH_SIDE_PX, BENCH_SIDE_PX);
    let mut copy = vec![0u8; frame.rgba.len()];
    let n = iterations.max(1);
    let (mut tf, mut tc) = (Vec::with_capacity(n), Vec::with_capacity(n));
    let _ = draw(&scene, &view, &mut frame); // warm the tables
    let mut sink = 0u64;
    for i in 0..n {
        let t0 = now_ns();
        let _ = draw(&scene, &view, &mut frame);
        let t1 = now_ns();
        raster::fill_rgba(&mut frame.rgba, [3, 4, (i & 7) as u8, 255]);
        copy.copy_from_slice(&frame.rgba);
        let t2 = now_ns();
        sink = sink.wrapping_add(copy[(i * 4099) % copy.len()] as u64);
        tf.push(t1 - t0);
        tc.push(t2 - t1);
    }
    core::hint::black_box(sink);
    let min = |v: &[f64]| v.iter().copied().fold(f64::INFINITY, f64::min);
    let (min_frame_ns, min_floor_ns) = (min(&tf), min(&tc));
    BenchFigures { median_frame_ns: median(&mut tf), median_floor_ns: median(&mut tc), min_frame_ns, min_floor_ns }
}

/// Native form of [`frame_vs_floor_with_clock`] with a monotonic clock.
#[cfg(not(target_arch = "wasm32"))]
pub fn frame_vs_floor(iterations: usize) -> (f64, f64) {
    let start = std::time::Instant::now();
    frame_vs_floor_with_clock(iterations, &mut || start.elapsed().as_nanos() as f64)
}

/// Native form of [`figures_with_clock`].
#[cfg(not(target_arch = "wasm32"))]
pub fn figures(iterations: usize) -> BenchFigures {
    let start = std::time::Instant::now();
    figures_with_clock(iterations, &mut || start.elapsed().as_nanos() as f64)
}
