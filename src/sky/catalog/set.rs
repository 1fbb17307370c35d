//! `Catalogs`: the loaded catalog files plus their indexes, loaded tier by tier so a
//! phone can show the bright tier before the deep ones arrive.

use super::{decode_stars, CatalogError, Star, StarCatalog};
use crate::sky::dso::{decode_dso, Dso, DsoCatalog};
use crate::sky::index::{unit_vector, SkyIndex};
use crate::sky::{names, Equatorial};

/// Star tiers in id order: a star id is `tier << 28 | index in that tier's file`,
/// so ids stay the same whatever order the tiers load in.
pub const STAR_TIERS: [&str; 3] = ["stars_bright", "stars_hip", "stars_gaia"];
/// The deep-sky file's name for [`Catalogs::load`].
pub const DSO_FILE: &str = "dso_openngc";
const KNOWN: &str = "stars_bright, stars_hip, stars_gaia, dso_openngc";
const TIER_SHIFT: u32 = 28;
/// Deep-sky objects larger than this (semi-major axis) are checked by scan, not by index.
const LARGE_DSO_RAD: f64 = 0.5 * core::f64::consts::PI / 180.0;

/// Attribution lines of each file, to show offline (licences in catalog/README.md).
pub fn credit(file: &str) -> &'static str {
    match file {
        "stars_bright" | "stars_hip" => "Hipparcos new reduction (van Leeuwen 2007), ESA public data",
        "stars_gaia" => "Gaia DR3: this work has made use of data from the European Space Agency (ESA) mission Gaia, processed by the Gaia Data Processing and Analysis Consortium (DPAC); CC BY-SA 3.0 IGO",
        "dso_openngc" => "OpenNGC by Mattia Verga et al., CC-BY-SA-4.0",
        _ => "IAU Working Group on Star Names, via skyfield (MIT)",
    }
}

struct Tier {
    cat: StarCatalog,
    index: SkyIndex,
}

struct DsoSet {
    cat: DsoCatalog,
    /// Index over the centres of objects no larger than LARGE_DSO_RAD.
    index: SkyIndex,
    /// Index position → object number, for the indexed (small) objects.
    small: Vec<u32>,
    large: Vec<u32>,
    /// Normalized identifier ("ngc1976", "ic434", "mel22") → object.
    by_id: NameIndex,
    /// Messier number → object (None: not in the catalog); a table, not another map type.
    by_messier: Vec<Option<u32>>,
    /// Normalized common name ("orionnebula") → object.
    by_name: NameIndex,
}

/// All loaded catalogs. Empty at first; [`Catalogs::load`] adds one file at a time.
#[derive(Default)]
pub struct Catalogs {
    tiers: [Option<Tier>; 3],
    dso: Option<DsoSet>,
    /// (Hipparcos number, star id), sorted by number, one entry per number: the star
    /// loaded last, as a map's insert would keep. A sorted list, not another map type
    /// (wasm size).
    by_hip: Vec<(u32, u32)>,
}

/// A star id from a tier number and an index into that tier's `stars`.
pub fn star_id(tier: usize, index: u32) -> u32 {
    ((tier as u32) << TIER_SHIFT) | (index & ((1 << TIER_SHIFT) - 1))
}

/// (tier, index into that tier's `stars`) of a star id.
pub fn split_star_id(id: u32) -> (usize, u32) {
    ((id >> TIER_SHIFT) as usize, id & ((1 << TIER_SHIFT) - 1))
}

/// Normalized form of a catalogue identifier: lower-case prefix, number without leading
/// zeros, lower-case suffix ("NGC0224" → "ngc224", "IC 434" → "ic434", "Mel022" → "mel22").
/// ASCII case folding only, as `names::normalize`.
pub fn normalize_id(s: &str) -> String {
    let t = crate::sky::names::normalize(s);
    let start = t.find(|c: char| c.is_ascii_digit()).unwrap_or(t.len());
    let (pre, rest) = t.split_at(start);
    let end = rest.find(|c: char| !c.is_ascii_digit()).unwrap_or(rest.len());
    let (num, suf) = rest.split_at(end);
    let num = num.trim_start_matches('0');
    let num = if num.is_empty() && end > 0 { "0" } else { num };
    format!("{pre}{num}{suf}")
}

