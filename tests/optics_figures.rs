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
