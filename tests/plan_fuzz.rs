//! The planner's input comes from the page and from shared links: random
//! JSON bytes and random (also non-finite) numbers must give a plan or a
//! typed error, never a panic.

use nightfield::plan::*;
use proptest::prelude::*;

fn any_f64() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        -1.0e9f64..1.0e9,
        -10.0f64..10.0,
    ]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, ..ProptestConfig::default() })]

    #[test]
    fn random_bytes_never_panic(bytes in prop::collection::vec(any::<u8>(), 0..400)) {
        if let Ok(inp) = serde_json::from_slice::<PlanInput>(&bytes) {
            let _ = plan_night(&inp);
        }
    }

    #[test]
    fn mutated_numbers_never_panic(vals in prop::collection::vec(any_f64(), 16), which in 0usize..16) {
        let mut inp = bench::bench_input(6, 2);
        let v = vals[which];
        match which {
            0 => inp.site.lat_rad = v,
            1 => inp.site.lon_rad = v,
            2 => inp.start_utc_jd = v,
            3 => inp.end_utc_jd = v,
            4 => inp.step_minutes = v,
            5 => inp.horizon.min_alt_deg = v,
            6 => inp.horizon.obstructions[0].az_from_deg = v,
            7 => inp.extinction_k_mag = v,
            8 => inp.seeing_arcsec = v,
            9 => inp.slot_minutes = v,
            10 => inp.eye_pupil_mm = v,
            11 => inp.stations[0].trains[0].magnification = v,
            12 => inp.stations[0].mount.pivot_height_mm = v,
            13 => inp.targets[3].major_arcmin = v,
            14 => inp.targets[3].surface_mu = Some(v),
            _ => inp.targets[3].position = TargetPosition::Fixed { ra_rad: v, dec_rad: vals[0] },
        }
        match plan_night(&inp) {
            Ok(p) => prop_assert_eq!(p.targets.len(), inp.targets.len()),
            Err(e) => prop_assert!(!e.to_string().is_empty()),
        }
    }
}

#[test]
fn degenerate_but_valid_inputs() {
    // No stations, no targets, an empty train list, a track with one point.
    let mut inp = bench::bench_input(0, 0);
    assert!(plan_night(&inp).is_ok());
    inp = bench::bench_input(3, 1);
    inp.stations[0].trains.clear();
    inp.targets[1].position = TargetPosition::Track { points: vec![TrackPoint { utc_jd: inp.start_utc_jd, ra_rad: 1.0, dec_rad: 0.2 }] };
    let p = plan_night(&inp).unwrap();
    assert!(p.stations[0].showings.is_empty());
    // A window shorter than one step.
    inp.end_utc_jd = inp.start_utc_jd + 1.0 / 1440.0;
    assert!(plan_night(&inp).is_ok());
}
