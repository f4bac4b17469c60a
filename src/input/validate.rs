//! From the raw schema to a validated [`Package`]: units converted, defaults applied and
//! recorded, every value checked against what is allowed. Problems are collected with
//! their key paths; `super::load` turns the paths into file positions.

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

fn meta(cx: &mut Ctx, p: &raw::Package) -> Option<Meta> {
    let title = cx.text("title", &p.title, 80);
    let title = cx.required("title", title, "the package title, e.g. \"Flexural strength of pretensioned members\"");
    let project = cx.text("project", &p.project, 60);
    let project = cx.required("project", project, "the project name");
    let project_number = cx.text("project_number", &p.project_number, 30).unwrap_or_default();
    let client = cx.text("client", &p.client, 60).unwrap_or_default();
    let subject = cx.text("subject", &p.subject, 100).unwrap_or_default();
    let revision = cx.text("revision", &p.revision, 20);
    let revision = cx.required("revision", revision, "the revision of this issue, e.g. \"0\" or \"A\"");
    let date = cx.date("date", &p.date);
    let date = cx.required("date", date, "the report date, e.g. 2026-11-30");
    let notes = cx.text("notes", &p.notes, limits::TEXT);
    let named = p.basis.clone().unwrap_or_else(|| "ACI 318-19".to_string());
    let basis_id = match BasisId::select(&named, cx.sys) {
        Ok(id) => {
            cx.basis = id.get(cx.sys);
            id
        }
        Err(known) => {
            cx.problem(
                "basis",
                format!("basis = {named:?} is not a design basis this version checks"),
                Some(known.to_string()),
            );
            BasisId::Aci318
        }
    };
    let basis = cx.basis.name().to_string();
    let paper = match p.paper.as_deref() {
        None => match cx.sys {
            System::Us => Paper::Letter,
            System::Si => Paper::A4,
        },
        Some("letter") => Paper::Letter,
        Some("a4") => Paper::A4,
        Some(other) => {
            cx.problem(
                "paper",
                format!("paper = {other:?} is not a paper size this version prints"),
                Some("\"letter\" or \"a4\"".to_string()),
            );
            Paper::Letter
        }
    };

    let mut revisions = Vec::new();
    for (i, r) in p.revisions.iter().enumerate() {
        cx.enter(Seg::Key("revisions"));
        cx.enter(Seg::Idx(i));
        let rev = cx.text("rev", &r.rev, 20);
        let rev = cx.required("rev", rev, "the revision mark");
        let d = cx.date("date", &r.date);
        let d = cx.required("date", d, "the date of the revision");
        let description = cx.text("description", &r.description, limits::SHORT_TEXT).unwrap_or_default();
        if let (Some(rev), Some(d)) = (rev, d) {
            if let Some(prev) = revisions.last().map(|x: &Revision| x.date)
                && d < prev
            {
                cx.problem(
                    "date",
                    format!("date = {d} is earlier than the revision before it ({prev})"),
                    Some("revisions listed oldest first".to_string()),
                );
            }
            revisions.push(Revision { rev, date: d, description });
        }
        cx.leave();
        cx.leave();
    }
    if let (Some(last), Some(revision)) = (revisions.last(), &revision)
        && &last.rev != revision
    {
        cx.problem(
            "revision",
            format!("revision = {revision:?}, but the revision history ends with {:?}", last.rev),
            Some("the current revision as the last entry of [[package.revisions]]".to_string()),
        );
    }

    let mut signoffs: Vec<Signoff> = Vec::new();
    for (i, s) in p.signoff.iter().enumerate() {
        cx.enter(Seg::Key("signoff"));
        cx.enter(Seg::Idx(i));
        let role = match s.role.as_deref() {
            Some("prepared") => Some(Role::Prepared),
            Some("checked") => Some(Role::Checked),
            Some("approved") => Some(Role::Approved),
            Some(other) => {
                cx.problem(
                    "role",
                    format!("role = {other:?} is not a sign-off role"),
                    Some("\"prepared\", \"checked\" or \"approved\"".to_string()),
                );
                None
            }
            None => {
                cx.problem("role", "role is missing", Some("\"prepared\", \"checked\" or \"approved\"".to_string()));
                None
            }
        };
        let name = cx.text("name", &s.name, 60);
        let name = cx.required("name", name, "the name of the person signing");
        let license = cx.text("license", &s.license, 40);
        let firm = cx.text("firm", &s.firm, 80);
        let date = cx.date("date", &s.date);
        if let (Some(role), Some(name)) = (role, name) {
            if signoffs.iter().any(|x| x.role == role) {
                cx.problem(
                    "role",
                    format!("role = {:?} is listed twice", role.name()),
                    Some("one sign-off per role".to_string()),
                );
            }
            signoffs.push(Signoff { role, name, license, firm, date });
        }
        cx.leave();
        cx.leave();
    }
    let find = |r: Role| signoffs.iter().position(|s| s.role == r);
    let at_signoff = |i: usize| vec![Seg::Key("package"), Seg::Key("signoff"), Seg::Idx(i)];
    // a quick check needs no sign-offs; the package is then a draft (Meta::is_draft)
    for r in [Role::Prepared, Role::Checked] {
        if find(r).is_none() {
            cx.warn(
                "signoff",
                format!(
                    "no sign-off has role = {:?}: the package is a DRAFT until [[package.signoff]] tables for \"prepared\" and \"checked\" are given and dated",
                    r.name()
                ),
            );
        }
    }
    if let (Some(pi), Some(ci)) = (find(Role::Prepared), find(Role::Checked))
        && signoffs[pi].name.trim().eq_ignore_ascii_case(signoffs[ci].name.trim())
    {
        let mut path = at_signoff(ci);
        path.push(Seg::Key("name"));
        cx.problems.push(Problem {
            path,
            message: format!("the checker ({:?}) is the preparer", signoffs[ci].name),
            allowed: Some("a checker who is not the person who prepared the package".to_string()),
        });
    }
    // dates in order: prepared <= checked <= approved, and no later role dated before an
    // earlier one is
    let order: Vec<(usize, &Signoff)> = [Role::Prepared, Role::Checked, Role::Approved]
        .iter()
        .filter_map(|r| find(*r).map(|i| (i, &signoffs[i])))
        .collect();
    let mut issues = Vec::new();
    for w in order.windows(2) {
        let ((_, a), (bi, b)) = (w[0], w[1]);
        match (a.date, b.date) {
            (Some(da), Some(db)) if db < da => issues
                .push((bi, format!("the {} date {db} is earlier than the {} date {da}", b.role.name(), a.role.name()))),
            (None, Some(_)) => issues.push((bi, format!("{} is dated but {} is not", b.role.name(), a.role.name()))),
            _ => {}
        }
    }
    for (i, message) in issues {
        let mut path = at_signoff(i);
        path.push(Seg::Key("date"));
        cx.problems.push(Problem {
            path,
            message,
            allowed: Some("sign-off dates in order: prepared, then checked, then approved".to_string()),
        });
    }

    Some(Meta {
        title: title?,
        project: project?,
        project_number,
        client,
        subject,
        revision: revision?,
        date: date?,
        basis,
        basis_id,
        paper,
        notes,
        revisions,
        signoffs,
    })
}

