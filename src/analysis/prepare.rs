//! The member's materials and section properties, derived once per member: Ec, fr and
//! beta1 (asked of the design basis), the precast and the transformed composite
//! section, each a recorded step.

use super::{Conv, sy};
use crate::basis::{Basis, Clause};
use crate::error::{Error, Result};
use crate::input::model::Member;
use crate::material::strand::Curve as StrandCurve;
use crate::section::{Props, Region};
use crate::trace::{Step, Trace, Unit, f::*};
use crate::units::System;

/// Everything about a member that does not change along it.
pub(super) struct Prepared<'a> {
    pub m: &'a Member,
    /// The design basis every decision of a code is asked of.
    pub basis: &'static dyn Basis,
    pub sys: System,
    pub cv: Conv,
    pub precast: Props,
    pub composite: Option<Props>,
    pub n: Option<f64>,
    pub topping_region: Option<Region>,
    /// y of the precast top and of the section top.
    pub top_p: f64,
    pub top: f64,
    pub t: f64,
    pub beta1: f64,
    /// f'c of the concrete at the compression face.
    pub fc_top: f64,
    pub curves: Vec<StrandCurve>,
    /// Whether the design has tension in the precompressed tensile zone under service
    /// loads, which doubles the development length of debonded strand (25.4.8.1(b)):
    /// the largest bottom stress between the bearings and its x, where the member's
    /// stresses are computed; `None` (doubled, the conservative reading) where they are
    /// not.
    pub service_tension: Option<(f64, f64)>,
}

pub(super) fn prepare<'a>(m: &'a Member, basis: &'static dyn Basis, tr: &mut Trace) -> Result<Prepared<'a>> {
    let sys = basis.units();
    let cv = Conv::new(sys);
    let precast = m.region.props();
    if !(precast.area > 0.0 && precast.i > 0.0) {
        return Err(Error::Analysis {
            member: m.id.clone(),
            location: String::new(),
            message: "the section is degenerate (no area or no stiffness)".into(),
        });
    }
    let top_p = m.region.y_top();
    let t = m.topping_thickness();
    let mut curves = Vec::new();
    for (i, s) in m.strands.iter().enumerate() {
        match StrandCurve::new(s.model, s.grade, sys) {
            Some(c) => curves.push(c),
            None => {
                return Err(Error::Analysis {
                    member: m.id.clone(),
                    location: String::new(),
                    message: format!("strand layer {}: no curve for this model and grade", i + 1),
                });
            }
        }
    }

    // material steps
    let c = &m.concrete;
    record_concrete(tr, basis, "precast", c, "");
    record_precast(m, &precast, tr);
    let (topping_region, composite, n, fc_top) = match &m.topping {
        Some(tp) => {
            let (region, comp, n) = composite_section(m, basis, tp, &precast, tr);
            (Some(region), Some(comp), Some(n), tp.concrete.fc)
        }
        None => (None, None, None, c.fc),
    };
    let beta1 = record_beta1(m, basis, fc_top, tr);
    Ok(Prepared {
        m,
        basis,
        sys,
        cv,
        precast,
        composite,
        n,
        topping_region,
        top_p,
        top: top_p + t,
        t,
        beta1,
        fc_top,
        curves,
        service_tension: None,
    })
}

/// The precast section's properties, recorded: area, centroid, inertia and moduli.
fn record_precast(m: &Member, precast: &Props, tr: &mut Trace) {
    tr.rec(|| {
        Step::new("section", "section.A", "Area of the precast section", sy("A", "A"))
            .result(precast.area, Unit::Area)
            .note(outline_source(m))
    });
    tr.rec(|| {
        Step::new("section", "section.yb", "Height of the centroid above the bottom", sy("y_b", "yb"))
            .result(precast.cb(), Unit::Length)
            .note("exact, from the section outline")
    });
    tr.rec(|| {
        Step::new("section", "section.I", "Moment of inertia of the precast section", sy("I", "I"))
            .result(precast.i, Unit::Inertia)
    });
    tr.rec(|| {
        Step::new("section", "section.Sb", "Section modulus, bottom fibre", sy("S_b", "Sb"))
            .formula(div(v(0), v(1)))
            .input(sy("I", "I"), precast.i, Unit::Inertia)
            .input(sy("y_b", "yb"), precast.cb(), Unit::Length)
            .result(precast.sb(), Unit::Modulus)
    });
    tr.rec(|| {
        Step::new("section", "section.St", "Section modulus, top fibre", sy("S_t", "St"))
            .formula(div(v(0), v(1)))
            .input(sy("I", "I"), precast.i, Unit::Inertia)
            .input(sy("y_t", "yt"), precast.ct(), Unit::Length)
            .result(precast.st(), Unit::Modulus)
    });
}

