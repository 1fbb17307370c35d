//! Geometry of the drawn picture: where a known star lands under each
//! orientation, which way the Moon's lit side faces, how a sensor frame turns.
mod render_util;

use glam::{DMat2, DVec2};
use nightfield::orient::SkyToScreen;
use nightfield::render::{draw, Frame, ViewParams};
use nightfield::scene::{gnomonic, FieldShape, Scene, SceneStar, SkyLight};
use nightfield::sky::Equatorial;
use render_util::centroid;

fn m(a: f64, b: f64, c: f64, d: f64) -> SkyToScreen {
    // Row-major [[a, b], [c, d]]: right = a·east + b·north, up = c·east + d·north.
    SkyToScreen { m: DMat2::from_cols(DVec2::new(a, c), DVec2::new(b, d)) }
}

fn dark_scene(orient: SkyToScreen, radius_rad: f64) -> Scene {
    let mut s = Scene::new(Equatorial { ra_rad: 1.0, dec_rad: 0.3 }, FieldShape::Circle { radius_rad }, orient, 12.0);
    s.sky = SkyLight { sky_mag_arcsec2: 24.0, dimming_mag: 0.0, moon_share: 0.0 };
    s
}

/// One star 0.30 R east and 0.20 R north of centre, at a sub-pixel position.
/// Expected pixels are worked out by hand for each train (common practice:
/// the naked eye/chart shows east left, a mirror diagonal swaps east to the
/// right, a Newtonian turns the view by 180°, a 90° turn moves north to the side).
#[test]
fn star_lands_on_expected_pixel_under_each_orientation() {
    let r = 0.01; // field radius, rad
    let view = ViewParams { width_px: 400, height_px: 300, ..ViewParams::default() };
    let s = 300.0 * 0.94 / (2.0 * r); // px per rad: field fits the 300 px side at 94 %
    let (e, n) = (0.30 * r, 0.20 * r);
    let (cx, cy) = (200.0, 150.0);
    let cases = [
        ("chart: north up, east left", m(-1.0, 0.0, 0.0, 1.0), (cx - e * s, cy - n * s)),
        ("mirror diagonal: north up, east right", m(1.0, 0.0, 0.0, 1.0), (cx + e * s, cy - n * s)),
        ("rotated 180°: north down, east right", m(1.0, 0.0, 0.0, -1.0), (cx + e * s, cy + n * s)),
        // Chart turned 90° counter-clockwise: north points left, east down.
        ("chart turned 90° ccw", m(0.0, -1.0, -1.0, 0.0), (cx - n * s, cy + e * s)),
        // Mirror image turned 90° clockwise: north right, east down... (east → −up, north → right)
        ("mirror turned 90° cw", m(0.0, 1.0, -1.0, 0.0), (cx + n * s, cy + e * s)),
    ];
    // A bright star (wide stamp) and a faint one (base-width phase tables).
    for ((name, o, (ex, ey)), vmag) in cases.iter().flat_map(|c| [(*c, 9.0f32), (*c, 11.5)]) {
        let mut sc = dark_scene(o, r);
        sc.stars.push(SceneStar { offset: DVec2::new(e, n), vmag, bv: 0.6 });
        let mut f = Frame::default();
        draw(&sc, &view, &mut f).unwrap();
        let (x0, y0) = ((ex - 8.0) as u32, (ey - 8.0) as u32);
        let floor = {
            let p = f.pixel(x0, y0);
            let lin = |c: u8| nightfield::render::raster::srgb_to_linear(c as f32 / 255.0) as f64;
            lin(p[0]) + lin(p[1]) + lin(p[2])
        };
        let (x, y) = centroid(&f, x0, y0, x0 + 16, y0 + 16, floor);
        assert!((x - ex).abs() < 0.05 && (y - ey).abs() < 0.05, "{name}, V {vmag}: star at ({x:.3}, {y:.3}), expected ({ex:.3}, {ey:.3})");
    }
}

/// The chart switch shows the same field north up, east left whatever the train.
#[test]
fn chart_switch_overrides_train() {
    let r = 0.01;
    let mut sc = dark_scene(m(1.0, 0.0, 0.0, -1.0), r);
    sc.stars.push(SceneStar { offset: DVec2::new(0.3 * r, 0.0), vmag: 9.0, bv: 0.6 });
    let view = ViewParams { width_px: 200, height_px: 200, chart_view: true, ..ViewParams::default() };
    let mut f = Frame::default();
    draw(&sc, &view, &mut f).unwrap();
    let (x, _) = centroid(&f, 40, 90, 160, 110, 0.01);
    assert!(x < 100.0 - 20.0, "east should be left in chart view, star at x = {x}");
}

/// Gnomonic projection: a star 1° north of a centre on the equator lies at
/// η = tan 1° (definition of the TAN projection, Calabretta & Greisen 2002).
#[test]
fn gnomonic_north_offset_is_tangent() {
    let c = Equatorial { ra_rad: 2.0, dec_rad: 0.0 };
    let p = Equatorial { ra_rad: 2.0, dec_rad: 1f64.to_radians() };
    let o = gnomonic(c, p).unwrap();
    assert!(o.x.abs() < 1e-15 && (o.y - 1f64.to_radians().tan()).abs() < 1e-15);
    let back = nightfield::scene::gnomonic_inverse(c, o);
    assert!((back.dec_rad - p.dec_rad).abs() < 1e-14 && (back.ra_rad - p.ra_rad).abs() < 1e-14);
}

/// A sensor turned 90° on the instrument's screen swaps its width and height
/// there (the frame edge is found from the dark outside it).
#[test]
fn sensor_rotated_90_swaps_width_and_height() {
    let orient = m(1.0, 0.0, 0.0, 1.0);
    let extent = |rot: f64| {
        let mut sc = Scene::new(Equatorial { ra_rad: 1.0, dec_rad: 0.3 }, FieldShape::Sensor { width_rad: 0.02, height_rad: 0.01, rotation_rad: rot }, orient, 12.0);
        sc.sky = SkyLight { sky_mag_arcsec2: 17.0, dimming_mag: 0.0, moon_share: 0.0 };
        let view = ViewParams { width_px: 300, height_px: 300, px_per_rad: Some(10000.0), ..ViewParams::default() };
        let mut f = Frame::default();
        draw(&sc, &view, &mut f).unwrap();
        // Bright (sky) pixels along the centre row and column.
        let row = (0..300).filter(|&x| f.pixel(x, 150)[1] > 60).count();
        let col = (0..300).filter(|&y| f.pixel(150, y)[1] > 60).count();
        (row, col)
    };
    let (w0, h0) = extent(0.0);
    let (w1, h1) = extent(std::f64::consts::FRAC_PI_2);
    assert!((w0 as i32 - 200).abs() <= 2 && (h0 as i32 - 100).abs() <= 2, "unrotated {w0}×{h0}");
    assert!((w1 as i32 - 100).abs() <= 2 && (h1 as i32 - 200).abs() <= 2, "rotated {w1}×{h1}");
}
