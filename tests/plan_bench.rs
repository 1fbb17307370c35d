//! Planner bench (run with `cargo test --release --test plan_bench -- --ignored --nocapture`):
//! 300 targets × 6 stations, 5-minute steps over 5 hours; prints the native
//! time per plan and per re-plan (the lead times the same `bench_plan` in wasm).

use nightfield::plan::bench::{bench_input, bench_plan};
use nightfield::plan::schedule::prepare;
use nightfield::plan::AzSector;
use std::time::Instant;

#[test]
#[ignore]
fn bench_300_targets_6_stations() {
    let runs = 15;
    let mut times = Vec::new();
    let mut showings = 0;
    for _ in 0..runs {
        let t = Instant::now();
        showings = bench_plan(300, 6);
        times.push(t.elapsed().as_secs_f64() * 1e3);
    }
    times.sort_by(f64::total_cmp);
    let input = bench_input(300, 6);
    let prep = prepare(&input).unwrap();
    let mut re = Vec::new();
    for _ in 0..runs {
        let t = Instant::now();
        let p = prep.plan(&[AzSector { az_from_deg: 90.0, az_to_deg: 180.0 }], Some(input.start_utc_jd + 0.05));
        std::hint::black_box(&p);
        re.push(t.elapsed().as_secs_f64() * 1e3);
    }
    re.sort_by(f64::total_cmp);
    println!(
        "plan bench (300 targets x 6 stations, 61 steps): full plan median {:.2} ms (min {:.2}), re-plan median {:.2} ms; {} showings",
        times[runs / 2], times[0], re[runs / 2], showings
    );
    assert!(showings > 0);
}
