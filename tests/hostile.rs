//! Hostile and broken inputs: every one is refused with exit status 2 and one clear
//! message naming the file, the line and column, the key and what is allowed; nothing
//! panics and no output file is left behind.

mod common;
use common::*;
use std::path::Path;

/// A valid package: the common head and one rectangular member.
static BASE_TEXT: std::sync::LazyLock<String> = std::sync::LazyLock::new(|| {
    format!(
        "{HEAD_US}\n[[member]]\nid = \"R-1\"\nlength = 360.0\nmu = 120.0\n[member.concrete]\nfc = 6.0\n[member.section]\nshape = \"rectangle\"\nwidth = 12.0\nheight = 24.0\n[[member.strands]]\ndepth = 21.0\ncount = 4\ndiameter = 0.5\nfse = 160.0\n"
    )
});

/// The base with one line replaced (or text appended when `from` is empty).
fn with(from: &str, to: &str) -> String {
    if from.is_empty() {
        return format!("{}{to}", BASE_TEXT.as_str());
    }
    assert!(BASE_TEXT.contains(from), "the base has no {from:?}");
    BASE_TEXT.replacen(from, to, 1)
}

struct Case {
    name: &'static str,
    text: Vec<u8>,
    /// Text the message must contain (usually the key).
    key: &'static str,
    /// Whether the message must give a line and column.
    position: bool,
}

fn case(name: &'static str, text: String, key: &'static str) -> Case {
    Case { name, text: text.into_bytes(), key, position: true }
}

