//! Eyepiece height, framing, sky brightness and talking points.

use nightfield::plan::framing::*;
use nightfield::plan::height::*;
use nightfield::plan::sky_brightness::*;
use nightfield::sky::brightness::*;
use nightfield::plan::talking_points::*;
use nightfield::plan::*;

fn train(label: &str, ap: f64, mag: f64, afov_deg: f64) -> TrainOption {
    TrainOption {
        label: label.into(),
        aperture_mm: ap,
        magnification: mag,
        true_field_deg: afov_deg / mag,
        transmission: 0.8,
        filter: Filter::None,
        solar_filtered: false,
        orientation_note: String::new(),
    }
}

#[test]
fn eyepiece_height_geometry() {
    // Rigid tube about its altitude axis: pivot + along·sin(alt) + up·cos(alt).
    let dob = MountGeometry::dobsonian_200_1200();
    assert!((eyepiece_height_m(&dob, std::f64::consts::FRAC_PI_2) - 1.32).abs() < 1e-9);
    assert!((eyepiece_height_m(&dob, 30f64.to_radians()) - 0.92).abs() < 1e-9);
    // A refractor with a diagonal: the eyepiece drops as the tube rises (common practice).
    let r = MountGeometry::refractor_80_600_tripod();
    let low = eyepiece_height_m(&r, 10f64.to_radians());
    let high = eyepiece_height_m(&r, 80f64.to_radians());
    assert!(low > high, "{low} {high}");
    assert!((eyepiece_height_m(&r, 0.0) - 1.34).abs() < 1e-9);
}

#[test]
fn reach_flags() {
    // Figures of common practice (see height.rs constants).
    let a = access(1.0);
    assert_eq!((a.child, a.wheelchair, a.adult), (Reach::Ok, Reach::Ok, Reach::Ok));
    let a = access(1.25);
    assert_eq!(a.child, Reach::NeedsStep);
    assert_eq!(a.wheelchair, Reach::Ok);
    let a = access(1.5);
    assert_eq!((a.child, a.wheelchair, a.adult), (Reach::TooHigh, Reach::TooHigh, Reach::Ok));
    assert!(a.notes.iter().any(|n| n.contains("wheelchair")));
    let a = access(1.9);
    assert_eq!(a.adult, Reach::NeedsStep);
    assert_eq!(access(0.6).adult, Reach::TooLow);
}

#[test]
fn framing_rules() {
    // 200/1200 with 32, 25, 10, 6 mm eyepieces (52° apparent field): 37.5×, 48×, 120×, 200×.
    let trains: Vec<TrainOption> = [32.0, 25.0, 10.0, 6.0].iter().map(|&ep| train(&format!("{ep} mm"), 200.0, 1200.0 / ep, 52.0)).collect();
    let mut flat = |_: usize| 0.0;
    // A 60′ object fits only the 32 mm (1.39° field) with the 1.3 margin.
    let f = best_frame(TargetKind::OpenCluster, 60.0, &trains, 6.0, 2.0, &mut flat).unwrap();
    assert_eq!(f.train_index, 0);
    assert!(f.fits);
    // Small object, equal visibility: the larger image wins.
    let f = best_frame(TargetKind::PlanetaryNebula, 1.4, &trains, 6.0, 2.0, &mut flat).unwrap();
    assert_eq!(f.train_index, 3);
    // Visibility decides when it differs by more than the tie margin.
    let mut prefer_low = |i: usize| if i == 1 { 1.0 } else { 0.0 };
    assert_eq!(best_frame(TargetKind::Galaxy, 5.0, &trains, 6.0, 2.0, &mut prefer_low).unwrap().train_index, 1);
    // Planet: in 2″ seeing the useful maximum is 200× (common practice), D/pupil the minimum.
    assert_eq!(useful_magnification(200.0, 6.0, 2.0), (200.0 / 6.0, 200.0));
    let f = best_frame(TargetKind::Planet, 0.75, &trains, 6.0, 2.0, &mut flat).unwrap();
    assert_eq!(f.train_index, 3);
    assert!(f.in_useful_range);
    // In poor 4″ seeing the limit is 100×: the highest magnification inside it is 48× (25 mm).
    let f = best_frame(TargetKind::Planet, 0.75, &trains, 6.0, 4.0, &mut flat).unwrap();
    assert_eq!(f.train_index, 1);
    // The Moon (31′) whole in the field: 48× gives 65′ ≥ 1.15 × 31′, 120× does not.
    assert_eq!(best_frame(TargetKind::Moon, 31.0, &trains, 6.0, 2.0, &mut flat).unwrap().train_index, 1);
    // The Sun: no solar-filtered train, no frame at all.
    assert!(best_frame(TargetKind::Sun, 32.0, &trains, 6.0, 2.0, &mut flat).is_none());
    let mut solar = trains.clone();
    solar[0].solar_filtered = true;
    assert_eq!(best_frame(TargetKind::Sun, 32.0, &solar, 6.0, 2.0, &mut flat).unwrap().train_index, 0);
    // And the solar-filtered train is never used at night.
    assert_ne!(best_frame(TargetKind::OpenCluster, 20.0, &solar, 6.0, 2.0, &mut flat).unwrap().train_index, 0);
}

