//! The payload: everything the package shows, as JSON. It holds the program version, the
//! parsed input, every result and the whole trace, with each displayed number also as
//! the text it is printed as (formatted here, never in the templates). Its canonical
//! bytes are hashed (see [`crate::seal`]) and attached to the PDF.

use crate::analysis::{Analysis, LocationResult, MemberResult};
use crate::input::{Package, Source};
use crate::trace::{Step, Style, Unit, scale};
use crate::units::System;
use serde_json::{Value, json};

/// A number as the sheets print it: [`crate::trace::show`] with a true minus sign (the
/// plain trace and `check` keep the ASCII hyphen, which tools read).
fn show(v: f64) -> String {
    minus(crate::trace::show(v))
}

/// [`crate::trace::scaled`] with a true minus sign.
fn scaled(v: f64, u: Unit) -> String {
    minus(crate::trace::scaled(v, u))
}

fn minus(s: String) -> String {
    match s.strip_prefix('-') {
        Some(rest) => format!("−{rest}"),
        None => s,
    }
}

/// What the templates print for a unit.
fn unit_name(u: Unit, sys: System) -> &'static str {
    u.name(sys)
}

/// A value as Typst math: "6.123 times 10^(-3)" for a strain.
fn shown_math(st: &Step) -> String {
    let (v, u) = (st.value, st.unit);
    // zero needs no scale ("0", not "0 × 10⁻³")
    let (_, _, tag) = if v == 0.0 { (1.0, "", "") } else { scale(u) };
    let s = minus(st.shown());
    let s = crate::trace::math_number(&s);
    if tag.is_empty() { s } else { format!("{s} times {tag}") }
}

/// The JSON object `obj` with `fields` moved in. `json!` copies each value it is given
/// by serialising it, which for a member's steps and locations cost most of the time of
/// building the payload.
fn with_moved<const N: usize>(mut obj: Value, fields: [(&str, Value); N]) -> Value {
    if let Value::Object(map) = &mut obj {
        for (k, v) in fields {
            map.insert(k.to_string(), v);
        }
    }
    obj
}

/// A step as the templates read it.
pub fn step_view(st: &Step, sys: System) -> Value {
    let constant = matches!(st.formula, Some(crate::trace::Expr::Num(_)));
    let math = st.printed(Style::Math).filter(|_| !constant);
    let (formula, subst) = match &math {
        Some((f, s)) => (Some(f.clone()), if s != f { Some(s.clone()) } else { None }),
        None => (None, None),
    };
    let short = st.id.split_once('.').filter(|(p, _)| p.starts_with('L')).map_or(st.id.as_str(), |(_, rest)| rest);
    // one line, or stacked with the equals signs aligned, by the estimated width of the
    // whole line (about 88 estimated characters fit the equation column)
    let (ws, wf, wsub) = st.widths();
    let result_w = st.shown().chars().count() as f64 + unit_name(st.unit, sys).chars().count() as f64 + 6.0;
    let total =
        ws + if formula.is_some() { wf + 3.0 } else { 0.0 } + if subst.is_some() { wsub + 3.0 } else { 0.0 } + result_w;
    let stack = total > 88.0;
    let inputs: Vec<Value> = st
        .inputs
        .iter()
        .map(|i| {
            json!({
                "sym": i.symbol.math,
                "plain": i.symbol.plain,
                "value": i.value,
                "unit": unit_name(i.unit, sys),
                "kind": i.unit,
            })
        })
        .collect();
    let v = json!({
        "id": st.id,
        "short": short,
        "stack": stack,
        "group": st.group,
        "title": st.title,
        "sym": st.symbol.math,
        "plain": st.symbol.plain,
        "formula": formula,
        "subst": subst,
        "value": st.value,
        "shown": minus(st.shown()),
        "shown_math": shown_math(st),
        "scale": scale(st.unit).1,
        "unit": unit_name(st.unit, sys),
        "clause": st.clause,
        "note": st.note,
        "tree": st.formula,
    });
    with_moved(v, [("inputs", Value::Array(inputs))])
}

