//! Code checks around the strain-compatibility solution: strand transfer and
//! development, the control class and phi, the cracking moment and minimum
//! reinforcement, and the code's approximate fps for comparison. What the code decides is
//! asked of the design basis; the clauses named in comments are those of ACI 318-19.

use super::prepare::Prepared;
use super::prestress::StrandAt;
use super::solve::{Model, State, Steel, SteelLaw};
use super::{Approximate, Development, MinReinforcement, is_slab, sy, sym_k};
use crate::basis::{Clause, Control};
use crate::input::model::{End, StrandLayer};
use crate::section::Region;
use crate::trace::{Step, Symbol, Trace, Unit, f::*, show};
use crate::units::System;

/// The id of a step of location li: `L{li+1}.{k}`.
pub(super) fn tag(li: usize, k: &str) -> String {
    format!("L{}.{k}", li + 1)
}

/// A step of strand layer k at location li: its id `L{li+1}.{id}.{k}`, its title
/// "{title}, layer {k}".
pub(super) fn layer_step(group: &str, li: usize, id: &str, k: usize, title: &str, symbol: Symbol) -> Step {
    Step::new(group, tag(li, &format!("{id}.{k}")), format!("{title}, layer {k}"), symbol)
}

/// Transfer length and the effective prestress at a section `from_end` (the nearer end
/// and the distance to it), before the solution.
pub(super) fn transfer(
    p: &Prepared,
    li: usize,
    i: usize,
    s: &StrandLayer,
    from_end: Option<(End, f64)>,
    tr: &mut Trace,
) -> (f64, bool, Option<Development>) {
    let Some((end, xe)) = from_end else {
        return (s.fse, true, None);
    };
    let k = i + 1;
    let (d1, _) = p.basis.development_divisors();
    let ltr = s.fse / d1 * s.diameter;
    let x_bond = xe - s.debonded_length;
    if s.debonded_length > 0.0 {
        tr.rec(|| bonded_length_step(li, k, s, end, xe, x_bond));
    }
    // where the bond begins, within the rounding of x measured from the other end (a
    // section at length - x must find what the section at x finds)
    let at_start = x_bond <= 1e-9 * p.m.length.unwrap_or(0.0);
    let (fse_here, active, state) = if at_start && s.debonded_length > 0.0 {
        (0.0, false, "debonded at this section")
    } else if at_start {
        (0.0, false, "at the member end: not yet bonded")
    } else if x_bond < ltr {
        (s.fse * x_bond / ltr, true, "within the transfer length")
    } else {
        (s.fse, true, "beyond the transfer length")
    };
    let dev = Development {
        layer: k,
        end,
        x_end: xe,
        x_bond,
        debonded_length: s.debonded_length,
        transfer_length: ltr,
        development_length: f64::NAN,
        doubled: s.debonded_length > 0.0 && p.service_tension.is_none_or(|(ft, _)| ft > 0.0),
        fse_here,
        fpx: None,
        ratio: None,
        phi: None,
        state,
    };
    (fse_here, active, Some(dev))
}

/// A layer's transfer length, once for the member (its sections use it from the nearer
/// end, past any debonding).
pub(super) fn transfer_length_step(p: &Prepared, k: usize, s: &StrandLayer) -> Step {
    let (d1, _) = p.basis.development_divisors();
    let ltr = s.fse / d1 * s.diameter;
    Step::new(
        "prestress",
        format!("prestress.ltr.{k}"),
        format!("Transfer length, layer {k}"),
        sym_k("ell", "\"tr\"", "ltr", k),
    )
    .formula(mul(vec![div(v(0), n(d1)), v(1)]))
    .input(sym_k("f", "\"se\"", "fse", k), s.fse, Unit::Stress)
    .input(s_db(), s.diameter, Unit::Length)
    .result(ltr, Unit::Length)
    .clause(p.basis.cite(Clause::TransferLength))
    .note(match p.sys {
        _ if s.fse == 0.0 => "untensioned strand: no prestress to transfer",
        System::Us => "fse in ksi (fse/3000 with psi)",
        System::Si => "fse in MPa",
    })
}

fn bonded_length_step(li: usize, k: usize, s: &StrandLayer, end: End, xe: f64, x_bond: f64) -> Step {
    layer_step("development", li, "dev.xb", k, "Bonded length to the section", sym_k("x", "b", "xb", k))
        .formula(sub(v(0), v(1)))
        .input(sy("x_e", "xe"), xe, Unit::Length)
        .input(sym_k("ell", "\"db\"", "l_debond", k), s.debonded_length, Unit::Length)
        .result(x_bond, Unit::Length)
        .note(format!("distance from where the bond begins, debonded over ℓdb at each end; from the {}", end.name()))
}

fn s_db() -> Symbol {
    sy("d_b", "db")
}

