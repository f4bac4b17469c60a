//! `diff`: what changed between two packages, or two TOML inputs, or one of each: the
//! package data, the inputs of each member, members added or removed, and the results
//! of every check location before and after.
//!
//! It speaks the user's language: every value in the unit it is shown in (the
//! package's system: kip-ft or kN-m for moments, in or mm, ksi or MPa), never in the
//! coherent units the payload's parsed input holds (kip-in, N-mm). Items of a list are
//! matched by what names them, not by their place: a member by its id, a location by
//! its name within its member, a default by its key, a sign-off by its role, a revision
//! by its letter; strand and bar layers, and outline points, by their index (they have
//! no name). A package is read from its attached payload; a TOML input is analysed in
//! this process, as `check` does.

use crate::error::{Error, Result};
use crate::units::System;
use serde_json::{Map, Value, json};
use std::path::Path;

/// One side of a comparison: a payload, and what it was read from.
pub struct Side {
    pub payload: Value,
    /// "package" or "input".
    pub kind: &'static str,
    /// The content hash (payload) a package records; `None` for an input.
    pub content_hash: Option<String>,
    /// The file hash (PDF) of a package; `None` for an input.
    pub file_hash: Option<String>,
}

/// Reads one side: a package (its attached payload) or, for a name ending in `.toml`,
/// an input, read, checked and analysed here. Errors are those of `verify` and `check`
/// (exit 2).
pub fn load(path: &Path) -> Result<Side> {
    let is_toml = path.extension().is_some_and(|e| e.eq_ignore_ascii_case("toml"));
    if is_toml {
        let bytes = crate::files::read_regular(path, crate::input::MAX_FILE_BYTES, "the input")?;
        let src = crate::input::from_bytes(path.display().to_string(), bytes)?;
        let pkg = crate::input::parse(&src)?;
        let a = crate::analysis::analyze(&pkg, false)?;
        let payload =
            crate::report::payload::build(&pkg, &src, &a, &crate::report::payload::Provenance { templates: "builtin" });
        // a package's payload is read back from its JSON text, and reading a float back
        // may differ from the value written in its last bit: go the same way
        let payload = serde_json::from_slice(&crate::seal::canonical(&payload))
            .map_err(|e| Error::Usage(format!("{}: the analysis could not be read back ({e})", path.display())))?;
        return Ok(Side { payload, kind: "input", content_hash: None, file_hash: None });
    }
    let o = crate::verify::open(path).map_err(|e| match e {
        Error::Usage(m) => Error::Usage(format!("{m} (diff compares packages and TOML inputs, named .toml)")),
        other => other,
    })?;
    Ok(Side {
        content_hash: Some(crate::seal::sha256_hex(&o.payload)),
        file_hash: Some(crate::seal::sha256_hex(&o.bytes)),
        payload: o.payload_json,
        kind: "package",
    })
}

/// The kind of quantity a value is, for its unit.
#[derive(Clone, Copy, PartialEq, Debug)]
enum Q {
    Length,
    Area,
    Stress,
    Moment,
    Density,
    Plain,
}

/// The kind of an input value, by its key (the last name in its path); every number
/// of an outline or a hole is a length.
fn input_quantity(path: &[Seg]) -> Q {
    if path.iter().any(|s| matches!(s, Seg::Key(k) if k == "outline" || k == "holes")) {
        return Q::Length;
    }
    let Some(key) = path.iter().rev().find_map(|s| match s {
        Seg::Key(k) => Some(k.as_str()),
        _ => None,
    }) else {
        return Q::Plain;
    };
    match key {
        "length"
        | "x"
        | "depth"
        | "depth_end"
        | "depth_harp"
        | "harp_x"
        | "harp_x2"
        | "diameter"
        | "debonded_length"
        | "thickness"
        | "width"
        | "x_center"
        | "height"
        | "flange_width"
        | "flange_thickness"
        | "web_width"
        | "ledge_width"
        | "ledge_height"
        | "stem_spacing"
        | "stem_width_top"
        | "stem_width_bottom"
        | "top_flange_width"
        | "top_flange_thickness"
        | "top_taper"
        | "bottom_flange_width"
        | "bottom_flange_thickness"
        | "bottom_taper"
        | "void_diameter"
        | "void_center_height" => Q::Length,
        "area" => Q::Area,
        "fc" | "ec" | "fr" | "fpu" | "fpy" | "fse" | "fpj" | "losses" | "fy" | "es" => Q::Stress,
        "mu" | "mnc" => Q::Moment,
        "wc" => Q::Density,
        _ => Q::Plain,
    }
}

