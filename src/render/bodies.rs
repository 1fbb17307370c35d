//! The Moon, the Sun and the planets as discs with phase; Saturn's rings;
//! satellites as points. Bodies smaller than a pixel are drawn as stars.
//!
//! Phase: on the unit disc, with u along the bright limb and v across it, a
//! point is lit when u ≥ −cos(i)·√(1−v²) (i = phase angle): the terminator is
//! the half-ellipse of semi-axis |cos i| (orthographic view of a sphere lit
//! from the Sun's direction). Colours and shading are our display choices
//! (from memory, not photometry); the dark side shows only the sky in front.

use super::raster::{luts, Canvas};
use super::{background, stars, Palette, ViewTransform};
use crate::scene::{BodyLook, Scene, SceneBody};

/// Display colour (linear) of a body's lit side.
fn lit_colour(look: BodyLook) -> [f32; 3] {
    match look {
        BodyLook::Sun => [1.0, 0.97, 0.90],
        BodyLook::Moon => [0.80, 0.78, 0.72],
        BodyLook::Mercury => [0.62, 0.58, 0.54],
        BodyLook::Venus => [0.95, 0.92, 0.80],
        BodyLook::Mars => [0.85, 0.42, 0.22],
        BodyLook::Jupiter => [0.86, 0.78, 0.64],
        BodyLook::Saturn => [0.86, 0.78, 0.56],
        BodyLook::Uranus => [0.55, 0.80, 0.85],
        BodyLook::Neptune => [0.38, 0.52, 0.95],
        BodyLook::Satellite => [0.80, 0.78, 0.72],
    }
}

/// Limb darkening strength (0 = flat): thick atmospheres darken towards the limb.
fn limb_darkening(look: BodyLook) -> f32 {
    match look {
        BodyLook::Jupiter | BodyLook::Saturn | BodyLook::Uranus | BodyLook::Neptune | BodyLook::Sun => 0.45,
        BodyLook::Venus => 0.25,
        _ => 0.1,
    }
}

struct Disc {
    cx: f32,
    cy: f32,
    r: f32,
    /// Screen unit vectors (pixel axes, y down): equator and north pole.
    eq: (f32, f32),
    pole: (f32, f32),
    /// Apparent polar / equatorial radius.
    pr: f32,
    /// Bright-limb direction and across it, in unit-disc coordinates (eq, pole).
    bl: (f32, f32),
    cos_i: f32,
}

impl Disc {
    fn new(b: &SceneBody, t: &ViewTransform) -> Disc {
        let (cx, cy) = t.to_px(b.offset);
        let r = (b.radius_rad * t.px_per_rad) as f32;
        let pole = t.dir_px(b.pole_dir);
        let pole = if pole == (0.0, 0.0) { (0.0, -1.0) } else { pole };
        let eq = (-pole.1, pole.0);
        let bl_px = t.dir_px(b.bright_limb_dir);
        let pr = (b.polar_ratio as f32).clamp(0.5, 1.0);
        let (bx, by) = (bl_px.0 * eq.0 + bl_px.1 * eq.1, (bl_px.0 * pole.0 + bl_px.1 * pole.1) / pr);
        let n = super::raster::sqrt(bx * bx + by * by).max(1e-9);
        Disc { cx, cy, r, eq, pole, pr, bl: (bx / n, by / n), cos_i: libm::cos(b.phase_angle_rad) as f32 }
    }

    /// Unit-disc coordinates (along equator, along pole) of a pixel point.
    #[inline]
    fn local(&self, x: f32, y: f32) -> (f32, f32) {
        let (dx, dy) = ((x - self.cx) / self.r, (y - self.cy) / self.r);
        (dx * self.eq.0 + dy * self.eq.1, (dx * self.pole.0 + dy * self.pole.1) / self.pr)
    }

    /// Coverage of the lit side at unit-disc point (a, b), soft over ~1.5 px.
    #[inline]
    fn lit(&self, a: f32, b: f32) -> f32 {
        let u = a * self.bl.0 + b * self.bl.1;
        let v = -a * self.bl.1 + b * self.bl.0;
        let d = u + self.cos_i * super::raster::sqrt((1.0 - v * v).max(0.0));
        (d * self.r / 1.5 + 0.5).clamp(0.0, 1.0)
    }
}

