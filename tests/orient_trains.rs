//! Orientation per train, tested physically: an asymmetric "F" of sky points
//! is traced ray by ray through each train's fold geometry, and the arms'
//! landing directions on screen are checked against facts of the trade
//! (common practice): the naked eye and binoculars show the sky as it is; a
//! refractor or Cassegrain looked through straight shows it turned 180°; a
//! Newtonian keeps the sky's handedness, turned by an angle set by its
//! focuser; a mirror diagonal shows a mirror image; an erecting prism shows
//! it upright and unreversed.

use glam::DVec2;
use nightfield::optics::*;
use nightfield::orient::*;

fn tel(design: Design, acc: Vec<Accessory>, mount: Mount) -> Train {
    Train {
        name: String::new(),
        instrument: Instrument::Telescope(Telescope {
            design,
            aperture_mm: 100.0,
            focal_length_mm: 1000.0,
            obstruction_mm: 0.0,
            mirror_reflectivity: 0.9,
            glass_transmission: 0.95,
        }),
        accessories: acc,
        mount,
    }
}
fn ep() -> Accessory {
    Accessory::Eyepiece(presets::eyepiece(25.0, 52.0))
}
fn diag(k: DiagonalKind, r: f64) -> Accessory {
    Accessory::StarDiagonal(StarDiagonal { prism: k, rotation_deg: r, transmission: None })
}
fn camera(rot: f64, rows: RowOrder) -> Accessory {
    Accessory::Camera(Camera {
        sensor_width_mm: 23.5,
        sensor_height_mm: 15.6,
        pixel_pitch_um: 3.9,
        pixels_x: 6000,
        pixels_y: 4000,
        rotation_deg: rot,
        row_order: rows,
    })
}
fn naked() -> Train {
    presets::presets().into_iter().find(|p| p.id == "naked_eye").unwrap().train
}
fn binoculars() -> Train {
    presets::presets().into_iter().find(|p| p.id == "binoculars_10x50").unwrap().train
}
fn finder(erecting: bool) -> Train {
    Train {
        name: String::new(),
        instrument: Instrument::Finder(Finder { aperture_mm: 50.0, magnification: 8.0, true_field_deg: 5.0, erecting, transmission: 0.85 }),
        accessories: vec![],
        mount: Mount::AltAz,
    }
}

/// Where the F's stem (north) and top arm (east) point on screen, as unit vectors.
struct FLanding {
    stem: DVec2,
    arm: DVec2,
    middle: DVec2,
}

/// An "F" of sky points, 1° tall: stem from the origin north, a top arm east, a
/// shorter middle arm east. Traced as separate rays (finite angles), not via the matrix.
fn trace_f(train: &Train, st: &MountState) -> FLanding {
    let d = 1f64.to_radians();
    let sky = [
        DVec2::new(0.0, 0.0),
        DVec2::new(0.0, d),
        DVec2::new(0.5 * d, d),
        DVec2::new(0.0, 0.5 * d),
        DVec2::new(0.35 * d, 0.5 * d),
    ];
    let g = geometry(train, st).unwrap();
    let s = g.trace(&sky);
    FLanding {
        stem: (s[1] - s[0]).normalize(),
        arm: (s[2] - s[1]).normalize(),
        middle: (s[4] - s[3]).normalize(),
    }
}

const UP: DVec2 = DVec2::new(0.0, 1.0);
const DOWN: DVec2 = DVec2::new(0.0, -1.0);
const LEFT: DVec2 = DVec2::new(-1.0, 0.0);
const RIGHT: DVec2 = DVec2::new(1.0, 0.0);

fn near(a: DVec2, b: DVec2) -> bool {
    (a - b).length() < 0.02
}

/// Target on the meridian-like geometry where zenith and north coincide on the
/// sky (q = 0), at altitude 40°: "up toward the zenith" is also "north".
fn st0() -> MountState {
    MountState { parallactic_rad: 0.0, alt_rad: 40f64.to_radians(), ..Default::default() }
}

#[test]
fn naked_eye_and_binoculars_show_the_sky_as_it_is() {
    for t in [naked(), binoculars(), finder(true)] {
        let f = trace_f(&t, &st0());
        assert!(near(f.stem, UP) && near(f.arm, LEFT) && near(f.middle, LEFT), "{}", t.name);
        // And at any parallactic angle: equal to the naked-eye view (zenith up).
        for q in [-2.0, -0.4, 0.9, 2.5] {
            let st = MountState { parallactic_rad: q, alt_rad: 0.5, ..Default::default() };
            let m = orientation(&t, &st).unwrap().m;
            assert!(m.abs_diff_eq(naked_eye_view(q).m, 1e-12), "{m:?}");
        }
    }
    let d = describe(&orientation(&naked(), &st0()).unwrap(), 0.0);
    assert!(d.text.starts_with("upright"), "{}", d.text);
}

