//! Number formatting: every number a package, `check` or `trace` prints is written
//! here (about four figures, fixed decimals, scientific notation, ratios, scaled
//! strains), so that the same value always reads the same.

use super::Unit;

/// A constant as it is written in a formula: the shortest exact decimal; powers of ten
/// from a million up as 10^k.
pub fn const_text(v: f64) -> String {
    let v = if v != 0.0 && (v - v.round()).abs() < 1e-9 * v.abs() { v.round() } else { v };
    let a = v.abs();
    if a >= 1e6 && (a.log10().fract()).abs() < 1e-12 {
        let k = a.log10().round() as i32;
        let s = format!("10^{k}");
        return if v < 0.0 { format!("-{s}") } else { s };
    }
    format!("{v}")
}

/// `v` with `decimals` digits after the point: the same text as `format!("{v:.decimals$}")`,
/// about twenty times faster for the values a package shows. The value is scaled and
/// rounded in integers; when that could differ from rounding the exact binary value (a
/// scaled value beyond 2^31, or within 1e-6 of a tie), or when it rounds to zero (where the
/// standard text keeps the sign), the standard formatter is used.
pub fn fixed(v: f64, decimals: usize) -> String {
    const POW10: [f64; 13] = [1.0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12];
    let scaled = match POW10.get(decimals) {
        Some(p) if v.is_finite() => v * p,
        _ => return format!("{v:.decimals$}"),
    };
    // |scaled| < 2^31: the product is within 1.2e-7 of the exact one
    if scaled.abs() >= 2147483648.0 || (scaled.abs().fract() - 0.5).abs() < 1e-6 {
        return format!("{v:.decimals$}");
    }
    let r = scaled.round() as i64;
    if r == 0 {
        return format!("{v:.decimals$}");
    }
    let digits = r.unsigned_abs().to_string();
    let mut s = String::with_capacity(digits.len() + decimals + 3);
    if r < 0 {
        s.push('-');
    }
    if decimals == 0 {
        s.push_str(&digits);
    } else if digits.len() > decimals {
        let (int, frac) = digits.split_at(digits.len() - decimals);
        s.push_str(int);
        s.push('.');
        s.push_str(frac);
    } else {
        s.push_str("0.");
        s.extend(std::iter::repeat_n('0', decimals - digits.len()));
        s.push_str(&digits);
    }
    s
}

/// The digits 0 to 9 raised, for the exponents [`sci`] writes and [`math_number`] reads.
const SUPERSCRIPT_DIGITS: &str = "⁰¹²³⁴⁵⁶⁷⁸⁹";

/// A value in scientific notation as a reader writes it: `decimals` digits after the
/// mantissa's point and a power of ten with a superscript exponent, "4.3×10⁻¹⁵", and
/// a true minus sign.
pub fn sci(v: f64, decimals: usize) -> String {
    if !v.is_finite() {
        return "—".to_string();
    }
    let s = format!("{v:.decimals$e}");
    let (mantissa, exp) = s.split_once('e').unwrap_or((&s, "0"));
    let mantissa = mantissa.replace('-', "−");
    match exp.parse::<i32>() {
        Ok(0) | Err(_) => mantissa,
        Ok(e) => format!("{mantissa}×10{}", superscript(e)),
    }
}

/// An exponent written raised: -15 as "⁻¹⁵".
fn superscript(e: i32) -> String {
    e.to_string()
        .chars()
        .map(|c| match c.to_digit(10) {
            Some(i) => SUPERSCRIPT_DIGITS.chars().nth(i as usize).unwrap_or(c),
            None => '⁻',
        })
        .collect()
}

/// A shown number as Typst math: "4.3×10⁻¹⁵" (see [`sci`]) or "4.3e-15" becomes
/// "4.3 times 10^(-15)"; other numbers are unchanged but for a true minus sign's
/// becoming "-".
pub fn math_number(s: &str) -> String {
    let s = s.replace('−', "-");
    if let Some((m, e)) = s.split_once("×10") {
        let e: String = e
            .chars()
            .map(|c| match SUPERSCRIPT_DIGITS.chars().position(|d| d == c) {
                Some(i) => char::from(b'0' + i as u8),
                None if c == '⁻' => '-',
                None => c,
            })
            .collect();
        return format!("{m} times 10^({e})");
    }
    match s.split_once('e') {
        Some((m, e)) => format!("{m} times 10^({})", e.trim_start_matches('+')),
        None => s,
    }
}

/// The number of decimals [`show`] prints a value with.
pub fn decimals_shown(v: f64) -> usize {
    let s = show(v);
    s.find('.').map_or(0, |i| s.len() - i - 1)
}

/// A value with as many decimals as `like` is shown with (a with the digits of c).
pub fn show_like(v: f64, like: f64) -> String {
    if !v.is_finite() { "—".to_string() } else { fixed(v, decimals_shown(like)) }
}

/// A demand-to-capacity ratio as printed everywhere: three significant figures
/// ("0.913", "1.05", "12.4").
pub fn ratio_text(v: f64) -> String {
    if !v.is_finite() {
        return "—".to_string();
    }
    let a = v.abs();
    let decimals = if a < 0.9995 {
        3
    } else if a < 9.995 {
        2
    } else if a < 99.95 {
        1
    } else {
        0
    };
    fixed(v, decimals)
}

