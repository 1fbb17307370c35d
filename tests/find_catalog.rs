//! Star hops over the real catalogs (Hipparcos bright + faint tiers and the
//! Gaia DR3 tier, as built in catalog/). Start stars are found by IAU name
//! (catalog/names_iau.tsv, from skyfield's named_star_dict); target places
//! are J2000 values from memory (M3 13h42m11.6s +28°22′38″, M13 16h41m41.2s
//! +36°27′35″): the checks are the route rules, which do not depend on them.
use nightfield::find::bench::{bench_finder, bench_route_search, BENCH_TARGET};
use nightfield::find::finder::*;
use nightfield::find::geom::sep_rad;
use nightfield::find::hop::*;
use nightfield::find::sources::{find_hip, hop_stars};
use nightfield::sky::catalog::decode_stars;
use nightfield::sky::Equatorial;
use std::sync::OnceLock;

static BRIGHT: &[u8] = include_bytes!("../catalog/stars_bright.nfs");
static HIP: &[u8] = include_bytes!("../catalog/stars_hip.nfs");
static GAIA: &[u8] = include_bytes!("../catalog/stars_gaia.nfs");
static NAMES: &str = include_str!("../catalog/names_iau.tsv");

fn deep() -> &'static Vec<HopStar> {
    static S: OnceLock<Vec<HopStar>> = OnceLock::new();
    S.get_or_init(|| {
        let cats = [decode_stars(BRIGHT).unwrap(), decode_stars(HIP).unwrap(), decode_stars(GAIA).unwrap()];
        hop_stars(&[&cats[0], &cats[1], &cats[2]])
    })
}

fn hip_of(name: &str) -> u32 {
    NAMES.lines().find_map(|l| {
        let mut it = l.split('\t');
        (it.next() == Some(name)).then(|| it.next().unwrap().trim().parse().unwrap())
    }).unwrap()
}
fn name_of(id: u32) -> Option<String> {
    NAMES.lines().filter(|l| !l.starts_with('#')).find_map(|l| {
        let mut it = l.split('\t');
        let n = it.next()?;
        (it.next()?.trim().parse::<u32>().ok()? == id).then(|| n.to_string())
    })
}

const M13: Equatorial = Equatorial { ra_rad: 4.367_445, dec_rad: 0.636_196 };

fn check_rules(r: &Route, stars: &[HopStar], start: usize, target: Equatorial, f: &Finder, limit: f64, margin: f64) {
    assert_eq!(r.points[0].star_id, Some(stars[start].id));
    assert!(sep_rad(r.points.last().unwrap().pos, target) < 1e-12, "ends on the target");
    for s in &r.steps {
        assert!(s.length_rad <= f.field_radius_rad() * (1.0 - margin) + 1e-12, "hop {}° too long", s.length_rad.to_degrees());
    }
    for p in &r.points[1..r.points.len() - 1] {
        assert!((p.vmag.unwrap() as f64) < limit, "mag {:?} not visible (limit {limit})", p.vmag);
    }
    // Fewest hops is at least the distance over the hop limit.
    let d = sep_rad(r.points[0].pos, target);
    assert!(r.hop_count >= (d / r.max_hop_rad).ceil() as usize);
}

#[test]
fn arcturus_to_m3_with_a_magnifying_finder() {
    let stars = deep();
    assert!(stars.len() > 480_000);
    let start = find_hip(stars, hip_of("Arcturus")).unwrap();
    let f = bench_finder().unwrap();
    let limit = f.limiting_mag(6.0, 7.0).unwrap();
    let rules = HopRules::default();
    let r = plan_route_named(stars, start, "Arcturus", BENCH_TARGET, "M3", &f, limit, UpReference::North, &rules, &name_of).unwrap();
    check_rules(&r, stars, start, BENCH_TARGET, &f, limit, rules.edge_margin);
    // 12.0° at ≤ 2.4° per hop: 5 hops is the least possible; a dense mag-9.5
    // field comes within one hop of that.
    let least = (sep_rad(stars[start].pos(), BENCH_TARGET) / r.max_hop_rad).ceil() as usize;
    assert!(r.hop_count <= least + 1, "{} hops", r.hop_count);
    assert!(r.stars_considered > 500);
    // Same workload through the bench entry point.
    assert_eq!(bench_route_search(stars).unwrap().hop_count, r.hop_count);
    for l in &r.legs { println!("{}", l.sentence); }
}

/// A unit-power sight: the route must use naked-eye stars only, hops inside
/// the outer ring. With a 4° outer ring under a mag-6 sky the naked-eye stars
/// near M13 leave gaps (the search must say so); a 6° ring under a mag-6.5 sky bridges them.
#[test]
fn alphecca_to_m13_with_a_reflex_sight() {
    let stars = deep();
    let start = find_hip(stars, hip_of("Alphecca")).unwrap();
    let rings = |outer: f64| Finder::new(FinderSpec { kind: FinderKind::ReflexSight { ring_radii_deg: vec![0.5, 2.0, outer] }, aperture_mm: 0.0, magnification: 1.0, true_field_deg: 30.0 }).unwrap();
    let small = rings(4.0);
    let e = plan_route(stars, start, "Alphecca", M13, "M13", &small, small.limiting_mag(6.0, 7.0).unwrap(), UpReference::North, &HopRules::default()).unwrap_err();
    assert!(e.to_string().contains("gap wider than 3.2°"), "{e}");
    let f = rings(6.0);
    let limit = f.limiting_mag(6.5, 7.0).unwrap();
    assert!(limit < 6.5);
    let rules = HopRules::default();
    let r = plan_route(stars, start, "Alphecca", M13, "M13", &f, limit, UpReference::North, &rules).unwrap();
    check_rules(&r, stars, start, M13, &f, limit, rules.edge_margin);
    assert!(r.hop_count >= 2);
    for p in &r.points[1..r.points.len() - 1] {
        assert!((p.vmag.unwrap() as f64) <= limit - rules.visibility_margin_mag);
    }
}

