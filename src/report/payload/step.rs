//! A recorded step as the payload holds it: what the sheets print of it (formatted
//! here), and the values and the formula tree it was computed from.

use super::{minus, unit_name};
use crate::trace::{Expr, Step, Style, Unit, math_number, scale};
use crate::units::System;
use serde::Serialize;

/// What a sheet prints of a step (the view holds only this).
#[derive(Serialize)]
pub struct StepShown {
    pub id: String,
    /// The id without its location prefix ("strength.Mn" for "L2.strength.Mn").
    pub short: String,
    /// Stacked, one part a line with the equals signs aligned, rather than on one line.
    pub stack: bool,
    pub group: String,
    pub title: String,
    /// The symbol as Typst math.
    pub sym: String,
    /// The formula as Typst math (none for a value from the input, a table or a constant).
    pub formula: Option<String>,
    /// The formula with the values substituted, where it differs from the formula.
    pub subst: Option<String>,
    pub shown: String,
    pub shown_math: String,
    pub unit: &'static str,
    pub clause: Option<String>,
    pub note: Option<String>,
}

/// A step in the payload: what is printed, and what it was computed from.
#[derive(Serialize)]
pub struct StepPayload<'a> {
    #[serde(flatten)]
    pub shown: StepShown,
    pub plain: &'a str,
    pub value: f64,
    pub scale: &'static str,
    pub tree: &'a Option<Expr>,
    pub inputs: Vec<InputShown<'a>>,
}

/// A named input of a step.
#[derive(Serialize)]
pub struct InputShown<'a> {
    pub sym: &'a str,
    pub plain: &'a str,
    pub value: f64,
    pub unit: &'static str,
    pub kind: Unit,
}

/// About this many estimated characters fit the equation column on one line.
const LINE_WIDTH: f64 = 88.0;

/// A step as the payload holds it.
pub fn step(st: &Step, sys: System) -> StepPayload<'_> {
    let constant = matches!(st.formula, Some(Expr::Num(_)));
    let math = st.printed(Style::Math).filter(|_| !constant);
    let (formula, subst) = match math {
        Some((f, s)) => {
            let subst = (s != f).then_some(s);
            (Some(f), subst)
        }
        None => (None, None),
    };
    let short = st.id.split_once('.').filter(|(p, _)| p.starts_with('L')).map_or(st.id.as_str(), |(_, rest)| rest);
    let shown = StepShown {
        id: st.id.clone(),
        short: short.to_string(),
        stack: line_width(st, sys, formula.is_some(), subst.is_some()) > LINE_WIDTH,
        group: st.group.clone(),
        title: st.title.clone(),
        sym: st.symbol.math.clone(),
        formula,
        subst,
        shown: minus(st.shown()),
        shown_math: shown_math(st),
        unit: unit_name(st.unit, sys),
        clause: st.clause.clone(),
        note: st.note.clone(),
    };
    let inputs = st
        .inputs
        .iter()
        .map(|i| InputShown {
            sym: &i.symbol.math,
            plain: &i.symbol.plain,
            value: i.value,
            unit: unit_name(i.unit, sys),
            kind: i.unit,
        })
        .collect();
    StepPayload { shown, plain: &st.symbol.plain, value: st.value, scale: scale(st.unit).1, tree: &st.formula, inputs }
}

/// The estimated width of a step's whole line: symbol, formula, substitution and result.
fn line_width(st: &Step, sys: System, formula: bool, subst: bool) -> f64 {
    let (ws, wf, wsub) = st.widths();
    let result = st.shown().chars().count() as f64 + unit_name(st.unit, sys).chars().count() as f64 + 6.0;
    ws + if formula { wf + 3.0 } else { 0.0 } + if subst { wsub + 3.0 } else { 0.0 } + result
}

/// A value as Typst math: "6.123 times 10^(-3)" for a strain.
fn shown_math(st: &Step) -> String {
    // zero needs no scale ("0", not "0 × 10⁻³")
    let tag = if st.value == 0.0 { "" } else { scale(st.unit).2 };
    let s = math_number(&minus(st.shown()));
    if tag.is_empty() { s } else { format!("{s} times {tag}") }
}
