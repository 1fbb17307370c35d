//! Gathers what the field holds into a `Scene`: the target's apparent place, the
//! catalog stars and deep-sky objects inside the field, the Sun, Moon and planets,
//! the orientation of the train and the markers. The renderer draws the result.
//!
//! Invariant: every position put into the scene is an apparent place of date
//! (true equator and equinox), so the gnomonic offsets are consistent.

use super::EngineError;
use crate::optics::figures::{figures_for, Conditions, Figures};
use crate::optics::train::{Accessory, Instrument, NakedEye, Train};
use crate::orient::{self, MountState, SkyToScreen};
use crate::scenario::{parse_civil, Scenario, TargetSpec};
use crate::scene::{BodyLook, DsoLook, FieldShape, LabelKind, Rings, Scene, SceneBody};
use crate::sky::apparent::{aberrate, astrometric_direction, deflect_by_sun, CatalogPlace};
use crate::sky::catalog::Catalogs;
use crate::sky::dso::DsoKind;
use crate::sky::earth_ephem::{earth_state, EarthState};
use crate::sky::frames::{npb_matrix, ra_dec_of, unit_vector};
use crate::sky::horizon::{hour_angle_rad, parallactic_angle_rad, site_from_deg, to_horizontal};
use crate::sky::search::{resolve, TargetRef};
use crate::sky::{Equatorial, Horizontal, Site};
use crate::solar::ephemeris::Ephemeris;
use crate::solar::state::BodyState;
use crate::solar::BodyId;
use crate::time::Instant;
use glam::{DMat3, DVec2, DVec3};

/// Deepest star drawn, whatever the optics: the catalogs end about here.
pub const CATALOG_FLOOR_MAG: f32 = 12.0;

/// ICRS → apparent of date for distant sources, set up once per scenario
/// (ERFA-style: space motion, light deflection by the Sun, aberration, NPB).
pub struct ApparentFrame {
    earth: EarthState,
    npb: DMat3,
    tt_jd: f64,
}

impl ApparentFrame {
    pub fn new(t: &Instant) -> Self {
        ApparentFrame { earth: earth_state(t.tt_jd), npb: npb_matrix(t.tt_jd), tt_jd: t.tt_jd }
    }

    fn finish(&self, p: DVec3) -> Equatorial {
        let em = self.earth.helio_pos_au.length();
        let e = self.earth.helio_pos_au / em;
        let dlim = 1e-6 / (em * em).max(1.0);
        let d = deflect_by_sun(p, p, e, em, dlim).normalize();
        let a = aberrate(d, self.earth.bary_vel_au_day, em);
        let (ra_rad, dec_rad) = ra_dec_of(self.npb * a);
        Equatorial { ra_rad, dec_rad }
    }

    /// A catalog star (epoch `epoch_jyear`) → apparent place of date.
    pub fn star(&self, place: &CatalogPlace, epoch_jyear: f64) -> Equatorial {
        self.finish(astrometric_direction(place, epoch_jyear, self.tt_jd, self.earth.bary_pos_au))
    }

    /// A fixed ICRS direction (deep-sky object, typed coordinates) → apparent of date.
    pub fn fixed(&self, p: Equatorial) -> Equatorial {
        self.finish(unit_vector(p.ra_rad, p.dec_rad))
    }

    /// Apparent of date → ICRS direction (for catalog cone queries; aberration
    /// undone to first order, which is far inside the query margin).
    pub fn to_icrs(&self, p: Equatorial) -> Equatorial {
        let v = self.npb.transpose() * unit_vector(p.ra_rad, p.dec_rad);
        let v = (v - self.earth.bary_vel_au_day / crate::sky::apparent::C_AU_DAY).normalize();
        let (ra_rad, dec_rad) = ra_dec_of(v);
        Equatorial { ra_rad, dec_rad }
    }
}

/// What the view is pointed at, resolved.
#[derive(Clone, Debug)]
pub struct Aim {
    pub name: String,
    pub kind: String,
    /// Apparent place of date (topocentric for solar-system bodies).
    pub apparent: Equatorial,
    pub body: Option<BodyId>,
    /// Apparent size of the target (major axis), radians; 0 for a star.
    pub size_rad: f64,
    pub vmag: Option<f64>,
    pub dso: Option<u32>,
}

