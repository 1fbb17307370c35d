//! Frame cost against the fill+copy floor; run with
//! `cargo test --release --test render_bench -- --ignored --nocapture`.
//! Prints figures; never asserts on time.
mod render_util;

#[test]
#[ignore]
fn frame_vs_floor_ratio() {
    let f = nightfield::render::bench::figures(300);
    println!(
        "1024x1024 rich field (6000 stars): frame median {:.0} us, fill+copy floor median {:.0} us, ratio {:.2} (target <= 4); minima {:.0} / {:.0} us, ratio {:.2}",
        f.median_frame_ns / 1e3, f.median_floor_ns / 1e3, f.median_frame_ns / f.median_floor_ns,
        f.min_frame_ns / 1e3, f.min_floor_ns / 1e3, f.min_frame_ns / f.min_floor_ns
    );
}

/// Writes the bench frame to tests/out/bench_field.png to look at.
#[test]
#[ignore]
fn bench_frame_picture() {
    let scene = nightfield::render::bench::rich_field_scene();
    let view = nightfield::render::ViewParams { width_px: 1024, height_px: 1024, ..Default::default() };
    let mut f = nightfield::render::Frame::default();
    nightfield::render::draw(&scene, &view, &mut f).unwrap();
    render_util::write_png(&std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/out/bench_field.png"), &f);
}