fn cases() -> Vec<Case> {
    let poly = |pts: &str| {
        with("shape = \"rectangle\"\nwidth = 12.0\nheight = 24.0", &format!("shape = \"polygon\"\noutline = {pts}"))
    };
    let mut many = String::from("[");
    for k in 0..2001 {
        let a = k as f64 / 2001.0 * std::f64::consts::TAU;
        many.push_str(&format!("[{:.6}, {:.6}],", 6.0 * a.cos(), 12.0 + 12.0 * a.sin()));
    }
    many.push(']');
    let mut members = BASE_TEXT.clone();
    for k in 0..10_001 {
        members.push_str(&format!("[[member]]\nid = \"M{k}\"\nmu = 1.0\n[member.concrete]\nfc = 6.0\n[member.section]\nshape = \"rectangle\"\nwidth = 12.0\nheight = 24.0\n[[member.strands]]\ndepth = 21.0\ncount = 1\ndiameter = 0.5\nfse = 1.0\n"));
    }
    let hc = with(
        "shape = \"rectangle\"\nwidth = 12.0\nheight = 24.0",
        "shape = \"hollow_core\"\nwidth = 48.0\nheight = 24.0\nvoid_count = 4\nvoid_diameter = 8.0\nvoid_center_height = 12.0",
    );
    vec![
        case("NaN", with("fc = 6.0", "fc = nan"), "fc"),
        case("infinity", with("fc = 6.0", "fc = inf"), "fc"),
        case("negative strength", with("fc = 6.0", "fc = -6.0"), "fc"),
        case("zero strength", with("fc = 6.0", "fc = 0"), "fc"),
        case("absurd strength", with("fc = 6.0", "fc = 40.0"), "fc"),
        case("zero width", with("width = 12.0", "width = 0"), "width"),
        case("negative height", with("height = 24.0", "height = -24.0"), "height"),
        case("strand outside the concrete", with("depth = 21.0", "depth = 30.0"), "depth"),
        case("strand on the edge", with("depth = 21.0", "depth = 23.9"), "depth"),
        case("depth and height both", with("depth = 21.0", "depth = 21.0\nheight = 3.0"), "height"),
        case("unknown key", with("fc = 6.0", "fc = 6.0\nfcc = 5.0"), "fcc"),
        case("unknown table", with("", "[member.prestress]\nloss = 1\n"), "prestress"),
        case("unknown shape", with("shape = \"rectangle\"", "shape = \"circle\""), "shape"),
        case("unknown unit", with("fc = 6.0", "fc = \"6 kilo\""), "fc"),
        case("unit of another dimension", with("width = 12.0", "width = \"12 ksi\""), "width"),
        case("not a number", with("fc = 6.0", "fc = \"abc\""), "fc"),
        case("self-intersecting polygon", poly("[[0.0, 0.0], [12.0, 24.0], [12.0, 0.0], [0.0, 24.0]]"), "outline"),
        case("zero-area polygon", poly("[[0.0, 0.0], [6.0, 12.0], [12.0, 24.0]]"), "outline"),
        case(
            "hole outside the outline",
            poly(
                "[[-6.0, 0.0], [6.0, 0.0], [6.0, 24.0], [-6.0, 24.0]]\nholes = [[[20.0, 2.0], [22.0, 2.0], [22.0, 4.0]]]",
            ),
            "holes",
        ),
        case(
            "overlapping holes",
            poly(
                "[[-6.0, 0.0], [6.0, 0.0], [6.0, 24.0], [-6.0, 24.0]]\nholes = [[[-2.0, 10.0], [2.0, 10.0], [2.0, 14.0], [-2.0, 14.0]], [[-1.0, 11.0], [3.0, 11.0], [3.0, 15.0], [-1.0, 15.0]]]",
            ),
            "holes",
        ),
        case("too many vertices", poly(&many), "outline"),
        case(
            "duplicate member ids",
            format!("{}{}", BASE_TEXT.as_str(), &BASE_TEXT[BASE_TEXT.find("[[member]]").unwrap()..]),
            "used twice",
        ),
        case("fse over fpu", with("fse = 160.0", "fse = 280.0"), "fse"),
        case("negative fse", with("fse = 160.0", "fse = -1.0"), "fse"),
        case("absurd count", with("count = 4", "count = 100000"), "count"),
        case("zero count", with("count = 4", "count = 0"), "count"),
        case("fractional count", with("count = 4", "count = 6.5"), "count"),
        Case { name: "empty file", text: Vec::new(), key: "format", position: false },
        Case { name: "binary file", text: b"\x00\x01\x02PDF\xff\xfe".to_vec(), key: "NUL", position: true },
        Case { name: "not UTF-8", text: b"format = 1\ntitle = \"\xff\xfe\"\n".to_vec(), key: "UTF-8", position: true },
        Case { name: "a 50 MB file", text: vec![b'#'; 50 * 1024 * 1024], key: "MiB", position: false },
        case(
            "deeply nested arrays",
            format!("format = 1\nx = {}{}\n", "[".repeat(100_000), "]".repeat(100_000)),
            "recurse",
        ),
        Case {
            name: "deeply nested tables",
            text: format!("format = 1\n{} = 1\n", vec!["a"; 20_000].join(".")).into_bytes(),
            key: "deeply",
            position: false,
        },
        case(
            "deeply nested inline tables",
            format!("format = 1\nx = {}{}\n", "{ a = ".repeat(50_000), "}".repeat(50_000)),
            "recurse",
        ),
        case("no package table", BASE_TEXT.replace("[package]", "[pakage]"), "pakage"),
        case("unknown unit system", with("units = \"us\"", "units = \"imperial\""), "units"),
        case("future format", with("format = 1", "format = 2"), "format"),
        case("impossible date", with("date = 2026-12-01", "date = 2026-13-45"), "date"),
        case("date with a time", with("date = 2026-12-01", "date = 2026-12-01T10:00:00"), "date"),
        case("checker is the preparer", with("name = \"C. Hecker\"", "name = \"p. reparer\""), "checker"),
        case(
            "sign-off dates out of order",
            with("name = \"C. Hecker\"", "name = \"C. Hecker\"\ndate = 2026-11-01"),
            "prepared",
        ),
        case("harped without harp point", with("depth = 21.0", "depth_end = 12.0\ndepth_harp = 21.0"), "harp_x"),
        case(
            "power formula for Grade 250",
            with("fse = 160.0", "fse = 150.0\nfpu = 250.0\nmodel = \"power\""),
            "model",
        ),
        case("a grade no model fits", with("fse = 160.0", "fse = 160.0\nfpu = 240.0"), "fpu"),
        case("non-standard strand without area", with("diameter = 0.5", "diameter = 0.55"), "diameter"),
        case("unknown bar size", with("", "[[member.bars]]\ndepth = 21.0\ncount = 2\nsize = \"#12\"\n"), "size"),
        case("location beyond the span", with("", "[[member.location]]\nname = \"far\"\nx = 400.0\n"), "x"),
        case("negative location", with("", "[[member.location]]\nname = \"neg\"\nx = -1.0\n"), "x"),
        case(
            "duplicate location names",
            with("", "[[member.location]]\nname = \"a\"\nx = 10.0\n[[member.location]]\nname = \"a\"\nx = 20.0\n"),
            "used twice",
        ),
        case("zero topping", with("", "[member.topping]\nthickness = 0.0\nfc = 4.0\n"), "thickness"),
        case("lambda above 1", with("fc = 6.0", "fc = 6.0\nlambda = 1.5"), "lambda"),
        case(
            "revision history out of step",
            with(
                "\n[[member]]",
                "[[package.revisions]]\nrev = \"A\"\ndate = 2026-11-01\ndescription = \"x\"\n\n[[member]]",
            ),
            "revision",
        ),
        case("control character", with("id = \"R-1\"", "id = \"R-1\"\ndescription = \"bell \\u0007\""), "description"),
        case("no strands", BASE_TEXT[..BASE_TEXT.find("[[member.strands]]").unwrap()].to_string(), "strands"),
        case("no demand", with("mu = 120.0\n", ""), "mu"),
        case("jacking above the range", with("fse = 160.0", "jacking = 0.95\nlosses = 30.0"), "jacking"),
        case("losses above the jacking stress", with("fse = 160.0", "losses = 300.0"), "losses"),
        case(
            "strands that do not fit between the voids",
            hc.replace("depth = 21.0", "height = 12.0").replace("\ncount = 4", "\ncount = 40"),
            "height",
        ),
        // 16 in of concrete at the voids' mid-height, in five stretches with room for 27
        // strands of 0.5 in side by side: 28 would straddle the voids' edges (28 x 0.5 in
        // is less than the 16 in in all, which the check once compared)
        case(
            "strands straddling the voids",
            hc.replace("depth = 21.0", "height = 12.0").replace("\ncount = 4", "\ncount = 28"),
            "room for 27",
        ),
        case("unknown paper", with("units = \"us\"", "units = \"us\"\npaper = \"legal\""), "paper"),
        case("unknown code basis", with("units = \"us\"", "units = \"us\"\nbasis = \"ACI 318-14\""), "basis"),
        case(
            "debonding beyond midspan",
            with("fse = 160.0", "fse = 160.0\ndebonded_length = 200.0"),
            "debonded_length",
        ),
        case("overlong id", with("id = \"R-1\"", &format!("id = \"{}\"", "x".repeat(200))), "id"),
        case("too many members", members, "members"),
        case("syntax error", with("fc = 6.0", "fc = = 6.0"), "fc"),
        case("string where a table belongs", with("[member.concrete]\nfc = 6.0", "concrete = \"strong\""), "concrete"),
        // d below the pitch, but the drawn 64-gons reach beyond the circle: they overlap
        case(
            "hollow-core voids touching as drawn",
            hc.replace("void_diameter = 8.0", "void_diameter = 11.995"),
            "between two voids",
        ),
        case(
            "hollow-core void too near the top",
            hc.replace("void_center_height = 12.0", "void_center_height = 19.7"),
            "above the voids",
        ),
        case("text the fonts cannot draw", with("id = \"R-1\"", "id = \"R-1\"\ndescription = \"梁 ก 🏗\""), "U+6881"),
        case("a comment the fonts cannot draw", with("fc = 6.0", "fc = 6.0 # 强度"), "comment"),
        case(
            "bidirectional override",
            with("id = \"R-1\"", "id = \"R-1\"\ndescription = \"abc \\u202E fed\""),
            "U+202E",
        ),
        case(
            "a word too long to wrap",
            with("id = \"R-1\"", &format!("id = \"R-1\"\ndescription = \"{}\"", "w".repeat(40))),
            "without a space",
        ),
        case("an id too long for its cells", with("id = \"R-1\"", "id = \"R-1-second-floor-east\""), "at most 16"),
        case("misspelt key", with("fc = 6.0", "fc = 6.0\nlambd = 1.0"), "did you mean `lambda`"),
        case("strand height above the section", with("depth = 21.0", "height = 30.0"), "height = 30 in"),
        case(
            "location beyond the member",
            with("", "[[member.location]]\nname = \"far\"\nx = 400.0\n"),
            "whose length is 360 in",
        ),
        case(
            "location without a member length",
            with("length = 360.0\n", "").replace("mu = 120.0\n", "")
                + "[[member.location]]\nname = \"a\"\nx = 100.0\nmu = 10.0\n",
            "no length",
        ),
        case(
            "member mu that no location uses",
            with("", "[[member.location]]\nname = \"a\"\nx = 100.0\nmu = 10.0\n"),
            "used by no location",
        ),
        case(
            "second harp point before the first",
            with("depth = 21.0", "depth_end = 12.0\ndepth_harp = 21.0\nharp_x = 150.0\nharp_x2 = 100.0"),
            "harp_x2",
        ),
    ]
}

