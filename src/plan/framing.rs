//! Which train of a station frames a target best: the object fits the true
//! field with a margin (extended objects), or the magnification lies in the
//! useful range (planets), and among those the best visibility.

use super::input::{TargetKind, TrainOption};
use serde::{Deserialize, Serialize};

/// An object should span at most 1/FIT_MARGIN of the true field (our choice:
/// room to find it and for it to drift a little).
pub const FIT_MARGIN: f64 = 1.3;
/// The whole Moon or Sun disc should span at most this part of the field.
pub const DISC_MARGIN: f64 = 1.15;
/// Visibility margins closer than this count as equal; then the larger image wins (mag).
pub const MARGIN_TIE_MAG: f64 = 0.3;

/// Useful magnification range for a planet, (min, max): exit pupil no larger
/// than the eye's; at most 2× per mm of aperture, and at most about 400/seeing″
/// (common practice: above about 200× the view rarely improves in ordinary 2″ seeing).
pub fn useful_magnification(aperture_mm: f64, eye_pupil_mm: f64, seeing_arcsec: f64) -> (f64, f64) {
    let lo = aperture_mm / eye_pupil_mm;
    let hi = (2.0 * aperture_mm).min(400.0 / seeing_arcsec).max(lo);
    (lo, hi)
}

/// The chosen train and how the target sits in it.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct FrameChoice {
    pub train_index: usize,
    /// The target fits the field with the margin.
    pub fits: bool,
    /// Target size over true field (1 = fills it edge to edge).
    pub fill_frac: f64,
    /// For planets: magnification in the useful range.
    pub in_useful_range: bool,
    pub note: String,
}

/// Choose the train of `trains` for a target of `kind` and size `major_arcmin`;
/// `margin_of(i)` gives the visibility margin (mag) of train i for this target.
/// Trains with a solar filter serve the Sun only; the Sun only them. None if no train may show it.
pub fn best_frame(
    kind: TargetKind,
    major_arcmin: f64,
    trains: &[TrainOption],
    eye_pupil_mm: f64,
    seeing_arcsec: f64,
    margin_of: &mut dyn FnMut(usize) -> f64,
) -> Option<FrameChoice> {
    let allowed: Vec<usize> = (0..trains.len()).filter(|&i| trains[i].solar_filtered == (kind == TargetKind::Sun)).collect();
    if allowed.is_empty() {
        return None;
    }
    let field_arcmin = |i: usize| trains[i].true_field_deg * 60.0;
    let fill = |i: usize| if field_arcmin(i) > 0.0 { major_arcmin / field_arcmin(i) } else { f64::INFINITY };
    let widest = *allowed
        .iter()
        .max_by(|&&a, &&b| field_arcmin(a).total_cmp(&field_arcmin(b)).then(b.cmp(&a)))?;
    let choice = |i: usize, fits: bool, useful: bool, note: String| FrameChoice {
        train_index: i,
        fits,
        fill_frac: fill(i),
        in_useful_range: useful,
        note,
    };
    match kind {
        TargetKind::Planet => {
            let mut best: Option<(usize, f64)> = None;
            for &i in &allowed {
                let t = &trains[i];
                let (lo, hi) = useful_magnification(t.aperture_mm, eye_pupil_mm, seeing_arcsec);
                let pref = (1.2 * t.aperture_mm).clamp(lo, hi);
                let inside = t.magnification >= lo * 0.999 && t.magnification <= hi * 1.001;
                // Distance from the preferred magnification in log units; outside the range costs more.
                let cost = libm::fabs(libm::log(t.magnification / pref)) + if inside { 0.0 } else { 10.0 };
                if best.is_none_or(|(_, c)| cost < c) {
                    best = Some((i, cost));
                }
            }
            let (i, cost) = best?;
            let useful = cost < 10.0;
            let note = if useful {
                String::new()
            } else {
                "no eyepiece gives a useful magnification for this planet".to_string()
            };
            Some(choice(i, fill(i) * FIT_MARGIN <= 1.0, useful, note))
        }
        TargetKind::Moon | TargetKind::Sun => {
            let fitting = allowed.iter().copied().filter(|&i| fill(i) * DISC_MARGIN <= 1.0);
            match fitting.max_by(|&a, &b| trains[a].magnification.total_cmp(&trains[b].magnification).then(b.cmp(&a))) {
                Some(i) => Some(choice(i, true, true, String::new())),
                None => Some(choice(widest, false, true, "the whole disc does not fit: visitors see part of it".to_string())),
            }
        }
        _ => {
            let fitting: Vec<usize> = allowed.iter().copied().filter(|&i| fill(i) * FIT_MARGIN <= 1.0).collect();
            if fitting.is_empty() {
                return Some(choice(widest, false, true, "larger than the field: visitors see the central part".to_string()));
            }
            let margins: Vec<(usize, f64)> = fitting.iter().map(|&i| (i, margin_of(i))).collect();
            let top = margins.iter().map(|m| m.1).fold(f64::NEG_INFINITY, f64::max);
            let i = margins
                .iter()
                .filter(|m| m.1 >= top - MARGIN_TIE_MAG)
                .max_by(|a, b| trains[a.0].magnification.total_cmp(&trains[b.0].magnification).then(b.0.cmp(&a.0)))?
                .0;
            Some(choice(i, true, true, String::new()))
        }
    }
}
