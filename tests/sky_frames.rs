//! Frames, Earth ephemeris and apparent star places against ERFA and skyfield
//! (fixture tests/fixtures/gen_sky.py → sky.json).

use glam::DVec3;
use nightfield::sky::apparent::*;
use nightfield::sky::frames::*;
use nightfield::time::Instant;
use serde_json::Value;

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/sky.json")).unwrap();
    serde_json::from_str(&text).unwrap()
}
fn f(v: &Value) -> f64 {
    v.as_f64().unwrap()
}
fn v3(v: &Value) -> DVec3 {
    DVec3::new(f(&v[0]), f(&v[1]), f(&v[2]))
}
fn places(fx: &Value) -> Vec<(u64, CatalogPlace)> {
    fx["hip_stars"].as_array().unwrap().iter().map(|s| {
        (s["hip"].as_u64().unwrap(), CatalogPlace {
            ra_rad: f(&s["ra_rad"]), dec_rad: f(&s["dec_rad"]),
            pm_ra_cosdec_mas_yr: f(&s["pm_ra_cosdec_mas_yr"]), pm_dec_mas_yr: f(&s["pm_dec_mas_yr"]),
            parallax_mas: f(&s["parallax_mas"]), rv_km_s: 0.0,
        })
    }).collect()
}
/// Angle between two directions given as RA/Dec, arcseconds.
fn sep_arcsec(ra1: f64, de1: f64, ra2: f64, de2: f64) -> f64 {
    let a = unit_vector(ra1, de1);
    let b = unit_vector(ra2, de2);
    a.cross(b).length().atan2(a.dot(b)) / ARCSEC_RAD
}

#[test]
fn npb_matches_erfa_pn06_with_2000b_and_pnm06a() {
    // Exact port: ERFA pn06 fed nut00b (+P03 adjustment) → elements within 1e-11.
    // Against ERFA pnm06a (IAU 2000A nutation): within 5e-9 (1 mas), the 2000B truncation.
    for c in fixture()["npb"].as_array().unwrap() {
        let tt = f(&c["tt_jd"]);
        let m = npb_matrix(tt).transpose().to_cols_array(); // row-major
        for (i, x) in m.iter().enumerate() {
            assert!((x - f(&c["pn06_nut00b_rows"][i])).abs() < 1e-11, "tt {tt} element {i}");
            assert!((x - f(&c["pnm06a_rows"][i])).abs() < 5e-9, "tt {tt} element {i} vs 2000A");
        }
        assert!((mean_obliquity_rad(tt) - f(&c["obl06_rad"])).abs() < 1e-12);
        let (dp, de) = nutation_2000b_rad(tt);
        assert!((dp - f(&c["nut00b_dpsi_rad"])).abs() < 1e-12 && (de - f(&c["nut00b_deps_rad"])).abs() < 1e-12);
    }
}

#[test]
fn truncated_epv00_within_stated_error() {
    // Against the full ERFA epv00 series, 1900–2100: position < 1e-5 AU, velocity < 1e-5 relative.
    let (mut wp, mut wv) = (0.0_f64, 0.0_f64);
    for c in fixture()["earth"].as_array().unwrap() {
        let e = earth_state(f(&c["tt_jd"]));
        wp = wp.max((e.helio_pos_au - v3(&c["helio_pos_au"])).length()).max((e.bary_pos_au - v3(&c["bary_pos_au"])).length());
        let vr = v3(&c["bary_vel_au_day"]);
        wv = wv.max((e.bary_vel_au_day - vr).length() / vr.length());
        assert_eq!(earth_velocity_au_day(f(&c["tt_jd"])), e.bary_vel_au_day);
    }
    println!("truncated EPV00: worst position {wp:.2e} AU, worst velocity {wv:.2e} relative");
    assert!(wp < 1e-5 && wv < 1e-5, "{wp} {wv}");
}

#[test]
fn star_apparent_place_matches_erfa_within_0_1_arcsec() {
    // ERFA: pmsafe (J1991.25 → J2000.0, rv 0) then atci13 (CIRS), then RA − eo (eo from
    // atci13) = equinox-based apparent place; same frame as ours (true equator/equinox of date).
    let fx = fixture();
    let stars = places(&fx);
    let mut worst: f64 = 0.0;
    for c in fx["apparent"].as_array().unwrap() {
        let hip = c["hip"].as_u64().unwrap();
        let p = stars.iter().find(|s| s.0 == hip).unwrap().1;
        let tt = f(&c["tt_jd"]);
        let mut t = Instant::from_utc_jd(tt - 69.0 / 86400.0).unwrap();
        t.tt_jd = tt; // only TT matters for the geocentric apparent place
        let a = star_apparent(&p, 1991.25, &t);
        let d = sep_arcsec(a.ra_rad, a.dec_rad, f(&c["ra_app_rad"]), f(&c["dec_app_rad"]));
        assert!(d < 0.1, "HIP {hip} at {tt}: {d}\"");
        worst = worst.max(d);
    }
    println!("apparent place vs ERFA: worst {worst:.4}\"");
    assert!(worst < 0.01); // 2000B vs 2000A nutation leaves ~1 mas
}

