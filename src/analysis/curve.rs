//! Moment-curvature response of a member's section by a layered (fibre) analysis.
//!
//! The concrete is cut into horizontal strips whose areas and centroids are exact (each
//! strip is the difference of two clipped areas of the outline, never a sample of the
//! width); steel layers are discrete. Concrete follows the Hognestad curve (or Popovics /
//! Thorenfeldt with the Collins-Mitchell parameters), linear in tension up to fr and
//! zero beyond; strand follows the same curve as the strength calculation, carrying its
//! effective prestrain; bars are elastic-perfectly-plastic (optionally hardening).
//!
//! Staging: the precast unit alone carries the prestress and, for a topped member, the
//! non-composite moment Mnc; the topping starts at zero strain once it acts. From that
//! state the curvature is increased in steps; at each step axial equilibrium is solved
//! for the strain at the reference level by Brent's method. The curve ends when the most
//! compressed concrete fibre reaches the crushing strain or a strand reaches its rupture
//! strain, whichever comes first.

use super::prepare::{Prepared, prepare};
use super::prestress::strands_at;
use super::roots::{bracket, brent, brent_value};
use super::station::Station;
use crate::basis::Basis;
use crate::error::{Error, Result};
use crate::input::model::Member;
use crate::material::concrete::{ConcreteLaw, Curve as ConcreteCurve};
use crate::material::steel::Bar;
use crate::material::strand::Curve as StrandCurve;
use crate::section::Region;
use crate::trace::Trace;
use serde::Serialize;

/// Concrete strips: centroid heights and areas.
struct Strips {
    y: Vec<f64>,
    a: Vec<f64>,
}

/// Exact strips of a region between two heights.
fn strips(region: &Region, y_bot: f64, y_top: f64, n: usize) -> Strips {
    let h = (y_top - y_bot) / n as f64;
    let mut y = Vec::with_capacity(n);
    let mut a = Vec::with_capacity(n);
    let mut upper = region.above(y_top);
    for k in 0..n {
        let lo = y_top - (k + 1) as f64 * h;
        let below = region.above(if k + 1 == n { y_bot - 1.0 } else { lo });
        let s = below - upper;
        if s.area > 1e-12 * h * h {
            y.push(s.qx / s.area);
            a.push(s.area);
        }
        upper = below;
    }
    Strips { y, a }
}

/// The strips' axial force and moment about `yr` under the strain e - k (y - yr), added
/// to `sums`. Strips cracked in tension carry nothing (stress zero past fr): as the
/// strain is linear in y they are a run at one end of the strips (top first), found by
/// bisection and skipped. Skipping them adds nothing the sums would not have: the result
/// is the same, bit for bit, and the march near its end, where most of a deep section
/// is cracked, runs several times faster.
fn strip_forces(st: &Strips, law: &ConcreteLaw, (e, k, yr): (f64, f64, f64), sums: (f64, f64)) -> (f64, f64) {
    let cracked = |y: f64| law.ec * (e - k * (y - yr)) > law.fr;
    // y falls along the strips: with k > 0 the strain grows along them (the cracked
    // strips are a tail), with k < 0 it falls (a head)
    let (from, to) = if k > 0.0 {
        (0, st.y.partition_point(|&y| !cracked(y)))
    } else if k < 0.0 {
        (st.y.partition_point(|&y| cracked(y)), st.y.len())
    } else {
        (0, st.y.len())
    };
    let (mut n, mut m) = sums;
    for (y, a) in st.y[from..to].iter().zip(&st.a[from..to]) {
        let f = law.stress(e - k * (y - yr)) * a;
        n += f;
        m -= f * (y - yr);
    }
    (n, m)
}

#[derive(Clone, Copy)]
enum SteelLaw {
    Strand(StrandCurve),
    Bar(Bar),
}

#[derive(Clone, Copy)]
struct Steel {
    y: f64,
    area: f64,
    law: SteelLaw,
    /// Strain at the starting state (strand: eps1 = fse / Eps; bars: 0).
    eps0: f64,
}

impl Steel {
    fn stress(&self, eps: f64, hardening: bool) -> f64 {
        match self.law {
            SteelLaw::Strand(c) => c.stress(eps),
            SteelLaw::Bar(b) => {
                if hardening {
                    b.stress_hardening(eps)
                } else {
                    b.stress(eps)
                }
            }
        }
    }
}

