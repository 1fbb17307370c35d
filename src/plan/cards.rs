//! Printable station cards: per station its showings with times, eyepiece,
//! what the visitor sees, orientation, eyepiece height, talking points,
//! events of the night and cautions. The page lays them out (print CSS).

use super::assign::{SkyEventKind, StationPlan, TargetPlan};
use super::cautions::{Caution, CautionLevel};
pub use super::cautions::CautionsCard;
use super::input::TargetKind;
use super::schedule::Prepared;
use super::talking_points::talking_points;
use super::visibility::Verdict;
use super::local_hhmm;
use serde::{Deserialize, Serialize};

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct CardEntry {
    pub from_local: String,
    pub to_local: String,
    pub target_index: usize,
    pub target: String,
    pub train_label: String,
    pub magnification: f64,
    pub true_field_deg: f64,
    /// "fills about a third of the field"...
    pub size_words: String,
    pub verdict: Verdict,
    pub verdict_words: String,
    pub orientation_note: String,
    pub height_words: String,
    pub access_notes: Vec<String>,
    pub talking_points: Vec<String>,
    pub events: Vec<String>,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StationCard {
    pub station: String,
    pub entries: Vec<CardEntry>,
    /// Danger/warning lines for this station (the page shows them prominently).
    pub cautions: Vec<String>,
}

pub fn moon_words(frac: f64, waxing: bool) -> String {
    let pct = libm::round(frac * 100.0);
    let phase = if frac < 0.03 {
        "new Moon"
    } else if frac > 0.97 {
        "full Moon"
    } else if (0.45..=0.55).contains(&frac) {
        if waxing { "first quarter" } else { "last quarter" }
    } else if frac < 0.5 {
        if waxing { "waxing crescent" } else { "waning crescent" }
    } else if waxing {
        "waxing gibbous"
    } else {
        "waning gibbous"
    };
    format!("{phase}, {pct:.0}% lit")
}

pub fn sky_event_words(k: SkyEventKind) -> &'static str {
    match k {
        SkyEventKind::Sunset => "Sunset",
        SkyEventKind::CivilDusk => "End of civil twilight",
        SkyEventKind::NauticalDusk => "End of nautical twilight",
        SkyEventKind::AstronomicalDusk => "Full darkness (end of astronomical twilight)",
        SkyEventKind::AstronomicalDawn => "Dawn begins (astronomical twilight)",
        SkyEventKind::NauticalDawn => "Nautical twilight begins",
        SkyEventKind::CivilDawn => "Civil twilight begins",
        SkyEventKind::Sunrise => "Sunrise",
        SkyEventKind::Moonrise => "Moonrise",
        SkyEventKind::Moonset => "Moonset",
    }
}

fn size_words(fill: f64, kind: TargetKind, major_arcmin: f64) -> String {
    if !fill.is_finite() || fill <= 0.0 {
        return String::new();
    }
    if kind == TargetKind::Planet && fill <= 0.25 {
        return format!("a small bright disc, {:.0}″ across", major_arcmin * 60.0);
    }
    if fill > 1.0 {
        "larger than the field".to_string()
    } else if fill > 0.6 {
        "fills most of the field".to_string()
    } else if fill > 0.25 {
        format!("about {:.0}% of the field across", fill * 100.0)
    } else if fill > 0.05 {
        "small in the field".to_string()
    } else {
        "a tiny spot or point in the field".to_string()
    }
}

pub fn station_cards(p: &Prepared, targets: &[TargetPlan], stations: &[StationPlan], cautions: &[Caution]) -> Vec<StationCard> {
    let inp = &p.input;
    let off = inp.utc_offset_minutes;
    stations
        .iter()
        .enumerate()
        .map(|(si, sp)| {
            let st = &inp.stations[si];
            let entries = sp
                .showings
                .iter()
                .map(|sh| {
                    let c = &inp.targets[sh.target_index];
                    let tr = &st.trains[sh.train_index];
                    let fill = targets[sh.target_index].per_station[si].as_ref().map(|v| v.frame.fill_frac).unwrap_or(f64::NAN);
                    let core = targets[sh.target_index].per_station[si].as_ref().map(|v| v.frame.note.clone()).unwrap_or_default();
                    let mut vw = sh.verdict.words().to_string();
                    if !core.is_empty() {
                        vw = format!("{vw}; {core}");
                    }
                    if c.kind == TargetKind::Galaxy && sh.verdict <= Verdict::AvertedVision {
                        vw.push_str("; expect only the brighter centre as a faint smudge");
                    }
                    let events = inp
                        .events
                        .iter()
                        .filter(|e| e.target_id == c.id && e.start_utc_jd <= sh.end_utc_jd && e.end_utc_jd.unwrap_or(e.start_utc_jd) >= sh.start_utc_jd)
                        .filter(|e| p.in_view_at(sh.target_index, e.start_utc_jd))
                        .map(|e| format!("{} {}", local_hhmm(e.start_utc_jd, off), e.text))
                        .collect();
                    CardEntry {
                        from_local: sh.start_local.clone(),
                        to_local: sh.end_local.clone(),
                        target_index: sh.target_index,
                        target: c.name.clone(),
                        train_label: tr.label.clone(),
                        magnification: tr.magnification,
                        true_field_deg: tr.true_field_deg,
                        size_words: size_words(fill, c.kind, c.major_arcmin),
                        verdict: sh.verdict,
                        verdict_words: vw,
                        orientation_note: tr.orientation_note.clone(),
                        height_words: height_words(sh.eyepiece_height_min_m, sh.eyepiece_height_max_m),
                        access_notes: sh.access_notes.clone(),
                        talking_points: talking_points(c, p.moon_distance_km),
                        events,
                    }
                })
                .collect();
            let cautions = cautions
                .iter()
                .filter(|c| c.level >= CautionLevel::Warning && (c.station_index.is_none() || c.station_index == Some(si)))
                .filter(|c| c.target_index.is_none_or(|t| sp.showings.iter().any(|s| s.target_index == t)) || c.station_index == Some(si))
                .map(|c| c.text.clone())
                .collect();
            StationCard { station: sp.name.clone(), entries, cautions }
        })
        .collect()
}

/// "eyepiece 1.07 m above the ground", or a range when the height changes by a
/// centimetre or more during the showing (to the centimetre a visitor can use).
pub fn height_words(min_m: f64, max_m: f64) -> String {
    let (lo, hi) = ((min_m * 100.0).round() / 100.0, (max_m * 100.0).round() / 100.0);
    if (hi - lo).abs() < 0.005 {
        format!("eyepiece {lo:.2} m above the ground")
    } else {
        format!("eyepiece {lo:.2}–{hi:.2} m above the ground")
    }
}
