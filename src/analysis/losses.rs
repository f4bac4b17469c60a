//! Prestress losses computed by the method of Zia et al. (1979), as given in the PCI
//! Design Handbook, for the strand layers that give their jacking stress alone. Once
//! per member, at the middle of its length (the section of the largest self-weight
//! moment of a member whose bearings sit alike at both ends): elastic shortening,
//! creep, shrinkage and relaxation, each a recorded step; then each layer's fse (used
//! by strength at every section) and its stress just after release, fpi.
//!
//! The coefficients are the method's for pretensioned members. Kes = 1.0 is from a
//! stored copy of the paper; the other coefficients (Kcir, Kcr, Ksh, the shrinkage
//! constants) and the values of its tables (Kre, J, C) are recalled from memory and say
//! so where they are shown.

use super::demand::Demand;
use super::prepare::Prepared;
use super::{sy, sym_k};
use crate::basis::Clause;
use crate::error::{Error, Result};
use crate::input::model::{Along, EcSource, FseSource, LoadKind, Member};
use crate::material::strand::Grade;
use crate::trace::{Step, Symbol, Trace, Unit, f::*};
use crate::units::System;
use serde::Serialize;

/// The method's name, as cited beside each step.
pub const SOURCE: &str = "Zia et al. (1979), as given in the PCI Design Handbook";
/// Kes, pretensioned members.
const KES: f64 = 1.0;
/// Kcir, pretensioned members.
const KCIR: f64 = 0.9;
/// Ksh, pretensioned members.
const KSH: f64 = 1.0;

/// The relaxation factor C of low-relaxation strand by fpi/fpu (the method's table,
/// from memory): 0.60 to 0.80 by 0.01.
const C_TABLE: [f64; 21] = [
    0.33, 0.37, 0.41, 0.45, 0.49, 0.53, 0.57, 0.61, 0.66, 0.70, 0.75, 0.80, 0.85, 0.90, 0.95, 1.00, 1.05, 1.11, 1.16,
    1.22, 1.28,
];

/// C at fpi/fpu = r, by linear interpolation in the table (r within 0.60 to 0.80, as
/// the input's validation holds).
pub fn relaxation_c(r: f64) -> f64 {
    let t = ((r - 0.60) / 0.01).clamp(0.0, 20.0);
    let i = (t.floor() as usize).min(19);
    C_TABLE[i] + (C_TABLE[i + 1] - C_TABLE[i]) * (t - i as f64)
}

/// Kre (in the package's stress unit) and J of low-relaxation strand of a grade (the
/// method's table, from memory: 5000 psi and 0.040 for Grade 270, 4630 psi and 0.037
/// for Grade 250; 34.5 and 31.9 MPa).
pub fn kre_j(grade: Grade, sys: System) -> (f64, f64) {
    match (grade, sys) {
        (Grade::G270, System::Us) => (5.0, 0.040),
        (Grade::G250, System::Us) => (4.63, 0.037),
        (Grade::G270, System::Si) => (34.5, 0.040),
        (Grade::G250, System::Si) => (31.9, 0.037),
    }
}

/// One layer's computed losses, in the package's stress unit.
#[derive(Debug, Clone, Serialize)]
pub struct LayerLosses {
    pub layer: usize,
    pub fpj: f64,
    pub es: f64,
    pub cr: f64,
    pub sh: f64,
    /// The relaxation factor C.
    pub c: f64,
    pub re: f64,
    pub total: f64,
    pub fse: f64,
    /// The stress just after release: fpj less elastic shortening.
    pub fpi: f64,
}

/// The member's loss computation (shown units: stress, force, moment, length).
#[derive(Debug, Clone, Serialize)]
pub struct Losses {
    pub method: &'static str,
    /// The section the losses are computed at, from the left end.
    pub x: f64,
    pub eci: f64,
    pub pi: f64,
    pub e: f64,
    pub mg: f64,
    pub fcir: f64,
    pub fcds: f64,
    pub volume_to_surface: f64,
    pub relative_humidity: f64,
    pub kcr: f64,
    /// Each computed layer (reported per layer in the member's `prestress`).
    #[serde(skip)]
    pub layers: Vec<LayerLosses>,
}

