//! The moment-curvature plot of a member and its table, ready to draw: ranges, ticks
//! with their labels, the curve's points, its marked points and the strength lines.

use super::{minus, printed};
use crate::analysis::LocationResult;
use crate::analysis::curve::{CurveResult, Mark};
use crate::trace::fixed;
use crate::units::System;
use serde::Serialize;

/// Curvature is shown as ×10⁻⁶ per unit length.
const CURVATURE_SCALE: f64 = 1e6;

/// The axes of a plot: ranges, ticks and labels (flattened into the plot's keys).
#[derive(Serialize)]
pub struct Axes {
    pub x_range: [f64; 2],
    pub y_range: [f64; 2],
    pub x_ticks: Vec<Tick>,
    pub y_ticks: Vec<Tick>,
    pub x_label: String,
    pub y_label: String,
}

#[derive(Serialize)]
pub struct CurvePlot<'a> {
    pub location: &'a str,
    #[serde(flatten)]
    pub axes: Axes,
    /// Curvature and moment of each point.
    pub points: Vec<[f64; 2]>,
    pub marks: Vec<MarkShown>,
    pub lines: Vec<Line>,
    pub ductility: Option<String>,
    pub ended_by: &'static str,
    pub concrete_model: &'static str,
    pub strips: String,
    pub points_count: String,
    pub notes: &'a [String],
    pub peak_vs_mn: String,
    pub cracking_vs_mcr: Option<String>,
}

/// A tick of an axis: where, and its label.
#[derive(Serialize)]
pub struct Tick {
    pub value: f64,
    pub label: String,
}

/// A marked point of the curve (cracking, first yield, peak, end).
#[derive(Serialize)]
pub struct MarkShown {
    pub name: &'static str,
    pub curvature: f64,
    pub moment: f64,
    pub curvature_shown: String,
    pub moment_shown: String,
}

/// A horizontal strength line (Mn, φMn, Mu, Mcr).
#[derive(Serialize)]
pub struct Line {
    pub name: &'static str,
    pub value: f64,
    pub shown: String,
}

/// The plot of the curve `c` of the location `l`.
pub fn plot<'a>(c: &'a CurveResult, l: &LocationResult, sys: System) -> CurvePlot<'a> {
    let u = sys.names();
    let (kmin, kmax) = c.points.iter().fold((0.0f64, 0.0f64), |(a, b), p| (a.min(p.curvature), b.max(p.curvature)));
    let mmax = c.points.iter().map(|p| p.moment).fold(l.mn.max(l.mu).max(l.mcr), f64::max) * 1.08;
    let mmin = c.points.iter().map(|p| p.moment).fold(0.0, f64::min);
    let tick = |value: f64, label: f64| Tick { value, label: tick_label(label) };
    let mark = |name: &'static str, m: Option<Mark>| {
        m.map(|m| MarkShown {
            name,
            curvature: m.curvature,
            moment: m.moment,
            curvature_shown: printed(m.curvature * CURVATURE_SCALE),
            moment_shown: printed(m.moment),
        })
    };
    let line = |name: &'static str, value: f64| Line { name, value, shown: printed(value) };
    let marks = [
        mark("cracking", c.cracking),
        mark("first yield", c.yielding),
        mark("peak", Some(c.peak)),
        mark("end", Some(c.ultimate)),
    ];
    CurvePlot {
        location: &c.location,
        axes: Axes {
            x_range: [kmin, kmax],
            y_range: [mmin, mmax],
            x_ticks: ticks(kmin * CURVATURE_SCALE, kmax * CURVATURE_SCALE)
                .into_iter()
                .map(|t| tick(t / CURVATURE_SCALE, t))
                .collect(),
            y_ticks: ticks(mmin, mmax).into_iter().map(|t| tick(t, t)).collect(),
            x_label: format!("curvature ×10⁻⁶ 1/{}", u.length),
            y_label: format!("moment {}", u.moment),
        },
        points: c.points.iter().map(|p| [p.curvature, p.moment]).collect(),
        marks: marks.into_iter().flatten().collect(),
        lines: vec![
            line("Mn (stress block)", l.mn),
            line("φMn", l.phi_mn),
            line("Mu", l.mu),
            line("Mcr (formula)", l.mcr),
        ],
        ductility: c.ductility.map(printed),
        ended_by: c.ended_by,
        concrete_model: c.concrete_model,
        strips: c.strips.to_string(),
        points_count: c.points.len().to_string(),
        notes: &c.notes,
        peak_vs_mn: printed((c.peak.moment - l.mn) / l.mn * 100.0),
        cracking_vs_mcr: c.cracking.map(|k| printed((k.moment - l.mcr) / l.mcr * 100.0)),
    }
}

/// Tick positions for an axis from lo to hi: about five steps of 1, 2, 2.5 or 5 × 10^k,
/// up to the last one not beyond hi. They start at the first tick not below lo, or at
/// the one below lo where that would leave over 40 % of a step unlabelled (a curve that
/// starts well left of zero gets a labelled negative tick; the axis then starts there).
pub(super) fn ticks(lo: f64, hi: f64) -> Vec<f64> {
    let span = (hi - lo).abs();
    if span <= 0.0 || !span.is_finite() {
        return vec![lo];
    }
    let raw = span / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0].iter().map(|k| k * mag).find(|s| *s >= raw).unwrap_or(10.0 * mag);
    let up = (lo / step - 1e-9).ceil() * step;
    let first = if up - lo > 0.4 * step { up - step } else { up };
    let mut out = Vec::new();
    let mut t = first;
    while t <= hi + 1e-9 * span {
        out.push(if t.abs() < 1e-12 * span { 0.0 } else { t });
        t += step;
    }
    out
}

/// A tick label: short, no trailing zeros.
pub(super) fn tick_label(t: f64) -> String {
    let s = fixed(t, 3);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".into() } else { minus(s.to_string()) }
}
