//! The command line: exit statuses, the JSON contract, the starter file, trace formats.

mod common;
use common::*;

#[test]
fn check_exit_status_and_json_contract() {
    for ex in ["parking-double-tee.toml", "inverted-tee-girder.toml", "hollow-core-plank.toml"] {
        let o = bin().args(["check", "--json", example(ex).to_str().unwrap()]).output().unwrap();
        let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
        // 0 every check met, 3 met only on open conditions, which the JSON lists
        let status = v["status"].as_str().unwrap();
        let expected = match status {
            "pass" => 0,
            "conditional" => 3,
            other => panic!("{ex}: status {other}"),
        };
        assert_eq!(o.status.code(), Some(expected), "{ex}: {}", String::from_utf8_lossy(&o.stderr));
        let open: usize =
            v["members"].as_array().unwrap().iter().map(|m| m["conditions"].as_array().unwrap().len()).sum();
        assert_eq!(open > 0, status == "conditional", "{ex}");
        assert_eq!(v["format"], 1);
        for k in ["length", "area", "stress", "force", "moment"] {
            assert!(v["units"][k].is_string(), "{ex}: units.{k}");
        }
        for m in v["members"].as_array().unwrap() {
            for k in [
                "id",
                "c",
                "a",
                "beta1",
                "eps_t",
                "phi",
                "mn",
                "phi_mn",
                "mu",
                "ratio",
                "control",
                "mcr",
                "min_reinforcement_ok",
                "pass",
                "strands",
                "bars",
                "locations",
            ] {
                assert!(m.get(k).is_some(), "{ex}: member has no {k}");
            }
            for s in m["strands"].as_array().unwrap() {
                for k in ["depth", "eps", "stress", "force", "eps1", "eps2", "eps3"] {
                    assert!(s.get(k).is_some(), "{ex}: strand has no {k}");
                }
            }
            // the top-level fields are those of the governing (highest-ratio) location
            let locs = m["locations"].as_array().unwrap();
            let worst = locs.iter().map(|l| l["ratio"].as_f64().unwrap()).fold(0.0, f64::max);
            assert_eq!(m["ratio"].as_f64().unwrap(), worst);
            assert!(locs.iter().all(|l| l["name"].is_string() && l.get("x").is_some()));
        }
    }
    // a failing member: exit 1, and the table says FAIL
    let text = std::fs::read_to_string(example("hollow-core-plank.toml")).unwrap().replace("mu = 148.0", "mu = 900.0");
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("fail.toml");
    std::fs::write(&f, text).unwrap();
    let o = bin().arg("check").arg(&f).output().unwrap();
    assert_eq!(o.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&o.stdout).contains("FAIL"));
}

#[test]
fn new_writes_a_starter_that_checks_and_is_not_overwritten() {
    let dir = tempfile::tempdir().unwrap();
    for units in ["us", "si"] {
        let f = dir.path().join(format!("start-{units}.toml"));
        let o = bin().args(["new", f.to_str().unwrap(), "--units", units]).output().unwrap();
        assert!(o.status.success());
        let o = bin().arg("check").arg(&f).output().unwrap();
        assert_eq!(
            o.status.code(),
            Some(0),
            "{units}: {}{}",
            String::from_utf8_lossy(&o.stdout),
            String::from_utf8_lossy(&o.stderr)
        );
        std::fs::write(&f, "mine").unwrap();
        let o = bin().args(["new", f.to_str().unwrap()]).output().unwrap();
        assert_eq!(o.status.code(), Some(2));
        assert_eq!(std::fs::read_to_string(&f).unwrap(), "mine");
    }
}

#[test]
fn trace_formats() {
    let ex = example("parking-double-tee.toml");
    let o = bin().args(["trace", ex.to_str().unwrap(), "--member", "DT-2"]).output().unwrap();
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(t.contains("== member DT-2") && !t.contains("== member DT-1") && t.contains("iteration log"));
    let o = bin().args(["trace", ex.to_str().unwrap(), "--format", "json"]).output().unwrap();
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    let steps = v["steps"].as_array().unwrap();
    assert!(steps.len() > 100);
    // each step with a formula carries it as a tree that evaluates to the recorded value
    for s in steps.iter().filter(|s| !s["formula"].is_null()) {
        let e: strainsheet::trace::Expr = serde_json::from_value(s["formula"].clone()).unwrap();
        let x: Vec<f64> =
            s["inputs"].as_array().unwrap().iter().map(|i| i["value"].as_f64().unwrap_or(f64::NAN)).collect();
        let want = s["value"].as_f64().unwrap();
        let scale = x.iter().fold(want.abs(), |m, v| m.max(v.abs()));
        assert!((e.eval(&x) - want).abs() <= 1e-9 * scale.max(1e-12), "{}", s["id"]);
    }
    let o = bin().args(["trace", ex.to_str().unwrap(), "--format", "csv"]).output().unwrap();
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(t.starts_with("member,location,id,title,symbol,formula,substituted,value,unit,clause\n"));
    let o = bin().args(["trace", ex.to_str().unwrap(), "--member", "nope"]).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
}

#[test]
fn usage_errors_exit_2() {
    assert_eq!(bin().arg("frobnicate").output().unwrap().status.code(), Some(2));
    assert_eq!(bin().args(["check", "/no/such/file.toml"]).output().unwrap().status.code(), Some(2));
    let help = bin().args(["sign", "--help"]).output().unwrap();
    assert!(String::from_utf8_lossy(&help.stdout).contains("not a professional seal"));
}

