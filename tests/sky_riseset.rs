//! Rise/transit/set, twilight and darkness against skyfield's almanac (fixture
//! tests/fixtures/gen_sky.py → sky.json; skyfield 1.55 + DE421, same horizons:
//! −34′ for stars, −50′/−6°/−12°/−18° for the Sun's centre, no refraction model).

use nightfield::sky::apparent::{star_apparent, CatalogPlace};
use nightfield::sky::darkness::*;
use nightfield::sky::horizon::{hour_angle_rad, site_from_deg, to_horizontal};
use nightfield::sky::riseset::*;
use nightfield::sky::Site;
use nightfield::time::Instant;
use serde_json::Value;

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/sky.json")).unwrap();
    serde_json::from_str(&text).unwrap()
}
fn f(v: &Value) -> f64 {
    v.as_f64().unwrap()
}
fn list(v: &Value) -> Vec<f64> {
    v.as_array().unwrap().iter().map(f).collect()
}
fn site(name: &str) -> Site {
    match name {
        "mid_north" => site_from_deg(50.0, 8.0, 100.0),
        "south" => site_from_deg(-33.9, 18.5, 50.0),
        "far_north" => site_from_deg(60.0, 10.0, 0.0),
        _ => unreachable!(),
    }
    .unwrap()
}
const MINUTE_DAYS: f64 = 1.0 / 1440.0;

fn star_place(fx: &Value, hip: u64) -> CatalogPlace {
    let s = fx["hip_stars"].as_array().unwrap().iter().find(|s| s["hip"].as_u64() == Some(hip)).unwrap();
    CatalogPlace { ra_rad: f(&s["ra_rad"]), dec_rad: f(&s["dec_rad"]), pm_ra_cosdec_mas_yr: f(&s["pm_ra_cosdec_mas_yr"]),
        pm_dec_mas_yr: f(&s["pm_dec_mas_yr"]), parallax_mas: f(&s["parallax_mas"]), rv_km_s: 0.0 }
}

fn close(ours: &[f64], theirs: &[f64], what: &str) -> f64 {
    assert_eq!(ours.len(), theirs.len(), "{what}: ours {ours:?} vs skyfield {theirs:?}");
    let mut worst: f64 = 0.0;
    for (a, b) in ours.iter().zip(theirs) {
        let d = (a - b).abs() / MINUTE_DAYS;
        assert!(d < 1.0, "{what}: {a} vs {b} ({d} min)");
        worst = worst.max(d);
    }
    worst
}

#[test]
fn star_rise_transit_set_match_skyfield_within_1_minute() {
    let fx = fixture();
    let mut worst: f64 = 0.0;
    for w in fx["riseset"].as_array().unwrap() {
        let site = site(w["site"].as_str().unwrap());
        let start = f(&w["start_utc_jd"]);
        for s in w["stars"].as_array().unwrap() {
            let hip = s["hip"].as_u64().unwrap();
            let p = star_place(&fx, hip);
            let alt = |jd: f64| match Instant::from_utc_jd(jd) {
                Ok(t) => to_horizontal(star_apparent(&p, 1991.25, &t), &site, &t).alt_rad,
                Err(_) => f64::NAN,
            };
            let r = rise_transit_set(alt, start, start + 1.0, f(&s["horizon_deg"]).to_radians()).unwrap();
            let r2 = star_rise_transit_set(&p, 1991.25, &site, start, start + 1.0, STAR_HORIZON_RAD).unwrap();
            assert_eq!(r.events.len(), r2.events.len());
            let rises: Vec<f64> = r.events.iter().filter(|e| e.kind == EventKind::Rise).map(|e| e.utc_jd).collect();
            let sets: Vec<f64> = r.events.iter().filter(|e| e.kind == EventKind::Set).map(|e| e.utc_jd).collect();
            let what = format!("HIP {hip} at {}", w["site"]);
            worst = worst.max(close(&rises, &list(&s["rise_utc_jd"]), &what));
            worst = worst.max(close(&sets, &list(&s["set_utc_jd"]), &what));
            // Circumpolar / never up: stated by both sides, not forced into times.
            if s["no_crossing"].as_u64().unwrap() > 0 {
                let up = f(&s["alt_at_12h_deg"]) > 0.0;
                let want = if up { Circumstance::AlwaysAbove } else { Circumstance::AlwaysBelow };
                assert_eq!(r.circumstance, want, "{what}");
            } else {
                assert_eq!(r.circumstance, Circumstance::CrossesHorizon, "{what}");
            }
            // Meridian transit by hour angle (skyfield find_transits).
            let ha = |jd: f64| match Instant::from_utc_jd(jd) {
                Ok(t) => hour_angle_rad(star_apparent(&p, 1991.25, &t).ra_rad, site.lon_rad, &t),
                Err(_) => f64::NAN,
            };
            let tr = meridian_transits(ha, start, start + 1.0).unwrap();
            worst = worst.max(close(&tr, &list(&s["transit_utc_jd"]), &format!("{what} transit")));
            // For a fixed star the highest point is the meridian transit.
            if let (Some(c), Some(t0)) = (r.transit_utc_jd, tr.first()) {
                assert!((c - t0).abs() < MINUTE_DAYS, "{what}: culmination {c} vs transit {t0}");
            }
        }
    }
    println!("stars vs skyfield almanac: worst {:.3} min", worst);
}

