//! Bench (prints figures, asserts nothing about time):
//!   cargo test --release --test catalog_bench -- --ignored --nocapture
//! Decode + index time per file, and a 1° field (0.5° radius) cone query at the deep
//! limit (V ≤ 10) via the index vs a full scan, with their ratio (target ≥ 100×).

use std::time::Instant;

use nightfield::sky::catalog::{decode_stars, Catalogs};
use nightfield::sky::dso::decode_dso;
use nightfield::sky::index::SkyIndex;
use nightfield::sky::Equatorial;

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

#[test]
#[ignore]
fn bench_catalog_load_and_cone_query() {
    let files: [(&str, &[u8]); 3] = [
        ("stars_bright", include_bytes!("../catalog/stars_bright.nfs")),
        ("stars_hip", include_bytes!("../catalog/stars_hip.nfs")),
        ("stars_gaia", include_bytes!("../catalog/stars_gaia.nfs")),
    ];
    for (name, bytes) in files {
        let dec = median((0..5).map(|_| { let t = Instant::now(); let c = decode_stars(bytes).unwrap(); std::hint::black_box(&c); t.elapsed().as_secs_f64() }).collect());
        let cat = decode_stars(bytes).unwrap();
        let build = median((0..5).map(|_| { let t = Instant::now(); let i = SkyIndex::build(&cat.stars); std::hint::black_box(&i); t.elapsed().as_secs_f64() }).collect());
        println!("{name:13} {:7} stars  decode {:7.2} ms  index build {:7.2} ms", cat.stars.len(), dec * 1e3, build * 1e3);
    }
    let dso = include_bytes!("../catalog/dso_openngc.nfd");
    let t = Instant::now();
    let d = decode_dso(dso).unwrap();
    println!("dso_openngc   {:7} objects decode {:7.2} ms", d.objects.len(), t.elapsed().as_secs_f64() * 1e3);

    let mut cats = Catalogs::new();
    for (name, bytes) in files {
        cats.load(name, bytes).unwrap();
    }
    // Deterministic pseudo-random field centres, uniform on the sphere.
    let mut s = 0x2545_F491_4F6C_DD1Du64;
    let mut rnd = || { s ^= s << 13; s ^= s >> 7; s ^= s << 17; (s >> 11) as f64 / (1u64 << 53) as f64 };
    let centres: Vec<Equatorial> = (0..400)
        .map(|_| Equatorial { ra_rad: rnd() * std::f64::consts::TAU, dec_rad: (2.0 * rnd() - 1.0).asin() })
        .collect();
    let r = 0.5f64.to_radians();
    let gaia = cats.tier_index(2).unwrap();
    // Medians of 5 rounds (the machine is shared; single rounds are noisy).
    let mut found = 0usize;
    let t_index = median((0..5).map(|_| {
        found = 0;
        let t = Instant::now();
        for c in &centres {
            found += gaia.cone(*c, r, 10.0).len();
        }
        t.elapsed().as_secs_f64() / centres.len() as f64
    }).collect());
    let mut found_scan = 0usize;
    let t_scan = median((0..5).map(|_| {
        found_scan = 0;
        let t = Instant::now();
        for c in centres.iter().take(20) {
            found_scan += gaia.cone_scan(*c, r, 10.0).len();
        }
        t.elapsed().as_secs_f64() / 20.0
    }).collect());
    println!(
        "Gaia tier ({} stars), 1° field, V<=10: index {:.2} µs/query, full scan {:.0} µs/query, ratio {:.0}x (mean {:.1} stars/field; scan sample {found_scan})",
        gaia.len(), t_index * 1e6, t_scan * 1e6, t_scan / t_index, found as f64 / centres.len() as f64
    );
    let t = Instant::now();
    let mut n_all = 0usize;
    for c in &centres {
        n_all += cats.stars_in_cone(*c, r, 10.0).len();
    }
    let t_all = t.elapsed().as_secs_f64() / centres.len() as f64;
    let t = Instant::now();
    for c in centres.iter().take(40) {
        for tier in 0..3 {
            std::hint::black_box(cats.tier_index(tier).unwrap().cone_scan(*c, r, 10.0));
        }
    }
    let t_all_scan = t.elapsed().as_secs_f64() / 40.0;
    println!(
        "all three star tiers: index {:.2} µs/query, full scan {:.0} µs/query, ratio {:.0}x (mean {:.1} stars/field)",
        t_all * 1e6, t_all_scan * 1e6, t_all_scan / t_all, n_all as f64 / centres.len() as f64
    );
}
