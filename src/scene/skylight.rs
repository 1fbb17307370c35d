//! Sky brightness behind the field: moonlight added to the natural sky, and
//! the dimming of surface brightness in an instrument.

/// Sky brightness V mag/arcsec² → nanolamberts (Krisciunas & Schaefer 1991, eq. 1 inverse).
pub fn mag_arcsec2_to_nl(v: f64) -> f64 {
    34.08 * libm::exp(20.7233 - 0.92104 * v)
}

/// Nanolamberts → V mag/arcsec² (Krisciunas & Schaefer 1991, PASP 103, 1033, eq. 1).
pub fn nl_to_mag_arcsec2(b_nl: f64) -> f64 {
    (20.7233 - libm::log(b_nl.max(1e-9) / 34.08)) / 0.92104
}

/// Sky brightness added by the Moon, nanolamberts: the model of Krisciunas &
/// Schaefer 1991 (PASP 103, 1033), eqs. 15–21, in the V band.
/// `phase_angle_rad`: Sun–Moon–observer angle; `separation_rad`: Moon to target;
/// `moon_zd_rad`, `target_zd_rad`: zenith distances; `k_mag`: extinction per airmass.
/// Zero when the Moon is below the horizon.
pub fn moonlight_nl(phase_angle_rad: f64, separation_rad: f64, moon_zd_rad: f64, target_zd_rad: f64, k_mag: f64) -> f64 {
    let half_pi = core::f64::consts::FRAC_PI_2;
    if moon_zd_rad >= half_pi {
        return 0.0;
    }
    let alpha = phase_angle_rad.abs().to_degrees().min(180.0);
    let rho = separation_rad.abs().to_degrees().clamp(0.5, 180.0);
    let istar = libm::pow(10.0, -0.4 * (3.84 + 0.026 * alpha + 4e-9 * (alpha * alpha) * (alpha * alpha)));
    let cr = libm::cos(rho.to_radians());
    let f_rho = libm::pow(10.0, 5.36) * (1.06 + cr * cr) + libm::pow(10.0, 6.15 - rho / 40.0);
    let x = |zd: f64| {
        let s = libm::sin(zd.min(half_pi));
        1.0 / libm::sqrt(1.0 - 0.96 * s * s)
    };
    f_rho * istar * libm::pow(10.0, -0.4 * k_mag * x(moon_zd_rad)) * (1.0 - libm::pow(10.0, -0.4 * k_mag * x(target_zd_rad.min(half_pi))))
}

/// Combines a natural sky (mag/arcsec²) with moonlight (nL): returns the total
/// sky brightness (mag/arcsec²) and the Moon's share of it (0..1).
pub fn sky_with_moon(dark_sky_mag_arcsec2: f64, moon_nl: f64) -> (f64, f64) {
    let dark = mag_arcsec2_to_nl(dark_sky_mag_arcsec2);
    let total = dark + moon_nl.max(0.0);
    (nl_to_mag_arcsec2(total), if total > 0.0 { moon_nl.max(0.0) / total } else { 0.0 })
}

/// Dimming of surface brightness in a telescope, magnitudes: none while the
/// exit pupil fills the eye's pupil, else 5·log10(eye / exit) (common practice:
/// no instrument raises surface brightness; a smaller exit pupil lowers it as its area).
pub fn exit_pupil_dimming_mag(exit_pupil_mm: f64, eye_pupil_mm: f64) -> f64 {
    if !(exit_pupil_mm > 0.0) || !(eye_pupil_mm > 0.0) || exit_pupil_mm >= eye_pupil_mm {
        return 0.0;
    }
    5.0 * libm::log10(eye_pupil_mm / exit_pupil_mm)
}
