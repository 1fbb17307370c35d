//! Planning a public observing night: which targets are up and when, which
//! eyepiece frames each at each station, whether an untrained visitor will
//! see it (Crumey 2014 threshold model), how high the eyepiece sits, the
//! station plans, the field timeline, the cards and the cautions.
//!
//! Entry points: [`plan_night`] (one call), or [`schedule::prepare`] once and
//! [`schedule::Prepared::plan`] for quick re-plans (a sector clouds over).
//! Inputs are plain serde values the engine fills from optics, catalogs and solar.

pub mod assign;
pub mod bench;
pub mod cards;
pub mod cautions;
pub mod ephem_lite;
pub mod framing;
pub mod height;
pub mod input;
pub mod schedule;
pub mod sky_brightness;
pub mod talking_points;
pub mod visibility;
pub mod wire;

pub use input::*;
pub use assign::{Showing, StationPlan, StationView, TargetPlan, TimelineEntry};
pub use schedule::{plan_night, Plan, Prepared};

use core::fmt;

/// Why a plan could not be made; Display names the field and the allowed range.
#[derive(Clone, Debug, PartialEq)]
pub enum PlanError {
    /// A number outside its allowed range.
    OutOfRange { field: &'static str, value: f64, allowed: &'static str },
    /// The event ends before it starts or lasts too long.
    BadWindow { start_utc_jd: f64, end_utc_jd: f64 },
    /// Too many time steps for one plan.
    TooManySteps { steps: usize, max: usize },
}

impl fmt::Display for PlanError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            PlanError::OutOfRange { field, value, allowed } => {
                write!(f, "{field} is {value}, but must be {allowed}")
            }
            PlanError::BadWindow { start_utc_jd, end_utc_jd } => write!(
                f,
                "the event must end after it starts and last at most 24 hours (start {start_utc_jd}, end {end_utc_jd} as UTC Julian dates)"
            ),
            PlanError::TooManySteps { steps, max } => {
                write!(f, "the time step gives {steps} steps; at most {max} are allowed (use a longer step)")
            }
        }
    }
}

impl std::error::Error for PlanError {}

/// Check that `v` is finite and within [lo, hi].
pub(crate) fn check_range(field: &'static str, v: f64, lo: f64, hi: f64, allowed: &'static str) -> Result<(), PlanError> {
    if v.is_finite() && v >= lo && v <= hi {
        Ok(())
    } else {
        Err(PlanError::OutOfRange { field, value: v, allowed })
    }
}

/// Local clock time "HH:MM" of a UTC Julian date at `utc_offset_minutes`.
pub fn local_hhmm(utc_jd: f64, utc_offset_minutes: i32) -> String {
    let minutes = libm::floor((utc_jd + 0.5) * 1440.0 + 0.5) as i64 + utc_offset_minutes as i64;
    let m = minutes.rem_euclid(1440);
    format!("{:02}:{:02}", m / 60, m % 60)
}
