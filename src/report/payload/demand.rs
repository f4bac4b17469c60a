//! A member's demand in the payload, for members with loads: the loads, supports and
//! load combinations as the demand sheet prints them, each station along the span as
//! its table prints it, and the capacity diagram (φMn and Mu along the member) ready to
//! draw: ranges, ticks, the two lines, the end regions and the marked points.

use super::curve::{Axes, Tick, tick_label, ticks};
use super::printed;
use crate::analysis::conclusion::Status;
use crate::analysis::demand::{Demand, line_shown, pressure_shown};
use crate::analysis::{MemberResult, StationRow};
use crate::basis::{Basis, Clause};
use crate::input::model::{End, LoadKind};
use crate::trace::{Unit, ratio_text};
use serde::Serialize;

/// Points along the member at which Mu(x) is drawn (besides the stations).
const MU_SAMPLES: usize = 120;

/// What the demand sheet, the capacity diagram and the station table print.
#[derive(Serialize)]
pub struct DemandShown {
    pub length: String,
    pub span: String,
    pub bearing: String,
    pub width: String,
    /// Some load is given as an area load (over the tributary width).
    pub area_loads: bool,
    /// The unit of a line load ("klf").
    pub line_unit: &'static str,
    /// The topping was cast on a shored member (its weight on the composite section).
    pub shored: bool,
    pub loads: Vec<LoadRow>,
    pub points: Vec<PointRow>,
    pub combinations: Vec<CombinationRow>,
    /// The clause of the combinations, cited in full.
    pub combinations_clause: String,
    /// The live-load factor where live load accompanies roof live load or snow, where
    /// it is reduced: the factor, the reason given and the clause.
    pub live_reduced: Option<LiveReduced>,
    /// The largest hogging factored moment, at the overhangs (shown, not checked).
    pub hogging: String,
    pub has_overhangs: bool,
    /// The load kinds present, by symbol ("D", "L"): the moment columns of the table.
    pub kinds: Vec<&'static str>,
    /// The load kinds the combinations name that this member does not have ("Lr"), or
    /// none.
    pub absent: Option<String>,
    pub stations: Vec<StationShown>,
    /// How many stations are derived in full on location sheets, and how many are not.
    pub derived_count: usize,
    /// How many stations mirror one derived in full (a symmetric member's right end
    /// region).
    pub mirror_count: usize,
    pub untraced_count: usize,
    pub diagram: Diagram,
}

/// A uniform load of the member.
#[derive(Serialize)]
pub struct LoadRow {
    /// "dead", "live", ...
    pub kind: &'static str,
    pub symbol: &'static str,
    pub source: String,
    /// The area load and the width it is taken over, where it was given as one.
    pub area_load: Option<String>,
    pub w: String,
    /// "precast unit alone" or "composite section" ("the section" without a topping).
    pub carried_by: &'static str,
}

/// A point load of the member.
#[derive(Serialize)]
pub struct PointRow {
    pub kind: &'static str,
    pub symbol: &'static str,
    pub name: String,
    pub p: String,
    pub x: String,
}

/// A load combination: its name, its factors written out, and at how many stations it
/// governs.
#[derive(Serialize)]
pub struct CombinationRow {
    pub name: String,
    pub text: String,
    pub governs: String,
}

#[derive(Serialize)]
pub struct LiveReduced {
    pub factor: String,
    pub reason: Option<String>,
    pub clause: String,
}

/// A station as its table prints it.
#[derive(Serialize)]
pub struct StationShown {
    pub x: String,
    pub what: String,
    /// "left" or "right" within an end region.
    pub end_region: Option<&'static str>,
    /// The unfactored moment of each load kind present, in the order of `kinds`.
    pub by_kind: Vec<String>,
    pub mu: String,
    pub combination: String,
    pub mnc: String,
    pub phi: String,
    pub phi_mn: String,
    pub ratio: String,
    pub min_ok: &'static str,
    pub status: Status,
    pub status_word: &'static str,
    /// The name of the location whose sheets derive this station in full.
    pub derived: Option<String>,
    pub role: Option<&'static str>,
    /// The x of the station this one mirrors (a symmetric member's right end region):
    /// its derivation is that station's.
    pub mirror_of: Option<String>,
}

