//! Camber and deflection at the middle of the member: the elastic camber at release from
//! the prestress less the self-weight deflection (the member on its ends, Eci, the
//! precast section), the camber at erection and the final camber by the long-term
//! multipliers of the PCI Design Handbook, and the immediate live-load deflection
//! (between the bearings, Ec, the composite section) against the limit the input
//! chooses (ACI 318-19 Table 24.2.2).
//!
//! Each elastic deflection is the virtual work of its moment M(x) against the moment
//! m(x) of a unit load at the point sought: Δ = ∫ M m / (E I) dx, by Simpson's rule on
//! pieces between the points where M or m changes its form (the ends of transfer, the
//! debond and harp points, the bearings, the point loads, the middle), where M m is a
//! polynomial of degree three at most: exact. Upward camber positive; deflections
//! downward positive.

use super::demand::Demand;
use super::prepare::Prepared;
use super::stresses::{Class, force_at};
use super::sy;
use crate::basis::Clause;
use crate::input::model::{LoadKind, Profile};
use crate::trace::{Step, Trace, Unit};
use serde::Serialize;

/// The long-term multipliers on the elastic values at release (PCI Design Handbook,
/// "suggested simple span multipliers", after Martin (1977); from memory): at erection
/// on the self-weight deflection and on the camber from prestress; final on those two,
/// on the superimposed dead load's deflection and on the composite topping's. Without
/// and with a composite topping.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Multipliers {
    pub erection_self_weight: f64,
    pub erection_prestress: f64,
    pub final_self_weight: f64,
    pub final_prestress: f64,
    pub final_superimposed: f64,
    pub final_topping: Option<f64>,
}

const PLAIN: Multipliers = Multipliers {
    erection_self_weight: 1.85,
    erection_prestress: 1.80,
    final_self_weight: 2.70,
    final_prestress: 2.45,
    final_superimposed: 3.00,
    final_topping: None,
};

const TOPPED: Multipliers = Multipliers {
    erection_self_weight: 1.85,
    erection_prestress: 1.80,
    final_self_weight: 2.40,
    final_prestress: 2.20,
    final_superimposed: 3.00,
    final_topping: Some(2.30),
};

/// The live-load deflection against its limit, or why it is not computed.
#[derive(Debug, Clone, Serialize)]
pub struct LiveDeflection {
    /// Downward, at the middle of the span (`None`: not computed).
    pub live: Option<f64>,
    /// What load it is of ("L", or the larger of "Lr" and "S" on a member without L).
    pub load: &'static str,
    pub limit: Option<f64>,
    /// "L/360".
    pub limit_text: Option<String>,
    pub ok: bool,
    pub why_not: Option<String>,
    /// The bilinear relation of a class T or C member (`None`: class U, gross section).
    pub cracked: Option<Bilinear>,
}

/// The bilinear moment-deflection relation of a class T or C member (24.2.3.9), as the
/// PCI Design Handbook applies it (from memory): the uncracked composite section up to
/// the live moment that brings the bottom fibre at midspan to the modulus of rupture fr,
/// the cracked transformed section for the rest of the live moment.
#[derive(Debug, Clone, Serialize)]
pub struct Bilinear {
    /// The deflection on the uncracked section, Ic and Icr (in the precast concrete's
    /// Ec), the cracked neutral axis's depth below the top.
    pub gross: f64,
    pub ic: f64,
    pub icr: f64,
    pub depth: f64,
    /// At midspan: the bottom stress under the prestress and the dead load, the bottom
    /// section modulus, fr, the live moment that cracks the bottom (shown moment), the
    /// live moment, and the share of it on the uncracked section.
    pub dead_bottom: f64,
    pub sb: f64,
    pub fr: f64,
    pub m_cr: f64,
    pub m_live: f64,
    pub share: f64,
}

