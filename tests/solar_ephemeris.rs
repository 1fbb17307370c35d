//! The ephemeris file: decoder validation, fuzzing, coverage errors, and
//! geocentric astrometric places against skyfield + JPL DE421
//! (tests/fixtures/gen_solar.py writes the check values).

use nightfield::solar::geometry::{geocentric_astrometric, ra_dec_rad};
use nightfield::solar::{BodyId, Ephemeris, EphemerisError, SolarError};
use proptest::prelude::*;

fn file() -> Vec<u8> {
    std::fs::read(concat!(env!("CARGO_MANIFEST_DIR"), "/catalog/ephemeris.bin")).unwrap()
}

fn fixture() -> serde_json::Value {
    let s = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/solar.json")).unwrap();
    serde_json::from_str(&s).unwrap()
}

fn sep_arcsec(ra1: f64, dec1: f64, ra2: f64, dec2: f64) -> f64 {
    let c = dec1.sin() * dec2.sin() + dec1.cos() * dec2.cos() * (ra1 - ra2).cos();
    let s = ((dec1.cos() * (ra1 - ra2).sin()).powi(2)
        + (dec2.sin() * dec1.cos() * (ra1 - ra2).cos() - dec1.sin() * dec2.cos()).powi(2))
    .sqrt();
    s.atan2(c).to_degrees() * 3600.0
}

#[test]
fn committed_file_decodes_and_covers_1950_to_2050() {
    let e = Ephemeris::decode(&file()).unwrap();
    assert!(e.start_jd() <= 2_433_282.5, "starts by 1950-01-01");
    assert!(e.end_jd() >= 2_469_807.5, "runs to at least 2050-01-01");
    // DE421 EMRAT (Folkner et al. 2008).
    assert!((e.emrat() - 81.300_569_07).abs() < 1e-6);
}

#[test]
fn geocentric_astrometric_matches_skyfield_de421() {
    // Check values: skyfield 1.55 + DE421, earth.at(t).observe(body).radec() (ICRS).
    // Bars: the fit tolerances (Moon 0.15 km, planets <= 100 km) give < 0.1″;
    // TDB−TT by the two-term series adds < 0.01″.
    let e = Ephemeris::decode(&file()).unwrap();
    let fx = fixture();
    let mut worst = 0.0f64;
    for case in fx["cases"].as_array().unwrap() {
        let tt = case["tt_jd"].as_f64().unwrap();
        for b in BodyId::ALL {
            let row = &case["bodies"][b.name()];
            let (v, _) = geocentric_astrometric(&e, b, tt).unwrap();
            let (ra, dec) = ra_dec_rad(v);
            let d = sep_arcsec(
                ra,
                dec,
                row["astrometric_ra_deg"].as_f64().unwrap().to_radians(),
                row["astrometric_dec_deg"].as_f64().unwrap().to_radians(),
            );
            let bar = if b == BodyId::Moon { 0.2 } else { 0.1 };
            assert!(d < bar, "{} at TT {tt}: {d:.4}″ off", b.name());
            let dist = row["geocentric_distance_au"].as_f64().unwrap();
            assert!((v.length() / dist - 1.0).abs() < 2e-7, "{} distance", b.name());
            worst = worst.max(d);
        }
    }
    println!("worst astrometric difference {worst:.4}″");
}

#[test]
fn dates_outside_coverage_give_a_clear_error() {
    let e = Ephemeris::decode(&file()).unwrap();
    let err = geocentric_astrometric(&e, BodyId::Mars, 2_430_000.5).unwrap_err();
    assert!(matches!(err, SolarError::OutOfCoverage { .. }));
    let msg = err.to_string();
    assert!(msg.contains("outside") && msg.contains("1950-01-01") && msg.contains("2050-12-06"), "{msg}");
    println!("{msg}");
    assert!(geocentric_astrometric(&e, BodyId::Moon, 2_480_000.5).is_err());
    assert!(matches!(geocentric_astrometric(&e, BodyId::Moon, f64::NAN), Err(SolarError::NotFinite { .. })));
}

#[test]
fn corrupt_files_are_rejected_with_typed_errors() {
    let good = file();
    assert_eq!(Ephemeris::decode(&good[..10]).unwrap_err(), EphemerisError::TooShort { len: 10 });
    let mut bad = good.clone();
    bad[0] = b'X';
    assert_eq!(Ephemeris::decode(&bad).unwrap_err(), EphemerisError::BadMagic);
    let mut bad = good.clone();
    bad[8] = 9;
    assert_eq!(Ephemeris::decode(&bad).unwrap_err(), EphemerisError::UnsupportedVersion { found: 9 });
    let mut bad = good.clone();
    let n = bad.len();
    bad[n / 2] ^= 0x10;
    assert_eq!(Ephemeris::decode(&bad).unwrap_err(), EphemerisError::Checksum);
    let short = &good[..good.len() - 1];
    assert!(matches!(Ephemeris::decode(short).unwrap_err(), EphemerisError::LengthMismatch { .. }));
    assert!(!EphemerisError::BadMagic.to_string().is_empty());
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 200, ..ProptestConfig::default() })]
    #[test]
    fn random_bytes_never_panic(bytes in proptest::collection::vec(any::<u8>(), 0..2000)) {
        let _ = Ephemeris::decode(&bytes);
    }

    #[test]
    fn mutated_headers_never_panic(edits in proptest::collection::vec((0usize..400, any::<u8>()), 1..8),
                                   cut in 0usize..500) {
        // Mutate the header and body table (where lengths live) and truncate the tail.
        let mut b = file();
        for (i, v) in edits { b[i] = v; }
        let keep = b.len() - cut;
        b.truncate(keep);
        let _ = Ephemeris::decode(&b);
    }
}

fn fnv1a64(data: &[u8]) -> u64 {
    let mut h: u64 = 0xCBF2_9CE4_8422_2325;
    for &b in data {
        h ^= b as u64;
        h = h.wrapping_mul(0x0000_0100_0000_01B3);
    }
    h
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, ..ProptestConfig::default() })]
    #[test]
    fn mutations_with_a_valid_checksum_never_panic(edits in proptest::collection::vec((any::<u32>(), any::<u8>()), 1..6),
                                                   cut in 0usize..64) {
        // Reseal the checksum so the coefficient decoder itself is exercised.
        let mut b = file();
        b.truncate(b.len() - 8 - cut);
        for (i, v) in edits { let n = b.len(); b[i as usize % n] = v; }
        let h = fnv1a64(&b);
        b.extend_from_slice(&h.to_le_bytes());
        if let Ok(e) = Ephemeris::decode(&b) {
            for b in BodyId::ALL {
                let _ = geocentric_astrometric(&e, b, 2_451_545.0);
            }
        }
    }
}
