//! Integrity for review and archive: `verify` accepts the intact file and rejects every
//! kind of change (the tamper matrix); file signatures; `diff`.

mod common;
use common::*;
use lopdf::{Document, Object};
use std::path::{Path, PathBuf};

struct Issued {
    _dir: tempfile::TempDir,
    pdf: PathBuf,
}

fn issue(example_name: &str) -> Issued {
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("pkg.pdf");
    let out =
        bin().args(["report", example(example_name).to_str().unwrap(), "-o", pdf.to_str().unwrap()]).output().unwrap();
    assert!(matches!(out.status.code(), Some(0 | 1 | 3)), "{}", String::from_utf8_lossy(&out.stderr));
    Issued { _dir: dir, pdf }
}

fn verify(path: &Path, extra: &[&str]) -> (i32, String) {
    let out = bin().arg("verify").arg(path).args(extra).output().unwrap();
    (
        out.status.code().unwrap_or(-1),
        format!("{}{}", String::from_utf8_lossy(&out.stdout), String::from_utf8_lossy(&out.stderr)),
    )
}

/// A tampered copy in its own folder (no sidecar, so only the file itself is judged).
fn tampered(bytes: &[u8]) -> (tempfile::TempDir, PathBuf) {
    let dir = tempfile::tempdir().unwrap();
    let p = dir.path().join("copy.pdf");
    std::fs::write(&p, bytes).unwrap();
    (dir, p)
}

#[test]
fn intact_package_verifies() {
    let i = issue("hollow-core-plank.toml");
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("byte-identical") && out.contains("sidecar"), "{out}");
}

#[test]
fn tamper_matrix_is_rejected() {
    let i = issue("hollow-core-plank.toml");
    let good = std::fs::read(&i.pdf).unwrap();
    let mut cases: Vec<(String, Vec<u8>)> = Vec::new();
    // a flipped byte at offsets spread over the whole file
    for k in 0..24 {
        let at = if k == 0 { 9 } else { good.len() * k / 24 + 7 };
        let mut b = good.clone();
        b[at] ^= 0x20;
        cases.push((format!("byte {at} flipped"), b));
    }
    let mut last = good.clone();
    *last.last_mut().unwrap() ^= 0x01;
    cases.push(("last byte flipped".into(), last));
    cases.push(("truncated by half".into(), good[..good.len() / 2].to_vec()));
    cases.push(("truncated by one byte".into(), good[..good.len() - 1].to_vec()));
    cases.push(("appended bytes".into(), [good.as_slice(), b"\n% appended comment\n"].concat()));
    // an incremental update that changes the document title
    {
        let doc = Document::load_mem(&good).unwrap();
        let info_id = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
        let startxref = good.len();
        let prev = {
            let s = String::from_utf8_lossy(&good);
            let i = s.rfind("startxref").unwrap();
            s[i + 9..].split_whitespace().next().unwrap().to_string()
        };
        let obj = format!("{} {} obj\n<< /Title (Changed) >>\nendobj\n", info_id.0, info_id.1);
        let xref_at = startxref + obj.len();
        let upd = format!(
            "{obj}xref\n{} 1\n{:010} {:05} n \ntrailer\n<< /Size {} /Prev {prev} /Root {} 0 R /Info {} 0 R >>\nstartxref\n{xref_at}\n%%EOF\n",
            info_id.0,
            startxref,
            info_id.1,
            doc.max_id + 1,
            doc.trailer.get(b"Root").unwrap().as_reference().unwrap().0,
            info_id.0
        );
        cases.push(("incremental update".into(), [good.as_slice(), upd.as_bytes()].concat()));
    }
    // a re-saved copy (same content, written again by another PDF library)
    {
        let mut doc = Document::load_mem(&good).unwrap();
        let mut b = Vec::new();
        doc.save_to(&mut b).unwrap();
        cases.push(("re-saved copy".into(), b));
    }
    // edited metadata
    {
        let mut doc = Document::load_mem(&good).unwrap();
        let info_id = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
        doc.get_dictionary_mut(info_id).unwrap().set("Author", Object::string_literal("Someone Else"));
        let mut b = Vec::new();
        doc.save_to(&mut b).unwrap();
        cases.push(("edited author".into(), b));
    }
    // an edited attachment: one result changed in the payload
    {
        let mut doc = Document::load_mem(&good).unwrap();
        let id = find_attachment_stream(&doc, "payload.json");
        let stream = doc.get_object_mut(id).unwrap().as_stream_mut().unwrap();
        let text = String::from_utf8(stream.decompressed_content().unwrap()).unwrap();
        let edited = text.replacen("\"pass\":false", "\"pass\":true", 1).replacen("\"ratio\":0.", "\"ratio\":0.1", 1);
        assert_ne!(edited, text);
        stream.set_plain_content(edited.into_bytes());
        let mut b = Vec::new();
        doc.save_to(&mut b).unwrap();
        cases.push(("edited payload attachment".into(), b));
    }
    // an edited input attachment
    {
        let mut doc = Document::load_mem(&good).unwrap();
        let id = find_attachment_stream(&doc, "input.toml");
        let stream = doc.get_object_mut(id).unwrap().as_stream_mut().unwrap();
        let text = String::from_utf8(stream.decompressed_content().unwrap()).unwrap();
        let edited = text.replacen("fc = 45.0", "fc = 55.0", 1);
        assert_ne!(edited, text);
        stream.set_plain_content(edited.into_bytes());
        let mut b = Vec::new();
        doc.save_to(&mut b).unwrap();
        cases.push(("edited input attachment".into(), b));
    }
    for (what, bytes) in &cases {
        let (_d, p) = tampered(bytes);
        let (code, out) = verify(&p, &[]);
        assert!(code == 1 || code == 2, "{what}: accepted (exit {code})\n{out}");
        assert!(
            out.contains("FAIL") || out.contains("not a strainsheet package") || out.contains("cannot be read"),
            "{what}: no reason given\n{out}"
        );
    }
    // the original still verifies
    assert_eq!(verify(&i.pdf, &[]).0, 0);
}

