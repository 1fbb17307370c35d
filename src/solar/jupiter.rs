//! Jupiter's Galilean moons and Great Red Spot.
//!
//! Moon theory: Meeus 1998 ch. 44 lower-accuracy method (mean longitudes and
//! the main resonance/eccentricity terms of Lieske's E5 theory), set in the
//! real geometry: Jupiter's pole from Archinal et al. 2018 and the Earth, Sun
//! and Jupiter positions from the DE421 fits. Offsets in Jupiter equatorial radii.

use super::apparent::Apparent;
use super::geometry::{astrometric, body_barycentric, earth_barycentric, tdb_from_tt};
use super::physical::pole_icrf;
use super::{BodyId, Ephemeris, SolarError};
use glam::DVec3;
use serde::{Deserialize, Serialize};

/// Jupiter's polar/equatorial radius ratio (Archinal et al. 2018: 66854/71492).
const POLAR_RATIO: f64 = 66_854.0 / 71_492.0;
pub const MOON_NAMES: [&str; 4] = ["Io", "Europa", "Ganymede", "Callisto"];

/// Where a moon is as seen from the Earth.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum MoonSituation {
    /// Clear of the disc and lit.
    Clear,
    /// In front of the disc.
    Transit,
    /// Behind the disc (occulted).
    Occulted,
    /// In Jupiter's shadow (eclipsed), not behind the disc.
    Eclipsed,
}

/// One Galilean moon on the sky relative to Jupiter's centre.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MoonOffset {
    /// Offsets in Jupiter equatorial radii, +east and +north (of-date axes).
    pub east: f64,
    pub north: f64,
    /// + toward the observer (in front of Jupiter's centre).
    pub front: f64,
    pub situation: MoonSituation,
    /// In Jupiter's shadow (also when behind the disc).
    pub in_shadow: bool,
    /// Its shadow falls on the visible disc.
    pub shadow_on_disc: bool,
    /// The shadow's offset on the sky (Jupiter radii, east, north) when it is on the disc.
    pub shadow_east: f64,
    pub shadow_north: f64,
}

fn dsin(x: f64) -> f64 {
    libm::sin(x.to_radians())
}
fn dcos(x: f64) -> f64 {
    libm::cos(x.to_radians())
}

/// Meeus 1998 ch. 44 (lower accuracy): moon angles u (deg, 0 = inferior
/// conjunction, increasing westward on the near side) and radii (Jupiter radii);
/// `tdb_jd` is the observation time (light time is taken off inside).
fn meeus_u_r(tdb_jd: f64, delta_au: f64) -> [(f64, f64); 4] {
    let d = tdb_jd - 2_451_545.0;
    let v = 172.74 + 0.001_115_88 * d;
    let m = 357.529 + 0.985_600_3 * d;
    let n = 20.020 + 0.083_085_3 * d + 0.329 * dsin(v);
    let j = 66.115 + 0.902_517_9 * d - 0.329 * dsin(v);
    let a = 1.915 * dsin(m) + 0.020 * dsin(2.0 * m);
    let b = 5.555 * dsin(n) + 0.168 * dsin(2.0 * n);
    let k = j + a - b;
    let rr = 1.000_14 - 0.016_71 * dcos(m) - 0.000_14 * dcos(2.0 * m);
    let r = 5.208_72 - 0.252_08 * dcos(n) - 0.006_11 * dcos(2.0 * n);
    let del = (r * r + rr * rr - 2.0 * r * rr * dcos(k)).sqrt();
    let psi = libm::asin((rr / del * dsin(k)).clamp(-1.0, 1.0)).to_degrees();
    // Light time from our own geometry (Meeus's Δ/173 days).
    let dd = d - delta_au / 173.144_6;
    let pb = psi - b;
    let mut u1 = 163.8069 + 203.405_864_6 * dd + pb;
    let mut u2 = 358.4140 + 101.291_633_5 * dd + pb;
    let mut u3 = 5.7176 + 50.234_518_0 * dd + pb;
    let mut u4 = 224.8092 + 21.487_980_0 * dd + pb;
    let g = 331.18 + 50.310_482 * dd;
    let h = 87.45 + 21.569_231 * dd;
    let (c1, c2) = (2.0 * (u1 - u2), 2.0 * (u2 - u3));
    u1 += 0.473 * dsin(c1);
    u2 += 1.065 * dsin(c2);
    u3 += 0.165 * dsin(g);
    u4 += 0.843 * dsin(h);
    [
        (u1, 5.9057 - 0.0244 * dcos(c1)),
        (u2, 9.3966 - 0.0882 * dcos(c2)),
        (u3, 14.9883 - 0.0216 * dcos(g)),
        (u4, 26.3627 - 0.1939 * dcos(h)),
    ]
}

