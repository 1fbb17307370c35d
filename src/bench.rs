//! Benchmark workloads shared by the native bench binary and the wasm export, so
//! one run can print native/wasm ratios of the same code built by the same compiler.
//! The clock is injected (monotonic natively, `performance.now()` in wasm); the
//! figures are medians of many runs. Nothing here is a timed test.

use crate::engine::Engine;
use crate::sky::catalog::{decode_stars, Catalogs};
use crate::sky::index::SkyIndex;
use crate::sky::Equatorial;
use serde::Serialize;

/// Medians in nanoseconds, plus the sizes that make them comparable.
#[derive(Clone, Debug, Default, Serialize)]
pub struct BenchReport {
    pub render_frame_ns: f64,
    pub render_floor_ns: f64,
    pub cone_index_ns: f64,
    pub cone_scan_ns: f64,
    /// Stars found over all 64 bench fields (not one field).
    pub cone_stars_found: usize,
    pub bodies_instant_ns: f64,
    pub bodies_night_ns: f64,
    pub plan_300x6_ns: f64,
    pub route_search_ns: f64,
    pub decode_deep_ns: f64,
    pub scenario_ns: f64,
}

fn median(v: &mut [f64]) -> f64 {
    if v.is_empty() {
        return f64::NAN;
    }
    crate::sort::sort_by(v, |a, b| a.total_cmp(b));
    v[v.len() / 2]
}

fn time_n(n: usize, now: &mut dyn FnMut() -> f64, mut f: impl FnMut()) -> f64 {
    let mut t = Vec::with_capacity(n);
    f(); // warm up
    for _ in 0..n {
        let t0 = now();
        f();
        t.push(now() - t0);
    }
    median(&mut t)
}

/// Runs every workload. `files` are the catalog files by name (as `load_catalog` takes them).
pub fn run_all(files: &[(&str, &[u8])], quick: bool, now_ns: &mut dyn FnMut() -> f64) -> BenchReport {
    let reps = if quick { 5 } else { 31 };
    let mut r = BenchReport::default();
    let (frame, floor) = crate::render::bench::frame_vs_floor_with_clock(if quick { 10 } else { 101 }, now_ns);
    r.render_frame_ns = frame;
    r.render_floor_ns = floor;

    // Cone query at the deep limit, 1° field (0.5° radius), on the deep tier.
    if let Some((_, bytes)) = files.iter().find(|(n, _)| n.starts_with("stars_gaia")) {
        r.decode_deep_ns = time_n(if quick { 1 } else { 5 }, now_ns, || {
            let _ = core::hint::black_box(decode_stars(bytes));
        });
        if let Ok(cat) = decode_stars(bytes) {
            let index = SkyIndex::build(&cat.stars);
            let centers: Vec<Equatorial> = (0..64)
                .map(|i| Equatorial { ra_rad: (i as f64 * 0.618_034 % 1.0) * std::f64::consts::TAU, dec_rad: libm::asin((i as f64 * 0.414_214 % 1.0) * 2.0 - 1.0) })
                .collect();
            let radius = 0.5f64.to_radians();
            let mut found = 0;
            r.cone_index_ns = time_n(reps, now_ns, || {
                found = 0;
                for c in &centers {
                    found += core::hint::black_box(index.cone(*c, radius, 10.0)).len();
                }
            }) / centers.len() as f64;
            r.cone_scan_ns = time_n(if quick { 2 } else { 7 }, now_ns, || {
                for c in centers.iter().take(8) {
                    core::hint::black_box(index.cone_scan(*c, radius, 10.0));
                }
            }) / 8.0;
            r.cone_stars_found = found;
        }
    }

    let mut eng = Engine::new();
    for (name, bytes) in files {
        let _ = eng.load_catalog(name, bytes);
    }
    if let Some(eph) = eng.ephemeris() {
        if let (Ok(t), Ok(site)) = (crate::time::Instant::from_civil(2026, 12, 12, 20, 0, 0.0, 0), crate::sky::horizon::site_from_deg(47.05, 8.3, 560.0)) {
            r.bodies_instant_ns = time_n(reps, now_ns, || {
                let _ = core::hint::black_box(crate::solar::topocentric::all_bodies(eph, &t, &site));
            });
            r.bodies_night_ns = time_n(if quick { 2 } else { 9 }, now_ns, || {
                let _ = core::hint::black_box(crate::solar::topocentric::night_track(eph, &t, &site, 5.0, 8.0));
            });
        }
    }
    r.plan_300x6_ns = time_n(if quick { 1 } else { 5 }, now_ns, || {
        core::hint::black_box(crate::plan::bench::bench_plan(300, 6));
    });
    let cats: &Catalogs = eng.catalogs();
    let tiers: Vec<&crate::sky::catalog::StarCatalog> = (0..3).filter_map(|t| cats.tier(t)).collect();
    let hop = crate::find::sources::hop_stars(&tiers);
    r.route_search_ns = time_n(if quick { 1 } else { 5 }, now_ns, || {
        let _ = core::hint::black_box(crate::find::bench::bench_route_search(&hop));
    });
    let demo = crate::scenario::demo_scenario();
    r.scenario_ns = time_n(if quick { 2 } else { 11 }, now_ns, || {
        let _ = core::hint::black_box(eng.set_scenario(demo.clone()));
    });
    r
}
