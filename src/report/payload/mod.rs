//! The payload: everything the package shows, as typed data. It holds the program
//! version, the parsed input, every result and the whole trace, with each displayed
//! number also as the text it is printed as (formatted here, never in the templates).
//! Its canonical bytes are hashed (the content hash, [`crate::integrity::content_hash`])
//! and attached to the PDF; the views the templates read ([`super::view`]) are made of
//! its pieces; `verify` and `diff` read it back as [`Stored`].
//!
//! The analysis's result structs are embedded as they are (a location's result less its
//! trace, which is written as steps; see [`omit`]), so a field the analysis adds reaches
//! the payload without an edit here.

mod curve;
mod demand;
mod location;
mod member;
pub mod omit;
mod step;
mod stored;
mod stresses;

pub use curve::{CurvePlot, Line, MarkShown, Tick};
pub use demand::{DemandShown, Diagram, StationShown};
pub use location::{LayerShown, LocationPayload, LocationShown, TrialShown, ValuesShown};
pub use member::{BarRow, MemberPayload, MemberShown, Ring, SectionShown, StrandRow};
pub use step::{InputShown, StepPayload, StepShown};
pub use stored::{LayerRecord, LocationRecord, MemberRecord, Stored, Written};

use crate::analysis::Analysis;
use crate::analysis::conclusion::{ConditionKind, Status};
use crate::input::model::{Meta, Paper, Warning};
use crate::input::{Package, Source};
use crate::trace::{Unit, ratio_text};
use crate::units::System;
use serde::{Deserialize, Serialize};

/// The payload of a package.
#[derive(Serialize)]
pub struct Payload<'a> {
    #[serde(flatten)]
    pub head: Head,
    pub summary: Vec<SummaryRow>,
    /// One row per member whose stresses are checked.
    pub stress_summary: Vec<StressSummaryRow>,
    /// Every open condition of the package (the back matter lists them all).
    pub open_items: Vec<OpenItem>,
    /// The open conditions by kind, for the cover.
    pub open_kinds: Vec<OpenKind>,
    pub members: Vec<MemberPayload<'a>>,
}

/// What every sheet reads: the program, the units, the input file, the package's data,
/// the defaults taken and the input's warnings. Written and read back alike.
#[derive(Serialize, Deserialize, Clone)]
pub struct Head {
    pub format: u32,
    pub program: Program,
    /// "builtin", or "sha256:" and the hash of the template folder.
    pub templates: String,
    pub units: UnitsShown,
    pub input: InputFile,
    pub package: PackageShown,
    pub defaults: Vec<DefaultShown>,
    pub warnings: Vec<WarningShown>,
}

#[derive(Serialize, Deserialize, Clone, PartialEq)]
pub struct Program {
    pub name: String,
    pub version: String,
}

/// The unit names the sheets print.
#[derive(Serialize, Deserialize, Clone)]
pub struct UnitsShown {
    /// "us" or "si".
    pub system: String,
    pub length: String,
    pub area: String,
    pub stress: String,
    pub force: String,
    pub moment: String,
    pub inertia: String,
    pub modulus: String,
    /// The coherent units of the parsed input ("in, in2, ksi, kip, kip-in").
    pub input_coherent: String,
}

impl UnitsShown {
    /// The unit system these names are of.
    pub fn system(&self) -> System {
        if self.system == "si" { System::Si } else { System::Us }
    }
}

/// The input file: its name, SHA-256 and number of lines.
#[derive(Serialize, Deserialize, Clone)]
pub struct InputFile {
    pub name: String,
    pub sha256: String,
    pub lines: usize,
}

