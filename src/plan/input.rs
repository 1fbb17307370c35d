//! The planner's input: plain serde values. The engine fills trains from
//! `optics::figures`, DSOs from `sky::dso`, planets from `solar`.

use super::height::MountGeometry;
use super::sky_brightness::SkyBrightness;
use super::{check_range, PlanError};
use crate::sky::Site;
use serde::{Deserialize, Serialize};

/// Everything about the night.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanInput {
    pub site: Site,
    /// Local clock offset from UTC for the cards, minutes.
    #[serde(default)]
    pub utc_offset_minutes: i32,
    pub start_utc_jd: f64,
    pub end_utc_jd: f64,
    #[serde(default = "default_step")]
    pub step_minutes: f64,
    #[serde(default)]
    pub horizon: HorizonMask,
    pub sky: SkyBrightness,
    /// V extinction coefficient, mag per air mass (0.2 for an ordinary lowland site: common practice).
    #[serde(default = "default_k")]
    pub extinction_k_mag: f64,
    /// Seeing, FWHM arcsec (2″ is ordinary: common practice).
    #[serde(default = "default_seeing")]
    pub seeing_arcsec: f64,
    /// Warn when the Sun is within this angle of a target while it is up or in twilight, deg.
    #[serde(default = "default_sun_caution")]
    pub sun_caution_deg: f64,
    /// Length of one showing at a station, minutes.
    #[serde(default = "default_slot")]
    pub slot_minutes: f64,
    /// Eye pupil assumed for visitors, mm (6 mm for a mixed public: common practice).
    #[serde(default = "default_pupil")]
    pub eye_pupil_mm: f64,
    pub stations: Vec<Station>,
    pub targets: Vec<Candidate>,
    /// Timed events of the night from the solar module (moon shadow transits, ...).
    #[serde(default)]
    pub events: Vec<TimedEvent>,
}

fn default_step() -> f64 {
    5.0
}
fn default_k() -> f64 {
    0.2
}
fn default_seeing() -> f64 {
    2.0
}
fn default_sun_caution() -> f64 {
    20.0
}
fn default_slot() -> f64 {
    30.0
}
fn default_pupil() -> f64 {
    6.0
}

/// The local horizon: a minimum altitude and blocked azimuth ranges.
#[derive(Clone, Debug, Default, PartialEq, Serialize, Deserialize)]
pub struct HorizonMask {
    pub min_alt_deg: f64,
    #[serde(default)]
    pub obstructions: Vec<Obstruction>,
}

/// Trees, a building...: below `alt_deg` between two azimuths (north = 0, east = 90;
/// from > to wraps through north).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Obstruction {
    pub az_from_deg: f64,
    pub az_to_deg: f64,
    pub alt_deg: f64,
}

/// A range of azimuths (from > to wraps through north), e.g. a clouded sector.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct AzSector {
    pub az_from_deg: f64,
    pub az_to_deg: f64,
}

impl AzSector {
    pub fn contains_deg(&self, az_deg: f64) -> bool {
        az_in(az_deg, self.az_from_deg, self.az_to_deg)
    }
}

/// Whether `az` lies in [from, to], wrapping through north when from > to.
pub fn az_in(az_deg: f64, from_deg: f64, to_deg: f64) -> bool {
    let a = crate::math::rem_euclid(az_deg, 360.0);
    let f = crate::math::rem_euclid(from_deg, 360.0);
    let t = crate::math::rem_euclid(to_deg, 360.0);
    if f <= t {
        a >= f && a <= t
    } else {
        a >= f || a <= t
    }
}

impl HorizonMask {
    /// Lowest altitude at which a target at `az_deg` is in clear view, deg.
    pub fn limit_deg(&self, az_deg: f64) -> f64 {
        let mut lim = self.min_alt_deg;
        for o in &self.obstructions {
            if az_in(az_deg, o.az_from_deg, o.az_to_deg) && o.alt_deg > lim {
                lim = o.alt_deg;
            }
        }
        lim
    }
}

/// One telescope on the field with what it can be set up as.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Station {
    pub name: String,
    pub mount: MountGeometry,
    /// The eyepiece/accessory combinations of this telescope.
    pub trains: Vec<TrainOption>,
}

