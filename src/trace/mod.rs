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

pub mod expr;
pub mod number;
pub mod print;

pub use expr::{Expr, f};
pub use number::{
    const_text, decimals_shown, fixed, math_number, ratio_text, scale, scaled, sci, show, show_like, substituted,
};
pub use print::{Printer, Style, width};

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