/// The capacity diagram: x along the member (0 to its length), moments upward.
#[derive(Serialize)]
pub struct Diagram {
    #[serde(flatten)]
    pub axes: Axes,
    /// φMn at each station (x, moment), in order of x.
    pub phi_mn: Vec<[f64; 2]>,
    /// The governing factored moment Mu(x), sampled along the member.
    pub mu: Vec<[f64; 2]>,
    /// The bearings' x.
    pub bearings: [f64; 2],
    /// The end regions [from, to] (up to the longest debonded plus development length).
    pub regions: Vec<[f64; 2]>,
    /// Marked points along the member: transfer and development ends, debond and harp
    /// points, point loads.
    pub marks: Vec<DiagramMark>,
    /// The governing station: x, φMn, Mu and its label.
    pub governing: Option<GoverningMark>,
    /// What the letters of the marks mean.
    pub key: Vec<(&'static str, &'static str)>,
}

#[derive(Serialize)]
pub struct DiagramMark {
    pub x: f64,
    /// "T1, D1": the letters of what is here and the layer (or point load) numbers.
    pub label: String,
    /// The row of its label below the axis (0, 1, 2), so that labels do not overlap.
    pub row: usize,
}

#[derive(Serialize)]
pub struct GoverningMark {
    pub x: f64,
    pub phi_mn: f64,
    pub mu: f64,
    pub label: String,
}

/// A combination's factors written out ("1.2D + 1.6L + 0.5Lr"), each with at least
/// one decimal.
fn combination_text(factors: &[f64; 4]) -> String {
    LoadKind::ALL
        .iter()
        .zip(factors)
        .filter(|(_, f)| **f != 0.0)
        .map(|(k, f)| {
            let n = if f.fract() == 0.0 { format!("{f:.1}") } else { format!("{f}") };
            format!("{n}{}", k.symbol())
        })
        .collect::<Vec<_>>()
        .join(" + ")
}

