//! The find module fed by the sky core and the real catalog, checked against
//! skyfield 1.55 + DE421 (fixture tests/fixtures/find.json, "named": Hipparcos
//! new-reduction places observed from three sites, geometric alt/az).
use nightfield::find::geom::{pa_rad, sep_rad, wrap_pi};
use nightfield::find::guide::*;
use nightfield::find::words::*;
use nightfield::sky::catalog::{decode_stars, StarCatalog};
use nightfield::sky::horizon::site_from_deg;
use nightfield::sky::Horizontal;
use nightfield::time::Instant;
use serde_json::Value;

static BRIGHT: &[u8] = include_bytes!("../catalog/stars_bright.nfs");

fn fixture() -> Value {
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/find.json")).unwrap();
    serde_json::from_str(&text).unwrap()
}
fn f(v: &Value) -> f64 { v.as_f64().unwrap() }

fn cases() -> Vec<(nightfield::sky::Site, Instant, Vec<(u32, String, Horizontal)>)> {
    let fx = fixture();
    fx["named"].as_array().unwrap().iter().map(|c| {
        let site = site_from_deg(f(&c["lat_deg"]), f(&c["lon_deg"]), 0.0).unwrap();
        // The fixture gives TT and UT1; UTC is within 0.9 s of UT1 and unused here.
        let t = Instant { utc_jd: f(&c["ut1_jd"]), tt_jd: f(&c["tt_jd"]), ut1_jd: f(&c["ut1_jd"]) };
        let stars = c["stars"].as_array().unwrap().iter().map(|s| {
            (s["hip"].as_u64().unwrap() as u32, s["name"].as_str().unwrap().to_string(),
             Horizontal { alt_rad: f(&s["alt_rad"]), az_rad: f(&s["az_rad"]) })
        }).collect();
        (site, t, stars)
    }).collect()
}

fn star<'a>(cat: &'a StarCatalog, hip: u32) -> &'a nightfield::sky::catalog::Star {
    cat.stars.iter().find(|s| s.hip == hip).unwrap()
}

fn sep_hz(a: Horizontal, b: Horizontal) -> f64 {
    sep_rad(nightfield::find::geom::hz_as_sph(a), nightfield::find::geom::hz_as_sph(b))
}

/// Our chain (catalog → sky apparent place → alt/az) lands within 2″ of
/// skyfield, and the bearing and height words agree with skyfield's alt/az
/// (skipping any star within 0.01° of a word boundary).
#[test]
fn pointing_words_agree_with_skyfield() {
    let cat = decode_stars(BRIGHT).unwrap();
    let mut compared = 0;
    for (site, t, stars) in cases() {
        for (hip, name, sky_hz) in &stars {
            let ours = star_horizontal(star(&cat, *hip), cat.epoch_jyear, &site, &t);
            let d = sep_hz(ours, *sky_hz).to_degrees() * 3600.0;
            assert!(d < 2.0, "{name}: {d}″ from skyfield");
            let az_deg = sky_hz.az_rad.to_degrees().rem_euclid(360.0);
            let near_sector_edge = ((az_deg / 22.5 + 0.5).fract() - 0.5).abs() * 22.5 > 11.24;
            let alt_deg = sky_hz.alt_rad.to_degrees();
            let near_band_edge = [0.0, 3.0, 10.0, 25.0, 50.0, 70.0].iter().any(|b| (alt_deg - b).abs() < 0.01);
            if near_sector_edge || near_band_edge {
                continue;
            }
            assert_eq!(compass_point_16(ours.az_rad), compass_point_16(sky_hz.az_rad), "{name}");
            assert_eq!(altitude_band(ours.alt_rad), altitude_band(sky_hz.alt_rad), "{name}");
            compared += 1;
        }
    }
    assert!(compared >= 25);
}

/// The nearest-landmark sentence from our chain equals the one from
/// skyfield's alt/az, for every star above the horizon as the target.
#[test]
fn landmark_sentences_agree_with_skyfield() {
    let cat = decode_stars(BRIGHT).unwrap();
    for (site, t, stars) in cases() {
        let ours: Vec<Landmark> = stars.iter().map(|(hip, name, _)| star_landmark(name, star(&cat, *hip), cat.epoch_jyear, &site, &t)).collect();
        let theirs: Vec<Landmark> = stars.iter().map(|(hip, name, hz)| Landmark { name: name.clone(), pos: *hz, vmag: star(&cat, *hip).vmag as f64 }).collect();
        for (k, l) in ours.iter().enumerate() {
            if l.pos.alt_rad < 0.1 {
                continue;
            }
            let a = pointing_words(l.pos, &ours, LandmarkRule::default()).unwrap();
            let b = pointing_words(theirs[k].pos, &theirs, LandmarkRule::default()).unwrap();
            assert_eq!(a.from_landmark.as_ref().map(|x| &x.sentence), b.from_landmark.as_ref().map(|x| &x.sentence));
        }
    }
}