#[test]
fn straight_refractor_and_cassegrains_turn_the_sky_180() {
    for design in [Design::Refractor, Design::ClassicalCassegrain, Design::SchmidtCassegrain, Design::MaksutovCassegrain] {
        let t = tel(design, vec![ep()], Mount::AltAz);
        let f = trace_f(&t, &st0());
        assert!(near(f.stem, DOWN) && near(f.arm, RIGHT), "{:?}", t.instrument);
        let d = describe(&orientation(&t, &st0()).unwrap(), 0.0);
        assert!(d.text.starts_with("upside down"), "{}", d.text);
    }
    let f = trace_f(&finder(false), &st0());
    assert!(near(f.stem, DOWN) && near(f.arm, RIGHT));
}

#[test]
fn mirror_or_prism_diagonal_gives_a_mirror_image() {
    for design in [Design::Refractor, Design::SchmidtCassegrain, Design::MaksutovCassegrain] {
        for k in [DiagonalKind::Mirror90, DiagonalKind::Prism90] {
            // Eyepiece end pointing up: correct top-to-bottom, reversed left–right.
            let t = tel(design.clone(), vec![diag(k, 0.0), ep()], Mount::AltAz);
            let f = trace_f(&t, &st0());
            assert!(near(f.stem, UP) && near(f.arm, RIGHT), "{design:?} {k:?}");
            let m = orientation(&t, &st0()).unwrap();
            assert!(m.is_mirrored());
            assert!(describe(&m, 0.0).text.starts_with("mirror-reversed left–right"));
            // Any rotation of the diagonal keeps it a mirror image.
            for r in [37.0, 90.0, -120.0] {
                let t = tel(design.clone(), vec![diag(k, r), ep()], Mount::AltAz);
                let f = trace_f(&t, &st0());
                assert!(f.stem.perp_dot(f.arm) < -0.99, "mirrored: arm clockwise of stem");
            }
        }
    }
}

#[test]
fn erecting_prism_shows_it_upright_and_unreversed() {
    for k in [DiagonalKind::ErectingRoof90, DiagonalKind::ErectingRoof45] {
        for alt in [10.0f64, 40.0, 75.0] {
            let st = MountState { parallactic_rad: 0.0, alt_rad: alt.to_radians(), ..Default::default() };
            let t = tel(Design::Refractor, vec![diag(k, 0.0), ep()], Mount::AltAz);
            let f = trace_f(&t, &st);
            assert!(near(f.stem, UP) && near(f.arm, LEFT), "{k:?} alt {alt}");
        }
    }
}

#[test]
fn newtonian_keeps_handedness_turned_by_focuser_position() {
    let base = |a: f64| tel(Design::Newtonian { focuser_angle_deg: a }, vec![ep()], Mount::AltAz);
    let rot = |a: f64| describe(&orientation(&base(a), &st0()).unwrap(), 0.0).rotation_deg;
    for a in [0.0, 30.0, 45.0, 90.0, 135.0, 180.0, 270.0] {
        let f = trace_f(&base(a), &st0());
        // Unmirrored: the arm points 90° anticlockwise of the stem, as on the sky seen directly.
        assert!(f.stem.perp_dot(f.arm) > 0.99, "focuser {a}");
        assert!(!orientation(&base(a), &st0()).unwrap().is_mirrored());
    }
    // Focuser on top, observer looking down into it: turned 180° like a refractor.
    let f = trace_f(&base(0.0), &st0());
    assert!(near(f.stem, DOWN), "{:?}", f.stem);
    // The turn depends on where the focuser sits: 45° round the tube differs from the top.
    let spread = [0.0, 45.0, 90.0].map(rot);
    assert!((spread[0] - spread[1]).abs() > 1.0 && (spread[1] - spread[2]).abs() > 1.0, "{spread:?}");
    // Focuser on the side (horizontal line of sight): the tube's sky end, seen from the
    // side, is tilted by the altitude, so the turn is 180° − altitude.
    for h in [5.0f64, 40.0, 70.0] {
        let st = MountState { parallactic_rad: 0.0, alt_rad: h.to_radians(), ..Default::default() };
        let r = describe(&orientation(&base(90.0), &st).unwrap(), 0.0).rotation_deg;
        assert!((r.abs() - (180.0 - h)).abs() < 1e-6, "{h} {r}");
    }
}

