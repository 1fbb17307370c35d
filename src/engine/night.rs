//! The night plan for a scenario's kit and site: builds the planner's input from the
//! loaded catalogs (OpenNGC), the ephemeris (Sun, Moon, planets, Jupiter's moons) and the
//! stations' optical trains, then runs `plan::plan_night`.

use super::compose::{instant_of, site_of};
use super::EngineError;
use crate::plan::input::{AzSector, HorizonMask, PlanInput};
use crate::plan::sky_brightness::SkyBrightness;
use crate::plan::{plan_night, wire, Plan};
use crate::scenario::{parse_civil, Scenario, StationSpec};
use crate::sky::catalog::Catalogs;
use crate::solar::ephemeris::Ephemeris;
use serde::{Deserialize, Serialize};

/// What the page asks for: the scenario (site, stations) and the event's window.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanRequest {
    pub scenario: Scenario,
    /// Event start and end, UTC ("YYYY-MM-DDTHH:MM[:SS]Z"). Default: from the
    /// scenario's time for four hours.
    #[serde(default)]
    pub start_utc: Option<String>,
    #[serde(default)]
    pub end_utc: Option<String>,
    /// The site's UTC offset during the event, minutes (the page gets it from Intl).
    #[serde(default)]
    pub utc_offset_min: i32,
    #[serde(default)]
    pub horizon: HorizonMask,
    /// Sky brightness; default: the scenario's view sky brightness.
    #[serde(default)]
    pub sky: Option<SkyBrightness>,
    /// Azimuth sectors that have clouded over (a quick re-plan leaves them out).
    #[serde(default)]
    pub clouded: Vec<AzSector>,
    /// Deep-sky candidates: Messier objects plus NGC/IC objects brighter than this V
    /// (not NGC/IC records of single or double stars: `wire::is_deep_sky_candidate`).
    #[serde(default = "default_dso_vmag")]
    pub dso_vmag_limit: f64,
}

impl PlanRequest {
    /// From JSON text: a request object, or a bare scenario (then the window is four
    /// hours from the scenario's time).
    pub fn from_json(text: &str) -> Result<PlanRequest, EngineError> {
        let unread = |e: crate::json::Error| EngineError::Plan(format!("the plan request could not be read: {e}"));
        let v = crate::json::parse(text).map_err(unread)?;
        if !v.is_object() {
            let kind = crate::json::kind_of(&v);
            return Err(EngineError::Plan(format!("the plan request could not be read: invalid type: {kind}, expected an object")));
        }
        if v.get("scenario").is_some_and(|s| !s.is_null()) {
            let req: PlanRequest = crate::json::from_value(v).map_err(unread)?;
            Ok(req)
        } else {
            let scenario = Scenario::from_value(v).map_err(EngineError::Scenario)?;
            Ok(PlanRequest {
                scenario,
                start_utc: None,
                end_utc: None,
                utc_offset_min: 0,
                horizon: HorizonMask::default(),
                sky: None,
                clouded: vec![],
                dso_vmag_limit: default_dso_vmag(),
            })
        }
    }
}

fn default_dso_vmag() -> f64 {
    8.0
}

fn utc_jd(field: &'static str, text: &str) -> Result<f64, EngineError> {
    let c = parse_civil(field, text).map_err(EngineError::Scenario)?;
    let t = crate::time::Instant::from_civil(c.year, c.month, c.day, c.hour, c.minute, c.second, 0).map_err(|e| EngineError::Time(e.to_string()))?;
    Ok(t.utc_jd)
}

/// How the train turns the view, relative to the naked eye, in words for a card
/// ("upside down (turned 180°)", "mirror-reversed left–right"): the part of
/// `orient::describe` that does not change through the night on an alt-azimuth mount.
fn orientation_note(train: &crate::optics::train::Train) -> String {
    let state = crate::orient::MountState { parallactic_rad: 0.0, alt_rad: 45f64.to_radians(), pier_side: None, user_rotation_rad: 0.0, dec_rad: Some(0.3) };
    match crate::orient::orientation(train, &state) {
        Ok(view) => {
            let text = crate::orient::describe(&view, 0.0).text;
            let body = text.split(", zenith").next().unwrap_or("").to_string();
            format!("The view is {body}.")
        }
        Err(_) => String::new(),
    }
}

