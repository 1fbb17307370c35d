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
use crate::scene::{DsoLook, LabelKind, Scene};
use crate::sky::apparent::{ApparentContext, CatalogPlace};
use crate::sky::catalog::Catalogs;
use crate::sky::dso::DsoKind;
use crate::sky::frames::{ra_dec_of, unit_vector};
use crate::sky::horizon::{hour_angle_rad, parallactic_angle_rad, site_from_deg, to_horizontal};
use crate::sky::search::{resolve, TargetRef};
use crate::sky::{Equatorial, Horizontal, Site};
use crate::solar::ephemeris::Ephemeris;
use crate::solar::state::BodyState;
use crate::solar::BodyId;
use crate::time::Instant;
use glam::DVec2;

/// Deepest star drawn, whatever the optics: the catalogs end about here.
pub const CATALOG_FLOOR_MAG: f32 = 12.0;

/// ICRS → apparent place of date at the site, set up once per scenario
/// (the sky core's `ApparentContext`: space motion, deflection, aberration, NPB).
pub struct ApparentFrame {
    ctx: ApparentContext,
}

impl ApparentFrame {
    pub fn new(t: &Instant, site: &Site) -> Self {
        ApparentFrame { ctx: ApparentContext::at_site(t, site) }
    }

    pub fn context(&self) -> &ApparentContext {
        &self.ctx
    }

    /// A catalog star (epoch `epoch_jyear`) → apparent place of date.
    pub fn star(&self, place: &CatalogPlace, epoch_jyear: f64) -> Equatorial {
        self.ctx.place(place, epoch_jyear)
    }

    /// A fixed ICRS direction (deep-sky object, typed coordinates) → apparent of date.
    pub fn fixed(&self, p: Equatorial) -> Equatorial {
        let (ra_rad, dec_rad) = ra_dec_of(self.ctx.direction(unit_vector(p.ra_rad, p.dec_rad)));
        Equatorial { ra_rad, dec_rad }
    }

