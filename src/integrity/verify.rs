//! `verify`: proving that a package is exactly what was issued.
//!
//! Two hashes are in play, and every message names which: the **content hash
//! (payload)**, the SHA-256 of the attached payload.json, printed on the cover and in
//! every title block; and the **file hash (PDF)**, the SHA-256 of the PDF file itself,
//! which the `.sha256` sidecar holds.
//!
//! The checks, each reported in plain words:
//! 1. the attached payload hashes to the content hash recorded in the PDF metadata;
//! 2. re-analysing the attached input gives the same payload;
//! 3. re-rendering gives a file byte-identical to the one given (any change anywhere in
//!    the file is caught, also one a viewer would not show); only this version can
//!    re-render its own packages, so a package that says another version made it is
//!    not verified (exit 3) unless its file hash is given with `--expect`;
//! 4. a `FILE.pdf.sha256` sidecar beside it records the file hash of this file (a
//!    sidecar that names another file, or records the hash of another PDF while this one
//!    re-renders byte for byte, is said to belong to another file);
//! 5. with a public key, the `FILE.pdf.sig` signature is valid for the file (without
//!    one, a signature file beside it is mentioned);
//! 6. with `--expect HASH`, the hash recorded at issue equals the file hash (PDF) or the
//!    content hash (payload), and which one is said.

use super::attached::{self, Opened};
use super::{sha256_hex, sidecar};
use crate::analysis::Analysis;
use crate::error::{Error, Result};
use crate::input::{self, Source};
use crate::report::{self, Templates, payload};
use std::path::{Path, PathBuf};

/// The largest sidecar read (one line: a hash and a file name).
pub const MAX_SIDECAR_BYTES: u64 = 64 * 1024;

/// The outcome of one check.
#[derive(Debug, Clone, PartialEq)]
pub struct Check {
    pub name: &'static str,
    /// `None`: not run (with the reason in `detail`).
    pub ok: Option<bool>,
    pub detail: String,
}

/// Which hash a hash given with `--expect` equals.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Matched {
    /// The SHA-256 of the PDF file: the file is byte for byte the one recorded.
    File,
    /// The SHA-256 of the attached payload (the hash on the cover).
    Content,
}

/// The outcome of `verify`.
#[derive(Debug)]
pub struct Report {
    pub checks: Vec<Check>,
    /// Version of the program that made the package, when it differs from this one.
    pub other_version: Option<String>,
    /// Why the pages could not be compared with the content (the package made by another
    /// version, or with a template folder not given): the package is then not verified.
    pub unverified: Option<String>,
    /// Whether the package is a draft (not every sign-off is dated).
    pub draft: bool,
    /// Which hash the `--expect` hash equals, if one was given and it equals one.
    pub expected: Option<Matched>,
}

impl Report {
    /// 0 intact, 1 changed (or the signature or the expected hash fails), 3 not
    /// verified: its pages could not be compared with its content (made by another
    /// version, or with a template folder not given), and its file hash was not given
    /// with `--expect`.
    pub fn exit_code(&self) -> u8 {
        if self.checks.iter().any(|c| c.ok == Some(false)) {
            1
        } else if self.unverified.is_some() && self.expected != Some(Matched::File) {
            3
        } else {
            0
        }
    }

    /// The closing line: what the checks prove, in words.
    pub fn verdict(&self) -> String {
        let stale =
            self.checks.iter().any(|c| c.name == SIDECAR && c.ok.is_none() && c.detail.contains("belongs to another"));
        let note = if stale { " (the sidecar beside it belongs to another file; see above)" } else { "" };
        let failed = |name: &str| self.checks.iter().any(|c| c.name == name && c.ok == Some(false));
        let draft = if self.draft { ", a DRAFT (not every sign-off is dated)" } else { "" };
        match self.exit_code() {
            0 if self.unverified.is_some() => format!(
                "intact: the file is byte for byte the one whose file hash (PDF) was given with --expect{draft}{note}"
            ),
            0 if self.draft => format!(
                "intact draft: the file is exactly as it was written, but it is a DRAFT (not every sign-off is dated): it \
                 has not been issued{note}"
            ),
            0 => format!("intact: the package is exactly what was issued{note}"),
            1 if self.checks.iter().any(|c| c.ok == Some(false) && ![SIGNATURE, EXPECTED].contains(&c.name)) => {
                "CHANGED: the package is not what was issued (see the failed checks)".into()
            }
            1 if failed(EXPECTED) => {
                "NOT THE FILE RECORDED: the hash given with --expect is neither of this file's (see above)".into()
            }
            1 => format!(
                "SIGNATURE NOT VALID: the signature does not prove this file (see above){}",
                match &self.unverified {
                    Some(why) => format!("; and the package is not verified: {why}"),
                    None => String::new(),
                }
            ),
            _ => format!(
                "NOT VERIFIED: {}, so its pages were not compared with its content; prove the file against the file hash \
                 (PDF) recorded at issue with --expect HASH",
                self.unverified.as_deref().unwrap_or("its pages could not be re-rendered"),
            ),
        }
    }
}

