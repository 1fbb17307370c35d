//! Golden images of representative scenes, composed from the real catalogs
//! (catalog/*.nfs), the real ephemeris (catalog/ephemeris.bin) and generic
//! preset trains, rendered natively and compared with tests/golden/*.png
//! within the tolerance stated in render_util. NIGHTFIELD_BLESS=1 rewrites
//! the references; a failure writes tests/out/<name>.png and <name>_diff.png.
mod render_util;

use nightfield::optics::figures::Conditions;
use nightfield::optics::{presets, Accessory, Train};
use nightfield::render::{draw, Frame, ViewParams};
use nightfield::scene::compose::{compose, ComposeInput};
use nightfield::scene::{DsoLook, Scene};
use nightfield::sky::catalog::{decode_stars, StarCatalog};
use nightfield::sky::{Equatorial, Site};
use nightfield::solar::Ephemeris;
use nightfield::time::Instant;
use std::path::PathBuf;
use std::sync::OnceLock;

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn catalogs() -> &'static [StarCatalog] {
    static C: OnceLock<Vec<StarCatalog>> = OnceLock::new();
    C.get_or_init(|| {
        ["stars_bright.nfs", "stars_hip.nfs", "stars_gaia.nfs"]
            .iter()
            .map(|f| decode_stars(&std::fs::read(root().join("catalog").join(f)).unwrap()).unwrap())
            .collect()
    })
}

fn dsos() -> &'static nightfield::sky::dso::DsoCatalog {
    static D: OnceLock<nightfield::sky::dso::DsoCatalog> = OnceLock::new();
    D.get_or_init(|| nightfield::sky::dso::decode_dso(&std::fs::read(root().join("catalog/dso_openngc.nfd")).unwrap()).unwrap())
}

fn ephemeris() -> &'static Ephemeris {
    static E: OnceLock<Ephemeris> = OnceLock::new();
    E.get_or_init(|| Ephemeris::decode(&std::fs::read(root().join("catalog/ephemeris.bin")).unwrap()).unwrap())
}

/// The test site (an invented field at 48° N, 11° E, 500 m).
fn site() -> Site {
    nightfield::sky::horizon::site_from_deg(48.0, 11.0, 500.0).unwrap()
}

pub fn train(id: &str, eyepiece: Option<(f64, f64)>) -> Train {
    let mut t = presets::presets().into_iter().find(|p| p.id == id).unwrap().train;
    if let Some((f, afov)) = eyepiece {
        for a in t.accessories.iter_mut() {
            if matches!(a, Accessory::Eyepiece(_)) {
                *a = Accessory::Eyepiece(presets::eyepiece(f, afov));
            }
        }
    }
    t
}

/// A J2000 catalog direction (RA hours, Dec degrees) → apparent place of date
/// at the test site (the sky core's apparent-place chain).
fn j2000(ra_h: f64, dec_d: f64, when: (i32, u32, u32, u32, u32)) -> Equatorial {
    let instant = Instant::from_civil(when.0, when.1, when.2, when.3, when.4, 0.0, 0).unwrap();
    let ctx = nightfield::sky::apparent::ApparentContext::at_site(&instant, &site());
    let p = nightfield::sky::apparent::CatalogPlace { ra_rad: (ra_h * 15.0).to_radians(), dec_rad: dec_d.to_radians(), pm_ra_cosdec_mas_yr: 0.0, pm_dec_mas_yr: 0.0, parallax_mas: 0.0, rv_km_s: 0.0 };
    ctx.place(&p, 2000.0)
}

pub fn scene_for(t: &Train, center: Equatorial, when: (i32, u32, u32, u32, u32), dark_sky: f64, label: &str) -> Scene {
    let cats: Vec<&StarCatalog> = catalogs().iter().collect();
    let instant = Instant::from_civil(when.0, when.1, when.2, when.3, when.4, 0.0, 0).unwrap();
    compose(&ComposeInput {
        train: t,
        conditions: Conditions::default(),
        center,
        instant,
        site: site(),
        catalogs: &cats,
        dsos: Some(dsos()),
        ephemeris: Some(ephemeris()),
        dark_sky_mag_arcsec2: dark_sky,
        driven: false,
        user_rotation_rad: 0.0,
        sensor_rotation_rad: 0.0,
        target_label: Some(label),
    })
    .unwrap()
}

fn body_center(b: nightfield::solar::BodyId, when: (i32, u32, u32, u32, u32)) -> Equatorial {
    let instant = Instant::from_civil(when.0, when.1, when.2, when.3, when.4, 0.0, 0).unwrap();
    nightfield::solar::body_apparent(ephemeris(), b, &instant, &site()).unwrap().topocentric
}

fn render(scene: &Scene, name: &str) -> Frame {
    let view = ViewParams { width_px: 512, height_px: 512, ..ViewParams::default() };
    let mut f = Frame::default();
    let labels = draw(scene, &view, &mut f).unwrap();
    assert!(!labels.is_empty(), "{name}: expected some labels");
    f
}

