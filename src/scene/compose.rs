//! One call that composes the scene for a train pointed at a place in the
//! sky at an instant from a site: figures, orientation (train + mount +
//! parallactic angle), stars, Sun/Moon/planets, sky light, markers.

use super::Scene;
use crate::optics::figures::{figures_for, Conditions};
use crate::optics::{OpticsError, Train};
use crate::orient::{orientation, MountState};
use crate::sky::apparent::ApparentContext;
use crate::sky::catalog::StarCatalog;
use crate::sky::dso::DsoCatalog;
use crate::sky::horizon::{hour_angle_rad, parallactic_angle_rad, to_horizontal};
use crate::sky::{Equatorial, Site};
use crate::solar::{self, BodyId, Ephemeris, SolarError};
use crate::time::Instant;
use std::fmt;

/// Everything a scene is composed from (already decoded and validated upstream).
pub struct ComposeInput<'a> {
    pub train: &'a Train,
    pub conditions: Conditions,
    /// Field centre, apparent place (true equator and equinox of date).
    pub center: Equatorial,
    pub instant: Instant,
    pub site: Site,
    /// Star tiers to draw; they must not overlap (each star in one tier only).
    pub catalogs: &'a [&'a StarCatalog],
    /// Deep-sky objects to draw; None leaves them out.
    pub dsos: Option<&'a DsoCatalog>,
    /// For the Sun, Moon, planets and moonlight; None leaves them out.
    pub ephemeris: Option<&'a Ephemeris>,
    /// Natural sky brightness without the Moon, V mag/arcsec².
    pub dark_sky_mag_arcsec2: f64,
    /// Mount tracks the sky (no drift marker).
    pub driven: bool,
    pub user_rotation_rad: f64,
    pub sensor_rotation_rad: f64,
    /// Text for the label at the field centre (the target's name), if any.
    pub target_label: Option<&'a str>,
}

/// Why a scene could not be composed.
#[derive(Clone, Debug, PartialEq)]
pub enum ComposeError {
    Optics(OpticsError),
    Solar(SolarError),
    /// A sky brightness outside 10..=25 mag/arcsec².
    SkyBrightness(f64),
}

impl fmt::Display for ComposeError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ComposeError::Optics(e) => write!(f, "{e}"),
            ComposeError::Solar(e) => write!(f, "{e}"),
            ComposeError::SkyBrightness(v) => write!(f, "sky brightness {v} mag/arcsec²: must be between 10 and 25"),
        }
    }
}
impl std::error::Error for ComposeError {}
impl From<OpticsError> for ComposeError {
    fn from(e: OpticsError) -> Self {
        ComposeError::Optics(e)
    }
}
impl From<SolarError> for ComposeError {
    fn from(e: SolarError) -> Self {
        ComposeError::Solar(e)
    }
}

/// V-band extinction used for moonlight, mag per air mass (common practice
/// for a good site; Krisciunas & Schaefer 1991 used 0.172 at Mauna Kea).
pub const MOONLIGHT_K_MAG: f64 = 0.2;

/// Composes the scene (see module doc). Stars are selected by a scan of each
/// catalog against the field with a 1° margin for precession since the
/// catalog epoch, then placed at their apparent places.
pub fn compose(inp: &ComposeInput) -> Result<Scene, ComposeError> {
    if !(10.0..=25.0).contains(&inp.dark_sky_mag_arcsec2) {
        return Err(ComposeError::SkyBrightness(inp.dark_sky_mag_arcsec2));
    }
    let fig = figures_for(inp.train, &inp.conditions)?;
    let lat = inp.site.lat_rad;
    let ha = hour_angle_rad(inp.center.ra_rad, inp.site.lon_rad, &inp.instant);
    let q = parallactic_angle_rad(ha, inp.center.dec_rad, lat);
    let hz = to_horizontal(inp.center, &inp.site, &inp.instant);
    let state = MountState { parallactic_rad: q, alt_rad: hz.alt_rad, pier_side: None, user_rotation_rad: inp.user_rotation_rad, dec_rad: Some(inp.center.dec_rad) };
    let orient = orientation(inp.train, &state)?;
    let mut scene = Scene::for_figures(inp.center, &fig, orient, inp.sensor_rotation_rad);
    scene.set_zenith(q);
    if !inp.driven {
        scene.set_sidereal_drift();
    }

    let ctx = ApparentContext::at_site(&inp.instant, &inp.site);
    let reach = scene.field_reach_rad() + 1f64.to_radians();
    let cos_reach = libm::cos(reach.min(3.0));
    let c = unit(inp.center);
    for cat in inp.catalogs {
        let idx: Vec<u32> = cat
            .stars
            .iter()
            .enumerate()
            .filter(|(_, s)| s.vmag <= scene.mag_limit && unit(Equatorial { ra_rad: s.ra_rad, dec_rad: s.dec_rad }).dot(c) >= cos_reach)
            .map(|(i, _)| i as u32)
            .collect();
        scene.add_catalog_stars(cat, Some(&idx), &ctx);
    }

    if let Some(d) = inp.dsos {
        scene.add_catalog_dsos(d, &ctx);
    }
    let mut moon_nl = 0.0;
    if let Some(eph) = inp.ephemeris {
        for b in BodyId::ALL {
            scene.add_solar_body(eph, b, &inp.instant, &inp.site)?;
        }
        let moon = solar::body_apparent(eph, BodyId::Moon, &inp.instant, &inp.site)?;
        let mh = to_horizontal(moon.topocentric, &inp.site, &inp.instant);
        let sep = libm::acos(unit(moon.topocentric).dot(c).clamp(-1.0, 1.0));
        moon_nl = crate::sky::brightness::moonlight_nl(moon.phase_angle_rad, sep, mh.alt_rad, hz.alt_rad, MOONLIGHT_K_MAG);
    }
    scene.set_sky(inp.dark_sky_mag_arcsec2, moon_nl, fig.exit_pupil_mm, inp.conditions.eye_pupil_mm);
    if let Some(t) = inp.target_label {
        scene.labels.push(super::SceneLabel { offset: glam::DVec2::ZERO, text: t.to_string(), kind: super::LabelKind::Target });
    }
    Ok(scene)
}

fn unit(p: Equatorial) -> glam::DVec3 {
    let (sd, cd) = libm::sincos(p.dec_rad);
    let (sa, ca) = libm::sincos(p.ra_rad);
    glam::DVec3::new(cd * ca, cd * sa, sd)
}
