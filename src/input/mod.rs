//! Reading a package: TOML text to a validated [`Package`], or diagnostics naming the
//! file, line, column, key, the value found and what is allowed.

pub mod fast;
pub mod locate;
pub mod model;
pub mod schema;
pub mod validate;

use crate::error::{Diagnostic, Error, Result};
use crate::units::System;
pub use model::Package;
use std::path::Path;

/// The largest input file read (bytes).
pub const MAX_FILE_BYTES: u64 = 16 * 1024 * 1024;

/// The input as read: its name for messages and its text.
#[derive(Debug, Clone)]
pub struct Source {
    pub name: String,
    pub text: String,
}

/// Reads a file, refusing what is too large or not UTF-8 text.
pub fn read(path: &Path) -> Result<Source> {
    let name = path.display().to_string();
    let meta = std::fs::metadata(path).map_err(|e| Error::io(path, e))?;
    if !meta.is_file() {
        return Err(Error::Io { path: name, message: "not a file".into() });
    }
    if meta.len() > MAX_FILE_BYTES {
        return Err(Error::Input(vec![Diagnostic {
            file: name,
            line: 0,
            col: 0,
            key: String::new(),
            message: format!("the file is {} bytes long", meta.len()),
            allowed: Some(format!("input files up to {} MiB", MAX_FILE_BYTES / (1024 * 1024))),
            snippet: None,
        }]));
    }
    let bytes = std::fs::read(path).map_err(|e| Error::io(path, e))?;
    from_bytes(name, bytes)
}

/// Checks that bytes are UTF-8 text (no NUL), giving the position of the first bad byte.
pub fn from_bytes(name: String, bytes: Vec<u8>) -> Result<Source> {
    let bad = |offset: usize, message: String| {
        let (line, col) = {
            let before = &bytes[..offset];
            let line = before.iter().filter(|b| **b == b'\n').count() + 1;
            let start = before.iter().rposition(|b| *b == b'\n').map_or(0, |i| i + 1);
            (line, offset - start + 1)
        };
        Error::Input(vec![Diagnostic {
            file: name.clone(),
            line,
            col,
            key: String::new(),
            message,
            allowed: Some("a TOML text file in UTF-8".into()),
            snippet: None,
        }])
    };
    if let Some(i) = bytes.iter().position(|b| *b == 0) {
        return Err(bad(i, "the file holds a NUL byte: it is not a text file".into()));
    }
    match String::from_utf8(bytes.clone()) {
        Ok(text) => Ok(Source { name, text }),
        Err(e) => {
            let i = e.utf8_error().valid_up_to();
            Err(bad(i, "the file is not valid UTF-8 text".into()))
        }
    }
}

fn diagnostic(
    src: &Source,
    span: Option<std::ops::Range<usize>>,
    key: String,
    message: String,
    allowed: Option<String>,
) -> Diagnostic {
    let (line, col, snippet) = match &span {
        Some(s) => {
            let (l, c) = locate::line_col(&src.text, s.start);
            (l, c, locate::snippet(&src.text, s))
        }
        None => (0, 0, None),
    };
    Diagnostic { file: src.name.clone(), line, col, key, message, allowed, snippet }
}

/// The unit system, read first: every other value depends on it.
fn system_of(src: &Source, f: &schema::File) -> Result<System> {
    if src.text.trim().is_empty() {
        return Err(Error::Input(vec![diagnostic(
            src,
            None,
            String::new(),
            "the file is empty".into(),
            Some("a package: format = 1, a [package] table and [[member]] tables (`strainsheet new FILE` writes a starter)".into()),
        )]));
    }
    if f.package.is_none() {
        return Err(Error::Input(vec![diagnostic(
            src,
            Some(0..0),
            "package".into(),
            "the [package] table is missing".into(),
            Some("a [package] table with title, project, revision, date and units".into()),
        )]));
    }
    let units = f.package.as_ref().and_then(|p| p.units.as_deref());
    let path = [locate::Seg::Key("package"), locate::Seg::Key("units")];
    match units {
        Some("us") => Ok(System::Us),
        Some("si") => Ok(System::Si),
        other => {
            let message = match other {
                Some(u) => format!("units = {u:?} is not a unit system"),
                None => "units is missing".to_string(),
            };
            Err(Error::Input(vec![diagnostic(
                src,
                locate::span_of(&src.text, &path),
                locate::show_path(&path),
                message,
                Some("\"us\" (in, in2, ksi, kip, kip-ft) or \"si\" (mm, mm2, MPa, kN, kN-m)".into()),
            )]))
        }
    }
}

/// Files with at least this many members are parsed in chunks, in parallel.
const CHUNKED_FROM: usize = 64;

