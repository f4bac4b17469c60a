//! Force equilibrium of a section at nominal strength, solved for the neutral-axis
//! depth c with Brent's bracketing method.
//!
//! At a trial c: concrete strain 0.003 at the top fibre (ACI 318-19 22.2.2.1), the
//! Whitney block 0.85 f'c over the concrete within a = beta1 c (22.2.2.4.1), clipped
//! exactly from the section outline; steel strain eps = pre + 0.003 (d - c) / c, where pre
//! is eps1 + eps2 for strand (effective prestrain and decompression) and 0 for bars.
//! Steel inside the block has the concrete it displaces deducted. The residual is the
//! concrete's compression force (a magnitude) minus the steel forces (tension positive).

use crate::material::steel::Bar;
use crate::material::strand::Curve as StrandCurve;
use crate::section::Region;
use serde::Serialize;

/// A concrete part of the section and the block stress it carries.
#[derive(Debug, Clone, Copy)]
pub struct Part<'a> {
    pub region: &'a Region,
    /// Block stress 0.85 f'c used for this part.
    pub stress: f64,
}

/// The stress-strain law of a steel layer at nominal strength: a strand curve, or an
/// elastic-perfectly-plastic bar. Strain and stress are tension positive, as in the
/// concrete's law of the fibre analysis (`material::concrete::ConcreteLaw`).
#[derive(Debug, Clone, Copy)]
pub enum SteelLaw {
    Strand(StrandCurve),
    Bar(Bar),
}

impl SteelLaw {
    /// Stress for a total strain, both tension positive (before any cap).
    #[inline]
    pub fn stress(&self, eps: f64) -> f64 {
        match self {
            SteelLaw::Strand(s) => s.stress(eps),
            SteelLaw::Bar(b) => b.stress(eps),
        }
    }
}

/// A steel layer as the solver sees it.
#[derive(Debug, Clone, Copy)]
pub struct Steel {
    /// Depth below the top of the section (topping included).
    pub d: f64,
    /// Total area of the layer.
    pub area: f64,
    /// Bar or strand diameter (for the share of it inside the block).
    pub db: f64,
    /// Strain before the flexural strain: eps1 + eps2 for strand, 0 for bars.
    pub pre: f64,
    /// Largest tensile stress it may carry (fpx of a strand not fully developed).
    pub cap: f64,
    pub law: SteelLaw,
    /// Block stress of the concrete it displaces when inside the block.
    pub displaced: f64,
}

impl Steel {
    #[inline]
    pub fn eps3(&self, c: f64, ecu: f64) -> f64 {
        ecu * (self.d - c) / c
    }
    #[inline]
    pub fn stress_at(&self, eps: f64) -> f64 {
        self.law.stress(eps).min(self.cap)
    }
    /// The share of the layer inside a block of depth a (0 to 1, linear over its
    /// diameter so that the force is continuous in c).
    #[inline]
    pub fn inside(&self, a: f64) -> f64 {
        if self.displaced == 0.0 {
            return 0.0;
        }
        ((a - (self.d - self.db / 2.0)) / self.db).clamp(0.0, 1.0)
    }
    /// Force at a neutral-axis depth (tension positive).
    #[inline]
    pub fn force(&self, c: f64, a: f64, ecu: f64) -> f64 {
        let eps = self.pre + self.eps3(c, ecu);
        self.area * (self.stress_at(eps) + self.displaced * self.inside(a))
    }
}

pub struct Model<'a> {
    pub parts: Vec<Part<'a>>,
    pub steel: Vec<Steel>,
    /// y of the top fibre.
    pub top: f64,
    /// Overall depth.
    pub depth: f64,
    pub beta1: f64,
    pub ecu: f64,
}

/// The section at one trial c.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct State {
    pub c: f64,
    pub a: f64,
    /// Concrete compression force.
    pub cc: f64,
    /// Depth of its centroid below the top.
    pub dc: f64,
    /// Sum of steel forces (tension positive).
    pub t: f64,
    pub residual: f64,
}

/// One trial of the iteration log.
#[derive(Debug, Clone, Serialize)]
pub struct Trial {
    pub k: usize,
    pub method: &'static str,
    pub c: f64,
    pub a: f64,
    /// Total strain and stress of the extreme (deepest) steel layer.
    pub eps: f64,
    pub stress: f64,
    pub cc: f64,
    pub t: f64,
    pub residual: f64,
}

/// Why no equilibrium was found.
#[derive(Debug, Clone, PartialEq)]
pub enum NoSolution {
    /// Even with the whole section in compression the steel tension is larger.
    OverReinforced {
        steel: f64,
        concrete: f64,
    },
    /// Even with a vanishing compression zone the steel is not in net tension.
    NoTension,
    NotConverged {
        iterations: usize,
        residual: f64,
    },
}

impl std::fmt::Display for NoSolution {
    fn fmt(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
        match self {
            NoSolution::OverReinforced { .. } => write!(
                f,
                "no equilibrium: the steel tension exceeds what the concrete can balance even with the whole section in compression"
            ),
            NoSolution::NoTension => {
                write!(f, "no equilibrium: the steel is not in net tension for any neutral-axis depth")
            }
            NoSolution::NotConverged { iterations, residual } => {
                write!(f, "the equilibrium iteration did not converge in {iterations} trials (residual {residual:.3e})")
            }
        }
    }
}

