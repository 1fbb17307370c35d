//! The numbers and words beside the view, drawn from a composed scene.

use super::compose::{body_title, Composed};
use super::EngineError;
use crate::optics::figures::Figures;
use crate::scenario::Scenario;
use crate::sky::catalog::Catalogs;
use crate::sky::search::{resolve as search, TargetRef};
use crate::solar::ephemeris::Ephemeris;
use crate::solar::BodyId;
use serde::Serialize;

/// The figures the page shows beside the view (degrees at this edge).
#[derive(Clone, Debug, Serialize)]
pub struct ViewFigures {
    pub target_name: String,
    pub target_kind: String,
    /// Apparent place of date (topocentric for bodies).
    pub ra_deg: f64,
    pub dec_deg: f64,
    pub alt_deg: f64,
    pub az_deg: f64,
    pub parallactic_deg: f64,
    pub magnification: Option<f64>,
    pub true_field_deg: f64,
    pub exit_pupil_mm: Option<f64>,
    pub focal_ratio: Option<f64>,
    /// The orientation in words ("upside down, zenith at bottom, north at bottom").
    pub orientation: String,
    pub mirrored: bool,
    /// Seconds the sky takes to carry the target from the centre out of an undriven field.
    pub drift_s: Option<f64>,
    /// How big the target sits in the field, in words.
    pub size_words: Option<String>,
    pub target_size_deg: f64,
    pub limiting_mag: f64,
    pub stars_drawn: usize,
    pub sun_alt_deg: Option<f64>,
    pub sun_separation_deg: Option<f64>,
    pub moon_alt_deg: Option<f64>,
    pub advice: Vec<String>,
    /// Every optical figure of the train.
    pub optics: Figures,
}

pub fn view_figures(c: &Composed) -> ViewFigures {
    let deg = f64::to_degrees;
    let tf = c.optics.true_field_rad;
    let size_words = if c.aim.size_rad > 0.0 && tf > 0.0 {
        let share = c.aim.size_rad / tf;
        Some(if share > 1.0 {
            format!("larger than the field ({:.0}% of its width): the field shows only part of it", share * 100.0)
        } else if share > 0.8 {
            format!("just fits: {:.0}% of the field's width", share * 100.0)
        } else if share > 0.05 {
            format!("fits well: {:.0}% of the field's width", share * 100.0)
        } else {
            format!("small: {:.1}% of the field's width", share * 100.0)
        })
    } else {
        None
    };
    let mut advice = c.optics.advice.clone();
    if c.horizontal.alt_rad < 0.0 {
        advice.insert(0, "The target is below the horizon at this time.".into());
    } else if c.horizontal.alt_rad < 15f64.to_radians() {
        advice.insert(0, "The target is low: haze and turbulence will soften the view.".into());
    }
    ViewFigures {
        target_name: c.aim.name.clone(),
        target_kind: c.aim.kind.clone(),
        ra_deg: deg(c.aim.apparent.ra_rad),
        dec_deg: deg(c.aim.apparent.dec_rad),
        alt_deg: deg(c.horizontal.alt_rad),
        az_deg: deg(c.horizontal.az_rad),
        parallactic_deg: deg(c.parallactic_rad),
        magnification: c.optics.magnification,
        true_field_deg: deg(tf),
        exit_pupil_mm: c.optics.exit_pupil_mm,
        focal_ratio: c.optics.focal_ratio,
        orientation: c.orientation.text.clone(),
        mirrored: c.orientation.mirrored,
        drift_s: c.scene.markers.drift.map(|d| d.time_to_exit_s).filter(|s| s.is_finite()),
        size_words,
        target_size_deg: deg(c.aim.size_rad),
        limiting_mag: c.mag_limit as f64,
        stars_drawn: c.scene.stars.len(),
        sun_alt_deg: c.sun_alt_rad.map(deg),
        sun_separation_deg: c.sun_separation_rad.map(deg),
        moon_alt_deg: c.moon_alt_rad.map(deg),
        advice,
        optics: c.optics.clone(),
    }
}

/// A resolved target name.
#[derive(Clone, Debug, Serialize)]
pub struct Resolved {
    pub query: String,
    pub name: String,
    pub kind: String,
    /// Catalog (ICRS) place; for bodies, the apparent place at the current scenario's time.
    pub ra_deg: Option<f64>,
    pub dec_deg: Option<f64>,
    pub vmag: Option<f64>,
}

pub fn resolve(cats: &Catalogs, eph: Option<&Ephemeris>, s: Option<&Scenario>, query: &str) -> Result<Resolved, EngineError> {
    let r = search(query, cats).map_err(|e| EngineError::Target(e.to_string()))?;
    Ok(match r {
        TargetRef::Star(id) => {
            let (st, _) = cats.star(id).ok_or_else(|| EngineError::Target(format!("\"{query}\" is not loaded yet")))?;
            Resolved {
                query: query.into(),
                name: cats.star_label(id),
                kind: "star".into(),
                ra_deg: Some(st.ra_rad.to_degrees()),
                dec_deg: Some(st.dec_rad.to_degrees()),
                vmag: Some(st.vmag as f64),
            }
        }
        TargetRef::Dso(id) => {
            let d = cats.dso(id).ok_or_else(|| EngineError::Target(format!("\"{query}\" is not loaded yet")))?;
            Resolved {
                query: query.into(),
                name: super::compose::dso_title(d),
                kind: d.kind.words().into(),
                ra_deg: Some(d.ra_rad.to_degrees()),
                dec_deg: Some(d.dec_rad.to_degrees()),
                vmag: d.vmag.map(|v| v as f64),
            }
        }
        TargetRef::Body(b) => {
            let body = BodyId::from_name(&b).ok_or_else(|| EngineError::Target(format!("no solar-system body called \"{b}\"")))?;
            let mut out = Resolved { query: query.into(), name: body_title(body).into(), kind: "solar system".into(), ra_deg: None, dec_deg: None, vmag: None };
            if let (Some(eph), Some(s)) = (eph, s) {
                if let (Ok(t), Ok(site)) = (super::compose::instant_of(s), super::compose::site_of(s)) {
                    if let Ok(st) = crate::solar::topocentric::body_apparent(eph, body, &t, &site) {
                        out.ra_deg = Some(st.topocentric.ra_rad.to_degrees());
                        out.dec_deg = Some(st.topocentric.dec_rad.to_degrees());
                        out.vmag = Some(st.vmag);
                    }
                }
            }
            out
        }
    })
}