/// A value rounded for display: about four significant figures, with an ASCII hyphen
/// for a minus sign (the plain trace and `check` are read by tools; the sheets put a true
/// minus sign in its place). Tiny values are written in scientific notation and values
/// from a million up in engineering form. Strains and curvatures are shown scaled (see
/// [`scaled`]).
pub fn show(v: f64) -> String {
    if !v.is_finite() {
        return "—".to_string();
    }
    let a = v.abs();
    if a != 0.0 && a < 1e-4 {
        return sci(v, 1);
    }
    if a >= 1e6 {
        // engineering form: four figures times a power of ten that is a multiple of 3,
        // "1.344×10⁹" for a moment of inertia in mm⁴
        let mut e = (a.log10().floor() as i32).div_euclid(3) * 3;
        let mut m = show(v / 10f64.powi(e));
        // 999.95 rounds up to "1000.0": take the next power instead
        if m.trim_start_matches('-').parse::<f64>().is_ok_and(|x| x >= 1000.0) {
            e += 3;
            m = show(v / 10f64.powi(e));
        }
        return format!("{}×10{}", m.replace('-', "−"), superscript(e));
    }
    let decimals = if a >= 1000.0 {
        0
    } else if a >= 100.0 {
        1
    } else if a >= 10.0 {
        2
    } else if a >= 1.0 {
        3
    } else if a == 0.0 {
        return "0".to_string();
    } else {
        // four significant figures below 1
        let mag = a.log10().floor() as i32; // -1 for 0.1..1
        (3 - mag).clamp(1, 12) as usize
    };
    let mut s = fixed(v, decimals);
    if a < 1.0 && s.contains('.') {
        // 0.7500 -> 0.75, keep at least two decimals
        while s.ends_with('0') && s.len() - s.find('.').unwrap_or(0) > 3 {
            s.pop();
        }
    }
    if s == "-0" || s.starts_with("-0") && s.trim_start_matches(['-', '0', '.']).is_empty() {
        s = s.trim_start_matches('-').to_string();
    }
    s
}

/// The scale a unit is shown at: strains ×10⁻³, curvatures ×10⁻⁶.
pub fn scale(unit: Unit) -> (f64, &'static str, &'static str) {
    match unit {
        Unit::Strain => (1e3, "×10⁻³", "10^(-3)"),
        Unit::Curvature => (1e6, "×10⁻⁶", "10^(-6)"),
        _ => (1.0, "", ""),
    }
}

/// A value in its shown scale ("6.123" for a strain of 0.006123).
pub fn scaled(v: f64, unit: Unit) -> String {
    match unit {
        Unit::Demand => ratio_text(v),
        _ => show(v * scale(unit).0),
    }
}

/// A value as it is substituted into a formula: strains as plain decimals.
pub fn substituted(v: f64, unit: Unit) -> String {
    match unit {
        Unit::Strain | Unit::Curvature => {
            if v == 0.0 {
                return "0".to_string();
            }
            let mag = v.abs().log10().floor() as i32;
            let decimals = (3 - mag).clamp(1, 15) as usize;
            format!("{v:.decimals$}")
        }
        _ => show(v),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::trace::Unit;

    // the reference is the standard library's own formatter
    #[test]
    fn fixed_writes_what_the_standard_formatter_writes() {
        let hard = [
            0.0,
            -0.0,
            0.5,
            1.5,
            2.5,
            -2.5,
            0.125,
            0.0625,
            1e-7,
            -1e-7,
            0.000_499_999,
            0.000_5,
            0.001,
            270.0,
            1860.0,
            0.75,
            0.1,
            0.7,
            1.005,
            2.675,
            1234.5,
            99.995,
            2_147.483_647,
            2_147.483_648,
            1e12,
            -123.456_789,
            8.589_934_592e9,
            f64::MIN_POSITIVE,
            f64::MAX,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ];
        for v in hard {
            for d in 0..15 {
                assert_eq!(fixed(v, d), format!("{v:.d$}"), "{v} with {d} decimals");
            }
        }
    }

    #[test]
    fn sci_writes_powers_of_ten() {
        assert_eq!(sci(4.3e-15, 1), "4.3×10⁻¹⁵");
        assert_eq!(sci(-220.0, 2), "−2.20×10²");
        assert_eq!(sci(3.49, 2), "3.49");
        assert_eq!(sci(f64::NAN, 1), "—");
        assert_eq!(show(1_344_198_284.0), "1.344×10⁹");
        assert_eq!(show(10_753_586.0), "10.75×10⁶");
        assert_eq!(show(-999_999_999.0), "−1.00×10⁹");
        assert_eq!(show(999_999.0), "999999");
        assert_eq!(math_number("−4.3×10⁻¹⁵"), "-4.3 times 10^(-15)");
        assert_eq!(math_number("9.4e-13"), "9.4 times 10^(-13)");
        assert_eq!(math_number("−12.5"), "-12.5");
    }

    proptest::proptest! {
        #[test]
        fn fixed_matches_the_standard_formatter(v in -1e7f64..1e7, d in 0usize..13, e in -12i32..4) {
            let v = v * 10f64.powi(e);
            proptest::prop_assert_eq!(fixed(v, d), format!("{v:.d$}"));
        }
    }

    #[test]
    fn shows_values() {
        assert_eq!(show(12345.6), "12346");
        assert_eq!(show(245.04), "245.0");
        assert_eq!(show(7.3851), "7.385");
        assert_eq!(show(0.75), "0.75");
        assert_eq!(show(0.84167), "0.8417");
        assert_eq!(show(0.9), "0.90");
        assert_eq!(show(-0.0), "0");
        assert_eq!(scaled(0.0061234, Unit::Strain), "6.123");
        assert_eq!(substituted(0.0061234, Unit::Strain), "0.006123");
    }
}