fn find_attachment_stream(doc: &Document, name: &str) -> lopdf::ObjectId {
    let catalog = doc.catalog().unwrap();
    let names = catalog.get_deref(b"Names", doc).unwrap().as_dict().unwrap();
    let tree = names.get_deref(b"EmbeddedFiles", doc).unwrap().as_dict().unwrap();
    let arr = tree.get(b"Names").unwrap().as_array().unwrap();
    for pair in arr.chunks(2) {
        if let Object::String(n, _) = &pair[0]
            && n == name.as_bytes()
        {
            let spec = doc.dereference(&pair[1]).unwrap().1.as_dict().unwrap();
            return spec.get(b"EF").unwrap().as_dict().unwrap().get(b"F").unwrap().as_reference().unwrap();
        }
    }
    panic!("no attachment {name}");
}

#[test]
fn foreign_and_empty_files_are_not_packages() {
    let dir = tempfile::tempdir().unwrap();
    let empty = dir.path().join("empty.pdf");
    std::fs::write(&empty, b"").unwrap();
    assert_eq!(verify(&empty, &[]).0, 2);
    let text = dir.path().join("notes.pdf");
    std::fs::write(&text, b"hello, this is not a PDF").unwrap();
    assert_eq!(verify(&text, &[]).0, 2);
    // a PDF made by another program: no attached payload
    let mut doc = Document::with_version("1.7");
    let pages_id = doc.new_object_id();
    let page_id = doc.add_object(lopdf::dictionary! { "Type" => "Page", "Parent" => pages_id, "MediaBox" => vec![0.into(), 0.into(), 612.into(), 792.into()] });
    doc.objects.insert(
        pages_id,
        Object::Dictionary(lopdf::dictionary! { "Type" => "Pages", "Kids" => vec![page_id.into()], "Count" => 1 }),
    );
    let catalog = doc.add_object(lopdf::dictionary! { "Type" => "Catalog", "Pages" => pages_id });
    doc.trailer.set("Root", catalog);
    let foreign = dir.path().join("foreign.pdf");
    doc.save(&foreign).unwrap();
    let (code, out) = verify(&foreign, &[]);
    assert_eq!(code, 2, "{out}");
    assert!(out.contains("not a strainsheet package"), "{out}");
    assert_eq!(verify(&dir.path().join("missing.pdf"), &[]).0, 2);
}

/// The sidecar holds the file hash (PDF) of the file it names. One that records the
/// hash of another PDF of this name (left from an earlier issue, or an interrupted
/// write) while the file itself re-renders byte for byte belongs to another file: it is
/// said so, and the package is not called CHANGED; one that names another file likewise.
/// A changed file beside its own sidecar fails both.
#[test]
fn a_sidecar_of_another_file_is_named_as_such() {
    let i = issue("hollow-core-plank.toml");
    let side = PathBuf::from(format!("{}.sha256", i.pdf.display()));
    let own = std::fs::read_to_string(&side).unwrap();
    // the sidecar of another PDF of this name
    std::fs::write(&side, format!("{}  pkg.pdf\n", "0".repeat(64))).unwrap();
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("[--  ] sidecar") && out.contains("belongs to another PDF of this name"), "{out}");
    assert!(!out.contains("CHANGED") && out.contains("belongs to another file"), "{out}");
    // a sidecar naming another file
    std::fs::write(&side, format!("{}  other.pdf\n", "1".repeat(64))).unwrap();
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("belongs to another file: it names \"other.pdf\""), "{out}");
    // its own sidecar, saved with a CR LF line end
    std::fs::write(&side, own.replace('\n', "\r\n")).unwrap();
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("[ok  ] sidecar file hash (PDF)") && !out.contains("renamed"), "{out}");
    // its own sidecar beside a renamed copy: the hash matches, the name is noted
    let copy = i.pdf.with_file_name("renamed.pdf");
    std::fs::copy(&i.pdf, &copy).unwrap();
    std::fs::write(format!("{}.sha256", copy.display()), &own).unwrap();
    let (code, out) = verify(&copy, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("[ok  ] sidecar") && out.contains("renamed"), "{out}");
    // a changed file beside its own sidecar
    let mut bytes = std::fs::read(&i.pdf).unwrap();
    let at = bytes.len() / 2;
    bytes[at] ^= 0x20;
    std::fs::write(&i.pdf, &bytes).unwrap();
    std::fs::write(&side, &own).unwrap();
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 1, "{out}");
    assert!(out.contains("[FAIL] sidecar file hash (PDF)") && out.contains("CHANGED"), "{out}");
}