/// Development length and the stress limit at x (after a first, unlimited solution).
/// Returns the stress cap and the phi of 21.2.3 for a layer not fully developed.
#[allow(clippy::too_many_arguments)]
pub(super) fn development(
    p: &Prepared,
    li: usize,
    i: usize,
    s: &StrandLayer,
    fps: f64,
    at: &mut StrandAt,
    tr: &mut Trace,
) -> Option<f64> {
    let dev = at.dev.as_mut()?;
    let k = i + 1;
    let (d1, d2) = p.basis.development_divisors();
    let fse_full = s.fse;
    let fps_d = fps.max(fse_full);
    let factor = if dev.doubled { 2.0 } else { 1.0 };
    let ld = factor * (fse_full / d1 * s.diameter + (fps_d - fse_full) / d2 * s.diameter);
    dev.development_length = ld;
    let debonded = dev.debonded_length > 0.0;
    tr.rec(|| development_length_step(p, li, k, s, fps_d, (factor, debonded), ld));
    if !at.active {
        return None;
    }
    let xb = dev.x_bond;
    let ltr = dev.transfer_length;
    // within the rounding of x measured from the other end, as in `transfer`
    if xb >= ld - 1e-9 * p.m.length.unwrap_or(0.0) {
        dev.state = "fully developed";
        tr.rec(|| fully_developed_step(p, li, k, &*dev));
        return None;
    }
    let cap = if xb <= ltr {
        fse_full * xb / ltr.max(f64::MIN_POSITIVE)
    } else {
        fse_full + (xb - ltr) / (ld - ltr) * (fps_d - fse_full)
    };
    dev.fpx = Some(cap);
    dev.state = if xb <= ltr { "within the transfer length" } else { "between the transfer and development lengths" };
    tr.rec(|| stress_limit_step(p, li, k, &*dev, fse_full, fps_d, cap));
    let ratio = if xb <= ltr { 0.0 } else { (xb - ltr) / (ld - ltr) };
    dev.ratio = Some(ratio);
    Some(cap)
}

/// The development length's step; `factor` 2 where it is doubled (25.4.8.1(b)), and
/// whether the layer is debonded at the member end (why it is or is not doubled).
fn development_length_step(
    p: &Prepared,
    li: usize,
    k: usize,
    s: &StrandLayer,
    fps_d: f64,
    (factor, debonded): (f64, bool),
    ld: f64,
) -> Step {
    let (d1, d2) = p.basis.development_divisors();
    let fse_full = s.fse;
    // (fps - fse) / 1 in ksi: no division shown
    let rise = if d2 == 1.0 { sub(v(1), v(0)) } else { div(sub(v(1), v(0)), n(d2)) };
    let core = add(vec![mul(vec![div(v(0), n(d1)), v(2)]), mul(vec![rise, v(2)])]);
    let names = p.sys.names();
    let tension = |(ft, x): (f64, f64)| {
        format!(
            "largest bottom stress under all service loads between the bearings {} {} at x = {} {}",
            show(ft),
            names.stress,
            show(x),
            names.length
        )
    };
    let solved = "fps as solved at this location with the strand fully developed";
    let (formula, note) = if fps_d == 0.0 {
        (core, "untensioned strand in compression here: its development does not limit it".to_string())
    } else if factor == 2.0 {
        let why = match p.service_tension {
            Some(t) => format!("the design has tension in the precompressed tensile zone under service loads ({})", tension(t)),
            None => "the service stresses are not computed for this member (its moments are given), so tension in the precompressed tensile zone is assumed, the conservative reading".into(),
        };
        (
            mul(vec![n(2.0), core]),
            format!("doubled for strand whose bonding does not reach the member end (25.4.8.1(b)): {why}; {solved}"),
        )
    } else if let (true, Some(t)) = (debonded, p.service_tension) {
        (
            core,
            format!(
                "not doubled although the strand is debonded at the member end: no tension in the precompressed tensile zone under service loads ({}), so 25.4.8.1(b) does not apply; {solved}",
                tension(t)
            ),
        )
    } else {
        (core, format!("{solved}, so ℓd differs a little between locations"))
    };
    layer_step("development", li, "dev.ld", k, "Development length", sym_k("ell", "d", "ld", k))
        .formula(formula)
        .input(sym_k("f", "\"se\"", "fse", k), fse_full, Unit::Stress)
        .input(sym_k("f", "\"ps\"", "fps", k), fps_d, Unit::Stress)
        .input(s_db(), s.diameter, Unit::Length)
        .result(ld, Unit::Length)
        .clause(p.basis.cite(if factor == 2.0 || debonded {
            Clause::DevelopmentDoubled
        } else {
            Clause::DevelopmentLength
        }))
        .note(note)
}

fn fully_developed_step(p: &Prepared, li: usize, k: usize, dev: &Development) -> Step {
    let title = "Bonded length against the development length";
    layer_step("development", li, "dev.full", k, title, sym_k("x", "b", "xb", k))
        .result(dev.x_bond, Unit::Length)
        .clause(p.basis.cite(Clause::StrandStressLimit))
        .note(format!(
            "bonded length from the {}, at least ℓd = {} {}: the strand is fully developed here and its stress is not limited",
            dev.end.name(),
            show(dev.development_length),
            p.sys.names().length
        ))
}

