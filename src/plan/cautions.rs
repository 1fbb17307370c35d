//! Safety: the Sun up or near a target during the event, solar viewing, and
//! the general cautions card for the field.

use super::assign::{StationPlan, TargetPlan};
use super::input::TargetKind;
use super::local_hhmm;
use super::schedule::{Prepared, SUNSET_ALT_DEG};
use serde::{Deserialize, Serialize};

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum CautionLevel {
    Note,
    Warning,
    Danger,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Caution {
    pub level: CautionLevel,
    pub text: String,
    pub station_index: Option<usize>,
    pub target_index: Option<usize>,
}

/// The sentence every Sun caution carries.
pub const SOLAR_RULE: &str =
    "Never point a telescope, finder or binoculars at or near the Sun without a proper full-aperture solar filter; solar viewing only with such a filter, per local rules and trained practice.";

/// Sun above the horizon from this altitude on counts as "up" for the cautions, deg
/// (a little below the geometric horizon: refraction and sweeping telescopes).
const SUN_UP_DEG: f64 = SUNSET_ALT_DEG - 1.0;

/// All cautions for this plan, most severe first.
pub fn cautions(p: &Prepared, targets: &[TargetPlan], stations: &[StationPlan]) -> Vec<Caution> {
    let inp = &p.input;
    let off = inp.utc_offset_minutes;
    let steps = &p.steps_utc_jd;
    let up: Vec<bool> = p.sun_alt_rad.iter().map(|a| a.to_degrees() > SUN_UP_DEG).collect();
    let mut out = Vec::new();
    if let (Some(first), Some(last)) = (up.iter().position(|&u| u), up.iter().rposition(|&u| u)) {
        out.push(Caution {
            level: CautionLevel::Danger,
            text: format!(
                "The Sun is up or at the horizon during the event ({}–{}). {}",
                local_hhmm(steps[first], off),
                local_hhmm(steps[last], off),
                SOLAR_RULE
            ),
            station_index: None,
            target_index: None,
        });
    }
    for (si, sp) in stations.iter().enumerate() {
        for sh in &sp.showings {
            let t = sh.target_index;
            let c = &inp.targets[t];
            if c.kind == TargetKind::Sun {
                out.push(Caution {
                    level: CautionLevel::Danger,
                    text: format!(
                        "{} shows the Sun {}–{}: only through its full-aperture solar filter, checked for damage before use and fixed so wind or a visitor cannot move it; finders capped or removed. {}",
                        sp.name, sh.start_local, sh.end_local, SOLAR_RULE
                    ),
                    station_index: Some(si),
                    target_index: Some(t),
                });
                continue;
            }
            let tr = &p.tracks[t];
            let near = steps
                .iter()
                .enumerate()
                .filter(|(_, &jd)| jd >= sh.start_utc_jd && jd <= sh.end_utc_jd)
                .filter(|(i, _)| up[*i] && tr.sun_sep_deg[*i] < inp.sun_caution_deg)
                .map(|(i, _)| tr.sun_sep_deg[i])
                .fold(f64::INFINITY, f64::min);
            if near.is_finite() {
                out.push(Caution {
                    level: CautionLevel::Danger,
                    text: format!(
                        "{}: {} is only {:.0}° from the Sun while the Sun is up ({}–{}). Aim only with the Sun blocked from view, keep visitors' hands off the telescope. {}",
                        sp.name, c.name, near, sh.start_local, sh.end_local, SOLAR_RULE
                    ),
                    station_index: Some(si),
                    target_index: Some(t),
                });
            }
        }
    }
    for (t, tp) in targets.iter().enumerate() {
        if tp.kind != TargetKind::Sun && tp.min_sun_sep_deg < inp.sun_caution_deg && !out.iter().any(|c| c.target_index == Some(t)) {
            out.push(Caution {
                level: CautionLevel::Warning,
                text: format!("{} comes within {:.0}° of the Sun in twilight or daylight. {}", tp.name, tp.min_sun_sep_deg, SOLAR_RULE),
                station_index: None,
                target_index: Some(t),
            });
        }
    }
    crate::sort::sort_by(&mut out, |a, b| b.level.cmp(&a.level));
    out
}

/// The cautions card for the whole field.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct CautionsCard {
    pub title: String,
    pub items: Vec<String>,
}

/// General cautions for a public night (common practice).
pub fn cautions_card() -> CautionsCard {
    CautionsCard {
        title: "Safety on the field".to_string(),
        items: vec![
            SOLAR_RULE.to_string(),
            "Laser pointers only as local law allows, only by a named volunteer, never towards people, aircraft or vehicles.".to_string(),
            "Steps: sturdy, wide, non-slip, with a volunteer beside them; no ladders for visitors.".to_string(),
            "Cables and tripod legs: route away from walkways, tape or cover them, mark with dim red light.".to_string(),
            "Light: red light only, dim, pointed at the ground; no white torches or phone screens on the field.".to_string(),
            "Children: accompanied at the eyepiece; nobody touches the telescope or the eyepiece while looking.".to_string(),
            "Cold and damp: warn visitors about dew and frost on metal; keep a first-aid kit and a torch at the desk.".to_string(),
        ],
    }
}
