//! Will a visitor see an extended object? Contrast-threshold model of
//! Crumey (2014, MNRAS 442, 2600, "Human contrast threshold and astronomical
//! visibility"), fitted by Crumey to Blackwell's (1946) threshold data,
//! with Crumey's telescopic extension (his section 3: exit-pupil dimming,
//! magnified area, monocular and field factors).
//!
//! Units: luminance in cd/m², areas in steradians, magnitudes V.
//! All float functions go through `libm` so native and wasm agree.

use serde::{Deserialize, Serialize};

/// V-band illuminance of a magnitude-0 source, lux (Crumey 2014, below eq. 4).
pub const ZV_LUX: f64 = 2.54e-6;
/// Below this background (cd/m²) thresholds stop falling (Crumey 2014, sec. 2.5).
pub const B_FLOOR_CD_M2: f64 = 1.0e-5;
/// Monocular telescope factor FT = √2 (Crumey 2014, sec. 1.6.4).
pub const MONOCULAR_FACTOR: f64 = core::f64::consts::SQRT_2;
/// Reference field factor F = 2 for an ordinary attentive observer, the value
/// Crumey (2014, sec. 3.1) uses for naked-eye limits.
pub const F_REFERENCE: f64 = 2.0;
/// Our field factor for an untrained visitor glancing into an eyepiece for a
/// minute, looking straight at the object: twice the reference (our choice,
/// about 0.75 mag harder). Averted vision, once told how, brings them back to F_REFERENCE.
pub const F_VISITOR: f64 = 4.0;

const SR_PER_ARCSEC2: f64 = (core::f64::consts::PI / 648_000.0) * (core::f64::consts::PI / 648_000.0);
const SR_PER_ARCMIN2: f64 = SR_PER_ARCSEC2 * 3600.0;

// Combined scotopic/photopic fit of R(B) to Blackwell (1946) (Crumey 2014 eqs. 25, 28).
const A1: f64 = 5.949e-8;
const A2: f64 = -2.389e-7;
const A3: f64 = 2.459e-7;
const A4: f64 = 4.120e-4;
const A5: f64 = -4.225e-4;
// Combined fit of the large-target asymptote C∞(B) (Crumey 2014 eqs. 39, 40).
const B1: f64 = 9.606e-6;
const B2: f64 = -4.112e-5;
const B3: f64 = 5.019e-5;
const B4: f64 = 4.837e-3;
const B5: f64 = -4.884e-3;

/// Surface-brightness zero point: μ = ZP − 2.5 log10(L / cd m⁻²) (≈ 12.58, Crumey 2014 sec. 1.1).
/// (Precomputed: −2.5·log10(sr per arcsec² / ZV); a test recomputes it.)
pub fn mu_zero_point() -> f64 {
    MU_ZERO_POINT
}

/// −2.5·log10((π/648000)² / 2.54e-6).
pub const MU_ZERO_POINT: f64 = ZP_VALUE;
const ZP_VALUE: f64 = 12.584_209_957_432_142;

/// 10^x through exp (cheaper than pow in the inner loop).
#[inline]
fn exp10(x: f64) -> f64 {
    libm::exp(x * core::f64::consts::LN_10)
}

/// b^(−1/4) through two square roots.
#[inline]
fn inv_fourth_root(b: f64) -> f64 {
    1.0 / libm::sqrt(libm::sqrt(b))
}

/// mag/arcsec² → cd/m² (Crumey 2014 sec. 1.1 zero point).
pub fn mag_arcsec2_to_cd_m2(mu: f64) -> f64 {
    exp10((MU_ZERO_POINT - mu) / 2.5)
}

/// cd/m² → mag/arcsec².
pub fn cd_m2_to_mag_arcsec2(l_cd_m2: f64) -> f64 {
    if l_cd_m2 <= 0.0 {
        return f64::INFINITY;
    }
    mu_zero_point() - 2.5 * libm::log10(l_cd_m2)
}

/// Illuminance (lux) → V magnitude.
pub fn lux_to_mag(lux: f64) -> f64 {
    if lux <= 0.0 {
        return f64::INFINITY;
    }
    -2.5 * libm::log10(lux / ZV_LUX)
}

/// arcmin² → sr.
pub fn arcmin2_to_sr(a: f64) -> f64 {
    a * SR_PER_ARCMIN2
}

/// Riccò factor R(B) = C·A for point-like targets, sr (Crumey 2014 eq. 25 with eq. 28 coefficients).
pub fn ricco_factor_sr(b_cd_m2: f64) -> f64 {
    let b = b_cd_m2.max(B_FLOOR_CD_M2);
    let q4 = inv_fourth_root(b);
    let inner = (A1 * q4 * q4 + A2 * q4 + A3).max(0.0);
    let r = libm::sqrt(inner) + A4 * q4 + A5;
    r * r
}

