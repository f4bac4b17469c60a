//! strainsheet: flexural strength of pretensioned concrete members by strain
//! compatibility, recorded step by step and rendered as a signed-off calculation package.
//!
//! The pipeline, one module per arrow (see DEVELOPERS.md):
//!
//! ```text
//! input.toml --input::load--> Package --analysis::analyze--> Analysis (results + trace)
//!   --report::payload--> canonical JSON --seal--> content hash
//!   --report::render--> PDF bytes --output::write--> package.pdf + package.pdf.sha256
//! ```

pub mod analysis;
pub mod diff;
pub mod error;
pub mod input;
pub mod material;
pub mod output;
pub mod present;
pub mod report;
pub mod seal;
pub mod section;
pub mod sign;
pub mod starter;
pub mod trace;
pub mod units;
pub mod verify;

pub use error::{Error, Result};