/// The demand of a member with loads, as its sheets print it.
pub fn demand(m: &MemberResult, d: &Demand, basis: &dyn Basis) -> DemandShown {
    let sys = basis.units();
    let u = sys.names();
    let km = sys.moment_shown();
    let kf = sys.force_shown();
    let length = |v: f64| format!("{} {}", printed(v), u.length);
    let present: Vec<usize> = (0..4)
        .filter(|&k| {
            d.uniform.iter().any(|l| l.kind == LoadKind::ALL[k] && l.w != 0.0)
                || d.points.iter().any(|q| q.kind == LoadKind::ALL[k] && q.p != 0.0)
        })
        .collect();
    let loads = d
        .uniform
        .iter()
        .map(|l| LoadRow {
            kind: l.kind.word(),
            symbol: l.kind.symbol(),
            source: l.source.trim_start_matches("loads.").replace('_', " "),
            area_load: l.area_load.map(|q| {
                format!("{} {} × {}", printed(pressure_shown(sys, q)), Unit::Pressure.name(sys), length(d.width))
            }),
            w: printed(line_shown(sys, l.w)),
            carried_by: match (m.section.composite.is_some(), l.precast_only) {
                (false, _) => "the section",
                (true, true) => "precast unit alone",
                (true, false) => "composite section",
            },
        })
        .collect();
    let points = d
        .points
        .iter()
        .map(|q| PointRow {
            kind: q.kind.word(),
            symbol: q.kind.symbol(),
            name: q.name.clone(),
            p: printed(q.p * kf),
            x: printed(q.x),
        })
        .collect();
    let combinations = d
        .combinations
        .iter()
        .map(|c| CombinationRow {
            name: c.name.clone(),
            text: combination_text(&c.factors),
            governs: m.stations.iter().filter(|s| s.combination == c.name).count().to_string(),
        })
        .collect();
    let live_reduced = (d.live_factor != 1.0).then(|| LiveReduced {
        factor: printed(d.live_factor),
        reason: d.live_factor_reason.clone(),
        clause: basis.cite(Clause::ReducedLiveFactor),
    });
    let stations: Vec<StationShown> = m.stations.iter().map(|s| station(s, m, &present)).collect();
    let mirror_count = m.stations.iter().filter(|s| s.mirror_of.is_some()).count();
    let derived_count = m.stations.iter().filter(|s| s.derived.is_some()).count() - mirror_count;
    DemandShown {
        length: length(d.length),
        span: length(d.span),
        bearing: length(d.bearing),
        width: length(d.width),
        area_loads: d.uniform.iter().any(|l| l.area_load.is_some()),
        line_unit: Unit::LineLoad.name(sys),
        shored: d.shored,
        loads,
        points,
        combinations,
        combinations_clause: basis.cite(Clause::LoadCombinations),
        live_reduced,
        hogging: printed(d.hogging * km),
        has_overhangs: d.bearing > 0.0,
        kinds: present.iter().map(|&k| LoadKind::ALL[k].symbol()).collect(),
        absent: {
            let named: Vec<&str> = (0..4)
                .filter(|k| !present.contains(k) && d.combinations.iter().any(|c| c.factors[*k] != 0.0))
                .map(|k| LoadKind::ALL[k].symbol())
                .collect();
            (!named.is_empty()).then(|| named.join(", "))
        },
        untraced_count: stations.len() - derived_count - mirror_count,
        derived_count,
        mirror_count,
        stations,
        diagram: diagram(m, d, sys),
    }
}

fn station(s: &StationRow, m: &MemberResult, present: &[usize]) -> StationShown {
    StationShown {
        x: printed(s.x),
        what: s.what.join("; "),
        end_region: s.end_region.map(|e| match e {
            End::Left => "left",
            End::Right => "right",
        }),
        by_kind: present.iter().map(|&k| printed(s.by_kind[k])).collect(),
        mu: printed(s.mu),
        combination: s.combination.clone(),
        mnc: printed(s.mnc),
        phi: printed(s.phi),
        phi_mn: printed(s.phi_mn),
        ratio: ratio_text(s.ratio),
        min_ok: if s.min_ok { "met" } else { "not met" },
        status: s.status,
        status_word: s.status.word(),
        derived: s.derived.and_then(|i| m.locations.get(i)).map(|l| l.name.clone()),
        role: s.role,
        mirror_of: s.mirror_of.map(printed),
    }
}

/// The letter of a station's reason on the diagram, and its layer or load number.
fn mark_of(what: &str) -> Option<(&'static str, String)> {
    let number = |w: &str, after: &str| {
        w.split(after).nth(1).map(|r| r.chars().take_while(|c| c.is_ascii_digit()).collect::<String>())
    };
    let (letter, after) = if what.starts_with("end of transfer") {
        ("T", "layer ")
    } else if what.starts_with("end of development") {
        ("D", "layer ")
    } else if what.starts_with("debond point") {
        ("B", "layer ")
    } else if what.starts_with("harp point") {
        ("H", "layer ")
    } else if what.starts_with("point load") {
        ("P", "point load ")
    } else {
        return None;
    };
    Some((letter, number(what, after).unwrap_or_default()))
}

/// What the letters of the marks mean.
const KEY: [(&str, &str); 5] = [
    ("T", "end of the transfer length"),
    ("D", "end of the development length"),
    ("B", "debond point (bonding begins)"),
    ("H", "harp point"),
    ("P", "point load"),
];

