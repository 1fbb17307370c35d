//! Pointing words: compass points, hand measures, landmark directions.
use nightfield::find::words::*;
use nightfield::sky::Horizontal;
use proptest::prelude::*;

fn hz(alt_deg: f64, az_deg: f64) -> Horizontal {
    Horizontal { alt_rad: alt_deg.to_radians(), az_rad: az_deg.to_radians() }
}

/// 16-point compass rose, 22.5° apart, each covering ±11.25° (common practice).
#[test]
fn compass_points_known() {
    assert_eq!(compass_point_16(0.0).name, "north");
    assert_eq!(compass_point_16(135f64.to_radians()).name, "south-east");
    assert_eq!(compass_point_16(202.5f64.to_radians()).abbrev, "SSW");
    assert_eq!(compass_point_16(270f64.to_radians()).name, "west");
    assert_eq!(compass_point_16(11.2f64.to_radians()).name, "north");
    assert_eq!(compass_point_16(11.3f64.to_radians()).name, "north-north-east");
    assert_eq!(compass_point_16(348.8f64.to_radians()).name, "north");
    assert_eq!(compass_point_16(-90f64.to_radians()).name, "west");
}

proptest! {
    /// The bearing word's own azimuth is within half a sector (11.25°) of the azimuth.
    #[test]
    fn bearing_words_agree_with_azimuth(az in -20.0f64..20.0) {
        let cp = compass_point_16(az);
        let deg = az.to_degrees().rem_euclid(360.0);
        let diff = (deg - cp.nominal_az_deg + 540.0).rem_euclid(360.0) - 180.0;
        prop_assert!(diff.abs() <= 11.25 + 1e-9, "az {} → {} ({}°)", deg, cp.name, cp.nominal_az_deg);
        // The sentence names the same point.
        let s = altitude_sentence(Horizontal { alt_rad: 0.3, az_rad: az });
        let needle = format!("the {},", cp.name);
        prop_assert!(s.contains(&needle), "{}", s);
    }

    /// Facing the sky, azimuth grows to the right: a target a little east of
    /// a landmark in azimuth at equal altitude is "to the right".
    #[test]
    fn direction_words_right_is_growing_azimuth(az in 0.0f64..360.0, alt in 5.0f64..60.0, d in 1.0f64..15.0) {
        let (ang, w) = direction_words(hz(alt, az), hz(alt, az + d));
        prop_assert!(ang > 45.0 && ang < 135.0, "angle {}", ang);
        prop_assert!(w.contains("right"));
        let (ang, w) = direction_words(hz(alt, az), hz(alt + d, az));
        prop_assert!(ang < 1e-6 || ang > 360.0 - 1e-6, "angle {}", ang);
        prop_assert_eq!(w, "straight up");
    }
}

/// Hand measures (common practice): finger 1°, three fingers 5°, fist 10°.
#[test]
fn hand_measures() {
    assert_eq!(hand_measure_words(1f64.to_radians()), "about one finger's width (1°)");
    assert_eq!(hand_measure_words(2f64.to_radians()), "about two fingers' width (2°)");
    assert_eq!(hand_measure_words(5f64.to_radians()), "about three fingers' width (5°)");
    assert_eq!(hand_measure_words(10f64.to_radians()), "about one fist (10°)");
    assert_eq!(hand_measure_words(15f64.to_radians()), "about one and a half fists (15°)");
    assert_eq!(hand_measure_words(31f64.to_radians()), "about three fists (31°)");
    assert_eq!(hand_measure_words(0.5f64.to_radians()), "less than a finger's width (30′)");
}

#[test]
fn altitude_sentences() {
    assert_eq!(altitude_sentence(hz(10.0, 135.0)), "Low in the south-east, about one fist (10°) above the horizon.");
    assert_eq!(altitude_sentence(hz(5.0, 180.0)), "Very low in the south, about three fingers' width (5°) above the horizon.");
    assert_eq!(altitude_sentence(hz(40.0, 270.0)), "Part way up in the west, about four fists (40°) above the horizon.");
    assert_eq!(altitude_sentence(hz(80.0, 0.0)), "Nearly overhead: about one fist (10°) from straight up, toward the north.");
    assert!(altitude_sentence(hz(-3.0, 90.0)).contains("not visible"));
}

#[test]
fn nearest_landmark_and_sentence() {
    let lm = vec![
        Landmark { name: "Far Bright".into(), pos: hz(40.0, 100.0), vmag: 0.0 },
        Landmark { name: "Near Bright".into(), pos: hz(30.0, 180.0), vmag: 1.0 },
        Landmark { name: "Too Faint".into(), pos: hz(25.0, 180.0), vmag: 4.0 },
        Landmark { name: "Set".into(), pos: hz(-2.0, 180.0), vmag: -1.0 },
    ];
    let target = hz(20.0, 180.0);
    let p = pointing_words(target, &lm, LandmarkRule::default()).unwrap();
    let f = p.from_landmark.unwrap();
    assert_eq!(f.name, "Near Bright");
    assert!((f.distance_deg - 10.0).abs() < 1e-9);
    assert_eq!(f.direction_words, "straight down");
    assert_eq!(f.sentence, "From Near Bright, go about one fist (10°) straight down.");
    assert_eq!(p.compass.name, "south");
    // Facing south, west (az 270) is on the right: a target west of the landmark.
    let (_, w) = direction_words(hz(30.0, 180.0), hz(30.0, 200.0));
    assert_eq!(w, "to the right");
}

#[test]
fn bad_input_is_an_error() {
    let e = pointing_words(Horizontal { alt_rad: f64::NAN, az_rad: 0.0 }, &[], LandmarkRule::default()).unwrap_err();
    assert!(e.to_string().contains("target altitude"));
}
