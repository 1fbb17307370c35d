//! Setting circles and angle gauges on a Dobsonian-type (alt-azimuth) mount:
//! the altitude and azimuth readings to dial for a target.
//!
//! Method: a dial reading is the target's horizontal coordinate plus a fixed
//! dial offset (the mount's zero), found from the site's azimuth reference —
//! true north, or a reference star whose dial reading the user noted when
//! centred. Give the altitude as seen (with refraction, `sky::refraction`):
//! the tube must point where the light comes from.

use super::geom::{wrap_2pi, wrap_pi};
use super::words::compass_point_16;
use super::{check, FindError};
use crate::sky::Horizontal;
use serde::{Deserialize, Serialize};

/// How the azimuth dial is zeroed on this site.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum AzimuthReference {
    /// The dial's 0 faces true north (the mount was set up by compass with
    /// the local magnetic declination applied, or on a marked meridian line).
    TrueNorth,
    /// The user centred a reference star and read `dial_deg` off the dial;
    /// `star` is that star's alt/az at the moment of reading.
    ReferenceStar { star: Horizontal, dial_deg: f64 },
}

/// Which way the azimuth numbers grow, seen from above.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DialSense {
    /// North → east → south (the compass way).
    Clockwise,
    /// North → west → south.
    CounterClockwise,
}

/// Readings to dial.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DialReading {
    /// Angle gauge / altitude circle, degrees above the horizon.
    pub alt_dial_deg: f64,
    /// Azimuth circle in [0, 360).
    pub az_dial_deg: f64,
    /// True azimuth of the target, degrees from north through east.
    pub true_az_deg: f64,
    /// "Set the angle gauge to 34.5° and the azimuth circle to 127.0° (south-east)."
    pub words: String,
}

/// Dial readings for `target`. `alt_zero_offset_deg` is what the angle gauge
/// reads with the tube level (0 for a calibrated gauge).
pub fn dial_readings(target: Horizontal, reference: AzimuthReference, sense: DialSense, alt_zero_offset_deg: f64) -> Result<DialReading, FindError> {
    check("target altitude", target.alt_rad, -core::f64::consts::FRAC_PI_2, core::f64::consts::FRAC_PI_2, "between -90° and 90° (in radians)")?;
    check("target azimuth", target.az_rad, -1e3, 1e3, "a finite angle in radians")?;
    check("angle gauge zero offset", alt_zero_offset_deg, -10.0, 10.0, "within ±10°")?;
    let sign = match sense {
        DialSense::Clockwise => 1.0,
        DialSense::CounterClockwise => -1.0,
    };
    // dial = sign·az + zero  (degrees)
    let zero_deg = match reference {
        AzimuthReference::TrueNorth => 0.0,
        AzimuthReference::ReferenceStar { star, dial_deg } => {
            check("reference star azimuth", star.az_rad, -1e3, 1e3, "a finite angle in radians")?;
            check("reference star dial reading", dial_deg, -360.0, 720.0, "between -360° and 720°")?;
            dial_deg - sign * star.az_rad.to_degrees()
        }
    };
    let true_az_deg = wrap_2pi(target.az_rad).to_degrees();
    let az_dial_deg = wrap_2pi((sign * true_az_deg + zero_deg).to_radians()).to_degrees();
    // Round-trip through radians can give 360 − ε; keep [0, 360).
    let az_dial_deg = if az_dial_deg >= 359.9995 { 0.0 } else { az_dial_deg };
    let alt_dial_deg = target.alt_rad.to_degrees() + alt_zero_offset_deg;
    let cp = compass_point_16(target.az_rad);
    let mut words = format!(
        "Set the angle gauge to {alt_dial_deg:.1}° and the azimuth circle to {az_dial_deg:.1}° (toward the {}).",
        cp.name
    );
    if target.alt_rad < 0.0 {
        words.push_str(" The target is below the horizon now.");
    }
    Ok(DialReading { alt_dial_deg, az_dial_deg, true_az_deg, words })
}

/// How far to turn from one target to the next: azimuth (signed, shortest
/// way, positive = clockwise seen from above) and altitude change, degrees.
pub fn turn_between(from: Horizontal, to: Horizontal) -> (f64, f64) {
    (wrap_pi(to.az_rad - from.az_rad).to_degrees(), (to.alt_rad - from.alt_rad).to_degrees())
}
