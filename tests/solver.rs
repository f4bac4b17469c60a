//! The solver at its edges: a neutral axis below the section, a stress block through
//! topping, flange and web, and a section no neutral axis can balance (an error with
//! its reason, never a number).

mod common;
use common::*;

fn member(extra_section: &str, strands: &str) -> String {
    format!(
        "{HEAD_US}\n[[member]]\nid = \"U\"\nmu = 10.0\n[member.concrete]\nfc = 6.0\n[member.section]\n{extra_section}\n{strands}"
    )
}

#[test]
fn a_neutral_axis_below_the_section_still_solves() {
    // a small section packed with strand: equilibrium needs c beyond the section depth
    let pkg = parse(&member(
        "shape = \"rectangle\"\nwidth = 12.0\nheight = 12.0",
        "[[member.strands]]\ndepth = 5.0\ncount = 20\ndiameter = 0.6\nfse = 100.0\n[[member.strands]]\ndepth = 7.0\ncount = 20\ndiameter = 0.6\nfse = 100.0\n",
    ));
    let r = strainsheet::analysis::analyze(&pkg, true).unwrap();
    let l = &r.members[0].locations[0];
    assert!(l.c > 12.0, "c = {}", l.c);
    assert_eq!(l.zone, "whole section");
    assert!(l.closure < 1e-9);
    assert_eq!(l.control, "compression");
}

#[test]
fn a_block_through_topping_flange_and_web() {
    let text = format!(
        "{HEAD_US}\n[[member]]\nid = \"T\"\nmu = 10.0\n[member.concrete]\nfc = 8.0\n[member.section]\nshape = \"tee\"\nflange_width = 36.0\nflange_thickness = 2.0\nweb_width = 8.0\nheight = 30.0\n[member.topping]\nthickness = 1.5\nfc = 4.0\nblock = \"two_part\"\n[[member.strands]]\nheight = 3.0\ncount = 12\ndiameter = 0.6\nfse = 165.0\n"
    );
    let pkg = parse(&text);
    let r = strainsheet::analysis::analyze(&pkg, true).unwrap();
    let l = &r.members[0].locations[0];
    assert_eq!(l.zone, "topping, flange and web", "a = {}", l.a);
    assert!(l.closure < 1e-9);
    // both block options are recorded, and the conservative default is the weaker
    let other = l.other_block.as_ref().expect("the other block option is shown");
    assert!(other.mn < l.mn, "topping f'c throughout {} vs two-part {}", other.mn, l.mn);
    // the concrete force is the sum of the parts at their own 0.85 f'c
    let c1 = l.trace.iter().find(|s| s.id == "L1.strength.C.1").unwrap().value;
    let c2 = l.trace.iter().find(|s| s.id == "L1.strength.C.2").unwrap().value;
    assert!(((c1 + c2) - l.cc).abs() < 1e-9 * l.cc);
}

#[test]
fn an_impossible_section_is_an_error_not_a_number() {
    // more prestressing steel than a 6 x 6 section can ever balance
    let text = member(
        "shape = \"rectangle\"\nwidth = 6.0\nheight = 6.0",
        "[[member.strands]]\ndepth = 2.0\ncount = 10\ndiameter = 0.6\nfse = 190.0\n[[member.strands]]\ndepth = 3.0\ncount = 10\ndiameter = 0.6\nfse = 190.0\n[[member.strands]]\ndepth = 4.0\ncount = 10\ndiameter = 0.6\nfse = 190.0\n[[member.strands]]\ndepth = 5.0\ncount = 10\ndiameter = 0.6\nfse = 190.0\n",
    );
    let pkg = parse(&text);
    match strainsheet::analysis::analyze(&pkg, false) {
        Err(strainsheet::Error::Analysis { message, .. }) => assert!(message.contains("no equilibrium"), "{message}"),
        Ok(r) => panic!("a number came out: c = {}", r.members[0].locations[0].c),
        Err(e) => panic!("{e}"),
    }
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("x.toml");
    std::fs::write(&f, text).unwrap();
    let o = bin().arg("check").arg(&f).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("no equilibrium"));
}