/// The stress limit fpx of a layer not fully developed: within the transfer length, or
/// linear between the transfer and development lengths.
fn stress_limit_step(p: &Prepared, li: usize, k: usize, dev: &Development, fse: f64, fps_d: f64, cap: f64) -> Step {
    let (xb, ltr, ld, end) = (dev.x_bond, dev.transfer_length, dev.development_length, dev.end);
    let title = "Strand stress limit at the section";
    let st = layer_step("development", li, "dev.fpx", k, title, sym_k("f", "\"px\"", "fpx", k))
        .clause(p.basis.cite(Clause::StrandStressLimit));
    if xb <= ltr {
        st.formula(div(mul(vec![v(0), v(1)]), v(2)))
            .input(sym_k("f", "\"se\"", "fse", k), fse, Unit::Stress)
            .input(sym_k("x", "b", "xb", k), xb, Unit::Length)
            .input(sym_k("ell", "\"tr\"", "ltr", k), ltr, Unit::Length)
            .result(cap, Unit::Stress)
            .note(format!("within the transfer length from the {}", end.name()))
    } else {
        st.formula(add(vec![v(0), mul(vec![div(sub(v(1), v(2)), sub(v(3), v(2))), sub(v(4), v(0))])]))
            .input(sym_k("f", "\"se\"", "fse", k), fse, Unit::Stress)
            .input(sym_k("x", "b", "xb", k), xb, Unit::Length)
            .input(sym_k("ell", "\"tr\"", "ltr", k), ltr, Unit::Length)
            .input(sym_k("ell", "d", "ld", k), ld, Unit::Length)
            .input(sym_k("f", "\"ps\"", "fps", k), fps_d, Unit::Stress)
            .result(cap, Unit::Stress)
            .note(format!("between the transfer and development lengths from the {}: linear", end.name()))
    }
}

/// phi of ACI 318-19 21.2.3 for strand not fully developed at the section: 0.75 up to
/// the transfer length, then linear to phi_p (the value of Table 21.2.2) at the
/// development length, measured from where the bond begins. Only strand below the
/// neutral axis (in tension) governs.
pub(super) fn phi_development(
    p: &Prepared,
    li: usize,
    at: &mut [StrandAt],
    c: f64,
    phi_p: f64,
    tr: &mut Trace,
) -> Vec<(usize, f64)> {
    let mut each = Vec::new();
    for (i, a) in at.iter_mut().enumerate() {
        let k = i + 1;
        if !a.active || a.d <= c {
            continue;
        }
        let Some(dev) = a.dev.as_mut() else { continue };
        let Some(ratio) = dev.ratio else { continue };
        let p0 = p.basis.phi_transfer();
        let phi = (p0 + (phi_p - p0) * ratio).min(phi_p.max(p0));
        dev.phi = Some(phi);
        let (xb, ltr, ld) = (dev.x_bond, dev.transfer_length, dev.development_length);
        tr.rec(|| {
            let title = "Strength reduction factor, strand not fully developed";
            let st = layer_step("checks", li, "dev.phi", k, title, sym_k("phi", "\"dev\"", "phi_dev", k))
                .clause(p.basis.cite(Clause::PhiDevelopment));
            if ratio == 0.0 {
                st.result(phi, Unit::Ratio).note("from where the bond begins to the end of the transfer length")
            } else {
                st.formula(add(vec![n(p0), mul(vec![sub(v(0), n(p0)), div(sub(v(1), v(2)), sub(v(3), v(2)))])]))
                    .input(sy("phi_p", "phi_p"), phi_p, Unit::Ratio)
                    .input(sym_k("x", "b", "xb", k), xb, Unit::Length)
                    .input(sym_k("ell", "\"tr\"", "ltr", k), ltr, Unit::Length)
                    .input(sym_k("ell", "d", "ld", k), ld, Unit::Length)
                    .result(phi, Unit::Ratio)
                    .note(format!(
                        "linear from {} at the transfer length to φp ({}) at the development length",
                        show(p0),
                        p.basis.clause(Clause::PhiTableShort)
                    ))
            }
        });
        each.push((k, phi));
    }
    each
}

pub(super) struct Classification {
    pub eps_t: f64,
    pub eps_ty: f64,
    pub class: &'static str,
    pub phi: f64,
    pub extreme: String,
}

pub(super) fn control(p: &Prepared, li: usize, model: &Model, st: &State, tr: &mut Trace) -> Classification {
    let ns = p.m.strands.len();
    let Some((j, ext)) =
        model.steel.iter().enumerate().filter(|(_, s)| s.area > 0.0).max_by(|a, b| a.1.d.total_cmp(&b.1.d))
    else {
        let eps_ty = p.basis.strand_yield_strain();
        let (phi, class) = p.basis.phi(0.0, eps_ty);
        return Classification { eps_t: 0.0, eps_ty, class: class.word(), phi, extreme: "none".into() };
    };
    let is_strand = j < ns;
    let k = if is_strand { j + 1 } else { j - ns + 1 };
    let extreme = if is_strand { format!("strand layer {k}") } else { format!("bar layer {k}") };
    let eps_t = ext.eps3(st.c, model.ecu);
    tr.rec(|| {
        Step::new(
            "checks",
            tag(li, "eps_t"),
            "Net tensile strain in the extreme tension steel",
            sy("epsilon_t", "eps_t"),
        )
        .formula(div(mul(vec![n(model.ecu), sub(v(0), v(1))]), v(1)))
        .input(sy("d_t", "dt"), ext.d, Unit::Length)
        .input(sy("c", "c"), st.c, Unit::Length)
        .result(eps_t, Unit::Strain)
        .clause(p.basis.cite(Clause::NetTensileStrain))
        .note(format!("{extreme}; flexural strain only, excluding prestress and decompression strains"))
    });
    let eps_ty = yield_strain(p, li, ext, tr);
    let (phi, class) = p.basis.phi(eps_t, eps_ty);
    tr.rec(|| phi_flexure_step(p, li, eps_t, eps_ty, phi, class));
    Classification { eps_t, eps_ty, class: class.word(), phi, extreme }
}

