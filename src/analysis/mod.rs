//! The engine: from a validated member to its flexural strength at every check
//! location, computed by strain compatibility, with every step recorded. Each stage is a
//! file of its own, in the order a hand calculation goes:
//!
//! - `prepare`: materials and section properties, once per member;
//! - `demand`: the moments along the span from the member's loads, factored by the
//!   basis's combinations (members with loads);
//! - `station`: the sections checked: the named locations and the stations along the
//!   span;
//! - `prestress`: at a location, each strand layer's place, bond and prestress;
//! - `strength`: the strain-compatibility solution (development limits included), Mn;
//! - `checks`: phi, phi Mn against Mu, the cracking moment and minimum strength, the
//!   approximate strand stress for comparison;
//! - `conclusion`: the status, the open conditions and the words;
//! - `location`: one check location through the stages above.
//!
//! Everything a code decides is asked of the design basis (`crate::basis`).

pub mod camber;
pub mod checks;
pub mod conclusion;
pub mod cracked;
pub mod curve;
pub mod demand;
mod location;
pub mod losses;
mod prepare;
mod prestress;
pub mod results;
pub mod roots;
pub mod solve;
pub mod station;
mod strength;
pub mod stresses;

pub use results::*;
pub use strength::moment_of;

use crate::basis::Basis;
use crate::error::Result;
use crate::input::model::{Kind, Member, Package};
use crate::trace::{Step, Symbol, Trace, Unit};
use crate::units::System;
use prepare::prepare;
use rayon::prelude::*;

/// Unit-conversion divisors between coherent products and shown units.
#[derive(Debug, Clone, Copy)]
pub struct Conv {
    pub sys: System,
    /// coherent force -> shown force
    pub kf: f64,
    /// coherent moment -> shown moment
    pub km: f64,
    /// stress x area / f_div = shown force
    pub f_div: f64,
    /// shown force x length / m_div = shown moment
    pub m_div: f64,
    /// stress x length³ / s_div = shown moment
    pub s_div: f64,
}

impl Conv {
    pub fn new(sys: System) -> Conv {
        let kf = sys.force_shown();
        let km = sys.moment_shown();
        Conv { sys, kf, km, f_div: 1.0 / kf, m_div: kf / km, s_div: 1.0 / km }
    }
}

/// Analyses every member (in parallel; the result keeps the input order).
pub fn analyze(pkg: &Package, trace: bool) -> Result<Analysis> {
    let results: Vec<Result<MemberResult>> =
        pkg.members.par_iter().map(|m| analyze_member(m, pkg.basis(), trace)).collect();
    // the first error in input order, whichever thread met it first
    let members = results.into_iter().collect::<Result<Vec<_>>>()?;
    Ok(Analysis { units: pkg.units, members })
}

/// Everything the package shows: the traced analysis and each member's
/// moment-curvature response at its governing location.
pub fn analyze_full(pkg: &Package) -> Result<Analysis> {
    let mut a = analyze(pkg, true)?;
    a.members.par_iter_mut().zip(pkg.members.par_iter()).for_each(|(r, m)| {
        let curve = curve::moment_curvature(r.member(m), pkg.basis(), &r.sites[r.governing], r.governing);
        match curve {
            Ok(c) => r.curve = Some(c),
            Err(e) => r.curve_error = Some(e.to_string()),
        }
    });
    Ok(a)
}

