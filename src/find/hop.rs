//! Star-hop route from a bright starting star to the target.
//!
//! Method (stated to the user): a shortest path (Dijkstra 1959) over the graph
//! whose nodes are the start, the target and every star brighter than the
//! finder's limit less a visibility margin inside a corridor around the
//! great circle start→target, and whose edges join two nodes closer than the
//! hop limit: the finder's field radius less an edge margin, so that with the
//! current star centred the next one is inside the field. Cost is
//! lexicographic: fewest hops, then shortest total length.
//! Positions must all be in one frame (the catalog's); proper motion over a
//! few decades is far below a finder's resolution and is ignored here.

// `!(a <= b)` is deliberate: it is true for NaN, which must be refused too.
#![allow(clippy::neg_cmp_op_on_partial_ord)]

use super::finder::Finder;
use super::legs::{legs, Leg};
use super::geom::{offset_by, pa_rad, sep_rad, unit, wrap_2pi};
use super::{check, FindError};
use crate::sky::Equatorial;
use glam::DVec3;
use serde::{Deserialize, Serialize};
use std::cmp::Ordering;
use std::collections::BinaryHeap;

/// A star as the route search sees it. `id` is the caller's (catalog index).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct HopStar {
    pub ra_rad: f64,
    pub dec_rad: f64,
    pub vmag: f32,
    pub id: u32,
}

impl HopStar {
    pub fn pos(&self) -> Equatorial {
        Equatorial { ra_rad: self.ra_rad, dec_rad: self.dec_rad }
    }
}

/// Tuning of the route search.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct HopRules {
    /// Fraction of the field radius kept free at the edge (0.2 = a hop is at
    /// most 80 % of the radius).
    pub edge_margin: f64,
    /// Stars used must be this many magnitudes brighter than the finder's
    /// limit, so they are easy to see (not just at the threshold).
    pub visibility_margin_mag: f64,
    /// Prefer bright stepping stones: landing on a star costs this fraction
    /// of the hop limit per magnitude fainter than 3 mag above the star limit.
    pub faintness_penalty: f64,
}

impl Default for HopRules {
    fn default() -> Self {
        HopRules { edge_margin: 0.2, visibility_margin_mag: 0.5, faintness_penalty: 0.1 }
    }
}

/// Extra cost (radians of path) of landing on a star of `vmag`.
pub fn landing_penalty_rad(vmag: f64, star_limit_mag: f64, hop_rad: f64, rules: &HopRules) -> f64 {
    rules.faintness_penalty * hop_rad * (vmag - (star_limit_mag - 3.0)).max(0.0)
}

/// Which way "up" is for the direction words.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum UpReference {
    /// Words relative to the zenith and horizon; the zenith's place in the
    /// stars' frame (`geom::zenith_equatorial`).
    Zenith { zenith: Equatorial },
    /// Words as celestial compass directions (north = toward the pole).
    North,
}

/// One point of the route, for the overlay.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct RoutePoint {
    pub pos: Equatorial,
    /// None for the target when it is not a star of the list.
    pub vmag: Option<f32>,
    pub star_id: Option<u32>,
    pub label: String,
}

/// One hop, from `points[from]` to `points[to]`.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HopStep {
    pub from: usize,
    pub to: usize,
    pub length_rad: f64,
    /// Length as a fraction of the finder's field diameter.
    pub length_fields: f64,
    /// Direction counter-clockwise from "up" as the observer faces the sky, degrees.
    pub direction_from_up_deg: f64,
    pub direction_words: &'static str,
    /// What the hop lands on: "a pair of nearly equal stars (mag 6.1 and 6.3, 14′ apart)".
    pub lands_on: String,
    pub sentence: String,
}

/// A star-hop route: points in order (start first, target last) and the hops.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Route {
    pub points: Vec<RoutePoint>,
    pub steps: Vec<HopStep>,
    /// Runs of same-direction hops, one instruction each.
    pub legs: Vec<Leg>,
    pub hop_count: usize,
    pub total_rad: f64,
    pub max_hop_rad: f64,
    /// Stars on the route are at least this bright.
    pub star_limit_mag: f64,
    /// The minimised second cost: total length plus faintness penalties, radians.
    pub cost_rad: f64,
    pub stars_considered: usize,
    pub method: &'static str,
}

