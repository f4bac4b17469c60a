//! Rendering is sandboxed: a template folder can read only itself, the fonts and the
//! package's data; it must hold the three entries and keep their contracts; links in it,
//! warnings and runaway templates are refused or stopped.

mod common;
use common::*;
use std::path::Path;

/// The three entry templates a folder must hold, each as small as it may be: the front
/// and back matter with the anchor where the back matter begins, a run of members, and
/// one page per sheet for the numbers.
const MINIMAL: [(&str, &str); 3] = [
    ("package.typ", "Front\n#pagebreak()\n#metadata(\"toc:summary\") <toc:summary>\nBack\n"),
    ("members.typ", "#for m in json(\"view.json\").members [#m.id #pagebreak(weak: true)]\n"),
    ("sheet-numbers.typ", "#for _ in range(json(\"view.json\").sheet_numbers.total - 1) { pagebreak() }\n"),
];

/// A template folder of the minimal templates with `entry` holding `text` instead.
fn template_dir_with(entry: &str, text: &str) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    for (name, minimal) in MINIMAL {
        std::fs::write(dir.path().join(name), if name == entry { text } else { minimal }).unwrap();
    }
    dir
}

fn template_dir(main: &str) -> tempfile::TempDir {
    template_dir_with("package.typ", main)
}

fn report_with(templates: &Path, out: &Path) -> (Option<i32>, String) {
    let o = bin()
        .args([
            "report",
            example("hollow-core-plank.toml").to_str().unwrap(),
            "-o",
            out.to_str().unwrap(),
            "--templates",
            templates.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

#[test]
fn a_template_cannot_read_outside_its_folder() {
    let outside = tempfile::tempdir().unwrap();
    let secret = outside.path().join("secret.txt");
    std::fs::write(&secret, "top secret").unwrap();
    let attempts = [
        r#"#read("/etc/passwd")"#.to_string(),
        r#"#read("../secret.txt")"#.to_string(),
        format!("#read({:?})", secret.to_str().unwrap()),
        r#"#include "/etc/passwd""#.to_string(),
        r#"#import "../x.typ": *"#.to_string(),
        r#"#image("/etc/hostname")"#.to_string(),
        r#"#json("/etc/passwd")"#.to_string(),
        r#"#read("../../../../../../etc/passwd")"#.to_string(),
        r#"#read("/proc/self/environ")"#.to_string(),
    ];
    // every entry template runs in the same sandbox
    for (entry, _) in MINIMAL {
        for a in &attempts {
            let dir = template_dir_with(entry, &format!("{a}\n"));
            let out = outside.path().join("out.pdf");
            let (code, err) = report_with(dir.path(), &out);
            assert_eq!(code, Some(2), "{entry}: {a}: {err}");
            assert!(
                err.contains(&format!("{entry}:1")),
                "{entry}: {a}: the error does not point at the template: {err}"
            );
            assert!(!err.contains("top secret") && !err.contains("root:"), "{entry}: {a}: leaked");
            assert!(!out.exists(), "{entry}: {a}: wrote a file");
        }
    }
    // the package's own data is readable
    let dir = template_dir(
        "#set document(date: datetime(year: 2026, month: 1, day: 1))\n#pdf.attach(\"payload.json\", relationship: \"data\", mime-type: \"application/json\", description: \"p\")\n#json(\"view.json\").package.project\n#pagebreak()\n#metadata(\"toc:summary\") <toc:summary>\n",
    );
    let out = outside.path().join("ok.pdf");
    let (code, err) = report_with(dir.path(), &out);
    assert!(matches!(code, Some(0 | 3)), "{err}");
    let text = pdf_text(&std::fs::read(&out).unwrap(), None);
    assert!(text.contains("Saltmarsh Quay Residences"), "{text}");
}

#[test]
fn a_template_folder_needs_the_three_entries() {
    let dir = template_dir("Hello\n");
    std::fs::remove_file(dir.path().join("sheet-numbers.typ")).unwrap();
    let out = dir.path().join("out.pdf");
    let (code, err) = report_with(dir.path(), &out);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("no sheet-numbers.typ") && err.contains("members.typ"), "{err}");
    assert!(!out.exists());
}

#[test]
fn a_template_folder_of_the_old_names_is_told_the_new_ones() {
    let dir = template_dir("Hello\n");
    std::fs::rename(dir.path().join("sheet-numbers.typ"), dir.path().join("stamps.typ")).unwrap();
    let out = dir.path().join("out.pdf");
    let (code, err) = report_with(dir.path(), &out);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("stamps.typ is now called sheet-numbers.typ"), "{err}");
    assert!(!out.exists());
}

#[test]
fn the_entries_must_keep_their_contract() {
    // no anchor where the back matter begins
    let dir = template_dir("Hello\n");
    let (code, err) = report_with(dir.path(), &dir.path().join("a.pdf"));
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("toc:summary"), "{err}");
    // one page of numbers too few
    let dir = template_dir_with(
        "sheet-numbers.typ",
        "#for _ in range(json(\"view.json\").sheet_numbers.total - 2) { pagebreak() }\n",
    );
    let (code, err) = report_with(dir.path(), &dir.path().join("b.pdf"));
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("sheet-numbers.typ made") && err.contains("one per sheet"), "{err}");
}

#[cfg(unix)]
#[test]
fn links_in_a_template_folder_are_refused() {
    let outside = tempfile::tempdir().unwrap();
    std::fs::write(outside.path().join("x.typ"), "x").unwrap();
    let dir = template_dir("#include \"x.typ\"\n");
    std::os::unix::fs::symlink(outside.path().join("x.typ"), dir.path().join("x.typ")).unwrap();
    let (code, err) = report_with(dir.path(), &outside.path().join("out.pdf"));
    assert_eq!(code, Some(2));
    assert!(err.contains("link"), "{err}");
}

#[test]
fn a_template_warning_is_an_error() {
    let dir = template_dir("#set text(font: \"No Such Font\")\nHello\n");
    let out = dir.path().join("out.pdf");
    let (code, err) = report_with(dir.path(), &out);
    assert_eq!(code, Some(2));
    assert!(err.contains("warning"), "{err}");
    assert!(!out.exists());
}

/// A template folder that loops without end, or doubles a string until memory runs out,
/// is stopped at the bound given, with a message naming the folder; nothing is written.
#[test]
fn a_runaway_template_is_stopped_at_its_bounds() {
    let outside = tempfile::tempdir().unwrap();
    let cases = [
        (
            "--time-limit",
            "3",
            "#for i in range(100000) { for j in range(100000) { let k = i + j } }\n",
            "did not finish within 3 s",
        ),
        ("--memory-limit", "400", "#let s = \"x\"\n#for i in range(40) { s = s + s }\n#s.len()\n", "beyond 400 MB"),
    ];
    for (flag, value, text, said) in cases {
        let dir = template_dir(text);
        let out = outside.path().join("runaway.pdf");
        let started = std::time::Instant::now();
        let o = bin()
            .args(["report", example("hollow-core-plank.toml").to_str().unwrap(), "-o", out.to_str().unwrap()])
            .args(["--templates", dir.path().to_str().unwrap(), flag, value])
            .output()
            .unwrap();
        let err = String::from_utf8_lossy(&o.stderr);
        assert_eq!(o.status.code(), Some(2), "{flag}: {err}");
        assert!(err.contains(said) && err.contains(dir.path().to_str().unwrap()), "{flag}: {err}");
        assert!(started.elapsed().as_secs() < 60, "{flag}: {:?}", started.elapsed());
        assert!(!out.exists());
    }
}