fn diagram(m: &MemberResult, d: &Demand, sys: crate::units::System) -> Diagram {
    let u = sys.names();
    let km = sys.moment_shown();
    let len = d.length;
    let rows = &m.stations;
    let phi_mn: Vec<[f64; 2]> = rows.iter().map(|s| [s.x, s.phi_mn]).collect();
    // Mu(x) from the same statics as the stations, at even steps and at every station
    let mut xs: Vec<f64> = (0..=MU_SAMPLES).map(|k| len * k as f64 / MU_SAMPLES as f64).collect();
    xs.extend(rows.iter().map(|s| s.x));
    xs.extend(d.points.iter().map(|q| q.x));
    xs.extend([d.bearing, len - d.bearing]);
    xs.retain(|x| x.is_finite() && (0.0..=len).contains(x));
    xs.sort_by(f64::total_cmp);
    xs.dedup_by(|a, b| (*a - *b).abs() <= 1e-9 * len);
    let mu: Vec<[f64; 2]> = xs.iter().map(|&x| [x, d.at(x).mu * km]).collect();
    let top = phi_mn.iter().chain(&mu).map(|p| p[1]).fold(0.0, f64::max).max(1e-9) * 1.12;
    // the end regions: up to the last station in each (the end of the longest
    // debonded plus development length)
    let mut regions = Vec::new();
    let left = rows.iter().filter(|s| s.end_region == Some(End::Left)).map(|s| s.x).fold(f64::NAN, f64::max);
    if left.is_finite() {
        regions.push([0.0, left]);
    }
    let right = rows.iter().filter(|s| s.end_region == Some(End::Right)).map(|s| s.x).fold(f64::NAN, f64::min);
    if right.is_finite() {
        regions.push([right, len]);
    }
    // marks: the letters of each station that has any, their labels set in rows so that
    // no two labels in a row overlap (widths estimated from the characters)
    let mut marks: Vec<DiagramMark> = Vec::new();
    let per_char = len / 6.0 / 72.0 * 6.5 * 0.6; // a 6.5 pt character on a plot about 6 in wide
    let mut ends = [f64::NEG_INFINITY; 3];
    for s in rows {
        let mut found: Vec<String> = Vec::new();
        for w in &s.what {
            if let Some((letter, k)) = mark_of(w) {
                let t = format!("{letter}{k}");
                if !found.contains(&t) {
                    found.push(t);
                }
            }
        }
        if found.is_empty() {
            continue;
        }
        let label = found.join(", ");
        let half = label.chars().count() as f64 * per_char / 2.0;
        let row = (0..3)
            .find(|&r| s.x - half > ends[r] + per_char)
            .unwrap_or_else(|| (0..3).min_by(|&a, &b| ends[a].total_cmp(&ends[b])).unwrap_or(0));
        ends[row] = s.x + half;
        marks.push(DiagramMark { x: s.x, label, row });
    }
    let governing = rows.iter().find(|s| s.role == Some("governing station")).map(|s| GoverningMark {
        x: s.x,
        phi_mn: s.phi_mn,
        mu: s.mu,
        label: format!("governing: x = {} {}, Mu/φMn = {}", printed(s.x), u.length, ratio_text(s.ratio)),
    });
    let key = KEY.iter().copied().filter(|(l, _)| marks.iter().any(|k| k.label.contains(l))).collect();
    Diagram {
        axes: Axes {
            x_range: [0.0, len],
            y_range: [0.0, top],
            x_ticks: ticks(0.0, len).into_iter().map(|t| Tick { value: t, label: tick_label(t) }).collect(),
            y_ticks: ticks(0.0, top).into_iter().map(|t| Tick { value: t, label: tick_label(t) }).collect(),
            x_label: format!("x from the left end ({})", u.length),
            y_label: format!("moment ({})", u.moment),
        },
        phi_mn,
        mu,
        bearings: [d.bearing, len - d.bearing],
        regions,
        marks,
        governing,
        key,
    }
}