/// The library's writer, interrupted between its steps (simulated by looking at the
/// folder at each step): with --overwrite the old sidecar goes first, then the new PDF
/// comes, then its sidecar, so no step leaves a new PDF beside the old sidecar, and what
/// an interrupt would say at each step is true. An old sidecar beside a new PDF (as an
/// earlier version could leave) is named as another file's by verify, not CHANGED.
#[test]
fn an_interrupted_overwrite_never_pairs_a_file_with_another_sidecar() {
    use strainsheet::output;
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("pkg.pdf");
    let side = dir.path().join("pkg.pdf.sha256");
    let (_, old) = render_example("hollow-core-plank.toml");
    let (_, new) = render_example("inverted-tee-girder.toml");
    let pair = |r: &strainsheet::report::Rendered| {
        vec![
            (pdf.clone(), r.pdf.clone()),
            (side.clone(), strainsheet::integrity::sidecar::line(&r.pdf, "pkg.pdf").into_bytes()),
        ]
    };
    output::write_all(&pair(&old), false).unwrap();
    let mut seen: Vec<(PathBuf, Option<Vec<u8>>, bool, String)> = Vec::new();
    output::write_all_observed(&pair(&new), true, &mut |changed, said| {
        seen.push((changed.to_path_buf(), std::fs::read(&pdf).ok(), side.exists(), said.to_string()));
    })
    .unwrap();
    assert_eq!(seen.len(), 3, "{:?}", seen.iter().map(|s| (&s.0, &s.3)).collect::<Vec<_>>());
    // 1. the old sidecar removed; the old PDF as it was
    assert_eq!(seen[0].0, side);
    assert_eq!(seen[0].1.as_deref(), Some(old.pdf.as_slice()));
    assert!(!seen[0].2);
    assert!(seen[0].3.contains("nothing new was written") && seen[0].3.contains("is as it was"), "{}", seen[0].3);
    // 2. the new PDF placed, no sidecar yet
    assert_eq!(seen[1].0, pdf);
    assert_eq!(seen[1].1.as_deref(), Some(new.pdf.as_slice()));
    assert!(!seen[1].2, "a sidecar was beside the new PDF before its own was written");
    assert!(seen[1].3.contains("pkg.pdf written, but not") && seen[1].3.contains("none exists now"), "{}", seen[1].3);
    // 3. its sidecar
    assert_eq!(seen[2].0, side);
    assert!(seen[2].2 && seen[2].3.ends_with("written"), "{}", seen[2].3);
    assert_eq!(std::fs::read_to_string(&side).unwrap(), strainsheet::integrity::sidecar::line(&new.pdf, "pkg.pdf"));
    let left: Vec<String> =
        std::fs::read_dir(dir.path()).unwrap().map(|e| e.unwrap().file_name().to_string_lossy().into_owned()).collect();
    assert_eq!(left.len(), 2, "{left:?}");
    // without --overwrite an interrupt removes what was placed: nothing is written
    let other = dir.path().join("fresh.pdf");
    let mut said = Vec::new();
    output::write_all_observed(&[(other.clone(), b"x".to_vec())], false, &mut |_, s| said.push(s.to_string())).unwrap();
    assert_eq!(said, ["nothing was written"]);
    // the state an earlier version could leave: the new PDF beside the old sidecar
    std::fs::write(&side, strainsheet::integrity::sidecar::line(&old.pdf, "pkg.pdf")).unwrap();
    let (code, out) = verify(&pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("belongs to another PDF of this name") && !out.contains("CHANGED"), "{out}");
}

/// A copy of a package whose payload says another version made it (the content hash in
/// the metadata made to match), with `edit` applied to the document first.
fn other_version_copy(good: &[u8], version: &str, edit: impl FnOnce(&mut Document)) -> Vec<u8> {
    let mut doc = Document::load_mem(good).unwrap();
    edit(&mut doc);
    let id = find_attachment_stream(&doc, "payload.json");
    let stream = doc.get_object_mut(id).unwrap().as_stream_mut().unwrap();
    let text = String::from_utf8(stream.decompressed_content().unwrap()).unwrap();
    let edited = text.replacen(
        &format!("\"version\":\"{}\"", env!("CARGO_PKG_VERSION")),
        &format!("\"version\":\"{version}\""),
        1,
    );
    assert_ne!(edited, text);
    let new_hash = strainsheet::integrity::sha256_hex(edited.as_bytes());
    stream.set_plain_content(edited.into_bytes());
    let info_id = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
    doc.get_dictionary_mut(info_id)
        .unwrap()
        .set("Keywords", Object::string_literal(format!("strainsheet, content-sha256:{new_hash}")));
    let mut b = Vec::new();
    doc.save_to(&mut b).unwrap();
    b
}