/// The concrete strips of a member's section: cut once per member, shared by the
/// curves of all its sections.
struct Layers {
    precast: Strips,
    topping: Option<Strips>,
}

impl Layers {
    fn of(p: &Prepared) -> Layers {
        let m = p.m;
        let strips_n = m.curve.strips;
        let precast = strips(&m.region, m.region.y_bot(), p.top_p, strips_n);
        let topping = match (&m.topping, &p.topping_region) {
            (Some(t), Some(r)) => {
                let n = ((strips_n as f64) * t.thickness / m.precast_height()).ceil().max(20.0) as usize;
                Some(strips(r, p.top_p, p.top, n))
            }
            _ => None,
        };
        Layers { precast, topping }
    }
}

struct Fibres<'a> {
    /// Reference level: the centroid of the precast unit.
    yr: f64,
    precast: &'a Strips,
    law_p: ConcreteLaw,
    topping: Option<(&'a Strips, ConcreteLaw)>,
    steel: Vec<Steel>,
    hardening: bool,
    y_top_p: f64,
    y_top: f64,
    /// Deepest bonded strand (index into steel).
    extreme: Option<usize>,
}

/// A state: the precast strain at the reference level and curvature at the start
/// (e0, k0), and the increments once the topping acts (d0, dk). Curvature is positive
/// for sagging (compression at the top): strain(y) = e - k (y - yr).
#[derive(Clone, Copy, Debug, Default)]
struct State {
    e0: f64,
    k0: f64,
    d0: f64,
    dk: f64,
}

impl Fibres<'_> {
    #[inline]
    fn precast_strain(&self, s: &State, y: f64) -> f64 {
        (s.e0 + s.d0) - (s.k0 + s.dk) * (y - self.yr)
    }
    #[inline]
    fn increment(&self, s: &State, y: f64) -> f64 {
        s.d0 - s.dk * (y - self.yr)
    }

    /// Axial force and moment about the reference level (sagging positive), with the
    /// steel at its starting force (initial stage) or following the increments.
    fn forces(&self, s: &State, initial: bool) -> (f64, f64) {
        let (e, k) = (s.e0 + s.d0, s.k0 + s.dk);
        let yr = self.yr;
        let (mut n, mut m) = strip_forces(self.precast, &self.law_p, (e, k, yr), (0.0, 0.0));
        if !initial && let Some((st, law)) = &self.topping {
            (n, m) = strip_forces(st, law, (s.d0, s.dk, yr), (n, m));
        }
        for st in &self.steel {
            let eps = if initial { st.eps0 } else { st.eps0 + self.increment(s, st.y) };
            let f = st.stress(eps, self.hardening) * st.area;
            n += f;
            m -= f * (st.y - yr);
        }
        (n, m)
    }

    /// The starting state of the precast unit under prestress and a moment: Newton's
    /// method on (e0, k0), from the elastic estimate.
    fn initial(&self, moment: f64, scale_n: f64, scale_m: f64, h: f64) -> Option<State> {
        let pe: f64 = self.steel.iter().map(|s| s.stress(s.eps0, false) * s.area).sum();
        let area: f64 = self.precast.a.iter().sum();
        let inertia: f64 = self.precast.y.iter().zip(&self.precast.a).map(|(y, a)| a * (y - self.yr).powi(2)).sum();
        let ms: f64 = self.steel.iter().map(|s| -s.stress(s.eps0, false) * s.area * (s.y - self.yr)).sum();
        let ec = self.law_p.ec;
        let mut x = [-pe / (ec * area), (moment - ms) / (ec * inertia)];
        let res = |x: [f64; 2]| {
            let (n, m) = self.forces(&State { e0: x[0], k0: x[1], d0: 0.0, dk: 0.0 }, true);
            [n, m - moment]
        };
        for _ in 0..60 {
            let r = res(x);
            if r[0].abs() <= 1e-11 * scale_n && r[1].abs() <= 1e-11 * scale_m {
                return Some(State { e0: x[0], k0: x[1], d0: 0.0, dk: 0.0 });
            }
            let (h0, h1) = (1e-8, 1e-8 / h);
            let r0 = res([x[0] + h0, x[1]]);
            let r1 = res([x[0], x[1] + h1]);
            let j = [[(r0[0] - r[0]) / h0, (r1[0] - r[0]) / h1], [(r0[1] - r[1]) / h0, (r1[1] - r[1]) / h1]];
            let det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
            if det == 0.0 || !det.is_finite() {
                return None;
            }
            let dx = [(r[0] * j[1][1] - r[1] * j[0][1]) / det, (j[0][0] * r[1] - j[1][0] * r[0]) / det];
            x = [x[0] - dx[0], x[1] - dx[1]];
        }
        None
    }

    /// Solves axial equilibrium for d0 at a curvature increment, by the root nearest
    /// `guess`: the search widens from `guess` by `step` (about the change of d0 to
    /// expect), so that the curve follows its own branch. The axial force is not
    /// monotonic in d0 once concrete softens or cracks, and a wide first bracket could
    /// hold a second, unrelated equilibrium (a state past crushing, say).
    fn equilibrium(&self, base: &State, dk: f64, guess: f64, scale_n: f64, step: f64) -> Option<State> {
        let f = |d0: f64| self.forces(&State { d0, dk, ..*base }, false).0;
        let (a, b, fa, fb) = bracket(f, guess, step.max(1e-12), 80)?;
        let (d0, f0) = brent_value(f, a, b, fa, fb, 1e-15, 1e-10 * scale_n)?;
        // a sign change across a jump of the force (a strip cracking) is not an
        // equilibrium unless the jump is small
        if f0.abs() > 1e-3 * scale_n {
            return None;
        }
        Some(State { d0, dk, ..*base })
    }

    /// The most compressive concrete strain (at the top of the topping or the precast).
    fn top_strain(&self, s: &State, initial: bool) -> f64 {
        let p = self.precast_strain(s, self.y_top_p);
        if self.topping.is_some() && !initial { p.min(self.increment(s, self.y_top)) } else { p }
    }

    fn strand_strain(&self, s: &State, initial: bool) -> f64 {
        match self.extreme {
            Some(i) => {
                let st = &self.steel[i];
                if initial { st.eps0 } else { st.eps0 + self.increment(s, st.y) }
            }
            None => 0.0,
        }
    }
}

