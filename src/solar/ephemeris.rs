//! The compact ephemeris file (catalog/ephemeris.bin): decoding and Chebyshev
//! evaluation. Chebyshev fits to JPL DE421 made by catalog/build_ephemeris.py
//! (layout documented there). Positions are km in the ICRF, argument TDB.

use glam::DVec3;
use std::fmt;

/// Astronomical unit in km (IAU 2012 Resolution B2).
pub const AU_KM: f64 = 149_597_870.7;
const MAGIC: &[u8; 8] = b"NFSOLEPH";
const VERSION: u16 = 1;
const BODY_COUNT: usize = 10;
const HEADER_BYTES: usize = 8 + 4 + 24;
const TABLE_ENTRY_BYTES: usize = 32;
const MAX_NCOEF: usize = 64;

/// The series stored in the file, by body code.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Series {
    Sun = 0,
    /// Geocentric Moon (Moon minus Earth).
    Moon = 1,
    EarthMoonBarycentre = 2,
    Mercury = 3,
    Venus = 4,
    Mars = 5,
    Jupiter = 6,
    Saturn = 7,
    Uranus = 8,
    Neptune = 9,
}

/// Why an ephemeris file could not be read.
#[derive(Clone, Debug, PartialEq)]
pub enum EphemerisError {
    TooShort { len: usize },
    BadMagic,
    UnsupportedVersion { found: u16 },
    BodyCount { found: u16 },
    BadHeader { field: &'static str },
    BadBodyEntry { index: usize, field: &'static str },
    LengthMismatch { expected: usize, found: usize },
    Checksum,
    BadPayload { body: u8 },
}

impl fmt::Display for EphemerisError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        use EphemerisError::*;
        match self {
            TooShort { len } => write!(f, "ephemeris file is {len} bytes, too short for its header"),
            BadMagic => write!(f, "not an ephemeris file: it does not start with NFSOLEPH"),
            UnsupportedVersion { found } => write!(f, "ephemeris file version {found} is not supported (only version {VERSION})"),
            BodyCount { found } => write!(f, "ephemeris file lists {found} bodies; exactly {BODY_COUNT} are required"),
            BadHeader { field } => write!(f, "ephemeris header field '{field}' is out of its allowed range"),
            BadBodyEntry { index, field } => write!(f, "ephemeris body table entry {index}: field '{field}' is out of its allowed range"),
            LengthMismatch { expected, found } => write!(f, "ephemeris file is {found} bytes but its header says {expected}"),
            Checksum => write!(f, "ephemeris file is corrupt: checksum does not match"),
            BadPayload { body } => write!(f, "ephemeris coefficients of body code {body} are corrupt"),
        }
    }
}
impl std::error::Error for EphemerisError {}

/// A date outside the ephemeris coverage.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OutOfCoverage {
    pub tdb_jd: f64,
    pub start_jd: f64,
    pub end_jd: f64,
}

#[derive(Clone, Debug)]
struct SeriesData {
    ncoef: usize,
    n_intervals: usize,
    interval_days: f64,
    /// km; index ((interval * 3) + component) * ncoef + k
    coefs: Vec<f64>,
}

/// The decoded ephemeris: ten Chebyshev series over one common span.
#[derive(Clone, Debug)]
pub struct Ephemeris {
    start_jd: f64,
    span_days: f64,
    emrat: f64,
    series: Vec<SeriesData>,
}

fn rd_u16(b: &[u8], o: usize) -> u16 {
    u16::from_le_bytes([b[o], b[o + 1]])
}
fn rd_u32(b: &[u8], o: usize) -> u32 {
    u32::from_le_bytes([b[o], b[o + 1], b[o + 2], b[o + 3]])
}
fn rd_f64(b: &[u8], o: usize) -> f64 {
    let mut a = [0u8; 8];
    a.copy_from_slice(&b[o..o + 8]);
    f64::from_le_bytes(a)
}

