//! The calculation package: determinism, the title block on every sheet, DRAFT logic,
//! the displayed values against the trace, hostile text, overwrite refusal, and the PDF
//! structure read back with a PDF library, and the bookmarks.

mod common;
use common::*;
use strainsheet::input::{self, Source};

const EXAMPLES: [&str; 3] = ["parking-double-tee.toml", "inverted-tee-girder.toml", "hollow-core-plank.toml"];

/// The examples, and a package of fourteen members: typeset in three runs of members, two
/// at a time, whose sheets are joined (the examples fit in one run).
fn packages() -> Vec<(String, strainsheet::input::Package, strainsheet::report::Rendered)> {
    let mut out: Vec<_> = EXAMPLES
        .iter()
        .map(|ex| {
            let (pkg, r) = render_example(ex);
            (ex.to_string(), pkg, r)
        })
        .collect();
    let src = Source { name: "fourteen.toml".into(), text: replicated("parking-double-tee.toml", 14) };
    let pkg = input::parse(&src).unwrap();
    assert_eq!(pkg.members.len(), 14);
    let r = render(&pkg, &src);
    out.push(("fourteen members".into(), pkg, r));
    out
}

#[test]
fn same_input_same_bytes() {
    for ex in EXAMPLES {
        let (_, a) = render_example(ex);
        let (_, b) = render_example(ex);
        assert!(a.pdf == b.pdf, "{ex}: two renders differ");
        assert_eq!(a.hash, b.hash);
    }
    // runs of members typeset in parallel and joined
    let src = Source { name: "fourteen.toml".into(), text: replicated("parking-double-tee.toml", 14) };
    let pkg = input::parse(&src).unwrap();
    assert!(render(&pkg, &src).pdf == render(&pkg, &src).pdf, "fourteen members: two renders differ");
}

#[test]
fn every_sheet_has_title_block_hash_and_draft_mark() {
    for (ex, pkg, r) in packages() {
        let n = pages(&r.pdf);
        assert_eq!(n, r.pages);
        let draft = pkg.meta.is_draft();
        for p in 1..=n {
            let t = pdf_text(&r.pdf, Some(p));
            assert!(t.contains(&r.hash[..16]), "{ex} sheet {p}: no content hash in the title block");
            assert!(t.contains(&format!("{p} of {n}")), "{ex} sheet {p}: no 'sheet {p} of {n}'");
            assert!(t.contains(&pkg.meta.project), "{ex} sheet {p}: no project name");
            assert_eq!(t.contains("DRAFT"), draft, "{ex} sheet {p}: DRAFT mark should be {draft}");
        }
        // the full hash and the number of sheets on the cover
        let cover = pdf_text(&r.pdf, Some(1));
        assert!(cover.contains(&r.hash), "{ex}: the cover lacks the full hash");
        assert!(cover.contains(&format!("{n}, this cover included")), "{ex}: the cover's sheet count is not {n}");
    }
}

#[test]
fn draft_until_every_signoff_is_dated() {
    // the girder example has every sign-off dated: issued; undating one makes it a draft
    let (src, pkg) = input::load(&example("inverted-tee-girder.toml")).unwrap();
    assert!(!pkg.meta.is_draft());
    let text = src.text.replace("date = 2026-11-24\n\n[[member]]", "\n[[member]]");
    assert_ne!(text, src.text);
    let src2 = Source { name: src.name.clone(), text };
    let pkg2 = input::parse(&src2).unwrap();
    assert!(pkg2.meta.is_draft());
    let r = render(&pkg2, &src2);
    assert!(pdf_text(&r.pdf, Some(1)).contains("DRAFT"));
    assert!(pdf_text(&r.pdf, Some(pages(&r.pdf))).contains("DRAFT"));
}

fn squash(s: &str) -> String {
    s.split_whitespace().collect::<Vec<_>>().join(" ")
}

