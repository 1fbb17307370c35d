//! The night on a time grid: every target's altitude curve, when it is in
//! clear view, its best time, and per station the framing train and the
//! visibility verdict at every step. Built once by [`prepare`]; [`Prepared::plan`]
//! then assigns showings cheaply (and again when a sector clouds over).

use super::ephem_lite::{self, SiteTrig};
use super::framing::{best_frame, FrameChoice};
use super::input::*;
use super::sky_brightness::{self as skyb, SKY_BV};
use crate::sky::brightness as skyl;
use super::visibility::{self as vis, Assessment, Eyepath, ExtendedLight, Verdict};
use super::PlanError;
use crate::sky::Equatorial;
use serde::{Deserialize, Serialize};

/// At most this many time steps in one plan.
pub const MAX_STEPS: usize = 2000;
/// Sun's altitude at sunrise/sunset, deg (refraction and semidiameter: common practice).
pub const SUNSET_ALT_DEG: f64 = -0.833;

/// One station's view of one target at one step.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct StepView {
    pub verdict: Verdict,
    pub averted_margin_mag: f32,
}

/// A target prepared on the grid.
#[derive(Clone, Debug)]
pub(crate) struct Track {
    pub alt_rad: Vec<f64>,
    pub az_rad: Vec<f64>,
    pub moon_sep_deg: Vec<f64>,
    pub sun_sep_deg: Vec<f64>,
    /// Sky at the target, V mag/arcsec² (`sky::brightness`, what the verdicts use).
    pub sky_mu: Vec<f64>,
    /// In clear view (above the mask) at each step, before any clouds.
    pub clear: Vec<bool>,
    /// Per station: chosen framing (None: no train may show it).
    pub frames: Vec<Option<FrameChoice>>,
    /// Per station, per step.
    pub views: Vec<Vec<StepView>>,
}

/// The night computed once; plans and re-plans read it.
#[derive(Clone, Debug)]
pub struct Prepared {
    pub input: PlanInput,
    pub steps_utc_jd: Vec<f64>,
    pub sun_alt_rad: Vec<f64>,
    pub moon_alt_rad: Vec<f64>,
    pub moon_phase_angle_deg: Vec<f64>,
    pub moon_illuminated: Vec<f64>,
    pub moon_waxing: bool,
    pub moon_distance_km: f64,
    pub(crate) tracks: Vec<Track>,
}

impl Prepared {
    /// The sky at target `target` (index in `input.targets`) at step `step`, V mag/arcsec²:
    /// the one sky model (`sky::brightness`) at the planner's geometry, as its verdicts use it.
    pub fn sky_mu(&self, target: usize, step: usize) -> Option<f64> {
        self.tracks.get(target)?.sky_mu.get(step).copied()
    }
}

fn interp_track(points: &[TrackPoint], jd: f64) -> Equatorial {
    match points.len() {
        0 => Equatorial { ra_rad: 0.0, dec_rad: 0.0 },
        1 => Equatorial { ra_rad: points[0].ra_rad, dec_rad: points[0].dec_rad },
        n => {
            let mut k = 0;
            while k + 2 < n && points[k + 1].utc_jd < jd {
                k += 1;
            }
            let (a, b) = (&points[k], &points[k + 1]);
            let span = b.utc_jd - a.utc_jd;
            let f = if span.abs() > 0.0 { ((jd - a.utc_jd) / span).clamp(-1.0, 2.0) } else { 0.0 };
            let mut dra = b.ra_rad - a.ra_rad;
            if dra > core::f64::consts::PI {
                dra -= core::f64::consts::TAU;
            } else if dra < -core::f64::consts::PI {
                dra += core::f64::consts::TAU;
            }
            Equatorial { ra_rad: a.ra_rad + f * dra, dec_rad: a.dec_rad + f * (b.dec_rad - a.dec_rad) }
        }
    }
}