impl Catalogs {
    pub fn new() -> Catalogs {
        Catalogs::default()
    }

    /// Decode and index one file. `name` is the file's name with or without directory and
    /// extension ("stars_bright", "catalog/stars_gaia.nfs"). Loading a file again replaces it.
    pub fn load(&mut self, name: &str, bytes: &[u8]) -> Result<(), CatalogError> {
        let base = name.rsplit(['/', '\\']).next().unwrap_or(name);
        let stem = base.split('.').next().unwrap_or(base);
        if let Some(t) = STAR_TIERS.iter().position(|&s| s == stem) {
            let cat = decode_stars(bytes)?;
            let index = SkyIndex::build(&cat.stars);
            self.by_hip.retain(|&(_, id)| (id >> TIER_SHIFT) as usize != t);
            for (i, s) in cat.stars.iter().enumerate() {
                if s.hip != 0 {
                    self.by_hip.push((s.hip, ((t as u32) << TIER_SHIFT) | i as u32));
                }
            }
            // Stable: for one number, the older entries stay before the newer; keep the newest.
            crate::sort::sort_by(&mut self.by_hip, |a, b| a.0.cmp(&b.0));
            let mut kept: Vec<(u32, u32)> = Vec::with_capacity(self.by_hip.len());
            for &e in &self.by_hip {
                match kept.last_mut() {
                    Some(last) if last.0 == e.0 => *last = e,
                    _ => kept.push(e),
                }
            }
            self.by_hip = kept;
            self.tiers[t] = Some(Tier { cat, index });
            Ok(())
        } else if stem == DSO_FILE {
            self.dso = Some(build_dso(decode_dso(bytes)?));
            Ok(())
        } else {
            Err(CatalogError::UnknownFile { name: name.to_string(), known: KNOWN })
        }
    }

