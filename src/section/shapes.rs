//! Builders for the shapes a package may name. Each builds a [`Region`] with its bottom
//! at y = 0 and its axis of symmetry at x = 0 (a polygon keeps the user's coordinates).

use super::{P, Region};
use serde::Serialize;

/// The shape of a precast section, with its dimensions (package length unit).
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "shape", rename_all = "snake_case")]
pub enum Shape {
    Rectangle {
        width: f64,
        height: f64,
    },
    Tee {
        flange_width: f64,
        flange_thickness: f64,
        web_width: f64,
        height: f64,
    },
    InvertedTee {
        web_width: f64,
        height: f64,
        /// Projection of each ledge beyond the web face.
        ledge_width: f64,
        ledge_height: f64,
        /// 2 for an inverted tee, 1 for an L-beam (ledge on the right).
        ledges: u32,
    },
    DoubleTee {
        flange_width: f64,
        flange_thickness: f64,
        height: f64,
        /// Centre-to-centre spacing of the two stems.
        stem_spacing: f64,
        stem_width_top: f64,
        stem_width_bottom: f64,
    },
    IGirder {
        height: f64,
        top_flange_width: f64,
        top_flange_thickness: f64,
        /// Height of the linear taper from the top flange into the web.
        top_taper: f64,
        web_width: f64,
        bottom_flange_width: f64,
        bottom_flange_thickness: f64,
        bottom_taper: f64,
    },
    HollowCore {
        width: f64,
        height: f64,
        void_count: u32,
        void_diameter: f64,
        /// Height of the void centres above the bottom.
        void_center_height: f64,
    },
    Polygon {
        outline: Vec<P>,
        holes: Vec<Vec<P>>,
    },
}

/// A dimension that does not fit the shape: the key, its value and what is allowed.
#[derive(Debug, Clone, PartialEq)]
pub struct ShapeError {
    pub key: &'static str,
    pub value: f64,
    pub allowed: String,
}

fn need(ok: bool, key: &'static str, value: f64, allowed: impl FnOnce() -> String) -> Result<(), ShapeError> {
    if ok { Ok(()) } else { Err(ShapeError { key, value, allowed: allowed() }) }
}

/// The top flange of a flanged shape, for the code's approximate method.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Flange {
    /// Width of the compression face.
    pub b: f64,
    /// Flange thickness.
    pub hf: f64,
    /// Width of the web (both stems of a double tee) just below the flange.
    pub bw: f64,
}

/// Sides of the polygon that stands for a round void.
pub const VOID_SIDES: usize = 64;

/// A circle as a regular polygon of [`VOID_SIDES`] sides with the circle's area (its
/// circumradius is enlarged by sqrt(2π / (n sin(2π/n))), 1.0008 for 64 sides).
pub fn circle(cx: f64, cy: f64, d: f64) -> Vec<P> {
    // the unit polygon (area pi), computed once
    static UNIT: std::sync::LazyLock<Vec<P>> = std::sync::LazyLock::new(|| {
        let t = 2.0 * std::f64::consts::PI / VOID_SIDES as f64;
        let r = (t / t.sin()).sqrt();
        (0..VOID_SIDES)
            .map(|k| {
                let a = std::f64::consts::FRAC_PI_2 + t * k as f64;
                [r * a.cos(), r * a.sin()]
            })
            .collect()
    });
    let r = d / 2.0;
    UNIT.iter().map(|p| [cx + r * p[0], cy + r * p[1]]).collect()
}

