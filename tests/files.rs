//! Files on disk: only regular files are replaced; any legal output name is written and
//! a name too long is said to be; an interrupted report (Ctrl-C) leaves the old file and
//! no temporary, and SIGTERM and SIGHUP clean up as Ctrl-C does; a
//! template folder's entries are never followed through a link, even one swapped in
//! while the folder is read.

mod common;
use common::*;
use std::path::Path;

fn names_in(dir: &Path) -> Vec<String> {
    let mut v: Vec<String> =
        std::fs::read_dir(dir).unwrap().map(|e| e.unwrap().file_name().to_string_lossy().into_owned()).collect();
    v.sort();
    v
}

fn report(out: &Path, extra: &[&str]) -> (Option<i32>, String) {
    let o = bin()
        .args(["report", example("hollow-core-plank.toml").to_str().unwrap(), "-o", out.to_str().unwrap()])
        .args(extra)
        .output()
        .unwrap();
    (o.status.code(), String::from_utf8_lossy(&o.stderr).into_owned())
}

#[cfg(unix)]
fn mkfifo(p: &Path) {
    let c = std::ffi::CString::new(p.to_str().unwrap()).unwrap();
    // SAFETY: mkfifo reads the NUL-terminated path.
    assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o644) }, 0);
}

/// `report --overwrite` (and every other writer) replaces regular files only: a pipe, a
/// link or a folder where the package or its sidecar would go is refused with exit 2,
/// left as it was, and nothing is written.
#[cfg(target_os = "linux")]
#[test]
fn only_regular_files_are_replaced() {
    let dir = tempfile::tempdir().unwrap();
    // a pipe in the package's place
    let fifo = dir.path().join("pipe.pdf");
    mkfifo(&fifo);
    let (code, err) = report(&fifo, &["--overwrite"]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("pipe.pdf") && err.contains("named pipe") && err.contains("regular file"), "{err}");
    use std::os::unix::fs::FileTypeExt;
    assert!(std::fs::symlink_metadata(&fifo).unwrap().file_type().is_fifo());
    // a pipe in the sidecar's place: refused before anything is written
    let out = dir.path().join("a.pdf");
    mkfifo(&dir.path().join("a.pdf.sha256"));
    let (code, err) = report(&out, &["--overwrite"]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("a.pdf.sha256") && err.contains("named pipe"), "{err}");
    assert!(!out.exists());
    // a link: neither it nor what it points to is replaced
    let target = dir.path().join("elsewhere.txt");
    std::fs::write(&target, "keep me").unwrap();
    let link = dir.path().join("link.pdf");
    std::os::unix::fs::symlink(&target, &link).unwrap();
    let (code, err) = report(&link, &["--overwrite"]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("symbolic link"), "{err}");
    assert!(std::fs::symlink_metadata(&link).unwrap().file_type().is_symlink());
    assert_eq!(std::fs::read_to_string(&target).unwrap(), "keep me");
    // a folder
    let folder = dir.path().join("folder.pdf");
    std::fs::create_dir(&folder).unwrap();
    let (code, err) = report(&folder, &["--overwrite"]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("a folder"), "{err}");
    // the starter and the signature go the same way
    let o = bin().args(["new", fifo.to_str().unwrap(), "--overwrite"]).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("named pipe"));
    // no temporary file is left anywhere
    assert!(names_in(dir.path()).iter().all(|n| !n.ends_with(".part")), "{:?}", names_in(dir.path()));
    // the library's writer, directly
    let e = strainsheet::output::write_all(&[(fifo.clone(), b"x".to_vec())], true).unwrap_err().to_string();
    assert!(e.contains("named pipe"), "{e}");
}

/// Any name the folder allows is written, with its sidecar (the temporary names are
/// short); a name the folder does not allow is refused before any work, naming the
/// limit and the longest name that fits.
#[test]
fn long_names_are_written_and_too_long_ones_are_named() {
    let dir = tempfile::tempdir().unwrap();
    // 240 bytes: the sidecar's name (247) still fits in 255
    let name = format!("{}.pdf", "p".repeat(236));
    assert_eq!(name.len(), 240);
    let out = dir.path().join(&name);
    let (code, err) = report(&out, &[]);
    assert!(matches!(code, Some(0 | 3)), "{err}");
    let side = dir.path().join(format!("{name}.sha256"));
    let line = std::fs::read_to_string(&side).unwrap();
    assert!(line.ends_with(&format!("  {name}\n")), "{line}");
    assert_eq!(names_in(dir.path()).len(), 2, "{:?}", names_in(dir.path()));
    // 250 bytes: the package fits, its sidecar (257) does not
    let name = format!("{}.pdf", "q".repeat(246));
    let started = std::time::Instant::now();
    let (code, err) = report(&dir.path().join(&name), &[]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains(".sha256") && err.contains("NAME_MAX") && err.contains("255 bytes"), "{err}");
    assert!(err.contains("at most 248 bytes"), "{err}");
    assert!(!err.contains("folder does not exist") && !err.contains("cannot write"), "{err}");
    assert!(started.elapsed() < std::time::Duration::from_secs(5), "the name was checked only after the work");
    // 256 bytes: the name itself
    let name = format!("{}.pdf", "r".repeat(252));
    let (code, err) = report(&dir.path().join(&name), &[]);
    assert_eq!(code, Some(2), "{err}");
    assert!(err.contains("256 bytes long") && err.contains("choose a shorter name"), "{err}");
    assert_eq!(names_in(dir.path()).len(), 2, "{:?}", names_in(dir.path()));
}

