//! The members' finished sheets, held in few bytes until the PDF is written.
//!
//! A sheet's frame is a tree of items of 192 bytes each, and every glyph of its text
//! takes 56 bytes more. Held that way, the 420 member sheets of a 60-member package took
//! about 95 MB while the front and back matter were typeset. [`pack`] writes a
//! frame's tree and its text as bytes (a glyph in about 14) and keeps its other items
//! (shapes, images, links, tags) and its groups as they are; [`unpack`] builds
//! the same frame again, bit for bit: every number is written whole (its 64 bits), every
//! font, colour, stroke and language is the value it was.

use typst::layout::{Abs, Em, Frame, FrameItem, FrameKind, GroupItem, Point, Size};
use typst::syntax::Span;
use typst::text::{FontInstance, Glyph, Lang, Region, TextItem};
use typst::visualize::{FixedStroke, Paint};
use typst_layout::Page;

/// A packed sheet (see [`pack`]).
pub(super) struct Packed {
    /// The page, its frame emptied.
    page: Page,
    /// The frame's tree and its text.
    bytes: Vec<u8>,
    /// The items other than text and groups, in the order of the tree.
    items: Vec<FrameItem>,
    /// The groups, each with its frame emptied, in the order of the tree.
    groups: Vec<GroupItem>,
    /// The fonts, colours, strokes and languages of its text, written as their places
    /// in these lists.
    tables: Tables,
}

/// The distinct fonts, colours, strokes and languages of a sheet's text.
#[derive(Default)]
struct Tables {
    fonts: Vec<FontInstance>,
    paints: Vec<Paint>,
    strokes: Vec<FixedStroke>,
    langs: Vec<(Lang, Option<Region>)>,
}

// what an item of a frame is, in the bytes
const TEXT: u8 = 0;
const GROUP: u8 = 1;
const OTHER: u8 = 2;

// a glyph's flags: which of its numbers are written
const X_OFFSET: u8 = 1;
const Y_ADVANCE: u8 = 2;
const Y_OFFSET: u8 = 4;
/// The glyph's range starts where the last one's ended.
const FOLLOWS: u8 = 8;
/// The glyph's span is the last one's.
const SAME_SPAN: u8 = 16;

/// Packs a finished sheet.
pub(super) fn pack(mut page: Page) -> Packed {
    let frame = std::mem::replace(&mut page.frame, Frame::soft(Size::zero()));
    let mut packed =
        Packed { page, bytes: Vec::new(), items: Vec::new(), groups: Vec::new(), tables: Tables::default() };
    let mut tables = Tables::default();
    tables.put_frame(&frame, &mut packed);
    packed.tables = tables;
    packed.bytes.shrink_to_fit();
    packed.items.shrink_to_fit();
    packed.groups.shrink_to_fit();
    packed
}

/// The sheet as it was packed; `None` if the bytes do not read (which would be a fault
/// of this module).
pub(super) fn unpack(packed: Packed) -> Option<Page> {
    let Packed { mut page, bytes, items, groups, tables } = packed;
    let mut r = Reader { bytes: &bytes, at: 0 };
    let mut items = items.into_iter();
    let mut groups = groups.into_iter();
    let frame = tables.get_frame(&mut r, &mut items, &mut groups)?;
    if r.at != bytes.len() || items.next().is_some() || groups.next().is_some() {
        return None;
    }
    page.frame = frame;
    Some(page)
}