/// One optical train's figures, as `optics::figures` gives them.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TrainOption {
    /// "25 mm eyepiece", "10 mm + 2× Barlow lens"...
    pub label: String,
    pub aperture_mm: f64,
    pub magnification: f64,
    pub true_field_deg: f64,
    /// Light reaching the eye, 0–1 (mirrors, lenses, central obstruction).
    #[serde(default = "default_transmission")]
    pub transmission: f64,
    #[serde(default)]
    pub filter: Filter,
    /// A proper full-aperture solar filter is fitted: this train is for the Sun only.
    #[serde(default)]
    pub solar_filtered: bool,
    /// Which way up/mirrored, from `orient::describe`.
    #[serde(default)]
    pub orientation_note: String,
}

fn default_transmission() -> f64 {
    0.8
}

/// A visual filter, entering the verdict through its transmissions.
#[derive(Clone, Copy, Debug, Default, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case", tag = "kind")]
pub enum Filter {
    #[default]
    None,
    /// Grey (Moon filter): the same for object and sky.
    Neutral { transmission: f64 },
    /// Nebula band-pass: passes emission-line light, cuts the sky and starlight.
    NebulaBand { line_transmission: f64, continuum_transmission: f64 },
}

impl Filter {
    /// (object, sky) transmission for an object that shines in emission lines or not.
    pub fn pass(&self, emission_lines: bool) -> (f64, f64) {
        match *self {
            Filter::None => (1.0, 1.0),
            Filter::Neutral { transmission } => (transmission, transmission),
            Filter::NebulaBand { line_transmission, continuum_transmission } => {
                if emission_lines {
                    (line_transmission, continuum_transmission)
                } else {
                    (continuum_transmission, continuum_transmission)
                }
            }
        }
    }
}

/// What kind of target: decides framing, colour and core assumptions.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum TargetKind {
    Sun,
    Moon,
    Planet,
    Galaxy,
    GlobularCluster,
    OpenCluster,
    PlanetaryNebula,
    EmissionNebula,
    ReflectionNebula,
    Star,
    Other,
}

impl TargetKind {
    pub fn is_body(self) -> bool {
        matches!(self, TargetKind::Sun | TargetKind::Moon | TargetKind::Planet)
    }
    pub fn emission_lines(self) -> bool {
        matches!(self, TargetKind::PlanetaryNebula | TargetKind::EmissionNebula)
    }
}

/// Where a target is.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case", tag = "by")]
pub enum TargetPosition {
    /// Fixed during the night (DSOs, stars): equator and equinox of date.
    Fixed { ra_rad: f64, dec_rad: f64 },
    /// A moving body sampled through the night (planets from `solar`), interpolated linearly.
    Track { points: Vec<TrackPoint> },
    /// Computed by the planner (low-precision Sun/Moon of `ephem_lite`).
    Sun,
    Moon,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct TrackPoint {
    pub utc_jd: f64,
    pub ra_rad: f64,
    pub dec_rad: f64,
}

/// A target the planner may schedule.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Candidate {
    /// Stable id ("M31", "jupiter").
    pub id: String,
    pub name: String,
    pub kind: TargetKind,
    pub position: TargetPosition,
    /// Apparent size (major, minor axis), arcmin. Bodies: their diameter.
    pub major_arcmin: f64,
    pub minor_arcmin: f64,
    /// Integrated V magnitude, if known.
    #[serde(default)]
    pub vmag: Option<f64>,
    /// Mean surface brightness as catalogued (OpenNGC: mostly B band), mag/arcsec².
    #[serde(default)]
    pub surface_mu: Option<f64>,
    /// Whether `surface_mu` is B band (OpenNGC) rather than V.
    #[serde(default)]
    pub surface_mu_is_b: bool,
    #[serde(default)]
    pub bv: Option<f64>,
    /// Distance for the talking points.
    #[serde(default)]
    pub distance_ly: Option<f64>,
    #[serde(default)]
    pub distance_au: Option<f64>,
}

/// A timed event of the night, from `solar` (e.g. a moon's shadow on Jupiter).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TimedEvent {
    pub target_id: String,
    pub start_utc_jd: f64,
    #[serde(default)]
    pub end_utc_jd: Option<f64>,
    pub text: String,
}