/// Binoculars from Vega to M13 (24°): a long route, still every rule holds.
#[test]
fn vega_to_m13_with_binoculars() {
    let stars = deep();
    let f = Finder::new(FinderSpec { kind: FinderKind::Binoculars, aperture_mm: 50.0, magnification: 10.0, true_field_deg: 6.5 }).unwrap();
    let limit = f.limiting_mag(5.5, 7.0).unwrap();
    let start = find_hip(stars, hip_of("Vega")).unwrap();
    let rules = HopRules { edge_margin: 0.3, visibility_margin_mag: 1.0, faintness_penalty: 0.1 };
    let r = plan_route(stars, start, "Vega", M13, "M13", &f, limit, UpReference::North, &rules).unwrap();
    check_rules(&r, stars, start, M13, &f, limit, rules.edge_margin);
}

/// Native time of the route-search bench (the lead times the same function in wasm).
#[test]
#[ignore]
fn bench_route_search_native() {
    let stars = deep();
    let _ = bench_route_search(stars).unwrap();
    let mut times = Vec::new();
    for _ in 0..15 {
        let t = std::time::Instant::now();
        let r = bench_route_search(stars).unwrap();
        times.push(t.elapsed().as_secs_f64() * 1e3);
        std::hint::black_box(r);
    }
    times.sort_by(|a, b| a.total_cmp(b));
    let r = bench_route_search(stars).unwrap();
    println!(
        "route search Arcturus→M3 over {} stars ({} in the corridor, {} hops): median {:.2} ms, min {:.2} ms",
        stars.len(), r.stars_considered, r.hop_count, times[times.len() / 2], times[0]
    );
}

/// A whole card for M13 from an invented site on a June night: the route's
/// hop directions "relative to the zenith" (catalog frame + zenith carried
/// back by NPB) agree with the directions between the same points in alt/az
/// computed by the sky core (a frame-invariant angle): within 0.1°.
#[test]
fn m13_card_on_a_june_night() {
    use nightfield::find::card::*;
    use nightfield::find::circles::{AzimuthReference, DialSense};
    use nightfield::find::words::{compass_point_16, direction_words};
    use nightfield::sky::apparent::{star_apparent, CatalogPlace};
    use nightfield::sky::horizon::{site_from_deg, to_horizontal};
    use nightfield::time::Instant;
    let stars = deep();
    let site = site_from_deg(50.5, 8.25, 200.0).unwrap();
    let t = Instant::from_civil(2026, 6, 15, 23, 30, 0.0, 120).unwrap();
    let place = |p: Equatorial| CatalogPlace { ra_rad: p.ra_rad, dec_rad: p.dec_rad, pm_ra_cosdec_mas_yr: 0.0, pm_dec_mas_yr: 0.0, parallax_mas: 0.0, rv_km_s: 0.0 };
    let app = star_apparent(&place(M13), 2000.0, &t);
    let f = bench_finder().unwrap();
    let req = CardRequest {
        site, t, target_label: "M13", target_apparent: app, finder: &f, main_true_field_rad: 0.8f64.to_radians(),
        naked_eye_limit_mag: 5.5, stars, landmarks: &[], start: Some(find_hip(stars, hip_of("Vega")).unwrap()),
        auto_start_max_vmag: 3.0, hop_rules: HopRules::default(), azimuth_reference: AzimuthReference::TrueNorth,
        dial_sense: DialSense::Clockwise, name_of: &name_of,
    };
    let card = find_card(&req).unwrap();
    let hz = to_horizontal(app, &site, &t);
    assert!(hz.alt_rad > 0.5, "M13 is high on a June night from 50°N");
    assert_eq!(card.pointing.compass, compass_point_16(hz.az_rad));
    assert!((card.dials.az_dial_deg - card.pointing.az_deg).abs() < 1e-9);
    let r = card.route.as_ref().unwrap();
    assert_eq!(r.points[0].label, "Vega");
    check_rules(r, stars, req.start.unwrap(), r.points.last().unwrap().pos, &f, card.finder_view.limiting_mag, 0.2);
    for s in &r.steps {
        let h = |k: usize| to_horizontal(star_apparent(&place(r.points[k].pos), 2000.0, &t), &site, &t);
        let (cw, _) = direction_words(h(s.from), h(s.to));
        let diff = ((s.direction_from_up_deg + cw) % 360.0 + 360.0) % 360.0;
        assert!(diff.min(360.0 - diff) < 0.1, "step {}: ccw {} vs cw {}", s.from, s.direction_from_up_deg, cw);
    }
    for l in &r.legs { println!("{}", l.sentence); }
    for s in &r.steps { println!("  {}", s.sentence); }
    println!("{}", card.pointing.sentence);
}
