//! Spatial index for cone queries: declination zones cut into RA cells of about equal
//! size (zone height chosen for ~16 points per tile), points sorted by magnitude within
//! each tile so a magnitude-limited query stops early.
//!
//! Correct at the poles (a cap that contains a pole takes every cell of the zones it
//! touches) and across RA 0/2π (cell ranges wrap). A point is in the cone when the dot
//! product of unit vectors is ≥ cos(radius): the same predicate as [`SkyIndex::cone_scan`],
//! the full-scan reference, so the two agree exactly.

use core::f64::consts::{FRAC_PI_2, PI, TAU};

use super::catalog::Star;
use super::Equatorial;

/// Slack added to tile ranges so float rounding at tile edges never drops a point.
const EDGE_SLACK_RAD: f64 = 1e-9;
const TARGET_PER_TILE: f64 = 16.0;

/// Unit vector of a direction (ICRS-like axes). libm so native and wasm agree bit for bit.
pub fn unit_vector(ra_rad: f64, dec_rad: f64) -> [f64; 3] {
    let cd = libm::cos(dec_rad);
    [cd * libm::cos(ra_rad), cd * libm::sin(ra_rad), libm::sin(dec_rad)]
}

#[inline]
fn dot(a: &[f64; 3], b: &[f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// An index over points (ra, dec, mag); query results are indices into the input slice.
#[derive(Clone, Debug)]
pub struct SkyIndex {
    zone_h_rad: f64,
    /// Cells per zone.
    cells: Vec<u32>,
    /// First tile number of each zone.
    zone_first: Vec<u32>,
    /// `tile_start[t]..tile_start[t+1]` is tile t's range in `order`.
    tile_start: Vec<u32>,
    /// Point indices, tile by tile, each tile sorted by magnitude (brightest first).
    order: Vec<u32>,
    /// Per point (input order): unit vector and magnitude.
    vec: Vec<[f64; 3]>,
    mag: Vec<f32>,
}

impl SkyIndex {
    /// Index catalog stars by position and V magnitude.
    pub fn build(stars: &[Star]) -> SkyIndex {
        SkyIndex::from_points(stars.iter().map(|s| (s.ra_rad, s.dec_rad, s.vmag)))
    }

    /// Index arbitrary points (ra_rad, dec_rad, mag). NaN magnitudes sort last and never
    /// pass a finite magnitude limit.
    pub fn from_points(points: impl Iterator<Item = (f64, f64, f32)>) -> SkyIndex {
        let mut vec = Vec::new();
        let mut mag = Vec::new();
        let mut radec = Vec::new();
        for (ra, dec, m) in points {
            let ra = crate::math::rem_euclid(ra, TAU);
            let dec = dec.clamp(-FRAC_PI_2, FRAC_PI_2);
            vec.push(unit_vector(ra, dec));
            mag.push(if m.is_nan() { f32::NAN } else { m });
            radec.push((ra, dec));
        }
        let n = vec.len().max(1) as f64;
        // Zone height for ~TARGET_PER_TILE points per tile on average, 0.25° to 15°.
        let h_deg = libm::sqrt(41_253.0 * TARGET_PER_TILE / n).clamp(0.25, 15.0);
        let zones = libm::ceil(180.0 / h_deg) as usize;
        let zone_h_rad = PI / zones as f64;
        let mut cells = Vec::with_capacity(zones);
        let mut zone_first = Vec::with_capacity(zones);
        let mut total = 0u32;
        for z in 0..zones {
            let mid = -FRAC_PI_2 + (z as f64 + 0.5) * zone_h_rad;
            let c = libm::floor(TAU * libm::cos(mid) / zone_h_rad + 0.5).max(1.0) as u32;
            zone_first.push(total);
            cells.push(c);
            total += c;
        }
        let mut idx = SkyIndex { zone_h_rad, cells, zone_first, tile_start: Vec::new(), order: Vec::new(), vec, mag };
        // Counting sort by tile, then magnitude order inside each tile.
        let tiles: Vec<u32> = radec.iter().map(|&(ra, dec)| idx.tile_of(ra, dec)).collect();
        let mut start = vec![0u32; total as usize + 1];
        for &t in &tiles {
            start[t as usize + 1] += 1;
        }
        for t in 0..total as usize {
            start[t + 1] += start[t];
        }
        let mut fill = start.clone();
        let mut order = vec![0u32; tiles.len()];
        for (i, &t) in tiles.iter().enumerate() {
            order[fill[t as usize] as usize] = i as u32;
            fill[t as usize] += 1;
        }
        for t in 0..total as usize {
            let s = &mut order[start[t] as usize..start[t + 1] as usize];
            let m = &idx.mag;
            crate::sort::sort_indices(s, &|a, b| m[a as usize].total_cmp(&m[b as usize]).then(a.cmp(&b)));
        }
        idx.tile_start = start;
        idx.order = order;
        idx
    }

    pub fn len(&self) -> usize {
        self.vec.len()
    }

    pub fn is_empty(&self) -> bool {
        self.vec.is_empty()
    }

    fn zone_of(&self, dec: f64) -> usize {
        let z = libm::floor((dec + FRAC_PI_2) / self.zone_h_rad);
        (z.max(0.0) as usize).min(self.cells.len() - 1)
    }

    fn tile_of(&self, ra: f64, dec: f64) -> u32 {
        let z = self.zone_of(dec);
        let n = self.cells[z];
        let c = (libm::floor(ra / (TAU / n as f64)).max(0.0) as u32).min(n - 1);
        self.zone_first[z] + c
    }

    /// Indices of points within `radius_rad` of `center` with mag ≤ `mag_limit`, in no
    /// particular order. `radius_rad` is clamped to 0…π.
    pub fn cone(&self, center: Equatorial, radius_rad: f64, mag_limit: f32) -> Vec<u32> {
        let mut out = Vec::new();
        self.cone_into(center, radius_rad, mag_limit, &mut out);
        out
    }

    /// As [`SkyIndex::cone`], appending to `out` (no allocation when it has room).
    pub fn cone_into(&self, center: Equatorial, radius_rad: f64, mag_limit: f32, out: &mut Vec<u32>) {
        if self.vec.is_empty() || !radius_rad.is_finite() || !center.ra_rad.is_finite() || !center.dec_rad.is_finite() {
            return;
        }
        let r = radius_rad.clamp(0.0, PI);
        let ra0 = crate::math::rem_euclid(center.ra_rad, TAU);
        let dec0 = center.dec_rad.clamp(-FRAC_PI_2, FRAC_PI_2);
        let c = unit_vector(ra0, dec0);
        let cos_r = libm::cos(r);
        let lo = dec0 - r - EDGE_SLACK_RAD;
        let hi = dec0 + r + EDGE_SLACK_RAD;
        // RA half-width of the cap (exact bound over all its declinations) unless it holds a pole.
        let all_ra = lo <= -FRAC_PI_2 || hi >= FRAC_PI_2 || r >= FRAC_PI_2;
        let half = if all_ra {
            PI
        } else {
            let s = libm::sin(r) / libm::cos(dec0);
            if s >= 1.0 {
                PI
            } else {
                libm::asin(s) + EDGE_SLACK_RAD
            }
        };
        for z in self.zone_of(lo.max(-FRAC_PI_2))..=self.zone_of(hi.min(FRAC_PI_2)) {
            let n = self.cells[z] as i64;
            let w = TAU / n as f64;
            let (c_lo, c_hi) = if half >= PI {
                (0, n - 1)
            } else {
                let a = libm::floor((ra0 - half) / w) as i64;
                let b = libm::floor((ra0 + half) / w) as i64;
                if b - a + 1 >= n {
                    (0, n - 1)
                } else {
                    (a, b)
                }
            };
            for cell in c_lo..=c_hi {
                let t = (self.zone_first[z] as i64 + cell.rem_euclid(n)) as usize;
                for &i in &self.order[self.tile_start[t] as usize..self.tile_start[t + 1] as usize] {
                    let m = self.mag[i as usize];
                    if !(m <= mag_limit) {
                        break; // sorted by magnitude: the rest are fainter (or NaN)
                    }
                    if dot(&self.vec[i as usize], &c) >= cos_r {
                        out.push(i);
                    }
                }
            }
        }
    }

    /// The same query by scanning every point: the reference for tests and the bench.
    pub fn cone_scan(&self, center: Equatorial, radius_rad: f64, mag_limit: f32) -> Vec<u32> {
        if !radius_rad.is_finite() || !center.ra_rad.is_finite() || !center.dec_rad.is_finite() {
            return Vec::new();
        }
        let r = radius_rad.clamp(0.0, PI);
        let c = unit_vector(crate::math::rem_euclid(center.ra_rad, TAU), center.dec_rad.clamp(-FRAC_PI_2, FRAC_PI_2));
        let cos_r = libm::cos(r);
        (0..self.vec.len() as u32)
            .filter(|&i| self.mag[i as usize] <= mag_limit && dot(&self.vec[i as usize], &c) >= cos_r)
            .collect()
    }
}
