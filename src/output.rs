//! Writing outputs so that nothing half-written is ever left on disk: each file is
//! written to a temporary file in the same folder (a short name, `.ss-XXXXXXXX.part`, so
//! that any legal output name can be written), flushed, then renamed into place. Only
//! regular files are ever replaced, and only when asked.
//!
//! Several files written as one (a package and its sidecar) are placed in an order that
//! never leaves a companion beside a file it does not belong to: with `--overwrite` the
//! earlier companions are removed first, then the first file is renamed into place, then
//! the companions. An interrupt (Ctrl-C, SIGTERM, SIGHUP) removes the temporary files
//! and says exactly which files were written, which removed and which are as they were;
//! without `--overwrite` the files already placed are removed again, so nothing is
//! written.

use crate::error::{Error, Result};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::sync::Mutex;
use std::sync::atomic::{AtomicU64, Ordering};

/// The writes in progress, for the interrupt handler. Every step that changes the
/// folder (a temporary file made, a companion removed, a file renamed into place) is
/// taken holding this lock and recorded before it is released, so the handler, which
/// takes the lock and ends the process, always sees what is on disk.
static STATE: Mutex<Vec<Placing>> = Mutex::new(Vec::new());
static NEXT_ID: AtomicU64 = AtomicU64::new(0);

struct Placing {
    id: u64,
    overwrite: bool,
    /// Temporary files to remove on interrupt.
    temps: Vec<PathBuf>,
    /// Every target, the first file first.
    targets: Vec<PathBuf>,
    /// Earlier companions removed before the first file is placed.
    removed: Vec<PathBuf>,
    /// Targets renamed into place, in order.
    placed: Vec<PathBuf>,
}

fn state() -> std::sync::MutexGuard<'static, Vec<Placing>> {
    STATE.lock().unwrap_or_else(|e| e.into_inner())
}

fn name(p: &Path) -> String {
    p.display().to_string()
}

fn names(ps: &[&PathBuf]) -> String {
    let ns: Vec<String> = ps.iter().map(|p| name(p)).collect();
    match ns.len() {
        0 => String::new(),
        1 => ns[0].clone(),
        _ => format!("{} and {}", ns[..ns.len() - 1].join(", "), ns[ns.len() - 1]),
    }
}

impl Placing {
    /// What is on disk once this write is abandoned (as an interrupt abandons it), in
    /// words. Without overwrite the files placed are removed again: nothing is written.
    fn summary(&self) -> String {
        if !self.overwrite || (self.placed.is_empty() && self.removed.is_empty()) {
            return "nothing was written".into();
        }
        let placed: Vec<&PathBuf> = self.placed.iter().collect();
        if placed.is_empty() {
            let removed: Vec<&PathBuf> = self.removed.iter().collect();
            return format!(
                "nothing new was written: {} is as it was, but {} (belonging to it) {} already removed, so that no \
                 companion would be left beside a file it does not belong to; run the command again to write all",
                name(&self.targets[0]),
                names(&removed),
                if removed.len() == 1 { "was" } else { "were" }
            );
        }
        let missing: Vec<&PathBuf> = self.targets.iter().filter(|t| !self.placed.contains(t)).collect();
        if missing.is_empty() {
            return format!("{} written", names(&placed));
        }
        format!(
            "{} written, but not {} (none exists now); run the command again to write all",
            names(&placed),
            names(&missing)
        )
    }

    /// Removes the temporary files and, without overwrite, the files placed (they did
    /// not exist before). Returns what is on disk, in words.
    fn abandon(&mut self) -> String {
        let what = self.summary();
        for p in self.temps.drain(..) {
            let _ = std::fs::remove_file(p);
        }
        if !self.overwrite {
            for p in self.placed.drain(..) {
                let _ = std::fs::remove_file(p);
            }
        }
        what
    }
}

/// Abandons one write (after an error), saying what is on disk.
fn abandon_write(id: u64) -> String {
    let mut st = state();
    match st.iter().position(|w| w.id == id) {
        Some(i) => st.remove(i).abandon(),
        None => "nothing was written".into(),
    }
}

/// Abandons every write in progress, as an interrupt does: their temporary files are
/// removed, and the files placed by writes without overwrite. Returns what is on disk,
/// in words.
pub fn remove_pending() -> String {
    abandon_all(&mut state())
}