fn run(args: &[&str], file: &Path) -> (Option<i32>, String) {
    let out = bin().args(args).arg(file).output().unwrap();
    (out.status.code(), String::from_utf8_lossy(&out.stderr).into_owned())
}

/// A quick check needs no sign-offs: a missing "checked" sign-off is a warning, and the
/// package it makes is a DRAFT.
#[test]
fn missing_signoff_warns_and_the_package_is_a_draft() {
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("test.toml");
    std::fs::write(&f, with("role = \"checked\"", "role = \"approved\"")).unwrap();
    for cmd in [&["check"][..], &["trace"][..]] {
        // check prints its warnings under the table, trace on stderr
        let out = bin().args(cmd).arg(&f).output().unwrap();
        let (code, err) = (
            out.status.code(),
            format!("{}{}", String::from_utf8_lossy(&out.stdout), String::from_utf8_lossy(&out.stderr)),
        );
        assert_eq!(code, Some(0), "{cmd:?}: {err}");
        assert!(err.contains("warning") && err.contains("\"checked\"") && err.contains("DRAFT"), "{cmd:?}: {err}");
    }
    // every sign-off given is dated, but there is no checker: still a draft
    let head = HEAD_US.replace("name = \"P. Reparer\"", "name = \"P. Reparer\"\ndate = 2026-11-01").replace(
        "role = \"checked\"\nname = \"C. Hecker\"",
        "role = \"approved\"\nname = \"C. Hecker\"\ndate = 2026-11-02",
    );
    let pkg = parse(&format!("{head}{}", &BASE_TEXT[BASE_TEXT.find("[[member]]").unwrap()..]));
    assert!(pkg.meta.signoffs.iter().all(|s| s.date.is_some()));
    assert!(pkg.meta.is_draft());
}

