//! The engine: from a validated member to its flexural strength at every check
//! location, computed by strain compatibility, with every step recorded.
//!
//! Order of a location, as a hand calculation goes: strand development at x (transfer
//! and development lengths, reduced fse in the transfer zone); prestress (fse, eps1, Pe,
//! e, eps2); the equilibrium solution (c, a, strains, stresses, forces); Mn; eps_t,
//! control class and phi; phi Mn against Mu; cracking moment and minimum reinforcement;
//! the code's approximate fps for comparison; the conclusion.

pub mod checks;
pub mod conclusion;
pub mod curve;
pub mod roots;
pub mod solve;

use crate::error::{Error, Result};
use crate::input::model::{BlockMode, Kind, Member, Package, StrandLayer};
use crate::material::concrete::{self, EPS_CU};
use crate::material::steel::Bar;
use crate::material::strand::Curve as StrandCurve;
use crate::section::{P, Props, Region};
use crate::trace::{Step, Symbol, Trace, Unit, f::*};
use crate::units::System;
use rayon::prelude::*;
use serde::Serialize;
use solve::{Law, Model, Part, State, Steel, Trial};

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

/// Section properties as shown.
#[derive(Debug, Clone, Serialize)]
pub struct PropsOut {
    pub area: f64,
    /// Height of the centroid above the bottom.
    pub yb: f64,
    pub i: f64,
    /// Distances from the centroid to the top and bottom fibres.
    pub ct: f64,
    pub cb: f64,
    pub st: f64,
    pub sb: f64,
}

impl PropsOut {
    fn of(p: &Props) -> PropsOut {
        PropsOut { area: p.area, yb: p.cb(), i: p.i, ct: p.ct(), cb: p.cb(), st: p.st(), sb: p.sb() }
    }
}