/// The yield strain of the extreme tension steel for the control classification: the
/// basis's value for strand, fy / Es for a bar.
fn yield_strain(p: &Prepared, li: usize, ext: &Steel, tr: &mut Trace) -> f64 {
    let (eps_ty, eps_ty_note) = match ext.law {
        SteelLaw::Strand(_) => (
            p.basis.strand_yield_strain(),
            format!(
                "{} for prestressed reinforcement ({})",
                crate::trace::const_text(p.basis.strand_yield_strain()),
                p.basis.clause(Clause::YieldStrainForClass)
            ),
        ),
        SteelLaw::Bar(b) => (b.fy / b.es, "fy / Es of the bar".to_string()),
    };
    tr.rec(|| {
        let stp = Step::new(
            "checks",
            tag(li, "eps_ty"),
            "Yield strain for the control classification",
            sy("epsilon_\"ty\"", "eps_ty"),
        )
        .clause(p.basis.cite(Clause::YieldStrainForClass));
        match ext.law {
            SteelLaw::Bar(b) => stp
                .formula(div(v(0), v(1)))
                .input(sy("f_y", "fy"), b.fy, Unit::Stress)
                .input(sy("E_s", "Es"), b.es, Unit::Stress)
                .result(eps_ty, Unit::Strain)
                .note(eps_ty_note.clone()),
            SteelLaw::Strand(_) => stp.result(eps_ty, Unit::Strain).note(eps_ty_note.clone()),
        }
    });
    eps_ty
}

fn phi_flexure_step(p: &Prepared, li: usize, eps_t: f64, eps_ty: f64, phi: f64, class: Control) -> Step {
    let stp = Step::new("checks", tag(li, "phi_f"), "Strength reduction factor for flexure", sy("phi_f", "phi_f"))
        .clause(p.basis.cite(Clause::PhiTable));
    match class {
        Control::Transition => stp
            .formula(add(vec![n(0.65), mul(vec![n(0.25), div(sub(v(0), v(1)), n(0.003))])]))
            .input(sy("epsilon_t", "eps_t"), eps_t, Unit::Strain)
            .input(sy("epsilon_\"ty\"", "eps_ty"), eps_ty, Unit::Strain)
            .result(phi, Unit::Ratio)
            .note("transition zone: εty < εt < εty + 0.003"),
        Control::Tension => stp.result(phi, Unit::Ratio).note("tension-controlled: εt ≥ εty + 0.003"),
        _ => stp.result(phi, Unit::Ratio).note("compression-controlled: εt ≤ εty"),
    }
}

/// The extreme fibre stresses of the precast unit under the effective prestress alone
/// (no self-weight: the worst case for the top's tension and the bottom's compression),
/// tension positive: the top against fr, the bottom's precompression against f'c. A
/// screening until the stresses at release and in service are checked; where either is
/// exceeded it is an open condition of the conclusion.
pub(super) struct PrestressAlone {
    pub top: f64,
    pub bottom: f64,
    pub top_cracks: bool,
    pub over_compressed: bool,
}

pub(super) fn prestress_alone(p: &Prepared, li: usize, pe: f64, e: f64, tr: &mut Trace) -> PrestressAlone {
    let cv = p.cv;
    let pc = &p.precast;
    let (area, st, sb) = (pc.area, pc.st(), pc.sb());
    let c = &p.m.concrete;
    let pe_s = pe * cv.kf;
    let top = -pe / area + pe * e / st;
    let bottom = -pe / area - pe * e / sb;
    tr.rec(|| {
        Step::new(
            "cracking",
            tag(li, "ft_pe"),
            "Top fibre stress of the precast unit from the effective prestress alone",
            sy("f_(t,\"pe\")", "ft,pe"),
        )
        .formula(add(vec![neg(per(div(v(0), v(1)), cv.kf)), per(div(mul(vec![v(0), v(2)]), v(3)), cv.kf)]))
        .input(sy("P_e", "Pe"), pe_s, Unit::Force)
        .input(sy("A", "A"), area, Unit::Area)
        .input(sy("e", "e"), e, Unit::Length)
        .input(sy("S_t", "St"), st, Unit::Modulus)
        .result(top, Unit::Stress)
        .note(format!(
            "tension positive; no self-weight counted. {} fr = {} {}",
            if top > c.fr { "Exceeds" } else { "Does not exceed" },
            show(c.fr),
            p.sys.names().stress
        ))
    });
    PrestressAlone { top, bottom, top_cracks: top > c.fr, over_compressed: -bottom > c.fc }
}

