//! The views: what each entry template reads as `view.json`, one typed view an entry.
//! Each is made of the payload's pieces, so every number it holds is the payload's; the
//! decisions the sheets show (a reduced φ, a strand held at fpx, how many locations are
//! conditional) are made here, never in the templates.
//!
//! - [`MembersView`], for `members.typ`: a run of members, each as its sheets read it
//!   (no formula trees, step inputs, parsed input or solver log: keeping it small keeps
//!   the typesetting fast);
//! - [`PackageView`], for `package.typ`: the front and back matter, with each member's
//!   names only and where the members' anchors fell;
//! - [`NumbersView`], for `sheet-numbers.typ`: the number of sheets and the subject
//!   marks of the whole package in sheet order.

use super::payload::{
    Head, LayerShown, LocationPayload, LocationShown, MemberPayload, MemberShown, OpenItem, OpenKind, StepShown,
    SummaryRow, omit::Omit,
};
use crate::analysis::conclusion::Status;
use crate::analysis::{LayerOut, LocationResult};
use serde::Serialize;
use std::collections::BTreeMap;

/// The view of a run of members (`members.typ`).
#[derive(Serialize)]
pub struct MembersView<'a> {
    #[serde(flatten)]
    pub head: &'a Head,
    /// The position of the run's first member in the package.
    pub first: usize,
    pub members: Vec<MemberView<'a>>,
}

/// A member as its sheets read it.
#[derive(Serialize)]
pub struct MemberView<'a> {
    #[serde(flatten)]
    pub shown: &'a MemberShown<'a>,
    pub steps: Vec<&'a StepShown>,
    pub locations: Vec<LocationView<'a>>,
}

/// A location as its sheets read it: its result (but the trace, the solver's raw log and
/// the raw layers, given below with their printed values), its steps and its printed
/// values.
#[derive(Serialize)]
pub struct LocationView<'a> {
    #[serde(flatten)]
    pub result: Omit<'a, LocationResult>,
    pub strands: Vec<LayerView<'a>>,
    pub bars: Vec<LayerView<'a>>,
    pub steps: Vec<&'a StepShown>,
    #[serde(flatten)]
    pub shown: &'a LocationShown,
    /// φ is reduced below the flexural value because strand is not fully developed.
    pub phi_reduced: bool,
    /// Some strand is not fully developed here and held at fpx.
    pub strand_capped: bool,
}

/// A steel layer with its printed values, so that a figure labels it without looking
/// it up.
#[derive(Serialize)]
pub struct LayerView<'a> {
    #[serde(flatten)]
    pub layer: &'a LayerOut,
    pub shown: &'a LayerShown,
}

/// The view of the front and back matter (`package.typ`).
#[derive(Serialize)]
pub struct PackageView<'a> {
    #[serde(flatten)]
    pub head: &'a Head,
    pub summary: &'a [SummaryRow],
    pub stress_summary: &'a [super::payload::StressSummaryRow],
    pub open_items: &'a [OpenItem],
    pub open_kinds: &'a [OpenKind],
    /// How many locations are adequate only on open conditions.
    pub conditional_locations: usize,
    pub members: &'a [ContentsEntry],
    pub sheets: &'a MemberSheets,
}

/// What the contents lists of a member: its names.
#[derive(Serialize)]
pub struct ContentsEntry {
    pub id: String,
    pub description: String,
    /// The member has loads: its demand sheet and capacity diagram are listed too.
    pub has_demand: bool,
    /// Whether it has a stress sheet (a member with loads).
    pub has_stresses: bool,
    pub locations: Vec<ContentsLocation>,
}

#[derive(Serialize)]
pub struct ContentsLocation {
    pub name: String,
    pub shown: ContentsValues,
}

/// The banner values of a location the contents repeats.
#[derive(Serialize)]
pub struct ContentsValues {
    pub x_label: String,
    pub mu: String,
}

/// Where the members' sheets are: how many, and the sheet (counted from the first member
/// sheet, 1) and place of each of their anchors.
#[derive(Serialize, Default)]
pub struct MemberSheets {
    pub members: usize,
    pub anchors: BTreeMap<String, Anchor>,
}

/// An anchor's sheet and place on it (points from the top left).
#[derive(Serialize)]
pub struct Anchor {
    pub page: usize,
    pub x: f64,
    pub y: f64,
}