/// The package's data as the cover and the title blocks print it.
#[derive(Serialize, Deserialize, Clone)]
pub struct PackageShown {
    pub title: String,
    pub project: String,
    pub project_number: String,
    pub client: String,
    pub subject: String,
    pub revision: String,
    pub date: String,
    pub basis: String,
    /// The code as the references list it (from the design basis; empty in the payloads
    /// of versions before 0.7.0).
    #[serde(default)]
    pub basis_reference: String,
    /// "letter" or "a4".
    pub paper: String,
    pub notes: Option<String>,
    pub revisions: Vec<RevisionShown>,
    pub signoffs: Vec<SignoffShown>,
    /// Not every sign-off is dated.
    pub draft: bool,
    pub pass: bool,
    #[serde(with = "status_word")]
    pub status: Status,
    /// Members whose demand is derived from their loads, and those with a location
    /// whose Mu is given by hand (the cover's scope names both).
    pub demand_derived: Vec<String>,
    pub demand_given: Vec<String>,
    /// Members with a hogging moment over an overhang (shown, not checked).
    pub hogging: Vec<String>,
    /// Members with a layer whose losses are computed, and members with a layer whose
    /// fse or losses are given.
    pub losses_computed: Vec<String>,
    pub losses_given: Vec<String>,
    /// Members whose stresses are checked at release and in service; in service only
    /// (the release stage lacks f'ci or fpi); not at all (no loads).
    #[serde(default)]
    pub stresses_checked: Vec<String>,
    #[serde(default)]
    pub stresses_service_only: Vec<String>,
    #[serde(default)]
    pub stresses_unchecked: Vec<String>,
    /// Members whose camber is estimated, and those of them whose live-load deflection
    /// is not computed (class T or C).
    #[serde(default)]
    pub camber_computed: Vec<String>,
    #[serde(default)]
    pub deflection_not_computed: Vec<String>,
    /// Members of class C (their crack control made on the cracked section), and members
    /// whose live-load deflection is found by the bilinear relation (class T or C).
    #[serde(default)]
    pub class_c: Vec<String>,
    #[serde(default)]
    pub deflection_bilinear: Vec<String>,
}

#[derive(Serialize, Deserialize, Clone)]
pub struct RevisionShown {
    pub rev: String,
    pub date: String,
    pub description: String,
}

#[derive(Serialize, Deserialize, Clone)]
pub struct SignoffShown {
    pub role: String,
    pub name: String,
    pub license: Option<String>,
    pub firm: Option<String>,
    pub date: Option<String>,
}

/// A value taken by default, and the members that took it ("all members" or ids).
#[derive(Serialize, Deserialize, Clone)]
pub struct DefaultShown {
    pub text: String,
    pub members: String,
}

/// A warning about the input (allowed, but unusual).
#[derive(Serialize, Deserialize, Clone)]
pub struct WarningShown {
    pub at: String,
    pub key: String,
    pub message: String,
}

/// A row of the summary table: a location of a member.
#[derive(Serialize)]
pub struct SummaryRow {
    pub member: String,
    pub location: String,
    pub x: String,
    pub phi_mn: String,
    pub mu: String,
    pub ratio: String,
    pub control: &'static str,
    pub phi: String,
    /// The minimum strength: "met", "waived (see sheet)" or "not met".
    pub min: &'static str,
    pub pass: bool,
    pub status: Status,
    /// Adequate only on the open conditions the conclusion lists.
    pub caution: bool,
    pub governing: bool,
}

/// A member's stresses in the summary: its class, the worst stress against its limit at
/// release and in service, the largest reinforcement at release, and its result.
#[derive(Serialize)]
pub struct StressSummaryRow {
    /// The member's position in the package (for the link to its stress sheet).
    pub index: usize,
    pub member: String,
    pub class: &'static str,
    pub release: String,
    pub service: String,
    pub reinforcement: String,
    /// The live-load deflection against its limit, or why it is not given.
    pub deflection: String,
    pub pass: bool,
    pub caution: bool,
}

