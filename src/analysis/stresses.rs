//! The concrete stresses at release and in service at every station along the member,
//! against the basis's limits, and the member's class (U, T or C) from the service
//! tension in the precompressed tensile zone.
//!
//! Elastic, uncracked gross sections (the strand's transformed area neglected, common
//! practice): at release the precast unit rests on its ends and carries its own weight
//! and the prestress just after release, fpi; in service the effective prestress fse
//! acts on the precast unit with the loads it carries alone (Mnc: self-weight, and the
//! topping of unshored construction), and the other loads act on the composite section.
//! The prestress of each layer builds up over its transfer length from each end (past
//! any debonding), as in the strength stage. Tension positive.

use super::demand::Demand;
use super::prepare::Prepared;
use super::prestress::strands_at;
use super::station::Station;
use super::sy;
use crate::basis::{Clause, Combination, ReleaseLimits};
use crate::input::model::LoadKind;
use crate::trace::{Step, Trace, Unit, f::*};
use serde::Serialize;

/// A fibre's stress and the limit for its sign (compression negative, tension
/// positive; `None` where no limit applies to a stress of that sign).
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Fibre {
    pub stress: f64,
    pub limit: Option<f64>,
}

impl Fibre {
    /// The stress against its limit (1 at the limit; 0 without one).
    pub fn ratio(&self) -> f64 {
        match self.limit {
            Some(l) if l != 0.0 => self.stress / l,
            _ => 0.0,
        }
    }
    pub fn ok(&self) -> bool {
        self.ratio() <= 1.0 + 1e-9
    }
}

/// The stresses of one stage at a station.
#[derive(Debug, Clone, Serialize)]
pub struct StageStress {
    /// "release", "sustained" or "service".
    pub stage: &'static str,
    /// The service combination (the largest moment here), for the service stage.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub combination: Option<String>,
    /// The prestress force (shown units) and its eccentricity below the precast centroid.
    pub p: f64,
    pub e: f64,
    /// The moments on the precast unit alone and on the composite section (shown units).
    pub m_precast: f64,
    pub m_composite: f64,
    pub top: Fibre,
    pub bottom: Fibre,
    pub topping_top: Option<Fibre>,
}

impl StageStress {
    fn fibres(&self) -> impl Iterator<Item = &Fibre> {
        [&self.top, &self.bottom].into_iter().chain(self.topping_top.as_ref())
    }
    /// The largest stress-to-limit ratio of its fibres.
    pub fn worst(&self) -> f64 {
        self.fibres().map(Fibre::ratio).fold(0.0, f64::max)
    }
}

/// The bonded reinforcement of the tension zone where the tension at release exceeds
/// its limit.
#[derive(Debug, Clone, Serialize)]
pub struct Reinforcement {
    pub x: f64,
    /// "top" or "bottom".
    pub fibre: &'static str,
    /// The tensile force of the uncracked stresses over the tension zone (shown units).
    pub tension_force: f64,
    pub fs: f64,
    /// Required: the force over fs.
    pub area: f64,
    /// Provided: the bonded bars and untensioned strands within the tension zone.
    pub provided: f64,
    pub ok: bool,
}

/// The release stage as checked, or why not.
#[derive(Debug, Clone, Serialize)]
pub struct ReleaseOut {
    pub checked: bool,
    pub why_not: Option<String>,
    pub fci: Option<f64>,
    /// The stations within this distance of an end take the end limits.
    pub end_zone: Option<f64>,
    /// The limits, signed: compression negative, tension positive.
    pub limits: Option<ReleaseLimits>,
}

/// The service compression limits (negative), the topping's where there is one.
#[derive(Debug, Clone, Serialize)]
pub struct ServiceLimits {
    pub sustained: f64,
    pub total: f64,
    pub topping_sustained: Option<f64>,
    pub topping_total: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ServiceOut {
    pub limits: ServiceLimits,
    pub sustained_live: f64,
}

/// The class by the service tension ft in the precompressed tensile zone.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum Class {
    U,
    T,
    C,
}

impl Class {
    pub fn letter(self) -> &'static str {
        match self {
            Class::U => "U",
            Class::T => "T",
            Class::C => "C",
        }
    }
}

/// The member's stresses: the class, the limits, the reinforcement at release, and
/// whether every stress is within its limit.
#[derive(Debug, Clone, Serialize)]
pub struct MemberStresses {
    /// The member's length, end to end.
    pub length: f64,
    pub class: Class,
    /// The largest bottom-fibre stress under all service loads between the bearings, and
    /// the upper bounds of classes U and T.
    pub ft: f64,
    pub ft_x: f64,
    pub ft_u: f64,
    pub ft_t: f64,
    pub release: ReleaseOut,
    pub service: ServiceOut,
    pub reinforcement: Vec<Reinforcement>,
    /// The largest stress-to-limit ratio at release (where checked) and in service, and
    /// the x of each.
    pub worst_release: Option<(f64, f64)>,
    pub worst_service: (f64, f64),
    pub pass: bool,
    /// Points between the stations where a fine scan found a stage (or the class's bottom
    /// tension) beyond what the stations and named locations show: checked as they are.
    pub between: Vec<Between>,
    /// A class C member's crack control on the cracked section, or why it is not made.
    pub crack_control: Option<super::cracked::CrackCheck>,
}

