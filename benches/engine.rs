//! Criterion benchmarks of the engine and the package:
//!   cargo bench --bench engine
//! solve: one member (12-vertex polygon, 3 strand layers), check path (no trace);
//! clip: the area above a depth of a hollow-core plank and of a double tee;
//! curve: a 200-point moment-curvature curve of a topped double tee;
//! phi Mn at 100 stations: the strength solution along a member (no trace);
//! render: the calculation package of a 10-member package.

use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;
use strainsheet::input::{self, Source};
use strainsheet::{analysis, report};

const HEAD: &str = r#"format = 1
[package]
title = "Benchmark"
project = "Benchmark"
revision = "0"
date = 2026-12-01
units = "us"
[[package.signoff]]
role = "prepared"
name = "A"
[[package.signoff]]
role = "checked"
name = "B"
"#;

const POLYGON_MEMBER: &str = r#"
[[member]]
id = "P-12"
mu = 400.0
[member.concrete]
fc = 6.0
[member.section]
shape = "polygon"
outline = [[-24.0, 30.0], [-24.0, 26.0], [-5.0, 24.0], [-4.0, 6.0], [-12.0, 4.0], [-12.0, 0.0],
           [12.0, 0.0], [12.0, 4.0], [4.0, 6.0], [5.0, 24.0], [24.0, 26.0], [24.0, 30.0]]
[[member.strands]]
height = 2.0
count = 8
diameter = 0.5
fse = 165.0
[[member.strands]]
height = 4.0
count = 6
diameter = 0.5
fse = 165.0
[[member.strands]]
depth = 2.0
count = 2
diameter = 0.5
fse = 0.0
"#;

fn load(text: &str) -> input::Package {
    input::parse(&Source { name: "bench.toml".into(), text: text.to_string() }).expect("valid")
}

fn example(name: &str) -> (Source, input::Package) {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples").join(name);
    input::load(&path).expect("example")
}

fn benches(c: &mut Criterion) {
    let pkg = load(&format!("{HEAD}{POLYGON_MEMBER}"));
    let m = &pkg.members[0];
    c.bench_function("solve: 12-vertex polygon, 3 layers", |b| {
        b.iter(|| analysis::analyze_member(black_box(m), pkg.basis(), false).unwrap())
    });
    c.bench_function("solve, traced: 12-vertex polygon, 3 layers", |b| {
        b.iter(|| analysis::analyze_member(black_box(m), pkg.basis(), true).unwrap())
    });

    let (_, hc) = example("hollow-core-plank.toml");
    let region = &hc.members[0].region;
    let top = region.y_top();
    c.bench_function("clip: hollow-core plank (6 voids), cut through the voids", |b| {
        b.iter(|| region.above(black_box(top - 120.0)))
    });
    let (_, dt) = example("parking-double-tee.toml");
    let dreg = &dt.members[0].region;
    let dtop = dreg.y_top();
    c.bench_function("clip: double tee, cut in the stems", |b| b.iter(|| dreg.above(black_box(dtop - 10.0))));

    let dm = &dt.members[0];
    // the member as analysed: DT-1 computes its losses, which fill in its layers' fse
    let mut r = analysis::analyze_member(dm, dt.basis(), false).unwrap();
    let site = r.sites.remove(2);
    let analysed = r.member(dm).clone();
    c.bench_function("curve: 200 points, topped double tee", |b| {
        b.iter(|| analysis::curve::moment_curvature(black_box(&analysed), dt.basis(), &site, 2).unwrap())
    });

    // phi Mn at 100 stations along a member: the loaded, topped, harped double tee and
    // the inverted-tee girder of the demos
    for (file, i) in [("parking-double-tee.toml", 0), ("inverted-tee-girder.toml", 0)] {
        let (_, pk) = example(file);
        let m = &pk.members[i];
        let len = m.length.expect("the demos give their length");
        let xs: Vec<f64> = (0..100).map(|k| len * (k as f64 + 0.5) / 100.0).collect();
        c.bench_function(&format!("phi Mn at 100 stations: {} ({file})", m.id), |b| {
            b.iter(|| analysis::phi_mn_along(black_box(m), pk.basis(), &xs).unwrap())
        });
    }

    // a 10-member package: the double tees repeated
    let text = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/parking-double-tee.toml"),
    )
    .unwrap();
    let first = text.find("\n[[member]]").unwrap();
    let (head, members) = text.split_at(first);
    let mut big = head.to_string();
    for k in 0..5 {
        big.push_str(&members.replace("\nid = \"", &format!("\nid = \"B{k}-")));
    }
    let src = Source { name: "ten.toml".into(), text: big };
    let pkg10 = input::parse(&src).unwrap();
    assert_eq!(pkg10.members.len(), 10);
    let mut g = c.benchmark_group("render");
    g.sample_size(10);
    g.bench_function("package of 10 members (analysis, typesetting, PDF/A)", |b| {
        b.iter(|| {
            let a = analysis::analyze_full(&pkg10).unwrap();
            report::render(&pkg10, &src, &a, &report::Templates::builtin()).unwrap()
        })
    });
    g.finish();
}

criterion_group!(engine, benches);
criterion_main!(engine);
