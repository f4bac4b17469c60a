//! What the analysis finds: the typed results of a member and of each check location,
//! as the payload, `check` and the templates read them.

use super::conclusion;
use crate::input::model::BlockMode;
use crate::section::{P, Props};
use crate::trace::Step;
use crate::units::System;
use serde::Serialize;

/// Section properties as shown.
#[derive(Debug, Clone, Serialize)]
pub struct PropsOut {
    pub area: f64,
    /// Height of the centroid above the bottom.
    pub yb: f64,
    pub i: f64,
    /// Distances from the centroid to the top and bottom fibres.
    pub ct: f64,
    pub cb: f64,
    pub st: f64,
    pub sb: f64,
}

impl PropsOut {
    pub(super) fn of(p: &Props) -> PropsOut {
        PropsOut { area: p.area, yb: p.cb(), i: p.i, ct: p.ct(), cb: p.cb(), st: p.st(), sb: p.sb() }
    }
}

/// What the package sketch needs to draw the section.
#[derive(Debug, Clone, Serialize)]
pub struct Geometry {
    pub outline: Vec<P>,
    pub holes: Vec<Vec<P>>,
    /// Topping rectangle [x0, y0, x1, y1].
    pub topping: Option<[f64; 4]>,
    pub x_min: f64,
    pub x_max: f64,
    pub y_min: f64,
    pub y_max: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct SectionResult {
    pub shape: &'static str,
    pub precast_height: f64,
    pub height: f64,
    pub precast: PropsOut,
    /// Transformed composite section (topping at the modular ratio).
    pub composite: Option<PropsOut>,
    pub modular_ratio: Option<f64>,
    pub ec: f64,
    pub fr: f64,
    pub ec_topping: Option<f64>,
    pub beta1: f64,
    pub geometry: Geometry,
    /// Not symmetric about a vertical axis (an L-beam): bending about a horizontal axis
    /// with lateral restraint is assumed, and the package says so.
    pub asymmetric: bool,
}

/// A steel layer's result at a location.
#[derive(Debug, Clone, Serialize)]
pub struct LayerOut {
    pub kind: &'static str,
    /// 1-based within its kind.
    pub index: usize,
    /// "6 × 1/2 in" or "3 #5".
    pub label: String,
    pub count: u32,
    /// Area of one strand or bar.
    pub unit_area: f64,
    pub area: f64,
    /// Depth below the top of the section (topping included).
    pub depth: f64,
    pub eps1: Option<f64>,
    pub eps2: Option<f64>,
    pub eps3: f64,
    pub eps: f64,
    pub stress: f64,
    pub force: f64,
    /// Effective prestress at this location (strand).
    pub fse: Option<f64>,
    /// Stress limit of a strand not fully developed here.
    pub cap: Option<f64>,
    /// Share of the layer inside the stress block (its displaced concrete deducted).
    pub in_block: f64,
    /// Whether the layer carries stress here (a debonded strand does not).
    pub active: bool,
    /// Points for the sketch.
    pub points: Vec<P>,
    pub diameter: f64,
}

/// Development of one strand layer at a location (ACI 318-19 25.4.8).
#[derive(Debug, Clone, Serialize)]
pub struct Development {
    pub layer: usize,
    /// The nearer member end, from which transfer, development and debonding are measured.
    pub end: crate::input::model::End,
    /// Distance from that end.
    pub x_end: f64,
    /// Distance from where bonding begins (x_end less the debonded length).
    pub x_bond: f64,
    pub debonded_length: f64,
    pub transfer_length: f64,
    pub development_length: f64,
    pub doubled: bool,
    pub fse_here: f64,
    pub fpx: Option<f64>,
    /// Position between the transfer and development lengths (0 within the transfer
    /// length), for strand not fully developed here.
    pub ratio: Option<f64>,
    pub phi: Option<f64>,
    pub state: &'static str,
}

#[derive(Debug, Clone, Serialize)]
pub struct MinReinforcement {
    pub clause: String,
    pub required: f64,
    pub ok: bool,
    /// phi Mn >= 2 Mu: the flexural half of the waiver clause holds.
    pub waiver_flexure: bool,
    pub waiver_clause: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Approximate {
    pub applicable: bool,
    pub reason: Option<String>,
    pub gamma_p: Option<f64>,
    pub rho_p: Option<f64>,
    pub fps: Option<f64>,
    pub a: Option<f64>,
    pub flanged: bool,
    pub mn: Option<f64>,
    /// (approximate - strain compatibility) / strain compatibility, per cent.
    pub difference: Option<f64>,
}

impl Approximate {
    /// The approximate method does not apply here, for the reason given.
    pub fn not_applicable(reason: String) -> Approximate {
        Approximate {
            applicable: false,
            reason: Some(reason),
            gamma_p: None,
            rho_p: None,
            fps: None,
            a: None,
            flanged: false,
            mn: None,
            difference: None,
        }
    }
}

/// The result with the other stress-block option, for comparison.
#[derive(Debug, Clone, Serialize)]
pub struct OtherBlock {
    pub block: BlockMode,
    pub c: f64,
    pub a: f64,
    pub mn: f64,
}

/// The precast unit's extreme fibre stresses under the effective prestress alone
/// (tension positive), against fr and f'c.
#[derive(Debug, Clone, Serialize)]
pub struct PrestressAloneOut {
    pub top: f64,
    pub bottom: f64,
    pub fr: f64,
    pub fc: f64,
    pub top_cracks: bool,
    pub over_compressed: bool,
}

#[derive(Debug, Clone, Serialize)]
pub struct LocationResult {
    pub name: String,
    /// The stresses at release, sustained and in service at a named location along a
    /// member with loads (empty elsewhere).
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub stresses: Vec<super::stresses::StageStress>,
    pub x: Option<f64>,
    pub mu: f64,
    pub pe: f64,
    pub e: f64,
    pub c: f64,
    pub a: f64,
    pub beta1: f64,
    /// The concrete strain at the compression face at nominal strength.
    pub eps_cu: f64,
    pub block: Option<BlockMode>,
    pub zone: &'static str,
    pub cc: f64,
    pub dc: f64,
    pub strands: Vec<LayerOut>,
    pub bars: Vec<LayerOut>,
    pub iterations: Vec<super::solve::Trial>,
    /// |C - T| / C at the solution.
    pub closure: f64,
    pub mn: f64,
    pub eps_t: f64,
    pub eps_ty: f64,
    pub extreme: String,
    pub control: &'static str,
    pub phi: f64,
    pub phi_flexure: f64,
    pub phi_development: Option<f64>,
    pub phi_mn: f64,
    pub ratio: f64,
    pub strength_ok: bool,
    pub mcr: f64,
    /// The precast unit cracks under the non-composite moment alone.
    pub cracked_before_composite: bool,
    pub min_reinforcement: MinReinforcement,
    pub approximate: Approximate,
    pub development: Vec<Development>,
    pub max_strand_strain: f64,
    /// The largest strain of strand not fully developed here (held at fpx).
    pub capped_strain: f64,
    pub rupture_risk: bool,
    pub prestress_alone: PrestressAloneOut,
    pub other_block: Option<OtherBlock>,
    /// Every check met, perhaps on open conditions (see `status`).
    pub pass: bool,
    pub status: conclusion::Status,
    /// Open conditions and cautions: the result holds only if they are settled.
    pub conditions: Vec<conclusion::Condition>,
    pub conclusion: String,
    pub notes: Vec<String>,
    /// Rings of the compression block for the sketch.
    pub block_rings: Vec<Vec<P>>,
    /// Whether strain compatibility was solved (false where there is no tension steel).
    pub solved: bool,
    /// Where Mu comes from: `None` given in the input; else derived from the member's
    /// loads, by the governing load combination named.
    pub demand_from_loads: Option<String>,
    pub trace: Vec<Step>,
}

#[derive(Debug, Clone, Serialize)]
pub struct MemberResult {
    pub id: String,
    pub section: SectionResult,
    pub locations: Vec<LocationResult>,
    /// Index of the governing location (highest Mu / phi Mn).
    pub governing: usize,
    pub pass: bool,
    pub status: conclusion::Status,
    pub trace: Vec<Step>,
    /// The moment-curvature response at the governing location (filled by
    /// [`analyze_full`]), or why it could not be found.
    pub curve: Option<super::curve::CurveResult>,
    pub curve_error: Option<String>,
    /// The demand from the member's loads (`None`: the moments were given by hand).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub demand: Option<super::demand::Demand>,
    /// Every station along the span, in order of x (members with loads).
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub stations: Vec<StationRow>,
    /// The sections derived in full, with their demand, in the order of `locations`.
    #[serde(skip)]
    pub sites: Vec<super::station::Station>,
    /// Each strand layer's prestress.
    pub prestress: Vec<LayerPrestress>,
    /// The loss computation, where a layer takes computed losses.
    pub losses: Option<super::losses::Losses>,
    /// The member as analysed, where computed losses filled in a layer's fse (see
    /// `member()`).
    #[serde(skip)]
    pub member: Option<Box<crate::input::model::Member>>,
    /// The stresses at release and in service and the class (members with loads).
    pub stresses: Option<super::stresses::MemberStresses>,
    /// The member's own open conditions (of its stresses), beside its locations'.
    pub conditions: Vec<conclusion::Condition>,
    /// Camber (members whose release stresses are checked).
    pub camber: Option<super::camber::Camber>,
    /// The live-load deflection against its limit (members with loads).
    pub deflection: Option<super::camber::LiveDeflection>,
}

/// One station along the span: its demand and its design strength (shown units).
#[derive(Debug, Clone, Serialize)]
pub struct StationRow {
    pub x: f64,
    /// Why the station is there (an end of a transfer length, a tenth point, ...).
    pub what: Vec<String>,
    /// Within the end region of the left or right end (up to the longest debonded plus
    /// development length from it).
    pub end_region: Option<crate::input::model::End>,
    /// Unfactored moments of dead, live, roof live and snow load.
    pub by_kind: [f64; 4],
    pub mu: f64,
    pub mnc: f64,
    /// The governing load combination here.
    pub combination: String,
    pub phi: f64,
    pub mn: f64,
    pub phi_mn: f64,
    pub ratio: f64,
    pub mcr: f64,
    pub min_ok: bool,
    pub status: conclusion::Status,
    pub pass: bool,
    pub conditions: Vec<conclusion::ConditionKind>,
    /// The index in `locations` of its full derivation, where it has one.
    pub derived: Option<usize>,
    /// "governing station", or the critical station of an end region.
    pub role: Option<&'static str>,
    /// The x of the station this one mirrors (the right end region's critical station
    /// of a member symmetric about the middle of its length): same strand states,
    /// moments and strength, so its derivation is that station's.
    pub mirror_of: Option<f64>,
    /// The stresses here at release (where checked), under sustained and under all
    /// service loads.
    pub stresses: Vec<super::stresses::StageStress>,
}

impl MemberResult {
    pub fn governing(&self) -> &LocationResult {
        &self.locations[self.governing]
    }
    /// The member as analysed: the input's, with the fse of layers that take computed
    /// losses filled in.
    pub fn member<'a>(&'a self, given: &'a crate::input::model::Member) -> &'a crate::input::model::Member {
        self.member.as_deref().unwrap_or(given)
    }
}

/// A strand layer's prestress: where it comes from, fpj, the losses, fse, and the
/// stress just after release where the losses are computed.
#[derive(Debug, Clone, Serialize)]
pub struct LayerPrestress {
    pub layer: usize,
    /// "given" (fse), "losses_given" or "computed".
    pub source: &'static str,
    pub fpj: Option<f64>,
    pub fse: f64,
    pub fpi: Option<f64>,
    pub losses: Option<LossesOut>,
}

/// Losses of a layer: the total, and each part where computed.
#[derive(Debug, Clone, Serialize)]
pub struct LossesOut {
    pub total: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub es: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub cr: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sh: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub re: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct Analysis {
    pub units: System,
    pub members: Vec<MemberResult>,
}

impl Analysis {
    pub fn pass(&self) -> bool {
        self.members.iter().all(|m| m.pass)
    }
    /// The package's result: the worst of its members'.
    pub fn status(&self) -> conclusion::Status {
        self.members.iter().fold(conclusion::Status::Pass, |s, m| s.and(m.status))
    }
}