/// One point of the curve. Curvature in 1/length, moment in the package's moment unit.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Point {
    pub curvature: f64,
    pub moment: f64,
    pub top_strain: f64,
    /// Depth of zero strain below the top of the section.
    pub neutral_axis: f64,
    pub strand_strain: f64,
}

/// A marked point.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Mark {
    pub curvature: f64,
    pub moment: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct CurveResult {
    pub member: String,
    pub location: String,
    pub concrete_model: &'static str,
    pub strips: usize,
    pub points: Vec<Point>,
    pub cracking: Option<Mark>,
    #[serde(rename = "yield")]
    pub yielding: Option<Mark>,
    pub peak: Mark,
    pub ultimate: Mark,
    pub ductility: Option<f64>,
    pub ended_by: &'static str,
    pub notes: Vec<String>,
}

fn model_name(c: ConcreteCurve) -> &'static str {
    match c {
        ConcreteCurve::Hognestad => "Hognestad",
        ConcreteCurve::Popovics => "Popovics (Thorenfeldt, Collins-Mitchell parameters)",
    }
}

fn fail(m: &Member, loc: &Station, why: &str) -> Error {
    Error::Analysis {
        member: m.id.clone(),
        location: loc.name.clone(),
        message: format!("moment-curvature analysis: {why}"),
    }
}

