//! Share-link codec: round trips, the typed errors, and a fuzz of the decoder.
use nightfield::share::{self, ShareError, SHARE_VERSION};
use proptest::prelude::*;
use serde::{Deserialize, Serialize};
use serde_json::json;

#[derive(Serialize, Deserialize, Debug, PartialEq, Clone)]
struct Sample {
    lat_deg: f64,
    lon_deg: f64,
    names: Vec<String>,
    focal_mm: Vec<f64>,
}

fn demo() -> serde_json::Value {
    // Invented demo data (an invented club at an invented site).
    json!({
        "site": {"name": "Hollow Meadow field", "lat_deg": 47.123456, "lon_deg": 8.654321, "elev_m": 612.0,
                 "tz": "Europe/Zurich"},
        "time": {"utc": "2026-12-05T20:30:00Z"},
        "kit": {"stations": [{"name": "Station A", "telescope": {"aperture_mm": 200.0, "focal_mm": 1200.0},
                               "eyepieces": [{"focal_mm": 25.0, "afov_deg": 52.0}, {"focal_mm": 10.0, "afov_deg": 60.0}]}]},
        "target": "M 42"
    })
}

#[test]
fn round_trip_is_exact_and_deterministic() {
    let v = demo();
    let a = share::encode(&v).unwrap();
    let b = share::encode(&v).unwrap();
    assert_eq!(a, b, "same value, same link");
    let back: serde_json::Value = share::decode(&a).unwrap();
    assert_eq!(back, v);
    // Accepts the fragment and a whole URL too.
    let back2: serde_json::Value = share::decode(&format!("#s={a}")).unwrap();
    let back3: serde_json::Value = share::decode(&format!("https://example.invalid/app/#s={a}")).unwrap();
    assert_eq!(back2, v);
    assert_eq!(back3, v);
    assert!(a.chars().all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_'));
    // Compact: far shorter than the JSON itself.
    let json_len = serde_json::to_string(&v).unwrap().len();
    assert!(a.len() < json_len, "link {} chars vs json {json_len}", a.len());
}

#[test]
fn typed_errors() {
    let good = share::encode(&demo()).unwrap();
    assert_eq!(share::decode::<serde_json::Value>(""), Err(ShareError::Empty));
    assert_eq!(share::decode::<serde_json::Value>("#s="), Err(ShareError::Empty));
    assert!(matches!(share::decode::<serde_json::Value>("abc$def"), Err(ShareError::BadCharacter { position: 3, found: '$' })));
    // Truncated: cutting the link breaks length or checksum, never panics.
    for cut in 1..good.len() {
        let r = share::decode::<serde_json::Value>(&good[..cut]);
        assert!(matches!(r, Err(ShareError::Truncated | ShareError::Checksum)), "cut {cut}: {r:?}");
    }
    // Future version: rewrite the version byte and fix the checksum.
    let mut bytes = share::base64url_decode(&good).unwrap();
    bytes[0] = SHARE_VERSION + 1;
    let n = bytes.len();
    let crc = share::crc32(&bytes[..n - 4]);
    bytes[n - 4..].copy_from_slice(&crc.to_le_bytes());
    let future = share::base64url_encode(&bytes);
    let err = share::decode::<serde_json::Value>(&future).unwrap_err();
    assert_eq!(err, ShareError::FutureVersion { found: SHARE_VERSION + 1, newest_known: SHARE_VERSION });
    assert!(err.to_string().contains("newer Nightfield"));
    // Altered character: checksum catches it.
    let mut altered: Vec<char> = good.chars().collect();
    let mid = altered.len() / 2;
    altered[mid] = if altered[mid] == 'A' { 'B' } else { 'A' };
    let altered: String = altered.into_iter().collect();
    assert!(matches!(share::decode::<serde_json::Value>(&altered), Err(ShareError::Checksum | ShareError::Truncated)));
    // Intact but the wrong shape.
    let other = share::encode(&json!({"lat_deg": "north"})).unwrap();
    assert!(matches!(share::decode::<Sample>(&other), Err(ShareError::NotAScenario(_))));
    // Too long.
    let long = "A".repeat(share::MAX_LINK_CHARS + 4);
    assert!(matches!(share::decode::<serde_json::Value>(&long), Err(ShareError::TooLong { .. })));
}

#[test]
fn deflate_bomb_is_refused() {
    let big = vec![b' '; share::MAX_JSON_BYTES + 10];
    let link = share::encode_json_bytes(&big);
    assert_eq!(share::decode_json_bytes(&link), Err(ShareError::TooLarge { max_bytes: share::MAX_JSON_BYTES }));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Any text fed to the decoder gives a value or a typed error, never a panic.
    #[test]
    fn decoder_never_panics_on_text(s in ".{0,300}") {
        let _ = share::decode::<serde_json::Value>(&s);
    }

    /// Any bytes, base64url-encoded, likewise.
    #[test]
    fn decoder_never_panics_on_bytes(b in proptest::collection::vec(any::<u8>(), 0..400)) {
        let _ = share::decode::<serde_json::Value>(&share::base64url_encode(&b));
    }

    /// Flipping any bit of a valid link is detected (CRC-32 catches every single-bit error).
    #[test]
    fn single_bit_flips_are_caught(idx in 0usize..10_000, bit in 0u8..8) {
        let good = share::encode(&demo()).unwrap();
        let mut bytes = share::base64url_decode(&good).unwrap();
        let i = idx % bytes.len();
        bytes[i] ^= 1 << bit;
        let r = share::decode::<serde_json::Value>(&share::base64url_encode(&bytes));
        prop_assert!(r.is_err());
    }

    /// Floats survive bit-exactly (needed for identical pixels after a link round trip).
    #[test]
    fn floats_round_trip_exactly(lat in -90.0f64..90.0, lon in -180.0f64..180.0,
                                 f in proptest::collection::vec(0.1f64..5000.0, 0..8),
                                 names in proptest::collection::vec("[ -~]{0,12}", 0..4)) {
        let s = Sample { lat_deg: lat, lon_deg: lon, names, focal_mm: f };
        let back: Sample = share::decode(&share::encode(&s).unwrap()).unwrap();
        prop_assert_eq!(back.lat_deg.to_bits(), s.lat_deg.to_bits());
        prop_assert_eq!(back, s);
    }
}
