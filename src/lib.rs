//! strainsheet: flexural strength of pretensioned concrete members by strain
//! compatibility, recorded step by step and rendered as a signed-off calculation package.
//!
//! The pipeline, one module per arrow (see DEVELOPERS.md):
//!
//! ```text
//! input.toml --input::load--> Package --analysis::analyze--> Analysis (results + trace)
//!   --report::payload::build--> Payload (canonical JSON) --integrity::content_hash--> content hash
//!   --report::render--> PDF bytes --output::write_all--> package.pdf + package.pdf.sha256
//! verify: package.pdf --integrity::verify--> attached input + payload --re-run--> same hash, same bytes
//! ```

pub mod analysis;
pub mod basis;
pub mod error;
pub mod fonts;
pub mod input;
pub mod integrity;
pub mod material;
pub mod output;
pub mod present;
pub mod report;
pub mod section;
pub mod starter;
pub mod trace;
pub mod units;

pub use analysis::conclusion::Status;
pub use error::{Error, Result};

/// `check --json` of a whole package: the members are analysed (without trace) and each
/// written as its JSON, in parallel chunks, each chunk's results dropped as soon as they
/// are written, so a large package is quick and needs little memory. An analysis error
/// is that of the first failing member in input order.
pub fn check_members(pkg: &input::Package) -> Result<CheckedMembers> {
    use rayon::prelude::*;
    const CHUNK: usize = 16;
    let pieces: Vec<Result<(Vec<u8>, Status)>> = pkg
        .members
        .par_chunks(CHUNK)
        .map(|ms| {
            let mut buf = Vec::with_capacity(ms.len() * 2048);
            let mut status = Status::Pass;
            for m in ms {
                let r = analysis::analyze_member(m, pkg.basis(), false)?;
                status = status.and(r.status);
                if !buf.is_empty() {
                    buf.push(b',');
                }
                present::write_member_json(&mut buf, &r);
            }
            Ok((buf, status))
        })
        .collect();
    let mut out = CheckedMembers { pieces: Vec::with_capacity(pieces.len()), status: Status::Pass };
    for p in pieces {
        let (b, st) = p?;
        out.status = out.status.and(st);
        out.pieces.push(b);
    }
    Ok(out)
}

/// The members of `check --json`, written, and the package's result.
pub struct CheckedMembers {
    pieces: Vec<Vec<u8>>,
    pub status: Status,
}

impl CheckedMembers {
    /// Writes the whole of `check --json`: the bytes of serialising
    /// [`present::check_document`].
    pub fn write_json(&self, pkg: &input::Package, w: &mut dyn std::io::Write) -> std::io::Result<()> {
        present::write_check_json(w, pkg, self.status, &self.pieces)
    }
}

/// The forms `trace` writes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TraceForm {
    Text,
    Json,
    Csv,
}

/// `trace`: every step of the members chosen (all where `member` is `None`), analysed a
/// few at a time and written as they are done, so the memory needed does not grow with
/// the package. The JSON is `{"format": 1, "units": {...}, "steps": [...]}`, a step a
/// line. An analysis error stops the writing and is returned in `Ok(Err(..))`; a
/// writing error in `Err` (a closed pipe is then the reader's choice).
pub fn write_trace(
    pkg: &input::Package,
    member: Option<&str>,
    form: TraceForm,
    w: &mut dyn std::io::Write,
) -> std::io::Result<Result<()>> {
    use rayon::prelude::*;
    let chosen: Vec<&input::model::Member> =
        pkg.members.iter().filter(|m| member.is_none_or(|id| m.id == id)).collect();
    match form {
        TraceForm::Json => {
            w.write_all(b"{\"format\":1,\"units\":")?;
            serde_json::to_writer(&mut *w, &pkg.units.names())?;
            w.write_all(b",\"steps\":[")?;
        }
        TraceForm::Csv => w.write_all(present::TRACE_CSV_HEAD.as_bytes())?,
        TraceForm::Text => {}
    }
    let mut first = true;
    for chunk in chosen.chunks(8) {
        let done: Vec<Result<analysis::MemberResult>> =
            chunk.par_iter().map(|m| analysis::analyze_member(m, pkg.basis(), true)).collect();
        for r in done {
            let r = match r {
                Ok(r) => r,
                Err(e) => return Ok(Err(e)),
            };
            match form {
                TraceForm::Text => w.write_all(present::trace_text(pkg, &[&r]).as_bytes())?,
                TraceForm::Csv => w.write_all(present::trace_csv_rows(pkg, &[&r]).as_bytes())?,
                TraceForm::Json => {
                    for st in present::trace_json_steps(pkg, &r) {
                        w.write_all(if first { b"\n" } else { b",\n" })?;
                        first = false;
                        serde_json::to_writer(&mut *w, &st)?;
                    }
                }
            }
        }
    }
    if form == TraceForm::Json {
        w.write_all(b"\n]}\n")?;
    }
    Ok(Ok(()))
}
