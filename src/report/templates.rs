//! The templates: the built-in set (embedded at build time) or a folder of a firm's
//! own, read safely, and the hash that records which set made a package.

use crate::error::{Error, Result};
use std::collections::BTreeMap;
use std::path::Path;

/// The built-in templates, embedded at build time.
const BUILTIN: &[(&str, &str)] = &[
    ("package.typ", include_str!("../../templates/package.typ")),
    ("members.typ", include_str!("../../templates/members.typ")),
    ("sheet-numbers.typ", include_str!("../../templates/sheet-numbers.typ")),
    ("sheet.typ", include_str!("../../templates/sheet.typ")),
    ("member.typ", include_str!("../../templates/member.typ")),
    ("figures.typ", include_str!("../../templates/figures.typ")),
    ("curve.typ", include_str!("../../templates/curve.typ")),
    ("demand.typ", include_str!("../../templates/demand.typ")),
    ("stresses.typ", include_str!("../../templates/stresses.typ")),
];

/// Names the world reserves for the package's data.
pub const DATA_FILES: &[&str] = &["payload.json", "view.json", "content-hash.json", "input.toml"];

/// The entry template of the front and back matter.
pub const MAIN: &str = "/package.typ";
/// The entry template of a run of members.
pub const MEMBERS: &str = "/members.typ";
/// The entry template of the sheet numbers.
pub const NUMBERS: &str = "/sheet-numbers.typ";
/// The entry templates every template folder must hold.
const ENTRIES: [&str; 3] = [MAIN, MEMBERS, NUMBERS];

/// Limits on a template folder.
const MAX_TEMPLATE_FILES: usize = 200;
const MAX_TEMPLATE_BYTES: u64 = 20 * 1024 * 1024;

/// A set of templates and where it came from.
#[derive(Debug, Clone)]
pub struct Templates {
    pub(super) files: BTreeMap<String, Vec<u8>>,
    /// `None` for the built-in set, else the SHA-256 of the folder (see [`Templates::hash_of`]).
    hash: Option<String>,
}

impl Templates {
    pub fn builtin() -> Templates {
        Templates { files: BUILTIN.iter().map(|(n, t)| (format!("/{n}"), t.as_bytes().to_vec())).collect(), hash: None }
    }

    /// Reads a template folder: regular files only (links are refused), at most
    /// [`MAX_TEMPLATE_FILES`] files and 20 MiB. The folder must hold the three entry
    /// templates: `package.typ`, `members.typ` and `sheet-numbers.typ`.
    ///
    /// Each entry is opened once, relative to its folder as opened, without following a
    /// link (`O_NOFOLLOW`), and what was opened is checked (`fstat`): an entry swapped for
    /// a link, a pipe or a device after the folder was listed is refused, never followed
    /// or waited on.
    pub fn from_dir(dir: &Path) -> Result<Templates> {
        use std::io::Read;
        let link = |p: &Path| {
            Error::Usage(format!(
                "{}: the template folder holds a link; links are not followed, copy the file in instead",
                p.display()
            ))
        };
        let swapped = |p: &Path, kind: &str| {
            Error::Usage(format!(
                "{}: this entry of the template folder became {kind} while the folder was read; it is not read",
                p.display()
            ))
        };
        let mut files = BTreeMap::new();
        let mut total = 0u64;
        let root = open_entry(None, dir, true).map_err(|e| Error::io(dir, e))?;
        let mut stack = vec![(root, dir.to_path_buf(), String::new())];
        while let Some((folder, path, rel)) = stack.pop() {
            let entries = std::fs::read_dir(&path).map_err(|e| Error::io(&path, e))?;
            let mut entries: Vec<_> = entries.filter_map(|e| e.ok()).collect();
            entries.sort_by_key(|e| e.file_name());
            for e in entries {
                let p = e.path();
                let name = e.file_name().to_string_lossy().into_owned();
                let meta = std::fs::symlink_metadata(&p).map_err(|err| Error::io(&p, err))?;
                let vrel = if rel.is_empty() { name.clone() } else { format!("{rel}/{name}") };
                if meta.file_type().is_symlink() {
                    return Err(link(&p));
                }
                if !meta.is_dir() && !meta.is_file() {
                    continue;
                }
                // open what the name holds now, in the folder as opened, never through a link
                let opened = match open_entry(Some(&folder), &p, meta.is_dir()) {
                    Ok(f) => f,
                    Err(err) if is_link_error(&err) => return Err(link(&p)),
                    Err(err) => return Err(Error::io(&p, err)),
                };
                let now = opened.metadata().map_err(|err| Error::io(&p, err))?;
                if meta.is_dir() {
                    if !now.is_dir() {
                        return Err(swapped(&p, crate::integrity::files::kind_of(&now.file_type())));
                    }
                    stack.push((opened, p, vrel));
                    continue;
                }
                if !now.is_file() {
                    return Err(swapped(&p, crate::integrity::files::kind_of(&now.file_type())));
                }
                if DATA_FILES.contains(&vrel.as_str()) {
                    return Err(Error::Usage(format!(
                        "{}: the name {vrel} is reserved for the package's data",
                        p.display()
                    )));
                }
                let too_large = || {
                    Error::Usage(format!(
                        "{}: the template folder is too large (at most {MAX_TEMPLATE_FILES} files and 20 MiB)",
                        dir.display()
                    ))
                };
                if files.len() >= MAX_TEMPLATE_FILES || total + now.len() > MAX_TEMPLATE_BYTES {
                    return Err(too_large());
                }
                // read what was opened, and no more than the limit leaves (a file that grows
                // while it is read is stopped there)
                let room = MAX_TEMPLATE_BYTES - total;
                let mut bytes = Vec::with_capacity(now.len() as usize);
                opened.take(room + 1).read_to_end(&mut bytes).map_err(|err| Error::io(&p, err))?;
                if bytes.len() as u64 > room {
                    return Err(too_large());
                }
                total += bytes.len() as u64;
                files.insert(format!("/{vrel}"), bytes);
            }
        }
        let missing: Vec<&str> = ENTRIES.iter().filter(|e| !files.contains_key(**e)).map(|e| &e[1..]).collect();
        if !missing.is_empty() {
            // a folder copied from an earlier version: say what its files are called now
            let renamed = if files.contains_key("/stamps.typ") {
                "; stamps.typ is now called sheet-numbers.typ (it reads data.sheet_numbers where it read \
                 data.stamp), and seal.json is now content-hash.json"
            } else {
                ""
            };
            return Err(Error::Usage(format!(
                "{}: the template folder has no {} (it must hold package.typ, members.typ and sheet-numbers.typ){renamed}",
                dir.display(),
                missing.join(" and ")
            )));
        }
        let hash = Some(Self::hash_of(&files));
        Ok(Templates { files, hash })
    }

