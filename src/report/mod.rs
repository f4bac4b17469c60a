//! The calculation package: the payload rendered through the templates with Typst,
//! embedded as a library, to a PDF/A-3b file with the input and the payload attached.

pub mod payload;
pub mod world;

use crate::analysis::Analysis;
use crate::error::{Error, Result};
use crate::input::{Package, Source};
use std::collections::BTreeMap;
use std::path::Path;
use typst::foundations::{Datetime, Smart};
use typst_layout::PagedDocument;
use typst_pdf::{PdfOptions, PdfStandard, PdfStandards, Timestamp};

/// The built-in templates, embedded at build time.
const BUILTIN: &[(&str, &str)] = &[
    ("package.typ", include_str!("../../templates/package.typ")),
    ("sheet.typ", include_str!("../../templates/sheet.typ")),
    ("member.typ", include_str!("../../templates/member.typ")),
    ("figures.typ", include_str!("../../templates/figures.typ")),
    ("curve.typ", include_str!("../../templates/curve.typ")),
];

/// Names the world reserves for the package's data.
pub const DATA_FILES: &[&str] = &["payload.json", "view.json", "seal.json", "input.toml"];

/// The entry template.
pub const MAIN: &str = "/package.typ";

/// Limits on a template folder.
const MAX_TEMPLATE_FILES: usize = 200;
const MAX_TEMPLATE_BYTES: u64 = 20 * 1024 * 1024;

/// A set of templates and where it came from.
#[derive(Debug, Clone)]
pub struct Templates {
    files: BTreeMap<String, Vec<u8>>,
    /// `None` for the built-in set, else the SHA-256 of the folder (see [`Templates::hash`]).
    hash: Option<String>,
}

impl Templates {
    pub fn builtin() -> Templates {
        Templates { files: BUILTIN.iter().map(|(n, t)| (format!("/{n}"), t.as_bytes().to_vec())).collect(), hash: None }
    }

    /// Reads a template folder: regular files only (links are refused), at most
    /// [`MAX_TEMPLATE_FILES`] files and 20 MiB. The folder must hold `package.typ`.
    pub fn from_dir(dir: &Path) -> Result<Templates> {
        let mut files = BTreeMap::new();
        let mut total = 0u64;
        let mut stack = vec![(dir.to_path_buf(), String::new())];
        while let Some((path, rel)) = stack.pop() {
            let entries = std::fs::read_dir(&path).map_err(|e| Error::io(&path, e))?;
            let mut entries: Vec<_> = entries.filter_map(|e| e.ok()).collect();
            entries.sort_by_key(|e| e.file_name());
            for e in entries {
                let p = e.path();
                let name = e.file_name().to_string_lossy().into_owned();
                let meta = std::fs::symlink_metadata(&p).map_err(|err| Error::io(&p, err))?;
                let vrel = if rel.is_empty() { name.clone() } else { format!("{rel}/{name}") };
                if meta.file_type().is_symlink() {
                    return Err(Error::Usage(format!(
                        "{}: the template folder holds a link; links are not followed, copy the file in instead",
                        p.display()
                    )));
                }
                if meta.is_dir() {
                    stack.push((p, vrel));
                    continue;
                }
                if !meta.is_file() {
                    continue;
                }
                if DATA_FILES.contains(&vrel.as_str()) {
                    return Err(Error::Usage(format!(
                        "{}: the name {vrel} is reserved for the package's data",
                        p.display()
                    )));
                }
                total += meta.len();
                if files.len() >= MAX_TEMPLATE_FILES || total > MAX_TEMPLATE_BYTES {
                    return Err(Error::Usage(format!(
                        "{}: the template folder is too large (at most {MAX_TEMPLATE_FILES} files and 20 MiB)",
                        dir.display()
                    )));
                }
                let bytes = std::fs::read(&p).map_err(|err| Error::io(&p, err))?;
                files.insert(format!("/{vrel}"), bytes);
            }
        }
        if !files.contains_key(MAIN) {
            return Err(Error::Usage(format!("{}: the template folder has no package.typ", dir.display())));
        }
        let hash = Some(Self::hash_of(&files));
        Ok(Templates { files, hash })
    }