#[test]
fn other_version_is_exit_3_not_verified() {
    let i = issue("hollow-core-plank.toml");
    let good = std::fs::read(&i.pdf).unwrap();
    let b = other_version_copy(&good, "0.0.1", |_| {});
    let (_d, p) = tampered(&b);
    let (code, out) = verify(&p, &[]);
    assert_eq!(code, 3, "{out}");
    assert!(
        out.contains("[ok  ] content hash (payload)")
            && out.contains("[ok  ] re-analysis")
            && out.contains("version 0.0.1"),
        "{out}"
    );
    assert!(out.contains("NOT VERIFIED") && out.contains("not compared") && !out.contains("intact"), "{out}");
    assert!(out.contains("--expect"), "{out}");
    // its own file hash, recorded at issue, proves it whatever the version
    let own = strainsheet::integrity::sha256_hex(&b);
    let (code, out) = verify(&p, &["--expect", &own]);
    assert_eq!(code, 0, "{out}");
    assert!(
        out.contains("[ok  ] expected hash") && out.contains("file hash (PDF)") && out.contains("byte for byte"),
        "{out}"
    );
}

/// A forgery: the sheets changed and the payload made to say an older version made it
/// (so this version cannot re-render it). It is never reported intact, nor as anything
/// short of "not verified"; the file hash recorded at issue exposes it.
#[test]
fn a_forged_older_version_stamp_is_not_verified() {
    let i = issue("hollow-core-plank.toml");
    let good = std::fs::read(&i.pdf).unwrap();
    let issued_hash = strainsheet::integrity::sha256_hex(&good);
    let forged = other_version_copy(&good, "0.4.0", |doc| {
        // the first sheet's drawing replaced: the pages no longer show the payload
        let page = *doc.get_pages().get(&1).unwrap();
        let content = doc
            .add_object(lopdf::Stream::new(lopdf::dictionary! {}, b"BT /F1 24 Tf 72 720 Td (ADEQUATE) Tj ET".to_vec()));
        doc.get_dictionary_mut(page).unwrap().set("Contents", content);
    });
    let (_d, p) = tampered(&forged);
    std::fs::write(format!("{}.sha256", p.display()), strainsheet::integrity::sidecar::line(&forged, "copy.pdf"))
        .unwrap();
    let (code, out) = verify(&p, &[]);
    assert_eq!(code, 3, "{out}");
    assert!(out.contains("NOT VERIFIED") && !out.contains("intact"), "{out}");
    assert!(out.contains("[--  ] re-render: not run"), "{out}");
    // the archivist's record of the file hash at issue: any difference fails
    let (code, out) = verify(&p, &["--expect", &issued_hash]);
    assert_eq!(code, 1, "{out}");
    assert!(out.contains("[FAIL] expected hash") && out.contains("not the file recorded"), "{out}");
    // so does the content hash recorded at issue (the payload was changed)
    let content = strainsheet::integrity::attached::open(&i.pdf).unwrap();
    let (code, out) = verify(&p, &["--expect", &strainsheet::integrity::sha256_hex(&content.payload)]);
    assert_eq!(code, 1, "{out}");
}

/// `--expect HASH` takes either hash, says which one it is, and fails on any other.
#[test]
fn expect_names_the_hash_it_matched() {
    let i = issue("inverted-tee-girder.toml");
    let bytes = std::fs::read(&i.pdf).unwrap();
    let file_hash = strainsheet::integrity::sha256_hex(&bytes);
    let content_hash =
        strainsheet::integrity::sha256_hex(&strainsheet::integrity::attached::open(&i.pdf).unwrap().payload);
    let (code, out) = verify(&i.pdf, &["--expect", &file_hash.to_uppercase()]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("is the file hash (PDF) of this file"), "{out}");
    let (code, out) = verify(&i.pdf, &["--expect", &format!("sha256:{content_hash}")]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("is the content hash (payload) of this file"), "{out}");
    let mut other = file_hash.clone().into_bytes();
    other[10] = if other[10] == b'0' { b'1' } else { b'0' };
    let (code, out) = verify(&i.pdf, &["--expect", std::str::from_utf8(&other).unwrap()]);
    assert_eq!(code, 1, "{out}");
    assert!(
        out.contains("neither the file hash (PDF)") && out.contains(&file_hash) && out.contains(&content_hash),
        "{out}"
    );
    let (code, out) = verify(&i.pdf, &["--expect", &file_hash[..63]]);
    assert_eq!(code, 2, "{out}");
    assert!(out.contains("--expect") && out.contains("64 hexadecimal digits"), "{out}");
}

