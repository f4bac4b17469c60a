//! Strength by strain compatibility at a check location: the model of the section (the
//! concrete parts of the stress block and every steel layer with its prestrain), the
//! equilibrium found by Brent's method, the strand stress limited where the strand is
//! not fully developed (then solved again), and every step of the solution: the block,
//! each layer's strains, stress and force, and Mn.

use super::prepare::Prepared;
use super::prestress::StrandAt;
use super::solve::{self, Model, Part, State, Steel, SteelLaw, Trial};
use super::station::Station;
use super::{LayerOut, OtherBlock, checks, sy, sym_k};
use crate::basis::Clause;
use crate::error::{Error, Result};
use crate::input::model::{BlockMode, StrandLayer};
use crate::material::steel::Bar;
use crate::section::{P, Region};
use crate::trace::{Step, Trace, Unit, f::*};
use crate::units::System;

pub(super) fn parts_for<'a>(p: &'a Prepared, block: Option<BlockMode>) -> Vec<Part<'a>> {
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

pub(super) fn strand_label(s: &StrandLayer, sys: System) -> String {
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

pub(super) fn model_for<'a>(p: &'a Prepared, parts: Vec<Part<'a>>, at: &[StrandAt], caps: &[f64]) -> Model<'a> {
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
            law: SteelLaw::Strand(p.curves[i]),
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
            law: SteelLaw::Bar(Bar { fy: b.fy, es: b.es, hardening: 0.0, fu: b.fy }),
            displaced: block_stress_at(&parts, p, d),
        });
    }
    Model { parts, steel, top: p.top, depth: m.total_height(), beta1: p.beta1, ecu: p.basis.crushing_strain() }
}

pub(super) fn solve_err(p: &Prepared, loc: &str, e: solve::NoSolution) -> Error {
    Error::Analysis { member: p.m.id.clone(), location: loc.to_string(), message: e.to_string() }
}

pub(super) fn zone_of(p: &Prepared, a: f64) -> &'static str {
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

/// Where the sketch draws the bars or strands of a layer: spread over the concrete the
/// whole bar occupies (from y - d/2 to y + d/2), so none is drawn in a void; if they do
/// not fit there, over the concrete at y.
pub(super) fn layer_points(region: &Region, y: f64, count: u32, d: f64) -> Vec<P> {
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

/// A location solved: the model and its state, the trials, the stress limits of
/// strand not developed there, the recorded layers and Mn, and the result with the
/// other stress-block option where it differs.
pub(super) struct Solved<'a> {
    pub model: Model<'a>,
    pub st: State,
    pub log: Vec<Trial>,
    pub caps: Vec<f64>,
    pub strength: Strength,
    pub closure: f64,
    pub block: Option<BlockMode>,
    pub other_block: Option<OtherBlock>,
}

