//! Atmospheric refraction and air mass.
//! - True → apparent: Saemundsson (1986, Sky & Telescope 72, 70).
//! - Apparent → true: Bennett (1982, Journal of Navigation 35, 255).
//!
//! Both in arcminutes with the standard pressure/temperature factor
//! (P / 1010 hPa)·(283 K / (273 K + T)) (Meeus, Astronomical Algorithms, ch. 16).
//!
//! - Air mass: Kasten & Young (1989, Applied Optics 28, 4735).

/// Standard pressure of the refraction formulas, hPa.
pub const STANDARD_PRESSURE_HPA: f64 = 1010.0;
/// Standard temperature of the refraction formulas, °C.
pub const STANDARD_TEMP_C: f64 = 10.0;
/// Below this altitude the formulas lose meaning: they are evaluated here instead
/// (continuous, so a drawn horizon does not jump).
const MIN_ALT_DEG: f64 = -1.0;

fn pt_factor(pressure_hpa: f64, temp_c: f64) -> f64 {
    if !(pressure_hpa.is_finite() && temp_c.is_finite()) || pressure_hpa <= 0.0 || temp_c <= -273.0 {
        return 0.0;
    }
    (pressure_hpa / STANDARD_PRESSURE_HPA) * (283.0 / (273.0 + temp_c))
}

/// Refraction (apparent − true altitude), radians, for a true (geometric) altitude:
/// Saemundsson (1986), R′ = 1.02 / tan(h + 10.3/(h + 5.11)), h in degrees,
/// times the P/T factor. Pressure 0 gives 0 (refraction off).
pub fn refraction_rad(true_alt_rad: f64, pressure_hpa: f64, temp_c: f64) -> f64 {
    if !true_alt_rad.is_finite() {
        return 0.0;
    }
    let h = true_alt_rad.to_degrees().max(MIN_ALT_DEG);
    if h >= 90.0 {
        return 0.0;
    }
    let r_arcmin = 1.02 / libm::tan((h + 10.3 / (h + 5.11)).to_radians());
    (r_arcmin * pt_factor(pressure_hpa, temp_c) / 60.0).to_radians().max(0.0)
}

/// Refraction, radians, for an apparent (observed) altitude: Bennett (1982),
/// R′ = 1 / tan(h₀ + 7.31/(h₀ + 4.4)), h₀ in degrees, times the P/T factor.
pub fn refraction_from_apparent_rad(apparent_alt_rad: f64, pressure_hpa: f64, temp_c: f64) -> f64 {
    if !apparent_alt_rad.is_finite() {
        return 0.0;
    }
    let h = apparent_alt_rad.to_degrees().max(MIN_ALT_DEG);
    if h >= 90.0 {
        return 0.0;
    }
    let r_arcmin = 1.0 / libm::tan((h + 7.31 / (h + 4.4)).to_radians());
    (r_arcmin * pt_factor(pressure_hpa, temp_c) / 60.0).to_radians().max(0.0)
}

/// True altitude → apparent altitude (Saemundsson refraction added).
pub fn apparent_altitude_rad(true_alt_rad: f64, pressure_hpa: f64, temp_c: f64) -> f64 {
    true_alt_rad + refraction_rad(true_alt_rad, pressure_hpa, temp_c)
}

/// Geometric alt/az → as seen through the air (Saemundsson refraction on the altitude).
pub fn refracted(h: crate::sky::Horizontal, pressure_hpa: f64, temp_c: f64) -> crate::sky::Horizontal {
    crate::sky::Horizontal { alt_rad: apparent_altitude_rad(h.alt_rad, pressure_hpa, temp_c), az_rad: h.az_rad }
}

/// Air mass at an apparent altitude: Kasten & Young (1989),
/// X = 1 / (sin h + 0.50572 (h + 6.07995°)^−1.6364), h in degrees.
/// Below −6.07995° (no formula) returns infinity; libm for cross-platform bytes.
pub fn airmass(alt_rad: f64) -> f64 {
    let h = alt_rad.to_degrees();
    if !h.is_finite() || h + 6.07995 <= 0.0 {
        return f64::INFINITY;
    }
    let d = libm::sin(alt_rad) + 0.50572 * libm::pow(h + 6.07995, -1.6364);
    if d <= 0.0 { f64::INFINITY } else { 1.0 / d }
}