/// Longest start-to-target distance searched: star hops start near the target.
pub const MAX_ROUTE_RAD: f64 = 60.0 * core::f64::consts::PI / 180.0;

pub const METHOD: &str = "shortest path (Dijkstra) over visible stars; a hop is at most the finder's field radius less the edge margin; cost = fewest hops, then least (total length + faintness penalty per landing star)";

/// The cone to fetch candidate stars from (centre, radius) for a route from
/// `start` to `target` with this finder: covers the widest corridor searched.
pub fn route_region(start: Equatorial, target: Equatorial, finder: &Finder, rules: &HopRules) -> (Equatorial, f64) {
    let d = sep_rad(start, target);
    let hop = max_hop_rad(finder, rules);
    let mid = offset_by(start, pa_rad(start, target), d / 2.0);
    let w = corridor_widths(d, hop)[2];
    (mid, (d / 2.0 + w).min(core::f64::consts::PI))
}

fn max_hop_rad(finder: &Finder, rules: &HopRules) -> f64 {
    finder.field_radius_rad() * (1.0 - rules.edge_margin)
}

/// Half-widths tried in turn: narrow first (fast), wider if a gap blocks.
fn corridor_widths(d: f64, hop: f64) -> [f64; 3] {
    let w0 = (2.0 * hop).max(0.2 * d);
    [w0, 2.5 * w0, 6.0 * w0]
}

/// The nearest star to `target` brighter than `max_vmag`, within `max_dist_rad`
/// (ties: the brighter). A sensible bright starting star.
pub fn choose_start(stars: &[HopStar], target: Equatorial, max_vmag: f64, max_dist_rad: f64) -> Option<usize> {
    let mut best: Option<(usize, f64)> = None;
    for (i, s) in stars.iter().enumerate() {
        if !((s.vmag as f64) <= max_vmag) {
            continue;
        }
        let d = sep_rad(s.pos(), target);
        if !(d <= max_dist_rad) {
            continue;
        }
        let better = match best {
            None => true,
            Some((b, bd)) => d < bd || (d == bd && s.vmag < stars[b].vmag),
        };
        if better {
            best = Some((i, d));
        }
    }
    best.map(|b| b.0)
}

#[derive(Clone, Copy, PartialEq)]
struct Cost {
    hops: u32,
    len: f64,
    node: u32,
}
impl Eq for Cost {}
impl Ord for Cost {
    // Reversed: BinaryHeap is a max-heap and we want the cheapest first.
    fn cmp(&self, o: &Self) -> Ordering {
        o.hops.cmp(&self.hops).then(o.len.total_cmp(&self.len)).then(o.node.cmp(&self.node))
    }
}
impl PartialOrd for Cost {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}

/// Buckets of unit vectors on a cubic grid of side `cell` (chord length):
/// every pair closer than `cell` lies in neighbouring cells. The points are kept ordered
/// by cell (ascending point number within a cell) and a cell is found by binary search,
/// so no hash map is compiled for this one key type (wasm size).
struct Grid {
    cell: f64,
    /// Each point's cell.
    keys: Vec<(i32, i32, i32)>,
    /// Point numbers ordered by cell, then by number.
    order: Vec<u32>,
}