fn stress_summary(a: &Analysis) -> Vec<StressSummaryRow> {
    let at = |w: (f64, f64)| format!("{} at x = {}", ratio_text(w.0), printed(w.1));
    (a.members.iter().enumerate())
        .filter_map(|(index, m)| {
            let s = m.stresses.as_ref()?;
            let steel = s.reinforcement.iter().map(|r| r.area).fold(0.0, f64::max);
            Some(StressSummaryRow {
                index,
                member: m.id.clone(),
                class: s.class.letter(),
                release: if s.release.checked {
                    s.worst_release.map_or_else(|| "—".into(), at)
                } else {
                    "not checked".into()
                },
                service: at(s.worst_service),
                reinforcement: if s.reinforcement.is_empty() { "—".into() } else { printed(steel) },
                deflection: m
                    .deflection
                    .as_ref()
                    .map_or_else(|| "—".into(), |d| d.short(s.class.letter(), "≤", printed)),
                pass: s.pass && m.deflection.as_ref().is_none_or(|l| l.ok),
                caution: !m.conditions.is_empty(),
            })
        })
        .collect()
}

/// An open condition, where it is.
#[derive(Serialize)]
pub struct OpenItem {
    pub member: String,
    pub location: String,
    pub kind: ConditionKind,
    pub short: String,
}

/// The open conditions of one kind: what they ask, how many, and the first places.
#[derive(Serialize)]
pub struct OpenKind {
    pub title: &'static str,
    pub count: usize,
    pub places: String,
}

/// Options of the render that enter the payload.
pub struct Provenance<'a> {
    /// "builtin", or the SHA-256 of a template folder.
    pub templates: &'a str,
}

/// Builds the payload.
pub fn build<'a>(pkg: &'a Package, src: &Source, a: &'a Analysis, prov: &Provenance) -> Payload<'a> {
    let members = {
        use rayon::prelude::*;
        let basis = pkg.basis();
        a.members.par_iter().zip(&pkg.members).map(|(r, m)| member::member(r, m, basis)).collect()
    };
    Payload {
        head: head(pkg, src, a, prov),
        summary: summary(a),
        stress_summary: stress_summary(a),
        open_items: open_items(a),
        open_kinds: open_kinds(a),
        members,
    }
}

impl Payload<'_> {
    /// The canonical bytes of the payload (their SHA-256 is the content hash).
    pub fn canonical(&self) -> crate::Result<Vec<u8>> {
        let v = serde_json::to_value(self)
            .map_err(|e| crate::Error::Render(format!("the payload cannot be written ({e})")))?;
        Ok(crate::integrity::content_hash::canonical(&v))
    }
}

fn head(pkg: &Package, src: &Source, a: &Analysis, prov: &Provenance) -> Head {
    let name = std::path::Path::new(&src.name)
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| src.name.clone());
    Head {
        format: 1,
        program: Program { name: "strainsheet".into(), version: env!("CARGO_PKG_VERSION").into() },
        templates: prov.templates.to_string(),
        units: units_shown(pkg.units),
        input: InputFile {
            name,
            sha256: crate::integrity::sha256_hex(src.text.as_bytes()),
            lines: src.text.lines().count(),
        },
        package: package_shown(&pkg.meta, pkg.basis(), a),
        defaults: defaults(pkg),
        warnings: pkg.warnings.iter().map(warning).collect(),
    }
}

fn units_shown(sys: System) -> UnitsShown {
    let u = sys.names();
    UnitsShown {
        system: sys.label().into(),
        length: u.length.into(),
        area: Unit::Area.name(sys).into(),
        stress: u.stress.into(),
        force: u.force.into(),
        moment: u.moment.into(),
        inertia: Unit::Inertia.name(sys).into(),
        modulus: Unit::Modulus.name(sys).into(),
        input_coherent: match sys {
            System::Us => "in, in2, ksi, kip, kip-in",
            System::Si => "mm, mm2, MPa, N, N-mm",
        }
        .into(),
    }
}

