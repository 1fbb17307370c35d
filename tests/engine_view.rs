//! The engine end to end, natively: real catalog files, a scenario, a frame.
use nightfield::engine::Engine;
use nightfield::scenario::Scenario;

fn engine() -> Engine {
    let mut e = Engine::new();
    for f in ["stars_bright.nfs", "stars_hip.nfs", "stars_gaia.nfs", "dso_openngc.nfd", "ephemeris.bin"] {
        let bytes = std::fs::read(format!("{}/catalog/{f}", env!("CARGO_MANIFEST_DIR"))).unwrap();
        e.load_catalog(f, &bytes).unwrap();
    }
    e
}

fn scenario(target: &str, train: &str, time: &str) -> Scenario {
    let json = format!(
        r#"{{"version":1,"site":{{"name":"Hollow Meadow field (demo)","lat_deg":47.05,"lon_deg":8.3,"elev_m":560,"tz":"Europe/Zurich"}},
        "time_utc":"{time}","train":{train},"target":"{target}","view":{{"labels":true}}}}"#
    );
    Scenario::from_json(&json).unwrap()
}

const REFRACTOR_DIAGONAL: &str = r#"{"instrument":{"kind":"telescope","design":{"type":"refractor"},"aperture_mm":80,"focal_length_mm":600},
 "accessories":[{"kind":"star_diagonal","prism":"mirror90"},{"kind":"eyepiece","focal_length_mm":25,"apparent_field_deg":52}],"mount":{"kind":"alt_az"}}"#;

fn write_png(name: &str, w: u32, h: u32, rgba: &[u8]) {
    let dir = format!("{}/tests/out", env!("CARGO_MANIFEST_DIR"));
    std::fs::create_dir_all(&dir).unwrap();
    let file = std::fs::File::create(format!("{dir}/{name}.png")).unwrap();
    let mut enc = png::Encoder::new(std::io::BufWriter::new(file), w, h);
    enc.set_color(png::ColorType::Rgba);
    enc.set_depth(png::BitDepth::Eight);
    enc.write_header().unwrap().write_image_data(rgba).unwrap();
}

#[test]
fn pleiades_through_a_refractor_with_a_diagonal() {
    let mut e = engine();
    let fig = e.set_scenario(scenario("M45", REFRACTOR_DIAGONAL, "2026-12-12T21:00:00Z")).unwrap();
    // 600 mm / 25 mm = 24× (common practice: magnification = F / f).
    assert!((fig.magnification.unwrap() - 24.0).abs() < 1e-9);
    // 52° / 24 ≈ 2.17° (apparent field ÷ magnification).
    assert!((fig.true_field_deg - 52.0 / 24.0).abs() < 0.01, "{}", fig.true_field_deg);
    assert!(fig.mirrored, "a mirror diagonal mirrors the view");
    assert!(fig.alt_deg > 40.0, "M45 is high in a December evening at 47° N: {}", fig.alt_deg);
    assert!(fig.stars_drawn > 50, "stars drawn: {}", fig.stars_drawn);
    let info = e.render(512, 512, 1.0).unwrap();
    assert_eq!(info.len, 512 * 512 * 4);
    let lit = e.pixels().chunks(4).filter(|p| p[0] > 80 || p[1] > 80 || p[2] > 80).count();
    assert!(lit > 200, "lit pixels: {lit}");
    write_png("engine_m45", 512, 512, e.pixels());
}

#[test]
fn jupiter_and_the_moon_render() {
    let mut e = engine();
    let fig = e.set_scenario(scenario("Jupiter", REFRACTOR_DIAGONAL, "2026-12-12T23:00:00Z")).unwrap();
    assert_eq!(fig.target_name, "Jupiter");
    e.render(512, 512, 2.0).unwrap();
    write_png("engine_jupiter", 512, 512, e.pixels());
}

