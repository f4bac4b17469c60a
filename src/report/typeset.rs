//! Typesetting: the package's sheets made in several Typst runs, each in a world of its
//! own (so the locations of their elements differ), and joined into one PDF/A-3b
//! document:
//!
//! 1. the members, a few at a time (`members.typ`), two runs at once; where each
//!    anchor and each subject mark falls is noted ([`super::sheet_marks`]);
//! 2. the front and back matter (`package.typ`), told where the members' anchors are,
//!    for the contents and the summary; it is split at the sheet of the anchor
//!    `toc:summary`;
//! 3. the subjects and numbers of the sheets (`sheet-numbers.typ`, given every subject
//!    mark in sheet order): one page per sheet, laid over the sheet of the same number.
//!
//! The sheets are the same as those of one run of the whole package, but that the
//! summary always begins a sheet. Between the runs the caller's [`Hooks::pause`] is
//! told, when no run is going on, so that it may empty Typst's caches.

use super::sheet_marks::{MemberMarks, front_sheets, in_sheet_order, marks_of};
use super::templates::{MAIN, MEMBERS, NUMBERS, Templates};
use super::view::{NumbersView, PackageView, SheetNumbers};
use super::{Hooks, Pause, Prepared, Rendered, world};
use crate::error::{Error, Result};
use crate::input::{Package, Source};
use serde::Serialize;
use std::collections::BTreeMap;
use typst::diag::Warned;
use typst::ecow::EcoVec;
use typst::foundations::{Bytes, Datetime, Smart};
use typst::introspection::{Location, Tag};
use typst::layout::{Frame, FrameItem, Point};
use typst::model::{Document, HeadingElem};
use typst_layout::{Page, PagedDocument};
use typst_pdf::{PdfOptions, PdfStandard, PdfStandards, Timestamp};

/// Members typeset in one Typst run. Typst's memory grows with the sheets of a run
/// (about 1.7 MB a sheet); a few members at a time keep the peak low whatever the length
/// of the package, at little cost in time.
const MEMBERS_PER_RUN: usize = 6;
/// Runs of members typeset at the same time.
const PARALLEL_RUNS: usize = 2;
/// At most this many runs of members (longer packages put more members in a run). Each
/// run serves its files under a folder of its own, and Typst keeps a file id for every
/// path it reads for the life of the process, at most 65,535: 200 runs of at most 200
/// template files each stay well inside.
const MAX_RUNS: usize = 200;

/// How many members a run of a package of `members` members typesets.
pub fn members_per_run(members: usize) -> usize {
    MEMBERS_PER_RUN.max(members.div_ceil(MAX_RUNS))
}

/// The worlds of a package's runs: the templates, its content hash and its date.
struct Runs {
    files: BTreeMap<String, Bytes>,
    date: Datetime,
}

impl Runs {
    /// One Typst run of the entry `main` reading `view`, its files served under `dir`.
    fn run(&self, dir: &str, main: &str, view: Vec<u8>, extra: &[(&str, Bytes)]) -> Result<PagedDocument> {
        let mut files = self.files.clone();
        files.insert("/view.json".into(), Bytes::new(view));
        for (name, bytes) in extra {
            files.insert(format!("/{name}"), bytes.clone());
        }
        let world = world::SheetWorld::new(dir, main, files, Some(self.date))
            .ok_or_else(|| Error::Render("bad template path".into()))?;
        compile(&world)
    }
}

/// Typesets a prepared package (see [`super::prepare`]).
pub fn package(pkg: &Package, src: &Source, job: Prepared, templates: &Templates, hooks: &Hooks) -> Result<Rendered> {
    let d = pkg.meta.date;
    let date = Datetime::from_ymd(d.year as i32, d.month, d.day)
        .ok_or_else(|| Error::Render(format!("the date {d} cannot be used")))?;
    let mut files: BTreeMap<String, Bytes> =
        templates.files.iter().map(|(k, v)| (k.clone(), Bytes::new(v.clone()))).collect();
    let hash_json = serde_json::json!({ "hash": job.hash });
    files.insert("/content-hash.json".into(), Bytes::new(hash_json.to_string().into_bytes()));
    let runs = Runs { files, date };

    // 1. the members, a few per run, two runs at a time
    let (member_pages, member_marks) = member_runs(&runs, job.runs, job.members, hooks)?;
    (hooks.pause)(Pause::Phase);

    // 2. the front and back matter; the attachments are named by their paths, so this
    // run is served at the root
    (hooks.progress)("typesetting the cover, contents, design basis, summary and appendix".into());
    let f = &job.front;
    let view = PackageView {
        head: &f.head,
        summary: &f.summary,
        stress_summary: &f.stress_summary,
        open_items: &f.open_items,
        open_kinds: &f.open_kinds,
        conditional_locations: f.conditional_locations,
        members: &f.contents,
        sheets: &member_marks.sheets,
    };
    let payload = Bytes::new(job.payload);
    let attached = [("payload.json", payload.clone()), ("input.toml", Bytes::new(src.text.as_bytes().to_vec()))];
    let outer = runs.run("", MAIN, json(&view)?, &attached)?;
    (hooks.pause)(Pause::Phase);

    // 3. the subjects and numbers of the sheets, from the marks in sheet order
    let outer_marks = marks_of(&outer);
    let front = front_sheets(&outer_marks)?;
    let total = outer.pages().len() + member_pages.len();
    (hooks.progress)(format!("numbering {total} sheets"));
    let sheet_numbers = SheetNumbers { total, marks: in_sheet_order(outer_marks, front, member_marks) };
    let numbers = runs.run("s", NUMBERS, json(&NumbersView { head: &f.head, sheet_numbers })?, &[])?;
    (hooks.pause)(Pause::Phase);
    if numbers.pages().len() != total {
        return Err(Error::Render(format!(
            "sheet-numbers.typ made {} pages for a package of {total} sheets; it must make one per sheet",
            numbers.pages().len()
        )));
    }

    let doc = join(&outer, front, member_pages, &numbers);
    drop((outer, numbers));
    (hooks.progress)(format!("writing the PDF of {total} sheets"));
    let pdf = export(&doc, &job.hash, date)?;
    Ok(Rendered { pdf, payload: payload.to_vec(), hash: job.hash, pages: total })
}