/// The concrete keys of a table (`[member.concrete]` or `[member.topping]`).
struct ConcreteKeys<'a> {
    fc: &'a Option<Q>,
    ec: &'a Option<Q>,
    density: &'a Option<Q>,
    lambda: Option<f64>,
    fr: &'a Option<Q>,
    curve: &'a Option<String>,
}

fn concrete_of(cx: &mut Ctx, k: ConcreteKeys, defaults: &mut Vec<Default>, prefix: &str) -> Option<Concrete> {
    let ConcreteKeys { fc, ec, density, lambda, fr, curve } = k;
    let r = ranges(cx.sys);
    let names = cx.sys.names();
    let fc = cx.ranged("fc", fc, Dim::Stress, r.fc.0, r.fc.1, false);
    let fc = match fc {
        Some(v) => v,
        None => cx.required("fc", fc, &format!("f'c, {} to {} {}", r.fc.0, r.fc.1, names.stress))?,
    };
    if fc < r.fc_usual.0 || fc > r.fc_usual.1 {
        cx.warn(
            "fc",
            format!(
                "f'c = {} {} is outside the usual range {} to {} {}; confirm it",
                num(fc),
                names.stress,
                r.fc_usual.0,
                r.fc_usual.1,
                names.stress
            ),
        );
    }
    let lambda_v = match lambda {
        Some(_) => cx.ratio("lambda", lambda, 0.75, 1.0)?,
        None => {
            defaults.push(Default { key: format!("{prefix}lambda"), text: "λ = 1.0 (normalweight concrete)".into() });
            1.0
        }
    };
    let wc = cx.ranged("density", density, Dim::Density, r.density.0, r.density.1, false);
    if density.is_some() && wc.is_none() {
        return None;
    }
    let (ec_v, ec_source) = match cx.ranged("ec", ec, Dim::Stress, r.ec.0, r.ec.1, false) {
        Some(v) => (v, EcSource::Given),
        None if ec.is_some() => return None,
        None => match wc {
            Some(wc) => (cx.basis.ec_density(fc, wc).value, EcSource::Density { wc }),
            None => {
                defaults.push(Default { key: format!("{prefix}ec"), text: cx.basis.ec_default_text() });
                (cx.basis.ec_normalweight(fc).value, EcSource::Normalweight)
            }
        },
    };
    let fr_max = fc * 0.3;
    let (fr_v, fr_given) = match cx.ranged("fr", fr, Dim::Stress, 0.0, fr_max, true) {
        Some(v) => (v, true),
        None if fr.is_some() => return None,
        None => {
            defaults.push(Default { key: format!("{prefix}fr"), text: cx.basis.fr_default_text() });
            (cx.basis.modulus_of_rupture(fc, lambda_v).value, false)
        }
    };
    let curve = match curve.as_deref() {
        None => ConcreteCurve::Hognestad,
        Some("hognestad") => ConcreteCurve::Hognestad,
        Some("popovics") => ConcreteCurve::Popovics,
        Some(other) => {
            cx.problem(
                "curve",
                format!("curve = {other:?} is not a concrete curve this version knows"),
                Some("\"hognestad\" or \"popovics\"".to_string()),
            );
            return None;
        }
    };
    Some(Concrete { fc, ec: ec_v, ec_source, lambda: lambda_v, fr: fr_v, fr_given, curve })
}

