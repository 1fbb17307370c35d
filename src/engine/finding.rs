//! Finding the target: pointing in plain words, the finder's view with the main
//! scope's field marked, a star-hop route and the dial readings, for the current
//! scenario (see `find::card`).

use super::compose::Composed;
use super::EngineError;
use crate::find::card::{find_card, CardRequest, FindCard};
use crate::find::circles::{AzimuthReference, DialSense};
use crate::find::finder::{Finder, FinderSpec};
use crate::find::hop::{HopRules, HopStar};
use crate::find::{guide, sources};
use crate::sky::catalog::Catalogs;
use crate::solar::ephemeris::Ephemeris;

/// Stars a finder route may use: the bright and the Hipparcos tiers (complete to about V 9,
/// deeper than any finder shows).
pub fn route_stars(cats: &Catalogs) -> Vec<HopStar> {
    let tiers: Vec<&crate::sky::catalog::StarCatalog> = (0..2).filter_map(|t| cats.tier(t)).collect();
    sources::hop_stars(&tiers)
}

/// The find card for a composed view and a finder.
pub fn card(c: &Composed, cats: &Catalogs, eph: Option<&Ephemeris>, stars: &[HopStar], spec: FinderSpec) -> Result<FindCard, EngineError> {
    let finder = Finder::new(spec).map_err(|e| EngineError::Target(format!("finder: {e}")))?;
    let mut landmarks = eph.map(|e| guide::solar_landmarks(e, &c.site, &c.instant)).unwrap_or_default();
    if let Some(bright) = cats.tier(0) {
        landmarks.extend(guide::named_star_landmarks(bright, 2.5, &c.site, &c.instant));
    }
    let nelm = crate::plan::visibility::naked_eye_limit_mag(c.natural_sky_mag_arcsec2, 2.0);
    let name_of = |id: u32| sources::iau_name(id);
    let req = CardRequest {
        site: c.site,
        t: c.instant,
        target_label: &c.aim.name,
        target_apparent: c.aim.apparent,
        finder: &finder,
        main_true_field_rad: c.optics.true_field_rad,
        naked_eye_limit_mag: nelm,
        stars,
        landmarks: &landmarks,
        start: None,
        auto_start_max_vmag: 2.5,
        hop_rules: HopRules::default(),
        azimuth_reference: AzimuthReference::TrueNorth,
        dial_sense: DialSense::Clockwise,
        name_of: &name_of,
    };
    find_card(&req).map_err(|e| EngineError::Target(e.to_string()))
}

/// The finder's own view of the target: the scenario recomposed with the finder as the
/// train (its orientation, field and star limit), the main scope's field as a ring and
/// the star-hop route as a path over it.
pub fn finder_scene(
    main: &Composed,
    scenario: &crate::scenario::Scenario,
    cats: &Catalogs,
    eph: Option<&Ephemeris>,
    stars: &[HopStar],
    spec: FinderSpec,
) -> Result<Composed, EngineError> {
    let finder = Finder::new(spec.clone()).map_err(|e| EngineError::Target(format!("finder: {e}")))?;
    let card = card(main, cats, eph, stars, spec)?;
    let mut s = scenario.clone();
    s.train = Some(finder.to_train());
    s.view.pan_arcmin = [0.0, 0.0];
    let mut c = super::compose::compose(&s, cats, eph)?;
    let frame = super::compose::ApparentFrame::new(&c.instant, &c.site);
    let center = c.scene.center;
    if let Some(off) = crate::scene::gnomonic(center, main.aim.apparent) {
        c.scene.overlays.push(crate::scene::Overlay::Ring { center: off, radius_rad: main.optics.true_field_rad / 2.0 });
    }
    if let Some(route) = card.route.as_ref() {
        let points: Vec<glam::DVec2> = route
            .points
            .iter()
            .filter_map(|p| crate::scene::gnomonic(center, frame.fixed(p.pos)))
            .collect();
        c.scene.overlays.push(crate::scene::Overlay::Path { points });
        // Number the stepping stones as the steps name them ("star 4" = where hop 4 lands).
        if scenario.view.labels {
            let last = route.points.len().saturating_sub(1);
            for (k, p) in route.points.iter().enumerate() {
                if k > 0 && k < last && !p.label.is_empty() && p.label.chars().all(|ch| ch.is_ascii_digit()) {
                    c.scene.add_label(frame.fixed(p.pos), &p.label, crate::scene::LabelKind::Star);
                }
            }
        }
    }
    Ok(c)
}