/// What a unit conversion in a formula does, in words ("/ 12: kip-in to kip-ft").
fn conversion_words(sys: System, divisor: f64, result: Unit) -> String {
    let same = |a: f64, b: f64| (a - b).abs() <= 1e-12 * b.abs();
    match sys {
        System::Us if same(divisor, 144e3) && result == Unit::LineLoad => "/ 144 000: pcf × in² to klf".into(),
        System::Us if same(divisor, 12e3) && result == Unit::LineLoad => "/ 12 000: psf × in to klf".into(),
        System::Us if same(divisor, 144.0) && result == Unit::Moment => "/ 144: klf × in² to kip-ft".into(),
        System::Si if same(divisor, 1e9) && result == Unit::LineLoad => "/ 10⁹: kg/m³ × m/s² × mm² to kN/m".into(),
        System::Si if same(divisor, 1e3) && result == Unit::LineLoad => "/ 1000: kPa × mm to kN/m".into(),
        System::Us if same(divisor, 12.0) => "/ 12: kip-in to kip-ft".into(),
        System::Us if same(divisor, 1.0 / 12.0) => "× 12: kip-ft to kip-in".into(),
        System::Us if same(divisor, 1000.0) && result == Unit::Stress => "/ 1000: psi to ksi".into(),
        System::Si if same(divisor, 1000.0) && result == Unit::Moment => "/ 1000: kN-mm to kN-m".into(),
        System::Si if same(divisor, 1000.0) => "/ 1000: N to kN".into(),
        System::Si if same(divisor, 0.001) => "× 1000: kN to N".into(),
        System::Si if same(divisor, 1e6) => "/ 10⁶: N-mm to kN-m".into(),
        _ => format!("/ {}: a unit conversion", crate::trace::show(divisor)),
    }
}

/// Each unit conversion in a step's formula is named in the step's note.
fn name_conversions(sys: System, steps: &mut [Step]) {
    for st in steps.iter_mut() {
        let convs = st.formula.as_ref().map(|f| f.conversions()).unwrap_or_default();
        if !convs.is_empty() {
            let words: Vec<String> = convs.iter().map(|d| conversion_words(sys, *d, st.unit)).collect();
            let words = format!("units: {}", words.join("; "));
            st.note = Some(match st.note.take() {
                Some(n) => format!("{n} ({words})"),
                None => words,
            });
        }
    }
}

// ---- symbols ---------------------------------------------------------------------

fn sy(math: &'static str, plain: &'static str) -> Symbol {
    Symbol::new(math, plain)
}
/// A symbol with a layer's number ("fse,2").
fn sym_k(base: &'static str, sub: &'static str, plain: &'static str, k: usize) -> Symbol {
    Symbol::indexed(base, sub, plain, k)
}

/// One member under a design basis: its section once, its demand from its loads, then
/// each station along the span (a table row) and each section derived in full (the
/// named locations, the governing station and the critical station of each end region).
pub fn analyze_member(m: &Member, basis: &'static dyn Basis, trace: bool) -> Result<MemberResult> {
    let (first, decided) = member_with(m, basis, trace, None)?;
    // a guard: the search that decided the development of debonded strand (exact on the
    // pieces between the member's breaks) found no service tension at the bottom, but
    // the stations or the scan between them do: the design has tension in the
    // precompressed tensile zone after all, and the member is analysed again with it
    let found = first.stresses.as_ref().map(|s| (s.ft, s.ft_x));
    match (decided, found) {
        (Some((scan, _)), Some((ft, x)))
            if scan <= 0.0 && ft > 0.0 && m.strands.iter().any(|s| s.debonded_length > 0.0) =>
        {
            Ok(member_with(m, basis, trace, Some((ft, x)))?.0)
        }
        _ => Ok(first),
    }
}

/// The member prepared and its demand (members with loads), with the service tension
/// that decides the development of debonded strand: `tension` where given, else found
/// by a scan of the service stresses (`None` without loads: doubled).
fn prepare_with_demand<'a>(
    m: &'a Member,
    basis: &'static dyn Basis,
    tr: &mut Trace,
    tension: Option<(f64, f64)>,
) -> Result<(prepare::Prepared<'a>, Option<demand::Demand>)> {
    let mut p = prepare(m, basis, tr)?;
    let demand = demand::of_member(&p, m, tr);
    p.service_tension = demand.as_ref().map(|d| tension.unwrap_or_else(|| stresses::service_tension(&p, d)));
    Ok((p, demand))
}

