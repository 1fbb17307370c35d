//! Deep-sky file: decoded values against OpenNGC's own database (tests/fixtures/gen_catalog.py
//! reads pyongc's ongc.db), Messier coverage, and decoder fuzzing.

use nightfield::sky::catalog::CatalogError;
use nightfield::sky::dso::{decode_dso, DsoKind};
use proptest::prelude::*;

static DSO: &[u8] = include_bytes!("../catalog/dso_openngc.nfd");

fn fixture() -> serde_json::Value {
    serde_json::from_str(include_str!("fixtures/catalog.json")).unwrap()
}

#[test]
fn objects_match_openngc() {
    let cat = decode_dso(DSO).unwrap();
    let fx = fixture();
    assert_eq!(cat.objects.len() as u64, fx["dso_total_without_dup_nonex"].as_u64().unwrap());
    let opt = |v: &serde_json::Value| v.as_f64();
    for e in fx["dso"].as_array().unwrap() {
        let name = e["name"].as_str().unwrap();
        if e["type"] == "Dup" {
            // A duplicate record is an alias on the object it duplicates.
            let o = cat.objects.iter().find(|o| o.ids.iter().any(|i| i == name)).unwrap();
            assert_ne!(o.ids[0], name);
            continue;
        }
        let o = cat.objects.iter().find(|o| o.ids[0] == name).unwrap();
        let step = 1.5e-9; // fixed-point step, rad
        assert!((o.ra_rad - e["ra_rad"].as_f64().unwrap()).abs() < step, "{name} ra");
        assert!((o.dec_rad - e["dec_rad"].as_f64().unwrap()).abs() < step, "{name} dec");
        for (got, want) in [
            (o.major_arcmin, opt(&e["major_arcmin"])),
            (o.minor_arcmin, opt(&e["minor_arcmin"])),
            (o.pa_deg, opt(&e["pa_deg"])),
            (o.bmag, opt(&e["bmag"])),
            (o.vmag, opt(&e["vmag"])),
            (o.surf_br_mag_arcsec2, opt(&e["surf_br"])),
        ] {
            match (got, want) {
                (None, None) => {}
                (Some(g), Some(w)) => assert!((g as f64 - w).abs() < 0.006, "{name}: {g} vs {w}"),
                other => panic!("{name}: {other:?}"),
            }
        }
        let m: u8 = e["messier"].as_str().unwrap().parse().unwrap_or(0);
        assert_eq!(o.messier, m, "{name}");
        let names: Vec<&str> = e["common_names"].as_str().unwrap().split(',').filter(|s| !s.is_empty()).collect();
        assert_eq!(o.common_names, names, "{name}");
    }
    let m42 = cat.objects.iter().find(|o| o.messier == 42).unwrap();
    assert_eq!(m42.kind, DsoKind::ClusterNebula);
    assert_eq!(m42.designation(), "M 42");
    // Every Messier number but 102 (ambiguous, no OpenNGC record) is present.
    for m in 1..=110u8 {
        assert_eq!(cat.objects.iter().any(|o| o.messier == m), m != 102, "M {m}");
    }
}

#[test]
fn corrupt_dso_files_give_clear_errors() {
    assert!(matches!(decode_dso(&DSO[..40]), Err(CatalogError::Truncated { .. })));
    assert!(matches!(decode_dso(&DSO[..DSO.len() - 3]), Err(CatalogError::Truncated { .. })));
    assert!(matches!(decode_dso(b"NFSTARS\0 not a dso file at all, no no no no no no"), Err(CatalogError::BadMagic { .. })));
    let mut v = DSO.to_vec();
    v[1000] ^= 4;
    assert!(decode_dso(&v).unwrap_err().to_string().contains("damaged"));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]
    #[test]
    fn random_bytes_never_panic(bytes in proptest::collection::vec(any::<u8>(), 0..3000)) {
        let _ = decode_dso(&bytes);
        let mut v = b"NFDSO\0\0\0".to_vec();
        v.extend_from_slice(&bytes);
        let _ = decode_dso(&v);
    }

    #[test]
    fn truncation_and_bit_flips_are_errors(len in 0usize..DSO.len(), pos in 0usize..DSO.len(), bit in 0u8..8) {
        prop_assert!(decode_dso(&DSO[..len]).is_err());
        let mut v = DSO.to_vec();
        v[pos] ^= 1 << bit;
        prop_assert!(decode_dso(&v).is_err());
    }
}
