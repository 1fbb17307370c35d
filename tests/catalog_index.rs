//! Spatial index against a brute-force scan (same predicate), including the poles and
//! the RA 0/2π seam; deep-sky overlap against a brute-force check on the real file.

use std::f64::consts::{FRAC_PI_2, PI, TAU};

use nightfield::sky::catalog::Catalogs;
use nightfield::sky::index::SkyIndex;
use nightfield::sky::Equatorial;
use proptest::prelude::*;

fn sorted(mut v: Vec<u32>) -> Vec<u32> {
    v.sort_unstable();
    v
}

/// Points clustered where indexes go wrong: near the poles, near RA 0, anywhere.
fn point() -> impl Strategy<Value = (f64, f64, f32)> {
    prop_oneof![
        (0.0..TAU, -FRAC_PI_2..FRAC_PI_2, -1.0f32..12.0),
        (0.0..TAU, (FRAC_PI_2 - 0.05)..=FRAC_PI_2, -1.0f32..12.0),
        (0.0..TAU, -FRAC_PI_2..=(-FRAC_PI_2 + 0.05), -1.0f32..12.0),
        (prop_oneof![0.0..0.02, (TAU - 0.02)..TAU], -1.2f64..1.2, -1.0f32..12.0),
    ]
}

fn center() -> impl Strategy<Value = Equatorial> {
    prop_oneof![
        (0.0..TAU, -FRAC_PI_2..=FRAC_PI_2),
        (0.0..TAU, prop_oneof![Just(FRAC_PI_2), Just(-FRAC_PI_2), (FRAC_PI_2 - 0.03)..FRAC_PI_2]),
        (prop_oneof![Just(0.0), 0.0..0.01, (TAU - 0.01)..TAU, Just(TAU)], -1.2f64..1.2),
        (-7.0f64..14.0, -FRAC_PI_2..=FRAC_PI_2), // RA outside 0..2π is normalized
    ]
    .prop_map(|(ra_rad, dec_rad)| Equatorial { ra_rad, dec_rad })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]
    #[test]
    fn cone_matches_brute_force(
        pts in proptest::collection::vec(point(), 0..1500),
        c in center(),
        r in prop_oneof![0.0..0.02, 0.0..0.3, 0.0..PI],
        m in -1.0f32..13.0,
    ) {
        let idx = SkyIndex::from_points(pts.iter().copied());
        prop_assert_eq!(sorted(idx.cone(c, r, m)), idx.cone_scan(c, r, m));
    }
}

#[test]
fn real_deep_tier_cone_matches_scan() {
    let cats = {
        let mut c = Catalogs::new();
        c.load("stars_gaia", include_bytes!("../catalog/stars_gaia.nfs")).unwrap();
        c
    };
    let idx = cats.tier_index(2).unwrap();
    for (ra, dec) in [(83.8f64, -5.4f64), (0.0, 0.0), (359.9, 30.0), (37.95, 89.26), (10.0, -89.9), (266.4, -29.0)] {
        let c = Equatorial { ra_rad: ra.to_radians(), dec_rad: dec.to_radians() };
        for r_deg in [0.05, 0.5, 3.0] {
            let got = sorted(idx.cone(c, f64::to_radians(r_deg), 10.0));
            assert_eq!(got, idx.cone_scan(c, f64::to_radians(r_deg), 10.0), "({ra},{dec}) r {r_deg}");
        }
    }
}

#[test]
fn dso_overlap_matches_brute_force_and_finds_large_objects() {
    let mut cats = Catalogs::new();
    cats.load("catalog/dso_openngc.nfd", include_bytes!("../catalog/dso_openngc.nfd")).unwrap();
    let brute = |c: Equatorial, r: f64| -> Vec<u32> {
        (0..cats.dso_count() as u32)
            .filter(|&i| {
                let o = cats.dso(i).unwrap();
                let d = (c.dec_rad.sin() * o.dec_rad.sin()
                    + c.dec_rad.cos() * o.dec_rad.cos() * (c.ra_rad - o.ra_rad).cos())
                .clamp(-1.0, 1.0)
                .acos();
                d <= r + o.radius_rad() + 1e-12
            })
            .collect()
    };
    // M 31's 178' disk overlaps a 0.2° field 1° from its centre; M 42 a field on it.
    let near_m31 = Equatorial { ra_rad: 0.1864847944729858 + 1.0f64.to_radians() / 0.7203f64.cos(), dec_rad: 0.7203 };
    for (c, r) in [
        (near_m31, 0.1f64.to_radians()),
        (Equatorial { ra_rad: 1.46291, dec_rad: -0.09407 }, 0.25f64.to_radians()),
        (Equatorial { ra_rad: 0.0, dec_rad: FRAC_PI_2 }, 2.0f64.to_radians()),
        (Equatorial { ra_rad: 3.0, dec_rad: 0.3 }, 5.0f64.to_radians()),
    ] {
        let got = cats.dsos_overlapping(c, r);
        let want = brute(c, r);
        // The index uses the same circle test via unit vectors; allow disagreement only
        // within 1e-9 rad of the edge, of which there are none in these fields.
        assert_eq!(got, want);
    }
    let m31 = (0..cats.dso_count() as u32).find(|&i| cats.dso(i).unwrap().messier == 31).unwrap();
    assert!(cats.dsos_overlapping(near_m31, 0.1f64.to_radians()).contains(&m31));
}
