//! Glue to the sky core: everything the find module needs for one site and
//! instant — alt/az of a target and of landmarks, the finder's "up", the
//! zenith in the catalog's frame for star-hop words.
//!
//! Altitudes here are geometric (no refraction): refraction lifts a target by
//! at most about half a degree at the horizon, under the hand-measure
//! resolution of the words; setting circles should be fed refracted altitudes.

use super::geom::zenith_equatorial;
use super::words::{pointing_words, Landmark, LandmarkRule, Pointing};
use super::FindError;
use crate::sky::apparent::{star_apparent, CatalogPlace};
use crate::sky::catalog::Star;
use crate::sky::frames::{npb_matrix, ra_dec_of, unit_vector};
use crate::sky::horizon::{hour_angle_rad, parallactic_angle_rad, to_horizontal};
use crate::sky::{Equatorial, Horizontal, Site};
use crate::time::{local_sidereal_rad, Instant};

/// A catalog star's place and motion as the sky core wants it.
pub fn catalog_place(s: &Star) -> CatalogPlace {
    CatalogPlace::from(s)
}

/// Geometric alt/az of a catalog star (apparent place, IAU 2006/2000B, via `sky`).
pub fn star_horizontal(s: &Star, epoch_jyear: f64, site: &Site, t: &Instant) -> Horizontal {
    to_horizontal(star_apparent(&catalog_place(s), epoch_jyear, t), site, t)
}

/// A landmark from a named catalog star at this site and instant.
pub fn star_landmark(name: &str, s: &Star, epoch_jyear: f64, site: &Site, t: &Instant) -> Landmark {
    Landmark { name: name.to_string(), pos: star_horizontal(s, epoch_jyear, site, t), vmag: s.vmag as f64 }
}

/// A landmark from any apparent place (true equator and equinox of date),
/// e.g. a planet from the solar module.
pub fn apparent_landmark(name: &str, app: Equatorial, vmag: f64, site: &Site, t: &Instant) -> Landmark {
    Landmark { name: name.to_string(), pos: to_horizontal(app, site, t), vmag }
}

/// The position angle of "up" (toward the zenith) at an apparent place: the
/// parallactic angle (ERFA `eraHd2pa`, via `sky::horizon`). Feed it to
/// `Finder::orientation` for a finder on an alt-azimuth mount.
pub fn up_pa_rad(app: Equatorial, site: &Site, t: &Instant) -> f64 {
    parallactic_angle_rad(hour_angle_rad(app.ra_rad, site.lon_rad, t), app.dec_rad, site.lat_rad)
}

/// The zenith as a direction in the GCRS/ICRS axes of the star catalogs:
/// (LAST, latitude) of date turned back by the NPB matrix (IAU 2006/2000B).
/// Aberration (≤ 20″) is ignored: this only orients direction words.
pub fn zenith_catalog_frame(site: &Site, t: &Instant) -> Equatorial {
    let z = zenith_equatorial(local_sidereal_rad(t, site.lon_rad), site.lat_rad);
    let v = npb_matrix(t.tt_jd).transpose() * unit_vector(z.ra_rad, z.dec_rad);
    let (ra_rad, dec_rad) = ra_dec_of(v);
    Equatorial { ra_rad, dec_rad }
}

/// Pointing words for a target given by its apparent place.
pub fn pointing_for(app: Equatorial, site: &Site, t: &Instant, landmarks: &[Landmark], rule: LandmarkRule) -> Result<Pointing, FindError> {
    pointing_words(to_horizontal(app, site, t), landmarks, rule)
}

/// An apparent place (true equator and equinox of date) turned back to the
/// catalogs' GCRS/ICRS axes by the NPB matrix (IAU 2006/2000B). Annual
/// aberration (≤ 20.5″) is left in: far below a finder's resolution.
pub fn apparent_to_catalog_frame(app: Equatorial, t: &Instant) -> Equatorial {
    let v = npb_matrix(t.tt_jd).transpose() * unit_vector(app.ra_rad, app.dec_rad);
    let (ra_rad, dec_rad) = ra_dec_of(v);
    Equatorial { ra_rad, dec_rad }
}

/// Landmarks from the solar system: the Moon and the naked-eye planets at
/// their topocentric apparent places (solar module, DE421), with their
/// visual magnitudes. Bodies outside the ephemeris' coverage are left out.
pub fn solar_landmarks(eph: &crate::solar::Ephemeris, site: &Site, t: &Instant) -> Vec<Landmark> {
    use crate::solar::{body_apparent, BodyId};
    let bodies = [
        (BodyId::Moon, "the Moon"),
        (BodyId::Venus, "Venus"),
        (BodyId::Jupiter, "Jupiter"),
        (BodyId::Mars, "Mars"),
        (BodyId::Saturn, "Saturn"),
        (BodyId::Mercury, "Mercury"),
    ];
    bodies
        .iter()
        .filter_map(|&(b, name)| {
            let s = body_apparent(eph, b, t, site).ok()?;
            Some(apparent_landmark(name, s.topocentric, s.vmag, site, t))
        })
        .collect()
}

/// Landmarks from the named bright stars of a catalog tier (IAU names via
/// `sky::names`), brighter than `max_vmag`.
pub fn named_star_landmarks(cat: &crate::sky::catalog::StarCatalog, max_vmag: f64, site: &Site, t: &Instant) -> Vec<Landmark> {
    cat.stars
        .iter()
        .filter(|s| s.hip != 0 && (s.vmag as f64) <= max_vmag)
        .filter_map(|s| crate::sky::names::name_for_hip(s.hip).map(|n| star_landmark(n, s, cat.epoch_jyear, site, t)))
        .collect()
}