impl LiveDeflection {
    /// In a few words for a table: "0.12 <= L/360 = 1.17", "not computed (class T)" or
    /// "0.12 (no limit chosen)"; `within` is the sign printed where the limit is met,
    /// `number` writes a number.
    pub fn short(&self, class: &str, within: &str, number: impl Fn(f64) -> String) -> String {
        match (self.live, &self.limit_text, self.limit) {
            (None, _, _) => format!("not computed (class {class})"),
            (Some(v), Some(t), Some(l)) => {
                format!("{} {} {t} = {}", number(v), if self.ok { within } else { "EXCEEDS" }, number(l))
            }
            (Some(v), _, _) => format!("{} (no limit chosen)", number(v)),
        }
    }
}

/// Camber and deflection of a member (lengths; camber upward positive, deflections
/// downward positive).
#[derive(Debug, Clone, Serialize)]
pub struct Camber {
    /// Where: the middle of the member.
    pub x: f64,
    pub prestress: f64,
    pub self_weight: f64,
    pub topping: Option<f64>,
    pub superimposed_dead: f64,
    pub release: f64,
    pub erection: f64,
    #[serde(rename = "final")]
    pub final_camber: f64,
    pub multipliers: Multipliers,
}

/// The points where a moment of the member changes its form: its ends and middle, the
/// bearings, each layer's debond point and the end of its transfer length from each end,
/// the harp points and the point loads.
pub(super) fn breaks(p: &Prepared, d: &Demand) -> Vec<f64> {
    let len = d.length;
    let (d1, _) = p.basis.development_divisors();
    let mut xs = vec![0.0, len, len / 2.0, d.bearing, len - d.bearing];
    for s in &p.m.strands {
        let ltr = s.fse / d1 * s.diameter;
        for x in [s.debonded_length, s.debonded_length + ltr] {
            xs.extend([x, len - x]);
        }
        if let Profile::Harped { harp_x, harp_x2, .. } = s.profile {
            xs.extend([harp_x, harp_x2.unwrap_or(len - harp_x)]);
        }
    }
    xs.extend(d.points.iter().map(|q| q.x));
    xs.retain(|x| x.is_finite() && (0.0..=len).contains(x));
    xs.sort_by(f64::total_cmp);
    xs.dedup_by(|a, b| (*a - *b).abs() <= 1e-9 * len);
    xs
}

/// ∫ M m dx over the span between supports at `a` and `b`, m the moment of a unit load at
/// `at`; the pieces between `nodes` by Simpson's rule (exact for cubic M m).
fn virtual_work(moment: &dyn Fn(f64) -> f64, (a, b): (f64, f64), at: f64, nodes: &[f64]) -> f64 {
    let m = |x: f64| {
        if x <= at { (b - at) / (b - a) * (x - a) } else { (at - a) / (b - a) * (b - x) }
    };
    let mut pts: Vec<f64> = nodes.iter().copied().filter(|x| *x > a && *x < b).collect();
    pts.extend([a, b, at]);
    pts.sort_by(f64::total_cmp);
    pts.dedup();
    pts.windows(2)
        .map(|w| {
            let (x0, x1) = (w[0], w[1]);
            // within a piece, both sides' limits: a point load's jump sits at a node
            let h = x1 - x0;
            let (e0, e1) = (x0 + 1e-12 * h, x1 - 1e-12 * h);
            let mid = 0.5 * (x0 + x1);
            h / 6.0 * (moment(e0) * m(e0) + 4.0 * moment(mid) * m(mid) + moment(e1) * m(e1))
        })
        .sum()
}