fn step(id: &str, title: &str, symbol: Symbol) -> Step {
    Step::new("losses", format!("losses.{id}"), title.to_string(), symbol)
}

/// The perimeter of the precast section: its outline and its voids.
fn perimeter(m: &Member) -> f64 {
    m.region
        .rings()
        .map(|ring| {
            ring.iter().zip(ring.iter().cycle().skip(1)).map(|(a, b)| (b[0] - a[0]).hypot(b[1] - a[1])).sum::<f64>()
        })
        .sum()
}

/// What the layers' losses share: the concrete stresses at the strands, V/S, RH, Kcr
/// and Eci.
#[derive(Clone, Copy)]
struct Shared {
    fcir: f64,
    fcds: f64,
    vs: f64,
    rh: f64,
    kcr: f64,
    eci: f64,
}

/// A layer at the loss section: its index, fpj, Aps and distance below the precast
/// centroid.
type LayerAt = (usize, f64, f64, f64);

/// The strands at the loss section just before release: each layer, the force Pi and
/// its eccentricity e.
fn before_release(p: &Prepared, along: Option<Along>) -> (Vec<LayerAt>, f64, f64) {
    let layers: Vec<LayerAt> =
        p.m.strands
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let fpj = match s.fse_source {
                    FseSource::Computed { fpj, .. } | FseSource::Losses { fpj, .. } => fpj,
                    FseSource::Given => s.fse,
                };
                let y = p.top_p - s.profile.depth_at(along);
                (i, fpj, s.total_area(), p.precast.yc - y)
            })
            .collect();
    let pi: f64 = layers.iter().map(|(_, f, a, _)| f * a).sum();
    let e = layers.iter().map(|(_, f, a, y)| f * a * y).sum::<f64>() / pi;
    (layers, pi, e)
}

/// The unfactored dead-load moments at x: the self-weight (acting at release), the
/// topping on the precast unit (unshored), and the other dead loads after release
/// (the topping of shored construction among them).
fn dead_moments(d: &Demand, x: f64) -> (f64, f64, f64) {
    let (mut mg, mut m_top, mut m_sd) = (0.0, 0.0, 0.0);
    for u in d.uniform.iter().filter(|u| u.kind == LoadKind::Dead) {
        let mx = d.uniform_moment(u.w, x);
        match (u.source.as_str(), u.precast_only) {
            ("self-weight", _) => mg += mx,
            (_, true) => m_top += mx,
            (_, false) => m_sd += mx,
        }
    }
    m_sd += d.points.iter().filter(|q| q.kind == LoadKind::Dead).map(|q| d.point_moment(q.p, q.x, x)).sum::<f64>();
    (mg, m_top, m_sd)
}

/// fcds, with the composite section's eccentricity and inertia it used (the precast
/// section's without a topping).
fn fcds_of(p: &Prepared, e: f64, m_top: f64, m_sd: f64) -> (f64, f64, f64) {
    let i = p.precast.i;
    match &p.composite {
        Some(c) => {
            let y = p.precast.yc - e;
            (m_top * e / i + m_sd * (c.yc - y) / c.i, c.yc - y, c.i)
        }
        None => ((m_top + m_sd) * e / i, e, i),
    }
}

/// One layer's losses by the method.
fn layer_losses(p: &Prepared, i: usize, fpj: f64, jacking: f64, sh_: Shared) -> LayerLosses {
    let s = &p.m.strands[i];
    let eps = p.curves[i].eps_modulus;
    let Shared { fcir, fcds, vs, rh, kcr, eci } = sh_;
    let es = KES * eps * fcir / eci;
    let cr = (kcr * eps / p.m.concrete.ec * (fcir - fcds)).max(0.0);
    let sh = (8.2e-6 * KSH * eps * (1.0 - vs_factor(p.sys) * vs) * (100.0 - rh)).max(0.0);
    let c = relaxation_c(jacking);
    let (kre, j) = kre_j(s.grade, p.sys);
    let re = ((kre - j * (sh + cr + es)) * c).max(0.0);
    let total = es + cr + sh + re;
    LayerLosses { layer: i + 1, fpj, es, cr, sh, c, re, total, fse: fpj - total, fpi: fpj - es }
}