fn shape(cx: &mut Ctx, s: &raw::Section) -> Option<Shape> {
    let Some(name) = s.shape.as_deref() else {
        cx.problem("shape", "shape is missing", Some(SHAPES.to_string()));
        return None;
    };
    let all: [(&'static str, bool); 23] = [
        ("width", s.width.is_some()),
        ("height", s.height.is_some()),
        ("flange_width", s.flange_width.is_some()),
        ("flange_thickness", s.flange_thickness.is_some()),
        ("web_width", s.web_width.is_some()),
        ("ledge_width", s.ledge_width.is_some()),
        ("ledge_height", s.ledge_height.is_some()),
        ("ledges", s.ledges.is_some()),
        ("stem_spacing", s.stem_spacing.is_some()),
        ("stem_width_top", s.stem_width_top.is_some()),
        ("stem_width_bottom", s.stem_width_bottom.is_some()),
        ("top_flange_width", s.top_flange_width.is_some()),
        ("top_flange_thickness", s.top_flange_thickness.is_some()),
        ("top_taper", s.top_taper.is_some()),
        ("bottom_flange_width", s.bottom_flange_width.is_some()),
        ("bottom_flange_thickness", s.bottom_flange_thickness.is_some()),
        ("bottom_taper", s.bottom_taper.is_some()),
        ("void_count", s.void_count.is_some()),
        ("void_diameter", s.void_diameter.is_some()),
        ("void_center_height", s.void_center_height.is_some()),
        ("outline", s.outline.is_some()),
        ("holes", s.holes.is_some()),
        ("shape", true),
    ];
    let (required, optional): (&[&str], &[&str]) = match name {
        "rectangle" => (&["width", "height"], &[]),
        "tee" => (&["flange_width", "flange_thickness", "web_width", "height"], &[]),
        "inverted_tee" => (&["web_width", "height", "ledge_width", "ledge_height"], &["ledges"]),
        "double_tee" => (
            &["flange_width", "flange_thickness", "height", "stem_spacing", "stem_width_top", "stem_width_bottom"],
            &[],
        ),
        "i_girder" => (
            &[
                "height",
                "top_flange_width",
                "top_flange_thickness",
                "web_width",
                "bottom_flange_width",
                "bottom_flange_thickness",
            ],
            &["top_taper", "bottom_taper"],
        ),
        "hollow_core" => (&["width", "height", "void_count", "void_diameter", "void_center_height"], &[]),
        "polygon" => (&["outline"], &["holes"]),
        other => {
            cx.problem(
                "shape",
                format!("shape = {other:?} is not a shape this version builds"),
                Some(SHAPES.to_string()),
            );
            return None;
        }
    };
    let mut ok = true;
    let takes = || required.iter().chain(optional).copied().collect::<Vec<_>>().join(", ");
    for (key, given) in all {
        if key == "shape" {
            continue;
        }
        if given && !required.contains(&key) && !optional.contains(&key) {
            cx.problem(
                key,
                format!("{key} is not a dimension of shape {name:?}"),
                Some(format!("shape {name:?} takes {}", takes())),
            );
            ok = false;
        }
        if !given && required.contains(&key) {
            cx.problem(
                key,
                format!("{key} is missing (shape {name:?} needs it)"),
                Some(format!("shape {name:?} takes {}", takes())),
            );
            ok = false;
        }
    }
    if !ok {
        return None;
    }
    let shape = match name {
        "rectangle" => {
            Shape::Rectangle { width: cx.dim_len("width", &s.width)?, height: cx.dim_len("height", &s.height)? }
        }
        "tee" => Shape::Tee {
            flange_width: cx.dim_len("flange_width", &s.flange_width)?,
            flange_thickness: cx.dim_len("flange_thickness", &s.flange_thickness)?,
            web_width: cx.dim_len("web_width", &s.web_width)?,
            height: cx.dim_len("height", &s.height)?,
        },
        "inverted_tee" => Shape::InvertedTee {
            web_width: cx.dim_len("web_width", &s.web_width)?,
            height: cx.dim_len("height", &s.height)?,
            ledge_width: cx.dim_len("ledge_width", &s.ledge_width)?,
            ledge_height: cx.dim_len("ledge_height", &s.ledge_height)?,
            ledges: match s.ledges {
                None => 2,
                Some(_) => cx.count("ledges", s.ledges, 1, 2)?,
            },
        },
        "double_tee" => Shape::DoubleTee {
            flange_width: cx.dim_len("flange_width", &s.flange_width)?,
            flange_thickness: cx.dim_len("flange_thickness", &s.flange_thickness)?,
            height: cx.dim_len("height", &s.height)?,
            stem_spacing: cx.dim_len("stem_spacing", &s.stem_spacing)?,
            stem_width_top: cx.dim_len("stem_width_top", &s.stem_width_top)?,
            stem_width_bottom: cx.dim_len("stem_width_bottom", &s.stem_width_bottom)?,
        },
        "i_girder" => {
            let max = ranges(cx.sys).dim_max;
            Shape::IGirder {
                height: cx.dim_len("height", &s.height)?,
                top_flange_width: cx.dim_len("top_flange_width", &s.top_flange_width)?,
                top_flange_thickness: cx.dim_len("top_flange_thickness", &s.top_flange_thickness)?,
                top_taper: if s.top_taper.is_some() {
                    cx.ranged("top_taper", &s.top_taper, Dim::Length, 0.0, max, false)?
                } else {
                    0.0
                },
                web_width: cx.dim_len("web_width", &s.web_width)?,
                bottom_flange_width: cx.dim_len("bottom_flange_width", &s.bottom_flange_width)?,
                bottom_flange_thickness: cx.dim_len("bottom_flange_thickness", &s.bottom_flange_thickness)?,
                bottom_taper: if s.bottom_taper.is_some() {
                    cx.ranged("bottom_taper", &s.bottom_taper, Dim::Length, 0.0, max, false)?
                } else {
                    0.0
                },
            }
        }
        "hollow_core" => {
            let sh = Shape::HollowCore {
                width: cx.dim_len("width", &s.width)?,
                height: cx.dim_len("height", &s.height)?,
                void_count: cx.count("void_count", s.void_count, 1, 40)?,
                void_diameter: cx.dim_len("void_diameter", &s.void_diameter)?,
                void_center_height: cx.dim_len("void_center_height", &s.void_center_height)?,
            };
            hollow_core_fits(cx, &sh)?;
            sh
        }
        _ => polygon(cx, s)?,
    };
    Some(shape)
}

/// The voids of a hollow-core plank as drawn (polygons of [`VOID_SIDES`] sides with the
/// circle's area, whose corners reach a little beyond the circle) leave a plausible web
/// between voids and concrete above and below them: at least 0.75 in (19 mm), and the
/// edge webs (half a web, as the voids are spaced evenly) at least 0.375 in (9.5 mm).
fn hollow_core_fits(cx: &mut Ctx, sh: &Shape) -> Option<()> {
    let Shape::HollowCore { width, height, void_count, void_diameter: d, void_center_height: yc } = *sh else {
        return Some(());
    };
    let min = match cx.sys {
        System::Us => 0.75,
        System::Si => 19.0,
    };
    let t = std::f64::consts::TAU / VOID_SIDES as f64;
    let r = d / 2.0 * (t / t.sin()).sqrt();
    let pitch = width / void_count as f64;
    let len = cx.sys.names().length;
    let checks = [
        ("void_diameter", d, pitch - 2.0 * r, min, "the web between two voids"),
        ("void_diameter", d, pitch / 2.0 - r, min / 2.0, "the web at each edge of the plank"),
        ("void_center_height", yc, height - yc - r, min, "the concrete above the voids"),
        ("void_center_height", yc, yc - r, min, "the concrete below the voids"),
    ];
    for (key, value, left, need, what) in checks {
        if left < need {
            cx.problem(
                key,
                format!(
                    "{key} = {} {len} leaves {what} {} {len} thick as drawn (each void a {VOID_SIDES}-sided polygon of the circle's area, reaching {} {len} from its centre)",
                    num(value),
                    crate::trace::show(left),
                    crate::trace::show(r)
                ),
                Some(format!("voids that leave at least {} {len} there", num(need))),
            );
            return None;
        }
    }
    Some(())
}

const SHAPES: &str =
    "\"rectangle\", \"tee\", \"inverted_tee\", \"double_tee\", \"i_girder\", \"hollow_core\" or \"polygon\"";

fn ring(cx: &mut Ctx, key: &'static str, pts: &[Vec<f64>], hole: Option<usize>) -> Option<Vec<P>> {
    let what = match hole {
        Some(h) => format!("hole {}", h + 1),
        None => "the outline".to_string(),
    };
    if pts.len() > limits::VERTICES {
        cx.problem(
            key,
            format!("{what} has {} points", pts.len()),
            Some(format!("at most {} points", limits::VERTICES)),
        );
        return None;
    }
    let max = ranges(cx.sys).dim_max;
    let mut out = Vec::with_capacity(pts.len());
    for (i, p) in pts.iter().enumerate() {
        if p.len() != 2 {
            cx.problem(
                key,
                format!("point {} of {what} has {} numbers", i + 1, p.len()),
                Some("[x, y] pairs".to_string()),
            );
            return None;
        }
        if !p.iter().all(|v| v.is_finite() && v.abs() <= max) {
            cx.problem(
                key,
                format!("point {} of {what} is [{}, {}]", i + 1, num(p[0]), num(p[1])),
                Some(format!("finite coordinates within ±{} {}", max, cx.sys.names().length)),
            );
            return None;
        }
        out.push([p[0], p[1]]);
    }
    if let Err(fault) = section::check_ring(&out) {
        cx.problem(
            key,
            format!("{what} {fault}"),
            Some("a simple polygon (no crossing or touching edges) with area".to_string()),
        );
        return None;
    }
    Some(out)
}

fn polygon(cx: &mut Ctx, s: &raw::Section) -> Option<Shape> {
    let outline = ring(cx, "outline", s.outline.as_deref().unwrap_or(&[]), None)?;
    let raw_holes = s.holes.as_deref().unwrap_or(&[]);
    if raw_holes.len() > limits::HOLES {
        cx.problem("holes", format!("there are {} holes", raw_holes.len()), Some(format!("at most {}", limits::HOLES)));
        return None;
    }
    let total = outline.len() + raw_holes.iter().map(|h| h.len()).sum::<usize>();
    if total > limits::SECTION_POINTS {
        cx.problem(
            "holes",
            format!("the outline and holes have {total} points together"),
            Some(format!("at most {} points in all (a hole's curve needs a few dozen)", limits::SECTION_POINTS)),
        );
        return None;
    }
    let mut holes: Vec<Vec<P>> = Vec::new();
    for (h, pts) in raw_holes.iter().enumerate() {
        let r = ring(cx, "holes", pts, Some(h))?;
        let inside = r.iter().all(|p| section::point_in_ring(&outline, *p)) && !section::rings_meet(&r, &outline);
        if !inside {
            cx.problem(
                "holes",
                format!("hole {} is not inside the outline", h + 1),
                Some("holes wholly inside the outline, not touching it".to_string()),
            );
            return None;
        }
        for (k, other) in holes.iter().enumerate() {
            if section::rings_meet(&r, other)
                || section::point_in_ring(other, r[0])
                || section::point_in_ring(&r, other[0])
            {
                cx.problem(
                    "holes",
                    format!("hole {} overlaps hole {}", h + 1, k + 1),
                    Some("holes that do not overlap or touch".to_string()),
                );
                return None;
            }
        }
        holes.push(r);
    }
    Some(Shape::Polygon { outline, holes })
}

/// One of several mutually exclusive ways to give a value.
fn exclusive(cx: &mut Ctx, given: &[(&'static str, bool)], what: &str) -> Option<&'static str> {
    let set: Vec<&'static str> = given.iter().filter(|(_, g)| *g).map(|(k, _)| *k).collect();
    match set.len() {
        1 => Some(set[0]),
        0 => {
            let names: Vec<&str> = given.iter().map(|(k, _)| *k).collect();
            cx.problem("", format!("{what} is missing"), Some(format!("one of {}", names.join(", "))));
            None
        }
        _ => {
            cx.problem(
                set[1],
                format!("{} and {} are both given", set[0], set[1]),
                Some(format!("only one of them: {what}")),
            );
            None
        }
    }
}

/// Checks that steel of a diameter at a depth below the top of the precast fits inside
/// the concrete: inside the outline, clear of voids and edges, with room for `count`
/// bars side by side.
fn check_inside(cx: &mut Ctx, key: &'static str, region: &Region, depth: f64, count: u32, d: f64) -> bool {
    let top = region.y_top();
    let h = top - region.y_bot();
    let len = cx.sys.names().length;
    // the level as the user wrote it: a height from the bottom or a depth from the top
    let by_height = key.starts_with("height");
    let written = if by_height { h - depth } else { depth };
    if depth - d / 2.0 <= 0.0 || depth + d / 2.0 >= h {
        cx.problem(
            key,
            format!(
                "{key} = {} {len} puts the steel (diameter {} {len}) outside the concrete of the precast unit, which is {} {len} deep",
                num(written),
                num(d),
                num(h)
            ),
            Some(format!(
                "a {} between {} and {} {len} ({} from the {} of the precast unit)",
                if by_height { "height" } else { "depth" },
                num(d / 2.0),
                num(h - d / 2.0),
                if by_height { "height" } else { "depth" },
                if by_height { "bottom" } else { "top" },
            )),
        );
        return false;
    }
    let y = top - depth;
    let room = region.room_at(y, d);
    let fits = crate::section::side_by_side(&room, d);
    if fits < u64::from(count) {
        let w: f64 = room.iter().map(|(a, b)| b - a).sum();
        let (there, allowed) = if room.is_empty() {
            (
                "no concrete spans the steel's whole diameter there".to_string(),
                "a depth where the section has concrete (not in a void or outside the outline)".to_string(),
            )
        } else if room.len() == 1 {
            (
                format!("the section has {} {len} there", num(w)),
                format!("at most {fits} bars or strands of this size at this depth"),
            )
        } else {
            let pieces: Vec<String> = room.iter().map(|(a, b)| crate::trace::show(b - a)).collect();
            (
                format!(
                    "the concrete there lies in {} stretches between voids and edges ({} {len}), with room for {fits} side by side",
                    room.len(),
                    pieces.join(", ")
                ),
                format!("at most {fits} bars or strands of this size at this depth"),
            )
        };
        cx.problem(
            key,
            format!(
                "{count} of diameter {} {len} need {} {len} of concrete width at {key} = {} {len}; {there}",
                num(d),
                num(count as f64 * d),
                num(written)
            ),
            Some(allowed),
        );
        return false;
    }
    true
}

fn strand_layer(
    cx: &mut Ctx,
    s: &raw::Strands,
    region: &Region,
    length: Option<f64>,
    defaults: &mut Vec<Default>,
) -> Option<StrandLayer> {
    let sys = cx.sys;
    let names = sys.names();
    let h = region.y_top() - region.y_bot();
    let max = ranges(sys).dim_max;
    let how = exclusive(
        cx,
        &[
            ("depth", s.depth.is_some()),
            ("height", s.height.is_some()),
            ("depth_end", s.depth_end.is_some() || s.depth_harp.is_some()),
            ("height_end", s.height_end.is_some() || s.height_harp.is_some()),
        ],
        "the layer's level (depth from the top of the precast unit, or height from its bottom; harped: depth_end and depth_harp, or height_end and height_harp, with harp_x)",
    );
    let lvl = |cx: &mut Ctx, key: &'static str, q: &Option<Q>| cx.ranged(key, q, Dim::Length, 0.0, max, true);
    let profile = match how? {
        "depth" => Profile::Straight { depth: lvl(cx, "depth", &s.depth)? },
        "height" => Profile::Straight { depth: h - lvl(cx, "height", &s.height)? },
        harped => {
            let (end, harp, e_key, h_key) = if harped == "depth_end" {
                (&s.depth_end, &s.depth_harp, "depth_end", "depth_harp")
            } else {
                (&s.height_end, &s.height_harp, "height_end", "height_harp")
            };
            let e = cx.required(e_key, end.as_ref(), "the level at the member end").cloned();
            let hp = cx.required(h_key, harp.as_ref(), "the level at the harp point").cloned();
            let e = lvl(cx, e_key, &e)?;
            let hp = lvl(cx, h_key, &hp)?;
            let (de, dh) = if harped == "depth_end" { (e, hp) } else { (h - e, h - hp) };
            let hx = cx.required("harp_x", s.harp_x.as_ref(), "the harp point's distance from the member end").cloned();
            match (&s.harp_x2, length) {
                (Some(_), None) => {
                    cx.problem(
                        "harp_x2",
                        "harp_x2 is given but the member has no length",
                        Some("give the member's length (end to end), or leave harp_x2 out".to_string()),
                    );
                    return None;
                }
                (Some(_), Some(len)) => {
                    let hx = cx.ranged("harp_x", &hx, Dim::Length, 0.0, len, true)?;
                    let hx2 = cx.ranged("harp_x2", &s.harp_x2, Dim::Length, 0.0, len, true)?;
                    if !(hx2 > hx && hx2 < len) {
                        cx.problem(
                            "harp_x2",
                            format!(
                                "harp_x2 = {} is not between harp_x = {} and the member's length {}",
                                cx.shown(Dim::Length, hx2),
                                cx.shown(Dim::Length, hx),
                                cx.shown(Dim::Length, len)
                            ),
                            Some(
                                "the second harp point's distance from the left end: harp_x < harp_x2 < length"
                                    .to_string(),
                            ),
                        );
                        return None;
                    }
                    Profile::Harped {
                        depth_end: de,
                        depth_harp: dh,
                        harp_x: hx,
                        harp_x2: Some(hx2),
                        harp_x2_given: true,
                    }
                }
                (None, _) => {
                    let limit = length.map_or(ranges(sys).length_max, |l| l / 2.0);
                    let hx = cx.ranged("harp_x", &hx, Dim::Length, 0.0, limit, true)?;
                    Profile::Harped {
                        depth_end: de,
                        depth_harp: dh,
                        harp_x: hx,
                        harp_x2: length.map(|l| l - hx),
                        harp_x2_given: false,
                    }
                }
            }
        }
    };
    for (key, given) in [("harp_x", s.harp_x.is_some()), ("harp_x2", s.harp_x2.is_some())] {
        if given && matches!(profile, Profile::Straight { .. }) {
            cx.problem(
                key,
                format!("{key} is given for a straight layer"),
                Some(format!("{key} only with depth_end/depth_harp or height_end/height_harp")),
            );
            return None;
        }
    }
    let count = cx.count("count", s.count, 1, limits::STRANDS_PER_LAYER);
    let count = cx.required("count", count, "the number of strands in the layer")?;

    let fpu = match &s.fpu {
        Some(_) => {
            let (lo, hi) = match sys {
                System::Us => (150.0, 350.0),
                System::Si => (1000.0, 2400.0),
            };
            cx.ranged("fpu", &s.fpu, Dim::Stress, lo, hi, false)?
        }
        None => {
            let v = match sys {
                System::Us => 270.0,
                System::Si => 1860.0,
            };
            defaults.push(Default {
                key: "strands.fpu".into(),
                text: format!("fpu = {} {} (Grade {})", num(v), names.stress, num(v)),
            });
            v
        }
    };
    let Some(grade) = Grade::of(fpu, sys) else {
        let allowed = match sys {
            System::Us => "250 or 270 ksi (the grades the strand models were fitted to)",
            System::Si => "1725 or 1860 MPa (the grades the strand models were fitted to)",
        };
        cx.problem(
            "fpu",
            format!("fpu = {} {}: no strand model here is fitted to this grade", num(fpu), names.stress),
            Some(allowed.to_string()),
        );
        return None;
    };
    let model = match s.model.as_deref() {
        None => {
            defaults.push(Default {
                key: "strands.model".into(),
                text: "strand model \"pci\" (PCI Design Handbook two-branch curve)".into(),
            });
            Model::Pci
        }
        Some("pci") => Model::Pci,
        Some("power") => Model::Power,
        Some(other) => {
            cx.problem(
                "model",
                format!("model = {other:?} is not a strand model this version knows"),
                Some("\"pci\" or \"power\"".to_string()),
            );
            return None;
        }
    };
    if StrandCurve::new(model, grade, sys).is_none() {
        cx.problem(
            "model",
            format!("model = \"power\" with fpu = {} {}: the power formula is fitted to Grade 270 low-relaxation strand only", num(fpu), names.stress),
            Some("model = \"pci\" for Grade 250 strand, or Grade 270 strand".to_string()),
        );
        return None;
    }

    // size: diameter (area from the table, or given), or area alone (a standard size)
    let diameter = match &s.diameter {
        Some(_) => Some(cx.ranged("diameter", &s.diameter, Dim::Length, 0.0, max / 10.0, true)?),
        None => None,
    };
    let area = match &s.area {
        Some(_) => Some(cx.ranged("area", &s.area, Dim::Area, 0.0, max, true)?),
        None => None,
    };
    let (diameter, area, size) = match (diameter, area) {
        (Some(d), a) => match catalog::strand_by_diameter(d, grade, sys) {
            Some(std) => {
                if let Some(a) = a
                    && (a - std.area).abs() > 0.02 * std.area
                {
                    cx.warn(
                        "area",
                        format!(
                            "area {} {} differs from the standard {} {} of {} strand",
                            num(a),
                            names.area,
                            num(std.area),
                            names.area,
                            std.name
                        ),
                    );
                }
                (std.diameter, a.unwrap_or(std.area), Some(std.name))
            }
            None => match a {
                Some(a) => (d, a, None),
                None => {
                    cx.problem(
                        "diameter",
                        format!(
                            "diameter = {} {} is not a standard size of this strand grade; its area is unknown",
                            num(d),
                            names.length
                        ),
                        Some(format!("a standard diameter: {}; or give area too", catalog::strand_names(grade, sys))),
                    );
                    return None;
                }
            },
        },
        (None, Some(a)) => match catalog::strand_by_area(a, grade, sys) {
            Some(std) => (std.diameter, a, Some(std.name)),
            None => {
                cx.problem(
                    "area",
                    format!("area = {} {} is not a standard strand area, so the diameter (needed for development length) is unknown", num(a), names.area),
                    Some("give diameter as well".to_string()),
                );
                return None;
            }
        },
        (None, None) => {
            cx.problem(
                "diameter",
                "diameter is missing",
                Some(format!("the strand's nominal diameter: {}", catalog::strand_names(grade, sys))),
            );
            return None;
        }
    };

    let fpy = match &s.fpy {
        Some(_) => cx.ranged("fpy", &s.fpy, Dim::Stress, 0.8 * fpu, 0.95 * fpu, false)?,
        None => {
            defaults.push(Default { key: "strands.fpy".into(), text: "fpy = 0.90 fpu (low-relaxation strand)".into() });
            0.9 * fpu
        }
    };
    let jack_limit = cx.basis.jacking_limit(fpu, fpy);
    let how = exclusive(
        cx,
        &[("fse", s.fse.is_some()), ("losses", s.losses.is_some())],
        "the effective prestress (fse, or losses with jacking)",
    )?;
    let (fse, fse_source) = if how == "fse" {
        if s.jacking.is_some() {
            cx.problem("jacking", "jacking is given with fse", Some("fse alone, or jacking with losses".to_string()));
            return None;
        }
        let v = cx.quantity("fse", &s.fse, Dim::Stress)?;
        if !(0.0..fpu).contains(&v) {
            cx.problem(
                "fse",
                format!("fse = {} is out of range", cx.shown(Dim::Stress, v)),
                Some(format!("0 <= fse < fpu = {}", cx.shown(Dim::Stress, fpu))),
            );
            return None;
        }
        if v > jack_limit {
            cx.warn(
                "fse",
                format!(
                    "fse = {} exceeds the jacking limit {} = {} of {}",
                    cx.shown(Dim::Stress, v),
                    cx.basis.jacking_limit_text(),
                    cx.shown(Dim::Stress, jack_limit),
                    cx.basis.cite(Clause::JackingLimit)
                ),
            );
        }
        (v, FseSource::Given)
    } else {
        let jacking = match s.jacking {
            Some(j) => cx.ratio("jacking", Some(j), 0.5, 0.85)?,
            None => {
                defaults.push(Default { key: "strands.jacking".into(), text: "jacking stress fpj = 0.75 fpu".into() });
                0.75
            }
        };
        let fpj = jacking * fpu;
        if fpj > jack_limit * (1.0 + 1e-12) {
            cx.warn(
                "jacking",
                format!(
                    "jacking = {} gives fpj = {}, above the limit {} = {} of {}",
                    num(jacking),
                    cx.shown(Dim::Stress, fpj),
                    cx.basis.jacking_limit_text(),
                    cx.shown(Dim::Stress, jack_limit),
                    cx.basis.cite(Clause::JackingLimit)
                ),
            );
        }
        let losses = cx.quantity("losses", &s.losses, Dim::Stress)?;
        if !(0.0..fpj).contains(&losses) {
            cx.problem(
                "losses",
                format!("losses = {} is out of range", cx.shown(Dim::Stress, losses)),
                Some(format!("0 <= losses < fpj = {}", cx.shown(Dim::Stress, fpj))),
            );
            return None;
        }
        (fpj - losses, FseSource::Losses { jacking, fpj, losses })
    };
    let debonded_length = match &s.debonded_length {
        Some(_) => {
            let limit = length.map_or(ranges(sys).length_max, |l| l / 2.0);
            cx.ranged("debonded_length", &s.debonded_length, Dim::Length, 0.0, limit, false)?
        }
        None => 0.0,
    };
    // inside the concrete, at every level the layer takes
    let levels: Vec<(f64, &'static str)> = match profile {
        Profile::Straight { depth } => vec![(depth, if s.height.is_some() { "height" } else { "depth" })],
        Profile::Harped { depth_end, depth_harp, .. } => {
            let (a, b) =
                if s.depth_end.is_some() { ("depth_end", "depth_harp") } else { ("height_end", "height_harp") };
            vec![(depth_end, a), (depth_harp, b)]
        }
    };
    for (d, key) in levels {
        if !check_inside(cx, key, region, d, count, diameter) {
            return None;
        }
    }
    Some(StrandLayer { profile, count, diameter, area, size, fpu, fpy, grade, model, fse, fse_source, debonded_length })
}

fn bar_layer(cx: &mut Ctx, b: &raw::Bars, region: &Region, defaults: &mut Vec<Default>) -> Option<BarLayer> {
    let sys = cx.sys;
    let r = ranges(sys);
    let h = region.y_top() - region.y_bot();
    let how = exclusive(
        cx,
        &[("depth", b.depth.is_some()), ("height", b.height.is_some())],
        "the layer's level (depth from the top of the precast unit, or height from its bottom)",
    )?;
    let depth = if how == "depth" {
        cx.ranged("depth", &b.depth, Dim::Length, 0.0, r.dim_max, true)?
    } else {
        h - cx.ranged("height", &b.height, Dim::Length, 0.0, r.dim_max, true)?
    };
    let count = cx.count("count", b.count, 1, limits::BARS_PER_LAYER);
    let count = cx.required("count", count, "the number of bars in the layer")?;
    let (size, diameter, area) = match (&b.size, &b.diameter) {
        (Some(_), Some(_)) => {
            cx.problem(
                "diameter",
                "size and diameter are both given",
                Some("a bar size (\"#5\"), or diameter with area".to_string()),
            );
            return None;
        }
        (Some(name), None) => match catalog::bar(name, sys) {
            Some(bs) => {
                if b.area.is_some() {
                    cx.problem(
                        "area",
                        "area is given with size; the size fixes the area",
                        Some(format!("size alone ({} has {} {})", bs.name, num(bs.area), sys.names().area)),
                    );
                    return None;
                }
                (Some(bs.name), bs.diameter, bs.area)
            }
            None => {
                let std = match sys {
                    System::Us => "ASTM A615",
                    System::Si => "ASTM A615M",
                };
                cx.problem("size", format!("size = {name:?} is not a {std} bar size"), Some(catalog::bar_names(sys)));
                return None;
            }
        },
        (None, Some(_)) => {
            let d = cx.ranged("diameter", &b.diameter, Dim::Length, 0.0, r.dim_max / 10.0, true)?;
            let a = cx.required("area", b.area.as_ref(), "the area of one bar (with diameter)").cloned();
            let a = cx.ranged("area", &a, Dim::Area, 0.0, r.dim_max, true)?;
            (None, d, a)
        }
        (None, None) if b.area.is_some() => {
            // area alone: the drawing and the fit check use the round bar of that area
            let a = cx.ranged("area", &b.area, Dim::Area, 0.0, r.dim_max, true)?;
            let d = (4.0 * a / std::f64::consts::PI).sqrt();
            defaults.push(Default {
                key: "bars.diameter".into(),
                text: format!(
                    "a bar layer given by its area alone ({} {}) is drawn and placed as the round bar of that area, diameter √(4A/π) = {} {}",
                    num(a),
                    sys.names().area,
                    crate::trace::show(d),
                    sys.names().length
                ),
            });
            (None, d, a)
        }
        (None, None) => {
            cx.problem(
                "size",
                "size is missing",
                Some(format!("a bar size: {}; diameter with area; or area alone", catalog::bar_names(sys))),
            );
            return None;
        }
    };
    let fy = match &b.fy {
        Some(_) => cx.ranged("fy", &b.fy, Dim::Stress, r.fy.0, r.fy.1, false)?,
        None => {
            let (v, g) = match sys {
                System::Us => (60.0, "fy = 60 ksi (ASTM A615 Grade 60)"),
                System::Si => (420.0, "fy = 420 MPa (ASTM A615M Grade 420)"),
            };
            defaults.push(Default { key: "bars.fy".into(), text: g.into() });
            v
        }
    };
    let es = match &b.es {
        Some(_) => cx.ranged("es", &b.es, Dim::Stress, r.es.0, r.es.1, false)?,
        None => {
            let (v, t) = cx.basis.bar_modulus();
            defaults.push(Default { key: "bars.es".into(), text: t });
            v
        }
    };
    if !check_inside(cx, how, region, depth, count, diameter) {
        return None;
    }
    Some(BarLayer { depth, count, size, diameter, area, fy, es })
}

fn member(cx: &mut Ctx, m: &raw::Member) -> Option<Member> {
    let sys = cx.sys;
    let r = ranges(sys);
    let mut defaults = Vec::new();
    let id = cx.text("id", &m.id, 16);
    let id = cx.required("id", id, "a short unique name for the member, e.g. \"DT-1\"");
    if let Some(id) = &id
        && id.trim().is_empty()
    {
        cx.problem("id", "id is empty", Some("a short unique name for the member".to_string()));
    }
    let description = cx.text("description", &m.description, limits::TEXT).unwrap_or_default();
    let length = match &m.length {
        Some(_) => Some(cx.ranged("length", &m.length, Dim::Length, 0.0, r.length_max, true)?),
        None => None,
    };

    let concrete = match &m.concrete {
        Some(c) => {
            cx.enter(Seg::Key("concrete"));
            let v = concrete_of(
                cx,
                ConcreteKeys {
                    fc: &c.fc,
                    ec: &c.ec,
                    density: &c.density,
                    lambda: c.lambda,
                    fr: &c.fr,
                    curve: &c.curve,
                },
                &mut defaults,
                "concrete.",
            );
            cx.leave();
            v
        }
        None => {
            cx.problem(
                "concrete",
                "the [member.concrete] table is missing",
                Some("a table with fc (and optionally ec, density, lambda, fr)".to_string()),
            );
            None
        }
    };

    let (shape, region) = match &m.section {
        Some(s) => {
            cx.enter(Seg::Key("section"));
            let built = shape(cx, s).and_then(|sh| match sh.build() {
                Ok(region) => Some((sh, region)),
                Err(ShapeError { key, value, allowed }) => {
                    cx.problem(key, format!("{key} = {} does not fit the shape", num(value)), Some(allowed));
                    None
                }
            });
            cx.leave();
            match built {
                Some(b) => (Some(b.0), Some(b.1)),
                None => (None, None),
            }
        }
        None => {
            cx.problem(
                "section",
                "the [member.section] table is missing",
                Some(format!("a table with shape = {SHAPES} and its dimensions")),
            );
            (None, None)
        }
    };

    let kind = match m.kind.as_deref() {
        None => {
            if shape.as_ref().is_some_and(|s| s.is_slab()) {
                Kind::OneWaySlab
            } else {
                Kind::Beam
            }
        }
        Some("beam") => Kind::Beam,
        Some("slab") => Kind::OneWaySlab,
        Some(other) => {
            cx.problem(
                "kind",
                format!("kind = {other:?} is not a member kind"),
                Some("\"beam\" or \"slab\" (one-way slab)".to_string()),
            );
            Kind::Beam
        }
    };

    let topping = match (&m.topping, &region) {
        (Some(t), Some(region)) => {
            cx.enter(Seg::Key("topping"));
            let thickness = cx.ranged("thickness", &t.thickness, Dim::Length, 0.0, r.dim_max / 10.0, true);
            let thickness = cx.required("thickness", thickness, "the topping thickness");
            let (lo, hi) = region.top_extent();
            let flat = hi - lo > 0.0 && lo.is_finite() && hi.is_finite();
            let width = match &t.width {
                Some(_) => cx.dim_len("width", &t.width),
                None if flat => Some(hi - lo),
                None => {
                    cx.problem(
                        "width",
                        "width is missing and the top of the precast unit is not flat",
                        Some("the topping width".to_string()),
                    );
                    None
                }
            };
            let block = match t.block.as_deref() {
                None => {
                    defaults.push(Default {
                        key: "topping.block".into(),
                        text: "where the stress block is deeper than the topping, the topping's f'c and β1 are used over the whole block".into(),
                    });
                    Some(BlockMode::Topping)
                }
                Some("topping") => Some(BlockMode::Topping),
                Some("two_part") => Some(BlockMode::TwoPart),
                Some(other) => {
                    cx.problem(
                        "block",
                        format!("block = {other:?} is not a stress-block option"),
                        Some("\"topping\" or \"two_part\"".to_string()),
                    );
                    None
                }
            };
            let c = concrete_of(
                cx,
                ConcreteKeys {
                    fc: &t.fc,
                    ec: &t.ec,
                    density: &t.density,
                    lambda: t.lambda,
                    fr: &None,
                    curve: &t.curve,
                },
                &mut defaults,
                "topping.",
            );
            cx.leave();
            match (thickness, width, block, c) {
                (Some(thickness), Some(width), Some(block), Some(concrete)) => Some(Topping {
                    thickness,
                    width,
                    x_center: if flat { (lo + hi) / 2.0 } else { 0.0 },
                    concrete,
                    block,
                }),
                _ => return None,
            }
        }
        (Some(_), None) => return None,
        (None, _) => None,
    };

    // moments
    let mu = match &m.mu {
        Some(_) => Some(cx.ranged("mu", &m.mu, Dim::Moment, 0.0, r.moment_max, true)?),
        None => None,
    };
    let mnc = match &m.mnc {
        Some(_) => {
            let v = cx.ranged("mnc", &m.mnc, Dim::Moment, 0.0, r.moment_max, false)?;
            if m.topping.is_none() {
                cx.warn("mnc", "mnc is used only for members with a topping; it is ignored here");
            }
            v
        }
        None => {
            if m.topping.is_some() {
                defaults.push(Default { key: "mnc".into(), text: "non-composite moment Mnc = 0 (not given)".into() });
            }
            0.0
        }
    };
    if m.location.len() > limits::LOCATIONS {
        cx.problem(
            "location",
            format!("{} check locations", m.location.len()),
            Some(format!("at most {}", limits::LOCATIONS)),
        );
        return None;
    }
    let mut locations = Vec::new();
    for (k, l) in m.location.iter().enumerate() {
        cx.enter(Seg::Key("location"));
        cx.enter(Seg::Idx(k));
        let name = cx.text("name", &l.name, 40).unwrap_or_else(|| format!("location {}", k + 1));
        if locations.iter().any(|x: &Location| x.name == name) {
            cx.problem(
                "name",
                format!("name = {name:?} is used twice in this member"),
                Some("a unique name per location".to_string()),
            );
        }
        let x = match (&l.x, length) {
            (Some(_), Some(len)) => match cx.quantity("x", &l.x, Dim::Length) {
                Some(x) if (0.0..=len).contains(&x) => Some(x),
                Some(x) => {
                    cx.problem(
                        "x",
                        format!(
                            "x = {} lies outside the member, whose length is {}",
                            cx.shown(Dim::Length, x),
                            cx.shown(Dim::Length, len)
                        ),
                        Some(format!("0 <= x <= {} (x from the left end)", cx.shown(Dim::Length, len))),
                    );
                    None
                }
                None => None,
            },
            (Some(_), None) => {
                cx.problem(
                    "x",
                    "x is given but the member has no length, so x cannot be measured from its ends",
                    Some("give the member's length (end to end) in [[member]]; x then runs from 0 at the left end to the length".to_string()),
                );
                None
            }
            (None, _) => None,
        };
        let lmu = match &l.mu {
            Some(_) => cx.ranged("mu", &l.mu, Dim::Moment, 0.0, r.moment_max, true),
            None => {
                if mu.is_none() {
                    cx.problem(
                        "mu",
                        "mu is missing (neither the location nor the member gives it)",
                        Some("the factored moment at the location".to_string()),
                    );
                }
                mu
            }
        };
        if l.x.is_none() {
            cx.problem("x", "x is missing", Some("the location's distance from the member end".to_string()));
        }
        let mnc_scaled = l.mnc.is_none() && length.is_some() && x.is_some() && m.topping.is_some();
        let lmnc = match &l.mnc {
            Some(_) => cx.ranged("mnc", &l.mnc, Dim::Moment, 0.0, r.moment_max, false),
            None => match (length, x) {
                (Some(len), Some(x)) if m.topping.is_some() => {
                    if mnc > 0.0 {
                        defaults.push(Default {
                            key: "location.mnc".into(),
                            text: "where a location gives no mnc, the member's mnc (at midspan) is scaled by 4x(L - x)/L², as for a uniformly loaded simple span".into(),
                        });
                    }
                    Some(mnc * 4.0 * x * (len - x) / (len * len))
                }
                _ => Some(mnc),
            },
        };
        if let (Some(lmu), Some(x), Some(lmnc)) = (lmu, x, lmnc) {
            locations.push(Location { name, x: Some(x), mu: lmu, mnc: lmnc, mnc_scaled });
        }
        cx.leave();
        cx.leave();
    }
    // the member's mu and mnc are the values of the locations that give none: where
    // every location gives its own, a member value would be used nowhere
    if !m.location.is_empty() {
        for (key, member_given, all_own) in [
            ("mu", m.mu.is_some(), m.location.iter().all(|l| l.mu.is_some())),
            ("mnc", m.mnc.is_some() && m.topping.is_some(), m.location.iter().all(|l| l.mnc.is_some())),
        ] {
            if member_given && all_own {
                cx.problem(
                    key,
                    format!("{key} is given for the member and for every [[member.location]], so the member's {key} would be used by no location"),
                    Some(format!("the member's {key} applies to the locations that give none: remove it, or remove {key} from the locations that should take it")),
                );
            }
        }
    }
    if m.location.is_empty() {
        match mu {
            Some(mu) => match length {
                Some(l) => {
                    locations.push(Location { name: "midspan".into(), x: Some(l / 2.0), mu, mnc, mnc_scaled: false })
                }
                None => {
                    locations.push(Location { name: "critical section".into(), x: None, mu, mnc, mnc_scaled: false })
                }
            },
            None => cx.problem(
                "mu",
                "mu is missing",
                Some("the factored moment, or [[member.location]] tables with x and mu".to_string()),
            ),
        }
    }

    let region = region?;
    if m.strands.is_empty() {
        cx.problem(
            "strands",
            "the member has no strand layers",
            Some("at least one [[member.strands]] table".to_string()),
        );
    }
    if m.strands.len() > limits::LAYERS || m.bars.len() > limits::LAYERS {
        cx.problem(
            "strands",
            format!("{} strand and {} bar layers", m.strands.len(), m.bars.len()),
            Some(format!("at most {} of each", limits::LAYERS)),
        );
        return None;
    }
    let mut strands = Vec::new();
    for (k, s) in m.strands.iter().enumerate() {
        cx.enter(Seg::Key("strands"));
        cx.enter(Seg::Idx(k));
        if let Some(layer) = strand_layer(cx, s, &region, length, &mut defaults) {
            strands.push(layer);
        }
        cx.leave();
        cx.leave();
    }
    if !strands.is_empty() && strands.iter().all(|s| s.fse == 0.0) {
        cx.warn("strands", "no strand layer is tensioned (every fse is 0)");
    }
    let mut bars = Vec::new();
    for (k, b) in m.bars.iter().enumerate() {
        cx.enter(Seg::Key("bars"));
        cx.enter(Seg::Idx(k));
        if let Some(layer) = bar_layer(cx, b, &region, &mut defaults) {
            bars.push(layer);
        }
        cx.leave();
        cx.leave();
    }
    let curve = match &m.curve {
        Some(c) => {
            cx.enter(Seg::Key("curve"));
            let o = (
                c.crushing_strain.map_or(Some(0.003), |v| cx.ratio("crushing_strain", Some(v), 0.002, 0.006)),
                c.rupture_strain.map_or(Some(0.035), |v| cx.ratio("rupture_strain", Some(v), 0.01, 0.1)),
                c.points
                    .map_or(Some(200), |v| cx.count("points", Some(v), 20, limits::CURVE_POINTS).map(|n| n as usize)),
                c.strips
                    .map_or(Some(200), |v| cx.count("strips", Some(v), 200, limits::CURVE_STRIPS).map(|n| n as usize)),
                c.bar_hardening.map_or(Some(0.0), |v| cx.ratio("bar_hardening", Some(v), 0.0, 0.1)),
            );
            cx.leave();
            match o {
                (Some(crushing_strain), Some(rupture_strain), Some(points), Some(strips), Some(bar_hardening)) => {
                    CurveOptions { crushing_strain, rupture_strain, points, strips, bar_hardening }
                }
                _ => return None,
            }
        }
        None => {
            CurveOptions { crushing_strain: 0.003, rupture_strain: 0.035, points: 200, strips: 200, bar_hardening: 0.0 }
        }
    };
    // dedup defaults (several layers may take the same one)
    let mut seen: Vec<Default> = Vec::new();
    for d in defaults {
        if !seen.contains(&d) {
            seen.push(d);
        }
    }
    Some(Member {
        id: id?,
        description,
        kind,
        length,
        mnc,
        locations,
        concrete: concrete?,
        shape: shape?,
        region,
        topping,
        strands,
        bars,
        curve,
        defaults: seen,
    })
}