/// The camber of a member whose release stage is checked (fpi and Eci known), each step
/// recorded in `tr`.
pub(super) fn of_member(p: &Prepared, d: &Demand, tr: &mut Trace) -> Option<Camber> {
    let m = p.m;
    let rel = m.release?;
    let len = d.length;
    let mid = len / 2.0;
    let nodes = breaks(p, d);
    let (i, ec, eci) = (p.precast.i, m.concrete.ec, rel.eci);
    let ic = p.composite.as_ref().map_or(i, |c| c.i);
    let ends = (0.0, len);
    let bearings = (d.bearing, len - d.bearing);
    // the prestress just after release, with its eccentricity, as in the stresses
    let mp = |x: f64| {
        let (force, e) = force_at(p, x, &|k| m.strands[k].fpi.unwrap_or(0.0));
        force * e
    };
    let prestress = virtual_work(&mp, ends, mid, &nodes) / (eci * i);
    let w_sw = d.uniform.iter().find(|u| u.source == "self-weight").map_or(0.0, |u| u.w);
    let self_weight = 5.0 * w_sw * len.powi(4) / (384.0 * eci * i);
    let w_top = d.uniform.iter().find(|u| u.source == "topping" && u.precast_only).map(|u| u.w);
    let topping = w_top.map(|w| virtual_work(&|x| d.uniform_moment(w, x), bearings, mid, &nodes) / (ec * i));
    // the other dead loads, on the composite section (a shored topping among them)
    let sd = |x: f64| {
        let u: f64 = (d.uniform.iter())
            .filter(|u| u.kind == LoadKind::Dead && u.source != "self-weight" && !u.precast_only)
            .map(|u| d.uniform_moment(u.w, x))
            .sum();
        let q: f64 = (d.points.iter()).filter(|q| q.kind == LoadKind::Dead).map(|q| d.point_moment(q.p, q.x, x)).sum();
        u + q
    };
    let superimposed_dead = virtual_work(&sd, bearings, mid, &nodes) / (ec * ic);
    let k = if m.topping.is_some() { TOPPED } else { PLAIN };
    let release = prestress - self_weight;
    let erection = k.erection_prestress * prestress - k.erection_self_weight * self_weight;
    let final_camber = k.final_prestress * prestress
        - k.final_self_weight * self_weight
        - k.final_topping.zip(topping).map_or(0.0, |(f, t)| f * t)
        - k.final_superimposed * superimposed_dead;
    let c = Camber {
        x: mid,
        prestress,
        self_weight,
        topping,
        superimposed_dead,
        release,
        erection,
        final_camber,
        multipliers: k,
    };
    record(p, d, &c, (eci, ec, i, ic), w_sw, tr);
    Some(c)
}

/// The immediate deflection of the live load (L; on a member without it, the larger of
/// Lr and S) at mid-length between the bearings on the uncracked composite section, with
/// Ec: class U only; recorded in `tr`.
pub(super) fn live_deflection(p: &Prepared, d: &Demand, class: Class, tr: &mut Trace) -> LiveDeflection {
    let out = live(p, d, class);
    record_live(p, d, &out, tr);
    out
}

fn live(p: &Prepared, d: &Demand, class: Class) -> LiveDeflection {
    let nodes = breaks(p, d);
    let (bearings, mid) = ((d.bearing, d.length - d.bearing), d.length / 2.0);
    let ic = p.composite.as_ref().map_or(p.precast.i, |c| c.i);
    let ei = p.m.concrete.ec * ic;
    // the live load on the span alone, between the bearings (loaded overhangs would lift
    // the middle: unconservative), point loads on the span only
    let (a, b) = bearings;
    let of = |kind: LoadKind| {
        let mo = |x: f64| {
            if x <= a || x >= b {
                return 0.0;
            }
            let u: f64 = d.uniform.iter().filter(|u| u.kind == kind).map(|u| u.w * (x - a) * (b - x) / 2.0).sum();
            let q: f64 = (d.points.iter())
                .filter(|q| q.kind == kind && q.x >= a && q.x <= b)
                .map(|q| d.point_moment(q.p, q.x, x))
                .sum();
            u + q
        };
        (virtual_work(&mo, bearings, mid, &nodes) / ei, mo(mid))
    };
    let has = |kind: LoadKind| {
        d.uniform.iter().any(|u| u.kind == kind && u.w > 0.0) || d.points.iter().any(|q| q.kind == kind && q.p > 0.0)
    };
    let roof = |lr: (f64, f64), s: (f64, f64)| if lr.0 >= s.0 { ("Lr", lr) } else { ("S", s) };
    // L/180 (flat roofs) limits the larger of Lr and S; L/360 (floors) limits L; with no
    // limit, L, or the larger of Lr and S on a member without L
    let (load, value) = match p.m.stresses.deflection_limit {
        Some(180.0) => roof(of(LoadKind::RoofLive), of(LoadKind::Snow)),
        Some(_) => ("L", of(LoadKind::Live)),
        None if has(LoadKind::Live) || !(has(LoadKind::RoofLive) || has(LoadKind::Snow)) => ("L", of(LoadKind::Live)),
        None => roof(of(LoadKind::RoofLive), of(LoadKind::Snow)),
    };
    let span = d.span;
    let limit = p.m.stresses.deflection_limit;
    let limit_value = limit.map(|n| span / n);
    let limit_text =
        limit.map(|n| if n.fract() == 0.0 { format!("L/{n:.0}") } else { format!("L/{}", crate::trace::show(n)) });
    let (gross, m_live) = value;
    let mut out = LiveDeflection {
        live: Some(gross),
        load,
        limit: limit_value,
        limit_text,
        ok: true,
        why_not: None,
        cracked: None,
    };
    if class != Class::U {
        match bilinear(p, d, gross, m_live) {
            Ok(b) => {
                out.live = Some(b.gross * b.share + b.gross * b.ic / b.icr * (1.0 - b.share));
                out.cracked = Some(b);
            }
            Err(why) => {
                out.live = None;
                out.why_not = Some(format!(
                    "class {}: the deflection needs the cracked section ({}), and {why}",
                    class.letter(),
                    p.basis.cite(Clause::CrackedDeflection)
                ));
            }
        }
    }
    out.ok = out.live.is_none_or(|v| limit_value.is_none_or(|l| v <= l * (1.0 + 1e-9)));
    out
}

