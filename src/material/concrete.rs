//! Concrete stress-strain laws for the fibre analysis (Hognestad, Popovics). What a
//! code decides of concrete (beta1, Ec, fr, the crushing strain at nominal strength) is
//! asked of the design basis (`crate::basis`).

use crate::units::System;

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

/// The stress-strain law of a concrete for the fibre analysis. Strain and stress are
/// tension positive, as in the strand and bar curves: a compressive strain is negative
/// and gives a negative stress. The parameters (`peak`, `eps0`) are magnitudes.
#[derive(Debug, Clone, Copy)]
pub struct ConcreteLaw {
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

impl ConcreteLaw {
    pub fn new(curve: Curve, fc: f64, ec: f64, fr: f64, sys: System) -> ConcreteLaw {
        match curve {
            Curve::Hognestad => {
                let peak = 0.85 * fc;
                ConcreteLaw { curve, fc, ec, fr, peak, eps0: 2.0 * peak / ec, n: 0.0, k_post: 0.0 }
            }
            Curve::Popovics => {
                let (n_div, k_div) = match sys {
                    System::Us => (2.5, 9.0), // f'c in ksi: 2500 psi, 9000 psi
                    System::Si => (17.0, 62.0),
                };
                let n = 0.8 + fc / n_div;
                let k_post = (0.67 + fc / k_div).max(1.0);
                let eps0 = fc / ec * n / (n - 1.0);
                ConcreteLaw { curve, fc, ec, fr, peak: fc, eps0, n, k_post }
            }
        }
    }

    /// Stress for a strain, both tension positive (a negative strain gives a negative
    /// stress). Tension: linear to fr, then zero. Compression beyond the curve's end: zero.
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

    #[test]
    fn hognestad_shape() {
        let l = ConcreteLaw::new(Curve::Hognestad, 5.0, 4030.5, 0.53, System::Us);
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
        let l = ConcreteLaw::new(Curve::Popovics, 10.0, 5700.0, 0.75, System::Us);
        assert!((l.stress(-l.eps0) + 10.0).abs() < 1e-9);
        assert!(l.stress(-1.5 * l.eps0) > -10.0);
    }
}