impl Shape {
    pub fn name(&self) -> &'static str {
        match self {
            Shape::Rectangle { .. } => "rectangle",
            Shape::Tee { .. } => "tee",
            Shape::InvertedTee { ledges: 1, .. } => "L-beam",
            Shape::InvertedTee { .. } => "inverted tee",
            Shape::DoubleTee { .. } => "double tee",
            Shape::IGirder { .. } => "I-girder",
            Shape::HollowCore { .. } => "hollow-core plank",
            Shape::Polygon { .. } => "polygon",
        }
    }

    /// Whether the member is a one-way slab for the code's minimum-reinforcement
    /// clause (7.6.2) rather than a beam (9.6.2).
    pub fn is_slab(&self) -> bool {
        matches!(self, Shape::HollowCore { .. })
    }

    /// Where a compression block reaching `depth` below the top of the precast unit ends.
    pub fn zone(&self, depth: f64) -> &'static str {
        match *self {
            Shape::Tee { flange_thickness: hf, .. } | Shape::DoubleTee { flange_thickness: hf, .. } => {
                if depth <= hf {
                    "flange"
                } else {
                    "web"
                }
            }
            Shape::IGirder { top_flange_thickness: hf, top_taper, .. } => {
                if depth <= hf {
                    "top flange"
                } else if depth <= hf + top_taper {
                    "top flange taper"
                } else {
                    "web"
                }
            }
            Shape::InvertedTee { height, ledge_height, .. } => {
                if depth <= height - ledge_height {
                    "stem"
                } else {
                    "ledge"
                }
            }
            Shape::HollowCore { height, void_diameter, void_center_height, .. } => {
                if depth <= height - void_center_height - void_diameter / 2.0 { "top flange" } else { "void region" }
            }
            Shape::Rectangle { .. } => "rectangular section",
            Shape::Polygon { .. } => "section",
        }
    }

    /// The top flange, where the shape has one.
    pub fn flange(&self) -> Option<Flange> {
        match *self {
            Shape::Tee { flange_width, flange_thickness, web_width, .. } => {
                Some(Flange { b: flange_width, hf: flange_thickness, bw: web_width })
            }
            Shape::DoubleTee { flange_width, flange_thickness, stem_width_top, .. } => {
                Some(Flange { b: flange_width, hf: flange_thickness, bw: 2.0 * stem_width_top })
            }
            Shape::IGirder { top_flange_width, top_flange_thickness, web_width, .. } => {
                Some(Flange { b: top_flange_width, hf: top_flange_thickness, bw: web_width })
            }
            _ => None,
        }
    }

    /// Builds the region, checking that the dimensions fit together.
    pub fn build(&self) -> Result<Region, ShapeError> {
        match *self {
            Shape::Rectangle { width: w, height: h } => {
                let x = w / 2.0;
                Ok(Region::new(vec![[-x, 0.0], [x, 0.0], [x, h], [-x, h]], vec![]))
            }
            Shape::Tee { flange_width: bf, flange_thickness: hf, web_width: bw, height: h } => {
                need(hf < h, "flange_thickness", hf, || format!("less than height {h}"))?;
                need(bw < bf, "web_width", bw, || format!("less than flange_width {bf}"))?;
                let (f, w, y) = (bf / 2.0, bw / 2.0, h - hf);
                Ok(Region::new(vec![[-w, 0.0], [w, 0.0], [w, y], [f, y], [f, h], [-f, h], [-f, y], [-w, y]], vec![]))
            }
            Shape::InvertedTee { web_width: bw, height: h, ledge_width: bl, ledge_height: hl, ledges } => {
                inverted_tee(bw, h, bl, hl, ledges)
            }
            Shape::DoubleTee {
                flange_width: bf,
                flange_thickness: hf,
                height: h,
                stem_spacing: s,
                stem_width_top: wt,
                stem_width_bottom: wb,
            } => double_tee(bf, hf, h, s, (wt, wb)),
            Shape::IGirder {
                height: h,
                top_flange_width: bt,
                top_flange_thickness: tt,
                top_taper: ht,
                web_width: bw,
                bottom_flange_width: bb,
                bottom_flange_thickness: tb,
                bottom_taper: hb,
            } => i_girder(h, (bt, tt, ht), bw, (bb, tb, hb)),
            Shape::HollowCore { width: w, height: h, void_count: n, void_diameter: d, void_center_height: yc } => {
                hollow_core(w, h, n, d, yc)
            }
            Shape::Polygon { ref outline, ref holes } => Ok(Region::new(outline.clone(), holes.clone())),
        }
    }
}

/// An inverted tee (two ledges) or an L-beam (one, on the right).
fn inverted_tee(bw: f64, h: f64, bl: f64, hl: f64, ledges: u32) -> Result<Region, ShapeError> {
    need(hl < h, "ledge_height", hl, || format!("less than height {h}"))?;
    need(ledges == 1 || ledges == 2, "ledges", ledges as f64, || "1 (L-beam) or 2".into())?;
    let w = bw / 2.0;
    let right = w + bl;
    let left = if ledges == 2 { -w - bl } else { -w };
    let mut pts = vec![[left, 0.0], [right, 0.0], [right, hl], [w, hl], [w, h], [-w, h]];
    if ledges == 2 {
        pts.push([-w, hl]);
        pts.push([left, hl]);
    }
    Ok(Region::new(pts, vec![]))
}

