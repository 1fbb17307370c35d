//! Target search over the real files: designations, names, bodies, bad input.
//! Check values: OpenNGC / Hipparcos identities (M 42 = NGC 1976, Vega = HIP 91262,
//! M 45 = Pleiades: common practice), and the IAU names table.

use nightfield::sky::catalog::Catalogs;
use nightfield::sky::search::{resolve, SearchError, TargetRef};

fn all() -> Catalogs {
    let mut c = Catalogs::new();
    c.load("stars_bright", include_bytes!("../catalog/stars_bright.nfs")).unwrap();
    c.load("stars_hip.nfs", include_bytes!("../catalog/stars_hip.nfs")).unwrap();
    c.load("dso_openngc", include_bytes!("../catalog/dso_openngc.nfd")).unwrap();
    c
}

fn dso_id(c: &Catalogs, q: &str) -> String {
    match resolve(q, c) {
        Ok(TargetRef::Dso(i)) => c.dso(i).unwrap().ids[0].clone(),
        other => panic!("{q}: {other:?}"),
    }
}

fn hip(c: &Catalogs, q: &str) -> u32 {
    match resolve(q, c) {
        Ok(TargetRef::Star(i)) => c.star(i).unwrap().0.hip,
        other => panic!("{q}: {other:?}"),
    }
}

#[test]
fn designations_and_names_resolve() {
    let c = all();
    for q in ["M42", "m 42", "M 042", "messier 42", "NGC 1976", "ngc1976", "Orion Nebula", "orion nebula", "Great Orion Nebula"] {
        assert_eq!(dso_id(&c, q), "NGC1976", "{q}");
    }
    assert_eq!(dso_id(&c, "NGC 7000"), "NGC7000");
    assert_eq!(dso_id(&c, "North America Nebula"), "NGC7000");
    assert_eq!(dso_id(&c, "IC434"), "IC0434");
    assert_eq!(dso_id(&c, "ic 434"), "IC0434");
    assert_eq!(dso_id(&c, "M45"), "Mel022");
    assert_eq!(dso_id(&c, "Pleiades"), "Mel022");
    assert_eq!(dso_id(&c, "Mel 22"), "Mel022");
    assert_eq!(dso_id(&c, "M31"), "NGC0224");
    assert_eq!(dso_id(&c, "IC 11"), "NGC0281"); // OpenNGC: IC 11 is a duplicate record of NGC 281
    assert_eq!(hip(&c, "HIP 91262"), 91262);
    assert_eq!(hip(&c, "hip91262"), 91262);
    assert_eq!(hip(&c, "Vega"), 91262);
    assert_eq!(hip(&c, "  VEGA "), 91262);
    assert_eq!(hip(&c, "rigil kentaurus"), 71683);
    assert_eq!(hip(&c, "Herschels Garnet Star"), 107259);
    for (q, b) in [("Jupiter", "jupiter"), ("the Moon", "moon"), ("SUN", "sun"), ("neptune", "neptune")] {
        assert_eq!(resolve(q, &c), Ok(TargetRef::Body(b.into())));
    }
    let (vega, _) = c.star(c.star_by_hip(91262).unwrap()).unwrap();
    assert!((vega.ra_rad.to_degrees() - 279.23).abs() < 0.01); // Vega RA 18h36.9m (common practice)
    assert_eq!(c.star_label(c.star_by_hip(91262).unwrap()), "Vega");
}

#[test]
fn unknown_and_bad_names_get_clear_messages() {
    let c = all();
    match resolve("Vgea", &c) {
        Err(e @ SearchError::Unknown { .. }) => {
            let msg = e.to_string();
            assert!(msg.contains("Vgea") && msg.contains("Vega"), "{msg}");
        }
        other => panic!("{other:?}"),
    }
    match resolve("Orion Nebul", &c) {
        Err(SearchError::Unknown { suggestions, .. }) => assert!(suggestions.iter().any(|s| s == "Orion Nebula")),
        other => panic!("{other:?}"),
    }
    assert!(matches!(resolve("M 111", &c), Err(SearchError::OutOfRange { .. })));
    assert!(matches!(resolve("M 0", &c), Err(SearchError::OutOfRange { .. })));
    assert!(matches!(resolve("M102", &c), Err(SearchError::NoRecord { .. })));
    assert!(matches!(resolve("NGC 9999", &c), Err(SearchError::OutOfRange { .. })));
    assert!(matches!(resolve("HIP 999999", &c), Err(SearchError::OutOfRange { .. })));
    assert!(matches!(resolve("   ", &c), Err(SearchError::Empty)));
    assert!(matches!(resolve("zzqqxx", &c), Err(SearchError::Unknown { .. })));
    assert!(matches!(resolve("M 99999999999999999999999", &c), Err(SearchError::OutOfRange { .. }) | Err(SearchError::Unknown { .. })));
    for q in ["%%%", "ngc", "m", "hip -5", "\u{1F52D}", "NGC 1976 extra"] {
        let r = resolve(q, &c);
        if let Err(e) = r {
            assert!(!e.to_string().is_empty());
        }
    }
}