/// The view of the sheet numbers (`sheet-numbers.typ`).
#[derive(Serialize)]
pub struct NumbersView<'a> {
    #[serde(flatten)]
    pub head: &'a Head,
    pub sheet_numbers: SheetNumbers,
}

/// The number of sheets, and every subject mark of the package in sheet order.
#[derive(Serialize)]
pub struct SheetNumbers {
    pub total: usize,
    pub marks: Vec<SubjectMark>,
}

/// A subject mark: its sheet, its height on it (points) and the subject.
#[derive(Serialize, Clone)]
pub struct SubjectMark {
    pub page: usize,
    pub y: f64,
    pub value: String,
}

/// The members of a run as their sheets read them.
pub fn members<'a>(members: &'a [MemberPayload<'a>]) -> Vec<MemberView<'a>> {
    members.iter().map(member).collect()
}

fn member<'a>(m: &'a MemberPayload<'a>) -> MemberView<'a> {
    MemberView {
        shown: &m.shown,
        steps: m.steps.iter().map(|s| &s.shown).collect(),
        locations: m.locations.iter().map(location).collect(),
    }
}

fn location<'a>(l: &'a LocationPayload<'a>) -> LocationView<'a> {
    let r = l.result.value;
    let layers = |raw: &'a [LayerOut], shown: &'a [LayerShown]| -> Vec<LayerView<'a>> {
        raw.iter().zip(shown).map(|(layer, shown)| LayerView { layer, shown }).collect()
    };
    LocationView {
        result: Omit { value: r, omitted: &["trace", "iterations", "strands", "bars"] },
        strands: layers(&r.strands, &l.shown.strands_shown),
        bars: layers(&r.bars, &l.shown.bars_shown),
        steps: l.steps.iter().map(|s| &s.shown).collect(),
        shown: &l.shown,
        phi_reduced: r.phi < r.phi_flexure,
        strand_capped: r.strands.iter().any(|s| s.cap.is_some()),
    }
}

/// What the contents lists of each member.
pub fn contents(members: &[MemberPayload]) -> Vec<ContentsEntry> {
    members
        .iter()
        .map(|m| ContentsEntry {
            id: m.shown.id.to_string(),
            description: m.shown.description.to_string(),
            has_demand: m.shown.demand.is_some(),
            has_stresses: m.shown.stresses.is_some(),
            locations: m
                .locations
                .iter()
                .map(|l| ContentsLocation {
                    name: l.result.value.name.clone(),
                    shown: ContentsValues { x_label: l.shown.shown.x_label.clone(), mu: l.shown.shown.mu.clone() },
                })
                .collect(),
        })
        .collect()
}

/// How many rows of the summary are adequate only on open conditions.
pub fn conditional_locations(summary: &[SummaryRow]) -> usize {
    summary.iter().filter(|r| r.status == Status::Conditional).count()
}

#[cfg(test)]
mod tests {
    //! Each view's keys are pinned: every key a template reads must be in its view, so
    //! that a field cannot be lost without this test saying which.

    use super::*;
    use crate::report::payload::{self, Provenance};
    use serde_json::Value;

    /// Every key path of a JSON value ("members[].locations[].shown.x_label").
    fn paths(v: &Value, at: &str, out: &mut std::collections::BTreeSet<String>) {
        match v {
            Value::Object(m) => {
                for (k, x) in m {
                    let p = if at.is_empty() { k.clone() } else { format!("{at}.{k}") };
                    out.insert(p.clone());
                    paths(x, &p, out);
                }
            }
            Value::Array(xs) => xs.iter().for_each(|x| paths(x, &format!("{at}[]"), out)),
            _ => {}
        }
    }

    fn assert_keys(name: &str, view: &impl Serialize, wanted: &[&str]) {
        let mut found = std::collections::BTreeSet::new();
        paths(&serde_json::to_value(view).unwrap(), "", &mut found);
        let missing: Vec<&&str> = wanted.iter().filter(|k| !found.contains(**k)).collect();
        assert!(missing.is_empty(), "{name} lacks {missing:?}");
    }

