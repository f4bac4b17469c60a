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

use crate::error::{Error, Result};
use crate::input::{self, Source};
use crate::report::{self, Templates};
use crate::seal::sha256_hex;
use lopdf::{Document, Object};
use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

/// The largest file `verify` reads, and the largest attachment it inflates.
pub const MAX_PDF_BYTES: u64 = 512 * 1024 * 1024;
/// The largest sidecar read (one line: a hash and a file name).
pub const MAX_SIDECAR_BYTES: u64 = 64 * 1024;
const MAX_ATTACHMENT_BYTES: usize = 256 * 1024 * 1024;

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
pub const SIDECAR: &str = "sidecar file hash (PDF)";
pub const SIGNATURE: &str = "signature";
pub const EXPECTED: &str = "expected hash";

/// Why a file is not a package this program can verify (exit 2).
fn not_package(path: &Path, why: impl std::fmt::Display) -> Error {
    Error::Usage(format!("{}: not a strainsheet package: {why}", path.display()))
}

/// The files attached to a PDF (its /EmbeddedFiles name tree), by name.
pub fn attachments(doc: &Document) -> std::result::Result<BTreeMap<String, Vec<u8>>, String> {
    let catalog = doc.catalog().map_err(|e| format!("no document catalog ({e})"))?;
    let names =
        catalog.get_deref(b"Names", doc).and_then(Object::as_dict).map_err(|_| "no attached files".to_string())?;
    let tree = names
        .get_deref(b"EmbeddedFiles", doc)
        .and_then(Object::as_dict)
        .map_err(|_| "no attached files".to_string())?;
    let mut out = BTreeMap::new();
    walk_names(doc, tree, &mut out, 0)?;
    Ok(out)
}

fn walk_names(
    doc: &Document,
    node: &lopdf::Dictionary,
    out: &mut BTreeMap<String, Vec<u8>>,
    depth: usize,
) -> std::result::Result<(), String> {
    if depth > 16 {
        return Err("the attachment tree is too deep".into());
    }
    if let Ok(kids) = node.get_deref(b"Kids", doc).and_then(Object::as_array) {
        for k in kids {
            let kid = doc.dereference(k).map_err(|e| e.to_string())?.1.as_dict().map_err(|e| e.to_string())?;
            walk_names(doc, kid, out, depth + 1)?;
        }
    }
    if let Ok(pairs) = node.get_deref(b"Names", doc).and_then(Object::as_array) {
        for pair in pairs.chunks(2) {
            let [name, spec] = pair else { continue };
            let name = match doc.dereference(name).map_err(|e| e.to_string())?.1 {
                Object::String(bytes, _) => String::from_utf8_lossy(bytes).into_owned(),
                _ => continue,
            };
            let spec = doc.dereference(spec).map_err(|e| e.to_string())?.1.as_dict().map_err(|e| e.to_string())?;
            let ef = spec
                .get_deref(b"EF", doc)
                .and_then(Object::as_dict)
                .map_err(|_| format!("attachment {name} has no file stream"))?;
            let stream = ef
                .get_deref(b"F", doc)
                .and_then(Object::as_stream)
                .map_err(|_| format!("attachment {name} has no file stream"))?;
            let bytes = if stream.dict.has(b"Filter") {
                stream
                    .decompressed_content_with_limit(MAX_ATTACHMENT_BYTES)
                    .map_err(|e| format!("attachment {name} cannot be read ({e})"))?
            } else {
                stream.content.clone()
            };
            out.insert(name, bytes);
        }
    }
    Ok(())
}

/// The content hash recorded in the PDF's document information (keywords).
pub fn recorded_hash(doc: &Document) -> Option<String> {
    let info = doc.trailer.get_deref(b"Info", doc).ok()?.as_dict().ok()?;
    let kw = match info.get_deref(b"Keywords", doc).ok()? {
        Object::String(b, _) => decode_pdf_text(b),
        _ => return None,
    };
    let i = kw.find("content-sha256:")?;
    let hex: String = kw[i + 15..].chars().take_while(|c| c.is_ascii_hexdigit()).collect();
    (hex.len() == 64).then_some(hex)
}

