//! The validated package: what the engine computes from. All values are in the coherent
//! units of the package's system (see [`crate::units`]).

use crate::material::concrete::Curve as ConcreteCurve;
use crate::material::strand::{Grade, Model};
use crate::section::Region;
use crate::section::shapes::Shape;
use crate::units::System;
use serde::{Serialize, Serializer};

/// A calendar date (from the input; the program never reads the clock for a package).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Date {
    pub year: u16,
    pub month: u8,
    pub day: u8,
}

impl std::fmt::Display for Date {
    fn fmt(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
        write!(f, "{:04}-{:02}-{:02}", self.year, self.month, self.day)
    }
}

impl Serialize for Date {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Paper {
    Letter,
    A4,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Role {
    Prepared,
    Checked,
    Approved,
}

impl Role {
    pub fn name(self) -> &'static str {
        match self {
            Role::Prepared => "prepared",
            Role::Checked => "checked",
            Role::Approved => "approved",
        }
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct Signoff {
    pub role: Role,
    pub name: String,
    pub license: Option<String>,
    pub firm: Option<String>,
    pub date: Option<Date>,
}

#[derive(Debug, Clone, Serialize)]
pub struct Revision {
    pub rev: String,
    pub date: Date,
    pub description: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Meta {
    pub title: String,
    pub project: String,
    pub project_number: String,
    pub client: String,
    pub subject: String,
    pub revision: String,
    pub date: Date,
    /// The design basis as cited ("ACI 318-19").
    pub basis: String,
    pub basis_id: crate::basis::BasisId,
    pub paper: Paper,
    pub notes: Option<String>,
    pub revisions: Vec<Revision>,
    pub signoffs: Vec<Signoff>,
}

impl Meta {
    /// The sign-off of a role.
    pub fn signoff(&self, role: Role) -> Option<&Signoff> {
        self.signoffs.iter().find(|s| s.role == role)
    }
    /// A package is issued (not a draft) when it has the "prepared" and "checked"
    /// sign-offs and every sign-off it lists is dated.
    pub fn is_draft(&self) -> bool {
        self.signoff(Role::Prepared).is_none()
            || self.signoff(Role::Checked).is_none()
            || self.signoffs.iter().any(|s| s.date.is_none())
    }
}

/// A value the input did not set, taken by default; shown in the design basis.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Default {
    /// The key, e.g. "strands.fpu".
    pub key: String,
    /// What was assumed, e.g. "fpu = 270 ksi".
    pub text: String,
}

#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "source", rename_all = "snake_case")]
pub enum EcSource {
    Given,
    Normalweight,
    Density { wc: f64 },
}

#[derive(Debug, Clone, Serialize)]
pub struct Concrete {
    pub fc: f64,
    pub ec: f64,
    pub ec_source: EcSource,
    pub lambda: f64,
    pub fr: f64,
    pub fr_given: bool,
    pub curve: ConcreteCurve,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum BlockMode {
    /// The topping's f'c and beta1 over the whole block (conservative practice).
    Topping,
    /// a = beta1 c with the topping's beta1; each concrete's 0.85 f'c over its own area.
    TwoPart,
}

#[derive(Debug, Clone, Serialize)]
pub struct Topping {
    pub thickness: f64,
    pub width: f64,
    /// Centre of the topping in x.
    pub x_center: f64,
    pub concrete: Concrete,
    pub block: BlockMode,
}

/// A strand layer's level.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "profile", rename_all = "snake_case")]
pub enum Profile {
    /// Straight, at a depth below the top of the precast unit.
    Straight { depth: f64 },
    /// Harped: depth at both member ends, and at and between the two harp points. From
    /// each end to its harp point the depth varies linearly. `harp_x` is the first harp
    /// point's distance from the left end; `harp_x2` the second's, also from the left end
    /// (given in the input, or `length - harp_x` for the usual symmetric layer; `None`
    /// only for a member without a length, which has no located sections).
    Harped { depth_end: f64, depth_harp: f64, harp_x: f64, harp_x2: Option<f64>, harp_x2_given: bool },
}

impl Profile {
    /// Depth below the top of the precast unit at a section along the member (`None`:
    /// at the governing section, taken at the harp depth). Symmetric members give the
    /// same depth at x and length - x.
    pub fn depth_at(&self, at: Option<Along>) -> f64 {
        match *self {
            Profile::Straight { depth } => depth,
            Profile::Harped { depth_end, depth_harp, harp_x, harp_x2, .. } => match at {
                None => depth_harp,
                Some(Along { x, length }) => {
                    let x2 = harp_x2.unwrap_or(length - harp_x);
                    if x < harp_x {
                        depth_end + (depth_harp - depth_end) * x / harp_x
                    } else if x > x2 {
                        depth_end + (depth_harp - depth_end) * (length - x) / (length - x2)
                    } else {
                        depth_harp
                    }
                }
            },
        }
    }
}

/// One of the two ends of a member; x is measured from the left one.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum End {
    Left,
    Right,
}

impl End {
    pub fn name(self) -> &'static str {
        match self {
            End::Left => "left end",
            End::Right => "right end",
        }
    }
}

/// A section along a member of known length: x from the left end.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Along {
    pub x: f64,
    pub length: f64,
}

impl Along {
    /// The nearer end and the distance to it (the left end where both are as near).
    /// Transfer, development and debonding are measured from here.
    pub fn nearer_end(&self) -> (End, f64) {
        let right = self.length - self.x;
        if self.x <= right { (End::Left, self.x) } else { (End::Right, right) }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "source", rename_all = "snake_case")]
pub enum FseSource {
    Given,
    /// fse = jacking fpu - losses.
    Losses {
        jacking: f64,
        fpj: f64,
        losses: f64,
    },
    /// fse = jacking fpu less the losses computed by the member's method (the layer's
    /// fse is not a number until the analysis has computed them).
    Computed {
        jacking: f64,
        fpj: f64,
    },
}

/// The concrete at release (transfer of prestress).
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Release {
    pub fci: f64,
    pub eci: f64,
    pub eci_source: EcSource,
}

/// The method of computed losses and what it asks of the member.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct LossMethod {
    /// Average annual ambient relative humidity, percent.
    pub relative_humidity: f64,
    /// Volume to surface ratio, where given (else from the section: area / perimeter).
    pub volume_to_surface: Option<f64>,
}