/// Parses large files faster: the text is cut before each `[[member]]` header line and
/// the pieces are parsed in parallel (the head as `format` and `package` only, each piece
/// as `member` tables only). Any piece that does not parse that way (a header line inside
/// a multi-line string, tables out of the usual order...) makes this return `None`, and
/// the whole file is then parsed at once, which gives the same result or the error
/// message with its position.
fn parse_chunked(text: &str) -> Option<schema::File> {
    use rayon::prelude::*;
    #[derive(serde::Deserialize)]
    #[serde(deny_unknown_fields)]
    struct Head {
        format: Option<i64>,
        package: Option<schema::Package>,
    }
    #[derive(serde::Deserialize)]
    #[serde(deny_unknown_fields)]
    struct Piece {
        member: Vec<schema::Member>,
    }
    // the starts of the lines that hold a `[[member]]` header alone (or with a comment)
    let mut starts = Vec::new();
    const HEADER: &str = "[[member]]";
    for (at, _) in text.match_indices(HEADER) {
        let line = text[..at].rfind('\n').map_or(0, |i| i + 1);
        let end = text[at..].find('\n').map_or(text.len(), |i| at + i);
        let rest = text[at + HEADER.len()..end].trim_start();
        if text[line..at].trim().is_empty() && (rest.is_empty() || rest.starts_with('#')) {
            starts.push(line);
        }
    }
    if starts.len() < CHUNKED_FROM {
        return None;
    }
    let head: Head = fast::read(&text[..starts[0]]).ok()?;
    let groups = (rayon::current_num_threads() * 4).max(1);
    let per = starts.len().div_ceil(groups);
    let bounds: Vec<(usize, usize, usize)> = starts
        .chunks(per)
        .map(|c| (c[0], c.len()))
        .enumerate()
        .map(|(g, (from, n))| {
            let to = starts.get((g + 1) * per).copied().unwrap_or(text.len());
            (from, to, n)
        })
        .collect();
    let pieces: Option<Vec<Vec<schema::Member>>> = bounds
        .par_iter()
        .map(|&(from, to, n)| {
            let p: Piece = fast::read(&text[from..to]).ok()?;
            (p.member.len() == n).then_some(p.member)
        })
        .collect();
    Some(schema::File { format: head.format, package: head.package, member: pieces?.into_iter().flatten().collect() })
}

/// Parses and validates a package.
pub fn parse(src: &Source) -> Result<Package> {
    let file: schema::File = match parse_chunked(&src.text) {
        Some(f) => Ok(f),
        None => fast::read(&src.text),
    }
    .map_err(|e| {
        let mut message = e.message().trim().to_string();
        if let Some(first) = message.lines().next() {
            message = first.to_string();
        }
        let mut span = e.span();
        let allowed = if message.contains("recursion") {
            message = format!("the file nests tables or arrays too deeply ({message})");
            Some("tables and arrays nested as in a package (a few levels)".to_string())
        } else if message.starts_with("unknown field") {
            let (m, allowed) = unknown_key(&message);
            // a shape's keys are read after its table: point at the key's own line
            if let (Some(s), Some(given)) = (&span, message.split('`').nth(1)) {
                span = key_in_table(&src.text, s.start, given).or(span);
            }
            message = m;
            allowed
        } else if message.starts_with("unknown variant") {
            let (m, allowed) = unknown_value(&message, span.as_ref().map(|s| line_key(&src.text, s.start)));
            message = m;
            allowed
        } else if message == "missing field `shape`" {
            Some(format!("shape = {}", validate::SHAPES))
        } else {
            Some("TOML as in the starter file that `strainsheet new` writes".to_string())
        };
        // name the key for unknown-field errors and missing tables
        let key = span.as_ref().map(|s| key_at(&src.text, s.start)).filter(|k| !k.is_empty());
        let key = key.or_else(|| span.as_ref().map(|s| line_key(&src.text, s.start))).unwrap_or_default();
        Error::Input(vec![diagnostic(src, span, key, message, allowed)])
    })?;
    let sys = system_of(src, &file)?;
    let mut cx = validate::Ctx::new(sys);
    let pkg = validate::package(&mut cx, &file);
    if !cx.problems.is_empty() || pkg.is_none() {
        let mut ds: Vec<Diagnostic> = cx
            .problems
            .iter()
            .take(20)
            .map(|p| {
                let span = locate::span_of(&src.text, &p.path);
                diagnostic(src, span, locate::show_path(&p.path), p.message.clone(), p.allowed.clone())
            })
            .collect();
        if ds.is_empty() {
            ds.push(diagnostic(src, None, String::new(), "the package could not be read".into(), None));
        }
        return Err(Error::Input(ds));
    }
    let mut pkg = pkg.ok_or_else(|| Error::Usage("the package could not be read".into()))?;
    // the values are checked above; the appendix also prints the comments verbatim
    if let Some((at, c)) =
        src.text.char_indices().find(|(_, c)| !crate::fonts::drawable(*c) || crate::fonts::reorders(*c))
    {
        let line_end = src.text[at..].find('\n').map_or(src.text.len(), |k| at + k);
        let line = &src.text[src.text[..at].rfind('\n').map_or(0, |k| k + 1)..line_end];
        let message = if crate::fonts::reorders(c) {
            format!(
                "a comment holds the bidirectional control character U+{:04X}, which would reorder the input as the appendix prints it",
                c as u32
            )
        } else {
            format!(
                "a comment holds characters the package's fonts cannot draw: {} (the appendix prints the input verbatim)",
                validate::undrawable(line)
            )
        };
        return Err(Error::Input(vec![diagnostic(
            src,
            Some(at..at + c.len_utf8()),
            String::new(),
            message,
            Some("comments in Latin, Greek or Cyrillic letters, digits and the usual symbols".into()),
        )]));
    }
    pkg.warnings = cx
        .warnings
        .iter()
        .map(|(path, message)| {
            let at = match locate::span_of(&src.text, path) {
                Some(s) => {
                    let (l, c) = locate::line_col(&src.text, s.start);
                    format!("{}:{l}:{c}", src.name)
                }
                None => src.name.clone(),
            };
            model::Warning { at, key: locate::show_path(path), message: message.clone() }
        })
        .collect();
    Ok(pkg)
}