/// Input that once met friction and is now read: bars by area alone, a harped layer
/// placed by heights, two harp points given.
#[test]
fn friendly_forms_are_read() {
    // bars by area alone: the round bar of that area, and the default says so
    let pkg = parse(&with("", "[[member.bars]]\nheight = 2.0\ncount = 2\narea = 0.31\n"));
    let b = &pkg.members[0].bars[0];
    assert!((b.diameter - (4.0 * 0.31 / std::f64::consts::PI).sqrt()).abs() < 1e-12);
    assert!(pkg.members[0].defaults.iter().any(|d| d.key == "bars.diameter"));
    // a harped layer by heights: the same member as by depths (24 in deep)
    let by_height = parse(&with("depth = 21.0", "height_end = 12.0\nheight_harp = 3.0\nharp_x = 120.0"));
    let by_depth = parse(&with("depth = 21.0", "depth_end = 12.0\ndepth_harp = 21.0\nharp_x = 120.0"));
    assert_eq!(by_height.members[0].strands[0].profile, by_depth.members[0].strands[0].profile);
    // both harp points given, measured from the left end
    let two = parse(&with("depth = 21.0", "depth_end = 12.0\ndepth_harp = 21.0\nharp_x = 120.0\nharp_x2 = 200.0"));
    let prof = two.members[0].strands[0].profile;
    let at = |x: f64| prof.depth_at(Some(strainsheet::input::model::Along { x, length: 360.0 }));
    assert_eq!(at(160.0), 21.0);
    assert!((at(280.0) - (12.0 + 9.0 * 80.0 / 160.0)).abs() < 1e-12);
}

