//! Unit systems and quantities.
//!
//! Every package is in one unit system. Inside the engine all values are held in the
//! system's *coherent* units, so that stress times area is a force and force times
//! length is a moment with no factor:
//!
//! | quantity | "us" coherent | "us" shown | "si" coherent | "si" shown |
//! |----------|---------------|------------|---------------|------------|
//! | length   | in            | in         | mm            | mm         |
//! | area     | in²           | in²        | mm²           | mm²        |
//! | stress   | ksi           | ksi        | MPa           | MPa        |
//! | force    | kip           | kip        | N             | kN         |
//! | moment   | kip-in        | kip-ft     | N-mm          | kN-m       |
//!
//! Input numbers are read in the *shown* units (a bare `mu = 450` is kip-ft or kN-m);
//! a string such as `"5200 kip-in"` names its own unit and is converted.

use serde::{Deserialize, Serialize};

/// The unit system of a package.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Hash)]
#[serde(rename_all = "lowercase")]
pub enum System {
    /// in, in², ksi, kip, kip-ft.
    Us,
    /// mm, mm², MPa, kN, kN-m.
    Si,
}

/// The physical dimension of an input value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dim {
    Length,
    Area,
    Stress,
    Force,
    Moment,
    Density,
    /// A force per length (a line load): kip/in or N/mm coherent, klf or kN/m shown.
    LineLoad,
}

impl Dim {
    pub fn name(self) -> &'static str {
        match self {
            Dim::Length => "a length",
            Dim::Area => "an area",
            Dim::Stress => "a stress",
            Dim::Force => "a force",
            Dim::Moment => "a moment",
            Dim::Density => "a density",
            Dim::LineLoad => "a line load",
        }
    }
}

/// A unit accepted in input strings: its spellings, dimension and factor to the
/// coherent unit of each system (value_coherent = value * factor).
struct UnitDef {
    names: &'static [&'static str],
    dim: Dim,
    to_us: f64,
    to_si: f64,
}

const IN_MM: f64 = 25.4;
const KIP_N: f64 = 4_448.221_615_260_5;
const KSI_MPA: f64 = 6.894_757_293_168_361;
const PCF_KGM3: f64 = 16.018_463_373_960_14;
/// One pound per square foot in ksi.
const PSF_KSI: f64 = 1e-3 / 144.0;