/// Everything computed for one scenario (the figures are drawn from it).
pub struct Composed {
    pub scene: Scene,
    pub aim: Aim,
    pub instant: Instant,
    pub site: Site,
    pub train: Train,
    pub optics: Figures,
    pub horizontal: Horizontal,
    pub parallactic_rad: f64,
    pub orientation: orient::Description,
    pub bodies: Vec<BodyState>,
    pub sun_alt_rad: Option<f64>,
    pub sun_separation_rad: Option<f64>,
    pub moon_alt_rad: Option<f64>,
    pub mag_limit: f32,
}

pub fn instant_of(s: &Scenario) -> Result<Instant, EngineError> {
    let c = parse_civil("time", &s.time_utc).map_err(EngineError::Scenario)?;
    Instant::from_civil(c.year, c.month, c.day, c.hour, c.minute, c.second, 0).map_err(|e| EngineError::Time(e.to_string()))
}

pub fn site_of(s: &Scenario) -> Result<Site, EngineError> {
    site_from_deg(s.site.lat_deg, s.site.lon_deg, s.site.elev_m).map_err(|e| EngineError::Site(e.to_string()))
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

fn dso_look(k: DsoKind) -> DsoLook {
    use DsoKind::*;
    match k {
        Galaxy | GalaxyPair | GalaxyTriplet | GalaxyGroup => DsoLook::Galaxy,
        EmissionNebula | ReflectionNebula | Nebula | HiiRegion | SupernovaRemnant | ClusterNebula => DsoLook::Nebula,
        PlanetaryNebula => DsoLook::PlanetaryNebula,
        GlobularCluster => DsoLook::GlobularCluster,
        OpenCluster | Association => DsoLook::OpenCluster,
        DarkNebula => DsoLook::DarkNebula,
        _ => DsoLook::Other,
    }
}

/// Unit tangent-plane vector (east, north) of a position angle (north through east).
fn pa_dir(pa_rad: f64) -> DVec2 {
    DVec2::new(libm::sin(pa_rad), libm::cos(pa_rad))
}

/// Angular separation (haversine form, stable for small angles).
pub fn separation_rad(a: Equatorial, b: Equatorial) -> f64 {
    let sd = libm::sin((b.dec_rad - a.dec_rad) / 2.0);
    let sr = libm::sin((b.ra_rad - a.ra_rad) / 2.0);
    let h = sd * sd + libm::cos(a.dec_rad) * libm::cos(b.dec_rad) * sr * sr;
    2.0 * libm::asin(libm::sqrt(h.clamp(0.0, 1.0)))
}

/// Resolves the scenario's target to an apparent place of date.
pub fn aim(
    s: &Scenario,
    cats: &Catalogs,
    eph: Option<&Ephemeris>,
    frame: &ApparentFrame,
    t: &Instant,
    site: &Site,
) -> Result<Aim, EngineError> {
    match &s.target {
        TargetSpec::Coordinates { ra_deg, dec_deg } => Ok(Aim {
            name: format!("RA {:.3}°, Dec {:+.3}°", ra_deg, dec_deg),
            kind: "position".into(),
            apparent: frame.fixed(Equatorial { ra_rad: ra_deg.to_radians(), dec_rad: dec_deg.to_radians() }),
            body: None,
            size_rad: 0.0,
            vmag: None,
            dso: None,
        }),
        TargetSpec::Name(name) => match resolve(name, cats).map_err(|e| EngineError::Target(e.to_string()))? {
            TargetRef::Star(id) => {
                let (star, epoch) = cats.star(id).ok_or_else(|| EngineError::Target(format!("\"{name}\" is not loaded yet")))?;
                let place = place_of(star);
                Ok(Aim {
                    name: cats.star_label(id),
                    kind: "star".into(),
                    apparent: frame.star(&place, epoch),
                    body: None,
                    size_rad: 0.0,
                    vmag: Some(star.vmag as f64),
                    dso: None,
                })
            }
            TargetRef::Dso(id) => {
                let d = cats.dso(id).ok_or_else(|| EngineError::Target(format!("\"{name}\" is not loaded yet")))?;
                let label = dso_title(d);
                Ok(Aim {
                    name: label,
                    kind: d.kind.words().to_string(),
                    apparent: frame.fixed(Equatorial { ra_rad: d.ra_rad, dec_rad: d.dec_rad }),
                    body: None,
                    size_rad: 2.0 * d.radius_rad(),
                    vmag: d.vmag.map(|v| v as f64),
                    dso: Some(id),
                })
            }
            TargetRef::Body(b) => {
                let body = BodyId::from_name(&b).ok_or_else(|| EngineError::Target(format!("no solar-system body called \"{b}\"")))?;
                let eph = eph.ok_or(EngineError::NotLoaded { what: "the Sun, Moon and planet positions (ephemeris.bin)" })?;
                let st = crate::solar::topocentric::body_apparent(eph, body, t, site).map_err(|e| EngineError::Solar(e.to_string()))?;
                Ok(Aim {
                    name: body_title(body).into(),
                    kind: if body == BodyId::Moon || body == BodyId::Sun { body_title(body).to_lowercase() } else { "planet".into() },
                    apparent: st.topocentric,
                    body: Some(body),
                    size_rad: (st.diameter_arcsec / 3600.0).to_radians(),
                    vmag: Some(st.vmag),
                    dso: None,
                })
            }
        },
    }
}

/// "M 42 (Orion Nebula)", "NGC 7000 (North America Nebula)", "IC 434".
pub fn dso_title(d: &crate::sky::dso::Dso) -> String {
    match d.common_names.first() {
        Some(c) if !c.is_empty() => format!("{} ({})", d.designation(), c),
        _ => d.designation(),
    }
}

pub fn body_title(b: BodyId) -> &'static str {
    match b {
        BodyId::Sun => "Sun",
        BodyId::Moon => "Moon",
        BodyId::Mercury => "Mercury",
        BodyId::Venus => "Venus",
        BodyId::Mars => "Mars",
        BodyId::Jupiter => "Jupiter",
        BodyId::Saturn => "Saturn",
        BodyId::Uranus => "Uranus",
        BodyId::Neptune => "Neptune",
    }
}

