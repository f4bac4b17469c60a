//! A member in the payload: its input as given, its results, and what its sheets print
//! of them (the input summary, the strand and bar tables, a polygon's vertices, the
//! moment-curvature plot).

use super::curve::{CurvePlot, plot};
use super::demand::{DemandShown, demand};
use super::location::{LocationPayload, location};
use super::printed;
use super::step::{StepPayload, step};
use crate::analysis::curve::CurveResult;
use crate::analysis::demand::Demand;
use crate::analysis::{MemberResult, SectionResult, StationRow};
use crate::basis::Basis;
use crate::input::model::{BarLayer, Default, Kind, Member, Profile, StrandLayer};
use crate::section::shapes::Shape;
use crate::units::UnitNames;
use serde::Serialize;

/// A member in the payload.
#[derive(Serialize)]
pub struct MemberPayload<'a> {
    #[serde(flatten)]
    pub shown: MemberShown<'a>,
    /// The member's input as read (coherent units).
    pub input: &'a Member,
    pub curve_data: Option<&'a CurveResult>,
    /// The demand from the member's loads and every station along the span, as the
    /// analysis gives them (members with loads).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub demand_data: Option<&'a Demand>,
    #[serde(skip_serializing_if = "<[_]>::is_empty")]
    pub stations: &'a [StationRow],
    pub steps: Vec<StepPayload<'a>>,
    pub locations: Vec<LocationPayload<'a>>,
}

/// What the sheets of a member read of it (besides its steps and locations).
#[derive(Serialize)]
pub struct MemberShown<'a> {
    pub id: &'a str,
    pub description: &'a str,
    pub kind: Kind,
    pub pass: bool,
    /// The position of the governing location.
    pub governing: usize,
    pub section: &'a SectionResult,
    pub section_shown: SectionShown,
    pub defaults: &'a [Default],
    /// The input summary: a label and a value a row.
    pub input_rows: Vec<(&'static str, String)>,
    /// Where the losses are computed ("240.0 in"), for a member that computes them.
    pub losses_x: Option<String>,
    /// A polygon's outline and holes as given (y upward), so that a checker can
    /// recompute A, yb and I; empty for a built-in shape, whose dimensions are rows.
    pub vertices: Vec<Ring>,
    pub strands: Vec<StrandRow>,
    pub bars: Vec<BarRow>,
    pub curve: Option<CurvePlot<'a>>,
    pub curve_error: Option<&'a str>,
    /// The demand sheet, the capacity diagram and the station table (members with loads).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub demand: Option<DemandShown>,
    /// The stress sheet (members with loads).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stresses: Option<super::stresses::StressesShown>,
}

/// The section's overall dimensions, with their unit.
#[derive(Serialize)]
pub struct SectionShown {
    pub height: String,
    pub precast_height: String,
    pub topping_thickness: Option<String>,
    pub width: String,
}

/// A ring of a polygon section: its name and its points (number, x, y).
#[derive(Serialize)]
pub struct Ring {
    pub ring: String,
    pub points: Vec<[String; 3]>,
}

/// A row of the strand table.
#[derive(Serialize)]
pub struct StrandRow {
    pub index: usize,
    pub count: u32,
    pub size: &'static str,
    pub diameter: String,
    pub area: String,
    pub total_area: String,
    pub fpu: String,
    pub fse: String,
    /// Where the layer is: its depth (and dp with a topping), or its harped profile.
    pub level: String,
    pub model: crate::material::strand::Model,
    pub model_shown: &'static str,
    pub debonded: Option<String>,
}

/// A row of the bar table.
#[derive(Serialize)]
pub struct BarRow {
    pub index: usize,
    pub count: u32,
    pub size: &'static str,
    pub diameter: String,
    pub area: String,
    pub total_area: String,
    pub fy: String,
    pub depth: String,
}

/// A member as the payload holds it.
pub fn member<'a>(m: &'a MemberResult, input: &'a Member, basis: &dyn Basis) -> MemberPayload<'a> {
    // as analysed: computed losses fill in their layers' fse
    let input = m.member(input);
    let sys = basis.units();
    let u = sys.names();
    let length = |v: f64| format!("{} {}", printed(v), u.length);
    let g = &m.section.geometry;
    let shown = MemberShown {
        id: &m.id,
        description: &input.description,
        kind: input.kind,
        pass: m.pass,
        governing: m.governing,
        section: &m.section,
        section_shown: SectionShown {
            height: length(m.section.height),
            precast_height: length(m.section.precast_height),
            topping_thickness: input.topping.as_ref().map(|t| length(t.thickness)),
            width: length(g.x_max - g.x_min),
        },
        defaults: &input.defaults,
        input_rows: input_rows(input, basis),
        losses_x: m.losses.as_ref().map(|l| length(l.x)),
        vertices: vertices(&input.shape),
        strands: input.strands.iter().enumerate().map(|(i, s)| strand_row(i, s, input, u)).collect(),
        bars: input.bars.iter().enumerate().map(|(i, b)| bar_row(i, b)).collect(),
        curve: m.curve.as_ref().map(|c| plot(c, m.governing(), sys)),
        curve_error: m.curve_error.as_deref(),
        demand: m.demand.as_ref().map(|d| demand(m, d, basis)),
        stresses: m.stresses.as_ref().map(|s| super::stresses::stresses(m, s, basis, input.stresses.reinforcement_fy)),
    };
    MemberPayload {
        shown,
        input,
        curve_data: m.curve.as_ref(),
        demand_data: m.demand.as_ref(),
        stations: &m.stations,
        steps: m.trace.iter().map(|s| step(s, sys)).collect(),
        locations: m.locations.iter().map(|l| location(l, sys)).collect(),
    }
}

