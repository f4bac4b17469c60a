//! Presentations of results for the terminal and for tools: the `check` table and JSON,
//! and the `trace` listing as text, JSON or CSV.

use crate::analysis::conclusion::{Condition, Status};
use crate::analysis::{Analysis, LayerOut, LocationResult, MemberResult};
use crate::input::Package;
use crate::trace::{Step, Style, show};
use serde::Serialize;
use serde_json::{Value, json};

#[derive(Serialize)]
struct LayerJson {
    depth: f64,
    area: f64,
    eps: f64,
    stress: f64,
    force: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    eps1: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    eps2: Option<f64>,
    eps3: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    fse: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    active: Option<bool>,
}

fn layer_json(l: &LayerOut, strand: bool) -> LayerJson {
    LayerJson {
        depth: l.depth,
        area: l.area,
        eps: l.eps,
        stress: l.stress,
        force: l.force,
        eps1: l.eps1.filter(|_| strand),
        eps2: l.eps2.filter(|_| strand),
        eps3: l.eps3,
        fse: l.fse.filter(|_| strand),
        active: strand.then_some(l.active),
    }
}

#[derive(Serialize)]
struct LocationJson<'a> {
    #[serde(skip_serializing_if = "Option::is_none")]
    name: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    x: Option<Option<f64>>,
    c: f64,
    a: f64,
    beta1: f64,
    zone: &'a str,
    eps_t: f64,
    phi: f64,
    mn: f64,
    phi_mn: f64,
    mu: f64,
    ratio: f64,
    control: &'a str,
    mcr: f64,
    min_reinforcement_ok: bool,
    min_reinforcement_waived: bool,
    rupture_risk: bool,
    #[serde(skip_serializing_if = "Option::is_none")]
    pass: Option<bool>,
    #[serde(skip_serializing_if = "Option::is_none")]
    status: Option<Status>,
    #[serde(skip_serializing_if = "Option::is_none")]
    conditions: Option<&'a [Condition]>,
    top_fibre_prestress_alone: f64,
    conclusion: &'a str,
    strands: Vec<LayerJson>,
    bars: Vec<LayerJson>,
    /// A named location along a member with loads: its stresses (in `locations` only:
    /// the member's own `stresses` is the summary).
    #[serde(skip_serializing_if = "Option::is_none")]
    stresses: Option<&'a [crate::analysis::stresses::StageStress]>,
}

fn location_json(l: &LocationResult, top_level: bool) -> LocationJson<'_> {
    LocationJson {
        name: (!top_level).then_some(l.name.as_str()),
        x: (!top_level).then_some(l.x),
        c: l.c,
        a: l.a,
        beta1: l.beta1,
        zone: l.zone,
        eps_t: l.eps_t,
        phi: l.phi,
        mn: l.mn,
        phi_mn: l.phi_mn,
        mu: l.mu,
        ratio: l.ratio,
        control: l.control,
        mcr: l.mcr,
        min_reinforcement_ok: l.min_reinforcement.ok,
        min_reinforcement_waived: !l.min_reinforcement.ok && l.min_reinforcement.waiver_flexure,
        rupture_risk: l.rupture_risk,
        pass: (!top_level).then_some(l.pass),
        status: (!top_level).then_some(l.status),
        conditions: (!top_level).then_some(l.conditions.as_slice()),
        top_fibre_prestress_alone: l.prestress_alone.top,
        conclusion: &l.conclusion,
        strands: l.strands.iter().map(|s| layer_json(s, true)).collect(),
        bars: l.bars.iter().map(|s| layer_json(s, false)).collect(),
        stresses: (!top_level && !l.stresses.is_empty()).then_some(l.stresses.as_slice()),
    }
}

