//! The Moon for the eyepiece: libration, axis, colongitude (Meeus 1998 Example
//! 53.a, from memory), phase and age (skyfield almanac via gen_solar.py).

#[path = "solar_common.rs"]
mod common;
use common::*;
use glam::DVec3;
use nightfield::sky::frames::npb_matrix;
use nightfield::solar::apparent::apparent_from_site_gcrs;
use nightfield::solar::moon::{moon_age_days, moon_face, moon_phase, phase_name};
use nightfield::solar::BodyId;

#[test]
fn meeus_example_53a() {
    // 1992 Apr 12 0h TD (from memory): optical libration l′ = −1.206°, b′ = +4.194°;
    // with physical libration (≤ 0.03°, not modelled) P = 15.08°, colongitude
    // 90° − l0 with l0 = 67.89°, b0 = +1.46°.
    let e = eph();
    let tt = 2_448_724.5;
    let a = apparent_from_site_gcrs(&e, BodyId::Moon, tt, &npb_matrix(tt), DVec3::ZERO, DVec3::ZERO).unwrap();
    let m = moon_face(&a);
    let d = |x: f64| x.to_degrees();
    assert!((d(m.libration_lon_rad) + 1.206).abs() < 0.02, "l {}", d(m.libration_lon_rad));
    assert!((d(m.libration_lat_rad) - 4.194).abs() < 0.02, "b {}", d(m.libration_lat_rad));
    assert!((d(m.axis_pa_rad) - 15.08).abs() < 0.05, "P {}", d(m.axis_pa_rad));
    assert!((d(m.colongitude_rad) - (90.0 - 67.89)).abs() < 0.05, "c0 {}", d(m.colongitude_rad));
    assert!((d(m.subsolar_lat_rad) - 1.46).abs() < 0.05, "b0 {}", d(m.subsolar_lat_rad));
}

#[test]
fn age_and_phase_match_skyfield_almanac() {
    let e = eph();
    let fx = fixture();
    for case in fx["cases"].as_array().unwrap() {
        let tt = f(&case["tt_jd"]);
        let want_age = tt - f(&case["moon_phase"]["last_new_moon_tt_jd"]);
        let age = moon_age_days(&e, tt).unwrap();
        // Both find the same geocentric conjunction; skyfield's is apparent
        // (aberration shifts it by ~40 s), hence 5 minutes.
        assert!((age - want_age).abs() < 5.0 / 1440.0, "TT {tt}: age {age} vs {want_age}");
        let (name, _) = moon_phase(&e, tt).unwrap();
        assert_eq!(name, phase_name(f(&case["moon_phase"]["elongation_deg"]).to_radians()), "TT {tt}");
    }
}

#[test]
fn colongitude_follows_the_phase() {
    // Common practice: colongitude ≈ 270° at new moon, 0° at first quarter,
    // 90° at full, 180° at last quarter (to within the libration, a few degrees).
    let e = eph();
    let fx = fixture();
    for case in fx["cases"].as_array().unwrap() {
        let a = case_apparent(&e, case, BodyId::Moon);
        let c = moon_face(&a).colongitude_rad.to_degrees();
        let el = f(&case["moon_phase"]["elongation_deg"]);
        let want = (el - 90.0).rem_euclid(360.0);
        let diff = (c - want + 540.0).rem_euclid(360.0) - 180.0;
        assert!(diff.abs() < 10.0, "colongitude {c} vs elongation {el}");
    }
    assert_eq!(phase_name(0.01), "new moon");
    assert_eq!(phase_name(std::f64::consts::PI), "full moon");
    assert_eq!(phase_name(6.2), "new moon");
}

#[test]
fn site_conveniences_agree_with_the_parts() {
    use nightfield::sky::Site;
    use nightfield::solar::{galilean_moons_at, moon_at, saturn_rings_at};
    use nightfield::time::Instant;
    let e = eph();
    let t = Instant::from_utc_jd(2_460_400.4).unwrap();
    let site = Site { lat_rad: 0.9, lon_rad: 0.13, elev_m: 100.0 };
    let (face, name, age) = moon_at(&e, &t, &site).unwrap();
    assert!(face.libration_lat_rad.abs() < 7f64.to_radians() && face.libration_lon_rad.abs() < 9f64.to_radians());
    assert!((0.0..29.6).contains(&age) && !name.is_empty());
    let r = saturn_rings_at(&e, &t, &site).unwrap();
    assert!(r.earth_tilt_rad.abs() < 27f64.to_radians());
    let m = galilean_moons_at(&e, &t).unwrap();
    // Semi-major axes, Jupiter radii (Meeus ch. 44): no moon strays beyond its orbit.
    for (o, a) in m.iter().zip([5.9, 9.4, 15.0, 26.4]) {
        assert!((o.east * o.east + o.north * o.north).sqrt() < a * 1.02);
    }
    let bad = Instant { utc_jd: f64::NAN, tt_jd: f64::NAN, ut1_jd: f64::NAN };
    assert!(moon_at(&e, &bad, &site).is_err() && galilean_moons_at(&e, &bad).is_err());
}