fn build<'a>(p: &Prepared, layers: &'a Layers, loc: &Station, li: usize) -> Fibres<'a> {
    let m = p.m;
    let sys = p.sys;
    let mut tr = Trace::new(false);
    let at = strands_at(p, li, loc, &mut tr);
    let opts = m.curve;
    let c = &m.concrete;
    let law_p = ConcreteLaw::new(c.curve, c.fc, c.ec, c.fr, sys);
    let precast = &layers.precast;
    let topping = match (&m.topping, &layers.topping) {
        (Some(t), Some(st)) => {
            let tc = &t.concrete;
            Some((st, ConcreteLaw::new(tc.curve, tc.fc, tc.ec, tc.fr, sys)))
        }
        _ => None,
    };
    let mut steel = Vec::new();
    let mut extreme: Option<(usize, f64)> = None;
    let mut deepest_bar: Option<(usize, f64)> = None;
    for (i, (s, a)) in m.strands.iter().zip(&at).enumerate() {
        if !a.active {
            continue;
        }
        let y = p.top - a.d;
        if extreme.is_none_or(|(_, d)| a.d > d) {
            extreme = Some((steel.len(), a.d));
        }
        steel.push(Steel { y, area: s.total_area(), law: SteelLaw::Strand(p.curves[i]), eps0: a.eps1 });
    }
    for b in &m.bars {
        let y = p.top_p - b.depth;
        if deepest_bar.is_none_or(|(_, d)| b.depth + p.t > d) {
            deepest_bar = Some((steel.len(), b.depth + p.t));
        }
        let fu = b.fy * 1.5;
        steel.push(Steel {
            y,
            area: b.total_area(),
            law: SteelLaw::Bar(Bar { fy: b.fy, es: b.es, hardening: opts.bar_hardening, fu }),
            eps0: 0.0,
        });
    }
    Fibres {
        yr: p.precast.yc,
        precast,
        law_p,
        topping,
        steel,
        hardening: opts.bar_hardening > 0.0,
        y_top_p: p.top_p,
        y_top: p.top,
        extreme: extreme.or(deepest_bar).map(|e| e.0),
    }
}

/// The moment-curvature curve of a member at one of its checked sections (`li`: its
/// index, for the step ids).
pub fn moment_curvature(m: &Member, basis: &'static dyn Basis, loc: &Station, li: usize) -> Result<CurveResult> {
    let p = prepare(m, basis, &mut Trace::new(false))?;
    curve_points(&p, &Layers::of(&p), loc, li, m.curve.points)
}

/// What settles strand rupture at the sections of one member: the end of each section's
/// curve, kept by everything the curve depends on (each layer's bond, depth and
/// prestrain, and the non-composite moment of a topped member), so that sections alike in
/// all of these (a symmetric member's two halves, the fully bonded middle of an untopped
/// one) march once. The key is exact: nothing is rounded.
pub(super) struct CurveEnds<'a> {
    p: &'a Prepared<'a>,
    layers: Option<Layers>,
    ends: std::collections::HashMap<Vec<u64>, std::result::Result<CurveResult, String>>,
}

impl<'a> CurveEnds<'a> {
    pub(super) fn new(p: &'a Prepared<'a>) -> CurveEnds<'a> {
        CurveEnds { p, layers: None, ends: std::collections::HashMap::new() }
    }

    pub(super) fn units(&self) -> crate::units::System {
        self.p.sys
    }

    /// The end of a section's curve and what ended it (the march does not depend on
    /// the number of points; the cracking and yield events between points are not
    /// sought, as the end does not depend on them either).
    pub(super) fn end_of(&mut self, loc: &Station, li: usize) -> &std::result::Result<CurveResult, String> {
        let p = self.p;
        let at = strands_at(p, li, loc, &mut Trace::new(false));
        let mut key: Vec<u64> = at.iter().flat_map(|a| [a.active as u64, a.d.to_bits(), a.eps1.to_bits()]).collect();
        if p.m.topping.is_some() {
            key.push(loc.mnc.to_bits());
        }
        let layers = self.layers.get_or_insert_with(|| Layers::of(p));
        self.ends.entry(key).or_insert_with(|| curve_points(p, layers, loc, li, 0).map_err(|e| e.to_string()))
    }
}

/// One curve's run: the fibres, the state the composite stage starts from, and the
/// scales and limits its march uses.
struct Run<'f, 'a> {
    f: &'f Fibres<'a>,
    base: State,
    h: f64,
    scale_n: f64,
    km: f64,
    crushing: f64,
    rupture: f64,
}

