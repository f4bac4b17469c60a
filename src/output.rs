//! Writing outputs so that nothing half-written is ever left on disk: each file is
//! written to a temporary file in the same folder, flushed, then renamed into place. An
//! existing file is replaced only when asked. An interrupt (Ctrl-C) removes the
//! temporary files before the process ends.

use crate::error::{Error, Result};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::sync::Mutex;

static PENDING: Mutex<Vec<PathBuf>> = Mutex::new(Vec::new());

fn pending() -> std::sync::MutexGuard<'static, Vec<PathBuf>> {
    PENDING.lock().unwrap_or_else(|e| e.into_inner())
}

/// Removes the temporary files of writes in progress (called on interrupt).
pub fn remove_pending() {
    for p in pending().drain(..) {
        let _ = std::fs::remove_file(p);
    }
}

/// Installs the interrupt handler: pending temporary files are removed and the process
/// exits with status 130.
pub fn on_interrupt_clean_up() {
    let _ = ctrlc::set_handler(|| {
        remove_pending();
        eprintln!("interrupted: nothing was written");
        std::process::exit(130);
    });
}

struct Temp {
    file: tempfile::NamedTempFile,
    target: PathBuf,
}

fn stage(target: &Path, bytes: &[u8]) -> Result<Temp> {
    let dir = match target.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    if !dir.is_dir() {
        return Err(Error::io(&dir, "this folder does not exist; create it first or write elsewhere with -o"));
    }
    let name = target.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let mut file = tempfile::Builder::new()
        .prefix(&format!(".{name}."))
        .suffix(".part")
        .tempfile_in(&dir)
        .map_err(|e| Error::io(&dir, format!("cannot write here ({})", e.kind())))?;
    pending().push(file.path().to_path_buf());
    file.write_all(bytes).and_then(|_| file.as_file().sync_all()).map_err(|e| Error::io(target, e))?;
    // a temporary file is private (0600); the output is an ordinary file
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        let _ = file.as_file().set_permissions(std::fs::Permissions::from_mode(0o644));
    }
    Ok(Temp { file, target: target.to_path_buf() })
}

/// Writes several files as one: all are staged first; then each is moved into place.
/// Without `overwrite`, an existing target is an error and nothing is written.
pub fn write_all(files: &[(PathBuf, Vec<u8>)], overwrite: bool) -> Result<()> {
    if !overwrite && let Some((p, _)) = files.iter().find(|(p, _)| p.exists()) {
        return Err(Error::Io {
            path: p.display().to_string(),
            message: "already exists; it is left as it is (use --overwrite to replace it)".into(),
        });
    }
    let mut staged = Vec::new();
    for (p, bytes) in files {
        match stage(p, bytes) {
            Ok(t) => staged.push(t),
            Err(e) => {
                remove_pending();
                return Err(e);
            }
        }
    }
    let mut placed: Vec<PathBuf> = Vec::new();
    for t in staged {
        let tmp_path = t.file.path().to_path_buf();
        let res = if overwrite {
            t.file.persist(&t.target).map(|_| ())
        } else {
            t.file.persist_noclobber(&t.target).map(|_| ())
        };
        pending().retain(|p| p != &tmp_path);
        if let Err(e) = res {
            let _ = std::fs::remove_file(&tmp_path);
            if !overwrite {
                for p in &placed {
                    let _ = std::fs::remove_file(p);
                }
            }
            remove_pending();
            return Err(Error::io(&t.target, e.error));
        }
        placed.push(t.target);
    }
    Ok(())
}