#[derive(Debug, Clone, Serialize)]
pub struct StrandLayer {
    pub profile: Profile,
    pub count: u32,
    pub diameter: f64,
    /// Area of one strand.
    pub area: f64,
    /// Name of the standard size, when it is one.
    pub size: Option<&'static str>,
    pub fpu: f64,
    pub fpy: f64,
    pub grade: Grade,
    pub model: Model,
    pub fse: f64,
    pub fse_source: FseSource,
    /// The stress just after release, where known: given (with fse or losses given) or
    /// filled in by the loss method (computed losses).
    pub fpi: Option<f64>,
    pub debonded_length: f64,
}

impl StrandLayer {
    pub fn total_area(&self) -> f64 {
        self.area * self.count as f64
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct BarLayer {
    pub depth: f64,
    pub count: u32,
    pub size: Option<&'static str>,
    pub diameter: f64,
    pub area: f64,
    pub fy: f64,
    pub es: f64,
}

impl BarLayer {
    pub fn total_area(&self) -> f64 {
        self.area * self.count as f64
    }
}

#[derive(Debug, Clone, Serialize)]
pub struct Location {
    pub name: String,
    /// Distance from the member end; `None` when not given (strands then taken as fully
    /// developed).
    pub x: Option<f64>,
    /// The factored moment; `None` where the member's loads give it (the demand stage
    /// derives it at x).
    pub mu: Option<f64>,
    /// Non-composite moment on the precast unit at this location (topped members);
    /// `None` where the member's loads give it.
    pub mnc: Option<f64>,
    /// Whether `mnc` was scaled from the member's midspan value (the location gives none).
    pub mnc_scaled: bool,
}

/// What a load is: its kind decides its load factor.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LoadKind {
    Dead,
    Live,
    RoofLive,
    Snow,
}

impl LoadKind {
    /// The symbol of the load in the combinations ("D", "L", "Lr", "S").
    pub fn symbol(self) -> &'static str {
        match self {
            LoadKind::Dead => "D",
            LoadKind::Live => "L",
            LoadKind::RoofLive => "Lr",
            LoadKind::Snow => "S",
        }
    }
    pub fn word(self) -> &'static str {
        match self {
            LoadKind::Dead => "dead",
            LoadKind::Live => "live",
            LoadKind::RoofLive => "roof live",
            LoadKind::Snow => "snow",
        }
    }
    pub const ALL: [LoadKind; 4] = [LoadKind::Dead, LoadKind::Live, LoadKind::RoofLive, LoadKind::Snow];
}

/// A uniform load over the whole member, from an area load times the tributary width or
/// given as a line load.
#[derive(Debug, Clone, Serialize)]
pub struct LineLoad {
    pub kind: LoadKind,
    /// Where it comes from: "self-weight", "topping", or the input key.
    pub source: String,
    /// The area load it was made from (coherent stress), if any.
    pub area_load: Option<f64>,
    /// Coherent force per length.
    pub w: f64,
    /// Carried by the precast unit alone (self-weight; the topping of unshored
    /// construction), not by the composite section.
    pub precast_only: bool,
}