fn system_of(p: &Value) -> System {
    match p.pointer("/units/system").and_then(Value::as_str) {
        Some("si") => System::Si,
        _ => System::Us,
    }
}

fn unit_name(q: Q, sys: System) -> Option<&'static str> {
    let u = sys.names();
    match (q, sys) {
        (Q::Length, _) => Some(u.length),
        (Q::Area, System::Us) => Some("in²"),
        (Q::Area, System::Si) => Some("mm²"),
        (Q::Stress, _) => Some(u.stress),
        (Q::Moment, _) => Some(u.moment),
        (Q::Density, System::Us) => Some("pcf"),
        (Q::Density, System::Si) => Some("kg/m³"),
        (Q::Plain, _) => None,
    }
}

/// A coherent input value in the unit it is shown in (kip-in to kip-ft, N-mm to kN-m;
/// lengths, areas, stresses and densities are shown in their coherent units).
fn shown_input(v: f64, q: Q, sys: System) -> f64 {
    match q {
        Q::Moment => v * sys.moment_shown(),
        _ => v,
    }
}

/// A path into a payload: keys, list places (from 1), list items named by a field.
#[derive(Clone, Debug)]
enum Seg {
    Key(String),
    At(usize),
    Named(String),
}

fn path_text(path: &[Seg]) -> String {
    let mut out = String::new();
    for s in path {
        match s {
            Seg::Key(k) => {
                if !out.is_empty() {
                    out.push('.');
                }
                out.push_str(k);
            }
            Seg::At(i) => out.push_str(&format!("[{i}]")),
            Seg::Named(n) => out.push_str(&format!("[{n:?}]")),
        }
    }
    out
}

/// The field that names the items of a list, by the list's key.
fn naming_field(path: &[Seg]) -> Option<&'static str> {
    match path.last() {
        Some(Seg::Key(k)) => match k.as_str() {
            "locations" => Some("name"),
            "defaults" => Some("key"),
            "signoffs" => Some("role"),
            "revisions" => Some("rev"),
            _ => None,
        },
        _ => None,
    }
}

/// The names of a list's items by a field, if every item has one and no two share it.
fn names_by<'a>(xs: &'a [Value], field: &str) -> Option<Vec<&'a str>> {
    let names: Vec<&str> = xs.iter().map(|x| x.get(field).and_then(Value::as_str)).collect::<Option<_>>()?;
    let mut sorted = names.clone();
    sorted.sort_unstable();
    sorted.dedup();
    (sorted.len() == names.len()).then_some(names)
}

/// One difference: where, and the values before and after (`Null` where absent).
struct Change {
    path: Vec<Seg>,
    before: Value,
    after: Value,
}

fn leaf_changes(path: &mut Vec<Seg>, a: &Value, b: &Value, out: &mut Vec<Change>) {
    match (a, b) {
        (Value::Object(x), Value::Object(y)) => {
            let mut keys: Vec<&String> = x.keys().chain(y.keys()).collect();
            keys.sort();
            keys.dedup();
            for k in keys {
                path.push(Seg::Key(k.clone()));
                leaf_changes(path, x.get(k).unwrap_or(&Value::Null), y.get(k).unwrap_or(&Value::Null), out);
                path.pop();
            }
        }
        (Value::Array(x), Value::Array(y)) => {
            let named = naming_field(path).and_then(|f| Some((names_by(x, f)?, names_by(y, f)?)));
            if let Some((nx, ny)) = named {
                // matched by name: changed items in the new order, then the removed ones
                for (j, n) in ny.iter().enumerate() {
                    path.push(Seg::Named(n.to_string()));
                    match nx.iter().position(|m| m == n) {
                        Some(i) => leaf_changes(path, &x[i], &y[j], out),
                        None => out.push(Change { path: path.clone(), before: Value::Null, after: y[j].clone() }),
                    }
                    path.pop();
                }
                for (i, n) in nx.iter().enumerate().filter(|(_, n)| !ny.contains(n)) {
                    path.push(Seg::Named(n.to_string()));
                    out.push(Change { path: path.clone(), before: x[i].clone(), after: Value::Null });
                    path.pop();
                }
            } else {
                // by place (layers, points): the common part, then what is added or removed
                for i in 0..x.len().max(y.len()) {
                    path.push(Seg::At(i + 1));
                    match (x.get(i), y.get(i)) {
                        (Some(p), Some(q)) => leaf_changes(path, p, q, out),
                        (p, q) => out.push(Change {
                            path: path.clone(),
                            before: p.cloned().unwrap_or(Value::Null),
                            after: q.cloned().unwrap_or(Value::Null),
                        }),
                    }
                    path.pop();
                }
            }
        }
        _ if a != b => out.push(Change { path: path.clone(), before: a.clone(), after: b.clone() }),
        _ => {}
    }
}

