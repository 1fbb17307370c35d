//! Finding a target and finding it again: pointing in plain words, finder
//! views and their orientation, a star-hop route, setting-circle readings.
//!
//! Inputs are positions computed elsewhere (sky/solar: alt/az, apparent or
//! catalog places); this module adds geometry and words. Sky offsets follow
//! `orient.rs`: (east, north) radians → screen (right, up).

pub mod bench;
pub mod card;
pub mod circles;
pub mod finder;
pub mod geom;
pub mod guide;
pub mod hop;
pub mod legs;
pub mod sources;
pub mod words;

use core::fmt;

/// Errors of the find module; Display names the field and the allowed range.
#[derive(Clone, Debug, PartialEq)]
pub enum FindError {
    /// A numeric input is out of range or not finite.
    OutOfRange { field: &'static str, value: f64, allowed: &'static str },
    /// A list input that must not be empty is empty.
    Empty { field: &'static str },
    /// An index into a list is past its end.
    BadIndex { field: &'static str, index: usize, len: usize },
    /// No chain of visible stars joins the start to the target.
    NoRoute { reason: String },
}

impl fmt::Display for FindError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            FindError::OutOfRange { field, value, allowed } => {
                write!(f, "{field} is {value}, but it must be {allowed}")
            }
            FindError::Empty { field } => write!(f, "{field} is empty; give at least one entry"),
            FindError::BadIndex { field, index, len } => {
                write!(f, "{field} is {index}, but it must be below {len}")
            }
            FindError::NoRoute { reason } => write!(f, "no star-hop route: {reason}"),
        }
    }
}

impl std::error::Error for FindError {}

/// Check that `v` is finite and within [lo, hi].
pub(crate) fn check(field: &'static str, v: f64, lo: f64, hi: f64, allowed: &'static str) -> Result<f64, FindError> {
    if v.is_finite() && v >= lo && v <= hi {
        Ok(v)
    } else {
        Err(FindError::OutOfRange { field, value: v, allowed })
    }
}