/// A point between the stations, with why it is checked and its stages.
#[derive(Debug, Clone, Serialize)]
pub struct Between {
    pub x: f64,
    pub why: String,
    pub stresses: Vec<StageStress>,
}

/// The points of a fine scan along the member (400 equal parts) where a stage's worst
/// stress-to-limit ratio, or the bottom tension under all service loads between the
/// bearings, exceeds the largest at `xs` (by more than 1 part in 10⁶): each with why.
pub(super) fn between(p: &Prepared, d: &Demand, xs: &[f64]) -> Vec<(f64, String)> {
    const PARTS: usize = 400;
    let cx = context(p, d);
    let len = d.length;
    let known: Vec<Vec<StageStress>> = xs.iter().map(|&x| at(&cx, x)).collect();
    let mut grid: Vec<f64> = (1..PARTS).map(|k| len * k as f64 / PARTS as f64).collect();
    // just past each end zone, where the release limits drop to those away from the ends
    // while the stresses have not yet changed
    if cx.release.is_some() && cx.end_zone > 0.0 && cx.end_zone < len / 2.0 {
        let past = cx.end_zone * (1.0 + 1e-6) + 1e-6 * len;
        grid.extend([past, len - past]);
    }
    let scan: Vec<Vec<StageStress>> = grid.iter().map(|&x| at(&cx, x)).collect();
    let mut out: Vec<(f64, String)> = Vec::new();
    let mut add = |x: f64, why: String| {
        if !out.iter().any(|(y, _)| (y - x).abs() <= 1e-9 * len) {
            out.push((x, why));
        }
    };
    // two measures of a stage at a point: its worst ratio as shown, and the ratio that
    // decides the check (a reinforced tension at release counts by the steel it needs
    // over the steel provided, not by its stress)
    let reinforced = p.m.stresses.release_reinforcement;
    let decides = |x: f64, st: &StageStress| -> f64 {
        let mut r: f64 = st.topping_top.map_or(0.0, |t| t.ratio());
        for (fibre, f) in [("top", &st.top), ("bottom", &st.bottom)] {
            r = r.max(if st.stage == "release" && reinforced && f.stress > 0.0 && !f.ok() {
                let steel = bonded_steel(&cx, x, fibre, st);
                if steel.provided > 0.0 { steel.area / steel.provided } else { f64::INFINITY }
            } else {
                f.ratio()
            });
        }
        r
    };
    for stage in ["release", "sustained", "service"] {
        let shown = |_: f64, st: &StageStress| -> f64 { st.worst() };
        for measure in [&shown as &dyn Fn(f64, &StageStress) -> f64, &decides] {
            let worst_of = |rows: &[Vec<StageStress>], xs: &[f64]| {
                first_largest(
                    (xs.iter().zip(rows))
                        .filter_map(|(x, r)| r.iter().find(|s| s.stage == stage).map(|s| (measure(*x, s), *x))),
                )
            };
            if let (Some(k), Some(g)) = (worst_of(&known, xs), worst_of(&scan, &grid))
                && g.0 > k.0 * (1.0 + 1e-6)
                && g.0 > 0.0
            {
                let past_end_zone = (g.1.min(len - g.1) - cx.end_zone).abs() <= 1e-4 * len;
                add(
                    g.1,
                    if past_end_zone && stage == "release" {
                        "just past the end zone".into()
                    } else {
                        format!("between stations: largest {stage} ratio")
                    },
                );
            }
        }
    }
    let (lo, hi) = (d.bearing - 1e-9 * len, len - d.bearing + 1e-9 * len);
    let ft_of = |rows: &[Vec<StageStress>], xs: &[f64]| {
        (xs.iter().zip(rows))
            .filter(|(x, _)| **x >= lo && **x <= hi)
            .filter_map(|(x, r)| r.iter().find(|s| s.stage == "service").map(|s| (s.bottom.stress, *x)))
            .fold((f64::NEG_INFINITY, 0.0), |a, b| if b.0 > a.0 { b } else { a })
    };
    let (k, g) = (ft_of(&known, xs), ft_of(&scan, &grid));
    if g.0 > k.0 + 1e-6 * k.0.abs().max(1e-3) {
        add(g.1, "between stations: largest bottom tension".into());
    }
    out
}

