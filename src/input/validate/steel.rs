//! The steel of a member: strand layers (level, profile, grade, model, prestress,
//! debonding) and bar layers, each placed inside the concrete with room to fit.

use super::*;

/// One of several mutually exclusive ways to give a value.
fn exclusive(cx: &mut Ctx, given: &[(&'static str, bool)], what: &str) -> Option<&'static str> {
    let set: Vec<&'static str> = given.iter().filter(|(_, g)| *g).map(|(k, _)| *k).collect();
    match set.len() {
        1 => Some(set[0]),
        0 => {
            let names: Vec<&str> = given.iter().map(|(k, _)| *k).collect();
            cx.problem("", format!("{what} is missing"), Some(format!("one of {}", names.join(", "))));
            None
        }
        _ => {
            cx.problem(
                set[1],
                format!("{} and {} are both given", set[0], set[1]),
                Some(format!("only one of them: {what}")),
            );
            None
        }
    }
}

/// Checks that steel of a diameter at a depth below the top of the precast fits inside
/// the concrete: inside the outline, clear of voids and edges, with room for `count`
/// bars side by side.
fn check_inside(cx: &mut Ctx, key: &'static str, region: &Region, depth: f64, count: u32, d: f64) -> bool {
    let top = region.y_top();
    let h = top - region.y_bot();
    let len = cx.sys.names().length;
    // the level as the user wrote it: a height from the bottom or a depth from the top
    let by_height = key.starts_with("height");
    let written = if by_height { h - depth } else { depth };
    if depth - d / 2.0 <= 0.0 || depth + d / 2.0 >= h {
        cx.problem(
            key,
            format!(
                "{key} = {} {len} puts the steel (diameter {} {len}) outside the concrete of the precast unit, which is {} {len} deep",
                num(written),
                num(d),
                num(h)
            ),
            Some(format!(
                "a {} between {} and {} {len} ({} from the {} of the precast unit)",
                if by_height { "height" } else { "depth" },
                num(d / 2.0),
                num(h - d / 2.0),
                if by_height { "height" } else { "depth" },
                if by_height { "bottom" } else { "top" },
            )),
        );
        return false;
    }
    let y = top - depth;
    let room = region.room_at(y, d);
    let fits = crate::section::side_by_side(&room, d);
    if fits < u64::from(count) {
        let w: f64 = room.iter().map(|(a, b)| b - a).sum();
        let (there, allowed) = if room.is_empty() {
            (
                "no concrete spans the steel's whole diameter there".to_string(),
                "a depth where the section has concrete (not in a void or outside the outline)".to_string(),
            )
        } else if room.len() == 1 {
            (
                format!("the section has {} {len} there", num(w)),
                format!("at most {fits} bars or strands of this size at this depth"),
            )
        } else {
            let pieces: Vec<String> = room.iter().map(|(a, b)| crate::trace::show(b - a)).collect();
            (
                format!(
                    "the concrete there lies in {} stretches between voids and edges ({} {len}), with room for {fits} side by side",
                    room.len(),
                    pieces.join(", ")
                ),
                format!("at most {fits} bars or strands of this size at this depth"),
            )
        };
        cx.problem(
            key,
            format!(
                "{count} of diameter {} {len} need {} {len} of concrete width at {key} = {} {len}; {there}",
                num(d),
                num(count as f64 * d),
                num(written)
            ),
            Some(allowed),
        );
        return false;
    }
    true
}

pub(super) fn strand_layer(
    cx: &mut Ctx,
    s: &raw::Strands,
    region: &Region,
    length: Option<f64>,
    defaults: &mut Vec<Default>,
) -> Option<StrandLayer> {
    let h = region.y_top() - region.y_bot();
    let profile = strand_profile(cx, s, h, length)?;
    let count = cx.count("count", s.count, 1, limits::STRANDS_PER_LAYER);
    let count = cx.required("count", count, "the number of strands in the layer")?;
    let (fpu, grade, model) = strand_grade(cx, s, defaults)?;
    let (diameter, area, size) = strand_size(cx, s, grade)?;
    let fpy = match &s.fpy {
        Some(_) => cx.ranged("fpy", &s.fpy, Dim::Stress, 0.8 * fpu, 0.95 * fpu, false)?,
        None => {
            defaults.push(Default { key: "strands.fpy".into(), text: "fpy = 0.90 fpu (low-relaxation strand)".into() });
            0.9 * fpu
        }
    };
    let (fse, fse_source) = strand_prestress(cx, s, fpu, fpy, defaults)?;
    let fpi = stress_at_release(cx, s, fse, fse_source, fpu)?;
    let debonded_length = match &s.debonded_length {
        Some(_) => {
            let limit = length.map_or(ranges(cx.sys).length_max, |l| l / 2.0);
            cx.ranged("debonded_length", &s.debonded_length, Dim::Length, 0.0, limit, false)?
        }
        None => 0.0,
    };
    // inside the concrete, at every level the layer takes
    let levels: Vec<(f64, &'static str)> = match profile {
        Profile::Straight { depth } => vec![(depth, if s.height.is_some() { "height" } else { "depth" })],
        Profile::Harped { depth_end, depth_harp, .. } => {
            let (a, b) =
                if s.depth_end.is_some() { ("depth_end", "depth_harp") } else { ("height_end", "height_harp") };
            vec![(depth_end, a), (depth_harp, b)]
        }
    };
    for (d, key) in levels {
        if !check_inside(cx, key, region, d, count, diameter) {
            return None;
        }
    }
    Some(StrandLayer {
        profile,
        count,
        diameter,
        area,
        size,
        fpu,
        fpy,
        grade,
        model,
        fse,
        fse_source,
        fpi,
        debonded_length,
    })
}

/// The stress just after release where the layer gives it (`fpi`): allowed beside a
/// given fse or given losses, from fse up to fpj (or fpu where fpj is not known); a
/// layer whose losses are computed takes it from the loss method. `Some(None)` where
/// it is not given.
fn stress_at_release(cx: &mut Ctx, s: &raw::Strands, fse: f64, source: FseSource, fpu: f64) -> Option<Option<f64>> {
    if s.fpi.is_none() {
        return Some(None);
    }
    let (hi, hi_name) = match source {
        FseSource::Computed { .. } => {
            cx.problem(
                "fpi",
                "fpi is given on a layer whose losses are computed: the loss method gives the stress after release",
                Some("fpi only beside fse or losses; or fse and losses left to the method".to_string()),
            );
            return None;
        }
        FseSource::Losses { fpj, .. } => (fpj, "fpj"),
        FseSource::Given => (fpu, "fpu"),
    };
    let v = cx.quantity("fpi", &s.fpi, Dim::Stress)?;
    if !(v >= fse && v <= hi) || fse <= 0.0 {
        let allowed = if fse <= 0.0 {
            "no fpi on an untensioned layer (fse = 0)".to_string()
        } else {
            format!("fse <= fpi <= {hi_name}: {} to {}", cx.shown(Dim::Stress, fse), cx.shown(Dim::Stress, hi))
        };
        cx.problem("fpi", format!("fpi = {} is out of range", cx.shown(Dim::Stress, v)), Some(allowed));
        return None;
    }
    Some(Some(v))
}

/// The layer's level: straight at a depth from the top of the precast unit (or a height
/// from its bottom), or harped; a precast unit `h` deep.
fn strand_profile(cx: &mut Ctx, s: &raw::Strands, h: f64, length: Option<f64>) -> Option<Profile> {
    let max = ranges(cx.sys).dim_max;
    let how = exclusive(
        cx,
        &[
            ("depth", s.depth.is_some()),
            ("height", s.height.is_some()),
            ("depth_end", s.depth_end.is_some() || s.depth_harp.is_some()),
            ("height_end", s.height_end.is_some() || s.height_harp.is_some()),
        ],
        "the layer's level (depth from the top of the precast unit, or height from its bottom; harped: depth_end and depth_harp, or height_end and height_harp, with harp_x)",
    );
    let profile = match how? {
        "depth" => Profile::Straight { depth: cx.ranged("depth", &s.depth, Dim::Length, 0.0, max, true)? },
        "height" => Profile::Straight { depth: h - cx.ranged("height", &s.height, Dim::Length, 0.0, max, true)? },
        harped => harped_profile(cx, s, harped == "depth_end", h, length)?,
    };
    for (key, given) in [("harp_x", s.harp_x.is_some()), ("harp_x2", s.harp_x2.is_some())] {
        if given && matches!(profile, Profile::Straight { .. }) {
            cx.problem(
                key,
                format!("{key} is given for a straight layer"),
                Some(format!("{key} only with depth_end/depth_harp or height_end/height_harp")),
            );
            return None;
        }
    }
    Some(profile)
}

/// A harped layer: its levels at the member end and at the harp points (as depths, or
/// as heights when `by_depth` is false) and the harp points' distances.
fn harped_profile(cx: &mut Ctx, s: &raw::Strands, by_depth: bool, h: f64, length: Option<f64>) -> Option<Profile> {
    let max = ranges(cx.sys).dim_max;
    let (end, harp, e_key, h_key) = if by_depth {
        (&s.depth_end, &s.depth_harp, "depth_end", "depth_harp")
    } else {
        (&s.height_end, &s.height_harp, "height_end", "height_harp")
    };
    let e = cx.required(e_key, end.as_ref(), "the level at the member end").cloned();
    let hp = cx.required(h_key, harp.as_ref(), "the level at the harp point").cloned();
    let e = cx.ranged(e_key, &e, Dim::Length, 0.0, max, true)?;
    let hp = cx.ranged(h_key, &hp, Dim::Length, 0.0, max, true)?;
    let (depth_end, depth_harp) = if by_depth { (e, hp) } else { (h - e, h - hp) };
    let hx = cx.required("harp_x", s.harp_x.as_ref(), "the harp point's distance from the member end").cloned();
    let (harp_x, harp_x2, harp_x2_given) = match (&s.harp_x2, length) {
        (Some(_), None) => {
            cx.problem(
                "harp_x2",
                "harp_x2 is given but the member has no length",
                Some("give the member's length (end to end), or leave harp_x2 out".to_string()),
            );
            return None;
        }
        (Some(_), Some(len)) => {
            let (hx, hx2) = second_harp_point(cx, s, &hx, len)?;
            (hx, Some(hx2), true)
        }
        (None, _) => {
            let limit = length.map_or(ranges(cx.sys).length_max, |l| l / 2.0);
            let hx = cx.ranged("harp_x", &hx, Dim::Length, 0.0, limit, true)?;
            (hx, length.map(|l| l - hx), false)
        }
    };
    Some(Profile::Harped { depth_end, depth_harp, harp_x, harp_x2, harp_x2_given })
}

/// harp_x and harp_x2 of a layer with two harp points given: harp_x < harp_x2 < length.
fn second_harp_point(cx: &mut Ctx, s: &raw::Strands, hx: &Option<Q>, len: f64) -> Option<(f64, f64)> {
    let hx = cx.ranged("harp_x", hx, Dim::Length, 0.0, len, true)?;
    let hx2 = cx.ranged("harp_x2", &s.harp_x2, Dim::Length, 0.0, len, true)?;
    if !(hx2 > hx && hx2 < len) {
        cx.problem(
            "harp_x2",
            format!(
                "harp_x2 = {} is not between harp_x = {} and the member's length {}",
                cx.shown(Dim::Length, hx2),
                cx.shown(Dim::Length, hx),
                cx.shown(Dim::Length, len)
            ),
            Some("the second harp point's distance from the left end: harp_x < harp_x2 < length".to_string()),
        );
        return None;
    }
    Some((hx, hx2))
}

/// The strand's fpu (Grade 270 by default), its grade and the strand model fitted to it.
fn strand_grade(cx: &mut Ctx, s: &raw::Strands, defaults: &mut Vec<Default>) -> Option<(f64, Grade, Model)> {
    let sys = cx.sys;
    let names = sys.names();
    let fpu = match &s.fpu {
        Some(_) => {
            let (lo, hi) = match sys {
                System::Us => (150.0, 350.0),
                System::Si => (1000.0, 2400.0),
            };
            cx.ranged("fpu", &s.fpu, Dim::Stress, lo, hi, false)?
        }
        None => {
            let v = match sys {
                System::Us => 270.0,
                System::Si => 1860.0,
            };
            defaults.push(Default {
                key: "strands.fpu".into(),
                text: format!("fpu = {} {} (Grade {})", num(v), names.stress, num(v)),
            });
            v
        }
    };
    let Some(grade) = Grade::of(fpu, sys) else {
        let allowed = match sys {
            System::Us => "250 or 270 ksi (the grades the strand models were fitted to)",
            System::Si => "1725 or 1860 MPa (the grades the strand models were fitted to)",
        };
        cx.problem(
            "fpu",
            format!("fpu = {} {}: no strand model here is fitted to this grade", num(fpu), names.stress),
            Some(allowed.to_string()),
        );
        return None;
    };
    let model = strand_model(cx, s, defaults)?;
    if StrandCurve::new(model, grade, sys).is_none() {
        cx.problem(
            "model",
            format!("model = \"power\" with fpu = {} {}: the power formula is fitted to Grade 270 low-relaxation strand only", num(fpu), names.stress),
            Some("model = \"pci\" for Grade 250 strand, or Grade 270 strand".to_string()),
        );
        return None;
    }
    Some((fpu, grade, model))
}

fn strand_model(cx: &mut Ctx, s: &raw::Strands, defaults: &mut Vec<Default>) -> Option<Model> {
    match s.model.as_deref() {
        None => {
            defaults.push(Default {
                key: "strands.model".into(),
                text: "strand model \"pci\" (PCI Design Handbook two-branch curve)".into(),
            });
            Some(Model::Pci)
        }
        Some("pci") => Some(Model::Pci),
        Some("power") => Some(Model::Power),
        Some(other) => {
            cx.problem(
                "model",
                format!("model = {other:?} is not a strand model this version knows"),
                Some("\"pci\" or \"power\"".to_string()),
            );
            None
        }
    }
}

/// The strand's size: its diameter (the area from the table, or given), or its area
/// alone (a standard size). Returns the diameter, the area and the standard size's name.
fn strand_size(cx: &mut Ctx, s: &raw::Strands, grade: Grade) -> Option<(f64, f64, Option<&'static str>)> {
    let sys = cx.sys;
    let names = sys.names();
    let max = ranges(sys).dim_max;
    let diameter = match &s.diameter {
        Some(_) => Some(cx.ranged("diameter", &s.diameter, Dim::Length, 0.0, max / 10.0, true)?),
        None => None,
    };
    let area = match &s.area {
        Some(_) => Some(cx.ranged("area", &s.area, Dim::Area, 0.0, max, true)?),
        None => None,
    };
    match (diameter, area) {
        (Some(d), a) => size_by_diameter(cx, d, a, grade),
        (None, Some(a)) => match catalog::strand_by_area(a, grade, sys) {
            Some(std) => Some((std.diameter, a, Some(std.name))),
            None => {
                cx.problem(
                    "area",
                    format!("area = {} {} is not a standard strand area, so the diameter (needed for development length) is unknown", num(a), names.area),
                    Some("give diameter as well".to_string()),
                );
                None
            }
        },
        (None, None) => {
            cx.problem(
                "diameter",
                "diameter is missing",
                Some(format!("the strand's nominal diameter: {}", catalog::strand_names(grade, sys))),
            );
            None
        }
    }
}

/// The size of a strand given by its diameter: a standard size (an area given too is
/// kept, with a warning where it differs from the table's), or any diameter with its area.
fn size_by_diameter(cx: &mut Ctx, d: f64, a: Option<f64>, grade: Grade) -> Option<(f64, f64, Option<&'static str>)> {
    let sys = cx.sys;
    let names = sys.names();
    match catalog::strand_by_diameter(d, grade, sys) {
        Some(std) => {
            if let Some(a) = a
                && (a - std.area).abs() > 0.02 * std.area
            {
                cx.warn(
                    "area",
                    format!(
                        "area {} {} differs from the standard {} {} of {} strand",
                        num(a),
                        names.area,
                        num(std.area),
                        names.area,
                        std.name
                    ),
                );
            }
            Some((std.diameter, a.unwrap_or(std.area), Some(std.name)))
        }
        None => match a {
            Some(a) => Some((d, a, None)),
            None => {
                cx.problem(
                    "diameter",
                    format!(
                        "diameter = {} {} is not a standard size of this strand grade; its area is unknown",
                        num(d),
                        names.length
                    ),
                    Some(format!("a standard diameter: {}; or give area too", catalog::strand_names(grade, sys))),
                );
                None
            }
        },
    }
}

/// The effective prestress: fse given, or the jacking stress (0.75 fpu by default) less
/// the losses; a warning where it exceeds the basis's jacking limit.
fn strand_prestress(
    cx: &mut Ctx,
    s: &raw::Strands,
    fpu: f64,
    fpy: f64,
    defaults: &mut Vec<Default>,
) -> Option<(f64, FseSource)> {
    let jack_limit = cx.basis.jacking_limit(fpu, fpy);
    if s.fse.is_none() && s.losses.is_none() && s.jacking.is_some() {
        return computed_prestress(cx, s.jacking, fpu, jack_limit);
    }
    let how = exclusive(
        cx,
        &[("fse", s.fse.is_some()), ("losses", s.losses.is_some())],
        "the effective prestress (fse, or losses with jacking)",
    )?;
    if how == "fse" {
        if s.jacking.is_some() {
            cx.problem("jacking", "jacking is given with fse", Some("fse alone, or jacking with losses".to_string()));
            return None;
        }
        let v = stress_below(cx, "fse", &s.fse, fpu, "fpu")?;
        if v > jack_limit {
            let message = format!(
                "fse = {} exceeds the jacking limit {} = {} of {}",
                cx.shown(Dim::Stress, v),
                cx.basis.jacking_limit_text(),
                cx.shown(Dim::Stress, jack_limit),
                cx.basis.cite(Clause::JackingLimit)
            );
            cx.warn("fse", message);
        }
        return Some((v, FseSource::Given));
    }
    let jacking = match s.jacking {
        Some(j) => cx.ratio("jacking", Some(j), 0.5, 0.85)?,
        None => {
            defaults.push(Default { key: "strands.jacking".into(), text: "jacking stress fpj = 0.75 fpu".into() });
            0.75
        }
    };
    let fpj = jacking * fpu;
    warn_above_jacking_limit(cx, jacking, fpj, jack_limit);
    let losses = stress_below(cx, "losses", &s.losses, fpj, "fpj")?;
    Some((fpj - losses, FseSource::Losses { jacking, fpj, losses }))
}

/// A layer that gives `jacking` alone: its losses are computed by the member's method,
/// whose relaxation factor C is tabulated for fpj/fpu from 0.60 to 0.80.
fn computed_prestress(cx: &mut Ctx, jacking: Option<f64>, fpu: f64, jack_limit: f64) -> Option<(f64, FseSource)> {
    let j = jacking?;
    if !(0.60..=0.80).contains(&j) {
        cx.problem(
            "jacking",
            format!(
                "jacking = {} with neither fse nor losses asks for computed losses, whose relaxation factor C is tabulated for fpj/fpu from 0.60 to 0.80 only",
                num(j)
            ),
            Some("0.60 <= jacking <= 0.80, or give fse or losses".to_string()),
        );
        return None;
    }
    let fpj = j * fpu;
    warn_above_jacking_limit(cx, j, fpj, jack_limit);
    Some((f64::NAN, FseSource::Computed { jacking: j, fpj }))
}

/// A jacking stress above the basis's limit is warned of (the input stands).
fn warn_above_jacking_limit(cx: &mut Ctx, jacking: f64, fpj: f64, jack_limit: f64) {
    if fpj > jack_limit * (1.0 + 1e-12) {
        let message = format!(
            "jacking = {} gives fpj = {}, above the limit {} = {} of {}",
            num(jacking),
            cx.shown(Dim::Stress, fpj),
            cx.basis.jacking_limit_text(),
            cx.shown(Dim::Stress, jack_limit),
            cx.basis.cite(Clause::JackingLimit)
        );
        cx.warn("jacking", message);
    }
}

/// A stress from 0 up to, not including, a bound named `bound_name`.
fn stress_below(cx: &mut Ctx, key: &'static str, q: &Option<Q>, bound: f64, bound_name: &str) -> Option<f64> {
    let v = cx.quantity(key, q, Dim::Stress)?;
    if !(0.0..bound).contains(&v) {
        cx.problem(
            key,
            format!("{key} = {} is out of range", cx.shown(Dim::Stress, v)),
            Some(format!("0 <= {key} < {bound_name} = {}", cx.shown(Dim::Stress, bound))),
        );
        return None;
    }
    Some(v)
}

pub(super) fn bar_layer(cx: &mut Ctx, b: &raw::Bars, region: &Region, defaults: &mut Vec<Default>) -> Option<BarLayer> {
    let sys = cx.sys;
    let r = ranges(sys);
    let h = region.y_top() - region.y_bot();
    let how = exclusive(
        cx,
        &[("depth", b.depth.is_some()), ("height", b.height.is_some())],
        "the layer's level (depth from the top of the precast unit, or height from its bottom)",
    )?;
    let depth = if how == "depth" {
        cx.ranged("depth", &b.depth, Dim::Length, 0.0, r.dim_max, true)?
    } else {
        h - cx.ranged("height", &b.height, Dim::Length, 0.0, r.dim_max, true)?
    };
    let count = cx.count("count", b.count, 1, limits::BARS_PER_LAYER);
    let count = cx.required("count", count, "the number of bars in the layer")?;
    let (size, diameter, area) = bar_size(cx, b, defaults)?;
    let fy = match &b.fy {
        Some(_) => cx.ranged("fy", &b.fy, Dim::Stress, r.fy.0, r.fy.1, false)?,
        None => {
            let (v, g) = match sys {
                System::Us => (60.0, "fy = 60 ksi (ASTM A615 Grade 60)"),
                System::Si => (420.0, "fy = 420 MPa (ASTM A615M Grade 420)"),
            };
            defaults.push(Default { key: "bars.fy".into(), text: g.into() });
            v
        }
    };
    let es = match &b.es {
        Some(_) => cx.ranged("es", &b.es, Dim::Stress, r.es.0, r.es.1, false)?,
        None => {
            let (v, t) = cx.basis.bar_modulus();
            defaults.push(Default { key: "bars.es".into(), text: t });
            v
        }
    };
    if !check_inside(cx, how, region, depth, count, diameter) {
        return None;
    }
    Some(BarLayer { depth, count, size, diameter, area, fy, es })
}

/// A bar's size: a bar size of the catalogue, a diameter with its area, or an area alone
/// (drawn and placed as the round bar of that area). Returns the size's name, the
/// diameter and the area.
fn bar_size(cx: &mut Ctx, b: &raw::Bars, defaults: &mut Vec<Default>) -> Option<(Option<&'static str>, f64, f64)> {
    let sys = cx.sys;
    let r = ranges(sys);
    match (&b.size, &b.diameter) {
        (Some(_), Some(_)) => {
            cx.problem(
                "diameter",
                "size and diameter are both given",
                Some("a bar size (\"#5\"), or diameter with area".to_string()),
            );
            None
        }
        (Some(name), None) => match catalog::bar(name, sys) {
            Some(bs) => {
                if b.area.is_some() {
                    cx.problem(
                        "area",
                        "area is given with size; the size fixes the area",
                        Some(format!("size alone ({} has {} {})", bs.name, num(bs.area), sys.names().area)),
                    );
                    return None;
                }
                Some((Some(bs.name), bs.diameter, bs.area))
            }
            None => {
                let std = match sys {
                    System::Us => "ASTM A615",
                    System::Si => "ASTM A615M",
                };
                cx.problem("size", format!("size = {name:?} is not a {std} bar size"), Some(catalog::bar_names(sys)));
                None
            }
        },
        (None, Some(_)) => {
            let d = cx.ranged("diameter", &b.diameter, Dim::Length, 0.0, r.dim_max / 10.0, true)?;
            let a = cx.required("area", b.area.as_ref(), "the area of one bar (with diameter)").cloned();
            let a = cx.ranged("area", &a, Dim::Area, 0.0, r.dim_max, true)?;
            Some((None, d, a))
        }
        (None, None) if b.area.is_some() => {
            // area alone: the drawing and the fit check use the round bar of that area
            let a = cx.ranged("area", &b.area, Dim::Area, 0.0, r.dim_max, true)?;
            let d = (4.0 * a / std::f64::consts::PI).sqrt();
            defaults.push(Default {
                key: "bars.diameter".into(),
                text: format!(
                    "a bar layer given by its area alone ({} {}) is drawn and placed as the round bar of that area, diameter √(4A/π) = {} {}",
                    num(a),
                    sys.names().area,
                    crate::trace::show(d),
                    sys.names().length
                ),
            });
            Some((None, d, a))
        }
        (None, None) => {
            cx.problem(
                "size",
                "size is missing",
                Some(format!("a bar size: {}; diameter with area; or area alone", catalog::bar_names(sys))),
            );
            None
        }
    }
}
