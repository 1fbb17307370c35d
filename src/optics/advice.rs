//! Advice in plain words for a train's figures (rules of thumb of the trade).

use super::figures::{Conditions, Figures, Mode, TrueFieldMethod};
use super::train::*;

/// Pupil of older eyes (common practice: about 5 mm past 50).
pub const OLDER_EYE_PUPIL_MM: f64 = 5.0;
/// Beyond about this magnification the view rarely improves in ordinary seeing (common practice).
pub const SEEING_LIMIT_MAGNIFICATION: f64 = 200.0;
/// Eye relief glasses wearers need (common practice: about 15 mm or more).
pub const GLASSES_EYE_RELIEF_MM: f64 = 15.0;

/// How a camera's pixels sample the seeing disc.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Sampling {
    /// Pixels larger than half the seeing: stars look blocky.
    Under,
    /// Between a third and a half of the seeing (the Nyquist rule of thumb).
    Good,
    /// Pixels smaller than a third of the seeing: resolution wasted, less signal per pixel.
    Over,
}

/// Sampling by the Nyquist rule of thumb: 2–3 pixels across the seeing FWHM.
pub fn sampling(pixel_scale_arcsec: f64, seeing_arcsec: f64) -> Sampling {
    if pixel_scale_arcsec > seeing_arcsec / 2.0 {
        Sampling::Under
    } else if pixel_scale_arcsec < seeing_arcsec / 3.0 {
        Sampling::Over
    } else {
        Sampling::Good
    }
}

/// Plain-language advice, most important first.
pub fn advise(train: &Train, f: &Figures, cond: &Conditions, implied_stop_mm: Option<f64>) -> Vec<String> {
    let mut out = Vec::new();
    if train.accessories.iter().any(|a| matches!(a, Accessory::Filter(fl) if fl.filter == FilterKind::Solar)) {
        out.push(
            "Solar filter fitted: look at the Sun only with a proper full-aperture solar filter, \
             checked before every use, per local rules and trained practice."
                .to_string(),
        );
    }
    if let (Some(ep), Some(m)) = (f.exit_pupil_mm, f.magnification) {
        if m > 1.0 {
            if ep > cond.eye_pupil_mm {
                out.push(format!(
                    "Exit pupil {ep:.1} mm is wider than the eye's pupil ({:.0} mm): part of the aperture is wasted; \
                     a shorter eyepiece (at least {:.0}×) uses all of it.",
                    cond.eye_pupil_mm, f.min_useful_magnification
                ));
            } else if ep > OLDER_EYE_PUPIL_MM {
                out.push(format!(
                    "Exit pupil {ep:.1} mm: older visitors, whose pupils open to about {OLDER_EYE_PUPIL_MM:.0} mm, lose part of the aperture."
                ));
            }
            if ep < 0.5 {
                out.push(format!("Exit pupil {ep:.2} mm is very small: the view is dim and floaters in the eye show."));
            }
        }
        if m > f.max_useful_magnification {
            out.push(format!(
                "Magnification {m:.0}× is past the useful maximum of about {:.0}× (twice the aperture in mm): \
                 the image only gets bigger, dimmer and softer.",
                f.max_useful_magnification
            ));
        }
        if m > SEEING_LIMIT_MAGNIFICATION {
            out.push(format!(
                "At {m:.0}×: beyond about {SEEING_LIMIT_MAGNIFICATION:.0}× the view rarely improves in ordinary seeing."
            ));
        }
    }
    match f.true_field_method {
        TrueFieldMethod::ApparentOverMagnification => out.push(
            "True field from apparent field ÷ magnification: this overstates wide-field eyepieces by several per cent; \
             enter the eyepiece's field stop for the exact figure."
                .to_string(),
        ),
        TrueFieldMethod::BarrelLimit => {
            if let (Some(ep), Some(stop)) = (train.eyepiece(), implied_stop_mm) {
                out.push(format!(
                    "This eyepiece's apparent field would need a field stop of about {stop:.0} mm, more than a {} barrel passes \
                     (about {:.0} mm): the true field shown is the barrel's limit.",
                    ep.barrel.label(),
                    ep.barrel.max_field_stop_mm()
                ));
            }
        }
        _ => {}
    }
    let eye_relief = match &train.instrument {
        Instrument::Binoculars(b) => b.eye_relief_mm,
        _ => train.eyepiece().and_then(|e| e.eye_relief_mm),
    };
    if let Some(er) = eye_relief {
        if er < GLASSES_EYE_RELIEF_MM && f.mode != Mode::Camera {
            out.push(format!(
                "Eye relief {er:.0} mm: visitors with glasses need about {GLASSES_EYE_RELIEF_MM:.0} mm or more to see the whole field."
            ));
        }
    }
    for (acc, k) in train
        .accessories
        .iter()
        .filter_map(|a| match a {
            Accessory::Barlow(m) | Accessory::Reducer(m) => Some(m),
            _ => None,
        })
        .zip(&f.modifier_factors)
    {
        if (k - acc.factor).abs() > 0.005 {
            out.push(format!(
                "The {:.2}× lens sits {:.0} mm away from its design spacing: its real factor is {k:.2}× \
                 (a Barlow's factor grows, a reducer's shrinks, with distance from the focus).",
                acc.factor, acc.extra_spacing_mm
            ));
        }
    }
    if let Some(px) = f.pixel_scale_arcsec {
        let s = cond.seeing_arcsec;
        match sampling(px, s) {
            Sampling::Under => out.push(format!(
                "Pixel scale {px:.2}″ is coarse for {s:.1}″ seeing (under-sampled: want about {:.2}–{:.2}″ per pixel); \
                 a Barlow lens samples finer, over a smaller field.",
                s / 3.0,
                s / 2.0
            )),
            Sampling::Over => out.push(format!(
                "Pixel scale {px:.2}″ is finer than {s:.1}″ seeing can use (over-sampled: about {:.2}–{:.2}″ per pixel suffices); \
                 a focal reducer or 2×2 binning gives more signal per pixel.",
                s / 3.0,
                s / 2.0
            )),
            Sampling::Good => {}
        }
    }
    out
}