fn fnv1a64(data: &[u8]) -> u64 {
    let mut h: u64 = 0xCBF2_9CE4_8422_2325;
    for &b in data {
        h ^= b as u64;
        h = h.wrapping_mul(0x0000_0100_0000_01B3);
    }
    h
}

/// Zigzag LEB128 integers, exactly `count` of them filling `bytes`.
fn decode_varints(bytes: &[u8], count: usize, quantum: f64, out: &mut Vec<f64>) -> Option<()> {
    let mut i = 0;
    for _ in 0..count {
        let mut u: u64 = 0;
        let mut shift = 0u32;
        loop {
            let b = *bytes.get(i)?;
            i += 1;
            if shift == 63 && (b & 0x7E) != 0 {
                return None; // would overflow 64 bits
            }
            u |= ((b & 0x7F) as u64) << shift;
            if b & 0x80 == 0 {
                break;
            }
            shift += 7;
            if shift > 63 {
                return None;
            }
        }
        let v = ((u >> 1) as i64) ^ -((u & 1) as i64);
        out.push(v as f64 * quantum);
    }
    (i == bytes.len()).then_some(())
}

impl Ephemeris {
    /// Decode and validate an ephemeris file (untrusted bytes: never panics).
    pub fn decode(bytes: &[u8]) -> Result<Ephemeris, EphemerisError> {
        let min = HEADER_BYTES + BODY_COUNT * TABLE_ENTRY_BYTES + 8;
        if bytes.len() < HEADER_BYTES {
            return Err(EphemerisError::TooShort { len: bytes.len() });
        }
        if &bytes[0..8] != MAGIC {
            return Err(EphemerisError::BadMagic);
        }
        let version = rd_u16(bytes, 8);
        if version != VERSION {
            return Err(EphemerisError::UnsupportedVersion { found: version });
        }
        let count = rd_u16(bytes, 10);
        if count as usize != BODY_COUNT {
            return Err(EphemerisError::BodyCount { found: count });
        }
        if bytes.len() < min {
            return Err(EphemerisError::TooShort { len: bytes.len() });
        }
        let start_jd = rd_f64(bytes, 12);
        let span_days = rd_f64(bytes, 20);
        let emrat = rd_f64(bytes, 28);
        if !(start_jd.is_finite() && (2_000_000.0..3_000_000.0).contains(&start_jd)) {
            return Err(EphemerisError::BadHeader { field: "start_jd" });
        }
        if !(span_days.is_finite() && span_days > 0.0 && span_days <= 200_000.0) {
            return Err(EphemerisError::BadHeader { field: "span_days" });
        }
        if !(emrat.is_finite() && (50.0..150.0).contains(&emrat)) {
            return Err(EphemerisError::BadHeader { field: "emrat" });
        }
        // Body table.
        let mut entries = Vec::with_capacity(BODY_COUNT);
        let mut payload_total: usize = 0;
        for index in 0..BODY_COUNT {
            let o = HEADER_BYTES + index * TABLE_ENTRY_BYTES;
            let bad = |field| EphemerisError::BadBodyEntry { index, field };
            let code = bytes[o];
            let ncoef = bytes[o + 1] as usize;
            let n_intervals = rd_u32(bytes, o + 4) as usize;
            let interval_days = rd_f64(bytes, o + 8);
            let quantum = rd_f64(bytes, o + 16);
            let payload = rd_u32(bytes, o + 24) as usize;
            if code as usize != index {
                return Err(bad("body_code"));
            }
            if ncoef == 0 || ncoef > MAX_NCOEF {
                return Err(bad("ncoef"));
            }
            if !(interval_days.is_finite() && interval_days > 0.0) || n_intervals == 0 {
                return Err(bad("interval_days"));
            }
            if (n_intervals as f64 * interval_days - span_days).abs() > 1e-6 {
                return Err(bad("n_intervals"));
            }
            if !(quantum.is_finite() && quantum > 0.0 && quantum < 1e6) {
                return Err(bad("quantum_km"));
            }
            // Every coefficient takes at least one byte: bounds the allocation.
            let values = n_intervals.checked_mul(3 * ncoef).ok_or(bad("n_intervals"))?;
            if values > payload {
                return Err(bad("payload_bytes"));
            }
            payload_total = payload_total.checked_add(payload).ok_or(bad("payload_bytes"))?;
            entries.push((code, ncoef, n_intervals, interval_days, quantum, payload, values));
        }
        let expected = min.checked_add(payload_total).ok_or(EphemerisError::BadHeader { field: "payload_bytes" })?;
        if expected != bytes.len() {
            return Err(EphemerisError::LengthMismatch { expected, found: bytes.len() });
        }
        let body_end = bytes.len() - 8;
        let mut sum = [0u8; 8];
        sum.copy_from_slice(&bytes[body_end..]);
        if fnv1a64(&bytes[..body_end]) != u64::from_le_bytes(sum) {
            return Err(EphemerisError::Checksum);
        }
        let mut offset = HEADER_BYTES + BODY_COUNT * TABLE_ENTRY_BYTES;
        let mut series = Vec::with_capacity(BODY_COUNT);
        for (code, ncoef, n_intervals, interval_days, quantum, payload, values) in entries {
            let mut coefs = Vec::with_capacity(values);
            decode_varints(&bytes[offset..offset + payload], values, quantum, &mut coefs)
                .ok_or(EphemerisError::BadPayload { body: code })?;
            offset += payload;
            series.push(SeriesData { ncoef, n_intervals, interval_days, coefs });
        }
        Ok(Ephemeris { start_jd, span_days, emrat, series })
    }