/// The names of the checks.
pub const CONTENT: &str = "content hash (payload)";
pub const REANALYSIS: &str = "re-analysis";
pub const RERENDER: &str = "re-render";
pub const SIDECAR: &str = "sidecar file hash (PDF)";
pub const SIGNATURE: &str = "signature";
pub const EXPECTED: &str = "expected hash";

/// Options of `verify`.
#[derive(Default)]
pub struct Options<'a> {
    pub templates: Option<&'a Path>,
    pub pubkey: Option<&'a Path>,
    /// A hash recorded at issue: the file hash (PDF) or the content hash (payload).
    pub expect: Option<&'a str>,
    /// What the re-render tells its caller (see [`report::Hooks`]).
    pub hooks: report::Hooks<'a>,
}

/// Whether a path exists in any form (a dangling link too).
fn present(p: &Path) -> bool {
    std::fs::symlink_metadata(p).is_ok()
}

fn sibling(path: &Path, ext: &str) -> PathBuf {
    let mut s = path.as_os_str().to_os_string();
    s.push(ext);
    PathBuf::from(s)
}

/// What a package says of itself: the version that made it, whether it is a draft, its
/// input's name and its templates (as far as this version reads its payload).
struct Said {
    version: String,
    /// The version, when it is not this one.
    other_version: Option<String>,
    draft: bool,
    input_name: String,
    templates: String,
}

impl Said {
    fn of(o: &Opened) -> Said {
        let version = o.program.version.clone();
        let head = o.stored.as_ref().ok().map(|s| &s.head);
        Said {
            other_version: (version != env!("CARGO_PKG_VERSION")).then(|| version.clone()),
            version,
            draft: head.is_some_and(|h| h.package.draft),
            input_name: head.map_or("input.toml", |h| h.input.name.as_str()).to_string(),
            templates: head.map_or("builtin", |h| h.templates.as_str()).to_string(),
        }
    }
}

/// The package's input analysed again: its source, the package and the analysis.
type Reanalysed = std::result::Result<(Source, input::Package, Analysis), String>;

/// Runs every check on a package.
pub fn verify(path: &Path, opts: &Options) -> Result<Report> {
    let expect = opts.expect.map(expected_hash).transpose()?;
    let o = attached::open(path)?;
    let said = Said::of(&o);
    let file_hash = sha256_hex(&o.bytes);
    let content_hash = sha256_hex(&o.payload);
    let templates = templates_for(&said.templates, opts.templates);
    let reanalysed = reanalyse(&o, &said.input_name);
    let mut checks = vec![
        content_check(o.recorded.as_deref(), &content_hash),
        reanalysis_check(&o, &said, &reanalysed, &templates),
        rerender_check(&o, &said, &reanalysed, &templates, &opts.hooks),
    ];
    let rerendered = checks[2].ok;
    // the pages could not be compared: the package is not verified (a missing or
    // different template folder, or another version)
    let unverified = match (&said.other_version, &templates) {
        (Some(v), _) => Some(format!(
            "the package says version {v} made it, and only that version can re-render it (verify it with strainsheet {v})"
        )),
        (None, Err(e)) => Some(e.clone()),
        (None, Ok(_)) => None,
    };
    checks.push(sidecar_check(path, &file_hash, rerendered));
    checks.extend(signature_check(path, opts.pubkey, &o.bytes));
    let mut expected = None;
    if let Some(want) = &expect {
        let (check, matched) = expected_check(want, &file_hash, &content_hash, said.other_version.is_some());
        checks.push(check);
        expected = matched;
    }
    Ok(Report { checks, other_version: said.other_version, unverified, draft: said.draft, expected })
}

/// A hash given with `--expect`, read.
fn expected_hash(text: &str) -> Result<String> {
    sidecar::parse_hash(text).ok_or_else(|| {
        Error::Usage(format!(
            "--expect {text:?} is not a SHA-256: give the 64 hexadecimal digits of the file hash (PDF, as in the \
             .sha256 sidecar) or of the content hash (payload, as on the cover)"
        ))
    })
}

