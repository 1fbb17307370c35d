//! Property tests: over random fold geometries and rotations, the image's
//! parity is the sign of the transform's determinant (odd reflections mirror),
//! the transform stays a rotation or reflection, and the words say the transform.

use glam::{DMat2, DVec2, DVec3};
use nightfield::optics::fold::{LightPath, TubeFrame};
use nightfield::optics::*;
use nightfield::orient::*;
use proptest::prelude::*;

/// Rebuild a transform from the words of `describe` (the inverse of the wording).
fn from_words(text: &str, q: f64) -> DMat2 {
    let mirrored = text.starts_with("mirror-reversed");
    let number = |t: &str| -> f64 {
        let i = t.find("rotated ").map(|i| i + 8);
        match i {
            Some(i) => {
                let rest = &t[i..];
                let end = rest.find('°').unwrap();
                let v: f64 = rest[..end].parse().unwrap();
                if rest[end..].starts_with("° clockwise") {
                    -v
                } else {
                    assert!(rest[end..].starts_with("° anticlockwise"), "{t}");
                    v
                }
            }
            None => 0.0,
        }
    };
    let rot = if text.starts_with("upside down") || text.starts_with("mirror-reversed top–bottom") {
        180.0
    } else {
        assert!(text.starts_with("upright") || text.starts_with("rotated") || text.starts_with("mirror-reversed left–right"), "{text}");
        number(text)
    };
    let flip = if mirrored { DMat2::from_cols_array(&[-1.0, 0.0, 0.0, 1.0]) } else { DMat2::IDENTITY };
    DMat2::from_angle(rot.to_radians()) * flip * naked_eye_view(q).m
}

fn sector_of(v: DVec2) -> f64 {
    libm::atan2(-v.x, v.y).to_degrees().rem_euclid(360.0)
}

fn check_words(m: &SkyToScreen, q: f64) {
    let d = describe(m, q);
    assert_eq!(d.mirrored, m.m.determinant() > 0.0);
    assert_eq!(d.text.contains("mirror"), d.mirrored, "{}", d.text);
    let back = from_words(&d.text, q);
    // Rounded to whole degrees: within half a degree of the transform.
    let err = (back - m.m).to_cols_array().iter().fold(0f64, |a, x| a.max(x.abs()));
    assert!(err < 0.5f64.to_radians() * 1.01, "{} {err}", d.text);
    // "zenith at X": X is the 45° sector holding the zenith's screen direction.
    let z = m.apply(zenith_sky(q));
    let want = direction_words([z.x, z.y]);
    assert!(d.text.contains(&format!("zenith at {want},")), "{} vs {want}", d.text);
    let s = sector_of(z);
    let names = ["top", "upper left", "left", "lower left", "bottom", "lower right", "right", "upper right"];
    let k = names.iter().position(|n| *n == want).unwrap() as f64 * 45.0;
    let off = (s - k + 540.0).rem_euclid(360.0) - 180.0;
    assert!(off.abs() <= 22.5 + 1e-9, "{s} {want}");
}