/// Both hashes are named wherever they are printed: report's message, verify's checks.
#[test]
fn the_two_hashes_are_labelled() {
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("lab.pdf");
    let out = bin()
        .args(["report", example("inverted-tee-girder.toml").to_str().unwrap(), "-o", pdf.to_str().unwrap()])
        .output()
        .unwrap();
    let said = String::from_utf8_lossy(&out.stderr);
    let bytes = std::fs::read(&pdf).unwrap();
    let file_hash = strainsheet::integrity::sha256_hex(&bytes);
    let content_hash =
        strainsheet::integrity::sha256_hex(&strainsheet::integrity::attached::open(&pdf).unwrap().payload);
    assert!(said.contains(&format!("content hash (payload, on the cover): {content_hash}")), "{said}");
    assert!(said.contains(&format!("file hash (PDF, in {}.sha256): {file_hash}", pdf.display())), "{said}");
    // the sidecar stays one line sha256sum -c reads
    assert_eq!(
        std::fs::read_to_string(format!("{}.sha256", pdf.display())).unwrap(),
        format!("{file_hash}  lab.pdf\n")
    );
    let (_, out) = verify(&pdf, &[]);
    assert!(
        out.contains(&format!(
            "[ok  ] content hash (payload): the attached payload hashes to the recorded content hash {content_hash}"
        )),
        "{out}"
    );
    assert!(out.contains("[ok  ] sidecar file hash (PDF)"), "{out}");
    // the cover names the hash it shows as the payload's
    let cover = pdf_text(&bytes, Some(1));
    // the label is set in spaced capitals
    let squeezed: String = cover.chars().filter(|c| !c.is_whitespace()).collect::<String>().to_uppercase();
    assert!(squeezed.contains("CONTENTSHA-256OFTHEPAYLOAD") && cover.contains(&content_hash), "{cover}");
}

/// A draft (a sign-off undated) verifies as an intact draft, never as "issued".
#[test]
fn a_draft_is_an_intact_draft_not_an_issued_package() {
    let d = issue("hollow-core-plank.toml");
    let (code, out) = verify(&d.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("intact draft") && out.contains("DRAFT") && !out.contains("what was issued"), "{out}");
    let i = issue("inverted-tee-girder.toml");
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("exactly what was issued") && !out.contains("DRAFT"), "{out}");
}

#[test]
fn custom_templates_must_be_given_to_verify() {
    let dir = tempfile::tempdir().unwrap();
    let tdir = dir.path().join("firm");
    std::fs::create_dir(&tdir).unwrap();
    for e in std::fs::read_dir(Path::new(env!("CARGO_MANIFEST_DIR")).join("templates")).unwrap() {
        let e = e.unwrap();
        std::fs::copy(e.path(), tdir.join(e.file_name())).unwrap();
    }
    let sheet = tdir.join("sheet.typ");
    let t = std::fs::read_to_string(&sheet).unwrap();
    std::fs::write(&sheet, format!("{t}\n// firm variant\n")).unwrap();
    let pdf = dir.path().join("firm.pdf");
    let out = bin()
        .args([
            "report",
            example("hollow-core-plank.toml").to_str().unwrap(),
            "-o",
            pdf.to_str().unwrap(),
            "--templates",
            tdir.to_str().unwrap(),
        ])
        .output()
        .unwrap();
    assert!(matches!(out.status.code(), Some(0 | 3)), "{}", String::from_utf8_lossy(&out.stderr));
    // without its templates the pages cannot be compared: not verified (never intact)
    let (code, text) = verify(&pdf, &[]);
    assert_eq!(code, 3, "{text}");
    assert!(text.contains("--templates") && text.contains("NOT VERIFIED") && !text.contains("intact"), "{text}");
    let (code, text) = verify(&pdf, &["--templates", tdir.to_str().unwrap()]);
    assert_eq!(code, 0, "{text}");
    std::fs::write(&sheet, format!("{t}\n// changed again\n")).unwrap();
    let (code, text) = verify(&pdf, &["--templates", tdir.to_str().unwrap()]);
    assert_eq!(code, 3, "{text}");
    assert!(text.contains("differ") && text.contains("NOT VERIFIED"), "{text}");
    // the file hash recorded at issue proves it without them
    let file_hash = strainsheet::integrity::sha256_hex(&std::fs::read(&pdf).unwrap());
    let (code, text) = verify(&pdf, &["--expect", &file_hash]);
    assert_eq!(code, 0, "{text}");
    assert!(text.contains("byte for byte"), "{text}");
}

