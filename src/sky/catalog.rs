//! Star catalog files (`*.nfs`, built by `catalog/build.py`): decoding and validation.
//!
//! Format (little-endian; full description in catalog/README.md): a 64-byte header
//! (magic, version, layout, count, epoch, zones, payload length, CRC-32, magnitude
//! limit, source), then the zone table, per-tile star counts and one byte-shuffled
//! column per field. Layout 1 (Hipparcos) holds absolute fixed-point positions with
//! proper motion and parallax; layout 2 (Gaia) holds tile-relative positions only.
//! Every field is range-checked: a corrupt or truncated file is an error, never a panic.

use core::fmt;

pub(crate) mod bytes;
mod set;
pub use set::{credit, normalize_id, split_star_id, star_id, Catalogs, DSO_FILE, STAR_TIERS};
use bytes::{crc32, Reader};

/// File magic of a Nightfield star file.
pub const STAR_MAGIC: &[u8; 8] = b"NFSTARS\0";
/// The one star-file format version this decoder reads.
pub const STAR_FORMAT_VERSION: u16 = 1;
const HEADER_LEN: usize = 64;
const CRC_AT: usize = 32;
const MAX_ZONES: usize = 4096;
const MAX_CELLS: usize = 8192;
const MAX_STARS: usize = 20_000_000;
const OFFSET_STEPS: u32 = 32_768;
const MISSING_I16: i16 = i16::MIN;

/// What a star file carries per star.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StarLayout {
    /// Fixed-point position, proper motion, parallax, V, B−V, HIP number (Hipparcos).
    Astrometric,
    /// Tile-relative position, V, B−V; no proper motion or parallax (Gaia tier).
    Photometric,
}

/// One catalog star at the catalog epoch (ICRS).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Star {
    pub ra_rad: f64,
    pub dec_rad: f64,
    /// Proper motion in RA times cos(Dec), mas/yr (0 in the Gaia tier: not carried).
    pub pm_ra_cosdec_mas_yr: f32,
    pub pm_dec_mas_yr: f32,
    /// Parallax, mas (0 in the Gaia tier: not carried).
    pub parallax_mas: f32,
    /// Johnson V magnitude (derived; see catalog/README.md for the relation per tier).
    pub vmag: f32,
    /// Johnson B−V colour; NaN when unknown (use [`Star::bv_or`]).
    pub bv: f32,
    /// Hipparcos number, 0 when none.
    pub hip: u32,
}

impl Star {
    /// B−V, or `default` when the catalog has no colour for this star.
    pub fn bv_or(&self, default: f32) -> f32 {
        if self.bv.is_finite() {
            self.bv
        } else {
            default
        }
    }
}

/// A decoded star file.
#[derive(Clone, Debug, PartialEq)]
pub struct StarCatalog {
    /// Epoch of the positions as a Julian year (1991.25 Hipparcos, 2016.0 Gaia DR3).
    pub epoch_jyear: f64,
    /// Source named in the file header, e.g. "Hipparcos I/311 V<=6.5".
    pub source: String,
    pub layout: StarLayout,
    /// Faintest V the file was cut at (informational).
    pub mag_limit: f32,
    /// Stars in file order (sorted by sky tile).
    pub stars: Vec<Star>,
}

