//! The browser edge: wasm-bindgen exports. The only file that knows it runs in a browser.
//! Each method wraps `engine::Engine` 1:1; errors become JS `Error`s with the plain message.

use crate::engine::Engine as Core;
use crate::scenario::Scenario;
use serde::Serialize;
use wasm_bindgen::prelude::*;

#[wasm_bindgen(start)]
pub fn start() {
    console_error_panic_hook::set_once();
}

/// Engine version (crate version).
#[wasm_bindgen]
pub fn version() -> String {
    env!("CARGO_PKG_VERSION").to_string()
}

fn err(e: impl std::fmt::Display) -> JsValue {
    js_sys::Error::new(&e.to_string()).into()
}

fn to_js<T: Serialize>(v: &T) -> Result<JsValue, JsValue> {
    v.serialize(&serde_wasm_bindgen::Serializer::json_compatible()).map_err(err)
}

/// JS object → JSON text → Scenario: the same serde_json parse path as a share link.
fn json_text(v: &JsValue) -> Result<String, JsValue> {
    js_sys::JSON::stringify(v)?.as_string().ok_or_else(|| err("the view description could not be read: it is not a plain object"))
}

fn scenario_from(v: JsValue) -> Result<Scenario, JsValue> {
    Scenario::from_json(&json_text(&v)?).map_err(err)
}

/// A finder object from the page (undefined or null: the default finder).
fn finder_spec(finder: &JsValue) -> Result<Option<crate::find::finder::FinderSpec>, JsValue> {
    if finder.is_undefined() || finder.is_null() {
        return Ok(None);
    }
    let text = json_text(finder)?;
    crate::json::from_str(&text).map(Some).map_err(|e| err(format!("the finder could not be read: {e}")))
}

#[wasm_bindgen]
pub struct Engine {
    core: Core,
}

#[wasm_bindgen]
impl Engine {
    #[wasm_bindgen(constructor)]
    pub fn new() -> Engine {
        Engine { core: Core::new() }
    }

    /// Loads a data file by name (see catalog/README.md); returns what is loaded.
    #[wasm_bindgen(js_name = loadCatalog)]
    pub fn load_catalog(&mut self, name: &str, bytes: &[u8]) -> Result<JsValue, JsValue> {
        to_js(&self.core.load_catalog(name, bytes).map_err(err)?)
    }

    /// Sets the scenario (plain object), builds the scene, returns the figures.
    #[wasm_bindgen(js_name = setScenario)]
    pub fn set_scenario(&mut self, scenario: JsValue) -> Result<JsValue, JsValue> {
        let s = scenario_from(scenario)?;
        to_js(&self.core.set_scenario(s).map_err(err)?)
    }

    pub fn figures(&self) -> Result<JsValue, JsValue> {
        to_js(&self.core.figures().map_err(err)?)
    }

    /// Draws into the engine's buffer; returns {ptr, len, width, height, labels}.
    pub fn render(&mut self, width_px: u32, height_px: u32, dpr: f32) -> Result<JsValue, JsValue> {
        to_js(&self.core.render(width_px, height_px, dpr).map_err(err)?)
    }

    pub fn pan(&mut self, dx_px: f32, dy_px: f32) -> Result<JsValue, JsValue> {
        to_js(&self.core.pan(dx_px, dy_px).map_err(err)?)
    }

    pub fn zoom(&mut self, step: f32) -> Result<JsValue, JsValue> {
        to_js(&self.core.zoom(step).map_err(err)?)
    }

    pub fn resolve(&self, query: &str) -> Result<JsValue, JsValue> {
        to_js(&self.core.resolve(query).map_err(err)?)
    }

    /// Plans the night: takes {scenario, start_utc?, end_utc?, utc_offset_min?, horizon?, sky?, clouded?}
    /// or a bare scenario (then: four hours from its time).
    #[wasm_bindgen(js_name = planNight)]
    pub fn plan_night(&self, request: JsValue) -> Result<JsValue, JsValue> {
        let text = json_text(&request)?;
        let req = crate::engine::night::PlanRequest::from_json(&text).map_err(err)?;
        to_js(&self.core.plan_night(&req).map_err(err)?)
    }

    /// How to find the current target with a finder ({kind, aperture_mm, magnification,
    /// true_field_deg}; omitted: an 8×50 straight-through): pointing words, finder view,
    /// star-hop route, dial readings.
    #[wasm_bindgen(js_name = findCard)]
    pub fn find_card(&mut self, finder: JsValue) -> Result<JsValue, JsValue> {
        let spec = finder_spec(&finder)?;
        to_js(&self.core.find_card(spec).map_err(err)?)
    }

