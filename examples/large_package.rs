//! Prints a package of N members (default 60) built from varied double tees, inverted
//! tees and hollow-core planks, for the performance measurements in README.md:
//!
//! ```sh
//! cargo run --release --example large_package -- 3000 > /tmp/members-3000.toml
//! ```
//!
//! With `--loaded`, each member's demand is derived from loads instead of given, and no
//! two members are alike (their lengths and live loads vary with their number), so
//! nothing is shared between members:
//!
//! ```sh
//! cargo run --release --example large_package -- 3000 --loaded > /tmp/loaded-3000.toml
//! ```
//!
//! The members are variations generated for measurement only, not a real project.

fn main() {
    let n: usize = std::env::args().nth(1).and_then(|a| a.parse().ok()).unwrap_or(60);
    let loaded = std::env::args().any(|a| a == "--loaded");
    print!("{}", if loaded { strainsheet_loaded(n) } else { strainsheet_large(n) });
}

/// The package's head: everything before the members.
fn head() -> String {
    String::from(
        r#"format = 1
[package]
title = "Generated package for performance measurement"
project = "Measurement project"
project_number = "PERF"
revision = "0"
date = 2026-12-01
units = "us"
[[package.signoff]]
role = "prepared"
name = "Generated"
[[package.signoff]]
role = "checked"
name = "Generated checker"
"#,
    )
}

fn strainsheet_large(n: usize) -> String {
    let mut s = head();
    for i in 0..n {
        let v = (i % 7) as f64;
        match i % 3 {
            0 => s.push_str(&format!(
                r##"
[[member]]
id = "DT-{i}"
length = {len}
mnc = {mnc}
mu = {mu}
[member.concrete]
fc = 6.0
[member.section]
shape = "double_tee"
flange_width = 144.0
flange_thickness = 2.0
height = 28.0
stem_spacing = 72.0
stem_width_top = 7.75
stem_width_bottom = 5.75
[member.topping]
thickness = 3.0
fc = 4.0
[[member.strands]]
depth_end = 14.0
depth_harp = 24.5
harp_x = 288.0
count = 8
diameter = 0.5
fse = {fse}
[[member.strands]]
height = 2.5
count = 2
diameter = 0.5
fse = {fse}
[[member.location]]
name = "near bearing"
x = 24.0
mu = 90.0
[[member.location]]
name = "midspan"
x = {mid}
"##,
                len = 720.0 - 12.0 * v,
                mid = (720.0 - 12.0 * v) / 2.0,
                mnc = 300.0 - 5.0 * v,
                mu = 700.0 + 10.0 * v,
                fse = 160.0 + v
            )),
            1 => s.push_str(&format!(
                r##"
[[member]]
id = "IT-{i}"
length = 432.0
mu = {mu}
[member.concrete]
fc = 7.0
[member.section]
shape = "inverted_tee"
web_width = 16.0
height = 36.0
ledge_width = 8.0
ledge_height = 12.0
[[member.strands]]
height = 2.5
count = 10
diameter = 0.6
fse = {fse}
[[member.strands]]
height = 4.5
count = 6
diameter = 0.6
fse = {fse}
[[member.strands]]
depth = 2.5
count = 2
diameter = 0.5
fse = 0.0
[[member.bars]]
height = 7.0
count = 4
size = "#6"
"##,
                mu = 1000.0 + 20.0 * v,
                fse = 165.0 + v
            )),
            _ => s.push_str(&format!(
                r##"
[[member]]
id = "HC-{i}"
length = 330.0
mu = {mu}
[member.concrete]
fc = 6.0
[member.section]
shape = "hollow_core"
width = 48.0
height = 10.0
void_count = 6
void_diameter = 6.5
void_center_height = 5.0
[[member.strands]]
height = 1.75
count = 7
diameter = 0.5
fse = {fse}
"##,
                mu = 120.0 + 2.0 * v,
                fse = 155.0 + v
            )),
        }
    }
    s
}

/// Members whose demand is derived from loads (the three shapes in turn, as above), each
/// of its own length and live load.
fn strainsheet_loaded(n: usize) -> String {
    let mut s = head();
    for i in 0..n {
        // a different length and live load for every member of a package of up to
        // several thousand
        let (a, b) = ((i % 101) as f64, (i % 13) as f64);
        match i % 3 {
            0 => s.push_str(&format!(
                r##"
[[member]]
id = "DT-{i}"
length = {len}
span = {span}
[member.loads]
superimposed_dead = "5 psf"
live = "{live} psf"
[member.concrete]
fc = 6.0
[member.section]
shape = "double_tee"
flange_width = 144.0
flange_thickness = 2.0
height = 28.0
stem_spacing = 72.0
stem_width_top = 7.75
stem_width_bottom = 5.75
[member.topping]
thickness = 3.0
fc = 4.0
[[member.strands]]
depth_end = 14.0
depth_harp = 24.5
harp_x = 288.0
count = 8
diameter = 0.5
fse = 165.0
[[member.strands]]
height = 2.5
count = 4
diameter = 0.5
fse = 165.0
[[member.location]]
name = "near bearing"
x = 24.0
"##,
                len = 620.0 + a,
                span = 608.0 + a,
                live = 30.0 + b,
            )),
            1 => s.push_str(&format!(
                r##"
[[member]]
id = "IT-{i}"
length = {len}
[member.loads]
superimposed_dead = "2.0 klf"
live = "{live} klf"
[member.concrete]
fc = 7.0
[member.section]
shape = "inverted_tee"
web_width = 16.0
height = 36.0
ledge_width = 8.0
ledge_height = 12.0
[[member.strands]]
height = 2.5
count = 10
diameter = 0.6
fse = 165.0
[[member.strands]]
height = 4.5
count = 6
diameter = 0.6
fse = 165.0
[[member.strands]]
depth = 2.5
count = 2
diameter = 0.5
fse = 0.0
[[member.bars]]
height = 7.0
count = 4
size = "#6"
"##,
                len = 380.0 + a / 2.0,
                live = 1.0 + b / 20.0,
            )),
            _ => s.push_str(&format!(
                r##"
[[member]]
id = "HC-{i}"
length = {len}
[member.loads]
superimposed_dead = "15 psf"
live = "{live} psf"
[member.concrete]
fc = 6.0
[member.section]
shape = "hollow_core"
width = 48.0
height = 10.0
void_count = 6
void_diameter = 6.5
void_center_height = 5.0
[[member.strands]]
height = 1.75
count = 7
diameter = 0.5
fse = 155.0
"##,
                len = 300.0 + a / 2.0,
                live = 40.0 + b,
            )),
        }
    }
    s
}
