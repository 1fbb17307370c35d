//! Shared helpers for the render tests: PNG write/read and golden compares.
#![allow(dead_code)]

use nightfield::render::Frame;
use std::path::{Path, PathBuf};

pub fn write_png(path: &Path, f: &Frame) {
    if let Some(d) = path.parent() {
        std::fs::create_dir_all(d).unwrap();
    }
    let file = std::fs::File::create(path).unwrap();
    let mut enc = png::Encoder::new(std::io::BufWriter::new(file), f.width, f.height);
    enc.set_color(png::ColorType::Rgba);
    enc.set_depth(png::BitDepth::Eight);
    enc.write_header().unwrap().write_image_data(&f.rgba).unwrap();
}

pub fn read_png(path: &Path) -> Option<Frame> {
    let dec = png::Decoder::new(std::fs::File::open(path).ok()?);
    let mut r = dec.read_info().ok()?;
    let mut buf = vec![0; r.output_buffer_size()];
    let info = r.next_frame(&mut buf).ok()?;
    if info.color_type != png::ColorType::Rgba || info.bit_depth != png::BitDepth::Eight {
        return None;
    }
    buf.truncate(info.buffer_size());
    Some(Frame { width: info.width, height: info.height, rgba: buf })
}

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// Golden tolerance (stated): every channel of every pixel within 2 levels,
/// and at most 0.1 % of pixels differing at all. Rendering is deterministic
/// (libm), so on one machine the bytes match exactly; the slack only absorbs
/// deliberate, invisible changes of rounding.
pub const MAX_CHANNEL_DIFF: u8 = 2;
pub const MAX_DIFFERING_SHARE: f64 = 0.001;

/// Compares `f` with tests/golden/<name>.png; NIGHTFIELD_BLESS=1 rewrites the
/// reference. On failure writes tests/out/<name>.png and <name>_diff.png.
pub fn check_golden(name: &str, f: &Frame) {
    let golden = root().join("tests/golden").join(format!("{name}.png"));
    if std::env::var("NIGHTFIELD_BLESS").is_ok_and(|v| v == "1") {
        write_png(&golden, f);
        return;
    }
    let Some(g) = read_png(&golden) else {
        write_png(&root().join("tests/out").join(format!("{name}.png")), f);
        panic!("no reference {golden:?}; run with NIGHTFIELD_BLESS=1 to create it (actual in tests/out)");
    };
    assert_eq!((g.width, g.height), (f.width, f.height), "{name}: size differs from reference");
    let mut diff = Frame::new(f.width, f.height);
    let (mut worst, mut differing) = (0u8, 0usize);
    for (i, (a, b)) in f.rgba.chunks_exact(4).zip(g.rgba.chunks_exact(4)).enumerate() {
        let d = (0..4).map(|k| a[k].abs_diff(b[k])).max().unwrap();
        worst = worst.max(d);
        if d > 0 {
            differing += 1;
        }
        let v = (d as u32 * 32).min(255) as u8;
        diff.rgba[i * 4..i * 4 + 4].copy_from_slice(&[v, if d > MAX_CHANNEL_DIFF { 0 } else { v }, 0, 255]);
    }
    let share = differing as f64 / (f.width as f64 * f.height as f64);
    if worst > MAX_CHANNEL_DIFF || share > MAX_DIFFERING_SHARE {
        let out = root().join("tests/out");
        write_png(&out.join(format!("{name}.png")), f);
        write_png(&out.join(format!("{name}_diff.png")), &diff);
        panic!("{name}: differs from reference (worst channel diff {worst}, {:.3}% pixels differ); see tests/out/{name}_diff.png", share * 100.0);
    }
}

/// Centroid (x, y) of the linear light above `floor` (sum of linear RGB) in a window.
pub fn centroid(f: &Frame, x0: u32, y0: u32, x1: u32, y1: u32, floor: f64) -> (f64, f64) {
    let (mut sx, mut sy, mut sw) = (0.0, 0.0, 0.0);
    for y in y0..y1 {
        for x in x0..x1 {
            let p = f.pixel(x, y);
            let lin = |c: u8| nightfield::render::raster::srgb_to_linear(c as f32 / 255.0) as f64;
            let v = lin(p[0]) + lin(p[1]) + lin(p[2]) - floor;
            if v > 0.0 {
                sx += v * (x as f64 + 0.5);
                sy += v * (y as f64 + 0.5);
                sw += v;
            }
        }
    }
    (sx / sw, sy / sw)
}