/// PDF text strings are PDFDocEncoding or UTF-16BE with a byte-order mark.
fn decode_pdf_text(b: &[u8]) -> String {
    if b.starts_with(&[0xFE, 0xFF]) {
        let units: Vec<u16> =
            b[2..].chunks(2).filter(|c| c.len() == 2).map(|c| u16::from_be_bytes([c[0], c[1]])).collect();
        String::from_utf16_lossy(&units)
    } else {
        b.iter().map(|&c| c as char).collect()
    }
}

/// What a package holds, read back.
pub struct Opened {
    pub bytes: Vec<u8>,
    pub input: Vec<u8>,
    pub payload: Vec<u8>,
    pub payload_json: serde_json::Value,
    pub recorded: Option<String>,
}

/// Reads a package: its bytes, attachments and recorded hash. Errors mean "not a
/// package or unreadable" (exit 2).
pub fn open(path: &Path) -> Result<Opened> {
    let bytes = crate::files::read_regular(path, MAX_PDF_BYTES, "the package")?;
    if !bytes.starts_with(b"%PDF-") {
        return Err(not_package(path, "the file is not a PDF"));
    }
    let doc = Document::load_mem(&bytes).map_err(|e| not_package(path, format!("the PDF cannot be read ({e})")))?;
    let mut files = attachments(&doc).map_err(|e| not_package(path, e))?;
    let payload = files.remove("payload.json").ok_or_else(|| not_package(path, "no attached payload.json"))?;
    let input = files.remove("input.toml").ok_or_else(|| not_package(path, "no attached input.toml"))?;
    let payload_json: serde_json::Value = serde_json::from_slice(&payload)
        .map_err(|e| not_package(path, format!("the attached payload is not JSON ({e})")))?;
    if payload_json.pointer("/program/name").and_then(|v| v.as_str()) != Some("strainsheet") {
        return Err(not_package(path, "the attached payload was not written by strainsheet"));
    }
    Ok(Opened { bytes, input, payload, payload_json, recorded: recorded_hash(&doc) })
}

/// Options of `verify`.
#[derive(Default)]
pub struct Options<'a> {
    pub templates: Option<&'a Path>,
    pub pubkey: Option<&'a Path>,
    /// A hash recorded at issue: the file hash (PDF) or the content hash (payload).
    pub expect: Option<&'a str>,
}

/// A SHA-256 given by a person: 64 hexadecimal digits, optionally after `sha256:`, in
/// either case; returned in lowercase.
pub fn parse_hash(text: &str) -> Option<String> {
    let t = text.trim();
    let t = t.strip_prefix("sha256:").or_else(|| t.strip_prefix("SHA256:")).unwrap_or(t);
    (t.len() == 64 && t.bytes().all(|b| b.is_ascii_hexdigit())).then(|| t.to_ascii_lowercase())
}