/// The shrinkage term's factor on V/S: 0.06 per in, 0.0024 per mm.
fn vs_factor(sys: System) -> f64 {
    match sys {
        System::Us => 0.06,
        System::Si => 0.0024,
    }
}

/// The losses of the member's computed layers, and the member with each such layer's
/// fse filled in.
pub(super) fn compute(p: &Prepared, d: &Demand, tr: &mut Trace) -> Result<(Member, Losses)> {
    let m = p.m;
    let fail = |message: String| Error::Analysis { member: m.id.clone(), location: String::new(), message };
    let (Some(rel), Some(method)) = (m.release, m.losses) else {
        return Err(fail("computed losses need fci and [member.losses] (the input's validation requires both)".into()));
    };
    let (sys, cv) = (p.sys, p.cv);
    let x = d.length / 2.0;
    record_eci(p, &rel, tr);
    let (layers, pi, e) = before_release(p, Some(Along { x, length: d.length }));
    tr.rec(|| pi_step(p, pi));
    tr.rec(|| e_step(p, x, e));
    let (mg, m_top, m_sd) = dead_moments(d, x);
    tr.rec(|| mg_step(p, d, x, mg));
    let (a, i) = (p.precast.area, p.precast.i);
    let fcir = KCIR * (pi / a + pi * e * e / i) - mg * e / i;
    tr.rec(|| fcir_step(p, pi, e, mg, fcir));
    // the method estimates the losses of a member in compression at its strands
    if fcir.is_nan() || fcir <= 0.0 {
        return Err(fail(format!(
            "the concrete at the strands is not in compression just after release (fcir = {} {} at x = {} {}): the loss method does not apply; give fse or losses",
            crate::trace::show(fcir),
            sys.names().stress,
            crate::trace::show(x),
            sys.names().length
        )));
    }
    let (fcds, e_c, i_c) = fcds_of(p, e, m_top, m_sd);
    tr.rec(|| fcds_step(p, m_top, m_sd, e, e_c, i_c, fcds));
    let vs = method.volume_to_surface.unwrap_or(a / perimeter(m));
    tr.rec(|| vs_step(p, method.volume_to_surface, vs));
    let kcr = if m.concrete.lambda < 1.0 { 1.6 } else { 2.0 };
    let shared = Shared { fcir, fcds, vs, rh: method.relative_humidity, kcr, eci: rel.eci };
    let mut out = m.clone();
    let mut results = Vec::new();
    for &(i, fpj, _, _) in &layers {
        let FseSource::Computed { jacking, .. } = m.strands[i].fse_source else { continue };
        let l = layer_losses(p, i, fpj, jacking, shared);
        if l.fse.is_nan() || l.fse <= 0.0 {
            return Err(fail(format!(
                "strand layer {}: the computed losses ({} {}) are not less than the jacking stress ({} {})",
                l.layer,
                crate::trace::show(l.total),
                sys.names().stress,
                crate::trace::show(fpj),
                sys.names().stress
            )));
        }
        record_layer(p, &m.strands[i], jacking, &l, shared, tr);
        out.strands[i].fse = l.fse;
        out.strands[i].fpi = Some(l.fpi);
        results.push(l);
    }
    tr.rec(|| pe_step(p, &out));
    let losses = Losses {
        method: "zia-1979",
        x,
        eci: rel.eci,
        pi: pi * cv.kf,
        e,
        mg: mg * cv.km,
        fcir,
        fcds,
        volume_to_surface: vs,
        relative_humidity: method.relative_humidity,
        kcr,
        layers: results,
    };
    Ok((out, losses))
}

fn pi_step(p: &Prepared, pi: f64) -> Step {
    step("pi", "Prestress force just before release", sy("P_i", "Pi"))
        .result(pi * p.cv.kf, Unit::Force)
        .note("Σ fpj Aps of the layers: the jacking stress, no loss before release taken apart (the method's relaxation is the whole)")
}

fn e_step(p: &Prepared, x: f64, e: f64) -> Step {
    step("e", "Eccentricity of the strands below the precast centroid", sy("e", "e")).result(e, Unit::Length).note(
        format!(
            "at x = {} {} (the middle of the member's length), weighted by fpj Aps",
            crate::trace::show(x),
            p.sys.names().length
        ),
    )
}