/// Colour (B−V) and core assumptions per kind, used for untrained eyes
/// (from memory, approximate typical values; emission objects get 0.0 because
/// their light is mostly the green [O III] and Hβ lines the dark-adapted eye sees well).
/// Bright emission nebulae (H II regions such as M 42 and M 8) carry much of their light
/// in a core a few arcminutes across, far above the catalogue's mean over the whole
/// outline: we take a sixteenth of the area 1.5 mag/arcsec² brighter (our stated
/// assumption, beside the galaxies' 1/16 and 2 mag), so M 42 (mean about 22 mag/arcsec²
/// over 90′ × 60′) is easy in a small telescope under a suburban sky, as it is. Known
/// weakness: a large faint H II region with a bright catalogued total (NGC 7000) comes
/// out easier than it looks without a filter.
pub fn kind_light_defaults(kind: TargetKind) -> (f64, f64, f64) {
    // (B−V, core area fraction, core gain mag/arcsec²)
    match kind {
        TargetKind::Galaxy => (0.85, 1.0 / 16.0, 2.0),
        TargetKind::GlobularCluster => (0.70, 1.0 / 9.0, 1.5),
        TargetKind::OpenCluster => (0.35, 0.0, 0.0),
        TargetKind::EmissionNebula => (0.0, 1.0 / 16.0, 1.5),
        TargetKind::PlanetaryNebula => (0.0, 0.0, 0.0),
        TargetKind::ReflectionNebula => (0.2, 0.0, 0.0),
        TargetKind::Moon | TargetKind::Sun => (0.9, 0.0, 0.0),
        TargetKind::Planet => (0.8, 0.0, 0.0),
        TargetKind::Star | TargetKind::Other => (0.6, 0.0, 0.0),
    }
}

/// The object's light for the threshold model; None when nothing is known of its brightness.
fn light_of(c: &Candidate, moon_phase_deg: f64) -> Option<ExtendedLight> {
    let (bv0, core_frac, core_gain) = kind_light_defaults(c.kind);
    let bv = c.bv.unwrap_or(bv0);
    let minor = if c.minor_arcmin > 0.0 { c.minor_arcmin } else { c.major_arcmin };
    let mut area = core::f64::consts::FRAC_PI_4 * c.major_arcmin * minor;
    let vmag = if c.kind == TargetKind::Moon { Some(skyl::moon_vmag(moon_phase_deg.to_radians())) } else { c.vmag };
    if c.kind == TargetKind::Moon {
        area *= (0.5 * (1.0 + libm::cos(moon_phase_deg.to_radians()))).max(0.02);
    }
    if area <= 0.0 {
        return None;
    }
    let mean_mu_v = match (c.surface_mu, vmag) {
        (Some(mu), _) if c.kind != TargetKind::Moon => {
            // OpenNGC's mean surface brightness is B band: V = B − (B−V).
            if c.surface_mu_is_b {
                mu - bv
            } else {
                mu
            }
        }
        (_, Some(m)) => m + 2.5 * libm::log10(area * 3600.0),
        _ => return None,
    };
    Some(ExtendedLight { mean_mu_v, area_arcmin2: area, core_area_frac: core_frac, core_gain_mag: core_gain, bv })
}

fn eyepath(t: &TrainOption, kind: TargetKind, pupil: f64) -> Eyepath {
    let (pt, ps) = t.filter.pass(kind.emission_lines());
    Eyepath {
        aperture_mm: t.aperture_mm,
        magnification: t.magnification,
        eye_pupil_mm: pupil,
        target_transmission: t.transmission * pt,
        sky_transmission: t.transmission * ps,
    }
}

/// Verdict for a candidate through one train under one sky: the same call the
/// planner makes at every step, for the view to draw what the card says
/// (`extinction_mag` at the target's air mass, `sky_mu` the sky at the target).
pub fn assess_candidate(c: &Candidate, t: &TrainOption, eye_pupil_mm: f64, moon_phase_deg: f64, extinction_mag: f64, sky_mu: f64) -> Assessment {
    assess_one(c, light_of(c, moon_phase_deg).as_ref(), t, eye_pupil_mm, extinction_mag, sky_mu)
}

