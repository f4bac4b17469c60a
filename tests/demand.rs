//! The demand along the span: statics of a simple span with overhangs against an
//! independent frame library and by hand, the load combinations of the design basis, the
//! stations along the member, and the input that gives the loads.

mod common;
use common::*;
use proptest::prelude::*;
use strainsheet::analysis::{self, demand::Demand};
use strainsheet::basis::{Basis, aci318};
use strainsheet::input::model::{LineLoad, LoadKind, PointLoad};

/// A demand of uniform and point loads (kip, in), all dead load.
fn demand(length: f64, bearing: f64, w: f64, points: &[(f64, f64)]) -> Demand {
    Demand {
        length,
        span: length - 2.0 * bearing,
        bearing,
        width: 0.0,
        uniform: vec![LineLoad {
            kind: LoadKind::Dead,
            source: "test".into(),
            area_load: None,
            w,
            precast_only: false,
        }],
        points: points
            .iter()
            .enumerate()
            .map(|(i, &(p, x))| PointLoad { kind: LoadKind::Dead, name: format!("P{i}"), p, x })
            .collect(),
        combinations: aci318::US.combinations([true, false, false, false], 1.0),
        live_factor: 1.0,
        live_factor_reason: None,
        shored: false,
        hogging: 0.0,
    }
}

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * b.abs().max(1.0)
}

// Reference: PyNiteFEA 3.2.0 (a general-purpose frame library on PyPI), run by
// tests/reference/beam_statics_check.py on 2026-12-03; the values printed there, kip-in.
/// Length, bearing distance, w, point loads (P, x) and the expected moments (x, M).
type Case = (f64, f64, f64, &'static [(f64, f64)], &'static [(f64, f64)]);

#[test]
fn statics_match_an_independent_frame_library() {
    let cases: [Case; 3] = [
        (
            600.0,
            6.0,
            0.1,
            &[(12.0, 150.0)],
            &[(6.0, -1.8), (150.0, 4499.81632653), (300.0, 5184.0), (450.0, 3618.18367347)],
        ),
        (480.0, 0.0, 0.05, &[(8.0, 360.0)], &[(120.0, 1320.0), (240.0, 1920.0), (360.0, 1800.0)]),
        (
            720.0,
            12.0,
            0.08,
            &[(5.0, 6.0)],
            &[(6.0, -1.44), (12.0, -35.76), (200.0, 3792.50344828), (360.0, 4823.4), (700.0, 214.05517241)],
        ),
    ];
    for (length, a, w, points, expect) in cases {
        let d = demand(length, a, w, points);
        for &(x, m) in expect {
            let got = d.uniform_moment(w, x) + points.iter().map(|&(p, xp)| d.point_moment(p, xp, x)).sum::<f64>();
            assert!(close(got, m, 1e-8), "L={length} a={a} x={x}: {got} vs {m}");
        }
    }
}

// By hand (common practice): a simple span of length L under w has M = w L²/8 at midspan
// and w x (L - x)/2 elsewhere; a point load P at xp gives P xp (L - xp)/L under it.
// Superposition: the moments of several loads add.
#[test]
fn statics_by_hand() {
    let d = demand(480.0, 0.0, 0.1, &[]);
    assert!(close(d.uniform_moment(0.1, 240.0), 0.1 * 480.0 * 480.0 / 8.0, 1e-12));
    assert!(close(d.uniform_moment(0.1, 100.0), 0.1 * 100.0 * 380.0 / 2.0, 1e-12));
    assert!(close(d.point_moment(10.0, 120.0, 120.0), 10.0 * 120.0 * 360.0 / 480.0, 1e-12));
    // overhangs of a each side: M = w/2 (x'(S - x') - a²) between the bearings
    let d = demand(600.0, 6.0, 0.1, &[]);
    let (x, a, s) = (200.0, 6.0, 588.0);
    assert!(close(d.uniform_moment(0.1, x), 0.1 / 2.0 * ((x - a) * (s - (x - a)) - a * a), 1e-12));
    // both ends of the member are free: no moment there
    assert!(d.uniform_moment(0.1, 0.0).abs() < 1e-9 && d.uniform_moment(0.1, 600.0).abs() < 1e-9);
    assert!(d.point_moment(10.0, 150.0, 600.0).abs() < 1e-9);
}