impl Tables {
    fn put_frame(&mut self, frame: &Frame, out: &mut Packed) {
        let b = &mut out.bytes;
        put_f(b, frame.width().to_raw());
        put_f(b, frame.height().to_raw());
        if frame.has_baseline() {
            b.push(1);
            put_f(b, frame.baseline().to_raw());
        } else {
            b.push(0);
        }
        b.push(match frame.kind() {
            FrameKind::Soft => 0,
            FrameKind::Hard => 1,
        });
        put_u(b, frame.items().len() as u64);
        for (p, item) in frame.items() {
            put_f(&mut out.bytes, p.x.to_raw());
            put_f(&mut out.bytes, p.y.to_raw());
            match item {
                FrameItem::Text(t) => {
                    out.bytes.push(TEXT);
                    self.put_text(t, &mut out.bytes);
                }
                FrameItem::Group(g) => {
                    out.bytes.push(GROUP);
                    let mut kept = g.clone();
                    kept.frame = Frame::soft(Size::zero());
                    out.groups.push(kept);
                    self.put_frame(&g.frame, out);
                }
                other => {
                    out.bytes.push(OTHER);
                    out.items.push(other.clone());
                }
            }
        }
    }

    fn get_frame(
        &self,
        r: &mut Reader,
        items: &mut impl Iterator<Item = FrameItem>,
        groups: &mut impl Iterator<Item = GroupItem>,
    ) -> Option<Frame> {
        let size = Size::new(Abs::raw(r.f()?), Abs::raw(r.f()?));
        let baseline = match r.byte()? {
            0 => None,
            1 => Some(Abs::raw(r.f()?)),
            _ => return None,
        };
        let kind = match r.byte()? {
            0 => FrameKind::Soft,
            1 => FrameKind::Hard,
            _ => return None,
        };
        let n = usize::try_from(r.u()?).ok()?;
        // no more items than bytes left (each takes at least 17)
        let mut list = Vec::with_capacity(n.min(r.left() / 17));
        for _ in 0..n {
            let p = Point::new(Abs::raw(r.f()?), Abs::raw(r.f()?));
            let item = match r.byte()? {
                TEXT => FrameItem::Text(self.get_text(r)?),
                GROUP => {
                    let mut g = groups.next()?;
                    g.frame = self.get_frame(r, items, groups)?;
                    FrameItem::Group(g)
                }
                OTHER => items.next()?,
                _ => return None,
            };
            list.push((p, item));
        }
        let mut frame = Frame::new(size, kind);
        if let Some(b) = baseline {
            frame.set_baseline(b);
        }
        frame.push_multiple(list);
        Some(frame)
    }

    fn put_text(&mut self, t: &TextItem, b: &mut Vec<u8>) {
        put_u(b, place(&mut self.fonts, &t.font));
        put_f(b, t.size.to_raw());
        put_u(b, place(&mut self.paints, &t.fill));
        match &t.stroke {
            None => put_u(b, 0),
            Some(s) => put_u(b, place(&mut self.strokes, s) + 1),
        }
        put_u(b, place(&mut self.langs, &(t.lang, t.region)));
        put_u(b, t.text.len() as u64);
        b.extend_from_slice(t.text.as_bytes());
        put_u(b, t.glyphs.len() as u64);
        let (mut end, mut span) = (0u16, 0u64);
        for g in &t.glyphs {
            let raw_span = g.span.0.into_raw().get();
            let mut flags = 0;
            for (bit, v) in [(X_OFFSET, g.x_offset), (Y_ADVANCE, g.y_advance), (Y_OFFSET, g.y_offset)] {
                if v.get().to_bits() != 0 {
                    flags |= bit;
                }
            }
            if g.range.start == end {
                flags |= FOLLOWS;
            }
            if raw_span == span {
                flags |= SAME_SPAN;
            }
            b.push(flags);
            b.extend_from_slice(&g.id.to_le_bytes());
            put_f(b, g.x_advance.get());
            for (bit, v) in [(X_OFFSET, g.x_offset), (Y_ADVANCE, g.y_advance), (Y_OFFSET, g.y_offset)] {
                if flags & bit != 0 {
                    put_f(b, v.get());
                }
            }
            if flags & FOLLOWS == 0 {
                put_u(b, g.range.start.into());
            }
            put_u(b, g.range.end.wrapping_sub(g.range.start).into());
            if flags & SAME_SPAN == 0 {
                b.extend_from_slice(&raw_span.to_le_bytes());
            }
            put_u(b, g.span.1.into());
            (end, span) = (g.range.end, raw_span);
        }
    }