    /// Names of the loaded files.
    pub fn loaded(&self) -> Vec<&'static str> {
        let mut v: Vec<&'static str> =
            STAR_TIERS.iter().zip(&self.tiers).filter(|(_, t)| t.is_some()).map(|(n, _)| *n).collect();
        if self.dso.is_some() {
            v.push(DSO_FILE);
        }
        v
    }

    /// Attribution lines of the loaded files plus the compiled-in star names, to show offline.
    pub fn credits(&self) -> Vec<&'static str> {
        let mut v: Vec<&'static str> = self.loaded().into_iter().map(credit).collect();
        v.push(credit("names_iau"));
        v.dedup();
        v
    }

    /// A star by id, with the Julian-year epoch of its catalog position.
    pub fn star(&self, id: u32) -> Option<(&Star, f64)> {
        let t = self.tiers.get((id >> TIER_SHIFT) as usize)?.as_ref()?;
        t.cat.stars.get((id & ((1 << TIER_SHIFT) - 1)) as usize).map(|s| (s, t.cat.epoch_jyear))
    }

    /// Id of a Hipparcos star, if its tier is loaded.
    pub fn star_by_hip(&self, hip: u32) -> Option<u32> {
        let k = self.by_hip.binary_search_by(|e| e.0.cmp(&hip)).ok()?;
        Some(self.by_hip[k].1)
    }

    /// Words for a star: its IAU name, else "HIP n", else "star of magnitude m".
    pub fn star_label(&self, id: u32) -> String {
        match self.star(id) {
            Some((s, _)) if s.hip != 0 => match names::name_for_hip(s.hip) {
                Some(n) => n.to_string(),
                None => format!("HIP {}", s.hip),
            },
            Some((s, _)) => format!("star of magnitude {:.1}", s.vmag),
            None => "unknown star".to_string(),
        }
    }

    /// Ids of stars within `radius_rad` of `center` (catalog positions) with V ≤ `mag_limit`,
    /// over every loaded tier.
    pub fn stars_in_cone(&self, center: Equatorial, radius_rad: f64, mag_limit: f32) -> Vec<u32> {
        let mut out = Vec::new();
        let mut tmp = Vec::new();
        for (t, tier) in self.tiers.iter().enumerate() {
            if let Some(tier) = tier {
                tmp.clear();
                tier.index.cone_into(center, radius_rad, mag_limit, &mut tmp);
                out.extend(tmp.iter().map(|&i| ((t as u32) << TIER_SHIFT) | i));
            }
        }
        out
    }

    /// Every star id of the loaded tiers (for full scans).
    pub fn all_star_ids(&self) -> impl Iterator<Item = u32> + '_ {
        self.tiers.iter().enumerate().flat_map(|(t, tier)| {
            let n = tier.as_ref().map_or(0, |x| x.cat.stars.len() as u32);
            (0..n).map(move |i| ((t as u32) << TIER_SHIFT) | i)
        })
    }

    /// One loaded tier's catalog (tier number as in [`STAR_TIERS`]); its star indices are
    /// what [`Catalogs::tier_index`] returns and what [`split_star_id`] gives.
    pub fn tier(&self, tier: usize) -> Option<&StarCatalog> {
        self.tiers.get(tier)?.as_ref().map(|t| &t.cat)
    }

    /// The index of one loaded tier.
    pub fn tier_index(&self, tier: usize) -> Option<&SkyIndex> {
        self.tiers.get(tier)?.as_ref().map(|t| &t.index)
    }

    pub fn dso(&self, id: u32) -> Option<&Dso> {
        self.dso.as_ref()?.cat.objects.get(id as usize)
    }

    pub fn dso_count(&self) -> usize {
        self.dso.as_ref().map_or(0, |d| d.cat.objects.len())
    }

    /// Deep-sky objects whose extent (a circle of the semi-major axis; a point when the
    /// size is unknown) overlaps the circular field of `radius_rad` around `center`.
    pub fn dsos_overlapping(&self, center: Equatorial, radius_rad: f64) -> Vec<u32> {
        let Some(d) = &self.dso else { return Vec::new() };
        if !radius_rad.is_finite() {
            return Vec::new();
        }
        let c = unit_vector(center.ra_rad, center.dec_rad);
        let overlaps = |o: &Dso| {
            let reach = radius_rad.max(0.0) + o.radius_rad();
            if reach >= core::f64::consts::PI {
                return true;
            }
            let v = unit_vector(o.ra_rad, o.dec_rad);
            v[0] * c[0] + v[1] * c[1] + v[2] * c[2] >= libm::cos(reach)
        };
        let mut out: Vec<u32> = d
            .index
            .cone(center, radius_rad.max(0.0) + LARGE_DSO_RAD, f32::INFINITY)
            .into_iter()
            .map(|i| d.small[i as usize])
            .filter(|&i| overlaps(&d.cat.objects[i as usize]))
            .collect();
        out.extend(d.large.iter().copied().filter(|&i| overlaps(&d.cat.objects[i as usize])));
        crate::sort::sort_u32(&mut out);
        out
    }

    pub(crate) fn dso_by_id(&self, normalized: &str) -> Option<u32> {
        self.dso.as_ref()?.by_id.get(normalized)
    }
    pub(crate) fn dso_by_messier(&self, m: u8) -> Option<u32> {
        self.dso.as_ref()?.by_messier[m as usize]
    }
    pub(crate) fn dso_by_name(&self, normalized: &str) -> Option<u32> {
        self.dso.as_ref()?.by_name.get(normalized)
    }
    pub(crate) fn dso_common_names(&self) -> impl Iterator<Item = &str> {
        self.dso.iter().flat_map(|d| d.cat.objects.iter().flat_map(|o| o.common_names.iter().map(String::as_str)))
    }
    pub(crate) fn hip_tiers_loaded(&self) -> bool {
        self.tiers[0].is_some() && self.tiers[1].is_some()
    }
    pub(crate) fn dso_loaded(&self) -> bool {
        self.dso.is_some()
    }
}

