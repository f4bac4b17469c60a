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

/// A topped double tee's concrete, section and topping, and its steel: a harped layer of
/// 8 strands and a straight one of `straight` strands, each at `fse`.
fn double_tee(straight: u32, fse: f64) -> String {
    format!(
        r##"[member.concrete]
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
count = {straight}
diameter = 0.5
fse = {fse}
"##
    )
}

/// An inverted-tee girder's concrete, section and steel, its strand at `fse`.
fn inverted_tee(fse: f64) -> String {
    format!(
        r##"[member.concrete]
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
"##
    )
}

/// A hollow-core plank's concrete, section and strand, at `fse`.
fn hollow_core(fse: f64) -> String {
    format!(
        r##"[member.concrete]
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
"##
    )
}

fn strainsheet_large(n: usize) -> String {
    let mut s = head();
    for i in 0..n {
        let v = (i % 7) as f64;
        let member = match i % 3 {
            0 => {
                let len = 720.0 - 12.0 * v;
                format!(
                    "id = \"DT-{i}\"\nlength = {len}\nmnc = {}\nmu = {}\n{}[[member.location]]\nname = \"near bearing\"\nx = 24.0\nmu = 90.0\n[[member.location]]\nname = \"midspan\"\nx = {}\n",
                    300.0 - 5.0 * v,
                    700.0 + 10.0 * v,
                    double_tee(2, 160.0 + v),
                    len / 2.0
                )
            }
            1 => format!("id = \"IT-{i}\"\nlength = 432.0\nmu = {}\n{}", 1000.0 + 20.0 * v, inverted_tee(165.0 + v)),
            _ => format!("id = \"HC-{i}\"\nlength = 330.0\nmu = {}\n{}", 120.0 + 2.0 * v, hollow_core(155.0 + v)),
        };
        s.push_str(&format!("\n[[member]]\n{member}"));
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
        let member = match i % 3 {
            0 => format!(
                "id = \"DT-{i}\"\nlength = {}\nspan = {}\n[member.loads]\nsuperimposed_dead = \"5 psf\"\nlive = \"{} psf\"\n{}[[member.location]]\nname = \"near bearing\"\nx = 24.0\n",
                620.0 + a,
                608.0 + a,
                30.0 + b,
                double_tee(4, 165.0)
            ),
            1 => format!(
                "id = \"IT-{i}\"\nlength = {}\n[member.loads]\nsuperimposed_dead = \"2.0 klf\"\nlive = \"{} klf\"\n{}",
                380.0 + a / 2.0,
                1.0 + b / 20.0,
                inverted_tee(165.0)
            ),
            _ => format!(
                "id = \"HC-{i}\"\nlength = {}\n[member.loads]\nsuperimposed_dead = \"15 psf\"\nlive = \"{} psf\"\n{}",
                300.0 + a / 2.0,
                40.0 + b,
                hollow_core(155.0)
            ),
        };
        s.push_str(&format!("\n[[member]]\n{member}"));
    }
    s
}