/// One member, with the service tension that decides the development of debonded strand
/// given (`tension`) or found by a scan; the result and that tension.
fn member_with(
    m: &Member,
    basis: &'static dyn Basis,
    trace: bool,
    tension: Option<(f64, f64)>,
) -> Result<(MemberResult, Option<(f64, f64)>)> {
    // computed losses first: they fill in the fse of their layers, which everything
    // after them reads (the member with those filled in is the one analysed)
    let mut lt = Trace::new(trace);
    let computed = with_losses(m, basis, &mut lt)?;
    let (m, losses) = match &computed {
        Some((effective, l)) => (effective, Some(l.clone())),
        None => (m, None),
    };
    let sys = basis.units();
    let mut tr = Trace::new(trace);
    let (p, demand) = prepare_with_demand(m, basis, &mut tr, tension)?;
    tr.steps.append(&mut lt.steps);
    prestress::record_member(&p, &mut tr);
    let mut sites = sites_of(m, demand.as_ref())?;
    // where the stresses are checked along the member, they settle what the prestress
    // alone leaves open at a section
    let stresses_checked = demand.is_some() && stresses::release_checked(&p);
    let mut ends = curve::CurveEnds::new(&p);
    let mut stations = match &demand {
        Some(d) => along_span(&p, d, &mut sites, &mut ends)?,
        None => Vec::new(),
    };
    let mut locations = derive_locations(&p, demand.as_ref(), &sites, &mut ends, trace, stresses_checked)?;
    let named = m.locations.len();
    let stresses = demand.as_ref().map(|d| stresses_along(&p, d, &mut stations, &mut locations[..named], &mut tr));
    let conditions = stresses.as_ref().map_or_else(Vec::new, |s| stress_conditions(s, sys));
    let camber = match (&demand, &stresses) {
        (Some(d), Some(s)) if s.release.checked => camber::of_member(&p, d, &mut tr),
        _ => None,
    };
    let deflection = match (&demand, &stresses) {
        (Some(d), Some(s)) => Some(camber::live_deflection(&p, d, s.class, &mut tr)),
        _ => None,
    };
    let mut conditions = conditions;
    if let Some(why) =
        deflection.as_ref().filter(|l| l.live.is_none() && l.limit.is_some()).and_then(|l| l.why_not.clone())
    {
        conditions.push(conclusion::Condition {
            kind: conclusion::ConditionKind::DeflectionNotComputed,
            short: "live-load deflection not computed".into(),
            text: format!("The live-load deflection limit of the input is not checked: {why}."),
        });
    }
    let (governing, pass, status) = verdict(&locations, &stations, stresses.as_ref(), deflection.as_ref(), &conditions);
    let section = section_result(m, &p);
    let mut steps = tr.steps;
    name_conversions(sys, &mut steps);
    let decided = p.service_tension;
    Ok((
        MemberResult {
            id: m.id.clone(),
            section,
            locations,
            governing,
            pass,
            status,
            trace: steps,
            curve: None,
            curve_error: None,
            demand,
            stations,
            sites,
            prestress: prestress_of(m, losses.as_ref()),
            losses,
            member: computed.map(|(effective, _)| Box::new(effective)),
            stresses,
            conditions,
            camber,
            deflection,
        },
        decided,
    ))
}

/// The member's named locations as sections, with their moments (given, or from the
/// demand at their x).
fn sites_of(m: &Member, demand: Option<&demand::Demand>) -> Result<Vec<station::Station>> {
    let mut sites = Vec::with_capacity(m.locations.len() + 3);
    for l in &m.locations {
        let site = station::Station::of_location(l, demand).ok_or_else(|| crate::error::Error::Analysis {
            member: m.id.clone(),
            location: l.name.clone(),
            message: "no moment is given here and the member has no loads to derive it from".into(),
        })?;
        sites.push(site);
    }
    Ok(sites)
}

/// Each section derived in full (a named location, the governing station, the critical
/// station of each end region): its strength, its demand's steps first where the
/// member has loads, and strand rupture settled by its curve's end.
fn derive_locations(
    p: &prepare::Prepared,
    demand: Option<&demand::Demand>,
    sites: &[station::Station],
    ends: &mut curve::CurveEnds,
    trace: bool,
    stresses_checked: bool,
) -> Result<Vec<LocationResult>> {
    let sys = p.sys;
    let mut locations = Vec::with_capacity(sites.len());
    for (li, site) in sites.iter().enumerate() {
        let mut r = location::location(p, li, site, trace)?;
        if let (Some(d), Some(at)) = (demand, &site.moments) {
            // the demand's steps first: where the moments come from
            let mut dt = Trace::new(trace);
            demand::record_at(d, p, &format!("L{}", li + 1), at, &mut dt);
            let mut steps = dt.steps;
            name_conversions(sys, &mut steps);
            steps.append(&mut r.trace);
            r.trace = steps;
            r.demand_from_loads = d.combinations.get(at.combination).map(|c| c.name.clone());
        }
        settle_with_curve(ends, site, li, &mut r, stresses_checked);
        locations.push(r);
    }
    Ok(locations)
}

