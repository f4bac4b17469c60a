//! `verify`: proving that a package is exactly what was issued.
//!
//! The checks, each reported in plain words:
//! 1. the attached payload hashes to the content hash recorded in the PDF metadata;
//! 2. re-analysing the attached input gives the same payload;
//! 3. re-rendering gives a file byte-identical to the one given (any change anywhere in
//!    the file is caught, also one a viewer would not show);
//! 4. a `FILE.pdf.sha256` sidecar beside it matches the file;
//! 5. with a public key, the `FILE.pdf.sig` signature is valid for the file.

use crate::error::{Error, Result};
use crate::input::{self, Source};
use crate::report::{self, Templates};
use crate::seal::sha256_hex;
use lopdf::{Document, Object};
use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

/// The largest file `verify` reads, and the largest attachment it inflates.
pub const MAX_PDF_BYTES: u64 = 512 * 1024 * 1024;
const MAX_ATTACHMENT_BYTES: usize = 256 * 1024 * 1024;

/// The outcome of one check.
#[derive(Debug, Clone, PartialEq)]
pub struct Check {
    pub name: &'static str,
    /// `None`: not run (with the reason in `detail`).
    pub ok: Option<bool>,
    pub detail: String,
}

/// The outcome of `verify`.
#[derive(Debug)]
pub struct Report {
    pub checks: Vec<Check>,
    /// Version of the program that made the package, when it differs from this one.
    pub other_version: Option<String>,
}

impl Report {
    /// 0 intact, 1 changed, 3 made by a different version.
    pub fn exit_code(&self) -> u8 {
        if self.checks.iter().any(|c| c.ok == Some(false)) {
            1
        } else if self.other_version.is_some() {
            3
        } else {
            0
        }
    }
}

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
    let meta = std::fs::metadata(path).map_err(|e| Error::io(path, e))?;
    if meta.len() > MAX_PDF_BYTES {
        return Err(not_package(
            path,
            format!("the file is {} bytes, more than any package this version writes", meta.len()),
        ));
    }
    let bytes = std::fs::read(path).map_err(|e| Error::io(path, e))?;
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
pub struct Options<'a> {
    pub templates: Option<&'a Path>,
    pub pubkey: Option<&'a Path>,
}

fn sibling(path: &Path, ext: &str) -> PathBuf {
    let mut s = path.as_os_str().to_os_string();
    s.push(ext);
    PathBuf::from(s)
}

/// Runs every check on a package.
pub fn verify(path: &Path, opts: &Options) -> Result<Report> {
    let o = open(path)?;
    let mut checks = Vec::new();
    let version = o.payload_json.pointer("/program/version").and_then(|v| v.as_str()).unwrap_or("?").to_string();
    let other_version = (version != env!("CARGO_PKG_VERSION")).then(|| version.clone());

    // 1. content hash
    let actual = sha256_hex(&o.payload);
    checks.push(match &o.recorded {
        Some(r) if *r == actual => Check { name: "content hash", ok: Some(true), detail: format!("the attached payload hashes to the recorded {r}") },
        Some(r) => Check { name: "content hash", ok: Some(false), detail: format!("the attached payload hashes to {actual}, but the package records {r}: the payload or the metadata was changed") },
        None => Check { name: "content hash", ok: Some(false), detail: "the PDF metadata holds no content hash: the metadata was changed".into() },
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
            } else {
                Check {
                    name: "re-analysis",
                    ok: Some(false),
                    detail: if other_version.is_some() {
                        format!("this version ({}) gives different results from the attached input than version {version} recorded", env!("CARGO_PKG_VERSION"))
                    } else {
                        "the attached input gives a different payload: the payload or the input was changed".into()
                    },
                }
            });
        }
    }

    // 3. re-render
    match (&reanalysed, &templates, &other_version) {
        (_, _, Some(v)) => checks.push(Check {
            name: "re-render",
            ok: None,
            detail: format!("not run: the package was made by version {v}, this is {}", env!("CARGO_PKG_VERSION")),
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
    if templates.is_err() && other_version.is_none() {
        // a missing or different template folder means the file cannot be proven intact
        if let Err(e) = &templates {
            checks.push(Check { name: "templates", ok: Some(false), detail: e.clone() });
        }
    }

    // 4. sidecar
    let side = sibling(path, ".sha256");
    if side.exists() {
        let text = std::fs::read_to_string(&side).unwrap_or_default();
        let want = text.split_whitespace().next().unwrap_or("").to_ascii_lowercase();
        let have = sha256_hex(&o.bytes);
        checks.push(if want == have {
            Check { name: "sidecar", ok: Some(true), detail: format!("{} matches the file", side.display()) }
        } else {
            Check {
                name: "sidecar",
                ok: Some(false),
                detail: format!("{} records {want}, the file hashes to {have}", side.display()),
            }
        });
    } else {
        checks.push(Check {
            name: "sidecar",
            ok: None,
            detail: format!("not run: no {} beside the file", side.display()),
        });
    }

    // 5. signature
    if let Some(pk) = opts.pubkey {
        let sig = sibling(path, ".sig");
        checks.push(match crate::sign::check(&sig, pk, &o.bytes) {
            Ok(who) => Check {
                name: "signature",
                ok: Some(true),
                detail: format!("{} is a valid signature of this file by {who}", sig.display()),
            },
            Err(e) => Check { name: "signature", ok: Some(false), detail: e },
        });
    }
    Ok(Report { checks, other_version })
}
