//! The calculation package: the payload rendered through the templates with Typst,
//! embedded as a library, to a PDF/A-3b file with the input and the payload attached.
//!
//! Two phases, each a function: [`prepare`] builds the payload, its content hash and the
//! view of every run of members (after it the analysis may be let go), and [`typeset`]
//! runs Typst and writes the PDF. [`render`] is the two in one.
//!
//! - [`payload`]: the typed payload (what is hashed and attached);
//! - [`view`]: what each entry template reads;
//! - [`templates`]: the built-in templates or a folder of one's own;
//! - [`world`]: the Typst world of one run (templates, fonts and data files only);
//! - `typeset` and `sheet_marks`: the runs, their anchors and subject marks, the joined
//!   sheets and the PDF.

pub mod payload;
mod sheet_marks;
pub mod templates;
mod typeset;
pub mod view;
pub mod world;

pub use templates::Templates;

use crate::analysis::Analysis;
use crate::error::{Error, Result};
use crate::input::{Package, Source};
use payload::{Head, OpenItem, OpenKind, Provenance, SummaryRow};
use view::{ContentsEntry, MembersView};

/// A rendered package.
pub struct Rendered {
    pub pdf: Vec<u8>,
    /// The canonical payload bytes (attached as payload.json).
    pub payload: Vec<u8>,
    /// SHA-256 of the payload: the content hash.
    pub hash: String,
    pub pages: usize,
}

/// Where the typesetting stops for its caller, when no Typst run is going on.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Pause {
    /// After a batch of member runs; more follow.
    Batch,
    /// After a phase: the members, the front and back matter, the sheet numbers.
    Phase,
}

/// What the caller is told while a package is typeset. The library keeps no policy on
/// memory of its own: Typst's caches and the allocator are the program's (`main.rs`
/// empties the caches at each pause).
#[derive(Clone, Copy)]
pub struct Hooks<'a> {
    /// What is being done ("typesetting members: 8 of 60 done").
    pub progress: &'a (dyn Fn(String) + Sync),
    /// Called at each [`Pause`].
    pub pause: &'a (dyn Fn(Pause) + Sync),
}

impl Default for Hooks<'_> {
    /// Nothing said, nothing done at the pauses.
    fn default() -> Self {
        fn quiet(_: String) {}
        fn carry_on(_: Pause) {}
        Hooks { progress: &quiet, pause: &carry_on }
    }
}

/// A package ready to typeset: its payload, content hash and views.
pub struct Prepared {
    /// The canonical payload bytes.
    payload: Vec<u8>,
    /// The content hash.
    hash: String,
    /// How many members.
    members: usize,
    /// The view of each run of members, in order.
    runs: Vec<Vec<u8>>,
    front: FrontMatter,
}

/// What the front and back matter read, besides where the members' sheets fell.
struct FrontMatter {
    head: Head,
    summary: Vec<SummaryRow>,
    stress_summary: Vec<payload::StressSummaryRow>,
    open_items: Vec<OpenItem>,
    open_kinds: Vec<OpenKind>,
    conditional_locations: usize,
    contents: Vec<ContentsEntry>,
}

/// Builds the payload, its content hash and the views of the runs of members; nothing
/// of the analysis is needed after it.
pub fn prepare(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> Result<Prepared> {
    use rayon::prelude::*;
    let p = payload::build(pkg, src, a, &Provenance { templates: &templates.provenance() });
    let per_run = typeset::members_per_run(p.members.len());
    // the bytes and their hash on one thread, the views of the runs on the other
    let (bytes, runs) = rayon::join(
        || p.canonical(),
        || -> Result<Vec<Vec<u8>>> {
            let run = |(k, members)| MembersView { head: &p.head, first: k * per_run, members: view::members(members) };
            p.members.par_chunks(per_run).enumerate().map(|r| write_view(&run(r))).collect()
        },
    );
    let (bytes, runs) = (bytes?, runs?);
    let front = FrontMatter {
        conditional_locations: view::conditional_locations(&p.summary),
        contents: view::contents(&p.members),
        head: p.head,
        summary: p.summary,
        stress_summary: p.stress_summary,
        open_items: p.open_items,
        open_kinds: p.open_kinds,
    };
    let hash = crate::integrity::sha256_hex(&bytes);
    Ok(Prepared { payload: bytes, hash, members: p.members.len(), runs, front })
}

fn write_view(view: &MembersView) -> Result<Vec<u8>> {
    serde_json::to_vec(view).map_err(|e| Error::Render(format!("the view cannot be written ({e})")))
}

/// Typesets a prepared package, telling `hooks` what it does.
pub fn typeset(pkg: &Package, src: &Source, job: Prepared, templates: &Templates, hooks: &Hooks) -> Result<Rendered> {
    typeset::package(pkg, src, job, templates, hooks)
}

/// Renders the package: [`prepare`], then [`typeset`], with nothing done at the pauses.
pub fn render(pkg: &Package, src: &Source, a: &Analysis, templates: &Templates) -> Result<Rendered> {
    render_with(pkg, src, a, templates, &Hooks::default())
}

/// Renders the package, telling `hooks` what it does.
pub fn render_with(
    pkg: &Package,
    src: &Source,
    a: &Analysis,
    templates: &Templates,
    hooks: &Hooks,
) -> Result<Rendered> {
    typeset(pkg, src, prepare(pkg, src, a, templates)?, templates, hooks)
}
