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

#[test]
fn sidecar_mismatch_is_reported() {
    let i = issue("hollow-core-plank.toml");
    let side = PathBuf::from(format!("{}.sha256", i.pdf.display()));
    std::fs::write(&side, format!("{}  pkg.pdf\n", "0".repeat(64))).unwrap();
    let (code, out) = verify(&i.pdf, &[]);
    assert_eq!(code, 1, "{out}");
    assert!(out.contains("[FAIL] sidecar"), "{out}");
}

#[test]
fn other_version_is_exit_3_with_checks_1_and_2() {
    let i = issue("hollow-core-plank.toml");
    let good = std::fs::read(&i.pdf).unwrap();
    let mut doc = Document::load_mem(&good).unwrap();
    let id = find_attachment_stream(&doc, "payload.json");
    let stream = doc.get_object_mut(id).unwrap().as_stream_mut().unwrap();
    let text = String::from_utf8(stream.decompressed_content().unwrap()).unwrap();
    let edited = text.replacen(&format!("\"version\":\"{}\"", env!("CARGO_PKG_VERSION")), "\"version\":\"0.0.1\"", 1);
    assert_ne!(edited, text);
    let new_hash = strainsheet::seal::sha256_hex(edited.as_bytes());
    stream.set_plain_content(edited.into_bytes());
    let info_id = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
    doc.get_dictionary_mut(info_id)
        .unwrap()
        .set("Keywords", Object::string_literal(format!("strainsheet, content-sha256:{new_hash}")));
    let mut b = Vec::new();
    doc.save_to(&mut b).unwrap();
    let (_d, p) = tampered(&b);
    let (code, out) = verify(&p, &[]);
    assert_eq!(code, 3, "{out}");
    assert!(
        out.contains("[ok  ] content hash") && out.contains("[ok  ] re-analysis") && out.contains("version 0.0.1"),
        "{out}"
    );
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
    let (code, text) = verify(&pdf, &[]);
    assert_eq!(code, 1, "{text}");
    assert!(text.contains("--templates"), "{text}");
    let (code, text) = verify(&pdf, &["--templates", tdir.to_str().unwrap()]);
    assert_eq!(code, 0, "{text}");
    std::fs::write(&sheet, format!("{t}\n// changed again\n")).unwrap();
    let (code, text) = verify(&pdf, &["--templates", tdir.to_str().unwrap()]);
    assert_eq!(code, 1, "{text}");
    assert!(text.contains("differ"), "{text}");
}

#[test]
fn signatures_prove_the_signer_and_the_file() {
    let i = issue("hollow-core-plank.toml");
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
    // a signature over a changed file fails
    let sig = PathBuf::from(format!("{}.sig", i.pdf.display()));
    let good = std::fs::read(&i.pdf).unwrap();
    let mut bad = good.clone();
    bad.extend_from_slice(b"\n");
    std::fs::write(&i.pdf, &bad).unwrap();
    let msg = strainsheet::sign::check(&sig, &pubkey, &bad).unwrap_err();
    assert!(msg.contains("changed after it was signed"), "{msg}");
    std::fs::write(&i.pdf, &good).unwrap();
    // an altered signature file fails
    let s = std::fs::read_to_string(&sig).unwrap();
    std::fs::write(&sig, s.replace("signer: Katriina Holmbeck", "signer: Someone Else")).unwrap();
    let msg = strainsheet::sign::check(&sig, &pubkey, &good).unwrap_err();
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
    let msg = strainsheet::sign::check(&sig, &dir.join("other.key.pub"), &good).unwrap_err();
    assert!(msg.contains("another key"), "{msg}");
}

#[test]
fn diff_reports_inputs_and_results() {
    let a = issue("parking-double-tee.toml");
    let src = std::fs::read_to_string(example("parking-double-tee.toml")).unwrap();
    let changed = src.replacen("losses = 38.0", "losses = 45.0", 1);
    let dir = tempfile::tempdir().unwrap();
    let t = dir.path().join("b.toml");
    std::fs::write(&t, changed).unwrap();
    let bpdf = dir.path().join("b.pdf");
    assert!(
        bin()
            .args(["report", t.to_str().unwrap(), "-o", bpdf.to_str().unwrap()])
            .output()
            .unwrap()
            .status
            .code()
            .is_some()
    );
    let out = bin().args(["diff", a.pdf.to_str().unwrap(), bpdf.to_str().unwrap(), "--json"]).output().unwrap();
    assert!(out.status.success());
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v["input_changed"], true);
    let dt1 = v["members"].as_array().unwrap().iter().find(|m| m["id"] == "DT-1").unwrap();
    let keys: Vec<&str> =
        dt1["inputs_changed"].as_array().unwrap().iter().map(|c| c["key"].as_str().unwrap()).collect();
    assert!(keys.contains(&"strands[1].fse_source.losses"), "{keys:?}");
    let table = bin().args(["diff", a.pdf.to_str().unwrap(), bpdf.to_str().unwrap()]).output().unwrap();
    let t = String::from_utf8_lossy(&table.stdout);
    assert!(t.contains("member DT-1") && t.contains("phi_mn"), "{t}");
}
