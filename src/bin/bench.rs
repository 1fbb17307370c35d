//! Native side of `make bench`: runs the shared workloads (src/bench.rs) and prints
//! the report as one JSON line. Usage: bench [--quick] CATALOG_DIR, or bench --render N
fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    // `bench --render N`: the render workload alone over N frames, printed as
    // "median_frame_ns median_floor_ns" (for scripts/bench-render.mjs A/B runs).
    if let Some(i) = args.iter().position(|a| a == "--render") {
        let n = args.get(i + 1).and_then(|a| a.parse().ok()).unwrap_or(400);
        let f = nightfield::render::bench::figures(n);
        println!("{} {}", f.median_frame_ns, f.median_floor_ns);
        return;
    }
    let quick = args.iter().any(|a| a == "--quick");
    let dir = args.iter().find(|a| !a.starts_with("--")).cloned().unwrap_or_else(|| "catalog".into());
    let names = ["stars_bright.nfs", "stars_hip.nfs", "stars_gaia.nfs", "dso_openngc.nfd", "ephemeris.bin"];
    let mut files = Vec::new();
    for n in names {
        match std::fs::read(format!("{dir}/{n}")) {
            Ok(b) => files.push((n, b)),
            Err(e) => {
                eprintln!("bench: cannot read {dir}/{n}: {e}");
                std::process::exit(1);
            }
        }
    }
    let refs: Vec<(&str, &[u8])> = files.iter().map(|(n, b)| (*n, b.as_slice())).collect();
    let start = std::time::Instant::now();
    let report = nightfield::bench::run_all(&refs, quick, &mut || start.elapsed().as_nanos() as f64);
    match serde_json::to_string(&report) {
        Ok(s) => println!("{s}"),
        Err(e) => {
            eprintln!("bench: {e}");
            std::process::exit(1);
        }
    }
}