#[test]
fn camera_on_equatorial_refractor_shows_north_up_east_left_and_flip_turns_180() {
    let st = MountState { parallactic_rad: 0.8, alt_rad: 0.6, ..Default::default() };
    let t = tel(Design::Refractor, vec![camera(0.0, RowOrder::TopDown)], Mount::Equatorial { pier_side: PierSide::West });
    let f = trace_f(&t, &st);
    assert!(near(f.stem, UP) && near(f.arm, LEFT));
    // Independent of the parallactic angle: an equatorial mount does not rotate the field.
    let m1 = orientation(&t, &st).unwrap().m;
    let m2 = orientation(&t, &MountState { parallactic_rad: -1.3, ..st }).unwrap().m;
    assert!(m1.abs_diff_eq(SkyToScreen::chart().m, 1e-12) && m2.abs_diff_eq(m1, 1e-12));
    // A meridian flip turns the image 180°.
    let flipped = orientation(&t, &MountState { pier_side: Some(PierSide::East), ..st }).unwrap().m;
    assert!(flipped.abs_diff_eq(-m1, 1e-12));
    // Camera rotation 90° toward the tube's left (east here): the sensor top sits at PA 90°,
    // so east is up on the picture.
    let t90 = tel(Design::Refractor, vec![camera(90.0, RowOrder::TopDown)], Mount::Equatorial { pier_side: PierSide::West });
    let f = trace_f(&t90, &st);
    assert!(near(f.arm, UP), "{:?}", f.arm);
    // A bottom-up file shown top-down is flipped vertically: a mirror image.
    let tb = tel(Design::Refractor, vec![camera(0.0, RowOrder::BottomUp)], Mount::Equatorial { pier_side: PierSide::West });
    let f = trace_f(&tb, &st);
    assert!(near(f.stem, DOWN) && near(f.arm, LEFT));
}

#[test]
fn prime_focus_camera_is_mirrored_newtonian_camera_is_not() {
    let st = st0();
    let eq = Mount::Equatorial { pier_side: PierSide::West };
    let p = orientation(&tel(Design::PrimeFocus, vec![camera(0.0, RowOrder::TopDown)], eq), &st).unwrap();
    assert!(p.is_mirrored()); // one reflection
    let n = orientation(&tel(Design::Newtonian { focuser_angle_deg: 90.0 }, vec![camera(0.0, RowOrder::TopDown)], eq), &st).unwrap();
    assert!(!n.is_mirrored()); // two reflections
}

#[test]
fn altaz_camera_field_rotates_with_parallactic_angle() {
    let t = tel(Design::SchmidtCassegrain, vec![camera(0.0, RowOrder::TopDown)], Mount::AltAz);
    let pa_of_north = |q: f64| {
        let m = orientation(&t, &MountState { parallactic_rad: q, alt_rad: 0.5, ..Default::default() }).unwrap();
        let n = m.apply(DVec2::Y);
        libm::atan2(-n.x, n.y)
    };
    // Field rotation: north turns on the picture one-for-one with q.
    let d = pa_of_north(0.5) - pa_of_north(0.2);
    assert!((d.abs() - 0.3).abs() < 1e-9, "{d}");
}

#[test]
fn nasmyth_turns_by_parallactic_plus_or_minus_altitude() {
    for port in [Port::Left, Port::Right] {
        let t = tel(Design::Nasmyth { port }, vec![ep()], Mount::AltAz);
        let ang = |q: f64, h: f64| {
            let m = orientation(&t, &MountState { parallactic_rad: q, alt_rad: h, ..Default::default() }).unwrap();
            assert!(m.is_mirrored()); // three reflections
            let n = m.apply(DVec2::Y);
            libm::atan2(-n.x, n.y)
        };
        let wrap = |x: f64| (x + std::f64::consts::PI).rem_euclid(2.0 * std::f64::consts::PI) - std::f64::consts::PI;
        let dq = wrap(ang(0.4, 0.3) - ang(0.1, 0.3));
        let dh = wrap(ang(0.1, 0.6) - ang(0.1, 0.3));
        assert!((dq.abs() - 0.3).abs() < 1e-9 && (dh.abs() - 0.3).abs() < 1e-9, "{port:?} {dq} {dh}");
    }
    let sense = |port| {
        let t = tel(Design::Nasmyth { port }, vec![ep()], Mount::AltAz);
        let a = |h: f64| {
            let n = orientation(&t, &MountState { parallactic_rad: 0.0, alt_rad: h, ..Default::default() }).unwrap().apply(DVec2::Y);
            libm::atan2(-n.x, n.y)
        };
        (a(0.4) - a(0.3)).signum()
    };
    assert_ne!(sense(Port::Left), sense(Port::Right));
}

#[test]
fn trace_agrees_with_linear_transform_for_small_offsets() {
    let t = tel(Design::Newtonian { focuser_angle_deg: 63.0 }, vec![ep()], Mount::AltAz);
    let st = MountState { parallactic_rad: 1.1, alt_rad: 0.9, user_rotation_rad: 0.2, ..Default::default() };
    let g = geometry(&t, &st).unwrap();
    let m = g.transform();
    let p = DVec2::new(1e-4, -2e-4);
    let s = g.trace(&[DVec2::ZERO, p]);
    assert!((s[1] - s[0] - m.apply(p)).length() < 1e-10);
}

