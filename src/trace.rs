//! The trace: every step of a computation as data.
//!
//! A [`Step`] records what was computed (title, symbol), from what (named inputs with
//! values and units), by which formula (an [`Expr`] tree that both evaluates and prints
//! itself as Typst math and as plain text), the result and the clause or source.
//!
//! The engine computes with plain Rust and records the step beside it; the test
//! `tests/trace_replay.rs` re-evaluates every recorded formula from its recorded inputs
//! and must get the recorded result, so the formula shown is the formula computed.
//!
//! Invariant: symbol strings and formula text are built only from `&'static str`
//! constants of this crate and formatted numbers. No user text ever enters them, so the
//! templates may evaluate them as Typst math.

use serde::{Deserialize, Serialize};

/// What kind of quantity a value is; the payload resolves it to a unit name.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Unit {
    Length,
    Area,
    /// Second moment of area (length⁴).
    Inertia,
    /// Section modulus (length³).
    Modulus,
    Stress,
    Force,
    Moment,
    /// Strain, shown as ×10⁻³.
    Strain,
    /// Curvature, 1/length, shown as ×10⁻⁶.
    Curvature,
    /// A pure number (β1, φ, a ratio).
    Ratio,
    /// A demand-to-capacity ratio, shown to three figures.
    Demand,
    /// Per cent.
    Percent,
    /// A force per length: klf or kN/m.
    LineLoad,
    /// A load per area: psf or kPa.
    Pressure,
    /// A density: pcf or kg/m³.
    Density,
}

impl Unit {
    /// The unit's name in a unit system ("" for pure numbers).
    pub fn name(self, system: crate::units::System) -> &'static str {
        use crate::units::System::{Si, Us};
        match (self, system) {
            (Unit::Length, Us) => "in",
            (Unit::Length, Si) => "mm",
            (Unit::Area, Us) => "in²",
            (Unit::Area, Si) => "mm²",
            (Unit::Inertia, Us) => "in⁴",
            (Unit::Inertia, Si) => "mm⁴",
            (Unit::Modulus, Us) => "in³",
            (Unit::Modulus, Si) => "mm³",
            (Unit::Stress, Us) => "ksi",
            (Unit::Stress, Si) => "MPa",
            (Unit::Force, Us) => "kip",
            (Unit::Force, Si) => "kN",
            (Unit::Moment, Us) => "kip-ft",
            (Unit::Moment, Si) => "kN-m",
            (Unit::Curvature, Us) => "1/in",
            (Unit::Curvature, Si) => "1/mm",
            (Unit::Percent, _) => "%",
            (Unit::LineLoad, Us) => "klf",
            (Unit::LineLoad, Si) => "kN/m",
            (Unit::Pressure, Us) => "psf",
            (Unit::Pressure, Si) => "kPa",
            (Unit::Density, Us) => "pcf",
            (Unit::Density, Si) => "kg/m³",
            (Unit::Strain, _) | (Unit::Ratio, _) | (Unit::Demand, _) => "",
        }
    }
}

/// A symbol, in Typst math and in plain text.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Symbol {
    pub math: String,
    pub plain: String,
}

impl Symbol {
    /// A fixed symbol.
    pub fn new(math: &'static str, plain: &'static str) -> Symbol {
        Symbol { math: math.to_string(), plain: plain.to_string() }
    }

    /// A symbol with a layer (or other) index added to its subscript:
    /// `indexed("f", "\"se\"", "fse", 2)` is f with subscript "se,2".
    pub fn indexed(base: &'static str, sub: &'static str, plain: &'static str, i: usize) -> Symbol {
        let math = if sub.is_empty() { format!("{base}_({i})") } else { format!("{base}_({sub},{i})") };
        Symbol { math, plain: format!("{plain},{i}") }
    }
}

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

    fn prec(&self) -> u8 {
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

/// How a formula is printed.
#[derive(Clone, Copy, PartialEq, Eq)]
pub enum Style {
    /// Typst math.
    Math,
    /// Plain text for terminals and CSV.
    Plain,
}

/// Prints a formula: symbolically (`values = None`) or with the input values substituted.
pub struct Printer<'a> {
    pub style: Style,
    pub symbols: &'a [&'a Symbol],
    pub values: Option<&'a [String]>,
}

