//! Bad inputs (zero, negative, NaN, absurd, impossible order) each give their
//! own typed error naming the field and range; nothing panics (fuzzed).

use nightfield::optics::*;
use nightfield::orient::{orientation, MountState};
use proptest::prelude::*;

fn good() -> Train {
    Train {
        name: String::new(),
        instrument: Instrument::Telescope(Telescope {
            design: Design::Refractor,
            aperture_mm: 80.0,
            focal_length_mm: 600.0,
            obstruction_mm: 0.0,
            mirror_reflectivity: 0.9,
            glass_transmission: 0.95,
        }),
        accessories: vec![Accessory::Eyepiece(presets::eyepiece(25.0, 52.0))],
        mount: Mount::AltAz,
    }
}

fn tel(t: &mut Train) -> &mut Telescope {
    match &mut t.instrument {
        Instrument::Telescope(x) => x,
        _ => unreachable!(),
    }
}
fn eyep(t: &mut Train) -> &mut Eyepiece {
    t.accessories
        .iter_mut()
        .find_map(|a| match a {
            Accessory::Eyepiece(e) => Some(e),
            _ => None,
        })
        .unwrap()
}

fn out_of_range(e: OpticsError, want_field: &str) {
    match &e {
        OpticsError::OutOfRange { field, .. } => assert_eq!(field, want_field, "{e}"),
        other => panic!("expected OutOfRange for {want_field}, got {other:?}"),
    }
    let text = e.to_string();
    assert!(text.contains(want_field) && text.contains("must be between"), "{text}");
}

#[test]
fn each_bad_number_names_its_field() {
    let cases: Vec<(&str, Box<dyn Fn(&mut Train)>)> = vec![
        ("instrument.aperture_mm", Box::new(|t| tel(t).aperture_mm = 0.0)),
        ("instrument.aperture_mm", Box::new(|t| tel(t).aperture_mm = f64::NAN)),
        ("instrument.focal_length_mm", Box::new(|t| tel(t).focal_length_mm = -600.0)),
        ("instrument.focal_length_mm", Box::new(|t| tel(t).focal_length_mm = f64::INFINITY)),
        ("instrument.obstruction_mm", Box::new(|t| tel(t).obstruction_mm = 80.0)),
        ("instrument.mirror_reflectivity", Box::new(|t| tel(t).mirror_reflectivity = 1.5)),
        ("accessories[0].focal_length_mm", Box::new(|t| eyep(t).focal_length_mm = 0.0)),
        ("accessories[0].focal_length_mm", Box::new(|t| eyep(t).focal_length_mm = f64::NAN)),
        ("accessories[0].apparent_field_deg", Box::new(|t| eyep(t).apparent_field_deg = 10.0)),
        ("accessories[0].apparent_field_deg", Box::new(|t| eyep(t).apparent_field_deg = 150.0)),
        ("accessories[0].eye_relief_mm", Box::new(|t| eyep(t).eye_relief_mm = Some(-3.0))),
        ("accessories[0].field_stop_mm", Box::new(|t| eyep(t).field_stop_mm = Some(0.0))),
    ];
    for (field, f) in cases {
        let mut t = good();
        f(&mut t);
        out_of_range(figures(&t).unwrap_err(), field);
        out_of_range(orientation(&t, &MountState::default()).unwrap_err(), field);
    }
    // Focal ratio 600 / 10000 = 0.06: absurd.
    let mut t = good();
    tel(&mut t).aperture_mm = 1900.0;
    tel(&mut t).focal_length_mm = 100.0;
    assert!(figures(&t).unwrap_err().to_string().contains("focal_ratio"));
    let text = {
        let mut t = good();
        eyep(&mut t).apparent_field_deg = 10.0;
        figures(&t).unwrap_err().to_string()
    };
    assert!(text.contains("between 20 and 120°"), "{text}");
}

#[test]
fn accessory_numbers() {
    let with = |a: Accessory| {
        let mut t = good();
        t.accessories.insert(0, a);
        figures(&t).unwrap_err()
    };
    let m = |factor| FocalModifier { factor, lens_focal_length_mm: None, extra_spacing_mm: 0.0, transmission: 0.96 };
    out_of_range(with(Accessory::Barlow(m(0.5))), "accessories[0].factor");
    out_of_range(with(Accessory::Reducer(m(1.5))), "accessories[0].factor");
    out_of_range(with(Accessory::Filter(Filter { filter: FilterKind::Neutral, transmission: 0.0 })), "accessories[0].transmission");
    out_of_range(with(Accessory::Filter(Filter { filter: FilterKind::Neutral, transmission: 2.0 })), "accessories[0].transmission");
    out_of_range(
        with(Accessory::StarDiagonal(StarDiagonal { prism: DiagonalKind::Mirror90, rotation_deg: f64::NAN, transmission: None })),
        "accessories[0].rotation_deg",
    );
    // Spacing without the lens's focal length cannot give a real factor.
    let e = with(Accessory::Barlow(FocalModifier { extra_spacing_mm: 30.0, ..m(2.0) }));
    assert!(matches!(e, OpticsError::MissingField { .. }), "{e:?}");
    // A reducer moved so far that its factor would collapse.
    let e = with(Accessory::Reducer(FocalModifier { lens_focal_length_mm: Some(100.0), extra_spacing_mm: 90.0, ..m(0.63) }));
    assert!(matches!(e, OpticsError::RealFactorOutOfRange { .. }) && e.to_string().contains("accessories[0].extra_spacing_mm"), "{e}");
}