#[test]
fn bad_inputs_give_plain_errors() {
    let mut e = engine();
    let mut s = scenario("M45", REFRACTOR_DIAGONAL, "2026-12-12T21:00:00Z");
    s.site.lat_deg = 91.0;
    let msg = e.set_scenario(s).unwrap_err().to_string();
    assert!(msg.contains("latitude"), "{msg}");
    let msg = e.set_scenario(scenario("Planet Nine", REFRACTOR_DIAGONAL, "2026-12-12T21:00:00Z")).unwrap_err().to_string();
    assert!(msg.to_lowercase().contains("planet nine"), "{msg}");
    assert!(Scenario::from_json(r#"{"version":99}"#).unwrap_err().to_string().contains("newer"));
    assert!(e.decode_link("garbage!!").is_err());
    assert!(e.load_catalog("stars_hip.nfs", b"NFS1 truncated").is_err());
}

#[test]
fn share_link_round_trip() {
    let e = engine();
    let s = scenario("M42", REFRACTOR_DIAGONAL, "2026-12-12T22:00:00Z");
    let link = e.encode_link(&s).unwrap();
    assert!(link.len() < 1200, "link length {}", link.len());
    assert_eq!(e.decode_link(&link).unwrap(), s);
}

#[test]
fn jupiter_is_in_its_own_scene() {
    let mut e = engine();
    e.set_scenario(scenario("Jupiter", REFRACTOR_DIAGONAL, "2026-12-12T23:00:00Z")).unwrap();
    let c = e.composed().unwrap();
    let looks: Vec<_> = c.scene.bodies.iter().map(|b| (b.look, b.offset)).collect();
    assert!(c.scene.bodies.iter().any(|b| b.look == nightfield::scene::BodyLook::Jupiter), "{looks:?}");
    // Jupiter and four moons.
    assert_eq!(c.scene.bodies.iter().filter(|b| b.look == nightfield::scene::BodyLook::Satellite).count(), 4);
}

#[test]
fn night_plan_for_the_demo_kit() {
    use nightfield::engine::night::PlanRequest;
    let e = engine();
    let s = scenario("M45", REFRACTOR_DIAGONAL, "2026-12-12T18:00:00Z");
    let req = PlanRequest::from_json(&serde_json::json!({
        "scenario": s, "start_utc": "2026-12-12T18:00:00Z", "end_utc": "2026-12-12T22:00:00Z", "utc_offset_min": 60
    }).to_string()).unwrap();
    let plan = e.plan_night(&req).unwrap();
    let v = serde_json::to_value(&plan).unwrap();
    let targets = v["targets"].as_array().map(|a| a.len()).unwrap_or(0);
    assert!(targets > 50, "candidates planned: {targets}");
    // A bare scenario is accepted too (four hours from its time).
    let bare = PlanRequest::from_json(&serde_json::to_string(&s).unwrap()).unwrap();
    assert!(e.plan_night(&bare).is_ok());
    // A window that ends before it starts is refused in words.
    let bad = PlanRequest::from_json(&serde_json::json!({"scenario": s, "start_utc": "2026-12-12T22:00:00Z", "end_utc": "2026-12-12T18:00:00Z"}).to_string()).unwrap();
    assert!(e.plan_night(&bad).unwrap_err().to_string().contains("end after it starts"));
}

#[test]
fn demo_and_comparison_scenarios_are_valid() {
    let mut e = engine();
    let f = e.set_scenario(nightfield::scenario::demo_scenario()).unwrap();
    assert!(f.target_name.starts_with("M 45"), "{}", f.target_name);
    for (name, json) in nightfield::scenario::comparison_scenarios() {
        e.set_scenario_json(&json).unwrap_or_else(|err| panic!("{name}: {err}"));
    }
}

#[test]
fn find_card_for_m13_from_the_demo_site() {
    let mut e = engine();
    e.set_scenario(scenario("M13", REFRACTOR_DIAGONAL, "2026-06-20T21:30:00Z")).unwrap();
    let card = e.find_card(None).unwrap();
    let v = serde_json::to_value(&card).unwrap();
    // A June night at 47° N: M13 is high; the words must name a direction.
    let words = v["pointing"].to_string().to_lowercase();
    assert!(["north", "south", "east", "west", "overhead"].iter().any(|w| words.contains(w)), "{words}");
    if let Some(route) = card.route.as_ref() {
        assert!(route.hop_count >= 1);
    } else {
        assert!(card.route_error.is_some());
    }
}

#[test]
fn finder_view_is_inverted_and_rings_the_main_field() {
    let mut e = engine();
    e.set_scenario(scenario("M13", REFRACTOR_DIAGONAL, "2026-06-20T21:30:00Z")).unwrap();
    let main_field = e.figures().unwrap().true_field_deg;
    let f = e.finder_view(None).unwrap();
    // An 8×50 straight-through finder: 6° field (the spec), upside down (no erecting optics).
    assert!((f.true_field_deg - 6.0).abs() < 0.01, "{}", f.true_field_deg);
    assert!(!f.mirrored && f.orientation.starts_with("upside down"), "{}", f.orientation);
    let c = e.composed().unwrap();
    let ring = c.scene.overlays.iter().find_map(|o| match o {
        nightfield::scene::Overlay::Ring { radius_rad, .. } => Some(*radius_rad),
        _ => None,
    });
    assert!((ring.unwrap().to_degrees() * 2.0 - main_field).abs() < 1e-9);
    let r = e.render(512, 512, 1.0).unwrap();
    write_png("engine_finder_m13", 512, 512, e.pixels());
    // The numbered stepping stones the find card's steps name ("star 2") are labelled in the
    // picture, for every one of them that lies inside the finder's field.
    let card = e.find_card(None).unwrap();
    let route = card.route.as_ref().expect("a route to M 13");
    let numbered: Vec<&str> = route.points.iter().skip(1).take(route.points.len().saturating_sub(2)).map(|p| p.label.as_str()).filter(|l| l.chars().all(|ch| ch.is_ascii_digit())).collect();
    let shown: Vec<&str> = r.labels.iter().map(|l| l.text.as_str()).filter(|t| t.chars().all(|ch| ch.is_ascii_digit())).collect();
    assert!(shown.iter().all(|t| numbered.contains(t)), "labels {shown:?} vs route {numbered:?}");
    // The last stepping stone is one hop (less than a finder radius) from the target at the centre.
    if let Some(last) = numbered.last() {
        assert!(shown.contains(last), "the last stepping stone {last} is not labelled: {shown:?}");
    }
}