impl Grid {
    fn new(vs: &[DVec3], cell: f64) -> Grid {
        let keys: Vec<(i32, i32, i32)> = vs.iter().map(|v| key(*v, cell)).collect();
        let mut order: Vec<u32> = (0..vs.len() as u32).collect();
        crate::sort::sort_indices(&mut order, &|a, b| keys[a as usize].cmp(&keys[b as usize]));
        Grid { cell, keys, order }
    }
    /// Calls `f` with every point in the 27 cells around `v`, cell by cell, each cell's
    /// points in ascending number.
    fn near(&self, v: DVec3, mut f: impl FnMut(u32)) {
        let (x, y, z) = key(v, self.cell);
        for dx in -1..=1 {
            for dy in -1..=1 {
                for dz in -1..=1 {
                    let k = (x + dx, y + dy, z + dz);
                    let first = self.order.partition_point(|&i| self.keys[i as usize] < k);
                    for &i in self.order[first..].iter().take_while(|&&i| self.keys[i as usize] == k) {
                        f(i);
                    }
                }
            }
        }
    }
}

fn key(v: DVec3, cell: f64) -> (i32, i32, i32) {
    ((v.x / cell).floor() as i32, (v.y / cell).floor() as i32, (v.z / cell).floor() as i32)
}

/// Plan a star-hop route from `stars[start]` to the target through stars of
/// `stars` (any superset of the region, e.g. a cone from `route_region`).
/// `finder_limit_mag` comes from `Finder::limiting_mag`.
#[allow(clippy::too_many_arguments)]
pub fn plan_route(
    stars: &[HopStar],
    start: usize,
    start_label: &str,
    target: Equatorial,
    target_label: &str,
    finder: &Finder,
    finder_limit_mag: f64,
    up: UpReference,
    rules: &HopRules,
) -> Result<Route, FindError> {
    plan_route_named(stars, start, start_label, target, target_label, finder, finder_limit_mag, up, rules, &|_| None)
}

/// As `plan_route`, with `name_of` giving a star's proper name (by its `id`)
/// for the step words and labels ("to Muphrid (mag 2.7)").
#[allow(clippy::too_many_arguments)]
pub fn plan_route_named(
    stars: &[HopStar],
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
    if start >= stars.len() {
        return Err(FindError::BadIndex { field: "starting star", index: start, len: stars.len() });
    }
    check("edge margin", rules.edge_margin, 0.0, 0.9, "between 0 and 0.9")?;
    check("visibility margin", rules.visibility_margin_mag, 0.0, 5.0, "between 0 and 5 mag")?;
    check("finder limiting magnitude", finder_limit_mag, -2.0, 20.0, "between -2 and 20")?;
    check("target declination", target.dec_rad, -core::f64::consts::FRAC_PI_2, core::f64::consts::FRAC_PI_2, "between -90° and 90° (in radians)")?;
    check("target right ascension", target.ra_rad, -1e3, 1e3, "a finite angle in radians")?;
    let s0 = stars[start];
    if !(s0.ra_rad.is_finite() && s0.dec_rad.is_finite()) {
        return Err(FindError::OutOfRange { field: "starting star position", value: s0.ra_rad, allowed: "finite" });
    }
    let hop = max_hop_rad(finder, rules);
    let star_limit = finder_limit_mag - rules.visibility_margin_mag;
    let d = sep_rad(s0.pos(), target);
    if !(d <= MAX_ROUTE_RAD) {
        return Err(FindError::OutOfRange {
            field: "distance from the starting star to the target (degrees)",
            value: d.to_degrees(),
            allowed: "at most 60°: start from a bright star nearer the target",
        });
    }
    let mut last_err = None;
    let widths = corridor_widths(d, hop);
    for (wi, &w) in widths.iter().enumerate() {
        match search(stars, start, target, hop, star_limit, d, w, rules) {
            Ok((nodes, path, cost)) => {
                // Certify the route against stars outside the corridor: a route with fewer hops
                // is at most (k − 1)·hop long, one with as many hops and a lower cost is shorter
                // than this cost, and every landing point of a route of length L lies in the
                // ellipse sep(p, start) + sep(p, target) ≤ L (triangle inequality). If that
                // ellipse fits the corridor (sum ≤ d + 2w), nothing outside can beat it.
                let hops = path.len().saturating_sub(1) as f64;
                let need = ((hops - 1.0) * hop).max(cost);
                if need <= d + 2.0 * w {
                    return Ok(describe(cost, stars, &nodes, &path, start_label, target_label, finder, hop, star_limit, up, name_of));
                }
                if wi + 1 == widths.len() {
                    // Widest corridor and still not certified: one search over exactly the ellipse
                    // that holds every better route (wider only finds an equal or better one).
                    let w_exact = ((need - d) / 2.0).min(core::f64::consts::PI);
                    let (nodes, path, cost) = search(stars, start, target, hop, star_limit, d, w_exact, rules)?;
                    return Ok(describe(cost, stars, &nodes, &path, start_label, target_label, finder, hop, star_limit, up, name_of));
                }
            }
            Err(e) => last_err = Some(e),
        }
    }
    Err(last_err.unwrap_or(FindError::NoRoute { reason: "no stars".into() }))
}

