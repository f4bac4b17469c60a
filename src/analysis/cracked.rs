//! The cracked transformed section: the concrete in compression alone (the topping's by
//! its modular ratio), each bonded strand layer and bar by its modulus over the precast
//! concrete's Ec, all linear. Two uses, each a recorded result of its own:
//!
//! - the crack control of a class C member (24.5.2.3, 24.3.2): the strand stress change
//!   Δfps beyond decompression under the service moment, by the decompression method:
//!   the decompression force (the effective prestress force, fdc taken as fse) acts as a
//!   compression at the strand's centroid together with the service moment on the
//!   cracked section, all of it on the composite section (steel in the compression zone
//!   counts n A: the concrete it displaces is not deducted);
//! - the live-load deflection of a class T or C member (24.2.3.9): the second moment
//!   Icr of the section under bending alone, for the bilinear moment-deflection
//!   relation.

use super::demand::Demand;
use super::prepare::Prepared;
use super::prestress::strands_at;
use super::roots::brent;
use super::station::Station;
use super::{stresses, sy};
use crate::basis::Clause;
use crate::section::Moments;
use crate::trace::{Step, Trace, Unit, show};
use serde::Serialize;

/// The transformed section at a point of the member: the concrete regions with their
/// modular ratios, and the steel (height, transformed area n A, n).
pub(super) struct Transformed<'a> {
    p: &'a Prepared<'a>,
    steel: Vec<SteelAt>,
}

/// A steel layer of the transformed section.
#[derive(Debug, Clone, Copy)]
pub(super) struct SteelAt {
    pub y: f64,
    /// Its modular ratio and transformed area n A.
    pub n: f64,
    pub na: f64,
    /// The strand layer's number (None: a bar layer) and whether it is tensioned.
    pub layer: Option<usize>,
    pub tensioned: bool,
}

impl<'a> Transformed<'a> {
    /// The section at x: every strand layer bonded there, and the bars.
    pub(super) fn at(p: &'a Prepared<'a>, x: f64) -> Transformed<'a> {
        let m = p.m;
        let ec = m.concrete.ec;
        let at = strands_at(p, 0, &Station::without_demand(String::new(), x), &mut Trace::new(false));
        let mut steel = Vec::new();
        for (i, (s, a)) in m.strands.iter().zip(&at).enumerate() {
            if a.active {
                let n = p.curves[i].eps_modulus / ec;
                steel.push(SteelAt {
                    y: p.top - a.d,
                    n,
                    na: n * s.total_area(),
                    layer: Some(i + 1),
                    tensioned: s.fse > 0.0,
                });
            }
        }
        for b in &m.bars {
            let n = b.es / ec;
            steel.push(SteelAt { y: p.top_p - b.depth, n, na: n * b.total_area(), layer: None, tensioned: false });
        }
        Transformed { p, steel }
    }

    /// The moments of the transformed section's part in compression above y (concrete
    /// above y by its ratio) with all of the steel.
    fn zone(&self, y: f64) -> Moments {
        let p = self.p;
        let mut z = p.m.region.above(y);
        if let (Some(r), Some(n)) = (&p.topping_region, p.n) {
            let t = r.above(y);
            z = z + t.scaled(n);
        }
        for s in &self.steel {
            z = z + Moments { area: s.na, qx: s.na * s.y, qy: 0.0, ix: s.na * s.y * s.y };
        }
        z
    }

    /// The bending-only cracked section: the neutral axis's height and Icr about it (in
    /// the precast concrete's modulus).
    pub(super) fn bending(&self) -> Option<(f64, f64)> {
        let first = |y: f64| {
            let z = self.zone(y);
            z.qx - y * z.area
        };
        let (lo, hi) = (self.p.m.region.y_bot(), self.p.top);
        let (flo, fhi) = (first(lo), first(hi));
        if flo.is_nan() || fhi.is_nan() || flo <= 0.0 || fhi >= 0.0 {
            return None;
        }
        let y = brent(first, lo, hi, flo, fhi, 1e-12 * (hi - lo), 0.0)?;
        let z = self.zone(y);
        Some((y, z.ix - 2.0 * y * z.qx + y * y * z.area))
    }

    /// The decompression method: the cracked section under a compression `force` at
    /// height `yp` and the moment `moment` (sagging). The neutral axis's height and Ec
    /// times the curvature; among several roots, the one giving the largest tension at
    /// the lowest steel (the conservative one). `None`: no equilibrium on the section.
    pub(super) fn decompression(&self, force: f64, yp: f64, moment: f64) -> Option<(f64, f64)> {
        // about a neutral axis at y: first moment A1 = ∫(y' - y) dA and the product
        // B1 = ∫(y' - y)(y' - yp) dA; equilibrium: Ec κ A1 = force, Ec κ B1 = moment
        let ab = |y: f64| {
            let z = self.zone(y);
            (z.qx - y * z.area, z.ix - (y + yp) * z.qx + y * yp * z.area)
        };
        let f = |y: f64| {
            let (a1, b1) = ab(y);
            moment * a1 - force * b1
        };
        let (lo, hi) = (self.p.m.region.y_bot(), self.p.top);
        const PARTS: usize = 400;
        let ys: Vec<f64> = (0..=PARTS).map(|k| lo + (hi - lo) * k as f64 / PARTS as f64).collect();
        // the tension at the lowest tensioned strand, as crack_control reads it
        let y_low = self.steel.iter().filter(|s| s.tensioned).map(|s| s.y).fold(f64::INFINITY, f64::min);
        let mut best: Option<(f64, f64, f64)> = None;
        for w in ys.windows(2) {
            let (fa, fb) = (f(w[0]), f(w[1]));
            // a change of sign (NaN counts as none), not two zeros
            let changes = fa * fb <= 0.0 && !(fa == 0.0 && fb == 0.0);
            if !changes {
                continue;
            }
            let Some(y) = brent(f, w[0], w[1], fa, fb, 1e-12 * (hi - lo), 0.0) else { continue };
            let (a1, b1) = ab(y);
            if b1 <= 0.0 || a1 < -1e-9 * b1.abs() / (hi - lo) {
                continue;
            }
            let ek = moment / b1;
            let tension = ek * (y - y_low);
            if best.is_none_or(|b| tension > b.2) {
                best = Some((y, ek, tension));
            }
        }
        best.map(|(y, ek, _)| (y, ek))
    }

    pub(super) fn steel(&self) -> &[SteelAt] {
        &self.steel
    }
}

