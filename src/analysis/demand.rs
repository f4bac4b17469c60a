//! The demand along the span, from the member's service loads: the self-weight and the
//! topping from the section, the area loads times the tributary width, the point loads;
//! the moments of a simple span between the bearings (the overhangs past them
//! included) by statics; the factored moment by the basis's load combinations, the
//! governing one named; and the non-composite moment Mnc that the composite cracking
//! moment needs.
//!
//! Sign: sagging moments (tension at the bottom) are positive. x is from the left end.

use super::prepare::Prepared;
use super::{sy, sym_k};
use crate::basis::{Clause, Combination};
use crate::input::model::{LineLoad, LoadKind, Loads, Member, PointLoad};
use crate::trace::{Expr, Step, Trace, Unit, f::*};
use crate::units::System;
use serde::Serialize;

/// Standard gravity, m/s² (for the weight of a density in kg/m³; common practice).
const G: f64 = 9.806_65;

/// The loads of a member, ready for statics: every uniform load (self-weight and
/// topping included) and the point loads, with the combinations of its basis.
#[derive(Debug, Clone, Serialize)]
pub struct Demand {
    pub length: f64,
    pub span: f64,
    /// Distance of each bearing from its end.
    pub bearing: f64,
    pub width: f64,
    pub uniform: Vec<LineLoad>,
    pub points: Vec<PointLoad>,
    pub combinations: Vec<Combination>,
    pub live_factor: f64,
    pub live_factor_reason: Option<String>,
    pub shored: bool,
    /// The size of the largest hogging (negative) factored moment, at the overhangs
    /// (0 without overhangs): shown, not checked.
    pub hogging: f64,
}

/// The moments at a section.
#[derive(Debug, Clone, Serialize)]
pub struct MomentsAt {
    pub x: f64,
    /// Unfactored moment of each load kind (dead, live, roof live, snow).
    pub by_kind: [f64; 4],
    /// Each combination's factored moment, in the basis's order.
    pub factored: Vec<f64>,
    /// The governing (largest) factored moment, at least 0: the sagging demand.
    pub mu: f64,
    /// Index of the governing combination.
    pub combination: usize,
    /// The unfactored moment on the precast unit alone (self-weight; the topping of
    /// unshored construction): Mnc.
    pub mnc: f64,
}

impl Demand {
    /// The demand of a member with loads: the self-weight and topping derived from the
    /// section (each recorded), then the given loads (each recorded).
    pub(super) fn derive(p: &Prepared, loads: &Loads, tr: &mut Trace) -> Demand {
        let m = p.m;
        let sys = p.sys;
        let length = m.length.unwrap_or(loads.span);
        let mut uniform = Vec::new();
        let w_sw = weight(sys, loads.density, p.precast.area);
        tr.rec(|| {
            weight_step(
                sys,
                "D.wsw",
                "Self-weight of the precast unit",
                "sw",
                loads.density,
                p.precast.area,
                w_sw,
                "the area of the precast section times its weight",
            )
        });
        uniform.push(LineLoad {
            kind: LoadKind::Dead,
            source: "self-weight".into(),
            area_load: None,
            w: w_sw,
            precast_only: true,
        });
        if let (Some(t), Some(rho)) = (&m.topping, loads.topping_density) {
            let area = t.thickness * t.width;
            let w_t = weight(sys, rho, area);
            tr.rec(|| {
                weight_step(sys, "D.wtop", "Weight of the topping", "top", rho, area, w_t, if loads.shored {
                    "thickness times width times its weight; cast on a shored member: carried by the composite section"
                } else {
                    "thickness times width times its weight; unshored construction: carried by the precast unit alone"
                })
            });
            uniform.push(LineLoad {
                kind: LoadKind::Dead,
                source: "topping".into(),
                area_load: None,
                w: w_t,
                precast_only: !loads.shored,
            });
        }
        for (j, u) in loads.uniform.iter().enumerate() {
            tr.rec(|| given_load_step(sys, j, u, loads.width));
            uniform.push(u.clone());
        }
        let present = LoadKind::ALL.map(|k| {
            uniform.iter().any(|u| u.kind == k && u.w > 0.0) || loads.points.iter().any(|q| q.kind == k && q.p > 0.0)
        });
        let combinations = p.basis.combinations(present, loads.live_factor);
        let mut d = Demand {
            length,
            span: loads.span,
            bearing: loads.bearing,
            width: loads.width,
            uniform,
            points: loads.points.clone(),
            combinations,
            live_factor: loads.live_factor,
            live_factor_reason: loads.live_factor_reason.clone(),
            shored: loads.shored,
            hogging: 0.0,
        };
        d.hogging = d.hogging_max();
        d
    }

