//! The engine: one stateful handle that the page, the tests and any other caller use.
//!
//! `set_scenario` validates a scenario, builds the scene once and returns the figures;
//! `render` draws the current scene into the engine's own RGBA buffer (the page views
//! it zero-copy); `pan`/`zoom` re-render from the same scene without new JSON.
//! Nothing here panics on what a user, a link or a file can feed in.

pub mod compose;
pub mod figures;
pub mod finding;
pub mod night;

use crate::render::{self, Frame, Label, ViewParams};
use crate::scenario::{Scenario, ScenarioError};
use crate::sky::catalog::Catalogs;
use crate::solar::ephemeris::Ephemeris;
use compose::Composed;
pub use figures::ViewFigures;
use serde::Serialize;
use std::fmt;

/// Why the engine could not do what was asked, in plain words.
#[derive(Clone, Debug, PartialEq)]
pub enum EngineError {
    Scenario(ScenarioError),
    Time(String),
    Site(String),
    Target(String),
    Optics(String),
    Solar(String),
    Catalog { file: String, why: String },
    NotLoaded { what: &'static str },
    NoScenario,
    Render(String),
    Link(String),
    Plan(String),
}

impl fmt::Display for EngineError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            EngineError::Scenario(e) => write!(f, "{e}"),
            EngineError::Time(e) => write!(f, "time: {e}"),
            EngineError::Site(e) => write!(f, "site: {e}"),
            EngineError::Target(e) => write!(f, "{e}"),
            EngineError::Optics(e) => write!(f, "optics: {e}"),
            EngineError::Solar(e) => write!(f, "Sun, Moon and planets: {e}"),
            EngineError::Catalog { file, why } => write!(f, "catalog file {file}: {why}"),
            EngineError::NotLoaded { what } => write!(f, "{what} not loaded yet"),
            EngineError::NoScenario => write!(f, "no view set up yet: choose a site, a time, a telescope and a target"),
            EngineError::Render(e) => write!(f, "drawing: {e}"),
            EngineError::Link(e) => write!(f, "{e}"),
            EngineError::Plan(e) => write!(f, "night plan: {e}"),
        }
    }
}

impl std::error::Error for EngineError {}

/// Where the drawn pixels are, and the labels for the page to write over them.
#[derive(Clone, Debug, Serialize)]
pub struct RenderInfo {
    /// Byte offset of the RGBA buffer in wasm memory (0 natively; use `pixels()`).
    pub ptr: usize,
    pub len: usize,
    pub width: u32,
    pub height: u32,
    pub labels: Vec<Label>,
}

/// What a loaded catalog file holds.
#[derive(Clone, Debug, Serialize)]
pub struct LoadSummary {
    pub file: String,
    pub loaded: Vec<String>,
}

/// The stateful handle.
pub struct Engine {
    cats: Catalogs,
    eph: Option<Ephemeris>,
    scenario: Option<Scenario>,
    composed: Option<Composed>,
    frame: Frame,
    pan_px: (f32, f32),
    zoom: f32,
    last_view: ViewParams,
    route_stars: Option<Vec<crate::find::hop::HopStar>>,
}

impl Default for Engine {
    fn default() -> Self {
        Engine::new()
    }
}

impl Engine {
    pub fn new() -> Engine {
        Engine {
            cats: Catalogs::new(),
            eph: None,
            scenario: None,
            composed: None,
            frame: Frame::new(1, 1),
            pan_px: (0.0, 0.0),
            zoom: 1.0,
            last_view: ViewParams::default(),
            route_stars: None,
        }
    }

