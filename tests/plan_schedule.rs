//! Plan invariants (a target below the horizon is never scheduled; the best
//! time lies in a window; clouded sectors are avoided after a re-plan; the
//! Sun only at a solar-filtered train), by proptest over random nights.

use nightfield::plan::height::MountGeometry;
use nightfield::plan::schedule::prepare;
use nightfield::plan::*;
use nightfield::plan::sky_brightness::{SkyBrightness, SkyClass};
use nightfield::sky::Site;
use proptest::prelude::*;

fn train(label: &str, ap: f64, mag: f64, solar: bool) -> TrainOption {
    TrainOption {
        label: label.into(),
        aperture_mm: ap,
        magnification: mag,
        true_field_deg: 52.0 / mag,
        transmission: 0.8,
        filter: Filter::None,
        solar_filtered: solar,
        orientation_note: String::new(),
    }
}

fn input(lat: f64, start: f64, hours: f64, min_alt: f64, obst: (f64, f64, f64), seeds: &[(f64, f64, f64, f64)]) -> PlanInput {
    let mut targets: Vec<Candidate> = seeds
        .iter()
        .enumerate()
        .map(|(i, &(ra, dec, size, mu))| Candidate {
            id: format!("t{i}"),
            name: format!("T{i}"),
            kind: if i % 2 == 0 { TargetKind::Galaxy } else { TargetKind::OpenCluster },
            position: TargetPosition::Fixed { ra_rad: ra, dec_rad: dec },
            major_arcmin: size,
            minor_arcmin: size * 0.6,
            vmag: None,
            surface_mu: Some(mu),
            surface_mu_is_b: true,
            bv: None,
            distance_ly: None,
            distance_au: None,
        })
        .collect();
    for (id, kind, pos) in [("moon", TargetKind::Moon, TargetPosition::Moon), ("sun", TargetKind::Sun, TargetPosition::Sun)] {
        targets.push(Candidate {
            id: id.into(),
            name: id.into(),
            kind,
            position: pos,
            major_arcmin: 31.0,
            minor_arcmin: 31.0,
            vmag: if kind == TargetKind::Sun { Some(-26.7) } else { None },
            surface_mu: None,
            surface_mu_is_b: false,
            bv: None,
            distance_ly: None,
            distance_au: None,
        });
    }
    PlanInput {
        site: Site { lat_rad: lat.to_radians(), lon_rad: 0.3, elev_m: 100.0 },
        utc_offset_minutes: 0,
        start_utc_jd: start,
        end_utc_jd: start + hours / 24.0,
        step_minutes: 5.0,
        horizon: HorizonMask { min_alt_deg: min_alt, obstructions: vec![Obstruction { az_from_deg: obst.0, az_to_deg: obst.1, alt_deg: obst.2 }] },
        sky: SkyBrightness::Class { class: SkyClass::Countryside },
        extinction_k_mag: 0.2,
        seeing_arcsec: 2.0,
        sun_caution_deg: 20.0,
        slot_minutes: 30.0,
        eye_pupil_mm: 6.0,
        stations: vec![
            Station {
                name: "A".into(),
                mount: MountGeometry::dobsonian_200_1200(),
                trains: vec![train("32 mm", 200.0, 37.5, false), train("10 mm", 200.0, 120.0, false)],
            },
            Station {
                name: "B".into(),
                mount: MountGeometry::refractor_80_600_tripod(),
                trains: vec![train("25 mm", 80.0, 24.0, false), train("25 mm solar", 80.0, 24.0, true)],
            },
        ],
        targets,
        events: Vec::new(),
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, ..ProptestConfig::default() })]
    #[test]
    fn never_below_horizon_and_best_in_window(
        lat in -60.0f64..65.0,
        start in 2_460_000.0f64..2_462_000.0,
        hours in 1.0f64..9.0,
        min_alt in 0.0f64..30.0,
        obst in (0.0f64..360.0, 0.0f64..360.0, 0.0f64..60.0),
        seeds in prop::collection::vec((0.0f64..6.28, -1.5f64..1.5, 0.5f64..60.0, 18.0f64..24.5), 1..12),
        cloud in (0.0f64..360.0, 10.0f64..120.0, 0.0f64..1.0),
    ) {
        let inp = input(lat, start, hours, min_alt, obst, &seeds);
        let prep = prepare(&inp).unwrap();
        let sector = AzSector { az_from_deg: cloud.0, az_to_deg: (cloud.0 + cloud.1) % 360.0 };
        let from = start + cloud.2 * hours / 24.0;
        for (clouded, from_jd) in [(vec![], None), (vec![sector], Some(from))] {
            let plan = prep.plan(&clouded, from_jd);
            let n = plan.steps_utc_jd.len();
            let in_view = |t: usize, i: usize| {
                let tp = &plan.targets[t];
                let alt = tp.alt_deg[i] as f64;
                let az = tp.az_deg[i] as f64;
                let lim = inp.horizon.limit_deg(az);
                let cloudy = from_jd.is_some_and(|f| plan.steps_utc_jd[i] >= f) && clouded.iter().any(|s| s.contains_deg(az));
                // f32 curves: allow their rounding at the limit.
                alt >= lim - 1e-3 && alt > -1e-3 && !cloudy
            };
            for (t, tp) in plan.targets.iter().enumerate() {
                for w in &tp.windows {
                    prop_assert!(w.start_utc_jd >= inp.start_utc_jd - 1e-9 && w.end_utc_jd <= inp.end_utc_jd + 1e-9);
                    for i in 0..n {
                        let jd = plan.steps_utc_jd[i];
                        if jd >= w.start_utc_jd - 1e-9 && jd <= w.end_utc_jd + 1e-9 {
                            prop_assert!(in_view(t, i), "window step below horizon: target {t} step {i}");
                        }
                    }
                }
                if let Some(b) = tp.best_utc_jd {
                    prop_assert!(tp.windows.iter().any(|w| b >= w.start_utc_jd - 1e-9 && b <= w.end_utc_jd + 1e-9), "best time outside every window");
                } else {
                    prop_assert!(tp.windows.is_empty());
                }
            }
            for (s, sp) in plan.stations.iter().enumerate() {
                let mut last_end = f64::NEG_INFINITY;
                for sh in &sp.showings {
                    prop_assert!(sh.start_utc_jd >= last_end - 1e-9, "overlapping showings");
                    last_end = sh.end_utc_jd;
                    for i in 0..n {
                        let jd = plan.steps_utc_jd[i];
                        if jd >= sh.start_utc_jd - 1e-9 && jd <= sh.end_utc_jd + 1e-9 {
                            prop_assert!(in_view(sh.target_index, i), "scheduled below horizon or in cloud: station {s} target {} step {i}", sh.target_index);
                        }
                    }
                    let tr = &inp.stations[s].trains[sh.train_index];
                    let is_sun = inp.targets[sh.target_index].kind == TargetKind::Sun;
                    prop_assert_eq!(tr.solar_filtered, is_sun, "Sun only through a solar-filtered train");
                }
            }
        }
    }
}