/// Verdict for a candidate through one train under one sky (stars: point-source limit; Sun: filtered trains only).
fn assess_one(c: &Candidate, light: Option<&ExtendedLight>, t: &TrainOption, pupil: f64, ext_mag: f64, sky_mu: f64) -> Assessment {
    let path = eyepath(t, c.kind, pupil);
    if c.kind == TargetKind::Sun {
        let ok = t.solar_filtered;
        let (v, m) = if ok { (Verdict::Easy, 10.0) } else { (Verdict::NotVisible, -10.0) };
        return Assessment { verdict: v, visitor_margin_mag: m, averted_margin_mag: m, core_only: false };
    }
    if c.kind == TargetKind::Star {
        let m = c.vmag.unwrap_or(99.0) + ext_mag;
        let vis_m = vis::telescopic_star_limit_mag(sky_mu, &path, vis::F_VISITOR) - m;
        let av_m = vis::telescopic_star_limit_mag(sky_mu, &path, vis::F_REFERENCE) - m;
        let verdict = if vis_m >= vis::EASY_MARGIN_MAG {
            Verdict::Easy
        } else if vis_m >= 0.0 {
            Verdict::Visible
        } else if av_m >= 0.0 {
            Verdict::AvertedVision
        } else {
            Verdict::NotVisible
        };
        return Assessment { verdict, visitor_margin_mag: vis_m, averted_margin_mag: av_m, core_only: false };
    }
    match light {
        Some(l) => vis::assess(l, ext_mag, sky_mu, SKY_BV, &path),
        None => Assessment { verdict: Verdict::NotVisible, visitor_margin_mag: f64::NEG_INFINITY, averted_margin_mag: f64::NEG_INFINITY, core_only: false },
    }
}