#[test]
fn displayed_values_equal_the_trace() {
    for ex in EXAMPLES {
        let (src, pkg) = input::load(&example(ex)).unwrap();
        let a = strainsheet::analysis::analyze_full(&pkg).unwrap();
        let r = strainsheet::report::render(&pkg, &src, &a, &strainsheet::report::Templates::builtin()).unwrap();
        let n = pages(&r.pdf);
        let sheets: Vec<String> = (1..=n).map(|p| squash(&pdf_text(&r.pdf, Some(p)))).collect();
        for m in &a.members {
            for l in &m.locations {
                // the sheets of this location: their title block names it as "<id> · <name>"
                let subject = format!("{} · {}", m.id, l.name);
                let chunk: String = sheets
                    .iter()
                    .filter(|t| t.contains(&subject) && !t.contains("Contents"))
                    .cloned()
                    .collect::<Vec<_>>()
                    .join(" ");
                assert!(!chunk.is_empty(), "{ex}: no sheets titled {subject}");
                for st in &l.trace {
                    if st.value.is_nan() {
                        continue;
                    }
                    let plain = strainsheet::trace::scaled(st.value, st.unit);
                    // a tiny value prints as mantissa × 10^exponent (the sheet's math sets
                    // the exponent raised: its text has no superscript characters)
                    let shown = match plain.split_once("×10") {
                        Some((m, e)) => {
                            let e: String = e
                                .chars()
                                .map(|c| match "⁰¹²³⁴⁵⁶⁷⁸⁹".chars().position(|s| s == c) {
                                    Some(d) => char::from(b'0' + d as u8),
                                    None if c == '⁻' => '−',
                                    None => c,
                                })
                                .collect();
                            format!("{m} × 10{e}").replace('-', "−")
                        }
                        None => plain.replace('-', "−"),
                    };
                    assert!(
                        chunk.contains(&shown) || chunk.contains(&plain),
                        "{ex}: {} {}: step {} shows {plain}, not found on its sheets",
                        m.id,
                        l.name,
                        st.id
                    );
                }
                let f = strainsheet::trace::show;
                for v in [f(l.phi_mn), f(l.mu), strainsheet::trace::ratio_text(l.ratio), f(l.c)] {
                    assert!(chunk.contains(&v), "{ex}: {} {}: {v} not on its sheets", m.id, l.name);
                }
            }
        }
    }
}

fn hostile_package() -> (Package, Source) {
    let text = String::from(
        r##"format = 1
[package]
title = "#read(\"/etc/passwd\") $x^2$ *bold* _it_ <lab> @ref ]] #image(\"/etc/hostname\")"
project = "#include \"/etc/passwd\""
project_number = "#json(\"/etc/passwd\")"
client = "#import \"/etc/passwd\": *"
revision = "0"
date = 2026-12-01
units = "us"
notes = "Backslash \\ and #{1 + 1} and `raw` and // comment"
[[package.signoff]]
role = "prepared"
name = "#sym.alpha"
[[package.signoff]]
role = "checked"
name = "]; #panic(\"x\")"
[[member]]
id = "#read(\"x\")"
description = "$ 1 + 1 $ and *emphasis*"
length = 240.0
[member.concrete]
fc = 6.0
[member.section]
shape = "rectangle"
width = 12.0
height = 24.0
[[member.strands]]
depth = 21.0
count = 4
diameter = 0.5
fse = 160.0
[[member.location]]
name = "#pagebreak() \\ <x>"
x = 120.0
mu = 100.0
"##,
    );
    let src = Source { name: "hostile.toml".into(), text };
    let pkg = input::parse(&src).unwrap();
    (pkg, src)
}
use strainsheet::input::Package;

#[test]
fn user_text_prints_literally() {
    let (pkg, src) = hostile_package();
    let r = render(&pkg, &src);
    let text = pdf_text(&r.pdf, None);
    assert!(!text.contains("root:"), "a file of the machine leaked into the package");
    for s in [
        r#"#read("/etc/passwd") $x^2$ *bold* _it_ <lab> @ref ]]"#,
        r#"#include "/etc/passwd""#,
        "#sym.alpha",
        r#"]; #panic("x")"#,
        "$ 1 + 1 $ and *emphasis*",
        "#{1 + 1}",
    ] {
        assert!(squash(&text).contains(&squash(s)), "not printed literally: {s}");
    }
}

#[test]
fn pdf_structure_reads_back() {
    for ex in EXAMPLES {
        let (pkg, r) = render_example(ex);
        let doc = lopdf::Document::load_mem(&r.pdf).expect("lopdf reads the package");
        assert_eq!(doc.get_pages().len(), r.pages);
        let files = strainsheet::integrity::attached::attachments(&doc).unwrap();
        assert_eq!(
            files.keys().cloned().collect::<Vec<_>>(),
            vec!["input.toml".to_string(), "payload.json".to_string()]
        );
        assert_eq!(files["payload.json"], r.payload);
        assert_eq!(strainsheet::integrity::sha256_hex(&files["payload.json"]), r.hash);
        assert_eq!(strainsheet::integrity::attached::recorded_hash(&doc).as_deref(), Some(r.hash.as_str()));
        // PDF/A-3b identification in the XMP metadata
        let s = String::from_utf8_lossy(&r.pdf);
        assert!(s.contains("pdfaid:part>3<") || s.contains("pdfaid:part=\"3\""), "{ex}: no PDF/A-3 identification");
        // paper: US Letter for us packages, A4 for si
        let first = *doc.get_pages().values().next().unwrap();
        let mb = doc.get_dictionary(first).unwrap().get(b"MediaBox").unwrap().as_array().unwrap().clone();
        let w = mb[2].as_float().unwrap_or_else(|_| mb[2].as_i64().unwrap() as f32);
        let expected = if pkg.units == strainsheet::units::System::Us { 612.0 } else { 595.28 };
        assert!((w - expected).abs() < 1.0, "{ex}: page width {w}");
    }
}

