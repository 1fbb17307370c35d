//! The planner's low-precision Sun, Moon, sidereal time and twilight against
//! skyfield 1.55 / JPL DE421 (tests/fixtures/gen_plan.py writes plan.json).
//! Bars: the published accuracy of the Astronomical Almanac low-precision
//! formulae (Sun 0.01°, Moon 0.3° in longitude) with room, planning-grade.

use nightfield::plan::ephem_lite::*;
use nightfield::plan::*;
use nightfield::sky::{Equatorial, Site};
use serde_json::Value;

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/plan.json")).unwrap();
    serde_json::from_str(&text).unwrap()
}

fn site() -> Site {
    Site { lat_rad: 47.2f64.to_radians(), lon_rad: 8.4f64.to_radians(), elev_m: 450.0 }
}

fn sep_deg(ra1: f64, de1: f64, ra2: f64, de2: f64) -> f64 {
    let a = Equatorial { ra_rad: ra1.to_radians(), dec_rad: de1.to_radians() };
    let b = Equatorial { ra_rad: ra2.to_radians(), dec_rad: de2.to_radians() };
    separation_rad(&a, &b).to_degrees()
}

#[test]
fn sun_moon_and_sidereal_time_against_skyfield() {
    let fx = fixture();
    let st = SiteTrig::new(&site());
    let (mut worst_sun, mut worst_moon, mut worst_moon_alt, mut worst_frac) = (0.0f64, 0.0f64, 0.0f64, 0.0f64);
    for s in fx["samples"].as_array().unwrap() {
        let jd = s["utc_jd"].as_f64().unwrap();
        let g = gmst_rad(jd).to_degrees();
        let dg = ((g - s["gmst_deg"].as_f64().unwrap() + 540.0) % 360.0) - 180.0;
        assert!(dg.abs() < 0.005, "GMST at {jd}: {dg}°");
        let sun = sun_lite(jd);
        let d = sep_deg(sun.equ.ra_rad.to_degrees(), sun.equ.dec_rad.to_degrees(), s["sun_ra_deg"].as_f64().unwrap(), s["sun_dec_deg"].as_f64().unwrap());
        worst_sun = worst_sun.max(d);
        let moon = moon_lite(jd);
        let d = sep_deg(moon.equ.ra_rad.to_degrees(), moon.equ.dec_rad.to_degrees(), s["moon_ra_deg"].as_f64().unwrap(), s["moon_dec_deg"].as_f64().unwrap());
        worst_moon = worst_moon.max(d);
        let lst = lst_rad(jd, &st);
        let mh = horizontal(&moon.equ, lst, &st);
        let malt = moon_topocentric_alt_rad(mh.alt_rad, moon.parallax_deg).to_degrees();
        // skyfield's altitude includes no refraction here (apparent() without temperature/pressure).
        worst_moon_alt = worst_moon_alt.max((malt - s["moon_alt_deg"].as_f64().unwrap()).abs());
        let salt = horizontal(&sun.equ, lst, &st).alt_rad.to_degrees();
        assert!((salt - s["sun_alt_deg"].as_f64().unwrap()).abs() < 0.03, "Sun altitude at {jd}");
        let (_, frac, _) = moon_phase(&sun, &moon);
        worst_frac = worst_frac.max((frac - s["moon_illuminated"].as_f64().unwrap()).abs());
    }
    println!("worst: Sun {worst_sun:.4}°, Moon {worst_moon:.3}°, Moon alt {worst_moon_alt:.3}°, lit fraction {worst_frac:.4}");
    assert!(worst_sun < 0.02, "Sun {worst_sun}");
    assert!(worst_moon < 0.5, "Moon {worst_moon}");
    assert!(worst_moon_alt < 0.5, "Moon altitude {worst_moon_alt}");
    assert!(worst_frac < 0.01, "Moon lit fraction {worst_frac}");
}

#[test]
fn twilight_times_against_skyfield() {
    let fx = fixture();
    let mut input = bench::bench_input(0, 0);
    input.site = site();
    input.start_utc_jd = 2_461_387.0; // 2026-12-12 12:00 UTC
    input.end_utc_jd = 2_461_388.0;
    input.step_minutes = 2.0;
    let plan = plan_night(&input).unwrap();
    use nightfield::plan::assign::SkyEventKind as K;
    // skyfield dark_twilight_day codes: 3 civil, 2 nautical, 1 astronomical, 0 dark, 4 day.
    let dusk = [K::Sunset, K::CivilDusk, K::NauticalDusk, K::AstronomicalDusk];
    let dawn = [K::AstronomicalDawn, K::NauticalDawn, K::CivilDawn, K::Sunrise];
    let tw = fx["twilight_2026_12_12"].as_array().unwrap();
    assert_eq!(tw.len(), 8);
    for (i, row) in tw.iter().enumerate() {
        let kind = if i < 4 { dusk[i] } else { dawn[i - 4] };
        let want = row["utc_jd"].as_f64().unwrap();
        let got = plan.sky_events.iter().find(|e| e.kind == kind).unwrap().utc_jd;
        // One minute: low-precision Sun and linear interpolation between 2-minute steps.
        assert!((got - want).abs() * 1440.0 < 1.0, "{kind:?}: {} min", (got - want) * 1440.0);
    }
}