/// A double tee: a flange over two tapered stems, `s` apart centre to centre.
fn double_tee(bf: f64, hf: f64, h: f64, s: f64, (wt, wb): (f64, f64)) -> Result<Region, ShapeError> {
    need(hf < h, "flange_thickness", hf, || format!("less than height {h}"))?;
    need(wt > 0.0 && wb > 0.0, "stem_width_bottom", wb, || "greater than 0".into())?;
    need(s > wt.max(wb), "stem_spacing", s, || {
        format!("greater than the stem width {} so the stems do not overlap", wt.max(wb))
    })?;
    need(s + wt.max(wb) <= bf, "stem_spacing", s, || {
        format!("at most flange_width - stem width = {} so the stems lie under the flange", bf - wt.max(wb))
    })?;
    let (f, y, c) = (bf / 2.0, h - hf, s / 2.0);
    let (t, b) = (wt / 2.0, wb / 2.0);
    Ok(Region::new(
        vec![
            [-c - b, 0.0],
            [-c + b, 0.0],
            [-c + t, y],
            [c - t, y],
            [c - b, 0.0],
            [c + b, 0.0],
            [c + t, y],
            [f, y],
            [f, h],
            [-f, h],
            [-f, y],
            [-c - t, y],
        ],
        vec![],
    ))
}

/// An I-girder: top and bottom flanges with their tapers, and the web between.
fn i_girder(
    h: f64,
    (bt, tt, ht): (f64, f64, f64),
    bw: f64,
    (bb, tb, hb): (f64, f64, f64),
) -> Result<Region, ShapeError> {
    need(tt + ht + tb + hb < h, "height", h, || {
        format!("greater than the flanges and tapers together ({})", tt + ht + tb + hb)
    })?;
    need(bw <= bt, "web_width", bw, || format!("at most top_flange_width {bt}"))?;
    need(bw <= bb, "web_width", bw, || format!("at most bottom_flange_width {bb}"))?;
    let (w, t, b) = (bw / 2.0, bt / 2.0, bb / 2.0);
    let mut pts = vec![[-b, 0.0], [b, 0.0], [b, tb]];
    if hb > 0.0 && b > w {
        pts.push([w, tb + hb]);
    } else {
        pts.push([w, tb]);
    }
    if ht > 0.0 && t > w {
        pts.push([w, h - tt - ht]);
    } else {
        pts.push([w, h - tt]);
    }
    pts.extend([[t, h - tt], [t, h], [-t, h], [-t, h - tt]]);
    if ht > 0.0 && t > w {
        pts.push([-w, h - tt - ht]);
    } else {
        pts.push([-w, h - tt]);
    }
    if hb > 0.0 && b > w {
        pts.push([-w, tb + hb]);
    } else {
        pts.push([-w, tb]);
    }
    pts.push([-b, tb]);
    dedup(&mut pts);
    Ok(Region::new(pts, vec![]))
}

/// A hollow-core plank: a rectangle with `n` round voids at even pitch.
fn hollow_core(w: f64, h: f64, n: u32, d: f64, yc: f64) -> Result<Region, ShapeError> {
    need(n >= 1, "void_count", n as f64, || "at least 1".into())?;
    let pitch = w / n as f64;
    need(d < pitch, "void_diameter", d, || format!("less than the void pitch width / void_count = {pitch}"))?;
    need(yc - d / 2.0 > 0.0, "void_center_height", yc, || {
        format!("more than void_diameter / 2 = {} (the void must stay above the bottom)", d / 2.0)
    })?;
    need(yc + d / 2.0 < h, "void_center_height", yc, || {
        format!("less than height - void_diameter / 2 = {} (the void must stay below the top)", h - d / 2.0)
    })?;
    let x = w / 2.0;
    let holes = (0..n).map(|k| circle(-x + pitch * (k as f64 + 0.5), yc, d)).collect();
    Ok(Region::new(vec![[-x, 0.0], [x, 0.0], [x, h], [-x, h]], holes))
}

fn dedup(pts: &mut Vec<P>) {
    pts.dedup();
    while pts.len() > 1 && pts.first() == pts.last() {
        pts.pop();
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tee_area() {
        let s = Shape::Tee { flange_width: 48.0, flange_thickness: 4.0, web_width: 8.0, height: 28.0 };
        let r = s.build().unwrap();
        assert!((r.props().area - (48.0 * 4.0 + 8.0 * 24.0)).abs() < 1e-9);
    }

    #[test]
    fn void_polygon_keeps_circle_area() {
        let c = crate::section::Region::new(circle(0.0, 0.0, 6.0), vec![]);
        let exact = std::f64::consts::PI * 9.0;
        assert!((c.props().area - exact).abs() / exact < 1e-12);
    }

    #[test]
    fn double_tee_area() {
        let s = Shape::DoubleTee {
            flange_width: 120.0,
            flange_thickness: 2.0,
            height: 24.0,
            stem_spacing: 60.0,
            stem_width_top: 7.75,
            stem_width_bottom: 5.75,
        };
        let r = s.build().unwrap();
        let stems = 2.0 * 22.0 * (7.75 + 5.75) / 2.0;
        assert!((r.props().area - (240.0 + stems)).abs() < 1e-9);
    }
}
