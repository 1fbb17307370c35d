//! Little-endian byte reading and CRC-32 shared by the catalog decoders.

use super::CatalogError;

/// CRC-32 (IEEE 802.3, reflected, polynomial 0xEDB88320) over several slices, as zlib.crc32
/// (the same table as the share links: `share::crc32_update`).
pub fn crc32(parts: &[&[u8]]) -> u32 {
    !parts.iter().fold(0xFFFF_FFFFu32, |c, p| crate::share::crc32_update(c, p))
}

/// A bounds-checked cursor: every read past the end is `CatalogError::Truncated`.
pub struct Reader<'a> {
    buf: &'a [u8],
    pos: usize,
}

impl<'a> Reader<'a> {
    pub fn new(buf: &'a [u8]) -> Self {
        Reader { buf, pos: 0 }
    }

    pub fn take(&mut self, n: usize) -> Result<&'a [u8], CatalogError> {
        let end = self.pos.checked_add(n).filter(|&e| e <= self.buf.len()).ok_or(CatalogError::Truncated {
            what: "catalog file section",
            need_bytes: self.pos.saturating_add(n),
            have_bytes: self.buf.len(),
        })?;
        let s = &self.buf[self.pos..end];
        self.pos = end;
        Ok(s)
    }

    pub fn u8(&mut self) -> Result<u8, CatalogError> {
        Ok(self.take(1)?[0])
    }
    pub fn u16(&mut self) -> Result<u16, CatalogError> {
        let b = self.take(2)?;
        Ok(u16::from_le_bytes([b[0], b[1]]))
    }
    pub fn u32(&mut self) -> Result<u32, CatalogError> {
        let b = self.take(4)?;
        Ok(u32::from_le_bytes([b[0], b[1], b[2], b[3]]))
    }
    pub fn f32(&mut self) -> Result<f32, CatalogError> {
        Ok(f32::from_bits(self.u32()?))
    }
    pub fn f64(&mut self) -> Result<f64, CatalogError> {
        let b = self.take(8)?;
        let mut a = [0u8; 8];
        a.copy_from_slice(b);
        Ok(f64::from_le_bytes(a))
    }

    /// `n` values of `W` bytes stored byte-plane by byte-plane (all low bytes first).
    fn shuffled<const W: usize>(&mut self, n: usize) -> Result<Vec<u32>, CatalogError> {
        let raw = self.take(n.checked_mul(W).unwrap_or(usize::MAX))?;
        let mut out = vec![0u32; n];
        for plane in 0..W {
            let p = &raw[plane * n..(plane + 1) * n];
            for (o, &b) in out.iter_mut().zip(p) {
                *o |= (b as u32) << (8 * plane);
            }
        }
        Ok(out)
    }
    pub fn shuffled_u32(&mut self, n: usize) -> Result<Vec<u32>, CatalogError> {
        self.shuffled::<4>(n)
    }
    pub fn shuffled_u16(&mut self, n: usize) -> Result<Vec<u16>, CatalogError> {
        Ok(self.shuffled::<2>(n)?.into_iter().map(|v| v as u16).collect())
    }
}