impl PlanInput {
    /// Check every number a user or a link can set.
    pub fn validate(&self) -> Result<(), PlanError> {
        check_range("site latitude", self.site.lat_rad.to_degrees(), -90.0, 90.0, "between -90° and 90°")?;
        check_range("site longitude", self.site.lon_rad.to_degrees(), -360.0, 360.0, "between -180° and 180°")?;
        check_range("time step", self.step_minutes, 0.5, 60.0, "between 0.5 and 60 minutes")?;
        check_range("minimum altitude", self.horizon.min_alt_deg, -5.0, 80.0, "between -5° and 80°")?;
        for o in &self.horizon.obstructions {
            check_range("obstruction altitude", o.alt_deg, -5.0, 90.0, "between -5° and 90°")?;
            check_range("obstruction azimuth", o.az_from_deg, -360.0, 720.0, "between 0° and 360°")?;
            check_range("obstruction azimuth", o.az_to_deg, -360.0, 720.0, "between 0° and 360°")?;
        }
        check_range("sky brightness", self.sky.zenith_mu(), 14.0, 23.0, "between 14 and 23 mag/arcsec²")?;
        check_range("extinction", self.extinction_k_mag, 0.05, 1.5, "between 0.05 and 1.5 mag per air mass")?;
        check_range("seeing", self.seeing_arcsec, 0.3, 10.0, "between 0.3″ and 10″")?;
        check_range("Sun caution angle", self.sun_caution_deg, 0.0, 90.0, "between 0° and 90°")?;
        check_range("showing length", self.slot_minutes, 5.0, 240.0, "between 5 and 240 minutes")?;
        check_range("eye pupil", self.eye_pupil_mm, 2.0, 9.0, "between 2 and 9 mm")?;
        let span = self.end_utc_jd - self.start_utc_jd;
        if !(self.start_utc_jd.is_finite() && span.is_finite() && span > 0.0 && span <= 1.0) {
            return Err(PlanError::BadWindow { start_utc_jd: self.start_utc_jd, end_utc_jd: self.end_utc_jd });
        }
        for s in &self.stations {
            s.mount.validate()?;
            for t in &s.trains {
                check_range("aperture", t.aperture_mm, 5.0, 2000.0, "between 5 and 2000 mm")?;
                check_range("magnification", t.magnification, 1.0, 2000.0, "between 1× and 2000×")?;
                check_range("true field", t.true_field_deg, 0.01, 30.0, "between 0.01° and 30°")?;
                check_range("transmission", t.transmission, 0.01, 1.0, "between 0.01 and 1")?;
                let (a, b) = t.filter.pass(true);
                check_range("filter transmission", a, 0.0, 1.0, "between 0 and 1")?;
                check_range("filter transmission", b, 0.0, 1.0, "between 0 and 1")?;
            }
        }
        for c in &self.targets {
            check_range("target size", c.major_arcmin, 0.0, 1200.0, "between 0′ and 1200′")?;
            check_range("target size", c.minor_arcmin, 0.0, 1200.0, "between 0′ and 1200′")?;
            if let Some(m) = c.surface_mu {
                check_range("surface brightness", m, -15.0, 30.0, "between -15 and 30 mag/arcsec²")?;
            }
            if let Some(m) = c.vmag {
                check_range("magnitude", m, -30.0, 30.0, "between -30 and 30")?;
            }
            match &c.position {
                TargetPosition::Fixed { ra_rad, dec_rad } => {
                    check_range("target RA", *ra_rad, -7.0, 14.0, "between 0 and 2π rad")?;
                    check_range("target Dec", *dec_rad, -core::f64::consts::FRAC_PI_2 - 1e-9, core::f64::consts::FRAC_PI_2 + 1e-9, "between -π/2 and π/2 rad")?;
                }
                TargetPosition::Track { points } => {
                    for p in points {
                        check_range("track RA", p.ra_rad, -7.0, 14.0, "between 0 and 2π rad")?;
                        check_range("track Dec", p.dec_rad, -core::f64::consts::FRAC_PI_2 - 1e-9, core::f64::consts::FRAC_PI_2 + 1e-9, "between -π/2 and π/2 rad")?;
                        check_range("track time", p.utc_jd, 0.0, 1.0e7, "a UTC Julian date")?;
                    }
                }
                _ => {}
            }
        }
        Ok(())
    }
}