/// The cracking moment (shown units), ACI 318-19 with the section moduli of the precast
/// unit and, for a topped member, of the transformed composite section; and whether the
/// precast unit cracks under the non-composite moment alone (before the topping acts).
pub(super) fn cracking(p: &Prepared, li: usize, pe: f64, e: f64, mnc: f64, tr: &mut Trace) -> (f64, bool) {
    let cv = p.cv;
    let sb = p.precast.sb();
    let fr = p.m.concrete.fr;
    let fpe = precompression(p, li, pe, e, tr);
    match (&p.composite, p.m.topping.as_ref()) {
        (Some(comp), Some(_)) => {
            let sbc = comp.sb();
            // the precast unit alone cracks under Mnc where Mnc / Sb > fr + fpe: the
            // composite formula then does not apply (the conclusion says so)
            let mnc_crack = sb * (fr + fpe);
            let cracked_first = mnc > mnc_crack;
            let mnc = mnc * cv.km;
            let mcr = sbc * (fr + fpe) / cv.s_div - mnc * (sbc / sb - 1.0);
            tr.rec(|| {
                Step::new("cracking", tag(li, "Mcr"), "Cracking moment of the composite member", sy("M_\"cr\"", "Mcr"))
                    .formula(sub(
                        per(mul(vec![v(0), add(vec![v(1), v(2)])]), cv.s_div),
                        mul(vec![v(3), sub(div(v(0), v(4)), n(1.0))]),
                    ))
                    .input(sy("S_(b c)", "Sbc"), sbc, Unit::Modulus)
                    .input(sy("f_r", "fr"), fr, Unit::Stress)
                    .input(sy("f_\"pe\"", "fpe"), fpe, Unit::Stress)
                    .input(sy("M_\"nc\"", "Mnc"), mnc, Unit::Moment)
                    .input(sy("S_b", "Sb"), sb, Unit::Modulus)
                    .result(mcr, Unit::Moment)
                    .clause(format!("{} (PCI Design Handbook form for composite members)", mcr_clauses(p)))
                    .note(if cracked_first {
                        "Mnc: moment on the precast unit before the topping acts. Mnc exceeds Sb (fr + fpe): the precast unit cracks before the topping acts, and this formula does not apply"
                    } else {
                        "Mnc: moment on the precast unit before the topping acts"
                    })
            });
            (mcr, cracked_first)
        }
        _ => {
            let mcr = sb * (fr + fpe) / cv.s_div;
            tr.rec(|| {
                Step::new("cracking", tag(li, "Mcr"), "Cracking moment", sy("M_\"cr\"", "Mcr"))
                    .formula(per(mul(vec![v(0), add(vec![v(1), v(2)])]), cv.s_div))
                    .input(sy("S_b", "Sb"), sb, Unit::Modulus)
                    .input(sy("f_r", "fr"), fr, Unit::Stress)
                    .input(sy("f_\"pe\"", "fpe"), fpe, Unit::Stress)
                    .result(mcr, Unit::Moment)
                    .clause(mcr_clauses(p))
            });
            (mcr, false)
        }
    }
}

/// The clauses the cracking moment's step cites: the minimum strength and Mcr.
fn mcr_clauses(p: &Prepared) -> String {
    format!(
        "{}, {}",
        p.basis.cite(Clause::MinimumStrength { slab: is_slab(p.m) }),
        p.basis.clause(Clause::CrackingMoment)
    )
}

/// The precompression at the bottom fibre of the precast unit from the prestress.
fn precompression(p: &Prepared, li: usize, pe: f64, e: f64, tr: &mut Trace) -> f64 {
    let cv = p.cv;
    let pc = &p.precast;
    let (area, sb) = (pc.area, pc.sb());
    let pe_s = pe * cv.kf;
    let fpe = pe / area + pe * e / sb;
    tr.rec(|| {
        Step::new(
            "cracking",
            tag(li, "fpe"),
            "Precompression at the bottom fibre from prestress",
            sy("f_\"pe\"", "fpe"),
        )
        .formula(add(vec![per(div(v(0), v(1)), cv.kf), per(div(mul(vec![v(0), v(2)]), v(3)), cv.kf)]))
        .input(sy("P_e", "Pe"), pe_s, Unit::Force)
        .input(sy("A", "A"), area, Unit::Area)
        .input(sy("e", "e"), e, Unit::Length)
        .input(sy("S_b", "Sb"), sb, Unit::Modulus)
        .result(fpe, Unit::Stress)
    });
    fpe
}

pub(super) fn minimum(p: &Prepared, li: usize, mcr: f64, phi_mn: f64, mu: f64, tr: &mut Trace) -> MinReinforcement {
    let slab = is_slab(p.m);
    let clause = p.basis.cite(Clause::MinimumStrength { slab });
    let waiver_clause = p.basis.cite(Clause::MinimumWaiver { slab });
    let (k_min, k_waive) = (p.basis.minimum_factor(), p.basis.waiver_factor());
    let required = k_min * mcr;
    let ok = phi_mn >= required;
    let waiver_flexure = phi_mn >= k_waive * mu;
    tr.rec(|| {
        Step::new("cracking", tag(li, "min"), "Minimum flexural strength required", sy("1.2 M_\"cr\"", "1.2Mcr"))
            .formula(mul(vec![n(k_min), v(0)]))
            .input(sy("M_\"cr\"", "Mcr"), mcr, Unit::Moment)
            .result(required, Unit::Moment)
            .clause(clause.clone())
            .note(if ok {
                format!("φMn = {} ≥ 1.2 Mcr: satisfied", show(phi_mn))
            } else if waiver_flexure {
                format!("φMn = {} < 1.2 Mcr, but φMn ≥ 2 Mu: {waiver_clause} may waive it if shear strength is also at least twice that required (not checked here)", show(phi_mn))
            } else {
                format!("φMn = {} < 1.2 Mcr and φMn < 2 Mu: not satisfied", show(phi_mn))
            })
    });
    MinReinforcement { clause, required, ok, waiver_flexure, waiver_clause }
}