fn steps_view(steps: &[Step], sys: System) -> Value {
    Value::Array(steps.iter().map(|s| step_view(s, sys)).collect())
}

fn opt(v: Option<f64>) -> Value {
    match v {
        Some(x) if x.is_finite() => json!(show(x)),
        _ => json!("—"),
    }
}

fn location_view(l: &LocationResult, sys: System) -> Value {
    let mut v = serde_json::to_value(l).unwrap_or(Value::Null);
    let steps = steps_view(&l.trace, sys);
    let obj = v.as_object_mut().expect("a location serialises as an object");
    obj.remove("trace");
    obj.insert("steps".into(), steps);
    let iters: Vec<Value> = l
        .iterations
        .iter()
        .map(|t| {
            json!({
                "k": t.k.to_string(),
                "method": t.method,
                "c": show(t.c),
                "a": minus(crate::trace::show_like(t.a, t.c)),
                // a trial at the bracket's end (c near zero) strains the steel beyond any
                // real value: such strains are shown as beyond 1000 ×10⁻³
                "eps": if t.eps.abs() >= 1.0 {
                    if t.eps > 0.0 { "> 1000".to_string() } else { "< −1000".to_string() }
                } else {
                    scaled(t.eps, Unit::Strain)
                },
                "stress": show(t.stress),
                "cc": show(t.cc),
                "t": show(t.t),
                "residual": if t.residual == 0.0 { "0".to_string() } else { crate::trace::sci(t.residual, 2) },
            })
        })
        .collect();
    obj.insert("iterations_shown".into(), Value::Array(iters));
    let layers = |ls: &[crate::analysis::LayerOut]| -> Vec<Value> {
        ls.iter()
            .map(|s| {
                json!({
                    "kind": s.kind,
                    "index": s.index,
                    "label": s.label,
                    "area": show(s.area),
                    "unit_area": show(s.unit_area),
                    "depth": show(s.depth),
                    "eps1": s.eps1.map(|e| scaled(e, Unit::Strain)),
                    "eps2": s.eps2.map(|e| scaled(e, Unit::Strain)),
                    "eps3": scaled(s.eps3, Unit::Strain),
                    "eps": scaled(s.eps, Unit::Strain),
                    "stress": show(s.stress),
                    "force": show(s.force),
                    "fse": s.fse.map(show),
                    "cap": s.cap.map(show),
                    "active": s.active,
                })
            })
            .collect()
    };
    obj.insert("strands_shown".into(), Value::Array(layers(&l.strands)));
    obj.insert("bars_shown".into(), Value::Array(layers(&l.bars)));
    let u = sys.names();
    obj.insert(
        "shown".into(),
        json!({
            "x": l.x.map(show),
            "c": show(l.c),
            "a": minus(crate::trace::show_like(l.a, l.c)),
            "mn": show(l.mn),
            "phi": show(l.phi),
            "phi_mn": show(l.phi_mn),
            "mu": show(l.mu),
            "ratio": crate::trace::ratio_text(l.ratio),
            "mcr": show(l.mcr),
            "min_required": show(l.min_reinforcement.required),
            "eps_t": scaled(l.eps_t, Unit::Strain),
            "pe": show(l.pe),
            "e": show(l.e),
            "cc": show(l.cc),
            "dc": show(l.dc),
            "closure": crate::trace::sci(l.closure, 1),
            "trials": l.iterations.len().to_string(),
            "approx_mn": opt(l.approximate.mn),
            "approx_fps": opt(l.approximate.fps),
            "approx_diff": opt(l.approximate.difference),
            "other_mn": opt(l.other_block.as_ref().map(|o| o.mn)),
            "max_strand_strain": scaled(l.max_strand_strain, Unit::Strain),
            "eps_cu": crate::trace::const_text(l.eps_cu),
            "x_label": match l.x { Some(x) => format!("x = {} {}", show(x), u.length), None => "strands taken as fully developed".into() },
        }),
    );
    v
}