fn mg_step(p: &Prepared, d: &Demand, x: f64, mg: f64) -> Step {
    let w_sw: f64 = d.uniform.iter().filter(|u| u.source == "self-weight").map(|u| u.w).sum();
    let st = step("mg", "Self-weight moment at the section", sy("M_g", "Mg")).input(
        sy("w_\"sw\"", "wsw"),
        super::demand::line_shown(p.sys, w_sw),
        Unit::LineLoad,
    );
    let (st, term) = super::demand::uniform_term(st, d, x, p.sys);
    st.formula(term).result(mg * p.cv.km, Unit::Moment).note("the self-weight of the precast unit at the middle of the length, taken on the span between the bearings (in the bed the member spans its whole length: a larger Mg there, smaller losses; the smaller Mg here gives the larger losses)")
}

fn vs_step(p: &Prepared, given: Option<f64>, vs: f64) -> Step {
    let st = step("vs", "Volume to surface ratio", sy("V/S", "V/S"));
    match given {
        Some(v) => st.result(v, Unit::Length).note("given in the input"),
        None => st
            .formula(div(v(0), v(1)))
            .input(sy("A", "A"), p.precast.area, Unit::Area)
            .input(sy("p", "perimeter"), perimeter(p.m), Unit::Length)
            .result(vs, Unit::Length)
            .note("the precast section's area over its perimeter (the outline and any voids), per unit length"),
    }
}

/// The effective force of the member, every layer fully transferred.
fn pe_step(p: &Prepared, out: &Member) -> Step {
    let mut st = step("pe", "Effective prestress force (fully transferred)", sy("P_e", "Pe"));
    let mut terms = Vec::new();
    for (i, s) in out.strands.iter().enumerate() {
        let j = st.inputs.len();
        st = st.input(sym_k("f", "\"se\"", "fse", i + 1), s.fse, Unit::Stress).input(
            sym_k("A", "\"ps\"", "Aps", i + 1),
            s.total_area(),
            Unit::Area,
        );
        terms.push(mul(vec![v(j), v(j + 1)]));
    }
    let pe: f64 = out.strands.iter().map(|s| s.fse * s.total_area()).sum();
    st.formula(per(add(terms), 1.0 / p.cv.f_div))
        .result(pe * p.cv.kf, Unit::Force)
        .note("beyond the transfer lengths; a section within one works its own")
}

/// Eci: given, or by the basis's rule for Ec at f'ci.
fn record_eci(p: &Prepared, rel: &crate::input::model::Release, tr: &mut Trace) {
    let sym = sy("E_(c i)", "Eci");
    let title = "Modulus of elasticity at release";
    let (_, root) = p.basis.fc_root(rel.fci);
    let fci_sym = match p.sys {
        System::Us => sy("f'_(c i)", "f'ci [psi]"),
        System::Si => sy("f'_(c i)", "f'ci"),
    };
    tr.rec(|| match rel.eci_source {
        EcSource::Given => step("eci", title, sym).result(rel.eci, Unit::Stress).note("given in the input"),
        EcSource::Normalweight => {
            let b = p.basis.ec_normalweight(rel.fci);
            step("eci", title, sym)
                .formula(b.formula)
                .input(fci_sym, root, Unit::Ratio)
                .result(rel.eci, Unit::Stress)
                .clause(p.basis.cite(Clause::EcNormalweight))
                .note(format!(
                    "the rule for Ec at f'ci = {} {}; {}",
                    crate::trace::show(rel.fci),
                    p.sys.names().stress,
                    b.note
                ))
        }
        EcSource::Density { wc } => {
            let b = p.basis.ec_density(rel.fci, wc);
            step("eci", title, sym)
                .formula(b.formula)
                .input(fci_sym, root, Unit::Ratio)
                .input(sy("w_c", "wc"), wc, Unit::Ratio)
                .result(rel.eci, Unit::Stress)
                .clause(p.basis.cite(Clause::EcDensity))
                .note(format!(
                    "the rule for Ec at f'ci = {} {}; {}",
                    crate::trace::show(rel.fci),
                    p.sys.names().stress,
                    b.note
                ))
        }
    });
}

