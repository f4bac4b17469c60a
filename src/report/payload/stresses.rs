//! A member's stresses in the payload: the limits and the class as the stress sheet
//! prints them, a row per station, the reinforcement at release, and the plot of the
//! top and bottom stresses along the member against their limits.

use super::curve::{Axes, Tick, tick_label, ticks};
use super::printed;
use crate::analysis::MemberResult;
use crate::analysis::stresses::{Fibre, MemberStresses, StageStress};
use crate::basis::{Basis, Clause};
use crate::trace::ratio_text;
use serde::Serialize;

/// What the stress sheet prints.
#[derive(Serialize)]
pub struct StressesShown {
    pub pass: bool,
    pub class: &'static str,
    /// The class found, in words with its numbers.
    pub class_text: String,
    pub release_checked: bool,
    pub release_why_not: Option<String>,
    /// Label and value rows of the limits.
    pub release_limits: Vec<(String, String)>,
    pub service_limits: Vec<(String, String)>,
    pub combinations: String,
    pub sustained_live: String,
    pub has_topping: bool,
    pub rows: Vec<StressRow>,
    pub reinforcement: Vec<ReinforcementRow>,
    pub reinforcement_fy: String,
    pub reinforcement_rule: &'static str,
    pub worst_release: Option<String>,
    pub worst_service: String,
    pub clauses: Clauses,
    pub plot: StressPlot,
    /// Camber and the live-load deflection, or why they are not computed.
    pub camber: Option<CamberShown>,
    pub camber_why_not: Option<String>,
    /// The live-load deflection in words, and whether it is within its limit.
    pub live: Option<String>,
    pub live_ok: bool,
    /// A class C member's crack control in words (None: not class C).
    pub crack_text: Option<String>,
}

/// The camber table: each elastic component with its multipliers, and the results.
#[derive(Serialize)]
pub struct CamberShown {
    pub x: String,
    /// Component, elastic value, multiplier at erection, multiplier final.
    pub rows: Vec<[String; 4]>,
    pub release: String,
    pub erection: String,
    pub final_camber: String,
}

/// The clauses the sheet cites, in full.
#[derive(Serialize)]
pub struct Clauses {
    pub release: String,
    pub reinforcement: String,
    pub service: String,
    pub class: String,
    pub combinations: String,
}

/// A stress printed, and whether it is beyond its limit.
#[derive(Serialize)]
pub struct Cell {
    pub text: String,
    pub over: bool,
}

/// One station's stresses: at release (top, bottom), sustained and all service loads
/// (top, bottom; the topping's top under all loads), and the worst ratio to a limit.
#[derive(Serialize)]
pub struct StressRow {
    pub x: String,
    /// The name of a named location (the stations have none).
    pub name: Option<String>,
    pub end_zone: bool,
    pub release: Option<[Cell; 2]>,
    pub sustained: [Cell; 2],
    pub service: [Cell; 2],
    pub topping: Option<Cell>,
    pub worst: String,
    /// "ok", "reinforced" (tension at release carried by bonded bars) or "FAIL".
    pub result: &'static str,
}

#[derive(Serialize)]
pub struct ReinforcementRow {
    pub x: String,
    pub fibre: &'static str,
    pub force: String,
    pub fs: String,
    pub area: String,
    pub provided: String,
    pub ok: bool,
}

/// The top and bottom stresses along the member at release and under all service loads,
/// with the limits as steps.
#[derive(Serialize)]
pub struct StressPlot {
    #[serde(flatten)]
    pub axes: Axes,
    pub lines: Vec<PlotLine>,
    pub limits: Vec<PlotLine>,
    pub bearings: [f64; 2],
}

#[derive(Serialize)]
pub struct PlotLine {
    pub name: String,
    /// "release" or "service": the colour; "top" or "bottom": the stroke.
    pub stage: &'static str,
    pub fibre: &'static str,
    pub points: Vec<[f64; 2]>,
}

fn cell(f: &Fibre) -> Cell {
    Cell { text: printed(f.stress), over: !f.ok() }
}

