//! The drawn view agrees with the planner's verdict (issue: "the drawn view must agree
//! with the verdict"): a deep-sky glow is drawn only when the visibility model says a
//! visitor can see it, and more strongly the larger the margin. Check values are the
//! planner's own verdicts (plan::schedule::assess_candidate, Crumey 2014 model) for the
//! same train and sky, so the test ties the picture to the card, not to a number of ours.
use nightfield::engine::compose::{drawn_mean_mu, physical_mean_mu};
use nightfield::engine::Engine;
use nightfield::plan::visibility::{view_strength, Verdict};
use nightfield::scenario::Scenario;
use nightfield::sky::search::{resolve, TargetRef};

fn engine() -> Engine {
    let mut e = Engine::new();
    for f in ["stars_bright.nfs", "dso_openngc.nfd", "ephemeris.bin"] {
        let bytes = std::fs::read(format!("{}/catalog/{f}", env!("CARGO_MANIFEST_DIR"))).unwrap();
        e.load_catalog(f, &bytes).unwrap();
    }
    e
}

const REFRACTOR: &str = r#"{"instrument":{"kind":"telescope","design":{"type":"refractor"},"aperture_mm":80,"focal_length_mm":600},
 "accessories":[{"kind":"eyepiece","focal_length_mm":25,"apparent_field_deg":52}],"mount":{"kind":"alt_az"}}"#;
const CAMERA: &str = r#"{"instrument":{"kind":"telescope","design":{"type":"refractor"},"aperture_mm":80,"focal_length_mm":600},
 "accessories":[{"kind":"camera","sensor_width_mm":23.5,"sensor_height_mm":15.6,"pixel_pitch_um":3.9,"pixels_x":6000,"pixels_y":4000}],"mount":{"kind":"alt_az"}}"#;

fn scenario(target: &str, train: &str, sky: f64) -> Scenario {
    let json = format!(
        r#"{{"version":1,"site":{{"name":"Hollow Meadow field (demo)","lat_deg":47.05,"lon_deg":8.3,"elev_m":560,"tz":"Europe/Zurich"}},
        "time_utc":"2026-12-12T22:30:00Z","train":{train},"target":"{target}","view":{{"labels":false,"sky_mag_arcsec2":{sky}}}}}"#
    );
    Scenario::from_json(&json).unwrap()
}

/// The target's glow as drawn (mean surface brightness in the scene) and the sky behind it.
fn drawn(e: &mut Engine, target: &str, train: &str, sky: f64) -> (f32, f64) {
    e.set_scenario(scenario(target, train, sky)).unwrap();
    let c = e.composed().unwrap();
    let d = c.scene.dsos.iter().min_by(|a, b| a.offset.length().total_cmp(&b.offset.length())).expect("the target is in the field");
    (d.surf_br_mag_arcsec2, c.natural_sky_mag_arcsec2)
}

/// The planner's verdict for the same object, train and sky.
fn verdict(e: &Engine, target: &str, sky_mu: f64) -> nightfield::plan::visibility::Assessment {
    let TargetRef::Dso(id) = resolve(target, e.catalogs()).unwrap() else { panic!("{target} is a deep-sky object") };
    let d = e.catalogs().dso(id).unwrap();
    let c = nightfield::plan::wire::candidate_from_dso_with(d, &glam::DMat3::IDENTITY).unwrap();
    let train: nightfield::optics::Train = serde_json::from_str(REFRACTOR).unwrap();
    let opt = nightfield::plan::wire::train_option(&train, "", "").unwrap().unwrap();
    let alt = e.figures().unwrap().alt_deg.to_radians();
    nightfield::plan::schedule::assess_candidate(&c, &opt, 6.0, 180.0, 0.2 * nightfield::sky::refraction::airmass(alt), sky_mu)
}

#[test]
fn a_glow_the_verdict_calls_invisible_is_not_drawn() {
    let mut e = engine();
    // M 74, a faint face-on galaxy, in an 80 mm refractor under a bright town sky.
    let (mu, sky) = drawn(&mut e, "M74", REFRACTOR, 17.5);
    let a = verdict(&e, "M74", sky);
    assert_eq!(a.verdict, Verdict::NotVisible, "{a:?}");
    assert!(mu.is_infinite(), "drawn although not visible: {mu}");
}