    /// Loads one data file by its file name (`stars_bright.nfs`, `stars_hip.nfs`,
    /// `stars_gaia.nfs`, `dso_openngc.nfd`, `ephemeris.bin`). Tiers may come in any order;
    /// a corrupt file is refused with a clear message and leaves the others intact.
    pub fn load_catalog(&mut self, file: &str, bytes: &[u8]) -> Result<LoadSummary, EngineError> {
        if file.starts_with("ephemeris") {
            let e = Ephemeris::decode(bytes).map_err(|e| EngineError::Catalog { file: file.into(), why: e.to_string() })?;
            self.eph = Some(e);
        } else {
            self.cats.load(file, bytes).map_err(|e| EngineError::Catalog { file: file.into(), why: e.to_string() })?;
            self.route_stars = None;
        }
        // A tier that arrives later deepens the current view.
        if let Some(s) = self.scenario.clone() {
            let _ = self.set_scenario(s);
        }
        let mut loaded: Vec<String> = self.cats.loaded().iter().map(|s| s.to_string()).collect();
        if self.eph.is_some() {
            loaded.push("ephemeris.bin".into());
        }
        Ok(LoadSummary { file: file.into(), loaded })
    }

    pub fn catalogs(&self) -> &Catalogs {
        &self.cats
    }

    pub fn ephemeris(&self) -> Option<&Ephemeris> {
        self.eph.as_ref()
    }

    /// Validates the scenario, builds the scene and returns the figures beside the view.
    pub fn set_scenario(&mut self, s: Scenario) -> Result<ViewFigures, EngineError> {
        s.validate().map_err(EngineError::Scenario)?;
        let c = compose::compose(&s, &self.cats, self.eph.as_ref())?;
        let fig = figures::view_figures(&c);
        self.composed = Some(c);
        self.scenario = Some(s);
        self.pan_px = (0.0, 0.0);
        self.zoom = 1.0;
        Ok(fig)
    }

    /// Same as `set_scenario`, from JSON text.
    pub fn set_scenario_json(&mut self, json: &str) -> Result<ViewFigures, EngineError> {
        let s = Scenario::from_json(json).map_err(EngineError::Scenario)?;
        self.set_scenario(s)
    }

    pub fn scenario(&self) -> Option<&Scenario> {
        self.scenario.as_ref()
    }

    pub fn composed(&self) -> Option<&Composed> {
        self.composed.as_ref()
    }

    /// The figures of the current view.
    pub fn figures(&self) -> Result<ViewFigures, EngineError> {
        self.composed.as_ref().map(figures::view_figures).ok_or(EngineError::NoScenario)
    }

    /// Draws the current scene into the engine's buffer, `width`×`height` device pixels.
    pub fn render(&mut self, width_px: u32, height_px: u32, dpr: f32) -> Result<RenderInfo, EngineError> {
        let c = self.composed.as_ref().ok_or(EngineError::NoScenario)?;
        let s = self.scenario.as_ref().ok_or(EngineError::NoScenario)?;
        let view = ViewParams {
            width_px,
            height_px,
            dpr,
            night_mode: s.view.night,
            chart_view: s.view.north_up,
            pan_x_px: self.pan_px.0,
            pan_y_px: self.pan_px.1,
            zoom: self.zoom,
            px_per_rad: None,
        };
        self.frame.resize(width_px.clamp(1, render::MAX_SIDE_PX), height_px.clamp(1, render::MAX_SIDE_PX));
        let labels = render::draw(&c.scene, &view, &mut self.frame).map_err(|e| EngineError::Render(e.to_string()))?;
        self.last_view = view;
        Ok(RenderInfo { ptr: self.frame.rgba.as_ptr() as usize, len: self.frame.rgba.len(), width: self.frame.width, height: self.frame.height, labels })
    }

    /// The last drawn RGBA buffer.
    pub fn pixels(&self) -> &[u8] {
        &self.frame.rgba
    }

    /// Moves the view by a drag of (dx, dy) device pixels and redraws at the last size.
    pub fn pan(&mut self, dx_px: f32, dy_px: f32) -> Result<RenderInfo, EngineError> {
        if !dx_px.is_finite() || !dy_px.is_finite() {
            return Err(EngineError::Render("pan: the drag distance must be a finite number of pixels".into()));
        }
        let lim = 4.0 * self.last_view.width_px.max(self.last_view.height_px) as f32;
        self.pan_px.0 = (self.pan_px.0 + dx_px).clamp(-lim, lim);
        self.pan_px.1 = (self.pan_px.1 + dy_px).clamp(-lim, lim);
        self.render(self.last_view.width_px, self.last_view.height_px, self.last_view.dpr)
    }