/// The stress sheet of a member whose stresses are checked.
pub fn stresses(m: &MemberResult, s: &MemberStresses, basis: &dyn Basis, reinforcement_fy: f64) -> StressesShown {
    let sys = basis.units();
    let u = sys.names();
    let st = |v: f64| format!("{} {}", printed(v), u.stress);
    let rows = rows_in_order(m, s);
    let (release_limits, service_limits) = limits_shown(s, &u);
    let class_text = class_text(s, &u);
    let d = m.demand.as_ref();
    let present = crate::input::model::LoadKind::ALL.map(|k| {
        d.is_some_and(|d| {
            d.uniform.iter().any(|w| w.kind == k && w.w > 0.0) || d.points.iter().any(|q| q.kind == k && q.p > 0.0)
        })
    });
    let combinations =
        basis.service_combinations(present).iter().map(|c| c.name.clone()).collect::<Vec<_>>().join("; ");
    let (_, rule) = basis.release_steel_stress(reinforcement_fy);
    let at = |w: (f64, f64)| format!("{} at x = {} {}", ratio_text(w.0), printed(w.1), u.length);
    StressesShown {
        pass: s.pass,
        class: s.class.letter(),
        class_text,
        release_checked: s.release.checked,
        release_why_not: s.release.why_not.clone(),
        release_limits,
        service_limits,
        combinations,
        sustained_live: printed(s.service.sustained_live),
        has_topping: s.service.limits.topping_total.is_some(),
        rows,
        reinforcement: s
            .reinforcement
            .iter()
            .map(|r| ReinforcementRow {
                x: printed(r.x),
                fibre: r.fibre,
                force: printed(r.tension_force),
                fs: printed(r.fs),
                area: printed(r.area),
                provided: printed(r.provided),
                ok: r.ok,
            })
            .collect(),
        reinforcement_fy: st(reinforcement_fy),
        reinforcement_rule: rule,
        worst_release: s.worst_release.map(at),
        worst_service: at(s.worst_service),
        clauses: Clauses {
            release: format!("{}; {}", basis.cite(Clause::ReleaseCompression), basis.clause(Clause::ReleaseTension)),
            reinforcement: basis.cite(Clause::ReleaseReinforcement),
            service: basis.cite(Clause::ServiceCompression),
            class: basis.cite(Clause::MemberClass),
            combinations: basis.cite(Clause::ServiceCombinations),
        },
        plot: plot(m, s, sys),
        camber: m.camber.as_ref().map(camber),
        live: m.deflection.as_ref().map(|d| live_text(d, s, &u)),
        live_ok: m.deflection.as_ref().is_none_or(|d| d.ok),
        crack_text: s.crack_control.as_ref().map(|c| crack_text(c, &u)),
        camber_why_not: m.camber.is_none().then(|| {
            "the camber rests on the release stage (Eci and the stress just after release), which is not checked for this member".to_string()
        }),
    }
}

/// The rows of the stress table: the stations, the named locations and the points the
/// scan found between them, in order of x.
fn rows_in_order(m: &MemberResult, s: &MemberStresses) -> Vec<StressRow> {
    // the stations and the named locations, in order of x
    let mut at: Vec<(f64, Option<&str>, &[StageStress])> =
        m.stations.iter().map(|r| (r.x, None, r.stresses.as_slice())).collect();
    at.extend(
        m.locations
            .iter()
            .filter(|l| !l.stresses.is_empty())
            .filter_map(|l| Some((l.x?, Some(l.name.as_str()), l.stresses.as_slice()))),
    );
    at.extend(s.between.iter().map(|b| (b.x, Some(b.why.as_str()), b.stresses.as_slice())));
    at.sort_by(|a, b| a.0.total_cmp(&b.0));
    at.iter().map(|&(x, name, st)| row(x, name, st, s)).collect()
}

/// Rows of a list of limits: what is limited, and the limit with its unit.
type LimitRows = Vec<(String, String)>;

/// The stress limits as the sheet lists them: at release (where checked) and in service.
fn limits_shown(s: &MemberStresses, u: &crate::units::UnitNames) -> (LimitRows, LimitRows) {
    let st = |v: f64| format!("{} {}", printed(v), u.stress);
    let mut release_limits = Vec::new();
    if let (Some(l), Some(fci)) = (&s.release.limits, s.release.fci) {
        release_limits = vec![
            ("f'ci".to_string(), st(fci)),
            (
                "Compression away from the ends (at the ends)".to_string(),
                format!("{} ({})", st(l.compression), st(l.compression_end)),
            ),
            (
                "Tension away from the ends (at the ends)".to_string(),
                format!("{} ({})", st(l.tension), st(l.tension_end)),
            ),
            (
                "End zone, from each end".to_string(),
                format!("{} {}", printed(s.release.end_zone.unwrap_or(0.0)), u.length),
            ),
        ];
    }
    let sl = &s.service.limits;
    let mut service_limits = vec![
        ("Compression, sustained loads".to_string(), st(sl.sustained)),
        ("Compression, all loads".to_string(), st(sl.total)),
    ];
    if let (Some(a), Some(b)) = (sl.topping_sustained, sl.topping_total) {
        service_limits.push(("Topping, sustained (all) loads".to_string(), format!("{} ({})", st(a), st(b))));
    }
    service_limits.push(("Class U up to / class T up to".to_string(), format!("{} / {}", st(s.ft_u), st(s.ft_t))));
    (release_limits, service_limits)
}

