//! Figures of optical trains against facts of the trade and handbook formulas.

use nightfield::optics::*;

fn telescope(design: Design, d: f64, f: f64, acc: Vec<Accessory>) -> Train {
    Train {
        name: String::new(),
        instrument: Instrument::Telescope(Telescope {
            design,
            aperture_mm: d,
            focal_length_mm: f,
            obstruction_mm: 0.0,
            mirror_reflectivity: 0.9,
            glass_transmission: 0.95,
        }),
        accessories: acc,
        mount: Mount::AltAz,
    }
}

fn ep(f: f64, afov: f64, stop: Option<f64>) -> Accessory {
    Accessory::Eyepiece(Eyepiece {
        focal_length_mm: f,
        apparent_field_deg: afov,
        field_stop_mm: stop,
        eye_relief_mm: None,
        barrel: Barrel::In125,
        transmission: 0.95,
    })
}

#[test]
fn focal_ratio_85_600_is_f7() {
    // Common practice: 85 mm aperture, 600 mm focal length is f/7 (7.06).
    let f = figures(&telescope(Design::Refractor, 85.0, 600.0, vec![ep(25.0, 52.0, None)])).unwrap();
    let n = f.focal_ratio.unwrap();
    assert!((n - 7.06).abs() < 0.005, "{n}");
}

#[test]
fn magnification_600_with_3_7_is_about_162() {
    // Common practice: 600 mm with a 3.7 mm eyepiece gives about 162×.
    let f = figures(&telescope(Design::Refractor, 85.0, 600.0, vec![ep(3.7, 60.0, None)])).unwrap();
    let m = f.magnification.unwrap();
    assert!((m - 162.0).abs() < 0.5, "{m}");
    // Exit pupil D / M (definition): 85 / 162.2 = 0.524 mm.
    assert!((f.exit_pupil_mm.unwrap() - 85.0 / (600.0 / 3.7)).abs() < 1e-12);
}

#[test]
fn true_field_from_field_stop_and_from_apparent_field() {
    // Handbook: true field (deg) = 57.3 × field stop / focal length; 27 mm on 1200 mm = 1.289°.
    let f = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(32.0, 52.0, Some(27.0))])).unwrap();
    assert_eq!(f.true_field_method, TrueFieldMethod::FieldStop);
    assert!((f.true_field_rad.to_degrees() - 57.2958 * 27.0 / 1200.0).abs() < 1e-4);
    // Simple rule: apparent field ÷ magnification: 52° / 48× = 1.083°.
    let g = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(25.0, 52.0, None)])).unwrap();
    assert_eq!(g.true_field_method, TrueFieldMethod::ApparentOverMagnification);
    assert!((g.true_field_rad.to_degrees() - 52.0 / 48.0).abs() < 1e-9);
    assert!(g.advice.iter().any(|a| a.contains("overstates")));
}

fn cam(pitch: f64, nx: u32, ny: u32) -> Accessory {
    Accessory::Camera(Camera {
        sensor_width_mm: pitch * nx as f64 / 1000.0,
        sensor_height_mm: pitch * ny as f64 / 1000.0,
        pixel_pitch_um: pitch,
        pixels_x: nx,
        pixels_y: ny,
        rotation_deg: 0.0,
        row_order: RowOrder::TopDown,
    })
}

#[test]
fn resolution_dawes_and_rayleigh() {
    // Dawes (1867): 116″ / D(mm); 100 mm gives 1.16″.
    // Rayleigh: 1.22 λ / D with λ = 550 nm: 1.22 × 550e-9 / 0.1 m = 6.71e-6 rad = 1.384″.
    let f = figures(&telescope(Design::Refractor, 100.0, 900.0, vec![ep(25.0, 52.0, None)])).unwrap();
    assert!((f.dawes_arcsec - 1.16).abs() < 1e-12);
    assert!((f.rayleigh_arcsec - 1.384).abs() < 0.001, "{}", f.rayleigh_arcsec);
}

#[test]
fn plate_scale_pixel_scale_and_sensor_field() {
    // Plate scale 206 265″ / f: 1000 mm gives 206.265″/mm; 3.76 µm pixels give 0.7756″/px.
    let f = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1000.0, vec![cam(3.76, 4000, 3000)])).unwrap();
    assert_eq!(f.mode, Mode::Camera);
    assert!(f.magnification.is_none());
    assert!((f.plate_scale_arcsec_per_mm.unwrap() - 206.265).abs() < 1e-3);
    assert!((f.pixel_scale_arcsec.unwrap() - 0.7756).abs() < 1e-4);
    // Sensor field 2·atan(w / 2f): 15.04 mm × 11.28 mm at 1000 mm.
    let s = f.sensor_field.unwrap();
    assert!((s.width_rad.to_degrees() - 0.8617).abs() < 1e-4, "{}", s.width_rad.to_degrees());
    assert!((s.height_rad.to_degrees() - 0.6463).abs() < 1e-4);
    assert!((s.diagonal_rad.to_degrees() - 1.0771).abs() < 1e-4);
}

