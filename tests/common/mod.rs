//! Helpers shared by the integration tests.
#![allow(dead_code)]

use strainsheet::input::{self, Package, Source};

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

pub fn example(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples").join(name)
}