#[derive(Serialize)]
struct MemberJson<'a> {
    id: &'a str,
    /// Name of the governing location, whose results are the member's fields.
    governing: &'a str,
    pass: bool,
    /// "pass", "conditional" (every check met, on the open conditions listed) or "fail".
    status: Status,
    /// The open conditions of every location, each with the location's name.
    conditions: Vec<NamedCondition<'a>>,
    #[serde(flatten)]
    top: LocationJson<'a>,
    locations: Vec<LocationJson<'a>>,
    /// Members with loads: every station along the span, in order of x.
    #[serde(skip_serializing_if = "Vec::is_empty")]
    stations: Vec<StationJson<'a>>,
    /// Each strand layer's prestress: its source, fpj, losses, fse and fpi.
    prestress: &'a [crate::analysis::LayerPrestress],
    /// The loss computation, where a layer's losses are computed.
    #[serde(skip_serializing_if = "Option::is_none")]
    losses: Option<&'a crate::analysis::losses::Losses>,
    /// Members with loads: the class, the stress limits, the reinforcement at release,
    /// and whether every stress is within its limit.
    #[serde(skip_serializing_if = "Option::is_none")]
    stresses: Option<&'a crate::analysis::stresses::MemberStresses>,
    /// Members whose release stresses are checked: camber at release, erection and
    /// final, and the live-load deflection against its limit.
    #[serde(skip_serializing_if = "Option::is_none")]
    camber: Option<&'a crate::analysis::camber::Camber>,
    /// The class U, T or C (members with loads), and the live-load deflection against its
    /// limit (where the camber is computed): the same as in `stresses` and `camber`.
    #[serde(skip_serializing_if = "Option::is_none")]
    class: Option<&'static str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    deflection: Option<&'a crate::analysis::camber::LiveDeflection>,
}

#[derive(Serialize)]
struct StationJson<'a> {
    x: f64,
    what: &'a [String],
    mu: f64,
    mnc: f64,
    combination: &'a str,
    phi: f64,
    phi_mn: f64,
    ratio: f64,
    mcr: f64,
    min_reinforcement_ok: bool,
    status: Status,
    #[serde(skip_serializing_if = "Option::is_none")]
    end_region: Option<crate::input::model::End>,
    /// The name of its full derivation among `locations`, where it has one.
    #[serde(skip_serializing_if = "Option::is_none")]
    derived_as: Option<&'a str>,
    /// The x of the station this one mirrors: its derivation is that one's.
    #[serde(skip_serializing_if = "Option::is_none")]
    mirror_of: Option<f64>,
    /// The stresses at release (where checked), under sustained and under all service
    /// loads.
    stresses: &'a [crate::analysis::stresses::StageStress],
}

fn station_json<'a>(m: &'a MemberResult, s: &'a crate::analysis::StationRow) -> StationJson<'a> {
    StationJson {
        x: s.x,
        what: &s.what,
        mu: s.mu,
        mnc: s.mnc,
        combination: &s.combination,
        phi: s.phi,
        phi_mn: s.phi_mn,
        ratio: s.ratio,
        mcr: s.mcr,
        min_reinforcement_ok: s.min_ok,
        status: s.status,
        end_region: s.end_region,
        derived_as: s.derived.and_then(|i| m.locations.get(i)).map(|l| l.name.as_str()),
        mirror_of: s.mirror_of,
        stresses: &s.stresses,
    }
}

/// `check --json`, the whole document: the contract of the design document.
#[derive(Serialize)]
pub struct CheckDocument<'a> {
    format: u32,
    units: crate::units::UnitNames,
    pass: bool,
    status: Status,
    members: Vec<MemberJson<'a>>,
    warnings: &'a [crate::input::model::Warning],
}

pub fn check_document<'a>(pkg: &'a Package, a: &'a Analysis) -> CheckDocument<'a> {
    CheckDocument {
        format: 1,
        units: pkg.units.names(),
        pass: a.pass(),
        status: a.status(),
        members: a.members.iter().map(member_json).collect(),
        warnings: &pkg.warnings,
    }
}

#[derive(Serialize)]
struct NamedCondition<'a> {
    location: &'a str,
    #[serde(flatten)]
    condition: &'a Condition,
}

fn member_json(m: &MemberResult) -> MemberJson<'_> {
    MemberJson {
        id: &m.id,
        governing: &m.governing().name,
        pass: m.pass,
        status: m.status,
        conditions: m
            .locations
            .iter()
            .flat_map(|l| l.conditions.iter().map(|c| NamedCondition { location: &l.name, condition: c }))
            .chain(m.conditions.iter().map(|c| NamedCondition { location: "member", condition: c }))
            .collect(),
        top: location_json(m.governing(), true),
        locations: m.locations.iter().map(|l| location_json(l, false)).collect(),
        stations: m.stations.iter().map(|s| station_json(m, s)).collect(),
        prestress: &m.prestress,
        losses: m.losses.as_ref(),
        stresses: m.stresses.as_ref(),
        camber: m.camber.as_ref(),
        class: m.stresses.as_ref().map(|s| s.class.letter()),
        deflection: m.deflection.as_ref(),
    }
}