/// The largest bottom stress under all service loads between the bearings and its x:
/// whether the design has tension in the precompressed tensile zone, which decides the
/// development length of debonded strand (25.4.8.1(b)) before the stations (placed by
/// that length) are known. Exact: between the member's breaks (bearings, point loads,
/// harp and debond points, the ends of the transfer lengths) the bottom stress under
/// each combination is a quadratic in x (the prestress builds up linearly, a harped
/// layer's depth is linear, the moments are at most quadratic), so its largest value
/// lies at a break or at the vertex of the parabola through a piece's ends and middle.
pub(super) fn service_tension(p: &Prepared, d: &Demand) -> (f64, f64) {
    let cx = context(p, d);
    let (lo, hi) = (d.bearing, d.length - d.bearing);
    let nodes: Vec<f64> = super::camber::breaks(p, d).into_iter().filter(|x| *x >= lo && *x <= hi).collect();
    let bottom = |x: f64, factors: &[f64; 4]| {
        let (force, e) = force_at(p, x, &|i| p.m.strands[i].fse);
        let (by_kind, mnc) = moments_at(&cx, x);
        let m: f64 = factors.iter().zip(by_kind).map(|(f, m)| f * m).sum();
        fibres(&cx, force, e, mnc, m - mnc).1
    };
    let mut points: Vec<(f64, f64)> = Vec::new();
    for c in &cx.combinations {
        let f = |x: f64| (bottom(x, &c.factors), x);
        for w in nodes.windows(2) {
            let (x0, x2) = (w[0], w[1]);
            let x1 = 0.5 * (x0 + x2);
            let (f0, f1, f2) = (f(x0), f(x1), f(x2));
            points.extend([f0, f1, f2]);
            // the vertex of the parabola through the three, where it is a maximum inside
            let bend = f0.0 - 2.0 * f1.0 + f2.0;
            if bend < 0.0 {
                let t = (f0.0 - f2.0) / (2.0 * bend);
                if t.abs() < 1.0 {
                    points.push(f(x1 + t * (x2 - x0) / 2.0));
                }
            }
        }
    }
    first_largest(points.into_iter()).unwrap_or((f64::NEG_INFINITY, 0.0))
}

/// The moment at x under the service combination with the largest moment there.
pub(super) fn service_moment(p: &Prepared, d: &Demand, x: f64) -> f64 {
    let cx = context(p, d);
    at(&cx, x).into_iter().find(|s| s.stage == "service").map_or(0.0, |s| (s.m_precast + s.m_composite) / p.cv.km)
}

/// At x: the bottom stress under the effective prestress and the dead load alone, and
/// the bottom section modulus of the section the loads beyond it act on (the composite
/// one where there is a topping).
pub(super) fn dead_bottom(p: &Prepared, d: &Demand, x: f64) -> (f64, f64) {
    let cx = context(p, d);
    let (force, e) = force_at(p, x, &|i| p.m.strands[i].fse);
    let (by_kind, mnc) = moments_at(&cx, x);
    let (_, bottom, _) = fibres(&cx, force, e, mnc, by_kind[0] - mnc);
    (bottom, cx.ic / (cx.ycc - cx.bot))
}

/// What the stages read of the member, once: the section's properties and the limits.
struct Ctx<'a> {
    p: &'a Prepared<'a>,
    d: &'a Demand,
    len: f64,
    /// Precast A, I, centroid; its top and bottom heights; composite I and centroid; the
    /// top of the section; the topping's modular ratio.
    a: f64,
    i: f64,
    yc: f64,
    top_p: f64,
    bot: f64,
    ic: f64,
    ycc: f64,
    top: f64,
    n: f64,
    /// Self-weight of the precast unit per length (the release moment).
    w_sw: f64,
    /// The largest transfer length of a tensioned layer: the end zone at release.
    end_zone: f64,
    release: Option<(f64, ReleaseLimits)>,
    service: ServiceLimits,
    combinations: Vec<Combination>,
}