#[test]
fn base_is_valid() {
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("test.toml");
    std::fs::write(&f, BASE_TEXT.as_str()).unwrap();
    let (code, err) = run(&["check"], &f);
    assert_eq!(code, Some(0), "{err}");
}

#[test]
fn hostile_inputs_are_refused_clearly() {
    let cases = cases();
    assert!(cases.len() >= 40);
    let dir = tempfile::tempdir().unwrap();
    let mut failures = Vec::new();
    for c in &cases {
        let f = dir.path().join("test.toml");
        std::fs::write(&f, &c.text).unwrap();
        for cmd in [vec!["check"], vec!["trace"], vec!["check", "--json"]] {
            let (code, err) = run(&cmd, &f);
            let errors = err.lines().filter(|l| l.starts_with("error:")).count();
            let pos_ok = !c.position
                || err
                    .split("test.toml:")
                    .nth(1)
                    .is_some_and(|r| r.chars().next().is_some_and(|ch| ch.is_ascii_digit()));
            if code != Some(2)
                || err.contains("panicked")
                || !err.contains(c.key)
                || errors != 1
                || !pos_ok
                || !err.contains("test.toml")
            {
                failures.push(format!(
                    "{} ({}): exit {code:?}, {errors} messages\n{}",
                    c.name,
                    cmd.join(" "),
                    err.chars().take(600).collect::<String>()
                ));
            }
        }
    }
    assert!(failures.is_empty(), "{} failures:\n\n{}", failures.len(), failures.join("\n\n"));
}

#[test]
fn refused_inputs_leave_no_files() {
    let dir = tempfile::tempdir().unwrap();
    for c in cases().iter().filter(|c| c.text.len() < 1_000_000).take(20) {
        let f = dir.path().join("test.toml");
        std::fs::write(&f, &c.text).unwrap();
        let out = dir.path().join("out.pdf");
        let o = bin().args(["report", f.to_str().unwrap(), "-o", out.to_str().unwrap()]).output().unwrap();
        assert_eq!(o.status.code(), Some(2), "{}", c.name);
        let left: Vec<_> = std::fs::read_dir(dir.path())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .filter(|n| n != "test.toml")
            .collect();
        assert!(left.is_empty(), "{}: left {left:?}", c.name);
    }
}

#[test]
fn errors_point_at_the_offending_value() {
    let dir = tempfile::tempdir().unwrap();
    let f = dir.path().join("test.toml");
    std::fs::write(&f, with("fse = 160.0", "fse = 280.0")).unwrap();
    let (_, err) = run(&["check"], &f);
    let line = BASE_TEXT.lines().position(|l| l == "fse = 160.0").unwrap() + 1;
    assert!(
        err.contains(&format!("test.toml:{line}:7: member[1].strands[1].fse: fse = 280 ksi is out of range")),
        "{err}"
    );
    assert!(err.contains("allowed: 0 <= fse < fpu = 270 ksi"), "{err}");
    assert!(err.contains("^^^^^"), "{err}");
}

