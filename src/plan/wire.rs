//! Filling the planner's input from the other modules: trains from
//! `optics::figures`, deep-sky candidates from `sky::dso` (precessed to the
//! equator of date with `sky::frames::npb_matrix`), planets, Moon and Sun from
//! `solar` (sampled tracks), Jupiter's moon events as timed events.

use super::input::{Candidate, Filter, TargetKind, TargetPosition, TimedEvent, TrackPoint, TrainOption};
use super::height::{MountGeometry, MountKind};
use super::input::Station;
use crate::optics::{self, Accessory, Design, FilterKind, Instrument, Mode, Mount, OpticsError, Train};
use crate::sky::dso::{Dso, DsoKind};
use crate::sky::frames::{npb_matrix, ra_dec_of, unit_vector};
use crate::sky::Site;
use crate::solar::jupiter_events::{moon_events, EventKind};
use crate::solar::{body_apparent, BodyId, Ephemeris, SolarError};
use crate::time::{Instant, TimeError};
use core::fmt;

/// Nebula band-pass filters pass the [O III]/Hβ lines at about this fraction
/// (from memory, typical for such filters); optics' filter transmission is taken as the continuum pass.
pub const BANDPASS_LINE_TRANSMISSION: f64 = 0.85;

/// Why the solar-system candidates could not be built.
#[derive(Clone, Debug, PartialEq)]
pub enum WireError {
    Time(TimeError),
    Solar(SolarError),
}

impl fmt::Display for WireError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            WireError::Time(e) => write!(f, "event time: {e}"),
            WireError::Solar(e) => write!(f, "solar-system positions: {e}"),
        }
    }
}

impl std::error::Error for WireError {}

impl From<TimeError> for WireError {
    fn from(e: TimeError) -> Self {
        WireError::Time(e)
    }
}
impl From<SolarError> for WireError {
    fn from(e: SolarError) -> Self {
        WireError::Solar(e)
    }
}

/// The planner's view of one visual train (None for camera and phone trains).
/// `label` names it on the card; `orientation_note` comes from `orient::describe`.
pub fn train_option(train: &Train, label: &str, orientation_note: &str) -> Result<Option<TrainOption>, OpticsError> {
    let fig = optics::figures(train)?;
    let Some(mag) = fig.magnification.filter(|_| fig.mode == Mode::Visual) else {
        return Ok(None);
    };
    let mut filter_t = 1.0;
    let mut filter = Filter::None;
    let mut solar = false;
    for a in &train.accessories {
        if let Accessory::Filter(f) = a {
            filter_t *= f.transmission;
            match f.filter {
                FilterKind::Solar => solar = true,
                FilterKind::Neutral | FilterKind::Colour => {
                    filter = Filter::Neutral { transmission: f.transmission };
                }
                FilterKind::NebulaBandPass => {
                    filter = Filter::NebulaBand { line_transmission: BANDPASS_LINE_TRANSMISSION, continuum_transmission: f.transmission };
                }
            }
        }
    }
    // figures' transmission includes the filters; the planner applies the filter itself.
    let base = if filter_t > 0.0 { (fig.transmission / filter_t).clamp(0.01, 1.0) } else { fig.transmission.clamp(0.01, 1.0) };
    Ok(Some(TrainOption {
        label: label.to_string(),
        aperture_mm: fig.aperture_mm,
        magnification: mag,
        true_field_deg: fig.true_field_rad.to_degrees(),
        transmission: base,
        filter,
        solar_filtered: solar,
        orientation_note: orientation_note.to_string(),
    }))
}

fn kind_of(k: DsoKind) -> Option<TargetKind> {
    use DsoKind::*;
    Some(match k {
        Galaxy | GalaxyPair | GalaxyTriplet | GalaxyGroup => TargetKind::Galaxy,
        GlobularCluster => TargetKind::GlobularCluster,
        OpenCluster | Association => TargetKind::OpenCluster,
        PlanetaryNebula => TargetKind::PlanetaryNebula,
        // A cluster with nebula (M 42) is shown for its glow; its stars come from the star catalogs.
        ClusterNebula | HiiRegion | EmissionNebula | Nebula | SupernovaRemnant => TargetKind::EmissionNebula,
        ReflectionNebula => TargetKind::ReflectionNebula,
        Star | DoubleStar => TargetKind::Star,
        DarkNebula | Nova | Other => return None,
    })
}