/// Appends one member as `check --json` writes it in its `members` array.
pub fn write_member_json(out: &mut Vec<u8>, m: &MemberResult) {
    // writing to memory cannot fail for these types
    let _ = serde_json::to_writer(&mut *out, &member_json(m));
}

/// Writes `check --json` from members already written (by [`write_member_json`],
/// comma-separated, in pieces in input order): the same bytes as serialising
/// [`check_document`].
pub fn write_check_json(
    w: &mut dyn std::io::Write,
    pkg: &Package,
    status: Status,
    pieces: &[Vec<u8>],
) -> std::io::Result<()> {
    w.write_all(b"{\"format\":1,\"units\":")?;
    serde_json::to_writer(&mut *w, &pkg.units.names())?;
    w.write_all(if status == Status::Fail { b",\"pass\":false,\"status\":" } else { b",\"pass\":true,\"status\":" })?;
    serde_json::to_writer(&mut *w, &status)?;
    w.write_all(b",\"members\":[")?;
    for (i, p) in pieces.iter().enumerate() {
        if i > 0 {
            w.write_all(b",")?;
        }
        w.write_all(p)?;
    }
    w.write_all(b"],\"warnings\":")?;
    serde_json::to_writer(&mut *w, &pkg.warnings)?;
    w.write_all(b"}")
}

/// `check`: one row per location, the members' stresses, the open conditions, the
/// warnings and the totals.
pub fn check_table(pkg: &Package, a: &Analysis) -> String {
    let u = pkg.units.names();
    // the open conditions, numbered as the table refers to them
    let mut open: Vec<String> = Vec::new();
    let rows = strength_rows(a, &u, &mut open);
    let mut out = format!("{} — {} ({} units)\n", pkg.meta.title, pkg.meta.project, pkg.units.label());
    out.push_str(&text_table(&rows, &|c| c < 2 || c == 5 || c == 8 || c == 14));
    out.push_str(&stress_table(a, &u, &mut open));
    if !open.is_empty() {
        out.push_str("Open conditions (the result holds only once each is settled):\n");
        for (k, text) in open.iter().enumerate() {
            out.push_str(&format!("  [{}] {text}\n", k + 1));
        }
    }
    for w in &pkg.warnings {
        out.push_str(&format!("warning: {}: {}: {}\n", w.at, w.key, w.message));
    }
    out.push_str(&totals(a));
    out
}

/// The strength table: its head and a row per location; the open conditions its rows
/// refer to are added to `open`.
fn strength_rows(a: &Analysis, u: &crate::units::UnitNames, open: &mut Vec<String>) -> Vec<Vec<String>> {
    let mut rows: Vec<Vec<String>> = vec![vec![
        "member".into(),
        "location".into(),
        format!("x ({})", u.length),
        format!("c ({})", u.length),
        format!("a ({})", u.length),
        "zone".into(),
        format!("fps ({})", u.stress),
        "eps_t (x10^-3)".into(),
        "control".into(),
        "phi".into(),
        format!("phi Mn ({})", u.moment),
        format!("Mu ({})", u.moment),
        "Mu/phi Mn".into(),
        "1.2 Mcr".into(),
        "result".into(),
    ]];
    for m in &a.members {
        for l in &m.locations {
            let fps = l
                .strands
                .iter()
                .filter(|s| s.active)
                .max_by(|x, y| x.depth.total_cmp(&y.depth))
                .map(|s| show(s.stress))
                .unwrap_or_else(|| "-".into());
            let minr = if l.min_reinforcement.ok {
                "ok"
            } else if l.min_reinforcement.waiver_flexure {
                "waived"
            } else {
                "NOT MET"
            };
            rows.push(vec![
                m.id.clone(),
                l.name.clone(),
                l.x.map(show).unwrap_or_else(|| "-".into()),
                show(l.c),
                crate::trace::show_like(l.a, l.c),
                l.zone.into(),
                fps,
                crate::trace::scaled(l.eps_t, crate::trace::Unit::Strain),
                l.control.into(),
                format!("{:.3}", l.phi),
                show(l.phi_mn),
                show(l.mu),
                crate::trace::ratio_text(l.ratio),
                minr.into(),
                match l.status {
                    Status::Conditional => format!("conditional [{}]", notes_of(open, m, l)),
                    st => st.word().into(),
                },
            ]);
        }
    }
    rows
}