/// What the package sketch needs to draw the section.
#[derive(Debug, Clone, Serialize)]
pub struct Geometry {
    pub outline: Vec<P>,
    pub holes: Vec<Vec<P>>,
    /// Topping rectangle [x0, y0, x1, y1].
    pub topping: Option<[f64; 4]>,
    pub x_min: f64,
    pub x_max: f64,
    pub y_min: f64,
    pub y_max: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct SectionResult {
    pub shape: &'static str,
    pub precast_height: f64,
    pub height: f64,
    pub precast: PropsOut,
    /// Transformed composite section (topping at the modular ratio).
    pub composite: Option<PropsOut>,
    pub modular_ratio: Option<f64>,
    pub ec: f64,
    pub fr: f64,
    pub ec_topping: Option<f64>,
    pub beta1: f64,
    pub geometry: Geometry,
    /// Not symmetric about a vertical axis (an L-beam): bending about a horizontal axis
    /// with lateral restraint is assumed, and the package says so.
    pub asymmetric: bool,
}

/// A steel layer's result at a location.
#[derive(Debug, Clone, Serialize)]
pub struct LayerOut {
    pub kind: &'static str,
    /// 1-based within its kind.
    pub index: usize,
    /// "6 × 1/2 in" or "3 #5".
    pub label: String,
    pub count: u32,
    /// Area of one strand or bar.
    pub unit_area: f64,
    pub area: f64,
    /// Depth below the top of the section (topping included).
    pub depth: f64,
    pub eps1: Option<f64>,
    pub eps2: Option<f64>,
    pub eps3: f64,
    pub eps: f64,
    pub stress: f64,
    pub force: f64,
    /// Effective prestress at this location (strand).
    pub fse: Option<f64>,
    /// Stress limit of a strand not fully developed here.
    pub cap: Option<f64>,
    /// Share of the layer inside the stress block (its displaced concrete deducted).
    pub in_block: f64,
    /// Whether the layer carries stress here (a debonded strand does not).
    pub active: bool,
    /// Points for the sketch.
    pub points: Vec<P>,
    pub diameter: f64,
}

/// Development of one strand layer at a location (ACI 318-19 25.4.8).
#[derive(Debug, Clone, Serialize)]
pub struct Development {
    pub layer: usize,
    /// The nearer member end, from which transfer, development and debonding are measured.
    pub end: crate::input::model::End,
    /// Distance from that end.
    pub x_end: f64,
    /// Distance from where bonding begins (x_end less the debonded length).
    pub x_bond: f64,
    pub debonded_length: f64,
    pub transfer_length: f64,
    pub development_length: f64,
    pub doubled: bool,
    pub fse_here: f64,
    pub fpx: Option<f64>,
    /// Position between the transfer and development lengths (0 within the transfer
    /// length), for strand not fully developed here.
    pub ratio: Option<f64>,
    pub phi: Option<f64>,
    pub state: &'static str,
}

#[derive(Debug, Clone, Serialize)]
pub struct MinReinforcement {
    pub clause: String,
    pub required: f64,
    pub ok: bool,
    /// phi Mn >= 2 Mu: the flexural half of the waiver clause holds.
    pub waiver_flexure: bool,
    pub waiver_clause: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Approximate {
    pub applicable: bool,
    pub reason: Option<String>,
    pub gamma_p: Option<f64>,
    pub rho_p: Option<f64>,
    pub fps: Option<f64>,
    pub a: Option<f64>,
    pub flanged: bool,
    pub mn: Option<f64>,
    /// (approximate - strain compatibility) / strain compatibility, per cent.
    pub difference: Option<f64>,
}

/// The result with the other stress-block option, for comparison.
#[derive(Debug, Clone, Serialize)]
pub struct OtherBlock {
    pub block: BlockMode,
    pub c: f64,
    pub a: f64,
    pub mn: f64,
}

/// The precast unit's extreme fibre stresses under the effective prestress alone
/// (tension positive), against fr and f'c.
#[derive(Debug, Clone, Serialize)]
pub struct PrestressAloneOut {
    pub top: f64,
    pub bottom: f64,
    pub fr: f64,
    pub fc: f64,
    pub top_cracks: bool,
    pub over_compressed: bool,
}

#[derive(Debug, Clone, Serialize)]
pub struct LocationResult {
    pub name: String,
    pub x: Option<f64>,
    pub mu: f64,
    pub pe: f64,
    pub e: f64,
    pub c: f64,
    pub a: f64,
    pub beta1: f64,
    pub block: Option<BlockMode>,
    pub zone: &'static str,
    pub cc: f64,
    pub dc: f64,
    pub strands: Vec<LayerOut>,
    pub bars: Vec<LayerOut>,
    pub iterations: Vec<Trial>,
    /// |C - T| / C at the solution.
    pub closure: f64,
    pub mn: f64,
    pub eps_t: f64,
    pub eps_ty: f64,
    pub extreme: String,
    pub control: &'static str,
    pub phi: f64,
    pub phi_flexure: f64,
    pub phi_development: Option<f64>,
    pub phi_mn: f64,
    pub ratio: f64,
    pub strength_ok: bool,
    pub mcr: f64,
    /// The precast unit cracks under the non-composite moment alone.
    pub cracked_before_composite: bool,
    pub min_reinforcement: MinReinforcement,
    pub approximate: Approximate,
    pub development: Vec<Development>,
    pub max_strand_strain: f64,
    /// The largest strain of strand not fully developed here (held at fpx).
    pub capped_strain: f64,
    pub rupture_risk: bool,
    pub prestress_alone: PrestressAloneOut,
    pub other_block: Option<OtherBlock>,
    /// Every check met, perhaps on open conditions (see `status`).
    pub pass: bool,
    pub status: conclusion::Status,
    /// Open conditions and cautions: the result holds only if they are settled.
    pub conditions: Vec<conclusion::Condition>,
    pub conclusion: String,
    pub notes: Vec<String>,
    /// Rings of the compression block for the sketch.
    pub block_rings: Vec<Vec<P>>,
    /// Whether strain compatibility was solved (false where there is no tension steel).
    pub solved: bool,
    pub trace: Vec<Step>,
}

#[derive(Debug, Clone, Serialize)]
pub struct MemberResult {
    pub id: String,
    pub section: SectionResult,
    pub locations: Vec<LocationResult>,
    /// Index of the governing location (highest Mu / phi Mn).
    pub governing: usize,
    pub pass: bool,
    pub status: conclusion::Status,
    pub trace: Vec<Step>,
    /// The moment-curvature response at the governing location (filled by
    /// [`analyze_full`]), or why it could not be found.
    pub curve: Option<curve::CurveResult>,
    pub curve_error: Option<String>,
}

impl MemberResult {
    pub fn governing(&self) -> &LocationResult {
        &self.locations[self.governing]
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct Analysis {
    pub units: System,
    pub members: Vec<MemberResult>,
}

impl Analysis {
    pub fn pass(&self) -> bool {
        self.members.iter().all(|m| m.pass)
    }
    /// The package's result: the worst of its members'.
    pub fn status(&self) -> conclusion::Status {
        self.members.iter().fold(conclusion::Status::Pass, |s, m| s.and(m.status))
    }
}

/// Analyses every member (in parallel; the result keeps the input order).
pub fn analyze(pkg: &Package, trace: bool) -> Result<Analysis> {
    let results: Vec<Result<MemberResult>> =
        pkg.members.par_iter().map(|m| analyze_member(m, pkg.units, trace)).collect();
    // the first error in input order, whichever thread met it first
    let members = results.into_iter().collect::<Result<Vec<_>>>()?;
    Ok(Analysis { units: pkg.units, members })
}

/// Everything the package shows: the traced analysis and each member's
/// moment-curvature response at its governing location.
pub fn analyze_full(pkg: &Package) -> Result<Analysis> {
    let mut a = analyze(pkg, true)?;
    a.members.par_iter_mut().zip(pkg.members.par_iter()).for_each(|(r, m)| {
        match curve::moment_curvature(m, pkg.units, r.governing) {
            Ok(c) => r.curve = Some(c),
            Err(e) => r.curve_error = Some(e.to_string()),
        }
    });
    Ok(a)
}

/// The code edition as cited for a unit system: ACI 318M-19 for SI packages.
pub fn code(sys: System) -> &'static str {
    match sys {
        System::Us => "ACI 318-19",
        System::Si => "ACI 318M-19",
    }
}

/// What a unit conversion in a formula does, in words ("/ 12: kip-in to kip-ft").
fn conversion_words(sys: System, divisor: f64, result: Unit) -> String {
    let same = |a: f64, b: f64| (a - b).abs() <= 1e-12 * b.abs();
    match sys {
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

/// Steps are written citing ACI 318-19; an SI package cites ACI 318M-19, the same
/// clauses in SI units. Each unit conversion in a formula is named in the step's note.
fn cite_for(sys: System, steps: &mut [Step]) {
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
    if sys == System::Si {
        for st in steps {
            if let Some(c) = &mut st.clause {
                *c = c.replace("ACI 318-19", "ACI 318M-19");
            }
            if let Some(n) = &mut st.note {
                *n = n.replace("ACI 318-19", "ACI 318M-19");
            }
        }
    }
}

// ---- symbols ---------------------------------------------------------------------

fn sy(math: &'static str, plain: &'static str) -> Symbol {
    Symbol::new(math, plain)
}
fn si(base: &'static str, sub: &'static str, plain: &'static str, i: usize) -> Symbol {
    Symbol::indexed(base, sub, plain, i)
}

/// Everything about a member that does not change along it.
struct Prepared<'a> {
    m: &'a Member,
    sys: System,
    cv: Conv,
    precast: Props,
    composite: Option<Props>,
    n: Option<f64>,
    topping_region: Option<Region>,
    /// y of the precast top and of the section top.
    top_p: f64,
    top: f64,
    t: f64,
    beta1: f64,
    /// f'c of the concrete at the compression face.
    fc_top: f64,
    curves: Vec<StrandCurve>,
}

fn prepare<'a>(m: &'a Member, sys: System, tr: &mut Trace) -> Result<Prepared<'a>> {
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
    record_concrete(tr, sys, "precast", c, "");
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
    let (topping_region, composite, n, fc_top) = match &m.topping {
        Some(tp) => {
            record_concrete(tr, sys, "topping", &tp.concrete, "t");
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
                Step::new(
                    "section",
                    "composite.ybc",
                    "Height of the composite centroid above the bottom",
                    sy("y_(b c)", "ybc"),
                )
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
            (Some(region), Some(comp), Some(n), tp.concrete.fc)
        }
        None => (None, None, None, c.fc),
    };
    let b1 = concrete::beta1(fc_top, sys);
    tr.rec(|| {
        let mut st = Step::new("materials", "beta1", "Stress block factor", sy("beta_1", "beta1"))
            .formula(b1.formula.clone())
            .input(sy("f'_c", "f'c"), fc_top, Unit::Stress)
            .result(b1.value, Unit::Ratio)
            .clause("ACI 318-19 Table 22.2.2.4.3")
            .note(b1.note);
        if m.topping.is_some() {
            st = st.clause("ACI 318-19 Table 22.2.2.4.3, 22.3.3").note(format!(
                "{}; f'c of the topping, the concrete at the compression face (a composite member whose parts differ in f'c, 22.3.3)",
                b1.note
            ));
        }
        st
    });
    Ok(Prepared {
        m,
        sys,
        cv,
        precast,
        composite,
        n,
        topping_region,
        top_p,
        top: top_p + t,
        t,
        beta1: b1.value,
        fc_top,
        curves,
    })
}

/// Whether a section is not symmetric about a vertical axis: the compression zone above
/// some depth has its centroid off the vertical through the section's centroid.
fn asymmetric(region: &Region) -> bool {
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
    sys: System,
    part: &'static str,
    c: &crate::input::model::Concrete,
    tag: &'static str,
) {
    use crate::input::model::EcSource;
    let id = |k: &str| format!("{part}.{k}");
    let (fc_sym, fc_root) = concrete::fc_root_input(c.fc, sys);
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
            let b = concrete::ec_normalweight(c.fc, sys);
            Step::new("materials", id("Ec"), format!("Modulus of elasticity, {title}"), ec_sym.clone())
                .formula(b.formula)
                .input(fc_sym.clone(), fc_root, Unit::Ratio)
                .result(c.ec, Unit::Stress)
                .clause("ACI 318-19 19.2.2.1(b)")
                .note(b.note)
        }),
        EcSource::Density { wc } => tr.rec(|| {
            let b = concrete::ec_density(c.fc, wc, sys);
            Step::new("materials", id("Ec"), format!("Modulus of elasticity, {title}"), ec_sym.clone())
                .formula(b.formula)
                .input(fc_sym.clone(), fc_root, Unit::Ratio)
                .input(sy("w_c", "wc"), wc, Unit::Ratio)
                .result(c.ec, Unit::Stress)
                .clause("ACI 318-19 19.2.2.1(a)")
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
                let b = concrete::fr(c.fc, c.lambda, sys);
                Step::new("materials", id("fr"), "Modulus of rupture", fr_sym.clone())
                    .formula(b.formula)
                    .input(fc_sym.clone(), fc_root, Unit::Ratio)
                    .input(sy("lambda", "λ"), c.lambda, Unit::Ratio)
                    .result(c.fr, Unit::Stress)
                    .clause("ACI 318-19 19.2.3.1")
                    .note(b.note)
            });
        }
    }
}