/// Tick positions for an axis from lo to hi: about five steps of 1, 2, 2.5 or 5 × 10^k,
/// up to the last one not beyond hi. They start at the first tick not below lo, or at
/// the one below lo where that would leave over 40 % of a step unlabelled (a curve that
/// starts well left of zero gets a labelled negative tick; the axis then starts there).
fn ticks(lo: f64, hi: f64) -> Vec<f64> {
    let span = (hi - lo).abs();
    if span <= 0.0 || !span.is_finite() {
        return vec![lo];
    }
    let raw = span / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 2.5, 5.0, 10.0].iter().map(|k| k * mag).find(|s| *s >= raw).unwrap_or(10.0 * mag);
    let up = (lo / step - 1e-9).ceil() * step;
    let first = if up - lo > 0.4 * step { up - step } else { up };
    let mut out = Vec::new();
    let mut t = first;
    while t <= hi + 1e-9 * span {
        out.push(if t.abs() < 1e-12 * span { 0.0 } else { t });
        t += step;
    }
    out
}

/// The moment-curvature plot and its table, ready to draw.
fn curve_view(c: &crate::analysis::curve::CurveResult, l: &LocationResult, sys: System) -> Value {
    let u = sys.names();
    let kscale = 1e6; // curvature shown as ×10⁻⁶ per unit length
    let (kmin, kmax) = c.points.iter().fold((0.0f64, 0.0f64), |(a, b), p| (a.min(p.curvature), b.max(p.curvature)));
    let mmax = c.points.iter().map(|p| p.moment).fold(l.mn.max(l.mu).max(l.mcr), f64::max) * 1.08;
    let mmin = c.points.iter().map(|p| p.moment).fold(0.0, f64::min);
    let xt: Vec<Value> = ticks(kmin * kscale, kmax * kscale)
        .into_iter()
        .map(|t| json!({"value": t / kscale, "label": show_tick(t)}))
        .collect();
    let yt: Vec<Value> = ticks(mmin, mmax).into_iter().map(|t| json!({"value": t, "label": show_tick(t)})).collect();
    let mark = |name: &str, m: Option<crate::analysis::curve::Mark>| {
        m.map(|m| json!({"name": name, "curvature": m.curvature, "moment": m.moment, "curvature_shown": show(m.curvature * kscale), "moment_shown": show(m.moment)}))
    };
    let marks: Vec<Value> = [
        mark("cracking", c.cracking),
        mark("first yield", c.yielding),
        mark("peak", Some(c.peak)),
        mark("end", Some(c.ultimate)),
    ]
    .into_iter()
    .flatten()
    .collect();
    let lines = vec![
        json!({"name": "Mn (stress block)", "value": l.mn, "shown": show(l.mn)}),
        json!({"name": "φMn", "value": l.phi_mn, "shown": show(l.phi_mn)}),
        json!({"name": "Mu", "value": l.mu, "shown": show(l.mu)}),
        json!({"name": "Mcr (formula)", "value": l.mcr, "shown": show(l.mcr)}),
    ];
    json!({
        "location": c.location,
        "x_range": [kmin, kmax],
        "y_range": [mmin, mmax],
        "x_ticks": xt,
        "y_ticks": yt,
        "x_label": format!("curvature ×10⁻⁶ 1/{}", u.length),
        "y_label": format!("moment {}", u.moment),
        "points": c.points.iter().map(|p| [p.curvature, p.moment]).collect::<Vec<_>>(),
        "marks": marks,
        "lines": lines,
        "ductility": c.ductility.map(show),
        "ended_by": c.ended_by,
        "concrete_model": c.concrete_model,
        "strips": c.strips.to_string(),
        "points_count": c.points.len().to_string(),
        "notes": c.notes,
        "peak_vs_mn": show((c.peak.moment - l.mn) / l.mn * 100.0),
        "cracking_vs_mcr": c.cracking.map(|k| show((k.moment - l.mcr) / l.mcr * 100.0)),
    })
}