    /// SHA-256 over the sorted list of `path NUL sha256(content) LF`.
    fn hash_of(files: &BTreeMap<String, Vec<u8>>) -> String {
        let mut listing = Vec::new();
        for (p, b) in files {
            listing.extend_from_slice(p.as_bytes());
            listing.push(0);
            listing.extend_from_slice(crate::seal::sha256_hex(b).as_bytes());
            listing.push(b'\n');
        }
        crate::seal::sha256_hex(&listing)
    }

    /// What the payload records: "builtin" or "sha256:<hex>".
    pub fn provenance(&self) -> String {
        match &self.hash {
            None => "builtin".into(),
            Some(h) => format!("sha256:{h}"),
        }
    }
}

/// A rendered package.
pub struct Rendered {
    pub pdf: Vec<u8>,
    /// The canonical payload bytes (attached as payload.json).
    pub payload: Vec<u8>,
    /// SHA-256 of the payload: the content hash.
    pub hash: String,
    pub pages: usize,
}

/// Builds the payload, its hash and the view the templates read.
pub fn seal(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> (Vec<u8>, String, Vec<u8>) {
    let prov = templates.provenance();
    let v = payload::build(pkg, src, a, &payload::Provenance { templates: &prov });
    let bytes = crate::seal::canonical(&v);
    let hash = crate::seal::sha256_hex(&bytes);
    let view = crate::seal::canonical(&payload::view(&v));
    (bytes, hash, view)
}

/// Renders the package.
pub fn render(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> Result<Rendered> {
    let (payload, hash, view) = seal(pkg, src, a, templates);
    let pdf_and_pages = compile(pkg, src, &payload, &view, &hash, templates)?;
    Ok(Rendered { pdf: pdf_and_pages.0, payload, hash, pages: pdf_and_pages.1 })
}

fn compile(
    pkg: &Package,
    src: &Source,
    payload: &[u8],
    view: &[u8],
    hash: &str,
    templates: &Templates,
) -> Result<(Vec<u8>, usize)> {
    let d = pkg.meta.date;
    let date = Datetime::from_ymd(d.year as i32, d.month, d.day)
        .ok_or_else(|| Error::Render(format!("the date {d} cannot be used")))?;
    let mut files = templates.files.clone();
    files.insert("/payload.json".into(), payload.to_vec());
    files.insert("/view.json".into(), view.to_vec());
    files.insert("/seal.json".into(), format!("{{\"hash\":\"{hash}\"}}").into_bytes());
    files.insert("/input.toml".into(), src.text.as_bytes().to_vec());
    let world = world::SheetWorld::new(MAIN, files, Some(date))
        .ok_or_else(|| Error::Render("bad main template path".into()))?;
    let warned = typst::compile::<PagedDocument>(&world);
    let doc = match warned.output {
        Ok(doc) => doc,
        Err(errors) => {
            let msgs: Vec<String> = errors.iter().map(|d| world.describe(d)).collect();
            return Err(Error::Render(msgs.join("; ")));
        }
    };
    if !warned.warnings.is_empty() {
        let msgs: Vec<String> = warned.warnings.iter().map(|d| world.describe(d)).collect();
        return Err(Error::Render(format!("the templates produced warnings (treated as errors): {}", msgs.join("; "))));
    }
    let standards = PdfStandards::new(&[PdfStandard::A_3b]).map_err(|e| Error::Render(format!("{e:?}")))?;
    let options = PdfOptions {
        ident: Smart::Custom(format!("strainsheet:{hash}")),
        creator: Smart::Custom(Some(format!("strainsheet {}", env!("CARGO_PKG_VERSION")))),
        timestamp: Some(Timestamp::new_utc(date)),
        standards,
        // PDF/A-3b asks for the visual appearance only; without the tag tree the file is
        // about a third of the size and writes twice as fast
        tagged: false,
        ..PdfOptions::default()
    };
    let pdf = typst_pdf::pdf(&doc, &options).map_err(|errors| {
        let msgs: Vec<String> = errors.iter().map(|d| world.describe(d)).collect();
        Error::Render(msgs.join("; "))
    })?;
    Ok((pdf, doc.pages().len()))
}
