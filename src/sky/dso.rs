//! Deep-sky objects from the OpenNGC file (`dso_openngc.nfd`, built by `catalog/build.py`):
//! decoding, validation, and the identifiers search uses. Format: catalog/README.md.

use serde::{Deserialize, Serialize};

use super::catalog::bytes::{crc32, Reader};
use super::catalog::CatalogError;

pub const DSO_MAGIC: &[u8; 8] = b"NFDSO\0\0\0";
pub const DSO_FORMAT_VERSION: u16 = 1;
const HEADER_LEN: usize = 48;
const CRC_AT: usize = 20;
const WHAT: &str = "deep-sky catalog file";

/// OpenNGC object types, in the file's code order.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum DsoKind {
    Star,
    DoubleStar,
    Association,
    OpenCluster,
    GlobularCluster,
    ClusterNebula,
    Galaxy,
    GalaxyPair,
    GalaxyTriplet,
    GalaxyGroup,
    PlanetaryNebula,
    HiiRegion,
    DarkNebula,
    EmissionNebula,
    Nebula,
    ReflectionNebula,
    SupernovaRemnant,
    Nova,
    Other,
}

const KINDS: [DsoKind; 19] = [
    DsoKind::Star,
    DsoKind::DoubleStar,
    DsoKind::Association,
    DsoKind::OpenCluster,
    DsoKind::GlobularCluster,
    DsoKind::ClusterNebula,
    DsoKind::Galaxy,
    DsoKind::GalaxyPair,
    DsoKind::GalaxyTriplet,
    DsoKind::GalaxyGroup,
    DsoKind::PlanetaryNebula,
    DsoKind::HiiRegion,
    DsoKind::DarkNebula,
    DsoKind::EmissionNebula,
    DsoKind::Nebula,
    DsoKind::ReflectionNebula,
    DsoKind::SupernovaRemnant,
    DsoKind::Nova,
    DsoKind::Other,
];

impl DsoKind {
    /// Plain words for labels ("galaxy", "open cluster", ...).
    pub fn words(self) -> &'static str {
        use DsoKind::*;
        match self {
            Star => "star",
            DoubleStar => "double star",
            Association => "stellar association",
            OpenCluster => "open cluster",
            GlobularCluster => "globular cluster",
            ClusterNebula => "cluster with nebula",
            Galaxy => "galaxy",
            GalaxyPair => "galaxy pair",
            GalaxyTriplet => "galaxy triplet",
            GalaxyGroup => "galaxy group",
            PlanetaryNebula => "planetary nebula",
            HiiRegion => "H II region",
            DarkNebula => "dark nebula",
            EmissionNebula => "emission nebula",
            Nebula => "nebula",
            ReflectionNebula => "reflection nebula",
            SupernovaRemnant => "supernova remnant",
            Nova => "nova",
            Other => "other object",
        }
    }
}

/// One deep-sky object (J2000 / ICRS position). Unknown values are `None`.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Dso {
    pub kind: DsoKind,
    pub ra_rad: f64,
    pub dec_rad: f64,
    pub major_arcmin: Option<f32>,
    pub minor_arcmin: Option<f32>,
    /// Position angle of the major axis, degrees from north through east.
    pub pa_deg: Option<f32>,
    pub bmag: Option<f32>,
    pub vmag: Option<f32>,
    /// Mean surface brightness, mag/arcsec² (OpenNGC, from B).
    pub surf_br_mag_arcsec2: Option<f32>,
    /// Messier number, 0 when none.
    pub messier: u8,
    /// Identifiers, OpenNGC name first: "NGC1976", cross-identifiers, duplicate-record names.
    pub ids: Vec<String>,
    /// Common names ("Orion Nebula", ...), possibly empty.
    pub common_names: Vec<String>,
}

impl Dso {
    /// Display designation: "M 42" if a Messier object, else "NGC 1976" / "IC 434" style.
    pub fn designation(&self) -> String {
        if self.messier > 0 {
            return format!("M {}", self.messier);
        }
        let id = self.ids.first().map(String::as_str).unwrap_or("");
        let split = id.find(|c: char| c.is_ascii_digit()).unwrap_or(id.len());
        let (pre, num) = id.split_at(split);
        let num = num.trim_start_matches('0');
        if pre.is_empty() || num.is_empty() {
            id.to_string()
        } else {
            format!("{pre} {num}")
        }
    }

    /// Semi-major axis in radians (0 when the size is unknown).
    pub fn radius_rad(&self) -> f64 {
        self.major_arcmin.map_or(0.0, |m| (m as f64 / 2.0 / 60.0).to_radians())
    }
}

/// A decoded deep-sky file.
#[derive(Clone, Debug, PartialEq)]
pub struct DsoCatalog {
    pub source: String,
    pub objects: Vec<Dso>,
}