fn place_of(star: &crate::sky::catalog::Star) -> CatalogPlace {
    CatalogPlace {
        ra_rad: star.ra_rad,
        dec_rad: star.dec_rad,
        pm_ra_cosdec_mas_yr: star.pm_ra_cosdec_mas_yr as f64,
        pm_dec_mas_yr: star.pm_dec_mas_yr as f64,
        parallax_mas: star.parallax_mas as f64,
        rv_km_s: 0.0,
    }
}

/// The field edge the train gives: the eyepiece's field stop circle, or the sensor.
fn field_shape(train: &Train, fig: &Figures) -> FieldShape {
    for a in train.accessories.iter().rev() {
        if let Accessory::Camera(c) = a {
            if let Some(sf) = fig.sensor_field {
                return FieldShape::Sensor { width_rad: sf.width_rad, height_rad: sf.height_rad, rotation_rad: c.rotation_deg.to_radians() };
            }
        }
    }
    FieldShape::Circle { radius_rad: fig.true_field_rad / 2.0 }
}

/// Builds the scene and the numbers beside it for a validated scenario.
pub fn compose(s: &Scenario, cats: &Catalogs, eph: Option<&Ephemeris>) -> Result<Composed, EngineError> {
    let t = instant_of(s)?;
    let site = site_of(s)?;
    let frame = ApparentFrame::new(&t);
    let aim = aim(s, cats, eph, &frame, &t, &site)?;

    let train = s.train.clone().unwrap_or_else(|| Train {
        name: "naked eye".into(),
        instrument: Instrument::NakedEye(NakedEye::default()),
        accessories: vec![],
        mount: Default::default(),
    });
    let sky_mu = s.view.sky_mag_arcsec2;
    let cond = Conditions::default();
    let optics = figures_for(&train, &cond).map_err(|e| EngineError::Optics(e.to_string()))?;

    let horizontal = to_horizontal(aim.apparent, &site, &t);
    let ha = hour_angle_rad(aim.apparent.ra_rad, site.lon_rad, &t);
    let q = parallactic_angle_rad(ha, aim.apparent.dec_rad, site.lat_rad);
    let state = MountState { parallactic_rad: q, alt_rad: horizontal.alt_rad, pier_side: None, user_rotation_rad: s.view.rotation_deg.to_radians(), dec_rad: Some(aim.apparent.dec_rad) };
    let view = orient::orientation(&train, &state).map_err(|e| EngineError::Optics(e.to_string()))?;
    let shown: SkyToScreen = if s.view.north_up { SkyToScreen::chart() } else { view };
    let orientation = orient::describe(&view, q);

    // The field centre: the target, moved by the volunteer's pan (east, north).
    let pan = DVec2::new(s.view.pan_arcmin[0], s.view.pan_arcmin[1]) * (1.0f64 / 60.0).to_radians();
    let center = if pan == DVec2::ZERO { aim.apparent } else { crate::scene::gnomonic_inverse(aim.apparent, pan) };

    let mag_limit = (optics.limiting_mag as f32).min(CATALOG_FLOOR_MAG);
    let mut scene = Scene::new(center, field_shape(&train, &optics), shown, mag_limit);

    // Stars: cone query in the catalog frame, each star to its apparent place.
    let reach = scene.field_reach_rad() * 1.05 + 2e-4;
    let icrs_center = frame.to_icrs(center);
    for id in cats.stars_in_cone(icrs_center, reach, mag_limit) {
        if let Some((star, epoch)) = cats.star(id) {
            let p = frame.star(&place_of(star), epoch);
            if scene.add_star(p, star.vmag, star.bv_or(0.65)) && s.view.labels && star.vmag < 3.5 {
                let label = cats.star_label(id);
                if !label.starts_with("HIP") && !label.starts_with("Gaia") {
                    scene.add_label(p, &label, LabelKind::Star);
                }
            }
        }
    }
    // Deep-sky objects overlapping the field.
    for id in cats.dsos_overlapping(icrs_center, reach) {
        if let Some(d) = cats.dso(id) {
            let p = frame.fixed(Equatorial { ra_rad: d.ra_rad, dec_rad: d.dec_rad });
            let Some(major_arcmin) = d.major_arcmin else { continue };
            let major = (major_arcmin as f64 / 60.0).to_radians() / 2.0;
            let minor = (d.minor_arcmin.unwrap_or(major_arcmin) as f64 / 60.0).to_radians() / 2.0;
            let sb = d.surf_br_mag_arcsec2.unwrap_or(22.0);
            let label = if s.view.labels { Some(d.designation()) } else { None };
            scene.add_dso(p, major.max(1e-6), minor.max(1e-6), d.pa_deg.unwrap_or(0.0).to_radians() as f64, dso_look(d.kind), sb, label.as_deref());
        }
    }

    // The Sun, the Moon and the planets.
    let mut bodies = Vec::new();
    let (mut sun_alt_rad, mut sun_separation_rad, mut moon_alt_rad) = (None, None, None);
    if let Some(eph) = eph {
        if let Ok(all) = crate::solar::topocentric::all_bodies(eph, &t, &site) {
            for st in all.iter() {
                let h = to_horizontal(st.topocentric, &site, &t);
                if st.body == BodyId::Sun {
                    sun_alt_rad = Some(h.alt_rad);
                    sun_separation_rad = Some(separation_rad(st.topocentric, aim.apparent));
                }
                if st.body == BodyId::Moon {
                    moon_alt_rad = Some(h.alt_rad);
                }
                add_body(&mut scene, eph, st, &t, &site, s.view.labels);
            }
            bodies.extend_from_slice(&all);
        }
    }

    scene.markers.zenith_dir = Some(pa_dir(q));
    scene.set_sidereal_drift();
    scene.sky.sky_mag_arcsec2 = sky_mu;
    if let Some(ep) = optics.exit_pupil_mm {
        scene.sky.dimming_mag = crate::scene::skylight::exit_pupil_dimming_mag(ep, cond.eye_pupil_mm);
    }
    if let (Some(malt), Some(moon)) = (moon_alt_rad, bodies.iter().find(|b| b.body == BodyId::Moon)) {
        if malt > 0.0 && horizontal.alt_rad > 0.0 {
            let sep = separation_rad(moon.topocentric, aim.apparent);
            let nl = crate::scene::skylight::moonlight_nl(
                moon.phase_angle_rad,
                sep,
                std::f64::consts::FRAC_PI_2 - malt,
                std::f64::consts::FRAC_PI_2 - horizontal.alt_rad,
                0.2,
            );
            let (mu, share) = crate::scene::skylight::sky_with_moon(sky_mu, nl);
            scene.sky.sky_mag_arcsec2 = mu;
            scene.sky.moon_share = share;
        }
    }
    if s.view.labels {
        scene.add_label(aim.apparent, &aim.name, LabelKind::Target);
    }
    Ok(Composed {
        scene,
        aim,
        instant: t,
        site,
        train,
        optics,
        horizontal,
        parallactic_rad: q,
        orientation,
        bodies,
        sun_alt_rad,
        sun_separation_rad,
        moon_alt_rad,
        mag_limit,
    })
}