    fn get_text(&self, r: &mut Reader) -> Option<TextItem> {
        let font = self.fonts.get(r.index()?)?.clone();
        let size = Abs::raw(r.f()?);
        let fill = self.paints.get(r.index()?)?.clone();
        let stroke = match r.index()? {
            0 => None,
            k => Some(self.strokes.get(k - 1)?.clone()),
        };
        let (lang, region) = *self.langs.get(r.index()?)?;
        let len = r.index()?;
        let text = std::str::from_utf8(r.take(len)?).ok()?.into();
        let n = r.index()?;
        // no more glyphs than bytes left (each takes at least 13)
        let mut glyphs = Vec::with_capacity(n.min(r.left() / 13));
        let (mut end, mut span) = (0u16, 0u64);
        for _ in 0..n {
            let flags = r.byte()?;
            let id = u16::from_le_bytes(r.take(2)?.try_into().ok()?);
            let x_advance = Em::new(r.f()?);
            let mut extra = [Em::zero(); 3];
            for (k, bit) in [X_OFFSET, Y_ADVANCE, Y_OFFSET].into_iter().enumerate() {
                if flags & bit != 0 {
                    extra[k] = Em::new(r.f()?);
                }
            }
            let start = if flags & FOLLOWS != 0 { end } else { u16::try_from(r.u()?).ok()? };
            let range_end = start.wrapping_add(u16::try_from(r.u()?).ok()?);
            if flags & SAME_SPAN == 0 {
                span = u64::from_le_bytes(r.take(8)?.try_into().ok()?);
            }
            let offset = u16::try_from(r.u()?).ok()?;
            glyphs.push(Glyph {
                id,
                x_advance,
                x_offset: extra[0],
                y_advance: extra[1],
                y_offset: extra[2],
                range: start..range_end,
                span: (Span::from_raw(std::num::NonZeroU64::new(span)?), offset),
            });
            end = range_end;
        }
        Some(TextItem { font, size, fill, stroke, lang, region, text, glyphs })
    }
}

/// The place of `v` in `list`, added at the end if it is not there.
fn place<T: PartialEq + Clone>(list: &mut Vec<T>, v: &T) -> u64 {
    let k = list.iter().rposition(|x| x == v).unwrap_or_else(|| {
        list.push(v.clone());
        list.len() - 1
    });
    k as u64
}

/// A number in seven-bit groups, the lowest first (LEB128).
fn put_u(b: &mut Vec<u8>, mut v: u64) {
    while v >= 0x80 {
        b.push((v as u8) | 0x80);
        v >>= 7;
    }
    b.push(v as u8);
}

/// A float as its 64 bits.
fn put_f(b: &mut Vec<u8>, v: f64) {
    b.extend_from_slice(&v.to_bits().to_le_bytes());
}

/// Reads what `put_u` and `put_f` wrote.
struct Reader<'a> {
    bytes: &'a [u8],
    at: usize,
}

impl Reader<'_> {
    fn left(&self) -> usize {
        self.bytes.len() - self.at
    }

    fn take(&mut self, n: usize) -> Option<&[u8]> {
        let s = self.bytes.get(self.at..self.at.checked_add(n)?)?;
        self.at += n;
        Some(s)
    }

    fn byte(&mut self) -> Option<u8> {
        Some(self.take(1)?[0])
    }

    fn f(&mut self) -> Option<f64> {
        Some(f64::from_bits(u64::from_le_bytes(self.take(8)?.try_into().ok()?)))
    }

    fn u(&mut self) -> Option<u64> {
        let mut v = 0u64;
        for shift in (0..64).step_by(7) {
            let b = self.byte()?;
            v |= u64::from(b & 0x7f).checked_shl(shift)?;
            if b & 0x80 == 0 {
                return Some(v);
            }
        }
        None
    }

    fn index(&mut self) -> Option<usize> {
        usize::try_from(self.u()?).ok()
    }
}