#[test]
fn field_stop_wider_than_barrel() {
    let mut t = good();
    eyep(&mut t).field_stop_mm = Some(35.0);
    let e = figures(&t).unwrap_err();
    assert!(matches!(e, OpticsError::FieldStopTooWide { max_mm, .. } if max_mm == 27.0), "{e:?}");
    assert!(e.to_string().contains("1.25″"));
    eyep(&mut t).barrel = Barrel::In2;
    figures(&t).unwrap();
}

#[test]
fn camera_and_phone_numbers() {
    let cam = Camera { sensor_width_mm: 23.5, sensor_height_mm: 15.6, pixel_pitch_um: 3.9, pixels_x: 6000, pixels_y: 4000, rotation_deg: 0.0, row_order: RowOrder::TopDown };
    let with_cam = |c: Camera| {
        let mut t = good();
        t.accessories = vec![Accessory::Camera(c)];
        figures(&t)
    };
    with_cam(cam.clone()).unwrap();
    out_of_range(with_cam(Camera { pixel_pitch_um: 0.0, ..cam.clone() }).unwrap_err(), "accessories[0].pixel_pitch_um");
    out_of_range(with_cam(Camera { pixels_x: 0, ..cam.clone() }).unwrap_err(), "accessories[0].pixels_x");
    out_of_range(with_cam(Camera { sensor_height_mm: -1.0, ..cam.clone() }).unwrap_err(), "accessories[0].sensor_height_mm");
    let e = with_cam(Camera { sensor_width_mm: 36.0, ..cam.clone() }).unwrap_err();
    assert!(matches!(e, OpticsError::SensorMismatch { .. }) && e.to_string().contains("sensor_width_mm"), "{e}");
    let mut t = good();
    t.accessories.push(Accessory::Phone(Phone { lens_focal_length_mm: 0.0, pixel_pitch_um: None, rotation_deg: 0.0 }));
    out_of_range(figures(&t).unwrap_err(), "accessories[1].lens_focal_length_mm");
}

#[test]
fn impossible_light_paths() {
    let ep = || Accessory::Eyepiece(presets::eyepiece(25.0, 52.0));
    let diag = || Accessory::StarDiagonal(StarDiagonal { prism: DiagonalKind::Mirror90, rotation_deg: 0.0, transmission: None });
    let cam = || Accessory::Camera(Camera { sensor_width_mm: 10.0, sensor_height_mm: 10.0, pixel_pitch_um: 5.0, pixels_x: 2000, pixels_y: 2000, rotation_deg: 0.0, row_order: RowOrder::TopDown });
    let phone = || Accessory::Phone(Phone { lens_focal_length_mm: 4.0, pixel_pitch_um: None, rotation_deg: 0.0 });
    let solar = || Accessory::Filter(Filter { filter: FilterKind::Solar, transmission: 1e-5 });
    let mut t = good();
    t.accessories = vec![];
    assert_eq!(figures(&t).unwrap_err(), OpticsError::NothingAtFocus);
    t.accessories = vec![ep(), ep()];
    assert!(matches!(figures(&t).unwrap_err(), OpticsError::WrongPlace { index: 1, .. }));
    t.accessories = vec![diag(), diag(), ep()];
    assert_eq!(figures(&t).unwrap_err(), OpticsError::Duplicate { accessory: "star diagonal" });
    t.accessories = vec![phone(), ep()];
    assert!(matches!(figures(&t).unwrap_err(), OpticsError::WrongPlace { index: 0, accessory: "phone", .. }));
    t.accessories = vec![ep(), diag()];
    assert!(matches!(figures(&t).unwrap_err(), OpticsError::WrongPlace { index: 1, .. }));
    t.accessories = vec![cam(), ep()];
    assert!(matches!(figures(&t).unwrap_err(), OpticsError::WrongPlace { index: 1, .. }));
    t.accessories = vec![ep(), solar()];
    let e = figures(&t).unwrap_err();
    assert!(e.to_string().contains("solar filter must cover the front"), "{e}");
    t.accessories = vec![solar(), ep()];
    assert!(figures(&t).unwrap().advice[0].contains("solar filter"));
    // A prime-focus camera takes no eyepiece or diagonal.
    tel(&mut t).design = Design::PrimeFocus;
    t.accessories = vec![ep()];
    assert!(matches!(figures(&t).unwrap_err(), OpticsError::NotAllowed { instrument: "a prime-focus camera", .. }));
    // Binoculars take no eyepiece or diagonal, and need some field.
    let mut b = presets::presets().into_iter().find(|p| p.id == "binoculars_10x50").unwrap().train;
    b.accessories = vec![diag()];
    assert!(matches!(figures(&b).unwrap_err(), OpticsError::NotAllowed { instrument: "binoculars", .. }));
    b.accessories = vec![];
    if let Instrument::Binoculars(x) = &mut b.instrument {
        x.true_field_deg = None;
    }
    assert!(matches!(figures(&b).unwrap_err(), OpticsError::MissingField { .. }));
    // The naked eye takes no phone.
    let mut n = presets::presets()[0].train.clone();
    n.accessories = vec![phone()];
    assert!(matches!(figures(&n).unwrap_err(), OpticsError::NotAllowed { .. }));
}

