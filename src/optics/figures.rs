//! The figures of a train: scale, field, pupil, resolution, brightness.
//!
//! Each routine names its formula. Angles are radians inside; the few
//! arcsecond figures carry `_arcsec` in their names.

use super::advice;
use super::train::*;
use super::validate::{check, validate, OpticsError};
use serde::{Deserialize, Serialize};

/// Arcseconds per radian.
pub const ARCSEC_PER_RAD: f64 = 206_264.806_247_096_36;
/// Wavelength for the Rayleigh limit: 550 nm, the eye's peak, in mm.
pub const GREEN_MM: f64 = 550e-6;

/// The observer and the night, for the figures that depend on them.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Conditions {
    /// Dark-adapted pupil (about 7 mm young, about 5 mm past 50: common practice).
    #[serde(default = "default_eye_pupil_mm")]
    pub eye_pupil_mm: f64,
    /// Faintest star the naked eye sees at the zenith under this sky.
    #[serde(default = "default_nelm")]
    pub naked_eye_limit_mag: f64,
    /// Seeing, full width at half maximum.
    #[serde(default = "default_seeing_arcsec")]
    pub seeing_arcsec: f64,
}

fn default_eye_pupil_mm() -> f64 {
    7.0
}
fn default_nelm() -> f64 {
    6.0
}
fn default_seeing_arcsec() -> f64 {
    2.5
}

impl Default for Conditions {
    fn default() -> Self {
        Conditions {
            eye_pupil_mm: default_eye_pupil_mm(),
            naked_eye_limit_mag: default_nelm(),
            seeing_arcsec: default_seeing_arcsec(),
        }
    }
}

/// How the true field was found.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum TrueFieldMethod {
    /// Field stop ÷ effective focal length: the exact figure.
    FieldStop,
    /// Apparent field ÷ magnification: overstates wide-field eyepieces by several per cent.
    ApparentOverMagnification,
    /// Apparent field ÷ magnification would need a field stop wider than the
    /// barrel passes, so the barrel's limit was used instead.
    BarrelLimit,
    /// The instrument's stated true field (binoculars, finder).
    Stated,
    /// The sensor's diagonal (camera).
    SensorDiagonal,
    /// The chosen naked-eye view.
    NakedEye,
}

/// What ends the light path.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Mode {
    Visual,
    Camera,
    /// Phone held to an eyepiece (afocal).
    Phone,
}

/// Angular size of a sensor (or phone picture) on the sky.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct SensorField {
    pub width_rad: f64,
    pub height_rad: f64,
    pub diagonal_rad: f64,
}

/// Every figure a volunteer needs for one train.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Figures {
    pub mode: Mode,
    /// Light-gathering diameter (the eye's pupil for the naked eye).
    pub aperture_mm: f64,
    /// Focal length of the objective (telescopes only).
    pub focal_length_mm: Option<f64>,
    /// After Barlow lenses and reducers.
    pub effective_focal_length_mm: Option<f64>,
    /// Effective focal length ÷ aperture.
    pub focal_ratio: Option<f64>,
    /// None for a camera (an image, not a view).
    pub magnification: Option<f64>,
    /// Full width of the field on the sky (camera: the sensor diagonal).
    pub true_field_rad: f64,
    pub true_field_method: TrueFieldMethod,
    /// Angular diameter of the field as the eye sees it (the field circle to
    /// draw); the true field × magnification when the barrel limits it. None for a camera.
    pub apparent_field_rad: Option<f64>,
    pub exit_pupil_mm: Option<f64>,
    /// Arcseconds of sky per mm of focal plane (camera or phone sensor).
    pub plate_scale_arcsec_per_mm: Option<f64>,
    pub pixel_scale_arcsec: Option<f64>,
    pub sensor_field: Option<SensorField>,
    pub dawes_arcsec: f64,
    pub rayleigh_arcsec: f64,
    pub limiting_mag: f64,
    pub max_useful_magnification: f64,
    pub min_useful_magnification: f64,
    /// Fraction of the light reaching the eye or sensor.
    pub transmission: f64,
    /// Surface brightness of an extended object relative to the naked eye.
    pub surface_brightness_ratio: Option<f64>,
    /// Real factor of each Barlow/reducer, in light-path order.
    pub modifier_factors: Vec<f64>,
    pub advice: Vec<String>,
}

/// Focal ratio N = F / D (definition).
pub fn focal_ratio(focal_length_mm: f64, aperture_mm: f64) -> f64 {
    focal_length_mm / aperture_mm
}

/// Magnification M = F / f_e, objective over eyepiece focal length (Kepler's telescope).
pub fn magnification(effective_focal_length_mm: f64, eyepiece_focal_length_mm: f64) -> f64 {
    effective_focal_length_mm / eyepiece_focal_length_mm
}