    /// The keys the templates read of the package's head (sheet.typ, package.typ).
    const HEAD: &[&str] = &[
        "package.title",
        "package.project",
        "package.project_number",
        "package.client",
        "package.subject",
        "package.revision",
        "package.date",
        "package.basis",
        "package.basis_reference",
        "package.paper",
        "package.notes",
        "package.draft",
        "package.pass",
        "package.demand_derived",
        "package.demand_given",
        "package.hogging",
        "package.losses_computed",
        "package.losses_given",
        "package.stresses_checked",
        "package.stresses_service_only",
        "package.stresses_unchecked",
        "package.camber_computed",
        "package.deflection_not_computed",
        "package.class_c",
        "package.deflection_bilinear",
        "package.signoffs[].role",
        "package.signoffs[].name",
        "package.signoffs[].license",
        "package.signoffs[].firm",
        "package.signoffs[].date",
        "package.revisions[].rev",
        "package.revisions[].date",
        "package.revisions[].description",
        "units.system",
        "units.length",
        "units.area",
        "units.stress",
        "units.force",
        "units.moment",
        "program.name",
        "program.version",
        "input.name",
        "input.sha256",
        "input.lines",
        "templates",
        "defaults",
        "warnings",
    ];

    /// The keys members.typ, member.typ, figures.typ and curve.typ read.
    const MEMBERS: &[&str] = &[
        "first",
        "members[].id",
        "members[].description",
        "members[].governing",
        "members[].input_rows",
        "members[].losses_x",
        "members[].section.height",
        "members[].section.asymmetric",
        "members[].section.composite",
        "members[].section.geometry.x_min",
        "members[].section.geometry.x_max",
        "members[].section.geometry.y_min",
        "members[].section.geometry.y_max",
        "members[].section.geometry.outline",
        "members[].section.geometry.holes",
        "members[].section.geometry.topping",
        "members[].section_shown.height",
        "members[].section_shown.width",
        "members[].strands[].index",
        "members[].strands[].count",
        "members[].strands[].size",
        "members[].strands[].area",
        "members[].strands[].total_area",
        "members[].strands[].fse",
        "members[].strands[].level",
        "members[].strands[].debonded",
        "members[].strands[].model_shown",
        "members[].bars",
        "members[].vertices",
        "members[].curve",
        "members[].curve_error",
        "members[].steps[].group",
        "members[].steps[].title",
        "members[].steps[].clause",
        "members[].steps[].note",
        "members[].steps[].sym",
        "members[].steps[].formula",
        "members[].steps[].subst",
        "members[].steps[].shown_math",
        "members[].steps[].unit",
        "members[].steps[].stack",
        "members[].locations[].name",
        "members[].locations[].x",
        "members[].locations[].a",
        "members[].locations[].c",
        "members[].locations[].cc",
        "members[].locations[].dc",
        "members[].locations[].pass",
        "members[].locations[].status",
        "members[].locations[].strength_ok",
        "members[].locations[].solved",
        "members[].locations[].control",
        "members[].locations[].conclusion",
        "members[].locations[].conditions[].text",
        "members[].locations[].notes",
        "members[].locations[].block_rings",
        "members[].locations[].phi_reduced",
        "members[].locations[].strand_capped",
        "members[].locations[].min_reinforcement.ok",
        "members[].locations[].min_reinforcement.waiver_flexure",
        "members[].locations[].min_reinforcement.waiver_clause",
        "members[].locations[].approximate.applicable",
        "members[].locations[].approximate.reason",
        "members[].locations[].steps[].short",
        "members[].locations[].steps[].group",
        "members[].locations[].strands[].kind",
        "members[].locations[].strands[].index",
        "members[].locations[].strands[].active",
        "members[].locations[].strands[].depth",
        "members[].locations[].strands[].eps",
        "members[].locations[].strands[].eps3",
        "members[].locations[].strands[].force",
        "members[].locations[].strands[].points",
        "members[].locations[].strands[].diameter",
        "members[].locations[].strands[].shown.depth",
        "members[].locations[].strands[].shown.eps",
        "members[].locations[].strands[].shown.force",
        "members[].locations[].strands[].shown.label",
        "members[].locations[].bars",
        "members[].locations[].strands_shown[].index",
        "members[].locations[].strands_shown[].label",
        "members[].locations[].strands_shown[].area",
        "members[].locations[].strands_shown[].depth",
        "members[].locations[].strands_shown[].eps1",
        "members[].locations[].strands_shown[].eps2",
        "members[].locations[].strands_shown[].eps3",
        "members[].locations[].strands_shown[].eps",
        "members[].locations[].strands_shown[].stress",
        "members[].locations[].strands_shown[].force",
        "members[].locations[].strands_shown[].cap",
        "members[].locations[].bars_shown",
        "members[].locations[].iterations_shown[].k",
        "members[].locations[].iterations_shown[].method",
        "members[].locations[].iterations_shown[].c",
        "members[].locations[].iterations_shown[].a",
        "members[].locations[].iterations_shown[].eps",
        "members[].locations[].iterations_shown[].stress",
        "members[].locations[].iterations_shown[].cc",
        "members[].locations[].iterations_shown[].t",
        "members[].locations[].iterations_shown[].residual",
        "members[].locations[].shown.x_label",
        "members[].locations[].shown.mu",
        "members[].locations[].shown.a",
        "members[].locations[].shown.c",
        "members[].locations[].shown.cc",
        "members[].locations[].shown.dc",
        "members[].locations[].shown.phi",
        "members[].locations[].shown.phi_mn",
        "members[].locations[].shown.ratio",
        "members[].locations[].shown.min_required",
        "members[].locations[].shown.trials",
        "members[].locations[].shown.closure",
        "members[].locations[].demand_from_loads",
    ];

