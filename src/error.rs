//! Errors, each meant for a person: where (file, line, column, key), what was found, and
//! what is allowed. `main` maps them to exit statuses.

use std::fmt;

/// One problem in an input file.
#[derive(Debug, Clone, PartialEq)]
pub struct Diagnostic {
    pub file: String,
    /// 1-based line and column of the offending value (0 when unknown).
    pub line: usize,
    pub col: usize,
    /// Key path, e.g. `member[2].strands[1].fse` (indices from 1).
    pub key: String,
    pub message: String,
    /// What is allowed.
    pub allowed: Option<String>,
    /// The source line and the span on it to underline (start, length in chars).
    pub snippet: Option<(String, usize, usize)>,
}

impl fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut fmt::Formatter) -> fmt::Result {
        write!(f, "{}", self.file)?;
        if self.line > 0 {
            write!(f, ":{}:{}", self.line, self.col)?;
        }
        write!(f, ": ")?;
        if !self.key.is_empty() {
            write!(f, "{}: ", self.key)?;
        }
        write!(f, "{}", self.message)?;
        if let Some((text, start, len)) = &self.snippet {
            let num = self.line.to_string();
            let pad = " ".repeat(num.len());
            write!(f, "\n {pad} |\n {num} | {text}\n {pad} | {}{}", " ".repeat(*start), "^".repeat((*len).max(1)))?;
        }
        if let Some(a) = &self.allowed {
            write!(f, "\n  allowed: {a}")?;
        }
        Ok(())
    }
}

#[derive(Debug)]
pub enum Error {
    /// The input file has problems (exit 2).
    Input(Vec<Diagnostic>),
    /// A member could not be analysed (exit 2): the solver found no equilibrium, or the
    /// section is degenerate.
    Analysis { member: String, location: String, message: String },
    /// A file could not be read or written (exit 2).
    Io { path: String, message: String },
    /// The report could not be rendered (exit 2).
    Render(String),
    /// Anything else the user must act on (exit 2), e.g. an unknown member id.
    Usage(String),
}

impl Error {
    pub fn io(path: &std::path::Path, e: impl fmt::Display) -> Error {
        Error::Io { path: path.display().to_string(), message: e.to_string() }
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter) -> fmt::Result {
        match self {
            Error::Input(ds) => {
                for (i, d) in ds.iter().enumerate() {
                    if i > 0 {
                        writeln!(f)?;
                    }
                    write!(f, "error: {d}")?;
                }
                Ok(())
            }
            Error::Analysis { member, location, message } => {
                write!(f, "error: member {member:?}, location {location:?}: {message}")
            }
            Error::Io { path, message } => write!(f, "error: {path}: {message}"),
            Error::Render(m) => write!(f, "error: the report could not be rendered: {m}"),
            Error::Usage(m) => write!(f, "error: {m}"),
        }
    }
}

impl std::error::Error for Error {}

pub type Result<T, E = Error> = std::result::Result<T, E>;