/// h and χ Persei (NGC 869/884, J2000 centre from memory) in an 80/600
/// refractor with a 25 mm eyepiece (24×, about 2.2° field).
#[test]
fn golden_rich_star_field() {
    let when = (2027, 1, 10, 20, 0);
    let s = scene_for(&train("refractor_80_600", None), j2000(2.345, 57.13, when), when, 21.3, "h and χ Persei");
    assert!(s.stars.len() > 150, "rich field has {} stars", s.stars.len());
    render_util::check_golden("rich_star_field", &render(&s, "rich"));
}

/// M42 with M43 and their neighbours from the OpenNGC file in a 150/750
/// Newtonian with 25 mm (30×); mean surface brightness from V and size where
/// the catalog has none (M42: 90′×60′, V 4.0).
#[test]
fn golden_large_nebula() {
    let when = (2027, 1, 10, 22, 0);
    let s = scene_for(&train("newtonian_150_750_eq", None), j2000(5.5879, -5.39, when), when, 21.3, "M42");
    assert!(s.dsos.iter().any(|d| d.look == DsoLook::Nebula && d.semi_major.length() > (40.0f64 / 60.0).to_radians()), "M42 at its true size");
    render_util::check_golden("large_nebula", &render(&s, "nebula"));
}

/// The crescent Moon (about 16 % lit) on 2027-02-10 18:00 UTC in the 80/600 refractor.
#[test]
fn golden_crescent_moon() {
    let when = (2027, 2, 10, 18, 0);
    let c = body_center(nightfield::solar::BodyId::Moon, when);
    let s = scene_for(&train("refractor_80_600", None), c, when, 21.3, "Moon");
    assert_eq!(s.bodies.len(), 1);
    render_util::check_golden("crescent_moon", &render(&s, "moon"));
}

/// Jupiter and its four large moons, 203/2032 with a 12 mm 60° eyepiece (169×).
#[test]
fn golden_jupiter_with_moons() {
    let when = (2027, 1, 15, 22, 0);
    let c = body_center(nightfield::solar::BodyId::Jupiter, when);
    let s = scene_for(&train("schmidt_cassegrain_203_2032", Some((12.0, 60.0))), c, when, 21.3, "Jupiter");
    assert!(s.bodies.len() >= 4, "Jupiter and at least 3 moons, got {}", s.bodies.len());
    render_util::check_golden("jupiter_moons", &render(&s, "jupiter"));
}

/// Saturn with its rings open about 26° (south face), 203/2032 with a 4 mm 60° eyepiece (508×).
#[test]
fn golden_saturn() {
    let when = (2031, 11, 1, 21, 0);
    let c = body_center(nightfield::solar::BodyId::Saturn, when);
    let s = scene_for(&train("schmidt_cassegrain_203_2032", Some((4.0, 60.0))), c, when, 21.3, "Saturn");
    assert!(s.bodies[0].rings.is_some());
    render_util::check_golden("saturn", &render(&s, "saturn"));
}

/// The Pleiades through the 80/480 refractor with a camera (sensor 23.5×15.6 mm),
/// shown in the chart view: the sensor frame appears turned by the mount's
/// frame against north-up (equatorial mount: the frame's turn is fixed on the sky).
#[test]
fn golden_camera_frame_chart_view() {
    let when = (2027, 1, 10, 20, 0);
    let s = scene_for(&train("refractor_80_480_camera", None), j2000(3.7914, 24.105, when), when, 20.5, "M45");
    assert!(matches!(s.field, nightfield::scene::FieldEdge::Polygon { .. }));
    let view = ViewParams { width_px: 512, height_px: 384, chart_view: true, ..ViewParams::default() };
    let mut f = Frame::default();
    draw(&s, &view, &mut f).unwrap();
    render_util::check_golden("camera_frame_chart", &f);
}

/// Zoomed looks at the planets, written to tests/out/ for the eye (not compared).
#[test]
#[ignore]
fn zoomed_planets_for_inspection() {
    for (name, b, when, ep) in [
        ("zoom_saturn", nightfield::solar::BodyId::Saturn, (2031, 11, 1, 21, 0), (4.0, 60.0)),
        ("zoom_jupiter", nightfield::solar::BodyId::Jupiter, (2027, 1, 15, 22, 0), (12.0, 60.0)),
    ] {
        let c = body_center(b, when);
        let s = scene_for(&train("schmidt_cassegrain_203_2032", Some(ep)), c, when, 21.3, name);
        let view = ViewParams { width_px: 512, height_px: 512, zoom: 6.0, ..ViewParams::default() };
        let mut f = Frame::default();
        draw(&s, &view, &mut f).unwrap();
        render_util::write_png(&root().join("tests/out").join(format!("{name}.png")), &f);
    }
}
