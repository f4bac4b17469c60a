//! One check location through the stages, in the order of a hand calculation:
//! prestress, strength by strain compatibility, phi and the design strength, the
//! cracking moment and minimum strength, the approximate strand stress, and the
//! figures the package draws. The words of the result are settled afterwards
//! (`conclusion::settle`), once the member's curve has answered what it can.

use super::checks::{self, PrestressAlone, tag};
use super::prepare::Prepared;
use super::prestress::{self, Prestress, StrandAt};
use super::solve::{Model, Trial};
use super::station::Station;
use super::strength::{self, layer_points, strand_label, zone_of};
use super::{
    Approximate, LayerOut, LocationResult, MinReinforcement, PrestressAloneOut, conclusion, is_slab, name_conversions,
    sy, sym_k,
};
use crate::basis::Clause;
use crate::error::Result;
use crate::section::P;
use crate::trace::{Step, Trace, Unit, f::*};

pub(super) fn location(p: &Prepared, li: usize, loc: &Station, trace: bool) -> Result<LocationResult> {
    let mut tr = Trace::new(trace);
    let mut notes: Vec<String> = Vec::new();

    let mut pre = prestress::at_location(p, li, loc, &mut tr);
    if loc.x.is_none() {
        notes.push("No distance from the member end is given: the strands are taken as fully developed here.".into());
    }

    // a section where no strand is bonded and there are no bars (at a member end, in a
    // debonded zone) has no tension steel: its strength is zero, a result, not an error
    if p.m.bars.is_empty() && pre.at.iter().all(|a| !a.active) {
        return Ok(no_tension_steel(p, li, loc, &pre, tr, notes));
    }

    let solved = strength::solve_location(p, li, loc, &mut pre.at, &mut tr, &mut notes)?;
    Ok(solved_result(p, li, loc, pre, solved, tr, notes))
}

/// The result of a section solved by strain compatibility: phi and the design strength,
/// the cracking moment and minimum strength, the approximate fps and the strand strains.
fn solved_result(
    p: &Prepared,
    li: usize,
    loc: &Station,
    pre: Prestress,
    solved: strength::Solved,
    mut tr: Trace,
    notes: Vec<String>,
) -> LocationResult {
    let strength::Solved { model, st, log, caps, strength, closure, block, other_block } = solved;
    let Prestress { mut at, pe, e } = pre;
    let cv = p.cv;
    let mn = strength.mn_shown;
    let mu = loc.mu * cv.km;
    let ctl = checks::control(p, li, &model, &st, &mut tr);
    let phi_devs = checks::phi_development(p, li, &mut at, st.c, ctl.phi, &mut tr);
    let phi_dev = phi_devs.iter().map(|d| d.1).reduce(f64::min);
    let phi = least_phi(p, li, ctl.phi, phi_dev, &phi_devs, &mut tr);
    let (phi_mn, ratio) = design_strength(p, li, phi, mn, mu, &mut tr);
    record_mnc_scaled(p, li, loc, &mut tr);
    let (mcr, cracked_first) = checks::cracking(p, li, pe, e, loc.mnc, &mut tr);
    let minr = checks::minimum(p, li, mcr, phi_mn, mu, &mut tr);
    let not_developed = loc.x.is_some() && caps.iter().any(|c| c.is_finite());
    let approximate = checks::approximate(p, li, &st, &at, not_developed, mn, &mut tr);
    let alone = checks::prestress_alone(p, li, pe, e, &mut tr);
    let (max_strand_strain, capped_strain) = strand_strains(&strength.strands);
    // the block's outline is drawn only in the package (traced runs)
    let block_rings = if tr.on() { block_outline(p, &model, st.a) } else { Vec::new() };
    let iterations: Vec<Trial> = log
        .into_iter()
        .map(|t| Trial { cc: t.cc * cv.kf, t: t.t * cv.kf, residual: t.residual * cv.kf, ..t })
        .collect();
    let strength_ok = ratio <= 1.0;
    let checked = Checked { mu, pe, e, phi, phi_mn, ratio, strength_ok, mcr, cracked_first, minr, alone, notes, tr };
    LocationResult {
        stresses: Vec::new(),
        c: st.c,
        a: st.a,
        eps_cu: model.ecu,
        block,
        zone: zone_of(p, st.a),
        cc: st.cc * cv.kf,
        dc: st.dc,
        strands: strength.strands,
        bars: strength.bars,
        iterations,
        closure,
        mn,
        eps_t: ctl.eps_t,
        eps_ty: ctl.eps_ty,
        extreme: ctl.extreme,
        control: ctl.class,
        phi_flexure: ctl.phi,
        phi_development: phi_dev,
        approximate,
        max_strand_strain,
        capped_strain,
        rupture_risk: max_strand_strain > conclusion::STRAND_ELONGATION,
        other_block,
        block_rings,
        solved: true,
        ..unsolved(p, loc, &at, checked)
    }
}