/// The closing lines of `check`: how many locations and members pass, fail or hold on
/// open conditions.
fn totals(a: &Analysis) -> String {
    let mut out = String::new();
    let (mut n, mut failed, mut cond) = (0, 0, 0);
    for l in a.members.iter().flat_map(|m| &m.locations) {
        n += 1;
        match l.status {
            Status::Fail => failed += 1,
            Status::Conditional => cond += 1,
            Status::Pass => {}
        }
    }
    if failed > 0 {
        out.push_str(&format!("Strength: {failed} of {n} check locations FAIL.\n"));
    } else if cond > 0 {
        out.push_str(&format!(
            "Strength: all {n} check locations of {} members meet the checks made here, {cond} of them only on the open conditions above.\n",
            a.members.len()
        ));
    } else {
        out.push_str(&format!("Strength: all {n} check locations of {} members pass.\n", a.members.len()));
    }
    let checked: Vec<&MemberResult> = a.members.iter().filter(|m| m.stresses.is_some()).collect();
    let s_failed = checked
        .iter()
        .filter(|m| m.stresses.as_ref().is_some_and(|s| !s.pass) || m.deflection.as_ref().is_some_and(|l| !l.ok))
        .count();
    let s_cond = checked.iter().filter(|m| !m.conditions.is_empty()).count();
    let k = checked.len();
    if s_failed > 0 {
        out.push_str(&format!("Stresses and deflection: {s_failed} of {} with loads FAIL.\n", members(k)));
    } else if s_cond > 0 {
        out.push_str(&format!(
            "Stresses and deflection: every one of {} with loads meets its limits, {s_cond} only on the open conditions above.\n",
            members(k)
        ));
    } else if k > 0 {
        out.push_str(&format!("Stresses and deflection: every one of {} with loads meets its limits.\n", members(k)));
    }
    if k < a.members.len() {
        out.push_str(&format!(
            "Stresses not checked: {} without loads (moments given by hand).\n",
            members(a.members.len() - k)
        ));
    }
    out
}

/// "1 member", "3 members".
fn members(n: usize) -> String {
    if n == 1 { "1 member".into() } else { format!("{n} members") }
}

/// The members' stresses, one row each (members with loads): the class, the service
/// tension, the worst stress against its limit at release and in service, the
/// reinforcement at release; member conditions join the numbered list.
fn stress_table(a: &Analysis, u: &crate::units::UnitNames, open: &mut Vec<String>) -> String {
    let mut rows: Vec<Vec<String>> = vec![vec![
        "member".into(),
        "class".into(),
        format!("ft ({})", u.stress),
        "release: worst stress/limit".into(),
        "service: worst stress/limit".into(),
        format!("reinforcement at release ({}²)", u.length),
        format!("camber at release / final ({})", u.length),
        format!("live deflection ({})", u.length),
        "result".into(),
    ]];
    let at = |w: Option<(f64, f64)>| match w {
        Some((r, x)) => format!("{} at x = {}", crate::trace::ratio_text(r), show(x)),
        None => "-".into(),
    };
    for m in &a.members {
        let Some(s) = &m.stresses else { continue };
        let release = match (s.release.checked, s.reinforcement.is_empty()) {
            (false, _) => "not checked".into(),
            (true, true) => at(s.worst_release),
            (true, false) => format!("{} (tension reinforced)", at(s.worst_release)),
        };
        // the station nearest to short (the largest required over provided)
        let steel =
            s.reinforcement.iter().fold(None, |a: Option<&crate::analysis::stresses::Reinforcement>, r| match a {
                Some(a) if a.area * r.provided.max(1e-300) >= r.area * a.provided.max(1e-300) => Some(a),
                _ => Some(r),
            });
        let deflection_ok = m.deflection.as_ref().is_none_or(|l| l.ok);
        let ok = s.pass && deflection_ok;
        let mut result = if ok { "pass".to_string() } else { "FAIL".to_string() };
        let camber = match &m.camber {
            None => "not computed (no release stage)".to_string(),
            Some(c) => format!("{} / {}", show(c.release), show(c.final_camber)),
        };
        let live = m.deflection.as_ref().map_or_else(|| "-".to_string(), |d| d.short(s.class.letter(), "<=", show));
        if ok && !m.conditions.is_empty() {
            let mut refs = Vec::new();
            for c in &m.conditions {
                open.push(format!("{}: {}", m.id, c.text));
                refs.push(open.len().to_string());
            }
            result = format!("conditional [{}]", refs.join(","));
        }
        rows.push(vec![
            m.id.clone(),
            s.class.letter().into(),
            show(s.ft),
            release,
            at(Some(s.worst_service)),
            steel.map_or_else(
                || "-".into(),
                |r| format!("{} req / {} prov{}", show(r.area), show(r.provided), if r.ok { "" } else { " SHORT" }),
            ),
            camber,
            live,
            result,
        ]);
    }
    if rows.len() == 1 {
        return String::new();
    }
    let mut out = "\nStresses at release and in service (tension positive; the worst stress against its limit along the member), camber (upward) and the live-load deflection at mid-length:\n".to_string();
    out.push_str(&text_table(&rows, &|_| true));
    out
}