/// The code's approximate fps (ACI 318-19 20.3.2.3.1), where it applies, and the
/// resulting Mn for comparison with strain compatibility.
pub(super) fn approximate(
    p: &Prepared,
    li: usize,
    st: &State,
    at: &[StrandAt],
    not_developed: bool,
    mn_sc: f64,
    tr: &mut Trace,
) -> Approximate {
    let (fpu, counted) = match applicability(p, st, at, not_developed) {
        Ok(f) => f,
        Err(r) => {
            tr.rec(|| {
                Step::new(
                    "approximate",
                    tag(li, "approx"),
                    format!("Approximate strand stress of the code ({})", p.basis.clause(Clause::ApproximateFps)),
                    sy("f_\"ps,approx\"", "fps,approx"),
                )
                .result(f64::NAN, Unit::Stress)
                .note(format!("not applicable: {r}"))
            });
            return Approximate::not_applicable(r);
        }
    };
    let inp = ApproxInputs::new(p, at, &counted, fpu);
    let full = inp.fps_at(inp.b, inp.aps);
    tr.rec(|| fps_step(p, li, &inp, "approx.fps", "Approximate strand stress at nominal strength", full));
    let block = Block::new(p, inp.fc, inp.h);
    let deeper = || Approximate::not_applicable("the stress block would be deeper than the section".into());
    let Some(a) = block.depth_for(inp.tension(full.fps)) else {
        return deeper();
    };
    // a flanged section whose block is deeper than the flange: overhangs and web
    let (fps, a, flanged) = match inp.bw {
        Some(bw) if a > inp.hf && bw < inp.b => {
            let web = web_portion(p, li, &inp, bw, full.fps, tr);
            match block.depth_for(inp.tension(web.fps)) {
                Some(a2) => (web.fps, a2, true),
                None => return deeper(),
            }
        }
        _ => (full.fps, a, false),
    };
    let (mn, diff) = nominal(p, li, &inp, &block, fps, a, mn_sc, tr);
    Approximate {
        applicable: true,
        reason: None,
        gamma_p: Some(inp.gamma_p),
        rho_p: Some(full.rho_p),
        fps: Some(fps),
        a: Some(a),
        flanged,
        mn: Some(mn),
        difference: Some(diff),
    }
}

/// Whether the approximate fps applies here: the strand's fpu and which layers count
/// (untensioned strand in the compression zone does not), or why it does not apply.
fn applicability(p: &Prepared, st: &State, at: &[StrandAt], not_developed: bool) -> Result<(f64, Vec<bool>), String> {
    let m = p.m;
    if m.strands.is_empty() {
        return Err("there is no prestressing steel".to_string());
    }
    if not_developed {
        return Err("strand is not fully developed at this location".to_string());
    }
    // untensioned strand in the compression zone is not prestressing steel: it is
    // left out like compression reinforcement (rho' = 0)
    let counted: Vec<bool> = m.strands.iter().zip(at).map(|(s, a)| !(s.fse == 0.0 && a.d <= st.c)).collect();
    for (i, ((s, a), keep)) in m.strands.iter().zip(at).zip(&counted).enumerate() {
        if !keep {
            continue;
        }
        if !a.active {
            return Err(format!("strand layer {} is debonded here", i + 1));
        }
        if s.fse < p.basis.approximate_min_fse() * s.fpu {
            return Err(format!(
                "fse of strand layer {} is below {} fpu ({})",
                i + 1,
                crate::trace::const_text(p.basis.approximate_min_fse()),
                p.basis.cite(Clause::ApproximateFps)
            ));
        }
        if a.d <= st.c {
            return Err(format!(
                "strand layer {} lies in the compression zone; the formula needs all prestressing steel in the tension zone",
                i + 1
            ));
        }
    }
    let mut grades = m.strands.iter().zip(&counted).filter(|(_, k)| **k).map(|(s, _)| s.fpu);
    let fpu = grades.next().ok_or_else(|| "there is no tensioned strand".to_string())?;
    if grades.any(|g| g != fpu) {
        return Err("the strand layers are of different grades".to_string());
    }
    Ok((fpu, counted))
}

/// What the approximate fps is computed from: the strand counted, the tension bars and
/// the compression face.
struct ApproxInputs {
    fpu: f64,
    gamma_p: f64,
    gamma_bound: &'static str,
    /// The least fse / fpu of the layers counted (the condition of 20.3.2.3.1).
    fse_ratio: f64,
    /// How many layers are left out (untensioned, in the compression zone).
    left_out: usize,
    aps: f64,
    dp: f64,
    /// Tension bars: their area, depth and least fy (all 0 without them).
    as_: f64,
    d_s: f64,
    fy: f64,
    /// f'c of the compression face, beta1 and the overall depth.
    fc: f64,
    b1: f64,
    h: f64,
    /// Width of the compression face, the flange's depth and the web's width (flanged).
    b: f64,
    hf: f64,
    bw: Option<f64>,
}

/// fps at a width with the strand area counted over it, and the ratios it rests on.
#[derive(Clone, Copy)]
struct FpsAt {
    width: f64,
    aps: f64,
    fps: f64,
    rho_p: f64,
    rho: f64,
}

