//! Cross-section geometry: polygons with holes, exact properties, and exact clipping at
//! a horizontal line (the compression zone above a depth is clipped, never sampled).
//!
//! Coordinates are `[x, y]` with y upward (drawing convention), in the package's length
//! unit. Outlines are stored counter-clockwise and holes clockwise, so that every sum
//! over rings is simply additive.

pub mod shapes;

use serde::Serialize;

pub type P = [f64; 2];

/// Running sums of Green's-theorem integrals over a closed chain of points.
#[derive(Clone, Copy, Default, Debug)]
struct Acc {
    first: Option<P>,
    prev: Option<P>,
    /// 2 A
    a2: f64,
    /// 6 ∫ y dA
    qx6: f64,
    /// 6 ∫ x dA
    qy6: f64,
    /// 12 ∫ y² dA
    ix12: f64,
}

impl Acc {
    #[inline]
    fn term(&mut self, p: P, q: P) {
        let cross = p[0] * q[1] - q[0] * p[1];
        self.a2 += cross;
        self.qx6 += (p[1] + q[1]) * cross;
        self.qy6 += (p[0] + q[0]) * cross;
        self.ix12 += (p[1] * p[1] + p[1] * q[1] + q[1] * q[1]) * cross;
    }
    #[inline]
    fn push(&mut self, p: P) {
        match self.prev {
            Some(prev) => self.term(prev, p),
            None => self.first = Some(p),
        }
        self.prev = Some(p);
    }
    #[inline]
    fn close(mut self) -> Moments {
        if let (Some(first), Some(prev)) = (self.first, self.prev) {
            self.term(prev, first);
        }
        Moments { area: self.a2 / 2.0, qx: self.qx6 / 6.0, qy: self.qy6 / 6.0, ix: self.ix12 / 12.0 }
    }
}

/// Area integrals of a region (signed by ring orientation).
#[derive(Clone, Copy, Default, Debug, PartialEq)]
pub struct Moments {
    /// ∫ dA
    pub area: f64,
    /// ∫ y dA
    pub qx: f64,
    /// ∫ x dA
    pub qy: f64,
    /// ∫ y² dA
    pub ix: f64,
}

impl std::ops::Add for Moments {
    type Output = Moments;
    fn add(self, o: Moments) -> Moments {
        Moments { area: self.area + o.area, qx: self.qx + o.qx, qy: self.qy + o.qy, ix: self.ix + o.ix }
    }
}

impl std::ops::Sub for Moments {
    type Output = Moments;
    fn sub(self, o: Moments) -> Moments {
        Moments { area: self.area - o.area, qx: self.qx - o.qx, qy: self.qy - o.qy, ix: self.ix - o.ix }
    }
}

impl Moments {
    /// The moments scaled by a factor (a modular ratio, for transformed sections).
    pub fn scaled(self, k: f64) -> Moments {
        Moments { area: self.area * k, qx: self.qx * k, qy: self.qy * k, ix: self.ix * k }
    }
}

fn signed_area(ring: &[P]) -> f64 {
    let mut acc = Acc::default();
    for &p in ring {
        acc.push(p);
    }
    acc.close().area
}

#[inline]
/// The x where each edge of a ring crosses the horizontal line y, appended to `xs`.
fn crossings(ring: &[P], y: f64, xs: &mut Vec<f64>) {
    let Some(&last) = ring.last() else { return };
    let mut p = last;
    for &q in ring {
        if (p[1] <= y) != (q[1] <= y) {
            xs.push(cut(p, q, y)[0]);
        }
        p = q;
    }
}

fn cut(p: P, q: P, y0: f64) -> P {
    let t = (y0 - p[1]) / (q[1] - p[1]);
    [p[0] + t * (q[0] - p[0]), y0]
}

/// Sutherland-Hodgman against the half-plane y >= y0, streamed into an accumulator or a
/// point list. Against a single half-plane the result is exact for any simple ring: the
/// extra edges it may add lie on the cut line and are traversed both ways, so they cancel.
fn clip_ring(ring: &[P], y0: f64, mut emit: impl FnMut(P)) {
    let n = ring.len();
    for i in 0..n {
        let p = ring[i];
        let q = ring[(i + 1) % n];
        let pin = p[1] >= y0;
        let qin = q[1] >= y0;
        if qin {
            if !pin {
                emit(cut(p, q, y0));
            }
            emit(q);
        } else if pin {
            emit(cut(p, q, y0));
        }
    }
}

