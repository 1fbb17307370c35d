//! The Scenario: the single source of truth for one view (site, time, kit, chosen
//! station and train, target, view options). The share link and the saved copy on
//! the device are two encodings of it.
//!
//! Invariant: every field a user or a link can set is checked by `validate`, which
//! names the field and its allowed range; nothing downstream panics on a validated
//! scenario.

use crate::optics::train::Train;
use serde::{Deserialize, Serialize};
use std::fmt;

/// Schema version of the Scenario JSON. A link or saved copy from a newer version is
/// refused with a clear message rather than misread.
pub const SCENARIO_VERSION: u32 = 1;

/// One whole view: what the page stores, what a link carries.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Scenario {
    pub version: u32,
    pub site: SiteSpec,
    /// The instant, UTC, as "YYYY-MM-DDTHH:MM[:SS[.sss]]Z" (the page shows it in the site's zone).
    pub time_utc: String,
    /// The page's kit (items and stations), carried whole so a link restores it;
    /// the engine reads only `train` and `stations`.
    #[serde(default)]
    pub kit: serde_json::Value,
    /// Index of the chosen station and eyepiece in the kit (for the page).
    #[serde(default)]
    pub station: usize,
    #[serde(default)]
    pub eyepiece: usize,
    /// The chosen optical train, resolved by the page from the kit.
    pub train: Option<Train>,
    /// Every station's trains (one per eyepiece), for the night plan.
    #[serde(default)]
    pub stations: Vec<StationSpec>,
    pub target: TargetSpec,
    #[serde(default)]
    pub view: ViewSpec,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StationSpec {
    #[serde(default)]
    pub name: String,
    pub trains: Vec<Train>,
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct SiteSpec {
    #[serde(default)]
    pub name: String,
    pub lat_deg: f64,
    pub lon_deg: f64,
    #[serde(default)]
    pub elev_m: f64,
    /// IANA zone name of the site (the page turns it into local times with Intl).
    #[serde(default)]
    pub tz: String,
    /// Event hours in the site's civil time, "HH:MM" (the page's plan uses them).
    #[serde(default)]
    pub event_start: String,
    #[serde(default)]
    pub event_end: String,
}

/// What to point at: a name the search resolves ("M42", "Vega", "Jupiter"), or a direction.
/// (`Deserialize` by hand: see `crate::json`.)
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(untagged)]
pub enum TargetSpec {
    Name(String),
    Coordinates { ra_deg: f64, dec_deg: f64 },
}

impl<'de> Deserialize<'de> for TargetSpec {
    /// Untagged, as serde's derive: a string is a name; an object the coordinates.
    fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        #[derive(Deserialize)]
        struct Coordinates {
            ra_deg: f64,
            dec_deg: f64,
        }
        let no_match = || serde::de::Error::custom("data did not match any variant of untagged enum TargetSpec");
        match serde_json::Value::deserialize(d)? {
            serde_json::Value::String(s) => Ok(TargetSpec::Name(s)),
            v @ serde_json::Value::Object(_) => {
                let c: Coordinates = crate::json::from_value(v).map_err(|_| no_match())?;
                Ok(TargetSpec::Coordinates { ra_deg: c.ra_deg, dec_deg: c.dec_deg })
            }
            _ => Err(no_match()),
        }
    }
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(default)]
pub struct ViewSpec {
    /// Show the field as a chart would (north up, east left) instead of as the train shows it.
    pub north_up: bool,
    /// Red-only rendering for dark adaptation.
    pub night: bool,
    /// Draw text labels (names, directions).
    pub labels: bool,
    /// Side-by-side compare (the page's switch).
    pub compare: bool,
    /// Zenith sky brightness in V mag/arcsec² (darker sky = larger number).
    pub sky_mag_arcsec2: f64,
    /// Pan of the view centre from the target, arcminutes (east, north).
    pub pan_arcmin: [f64; 2],
    /// Extra rotation the volunteer gave the diagonal/eyepiece/camera, degrees.
    pub rotation_deg: f64,
}

impl Default for ViewSpec {
    fn default() -> Self {
        ViewSpec {
            north_up: false,
            night: false,
            labels: true,
            compare: false,
            sky_mag_arcsec2: 20.5,
            pan_arcmin: [0.0, 0.0],
            rotation_deg: 0.0,
        }
    }
}

