//! The calculation package: the payload rendered through the templates with Typst,
//! embedded as a library, to a PDF/A-3b file with the input and the payload attached.

pub mod payload;
mod shelf;
pub mod world;

use crate::analysis::Analysis;
use crate::error::{Error, Result};
use crate::input::{Package, Source};
use serde_json::{Map, Value, json};
use std::collections::BTreeMap;
use std::path::Path;
use typst::comemo;
use typst::diag::Warned;
use typst::ecow::EcoVec;
use typst::foundations::{Bytes, Datetime, NativeElement, Smart};
use typst::introspection::{Introspector, MetadataElem};
use typst::layout::Point;
use typst::model::Document;
use typst_layout::{Page, PagedDocument};
use typst_pdf::{PdfOptions, PdfStandard, PdfStandards, Timestamp};

/// The built-in templates, embedded at build time.
const BUILTIN: &[(&str, &str)] = &[
    ("package.typ", include_str!("../../templates/package.typ")),
    ("members.typ", include_str!("../../templates/members.typ")),
    ("stamps.typ", include_str!("../../templates/stamps.typ")),
    ("sheet.typ", include_str!("../../templates/sheet.typ")),
    ("member.typ", include_str!("../../templates/member.typ")),
    ("figures.typ", include_str!("../../templates/figures.typ")),
    ("curve.typ", include_str!("../../templates/curve.typ")),
];

/// Names the world reserves for the package's data.
pub const DATA_FILES: &[&str] = &["payload.json", "view.json", "seal.json", "input.toml"];

/// The entry template of the front and back matter.
pub const MAIN: &str = "/package.typ";
/// The entry template of a run of members.
pub const MEMBERS: &str = "/members.typ";
/// The entry template of the sheet numbers.
pub const STAMPS: &str = "/stamps.typ";
/// The entry templates every template folder must hold.
const ENTRIES: [&str; 3] = [MAIN, MEMBERS, STAMPS];