/// Large-target threshold contrast C∞(B) (Crumey 2014 eq. 39 with eq. 40 coefficients).
pub fn c_inf(b_cd_m2: f64) -> f64 {
    let b = b_cd_m2.max(B_FLOOR_CD_M2);
    let q4 = inv_fourth_root(b);
    let inner = (B1 * q4 * q4 + B2 * q4 + B3).max(0.0);
    libm::sqrt(inner) + B4 * q4 + B5
}

// Scotopic-only fits (Crumey 2014 eqs. 23, 26 and 35, 37); his linear
// approximations (eqs. 55, 57, 63) are built on these.
const R1: f64 = 6.505e-4;
const R2: f64 = -8.461e-4;
const K1: f64 = 7.633e-3;
const K2: f64 = -7.174e-3;

/// Scotopic-branch R(B) = (r1·B^−¼ + r2)² (Crumey 2014 eqs. 23, 26); valid for night skies.
pub fn ricco_factor_scotopic_sr(b_cd_m2: f64) -> f64 {
    let r = R1 * inv_fourth_root(b_cd_m2.max(B_FLOOR_CD_M2)) + R2;
    r * r
}

/// Scotopic-branch C∞(B) = k1·B^−¼ + k2 (Crumey 2014 eqs. 35, 37).
pub fn c_inf_scotopic(b_cd_m2: f64) -> f64 {
    K1 * inv_fourth_root(b_cd_m2.max(B_FLOOR_CD_M2)) + K2
}

/// Joining exponent q(B) (Crumey 2014 eqs. 42–44).
pub fn join_exponent(b_cd_m2: f64) -> f64 {
    let b = b_cd_m2.max(B_FLOOR_CD_M2);
    if b >= 3.40 {
        (1.146 - 0.0885 * libm::log10(b)).max(0.05)
    } else if b >= 0.193 {
        0.8861 + 0.4 * libm::log10(b)
    } else {
        0.6
    }
}

/// R, C∞ and q of one adapting background (shared by every target size on it).
#[derive(Clone, Copy, Debug)]
pub struct Background {
    pub b_cd_m2: f64,
    pub ln_r: f64,
    pub ln_c_inf: f64,
    pub q: f64,
}

/// Evaluate the fits once for background `b_cd_m2` (held at the floor below 1e-5 cd/m²).
pub fn background(b_cd_m2: f64) -> Background {
    let b = b_cd_m2.max(B_FLOOR_CD_M2);
    Background { b_cd_m2: b, ln_r: libm::log(ricco_factor_sr(b)), ln_c_inf: libm::log(c_inf(b)), q: join_exponent(b) }
}

/// ln of the threshold contrast ((R/A)^q + C∞^q)^(1/q) on `bg` for area `area_sr` (Crumey 2014 eq. 41).
pub fn ln_threshold_contrast(bg: &Background, area_sr: f64) -> f64 {
    let q = bg.q;
    // log-sum-exp form keeps tiny areas finite.
    let x = q * (bg.ln_r - libm::log(area_sr.max(1e-30)));
    let y = q * bg.ln_c_inf;
    let hi = x.max(y);
    (hi + libm::log1p(libm::exp(x.min(y) - hi))) / q
}

/// Threshold luminance increment ΔB (cd/m²) for a uniform disc of area
/// `area_sr` on background `b_cd_m2`, field factor `f`
/// (Crumey 2014 eq. 41: ΔB = F·B·((R/A)^q + C∞^q)^(1/q); B held at the floor below 1e-5 cd/m²).
pub fn threshold_increment_cd_m2(area_sr: f64, b_cd_m2: f64, f: f64) -> f64 {
    let bg = background(b_cd_m2);
    f * bg.b_cd_m2 * libm::exp(ln_threshold_contrast(&bg, area_sr))
}

/// Naked-eye limiting magnitude of a star (point-source limit of eq. 41, Crumey 2014 sec. 3.1).
pub fn naked_eye_limit_mag(sky_mu: f64, f: f64) -> f64 {
    let b = mag_arcsec2_to_cd_m2(sky_mu).max(B_FLOOR_CD_M2);
    lux_to_mag(f * b * ricco_factor_sr(b))
}

/// Naked-eye limiting surface brightness of a very large target, μ∞ (Crumey 2014 sec. 3.1).
pub fn naked_eye_limit_mu_inf(sky_mu: f64, f: f64) -> f64 {
    let b = mag_arcsec2_to_cd_m2(sky_mu).max(B_FLOOR_CD_M2);
    cd_m2_to_mag_arcsec2(f * b * c_inf(b))
}