/// Why a scenario cannot be used, in plain words naming the field.
#[derive(Clone, Debug, PartialEq)]
pub enum ScenarioError {
    FutureVersion { found: u32, supported: u32 },
    OutOfRange { field: &'static str, value: f64, min: f64, max: f64 },
    BadTime { field: &'static str, text: String },
    Missing { field: &'static str },
    Json(String),
}

impl fmt::Display for ScenarioError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ScenarioError::FutureVersion { found, supported } => write!(
                f,
                "this view was saved by a newer Nightfield (format {found}; this copy reads up to {supported}). Reload the app to update it."
            ),
            ScenarioError::OutOfRange { field, value, min, max } => {
                write!(f, "{field} is {value}, but it must be between {min} and {max}")
            }
            ScenarioError::BadTime { field, text } => {
                write!(f, "{field} \"{text}\" is not a date and time like 2026-12-12T21:30")
            }
            ScenarioError::Missing { field } => write!(f, "{field} is missing"),
            ScenarioError::Json(msg) => write!(f, "the view description could not be read: {msg}"),
        }
    }
}

impl std::error::Error for ScenarioError {}

pub(crate) fn check_range(field: &'static str, value: f64, min: f64, max: f64) -> Result<(), ScenarioError> {
    if value.is_finite() && value >= min && value <= max {
        Ok(())
    } else {
        Err(ScenarioError::OutOfRange { field, value, min, max })
    }
}

/// Civil date and time parsed from "YYYY-MM-DDTHH:MM[:SS]".
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CivilTime {
    pub year: i32,
    pub month: u32,
    pub day: u32,
    pub hour: u32,
    pub minute: u32,
    pub second: f64,
}

/// Parses "YYYY-MM-DDTHH:MM[:SS]" (a space may stand for the T).
pub fn parse_civil(field: &'static str, text: &str) -> Result<CivilTime, ScenarioError> {
    let bad = || ScenarioError::BadTime { field, text: text.chars().take(40).collect() };
    let t = text.trim();
    let t = t.strip_suffix('Z').unwrap_or(t);
    let (date, clock) = t.split_once(['T', ' ']).ok_or_else(bad)?;
    let d: Vec<&str> = date.split('-').collect();
    let c: Vec<&str> = clock.split(':').collect();
    if d.len() != 3 || !(2..=3).contains(&c.len()) {
        return Err(bad());
    }
    let num = |s: &str| -> Result<i64, ScenarioError> {
        if s.is_empty() || s.len() > 4 || !s.bytes().all(|b| b.is_ascii_digit()) {
            return Err(bad());
        }
        s.parse::<i64>().map_err(|_| bad())
    };
    let year = num(d[0])? as i32;
    let month = num(d[1])? as u32;
    let day = num(d[2])? as u32;
    let hour = num(c[0])? as u32;
    let minute = num(c[1])? as u32;
    let second = if c.len() == 3 {
        let s: f64 = c[2].parse().map_err(|_| bad())?;
        if !(0.0..61.0).contains(&s) {
            return Err(bad());
        }
        s
    } else {
        0.0
    };
    let days_in_month = match month {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        2 if (year % 4 == 0 && year % 100 != 0) || year % 400 == 0 => 29,
        2 => 28,
        _ => return Err(bad()),
    };
    if day < 1 || day > days_in_month || hour > 23 || minute > 59 {
        return Err(bad());
    }
    Ok(CivilTime { year, month, day, hour, minute, second })
}

impl Scenario {
    /// Reads a scenario from JSON text, refusing newer formats with a clear message.
    /// (One parse path, `crate::json`, keeps the wasm small.)
    pub fn from_json(text: &str) -> Result<Scenario, ScenarioError> {
        Scenario::from_value(crate::json::parse(text).map_err(|e| ScenarioError::Json(e.to_string()))?)
    }

    /// As `from_json`, from parsed JSON.
    pub fn from_value(v: serde_json::Value) -> Result<Scenario, ScenarioError> {
        if let Some(found) = v.get("version").and_then(|n| n.as_u64()) {
            if found > SCENARIO_VERSION as u64 {
                return Err(ScenarioError::FutureVersion { found: found.min(u32::MAX as u64) as u32, supported: SCENARIO_VERSION });
            }
        }
        let s: Scenario = crate::json::from_value(v).map_err(|e| ScenarioError::Json(e.to_string()))?;
        s.validate()?;
        Ok(s)
    }