    /// The keys demand.typ reads of a member with loads (the demand sheet, the capacity
    /// diagram and the station table).
    const DEMAND: &[&str] = &[
        "members[].demand.length",
        "members[].demand.span",
        "members[].demand.bearing",
        "members[].demand.width",
        "members[].demand.line_unit",
        "members[].demand.area_loads",
        "members[].demand.shored",
        "members[].demand.loads[].kind",
        "members[].demand.loads[].symbol",
        "members[].demand.loads[].source",
        "members[].demand.loads[].area_load",
        "members[].demand.loads[].w",
        "members[].demand.loads[].carried_by",
        "members[].demand.points[].kind",
        "members[].demand.points[].symbol",
        "members[].demand.points[].name",
        "members[].demand.points[].p",
        "members[].demand.points[].x",
        "members[].demand.combinations[].name",
        "members[].demand.combinations[].text",
        "members[].demand.combinations[].governs",
        "members[].demand.combinations_clause",
        "members[].demand.live_reduced.factor",
        "members[].demand.live_reduced.reason",
        "members[].demand.live_reduced.clause",
        "members[].demand.absent",
        "members[].demand.hogging",
        "members[].demand.has_overhangs",
        "members[].demand.kinds",
        "members[].demand.derived_count",
        "members[].demand.untraced_count",
        "members[].demand.mirror_count",
        "members[].demand.stations[].x",
        "members[].demand.stations[].what",
        "members[].demand.stations[].end_region",
        "members[].demand.stations[].by_kind",
        "members[].demand.stations[].mu",
        "members[].demand.stations[].combination",
        "members[].demand.stations[].mnc",
        "members[].demand.stations[].phi",
        "members[].demand.stations[].phi_mn",
        "members[].demand.stations[].ratio",
        "members[].demand.stations[].min_ok",
        "members[].demand.stations[].status",
        "members[].demand.stations[].status_word",
        "members[].demand.stations[].derived",
        "members[].demand.stations[].role",
        "members[].demand.stations[].mirror_of",
        "members[].demand.diagram.x_range",
        "members[].demand.diagram.y_range",
        "members[].demand.diagram.x_ticks[].value",
        "members[].demand.diagram.x_ticks[].label",
        "members[].demand.diagram.y_ticks[].value",
        "members[].demand.diagram.y_ticks[].label",
        "members[].demand.diagram.x_label",
        "members[].demand.diagram.y_label",
        "members[].demand.diagram.phi_mn",
        "members[].demand.diagram.mu",
        "members[].demand.diagram.bearings",
        "members[].demand.diagram.regions",
        "members[].demand.diagram.marks[].x",
        "members[].demand.diagram.marks[].label",
        "members[].demand.diagram.marks[].row",
        "members[].demand.diagram.governing.x",
        "members[].demand.diagram.governing.phi_mn",
        "members[].demand.diagram.governing.mu",
        "members[].demand.diagram.governing.label",
        "members[].demand.diagram.key",
    ];