/// SIGTERM and SIGHUP end `report` as Ctrl-C does: the handler runs (exit 130, not death
/// by the signal), says what was written, and no temporary file is left.
#[cfg(target_os = "linux")]
#[test]
fn termination_signals_clean_up_like_an_interrupt() {
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("big.toml");
    std::fs::write(&input, replicated("parking-double-tee.toml", 40)).unwrap();
    for (sig, name) in [(libc::SIGTERM, "SIGTERM"), (libc::SIGHUP, "SIGHUP")] {
        let out = dir.path().join("big.pdf");
        let child = bin()
            .args(["report", input.to_str().unwrap(), "-o", out.to_str().unwrap()])
            .stderr(std::process::Stdio::piped())
            .spawn()
            .unwrap();
        std::thread::sleep(std::time::Duration::from_millis(600));
        // SAFETY: kill sends a signal to the child we started, by its id.
        assert_eq!(unsafe { libc::kill(child.id() as i32, sig) }, 0);
        let o = child.wait_with_output().unwrap();
        let err = String::from_utf8_lossy(&o.stderr);
        use std::os::unix::process::ExitStatusExt;
        assert_eq!(o.status.signal(), None, "{name}: the process died of the signal, unhandled\n{err}");
        assert_eq!(o.status.code(), Some(130), "{name}\n{err}");
        assert!(err.contains("interrupted: nothing was written"), "{name}\n{err}");
        assert_eq!(names_in(dir.path()), ["big.toml"], "{name}");
    }
}

/// A template folder whose entry is swapped again and again between a regular file and
/// a link to a file outside it, while the folder is read over and over: the file outside
/// is never read (a link is refused, or the regular file is read).
#[cfg(target_os = "linux")]
#[test]
fn a_template_swapped_for_a_link_is_never_followed() {
    let root = tempfile::tempdir().unwrap();
    let tdir = root.path().join("t");
    let stage = root.path().join("stage");
    std::fs::create_dir(&tdir).unwrap();
    std::fs::create_dir(&stage).unwrap();
    for (n, text) in [("package.typ", "p"), ("members.typ", "m"), ("sheet-numbers.typ", "s")] {
        std::fs::write(tdir.join(n), text).unwrap();
    }
    let secret = root.path().join("secret.txt");
    std::fs::write(&secret, "SECRET OUTSIDE THE FOLDER").unwrap();
    let entry = tdir.join("x.typ");
    std::fs::write(&entry, "regular").unwrap();
    let stop = std::sync::Arc::new(std::sync::atomic::AtomicBool::new(false));
    let swapper = {
        let (stop, stage, entry, secret) = (stop.clone(), stage.clone(), entry.clone(), secret.clone());
        std::thread::spawn(move || {
            let (l, r) = (stage.join("l"), stage.join("r"));
            while !stop.load(std::sync::atomic::Ordering::Relaxed) {
                let _ = std::os::unix::fs::symlink(&secret, &l);
                let _ = std::fs::rename(&l, &entry);
                let _ = std::fs::write(&r, "regular");
                let _ = std::fs::rename(&r, &entry);
            }
        })
    };
    // what the folder reads as with x.typ the regular file
    let reference = root.path().join("reference");
    std::fs::create_dir(&reference).unwrap();
    for n in ["package.typ", "members.typ", "sheet-numbers.typ"] {
        std::fs::copy(tdir.join(n), reference.join(n)).unwrap();
    }
    std::fs::write(reference.join("x.typ"), "regular").unwrap();
    let want = strainsheet::report::Templates::from_dir(&reference).unwrap().provenance();
    let (mut read, mut refused) = (0, 0);
    let started = std::time::Instant::now();
    while started.elapsed() < std::time::Duration::from_secs(3) {
        match strainsheet::report::Templates::from_dir(&tdir) {
            Ok(t) => {
                assert_eq!(t.provenance(), want, "a file was read through a link (after {read} reads)");
                read += 1;
            }
            Err(e) => {
                let e = e.to_string();
                assert!(e.contains("link"), "{e}");
                refused += 1;
            }
        }
    }
    stop.store(true, std::sync::atomic::Ordering::Relaxed);
    swapper.join().unwrap();
    assert!(read + refused > 100, "only {read} reads and {refused} refusals");
}

/// Ctrl-C (SIGINT) during `report --overwrite`: the handler runs (exit 130), the file
/// being replaced is left as it was, and no temporary file is left.
#[cfg(target_os = "linux")]
#[test]
fn an_interrupted_report_leaves_the_old_file_and_no_temporary() {
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("big.toml");
    std::fs::write(&input, replicated("parking-double-tee.toml", 40)).unwrap();
    let out = dir.path().join("big.pdf");
    std::fs::write(&out, b"the issued package").unwrap();
    let child = bin()
        .args(["report", input.to_str().unwrap(), "-o", out.to_str().unwrap(), "--overwrite"])
        .stderr(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    std::thread::sleep(std::time::Duration::from_millis(600));
    // SAFETY: kill sends a signal to the child we started, by its id.
    assert_eq!(unsafe { libc::kill(child.id() as i32, libc::SIGINT) }, 0);
    let o = child.wait_with_output().unwrap();
    let err = String::from_utf8_lossy(&o.stderr);
    assert_eq!(o.status.code(), Some(130), "{err}");
    assert_eq!(std::fs::read(&out).unwrap(), b"the issued package");
    assert_eq!(names_in(dir.path()), ["big.pdf", "big.toml"], "{err}");
}