impl Printer<'_> {
    pub fn print(&self, e: &Expr) -> String {
        let mut s = String::new();
        self.write(e, &mut s);
        s
    }

    fn atom(&self, i: usize) -> String {
        match self.values {
            Some(vals) => {
                let v = vals.get(i).cloned().unwrap_or_default();
                let v = if self.style == Style::Math { math_number(&v) } else { v };
                if v.starts_with('-') || v.starts_with('−') { format!("({v})") } else { v }
            }
            None => match self.style {
                Style::Math => self.symbols.get(i).map(|s| s.math.clone()).unwrap_or_default(),
                Style::Plain => self.symbols.get(i).map(|s| s.plain.clone()).unwrap_or_default(),
            },
        }
    }

    fn child(&self, e: &Expr, min_prec: u8, out: &mut String) {
        if e.prec() < min_prec {
            out.push('(');
            self.write(e, out);
            out.push(')');
        } else {
            self.write(e, out);
        }
    }

    fn write(&self, e: &Expr, out: &mut String) {
        let math = self.style == Style::Math;
        match e {
            Expr::Var(i) => out.push_str(&self.atom(*i)),
            Expr::Num(v) => {
                let t = const_text(*v);
                if *v < 0.0 {
                    out.push('(');
                    out.push_str(&t);
                    out.push(')');
                } else {
                    out.push_str(&t);
                }
            }
            Expr::Add(xs) => {
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        if let Expr::Neg(inner) = x {
                            out.push_str(" - ");
                            self.child(inner, 2, out);
                            continue;
                        }
                        out.push_str(" + ");
                    }
                    self.child(x, 1, out);
                }
            }
            Expr::Sub(a, b) => {
                self.child(a, 1, out);
                out.push_str(" - ");
                self.child(b, 2, out);
            }
            Expr::Mul(xs) => {
                let symbolic = self.values.is_none();
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        let both_vars = symbolic && !matches!(x, Expr::Num(_));
                        out.push_str(match (math, both_vars) {
                            (true, true) => " ",
                            (true, false) => " times ",
                            (false, _) => " * ",
                        });
                    }
                    self.child(x, 3, out);
                }
            }
            Expr::Div(a, b) => {
                if math {
                    out.push_str("frac(");
                    self.write(a, out);
                    out.push_str(", ");
                    self.write(b, out);
                    out.push(')');
                } else {
                    self.child(a, 3, out);
                    out.push_str(" / ");
                    self.child(b, 5, out);
                }
            }
            Expr::Neg(a) => {
                out.push('-');
                self.child(a, 3, out);
            }
            Expr::Pow(a, b) => {
                self.child(a, 6, out);
                if math {
                    out.push_str("^(");
                    self.write(b, out);
                    out.push(')');
                } else {
                    out.push('^');
                    self.child(b, 6, out);
                }
            }
            Expr::Sqrt(a) => {
                out.push_str("sqrt(");
                self.write(a, out);
                out.push(')');
            }
            Expr::Min(xs) | Expr::Max(xs) => {
                out.push_str(if matches!(e, Expr::Min(_)) { "min(" } else { "max(" });
                for (k, x) in xs.iter().enumerate() {
                    if k > 0 {
                        out.push_str(", ");
                    }
                    self.write(x, out);
                }
                out.push(')');
            }
            Expr::Per(a, d) => {
                if self.values.is_none() {
                    self.write(a, out);
                } else {
                    self.child(a, 4, out);
                    if *d < 1.0 {
                        out.push_str(if math { " times " } else { " * " });
                        out.push_str(&const_text(1.0 / *d));
                    } else {
                        // a literal slash in math: a conversion, not a fraction
                        out.push_str(if math { " \\/ " } else { " / " });
                        out.push_str(&const_text(*d));
                    }
                }
            }
        }
    }
}

