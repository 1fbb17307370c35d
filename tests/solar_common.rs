//! Shared helpers for the solar tests (also built as its own empty test).
#![allow(dead_code)]

use glam::{DMat3, DVec3};
use nightfield::solar::apparent::{apparent_from_site_gcrs, Apparent};
use nightfield::solar::{BodyId, Ephemeris};

pub fn eph() -> Ephemeris {
    Ephemeris::decode(&std::fs::read(concat!(env!("CARGO_MANIFEST_DIR"), "/catalog/ephemeris.bin")).unwrap()).unwrap()
}
pub fn fixture() -> serde_json::Value {
    let s = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/solar.json")).unwrap();
    serde_json::from_str(&s).unwrap()
}
pub fn v3(v: &serde_json::Value) -> DVec3 {
    DVec3::new(v[0].as_f64().unwrap(), v[1].as_f64().unwrap(), v[2].as_f64().unwrap())
}
pub fn f(v: &serde_json::Value) -> f64 {
    v.as_f64().unwrap()
}
pub fn sep_arcsec(ra1: f64, dec1: f64, ra2: f64, dec2: f64) -> f64 {
    let a = DVec3::new(dec1.cos() * ra1.cos(), dec1.cos() * ra1.sin(), dec1.sin());
    let b = DVec3::new(dec2.cos() * ra2.cos(), dec2.cos() * ra2.sin(), dec2.sin());
    a.cross(b).length().atan2(a.dot(b)).to_degrees() * 3600.0
}
/// Skyfield's own frame matrix and site state for a fixture case.
pub fn case_frame(case: &serde_json::Value) -> (f64, DMat3, DVec3, DVec3) {
    let m = &case["npb_matrix"];
    let npb = DMat3::from_cols(v3(&m[0]), v3(&m[1]), v3(&m[2])).transpose();
    (f(&case["tt_jd"]), npb, v3(&case["site_gcrs_m"]), v3(&case["site_gcrs_m_s"]))
}
/// Apparent place of a body for a fixture case, in skyfield's frame.
pub fn case_apparent(e: &Ephemeris, case: &serde_json::Value, b: BodyId) -> Apparent {
    let (tt, npb, r, v) = case_frame(case);
    apparent_from_site_gcrs(e, b, tt, &npb, r, v).unwrap()
}
