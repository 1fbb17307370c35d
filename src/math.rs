//! Float helpers that go through the `libm` crate.
//!
//! The engine calls `libm` for every transcendental function (`libm::sin`, `libm::atan2`,
//! ...), never the std methods (`x.sin()`): in the wasm, the std methods link a second
//! copy of the same algorithms (the compiler's own math library), about 5 KB gzipped.
//! Calling `libm` everywhere also gives native builds the same results as the wasm, to
//! the last bit. The float `%` operator and `f64::rem_euclid` link that second copy's
//! `fmod` in the wasm, hence `rem_euclid` here.

/// `a.rem_euclid(b)` (std's definition, bit for bit) through `libm::fmod`: the least
/// non-negative remainder of a / b, for b ≠ 0; NaN for b = 0 or a infinite, as std.
/// fmod is exact, so this gives what the `%` operator gives.
pub fn rem_euclid(a: f64, b: f64) -> f64 {
    let r = libm::fmod(a, b);
    if r < 0.0 {
        r + b.abs()
    } else {
        r
    }
}

#[cfg(test)]
mod tests {
    use super::rem_euclid;

    #[test]
    fn matches_std_rem_euclid_bit_for_bit() {
        let tau = std::f64::consts::TAU;
        let xs = [
            0.0, -0.0, 1.0, -1.0, 1e-300, -1e-300, 5e-324, -5e-324, tau, -tau, 7.5, -7.5, 360.0, -360.0, 359.999_999_999,
            -0.000_000_1, 1e17, -1e17, 1.7e308, -1.7e308, 2451545.123_456, -2451545.123_456, f64::INFINITY, f64::NEG_INFINITY, f64::NAN,
        ];
        let bs = [tau, 1.0, 360.0, -360.0, 2.5, 1e-3, 1296000.0, 0.0, f64::INFINITY];
        for &a in &xs {
            for &b in &bs {
                let (got, want) = (rem_euclid(a, b), a.rem_euclid(b));
                assert!(got.to_bits() == want.to_bits() || (got.is_nan() && want.is_nan()), "rem_euclid({a:e}, {b:e}): {got:e} vs std {want:e}");
            }
        }
        // A spread of ordinary values too.
        let mut x = -1.0e6;
        while x < 1.0e6 {
            for &b in &[tau, 360.0, 1.0] {
                assert_eq!(rem_euclid(x, b).to_bits(), x.rem_euclid(b).to_bits(), "rem_euclid({x:e}, {b})");
            }
            x += 977.123_456_789;
        }
    }
}