impl Run<'_, '_> {
    fn point(&self, s: &State, initial: bool, moment: f64) -> Point {
        let f = self.f;
        let k = s.k0 + s.dk;
        let e_ref = s.e0 + s.d0;
        let na = if k.abs() > 0.0 { f.y_top - (f.yr + e_ref / k) } else { f64::NAN };
        Point {
            curvature: k,
            moment: moment * self.km,
            top_strain: f.top_strain(s, initial),
            neutral_axis: na,
            strand_strain: f.strand_strain(s, initial),
        }
    }

    /// The composite state at a curvature increment, solved from a state near it.
    fn solve_from(&self, from: &State, dk: f64) -> Option<State> {
        let step = ((dk - from.dk).abs() * self.h * 0.25).max(1e-12);
        self.f.equilibrium(&self.base, dk, from.d0, self.scale_n, step)
    }

    /// How far a state is past the end of the curve (0 at it), and whether crushing
    /// (rather than strand rupture) ends it.
    fn end_fn(&self, s: &State) -> (f64, bool) {
        let f = self.f;
        let crush = -f.top_strain(s, false) / self.crushing;
        let rupture = match f.extreme.map(|i| f.steel[i].law) {
            Some(SteelLaw::Strand(_)) => f.strand_strain(s, false) / self.rupture,
            _ => 0.0,
        };
        (crush.max(rupture) - 1.0, crush >= rupture)
    }

    /// The change of the top strain and of the extreme steel strain between two states,
    /// as a share of the largest allowed in one step of the march (accepted up to 1).
    fn change(&self, a: &State, b: &State) -> f64 {
        let f = self.f;
        let (d_top, d_steel) = (self.crushing / 40.0, self.rupture / 40.0);
        ((f.top_strain(a, false) - f.top_strain(b, false)).abs() / d_top)
            .max((f.strand_strain(a, false) - f.strand_strain(b, false)).abs() / d_steel)
    }
}

/// Stage 1's states with the moment on each, and cracking where it cracks.
type StageOne = (Vec<(State, f64)>, Option<Mark>);

/// Stage 1: the precast unit alone, from the prestressed state to Mnc (ten steps): its
/// points, the state the composite stage starts from, and cracking where the precast
/// unit cracks under Mnc.
fn stage_one(
    f: &Fibres,
    mnc: f64,
    (scale_n, scale_m, h, km): (f64, f64, f64, f64),
    (m, loc): (&Member, &Station),
    notes: &mut Vec<String>,
) -> Result<StageOne> {
    let eps_cr = f.law_p.fr / f.law_p.ec;
    let y_bot_strip = f.precast.y.iter().copied().fold(f64::INFINITY, f64::min);
    let start = f
        .initial(0.0, scale_n, scale_m, h)
        .ok_or_else(|| fail(m, loc, "no equilibrium of the prestressed precast unit"))?;
    let stage1 = if mnc > 0.0 { 10 } else { 0 };
    if f.precast_strain(&start, f.y_top_p) >= eps_cr {
        notes.push(format!(
            "Under the prestress alone{} the top of the precast unit is in tension beyond the cracking strain fr / Ec: it cracks before any moment acts, so the curve starts at a negative (cambering) curvature and rises softly until the top closes.",
            if mnc > 0.0 { "" } else { " (no moment acts on the member at the start of this curve, not even its self-weight)" }
        ));
    }
    let mut states = vec![(start, 0.0)];
    let mut cracking = None;
    for j in 1..=stage1 {
        let mt = mnc * j as f64 / stage1 as f64;
        let s = f
            .initial(mt, scale_n, scale_m, h)
            .ok_or_else(|| fail(m, loc, "no equilibrium of the precast unit under the non-composite moment"))?;
        if cracking.is_none() && f.precast_strain(&s, y_bot_strip) >= eps_cr {
            notes.push("The precast unit cracks under the non-composite moment, before the topping acts.".into());
            let s_cr =
                brent_initial(f, mnc * (j - 1) as f64 / stage1 as f64, mt, eps_cr, y_bot_strip, scale_n, scale_m, h);
            if let Some((mc, sc)) = s_cr {
                cracking = Some(Mark { curvature: sc.k0, moment: mc * km });
            }
        }
        states.push((s, mt));
    }
    Ok((states, cracking))
}