    /// The reactions' positions: the bearings, (length - span)/2 from each end.
    fn bearings(&self) -> (f64, f64) {
        (self.bearing, self.length - self.bearing)
    }

    /// Moment at x of a uniform load w over the whole member (Macaulay: each bearing
    /// carries w L / 2).
    pub fn uniform_moment(&self, w: f64, x: f64) -> f64 {
        let (a, b) = self.bearings();
        let r = w * self.length / 2.0;
        r * (x - a).max(0.0) + r * (x - b).max(0.0) - w * x * x / 2.0
    }

    /// Moment at x of a point load p at xp.
    pub fn point_moment(&self, p: f64, xp: f64, x: f64) -> f64 {
        let (a, b) = self.bearings();
        let ra = p * (b - xp) / self.span;
        let rb = p * (xp - a) / self.span;
        ra * (x - a).max(0.0) + rb * (x - b).max(0.0) - p * (x - xp).max(0.0)
    }

    /// The moments at x.
    pub fn at(&self, x: f64) -> MomentsAt {
        let mut by_kind = [0.0; 4];
        let mut mnc = 0.0;
        for u in &self.uniform {
            let mx = self.uniform_moment(u.w, x);
            by_kind[kind_index(u.kind)] += mx;
            if u.precast_only {
                mnc += mx;
            }
        }
        for q in &self.points {
            by_kind[kind_index(q.kind)] += self.point_moment(q.p, q.x, x);
        }
        let factored: Vec<f64> =
            self.combinations.iter().map(|c| c.factors.iter().zip(by_kind).map(|(f, m)| f * m).sum()).collect();
        let (combination, mu) =
            factored.iter().copied().enumerate().max_by(|a, b| a.1.total_cmp(&b.1)).unwrap_or((0, 0.0));
        MomentsAt { x, by_kind, factored, mu: mu.max(0.0), combination, mnc: mnc.max(0.0) }
    }

    /// The largest hogging factored moment: over the overhangs it is largest at the
    /// bearings (uniform loads) or under a point load past them; the least factored
    /// moment at those points, negated (0 where none is negative).
    fn hogging_max(&self) -> f64 {
        let (a, b) = self.bearings();
        let mut xs = vec![a, b];
        xs.extend(self.points.iter().map(|q| q.x).filter(|x| *x < a || *x > b));
        xs.iter()
            .map(|&x| {
                let m = self.at(x);
                // the least of the combinations: hogging is the negative side
                let least = m.factored.iter().copied().fold(f64::INFINITY, f64::min);
                (-least).max(0.0)
            })
            .fold(0.0, f64::max)
    }
}

/// A symbol subscripted with a load kind, as Typst math: "M_D", or "M_(L_r)" for roof
/// live load (a bare "Lr" would be read as a variable).
fn sub_math(base: &str, kind: LoadKind) -> String {
    match kind {
        LoadKind::RoofLive => format!("{base}_(L_r)"),
        k => format!("{base}_{}", k.symbol()),
    }
}

fn kind_index(k: LoadKind) -> usize {
    LoadKind::ALL.iter().position(|x| *x == k).unwrap_or(0)
}

/// The weight per length of an area of concrete of a density (pcf or kg/m³), coherent.
fn weight(sys: System, density: f64, area: f64) -> f64 {
    match sys {
        // lb/ft³ over 1728 in³/ft³ and 1000 lb/kip: kip/in³
        System::Us => density / 1728e3 * area,
        // kg/m³ × g: N/m³ = 1e-9 N/mm³
        System::Si => density * G * 1e-9 * area,
    }
}

/// Coherent line load to the shown unit (klf or kN/m).
pub fn line_shown(sys: System, w: f64) -> f64 {
    match sys {
        System::Us => w * 12.0,
        System::Si => w,
    }
}

/// Coherent area load to the shown unit (psf or kPa).
pub fn pressure_shown(sys: System, q: f64) -> f64 {
    match sys {
        System::Us => q * 144e3,
        System::Si => q * 1e3,
    }
}

