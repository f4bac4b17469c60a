//! The section: a built-in shape's dimensions and their fit, or a polygon's outline and
//! holes (simple, apart, within the limits).

use super::*;

pub(super) fn shape(cx: &mut Ctx, s: &raw::Section) -> Option<Shape> {
    use raw::Section as S;
    let sh = match s {
        S::Rectangle { width, height } => {
            let n = "rectangle";
            Shape::Rectangle { width: cx.dim(n, "width", width)?, height: cx.dim(n, "height", height)? }
        }
        S::Tee { flange_width, flange_thickness, web_width, height } => {
            let n = "tee";
            Shape::Tee {
                flange_width: cx.dim(n, "flange_width", flange_width)?,
                flange_thickness: cx.dim(n, "flange_thickness", flange_thickness)?,
                web_width: cx.dim(n, "web_width", web_width)?,
                height: cx.dim(n, "height", height)?,
            }
        }
        S::InvertedTee { web_width, height, ledge_width, ledge_height, ledges } => {
            let n = "inverted_tee";
            Shape::InvertedTee {
                web_width: cx.dim(n, "web_width", web_width)?,
                height: cx.dim(n, "height", height)?,
                ledge_width: cx.dim(n, "ledge_width", ledge_width)?,
                ledge_height: cx.dim(n, "ledge_height", ledge_height)?,
                ledges: match ledges {
                    None => 2,
                    Some(_) => cx.count("ledges", *ledges, 1, 2)?,
                },
            }
        }
        S::DoubleTee { flange_width, flange_thickness, height, stem_spacing, stem_width_top, stem_width_bottom } => {
            let n = "double_tee";
            Shape::DoubleTee {
                flange_width: cx.dim(n, "flange_width", flange_width)?,
                flange_thickness: cx.dim(n, "flange_thickness", flange_thickness)?,
                height: cx.dim(n, "height", height)?,
                stem_spacing: cx.dim(n, "stem_spacing", stem_spacing)?,
                stem_width_top: cx.dim(n, "stem_width_top", stem_width_top)?,
                stem_width_bottom: cx.dim(n, "stem_width_bottom", stem_width_bottom)?,
            }
        }
        S::IGirder {
            height,
            top_flange_width,
            top_flange_thickness,
            top_taper,
            web_width,
            bottom_flange_width,
            bottom_flange_thickness,
            bottom_taper,
        } => {
            let n = "i_girder";
            let max = ranges(cx.sys).dim_max;
            let taper = |cx: &mut Ctx, key, q: &Option<Q>| match q {
                Some(_) => cx.ranged(key, q, Dim::Length, 0.0, max, false),
                None => Some(0.0),
            };
            Shape::IGirder {
                height: cx.dim(n, "height", height)?,
                top_flange_width: cx.dim(n, "top_flange_width", top_flange_width)?,
                top_flange_thickness: cx.dim(n, "top_flange_thickness", top_flange_thickness)?,
                top_taper: taper(cx, "top_taper", top_taper)?,
                web_width: cx.dim(n, "web_width", web_width)?,
                bottom_flange_width: cx.dim(n, "bottom_flange_width", bottom_flange_width)?,
                bottom_flange_thickness: cx.dim(n, "bottom_flange_thickness", bottom_flange_thickness)?,
                bottom_taper: taper(cx, "bottom_taper", bottom_taper)?,
            }
        }
        S::HollowCore { width, height, void_count, void_diameter, void_center_height } => {
            let n = "hollow_core";
            let count = cx.required("void_count", *void_count, "the number of voids (shape \"hollow_core\" needs it)");
            let sh = Shape::HollowCore {
                width: cx.dim(n, "width", width)?,
                height: cx.dim(n, "height", height)?,
                void_count: cx.count("void_count", Some(count?), 1, 40)?,
                void_diameter: cx.dim(n, "void_diameter", void_diameter)?,
                void_center_height: cx.dim(n, "void_center_height", void_center_height)?,
            };
            hollow_core_fits(cx, &sh)?;
            sh
        }
        S::Polygon { outline, holes } => polygon(cx, outline.as_deref(), holes.as_deref())?,
    };
    Some(sh)
}