fn unit(theta: f64, phi: f64) -> DVec3 {
    DVec3::new(libm::cos(phi) * libm::cos(theta), libm::cos(phi) * libm::sin(theta), libm::sin(phi))
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    #[test]
    fn random_folds_parity_is_determinant_sign(
        faces in prop::collection::vec((0.0f64..6.283, -1.5f64..1.5, any::<bool>()), 0..7),
        q in -3.1f64..3.1, h in -0.2f64..1.5,
    ) {
        let st = MountState { parallactic_rad: q, alt_rad: h, ..Default::default() };
        let g = geometry(&presets::presets()[0].train, &st).unwrap();
        let mut path = LightPath::entering(&g.tube);
        for (th, ph, focus) in &faces {
            let n = unit(*th, *ph);
            // A face seen edge-on does not reflect the beam; skip those.
            if n.dot(path.dir).abs() < 0.05 { continue; }
            path.mirror(n);
            if *focus { path.focus(); }
        }
        let k = path.reflections();
        let g = g.with_path(path);
        let m = g.transform();
        let det = m.m.determinant();
        // 3-D: each face has determinant −1, each real image +1.
        let det3_want = if k % 2 == 0 { 1.0 } else { -1.0 };
        prop_assert!((g.path.map.determinant() - det3_want).abs() < 1e-9);
        // 2-D: the naked eye (no reflection) has −1 in the (east, north)→(right, up) convention.
        let want = if k % 2 == 0 { -1.0 } else { 1.0 };
        prop_assert!((det - want).abs() < 1e-9, "k={} det={}", k, det);
        prop_assert!((m.m.transpose() * m.m).abs_diff_eq(DMat2::IDENTITY, 1e-9));
        check_words(&m, q);
    }

    #[test]
    fn random_trains_parity_and_words(
        design in 0usize..8, dec in -1.5f64..1.5, focuser in -180.0f64..180.0, port in any::<bool>(),
        diag_kind in 0usize..5, diag_rot in -180.0f64..180.0,
        end in 0usize..3, end_rot in -180.0f64..180.0, bottom_up in any::<bool>(),
        equatorial in any::<bool>(), east in any::<bool>(),
        q in -3.1f64..3.1, h in -0.1f64..1.56, user in -3.0f64..3.0,
    ) {
        let design = match design {
            0 => Design::Refractor,
            1 => Design::Newtonian { focuser_angle_deg: focuser },
            2 => Design::ClassicalCassegrain,
            3 => Design::SchmidtCassegrain,
            4 => Design::MaksutovCassegrain,
            5 => Design::Nasmyth { port: if port { Port::Left } else { Port::Right } },
            6 => Design::Coude,
            _ => Design::PrimeFocus,
        };
        let prime = design == Design::PrimeFocus;
        let kinds = [DiagonalKind::None, DiagonalKind::Mirror90, DiagonalKind::Prism90, DiagonalKind::ErectingRoof45, DiagonalKind::ErectingRoof90];
        let mut acc = vec![];
        if !prime {
            acc.push(Accessory::StarDiagonal(StarDiagonal { prism: kinds[diag_kind], rotation_deg: diag_rot, transmission: None }));
        }
        let end = if prime { 2 } else { end };
        let cam = end == 2;
        if !cam { acc.push(Accessory::Eyepiece(presets::eyepiece(20.0, 60.0))); }
        if end == 1 { acc.push(Accessory::Phone(Phone { lens_focal_length_mm: 4.0, pixel_pitch_um: None, rotation_deg: end_rot })); }
        if cam {
            acc.push(Accessory::Camera(Camera { sensor_width_mm: 10.0, sensor_height_mm: 8.0, pixel_pitch_um: 5.0, pixels_x: 2000, pixels_y: 1600, rotation_deg: end_rot, row_order: if bottom_up { RowOrder::BottomUp } else { RowOrder::TopDown } }));
        }
        let equatorial = equatorial || design == Design::Coude;
        let mount = if equatorial { Mount::Equatorial { pier_side: if east { PierSide::East } else { PierSide::West } } } else { Mount::AltAz };
        let t = Train { name: String::new(), instrument: Instrument::Telescope(Telescope { design: design.clone(), aperture_mm: 150.0, focal_length_mm: 1200.0, obstruction_mm: 0.0, mirror_reflectivity: 0.9, glass_transmission: 0.95 }), accessories: acc, mount };
        let st = MountState { parallactic_rad: q, alt_rad: h, user_rotation_rad: user, pier_side: None, dec_rad: Some(dec) };
        let m = orientation(&t, &st).unwrap();
        let mut k = reflection_count(&t);
        let expect_k = design.mirror_count() + match kinds[diag_kind] { DiagonalKind::None => 0, DiagonalKind::Mirror90 | DiagonalKind::Prism90 => 1, _ => 2 } * (!prime as u32);
        prop_assert_eq!(k, expect_k);
        if cam && bottom_up { k += 1; }
        let want = if k % 2 == 0 { -1.0 } else { 1.0 };
        prop_assert!((m.m.determinant() - want).abs() < 1e-9);
        prop_assert!((m.m.transpose() * m.m).abs_diff_eq(DMat2::IDENTITY, 1e-9));
        check_words(&m, q);
        // The user's turn turns the picture and nothing else.
        let m0 = orientation(&t, &MountState { user_rotation_rad: 0.0, ..st }).unwrap();
        prop_assert!((DMat2::from_angle(user) * m0.m).abs_diff_eq(m.m, 1e-9));
    }

    #[test]
    fn frame_is_right_handed(q in -3.1f64..3.1, h in -1.5f64..1.5) {
        let g = geometry(&presets::presets()[3].train, &MountState { parallactic_rad: q, alt_rad: h, ..Default::default() }).unwrap();
        let t: TubeFrame = g.tube;
        prop_assert!((t.top.cross(t.axis) - t.left).length() < 1e-12);
        prop_assert!((g.sky_east.cross(g.sky_north) - g.target).length() < 1e-12);
        prop_assert!(g.view.dot(g.up).abs() < 1e-9 && (g.up.length() - 1.0).abs() < 1e-9);
    }
}
