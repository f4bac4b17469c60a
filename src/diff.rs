//! `diff`: what changed between two issued packages, read from their attached payloads:
//! the package data, the inputs of each member, members added or removed, and the key
//! results of every check location before and after.

use serde_json::{Value, json};

fn s(v: &Value) -> String {
    match v {
        Value::String(t) => t.clone(),
        Value::Null => "—".into(),
        other => other.to_string(),
    }
}

/// Leaf paths where two JSON values differ: (path, old, new).
fn leaf_changes(path: &str, a: &Value, b: &Value, out: &mut Vec<(String, Value, Value)>) {
    match (a, b) {
        (Value::Object(x), Value::Object(y)) => {
            let mut keys: Vec<&String> = x.keys().chain(y.keys()).collect();
            keys.sort();
            keys.dedup();
            for k in keys {
                let p = if path.is_empty() { k.clone() } else { format!("{path}.{k}") };
                leaf_changes(&p, x.get(k).unwrap_or(&Value::Null), y.get(k).unwrap_or(&Value::Null), out);
            }
        }
        (Value::Array(x), Value::Array(y)) if x.len() == y.len() => {
            for (i, (p, q)) in x.iter().zip(y).enumerate() {
                leaf_changes(&format!("{path}[{}]", i + 1), p, q, out);
            }
        }
        (Value::Array(x), Value::Array(y)) => {
            // a list that grew or shrank: compare the common part, then name the rest
            for (i, (p, q)) in x.iter().zip(y).enumerate() {
                leaf_changes(&format!("{path}[{}]", i + 1), p, q, out);
            }
            for (i, extra) in x.iter().enumerate().skip(y.len()) {
                out.push((format!("{path}[{}]", i + 1), extra.clone(), Value::Null));
            }
            for (i, extra) in y.iter().enumerate().skip(x.len()) {
                out.push((format!("{path}[{}]", i + 1), Value::Null, extra.clone()));
            }
        }
        _ if a != b => out.push((path.to_string(), a.clone(), b.clone())),
        _ => {}
    }
}

fn extreme_fps(loc: &Value) -> Option<f64> {
    loc["strands"]
        .as_array()?
        .iter()
        .filter(|l| l["active"].as_bool().unwrap_or(false))
        .max_by(|a, b| a["depth"].as_f64().unwrap_or(0.0).total_cmp(&b["depth"].as_f64().unwrap_or(0.0)))
        .and_then(|l| l["stress"].as_f64())
}

fn key_results(loc: &Value) -> Vec<(&'static str, Option<f64>)> {
    vec![
        ("c", loc["c"].as_f64()),
        ("fps", extreme_fps(loc)),
        ("mn", loc["mn"].as_f64()),
        ("phi_mn", loc["phi_mn"].as_f64()),
        ("ratio", loc["ratio"].as_f64()),
    ]
}

/// The differences as JSON.
pub fn diff(old: &Value, new: &Value) -> Value {
    let mut package = Vec::new();
    leaf_changes("", &old["package"], &new["package"], &mut package);
    let ids = |p: &Value| -> Vec<String> {
        p["members"].as_array().map(|ms| ms.iter().map(|m| s(&m["id"])).collect()).unwrap_or_default()
    };
    let (old_ids, new_ids) = (ids(old), ids(new));
    let added: Vec<&String> = new_ids.iter().filter(|i| !old_ids.contains(i)).collect();
    let removed: Vec<&String> = old_ids.iter().filter(|i| !new_ids.contains(i)).collect();
    let find =
        |p: &Value, id: &str| p["members"].as_array().and_then(|ms| ms.iter().find(|m| s(&m["id"]) == id).cloned());
    let mut members = Vec::new();
    for id in old_ids.iter().filter(|i| new_ids.contains(i)) {
        let (Some(a), Some(b)) = (find(old, id), find(new, id)) else { continue };
        let mut inputs = Vec::new();
        leaf_changes("", &a["input"], &b["input"], &mut inputs);
        let locs = |m: &Value| m["locations"].as_array().cloned().unwrap_or_default();
        let (la, lb) = (locs(&a), locs(&b));
        let mut locations = Vec::new();
        for l in &lb {
            let name = s(&l["name"]);
            let before = la.iter().find(|x| s(&x["name"]) == name);
            let results: Vec<Value> = key_results(l)
                .into_iter()
                .map(|(k, after)| {
                    let before_v =
                        before.and_then(|b| key_results(b).into_iter().find(|(kk, _)| *kk == k).and_then(|(_, v)| v));
                    let change = match (before_v, after) {
                        (Some(x), Some(y)) if x != 0.0 => Some((y - x) / x.abs() * 100.0),
                        _ => None,
                    };
                    json!({"quantity": k, "before": before_v, "after": after, "change_percent": change})
                })
                .collect();
            locations.push(json!({
                "name": name,
                "new": before.is_none(),
                "pass_before": before.map(|b| b["pass"].clone()),
                "pass_after": l["pass"],
                "results": results,
            }));
        }
        let dropped: Vec<String> =
            la.iter().map(|x| s(&x["name"])).filter(|n| !lb.iter().any(|y| s(&y["name"]) == *n)).collect();
        members.push(json!({
            "id": id,
            "inputs_changed": inputs.iter().map(|(p, a, b)| json!({"key": p, "before": a, "after": b})).collect::<Vec<_>>(),
            "locations": locations,
            "locations_removed": dropped,
        }));
    }
    json!({
        "format": 1,
        "old": {"revision": old["package"]["revision"], "version": old["program"]["version"], "input_sha256": old["input"]["sha256"]},
        "new": {"revision": new["package"]["revision"], "version": new["program"]["version"], "input_sha256": new["input"]["sha256"]},
        "input_changed": old["input"]["sha256"] != new["input"]["sha256"],
        "package_changed": package.iter().map(|(p, a, b)| json!({"key": p, "before": a, "after": b})).collect::<Vec<_>>(),
        "members_added": added,
        "members_removed": removed,
        "members": members,
    })
}

