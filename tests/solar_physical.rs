//! Physical ephemeris: diameters and illuminated fractions against skyfield +
//! DE421 (tests/fixtures/gen_solar.py); magnitudes against skyfield's
//! Mallama & Hilton 2018 port, PyEphem, and values from memory.

#[path = "solar_common.rs"]
mod common;
use common::*;
use nightfield::solar::physical::phase_angle_rad;
use nightfield::solar::{body_state_from, BodyId};

#[test]
fn diameters_fractions_and_magnitudes_match_references() {
    let e = eph();
    let fx = fixture();
    let (mut worst_d, mut worst_k, mut worst_mh, mut worst_pe) = (0.0f64, 0.0f64, 0.0f64, 0.0f64);
    for case in fx["cases"].as_array().unwrap() {
        let sun = case_apparent(&e, case, BodyId::Sun);
        for b in BodyId::ALL {
            let row = &case["bodies"][b.name()];
            let a = case_apparent(&e, case, b);
            let s = body_state_from(b, &a, &sun);
            // Issue 5 bars: diameter within 0.5 %, fraction within 0.005.
            let dd = (s.diameter_arcsec / f(&row["diameter_arcsec"]) - 1.0).abs();
            assert!(dd < 0.005, "{} diameter {} vs {}", b.name(), s.diameter_arcsec, row["diameter_arcsec"]);
            worst_d = worst_d.max(dd);
            if b == BodyId::Sun {
                continue;
            }
            let dk = (s.illuminated_fraction - f(&row["illuminated_fraction"])).abs();
            assert!(dk < 0.005, "{} fraction {} vs {}", b.name(), s.illuminated_fraction, row["illuminated_fraction"]);
            worst_k = worst_k.max(dk);
            let di = (phase_angle_rad(&a).to_degrees() - f(&row["phase_angle_deg"])).abs();
            assert!(di < 0.05, "{} phase angle", b.name());
            if b == BodyId::Moon {
                continue;
            }
            // skyfield.magnitudelib implements the same Mallama & Hilton 2018
            // equations (Sun at the barycentre there, hence 0.02 mag slack).
            if let Some(m) = row["mag_mallama_hilton"].as_f64() {
                let dm = (s.vmag - m).abs();
                assert!(dm < 0.02, "{} mag {} vs M&H {}", b.name(), s.vmag, m);
                worst_mh = worst_mh.max(dm);
            }
            // PyEphem's older formulas: within 0.3 where they apply (not Mercury or
            // Venus beyond 90° phase angle, not Saturn, whose rings they treat differently).
            let i = s.phase_angle_rad.to_degrees();
            let applies = match b {
                BodyId::Mercury | BodyId::Venus => i < 90.0,
                BodyId::Saturn => false,
                _ => true,
            };
            if applies {
                let dp = (s.vmag - f(&row["pyephem_mag"])).abs();
                assert!(dp < 0.3, "{} mag {} vs PyEphem {} (phase {i:.1}°)", b.name(), s.vmag, row["pyephem_mag"]);
                worst_pe = worst_pe.max(dp);
            }
        }
    }
    println!("worst: diameter {:.5} rel, fraction {worst_k:.6}, M&H {worst_mh:.3} mag, PyEphem {worst_pe:.3} mag", worst_d);
}

#[test]
fn magnitudes_at_well_known_events() {
    // Values from memory (widely reported almanac figures), geocentric:
    // Mars at the 2003-08-28 perihelic opposition −2.9; Jupiter at the
    // 2023-11-03 opposition −2.9; Saturn at the 2003-12-31 opposition, rings
    // open, −0.5; Venus at greatest brilliancy 2020-04-28 −4.7.
    use glam::DVec3;
    use nightfield::sky::frames::npb_matrix;
    use nightfield::solar::apparent::apparent_from_site_gcrs;
    let e = eph();
    let at = |b: BodyId, tt: f64| {
        let npb = npb_matrix(tt);
        let a = apparent_from_site_gcrs(&e, b, tt, &npb, DVec3::ZERO, DVec3::ZERO).unwrap();
        let s = apparent_from_site_gcrs(&e, BodyId::Sun, tt, &npb, DVec3::ZERO, DVec3::ZERO).unwrap();
        body_state_from(b, &a, &s).vmag
    };
    for (b, tt, want) in [
        (BodyId::Mars, 2_452_879.9, -2.9),
        (BodyId::Jupiter, 2_460_252.5, -2.9),
        (BodyId::Saturn, 2_453_005.5, -0.5),
        (BodyId::Venus, 2_458_967.5, -4.7),
    ] {
        let m = at(b, tt);
        assert!((m - want).abs() < 0.15, "{} {m:.2} vs {want}", b.name());
    }
}
