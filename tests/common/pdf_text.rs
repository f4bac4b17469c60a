//! The text of a PDF's pages, read in Rust with lopdf (no outside program): every glyph
//! placed where the page draws it (the text and graphics matrices, the font's widths),
//! decoded by its font's ToUnicode map, and set out in lines from the top of the page
//! down, each line from left to right, as `pdftotext -layout` read them: glyphs whose
//! baselines lie within a fraction of their size share a line (an exponent joins its
//! base), and a gap wider than a tenth of the font size between neighbouring glyphs is
//! a space. Text drawn at an angle (the DRAFT watermark, a rotated label) follows, one
//! run a line, spaced the same way along its direction. Each page ends with a form feed.
//!
//! It panics on what it cannot read (a font without a ToUnicode map, a content stream
//! that does not decode), so a test never compares against text that was not read.

use lopdf::content::Content;
use lopdf::{Dictionary, Document, Encoding, Object, ObjectId};
use std::collections::BTreeMap;

/// The text of a PDF (or of one page, numbered from 1).
pub fn pdf_text(pdf: &[u8], page: Option<usize>) -> String {
    let doc = Document::load_mem(pdf).expect("a readable PDF");
    let pages = doc.get_pages();
    let wanted: Vec<ObjectId> = match page {
        Some(p) => vec![*pages.get(&(p as u32)).unwrap_or_else(|| panic!("no page {p} of {}", pages.len()))],
        None => pages.values().copied().collect(),
    };
    let mut out = String::new();
    for id in wanted {
        out.push_str(&page_text(&doc, id));
        out.push('\x0c');
    }
    out
}

/// A row-vector affine matrix [a b c d e f], as PDF writes them.
#[derive(Clone, Copy, Debug)]
struct M([f64; 6]);

impl M {
    const ID: M = M([1.0, 0.0, 0.0, 1.0, 0.0, 0.0]);
    /// `self` applied first, then `n`.
    fn then(self, n: M) -> M {
        let [a, b, c, d, e, f] = self.0;
        let [na, nb, nc, nd, ne, nf] = n.0;
        M([
            a * na + b * nc,
            a * nb + b * nd,
            c * na + d * nc,
            c * nb + d * nd,
            e * na + f * nc + ne,
            e * nb + f * nd + nf,
        ])
    }
    fn translate(x: f64, y: f64) -> M {
        M([1.0, 0.0, 0.0, 1.0, x, y])
    }
}

struct Font<'a> {
    two_byte: bool,
    widths: BTreeMap<u32, f64>,
    default_width: f64,
    /// glyph space to text space (1/1000, or a Type 3 font's matrix)
    scale: f64,
    encoding: Encoding<'a>,
}

#[derive(Clone)]
struct TextState {
    ctm: M,
    char_spacing: f64,
    word_spacing: f64,
    h_scale: f64,
    leading: f64,
    rise: f64,
    font: Option<Vec<u8>>,
    size: f64,
}

struct Glyph {
    /// origin on the page, in points, y up
    x: f64,
    y: f64,
    /// the device advance along the run's direction
    adv: f64,
    /// the size of the type on the page
    size: f64,
    text: String,
    /// drawn upright, left to right
    upright: bool,
    /// the text-showing operation it came from
    run: usize,
}

fn num(o: &Object) -> f64 {
    match o {
        Object::Integer(i) => *i as f64,
        Object::Real(r) => *r as f64,
        other => panic!("a number was expected, found {other:?}"),
    }
}

fn deref<'a>(doc: &'a Document, o: &'a Object) -> &'a Object {
    doc.dereference(o).expect("a reference that resolves").1
}

fn font<'a>(doc: &'a Document, dict: &'a Dictionary) -> Font<'a> {
    let subtype = dict.get(b"Subtype").and_then(Object::as_name).expect("a font subtype");
    let encoding = dict.get_font_encoding(doc).expect("a font encoding");
    assert!(
        dict.get(b"ToUnicode").is_ok() || subtype != b"Type0",
        "a composite font without a ToUnicode map: its text cannot be read"
    );
    let mut widths = BTreeMap::new();
    if subtype == b"Type0" {
        let enc = dict.get(b"Encoding").and_then(Object::as_name).expect("a Type0 font's encoding");
        assert!(enc == b"Identity-H" || enc == b"Identity-V", "an unsupported CMap {}", String::from_utf8_lossy(enc));
        let desc = deref(doc, dict.get(b"DescendantFonts").expect("descendant fonts"));
        let desc = deref(doc, &desc.as_array().expect("an array")[0]).as_dict().expect("a CID font");
        let default_width = desc.get(b"DW").map(num).unwrap_or(1000.0);
        if let Ok(w) = desc.get(b"W") {
            let w = deref(doc, w).as_array().expect("a W array");
            let mut i = 0;
            while i < w.len() {
                let first = num(&w[i]) as u32;
                match deref(doc, &w[i + 1]) {
                    Object::Array(list) => {
                        for (k, v) in list.iter().enumerate() {
                            widths.insert(first + k as u32, num(v));
                        }
                        i += 2;
                    }
                    last => {
                        let last = num(last) as u32;
                        let v = num(&w[i + 2]);
                        for c in first..=last {
                            widths.insert(c, v);
                        }
                        i += 3;
                    }
                }
            }
        }
        return Font { two_byte: true, widths, default_width, scale: 0.001, encoding };
    }
    let first = dict.get(b"FirstChar").map(num).unwrap_or(0.0) as u32;
    if let Ok(w) = dict.get(b"Widths") {
        for (k, v) in deref(doc, w).as_array().expect("a Widths array").iter().enumerate() {
            widths.insert(first + k as u32, num(deref(doc, v)));
        }
    }
    let scale = match dict.get(b"FontMatrix") {
        Ok(m) => num(&deref(doc, m).as_array().expect("a font matrix")[0]),
        Err(_) => 0.001,
    };
    Font { two_byte: false, widths, default_width: 0.0, scale, encoding }
}