    /// A member with every kind of load, a point load and a reduced live-load factor,
    /// beside one without loads.
    const LOADED: &str = concat!(
        include_str!("../../tests/fixtures/loads-of-every-kind.toml"),
        r#"
[[member]]
id = "RB-2"
length = 480.0
[member.concrete]
fc = 6.0
[member.section]
shape = "rectangle"
width = 16.0
height = 32.0
[[member.strands]]
depth = 29.0
count = 8
diameter = 0.5
fse = 160.0
[[member.location]]
name = "midspan"
x = 240.0
mu = 300.0
"#
    );

    #[test]
    fn a_member_with_loads_has_its_demand_in_the_view_and_one_without_has_none() {
        let src = crate::input::Source { name: "loaded.toml".into(), text: LOADED.into() };
        let pkg = crate::input::parse(&src).unwrap();
        let a = crate::analysis::analyze_full(&pkg).unwrap();
        let p = payload::build(&pkg, &src, &a, &Provenance { templates: "builtin" });
        let members = MembersView { head: &p.head, first: 0, members: super::members(&p.members[..1]) };
        assert_keys("a loaded member's view", &members, DEMAND);
        let v = serde_json::to_value(super::members(&p.members[1..])).unwrap();
        assert!(v[0].get("demand").is_none(), "a member without loads has no demand sheet");
        let raw = serde_json::to_value(&p.members[1]).unwrap();
        assert!(raw.get("demand_data").is_none() && raw.get("stations").is_none());
        let entries = contents(&p.members);
        assert!(entries[0].has_demand && !entries[1].has_demand);
    }

    /// The keys stresses.typ reads of a member whose stresses are checked (with the
    /// bonded reinforcement at release).
    const STRESSES: &[&str] = &[
        "members[].has_stresses",
        "members[].stresses.class",
        "members[].stresses.class_text",
        "members[].stresses.crack_text",
        "members[].stresses.release_checked",
        "members[].stresses.release_why_not",
        "members[].stresses.release_limits",
        "members[].stresses.service_limits",
        "members[].stresses.combinations",
        "members[].stresses.sustained_live",
        "members[].stresses.has_topping",
        "members[].stresses.rows[].x",
        "members[].stresses.rows[].end_zone",
        "members[].stresses.rows[].release[].text",
        "members[].stresses.rows[].release[].over",
        "members[].stresses.rows[].sustained[].text",
        "members[].stresses.rows[].service[].over",
        "members[].stresses.rows[].topping",
        "members[].stresses.rows[].worst",
        "members[].stresses.rows[].result",
        "members[].stresses.reinforcement[].x",
        "members[].stresses.reinforcement[].fibre",
        "members[].stresses.reinforcement[].force",
        "members[].stresses.reinforcement[].fs",
        "members[].stresses.reinforcement[].area",
        "members[].stresses.reinforcement_fy",
        "members[].stresses.reinforcement_rule",
        "members[].stresses.worst_release",
        "members[].stresses.worst_service",
        "members[].stresses.clauses.release",
        "members[].stresses.clauses.reinforcement",
        "members[].stresses.clauses.service",
        "members[].stresses.clauses.class",
        "members[].stresses.clauses.combinations",
        "members[].stresses.plot.x_range",
        "members[].stresses.plot.y_range",
        "members[].stresses.plot.x_ticks[].value",
        "members[].stresses.plot.y_ticks[].label",
        "members[].stresses.plot.x_label",
        "members[].stresses.plot.y_label",
        "members[].stresses.plot.bearings",
        "members[].stresses.plot.lines[].points",
        "members[].stresses.plot.lines[].stage",
        "members[].stresses.plot.lines[].fibre",
        "members[].stresses.plot.limits[].points",
        "members[].stresses.plot.limits[].stage",
    ];

    #[test]
    fn a_member_with_checked_stresses_has_its_stress_sheet_in_the_view() {
        let text = include_str!("../../examples/inverted-tee-girder.toml");
        let src = crate::input::Source { name: "girders.toml".into(), text: text.into() };
        let pkg = crate::input::parse(&src).unwrap();
        let a = crate::analysis::analyze_full(&pkg).unwrap();
        let p = payload::build(&pkg, &src, &a, &Provenance { templates: "builtin" });
        // LB-7 carries its tension at release with bonded reinforcement
        let members = MembersView { head: &p.head, first: 1, members: super::members(&p.members[1..2]) };
        let entries = contents(&p.members[1..2]);
        let v = serde_json::json!({ "members": serde_json::to_value(&members).unwrap()["members"], "has": entries });
        let mut found = std::collections::BTreeSet::new();
        paths(&v, "", &mut found);
        let wanted: Vec<String> = STRESSES
            .iter()
            .map(|k| if *k == "members[].has_stresses" { "has[].has_stresses".to_string() } else { k.to_string() })
            .collect();
        let missing: Vec<&String> = wanted.iter().filter(|k| !found.contains(k.as_str())).collect();
        assert!(missing.is_empty(), "the stress sheet's view lacks {missing:?}");
        assert!(p.stress_summary.iter().any(|r| r.member == "LB-7" && r.reinforcement != "—"));
    }