    /// Checks every number a user or a link can set; names the field and its range.
    pub fn validate(&self) -> Result<(), ScenarioError> {
        if self.version == 0 || self.version > SCENARIO_VERSION {
            return Err(ScenarioError::FutureVersion { found: self.version, supported: SCENARIO_VERSION });
        }
        check_range("site latitude (degrees)", self.site.lat_deg, -90.0, 90.0)?;
        check_range("site longitude (degrees)", self.site.lon_deg, -180.0, 180.0)?;
        check_range("site elevation (metres)", self.site.elev_m, -500.0, 9000.0)?;
        parse_civil("time", &self.time_utc)?;
        if let TargetSpec::Coordinates { ra_deg, dec_deg } = self.target {
            check_range("target right ascension (degrees)", ra_deg, 0.0, 360.0)?;
            check_range("target declination (degrees)", dec_deg, -90.0, 90.0)?;
        }
        if let TargetSpec::Name(n) = &self.target {
            if n.trim().is_empty() {
                return Err(ScenarioError::Missing { field: "target" });
            }
        }
        check_range("sky brightness (mag/arcsec²)", self.view.sky_mag_arcsec2, 14.0, 22.5)?;
        check_range("view pan east (arcminutes)", self.view.pan_arcmin[0], -6000.0, 6000.0)?;
        check_range("view pan north (arcminutes)", self.view.pan_arcmin[1], -6000.0, 6000.0)?;
        check_range("view rotation (degrees)", self.view.rotation_deg, -360.0, 360.0)?;
        Ok(())
    }
}

/// The demo view, as JSON: an invented club's field on a December evening, the
/// Pleiades in an 80/600 refractor with a mirror diagonal and a 25 mm 52° eyepiece.
pub const DEMO_SCENARIO_JSON: &str = r#"{
  "version": 1,
  "site": { "name": "Hollow Meadow field (demo)", "lat_deg": 47.05, "lon_deg": 8.3, "elev_m": 560,
            "tz": "Europe/Zurich", "event_start": "19:00", "event_end": "23:00" },
  "time_utc": "2026-12-12T20:00:00Z",
  "train": { "name": "80/600 refractor",
             "instrument": { "kind": "telescope", "design": { "type": "refractor" }, "aperture_mm": 80, "focal_length_mm": 600 },
             "accessories": [ { "kind": "star_diagonal", "prism": "mirror90" },
                              { "kind": "eyepiece", "focal_length_mm": 25, "apparent_field_deg": 52 } ],
             "mount": { "kind": "alt_az" } },
  "target": "M45",
  "view": { "north_up": false, "night": false, "labels": true, "sky_mag_arcsec2": 20.5 }
}"#;

/// The demo scenario (a constant the tests prove valid).
pub fn demo_scenario() -> Scenario {
    #[allow(clippy::expect_used)]
    Scenario::from_json(DEMO_SCENARIO_JSON).expect("the built-in demo scenario is valid (tested)")
}

/// Scenarios whose pixels must be identical natively and in wasm (see src/bin/render_demo.rs
/// and tests/browser/same-bytes.test.mjs): the demo, a night-mode camera view, Jupiter, the Moon.
pub fn comparison_scenarios() -> Vec<(&'static str, String)> {
    let demo = DEMO_SCENARIO_JSON.to_string();
    let night = demo.replace("\"night\": false", "\"night\": true").replace("\"M45\"", "\"M42\"");
    let jupiter = demo.replace("\"M45\"", "\"Jupiter\"").replace("\"focal_length_mm\": 25", "\"focal_length_mm\": 6");
    let moon = demo.replace("\"M45\"", "\"Moon\"").replace("2026-12-12T20:00:00Z", "2026-12-17T17:30:00Z");
    let chart = demo.replace("\"north_up\": false", "\"north_up\": true").replace("\"M45\"", "\"NGC 7000\"");
    vec![("demo", demo), ("night_m42", night), ("jupiter", jupiter), ("moon", moon), ("chart_ngc7000", chart)]
}

/// FNV-1a 64-bit hash (Fowler–Noll–Vo), for comparing pixel buffers across builds.
pub fn fnv1a64(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for &b in bytes {
        h ^= b as u64;
        h = h.wrapping_mul(0x0000_0100_0000_01b3);
    }
    h
}