/// The stresses at every station `xs` of a member with loads: each station's stages
/// (release first, where checked), and the member's summary. The limits and the class
/// bounds are recorded in `tr`, and the stresses at the station governing each stage.
pub(super) fn of_member(
    p: &Prepared,
    d: &Demand,
    xs: &[f64],
    tr: &mut Trace,
) -> (MemberStresses, Vec<Vec<StageStress>>) {
    let m = p.m;
    let cx = context(p, d);
    let rows: Vec<Vec<StageStress>> = xs.iter().map(|&x| at(&cx, x)).collect();
    let (ft_u, ft_t) = p.basis.class_limits(m.concrete.fc);
    let (bearing, len) = (d.bearing, d.length);
    let tol = 1e-9 * len;
    let (ft, ft_x) = xs
        .iter()
        .zip(&rows)
        .filter(|(x, _)| **x >= bearing - tol && **x <= len - bearing + tol)
        .filter_map(|(x, r)| r.iter().find(|s| s.stage == "service").map(|s| (s.bottom.stress, *x)))
        .fold((f64::NEG_INFINITY, 0.0), |a, b| if b.0 > a.0 { b } else { a });
    let class = if ft <= ft_u {
        Class::U
    } else if ft <= ft_t {
        Class::T
    } else {
        Class::C
    };
    let worst = |stage: &str| {
        first_largest(
            xs.iter().zip(&rows).filter_map(|(x, r)| r.iter().find(|s| s.stage == stage).map(|s| (s.worst(), *x))),
        )
    };
    let worst_release = worst("release");
    let worst_service = [worst("sustained"), worst("service")]
        .into_iter()
        .flatten()
        .fold((0.0, 0.0), |a, b| if b.0 > a.0 { b } else { a });
    let mut reinforcement = Vec::new();
    let mut pass = true;
    for (x, r) in xs.iter().zip(&rows) {
        for s in r {
            for (fibre, f) in [("top", &s.top), ("bottom", &s.bottom)] {
                if f.ok() {
                    continue;
                }
                if s.stage == "release" && f.stress > 0.0 && m.stresses.release_reinforcement {
                    let r = bonded_steel(&cx, *x, fibre, s);
                    pass &= r.ok;
                    reinforcement.push(r);
                } else {
                    pass = false;
                }
            }
            if s.topping_top.is_some_and(|f| !f.ok()) {
                pass = false;
            }
        }
    }
    reinforcement.sort_by(|a, b| a.x.total_cmp(&b.x));
    record_member(&cx, tr, ft_u, ft_t);
    let release = ReleaseOut {
        checked: cx.release.is_some(),
        why_not: why_release_unchecked(p),
        fci: m.release.map(|r| r.fci),
        end_zone: cx.release.map(|_| cx.end_zone),
        limits: cx.release.map(|(_, l)| ReleaseLimits {
            compression: -l.compression,
            compression_end: -l.compression_end,
            ..l
        }),
    };
    let out = MemberStresses {
        length: len,
        class,
        ft,
        ft_x,
        ft_u,
        ft_t,
        release,
        service: ServiceOut { limits: cx.service.clone(), sustained_live: m.stresses.sustained_live },
        reinforcement,
        worst_release,
        worst_service,
        pass,
        between: Vec::new(),
        crack_control: None,
    };
    (out, rows)
}

/// The pair with the largest first value, the first of equals (in the order of the
/// stations, as the summary and the derivations both name it).
pub(super) fn first_largest<T>(pairs: impl Iterator<Item = (f64, T)>) -> Option<(f64, T)> {
    pairs.fold(None, |best, c| match best {
        Some(b) if b.0 >= c.0 => Some(b),
        _ => Some(c),
    })
}

/// Whether a station takes the end limits at release: within the longest transfer
/// length of a member end, the point at that length included (to a part in 10⁹, so
/// that x and L - x are alike).
pub fn in_end_zone(x: f64, len: f64, zone: f64) -> bool {
    x.min(len - x) <= zone * (1.0 + 1e-9) + 1e-9 * len
}

/// Whether the release stage can be checked (f'ci and every fpi known).
pub(super) fn release_checked(p: &Prepared) -> bool {
    why_release_unchecked(p).is_none()
}

/// Why the release stage is not checked (`None` where it is).
fn why_release_unchecked(p: &Prepared) -> Option<String> {
    let m = p.m;
    if m.release.is_none() {
        return Some("f'ci is not given ([member.concrete] fci)".into());
    }
    let missing: Vec<String> = (m.strands.iter().enumerate())
        .filter(|(_, s)| s.fse > 0.0 && s.fpi.is_none())
        .map(|(i, _)| (i + 1).to_string())
        .collect();
    (!missing.is_empty()).then(|| {
        format!(
            "the stress just after release is not known for strand layer {} (give fpi on the layer, or have its losses computed)",
            missing.join(", ")
        )
    })
}

fn context<'a>(p: &'a Prepared<'a>, d: &'a Demand) -> Ctx<'a> {
    let m = p.m;
    let (ic, ycc) = p.composite.as_ref().map_or((p.precast.i, p.precast.yc), |c| (c.i, c.yc));
    let (d1, _) = p.basis.development_divisors();
    let end_zone = m.strands.iter().filter(|s| s.fse > 0.0).map(|s| s.fse / d1 * s.diameter).fold(0.0, f64::max);
    let w_sw = d.uniform.iter().find(|u| u.source == "self-weight").map_or(0.0, |u| u.w);
    let release = match (m.release, why_release_unchecked(p)) {
        (Some(r), None) => Some((r.fci, p.basis.release_limits(r.fci))),
        _ => None,
    };
    let (k_sus, k_tot) = p.basis.service_compression();
    let fct = m.topping.as_ref().map(|t| t.concrete.fc);
    let service = ServiceLimits {
        sustained: -k_sus * m.concrete.fc,
        total: -k_tot * m.concrete.fc,
        topping_sustained: fct.map(|f| -k_sus * f),
        topping_total: fct.map(|f| -k_tot * f),
    };
    let present = LoadKind::ALL.map(|k| {
        d.uniform.iter().any(|u| u.kind == k && u.w > 0.0) || d.points.iter().any(|q| q.kind == k && q.p > 0.0)
    });
    Ctx {
        p,
        d,
        len: d.length,
        a: p.precast.area,
        i: p.precast.i,
        yc: p.precast.yc,
        top_p: p.top_p,
        bot: m.region.y_bot(),
        ic,
        ycc,
        top: p.top,
        n: p.n.unwrap_or(1.0),
        w_sw,
        end_zone,
        release,
        service,
        combinations: p.basis.service_combinations(present),
    }
}

