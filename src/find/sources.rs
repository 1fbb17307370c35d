//! Adapters from the catalogs' types to the route search's `HopStar`.

use super::hop::HopStar;
use crate::sky::catalog::{Star, StarCatalog};

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