/// Latitudes above Jupiter's equator (rad): the leading terms of the latitude
/// series of Meeus 1998 ch. 44 (higher accuracy, after Lieske E5), from memory;
/// `lon_obs_deg` is the observer's jovicentric longitude, so L = lon_obs + u.
fn latitudes_rad(tdb_emit: f64, lon_obs_deg: f64, ur: &[(f64, f64); 4]) -> [f64; 4] {
    let t = tdb_emit - 2_443_000.5;
    let w1 = 312.3346 - 0.132_793_86 * t;
    let w2 = 100.4411 - 0.032_630_64 * t;
    let w3 = 119.1942 - 0.007_177_03 * t;
    let w4 = 322.6186 - 0.001_759_34 * t;
    let psi = 316.5182 - 0.000_002_08 * t;
    let l: [f64; 4] = core::array::from_fn(|i| lon_obs_deg + ur[i].0);
    [
        0.000_639_3 * dsin(l[0] - w1) + 0.000_182_5 * dsin(l[0] - w2),
        0.008_100_4 * dsin(l[1] - w2) + 0.000_451_2 * dsin(l[1] - w3) - 0.000_328_4 * dsin(l[1] - psi),
        0.003_240_2 * dsin(l[2] - w3) - 0.001_691_1 * dsin(l[2] - psi) + 0.000_684_7 * dsin(l[2] - w4)
            - 0.000_279_7 * dsin(l[2] - w2),
        -0.007_657_9 * dsin(l[3] - psi) + 0.004_413_4 * dsin(l[3] - w4) - 0.000_511_2 * dsin(l[3] - w3),
    ]
}

/// The Jupiter-centred geometry of one instant, ICRF unit vectors.
struct JupiterFrame {
    to_obs: DVec3,
    to_sun: DVec3,
    pole: DVec3,
    /// Sky basis at Jupiter: east and north of date.
    east: DVec3,
    north: DVec3,
    tdb_emit: f64,
    delta_au: f64,
}

fn frame(eph: &Ephemeris, tt_jd: f64, observer_bary: Option<DVec3>, pole_of_date: DVec3) -> Result<JupiterFrame, SolarError> {
    if !tt_jd.is_finite() {
        return Err(SolarError::NotFinite { field: "tt_jd" });
    }
    let tdb = tdb_from_tt(tt_jd);
    let obs = match observer_bary {
        Some(o) => o,
        None => earth_barycentric(eph, tdb)?.0,
    };
    let (ast, lt) = astrometric(eph, BodyId::Jupiter, tdb, obs)?;
    let (jb, _) = body_barycentric(eph, BodyId::Jupiter, tdb - lt)?;
    let (sb, _) = body_barycentric(eph, BodyId::Sun, tdb - lt)?;
    let d = ast.normalize();
    let east = pole_of_date.cross(d).normalize();
    let north = d.cross(east);
    Ok(JupiterFrame {
        to_obs: -d,
        to_sun: (sb - jb).normalize(),
        pole: pole_icrf(BodyId::Jupiter, tdb - lt).unwrap_or(DVec3::Z),
        east,
        north,
        tdb_emit: tdb - lt,
        delta_au: ast.length(),
    })
}

