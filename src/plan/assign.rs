//! From the prepared night to a plan: windows and best times per target,
//! showings per station (greedy per slot), the field timeline, twilight and
//! Moon summary, cautions and cards. Cheap: reads only the prepared grid.

use super::cards::{self, CautionsCard, StationCard};
use super::cautions::{self, Caution};
use super::framing::FrameChoice;
use super::height::{self, Access};
use super::input::{AzSector, PlanInput, TargetKind};
use super::schedule::{prepare, Prepared, Window, SUNSET_ALT_DEG};
use super::visibility::Verdict;
use super::{local_hhmm, PlanError};
use serde::{Deserialize, Serialize};

/// The plan for the night (serde: the page draws it).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Plan {
    pub steps_utc_jd: Vec<f64>,
    pub sun_alt_deg: Vec<f32>,
    pub sky_events: Vec<SkyEvent>,
    pub moon: MoonSummary,
    pub targets: Vec<TargetPlan>,
    pub stations: Vec<StationPlan>,
    pub timeline: Vec<TimelineEntry>,
    pub cautions: Vec<Caution>,
    pub cards: Vec<StationCard>,
    pub cautions_card: CautionsCard,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum SkyEventKind {
    Sunset,
    CivilDusk,
    NauticalDusk,
    AstronomicalDusk,
    AstronomicalDawn,
    NauticalDawn,
    CivilDawn,
    Sunrise,
    Moonrise,
    Moonset,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct SkyEvent {
    pub kind: SkyEventKind,
    pub utc_jd: f64,
    pub local: String,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct MoonSummary {
    pub phase_angle_deg: f64,
    pub illuminated_fraction: f64,
    pub waxing: bool,
    pub words: String,
    pub alt_deg: Vec<f32>,
    pub distance_km: f64,
}

/// One station's view of a target at its best time.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StationView {
    pub frame: FrameChoice,
    pub train_label: String,
    pub verdict_at_best: Verdict,
    pub averted_margin_mag: f32,
    pub access_at_best: Access,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TargetPlan {
    pub id: String,
    pub name: String,
    pub kind: TargetKind,
    /// Up and seen by at least one station at some time (or a body that is up).
    pub candidate: bool,
    pub windows: Vec<Window>,
    pub best_utc_jd: Option<f64>,
    pub best_local: String,
    pub best_alt_deg: f64,
    pub alt_deg: Vec<f32>,
    /// Azimuth per step, deg from north through east.
    pub az_deg: Vec<f32>,
    pub moon_sep_deg_at_best: f64,
    /// Smallest Sun separation while the Sun is above −6° and the target in view, deg.
    pub min_sun_sep_deg: f64,
    pub per_station: Vec<Option<StationView>>,
}

/// A target shown at a station for a while.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Showing {
    pub target_index: usize,
    pub train_index: usize,
    pub start_utc_jd: f64,
    pub end_utc_jd: f64,
    pub start_local: String,
    pub end_local: String,
    pub verdict: Verdict,
    pub alt_start_deg: f64,
    pub alt_end_deg: f64,
    pub eyepiece_height_min_m: f64,
    pub eyepiece_height_max_m: f64,
    pub access_notes: Vec<String>,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StationPlan {
    pub name: String,
    pub showings: Vec<Showing>,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TimelineEntry {
    pub utc_jd: f64,
    pub local: String,
    pub text: String,
    pub station_index: Option<usize>,
    pub target_index: Option<usize>,
}

/// Prepare and plan in one call (the benchmarked entry point).
pub fn plan_night(input: &PlanInput) -> Result<Plan, PlanError> {
    Ok(prepare(input)?.plan(&[], None))
}

fn weight(v: Verdict) -> f64 {
    match v {
        Verdict::Easy => 3.0,
        Verdict::Visible => 2.0,
        Verdict::AvertedVision => 1.0,
        Verdict::NotVisible => 0.0,
    }
}

/// Crossings of `series` (per step) through `level`, linear between steps:
/// (utc_jd, rising).
fn crossings(steps: &[f64], series: &[f64], level: f64) -> Vec<(f64, bool)> {
    let mut out = Vec::new();
    for i in 1..series.len() {
        let (a, b) = (series[i - 1] - level, series[i] - level);
        if (a < 0.0) != (b < 0.0) {
            let f = a / (a - b);
            out.push((steps[i - 1] + f * (steps[i] - steps[i - 1]), b >= 0.0));
        }
    }
    out
}

impl Prepared {
    /// In view at step `i` for target `t`, given clouded sectors from `from_jd` on.
    fn open(&self, t: usize, i: usize, clouded: &[AzSector], from_jd: f64) -> bool {
        let tr = &self.tracks[t];
        if !tr.clear[i] {
            return false;
        }
        if self.steps_utc_jd[i] >= from_jd {
            let az = tr.az_rad[i].to_degrees();
            if clouded.iter().any(|s| s.contains_deg(az)) {
                return false;
            }
        }
        true
    }

    /// Whether target `t` is in clear view at the grid step nearest `utc_jd`.
    pub fn in_view_at(&self, t: usize, utc_jd: f64) -> bool {
        let step_d = self.input.step_minutes / 1440.0;
        let i = libm::round((utc_jd - self.input.start_utc_jd) / step_d);
        if i.is_nan() || i < 0.0 || i as usize >= self.steps_utc_jd.len() {
            return false;
        }
        self.tracks.get(t).is_some_and(|tr| tr.clear[i as usize])
    }

    /// Make the plan; `clouded` sectors are closed from `from_utc_jd` on (None: all night).
    pub fn plan(&self, clouded: &[AzSector], from_utc_jd: Option<f64>) -> Plan {
        let inp = &self.input;
        let off = inp.utc_offset_minutes;
        let from_jd = from_utc_jd.unwrap_or(f64::NEG_INFINITY);
        let steps = &self.steps_utc_jd;
        let n = steps.len();
        let ns = inp.stations.len();

        // Sky events.
        let sun_deg: Vec<f64> = self.sun_alt_rad.iter().map(|a| a.to_degrees()).collect();
        let mut sky_events = Vec::new();
        for (level, down, up) in [
            (SUNSET_ALT_DEG, SkyEventKind::Sunset, SkyEventKind::Sunrise),
            (-6.0, SkyEventKind::CivilDusk, SkyEventKind::CivilDawn),
            (-12.0, SkyEventKind::NauticalDusk, SkyEventKind::NauticalDawn),
            (-18.0, SkyEventKind::AstronomicalDusk, SkyEventKind::AstronomicalDawn),
        ] {
            for (jd, rising) in crossings(steps, &sun_deg, level) {
                sky_events.push(SkyEvent { kind: if rising { up } else { down }, utc_jd: jd, local: local_hhmm(jd, off) });
            }
        }
        let moon_deg: Vec<f64> = self.moon_alt_rad.iter().map(|a| a.to_degrees()).collect();
        for (jd, rising) in crossings(steps, &moon_deg, SUNSET_ALT_DEG) {
            let kind = if rising { SkyEventKind::Moonrise } else { SkyEventKind::Moonset };
            sky_events.push(SkyEvent { kind, utc_jd: jd, local: local_hhmm(jd, off) });
        }
        crate::sort::sort_by(&mut sky_events, |a, b| a.utc_jd.total_cmp(&b.utc_jd));
        let mid = n / 2;
        let moon = MoonSummary {
            phase_angle_deg: self.moon_phase_angle_deg[mid],
            illuminated_fraction: self.moon_illuminated[mid],
            waxing: self.moon_waxing,
            words: cards::moon_words(self.moon_illuminated[mid], self.moon_waxing),
            alt_deg: moon_deg.iter().map(|&a| a as f32).collect(),
            distance_km: self.moon_distance_km,
        };

        // Per target: windows, best time, per-station view at best.
        let mut targets = Vec::with_capacity(self.tracks.len());
        for (t, tr) in self.tracks.iter().enumerate() {
            let c = &inp.targets[t];
            let open: Vec<bool> = (0..n).map(|i| self.open(t, i, clouded, from_jd)).collect();
            let mut windows = Vec::new();
            let mut i = 0;
            while i < n {
                if open[i] {
                    let s = i;
                    while i + 1 < n && open[i + 1] {
                        i += 1;
                    }
                    windows.push(Window { start_utc_jd: steps[s], end_utc_jd: steps[i] });
                }
                i += 1;
            }
            // Best: bodies at their highest; others at the best margin over stations.
            let score = |i: usize| -> f64 {
                if c.kind.is_body() {
                    tr.alt_rad[i]
                } else {
                    tr.views.iter().filter(|v| !v.is_empty()).map(|v| v[i].averted_margin_mag as f64).fold(f64::NEG_INFINITY, f64::max)
                        + 0.01 * tr.alt_rad[i]
                }
            };
            let mut best: Option<usize> = None;
            for i in (0..n).filter(|&i| open[i]) {
                if best.is_none_or(|b| score(i) > score(b)) {
                    best = Some(i);
                }
            }
            let seen_somewhere = best.is_some_and(|b| tr.views.iter().any(|v| !v.is_empty() && v[b].verdict >= Verdict::AvertedVision));
            let per_station = (0..ns)
                .map(|s| {
                    let f = tr.frames[s].clone()?;
                    let b = best?;
                    let v = tr.views[s][b];
                    let h = height::eyepiece_height_m(&inp.stations[s].mount, tr.alt_rad[b]);
                    Some(StationView {
                        train_label: inp.stations[s].trains[f.train_index].label.clone(),
                        frame: f,
                        verdict_at_best: v.verdict,
                        averted_margin_mag: v.averted_margin_mag,
                        access_at_best: height::access(h),
                    })
                })
                .collect();
            let min_sun_sep = (0..n)
                .filter(|&i| tr.clear[i] && sun_deg[i] > -6.0)
                .map(|i| tr.sun_sep_deg[i])
                .fold(f64::INFINITY, f64::min);
            targets.push(TargetPlan {
                id: c.id.clone(),
                name: c.name.clone(),
                kind: c.kind,
                candidate: seen_somewhere,
                windows,
                best_utc_jd: best.map(|b| steps[b]),
                best_local: best.map(|b| local_hhmm(steps[b], off)).unwrap_or_default(),
                best_alt_deg: best.map(|b| tr.alt_rad[b].to_degrees()).unwrap_or(f64::NAN),
                alt_deg: tr.alt_rad.iter().map(|a| a.to_degrees() as f32).collect(),
                az_deg: tr.az_rad.iter().map(|a| a.to_degrees() as f32).collect(),
                moon_sep_deg_at_best: best.map(|b| tr.moon_sep_deg[b]).unwrap_or(f64::NAN),
                min_sun_sep_deg: min_sun_sep,
                per_station,
            });
        }

        let stations = self.assign_slots(clouded, from_jd);
        let mut timeline = Vec::new();
        for e in &sky_events {
            timeline.push(TimelineEntry { utc_jd: e.utc_jd, local: e.local.clone(), text: cards::sky_event_words(e.kind).to_string(), station_index: None, target_index: None });
        }
        for (si, sp) in stations.iter().enumerate() {
            for sh in &sp.showings {
                let name = &inp.targets[sh.target_index].name;
                timeline.push(TimelineEntry {
                    utc_jd: sh.start_utc_jd,
                    local: sh.start_local.clone(),
                    text: format!("{}: {} until {}", sp.name, name, sh.end_local),
                    station_index: Some(si),
                    target_index: Some(sh.target_index),
                });
            }
        }
        for ev in &inp.events {
            if ev.start_utc_jd >= inp.start_utc_jd && ev.start_utc_jd <= inp.end_utc_jd {
                let ti = inp.targets.iter().position(|c| c.id == ev.target_id);
                // Only events that can be watched: the target in view at that time (or not in the plan at all).
                if let Some(t) = ti {
                    if !self.in_view_at(t, ev.start_utc_jd) {
                        continue;
                    }
                }
                timeline.push(TimelineEntry { utc_jd: ev.start_utc_jd, local: local_hhmm(ev.start_utc_jd, off), text: ev.text.clone(), station_index: None, target_index: ti });
            }
        }
        crate::sort::sort_by(&mut timeline, |a, b| a.utc_jd.total_cmp(&b.utc_jd).then(a.station_index.cmp(&b.station_index)));

        let cautions = cautions::cautions(self, &targets, &stations);
        let cards = cards::station_cards(self, &targets, &stations, &cautions);
        Plan {
            steps_utc_jd: steps.clone(),
            sun_alt_deg: sun_deg.iter().map(|&a| a as f32).collect(),
            sky_events,
            moon,
            targets,
            stations,
            timeline,
            cautions,
            cards,
            cautions_card: cautions::cautions_card(),
        }
    }

    /// Greedy per slot: each station shows the best-scoring target that is in
    /// view during the whole slot; another station's current target only when nothing else is left.
    fn assign_slots(&self, clouded: &[AzSector], from_jd: f64) -> Vec<StationPlan> {
        let inp = &self.input;
        let steps = &self.steps_utc_jd;
        let n = steps.len();
        let ns = inp.stations.len();
        let per = ((inp.slot_minutes / inp.step_minutes).round() as usize).max(1);
        let nslots = if n > 1 { (n - 1).div_ceil(per) } else { 0 };
        let mut prev: Vec<Option<usize>> = vec![None; ns];
        // Slots the current target has been shown in a row at each station.
        let mut run: Vec<usize> = vec![0; ns];
        // A target stays at most this many slots in a row unless nothing else is left (our choice: variety for the queue).
        let max_run = ((60.0 / inp.slot_minutes).round() as usize).max(1);
        let mut shown: Vec<Vec<bool>> = vec![vec![false; inp.targets.len()]; ns];
        let mut plans: Vec<StationPlan> = inp.stations.iter().map(|s| StationPlan { name: s.name.clone(), showings: Vec::new() }).collect();
        for k in 0..nslots {
            let (a, b) = (k * per, ((k + 1) * per).min(n - 1));
            let m = (a + b) / 2;
            let mut options: Vec<(f64, usize, usize)> = Vec::new();
            for t in 0..inp.targets.len() {
                if !(a..=b).all(|i| self.open(t, i, clouded, from_jd)) {
                    continue;
                }
                let tr = &self.tracks[t];
                let kind = inp.targets[t].kind;
                for s in 0..ns {
                    if tr.frames[s].is_none() || tr.views[s].is_empty() {
                        continue;
                    }
                    let v = tr.views[s][m];
                    if v.verdict < Verdict::AvertedVision || !(a..=b).all(|i| tr.views[s][i].verdict >= Verdict::AvertedVision) {
                        continue;
                    }
                    let mut score = 10.0 * weight(v.verdict) + tr.alt_rad[m].to_degrees() / 10.0;
                    // The Moon and the bright planets are what visitors queue for (common practice).
                    let bright_body = kind == TargetKind::Moon || (kind == TargetKind::Planet && inp.targets[t].vmag.is_some_and(|m| m < 1.5));
                    if bright_body {
                        score += 12.0;
                    }
                    score += showpiece_bonus(&inp.targets[t]);
                    if prev[s] == Some(t) {
                        score += if run[s] < max_run { 4.0 } else { -25.0 };
                    } else if shown[s][t] {
                        score -= 6.0;
                    }
                    options.push((score, s, t));
                }
            }
            crate::sort::sort_by(&mut options, |x, y| y.0.total_cmp(&x.0).then(x.1.cmp(&y.1)).then(x.2.cmp(&y.2)));
            let mut station_done = vec![false; ns];
            let mut taken = vec![false; inp.targets.len()];
            for pass in 0..2 {
                for &(_, s, t) in &options {
                    if station_done[s] || (pass == 0 && taken[t]) {
                        continue;
                    }
                    station_done[s] = true;
                    taken[t] = true;
                    self.push_showing(&mut plans[s], s, t, a, b, prev[s] == Some(t));
                    shown[s][t] = true;
                }
            }
            for s in 0..ns {
                let now = if station_done[s] { plans[s].showings.last().map(|x| x.target_index) } else { None };
                run[s] = if now.is_some() && now == prev[s] { run[s] + 1 } else { usize::from(now.is_some()) };
                prev[s] = now;
            }
        }
        plans
    }

    fn push_showing(&self, plan: &mut StationPlan, s: usize, t: usize, a: usize, b: usize, extend: bool) {
        let inp = &self.input;
        let steps = &self.steps_utc_jd;
        let tr = &self.tracks[t];
        let train_index = tr.frames[s].as_ref().map(|f| f.train_index).unwrap_or(0);
        let g = &inp.stations[s].mount;
        let hs: Vec<f64> = (a..=b).map(|i| height::eyepiece_height_m(g, tr.alt_rad[i])).collect();
        let (hmin, hmax) = hs.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), &h| (lo.min(h), hi.max(h)));
        let mut notes: Vec<String> = Vec::new();
        for h in [hmin, hmax] {
            for note in height::access(h).notes {
                if !notes.contains(&note) {
                    notes.push(note);
                }
            }
        }
        let worst = (a..=b).map(|i| tr.views[s][i].verdict).min().unwrap_or(Verdict::NotVisible);
        let off = inp.utc_offset_minutes;
        if extend {
            if let Some(last) = plan.showings.last_mut() {
                last.end_utc_jd = steps[b];
                last.end_local = local_hhmm(steps[b], off);
                last.alt_end_deg = tr.alt_rad[b].to_degrees();
                last.verdict = last.verdict.min(worst);
                last.eyepiece_height_min_m = last.eyepiece_height_min_m.min(hmin);
                last.eyepiece_height_max_m = last.eyepiece_height_max_m.max(hmax);
                for note in notes {
                    if !last.access_notes.contains(&note) {
                        last.access_notes.push(note);
                    }
                }
                return;
            }
        }
        plan.showings.push(Showing {
            target_index: t,
            train_index,
            start_utc_jd: steps[a],
            end_utc_jd: steps[b],
            start_local: local_hhmm(steps[a], off),
            end_local: local_hhmm(steps[b], off),
            verdict: worst,
            alt_start_deg: tr.alt_rad[a].to_degrees(),
            alt_end_deg: tr.alt_rad[b].to_degrees(),
            eyepiece_height_min_m: hmin,
            eyepiece_height_max_m: hmax,
            access_notes: notes,
        });
    }
}

/// How much a deep-sky object draws a queue, beyond its verdict (our choice, stated):
/// up to 3 points for integrated brightness (V 9 → 0, V 3 or brighter → 3) and 1.5 for
/// an object with a common name (the famous ones: "Andromeda Galaxy", "Pleiades"),
/// so a public night shows M 31 before an equally easy but anonymous open cluster.
pub fn showpiece_bonus(c: &super::input::Candidate) -> f64 {
    if matches!(c.kind, TargetKind::Moon | TargetKind::Planet | TargetKind::Sun) {
        return 0.0;
    }
    let bright = c.vmag.map_or(0.0, |m| ((9.0 - m) / 2.0).clamp(0.0, 3.0));
    let named = if c.name.contains('(') { 1.5 } else { 0.0 };
    bright + named
}