    /// SHA-256 over the sorted list of `path NUL sha256(content) LF`.
    fn hash_of(files: &BTreeMap<String, Vec<u8>>) -> String {
        let mut listing = Vec::new();
        for (p, b) in files {
            listing.extend_from_slice(p.as_bytes());
            listing.push(0);
            listing.extend_from_slice(crate::integrity::sha256_hex(b).as_bytes());
            listing.push(b'\n');
        }
        crate::integrity::sha256_hex(&listing)
    }

    /// What the payload records: "builtin" or "sha256:<hex>".
    pub fn provenance(&self) -> String {
        match &self.hash {
            None => "builtin".into(),
            Some(h) => format!("sha256:{h}"),
        }
    }
}

/// Opens an entry of a template folder for [`Templates::from_dir`]: on Linux relative to
/// its folder as opened (`openat`), never following a link at its name (`O_NOFOLLOW`) and
/// never waiting (`O_NONBLOCK`: a pipe put in its place opens at once, and is refused by
/// its type); `folder` is `None` for the folder given, which is opened by its path.
fn open_entry(folder: Option<&std::fs::File>, path: &Path, dir: bool) -> std::io::Result<std::fs::File> {
    #[cfg(target_os = "linux")]
    {
        use std::os::fd::{AsRawFd, FromRawFd};
        use std::os::unix::ffi::OsStrExt;
        let mut flags = libc::O_RDONLY | libc::O_CLOEXEC | libc::O_NONBLOCK;
        if dir {
            flags |= libc::O_DIRECTORY;
        }
        let (at, name) = match folder {
            Some(f) => {
                flags |= libc::O_NOFOLLOW;
                (f.as_raw_fd(), path.file_name().unwrap_or(path.as_os_str()))
            }
            None => (libc::AT_FDCWD, path.as_os_str()),
        };
        let c = std::ffi::CString::new(name.as_bytes())
            .map_err(|_| std::io::Error::new(std::io::ErrorKind::InvalidInput, "a name with a NUL byte"))?;
        // SAFETY: openat reads the NUL-terminated name; `at` is a descriptor we hold open
        // (or AT_FDCWD). A descriptor it returns is ours alone, and File takes it over.
        let fd = unsafe { libc::openat(at, c.as_ptr(), flags) };
        if fd < 0 {
            return Err(std::io::Error::last_os_error());
        }
        // SAFETY: fd is a fresh, valid descriptor that nothing else owns.
        Ok(unsafe { std::fs::File::from_raw_fd(fd) })
    }
    #[cfg(not(target_os = "linux"))]
    {
        // elsewhere the entry is opened by its path; what was opened is still checked
        let _ = (folder, dir);
        std::fs::File::open(path)
    }
}

/// Whether opening failed because the name is a link (`O_NOFOLLOW` gives ELOOP).
fn is_link_error(e: &std::io::Error) -> bool {
    #[cfg(target_os = "linux")]
    if e.raw_os_error() == Some(libc::ELOOP) {
        return true;
    }
    let _ = e;
    false
}