/// Stage 2: composite from the starting state; increments dk from 0. The curve is
/// followed step by step from the start (continuation): each state is solved from the
/// one before, with steps that shrink where the strains change fast, up to the crushing
/// or rupture strain, or to a limit point where no neighbouring equilibrium exists (the
/// section softens). The marched states, the end state and what ended the curve.
fn march(run: &Run, (m, loc): (&Member, &Station)) -> Result<(Vec<State>, State, &'static str)> {
    let base = run.base;
    let mut march: Vec<State> = vec![base];
    let mut dstep = run.crushing / run.h / 32.0;
    for _ in 0..20_000 {
        let cur = *march.last().unwrap_or(&base);
        if dstep <= 1e-9 * cur.dk.abs().max(run.crushing / run.h) {
            return Ok((march, cur, "a limit point (no equilibrium beyond it: the section softens)"));
        }
        let next = match run.solve_from(&cur, cur.dk + dstep) {
            Some(s) if run.change(&cur, &s) <= 1.0 => s,
            _ => {
                dstep *= 0.5;
                continue;
            }
        };
        if run.end_fn(&next).0 >= 0.0 {
            // the end lies in this step: find it on the branch, from the state before
            let g = |dk: f64| run.solve_from(&cur, dk).map_or(f64::NAN, |s| run.end_fn(&s).0);
            let (glo, ghi) = (run.end_fn(&cur).0, run.end_fn(&next).0);
            let dk = if glo >= 0.0 {
                cur.dk
            } else {
                brent(g, cur.dk, next.dk, glo, ghi, 1e-14 * next.dk.abs().max(1e-30), 1e-10).unwrap_or(next.dk)
            };
            let s = run.solve_from(&cur, dk).unwrap_or(next);
            let ended_by = if run.end_fn(&s).1 { "concrete crushing" } else { "strand rupture" };
            march.push(s);
            return Ok((march, s, ended_by));
        }
        if run.change(&cur, &next) < 0.5 {
            dstep *= 1.6;
        }
        march.push(next);
    }
    Err(fail(m, loc, "no equilibrium was found up to the crushing or rupture strain"))
}

/// `n` points up to the end: denser at the start, where cracking happens; each solved
/// from the marched state just below it, so it lies on the same branch.
fn sample(
    run: &Run,
    march: &[State],
    end_state: State,
    n: usize,
    (m, loc): (&Member, &Station),
) -> Result<Vec<(f64, State)>> {
    let dk_end = end_state.dk;
    let mut states: Vec<(f64, State)> = Vec::with_capacity(n + 4);
    let mut k = 0;
    for j in 1..=n {
        let s = j as f64 / n as f64;
        let dk = dk_end * s * s;
        let st = if j == n {
            end_state
        } else {
            while k + 1 < march.len() && march[k + 1].dk <= dk {
                k += 1;
            }
            run.solve_from(&march[k], dk).ok_or_else(|| fail(m, loc, "no equilibrium at a step of the curve"))?
        };
        states.push((dk, st));
    }
    Ok(states)
}

/// The events between the points: cracking (the bottom strip reaches fr) where stage 1
/// did not find it, and the first yield of the extreme steel (`fpy`). Each is solved on
/// the branch and its state added to the points.
fn events(run: &Run, states: &mut Vec<(f64, State)>, cracking: &mut Option<Mark>, fpy: Option<f64>) -> Option<Mark> {
    let f = run.f;
    let eps_cr = f.law_p.fr / f.law_p.ec;
    let y_bot_strip = f.precast.y.iter().copied().fold(f64::INFINITY, f64::min);
    let dk_end = states.last().map_or(0.0, |s| s.0);
    let mut insert = Vec::new();
    let mut yielding = None;
    let mut prev = (0.0, run.base);
    for &(dk, st) in states.iter() {
        let crack = |s: &State| f.precast_strain(s, y_bot_strip) - eps_cr;
        if cracking.is_none() && crack(&prev.1) < 0.0 && crack(&st) >= 0.0 {
            let gc = |x: f64| run.solve_from(&prev.1, x).map_or(f64::NAN, |s| crack(&s));
            if let Some(x) = brent(gc, prev.0, dk, crack(&prev.1), crack(&st), 1e-15 * dk_end, 0.0)
                && let Some(s) = run.solve_from(&prev.1, x)
            {
                let mo = f.forces(&s, false).1;
                *cracking = Some(Mark { curvature: s.k0 + s.dk, moment: mo * run.km });
                insert.push((x, s));
            }
        }
        if let (None, Some(fpy), Some(i)) = (&yielding, fpy, f.extreme) {
            let ys = |s: &State| f.steel[i].stress(f.strand_strain(s, false), false) - fpy;
            if ys(&prev.1) < 0.0 && ys(&st) >= 0.0 {
                let gy = |x: f64| run.solve_from(&prev.1, x).map_or(f64::NAN, |s| ys(&s));
                if let Some(x) = brent(gy, prev.0, dk, ys(&prev.1), ys(&st), 1e-15 * dk_end, 0.0)
                    && let Some(s) = run.solve_from(&prev.1, x)
                {
                    let mo = f.forces(&s, false).1;
                    yielding = Some(Mark { curvature: s.k0 + s.dk, moment: mo * run.km });
                    insert.push((x, s));
                }
            }
        }
        prev = (dk, st);
    }
    states.extend(insert);
    states.sort_by(|a, b| a.0.total_cmp(&b.0));
    yielding
}