/// fcir = Kcir (Pi/A + Pi e²/I) - Mg e / I, in shown units.
fn fcir_step(p: &Prepared, pi: f64, e: f64, mg: f64, fcir: f64) -> Step {
    let cv = p.cv;
    step("fcir", "Concrete stress at the centroid of the strands just after release", sy("f_(c i r)", "fcir"))
        .formula(sub(
            mul(vec![n(KCIR), add(vec![div(per(v(0), 1.0 / cv.f_div), v(1)), div(mul(vec![per(v(0), 1.0 / cv.f_div), pow(v(2), n(2.0))]), v(3))])]),
            div(mul(vec![per(v(4), 1.0 / cv.s_div), v(2)]), v(3)),
        ))
        .input(sy("P_i", "Pi"), pi * cv.kf, Unit::Force)
        .input(sy("A", "A"), p.precast.area, Unit::Area)
        .input(sy("e", "e"), e, Unit::Length)
        .input(sy("I", "I"), p.precast.i, Unit::Inertia)
        .input(sy("M_g", "Mg"), mg * cv.km, Unit::Moment)
        .result(fcir, Unit::Stress)
        .clause(SOURCE)
        .note("Kcir = 0.9 for pretensioned members (from memory); Mg: the self-weight moment at this section, on the precast section; compression positive")
}

/// fcds: the dead loads applied after release, at the strands.
#[allow(clippy::too_many_arguments)]
fn fcds_step(p: &Prepared, m_top: f64, m_sd: f64, e: f64, e_c: f64, i_c: f64, fcds: f64) -> Step {
    let cv = p.cv;
    let st = step(
        "fcds",
        "Concrete stress at the centroid of the strands from the dead load after release",
        sy("f_(c d s)", "fcds"),
    );
    match &p.composite {
        Some(_) => st
            .formula(add(vec![
                div(mul(vec![per(v(0), 1.0 / cv.s_div), v(1)]), v(2)),
                div(mul(vec![per(v(3), 1.0 / cv.s_div), v(4)]), v(5)),
            ]))
            .input(sy("M_\"top\"", "Mtop"), m_top * cv.km, Unit::Moment)
            .input(sy("e", "e"), e, Unit::Length)
            .input(sy("I", "I"), p.precast.i, Unit::Inertia)
            .input(sy("M_\"sd\"", "Msd"), m_sd * cv.km, Unit::Moment)
            .input(sy("e_c", "ec"), e_c, Unit::Length)
            .input(sy("I_c", "Ic"), i_c, Unit::Inertia)
            .result(fcds, Unit::Stress)
            .clause(SOURCE)
            .note("Mtop: the topping's weight on the precast section (0 where shored); Msd: the other dead loads on the composite section, ec the strands' distance below its centroid"),
        None => st
            .formula(div(mul(vec![per(add(vec![v(0), v(1)]), 1.0 / cv.s_div), v(2)]), v(3)))
            .input(sy("M_\"top\"", "Mtop"), m_top * cv.km, Unit::Moment)
            .input(sy("M_\"sd\"", "Msd"), m_sd * cv.km, Unit::Moment)
            .input(sy("e", "e"), e, Unit::Length)
            .input(sy("I", "I"), p.precast.i, Unit::Inertia)
            .result(fcds, Unit::Stress)
            .clause(SOURCE)
            .note("the superimposed dead loads at this section, on the precast section"),
    }
}

/// A layer's losses: fpj, ES, CR, SH, C, RE, the total, fse and fpi, each a step.
fn record_layer(
    p: &Prepared,
    s: &crate::input::model::StrandLayer,
    jacking: f64,
    l: &LayerLosses,
    sh: Shared,
    tr: &mut Trace,
) {
    tr.rec(|| fpj_step(p, s, jacking, l));
    tr.rec(|| es_step(p, l, sh));
    tr.rec(|| cr_step(p, l, sh));
    tr.rec(|| sh_step(p, l, sh));
    tr.rec(|| c_step(l, jacking));
    tr.rec(|| re_step(p, s, l));
    tr.rec(|| total_step(l));
    tr.rec(|| fse_step(l));
    tr.rec(|| fpi_step(l));
}

