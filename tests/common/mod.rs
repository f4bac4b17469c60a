//! Helpers shared by the integration tests.
#![allow(dead_code)]

use strainsheet::input::{self, Package, Source};

mod pdf_text;
#[allow(unused_imports)]
pub use pdf_text::pdf_text;

/// A package header in US units with sign-offs, for test members.
pub const HEAD_US: &str = r#"format = 1
[package]
title = "Test package"
project = "Test project"
revision = "0"
date = 2026-12-01
units = "us"
[[package.signoff]]
role = "prepared"
name = "P. Reparer"
[[package.signoff]]
role = "checked"
name = "C. Hecker"
"#;

/// A 12 x 24 in rectangle whose two strand layers take computed losses (Zia et al. 1979),
/// with loads and f'ci: worked by hand in tests/losses.rs, its release force in
/// tests/stresses.rs.
pub const COMPUTED_LOSSES_MEMBER: &str = r#"
[[member]]
id = "ZA-1"
length = 480.0
[member.loads]
superimposed_dead = "0.3 klf"
live = "0.8 klf"
[member.concrete]
fc = 6.0
fci = 4.5
[member.losses]
method = "zia-1979"
relative_humidity = 70
volume_to_surface = 3.0
[member.section]
shape = "rectangle"
width = 12.0
height = 24.0
[[member.strands]]
height = 3.0
count = 6
diameter = 0.5
jacking = 0.75
[[member.strands]]
height = 6.0
count = 4
diameter = 0.5
jacking = 0.72
"#;

pub const HEAD_SI: &str = r#"format = 1
[package]
title = "Test package"
project = "Test project"
revision = "0"
date = 2026-12-01
units = "si"
[[package.signoff]]
role = "prepared"
name = "P. Reparer"
[[package.signoff]]
role = "checked"
name = "C. Hecker"
"#;

pub fn parse(text: &str) -> Package {
    let src = Source { name: "test.toml".into(), text: text.into() };
    match input::parse(&src) {
        Ok(p) => p,
        Err(e) => panic!("{e}\n---\n{text}"),
    }
}

pub fn parse_err(text: &str) -> String {
    let src = Source { name: "test.toml".into(), text: text.into() };
    match input::parse(&src) {
        Ok(_) => panic!("expected an error for\n{text}"),
        Err(e) => e.to_string(),
    }
}

/// A test fixture: the scenario packages with their moments given by hand (as the
/// examples were before their demand was derived from loads), whose values the tests
/// pin after recomputing them by hand. The shipped demos in examples/ are checked by
/// `demo` users (trace replay, hostile inputs, `cli::every_demo_checks_and_renders`).
pub fn example(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures").join(name)
}

/// A shipped demo package in examples/.
pub fn demo(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples").join(name)
}

/// Renders a package (library path) and returns the PDF bytes.
pub fn render(pkg: &Package, src: &Source) -> strainsheet::report::Rendered {
    let a = strainsheet::analysis::analyze_full(pkg).expect("analysis");
    strainsheet::report::render(pkg, src, &a, &strainsheet::report::Templates::builtin()).expect("render")
}

/// Loads an example and renders it.
pub fn render_example(name: &str) -> (Package, strainsheet::report::Rendered) {
    let (src, pkg) = input::load(&example(name)).expect("load");
    let r = render(&pkg, &src);
    (pkg, r)
}

/// Page count of a PDF.
pub fn pages(pdf: &[u8]) -> usize {
    lopdf::Document::load_mem(pdf).expect("a readable PDF").get_pages().len()
}

/// The strainsheet binary.
pub fn bin() -> std::process::Command {
    std::process::Command::new(env!("CARGO_BIN_EXE_strainsheet"))
}

/// A package of about `n` members: the members of a shipped example repeated with new ids.
pub fn replicated(example_name: &str, n: usize) -> String {
    let text = std::fs::read_to_string(example(example_name)).unwrap();
    let first = text.find("\n[[member]]").unwrap();
    let (head, members) = text.split_at(first);
    let per = members.matches("\n[[member]]").count();
    let mut out = head.to_string();
    for k in 0..n.div_ceil(per) {
        out.push_str(&members.replace("\nid = \"", &format!("\nid = \"R{k}-")));
    }
    out
}

/// Both readings of a TOML text into `T` (the quick one, `input::fast::quick`, and the
/// toml crate's): equal where the quick one decides (compared as Debug text, which
/// shows every float exactly), and the quick one never accepts what the toml crate
/// refuses. Returns whether the quick reading decided.
pub fn quick_agrees<T: serde::de::DeserializeOwned + std::fmt::Debug>(name: &str, text: &str) -> bool {
    let slow: Result<T, _> = toml::from_str(text);
    match (input::fast::quick::<T>(text), slow) {
        (Some(q), Ok(s)) => {
            assert_eq!(format!("{q:?}"), format!("{s:?}"), "{name}: the readings differ\n{text}");
            true
        }
        (Some(q), Err(e)) => panic!("{name}: read quickly as {q:?}, but the toml crate refuses it: {e}\n{text}"),
        (None, _) => false,
    }
}

/// A 12 x 24 in rectangle 40 ft long (simple span, end to end) under 0.2 klf of
/// superimposed dead load and `live` klf of live load, f'c 6 ksi, with `concrete` more
/// lines of `[member.concrete]` and `rest` after the section (strand layers, bars,
/// options): the test member of the stress, class and cracked-section checks.
pub fn rectangle_member(id: &str, live: &str, concrete: &str, rest: &str) -> String {
    format!(
        r##"
[[member]]
id = "{id}"
length = 480.0
[member.loads]
superimposed_dead = "0.2 klf"
live = "{live} klf"
[member.concrete]
fc = 6.0
{concrete}
[member.section]
shape = "rectangle"
width = 12.0
height = 24.0
{rest}
"##
    )
}
