//! One check location through the stages, in the order of a hand calculation:
//! prestress, strength by strain compatibility, phi and the design strength, the
//! cracking moment and minimum strength, the approximate strand stress, and the
//! figures the package draws. The words of the result are settled afterwards
//! (`conclusion::settle`), once the member's curve has answered what it can.

use super::prepare::Prepared;
use super::prestress::{self, StrandAt};
use super::solve::Trial;
use super::station::Station;
use super::strength::{self, layer_points, strand_label, zone_of};
use super::{
    Approximate, LayerOut, LocationResult, PrestressAloneOut, checks, conclusion, is_slab, name_conversions, sy, sym_k,
};
use crate::basis::Clause;
use crate::error::Result;
use crate::trace::{Step, Trace, Unit, f::*};

pub(super) fn location(p: &Prepared, li: usize, loc: &Station, trace: bool) -> Result<LocationResult> {
    let m = p.m;
    let sys = p.sys;
    let cv = p.cv;
    let mut tr = Trace::new(trace);
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let mut notes: Vec<String> = Vec::new();

    let prestress::Prestress { mut at, pe, e } = prestress::at_location(p, li, loc, &mut tr);
    if loc.x.is_none() {
        notes.push("No distance from the member end is given: the strands are taken as fully developed here.".into());
    }

    // a section where no strand is bonded and there are no bars (at a member end, in a
    // debonded zone) has no tension steel: its strength is zero, a result, not an error
    if m.bars.is_empty() && at.iter().all(|a| !a.active) {
        return Ok(no_tension_steel(p, li, loc, &at, pe, e, tr, notes));
    }

    let strength::Solved { model, st, log, caps, strength, closure, block, other_block } =
        strength::solve_location(p, li, loc, &mut at, &mut tr, &mut notes)?;

    // ---- Mn, phi, checks ---------------------------------------------------------
    let mn = strength.mn_shown;
    let mu = loc.mu * cv.km;
    let ctl = checks::control(p, li, &model, &st, &mut tr);
    let phi_devs = checks::phi_development(p, li, &mut at, st.c, ctl.phi, &mut tr);
    let phi_dev = phi_devs.iter().map(|d| d.1).reduce(f64::min);
    let phi = match phi_dev {
        Some(pd) if pd < ctl.phi => {
            let phi_f = ctl.phi;
            tr.rec(|| {
                // every layer's phi_dev, so a checker sees what the least is taken of
                let mut st = Step::new("checks", tag("phi"), "Strength reduction factor", sy("phi", "phi")).input(
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
        _ => ctl.phi,
    };
    let phi_mn = phi * mn;
    let ratio = mu / phi_mn;
    tr.rec(|| {
        Step::new("checks", tag("phiMn"), "Design flexural strength", sy("phi M_n", "phiMn"))
            .formula(mul(vec![v(0), v(1)]))
            .input(sy("phi", "phi"), phi, Unit::Ratio)
            .input(sy("M_n", "Mn"), mn, Unit::Moment)
            .result(phi_mn, Unit::Moment)
            .clause(p.basis.cite(Clause::DesignStrength { slab: is_slab(p.m) }))
    });
    tr.rec(|| {
        Step::new("checks", tag("ratio"), "Demand to capacity ratio", sy("\"ratio\"", "ratio"))
            .formula(div(v(0), v(1)))
            .input(sy("M_u", "Mu"), mu, Unit::Moment)
            .input(sy("phi M_n", "phiMn"), phi_mn, Unit::Moment)
            .result(ratio, Unit::Demand)
            .note(if ratio <= 1.0 { "at most 1: adequate" } else { "above 1: not adequate" })
    });
    let strength_ok = ratio <= 1.0;

    if let (true, Some(x), Some(len)) = (loc.mnc_scaled && p.m.mnc > 0.0, loc.x, p.m.length) {
        tr.rec(|| {
            Step::new("cracking", tag("Mnc"), "Non-composite moment at this section", sy("M_\"nc\"", "Mnc"))
                .formula(mul(vec![v(0), div(mul(vec![n(4.0), v(1), sub(v(2), v(1))]), pow(v(2), n(2.0)))]))
                .input(sy("M_(\"nc\",\"mid\")", "Mnc,mid"), p.m.mnc * cv.km, Unit::Moment)
                .input(sy("x", "x"), x, Unit::Length)
                .input(sy("L", "L"), len, Unit::Length)
                .result(loc.mnc * cv.km, Unit::Moment)
                .note("the member's midspan value, scaled as for a uniformly loaded simple span (the location gives none)")
        });
    }
    let (mcr, cracked_first) = checks::cracking(p, li, pe, e, loc.mnc, &mut tr);
    let minr = checks::minimum(p, li, mcr, phi_mn, mu, &mut tr);
    let approx =
        checks::approximate(p, li, &st, &at, loc.x.is_some() && caps.iter().any(|c| c.is_finite()), mn, &mut tr);

    let alone = checks::prestress_alone(p, li, pe, e, &mut tr);

    // strand elongation (ASTM A416 minimum elongation): strand whose stress is limited by
    // its development cannot be strained to rupture there (it would slip first), so only
    // developed strand counts; the conclusion (conclusion::settle) words both
    let max_strand_strain =
        strength.strands.iter().filter(|l| l.active && l.cap.is_none()).map(|l| l.eps).fold(0.0, f64::max);
    let rupture_risk = max_strand_strain > conclusion::STRAND_ELONGATION;
    let capped_strain =
        strength.strands.iter().filter(|l| l.active && l.cap.is_some()).map(|l| l.eps).fold(0.0, f64::max);
    // the block's outline is drawn only in the package (traced runs)
    let block_rings = if !trace {
        Vec::new()
    } else {
        let y0 = p.top - st.a;
        let mut rings = Vec::new();
        for part in &model.parts {
            let (o, holes) = part.region.clipped_above(y0);
            if o.len() >= 3 {
                rings.push(o);
            }
            rings.extend(holes);
        }
        rings
    };
    let iterations: Vec<Trial> = log
        .into_iter()
        .map(|t| Trial { cc: t.cc * cv.kf, t: t.t * cv.kf, residual: t.residual * cv.kf, ..t })
        .collect();
    let mut steps = tr.steps;
    name_conversions(sys, &mut steps);
    Ok(LocationResult {
        name: loc.name.clone(),
        x: loc.x,
        mu,
        pe: pe * cv.kf,
        e,
        c: st.c,
        a: st.a,
        beta1: p.beta1,
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
        phi,
        phi_flexure: ctl.phi,
        phi_development: phi_dev,
        phi_mn,
        ratio,
        strength_ok,
        mcr,
        cracked_before_composite: cracked_first,
        min_reinforcement: minr,
        approximate: approx,
        development: at.iter().filter_map(|a| a.dev.clone()).collect(),
        max_strand_strain,
        capped_strain,
        rupture_risk,
        prestress_alone: PrestressAloneOut {
            top: alone.top,
            bottom: alone.bottom,
            fr: m.concrete.fr,
            fc: m.concrete.fc,
            top_cracks: alone.top_cracks,
            over_compressed: alone.over_compressed,
        },
        other_block,
        // settled with the words by conclusion::settle, once the member's curve has
        // answered what it can
        pass: strength_ok,
        status: conclusion::Status::Fail,
        conditions: Vec::new(),
        conclusion: String::new(),
        notes,
        block_rings,
        solved: true,
        demand_from_loads: None,
        trace: steps,
    })
}

/// The result of a section with no tension steel: no strand bonded there and no bars.
/// Mn = 0; the demand, the cracking moment and the minimum strength are checked as
/// anywhere else, and the conclusion says why the strength is zero.
#[allow(clippy::too_many_arguments)]
fn no_tension_steel(
    p: &Prepared,
    li: usize,
    loc: &Station,
    at: &[StrandAt],
    pe: f64,
    e: f64,
    mut tr: Trace,
    mut notes: Vec<String>,
) -> LocationResult {
    let m = p.m;
    let cv = p.cv;
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let mu = loc.mu * cv.km;
    tr.rec(|| {
        Step::new("strength", tag("strength.Mn"), "Nominal flexural strength", sy("M_n", "Mn"))
            .result(0.0, Unit::Moment)
            .note("no strand is bonded at this section and there are no bars: no tension steel, no flexural strength")
    });
    // before the bond begins phi is that of the transfer length
    let phi = p.basis.phi_transfer();
    let ratio = if mu == 0.0 { 0.0 } else { f64::INFINITY };
    tr.rec(|| {
        Step::new("checks", tag("phiMn"), "Design flexural strength", sy("phi M_n", "phiMn"))
            .formula(mul(vec![v(0), v(1)]))
            .input(sy("phi", "phi"), phi, Unit::Ratio)
            .input(sy("M_n", "Mn"), 0.0, Unit::Moment)
            .result(0.0, Unit::Moment)
            .clause(p.basis.cite(Clause::LeastPhi))
            .note(format!("φ = {} where strand is not developed", crate::trace::show(phi)))
    });
    let (mcr, cracked_first) = checks::cracking(p, li, pe, e, loc.mnc, &mut tr);
    let minr = checks::minimum(p, li, mcr, 0.0, mu, &mut tr);
    let alone = checks::prestress_alone(p, li, pe, e, &mut tr);
    notes.push("No strand is bonded at this section (it lies before the bond begins: at the member end or in a debonded zone) and the member has no bars, so the section has no flexural strength.".into());
    let strands = m
        .strands
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
            points: if tr.on() { layer_points(&m.region, p.top - at[i].d, s.count, s.diameter) } else { Vec::new() },
            diameter: s.diameter,
        })
        .collect();
    let mut steps = tr.steps;
    name_conversions(p.sys, &mut steps);
    LocationResult {
        name: loc.name.clone(),
        x: loc.x,
        mu,
        pe: pe * cv.kf,
        e,
        c: 0.0,
        a: 0.0,
        beta1: p.beta1,
        eps_cu: p.basis.crushing_strain(),
        block: m.topping.as_ref().map(|t| t.block),
        zone: "none",
        cc: 0.0,
        dc: 0.0,
        strands,
        bars: Vec::new(),
        iterations: Vec::new(),
        closure: 0.0,
        mn: 0.0,
        eps_t: 0.0,
        eps_ty: 0.002,
        extreme: "none".into(),
        control: "none",
        phi,
        phi_flexure: phi,
        phi_development: Some(phi),
        phi_mn: 0.0,
        ratio,
        strength_ok: mu == 0.0,
        mcr,
        cracked_before_composite: cracked_first,
        min_reinforcement: minr,
        approximate: Approximate::not_applicable("no strand is bonded at this section".into()),
        development: at.iter().filter_map(|a| a.dev.clone()).collect(),
        max_strand_strain: 0.0,
        capped_strain: 0.0,
        rupture_risk: false,
        prestress_alone: PrestressAloneOut {
            top: alone.top,
            bottom: alone.bottom,
            fr: m.concrete.fr,
            fc: m.concrete.fc,
            top_cracks: alone.top_cracks,
            over_compressed: alone.over_compressed,
        },
        other_block: None,
        pass: mu == 0.0,
        status: conclusion::Status::Fail,
        conditions: Vec::new(),
        conclusion: String::new(),
        notes,
        block_rings: Vec::new(),
        solved: false,
        demand_from_loads: None,
        trace: steps,
    }
}