/// An input value in the unit it is shown in: numbers converted, the numbers of an
/// added or removed item too.
fn shown_value(v: &Value, path: &mut Vec<Seg>, sys: System) -> Value {
    match v {
        Value::Number(n) => {
            let q = input_quantity(path);
            let integer = n.is_i64() || n.is_u64();
            match n.as_f64() {
                // counts stay integers; every other number is shown in its unit
                Some(x) if !integer || q != Q::Plain => json!(tidy(shown_input(x, q, sys))),
                _ => v.clone(),
            }
        }
        Value::Object(m) => {
            let mut out = Map::new();
            for (k, x) in m {
                path.push(Seg::Key(k.clone()));
                out.insert(k.clone(), shown_value(x, path, sys));
                path.pop();
            }
            Value::Object(out)
        }
        Value::Array(xs) => Value::Array(
            xs.iter()
                .enumerate()
                .map(|(i, x)| {
                    path.push(Seg::At(i + 1));
                    let r = shown_value(x, path, sys);
                    path.pop();
                    r
                })
                .collect(),
        ),
        other => other.clone(),
    }
}

/// A converted value rounded to 10 significant figures, so that 5040 kip-in / 12 is
/// 420 kip-ft and not 420.00000000000006.
fn tidy(v: f64) -> f64 {
    if !v.is_finite() || v == 0.0 {
        return v;
    }
    format!("{v:.9e}").parse().unwrap_or(v)
}

/// A number in full (up to ten figures), as an input holds it.
fn full(v: f64) -> String {
    let t = tidy(v);
    if t.abs() >= 1e15 || (t != 0.0 && t.abs() < 1e-6) { format!("{t:e}") } else { format!("{t}") }
}

fn changes_json(changes: &[Change], old_sys: System, new_sys: System) -> Vec<Value> {
    changes
        .iter()
        .map(|c| {
            let mut p = c.path.clone();
            let q = input_quantity(&p);
            let unit = |sys| if c.before.is_number() || c.after.is_number() { unit_name(q, sys) } else { None };
            json!({
                "key": path_text(&c.path),
                "before": shown_value(&c.before, &mut p, old_sys),
                "after": shown_value(&c.after, &mut p, new_sys),
                "unit": unit(new_sys),
                "unit_before": unit(old_sys),
            })
        })
        .collect()
}

/// The stress of the extreme strand layer that is active.
fn extreme_fps(loc: &Value) -> Option<f64> {
    loc["strands"]
        .as_array()?
        .iter()
        .filter(|l| l["active"].as_bool().unwrap_or(false))
        .max_by(|a, b| a["depth"].as_f64().unwrap_or(0.0).total_cmp(&b["depth"].as_f64().unwrap_or(0.0)))
        .and_then(|l| l["stress"].as_f64())
}

/// The results of a location compared (already in the units they are shown in): name,
/// label, kind, value.
fn results(loc: &Value) -> Vec<(&'static str, &'static str, Q, Option<f64>)> {
    vec![
        ("c", "c", Q::Length, loc["c"].as_f64()),
        ("fps", "fps", Q::Stress, extreme_fps(loc)),
        ("mn", "Mn", Q::Moment, loc["mn"].as_f64()),
        ("phi", "phi", Q::Plain, loc["phi"].as_f64()),
        ("phi_mn", "phi Mn", Q::Moment, loc["phi_mn"].as_f64()),
        ("mu", "Mu", Q::Moment, loc["mu"].as_f64()),
        ("ratio", "Mu/phi Mn", Q::Plain, loc["ratio"].as_f64()),
        ("mcr", "Mcr", Q::Moment, loc["mcr"].as_f64()),
        ("min_required", "1.2 Mcr", Q::Moment, loc.pointer("/min_reinforcement/required").and_then(Value::as_f64)),
    ]
}