/// A class C member's crack control, or why it is not made.
#[derive(Debug, Clone, Serialize)]
#[serde(untagged)]
pub enum CrackCheck {
    Made(CrackControl),
    NotMade { why_not: String },
}

/// The crack control of a class C member at the point of its largest service tension
/// (24.5.2.3, 24.3.2).
#[derive(Debug, Clone, Serialize)]
pub struct CrackControl {
    pub x: f64,
    /// The service moment there and the decompression force (shown units), and the
    /// force's height (the tensioned strand's centroid).
    pub moment: f64,
    pub force: f64,
    pub y_force: f64,
    /// The neutral axis's depth below the top of the section.
    pub depth: f64,
    /// The tensioned strand layer closest to the tension face, its height and clear cover.
    pub layer: usize,
    pub y_strand: f64,
    pub cover: f64,
    /// Its stress change beyond decompression, and the limits.
    pub dfps: f64,
    pub dfps_max: f64,
    pub dfps_free: f64,
    /// The stress at the top of the section on the cracked section (for information).
    pub top: f64,
    /// The largest spacing (None: not limited, Δfps at most `dfps_free`), and the spacing
    /// of the input.
    pub spacing_max: Option<f64>,
    pub spacing: Option<f64>,
    /// Within its limits, as far as checked.
    pub ok: bool,
    /// What is left to the engineer, if anything.
    pub open: Option<String>,
}

impl CrackCheck {
    /// Whether the check is made and not met (a check not made is an open condition).
    pub fn fails(&self) -> bool {
        matches!(self, CrackCheck::Made(c) if !c.ok)
    }
}

/// The crack control of a class C member at x (the largest service tension), recorded in
/// `tr`, or why it is not made.
pub(super) fn crack_check(p: &Prepared, d: &Demand, x: f64, tr: &mut Trace) -> CrackCheck {
    match crack_control(p, d, x, tr) {
        Ok(c) => CrackCheck::Made(c),
        Err(why_not) => CrackCheck::NotMade { why_not },
    }
}

