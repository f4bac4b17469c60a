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
//! this process, as `check` does. Both are read as [`Stored`], the payload's own
//! structs; the parsed input and the package's data are compared value by value.

use crate::error::{Error, Result};
use crate::report::payload::{self, LocationRecord, MemberRecord, Stored};
use crate::units::System;
use serde::Serialize;
use serde_json::{Map, Value, json};
use std::path::Path;

/// One side of a comparison: a payload, and what it was read from.
pub struct Side {
    pub payload: Stored,
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
        let bytes = super::files::read_regular(path, crate::input::MAX_FILE_BYTES, "the input")?;
        let src = crate::input::from_bytes(path.display().to_string(), bytes)?;
        let pkg = crate::input::parse(&src)?;
        let a = crate::analysis::analyze(&pkg, false)?;
        let built = payload::build(&pkg, &src, &a, &payload::Provenance { templates: "builtin" });
        // a package's payload is read back from its JSON text, and reading a float back
        // may differ from the value written in its last bit: go the same way
        let payload = built
            .canonical()
            .and_then(|b| serde_json::from_slice(&b).map_err(|e| Error::Usage(e.to_string())))
            .map_err(|e| Error::Usage(format!("{}: the analysis could not be read back ({e})", path.display())))?;
        return Ok(Side { payload, kind: "input", content_hash: None, file_hash: None });
    }
    let o = super::attached::open(path).map_err(|e| match e {
        Error::Usage(m) => Error::Usage(format!("{m} (diff compares packages and TOML inputs, named .toml)")),
        other => other,
    })?;
    let payload = o.stored.map_err(|e| Error::Usage(format!("{}: {e}", path.display())))?;
    Ok(Side {
        content_hash: Some(super::sha256_hex(&o.payload)),
        file_hash: Some(super::sha256_hex(&o.bytes)),
        payload,
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

/// The differences between two sides (format 2: values in the units they are shown in,
/// each with its unit).
#[derive(Serialize)]
pub struct Diff {
    pub format: u32,
    pub old: SideShown,
    pub new: SideShown,
    /// The input's text differs.
    pub input_changed: bool,
    pub units_changed: bool,
    pub package_changed: Vec<ChangeRow>,
    pub members_added: Vec<String>,
    pub members_removed: Vec<String>,
    /// The members on both sides, in the new order.
    pub members: Vec<MemberDiff>,
}

/// What a side is: its revision, version, input, units, whether a draft, what it was
/// read from and its two hashes (for a package).
#[derive(Serialize)]
pub struct SideShown {
    pub revision: String,
    pub version: String,
    pub input_sha256: String,
    pub units: String,
    pub draft: bool,
    pub kind: &'static str,
    pub content_hash_payload: Option<String>,
    pub file_hash_pdf: Option<String>,
}

/// A value changed, added (before is null) or removed (after is null), in its unit.
#[derive(Serialize)]
pub struct ChangeRow {
    pub key: String,
    pub before: Value,
    pub after: Value,
    pub unit: Option<&'static str>,
    pub unit_before: Option<&'static str>,
}

/// A member on both sides: its inputs changed and its locations.
#[derive(Serialize)]
pub struct MemberDiff {
    pub id: String,
    pub inputs_changed: Vec<ChangeRow>,
    pub locations: Vec<LocationDiff>,
    pub locations_removed: Vec<String>,
}

/// A location of the new side: whether it is new or its results changed, and its
/// results before and after.
#[derive(Serialize)]
pub struct LocationDiff {
    pub name: String,
    pub new: bool,
    pub changed: bool,
    pub results: Vec<ResultRow>,
}

/// A result before and after.
#[derive(Serialize)]
pub struct ResultRow {
    pub quantity: &'static str,
    pub label: &'static str,
    pub unit: Option<&'static str>,
    pub before: Option<Reading>,
    pub after: Option<Reading>,
    pub changed: bool,
    pub change_percent: Option<f64>,
}

/// A result's value: a number, or a word (the status).
#[derive(Serialize, Clone, Copy, PartialEq, Debug)]
#[serde(untagged)]
pub enum Reading {
    Number(f64),
    Word(&'static str),
}

/// The values of an input change in their units, as a row.
fn change_rows(changes: &[Change], old_sys: System, new_sys: System) -> Vec<ChangeRow> {
    changes
        .iter()
        .map(|c| {
            let mut p = c.path.clone();
            let q = input_quantity(&p);
            let unit = |sys| if c.before.is_number() || c.after.is_number() { unit_name(q, sys) } else { None };
            ChangeRow {
                key: path_text(&c.path),
                before: shown_value(&c.before, &mut p, old_sys),
                after: shown_value(&c.after, &mut p, new_sys),
                unit: unit(new_sys),
                unit_before: unit(old_sys),
            }
        })
        .collect()
}

/// The results of a location compared (already in the units they are shown in): name,
/// label, kind, value.
fn results(loc: &LocationRecord) -> [(&'static str, &'static str, Q, Option<f64>); 9] {
    [
        ("c", "c", Q::Length, loc.c),
        ("fps", "fps", Q::Stress, loc.extreme_fps()),
        ("mn", "Mn", Q::Moment, loc.mn),
        ("phi", "phi", Q::Plain, loc.phi),
        ("phi_mn", "phi Mn", Q::Moment, loc.phi_mn),
        ("mu", "Mu", Q::Moment, loc.mu),
        ("ratio", "Mu/phi Mn", Q::Plain, loc.ratio),
        ("mcr", "Mcr", Q::Moment, loc.mcr),
        ("min_required", "1.2 Mcr", Q::Moment, loc.min_reinforcement.required),
    ]
}

fn status(loc: &LocationRecord) -> Reading {
    Reading::Word(if loc.pass { "pass" } else { "FAIL" })
}

fn location_results(
    before: Option<&LocationRecord>,
    after: &LocationRecord,
    old: System,
    new: System,
) -> Vec<ResultRow> {
    let b = before.map(results);
    let mut out: Vec<ResultRow> = results(after)
        .into_iter()
        .enumerate()
        .map(|(i, (quantity, label, q, y))| {
            let x = b.as_ref().and_then(|r| r[i].3);
            let change_percent = match (x, y) {
                (Some(x), Some(y)) if x != 0.0 && old == new => Some((y - x) / x.abs() * 100.0),
                _ => None,
            };
            let (before, after) = (x.map(Reading::Number), y.map(Reading::Number));
            ResultRow { quantity, label, unit: unit_name(q, new), before, after, changed: x != y, change_percent }
        })
        .collect();
    let (sb, sa) = (before.map(status), Some(status(after)));
    out.push(ResultRow {
        quantity: "status",
        label: "status",
        unit: None,
        before: sb,
        after: sa,
        changed: sb != sa,
        change_percent: None,
    });
    out
}

/// A member on both sides compared: its inputs, and its locations matched by name.
fn member_diff(a: &MemberRecord, b: &MemberRecord, os: System, ns: System) -> MemberDiff {
    let mut inputs = Vec::new();
    leaf_changes(&mut vec![], &a.input, &b.input, &mut inputs);
    let locations = b
        .locations
        .iter()
        .map(|l| {
            let before = a.locations.iter().find(|x| x.name == l.name);
            let results = location_results(before, l, os, ns);
            LocationDiff {
                name: l.name.clone(),
                new: before.is_none(),
                changed: before.is_none() || results.iter().any(|r| r.changed),
                results,
            }
        })
        .collect();
    let removed =
        a.locations.iter().filter(|x| !b.locations.iter().any(|y| y.name == x.name)).map(|x| x.name.clone()).collect();
    MemberDiff { id: b.id.clone(), inputs_changed: change_rows(&inputs, os, ns), locations, locations_removed: removed }
}

fn side_shown(s: &Side) -> SideShown {
    let h = &s.payload.head;
    SideShown {
        revision: h.package.revision.clone(),
        version: h.program.version.clone(),
        input_sha256: h.input.sha256.clone(),
        units: h.units.system.clone(),
        draft: h.package.draft,
        kind: s.kind,
        content_hash_payload: s.content_hash.clone(),
        file_hash_pdf: s.file_hash.clone(),
    }
}

/// The differences between two sides.
pub fn compare(old: &Side, new: &Side) -> Diff {
    let (o, n) = (&old.payload, &new.payload);
    let (os, ns) = (o.head.units.system(), n.head.units.system());
    let value = |p: &payload::PackageShown| serde_json::to_value(p).unwrap_or(Value::Null);
    let mut package = Vec::new();
    leaf_changes(&mut Vec::new(), &value(&o.head.package), &value(&n.head.package), &mut package);
    let has = |p: &Stored, id: &str| p.members.iter().any(|m| m.id == id);
    let members = n
        .members
        .iter()
        .filter_map(|b| o.members.iter().find(|a| a.id == b.id).map(|a| member_diff(a, b, os, ns)))
        .collect();
    Diff {
        format: 2,
        old: side_shown(old),
        new: side_shown(new),
        input_changed: o.head.input.sha256 != n.head.input.sha256,
        units_changed: os != ns,
        package_changed: change_rows(&package, os, ns),
        members_added: n.members.iter().filter(|m| !has(o, &m.id)).map(|m| m.id.clone()).collect(),
        members_removed: o.members.iter().filter(|m| !has(n, &m.id)).map(|m| m.id.clone()).collect(),
        members,
    }
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
fn input_text(v: &Value, unit: Option<&str>) -> String {
    let t = match v {
        Value::Number(n) => {
            let s = n.as_f64().map(full).unwrap_or_else(|| n.to_string());
            match unit {
                Some(u) => format!("{s} {u}"),
                None => s,
            }
        }
        Value::Object(m) => {
            let parts: Vec<String> = m.iter().map(|(k, x)| format!("{k} = {}", input_text(x, None))).collect();
            format!("{{{}}}", parts.join(", "))
        }
        Value::Array(xs) => format!("[{}]", xs.iter().map(|x| input_text(x, None)).collect::<Vec<_>>().join(", ")),
        other => text(other),
    };
    if t.chars().count() > 60 { format!("{}…", t.chars().take(59).collect::<String>()) } else { t }
}

/// A result for the table: about four figures, or in full where the two would read the
/// same.
fn result_texts(r: &ResultRow) -> (String, String) {
    let one = |v: Option<Reading>, fine: bool| match v {
        Some(Reading::Number(x)) => {
            let s = if fine { full(x) } else { crate::trace::show(x) };
            match r.unit {
                Some(u) => format!("{s} {u}"),
                None => s,
            }
        }
        Some(Reading::Word(w)) => w.to_string(),
        None => "—".into(),
    };
    let (a, b) = (one(r.before, false), one(r.after, false));
    if a == b && r.changed { (one(r.before, true), one(r.after, true)) } else { (a, b) }
}

fn hash_line(out: &mut String, label: &str, old: &Option<String>, new: &Option<String>) {
    if old.is_none() && new.is_none() {
        return;
    }
    let t = |v: &Option<String>| v.clone().unwrap_or_else(|| "— (a TOML input)".to_string());
    let same = if old == new { " (the same)" } else { "" };
    out.push_str(&format!("{label}: {} -> {}{same}\n", t(old), t(new)));
}

/// A line of the table for an input changed, added or removed.
fn change_line(out: &mut String, lead: &str, c: &ChangeRow) {
    let (b, a) = (&c.before, &c.after);
    let key = &c.key;
    if b.is_null() && (a.is_object() || a.is_array()) {
        out.push_str(&format!("{lead}{key} added: {}\n", input_text(a, c.unit)));
    } else if a.is_null() && (b.is_object() || b.is_array()) {
        out.push_str(&format!("{lead}{key} removed: {}\n", input_text(b, c.unit_before)));
    } else {
        out.push_str(&format!("{lead}{key}: {} -> {}\n", input_text(b, c.unit_before), input_text(a, c.unit)));
    }
}

/// The lines of the table for a location: its changed results (all of a new one's).
fn location_lines(out: &mut String, l: &LocationDiff) {
    out.push_str(&format!("  location {:?}{}\n", l.name, if l.new { " (new)" } else { "" }));
    for r in l.results.iter().filter(|r| l.new || r.changed) {
        let (b, a) = result_texts(r);
        if l.new {
            out.push_str(&format!("    {:<10} {a}\n", r.label));
            continue;
        }
        let pc = match r.change_percent {
            Some(c) if c.abs() < 0.005 => "  (0.00 %)".to_string(),
            Some(c) => format!("  ({c:+.2} %)"),
            None => String::new(),
        };
        out.push_str(&format!("    {:<10} {b} -> {a}{pc}\n", r.label));
    }
}

impl MemberDiff {
    /// Whether anything of the member differs.
    fn differs(&self) -> bool {
        !self.inputs_changed.is_empty()
            || !self.locations_removed.is_empty()
            || self.locations.iter().any(|l| l.changed)
    }
}

/// The lines of the table for a member, if anything of it differs.
fn member_lines(out: &mut String, m: &MemberDiff) {
    if !m.differs() {
        return;
    }
    out.push_str(&format!("\nmember {}\n", m.id));
    for c in &m.inputs_changed {
        change_line(out, "  input ", c);
    }
    for n in &m.locations_removed {
        out.push_str(&format!("  location {n:?} removed\n"));
    }
    let changed: Vec<&LocationDiff> = m.locations.iter().filter(|l| l.changed).collect();
    for l in &changed {
        location_lines(out, l);
    }
    if changed.is_empty() && m.locations_removed.is_empty() {
        out.push_str("  results unchanged at every location\n");
    }
}

/// The differences as a readable table: only what changed, in the package's units.
pub fn table(d: &Diff) -> String {
    let mut out = format!(
        "revision {} -> {} (program {} -> {}); input {}\n",
        d.old.revision,
        d.new.revision,
        d.old.version,
        d.new.version,
        if d.input_changed { "changed" } else { "unchanged" }
    );
    hash_line(&mut out, "content hash (payload)", &d.old.content_hash_payload, &d.new.content_hash_payload);
    hash_line(&mut out, "file hash (PDF)", &d.old.file_hash_pdf, &d.new.file_hash_pdf);
    if d.units_changed {
        out.push_str(&format!("units: {} -> {} (each side's values in its own units)\n", d.old.units, d.new.units));
    }
    if !d.package_changed.is_empty() {
        out.push_str("package:\n");
        for c in &d.package_changed {
            change_line(&mut out, "  ", c);
        }
    }
    let list = |ids: &[String]| if ids.is_empty() { "none".to_string() } else { ids.join(", ") };
    out.push_str(&format!("members added: {}; removed: {}\n", list(&d.members_added), list(&d.members_removed)));
    for m in &d.members {
        member_lines(&mut out, m);
    }
    let any = !d.package_changed.is_empty()
        || !d.members_added.is_empty()
        || !d.members_removed.is_empty()
        || d.members.iter().any(MemberDiff::differs);
    if !any {
        out.push_str(if d.input_changed {
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

    fn side(text: &str) -> Side {
        let src = crate::input::Source { name: "b.toml".into(), text: text.into() };
        let pkg = crate::input::parse(&src).unwrap();
        let a = crate::analysis::analyze(&pkg, false).unwrap();
        let built = payload::build(&pkg, &src, &a, &payload::Provenance { templates: "builtin" });
        let payload = serde_json::from_slice(&built.canonical().unwrap()).unwrap();
        Side { payload, kind: "input", content_hash: None, file_hash: None }
    }

    #[test]
    fn input_moments_are_shown_in_their_unit() {
        let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/inverted-tee-girder.toml");
        let text = std::fs::read_to_string(path).unwrap();
        let mu = text.lines().find(|l| l.starts_with("mu = ")).unwrap();
        let old = side(&text);
        let new = side(&text.replacen(mu, "mu = \"560 kip-ft\"", 1));
        let d = compare(&old, &new);
        let c = d.members.iter().flat_map(|m| &m.inputs_changed).find(|c| c.key.ends_with("mu")).unwrap();
        assert_eq!((c.after.as_f64(), c.unit), (Some(560.0), Some("kip-ft")), "{}", table(&d));
        assert!(table(&d).contains(&format!("{}: ", c.key)) && table(&d).contains("-> 560 kip-ft"), "{}", table(&d));
    }
}