/// The points of a layer for the sketch: spread evenly along the concrete at its level.
/// Where both sets of stretches have concrete.
/// Where the sketch draws the bars or strands of a layer: spread over the concrete the
/// whole bar occupies (from y - d/2 to y + d/2), so none is drawn in a void; if they do
/// not fit there, over the concrete at y.
fn layer_points(region: &Region, y: f64, count: u32, d: f64) -> Vec<P> {
    let r = d / 2.0;
    let band = region.room_at(y, d);
    let (intervals, inset) = if crate::section::side_by_side(&band, d) >= u64::from(count) {
        (band, r)
    } else {
        (region.stretches_at(y), 0.0)
    };
    let intervals: Vec<(f64, f64)> =
        intervals.into_iter().filter(|(a, b)| b - a > 2.0 * inset).map(|(a, b)| (a + inset, b - inset)).collect();
    let total: f64 = intervals.iter().map(|(a, b)| b - a).sum();
    if total <= 0.0 || count == 0 {
        return Vec::new();
    }
    // share the count among the intervals by length
    let mut pts = Vec::new();
    let mut left = count as usize;
    for (k, (a, b)) in intervals.iter().enumerate() {
        let share = if k + 1 == intervals.len() { left } else { ((count as f64) * (b - a) / total).round() as usize };
        let share = share.min(left);
        for j in 0..share {
            pts.push([a + (b - a) * (j as f64 + 0.5) / share as f64, y]);
        }
        left -= share;
    }
    pts
}

/// Per strand layer, the state at a location before the solution.
struct StrandAt {
    /// depth below the section top
    d: f64,
    /// distance below the precast centroid
    yb: f64,
    fse: f64,
    eps1: f64,
    eps2: f64,
    active: bool,
    dev: Option<Development>,
}

/// Each strand layer at a location: depth (harped profile at x), effective prestress
/// after transfer, and whether it is bonded there. Transfer, development, debonding and
/// the harp profile are measured from the nearer member end.
fn strands_at(p: &Prepared, li: usize, loc: &crate::input::model::Location, tr: &mut Trace) -> Vec<StrandAt> {
    let m = p.m;
    let along = m.along(loc);
    let from_end = along.map(|a| {
        let (end, xe) = a.nearer_end();
        tr.rec(|| {
            Step::new("development", format!("L{}.dev.xe", li + 1), "Distance to the nearer member end", sy("x_e", "xe"))
                .formula(min(vec![v(0), sub(v(1), v(0))]))
                .input(sy("x", "x"), a.x, Unit::Length)
                .input(sy("L", "L"), a.length, Unit::Length)
                .result(xe, Unit::Length)
                .note(format!(
                    "x from the left end, L end to end: the {} governs; transfer, development, debonding and the harp profile are measured from it",
                    end.name()
                ))
        });
        (end, xe)
    });
    m.strands
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let depth_p = s.profile.depth_at(along);
            if let (crate::input::model::Profile::Harped { depth_end, depth_harp, harp_x, harp_x2, .. }, Some(a)) =
                (s.profile, along)
            {
                record_harped_depth(tr, li, i + 1, a, depth_end, depth_harp, harp_x, harp_x2, depth_p);
            }
            let y = p.top_p - depth_p;
            let (fse, active, dev) = checks::transfer(p, li, i, s, from_end, tr);
            StrandAt {
                d: depth_p + p.t,
                yb: p.precast.yc - y,
                fse,
                eps1: fse / p.curves[i].eps_modulus,
                eps2: 0.0,
                active,
                dev,
            }
        })
        .collect()
}

/// The depth of a harped layer at x, from the nearer end's slope (or the harp depth
/// between the harp points).
#[allow(clippy::too_many_arguments)]
fn record_harped_depth(
    tr: &mut Trace,
    li: usize,
    k: usize,
    a: crate::input::model::Along,
    depth_end: f64,
    depth_harp: f64,
    harp_x: f64,
    harp_x2: Option<f64>,
    depth: f64,
) {
    let x2 = harp_x2.unwrap_or(a.length - harp_x);
    tr.rec(|| {
        let st = Step::new(
            "prestress",
            format!("L{}.prestress.dharp.{k}", li + 1),
            format!("Depth of harped layer {k} at x, below the top of the precast unit"),
            si("d", "\"h\"", "dh", k),
        );
        if a.x < harp_x {
            st.formula(add(vec![v(0), mul(vec![sub(v(1), v(0)), div(v(2), v(3))])]))
                .input(sy("d_\"end\"", "d_end"), depth_end, Unit::Length)
                .input(sy("d_\"harp\"", "d_harp"), depth_harp, Unit::Length)
                .input(sy("x", "x"), a.x, Unit::Length)
                .input(sy("x_h", "xh"), harp_x, Unit::Length)
                .result(depth, Unit::Length)
                .note("between the left end and the first harp point: linear")
        } else if a.x > x2 {
            st.formula(add(vec![v(0), mul(vec![sub(v(1), v(0)), div(sub(v(2), v(3)), sub(v(2), v(4)))])]))
                .input(sy("d_\"end\"", "d_end"), depth_end, Unit::Length)
                .input(sy("d_\"harp\"", "d_harp"), depth_harp, Unit::Length)
                .input(sy("L", "L"), a.length, Unit::Length)
                .input(sy("x", "x"), a.x, Unit::Length)
                .input(sy("x_(h 2)", "xh2"), x2, Unit::Length)
                .result(depth, Unit::Length)
                .note("between the second harp point and the right end: linear, measured from the right end")
        } else {
            st.result(depth, Unit::Length).note(format!(
                "between the harp points (x = {} and {} {}): the harp depth",
                crate::trace::show(harp_x),
                crate::trace::show(x2),
                "from the left end"
            ))
        }
    });
}