/// Whether an OpenNGC record is offered to the planner as a deep-sky sight: every Messier
/// object (M 40 is a double star), and NGC/IC objects brighter than `vmag_limit` (V, else B)
/// unless OpenNGC types them as a single or double star ("*", "**"): such records are stars
/// that got an NGC/IC number ("NGC 1990" is Alnilam), not deep-sky objects.
pub fn is_deep_sky_candidate(d: &Dso, vmag_limit: f64) -> bool {
    if d.messier > 0 {
        return true;
    }
    if matches!(d.kind, DsoKind::Star | DsoKind::DoubleStar) {
        return false;
    }
    d.vmag.or(d.bmag).map(|m| f64::from(m) <= vmag_limit).unwrap_or(false)
}

/// A deep-sky candidate from an OpenNGC record, its J2000 place carried to the
/// equator and equinox of date at `tt_jd` (IAU 2006/2000B NPB matrix of `sky::frames`).
/// None for kinds the planner does not show (dark nebulae, novae) or records without size and brightness.
pub fn candidate_from_dso(d: &Dso, tt_jd: f64) -> Option<Candidate> {
    candidate_from_dso_with(d, &npb_matrix(tt_jd))
}

/// Same, with the NPB matrix computed once for many objects.
pub fn candidate_from_dso_with(d: &Dso, npb: &glam::DMat3) -> Option<Candidate> {
    let kind = kind_of(d.kind)?;
    let major = d.major_arcmin.map(f64::from).filter(|m| *m > 0.0).unwrap_or(if kind == TargetKind::Star { 0.01 } else { 1.0 });
    let minor = d.minor_arcmin.map(f64::from).filter(|m| *m > 0.0).unwrap_or(major);
    let vmag = d.vmag.or(d.bmag).map(f64::from);
    let sb = d.surf_br_mag_arcsec2.map(f64::from);
    if vmag.is_none() && sb.is_none() {
        return None;
    }
    let (ra, dec) = ra_dec_of(*npb * unit_vector(d.ra_rad, d.dec_rad));
    let designation = d.designation();
    let name = match d.common_names.first() {
        Some(c) => format!("{designation} ({c})"),
        None => designation.clone(),
    };
    Some(Candidate {
        id: designation,
        name,
        kind,
        position: TargetPosition::Fixed { ra_rad: crate::math::rem_euclid(ra, core::f64::consts::TAU), dec_rad: dec },
        major_arcmin: major,
        minor_arcmin: minor,
        vmag,
        surface_mu: sb,
        surface_mu_is_b: true,
        bv: match (d.bmag, d.vmag) {
            (Some(b), Some(v)) if (b - v).abs() < 2.5 => Some(f64::from(b - v)),
            _ => None,
        },
        distance_ly: None,
        distance_au: None,
    })
}

/// Sun, Moon and planets as candidates: planets as tracks sampled every
/// `sample_hours` from `solar::body_apparent` (topocentric, of date); the Moon and
/// the Sun keep the planner's own positions (it also needs them every step) with sizes and distances from `solar`.
pub fn body_candidates(eph: &Ephemeris, site: &Site, start_utc_jd: f64, end_utc_jd: f64, sample_hours: f64) -> Result<Vec<Candidate>, WireError> {
    let step = (sample_hours.clamp(0.25, 6.0)) / 24.0;
    let n = (((end_utc_jd - start_utc_jd) / step).ceil().max(1.0) as usize).min(200) + 1;
    let mid = Instant::from_utc_jd(0.5 * (start_utc_jd + end_utc_jd))?;
    let mut out = Vec::new();
    for body in BodyId::ALL {
        let at_mid = body_apparent(eph, body, &mid, site)?;
        let (kind, position) = match body {
            BodyId::Sun => (TargetKind::Sun, TargetPosition::Sun),
            BodyId::Moon => (TargetKind::Moon, TargetPosition::Moon),
            _ => {
                let mut points = Vec::with_capacity(n);
                for i in 0..n {
                    let jd = (start_utc_jd + i as f64 * step).min(end_utc_jd);
                    let s = body_apparent(eph, body, &Instant::from_utc_jd(jd)?, site)?;
                    points.push(TrackPoint { utc_jd: jd, ra_rad: s.topocentric.ra_rad, dec_rad: s.topocentric.dec_rad });
                }
                (TargetKind::Planet, TargetPosition::Track { points })
            }
        };
        let name = body.name();
        let mut cap = name.chars();
        let title: String = cap.next().map(|c| c.to_ascii_uppercase()).into_iter().chain(cap).collect();
        out.push(Candidate {
            id: name.to_string(),
            name: title,
            kind,
            position,
            major_arcmin: at_mid.diameter_arcsec / 60.0,
            minor_arcmin: at_mid.diameter_arcsec / 60.0,
            vmag: Some(at_mid.vmag),
            surface_mu: None,
            surface_mu_is_b: false,
            bv: None,
            distance_ly: None,
            distance_au: Some(at_mid.distance_au),
        });
    }
    Ok(out)
}

