//! View options: night mode, device pixel ratio, pan/zoom from one scene,
//! determinism, and bad view parameters refused with an error, never a panic.
mod render_util;

use glam::DVec2;
use nightfield::orient::SkyToScreen;
use nightfield::render::{bench, draw, Frame, RenderError, ViewParams};
use nightfield::scene::{DsoLook, FieldShape, Scene, SceneStar};
use nightfield::sky::Equatorial;
use proptest::prelude::*;

fn scene() -> Scene {
    let mut s = bench::rich_field_scene();
    s.stars.truncate(500);
    s.add_dso(Equatorial { ra_rad: 5.2, dec_rad: 0.7 }, 0.01, 0.005, 0.5, DsoLook::Galaxy, 20.0, Some("test galaxy"));
    s
}

/// Night mode is red only: no green or blue anywhere in the frame.
#[test]
fn night_mode_is_red_only() {
    let s = scene();
    let mut f = Frame::default();
    draw(&s, &ViewParams { width_px: 256, height_px: 256, night_mode: true, ..ViewParams::default() }, &mut f).unwrap();
    assert!(f.rgba.chunks_exact(4).all(|p| p[1] == 0 && p[2] == 0));
    assert!(f.rgba.chunks_exact(4).any(|p| p[0] > 100), "stars still visible in red");
}

/// At device pixel ratio 2 the same view in twice the pixels puts each star
/// at twice the coordinates and draws it twice as wide (same look in CSS px).
#[test]
fn device_pixel_ratio_scales_positions_and_sizes() {
    let mut s = Scene::new(Equatorial { ra_rad: 1.0, dec_rad: 0.2 }, FieldShape::Circle { radius_rad: 0.01 }, SkyToScreen::chart(), 12.0);
    s.sky.sky_mag_arcsec2 = 24.0;
    s.stars.push(SceneStar { offset: DVec2::new(0.003, 0.002), vmag: 8.0, bv: 0.6 });
    let spread = |dpr: f32, side: u32| {
        let mut f = Frame::default();
        draw(&s, &ViewParams { width_px: side, height_px: side, dpr, ..ViewParams::default() }, &mut f).unwrap();
        let v = ViewParams { width_px: side, height_px: side, dpr, ..ViewParams::default() };
        let (ex, ey) = nightfield::render::view_transform(&s, &v).to_px(s.stars[0].offset);
        let (x0, y0) = ((ex - 12.0) as u32, (ey - 12.0) as u32);
        let (cx, cy) = render_util::centroid(&f, x0, y0, x0 + 24, y0 + 24, 0.005);
        // Second moment along x of the light in a window about the star.
        let lin = |c: u8| nightfield::render::raster::srgb_to_linear(c as f32 / 255.0) as f64;
        let (mut m2, mut w) = (0.0, 0.0);
        for y in (cy - 12.0) as u32..(cy + 12.0) as u32 {
            for x in (cx - 12.0) as u32..(cx + 12.0) as u32 {
                let v = lin(f.pixel(x, y)[1]) - 0.005;
                if v > 0.0 {
                    m2 += v * (x as f64 + 0.5 - cx).powi(2);
                    w += v;
                }
            }
        }
        (cx, cy, (m2 / w).sqrt())
    };
    let (x1, y1, s1) = spread(1.0, 200);
    let (x2, y2, s2) = spread(2.0, 400);
    assert!((x2 - 2.0 * x1).abs() < 0.25 && (y2 - 2.0 * y1).abs() < 0.25, "positions {x1},{y1} vs {x2},{y2}");
    assert!((s2 / s1 - 2.0).abs() < 0.25, "star width ratio {}", s2 / s1);
}