/// The section's properties and outline as the results give them.
fn section_result(m: &Member, p: &prepare::Prepared) -> SectionResult {
    let geometry = Geometry {
        outline: m.region.outline.clone(),
        holes: m.region.holes.clone(),
        topping: p.topping_region.as_ref().map(|r| [r.x_min(), r.y_bot(), r.x_max(), r.y_top()]),
        x_min: p.topping_region.as_ref().map_or(m.region.x_min(), |r| r.x_min().min(m.region.x_min())),
        x_max: p.topping_region.as_ref().map_or(m.region.x_max(), |r| r.x_max().max(m.region.x_max())),
        y_min: m.region.y_bot(),
        y_max: p.top,
    };
    SectionResult {
        shape: m.shape.name(),
        precast_height: m.precast_height(),
        height: m.total_height(),
        precast: PropsOut::of(&p.precast),
        composite: p.composite.as_ref().map(PropsOut::of),
        modular_ratio: p.n,
        ec: m.concrete.ec,
        fr: m.concrete.fr,
        ec_topping: m.topping.as_ref().map(|t| t.concrete.ec),
        beta1: p.beta1,
        geometry,
        asymmetric: prepare::asymmetric(&m.region),
    }
}

/// The member's governing location (highest Mu / phi Mn), whether every check is met,
/// and its status (conditional where an open condition remains).
fn verdict(
    locations: &[LocationResult],
    stations: &[StationRow],
    stresses: Option<&stresses::MemberStresses>,
    deflection: Option<&camber::LiveDeflection>,
    conditions: &[conclusion::Condition],
) -> (usize, bool, conclusion::Status) {
    let governing =
        locations.iter().enumerate().max_by(|a, b| a.1.ratio.total_cmp(&b.1.ratio)).map(|(i, _)| i).unwrap_or(0);
    let pass = locations.iter().all(|l| l.pass)
        && stations.iter().all(|s| s.pass)
        && stresses.is_none_or(|s| s.pass)
        && deflection.is_none_or(|l| l.ok);
    let status = locations
        .iter()
        .map(|l| l.status)
        .chain(stations.iter().map(|s| s.status))
        .chain(conditions.iter().map(|_| conclusion::Status::Conditional))
        .chain((!pass).then_some(conclusion::Status::Fail))
        .fold(conclusion::Status::Pass, |s, l| s.and(l));
    (governing, pass, status)
}

/// The stresses at every station (each row gets its stages), the derivation at the
/// station governing each stage recorded in the member's trace, and the member's
/// summary (with a class C member's crack control).
fn stresses_along(
    p: &prepare::Prepared,
    d: &demand::Demand,
    rows: &mut [StationRow],
    named: &mut [LocationResult],
    tr: &mut Trace,
) -> stresses::MemberStresses {
    // the stations, then the named locations that lie on the member
    let len = d.length;
    let on: Vec<usize> = (0..named.len()).filter(|&i| named[i].x.is_some_and(|x| x > 0.0 && x < len)).collect();
    let mut xs: Vec<f64> = rows.iter().map(|r| r.x).collect();
    xs.extend(on.iter().filter_map(|&i| named[i].x));
    // then the points between them where a fine scan finds a stage, or the class's bottom
    // tension, beyond what the stations and locations show
    let between = stresses::between(p, d, &xs);
    let n = xs.len();
    xs.extend(between.iter().map(|b| b.0));
    let (mut summary, mut per_x) = stresses::of_member(p, d, &xs, tr);
    let at_between = per_x.split_off(n);
    let at_named = per_x.split_off(rows.len());
    for (row, st) in rows.iter_mut().zip(per_x) {
        row.stresses = st;
    }
    for (&i, st) in on.iter().zip(at_named) {
        named[i].stresses = st;
    }
    summary.between = (between.into_iter().zip(at_between))
        .map(|((x, why), stresses)| stresses::Between { x, why, stresses })
        .collect();
    let all: Vec<(f64, &Vec<stresses::StageStress>)> = (rows.iter().map(|r| (r.x, &r.stresses)))
        .chain(on.iter().filter_map(|&i| named[i].x.map(|x| (x, &named[i].stresses))))
        .chain(summary.between.iter().map(|b| (b.x, &b.stresses)))
        .collect();
    for stage in ["release", "sustained", "service"] {
        // the first of equals, as the member's summary names it
        let worst = stresses::first_largest(
            (all.iter()).filter_map(|(x, st)| st.iter().find(|s| s.stage == stage).map(|s| (s.worst(), (*x, s)))),
        )
        .map(|(_, at)| at);
        if let Some((x, s)) = worst {
            stresses::record_station(p, d, x, s, tr);
        }
    }
    // a class C member's crack control on the cracked section, where its bottom
    // tension is largest
    if summary.class == stresses::Class::C {
        let c = cracked::crack_check(p, d, summary.ft_x, tr);
        summary.pass &= !c.fails();
        summary.crack_control = Some(c);
    }
    summary
}

