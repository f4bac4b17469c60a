//! A member has two ends: transfer, development, debonding and the harp profile are
//! measured from the nearer one. Checked on the parking-garage example, whose members
//! are symmetric: a section 24 in from the right bearing must give what the section
//! 24 in from the left one gives.

mod common;
use common::*;
use strainsheet::analysis;
use strainsheet::input::model::Location;

fn with_locations(member: usize, xs: &[f64]) -> analysis::MemberResult {
    let text = std::fs::read_to_string(example("parking-double-tee.toml")).unwrap();
    let mut pkg = parse(&text);
    let m = &mut pkg.members[member];
    m.locations = xs
        .iter()
        .map(|&x| Location {
            name: format!("x{x}"),
            x: Some(x),
            mu: Some(100.0 * 12.0),
            mnc: Some(0.0),
            mnc_scaled: false,
        })
        .collect();
    let a = analysis::analyze(&pkg, true).unwrap();
    a.members.into_iter().nth(member).unwrap()
}

#[test]
fn harped_double_tee_near_either_bearing() {
    // DT-1: 720 in long, strands harped at 288 in, straight strands below
    let r = with_locations(0, &[24.0, 696.0, 288.0, 432.0, 200.0, 520.0]);
    let l = &r.locations;
    for pair in l.chunks(2) {
        assert!(
            (pair[0].phi_mn - pair[1].phi_mn).abs() < 1e-9 * pair[0].phi_mn,
            "{} vs {}",
            pair[0].phi_mn,
            pair[1].phi_mn
        );
        assert_eq!(pair[0].phi, pair[1].phi);
    }
    // 24 in from either end, the strand is within its development length: phi 0.75
    // (ACI 318-19 21.2.3) and a reduced strand stress; not the fully developed 843.6
    assert_eq!(l[1].phi, 0.75);
    assert!((l[1].phi_mn - 272.3).abs() < 0.05, "{}", l[1].phi_mn);
    assert!(l[1].development.iter().all(|d| d.x_end == 24.0 && d.end == strainsheet::input::model::End::Right));
    // the harped layer's depth at 200 in from either end is on the slope, not at the harp
    let d_left = l[4].strands[0].depth;
    let d_right = l[5].strands[0].depth;
    assert!((d_left - d_right).abs() < 1e-9);
    assert!(d_left < 24.5 + 3.0 - 1.0, "harped depth {d_left}");
    // the trace names the nearer end
    let step = l[1].trace.iter().find(|s| s.id == "L2.dev.xe").expect("nearer-end step");
    assert_eq!(step.value, 24.0);
    assert!(step.note.as_deref().unwrap_or("").contains("right end governs"));
}

#[test]
fn debonded_double_tee_near_either_bearing() {
    // DT-2: 600 in long, two strands debonded 60 in at each end
    let r = with_locations(1, &[72.0, 528.0, 30.0, 570.0]);
    let l = &r.locations;
    for pair in l.chunks(2) {
        assert!(
            (pair[0].phi_mn - pair[1].phi_mn).abs() < 1e-9 * pair[0].phi_mn,
            "{} vs {}",
            pair[0].phi_mn,
            pair[1].phi_mn
        );
    }
    // 30 in from the right end the debonded layer carries nothing
    assert!(!l[3].strands[1].active);
    // 72 in from the right end: the debonded layer is 12 in into its bond, and the
    // strength is that found 72 in from the left end (436.5 kip-ft, where reading x
    // from the left end only gave 672 kip-ft: the figures of the issue that found it)
    assert!((l[1].development[1].x_bond - 12.0).abs() < 1e-9);
    assert!((l[1].phi_mn - 436.5).abs() < 0.05, "{}", l[1].phi_mn);
}