/// Is a Jupiter-centred point (Jupiter radii) inside the oblate planet's
/// silhouette seen along `axis` (unit vector)? Returns (inside, signed depth along axis).
fn inside_silhouette(p: DVec3, axis: DVec3, pole: DVec3) -> (bool, f64) {
    let depth = p.dot(axis);
    let q = p - axis * depth;
    // Stretch the pole-ward component so the oblate outline becomes a unit circle
    // (projected polar radius from the axis's latitude above the equator).
    let sin_b = pole.dot(axis);
    let b_proj = (1.0 - (1.0 - POLAR_RATIO * POLAR_RATIO) * (1.0 - sin_b * sin_b)).sqrt();
    let pole_sky = (pole - axis * sin_b).normalize_or_zero();
    let qn = q.dot(pole_sky);
    let qe = (q - pole_sky * qn).length();
    (qe * qe + (qn / b_proj).powi(2) < 1.0, depth)
}

fn moons_in_frame(fr: &JupiterFrame) -> [MoonOffset; 4] {
    let ur = meeus_u_r(fr.tdb_emit + fr.delta_au / 173.144_6, fr.delta_au);
    // Equator-plane basis: a toward the observer's projection, b toward the west.
    let a = (fr.to_obs - fr.pole * fr.pole.dot(fr.to_obs)).normalize();
    let b = fr.pole.cross(a);
    let mut out = [MoonOffset {
        east: 0.0,
        north: 0.0,
        front: 0.0,
        situation: MoonSituation::Clear,
        in_shadow: false,
        shadow_on_disc: false,
        shadow_east: 0.0,
        shadow_north: 0.0,
    }; 4];
    // Jovicentric ecliptic (J2000) longitude of the observer: the origin the
    // latitude terms' node longitudes are counted from.
    let eps = 23.439_291_1_f64.to_radians();
    let (ce, se) = (libm::cos(eps), libm::sin(eps));
    let o_ecl = DVec3::new(fr.to_obs.x, ce * fr.to_obs.y + se * fr.to_obs.z, -se * fr.to_obs.y + ce * fr.to_obs.z);
    let lon_obs = libm::atan2(o_ecl.y, o_ecl.x).to_degrees();
    let lats = latitudes_rad(fr.tdb_emit, lon_obs, &ur);
    for ((o, (u, r)), lat) in out.iter_mut().zip(ur).zip(lats) {
        let p = ((a * dcos(u) + b * dsin(u)) * libm::cos(lat) + fr.pole * libm::sin(lat)) * r;
        o.east = p.dot(fr.east);
        o.north = p.dot(fr.north);
        o.front = p.dot(fr.to_obs);
        let (on_disc, depth) = inside_silhouette(p, fr.to_obs, fr.pole);
        let (in_shadow_cyl, sun_depth) = inside_silhouette(p, fr.to_sun, fr.pole);
        o.in_shadow = in_shadow_cyl && sun_depth < 0.0;
        o.situation = if on_disc && depth > 0.0 {
            MoonSituation::Transit
        } else if on_disc {
            MoonSituation::Occulted
        } else if in_shadow_cyl && sun_depth < 0.0 {
            MoonSituation::Eclipsed
        } else {
            MoonSituation::Clear
        };
        // Shadow: the moon's point moved anti-sunward onto the near (sunlit) face.
        if sun_depth > 0.0 {
            let s = fr.to_sun;
            let (pd, pp) = (p.dot(s), p.length_squared());
            let disc = pd * pd - (pp - 1.0);
            if disc > 0.0 {
                let hit = p - s * (pd - disc.sqrt());
                if hit.dot(fr.to_obs) > 0.0 {
                    o.shadow_on_disc = true;
                    o.shadow_east = hit.dot(fr.east);
                    o.shadow_north = hit.dot(fr.north);
                }
            }
        }
    }
    out
}