/// Relative closure required of the force residual.
pub const CLOSURE: f64 = 1e-9;

impl Model<'_> {
    pub fn state(&self, c: f64) -> State {
        let a = (self.beta1 * c).min(self.depth);
        let y0 = self.top - a;
        let (mut cc, mut q) = (0.0, 0.0);
        for p in &self.parts {
            let m = p.region.above(y0);
            cc += p.stress * m.area;
            q += p.stress * m.qx;
        }
        let dc = if cc > 0.0 { self.top - q / cc } else { 0.0 };
        let t: f64 = self.steel.iter().map(|s| s.force(c, a, self.ecu)).sum();
        State { c, a, cc, dc, t, residual: cc - t }
    }

    fn extreme(&self) -> Option<&Steel> {
        self.steel.iter().max_by(|x, y| x.d.total_cmp(&y.d))
    }

    fn trial(&self, k: usize, method: &'static str, s: &State) -> Trial {
        let (eps, stress) = match self.extreme() {
            Some(x) => {
                let e = x.pre + x.eps3(s.c, self.ecu);
                (e, x.stress_at(e))
            }
            None => (0.0, 0.0),
        };
        Trial { k, method, c: s.c, a: s.a, eps, stress, cc: s.cc, t: s.t, residual: s.residual }
    }

    /// Solves for c. Returns the final state and the log of trials.
    pub fn solve(&self, log: Option<&mut Vec<Trial>>) -> Result<State, NoSolution> {
        let mut sink = Vec::new();
        let log = log.unwrap_or(&mut sink);
        let h = self.depth;
        let eval = |c: f64, method: &'static str, log: &mut Vec<Trial>| {
            let s = self.state(c);
            log.push(self.trial(log.len() + 1, method, &s));
            s
        };
        let lo = eval(1e-6 * h, "bracket", log);
        if lo.residual >= 0.0 {
            if lo.residual.abs() <= CLOSURE * lo.cc.max(lo.t.abs()) && lo.cc > 0.0 {
                return Ok(lo);
            }
            return Err(NoSolution::NoTension);
        }
        // the upper end: the section depth, widened while the steel still wins (a
        // neutral axis below the section is possible with heavy or compressed steel)
        let mut hi = eval(h, "bracket", log);
        let mut span = h;
        while hi.residual < 0.0 {
            if span > 64.0 * h {
                return Err(NoSolution::OverReinforced { steel: hi.t, concrete: hi.cc });
            }
            span *= 2.0;
            hi = eval(span, "bracket", log);
        }
        let ok = |s: &State| s.residual.abs() <= CLOSURE * s.cc.abs().max(f64::MIN_POSITIVE);
        if ok(&hi) {
            return Ok(hi);
        }
        // Brent's method (after the well-known formulation with inverse quadratic
        // interpolation, secant and bisection steps)
        let (mut pre, mut cur) = (lo, hi);
        let mut blk = pre;
        let (mut spre, mut scur) = (0.0f64, 0.0f64);
        let xtol = 1e-15 * h;
        for _ in 0..200 {
            if pre.residual != 0.0 && cur.residual != 0.0 && (pre.residual < 0.0) != (cur.residual < 0.0) {
                blk = pre;
                spre = cur.c - pre.c;
                scur = spre;
            }
            if blk.residual.abs() < cur.residual.abs() {
                pre = cur;
                cur = blk;
                blk = pre;
            }
            let delta = (xtol + 4.0 * f64::EPSILON * cur.c.abs()) / 2.0;
            let sbis = (blk.c - cur.c) / 2.0;
            if ok(&cur) {
                return Ok(cur);
            }
            if sbis.abs() < delta {
                // the interval has collapsed to adjacent numbers: accept the better end
                // only if it closes; otherwise report it
                return Err(NoSolution::NotConverged {
                    iterations: log.len(),
                    residual: cur.residual / cur.cc.max(1e-300),
                });
            }
            let mut method = "bisection";
            if spre.abs() > delta && cur.residual.abs() < pre.residual.abs() {
                let stry = if pre.c == blk.c {
                    method = "secant";
                    -cur.residual * (cur.c - pre.c) / (cur.residual - pre.residual)
                } else {
                    method = "inverse quadratic";
                    let dpre = (pre.residual - cur.residual) / (pre.c - cur.c);
                    let dblk = (blk.residual - cur.residual) / (blk.c - cur.c);
                    -cur.residual * (blk.residual * dblk - pre.residual * dpre)
                        / (dblk * dpre * (blk.residual - pre.residual))
                };
                if 2.0 * stry.abs() < spre.abs().min(3.0 * sbis.abs() - delta) {
                    spre = scur;
                    scur = stry;
                } else {
                    method = "bisection";
                    spre = sbis;
                    scur = sbis;
                }
            } else {
                spre = sbis;
                scur = sbis;
            }
            pre = cur;
            let next = if scur.abs() > delta { cur.c + scur } else { cur.c + delta.copysign(sbis) };
            cur = eval(next, method, log);
        }
        Err(NoSolution::NotConverged { iterations: log.len(), residual: cur.residual / cur.cc.max(1e-300) })
    }
}
