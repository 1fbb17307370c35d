//! Deep-sky objects drawn by type at their true size, shape and position
//! angle. Glows use a radial profile per type, scaled so the mean over the
//! catalogue outline equals the object's mean surface brightness; it is
//! added to the sky on the display scale of `background` (so the contrast
//! against the sky is the true ratio). Profiles are our stated choices:
//! galaxy exp(−r/0.25) (an exponential disc), nebula exp(−r/0.3) fading
//! from r = 0.7 to 1.1 (brighter towards the middle), dark nebula flat, soft from 0.55 to 1.1, planetary nebula flat to 0.8 then soft to 1.05,
//! globular cluster 1/(1 + (r/0.15)²) (a King-like core) fading from 0.8 to 1.2.
//! Open clusters and other objects get a dashed outline only (their stars
//! come from the star catalog).

use super::raster::Canvas;
use super::{background, Palette, ViewTransform};
use crate::scene::{DsoLook, Scene, SceneDso};
use glam::DVec2;
use std::sync::OnceLock;

const PROFILE_N: usize = 256;

struct Profile {
    /// Profile / (its mean over r < 1), sampled on [0, r_max].
    vals: [f32; PROFILE_N + 1],
    r_max: f32,
}

fn smoothstep(a: f32, b: f32, x: f32) -> f32 {
    let t = ((x - a) / (b - a)).clamp(0.0, 1.0);
    t * t * (3.0 - 2.0 * t)
}

fn raw_profile(look: DsoLook, r: f32) -> f32 {
    match look {
        DsoLook::Galaxy => libm::expf(-r / 0.25) * (1.0 - smoothstep(1.0, 1.25, r)),
        DsoLook::Nebula => libm::expf(-r / 0.3) * (1.0 - smoothstep(0.7, 1.1, r)),
        DsoLook::DarkNebula => 1.0 - smoothstep(0.55, 1.1, r),
        DsoLook::PlanetaryNebula => 1.0 - smoothstep(0.8, 1.05, r),
        DsoLook::GlobularCluster => (1.0 / (1.0 + (r / 0.15) * (r / 0.15))) * (1.0 - smoothstep(0.8, 1.2, r)),
        DsoLook::OpenCluster | DsoLook::Other => 0.0,
    }
}

fn r_max(look: DsoLook) -> f32 {
    match look {
        DsoLook::Galaxy => 1.25,
        DsoLook::Nebula | DsoLook::DarkNebula => 1.1,
        DsoLook::PlanetaryNebula => 1.05,
        DsoLook::GlobularCluster => 1.2,
        _ => 1.0,
    }
}

fn build(look: DsoLook) -> Profile {
    // Mean over the unit disc: ∫₀¹ p(r) 2r dr, midpoint rule.
    let n = 4000;
    let mut mean = 0.0f64;
    for i in 0..n {
        let r = (i as f64 + 0.5) / n as f64;
        mean += raw_profile(look, r as f32) as f64 * 2.0 * r / n as f64;
    }
    let rm = r_max(look);
    let mut vals = [0.0f32; PROFILE_N + 1];
    for (i, v) in vals.iter_mut().enumerate() {
        let r = rm * i as f32 / PROFILE_N as f32;
        *v = if mean > 0.0 { (raw_profile(look, r) as f64 / mean) as f32 } else { 0.0 };
    }
    Profile { vals, r_max: rm }
}

fn profile(look: DsoLook) -> &'static Profile {
    static P: OnceLock<[Profile; 4]> = OnceLock::new();
    let p = P.get_or_init(|| [build(DsoLook::Galaxy), build(DsoLook::Nebula), build(DsoLook::PlanetaryNebula), build(DsoLook::GlobularCluster)]);
    match look {
        DsoLook::Galaxy => &p[0],
        DsoLook::PlanetaryNebula => &p[2],
        DsoLook::GlobularCluster => &p[3],
        _ => &p[1],
    }
}

/// Mean over r < 1 of the normalised profile (1 by construction; for tests).
pub fn profile_mean(look: DsoLook) -> f64 {
    let p = profile(look);
    let n = 2000;
    let mut m = 0.0;
    for i in 0..n {
        let r = (i as f64 + 0.5) / n as f64;
        let u = (r as f32 / p.r_max * PROFILE_N as f32) as usize;
        m += p.vals[u.min(PROFILE_N)] as f64 * 2.0 * r / n as f64;
    }
    m
}

fn tint(look: DsoLook) -> [f32; 3] {
    // Faint glows look nearly colourless to the eye; a hint of type only.
    match look {
        DsoLook::Galaxy => [1.0, 0.96, 0.88],
        DsoLook::PlanetaryNebula => [0.80, 1.0, 0.95],
        DsoLook::GlobularCluster => [1.0, 0.95, 0.85],
        _ => [0.90, 1.0, 0.96],
    }
}