/// Node list: node 0 = start, node n-1 = target, others = star indices.
struct Nodes {
    star_of: Vec<Option<u32>>,
    pos: Vec<Equatorial>,
}

#[allow(clippy::too_many_arguments)]
fn search(stars: &[HopStar], start: usize, target: Equatorial, hop: f64, star_limit: f64, d: f64, w: f64, rules: &HopRules) -> Result<(Nodes, Vec<u32>, f64), FindError> {
    let s0 = stars[start].pos();
    let mut star_of = vec![Some(start as u32)];
    let mut pos = vec![s0];
    // Cheap cuts first (declination band, then one dot product against the
    // enclosing cone), the exact corridor test last.
    let mid = offset_by(s0, pa_rad(s0, target), d / 2.0);
    let cone = (d / 2.0 + w).min(core::f64::consts::PI);
    let (mid_v, cos_cone) = (unit(mid), libm::cos(cone));
    for (i, s) in stars.iter().enumerate() {
        if i == start || !((s.vmag as f64) <= star_limit) || !s.ra_rad.is_finite() || !s.dec_rad.is_finite() {
            continue;
        }
        if (s.dec_rad - mid.dec_rad).abs() > cone {
            continue;
        }
        let p = s.pos();
        if unit(p).dot(mid_v) < cos_cone {
            continue;
        }
        if sep_rad(p, s0) + sep_rad(p, target) <= d + 2.0 * w {
            star_of.push(Some(i as u32));
            pos.push(p);
        }
    }
    star_of.push(None);
    pos.push(target);
    let n = pos.len();
    let vs: Vec<DVec3> = pos.iter().map(|p| unit(*p)).collect();
    let penalty: Vec<f64> = star_of
        .iter()
        .enumerate()
        .map(|(k, s)| match s {
            Some(i) if k > 0 => landing_penalty_rad(stars[*i as usize].vmag as f64, star_limit, hop, rules),
            _ => 0.0,
        })
        .collect();
    let cos_hop = libm::cos(hop);
    let grid = Grid::new(&vs, 2.0 * libm::sin(hop / 2.0) * 1.000001);
    let mut best: Vec<(u32, f64)> = vec![(u32::MAX, f64::INFINITY); n];
    let mut prev: Vec<u32> = vec![u32::MAX; n];
    let mut heap = BinaryHeap::new();
    best[0] = (0, 0.0);
    heap.push(Cost { hops: 0, len: 0.0, node: 0 });
    let goal = (n - 1) as u32;
    while let Some(Cost { hops, len, node }) = heap.pop() {
        let cur = best[node as usize];
        if (hops, len) != cur {
            continue;
        }
        if node == goal {
            break;
        }
        let v = vs[node as usize];
        grid.near(v, |j| {
            if j == node {
                return;
            }
            let dot = v.dot(vs[j as usize]);
            if dot < cos_hop {
                return;
            }
            let step = libm::atan2(v.cross(vs[j as usize]).length(), dot);
            let c = (hops + 1, len + step + penalty[j as usize]);
            let b = best[j as usize];
            if c.0 < b.0 || (c.0 == b.0 && c.1 < b.1) {
                best[j as usize] = c;
                prev[j as usize] = node;
                heap.push(Cost { hops: c.0, len: c.1, node: j });
            }
        });
    }
    if best[n - 1].0 == u32::MAX {
        return Err(FindError::NoRoute {
            reason: format!(
                "between the start and the target there is a gap wider than {:.1}° without a star brighter than mag {:.1}; choose a wider finder, another starting star, or a darker sky",
                hop.to_degrees(),
                star_limit
            ),
        });
    }
    let mut path = vec![goal];
    let mut at = goal;
    while at != 0 {
        at = prev[at as usize];
        path.push(at);
    }
    path.reverse();
    let cost = best[n - 1].1;
    Ok((Nodes { star_of, pos }, path, cost))
}

