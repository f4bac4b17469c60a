//! Mild reinforcing steel: elastic-perfectly-plastic, optionally with linear strain
//! hardening (used only by the fibre analysis when asked for).

use serde::Serialize;

#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Bar {
    pub fy: f64,
    pub es: f64,
    /// Hardening modulus after yield as a fraction of Es (0 = perfectly plastic).
    pub hardening: f64,
    /// Tensile strength cap for the hardening branch.
    pub fu: f64,
}

impl Bar {
    /// Yield strain fy / Es.
    pub fn eps_y(&self) -> f64 {
        self.fy / self.es
    }

    /// Elastic-perfectly-plastic stress, tension positive.
    #[inline]
    pub fn stress(&self, eps: f64) -> f64 {
        (self.es * eps).clamp(-self.fy, self.fy)
    }

    /// Stress with the hardening branch (fibre analysis).
    #[inline]
    pub fn stress_hardening(&self, eps: f64) -> f64 {
        let ey = self.eps_y();
        if eps.abs() <= ey || self.hardening == 0.0 {
            return self.stress(eps);
        }
        let f = (self.fy + self.hardening * self.es * (eps.abs() - ey)).min(self.fu);
        f.copysign(eps)
    }
}
