//! The Typst world of a package: it serves the templates, the embedded fonts and the
//! package's data files, and nothing else. Every other path, absolute or relative,
//! inside or outside the template folder, is refused, so a template or a value in the
//! payload cannot read a file of the machine.

use std::collections::BTreeMap;
use std::sync::{LazyLock, Mutex};
use typst::diag::{FileError, FileResult, SourceDiagnostic};
use typst::foundations::{Bytes, Datetime, Duration};
use typst::syntax::{FileId, RootedPath, Source, VirtualPath, VirtualRoot};
use typst::text::{Font, FontBook};
use typst::utils::LazyHash;
use typst::{Library, LibraryExt, World, WorldExt};

/// The bundled fonts (typst-assets), loaded once per process.
struct Fonts {
    book: LazyHash<FontBook>,
    fonts: Vec<Font>,
}

static FONTS: LazyLock<Fonts> = LazyLock::new(|| {
    let fonts: Vec<Font> = typst_assets::fonts().flat_map(|data| Font::iter(Bytes::new(data))).collect();
    Fonts { book: LazyHash::new(FontBook::from_fonts(&fonts)), fonts }
});

static LIBRARY: LazyLock<LazyHash<Library>> = LazyLock::new(|| LazyHash::new(Library::default()));

/// A file id for a fixed virtual path (ids are interned for the life of the process,
/// so only fixed names are ever made).
pub fn file_id(path: &str) -> Option<FileId> {
    let vp = VirtualPath::new(path).ok()?;
    Some(RootedPath::new(VirtualRoot::Project, vp).intern())
}

pub struct SheetWorld {
    main: FileId,
    /// The folder the files are served under (`/run3/package.typ`). Each Typst run of a
    /// package has its own: source spans, and with them the locations of elements, then
    /// differ between runs, so the sheets of separate runs can be joined in one document.
    dir: String,
    /// Virtual path (with a leading slash, without the folder) to contents.
    files: BTreeMap<String, Bytes>,
    sources: Mutex<BTreeMap<String, Source>>,
    today: Option<Datetime>,
}

impl SheetWorld {
    /// A world of the given files served under `/dir` (at the root if `dir` is empty);
    /// `main` names the entry template.
    /// Use a fixed set of folder names: file ids live as long as the process.
    pub fn new(dir: &str, main: &str, files: BTreeMap<String, Bytes>, today: Option<Datetime>) -> Option<SheetWorld> {
        let dir = if dir.is_empty() { String::new() } else { format!("/{dir}") };
        let main_id = file_id(&format!("{dir}{main}"))?;
        Some(SheetWorld { main: main_id, dir, files, sources: Mutex::new(BTreeMap::new()), today })
    }

    fn lookup(&self, id: FileId) -> FileResult<(&str, &Bytes)> {
        let rooted = id.get();
        if *rooted.root() != VirtualRoot::Project {
            return Err(FileError::AccessDenied);
        }
        let full = rooted.vpath().get_with_slash();
        let path = full
            .strip_prefix(self.dir.as_str())
            .filter(|p| p.starts_with('/'))
            .ok_or_else(|| FileError::NotFound(std::path::PathBuf::from(full)))?;
        match self.files.get_key_value(path) {
            Some((k, v)) => Ok((k.as_str(), v)),
            None => Err(FileError::NotFound(std::path::PathBuf::from(path))),
        }
    }

    /// A diagnostic as a line for people: `package.typ:12:5: message (hint: ...)`.
    pub fn describe(&self, d: &SourceDiagnostic) -> String {
        let mut at = String::new();
        if let Some(id) = d.span.id() {
            let full = id.get().vpath().get_with_slash().to_string();
            let name = full.strip_prefix(self.dir.as_str()).unwrap_or(&full).trim_start_matches('/').to_string();
            at = name.clone();
            if let (Ok(src), Some(range)) = (self.source(id), self.range(d.span))
                && let Some((l, c)) = src.lines().byte_to_line_column(range.start)
            {
                at = format!("{name}:{}:{}", l + 1, c + 1);
            }
        }
        let mut s = if at.is_empty() { d.message.to_string() } else { format!("{at}: {}", d.message) };
        for h in d.hints.iter() {
            s.push_str(&format!(" (hint: {})", h.v));
        }
        s
    }
}

impl World for SheetWorld {
    fn library(&self) -> &LazyHash<Library> {
        &LIBRARY
    }

    fn book(&self) -> &LazyHash<FontBook> {
        &FONTS.book
    }

    fn main(&self) -> FileId {
        self.main
    }

    fn source(&self, id: FileId) -> FileResult<Source> {
        let (path, bytes) = self.lookup(id)?;
        let mut cache = self.sources.lock().unwrap_or_else(|e| e.into_inner());
        if let Some(s) = cache.get(path) {
            return Ok(s.clone());
        }
        let text = std::str::from_utf8(bytes).map_err(|_| FileError::InvalidUtf8)?;
        let src = Source::new(id, text.to_string());
        cache.insert(path.to_string(), src.clone());
        Ok(src)
    }

    fn file(&self, id: FileId) -> FileResult<Bytes> {
        self.lookup(id).map(|(_, b)| b.clone())
    }

    fn font(&self, index: usize) -> Option<Font> {
        FONTS.fonts.get(index).cloned()
    }

    fn today(&self, _offset: Option<Duration>) -> Option<Datetime> {
        self.today
    }
}