#[test]
fn signatures_prove_the_signer_and_the_file() {
    let i = issue("inverted-tee-girder.toml");
    let dir = i.pdf.parent().unwrap().to_path_buf();
    let key = dir.join("kh.key");
    let out = bin()
        .args(["keygen", "-o", key.to_str().unwrap(), "--name", "Katriina Holmbeck", "--license", "P.Eng. 300912"])
        .output()
        .unwrap();
    assert!(out.status.success());
    let secret_line =
        std::fs::read_to_string(&key).unwrap().lines().find(|l| l.starts_with("secret:")).unwrap().to_string();
    let secret = secret_line.trim_start_matches("secret:").trim().to_string();
    let said = format!("{}{}", String::from_utf8_lossy(&out.stdout), String::from_utf8_lossy(&out.stderr));
    assert!(!said.contains(&secret), "the private key was printed");
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        assert_eq!(std::fs::metadata(&key).unwrap().permissions().mode() & 0o777, 0o600);
    }
    // keys are never overwritten
    let again = bin().args(["keygen", "-o", key.to_str().unwrap(), "--name", "X", "--license", "Y"]).output().unwrap();
    assert_eq!(again.status.code(), Some(2));
    let pubkey = dir.join("kh.key.pub");
    let out = bin()
        .args(["sign", i.pdf.to_str().unwrap(), "--key", key.to_str().unwrap(), "--date", "2026-12-01"])
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", String::from_utf8_lossy(&out.stderr));
    let (code, text) = verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]);
    assert_eq!(code, 0, "{text}");
    assert!(text.contains("Katriina Holmbeck (P.Eng. 300912), signed 2026-12-01"), "{text}");
    assert!(
        !text.contains("DRAFT")
            && !std::fs::read_to_string(format!("{}.sig", i.pdf.display())).unwrap().contains("status")
    );
    // without the key, the signature beside the file is mentioned with how to check it
    let (code, text) = verify(&i.pdf, &[]);
    assert_eq!(code, 0, "{text}");
    assert!(
        text.contains("[--  ] signature: not checked")
            && text.contains("pkg.pdf.sig")
            && text.contains("--pubkey KEY.pub"),
        "{text}"
    );
    // a signature over a changed file fails
    let sig = PathBuf::from(format!("{}.sig", i.pdf.display()));
    let good = std::fs::read(&i.pdf).unwrap();
    let mut bad = good.clone();
    bad.extend_from_slice(b"\n");
    std::fs::write(&i.pdf, &bad).unwrap();
    let msg = strainsheet::integrity::sign::check(&sig, &pubkey, &bad).unwrap_err();
    assert!(msg.contains("changed after it was signed"), "{msg}");
    std::fs::write(&i.pdf, &good).unwrap();
    // an altered signature file fails
    let s = std::fs::read_to_string(&sig).unwrap();
    std::fs::write(&sig, s.replace("signer: Katriina Holmbeck", "signer: Someone Else")).unwrap();
    let msg = strainsheet::integrity::sign::check(&sig, &pubkey, &good).unwrap_err();
    assert!(msg.contains("altered"), "{msg}");
    // another key's public half does not verify it
    std::fs::write(&sig, &s).unwrap();
    let other = dir.join("other.key");
    assert!(
        bin()
            .args(["keygen", "-o", other.to_str().unwrap(), "--name", "O", "--license", "1"])
            .output()
            .unwrap()
            .status
            .success()
    );
    let msg = strainsheet::integrity::sign::check(&sig, &dir.join("other.key.pub"), &good).unwrap_err();
    assert!(msg.contains("another key"), "{msg}");
}

fn diff_out(args: &[&Path], json: bool) -> (i32, String) {
    let mut cmd = bin();
    cmd.arg("diff").args(args);
    if json {
        cmd.arg("--json");
    }
    let out = cmd.output().unwrap();
    (
        out.status.code().unwrap_or(-1),
        format!("{}{}", String::from_utf8_lossy(&out.stdout), String::from_utf8_lossy(&out.stderr)),
    )
}

/// An example with the check locations of its first member in reverse order, the
/// midspan's moment and the first layer's losses changed.
fn edited_double_tee(mu_from: &str, mu_to: &str) -> String {
    let src = std::fs::read_to_string(example("parking-double-tee.toml")).unwrap();
    let first = src.find("[[member.location]]").unwrap();
    let end = src[first..].find("[[member]]").unwrap() + first;
    let mut locs: Vec<String> = src[first..end]
        .split("[[member.location]]")
        .skip(1)
        .map(|l| format!("[[member.location]]{}", l.trim_end()))
        .collect();
    locs.reverse();
    let block = format!("{}\n\n", locs.join("\n\n"));
    assert!(locs[0].contains("\"midspan\"") && locs[0].contains(mu_from), "{}", locs[0]);
    let block = block.replacen(mu_from, mu_to, 1);
    format!("{}{}{}", &src[..first], block, &src[end..]).replacen("losses = 38.0", "losses = 45.0", 1)
}