/// The member's class in words: the largest bottom stress in service, where, and the
/// class it gives.
fn class_text(s: &MemberStresses, u: &crate::units::UnitNames) -> String {
    let st = |v: f64| format!("{} {}", printed(v), u.stress);
    format!(
        "the bottom fibre's largest stress under all service loads between the bearings (tension positive): ft = {} at x = {} {}; {}",
        st(s.ft),
        printed(s.ft_x),
        u.length,
        match s.class.letter() {
            "U" => format!("at most {}: class U", st(s.ft_u)),
            "T" => format!("above {} and at most {}: class T", st(s.ft_u), st(s.ft_t)),
            _ => format!("above {}: class C", st(s.ft_t)),
        }
    )
}

fn camber(c: &crate::analysis::camber::Camber) -> CamberShown {
    let k = c.multipliers;
    let mult = |v: f64| format!("{v:.2}");
    let mut rows = vec![
        [
            "camber from the prestress, Δp (up)".to_string(),
            printed(c.prestress),
            mult(k.erection_prestress),
            mult(k.final_prestress),
        ],
        [
            "self-weight, Δsw (down)".to_string(),
            printed(c.self_weight),
            mult(k.erection_self_weight),
            mult(k.final_self_weight),
        ],
    ];
    if let (Some(t), Some(f)) = (c.topping, k.final_topping) {
        rows.push(["topping, Δtop (down)".to_string(), printed(t), "—".into(), mult(f)]);
    }
    rows.push([
        "superimposed dead load, Δsd (down)".to_string(),
        printed(c.superimposed_dead),
        "—".into(),
        mult(k.final_superimposed),
    ]);
    CamberShown {
        x: printed(c.x),
        rows,
        release: printed(c.release),
        erection: printed(c.erection),
        final_camber: printed(c.final_camber),
    }
}

/// A class C member's crack control in words.
fn crack_text(c: &crate::analysis::cracked::CrackCheck, u: &crate::units::UnitNames) -> String {
    use crate::analysis::cracked::CrackCheck;
    let c = match c {
        CrackCheck::NotMade { why_not } => return format!("not made: {why_not}."),
        CrackCheck::Made(c) => c,
    };
    let within = |ok: bool| if ok { "within" } else { "BEYOND" };
    let spacing = match (c.spacing_max, c.spacing) {
        (Some(s), _) if s <= 0.0 => format!(
            "Table 24.3.2 allows no spacing at the tension face here: at the clear cover of {} {} its largest spacing is {} {}, at most 0, so the crack control is NOT MET whatever the spacing",
            printed(c.cover),
            u.length,
            printed(s),
            u.length
        ),
        (None, _) => format!("at or below {} {} the spacing is not limited", printed(c.dfps_free), u.stress),
        (Some(s), Some(given)) => format!(
            "largest spacing of the reinforcement at the tension face {} {}: the input's {} {} is {} it",
            printed(s),
            u.length,
            printed(given),
            u.length,
            within(given <= s * (1.0 + 1e-9))
        ),
        (Some(s), None) => {
            format!("largest spacing of the reinforcement at the tension face {} {}", printed(s), u.length)
        }
    };
    let open = c.open.as_ref().map_or(String::new(), |o| format!(" Left to the engineer: {o}."));
    format!(
        "at x = {} {}, Δfps = {} {} in layer {}, {} the limit {} {}; {spacing}.{open}",
        printed(c.x),
        u.length,
        printed(c.dfps),
        u.stress,
        c.layer,
        within(c.dfps <= c.dfps_max * (1.0 + 1e-9)),
        printed(c.dfps_max),
        u.stress
    )
}

/// The live-load deflection against its limit, in words.
fn live_text(d: &crate::analysis::camber::LiveDeflection, s: &MemberStresses, u: &crate::units::UnitNames) -> String {
    match (d.live, &d.limit_text, d.limit) {
        (None, _, _) => format!("not computed: {}", d.why_not.clone().unwrap_or_default()),
        (Some(v), Some(t), Some(l)) => format!(
            "{} {} of {} (class {}{}), {} the limit {t} = {} {}",
            printed(v),
            u.length,
            d.load,
            s.class.letter(),
            if d.cracked.is_some() { ", bilinear on the cracked section" } else { "" },
            if d.ok { "within" } else { "BEYOND" },
            printed(l),
            u.length
        ),
        (Some(v), _, _) => format!(
            "{} {} of {} (class {}{}); no limit chosen in the input",
            printed(v),
            u.length,
            d.load,
            s.class.letter(),
            if d.cracked.is_some() { ", bilinear on the cracked section" } else { "" }
        ),
    }
}