/// Rows of cells as plain-text columns two spaces apart, a rule under the first (the
/// header); `left(c)` says which columns align left (the others right).
fn text_table(rows: &[Vec<String>], left: &dyn Fn(usize) -> bool) -> String {
    let widths: Vec<usize> = (0..rows.first().map_or(0, Vec::len))
        .map(|c| rows.iter().map(|r| r[c].chars().count()).max().unwrap_or(0))
        .collect();
    let mut out = String::new();
    for (i, r) in rows.iter().enumerate() {
        let line: Vec<String> = (r.iter().enumerate())
            .map(
                |(c, cell)| {
                    if left(c) { format!("{cell:<w$}", w = widths[c]) } else { format!("{cell:>w$}", w = widths[c]) }
                },
            )
            .collect();
        out.push_str(line.join("  ").trim_end());
        out.push('\n');
        if i == 0 {
            out.push_str(&"-".repeat(widths.iter().sum::<usize>() + 2 * widths.len().saturating_sub(1)));
            out.push('\n');
        }
    }
    out
}

/// Adds a location's open conditions to the numbered list; their numbers, joined.
fn notes_of(open: &mut Vec<String>, m: &MemberResult, l: &LocationResult) -> String {
    let mut refs = Vec::new();
    for c in &l.conditions {
        open.push(format!("{} at {}: {}", m.id, l.name, c.text));
        refs.push(open.len().to_string());
    }
    refs.join(",")
}

/// Every step of the selected members, as readable text.
pub fn trace_text(pkg: &Package, members: &[&MemberResult]) -> String {
    let mut out = String::new();
    for m in members {
        out.push_str(&format!("== member {}\n", m.id));
        let write = |out: &mut String, st: &Step| {
            out.push_str(&format!("[{}] {}\n    {}", st.id, st.title, st.plain_line(pkg.units)));
            if let Some(c) = &st.clause {
                out.push_str(&format!("    ({c})"));
            }
            out.push('\n');
            if let Some(n) = &st.note {
                out.push_str(&format!("    note: {n}\n"));
            }
        };
        for st in &m.trace {
            write(&mut out, st);
        }
        for l in &m.locations {
            out.push_str(&format!(
                "-- location {} ({})\n",
                l.name,
                l.x.map(|x| format!("x = {}", show(x))).unwrap_or_else(|| "no x".into())
            ));
            out.push_str("   iteration log: k, method, c, a, eps (extreme), f (extreme), C, T, C - T\n");
            for t in &l.iterations {
                out.push_str(&format!(
                    "   {:>3} {:<17} {:>12.6} {:>12.6} {:>10.6} {:>10.3} {:>12.4} {:>12.4} {:>12.3e}\n",
                    t.k, t.method, t.c, t.a, t.eps, t.stress, t.cc, t.t, t.residual
                ));
            }
            for st in &l.trace {
                write(&mut out, st);
            }
            out.push_str(&format!("=> {}\n", l.conclusion));
        }
    }
    out
}