fn ring_moments(ring: &[P]) -> Moments {
    let mut acc = Acc::default();
    for &p in ring {
        acc.push(p);
    }
    acc.close()
}

fn ring_above(ring: &[P], y0: f64) -> Moments {
    let mut acc = Acc::default();
    clip_ring(ring, y0, |p| acc.push(p));
    acc.close()
}

/// A polygon with holes. Build it with [`Region::new`], which also caches each ring's
/// height range and moments (so clipping skips rings wholly above or below the cut).
#[derive(Clone, Debug, Serialize, PartialEq)]
pub struct Region {
    pub outline: Vec<P>,
    pub holes: Vec<Vec<P>>,
    #[serde(skip)]
    cache: Vec<RingInfo>,
}

#[derive(Clone, Copy, Debug, PartialEq)]
struct RingInfo {
    y_min: f64,
    y_max: f64,
    full: Moments,
}

impl RingInfo {
    fn of(ring: &[P]) -> RingInfo {
        let (y_min, y_max) =
            ring.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), p| (lo.min(p[1]), hi.max(p[1])));
        RingInfo { y_min, y_max, full: ring_moments(ring) }
    }
}

/// Properties of a region about its own centroid.
#[derive(Clone, Copy, Debug, Serialize, PartialEq)]
pub struct Props {
    pub area: f64,
    /// Centroid.
    pub xc: f64,
    pub yc: f64,
    /// Second moment about the horizontal centroidal axis.
    pub i: f64,
    pub y_top: f64,
    pub y_bot: f64,
}

impl Props {
    pub fn from_moments(m: Moments, y_top: f64, y_bot: f64) -> Props {
        let yc = m.qx / m.area;
        Props { area: m.area, xc: m.qy / m.area, yc, i: m.ix - m.area * yc * yc, y_top, y_bot }
    }
    /// Distance from the centroid to the top fibre.
    pub fn ct(&self) -> f64 {
        self.y_top - self.yc
    }
    /// Distance from the centroid to the bottom fibre.
    pub fn cb(&self) -> f64 {
        self.yc - self.y_bot
    }
    pub fn st(&self) -> f64 {
        self.i / self.ct()
    }
    pub fn sb(&self) -> f64 {
        self.i / self.cb()
    }
}

impl Region {
    /// A region from rings in any orientation: the outline is made counter-clockwise and
    /// the holes clockwise.
    pub fn new(mut outline: Vec<P>, mut holes: Vec<Vec<P>>) -> Region {
        if signed_area(&outline) < 0.0 {
            outline.reverse();
        }
        for h in &mut holes {
            if signed_area(h) > 0.0 {
                h.reverse();
            }
        }
        let cache =
            std::iter::once(outline.as_slice()).chain(holes.iter().map(|h| h.as_slice())).map(RingInfo::of).collect();
        Region { outline, holes, cache }
    }

    pub fn rings(&self) -> impl Iterator<Item = &[P]> {
        std::iter::once(self.outline.as_slice()).chain(self.holes.iter().map(|h| h.as_slice()))
    }

    pub fn moments(&self) -> Moments {
        self.cache.iter().map(|c| c.full).fold(Moments::default(), |a, b| a + b)
    }

    /// Exact area integrals of the part of the region with y >= y0.
    #[inline]
    pub fn above(&self, y0: f64) -> Moments {
        let mut m = Moments::default();
        for (ring, info) in self.rings().zip(&self.cache) {
            if y0 <= info.y_min {
                m = m + info.full;
            } else if y0 < info.y_max {
                m = m + ring_above(ring, y0);
            }
        }
        m
    }

    /// The rings of the part above y0, for drawing (outline rings, then hole rings).
    pub fn clipped_above(&self, y0: f64) -> (Vec<P>, Vec<Vec<P>>) {
        let mut out = Vec::new();
        clip_ring(&self.outline, y0, |p| out.push(p));
        let holes = self
            .holes
            .iter()
            .map(|h| {
                let mut v = Vec::new();
                clip_ring(h, y0, |p| v.push(p));
                v
            })
            .filter(|v| v.len() >= 3)
            .collect();
        (out, holes)
    }