pub fn analyze_member(m: &Member, sys: System, trace: bool) -> Result<MemberResult> {
    let mut tr = Trace::new(trace);
    let p = prepare(m, sys, &mut tr)?;
    let mut locations = Vec::with_capacity(m.locations.len());
    for (li, loc) in m.locations.iter().enumerate() {
        locations.push(location(&p, li, loc, trace)?);
    }
    // strand strained beyond its elongation: the section's moment-curvature curve says
    // whether it ruptures before the demand is carried
    for (li, l) in locations.iter_mut().enumerate() {
        // only the end of the curve is asked for: two points (the march is the same)
        let curve = l.rupture_risk.then(|| curve::moment_curvature_points(m, sys, li, 2));
        let check = match &curve {
            None => conclusion::RuptureCheck::NotAsked,
            Some(Ok(c)) => conclusion::RuptureCheck::Curve(c),
            Some(Err(e)) => conclusion::RuptureCheck::Failed(e.to_string()),
        };
        conclusion::settle(l, sys, check);
    }
    let governing =
        locations.iter().enumerate().max_by(|a, b| a.1.ratio.total_cmp(&b.1.ratio)).map(|(i, _)| i).unwrap_or(0);
    let pass = locations.iter().all(|l| l.pass);
    let status = locations.iter().fold(conclusion::Status::Pass, |s, l| s.and(l.status));
    let geometry = Geometry {
        outline: m.region.outline.clone(),
        holes: m.region.holes.clone(),
        topping: p.topping_region.as_ref().map(|r| [r.x_min(), r.y_bot(), r.x_max(), r.y_top()]),
        x_min: p.topping_region.as_ref().map_or(m.region.x_min(), |r| r.x_min().min(m.region.x_min())),
        x_max: p.topping_region.as_ref().map_or(m.region.x_max(), |r| r.x_max().max(m.region.x_max())),
        y_min: m.region.y_bot(),
        y_max: p.top,
    };
    let section = SectionResult {
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
        asymmetric: asymmetric(&m.region),
    };
    let mut steps = tr.steps;
    cite_for(sys, &mut steps);
    Ok(MemberResult {
        id: m.id.clone(),
        section,
        locations,
        governing,
        pass,
        status,
        trace: steps,
        curve: None,
        curve_error: None,
    })
}

fn parts_for<'a>(p: &'a Prepared, block: Option<BlockMode>) -> Vec<Part<'a>> {
    let m = p.m;
    match (&p.topping_region, &m.topping) {
        (Some(tr), Some(tp)) => {
            let precast_stress = match block {
                Some(BlockMode::TwoPart) => 0.85 * m.concrete.fc,
                _ => 0.85 * tp.concrete.fc,
            };
            vec![Part { region: tr, stress: 0.85 * tp.concrete.fc }, Part { region: &m.region, stress: precast_stress }]
        }
        _ => vec![Part { region: &m.region, stress: 0.85 * m.concrete.fc }],
    }
}

/// Block stress at a depth below the section top (for displaced concrete).
fn block_stress_at(parts: &[Part], p: &Prepared, d: f64) -> f64 {
    if parts.len() == 2 && d <= p.t { parts[0].stress } else { parts[parts.len() - 1].stress }
}

fn strand_label(s: &StrandLayer, sys: System) -> String {
    let u = sys.names();
    match s.size {
        Some(name) => format!("{} × {}", s.count, name),
        None => format!(
            "{} × {} {} ({} {})",
            s.count,
            crate::trace::show(s.diameter),
            u.length,
            crate::trace::show(s.area),
            u.area
        ),
    }
}

fn model_for<'a>(p: &'a Prepared, parts: Vec<Part<'a>>, at: &[StrandAt], caps: &[f64]) -> Model<'a> {
    let m = p.m;
    let mut steel = Vec::with_capacity(m.strands.len() + m.bars.len());
    for (i, s) in m.strands.iter().enumerate() {
        let a = &at[i];
        steel.push(Steel {
            d: a.d,
            area: if a.active { s.total_area() } else { 0.0 },
            db: s.diameter,
            pre: a.eps1 + a.eps2,
            cap: caps[i],
            law: Law::Strand(p.curves[i]),
            displaced: if a.active { block_stress_at(&parts, p, a.d) } else { 0.0 },
        });
    }
    for b in &m.bars {
        let d = b.depth + p.t;
        steel.push(Steel {
            d,
            area: b.total_area(),
            db: b.diameter,
            pre: 0.0,
            cap: f64::INFINITY,
            law: Law::Bar(Bar { fy: b.fy, es: b.es, hardening: 0.0, fu: b.fy }),
            displaced: block_stress_at(&parts, p, d),
        });
    }
    Model { parts, steel, top: p.top, depth: m.total_height(), beta1: p.beta1, ecu: EPS_CU }
}

fn solve_err(p: &Prepared, loc: &str, e: solve::NoSolution) -> Error {
    Error::Analysis { member: p.m.id.clone(), location: loc.to_string(), message: e.to_string() }
}

fn zone_of(p: &Prepared, a: f64) -> &'static str {
    let m = p.m;
    if a >= m.total_height() * (1.0 - 1e-12) {
        "whole section"
    } else if m.topping.is_some() && a <= p.t {
        "topping"
    } else if m.topping.is_some() {
        match m.shape.zone(a - p.t) {
            "flange" => "topping and flange",
            "web" => "topping, flange and web",
            "top flange" => "topping and top flange",
            "top flange taper" => "topping, top flange and taper",
            "void region" => "topping and void region",
            "stem" => "topping and stem",
            "ledge" => "topping, stem and ledge",
            _ => "topping and precast unit",
        }
    } else {
        m.shape.zone(a - p.t)
    }
}

