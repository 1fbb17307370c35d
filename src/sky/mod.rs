//! The sky core: coordinates, frames, apparent places, horizon coordinates,
//! the sky's own brightness (moonlight, twilight), catalogs and their spatial
//! index, target search.
//!
//! Shared value types live here so every module speaks the same units:
//! radians inside, degrees only at the edges (JSON, words).

pub mod apparent;
pub mod brightness;
pub mod catalog;
pub mod darkness;
pub mod dso;
pub mod earth_ephem;
pub mod frames;
pub mod horizon;
pub mod index;
pub mod names;
pub mod nutation;
pub mod refraction;
pub mod riseset;
pub mod search;

use serde::{Deserialize, Serialize};

/// A direction on the sky in an equatorial frame (which frame is said by the
/// function that returns it: ICRS/GCRS, true equator and equinox of date, CIRS).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Equatorial {
    pub ra_rad: f64,
    pub dec_rad: f64,
}

/// A direction in the horizon frame: altitude above the horizon and azimuth
/// measured from north through east.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Horizontal {
    pub alt_rad: f64,
    pub az_rad: f64,
}

/// An observing site on the WGS84 ellipsoid. Longitude is east-positive.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Site {
    pub lat_rad: f64,
    pub lon_rad: f64,
    pub elev_m: f64,
}