// ACI 318-19 Table 5.3.1, by hand, on a rectangular member with loads: w_sw = 150 pcf ×
// 12 × 24 in² = 0.3 klf; superimposed dead 0.5 klf; live 1.0 klf; span 40 ft, bearings at
// the ends. M_D = 0.8 × 40²/8 = 160 kip-ft, M_L = 1.0 × 40²/8 = 200 kip-ft; (5.3.1a)
// 1.4 × 160 = 224, (5.3.1b) 1.2 × 160 + 1.6 × 200 = 512, (5.3.1c) 1.2 × 160 + 1.0 × 200 =
// 392: Mu = 512 kip-ft by (5.3.1b).
const RECT: &str = r#"
[[member]]
id = "R-1"
length = 480.0
[member.loads]
superimposed_dead = "0.5 klf"
live = "1.0 klf"
[member.concrete]
fc = 6.0
[member.section]
shape = "rectangle"
width = 12.0
height = 24.0
[[member.strands]]
depth = 21.0
count = 8
diameter = 0.5
fse = 160.0
"#;

fn analysed(text: &str) -> analysis::MemberResult {
    let pkg = parse(&format!("{HEAD_US}{text}"));
    analysis::analyze(&pkg, true).unwrap().members.remove(0)
}

#[test]
fn combinations_on_a_member_by_hand() {
    let r = analysed(RECT);
    let mid = r.stations.iter().find(|s| (s.x - 240.0).abs() < 1e-9).expect("a station at midspan");
    assert!(close(mid.by_kind[0], 160.0, 1e-9), "M_D {}", mid.by_kind[0]);
    assert!(close(mid.by_kind[1], 200.0, 1e-9), "M_L {}", mid.by_kind[1]);
    assert!(close(mid.mu, 512.0, 1e-9), "Mu {}", mid.mu);
    assert_eq!(mid.combination, "(5.3.1b)");
    // the governing station is derived in full, its demand traced step by step
    let g = r.governing();
    assert!(g.name.starts_with("governing station"), "{}", g.name);
    assert!(close(g.mu, 512.0, 1e-9));
    let mu_step = g.trace.iter().find(|s| s.id.ends_with(".demand.Mu")).expect("the demand's step");
    assert!(close(mu_step.value, 512.0, 1e-9));
    assert!(mu_step.note.as_deref().unwrap_or("").contains("(5.3.1b) governs"));
    // the member-level steps: the self-weight from the area
    let sw = r.trace.iter().find(|s| s.id == "D.wsw").expect("self-weight step");
    assert!(close(sw.value, 0.3, 1e-12), "w_sw {}", sw.value);
}

// ACI 318-19 5.3.3 (from memory): the live-load factor in (5.3.1c) may be 0.5 except in
// garages, places of public assembly and where L > 100 psf; here with roof live load
// governing (5.3.1c): 1.2 × 160 + 1.6 × 100 + 0.5 × 200 = 452 against 1.0 L's 552.
#[test]
fn reduced_live_factor_is_shown_with_its_reason() {
    let text = RECT.replace(
        "live = \"1.0 klf\"",
        "live = \"1.0 klf\"\nroof_live = \"0.5 klf\"\nlive_factor = 0.5\nlive_factor_reason = \"office floor, L = 50 psf\"",
    );
    let r = analysed(&text);
    let mid = r.stations.iter().find(|s| (s.x - 240.0).abs() < 1e-9).unwrap();
    // (5.3.1b): 1.2 × 160 + 1.6 × 200 + 0.5 × 100 = 562 governs over (5.3.1c) 452
    assert!(close(mid.mu, 562.0, 1e-9), "{}", mid.mu);
    let d = r.demand.as_ref().unwrap();
    let c = d.combinations.iter().find(|c| c.name == "(5.3.1c)").unwrap();
    assert_eq!(c.factors, [1.2, 0.5, 1.6, 0.0]);
    assert_eq!(d.live_factor_reason.as_deref(), Some("office floor, L = 50 psf"));
    // without its reason the reduced factor is refused
    let e = parse_err(&format!("{HEAD_US}{}", text.replace("live_factor_reason = \"office floor, L = 50 psf\"", "")));
    assert!(e.contains("live_factor_reason"), "{e}");
}

#[test]
fn stations_cover_the_member() {
    let r = analysed(RECT);
    let xs: Vec<f64> = r.stations.iter().map(|s| s.x).collect();
    assert!(xs.windows(2).all(|w| w[0] < w[1]), "ordered by x: {xs:?}");
    // tenth points of the span (the end ones are the member's ends here: no section)
    for k in 1..10 {
        assert!(xs.iter().any(|x| (x - 48.0 * k as f64).abs() < 1e-9), "tenth point {k}");
    }
    // the ends of the transfer length from both ends: fse/3000 db = 160/3 × 0.5 in
    // (ACI 318-19 25.4.8.1, first term)
    let ltr = 160.0 / 3.0 * 0.5;
    assert!(xs.iter().any(|x| (x - ltr).abs() < 1e-9) && xs.iter().any(|x| (x - (480.0 - ltr)).abs() < 1e-9));
    // the governing station is the one of largest Mu / phi Mn
    let worst = r.stations.iter().map(|s| s.ratio).fold(0.0, f64::max);
    assert!(close(r.governing().ratio, worst, 1e-12));
}

