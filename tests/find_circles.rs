//! Setting-circle readings: dial = sign·azimuth + zero (the arithmetic of a
//! fixed dial offset; a Dobsonian's circles are read this way, common practice).
use nightfield::find::circles::*;
use nightfield::sky::Horizontal;

fn hz(alt_deg: f64, az_deg: f64) -> Horizontal {
    Horizontal { alt_rad: alt_deg.to_radians(), az_rad: az_deg.to_radians() }
}

#[test]
fn true_north_dials() {
    let r = dial_readings(hz(34.5, 127.0), AzimuthReference::TrueNorth, DialSense::Clockwise, 0.0).unwrap();
    assert!((r.az_dial_deg - 127.0).abs() < 1e-9);
    assert!((r.alt_dial_deg - 34.5).abs() < 1e-9);
    assert_eq!(r.words, "Set the angle gauge to 34.5° and the azimuth circle to 127.0° (toward the south-east).");
    let r = dial_readings(hz(34.5, 127.0), AzimuthReference::TrueNorth, DialSense::CounterClockwise, 0.5).unwrap();
    assert!((r.az_dial_deg - 233.0).abs() < 1e-9);
    assert!((r.alt_dial_deg - 35.0).abs() < 1e-9);
    let r = dial_readings(hz(10.0, 0.0), AzimuthReference::TrueNorth, DialSense::Clockwise, 0.0).unwrap();
    assert_eq!(r.az_dial_deg, 0.0);
}

#[test]
fn reference_star_dials() {
    // Star at az 200° read 50° on the dial; a target 50° further clockwise reads 100°.
    let reference = AzimuthReference::ReferenceStar { star: hz(30.0, 200.0), dial_deg: 50.0 };
    let r = dial_readings(hz(20.0, 250.0), reference, DialSense::Clockwise, 0.0).unwrap();
    assert!((r.az_dial_deg - 100.0).abs() < 1e-9, "{}", r.az_dial_deg);
    // Counter-clockwise dial: 50° clockwise in the sky is 50° down the dial.
    let r = dial_readings(hz(20.0, 250.0), reference, DialSense::CounterClockwise, 0.0).unwrap();
    assert!((r.az_dial_deg - 0.0).abs() < 1e-9 || (r.az_dial_deg - 360.0).abs() < 1e-9, "{}", r.az_dial_deg);
    let r = dial_readings(hz(20.0, 150.0), reference, DialSense::Clockwise, 0.0).unwrap();
    assert!((r.az_dial_deg - 0.0).abs() < 1e-9, "{}", r.az_dial_deg);
}

#[test]
fn turning_and_errors() {
    let (daz, dalt) = turn_between(hz(10.0, 350.0), hz(30.0, 10.0));
    assert!((daz - 20.0).abs() < 1e-9 && (dalt - 20.0).abs() < 1e-9);
    let e = dial_readings(hz(10.0, 0.0), AzimuthReference::TrueNorth, DialSense::Clockwise, 45.0).unwrap_err();
    assert!(e.to_string().contains("angle gauge zero offset"));
    assert!(dial_readings(hz(-5.0, 0.0), AzimuthReference::TrueNorth, DialSense::Clockwise, 0.0).unwrap().words.contains("below the horizon"));
}