/// The bilinear relation at midspan for a live load with deflection `gross` on the
/// uncracked section and moment `m_live` at midspan.
fn bilinear(p: &Prepared, d: &Demand, gross: f64, m_live: f64) -> Result<Bilinear, String> {
    let mid = d.length / 2.0;
    let ic = p.composite.as_ref().map_or(p.precast.i, |c| c.i);
    let (y, icr) = super::cracked::Transformed::at(p, mid)
        .bending()
        .ok_or("the cracked transformed section at midspan has no neutral axis within the section")?;
    let (dead_bottom, sb) = super::stresses::dead_bottom(p, d, mid);
    let fr = p.m.concrete.fr;
    let m_cr = (fr - dead_bottom).max(0.0) * sb;
    let share = if m_live > m_cr { m_cr / m_live } else { 1.0 };
    Ok(Bilinear {
        gross,
        ic,
        icr,
        depth: p.top - y,
        dead_bottom,
        sb,
        fr,
        m_cr: m_cr * p.cv.km,
        m_live: m_live * p.cv.km,
        share,
    })
}

fn record(p: &Prepared, d: &Demand, c: &Camber, (eci, ec, i, ic): (f64, f64, f64, f64), w_sw: f64, tr: &mut Trace) {
    let sys = p.sys;
    let u = sys.names();
    let len_u = u.length;
    let show = crate::trace::show;
    let integral = "by virtual work, ∫ M m / (E I) dx with m the moment of a unit load at the point (Simpson's rule on pieces where M m is at most cubic: exact)";
    tr.rec(|| {
        Step::new("camber", "camber.p", "Camber from the prestress at release", sy("Delta_p", "Δp"))
            .result(c.prestress, Unit::Length)
            .note(format!(
                "upward, at x = {} {len_u}: M(x) = P(x) e(x) with the force just after release and its eccentricity at each x (built up over the transfer lengths, as in the stresses), the member on its ends, Eci = {} {}, I = {} {len_u}⁴; {integral}",
                show(c.x),
                show(eci),
                u.stress,
                show(i),
            ))
    });
    tr.rec(|| {
        Step::new("camber", "camber.sw", "Deflection from the self-weight at release", sy("Delta_(s w)", "Δsw"))
            .result(c.self_weight, Unit::Length)
            .note(format!(
                "downward: 5 w L⁴ / (384 Eci I) with w = {} {}, L = {} {len_u} (the member on its ends)",
                show(super::demand::line_shown(sys, w_sw)),
                match sys {
                    crate::units::System::Us => "klf",
                    crate::units::System::Si => "kN/m",
                },
                show(d.length)
            ))
    });
    if let Some(t) = c.topping {
        tr.rec(|| {
            Step::new("camber", "camber.top", "Deflection from the topping's weight", sy("Delta_(t o p)", "Δtop"))
                .result(t, Unit::Length)
                .note(format!(
                    "downward: on the precast unit between the bearings, Ec = {} {}; {integral}",
                    show(ec),
                    u.stress
                ))
        });
    }
    tr.rec(|| {
        Step::new("camber", "camber.sd", "Deflection from the superimposed dead load", sy("Delta_(s d)", "Δsd"))
            .result(c.superimposed_dead, Unit::Length)
            .note(format!(
                "downward: the dead loads other than the self-weight{} on the composite section between the bearings, Ec, I = {} {len_u}⁴; {integral}",
                if c.topping.is_some() { " and the topping" } else { "" },
                show(ic)
            ))
    });
    let k = c.multipliers;
    let source = "PCI Design Handbook, suggested simple-span multipliers (after Martin 1977); from memory";
    tr.rec(|| {
        Step::new("camber", "camber.release", "Camber at release", sy("Delta_i", "Δi"))
            .formula(crate::trace::f::sub(crate::trace::f::v(0), crate::trace::f::v(1)))
            .input(sy("Delta_p", "Δp"), c.prestress, Unit::Length)
            .input(sy("Delta_(s w)", "Δsw"), c.self_weight, Unit::Length)
            .result(c.release, Unit::Length)
            .note("upward positive")
    });
    tr.rec(|| {
        use crate::trace::f::*;
        Step::new("camber", "camber.erection", "Camber at erection", sy("Delta_e", "Δe"))
            .formula(sub(mul(vec![n(k.erection_prestress), v(0)]), mul(vec![n(k.erection_self_weight), v(1)])))
            .input(sy("Delta_p", "Δp"), c.prestress, Unit::Length)
            .input(sy("Delta_(s w)", "Δsw"), c.self_weight, Unit::Length)
            .result(c.erection, Unit::Length)
            .clause(source)
    });
    tr.rec(|| {
        use crate::trace::f::*;
        let mut terms = vec![mul(vec![n(k.final_prestress), v(0)]), neg(mul(vec![n(k.final_self_weight), v(1)]))];
        let mut st = Step::new("camber", "camber.final", "Final camber", sy("Delta_f", "Δf"))
            .input(sy("Delta_p", "Δp"), c.prestress, Unit::Length)
            .input(sy("Delta_(s w)", "Δsw"), c.self_weight, Unit::Length)
            .input(sy("Delta_(s d)", "Δsd"), c.superimposed_dead, Unit::Length);
        terms.push(neg(mul(vec![n(k.final_superimposed), v(2)])));
        if let (Some(f), Some(t)) = (k.final_topping, c.topping) {
            terms.push(neg(mul(vec![n(f), v(3)])));
            st = st.input(sy("Delta_(t o p)", "Δtop"), t, Unit::Length);
        }
        st.formula(add(terms))
            .result(c.final_camber, Unit::Length)
            .clause(source)
            .note("upward positive; the multipliers of a member with a composite topping where it has one")
    });
}