/// A tick label: short, no trailing zeros.
fn show_tick(t: f64) -> String {
    let s = crate::trace::fixed(t, 3);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" { "0".into() } else { minus(s.to_string()) }
}

fn member_view(m: &MemberResult, input: &crate::input::model::Member, basis: &dyn crate::basis::Basis) -> Value {
    let sys = basis.units();
    let steps = steps_view(&m.trace, sys);
    let u = sys.names();
    let mut rows: Vec<Value> = Vec::new();
    let mut row = |k: &str, v: String| rows.push(json!([k, v]));
    row("Section", input.shape.name().to_string());
    if let crate::section::shapes::Shape::HollowCore { void_count, .. } = input.shape {
        row("Voids", format!("{void_count} round voids"));
    }
    for (k, v) in shape_dims(&input.shape) {
        row(k, format!("{} {}", show(v), u.length));
    }
    row("Precast concrete f'c", format!("{} {}", show(input.concrete.fc), u.stress));
    if let Some(t) = &input.topping {
        row(
            "Topping",
            format!(
                "{} {} thick, {} {} wide, f'c = {} {}",
                show(t.thickness),
                u.length,
                show(t.width),
                u.length,
                show(t.concrete.fc),
                u.stress
            ),
        );
    }
    if let Some(l) = input.length {
        row("Length, end to end (x from the left end)", format!("{} {}", show(l), u.length));
    }
    row(
        "Member kind",
        match input.kind {
            crate::input::model::Kind::Beam => format!("beam ({} {})", basis.name(), basis.member_chapter(false)),
            crate::input::model::Kind::OneWaySlab => {
                format!("one-way slab ({} {})", basis.name(), basis.member_chapter(true))
            }
        },
    );
    let strands: Vec<Value> = input
        .strands
        .iter()
        .enumerate()
        .map(|(i, s)| {
            // depths from the top of the precast unit, as input; with a topping also dp
            // from the top of the section, the datum of the steps and tables
            let t = input.topping_thickness();
            let d = |x: f64| {
                if t > 0.0 { format!("{} (dp {})", show(x), show(x + t)) } else { show(x) }
            };
            let level = match s.profile {
                crate::input::model::Profile::Straight { depth } => format!("depth {} {}", d(depth), u.length),
                crate::input::model::Profile::Harped { depth_end, depth_harp, harp_x, harp_x2, harp_x2_given } => {
                    match (harp_x2, harp_x2_given) {
                        (Some(x2), true) => format!(
                            "harped: depth {} at the ends, {} between x = {} and {} {}",
                            d(depth_end),
                            d(depth_harp),
                            show(harp_x),
                            show(x2),
                            u.length
                        ),
                        _ => format!(
                            "harped: depth {} at the ends, {} from {} {} from each end",
                            d(depth_end),
                            d(depth_harp),
                            show(harp_x),
                            u.length
                        ),
                    }
                }
            };
            json!({
                "index": i + 1,
                "count": s.count,
                "size": s.size.unwrap_or("non-standard"),
                "diameter": show(s.diameter),
                "area": show(s.area),
                "total_area": show(s.total_area()),
                "fpu": show(s.fpu),
                "fse": show(s.fse),
                "level": level,
                "model": s.model,
                "model_shown": s.model.short(),
                "debonded": if s.debonded_length > 0.0 { Some(show(s.debonded_length)) } else { None },
            })
        })
        .collect();
    let bars: Vec<Value> = input
        .bars
        .iter()
        .enumerate()
        .map(|(i, b)| {
            json!({
                "index": i + 1,
                "count": b.count,
                "size": b.size.unwrap_or("non-standard"),
                "diameter": show(b.diameter),
                "area": show(b.area),
                "total_area": show(b.total_area()),
                "fy": show(b.fy),
                "depth": show(b.depth),
            })
        })
        .collect();
    // a polygon's outline and holes as given (y upward), so a checker can recompute A,
    // yb and I; a built-in shape's dimensions are in the input rows
    let vertices: Vec<Value> = match &input.shape {
        crate::section::shapes::Shape::Polygon { outline, holes } => std::iter::once(("outline".to_string(), outline))
            .chain(holes.iter().enumerate().map(|(k, h)| (format!("hole {}", k + 1), h)))
            .map(|(name, ring)| {
                json!({
                    "ring": name,
                    "points": ring.iter().enumerate().map(|(k, p)| json!([(k + 1).to_string(), show(p[0]), show(p[1])])).collect::<Vec<_>>(),
                })
            })
            .collect(),
        _ => Vec::new(),
    };
    let locations: Vec<Value> = m.locations.iter().map(|l| location_view(l, sys)).collect();
    let curve = m.curve.as_ref().map_or(Value::Null, |c| curve_view(c, &m.locations[m.governing], sys));
    let v = json!({
        "id": m.id,
        "description": input.description,
        "kind": input.kind,
        "pass": m.pass,
        "governing": m.governing,
        "section": m.section,
        "section_shown": {
            "height": format!("{} {}", show(m.section.height), u.length),
            "precast_height": format!("{} {}", show(m.section.precast_height), u.length),
            "topping_thickness": input.topping.as_ref().map(|t| format!("{} {}", show(t.thickness), u.length)),
            "width": format!("{} {}", show(m.section.geometry.x_max - m.section.geometry.x_min), u.length),
        },
        "defaults": input.defaults,
        "input": input,
        "curve_data": m.curve,
        "curve_error": m.curve_error,
    });
    with_moved(
        v,
        [
            ("input_rows", Value::Array(rows)),
            ("vertices", Value::Array(vertices)),
            ("strands", Value::Array(strands)),
            ("bars", Value::Array(bars)),
            ("steps", steps),
            ("locations", Value::Array(locations)),
            ("curve", curve),
        ],
    )
}

