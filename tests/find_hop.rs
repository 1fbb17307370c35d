//! Star-hop routes on synthetic star fields (deterministic pseudo-random,
//! invented for the test): every hop fits the finder field, uses only stars
//! brighter than its limit, ends on the target, and is as short (in hops,
//! then length) as an independent brute-force breadth-first search finds.
use nightfield::find::finder::*;
use nightfield::find::geom::{sep_rad, zenith_equatorial};
use nightfield::find::hop::*;
use nightfield::sky::Equatorial;
use proptest::prelude::*;

fn eq(ra_deg: f64, dec_deg: f64) -> Equatorial {
    Equatorial { ra_rad: ra_deg.to_radians(), dec_rad: dec_deg.to_radians() }
}

/// Uniform stars in an RA/Dec box; magnitudes 2..10 (xorshift, fixed seed).
fn field(seed: u64, n: usize, ra0: f64, dec0: f64, size_deg: f64) -> Vec<HopStar> {
    let mut s = seed.max(1);
    let mut rnd = || { s ^= s << 13; s ^= s >> 7; s ^= s << 17; (s >> 11) as f64 / (1u64 << 53) as f64 };
    (0..n)
        .map(|i| {
            let dec = dec0 + (rnd() - 0.5) * size_deg;
            let ra = ra0 + (rnd() - 0.5) * size_deg / dec.to_radians().cos();
            HopStar { ra_rad: ra.to_radians(), dec_rad: dec.to_radians(), vmag: (2.0 + 8.0 * rnd()) as f32, id: i as u32 }
        })
        .collect()
}

fn finder() -> Finder {
    Finder::new(FinderSpec { kind: FinderKind::StraightThrough, aperture_mm: 30.0, magnification: 6.0, true_field_deg: 6.0 }).unwrap()
}

fn check_route(stars: &[HopStar], start: usize, target: Equatorial, f: &Finder, limit: f64, r: &Route) {
    assert_eq!(r.points.first().unwrap().star_id, Some(stars[start].id));
    let end = r.points.last().unwrap().pos;
    assert!(sep_rad(end, target) < 1e-12, "route must end on the target");
    assert_eq!(r.steps.len(), r.hop_count);
    assert_eq!(r.points.len(), r.hop_count + 1);
    for s in &r.steps {
        let a = r.points[s.from].pos;
        let b = r.points[s.to].pos;
        let len = sep_rad(a, b);
        assert!(len <= f.field_radius_rad() * 0.8 + 1e-12, "hop of {}° does not fit", len.to_degrees());
        assert!((len - s.length_rad).abs() < 1e-12);
    }
    for p in &r.points[1..r.points.len() - 1] {
        let m = p.vmag.unwrap() as f64;
        assert!(m < limit && m <= r.star_limit_mag, "star of mag {m} too faint for limit {limit}");
    }
}

/// Independent check: layered relaxation over ALL pairs of the same visible
/// stars (no grid, no corridor): the fewest hops, and among those the least
/// cost, where landing on a star adds 0.1·hop·max(0, V − (limit − 3)).
fn brute(stars: &[HopStar], start: usize, target: Equatorial, hop: f64, star_limit: f64) -> Option<(usize, f64)> {
    let mut pts: Vec<(Equatorial, f64)> = vec![(stars[start].pos(), 0.0)];
    pts.extend(stars.iter().enumerate().filter(|(i, s)| *i != start && (s.vmag as f64) <= star_limit)
        .map(|(_, s)| (s.pos(), 0.1 * hop * ((s.vmag as f64) - (star_limit - 3.0)).max(0.0))));
    pts.push((target, 0.0));
    let n = pts.len();
    let mut cur = vec![f64::INFINITY; n];
    cur[0] = 0.0;
    for k in 1..n {
        let mut next = vec![f64::INFINITY; n];
        for i in 0..n {
            if cur[i].is_finite() {
                for j in 0..n {
                    let d = sep_rad(pts[i].0, pts[j].0);
                    if i != j && d <= hop && cur[i] + d + pts[j].1 < next[j] {
                        next[j] = cur[i] + d + pts[j].1;
                    }
                }
            }
        }
        if next[n - 1].is_finite() {
            return Some((k, next[n - 1]));
        }
        cur = next;
    }
    None
}