/// The prestress force and its eccentricity at x, each layer at `stress(layer)` times
/// its transferred share there.
pub(super) fn force_at(p: &Prepared, x: f64, stress: &dyn Fn(usize) -> f64) -> (f64, f64) {
    let site = Station::without_demand(String::new(), x);
    let at = strands_at(p, 0, &site, &mut Trace::new(false));
    let mut force = 0.0;
    let mut moment = 0.0;
    for (i, (s, a)) in p.m.strands.iter().zip(&at).enumerate() {
        if s.fse <= 0.0 {
            continue;
        }
        let share = a.fse / s.fse;
        let f = stress(i) * s.total_area() * share;
        force += f;
        moment += f * a.yb;
    }
    (force, if force > 0.0 { moment / force } else { 0.0 })
}

/// The moments at x of each load kind, and of the loads on the precast unit alone
/// (signed: hogging negative over the overhangs).
fn moments_at(cx: &Ctx, x: f64) -> ([f64; 4], f64) {
    let d = cx.d;
    let mut by_kind = [0.0; 4];
    let mut mnc = 0.0;
    for u in &d.uniform {
        let mx = d.uniform_moment(u.w, x);
        by_kind[LoadKind::ALL.iter().position(|k| *k == u.kind).unwrap_or(0)] += mx;
        if u.precast_only {
            mnc += mx;
        }
    }
    for q in &d.points {
        by_kind[LoadKind::ALL.iter().position(|k| *k == q.kind).unwrap_or(0)] += d.point_moment(q.p, q.x, x);
    }
    (by_kind, mnc)
}

/// The stages at a station.
fn at(cx: &Ctx, x: f64) -> Vec<StageStress> {
    let p = cx.p;
    let m = p.m;
    let mut out = Vec::with_capacity(3);
    if let Some((_, lim)) = cx.release {
        let (force, e) = force_at(p, x, &|i| m.strands[i].fpi.unwrap_or(0.0));
        let msw = cx.w_sw * x * (cx.len - x) / 2.0;
        let end = in_end_zone(x, cx.len, cx.end_zone);
        let (c, t) = if end { (lim.compression_end, lim.tension_end) } else { (lim.compression, lim.tension) };
        let (top, bottom, _) = fibres(cx, force, e, msw, 0.0);
        let limit = |s: f64| Some(if s < 0.0 { -c } else { t });
        out.push(StageStress {
            stage: "release",
            combination: None,
            p: force * p.cv.kf,
            e,
            m_precast: msw * p.cv.km,
            m_composite: 0.0,
            top: Fibre { stress: top, limit: limit(top) },
            bottom: Fibre { stress: bottom, limit: limit(bottom) },
            topping_top: None,
        });
    }
    let (force, e) = force_at(p, x, &|i| m.strands[i].fse);
    let (by_kind, mnc) = moments_at(cx, x);
    let total = |f: &[f64; 4]| f.iter().zip(by_kind).map(|(f, m)| f * m).sum::<f64>();
    let (name, m_all) = (cx.combinations.iter())
        .map(|c| (c.name.clone(), total(&c.factors)))
        .fold((String::new(), f64::NEG_INFINITY), |a, b| if b.1 > a.1 { b } else { a });
    let m_sus = by_kind[0] + m.stresses.sustained_live * by_kind[1];
    let sl = &cx.service;
    for (stage, m_total, comp, comp_top, combination) in [
        ("sustained", m_sus, sl.sustained, sl.topping_sustained, None),
        ("service", m_all, sl.total, sl.topping_total, Some(name)),
    ] {
        let mc = m_total - mnc;
        let (top, bottom, tt) = fibres(cx, force, e, mnc, mc);
        let limit = |s: f64| if s < 0.0 { Some(comp) } else { None };
        out.push(StageStress {
            stage,
            combination,
            p: force * p.cv.kf,
            e,
            m_precast: mnc * p.cv.km,
            m_composite: mc * p.cv.km,
            top: Fibre { stress: top, limit: limit(top) },
            bottom: Fibre { stress: bottom, limit: limit(bottom) },
            topping_top: tt.map(|s| Fibre { stress: s, limit: if s < 0.0 { comp_top } else { None } }),
        });
    }
    out
}

