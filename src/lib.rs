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
pub mod files;
pub mod fonts;
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

pub use analysis::conclusion::Status;
pub use error::{Error, Result};

/// `check --json` of a whole package, analysed: the members are analysed (without trace)
/// and written in parallel chunks, each chunk's results dropped as soon as they are
/// written, so a large package is quick and needs little memory. An analysis error is
/// that of the first failing member in input order.
pub fn check_json(pkg: &input::Package) -> Result<CheckJson> {
    use rayon::prelude::*;
    const CHUNK: usize = 16;
    let pieces: Vec<Result<(Vec<u8>, Status)>> = pkg
        .members
        .par_chunks(CHUNK)
        .map(|ms| {
            let mut buf = Vec::with_capacity(ms.len() * 2048);
            let mut status = Status::Pass;
            for m in ms {
                let r = analysis::analyze_member(m, pkg.units, false)?;
                status = status.and(r.status);
                if !buf.is_empty() {
                    buf.push(b',');
                }
                present::write_member_json(&mut buf, &r);
            }
            Ok((buf, status))
        })
        .collect();
    let mut out = CheckJson { pieces: Vec::with_capacity(pieces.len()), status: Status::Pass };
    for p in pieces {
        let (b, st) = p?;
        out.status = out.status.and(st);
        out.pieces.push(b);
    }
    Ok(out)
}

/// The members of `check --json`, written, and the package's result.
pub struct CheckJson {
    pieces: Vec<Vec<u8>>,
    pub status: Status,
}

impl CheckJson {
    /// Writes the whole JSON: the bytes of serialising [`present::check_json`].
    pub fn write(&self, pkg: &input::Package, w: &mut dyn std::io::Write) -> std::io::Result<()> {
        present::write_check_json(w, pkg, self.status, &self.pieces)
    }
}