fn shape_dims(s: &crate::section::shapes::Shape) -> Vec<(&'static str, f64)> {
    use crate::section::shapes::Shape::*;
    match *s {
        Rectangle { width, height } => vec![("Width", width), ("Height", height)],
        Tee { flange_width, flange_thickness, web_width, height } => vec![
            ("Flange width", flange_width),
            ("Flange thickness", flange_thickness),
            ("Web width", web_width),
            ("Height", height),
        ],
        InvertedTee { web_width, height, ledge_width, ledge_height, .. } => vec![
            ("Stem width", web_width),
            ("Height", height),
            ("Ledge projection", ledge_width),
            ("Ledge height", ledge_height),
        ],
        DoubleTee { flange_width, flange_thickness, height, stem_spacing, stem_width_top, stem_width_bottom } => vec![
            ("Flange width", flange_width),
            ("Flange thickness", flange_thickness),
            ("Height", height),
            ("Stem spacing", stem_spacing),
            ("Stem width, top", stem_width_top),
            ("Stem width, bottom", stem_width_bottom),
        ],
        IGirder {
            height,
            top_flange_width,
            top_flange_thickness,
            top_taper,
            web_width,
            bottom_flange_width,
            bottom_flange_thickness,
            bottom_taper,
        } => vec![
            ("Height", height),
            ("Top flange width", top_flange_width),
            ("Top flange thickness", top_flange_thickness),
            ("Top taper", top_taper),
            ("Web width", web_width),
            ("Bottom flange width", bottom_flange_width),
            ("Bottom flange thickness", bottom_flange_thickness),
            ("Bottom taper", bottom_taper),
        ],
        HollowCore { width, height, void_diameter, void_center_height, .. } => vec![
            ("Width", width),
            ("Height", height),
            ("Void diameter", void_diameter),
            ("Void centre height", void_center_height),
        ],
        Polygon { .. } => vec![],
    }
}

/// Options of the render that enter the payload.
pub struct Provenance<'a> {
    /// "builtin", or the SHA-256 of a template folder.
    pub templates: &'a str,
}