const MOON_NAMES: [&str; 4] = ["Io", "Europa", "Ganymede", "Callisto"];

/// Jupiter's moon events during the event as timed events for the cards and the timeline (from `solar::jupiter_events`).
pub fn jupiter_timed_events(eph: &Ephemeris, start_utc_jd: f64, end_utc_jd: f64) -> Result<Vec<TimedEvent>, WireError> {
    let start = Instant::from_utc_jd(start_utc_jd)?;
    let tt_minus_utc = start.tt_jd - start.utc_jd;
    let events = moon_events(eph, start_utc_jd + tt_minus_utc, end_utc_jd + tt_minus_utc)?;
    Ok(events
        .into_iter()
        .filter(|e| e.visible)
        .map(|e| {
            let m = MOON_NAMES.get(e.moon as usize).copied().unwrap_or("a moon");
            let text = match e.kind {
                EventKind::TransitStart => format!("{m} starts to cross Jupiter's disc"),
                EventKind::TransitEnd => format!("{m} leaves Jupiter's disc"),
                EventKind::ShadowStart => format!("{m}'s shadow starts to cross Jupiter"),
                EventKind::ShadowEnd => format!("{m}'s shadow leaves Jupiter"),
                EventKind::OccultationStart => format!("{m} disappears behind Jupiter"),
                EventKind::OccultationEnd => format!("{m} reappears from behind Jupiter"),
                EventKind::EclipseStart => format!("{m} fades into Jupiter's shadow"),
                EventKind::EclipseEnd => format!("{m} reappears out of Jupiter's shadow"),
            };
            TimedEvent { target_id: "jupiter".to_string(), start_utc_jd: e.tt_jd - tt_minus_utc, end_utc_jd: None, text }
        })
        .collect())
}

/// Typical eyepiece geometry for a train's instrument and mount, scaled from the
/// presets in `height.rs` by focal length or aperture (common practice; the user
/// can measure and override): a Newtonian on an alt-azimuth mount sits in a rocker
/// box, a refractor on a tripod with a diagonal, a Cassegrain on a fork.
pub fn mount_geometry_for(train: &Train) -> MountGeometry {
    let diagonal = train.accessories.iter().any(|a| matches!(a, Accessory::StarDiagonal(_)));
    let eq = matches!(train.mount, Mount::Equatorial { .. });
    match &train.instrument {
        Instrument::Telescope(t) => {
            let fl = t.focal_length_mm.clamp(100.0, 5000.0);
            let ap = t.aperture_mm.clamp(20.0, 1000.0);
            let up = if diagonal { 90.0 } else { 0.0 };
            match t.design {
                Design::Newtonian { .. } if !eq => MountGeometry {
                    kind: MountKind::DobsonianRocker,
                    pivot_height_mm: 0.43 * fl,
                    along_tube_mm: 0.67 * fl,
                    up_offset_mm: 0.0,
                },
                Design::Newtonian { .. } => MountGeometry { kind: MountKind::Equatorial, pivot_height_mm: 1200.0, along_tube_mm: 0.5 * fl, up_offset_mm: 0.0 },
                Design::Refractor => MountGeometry {
                    kind: if eq { MountKind::Equatorial } else { MountKind::TripodRefractor },
                    pivot_height_mm: 1250.0,
                    along_tube_mm: -0.63 * fl,
                    up_offset_mm: up,
                },
                _ => MountGeometry {
                    kind: if eq { MountKind::Equatorial } else { MountKind::ForkCassegrain },
                    pivot_height_mm: 1150.0,
                    along_tube_mm: -1.4 * ap,
                    up_offset_mm: if diagonal { 100.0 } else { 0.0 },
                },
            }
        }
        // Hand-held or small instruments: at the eye of a standing adult.
        _ => MountGeometry { kind: MountKind::TripodRefractor, pivot_height_mm: 1450.0, along_tube_mm: 0.0, up_offset_mm: 0.0 },
    }
}

/// A planner station from a name and the station's trains (one per eyepiece):
/// visual trains only; the geometry from the first telescope train.
pub fn station_from_trains(name: &str, trains: &[Train], orientation_notes: &[String]) -> Result<Station, OpticsError> {
    let mut options = Vec::new();
    for (i, t) in trains.iter().enumerate() {
        let label = if t.name.is_empty() { format!("train {}", i + 1) } else { t.name.clone() };
        let note = orientation_notes.get(i).map(String::as_str).unwrap_or("");
        if let Some(o) = train_option(t, &label, note)? {
            options.push(o);
        }
    }
    let mount = trains.first().map(mount_geometry_for).unwrap_or_else(MountGeometry::refractor_80_600_tripod);
    Ok(Station { name: name.to_string(), mount, trains: options })
}