fn crack_control(p: &Prepared, d: &Demand, x: f64, tr: &mut Trace) -> Result<CrackControl, String> {
    let m = p.m;
    let t = Transformed::at(p, x);
    let moment = stresses::service_moment(p, d, x);
    let (force, e) = stresses::force_at(p, x, &|i| m.strands[i].fse);
    let yp = p.precast.yc - e;
    // the tensioned strand layer closest to the tension face
    let lowest = (t.steel().iter().filter(|s| s.tensioned))
        .filter_map(|s| s.layer.map(|k| (k, *s)))
        .min_by(|a, b| a.1.y.total_cmp(&b.1.y));
    let Some((layer, s)) = lowest else {
        return Err("no tensioned strand is bonded there".into());
    };
    let (y, ek) = t
        .decompression(force, yp, moment)
        .ok_or("the cracked section under the decompression force and the service moment has no neutral axis within the section (it may not crack there at all); check the crack control by other means")?;
    let dfps = s.n * ek * (y - s.y);
    let db = m.strands[layer - 1].diameter;
    let cover = s.y - m.region.y_bot() - db / 2.0;
    // the top of the topping by its modular ratio (n is given only with a topping)
    let top = -ek * (p.top - y) * p.n.unwrap_or(1.0);
    let (dfps_max, dfps_free) = p.basis.crack_control();
    let spacing = m.stresses.tension_face_spacing;
    let spacing_max = (dfps > dfps_free).then(|| p.basis.crack_spacing(dfps, cover));
    let tol = 1.0 + 1e-9;
    let mut ok = dfps <= dfps_max * tol;
    let mut open = Vec::new();
    match (spacing_max, spacing) {
        (Some(smax), _) if smax <= 0.0 => ok = false,
        (Some(smax), Some(s)) => ok &= s <= smax * tol,
        (Some(_), None) => open.push(
            "the spacing of the reinforcement closest to the tension face is not given ([member.stresses] tension_face_spacing): confirm it is within the largest allowed".to_string(),
        ),
        (None, _) => {}
    }
    let names = p.sys.names();
    if t.steel().iter().any(|b| b.layer.is_none() && b.y < s.y) {
        open.push("bars lie closer to the tension face than the strand: their stress and spacing (Table 24.3.2, deformed bars) are not checked".into());
    }
    if m.total_height() > p.basis.skin_depth() {
        open.push(format!(
            "the member is deeper than {} {}: the skin reinforcement of {} is not checked",
            show(p.basis.skin_depth()),
            names.length,
            p.basis.cite(Clause::SkinReinforcement)
        ));
    }
    let out = CrackControl {
        x,
        moment: moment * p.cv.km,
        force: force * p.cv.kf,
        y_force: yp,
        depth: p.top - y,
        layer,
        y_strand: s.y,
        cover,
        dfps,
        dfps_max,
        dfps_free,
        top,
        spacing_max,
        spacing,
        ok,
        open: (!open.is_empty()).then(|| open.join("; ")),
    };
    record(p, &out, tr);
    Ok(out)
}

fn record(p: &Prepared, c: &CrackControl, tr: &mut Trace) {
    let names = p.sys.names();
    let basis = p.basis;
    let at = format!("x = {} {}", show(c.x), names.length);
    tr.rec(|| {
        Step::new("stresses", "stresses.cracked.na", "Neutral axis of the cracked section, class C", sy("c_(\"cr\")", "c_cr"))
            .input(sy("M_s", "Ms"), c.moment, Unit::Moment)
            .input(sy("P_(\"dc\")", "Pdc"), c.force, Unit::Force)
            .input(sy("y_P", "yP"), c.y_force, Unit::Length)
            .result(c.depth, Unit::Length)
            .clause(basis.cite(Clause::ClassCStresses))
            .note(format!(
                "depth below the top at {at}, where the service tension is largest; the decompression method: the effective prestress force (fdc taken as fse, as 24.3.2 permits) as a compression at the strand's centroid, height yP, with the service moment Ms on the cracked transformed section (concrete in compression only, the topping by its modular ratio, strand and bars by Es / Ec), all of Ms on the {} section; from memory",
                if p.m.topping.is_some() { "composite" } else { "precast" }
            ))
    });
    tr.rec(|| {
        Step::new("stresses", "stresses.cracked.dfps", "Strand stress change beyond decompression, class C", sy("Delta f_(\"ps\")", "Δfps"))
            .input(sy("c_(\"cr\")", "c_cr"), c.depth, Unit::Length)
            .input(sy("y_s", "ys"), c.y_strand, Unit::Length)
            .result(c.dfps, Unit::Stress)
            .clause(basis.cite(Clause::CrackControl))
            .note(format!(
                "layer {} (closest to the tension face, height ys){}; limit {} {}: {}; at or below {} {} the spacing is not limited; the top of the section at {} {} on the cracked section",
                c.layer,
                if c.dfps < 0.0 { ", negative: the strand stays below its decompression stress" } else { "" },
                show(c.dfps_max),
                names.stress,
                if c.dfps <= c.dfps_max * (1.0 + 1e-9) { "within it" } else { "EXCEEDED" },
                show(c.dfps_free),
                names.stress,
                show(c.top),
                names.stress
            ))
    });
    if let Some(smax) = c.spacing_max {
        tr.rec(|| {
            let against = match c.spacing {
                _ if smax <= 0.0 => format!(
                    "; at or below 0 at this cover: no spacing meets it, so the crack control is NOT MET whatever the spacing (reduce the clear cover of layer {} or its Δfps)",
                    c.layer
                ),
                Some(s) => format!(
                    "; the input's spacing {} {}: {}",
                    show(s),
                    names.length,
                    if s <= smax * (1.0 + 1e-9) { "within it" } else { "EXCEEDED" }
                ),
                None => "; the input gives no spacing: left to the engineer".into(),
            };
            Step::new(
                "stresses",
                "stresses.cracked.s",
                "Largest spacing of the reinforcement at the tension face",
                sy("s_(\"max\")", "s_max"),
            )
            .input(sy("Delta f_(\"ps\")", "Δfps"), c.dfps, Unit::Stress)
            .input(sy("c_c", "cc"), c.cover, Unit::Length)
            .result(smax, Unit::Length)
            .clause(basis.cite(Clause::CrackControl))
            .note(format!(
                "{}; cc the clear cover of layer {}; from memory{against}",
                basis.crack_spacing_text(),
                c.layer
            ))
        });
    }
}
