//! Pointing in plain words: compass bearing, altitude in hand measures, and
//! the way from the nearest bright naked-eye star or planet.
//!
//! Hand measures at arm's length (common practice; they vary by person and
//! roughly cancel because longer arms come with bigger hands):
//! a little finger ≈ 1°, three middle fingers together ≈ 5°, a fist across
//! the knuckles ≈ 10°, a spread hand (thumb tip to little-finger tip) ≈ 20°.
//! Nightfield counts in fingers up to about 7° and in fists (halves) above.

// `!(a <= b)` is deliberate: it is true for NaN, which must be refused too.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::geom::{hz_as_sph, pa_rad, sep_rad, wrap_2pi};
use super::{check, FindError};
use crate::sky::Horizontal;
use serde::{Deserialize, Serialize};

/// Degrees covered by one hand measure at arm's length (common practice).
pub const FINGER_DEG: f64 = 1.0;
pub const THREE_FINGERS_DEG: f64 = 5.0;
pub const FIST_DEG: f64 = 10.0;
pub const SPREAD_HAND_DEG: f64 = 20.0;

const COMPASS_16: [(&str, &str); 16] = [
    ("north", "N"),
    ("north-north-east", "NNE"),
    ("north-east", "NE"),
    ("east-north-east", "ENE"),
    ("east", "E"),
    ("east-south-east", "ESE"),
    ("south-east", "SE"),
    ("south-south-east", "SSE"),
    ("south", "S"),
    ("south-south-west", "SSW"),
    ("south-west", "SW"),
    ("west-south-west", "WSW"),
    ("west", "W"),
    ("west-north-west", "WNW"),
    ("north-west", "NW"),
    ("north-north-west", "NNW"),
];

/// One of the 16 compass points.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct CompassPoint {
    /// 0 = north, 4 = east, 8 = south, 12 = west.
    pub index: u8,
    pub name: &'static str,
    pub abbrev: &'static str,
    /// The point's own azimuth, degrees from north through east.
    pub nominal_az_deg: f64,
}

/// The 16-point compass sector holding `az_rad` (azimuth from true north
/// through east); each point covers ±11.25° about its nominal azimuth.
pub fn compass_point_16(az_rad: f64) -> CompassPoint {
    let deg = wrap_2pi(az_rad).to_degrees();
    let idx = (libm::floor(deg / 22.5 + 0.5) as i64).rem_euclid(16) as usize;
    let (name, abbrev) = COMPASS_16[idx];
    CompassPoint { index: idx as u8, name, abbrev, nominal_az_deg: idx as f64 * 22.5 }
}

/// An angle in hand measures at arm's length, with degrees, e.g.
/// "about one and a half fists (15°)". Conventions in the module doc.
pub fn hand_measure_words(angle_rad: f64) -> String {
    let deg = angle_rad.abs().to_degrees();
    if !deg.is_finite() {
        return "an unknown angle".to_string();
    }
    let d_round = libm::round(deg) as i64;
    if deg < 0.75 {
        return format!("less than a finger's width ({})", small_deg(deg));
    }
    if deg < 3.5 {
        let n = d_round.max(1);
        let what = if n == 1 { "one finger's width".to_string() } else { format!("{} fingers' width", number_word(n)) };
        return format!("about {what} ({d_round}°)");
    }
    if deg < 7.5 {
        return format!("about three fingers' width ({d_round}°)");
    }
    let halves = libm::round(deg / (FIST_DEG / 2.0)) as i64;
    let whole = halves / 2;
    let fists = match (whole, halves % 2 == 1) {
        (1, false) => "one fist".to_string(),
        (1, true) => "one and a half fists".to_string(),
        (w, false) => format!("{} fists", number_word(w)),
        (w, true) => format!("{} and a half fists", number_word(w)),
    };
    format!("about {fists} ({d_round}°)")
}

fn small_deg(deg: f64) -> String {
    let arcmin = libm::round(deg * 60.0) as i64;
    format!("{arcmin}′")
}

fn number_word(n: i64) -> String {
    const W: [&str; 13] =
        ["zero", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten", "eleven", "twelve"];
    if (0..13).contains(&n) {
        W[n as usize].to_string()
    } else {
        n.to_string()
    }
}

/// The height band word for an altitude (our own bands, in degrees):
/// <0 below the horizon, <3 on the horizon, <10 very low, <25 low,
/// <50 part way up, <70 high, else nearly overhead.
pub fn altitude_band(alt_rad: f64) -> &'static str {
    let d = alt_rad.to_degrees();
    if d < 0.0 {
        "below the horizon"
    } else if d < 3.0 {
        "right on the horizon"
    } else if d < 10.0 {
        "very low"
    } else if d < 25.0 {
        "low"
    } else if d < 50.0 {
        "part way up"
    } else if d < 70.0 {
        "high"
    } else {
        "nearly overhead"
    }
}