/// diff speaks the package's units, matches locations by name (not by their place),
/// shows the changed results of each location, and takes TOML inputs as well as
/// packages.
#[test]
fn diff_reports_inputs_and_results_in_the_package_units() {
    let a = issue("parking-double-tee.toml");
    let dir = tempfile::tempdir().unwrap();
    let t = dir.path().join("b.toml");
    // the midspan moment, 800 kip-ft, to 860 kip-ft given in kip-in
    std::fs::write(&t, edited_double_tee("mu = 800.0", "mu = \"10320 kip-in\"")).unwrap();
    let bpdf = dir.path().join("b.pdf");
    let o = bin().args(["report", t.to_str().unwrap(), "-o", bpdf.to_str().unwrap()]).output().unwrap();
    assert!(o.status.code().is_some_and(|c| c <= 1), "{}", String::from_utf8_lossy(&o.stderr));
    for (what, old, new) in [
        ("two packages", a.pdf.clone(), bpdf.clone()),
        ("a package and an input", a.pdf.clone(), t.clone()),
        ("two inputs", example("parking-double-tee.toml"), t.clone()),
    ] {
        let (code, out) = diff_out(&[&old, &new], true);
        assert_eq!(code, 0, "{what}: {out}");
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["input_changed"], true, "{what}");
        let dt1 = v["members"].as_array().unwrap().iter().find(|m| m["id"] == "DT-1").unwrap();
        let inputs = dt1["inputs_changed"].as_array().unwrap();
        let keys: Vec<&str> = inputs.iter().map(|c| c["key"].as_str().unwrap()).collect();
        // only what changed: the reordered locations are matched by name
        assert_eq!(keys, ["locations[\"midspan\"].mu", "strands[1].fse", "strands[1].fse_source.losses"], "{what}");
        assert_eq!((inputs[0]["before"].as_f64(), inputs[0]["after"].as_f64()), (Some(800.0), Some(860.0)), "{what}");
        assert_eq!(inputs[0]["unit"], "kip-ft", "{what}");
        assert_eq!(inputs[2]["unit"], "ksi", "{what}");
        let (_, table) = diff_out(&[&old, &new], false);
        assert!(table.contains("input locations[\"midspan\"].mu: 800 kip-ft -> 860 kip-ft"), "{what}\n{table}");
        assert!(table.contains("input strands[1].fse_source.losses: 38 ksi -> 45 ksi"), "{what}\n{table}");
        assert!(!table.contains("9600") && !table.contains("10320"), "{what}: a moment in kip-in\n{table}");
        // the midspan's results, each named, in its unit
        let mid = table.split("location \"midspan\"").nth(1).unwrap_or_default();
        for label in ["phi Mn ", "Mu/phi Mn ", "Mcr ", "1.2 Mcr ", "status ", "Mu "] {
            assert!(mid.contains(&format!("    {label}")), "{what}: no {label}\n{table}");
        }
        assert!(mid.contains("Mu         800.0 kip-ft -> 860.0 kip-ft  (+7.50 %)"), "{what}\n{table}");
        assert!(mid.contains("status     pass -> FAIL"), "{what}\n{table}");
        // a member whose inputs and results did not change is not listed
        assert!(!table.contains("member DT-2"), "{what}\n{table}");
    }
    // the hashes are labelled; an input has none
    let (_, table) = diff_out(&[&a.pdf, &t], false);
    assert!(table.contains("content hash (payload): ") && table.contains("file hash (PDF): "), "{table}");
    assert!(table.contains("-> — (a TOML input)"), "{table}");
    // a package and the input it was made from: nothing differs
    let (code, table) = diff_out(&[&example("parking-double-tee.toml"), &a.pdf], false);
    assert_eq!(code, 0, "{table}");
    assert!(table.contains("no input or result differs"), "{table}");
    // neither a package nor an input
    let junk = dir.path().join("notes.txt");
    std::fs::write(&junk, "hello").unwrap();
    let (code, out) = diff_out(&[&junk, &t], false);
    assert_eq!(code, 2, "{out}");
    assert!(out.contains("notes.txt") && out.contains("TOML inputs"), "{out}");
}

/// SI packages: moments in kN-m; members matched by id when reordered, added or removed;
/// defaults by their key.
#[test]
fn diff_matches_members_and_defaults_by_their_names() {
    let dir = tempfile::tempdir().unwrap();
    let src = std::fs::read_to_string(example("hollow-core-plank.toml")).unwrap();
    let first = src.find("[[member]]").unwrap();
    let members: Vec<&str> = src[first..].split("[[member]]").skip(1).collect();
    assert!(members.len() >= 2);
    // the members in reverse order, the (now first) last one with a given lambda, and
    // its midspan moment from 235 to 250 kN-m
    let mut rev: Vec<String> = members.iter().rev().map(|m| format!("[[member]]{m}")).collect();
    rev[0] = rev[0].replacen("mu = 235.0", "mu = 250.0", 1).replacen("fc = 45.0", "fc = 45.0\nlambda = 0.85", 1);
    let edited = format!("{}{}", &src[..first], rev.join(""));
    assert_ne!(edited, src);
    let t = dir.path().join("si.toml");
    std::fs::write(&t, &edited).unwrap();
    let (code, out) = diff_out(&[&example("hollow-core-plank.toml"), &t], true);
    assert_eq!(code, 0, "{out}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["members_added"].as_array().unwrap().len(), 0, "{out}");
    let ms = v["members"].as_array().unwrap();
    let first_id = members[0].split("id = \"").nth(1).unwrap().split('"').next().unwrap();
    let moved = ms.iter().find(|m| m["id"] == first_id).unwrap();
    assert!(moved["inputs_changed"].as_array().unwrap().is_empty(), "a reordered member compared by place: {out}");
    let (_, table) = diff_out(&[&example("hollow-core-plank.toml"), &t], false);
    assert!(table.contains("kN-m") && !table.contains("N-mm") && !table.contains("kip"), "{table}");
    assert!(table.contains(".mu: 235 kN-m -> 250 kN-m"), "{table}");
    assert!(table.contains("input concrete.lambda: 1 -> 0.85"), "{table}");
    assert!(table.contains("input defaults[\"concrete.lambda\"] removed"), "{table}");
    // a member removed and one added
    let renamed = edited.replacen(&format!("id = \"{first_id}\""), "id = \"HC-9\"", 1);
    std::fs::write(&t, renamed).unwrap();
    let (_, table) = diff_out(&[&example("hollow-core-plank.toml"), &t], false);
    assert!(table.contains(&format!("members added: HC-9; removed: {first_id}")), "{table}");
}

/// Keys and a signed package for the signature tests: (package, its folder, key, public key).
fn signed(example_name: &str, extra: &[&str]) -> (Issued, PathBuf, PathBuf, std::process::Output) {
    let i = issue(example_name);
    let dir = i.pdf.parent().unwrap().to_path_buf();
    let key = dir.join("s.key");
    let out = bin()
        .args(["keygen", "-o", key.to_str().unwrap(), "--name", "S. Igner", "--license", "PE 7"])
        .output()
        .unwrap();
    assert!(out.status.success());
    let out = bin()
        .args(["sign", i.pdf.to_str().unwrap(), "--key", key.to_str().unwrap(), "--date", "2026-12-02"])
        .args(extra)
        .output()
        .unwrap();
    (i, key.clone(), dir.join("s.key.pub"), out)
}

/// A draft is not signed without --draft; with it, a warning, and the signature says so
/// (and still verifies).
#[test]
fn a_draft_is_signed_only_when_asked() {
    let (i, _, _, out) = signed("hollow-core-plank.toml", &[]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(
        err.contains("is a DRAFT") && err.contains("checked (Oluwaseun Fairbrother)") && err.contains("--draft"),
        "{err}"
    );
    let sig = PathBuf::from(format!("{}.sig", i.pdf.display()));
    assert!(!sig.exists());
    let (i, _, pubkey, out) = signed("hollow-core-plank.toml", &["--draft"]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(out.status.success(), "{err}");
    assert!(err.contains("warning") && err.contains("DRAFT"), "{err}");
    let sig = PathBuf::from(format!("{}.sig", i.pdf.display()));
    assert!(std::fs::read_to_string(&sig).unwrap().contains("\nstatus: draft\n"));
    let (code, text) = verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]);
    assert_eq!(code, 0, "{text}");
    assert!(text.contains("signed 2026-12-02, of a DRAFT") && text.contains("intact draft"), "{text}");
    // the status line is signed: taking it out breaks the signature
    let s = std::fs::read_to_string(&sig).unwrap();
    std::fs::write(&sig, s.replace("status: draft\n", "")).unwrap();
    let (code, text) = verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]);
    assert_eq!(code, 1, "{text}");
    assert!(text.contains("altered"), "{text}");
    // a file that is not a package is not signed
    let notes = i.pdf.with_file_name("notes.txt");
    std::fs::write(&notes, "hello").unwrap();
    let out = bin()
        .args(["sign", notes.to_str().unwrap(), "--key", i.pdf.with_file_name("s.key").to_str().unwrap()])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("packages only"));
}

