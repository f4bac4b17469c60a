//! From the raw schema to a validated [`Package`]: units converted, defaults applied and
//! recorded, every value checked against what is allowed. Problems are collected with
//! their key paths; `super::load` turns the paths into file positions.

mod concrete;
mod loads;
mod losses;
mod member;
mod meta;
mod shape;
mod steel;
mod stresses;

use super::locate::Seg;
use super::model::*;
use super::schema::{self as raw, Q};
use crate::basis::{Basis, BasisId, Clause};
use crate::material::catalog;
use crate::material::concrete::Curve as ConcreteCurve;
use crate::material::strand::{Curve as StrandCurve, Grade, Model};
use crate::section::shapes::{Shape, ShapeError, VOID_SIDES};
use crate::section::{self, P, Region};
use crate::units::{Dim, QuantityError, System};
use concrete::{ConcreteKeys, concrete_of};
use member::member;
use meta::meta;
pub(crate) use shape::SHAPES;
use shape::shape;
use steel::{bar_layer, strand_layer};

/// Limits that keep any input from making the program hang or exhaust memory.
pub mod limits {
    pub const MEMBERS: usize = 10_000;
    pub const LAYERS: usize = 50;
    pub const LOCATIONS: usize = 50;
    pub const VERTICES: usize = 2_000;
    pub const HOLES: usize = 100;
    /// Points of a polygon section, its outline and holes together: the checks that
    /// the rings are simple and apart compare edges pair by pair.
    pub const SECTION_POINTS: usize = 5_000;
    pub const STRANDS_PER_LAYER: i64 = 200;
    pub const BARS_PER_LAYER: i64 = 100;
    pub const TEXT: usize = 2_000;
    pub const SHORT_TEXT: usize = 200;
    pub const CURVE_POINTS: i64 = 2_000;
    pub const CURVE_STRIPS: i64 = 2_000;
}

/// A problem found, by key path.
pub struct Problem {
    pub path: Vec<Seg>,
    pub message: String,
    pub allowed: Option<String>,
}

pub struct Ctx {
    pub sys: System,
    /// The design basis the defaults follow (Ec, fr, Es, the jacking limit).
    pub basis: &'static dyn Basis,
    path: Vec<Seg>,
    pub problems: Vec<Problem>,
    pub warnings: Vec<(Vec<Seg>, String)>,
}

/// The longest run of characters without a space or hyphen that user text may hold.
pub const WORD_MAX: usize = 24;

/// The characters of `t` the bundled fonts cannot draw, each once, as "'c' (U+XXXX)"
/// (the first five).
pub fn undrawable(t: &str) -> String {
    let mut seen: Vec<char> = Vec::new();
    for c in t.chars().filter(|c| !crate::fonts::drawable(*c)) {
        if !seen.contains(&c) {
            seen.push(c);
        }
    }
    let mut out: Vec<String> = seen.iter().take(5).map(|c| format!("'{c}' (U+{:04X})", *c as u32)).collect();
    if seen.len() > 5 {
        out.push(format!("and {} more", seen.len() - 5));
    }
    out.join(", ")
}

/// Ranges in the package's units.
struct Ranges {
    fc: (f64, f64),
    fc_usual: (f64, f64),
    dim_max: f64,
    ec: (f64, f64),
    density: (f64, f64),
    fy: (f64, f64),
    es: (f64, f64),
    length_max: f64,
    /// The largest moment accepted (far beyond any real member: a bound that keeps the
    /// arithmetic finite).
    moment_max: f64,
}

fn ranges(sys: System) -> Ranges {
    match sys {
        System::Us => Ranges {
            fc: (2.5, 15.0),
            fc_usual: (3.0, 12.0),
            dim_max: 600.0,
            ec: (1000.0, 10_000.0),
            density: (90.0, 160.0),
            fy: (40.0, 100.0),
            es: (25_000.0, 32_000.0),
            length_max: 2400.0,
            moment_max: 1.2e7, // kip-in: 1e6 kip-ft
        },
        System::Si => Ranges {
            fc: (17.0, 100.0),
            fc_usual: (21.0, 80.0),
            dim_max: 15_000.0,
            ec: (7000.0, 70_000.0),
            density: (1440.0, 2560.0),
            fy: (280.0, 690.0),
            es: (170_000.0, 220_000.0),
            length_max: 60_000.0,
            moment_max: 1.5e15, // N-mm: 1.5e6 kN-m
        },
    }
}