/// Builds the payload.
pub fn build(pkg: &Package, src: &Source, a: &Analysis, prov: &Provenance) -> Value {
    let sys = pkg.units;
    let u = sys.names();
    let meta = &pkg.meta;
    // defaults, with the members that took them
    let mut defaults: Vec<(String, Vec<String>)> = Vec::new();
    for m in &pkg.members {
        for d in &m.defaults {
            match defaults.iter_mut().find(|(t, _)| *t == d.text) {
                Some((_, ids)) => {
                    if !ids.contains(&m.id) {
                        ids.push(m.id.clone());
                    }
                }
                None => defaults.push((d.text.clone(), vec![m.id.clone()])),
            }
        }
    }
    let all = pkg.members.len();
    let defaults: Vec<Value> = defaults
        .into_iter()
        .map(|(t, ids)| json!({"text": t, "members": if ids.len() == all { "all members".to_string() } else { ids.join(", ") }}))
        .collect();
    let summary: Vec<Value> = a
        .members
        .iter()
        .flat_map(|m| {
            m.locations.iter().enumerate().map(move |(i, l)| {
                json!({
                    "member": m.id,
                    "location": l.name,
                    "x": l.x.map(show).unwrap_or_else(|| "—".into()),
                    "phi_mn": show(l.phi_mn),
                    "mu": show(l.mu),
                    "ratio": crate::trace::ratio_text(l.ratio),
                    "control": l.control,
                    "phi": show(l.phi),
                    "min": if l.min_reinforcement.ok { "met" } else if l.min_reinforcement.waiver_flexure { "waived (see sheet)" } else { "not met" },
                    "pass": l.pass,
                    "status": l.status,
                    // adequate only on the open conditions the conclusion lists
                    "caution": l.status == crate::analysis::conclusion::Status::Conditional,
                    "governing": i == m.governing,
                })
            })
        })
        .collect();
    // every open condition of the package, for the cover
    let open_items: Vec<Value> = a
        .members
        .iter()
        .flat_map(|m| {
            m.locations.iter().flat_map(move |l| {
                l.conditions
                    .iter()
                    .map(move |c| json!({"member": m.id, "location": l.name, "kind": c.kind, "short": c.short}))
            })
        })
        .collect();
    // the same, by kind, for the cover: what each kind asks and where
    let mut kinds: Vec<(crate::analysis::conclusion::ConditionKind, Vec<String>)> = Vec::new();
    for m in &a.members {
        for l in &m.locations {
            for c in &l.conditions {
                let at = format!("{} · {}", m.id, l.name);
                match kinds.iter_mut().find(|(k, _)| *k == c.kind) {
                    Some((_, list)) => list.push(at),
                    None => kinds.push((c.kind, vec![at])),
                }
            }
        }
    }
    let open_kinds: Vec<Value> = kinds
        .into_iter()
        .map(|(k, at)| {
            const SHOWN: usize = 4;
            let more = at.len().saturating_sub(SHOWN);
            let mut places = at.iter().take(SHOWN).cloned().collect::<Vec<_>>().join("; ");
            if more > 0 {
                places.push_str(&format!("; and {more} more"));
            }
            json!({"title": k.title(), "count": at.len(), "places": places})
        })
        .collect();
    let members: Vec<Value> = {
        use rayon::prelude::*;
        let basis = pkg.basis();
        a.members.par_iter().zip(&pkg.members).map(|(r, m)| member_view(r, m, basis)).collect()
    };
    let draft = meta.is_draft();
    let signoffs: Vec<Value> = meta
        .signoffs
        .iter()
        .map(|s| json!({"role": s.role.name(), "name": s.name, "license": s.license, "firm": s.firm, "date": s.date.map(|d| d.to_string())}))
        .collect();
    let name = std::path::Path::new(&src.name)
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| src.name.clone());
    let v = json!({
        "format": 1,
        "program": {"name": "strainsheet", "version": env!("CARGO_PKG_VERSION")},
        "templates": prov.templates,
        "units": {
            "system": sys.label(),
            "length": u.length, "area": Unit::Area.name(sys), "stress": u.stress, "force": u.force, "moment": u.moment,
            "inertia": Unit::Inertia.name(sys), "modulus": Unit::Modulus.name(sys),
            "input_coherent": match sys { System::Us => "in, in2, ksi, kip, kip-in", System::Si => "mm, mm2, MPa, N, N-mm" },
        },
        "input": {
            "name": name,
            "sha256": crate::seal::sha256_hex(src.text.as_bytes()),
            "lines": src.text.lines().count(),
        },
        "package": {
            "title": meta.title,
            "project": meta.project,
            "project_number": meta.project_number,
            "client": meta.client,
            "subject": meta.subject,
            "revision": meta.revision,
            "date": meta.date.to_string(),
            "basis": meta.basis,
            "paper": meta.paper,
            "notes": meta.notes,
            "revisions": meta.revisions.iter().map(|r| json!({"rev": r.rev, "date": r.date.to_string(), "description": r.description})).collect::<Vec<_>>(),
            "signoffs": signoffs,
            "draft": draft,
            "pass": a.pass(),
            "status": a.status(),
        },
        "defaults": defaults,
        "warnings": pkg.warnings,
    });
    with_moved(
        v,
        [
            ("summary", Value::Array(summary)),
            ("open_items", Value::Array(open_items)),
            ("open_kinds", Value::Array(open_kinds)),
            ("members", Value::Array(members)),
        ],
    )
}