/// Why a catalog file could not be read. Each message names the field and what was allowed.
#[derive(Clone, Debug, PartialEq)]
pub enum CatalogError {
    /// The file is shorter than its header or than the length it declares.
    Truncated { what: &'static str, need_bytes: usize, have_bytes: usize },
    /// The file does not start with the expected magic bytes.
    BadMagic { what: &'static str },
    /// The format version is not one this build reads.
    UnsupportedVersion { what: &'static str, found: u16, supported: u16 },
    /// The file is longer than it declares (trailing bytes).
    TrailingBytes { what: &'static str, extra_bytes: usize },
    /// The CRC-32 over the file does not match: the file is damaged.
    ChecksumMismatch { what: &'static str, stored: u32, computed: u32 },
    /// A header or table field is outside its allowed range.
    FieldOutOfRange { field: &'static str, value: f64, allowed: &'static str },
    /// A per-object value is outside its allowed range.
    ValueOutOfRange { field: &'static str, index: usize, value: f64, allowed: &'static str },
    /// The declared sizes do not add up.
    Inconsistent { what: &'static str, detail: String },
    /// A text field is not valid UTF-8 / ASCII.
    BadText { field: &'static str, index: usize },
    /// `Catalogs::load` got a file name it does not know.
    UnknownFile { name: String, known: &'static str },
}

impl fmt::Display for CatalogError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        use CatalogError::*;
        match self {
            Truncated { what, need_bytes, have_bytes } => write!(
                f,
                "{what} is truncated: it needs {need_bytes} bytes but only {have_bytes} arrived; download it again"
            ),
            BadMagic { what } => write!(f, "this is not a {what} (its first bytes are not the expected file signature)"),
            UnsupportedVersion { what, found, supported } => write!(
                f,
                "{what} has format version {found}; this build reads version {supported} only"
            ),
            TrailingBytes { what, extra_bytes } => {
                write!(f, "{what} has {extra_bytes} unexpected bytes after its declared end")
            }
            ChecksumMismatch { what, stored, computed } => write!(
                f,
                "{what} is damaged: checksum {computed:08x} does not match the stored {stored:08x}; download it again"
            ),
            FieldOutOfRange { field, value, allowed } => {
                write!(f, "catalog field {field} is {value}, allowed {allowed}")
            }
            ValueOutOfRange { field, index, value, allowed } => {
                write!(f, "catalog entry {index}: {field} is {value}, allowed {allowed}")
            }
            Inconsistent { what, detail } => write!(f, "{what} is inconsistent: {detail}"),
            BadText { field, index } => write!(f, "catalog entry {index}: {field} is not valid text"),
            UnknownFile { name, known } => write!(f, "unknown catalog file \"{name}\"; known files: {known}"),
        }
    }
}

impl std::error::Error for CatalogError {}

const WHAT: &str = "star catalog file";

/// Decode and validate a star file (format in catalog/README.md).
pub fn decode_stars(bytes: &[u8]) -> Result<StarCatalog, CatalogError> {
    if bytes.len() < HEADER_LEN {
        if bytes.len() >= 8 && &bytes[..8] != STAR_MAGIC {
            return Err(CatalogError::BadMagic { what: WHAT });
        }
        return Err(CatalogError::Truncated { what: WHAT, need_bytes: HEADER_LEN, have_bytes: bytes.len() });
    }
    if &bytes[..8] != STAR_MAGIC {
        return Err(CatalogError::BadMagic { what: WHAT });
    }
    let mut h = Reader::new(&bytes[8..HEADER_LEN]);
    let version = h.u16()?;
    if version != STAR_FORMAT_VERSION {
        return Err(CatalogError::UnsupportedVersion { what: WHAT, found: version, supported: STAR_FORMAT_VERSION });
    }
    let layout = match h.u8()? {
        1 => StarLayout::Astrometric,
        2 => StarLayout::Photometric,
        other => {
            return Err(CatalogError::FieldOutOfRange { field: "layout", value: other as f64, allowed: "1 or 2" })
        }
    };
    let _reserved = h.u8()?;
    let count = h.u32()? as usize;
    let epoch_jyear = h.f64()?;
    let zones = h.u16()? as usize;
    let _reserved2 = h.u16()?;
    let payload_len = h.u32()? as usize;
    let stored_crc = h.u32()?;
    let mag_limit = h.f32()?;
    let source_raw = h.take(24)?;

    let need = HEADER_LEN.saturating_add(payload_len);
    if bytes.len() < need {
        return Err(CatalogError::Truncated { what: WHAT, need_bytes: need, have_bytes: bytes.len() });
    }
    if bytes.len() > need {
        return Err(CatalogError::TrailingBytes { what: WHAT, extra_bytes: bytes.len() - need });
    }
    let computed = crc32(&[&bytes[..CRC_AT], &bytes[CRC_AT + 4..]]);
    if computed != stored_crc {
        return Err(CatalogError::ChecksumMismatch { what: WHAT, stored: stored_crc, computed });
    }
    check_field("count", count as f64, count <= MAX_STARS, "0 to 20000000")?;
    check_field("epoch_jyear", epoch_jyear, (1900.0..=2100.0).contains(&epoch_jyear), "1900 to 2100")?;
    check_field("zones", zones as f64, (1..=MAX_ZONES).contains(&zones), "1 to 4096")?;
    check_field("mag_limit", mag_limit as f64, (-2.0..=25.0).contains(&mag_limit), "-2 to 25")?;
    let source = header_text(source_raw)?;

    let mut r = Reader::new(&bytes[HEADER_LEN..]);
    let mut cells = Vec::with_capacity(zones);
    for _ in 0..zones {
        let c = r.u16()? as usize;
        check_field("cells per zone", c as f64, (1..=MAX_CELLS).contains(&c), "1 to 8192")?;
        cells.push(c);
    }
    let tiles: usize = cells.iter().sum();
    let row = match layout {
        StarLayout::Astrometric => 28,
        StarLayout::Photometric => 7,
    };
    let expect = zones * 2 + tiles * 4 + count * row;
    if expect != payload_len {
        return Err(CatalogError::Inconsistent {
            what: WHAT,
            detail: format!("payload is {payload_len} bytes but {count} stars in {tiles} tiles need {expect}"),
        });
    }
    let counts = r.shuffled_u32(tiles)?;
    let total: u64 = counts.iter().map(|&c| c as u64).sum();
    if total != count as u64 {
        return Err(CatalogError::Inconsistent {
            what: WHAT,
            detail: format!("tile counts add up to {total} stars but the header says {count}"),
        });
    }
    let stars = match layout {
        StarLayout::Astrometric => decode_astrometric(&mut r, count, &counts)?,
        StarLayout::Photometric => decode_photometric(&mut r, count, &counts, &cells)?,
    };
    Ok(StarCatalog { epoch_jyear, source, layout, mag_limit, stars })
}

fn check_field(field: &'static str, value: f64, ok: bool, allowed: &'static str) -> Result<(), CatalogError> {
    if ok {
        Ok(())
    } else {
        Err(CatalogError::FieldOutOfRange { field, value, allowed })
    }
}

fn header_text(raw: &[u8]) -> Result<String, CatalogError> {
    let end = raw.iter().position(|&b| b == 0).unwrap_or(raw.len());
    let s = &raw[..end];
    if !s.iter().all(|b| (0x20..0x7f).contains(b)) || raw[end..].iter().any(|&b| b != 0) {
        return Err(CatalogError::BadText { field: "source", index: 0 });
    }
    Ok(String::from_utf8_lossy(s).into_owned())
}

/// Undo the per-tile delta coding of a column (wrapping prefix sums that restart per tile).
fn undelta<T: Copy + Default>(vals: &mut [T], counts: &[u32], add: impl Fn(T, T) -> T) {
    let mut i = 0usize;
    for &c in counts {
        let mut prev = T::default();
        for v in vals[i..i + c as usize].iter_mut() {
            prev = add(prev, *v);
            *v = prev;
        }
        i += c as usize;
    }
}

fn range_check(field: &'static str, i: usize, value: f64, ok: bool, allowed: &'static str) -> Result<(), CatalogError> {
    if ok {
        Ok(())
    } else {
        Err(CatalogError::ValueOutOfRange { field, index: i, value, allowed })
    }
}

fn mag_from(field: &'static str, i: usize, v: i16, lo: f32, hi: f32, allowed: &'static str, missing_ok: bool) -> Result<f32, CatalogError> {
    if v == MISSING_I16 {
        return if missing_ok {
            Ok(f32::NAN)
        } else {
            Err(CatalogError::ValueOutOfRange { field, index: i, value: v as f64, allowed })
        };
    }
    let m = v as f32 / 1000.0;
    range_check(field, i, m as f64, (lo..=hi).contains(&m), allowed)?;
    Ok(m)
}

const RA_SCALE: f64 = core::f64::consts::TAU / 4_294_967_296.0;
const DEC_SCALE: f64 = core::f64::consts::FRAC_PI_2 / 2_147_483_647.0;

fn decode_astrometric(r: &mut Reader, n: usize, counts: &[u32]) -> Result<Vec<Star>, CatalogError> {
    let mut ra = r.shuffled_u32(n)?;
    undelta(&mut ra, counts, u32::wrapping_add);
    let dec = r.shuffled_u32(n)?;
    let pmra = r.shuffled_u32(n)?;
    let pmde = r.shuffled_u32(n)?;
    let plx = r.shuffled_u32(n)?;
    let vm = r.shuffled_u16(n)?;
    let bv = r.shuffled_u16(n)?;
    let mut hip = r.shuffled_u32(n)?;
    undelta(&mut hip, counts, u32::wrapping_add);
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let d = dec[i] as i32;
        range_check("dec", i, d as f64, d != i32::MIN, "-2147483647 to 2147483647 (±90°)")?;
        let pm_a = pmra[i] as i32 as f32 / 10.0;
        let pm_d = pmde[i] as i32 as f32 / 10.0;
        let p = plx[i] as i32 as f32 / 10.0;
        range_check("pm_ra_cosdec_mas_yr", i, pm_a as f64, pm_a.abs() <= 15_000.0, "±15000 mas/yr")?;
        range_check("pm_dec_mas_yr", i, pm_d as f64, pm_d.abs() <= 15_000.0, "±15000 mas/yr")?;
        range_check("parallax_mas", i, p as f64, p.abs() <= 1_000.0, "±1000 mas")?;
        range_check("hip", i, hip[i] as f64, (1..=120_416).contains(&hip[i]), "1 to 120416")?;
        out.push(Star {
            ra_rad: ra[i] as f64 * RA_SCALE,
            dec_rad: d as f64 * DEC_SCALE,
            pm_ra_cosdec_mas_yr: pm_a,
            pm_dec_mas_yr: pm_d,
            parallax_mas: p,
            vmag: mag_from("vmag", i, vm[i] as i16, -2.0, 21.0, "-2 to 21", false)?,
            bv: mag_from("bv", i, bv[i] as i16, -1.0, 7.0, "-1 to 7 or unknown", true)?,
            hip: hip[i],
        });
    }
    Ok(out)
}

fn decode_photometric(r: &mut Reader, n: usize, counts: &[u32], cells: &[usize]) -> Result<Vec<Star>, CatalogError> {
    let dra = r.shuffled_u16(n)?;
    let ddec = r.shuffled_u16(n)?;
    let mut vm = r.shuffled_u16(n)?;
    undelta(&mut vm, counts, u16::wrapping_add);
    let bv = r.take(n)?;
    let zone_h = core::f64::consts::PI / cells.len() as f64;
    let steps = OFFSET_STEPS as f64;
    let mut out = Vec::with_capacity(n);
    let mut i = 0usize;
    let mut tile = 0usize;
    for (z, &nc) in cells.iter().enumerate() {
        let width = core::f64::consts::TAU / nc as f64;
        for c in 0..nc {
            let k = counts[tile] as usize;
            tile += 1;
            for j in i..i + k {
                range_check("ra offset", j, dra[j] as f64, (dra[j] as u32) < OFFSET_STEPS, "0 to 32767")?;
                range_check("dec offset", j, ddec[j] as f64, (ddec[j] as u32) < OFFSET_STEPS, "0 to 32767")?;
                out.push(Star {
                    ra_rad: (c as f64 + (dra[j] as f64 + 0.5) / steps) * width,
                    dec_rad: -core::f64::consts::FRAC_PI_2 + (z as f64 + (ddec[j] as f64 + 0.5) / steps) * zone_h,
                    pm_ra_cosdec_mas_yr: 0.0,
                    pm_dec_mas_yr: 0.0,
                    parallax_mas: 0.0,
                    vmag: mag_from("vmag", j, vm[j] as i16, -2.0, 21.0, "-2 to 21", false)?,
                    bv: if bv[j] == 255 { f32::NAN } else { bv[j] as f32 * 0.02 - 0.5 },
                    hip: 0,
                });
            }
            i += k;
        }
    }
    Ok(out)
}
