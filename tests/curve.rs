//! The moment-curvature analysis checked against the stress-block strength, elastic
//! section theory and the limits that end it.

mod common;
use common::*;
use strainsheet::analysis::{self, curve::moment_curvature};

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

fn rect_member(extra: &str) -> String {
    format!(
        "{HEAD_US}
[[member]]
id = \"R\"
mu = 100.0
[member.concrete]
fc = 6.0
[member.section]
shape = \"rectangle\"
width = 12.0
height = 24.0
{extra}"
    )
}

// Common practice: for ordinary under-reinforced sections the fibre analysis peaks close
// to the stress-block strength (the Whitney block is calibrated to such sections).
#[test]
fn peak_agrees_with_stress_block_mn() {
    let cases =
        [("parking-double-tee.toml", 0.03), ("inverted-tee-girder.toml", 0.03), ("hollow-core-plank.toml", 0.03)];
    for (ex, tol) in cases {
        let (_, pkg) = strainsheet::input::load(&example(ex)).unwrap();
        for m in &pkg.members {
            let r = analysis::analyze_member(m, pkg.basis(), false).unwrap();
            let c = moment_curvature(m, pkg.basis(), r.governing).unwrap();
            let mn = r.governing().mn;
            assert!(rel(c.peak.moment, mn) < tol, "{ex} {}: peak {} vs Mn {mn}", m.id, c.peak.moment);
        }
    }
    let pkg = parse(&rect_member("[[member.strands]]\ndepth = 21.0\ncount = 4\ndiameter = 0.5\nfse = 160.0\n"));
    let m = &pkg.members[0];
    let r = analysis::analyze_member(m, pkg.basis(), false).unwrap();
    let c = moment_curvature(m, pkg.basis(), 0).unwrap();
    assert!(
        rel(c.peak.moment, r.locations[0].mn) < 0.03,
        "rectangle: peak {} vs Mn {}",
        c.peak.moment,
        r.locations[0].mn
    );
}

// Elastic section theory (mechanics of materials; common practice): a prestressed
// rectangle cracks when the bottom fibre reaches fr. The fibre analysis is a transformed
// section (the bonded strand adds n Aps, n = Eps/Ec) after the prestress acts on the
// concrete alone, so: stage 1, bottom strain eps_b0 = -(Pe/A + Pe e yb/I)/Ec on the gross
// section; stage 2, M = (fr/Ec - eps_b0) Ec I_t / (y_t - y_b), with the transformed
// inertia I_t and centroid y_t. The Mcr formula of ACI (gross section throughout) is lower
// by the steel's share; the fibre result must sit next to the transformed value.
#[test]
fn cracking_matches_the_transformed_section() {
    let pkg = parse(&rect_member("[[member.strands]]\ndepth = 21.0\ncount = 6\ndiameter = 0.5\nfse = 160.0\n"));
    let m = &pkg.members[0];
    let r = analysis::analyze_member(m, pkg.basis(), false).unwrap();
    let c = moment_curvature(m, pkg.basis(), 0).unwrap();
    let (b, h, dp, aps, fse) = (12.0f64, 24.0f64, 21.0f64, 6.0 * 0.153, 160.0);
    let ec = 57_000.0 * (6000.0f64).sqrt() / 1000.0;
    let fr = 7.5 * (6000.0f64).sqrt() / 1000.0;
    let (a, i) = (b * h, b * h.powi(3) / 12.0);
    let e = dp - h / 2.0;
    let pe = fse * aps;
    let eps_b0 = -(pe / a + pe * e * (h / 2.0) / i) / ec;
    let n = 28_500.0 / ec;
    let at = a + n * aps;
    let yt = (a * h / 2.0 + n * aps * (h - dp)) / at;
    let it = i + a * (h / 2.0 - yt).powi(2) + n * aps * (h - dp - yt).powi(2);
    let y_strip = h / 400.0; // centroid of the bottom strip of 200
    let m_cr = (fr / ec - eps_b0) * ec * it / (yt - y_strip) / 12.0;
    let fibre = c.cracking.unwrap().moment;
    assert!(rel(fibre, m_cr) < 0.02, "fibre cracking {fibre} vs transformed section {m_cr}");
    // and the gross-section formula of the package is the lower of the two
    assert!(r.locations[0].mcr < fibre);
}

// Elastic cracked-section theory for a reinforced rectangle at first yield (common
// practice; e.g. Park and Paulay, Reinforced Concrete Structures, 1975, ch. 6, from
// memory): k = sqrt(2 rho n + (rho n)^2) - rho n, My = As fy (d - kd/3), phi_y = eps_y /
// (d - kd). With concrete below about 0.6 f'c at yield the fibre analysis is within 5 %.
#[test]
fn reinforced_yield_point_matches_cracked_section_theory() {
    let mut pkg = parse(&rect_member(
        "[[member.strands]]\ndepth = 21.5\ncount = 1\ndiameter = 0.5\nfse = 0.0\n[[member.bars]]\ndepth = 21.5\ncount = 3\nsize = \"#6\"\n",
    ));
    pkg.members[0].strands.clear();
    pkg.members[0].concrete.fc = 6.0;
    let m = &pkg.members[0];
    let c = moment_curvature(m, pkg.basis(), 0).unwrap();
    let y = c.yielding.expect("the bars yield");
    let ec = m.concrete.ec;
    let (b, d, as_, fy, es) = (12.0, 21.5, 3.0 * 0.44, 60.0, 29_000.0);
    let n = es / ec;
    let rho = as_ / (b * d);
    let k = (2.0 * rho * n + (rho * n).powi(2)).sqrt() - rho * n;
    let my = as_ * fy * (d - k * d / 3.0) / 12.0;
    let phi_y = fy / es / (d - k * d);
    assert!(rel(y.moment, my) < 0.05, "My {} vs {my}", y.moment);
    assert!(rel(y.curvature, phi_y) < 0.05, "phi_y {} vs {phi_y}", y.curvature);
}