/// The voids of a hollow-core plank as drawn (polygons of [`VOID_SIDES`] sides with the
/// circle's area, whose corners reach a little beyond the circle) leave a plausible web
/// between voids and concrete above and below them: at least 0.75 in (19 mm), and the
/// edge webs (half a web, as the voids are spaced evenly) at least 0.375 in (9.5 mm).
fn hollow_core_fits(cx: &mut Ctx, sh: &Shape) -> Option<()> {
    let Shape::HollowCore { width, height, void_count, void_diameter: d, void_center_height: yc } = *sh else {
        return Some(());
    };
    let min = match cx.sys {
        System::Us => 0.75,
        System::Si => 19.0,
    };
    let t = std::f64::consts::TAU / VOID_SIDES as f64;
    let r = d / 2.0 * (t / t.sin()).sqrt();
    let pitch = width / void_count as f64;
    let len = cx.sys.names().length;
    let checks = [
        ("void_diameter", d, pitch - 2.0 * r, min, "the web between two voids"),
        ("void_diameter", d, pitch / 2.0 - r, min / 2.0, "the web at each edge of the plank"),
        ("void_center_height", yc, height - yc - r, min, "the concrete above the voids"),
        ("void_center_height", yc, yc - r, min, "the concrete below the voids"),
    ];
    for (key, value, left, need, what) in checks {
        if left < need {
            cx.problem(
                key,
                format!(
                    "{key} = {} {len} leaves {what} {} {len} thick as drawn (each void a {VOID_SIDES}-sided polygon of the circle's area, reaching {} {len} from its centre)",
                    num(value),
                    crate::trace::show(left),
                    crate::trace::show(r)
                ),
                Some(format!("voids that leave at least {} {len} there", num(need))),
            );
            return None;
        }
    }
    Some(())
}

pub(crate) const SHAPES: &str =
    "\"rectangle\", \"tee\", \"inverted_tee\", \"double_tee\", \"i_girder\", \"hollow_core\" or \"polygon\"";

fn ring(cx: &mut Ctx, key: &'static str, pts: &[Vec<f64>], hole: Option<usize>) -> Option<Vec<P>> {
    let what = match hole {
        Some(h) => format!("hole {}", h + 1),
        None => "the outline".to_string(),
    };
    if pts.len() > limits::VERTICES {
        cx.problem(
            key,
            format!("{what} has {} points", pts.len()),
            Some(format!("at most {} points", limits::VERTICES)),
        );
        return None;
    }
    let max = ranges(cx.sys).dim_max;
    let mut out = Vec::with_capacity(pts.len());
    for (i, p) in pts.iter().enumerate() {
        if p.len() != 2 {
            cx.problem(
                key,
                format!("point {} of {what} has {} numbers", i + 1, p.len()),
                Some("[x, y] pairs".to_string()),
            );
            return None;
        }
        if !p.iter().all(|v| v.is_finite() && v.abs() <= max) {
            cx.problem(
                key,
                format!("point {} of {what} is [{}, {}]", i + 1, num(p[0]), num(p[1])),
                Some(format!("finite coordinates within ±{} {}", max, cx.sys.names().length)),
            );
            return None;
        }
        out.push([p[0], p[1]]);
    }
    if let Err(fault) = section::check_ring(&out) {
        cx.problem(
            key,
            format!("{what} {fault}"),
            Some("a simple polygon (no crossing or touching edges) with area".to_string()),
        );
        return None;
    }
    Some(out)
}

fn polygon(cx: &mut Ctx, outline: Option<&[Vec<f64>]>, holes: Option<&[Vec<Vec<f64>>]>) -> Option<Shape> {
    let outline = ring(cx, "outline", outline.unwrap_or(&[]), None)?;
    let raw_holes = holes.unwrap_or(&[]);
    if raw_holes.len() > limits::HOLES {
        cx.problem("holes", format!("there are {} holes", raw_holes.len()), Some(format!("at most {}", limits::HOLES)));
        return None;
    }
    let total = outline.len() + raw_holes.iter().map(|h| h.len()).sum::<usize>();
    if total > limits::SECTION_POINTS {
        cx.problem(
            "holes",
            format!("the outline and holes have {total} points together"),
            Some(format!("at most {} points in all (a hole's curve needs a few dozen)", limits::SECTION_POINTS)),
        );
        return None;
    }
    let mut holes: Vec<Vec<P>> = Vec::new();
    for (h, pts) in raw_holes.iter().enumerate() {
        let r = ring(cx, "holes", pts, Some(h))?;
        let inside = r.iter().all(|p| section::point_in_ring(&outline, *p)) && !section::rings_meet(&r, &outline);
        if !inside {
            cx.problem(
                "holes",
                format!("hole {} is not inside the outline", h + 1),
                Some("holes wholly inside the outline, not touching it".to_string()),
            );
            return None;
        }
        for (k, other) in holes.iter().enumerate() {
            if section::rings_meet(&r, other)
                || section::point_in_ring(other, r[0])
                || section::point_in_ring(&r, other[0])
            {
                cx.problem(
                    "holes",
                    format!("hole {} overlaps hole {}", h + 1, k + 1),
                    Some("holes that do not overlap or touch".to_string()),
                );
                return None;
            }
        }
        holes.push(r);
    }
    Some(Shape::Polygon { outline, holes })
}