    /// Zooms the drawn view by 2^(step/4) (a digital zoom; the page steps eyepieces itself).
    pub fn zoom(&mut self, step: f32) -> Result<RenderInfo, EngineError> {
        if !step.is_finite() {
            return Err(EngineError::Render("zoom: the step must be a finite number".into()));
        }
        self.zoom = (self.zoom * libm::exp2f(step / 4.0)).clamp(0.05, 50.0);
        self.render(self.last_view.width_px, self.last_view.height_px, self.last_view.dpr)
    }

    /// Resolves a target name ("M42", "Vega", "Jupiter") to what it is and where.
    pub fn resolve(&self, query: &str) -> Result<figures::Resolved, EngineError> {
        figures::resolve(&self.cats, self.eph.as_ref(), self.scenario.as_ref(), query)
    }

    /// Plans the night for the request's kit, site and window (see `night`).
    pub fn plan_night(&self, req: &night::PlanRequest) -> Result<crate::plan::Plan, EngineError> {
        night::plan(req, &self.cats, self.eph.as_ref())
    }

    /// The finder to use (default: an 8×50 straight-through, 6° field), with the route
    /// stars gathered from the loaded catalogs once.
    fn prepare_finder(&mut self, finder: Option<crate::find::finder::FinderSpec>) -> crate::find::finder::FinderSpec {
        if self.route_stars.is_none() {
            self.route_stars = Some(finding::route_stars(&self.cats));
        }
        finder.unwrap_or(crate::find::finder::FinderSpec {
            kind: crate::find::finder::FinderKind::StraightThrough,
            aperture_mm: 50.0,
            magnification: 8.0,
            true_field_deg: 6.0,
        })
    }

    /// How to find the current target: pointing in words, the finder's view, a star-hop
    /// route and dial readings (default finder: an 8×50 straight-through, 6° field).
    pub fn find_card(&mut self, finder: Option<crate::find::finder::FinderSpec>) -> Result<crate::find::card::FindCard, EngineError> {
        let spec = self.prepare_finder(finder);
        let c = self.composed.as_ref().ok_or(EngineError::NoScenario)?;
        let stars = self.route_stars.as_deref().unwrap_or(&[]);
        finding::card(c, &self.cats, self.eph.as_ref(), stars, spec)
    }

    /// Switches the current view to the finder's view of the target (orientation, field,
    /// star limit of the finder), with the main scope's field ringed and the star-hop route
    /// drawn; `render`, `pan` and `zoom` then draw it. `set_scenario` returns to the main view.
    pub fn finder_view(&mut self, finder: Option<crate::find::finder::FinderSpec>) -> Result<ViewFigures, EngineError> {
        let spec = self.prepare_finder(finder);
        let main = self.composed.as_ref().ok_or(EngineError::NoScenario)?;
        let s = self.scenario.as_ref().ok_or(EngineError::NoScenario)?;
        let stars = self.route_stars.as_deref().unwrap_or(&[]);
        let c = finding::finder_scene(main, s, &self.cats, self.eph.as_ref(), stars, spec)?;
        let fig = figures::view_figures(&c);
        self.composed = Some(c);
        self.pan_px = (0.0, 0.0);
        self.zoom = 1.0;
        Ok(fig)
    }

    /// A share link fragment for a scenario (compact, versioned, checksummed).
    pub fn encode_link(&self, s: &Scenario) -> Result<String, EngineError> {
        s.validate().map_err(EngineError::Scenario)?;
        crate::share::encode(s).map_err(|e| EngineError::Link(e.to_string()))
    }

    /// Reads a share link fragment back into a scenario; a malformed, truncated or
    /// future-version link gives a clear message.
    pub fn decode_link(&self, link: &str) -> Result<Scenario, EngineError> {
        let bytes = crate::share::decode_json_bytes(link).map_err(|e| EngineError::Link(e.to_string()))?;
        let text = std::str::from_utf8(&bytes).map_err(|_| EngineError::Link("the link's contents are not text".into()))?;
        Scenario::from_json(text).map_err(EngineError::Scenario)
    }
}
