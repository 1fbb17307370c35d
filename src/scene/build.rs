//! Scene building from the other modules' results: optics figures → field
//! edge and limiting magnitude; catalog stars → apparent places; Sun, Moon
//! and planets → discs with phase, Saturn's rings, Jupiter's moons; the
//! parallactic angle → zenith marker; sky brightness with moonlight.

use super::{skylight, BodyLook, FieldShape, LabelKind, Rings, Scene, SceneBody, SceneLabel};
use crate::optics::figures::{Figures, Mode};
use crate::orient::SkyToScreen;
use crate::sky::apparent::{ApparentContext, CatalogPlace};
use crate::sky::catalog::StarCatalog;
use crate::sky::dso::{DsoCatalog, DsoKind};
use super::DsoLook;
use crate::sky::{Equatorial, Site};
use crate::solar::{self, BodyId, Ephemeris, SolarError};
use crate::time::Instant;
use glam::DVec2;

/// Field edge from the figures: the sensor frame for a camera (turned by
/// `sensor_rotation_rad` on its own screen), else the field circle.
pub fn field_shape(f: &Figures, sensor_rotation_rad: f64) -> FieldShape {
    match (f.mode, f.sensor_field) {
        (Mode::Camera, Some(s)) => FieldShape::Sensor { width_rad: s.width_rad, height_rad: s.height_rad, rotation_rad: sensor_rotation_rad },
        _ => FieldShape::Circle { radius_rad: f.true_field_rad * 0.5 },
    }
}

impl Scene {
    /// An empty scene for a train's figures: its field edge, its limiting magnitude.
    pub fn for_figures(center: Equatorial, f: &Figures, orient: SkyToScreen, sensor_rotation_rad: f64) -> Scene {
        Scene::new(center, field_shape(f, sensor_rotation_rad), orient, f.limiting_mag as f32)
    }

    /// Adds catalog stars (indices into `cat.stars`, e.g. from a cone query;
    /// None = all) at their apparent places for `ctx` (true equator and
    /// equinox of date, the frame of `self.center`). Returns how many landed.
    pub fn add_catalog_stars(&mut self, cat: &StarCatalog, indices: Option<&[u32]>, ctx: &ApparentContext) -> usize {
        let mut n = 0;
        let mut one = |s: &crate::sky::catalog::Star, sc: &mut Scene| {
            if s.vmag > sc.mag_limit {
                return;
            }
            let p = ctx.place(&CatalogPlace::from(s), cat.epoch_jyear);
            if sc.add_star(p, s.vmag, s.bv_or(0.6)) {
                n += 1;
                if let Some(name) = (s.hip != 0).then(|| crate::sky::names::name_for_hip(s.hip)).flatten() {
                    sc.add_label(p, name, LabelKind::Star);
                }
            }
        };
        match indices {
            Some(ix) => {
                for &i in ix {
                    if let Some(s) = cat.stars.get(i as usize) {
                        one(s, self);
                    }
                }
            }
            None => {
                for s in &cat.stars {
                    one(s, self);
                }
            }
        }
        n
    }

    /// Adds the deep-sky objects of `cat` that overlap the field, at their
    /// apparent places for `ctx` (catalog positions are J2000/ICRS, no proper
    /// motion), drawn by type at their catalog size and position angle. The
    /// surface brightness is the catalog's (OpenNGC, from B) or, when missing,
    /// the mean over the outline from V (or B) and the size. Objects without a
    /// size, and single stars/novae (the star catalog draws those), are skipped.
    pub fn add_catalog_dsos(&mut self, cat: &DsoCatalog, ctx: &ApparentContext) -> usize {
        let reach = self.field_reach_rad() + 1f64.to_radians();
        let cos_reach = libm::cos(reach.min(3.0));
        let (sd0, cd0) = libm::sincos(self.center.dec_rad);
        let mut n = 0;
        for d in &cat.objects {
            let Some(look) = dso_look(d.kind) else { continue };
            let Some(major) = d.major_arcmin.filter(|m| *m > 0.0) else { continue };
            let minor = d.minor_arcmin.filter(|m| *m > 0.0).unwrap_or(major);
            // Quick cut before the apparent place: angular distance of the J2000 place.
            let (sd, cd) = libm::sincos(d.dec_rad);
            let cosd = sd0 * sd + cd0 * cd * libm::cos(d.ra_rad - self.center.ra_rad);
            let half_major_rad = (major as f64 / 120.0).to_radians();
            if cosd < libm::cos((reach + half_major_rad).min(3.0)).min(cos_reach) {
                continue;
            }
            let p = ctx.place(&CatalogPlace { ra_rad: d.ra_rad, dec_rad: d.dec_rad, pm_ra_cosdec_mas_yr: 0.0, pm_dec_mas_yr: 0.0, parallax_mas: 0.0, rv_km_s: 0.0 }, 2000.0);
            // A total magnitude of a cluster-with-nebula includes its stars, which the
            // star catalog already draws: a mean from it is capped at 18 mag/arcsec²
            // (brighter than any nebula's mean over its outline; our bound).
            let sb = d.surf_br_mag_arcsec2.map(|v| v as f64).or_else(|| {
                d.vmag.or(d.bmag).map(|m| super::mean_surface_brightness(m as f64, major as f64, minor as f64).max(MIN_DERIVED_SB))
            });
            let sb = sb.unwrap_or(f64::NAN) as f32;
            let am = |a: f32| (a as f64 / 60.0).to_radians();
            let pa = d.pa_deg.map_or(0.0, |v| (v as f64).to_radians());
            if self.add_dso(p, am(major), am(minor), pa, look, sb, Some(&d.designation())) {
                n += 1;
            }
        }
        n
    }