    pub fn y_top(&self) -> f64 {
        self.cache[0].y_max
    }
    pub fn y_bot(&self) -> f64 {
        self.cache[0].y_min
    }
    pub fn x_min(&self) -> f64 {
        self.outline.iter().map(|p| p[0]).fold(f64::INFINITY, f64::min)
    }
    pub fn x_max(&self) -> f64 {
        self.outline.iter().map(|p| p[0]).fold(f64::NEG_INFINITY, f64::max)
    }

    pub fn props(&self) -> Props {
        Props::from_moments(self.moments(), self.y_top(), self.y_bot())
    }

    /// Total width of concrete cut by the horizontal line y (outline chords less hole
    /// chords).
    pub fn width_at(&self, y: f64) -> f64 {
        fn chords(ring: &[P], y: f64) -> f64 {
            let mut xs: Vec<f64> = Vec::new();
            crossings(ring, y, &mut xs);
            xs.sort_by(f64::total_cmp);
            xs.chunks(2).map(|c| if c.len() == 2 { c[1] - c[0] } else { 0.0 }).sum()
        }
        // a ring that does not span y has no chord there (the test of `crossings`)
        let spans = |info: &RingInfo| y >= info.y_min && y < info.y_max;
        let mut w = if spans(&self.cache[0]) { chords(&self.outline, y) } else { 0.0 };
        for (h, info) in self.holes.iter().zip(&self.cache[1..]) {
            if spans(info) {
                w -= chords(h, y);
            }
        }
        w.max(0.0)
    }

    /// The stretches of concrete [x0, x1] cut by the horizontal line y, left to right.
    pub fn stretches_at(&self, y: f64) -> Vec<(f64, f64)> {
        let mut xs: Vec<f64> = Vec::new();
        for (ring, info) in self.rings().zip(&self.cache) {
            if y >= info.y_min && y < info.y_max {
                crossings(ring, y, &mut xs);
            }
        }
        xs.sort_by(f64::total_cmp);
        xs.chunks(2).filter(|c| c.len() == 2).map(|c| (c[0], c[1])).collect()
    }

    /// Where a bar of diameter `d` centred at height `y` can sit: the x ranges over which
    /// the concrete spans the whole band from y - d/2 to y + d/2. A vertical segment
    /// across the band lies in the concrete if its middle does and it meets no edge of
    /// the outline or a hole: the room is the stretches at y less the x ranges the edges
    /// cover inside the band.
    pub fn room_at(&self, y: f64, d: f64) -> Vec<(f64, f64)> {
        let (lo, hi) = (y - d / 2.0, y + d / 2.0);
        let mut blocked: Vec<(f64, f64)> = Vec::new();
        for (ring, info) in self.rings().zip(&self.cache) {
            if info.y_max <= lo || info.y_min >= hi {
                continue;
            }
            for (i, a) in ring.iter().enumerate() {
                let b = ring[(i + 1) % ring.len()];
                let (y0, y1) = (a[1].min(b[1]), a[1].max(b[1]));
                if y1 <= lo || y0 >= hi {
                    continue;
                }
                // the part of the edge inside the band
                let x_at = |yy: f64| a[0] + (b[0] - a[0]) * (yy - a[1]) / (b[1] - a[1]);
                let (xa, xb) = if y1 > y0 { (x_at(y0.max(lo)), x_at(y1.min(hi))) } else { (a[0], b[0]) };
                blocked.push((xa.min(xb), xa.max(xb)));
            }
        }
        blocked.sort_unstable_by(|p, q| p.0.total_cmp(&q.0));
        let mut room = Vec::new();
        for (s0, s1) in self.stretches_at(y) {
            let mut from = s0;
            for &(b0, b1) in &blocked {
                if b1 <= from || b0 >= s1 {
                    continue;
                }
                if b0 > from {
                    room.push((from, b0));
                }
                from = from.max(b1);
            }
            if s1 > from {
                room.push((from, s1));
            }
        }
        room
    }