/// The topping's concrete and the transformed composite section (the topping's area
/// taken at the modular ratio n), recorded: the topping's region, the composite
/// section's properties and n.
fn composite_section(
    m: &Member,
    basis: &'static dyn Basis,
    tp: &crate::input::model::Topping,
    precast: &Props,
    tr: &mut Trace,
) -> (Region, Props, f64) {
    let c = &m.concrete;
    let top_p = m.region.y_top();
    let t = m.topping_thickness();
    record_concrete(tr, basis, "topping", &tp.concrete, "t");
    let x0 = tp.x_center - tp.width / 2.0;
    let x1 = tp.x_center + tp.width / 2.0;
    let region = Region::new(vec![[x0, top_p], [x1, top_p], [x1, top_p + t], [x0, top_p + t]], vec![]);
    let n = tp.concrete.ec / c.ec;
    let mt = region.moments();
    let comp = Props::from_moments(m.region.moments() + mt.scaled(n), top_p + t, m.region.y_bot());
    tr.rec(|| {
        Step::new("section", "composite.n", "Modular ratio of the topping", sy("n", "n"))
            .formula(div(v(0), v(1)))
            .input(sy("E_(c,t)", "Ec,t"), tp.concrete.ec, Unit::Stress)
            .input(sy("E_c", "Ec"), c.ec, Unit::Stress)
            .result(n, Unit::Ratio)
    });
    tr.rec(|| {
        Step::new("section", "composite.A", "Area of the transformed composite section", sy("A_c", "Ac"))
            .formula(add(vec![v(0), mul(vec![v(1), v(2), v(3)])]))
            .input(sy("A", "A"), precast.area, Unit::Area)
            .input(sy("n", "n"), n, Unit::Ratio)
            .input(sy("b_t", "bt"), tp.width, Unit::Length)
            .input(sy("t", "t"), t, Unit::Length)
            .result(comp.area, Unit::Area)
    });
    tr.rec(|| {
        Step::new("section", "composite.ybc", "Height of the composite centroid above the bottom", sy("y_(b c)", "ybc"))
            .result(comp.cb(), Unit::Length)
            .note("transformed section: the topping's area taken at n")
    });
    tr.rec(|| {
        Step::new("section", "composite.Ic", "Moment of inertia of the composite section", sy("I_c", "Ic"))
            .result(comp.i, Unit::Inertia)
    });
    tr.rec(|| {
        Step::new("section", "composite.Sbc", "Composite section modulus, bottom fibre", sy("S_(b c)", "Sbc"))
            .formula(div(v(0), v(1)))
            .input(sy("I_c", "Ic"), comp.i, Unit::Inertia)
            .input(sy("y_(b c)", "ybc"), comp.cb(), Unit::Length)
            .result(comp.sb(), Unit::Modulus)
    });
    (region, comp, n)
}

/// The stress block factor beta1 of the concrete at the compression face, recorded.
fn record_beta1(m: &Member, basis: &'static dyn Basis, fc_top: f64, tr: &mut Trace) -> f64 {
    let b1 = basis.beta1(fc_top);
    tr.rec(|| {
        let mut st = Step::new("materials", "beta1", "Stress block factor", sy("beta_1", "beta1"))
            .formula(b1.formula.clone())
            .input(sy("f'_c", "f'c"), fc_top, Unit::Stress)
            .result(b1.value, Unit::Ratio)
            .clause(basis.cite(Clause::Beta1))
            .note(b1.note);
        if m.topping.is_some() {
            st = st.clause(format!("{}, {}", basis.cite(Clause::Beta1), basis.clause(Clause::Composite))).note(format!(
                "{}; f'c of the topping, the concrete at the compression face (a composite member whose parts differ in f'c, 22.3.3)",
                b1.note
            ));
        }
        st
    });
    b1.value
}