    /// Zenith marker from the parallactic angle q (the zenith lies at position angle q).
    pub fn set_zenith(&mut self, parallactic_rad: f64) {
        self.markers.zenith_dir = Some(crate::orient::zenith_sky(parallactic_rad));
    }

    /// Sky behind the field: a dark-sky brightness plus moonlight (Krisciunas &
    /// Schaefer 1991), dimmed in the instrument when its exit pupil is smaller
    /// than the eye's.
    pub fn set_sky(&mut self, dark_sky_mag_arcsec2: f64, moonlight_nl: f64, exit_pupil_mm: Option<f64>, eye_pupil_mm: f64) {
        let (total, share) = skylight::sky_with_moon(dark_sky_mag_arcsec2, moonlight_nl);
        let dim = exit_pupil_mm.map_or(0.0, |e| skylight::exit_pupil_dimming_mag(e, eye_pupil_mm));
        self.sky = super::SkyLight { sky_mag_arcsec2: total, dimming_mag: dim, moon_share: share };
    }

    /// Adds a Sun, Moon or planet at instant `t` from `site` (topocentric
    /// apparent place of date), with its phase, bright limb and pole; Saturn
    /// with its rings and Jupiter with its four large moons. Returns whether
    /// anything of it lies in the field.
    pub fn add_solar_body(&mut self, eph: &Ephemeris, body: BodyId, t: &Instant, site: &Site) -> Result<bool, SolarError> {
        let a = solar::apparent_place(eph, body, t, site)?;
        let sun = if body == BodyId::Sun { a } else { solar::apparent_place(eph, BodyId::Sun, t, site)? };
        let st = solar::body_state_from(body, &a, &sun);
        let Some(off) = super::gnomonic(self.center, st.topocentric) else { return Ok(false) };
        let radius_rad = (st.diameter_arcsec * 0.5 / 3600.0).to_radians();
        let reach = radius_rad * if body == BodyId::Saturn { 2.3 } else { 1.0 };
        let jupiter_system = if body == BodyId::Jupiter { radius_rad * 30.0 } else { 0.0 };
        if !self.in_field(off, reach.max(jupiter_system)) {
            return Ok(false);
        }
        let pole_pa = match body {
            BodyId::Moon => Some(solar::moon::moon_face(&a).axis_pa_rad),
            BodyId::Sun => None,
            _ => solar::physical::pole_icrf(body, a.tdb_jd - a.light_time_days)
                .map(|p| solar::physical::position_angle_rad(a.dir_gcrs, p, a.pole_of_date())),
        };
        let (rings, mut polar_ratio) = (None, polar_ratio(body));
        let rings = if body == BodyId::Saturn {
            let g = solar::saturn::saturn_rings(&a);
            // Apparent flattening of the globe seen at tilt B.
            let (s, c) = libm::sincos(g.earth_tilt_rad);
            polar_ratio = libm::sqrt(polar_ratio * polar_ratio * c * c + s * s);
            Some((Rings { tilt_rad: g.earth_tilt_rad }, g.axis_pa_rad))
        } else {
            rings
        };
        let pole_pa = rings.map(|r| r.1).or(pole_pa).unwrap_or(0.0);
        let j = super::local_frame(self.center, st.topocentric).unwrap_or(glam::DMat2::IDENTITY);
        let dir = |pa: f64| (j * Scene::pa_dir(pa)).normalize_or_zero();
        let look = body_look(body);
        self.bodies.push(SceneBody {
            look,
            offset: off,
            radius_rad,
            polar_ratio,
            pole_dir: dir(pole_pa),
            bright_limb_dir: dir(st.bright_limb_pa_rad),
            phase_angle_rad: st.phase_angle_rad,
            vmag: st.vmag as f32,
            rings: rings.map(|r| r.0),
        });
        self.labels.push(SceneLabel { offset: off + dir(0.0) * reach, text: title(body).into(), kind: LabelKind::Body });
        if body == BodyId::Jupiter {
            let moons = solar::jupiter::galilean_moons_for(eph, &a, t.tt_jd)?;
            for (k, m) in moons.iter().enumerate() {
                if matches!(m.situation, solar::jupiter::MoonSituation::Occulted | solar::jupiter::MoonSituation::Eclipsed) {
                    continue;
                }
                // Offsets are in Jupiter equatorial radii, east and north of date.
                let o = off + j * DVec2::new(m.east, m.north) * radius_rad;
                let (name, r_km, v) = GALILEAN[k];
                self.bodies.push(SceneBody {
                    look: BodyLook::Satellite,
                    offset: o,
                    radius_rad: r_km / (st.distance_au * solar::AU_KM),
                    polar_ratio: 1.0,
                    pole_dir: dir(pole_pa),
                    bright_limb_dir: dir(st.bright_limb_pa_rad),
                    phase_angle_rad: st.phase_angle_rad,
                    vmag: v,
                    rings: None,
                });
                self.labels.push(SceneLabel { offset: o, text: name.into(), kind: LabelKind::Satellite });
            }
        }
        Ok(true)
    }
}