fn num(v: &Value) -> String {
    match v.as_f64() {
        Some(x) => crate::trace::show(x),
        None => "—".into(),
    }
}

fn short(v: &Value) -> String {
    let t = match v {
        Value::Number(_) => num(v),
        other => s(other),
    };
    if t.chars().count() > 40 { format!("{}…", t.chars().take(39).collect::<String>()) } else { t }
}

/// The differences as a readable table.
pub fn table(d: &Value) -> String {
    let mut out = String::new();
    out.push_str(&format!(
        "revision {} -> {} (program {} -> {}); input {}\n",
        s(&d["old"]["revision"]),
        s(&d["new"]["revision"]),
        s(&d["old"]["version"]),
        s(&d["new"]["version"]),
        if d["input_changed"].as_bool().unwrap_or(false) { "changed" } else { "unchanged" }
    ));
    if let Some(ch) = d["package_changed"].as_array().filter(|a| !a.is_empty()) {
        out.push_str("package:\n");
        for c in ch {
            out.push_str(&format!("  {}: {} -> {}\n", s(&c["key"]), short(&c["before"]), short(&c["after"])));
        }
    }
    let list = |v: &Value| {
        v.as_array()
            .map(|a| a.iter().map(s).collect::<Vec<_>>().join(", "))
            .filter(|t| !t.is_empty())
            .unwrap_or_else(|| "none".into())
    };
    out.push_str(&format!("members added: {}; removed: {}\n", list(&d["members_added"]), list(&d["members_removed"])));
    for m in d["members"].as_array().into_iter().flatten() {
        out.push_str(&format!("\nmember {}\n", s(&m["id"])));
        for c in m["inputs_changed"].as_array().into_iter().flatten() {
            out.push_str(&format!("  input {}: {} -> {}\n", s(&c["key"]), short(&c["before"]), short(&c["after"])));
        }
        for n in m["locations_removed"].as_array().into_iter().flatten() {
            out.push_str(&format!("  location {} removed\n", s(n)));
        }
        out.push_str(&format!(
            "  {:<18} {:<8} {:>12} {:>12} {:>9}\n",
            "location", "result", "before", "after", "change"
        ));
        for l in m["locations"].as_array().into_iter().flatten() {
            let pass = |v: &Value| match v.as_bool() {
                Some(true) => "pass",
                Some(false) => "FAIL",
                None => "—",
            };
            let name =
                if l["new"].as_bool().unwrap_or(false) { format!("{} (new)", s(&l["name"])) } else { s(&l["name"]) };
            out.push_str(&format!(
                "  {:<18} {:<8} {:>12} {:>12}\n",
                name,
                "pass",
                pass(&l["pass_before"]),
                pass(&l["pass_after"])
            ));
            for r in l["results"].as_array().into_iter().flatten() {
                let ch = match r["change_percent"].as_f64() {
                    Some(c) if c.abs() < 0.005 => "0.00 %".to_string(),
                    Some(c) => format!("{c:+.2} %"),
                    None => "".into(),
                };
                out.push_str(&format!(
                    "  {:<18} {:<8} {:>12} {:>12} {:>9}\n",
                    "",
                    s(&r["quantity"]),
                    num(&r["before"]),
                    num(&r["after"]),
                    ch
                ));
            }
        }
    }
    out
}