    /// The extent [x0, x1] of the outline's top edge (vertices at the top level).
    pub fn top_extent(&self) -> (f64, f64) {
        let top = self.y_top();
        let tol = 1e-9 * (top - self.y_bot()).abs().max(1.0);
        let xs = self.outline.iter().filter(|p| (p[1] - top).abs() <= tol).map(|p| p[0]);
        let (lo, hi) = xs.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), x| (lo.min(x), hi.max(x)));
        (lo, hi)
    }

    /// Whether a point lies strictly inside the concrete (inside the outline, outside
    /// every hole), at least `clear` from every edge.
    pub fn contains(&self, p: P, clear: f64) -> bool {
        if !point_in_ring(&self.outline, p) || self.holes.iter().any(|h| point_in_ring(h, p)) {
            return false;
        }
        self.rings().all(|r| distance_to_ring(r, p) >= clear)
    }
}

/// How many bars of diameter `d` fit side by side in the x ranges of `room` (whole bars
/// in each range; see [`Region::room_at`]).
pub fn side_by_side(room: &[(f64, f64)], d: f64) -> u64 {
    room.iter().map(|(a, b)| ((b - a) / d + 1e-9).floor() as u64).sum()
}

/// The overlaps of two sorted lists of disjoint x ranges.
pub fn intersect(a: &[(f64, f64)], b: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    for &(a0, a1) in a {
        for &(b0, b1) in b {
            let (lo, hi) = (a0.max(b0), a1.min(b1));
            if hi > lo {
                out.push((lo, hi));
            }
        }
    }
    out
}

/// Even-odd point-in-polygon test.
pub fn point_in_ring(ring: &[P], p: P) -> bool {
    let n = ring.len();
    let mut inside = false;
    for i in 0..n {
        let a = ring[i];
        let b = ring[(i + 1) % n];
        if (a[1] > p[1]) != (b[1] > p[1]) {
            let x = a[0] + (p[1] - a[1]) / (b[1] - a[1]) * (b[0] - a[0]);
            if p[0] < x {
                inside = !inside;
            }
        }
    }
    inside
}

fn distance_to_segment(a: P, b: P, p: P) -> f64 {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len2 = dx * dx + dy * dy;
    let t = if len2 > 0.0 { (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2).clamp(0.0, 1.0) } else { 0.0 };
    let (cx, cy) = (a[0] + t * dx - p[0], a[1] + t * dy - p[1]);
    (cx * cx + cy * cy).sqrt()
}

/// Shortest distance from a point to a ring's edges.
pub fn distance_to_ring(ring: &[P], p: P) -> f64 {
    let n = ring.len();
    (0..n).map(|i| distance_to_segment(ring[i], ring[(i + 1) % n], p)).fold(f64::INFINITY, f64::min)
}