/// Exit pupil d = D / M (the image of the aperture formed by the eyepiece).
pub fn exit_pupil_mm(aperture_mm: f64, magnification: f64) -> f64 {
    aperture_mm / magnification
}

/// True field from the field stop: 2·atan(s / 2F) ≈ s / F rad (57.3·s/F degrees).
pub fn true_field_from_stop_rad(field_stop_mm: f64, effective_focal_length_mm: f64) -> f64 {
    2.0 * libm::atan(field_stop_mm / (2.0 * effective_focal_length_mm))
}

/// True field ≈ apparent field ÷ magnification (the simple rule; overstates wide fields).
pub fn true_field_from_apparent_rad(apparent_field_rad: f64, magnification: f64) -> f64 {
    apparent_field_rad / magnification
}

/// Plate scale 206 265″ / F (F in mm gives ″/mm).
pub fn plate_scale_arcsec_per_mm(focal_length_mm: f64) -> f64 {
    ARCSEC_PER_RAD / focal_length_mm
}

/// Pixel scale = plate scale × pixel pitch = 206.265·p(µm) / F(mm) ″/px.
pub fn pixel_scale_arcsec(pixel_pitch_um: f64, focal_length_mm: f64) -> f64 {
    plate_scale_arcsec_per_mm(focal_length_mm) * pixel_pitch_um / 1000.0
}

/// Field of a flat sensor dimension: 2·atan(w / 2F) (pinhole projection).
pub fn sensor_angle_rad(size_mm: f64, focal_length_mm: f64) -> f64 {
    2.0 * libm::atan(size_mm / (2.0 * focal_length_mm))
}

/// Dawes' limit 116″ / D(mm) for equal double stars (Dawes 1867).
pub fn dawes_arcsec(aperture_mm: f64) -> f64 {
    116.0 / aperture_mm
}

/// Rayleigh criterion θ = 1.22 λ / D at λ = 550 nm (Airy disc first minimum).
pub fn rayleigh_arcsec(aperture_mm: f64) -> f64 {
    1.22 * GREEN_MM / aperture_mm * ARCSEC_PER_RAD
}

/// Visual limiting magnitude by light-grasp scaling of the naked-eye limit
/// (Pogson's ratio): m = m₀ + 5·log10(D_eff / p) + 2.5·log10(T), with
/// D_eff = min(D, M·p) the part of the aperture the eye's pupil p can use.
/// Conservative at high power, where the darker background helps (Schaefer 1990).
pub fn limiting_mag(naked_eye_limit_mag: f64, aperture_mm: f64, magnification: f64, eye_pupil_mm: f64, transmission: f64) -> f64 {
    let used = aperture_mm.min(magnification * eye_pupil_mm);
    naked_eye_limit_mag + 5.0 * libm::log10(used / eye_pupil_mm) + 2.5 * libm::log10(transmission)
}

/// Maximum useful magnification ≈ 2× the aperture in mm (common practice: 50× per inch).
pub fn max_useful_magnification(aperture_mm: f64) -> f64 {
    2.0 * aperture_mm
}

/// Minimum useful magnification D / p: the exit pupil fills the eye's pupil.
pub fn min_useful_magnification(aperture_mm: f64, eye_pupil_mm: f64) -> f64 {
    aperture_mm / eye_pupil_mm
}

/// Extended-object surface brightness relative to the naked eye:
/// T·min(1, (exit pupil / eye pupil)²) (conservation of radiance; never above T).
pub fn surface_brightness_ratio(transmission: f64, exit_pupil_mm: f64, eye_pupil_mm: f64) -> f64 {
    let r = (exit_pupil_mm / eye_pupil_mm).min(1.0);
    transmission * r * r
}

/// Real factor of a Barlow (f < 0) or reducer (f > 0) moved Δ further from
/// the focus: m = m₀ − Δ / f (thin lens, 1/s' = 1/s + 1/f).
pub fn modifier_factor(m: &FocalModifier, is_barlow: bool) -> f64 {
    match m.lens_focal_length_mm {
        Some(f_abs) if m.extra_spacing_mm != 0.0 => {
            let f = if is_barlow { -f_abs } else { f_abs };
            m.factor - m.extra_spacing_mm / f
        }
        _ => m.factor,
    }
}