#[test]
fn star_propagated_to_2030_matches_skyfield_star() {
    // skyfield 1.55 Star (rv 0) observed from DE421 Earth: astrometric ICRS and
    // apparent RA/Dec of date; bar 0.1″.
    let fx = fixture();
    let stars = places(&fx);
    let mut worst: f64 = 0.0;
    for c in fx["star2030"].as_array().unwrap() {
        let hip = c["hip"].as_u64().unwrap();
        let p = stars.iter().find(|s| s.0 == hip).unwrap().1;
        let tt = f(&c["tt_jd"]);
        let e = earth_state(tt);
        let (ra, de) = ra_dec_of(astrometric_direction(&p, 1991.25, tt, e.bary_pos_au));
        let d1 = sep_arcsec(ra, de, f(&c["astrometric_ra_rad"]), f(&c["astrometric_dec_rad"]));
        let mut t = Instant::from_utc_jd(tt - 69.0 / 86400.0).unwrap();
        t.tt_jd = tt;
        let a = star_apparent(&p, 1991.25, &t);
        let d2 = sep_arcsec(a.ra_rad, a.dec_rad, f(&c["apparent_ra_rad"]), f(&c["apparent_dec_rad"]));
        assert!(d1 < 0.1 && d2 < 0.1, "HIP {hip}: astrometric {d1}\", apparent {d2}\"");
        worst = worst.max(d1).max(d2);
    }
    println!("2030 vs skyfield Star: worst {worst:.4}\"");
}

#[test]
fn aberration_size_and_deflection_direction() {
    // Annual aberration is at most ~20.5″ (κ = v/c, common practice).
    let tt = 2460385.35;
    let v = earth_velocity_au_day(tt);
    let p = v.normalize().cross(DVec3::Z).normalize(); // perpendicular to the velocity
    let q = aberrate(p, v, 1.0);
    let shift = p.cross(q).length().asin() / ARCSEC_RAD;
    assert!((19.8..21.0).contains(&shift), "{shift}");
    // Deflection pushes the image away from the Sun: 1.75″ at the limb (GR, common
    // practice) scales as cot(θ/2); at 90° from the Sun it is ~4 mas.
    let e = DVec3::X; // Sun→observer
    let star = DVec3::Y;
    let d = deflect_by_sun(star, star, e, 1.0, 1e-6);
    let moved = (d.normalize() - star).length() / ARCSEC_RAD;
    assert!((0.003..0.005).contains(&moved), "{moved}");
    assert!(d.normalize().x > 0.0); // away from the Sun (Sun lies in −X from the observer)
}

#[test]
fn gcrs_to_apparent_agrees_with_star_chain() {
    // A star with no motion or parallax: the reusable chain gives the same place.
    let p = CatalogPlace { ra_rad: 1.0, dec_rad: 0.3, pm_ra_cosdec_mas_yr: 0.0, pm_dec_mas_yr: 0.0, parallax_mas: 0.0, rv_km_s: 0.0 };
    let t = Instant::from_civil(2024, 3, 15, 20, 30, 0.0, 0).unwrap();
    let a = star_apparent(&p, 2000.0, &t);
    let (ra, de) = ra_dec_of(gcrs_to_apparent(unit_vector(1.0, 0.3), t.tt_jd));
    assert!(sep_arcsec(a.ra_rad, a.dec_rad, ra, de) < 1e-6);
}

#[test]
#[ignore]
fn bench_apparent_place_per_star() {
    // Prints per-star cost of the one-shot chain and of the cached context (ratio in one run).
    // Run: cargo test --release --test sky_frames bench_ -- --ignored --nocapture
    let t = Instant::from_civil(2024, 3, 15, 20, 30, 0.0, 0).unwrap();
    let stars: Vec<CatalogPlace> = (0..20_000).map(|i| {
        let x = i as f64;
        CatalogPlace { ra_rad: (x * 0.618).rem_euclid(6.283), dec_rad: ((x * 0.377).rem_euclid(3.0)) - 1.5,
            pm_ra_cosdec_mas_yr: 10.0, pm_dec_mas_yr: -5.0, parallax_mas: 2.0, rv_km_s: 0.0 }
    }).collect();
    let t0 = std::time::Instant::now();
    let mut acc = 0.0;
    for p in &stars[..2000] { acc += star_apparent(p, 1991.25, &t).ra_rad; }
    let one = t0.elapsed().as_secs_f64() / 2000.0;
    let t1 = std::time::Instant::now();
    let ctx = ApparentContext::geocentric(&t);
    for p in &stars { acc += ctx.place(p, 1991.25).ra_rad; }
    let cached = t1.elapsed().as_secs_f64() / stars.len() as f64;
    println!("per star: one-shot {:.2} µs, cached context {:.3} µs, ratio {:.0}× (checksum {acc:.3})", one * 1e6, cached * 1e6, one / cached);
}