/// A number for messages: short, in the package's shown unit.
fn num(v: f64) -> String {
    if v.is_nan() {
        return "nan".into();
    }
    if v.is_infinite() {
        return if v > 0.0 { "inf".into() } else { "-inf".into() };
    }
    if v != 0.0 && !(1e-6..1e9).contains(&v.abs()) {
        return format!("{v:e}");
    }
    let s = crate::trace::fixed(v, 6);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

fn written(q: &Q) -> String {
    match q {
        Q::Num(v) => num(*v),
        Q::Text(t) => format!("{t:?}"),
    }
}

impl Ctx {
    /// A context in a unit system, with the design basis that system defaults to until
    /// the package names its own.
    pub fn new(sys: System) -> Ctx {
        Ctx { sys, basis: BasisId::Aci318.get(sys), path: Vec::new(), problems: Vec::new(), warnings: Vec::new() }
    }

    fn unit(&self, dim: Dim) -> &'static str {
        let n = self.sys.names();
        match dim {
            Dim::Length => n.length,
            Dim::Area => n.area,
            Dim::Stress => n.stress,
            Dim::Force => n.force,
            Dim::Moment => n.moment,
            Dim::Density => match self.sys {
                System::Us => "lb/ft3",
                System::Si => "kg/m3",
            },
            Dim::LineLoad => match self.sys {
                System::Us => "klf",
                System::Si => "kN/m",
            },
        }
    }

    /// A coherent value shown in the package's unit, for messages.
    fn shown(&self, dim: Dim, v: f64) -> String {
        format!("{} {}", num(v / self.sys.shown_to_coherent(dim)), self.unit(dim))
    }

    fn at(&self, key: &'static str) -> Vec<Seg> {
        let mut p = self.path.clone();
        p.push(Seg::Key(key));
        p
    }

    pub fn problem(&mut self, key: &'static str, message: impl Into<String>, allowed: impl Into<Option<String>>) {
        let path = if key.is_empty() { self.path.clone() } else { self.at(key) };
        self.problems.push(Problem { path, message: message.into(), allowed: allowed.into() });
    }

    fn warn(&mut self, key: &'static str, message: impl Into<String>) {
        let path = if key.is_empty() { self.path.clone() } else { self.at(key) };
        self.warnings.push((path, message.into()));
    }

    fn enter(&mut self, s: Seg) {
        self.path.push(s);
    }
    fn leave(&mut self) {
        self.path.pop();
    }

    /// Reads a quantity in coherent units; records a problem if it cannot be read.
    fn quantity(&mut self, key: &'static str, q: &Option<Q>, dim: Dim) -> Option<f64> {
        let q = q.as_ref()?;
        let v = match q {
            Q::Num(v) => Ok(self.sys.bare(dim, *v)),
            Q::Text(t) => self.sys.parse(dim, t),
        };
        match v {
            Ok(v) if v.is_finite() => Some(v),
            Ok(_) => {
                self.problem(
                    key,
                    format!("{key} = {} is not a finite number", written(q)),
                    Some(format!("a finite {}", dim.name())),
                );
                None
            }
            Err(QuantityError::NoNumber) => {
                self.problem(
                    key,
                    format!("{key} = {} does not start with a number", written(q)),
                    Some(format!("a number in {}, or a string such as \"12 {}\"", self.unit(dim), self.unit(dim))),
                );
                None
            }
            Err(QuantityError::UnknownUnit(u)) => {
                self.problem(
                    key,
                    format!("{key} = {}: unknown unit {u:?}", written(q)),
                    Some(format!("units of {}: {}", dim.name(), System::accepted(dim))),
                );
                None
            }
            Err(QuantityError::WrongDimension { unit, found }) => {
                self.problem(
                    key,
                    format!("{key} = {}: {unit:?} is {}, but {key} is {}", written(q), found.name(), dim.name()),
                    Some(format!("units of {}: {}", dim.name(), System::accepted(dim))),
                );
                None
            }
        }
    }

    /// A quantity that must lie in [lo, hi] (coherent units); `open_lo` excludes lo.
    fn ranged(&mut self, key: &'static str, q: &Option<Q>, dim: Dim, lo: f64, hi: f64, open_lo: bool) -> Option<f64> {
        let v = self.quantity(key, q, dim)?;
        let ok = if open_lo { v > lo } else { v >= lo } && v <= hi;
        if !ok {
            let lo_op = if open_lo { "<" } else { "<=" };
            self.problem(
                key,
                format!("{key} = {} is out of range", self.shown(dim, v)),
                Some(format!("{} {lo_op} {key} <= {}", self.shown(dim, lo), self.shown(dim, hi))),
            );
            return None;
        }
        Some(v)
    }

    /// A dimension a shape needs: present, and a positive length.
    fn dim(&mut self, shape: &str, key: &'static str, q: &Option<Q>) -> Option<f64> {
        if q.is_none() {
            self.problem(
                key,
                format!("{key} is missing (shape {shape:?} needs it)"),
                Some(format!("the {} of the section", key.replace('_', " "))),
            );
            return None;
        }
        self.dim_len(key, q)
    }

    /// A positive dimension (length).
    fn dim_len(&mut self, key: &'static str, q: &Option<Q>) -> Option<f64> {
        let max = ranges(self.sys).dim_max;
        self.ranged(key, q, Dim::Length, 0.0, max, true)
    }

    /// `v`, or a "missing" problem if it is absent, unless the key was present but
    /// already refused (one message per problem).
    fn required<T>(&mut self, key: &'static str, v: Option<T>, what: &str) -> Option<T> {
        if v.is_some() {
            return v;
        }
        let here = self.at(key);
        if !self.problems.iter().any(|p| p.path == here) {
            self.problem(key, format!("{key} is missing"), Some(what.to_string()));
        }
        v
    }

    fn text(&mut self, key: &'static str, v: &Option<String>, max: usize) -> Option<String> {
        let t = v.as_ref()?;
        if t.chars().count() > max {
            self.problem(
                key,
                format!("{key} is {} characters long", t.chars().count()),
                Some(format!("at most {max} characters")),
            );
            return None;
        }
        if let Some(c) = t.chars().find(|c| c.is_control() && *c != '\n' && *c != '\t') {
            self.problem(
                key,
                format!("{key} holds the control character U+{:04X}", c as u32),
                Some("printable text".to_string()),
            );
            return None;
        }
        if let Some(c) = t.chars().find(|c| crate::fonts::reorders(*c)) {
            self.problem(
                key,
                format!(
                    "{key} holds the bidirectional control character U+{:04X}, which would reorder what the sheet shows",
                    c as u32
                ),
                Some("text without bidirectional controls (U+200E, U+200F, U+202A to U+202E, U+2066 to U+2069)".to_string()),
            );
            return None;
        }
        let missing = undrawable(t);
        if !missing.is_empty() {
            self.problem(
                key,
                format!("{key} holds characters the package's fonts cannot draw: {missing}"),
                Some("Latin, Greek or Cyrillic letters, digits and the usual symbols".to_string()),
            );
            return None;
        }
        // a run without a place to break would run off its cell on the sheet
        if let Some(w) = t.split(|c: char| c.is_whitespace() || c == '-').find(|w| w.chars().count() > WORD_MAX) {
            self.problem(
                key,
                format!("{key} holds a run of {} characters without a space or hyphen", w.chars().count()),
                Some(format!("words of at most {WORD_MAX} characters, so the sheet can wrap the text")),
            );
            return None;
        }
        Some(t.clone())
    }

    fn count(&mut self, key: &'static str, v: Option<i64>, lo: i64, hi: i64) -> Option<u32> {
        let n = v?;
        if n < lo || n > hi {
            self.problem(
                key,
                format!("{key} = {n} is out of range"),
                Some(format!("a whole number from {lo} to {hi}")),
            );
            return None;
        }
        Some(n as u32)
    }

    fn ratio(&mut self, key: &'static str, v: Option<f64>, lo: f64, hi: f64) -> Option<f64> {
        let x = v?;
        if !x.is_finite() || x < lo || x > hi {
            self.problem(
                key,
                format!("{key} = {} is out of range", num(x)),
                Some(format!("{} <= {key} <= {}", num(lo), num(hi))),
            );
            return None;
        }
        Some(x)
    }

    fn date(&mut self, key: &'static str, d: &Option<toml::value::Datetime>) -> Option<Date> {
        let d = d.as_ref()?;
        match (d.date, d.time, d.offset) {
            (Some(date), None, None) => Some(Date { year: date.year, month: date.month, day: date.day }),
            _ => {
                self.problem(
                    key,
                    format!("{key} = {d} is not a plain date"),
                    Some("a date such as 2026-11-30 (no time)".to_string()),
                );
                None
            }
        }
    }
}

