//! Rise, culmination and set by root finding on an altitude function, and
//! twilight from a low-precision Sun.
//!
//! Method: sample altitude − horizon every 10 minutes, bracket each sign change and
//! refine it by bisection to 0.1 s; find each extremum on the grid by golden-section
//! search. An extremum that crosses the horizon between two samples on the same side
//! (a grazing pass shorter than the step) is caught that way and bracketed on both
//! sides. Circumpolar and never-rising cases are reported as such, not forced.
//! Sun for twilight: the Astronomical Almanac's low-precision formulas (section C,
//! ~0.01° over 1950–2050).

use std::fmt;

use crate::sky::horizon::{to_horizontal, validate_site, SiteError};
use crate::sky::{Equatorial, Site};
use crate::time::{Instant, MAX_UTC_JD, MIN_UTC_JD};

/// Grid step, days (10 min).
const STEP_DAYS: f64 = 10.0 / 1440.0;
/// Root tolerance, days (0.1 s).
const TOL_DAYS: f64 = 0.1 / 86_400.0;
/// Longest search window, days.
pub const MAX_WINDOW_DAYS: f64 = 40.0;

/// Sunrise/sunset horizon: Sun's centre 50′ below the geometric horizon (34′ of
/// refraction + 16′ semidiameter), common practice (almanacs use −0.8333°).
pub const SUNRISE_HORIZON_RAD: f64 = -0.833_333_333_333_333_3 * std::f64::consts::PI / 180.0;
/// A star's rise/set horizon: 34′ of refraction at the horizon, common practice.
pub const STAR_HORIZON_RAD: f64 = -0.566_666_666_666_666_7 * std::f64::consts::PI / 180.0;

#[derive(Clone, Debug, PartialEq)]
pub enum RiseSetError {
    Window { start_utc_jd: f64, end_utc_jd: f64 },
    NotFinite { utc_jd: f64 },
    Site(SiteError),
}

impl fmt::Display for RiseSetError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            RiseSetError::Window { start_utc_jd, end_utc_jd } => write!(
                f,
                "search window {start_utc_jd}..{end_utc_jd} (UTC Julian dates) is not valid: it must run forward, last at most {MAX_WINDOW_DAYS} days, and lie within 1900-2100"
            ),
            RiseSetError::NotFinite { utc_jd } => write!(f, "the altitude could not be computed at UTC Julian date {utc_jd}"),
            RiseSetError::Site(e) => write!(f, "{e}"),
        }
    }
}

impl std::error::Error for RiseSetError {}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum EventKind {
    Rise,
    Set,
    /// Highest altitude (upper culmination; the meridian transit for a fixed star).
    Culmination,
    /// Lowest altitude (lower culmination).
    LowestPoint,
}

#[derive(Clone, Copy, Debug, PartialEq)]
pub struct AltEvent {
    pub kind: EventKind,
    pub utc_jd: f64,
    pub alt_rad: f64,
}

/// What the object does against the horizon over the whole window.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Circumstance {
    CrossesHorizon,
    AlwaysAbove,
    AlwaysBelow,
}

#[derive(Clone, Debug, PartialEq)]
pub struct RiseTransitSet {
    /// All events in time order.
    pub events: Vec<AltEvent>,
    pub circumstance: Circumstance,
    pub rise_utc_jd: Option<f64>,
    pub transit_utc_jd: Option<f64>,
    pub set_utc_jd: Option<f64>,
    pub max_alt_rad: f64,
}

fn check_window(start: f64, end: f64) -> Result<(), RiseSetError> {
    let ok = start.is_finite() && end.is_finite() && end > start && end - start <= MAX_WINDOW_DAYS
        && start >= MIN_UTC_JD && end < MAX_UTC_JD;
    if ok { Ok(()) } else { Err(RiseSetError::Window { start_utc_jd: start, end_utc_jd: end }) }
}