#[test]
fn route_is_valid_and_shortest() {
    let stars = field(7, 400, 120.0, 30.0, 16.0);
    let f = finder();
    let limit = f.limiting_mag(6.0, 7.0).unwrap();
    let target = eq(124.0, 34.0);
    let start = choose_start(&stars, eq(117.0, 26.0), 4.0, 10f64.to_radians()).unwrap();
    let rules = HopRules::default();
    let r = plan_route(&stars, start, "the start star", target, "the target", &f, limit, UpReference::North, &rules).unwrap();
    check_route(&stars, start, target, &f, limit, &r);
    let (k, len) = brute(&stars, start, target, r.max_hop_rad, r.star_limit_mag).unwrap();
    assert_eq!(r.hop_count, k);
    assert!((r.cost_rad - len).abs() < 1e-9, "{} vs {}", r.cost_rad, len);
    assert!(r.total_rad <= r.cost_rad + 1e-15);
    assert!(r.steps[0].sentence.starts_with("Step 1: from the start star, move "), "{}", r.steps[0].sentence);
    assert!(r.steps.last().unwrap().lands_on.starts_with("the target"));
}

#[test]
fn direct_hop_and_gap() {
    let f = finder();
    let stars = vec![
        HopStar { ra_rad: 0.0, dec_rad: 0.0, vmag: 1.0, id: 0 },
        HopStar { ra_rad: 0.0, dec_rad: 1f64.to_radians(), vmag: 5.0, id: 1 },
    ];
    let r = plan_route(&stars, 0, "A", eq(0.0, 2.0), "T", &f, 9.0, UpReference::North, &HopRules::default()).unwrap();
    assert_eq!(r.hop_count, 1);
    assert_eq!(r.steps[0].direction_words, "north");
    // 20° with nothing in between: no route, and the message says why.
    let e = plan_route(&stars, 0, "A", eq(0.0, 20.0), "T", &f, 9.0, UpReference::North, &HopRules::default()).unwrap_err();
    assert!(e.to_string().contains("gap wider than 2.4°"), "{e}");
    assert!(plan_route(&stars, 5, "A", eq(0.0, 2.0), "T", &f, 9.0, UpReference::North, &HopRules::default()).is_err());
}

/// Direction words: an observer at the north pole has the zenith at the
/// celestial pole, so "north" is "up toward the zenith" (spherical geometry).
/// East is to the left facing the sky with north up (common practice).
#[test]
fn zenith_words() {
    let f = finder();
    let stars = vec![HopStar { ra_rad: 0.0, dec_rad: 40f64.to_radians(), vmag: 1.0, id: 0 }];
    let up = UpReference::Zenith { zenith: zenith_equatorial(0.3, 90f64.to_radians()) };
    let r = plan_route(&stars, 0, "A", eq(0.0, 42.0), "T", &f, 9.0, up, &HopRules::default()).unwrap();
    assert_eq!(r.steps[0].direction_words, "up toward the zenith");
    let r = plan_route(&stars, 0, "A", eq(2.0, 40.0), "T", &f, 9.0, up, &HopRules::default()).unwrap();
    assert_eq!(r.steps[0].direction_words, "to the left, along the horizon");
    // Observer at latitude 40° at sidereal time 0: the star at the zenith,
    // a target 2° north of it lies toward the northern horizon: "down".
    let up = UpReference::Zenith { zenith: zenith_equatorial(0.0, 40f64.to_radians()) };
    let stars = vec![HopStar { ra_rad: 0.0, dec_rad: 38f64.to_radians(), vmag: 1.0, id: 0 }];
    let r = plan_route(&stars, 0, "A", eq(0.0, 36.0), "T", &f, 9.0, up, &HopRules::default()).unwrap();
    assert_eq!(r.steps[0].direction_words, "down toward the horizon");
}