/// "Low in the south-east, about one fist (10°) above the horizon."
/// Above 70° it counts from the zenith instead.
pub fn altitude_sentence(h: Horizontal) -> String {
    let cp = compass_point_16(h.az_rad);
    let band = altitude_band(h.alt_rad);
    let d = h.alt_rad.to_degrees();
    if d < 0.0 {
        return format!("Below the horizon in the {}, {} down: not visible now.", cp.name, hand_measure_words(h.alt_rad));
    }
    if d >= 70.0 {
        let from_zenith = core::f64::consts::FRAC_PI_2 - h.alt_rad;
        return format!("Nearly overhead: {} from straight up, toward the {}.", hand_measure_words(from_zenith), cp.name);
    }
    let mut s = format!("{band} in the {}, {} above the horizon.", cp.name, hand_measure_words(h.alt_rad));
    capitalise(&mut s);
    s
}

/// Upper-cases the first letter (the sentences here start with an ASCII letter).
fn capitalise(s: &mut str) {
    if let Some(c) = s.get_mut(0..1) {
        c.make_ascii_uppercase();
    }
}

/// A bright naked-eye star or planet the observer can start from.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Landmark {
    pub name: String,
    pub pos: Horizontal,
    pub vmag: f64,
}

/// Which landmarks count: brighter than `max_vmag`, higher than `min_alt_rad`.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct LandmarkRule {
    pub max_vmag: f64,
    pub min_alt_rad: f64,
}

impl Default for LandmarkRule {
    /// Mag 2.5 and 5° up: stars that show from a suburban field at dusk (common practice).
    fn default() -> Self {
        LandmarkRule { max_vmag: 2.5, min_alt_rad: 5f64.to_radians() }
    }
}

/// The way from a landmark to the target.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FromLandmark {
    pub name: String,
    pub distance_deg: f64,
    /// Direction from the landmark to the target, degrees clockwise from
    /// straight up (toward the zenith) as the observer faces the sky.
    pub direction_from_up_deg: f64,
    /// "up and to the left", "below", ...
    pub direction_words: &'static str,
    /// "From Vega, go about two fists (21°) down and to the left."
    pub sentence: String,
}

/// Pointing in words for one target.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Pointing {
    pub compass: CompassPoint,
    pub az_deg: f64,
    pub alt_deg: f64,
    /// "Low in the south-east, about one fist (10°) above the horizon."
    pub sentence: String,
    pub from_landmark: Option<FromLandmark>,
}

/// Direction from `from` to `to` as seen facing the sky with the zenith up:
/// the angle clockwise from "up" (azimuth grows to the right), and its words
/// (8 sectors of 45°).
pub fn direction_words(from: Horizontal, to: Horizontal) -> (f64, &'static str) {
    let ang = pa_rad(hz_as_sph(from), hz_as_sph(to));
    const W: [&str; 8] = [
        "straight up",
        "up and to the right",
        "to the right",
        "down and to the right",
        "straight down",
        "down and to the left",
        "to the left",
        "up and to the left",
    ];
    let idx = (libm::floor(ang.to_degrees() / 45.0 + 0.5) as i64).rem_euclid(8) as usize;
    (ang.to_degrees(), W[idx])
}

/// The nearest qualifying landmark to `target` (ties: the brighter, then the
/// first listed). A landmark closer than 0.1° is the target itself and is skipped.
pub fn nearest_landmark(target: Horizontal, landmarks: &[Landmark], rule: LandmarkRule) -> Option<(&Landmark, f64)> {
    let mut best: Option<(&Landmark, f64)> = None;
    for l in landmarks {
        if !(l.vmag <= rule.max_vmag) || !(l.pos.alt_rad >= rule.min_alt_rad) {
            continue;
        }
        let d = sep_rad(hz_as_sph(l.pos), hz_as_sph(target));
        if !d.is_finite() || d < 0.1f64.to_radians() {
            continue;
        }
        let better = match best {
            None => true,
            Some((b, bd)) => d < bd || (d == bd && l.vmag < b.vmag),
        };
        if better {
            best = Some((l, d));
        }
    }
    best
}

/// Pointing words for a target at its (refracted, as seen) alt/az: compass
/// bearing, altitude in hand measures, and the way from the nearest landmark.
pub fn pointing_words(target: Horizontal, landmarks: &[Landmark], rule: LandmarkRule) -> Result<Pointing, FindError> {
    check("target altitude", target.alt_rad, -core::f64::consts::FRAC_PI_2, core::f64::consts::FRAC_PI_2, "between -90° and 90° (in radians)")?;
    check("target azimuth", target.az_rad, -1e3, 1e3, "a finite angle in radians")?;
    let compass = compass_point_16(target.az_rad);
    let from_landmark = nearest_landmark(target, landmarks, rule).map(|(l, d)| {
        let (ang, w) = direction_words(l.pos, target);
        FromLandmark {
            name: l.name.clone(),
            distance_deg: d.to_degrees(),
            direction_from_up_deg: ang,
            direction_words: w,
            sentence: format!("From {}, go {} {}.", l.name, hand_measure_words(d), w),
        }
    });
    Ok(Pointing {
        compass,
        az_deg: wrap_2pi(target.az_rad).to_degrees(),
        alt_deg: target.alt_rad.to_degrees(),
        sentence: altitude_sentence(target),
        from_landmark,
    })
}