fn fraction_words(f: f64) -> &'static str {
    if f < 0.15 {
        "a small step"
    } else if f < 0.29 {
        "a quarter of a field"
    } else if f < 0.375 {
        "a third of a field"
    } else {
        "nearly half a field"
    }
}

fn up_words(rel_ccw_deg: f64, up: UpReference) -> &'static str {
    let idx = (libm::floor(rel_ccw_deg / 45.0 + 0.5) as i64).rem_euclid(8) as usize;
    match up {
        UpReference::Zenith { .. } => [
            "up toward the zenith",
            "up and to the left",
            "to the left, along the horizon",
            "down and to the left",
            "down toward the horizon",
            "down and to the right",
            "to the right, along the horizon",
            "up and to the right",
        ][idx],
        UpReference::North => [
            "north",
            "north-east",
            "east",
            "south-east",
            "south",
            "south-west",
            "west",
            "north-west",
        ][idx],
    }
}

fn arc_words(rad: f64) -> String {
    let deg = rad.to_degrees();
    if deg < 1.0 {
        format!("{}′", libm::round(deg * 60.0) as i64)
    } else {
        format!("{deg:.1}°")
    }
}

/// What a star looks like among its visible neighbours.
fn landing_words(stars: &[HopStar], nodes: &Nodes, grid: &Grid, vs: &[DVec3], node: usize, hop: f64) -> String {
    let Some(si) = nodes.star_of[node] else { return String::new() };
    let me = stars[si as usize];
    let v = vs[node];
    let pair_rad = 0.12 * hop;
    let mut pair: Option<(u32, f64)> = None;
    let mut brightest = true;
    grid.near(v, |j| {
        let j = j as usize;
        if j == node {
            return;
        }
        let Some(sj) = nodes.star_of[j] else { return };
        let o = stars[sj as usize];
        let dsep = libm::atan2(v.cross(vs[j]).length(), v.dot(vs[j]));
        if dsep > hop {
            return;
        }
        if o.vmag < me.vmag {
            brightest = false;
        }
        if dsep <= pair_rad && (o.vmag - me.vmag).abs() <= 0.5 && pair.is_none_or(|p| dsep < p.1) {
            pair = Some((sj, dsep));
        }
    });
    if let Some((sj, dsep)) = pair {
        let o = stars[sj as usize];
        let (a, b) = if me.vmag <= o.vmag { (me.vmag, o.vmag) } else { (o.vmag, me.vmag) };
        return format!("a pair of nearly equal stars (mag {a:.1} and {b:.1}, {} apart)", arc_words(dsep));
    }
    if brightest {
        format!("the brightest star around (mag {:.1})", me.vmag)
    } else {
        format!("a mag {:.1} star", me.vmag)
    }
}