fn record_live(p: &Prepared, d: &Demand, l: &LiveDeflection, tr: &mut Trace) {
    let len_u = p.sys.names().length;
    let show = crate::trace::show;
    let ic = p.composite.as_ref().map_or(p.precast.i, |c| c.i);
    let integral = "by virtual work, ∫ M m / (E I) dx with m the moment of a unit load at the point (Simpson's rule on pieces where M m is at most cubic: exact)";
    if let (Some(v), Some(b)) = (l.live, &l.cracked) {
        record_bilinear(p, d, l, v, b, tr);
        return;
    }
    if let Some(v) = l.live {
        tr.rec(|| {
            let st = Step::new("camber", "camber.live", "Immediate live-load deflection", sy("Delta_L", "ΔL"))
                .result(v, Unit::Length)
                .clause(format!("{} 24.2.3, Table 24.2.2", p.basis.name()));
            let against = match (l.limit, &l.limit_text) {
                (Some(lim), Some(t)) => format!(
                    "; limit {t} = {} {len_u} (the span {} {len_u}): {}",
                    show(lim),
                    show(d.span),
                    if l.ok { "within it" } else { "EXCEEDED" }
                ),
                _ => "; no limit chosen in the input ([member.stresses] deflection_limit)".into(),
            };
            st.note(format!(
                "downward, of {} on the span between the bearings (the overhangs unloaded), class U: the uncracked composite section, Ec, I = {} {len_u}⁴; {integral}{against}",
                l.load,
                show(ic)
            ))
        });
    }
}

