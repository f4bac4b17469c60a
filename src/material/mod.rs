//! Material models: concrete (beta1, Ec, fr, stress-strain curves for the fibre
//! analysis), prestressing strand (the handbook's two-branch curve and the power
//! formula) and mild steel, with the catalogue of strand and bar sizes.

pub mod catalog;
pub mod concrete;
pub mod steel;
pub mod strand;