fn orient(a: P, b: P, c: P) -> f64 {
    (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
}

fn on_segment(a: P, b: P, p: P) -> bool {
    p[0] >= a[0].min(b[0]) && p[0] <= a[0].max(b[0]) && p[1] >= a[1].min(b[1]) && p[1] <= a[1].max(b[1])
}

/// Whether two closed segments touch or cross.
fn segments_meet(a: P, b: P, c: P, d: P) -> bool {
    let (o1, o2, o3, o4) = (orient(a, b, c), orient(a, b, d), orient(c, d, a), orient(c, d, b));
    if ((o1 > 0.0 && o2 < 0.0) || (o1 < 0.0 && o2 > 0.0)) && ((o3 > 0.0 && o4 < 0.0) || (o3 < 0.0 && o4 > 0.0)) {
        return true;
    }
    (o1 == 0.0 && on_segment(a, b, c))
        || (o2 == 0.0 && on_segment(a, b, d))
        || (o3 == 0.0 && on_segment(c, d, a))
        || (o4 == 0.0 && on_segment(c, d, b))
}

/// What is wrong with a ring, if anything.
#[derive(Debug, Clone, PartialEq)]
pub enum RingFault {
    TooFewPoints(usize),
    NotFinite(usize),
    RepeatedPoint(usize),
    /// Edges `i` and `j` cross or touch.
    SelfIntersecting(usize, usize),
    ZeroArea,
}

impl std::fmt::Display for RingFault {
    fn fmt(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
        match self {
            RingFault::TooFewPoints(n) => write!(f, "has {n} points; a polygon needs at least 3"),
            RingFault::NotFinite(i) => write!(f, "point {} is not a finite number", i + 1),
            RingFault::RepeatedPoint(i) => write!(f, "point {} repeats the point before it", i + 1),
            RingFault::SelfIntersecting(i, j) => {
                write!(f, "is not simple: edge {} crosses or touches edge {}", i + 1, j + 1)
            }
            RingFault::ZeroArea => write!(f, "encloses no area"),
        }
    }
}

/// Checks that a ring is a simple polygon with area.
pub fn check_ring(ring: &[P]) -> Result<(), RingFault> {
    let n = ring.len();
    if n < 3 {
        return Err(RingFault::TooFewPoints(n));
    }
    if let Some(i) = ring.iter().position(|p| !p[0].is_finite() || !p[1].is_finite()) {
        return Err(RingFault::NotFinite(i));
    }
    for i in 0..n {
        if ring[i] == ring[(i + 1) % n] {
            return Err(RingFault::RepeatedPoint((i + 1) % n));
        }
    }
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        for j in i + 1..n {
            // adjacent edges share a vertex; test them only for overlap (collinear fold-back)
            let (c, d) = (ring[j], ring[(j + 1) % n]);
            let adjacent = j == i + 1 || (i == 0 && j == n - 1);
            if adjacent {
                let shared = if j == i + 1 { b } else { a };
                let (other1, other2) = if j == i + 1 { (a, d) } else { (b, c) };
                if orient(shared, other1, other2) == 0.0 {
                    // collinear: a fold-back if the two far ends lie on the same side
                    let dot = (other1[0] - shared[0]) * (other2[0] - shared[0])
                        + (other1[1] - shared[1]) * (other2[1] - shared[1]);
                    if dot > 0.0 {
                        return Err(RingFault::SelfIntersecting(i, j));
                    }
                }
                continue;
            }
            if segments_meet(a, b, c, d) {
                return Err(RingFault::SelfIntersecting(i, j));
            }
        }
    }
    let scale = ring.iter().map(|p| p[0].abs().max(p[1].abs())).fold(0.0, f64::max).max(1e-300);
    if signed_area(ring).abs() <= 1e-12 * scale * scale {
        return Err(RingFault::ZeroArea);
    }
    Ok(())
}