/// The zenith carried back to the catalog frame orients hop words correctly:
/// the direction from star A to star B, counted from "up" using catalog
/// places and `zenith_catalog_frame`, equals the one from skyfield's alt/az
/// (a frame-invariant angle): within 0.05°. Also the zenith distance of A
/// matches 90° − altitude within 0.03° (catalog epoch, no proper motion).
#[test]
fn zenith_in_catalog_frame_orients_hop_words() {
    let cat = decode_stars(BRIGHT).unwrap();
    let mut n = 0;
    for (site, t, stars) in cases() {
        let z = zenith_catalog_frame(&site, &t);
        let up: Vec<_> = stars.iter().filter(|(_, _, hz)| hz.alt_rad > 0.05 && hz.alt_rad < 80f64.to_radians()).collect();
        for a in &up {
            let sa = star(&cat, a.0);
            let pa_ = nightfield::sky::Equatorial { ra_rad: sa.ra_rad, dec_rad: sa.dec_rad };
            let zd = sep_rad(pa_, z).to_degrees();
            assert!((zd - (90.0 - a.2.alt_rad.to_degrees())).abs() < 0.03, "{}: zenith distance {zd}", a.1);
            for b in &up {
                if a.0 == b.0 {
                    continue;
                }
                let sb = star(&cat, b.0);
                let pb = nightfield::sky::Equatorial { ra_rad: sb.ra_rad, dec_rad: sb.dec_rad };
                let ccw = (pa_rad(pa_, pb) - pa_rad(pa_, z)).to_degrees();
                let (cw, _) = direction_words(a.2, b.2);
                let diff = wrap_pi((ccw + cw).to_radians()).to_degrees();
                assert!(diff.abs() < 0.05, "{} → {}: {diff}°", a.1, b.1);
                n += 1;
            }
        }
    }
    assert!(n >= 40, "{n}");
}

/// up_pa_rad is the parallactic angle: the zenith's position angle at the
/// apparent place, in the frame of date (zenith of date = LAST, latitude).
#[test]
fn up_pa_is_the_zenith_position_angle_of_date() {
    let cat = decode_stars(BRIGHT).unwrap();
    for (site, t, stars) in cases() {
        let z = nightfield::find::geom::zenith_equatorial(nightfield::time::local_sidereal_rad(&t, site.lon_rad), site.lat_rad);
        for (hip, name, hz) in &stars {
            if hz.alt_rad > 85f64.to_radians() {
                continue;
            }
            let app = nightfield::sky::apparent::star_apparent(&catalog_place(star(&cat, *hip)), cat.epoch_jyear, &t);
            let diff = wrap_pi(pa_rad(app, z) - up_pa_rad(app, &site, &t)).to_degrees();
            assert!(diff.abs() < 1e-6, "{name}: {diff}°");
        }
    }
}

/// Landmarks from the solar module and the named bright stars. Check values:
/// Jupiter shines between about −2.9 and −1.6 (common practice); Vega and
/// Arcturus are among the IAU-named stars brighter than mag 0.5.
#[test]
fn solar_and_named_landmarks() {
    let eph = nightfield::solar::Ephemeris::decode(include_bytes!("../catalog/ephemeris.bin")).unwrap();
    let cat = decode_stars(BRIGHT).unwrap();
    let (site, t, _) = cases().remove(0);
    let sol = solar_landmarks(&eph, &site, &t);
    assert_eq!(sol.len(), 6);
    let jup = sol.iter().find(|l| l.name == "Jupiter").unwrap();
    assert!(jup.vmag > -3.0 && jup.vmag < -1.5, "{}", jup.vmag);
    let named = named_star_landmarks(&cat, 0.5, &site, &t);
    assert!(named.iter().any(|l| l.name == "Vega") && named.iter().any(|l| l.name == "Arcturus"));
    assert!(named.iter().all(|l| l.vmag <= 0.5));
    // Pointing at Jupiter itself: the nearest landmark is another one, never Jupiter.
    let mut all = sol.clone();
    all.extend(named);
    let p = pointing_words(jup.pos, &all, LandmarkRule { max_vmag: 2.5, min_alt_rad: -1.0 }).unwrap();
    assert_ne!(p.from_landmark.unwrap().name, "Jupiter");
}