fn status(loc: &Value) -> Value {
    match loc["pass"].as_bool() {
        Some(true) => json!("pass"),
        Some(false) => json!("FAIL"),
        None => Value::Null,
    }
}

fn location_results(before: Option<&Value>, after: &Value, old_sys: System, new_sys: System) -> Vec<Value> {
    let b = before.map(results);
    let mut out: Vec<Value> = results(after)
        .into_iter()
        .enumerate()
        .map(|(i, (k, label, q, y))| {
            let x = b.as_ref().and_then(|r| r[i].3);
            let change = match (x, y) {
                (Some(x), Some(y)) if x != 0.0 && old_sys == new_sys => Some((y - x) / x.abs() * 100.0),
                _ => None,
            };
            json!({
                "quantity": k,
                "label": label,
                "unit": unit_name(q, new_sys),
                "before": x,
                "after": y,
                "changed": x != y,
                "change_percent": change,
            })
        })
        .collect();
    let (sb, sa) = (before.map(status).unwrap_or(Value::Null), status(after));
    out.push(json!({
        "quantity": "status",
        "label": "status",
        "unit": null,
        "before": sb,
        "after": sa,
        "changed": sb != sa,
        "change_percent": null,
    }));
    out
}

fn members_of(p: &Value) -> Vec<&Value> {
    p["members"].as_array().map(|ms| ms.iter().collect()).unwrap_or_default()
}

fn id_of(m: &Value) -> String {
    match &m["id"] {
        Value::String(s) => s.clone(),
        other => other.to_string(),
    }
}

/// The differences between two payloads, as JSON (format 2: values in the units they
/// are shown in, each with its unit).
pub fn diff(old: &Value, new: &Value) -> Value {
    let (os, ns) = (system_of(old), system_of(new));
    let mut package = Vec::new();
    leaf_changes(&mut Vec::new(), &old["package"], &new["package"], &mut package);
    let (om, nm) = (members_of(old), members_of(new));
    let old_ids: Vec<String> = om.iter().map(|m| id_of(m)).collect();
    let new_ids: Vec<String> = nm.iter().map(|m| id_of(m)).collect();
    let added: Vec<&String> = new_ids.iter().filter(|i| !old_ids.contains(i)).collect();
    let removed: Vec<&String> = old_ids.iter().filter(|i| !new_ids.contains(i)).collect();
    let mut members = Vec::new();
    for (j, id) in new_ids.iter().enumerate() {
        let Some(i) = old_ids.iter().position(|x| x == id) else { continue };
        let (a, b) = (om[i], nm[j]);
        let mut inputs = Vec::new();
        leaf_changes(&mut vec![], &a["input"], &b["input"], &mut inputs);
        let locs = |m: &Value| m["locations"].as_array().cloned().unwrap_or_default();
        let (la, lb) = (locs(a), locs(b));
        let name = |l: &Value| l["name"].as_str().unwrap_or("").to_string();
        let mut locations = Vec::new();
        for l in &lb {
            let before = la.iter().find(|x| name(x) == name(l));
            let results = location_results(before, l, os, ns);
            locations.push(json!({
                "name": name(l),
                "new": before.is_none(),
                "changed": before.is_none() || results.iter().any(|r| r["changed"] == true),
                "results": results,
            }));
        }
        let dropped: Vec<String> = la.iter().map(name).filter(|n| !lb.iter().any(|y| name(y) == *n)).collect();
        members.push(json!({
            "id": id,
            "inputs_changed": changes_json(&inputs, os, ns),
            "locations": locations,
            "locations_removed": dropped,
        }));
    }
    let side = |p: &Value| {
        json!({
            "revision": p["package"]["revision"],
            "version": p["program"]["version"],
            "input_sha256": p["input"]["sha256"],
            "units": p["units"]["system"],
            "draft": p["package"]["draft"],
        })
    };
    json!({
        "format": 2,
        "old": side(old),
        "new": side(new),
        "input_changed": old["input"]["sha256"] != new["input"]["sha256"],
        "units_changed": os != ns,
        "package_changed": changes_json(&package, os, ns),
        "members_added": added,
        "members_removed": removed,
        "members": members,
    })
}