#[test]
fn sun_up_gives_a_prominent_caution_and_filtered_showing() {
    // Afternoon into evening: the Sun is up at the start.
    let inp = input(47.0, 2_461_387.0 + 0.1, 6.0, 5.0, (0.0, 1.0, 0.0), &[(1.0, 0.5, 10.0, 21.0)]);
    let plan = plan_night(&inp).unwrap();
    assert!(plan.cautions.first().is_some_and(|c| c.level == cautions::CautionLevel::Danger && c.text.contains("full-aperture solar filter")));
    // Station B (solar train) may show the Sun; station A never.
    assert!(plan.stations[0].showings.iter().all(|s| inp.targets[s.target_index].kind != TargetKind::Sun));
    assert!(!plan.cautions_card.items.is_empty());
}

#[test]
fn bad_inputs_give_plain_errors() {
    let mut inp = input(47.0, 2_461_387.2, 5.0, 10.0, (0.0, 1.0, 0.0), &[]);
    inp.step_minutes = 0.0;
    let e = plan_night(&inp).unwrap_err();
    assert!(e.to_string().contains("time step"), "{e}");
    let mut inp = input(47.0, 2_461_387.2, 5.0, 10.0, (0.0, 1.0, 0.0), &[]);
    inp.end_utc_jd = inp.start_utc_jd - 0.1;
    assert!(matches!(plan_night(&inp), Err(PlanError::BadWindow { .. })));
    let mut inp = input(47.0, 2_461_387.2, 5.0, 10.0, (0.0, 1.0, 0.0), &[]);
    inp.extinction_k_mag = f64::NAN;
    assert!(plan_night(&inp).unwrap_err().to_string().contains("extinction"));
}

#[test]
fn plan_is_deterministic_and_serialises() {
    let inp = bench::bench_input(40, 3);
    let a = serde_json::to_string(&plan_night(&inp).unwrap()).unwrap();
    let b = serde_json::to_string(&plan_night(&inp).unwrap()).unwrap();
    assert_eq!(a, b);
    // The input round-trips through JSON (the page sends it).
    let back: PlanInput = serde_json::from_str(&serde_json::to_string(&inp).unwrap()).unwrap();
    assert_eq!(back.targets.len(), inp.targets.len());
    assert_eq!(back.stations, inp.stations);
}
