//! A deterministic synthetic night for timing the planner natively and in
//! wasm: `n_targets` invented deep-sky targets plus the Moon and one planet,
//! `n_stations` stations of four trains, 5-minute steps over 5 hours.
//! Invented data, for timing only (never a check value).

use super::height::MountGeometry;
use super::input::*;
use super::sky_brightness::{SkyBrightness, SkyClass};
use crate::sky::Site;

/// The bench input (deterministic: a fixed linear congruential sequence).
pub fn bench_input(n_targets: usize, n_stations: usize) -> PlanInput {
    let mut seed: u64 = 0x5eed_1234_abcd_0001;
    let mut next = || {
        seed = seed.wrapping_mul(6_364_136_223_846_793_005).wrapping_add(1_442_695_040_888_963_407);
        (seed >> 11) as f64 / (1u64 << 53) as f64
    };
    let kinds = [
        TargetKind::Galaxy,
        TargetKind::GlobularCluster,
        TargetKind::OpenCluster,
        TargetKind::PlanetaryNebula,
        TargetKind::EmissionNebula,
    ];
    let mut targets = vec![
        Candidate {
            id: "moon".into(),
            name: "Moon".into(),
            kind: TargetKind::Moon,
            position: TargetPosition::Moon,
            major_arcmin: 31.0,
            minor_arcmin: 31.0,
            vmag: None,
            surface_mu: None,
            surface_mu_is_b: false,
            bv: None,
            distance_ly: None,
            distance_au: None,
        },
        Candidate {
            id: "planet".into(),
            name: "Planet".into(),
            kind: TargetKind::Planet,
            position: TargetPosition::Track {
                points: vec![
                    TrackPoint { utc_jd: 2_461_387.2, ra_rad: 1.9, dec_rad: 0.38 },
                    TrackPoint { utc_jd: 2_461_387.5, ra_rad: 1.9005, dec_rad: 0.3801 },
                ],
            },
            major_arcmin: 0.75,
            minor_arcmin: 0.7,
            vmag: Some(-2.5),
            surface_mu: None,
            surface_mu_is_b: false,
            bv: None,
            distance_ly: None,
            distance_au: Some(4.2),
        },
    ];
    for i in 0..n_targets {
        let kind = kinds[i % kinds.len()];
        let major = 1.0 + 40.0 * next();
        targets.push(Candidate {
            id: format!("T{i}"),
            name: format!("Target {i}"),
            kind,
            position: TargetPosition::Fixed { ra_rad: core::f64::consts::TAU * next(), dec_rad: libm::asin(2.0 * next() - 1.0) },
            major_arcmin: major,
            minor_arcmin: major * (0.3 + 0.7 * next()),
            vmag: Some(5.0 + 8.0 * next()),
            surface_mu: Some(19.0 + 5.0 * next()),
            surface_mu_is_b: true,
            bv: None,
            distance_ly: Some(1.0e3 + 1.0e7 * next()),
            distance_au: None,
        });
    }
    let stations = (0..n_stations)
        .map(|s| {
            let (ap, fl, mount) = match s % 3 {
                0 => (200.0, 1200.0, MountGeometry::dobsonian_200_1200()),
                1 => (80.0, 600.0, MountGeometry::refractor_80_600_tripod()),
                _ => (200.0, 2000.0, MountGeometry::cassegrain_200_fork()),
            };
            let trains = [32.0, 25.0, 10.0, 6.0]
                .iter()
                .map(|&ep| {
                    let mag = fl / ep;
                    TrainOption {
                        label: format!("{ep} mm eyepiece"),
                        aperture_mm: ap,
                        magnification: mag,
                        true_field_deg: 52.0 / mag,
                        transmission: 0.8,
                        filter: Filter::None,
                        solar_filtered: false,
                        orientation_note: String::new(),
                    }
                })
                .collect();
            Station { name: format!("Station {}", s + 1), mount, trains }
        })
        .collect();
    PlanInput {
        site: Site { lat_rad: 47.2_f64.to_radians(), lon_rad: 8.4_f64.to_radians(), elev_m: 450.0 },
        utc_offset_minutes: 60,
        start_utc_jd: 2_461_387.2,
        end_utc_jd: 2_461_387.2 + 5.0 / 24.0,
        step_minutes: 5.0,
        horizon: HorizonMask { min_alt_deg: 15.0, obstructions: vec![Obstruction { az_from_deg: 200.0, az_to_deg: 250.0, alt_deg: 30.0 }] },
        sky: SkyBrightness::Class { class: SkyClass::Countryside },
        extinction_k_mag: 0.2,
        seeing_arcsec: 2.0,
        sun_caution_deg: 20.0,
        slot_minutes: 30.0,
        eye_pupil_mm: 6.0,
        stations,
        targets,
        events: Vec::new(),
    }
}

/// Plan the bench night; returns the number of showings (so the work cannot be optimised away).
pub fn bench_plan(n_targets: usize, n_stations: usize) -> usize {
    let input = bench_input(n_targets, n_stations);
    match super::plan_night(&input) {
        Ok(p) => p.stations.iter().map(|s| s.showings.len()).sum(),
        Err(_) => 0,
    }
}