#[cfg(test)]
mod tests {
    use super::super::{compile, slim, world};
    use super::*;
    use std::collections::BTreeMap;
    use typst::foundations::Bytes;

    /// Pages that use what the templates use and more: fonts, sizes, colours, a
    /// gradient and a stroke on text, ligatures, languages, equations (offset glyphs),
    /// rotated, scaled and clipped groups, shapes, a tiling, links, headings and raw text.
    fn pages() -> Vec<Page> {
        let source = r##"
#set page(width: 12cm, height: auto, margin: 1cm, fill: rgb("#fffef0"))
= Flexure <top>
Office affine ffi fl #"q\u{307}x\u{323}\u{302}" -- "quotes" --- and a number 1,224.5 in a line long enough to wrap
onto a second line of the paragraph, hyphenated where it must be.
#text(lang: "de", region: "ch")[Grüße aus der Schweiz] #text(size: 14pt, stroke: 0.3pt + blue)[Stroked]
#text(fill: gradient.linear(red, blue))[Graded text]
$ f_(p s) = f_(p u) (1 - gamma_p / beta_1 (rho_p f_(p u) / (f'_c))) quad sum_(i=1)^n x_i^2 $
#box(clip: true, width: 2cm, height: 0.5cm, radius: 2pt, stroke: 0.5pt)[#lorem(12)]
#box(rotate(30deg)[turned]) #box(scale(x: -100%)[mirror]) #box(move(dy: 3pt)[low])
#link("https://example.org")[a link] and #link(<top>)[back to the top]
#rect(fill: tiling(size: (4pt, 4pt), square(size: 2pt, fill: gray)), width: 1cm, height: 1cm)
#curve(fill: blue.lighten(60%), stroke: (paint: red, thickness: 1pt, dash: "dashed"),
  curve.move((0pt, 0pt)), curve.line((20pt, 10pt)), curve.cubic((30pt, 0pt), (40pt, 20pt), (50pt, 0pt)), curve.close())
#raw("let x = 1; // mono", lang: "rust", block: true)
#table(columns: 3, [a], [b], [c], table.cell(colspan: 2)[wide], [x])
#pagebreak()
== A second page
#text(font: "DejaVu Sans Mono")[0123 mono] #h(1fr) $x^2 + y_1$
"##;
        let mut files = BTreeMap::new();
        files.insert("/main.typ".to_string(), Bytes::new(source.as_bytes().to_vec()));
        let world = world::SheetWorld::new("", "/main.typ", files, None).unwrap();
        compile(&world).unwrap().pages().to_vec()
    }

    fn hash(page: &Page) -> u128 {
        typst::utils::hash128(page)
    }

    #[test]
    fn sheets_unpack_as_they_were_packed() {
        let mut pages = pages();
        assert_eq!(pages.len(), 2);
        // and a run of text as the layout does not make it, to try every flag: advances
        // up, offsets of minus zero, ranges out of order, a span of each glyph's own
        let mut odd = pages[1].clone();
        let text = first_text(&pages[0].frame).expect("a run of text");
        let mut t = text.clone();
        for (k, g) in t.glyphs.iter_mut().enumerate() {
            g.y_advance = Em::new(0.125 * k as f64);
            g.y_offset = Em::new(if k % 2 == 0 { -0.0 } else { 0.3 });
            g.x_offset = Em::new(if k % 3 == 0 { -0.0 } else { f64::MIN_POSITIVE });
            g.range = (k as u16 * 7) % 5..(k as u16 * 7) % 5 + 2;
            g.span = (Span::from_raw(std::num::NonZeroU64::new(u64::MAX - k as u64).unwrap()), u16::MAX - k as u16);
        }
        odd.frame.push(Point::new(Abs::pt(-1.5), Abs::pt(f64::MAX)), FrameItem::Text(t));
        pages.push(odd);
        // the pages hold what the packing treats apart
        let mut seen = Seen::default();
        seen.walk(&pages[0].frame);
        let all = [seen.offset, seen.ligature, seen.stroke, seen.link, seen.tag, seen.clip, seen.turned];
        assert_eq!(all, [true; 7], "offset, ligature, stroke, link, tag, clip, turned");
        for page in pages {
            let mut slimmed = page.clone();
            slim(&mut slimmed.frame);
            for p in [page, slimmed] {
                let packed = pack(p.clone());
                let back = unpack(packed).expect("the packed sheet reads back");
                assert_eq!(hash(&back), hash(&p));
                assert_eq!(format!("{:?}", back.frame), format!("{:?}", p.frame));
            }
        }
    }

    fn first_text(f: &Frame) -> Option<&TextItem> {
        f.items().find_map(|(_, it)| match it {
            FrameItem::Text(t) if t.glyphs.len() > 4 => Some(t),
            FrameItem::Group(g) => first_text(&g.frame),
            _ => None,
        })
    }

    #[derive(Default)]
    struct Seen {
        offset: bool,
        ligature: bool,
        stroke: bool,
        link: bool,
        tag: bool,
        clip: bool,
        turned: bool,
    }

    impl Seen {
        fn walk(&mut self, f: &Frame) {
            for (_, it) in f.items() {
                match it {
                    FrameItem::Text(t) => {
                        self.stroke |= t.stroke.is_some();
                        for g in &t.glyphs {
                            self.offset |= g.y_offset.get() != 0.0 || g.x_offset.get() != 0.0;
                            self.ligature |= g.range.len() > 1;
                        }
                    }
                    FrameItem::Group(g) => {
                        self.clip |= g.clip.is_some();
                        self.turned |= !g.transform.is_identity();
                        self.walk(&g.frame);
                    }
                    FrameItem::Link(..) => self.link = true,
                    FrameItem::Tag(_) => self.tag = true,
                    _ => {}
                }
            }
        }
    }

    #[test]
    fn packing_takes_less_than_half() {
        // the glyphs and items a frame holds, against the bytes and kept items of its pack
        fn held(f: &Frame) -> usize {
            f.items()
                .map(|(_, it)| {
                    std::mem::size_of::<(Point, FrameItem)>()
                        + match it {
                            FrameItem::Text(t) => t.glyphs.len() * std::mem::size_of::<Glyph>(),
                            FrameItem::Group(g) => held(&g.frame),
                            _ => 0,
                        }
                })
                .sum()
        }
        let page = pages().swap_remove(0);
        let before = held(&page.frame);
        let p = pack(page);
        let after = p.bytes.len()
            + p.items.len() * std::mem::size_of::<FrameItem>()
            + p.groups.len() * std::mem::size_of::<GroupItem>();
        assert!(after * 2 < before, "{after} bytes packed against {before} held");
    }

    #[test]
    fn damaged_packs_do_not_read() {
        let page = pages().swap_remove(0);
        let whole = pack(page.clone());
        let n = whole.bytes.len();
        for cut in (0..n).step_by(5) {
            let mut p = pack(page.clone());
            p.bytes.truncate(cut);
            assert!(unpack(p).is_none(), "cut at {cut} of {n}");
        }
        // a byte more, an item or a group too many or too few
        let mut p = pack(page.clone());
        p.bytes.push(0);
        assert!(unpack(p).is_none());
        let mut p = pack(page.clone());
        p.items.pop();
        assert!(unpack(p).is_none());
        let mut p = pack(page.clone());
        let g = p.groups[0].clone();
        p.groups.push(g);
        assert!(unpack(p).is_none());
        let mut p = pack(page);
        p.tables.fonts.clear();
        assert!(unpack(p).is_none());
    }
}