#[test]
fn a_darker_sky_draws_the_same_object_with_more_contrast_as_the_verdict_rises() {
    let mut e = engine();
    let (mu_town, sky_town) = drawn(&mut e, "M42", REFRACTOR, 18.5);
    let (mu_dark, sky_dark) = drawn(&mut e, "M42", REFRACTOR, 21.5);
    let (a_town, a_dark) = (verdict(&e, "M42", sky_town), verdict(&e, "M42", sky_dark));
    assert!(view_strength(&a_dark) > view_strength(&a_town), "{a_town:?} {a_dark:?}");
    assert!(a_dark.verdict != Verdict::NotVisible);
    // Contrast over the sky (mag): larger under the darker sky.
    let (drawn_town, drawn_dark) = (nightfield::engine::compose::display_sky_mu(sky_town), nightfield::engine::compose::display_sky_mu(sky_dark));
    assert!(drawn_dark - mu_dark as f64 > drawn_town - mu_town as f64, "town {mu_town}/{drawn_town}, dark {mu_dark}/{drawn_dark}");
    // And exactly the mapping of the planner's strength.
    let drawn_sky = nightfield::engine::compose::display_sky_mu(sky_dark);
    assert!((mu_dark - drawn_mean_mu(view_strength(&a_dark), drawn_sky)).abs() < 1e-4);
}

#[test]
fn the_orion_nebula_is_easy_in_a_small_telescope_under_a_suburban_sky() {
    // Common practice: M 42 is the showpiece of winter public nights, plain in any small telescope.
    let mut e = engine();
    let (_, sky) = drawn(&mut e, "M42", REFRACTOR, 19.5);
    let a = verdict(&e, "M42", sky);
    assert!(matches!(a.verdict, Verdict::Easy | Verdict::Visible), "{a:?}");
}

#[test]
fn a_camera_keeps_the_catalogued_surface_brightness() {
    let mut e = engine();
    let (mu, _) = drawn(&mut e, "M31", CAMERA, 20.5);
    let TargetRef::Dso(id) = resolve("M31", e.catalogs()).unwrap() else { panic!() };
    assert_eq!(Some(mu), physical_mean_mu(e.catalogs().dso(id).unwrap()));
}

#[test]
fn mean_surface_brightness_from_magnitude_and_outline() {
    // μ = m + 2.5 log10(area): M 42, V 4.0 over 90′ × 60′ (OpenNGC) gives 21.96 (hand computation).
    let mut e = engine();
    let TargetRef::Dso(id) = resolve("M42", e.catalogs()).unwrap() else { panic!() };
    let mu = physical_mean_mu(e.catalogs().dso(id).unwrap()).unwrap();
    assert!((mu - 21.96).abs() < 0.02, "{mu}");
    let _ = &mut e;
}

fn scene_sky_and_stars(e: &mut Engine, time: &str) -> (f64, usize) {
    let json = scenario("M45", REFRACTOR, 21.0);
    let mut s = json;
    s.time_utc = time.to_string();
    e.set_scenario(s).unwrap();
    let c = e.composed().unwrap();
    assert!(c.scene.sky.sky_mag_arcsec2 >= c.natural_sky_mag_arcsec2 - 1e-9, "the drawn sky is never brighter than nature's");
    (c.natural_sky_mag_arcsec2, c.scene.stars.len())
}

#[test]
fn daylight_and_twilight_wash_out_the_view() {
    // Sun altitudes at the demo site on 2026-12-12 (from memory of the season: sunset near
    // 16:40 local = 15:40 UTC): noon sun up, civil dusk, full night.
    let mut e = engine();
    let hip = std::fs::read(format!("{}/catalog/stars_hip.nfs", env!("CARGO_MANIFEST_DIR"))).unwrap();
    e.load_catalog("stars_hip.nfs", &hip).unwrap();
    let (day_mu, day_stars) = scene_sky_and_stars(&mut e, "2026-12-12T11:00:00Z");
    let (dusk_mu, dusk_stars) = scene_sky_and_stars(&mut e, "2026-12-12T16:05:00Z");
    let (night_mu, night_stars) = scene_sky_and_stars(&mut e, "2026-12-12T22:00:00Z");
    assert!(day_mu < 5.0, "daylight sky {day_mu}");
    assert!(day_mu < dusk_mu && dusk_mu < night_mu, "{day_mu} {dusk_mu} {night_mu}");
    assert!((night_mu - 21.0).abs() < 0.3, "night sky keeps the site's value (Moon aside): {night_mu}");
    assert!(day_stars < dusk_stars && dusk_stars < night_stars, "stars {day_stars} {dusk_stars} {night_stars}");
    assert!(e.figures().is_ok());
    let figs = { e.set_scenario({ let mut s = scenario("M45", REFRACTOR, 21.0); s.time_utc = "2026-12-12T11:00:00Z".into(); s }).unwrap(); e.figures().unwrap() };
    assert!(figs.sun_alt_deg.unwrap_or(-90.0) > 0.0);
}