/// Estimated width of a printed formula in characters of body text (fractions take the
/// wider of their parts, subscripts count less). The templates use it to choose between
/// one line and a stacked layout without measuring.
pub fn width(e: &Expr, symbols: &[&Symbol], values: Option<&[String]>) -> f64 {
    let w = |x: &Expr| width(x, symbols, values);
    match e {
        Expr::Var(i) => match values {
            Some(v) => v.get(*i).map_or(1.0, |s| s.chars().count() as f64 + if s.starts_with('-') { 2.0 } else { 0.0 }),
            None => symbols.get(*i).map_or(1.0, |s| 1.0 + 0.7 * (s.plain.chars().count() as f64 - 1.0).max(0.0)),
        },
        Expr::Num(v) => const_text(*v).chars().count() as f64,
        Expr::Add(xs) | Expr::Mul(xs) => {
            xs.iter().map(w).sum::<f64>()
                + 2.0 * (xs.len().saturating_sub(1)) as f64
                + if values.is_some() { 2.0 } else { 0.0 }
        }
        Expr::Sub(a, b) => w(a) + w(b) + 4.0,
        Expr::Div(a, b) => w(a).max(w(b)) + 1.0,
        Expr::Neg(a) => w(a) + 1.5,
        Expr::Pow(a, b) => w(a) + 0.7 * w(b) + 1.0,
        Expr::Sqrt(a) => w(a) + 2.0,
        Expr::Min(xs) | Expr::Max(xs) => 5.0 + xs.iter().map(w).sum::<f64>() + 2.0 * xs.len() as f64,
        Expr::Per(a, d) => w(a) + if values.is_some() { 4.0 + const_text(*d).chars().count() as f64 } else { 0.0 },
    }
}

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

/// A value rounded for display: about four significant figures, never in scientific
/// notation. Strains and curvatures are shown scaled (see [`scaled`]).
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

/// One named input of a step.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Input {
    pub symbol: Symbol,
    pub value: f64,
    pub unit: Unit,
}

/// One recorded step.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Step {
    /// Stable identifier, unique within the member's trace ("prestress.fse.1").
    pub id: String,
    /// The part of the calculation it belongs to ("section", "prestress", "strength"...).
    pub group: String,
    pub title: String,
    pub symbol: Symbol,
    /// The formula; `None` for a value taken from the input or a table.
    pub formula: Option<Expr>,
    pub inputs: Vec<Input>,
    pub value: f64,
    pub unit: Unit,
    /// Code clause, table or published source.
    pub clause: Option<String>,
    pub note: Option<String>,
    /// Decimals the result is shown with, where it must match another value's (the
    /// block depth a with the digits of c); otherwise about four figures.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub decimals: Option<usize>,
}

impl Step {
    pub fn new(group: &str, id: impl Into<String>, title: impl Into<String>, symbol: Symbol) -> Step {
        Step {
            id: id.into(),
            group: group.to_string(),
            title: title.into(),
            symbol,
            formula: None,
            inputs: Vec::new(),
            value: f64::NAN,
            unit: Unit::Ratio,
            clause: None,
            note: None,
            decimals: None,
        }
    }
    pub fn formula(mut self, e: Expr) -> Step {
        self.formula = Some(e);
        self
    }
    pub fn input(mut self, symbol: Symbol, value: f64, unit: Unit) -> Step {
        self.inputs.push(Input { symbol, value, unit });
        self
    }
    pub fn result(mut self, value: f64, unit: Unit) -> Step {
        self.value = value;
        self.unit = unit;
        self
    }
    pub fn clause(mut self, c: impl Into<String>) -> Step {
        self.clause = Some(c.into());
        self
    }
    pub fn note(mut self, n: impl Into<String>) -> Step {
        self.note = Some(n.into());
        self
    }

    /// Shows the result with as many decimals as `other` is shown with.
    pub fn decimals_like(mut self, other: f64) -> Step {
        self.decimals = Some(decimals_shown(other));
        self
    }

    /// The result as printed (in its shown scale).
    pub fn shown(&self) -> String {
        match self.decimals {
            Some(d) if self.value.is_finite() && scale(self.unit).0 == 1.0 => fixed(self.value, d),
            _ => scaled(self.value, self.unit),
        }
    }