/// A sidecar line as `sha256sum` writes it: the hash, two spaces (or a space and `*`)
/// and the file name; a name holding a backslash or a line end is escaped and the line
/// begins with a backslash; the line end may be CR LF. Returns the hash (lowercase) and
/// the name.
pub fn parse_sidecar(text: &str) -> std::result::Result<(String, String), String> {
    // a sidecar is not signed: one saved with a CR LF line end is read as well
    let body =
        text.strip_suffix("\r\n").or_else(|| text.strip_suffix('\n')).ok_or("it does not end with one line end")?;
    if body.contains('\n') {
        return Err("it holds more than one line; a sidecar holds one".into());
    }
    let (escaped, line) = match body.strip_prefix('\\') {
        Some(rest) => (true, rest),
        None => (false, body),
    };
    let (hash, rest) = line.split_at_checked(64).ok_or("it does not begin with a SHA-256 (64 hex digits)")?;
    let hash = parse_hash(hash).ok_or("it does not begin with a SHA-256 (64 hex digits)")?;
    let name = rest
        .strip_prefix("  ")
        .or_else(|| rest.strip_prefix(" *"))
        .ok_or("the hash is not followed by two spaces and a file name")?;
    if name.is_empty() {
        return Err("it names no file".into());
    }
    if !escaped {
        return Ok((hash, name.to_string()));
    }
    let mut out = String::new();
    let mut chars = name.chars();
    while let Some(c) = chars.next() {
        match (c, c == '\\') {
            (_, true) => match chars.next() {
                Some('\\') => out.push('\\'),
                Some('n') => out.push('\n'),
                Some('r') => out.push('\r'),
                _ => return Err("its file name holds a backslash that escapes nothing".into()),
            },
            (c, false) => out.push(c),
        }
    }
    Ok((hash, out))
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

/// Runs every check on a package.
pub fn verify(path: &Path, opts: &Options) -> Result<Report> {
    let expect = match opts.expect {
        Some(t) => Some(parse_hash(t).ok_or_else(|| {
            Error::Usage(format!(
                "--expect {t:?} is not a SHA-256: give the 64 hexadecimal digits of the file hash (PDF, as in the \
                 .sha256 sidecar) or of the content hash (payload, as on the cover)"
            ))
        })?),
        None => None,
    };
    let o = open(path)?;
    let mut checks = Vec::new();
    let version = o.payload_json.pointer("/program/version").and_then(|v| v.as_str()).unwrap_or("?").to_string();
    let other_version = (version != env!("CARGO_PKG_VERSION")).then(|| version.clone());
    let draft = o.payload_json.pointer("/package/draft").and_then(|v| v.as_bool()).unwrap_or(false);
    let file_hash = sha256_hex(&o.bytes);

    // 1. content hash
    let actual = sha256_hex(&o.payload);
    checks.push(match &o.recorded {
        Some(r) if *r == actual => Check { name: CONTENT, ok: Some(true), detail: format!("the attached payload hashes to the recorded content hash {r}") },
        Some(r) => Check { name: CONTENT, ok: Some(false), detail: format!("the attached payload hashes to {actual}, but the package records the content hash {r}: the payload or the metadata was changed") },
        None => Check { name: CONTENT, ok: Some(false), detail: "the PDF metadata holds no content hash: the metadata was changed".into() },
    });

    // 2. re-analysis
    let name = o.payload_json.pointer("/input/name").and_then(|v| v.as_str()).unwrap_or("input.toml").to_string();
    let templates_rec = o.payload_json.get("templates").and_then(|v| v.as_str()).unwrap_or("builtin").to_string();
    let templates: std::result::Result<Templates, String> = match (templates_rec.as_str(), opts.templates) {
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
    };
    let reanalysed = (|| -> std::result::Result<(Source, input::Package, crate::analysis::Analysis), String> {
        let src = input::from_bytes(name.clone(), o.input.clone()).map_err(|e| e.to_string())?;
        let pkg = input::parse(&src).map_err(|e| format!("the attached input no longer reads: {e}"))?;
        let a = crate::analysis::analyze_full(&pkg).map_err(|e| e.to_string())?;
        Ok((src, pkg, a))
    })();
    match (&reanalysed, &templates) {
        (Err(e), _) => checks.push(Check { name: "re-analysis", ok: Some(false), detail: e.clone() }),
        (Ok((src, pkg, a)), t) => {
            // the payload records the templates used; re-seal with the same provenance
            let prov = match t {
                Ok(t) => t.provenance(),
                Err(_) => templates_rec.clone(),
            };
            let v = report::payload::build(pkg, src, a, &report::payload::Provenance { templates: &prov });
            let mut v = v;
            if other_version.is_some() {
                // compare the results, not the version stamp
                v["program"]["version"] = serde_json::Value::String(version.clone());
            }
            let again = crate::seal::canonical(&v);
            checks.push(if again == o.payload {
                Check { name: "re-analysis", ok: Some(true), detail: "the attached input gives the same payload".into() }
            } else if other_version.is_some() {
                // another version may compute differently: that is no proof of a change
                Check {
                    name: "re-analysis",
                    ok: None,
                    detail: format!("this version ({}) computes other results from the attached input than version {version} recorded: the method may differ between the versions, or the payload was changed; this version cannot tell which", env!("CARGO_PKG_VERSION")),
                }
            } else {
                Check {
                    name: "re-analysis",
                    ok: Some(false),
                    detail: "the attached input gives a different payload: the payload or the input was changed".into(),
                }
            });
        }
    }

    // 3. re-render
    match (&reanalysed, &templates, &other_version) {
        (_, _, Some(v)) => checks.push(Check {
            name: "re-render",
            ok: None,
            detail: format!(
                "not run: the package says version {v} made it, this is {}; its pages were not compared with its content",
                env!("CARGO_PKG_VERSION")
            ),
        }),
        (Err(_), _, _) => {
            checks.push(Check { name: "re-render", ok: None, detail: "not run: the input does not re-analyse".into() })
        }
        (_, Err(e), _) => checks.push(Check { name: "re-render", ok: None, detail: format!("not run: {e}") }),
        (Ok((src, pkg, a)), Ok(t), None) => match report::render(pkg, src, a, t) {
            Ok(r) if r.pdf == o.bytes => checks.push(Check {
                name: "re-render",
                ok: Some(true),
                detail: "re-rendering gives a byte-identical file".into(),
            }),
            Ok(r) => {
                let at = r.pdf.iter().zip(&o.bytes).position(|(x, y)| x != y).unwrap_or(r.pdf.len().min(o.bytes.len()));
                checks.push(Check {
                    name: "re-render",
                    ok: Some(false),
                    detail: format!("the file differs from a fresh rendering ({} bytes vs {}, first difference at byte {at}): it was changed after it was written", o.bytes.len(), r.pdf.len()),
                })
            }
            Err(e) => checks.push(Check {
                name: "re-render",
                ok: Some(false),
                detail: format!("the package cannot be re-rendered: {e}"),
            }),
        },
    }
    // the pages could not be compared: the package is not verified (a missing or
    // different template folder, or another version)
    let unverified = match (&other_version, &templates) {
        (Some(v), _) => Some(format!(
            "the package says version {v} made it, and only that version can re-render it (verify it with strainsheet {v})"
        )),
        (None, Err(e)) => Some(e.clone()),
        (None, Ok(_)) => None,
    };

    let rerendered = checks.iter().find(|c| c.name == "re-render").and_then(|c| c.ok);

    // 4. sidecar
    checks.push(sidecar_check(path, &file_hash, rerendered));

    // 5. signature
    let sig = sibling(path, ".sig");
    if let Some(pk) = opts.pubkey {
        checks.push(match crate::sign::check(&sig, pk, &o.bytes) {
            Ok(who) => Check {
                name: SIGNATURE,
                ok: Some(true),
                detail: format!("{} is a valid signature of this file by {who}", sig.display()),
            },
            Err(e) => Check { name: SIGNATURE, ok: Some(false), detail: e },
        });
    } else if present(&sig) {
        checks.push(Check {
            name: SIGNATURE,
            ok: None,
            detail: format!(
                "not checked: {} is beside the file; check it with --pubkey KEY.pub (the signer's public key)",
                sig.display()
            ),
        });
    }

    // 6. a hash recorded at issue
    let mut expected = None;
    if let Some(want) = &expect {
        checks.push(if *want == file_hash {
            expected = Some(Matched::File);
            Check {
                name: EXPECTED,
                ok: Some(true),
                detail: format!("{want} is the file hash (PDF) of this file: it is byte for byte the file recorded"),
            }
        } else if *want == actual {
            expected = Some(Matched::Content);
            Check {
                name: EXPECTED,
                ok: Some(true),
                detail: format!(
                    "{want} is the content hash (payload) of this file: its attached payload is the one recorded{}",
                    if other_version.is_some() {
                        "; the pages are proven only by the file hash (PDF) for a package of another version"
                    } else {
                        ""
                    }
                ),
            }
        } else {
            Check {
                name: EXPECTED,
                ok: Some(false),
                detail: format!(
                    "{want} is neither the file hash (PDF) of this file, {file_hash}, nor its content hash (payload), {actual}: this is not the file recorded"
                ),
            }
        });
    }
    Ok(Report { checks, other_version, unverified, draft, expected })
}

/// Check 4: the sidecar beside the file. `rerendered` is the outcome of the re-render
/// (`None`: not run).
fn sidecar_check(path: &Path, file_hash: &str, rerendered: Option<bool>) -> Check {
    let side = sibling(path, ".sha256");
    let check = |ok, detail| Check { name: SIDECAR, ok, detail };
    if !present(&side) {
        return check(None, format!("not run: no {} beside the file", side.display()));
    }
    let text = match crate::files::read_text(&side, MAX_SIDECAR_BYTES, "the sidecar") {
        Ok(t) => t,
        Err(e) => return check(None, format!("not run: {e}")),
    };
    let (want, named) = match parse_sidecar(&text) {
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