/// The top and bottom stresses of the precast unit and the stress at the top of the
/// topping: prestress P at e, Mnc on the precast unit, Mc on the composite section.
fn fibres(cx: &Ctx, force: f64, e: f64, mnc: f64, mc: f64) -> (f64, f64, Option<f64>) {
    let (yt, yb) = (cx.top_p - cx.yc, cx.yc - cx.bot);
    let axial = -force / cx.a;
    let top = axial + force * e * yt / cx.i - mnc * yt / cx.i - mc * (cx.top_p - cx.ycc) / cx.ic;
    let bottom = axial - force * e * yb / cx.i + mnc * yb / cx.i + mc * (cx.ycc - cx.bot) / cx.ic;
    let tt = cx.p.m.topping.as_ref().map(|_| -cx.n * mc * (cx.top - cx.ycc) / cx.ic);
    (top, bottom, tt)
}

/// The bonded reinforcement of the tension zone at a release station: the tensile force
/// of the linear stress over the part of the precast section in tension, at the basis's
/// steel stress.
fn bonded_steel(cx: &Ctx, x: f64, fibre: &'static str, s: &StageStress) -> Reinforcement {
    let p = cx.p;
    let (ft, fb) = (s.top.stress, s.bottom.stress);
    // f(y) = a + b y, from the bottom fibre to the top; the tension zone is where it is
    // positive: above y0 where the stress rises upward, below it where it falls
    let b = (ft - fb) / (cx.top_p - cx.bot);
    let a = fb - b * cx.bot;
    let region = &p.m.region;
    let (part, zone): (crate::section::Moments, Box<dyn Fn(f64) -> bool>) = if b > 0.0 {
        let y0 = -a / b;
        (region.above(y0), Box::new(move |y| y >= y0))
    } else if b < 0.0 {
        let y0 = -a / b;
        (region.moments() - region.above(y0), Box::new(move |y| y <= y0))
    } else {
        (region.moments(), Box::new(move |_| a > 0.0))
    };
    let force = (a * part.area + b * part.qx).max(0.0);
    let (fs, _) = p.basis.release_steel_stress(p.m.stresses.reinforcement_fy);
    let area = force / fs;
    // bonded steel that is not tensioned: bars, and strand with no prestress (the
    // tensioned strand in the zone is not counted, conservatively)
    let site = Station::without_demand(String::new(), x);
    let at = strands_at(p, 0, &site, &mut Trace::new(false));
    let bars: f64 = p.m.bars.iter().filter(|b| zone(cx.top_p - b.depth)).map(|b| b.total_area()).sum();
    let strands: f64 = (p.m.strands.iter().zip(&at))
        .filter(|(s, a)| s.fse <= 0.0 && a.active && zone(cx.yc - a.yb))
        .map(|(s, _)| s.total_area())
        .sum();
    let provided = bars + strands;
    Reinforcement { x, fibre, tension_force: force * p.cv.kf, fs, area, provided, ok: provided >= area * (1.0 - 1e-9) }
}

/// The member's limits and class bounds, once.
fn record_member(cx: &Ctx, tr: &mut Trace, ft_u: f64, ft_t: f64) {
    let p = cx.p;
    let basis = p.basis;
    let m = p.m;
    let (fc_sym, fc_root) = basis.fc_root(m.concrete.fc);
    let stress = p.sys.names().stress;
    if let Some((fci, lim)) = cx.release {
        let clause_c = basis.cite(Clause::ReleaseCompression);
        let clause_t = basis.cite(Clause::ReleaseTension);
        tr.rec(|| {
            Step::new("stresses", "stresses.limit.release.fc", "Compressive stress limit at release", sy("f_(c,\"rel\")", "fc,rel"))
                .input(sy("f'_(c i)", "f'ci"), fci, Unit::Stress)
                .result(lim.compression, Unit::Stress)
                .clause(clause_c)
                .note(format!(
                    "{}: away from the ends {} {stress}, at the ends {} {stress} (within {} {} of a member end: the longest transfer length of a tensioned layer); from memory",
                    basis.release_limits_text(),
                    crate::trace::show(lim.compression),
                    crate::trace::show(lim.compression_end),
                    crate::trace::show(cx.end_zone),
                    p.sys.names().length,
                ))
        });
        tr.rec(|| {
            Step::new("stresses", "stresses.limit.release.ft", "Tensile stress limit at release", sy("f_(t,\"rel\")", "ft,rel"))
                .input(sy("f'_(c i)", "f'ci"), fci, Unit::Stress)
                .result(lim.tension, Unit::Stress)
                .clause(clause_t)
                .note(format!(
                    "away from the ends {} {stress}, at the ends {} {stress}; beyond them, bonded reinforcement ({}); from memory",
                    crate::trace::show(lim.tension),
                    crate::trace::show(lim.tension_end),
                    basis.cite(Clause::ReleaseReinforcement),
                ))
        });
    }
    for (id, title, sym, plain, value) in [
        ("stresses.limit.class.u", "Upper bound of the service tension ft of class U", "f_(t,U)", "ft,U", ft_u),
        ("stresses.limit.class.t", "Upper bound of the service tension ft of class T", "f_(t,T)", "ft,T", ft_t),
    ] {
        tr.rec(|| {
            Step::new("stresses", id, title, sy(sym, plain))
                .input(fc_sym.clone(), fc_root, Unit::Ratio)
                .result(value, Unit::Stress)
                .clause(basis.cite(Clause::MemberClass))
                .note(format!("{}; from memory", basis.class_limits_text()))
        });
    }
}