/// The member's open conditions from its stresses: class C, and release not checked.
fn stress_conditions(s: &stresses::MemberStresses, sys: System) -> Vec<conclusion::Condition> {
    use conclusion::{Condition, ConditionKind};
    let mut out = Vec::new();
    let names = sys.names();
    let class_c = |what: String| Condition {
        kind: ConditionKind::ClassC,
        short: format!("class C: ft = {} {}", crate::trace::show(s.ft), names.stress),
        text: format!(
            "The largest service tension at the bottom, {} {} at x = {} {}, exceeds the class T bound {} {}: the member is class C. {what}",
            crate::trace::show(s.ft),
            names.stress,
            crate::trace::show(s.ft_x),
            names.length,
            crate::trace::show(s.ft_t),
            names.stress
        ),
    };
    match &s.crack_control {
        Some(cracked::CrackCheck::NotMade { why_not }) => {
            out.push(class_c(format!("Its crack control on the cracked transformed section is not made: {why_not}.")))
        }
        Some(cracked::CrackCheck::Made(c)) => {
            if let Some(open) = &c.open {
                out.push(class_c(format!(
                    "On the cracked section Δfps = {} {}; left to the engineer: {open}.",
                    crate::trace::show(c.dfps),
                    names.stress
                )));
            }
        }
        None => {}
    }
    if let Some(why) = &s.release.why_not {
        out.push(Condition {
            kind: ConditionKind::ReleaseNotChecked,
            short: "stresses at release not checked".into(),
            text: format!("The stresses at release are not checked: {why}."),
        });
    }
    out
}

/// Each layer's prestress as the package and the JSON report it: where it comes from,
/// fpj, the losses, fse and (computed) the stress just after release.
fn prestress_of(m: &Member, losses: Option<&losses::Losses>) -> Vec<LayerPrestress> {
    use crate::input::model::FseSource;
    m.strands
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let computed = losses.and_then(|l| l.layers.iter().find(|x| x.layer == i + 1));
            match (s.fse_source, computed) {
                (FseSource::Computed { fpj, .. }, Some(c)) => LayerPrestress {
                    layer: i + 1,
                    source: "computed",
                    fpj: Some(fpj),
                    fse: s.fse,
                    fpi: Some(c.fpi),
                    losses: Some(LossesOut {
                        total: c.total,
                        es: Some(c.es),
                        cr: Some(c.cr),
                        sh: Some(c.sh),
                        re: Some(c.re),
                    }),
                },
                (FseSource::Losses { fpj, losses, .. }, _) => LayerPrestress {
                    layer: i + 1,
                    source: "losses_given",
                    fpj: Some(fpj),
                    fse: s.fse,
                    fpi: None,
                    losses: Some(LossesOut { total: losses, es: None, cr: None, sh: None, re: None }),
                },
                _ => LayerPrestress { layer: i + 1, source: "given", fpj: None, fse: s.fse, fpi: None, losses: None },
            }
        })
        .collect()
}