/// Name, radius (km) and mean opposition V of Io, Europa, Ganymede, Callisto (from memory).
const GALILEAN: [(&str, f64, f32); 4] = [("Io", 1821.6, 5.0), ("Europa", 1560.8, 5.3), ("Ganymede", 2634.1, 4.6), ("Callisto", 2410.3, 5.7)];

/// Polar / equatorial radius (IAU WGCCRE 2015 radii, from memory).
fn polar_ratio(b: BodyId) -> f64 {
    match b {
        BodyId::Jupiter => 66_854.0 / 71_492.0,
        BodyId::Saturn => 54_364.0 / 60_268.0,
        BodyId::Uranus => 24_973.0 / 25_559.0,
        BodyId::Neptune => 24_341.0 / 24_764.0,
        _ => 1.0,
    }
}

/// Brightest mean surface brightness taken from a total magnitude, mag/arcsec².
const MIN_DERIVED_SB: f64 = 18.0;

/// How each OpenNGC type is drawn (None: not drawn as a deep-sky object).
fn dso_look(k: DsoKind) -> Option<DsoLook> {
    use DsoKind::*;
    Some(match k {
        Galaxy | GalaxyPair | GalaxyTriplet => DsoLook::Galaxy,
        GalaxyGroup | Other => DsoLook::Other,
        OpenCluster | Association => DsoLook::OpenCluster,
        GlobularCluster => DsoLook::GlobularCluster,
        ClusterNebula | HiiRegion | EmissionNebula | Nebula | ReflectionNebula | SupernovaRemnant => DsoLook::Nebula,
        PlanetaryNebula => DsoLook::PlanetaryNebula,
        DarkNebula => DsoLook::DarkNebula,
        Star | DoubleStar | Nova => return None,
    })
}

fn body_look(b: BodyId) -> BodyLook {
    match b {
        BodyId::Sun => BodyLook::Sun,
        BodyId::Moon => BodyLook::Moon,
        BodyId::Mercury => BodyLook::Mercury,
        BodyId::Venus => BodyLook::Venus,
        BodyId::Mars => BodyLook::Mars,
        BodyId::Jupiter => BodyLook::Jupiter,
        BodyId::Saturn => BodyLook::Saturn,
        BodyId::Uranus => BodyLook::Uranus,
        BodyId::Neptune => BodyLook::Neptune,
    }
}

fn title(b: BodyId) -> &'static str {
    b.title()
}