fn bisect(f: &impl Fn(f64) -> f64, mut a: f64, mut b: f64, mut fa: f64) -> f64 {
    while b - a > TOL_DAYS {
        let m = 0.5 * (a + b);
        let fm = f(m);
        if (fm > 0.0) == (fa > 0.0) { a = m; fa = fm; } else { b = m; }
    }
    0.5 * (a + b)
}

/// Golden-section search for the maximum of `sign·f` on [a, b].
fn golden(f: &impl Fn(f64) -> f64, mut a: f64, mut b: f64, sign: f64) -> f64 {
    const R: f64 = 0.618_033_988_749_894_8;
    let mut c = b - R * (b - a);
    let mut d = a + R * (b - a);
    let (mut fc, mut fd) = (sign * f(c), sign * f(d));
    while b - a > TOL_DAYS {
        if fc > fd { b = d; d = c; fd = fc; c = b - R * (b - a); fc = sign * f(c); }
        else { a = c; c = d; fc = fd; d = a + R * (b - a); fd = sign * f(d); }
    }
    0.5 * (a + b)
}

/// Rise, culmination and set of any object, by root finding on `alt_at(utc_jd)`
/// (geometric or refracted altitude, radians) against `horizon_rad`, over a window
/// of at most 40 days. Grazing passes are found via the extrema (see module doc).
pub fn rise_transit_set(
    alt_at: impl Fn(f64) -> f64,
    start_utc_jd: f64,
    end_utc_jd: f64,
    horizon_rad: f64,
) -> Result<RiseTransitSet, RiseSetError> {
    check_window(start_utc_jd, end_utc_jd)?;
    let f = |t: f64| alt_at(t) - horizon_rad;
    let n = ((end_utc_jd - start_utc_jd) / STEP_DAYS).ceil().max(2.0) as usize;
    let step = (end_utc_jd - start_utc_jd) / n as f64;
    let ts: Vec<f64> = (0..=n).map(|i| start_utc_jd + i as f64 * step).collect();
    let mut fs = Vec::with_capacity(ts.len());
    for &t in &ts {
        let v = f(t);
        if !v.is_finite() {
            return Err(RiseSetError::NotFinite { utc_jd: t });
        }
        fs.push(v);
    }
    let mut events = Vec::new();
    let mut crossing = vec![false; n];
    for i in 0..n {
        if (fs[i] > 0.0) != (fs[i + 1] > 0.0) {
            crossing[i] = true;
            let t = bisect(&f, ts[i], ts[i + 1], fs[i]);
            let kind = if fs[i + 1] > fs[i] { EventKind::Rise } else { EventKind::Set };
            events.push(AltEvent { kind, utc_jd: t, alt_rad: horizon_rad });
        }
    }
    let mut max_alt = fs.iter().cloned().fold(f64::NEG_INFINITY, f64::max) + horizon_rad;
    for i in 1..n {
        let is_max = fs[i] >= fs[i - 1] && fs[i] > fs[i + 1];
        let is_min = fs[i] <= fs[i - 1] && fs[i] < fs[i + 1];
        if !(is_max || is_min) {
            continue;
        }
        let sign = if is_max { 1.0 } else { -1.0 };
        let te = golden(&f, ts[i - 1], ts[i + 1], sign);
        let fe = f(te);
        if !fe.is_finite() {
            return Err(RiseSetError::NotFinite { utc_jd: te });
        }
        let kind = if is_max { EventKind::Culmination } else { EventKind::LowestPoint };
        events.push(AltEvent { kind, utc_jd: te, alt_rad: fe + horizon_rad });
        if is_max { max_alt = max_alt.max(fe + horizon_rad); }
        // Grazing: the extremum is across the horizon but both neighbours are not.
        let neighbours_same = (fs[i - 1] > 0.0) == (fs[i + 1] > 0.0) && (fs[i] > 0.0) == (fs[i - 1] > 0.0);
        if neighbours_same && !crossing[i - 1] && !crossing[i] && (fe > 0.0) != (fs[i] > 0.0) {
            let (k1, k2) = if fe > 0.0 { (EventKind::Rise, EventKind::Set) } else { (EventKind::Set, EventKind::Rise) };
            events.push(AltEvent { kind: k1, utc_jd: bisect(&f, ts[i - 1], te, fs[i - 1]), alt_rad: horizon_rad });
            events.push(AltEvent { kind: k2, utc_jd: bisect(&f, te, ts[i + 1], fe), alt_rad: horizon_rad });
        }
    }
    crate::sort::sort_by(&mut events, |a, b| a.utc_jd.total_cmp(&b.utc_jd));
    let crosses = events.iter().any(|e| matches!(e.kind, EventKind::Rise | EventKind::Set));
    let circumstance = if crosses {
        Circumstance::CrossesHorizon
    } else if fs[0] > 0.0 {
        Circumstance::AlwaysAbove
    } else {
        Circumstance::AlwaysBelow
    };
    let first = |k: EventKind| events.iter().find(|e| e.kind == k).map(|e| e.utc_jd);
    Ok(RiseTransitSet {
        rise_utc_jd: first(EventKind::Rise),
        transit_utc_jd: first(EventKind::Culmination),
        set_utc_jd: first(EventKind::Set),
        events,
        circumstance,
        max_alt_rad: max_alt,
    })
}