/// The notes on a finished curve: a moment that falls after cracking, no yield, bars
/// starting unstressed, strand within its transfer length.
fn closing_notes(
    p: &Prepared,
    (loc, li): (&Station, usize),
    pts: &[Point],
    (cracking, yielding, peak): (Option<Mark>, Option<Mark>, Mark),
    notes: &mut Vec<String>,
) {
    let m = p.m;
    // a moment that falls after cracking: the concrete's tension is lost at once
    if let Some(cr) = cracking {
        let after = pts.iter().filter(|q| q.curvature > cr.curvature);
        let until = yielding.map_or(peak.curvature, |y| y.curvature);
        let low = after.take_while(|q| q.curvature <= until).map(|q| q.moment).fold(f64::INFINITY, f64::min);
        if low < cr.moment * 0.995 {
            notes.push(format!(
                "Just after cracking the moment falls from {} to {} {}: the concrete in tension carries fr until it cracks and nothing after (no tension stiffening), so its share is lost at once and the steel takes it up as the curvature grows.",
                crate::trace::show(cr.moment),
                crate::trace::show(low),
                p.sys.names().moment
            ));
        }
    }
    if yielding.is_none() {
        notes.push("The extreme tension steel does not yield (0.9 fpu for strand) before the end of the curve: no yield point, no curvature ductility.".into());
    }
    if !m.bars.is_empty() {
        notes.push("Bars start unstressed at the prestressed state (their share of the prestress shortening is neglected, as in the strength calculation).".into());
    }
    let mut tr = Trace::new(false);
    if loc.x.is_some() && m.strands.iter().zip(strands_at(p, li, loc, &mut tr).iter()).any(|(s, a)| a.fse < s.fse) {
        notes.push("Strand within its transfer length carries the reduced prestress here; the stress limits of 25.4.8.3 are not applied in the fibre analysis.".into());
    }
}