#[allow(clippy::too_many_arguments)]
fn weight_step(
    sys: System,
    id: &str,
    title: &str,
    sub: &'static str,
    density: f64,
    area: f64,
    w: f64,
    note: &str,
) -> Step {
    let symbol = crate::trace::Symbol { math: format!("w_(\"{sub}\")"), plain: format!("w{sub}") };
    let st = Step::new("demand", id, title, symbol).input(sy("w_c", "wc"), density, Unit::Density).input(
        sy("A", "A"),
        area,
        Unit::Area,
    );
    match sys {
        // pcf × in² / 144 = lb/ft; / 1000 = klf
        System::Us => st.formula(per(mul(vec![v(0), v(1)]), 144e3)),
        // kg/m³ × g × mm² / 10⁹ = kN/m
        System::Si => st.formula(per(mul(vec![v(0), n(G), v(1)]), 1e9)),
    }
    .result(line_shown(sys, w), Unit::LineLoad)
    .note(note)
}

/// A given load: an area load times the width, or a line load as given.
fn given_load_step(sys: System, j: usize, u: &LineLoad, width: f64) -> Step {
    let key = u.source.trim_start_matches("loads.");
    let title = format!("Uniform {} load ({})", u.kind.word(), key.replace('_', " "));
    let st = Step::new("demand", format!("D.w.{key}"), title, sym_k("w", "", "w", j + 1));
    match u.area_load {
        Some(q) => {
            let st =
                st.input(sy("q", "q"), pressure_shown(sys, q), Unit::Pressure).input(sy("b", "b"), width, Unit::Length);
            match sys {
                // psf × in / 12 = lb/ft; / 1000 = klf
                System::Us => st.formula(per(mul(vec![v(0), v(1)]), 12e3)),
                // kPa × mm / 1000 = kN/m
                System::Si => st.formula(per(mul(vec![v(0), v(1)]), 1e3)),
            }
            .result(line_shown(sys, u.w), Unit::LineLoad)
            .note("the area load times the tributary width b")
        }
        None => st.result(line_shown(sys, u.w), Unit::LineLoad).note("given as a line load"),
    }
}

/// The steps of the demand at a traced section: each load kind's moment, Mnc and the
/// factored moment by the governing combination. `tag` prefixes the step ids.
pub(super) fn record_at(d: &Demand, p: &Prepared, tag: &str, at: &MomentsAt, tr: &mut Trace) {
    let sys = p.sys;
    let km = p.cv.km;
    let x = at.x;
    for (ki, kind) in LoadKind::ALL.iter().enumerate() {
        record_kind(d, p, tag, at, (ki, *kind), tr);
    }
    tr.rec(|| {
        let c = &d.combinations[at.combination];
        let mut st = Step::new("demand", format!("{tag}.demand.Mu"), "Factored moment at x", sy("M_u", "Mu"));
        let mut terms = Vec::new();
        for (ki, kind) in LoadKind::ALL.iter().enumerate() {
            if c.factors[ki] != 0.0 && at.by_kind[ki] != 0.0 {
                let i = st.inputs.len();
                st = st.input(
                    crate::trace::Symbol { math: sub_math("M", *kind), plain: format!("M{}", kind.symbol()) },
                    at.by_kind[ki] * km,
                    Unit::Moment,
                );
                terms.push(mul(vec![n(c.factors[ki]), v(i)]));
            }
        }
        let others: Vec<String> = d
            .combinations
            .iter()
            .zip(&at.factored)
            .map(|(c, f)| format!("{} {} = {}", c.name, c.text(), crate::trace::show(f * km)))
            .collect();
        let formula = match terms.len() {
            0 => n(0.0),
            1 => terms.remove(0),
            _ => add(terms),
        };
        st.formula(formula)
            .result(at.mu * km, Unit::Moment)
            .clause(p.basis.cite(Clause::LoadCombinations))
            .note(format!("{} governs of: {}", c.name, others.join("; ")))
    });
    if p.m.topping.is_some() {
        tr.rec(|| {
            let wnc: f64 = d.uniform.iter().filter(|u| u.precast_only).map(|u| u.w).sum();
            let st = Step::new(
                "demand",
                format!("{tag}.demand.Mnc"),
                "Non-composite moment at x (unfactored)",
                sy("M_\"nc\"", "Mnc"),
            )
            .input(sy("w_\"nc\"", "wnc"), line_shown(sys, wnc), Unit::LineLoad);
            let (st, term) = uniform_term(st, d, x, sys);
            let st = st.formula(term);
            st.result(at.mnc * km, Unit::Moment).note(if d.shored {
                "the self-weight, carried by the precast unit alone (the topping was cast on a shored member)"
            } else {
                "the self-weight and the topping, carried by the precast unit alone (unshored construction)"
            })
        });
    }
}

