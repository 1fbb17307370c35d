//! Talking points computed from data: distance, true size, light travel time.

use super::input::{Candidate, TargetKind};

/// Astronomical unit, km (IAU 2012 resolution B2).
pub const AU_KM: f64 = 149_597_870.7;
/// Speed of light, km/s (SI definition).
pub const C_KM_S: f64 = 299_792.458;
/// Light-year, km (Julian year × c).
pub const LY_KM: f64 = 9.460_730_472_580_8e12;
/// Earth's mean diameter, km (IUGG mean radius 6371.0 km).
pub const EARTH_DIAMETER_KM: f64 = 12_742.0;

/// `x` to two significant figures with thousands separators ("1,400,000").
pub fn two_sig(x: f64) -> String {
    if !x.is_finite() || x <= 0.0 {
        return "0".to_string();
    }
    let e = libm::floor(libm::log10(x)) as i32;
    let scale = libm::pow(10.0, (e - 1) as f64);
    let r = libm::round(x / scale) * scale;
    if r < 10.0 {
        return format!("{:.1}", r).trim_end_matches(".0").to_string();
    }
    let s = format!("{:.0}", r);
    let mut out = String::new();
    for (i, ch) in s.chars().enumerate() {
        if i > 0 && (s.len() - i) % 3 == 0 {
            out.push(',');
        }
        out.push(ch);
    }
    out
}

fn duration_words(seconds: f64) -> String {
    if seconds < 120.0 {
        format!("{} seconds", two_sig(seconds))
    } else if seconds < 7200.0 {
        format!("{} minutes", two_sig(seconds / 60.0))
    } else if seconds < 86_400.0 * 3.0 {
        format!("{} hours", two_sig(seconds / 3600.0))
    } else {
        format!("{} days", two_sig(seconds / 86_400.0))
    }
}

/// A few sentences for the card (geometry: true size = distance × angle in radians; light time = distance / c).
pub fn talking_points(c: &Candidate, moon_distance_km: f64) -> Vec<String> {
    let mut out = Vec::new();
    let angle_rad = (c.major_arcmin / 60.0).to_radians();
    let dist_km = match c.kind {
        TargetKind::Moon => Some(moon_distance_km),
        _ => c.distance_au.map(|au| au * AU_KM),
    };
    if let Some(d) = dist_km.filter(|d| *d > 0.0) {
        out.push(format!("About {} km away; its light takes {} to reach us.", two_sig(d), duration_words(d / C_KM_S)));
        if angle_rad > 0.0 {
            let size = d * angle_rad;
            let ratio = size / EARTH_DIAMETER_KM;
            let cmp = if ratio >= 1.5 {
                format!("{} times the Earth's diameter", two_sig(ratio))
            } else if ratio >= 0.67 {
                "about the size of the Earth".to_string()
            } else {
                format!("about {} of the Earth's diameter", percent_words(ratio))
            };
            out.push(format!("About {} km across: {}.", two_sig(size), cmp));
        }
    } else if let Some(ly) = c.distance_ly.filter(|d| *d > 0.0) {
        out.push(format!("The light you see left it about {} years ago.", two_sig(ly)));
        if angle_rad > 0.0 {
            out.push(format!("About {} light-years across.", two_sig(ly * angle_rad)));
        }
    }
    out
}

fn percent_words(r: f64) -> String {
    format!("{}%", two_sig(100.0 * r))
}