/// The entry `name` of the `kind` dictionary (Font, XObject) of the nearest resources
/// that hold it.
fn resource<'a>(doc: &'a Document, resources: &[&'a Dictionary], kind: &[u8], name: &[u8]) -> Option<&'a Object> {
    resources.iter().find_map(|r| {
        let d = deref(doc, r.get(kind).ok()?).as_dict().ok()?;
        d.get(name).ok().map(|o| deref(doc, o))
    })
}

struct Reader<'a> {
    doc: &'a Document,
    glyphs: Vec<Glyph>,
    runs: usize,
}

impl<'a> Reader<'a> {
    fn content(&mut self, data: &[u8], resources: &[&'a Dictionary], ctm: M, depth: usize) {
        assert!(depth < 16, "forms nested too deep");
        let mut fonts: BTreeMap<Vec<u8>, Font> = BTreeMap::new();
        let content = Content::decode(data).expect("a content stream that decodes");
        let mut st = TextState {
            ctm,
            char_spacing: 0.0,
            word_spacing: 0.0,
            h_scale: 1.0,
            leading: 0.0,
            rise: 0.0,
            font: None,
            size: 0.0,
        };
        let mut stack = Vec::new();
        let (mut tm, mut tlm) = (M::ID, M::ID);
        for op in &content.operations {
            let o = &op.operands;
            match op.operator.as_str() {
                "q" => stack.push(st.clone()),
                "Q" => st = stack.pop().unwrap_or_else(|| st.clone()),
                "cm" => st.ctm = M(std::array::from_fn(|i| num(&o[i]))).then(st.ctm),
                "BT" => (tm, tlm) = (M::ID, M::ID),
                "Tf" => {
                    st.font = Some(o[0].as_name().expect("a font name").to_vec());
                    st.size = num(&o[1]);
                }
                "Tc" => st.char_spacing = num(&o[0]),
                "Tw" => st.word_spacing = num(&o[0]),
                "Tz" => st.h_scale = num(&o[0]) / 100.0,
                "TL" => st.leading = num(&o[0]),
                "Ts" => st.rise = num(&o[0]),
                "Td" => {
                    tlm = M::translate(num(&o[0]), num(&o[1])).then(tlm);
                    tm = tlm;
                }
                "TD" => {
                    st.leading = -num(&o[1]);
                    tlm = M::translate(num(&o[0]), num(&o[1])).then(tlm);
                    tm = tlm;
                }
                "Tm" => {
                    tlm = M(std::array::from_fn(|i| num(&o[i])));
                    tm = tlm;
                }
                "T*" => {
                    tlm = M::translate(0.0, -st.leading).then(tlm);
                    tm = tlm;
                }
                "Tj" | "TJ" | "'" | "\"" => {
                    if op.operator == "'" || op.operator == "\"" {
                        if op.operator == "\"" {
                            st.word_spacing = num(&o[0]);
                            st.char_spacing = num(&o[1]);
                        }
                        tlm = M::translate(0.0, -st.leading).then(tlm);
                        tm = tlm;
                    }
                    let name = st.font.clone().expect("text shown before a font is set");
                    let f = fonts.entry(name).or_insert_with_key(|name| {
                        let dict = resource(self.doc, resources, b"Font", name)
                            .and_then(|f| f.as_dict().ok())
                            .unwrap_or_else(|| panic!("no font {} in the resources", String::from_utf8_lossy(name)));
                        font(self.doc, dict)
                    });
                    self.runs += 1;
                    let items: Vec<&Object> = match (op.operator.as_str(), o.last()) {
                        ("TJ", Some(Object::Array(a))) => a.iter().collect(),
                        (_, Some(s)) => vec![s],
                        _ => panic!("a text operator without operands"),
                    };
                    for item in items {
                        match item {
                            Object::String(bytes, _) => self.show(bytes, f, &st, &mut tm),
                            n => {
                                let tx = -num(n) / 1000.0 * st.size * st.h_scale;
                                tm = M::translate(tx, 0.0).then(tm);
                            }
                        }
                    }
                }
                "Do" => {
                    let name = o[0].as_name().expect("an XObject name");
                    let Some(Ok(stream)) = resource(self.doc, resources, b"XObject", name).map(|x| x.as_stream())
                    else {
                        continue;
                    };
                    if stream.dict.get(b"Subtype").and_then(Object::as_name).ok() != Some(b"Form".as_slice()) {
                        continue;
                    }
                    let matrix = match stream.dict.get(b"Matrix") {
                        Ok(m) => M(std::array::from_fn(|i| num(&deref(self.doc, m).as_array().unwrap()[i]))),
                        Err(_) => M::ID,
                    };
                    // a form's own resources first, then those it was drawn with
                    let mut res: Vec<&Dictionary> = Vec::new();
                    res.extend(stream.dict.get(b"Resources").ok().and_then(|r| deref(self.doc, r).as_dict().ok()));
                    res.extend_from_slice(resources);
                    let data = stream.decompressed_content().unwrap_or_else(|_| stream.content.clone());
                    self.content(&data, &res, matrix.then(st.ctm), depth + 1);
                }
                _ => {}
            }
        }
    }

    fn show(&mut self, bytes: &[u8], f: &Font, st: &TextState, tm: &mut M) {
        let step = if f.two_byte { 2 } else { 1 };
        for code_bytes in bytes.chunks(step) {
            let code = code_bytes.iter().fold(0u32, |c, b| c * 256 + *b as u32);
            let w0 = f.widths.get(&code).copied().unwrap_or(f.default_width) * f.scale;
            let trm = M([st.size * st.h_scale, 0.0, 0.0, st.size, 0.0, st.rise]).then(*tm).then(st.ctm);
            let text = f.encoding.bytes_to_string(code_bytes).unwrap_or_default();
            let space = if code_bytes == [32] { st.word_spacing } else { 0.0 };
            let tx = (w0 * st.size + st.char_spacing + space) * st.h_scale;
            let [a, b, c, d, _, _] = trm.0;
            let size = (c * c + d * d).sqrt();
            let glyph_w = w0 * (a * a + b * b).sqrt();
            let eps = 1e-6 * size.max(1.0);
            let upright = b.abs() < eps && c.abs() < eps && a > 0.0 && d > 0.0;
            if !text.is_empty() && !text.contains('\u{fffd}') {
                self.glyphs.push(Glyph { x: trm.0[4], y: trm.0[5], adv: glyph_w, size, text, upright, run: self.runs });
            }
            *tm = M::translate(tx, 0.0).then(*tm);
        }
    }
}

fn page_text(doc: &Document, id: ObjectId) -> String {
    let (inline, ids) = doc.get_page_resources(id).expect("the page's resources");
    let mut resources: Vec<&Dictionary> = inline.into_iter().collect();
    resources.extend(ids.iter().filter_map(|i| doc.get_dictionary(*i).ok()));
    let data = doc.get_page_content(id);
    let mut r = Reader { doc, glyphs: Vec::new(), runs: 0 };
    r.content(&data, &resources, M::ID, 0);
    let (mut upright, angled): (Vec<Glyph>, Vec<Glyph>) = r.glyphs.into_iter().partition(|g| g.upright);

    // lines of upright glyphs, top down: a glyph joins the line above if its baseline is
    // within 0.45 of the larger size from that line's main baseline (its largest glyph's)
    upright.sort_by(|a, b| b.y.total_cmp(&a.y));
    let mut lines: Vec<(f64, f64, Vec<Glyph>)> = Vec::new();
    for g in upright {
        match lines.last_mut() {
            Some((base, size, line)) if (*base - g.y).abs() <= 0.45 * size.max(g.size) => {
                if g.size > *size {
                    (*base, *size) = (g.y, g.size);
                }
                line.push(g);
            }
            _ => lines.push((g.y, g.size, vec![g])),
        }
    }
    let mut out = String::new();
    for (_, _, mut line) in lines {
        line.sort_by(|a, b| a.x.total_cmp(&b.x));
        out.push_str(&spaced(line.iter().map(|g| (g.x, g))));
        out.push('\n');
    }
    // text at an angle: each run a line, in the order drawn, spaced along its direction
    let mut k = 0;
    while k < angled.len() {
        let run: Vec<&Glyph> = angled[k..].iter().take_while(|g| g.run == angled[k].run).collect();
        k += run.len();
        let (x0, y0) = (run[0].x, run[0].y);
        out.push_str(&spaced(run.iter().map(|g| ((g.x - x0).hypot(g.y - y0), *g))));
        out.push('\n');
    }
    out
}

/// Glyphs in reading order, given their position along the line: a space where the gap
/// to the previous glyph's end exceeds a tenth of the larger size.
fn spaced<'g>(glyphs: impl Iterator<Item = (f64, &'g Glyph)>) -> String {
    let mut s = String::new();
    let mut prev: Option<(f64, f64)> = None; // end, size
    for (pos, g) in glyphs {
        if let Some((end, size)) = prev
            && pos - end > 0.1 * size.max(g.size)
            && !s.ends_with(' ')
            && !g.text.starts_with(' ')
        {
            s.push(' ');
        }
        s.push_str(&g.text);
        prev = Some((pos + g.adv, g.size));
    }
    s
}