    /// Re-evaluates the formula from the recorded inputs.
    pub fn replay(&self) -> Option<f64> {
        let x: Vec<f64> = self.inputs.iter().map(|i| i.value).collect();
        self.formula.as_ref().map(|e| e.eval(&x))
    }

    /// The formula printed symbolically and with values substituted.
    pub fn printed(&self, style: Style) -> Option<(String, String)> {
        let e = self.formula.as_ref()?;
        let syms: Vec<&Symbol> = self.inputs.iter().map(|i| &i.symbol).collect();
        let vals: Vec<String> = self.inputs.iter().map(|i| substituted(i.value, i.unit)).collect();
        let sym = Printer { style, symbols: &syms, values: None }.print(e);
        let sub = Printer { style, symbols: &syms, values: Some(&vals) }.print(e);
        Some((sym, sub))
    }

    /// Estimated widths (in characters) of the symbol, the formula and the substituted
    /// line as printed.
    pub fn widths(&self) -> (f64, f64, f64) {
        let syms: Vec<&Symbol> = self.inputs.iter().map(|i| &i.symbol).collect();
        let vals: Vec<String> = self.inputs.iter().map(|i| substituted(i.value, i.unit)).collect();
        let sym = 1.0 + 0.7 * (self.symbol.plain.chars().count() as f64 - 1.0).max(0.0);
        match &self.formula {
            Some(e) => (sym, width(e, &syms, None), width(e, &syms, Some(&vals))),
            None => (sym, 0.0, 0.0),
        }
    }

    /// One line of plain text: `fse = fpj - Δfp = 202.5 - 35 = 167.5 ksi  [20.3.2.5.1]`.
    pub fn plain_line(&self, system: crate::units::System) -> String {
        let mut s = format!("{} = ", self.symbol.plain);
        let constant = matches!(self.formula, Some(Expr::Num(_)));
        if let Some((sym, sub)) = self.printed(Style::Plain).filter(|_| !constant) {
            s.push_str(&sym);
            s.push_str(" = ");
            if sub != sym {
                s.push_str(&sub);
                s.push_str(" = ");
            }
        }
        let (_, tag, _) = scale(self.unit);
        s.push_str(&self.shown());
        if !tag.is_empty() {
            s.push(' ');
            s.push_str(tag);
        }
        let name = self.unit.name(system);
        if !name.is_empty() {
            s.push(' ');
            s.push_str(name);
        }
        s
    }
}

/// A recorder of steps. When off, nothing is built: the closures are never called, so
/// the fast path (`check`, benchmarks) pays nothing for the trace.
#[derive(Debug, Default)]
pub struct Trace {
    on: bool,
    pub steps: Vec<Step>,
}

impl Trace {
    pub fn new(on: bool) -> Trace {
        Trace { on, steps: Vec::new() }
    }
    pub fn on(&self) -> bool {
        self.on
    }
    /// Records the step the closure builds, if recording.
    #[inline]
    pub fn rec(&mut self, build: impl FnOnce() -> Step) {
        if self.on {
            self.steps.push(build());
        }
    }
}

#[cfg(test)]
mod tests {
    use super::f::*;
    use super::*;

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
    fn prints_and_evaluates() {
        let a = Symbol::new("A_\"ps\"", "Aps");
        let fp = Symbol::new("f_\"ps\"", "fps");
        let e = per(mul(vec![v(0), v(1)]), 1000.0);
        let syms = [&a, &fp];
        let vals = ["1184".to_string(), "1650".to_string()];
        let p = Printer { style: Style::Math, symbols: &syms, values: None };
        assert_eq!(p.print(&e), "A_\"ps\" f_\"ps\"");
        let p = Printer { style: Style::Plain, symbols: &syms, values: Some(&vals) };
        assert_eq!(p.print(&e), "(1184 * 1650) / 1000");
        assert_eq!(e.eval(&[1184.0, 1650.0]), 1953.6);
        let d = div(n(0.04), sub(v(0), n(0.007)));
        let p = Printer { style: Style::Math, symbols: &syms, values: None };
        assert_eq!(p.print(&d), "frac(0.04, A_\"ps\" - 0.007)");
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