fn row(x: f64, name: Option<&str>, stresses: &[StageStress], s: &MemberStresses) -> StressRow {
    let stage = |name: &str| stresses.iter().find(|t| t.stage == name);
    let pair = |t: &StageStress| [cell(&t.top), cell(&t.bottom)];
    let empty = || [Cell { text: "—".into(), over: false }, Cell { text: "—".into(), over: false }];
    let rel = stage("release");
    let reinforced = s.reinforcement.iter().any(|q| (q.x - x).abs() <= 1e-9 * x.abs().max(1.0));
    let steel_short = s.reinforcement.iter().any(|q| (q.x - x).abs() <= 1e-9 * x.abs().max(1.0) && !q.ok);
    let failed = steel_short
        || stresses.iter().any(|t| {
            [&t.top, &t.bottom]
                .into_iter()
                .chain(t.topping_top.as_ref())
                .any(|f| !(f.ok() || (t.stage == "release" && reinforced && f.stress > 0.0)))
        });
    let worst = stresses.iter().map(StageStress::worst).fold(0.0, f64::max);
    StressRow {
        x: printed(x),
        name: name.map(str::to_string),
        end_zone: s.release.end_zone.is_some_and(|z| crate::analysis::stresses::in_end_zone(x, s.length, z)),
        release: rel.map(pair),
        sustained: stage("sustained").map_or_else(empty, pair),
        service: stage("service").map_or_else(empty, pair),
        topping: stage("service").and_then(|t| t.topping_top.as_ref()).map(cell),
        worst: ratio_text(worst),
        result: if failed {
            "FAIL"
        } else if reinforced {
            "reinforced"
        } else {
            "ok"
        },
    }
}

fn plot(m: &MemberResult, s: &MemberStresses, sys: crate::units::System) -> StressPlot {
    let u = sys.names();
    let rows = &m.stations;
    let mut lines = Vec::new();
    for (stage, name) in [("release", "at release"), ("service", "all service loads")] {
        for fibre in ["top", "bottom"] {
            let points: Vec<[f64; 2]> = rows
                .iter()
                .filter_map(|r| {
                    let t = r.stresses.iter().find(|t| t.stage == stage)?;
                    Some([r.x, if fibre == "top" { t.top.stress } else { t.bottom.stress }])
                })
                .collect();
            if !points.is_empty() {
                lines.push(PlotLine { name: format!("{fibre}, {name}"), stage, fibre, points });
            }
        }
    }
    let len = s.length;
    let mut limits = Vec::new();
    if let (Some(l), Some(z)) = (&s.release.limits, s.release.end_zone) {
        let z = z.min(len / 2.0);
        let step =
            |end: f64, mid: f64| vec![[0.0, end], [z, end], [z, mid], [len - z, mid], [len - z, end], [len, end]];
        limits.push(PlotLine {
            name: "release limits".into(),
            stage: "release",
            fibre: "limit",
            points: step(l.tension_end, l.tension),
        });
        limits.push(PlotLine {
            name: "release limits".into(),
            stage: "release",
            fibre: "limit",
            points: step(l.compression_end, l.compression),
        });
    }
    limits.push(PlotLine {
        name: "service limit".into(),
        stage: "service",
        fibre: "limit",
        points: vec![[0.0, s.service.limits.total], [len, s.service.limits.total]],
    });
    let all = lines.iter().chain(&limits).flat_map(|l| l.points.iter().map(|p| p[1]));
    let (lo, hi) = all.fold((0.0f64, 0.0f64), |(a, b), y| (a.min(y), b.max(y)));
    let pad = (hi - lo).max(1e-9) * 0.08;
    let (lo, hi) = (lo - pad, hi + pad);
    let bearing = m.demand.as_ref().map_or(0.0, |d| d.bearing);
    StressPlot {
        axes: Axes {
            x_range: [0.0, len],
            y_range: [lo, hi],
            x_ticks: ticks(0.0, len).into_iter().map(|t| Tick { value: t, label: tick_label(t) }).collect(),
            y_ticks: ticks(lo, hi).into_iter().map(|t| Tick { value: t, label: tick_label(t) }).collect(),
            x_label: format!("x from the left end ({})", u.length),
            y_label: format!("stress ({}), tension positive", u.stress),
        },
        lines,
        limits,
        bearings: [bearing, len - bearing],
    }
}