/// Radius of the Riccò area R/C∞, arcmin (Crumey 2014 eq. 22).
pub fn ricco_radius_arcmin(sky_mu: f64) -> f64 {
    let b = mag_arcsec2_to_cd_m2(sky_mu);
    let a_arcmin2 = ricco_factor_sr(b) / c_inf(b) / SR_PER_ARCMIN2;
    libm::sqrt(a_arcmin2 / core::f64::consts::PI)
}

/// The optical path from sky to eye, as the threshold model needs it.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Eyepath {
    pub aperture_mm: f64,
    pub magnification: f64,
    /// Eye pupil of the visitor, mm (6 mm for a mixed public: common practice).
    pub eye_pupil_mm: f64,
    /// Fraction of the object's light reaching the eye (mirrors, lenses,
    /// central obstruction, filter pass band for the object's light).
    pub target_transmission: f64,
    /// Fraction of the sky's light reaching the eye (differs from the object's
    /// only with a band-pass filter).
    pub sky_transmission: f64,
}

/// Limiting magnitude of a star through a telescope (Crumey 2014 sec. 3.2 telescopic point-source limit,
/// g = (min(d,p)/p)²·T dimming, M² flux gain, φ = F·FT).
pub fn telescopic_star_limit_mag(sky_mu: f64, path: &Eyepath, f: f64) -> f64 {
    let d = path.aperture_mm / path.magnification.max(1e-9);
    let p = path.eye_pupil_mm;
    let dmin = d.min(p);
    let g_sky = (dmin / p) * (dmin / p) * path.sky_transmission;
    let g_t = (dmin / p) * (dmin / p) * path.target_transmission;
    let b_app = g_sky * mag_arcsec2_to_cd_m2(sky_mu);
    let b = b_app.max(B_FLOOR_CD_M2);
    let phi = f * MONOCULAR_FACTOR;
    let di_app = phi * b * ricco_factor_sr(b);
    let m2 = path.magnification * path.magnification;
    lux_to_mag(di_app / (g_t * m2).max(1e-300))
}

/// How far above (+) or below (−) threshold an object is, in magnitudes,
/// seen through `path` (Crumey 2014 sec. 3.3 extended targets: apparent
/// background g·B, apparent area M²·A, increment compared at the eye).
/// `obj_mu` is the object's mean surface brightness as it reaches the
/// ground (V, after extinction and colour correction); `sky_mu` the sky at the object.
pub fn extended_margin_mag(obj_mu: f64, area_arcmin2: f64, sky_mu: f64, path: &Eyepath, f: f64) -> f64 {
    let d = path.aperture_mm / path.magnification.max(1e-9);
    let p = path.eye_pupil_mm;
    let dim = (d.min(p) / p) * (d.min(p) / p);
    let b_app = dim * path.sky_transmission * mag_arcsec2_to_cd_m2(sky_mu);
    let obj_app = dim * path.target_transmission * mag_arcsec2_to_cd_m2(obj_mu);
    let area_app_sr = arcmin2_to_sr(area_arcmin2) * path.magnification * path.magnification;
    let th = threshold_increment_cd_m2(area_app_sr, b_app, f * MONOCULAR_FACTOR);
    if obj_app <= 0.0 {
        return f64::NEG_INFINITY;
    }
    2.5 * libm::log10(obj_app / th)
}

/// Same, for the naked eye (no telescope, binocular: no FT).
pub fn naked_eye_margin_mag(obj_mu: f64, area_arcmin2: f64, sky_mu: f64, f: f64) -> f64 {
    let b = mag_arcsec2_to_cd_m2(sky_mu);
    let th = threshold_increment_cd_m2(arcmin2_to_sr(area_arcmin2), b, f);
    2.5 * libm::log10(mag_arcsec2_to_cd_m2(obj_mu) / th)
}

/// Scotopic colour correction between a target and the sky, in magnitudes
/// the target gains (+) relative to the sky (Crumey 2014 eq. 18: Δm = 0.27·(c_sky − c_target)).
pub fn colour_gain_mag(target_bv: f64, sky_bv: f64) -> f64 {
    0.27 * (sky_bv - target_bv)
}

/// Plain-words verdict for an untrained visitor.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize, Deserialize)]
pub enum Verdict {
    NotVisible,
    AvertedVision,
    Visible,
    Easy,
}

impl Verdict {
    /// Words for the card.
    pub fn words(self) -> &'static str {
        match self {
            Verdict::Easy => "easy",
            Verdict::Visible => "visible: look steadily for a while",
            Verdict::AvertedVision => "visible with averted vision (look slightly to one side)",
            Verdict::NotVisible => "not visible tonight",
        }
    }
}