/// A signature file is exactly what sign writes: anything added, doubled or changed in
/// form makes it invalid, with the reason.
#[test]
fn a_signature_file_is_exactly_its_format() {
    let (i, _, pubkey, out) = signed("inverted-tee-girder.toml", &[]);
    assert!(out.status.success(), "{}", String::from_utf8_lossy(&out.stderr));
    let sig = PathBuf::from(format!("{}.sig", i.pdf.display()));
    let good = std::fs::read_to_string(&sig).unwrap();
    let (code, text) = verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]);
    assert_eq!(code, 0, "{text}");
    let block = good.clone();
    let cases: Vec<(&str, String, &str)> = vec![
        ("a second signature block", format!("{good}{block}"), "goes on after the signature line"),
        ("free text appended", format!("{good}approved by the owner\n"), "goes on after the signature line"),
        ("a blank line appended", format!("{good}\n"), "goes on after the signature line"),
        ("trailing spaces", good.replace("\nsignature: ", " \nsignature: "), "spaces at an end"),
        ("spaces after the last line end", format!("{good}  "), "line end"),
        ("CR LF line ends", good.replace('\n', "\r\n"), "carriage returns"),
        ("a field twice", good.replace("date: 2026-12-02\n", "date: 2026-12-02\ndate: 2026-12-03\n"), "given twice"),
        ("an unknown field", good.replace("file: ", "note: x\nfile: "), "not a field"),
        (
            "uppercase hex",
            {
                let at = good.find("signature: ").unwrap() + 11;
                format!("{}{}", &good[..at], good[at..].to_uppercase())
            },
            "lowercase",
        ),
    ];
    for (what, text, why) in cases {
        std::fs::write(&sig, &text).unwrap();
        let (code, out) = verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]);
        assert_eq!(code, 1, "{what}: accepted\n{out}");
        assert!(
            out.contains("[FAIL] signature") && out.contains("not a valid signature file") && out.contains(why),
            "{what}\n{out}"
        );
    }
    std::fs::write(&sig, &good).unwrap();
    assert_eq!(verify(&i.pdf, &["--pubkey", pubkey.to_str().unwrap()]).0, 0);
}

/// Exit status 3 reads as "not verified" in the help, as in verify's closing line.
#[test]
fn exit_3_reads_not_verified_in_the_help() {
    for args in [vec!["--help"], vec!["verify", "--help"]] {
        let out = bin().args(&args).output().unwrap();
        let text = String::from_utf8_lossy(&out.stdout);
        assert!(text.contains("3 NOT VERIFIED") || text.contains("3 (verify only) NOT VERIFIED"), "{args:?}\n{text}");
        assert!(text.contains("content hash (payload)") && text.contains("file hash (PDF)"), "{args:?}\n{text}");
    }
}
