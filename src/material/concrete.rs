//! Concrete per ACI 318-19 (ACI 318M-19 for SI packages).

use crate::trace::{Expr, Symbol, f::*};
use crate::units::System;

/// Ultimate concrete compressive strain, ACI 318-19 22.2.2.1.
pub const EPS_CU: f64 = 0.003;

/// A formula chosen by a code table: the value, the formula over `inputs` and a note
/// naming the branch.
pub struct Branch {
    pub value: f64,
    pub formula: Expr,
    pub note: &'static str,
}

/// beta1 of ACI 318-19 Table 22.2.2.4.3, from f'c in the package's stress unit.
pub fn beta1(fc: f64, sys: System) -> Branch {
    // the breakpoints: 4 and 8 ksi, or 28 and 55 MPa (ACI 318M-19)
    let (lo, hi, step) = match sys {
        System::Us => (4.0, 8.0, 1.0),
        System::Si => (28.0, 55.0, 7.0),
    };
    if fc <= lo {
        Branch { value: 0.85, formula: n(0.85), note: "f'c at or below the lower breakpoint" }
    } else if fc >= hi {
        Branch { value: 0.65, formula: n(0.65), note: "f'c at or above the upper breakpoint" }
    } else {
        let value = 0.85 - 0.05 * (fc - lo) / step;
        let formula = if step == 1.0 {
            sub(n(0.85), mul(vec![n(0.05), sub(v(0), n(lo))]))
        } else {
            sub(n(0.85), div(mul(vec![n(0.05), sub(v(0), n(lo))]), n(step)))
        };
        Branch { value, formula, note: "f'c between the breakpoints: linear" }
    }
}

/// f'c in psi (US) or MPa (SI), for the square-root formulas.
fn fc_root_unit(fc: f64, sys: System) -> f64 {
    match sys {
        System::Us => fc * 1000.0,
        System::Si => fc,
    }
}

/// Ec of normalweight concrete, ACI 318-19 19.2.2.1(b): 57,000 sqrt(f'c) psi, or
/// 4700 sqrt(f'c) MPa. Returns the package stress unit (ksi or MPa).
pub fn ec_normalweight(fc: f64, sys: System) -> Branch {
    match sys {
        System::Us => Branch {
            value: 57_000.0 * fc_root_unit(fc, sys).sqrt() / 1000.0,
            // input 0 is f'c in psi
            formula: per(mul(vec![n(57_000.0), sqrt(v(0))]), 1000.0),
            note: "normalweight concrete; f'c in psi, Ec in psi converted to ksi",
        },
        System::Si => Branch {
            value: 4700.0 * fc.sqrt(),
            formula: mul(vec![n(4700.0), sqrt(v(0))]),
            note: "normalweight concrete; f'c and Ec in MPa",
        },
    }
}

/// Ec from density, ACI 318-19 19.2.2.1(a): wc^1.5 33 sqrt(f'c) psi (wc in lb/ft³), or
/// wc^1.5 0.043 sqrt(f'c) MPa (wc in kg/m³).
pub fn ec_density(fc: f64, wc: f64, sys: System) -> Branch {
    match sys {
        System::Us => Branch {
            value: wc.powf(1.5) * 33.0 * fc_root_unit(fc, sys).sqrt() / 1000.0,
            // input 0: f'c in psi, input 1: wc
            formula: per(mul(vec![pow(v(1), n(1.5)), n(33.0), sqrt(v(0))]), 1000.0),
            note: "from density; f'c in psi, wc in lb/ft³, Ec in psi converted to ksi",
        },
        System::Si => Branch {
            value: wc.powf(1.5) * 0.043 * fc.sqrt(),
            formula: mul(vec![pow(v(1), n(1.5)), n(0.043), sqrt(v(0))]),
            note: "from density; f'c in MPa, wc in kg/m³",
        },
    }
}

/// Modulus of rupture, ACI 318-19 19.2.3.1: 7.5 λ sqrt(f'c) psi or 0.62 λ sqrt(f'c) MPa.
pub fn fr(fc: f64, lambda: f64, sys: System) -> Branch {
    match sys {
        System::Us => Branch {
            value: 7.5 * lambda * fc_root_unit(fc, sys).sqrt() / 1000.0,
            // input 0: f'c in psi, input 1: λ
            formula: per(mul(vec![n(7.5), v(1), sqrt(v(0))]), 1000.0),
            note: "f'c in psi, fr in psi converted to ksi",
        },
        System::Si => Branch {
            value: 0.62 * lambda * fc.sqrt(),
            formula: mul(vec![n(0.62), v(1), sqrt(v(0))]),
            note: "f'c and fr in MPa",
        },
    }
}

/// The symbol and value of f'c as it enters the square-root formulas (psi or MPa).
pub fn fc_root_input(fc: f64, sys: System) -> (Symbol, f64) {
    match sys {
        System::Us => (Symbol::new("f'_c", "f'c [psi]"), fc * 1000.0),
        System::Si => (Symbol::new("f'_c", "f'c"), fc),
    }
}

/// Compression curves for the fibre analysis.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Curve {
    /// Hognestad: parabola to f''c = 0.85 f'c at eps0 = 2 f''c / Ec, then a straight
    /// descent of 15 % at 0.0038.
    Hognestad,
    /// Popovics / Thorenfeldt with the Collins-Mitchell parameters.
    Popovics,
}

