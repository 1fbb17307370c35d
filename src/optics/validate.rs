//! Validation of a train: every number finite and in a plausible range, the
//! accessories in an order that can exist. Errors name the field and the range.

use super::train::*;
use std::fmt;

/// Why a train (or a mount state) cannot be used.
#[derive(Clone, Debug, PartialEq)]
pub enum OpticsError {
    /// A number outside its allowed range (NaN and infinities included).
    OutOfRange { field: String, value: f64, min: f64, max: f64, unit: &'static str },
    /// The field stop is wider than the eyepiece barrel can pass.
    FieldStopTooWide { field: String, value_mm: f64, barrel: &'static str, max_mm: f64 },
    /// Sensor size disagrees with pixel pitch × pixel count.
    SensorMismatch { field: String, stated_mm: f64, from_pixels_mm: f64 },
    /// A telescope needs an eyepiece or a camera at the end.
    NothingAtFocus,
    /// Two of something there can be only one of (eyepiece, camera, diagonal, phone).
    Duplicate { accessory: &'static str },
    /// An accessory that cannot go on this instrument.
    NotAllowed { index: usize, accessory: &'static str, instrument: &'static str },
    /// An accessory placed where it cannot sit in the light path.
    WrongPlace { index: usize, accessory: &'static str, rule: &'static str },
    /// A Barlow or reducer moved so far from its design spacing that its real
    /// factor leaves the range such a lens can have.
    RealFactorOutOfRange { field: String, factor: f64, min: f64, max: f64 },
    /// Two choices that do not go together.
    Incompatible { what: &'static str },
    /// Binoculars need a stated true field or apparent field.
    MissingField { field: &'static str },
}

impl fmt::Display for OpticsError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            OpticsError::OutOfRange { field, value, min, max, unit } => {
                let got = if value.is_finite() { format!("{value}") } else { "not a number".into() };
                write!(f, "{field} must be between {min} and {max}{unit}; got {got}")
            }
            OpticsError::FieldStopTooWide { field, value_mm, barrel, max_mm } => write!(
                f,
                "{field} is {value_mm} mm, but a {barrel} barrel passes at most about {max_mm} mm"
            ),
            OpticsError::SensorMismatch { field, stated_mm, from_pixels_mm } => write!(
                f,
                "{field} is {stated_mm} mm, but pixel pitch × pixel count gives {from_pixels_mm:.2} mm (must agree within 5%)"
            ),
            OpticsError::NothingAtFocus => {
                write!(f, "a telescope needs an eyepiece or a camera at the end of the accessories")
            }
            OpticsError::Duplicate { accessory } => write!(f, "only one {accessory} can be in the light path"),
            OpticsError::NotAllowed { index, accessory, instrument } => {
                write!(f, "accessories[{index}]: a {accessory} cannot be used with {instrument}")
            }
            OpticsError::WrongPlace { index, accessory, rule } => {
                write!(f, "accessories[{index}]: the {accessory} is out of place: {rule}")
            }
            OpticsError::MissingField { field } => write!(f, "{field} is needed"),
            OpticsError::Incompatible { what } => write!(f, "{what}"),
            OpticsError::RealFactorOutOfRange { field, factor, min, max } => write!(
                f,
                "{field} gives a real factor of {factor:.2}×; it must stay between {min} and {max}×"
            ),
        }
    }
}

impl std::error::Error for OpticsError {}

/// Check `value` lies in [min, max]; the error names the field and range.
pub fn check(field: &str, value: f64, min: f64, max: f64, unit: &'static str) -> Result<(), OpticsError> {
    if value.is_finite() && value >= min && value <= max {
        Ok(())
    } else {
        Err(OpticsError::OutOfRange { field: field.to_string(), value, min, max, unit })
    }
}

fn check_opt(field: &str, value: Option<f64>, min: f64, max: f64, unit: &'static str) -> Result<(), OpticsError> {
    match value {
        Some(v) => check(field, v, min, max, unit),
        None => Ok(()),
    }
}

/// Check every number and the order of the accessories.
pub fn validate(train: &Train) -> Result<(), OpticsError> {
    let instrument_name = match &train.instrument {
        Instrument::NakedEye(n) => {
            check("instrument.field_deg", n.field_deg, 1.0, 180.0, "°")?;
            "the naked eye"
        }
        Instrument::Telescope(t) => {
            check("instrument.aperture_mm", t.aperture_mm, 10.0, 2000.0, " mm")?;
            check("instrument.focal_length_mm", t.focal_length_mm, 50.0, 40000.0, " mm")?;
            check("instrument.focal_ratio (focal length ÷ aperture)", t.focal_length_mm / t.aperture_mm, 1.0, 60.0, "")?;
            check("instrument.obstruction_mm", t.obstruction_mm, 0.0, 0.7 * t.aperture_mm, " mm")?;
            check("instrument.mirror_reflectivity", t.mirror_reflectivity, 0.5, 1.0, "")?;
            check("instrument.glass_transmission", t.glass_transmission, 0.5, 1.0, "")?;
            if t.design == Design::Coude && !matches!(train.mount, Mount::Equatorial { .. }) {
                return Err(OpticsError::Incompatible { what: "a coudé-type focus needs an equatorial mount (mount.kind = equatorial)" });
            }
            if let Design::Newtonian { focuser_angle_deg } = t.design {
                check("instrument.design.focuser_angle_deg", focuser_angle_deg, -360.0, 360.0, "°")?;
            }
            "a telescope"
        }
        Instrument::Binoculars(b) => {
            check("instrument.aperture_mm", b.aperture_mm, 10.0, 200.0, " mm")?;
            check("instrument.magnification", b.magnification, 1.0, 40.0, "×")?;
            check_opt("instrument.true_field_deg", b.true_field_deg, 0.5, 20.0, "°")?;
            check_opt("instrument.apparent_field_deg", b.apparent_field_deg, 20.0, 120.0, "°")?;
            check_opt("instrument.eye_relief_mm", b.eye_relief_mm, 1.0, 40.0, " mm")?;
            check("instrument.transmission", b.transmission, 0.3, 1.0, "")?;
            if b.true_field_deg.is_none() && b.apparent_field_deg.is_none() {
                return Err(OpticsError::MissingField { field: "instrument.true_field_deg or instrument.apparent_field_deg" });
            }
            "binoculars"
        }
        Instrument::Finder(fd) => {
            check("instrument.aperture_mm", fd.aperture_mm, 5.0, 150.0, " mm")?;
            check("instrument.magnification", fd.magnification, 1.0, 30.0, "×")?;
            check("instrument.true_field_deg", fd.true_field_deg, 0.5, 20.0, "°")?;
            check("instrument.transmission", fd.transmission, 0.3, 1.0, "")?;
            "a finder"
        }
    };
    let is_telescope = matches!(train.instrument, Instrument::Telescope(_));
    let prime = matches!(&train.instrument, Instrument::Telescope(t) if t.design == Design::PrimeFocus);
    let mut seen_eyepiece = false;
    let mut seen_end = false; // camera or phone: nothing may follow
    let mut counts = [0usize; 4]; // diagonal, eyepiece, camera, phone
    for (i, acc) in train.accessories.iter().enumerate() {
        let p = |name: &str| format!("accessories[{i}].{name}");
        let label = acc.label();
        if seen_end {
            return Err(OpticsError::WrongPlace { index: i, accessory: label, rule: "nothing can follow a camera or phone" });
        }
        let allowed = match acc {
            Accessory::Filter(_) => true,
            Accessory::Phone(_) => !matches!(train.instrument, Instrument::NakedEye(_)),
            Accessory::StarDiagonal(_) => {
                (is_telescope && !prime) || matches!(train.instrument, Instrument::Finder(_))
            }
            _ => is_telescope,
        };
        let visual_only = matches!(acc, Accessory::StarDiagonal(_) | Accessory::Eyepiece(_) | Accessory::Phone(_));
        if !allowed || (prime && visual_only) {
            let instrument = if prime { "a prime-focus camera" } else { instrument_name };
            return Err(OpticsError::NotAllowed { index: i, accessory: label, instrument });
        }
        if matches!(acc, Accessory::Filter(fl) if fl.filter == FilterKind::Solar) && i != 0 {
            return Err(OpticsError::WrongPlace {
                index: i,
                accessory: "solar filter",
                rule: "a solar filter must cover the front of the instrument, so it comes first",
            });
        }
        if seen_eyepiece && !matches!(acc, Accessory::Phone(_)) {
            return Err(OpticsError::WrongPlace { index: i, accessory: label, rule: "only a phone can follow the eyepiece" });
        }
        match acc {
            Accessory::StarDiagonal(d) => {
                counts[0] += 1;
                check(&p("rotation_deg"), d.rotation_deg, -360.0, 360.0, "°")?;
                check_opt(&p("transmission"), d.transmission, 0.5, 1.0, "")?;
            }
            Accessory::Barlow(m) => {
                check(&p("factor"), m.factor, 1.05, 6.0, "×")?;
                check_modifier(&p, m)?;
            }
            Accessory::Reducer(m) => {
                check(&p("factor"), m.factor, 0.2, 0.95, "×")?;
                check_modifier(&p, m)?;
            }
            Accessory::Filter(fl) => {
                check(&p("transmission"), fl.transmission, 1e-7, 1.0, "")?;
            }
            Accessory::Eyepiece(e) => {
                counts[1] += 1;
                seen_eyepiece = true;
                check(&p("focal_length_mm"), e.focal_length_mm, 2.0, 60.0, " mm")?;
                check(&p("apparent_field_deg"), e.apparent_field_deg, 20.0, 120.0, "°")?;
                check_opt(&p("field_stop_mm"), e.field_stop_mm, 1.0, 50.0, " mm")?;
                check_opt(&p("eye_relief_mm"), e.eye_relief_mm, 1.0, 40.0, " mm")?;
                check(&p("transmission"), e.transmission, 0.5, 1.0, "")?;
                if let Some(fs) = e.field_stop_mm {
                    let cap = e.barrel.max_field_stop_mm();
                    if fs > cap {
                        return Err(OpticsError::FieldStopTooWide {
                            field: p("field_stop_mm"),
                            value_mm: fs,
                            barrel: e.barrel.label(),
                            max_mm: cap,
                        });
                    }
                }
            }
            Accessory::Camera(c) => {
                counts[2] += 1;
                seen_end = true;
                check(&p("sensor_width_mm"), c.sensor_width_mm, 1.0, 100.0, " mm")?;
                check(&p("sensor_height_mm"), c.sensor_height_mm, 1.0, 100.0, " mm")?;
                check(&p("pixel_pitch_um"), c.pixel_pitch_um, 0.5, 30.0, " µm")?;
                check(&p("pixels_x"), c.pixels_x as f64, 16.0, 30000.0, "")?;
                check(&p("pixels_y"), c.pixels_y as f64, 16.0, 30000.0, "")?;
                check(&p("rotation_deg"), c.rotation_deg, -360.0, 360.0, "°")?;
                for (name, stated, n) in [
                    ("sensor_width_mm", c.sensor_width_mm, c.pixels_x),
                    ("sensor_height_mm", c.sensor_height_mm, c.pixels_y),
                ] {
                    let from_px = c.pixel_pitch_um * n as f64 / 1000.0;
                    if (from_px - stated).abs() > 0.05 * stated {
                        return Err(OpticsError::SensorMismatch { field: p(name), stated_mm: stated, from_pixels_mm: from_px });
                    }
                }
            }
            Accessory::Phone(ph) => {
                counts[3] += 1;
                seen_end = true;
                if is_telescope && !seen_eyepiece {
                    return Err(OpticsError::WrongPlace { index: i, accessory: "phone", rule: "a phone is held to an eyepiece, so it comes after one" });
                }
                check(&p("lens_focal_length_mm"), ph.lens_focal_length_mm, 1.0, 15.0, " mm")?;
                check_opt(&p("pixel_pitch_um"), ph.pixel_pitch_um, 0.3, 5.0, " µm")?;
                check(&p("rotation_deg"), ph.rotation_deg, -360.0, 360.0, "°")?;
            }
        }
    }
    for (n, name) in counts.iter().zip(["star diagonal", "eyepiece", "camera", "phone"]) {
        if *n > 1 {
            return Err(OpticsError::Duplicate { accessory: name });
        }
    }
    if counts[1] > 0 && counts[2] > 0 {
        return Err(OpticsError::WrongPlace {
            index: train.accessories.len().saturating_sub(1),
            accessory: "camera",
            rule: "a camera goes at the focus in place of the eyepiece (for a camera behind an eyepiece use a phone)",
        });
    }
    if is_telescope && counts[1] == 0 && counts[2] == 0 {
        return Err(OpticsError::NothingAtFocus);
    }
    Ok(())
}

fn check_modifier(p: &dyn Fn(&str) -> String, m: &FocalModifier) -> Result<(), OpticsError> {
    check_opt(&p("lens_focal_length_mm"), m.lens_focal_length_mm, 10.0, 1000.0, " mm")?;
    check(&p("extra_spacing_mm"), m.extra_spacing_mm, -100.0, 300.0, " mm")?;
    check(&p("transmission"), m.transmission, 0.5, 1.0, "")?;
    if m.extra_spacing_mm != 0.0 && m.lens_focal_length_mm.is_none() {
        return Err(OpticsError::MissingField { field: "lens_focal_length_mm (needed when extra_spacing_mm is not 0)" });
    }
    Ok(())
}