/// The layer's symbols: ΔfES,k and the like.
fn loss_sym(part: &'static str, plain: &'static str, k: usize) -> Symbol {
    sym_k("Delta f", part, plain, k)
}

fn layer_step(what: &str, k: usize, title: &str, symbol: Symbol) -> Step {
    step(&format!("{what}.{k}"), &format!("{title}, layer {k}"), symbol)
}

fn eps_of(p: &Prepared, l: &LayerLosses) -> f64 {
    p.curves[l.layer - 1].eps_modulus
}

fn fpj_step(p: &Prepared, s: &crate::input::model::StrandLayer, jacking: f64, l: &LayerLosses) -> Step {
    let k = l.layer;
    Step::new(
        "losses",
        format!("prestress.fpj.{k}"),
        format!("Jacking stress, layer {k}"),
        sym_k("f", "\"pj\"", "fpj", k),
    )
    .formula(mul(vec![v(0), v(1)]))
    .input(sy("f_\"pj\" / f_\"pu\"", "fpj/fpu"), jacking, Unit::Ratio)
    .input(sy("f_\"pu\"", "fpu"), s.fpu, Unit::Stress)
    .result(l.fpj, Unit::Stress)
    .clause(format!("{} (limit {})", p.basis.cite(Clause::JackingLimit), p.basis.jacking_limit_text()))
}

fn es_step(p: &Prepared, l: &LayerLosses, sh: Shared) -> Step {
    layer_step("es", l.layer, "Elastic shortening", loss_sym("\"ES\"", "ES", l.layer))
        .formula(div(mul(vec![n(KES), v(0), v(1)]), v(2)))
        .input(sy("E_\"ps\"", "Eps"), eps_of(p, l), Unit::Stress)
        .input(sy("f_(c i r)", "fcir"), sh.fcir, Unit::Stress)
        .input(sy("E_(c i)", "Eci"), sh.eci, Unit::Stress)
        .result(l.es, Unit::Stress)
        .clause(SOURCE)
        .note("Kes = 1.0 for pretensioned members")
}

fn cr_step(p: &Prepared, l: &LayerLosses, sh: Shared) -> Step {
    layer_step("cr", l.layer, "Creep", loss_sym("\"CR\"", "CR", l.layer))
        .formula(max(vec![mul(vec![n(sh.kcr), div(v(0), v(1)), sub(v(2), v(3))]), n(0.0)]))
        .input(sy("E_\"ps\"", "Eps"), eps_of(p, l), Unit::Stress)
        .input(sy("E_c", "Ec"), p.m.concrete.ec, Unit::Stress)
        .input(sy("f_(c i r)", "fcir"), sh.fcir, Unit::Stress)
        .input(sy("f_(c d s)", "fcds"), sh.fcds, Unit::Stress)
        .result(l.cr, Unit::Stress)
        .clause(SOURCE)
        .note(if sh.kcr < 2.0 {
            "Kcr = 1.6 for sand-lightweight concrete (λ below 1, at least 0.85), from memory; not less than 0"
        } else {
            "Kcr = 2.0 for normalweight concrete, pretensioned (from memory); not less than 0"
        })
}

fn sh_step(p: &Prepared, l: &LayerLosses, sh: Shared) -> Step {
    let factor = vs_factor(p.sys);
    layer_step("sh", l.layer, "Shrinkage", loss_sym("\"SH\"", "SH", l.layer))
        .formula(max(vec![
            mul(vec![n(8.2e-6 * KSH), v(0), sub(n(1.0), mul(vec![n(factor), v(1)])), sub(n(100.0), v(2))]),
            n(0.0),
        ]))
        .input(sy("E_\"ps\"", "Eps"), eps_of(p, l), Unit::Stress)
        .input(sy("V/S", "V/S"), sh.vs, Unit::Length)
        .input(sy("R H", "RH"), sh.rh, Unit::Ratio)
        .result(l.sh, Unit::Stress)
        .clause(SOURCE)
        .note(match p.sys {
            System::Us => "Ksh = 1.0 for pretensioned members, 8.2 × 10⁻⁶ and 0.06 (from memory); V/S in in, RH in per cent; not less than 0",
            System::Si => {
                "Ksh = 1.0 for pretensioned members, 8.2 × 10⁻⁶ (from memory); V/S in mm (0.0024 per mm for 0.06 per in), RH in per cent; not less than 0"
            }
        })
}