fn build_dso(cat: DsoCatalog) -> DsoSet {
    let (mut small, mut large) = (Vec::new(), Vec::new());
    for (i, o) in cat.objects.iter().enumerate() {
        if o.radius_rad() > LARGE_DSO_RAD {
            large.push(i as u32);
        } else {
            small.push(i as u32);
        }
    }
    let index = SkyIndex::from_points(small.iter().map(|&i| {
        let o = &cat.objects[i as usize];
        (o.ra_rad, o.dec_rad, 0.0)
    }));
    // (name, object, flag) in load order; each index keeps one object per name below.
    let (mut ids, mut names_in) = (Vec::new(), Vec::new());
    let mut by_messier: Vec<Option<u32>> = vec![None; 256];
    for (i, o) in cat.objects.iter().enumerate() {
        for (k, id) in o.ids.iter().enumerate() {
            ids.push((normalize_id(id), i as u32, k == 0));
        }
        if o.messier > 0 {
            by_messier[o.messier as usize].get_or_insert(i as u32);
        }
        for n in &o.common_names {
            names_in.push((names::normalize(n), i as u32, o.messier > 0));
        }
    }
    // An object's own (first) identifier wins over cross-ids, the last such object over
    // earlier ones; a name no object has as its own goes to the first object listing it.
    let by_id = NameIndex::build(ids, |g| g.iter().rev().find(|e| e.2).unwrap_or(&g[0]).1);
    // A Messier object keeps a shared name over a non-Messier one; else the first wins.
    let by_name = NameIndex::build(names_in, |g| g.iter().find(|e| e.2).unwrap_or(&g[0]).1);
    DsoSet { cat, index, small, large, by_id, by_messier, by_name }
}

/// Normalized name → object, as a list sorted by name and searched by halves: no hash
/// map (its table code and hasher) in the wasm.
struct NameIndex(Vec<(String, u32)>);

impl NameIndex {
    /// From (name, object, flag) entries in load order; `pick` chooses the object a name
    /// keeps from all of that name's entries (given in load order).
    fn build(mut entries: Vec<(String, u32, bool)>, pick: fn(&[(String, u32, bool)]) -> u32) -> NameIndex {
        crate::sort::sort_by(&mut entries, |a, b| a.0.cmp(&b.0)); // stable: load order within a name
        let mut out = Vec::new();
        let mut start = 0;
        while start < entries.len() {
            let end = start + entries[start..].iter().take_while(|e| e.0 == entries[start].0).count();
            let object = pick(&entries[start..end]);
            out.push((core::mem::take(&mut entries[start].0), object));
            start = end;
        }
        NameIndex(out)
    }

    fn get(&self, name: &str) -> Option<u32> {
        let k = self.0.binary_search_by(|e| e.0.as_str().cmp(name)).ok()?;
        Some(self.0[k].1)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::collections::HashMap;

    /// The name indexes give what the hash maps they replaced gave, rebuilt here with
    /// the same inserts, for every name in the real DSO file and a few absent ones.
    #[test]
    fn name_indexes_match_map_inserts() {
        let cat = decode_dso(include_bytes!("../../../catalog/dso_openngc.nfd")).unwrap();
        let (mut by_id, mut by_messier, mut by_name) = (HashMap::new(), HashMap::new(), HashMap::new());
        for (i, o) in cat.objects.iter().enumerate() {
            for (k, id) in o.ids.iter().enumerate() {
                let key = normalize_id(id);
                if k == 0 {
                    by_id.insert(key, i as u32);
                } else {
                    by_id.entry(key).or_insert(i as u32);
                }
            }
            if o.messier > 0 {
                by_messier.entry(o.messier).or_insert(i as u32);
            }
            for n in &o.common_names {
                let key = names::normalize(n);
                match by_name.get(&key) {
                    Some(&j) if cat.objects[j as usize].messier > 0 || o.messier == 0 => {}
                    _ => {
                        by_name.insert(key, i as u32);
                    }
                }
            }
        }
        let set = build_dso(cat);
        assert!(by_id.len() > 5000 && by_name.len() > 100 && by_messier.len() > 100);
        assert_eq!(set.by_id.0.len(), by_id.len());
        assert_eq!(set.by_name.0.len(), by_name.len());
        for (k, &v) in &by_id {
            assert_eq!(set.by_id.get(k), Some(v), "id {k}");
        }
        for (k, &v) in &by_name {
            assert_eq!(set.by_name.get(k), Some(v), "name {k}");
        }
        for m in 0..=255u8 {
            assert_eq!(set.by_messier[m as usize], by_messier.get(&m).copied(), "M{m}");
        }
        for absent in ["", "ngc", "ngc99999", "zzzz", "\u{e9}"] {
            assert_eq!(set.by_id.get(absent), by_id.get(absent).copied());
            assert_eq!(set.by_name.get(absent), by_name.get(absent).copied());
        }
    }
}
