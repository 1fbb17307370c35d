//! IAU proper names of bright stars → Hipparcos numbers, from `catalog/names_iau.tsv`
//! (skyfield's `named_star_dict`, built by `catalog/build.py`), compiled in so search
//! knows names before any catalog file has loaded.

static TABLE: &str = include_str!("../../catalog/names_iau.tsv");

/// All (name, HIP) pairs, sorted by name as in the file.
pub fn all() -> impl Iterator<Item = (&'static str, u32)> {
    TABLE.lines().filter(|l| !l.starts_with('#') && !l.is_empty()).filter_map(|l| {
        let (name, hip) = l.split_once('\t')?;
        Some((name, hip.trim().parse().ok()?))
    })
}

/// Letters and digits only, ASCII letters in lower case: "Rigil Kentaurus" → "rigilkentaurus".
/// Other letters are kept as they are (compared exactly): every name in the IAU list and
/// OpenNGC's common names is ASCII, and full Unicode case folding would add about 30 KB
/// of tables to the wasm.
pub fn normalize(s: &str) -> String {
    s.chars().filter(|c| c.is_alphanumeric()).map(|c| c.to_ascii_lowercase()).collect()
}

/// HIP number of an IAU star name, tolerant of case, spaces and punctuation.
pub fn hip_for_name(name: &str) -> Option<u32> {
    let key = normalize(name);
    all().find(|(n, _)| normalize(n) == key).map(|(_, h)| h)
}

/// The IAU name of a Hipparcos star (the first in name order if it has several).
pub fn name_for_hip(hip: u32) -> Option<&'static str> {
    all().find(|&(_, h)| h == hip).map(|(n, _)| n)
}