#[test]
fn sunrise_sunset_and_twilight_match_skyfield_within_1_minute() {
    // Our Sun: Astronomical Almanac low-precision formulas (~0.01°); skyfield: DE421.
    let fx = fixture();
    let mut worst: f64 = 0.0;
    for w in fx["riseset"].as_array().unwrap() {
        let site = site(w["site"].as_str().unwrap());
        let start = f(&w["start_utc_jd"]);
        let tw = twilight(&site, start).unwrap();
        let sun = &w["sun"];
        let pairs = [
            ("sunrise", tw.sunset_utc_jd, tw.sunrise_utc_jd),
            ("civil", tw.civil_dusk_utc_jd, tw.civil_dawn_utc_jd),
            ("nautical", tw.nautical_dusk_utc_jd, tw.nautical_dawn_utc_jd),
            ("astronomical", tw.astronomical_dusk_utc_jd, tw.astronomical_dawn_utc_jd),
        ];
        for (k, dusk, dawn) in pairs {
            let what = format!("{k} at {} from {start}", w["site"]);
            worst = worst.max(close(&dusk.into_iter().collect::<Vec<_>>(), &list(&sun[k]["set_utc_jd"]), &what));
            worst = worst.max(close(&dawn.into_iter().collect::<Vec<_>>(), &list(&sun[k]["rise_utc_jd"]), &what));
        }
        // Darkness at all: exactly when skyfield finds a −18° crossing.
        let dark = night_darkness(&site, start).unwrap();
        assert_eq!(dark.astronomical_darkness, !list(&sun["astronomical"]["set_utc_jd"]).is_empty(), "{}", w["site"]);
    }
    println!("Sun vs skyfield almanac: worst {:.3} min", worst);
}

#[test]
fn no_astronomical_darkness_above_48_5_degrees_at_the_june_solstice() {
    // 90° − 23.44° − 18° = 48.56° (geometry of the solstice Sun; common practice "about 48.5°").
    let noon = |lon_deg: f64| Instant::from_civil(2024, 6, 20, 12, 0, 0.0, 0).unwrap().utc_jd - lon_deg / 360.0;
    let south = night_darkness(&site_from_deg(48.2, 0.0, 0.0).unwrap(), noon(0.0)).unwrap();
    let north = night_darkness(&site_from_deg(48.9, 0.0, 0.0).unwrap(), noon(0.0)).unwrap();
    assert!(south.astronomical_darkness && south.dark_from_utc_jd.is_some());
    assert!(!north.astronomical_darkness && north.dark_from_utc_jd.is_none());
    assert!((north.min_sun_alt_rad.to_degrees() + 17.67).abs() < 0.1, "{}", north.min_sun_alt_rad.to_degrees());
    // Southern winter: long dark nights at 48.9° S.
    let s = night_darkness(&site_from_deg(-48.9, 0.0, 0.0).unwrap(), noon(0.0)).unwrap();
    assert!(s.astronomical_darkness);
}

#[test]
fn grazing_pass_between_samples_is_found() {
    // Synthetic altitude: above the horizon for ~9 minutes only, peak off the 10-min grid.
    let t0 = 2460400.0 + 0.123_456;
    let alt = |t: f64| 0.0005 - 50.0 * (t - t0) * (t - t0);
    let r = rise_transit_set(alt, 2460400.0, 2460401.0, 0.0).unwrap();
    let half = (0.0005_f64 / 50.0).sqrt();
    let rise = r.rise_utc_jd.unwrap();
    let set = r.set_utc_jd.unwrap();
    assert!((rise - (t0 - half)).abs() < 2e-6 && (set - (t0 + half)).abs() < 2e-6, "{rise} {set}");
    assert!((r.transit_utc_jd.unwrap() - t0).abs() < 2e-6);
    assert_eq!(r.circumstance, Circumstance::CrossesHorizon);
    // The same curve against a horizon above its peak: never up, stated.
    let r = rise_transit_set(alt, 2460400.0, 2460401.0, 0.001).unwrap();
    assert_eq!(r.circumstance, Circumstance::AlwaysBelow);
    assert!(r.rise_utc_jd.is_none() && r.set_utc_jd.is_none());
}

#[test]
fn extinction_by_air_mass() {
    // Δm = k·X; k = 0.2 mag/airmass default (common practice for V at a lowland site).
    assert_eq!(DEFAULT_EXTINCTION_K_MAG, 0.2);
    assert!((extinction_mag(1.0, DEFAULT_EXTINCTION_K_MAG) - 0.2).abs() < 1e-12);
    assert!((extinction_mag(2.0, 0.3) - 0.6).abs() < 1e-12);
    // At 30° altitude X ≈ 2 (sec 60°): a V = 5.0 star looks ≈ 5.4 with k = 0.2.
    let m = extincted_mag(5.0, 30f64.to_radians(), 0.2);
    assert!((m - 5.4).abs() < 0.01, "{m}");
}

#[test]
fn bad_windows_and_sites_are_errors() {
    let alt = |_t: f64| 0.1;
    assert!(matches!(rise_transit_set(alt, 2460400.0, 2460399.0, 0.0), Err(RiseSetError::Window { .. })));
    assert!(matches!(rise_transit_set(alt, 2460400.0, 2460500.0, 0.0), Err(RiseSetError::Window { .. })));
    assert!(matches!(rise_transit_set(alt, f64::NAN, 2460401.0, 0.0), Err(RiseSetError::Window { .. })));
    assert!(matches!(rise_transit_set(|_t| f64::NAN, 2460400.0, 2460401.0, 0.0), Err(RiseSetError::NotFinite { .. })));
    // A date outside the supported range: an error, not a panic.
    assert!(twilight(&site_from_deg(50.0, 0.0, 0.0).unwrap(), 2_500_000.0).is_err());
    let bad = Site { lat_rad: 91f64.to_radians(), lon_rad: 0.0, elev_m: 0.0 };
    let e = twilight(&bad, 2460400.0).unwrap_err();
    assert!(e.to_string().contains("latitude"), "{e}");
    assert!(night_darkness(&bad, 2460400.0).is_err());
}