#[test]
fn f5_against_f10_half_the_image_quarter_the_exposure() {
    // Common practice: at equal aperture an f/5 system gives an extended object's image
    // half the size of an f/10 system's, four times as bright per unit area: ¼ the exposure.
    let fast = telescope(Design::Refractor, 100.0, 500.0, vec![cam(4.0, 1000, 1000)]);
    let slow = telescope(Design::Refractor, 100.0, 1000.0, vec![cam(4.0, 1000, 1000)]);
    let (a, b) = (figures(&fast).unwrap(), figures(&slow).unwrap());
    assert!((b.plate_scale_arcsec_per_mm.unwrap() / a.plate_scale_arcsec_per_mm.unwrap() - 0.5).abs() < 1e-12);
    assert!((speed_ratio(&fast, &slow).unwrap() - 4.0).abs() < 1e-12);
    assert!((exposure_ratio(&fast, &slow).unwrap() - 0.25).abs() < 1e-12);
}

#[test]
fn transmission_brightness_and_limit() {
    // (1 − 0.25²) · 0.9² · eyepiece 0.95 = 0.7214 for a Newtonian with a 25% obstruction.
    let mut t = telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(40.0, 44.0, None)]);
    if let Instrument::Telescope(tel) = &mut t.instrument {
        tel.obstruction_mm = 50.0;
    }
    let f = figures(&t).unwrap();
    let want_t = (1.0 - 0.0625) * 0.81 * 0.95;
    assert!((f.transmission - want_t).abs() < 1e-12);
    // 30× gives a 6.67 mm exit pupil: brightness T·(6.67/7)², below T.
    let sb = f.surface_brightness_ratio.unwrap();
    assert!((sb - want_t * (200.0 / 30.0 / 7.0f64).powi(2)).abs() < 1e-12 && sb < want_t);
    // Light-grasp scaling: 6.0 + 5·log10(200/7) + 2.5·log10(T).
    assert!((f.limiting_mag - (6.0 + 5.0 * (200.0f64 / 7.0).log10() + 2.5 * want_t.log10())).abs() < 1e-12);
    // Max useful magnification 2×D (common practice), min D / 7 mm.
    assert_eq!(f.max_useful_magnification, 400.0);
    assert!((f.min_useful_magnification - 200.0 / 7.0).abs() < 1e-12);
    // Too low a power: exit pupil over 7 mm, brightness capped at T.
    let low = figures(&telescope(Design::Refractor, 100.0, 400.0, vec![ep(32.0, 52.0, Some(27.0))])).unwrap();
    assert!(low.exit_pupil_mm.unwrap() > 7.0);
    assert!((low.surface_brightness_ratio.unwrap() - low.transmission).abs() < 1e-12);
    assert!(low.advice.iter().any(|a| a.contains("wider than the eye's pupil")), "{:?}", low.advice);
}

#[test]
fn advice_on_high_power_eye_relief_and_sampling() {
    let mut e = Eyepiece { focal_length_mm: 4.0, apparent_field_deg: 52.0, field_stop_mm: None, eye_relief_mm: Some(5.0), barrel: Barrel::In125, transmission: 0.95 };
    let f = figures(&telescope(Design::MaksutovCassegrain, 127.0, 1500.0, vec![Accessory::Eyepiece(e.clone())])).unwrap();
    // 375× on 127 mm: past 254× (2×D) and past the ~200× seeing rule.
    assert!(f.advice.iter().any(|a| a.contains("useful maximum")));
    assert!(f.advice.iter().any(|a| a.contains("rarely improves")));
    assert!(f.advice.iter().any(|a| a.contains("glasses")));
    e.eye_relief_mm = Some(18.0);
    let f = figures(&telescope(Design::MaksutovCassegrain, 127.0, 1500.0, vec![Accessory::Eyepiece(e)])).unwrap();
    assert!(!f.advice.iter().any(|a| a.contains("glasses")));
    // Sampling against 2.5″ seeing: 3.76 µm at 300 mm = 2.59″/px (under), at 3000 mm = 0.26″/px (over).
    let under = figures(&telescope(Design::Refractor, 60.0, 300.0, vec![cam(3.76, 1000, 1000)])).unwrap();
    assert!(under.advice.iter().any(|a| a.contains("under-sampled")), "{:?}", under.advice);
    let over = figures(&telescope(Design::SchmidtCassegrain, 280.0, 2800.0, vec![cam(3.76, 1000, 1000)])).unwrap();
    assert!(over.advice.iter().any(|a| a.contains("over-sampled")));
    let good = figures(&telescope(Design::Refractor, 100.0, 700.0, vec![cam(3.76, 1000, 1000)])).unwrap();
    assert!(!good.advice.iter().any(|a| a.contains("sampled")), "{:?}", good.advice);
}

