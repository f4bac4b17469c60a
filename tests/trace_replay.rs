//! The formula shown is the formula computed: every recorded step of every shipped
//! example is re-evaluated from its recorded inputs and must give its recorded result.

use std::path::Path;
use strainsheet::{analysis, input};

fn examples() -> Vec<std::path::PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let mut v: Vec<_> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "toml"))
        .collect();
    v.sort();
    v
}

#[test]
fn every_step_replays() {
    let mut checked = 0;
    for path in examples() {
        let (_, pkg) = input::load(&path).unwrap();
        let a = analysis::analyze(&pkg, true).unwrap();
        for m in &a.members {
            let steps = m.trace.iter().chain(m.locations.iter().flat_map(|l| l.trace.iter()));
            for st in steps {
                if let Some(v) = st.replay() {
                    let tol = 1e-9 * st.value.abs().max(1e-12) + 1e-12;
                    assert!(
                        (v - st.value).abs() <= tol || (v.is_nan() && st.value.is_nan()),
                        "{}: member {} step {} ({}) replays to {v}, recorded {}",
                        path.display(),
                        m.id,
                        st.id,
                        st.title,
                        st.value
                    );
                    checked += 1;
                }
            }
        }
    }
    assert!(checked > 200, "only {checked} steps had formulas");
}

#[test]
fn step_ids_are_unique_per_member() {
    for path in examples() {
        let (_, pkg) = input::load(&path).unwrap();
        let a = analysis::analyze(&pkg, true).unwrap();
        for m in &a.members {
            let mut ids: Vec<&str> =
                m.trace.iter().chain(m.locations.iter().flat_map(|l| l.trace.iter())).map(|s| s.id.as_str()).collect();
            let n = ids.len();
            ids.sort();
            ids.dedup();
            assert_eq!(ids.len(), n, "{}: duplicate step ids in member {}", path.display(), m.id);
        }
    }
}

#[test]
fn trace_agrees_with_results() {
    // the numbers check reports are the numbers the trace records
    for path in examples() {
        let (_, pkg) = input::load(&path).unwrap();
        let a = analysis::analyze(&pkg, true).unwrap();
        let fast = analysis::analyze(&pkg, false).unwrap();
        for (m, f) in a.members.iter().zip(&fast.members) {
            for (j, (l, lf)) in m.locations.iter().zip(&f.locations).enumerate() {
                // a location's steps are named `L<its number>.<step>`: looked up by the
                // whole id, so that no other step ending the same way can answer
                let get = |step: &str| {
                    let id = format!("L{}.{step}", j + 1);
                    let mut found = l.trace.iter().filter(|s| s.id == id);
                    let s = found.next().unwrap_or_else(|| panic!("{}: no step {id}", m.id));
                    assert!(found.next().is_none(), "{}: two steps {id}", m.id);
                    s.value
                };
                assert_eq!(get("strength.Mn"), l.mn);
                assert_eq!(get("c"), l.c);
                assert_eq!(get("phiMn"), l.phi_mn);
                assert_eq!(lf.mn, l.mn, "traced and untraced runs differ");
                assert_eq!(lf.phi_mn, l.phi_mn);
            }
        }
    }
}
