//! Target search: "M42", "m 42", "NGC 7000", "IC434", "HIP 91262", "Vega", "Orion Nebula",
//! "Jupiter". Case, spaces and punctuation do not matter; an unknown name gets a plain
//! message with the nearest known names.

use core::fmt;

use serde::{Deserialize, Serialize};

use super::catalog::{normalize_id, Catalogs};
use super::names;

/// What a name resolved to. `Star` and `Dso` carry ids of [`Catalogs`]; `Body` a
/// lower-case solar-system body name ("sun", "moon", "mercury", … "neptune").
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum TargetRef {
    Star(u32),
    Dso(u32),
    Body(String),
}

/// Why a name did not resolve.
#[derive(Clone, Debug, PartialEq)]
pub enum SearchError {
    Empty,
    /// Nothing of that name; `suggestions` are the nearest known names (may be empty).
    Unknown { query: String, suggestions: Vec<String> },
    /// A catalogue number outside the catalogue's range.
    OutOfRange { query: String, catalogue: &'static str, allowed: &'static str },
    /// A valid designation with no record in the packaged catalogue (e.g. M 102).
    NoRecord { query: String, catalogue: &'static str },
    /// The file that holds this object has not loaded yet.
    NotLoaded { query: String, file: &'static str },
}

impl fmt::Display for SearchError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SearchError::Empty => write!(f, "type the name of a target, e.g. M 42, NGC 7000, Vega or Jupiter"),
            SearchError::Unknown { query, suggestions } if suggestions.is_empty() => write!(
                f,
                "no target called \"{query}\"; try a Messier, NGC, IC or HIP number, a star name or a planet"
            ),
            SearchError::Unknown { query, suggestions } => {
                write!(f, "no target called \"{query}\"; did you mean {}?", suggestions.join(", "))
            }
            SearchError::OutOfRange { query, catalogue, allowed } => {
                write!(f, "\"{query}\": {catalogue} numbers run {allowed}")
            }
            SearchError::NoRecord { query, catalogue } => {
                write!(f, "\"{query}\" has no record in the packaged {catalogue} data")
            }
            SearchError::NotLoaded { query, file } => {
                write!(f, "\"{query}\" is in the catalog file {file}, which has not loaded yet; try again in a moment")
            }
        }
    }
}

impl std::error::Error for SearchError {}

const BODIES: [&str; 9] = ["sun", "moon", "mercury", "venus", "mars", "jupiter", "saturn", "uranus", "neptune"];

/// Resolve a typed name to a target.
pub fn resolve(query: &str, cats: &Catalogs) -> Result<TargetRef, SearchError> {
    let q = query.trim();
    if q.is_empty() {
        return Err(SearchError::Empty);
    }
    let mut key = names::normalize(q);
    if key.is_empty() {
        return Err(SearchError::Unknown { query: q.to_string(), suggestions: Vec::new() });
    }
    if let Some(rest) = key.strip_prefix("the").filter(|r| BODIES.contains(r)) {
        key = rest.to_string();
    }
    if let Some(b) = BODIES.iter().find(|&&b| b == key) {
        return Ok(TargetRef::Body(b.to_string()));
    }
    if let Some(r) = designation(q, &key, cats) {
        return r;
    }
    if let Some(hip) = names::hip_for_name(q) {
        return match cats.star_by_hip(hip) {
            Some(id) => Ok(TargetRef::Star(id)),
            None => Err(SearchError::NotLoaded { query: q.to_string(), file: "stars_bright / stars_hip" }),
        };
    }
    if let Some(i) = cats.dso_by_name(&key) {
        return Ok(TargetRef::Dso(i));
    }
    if !cats.dso_loaded() {
        return Err(SearchError::NotLoaded { query: q.to_string(), file: "dso_openngc" });
    }
    Err(SearchError::Unknown { query: q.to_string(), suggestions: suggest(&key, cats) })
}