/// Solves a location by strain compatibility, limiting the stress of strand not
/// developed there (25.4.8.3 in ACI 318-19) and solving again, every step recorded.
pub(super) fn solve_location<'a>(
    p: &'a Prepared,
    li: usize,
    loc: &Station,
    at: &mut [StrandAt],
    tr: &mut Trace,
    notes: &mut Vec<String>,
) -> Result<Solved<'a>> {
    let m = p.m;
    let sys = p.sys;
    let cv = p.cv;
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let block = m.topping.as_ref().map(|t| t.block);
    let no_caps = vec![f64::INFINITY; m.strands.len()];
    let model = model_for(p, parts_for(p, block), at, &no_caps);
    let mut log = Vec::new();
    let mut st = model.solve(Some(&mut log)).map_err(|e| solve_err(p, &loc.name, e))?;
    let mut model = model;
    // development: limit the stress of strands not developed here, then solve again
    let fps_full: Vec<f64> =
        model.steel[..m.strands.len()].iter().map(|s| s.stress_at(s.pre + s.eps3(st.c, model.ecu))).collect();
    let mut caps = no_caps.clone();
    if loc.x.is_some() {
        for (i, s) in m.strands.iter().enumerate() {
            if let Some(cap) = checks::development(p, li, i, s, fps_full[i], &mut at[i], tr) {
                caps[i] = cap;
            }
        }
        if caps.iter().any(|c| c.is_finite()) {
            model = model_for(p, parts_for(p, block), at, &caps);
            log.clear();
            st = model.solve(Some(&mut log)).map_err(|e| solve_err(p, &loc.name, e))?;
            notes.push(format!(
                "Strands are not fully developed here: their stress is limited to fpx ({}) and the equilibrium is solved with that limit.",
                p.basis.cite(Clause::StrandStressLimit)
            ));
        }
    }
    let closure = (st.residual / st.cc).abs();
    let strength = record_solution(p, li, &model, &st, at, tr, closure, log.len());

    // ---- the other block option, for comparison ------------------------------------
    let other_block = match (block, &m.topping) {
        (Some(b), Some(tp)) if st.a > tp.thickness || tp.concrete.fc != m.concrete.fc => {
            let other = if b == BlockMode::Topping { BlockMode::TwoPart } else { BlockMode::Topping };
            let om = model_for(p, parts_for(p, Some(other)), at, &caps);
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

    Ok(Solved { model, st, log, caps, strength, closure, block, other_block })
}

/// Mn in coherent units from a solved state: sum of T_i (d_i - d_C).
pub fn moment_of(model: &Model, st: &State) -> f64 {
    model.steel.iter().map(|s| s.force(st.c, st.a, model.ecu) * (s.d - st.dc)).sum()
}

pub(super) struct Strength {
    pub mn_shown: f64,
    pub strands: Vec<LayerOut>,
    pub bars: Vec<LayerOut>,
}

/// The recorded solution: the block, each steel layer, the totals and Mn.
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
    let cc = record_block(p, li, model, st, tr, closure, trials);
    let mut strands = Vec::new();
    let mut bars = Vec::new();
    let mut forces = Vec::new();
    for (j, stl) in model.steel.iter().enumerate() {
        let (out, total) = record_layer(p, li, model, st, at, j, stl, tr);
        forces.extend(total);
        if out.kind == "strand" { strands.push(out) } else { bars.push(out) }
    }
    let mn_shown = record_totals(p, li, model, st, &forces, cc, closure, tr);
    Strength { mn_shown, strands, bars }
}

/// A steel layer's force at nominal strength, for the sums: its kind, number within
/// its kind, force (shown units) and depth.
type LayerForce = (&'static str, usize, f64, f64);

/// The neutral axis, the block, the concrete force of each part and the depth of the
/// compression resultant; returns the total concrete force (shown units).
fn record_block(
    p: &Prepared,
    li: usize,
    model: &Model,
    st: &State,
    tr: &mut Trace,
    closure: f64,
    trials: usize,
) -> f64 {
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
                .clause(p.basis.cite(Clause::StressBlock))
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
                sym_k("A", "\"comp\"", "Acomp", kk),
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
                sym_k("C", "", "C", kk),
            )
            .formula(per(mul(vec![n(0.85), v(0), v(1)]), cv.f_div))
            .input(sy("f'_c", "f'c"), fc, Unit::Stress)
            .input(sym_k("A", "\"comp\"", "Acomp", kk), mk.area, Unit::Area)
            .result(ck, Unit::Force)
            .clause(p.basis.cite(Clause::StressBlock))
        });
        cc_terms.push(ck);
    }
    let cc = st.cc * cv.kf;
    if cc_terms.len() > 1 {
        tr.rec(|| {
            Step::new("strength", tag("strength.C"), "Total concrete compression force", sy("C", "C"))
                .formula(add(vec![v(0), v(1)]))
                .input(sym_k("C", "", "C", 1), cc_terms[0], Unit::Force)
                .input(sym_k("C", "", "C", 2), cc_terms[1], Unit::Force)
                .result(cc, Unit::Force)
        });
    }
    tr.rec(|| {
        Step::new("strength", tag("strength.dC"), "Depth of the compression resultant", sy("d_C", "dC"))
            .result(st.dc, Unit::Length)
            .note("centroid of the block, from the clipped outline's first moment")
    });

    cc
}

/// A steel layer's state at nominal strength, as the steps and the layer table read it.
struct LayerAt {
    /// Position among the strand layers then the bar layers, and the layer's number
    /// within its kind (1-based).
    j: usize,
    k: usize,
    is_strand: bool,
    eps3: f64,
    eps: f64,
    f: f64,
    force: f64,
    /// The share of the layer inside the stress block.
    inside: f64,
    active: bool,
}

