//! Optics: the optical train (instrument, accessories, mount), its figures,
//! plain-language advice, validation and generic presets.
//!
//! Invariant: every public figure or orientation routine validates the train
//! first, so no user or link input reaches the arithmetic unchecked.

pub mod advice;
pub mod figures;
pub mod fold;
pub mod presets;
pub mod train;
pub mod validate;

pub use figures::{
    exposure_ratio, figures, figures_for, speed_ratio, Conditions, Figures, Mode, SensorField, TrueFieldMethod,
};
pub use train::*;
pub use validate::{validate, OpticsError};