// A member symmetric about the middle of its length (common practice: the two ends of a
// simple span under symmetric loads are mirror images) derives its left end region's
// critical station in full and says the right one's is its mirror; a point load off the
// middle breaks the symmetry, and each end region's critical station is derived.
#[test]
fn a_symmetric_member_derives_one_end_region_and_names_the_mirror() {
    let r = analysed(RECT);
    let left = r.stations.iter().find(|s| s.role == Some("critical station, left end region")).expect("left");
    let right = r.stations.iter().find(|s| s.role == Some("critical station, right end region")).expect("right");
    assert_eq!(right.mirror_of, Some(left.x));
    assert!(close(left.x + right.x, 480.0, 1e-9));
    assert_eq!(right.derived, left.derived, "the mirror points at the left's derivation");
    assert!(close(right.phi_mn, left.phi_mn, 1e-9) && close(right.mu, left.mu, 1e-9));
    assert!(!r.locations.iter().any(|l| l.name.contains("right end region")));

    let lopsided = format!("{RECT}\n[[member.point_load]]\nkind = \"live\"\nload = 20.0\nx = 400.0\n");
    let r = analysed(&lopsided);
    let right = r.stations.iter().find(|s| s.role == Some("critical station, right end region")).expect("right");
    assert_eq!(right.mirror_of, None);
    let i = right.derived.expect("derived in full");
    assert!(r.locations[i].name.contains("right end region"), "{}", r.locations[i].name);
}

#[test]
fn load_input_errors_name_the_key() {
    let cases: [(&str, &str, &str); 6] = [
        ("length = 480.0", "length = 480.0\nmu = 300.0", "mu"),
        ("superimposed_dead = \"0.5 klf\"", "superimposed_dead = 0.5", "has no unit"),
        ("superimposed_dead = \"0.5 klf\"", "superimposed_dead = \"0.5 kip\"", "superimposed_dead"),
        ("length = 480.0", "length = 480.0\nspan = 500.0", "span"),
        ("live = \"1.0 klf\"", "live = \"1.0 klf\"\nlive_factor = 0.7", "live_factor"),
        (
            "[member.concrete]",
            "[[member.point_load]]\nkind = \"dead\"\nload = 5.0\nx = 500.0\n[member.concrete]",
            "point_load",
        ),
    ];
    for (from, to, key) in cases {
        let e = parse_err(&format!("{HEAD_US}{}", RECT.replace(from, to)));
        assert!(e.contains(key), "{key}: {e}");
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 64, ..ProptestConfig::default() })]
    // A symmetric member (harped or debonded strands, symmetric loads) gives a symmetric
    // envelope: the demand and the design strength at x equal those at L - x.
    #[test]
    fn symmetric_member_symmetric_envelope(
        length in 360.0f64..900.0,
        bearing in 0.0f64..12.0,
        debond in 0.0f64..60.0,
        harped in any::<bool>(),
        live in 20.0f64..100.0,
    ) {
        let strands = if harped {
            format!("[[member.strands]]\ndepth_end = 10.0\ndepth_harp = 21.0\nharp_x = {}\ncount = 4\ndiameter = 0.5\nfse = 160.0\n", length * 0.4)
        } else {
            format!("[[member.strands]]\ndepth = 21.0\ncount = 4\ndiameter = 0.5\nfse = 160.0\ndebonded_length = {debond}\n[[member.strands]]\ndepth = 21.0\ncount = 4\ndiameter = 0.5\nfse = 160.0\n")
        };
        let text = format!(
            "[[member]]\nid = \"S\"\nlength = {length}\nspan = {}\n[member.loads]\nsuperimposed_dead = \"10 psf\"\nlive = \"{live} psf\"\nwidth = 96.0\n[member.concrete]\nfc = 6.0\n[member.section]\nshape = \"rectangle\"\nwidth = 12.0\nheight = 24.0\n{strands}",
            length - 2.0 * bearing
        );
        let r = analysed(&text);
        for s in &r.stations {
            // the nearest station to L - x: two stations may lie a fraction of an inch apart
            // (a debond point's transfer end beside a tenth point), so not the first near one
            let gap = |t: &&analysis::StationRow| (t.x - (length - s.x)).abs();
            let twin = r.stations.iter().min_by(|a, b| gap(a).total_cmp(&gap(b))).expect("stations");
            prop_assert!(gap(&twin) < 1e-9 * length, "no mirror of x = {}: nearest {}", s.x, twin.x);
            prop_assert!(close(s.mu, twin.mu, 1e-9), "Mu at {} {} vs {}", s.x, s.mu, twin.mu);
            prop_assert!(close(s.phi_mn, twin.phi_mn, 1e-9), "phi Mn at {} {} vs {}", s.x, s.phi_mn, twin.phi_mn);
        }
    }
}
