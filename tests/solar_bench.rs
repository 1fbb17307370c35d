//! Bench (run with `cargo test --release --test solar_bench -- --ignored --nocapture`):
//! positions of all bodies for one instant and for a night in 5-minute steps.
//! Prints medians; no timed assertions. The wasm side calls the same
//! `solar::all_bodies` / `solar::night_track`.

#[path = "solar_common.rs"]
mod common;
use common::*;
use nightfield::sky::Site;
use nightfield::solar::{all_bodies, night_track};
use nightfield::time::Instant;
use std::time::Instant as Clock;

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(|a, b| a.total_cmp(b));
    v[v.len() / 2]
}

#[test]
#[ignore]
fn bench_positions_of_all_bodies() {
    let e = eph();
    let site = Site { lat_rad: 51.2f64.to_radians(), lon_rad: 7.5f64.to_radians(), elev_m: 250.0 };
    let t = Instant::from_utc_jd(2_460_400.4).unwrap();
    let mut one = Vec::new();
    let mut sink = 0.0;
    for _ in 0..200 {
        let c = Clock::now();
        let s = all_bodies(&e, &t, &site).unwrap();
        one.push(c.elapsed().as_secs_f64());
        sink += s[1].topocentric.ra_rad;
    }
    let mut night = Vec::new();
    for _ in 0..15 {
        let c = Clock::now();
        let s = night_track(&e, &t, &site, 5.0, 12.0).unwrap();
        night.push(c.elapsed().as_secs_f64());
        sink += s.len() as f64;
    }
    let (a, b) = (median(one), median(night));
    println!("solar bench (native): all 9 bodies, one instant: {:.1} µs; night of 12 h in 5-min steps (145 instants): {:.2} ms; ratio night/instant {:.0} (sink {sink:.1})", a * 1e6, b * 1e3, b / a);
}
