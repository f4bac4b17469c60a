//! A payload read back (from a package's attachment, or from the canonical bytes of one
//! built here): the same [`Head`] as is written, and of each member what `diff`
//! compares. A value the analysis could not compute is written as null, so the results
//! read back are optional.

use super::{Head, Program};
use serde::Deserialize;

/// What every payload says of itself, whichever version wrote it: the program.
#[derive(Deserialize)]
pub struct Written {
    pub program: Program,
}

/// A payload read back.
#[derive(Deserialize)]
pub struct Stored {
    #[serde(flatten)]
    pub head: Head,
    pub members: Vec<MemberRecord>,
}

/// A member read back: its id, its parsed input (compared value by value) and the
/// results of its locations.
#[derive(Deserialize)]
pub struct MemberRecord {
    pub id: String,
    pub input: serde_json::Value,
    pub locations: Vec<LocationRecord>,
}

/// The results of a location read back.
#[derive(Deserialize)]
pub struct LocationRecord {
    pub name: String,
    pub c: Option<f64>,
    pub mn: Option<f64>,
    pub phi: Option<f64>,
    pub phi_mn: Option<f64>,
    pub mu: Option<f64>,
    pub ratio: Option<f64>,
    pub mcr: Option<f64>,
    pub min_reinforcement: MinimumRecord,
    pub pass: bool,
    pub strands: Vec<LayerRecord>,
}

/// The minimum-strength check of a location read back: its 1.2 Mcr.
#[derive(Deserialize)]
pub struct MinimumRecord {
    pub required: Option<f64>,
}

/// A strand layer at nominal strength read back.
#[derive(Deserialize)]
pub struct LayerRecord {
    pub active: bool,
    pub depth: Option<f64>,
    pub stress: Option<f64>,
}

impl LocationRecord {
    /// The stress of the deepest strand layer that is active.
    pub fn extreme_fps(&self) -> Option<f64> {
        self.strands
            .iter()
            .filter(|l| l.active)
            .max_by(|a, b| a.depth.unwrap_or(0.0).total_cmp(&b.depth.unwrap_or(0.0)))
            .and_then(|l| l.stress)
    }
}