    /// Apparent of date → ICRS direction, for catalog cone queries (aberration,
    /// ≤ 21″, is left in: far inside the query margin).
    pub fn to_icrs(&self, p: Equatorial) -> Equatorial {
        let (ra_rad, dec_rad) = ra_dec_of(self.ctx.npb.transpose() * unit_vector(p.ra_rad, p.dec_rad));
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
    /// The sky as nature makes it at the target (the site's dark sky brightened with air
    /// mass, moonlight, twilight: `sky::brightness`, as the planner), V mag/arcsec²;
    /// `scene.sky` holds the sky as drawn (see [`display_sky_mu`]).
    pub natural_sky_mag_arcsec2: f64,
}

pub fn instant_of(s: &Scenario) -> Result<Instant, EngineError> {
    let c = parse_civil("time", &s.time_utc).map_err(EngineError::Scenario)?;
    Instant::from_civil(c.year, c.month, c.day, c.hour, c.minute, c.second, 0).map_err(|e| EngineError::Time(e.to_string()))
}

pub fn site_of(s: &Scenario) -> Result<Site, EngineError> {
    site_from_deg(s.site.lat_deg, s.site.lon_deg, s.site.elev_m).map_err(|e| EngineError::Site(e.to_string()))
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
                    kind: if body == BodyId::Moon || body == BodyId::Sun { body_title(body).to_ascii_lowercase() } else { "planet".into() },
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
    b.title()
}

fn place_of(star: &crate::sky::catalog::Star) -> CatalogPlace {
    CatalogPlace::from(star)
}

/// Extinction coefficient and eye pupil the view's verdicts use: the planner's defaults
/// (`engine::night`), so the picture and the station card agree.
const VIEW_EXTINCTION_K_MAG: f64 = 0.2;
const VIEW_EYE_PUPIL_MM: f64 = 6.0;

/// The sky as drawn: the eye adapts to a bright sky and a screen cannot show it, so
/// below 19.5 mag/arcsec² (a bright suburb, moonlight, dusk, day) the drawn sky is
/// compressed: 19.5 − 0.15·(19.5 − μ). A dark sky is drawn as it is; daylight (about
/// 4 mag/arcsec²) becomes a pale sky on which the Moon and Venus still stand out, dusk
/// a grey one. Our display choice; the verdicts and star limits use the natural sky.
pub fn display_sky_mu(natural_mu: f64) -> f64 {
    const KNEE: f64 = 19.5;
    if !natural_mu.is_finite() || natural_mu >= KNEE {
        return natural_mu;
    }
    KNEE - 0.15 * (KNEE - natural_mu)
}

/// The catalogued mean surface brightness (OpenNGC, mostly B band), or, where the
/// catalogue has none, the integrated magnitude spread over the outline:
/// μ = m + 2.5 log10(area in arcsec²) (the definition of a mean surface brightness).
pub fn physical_mean_mu(d: &crate::sky::dso::Dso) -> Option<f32> {
    if let Some(mu) = d.surf_br_mag_arcsec2 {
        return Some(mu);
    }
    let m = d.vmag.or(d.bmag)?;
    let major = d.major_arcmin.filter(|a| *a > 0.0)? as f64;
    let minor = d.minor_arcmin.filter(|a| *a > 0.0).map_or(major, f64::from);
    let area_arcsec2 = core::f64::consts::FRAC_PI_4 * major * minor * 3600.0;
    Some((m as f64 + 2.5 * libm::log10(area_arcsec2)) as f32)
}

/// The mean surface brightness to draw for a glow whose visibility for a visitor is
/// `strength` (`plan::visibility::view_strength`, 0..1): 0 draws nothing; otherwise the
/// mean contrast over the sky rises on a log scale from 0.02 (just seen with averted
/// vision) through about 0.1 (plainly visible) to 1 (easy, bright). Our display choice:
/// the eye judges a glow by its margin over the threshold, so the screen shows that
/// margin rather than the raw ratio, which a monitor cannot reproduce at the eyepiece's
/// dark adaptation.
pub fn drawn_mean_mu(strength: f32, sky_mu: f64) -> f32 {
    if !(strength > 0.0) || !sky_mu.is_finite() {
        return f32::INFINITY;
    }
    let s = f64::from(strength.min(1.0));
    let contrast = 0.02 * libm::pow(50.0, ((s - 0.15) / 0.85).max(0.0));
    (sky_mu - 2.5 * libm::log10(contrast)) as f32
}

/// Builds the scene and the numbers beside it for a validated scenario.
pub fn compose(s: &Scenario, cats: &Catalogs, eph: Option<&Ephemeris>) -> Result<Composed, EngineError> {
    let t = instant_of(s)?;
    let site = site_of(s)?;
    let frame = ApparentFrame::new(&t, &site);
    let aim = aim(s, cats, eph, &frame, &t, &site)?;

    let train = s.train.clone().unwrap_or_else(|| Train {
        name: "naked eye".into(),
        instrument: Instrument::NakedEye(NakedEye::default()),
        accessories: vec![],
        mount: Default::default(),
    });
    // The sky: the site's dark sky plus twilight or daylight from the Sun's altitude
    // (the twilight term shared with the planner; low-precision Sun, 0.01°, is plenty
    // for a brightness), so a daytime or dusk view is drawn washed out and shallow, as it is.
    let sun_lite = crate::plan::ephem_lite::sun_lite(t.utc_jd);
    let site_trig = crate::plan::ephem_lite::SiteTrig::new(&site);
    let sun_alt_lite = crate::plan::ephem_lite::horizontal(&sun_lite.equ, crate::plan::ephem_lite::lst_rad(t.utc_jd, &site_trig), &site_trig).alt_rad;
    let twilight_nl = crate::sky::brightness::twilight_nl(sun_alt_lite);
    let sky_mu = crate::scene::skylight::sky_with_moon(s.view.sky_mag_arcsec2, twilight_nl).0;
    // The naked-eye star limit under this sky at the zenith (Crumey 2014, field factor 2
    // for a casual observer) sets how deep the eyepiece reaches.
    // (In daylight the eye's limit falls below 0 mag; the optics figures take 0 as their floor.)
    let naked_eye = crate::plan::visibility::naked_eye_limit_mag(sky_mu, 2.0).clamp(0.0, 8.5);
    let cond = Conditions { naked_eye_limit_mag: naked_eye, ..Conditions::default() };
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
    let sensor_rotation_rad = train
        .accessories
        .iter()
        .find_map(|a| if let Accessory::Camera(c) = a { Some(c.rotation_deg.to_radians()) } else { None })
        .unwrap_or(0.0);
    let mut scene = Scene::for_figures(center, &optics, shown, sensor_rotation_rad);
    scene.mag_limit = mag_limit;

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
    // Deep-sky objects overlapping the field (scene index, record) for the verdict below.
    let mut drawn_dsos: Vec<(usize, &crate::sky::dso::Dso)> = Vec::new();
    for id in cats.dsos_overlapping(icrs_center, reach) {
        if let Some(d) = cats.dso(id) {
            let p = frame.fixed(Equatorial { ra_rad: d.ra_rad, dec_rad: d.dec_rad });
            let Some(major_arcmin) = d.major_arcmin else { continue };
            let major = (major_arcmin as f64 / 60.0).to_radians() / 2.0;
            let minor = (d.minor_arcmin.unwrap_or(major_arcmin) as f64 / 60.0).to_radians() / 2.0;
            let sb = physical_mean_mu(d).unwrap_or(f32::INFINITY);
            let label = if s.view.labels { Some(d.designation()) } else { None };
            if scene.add_dso(p, major.max(1e-6), minor.max(1e-6), d.pa_deg.unwrap_or(0.0).to_radians() as f64, dso_look(d.kind), sb, label.as_deref()) {
                drawn_dsos.push((scene.dsos.len() - 1, d));
            }
        }
    }

    // The Sun, the Moon and the planets (with phases, rings and Jupiter's moons).
    let mut bodies = Vec::new();
    let (mut sun_alt_rad, mut sun_separation_rad, mut moon_alt_rad) = (None, None, None);
    // Moon's phase angle (180° = new) and distance from the target, for the sky and the
    // verdict; new and far when unknown.
    let mut moon_phase_deg = 180.0;
    let mut moon_separation = core::f64::consts::PI;
    if let Some(eph) = eph {
        for b in BodyId::ALL {
            scene.add_solar_body(eph, b, &t, &site).map_err(|e| EngineError::Solar(e.to_string()))?;
        }
        if let Ok(all) = crate::solar::topocentric::all_bodies(eph, &t, &site) {
            for st in all.iter() {
                let h = to_horizontal(st.topocentric, &site, &t);
                match st.body {
                    BodyId::Sun => {
                        sun_alt_rad = Some(h.alt_rad);
                        sun_separation_rad = Some(separation_rad(st.topocentric, aim.apparent));
                    }
                    BodyId::Moon => {
                        moon_alt_rad = Some(h.alt_rad);
                        moon_phase_deg = st.phase_angle_rad.to_degrees();
                        moon_separation = separation_rad(st.topocentric, aim.apparent);
                    }
                    _ => {}
                }
                if s.view.labels && st.body != BodyId::Sun && scene.in_field(crate::scene::gnomonic(scene.center, st.topocentric).unwrap_or(DVec2::splat(9.0)), 0.0) {
                    scene.add_label(st.topocentric, body_title(st.body), LabelKind::Body);
                }
            }
            bodies.extend_from_slice(&all);
        }
    }

    scene.set_zenith(q);
    let driven = matches!(train.mount, crate::optics::train::Mount::Equatorial { .. });
    if !driven {
        scene.set_sidereal_drift();
    }
    // The sky at the target as the planner computes it (`sky::brightness::sky_nl`): the
    // site's zenith sky brightened towards the horizon (K&S eq. 2), moonlight, twilight.
    // Moonlight and twilight are both scattered sunlight: one tint.
    let sky_here = crate::sky::brightness::sky_nl(&crate::sky::brightness::SkyAt {
        zenith_mu: s.view.sky_mag_arcsec2,
        k_mag: VIEW_EXTINCTION_K_MAG,
        target_alt_rad: horizontal.alt_rad,
        sun_alt_rad: sun_alt_lite,
        moon_alt_rad: moon_alt_rad.unwrap_or(-core::f64::consts::FRAC_PI_2),
        moon_phase_angle_rad: moon_phase_deg.to_radians(),
        moon_separation_rad: moon_separation,
    });
    let dark_here_mu = crate::sky::brightness::nl_to_mu(sky_here.dark);
    scene.set_sky(dark_here_mu, sky_here.moon + sky_here.twilight, optics.exit_pupil_mm, cond.eye_pupil_mm);
    // Through an eyepiece, each deep-sky glow is drawn as strongly as the planner's
    // verdict for a visitor says (the card and the picture agree); cameras keep the
    // catalogued surface brightness.
    let natural_sky_mu = scene.sky.sky_mag_arcsec2;
    scene.sky.sky_mag_arcsec2 = display_sky_mu(natural_sky_mu);
    if let Ok(Some(option)) = crate::plan::wire::train_option(&train, "", "") {
        let ext_mag = VIEW_EXTINCTION_K_MAG * crate::sky::refraction::airmass(horizontal.alt_rad);
        for (i, d) in &drawn_dsos {
            let strength = match crate::plan::wire::candidate_from_dso_with(d, &glam::DMat3::IDENTITY) {
                Some(c) => {
                    let a = crate::plan::schedule::assess_candidate(&c, &option, VIEW_EYE_PUPIL_MM, moon_phase_deg, ext_mag, natural_sky_mu);
                    crate::plan::visibility::view_strength(&a)
                }
                None => 0.0,
            };
            if let Some(sd) = scene.dsos.get_mut(*i) {
                sd.surf_br_mag_arcsec2 = drawn_mean_mu(strength, scene.sky.sky_mag_arcsec2);
            }
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
        natural_sky_mag_arcsec2: natural_sky_mu,
    })
}