#[test]
fn barlow_factor_grows_with_distance_and_barrel_limits_field() {
    // Thin lens: a 2× Barlow of 100 mm focal length moved 50 mm further gives 2 + 50/100 = 2.5×.
    let b = Accessory::Barlow(FocalModifier { factor: 2.0, lens_focal_length_mm: Some(100.0), extra_spacing_mm: 50.0, transmission: 0.96 });
    let f = figures(&telescope(Design::Refractor, 80.0, 600.0, vec![b, ep(10.0, 52.0, None)])).unwrap();
    assert!((f.effective_focal_length_mm.unwrap() - 1500.0).abs() < 1e-9);
    assert!((f.magnification.unwrap() - 150.0).abs() < 1e-9);
    assert!(f.advice.iter().any(|a| a.contains("real factor is 2.50")));
    // A reducer's factor shrinks: 0.63× of 200 mm moved 20 mm further gives 0.53×.
    let r = Accessory::Reducer(FocalModifier { factor: 0.63, lens_focal_length_mm: Some(200.0), extra_spacing_mm: 20.0, transmission: 0.96 });
    let f = figures(&telescope(Design::SchmidtCassegrain, 203.0, 2032.0, vec![r, ep(25.0, 52.0, None)])).unwrap();
    assert!((f.modifier_factors[0] - 0.53).abs() < 1e-12);
    // 40 mm × 68° would need a 47 mm stop; a 1.25″ barrel passes about 27 mm.
    let f = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(40.0, 68.0, None)])).unwrap();
    assert_eq!(f.true_field_method, TrueFieldMethod::BarrelLimit);
    assert!((f.true_field_rad - 2.0 * (27.0f64 / 2400.0).atan()).abs() < 1e-12);
}

#[test]
fn binoculars_finder_naked_eye_and_phone() {
    let p = presets::presets();
    let get = |id: &str| p.iter().find(|x| x.id == id).unwrap().train.clone();
    let b = figures(&get("binoculars_10x50")).unwrap();
    assert_eq!(b.exit_pupil_mm, Some(5.0));
    assert_eq!(b.true_field_method, TrueFieldMethod::Stated);
    assert!((b.true_field_rad.to_degrees() - 6.5).abs() < 1e-12);
    let n = figures(&get("naked_eye")).unwrap();
    assert_eq!(n.magnification, Some(1.0));
    // Afocal: 1200/25 = 48×; a 4 mm phone lens acts as 192 mm: 206265/192 = 1074.3″/mm.
    let phone = Accessory::Phone(Phone { lens_focal_length_mm: 4.0, pixel_pitch_um: Some(1.0), rotation_deg: 0.0 });
    let f = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(25.0, 52.0, None), phone])).unwrap();
    assert_eq!(f.mode, Mode::Phone);
    assert!((f.plate_scale_arcsec_per_mm.unwrap() - 206264.806 / 192.0).abs() < 1e-3);
    assert!((f.pixel_scale_arcsec.unwrap() - 206.264806 / 192.0).abs() < 1e-6);
}

#[test]
fn presets_are_valid_and_round_trip_as_snake_case_json() {
    for p in presets::presets() {
        figures(&p.train).unwrap();
        let json = serde_json::to_string(&p.train).unwrap();
        assert!(!json.contains("apertureMm") && json.contains("\"kind\""), "{json}");
        let back: Train = serde_json::from_str(&json).unwrap();
        assert_eq!(back, p.train);
    }
    for (_, e) in presets::eyepieces() {
        figures(&telescope(Design::Refractor, 80.0, 600.0, vec![Accessory::Eyepiece(e)])).unwrap();
    }
    let json = r#"{"instrument":{"kind":"telescope","design":{"type":"newtonian","focuser_angle_deg":45},
        "aperture_mm":200,"focal_length_mm":1200},
        "accessories":[{"kind":"eyepiece","focal_length_mm":25,"apparent_field_deg":52,"barrel":"1.25in"}]}"#;
    let t: Train = serde_json::from_str(json).unwrap();
    assert!((figures(&t).unwrap().magnification.unwrap() - 48.0).abs() < 1e-12);
}

#[test]
fn apparent_field_for_the_field_circle() {
    // Field stop known: the stated apparent field; barrel-limited: true field × magnification.
    let f = figures(&telescope(Design::Refractor, 80.0, 600.0, vec![ep(25.0, 52.0, None)])).unwrap();
    assert!((f.apparent_field_rad.unwrap().to_degrees() - 52.0).abs() < 1e-12);
    let g = figures(&telescope(Design::Newtonian { focuser_angle_deg: 0.0 }, 200.0, 1200.0, vec![ep(40.0, 68.0, None)])).unwrap();
    assert!((g.apparent_field_rad.unwrap() - g.true_field_rad * 30.0).abs() < 1e-12);
    let c = figures(&telescope(Design::Refractor, 80.0, 600.0, vec![cam(4.0, 1000, 1000)])).unwrap();
    assert!(c.apparent_field_rad.is_none());
}