    /// First covered instant (TDB Julian date).
    pub fn start_jd(&self) -> f64 {
        self.start_jd
    }
    /// End of coverage (TDB Julian date).
    pub fn end_jd(&self) -> f64 {
        self.start_jd + self.span_days
    }
    /// Earth/Moon mass ratio of the source ephemeris.
    pub fn emrat(&self) -> f64 {
        self.emrat
    }

    /// Position (AU) and velocity (AU/day) of one stored series at TDB `tdb_jd`,
    /// by Chebyshev summation (position) and its derivative (velocity).
    pub fn state(&self, s: Series, tdb_jd: f64) -> Result<(DVec3, DVec3), OutOfCoverage> {
        let d = &self.series[s as usize];
        let t = tdb_jd - self.start_jd;
        if !(t >= 0.0 && t <= self.span_days) {
            return Err(OutOfCoverage { tdb_jd, start_jd: self.start_jd, end_jd: self.end_jd() });
        }
        let mut i = (t / d.interval_days) as usize;
        if i >= d.n_intervals {
            i = d.n_intervals - 1;
        }
        let x = 2.0 * (t - i as f64 * d.interval_days) / d.interval_days - 1.0;
        let mut p = [0.0; 3];
        let mut v = [0.0; 3];
        let base = i * 3 * d.ncoef;
        for c in 0..3 {
            let cs = &d.coefs[base + c * d.ncoef..base + (c + 1) * d.ncoef];
            // T_k(x) and T'_k(x) by the three-term recurrences.
            let (mut t0, mut t1) = (1.0, x);
            let (mut dt0, mut dt1) = (0.0, 1.0);
            let mut sp = cs[0];
            let mut sv = 0.0;
            if cs.len() > 1 {
                sp += cs[1] * x;
                sv += cs[1];
            }
            for &ck in cs.iter().skip(2) {
                let t2 = 2.0 * x * t1 - t0;
                let dt2 = 2.0 * t1 + 2.0 * x * dt1 - dt0;
                sp += ck * t2;
                sv += ck * dt2;
                t0 = t1;
                t1 = t2;
                dt0 = dt1;
                dt1 = dt2;
            }
            p[c] = sp / AU_KM;
            v[c] = sv * 2.0 / d.interval_days / AU_KM;
        }
        Ok((DVec3::from_array(p), DVec3::from_array(v)))
    }
}