// The PDF bookmarks come from the headings of every run of Typst: each member's heading
// is there and opens the member's sheet, as the contents says.
#[test]
fn bookmarks_lead_to_every_member() {
    for (ex, pkg, r) in packages() {
        let doc = lopdf::Document::load_mem(&r.pdf).unwrap();
        let toc = doc.get_toc().expect("the package has bookmarks");
        assert!(toc.errors.is_empty(), "{ex}: {:?}", toc.errors);
        for m in &pkg.members {
            let title = format!("Member {}", m.id);
            let entry =
                toc.toc.iter().find(|t| t.title == title).unwrap_or_else(|| panic!("{ex}: no bookmark {title}"));
            assert!(
                pdf_text(&r.pdf, Some(entry.page)).contains(&title),
                "{ex}: bookmark {title} leads to sheet {}",
                entry.page
            );
        }
        for part in ["Summary of members", "Appendix: the input file"] {
            let entry = toc.toc.iter().find(|t| t.title == part).unwrap_or_else(|| panic!("{ex}: no bookmark {part}"));
            assert!(
                pdf_text(&r.pdf, Some(entry.page)).contains(part),
                "{ex}: bookmark {part} leads to sheet {}",
                entry.page
            );
        }
    }
}

#[test]
fn report_refuses_to_overwrite_and_leaves_the_old_file() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("pkg.pdf");
    std::fs::write(&out, b"an issued package").unwrap();
    let st = bin()
        .args(["report", example("hollow-core-plank.toml").to_str().unwrap(), "-o", out.to_str().unwrap()])
        .output()
        .unwrap();
    assert_eq!(st.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&st.stderr).contains("--overwrite"));
    assert_eq!(std::fs::read(&out).unwrap(), b"an issued package");
    let leftovers: Vec<_> = std::fs::read_dir(dir.path()).unwrap().map(|e| e.unwrap().file_name()).collect();
    assert_eq!(leftovers.len(), 1, "files left behind: {leftovers:?}");
    // with --overwrite it is replaced, with its sidecar
    let st = bin()
        .args([
            "report",
            example("hollow-core-plank.toml").to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
            "--overwrite",
        ])
        .output()
        .unwrap();
    assert!(matches!(st.status.code(), Some(0 | 3)), "{}", String::from_utf8_lossy(&st.stderr));
    assert!(std::fs::read(&out).unwrap().starts_with(b"%PDF-"));
    let side = std::fs::read_to_string(dir.path().join("pkg.pdf.sha256")).unwrap();
    assert_eq!(side, strainsheet::integrity::sidecar::line(&std::fs::read(&out).unwrap(), "pkg.pdf"));
}

#[test]
fn sidecar_reads_with_sha256sum() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("hc.pdf");
    let st = bin()
        .args(["report", example("hollow-core-plank.toml").to_str().unwrap(), "-o", out.to_str().unwrap()])
        .output()
        .unwrap();
    assert!(matches!(st.status.code(), Some(0 | 3)));
    let check = std::process::Command::new("sha256sum")
        .arg("-c")
        .arg("hc.pdf.sha256")
        .current_dir(dir.path())
        .output()
        .unwrap();
    assert!(check.status.success(), "{}", String::from_utf8_lossy(&check.stdout));
}

