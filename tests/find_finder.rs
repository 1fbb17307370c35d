//! Finder models: orientation traced with an asymmetric "F" of sky points,
//! limiting magnitude, main-field marker, input checks.
use glam::DVec2;
use nightfield::find::finder::*;
use nightfield::orient::SkyToScreen;

fn spec(kind: FinderKind, ap: f64, mag: f64, field: f64) -> Finder {
    Finder::new(FinderSpec { kind, aperture_mm: ap, magnification: mag, true_field_deg: field }).unwrap()
}
fn straight() -> Finder { spec(FinderKind::StraightThrough, 50.0, 8.0, 6.0) }
fn ra_mirror() -> Finder { spec(FinderKind::RightAngle { prism: PrismKind::Mirror }, 50.0, 9.0, 5.0) }
fn ra_erect() -> Finder { spec(FinderKind::RightAngle { prism: PrismKind::Erect }, 50.0, 9.0, 5.0) }
fn reflex() -> Finder { spec(FinderKind::ReflexSight { ring_radii_deg: vec![0.25, 1.0, 2.0] }, 0.0, 1.0, 30.0) }
fn binos() -> Finder { spec(FinderKind::Binoculars, 50.0, 10.0, 6.5) }

/// The letter F drawn on the sky as (east, north) offsets: stem going north,
/// top bar and middle bar going east. It has no symmetry, so any flip or turn shows.
const F: [(f64, f64); 5] = [(0.0, 0.0), (0.0, 2.0), (1.0, 2.0), (0.0, 1.0), (0.6, 1.0)];

fn trace(o: SkyToScreen) -> Vec<(f64, f64)> {
    F.iter().map(|&(e, n)| { let p = o.m * DVec2::new(e, n); (p.x, p.y) }).collect()
}
fn close(a: &[(f64, f64)], b: &[(f64, f64)]) -> bool {
    a.iter().zip(b).all(|(p, q)| (p.0 - q.0).abs() < 1e-12 && (p.1 - q.1).abs() < 1e-12)
}

/// North up (up_pa = 0). By eye (and chart) the F's bars point LEFT (east is
/// left facing the sky); a straight-through finder turns it 180° (common
/// practice: "an astronomical telescope shows the sky upside down"); a plain
/// mirror diagonal gives it right way up but mirror-reversed (bars to the right).
#[test]
fn f_trace_north_up() {
    let by_eye = vec![(0.0, 0.0), (0.0, 2.0), (-1.0, 2.0), (0.0, 1.0), (-0.6, 1.0)];
    let inverted = vec![(0.0, 0.0), (0.0, -2.0), (1.0, -2.0), (0.0, -1.0), (0.6, -1.0)];
    let mirrored = vec![(0.0, 0.0), (0.0, 2.0), (1.0, 2.0), (0.0, 1.0), (0.6, 1.0)];
    assert!(close(&trace(naked_eye(0.0)), &by_eye));
    assert!(close(&trace(straight().orientation(0.0)), &inverted));
    assert!(close(&trace(ra_mirror().orientation(0.0)), &mirrored));
    for f in [ra_erect(), reflex(), binos()] {
        assert!(close(&trace(f.orientation(0.0)), &by_eye), "{:?}", f.spec.kind);
    }
}

/// On an alt-az mount "up" is the zenith, at position angle q (the parallactic
/// angle) from north. The zenith must land straight up by eye and in erect
/// finders, straight down in the straight-through one; east stays 90°
/// counter-clockwise from north on screen for an unmirrored view and 90°
/// clockwise for a mirrored one (determinant −1 vs +1, orient.rs convention).
#[test]
fn f_trace_turned_by_parallactic_angle() {
    for q_deg in [-150.0f64, -40.0, 0.0, 30.0, 95.0, 179.0] {
        let q = q_deg.to_radians();
        let zen = DVec2::new(q.sin(), q.cos());
        for (f, zen_up, mirrored) in [
            (straight(), -1.0, false),
            (ra_mirror(), 1.0, true),
            (ra_erect(), 1.0, false),
            (reflex(), 1.0, false),
            (binos(), 1.0, false),
        ] {
            let o = f.orientation(q);
            let z = o.m * zen;
            assert!(z.x.abs() < 1e-12 && (z.y - zen_up).abs() < 1e-12, "{:?} q={q_deg}: zenith → {z:?}", f.spec.kind);
            let n = o.m * DVec2::new(0.0, 1.0);
            let e = o.m * DVec2::new(1.0, 0.0);
            let ccw = n.perp_dot(e); // > 0: east is counter-clockwise from north
            assert!(if mirrored { ccw < -0.999 } else { ccw > 0.999 }, "{:?} q={q_deg}", f.spec.kind);
            let det = o.m.determinant();
            assert!((det - if mirrored { 1.0 } else { -1.0 }).abs() < 1e-12);
            // F traced through the view = F by eye, then the finder's parity.
            let by_eye = trace(naked_eye(q));
            let expect: Vec<(f64, f64)> = by_eye.iter().map(|&(x, y)| { let p = f.parity() * DVec2::new(x, y); (p.x, p.y) }).collect();
            assert!(close(&trace(o), &expect));
        }
    }
}

