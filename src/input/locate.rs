//! From a key path to a place in the source text. Only used when there is something to
//! report, so the happy path parses the file once.

use toml::de::{DeTable, DeValue};

/// One step of a key path.
#[derive(Debug, Clone, PartialEq)]
pub enum Seg {
    Key(&'static str),
    Idx(usize),
}

/// A key path as the user reads it: `member[2].strands[1].fse`, indices from 1.
pub fn show_path(path: &[Seg]) -> String {
    let mut s = String::new();
    for seg in path {
        match seg {
            Seg::Key(k) => {
                if !s.is_empty() {
                    s.push('.');
                }
                s.push_str(k);
            }
            Seg::Idx(i) => s.push_str(&format!("[{}]", i + 1)),
        }
    }
    s
}

/// The byte span of the value at the path, or of the deepest table on it that exists.
pub fn span_of(text: &str, path: &[Seg]) -> Option<std::ops::Range<usize>> {
    let root = DeTable::parse(text).ok()?;
    let mut best = None;
    let mut cur: Option<&DeValue> = None;
    let mut table: Option<&DeTable> = Some(root.get_ref());
    for seg in path {
        let next = match (seg, table, cur) {
            (Seg::Key(k), Some(t), _) => t.iter().find(|(key, _)| key.get_ref() == k).map(|(_, v)| v),
            (Seg::Idx(i), _, Some(DeValue::Array(a))) => a.get(*i),
            _ => None,
        };
        match next {
            Some(v) => {
                best = Some(v.span());
                cur = Some(v.get_ref());
                table = match v.get_ref() {
                    DeValue::Table(t) => Some(t),
                    _ => None,
                };
            }
            None => break,
        }
    }
    best
}

/// 1-based line and column (in characters) of a byte offset.
pub fn line_col(text: &str, offset: usize) -> (usize, usize) {
    let offset = offset.min(text.len());
    let before = &text[..floor_char(text, offset)];
    let line = before.matches('\n').count() + 1;
    let start = before.rfind('\n').map_or(0, |i| i + 1);
    (line, before[start..].chars().count() + 1)
}

fn floor_char(text: &str, mut i: usize) -> usize {
    while i > 0 && !text.is_char_boundary(i) {
        i -= 1;
    }
    i
}

/// The source line holding a byte span, and the underlined part (start, length) in
/// characters. Long lines are shortened; control characters are shown as spaces.
pub fn snippet(text: &str, span: &std::ops::Range<usize>) -> Option<(String, usize, usize)> {
    let s = floor_char(text, span.start.min(text.len()));
    let line_start = text[..s].rfind('\n').map_or(0, |i| i + 1);
    let line_end = text[s..].find('\n').map_or(text.len(), |i| s + i);
    let line: String = text[line_start..line_end].chars().map(|c| if c.is_control() { ' ' } else { c }).collect();
    let start = text[line_start..s].chars().count();
    let e = floor_char(text, span.end.min(line_end).max(s));
    let len = text[s..e].chars().count();
    if line.chars().count() > 160 {
        let from = start.saturating_sub(40);
        let shown: String = line.chars().skip(from).take(120).collect();
        return Some((shown, start - from, len.min(120)));
    }
    Some((line, start, len))
}
