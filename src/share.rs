//! Share links: a compact, versioned, checksummed, URL-safe text form of a scenario.
//!
//! Layout of the bytes before text encoding (all ours, "nightfield share v1"):
//!   byte 0          format version (1)
//!   bytes 1..n-4    raw DEFLATE (RFC 1951) of the value's JSON text
//!   last 4 bytes    CRC-32 (IEEE 802.3 polynomial, RFC 1952) of bytes 0..n-4, little endian
//! The text is unpadded base64url (RFC 4648 §5), so it can sit in a URL fragment
//! (`#s=<payload>`) and in a QR code's byte mode. The JSON is produced by serde, so
//! the same value always gives the same link (deflate at a fixed level is deterministic).
//! Decoding never panics: every failure is a [`ShareError`] in plain words.

use serde::{de::DeserializeOwned, Serialize};
use std::fmt;

/// The format version this build writes and the newest it reads.
pub const SHARE_VERSION: u8 = 1;
/// The fragment key the page uses: `#s=<payload>`.
pub const FRAGMENT_KEY: &str = "s=";
/// Longest payload text accepted (a QR code holds at most 2953 bytes).
pub const MAX_LINK_CHARS: usize = 8192;
/// Largest JSON a link may inflate to (guards against deflate bombs).
pub const MAX_JSON_BYTES: usize = 256 * 1024;
/// DEFLATE level used when writing (fixed so links are reproducible).
const DEFLATE_LEVEL: u8 = 10;

/// Why a share link could not be read or written.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ShareError {
    /// The link holds no scenario data after `#s=`.
    Empty,
    /// The link is longer than any link this app writes.
    TooLong { chars: usize, max: usize },
    /// A character that base64url does not use.
    BadCharacter { position: usize, found: char },
    /// The text length cannot come from whole bytes, or too few bytes for a header.
    Truncated,
    /// Written by a newer Nightfield than this one.
    FutureVersion { found: u8, newest_known: u8 },
    /// Version byte 0 is never written.
    UnknownVersion { found: u8 },
    /// The checksum does not match: the link was cut or altered.
    Checksum,
    /// The compressed data is damaged.
    Corrupt,
    /// The data inflates beyond the limit.
    TooLarge { max_bytes: usize },
    /// The data is intact but does not describe a scenario this app understands.
    NotAScenario(String),
    /// Writing failed: the value could not be turned into JSON.
    Encode(String),
}

impl fmt::Display for ShareError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ShareError::Empty => write!(f, "the share link holds no scenario (nothing after \"#s=\")"),
            ShareError::TooLong { chars, max } => {
                write!(f, "the share link is {chars} characters long; at most {max} are allowed")
            }
            ShareError::BadCharacter { position, found } => write!(
                f,
                "the share link has a character {found:?} at position {position} that does not belong \
                 (allowed: letters, digits, '-' and '_'); it may have been mistyped or cut"
            ),
            ShareError::Truncated => write!(f, "the share link is incomplete: it seems to have been cut short"),
            ShareError::FutureVersion { found, newest_known } => write!(
                f,
                "the share link was made by a newer Nightfield (link format {found}; this app reads up to \
                 {newest_known}); update the app and open the link again"
            ),
            ShareError::UnknownVersion { found } => {
                write!(f, "the share link has an unknown format number {found} (allowed: 1 to {SHARE_VERSION})")
            }
            ShareError::Checksum => {
                write!(f, "the share link is damaged: its checksum does not match (it was cut or altered)")
            }
            ShareError::Corrupt => write!(f, "the share link is damaged: its compressed data cannot be unpacked"),
            ShareError::TooLarge { max_bytes } => {
                write!(f, "the share link unpacks to more than {max_bytes} bytes, the most a scenario may take")
            }
            ShareError::NotAScenario(why) => write!(f, "the share link does not hold a valid scenario: {why}"),
            ShareError::Encode(why) => write!(f, "the scenario could not be written as a link: {why}"),
        }
    }
}

impl std::error::Error for ShareError {}

/// Encode any serde value as link payload text (no `#s=` prefix).
pub fn encode<T: Serialize>(value: &T) -> Result<String, ShareError> {
    let json = serde_json::to_vec(value).map_err(|e| ShareError::Encode(e.to_string()))?;
    Ok(encode_json_bytes(&json))
}

/// Decode link text (a bare payload, `#s=...`, or a whole URL) into a serde value.
pub fn decode<T: DeserializeOwned>(link: &str) -> Result<T, ShareError> {
    let json = decode_json_bytes(link)?;
    let text = std::str::from_utf8(&json).map_err(|_| ShareError::NotAScenario("the link's contents are not text".into()))?;
    crate::json::from_str(text).map_err(|e| ShareError::NotAScenario(e.to_string()))
}

/// Payload text for raw JSON bytes (used by `encode`; public for tests and tools).
pub fn encode_json_bytes(json: &[u8]) -> String {
    let mut bytes = Vec::with_capacity(json.len() / 2 + 8);
    bytes.push(SHARE_VERSION);
    bytes.extend_from_slice(&miniz_oxide::deflate::compress_to_vec(json, DEFLATE_LEVEL));
    let crc = crc32(&bytes);
    bytes.extend_from_slice(&crc.to_le_bytes());
    base64url_encode(&bytes)
}