// `check --json` is written in parallel pieces; the bytes must be exactly those of
// serialising the whole result at once, for every shipped example and for a package
// large enough to be cut into many pieces (with members that fail and pass).
#[test]
fn check_json_pieces_equal_the_whole() {
    let mut texts: Vec<(String, String)> =
        ["parking-double-tee.toml", "inverted-tee-girder.toml", "hollow-core-plank.toml"]
            .iter()
            .map(|n| (n.to_string(), std::fs::read_to_string(common::example(n)).unwrap()))
            .collect();
    let mut big = String::from(common::HEAD_US);
    for i in 0..70 {
        big.push_str(&format!(
            "\n[[member]]\nid = \"R{i}\"\nmu = {}\n[member.concrete]\nfc = 6.0\n[member.section]\nshape = \"rectangle\"\nwidth = 12.0\nheight = 24.0\n[[member.strands]]\ndepth = 21.0\ncount = {}\ndiameter = 0.5\nfse = 160.0\n",
            150.0 + 3.0 * i as f64,
            2 + i % 5
        ));
    }
    texts.push(("generated".into(), big));
    for (name, text) in texts {
        let pkg = common::parse(&text);
        let a = strainsheet::analysis::analyze(&pkg, false).unwrap();
        let whole = serde_json::to_vec(&strainsheet::present::check_document(&pkg, &a)).unwrap();
        let out = strainsheet::check_members(&pkg).unwrap();
        let mut pieces = Vec::new();
        out.write_json(&pkg, &mut pieces).unwrap();
        assert_eq!(out.status, a.status(), "{name}");
        assert!(whole == pieces, "{name}: the assembled JSON differs from the whole");
    }
}

/// `report` typesets at most 500 members and says to split a larger package; `check`
/// and `trace` take it whole (trace writing member by member).
#[test]
fn report_refuses_a_package_too_large_to_typeset() {
    let text = replicated("parking-double-tee.toml", 502);
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("big.toml");
    std::fs::write(&f, text).unwrap();
    let out = dir.path().join("big.pdf");
    let o = bin().args(["report", f.to_str().unwrap(), "-o", out.to_str().unwrap()]).output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(2), "{err}");
    assert!(err.contains("at most 500") && err.contains("Split"), "{err}");
    assert!(!out.exists());
    let o = bin().args(["trace", "--format", "json", f.to_str().unwrap()]).output().unwrap();
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    assert!(v["steps"].as_array().unwrap().len() > 500 * 100);
}

/// Every shipped demo (its demand derived from loads, but for one member given by hand)
/// checks with the status its JSON states, each loaded member lists its stations in
/// order of x with the governing one's values on top, and the package renders.
#[test]
fn every_demo_checks_and_renders() {
    for ex in ["parking-double-tee.toml", "inverted-tee-girder.toml", "hollow-core-plank.toml"] {
        let o = bin().args(["check", "--json", demo(ex).to_str().unwrap()]).output().unwrap();
        let v: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
        let expected = match v["status"].as_str().unwrap() {
            "pass" => 0,
            "conditional" => 3,
            other => panic!("{ex}: status {other}"),
        };
        assert_eq!(o.status.code(), Some(expected), "{ex}");
        let mut loaded = 0;
        for m in v["members"].as_array().unwrap() {
            let Some(st) = m["stations"].as_array() else { continue };
            loaded += 1;
            let xs: Vec<f64> = st.iter().map(|s| s["x"].as_f64().unwrap()).collect();
            assert!(xs.windows(2).all(|w| w[0] < w[1]), "{ex}: stations ordered by x");
            for s in st {
                for key in ["x", "mu", "mnc", "phi_mn", "ratio"] {
                    assert!(s[key].is_number(), "{ex}: station without {key}");
                }
            }
            let worst = st.iter().map(|s| s["ratio"].as_f64().unwrap()).fold(0.0, f64::max);
            assert!(m["ratio"].as_f64().unwrap() >= worst, "{ex}: the top-level values are the governing section's");
        }
        assert!(loaded > 0, "{ex}: a demo with loads");
        let dir = tempfile::tempdir().unwrap();
        let pdf = dir.path().join("p.pdf");
        let o = bin().args(["report", demo(ex).to_str().unwrap(), "-o", pdf.to_str().unwrap()]).output().unwrap();
        assert!(matches!(o.status.code(), Some(0 | 3)), "{ex}: {}", String::from_utf8_lossy(&o.stderr));
        assert!(std::fs::metadata(&pdf).unwrap().len() > 10_000);
    }
}

// A reader that closes its end of the pipe early (`| head`) ends the output quietly:
// no panic on a broken pipe, from any command that writes to standard output.
#[test]
fn a_closed_pipe_is_not_a_panic() {
    let demo = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/parking-double-tee.toml");
    let demo = demo.to_str().unwrap();
    for args in [
        vec!["curve", demo, "--member", "DT-2", "--format", "json"],
        vec!["curve", demo, "--member", "DT-2", "--format", "csv"],
        vec!["check", "--json", demo],
        vec!["trace", demo],
    ] {
        let mut child = bin()
            .args(&args)
            .stdout(std::process::Stdio::piped())
            .stderr(std::process::Stdio::piped())
            .spawn()
            .unwrap();
        drop(child.stdout.take());
        let out = child.wait_with_output().unwrap();
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(!err.contains("panicked"), "{args:?}: {err}");
    }
}
