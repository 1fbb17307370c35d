//! Renders the fixed comparison scenarios natively and prints one line per frame:
//! name, width, height, FNV-1a 64 hash of the RGBA bytes. The browser-test suite
//! renders the same scenarios in wasm and compares the hashes (same pixels on both).
//! Usage: render_demo CATALOG_DIR
use nightfield::engine::Engine;

fn main() {
    let dir = std::env::args().nth(1).unwrap_or_else(|| "catalog".into());
    let mut e = Engine::new();
    for n in ["stars_bright.nfs", "stars_hip.nfs", "stars_gaia.nfs", "dso_openngc.nfd", "ephemeris.bin"] {
        let bytes = match std::fs::read(format!("{dir}/{n}")) {
            Ok(b) => b,
            Err(err) => {
                eprintln!("render_demo: cannot read {dir}/{n}: {err}");
                std::process::exit(1);
            }
        };
        if let Err(err) = e.load_catalog(n, &bytes) {
            eprintln!("render_demo: {err}");
            std::process::exit(1);
        }
    }
    for (name, json) in nightfield::scenario::comparison_scenarios() {
        let out = e.set_scenario_json(&json).and_then(|_| e.render(480, 360, 2.0));
        match out {
            Ok(info) => println!("{name} {} {} {:016x}", info.width, info.height, nightfield::scenario::fnv1a64(e.pixels())),
            Err(err) => println!("{name} error {err}"),
        }
    }
}