impl ApproxInputs {
    fn new(p: &Prepared, at: &[StrandAt], counted: &[bool], fpu: f64) -> ApproxInputs {
        let m = p.m;
        let layers: Vec<(&StrandLayer, &StrandAt)> =
            m.strands.iter().zip(at).zip(counted).filter(|(_, k)| **k).map(|(x, _)| x).collect();
        let left_out = counted.iter().filter(|k| !**k).count();
        let ratio = layers.iter().map(|(s, _)| s.fpy / s.fpu).fold(f64::INFINITY, f64::min);
        let fse_ratio = layers.iter().map(|(s, _)| s.fse / s.fpu).fold(f64::INFINITY, f64::min);
        let (gamma_p, gamma_bound) = p.basis.gamma_p(ratio);
        let aps: f64 = layers.iter().map(|(s, _)| s.total_area()).sum();
        let dp = layers.iter().map(|(s, a)| s.total_area() * a.d).sum::<f64>() / aps;
        // tension bars: below mid-depth; compression bars are not counted (rho' = 0, always
        // permitted and conservative)
        let h = m.total_height();
        let tb: Vec<_> = m.bars.iter().filter(|b| b.depth + p.t > h / 2.0).collect();
        let as_: f64 = tb.iter().map(|b| b.total_area()).sum();
        let d_s = if as_ > 0.0 { tb.iter().map(|b| b.total_area() * (b.depth + p.t)).sum::<f64>() / as_ } else { 0.0 };
        let fy = tb.iter().map(|b| b.fy).fold(f64::INFINITY, f64::min);
        let fy = if fy.is_finite() { fy } else { 0.0 };
        let (b, hf, bw) = match (&m.topping, m.shape.flange()) {
            (Some(t), Some(f)) => (t.width, t.thickness + f.hf, Some(f.bw)),
            (Some(t), None) => (t.width, t.thickness, None),
            (None, Some(f)) => (f.b, f.hf, Some(f.bw)),
            (None, None) => {
                let top = m.region.y_top();
                (m.region.width_at(top - 1e-9 * h), h, None)
            }
        };
        let (fc, b1) = (p.fc_top, p.beta1);
        ApproxInputs { fpu, gamma_p, gamma_bound, fse_ratio, left_out, aps, dp, as_, d_s, fy, fc, b1, h, b, hf, bw }
    }

    /// fps of 20.3.2.3.1 with rho_p = aps / (width dp).
    fn fps_at(&self, width: f64, aps: f64) -> FpsAt {
        let (fpu, fc) = (self.fpu, self.fc);
        let rho_p = aps / (width * self.dp);
        let rho = if self.as_ > 0.0 { self.as_ / (width * self.d_s) } else { 0.0 };
        let bracket = rho_p * fpu / fc + if self.as_ > 0.0 { self.d_s / self.dp * self.fy / fc * rho } else { 0.0 };
        FpsAt { width, aps, fps: fpu * (1.0 - self.gamma_p / self.b1 * bracket), rho_p, rho }
    }

    /// The tension the block balances: Aps fps + As fy.
    fn tension(&self, fps: f64) -> f64 {
        self.aps * fps + self.as_ * self.fy
    }
}

fn fps_step(p: &Prepared, li: usize, inp: &ApproxInputs, id: &str, title: &str, at: FpsAt) -> Step {
    let mut stp = Step::new("approximate", tag(li, id), title.to_string(), sy("f_\"ps\"", "fps"))
        .input(sy("f_\"pu\"", "fpu"), inp.fpu, Unit::Stress)
        .input(sy("gamma_p", "gamma_p"), inp.gamma_p, Unit::Ratio)
        .input(sy("beta_1", "beta1"), inp.b1, Unit::Ratio)
        .input(sy("rho_p", "rho_p"), at.rho_p, Unit::Ratio)
        .input(sy("f'_c", "f'c"), inp.fc, Unit::Stress)
        .clause(p.basis.cite(Clause::ApproximateFps));
    let mut bracket = vec![div(mul(vec![v(3), v(0)]), v(4))];
    if inp.as_ > 0.0 {
        stp = stp
            .input(sy("d", "d"), inp.d_s, Unit::Length)
            .input(sy("d_p", "dp"), inp.dp, Unit::Length)
            .input(sy("f_y", "fy"), inp.fy, Unit::Stress)
            .input(sy("rho", "rho"), at.rho, Unit::Ratio);
        bracket.push(mul(vec![div(v(5), v(6)), div(v(7), v(4)), v(8)]));
    }
    let bracket = if bracket.len() == 1 { bracket.remove(0) } else { add(bracket) };
    let formula = mul(vec![v(0), sub(n(1.0), mul(vec![div(v(1), v(2)), bracket]))]);
    stp.formula(formula).result(at.fps, Unit::Stress).note(format!(
        "applies: fse ≥ {} fpu in every layer (least fse/fpu = {}); γp = {} for fpy/fpu ≥ {}; ρp = Aps/(b dp) with b = {} and Aps = {}; compression steel not counted (ρ' = 0){}",
        crate::trace::const_text(p.basis.approximate_min_fse()),
        show(inp.fse_ratio),
        inp.gamma_p,
        inp.gamma_bound,
        show(at.width),
        show(at.aps),
        if inp.left_out > 0 { ", nor untensioned strand in the compression zone" } else { "" }
    ))
}