/// The message for a key the schema does not know: the key, the nearest known key
/// where one is close ("did you mean"), and the keys allowed in that table.
fn unknown_key(message: &str) -> (String, Option<String>) {
    let names: Vec<&str> = message.split('`').skip(1).step_by(2).collect();
    let Some((&given, known)) = names.split_first() else {
        return (message.to_string(), None);
    };
    let nearest = known
        .iter()
        .map(|k| (strsim::jaro_winkler(given, k), *k))
        .filter(|(score, _)| *score >= 0.8)
        .max_by(|a, b| a.0.total_cmp(&b.0))
        .map(|(_, k)| k);
    let list = known.iter().map(|k| format!("`{k}`")).collect::<Vec<_>>().join(", ");
    match nearest {
        Some(k) => (format!("unknown key `{given}`: did you mean `{k}`?"), Some(format!("one of {list}"))),
        None if known.is_empty() => (format!("unknown key `{given}`: this table takes no keys"), None),
        None => (format!("unknown key `{given}`"), Some(format!("one of {list}"))),
    }
}

/// A value the schema does not know for a key with a fixed set of values (a shape):
/// the value, the nearest known one, and the values allowed.
fn unknown_value(message: &str, key: Option<String>) -> (String, Option<String>) {
    let names: Vec<&str> = message.split('`').skip(1).step_by(2).collect();
    let Some((&given, known)) = names.split_first() else {
        return (message.to_string(), None);
    };
    let key = key.filter(|k| !k.is_empty()).unwrap_or_else(|| "the value".into());
    let nearest = known
        .iter()
        .map(|k| (strsim::jaro_winkler(given, k), *k))
        .filter(|(score, _)| *score >= 0.8)
        .max_by(|a, b| a.0.total_cmp(&b.0))
        .map(|(_, k)| format!(": did you mean {k:?}?"))
        .unwrap_or_default();
    let list = known.iter().map(|k| format!("{k:?}")).collect::<Vec<_>>().join(", ");
    (format!("{key} = {given:?} is not one this version knows{nearest}"), Some(format!("one of {list}")))
}

/// The span of `key = ...` within the table whose header is at `offset` (up to the next
/// table header).
fn key_in_table(text: &str, offset: usize, key: &str) -> Option<std::ops::Range<usize>> {
    let mut at = text[offset..].find('\n').map(|k| offset + k + 1)?;
    while at < text.len() {
        let line = &text[at..text[at..].find('\n').map_or(text.len(), |k| at + k)];
        let trimmed = line.trim_start();
        if trimmed.starts_with('[') {
            return None;
        }
        let indent = line.len() - trimmed.len();
        let rest = trimmed.strip_prefix(key);
        if rest.is_some_and(|r| r.trim_start().starts_with('=')) {
            return Some(at + indent..at + indent + key.len());
        }
        at += line.len() + 1;
    }
    None
}

/// The bare key at the start of the line holding a byte offset.
fn line_key(text: &str, offset: usize) -> String {
    let start = text[..offset.min(text.len())].rfind('\n').map_or(0, |k| k + 1);
    key_at(text, start + text[start..].len() - text[start..].trim_start().len())
}

/// The bare key written at a byte offset (for messages about unknown keys).
fn key_at(text: &str, offset: usize) -> String {
    let rest = text.get(offset..).unwrap_or("");
    rest.chars().take_while(|c| c.is_alphanumeric() || *c == '_' || *c == '-').collect()
}

/// Reads and validates a package file.
pub fn load(path: &Path) -> Result<(Source, Package)> {
    let src = read(path)?;
    let pkg = parse(&src)?;
    Ok((src, pkg))
}
