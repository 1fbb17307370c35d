//! Any date or site a user or a link can feed in gives a value or a typed
//! error, never a panic (proptest over wild inputs).

#[path = "solar_common.rs"]
mod common;
use common::*;
use nightfield::sky::Site;
use nightfield::solar::jupiter::grs_transits_tt;
use nightfield::solar::jupiter_events::moon_events;
use nightfield::solar::riseset::body_rise_transit_set;
use nightfield::solar::{all_bodies, galilean_moons_at, moon_at, saturn_rings_at, BodyId};
use nightfield::time::Instant;
use proptest::prelude::*;

fn wild() -> impl Strategy<Value = f64> {
    prop_oneof![
        2_400_000.0..2_500_000.0f64,
        2_433_282.0..2_470_147.0f64,
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(-1e300),
        any::<f64>(),
    ]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, ..ProptestConfig::default() })]
    #[test]
    fn wild_dates_and_sites_never_panic(tt in wild(), lat in any::<f64>(), lon in -10.0..10.0f64, elev in -1e4..1e5f64) {
        let e = eph();
        let t = Instant { utc_jd: tt, tt_jd: tt, ut1_jd: tt };
        let site = Site { lat_rad: lat, lon_rad: lon, elev_m: elev };
        let _ = all_bodies(&e, &t, &site);
        let _ = galilean_moons_at(&e, &t);
        let _ = saturn_rings_at(&e, &t, &site);
        let _ = moon_at(&e, &t, &site);
        let _ = grs_transits_tt(&e, tt, tt + 0.5, lat);
        let _ = moon_events(&e, tt, tt + 0.1);
        let _ = body_rise_transit_set(&e, BodyId::Moon, &site, tt, tt + 0.5);
    }
}

#[test]
fn a_bad_site_is_a_typed_error() {
    use nightfield::solar::{body_apparent, SolarError};
    let e = eph();
    let t = Instant::from_utc_jd(2_460_400.4).unwrap();
    let site = Site { lat_rad: 2.0, lon_rad: 0.0, elev_m: 0.0 };
    let err = body_apparent(&e, BodyId::Mars, &t, &site).unwrap_err();
    assert_eq!(err, SolarError::BadSite);
    assert!(err.to_string().contains("latitude"));
}
