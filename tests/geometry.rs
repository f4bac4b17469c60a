//! Section properties checked against an independent general-purpose geometry library
//! (the `geo` crate): areas, centroids and clipped areas of every shape the input can
//! name, holes included; and the second moment against closed forms.

mod common;
use geo::{Area, BooleanOps, Centroid, Coord, LineString, Polygon, Rect};
use strainsheet::section::Region;
use strainsheet::section::shapes::Shape;

fn to_geo(r: &Region) -> Polygon<f64> {
    let ring = |pts: &[[f64; 2]]| LineString::from(pts.iter().map(|p| Coord { x: p[0], y: p[1] }).collect::<Vec<_>>());
    Polygon::new(ring(&r.outline), r.holes.iter().map(|h| ring(h)).collect())
}

fn shapes() -> Vec<Shape> {
    vec![
        Shape::Rectangle { width: 12.0, height: 24.0 },
        Shape::Tee { flange_width: 48.0, flange_thickness: 4.0, web_width: 8.0, height: 28.0 },
        Shape::InvertedTee { web_width: 16.0, height: 36.0, ledge_width: 8.0, ledge_height: 12.0, ledges: 2 },
        Shape::InvertedTee { web_width: 14.0, height: 32.0, ledge_width: 8.0, ledge_height: 12.0, ledges: 1 },
        Shape::DoubleTee {
            flange_width: 144.0,
            flange_thickness: 2.0,
            height: 28.0,
            stem_spacing: 72.0,
            stem_width_top: 7.75,
            stem_width_bottom: 5.75,
        },
        Shape::IGirder {
            height: 54.0,
            top_flange_width: 16.0,
            top_flange_thickness: 6.0,
            top_taper: 3.0,
            web_width: 6.0,
            bottom_flange_width: 22.0,
            bottom_flange_thickness: 8.0,
            bottom_taper: 7.0,
        },
        Shape::HollowCore {
            width: 1200.0,
            height: 250.0,
            void_count: 6,
            void_diameter: 165.0,
            void_center_height: 125.0,
        },
        Shape::Polygon {
            outline: vec![
                [0.0, 0.0],
                [30.0, 0.0],
                [30.0, 6.0],
                [20.0, 8.0],
                [18.0, 30.0],
                [12.0, 30.0],
                [10.0, 8.0],
                [0.0, 6.0],
            ],
            holes: vec![vec![[13.0, 12.0], [17.0, 12.0], [17.0, 20.0], [13.0, 20.0]]],
        },
    ]
}

#[test]
fn area_and_centroid_match_geo() {
    for s in shapes() {
        let r = s.build().unwrap();
        let p = r.props();
        let g = to_geo(&r);
        let area = g.unsigned_area();
        let c = g.centroid().unwrap();
        assert!((p.area - area).abs() <= 1e-9 * area, "{}: area {} vs geo {area}", s.name(), p.area);
        assert!((p.yc - c.y()).abs() <= 1e-9 * (r.y_top() - r.y_bot()), "{}: yc {} vs geo {}", s.name(), p.yc, c.y());
        assert!((p.xc - c.x()).abs() <= 1e-9 * (r.x_max() - r.x_min()).max(1.0), "{}: xc", s.name());
    }
}

#[test]
fn clipped_area_and_centroid_match_geo() {
    for s in shapes() {
        let r = s.build().unwrap();
        let g = to_geo(&r);
        let (top, bot) = (r.y_top(), r.y_bot());
        for k in 1..20 {
            let y0 = bot + (top - bot) * k as f64 / 20.0 + 1e-7;
            let half = Rect::new(Coord { x: r.x_min() - 10.0, y: y0 }, Coord { x: r.x_max() + 10.0, y: top + 10.0 })
                .to_polygon();
            let cut = g.intersection(&half);
            let area = cut.unsigned_area();
            let m = r.above(y0);
            assert!(
                (m.area - area).abs() <= 1e-7 * g.unsigned_area(),
                "{} at {y0}: {} vs geo {area}",
                s.name(),
                m.area
            );
            if area > 0.0 {
                let cy = cut.centroid().unwrap().y();
                assert!((m.qx / m.area - cy).abs() <= 1e-7 * (top - bot), "{} at {y0}: centroid", s.name());
            }
        }
    }
}

// Closed forms (mechanics of materials): b h^3 / 12 for a rectangle; for a tee by the
// parallel-axis theorem.
#[test]
fn second_moment_matches_closed_forms() {
    let p = Shape::Rectangle { width: 12.0, height: 24.0 }.build().unwrap().props();
    assert!((p.i - 12.0 * 24f64.powi(3) / 12.0).abs() < 1e-6);
    let (bf, hf, bw, h) = (48.0, 4.0, 8.0, 28.0);
    let p = Shape::Tee { flange_width: bf, flange_thickness: hf, web_width: bw, height: h }.build().unwrap().props();
    let (af, aw) = (bf * hf, bw * (h - hf));
    let (yf, yw) = (h - hf / 2.0, (h - hf) / 2.0);
    let yc = (af * yf + aw * yw) / (af + aw);
    let i = bf * hf.powi(3) / 12.0 + af * (yf - yc).powi(2) + bw * (h - hf).powi(3) / 12.0 + aw * (yw - yc).powi(2);
    assert!((p.yc - yc).abs() < 1e-12 && (p.i - i).abs() < 1e-8 * i, "{} vs {i}", p.i);
    // a round void as a polygon keeps the circle's area (error well below 0.1 %) and its
    // second moment pi d^4 / 64 to 0.1 %
    let c = Region::new(strainsheet::section::shapes::circle(0.0, 0.0, 10.0), vec![]).props();
    assert!((c.area - std::f64::consts::PI * 25.0).abs() < 1e-9);
    let i0 = std::f64::consts::PI * 10f64.powi(4) / 64.0;
    assert!((c.i - i0).abs() / i0 < 1e-3, "{} vs {i0}", c.i);
}