/// Members typeset in one Typst run. Typst's memory grows with the sheets of a run
/// (about 1.7 MB a sheet); a few members at a time keep the peak low whatever the length
/// of the package, at little cost in time.
const MEMBERS_PER_RUN: usize = 6;
/// Runs of members typeset at the same time.
const PARALLEL_RUNS: usize = 2;
/// At most this many runs of members (longer packages put more members in a run). Each
/// run serves its files under a folder of its own, and Typst keeps a file id for every
/// path it reads for the life of the process, at most 65,535: 200 runs of at most
/// [`MAX_TEMPLATE_FILES`] files each stay well inside.
const MAX_RUNS: usize = 200;

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
    /// [`MAX_TEMPLATE_FILES`] files and 20 MiB. The folder must hold the three entry
    /// templates: `package.typ`, `members.typ` and `stamps.typ`.
    ///
    /// Each entry is opened once, relative to its folder as opened, without following a
    /// link (`O_NOFOLLOW`), and what was opened is checked (`fstat`): an entry swapped for
    /// a link, a pipe or a device after the folder was listed is refused, never followed
    /// or waited on.
    pub fn from_dir(dir: &Path) -> Result<Templates> {
        use std::io::Read;
        let link = |p: &Path| {
            Error::Usage(format!(
                "{}: the template folder holds a link; links are not followed, copy the file in instead",
                p.display()
            ))
        };
        let swapped = |p: &Path, kind: &str| {
            Error::Usage(format!(
                "{}: this entry of the template folder became {kind} while the folder was read; it is not read",
                p.display()
            ))
        };
        let mut files = BTreeMap::new();
        let mut total = 0u64;
        let root = open_entry(None, dir, true).map_err(|e| Error::io(dir, e))?;
        let mut stack = vec![(root, dir.to_path_buf(), String::new())];
        while let Some((folder, path, rel)) = stack.pop() {
            let entries = std::fs::read_dir(&path).map_err(|e| Error::io(&path, e))?;
            let mut entries: Vec<_> = entries.filter_map(|e| e.ok()).collect();
            entries.sort_by_key(|e| e.file_name());
            for e in entries {
                let p = e.path();
                let name = e.file_name().to_string_lossy().into_owned();
                let meta = std::fs::symlink_metadata(&p).map_err(|err| Error::io(&p, err))?;
                let vrel = if rel.is_empty() { name.clone() } else { format!("{rel}/{name}") };
                if meta.file_type().is_symlink() {
                    return Err(link(&p));
                }
                if !meta.is_dir() && !meta.is_file() {
                    continue;
                }
                // open what the name holds now, in the folder as opened, never through a link
                let opened = match open_entry(Some(&folder), &p, meta.is_dir()) {
                    Ok(f) => f,
                    Err(err) if is_link_error(&err) => return Err(link(&p)),
                    Err(err) => return Err(Error::io(&p, err)),
                };
                let now = opened.metadata().map_err(|err| Error::io(&p, err))?;
                if meta.is_dir() {
                    if !now.is_dir() {
                        return Err(swapped(&p, crate::files::kind_of(&now.file_type())));
                    }
                    stack.push((opened, p, vrel));
                    continue;
                }
                if !now.is_file() {
                    return Err(swapped(&p, crate::files::kind_of(&now.file_type())));
                }
                if DATA_FILES.contains(&vrel.as_str()) {
                    return Err(Error::Usage(format!(
                        "{}: the name {vrel} is reserved for the package's data",
                        p.display()
                    )));
                }
                let too_large = || {
                    Error::Usage(format!(
                        "{}: the template folder is too large (at most {MAX_TEMPLATE_FILES} files and 20 MiB)",
                        dir.display()
                    ))
                };
                if files.len() >= MAX_TEMPLATE_FILES || total + now.len() > MAX_TEMPLATE_BYTES {
                    return Err(too_large());
                }
                // read what was opened, and no more than the limit leaves (a file that grows
                // while it is read is stopped there)
                let room = MAX_TEMPLATE_BYTES - total;
                let mut bytes = Vec::with_capacity(now.len() as usize);
                opened.take(room + 1).read_to_end(&mut bytes).map_err(|err| Error::io(&p, err))?;
                if bytes.len() as u64 > room {
                    return Err(too_large());
                }
                total += bytes.len() as u64;
                files.insert(format!("/{vrel}"), bytes);
            }
        }
        let missing: Vec<&str> = ENTRIES.iter().filter(|e| !files.contains_key(**e)).map(|e| &e[1..]).collect();
        if !missing.is_empty() {
            return Err(Error::Usage(format!(
                "{}: the template folder has no {} (it must hold package.typ, members.typ and stamps.typ)",
                dir.display(),
                missing.join(" and ")
            )));
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

/// Opens an entry of a template folder for [`Templates::from_dir`]: on Linux relative to
/// its folder as opened (`openat`), never following a link at its name (`O_NOFOLLOW`) and
/// never waiting (`O_NONBLOCK`: a pipe put in its place opens at once, and is refused by
/// its type); `folder` is `None` for the folder given, which is opened by its path.
fn open_entry(folder: Option<&std::fs::File>, path: &Path, dir: bool) -> std::io::Result<std::fs::File> {
    #[cfg(target_os = "linux")]
    {
        use std::os::fd::{AsRawFd, FromRawFd};
        use std::os::unix::ffi::OsStrExt;
        let mut flags = libc::O_RDONLY | libc::O_CLOEXEC | libc::O_NONBLOCK;
        if dir {
            flags |= libc::O_DIRECTORY;
        }
        let (at, name) = match folder {
            Some(f) => {
                flags |= libc::O_NOFOLLOW;
                (f.as_raw_fd(), path.file_name().unwrap_or(path.as_os_str()))
            }
            None => (libc::AT_FDCWD, path.as_os_str()),
        };
        let c = std::ffi::CString::new(name.as_bytes())
            .map_err(|_| std::io::Error::new(std::io::ErrorKind::InvalidInput, "a name with a NUL byte"))?;
        // SAFETY: openat reads the NUL-terminated name; `at` is a descriptor we hold open
        // (or AT_FDCWD). A descriptor it returns is ours alone, and File takes it over.
        let fd = unsafe { libc::openat(at, c.as_ptr(), flags) };
        if fd < 0 {
            return Err(std::io::Error::last_os_error());
        }
        // SAFETY: fd is a fresh, valid descriptor that nothing else owns.
        Ok(unsafe { std::fs::File::from_raw_fd(fd) })
    }
    #[cfg(not(target_os = "linux"))]
    {
        // elsewhere the entry is opened by its path; what was opened is still checked
        let _ = (folder, dir);
        std::fs::File::open(path)
    }
}

/// Whether opening failed because the name is a link (`O_NOFOLLOW` gives ELOOP).
fn is_link_error(e: &std::io::Error) -> bool {
    #[cfg(target_os = "linux")]
    if e.raw_os_error() == Some(libc::ELOOP) {
        return true;
    }
    let _ = e;
    false
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
fn seal(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> (Vec<u8>, String, Value) {
    let prov = templates.provenance();
    let v = payload::build(pkg, src, a, &payload::Provenance { templates: &prov });
    // the bytes and their hash on one thread, the view on the other
    let ((bytes, hash), view) = rayon::join(
        || {
            let bytes = crate::seal::canonical(&v);
            let hash = crate::seal::sha256_hex(&bytes);
            (bytes, hash)
        },
        || payload::view(&v),
    );
    (bytes, hash, view)
}

/// Renders the package.
pub fn render(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> Result<Rendered> {
    typeset_sealed(pkg, src, seal(pkg, src, a, templates), templates, &|_| {})
}

/// Renders the package as [`render`] does, telling `progress` what it is doing
/// ("typesetting members: 8 of 60"); the analysis is let go before the typesetting.
pub fn render_reporting(
    pkg: &Package,
    src: &Source,
    a: Analysis,
    templates: &Templates,
    progress: &(dyn Fn(String) + Sync),
) -> Result<Rendered> {
    let sealed = seal(pkg, src, &a, templates);
    // the payload holds all of it now; the sheets are typeset from the view
    drop(a);
    typeset_sealed(pkg, src, sealed, templates, progress)
}

/// Typesets a sealed package: its payload, hash and view (see [`seal`]).
fn typeset_sealed(
    pkg: &Package,
    src: &Source,
    (payload, hash, view): (Vec<u8>, String, Value),
    templates: &Templates,
    progress: &(dyn Fn(String) + Sync),
) -> Result<Rendered> {
    // one copy of the payload serves the run that attaches it
    let payload = Bytes::new(payload);
    let (pdf, pages) = typeset(pkg, src, &payload, view, &hash, templates, progress)?;
    Ok(Rendered { pdf, payload: payload.to_vec(), hash, pages })
}

/// The package is typeset in several Typst runs, each in a world of its own (so the
/// locations of their elements differ), and the sheets are joined into one document:
/// 1. the members, [`MEMBERS_PER_RUN`] or more at a time (`members.typ`), two runs at
///    once; where each anchor (metadata labelled `toc:...`) and each subject mark
///    (labelled `subject`) falls is noted, and the sheets keep only the introspection
///    tags of headings ([`slim`]); they are held packed ([`shelf`]) until the PDF is
///    written;
/// 2. the front and back matter (`package.typ`), told where the members' anchors are,
///    for the contents and the summary; it is split at the sheet of the anchor
///    `toc:summary`;
/// 3. the subjects and numbers of the sheets (`stamps.typ`, given every subject mark in
///    sheet order): one page per sheet, laid over the sheet of the same number; the
///    members' sheets are unpacked meanwhile.
///
/// Typst's caches are emptied between runs, and give their memory back (the patched
/// comemo, vendor/comemo), so the peak memory is that of two runs plus the packed
/// sheets, or of the unpacked sheets and the PDF being written. The sheets are the same
/// as those of one run of the whole package, but that the summary always begins a sheet.
fn typeset(
    pkg: &Package,
    src: &Source,
    payload: &Bytes,
    view: Value,
    hash: &str,
    templates: &Templates,
    progress: &(dyn Fn(String) + Sync),
) -> Result<(Vec<u8>, usize)> {
    use rayon::prelude::*;
    let d = pkg.meta.date;
    let date = Datetime::from_ymd(d.year as i32, d.month, d.day)
        .ok_or_else(|| Error::Render(format!("the date {d} cannot be used")))?;
    let Value::Object(mut head) = view else {
        return Err(Error::Render("the package data is not an object".into()));
    };
    let members = match head.remove("members") {
        Some(Value::Array(ms)) => ms,
        _ => Vec::new(),
    };
    // what the front matter reads of the members; then each member as JSON text, so the
    // trees (ten times the size of their text) are gone before typesetting
    let entries: Vec<Value> = members.iter().map(contents_entry).collect();
    let members: Vec<Vec<u8>> = members.into_par_iter().map(|m| crate::seal::canonical(&m)).collect();
    let mut lean = head.clone();
    lean.remove("summary");
    let lean = crate::seal::canonical(&Value::Object(lean));

    let seal_json = Bytes::new(format!("{{\"hash\":\"{hash}\"}}").into_bytes());
    let run = |dir: &str, main: &str, view: Vec<u8>, extra: &[(&str, Bytes)]| -> Result<PagedDocument> {
        let mut files: BTreeMap<String, Bytes> =
            templates.files.iter().map(|(k, v)| (k.clone(), Bytes::new(v.clone()))).collect();
        files.insert("/view.json".into(), Bytes::new(view));
        files.insert("/seal.json".into(), seal_json.clone());
        for (name, bytes) in extra {
            files.insert(format!("/{name}"), bytes.clone());
        }
        let world = world::SheetWorld::new(dir, main, files, Some(date))
            .ok_or_else(|| Error::Render("bad template path".into()))?;
        compile(&world)
    };

    // 1. the members, a few per run, two runs at a time
    let mut member_pages: Vec<shelf::Packed> = Vec::new();
    let mut anchors = Map::new();
    // subject marks: sheet (of the members' sheets) and place
    let mut member_marks: Vec<(usize, f64, String)> = Vec::new();
    let per_run = MEMBERS_PER_RUN.max(members.len().div_ceil(MAX_RUNS));
    let runs: Vec<(usize, &[Vec<u8>])> = members.chunks(per_run).enumerate().collect();
    let member_run = |&(k, chunk): &(usize, &[Vec<u8>])| {
        let view = with_members(&lean, k * per_run, chunk);
        run(&format!("m{k}"), MEMBERS, view, &[])
    };
    let mut done = 0;
    for batch in runs.chunks(PARALLEL_RUNS) {
        progress(format!("typesetting members: {done} of {} done", members.len()));
        done += batch.iter().map(|(_, chunk)| chunk.len()).sum::<usize>();
        let docs: Vec<Result<PagedDocument>> = batch.par_iter().map(member_run).collect();
        // the caches hold every intermediate layout of the runs and the next runs need
        // none of it; they are emptied between batches, when no run is going on, while
        // the sheets are read and packed
        let (_, read) = rayon::join(
            || comemo::evict(0),
            || -> Result<()> {
                for doc in docs {
                    let doc = doc?;
                    let marks = marks_of(&doc);
                    let before = member_pages.len();
                    for (key, page, at) in marks.anchors {
                        anchors.insert(key, json!({"page": before + page, "x": at.x.to_pt(), "y": at.y.to_pt()}));
                    }
                    member_marks.extend(marks.subjects.into_iter().map(|(page, y, s)| (before + page, y, s)));
                    member_pages.par_extend(doc.pages().par_iter().cloned().map(|mut p| {
                        slim(&mut p.frame);
                        shelf::pack(p)
                    }));
                }
                Ok(())
            },
        );
        read?;
    }
    drop(members);
    // the caches' tables kept their size for the next batch; none comes
    phase_done();

    // 2. the front and back matter
    progress("typesetting the cover, contents, design basis, summary and appendix".into());
    let mut v = head;
    v.insert("members".into(), Value::Array(entries));
    v.insert("sheets".into(), json!({"members": member_pages.len(), "anchors": anchors}));
    let attached = [("payload.json", payload.clone()), ("input.toml", Bytes::new(src.text.as_bytes().to_vec()))];
    // at the root: the attachments are named by their paths
    let outer = run("", MAIN, crate::seal::canonical(&Value::Object(v)), &attached)?;
    phase_done();
    let outer_marks = marks_of(&outer);
    let back_from =
        outer_marks.anchors.iter().find(|(key, _, _)| key == "toc:summary").map(|(_, page, _)| page - 1).ok_or_else(
            || Error::Render("package.typ placed no anchor \"toc:summary\" (where the back matter begins)".into()),
        )?;
    let total = outer.pages().len() + member_pages.len();

    // 3. the subjects and numbers of the sheets, from the marks in sheet order
    let shift = member_pages.len();
    let front_marks = outer_marks.subjects.iter().filter(|m| m.0 <= back_from).cloned();
    let member_marks = member_marks.into_iter().map(|(page, y, s)| (back_from + page, y, s));
    let back_marks =
        outer_marks.subjects.iter().filter(|m| m.0 > back_from).map(|(page, y, s)| (page + shift, *y, s.clone()));
    let marks: Vec<Value> = front_marks
        .chain(member_marks)
        .chain(back_marks)
        .map(|(page, y, value)| json!({"page": page, "y": y, "value": value}))
        .collect();
    let mut v = Map::new();
    v.insert("stamp".into(), json!({"total": total, "marks": marks}));
    let view = with_entries(&lean, v);
    progress(format!("numbering {total} sheets"));
    // the members' sheets are unpacked meanwhile: the stamps are one run, on one thread
    let (stamps, members) = rayon::join(
        || run("s", STAMPS, view, &[]),
        || member_pages.into_par_iter().map(shelf::unpack).collect::<Vec<Option<Page>>>(),
    );
    let stamps = stamps?;
    phase_done();
    if stamps.pages().len() != total {
        return Err(Error::Render(format!(
            "stamps.typ made {} pages for a package of {total} sheets; it must make one per sheet",
            stamps.pages().len()
        )));
    }

    // the sheets in order, each with its subject and number laid over it
    let front = outer.pages()[..back_from].iter().cloned();
    let back = outer.pages()[back_from..].iter().cloned();
    let members = members
        .into_iter()
        .map(|p| p.ok_or_else(|| Error::Render("a member's sheet, kept packed, did not read back".into())));
    let mut pages = EcoVec::with_capacity(total);
    for (page, stamp) in front.map(Ok).chain(members).chain(back.map(Ok)).zip(stamps.pages()) {
        let mut page = page?;
        page.frame.push_frame(Point::zero(), stamp.frame.clone());
        pages.push(page);
    }
    let doc = PagedDocument::new(pages, outer.info().clone());
    drop(outer);
    drop(stamps);

    progress(format!("writing the PDF of {total} sheets"));
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
        let msgs: Vec<String> = errors.iter().map(|d| d.message.to_string()).collect();
        Error::Render(msgs.join("; "))
    })?;
    let sheets = doc.pages().len();
    // freeing every run of glyphs of the sheets takes a while (44 ms for 60 members);
    // the PDF need not wait for it
    rayon::spawn(move || drop(doc));
    Ok((pdf, sheets))
}

/// Ends a phase of the typesetting (the members, the front and back matter, the stamps):
/// Typst's caches are emptied and give back the memory of their tables (the patched
/// comemo, vendor/comemo), and that memory goes back to the system ([`give_back`]).
/// Between batches of member runs `comemo::evict(0)` alone empties the caches.
fn phase_done() {
    comemo::evict_and_release();
    give_back();
}

/// Hands the memory the last runs freed back to the system now, on every thread, rather
/// than when the allocator next gets round to it (the binary's allocator is mimalloc).
/// Called when a phase ends (the members, the front and back matter, the stamps), not
/// between batches of member runs: the next batch would only fault the same memory in
/// again (60 members: 0.15 s more system time, the same peak). Under another allocator
/// (tests, benches) this only tidies mimalloc's empty heaps.
fn give_back() {
    // SAFETY: mi_collect takes a flag, touches only the allocator's own free lists and
    // is safe to call on any thread at any time.
    rayon::broadcast(|_| unsafe { libmimalloc_sys::mi_collect(true) });
    // SAFETY: as above, for the calling thread.
    unsafe { libmimalloc_sys::mi_collect(true) };
}

/// The package's lean view (a JSON object) with the given entries added.
fn with_entries(lean: &[u8], extra: Map<String, Value>) -> Vec<u8> {
    if extra.is_empty() {
        return lean.to_vec();
    }
    let mut out = crate::seal::canonical(&Value::Object(extra));
    out.pop();
    close_with(out, lean)
}

/// Ends the JSON object begun in `out` (its opening brace and some members written)
/// with the members of the object `lean`.
fn close_with(mut out: Vec<u8>, lean: &[u8]) -> Vec<u8> {
    match lean {
        [b'{', b'}'] | [] => out.push(b'}'),
        _ => {
            out.push(b',');
            out.extend_from_slice(&lean[1..]);
        }
    }
    out
}

/// The view of a run of members: the package's lean view (a JSON object) with the
/// members' JSON texts and the position of the first.
fn with_members(lean: &[u8], first: usize, members: &[Vec<u8>]) -> Vec<u8> {
    let mut out = format!("{{\"first\":{first},\"members\":[").into_bytes();
    for (i, m) in members.iter().enumerate() {
        if i > 0 {
            out.push(b',');
        }
        out.extend_from_slice(m);
    }
    out.push(b']');
    close_with(out, lean)
}

/// One Typst run: its warnings are errors.
fn compile(world: &world::SheetWorld) -> Result<PagedDocument> {
    let Warned { output, warnings } = typst::compile::<PagedDocument>(world);
    let doc = output.map_err(|errors| {
        let msgs: Vec<String> = errors.iter().map(|d| world.describe(d)).collect();
        Error::Render(msgs.join("; "))
    })?;
    if !warnings.is_empty() {
        let msgs: Vec<String> = warnings.iter().map(|d| world.describe(d)).collect();
        return Err(Error::Render(format!("the templates produced warnings (treated as errors): {}", msgs.join("; "))));
    }
    Ok(doc)
}

/// What the program reads of a run: its anchors and its subject marks.
struct Marks {
    /// Key, sheet (from 1) and place on the sheet.
    anchors: Vec<(String, usize, Point)>,
    /// Sheet, height on it in points, and the subject, in order.
    subjects: Vec<(usize, f64, String)>,
}

/// The anchors (metadata labelled `toc:...`) and the subject marks (metadata labelled
/// `subject`) of a run.
fn marks_of(doc: &PagedDocument) -> Marks {
    let intro = doc.introspector();
    let mut out = Marks { anchors: Vec::new(), subjects: Vec::new() };
    for c in intro.query(&MetadataElem::ELEM.select()) {
        let (Some(label), Some(loc)) = (c.label(), c.location()) else { continue };
        let Some(pos) = intro.position(loc) else { continue };
        let key = label.resolve();
        if key.as_str() == "subject" {
            let text = match c.to_packed::<MetadataElem>().map(|m| &m.value) {
                Some(typst::foundations::Value::Str(s)) => s.to_string(),
                Some(typst::foundations::Value::Content(c)) => c.plain_text().to_string(),
                Some(other) => typst::foundations::Repr::repr(other).to_string(),
                None => continue,
            };
            out.subjects.push((pos.page.get(), pos.point.y.to_pt(), text));
        } else if key.starts_with("toc:") {
            out.anchors.push((key.as_str().to_string(), pos.page.get(), pos.point));
        }
    }
    out
}

/// What the front and back matter read of a member: its names, for the contents.
fn contents_entry(m: &Value) -> Value {
    let locations: Vec<Value> = m
        .get("locations")
        .and_then(Value::as_array)
        .map(|ls| {
            ls.iter()
                .map(|l| {
                    let shown = l.get("shown");
                    json!({
                        "name": l.get("name"),
                        "shown": {
                            "x_label": shown.and_then(|s| s.get("x_label")),
                            "mu": shown.and_then(|s| s.get("mu")),
                        },
                    })
                })
                .collect()
        })
        .unwrap_or_default();
    json!({"id": m.get("id"), "description": m.get("description"), "locations": locations})
}

/// Makes a finished sheet smaller to hold until the PDF is written:
/// - it drops the introspection tags, but those of headings (the PDF's bookmarks are made
///   from them): the others served the layout of their run, and they hold their elements;
/// - it joins runs of text set one after the other on one baseline in the same font, size
///   and colour into one run (an equation is set a glyph or a number at a time, and each
///   run costs an item and an allocation).
///
/// The glyphs stay where they were: the last glyph of a run advances to the start of the
/// next. Frames with nothing to change are left as they are (and shared).
fn slim(frame: &mut typst::layout::Frame) {
    use typst::introspection::{Location, Tag};
    use typst::layout::{Frame, FrameItem};
    use typst::model::HeadingElem;
    fn headings_in(frame: &Frame, out: &mut Vec<Location>) {
        for (_, it) in frame.items() {
            match it {
                FrameItem::Tag(Tag::Start(c, _)) if c.is::<HeadingElem>() => out.extend(c.location()),
                FrameItem::Group(g) => headings_in(&g.frame, out),
                _ => {}
            }
        }
    }
    fn dropped(it: &FrameItem, headings: &[Location]) -> bool {
        match it {
            FrameItem::Tag(Tag::Start(c, _)) => !c.is::<HeadingElem>(),
            FrameItem::Tag(Tag::End(loc, _, _)) => !headings.contains(loc),
            _ => false,
        }
    }
    /// The frame rebuilt, or `None` when nothing in it changes.
    fn rebuilt(frame: &Frame, headings: &[Location]) -> Option<Frame> {
        let groups: Vec<Option<Frame>> = frame
            .items()
            .map(|(_, it)| match it {
                FrameItem::Group(g) => rebuilt(&g.frame, headings),
                _ => None,
            })
            .collect();
        // the items that stay, and whether any two in a row are runs to join
        let kept = || frame.items().filter(|(_, it)| !dropped(it, headings));
        let work = groups.iter().any(Option::is_some)
            || kept().count() < frame.items().len()
            || kept().zip(kept().skip(1)).any(|((pa, a), (pb, b))| match (a, b) {
                (FrameItem::Text(a), FrameItem::Text(b)) => joins(*pa, a, *pb, b),
                _ => false,
            });
        if !work {
            return None;
        }
        let mut items: Vec<(Point, FrameItem)> = Vec::with_capacity(frame.items().len());
        for ((p, it), group) in frame.items().zip(groups) {
            if dropped(it, headings) {
                continue;
            }
            match (it, group) {
                (FrameItem::Group(g), Some(inner)) => {
                    let mut g = g.clone();
                    g.frame = inner;
                    items.push((*p, FrameItem::Group(g)));
                }
                (FrameItem::Text(t), _) => {
                    if let Some((q, FrameItem::Text(prev))) = items.last_mut()
                        && joins(*q, prev, *p, t)
                    {
                        join(*q, prev, *p, t);
                    } else {
                        items.push((*p, it.clone()));
                    }
                }
                _ => items.push((*p, it.clone())),
            }
        }
        // the joined runs grew their glyphs by doubling
        for (_, it) in &mut items {
            if let FrameItem::Text(t) = it
                && t.glyphs.capacity() > t.glyphs.len()
            {
                t.glyphs.shrink_to_fit();
            }
        }
        let mut out = frame.clone();
        out.clear();
        out.push_multiple(items);
        Some(out)
    }
    let mut headings = Vec::new();
    headings_in(frame, &mut headings);
    if let Some(f) = rebuilt(frame, &headings) {
        *frame = f;
    }
}

/// Whether the text run `b` at `pb` can be joined to the run `a` at `pa`: the same
/// baseline, font, size, colour, stroke and language, `b` starting at or after the end
/// of `a`, no vertical advances, and the joined text within the u16 glyph ranges.
fn joins(pa: Point, a: &typst::text::TextItem, pb: Point, b: &typst::text::TextItem) -> bool {
    pa.y == pb.y
        && a.font == b.font
        && a.size == b.size
        && a.fill == b.fill
        && a.stroke == b.stroke
        && a.lang == b.lang
        && a.region == b.region
        && !a.glyphs.is_empty()
        && !b.glyphs.is_empty()
        && pb.x >= pa.x + a.width()
        && a.text.len() + b.text.len() <= usize::from(u16::MAX)
        && a.glyphs.iter().chain(&b.glyphs).all(|g| g.y_advance.get() == 0.0)
}

/// Joins the run `b` at `pb` to the run `a` at `pa` (see [`joins`]): the last glyph of `a`
/// advances to where `b` starts.
fn join(pa: Point, a: &mut typst::text::TextItem, pb: Point, b: &typst::text::TextItem) {
    let gap = pb.x - (pa.x + a.width());
    let shift = a.text.len() as u16;
    if let Some(last) = a.glyphs.last_mut() {
        last.x_advance += typst::layout::Em::from_abs(gap, a.size);
    }
    a.text.push_str(&b.text);
    a.glyphs.extend(b.glyphs.iter().map(|g| {
        let mut g = g.clone();
        g.range = g.range.start + shift..g.range.end + shift;
        g
    }));
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn views_are_spliced_into_valid_json() {
        let lean = crate::seal::canonical(&json!({"package": {"title": "T"}, "units": {"length": "in"}}));
        let empty = crate::seal::canonical(&json!({}));
        let members = vec![crate::seal::canonical(&json!({"id": "A"})), crate::seal::canonical(&json!({"id": "B"}))];
        for base in [&lean, &empty] {
            let v: Value = serde_json::from_slice(&with_members(base, 6, &members)).unwrap();
            assert_eq!(v["first"], 6);
            assert_eq!(v["members"][1]["id"], "B");
            assert_eq!(v.as_object().unwrap().len(), if base.len() > 2 { 4 } else { 2 });
            let none: Value = serde_json::from_slice(&with_members(base, 0, &[])).unwrap();
            assert_eq!(none["members"], json!([]));
            let mut extra = Map::new();
            extra.insert("stamp".into(), json!({"total": 3}));
            let v: Value = serde_json::from_slice(&with_entries(base, extra)).unwrap();
            assert_eq!(v["stamp"]["total"], 3);
            let v: Value = serde_json::from_slice(&with_entries(base, Map::new())).unwrap();
            assert_eq!(v, serde_json::from_slice::<Value>(base).unwrap());
        }
        let v: Value = serde_json::from_slice(&with_members(&lean, 0, &members)).unwrap();
        assert_eq!(v["package"]["title"], "T");
    }

    /// Every glyph of a page: its id, the text it stands for, and where it is drawn
    /// (the sum of the run's advances before it, through every group's transform).
    fn glyphs_of(frame: &typst::layout::Frame) -> Vec<(u16, String, f64, f64)> {
        use typst::layout::{FrameItem, Transform};
        fn walk(frame: &typst::layout::Frame, ts: Transform, out: &mut Vec<(u16, String, f64, f64)>) {
            for (p, it) in frame.items() {
                let here = ts.pre_concat(Transform::translate(p.x, p.y));
                match it {
                    FrameItem::Group(g) => walk(&g.frame, here.pre_concat(g.transform), out),
                    FrameItem::Text(t) => {
                        let mut x = typst::layout::Abs::zero();
                        for g in &t.glyphs {
                            let at = Point::new(x + g.x_offset.at(t.size), -g.y_offset.at(t.size)).transform(here);
                            out.push((g.id, t.text[g.range()].to_string(), at.x.to_pt(), at.y.to_pt()));
                            x += g.x_advance.at(t.size);
                        }
                    }
                    _ => {}
                }
            }
        }
        let mut out = Vec::new();
        walk(frame, Transform::identity(), &mut out);
        out
    }

    fn texts_in(frame: &typst::layout::Frame) -> usize {
        use typst::layout::FrameItem;
        frame
            .items()
            .map(|(_, it)| match it {
                FrameItem::Text(_) => 1,
                FrameItem::Group(g) => texts_in(&g.frame),
                _ => 0,
            })
            .sum()
    }

    #[test]
    fn slim_sheets_draw_every_glyph_where_it_was() {
        // an equation is set a glyph or a number at a time; a heading keeps its tags
        let source = "= Flexure\n\
            Prestress $f_(s e) = 160 \"ksi\"$, so $P_e = A_(p s) f_(s e) = 1.224 dot 160 = 195.8 \"kip\"$.\n\n\
            #box(rotate(90deg)[$c = 0.529 \"in\" + x^2$]) #text(fill: red)[$a = beta_1 c$] and text.\n";
        let mut files = BTreeMap::new();
        files.insert("/main.typ".to_string(), Bytes::new(source.as_bytes().to_vec()));
        let world = world::SheetWorld::new("", "/main.typ", files, None).unwrap();
        let doc = compile(&world).unwrap();
        let before = &doc.pages()[0].frame;
        let mut after = before.clone();
        slim(&mut after);
        let (a, b) = (glyphs_of(before), glyphs_of(&after));
        assert_eq!(a.len(), b.len());
        for (g, h) in a.iter().zip(&b) {
            assert_eq!((g.0, &g.1), (h.0, &h.1));
            assert!((g.2 - h.2).abs() < 1e-9 && (g.3 - h.3).abs() < 1e-9, "{g:?} moved to {h:?}");
        }
        assert!(texts_in(&after) < texts_in(before), "{} runs before, {} after", texts_in(before), texts_in(&after));
        // the heading's tags stay (the bookmarks are made from them), the others go
        assert_eq!(tags_in(before).0, 1);
        assert!(tags_in(before).1 > 0);
        assert_eq!(tags_in(&after), (1, 0));
    }

    /// The heading start tags and the other start tags in a frame.
    fn tags_in(frame: &typst::layout::Frame) -> (usize, usize) {
        use typst::introspection::Tag;
        use typst::layout::FrameItem;
        frame.items().fold((0, 0), |(h, o), (_, it)| match it {
            FrameItem::Tag(Tag::Start(c, _)) if c.is::<typst::model::HeadingElem>() => (h + 1, o),
            FrameItem::Tag(Tag::Start(..)) => (h, o + 1),
            FrameItem::Group(g) => {
                let (gh, go) = tags_in(&g.frame);
                (h + gh, o + go)
            }
            _ => (h, o),
        })
    }
}
