//! Which OpenNGC records the night plan offers as deep-sky sights: Messier objects and
//! bright NGC/IC objects, but not the NGC/IC records that are single or double stars
//! (OpenNGC types "*" and "**"; e.g. NGC 1990 is the naked-eye star Alnilam).
use nightfield::engine::night::PlanRequest;
use nightfield::engine::Engine;
use nightfield::plan::wire::is_deep_sky_candidate;
use nightfield::sky::dso::DsoKind;

fn engine() -> Engine {
    let mut e = Engine::new();
    for f in ["stars_bright.nfs", "dso_openngc.nfd", "ephemeris.bin"] {
        let bytes = std::fs::read(format!("{}/catalog/{f}", env!("CARGO_MANIFEST_DIR"))).unwrap();
        e.load_catalog(f, &bytes).unwrap();
    }
    e
}

#[test]
fn plan_candidates_leave_out_ngc_ic_stars_but_keep_messier() {
    let e = engine();
    let cats = e.catalogs();
    let find = |name: &str| (0..cats.dso_count() as u32).filter_map(|i| cats.dso(i)).find(|d| d.designation() == name).unwrap_or_else(|| panic!("{name} not in the catalogue"));
    // OpenNGC types (from its CSV): NGC 1990, IC 1318, NGC 771 "*"; NGC 2542 "**"; M 40 "**"; NGC 869 "OCl".
    for (name, kind, want) in [
        ("NGC 1990", DsoKind::Star, false),
        ("IC 1318", DsoKind::Star, false),
        ("NGC 771", DsoKind::Star, false),
        ("NGC 2542", DsoKind::DoubleStar, false),
        ("M 40", DsoKind::DoubleStar, true),
        ("NGC 869", DsoKind::OpenCluster, true),
        ("M 42", DsoKind::ClusterNebula, true),
    ] {
        let d = find(name);
        assert_eq!(d.kind, kind, "{name}");
        assert_eq!(is_deep_sky_candidate(d, 8.0), want, "{name}");
    }
    // The brightness limit still applies to the others: NGC 869 is V 3.7.
    assert!(!is_deep_sky_candidate(find("NGC 869"), 3.0));
}

#[test]
fn plan_for_the_demo_has_no_ngc_ic_star_targets() {
    let e = engine();
    let s = nightfield::scenario::demo_scenario();
    let req = PlanRequest::from_json(&serde_json::to_string(&s).unwrap()).unwrap();
    let plan = e.plan_night(&req).unwrap();
    let stars: Vec<&str> = plan.targets.iter().filter(|t| t.kind == nightfield::plan::TargetKind::Star).map(|t| t.id.as_str()).collect();
    assert_eq!(stars, ["M 40"], "star-type targets");
    for gone in ["NGC 1990", "IC 1318", "NGC 771", "NGC 7748"] {
        assert!(!plan.targets.iter().any(|t| t.id == gone), "{gone} is a star, not a deep-sky target");
    }
    // Deep-sky showpieces and the bodies are still there.
    for id in ["M 31", "M 42", "M 45", "NGC 869", "saturn", "moon"] {
        assert!(plan.targets.iter().any(|t| t.id == id), "{id} missing");
    }
}