/// Fraction of light passed: (1 − (d_obs/D)²)·Rⁿ·T_glass·ΠT_accessories
/// (obstruction area loss, n mirror reflections, lens and filter losses).
pub fn transmission(train: &Train) -> f64 {
    let mut t = match &train.instrument {
        Instrument::NakedEye(_) => 1.0,
        Instrument::Binoculars(b) => b.transmission,
        Instrument::Finder(f) => f.transmission,
        Instrument::Telescope(tel) => {
            let obs = tel.obstruction_mm / tel.aperture_mm;
            let mut t = (1.0 - obs * obs) * libm::pow(tel.mirror_reflectivity, tel.design.mirror_count() as f64);
            if tel.design.has_glass() {
                t *= tel.glass_transmission;
            }
            t
        }
    };
    for acc in &train.accessories {
        t *= match acc {
            Accessory::StarDiagonal(d) => d.transmission.unwrap_or(d.prism.default_transmission()),
            Accessory::Barlow(m) | Accessory::Reducer(m) => m.transmission,
            Accessory::Filter(f) => f.transmission,
            Accessory::Eyepiece(e) => e.transmission,
            Accessory::Camera(_) | Accessory::Phone(_) => 1.0,
        };
    }
    t
}

/// The figures of a train under default conditions (7 mm pupil, limit 6.0, seeing 2.5″).
pub fn figures(train: &Train) -> Result<Figures, OpticsError> {
    figures_for(train, &Conditions::default())
}