#[test]
fn moonlight_krisciunas_schaefer() {
    // K&S 1991 eq. 9: full Moon V = −12.73 (common practice: about −12.7).
    assert!((moon_vmag(0.0) + 12.73).abs() < 1e-12);
    // K&S eq. 1 and its inverse.
    assert!((nl_to_mu(mu_to_nl(21.5)) - 21.5).abs() < 1e-9);
    // Eq. 1 against Crumey's photometric zero point: 21.83 mag/arcsec² ≈ 63 nL ≈ 2.0e-4 cd/m² (both from memory of the papers' constants).
    let cd = mu_to_nl(21.83) * 1e-5 / std::f64::consts::PI;
    let crumey = nightfield::plan::visibility::mag_arcsec2_to_cd_m2(21.83);
    assert!((cd / crumey - 1.0).abs() < 0.02, "{cd} {crumey}");
    // Full Moon at 60° altitude, target at the zenith (30° away), k = 0.172 (K&S's Mauna Kea value):
    // the sky brightens to about 18 mag/arcsec² (common practice: "about 18 under a full Moon").
    let s = SkyAt { zenith_mu: 21.6, k_mag: 0.172, target_alt_rad: 90f64.to_radians(), sun_alt_rad: -0.6, moon_alt_rad: 60f64.to_radians(), moon_phase_angle_rad: 0.0, moon_separation_rad: 30f64.to_radians() };
    let mu = sky_mu(&s);
    assert!((17.3..18.8).contains(&mu), "{mu}");
    // Moon below the horizon adds nothing; a thinner Moon adds less; closer to the Moon is brighter.
    let d = |deg: f64| deg.to_radians();
    assert_eq!(moonlight_nl(0.0, d(30.0), -0.1, 1.0, 0.2), 0.0);
    assert!(moonlight_nl(d(90.0), d(30.0), 1.0, 1.0, 0.2) < moonlight_nl(0.0, d(30.0), 1.0, 1.0, 0.2));
    assert!(moonlight_nl(0.0, d(20.0), 1.0, 1.0, 0.2) > moonlight_nl(0.0, d(60.0), 1.0, 1.0, 0.2));
    // Dark sky: brighter towards the horizon (van Rhijn-type gradient in K&S eq. 2).
    assert!(dark_sky_nl(21.6, 20f64.to_radians(), 0.2) > dark_sky_nl(21.6, 90f64.to_radians(), 0.2));
    // The scale classes are ordered.
    let z: Vec<f64> = SkyClass::ALL.iter().map(|c| c.zenith_mu()).collect();
    assert!(z.windows(2).all(|w| w[0] > w[1]));
}

#[test]
fn talking_points_from_data() {
    // Jupiter at 4.2 AU, 45″ across: about 140,000 km (common practice: 143,000 km), light time about 35 minutes.
    let c = Candidate {
        id: "jupiter".into(),
        name: "Jupiter".into(),
        kind: TargetKind::Planet,
        position: TargetPosition::Fixed { ra_rad: 0.0, dec_rad: 0.0 },
        major_arcmin: 0.75,
        minor_arcmin: 0.7,
        vmag: Some(-2.5),
        surface_mu: None,
        surface_mu_is_b: false,
        bv: None,
        distance_ly: None,
        distance_au: Some(4.2),
    };
    let t = talking_points(&c, 384_400.0);
    assert!(t[0].contains("630,000,000 km") && t[0].contains("35 minutes"), "{t:?}");
    assert!(t[1].contains("140,000 km") && t[1].contains("11 times"), "{t:?}");
    // A galaxy 2.5 million light-years away, 180′ across: about 130,000 light-years.
    let g = Candidate { kind: TargetKind::Galaxy, distance_au: None, distance_ly: Some(2.5e6), major_arcmin: 180.0, ..c };
    let t = talking_points(&g, 384_400.0);
    assert!(t[0].contains("2,500,000 years"), "{t:?}");
    assert!(t[1].contains("130,000 light-years"), "{t:?}");
    assert_eq!(two_sig(1234.0), "1,200");
    assert_eq!(two_sig(3.14), "3.1");
    assert_eq!(local_hhmm(2_461_387.25, 60), "19:00");
}

#[test]
fn showpieces_draw_the_queue_before_anonymous_objects() {
    // Common practice at public nights: the famous, bright objects first. Candidates as the
    // planner builds them from OpenNGC (M 31: V 3.4, named; NGC 7686: V 5.6, unnamed).
    let c = |id: &str, name: &str, v: f64| Candidate {
        id: id.into(),
        name: name.into(),
        kind: TargetKind::Galaxy,
        position: TargetPosition::Fixed { ra_rad: 0.0, dec_rad: 0.0 },
        major_arcmin: 10.0,
        minor_arcmin: 10.0,
        vmag: Some(v),
        surface_mu: None,
        surface_mu_is_b: false,
        bv: None,
        distance_ly: None,
        distance_au: None,
    };
    let famous = nightfield::plan::assign::showpiece_bonus(&c("M 31", "M 31 (Andromeda Galaxy)", 3.4));
    let anonymous = nightfield::plan::assign::showpiece_bonus(&c("NGC 7686", "NGC 7686", 5.6));
    let faint = nightfield::plan::assign::showpiece_bonus(&c("NGC 1", "NGC 1", 12.9));
    assert!(famous > anonymous && anonymous > faint, "{famous} {anonymous} {faint}");
    assert_eq!(faint, 0.0);
    // Never enough to lift an object over a better verdict class (10 points per class).
    assert!(famous < 10.0);
}

#[test]
fn eyepiece_height_words_say_one_height_when_it_does_not_change() {
    use nightfield::plan::cards::height_words;
    assert_eq!(height_words(1.0712, 1.0738), "eyepiece 1.07 m above the ground");
    assert_eq!(height_words(1.04, 1.07), "eyepiece 1.04–1.07 m above the ground");
}
