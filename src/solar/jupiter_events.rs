//! Timed events of the Galilean moons for a night: transits, shadow transits,
//! occultations and eclipses, found by scanning the moon theory of
//! `jupiter.rs` in 2-minute steps and bisecting each change to ~1 s.

use super::jupiter::{galilean_moons, MoonOffset, MoonSituation};
use super::{Ephemeris, SolarError};
use glam::DVec3;
use serde::{Deserialize, Serialize};

/// What happens at an event.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum EventKind {
    TransitStart,
    TransitEnd,
    ShadowStart,
    ShadowEnd,
    /// The moon disappears behind the disc.
    OccultationStart,
    OccultationEnd,
    /// The moon enters Jupiter's shadow (seen only if it is not behind the disc).
    EclipseStart,
    EclipseEnd,
}

/// One event: which moon (0 Io, 1 Europa, 2 Ganymede, 3 Callisto), what, when.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MoonEvent {
    pub moon: u8,
    pub kind: EventKind,
    pub tt_jd: f64,
    /// False for an eclipse that happens while the moon is behind the disc.
    pub visible: bool,
}

#[derive(Clone, Copy, PartialEq)]
struct Flags {
    transit: bool,
    shadow: bool,
    occulted: bool,
    eclipsed: bool,
}

fn flags(m: &MoonOffset) -> Flags {
    Flags {
        transit: m.situation == MoonSituation::Transit,
        shadow: m.shadow_on_disc,
        occulted: m.situation == MoonSituation::Occulted,
        // `situation` hides an eclipse behind the disc; recompute from the shadow test.
        eclipsed: m.situation == MoonSituation::Eclipsed || m.in_shadow,
    }
}

fn field(f: &Flags, k: usize) -> bool {
    [f.transit, f.shadow, f.occulted, f.eclipsed][k]
}

const KINDS: [(EventKind, EventKind); 4] = [
    (EventKind::TransitStart, EventKind::TransitEnd),
    (EventKind::ShadowStart, EventKind::ShadowEnd),
    (EventKind::OccultationStart, EventKind::OccultationEnd),
    (EventKind::EclipseStart, EventKind::EclipseEnd),
];

/// All events between two TT Julian dates (at most 3 days apart), in time order.
pub fn moon_events(eph: &Ephemeris, start_tt_jd: f64, end_tt_jd: f64) -> Result<Vec<MoonEvent>, SolarError> {
    if !(start_tt_jd.is_finite() && end_tt_jd.is_finite()) {
        return Err(SolarError::NotFinite { field: "night start/end" });
    }
    let mut out = Vec::new();
    if end_tt_jd <= start_tt_jd || end_tt_jd - start_tt_jd > 3.0 {
        return Ok(out);
    }
    let step = 2.0 / 1440.0;
    let at = |t: f64| galilean_moons(eph, t, DVec3::Z);
    let mut t0 = start_tt_jd;
    let mut prev = at(t0)?.map(|m| flags(&m));
    while t0 < end_tt_jd {
        let t1 = (t0 + step).min(end_tt_jd);
        let now = at(t1)?.map(|m| flags(&m));
        for moon in 0..4 {
            for (k, (on, off)) in KINDS.iter().enumerate() {
                let (a, b) = (field(&prev[moon], k), field(&now[moon], k));
                if a == b {
                    continue;
                }
                let (mut lo, mut hi) = (t0, t1);
                for _ in 0..7 {
                    let mid = 0.5 * (lo + hi);
                    if field(&flags(&at(mid)?[moon]), k) == a {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                let t = 0.5 * (lo + hi);
                let visible = k != 3 || !flags(&at(t)?[moon]).occulted;
                out.push(MoonEvent { moon: moon as u8, kind: if b { *on } else { *off }, tt_jd: t, visible });
            }
        }
        prev = now;
        t0 = t1;
    }
    crate::sort::sort_by(&mut out, |x, y| x.tt_jd.total_cmp(&y.tt_jd));
    Ok(out)
}
