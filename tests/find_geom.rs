//! Find-module geometry against ERFA (pyerfa) and skyfield, from the
//! committed fixture tests/fixtures/find.json (script: gen_find.py).
use nightfield::find::geom::*;
use nightfield::find::words::direction_words;
use nightfield::sky::{Equatorial, Horizontal};
use serde_json::Value;

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/find.json")).unwrap();
    serde_json::from_str(&text).unwrap()
}
fn f(v: &Value) -> f64 { v.as_f64().unwrap() }
fn eq2(v: &Value) -> Equatorial { Equatorial { ra_rad: f(&v[0]), dec_rad: f(&v[1]) } }

/// Separation and position angle vs eraSeps / eraPas: within 1e-9 rad.
#[test]
fn separations_and_position_angles_match_erfa() {
    let fx = fixture();
    for p in fx["pairs"].as_array().unwrap() {
        let (a, b) = (eq2(&p["a"]), eq2(&p["b"]));
        assert!((sep_rad(a, b) - f(&p["sep_rad"])).abs() < 1e-9);
        assert!(wrap_pi(pa_rad(a, b) - f(&p["pa_rad"])).abs() < 1e-9);
        // Round trip of the direct problem.
        let back = offset_by(a, pa_rad(a, b), sep_rad(a, b));
        assert!(sep_rad(back, b) < 1e-9);
    }
}

/// Gnomonic offsets vs eraTpxes: within 1e-9.
#[test]
fn tangent_plane_matches_erfa() {
    let fx = fixture();
    for t in fx["tangent"].as_array().unwrap() {
        let (xi, eta) = offset_en_rad(eq2(&t["centre"]), eq2(&t["p"])).unwrap();
        assert!((xi - f(&t["xi"])).abs() < 1e-9 && (eta - f(&t["eta"])).abs() < 1e-9);
    }
}

/// "Up" toward the zenith = position angle of the zenith's place = the
/// parallactic angle of eraHd2pa: within 1e-9 rad.
#[test]
fn zenith_position_angle_is_the_parallactic_angle() {
    let fx = fixture();
    for c in fx["parallactic"].as_array().unwrap() {
        let (ha, dec, phi) = (f(&c["ha"]), f(&c["dec"]), f(&c["phi"]));
        let lst = 1.234;
        let target = Equatorial { ra_rad: lst - ha, dec_rad: dec };
        let q = pa_rad(target, zenith_equatorial(lst, phi));
        assert!(wrap_pi(q - f(&c["q_rad"])).abs() < 1e-9, "ha {ha} dec {dec} phi {phi}");
    }
}

/// The direction from A to B relative to the zenith, taken from apparent
/// RA/Dec of date and the sidereal time (what a star hop uses), agrees with
/// the one taken from skyfield's alt/az (what pointing words use): within 0.05°.
#[test]
fn hop_directions_agree_with_alt_az() {
    let fx = fixture();
    let mut n = 0;
    for s in fx["sky"].as_array().unwrap() {
        let zen = zenith_equatorial(f(&s["last_rad"]), f(&s["lat_rad"]));
        for pair in s["pairs"].as_array().unwrap() {
            let e = |k: usize| Equatorial { ra_rad: f(&pair[k]["ra_rad"]), dec_rad: f(&pair[k]["dec_rad"]) };
            let h = |k: usize| Horizontal { alt_rad: f(&pair[k]["alt_rad"]), az_rad: f(&pair[k]["az_rad"]) };
            let ccw_from_up = wrap_2pi(pa_rad(e(0), e(1)) - pa_rad(e(0), zen)).to_degrees();
            let (cw_from_up, _) = direction_words(h(0), h(1));
            let diff = ((ccw_from_up + cw_from_up) % 360.0 + 360.0) % 360.0;
            let diff = diff.min(360.0 - diff);
            assert!(diff < 0.05, "ccw {ccw_from_up} vs cw {cw_from_up}");
            n += 1;
        }
    }
    assert_eq!(n, 24);
}