/// The derivation of one stage's stresses at a station (the station governing that
/// stage): the force and its eccentricity, the moments, and each fibre's stress.
pub(super) fn record_station(p: &Prepared, d: &Demand, x: f64, stage: &StageStress, tr: &mut Trace) {
    let cx = context(p, d);
    let cv = p.cv;
    let s = StationSteps { p, x, stage, tag: format!("stresses.{}", stage.stage) };
    let id = |t: &str| s.id(t);
    let release = stage.stage == "release";
    let title = s.title();
    s.force(tr);
    s.moments(&cx, tr);
    let (yt, yb) = (cx.top_p - cx.yc, cx.yc - cx.bot);
    let (st_p, sb_p) = (cx.i / yt, cx.i / yb);
    let (stc, sbc) = (cx.ic / (cx.top_p - cx.ycc), cx.ic / (cx.ycc - cx.bot));
    let (pf, e) = (stage.p, stage.e);
    let pm = if release { "M_(s w)" } else { "M_(n c)" };
    let fibre = |name: &str, sym: &'static str, plain: &'static str, s_p: f64, s_c: f64, sign: f64, f: &Fibre| {
        let ecc = mul(vec![v(0), v(2)]);
        let mut terms = vec![neg(per(div(v(0), v(1)), cv.kf))];
        if sign > 0.0 {
            terms.push(per(div(ecc, v(3)), cv.kf));
            terms.push(neg(per(div(v(4), v(3)), cv.km)));
        } else {
            terms.push(neg(per(div(ecc, v(3)), cv.kf)));
            terms.push(per(div(v(4), v(3)), cv.km));
        }
        let mut st = Step::new("stresses", id(plain), format!("Stress at the {name} {title}"), sy(sym, plain))
            .input(sy("P", "P"), pf, Unit::Force)
            .input(sy("A", "A"), cx.a, Unit::Area)
            .input(sy("e", "e"), e, Unit::Length)
            .input(if sign > 0.0 { sy("S_t", "St") } else { sy("S_b", "Sb") }, s_p, Unit::Modulus)
            .input(sy(pm, if release { "Msw" } else { "Mnc" }), stage.m_precast, Unit::Moment);
        if !release {
            terms.push(if sign > 0.0 { neg(per(div(v(5), v(6)), cv.km)) } else { per(div(v(5), v(6)), cv.km) });
            st = st.input(sy("M_c", "Mc"), stage.m_composite, Unit::Moment).input(
                if sign > 0.0 { sy("S'_(t c)", "S'tc") } else { sy("S_(b c)", "Sbc") },
                s_c,
                Unit::Modulus,
            );
        }
        let reinforced = release && f.stress > 0.0 && p.m.stresses.release_reinforcement;
        let limit = match f.limit {
            Some(l) => format!(
                "limit {} {}: {}",
                crate::trace::show(l),
                p.sys.names().stress,
                match (f.ok(), reinforced) {
                    (true, _) => "within it",
                    (false, true) => "exceeded, so carried by bonded reinforcement (its table)",
                    (false, false) => "EXCEEDED",
                }
            ),
            None => "no limit applies to a stress of this sign here".into(),
        };
        let extra = if !release && sign > 0.0 {
            "; S'tc = Ic / (height of the precast top above the composite centroid)"
        } else {
            ""
        };
        st.formula(add(terms)).result(f.stress, Unit::Stress).note(format!("tension positive; {limit}{extra}"))
    };
    tr.rec(|| fibre("top of the precast unit", "f_t", "ft", st_p, stc, 1.0, &stage.top));
    tr.rec(|| fibre("bottom", "f_b", "fb", sb_p, sbc, -1.0, &stage.bottom));
    if let Some(f) = &stage.topping_top {
        tr.rec(|| {
            Step::new("stresses", id("ftt"), format!("Stress at the top of the topping {title}"), sy("f_(t t)", "ftt"))
                .formula(neg(per(div(mul(vec![v(0), v(1)]), v(2)), cv.km)))
                .input(sy("n", "n"), cx.n, Unit::Ratio)
                .input(sy("M_c", "Mc"), stage.m_composite, Unit::Moment)
                .input(sy("S_(t c)", "Stc"), cx.ic / (cx.top - cx.ycc), Unit::Modulus)
                .result(f.stress, Unit::Stress)
                .note("the topping's own stress: n times that of the transformed section")
        });
    }
}