#[test]
fn the_curve_ends_at_crushing_or_rupture() {
    let (_, pkg) = strainsheet::input::load(&example("inverted-tee-girder.toml")).unwrap();
    for m in &pkg.members {
        let c = moment_curvature(m, pkg.basis(), 0).unwrap();
        let last = c.points.last().unwrap();
        match c.ended_by {
            "concrete crushing" => {
                assert!((last.top_strain + m.curve.crushing_strain).abs() < 1e-8, "{}", last.top_strain)
            }
            "strand rupture" => assert!((last.strand_strain - m.curve.rupture_strain).abs() < 1e-8),
            other => panic!("{other}"),
        }
        assert!(c.points.len() >= m.curve.points);
        // curvature increases along the curve; the first point is the prestressed state
        assert!(c.points.windows(2).all(|w| w[1].curvature >= w[0].curvature));
        assert_eq!(c.points[0].moment, 0.0);
        assert!(c.points[0].curvature < 0.0, "prestress gives camber: negative curvature at zero moment");
    }
}

#[test]
fn curve_json_has_the_contract_keys() {
    let out = bin()
        .args(["curve", example("hollow-core-plank.toml").to_str().unwrap(), "--member", "HC-2"])
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", String::from_utf8_lossy(&out.stderr));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    for k in ["member", "units", "points", "cracking_moment", "yield_moment", "peak_moment", "ductility", "ended_by"] {
        assert!(v.get(k).is_some(), "no {k}");
    }
    let p = &v["points"][5];
    for k in ["curvature", "moment", "top_strain", "neutral_axis", "strand_strain"] {
        assert!(p.get(k).is_some(), "point has no {k}");
    }
    assert_eq!(v["units"]["moment"], "kN-m");
    let csv = bin()
        .args(["curve", example("hollow-core-plank.toml").to_str().unwrap(), "--member", "HC-2", "--format", "csv"])
        .output()
        .unwrap();
    let text = String::from_utf8_lossy(&csv.stdout);
    // each column names its unit (SI package)
    assert!(
        text.starts_with("curvature (1/mm),moment (kN-m),top_strain,neutral_axis (mm below the top),strand_strain\n"),
        "{text}"
    );
    assert_eq!(text.lines().count(), v["points"].as_array().unwrap().len() + 1);
    // two members: --member is needed, and the message lists them
    let two = bin().args(["curve", example("hollow-core-plank.toml").to_str().unwrap()]).output().unwrap();
    assert_eq!(two.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&two.stderr).contains("HC-1, HC-2"));
    let bad = bin()
        .args(["curve", example("hollow-core-plank.toml").to_str().unwrap(), "--member", "NOPE"])
        .output()
        .unwrap();
    assert_eq!(bad.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&bad.stderr).contains("HC-1, HC-2"));
}

// The curve follows one branch of equilibrium from the prestressed state to its end: no
// point lies past the crushing or rupture strain, the top strain grows in small steps,
// and the moment never falls by more than the small drop when the concrete cracks (its
// tension is lost at once). A curve that jumped to a second equilibrium (a state past
// crushing, with the compression deep in the section) broke all three.
#[test]
fn the_curve_follows_one_branch() {
    for ex in ["parking-double-tee.toml", "inverted-tee-girder.toml", "hollow-core-plank.toml"] {
        let (_, pkg) = strainsheet::input::load(&example(ex)).unwrap();
        for m in &pkg.members {
            let r = analysis::analyze_member(m, pkg.basis(), false).unwrap();
            let c = moment_curvature(m, pkg.basis(), r.governing).unwrap();
            let (crush, rupture) = (m.curve.crushing_strain, m.curve.rupture_strain);
            let peak = c.peak.moment;
            for w in c.points.windows(2) {
                let (a, b) = (w[0], w[1]);
                assert!(
                    -b.top_strain <= crush * (1.0 + 1e-9),
                    "{ex} {}: top strain {} past crushing",
                    m.id,
                    b.top_strain
                );
                assert!(
                    b.strand_strain <= rupture * (1.0 + 1e-9),
                    "{ex} {}: strand strain {} past rupture",
                    m.id,
                    b.strand_strain
                );
                assert!(
                    (b.top_strain - a.top_strain).abs() <= crush / 10.0,
                    "{ex} {}: top strain jumps {} -> {}",
                    m.id,
                    a.top_strain,
                    b.top_strain
                );
                assert!(b.moment >= a.moment - 0.06 * peak, "{ex} {}: moment falls {} -> {}", m.id, a.moment, b.moment);
            }
        }
    }
}

/// With one member in the file, `curve` needs no --member.
#[test]
fn curve_of_the_only_member() {
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("one.toml");
    let text = std::fs::read_to_string(example("inverted-tee-girder.toml")).unwrap();
    // keep the first member only
    let second = text.match_indices("[[member]]").nth(1).map(|(i, _)| i).unwrap();
    std::fs::write(&f, &text[..second]).unwrap();
    let o = bin().args(["curve", f.to_str().unwrap(), "--format", "csv"]).output().unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", String::from_utf8_lossy(&o.stderr));
    assert!(String::from_utf8_lossy(&o.stdout).starts_with("curvature (1/in),moment (kip-ft)"));
}