/// The JSON bytes a link carries, after all checks.
pub fn decode_json_bytes(link: &str) -> Result<Vec<u8>, ShareError> {
    let payload = payload_of(link);
    if payload.is_empty() {
        return Err(ShareError::Empty);
    }
    if payload.len() > MAX_LINK_CHARS {
        return Err(ShareError::TooLong { chars: payload.chars().count(), max: MAX_LINK_CHARS });
    }
    let bytes = base64url_decode(payload)?;
    if bytes.len() < 1 + 4 {
        return Err(ShareError::Truncated);
    }
    let version = bytes[0];
    if version > SHARE_VERSION {
        return Err(ShareError::FutureVersion { found: version, newest_known: SHARE_VERSION });
    }
    if version == 0 {
        return Err(ShareError::UnknownVersion { found: version });
    }
    let (body, tail) = bytes.split_at(bytes.len() - 4);
    let stored = u32::from_le_bytes([tail[0], tail[1], tail[2], tail[3]]);
    if crc32(body) != stored {
        return Err(ShareError::Checksum);
    }
    miniz_oxide::inflate::decompress_to_vec_with_limit(&body[1..], MAX_JSON_BYTES).map_err(|e| {
        match e.status {
            miniz_oxide::inflate::TINFLStatus::HasMoreOutput => ShareError::TooLarge { max_bytes: MAX_JSON_BYTES },
            _ => ShareError::Corrupt,
        }
    })
}

/// Strip a URL or fragment down to the payload: everything after the last "#s=" or "#".
fn payload_of(link: &str) -> &str {
    let s = link.trim();
    let s = match s.rfind('#') {
        Some(i) => &s[i + 1..],
        None => s,
    };
    s.strip_prefix(FRAGMENT_KEY).unwrap_or(s)
}

const B64: &[u8; 64] = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

/// Unpadded base64url, RFC 4648 §5.
pub fn base64url_encode(bytes: &[u8]) -> String {
    let mut out = String::with_capacity(bytes.len().div_ceil(3) * 4);
    for chunk in bytes.chunks(3) {
        let b = [chunk[0], *chunk.get(1).unwrap_or(&0), *chunk.get(2).unwrap_or(&0)];
        let n = (u32::from(b[0]) << 16) | (u32::from(b[1]) << 8) | u32::from(b[2]);
        let chars = chunk.len() + 1;
        for k in 0..chars {
            out.push(B64[((n >> (18 - 6 * k)) & 63) as usize] as char);
        }
    }
    out
}

/// Inverse of [`base64url_encode`]; rejects padding, other alphabets and impossible lengths.
pub fn base64url_decode(text: &str) -> Result<Vec<u8>, ShareError> {
    let mut vals = Vec::with_capacity(text.len());
    for (position, found) in text.chars().enumerate() {
        let v = match found {
            'A'..='Z' => found as u32 - 'A' as u32,
            'a'..='z' => found as u32 - 'a' as u32 + 26,
            '0'..='9' => found as u32 - '0' as u32 + 52,
            '-' => 62,
            '_' => 63,
            _ => return Err(ShareError::BadCharacter { position, found }),
        };
        vals.push(v);
    }
    if vals.len() % 4 == 1 {
        return Err(ShareError::Truncated);
    }
    let mut out = Vec::with_capacity(vals.len() * 3 / 4);
    for chunk in vals.chunks(4) {
        let mut n = 0u32;
        for (k, v) in chunk.iter().enumerate() {
            n |= v << (18 - 6 * k);
        }
        let bytes = chunk.len() - 1;
        for k in 0..bytes {
            out.push((n >> (16 - 8 * k)) as u8);
        }
    }
    Ok(out)
}

const CRC_TABLE: [u32; 256] = crc_table();

const fn crc_table() -> [u32; 256] {
    let mut table = [0u32; 256];
    let mut i = 0;
    while i < 256 {
        let mut c = i as u32;
        let mut k = 0;
        while k < 8 {
            c = if c & 1 != 0 { 0xEDB8_8320 ^ (c >> 1) } else { c >> 1 };
            k += 1;
        }
        table[i] = c;
        i += 1;
    }
    table
}

/// CRC-32 with the IEEE 802.3 polynomial (reflected 0xEDB88320), as in RFC 1952 and PNG.
pub fn crc32(bytes: &[u8]) -> u32 {
    crc32_update(0xFFFF_FFFF, bytes) ^ 0xFFFF_FFFF
}

/// One step of CRC-32 over `bytes` from the running (pre-inverted) value `c`
/// (the catalog decoders feed several slices through it).
pub fn crc32_update(mut c: u32, bytes: &[u8]) -> u32 {
    for &b in bytes {
        c = CRC_TABLE[((c ^ u32::from(b)) & 0xFF) as usize] ^ (c >> 8);
    }
    c
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn crc32_check_value() {
        // The standard CRC-32 check value of "123456789" (RFC 1952 / common practice): 0xCBF43926.
        assert_eq!(crc32(b"123456789"), 0xCBF4_3926);
    }

    #[test]
    fn base64url_rfc4648_vectors() {
        // RFC 4648 §10 test vectors, padding removed.
        for (raw, enc) in [("", ""), ("f", "Zg"), ("fo", "Zm8"), ("foo", "Zm9v"), ("foob", "Zm9vYg"),
                           ("fooba", "Zm9vYmE"), ("foobar", "Zm9vYmFy")] {
            assert_eq!(base64url_encode(raw.as_bytes()), enc);
            assert_eq!(base64url_decode(enc).unwrap(), raw.as_bytes());
        }
        assert_eq!(base64url_encode(&[0xfb, 0xff]), "-_8");
    }
}