#[test]
fn bad_mount_state_and_conditions() {
    let t = good();
    for (st, field) in [
        (MountState { alt_rad: f64::NAN, ..Default::default() }, "mount_state.alt_rad"),
        (MountState { alt_rad: 2.0, ..Default::default() }, "mount_state.alt_rad"),
        (MountState { parallactic_rad: f64::INFINITY, ..Default::default() }, "mount_state.parallactic_rad"),
        (MountState { user_rotation_rad: 1e9, ..Default::default() }, "mount_state.user_rotation_rad"),
    ] {
        out_of_range(orientation(&t, &st).unwrap_err(), field);
    }
    let c = Conditions { eye_pupil_mm: 0.0, ..Default::default() };
    out_of_range(figures_for(&t, &c).unwrap_err(), "conditions.eye_pupil_mm");
    let c = Conditions { seeing_arcsec: f64::NAN, ..Default::default() };
    out_of_range(figures_for(&t, &c).unwrap_err(), "conditions.seeing_arcsec");
}

fn wild() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(0.0),
        Just(-1.0),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(1e300),
        Just(f64::MIN_POSITIVE),
        -1e4f64..1e5,
        any::<f64>(),
    ]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    /// Any numbers at all: an error or figures, never a panic; figures are finite.
    #[test]
    fn fuzz_numbers_never_panic(
        d in wild(), f in wild(), obs in wild(), fe in wild(), afov in wild(), stop in wild(),
        barlow in wild(), spacing in wild(), pitch in wild(), q in wild(), h in wild(), rot in wild(),
        kind in 0usize..4, nx in any::<u32>(),
    ) {
        let design = [Design::Refractor, Design::Newtonian { focuser_angle_deg: rot }, Design::MaksutovCassegrain, Design::Nasmyth { port: Port::Right }][kind].clone();
        let mut acc = vec![
            Accessory::StarDiagonal(StarDiagonal { prism: DiagonalKind::ErectingRoof90, rotation_deg: rot, transmission: None }),
            Accessory::Barlow(FocalModifier { factor: barlow, lens_focal_length_mm: Some(100.0), extra_spacing_mm: spacing, transmission: 0.96 }),
        ];
        if kind % 2 == 0 {
            acc.push(Accessory::Eyepiece(Eyepiece { focal_length_mm: fe, apparent_field_deg: afov, field_stop_mm: Some(stop), eye_relief_mm: None, barrel: Barrel::In2, transmission: 0.95 }));
        } else {
            acc.push(Accessory::Camera(Camera { sensor_width_mm: pitch * nx as f64 / 1000.0, sensor_height_mm: 10.0, pixel_pitch_um: pitch, pixels_x: nx, pixels_y: 2000, rotation_deg: rot, row_order: RowOrder::BottomUp }));
        }
        let t = Train { name: String::new(), instrument: Instrument::Telescope(Telescope { design, aperture_mm: d, focal_length_mm: f, obstruction_mm: obs, mirror_reflectivity: 0.9, glass_transmission: 0.95 }), accessories: acc, mount: Mount::AltAz };
        if let Ok(fig) = figures(&t) {
            prop_assert!(fig.true_field_rad.is_finite() && fig.true_field_rad > 0.0);
            prop_assert!(fig.limiting_mag.is_finite() && fig.transmission > 0.0);
        }
        if let Ok(m) = orientation(&t, &MountState { parallactic_rad: q, alt_rad: h, ..Default::default() }) {
            prop_assert!(m.m.is_finite());
        }
    }

    /// Arbitrary text as a train (as from a link or a kit file): parse errors, never a panic.
    #[test]
    fn fuzz_json_never_panics(s in ".{0,200}", cut in 0usize..400) {
        let _ = serde_json::from_str::<Train>(&s);
        let j = serde_json::to_string(&presets::presets()[4].train).unwrap();
        let cut = cut.min(j.len());
        if let Ok(t) = serde_json::from_str::<Train>(&j[..cut]) {
            let _ = figures(&t);
        }
    }
}