/// Puts a body (and Jupiter's moons, Saturn's rings) into the scene if it is in the field.
fn add_body(scene: &mut Scene, eph: &Ephemeris, st: &BodyState, t: &Instant, site: &Site, labels: bool) {
    let Some(off) = crate::scene::gnomonic(scene.center, st.topocentric) else { return };
    let radius_rad = (st.diameter_arcsec / 7200.0).to_radians();
    if !scene.in_field(off, radius_rad * 1.2 + (10.0f64 / 60.0).to_radians().min(scene.field_reach_rad())) {
        return;
    }
    let mut pole_dir = DVec2::Y;
    let mut rings = None;
    let mut polar_ratio = 1.0;
    let apparent = crate::solar::topocentric::apparent_place(eph, st.body, t, site).ok();
    if let Some(a) = apparent.as_ref() {
        if let Some(pole) = crate::solar::physical::pole_icrf(st.body, a.tdb_jd) {
            let pa = crate::solar::physical::position_angle_rad(a.dir_gcrs, pole, a.pole_of_date());
            pole_dir = pa_dir(pa);
        }
        if st.body == BodyId::Saturn {
            let g = crate::solar::saturn::saturn_rings(a);
            pole_dir = pa_dir(g.axis_pa_rad);
            rings = Some(Rings { tilt_rad: g.earth_tilt_rad });
        }
        if st.body == BodyId::Jupiter {
            polar_ratio = 0.935;
        }
        if st.body == BodyId::Saturn {
            polar_ratio = 0.90;
        }
    }
    scene.bodies.push(SceneBody {
        look: body_look(st.body),
        offset: off,
        radius_rad,
        polar_ratio,
        pole_dir,
        bright_limb_dir: pa_dir(st.bright_limb_pa_rad),
        phase_angle_rad: st.phase_angle_rad,
        vmag: st.vmag as f32,
        rings,
    });
    if labels {
        scene.add_label(st.topocentric, body_title(st.body), LabelKind::Body);
    }
    if st.body == BodyId::Jupiter {
        if let Some(a) = apparent.as_ref() {
            if let Ok(moons) = crate::solar::jupiter::galilean_moons_for(eph, a, t.tt_jd) {
                let r_j = radius_rad;
                for (i, m) in moons.iter().enumerate() {
                    let moff = off + DVec2::new(m.east, m.north) * r_j;
                    scene.bodies.push(SceneBody {
                        look: BodyLook::Satellite,
                        offset: moff,
                        radius_rad: r_j * 0.03,
                        polar_ratio: 1.0,
                        pole_dir: DVec2::Y,
                        bright_limb_dir: DVec2::Y,
                        phase_angle_rad: 0.0,
                        vmag: 5.5,
                        rings: None,
                    });
                    if labels {
                        let p = crate::scene::gnomonic_inverse(scene.center, moff);
                        scene.add_label(p, crate::solar::jupiter::MOON_NAMES[i], LabelKind::Satellite);
                    }
                }
            }
        }
    }
}