/// Settles a section's words, asking its moment-curvature curve where strand is strained
/// beyond its elongation (whether it ruptures before the demand is carried).
fn settle_with_curve(
    ends: &mut curve::CurveEnds,
    site: &station::Station,
    li: usize,
    r: &mut LocationResult,
    stresses_checked: bool,
) {
    let sys = ends.units();
    let check = match r.rupture_risk.then(|| ends.end_of(site, li)) {
        None => conclusion::RuptureCheck::NotAsked,
        Some(Ok(c)) => conclusion::RuptureCheck::Curve(c),
        Some(Err(e)) => conclusion::RuptureCheck::Failed(e.clone()),
    };
    conclusion::settle(r, sys, check, stresses_checked);
}

/// Every station along the span, as a table row; the governing station and the critical
/// station of each end region join `sites`, to be derived in full.
fn along_span(
    p: &prepare::Prepared,
    d: &demand::Demand,
    sites: &mut Vec<station::Station>,
    ends: &mut curve::CurveEnds,
) -> Result<Vec<StationRow>> {
    let m = p.m;
    let km = p.cv.km;
    let len = d.length;
    let at = |x: f64, name: String| {
        let mo = d.at(x);
        station::Station { name, x: Some(x), mu: mo.mu, mnc: mo.mnc, mnc_scaled: false, moments: Some(mo) }
    };
    // transfer and development lengths from a first solution at midspan
    let mid = location::location(p, 0, &at(len / 2.0, "midspan".into()), false)?;
    let lengths: Vec<(f64, f64)> = m
        .strands
        .iter()
        .enumerate()
        .map(|(i, _)| {
            mid.development
                .iter()
                .find(|dv| dv.layer == i + 1)
                .map_or((0.0, 0.0), |dv| (dv.transfer_length, dv.development_length))
        })
        .collect();
    let points: Vec<f64> = d.points.iter().map(|q| q.x).collect();
    let region = m
        .strands
        .iter()
        .zip(&lengths)
        .map(|(s, (_, ld))| s.debonded_length + if ld.is_finite() { *ld } else { 0.0 })
        .fold(0.0, f64::max);
    let mut rows = Vec::new();
    for (x, what) in station::positions(m, d.span, d.bearing, &lengths, &points) {
        let site = at(x, format!("x = {} {}", crate::trace::show(x), p.sys.names().length));
        let mut r = location::location(p, 0, &site, false)?;
        settle_with_curve(ends, &site, 0, &mut r, stresses::release_checked(p));
        let mo = site.moments.as_ref().map_or_else(|| d.at(x), |mo| mo.clone());
        let end_region = if x <= region {
            Some(crate::input::model::End::Left)
        } else if x >= len - region {
            Some(crate::input::model::End::Right)
        } else {
            None
        };
        rows.push(StationRow {
            x,
            what,
            end_region,
            by_kind: mo.by_kind.map(|v| v * km),
            mu: r.mu,
            mnc: mo.mnc * km,
            combination: d.combinations.get(mo.combination).map(|c| c.name.clone()).unwrap_or_default(),
            phi: r.phi,
            mn: r.mn,
            phi_mn: r.phi_mn,
            ratio: r.ratio,
            mcr: r.mcr,
            min_ok: r.min_reinforcement.ok,
            status: r.status,
            pass: r.pass,
            conditions: r.conditions.iter().map(|c| c.kind).collect(),
            derived: None,
            role: None,
            mirror_of: None,
            stresses: Vec::new(),
        });
    }
    // the governing station, then the critical station of each end region
    let most = |f: &dyn Fn(&StationRow) -> bool, rows: &[StationRow]| {
        rows.iter().enumerate().filter(|(_, r)| f(r)).max_by(|a, b| a.1.ratio.total_cmp(&b.1.ratio)).map(|(i, _)| i)
    };
    let picks = [
        (most(&|_| true, &rows), "governing station"),
        (most(&|r| r.end_region == Some(crate::input::model::End::Left), &rows), "critical station, left end region"),
        (most(&|r| r.end_region == Some(crate::input::model::End::Right), &rows), "critical station, right end region"),
    ];
    for (pick, role) in picks {
        let Some(i) = pick else { continue };
        if rows[i].role.is_some() {
            continue;
        }
        rows[i].role = Some(role);
        // the right end region's critical station of a symmetric member is the mirror
        // image of the left's: one derivation serves both
        let left = picks[1].0.filter(|&j| j != i && rows[j].derived.is_some());
        if let Some(j) = left.filter(|&j| role == picks[2].1 && mirrors(p, len, &rows[j], &rows[i])) {
            rows[i].derived = rows[j].derived;
            rows[i].mirror_of = Some(rows[j].x);
            continue;
        }
        rows[i].derived = Some(sites.len());
        let x = rows[i].x;
        sites.push(at(x, format!("{role} (x = {} {})", crate::trace::show(x), p.sys.names().length)));
    }
    Ok(rows)
}

