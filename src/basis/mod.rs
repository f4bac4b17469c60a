//! The design basis: everything a code decides, asked of one object. The stages of the
//! analysis never spell a clause or a code's constant; they name what they need
//! ([`Clause`] for a citation, a method for a value or a formula) and the basis chosen
//! by the input's `basis` answers.
//!
//! A new basis is one file beside `aci318.rs` that implements [`Basis`], one line in
//! [`BasisId`] (its name, how it is selected) and its tests.

pub mod aci318;

use crate::trace::{Expr, Symbol};
use crate::units::System;
use serde::Serialize;

/// A formula a code gives for a value, with the branch of its table where it has one:
/// the value, the formula over the step's inputs, and a note naming the branch.
pub struct Branch {
    pub value: f64,
    pub formula: Expr,
    pub note: &'static str,
}

/// What a stage cites. Each basis words it as its own clause (ACI 318-19 and ACI
/// 318M-19 share their numbers; another code has its own).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Clause {
    /// Strain compatibility and the concrete's crushing strain.
    StrainCompatibility,
    /// The equivalent rectangular stress block.
    StressBlock,
    /// The stress-block factor beta1.
    Beta1,
    /// Composite members whose parts differ in f'c.
    Composite,
    /// Ec of normalweight concrete.
    EcNormalweight,
    /// Ec from the density.
    EcDensity,
    /// The modulus of rupture.
    ModulusOfRupture,
    /// Es of bars.
    BarModulus,
    /// The jacking stress limit.
    JackingLimit,
    /// The transfer length of strand.
    TransferLength,
    /// The development length of strand.
    DevelopmentLength,
    /// The development length doubled for strand debonded at the member end.
    DevelopmentDoubled,
    /// The strand stress limit where strand is not fully developed.
    StrandStressLimit,
    /// The net tensile strain and its definition.
    NetTensileStrain,
    /// The yield strain for the control classification.
    YieldStrainForClass,
    /// phi by the strain classification (the table and its column).
    PhiTable,
    /// The same table, by its number alone.
    PhiTableShort,
    /// phi where strand is not fully developed.
    PhiDevelopment,
    /// phi of a section: the least of the strain classification's and that of strand
    /// not fully developed.
    LeastPhi,
    /// The design strength phi Mn >= Mu (beam or one-way slab).
    DesignStrength { slab: bool },
    /// The minimum flexural strength (beam or one-way slab).
    MinimumStrength { slab: bool },
    /// The waiver of the minimum flexural strength.
    MinimumWaiver { slab: bool },
    /// The cracking moment from the modulus of rupture.
    CrackingMoment,
    /// The approximate strand stress at nominal strength.
    ApproximateFps,
    /// The strength load combinations.
    LoadCombinations,
    /// The reduced live-load factor.
    ReducedLiveFactor,
    /// The compressive stress limits at release.
    ReleaseCompression,
    /// The tensile stress limits at release.
    ReleaseTension,
    /// The bonded reinforcement where the tension at release exceeds its limit.
    ReleaseReinforcement,
    /// The compressive stress limits in service.
    ServiceCompression,
    /// The classes U, T and C by the service tension in the precompressed tensile zone.
    MemberClass,
    /// The service (unfactored) load combinations for the stresses.
    ServiceCombinations,
    /// The stresses of a class C member on the cracked transformed section.
    ClassCStresses,
    /// Crack control: the spacing of the reinforcement closest to the tension face, and
    /// the strand stress change of a class C member.
    CrackControl,
    /// The deflection of a class T or C member from the cracked transformed section.
    CrackedDeflection,
    /// The skin reinforcement of deep class C beams.
    SkinReinforcement,
}

/// The stress limits at release, as sizes (compression and tension both positive): away
/// from the member's ends and at them.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ReleaseLimits {
    pub compression: f64,
    pub compression_end: f64,
    pub tension: f64,
    pub tension_end: f64,
}

