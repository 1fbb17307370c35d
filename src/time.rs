//! Time scales: civil time → UTC → TT and UT1 → Julian dates, sidereal time.

use serde::{Deserialize, Serialize};

/// One instant on the three time scales the engine needs, as Julian dates.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Instant {
    pub utc_jd: f64,
    pub tt_jd: f64,
    pub ut1_jd: f64,
}