/// Decode and validate a deep-sky file (format in catalog/README.md).
pub fn decode_dso(bytes: &[u8]) -> Result<DsoCatalog, CatalogError> {
    if bytes.len() >= 8 && &bytes[..8] != DSO_MAGIC {
        return Err(CatalogError::BadMagic { what: WHAT });
    }
    if bytes.len() < HEADER_LEN {
        return Err(CatalogError::Truncated { what: WHAT, need_bytes: HEADER_LEN, have_bytes: bytes.len() });
    }
    let mut h = Reader::new(&bytes[8..HEADER_LEN]);
    let version = h.u16()?;
    if version != DSO_FORMAT_VERSION {
        return Err(CatalogError::UnsupportedVersion { what: WHAT, found: version, supported: DSO_FORMAT_VERSION });
    }
    let _reserved = h.u16()?;
    let n = h.u32()? as usize;
    let payload_len = h.u32()? as usize;
    let stored = h.u32()?;
    let src = h.take(24)?;
    let need = HEADER_LEN.saturating_add(payload_len);
    if bytes.len() < need {
        return Err(CatalogError::Truncated { what: WHAT, need_bytes: need, have_bytes: bytes.len() });
    }
    if bytes.len() > need {
        return Err(CatalogError::TrailingBytes { what: WHAT, extra_bytes: bytes.len() - need });
    }
    let computed = crc32(&[&bytes[..CRC_AT], &bytes[CRC_AT + 4..]]);
    if computed != stored {
        return Err(CatalogError::ChecksumMismatch { what: WHAT, stored, computed });
    }
    // Fixed part: 4+4+1+1+2+2+2+2+2+2 = 22 bytes per object, then at least 4 bytes of strings.
    if n.saturating_mul(26) > payload_len {
        return Err(CatalogError::Inconsistent {
            what: WHAT,
            detail: format!("{n} objects cannot fit in {payload_len} bytes"),
        });
    }
    let end = src.iter().position(|&b| b == 0).unwrap_or(src.len());
    let source = core::str::from_utf8(&src[..end])
        .map_err(|_| CatalogError::BadText { field: "source", index: 0 })?
        .to_string();

    let mut r = Reader::new(&bytes[HEADER_LEN..]);
    let ra = r.take(4 * n)?;
    let dec = r.take(4 * n)?;
    let kind = r.take(n)?;
    let mess = r.take(n)?;
    let major = r.take(2 * n)?;
    let minor = r.take(2 * n)?;
    let pa = r.take(2 * n)?;
    let bm = r.take(2 * n)?;
    let vm = r.take(2 * n)?;
    let sb = r.take(2 * n)?;
    let le32 = |s: &[u8], i: usize| u32::from_le_bytes([s[4 * i], s[4 * i + 1], s[4 * i + 2], s[4 * i + 3]]);
    let le16 = |s: &[u8], i: usize| u16::from_le_bytes([s[2 * i], s[2 * i + 1]]);
    let bad = |field: &'static str, i: usize, v: f64, allowed: &'static str| CatalogError::ValueOutOfRange {
        field,
        index: i,
        value: v,
        allowed,
    };
    let size = |v: u16| if v == 0xFFFF { None } else { Some(v as f32 / 100.0) };
    let mag = |field: &'static str, i: usize, v: u16, lo: f32, hi: f32, allowed: &'static str| {
        let v = v as i16;
        if v == i16::MIN {
            return Ok(None);
        }
        let m = v as f32 / 1000.0;
        if (lo..=hi).contains(&m) {
            Ok(Some(m))
        } else {
            Err(bad(field, i, m as f64, allowed))
        }
    };
    let mut objects = Vec::with_capacity(n);
    for i in 0..n {
        let d = le32(dec, i) as i32;
        if d == i32::MIN {
            return Err(bad("dec", i, d as f64, "±90°"));
        }
        let k = *KINDS.get(kind[i] as usize).ok_or_else(|| bad("kind", i, kind[i] as f64, "0 to 18"))?;
        if mess[i] > 110 {
            return Err(bad("messier", i, mess[i] as f64, "0 to 110"));
        }
        let p = le16(pa, i);
        if p != 0xFFFF && p > 360 {
            return Err(bad("pa_deg", i, p as f64, "0 to 360 or unknown"));
        }
        let ids = read_list(&mut r, "ids", i)?;
        if ids.is_empty() {
            return Err(bad("ids", i, 0.0, "at least one identifier"));
        }
        let common_names = read_list(&mut r, "common_names", i)?;
        objects.push(Dso {
            kind: k,
            ra_rad: le32(ra, i) as f64 * (core::f64::consts::TAU / 4_294_967_296.0),
            dec_rad: d as f64 * (core::f64::consts::FRAC_PI_2 / 2_147_483_647.0),
            major_arcmin: size(le16(major, i)),
            minor_arcmin: size(le16(minor, i)),
            pa_deg: if p == 0xFFFF { None } else { Some(p as f32) },
            bmag: mag("bmag", i, le16(bm, i), -2.0, 30.0, "-2 to 30 or unknown")?,
            vmag: mag("vmag", i, le16(vm, i), -2.0, 30.0, "-2 to 30 or unknown")?,
            surf_br_mag_arcsec2: mag("surf_br_mag_arcsec2", i, le16(sb, i), 0.0, 32.0, "0 to 32 or unknown")?,
            messier: mess[i],
            ids,
            common_names,
        });
    }
    if r.take(1).is_ok() {
        return Err(CatalogError::Inconsistent { what: WHAT, detail: "bytes left over after the last object".into() });
    }
    Ok(DsoCatalog { source, objects })
}

fn read_list(r: &mut Reader, field: &'static str, index: usize) -> Result<Vec<String>, CatalogError> {
    let len = r.u16()? as usize;
    let raw = r.take(len)?;
    let s = core::str::from_utf8(raw).map_err(|_| CatalogError::BadText { field, index })?;
    Ok(s.split(',').map(str::trim).filter(|t| !t.is_empty()).map(String::from).collect())
}