/// The quick reading of the input (toml-spanner) decides only what the toml crate reads
/// the same way: on every hostile input, example, starter and form of TOML it either
/// gives the toml crate's value or gives up (and the toml crate's message is shown).
#[test]
fn quick_reading_agrees_with_the_toml_crate() {
    use strainsheet::input::schema::File;
    let mut texts: Vec<(String, String)> = Vec::new();
    for c in cases() {
        if let Ok(t) = String::from_utf8(c.text) {
            texts.push((c.name.to_string(), t));
        }
    }
    texts.push(("base".into(), BASE_TEXT.clone()));
    let examples = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    for e in std::fs::read_dir(examples).unwrap().flatten() {
        if e.path().extension().is_some_and(|x| x == "toml") {
            texts.push((e.path().display().to_string(), std::fs::read_to_string(e.path()).unwrap()));
        }
    }
    texts.push(("starter us".into(), strainsheet::starter::US.to_string()));
    texts.push(("starter si".into(), strainsheet::starter::SI.to_string()));
    // the forms of TOML a hand-written package may use
    let head = "format = 1\n[package]\ntitle = \"T\"\nproject = \"P\"\nrevision = \"A\"\nunits = \"us\"\n";
    for (name, extra) in [
        ("local date", "date = 2026-11-30\n"),
        ("offset datetime", "date = 2026-11-30T08:00:00Z\n"),
        ("local datetime", "date = 2026-11-30T08:00:00\n"),
        ("local time", "date = 08:00:00\n"),
        ("fractional seconds", "date = 2026-11-30T08:00:00.123456789+01:30\n"),
        ("time without seconds", "date = 2026-11-30T08:00\n"),
        ("space for T", "date = 2026-11-30 08:00:00.5Z\n"),
        ("literal and multi-line strings", "title2 = 'x'\n"),
        ("integer forms", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 1_200\nmu = 0x10\n"),
        ("floats", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 1.5e2\nmu = -0.0\n"),
        ("special floats", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = inf\nmu = nan\n"),
        ("huge integer", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 99999999999999999999\n"),
        ("inline tables", "date = 2026-11-30\n[[member]]\nid = 'a'\nconcrete = { fc = 5.0 }\n"),
        ("dotted keys", "date = 2026-11-30\n[[member]]\nid = 'a'\nconcrete.fc = 5.0\n"),
        ("unit strings", "date = 2026-11-30\n[[member]]\nid = \"a\"\nlength = \"30 ft\"\n"),
        ("duplicate key", "date = 2026-11-30\ndate = 2026-11-30\n"),
        ("unknown key", "date = 2026-11-30\ncolour = 'red'\n"),
        ("wrong type", "date = 'yesterday'\n"),
        (
            "outline",
            "date = 2026-11-30\n[[member]]\nid = 'a'\n[member.section]\nshape = 'polygon'\noutline = [[0, 0], [1.5, 0], [1, 2]]\n",
        ),
        ("table redefined", "date = 2026-11-30\n[package]\n"),
        ("escapes", "date = 2026-11-30\nclient = \"\\u00e9\\t\\\"x\\\"\"\n"),
        (
            "multi-line strings",
            "date = 2026-11-30\nnotes = \"\"\"\n  first \\\n  second\n\"\"\"\nclient = \'\'\'\nraw \\n\'\'\'\n",
        ),
        ("windows line ends", "date = 2026-11-30\r\nnotes = \"\"\"\r\na\r\nb\"\"\"\r\n"),
        ("comments and blank lines", "date = 2026-11-30 # the day\n\n# end\n"),
    ] {
        texts.push((name.to_string(), format!("{head}{extra}")));
    }
    let decided = texts.iter().filter(|(name, text)| quick_agrees::<File>(name, text)).count();
    // well-formed TOML with bad values, and every valid package, is read the same both ways
    assert!(decided >= 40, "only {decided} of {} decided quickly", texts.len());
}

/// Runs the program, failing (not hanging) if it has not ended within `secs`.
fn run_within(args: &[&std::ffi::OsStr], secs: u64) -> (Option<i32>, String) {
    let mut child = bin()
        .args(args)
        .stdin(std::process::Stdio::null())
        .stdout(std::process::Stdio::piped())
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    let start = std::time::Instant::now();
    loop {
        if child.try_wait().unwrap().is_some() {
            break;
        }
        if start.elapsed() > std::time::Duration::from_secs(secs) {
            let _ = child.kill();
            let _ = child.wait();
            panic!("{:?} did not end within {secs} s (blocked or reading without end)", args);
        }
        std::thread::sleep(std::time::Duration::from_millis(20));
    }
    let out = child.wait_with_output().unwrap();
    (out.status.code(), format!("{}{}", String::from_utf8_lossy(&out.stdout), String::from_utf8_lossy(&out.stderr)))
}

/// `verify`, `diff` and `sign` (its package and its key), and `verify --pubkey`, given a
/// named pipe or an endless device: each refuses at once, naming the file and why.
#[cfg(target_os = "linux")]
#[test]
fn integrity_commands_refuse_pipes_and_devices_at_once() {
    use std::ffi::OsStr;
    let dir = tempfile::tempdir().unwrap();
    let fifo = dir.path().join("pipe.pdf");
    let c = std::ffi::CString::new(fifo.to_str().unwrap()).unwrap();
    // SAFETY: mkfifo reads the NUL-terminated path.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
    let toml = dir.path().join("pipe.toml");
    let c = std::ffi::CString::new(toml.to_str().unwrap()).unwrap();
    // SAFETY: as above.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
    // a real package and a key, to reach the key and signature reads
    let pdf = dir.path().join("real.pdf");
    let o = bin()
        .args(["report", example("inverted-tee-girder.toml").to_str().unwrap(), "-o", pdf.to_str().unwrap()])
        .output()
        .unwrap();
    assert!(matches!(o.status.code(), Some(0 | 3)), "{}", String::from_utf8_lossy(&o.stderr));
    let key = dir.path().join("k");
    assert!(
        bin()
            .args(["keygen", "-o", key.to_str().unwrap(), "--name", "N", "--license", "L"])
            .output()
            .unwrap()
            .status
            .success()
    );
    let zero = Path::new("/dev/zero");
    let (p, k, z, f, t) = (pdf.as_os_str(), key.as_os_str(), zero.as_os_str(), fifo.as_os_str(), toml.as_os_str());
    let os = OsStr::new;
    let cases: Vec<(Vec<&OsStr>, Option<i32>, &str, &str)> = vec![
        (vec![os("verify"), f], Some(2), "pipe.pdf", "named pipe"),
        (vec![os("verify"), z], Some(2), "/dev/zero", "character device"),
        (vec![os("diff"), f, p], Some(2), "pipe.pdf", "named pipe"),
        (vec![os("diff"), p, z], Some(2), "/dev/zero", "character device"),
        (vec![os("diff"), t, p], Some(2), "pipe.toml", "named pipe"),
        (vec![os("sign"), f, os("--key"), k], Some(2), "pipe.pdf", "named pipe"),
        (vec![os("sign"), p, os("--key"), f], Some(2), "pipe.pdf", "named pipe"),
        (vec![os("sign"), p, os("--key"), z], Some(2), "/dev/zero", "character device"),
        (vec![os("verify"), p, os("--pubkey"), f], Some(1), "pipe.pdf", "named pipe"),
        (vec![os("verify"), p, os("--pubkey"), z], Some(1), "/dev/zero", "character device"),
    ];
    // a real signature, so that verify --pubkey reaches the key
    let o = bin().args(["sign", pdf.to_str().unwrap(), "--key", key.to_str().unwrap()]).output().unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let mut failures = Vec::new();
    for (args, code, name, why) in &cases {
        let (got, out) = run_within(args, 60);
        if got != *code || !out.contains(name) || !out.contains(why) || out.contains("panicked") {
            failures.push(format!("{args:?}: exit {got:?}\n{out}"));
        }
    }
    // a signature file that is a pipe, read by verify --pubkey
    let sig = dir.path().join("real.pdf.sig");
    std::fs::remove_file(&sig).unwrap();
    let c = std::ffi::CString::new(sig.to_str().unwrap()).unwrap();
    // SAFETY: as above.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
    let pubkey = dir.path().join("k.pub");
    let (got, out) = run_within(&[os("verify"), p, os("--pubkey"), pubkey.as_os_str()], 60);
    if got != Some(1) || !out.contains("real.pdf.sig") || !out.contains("named pipe") {
        failures.push(format!("signature file a pipe: exit {got:?}\n{out}"));
    }
    // a sidecar that is a pipe is not read: the check is not run, and says why
    std::fs::remove_file(&sig).unwrap();
    let side = dir.path().join("real.pdf.sha256");
    std::fs::remove_file(&side).unwrap();
    let c = std::ffi::CString::new(side.to_str().unwrap()).unwrap();
    // SAFETY: as above.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
    let (got, out) = run_within(&[os("verify"), p], 60);
    if got != Some(0) || !out.contains("[--  ] sidecar") || !out.contains("named pipe") {
        failures.push(format!("sidecar a pipe: exit {got:?}\n{out}"));
    }
    // a socket where the package should be
    let sock = dir.path().join("sock.pdf");
    let _listener = std::os::unix::net::UnixListener::bind(&sock).unwrap();
    let (got, out) = run_within(&[os("verify"), sock.as_os_str()], 60);
    if got != Some(2) || !out.contains("sock.pdf") || !out.contains("a socket") {
        failures.push(format!("a socket: exit {got:?}\n{out}"));
    }
    assert!(failures.is_empty(), "{}", failures.join("\n\n"));
}

/// The bounded reader itself: a pipe with no writer is refused at once (a thread and a
/// deadline make a regression fail, not hang), and so is an endless device.
#[cfg(target_os = "linux")]
#[test]
fn the_reader_refuses_a_pipe_without_waiting() {
    let dir = tempfile::tempdir().unwrap();
    let fifo = dir.path().join("p");
    let c = std::ffi::CString::new(fifo.to_str().unwrap()).unwrap();
    // SAFETY: mkfifo reads the NUL-terminated path.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
    let (tx, rx) = std::sync::mpsc::channel();
    let f = fifo.clone();
    std::thread::spawn(move || {
        let a = strainsheet::integrity::files::read_regular(&f, 1024, "the file").map(|b| b.len());
        let b = strainsheet::integrity::files::read_regular(Path::new("/dev/zero"), 1024, "the file").map(|b| b.len());
        let _ = tx.send((a.map_err(|e| e.to_string()), b.map_err(|e| e.to_string())));
    });
    let (a, b) = rx.recv_timeout(std::time::Duration::from_secs(20)).expect("the reader blocked on a pipe or a device");
    assert!(a.as_ref().is_err_and(|e| e.contains("named pipe") && e.contains("regular file")), "{a:?}");
    assert!(b.as_ref().is_err_and(|e| e.contains("character device")), "{b:?}");
}

/// A polygon section at the documented limits (a 2,000-point outline and holes of
/// 3,000 points in all, their bounding boxes overlapping) is checked in well under a
/// second here; one point more in all is refused.
#[test]
fn a_polygon_at_the_limits_is_checked_quickly() {
    let ring = |pts: Vec<(f64, f64)>| {
        format!("[{}]", pts.iter().map(|(x, y)| format!("[{x:.6}, {y:.6}]")).collect::<Vec<_>>().join(", "))
    };
    let outline: Vec<(f64, f64)> = (0..2000)
        .map(|k| {
            let a = k as f64 / 2000.0 * std::f64::consts::TAU;
            (100.0 * a.cos(), 100.0 + 100.0 * a.sin())
        })
        .collect();
    // ten thin parallel stripes on the diagonal, 300 points each
    let c = std::f64::consts::FRAC_1_SQRT_2;
    let stripes: Vec<String> = (0..10)
        .map(|h| {
            let off = (h as f64 - 4.5) * 8.0;
            let mut pts = Vec::new();
            for k in 0..150 {
                pts.push((-40.0 + 80.0 * k as f64 / 149.0, -1.0));
            }
            for k in 0..150 {
                pts.push((40.0 - 80.0 * k as f64 / 149.0, 1.0));
            }
            ring(pts.into_iter().map(|(t, n)| (t * c - (n + off) * c, t * c + (n + off) * c + 100.0)).collect())
        })
        .collect();
    let section = |holes: &[String]| {
        format!(
            "{HEAD_US}[[member]]\nid = \"P\"\nmu = 10.0\n[member.concrete]\nfc = 6.0\n[member.section]\nshape = \"polygon\"\noutline = {}\nholes = [{}]\n[[member.strands]]\nheight = 2.0\ncount = 4\ndiameter = 0.5\nfse = 160.0\n",
            ring(outline.clone()),
            holes.join(", ")
        )
    };
    let started = std::time::Instant::now();
    let pkg = parse(&section(&stripes));
    strainsheet::analysis::analyze(&pkg, false).unwrap();
    assert!(started.elapsed().as_secs_f64() < 5.0, "{:?}", started.elapsed());
    let mut more = stripes.clone();
    more.push("[[0.0, 190.0], [1.0, 190.0], [0.5, 191.0]]".into());
    assert!(parse_err(&section(&more)).contains("at most 5000 points"));
}
