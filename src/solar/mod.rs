//! The Sun, the Moon and the planets: positions from compact Chebyshev fits to
//! JPL DE421 (catalog/ephemeris.bin), apparent topocentric places, physical
//! ephemerides, Jupiter's Galilean moons, Saturn's rings, the Moon's libration.
//!
//! Invariants: radians and AU inside; TT/TDB Julian dates; every public
//! routine that a user date reaches returns `SolarError` instead of panicking.
//! Start at `topocentric` (`body_apparent`, `all_bodies`, `night_track`); the
//! ephemeris bytes come from catalog/ephemeris.bin via `Ephemeris::decode`.

pub mod ephemeris;
pub mod apparent;
pub mod geometry;
pub mod jupiter;
pub mod jupiter_events;
pub mod moon;
pub mod physical;
pub mod riseset;
pub mod saturn;
pub mod state;
pub mod topocentric;

pub use ephemeris::{Ephemeris, EphemerisError, OutOfCoverage, Series, AU_KM};
pub use state::{body_state_from, BodyState};
pub use topocentric::{
    all_bodies, apparent_place, body_apparent, body_horizontal, galilean_moons_at, jupiter_moon_events, moon_at, night_track,
    red_spot_transits_utc, saturn_rings_at, TimedMoonEvent,
};

use serde::{Deserialize, Serialize};
use std::fmt;

/// A solar-system body the engine can point at.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum BodyId {
    Sun,
    Moon,
    Mercury,
    Venus,
    Mars,
    Jupiter,
    Saturn,
    Uranus,
    Neptune,
}

impl BodyId {
    pub const ALL: [BodyId; 9] = [
        BodyId::Sun,
        BodyId::Moon,
        BodyId::Mercury,
        BodyId::Venus,
        BodyId::Mars,
        BodyId::Jupiter,
        BodyId::Saturn,
        BodyId::Uranus,
        BodyId::Neptune,
    ];

    /// Lower-case English name ("sun", "moon", "mercury", ...).
    pub fn name(self) -> &'static str {
        match self {
            BodyId::Sun => "sun",
            BodyId::Moon => "moon",
            BodyId::Mercury => "mercury",
            BodyId::Venus => "venus",
            BodyId::Mars => "mars",
            BodyId::Jupiter => "jupiter",
            BodyId::Saturn => "saturn",
            BodyId::Uranus => "uranus",
            BodyId::Neptune => "neptune",
        }
    }

    /// The name as a heading ("Sun", "Moon", "Jupiter").
    pub fn title(self) -> &'static str {
        match self {
            BodyId::Sun => "Sun",
            BodyId::Moon => "Moon",
            BodyId::Mercury => "Mercury",
            BodyId::Venus => "Venus",
            BodyId::Mars => "Mars",
            BodyId::Jupiter => "Jupiter",
            BodyId::Saturn => "Saturn",
            BodyId::Uranus => "Uranus",
            BodyId::Neptune => "Neptune",
        }
    }

    /// Parse a name, case-insensitive ("Moon", "jupiter").
    pub fn from_name(s: &str) -> Option<BodyId> {
        let s = s.trim();
        BodyId::ALL.iter().copied().find(|b| b.name().eq_ignore_ascii_case(s))
    }
}

/// Why a solar-system computation could not be done.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SolarError {
    /// The date is outside the ephemeris coverage.
    OutOfCoverage { tt_jd: f64, start_jd: f64, end_jd: f64 },
    /// A time input was not a finite number.
    NotFinite { field: &'static str },
    /// A search window that is empty, reversed, longer than 40 days or outside 1800–2200.
    Window { start_utc_jd: f64, end_utc_jd: f64 },
    /// The site's latitude, longitude or elevation is out of range.
    BadSite,
}

impl fmt::Display for SolarError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SolarError::OutOfCoverage { tt_jd, start_jd, end_jd } => write!(
                f,
                "date {} (TT) is outside the planet ephemeris, which covers {} to {}",
                ymd(*tt_jd),
                ymd(*start_jd),
                ymd(*end_jd)
            ),
            SolarError::NotFinite { field } => write!(f, "{field} must be a finite number"),
            SolarError::Window { start_utc_jd, end_utc_jd } => write!(
                f,
                "search window {start_utc_jd:.3} to {end_utc_jd:.3} (UTC Julian dates) must run forward, \
                 last at most 40 days and lie within the supported years"
            ),
            SolarError::BadSite => write!(
                f,
                "site must have latitude −90° to 90°, longitude −180° to 180° and elevation −500 to 9000 m"
            ),
        }
    }
}
impl std::error::Error for SolarError {}

/// "YYYY-MM-DD" of a Julian date (Gregorian; Meeus 1998 ch. 7), for messages.
fn ymd(jd: f64) -> String {
    if !(jd.is_finite() && jd > 0.0 && jd < 1e8) {
        return format!("(Julian date {jd})");
    }
    let z = (jd + 0.5).floor();
    let alpha = ((z - 1_867_216.25) / 36_524.25).floor();
    let a = if z < 2_299_161.0 { z } else { z + 1.0 + alpha - (alpha / 4.0).floor() };
    let b = a + 1524.0;
    let c = ((b - 122.1) / 365.25).floor();
    let d = (365.25 * c).floor();
    let e = ((b - d) / 30.6001).floor();
    let day = b - d - (30.6001 * e).floor();
    let month = if e < 14.0 { e - 1.0 } else { e - 13.0 };
    let year = if month > 2.0 { c - 4716.0 } else { c - 4715.0 };
    format!("{year:.0}-{month:02.0}-{day:02.0}")
}

impl From<OutOfCoverage> for SolarError {
    fn from(e: OutOfCoverage) -> Self {
        SolarError::OutOfCoverage { tt_jd: e.tdb_jd, start_jd: e.start_jd, end_jd: e.end_jd }
    }
}