fn package_shown(meta: &Meta, basis: &dyn crate::basis::Basis, a: &Analysis) -> PackageShown {
    let ids = |f: &dyn Fn(&crate::analysis::MemberResult) -> bool| {
        a.members.iter().filter(|m| f(m)).map(|m| m.id.clone()).collect::<Vec<_>>()
    };
    PackageShown {
        demand_derived: ids(&|m| m.demand.is_some()),
        demand_given: ids(&|m| m.locations.iter().any(|l| l.demand_from_loads.is_none())),
        hogging: ids(&|m| m.demand.as_ref().is_some_and(|d| d.hogging > 0.0)),
        losses_computed: ids(&|m| m.prestress.iter().any(|l| l.source == "computed")),
        losses_given: ids(&|m| m.prestress.iter().any(|l| l.source != "computed")),
        stresses_checked: ids(&|m| m.stresses.as_ref().is_some_and(|s| s.release.checked)),
        stresses_service_only: ids(&|m| m.stresses.as_ref().is_some_and(|s| !s.release.checked)),
        stresses_unchecked: ids(&|m| m.stresses.is_none()),
        camber_computed: ids(&|m| m.camber.is_some()),
        deflection_not_computed: ids(&|m| m.deflection.as_ref().is_some_and(|l| l.live.is_none())),
        class_c: ids(&|m| m.stresses.as_ref().is_some_and(|s| s.class == crate::analysis::stresses::Class::C)),
        deflection_bilinear: ids(&|m| m.deflection.as_ref().is_some_and(|l| l.live.is_some() && l.cracked.is_some())),
        title: meta.title.clone(),
        project: meta.project.clone(),
        project_number: meta.project_number.clone(),
        client: meta.client.clone(),
        subject: meta.subject.clone(),
        revision: meta.revision.clone(),
        date: meta.date.to_string(),
        basis: meta.basis.clone(),
        basis_reference: basis.reference().into(),
        paper: match meta.paper {
            Paper::Letter => "letter",
            Paper::A4 => "a4",
        }
        .into(),
        notes: meta.notes.clone(),
        revisions: meta
            .revisions
            .iter()
            .map(|r| RevisionShown { rev: r.rev.clone(), date: r.date.to_string(), description: r.description.clone() })
            .collect(),
        signoffs: meta
            .signoffs
            .iter()
            .map(|s| SignoffShown {
                role: s.role.name().into(),
                name: s.name.clone(),
                license: s.license.clone(),
                firm: s.firm.clone(),
                date: s.date.map(|d| d.to_string()),
            })
            .collect(),
        draft: meta.is_draft(),
        pass: a.pass(),
        status: a.status(),
    }
}

fn warning(w: &Warning) -> WarningShown {
    WarningShown { at: w.at.clone(), key: w.key.clone(), message: w.message.clone() }
}

/// The defaults taken, each with the members that took it.
fn defaults(pkg: &Package) -> Vec<DefaultShown> {
    let mut found: Vec<(String, Vec<&str>)> = Vec::new();
    for m in &pkg.members {
        for d in &m.defaults {
            match found.iter_mut().find(|(t, _)| *t == d.text) {
                Some((_, ids)) if !ids.contains(&m.id.as_str()) => ids.push(&m.id),
                Some(_) => {}
                None => found.push((d.text.clone(), vec![&m.id])),
            }
        }
    }
    let all = pkg.members.len();
    found
        .into_iter()
        .map(|(text, ids)| DefaultShown {
            text,
            members: if ids.len() == all { "all members".to_string() } else { ids.join(", ") },
        })
        .collect()
}