/// Light grasp over a 7 mm pupil, 5·log10(D/7) (common practice). An 8×50
/// finder under a mag-6 sky shows about mag 10 (common practice: "a 50 mm
/// finder reaches about 9th–10th magnitude"); the exit-pupil cap stops a
/// low-power large lens from gaining more than its 7 mm exit pupil allows.
#[test]
fn limiting_magnitudes() {
    let m = straight().limiting_mag(6.0, 7.0).unwrap();
    assert!(m > 9.0 && m < 10.5, "{m}");
    assert!((m - (6.0 + 5.0 * (50.0f64 / 7.0).log10() + 2.5 * 0.8f64.log10())).abs() < 1e-12);
    // 2× with 50 mm: only 14 mm of aperture used by a 7 mm pupil.
    let low = spec(FinderKind::StraightThrough, 50.0, 2.0, 20.0).limiting_mag(6.0, 7.0).unwrap();
    assert!((low - (6.0 + 5.0 * 2.0f64.log10() + 2.5 * 0.8f64.log10())).abs() < 1e-12);
    let r = reflex().limiting_mag(6.0, 7.0).unwrap();
    assert!(r < 6.0 && r > 5.7, "{r}");
    assert!(binos().limiting_mag(5.0, 7.0).unwrap() < straight().limiting_mag(6.0, 7.0).unwrap());
}

#[test]
fn main_field_marker_in_finder_coordinates() {
    let f = straight(); // 6° field: radius 3°
    let mk = f.main_field_marker(0.5f64.to_radians(), (0.0, 0.0), 0.0).unwrap();
    assert!(mk.centre_right.abs() < 1e-15 && mk.centre_up.abs() < 1e-15);
    assert!((mk.radius - 0.25 / 3.0).abs() < 1e-12);
    // Main scope aimed 1° east of the finder's centre: in an inverted view east is right.
    let mk = f.main_field_marker(0.5f64.to_radians(), (1f64.to_radians(), 0.0), 0.0).unwrap();
    assert!((mk.centre_right - 1.0 / 3.0).abs() < 1e-12 && mk.centre_up.abs() < 1e-12);
    // By eye / erect binoculars east is left.
    let mk = binos().main_field_marker(0.5f64.to_radians(), (1f64.to_radians(), 0.0), 0.0).unwrap();
    assert!(mk.centre_right < 0.0);
    let v = reflex().view(0.0, 0.02, (0.0, 0.0), 6.0).unwrap();
    assert_eq!(v.rings.len(), 3);
    assert!((v.rings[2] - 2.0 / 15.0).abs() < 1e-12);
    assert!((reflex().field_radius_rad() - 2f64.to_radians()).abs() < 1e-15);
}

#[test]
fn bad_finders_are_errors() {
    let bad = |kind, ap, mag, field| Finder::new(FinderSpec { kind, aperture_mm: ap, magnification: mag, true_field_deg: field }).unwrap_err().to_string();
    assert!(bad(FinderKind::StraightThrough, 0.0, 8.0, 6.0).contains("finder aperture"));
    assert!(bad(FinderKind::Binoculars, 50.0, f64::NAN, 6.0).contains("finder magnification"));
    assert!(bad(FinderKind::StraightThrough, 50.0, 8.0, 0.0).contains("finder true field"));
    assert!(bad(FinderKind::ReflexSight { ring_radii_deg: vec![] }, 0.0, 1.0, 30.0).contains("ring radii"));
    assert!(bad(FinderKind::ReflexSight { ring_radii_deg: vec![-1.0] }, 0.0, 1.0, 30.0).contains("ring radius"));
    assert!(straight().limiting_mag(f64::INFINITY, 7.0).is_err());
    assert!(straight().main_field_marker(0.0, (0.0, 0.0), 0.0).is_err());
}