/// The steps of one member as JSON values (each step with its printed formula).
pub fn trace_json_steps(pkg: &Package, m: &MemberResult) -> Vec<Value> {
    let step = |st: &Step, member: &str, location: Option<&str>| {
        let printed = st.printed(Style::Plain);
        json!({
            "member": member,
            "location": location,
            "id": st.id,
            "group": st.group,
            "title": st.title,
            "symbol": st.symbol.plain,
            "formula": st.formula,
            "formula_text": printed.as_ref().map(|p| &p.0),
            "substituted": printed.as_ref().map(|p| &p.1),
            "inputs": st.inputs.iter().map(|i| json!({"symbol": i.symbol.plain, "value": i.value, "unit": i.unit.name(pkg.units)})).collect::<Vec<_>>(),
            "value": st.value,
            "unit": st.unit.name(pkg.units),
            "clause": st.clause,
            "note": st.note,
        })
    };
    let mut steps = Vec::new();
    for st in &m.trace {
        steps.push(step(st, &m.id, None));
    }
    for l in &m.locations {
        for st in &l.trace {
            steps.push(step(st, &m.id, Some(&l.name)));
        }
    }
    steps
}

/// The steps of the selected members as JSON.
pub fn trace_json(pkg: &Package, members: &[&MemberResult]) -> Value {
    let steps: Vec<Value> = members.iter().flat_map(|m| trace_json_steps(pkg, m)).collect();
    json!({"format": 1, "units": pkg.units.names(), "steps": steps})
}

/// The CSV header line of [`trace_csv`].
pub const TRACE_CSV_HEAD: &str = "member,location,id,title,symbol,formula,substituted,value,unit,clause\n";

fn csv_field(s: &str) -> String {
    if s.contains([',', '"', '\n']) { format!("\"{}\"", s.replace('"', "\"\"")) } else { s.to_string() }
}

/// The steps as CSV: member, location, id, title, symbol, formula, substituted, value,
/// unit, clause.
pub fn trace_csv(pkg: &Package, members: &[&MemberResult]) -> String {
    let mut out = String::from(TRACE_CSV_HEAD);
    out.push_str(&trace_csv_rows(pkg, members));
    out
}

/// The rows of [`trace_csv`], without its header.
pub fn trace_csv_rows(pkg: &Package, members: &[&MemberResult]) -> String {
    let mut out = String::new();
    let mut row = |m: &str, l: &str, st: &Step| {
        let (f, s) = st.printed(Style::Plain).unwrap_or_default();
        let cells = [
            m,
            l,
            &st.id,
            &st.title,
            &st.symbol.plain,
            &f,
            &s,
            &format!("{}", st.value),
            st.unit.name(pkg.units),
            st.clause.as_deref().unwrap_or(""),
        ];
        out.push_str(&cells.iter().map(|c| csv_field(c)).collect::<Vec<_>>().join(","));
        out.push('\n');
    };
    for m in members {
        for st in &m.trace {
            row(&m.id, "", st);
        }
        for l in &m.locations {
            for st in &l.trace {
                row(&m.id, &l.name, st);
            }
        }
    }
    out
}

/// `curve --format json`.
pub fn curve_json(pkg: &Package, c: &crate::analysis::curve::CurveResult, l: &LocationResult) -> Value {
    let u = pkg.units.names();
    json!({
        "member": c.member,
        "location": c.location,
        "units": {"curvature": format!("1/{}", u.length), "moment": u.moment, "length": u.length, "neutral_axis": format!("{} below the top", u.length), "strain": "1 (tension positive)"},
        "points": c.points,
        "cracking_moment": c.cracking.map(|m| m.moment),
        "yield_moment": c.yielding.map(|m| m.moment),
        "peak_moment": c.peak.moment,
        "ductility": c.ductility,
        "ended_by": c.ended_by,
        "cracking": c.cracking,
        "yield": c.yielding,
        "peak": c.peak,
        "ultimate": c.ultimate,
        "concrete_model": c.concrete_model,
        "strips": c.strips,
        "notes": c.notes,
        "stress_block": {"mn": l.mn, "phi_mn": l.phi_mn, "mu": l.mu, "mcr": l.mcr},
    })
}

/// `curve --format csv`: one row per point; the header names each column's unit.
pub fn curve_csv(pkg: &Package, c: &crate::analysis::curve::CurveResult) -> String {
    let u = pkg.units.names();
    let mut out = format!(
        "curvature (1/{len}),moment ({mom}),top_strain,neutral_axis ({len} below the top),strand_strain\n",
        len = u.length,
        mom = u.moment
    );
    for p in &c.points {
        out.push_str(&format!(
            "{},{},{},{},{}\n",
            p.curvature, p.moment, p.top_strain, p.neutral_axis, p.strand_strain
        ));
    }
    out
}