/// What the steps of one stage at a station share: the stage, where it is, and the
/// prefix of its step ids.
struct StationSteps<'a> {
    p: &'a Prepared<'a>,
    x: f64,
    stage: &'a StageStress,
    tag: String,
}

impl StationSteps<'_> {
    fn id(&self, s: &str) -> String {
        format!("{}.{s}", self.tag)
    }

    fn title(&self) -> &'static str {
        match self.stage.stage {
            "release" => "at release",
            "sustained" => "in service, prestress and sustained loads",
            _ => "in service, prestress and all loads",
        }
    }

    /// The prestress force here, layer by layer, and its eccentricity.
    fn force(&self, tr: &mut Trace) {
        let (p, x, stage) = (self.p, self.x, self.stage);
        let cv = p.cv;
        let id = |t: &str| self.id(t);
        let release = stage.stage == "release";
        let (pf, e) = (stage.p, stage.e);
        tr.rec(|| {
            let mut st = Step::new("stresses", id("P"), format!("Prestress force at x = {} {}", crate::trace::show(x), p.sys.names().length), sy("P", "P"));
            let site = Station::without_demand(String::new(), x);
            let at = strands_at(p, 0, &site, &mut Trace::new(false));
            let mut terms = Vec::new();
            for (i, (s, a)) in p.m.strands.iter().zip(&at).enumerate() {
                if s.fse <= 0.0 {
                    continue;
                }
                let k = i + 1;
                let f = if release { s.fpi.unwrap_or(0.0) } else { s.fse };
                let j = terms.len() * 3;
                terms.push(mul(vec![v(j), v(j + 1), v(j + 2)]));
                st = st
                    .input(crate::trace::Symbol::indexed("f", if release { "\"pi\"" } else { "\"se\"" }, if release { "fpi" } else { "fse" }, k), f, Unit::Stress)
                    .input(crate::trace::Symbol::indexed("A", "\"ps\"", "Aps", k), s.total_area(), Unit::Area)
                    .input(crate::trace::Symbol::indexed("r", "", "r", k), a.fse / s.fse, Unit::Ratio);
            }
            st.formula(per(add(terms), cv.f_div)).result(pf, Unit::Force).note(
                "r: the share of each layer's prestress transferred here (0 where debonded, rising linearly over the transfer length past the end or the debond point, 1 beyond)",
            )
        });
        tr.rec(|| {
            Step::new("stresses", id("e"), "Eccentricity of the prestress below the precast centroid", sy("e", "e"))
                .result(e, Unit::Length)
                .note("the layers' distances below the centroid weighted by their forces here")
        });
    }

    /// The moments of the stage: the self-weight at release; in service, the moment on the
    /// precast unit alone and the one on the composite section.
    fn moments(&self, cx: &Ctx, tr: &mut Trace) {
        let (p, stage) = (self.p, self.stage);
        let id = |t: &str| self.id(t);
        let release = stage.stage == "release";
        if release {
            tr.rec(|| {
                Step::new("stresses", id("Msw"), "Self-weight moment at release", sy("M_(s w)", "Msw"))
                    .result(stage.m_precast, Unit::Moment)
                    .note(format!(
                        "w x (L - x) / 2 with w = {} {} over the overall length L = {} {}: the member rests on its ends once the strands are released",
                        crate::trace::show(super::demand::line_shown(p.sys, cx.w_sw)),
                        match p.sys {
                            crate::units::System::Us => "klf",
                            crate::units::System::Si => "kN/m",
                        },
                        crate::trace::show(cx.len),
                        p.sys.names().length
                    ))
            });
        } else {
            tr.rec(|| {
                Step::new("stresses", id("Mnc"), "Moment on the precast unit alone", sy("M_(n c)", "Mnc"))
                    .result(stage.m_precast, Unit::Moment)
                    .note("unfactored: self-weight, and the topping unless shored")
            });
            tr.rec(|| {
                let why = match &stage.combination {
                    Some(c) => format!("the service combination {c} (the largest moment here) less Mnc"),
                    None if p.m.stresses.sustained_live == 0.0 => {
                        "the dead load alone (no part of the live load is taken as sustained), less Mnc".to_string()
                    }
                    None => format!(
                        "the dead load and {} times the live load (the share taken as sustained), less Mnc",
                        crate::trace::show(p.m.stresses.sustained_live)
                    ),
                };
                let clause =
                    if stage.combination.is_some() { Clause::ServiceCombinations } else { Clause::ServiceCompression };
                Step::new("stresses", id("Mc"), "Moment on the composite section", sy("M_c", "Mc"))
                    .result(stage.m_composite, Unit::Moment)
                    .clause(p.basis.cite(clause))
                    .note(why)
            });
        }
    }
}