#[test]
fn progressive_loading_reports_missing_files() {
    let mut c = Catalogs::new();
    assert!(matches!(resolve("M 42", &c), Err(SearchError::NotLoaded { .. })));
    assert!(matches!(resolve("Vega", &c), Err(SearchError::NotLoaded { .. })));
    c.load("stars_bright", include_bytes!("../catalog/stars_bright.nfs")).unwrap();
    assert!(matches!(resolve("Vega", &c), Ok(TargetRef::Star(_))));
    // HIP 1 is V 9.1: in the full tier only.
    assert!(matches!(resolve("HIP 1", &c), Err(SearchError::NotLoaded { .. })));
    assert!(c.load("stars_everything", b"").unwrap_err().to_string().contains("unknown catalog file"));
    assert!(c.load("stars_hip", b"garbage").is_err());
    assert_eq!(c.loaded(), vec!["stars_bright"]);
}

#[test]
fn names_fold_ascii_case_and_keep_other_letters_exactly() {
    use nightfield::sky::names::normalize;
    assert_eq!(normalize("Rigil KENTAURUS"), "rigilkentaurus");
    assert_eq!(normalize("Barnard’s  Galaxy!"), "barnardsgalaxy"); // punctuation, any script, dropped
    assert_eq!(normalize("ÉTOILE 5"), "Étoile5"); // non-ASCII letters compared as written
    // Every shipped name is ASCII, so ASCII folding finds them whatever the case typed.
    for (n, _) in nightfield::sky::names::all() {
        assert!(n.is_ascii(), "{n}");
    }
    let c = all();
    let common: Vec<&String> = (0..).map_while(|i| c.dso(i)).flat_map(|d| &d.common_names).collect();
    assert!(common.len() > 100);
    for n in common {
        assert!(n.is_ascii(), "{n}");
    }
    assert_eq!(hip(&c, "vEgA"), 91262);
    assert_eq!(dso_id(&c, "ngc 224"), dso_id(&c, "M31"));
}

/// Hipparcos look-ups after loads in any order (a tier loaded again replaces its own
/// entries): the star loaded last for a number wins, as a map keyed by number keeps it.
#[test]
fn hip_lookup_follows_the_latest_load() {
    use nightfield::sky::catalog::{star_id, StarCatalog};
    use std::collections::HashMap;
    let files: [(&str, usize, &[u8]); 2] =
        [("stars_bright", 0, include_bytes!("../catalog/stars_bright.nfs")), ("stars_hip", 1, include_bytes!("../catalog/stars_hip.nfs"))];
    for order in [[0usize, 1, 0], [1, 0, 1], [0, 0, 1]] {
        let mut c = Catalogs::new();
        let mut model: HashMap<u32, u32> = HashMap::new();
        for &f in &order {
            let (name, tier, bytes) = files[f];
            c.load(name, bytes).unwrap();
            let cat: &StarCatalog = c.tier(tier).unwrap();
            model.retain(|_, id| nightfield::sky::catalog::split_star_id(*id).0 != tier);
            for (i, s) in cat.stars.iter().enumerate() {
                if s.hip != 0 {
                    model.insert(s.hip, star_id(tier, i as u32));
                }
            }
        }
        assert!(model.len() > 1000, "{order:?}: {} Hipparcos stars", model.len());
        for (&hip, &id) in &model {
            assert_eq!(c.star_by_hip(hip), Some(id), "{order:?}: HIP {hip}");
        }
        for hip in [0, 120_000, 4_000_000_000] {
            assert_eq!(c.star_by_hip(hip), model.get(&hip).copied(), "{order:?}: HIP {hip}");
        }
    }
}
