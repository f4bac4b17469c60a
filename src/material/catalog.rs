//! Standard strand and bar sizes with their nominal areas.
//!
//! Strand: ASTM A416/A416M seven-wire strand, nominal diameters and areas (from memory
//! of the standard's table; Grade 250 areas are smaller than Grade 270's for the same
//! diameter). Bars: ASTM A615 (#3 to #11) and A615M (#10 to #36).

use super::strand::Grade;
use crate::units::System;

/// A strand size: name, nominal diameter and area in the system's units.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StrandSize {
    pub name: &'static str,
    pub diameter: f64,
    pub area: f64,
}

const US_270: &[StrandSize] = &[
    StrandSize { name: "3/8 in", diameter: 0.375, area: 0.085 },
    StrandSize { name: "7/16 in", diameter: 0.4375, area: 0.115 },
    StrandSize { name: "1/2 in", diameter: 0.500, area: 0.153 },
    StrandSize { name: "1/2 in special", diameter: 0.52, area: 0.167 },
    StrandSize { name: "0.6 in", diameter: 0.600, area: 0.217 },
    StrandSize { name: "0.7 in", diameter: 0.700, area: 0.294 },
];

const US_250: &[StrandSize] = &[
    StrandSize { name: "3/8 in", diameter: 0.375, area: 0.080 },
    StrandSize { name: "7/16 in", diameter: 0.4375, area: 0.108 },
    StrandSize { name: "1/2 in", diameter: 0.500, area: 0.144 },
    StrandSize { name: "0.6 in", diameter: 0.600, area: 0.216 },
];

const SI_1860: &[StrandSize] = &[
    StrandSize { name: "9.5 mm", diameter: 9.53, area: 54.8 },
    StrandSize { name: "11.1 mm", diameter: 11.11, area: 74.2 },
    StrandSize { name: "12.7 mm", diameter: 12.70, area: 98.7 },
    StrandSize { name: "13.2 mm (1/2 in special)", diameter: 13.21, area: 107.7 },
    StrandSize { name: "15.2 mm", diameter: 15.24, area: 140.0 },
    StrandSize { name: "17.8 mm", diameter: 17.78, area: 189.7 },
];

const SI_1725: &[StrandSize] = &[
    StrandSize { name: "9.5 mm", diameter: 9.53, area: 51.6 },
    StrandSize { name: "11.1 mm", diameter: 11.11, area: 69.7 },
    StrandSize { name: "12.7 mm", diameter: 12.70, area: 92.9 },
    StrandSize { name: "15.2 mm", diameter: 15.24, area: 139.4 },
];

/// The strand sizes of a grade.
pub fn strand_sizes(grade: Grade, sys: System) -> &'static [StrandSize] {
    match (grade, sys) {
        (Grade::G270, System::Us) => US_270,
        (Grade::G250, System::Us) => US_250,
        (Grade::G270, System::Si) => SI_1860,
        (Grade::G250, System::Si) => SI_1725,
    }
}

/// The standard strand of a nominal diameter (within 1 %).
pub fn strand_by_diameter(d: f64, grade: Grade, sys: System) -> Option<StrandSize> {
    strand_sizes(grade, sys).iter().copied().find(|s| (s.diameter - d).abs() <= 0.01 * s.diameter)
}

/// The standard strand of a nominal area (within 2 %).
pub fn strand_by_area(a: f64, grade: Grade, sys: System) -> Option<StrandSize> {
    strand_sizes(grade, sys).iter().copied().find(|s| (s.area - a).abs() <= 0.02 * s.area)
}

/// A bar size: designation, nominal diameter and area.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BarSize {
    pub name: &'static str,
    pub diameter: f64,
    pub area: f64,
}

const A615: &[BarSize] = &[
    BarSize { name: "#3", diameter: 0.375, area: 0.11 },
    BarSize { name: "#4", diameter: 0.500, area: 0.20 },
    BarSize { name: "#5", diameter: 0.625, area: 0.31 },
    BarSize { name: "#6", diameter: 0.750, area: 0.44 },
    BarSize { name: "#7", diameter: 0.875, area: 0.60 },
    BarSize { name: "#8", diameter: 1.000, area: 0.79 },
    BarSize { name: "#9", diameter: 1.128, area: 1.00 },
    BarSize { name: "#10", diameter: 1.270, area: 1.27 },
    BarSize { name: "#11", diameter: 1.410, area: 1.56 },
];

const A615M: &[BarSize] = &[
    BarSize { name: "#10", diameter: 9.5, area: 71.0 },
    BarSize { name: "#13", diameter: 12.7, area: 129.0 },
    BarSize { name: "#16", diameter: 15.9, area: 199.0 },
    BarSize { name: "#19", diameter: 19.1, area: 284.0 },
    BarSize { name: "#22", diameter: 22.2, area: 387.0 },
    BarSize { name: "#25", diameter: 25.4, area: 510.0 },
    BarSize { name: "#29", diameter: 28.7, area: 645.0 },
    BarSize { name: "#32", diameter: 32.3, area: 819.0 },
    BarSize { name: "#36", diameter: 35.8, area: 1006.0 },
];

/// The bar sizes of a unit system.
pub fn bar_sizes(sys: System) -> &'static [BarSize] {
    match sys {
        System::Us => A615,
        System::Si => A615M,
    }
}

/// A bar by designation ("#5"; "5" is accepted too).
pub fn bar(name: &str, sys: System) -> Option<BarSize> {
    let key = name.trim();
    let key = key.strip_prefix('#').unwrap_or(key);
    bar_sizes(sys).iter().copied().find(|b| &b.name[1..] == key)
}

/// The designations, for error messages.
pub fn bar_names(sys: System) -> String {
    bar_sizes(sys).iter().map(|b| b.name).collect::<Vec<_>>().join(", ")
}

/// The strand diameters of a grade, for error messages.
pub fn strand_names(grade: Grade, sys: System) -> String {
    strand_sizes(grade, sys).iter().map(|s| format!("{} ({})", s.diameter, s.name)).collect::<Vec<_>>().join(", ")
}