/// [`diff`] of two sides, with what each was read from and its two hashes (content hash
/// of the payload, file hash of the PDF) for a package.
pub fn compare(old: &Side, new: &Side) -> Value {
    let mut d = diff(&old.payload, &new.payload);
    for (k, s) in [("old", old), ("new", new)] {
        if let Some(o) = d[k].as_object_mut() {
            o.insert("kind".into(), json!(s.kind));
            o.insert("content_hash_payload".into(), json!(s.content_hash));
            o.insert("file_hash_pdf".into(), json!(s.file_hash));
        }
    }
    d
}

fn text(v: &Value) -> String {
    match v {
        Value::String(t) => t.clone(),
        Value::Null => "—".into(),
        other => other.to_string(),
    }
}

/// An input value for the table: a number in full with its unit, an item as its
/// fields.
fn input_text(v: &Value, unit: &Value) -> String {
    let t = match v {
        Value::Number(n) => {
            let s = n.as_f64().map(full).unwrap_or_else(|| n.to_string());
            match unit.as_str() {
                Some(u) => format!("{s} {u}"),
                None => s,
            }
        }
        Value::Object(m) => {
            let parts: Vec<String> = m.iter().map(|(k, x)| format!("{k} = {}", input_text(x, &Value::Null))).collect();
            format!("{{{}}}", parts.join(", "))
        }
        Value::Array(xs) => {
            format!("[{}]", xs.iter().map(|x| input_text(x, &Value::Null)).collect::<Vec<_>>().join(", "))
        }
        other => text(other),
    };
    if t.chars().count() > 60 { format!("{}…", t.chars().take(59).collect::<String>()) } else { t }
}

/// A result for the table: about four figures, or in full where the two would read the
/// same.
fn result_texts(r: &Value) -> (String, String) {
    let one = |v: &Value, fine: bool| match v {
        Value::Number(n) => {
            let x = n.as_f64().unwrap_or(f64::NAN);
            let s = if fine { full(x) } else { crate::trace::show(x) };
            match r["unit"].as_str() {
                Some(u) => format!("{s} {u}"),
                None => s,
            }
        }
        other => text(other),
    };
    let (a, b) = (one(&r["before"], false), one(&r["after"], false));
    if a == b && r["changed"] == true { (one(&r["before"], true), one(&r["after"], true)) } else { (a, b) }
}

fn hash_line(out: &mut String, label: &str, key: &str, d: &Value) {
    let (a, b) = (&d["old"][key], &d["new"][key]);
    if a.is_null() && b.is_null() {
        return;
    }
    let t = |v: &Value| v.as_str().map_or("— (a TOML input)".to_string(), str::to_string);
    let same = if a == b { " (the same)" } else { "" };
    out.push_str(&format!("{label}: {} -> {}{same}\n", t(a), t(b)));
}