/// Build the grid and every track (positions, clear view, framing, verdicts).
pub fn prepare(input: &PlanInput) -> Result<Prepared, PlanError> {
    input.validate()?;
    let step_d = input.step_minutes / 1440.0;
    let span = input.end_utc_jd - input.start_utc_jd;
    let n = (libm::floor(span / step_d + 1e-9) as usize) + 1;
    if n > MAX_STEPS {
        return Err(PlanError::TooManySteps { steps: n, max: MAX_STEPS });
    }
    let mut steps: Vec<f64> = (0..n).map(|i| input.start_utc_jd + i as f64 * step_d).collect();
    if let Some(last) = steps.last_mut() {
        *last = last.min(input.end_utc_jd);
    }
    let st = SiteTrig::new(&input.site);
    let lst: Vec<f64> = steps.iter().map(|&t| ephem_lite::lst_rad(t, &st)).collect();
    let mut sun_equ = Vec::with_capacity(n);
    let mut sun_alt = Vec::with_capacity(n);
    let mut moon_equ = Vec::with_capacity(n);
    let mut moon_alt = Vec::with_capacity(n);
    let mut moon_phase = Vec::with_capacity(n);
    let mut moon_frac = Vec::with_capacity(n);
    let mut waxing = false;
    let mut moon_par = 0.95;
    for i in 0..n {
        let s = ephem_lite::sun_lite(steps[i]);
        let m = ephem_lite::moon_lite(steps[i]);
        let (ph, fr, wx) = ephem_lite::moon_phase(&s, &m);
        let sh = ephem_lite::horizontal(&s.equ, lst[i], &st);
        let mh = ephem_lite::horizontal(&m.equ, lst[i], &st);
        sun_alt.push(sh.alt_rad);
        sun_equ.push(s.equ);
        moon_alt.push(ephem_lite::moon_topocentric_alt_rad(mh.alt_rad, m.parallax_deg));
        moon_equ.push(m.equ);
        moon_phase.push(ph);
        moon_frac.push(fr);
        waxing = wx;
        moon_par = m.parallax_deg;
    }
    let zenith_mu = input.sky.zenith_mu();
    let k = input.extinction_k_mag;
    let pupil = input.eye_pupil_mm;
    let mid = n / 2;
    let mut tracks = Vec::with_capacity(input.targets.len());
    for c in &input.targets {
        let light = light_of(c, moon_phase[mid]);
        let mut alt = Vec::with_capacity(n);
        let mut az = Vec::with_capacity(n);
        let mut msep = Vec::with_capacity(n);
        let mut ssep = Vec::with_capacity(n);
        let mut clear = Vec::with_capacity(n);
        let fixed = match &c.position {
            TargetPosition::Fixed { ra_rad, dec_rad } => Some((*ra_rad, libm::sin(*dec_rad), libm::cos(*dec_rad))),
            _ => None,
        };
        for i in 0..n {
            let (h, equ) = if let Some((ra, sd, cd)) = fixed {
                (ephem_lite::horizontal_from_ha(lst[i] - ra, sd, cd, &st), Equatorial { ra_rad: ra, dec_rad: libm::atan2(sd, cd) })
            } else {
                match &c.position {
                    TargetPosition::Track { points } => {
                        let e = interp_track(points, steps[i]);
                        (ephem_lite::horizontal(&e, lst[i], &st), e)
                    }
                    TargetPosition::Sun => (ephem_lite::horizontal(&sun_equ[i], lst[i], &st), sun_equ[i]),
                    _ => {
                        let mut hm = ephem_lite::horizontal(&moon_equ[i], lst[i], &st);
                        hm.alt_rad = moon_alt[i];
                        (hm, moon_equ[i])
                    }
                }
            };
            let is_moon = matches!(c.position, TargetPosition::Moon);
            msep.push(if is_moon { 0.0 } else { ephem_lite::separation_rad(&equ, &moon_equ[i]).to_degrees() });
            ssep.push(ephem_lite::separation_rad(&equ, &sun_equ[i]).to_degrees());
            let lim = input.horizon.limit_deg(h.az_rad.to_degrees());
            clear.push(h.alt_rad.to_degrees() >= lim && h.alt_rad > 0.0);
            alt.push(h.alt_rad);
            az.push(h.az_rad);
        }
        // Sky at the target at each step (station independent); the Moon adds no
        // moonlight to its own sky.
        let sky_mu: Vec<f64> = (0..n)
            .map(|i| {
                let l = skyl::sky_nl(&skyl::SkyAt {
                    zenith_mu,
                    k_mag: k,
                    target_alt_rad: alt[i],
                    sun_alt_rad: sun_alt[i],
                    moon_alt_rad: moon_alt[i],
                    moon_phase_angle_rad: moon_phase[i].to_radians(),
                    moon_separation_rad: msep[i].to_radians(),
                });
                skyl::nl_to_mu(if c.kind == TargetKind::Moon { l.dark + l.twilight } else { l.total() })
            })
            .collect();
        // Reference step for framing: highest clear step (or the highest step).
        let ref_i = (0..n)
            .max_by(|&a, &b| (clear[a], alt[a]).partial_cmp(&(clear[b], alt[b])).unwrap_or(core::cmp::Ordering::Equal))
            .unwrap_or(0);
        let mut frames = Vec::with_capacity(input.stations.len());
        let mut views = Vec::with_capacity(input.stations.len());
        for s in &input.stations {
            let ext_ref = skyb::extinction_at_alt_mag(k, alt[ref_i]);
            let mut margin_of = |ti: usize| {
                assess_one(c, light.as_ref(), &s.trains[ti], pupil, ext_ref, sky_mu[ref_i]).averted_margin_mag
            };
            let f = best_frame(c.kind, c.major_arcmin, &s.trains, pupil, input.seeing_arcsec, &mut margin_of);
            let v: Vec<StepView> = match &f {
                Some(fc) => (0..n)
                    .map(|i| {
                        if !clear[i] {
                            return StepView { verdict: Verdict::NotVisible, averted_margin_mag: f32::NEG_INFINITY };
                        }
                        let a = assess_one(c, light.as_ref(), &s.trains[fc.train_index], pupil, skyb::extinction_at_alt_mag(k, alt[i]), sky_mu[i]);
                        StepView { verdict: a.verdict, averted_margin_mag: a.averted_margin_mag as f32 }
                    })
                    .collect(),
                None => Vec::new(),
            };
            frames.push(f);
            views.push(v);
        }
        tracks.push(Track { alt_rad: alt, az_rad: az, moon_sep_deg: msep, sun_sep_deg: ssep, sky_mu, clear, frames, views });
    }
    Ok(Prepared {
        input: input.clone(),
        steps_utc_jd: steps,
        sun_alt_rad: sun_alt,
        moon_alt_rad: moon_alt,
        moon_phase_angle_deg: moon_phase,
        moon_illuminated: moon_frac,
        moon_waxing: waxing,
        moon_distance_km: 6378.14 / libm::sin(moon_par.to_radians()),
        tracks,
    })
}

/// A span of time in clear view.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Window {
    pub start_utc_jd: f64,
    pub end_utc_jd: f64,
}

pub use super::assign::{plan_night, Plan};