/// A concrete stress-strain law (compression positive here: strain and stress both
/// taken positive in compression).
#[derive(Debug, Clone, Copy)]
pub struct Law {
    pub curve: Curve,
    pub fc: f64,
    pub ec: f64,
    pub fr: f64,
    /// Peak stress (f''c for Hognestad, f'c for Popovics).
    pub peak: f64,
    /// Strain at the peak.
    pub eps0: f64,
    /// Popovics parameters n and the post-peak k.
    pub n: f64,
    pub k_post: f64,
}

impl Law {
    pub fn new(curve: Curve, fc: f64, ec: f64, fr: f64, sys: System) -> Law {
        match curve {
            Curve::Hognestad => {
                let peak = 0.85 * fc;
                Law { curve, fc, ec, fr, peak, eps0: 2.0 * peak / ec, n: 0.0, k_post: 0.0 }
            }
            Curve::Popovics => {
                let (n_div, k_div) = match sys {
                    System::Us => (2.5, 9.0), // f'c in ksi: 2500 psi, 9000 psi
                    System::Si => (17.0, 62.0),
                };
                let n = 0.8 + fc / n_div;
                let k_post = (0.67 + fc / k_div).max(1.0);
                let eps0 = fc / ec * n / (n - 1.0);
                Law { curve, fc, ec, fr, peak: fc, eps0, n, k_post }
            }
        }
    }

    /// Stress for a strain, tension positive (so compression gives a negative stress).
    /// Tension: linear to fr, then zero. Compression beyond the curve's end: zero.
    #[inline]
    pub fn stress(&self, eps: f64) -> f64 {
        if eps >= 0.0 {
            let s = self.ec * eps;
            return if s <= self.fr { s } else { 0.0 };
        }
        let e = -eps;
        match self.curve {
            Curve::Hognestad => {
                if e <= self.eps0 {
                    let r = e / self.eps0;
                    -self.peak * (2.0 * r - r * r)
                } else if e <= 0.0038 {
                    -self.peak * (1.0 - 0.15 * (e - self.eps0) / (0.0038 - self.eps0))
                } else {
                    0.0
                }
            }
            Curve::Popovics => {
                let r = e / self.eps0;
                let k = if r <= 1.0 { 1.0 } else { self.k_post };
                -self.peak * self.n * r / (self.n - 1.0 + r.powf(self.n * k))
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // ACI 318-19 Table 22.2.2.4.3 (beta1): 0.85 up to 4000 psi, 0.85 - 0.05 (f'c - 4000)/1000
    // between, 0.65 from 8000 psi.
    #[test]
    fn beta1_table_us() {
        let b = |fc| beta1(fc, System::Us).value;
        assert_eq!(b(3.0), 0.85);
        assert_eq!(b(4.0), 0.85);
        assert!((b(5.0) - 0.80).abs() < 1e-12);
        assert!((b(6.0) - 0.75).abs() < 1e-12); // common practice: beta1 = 0.75 at 6 ksi
        assert!((b(7.0) - 0.70).abs() < 1e-12);
        assert!((b(8.0) - 0.65).abs() < 1e-12);
        assert_eq!(b(12.0), 0.65);
    }

    // ACI 318M-19 Table 22.2.2.4.3: breaks at 28 and 55 MPa, 0.05 per 7 MPa.
    #[test]
    fn beta1_table_si() {
        let b = |fc| beta1(fc, System::Si).value;
        assert_eq!(b(28.0), 0.85);
        assert!((b(35.0) - 0.80).abs() < 1e-12);
        assert!((b(42.0) - 0.75).abs() < 1e-12);
        assert_eq!(b(55.0), 0.65);
        assert_eq!(b(70.0), 0.65);
    }

    // ACI 318-19 19.2.2.1(b) and 19.2.3.1.
    #[test]
    fn ec_and_fr() {
        // 57,000 sqrt(5000) psi = 4,030,509 psi
        assert!((ec_normalweight(5.0, System::Us).value - 4030.509).abs() < 0.01);
        // 4700 sqrt(35) = 27,805.6 MPa
        assert!((ec_normalweight(35.0, System::Si).value - 27_805.57).abs() < 0.01);
        // 7.5 sqrt(5000) = 530.3 psi
        assert!((fr(5.0, 1.0, System::Us).value - 0.530_33).abs() < 1e-5);
        // 0.62 sqrt(35) = 3.668 MPa
        assert!((fr(35.0, 1.0, System::Si).value - 3.668).abs() < 1e-3);
        // 19.2.2.1(a): 145^1.5 x 33 x sqrt(5000) = 4,074,281 psi
        assert!((ec_density(5.0, 145.0, System::Us).value - 4074.28).abs() < 0.01);
    }

    #[test]
    fn hognestad_shape() {
        let l = Law::new(Curve::Hognestad, 5.0, 4030.5, 0.53, System::Us);
        // the peak f''c = 0.85 f'c at eps0 = 2 f''c / Ec
        assert!((l.stress(-l.eps0) + 4.25).abs() < 1e-12);
        // 15 % lower at 0.0038
        assert!((l.stress(-0.0038) + 0.85 * 4.25).abs() < 1e-9);
        // initial slope Ec
        assert!((l.stress(-1e-7) / -1e-7 - 4030.5).abs() < 1.0);
        assert_eq!(l.stress(0.001), 0.0); // cracked
    }

    #[test]
    fn popovics_peak_at_fc() {
        let l = Law::new(Curve::Popovics, 10.0, 5700.0, 0.75, System::Us);
        assert!((l.stress(-l.eps0) + 10.0).abs() < 1e-9);
        assert!(l.stress(-1.5 * l.eps0) > -10.0);
    }
}