/// Rise, culmination and set of a catalog star at a site (apparent place of date,
/// geometric altitude against `horizon_rad`, e.g. [`STAR_HORIZON_RAD`]).
pub fn star_rise_transit_set(
    place: &crate::sky::apparent::CatalogPlace,
    epoch_jyear: f64,
    site: &Site,
    start_utc_jd: f64,
    end_utc_jd: f64,
    horizon_rad: f64,
) -> Result<RiseTransitSet, RiseSetError> {
    validate_site(site).map_err(RiseSetError::Site)?;
    let alt = |jd: f64| match Instant::from_utc_jd(jd) {
        Ok(t) => to_horizontal(crate::sky::apparent::star_apparent(place, epoch_jyear, &t), site, &t).alt_rad,
        Err(_) => f64::NAN,
    };
    rise_transit_set(alt, start_utc_jd, end_utc_jd, horizon_rad)
}

/// Meridian transits (hour angle crossing 0 westward) in a window, by root finding
/// on `hour_angle_at(utc_jd)` (radians wrapped to (−π, π]).
pub fn meridian_transits(hour_angle_at: impl Fn(f64) -> f64, start_utc_jd: f64, end_utc_jd: f64) -> Result<Vec<f64>, RiseSetError> {
    check_window(start_utc_jd, end_utc_jd)?;
    let n = ((end_utc_jd - start_utc_jd) / STEP_DAYS).ceil().max(2.0) as usize;
    let step = (end_utc_jd - start_utc_jd) / n as f64;
    let mut out = Vec::new();
    let mut t0 = start_utc_jd;
    let mut h0 = hour_angle_at(t0);
    for i in 1..=n {
        let t1 = start_utc_jd + i as f64 * step;
        let h1 = hour_angle_at(t1);
        if !(h0.is_finite() && h1.is_finite()) {
            return Err(RiseSetError::NotFinite { utc_jd: t1 });
        }
        if h0 <= 0.0 && h1 > 0.0 && h1 - h0 < std::f64::consts::PI {
            out.push(bisect(&hour_angle_at, t0, t1, h0));
        }
        t0 = t1;
        h0 = h1;
    }
    Ok(out)
}

/// Geocentric apparent Sun, Astronomical Almanac low-precision formulas (section C;
/// ~0.01° over 1950–2050), referred to the equinox of date.
pub fn sun_low_precision(tt_jd: f64) -> Equatorial {
    let n = tt_jd - crate::time::J2000_JD;
    let l = (280.460 + 0.985_647_4 * n).to_radians();
    let g = (357.528 + 0.985_600_3 * n).to_radians();
    let lambda = l + (1.915 * libm::sin(g) + 0.020 * libm::sin(2.0 * g)).to_radians();
    let eps = (23.439 - 0.000_000_4 * n).to_radians();
    let ra = libm::atan2(libm::cos(eps) * libm::sin(lambda), libm::cos(lambda));
    Equatorial { ra_rad: crate::time::wrap_2pi(ra), dec_rad: libm::asin(libm::sin(eps) * libm::sin(lambda)) }
}