/// The largest strain of developed strand, and of strand not fully developed here.
/// Strand elongation (ASTM A416 minimum elongation): strand whose stress is limited by
/// its development cannot be strained to rupture there (it would slip first), so only
/// developed strand counts; the conclusion (conclusion::settle) words both.
fn strand_strains(strands: &[LayerOut]) -> (f64, f64) {
    let max_strand_strain = strands.iter().filter(|l| l.active && l.cap.is_none()).map(|l| l.eps).fold(0.0, f64::max);
    let capped_strain = strands.iter().filter(|l| l.active && l.cap.is_some()).map(|l| l.eps).fold(0.0, f64::max);
    (max_strand_strain, capped_strain)
}

/// phi: that for flexure, or the least phi_dev of strand not fully developed here where
/// it is less (every layer's phi_dev shown, so a checker sees what the least is taken of).
fn least_phi(
    p: &Prepared,
    li: usize,
    phi_f: f64,
    phi_dev: Option<f64>,
    phi_devs: &[(usize, f64)],
    tr: &mut Trace,
) -> f64 {
    match phi_dev {
        Some(pd) if pd < phi_f => {
            tr.rec(|| {
                let mut st = Step::new("checks", tag(li, "phi"), "Strength reduction factor", sy("phi", "phi")).input(
                    sy("phi_f", "phi_f"),
                    phi_f,
                    Unit::Ratio,
                );
                let mut terms = vec![v(0)];
                for (j, (k, pdk)) in phi_devs.iter().enumerate() {
                    st = st.input(sym_k("phi", "\"dev\"", "phi_dev", *k), *pdk, Unit::Ratio);
                    terms.push(v(j + 1));
                }
                st.formula(min(terms)).result(pd, Unit::Ratio).clause(p.basis.cite(Clause::LeastPhi)).note(
                    "strand not fully developed at this section: the least of φ for flexure and each such layer's φdev",
                )
            });
            pd
        }
        _ => phi_f,
    }
}

/// phi Mn and the demand to capacity ratio Mu / phi Mn.
fn design_strength(p: &Prepared, li: usize, phi: f64, mn: f64, mu: f64, tr: &mut Trace) -> (f64, f64) {
    let phi_mn = phi * mn;
    let ratio = mu / phi_mn;
    tr.rec(|| {
        design_strength_step(li, phi, mn, phi_mn).clause(p.basis.cite(Clause::DesignStrength { slab: is_slab(p.m) }))
    });
    tr.rec(|| {
        Step::new("checks", tag(li, "ratio"), "Demand to capacity ratio", sy("\"ratio\"", "ratio"))
            .formula(div(v(0), v(1)))
            .input(sy("M_u", "Mu"), mu, Unit::Moment)
            .input(sy("phi M_n", "phiMn"), phi_mn, Unit::Moment)
            .result(ratio, Unit::Demand)
            .note(if ratio <= 1.0 { "at most 1: adequate" } else { "above 1: not adequate" })
    });
    (phi_mn, ratio)
}