/// One steel layer at nominal strength: its strains, stress and force, recorded; its
/// row of the layer table; and its force for the sums where it carries any.
#[allow(clippy::too_many_arguments)]
fn record_layer(
    p: &Prepared,
    li: usize,
    model: &Model,
    st: &State,
    at: &[StrandAt],
    j: usize,
    stl: &Steel,
    tr: &mut Trace,
) -> (LayerOut, Option<LayerForce>) {
    let ns = p.m.strands.len();
    let is_strand = j < ns;
    let eps3 = stl.eps3(st.c, model.ecu);
    let eps = stl.pre + eps3;
    let l = LayerAt {
        j,
        k: if is_strand { j + 1 } else { j - ns + 1 },
        is_strand,
        eps3,
        eps,
        f: stl.stress_at(eps),
        force: stl.force(st.c, st.a, model.ecu) * p.cv.kf,
        inside: stl.inside(st.a),
        active: stl.area > 0.0,
    };
    let kind = if is_strand { "strand" } else { "bar" };
    let total = l.active.then(|| {
        layer_steps(p, li, model, st.c, at, stl, &l, tr);
        (kind, l.k, l.force, stl.d)
    });
    // the sketch's steel positions are drawn only in the package (traced runs)
    (layer_row(p, at, stl, &l, tr.on()), total)
}