#[test]
fn pair_of_equal_stars_is_named() {
    let f = finder(); // hop limit 2.4°
    let stars = vec![
        HopStar { ra_rad: 0.0, dec_rad: 0.0, vmag: 1.0, id: 0 },
        HopStar { ra_rad: 0.0, dec_rad: 2.0f64.to_radians(), vmag: 5.0, id: 1 },
        HopStar { ra_rad: 0.2f64.to_radians(), dec_rad: 2.0f64.to_radians(), vmag: 5.2, id: 2 },
    ];
    let r = plan_route(&stars, 0, "A", eq(0.0, 4.2), "T", &f, 9.0, UpReference::North, &HopRules::default()).unwrap();
    assert_eq!(r.hop_count, 2);
    assert!(r.steps[0].lands_on.starts_with("a pair of nearly equal stars (mag 5.0 and 5.2, 12′ apart)"), "{}", r.steps[0].lands_on);
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, .. ProptestConfig::default() })]
    #[test]
    fn random_fields_keep_the_rules(seed in 1u64..1_000_000, ra in 0.0f64..360.0, dec in -70.0f64..70.0,
                                    tra in -5.0f64..5.0, tdec in -5.0f64..5.0, margin in 0.0f64..0.5) {
        let stars = field(seed, 250, ra, dec, 14.0);
        let f = finder();
        let limit = f.limiting_mag(5.5, 7.0).unwrap();
        let target = eq(ra + tra / dec.to_radians().cos(), dec + tdec);
        let rules = HopRules { edge_margin: margin, visibility_margin_mag: 0.5, faintness_penalty: 0.1 };
        let start = choose_start(&stars, eq(ra - 3.0, dec), 5.0, 8f64.to_radians());
        prop_assume!(start.is_some());
        let start = start.unwrap();
        match plan_route(&stars, start, "S", target, "T", &f, limit, UpReference::North, &rules) {
            Ok(r) => {
                prop_assert!(sep_rad(r.points.last().unwrap().pos, target) < 1e-12);
                for s in &r.steps {
                    prop_assert!(s.length_rad <= f.field_radius_rad() * (1.0 - margin) + 1e-12);
                }
                for p in &r.points[1..r.points.len() - 1] {
                    prop_assert!((p.vmag.unwrap() as f64) <= limit - 0.5);
                }
                let (k, len) = brute(&stars, start, target, r.max_hop_rad, r.star_limit_mag).unwrap();
                prop_assert_eq!(r.hop_count, k);
                prop_assert!((r.cost_rad - len).abs() < 1e-9);
            }
            Err(_) => prop_assert!(brute(&stars, start, target, f.field_radius_rad() * (1.0 - margin), limit - 0.5).is_none()),
        }
    }
}

#[test]
fn named_stars_appear_in_the_steps() {
    let f = finder();
    let stars = vec![
        HopStar { ra_rad: 0.0, dec_rad: 0.0, vmag: 1.0, id: 10 },
        HopStar { ra_rad: 0.0, dec_rad: 2.0f64.to_radians(), vmag: 3.0, id: 11 },
    ];
    let name = |id: u32| if id == 11 { Some("Middle".to_string()) } else { None };
    let r = plan_route_named(&stars, 0, "Start", eq(0.0, 4.0), "T", &f, 9.0, UpReference::North, &HopRules::default(), &name).unwrap();
    assert_eq!(r.points[1].label, "Middle");
    assert!(r.steps[0].lands_on.starts_with("Middle, a mag 3.0 star"), "the start (mag 1) is brighter and in the same field: {}", r.steps[0].lands_on);
    assert!(r.steps[1].sentence.starts_with("Step 2: from Middle, move "), "{}", r.steps[1].sentence);
}

/// Legs group consecutive hops with equal direction words and add up to the route.
#[test]
fn legs_group_same_direction_hops() {
    let f = finder(); // hop limit 2.4°
    let stars: Vec<HopStar> = (0..5)
        .map(|k| HopStar { ra_rad: 0.0, dec_rad: (2.0 * k as f64).to_radians(), vmag: if k == 0 { 1.0 } else { 5.0 }, id: k })
        .chain(std::iter::once(HopStar { ra_rad: 2.0f64.to_radians(), dec_rad: 8.0f64.to_radians(), vmag: 5.0, id: 9 }))
        .collect();
    let r = plan_route(&stars, 0, "Start", eq(4.0, 8.0), "T", &f, 9.0, UpReference::North, &HopRules::default()).unwrap();
    assert_eq!(r.hop_count, 6);
    assert_eq!(r.legs.len(), 2, "{:#?}", r.legs);
    assert_eq!(r.legs[0].direction_words, "north");
    assert_eq!((r.legs[0].first_step, r.legs[0].last_step), (0, 3));
    assert!(r.legs[1].direction_words.contains("east"));
    let sum: f64 = r.legs.iter().map(|l| l.length_rad).sum();
    assert!((sum - r.total_rad).abs() < 1e-12);
    assert!(r.legs[0].sentence.starts_with("From Start, go about 1.3 fields (8.0°) north in four hops, to "), "{}", r.legs[0].sentence);
}