fn design_strength_step(li: usize, phi: f64, mn: f64, phi_mn: f64) -> Step {
    Step::new("checks", tag(li, "phiMn"), "Design flexural strength", sy("phi M_n", "phiMn"))
        .formula(mul(vec![v(0), v(1)]))
        .input(sy("phi", "phi"), phi, Unit::Ratio)
        .input(sy("M_n", "Mn"), mn, Unit::Moment)
        .result(phi_mn, Unit::Moment)
}

/// The non-composite moment at x, where the location gives none: the member's midspan
/// value scaled as for a uniformly loaded simple span.
fn record_mnc_scaled(p: &Prepared, li: usize, loc: &Station, tr: &mut Trace) {
    let cv = p.cv;
    if let (true, Some(x), Some(len)) = (loc.mnc_scaled && p.m.mnc > 0.0, loc.x, p.m.length) {
        tr.rec(|| {
            Step::new("cracking", tag(li, "Mnc"), "Non-composite moment at this section", sy("M_\"nc\"", "Mnc"))
                .formula(mul(vec![v(0), div(mul(vec![n(4.0), v(1), sub(v(2), v(1))]), pow(v(2), n(2.0)))]))
                .input(sy("M_(\"nc\",\"mid\")", "Mnc,mid"), p.m.mnc * cv.km, Unit::Moment)
                .input(sy("x", "x"), x, Unit::Length)
                .input(sy("L", "L"), len, Unit::Length)
                .result(loc.mnc * cv.km, Unit::Moment)
                .note("the member's midspan value, scaled as for a uniformly loaded simple span (the location gives none)")
        });
    }
}

/// The rings of the compression block of depth a, for the sketch.
fn block_outline(p: &Prepared, model: &Model, a: f64) -> Vec<Vec<P>> {
    let y0 = p.top - a;
    let mut rings = Vec::new();
    for part in &model.parts {
        let (o, holes) = part.region.clipped_above(y0);
        if o.len() >= 3 {
            rings.push(o);
        }
        rings.extend(holes);
    }
    rings
}

/// The result of a section with no tension steel: no strand bonded there and no bars.
/// Mn = 0; the demand, the cracking moment and the minimum strength are checked as
/// anywhere else, and the conclusion says why the strength is zero.
fn no_tension_steel(
    p: &Prepared,
    li: usize,
    loc: &Station,
    pre: &Prestress,
    mut tr: Trace,
    mut notes: Vec<String>,
) -> LocationResult {
    let (pe, e) = (pre.pe, pre.e);
    let mu = loc.mu * p.cv.km;
    tr.rec(|| {
        Step::new("strength", tag(li, "strength.Mn"), "Nominal flexural strength", sy("M_n", "Mn"))
            .result(0.0, Unit::Moment)
            .note("no strand is bonded at this section and there are no bars: no tension steel, no flexural strength")
    });
    // before the bond begins phi is that of the transfer length
    let phi = p.basis.phi_transfer();
    let ratio = if mu == 0.0 { 0.0 } else { f64::INFINITY };
    tr.rec(|| {
        design_strength_step(li, phi, 0.0, 0.0)
            .clause(p.basis.cite(Clause::LeastPhi))
            .note(format!("φ = {} where strand is not developed", crate::trace::show(phi)))
    });
    let (mcr, cracked_first) = checks::cracking(p, li, pe, e, loc.mnc, &mut tr);
    let minr = checks::minimum(p, li, mcr, 0.0, mu, &mut tr);
    let alone = checks::prestress_alone(p, li, pe, e, &mut tr);
    notes.push("No strand is bonded at this section (it lies before the bond begins: at the member end or in a debonded zone) and the member has no bars, so the section has no flexural strength.".into());
    let strands = unbonded_layers(p, &pre.at, tr.on());
    let strength_ok = mu == 0.0;
    let checked =
        Checked { mu, pe, e, phi, phi_mn: 0.0, ratio, strength_ok, mcr, cracked_first, minr, alone, notes, tr };
    LocationResult { strands, ..unsolved(p, loc, &pre.at, checked) }
}