/// Whether a section is not symmetric about a vertical axis: the compression zone above
/// some depth has its centroid off the vertical through the section's centroid.
pub(super) fn asymmetric(region: &Region) -> bool {
    let (top, bot) = (region.y_top(), region.y_bot());
    let xc = region.props().xc;
    let width = region.x_max() - region.x_min();
    [0.1, 0.3, 0.6, 0.9].iter().any(|f| {
        let zone = region.above(top - f * (top - bot));
        zone.area > 0.0 && (zone.qy / zone.area - xc).abs() > 1e-6 * width
    })
}

/// Where the section's properties come from, for a checker who recomputes them.
fn outline_source(m: &Member) -> String {
    use crate::section::shapes::{Shape, VOID_SIDES};
    match m.shape {
        Shape::Polygon { .. } => "exact, from the outline and holes listed in the vertex table".to_string(),
        Shape::HollowCore { .. } => format!(
            "exact, from the outline built from the dimensions in the input summary; each void a {VOID_SIDES}-sided polygon of the circle's area"
        ),
        _ => "exact, from the outline built from the dimensions in the input summary".to_string(),
    }
}

fn record_concrete(
    tr: &mut Trace,
    basis: &dyn Basis,
    part: &'static str,
    c: &crate::input::model::Concrete,
    tag: &'static str,
) {
    use crate::input::model::EcSource;
    let id = |k: &str| format!("{part}.{k}");
    let (fc_sym, fc_root) = basis.fc_root(c.fc);
    let ec_sym = if tag.is_empty() { sy("E_c", "Ec") } else { sy("E_(c,t)", "Ec,t") };
    let fr_sym = sy("f_r", "fr");
    let title = if tag.is_empty() { "precast concrete" } else { "topping concrete" };
    match c.ec_source {
        EcSource::Given => tr.rec(|| {
            Step::new("materials", id("Ec"), format!("Modulus of elasticity, {title}"), ec_sym.clone())
                .result(c.ec, Unit::Stress)
                .note("given in the input")
        }),
        EcSource::Normalweight => tr.rec(|| {
            let b = basis.ec_normalweight(c.fc);
            Step::new("materials", id("Ec"), format!("Modulus of elasticity, {title}"), ec_sym.clone())
                .formula(b.formula)
                .input(fc_sym.clone(), fc_root, Unit::Ratio)
                .result(c.ec, Unit::Stress)
                .clause(basis.cite(Clause::EcNormalweight))
                .note(b.note)
        }),
        EcSource::Density { wc } => tr.rec(|| {
            let b = basis.ec_density(c.fc, wc);
            Step::new("materials", id("Ec"), format!("Modulus of elasticity, {title}"), ec_sym.clone())
                .formula(b.formula)
                .input(fc_sym.clone(), fc_root, Unit::Ratio)
                .input(sy("w_c", "wc"), wc, Unit::Ratio)
                .result(c.ec, Unit::Stress)
                .clause(basis.cite(Clause::EcDensity))
                .note(b.note)
        }),
    }
    if tag.is_empty() {
        if c.fr_given {
            tr.rec(|| {
                Step::new("materials", id("fr"), "Modulus of rupture", fr_sym.clone())
                    .result(c.fr, Unit::Stress)
                    .note("given in the input")
            });
        } else {
            tr.rec(|| {
                let b = basis.modulus_of_rupture(c.fc, c.lambda);
                Step::new("materials", id("fr"), "Modulus of rupture", fr_sym.clone())
                    .formula(b.formula)
                    .input(fc_sym.clone(), fc_root, Unit::Ratio)
                    .input(sy("lambda", "λ"), c.lambda, Unit::Ratio)
                    .result(c.fr, Unit::Stress)
                    .clause(basis.cite(Clause::ModulusOfRupture))
                    .note(b.note)
            });
        }
    }
}