/// Whether station `b` is the mirror image of station `a` about the middle of the
/// member's length: at x and L - x, each layer at the same depth, bonded alike with
/// the same prestress, and the same moments, strength, checks and result (to 1e-9).
fn mirrors(p: &prepare::Prepared, len: f64, a: &StationRow, b: &StationRow) -> bool {
    let close = |u: f64, v: f64| (u - v).abs() <= 1e-9 * u.abs().max(v.abs()).max(1.0);
    let strands = |x: f64| {
        let site = station::Station::without_demand(String::new(), x);
        prestress::strands_at(p, 0, &site, &mut Trace::new(false))
    };
    let same_strands = strands(a.x)
        .iter()
        .zip(strands(b.x).iter())
        .all(|(s, t)| s.active == t.active && close(s.d, t.d) && close(s.fse, t.fse) && close(s.eps1, t.eps1));
    let numbers = [(a.mu, b.mu), (a.mnc, b.mnc), (a.phi, b.phi), (a.mn, b.mn), (a.phi_mn, b.phi_mn), (a.mcr, b.mcr)];
    close(a.x + b.x, len)
        && same_strands
        && numbers.iter().all(|&(u, v)| close(u, v))
        && a.by_kind.iter().zip(&b.by_kind).all(|(&u, &v)| close(u, v))
        && a.combination == b.combination
        && a.min_ok == b.min_ok
        && a.status == b.status
        && a.pass == b.pass
        && a.conditions == b.conditions
}

/// The member with the fse of the layers that take computed losses filled in, and the
/// loss computation (recorded in `tr`); `None` where no layer computes its losses.
fn with_losses(m: &Member, basis: &'static dyn Basis, tr: &mut Trace) -> Result<Option<(Member, losses::Losses)>> {
    if !m.computes_losses() {
        return Ok(None);
    }
    let p0 = prepare(m, basis, &mut Trace::new(false))?;
    let d0 = demand::of_member(&p0, m, &mut Trace::new(false)).ok_or_else(|| crate::error::Error::Analysis {
        member: m.id.clone(),
        location: String::new(),
        message: "computed losses need the member's loads".into(),
    })?;
    losses::compute(&p0, &d0, tr).map(Some)
}

/// phi Mn at each x along a member (from its left end), untraced: the strength solution
/// of the station table without its demand, minimum-strength check or the settling of
/// strand rupture (but the development of debonded strand decided as there, by the
/// member's service tension). For benchmarks and callers who want the capacity alone.
pub fn phi_mn_along(m: &Member, basis: &'static dyn Basis, xs: &[f64]) -> Result<Vec<f64>> {
    let computed = with_losses(m, basis, &mut Trace::new(false))?;
    let m = computed.as_ref().map_or(m, |(effective, _)| effective);
    let (p, _) = prepare_with_demand(m, basis, &mut Trace::new(false), None)?;
    xs.iter()
        .map(|&x| {
            let name = format!("x = {}", crate::trace::show(x));
            let site = station::Station::without_demand(name, x);
            location::location(&p, 0, &site, false).map(|r| r.phi_mn)
        })
        .collect()
}

/// Whether a member is a one-way slab for the minimum-reinforcement clause.
pub fn is_slab(m: &Member) -> bool {
    m.kind == Kind::OneWaySlab
}