/// Check 1: the attached payload hashes to the content hash the metadata records.
fn content_check(recorded: Option<&str>, actual: &str) -> Check {
    let (ok, detail) = match recorded {
        Some(r) if r == actual => (true, format!("the attached payload hashes to the recorded content hash {r}")),
        Some(r) => (
            false,
            format!(
                "the attached payload hashes to {actual}, but the package records the content hash {r}: the payload or \
                 the metadata was changed"
            ),
        ),
        None => (false, "the PDF metadata holds no content hash: the metadata was changed".into()),
    };
    Check { name: CONTENT, ok: Some(ok), detail }
}

/// The templates the package was made with: the built-in ones, or the folder given if
/// it is the one recorded; else why not.
fn templates_for(recorded: &str, given: Option<&Path>) -> std::result::Result<Templates, String> {
    match (recorded, given) {
        ("builtin", None) => Ok(Templates::builtin()),
        ("builtin", Some(_)) => Err("the package was made with the built-in templates; run without --templates".into()),
        (h, Some(dir)) => match Templates::from_dir(dir) {
            Ok(t) if t.provenance() == h => Ok(t),
            Ok(t) => Err(format!(
                "the templates in {} ({}) differ from those the package was made with ({h})",
                dir.display(),
                t.provenance()
            )),
            Err(e) => Err(e.to_string()),
        },
        (h, None) => Err(format!("the package was made with a template folder ({h}); give it with --templates DIR")),
    }
}

/// The attached input read and analysed again.
fn reanalyse(o: &Opened, name: &str) -> Reanalysed {
    let src = input::from_bytes(name.to_string(), o.input.clone()).map_err(|e| e.to_string())?;
    let pkg = input::parse(&src).map_err(|e| format!("the attached input no longer reads: {e}"))?;
    let a = crate::analysis::analyze_full(&pkg).map_err(|e| e.to_string())?;
    Ok((src, pkg, a))
}

/// Check 2: the attached input gives the attached payload.
fn reanalysis_check(
    o: &Opened,
    said: &Said,
    reanalysed: &Reanalysed,
    templates: &std::result::Result<Templates, String>,
) -> Check {
    let check = |ok, detail: String| Check { name: REANALYSIS, ok, detail };
    let (src, pkg, a) = match reanalysed {
        Ok(r) => r,
        Err(e) => return check(Some(false), e.clone()),
    };
    // the payload records the templates used; rebuild it with the same provenance
    let prov = templates.as_ref().map_or_else(|_| said.templates.clone(), Templates::provenance);
    let mut p = payload::build(pkg, src, a, &payload::Provenance { templates: &prov });
    if said.other_version.is_some() {
        // compare the results, not the version stamp
        p.head.program.version = said.version.clone();
    }
    match p.canonical() {
        Ok(again) if again == o.payload => check(Some(true), "the attached input gives the same payload".into()),
        // another version may compute differently: that is no proof of a change
        _ if said.other_version.is_some() => check(
            None,
            format!(
                "this version ({}) computes other results from the attached input than version {} recorded: the \
                 method may differ between the versions, or the payload was changed; this version cannot tell which",
                env!("CARGO_PKG_VERSION"),
                said.version
            ),
        ),
        _ => check(
            Some(false),
            "the attached input gives a different payload: the payload or the input was changed".into(),
        ),
    }
}

/// Check 3: rendering the package again gives the file, byte for byte.
fn rerender_check(
    o: &Opened,
    said: &Said,
    reanalysed: &Reanalysed,
    templates: &std::result::Result<Templates, String>,
    hooks: &report::Hooks,
) -> Check {
    let check = |ok, detail: String| Check { name: RERENDER, ok, detail };
    let ((src, pkg, a), t) = match (reanalysed, templates, &said.other_version) {
        (_, _, Some(v)) => {
            return check(
                None,
                format!(
                    "not run: the package says version {v} made it, this is {}; its pages were not compared with its \
                     content",
                    env!("CARGO_PKG_VERSION")
                ),
            );
        }
        (Err(_), _, _) => return check(None, "not run: the input does not re-analyse".into()),
        (_, Err(e), _) => return check(None, format!("not run: {e}")),
        (Ok(r), Ok(t), None) => (r, t),
    };
    match report::render_with(pkg, src, a, t, hooks) {
        Ok(r) if r.pdf == o.bytes => check(Some(true), "re-rendering gives a byte-identical file".into()),
        Ok(r) => {
            let at = r.pdf.iter().zip(&o.bytes).position(|(x, y)| x != y).unwrap_or(r.pdf.len().min(o.bytes.len()));
            check(
                Some(false),
                format!(
                    "the file differs from a fresh rendering ({} bytes vs {}, first difference at byte {at}): it was \
                     changed after it was written",
                    o.bytes.len(),
                    r.pdf.len()
                ),
            )
        }
        Err(e) => check(Some(false), format!("the package cannot be re-rendered: {e}")),
    }
}

