//! A check location in the payload: its result as the analysis gives it (every field but
//! the trace, which is written as steps), and the numbers its sheets print.

use super::omit::Omit;
use super::step::{StepPayload, step};
use super::{minus, printed, printed_scaled};
use crate::analysis::{LayerOut, LocationResult, solve::Trial};
use crate::trace::{Unit, const_text, ratio_text, sci, show_like};
use crate::units::System;
use serde::Serialize;

/// A location in the payload.
#[derive(Serialize)]
pub struct LocationPayload<'a> {
    /// The result, but its trace (written as `steps`).
    #[serde(flatten)]
    pub result: Omit<'a, LocationResult>,
    pub steps: Vec<StepPayload<'a>>,
    #[serde(flatten)]
    pub shown: LocationShown,
}

/// What the sheets of a location print, formatted.
#[derive(Serialize)]
pub struct LocationShown {
    pub iterations_shown: Vec<TrialShown>,
    pub strands_shown: Vec<LayerShown>,
    pub bars_shown: Vec<LayerShown>,
    pub shown: ValuesShown,
}

/// A trial of the strain-compatibility solution, as its table prints it.
#[derive(Serialize)]
pub struct TrialShown {
    pub k: String,
    pub method: &'static str,
    pub c: String,
    pub a: String,
    pub eps: String,
    pub stress: String,
    pub cc: String,
    pub t: String,
    pub residual: String,
}

/// A steel layer at nominal strength, as its table and the figures print it.
#[derive(Serialize)]
pub struct LayerShown {
    pub kind: &'static str,
    pub index: usize,
    pub label: String,
    pub area: String,
    pub unit_area: String,
    pub depth: String,
    pub eps1: Option<String>,
    pub eps2: Option<String>,
    pub eps3: String,
    pub eps: String,
    pub stress: String,
    pub force: String,
    pub fse: Option<String>,
    pub cap: Option<String>,
    pub active: bool,
}

/// The values of a location its sheets print (in the package's shown units).
#[derive(Serialize)]
pub struct ValuesShown {
    pub x: Option<String>,
    pub c: String,
    pub a: String,
    pub mn: String,
    pub phi: String,
    pub phi_mn: String,
    pub mu: String,
    pub ratio: String,
    pub mcr: String,
    pub min_required: String,
    pub eps_t: String,
    pub pe: String,
    pub e: String,
    pub cc: String,
    pub dc: String,
    pub closure: String,
    pub trials: String,
    pub approx_mn: String,
    pub approx_fps: String,
    pub approx_diff: String,
    pub other_mn: String,
    pub max_strand_strain: String,
    pub eps_cu: String,
    /// "x = 120.0 in", or that the strands are taken as fully developed.
    pub x_label: String,
}

/// A location as the payload holds it.
pub fn location(l: &LocationResult, sys: System) -> LocationPayload<'_> {
    LocationPayload {
        result: Omit { value: l, omitted: &["trace"] },
        steps: l.trace.iter().map(|s| step(s, sys)).collect(),
        shown: LocationShown {
            iterations_shown: l.iterations.iter().map(trial).collect(),
            strands_shown: l.strands.iter().map(layer).collect(),
            bars_shown: l.bars.iter().map(layer).collect(),
            shown: values(l, sys),
        },
    }
}

fn trial(t: &Trial) -> TrialShown {
    TrialShown {
        k: t.k.to_string(),
        method: t.method,
        c: printed(t.c),
        a: minus(show_like(t.a, t.c)),
        // a trial at the bracket's end (c near zero) strains the steel beyond any real
        // value: such strains are shown as beyond 1000 ×10⁻³
        eps: if t.eps.abs() >= 1.0 {
            if t.eps > 0.0 { "> 1000".to_string() } else { "< −1000".to_string() }
        } else {
            printed_scaled(t.eps, Unit::Strain)
        },
        stress: printed(t.stress),
        cc: printed(t.cc),
        t: printed(t.t),
        residual: if t.residual == 0.0 { "0".to_string() } else { sci(t.residual, 2) },
    }
}

fn layer(s: &LayerOut) -> LayerShown {
    let strain = |e: f64| printed_scaled(e, Unit::Strain);
    LayerShown {
        kind: s.kind,
        index: s.index,
        label: s.label.clone(),
        area: printed(s.area),
        unit_area: printed(s.unit_area),
        depth: printed(s.depth),
        eps1: s.eps1.map(strain),
        eps2: s.eps2.map(strain),
        eps3: strain(s.eps3),
        eps: strain(s.eps),
        stress: printed(s.stress),
        force: printed(s.force),
        fse: s.fse.map(printed),
        cap: s.cap.map(printed),
        active: s.active,
    }
}

/// A value that may be missing or not finite: printed, or a dash.
fn printed_or_dash(v: Option<f64>) -> String {
    match v {
        Some(x) if x.is_finite() => printed(x),
        _ => "—".to_string(),
    }
}

fn values(l: &LocationResult, sys: System) -> ValuesShown {
    let strain = |e: f64| printed_scaled(e, Unit::Strain);
    ValuesShown {
        x: l.x.map(printed),
        c: printed(l.c),
        a: minus(show_like(l.a, l.c)),
        mn: printed(l.mn),
        phi: printed(l.phi),
        phi_mn: printed(l.phi_mn),
        mu: printed(l.mu),
        ratio: ratio_text(l.ratio),
        mcr: printed(l.mcr),
        min_required: printed(l.min_reinforcement.required),
        eps_t: strain(l.eps_t),
        pe: printed(l.pe),
        e: printed(l.e),
        cc: printed(l.cc),
        dc: printed(l.dc),
        closure: sci(l.closure, 1),
        trials: l.iterations.len().to_string(),
        approx_mn: printed_or_dash(l.approximate.mn),
        approx_fps: printed_or_dash(l.approximate.fps),
        approx_diff: printed_or_dash(l.approximate.difference),
        other_mn: printed_or_dash(l.other_block.as_ref().map(|o| o.mn)),
        max_strand_strain: strain(l.max_strand_strain),
        eps_cu: const_text(l.eps_cu),
        x_label: match l.x {
            Some(x) => format!("x = {} {}", printed(x), sys.names().length),
            None => "strands taken as fully developed".into(),
        },
    }
}