fn location(p: &Prepared, li: usize, loc: &crate::input::model::Location, trace: bool) -> Result<LocationResult> {
    let m = p.m;
    let sys = p.sys;
    let cv = p.cv;
    let mut tr = Trace::new(trace);
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let mut notes: Vec<String> = Vec::new();

    // ---- development and prestress at x -----------------------------------------
    let eps_mod: Vec<f64> = p.curves.iter().map(|c| c.eps_modulus).collect();
    let mut at = strands_at(p, li, loc, &mut tr);
    if loc.x.is_none() {
        notes.push("No distance from the member end is given: the strands are taken as fully developed here.".into());
    }
    let pe: f64 = m.strands.iter().zip(&at).map(|(s, a)| a.fse * s.total_area()).sum();
    let e = if pe > 0.0 {
        m.strands.iter().zip(&at).map(|(s, a)| a.fse * s.total_area() * a.yb).sum::<f64>() / pe
    } else {
        0.0
    };
    let (area, inertia, ec) = (p.precast.area, p.precast.i, m.concrete.ec);
    for a in at.iter_mut() {
        a.eps2 = pe / (area * ec) + pe * e * a.yb / (inertia * ec);
    }
    // prestress steps
    for (i, s) in m.strands.iter().enumerate() {
        let a = &at[i];
        let k = i + 1;
        if let crate::input::model::FseSource::Losses { jacking, fpj, .. } = s.fse_source {
            tr.rec(|| {
                Step::new(
                    "prestress",
                    tag(&format!("prestress.fpj.{k}")),
                    format!("Jacking stress, layer {k}"),
                    si("f", "\"pj\"", "fpj", k),
                )
                .formula(mul(vec![v(0), v(1)]))
                .input(sy("f_\"pj\" / f_\"pu\"", "fpj/fpu"), jacking, Unit::Ratio)
                .input(sy("f_\"pu\"", "fpu"), s.fpu, Unit::Stress)
                .result(fpj, Unit::Stress)
                .clause("ACI 318-19 20.3.2.5.1 (limit min(0.80 fpu, 0.94 fpy))")
            });
        }
        tr.rec(|| {
            let mut st = Step::new(
                "prestress",
                tag(&format!("prestress.fse.{k}")),
                format!("Effective prestress, layer {k}"),
                si("f", "\"se\"", "fse", k),
            );
            st = match s.fse_source {
                crate::input::model::FseSource::Given => st.result(s.fse, Unit::Stress).note("given in the input"),
                crate::input::model::FseSource::Losses { fpj, losses, .. } => st
                    .formula(sub(v(0), v(1)))
                    .input(si("f", "\"pj\"", "fpj", k), fpj, Unit::Stress)
                    .input(si("Delta f", "p", "Δfp", k), losses, Unit::Stress)
                    .result(s.fse, Unit::Stress)
                    .note("jacking stress less the given losses"),
            };
            st
        });
        if a.fse != s.fse {
            let fse_here = a.fse;
            let dev = a.dev.clone();
            tr.rec(|| {
                let mut st = Step::new(
                    "prestress",
                    tag(&format!("prestress.fsex.{k}")),
                    format!("Effective prestress at x, layer {k}"),
                    si("f", "\"se,x\"", "fse,x", k),
                );
                match &dev {
                    Some(d) if d.x_bond > 0.0 => {
                        st = st
                            .formula(div(mul(vec![v(0), v(1)]), v(2)))
                            .input(si("f", "\"se\"", "fse", k), s.fse, Unit::Stress)
                            .input(sy("x_b", "xb"), d.x_bond, Unit::Length)
                            .input(sy("ell_\"tr\"", "ltr"), d.transfer_length, Unit::Length)
                            .result(fse_here, Unit::Stress)
                            .note(
                                "inside the transfer length: prestress transferred in proportion to the bonded length",
                            )
                    }
                    _ if s.debonded_length > 0.0 => {
                        st = st.result(fse_here, Unit::Stress).note("debonded here: no prestress")
                    }
                    _ => {
                        st = st
                            .result(fse_here, Unit::Stress)
                            .note("at the member end: the bond has not begun, no prestress")
                    }
                }
                st
            });
        }
        let reduced = a.fse != s.fse;
        tr.rec(|| {
            Step::new(
                "prestress",
                tag(&format!("prestress.eps1.{k}")),
                format!("Strain from effective prestress, layer {k}"),
                si("epsilon", "1", "eps1", k),
            )
            .formula(div(v(0), v(1)))
            .input(
                if reduced { si("f", "\"se,x\"", "fse,x", k) } else { si("f", "\"se\"", "fse", k) },
                a.fse,
                Unit::Stress,
            )
            .input(sy("E_\"ps\"", "Eps"), eps_mod[i], Unit::Stress)
            .result(a.eps1, Unit::Strain)
            .note("Eps is the initial slope of the strand curve")
        });
    }
    tr.rec(|| {
        let mut st = Step::new("prestress", tag("prestress.Pe"), "Effective prestress force", sy("P_e", "Pe"));
        let mut terms = Vec::new();
        for (i, s) in m.strands.iter().enumerate() {
            terms.push(mul(vec![v(2 * i), v(2 * i + 1)]));
            st = st.input(si("f", "\"se\"", "fse", i + 1), at[i].fse, Unit::Stress).input(
                si("A", "\"ps\"", "Aps", i + 1),
                s.total_area(),
                Unit::Area,
            );
        }
        st.formula(per(add(terms), cv.f_div)).result(pe * cv.kf, Unit::Force)
    });
    tr.rec(|| {
        let mut st = Step::new(
            "prestress",
            tag("prestress.e"),
            "Eccentricity of the prestress below the precast centroid",
            sy("e", "e"),
        );
        let mut terms = Vec::new();
        for (i, s) in m.strands.iter().enumerate() {
            terms.push(mul(vec![v(3 * i), v(3 * i + 1), v(3 * i + 2)]));
            st = st
                .input(si("f", "\"se\"", "fse", i + 1), at[i].fse, Unit::Stress)
                .input(si("A", "\"ps\"", "Aps", i + 1), s.total_area(), Unit::Area)
                .input(si("y", "", "y", i + 1), at[i].yb, Unit::Length);
        }
        let k = 3 * m.strands.len();
        st = st.input(sy("P_e", "Pe"), pe * cv.kf, Unit::Force);
        if pe > 0.0 {
            st = st.formula(div(per(add(terms), cv.f_div), v(k)));
        } else {
            st = st.note("no prestress at this location");
        }
        st.result(e, Unit::Length).note("y: each layer's distance below the centroid of the precast unit")
    });
    for (i, a) in at.iter().enumerate() {
        let k = i + 1;
        tr.rec(|| {
            // eps2 = Pe/(A Ec) + Pe e y / (I Ec), with Pe shown
            Step::new(
                "prestress",
                tag(&format!("prestress.eps2.{k}")),
                format!("Decompression strain, layer {k}"),
                si("epsilon", "2", "eps2", k),
            )
            .formula(add(vec![
                per(div(v(0), mul(vec![v(1), v(2)])), cv.kf),
                per(div(mul(vec![v(0), v(3), v(4)]), mul(vec![v(5), v(2)])), cv.kf),
            ]))
            .input(sy("P_e", "Pe"), pe * cv.kf, Unit::Force)
            .input(sy("A", "A"), area, Unit::Area)
            .input(sy("E_c", "Ec"), ec, Unit::Stress)
            .input(sy("e", "e"), e, Unit::Length)
            .input(si("y", "", "y", k), a.yb, Unit::Length)
            .input(sy("I", "I"), inertia, Unit::Inertia)
            .result(a.eps2, Unit::Strain)
            .note(
                "strain change in the concrete at the layer when the prestress is decompressed; precast section alone",
            )
        });
    }

    // a section where no strand is bonded and there are no bars (at a member end, in a
    // debonded zone) has no tension steel: its strength is zero, a result, not an error
    if m.bars.is_empty() && at.iter().all(|a| !a.active) {
        return Ok(no_tension_steel(p, li, loc, &at, pe, e, tr, notes));
    }

    // ---- strain compatibility ----------------------------------------------------
    let block = m.topping.as_ref().map(|t| t.block);
    let no_caps = vec![f64::INFINITY; m.strands.len()];
    let model = model_for(p, parts_for(p, block), &at, &no_caps);
    let mut log = Vec::new();
    let mut st = model.solve(Some(&mut log)).map_err(|e| solve_err(p, &loc.name, e))?;
    let mut model = model;
    // development: limit the stress of strands not developed here, then solve again
    let fps_full: Vec<f64> =
        model.steel[..m.strands.len()].iter().map(|s| s.stress_at(s.pre + s.eps3(st.c, EPS_CU))).collect();
    let mut caps = no_caps.clone();
    if loc.x.is_some() {
        for (i, s) in m.strands.iter().enumerate() {
            if let Some(cap) = checks::development(p, li, i, s, fps_full[i], &mut at[i], &mut tr) {
                caps[i] = cap;
            }
        }
        if caps.iter().any(|c| c.is_finite()) {
            model = model_for(p, parts_for(p, block), &at, &caps);
            log.clear();
            st = model.solve(Some(&mut log)).map_err(|e| solve_err(p, &loc.name, e))?;
            notes.push(format!("Strands are not fully developed here: their stress is limited to fpx ({} 25.4.8.3) and the equilibrium is solved with that limit.", code(sys)));
        }
    }
    let closure = (st.residual / st.cc).abs();
    let strength = record_solution(p, li, &model, &st, &at, &mut tr, closure, log.len());

    // ---- the other block option, for comparison ------------------------------------
    let other_block = match (block, &m.topping) {
        (Some(b), Some(tp)) if st.a > tp.thickness || tp.concrete.fc != m.concrete.fc => {
            let other = if b == BlockMode::Topping { BlockMode::TwoPart } else { BlockMode::Topping };
            let om = model_for(p, parts_for(p, Some(other)), &at, &caps);
            match om.solve(None) {
                Ok(os) => {
                    let mn_o = moment_of(&om, &os) * cv.km;
                    if st.a > tp.thickness || os.a > tp.thickness {
                        tr.rec(|| {
                            Step::new(
                                "strength",
                                tag("strength.Mn_other"),
                                "Nominal strength with the other stress-block option",
                                sy("M_(n,\"alt\")", "Mn,alt"),
                            )
                            .result(mn_o, Unit::Moment)
                            .note(format!(
                                "{} (input block = \"{}\"): c = {} {len}, a = {} {len}; shown for comparison only",
                                if other == BlockMode::TwoPart {
                                    "each concrete's 0.85 f'c over its own part of the block"
                                } else {
                                    "the topping's f'c over the whole block"
                                },
                                if other == BlockMode::TwoPart { "two_part" } else { "topping" },
                                crate::trace::show(os.c),
                                crate::trace::show(os.a),
                                len = sys.names().length
                            ))
                        });
                        Some(OtherBlock { block: other, c: os.c, a: os.a, mn: mn_o })
                    } else {
                        None
                    }
                }
                Err(_) => None,
            }
        }
        _ => None,
    };
    if let (Some(BlockMode::Topping), Some(tp)) = (block, &m.topping)
        && st.a > tp.thickness
        && tp.concrete.fc > m.concrete.fc
    {
        notes.push("The topping's f'c exceeds the precast concrete's and the block reaches below the topping: the default block (topping f'c throughout) is then not conservative; compare block = \"two_part\".".into());
    }

    // ---- Mn, phi, checks ---------------------------------------------------------
    let mn = strength.mn_shown;
    let mu = loc.mu * cv.km;
    let ctl = checks::control(p, li, &model, &st, &mut tr);
    let phi_devs = checks::phi_development(li, &mut at, st.c, ctl.phi, &mut tr);
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
                    st = st.input(si("phi", "\"dev\"", "phi_dev", *k), *pdk, Unit::Ratio);
                    terms.push(v(j + 1));
                }
                st.formula(min(terms)).result(pd, Unit::Ratio).clause("ACI 318-19 21.2.3").note(
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
            .clause(format!("ACI 318-19 {}", if is_slab(p.m) { "7.5.1.1" } else { "9.5.1.1" }))
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
    cite_for(sys, &mut steps);
    Ok(LocationResult {
        name: loc.name.clone(),
        x: loc.x,
        mu,
        pe: pe * cv.kf,
        e,
        c: st.c,
        a: st.a,
        beta1: p.beta1,
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
    loc: &crate::input::model::Location,
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
    // 21.2.3: within the transfer length (here: before the bond begins) phi is 0.75
    let phi = 0.75;
    let ratio = if mu == 0.0 { 0.0 } else { f64::INFINITY };
    tr.rec(|| {
        Step::new("checks", tag("phiMn"), "Design flexural strength", sy("phi M_n", "phiMn"))
            .formula(mul(vec![v(0), v(1)]))
            .input(sy("phi", "phi"), phi, Unit::Ratio)
            .input(sy("M_n", "Mn"), 0.0, Unit::Moment)
            .result(0.0, Unit::Moment)
            .clause("ACI 318-19 21.2.3")
            .note("φ = 0.75 where strand is not developed (Table 21.2.3)")
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
    cite_for(p.sys, &mut steps);
    LocationResult {
        name: loc.name.clone(),
        x: loc.x,
        mu,
        pe: pe * cv.kf,
        e,
        c: 0.0,
        a: 0.0,
        beta1: p.beta1,
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
        approximate: Approximate {
            applicable: false,
            reason: Some("no strand is bonded at this section".into()),
            gamma_p: None,
            rho_p: None,
            fps: None,
            a: None,
            flanged: false,
            mn: None,
            difference: None,
        },
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
        trace: steps,
    }
}

/// Mn in coherent units from a solved state: sum of T_i (d_i - d_C).
pub fn moment_of(model: &Model, st: &State) -> f64 {
    model.steel.iter().map(|s| s.force(st.c, st.a, model.ecu) * (s.d - st.dc)).sum()
}

struct Strength {
    mn_shown: f64,
    strands: Vec<LayerOut>,
    bars: Vec<LayerOut>,
}

#[allow(clippy::too_many_arguments)]
fn record_solution(
    p: &Prepared,
    li: usize,
    model: &Model,
    st: &State,
    at: &[StrandAt],
    tr: &mut Trace,
    closure: f64,
    trials: usize,
) -> Strength {
    let m = p.m;
    // the sketch's steel positions are drawn only in the package (traced runs)
    let sketch = tr.on();
    let cv = p.cv;
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let c = st.c;
    let a = st.a;
    tr.rec(|| {
        Step::new("strength", tag("c"), "Neutral-axis depth from force equilibrium", sy("c", "c"))
            .result(c, Unit::Length)
            .note(format!("Brent's method, {trials} trials; closure |C − ΣT| / C = {}", crate::trace::sci(closure, 1)))
    });
    tr.rec(|| {
        let st_ = Step::new("strength", tag("a"), "Depth of the equivalent stress block", sy("a", "a"))
            .decimals_like(c)
            .input(sy("beta_1", "beta1"), p.beta1, Unit::Ratio)
            .input(sy("c", "c"), c, Unit::Length);
        if a < p.beta1 * c {
            st_.result(a, Unit::Length).note("β1 c exceeds the section depth: the whole section is in compression")
        } else {
            st_.formula(mul(vec![v(0), v(1)]))
                .result(a, Unit::Length)
                .clause("ACI 318-19 22.2.2.4.1")
                .note(format!("the compression block lies in the {}", zone_of(p, a)))
        }
    });
    // concrete parts
    let y0 = p.top - a;
    let part_names: &[&str] = if model.parts.len() == 2 { &["topping", "precast unit"] } else { &["section"] };
    let mut cc_terms = Vec::new();
    for (k, part) in model.parts.iter().enumerate() {
        let mk = part.region.above(y0);
        let fc = part.stress / 0.85;
        let name = part_names[k];
        let kk = k + 1;
        tr.rec(|| {
            Step::new(
                "strength",
                tag(&format!("strength.Acomp.{kk}")),
                format!("Concrete area within the block, {name}"),
                si("A", "\"comp\"", "Acomp", kk),
            )
            .input(sy("a", "a"), a, Unit::Length)
            .result(mk.area, Unit::Area)
            .note("exact area of the outline above depth a (clipped, not sampled)")
        });
        let ck = part.stress * mk.area * cv.kf;
        tr.rec(|| {
            Step::new(
                "strength",
                tag(&format!("strength.C.{kk}")),
                format!("Concrete compression force, {name}"),
                si("C", "", "C", kk),
            )
            .formula(per(mul(vec![n(0.85), v(0), v(1)]), cv.f_div))
            .input(sy("f'_c", "f'c"), fc, Unit::Stress)
            .input(si("A", "\"comp\"", "Acomp", kk), mk.area, Unit::Area)
            .result(ck, Unit::Force)
            .clause("ACI 318-19 22.2.2.4.1")
        });
        cc_terms.push(ck);
    }
    let cc = st.cc * cv.kf;
    if cc_terms.len() > 1 {
        tr.rec(|| {
            Step::new("strength", tag("strength.C"), "Total concrete compression force", sy("C", "C"))
                .formula(add(vec![v(0), v(1)]))
                .input(si("C", "", "C", 1), cc_terms[0], Unit::Force)
                .input(si("C", "", "C", 2), cc_terms[1], Unit::Force)
                .result(cc, Unit::Force)
        });
    }
    tr.rec(|| {
        Step::new("strength", tag("strength.dC"), "Depth of the compression resultant", sy("d_C", "dC"))
            .result(st.dc, Unit::Length)
            .note("centroid of the block, from the clipped outline's first moment")
    });

    // steel layers
    let mut strands = Vec::new();
    let mut bars = Vec::new();
    let mut t_vals = Vec::new();
    let mut d_vals = Vec::new();
    let ns = m.strands.len();
    for (j, stl) in model.steel.iter().enumerate() {
        let is_strand = j < ns;
        let k = if is_strand { j + 1 } else { j - ns + 1 };
        let eps3 = stl.eps3(c, EPS_CU);
        let eps = stl.pre + eps3;
        let f = stl.stress_at(eps);
        let inside = stl.inside(a);
        let force = stl.force(c, a, EPS_CU) * cv.kf;
        let (kind, subs) = if is_strand { ("strand", "\"p\"") } else { ("bar", "\"s\"") };
        let active = stl.area > 0.0;
        if active {
            let pid = if is_strand { "strand" } else { "bar" };
            tr.rec(|| {
                Step::new(
                    "strength",
                    tag(&format!("strength.{pid}.eps3.{k}")),
                    format!("Flexural strain, {kind} layer {k}"),
                    si("epsilon", if is_strand { "3" } else { "s" }, if is_strand { "eps3" } else { "eps_s" }, k),
                )
                .formula(div(mul(vec![n(EPS_CU), sub(v(0), v(1))]), v(1)))
                .input(si("d", subs, "d", k), stl.d, Unit::Length)
                .input(sy("c", "c"), c, Unit::Length)
                .result(eps3, Unit::Strain)
                .clause("ACI 318-19 22.2.1.2, 22.2.2.1")
            });
            if is_strand {
                let i = j;
                tr.rec(|| {
                    Step::new(
                        "strength",
                        tag(&format!("strength.strand.eps.{k}")),
                        format!("Total strand strain, layer {k}"),
                        si("epsilon", "\"ps\"", "eps_ps", k),
                    )
                    .formula(add(vec![v(0), v(1), v(2)]))
                    .input(si("epsilon", "1", "eps1", k), at[i].eps1, Unit::Strain)
                    .input(si("epsilon", "2", "eps2", k), at[i].eps2, Unit::Strain)
                    .input(si("epsilon", "3", "eps3", k), eps3, Unit::Strain)
                    .result(eps, Unit::Strain)
                });
                let curve = p.curves[i];
                let raw = match stl.law {
                    Law::Strand(cu) => cu.stress(eps),
                    Law::Bar(b) => b.stress(eps),
                };
                tr.rec(|| {
                    let stp = Step::new(
                        "strength",
                        tag(&format!("strength.strand.f.{k}")),
                        format!("Strand stress, layer {k}"),
                        si("f", "\"ps\"", "fps", k),
                    );
                    if raw > stl.cap {
                        stp.formula(min(vec![curve.piece(eps).formula, v(1)]))
                            .input(si("epsilon", "\"ps\"", "eps_ps", k), eps, Unit::Strain)
                            .input(si("f", "\"px\"", "fpx", k), stl.cap, Unit::Stress)
                            .result(f, Unit::Stress)
                            .clause("ACI 318-19 25.4.8.3")
                            .note(format!(
                                "{}; limited to fpx, the strand is not fully developed here",
                                curve.model.name()
                            ))
                    } else {
                        let pc = curve.piece(eps);
                        stp.formula(pc.formula)
                            .input(si("epsilon", "\"ps\"", "eps_ps", k), eps, Unit::Strain)
                            .result(f, Unit::Stress)
                            .note(format!("{}, {}", curve.model.name(), pc.note))
                    }
                });
            } else {
                let b = match stl.law {
                    Law::Bar(b) => b,
                    Law::Strand(_) => Bar { fy: 0.0, es: 0.0, hardening: 0.0, fu: 0.0 },
                };
                tr.rec(|| {
                    let stp = Step::new(
                        "strength",
                        tag(&format!("strength.bar.f.{k}")),
                        format!("Bar stress, layer {k}"),
                        si("f", "\"s\"", "fs", k),
                    );
                    if (b.es * eps).abs() >= b.fy {
                        stp.formula(if eps >= 0.0 { v(0) } else { neg(v(0)) })
                            .input(sy("f_y", "fy"), b.fy, Unit::Stress)
                            .result(f, Unit::Stress)
                            .note(if eps >= 0.0 { "yielded in tension" } else { "yielded in compression" })
                    } else {
                        stp.formula(mul(vec![v(0), v(1)]))
                            .input(sy("E_s", "Es"), b.es, Unit::Stress)
                            .input(si("epsilon", "s", "eps_s", k), eps, Unit::Strain)
                            .result(f, Unit::Stress)
                            .note("elastic")
                    }
                });
            }
            tr.rec(|| {
                let fsym = if is_strand { si("f", "\"ps\"", "fps", k) } else { si("f", "\"s\"", "fs", k) };
                let asym = if is_strand { si("A", "\"ps\"", "Aps", k) } else { si("A", "\"s\"", "As", k) };
                let stp = Step::new(
                    "strength",
                    tag(&format!("strength.{pid}.T.{k}")),
                    format!("Force, {kind} layer {k}"),
                    si("T", subs, "T", k),
                );
                if inside > 0.0 {
                    stp.formula(per(mul(vec![v(0), add(vec![v(1), mul(vec![v(2), v(3)])])]), cv.f_div))
                        .input(asym, stl.area, Unit::Area)
                        .input(fsym, f, Unit::Stress)
                        .input(sy("0.85 f'_c", "0.85f'c"), stl.displaced, Unit::Stress)
                        .input(sy("chi", "share in block"), inside, Unit::Ratio)
                        .result(force, Unit::Force)
                        .note("inside the stress block: the concrete it displaces is deducted; χ is the share of the layer within the block")
                } else {
                    stp.formula(per(mul(vec![v(0), v(1)]), cv.f_div))
                        .input(asym, stl.area, Unit::Area)
                        .input(fsym, f, Unit::Stress)
                        .result(force, Unit::Force)
                }
            });
            t_vals.push((kind, k, force));
            d_vals.push(stl.d);
        }
        let (eps1, eps2, fse, label, count, unit_area, diameter, points) = if is_strand {
            let s_ = &m.strands[j];
            let y = p.top - stl.d;
            (
                Some(at[j].eps1),
                Some(at[j].eps2),
                Some(at[j].fse),
                strand_label(s_, p.sys),
                s_.count,
                s_.area,
                s_.diameter,
                if sketch { layer_points(&m.region, y, s_.count, s_.diameter) } else { Vec::new() },
            )
        } else {
            let b = &m.bars[j - ns];
            let label = match b.size {
                Some(sz) => format!("{} {}", b.count, sz),
                None => format!("{} × {} {}", b.count, crate::trace::show(b.diameter), p.sys.names().length),
            };
            let y = p.top - stl.d;
            (
                None,
                None,
                None,
                label,
                b.count,
                b.area,
                b.diameter,
                if sketch { layer_points(&m.region, y, b.count, b.diameter) } else { Vec::new() },
            )
        };
        let out = LayerOut {
            kind,
            index: k,
            label,
            count,
            unit_area,
            area: if is_strand { m.strands[j].total_area() } else { stl.area },
            depth: stl.d,
            eps1,
            eps2,
            eps3,
            eps,
            stress: if active { f } else { 0.0 },
            force,
            fse,
            cap: if stl.cap.is_finite() { Some(stl.cap) } else { None },
            in_block: inside,
            active,
            points,
            diameter,
        };
        if is_strand { strands.push(out) } else { bars.push(out) }
    }
    let t_sum: f64 = t_vals.iter().map(|t| t.2).sum();
    tr.rec(|| {
        let mut stp = Step::new("strength", tag("strength.T"), "Sum of steel forces", sy("Sigma T", "ΣT"));
        let mut terms = Vec::new();
        for (i, (kind, k, f)) in t_vals.iter().enumerate() {
            terms.push(v(i));
            stp = stp.input(si("T", if *kind == "strand" { "\"p\"" } else { "\"s\"" }, "T", *k), *f, Unit::Force);
        }
        stp.formula(add(terms)).result(t_sum, Unit::Force).note("tension positive")
    });
    tr.rec(|| {
        Step::new("strength", tag("strength.R"), "Equilibrium residual", sy("C - Sigma T", "C - ΣT"))
            .formula(sub(v(0), v(1)))
            .input(sy("C", "C"), cc, Unit::Force)
            .input(sy("Sigma T", "ΣT"), t_sum, Unit::Force)
            .result(cc - t_sum, Unit::Force)
            .note(format!("closure {} of C (required below 10⁻⁹)", crate::trace::sci(closure, 1)))
    });
    let mn_shown = moment_of(model, st) * cv.km;
    tr.rec(|| {
        let mut stp = Step::new("strength", tag("strength.Mn"), "Nominal flexural strength", sy("M_n", "Mn"));
        let mut terms = Vec::new();
        let nt = t_vals.len();
        for (i, (kind, k, f)) in t_vals.iter().enumerate() {
            terms.push(mul(vec![v(2 * i), sub(v(2 * i + 1), v(2 * nt))]));
            let sub_s = if *kind == "strand" { "\"p\"" } else { "\"s\"" };
            stp = stp.input(si("T", sub_s, "T", *k), *f, Unit::Force).input(
                si("d", sub_s, "d", *k),
                d_vals[i],
                Unit::Length,
            );
        }
        stp.input(sy("d_C", "dC"), st.dc, Unit::Length)
            .formula(per(add(terms), cv.m_div))
            .result(mn_shown, Unit::Moment)
            .note("moments of the steel forces about the compression resultant")
    });
    Strength { mn_shown, strands, bars }
}

/// Whether a member is a one-way slab for the minimum-reinforcement clause.
pub fn is_slab(m: &Member) -> bool {
    m.kind == Kind::OneWaySlab
}
