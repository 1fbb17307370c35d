//! Eyepiece height above the ground from mount and tube geometry, and who can
//! reach it. Reach heights are approximate figures of common practice for
//! public nights (not a standard): see the constants.

use super::{check_range, PlanError};
use serde::{Deserialize, Serialize};

/// How the tube is carried (decides the preset; the geometry is the same rigid-body formula).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum MountKind {
    /// Newtonian in a rocker box: eyepiece near the top end of the tube.
    DobsonianRocker,
    /// Refractor on a tripod alt-azimuth head, eyepiece at the back (usually in a star diagonal).
    TripodRefractor,
    /// Catadioptric on a fork: eyepiece behind the fork pivot, in a star diagonal.
    ForkCassegrain,
    /// Equatorial head; the altitude formula is an approximation (the tube also swings with hour angle).
    Equatorial,
}

/// The tube pivots about a horizontal axis `pivot_height_mm` above the ground; the
/// eyepiece sits `along_tube_mm` from the pivot along the tube (+ toward the sky end,
/// − behind it) and `up_offset_mm` off the tube axis in the vertical plane (a star
/// diagonal pointing up). Height = pivot + along·sin(alt) + up·cos(alt).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MountGeometry {
    pub kind: MountKind,
    pub pivot_height_mm: f64,
    pub along_tube_mm: f64,
    #[serde(default)]
    pub up_offset_mm: f64,
}

impl MountGeometry {
    /// 200/1200 Newtonian on a rocker mount (typical dimensions: common practice).
    pub fn dobsonian_200_1200() -> Self {
        MountGeometry { kind: MountKind::DobsonianRocker, pivot_height_mm: 520.0, along_tube_mm: 800.0, up_offset_mm: 0.0 }
    }
    /// 80/600 refractor with a star diagonal on a photo tripod (typical: common practice).
    pub fn refractor_80_600_tripod() -> Self {
        MountGeometry { kind: MountKind::TripodRefractor, pivot_height_mm: 1250.0, along_tube_mm: -380.0, up_offset_mm: 90.0 }
    }
    /// 200/2000 catadioptric on a fork on a tripod, star diagonal (typical: common practice).
    pub fn cassegrain_200_fork() -> Self {
        MountGeometry { kind: MountKind::ForkCassegrain, pivot_height_mm: 1150.0, along_tube_mm: -280.0, up_offset_mm: 100.0 }
    }

    pub fn validate(&self) -> Result<(), PlanError> {
        check_range("pivot height", self.pivot_height_mm, 0.0, 4000.0, "between 0 and 4000 mm")?;
        check_range("eyepiece distance along the tube", self.along_tube_mm, -4000.0, 4000.0, "between -4000 and 4000 mm")?;
        check_range("eyepiece offset", self.up_offset_mm, -1000.0, 1000.0, "between -1000 and 1000 mm")
    }
}

/// Eyepiece height above the ground, metres, at altitude `alt_rad` (rigid-body geometry of the tube about its altitude axis).
pub fn eyepiece_height_m(g: &MountGeometry, alt_rad: f64) -> f64 {
    let a = alt_rad.clamp(0.0, core::f64::consts::FRAC_PI_2);
    (g.pivot_height_mm + g.along_tube_mm * libm::sin(a) + g.up_offset_mm * libm::cos(a)) / 1000.0
}

// Reach figures, metres (approximate, common practice for outreach nights):
/// A child of about six to eight: eyepiece comfortably between these heights.
pub const CHILD_MIN_M: f64 = 0.80;
pub const CHILD_MAX_M: f64 = 1.15;
/// A sturdy step of this height lets a child reach this much higher.
pub const STEP_M: f64 = 0.25;
/// A seated wheelchair user, leaning a little: eyepiece between these heights.
pub const WHEELCHAIR_MIN_M: f64 = 0.95;
pub const WHEELCHAIR_MAX_M: f64 = 1.30;
/// A standing adult: comfortable range (below, offer a chair; above, a step).
pub const ADULT_MIN_M: f64 = 0.85;
pub const ADULT_MAX_M: f64 = 1.70;

/// Can this visitor reach the eyepiece?
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Reach {
    Ok,
    NeedsStep,
    /// Too high even with a step.
    TooHigh,
    /// Too low: sit, kneel, or offer a chair.
    TooLow,
}

/// Who can look, at one eyepiece height.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Access {
    pub height_m: f64,
    pub child: Reach,
    pub wheelchair: Reach,
    pub adult: Reach,
    /// Short plain notes for the card ("child needs a step"...).
    pub notes: Vec<String>,
}

/// Reach for each visitor at eyepiece height `h_m`.
pub fn access(h_m: f64) -> Access {
    let child = if h_m < CHILD_MIN_M {
        Reach::TooLow
    } else if h_m <= CHILD_MAX_M {
        Reach::Ok
    } else if h_m <= CHILD_MAX_M + STEP_M {
        Reach::NeedsStep
    } else {
        Reach::TooHigh
    };
    let wheelchair = if h_m < WHEELCHAIR_MIN_M {
        Reach::TooLow
    } else if h_m <= WHEELCHAIR_MAX_M {
        Reach::Ok
    } else {
        Reach::TooHigh
    };
    let adult = if h_m < ADULT_MIN_M {
        Reach::TooLow
    } else if h_m <= ADULT_MAX_M {
        Reach::Ok
    } else {
        Reach::NeedsStep
    };
    let mut notes = Vec::new();
    match child {
        Reach::NeedsStep => notes.push("children need a step".to_string()),
        Reach::TooHigh => notes.push("too high for children even on a step".to_string()),
        _ => {}
    }
    match wheelchair {
        Reach::TooLow => notes.push("too low for a wheelchair user".to_string()),
        Reach::TooHigh => notes.push("a wheelchair user cannot reach it".to_string()),
        _ => {}
    }
    match adult {
        Reach::NeedsStep => notes.push("adults need a step".to_string()),
        Reach::TooLow => notes.push("low: offer a chair".to_string()),
        _ => {}
    }
    Access { height_m: h_m, child, wheelchair, adult, notes }
}
