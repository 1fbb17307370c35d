//! Time scales: civil time → UTC → TT and UT1 → Julian dates, sidereal time.
//!
//! - UTC → TT: from 1972-01-01 on, TT = UTC + 32.184 s + (TAI−UTC), the leap
//!   seconds of ERFA `eraDat` (last entry 2017-01-01, 37 s; later dates keep 37 s).
//!   Before 1972, TT = UT1 + ΔT with ΔT from Espenak & Meeus (2006) polynomials.
//! - UT1 = UTC + DUT1, DUT1 settable (|DUT1| ≤ 0.9 s by the leap-second rule),
//!   default 0. One second of UT1 is 15″ of hour angle.
//! - Supported: UTC years 1900–2100 (the solar ephemeris covers 1950–2050).
//!
//! Dates are single f64 Julian dates: their resolution (~40 µs) is far below
//! every bar this crate keeps (1 ms of sidereal time).

use serde::{Deserialize, Serialize};
use std::fmt;

/// One instant on the three time scales the engine needs, as Julian dates.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Instant {
    pub utc_jd: f64,
    pub tt_jd: f64,
    pub ut1_jd: f64,
}

/// Julian date of J2000.0 (TT).
pub const J2000_JD: f64 = 2_451_545.0;
/// Days per Julian century.
pub const DAYS_PER_CENTURY: f64 = 36_525.0;
const SECONDS_PER_DAY: f64 = 86_400.0;
/// First supported UTC Julian date: 1900-01-01 00:00.
pub const MIN_UTC_JD: f64 = 2_415_020.5;
/// First unsupported UTC Julian date: 2101-01-01 00:00.
pub const MAX_UTC_JD: f64 = 2_488_434.5;
/// Largest |UT1 − UTC| accepted, seconds (leap seconds keep it under 0.9 s).
pub const MAX_DUT1_S: f64 = 0.9;

/// A time field out of range or not a number.
#[derive(Clone, Debug, PartialEq)]
pub enum TimeError {
    Year(i32),
    Month(u32),
    Day { day: u32, max: u32 },
    Hour(u32),
    Minute(u32),
    Second(f64),
    UtcOffsetMinutes(i32),
    JulianDate(f64),
    Dut1Seconds(f64),
}

impl fmt::Display for TimeError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            TimeError::Year(y) => write!(f, "year {y} is outside the supported range 1900 to 2100"),
            TimeError::Month(m) => write!(f, "month {m} is not a month: use 1 to 12"),
            TimeError::Day { day, max } => write!(f, "day {day} is not in this month: use 1 to {max}"),
            TimeError::Hour(h) => write!(f, "hour {h} is out of range: use 0 to 23"),
            TimeError::Minute(m) => write!(f, "minute {m} is out of range: use 0 to 59"),
            TimeError::Second(s) => write!(f, "second {s} is out of range: use 0 up to (not including) 60 (61 in a leap second)"),
            TimeError::UtcOffsetMinutes(o) => write!(f, "UTC offset {o} minutes is out of range: use -1080 to +1080 (±18 h)"),
            TimeError::JulianDate(jd) => write!(f, "Julian date {jd} is outside the supported range (UTC 1900-01-01 to 2100-12-31)"),
            TimeError::Dut1Seconds(d) => write!(f, "UT1−UTC of {d} s is out of range: use -0.9 to +0.9 s"),
        }
    }
}

impl std::error::Error for TimeError {}

fn is_leap_year(y: i32) -> bool {
    (y % 4 == 0 && y % 100 != 0) || y % 400 == 0
}

fn days_in_month(y: i32, m: u32) -> u32 {
    match m {
        2 if is_leap_year(y) => 29,
        2 => 28,
        4 | 6 | 9 | 11 => 30,
        _ => 31,
    }
}

/// Julian date at 0h of a Gregorian calendar date (algorithm of ERFA `eraCal2jd`).
fn cal_to_jd0(y: i32, m: u32, d: u32) -> f64 {
    let (iy, im, id) = (y as i64, m as i64, d as i64);
    let my = (im - 14) / 12;
    let iypmy = iy + my;
    let mjd = (1461 * (iypmy + 4800)) / 4 + (367 * (im - 2 - 12 * my)) / 12
        - (3 * ((iypmy + 4900) / 100)) / 4
        + id
        - 2_432_076;
    mjd as f64 + 2_400_000.5
}