/// The curve with `points` points after the march (at least 2). The march, and so the
/// end and what ended the curve, do not depend on it; the peak is that of the points.
/// `points` 0 asks for the end alone: two points, no cracking or yield event sought.
fn curve_points(p: &Prepared, layers: &Layers, loc: &Station, li: usize, points: usize) -> Result<CurveResult> {
    let m = p.m;
    let f = build(p, layers, loc, li);
    let h = m.total_height();
    let km = p.cv.km;
    let scale_n = m.concrete.fc * p.precast.area;
    let scale_m = scale_n * h;
    let mnc = if m.topping.is_some() { loc.mnc } else { 0.0 };
    // first yield: of the deepest strand (0.9 fpu, low-relaxation), or of the deepest bar
    // (fy) in a section without strand
    let fpy = f.extreme.map(|i| match f.steel[i].law {
        SteelLaw::Strand(c) => c.fpy(),
        SteelLaw::Bar(b) => b.fy,
    });
    let mut notes = Vec::new();
    let (stage1, mut cracking) = stage_one(&f, mnc, (scale_n, scale_m, h, km), (m, loc), &mut notes)?;
    let base = stage1.last().map_or(State::default(), |s| s.0);
    let run = Run { f: &f, base, h, scale_n, km, crushing: m.curve.crushing_strain, rupture: m.curve.rupture_strain };
    let mut pts: Vec<Point> = stage1.iter().map(|(s, mt)| run.point(s, true, *mt)).collect();
    let (march, end_state, ended_by) = march(&run, (m, loc))?;
    let mut states = sample(&run, &march, end_state, points.max(2), (m, loc))?;
    let yielding = if points > 0 { events(&run, &mut states, &mut cracking, fpy) } else { None };
    for (_, s) in &states {
        let mo = f.forces(s, false).1;
        pts.push(run.point(s, false, mo));
    }
    let peak = pts
        .iter()
        .max_by(|a, b| a.moment.total_cmp(&b.moment))
        .map(|p| Mark { curvature: p.curvature, moment: p.moment })
        .unwrap_or(Mark { curvature: 0.0, moment: 0.0 });
    let last = pts.last().copied().ok_or_else(|| fail(m, loc, "no points"))?;
    let ultimate = Mark { curvature: last.curvature, moment: last.moment };
    let ductility = yielding.map(|y| ultimate.curvature / y.curvature).filter(|d| d.is_finite() && *d > 0.0);
    closing_notes(p, (loc, li), &pts, (cracking, yielding, peak), &mut notes);
    Ok(CurveResult {
        member: m.id.clone(),
        location: loc.name.clone(),
        concrete_model: model_name(m.concrete.curve),
        strips: f.precast.y.len() + f.topping.as_ref().map_or(0, |t| t.0.y.len()),
        points: pts,
        cracking,
        yielding,
        peak,
        ultimate,
        ductility,
        ended_by,
        notes,
    })
}

/// Cracking within stage 1: the moment on the precast unit at which the bottom strip
/// reaches fr.
#[allow(clippy::too_many_arguments)]
fn brent_initial(
    f: &Fibres,
    m_lo: f64,
    m_hi: f64,
    eps_cr: f64,
    y: f64,
    sn: f64,
    sm: f64,
    h: f64,
) -> Option<(f64, State)> {
    let g = |mt: f64| f.initial(mt, sn, sm, h).map_or(f64::NAN, |s| f.precast_strain(&s, y) - eps_cr);
    let mt = brent(g, m_lo, m_hi, g(m_lo), g(m_hi), 1e-12 * m_hi.abs().max(1.0), 0.0)?;
    Some((mt, f.initial(mt, sn, sm, h)?))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::material::concrete::Curve;

    /// Skipping the cracked strips gives the sums of every strip, bit for bit: over
    /// sagging and hogging curvatures, none, part or all of the strips cracked, and
    /// strains that crush the top.
    #[test]
    fn skipping_cracked_strips_changes_nothing() {
        let region = Region::new(vec![[0.0, 0.0], [12.0, 0.0], [12.0, 24.0], [0.0, 24.0]], vec![]);
        let st = strips(&region, 0.0, 24.0, 200);
        let law = ConcreteLaw::new(Curve::Hognestad, 6.0, 4415.2, 0.581, crate::units::System::Us);
        let every = |e: f64, k: f64, yr: f64| {
            let (mut n, mut m) = (0.0, 0.0);
            for (y, a) in st.y.iter().zip(&st.a) {
                let f = law.stress(e - k * (y - yr)) * a;
                n += f;
                m -= f * (y - yr);
            }
            (n, m)
        };
        let mut cases = 0;
        for e in [-0.004, -0.001, -1e-4, 0.0, 1e-4, 2e-4, 0.002] {
            for k in [-1e-3, -1e-4, -1e-6, 0.0, 1e-6, 1e-5, 1e-4, 1e-3] {
                for yr in [0.0, 12.0, 17.3] {
                    let (a, b) = (strip_forces(&st, &law, (e, k, yr), (0.0, 0.0)), every(e, k, yr));
                    assert_eq!(a.0.to_bits(), b.0.to_bits(), "n at e = {e}, k = {k}, yr = {yr}");
                    assert_eq!(a.1.to_bits(), b.1.to_bits(), "m at e = {e}, k = {k}, yr = {yr}");
                    cases += 1;
                }
            }
        }
        assert_eq!(cases, 168);
    }
}