/// Check 5: with a public key, the signature beside the file; without one, a signature
/// file beside it is mentioned.
fn signature_check(path: &Path, pubkey: Option<&Path>, bytes: &[u8]) -> Option<Check> {
    let sig = sibling(path, ".sig");
    let check = |ok, detail| Some(Check { name: SIGNATURE, ok, detail });
    match pubkey {
        Some(pk) => match crate::integrity::sign::check(&sig, pk, bytes) {
            Ok(who) => check(Some(true), format!("{} is a valid signature of this file by {who}", sig.display())),
            Err(e) => check(Some(false), e),
        },
        None if present(&sig) => check(
            None,
            format!(
                "not checked: {} is beside the file; check it with --pubkey KEY.pub (the signer's public key)",
                sig.display()
            ),
        ),
        None => None,
    }
}

/// Check 6: the hash recorded at issue is the file hash (PDF) or the content hash
/// (payload) of this file, and which.
fn expected_check(want: &str, file_hash: &str, content_hash: &str, other_version: bool) -> (Check, Option<Matched>) {
    let check = |ok, detail| Check { name: EXPECTED, ok: Some(ok), detail };
    if want == file_hash {
        let detail = format!("{want} is the file hash (PDF) of this file: it is byte for byte the file recorded");
        (check(true, detail), Some(Matched::File))
    } else if want == content_hash {
        let pages = if other_version {
            "; the pages are proven only by the file hash (PDF) for a package of another version"
        } else {
            ""
        };
        let detail = format!(
            "{want} is the content hash (payload) of this file: its attached payload is the one recorded{pages}"
        );
        (check(true, detail), Some(Matched::Content))
    } else {
        let detail = format!(
            "{want} is neither the file hash (PDF) of this file, {file_hash}, nor its content hash (payload), \
             {content_hash}: this is not the file recorded"
        );
        (check(false, detail), None)
    }
}

/// Check 4: the sidecar beside the file. `rerendered` is the outcome of the re-render
/// (`None`: not run).
fn sidecar_check(path: &Path, file_hash: &str, rerendered: Option<bool>) -> Check {
    let side = sibling(path, ".sha256");
    let check = |ok, detail| Check { name: SIDECAR, ok, detail };
    if !present(&side) {
        return check(None, format!("not run: no {} beside the file", side.display()));
    }
    let text = match crate::integrity::files::read_text(&side, MAX_SIDECAR_BYTES, "the sidecar") {
        Ok(t) => t,
        Err(e) => return check(None, format!("not run: {e}")),
    };
    let (want, named) = match sidecar::parse(&text) {
        Ok(x) => x,
        Err(why) => return check(None, format!("not run: {} is not a sidecar line: {why}", side.display())),
    };
    let own = path.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let renamed = if named == own { String::new() } else { format!(" (it names {named:?}: the file was renamed)") };
    if want == file_hash {
        return check(Some(true), format!("{} records the file hash (PDF) of this file{renamed}", side.display()));
    }
    if named != own {
        return check(
            None,
            format!(
                "{} belongs to another file: it names {named:?}, not {own:?}, and records another file hash (PDF), {want}",
                side.display()
            ),
        );
    }
    match rerendered {
        Some(true) => check(
            None,
            format!(
                "{} belongs to another PDF of this name: it records the file hash {want}, this file hashes to {file_hash}, \
                 and this file re-renders byte for byte, so the sidecar was left from another file (an earlier issue, \
                 or an interrupted write); run report again, or remove it",
                side.display()
            ),
        ),
        Some(false) => check(
            Some(false),
            format!("{} records the file hash {want}; the file hashes to {file_hash}", side.display()),
        ),
        None => check(
            None,
            format!(
                "{} records the file hash {want}; this file hashes to {file_hash}: either the sidecar belongs to another \
                 PDF of this name or the file was changed, and without a re-render this version cannot tell which",
                side.display()
            ),
        ),
    }
}
