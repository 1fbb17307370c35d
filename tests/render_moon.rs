//! The Moon's lit side on screen faces where the train and the parallactic
//! angle say it must: for an 80/600 refractor with a mirror diagonal on an
//! alt-azimuth mount the view is the naked-eye view (zenith up) mirrored left
//! to right (common practice), so a direction at position angle θ appears at
//! screen (right, up) = (sin(θ − q), cos(θ − q)); in the chart view it appears
//! at (−sin θ, cos θ). θ is the bright-limb angle from the solar module
//! (checked there against skyfield), q the parallactic angle from the sky core.
mod render_util;

use nightfield::optics::figures::Conditions;
use nightfield::optics::presets;
use nightfield::render::{draw, Frame, ViewParams};
use nightfield::scene::compose::{compose, ComposeInput};
use nightfield::sky::horizon::{hour_angle_rad, parallactic_angle_rad, site_from_deg};
use nightfield::solar::{body_apparent, BodyId, Ephemeris};
use nightfield::time::Instant;

fn lit_direction(f: &Frame, cx: f64, cy: f64, r: f64) -> (f64, f64) {
    let lin = |c: u8| nightfield::render::raster::srgb_to_linear(c as f32 / 255.0) as f64;
    let (mut sx, mut sy, mut sw) = (0.0, 0.0, 0.0);
    for y in (cy - r) as u32..(cy + r) as u32 {
        for x in (cx - r) as u32..(cx + r) as u32 {
            let p = f.pixel(x, y);
            let v = lin(p[0]) + lin(p[1]) + lin(p[2]);
            if v > 0.3 {
                sx += v * (x as f64 + 0.5 - cx);
                sy += v * (y as f64 + 0.5 - cy);
                sw += v;
            }
        }
    }
    // Pixel y runs down; return (right, up).
    (sx / sw, -sy / sw)
}

fn angle_between(a: (f64, f64), b: (f64, f64)) -> f64 {
    let d = (a.0 * b.1 - a.1 * b.0).atan2(a.0 * b.0 + a.1 * b.1);
    d.abs().to_degrees()
}

#[test]
fn crescent_lit_side_faces_the_predicted_side() {
    let root = std::path::PathBuf::from(env!("CARGO_MANIFEST_DIR"));
    let eph = Ephemeris::decode(&std::fs::read(root.join("catalog/ephemeris.bin")).unwrap()).unwrap();
    let site = site_from_deg(48.0, 11.0, 500.0).unwrap();
    for when in [(2027, 2, 10, 18, 0), (2027, 2, 24, 4, 0)] {
        let t = Instant::from_civil(when.0, when.1, when.2, when.3, when.4, 0.0, 0).unwrap();
        let moon = body_apparent(&eph, BodyId::Moon, &t, &site).unwrap();
        let q = parallactic_angle_rad(hour_angle_rad(moon.topocentric.ra_rad, site.lon_rad, &t), moon.topocentric.dec_rad, site.lat_rad);
        let chi = moon.bright_limb_pa_rad;
        let train = presets::presets().into_iter().find(|p| p.id == "refractor_80_600").unwrap().train;
        let scene = compose(&ComposeInput {
            train: &train,
            conditions: Conditions::default(),
            center: moon.topocentric,
            instant: t,
            site,
            catalogs: &[],
            dsos: None,
        ephemeris: Some(&eph),
            dark_sky_mag_arcsec2: 21.0,
            driven: true,
            user_rotation_rad: 0.0,
            sensor_rotation_rad: 0.0,
            target_label: None,
        })
        .unwrap();
        let r_px = scene.bodies[0].radius_rad;
        for (chart, expect) in [(false, ((chi - q).sin(), (chi - q).cos())), (true, (-chi.sin(), chi.cos()))] {
            let view = ViewParams { width_px: 400, height_px: 400, chart_view: chart, ..ViewParams::default() };
            let mut f = Frame::default();
            draw(&scene, &view, &mut f).unwrap();
            let s = nightfield::render::view_transform(&scene, &view).px_per_rad;
            let got = lit_direction(&f, 200.0, 200.0, r_px * s + 3.0);
            let err = angle_between(got, expect);
            assert!(err < 4.0, "{when:?} chart={chart}: lit side at {got:?}, expected towards {expect:?} ({err:.1}° off)");
        }
    }
}