/// The four Galilean moons seen from the Earth's centre at TT `tt_jd`
/// (offsets from the centre barely depend on the site: < 0.001 radius).
/// `pole_of_date` is the celestial pole of date (ICRF unit vector; `Apparent::pole_of_date`).
pub fn galilean_moons(eph: &Ephemeris, tt_jd: f64, pole_of_date: DVec3) -> Result<[MoonOffset; 4], SolarError> {
    Ok(moons_in_frame(&frame(eph, tt_jd, None, pole_of_date)?))
}

/// As `galilean_moons`, with the frame of an apparent place of Jupiter.
pub fn galilean_moons_for(eph: &Ephemeris, jupiter: &Apparent, tt_jd: f64) -> Result<[MoonOffset; 4], SolarError> {
    galilean_moons(eph, tt_jd, jupiter.pole_of_date())
}

/// Central-meridian longitude in System II (rad, 0..2π): west longitude of the
/// sub-Earth point for W_II = 43.3° + 870.270° d (Explanatory Supplement 1992,
/// from memory), d days of TDB from J2000 at the light-emission time, with
/// Jupiter's IAU pole (Archinal et al. 2018).
pub fn central_meridian_ii_rad(eph: &Ephemeris, tt_jd: f64) -> Result<f64, SolarError> {
    let fr = frame(eph, tt_jd, None, DVec3::Z)?;
    Ok(cm_from_frame(&fr))
}

fn cm_from_frame(fr: &JupiterFrame) -> f64 {
    let d = fr.tdb_emit - 2_451_545.0;
    let w = crate::math::rem_euclid(43.3 + 870.270 * d, 360.0).to_radians();
    // Node of Jupiter's equator on the ICRF equator: Q = ẑ × pole.
    let q = DVec3::Z.cross(fr.pole).normalize();
    let y = fr.pole.cross(q);
    // Longitude (measured with the rotation) of the sub-observer point from Q.
    let lon_from_q = libm::atan2(fr.to_obs.dot(y), fr.to_obs.dot(q));
    // West longitude: the prime meridian sits at W from Q; points at angle x from Q
    // have west longitude W − x.
    crate::math::rem_euclid(w - lon_from_q, 2.0 * core::f64::consts::PI)
}

/// Times (TT Julian dates) in [start, end] when a System II longitude (e.g. the
/// Great Red Spot's, which drifts: the user sets it) crosses the central meridian.
pub fn grs_transits_tt(eph: &Ephemeris, start_tt_jd: f64, end_tt_jd: f64, grs_lon_ii_rad: f64) -> Result<Vec<f64>, SolarError> {
    if !(start_tt_jd.is_finite() && end_tt_jd.is_finite() && grs_lon_ii_rad.is_finite()) {
        return Err(SolarError::NotFinite { field: "night start/end or GRS longitude" });
    }
    let mut out = Vec::new();
    if end_tt_jd < start_tt_jd || end_tt_jd - start_tt_jd > 30.0 {
        return Ok(out);
    }
    // CM II advances ~870.27°/day (one turn per 9 h 55.6 min).
    let rate = 870.27_f64.to_radians();
    let tau = 2.0 * core::f64::consts::PI;
    let behind = |t: f64| -> Result<f64, SolarError> {
        // How far the spot's longitude is ahead of the CM, in (−π, π].
        let cm = central_meridian_ii_rad(eph, t)?;
        let x = crate::math::rem_euclid(grs_lon_ii_rad - cm, tau);
        Ok(if x > core::f64::consts::PI { x - tau } else { x })
    };
    let mut t = start_tt_jd + crate::math::rem_euclid(behind(start_tt_jd)?, tau) / rate;
    while t <= end_tt_jd + 0.5 {
        let mut tt = t;
        for _ in 0..4 {
            tt += behind(tt)? / rate;
        }
        if tt >= start_tt_jd && tt <= end_tt_jd {
            out.push(tt);
        }
        t = tt + tau / rate;
    }
    Ok(out)
}
