//! Rise and set of the Sun, the Moon, Venus and Jupiter against skyfield's
//! almanac.find_risings/find_settings with its default horizons (gen_solar.py).

#[path = "solar_common.rs"]
mod common;
use common::*;
use nightfield::sky::riseset::EventKind;
use nightfield::sky::Site;
use nightfield::solar::riseset::body_rise_transit_set;
use nightfield::solar::{BodyId, SolarError};

#[test]
fn rise_and_set_match_skyfield_within_20_seconds() {
    // Bar: UT1 = UTC on our side (|UT1−UTC| < 0.9 s) and skyfield's hour-angle
    // root finder; 20 s is far above both and far below what a plan needs.
    let e = eph();
    let fx = fixture();
    let s = &fx["riseset_site"];
    let site = Site { lat_rad: f(&s["lat_deg"]).to_radians(), lon_rad: f(&s["lon_deg"]).to_radians(), elev_m: f(&s["elev_m"]) };
    let mut worst = 0.0f64;
    for row in fx["riseset"].as_array().unwrap() {
        let start = f(&row["start_utc_jd"]);
        for b in [BodyId::Sun, BodyId::Moon, BodyId::Venus, BodyId::Jupiter] {
            let r = body_rise_transit_set(&e, b, &site, start, start + 1.0).unwrap();
            let want = &row["bodies"][b.name()];
            for (kind, key) in [(EventKind::Rise, "rise_utc_jd"), (EventKind::Set, "set_utc_jd")] {
                let ours: Vec<f64> = r.events.iter().filter(|x| x.kind == kind).map(|x| x.utc_jd).collect();
                let theirs: Vec<f64> = want[key].as_array().unwrap().iter().map(f).collect();
                assert_eq!(ours.len(), theirs.len(), "{} {key} at {start}", b.name());
                for (o, t) in ours.iter().zip(&theirs) {
                    let ds = (o - t).abs() * 86_400.0;
                    worst = worst.max(ds);
                    assert!(ds < 20.0, "{} {key} at {start}: {ds:.1} s", b.name());
                }
            }
        }
    }
    println!("worst rise/set difference {worst:.2} s");
}

#[test]
fn windows_outside_coverage_are_refused_clearly() {
    let e = eph();
    let site = Site { lat_rad: 0.8, lon_rad: 0.1, elev_m: 0.0 };
    let err = body_rise_transit_set(&e, BodyId::Moon, &site, 2_420_000.5, 2_420_001.5).unwrap_err();
    assert!(matches!(err, SolarError::OutOfCoverage { .. }), "{err:?}");
    let err = body_rise_transit_set(&e, BodyId::Moon, &site, 2_451_545.0, 2_451_500.0).unwrap_err();
    assert!(matches!(err, SolarError::Window { .. }), "{err:?}");
    assert!(!err.to_string().is_empty());
}