/// Geometric altitude of the low-precision Sun at a site (NaN outside 1900–2100).
pub fn sun_altitude_rad(site: &Site, utc_jd: f64) -> f64 {
    match Instant::from_utc_jd(utc_jd) {
        Ok(t) => to_horizontal(sun_low_precision(t.tt_jd), site, &t).alt_rad,
        Err(_) => f64::NAN,
    }
}

/// Evening and morning times of one night, UTC Julian dates (None: does not happen).
#[derive(Clone, Debug, PartialEq)]
pub struct Twilight {
    pub sunset_utc_jd: Option<f64>,
    pub civil_dusk_utc_jd: Option<f64>,
    pub nautical_dusk_utc_jd: Option<f64>,
    pub astronomical_dusk_utc_jd: Option<f64>,
    pub astronomical_dawn_utc_jd: Option<f64>,
    pub nautical_dawn_utc_jd: Option<f64>,
    pub civil_dawn_utc_jd: Option<f64>,
    pub sunrise_utc_jd: Option<f64>,
    /// Lowest altitude of the Sun's centre in the window.
    pub min_sun_alt_rad: f64,
}

/// Sunset/sunrise (−50′) and civil, nautical, astronomical twilight (Sun's centre at
/// −6°, −12°, −18°) for the 24 h starting at `start_utc_jd` (pass local noon), with the
/// Astronomical Almanac low-precision Sun.
pub fn twilight(site: &Site, start_utc_jd: f64) -> Result<Twilight, RiseSetError> {
    validate_site(site).map_err(RiseSetError::Site)?;
    twilight_with(|t| sun_altitude_rad(site, t), start_utc_jd)
}

/// As [`twilight`], with any Sun: `sun_alt_at(utc_jd)` gives the geometric altitude of
/// the Sun's centre (e.g. from the solar module's ephemeris).
pub fn twilight_with(sun_alt_at: impl Fn(f64) -> f64, start_utc_jd: f64) -> Result<Twilight, RiseSetError> {
    let end = start_utc_jd + 1.0;
    let alt = &sun_alt_at;
    let pair = |h_deg: f64| -> Result<(Option<f64>, Option<f64>, f64), RiseSetError> {
        let r = rise_transit_set(alt, start_utc_jd, end, h_deg.to_radians())?;
        let dusk = r.set_utc_jd;
        let dawn = r.events.iter()
            .find(|e| e.kind == EventKind::Rise && dusk.is_none_or(|d| e.utc_jd > d))
            .map(|e| e.utc_jd);
        let min = r.events.iter().filter(|e| e.kind == EventKind::LowestPoint).map(|e| e.alt_rad)
            .fold(f64::INFINITY, f64::min);
        Ok((dusk, dawn, min))
    };
    let (sunset, sunrise, min0) = pair(SUNRISE_HORIZON_RAD.to_degrees())?;
    let (cd, cw, _) = pair(-6.0)?;
    let (nd, nw, _) = pair(-12.0)?;
    let (ad, aw, _) = pair(-18.0)?;
    let min_sun = if min0.is_finite() { min0 } else { alt(start_utc_jd).min(alt(end)) };
    Ok(Twilight {
        sunset_utc_jd: sunset,
        civil_dusk_utc_jd: cd,
        nautical_dusk_utc_jd: nd,
        astronomical_dusk_utc_jd: ad,
        astronomical_dawn_utc_jd: aw,
        nautical_dawn_utc_jd: nw,
        civil_dawn_utc_jd: cw,
        sunrise_utc_jd: sunrise,
        min_sun_alt_rad: min_sun,
    })
}