/// Margins at the visitor and reference field factors, and the verdict.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Assessment {
    pub verdict: Verdict,
    /// Margin for a visitor looking straight at it (F = F_VISITOR), mag.
    pub visitor_margin_mag: f64,
    /// Margin with averted vision (F = F_REFERENCE), mag.
    pub averted_margin_mag: f64,
    /// Only the bright core of the object passes the threshold.
    pub core_only: bool,
}

/// Threshold for "easy": a visitor margin of at least 1 mag (our choice).
pub const EASY_MARGIN_MAG: f64 = 1.0;

/// The object as the model sees it: a uniform mean disc plus an optional core.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ExtendedLight {
    /// Mean V surface brightness above the atmosphere, mag/arcsec².
    pub mean_mu_v: f64,
    pub area_arcmin2: f64,
    /// Core: fraction of the area and how much brighter (mag/arcsec², ≥ 0).
    pub core_area_frac: f64,
    pub core_gain_mag: f64,
    /// B−V colour used for the scotopic correction.
    pub bv: f64,
}

/// Verdict for `light` through `path`, with `extinction_mag` at the object's
/// air mass and the local sky `sky_mu` (including moonlight, twilight),
/// sky colour `sky_bv`. Evaluates the whole object and its core and keeps the better.
/// (Same model as [`extended_margin_mag`], with the background fits evaluated once.)
pub fn assess(light: &ExtendedLight, extinction_mag: f64, sky_mu: f64, sky_bv: f64, path: &Eyepath) -> Assessment {
    let mu = light.mean_mu_v + extinction_mag - colour_gain_mag(light.bv, sky_bv);
    let d = path.aperture_mm / path.magnification.max(1e-9);
    let p = path.eye_pupil_mm;
    let dim = (d.min(p) / p) * (d.min(p) / p);
    let bg = background(dim * path.sky_transmission * mag_arcsec2_to_cd_m2(sky_mu));
    let m2 = path.magnification * path.magnification;
    // margin at F: 2.5 log10(obj / (F·FT·B·C)); ln → mag via 2.5/ln 10.
    let k = 2.5 / core::f64::consts::LN_10;
    let ln_th0 = libm::log(F_VISITOR * MONOCULAR_FACTOR * bg.b_cd_m2);
    let ln_obj = libm::log(dim * path.target_transmission) + (vis_zero_ln() - mu / k);
    let whole_v = k * (ln_obj - ln_th0 - ln_threshold_contrast(&bg, arcmin2_to_sr(light.area_arcmin2) * m2));
    let to_averted = 2.5 * libm::log10(F_VISITOR / F_REFERENCE);
    let mut vis = whole_v;
    if light.core_area_frac > 0.0 && light.core_gain_mag > 0.0 {
        let ca = arcmin2_to_sr(light.area_arcmin2 * light.core_area_frac) * m2;
        let core_v = k * (ln_obj + light.core_gain_mag / k - ln_th0 - ln_threshold_contrast(&bg, ca));
        vis = vis.max(core_v);
    }
    let avr = vis + to_averted;
    let verdict = verdict_of(vis, avr);
    let core_only = verdict > verdict_of(whole_v, whole_v + to_averted);
    Assessment { verdict, visitor_margin_mag: vis, averted_margin_mag: avr, core_only }
}

/// ln of the luminance (cd/m²) of a 0 mag/arcsec² surface.
fn vis_zero_ln() -> f64 {
    MU_ZERO_POINT / (2.5 / core::f64::consts::LN_10)
}

fn verdict_of(visitor_margin: f64, averted_margin: f64) -> Verdict {
    if visitor_margin >= EASY_MARGIN_MAG {
        Verdict::Easy
    } else if visitor_margin >= 0.0 {
        Verdict::Visible
    } else if averted_margin >= 0.0 {
        Verdict::AvertedVision
    } else {
        Verdict::NotVisible
    }
}

/// How strongly a drawn view should show the object, 0–1, from the same margins
/// as the verdict (0 = not drawn: "not visible tonight"; 0.15–0.35 averted
/// vision; 0.35–0.7 visible; 0.7–1 easy). Monotonic in the margins, so a renderer
/// that scales the object's drawn contrast by it agrees with the words.
pub fn view_strength(a: &Assessment) -> f32 {
    let to_averted = 2.5 * libm::log10(F_VISITOR / F_REFERENCE);
    let s = match a.verdict {
        Verdict::NotVisible => 0.0,
        Verdict::AvertedVision => 0.15 + 0.2 * (a.averted_margin_mag / to_averted).clamp(0.0, 1.0),
        Verdict::Visible => 0.35 + 0.35 * (a.visitor_margin_mag / EASY_MARGIN_MAG).clamp(0.0, 1.0),
        Verdict::Easy => 0.7 + 0.3 * ((a.visitor_margin_mag - EASY_MARGIN_MAG) / 2.0).clamp(0.0, 1.0),
    };
    s as f32
}