/// What the templates read (view.json): the payload less what no sheet prints (formula
/// trees, step inputs, the parsed input model, the raw curve and iteration data). It is
/// derived from the payload, so every number it holds is the payload's; keeping it
/// small keeps the typesetting fast.
pub fn view(payload: &Value) -> Value {
    const STEP_KEYS: &[&str] = &[
        "id",
        "short",
        "group",
        "title",
        "sym",
        "formula",
        "subst",
        "shown",
        "shown_math",
        "unit",
        "clause",
        "note",
        "stack",
    ];
    fn steps(v: &mut Value) {
        if let Some(list) = v.get_mut("steps").and_then(Value::as_array_mut) {
            for st in list {
                if let Some(o) = st.as_object_mut() {
                    o.retain(|k, _| STEP_KEYS.contains(&k.as_str()));
                }
            }
        }
    }
    // every member is pruned on its own, in parallel; the rest is copied
    use rayon::prelude::*;
    let Value::Object(top) = payload else { return payload.clone() };
    let mut out = serde_json::Map::new();
    for (k, val) in top {
        if k == "members"
            && let Value::Array(ms) = val
        {
            out.insert(k.clone(), Value::Array(ms.par_iter().map(|m| member(m.clone())).collect()));
        } else {
            out.insert(k.clone(), val.clone());
        }
    }
    fn member(mut m: Value) -> Value {
        steps(&mut m);
        if let Some(o) = m.as_object_mut() {
            o.remove("input");
            o.remove("curve_data");
        }
        if let Some(locs) = m.get_mut("locations").and_then(Value::as_array_mut) {
            for l in locs {
                steps(l);
                if let Some(o) = l.as_object_mut() {
                    o.remove("iterations");
                    // each layer carries its printed values, so a figure labels a
                    // layer without looking it up in the location
                    for (raw, shown) in [("strands", "strands_shown"), ("bars", "bars_shown")] {
                        let printed = o.get(shown).and_then(Value::as_array).cloned().unwrap_or_default();
                        if let Some(list) = o.get_mut(raw).and_then(Value::as_array_mut) {
                            for (layer, p) in list.iter_mut().zip(printed) {
                                if let Some(lo) = layer.as_object_mut() {
                                    lo.insert("shown".into(), p);
                                }
                            }
                        }
                    }
                }
            }
        }
        m
    }
    Value::Object(out)
}