    /// The keys curve.typ reads of a member's plot.
    const CURVE: &[&str] = &[
        "members[].curve.location",
        "members[].curve.x_range",
        "members[].curve.y_range",
        "members[].curve.x_ticks[].value",
        "members[].curve.x_ticks[].label",
        "members[].curve.y_ticks[].value",
        "members[].curve.y_ticks[].label",
        "members[].curve.x_label",
        "members[].curve.y_label",
        "members[].curve.points",
        "members[].curve.marks[].name",
        "members[].curve.marks[].curvature",
        "members[].curve.marks[].moment",
        "members[].curve.marks[].curvature_shown",
        "members[].curve.marks[].moment_shown",
        "members[].curve.lines[].name",
        "members[].curve.lines[].value",
        "members[].curve.lines[].shown",
        "members[].curve.ductility",
        "members[].curve.ended_by",
        "members[].curve.concrete_model",
        "members[].curve.strips",
        "members[].curve.points_count",
        "members[].curve.notes",
        "members[].curve.peak_vs_mn",
        "members[].curve.cracking_vs_mcr",
    ];

    /// The keys package.typ reads besides the head.
    const PACKAGE: &[&str] = &[
        "summary[].member",
        "summary[].location",
        "summary[].x",
        "summary[].phi_mn",
        "summary[].mu",
        "summary[].ratio",
        "summary[].control",
        "summary[].phi",
        "summary[].min",
        "summary[].pass",
        "summary[].caution",
        "summary[].governing",
        "open_items[].member",
        "open_items[].location",
        "open_items[].short",
        "open_kinds[].title",
        "open_kinds[].count",
        "open_kinds[].places",
        "conditional_locations",
        "members[].id",
        "members[].description",
        "members[].has_demand",
        "members[].has_stresses",
        "members[].locations[].name",
        "members[].locations[].shown.x_label",
        "members[].locations[].shown.mu",
        "sheets.members",
        "sheets.anchors",
    ];

    #[test]
    fn every_key_the_templates_read_is_in_its_view() {
        // the double tee: a topping, strands held at fpx near the ends, conditions
        let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples/parking-double-tee.toml");
        let (src, pkg) = crate::input::load(&path).unwrap();
        let a = crate::analysis::analyze_full(&pkg).unwrap();
        let p = payload::build(&pkg, &src, &a, &Provenance { templates: "builtin" });
        let members = MembersView { head: &p.head, first: 0, members: super::members(&p.members) };
        assert_keys("the members' view", &members, &[HEAD, MEMBERS, CURVE].concat());
        let mut sheets = MemberSheets { members: 3, ..MemberSheets::default() };
        sheets.anchors.insert("toc:member:0".into(), Anchor { page: 1, x: 0.0, y: 0.0 });
        let entries = contents(&p.members);
        let package = PackageView {
            head: &p.head,
            summary: &p.summary,
            stress_summary: &p.stress_summary,
            open_items: &p.open_items,
            open_kinds: &p.open_kinds,
            conditional_locations: conditional_locations(&p.summary),
            members: &entries,
            sheets: &sheets,
        };
        assert_keys("the package's view", &package, &[HEAD, PACKAGE].concat());
        let numbers = NumbersView {
            head: &p.head,
            sheet_numbers: SheetNumbers {
                total: 1,
                marks: vec![SubjectMark { page: 1, y: 0.0, value: "Cover".into() }],
            },
        };
        let wanted = [
            "sheet_numbers.total",
            "sheet_numbers.marks[].page",
            "sheet_numbers.marks[].y",
            "sheet_numbers.marks[].value",
        ];
        assert_keys("the sheet numbers' view", &numbers, &[HEAD, &wanted].concat());
    }
}