/// Plans the night (see module doc).
pub fn plan(req: &PlanRequest, cats: &Catalogs, eph: Option<&Ephemeris>) -> Result<Plan, EngineError> {
    let s = &req.scenario;
    s.validate().map_err(EngineError::Scenario)?;
    let eph = eph.ok_or(EngineError::NotLoaded { what: "the Sun, Moon and planet positions (ephemeris.bin)" })?;
    let site = site_of(s)?;
    let t0 = instant_of(s)?;
    let start = match &req.start_utc {
        Some(x) => utc_jd("event start", x)?,
        None => t0.utc_jd,
    };
    let end = match &req.end_utc {
        Some(x) => utc_jd("event end", x)?,
        None => start + 4.0 / 24.0,
    };
    if !(end > start && end - start <= 1.0) {
        return Err(EngineError::Plan("the event must end after it starts and last at most 24 hours".into()));
    }
    // Stations: the scenario's, else the chosen train as one station.
    let mut specs: Vec<StationSpec> = s.stations.clone();
    if specs.is_empty() {
        if let Some(t) = &s.train {
            specs.push(StationSpec { name: if t.name.is_empty() { "Station 1".into() } else { t.name.clone() }, trains: vec![t.clone()] });
        }
    }
    if specs.is_empty() {
        return Err(EngineError::Plan("the kit has no station with a telescope or binoculars yet".into()));
    }
    let mut stations = Vec::new();
    for sp in &specs {
        let notes: Vec<String> = sp.trains.iter().map(orientation_note).collect();
        stations.push(wire::station_from_trains(&sp.name, &sp.trains, &notes).map_err(|e| EngineError::Optics(format!("station {}: {e}", sp.name)))?);
    }
    // Candidates: Sun, Moon, planets; Messier and bright NGC/IC objects (no NGC/IC stars).
    let mut targets = wire::body_candidates(eph, &site, start, end, 0.5).map_err(|e| EngineError::Plan(e.to_string()))?;
    let mid = crate::time::Instant::from_utc_jd((start + end) / 2.0).map_err(|e| EngineError::Time(e.to_string()))?;
    let npb = crate::sky::frames::npb_matrix(mid.tt_jd);
    for id in 0..cats.dso_count() as u32 {
        if let Some(d) = cats.dso(id) {
            if wire::is_deep_sky_candidate(d, req.dso_vmag_limit) {
                if let Some(c) = wire::candidate_from_dso_with(d, &npb) {
                    targets.push(c);
                }
            }
        }
    }
    let events = wire::jupiter_timed_events(eph, start, end).unwrap_or_default();
    let input = PlanInput {
        site,
        utc_offset_minutes: req.utc_offset_min,
        start_utc_jd: start,
        end_utc_jd: end,
        step_minutes: 5.0,
        horizon: req.horizon.clone(),
        sky: req.sky.clone().unwrap_or(SkyBrightness::Measured { zenith_mu: s.view.sky_mag_arcsec2 }),
        extinction_k_mag: 0.2,
        seeing_arcsec: 2.0,
        sun_caution_deg: 20.0,
        slot_minutes: 30.0,
        eye_pupil_mm: 6.0,
        stations,
        targets,
        events,
    };
    if req.clouded.is_empty() {
        plan_night(&input).map_err(|e| EngineError::Plan(e.to_string()))
    } else {
        let prepared = crate::plan::schedule::prepare(&input).map_err(|e| EngineError::Plan(e.to_string()))?;
        Ok(prepared.plan(&req.clouded, None))
    }
}