#[test]
fn parallactic_angle_is_the_zenith_position_angle() {
    // Meeus, Astronomical Algorithms (1998) eq. 14.1: tan q = sin H / (tan φ cos δ − sin δ cos H).
    // Check our reading of q (position angle of the zenith, north through east) by
    // building the sphere directly in the horizon frame.
    use glam::DVec3;
    for (lat, ha, dec) in [(0.8f64, 0.7f64, 0.3f64), (0.8, -1.2, -0.2), (-0.6, 0.4, 0.1)] {
        let q = libm::atan2(libm::sin(ha), libm::tan(lat) * libm::cos(dec) - libm::sin(dec) * libm::cos(ha));
        // Equatorial unit vector of the target and the pole in (east, north, up).
        let (sl, cl) = (libm::sin(lat), libm::cos(lat));
        let eq_to_h = |x: f64, y: f64, z: f64| DVec3::new(-y, -x * sl + z * cl, x * cl + z * sl);
        let x = libm::cos(dec) * libm::cos(ha);
        let y = libm::cos(dec) * libm::sin(ha);
        let z = libm::sin(dec);
        let t = eq_to_h(x, y, z);
        let pole = eq_to_h(0.0, 0.0, 1.0);
        let north = (pole - pole.dot(t) * t).normalize();
        let east = north.cross(t);
        let zen = DVec3::Z - t.z * t;
        let pa = libm::atan2(zen.dot(east), zen.dot(north));
        assert!((pa - q).abs() < 1e-12, "{pa} {q}");
        // The sky core's routine (ERFA eraHd2pa) follows the same convention.
        let sky_q = nightfield::sky::horizon::parallactic_angle_rad(ha, dec, lat);
        assert!((sky_q - q).abs() < 1e-12, "{sky_q} {q}");
    }
}

#[test]
fn report_carries_transform_words_and_marks() {
    let t = tel(Design::Refractor, vec![diag(DiagonalKind::Mirror90, 0.0), ep()], Mount::AltAz);
    let st = st0();
    let r = report(&t, &st).unwrap();
    assert_eq!(r.reflections, 1);
    assert_eq!(r.m, orientation(&t, &st).unwrap().m.to_cols_array());
    assert!(r.description.mirrored && r.description.text.contains("zenith at top"));
    // Mirror diagonal pointing up, q = 0: zenith and north up, east to the right.
    let mk = r.description.marks;
    assert!((mk.zenith[1] - 1.0).abs() < 1e-9 && (mk.north[1] - 1.0).abs() < 1e-9 && (mk.east[0] - 1.0).abs() < 1e-9);
    let json = serde_json::to_string(&r).unwrap();
    assert!(json.contains("\"text\""));
}

#[test]
fn coude_image_turns_with_hour_angle() {
    // A coudé beam comes down the polar axis to a fixed observer: the whole
    // optical assembly turns about that axis with the hour angle, so the image
    // turns one-for-one with it (equatorial tracking keeps the sky fixed in the tube).
    let t = tel(Design::Coude, vec![ep()], Mount::Equatorial { pier_side: PierSide::West });
    let (lat, dec) = (0.8f64, 0.3f64);
    let north_angle = |ha: f64| {
        let q = nightfield::sky::horizon::parallactic_angle_rad(ha, dec, lat);
        let h = (lat.sin() * dec.sin() + lat.cos() * dec.cos() * ha.cos()).asin();
        let st = MountState { parallactic_rad: q, alt_rad: h, dec_rad: Some(dec), ..Default::default() };
        let m = orientation(&t, &st).unwrap();
        assert!(!m.is_mirrored()); // four reflections
        let n = m.apply(DVec2::Y);
        libm::atan2(-n.x, n.y)
    };
    for (a, b) in [(-1.0, -0.6), (0.1, 0.5), (1.2, 2.0)] {
        let d = (north_angle(b) - north_angle(a) + 3.0 * std::f64::consts::PI).rem_euclid(2.0 * std::f64::consts::PI) - std::f64::consts::PI;
        assert!((d.abs() - (b - a)).abs() < 1e-9, "{a} {b} {d}");
    }
    // Without the declination, or on an alt-az mount, it says what is missing.
    let st = MountState { parallactic_rad: 0.2, alt_rad: 0.5, ..Default::default() };
    assert!(matches!(orientation(&t, &st), Err(OpticsError::MissingField { .. })));
    let alt = tel(Design::Coude, vec![ep()], Mount::AltAz);
    assert!(matches!(orientation(&alt, &st), Err(OpticsError::Incompatible { .. })));
}