/// TAI−UTC leap seconds from 1972 on: (year, month, seconds), from ERFA `eraDat`.
const LEAP_SECONDS: [(i32, u32, f64); 28] = [
    (1972, 1, 10.0), (1972, 7, 11.0), (1973, 1, 12.0), (1974, 1, 13.0),
    (1975, 1, 14.0), (1976, 1, 15.0), (1977, 1, 16.0), (1978, 1, 17.0),
    (1979, 1, 18.0), (1980, 1, 19.0), (1981, 7, 20.0), (1982, 7, 21.0),
    (1983, 7, 22.0), (1985, 7, 23.0), (1988, 1, 24.0), (1990, 1, 25.0),
    (1991, 1, 26.0), (1992, 7, 27.0), (1993, 7, 28.0), (1994, 7, 29.0),
    (1996, 1, 30.0), (1997, 7, 31.0), (1999, 1, 32.0), (2006, 1, 33.0),
    (2009, 1, 34.0), (2012, 7, 35.0), (2015, 7, 36.0), (2017, 1, 37.0),
];

/// TAI−UTC in seconds at a UTC Julian date, or None before 1972 (no integer leap seconds).
pub fn tai_minus_utc_s(utc_jd: f64) -> Option<f64> {
    let mut out = None;
    for &(y, m, s) in LEAP_SECONDS.iter() {
        if utc_jd >= cal_to_jd0(y, m, 1) {
            out = Some(s);
        } else {
            break;
        }
    }
    out
}

/// ΔT = TT − UT1 in seconds: Espenak & Meeus (2006) polynomials, "Five Millennium
/// Canon of Solar Eclipses" (NASA/TP-2006-214141), segments 1900–2150; outside
/// that, their long-term parabola −20 + 32u², u = (y − 1820)/100.
pub fn delta_t_s(decimal_year: f64) -> f64 {
    let y = decimal_year;
    if (1900.0..1920.0).contains(&y) {
        let t = y - 1900.0;
        -2.79 + t * (1.494119 + t * (-0.0598939 + t * (0.0061966 - 0.000197 * t)))
    } else if (1920.0..1941.0).contains(&y) {
        let t = y - 1920.0;
        21.20 + t * (0.84493 + t * (-0.076100 + 0.0020936 * t))
    } else if (1941.0..1961.0).contains(&y) {
        let t = y - 1950.0;
        29.07 + 0.407 * t - t * t / 233.0 + t * t * t / 2547.0
    } else if (1961.0..1986.0).contains(&y) {
        let t = y - 1975.0;
        45.45 + 1.067 * t - t * t / 260.0 - t * t * t / 718.0
    } else if (1986.0..2005.0).contains(&y) {
        let t = y - 2000.0;
        63.86 + t * (0.3345 + t * (-0.060374 + t * (0.0017275 + t * (0.000651814 + 0.00002373599 * t))))
    } else if (2005.0..2050.0).contains(&y) {
        let t = y - 2000.0;
        62.92 + 0.32217 * t + 0.005589 * t * t
    } else if (2050.0..2150.0).contains(&y) {
        let u = (y - 1820.0) / 100.0;
        -20.0 + 32.0 * u * u - 0.5628 * (2150.0 - y)
    } else {
        let u = (y - 1820.0) / 100.0;
        -20.0 + 32.0 * u * u
    }
}

/// Decimal year of a Julian date (Julian years from J2000.0; ample for ΔT).
pub fn decimal_year(jd: f64) -> f64 {
    2000.0 + (jd - J2000_JD) / 365.25
}

impl Instant {
    /// Civil date and time at a UTC offset (minutes east of Greenwich, e.g. +60 for CET)
    /// → the instant, with UT1 = UTC (DUT1 = 0; see [`Instant::with_dut1_s`]).
    pub fn from_civil(
        year: i32,
        month: u32,
        day: u32,
        hour: u32,
        minute: u32,
        second: f64,
        utc_offset_minutes: i32,
    ) -> Result<Instant, TimeError> {
        if !(1900..=2100).contains(&year) {
            return Err(TimeError::Year(year));
        }
        if !(1..=12).contains(&month) {
            return Err(TimeError::Month(month));
        }
        let max = days_in_month(year, month);
        if day < 1 || day > max {
            return Err(TimeError::Day { day, max });
        }
        if hour > 23 {
            return Err(TimeError::Hour(hour));
        }
        if minute > 59 {
            return Err(TimeError::Minute(minute));
        }
        // 60.x only in the last minute of an hour (a leap second, local offsets
        // being whole quarter-hours is not assumed).
        let sec_max = if minute == 59 { 61.0 } else { 60.0 };
        if !(second.is_finite() && second >= 0.0 && second < sec_max) {
            return Err(TimeError::Second(second));
        }
        if !(-1080..=1080).contains(&utc_offset_minutes) {
            return Err(TimeError::UtcOffsetMinutes(utc_offset_minutes));
        }
        let day_s = hour as f64 * 3600.0 + minute as f64 * 60.0 + second
            - utc_offset_minutes as f64 * 60.0;
        Instant::from_utc_jd(cal_to_jd0(year, month, day) + day_s / SECONDS_PER_DAY)
    }

