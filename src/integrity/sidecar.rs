//! The sidecar `OUT.pdf.sha256`: one line that `sha256sum -c` reads, holding the file
//! hash (PDF), and the hashes people give on the command line.

/// The sidecar line `sha256sum -c` reads: `<hex>  <file name>\n`.
pub fn line(pdf: &[u8], file_name: &str) -> String {
    format!("{}  {}\n", super::sha256_hex(pdf), file_name)
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
pub fn parse(text: &str) -> std::result::Result<(String, String), String> {
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