#[allow(clippy::too_many_arguments)]
fn describe(cost_rad: f64, stars: &[HopStar], nodes: &Nodes, path: &[u32], start_label: &str, target_label: &str, finder: &Finder, hop: f64, star_limit: f64, up: UpReference, name_of: &dyn Fn(u32) -> Option<String>) -> Route {
    let vs: Vec<DVec3> = nodes.pos.iter().map(|p| unit(*p)).collect();
    let grid = Grid::new(&vs, 2.0 * libm::sin(hop / 2.0) * 1.000001);
    let last = path.len() - 1;
    let mut points = Vec::with_capacity(path.len());
    for (k, &n) in path.iter().enumerate() {
        let n = n as usize;
        let star = nodes.star_of[n].map(|i| stars[i as usize]);
        let label = if k == 0 {
            start_label.to_string()
        } else if k == last {
            target_label.to_string()
        } else {
            star.and_then(|s| name_of(s.id)).unwrap_or_else(|| format!("{}", k))
        };
        points.push(RoutePoint { pos: nodes.pos[n], vmag: star.map(|s| s.vmag), star_id: star.map(|s| s.id), label });
    }
    let diameter = 2.0 * finder.field_radius_rad();
    let mut steps = Vec::with_capacity(last);
    let mut total = 0.0;
    for k in 0..last {
        let (a, b) = (nodes.pos[path[k] as usize], nodes.pos[path[k + 1] as usize]);
        let len = sep_rad(a, b);
        total += len;
        let up_pa = match up {
            UpReference::Zenith { zenith } => pa_rad(a, zenith),
            UpReference::North => 0.0,
        };
        let rel = wrap_2pi(pa_rad(a, b) - up_pa).to_degrees();
        let words = up_words(rel, up);
        let lands_on = if k + 1 == last {
            format!("{target_label}, which should now sit in the main telescope's field")
        } else {
            let w = landing_words(stars, nodes, &grid, &vs, path[k + 1] as usize, hop);
            match nodes.star_of[path[k + 1] as usize].and_then(|i| name_of(stars[i as usize].id)) {
                Some(name) => format!("{name}, {w}"),
                None => w,
            }
        };
        let from = if k == 0 {
            start_label.to_string()
        } else {
            match nodes.star_of[path[k] as usize].and_then(|i| name_of(stars[i as usize].id)) {
                Some(name) => name,
                None => format!("star {k}"),
            }
        };
        let sentence = format!(
            "Step {}: from {from}, move {} ({}) {words} to {lands_on}.",
            k + 1,
            fraction_words(len / diameter),
            arc_words(len)
        );
        steps.push(HopStep {
            from: k,
            to: k + 1,
            length_rad: len,
            length_fields: len / diameter,
            direction_from_up_deg: rel,
            direction_words: words,
            lands_on,
            sentence,
        });
    }
    Route {
        legs: legs(&points, &steps, diameter),
        points,
        steps,
        hop_count: last,
        total_rad: total,
        max_hop_rad: hop,
        star_limit_mag: star_limit,
        cost_rad,
        stars_considered: nodes.pos.len().saturating_sub(2),
        method: METHOD,
    }
}

#[cfg(test)]
mod tests {
    use super::{key, Grid};
    use glam::DVec3;

    /// `Grid::near` visits exactly the points whose cell is within one step on every
    /// axis, cell by cell (dx, then dy, then dz), each cell's points in ascending number:
    /// the order the bucket map it replaced gave.
    #[test]
    fn grid_near_visits_neighbouring_cells_in_order() {
        let mut seed = 0x2545_f491_4f6c_dd1du64;
        let mut rnd = || {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 11) as f64 / (1u64 << 53) as f64 * 2.0 - 1.0
        };
        for &cell in &[0.05, 0.3, 1.0, 3.0] {
            let vs: Vec<DVec3> = (0..400).map(|_| DVec3::new(rnd(), rnd(), rnd()).normalize_or(DVec3::X)).collect();
            let grid = Grid::new(&vs, cell);
            for probe in vs.iter().take(60) {
                let mut got = Vec::new();
                grid.near(*probe, |i| got.push(i));
                let (x, y, z) = key(*probe, cell);
                let mut want = Vec::new();
                for dx in -1..=1 {
                    for dy in -1..=1 {
                        for dz in -1..=1 {
                            let k = (x + dx, y + dy, z + dz);
                            want.extend((0..vs.len() as u32).filter(|&i| key(vs[i as usize], cell) == k));
                        }
                    }
                }
                assert_eq!(got, want, "cell {cell}");
                assert!(!got.is_empty(), "a point's own cell holds it");
            }
        }
    }
}