/// The input summary of a member.
fn input_rows(input: &Member, basis: &dyn Basis) -> Vec<(&'static str, String)> {
    let u = basis.units().names();
    let mut rows = vec![("Section", input.shape.name().to_string())];
    if let Shape::HollowCore { void_count, .. } = input.shape {
        rows.push(("Voids", format!("{void_count} round voids")));
    }
    for (k, v) in shape_dims(&input.shape) {
        rows.push((k, format!("{} {}", printed(v), u.length)));
    }
    rows.push(("Precast concrete f'c", format!("{} {}", printed(input.concrete.fc), u.stress)));
    if let Some(t) = &input.topping {
        let (len, stress) = (u.length, u.stress);
        let (thick, wide, fc) = (printed(t.thickness), printed(t.width), printed(t.concrete.fc));
        rows.push(("Topping", format!("{thick} {len} thick, {wide} {len} wide, f'c = {fc} {stress}")));
    }
    if let Some(l) = input.length {
        rows.push(("Length, end to end (x from the left end)", format!("{} {}", printed(l), u.length)));
    }
    let code = basis.name();
    rows.push((
        "Member kind",
        match input.kind {
            Kind::Beam => format!("beam ({code} {})", basis.member_chapter(false)),
            Kind::OneWaySlab => format!("one-way slab ({code} {})", basis.member_chapter(true)),
        },
    ));
    rows
}

fn strand_row(i: usize, s: &StrandLayer, input: &Member, u: UnitNames) -> StrandRow {
    // depths from the top of the precast unit, as input; with a topping also dp from the
    // top of the section, the datum of the steps and tables
    let t = input.topping_thickness();
    let d = |x: f64| if t > 0.0 { format!("{} (dp {})", printed(x), printed(x + t)) } else { printed(x) };
    let level = match s.profile {
        Profile::Straight { depth } => format!("depth {} {}", d(depth), u.length),
        Profile::Harped { depth_end, depth_harp, harp_x, harp_x2: Some(x2), harp_x2_given: true } => format!(
            "harped: depth {} at the ends, {} between x = {} and {} {}",
            d(depth_end),
            d(depth_harp),
            printed(harp_x),
            printed(x2),
            u.length
        ),
        Profile::Harped { depth_end, depth_harp, harp_x, .. } => format!(
            "harped: depth {} at the ends, {} from {} {} from each end",
            d(depth_end),
            d(depth_harp),
            printed(harp_x),
            u.length
        ),
    };
    StrandRow {
        index: i + 1,
        count: s.count,
        size: s.size.unwrap_or("non-standard"),
        diameter: printed(s.diameter),
        area: printed(s.area),
        total_area: printed(s.total_area()),
        fpu: printed(s.fpu),
        fse: printed(s.fse),
        level,
        model: s.model,
        model_shown: s.model.short(),
        debonded: (s.debonded_length > 0.0).then(|| printed(s.debonded_length)),
    }
}

fn bar_row(i: usize, b: &BarLayer) -> BarRow {
    BarRow {
        index: i + 1,
        count: b.count,
        size: b.size.unwrap_or("non-standard"),
        diameter: printed(b.diameter),
        area: printed(b.area),
        total_area: printed(b.total_area()),
        fy: printed(b.fy),
        depth: printed(b.depth),
    }
}

/// A polygon's outline and holes, numbered point by point.
fn vertices(shape: &Shape) -> Vec<Ring> {
    let Shape::Polygon { outline, holes } = shape else { return Vec::new() };
    let ring = |name: String, points: &[[f64; 2]]| Ring {
        ring: name,
        points: points.iter().enumerate().map(|(k, p)| [(k + 1).to_string(), printed(p[0]), printed(p[1])]).collect(),
    };
    std::iter::once(ring("outline".to_string(), outline))
        .chain(holes.iter().enumerate().map(|(k, h)| ring(format!("hole {}", k + 1), h)))
        .collect()
}

/// The dimensions of a built-in shape, as the input summary lists them.
fn shape_dims(s: &Shape) -> Vec<(&'static str, f64)> {
    use Shape::*;
    match *s {
        Rectangle { width, height } => vec![("Width", width), ("Height", height)],
        Tee { flange_width, flange_thickness, web_width, height } => vec![
            ("Flange width", flange_width),
            ("Flange thickness", flange_thickness),
            ("Web width", web_width),
            ("Height", height),
        ],
        InvertedTee { web_width, height, ledge_width, ledge_height, .. } => vec![
            ("Stem width", web_width),
            ("Height", height),
            ("Ledge projection", ledge_width),
            ("Ledge height", ledge_height),
        ],
        DoubleTee { flange_width, flange_thickness, height, stem_spacing, stem_width_top, stem_width_bottom } => vec![
            ("Flange width", flange_width),
            ("Flange thickness", flange_thickness),
            ("Height", height),
            ("Stem spacing", stem_spacing),
            ("Stem width, top", stem_width_top),
            ("Stem width, bottom", stem_width_bottom),
        ],
        IGirder {
            height,
            top_flange_width,
            top_flange_thickness,
            top_taper,
            web_width,
            bottom_flange_width,
            bottom_flange_thickness,
            bottom_taper,
        } => vec![
            ("Height", height),
            ("Top flange width", top_flange_width),
            ("Top flange thickness", top_flange_thickness),
            ("Top taper", top_taper),
            ("Web width", web_width),
            ("Bottom flange width", bottom_flange_width),
            ("Bottom flange thickness", bottom_flange_thickness),
            ("Bottom taper", bottom_taper),
        ],
        HollowCore { width, height, void_diameter, void_center_height, .. } => vec![
            ("Width", width),
            ("Height", height),
            ("Void diameter", void_diameter),
            ("Void centre height", void_center_height),
        ],
        Polygon { .. } => vec![],
    }
}
