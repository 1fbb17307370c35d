//! The route-search benchmark workload, as a plain function so the lead can
//! time the same code natively and in wasm.

use super::finder::{Finder, FinderKind, FinderSpec};
use super::hop::{choose_start, plan_route, HopRules, HopStar, Route, UpReference};
use super::FindError;
use crate::sky::Equatorial;

/// Arcturus (J2000, from memory: 14h15m39.7s +19°10′57″) to the globular
/// cluster M3 (13h42m11.6s +28°22′38″): a classic hop across a region about
/// 10° wide, with a 6° 8×50 straight-through finder under a mag-6 sky.
pub const BENCH_START: Equatorial = Equatorial { ra_rad: 3.733_528, dec_rad: 0.334_798 };
pub const BENCH_TARGET: Equatorial = Equatorial { ra_rad: 3.587_495, dec_rad: 0.495_276 };

/// The bench finder: 8×50 straight-through, 6° true field (a common size).
pub fn bench_finder() -> Result<Finder, FindError> {
    Finder::new(FinderSpec { kind: FinderKind::StraightThrough, aperture_mm: 50.0, magnification: 8.0, true_field_deg: 6.0 })
}

/// One route search over `stars` (the whole deep catalog, as HopStars):
/// choose the start (brightest star near Arcturus' place), gather the
/// corridor, build the graph, search, describe. Returns the route.
pub fn bench_route_search(stars: &[HopStar]) -> Result<Route, FindError> {
    let finder = bench_finder()?;
    let limit = finder.limiting_mag(6.0, 7.0)?;
    let start = choose_start(stars, BENCH_START, 1.0, 0.5f64.to_radians())
        .ok_or(FindError::NoRoute { reason: "no star brighter than mag 1 within 0.5° of the bench start".into() })?;
    plan_route(stars, start, "Arcturus", BENCH_TARGET, "M3", &finder, limit, UpReference::North, &HopRules::default())
}

/// The same workload through the spatial index (`sources::plan_route_indexed`);
/// build `index` once with `sources::hop_index(stars)`.
pub fn bench_route_search_indexed(stars: &[HopStar], index: &crate::sky::index::SkyIndex) -> Result<Route, FindError> {
    let finder = bench_finder()?;
    let limit = finder.limiting_mag(6.0, 7.0)?;
    let near = index.cone(BENCH_START, 0.5f64.to_radians(), 1.0);
    let start = near
        .iter()
        .copied()
        .min_by(|&a, &b| {
            let da = crate::find::geom::sep_rad(stars[a as usize].pos(), BENCH_START);
            let db = crate::find::geom::sep_rad(stars[b as usize].pos(), BENCH_START);
            da.total_cmp(&db).then(a.cmp(&b))
        })
        .ok_or(FindError::NoRoute { reason: "no star brighter than mag 1 within 0.5° of the bench start".into() })?;
    crate::find::sources::plan_route_indexed(stars, index, start as usize, "Arcturus", BENCH_TARGET, "M3", &finder, limit, UpReference::North, &HopRules::default(), &|_| None)
}
