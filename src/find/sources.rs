//! Adapters from the catalogs' types to the route search's `HopStar`.

use super::finder::Finder;
use super::hop::{plan_route_named, route_region, HopRules, HopStar, Route, UpReference};
use super::FindError;
use crate::sky::catalog::{Star, StarCatalog};
use crate::sky::index::SkyIndex;
use crate::sky::Equatorial;

/// `HopStar::id` of a star without a Hipparcos number has this bit set; the
/// rest is its position in the concatenated catalogs. Stars with a HIP
/// number carry it as the id, so proper names (name → HIP) find them.
pub const NO_HIP_BIT: u32 = 1 << 31;

/// The id a catalog star gets in the route search.
pub fn hop_id(star: &Star, running_index: usize) -> u32 {
    if star.hip != 0 {
        star.hip
    } else {
        NO_HIP_BIT | (running_index as u32 & !NO_HIP_BIT)
    }
}

/// All stars of the given catalogs (e.g. bright + Hipparcos + Gaia tiers),
/// in order, as route-search stars. Positions stay at each catalog's epoch:
/// proper motions shift stars by arcseconds, far below a finder's resolution.
pub fn hop_stars(catalogs: &[&StarCatalog]) -> Vec<HopStar> {
    let n = catalogs.iter().map(|c| c.stars.len()).sum();
    let mut out = Vec::with_capacity(n);
    for c in catalogs {
        for s in &c.stars {
            let i = out.len();
            out.push(HopStar { ra_rad: s.ra_rad, dec_rad: s.dec_rad, vmag: s.vmag, id: hop_id(s, i) });
        }
    }
    out
}

/// Index of the star with Hipparcos number `hip` in `stars`, if any.
pub fn find_hip(stars: &[HopStar], hip: u32) -> Option<usize> {
    if hip == 0 || hip & NO_HIP_BIT != 0 {
        return None;
    }
    stars.iter().position(|s| s.id == hip)
}

/// The IAU proper name of a route star (by `HopStar::id`), via `sky::names`.
pub fn iau_name(id: u32) -> Option<String> {
    if id == 0 || id & NO_HIP_BIT != 0 {
        return None;
    }
    crate::sky::names::name_for_hip(id).map(str::to_string)
}

/// A spatial index over route-search stars (indices into the same slice).
pub fn hop_index(stars: &[HopStar]) -> SkyIndex {
    SkyIndex::from_points(stars.iter().map(|s| (s.ra_rad, s.dec_rad, s.vmag)))
}

/// As `hop::plan_route_named`, but fetching only the stars of the route's
/// region through the index (`hop::route_region` cone, star limit) instead of
/// scanning every star. Same route as the full scan.
#[allow(clippy::too_many_arguments)]
pub fn plan_route_indexed(
    stars: &[HopStar],
    index: &SkyIndex,
    start: usize,
    start_label: &str,
    target: Equatorial,
    target_label: &str,
    finder: &Finder,
    finder_limit_mag: f64,
    up: UpReference,
    rules: &HopRules,
    name_of: &dyn Fn(u32) -> Option<String>,
) -> Result<Route, FindError> {
    let Some(s0) = stars.get(start) else {
        return Err(FindError::BadIndex { field: "starting star", index: start, len: stars.len() });
    };
    let (centre, radius) = route_region(s0.pos(), target, finder, rules);
    let limit = (finder_limit_mag - rules.visibility_margin_mag) as f32;
    let mut ids = if limit.is_finite() { index.cone(centre, radius, limit) } else { Vec::new() };
    // The index returns no particular order; sort so ties break the same way everywhere.
    crate::sort::sort_u32(&mut ids);
    let mut subset = Vec::with_capacity(ids.len() + 1);
    subset.push(*s0);
    subset.extend(ids.iter().filter(|&&i| i as usize != start).filter_map(|&i| stars.get(i as usize).copied()));
    plan_route_named(&subset, 0, start_label, target, target_label, finder, finder_limit_mag, up, rules, name_of)
}