/// The step of one load kind's unfactored moment at a traced section (none where the
/// member has no load of that kind).
fn record_kind(d: &Demand, p: &Prepared, tag: &str, at: &MomentsAt, (ki, kind): (usize, LoadKind), tr: &mut Trace) {
    let sys = p.sys;
    let km = p.cv.km;
    let x = at.x;
    let (a, b) = d.bearings();
    let between = x >= a && x <= b;
    let ws: f64 = d.uniform.iter().filter(|u| u.kind == kind).map(|u| u.w).sum();
    let pts: Vec<&PointLoad> = d.points.iter().filter(|q| q.kind == kind).collect();
    if ws == 0.0 && pts.is_empty() {
        return;
    }
    tr.rec(|| {
        let sym = crate::trace::Symbol {
            math: sub_math("M", kind),
            plain: format!("M{}", kind.symbol()),
        };
        let mut st = Step::new("demand", format!("{tag}.demand.M{}", kind.symbol()), format!("Unfactored {} load moment at x", kind.word()), sym);
        let mut terms = Vec::new();
        if ws > 0.0 {
            let w_sym = crate::trace::Symbol { math: sub_math("w", kind), plain: format!("w{}", kind.symbol()) };
            st = st.input(w_sym, line_shown(sys, ws), Unit::LineLoad);
            let (with, term) = uniform_term(st, d, x, sys);
            st = with;
            terms.push(term);
        }
        for q in &pts {
            let i = st.inputs.len();
            // the load's number, not its name: user text never enters a math string
            let j = d.points.iter().position(|p| std::ptr::eq(p, *q)).unwrap_or(0) + 1;
            st = st.input(crate::trace::Symbol { math: format!("M_(P {j})"), plain: format!("M,P{j}") }, d.point_moment(q.p, q.x, x) * km, Unit::Moment);
            terms.push(v(i));
        }
        let formula = if terms.len() == 1 { terms.remove(0) } else { add(terms) };
        let mut note = String::from(if between {
            "the sum of the uniform loads of this kind over a simple span between the bearings, the overhangs loaded too: M = w/2 (x'(S - x') - a²) with x' = x - a"
        } else {
            "over the overhang past a bearing: M = -w xo²/2"
        });
        if !pts.is_empty() {
            let names: Vec<String> = d
                .points
                .iter()
                .enumerate()
                .filter(|(_, p)| p.kind == kind)
                .map(|(j, p)| format!("P{} {}", j + 1, p.name))
                .collect();
            note.push_str(&format!("; point loads by statics, their reactions over the span S ({})", names.join(", ")));
        }
        st.formula(formula).result(at.by_kind[ki] * km, Unit::Moment).note(note)
    });
}

/// The moment of a uniform load over the whole member at x, for a step whose input 0 is
/// w: between the bearings w/2 (x'(S - x') - a²) with x' = x - a; over an overhang
/// -w xo²/2, xo from the nearer end. Adds the step's inputs and gives the term.
pub(super) fn uniform_term(st: Step, d: &Demand, x: f64, sys: System) -> (Step, Expr) {
    let (a, b) = d.bearings();
    if x >= a && x <= b {
        let st = st.input(sy("x", "x"), x, Unit::Length).input(sy("a", "a"), a, Unit::Length).input(
            sy("S", "S"),
            d.span,
            Unit::Length,
        );
        let xp = sub(v(1), v(2));
        let core = mul(vec![div(v(0), n(2.0)), sub(mul(vec![xp.clone(), sub(v(3), xp)]), pow(v(2), n(2.0)))]);
        (st, per(core, conv_uniform(sys)))
    } else {
        let st = st.input(sy("x_o", "xo"), x.min(d.length - x), Unit::Length);
        (st, per(neg(mul(vec![div(v(0), n(2.0)), pow(v(1), n(2.0))])), conv_uniform(sys)))
    }
}

/// The unit conversion of w (shown) × length² to the shown moment: klf × in² / 144 =
/// kip-ft; kN/m × mm² / 10⁶ = kN-m.
fn conv_uniform(sys: System) -> f64 {
    match sys {
        System::Us => 144.0,
        System::Si => 1e6,
    }
}

/// The member's demand, if it has loads.
pub(super) fn of_member(p: &Prepared, m: &Member, tr: &mut Trace) -> Option<Demand> {
    m.loads.as_ref().map(|l| Demand::derive(p, l, tr))
}