fn c_step(l: &LayerLosses, jacking: f64) -> Step {
    layer_step("c", l.layer, "Relaxation factor", sym_k("C", "", "C", l.layer)).result(l.c, Unit::Ratio).clause(SOURCE).note(
        format!(
            "the method's table for low-relaxation steel, its ratio of the initial stress to fpu taken at the jacking stress, fpj/fpu = {}, interpolated linearly (table values from memory)",
            crate::trace::show(jacking)
        ),
    )
}

fn re_step(p: &Prepared, s: &crate::input::model::StrandLayer, l: &LayerLosses) -> Step {
    let k = l.layer;
    let (kre, j) = kre_j(s.grade, p.sys);
    let steel = match s.grade {
        Grade::G270 => "Grade 270 low-relaxation strand",
        Grade::G250 => "Grade 250 low-relaxation steel (the method's row is for wire; taken here for strand)",
    };
    layer_step("re", k, "Relaxation", loss_sym("\"RE\"", "RE", k))
        .formula(max(vec![mul(vec![sub(n(kre), mul(vec![n(j), add(vec![v(0), v(1), v(2)])])), v(3)]), n(0.0)]))
        .input(loss_sym("\"SH\"", "SH", k), l.sh, Unit::Stress)
        .input(loss_sym("\"CR\"", "CR", k), l.cr, Unit::Stress)
        .input(loss_sym("\"ES\"", "ES", k), l.es, Unit::Stress)
        .input(sym_k("C", "", "C", k), l.c, Unit::Ratio)
        .result(l.re, Unit::Stress)
        .clause(SOURCE)
        .note(format!(
            "{steel}: Kre = {} {}, J = {} (the method's table, from memory); not less than 0",
            crate::trace::show(kre),
            p.sys.names().stress,
            crate::trace::show(j)
        ))
}

fn total_step(l: &LayerLosses) -> Step {
    let k = l.layer;
    layer_step("total", k, "Total loss", loss_sym("p", "Δfp", k))
        .formula(add(vec![v(0), v(1), v(2), v(3)]))
        .input(loss_sym("\"ES\"", "ES", k), l.es, Unit::Stress)
        .input(loss_sym("\"CR\"", "CR", k), l.cr, Unit::Stress)
        .input(loss_sym("\"SH\"", "SH", k), l.sh, Unit::Stress)
        .input(loss_sym("\"RE\"", "RE", k), l.re, Unit::Stress)
        .result(l.total, Unit::Stress)
        .clause(SOURCE)
}

fn fse_step(l: &LayerLosses) -> Step {
    let k = l.layer;
    Step::new(
        "losses",
        format!("prestress.fse.{k}"),
        format!("Effective prestress, layer {k}"),
        sym_k("f", "\"se\"", "fse", k),
    )
    .formula(sub(v(0), v(1)))
    .input(sym_k("f", "\"pj\"", "fpj", k), l.fpj, Unit::Stress)
    .input(loss_sym("p", "Δfp", k), l.total, Unit::Stress)
    .result(l.fse, Unit::Stress)
    .note("jacking stress less the computed losses; used at every section of the member")
}

fn fpi_step(l: &LayerLosses) -> Step {
    let k = l.layer;
    Step::new(
        "losses",
        format!("prestress.fpi.{k}"),
        format!("Stress just after release, layer {k}"),
        sym_k("f", "\"pi\"", "fpi", k),
    )
    .formula(sub(v(0), v(1)))
    .input(sym_k("f", "\"pj\"", "fpj", k), l.fpj, Unit::Stress)
    .input(loss_sym("\"ES\"", "ES", k), l.es, Unit::Stress)
    .result(l.fpi, Unit::Stress)
    .note("jacking stress less elastic shortening (the method takes no relaxation apart before release)")
}
