//! Star colours: B−V → effective temperature (Ballesteros 2012, EPL 97, 34008)
//! → the sRGB colour of a blackbody at that temperature (Planck spectrum
//! weighted by the CIE 1931 colour-matching functions in the multi-lobe fit of
//! Wyman, Sloan & Shirley 2013, JCGT 2(2); XYZ → linear sRGB by IEC 61966-2-1).

use std::sync::OnceLock;

const BV_MIN: f32 = -0.4;
const BV_MAX: f32 = 2.0;
const BV_STEPS: usize = 241; // 0.01 mag steps

/// Effective temperature from B−V (Ballesteros 2012, eq. 14).
pub fn bv_to_temperature_k(bv: f64) -> f64 {
    4600.0 * (1.0 / (0.92 * bv + 1.7) + 1.0 / (0.92 * bv + 0.62))
}

fn lobe(l: f64, mu: f64, s1: f64, s2: f64) -> f64 {
    let s = if l < mu { s1 } else { s2 };
    let t = (l - mu) / s;
    libm::exp(-0.5 * t * t)
}

/// CIE 1931 2° colour-matching functions, multi-lobe fit (Wyman et al. 2013).
pub fn cie_xyz_bar(l_nm: f64) -> [f64; 3] {
    let x = 1.056 * lobe(l_nm, 599.8, 37.9, 31.0) + 0.362 * lobe(l_nm, 442.0, 16.0, 26.7)
        - 0.065 * lobe(l_nm, 501.1, 20.4, 26.2);
    let y = 0.821 * lobe(l_nm, 568.8, 46.9, 40.5) + 0.286 * lobe(l_nm, 530.9, 16.3, 31.1);
    let z = 1.217 * lobe(l_nm, 437.0, 11.8, 36.0) + 0.681 * lobe(l_nm, 459.0, 26.0, 13.8);
    [x, y, z]
}

/// Linear sRGB of a blackbody at `t_k`, scaled so the largest channel is 1.
pub fn blackbody_rgb(t_k: f64) -> [f32; 3] {
    const C2_NM_K: f64 = 1.438_776_877e7; // second radiation constant, nm·K (CODATA 2018)
    let mut xyz = [0.0f64; 3];
    let mut l = 380.0;
    while l <= 780.0 {
        let b = 1.0 / (l * l * l * l * l * (libm::exp(C2_NM_K / (l * t_k)) - 1.0));
        let c = cie_xyz_bar(l);
        for k in 0..3 {
            xyz[k] += b * c[k];
        }
        l += 5.0;
    }
    let [x, y, z] = xyz;
    let r = 3.2406 * x - 1.5372 * y - 0.4986 * z;
    let g = -0.9689 * x + 1.8758 * y + 0.0415 * z;
    let bl = 0.0557 * x - 0.2040 * y + 1.0570 * z;
    let (r, g, bl) = (r.max(0.0), g.max(0.0), bl.max(0.0));
    let m = r.max(g).max(bl).max(1e-30);
    [(r / m) as f32, (g / m) as f32, (bl / m) as f32]
}

/// How much of the blackbody colour is kept: stars look pale to the eye
/// (our display choice, not a measurement).
const SATURATION: f32 = 0.55;

fn table() -> &'static [[f32; 3]; BV_STEPS] {
    static T: OnceLock<[[f32; 3]; BV_STEPS]> = OnceLock::new();
    T.get_or_init(|| {
        let mut t = [[0.0; 3]; BV_STEPS];
        for (i, c) in t.iter_mut().enumerate() {
            let bv = BV_MIN as f64 + i as f64 * 0.01;
            let rgb = blackbody_rgb(bv_to_temperature_k(bv));
            let m = (0..3).map(|k| 1.0 - SATURATION + SATURATION * rgb[k]).fold(0.0f32, f32::max);
            for k in 0..3 {
                c[k] = (1.0 - SATURATION + SATURATION * rgb[k]) / m;
            }
        }
        t
    })
}

/// Display colour (linear RGB, max channel 1) of a star of colour index `bv`.
pub fn star_colour(bv: f32) -> [f32; 3] {
    let b = if bv.is_finite() { bv.clamp(BV_MIN, BV_MAX) } else { 0.6 };
    let i = ((b - BV_MIN) * 100.0 + 0.5) as usize;
    table()[i.min(BV_STEPS - 1)]
}