/// A concentrated load.
#[derive(Debug, Clone, Serialize)]
pub struct PointLoad {
    pub kind: LoadKind,
    pub name: String,
    /// Coherent force.
    pub p: f64,
    /// From the left end.
    pub x: f64,
}

/// The member's service loads and how it is supported: the input of the demand stage.
#[derive(Debug, Clone, Serialize)]
pub struct Loads {
    /// Centre to centre of the bearings.
    pub span: f64,
    /// Distance of each bearing from its end: (length - span) / 2.
    pub bearing: f64,
    /// Tributary width of the area loads.
    pub width: f64,
    /// Unit weight of the precast concrete and of the topping, as densities (pcf or
    /// kg/m³) with whether each was given.
    pub density: f64,
    pub topping_density: Option<f64>,
    /// Topping placed on a shored member: its weight is carried by the composite section.
    pub shored: bool,
    /// Area and line loads as given (self-weight and topping are added by the demand
    /// stage, which derives them from the section).
    pub uniform: Vec<LineLoad>,
    pub points: Vec<PointLoad>,
    /// The live-load factor of the combination where live load accompanies roof live
    /// load or snow (1.0, or 0.5 where the basis permits), with the reason given.
    pub live_factor: f64,
    pub live_factor_reason: Option<String>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Kind {
    Beam,
    OneWaySlab,
}

/// Options of the moment-curvature analysis.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct CurveOptions {
    pub crushing_strain: f64,
    pub rupture_strain: f64,
    pub points: usize,
    pub strips: usize,
    pub bar_hardening: f64,
}

#[derive(Debug, Clone, Serialize)]
pub struct Member {
    pub id: String,
    pub description: String,
    pub kind: Kind,
    pub length: Option<f64>,
    pub mnc: f64,
    pub locations: Vec<Location>,
    /// Service loads; `None` where the moments are given by hand.
    pub loads: Option<Loads>,
    pub concrete: Concrete,
    pub shape: Shape,
    #[serde(skip)]
    pub region: Region,
    pub topping: Option<Topping>,
    pub strands: Vec<StrandLayer>,
    pub bars: Vec<BarLayer>,
    pub curve: CurveOptions,
    pub defaults: Vec<Default>,
    /// The concrete at release, where f'ci is given.
    pub release: Option<Release>,
    /// The loss method, where a layer takes computed losses.
    pub losses: Option<LossMethod>,
    /// What the stress checks ask of the engineer.
    pub stresses: StressOptions,
}

/// The options of the stress checks at release and in service.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct StressOptions {
    /// Share of the live load that is sustained (0 to 1).
    pub sustained_live: f64,
    /// Provide the bonded reinforcement of the tension zone where the tension at release
    /// exceeds its limit (else such tension fails the member).
    pub release_reinforcement: bool,
    /// Yield strength of that reinforcement.
    pub reinforcement_fy: f64,
    /// The live-load deflection limit as the divisor of the span (360 for "L/360").
    pub deflection_limit: Option<f64>,
    /// Centre-to-centre spacing of the bonded reinforcement closest to the tension face,
    /// for the crack control of a class C member (24.3.2); `None`: not given.
    pub tension_face_spacing: Option<f64>,
}

impl Member {
    /// Whether any strand layer takes computed losses.
    pub fn computes_losses(&self) -> bool {
        self.strands.iter().any(|s| matches!(s.fse_source, FseSource::Computed { .. }))
    }
    /// Height of the precast unit.
    pub fn precast_height(&self) -> f64 {
        self.region.y_top() - self.region.y_bot()
    }
    /// Thickness of the topping (0 without one).
    pub fn topping_thickness(&self) -> f64 {
        self.topping.as_ref().map_or(0.0, |t| t.thickness)
    }
    /// Overall height, topping included.
    pub fn total_height(&self) -> f64 {
        self.precast_height() + self.topping_thickness()
    }
}

/// A warning about input that is allowed but unusual.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct Warning {
    /// Where: "file:line:col".
    pub at: String,
    pub key: String,
    pub message: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct Package {
    pub format: i64,
    pub units: System,
    pub meta: Meta,
    pub members: Vec<Member>,
    pub warnings: Vec<Warning>,
}

impl Package {
    /// The design basis every member is checked against.
    pub fn basis(&self) -> &'static dyn crate::basis::Basis {
        self.meta.basis_id.get(self.units)
    }
}