/// "M 42", "NGC7000", "IC 434", "HIP 91262", "Mel 22": a prefix of letters, then a number.
fn designation(q: &str, key: &str, cats: &Catalogs) -> Option<Result<TargetRef, SearchError>> {
    let split = key.find(|c: char| c.is_ascii_digit())?;
    let (pre, rest) = key.split_at(split);
    if pre.is_empty() {
        return None;
    }
    let digits_end = rest.find(|c: char| !c.is_ascii_digit()).unwrap_or(rest.len());
    let number: Option<u64> = rest[..digits_end].parse().ok();
    let plain = digits_end == rest.len();
    let query = q.to_string();
    Some(match (pre, number) {
        ("m" | "messier", Some(n)) if plain => {
            if !(1..=110).contains(&n) {
                Err(SearchError::OutOfRange { query, catalogue: "Messier", allowed: "1 to 110" })
            } else if !cats.dso_loaded() {
                Err(SearchError::NotLoaded { query, file: "dso_openngc" })
            } else {
                cats.dso_by_messier(n as u8)
                    .map(TargetRef::Dso)
                    .ok_or(SearchError::NoRecord { query, catalogue: "OpenNGC" })
            }
        }
        ("hip", Some(n)) if plain => {
            if !(1..=120_416).contains(&n) {
                Err(SearchError::OutOfRange { query, catalogue: "Hipparcos", allowed: "1 to 120416" })
            } else {
                match cats.star_by_hip(n as u32) {
                    Some(id) => Ok(TargetRef::Star(id)),
                    None if !cats.hip_tiers_loaded() => Err(SearchError::NotLoaded { query, file: "stars_hip" }),
                    None => Err(SearchError::NoRecord { query, catalogue: "Hipparcos (new reduction)" }),
                }
            }
        }
        ("ngc" | "ic", Some(n)) => {
            let (cat, max) = if pre == "ngc" { ("NGC", 7840) } else { ("IC", 5386) };
            if !(1..=max).contains(&n) {
                let allowed = if pre == "ngc" { "1 to 7840" } else { "1 to 5386" };
                Err(SearchError::OutOfRange { query, catalogue: cat, allowed })
            } else if !cats.dso_loaded() {
                Err(SearchError::NotLoaded { query, file: "dso_openngc" })
            } else {
                match cats.dso_by_id(&normalize_id(key)) {
                    Some(i) => Ok(TargetRef::Dso(i)),
                    None => Err(SearchError::NoRecord { query, catalogue: "OpenNGC" }),
                }
            }
        }
        _ => return cats.dso_by_id(&normalize_id(key)).map(|i| Ok(TargetRef::Dso(i))),
    })
}

/// Up to three known names nearest to `key` (edit distance on normalized forms).
fn suggest(key: &str, cats: &Catalogs) -> Vec<String> {
    if key.chars().count() > 48 {
        return Vec::new(); // no name is that long; skip the quadratic comparisons
    }
    let max = (key.chars().count() / 3).clamp(1, 3);
    let mut best: Vec<(usize, String)> = Vec::new();
    let mut consider = |name: &str| {
        let d = edit_distance(key, &names::normalize(name));
        if d <= max && !best.iter().any(|(_, n)| n == name) {
            best.push((d, name.to_string()));
        }
    };
    for (n, _) in names::all() {
        consider(n);
    }
    for n in cats.dso_common_names() {
        consider(n);
    }
    for b in BODIES {
        consider(&(b[..1].to_ascii_uppercase() + &b[1..]));
    }
    crate::sort::sort_by(&mut best, |a, b| a.cmp(b));
    best.into_iter().take(3).map(|(_, n)| n).collect()
}

/// Optimal-string-alignment distance (Damerau–Levenshtein without repeated edits):
/// insert, delete, substitute and swap of neighbours each cost 1.
fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let w = b.len() + 1;
    let mut d = vec![0usize; (a.len() + 1) * w];
    for i in 0..=a.len() {
        d[i * w] = i;
    }
    for j in 0..=b.len() {
        d[j] = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut v = (d[(i - 1) * w + j] + 1).min(d[i * w + j - 1] + 1).min(d[(i - 1) * w + j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                v = v.min(d[(i - 2) * w + j - 2] + 1);
            }
            d[i * w + j] = v;
        }
    }
    d[a.len() * w + b.len()]
}
