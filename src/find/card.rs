//! One "find it" card for a target at a time: pointing words, the finder
//! view with the main field marked, a star-hop route, setting-circle readings.

use super::circles::{dial_readings, AzimuthReference, DialReading, DialSense};
use super::finder::{Finder, FinderView};
use super::guide::{apparent_to_catalog_frame, up_pa_rad, zenith_catalog_frame};
use super::hop::{choose_start, plan_route_named, HopRules, HopStar, Route, UpReference};
use super::words::{pointing_words, Landmark, LandmarkRule, Pointing};
use super::FindError;
use crate::sky::horizon::to_horizontal;
use crate::sky::{Equatorial, Site};
use crate::time::Instant;
use serde::Serialize;

/// What a card is made from. Stars are the route-search stars (e.g.
/// `sources::hop_stars` of the loaded tiers, or a cone of them).
pub struct CardRequest<'a> {
    pub site: Site,
    pub t: Instant,
    pub target_label: &'a str,
    /// Target's apparent place (true equator and equinox of date).
    pub target_apparent: Equatorial,
    pub finder: &'a Finder,
    pub main_true_field_rad: f64,
    pub naked_eye_limit_mag: f64,
    pub stars: &'a [HopStar],
    pub landmarks: &'a [Landmark],
    /// Starting star (index into `stars`); None: the nearest star brighter
    /// than `auto_start_max_vmag` within 30° of the target.
    pub start: Option<usize>,
    pub auto_start_max_vmag: f64,
    pub hop_rules: HopRules,
    pub azimuth_reference: AzimuthReference,
    pub dial_sense: DialSense,
    /// Proper names by `HopStar::id`.
    pub name_of: &'a dyn Fn(u32) -> Option<String>,
}

/// The card. `route_error` says in words why there is no route, if none.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct FindCard {
    pub pointing: Pointing,
    /// Position angle of "up" (the zenith) at the target, for the views.
    pub up_pa_rad: f64,
    pub finder_view: FinderView,
    pub route: Option<Route>,
    pub route_error: Option<String>,
    pub dials: DialReading,
}

/// Air pressure and temperature for refraction when the card has none
/// (a standard night: 1010 hPa, 10 °C).
pub const STANDARD_PRESSURE_HPA: f64 = 1010.0;
pub const STANDARD_TEMP_C: f64 = 10.0;

/// Build the card (see module doc). Pointing words and dial readings use the
/// refracted altitude (`sky::refraction`, standard night air): where the
/// tube must point. Routes use zenith/horizon words.
pub fn find_card(req: &CardRequest) -> Result<FindCard, FindError> {
    let hz = crate::sky::refraction::refracted(to_horizontal(req.target_apparent, &req.site, &req.t), STANDARD_PRESSURE_HPA, STANDARD_TEMP_C);
    let pointing = pointing_words(hz, req.landmarks, LandmarkRule::default())?;
    let up = up_pa_rad(req.target_apparent, &req.site, &req.t);
    let finder_view = req.finder.view(up, req.main_true_field_rad, (0.0, 0.0), req.naked_eye_limit_mag)?;
    let dials = dial_readings(hz, req.azimuth_reference, req.dial_sense, 0.0)?;
    let target = apparent_to_catalog_frame(req.target_apparent, &req.t);
    let start = match req.start {
        Some(i) => Some(i),
        None => choose_start(req.stars, target, req.auto_start_max_vmag, 30f64.to_radians()),
    };
    let zen = UpReference::Zenith { zenith: zenith_catalog_frame(&req.site, &req.t) };
    let routed = match start {
        None => Err(FindError::NoRoute {
            reason: format!("no star brighter than mag {:.1} within 30° of {}", req.auto_start_max_vmag, req.target_label),
        }),
        Some(i) => {
            let label = (req.name_of)(req.stars.get(i).map_or(0, |s| s.id)).unwrap_or_else(|| "the starting star".to_string());
            plan_route_named(req.stars, i, &label, target, req.target_label, req.finder, finder_view.limiting_mag, zen, &req.hop_rules, req.name_of)
        }
    };
    let (route, route_error) = match routed {
        Ok(r) => (Some(r), None),
        Err(e) => (None, Some(e.to_string())),
    };
    Ok(FindCard { pointing, up_pa_rad: up, finder_view, route, route_error, dials })
}