/// The live-load deflection of a class T or C member by the bilinear relation: Icr, the
/// share of the live moment on the uncracked section, and the deflection.
fn record_bilinear(p: &Prepared, d: &Demand, l: &LiveDeflection, v: f64, b: &Bilinear, tr: &mut Trace) {
    use crate::trace::f::{add, div, min, mul, n, sub, v as var};
    let u = p.sys.names();
    let show = crate::trace::show;
    let clause = p.basis.cite(crate::basis::Clause::CrackedDeflection);
    tr.rec(|| {
        Step::new("camber", "camber.icr", "Cracked transformed section at midspan", sy("I_(\"cr\")", "Icr"))
            .result(b.icr, Unit::Inertia)
            .clause(clause.clone())
            .note(format!(
                "bending alone: the concrete in compression only{}, the bonded strand and bars by Es / Ec; neutral axis {} {} below the top; in the precast concrete's Ec",
                if p.m.topping.is_some() { " (the topping at its modular ratio)" } else { "" },
                show(b.depth),
                u.length
            ))
    });
    tr.rec(|| {
        let st = Step::new("camber", "camber.share", "Share of the live moment on the uncracked section", sy("r_g", "rg"));
        // no live moment: all of it (none) on the uncracked section
        let st = if b.m_live > 0.0 { st.formula(min(vec![div(var(0), var(1)), n(1.0)])) } else { st };
        st.input(sy("M_(\"cr,L\")", "Mcr,L"), b.m_cr, Unit::Moment)
            .input(sy("M_L", "ML"), b.m_live, Unit::Moment)
            .result(b.share, Unit::Ratio)
            .clause(clause.clone())
            .note(format!(
                "at midspan: Mcr,L = max(0, (fr − fb) Sb), the live moment that brings the bottom fibre from {} {} under the prestress and the dead load to fr = {} {} (Sb = {} {}³); the rest of the live moment acts on the cracked section (the bilinear relation as the PCI Design Handbook applies it, from memory)",
                show(b.dead_bottom),
                u.stress,
                show(b.fr),
                u.stress,
                show(b.sb),
                u.length
            ))
    });
    tr.rec(|| {
        let against = match (l.limit, &l.limit_text) {
            (Some(lim), Some(t)) => format!(
                "; limit {t} = {} {} (the span {} {}): {}",
                show(lim),
                u.length,
                show(d.span),
                u.length,
                if l.ok { "within it" } else { "EXCEEDED" }
            ),
            _ => "; no limit chosen in the input ([member.stresses] deflection_limit)".into(),
        };
        Step::new("camber", "camber.live", "Immediate live-load deflection, bilinear", sy("Delta_L", "ΔL"))
            .formula(add(vec![mul(vec![var(0), var(3)]), mul(vec![var(0), div(var(1), var(2)), sub(n(1.0), var(3))])]))
            .input(sy("Delta_g", "Δg"), b.gross, Unit::Length)
            .input(sy("I_c", "Ic"), b.ic, Unit::Inertia)
            .input(sy("I_(\"cr\")", "Icr"), b.icr, Unit::Inertia)
            .input(sy("r_g", "rg"), b.share, Unit::Ratio)
            .result(v, Unit::Length)
            .clause(format!("{clause}, Table 24.2.2"))
            .note(format!(
                "downward, of {} on the span between the bearings; Δg on the uncracked section (Ec Ic, by virtual work), the part of the live moment past cracking on Icr{against}",
                l.load
            ))
    });
}