const UNITS: &[UnitDef] = &[
    UnitDef { names: &["in", "inch", "inches"], dim: Dim::Length, to_us: 1.0, to_si: IN_MM },
    UnitDef { names: &["ft", "feet", "foot"], dim: Dim::Length, to_us: 12.0, to_si: 12.0 * IN_MM },
    UnitDef { names: &["mm"], dim: Dim::Length, to_us: 1.0 / IN_MM, to_si: 1.0 },
    UnitDef { names: &["cm"], dim: Dim::Length, to_us: 10.0 / IN_MM, to_si: 10.0 },
    UnitDef { names: &["m"], dim: Dim::Length, to_us: 1000.0 / IN_MM, to_si: 1000.0 },
    UnitDef { names: &["in2", "in^2", "in²", "sq in"], dim: Dim::Area, to_us: 1.0, to_si: IN_MM * IN_MM },
    UnitDef { names: &["mm2", "mm^2", "mm²"], dim: Dim::Area, to_us: 1.0 / (IN_MM * IN_MM), to_si: 1.0 },
    UnitDef { names: &["cm2", "cm^2", "cm²"], dim: Dim::Area, to_us: 100.0 / (IN_MM * IN_MM), to_si: 100.0 },
    UnitDef { names: &["ksi"], dim: Dim::Stress, to_us: 1.0, to_si: KSI_MPA },
    UnitDef { names: &["psi"], dim: Dim::Stress, to_us: 1e-3, to_si: KSI_MPA * 1e-3 },
    UnitDef { names: &["mpa", "n/mm2", "n/mm^2", "n/mm²"], dim: Dim::Stress, to_us: 1.0 / KSI_MPA, to_si: 1.0 },
    UnitDef { names: &["gpa"], dim: Dim::Stress, to_us: 1000.0 / KSI_MPA, to_si: 1000.0 },
    UnitDef { names: &["kpa", "kn/m2", "kn/m^2", "kn/m²"], dim: Dim::Stress, to_us: 1e-3 / KSI_MPA, to_si: 1e-3 },
    UnitDef {
        names: &["psf", "lb/ft2", "lb/ft^2", "lb/ft²"],
        dim: Dim::Stress,
        to_us: PSF_KSI,
        to_si: PSF_KSI * KSI_MPA,
    },
    UnitDef {
        names: &["ksf", "kip/ft2", "kip/ft^2", "kip/ft²"],
        dim: Dim::Stress,
        to_us: 1e3 * PSF_KSI,
        to_si: 1e3 * PSF_KSI * KSI_MPA,
    },
    UnitDef { names: &["klf", "kip/ft", "k/ft"], dim: Dim::LineLoad, to_us: 1.0 / 12.0, to_si: KIP_N / (12.0 * IN_MM) },
    UnitDef { names: &["plf", "lb/ft"], dim: Dim::LineLoad, to_us: 1e-3 / 12.0, to_si: 1e-3 * KIP_N / (12.0 * IN_MM) },
    UnitDef { names: &["kip/in", "k/in"], dim: Dim::LineLoad, to_us: 1.0, to_si: KIP_N / IN_MM },
    UnitDef { names: &["kn/m", "n/mm"], dim: Dim::LineLoad, to_us: IN_MM / KIP_N, to_si: 1.0 },
    UnitDef { names: &["kip", "kips", "k"], dim: Dim::Force, to_us: 1.0, to_si: KIP_N },
    UnitDef { names: &["lb", "lbf", "lbs"], dim: Dim::Force, to_us: 1e-3, to_si: KIP_N * 1e-3 },
    UnitDef { names: &["kn"], dim: Dim::Force, to_us: 1000.0 / KIP_N, to_si: 1000.0 },
    UnitDef { names: &["n"], dim: Dim::Force, to_us: 1.0 / KIP_N, to_si: 1.0 },
    UnitDef {
        names: &["kip-ft", "kip·ft", "kip ft", "k-ft", "ft-kip", "kipft"],
        dim: Dim::Moment,
        to_us: 12.0,
        to_si: KIP_N * 12.0 * IN_MM,
    },
    UnitDef {
        names: &["kip-in", "kip·in", "kip in", "k-in", "in-kip"],
        dim: Dim::Moment,
        to_us: 1.0,
        to_si: KIP_N * IN_MM,
    },
    UnitDef { names: &["lb-ft", "lb·ft", "ft-lb"], dim: Dim::Moment, to_us: 12e-3, to_si: KIP_N * 12e-3 * IN_MM },
    UnitDef { names: &["lb-in", "lb·in", "in-lb"], dim: Dim::Moment, to_us: 1e-3, to_si: KIP_N * 1e-3 * IN_MM },
    UnitDef {
        names: &["kn-m", "kn·m", "knm", "kn m", "kn*m"],
        dim: Dim::Moment,
        to_us: 1e6 / (KIP_N * IN_MM),
        to_si: 1e6,
    },
    UnitDef { names: &["n-mm", "n·mm", "nmm", "n mm"], dim: Dim::Moment, to_us: 1.0 / (KIP_N * IN_MM), to_si: 1.0 },
    UnitDef { names: &["pcf", "lb/ft3", "lb/ft^3", "lb/ft³"], dim: Dim::Density, to_us: 1.0, to_si: PCF_KGM3 },
    UnitDef { names: &["kg/m3", "kg/m^3", "kg/m³"], dim: Dim::Density, to_us: 1.0 / PCF_KGM3, to_si: 1.0 },
];

/// Why a quantity string was refused.
#[derive(Debug, Clone, PartialEq)]
pub enum QuantityError {
    /// No number at the start of the string.
    NoNumber,
    /// A unit that is not in the table.
    UnknownUnit(String),
    /// A known unit of another dimension.
    WrongDimension { unit: String, found: Dim },
}

impl System {
    /// Units accepted for a dimension, for error messages.
    pub fn accepted(dim: Dim) -> String {
        let names: Vec<&str> = UNITS.iter().filter(|u| u.dim == dim).map(|u| u.names[0]).collect();
        names.join(", ")
    }

    /// The factor from the shown unit of `dim` (what a bare input number means) to the
    /// coherent unit.
    pub fn shown_to_coherent(self, dim: Dim) -> f64 {
        match (self, dim) {
            (System::Us, Dim::Moment) => 12.0,
            (System::Us, Dim::LineLoad) => 1.0 / 12.0,
            (System::Si, Dim::Force) => 1e3,
            (System::Si, Dim::Moment) => 1e6,
            _ => 1.0,
        }
    }

    /// Converts a bare number given in the shown unit to coherent units.
    pub fn bare(self, dim: Dim, v: f64) -> f64 {
        v * self.shown_to_coherent(dim)
    }