fn abandon_all(st: &mut Vec<Placing>) -> String {
    let said: Vec<String> = st.drain(..).map(|mut w| w.abandon()).collect();
    if said.is_empty() { "nothing was written".into() } else { said.join("; ") }
}

/// Installs the handler of Ctrl-C, SIGTERM and SIGHUP: the temporary files are removed,
/// what was written is said, and the process exits with status 130.
pub fn on_interrupt_clean_up() {
    let _ = ctrlc::set_handler(|| {
        // the lock is held until the process ends: no write takes another step
        let mut st = state();
        let what = abandon_all(&mut st);
        eprintln!("interrupted: {what}");
        std::process::exit(130);
    });
}

/// The longest file name the folder takes, in bytes.
fn name_max(dir: &Path) -> usize {
    #[cfg(target_os = "linux")]
    {
        use std::os::unix::ffi::OsStrExt;
        if let Ok(c) = std::ffi::CString::new(dir.as_os_str().as_bytes()) {
            // SAFETY: pathconf reads the NUL-terminated path it is given and nothing else.
            let n = unsafe { libc::pathconf(c.as_ptr(), libc::_PC_NAME_MAX) };
            if n > 0 {
                return n as usize;
            }
        }
    }
    let _ = dir;
    255
}

fn folder_of(target: &Path) -> PathBuf {
    match target.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// Whether an error is "file name too long" (ENAMETOOLONG).
fn name_too_long(e: &std::io::Error) -> bool {
    #[cfg(target_os = "linux")]
    if e.raw_os_error() == Some(libc::ENAMETOOLONG) {
        return true;
    }
    e.kind() == std::io::ErrorKind::InvalidFilename
}

/// Refuses what could not or must not be written: a name longer than the folder allows,
/// and a target that exists but is not a regular file (a device, a pipe, a folder, a
/// link): only regular files are ever replaced.
fn check_targets(files: &[&Path]) -> Result<()> {
    let first_len = files.first().and_then(|p| p.file_name()).map_or(0, |n| n.len());
    for (i, p) in files.iter().enumerate() {
        let Some(file_name) = p.file_name() else {
            return Err(Error::io(p, "this names a folder, not a file; give a file name"));
        };
        let dir = folder_of(p);
        let max = name_max(&dir);
        if file_name.len() > max {
            let mut msg = format!(
                "the file name is {} bytes long; names in this folder are at most {max} bytes",
                file_name.len()
            );
            if i > 0 && file_name.len() > first_len {
                let extra = file_name.len() - first_len;
                msg.push_str(&format!(
                    " (NAME_MAX), and this name adds {extra} to {}'s: name the output with at most {} bytes",
                    name(files[0]),
                    max.saturating_sub(extra)
                ));
            } else {
                msg.push_str(" (NAME_MAX): choose a shorter name");
            }
            return Err(Error::io(p, msg));
        }
        if let Ok(meta) = std::fs::symlink_metadata(p)
            && !meta.is_file()
        {
            return Err(Error::io(
                p,
                format!(
                    "this is {}, not a regular file: it is left as it is (only regular files are replaced); write elsewhere",
                    crate::integrity::files::kind_of(&meta.file_type())
                ),
            ));
        }
    }
    Ok(())
}

/// The error of a step whose write was abandoned meanwhile (by [`remove_pending`]).
fn abandoned() -> std::io::Error {
    std::io::Error::other("the write was abandoned")
}

/// Whether the files could be written, before any work is done to make them: the names
/// fit the folder, no target is anything but a regular file, and without `overwrite`
/// none exists. [`write_all`] checks the same again.
pub fn preflight(targets: &[&Path], overwrite: bool) -> Result<()> {
    check_targets(targets)?;
    if !overwrite && let Some(p) = targets.iter().find(|p| std::fs::symlink_metadata(p).is_ok()) {
        return Err(Error::Io {
            path: p.display().to_string(),
            message: "already exists; it is left as it is (use --overwrite to replace it)".into(),
        });
    }
    Ok(())
}

/// Runs `f` on this write's record, holding the lock.
fn with_write<T>(id: u64, f: impl FnOnce(Option<&mut Placing>) -> T) -> T {
    let mut st = state();
    f(st.iter_mut().find(|w| w.id == id))
}

fn stage(id: u64, target: &Path, bytes: &[u8]) -> Result<tempfile::NamedTempFile> {
    let dir = folder_of(target);
    if !dir.is_dir() {
        return Err(Error::io(&dir, "this folder does not exist; create it first or write elsewhere with -o"));
    }
    let mut file = with_write(id, |w| {
        let file = tempfile::Builder::new().prefix(".ss-").suffix(".part").rand_bytes(8).tempfile_in(&dir).map_err(
            |e| match e.kind() {
                std::io::ErrorKind::PermissionDenied => {
                    Error::io(&dir, "cannot write in this folder (permission denied)")
                }
                _ if name_too_long(&e) => Error::io(&dir, format!("the folder's path is too long to write in ({e})")),
                _ => Error::io(&dir, format!("cannot write a file in this folder ({e})")),
            },
        )?;
        if let Some(w) = w {
            w.temps.push(file.path().to_path_buf());
        }
        Ok::<_, Error>(file)
    })?;
    file.write_all(bytes).and_then(|_| file.as_file().sync_all()).map_err(|e| Error::io(target, e))?;
    // a temporary file is private (0600); the output is an ordinary file
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        let _ = file.as_file().set_permissions(std::fs::Permissions::from_mode(0o644));
    }
    Ok(file)
}

