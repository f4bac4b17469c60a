//! Reading the files the integrity commands are given (a package, its sidecar, a
//! signature, a key, a TOML input to compare): regular files only, each opened once and
//! read to a size limit, so that a named pipe, a device such as /dev/zero, or a folder
//! is refused with its reason instead of blocking or reading without end.

use crate::error::{Error, Result};
use std::io::Read;
use std::path::Path;

/// What a file that is not a regular file is, in words.
pub fn kind_of(ft: &std::fs::FileType) -> &'static str {
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt;
        if ft.is_fifo() {
            return "a named pipe";
        }
        if ft.is_char_device() {
            return "a character device";
        }
        if ft.is_block_device() {
            return "a block device";
        }
        if ft.is_socket() {
            return "a socket";
        }
    }
    if ft.is_dir() {
        "a folder"
    } else if ft.is_symlink() {
        "a symbolic link"
    } else if ft.is_file() {
        "a regular file"
    } else {
        "not a regular file"
    }
}

/// Reads a regular file of at most `limit` bytes; `what` names it in messages ("the
/// package", "the signature file"). The file is opened once (without waiting, so a named
/// pipe with no writer does not block) and what was opened is checked: a pipe, a device,
/// a socket or a folder is refused, and so is a file longer than `limit` (also one that
/// grows while it is read).
pub fn read_regular(path: &Path, limit: u64, what: &str) -> Result<Vec<u8>> {
    let mut opts = std::fs::OpenOptions::new();
    opts.read(true);
    #[cfg(target_os = "linux")]
    {
        use std::os::unix::fs::OpenOptionsExt;
        // open(2) of a FIFO for reading waits for a writer unless O_NONBLOCK is given; for
        // a regular file the flag changes nothing
        opts.custom_flags(libc::O_NONBLOCK | libc::O_CLOEXEC);
    }
    #[cfg(not(target_os = "linux"))]
    {
        // without the flag, look before opening (a pipe would block the open)
        if let Ok(m) = std::fs::metadata(path)
            && !m.is_file()
        {
            return Err(not_regular(path, what, kind_of(&m.file_type())));
        }
    }
    let file = opts.open(path).map_err(|e| match std::fs::metadata(path) {
        // a socket cannot be opened at all: say what it is
        Ok(m) if !m.is_file() => not_regular(path, what, kind_of(&m.file_type())),
        _ => Error::io(path, open_error(&e, what)),
    })?;
    let meta = file.metadata().map_err(|e| Error::io(path, e))?;
    if !meta.is_file() {
        return Err(not_regular(path, what, kind_of(&meta.file_type())));
    }
    if meta.len() > limit {
        return Err(too_large(path, what, meta.len(), limit));
    }
    let mut bytes = Vec::with_capacity(meta.len() as usize);
    file.take(limit + 1).read_to_end(&mut bytes).map_err(|e| Error::io(path, e))?;
    if bytes.len() as u64 > limit {
        return Err(Error::io(path, format!("{what} grew beyond {} while it was read", size(limit))));
    }
    Ok(bytes)
}

/// Reads a regular file that must be UTF-8 text.
pub fn read_text(path: &Path, limit: u64, what: &str) -> Result<String> {
    let bytes = read_regular(path, limit, what)?;
    String::from_utf8(bytes).map_err(|e| {
        Error::io(path, format!("{what} is not UTF-8 text (byte {} is not)", e.utf8_error().valid_up_to() + 1))
    })
}

fn not_regular(path: &Path, what: &str, kind: &str) -> Error {
    Error::io(path, format!("{what} must be a regular file, and this is {kind}: it is not read"))
}

fn too_large(path: &Path, what: &str, len: u64, limit: u64) -> Error {
    Error::io(path, format!("{what} is {len} bytes long; at most {} is read", size(limit)))
}

/// A byte count as people write it ("512 MiB", "64 KiB").
pub fn size(bytes: u64) -> String {
    if bytes >= 1 << 20 && bytes.is_multiple_of(1 << 20) {
        format!("{} MiB", bytes >> 20)
    } else if bytes >= 1 << 10 && bytes.is_multiple_of(1 << 10) {
        format!("{} KiB", bytes >> 10)
    } else {
        format!("{bytes} bytes")
    }
}

fn open_error(e: &std::io::Error, what: &str) -> String {
    match e.kind() {
        std::io::ErrorKind::NotFound => format!("{what} does not exist"),
        std::io::ErrorKind::PermissionDenied => format!("{what} cannot be read (permission denied)"),
        _ => format!("{what} cannot be opened ({e})"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sizes_read_as_people_write_them() {
        assert_eq!(size(512 * 1024 * 1024), "512 MiB");
        assert_eq!(size(64 * 1024), "64 KiB");
        assert_eq!(size(1000), "1000 bytes");
    }

    #[test]
    fn a_file_over_the_limit_is_refused_and_one_at_it_is_read() {
        let dir = tempfile::tempdir().unwrap();
        let p = dir.path().join("f");
        std::fs::write(&p, vec![b'a'; 100]).unwrap();
        assert_eq!(read_regular(&p, 100, "the file").unwrap().len(), 100);
        let e = read_regular(&p, 99, "the file").unwrap_err().to_string();
        assert!(e.contains("100 bytes long") && e.contains("at most 99 bytes"), "{e}");
        let e = read_regular(dir.path(), 99, "the file").unwrap_err().to_string();
        assert!(e.contains("a folder"), "{e}");
    }
}
