//! A formula as data: a small expression tree over a step's inputs that evaluates
//! itself (and, through [`super::print`], prints itself).

use serde::{Deserialize, Serialize};

/// A formula as a small expression tree over the step's inputs.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "op", content = "args", rename_all = "snake_case")]
pub enum Expr {
    /// The step's input with this index.
    Var(usize),
    /// A constant written in the formula.
    Num(f64),
    Add(Vec<Expr>),
    Sub(Box<Expr>, Box<Expr>),
    Mul(Vec<Expr>),
    Div(Box<Expr>, Box<Expr>),
    Neg(Box<Expr>),
    Pow(Box<Expr>, Box<Expr>),
    Sqrt(Box<Expr>),
    Min(Vec<Expr>),
    Max(Vec<Expr>),
    /// A unit conversion: the value of the inner formula divided by `divisor`. Shown in
    /// the substituted line only (`… / 12`, or `… × 1000` for a divisor of 0.001), not
    /// in the symbolic one.
    Per(Box<Expr>, f64),
}

/// Shorthands for building formulas.
pub mod f {
    use super::Expr;
    pub fn v(i: usize) -> Expr {
        Expr::Var(i)
    }
    pub fn n(x: f64) -> Expr {
        Expr::Num(x)
    }
    pub fn add(xs: Vec<Expr>) -> Expr {
        Expr::Add(xs)
    }
    pub fn sub(a: Expr, b: Expr) -> Expr {
        Expr::Sub(Box::new(a), Box::new(b))
    }
    pub fn mul(xs: Vec<Expr>) -> Expr {
        Expr::Mul(xs)
    }
    pub fn div(a: Expr, b: Expr) -> Expr {
        Expr::Div(Box::new(a), Box::new(b))
    }
    pub fn neg(a: Expr) -> Expr {
        Expr::Neg(Box::new(a))
    }
    pub fn pow(a: Expr, b: Expr) -> Expr {
        Expr::Pow(Box::new(a), Box::new(b))
    }
    pub fn sqrt(a: Expr) -> Expr {
        Expr::Sqrt(Box::new(a))
    }
    pub fn min(xs: Vec<Expr>) -> Expr {
        Expr::Min(xs)
    }
    pub fn max(xs: Vec<Expr>) -> Expr {
        Expr::Max(xs)
    }
    /// `a` divided by a unit-conversion divisor; 1 leaves `a` as it is.
    pub fn per(a: Expr, divisor: f64) -> Expr {
        if divisor == 1.0 { a } else { Expr::Per(Box::new(a), divisor) }
    }
}

impl Expr {
    /// The divisors of the unit conversions in the formula, in order, each once.
    pub fn conversions(&self) -> Vec<f64> {
        let mut out = Vec::new();
        self.walk(&mut |e| {
            if let Expr::Per(_, d) = e
                && !out.contains(d)
            {
                out.push(*d);
            }
        });
        out
    }

    fn walk(&self, f: &mut dyn FnMut(&Expr)) {
        f(self);
        match self {
            Expr::Var(_) | Expr::Num(_) => {}
            Expr::Add(xs) | Expr::Mul(xs) | Expr::Min(xs) | Expr::Max(xs) => xs.iter().for_each(|x| x.walk(f)),
            Expr::Sub(a, b) | Expr::Div(a, b) | Expr::Pow(a, b) => {
                a.walk(f);
                b.walk(f);
            }
            Expr::Neg(a) | Expr::Sqrt(a) | Expr::Per(a, _) => a.walk(f),
        }
    }

    /// Evaluates the formula with the given input values.
    pub fn eval(&self, x: &[f64]) -> f64 {
        match self {
            Expr::Var(i) => x.get(*i).copied().unwrap_or(f64::NAN),
            Expr::Num(v) => *v,
            Expr::Add(xs) => xs.iter().map(|e| e.eval(x)).sum(),
            Expr::Sub(a, b) => a.eval(x) - b.eval(x),
            Expr::Mul(xs) => xs.iter().map(|e| e.eval(x)).product(),
            Expr::Div(a, b) => a.eval(x) / b.eval(x),
            Expr::Neg(a) => -a.eval(x),
            Expr::Pow(a, b) => a.eval(x).powf(b.eval(x)),
            Expr::Sqrt(a) => a.eval(x).sqrt(),
            Expr::Min(xs) => xs.iter().map(|e| e.eval(x)).fold(f64::INFINITY, f64::min),
            Expr::Max(xs) => xs.iter().map(|e| e.eval(x)).fold(f64::NEG_INFINITY, f64::max),
            Expr::Per(a, d) => a.eval(x) / d,
        }
    }

    pub(super) fn prec(&self) -> u8 {
        match self {
            Expr::Add(_) | Expr::Sub(..) => 1,
            Expr::Neg(_) => 2,
            Expr::Mul(_) => 3,
            Expr::Per(..) => 3,
            Expr::Div(..) => 4,
            Expr::Pow(..) => 5,
            _ => 6,
        }
    }
}