/// Whether two rings' edges meet anywhere (rings whose bounding boxes are apart do
/// not: most pairs of holes are settled by that alone).
pub fn rings_meet(r: &[P], s: &[P]) -> bool {
    let bbox = |ring: &[P]| {
        ring.iter().fold([f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY], |b, p| {
            [b[0].min(p[0]), b[1].min(p[1]), b[2].max(p[0]), b[3].max(p[1])]
        })
    };
    let (a, b) = (bbox(r), bbox(s));
    if a[2] < b[0] || b[2] < a[0] || a[3] < b[1] || b[3] < a[1] {
        return false;
    }
    let (n, m) = (r.len(), s.len());
    (0..n).any(|i| (0..m).any(|j| segments_meet(r[i], r[(i + 1) % n], s[j], s[(j + 1) % m])))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rect(w: f64, h: f64) -> Region {
        Region::new(vec![[0.0, 0.0], [w, 0.0], [w, h], [0.0, h]], vec![])
    }

    /// Whether the vertical segment at x across the band [lo, hi] lies in the concrete,
    /// sampled finely.
    fn column_clear(r: &Region, x: f64, lo: f64, hi: f64) -> bool {
        (0..=100).map(|k| lo + (hi - lo) * k as f64 / 100.0).all(|y| r.contains([x, y], 0.0))
    }

    #[test]
    fn room_for_a_bar_is_the_concrete_across_the_band() {
        // a plank with round voids, a double tee and a skewed polygon with a hole
        let circle = |cx: f64, cy: f64, r: f64| -> Vec<P> {
            (0..48)
                .map(|k| (k as f64) / 48.0 * std::f64::consts::TAU)
                .map(|a| [cx + r * a.cos(), cy + r * a.sin()])
                .collect()
        };
        let plank = Region::new(
            vec![[0.0, 0.0], [48.0, 0.0], [48.0, 8.0], [0.0, 8.0]],
            (0..4).map(|k| circle(6.0 + 12.0 * k as f64, 4.0, 2.6)).collect(),
        );
        let tee = Region::new(
            vec![
                [0.0, 24.0],
                [0.0, 22.0],
                [16.0, 22.0],
                [17.0, 0.0],
                [21.0, 0.0],
                [22.0, 22.0],
                [42.0, 22.0],
                [43.0, 0.0],
                [47.0, 0.0],
                [48.0, 22.0],
                [64.0, 22.0],
                [64.0, 24.0],
            ],
            vec![],
        );
        let odd = Region::new(
            vec![[0.0, 0.0], [10.0, 1.0], [12.0, 9.0], [1.0, 10.0]],
            vec![vec![[4.0, 4.0], [7.0, 4.5], [6.0, 7.0]]],
        );
        for (name, r) in [("plank", &plank), ("tee", &tee), ("odd", &odd)] {
            let (x0, x1) =
                r.outline.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| (a.min(p[0]), b.max(p[0])));
            for k in 0..20 {
                let y = r.y_bot() + (r.y_top() - r.y_bot()) * (k as f64 + 0.3137) / 20.0;
                for d in [0.5, 1.0] {
                    let (lo, hi) = (y - d / 2.0, y + d / 2.0);
                    let room = r.room_at(y, d);
                    // every column of the room is clear, and every clear column is in it
                    // (columns within a hair of a piece's end are not judged)
                    for j in 0..=300 {
                        let x = x0 + (x1 - x0) * (j as f64 + 0.5) / 301.0;
                        let inside = room.iter().any(|&(a, b)| x > a && x < b);
                        let near = room.iter().any(|&(a, b)| (x - a).abs() < 1e-6 || (x - b).abs() < 1e-6);
                        if near {
                            continue;
                        }
                        let clear = column_clear(r, x, lo + 1e-9, hi - 1e-9);
                        assert_eq!(inside, clear, "{name} y {y} d {d} x {x}: room {room:?}");
                    }
                }
            }
        }
    }

    #[test]
    fn rectangle_properties() {
        let p = rect(12.0, 24.0).props();
        assert!((p.area - 288.0).abs() < 1e-9);
        assert!((p.yc - 12.0).abs() < 1e-12);
        assert!((p.i - 12.0 * 24f64.powi(3) / 12.0).abs() < 1e-6);
    }

    #[test]
    fn clipping_is_exact_for_concave_rings() {
        // a U shape: clipping below the notch bottom gives two separate pieces
        let u = Region::new(
            vec![[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [7.0, 10.0], [7.0, 3.0], [3.0, 3.0], [3.0, 10.0], [0.0, 10.0]],
            vec![],
        );
        let m = u.above(5.0);
        assert!((m.area - 2.0 * 3.0 * 5.0).abs() < 1e-9);
        assert!((m.qx / m.area - 7.5).abs() < 1e-9);
    }

    #[test]
    fn holes_subtract() {
        let r = Region::new(
            vec![[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [0.0, 10.0]],
            vec![vec![[2.0, 2.0], [4.0, 2.0], [4.0, 4.0], [2.0, 4.0]]],
        );
        assert!((r.moments().area - 96.0).abs() < 1e-12);
        assert!((r.above(3.0).area - (70.0 - 2.0)).abs() < 1e-12);
        assert!((r.width_at(3.0) - 8.0).abs() < 1e-12);
    }

    #[test]
    fn detects_bad_rings() {
        assert_eq!(check_ring(&[[0.0, 0.0], [1.0, 1.0]]), Err(RingFault::TooFewPoints(2)));
        let bow = [[0.0, 0.0], [1.0, 1.0], [1.0, 0.0], [0.0, 1.0]];
        assert!(matches!(check_ring(&bow), Err(RingFault::SelfIntersecting(..))));
        assert!(check_ring(&[[0.0, 0.0], [1.0, 0.0], [2.0, 0.0]]).is_err());
    }
}