struct Ellipse {
    cx: f32,
    cy: f32,
    /// Pixel delta → unit-disc coordinates.
    inv: [f32; 4],
    half_x: f32,
    half_y: f32,
}

fn ellipse_px(d: &SceneDso, t: &ViewTransform) -> Option<Ellipse> {
    let a = t.m * d.semi_major;
    let b = t.m * d.semi_minor;
    let det = a.x * b.y - b.x * a.y;
    if !(det.abs() >= 1e-9) || !d.offset.is_finite() || !det.is_finite() {
        return None;
    }
    let (cx, cy) = t.to_px(d.offset);
    Some(Ellipse {
        cx,
        cy,
        inv: [(b.y / det) as f32, (-b.x / det) as f32, (-a.y / det) as f32, (a.x / det) as f32],
        half_x: libm::sqrt(a.x * a.x + b.x * b.x) as f32,
        half_y: libm::sqrt(a.y * a.y + b.y * b.y) as f32,
    })
}

/// Glows for the rows in `rows` (called per band, before the stars).
pub(crate) fn draw_dsos(cv: &mut Canvas, scene: &Scene, t: &ViewTransform, pal: &Palette, rows: (usize, usize)) {
    for d in &scene.dsos {
        if matches!(d.look, DsoLook::OpenCluster | DsoLook::Other) {
            continue;
        }
        let Some(e) = ellipse_px(d, t) else { continue };
        let p = profile(d.look);
        let reach_y = e.half_y * p.r_max + 1.0;
        let reach_x = e.half_x * p.r_max + 1.0;
        let y0 = ((e.cy - reach_y).floor().max(rows.0 as f32) as usize).max(rows.0);
        let y1 = ((e.cy + reach_y).ceil().max(0.0) as usize).min(rows.1).min(cv.h);
        let x0 = (e.cx - reach_x).floor().max(0.0) as usize;
        let x1 = ((e.cx + reach_x).ceil().max(0.0) as usize).min(cv.w);
        if y0 >= y1 || x0 >= x1 {
            continue;
        }
        let sb = d.surf_br_mag_arcsec2 as f64 + scene.sky.dimming_mag.max(0.0);
        let light = if d.surf_br_mag_arcsec2.is_finite() { background::surface_light(sb) } else { 0.0 };
        let dark = d.look == DsoLook::DarkNebula;
        if light <= 0.0 && !dark {
            continue;
        }
        let col = pal.map(tint(d.look));
        let scale = PROFILE_N as f32 / p.r_max;
        for y in y0..y1 {
            let dy = y as f32 + 0.5 - e.cy;
            for x in x0..x1 {
                let dx = x as f32 + 0.5 - e.cx;
                let u = e.inv[0] * dx + e.inv[1] * dy;
                let v = e.inv[2] * dx + e.inv[3] * dy;
                let r = super::raster::sqrt(u * u + v * v);
                if r >= p.r_max {
                    continue;
                }
                let k = p.vals[((r * scale) as usize).min(PROFILE_N)];
                let i = cv.idx(x, y);
                if dark {
                    // A dark nebula hides the sky glow behind it (not the air in front): 60 % at the core.
                    cv.scale(i, 1.0 - 0.6 * k.min(1.0));
                } else {
                    cv.add(i, col, light * k);
                }
            }
        }
    }
}

/// Dashed outlines of open clusters and other outline-only objects, kept
/// inside the field (called after the field mask).
pub(crate) fn draw_outlines(cv: &mut Canvas, scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette) {
    const SEG: usize = 48;
    let col = pal.map([0.45, 0.50, 0.60]);
    for d in &scene.dsos {
        if !matches!(d.look, DsoLook::OpenCluster | DsoLook::Other) {
            continue;
        }
        let pts: Vec<DVec2> = (0..=SEG)
            .map(|k| {
                let (s, c) = libm::sincos(k as f64 * core::f64::consts::TAU / SEG as f64);
                d.offset + d.semi_major * c + d.semi_minor * s
            })
            .collect();
        let (a, b) = (t.to_px(pts[0]), t.to_px(pts[SEG / 4]));
        if ((a.0 - b.0).abs() + (a.1 - b.1).abs()) < 4.0 * dpr {
            continue; // too small to outline
        }
        for k in (0..SEG).step_by(2) {
            let mid = (pts[k] + pts[k + 1]) * 0.5;
            if scene.in_field(mid, 0.0) {
                cv.line(t.to_px(pts[k]), t.to_px(pts[k + 1]), 1.0 * dpr, col, 0.8);
            }
        }
    }
}
