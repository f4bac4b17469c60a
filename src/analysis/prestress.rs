//! The prestress at a check location: each strand layer's depth there (the harp
//! profile from the nearer end), its bond and transfer (from the nearer end, past any
//! debonding), the effective prestress, Pe, its eccentricity, and the strains eps1
//! and eps2 that strain compatibility starts from.

use super::checks::{self, layer_step, tag};
use super::prepare::Prepared;
use super::station::Station;
use super::{Development, sy, sym_k};
use crate::basis::Clause;
use crate::input::model::{FseSource, StrandLayer};
use crate::trace::{Step, Trace, Unit, f::*};

/// Per strand layer, the state at a location before the solution.
pub(super) struct StrandAt {
    /// depth below the section top
    pub d: f64,
    /// distance below the precast centroid
    pub yb: f64,
    pub fse: f64,
    pub eps1: f64,
    pub eps2: f64,
    pub active: bool,
    pub dev: Option<Development>,
}

/// Each strand layer at a location: depth (harped profile at x), effective prestress
/// after transfer, and whether it is bonded there. Transfer, development, debonding and
/// the harp profile are measured from the nearer member end.
pub(super) fn strands_at(p: &Prepared, li: usize, loc: &Station, tr: &mut Trace) -> Vec<StrandAt> {
    let m = p.m;
    let along = loc.along(m.length);
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
            sym_k("d", "\"h\"", "dh", k),
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

/// The prestress of a location: each layer's state, the force Pe and its eccentricity
/// below the precast centroid.
pub(super) struct Prestress {
    pub at: Vec<StrandAt>,
    pub pe: f64,
    pub e: f64,
}

/// The prestress at a location, every step recorded.
pub(super) fn at_location(p: &Prepared, li: usize, loc: &Station, tr: &mut Trace) -> Prestress {
    let m = p.m;
    let mut at = strands_at(p, li, loc, tr);
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
    for (i, (s, a)) in m.strands.iter().zip(&at).enumerate() {
        record_layer(p, li, i, s, a, tr);
    }
    tr.rec(|| force_step(p, li, &at, pe));
    tr.rec(|| eccentricity_step(p, li, &at, pe, e));
    for (i, a) in at.iter().enumerate() {
        tr.rec(|| decompression_step(p, li, i + 1, a, pe, e));
    }

    Prestress { at, pe, e }
}

/// The member's prestress, once for all its sections: each layer's jacking stress
/// (where losses are given), its effective prestress fse and, for a member whose length
/// is given, its transfer length.
pub(super) fn record_member(p: &Prepared, tr: &mut Trace) {
    for (i, s) in p.m.strands.iter().enumerate() {
        let k = i + 1;
        let id = |what: &str| format!("prestress.{what}.{k}");
        if let FseSource::Losses { jacking, fpj, .. } = s.fse_source {
            tr.rec(|| {
                Step::new("prestress", id("fpj"), format!("Jacking stress, layer {k}"), sym_k("f", "\"pj\"", "fpj", k))
                    .formula(mul(vec![v(0), v(1)]))
                    .input(sy("f_\"pj\" / f_\"pu\"", "fpj/fpu"), jacking, Unit::Ratio)
                    .input(sy("f_\"pu\"", "fpu"), s.fpu, Unit::Stress)
                    .result(fpj, Unit::Stress)
                    .clause(format!("{} (limit {})", p.basis.cite(Clause::JackingLimit), p.basis.jacking_limit_text()))
            });
        }
        let computed = matches!(s.fse_source, FseSource::Computed { .. });
        if !computed {
            tr.rec(|| {
                let st = Step::new(
                    "prestress",
                    id("fse"),
                    format!("Effective prestress, layer {k}"),
                    sym_k("f", "\"se\"", "fse", k),
                );
                match s.fse_source {
                    FseSource::Given => st.result(s.fse, Unit::Stress).note("given in the input"),
                    FseSource::Losses { fpj, losses, .. } => st
                        .formula(sub(v(0), v(1)))
                        .input(sym_k("f", "\"pj\"", "fpj", k), fpj, Unit::Stress)
                        .input(sym_k("Delta f", "p", "Δfp", k), losses, Unit::Stress)
                        .result(s.fse, Unit::Stress)
                        .note("jacking stress less the given losses"),
                    // not recorded here: the computed losses record fse with their steps
                    FseSource::Computed { .. } => st.result(s.fse, Unit::Stress),
                }
            });
        }
        if p.m.length.is_some() {
            tr.rec(|| checks::transfer_length_step(p, k, s));
        }
    }
}

/// A layer's prestress steps at a location: fse at x where less is transferred there,
/// and eps1 (fse itself is the member's).
fn record_layer(p: &Prepared, li: usize, i: usize, s: &StrandLayer, a: &StrandAt, tr: &mut Trace) {
    let k = i + 1;
    let reduced = a.fse != s.fse;
    if reduced {
        tr.rec(|| fse_at_x_step(li, k, s, a));
    }
    tr.rec(|| {
        let title = "Strain from effective prestress";
        layer_step("prestress", li, "prestress.eps1", k, title, sym_k("epsilon", "1", "eps1", k))
            .formula(div(v(0), v(1)))
            .input(
                if reduced { sym_k("f", "\"se,x\"", "fse,x", k) } else { sym_k("f", "\"se\"", "fse", k) },
                a.fse,
                Unit::Stress,
            )
            .input(sy("E_\"ps\"", "Eps"), p.curves[i].eps_modulus, Unit::Stress)
            .result(a.eps1, Unit::Strain)
            .note("Eps is the initial slope of the strand curve")
    });
}

/// fse at x of a layer that transfers less than fse there: within the transfer length,
/// debonded, or before the bond begins.
fn fse_at_x_step(li: usize, k: usize, s: &StrandLayer, a: &StrandAt) -> Step {
    let title = "Effective prestress at x";
    let st = layer_step("prestress", li, "prestress.fsex", k, title, sym_k("f", "\"se,x\"", "fse,x", k));
    match &a.dev {
        Some(d) if d.x_bond > 0.0 => st
            .formula(div(mul(vec![v(0), v(1)]), v(2)))
            .input(sym_k("f", "\"se\"", "fse", k), s.fse, Unit::Stress)
            .input(sy("x_b", "xb"), d.x_bond, Unit::Length)
            .input(sy("ell_\"tr\"", "ltr"), d.transfer_length, Unit::Length)
            .result(a.fse, Unit::Stress)
            .note("inside the transfer length: prestress transferred in proportion to the bonded length"),
        _ if s.debonded_length > 0.0 => st.result(a.fse, Unit::Stress).note("debonded here: no prestress"),
        _ => st.result(a.fse, Unit::Stress).note("at the member end: the bond has not begun, no prestress"),
    }
}

fn force_step(p: &Prepared, li: usize, at: &[StrandAt], pe: f64) -> Step {
    let mut st = Step::new("prestress", tag(li, "prestress.Pe"), "Effective prestress force", sy("P_e", "Pe"));
    let mut terms = Vec::new();
    for (i, s) in p.m.strands.iter().enumerate() {
        terms.push(mul(vec![v(2 * i), v(2 * i + 1)]));
        st = st.input(sym_k("f", "\"se\"", "fse", i + 1), at[i].fse, Unit::Stress).input(
            sym_k("A", "\"ps\"", "Aps", i + 1),
            s.total_area(),
            Unit::Area,
        );
    }
    st.formula(per(add(terms), p.cv.f_div)).result(pe * p.cv.kf, Unit::Force)
}

fn eccentricity_step(p: &Prepared, li: usize, at: &[StrandAt], pe: f64, e: f64) -> Step {
    let title = "Eccentricity of the prestress below the precast centroid";
    let mut st = Step::new("prestress", tag(li, "prestress.e"), title, sy("e", "e"));
    let mut terms = Vec::new();
    for (i, s) in p.m.strands.iter().enumerate() {
        terms.push(mul(vec![v(3 * i), v(3 * i + 1), v(3 * i + 2)]));
        st = st
            .input(sym_k("f", "\"se\"", "fse", i + 1), at[i].fse, Unit::Stress)
            .input(sym_k("A", "\"ps\"", "Aps", i + 1), s.total_area(), Unit::Area)
            .input(sym_k("y", "", "y", i + 1), at[i].yb, Unit::Length);
    }
    let k = 3 * p.m.strands.len();
    st = st.input(sy("P_e", "Pe"), pe * p.cv.kf, Unit::Force);
    if pe > 0.0 {
        st = st.formula(div(per(add(terms), p.cv.f_div), v(k)));
    } else {
        st = st.note("no prestress at this location");
    }
    st.result(e, Unit::Length).note("y: each layer's distance below the centroid of the precast unit")
}

/// eps2 = Pe/(A Ec) + Pe e y / (I Ec), with Pe shown.
fn decompression_step(p: &Prepared, li: usize, k: usize, a: &StrandAt, pe: f64, e: f64) -> Step {
    let cv = p.cv;
    let (area, inertia, ec) = (p.precast.area, p.precast.i, p.m.concrete.ec);
    let title = "Decompression strain";
    layer_step("prestress", li, "prestress.eps2", k, title, sym_k("epsilon", "2", "eps2", k))
        .formula(add(vec![
            per(div(v(0), mul(vec![v(1), v(2)])), cv.kf),
            per(div(mul(vec![v(0), v(3), v(4)]), mul(vec![v(5), v(2)])), cv.kf),
        ]))
        .input(sy("P_e", "Pe"), pe * cv.kf, Unit::Force)
        .input(sy("A", "A"), area, Unit::Area)
        .input(sy("E_c", "Ec"), ec, Unit::Stress)
        .input(sy("e", "e"), e, Unit::Length)
        .input(sym_k("y", "", "y", k), a.yb, Unit::Length)
        .input(sy("I", "I"), inertia, Unit::Inertia)
        .result(a.eps2, Unit::Strain)
        .note("strain change in the concrete at the layer when the prestress is decompressed; precast section alone")
}