    /// A UTC Julian date → the instant, with UT1 = UTC (DUT1 = 0).
    pub fn from_utc_jd(utc_jd: f64) -> Result<Instant, TimeError> {
        Instant::from_utc_jd_dut1(utc_jd, 0.0)
    }

    /// A UTC Julian date and DUT1 = UT1 − UTC (seconds) → the instant.
    pub fn from_utc_jd_dut1(utc_jd: f64, dut1_s: f64) -> Result<Instant, TimeError> {
        if !(utc_jd.is_finite() && (MIN_UTC_JD..MAX_UTC_JD).contains(&utc_jd)) {
            return Err(TimeError::JulianDate(utc_jd));
        }
        if !(dut1_s.is_finite() && dut1_s.abs() <= MAX_DUT1_S) {
            return Err(TimeError::Dut1Seconds(dut1_s));
        }
        let ut1_jd = utc_jd + dut1_s / SECONDS_PER_DAY;
        let tt_jd = match tai_minus_utc_s(utc_jd) {
            Some(dat) => utc_jd + (32.184 + dat) / SECONDS_PER_DAY,
            None => ut1_jd + delta_t_s(decimal_year(utc_jd)) / SECONDS_PER_DAY,
        };
        Ok(Instant { utc_jd, tt_jd, ut1_jd })
    }

    /// The same UTC with DUT1 = UT1 − UTC set (seconds, |DUT1| ≤ 0.9).
    pub fn with_dut1_s(self, dut1_s: f64) -> Result<Instant, TimeError> {
        Instant::from_utc_jd_dut1(self.utc_jd, dut1_s)
    }

    /// This instant shifted by a number of days (UTC), keeping its DUT1.
    pub fn plus_days(self, days: f64) -> Result<Instant, TimeError> {
        let dut1_s = (self.ut1_jd - self.utc_jd) * SECONDS_PER_DAY;
        Instant::from_utc_jd_dut1(self.utc_jd + days, dut1_s.clamp(-MAX_DUT1_S, MAX_DUT1_S))
    }

    /// TT − UT1 in seconds at this instant.
    pub fn delta_t_s(&self) -> f64 {
        (self.tt_jd - self.ut1_jd) * SECONDS_PER_DAY
    }

    /// Julian centuries of TT since J2000.0.
    pub fn tt_centuries(&self) -> f64 {
        (self.tt_jd - J2000_JD) / DAYS_PER_CENTURY
    }
}

/// Wrap an angle into [0, 2π).
pub fn wrap_2pi(a: f64) -> f64 {
    let r = crate::math::rem_euclid(a, std::f64::consts::TAU);
    if r >= std::f64::consts::TAU { 0.0 } else { r }
}

/// Earth rotation angle, IAU 2000 (ERFA `eraEra00`), from UT1.
pub fn era_rad(ut1_jd: f64) -> f64 {
    let d = ut1_jd - J2000_JD;
    let f = crate::math::rem_euclid(ut1_jd, 1.0);
    wrap_2pi(std::f64::consts::TAU * (f + 0.779_057_273_264_0 + 0.002_737_811_911_354_48 * d))
}

/// Greenwich mean sidereal time, IAU 2006 (ERFA `eraGmst06`): ERA(UT1) + polynomial in TT.
pub fn gmst_rad(t: &Instant) -> f64 {
    let c = t.tt_centuries();
    let poly_arcsec = 0.014506
        + c * (4612.156534 + c * (1.3915817 + c * (-0.00000044 + c * (-0.000029956 - 0.0000000368 * c))));
    wrap_2pi(era_rad(t.ut1_jd) + poly_arcsec * crate::sky::frames::ARCSEC_RAD)
}

/// Greenwich apparent sidereal time, IAU 2006/2000B: GMST06 + equation of the
/// equinoxes (2000B nutation in longitude × cos ε_A + ERFA `eraEect00` terms).
pub fn gast_rad(t: &Instant) -> f64 {
    wrap_2pi(gmst_rad(t) + crate::sky::frames::equation_of_equinoxes_rad(t.tt_jd))
}

/// Local apparent sidereal time at an east-positive longitude.
pub fn local_sidereal_rad(t: &Instant, lon_rad: f64) -> f64 {
    wrap_2pi(gast_rad(t) + lon_rad)
}