    /// Switches this engine's view to the finder's view (same finder object as `findCard`),
    /// with the main field ringed and the route drawn; then `render` as usual.
    #[wasm_bindgen(js_name = finderView)]
    pub fn finder_view(&mut self, finder: JsValue) -> Result<JsValue, JsValue> {
        let spec = finder_spec(&finder)?;
        to_js(&self.core.finder_view(spec).map_err(err)?)
    }

    /// The link payload of the checked scenario. Its JSON text is written by the browser
    /// (`JSON.stringify` of the same object `decodeLink` gives back), so the wasm needs no
    /// second serializer; serde_json reads that text back exactly (shortest round-trip numbers).
    #[wasm_bindgen(js_name = encodeLink)]
    pub fn encode_link(&self, scenario: JsValue) -> Result<String, JsValue> {
        let s = scenario_from(scenario)?; // parsed and validated
        Ok(crate::share::encode_json_bytes(json_text(&to_js(&s)?)?.as_bytes()))
    }

    #[wasm_bindgen(js_name = decodeLink)]
    pub fn decode_link(&self, link: &str) -> Result<JsValue, JsValue> {
        to_js(&self.core.decode_link(link).map_err(err)?)
    }
}

impl Default for Engine {
    fn default() -> Self {
        Engine::new()
    }
}

/// The benchmark workloads (src/bench.rs) run in wasm, timed with performance.now().
/// Only in the `bench` build (`make bench`): the shipped wasm leaves them out.
#[cfg(feature = "bench")]
#[wasm_bindgen]
pub struct Bench {
    files: Vec<(String, Vec<u8>)>,
}

#[cfg(feature = "bench")]
#[wasm_bindgen]
impl Bench {
    #[wasm_bindgen(constructor)]
    pub fn new() -> Bench {
        Bench { files: Vec::new() }
    }

    pub fn add(&mut self, name: &str, bytes: &[u8]) {
        self.files.push((name.to_string(), bytes.to_vec()));
    }

    pub fn run(&self, quick: bool) -> Result<JsValue, JsValue> {
        let perf = js_sys::Reflect::get(&js_sys::global(), &JsValue::from_str("performance"))?;
        let now_fn: js_sys::Function = js_sys::Reflect::get(&perf, &JsValue::from_str("now"))?.dyn_into()?;
        let mut now = || now_fn.call0(&perf).ok().and_then(|v| v.as_f64()).unwrap_or(0.0) * 1e6;
        let refs: Vec<(&str, &[u8])> = self.files.iter().map(|(n, b)| (n.as_str(), b.as_slice())).collect();
        to_js(&crate::bench::run_all(&refs, quick, &mut now))
    }

    /// The render workload alone: [median frame, median floor, min frame,
    /// min floor] in ns over `iterations` frames (for A/B runs of render changes).
    pub fn render(&self, iterations: usize) -> Result<Vec<f64>, JsValue> {
        let perf = js_sys::Reflect::get(&js_sys::global(), &JsValue::from_str("performance"))?;
        let now_fn: js_sys::Function = js_sys::Reflect::get(&perf, &JsValue::from_str("now"))?.dyn_into()?;
        let mut now = || now_fn.call0(&perf).ok().and_then(|v| v.as_f64()).unwrap_or(0.0) * 1e6;
        let f = crate::render::bench::figures_with_clock(iterations, &mut now);
        Ok(vec![f.median_frame_ns, f.median_floor_ns, f.min_frame_ns, f.min_floor_ns])
    }
}

#[cfg(feature = "bench")]
impl Default for Bench {
    fn default() -> Self {
        Bench::new()
    }
}

/// The comparison scenarios (names and JSON) whose pixels must match the native build.
#[wasm_bindgen(js_name = comparisonScenarios)]
pub fn comparison_scenarios() -> Result<JsValue, JsValue> {
    to_js(&crate::scenario::comparison_scenarios())
}

/// FNV-1a 64 hash of the engine's last frame, as 16 hex digits.
#[wasm_bindgen(js_name = frameHash)]
pub fn frame_hash(engine: &Engine) -> String {
    format!("{:016x}", crate::scenario::fnv1a64(engine.core.pixels()))
}

#[wasm_bindgen]
impl Engine {
    /// Sets a scenario from JSON text (as the comparison and bench harnesses hold them).
    #[wasm_bindgen(js_name = setScenarioJson)]
    pub fn set_scenario_json(&mut self, json: &str) -> Result<JsValue, JsValue> {
        to_js(&self.core.set_scenario_json(json).map_err(err)?)
    }
}