/// The overhang-plus-web procedure (PCI Design Handbook) where the block is deeper than
/// the flange: the strand area Apf balancing the overhangs, and fps of the web portion.
fn web_portion(p: &Prepared, li: usize, inp: &ApproxInputs, bw: f64, fps: f64, tr: &mut Trace) -> FpsAt {
    let (fc, b, hf) = (inp.fc, inp.b, inp.hf);
    let apf = 0.85 * fc * (b - bw) * hf / fps;
    let apw = (inp.aps - apf).max(0.0);
    let web = inp.fps_at(bw, apw);
    tr.rec(|| {
        Step::new(
            "approximate",
            tag(li, "approx.Apf"),
            "Strand area balancing the flange overhangs",
            sy("A_\"pf\"", "Apf"),
        )
        .formula(div(mul(vec![n(0.85), v(0), sub(v(1), v(2)), v(3)]), v(4)))
        .input(sy("f'_c", "f'c"), fc, Unit::Stress)
        .input(sy("b", "b"), b, Unit::Length)
        .input(sy("b_w", "bw"), bw, Unit::Length)
        .input(sy("h_f", "hf"), hf, Unit::Length)
        .input(sy("f_\"ps\"", "fps"), fps, Unit::Stress)
        .result(apf, Unit::Area)
        .note("the block is deeper than the flange: overhang-plus-web procedure (PCI Design Handbook)")
    });
    let title = "Approximate strand stress, web portion (ρp = Apw / (bw dp))";
    tr.rec(|| fps_step(p, li, inp, "approx.fps_web", title, web));
    web
}

/// The block of the approximate method, its depth from the section outline (topping
/// and precast unit) with the compression-face f'c.
struct Block<'a> {
    parts: Vec<&'a Region>,
    top: f64,
    fc: f64,
    h: f64,
}

impl<'a> Block<'a> {
    fn new(p: &'a Prepared, fc: f64, h: f64) -> Block<'a> {
        let parts: Vec<&Region> = match &p.topping_region {
            Some(t) => vec![t, &p.m.region],
            None => vec![&p.m.region],
        };
        Block { parts, top: p.top, fc, h }
    }

    fn area_above(&self, a: f64) -> f64 {
        self.parts.iter().map(|r| r.above(self.top - a).area).sum::<f64>()
    }

    /// The block depth whose concrete, at 0.85 f'c, balances the tension t (none where
    /// the whole section would not).
    fn depth_for(&self, t: f64) -> Option<f64> {
        let h = self.h;
        let need = t / (0.85 * self.fc);
        let g = |a: f64| self.area_above(a) - need;
        let (g0, gh) = (g(0.0), g(h));
        if gh < 0.0 {
            return None;
        }
        super::roots::brent(g, 0.0, h, g0, gh, 1e-13 * h, 1e-12 * need)
    }

    /// Depth of the centroid of the concrete within a block of depth a.
    fn centroid_depth(&self, a: f64) -> f64 {
        let ab = self.area_above(a);
        let q: f64 = self.parts.iter().map(|r| r.above(self.top - a).qx).sum();
        self.top - q / ab
    }
}

/// Mn with the approximate fps and its difference (per cent) from strain compatibility's.
#[allow(clippy::too_many_arguments)]
fn nominal(
    p: &Prepared,
    li: usize,
    inp: &ApproxInputs,
    block: &Block,
    fps: f64,
    a: f64,
    mn_sc: f64,
    tr: &mut Trace,
) -> (f64, f64) {
    let (aps, dp, as_, fy, d_s) = (inp.aps, inp.dp, inp.as_, inp.fy, inp.d_s);
    let dc = block.centroid_depth(a);
    let mn = (aps * fps * (dp - dc) + as_ * fy * (d_s - dc)) * p.cv.km;
    let diff = (mn - mn_sc) / mn_sc * 100.0;
    tr.rec(|| {
        Step::new("approximate", tag(li, "approx.a"), "Block depth with the approximate fps", sy("a", "a"))
            .result(a, Unit::Length)
            .note("from the section outline: 0.85 f'c times the concrete area within a balances Aps fps + As fy")
    });
    tr.rec(|| {
        let mut stp = Step::new(
            "approximate",
            tag(li, "approx.Mn"),
            "Nominal strength with the approximate fps",
            sy("M_(n,\"approx\")", "Mn,approx"),
        )
        .input(sy("A_\"ps\"", "Aps"), aps, Unit::Area)
        .input(sy("f_\"ps\"", "fps"), fps, Unit::Stress)
        .input(sy("d_p", "dp"), dp, Unit::Length)
        .input(sy("d_C", "dC"), dc, Unit::Length);
        let mut terms = vec![mul(vec![v(0), v(1), sub(v(2), v(3))])];
        if as_ > 0.0 {
            stp = stp.input(sy("A_s", "As"), as_, Unit::Area).input(sy("f_y", "fy"), fy, Unit::Stress).input(
                sy("d", "d"),
                d_s,
                Unit::Length,
            );
            terms.push(mul(vec![v(4), v(5), sub(v(6), v(3))]));
        }
        stp.formula(per(add(terms), p.cv.s_div)).result(mn, Unit::Moment)
    });
    tr.rec(|| {
        Step::new("approximate", tag(li, "approx.diff"), "Difference from strain compatibility", sy("Delta", "diff"))
            .formula(mul(vec![div(sub(v(0), v(1)), v(1)), n(100.0)]))
            .input(sy("M_(n,\"approx\")", "Mn,approx"), mn, Unit::Moment)
            .input(sy("M_n", "Mn"), mn_sc, Unit::Moment)
            .result(diff, Unit::Percent)
    });
    (mn, diff)
}
