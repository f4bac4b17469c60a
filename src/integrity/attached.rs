//! Reading a package back: the files attached to it (the payload and the input) and
//! the content hash its metadata records. `verify`, `sign` and `diff` read packages
//! through [`open`].

use crate::error::{Error, Result};
use crate::report::payload::{Program, Stored, Written};
use lopdf::{Document, Object};
use std::collections::BTreeMap;
use std::path::Path;

/// The largest file read as a package, and the largest attachment it inflates.
pub const MAX_PDF_BYTES: u64 = 512 * 1024 * 1024;
const MAX_ATTACHMENT_BYTES: usize = 256 * 1024 * 1024;

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
    /// The file.
    pub bytes: Vec<u8>,
    /// The attached input.
    pub input: Vec<u8>,
    /// The attached payload's bytes.
    pub payload: Vec<u8>,
    /// The program that wrote the payload.
    pub program: Program,
    /// The payload read back, or why it cannot be (a payload of another version may be
    /// laid out otherwise).
    pub stored: std::result::Result<Stored, String>,
    /// The content hash the metadata records.
    pub recorded: Option<String>,
}

/// Reads a package: its bytes, attachments and recorded hash. Errors mean "not a
/// package or unreadable" (exit 2).
pub fn open(path: &Path) -> Result<Opened> {
    let bytes = crate::integrity::files::read_regular(path, MAX_PDF_BYTES, "the package")?;
    if !bytes.starts_with(b"%PDF-") {
        return Err(not_package(path, "the file is not a PDF"));
    }
    let doc = Document::load_mem(&bytes).map_err(|e| not_package(path, format!("the PDF cannot be read ({e})")))?;
    let mut files = attachments(&doc).map_err(|e| not_package(path, e))?;
    let payload = files.remove("payload.json").ok_or_else(|| not_package(path, "no attached payload.json"))?;
    let input = files.remove("input.toml").ok_or_else(|| not_package(path, "no attached input.toml"))?;
    let written: Written = serde_json::from_slice(&payload)
        .map_err(|e| not_package(path, format!("the attached payload is not one strainsheet writes ({e})")))?;
    if written.program.name != "strainsheet" {
        return Err(not_package(path, "the attached payload was not written by strainsheet"));
    }
    let stored = serde_json::from_slice(&payload)
        .map_err(|e| format!("the attached payload cannot be read by this version ({e})"));
    Ok(Opened { bytes, input, payload, program: written.program, stored, recorded: recorded_hash(&doc) })
}