    /// Parses "12.7 mm", "5200 kip-in", "1860 MPa" into coherent units of this system.
    pub fn parse(self, dim: Dim, text: &str) -> Result<f64, QuantityError> {
        let t = text.trim();
        // The number is the leading run of characters a float literal may hold; no
        // accepted unit starts with "e", so an exponent cannot be mistaken for a unit.
        let split = t
            .find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '_' | '+' | '-' | 'e' | 'E')))
            .unwrap_or(t.len());
        let (num, unit) = t.split_at(split);
        let value: f64 = num.replace('_', "").parse().map_err(|_| QuantityError::NoNumber)?;
        let unit = unit.trim();
        if unit.is_empty() {
            return Ok(self.bare(dim, value));
        }
        let key = unit.to_lowercase();
        let def = UNITS
            .iter()
            .find(|u| u.names.iter().any(|n| *n == key))
            .ok_or_else(|| QuantityError::UnknownUnit(unit.to_string()))?;
        if def.dim != dim {
            return Err(QuantityError::WrongDimension { unit: unit.to_string(), found: def.dim });
        }
        Ok(value
            * match self {
                System::Us => def.to_us,
                System::Si => def.to_si,
            })
    }

    /// Converts a coherent value of `dim` in this system to the coherent value in `to`.
    pub fn convert(self, to: System, dim: Dim, v: f64) -> f64 {
        if self == to {
            return v;
        }
        let f = match dim {
            Dim::Length => IN_MM,
            Dim::Area => IN_MM * IN_MM,
            Dim::Stress => KSI_MPA,
            Dim::Force => KIP_N,
            Dim::Moment => KIP_N * IN_MM,
            Dim::Density => PCF_KGM3,
            Dim::LineLoad => KIP_N / IN_MM,
        };
        match self {
            System::Us => v * f,
            System::Si => v / f,
        }
    }

    /// The names of the shown units, as printed in tables and JSON.
    pub fn names(self) -> UnitNames {
        match self {
            System::Us => UnitNames { length: "in", area: "in2", stress: "ksi", force: "kip", moment: "kip-ft" },
            System::Si => UnitNames { length: "mm", area: "mm2", stress: "MPa", force: "kN", moment: "kN-m" },
        }
    }

    /// Factor from a coherent force to the shown force.
    pub fn force_shown(self) -> f64 {
        1.0 / self.shown_to_coherent(Dim::Force)
    }

    /// Factor from a coherent moment to the shown moment.
    pub fn moment_shown(self) -> f64 {
        1.0 / self.shown_to_coherent(Dim::Moment)
    }

    pub fn label(self) -> &'static str {
        match self {
            System::Us => "us",
            System::Si => "si",
        }
    }
}

/// Unit names for output.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct UnitNames {
    pub length: &'static str,
    pub area: &'static str,
    pub stress: &'static str,
    pub force: &'static str,
    pub moment: &'static str,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_quantities() {
        let us = System::Us;
        assert_eq!(us.parse(Dim::Moment, "5200 kip-in").unwrap(), 5200.0);
        assert_eq!(us.parse(Dim::Moment, "450").unwrap(), 450.0 * 12.0);
        assert!((us.parse(Dim::Length, "12.7 mm").unwrap() - 0.5).abs() < 1e-12);
        assert!((us.parse(Dim::Stress, "1860 MPa").unwrap() - 269.77).abs() < 0.01);
        assert_eq!(us.parse(Dim::Stress, "6000 psi").unwrap(), 6.0);
        assert_eq!(us.parse(Dim::Length, "1.5e1 in").unwrap(), 15.0);
        let si = System::Si;
        assert_eq!(si.parse(Dim::Moment, "450 kN-m").unwrap(), 450e6);
        assert_eq!(si.parse(Dim::Force, "12").unwrap(), 12e3);
        assert!(matches!(si.parse(Dim::Length, "12 kip"), Err(QuantityError::WrongDimension { .. })));
        assert!(matches!(si.parse(Dim::Length, "12 furlong"), Err(QuantityError::UnknownUnit(_))));
        assert!(matches!(si.parse(Dim::Length, "mm"), Err(QuantityError::NoNumber)));
        // loads: 1 psf = 1/144 psi, 1 klf = 1/12 kip/in, 1 kN/m = 1 N/mm (common practice)
        assert!((us.parse(Dim::Stress, "144 psf").unwrap() - 1e-3).abs() < 1e-15);
        assert!((us.parse(Dim::LineLoad, "1.2 klf").unwrap() - 0.1).abs() < 1e-15);
        assert_eq!(si.parse(Dim::LineLoad, "11.7 kN/m").unwrap(), 11.7);
        assert!((si.parse(Dim::Stress, "2.4 kPa").unwrap() - 2.4e-3).abs() < 1e-15);
        // 1 kip/ft = 14.5939 kN/m (common practice)
        assert!((si.parse(Dim::LineLoad, "1 klf").unwrap() - 14.593_9).abs() < 1e-4);
    }
}