/// Writes several files as one: all are staged first, then moved into place, the first
/// file first. With `overwrite`, the existing companions (every file after the first)
/// are removed before the first file is placed, so that an interrupt never leaves an
/// earlier companion beside a new first file. Without `overwrite`, an existing target is
/// an error and nothing is written. Only regular files are replaced.
pub fn write_all(files: &[(PathBuf, Vec<u8>)], overwrite: bool) -> Result<()> {
    write_all_observed(files, overwrite, &mut |_, _| {})
}

/// [`write_all`], calling `observe` after each step that changes what the targets are
/// (a companion removed, a file placed) with the path it changed and what an interrupt
/// at that point would say is on disk. It is called holding the lock the interrupt
/// handler waits for.
pub fn write_all_observed(
    files: &[(PathBuf, Vec<u8>)],
    overwrite: bool,
    observe: &mut dyn FnMut(&Path, &str),
) -> Result<()> {
    if files.is_empty() {
        return Ok(());
    }
    let targets: Vec<&Path> = files.iter().map(|(p, _)| p.as_path()).collect();
    preflight(&targets, overwrite)?;
    let id = NEXT_ID.fetch_add(1, Ordering::Relaxed);
    state().push(Placing {
        id,
        overwrite,
        temps: Vec::new(),
        targets: files.iter().map(|(p, _)| p.clone()).collect(),
        removed: Vec::new(),
        placed: Vec::new(),
    });
    let fail = |target: &Path, e: &dyn std::fmt::Display| -> Error {
        let what = abandon_write(id);
        Error::io(target, format!("{e}; {what}"))
    };
    let mut staged = Vec::new();
    for (p, bytes) in files {
        match stage(id, p, bytes) {
            Ok(t) => staged.push((t, p.clone())),
            Err(e) => {
                drop(staged);
                abandon_write(id);
                return Err(e);
            }
        }
    }
    if overwrite {
        for (p, _) in &files[1..] {
            let res = with_write(id, |w| {
                let Some(w) = w else { return Err(abandoned()) };
                match std::fs::remove_file(p) {
                    Ok(()) => {
                        w.removed.push(p.clone());
                        observe(p, &w.summary());
                        Ok(())
                    }
                    Err(e) if e.kind() == std::io::ErrorKind::NotFound => Ok(()),
                    Err(e) => Err(e),
                }
            });
            if let Err(e) = res {
                return Err(fail(p, &format!("the earlier file cannot be removed ({e})")));
            }
        }
    }
    for (t, target) in staged {
        let res = with_write(id, |w| {
            let Some(w) = w else { return Err(abandoned()) };
            let tmp_path = t.path().to_path_buf();
            let res = if overwrite { t.persist(&target).map(|_| ()) } else { t.persist_noclobber(&target).map(|_| ()) };
            w.temps.retain(|p| p != &tmp_path);
            match res {
                Ok(()) => {
                    w.placed.push(target.clone());
                    observe(&target, &w.summary());
                    Ok(())
                }
                Err(e) => {
                    let _ = std::fs::remove_file(&tmp_path);
                    Err(e.error)
                }
            }
        });
        if let Err(e) = res {
            let why = if name_too_long(&e) {
                format!("the name is too long ({e})")
            } else {
                format!("cannot be moved into place ({e})")
            };
            return Err(fail(&target, &why));
        }
    }
    let mut st = state();
    st.retain(|w| w.id != id);
    Ok(())
}