/// A strength load combination: its name as the code numbers it and its factors on
/// dead, live, roof live and snow load (in [`crate::input::model::LoadKind::ALL`]'s
/// order).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Combination {
    pub name: String,
    pub factors: [f64; 4],
}

impl Combination {
    /// The combination written out ("1.2D + 1.6L + 0.5Lr").
    pub fn text(&self) -> String {
        use crate::input::model::LoadKind;
        let terms: Vec<String> = LoadKind::ALL
            .iter()
            .zip(self.factors)
            .filter(|(_, f)| *f != 0.0)
            .map(|(k, f)| format!("{f}{}", k.symbol()))
            .collect();
        terms.join(" + ")
    }
}

/// The strain classification of a section and its phi.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Control {
    Tension,
    Transition,
    Compression,
}

impl Control {
    pub fn word(self) -> &'static str {
        match self {
            Control::Tension => "tension",
            Control::Transition => "transition",
            Control::Compression => "compression",
        }
    }
}

/// Everything the analysis asks of a code.
pub trait Basis: Send + Sync {
    /// The code's name as cited ("ACI 318-19", "ACI 318M-19").
    fn name(&self) -> &'static str;
    /// The unit system its formulas are written in.
    fn units(&self) -> System;
    /// The code as the package's references list it (the publication, in Typst markup:
    /// `_..._` sets a title in italics).
    fn reference(&self) -> &'static str;
    /// The clause of a subject, without the code's name ("22.2.2.4.1").
    fn clause(&self, c: Clause) -> &'static str;
    /// The clause cited in full ("ACI 318-19 22.2.2.4.1").
    fn cite(&self, c: Clause) -> String {
        format!("{} {}", self.name(), self.clause(c))
    }
    /// The concrete strain at the compression face at nominal strength.
    fn crushing_strain(&self) -> f64;
    /// beta1 from f'c (the concrete at the compression face).
    fn beta1(&self, fc: f64) -> Branch;
    /// Ec of normalweight concrete from f'c; the step's input is [`Basis::fc_root`].
    fn ec_normalweight(&self, fc: f64) -> Branch;
    /// Ec from the density wc; inputs [`Basis::fc_root`] and wc.
    fn ec_density(&self, fc: f64, wc: f64) -> Branch;
    /// The modulus of rupture; inputs [`Basis::fc_root`] and lambda.
    fn modulus_of_rupture(&self, fc: f64, lambda: f64) -> Branch;
    /// f'c as it enters the square-root formulas (psi or MPa), with its symbol.
    fn fc_root(&self, fc: f64) -> (Symbol, f64);
    /// The words of the default Ec and fr, for the design basis's list of defaults.
    fn ec_default_text(&self) -> String;
    fn fr_default_text(&self) -> String;
    /// Es of bars by default, with the words for the list of defaults.
    fn bar_modulus(&self) -> (f64, String);
    /// The greatest jacking stress.
    fn jacking_limit(&self, fpu: f64, fpy: f64) -> f64;
    /// The words of the jacking limit ("min(0.80 fpu, 0.94 fpy)").
    fn jacking_limit_text(&self) -> &'static str;
    /// The divisors of the transfer term and of the development term of the strand's
    /// development length, in the package's stress unit.
    fn development_divisors(&self) -> (f64, f64);
    /// The yield strain of prestressing steel for the strain classification.
    fn strand_yield_strain(&self) -> f64;
    /// phi and the class for a net tensile strain and the yield strain.
    fn phi(&self, eps_t: f64, eps_ty: f64) -> (f64, Control);
    /// phi where strand is not fully developed: its value at the end of the transfer
    /// length (from there linear to phi_p at the development length).
    fn phi_transfer(&self) -> f64;
    /// The factor on Mcr of the minimum flexural strength (1.2 Mcr).
    fn minimum_factor(&self) -> f64;
    /// The factor on Mu that waives the minimum (phi Mn >= 2 Mu), and the condition the
    /// waiver rests on.
    fn waiver_factor(&self) -> f64;
    /// The approximate strand stress's factor gamma_p for fpy / fpu, with the bound
    /// that selects it.
    fn gamma_p(&self, fpy_over_fpu: f64) -> (f64, &'static str);
    /// The least fse / fpu for which the approximate strand stress applies.
    fn approximate_min_fse(&self) -> f64;
    /// The code's chapter for a beam or a one-way slab ("Ch. 9").
    fn member_chapter(&self, slab: bool) -> &'static str;
    /// The strength combinations of gravity loads, for the loads present (dead, live,
    /// roof live, snow, in [`crate::input::model::LoadKind::ALL`]'s order) and the
    /// live-load factor chosen where live load accompanies roof live load or snow.
    fn combinations(&self, present: [bool; 4], live_factor: f64) -> Vec<Combination>;
    /// The reduced live-load factor the code permits, and its clause with the cases
    /// where it is not permitted.
    fn reduced_live_factor(&self) -> (f64, &'static str);
    /// The stress limits at release of a simply supported member, from f'ci.
    fn release_limits(&self, fci: f64) -> ReleaseLimits;
    /// The words of the release limits ("0.60 f'ci, 0.70 f'ci at the ends; 3 sqrt(f'ci)...").
    fn release_limits_text(&self) -> &'static str;
    /// The stress the bonded reinforcement of the tension zone at release is taken at,
    /// from its fy, with the words of the rule.
    fn release_steel_stress(&self, fy: f64) -> (f64, &'static str);
    /// The compressive stress limits in service as shares of f'c: under the prestress
    /// and the sustained loads, and under the prestress and all loads.
    fn service_compression(&self) -> (f64, f64);
    /// The upper bounds of the service tension ft of classes U and T, from f'c.
    fn class_limits(&self, fc: f64) -> (f64, f64);
    /// The words of the class bounds ("7.5 sqrt(f'c) and 12 sqrt(f'c), psi").
    fn class_limits_text(&self) -> &'static str;
    /// The unfactored combinations of gravity loads for the service stresses, for the
    /// loads present (in [`crate::input::model::LoadKind::ALL`]'s order).
    fn service_combinations(&self, present: [bool; 4]) -> Vec<Combination>;
    /// Crack control of a class C member: the largest strand stress change beyond
    /// decompression Δfps, and the Δfps up to which the spacing is not limited.
    fn crack_control(&self) -> (f64, f64);
    /// The largest spacing of bonded prestressed reinforcement closest to the tension
    /// face, for a Δfps and the clear cover cc of that reinforcement.
    fn crack_spacing(&self, dfps: f64, cc: f64) -> f64;
    /// The words of that spacing rule.
    fn crack_spacing_text(&self) -> &'static str;
    /// The depth beyond which a class C beam needs skin reinforcement.
    fn skin_depth(&self) -> f64;
}

/// The bases this version knows, as the input selects them.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum BasisId {
    /// ACI 318-19 in US units; ACI 318M-19 in SI units.
    Aci318,
}

impl BasisId {
    /// The basis named in the input, in the package's units; `Err` lists those known.
    pub fn select(name: &str, sys: System) -> Result<BasisId, &'static str> {
        match (name, sys) {
            ("ACI 318-19", System::Us) | ("ACI 318-19" | "ACI 318M-19", System::Si) => Ok(BasisId::Aci318),
            _ => Err("\"ACI 318-19\" (\"ACI 318M-19\" for SI packages)"),
        }
    }

    /// The basis itself, in a unit system.
    pub fn get(self, sys: System) -> &'static dyn Basis {
        match (self, sys) {
            (BasisId::Aci318, System::Us) => &aci318::US,
            (BasisId::Aci318, System::Si) => &aci318::SI,
        }
    }
}