#[test]
fn far_targets_are_refused_plainly() {
    let stars = vec![HopStar { ra_rad: 0.0, dec_rad: 0.0, vmag: 1.0, id: 0 }];
    let e = plan_route(&stars, 0, "A", eq(0.0, 70.0), "T", &finder(), 9.0, UpReference::North, &HopRules::default()).unwrap_err();
    assert!(e.to_string().contains("at most 60°"), "{e}");
}

#[test]
fn finder_spec_json_round_trip() {
    let spec = FinderSpec { kind: FinderKind::ReflexSight { ring_radii_deg: vec![0.5, 2.0, 4.0] }, aperture_mm: 0.0, magnification: 1.0, true_field_deg: 20.0 };
    let json = serde_json::to_string(&spec).unwrap();
    assert_eq!(json, r#"{"kind":{"type":"reflex_sight","ring_radii_deg":[0.5,2.0,4.0]},"aperture_mm":0.0,"magnification":1.0,"true_field_deg":20.0}"#);
    let back: FinderSpec = serde_json::from_str(&json).unwrap();
    assert_eq!(back, spec);
    let ra: FinderSpec = serde_json::from_str(r#"{"kind":{"type":"right_angle","prism":"mirror"},"aperture_mm":50,"magnification":9,"true_field_deg":5}"#).unwrap();
    assert_eq!(ra.kind, FinderKind::RightAngle { prism: PrismKind::Mirror });
}

fn any_f64() -> impl Strategy<Value = f64> {
    prop_oneof![Just(f64::NAN), Just(f64::INFINITY), Just(-f64::INFINITY), Just(0.0), -1e6f64..1e6, -7.0f64..7.0]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 200, .. ProptestConfig::default() })]
    /// Whatever a link or form feeds in, the find functions answer or refuse; they never panic.
    #[test]
    fn garbage_never_panics(vals in proptest::collection::vec(any_f64(), 12), n in 1usize..20, start in 0usize..25) {
        let kinds = [FinderKind::StraightThrough, FinderKind::Binoculars, FinderKind::ReflexSight { ring_radii_deg: vec![vals[0], vals[1]] }];
        for kind in kinds {
            if let Ok(f) = Finder::new(FinderSpec { kind, aperture_mm: vals[2], magnification: vals[3], true_field_deg: vals[4] }) {
                let _ = f.limiting_mag(vals[5], vals[6]);
                let _ = f.main_field_marker(vals[7], (vals[8], vals[9]), vals[10]);
                let _ = f.view(vals[10], vals[7], (vals[8], vals[9]), vals[5]);
                let stars: Vec<HopStar> = (0..n).map(|i| HopStar { ra_rad: vals[i % 12] * 1e-3 * i as f64, dec_rad: vals[(i + 3) % 12] * 1e-3, vmag: vals[(i + 5) % 12] as f32, id: i as u32 }).collect();
                let rules = HopRules { edge_margin: vals[11].abs().min(2.0), visibility_margin_mag: 0.5, faintness_penalty: 0.1 };
                let _ = plan_route(&stars, start, "S", eq(vals[0] * 1e-3, vals[1] * 1e-3), "T", &f, vals[5], UpReference::North, &rules);
            }
        }
        let hz = nightfield::sky::Horizontal { alt_rad: vals[0], az_rad: vals[1] };
        let _ = nightfield::find::words::pointing_words(hz, &[], Default::default());
        let _ = nightfield::find::words::hand_measure_words(vals[2]);
        let _ = nightfield::find::circles::dial_readings(hz, nightfield::find::circles::AzimuthReference::ReferenceStar { star: hz, dial_deg: vals[3] }, nightfield::find::circles::DialSense::Clockwise, vals[4]);
    }
}