/// Bodies for the rows in `rows` (called per band, after the stars).
pub(crate) fn draw_bodies(cv: &mut Canvas, scene: &Scene, t: &ViewTransform, dpr: f32, pal: &Palette, rows: (usize, usize)) {
    let sky = pal.map(background::sky_colour(&scene.sky));
    let mut wx = Vec::new();
    for b in &scene.bodies {
        if !(b.offset.is_finite() && b.radius_rad.is_finite() && b.radius_rad >= 0.0) {
            continue;
        }
        let r_px = (b.radius_rad * t.px_per_rad) as f32;
        if r_px < 1.0 * dpr || b.look == BodyLook::Satellite && r_px < 2.0 * dpr {
            let (x, y) = t.to_px(b.offset);
            let mut look = stars::star_look(b.vmag.max(scene.mag_limit - 12.0), scene.mag_limit, dpr);
            if b.look == BodyLook::Satellite {
                // A moon beside its planet is a point, much smaller than the disc:
                // keep it near the base star width (bright, not bloated).
                let s = look.sigma_px.min(stars::SIGMA0_PX * dpr * 1.4);
                let peak = (look.flux / (core::f32::consts::TAU * look.sigma_px * look.sigma_px)).min(stars::PEAK_MAX);
                look = stars::StarLook { flux: peak * core::f32::consts::TAU * s * s, sigma_px: s, reach_px: stars::stamp_reach(s, dpr) };
            }
            stars::stamp(cv, x, y, look, pal.map(lit_colour(b.look)), rows, &mut wx);
            continue;
        }
        let disc = Disc::new(b, t);
        let ring_reach = if b.rings.is_some() { 2.3 } else { 1.0 };
        let reach = disc.r * ring_reach + 2.0;
        let y0 = ((disc.cy - reach).floor().max(0.0) as usize).max(rows.0);
        let y1 = ((disc.cy + reach).ceil().max(0.0) as usize).min(rows.1).min(cv.h);
        let x0 = (disc.cx - reach).floor().max(0.0) as usize;
        let x1 = ((disc.cx + reach).ceil().max(0.0) as usize).min(cv.w);
        if y0 >= y1 || x0 >= x1 {
            continue;
        }
        let lit = pal.map(lit_colour(b.look));
        let earthshine = if b.look == BodyLook::Moon { pal.map([0.005, 0.0055, 0.0065]) } else { [0.0; 3] };
        let ld = limb_darkening(b.look);
        let shade = |a: f32, bb: f32| -> [f32; 3] {
            // Colour of the globe at unit-disc point (a, bb), sky in front included.
            let rr = a * a + bb * bb;
            let mu = super::raster::sqrt((1.0 - rr).max(0.0));
            let mut k = (1.0 - ld) + ld * mu;
            if b.look == BodyLook::Jupiter {
                // The two dark equatorial belts (either side of the equator).
                let z = bb.abs() * 0.93;
                k *= 1.0 - 0.28 * (smooth_band(z, 0.10, 0.32));
            }
            let l = disc.lit(a, bb);
            let mut c = [0.0; 3];
            for ch in 0..3 {
                c[ch] = sky[ch] + lit[ch] * k * l + earthshine[ch] * (1.0 - l);
            }
            c
        };
        match b.rings {
            None => {
                for y in y0..y1 {
                    for x in x0..x1 {
                        let (a, bb) = disc.local(x as f32 + 0.5, y as f32 + 0.5);
                        let rr = super::raster::sqrt(a * a + bb * bb);
                        // Edge coverage from the distance to the limb in pixels.
                        let cov = ((1.0 - rr) * disc.r * disc.pr.min(1.0) + 0.5).clamp(0.0, 1.0);
                        if cov <= 0.0 {
                            continue;
                        }
                        let i = cv.idx(x, y);
                        cv.blend(i, shade(a, bb), cov);
                    }
                }
            }
            Some(rings) => {
                let sin_b = libm::sin(rings.tilt_rad) as f32;
                let sb = if sin_b.abs() < 0.01 { 0.01f32.copysign(sin_b + 1e-12) } else { sin_b };
                let ring_lit = pal.map([0.86, 0.80, 0.64]);
                let s2l = &luts().s2l;
                const SS: usize = 3;
                // Colour of one sample point, and whether Saturn covers it.
                let sample = |px: f32, py: f32, under: [f32; 3]| -> ([f32; 3], bool) {
                    let (a, bb) = disc.local(px, py);
                    // Ring-plane radius (equatorial radii) from the screen
                    // point: the pole axis is foreshortened by sin B.
                    let pole_px = bb * disc.pr;
                    let rho = super::raster::sqrt(a * a + (pole_px / sb) * (pole_px / sb));
                    let (ring_a, front) = (ring_opacity(rho), pole_px * sb < 0.0);
                    let on_globe = a * a + bb * bb < 1.0;
                    let mut c = under;
                    let mut any = false;
                    if on_globe {
                        c = shade(a, bb);
                        any = true;
                    }
                    if ring_a > 0.0 && (front || !on_globe) {
                        for ch in 0..3 {
                            c[ch] = c[ch] * (1.0 - ring_a) + (sky[ch] + ring_lit[ch] * ring_a.min(0.9)) * ring_a;
                        }
                        any = true;
                    }
                    (c, any)
                };
                // Largest change per pixel of the ring radius and of the globe radius:
                // pixels farther than that from every edge need one sample only.
                let g_rho = 1.5 / (disc.r * sb.abs());
                let g_globe = 1.5 / (disc.r * disc.pr);
                for y in y0..y1 {
                    for x in x0..x1 {
                        let (pcx, pcy) = (x as f32 + 0.5, y as f32 + 0.5);
                        let (a, bb) = disc.local(pcx, pcy);
                        let pole_px = bb * disc.pr;
                        let rho = super::raster::sqrt(a * a + (pole_px / sb) * (pole_px / sb));
                        let rg = super::raster::sqrt(a * a + bb * bb);
                        if rho - g_rho > RING_EDGES[4] && rg - g_globe > 1.0 {
                            continue;
                        }
                        let near = (rg - 1.0).abs() <= g_globe || RING_EDGES.iter().any(|e| (rho - e).abs() <= g_rho);
                        let i = cv.idx(x, y);
                        let under = [s2l[cv.px[i] as usize], s2l[cv.px[i + 1] as usize], s2l[cv.px[i + 2] as usize]];
                        if !near {
                            let (c, any) = sample(pcx, pcy, under);
                            if any {
                                cv.blend(i, c, 1.0);
                            }
                            continue;
                        }
                        let mut acc = [0.0f32; 3];
                        let mut any = false;
                        for sy in 0..SS {
                            for sx in 0..SS {
                                let px = x as f32 + (sx as f32 + 0.5) / SS as f32;
                                let py = y as f32 + (sy as f32 + 0.5) / SS as f32;
                                let (c, hit) = sample(px, py, under);
                                any |= hit;
                                for ch in 0..3 {
                                    acc[ch] += c[ch];
                                }
                            }
                        }
                        if any {
                            let n = (SS * SS) as f32;
                            cv.blend(i, [acc[0] / n, acc[1] / n, acc[2] / n], 1.0);
                        }
                    }
                }
            }
        }
    }
}

fn smooth_band(z: f32, a: f32, b: f32) -> f32 {
    let e = 0.04;
    let up = ((z - a + e) / (2.0 * e)).clamp(0.0, 1.0);
    let down = ((b + e - z) / (2.0 * e)).clamp(0.0, 1.0);
    up.min(down)
}

/// Ring edges (equatorial radii), see [`ring_opacity`].
const RING_EDGES: [f32; 5] = [1.239, 1.527, 1.951, 2.027, 2.269];

/// Opacity of Saturn's rings at ring-plane radius ρ (equatorial radii):
/// C ring 1.239–1.527, B ring 1.527–1.951, Cassini division 1.951–2.027,
/// A ring 2.027–2.269 (ring edges in km over 60 268 km, from memory).
pub fn ring_opacity(rho: f32) -> f32 {
    if rho < 1.239 {
        0.0
    } else if rho < 1.527 {
        0.18
    } else if rho < 1.951 {
        0.92
    } else if rho < 2.027 {
        0.08
    } else if rho < 2.269 {
        0.70
    } else {
        0.0
    }
}