/// A view as the JSON text a run reads.
fn json(view: &impl Serialize) -> Result<Vec<u8>> {
    serde_json::to_vec(view).map_err(|e| Error::Render(format!("the view cannot be written ({e})")))
}

/// Typesets the runs of members (each the view of its members), [`PARALLEL_RUNS`] at a
/// time; returns their sheets in order and their marks.
fn member_runs(runs: &Runs, views: Vec<Vec<u8>>, members: usize, hooks: &Hooks) -> Result<(Vec<Page>, MemberMarks)> {
    use rayon::prelude::*;
    let per_run = members_per_run(members);
    let mut pages = Vec::new();
    let mut marks = MemberMarks::default();
    let mut views: Vec<(usize, Vec<u8>)> = views.into_iter().enumerate().collect();
    let mut done = 0;
    while !views.is_empty() {
        let batch: Vec<(usize, Vec<u8>)> = views.drain(..PARALLEL_RUNS.min(views.len())).collect();
        (hooks.progress)(format!("typesetting members: {done} of {members} done"));
        done = (done + batch.len() * per_run).min(members);
        let docs: Vec<Result<PagedDocument>> =
            batch.into_par_iter().map(|(k, view)| runs.run(&format!("m{k}"), MEMBERS, view, &[])).collect();
        // no run is going on: the caches hold every intermediate layout of the runs, and
        // the next runs need none of it
        (hooks.pause)(Pause::Batch);
        for doc in docs {
            let doc = doc?;
            marks.add(&doc);
            pages.par_extend(doc.pages().par_iter().cloned().map(|mut p| {
                without_tags(&mut p.frame);
                p
            }));
        }
    }
    Ok((pages, marks))
}

/// Makes a finished sheet lighter to hold until the PDF is written: its introspection
/// tags are dropped, but those of headings (the PDF's bookmarks are made from them). The
/// others served the layout of their run, and each holds its element's content, which
/// nothing needs again. Frames with no tag to drop are left as they are (and shared).
fn without_tags(frame: &mut Frame) {
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
            FrameItem::Tag(Tag::End(loc, ..)) => !headings.contains(loc),
            _ => false,
        }
    }
    /// The frame without its tags, or `None` when it holds none to drop.
    fn rebuilt(frame: &Frame, headings: &[Location]) -> Option<Frame> {
        let groups: Vec<Option<Frame>> = frame
            .items()
            .map(|(_, it)| match it {
                FrameItem::Group(g) => rebuilt(&g.frame, headings),
                _ => None,
            })
            .collect();
        if groups.iter().all(Option::is_none) && !frame.items().any(|(_, it)| dropped(it, headings)) {
            return None;
        }
        let items: Vec<(Point, FrameItem)> = frame
            .items()
            .zip(groups)
            .filter(|((_, it), _)| !dropped(it, headings))
            .map(|((p, it), inner)| match (it, inner) {
                (FrameItem::Group(g), Some(inner)) => {
                    let mut g = g.clone();
                    g.frame = inner;
                    (*p, FrameItem::Group(g))
                }
                _ => (*p, it.clone()),
            })
            .collect();
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

/// The sheets in order, each with its subject and number laid over it: the front
/// matter, the members, the back matter.
fn join(outer: &PagedDocument, front: usize, members: Vec<Page>, numbers: &PagedDocument) -> PagedDocument {
    let (before, after) = outer.pages().split_at(front);
    let sheets = before.iter().cloned().chain(members).chain(after.iter().cloned());
    let mut pages = EcoVec::with_capacity(outer.pages().len() + numbers.pages().len());
    for (mut page, number) in sheets.zip(numbers.pages()) {
        page.frame.push_frame(Point::zero(), number.frame.clone());
        pages.push(page);
    }
    PagedDocument::new(pages, outer.info().clone())
}

/// The document as PDF/A-3b, identified by its content hash and dated by its input.
fn export(doc: &PagedDocument, hash: &str, date: Datetime) -> Result<Vec<u8>> {
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
    typst_pdf::pdf(doc, &options).map_err(|errors| {
        let msgs: Vec<String> = errors.iter().map(|d| d.message.to_string()).collect();
        Error::Render(msgs.join("; "))
    })
}

/// One Typst run: its warnings are errors.
pub fn compile(world: &world::SheetWorld) -> Result<PagedDocument> {
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