// The contents lists its rows from the data and looks up only their sheets: each row's
// sheet must be the sheet where that part begins, and no row may lack its sheet.
#[test]
fn contents_points_at_the_right_sheets() {
    for (ex, pkg, r) in packages() {
        // the contents runs from sheet 2 to the sheet before the design basis (over
        // several sheets for fourteen members)
        let basis = (2..=pages(&r.pdf))
            .find(|&p| pdf_text(&r.pdf, Some(p)).contains("Design per "))
            .unwrap_or_else(|| panic!("{ex}: no design basis"));
        let contents: String = (2..basis).map(|p| pdf_text(&r.pdf, Some(p))).collect();
        assert!(!contents.contains('—'), "{ex}: a contents row has no sheet:\n{contents}");
        let sheet_of = |needle: &str| -> usize {
            let line = contents
                .lines()
                .find(|l| l.trim_start().starts_with(needle))
                .unwrap_or_else(|| panic!("{ex}: no contents row for {needle:?}:\n{contents}"));
            line.split_whitespace().last().and_then(|w| w.parse().ok()).unwrap_or_else(|| panic!("{ex}: row {line:?}"))
        };
        for m in &pkg.members {
            let s = sheet_of(&format!("Member {}", m.id));
            let text = pdf_text(&r.pdf, Some(s));
            assert!(text.contains(&format!("Member {}", m.id)), "{ex}: member {} is not on sheet {s}", m.id);
            for loc in &m.locations {
                // location rows are indented under their member; find the first after it
                let after = &contents[contents.find(&format!("Member {}", m.id)).unwrap()..];
                let line = after.lines().find(|l| l.trim_start().starts_with(loc.name.as_str())).unwrap();
                let s: usize = line.split_whitespace().last().unwrap().parse().unwrap();
                let text = pdf_text(&r.pdf, Some(s));
                assert!(
                    text.contains(&format!("{} · {}", m.id, loc.name)),
                    "{ex}: {} {} is not on sheet {s}",
                    m.id,
                    loc.name
                );
            }
        }
        for part in ["Summary of members", "Cautions", "Appendix: the input file"] {
            let s = sheet_of(part);
            assert!(pdf_text(&r.pdf, Some(s)).contains(part), "{ex}: {part} not on sheet {s}");
        }
    }
}

/// A member with loads: every kind, a point load and a reduced live-load factor.
const LOADED: &str = include_str!("fixtures/loads-of-every-kind.toml");

// A member with loads has its demand sheet (loads, statics, combinations written out,
// the reduced live-load factor with its clause, hogging shown but not checked), and its
// capacity sheet (the diagram's labels and the station table, each station's values
// as the analysis gives them, the rows derived in full naming their sheets).
#[test]
fn a_loaded_member_has_its_demand_sheet_and_station_table() {
    let src = Source { name: "loaded.toml".into(), text: LOADED.into() };
    let pkg = input::parse(&src).unwrap();
    let a = strainsheet::analysis::analyze_full(&pkg).unwrap();
    let r = strainsheet::report::render(&pkg, &src, &a, &strainsheet::report::Templates::builtin()).unwrap();
    let n = pages(&r.pdf);
    let sheets: Vec<String> = (1..=n).map(|p| squash(&pdf_text(&r.pdf, Some(p)))).collect();
    let find = |needle: &str| sheets.iter().position(|t| t.contains(needle));
    let demand = find("RB-1: demand along the span").expect("no demand sheet");
    let capacity = find("RB-1: design strength and demand along the member").expect("no capacity sheet");
    assert!(demand <= capacity);
    let text = sheets[demand..].join(" ");
    for words in [
        "Moments by statics",
        "Load combinations",
        "= 1.2D + 1.6L + 0.5Lr",
        "= 1.2D + 0.5L + 1.6S",
        "ACI 318-19 5.3.3",
        "office floor below 100 psf",
        "hung unit",
        "15.00 psf × 96.00 in",
        "the section",
        "Hogging at the overhangs",
        "It is shown, not checked",
        "Stations along the span",
        "x from the left end (in)",
        "not interpolated",
    ] {
        assert!(text.contains(words), "the demand and capacity sheets lack {words:?}");
    }
    // every station is a row, with its values as the analysis gives them
    let m = &a.members[0];
    assert!(m.stations.len() > 10);
    for s in &m.stations {
        let x = strainsheet::trace::show(s.x);
        let phi_mn = strainsheet::trace::show(s.phi_mn);
        assert!(text.contains(&x) && text.contains(&phi_mn), "station x = {x}: no row with φMn = {phi_mn}");
        if let Some(i) = s.derived {
            // a wrapped cell's lines may be read apart: the name is looked for on its own
            assert!(text.contains(&m.locations[i].name), "station x = {x}: its location is not named");
            assert!(find(&format!("RB-1 · {}", m.locations[i].name)).is_some());
        }
    }
    let derived = m.stations.iter().filter(|s| s.derived.is_some()).count();
    assert!(derived >= 1);
    assert_eq!(
        text.matches("derived in full: sheets of RB-1 ·").count(),
        derived,
        "a derived row does not name its sheets"
    );
    // the location sheets begin with the demand at their section
    assert!(text.contains("Demand at this section, from the member"));
    assert!(text.contains("derived from the member’s loads"));
}