/// The differences as a readable table: only what changed, in the package's units.
pub fn table(d: &Value) -> String {
    let mut out = String::new();
    out.push_str(&format!(
        "revision {} -> {} (program {} -> {}); input {}\n",
        text(&d["old"]["revision"]),
        text(&d["new"]["revision"]),
        text(&d["old"]["version"]),
        text(&d["new"]["version"]),
        if d["input_changed"].as_bool().unwrap_or(false) { "changed" } else { "unchanged" }
    ));
    hash_line(&mut out, "content hash (payload)", "content_hash_payload", d);
    hash_line(&mut out, "file hash (PDF)", "file_hash_pdf", d);
    if d["units_changed"] == true {
        out.push_str(&format!(
            "units: {} -> {} (each side's values in its own units)\n",
            text(&d["old"]["units"]),
            text(&d["new"]["units"])
        ));
    }
    let change_line = |out: &mut String, lead: &str, c: &Value| {
        let (b, a) = (&c["before"], &c["after"]);
        let key = text(&c["key"]);
        if b.is_null() && !a.is_null() && (a.is_object() || a.is_array()) {
            out.push_str(&format!("{lead}{key} added: {}\n", input_text(a, &c["unit"])));
        } else if a.is_null() && !b.is_null() && (b.is_object() || b.is_array()) {
            out.push_str(&format!("{lead}{key} removed: {}\n", input_text(b, &c["unit_before"])));
        } else {
            out.push_str(&format!(
                "{lead}{key}: {} -> {}\n",
                input_text(b, &c["unit_before"]),
                input_text(a, &c["unit"])
            ));
        }
    };
    if let Some(ch) = d["package_changed"].as_array().filter(|a| !a.is_empty()) {
        out.push_str("package:\n");
        for c in ch {
            change_line(&mut out, "  ", c);
        }
    }
    let list = |v: &Value| {
        v.as_array()
            .map(|a| a.iter().map(text).collect::<Vec<_>>().join(", "))
            .filter(|t| !t.is_empty())
            .unwrap_or_else(|| "none".into())
    };
    out.push_str(&format!("members added: {}; removed: {}\n", list(&d["members_added"]), list(&d["members_removed"])));
    for m in d["members"].as_array().into_iter().flatten() {
        let inputs = m["inputs_changed"].as_array().map_or(&[][..], |v| v.as_slice());
        let removed = m["locations_removed"].as_array().map_or(&[][..], |v| v.as_slice());
        let changed: Vec<&Value> =
            m["locations"].as_array().into_iter().flatten().filter(|l| l["changed"] == true).collect();
        if inputs.is_empty() && removed.is_empty() && changed.is_empty() {
            continue;
        }
        out.push_str(&format!("\nmember {}\n", text(&m["id"])));
        for c in inputs {
            change_line(&mut out, "  input ", c);
        }
        for n in removed {
            out.push_str(&format!("  location {:?} removed\n", text(n)));
        }
        for l in &changed {
            let new = l["new"].as_bool().unwrap_or(false);
            out.push_str(&format!("  location {:?}{}\n", text(&l["name"]), if new { " (new)" } else { "" }));
            for r in l["results"].as_array().into_iter().flatten().filter(|r| new || r["changed"] == true) {
                let (b, a) = result_texts(r);
                let pc = match r["change_percent"].as_f64() {
                    Some(c) if c.abs() < 0.005 => "  (0.00 %)".to_string(),
                    Some(c) => format!("  ({c:+.2} %)"),
                    None => String::new(),
                };
                if new {
                    out.push_str(&format!("    {:<10} {a}\n", text(&r["label"])));
                } else {
                    out.push_str(&format!("    {:<10} {b} -> {a}{pc}\n", text(&r["label"])));
                }
            }
        }
        if changed.is_empty() && removed.is_empty() {
            out.push_str("  results unchanged at every location\n");
        }
    }
    let nonempty = |v: &Value| v.as_array().is_some_and(|a| !a.is_empty());
    let any = nonempty(&d["package_changed"])
        || nonempty(&d["members_added"])
        || nonempty(&d["members_removed"])
        || d["members"].as_array().into_iter().flatten().any(|m| {
            nonempty(&m["inputs_changed"])
                || nonempty(&m["locations_removed"])
                || m["locations"].as_array().into_iter().flatten().any(|l| l["changed"] == true)
        });
    if !any {
        out.push_str(if d["input_changed"] == true {
            "the input's text differs, but no value read from it and no result does\n"
        } else {
            "no input or result differs\n"
        });
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn input_moments_are_shown_in_their_unit() {
        let old = json!({"units": {"system": "us"}, "package": {}, "input": {"sha256": "a"}, "program": {},
            "members": [{"id": "B", "input": {"locations": [{"name": "mid", "mu": 5040.0}], "strands": [{"fse": 160.0}]}, "locations": []}]});
        let mut new = old.clone();
        new["members"][0]["input"]["locations"][0]["mu"] = json!(6720.0);
        let d = diff(&old, &new);
        let c = &d["members"][0]["inputs_changed"][0];
        assert_eq!(c["key"], "locations[\"mid\"].mu");
        assert_eq!(
            (c["before"].as_f64(), c["after"].as_f64(), c["unit"].as_str()),
            (Some(420.0), Some(560.0), Some("kip-ft"))
        );
        assert!(table(&d).contains("locations[\"mid\"].mu: 420 kip-ft -> 560 kip-ft"), "{}", table(&d));
    }
}