fn summary(a: &Analysis) -> Vec<SummaryRow> {
    let rows = a.members.iter().flat_map(|m| {
        m.locations.iter().enumerate().map(move |(i, l)| SummaryRow {
            member: m.id.clone(),
            location: l.name.clone(),
            x: l.x.map(printed).unwrap_or_else(|| "—".into()),
            phi_mn: printed(l.phi_mn),
            mu: printed(l.mu),
            ratio: ratio_text(l.ratio),
            control: l.control,
            phi: printed(l.phi),
            min: if l.min_reinforcement.ok {
                "met"
            } else if l.min_reinforcement.waiver_flexure {
                "waived (see sheet)"
            } else {
                "not met"
            },
            pass: l.pass,
            status: l.status,
            caution: l.status == Status::Conditional,
            governing: i == m.governing,
        })
    });
    rows.collect()
}

fn open_items(a: &Analysis) -> Vec<OpenItem> {
    let mut out = Vec::new();
    for m in &a.members {
        for l in &m.locations {
            out.extend(l.conditions.iter().map(|c| OpenItem {
                member: m.id.clone(),
                location: l.name.clone(),
                kind: c.kind,
                short: c.short.clone(),
            }));
        }
        out.extend(m.conditions.iter().map(|c| OpenItem {
            member: m.id.clone(),
            location: "stresses".into(),
            kind: c.kind,
            short: c.short.clone(),
        }));
    }
    out
}

/// The open conditions by kind, in the order each kind first appears: what the kind asks
/// and its first few places.
fn open_kinds(a: &Analysis) -> Vec<OpenKind> {
    const SHOWN: usize = 4;
    let mut kinds: Vec<(ConditionKind, Vec<String>)> = Vec::new();
    for m in &a.members {
        let named = m.locations.iter().flat_map(|l| l.conditions.iter().map(move |c| (l.name.as_str(), c)));
        for (name, c) in named.chain(m.conditions.iter().map(|c| ("stresses", c))) {
            let at = format!("{} · {}", m.id, name);
            match kinds.iter_mut().find(|(k, _)| *k == c.kind) {
                Some((_, list)) => list.push(at),
                None => kinds.push((c.kind, vec![at])),
            }
        }
    }
    let kind = |(k, at): (ConditionKind, Vec<String>)| {
        let mut places = at.iter().take(SHOWN).cloned().collect::<Vec<_>>().join("; ");
        let more = at.len().saturating_sub(SHOWN);
        if more > 0 {
            places.push_str(&format!("; and {more} more"));
        }
        OpenKind { title: k.title(), count: at.len(), places }
    };
    kinds.into_iter().map(kind).collect()
}

/// A number as the sheets print it: [`crate::trace::show`] with a true minus sign (the
/// plain trace and `check` keep the ASCII hyphen, which tools read).
pub fn printed(v: f64) -> String {
    minus(crate::trace::show(v))
}

/// [`crate::trace::scaled`] with a true minus sign.
fn printed_scaled(v: f64, u: Unit) -> String {
    minus(crate::trace::scaled(v, u))
}

/// A leading hyphen made a true minus sign.
fn minus(s: String) -> String {
    match s.strip_prefix('-') {
        Some(rest) => format!("−{rest}"),
        None => s,
    }
}

/// What the sheets print for a unit.
fn unit_name(u: Unit, sys: System) -> &'static str {
    u.name(sys)
}

/// A [`Status`] as the payload writes it ("pass", "conditional", "fail"), read back.
mod status_word {
    use crate::analysis::conclusion::Status;
    use serde::{Deserialize, Deserializer, Serialize, Serializer};

    pub fn serialize<S: Serializer>(s: &Status, out: S) -> Result<S::Ok, S::Error> {
        s.serialize(out)
    }

    pub fn deserialize<'de, D: Deserializer<'de>>(d: D) -> Result<Status, D::Error> {
        match String::deserialize(d)?.as_str() {
            "pass" => Ok(Status::Pass),
            "conditional" => Ok(Status::Conditional),
            "fail" => Ok(Status::Fail),
            other => Err(serde::de::Error::custom(format!("{other:?} is not a result"))),
        }
    }
}