/// One scene, many views: the same view gives the same bytes, a pan moves the
/// picture by whole pixels, zoom changes it.
#[test]
fn pan_and_zoom_rerender_from_one_scene() {
    let s = scene();
    let v = ViewParams { width_px: 300, height_px: 300, ..ViewParams::default() };
    let (mut a, mut b, mut c) = (Frame::default(), Frame::default(), Frame::default());
    draw(&s, &v, &mut a).unwrap();
    draw(&s, &v, &mut b).unwrap();
    assert_eq!(a, b, "same scene and view must give the same bytes");
    draw(&s, &ViewParams { pan_x_px: 10.0, ..v }, &mut c).unwrap();
    // Away from the fixed compass and edge markers, pixel (x, y) moved to (x+10, y).
    let same = (100..200).all(|y| (100..200).all(|x| a.pixel(x, y) == c.pixel(x + 10, y)));
    assert!(same);
    draw(&s, &ViewParams { zoom: 2.0, ..v }, &mut c).unwrap();
    assert_ne!(a, c);
}

#[test]
fn bad_view_parameters_are_errors() {
    let s = scene();
    let mut f = Frame::default();
    let base = ViewParams::default();
    assert!(matches!(draw(&s, &ViewParams { width_px: 0, ..base }, &mut f), Err(RenderError::Size { .. })));
    assert!(matches!(draw(&s, &ViewParams { height_px: 100_000, ..base }, &mut f), Err(RenderError::Size { .. })));
    assert!(matches!(draw(&s, &ViewParams { dpr: f32::NAN, ..base }, &mut f), Err(RenderError::Dpr(_))));
    assert!(matches!(draw(&s, &ViewParams { zoom: 0.0, ..base }, &mut f), Err(RenderError::Zoom(_))));
    assert!(matches!(draw(&s, &ViewParams { pan_x_px: f32::INFINITY, ..base }, &mut f), Err(RenderError::Pan)));
    assert!(matches!(draw(&s, &ViewParams { px_per_rad: Some(-1.0), ..base }, &mut f), Err(RenderError::Scale(_))));
    let msg = RenderError::Dpr(9.0).to_string();
    assert!(msg.contains("device pixel ratio") && msg.contains("0.5 and 8"));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]
    /// Any view parameters (a page or a link can send anything) give a frame or an error, never a panic.
    #[test]
    fn any_view_parameters_never_panic(w in 0u32..300, h in 0u32..300, dpr in 0.3f32..9.0, zoom in 0.005f32..1200.0,
                                       px in -1e7f32..1e7, py in -1e3f32..1e3, night: bool, chart: bool, fixed in proptest::option::of(-1e3f64..1e7)) {
        let s = scene();
        let mut f = Frame::default();
        let v = ViewParams { width_px: w, height_px: h, dpr, night_mode: night, chart_view: chart, pan_x_px: px, pan_y_px: py, zoom, px_per_rad: fixed };
        if draw(&s, &v, &mut f).is_ok() {
            prop_assert_eq!(f.rgba.len(), (w * h * 4) as usize);
        }
    }
}

/// Scenes holding non-finite values (a corrupt input upstream) still draw without panicking.
#[test]
fn non_finite_scene_values_do_not_panic() {
    let mut s = scene();
    s.stars.push(SceneStar { offset: DVec2::new(f64::NAN, 0.0), vmag: f32::NAN, bv: f32::INFINITY });
    s.dsos.push(nightfield::scene::SceneDso { offset: DVec2::new(f64::NAN, 1.0), semi_major: DVec2::new(f64::INFINITY, 0.0), semi_minor: DVec2::ZERO, look: DsoLook::Galaxy, surf_br_mag_arcsec2: f32::NAN });
    s.bodies.push(nightfield::scene::SceneBody {
        look: nightfield::scene::BodyLook::Moon, offset: DVec2::new(0.0, f64::NAN), radius_rad: f64::NAN, polar_ratio: f64::NAN,
        pole_dir: DVec2::ZERO, bright_limb_dir: DVec2::new(f64::NAN, 0.0), phase_angle_rad: f64::NAN, vmag: f32::NAN, rings: None,
    });
    s.markers.zenith_dir = Some(DVec2::new(f64::NAN, f64::NAN));
    let mut f = Frame::default();
    assert!(draw(&s, &ViewParams { width_px: 128, height_px: 128, ..ViewParams::default() }, &mut f).is_ok());
}
