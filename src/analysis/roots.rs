//! A bracketing root finder (Brent's method) for the fibre analysis and the code's
//! approximate method. The strength solution has its own, logging copy in `solve`.

/// Finds x in [a, b] with f(x) = 0, given f(a) and f(b) of opposite signs. Stops when
/// |f| <= ftol or the bracket is narrower than xtol. `None` without a sign change.
pub fn brent(f: impl FnMut(f64) -> f64, a: f64, b: f64, fa: f64, fb: f64, xtol: f64, ftol: f64) -> Option<f64> {
    brent_value(f, a, b, fa, fb, xtol, ftol).map(|(x, _)| x)
}

/// As [`brent`], with f at the root found (already evaluated: no further call of f).
pub fn brent_value(
    mut f: impl FnMut(f64) -> f64,
    a: f64,
    b: f64,
    fa: f64,
    fb: f64,
    xtol: f64,
    ftol: f64,
) -> Option<(f64, f64)> {
    if fa == 0.0 {
        return Some((a, fa));
    }
    if fb == 0.0 {
        return Some((b, fb));
    }
    if (fa < 0.0) == (fb < 0.0) || !fa.is_finite() || !fb.is_finite() {
        return None;
    }
    let (mut xpre, mut xcur, mut fpre, mut fcur) = (a, b, fa, fb);
    let (mut xblk, mut fblk, mut spre, mut scur) = (0.0f64, 0.0f64, 0.0f64, 0.0f64);
    for _ in 0..200 {
        if fpre != 0.0 && fcur != 0.0 && (fpre < 0.0) != (fcur < 0.0) {
            xblk = xpre;
            fblk = fpre;
            spre = xcur - xpre;
            scur = spre;
        }
        if fblk.abs() < fcur.abs() {
            xpre = xcur;
            xcur = xblk;
            xblk = xpre;
            fpre = fcur;
            fcur = fblk;
            fblk = fpre;
        }
        let delta = (xtol + 4.0 * f64::EPSILON * xcur.abs()) / 2.0;
        let sbis = (xblk - xcur) / 2.0;
        if fcur.abs() <= ftol || sbis.abs() < delta {
            return Some((xcur, fcur));
        }
        if spre.abs() > delta && fcur.abs() < fpre.abs() {
            let stry = if xpre == xblk {
                -fcur * (xcur - xpre) / (fcur - fpre)
            } else {
                let dpre = (fpre - fcur) / (xpre - xcur);
                let dblk = (fblk - fcur) / (xblk - xcur);
                -fcur * (fblk * dblk - fpre * dpre) / (dblk * dpre * (fblk - fpre))
            };
            if 2.0 * stry.abs() < spre.abs().min(3.0 * sbis.abs() - delta) {
                spre = scur;
                scur = stry;
            } else {
                spre = sbis;
                scur = sbis;
            }
        } else {
            spre = sbis;
            scur = sbis;
        }
        xpre = xcur;
        fpre = fcur;
        xcur += if scur.abs() > delta { scur } else { delta.copysign(sbis) };
        fcur = f(xcur);
        if !fcur.is_finite() {
            return None;
        }
    }
    Some((xcur, fcur))
}

/// Widens [x0 - step, x0 + step] geometrically until f changes sign; returns the
/// bracket and the values at its ends.
pub fn bracket(mut f: impl FnMut(f64) -> f64, x0: f64, step: f64, tries: usize) -> Option<(f64, f64, f64, f64)> {
    let mut s = step.abs().max(f64::MIN_POSITIVE);
    let f0 = f(x0);
    if f0 == 0.0 {
        return Some((x0, x0, 0.0, 0.0));
    }
    for _ in 0..tries {
        let (lo, hi) = (x0 - s, x0 + s);
        let (flo, fhi) = (f(lo), f(hi));
        if (flo < 0.0) != (f0 < 0.0) {
            return Some((lo, x0, flo, f0));
        }
        if (fhi < 0.0) != (f0 < 0.0) {
            return Some((x0, hi, f0, fhi));
        }
        s *= 2.0;
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_a_cube_root() {
        let f = |x: f64| x * x * x - 2.0;
        let r = brent(f, 0.0, 2.0, f(0.0), f(2.0), 1e-15, 0.0).unwrap();
        assert!((r - 2f64.cbrt()).abs() < 1e-12);
        let (a, b, fa, fb) = bracket(f, 10.0, 0.1, 60).unwrap();
        assert!(brent(f, a, b, fa, fb, 1e-15, 0.0).is_some());
    }
}
