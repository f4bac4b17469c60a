//! Sheet marks: what the program reads of a finished run (where each anchor and each
//! subject mark fell) and puts together across the runs: the members' anchors, for the
//! contents and the summary, and every subject mark of the package in sheet order, for
//! the sheet numbers.
//!
//! An anchor is a metadata element labelled `toc:...`; a subject mark is a metadata
//! element labelled `subject` holding the subject of the sheets that follow.

use super::view::{Anchor, MemberSheets, SubjectMark};
use crate::error::{Error, Result};
use typst::foundations::{NativeElement, Repr, Value};
use typst::introspection::{Introspector, MetadataElem};
use typst_layout::PagedDocument;

/// The marks of one run.
pub struct Marks {
    /// Key, sheet (from 1) and place on the sheet.
    anchors: Vec<(String, Anchor)>,
    /// In order.
    subjects: Vec<SubjectMark>,
}

/// The anchors and the subject marks of a run.
pub fn marks_of(doc: &PagedDocument) -> Marks {
    let intro = doc.introspector();
    let mut out = Marks { anchors: Vec::new(), subjects: Vec::new() };
    for c in intro.query(&MetadataElem::ELEM.select()) {
        let (Some(label), Some(loc)) = (c.label(), c.location()) else { continue };
        let Some(pos) = intro.position(loc) else { continue };
        let key = label.resolve();
        if key.as_str() == "subject" {
            let value = match c.to_packed::<MetadataElem>().map(|m| &m.value) {
                Some(Value::Str(s)) => s.to_string(),
                Some(Value::Content(c)) => c.plain_text().to_string(),
                Some(other) => other.repr().to_string(),
                None => continue,
            };
            out.subjects.push(SubjectMark { page: pos.page.get(), y: pos.point.y.to_pt(), value });
        } else if key.starts_with("toc:") {
            let at = Anchor { page: pos.page.get(), x: pos.point.x.to_pt(), y: pos.point.y.to_pt() };
            out.anchors.push((key.as_str().to_string(), at));
        }
    }
    out
}

/// The marks of the members' sheets, gathered run by run.
#[derive(Default)]
pub struct MemberMarks {
    /// How many member sheets, and where their anchors fell.
    pub sheets: MemberSheets,
    /// Their subject marks, sheets counted from the first member sheet.
    subjects: Vec<SubjectMark>,
}

impl MemberMarks {
    /// Adds a run of members, whose sheets follow those already gathered.
    pub fn add(&mut self, doc: &PagedDocument) {
        let before = self.sheets.members;
        let marks = marks_of(doc);
        for (key, at) in marks.anchors {
            self.sheets.anchors.insert(key, Anchor { page: before + at.page, ..at });
        }
        self.subjects.extend(marks.subjects.into_iter().map(|m| SubjectMark { page: before + m.page, ..m }));
        self.sheets.members += doc.pages().len();
    }
}

/// How many sheets of the front and back matter come before the members': those before
/// the sheet of the anchor `toc:summary`, where the back matter begins.
pub fn front_sheets(outer: &Marks) -> Result<usize> {
    outer.anchors.iter().find(|(key, _)| key == "toc:summary").map(|(_, at)| at.page - 1).ok_or_else(|| {
        Error::Render("package.typ placed no anchor \"toc:summary\" (where the back matter begins)".into())
    })
}

/// Every subject mark of the package in sheet order: the front matter's, the members'
/// after it, then the back matter's after the members.
pub fn in_sheet_order(outer: Marks, front: usize, members: MemberMarks) -> Vec<SubjectMark> {
    let shift = members.sheets.members;
    let (front_marks, back_marks): (Vec<SubjectMark>, Vec<SubjectMark>) =
        outer.subjects.into_iter().partition(|m| m.page <= front);
    let member_marks = members.subjects.into_iter().map(|m| SubjectMark { page: front + m.page, ..m });
    let back_marks = back_marks.into_iter().map(|m| SubjectMark { page: m.page + shift, ..m });
    front_marks.into_iter().chain(member_marks).chain(back_marks).collect()
}