/// The figures of a train for a given observer and sky.
pub fn figures_for(train: &Train, cond: &Conditions) -> Result<Figures, OpticsError> {
    validate(train)?;
    check("conditions.eye_pupil_mm", cond.eye_pupil_mm, 2.0, 9.0, " mm")?;
    check("conditions.naked_eye_limit_mag", cond.naked_eye_limit_mag, 0.0, 8.5, " mag")?;
    check("conditions.seeing_arcsec", cond.seeing_arcsec, 0.2, 15.0, "″")?;
    let p = cond.eye_pupil_mm;
    let t = transmission(train);
    let mut modifier_factors = Vec::new();
    let mut f = Figures {
        mode: Mode::Visual,
        aperture_mm: p,
        focal_length_mm: None,
        effective_focal_length_mm: None,
        focal_ratio: None,
        magnification: Some(1.0),
        true_field_rad: 0.0,
        true_field_method: TrueFieldMethod::NakedEye,
        apparent_field_rad: None,
        exit_pupil_mm: None,
        plate_scale_arcsec_per_mm: None,
        pixel_scale_arcsec: None,
        sensor_field: None,
        dawes_arcsec: 0.0,
        rayleigh_arcsec: 0.0,
        limiting_mag: 0.0,
        max_useful_magnification: 0.0,
        min_useful_magnification: 0.0,
        transmission: t,
        surface_brightness_ratio: None,
        modifier_factors: Vec::new(),
        advice: Vec::new(),
    };
    let mut field_stop_estimate_mm = None;
    match &train.instrument {
        Instrument::NakedEye(n) => {
            f.true_field_rad = n.field_deg.to_radians();
            f.exit_pupil_mm = Some(p);
        }
        Instrument::Binoculars(b) => {
            f.aperture_mm = b.aperture_mm;
            f.magnification = Some(b.magnification);
            f.exit_pupil_mm = Some(exit_pupil_mm(b.aperture_mm, b.magnification));
            if let Some(tf) = b.true_field_deg {
                f.true_field_rad = tf.to_radians();
                f.true_field_method = TrueFieldMethod::Stated;
            } else if let Some(af) = b.apparent_field_deg {
                f.true_field_rad = true_field_from_apparent_rad(af.to_radians(), b.magnification);
                f.true_field_method = TrueFieldMethod::ApparentOverMagnification;
            }
        }
        Instrument::Finder(fd) => {
            f.aperture_mm = fd.aperture_mm;
            f.magnification = Some(fd.magnification);
            f.exit_pupil_mm = Some(exit_pupil_mm(fd.aperture_mm, fd.magnification));
            f.true_field_rad = fd.true_field_deg.to_radians();
            f.true_field_method = TrueFieldMethod::Stated;
        }
        Instrument::Telescope(tel) => {
            f.aperture_mm = tel.aperture_mm;
            f.focal_length_mm = Some(tel.focal_length_mm);
            let mut fe = tel.focal_length_mm;
            for (i, acc) in train.accessories.iter().enumerate() {
                let (m, barlow) = match acc {
                    Accessory::Barlow(m) => (m, true),
                    Accessory::Reducer(m) => (m, false),
                    _ => continue,
                };
                let k = modifier_factor(m, barlow);
                let (lo, hi) = if barlow { (1.0, 10.0) } else { (0.1, 1.0) };
                if !(k > lo && k < hi) {
                    return Err(OpticsError::RealFactorOutOfRange {
                        field: format!("accessories[{i}].extra_spacing_mm"),
                        factor: k,
                        min: lo,
                        max: hi,
                    });
                }
                modifier_factors.push(k);
                fe *= k;
            }
            f.effective_focal_length_mm = Some(fe);
            f.focal_ratio = Some(focal_ratio(fe, tel.aperture_mm));
            f.plate_scale_arcsec_per_mm = Some(plate_scale_arcsec_per_mm(fe));
            if let Some(cam) = train.camera() {
                f.mode = Mode::Camera;
                f.magnification = None;
                f.pixel_scale_arcsec = Some(pixel_scale_arcsec(cam.pixel_pitch_um, fe));
                let w = sensor_angle_rad(cam.sensor_width_mm, fe);
                let h = sensor_angle_rad(cam.sensor_height_mm, fe);
                let d = sensor_angle_rad(libm::hypot(cam.sensor_width_mm, cam.sensor_height_mm), fe);
                f.sensor_field = Some(SensorField { width_rad: w, height_rad: h, diagonal_rad: d });
                f.true_field_rad = d;
                f.true_field_method = TrueFieldMethod::SensorDiagonal;
            } else if let Some(ep) = train.eyepiece() {
                let m = magnification(fe, ep.focal_length_mm);
                f.magnification = Some(m);
                f.exit_pupil_mm = Some(exit_pupil_mm(tel.aperture_mm, m));
                if let Some(fs) = ep.field_stop_mm {
                    f.true_field_rad = true_field_from_stop_rad(fs, fe);
                    f.true_field_method = TrueFieldMethod::FieldStop;
                } else {
                    // The simple rule implies a stop of about f_e × apparent field.
                    let implied = ep.focal_length_mm * ep.apparent_field_deg.to_radians();
                    let cap = ep.barrel.max_field_stop_mm();
                    field_stop_estimate_mm = Some(implied);
                    if implied > cap {
                        f.true_field_rad = true_field_from_stop_rad(cap, fe);
                        f.true_field_method = TrueFieldMethod::BarrelLimit;
                    } else {
                        f.true_field_rad = true_field_from_apparent_rad(ep.apparent_field_deg.to_radians(), m);
                        f.true_field_method = TrueFieldMethod::ApparentOverMagnification;
                    }
                }
            }
        }
    }
    f.modifier_factors = modifier_factors;
    if let Some(m) = f.magnification {
        let stated = match &train.instrument {
            Instrument::Binoculars(b) => b.apparent_field_deg,
            _ => train.eyepiece().map(|e| e.apparent_field_deg),
        };
        f.apparent_field_rad = Some(match (f.true_field_method, stated) {
            // The barrel's stop is what the eye sees round the field.
            (TrueFieldMethod::BarrelLimit, _) | (_, None) => (f.true_field_rad * m).min(std::f64::consts::PI),
            (_, Some(a)) => a.to_radians(),
        });
    }
    let aperture = f.aperture_mm;
    f.dawes_arcsec = dawes_arcsec(aperture);
    f.rayleigh_arcsec = rayleigh_arcsec(aperture);
    f.max_useful_magnification = max_useful_magnification(aperture);
    f.min_useful_magnification = min_useful_magnification(aperture, p).max(1.0);
    // A camera integrates: use the full aperture for its limit figure.
    let m_for_limit = f.magnification.unwrap_or(f64::INFINITY);
    f.limiting_mag = limiting_mag(cond.naked_eye_limit_mag, aperture, m_for_limit, p, t);
    if let Some(ep_mm) = f.exit_pupil_mm {
        f.surface_brightness_ratio = Some(surface_brightness_ratio(t, ep_mm, p));
    }
    if let (Some(ph), Some(m)) = (train.phone(), f.magnification) {
        // Afocal: the phone lens behind a magnifier of M acts as focal length M·f_phone.
        f.mode = Mode::Phone;
        let fe = m * ph.lens_focal_length_mm;
        f.plate_scale_arcsec_per_mm = Some(plate_scale_arcsec_per_mm(fe));
        f.pixel_scale_arcsec = ph.pixel_pitch_um.map(|pp| pixel_scale_arcsec(pp, fe));
    }
    f.advice = advice::advise(train, &f, cond, field_stop_estimate_mm);
    Ok(f)
}

/// Photographic speed of train `a` relative to `b` for an extended object,
/// per unit image area: (T_a / N_a²) / (T_b / N_b²) (image illuminance ∝ T/N²).
/// An f/5 system against an f/10 one of equal transmission gives 4.
pub fn speed_ratio(a: &Train, b: &Train) -> Result<f64, OpticsError> {
    let fa = figures(a)?;
    let fb = figures(b)?;
    let na = fa.focal_ratio.ok_or(OpticsError::MissingField { field: "first train: a telescope (focal ratio)" })?;
    let nb = fb.focal_ratio.ok_or(OpticsError::MissingField { field: "second train: a telescope (focal ratio)" })?;
    Ok((fa.transmission / (na * na)) / (fb.transmission / (nb * nb)))
}

/// Exposure time of `a` relative to `b` for the same signal per unit image area (1 / speed ratio).
pub fn exposure_ratio(a: &Train, b: &Train) -> Result<f64, OpticsError> {
    Ok(1.0 / speed_ratio(a, b)?)
}