/// A member as validated on its own: the member, its problems and warnings.
type Checked = (Option<Member>, Vec<Problem>, Vec<(Vec<Seg>, String)>);

/// Validates a whole file.
pub fn package(cx: &mut Ctx, f: &raw::File) -> Option<Package> {
    match f.format {
        Some(1) => {}
        Some(n) => {
            cx.problem("format", format!("format = {n} is not a format this version reads"), Some("1".to_string()))
        }
        None => cx.problem("format", "format is missing", Some("format = 1 at the top of the file".to_string())),
    }
    let Some(p) = &f.package else {
        cx.problem(
            "package",
            "the [package] table is missing",
            Some("a [package] table with title, project, date, units...".to_string()),
        );
        return None;
    };
    cx.enter(Seg::Key("package"));
    let meta = meta(cx, p);
    cx.leave();
    if f.member.is_empty() {
        cx.problem("member", "the package has no members", Some("at least one [[member]] table".to_string()));
    }
    if f.member.len() > limits::MEMBERS {
        cx.problem(
            "member",
            format!("the package has {} members", f.member.len()),
            Some(format!("at most {}", limits::MEMBERS)),
        );
        return None;
    }
    let mut seen = std::collections::HashMap::new();
    for (i, m) in f.member.iter().enumerate() {
        if let Some(id) = &m.id
            && let Some(first) = seen.insert(id.clone(), i)
        {
            cx.problems.push(Problem {
                path: vec![Seg::Key("member"), Seg::Idx(i), Seg::Key("id")],
                message: format!("id = {id:?} is used twice (also by member [{}])", first + 1),
                allowed: Some("a unique id for every member".to_string()),
            });
        }
    }
    // members are independent: validate them in parallel, each with its own context,
    // and keep the problems in member order
    use rayon::prelude::*;
    let sys = cx.sys;
    let basis = cx.basis;
    let checked: Vec<Checked> = f
        .member
        .par_iter()
        .enumerate()
        .map(|(i, m)| {
            let mut c = Ctx::new(sys);
            c.basis = basis;
            c.enter(Seg::Key("member"));
            c.enter(Seg::Idx(i));
            let r = member(&mut c, m);
            (r, c.problems, c.warnings)
        })
        .collect();
    let mut members = Vec::with_capacity(checked.len());
    for (m, problems, warnings) in checked {
        cx.problems.extend(problems);
        cx.warnings.extend(warnings);
        if let Some(m) = m {
            members.push(m);
        }
    }
    let meta = meta?;
    if !cx.problems.is_empty() {
        return None;
    }
    Some(Package { format: 1, units: cx.sys, meta, members, warnings: Vec::new() })
}
