//! Legs: runs of consecutive hops in the same direction, told as one
//! instruction ("from Arcturus, about 1.2 fields up and to the right, in three
//! hops, to a pair of nearly equal stars").

use super::hop::{HopStep, RoutePoint};
use serde::Serialize;

/// A run of hops with the same direction words.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Leg {
    /// Index of the first and last step of the run (inclusive).
    pub first_step: usize,
    pub last_step: usize,
    pub direction_words: &'static str,
    pub length_rad: f64,
    /// Length in finder field diameters.
    pub fields: f64,
    pub sentence: String,
}

fn point_name(p: &RoutePoint, k: usize) -> String {
    if k > 0 && p.label.chars().all(|c| c.is_ascii_digit()) {
        format!("star {}", p.label)
    } else {
        p.label.clone()
    }
}

fn fields_words(f: f64) -> String {
    if f < 0.45 {
        "less than half a field".to_string()
    } else if f < 0.75 {
        "about half a field".to_string()
    } else if f < 1.25 {
        "about one field".to_string()
    } else {
        format!("about {:.1} fields", f)
    }
}

fn count_words(n: usize) -> String {
    match n {
        1 => "in one hop".into(),
        2 => "in two hops".into(),
        3 => "in three hops".into(),
        4 => "in four hops".into(),
        n => format!("in {n} hops"),
    }
}

/// Group `steps` into legs; `field_diameter_rad` is the finder's hop field.
pub fn legs(points: &[RoutePoint], steps: &[HopStep], field_diameter_rad: f64) -> Vec<Leg> {
    let mut out: Vec<Leg> = Vec::new();
    let mut i = 0;
    while i < steps.len() {
        let mut j = i;
        while j + 1 < steps.len() && steps[j + 1].direction_words == steps[i].direction_words {
            j += 1;
        }
        let length_rad: f64 = steps[i..=j].iter().map(|s| s.length_rad).sum();
        let fields = length_rad / field_diameter_rad;
        let from = point_name(&points[steps[i].from], steps[i].from);
        let sentence = format!(
            "From {from}, go {} ({:.1}°) {} {}, to {}.",
            fields_words(fields),
            length_rad.to_degrees(),
            steps[i].direction_words,
            count_words(j - i + 1),
            steps[j].lands_on
        );
        out.push(Leg { first_step: i, last_step: j, direction_words: steps[i].direction_words, length_rad, fields, sentence });
        i = j + 1;
    }
    out
}