/// The steps of a layer that carries force: its flexural strain, (strand) its total
/// strain, its stress and its force.
#[allow(clippy::too_many_arguments)]
fn layer_steps(
    p: &Prepared,
    li: usize,
    model: &Model,
    c: f64,
    at: &[StrandAt],
    stl: &Steel,
    l: &LayerAt,
    tr: &mut Trace,
) {
    let cv = p.cv;
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let LayerAt { k, is_strand, eps3, f, force, inside, .. } = *l;
    let (kind, subs) = if is_strand { ("strand", "\"p\"") } else { ("bar", "\"s\"") };
    let pid = if is_strand { "strand" } else { "bar" };
    tr.rec(|| {
        Step::new(
            "strength",
            tag(&format!("strength.{pid}.eps3.{k}")),
            format!("Flexural strain, {kind} layer {k}"),
            sym_k("epsilon", if is_strand { "3" } else { "s" }, if is_strand { "eps3" } else { "eps_s" }, k),
        )
        .formula(div(mul(vec![n(model.ecu), sub(v(0), v(1))]), v(1)))
        .input(sym_k("d", subs, "d", k), stl.d, Unit::Length)
        .input(sy("c", "c"), c, Unit::Length)
        .result(eps3, Unit::Strain)
        .clause(p.basis.cite(Clause::StrainCompatibility))
    });
    if is_strand {
        strand_steps(p, &tag, at, stl, l, tr);
    } else {
        bar_stress_step(&tag, stl, l, tr);
    }
    tr.rec(|| {
        let fsym = if is_strand { sym_k("f", "\"ps\"", "fps", k) } else { sym_k("f", "\"s\"", "fs", k) };
        let asym = if is_strand { sym_k("A", "\"ps\"", "Aps", k) } else { sym_k("A", "\"s\"", "As", k) };
        let stp = Step::new(
            "strength",
            tag(&format!("strength.{pid}.T.{k}")),
            format!("Force, {kind} layer {k}"),
            sym_k("T", subs, "T", k),
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
}

/// A strand layer's total strain and its stress (held to fpx where it is not fully
/// developed).
fn strand_steps(p: &Prepared, tag: &dyn Fn(&str) -> String, at: &[StrandAt], stl: &Steel, l: &LayerAt, tr: &mut Trace) {
    let LayerAt { j: i, k, eps3, eps, f, .. } = *l;
    tr.rec(|| {
        Step::new(
            "strength",
            tag(&format!("strength.strand.eps.{k}")),
            format!("Total strand strain, layer {k}"),
            sym_k("epsilon", "\"ps\"", "eps_ps", k),
        )
        .formula(add(vec![v(0), v(1), v(2)]))
        .input(sym_k("epsilon", "1", "eps1", k), at[i].eps1, Unit::Strain)
        .input(sym_k("epsilon", "2", "eps2", k), at[i].eps2, Unit::Strain)
        .input(sym_k("epsilon", "3", "eps3", k), eps3, Unit::Strain)
        .result(eps, Unit::Strain)
    });
    let curve = p.curves[i];
    let raw = stl.law.stress(eps);
    tr.rec(|| {
        let stp = Step::new(
            "strength",
            tag(&format!("strength.strand.f.{k}")),
            format!("Strand stress, layer {k}"),
            sym_k("f", "\"ps\"", "fps", k),
        );
        if raw > stl.cap {
            stp.formula(min(vec![curve.piece(eps).formula, v(1)]))
                .input(sym_k("epsilon", "\"ps\"", "eps_ps", k), eps, Unit::Strain)
                .input(sym_k("f", "\"px\"", "fpx", k), stl.cap, Unit::Stress)
                .result(f, Unit::Stress)
                .clause(p.basis.cite(Clause::StrandStressLimit))
                .note(format!("{}; limited to fpx, the strand is not fully developed here", curve.model.name()))
        } else {
            let pc = curve.piece(eps);
            stp.formula(pc.formula)
                .input(sym_k("epsilon", "\"ps\"", "eps_ps", k), eps, Unit::Strain)
                .result(f, Unit::Stress)
                .note(format!("{}, {}", curve.model.name(), pc.note))
        }
    });
}

/// A bar layer's stress: elastic, or yielded.
fn bar_stress_step(tag: &dyn Fn(&str) -> String, stl: &Steel, l: &LayerAt, tr: &mut Trace) {
    let LayerAt { k, eps, f, .. } = *l;
    let b = match stl.law {
        SteelLaw::Bar(b) => b,
        SteelLaw::Strand(_) => Bar { fy: 0.0, es: 0.0, hardening: 0.0, fu: 0.0 },
    };
    tr.rec(|| {
        let stp = Step::new(
            "strength",
            tag(&format!("strength.bar.f.{k}")),
            format!("Bar stress, layer {k}"),
            sym_k("f", "\"s\"", "fs", k),
        );
        if (b.es * eps).abs() >= b.fy {
            stp.formula(if eps >= 0.0 { v(0) } else { neg(v(0)) })
                .input(sy("f_y", "fy"), b.fy, Unit::Stress)
                .result(f, Unit::Stress)
                .note(if eps >= 0.0 { "yielded in tension" } else { "yielded in compression" })
        } else {
            stp.formula(mul(vec![v(0), v(1)]))
                .input(sy("E_s", "Es"), b.es, Unit::Stress)
                .input(sym_k("epsilon", "s", "eps_s", k), eps, Unit::Strain)
                .result(f, Unit::Stress)
                .note("elastic")
        }
    });
}

/// A layer's row of the layer table (and its bars or strands in the sketch when
/// `sketch`).
fn layer_row(p: &Prepared, at: &[StrandAt], stl: &Steel, l: &LayerAt, sketch: bool) -> LayerOut {
    let m = p.m;
    let ns = m.strands.len();
    let LayerAt { j, k, is_strand, eps3, eps, f, force, inside, active } = *l;
    let kind = if is_strand { "strand" } else { "bar" };
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
    LayerOut {
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
    }
}

/// The sum of the steel forces, the equilibrium residual and Mn (shown units).
#[allow(clippy::too_many_arguments)]
fn record_totals(
    p: &Prepared,
    li: usize,
    model: &Model,
    st: &State,
    forces: &[LayerForce],
    cc: f64,
    closure: f64,
    tr: &mut Trace,
) -> f64 {
    let cv = p.cv;
    let tag = |k: &str| format!("L{}.{k}", li + 1);
    let t_sum: f64 = forces.iter().map(|t| t.2).sum();
    tr.rec(|| {
        let mut stp = Step::new("strength", tag("strength.T"), "Sum of steel forces", sy("Sigma T", "ΣT"));
        let mut terms = Vec::new();
        for (i, (kind, k, f, _)) in forces.iter().enumerate() {
            terms.push(v(i));
            stp = stp.input(sym_k("T", if *kind == "strand" { "\"p\"" } else { "\"s\"" }, "T", *k), *f, Unit::Force);
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
        let nt = forces.len();
        for (i, (kind, k, f, d)) in forces.iter().enumerate() {
            terms.push(mul(vec![v(2 * i), sub(v(2 * i + 1), v(2 * nt))]));
            let sub_s = if *kind == "strand" { "\"p\"" } else { "\"s\"" };
            stp = stp.input(sym_k("T", sub_s, "T", *k), *f, Unit::Force).input(
                sym_k("d", sub_s, "d", *k),
                *d,
                Unit::Length,
            );
        }
        stp.input(sy("d_C", "dC"), st.dc, Unit::Length)
            .formula(per(add(terms), cv.m_div))
            .result(mn_shown, Unit::Moment)
            .note("moments of the steel forces about the compression resultant")
    });
    mn_shown
}