/// The strand layers of a section where none is bonded: no strain or force (the points
/// of the sketch only in traced runs).
fn unbonded_layers(p: &Prepared, at: &[StrandAt], traced: bool) -> Vec<LayerOut> {
    let m = p.m;
    m.strands
        .iter()
        .enumerate()
        .map(|(i, s)| LayerOut {
            kind: "strand",
            index: i + 1,
            label: strand_label(s, p.sys),
            count: s.count,
            unit_area: s.area,
            area: s.total_area(),
            depth: at[i].d,
            eps1: Some(at[i].eps1),
            eps2: Some(at[i].eps2),
            eps3: 0.0,
            eps: 0.0,
            stress: 0.0,
            force: 0.0,
            fse: Some(at[i].fse),
            cap: None,
            in_block: 0.0,
            active: false,
            points: if traced { layer_points(&m.region, p.top - at[i].d, s.count, s.diameter) } else { Vec::new() },
            diameter: s.diameter,
        })
        .collect()
}

/// What a location's result holds whether or not its section is solved: the demand,
/// the prestress, phi and the design strength, the cracking moment and the minimum
/// strength, the fibre stresses under the prestress alone, the notes and the steps.
struct Checked {
    mu: f64,
    pe: f64,
    e: f64,
    phi: f64,
    phi_mn: f64,
    ratio: f64,
    strength_ok: bool,
    mcr: f64,
    cracked_first: bool,
    minr: MinReinforcement,
    alone: PrestressAlone,
    notes: Vec<String>,
    tr: Trace,
}

/// The result of a location whose section is not solved (no tension steel: Mn = 0,
/// phi that of the transfer length); a solved section's result overrides what strain
/// compatibility gives. Status and conclusion are settled later by conclusion::settle.
fn unsolved(p: &Prepared, loc: &Station, at: &[StrandAt], c: Checked) -> LocationResult {
    let m = p.m;
    let mut steps = c.tr.steps;
    name_conversions(p.sys, &mut steps);
    LocationResult {
        stresses: Vec::new(),
        name: loc.name.clone(),
        x: loc.x,
        mu: c.mu,
        pe: c.pe * p.cv.kf,
        e: c.e,
        c: 0.0,
        a: 0.0,
        beta1: p.beta1,
        eps_cu: p.basis.crushing_strain(),
        block: m.topping.as_ref().map(|t| t.block),
        zone: "none",
        cc: 0.0,
        dc: 0.0,
        strands: Vec::new(),
        bars: Vec::new(),
        iterations: Vec::new(),
        closure: 0.0,
        mn: 0.0,
        eps_t: 0.0,
        eps_ty: 0.002,
        extreme: "none".into(),
        control: "none",
        phi: c.phi,
        phi_flexure: c.phi,
        phi_development: Some(c.phi),
        phi_mn: c.phi_mn,
        ratio: c.ratio,
        strength_ok: c.strength_ok,
        mcr: c.mcr,
        cracked_before_composite: c.cracked_first,
        min_reinforcement: c.minr,
        approximate: Approximate::not_applicable("no strand is bonded at this section".into()),
        development: at.iter().filter_map(|a| a.dev.clone()).collect(),
        max_strand_strain: 0.0,
        capped_strain: 0.0,
        rupture_risk: false,
        prestress_alone: PrestressAloneOut {
            top: c.alone.top,
            bottom: c.alone.bottom,
            fr: m.concrete.fr,
            fc: m.concrete.fc,
            top_cracks: c.alone.top_cracks,
            over_compressed: c.alone.over_compressed,
        },
        other_block: None,
        // settled with the words by conclusion::settle
        pass: c.strength_ok,
        status: conclusion::Status::Fail,
        conditions: Vec::new(),
        conclusion: String::new(),
        notes: c.notes,
        block_rings: Vec::new(),
        solved: false,
        demand_from_loads: None,
        trace: steps,
    }
}
