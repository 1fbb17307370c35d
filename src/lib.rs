//! Nightfield: a field-of-view simulator for astronomy outreach nights.
//!
//! Module map only; each module's doc says its job and invariants
//! (see DEVELOPERS.md for the bird's-eye view).

pub mod bench;
pub mod engine;
pub mod find;
pub mod json;
pub mod math;
pub mod optics;
pub mod orient;
pub mod plan;
pub mod render;
pub mod scenario;
pub mod scene;
pub mod share;
pub mod sky;
pub mod sort;
pub mod solar;
pub mod time;

#[cfg(target_arch = "wasm32")]
pub mod web;
