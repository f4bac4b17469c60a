//! File signatures: an Ed25519 key pair for the engineer of record, and a small text
//! file `FILE.pdf.sig` holding signer, license, date, the file's SHA-256 and the
//! signature over those lines.
//!
//! A signature file is exactly what `sign` writes, and nothing else is accepted: UTF-8,
//! line ends LF only (a CR LF file was converted in transit: restore the original), the
//! header line, then one line each, in this order, of `signer`, `license`, `date`,
//! `file`, `sha256`, `status` (only for a draft: `status: draft`), `public-key` and
//! `signature`, each `key: value` with one space and no space at either end of the
//! value, the hashes and keys in lowercase hex, and one line end after the signature.
//! A field twice, a line of any other kind, blank lines, trailing spaces, or anything
//! after the signature line (free text, a second signature) make it invalid. The
//! signed message is every line before `signature:`; a signature of an older version
//! (without a `status` line) verifies as it did.
//!
//! Only packages are signed, and a draft (not every sign-off dated) only when asked:
//! its signature then carries `status: draft`.
//!
//! A signature proves who issued a file and that it has not changed since. It is not a
//! professional seal under a licensing board's digital-signature rules, and it
//! complements, never replaces, the sign-off block inside the package.

use crate::error::{Error, Result};
use crate::integrity::sha256_hex;
use ed25519_dalek::{Signature, Signer, SigningKey, Verifier, VerifyingKey};
use std::io::Write;
use std::path::{Path, PathBuf};

const KEY_HEAD: &str = "strainsheet-signing-key 1";
const PUB_HEAD: &str = "strainsheet-public-key 1";
const SIG_HEAD: &str = "strainsheet-signature 1";
/// The largest key or signature file read.
const MAX_KEY_BYTES: u64 = 64 * 1024;
/// The fields of a signature file, in their order (`status` only for a draft).
const SIG_FIELDS: [&str; 8] = ["signer", "license", "date", "file", "sha256", "status", "public-key", "signature"];

/// Fields of a key or signature file: `key: value` lines after a header line.
fn fields(text: &str, head: &str) -> std::result::Result<Vec<(String, String)>, String> {
    let mut lines = text.lines();
    if lines.next().map(str::trim) != Some(head) {
        return Err(format!("it does not start with {head:?}"));
    }
    Ok(lines
        .filter(|l| !l.trim().is_empty())
        .filter_map(|l| l.split_once(':').map(|(k, v)| (k.trim().to_string(), v.trim().to_string())))
        .collect())
}

fn field<'a>(fs: &'a [(String, String)], k: &str) -> std::result::Result<&'a str, String> {
    fs.iter().find(|(key, _)| key == k).map(|(_, v)| v.as_str()).ok_or_else(|| format!("it has no {k:?} line"))
}

fn clean(s: &str, what: &str) -> Result<String> {
    let t = s.trim();
    if t.is_empty() || t.chars().any(|c| c.is_control()) || t.len() > 200 {
        return Err(Error::Usage(format!("{what} must be 1 to 200 printable characters on one line")));
    }
    Ok(t.to_string())
}

/// The public key file beside a private key file.
pub fn public_path(key: &Path) -> PathBuf {
    let mut s = key.as_os_str().to_os_string();
    s.push(".pub");
    PathBuf::from(s)
}

/// Writes a new key pair: `KEY` (private, mode 0600) and `KEY.pub`. Never overwrites.
pub fn keygen(key: &Path, name: &str, license: &str) -> Result<PathBuf> {
    let name = clean(name, "--name")?;
    let license = clean(license, "--license")?;
    let mut secret = [0u8; 32];
    getrandom::fill(&mut secret).map_err(|e| Error::Usage(format!("no randomness available for a key: {e}")))?;
    let sk = SigningKey::from_bytes(&secret);
    let pk = sk.verifying_key();
    let pub_path = public_path(key);
    for p in [key, pub_path.as_path()] {
        if p.exists() {
            return Err(Error::Io {
                path: p.display().to_string(),
                message: "already exists; keys are never overwritten".into(),
            });
        }
    }
    let private = format!("{KEY_HEAD}\nname: {name}\nlicense: {license}\nsecret: {}\n", hex::encode(secret));
    let public = format!("{PUB_HEAD}\nname: {name}\nlicense: {license}\npublic: {}\n", hex::encode(pk.to_bytes()));
    write_private(key, private.as_bytes())?;
    if let Err(e) = crate::output::write_all(&[(pub_path.clone(), public.into_bytes())], false) {
        let _ = std::fs::remove_file(key);
        return Err(e);
    }
    Ok(pub_path)
}

/// Creates a file readable by its owner only, refusing to replace one.
fn write_private(path: &Path, bytes: &[u8]) -> Result<()> {
    let mut opts = std::fs::OpenOptions::new();
    opts.write(true).create_new(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt;
        opts.mode(0o600);
    }
    let mut f = opts.open(path).map_err(|e| Error::io(path, e))?;
    if let Err(e) = f.write_all(bytes).and_then(|_| f.sync_all()) {
        let _ = std::fs::remove_file(path);
        return Err(Error::io(path, e));
    }
    Ok(())
}

struct Key {
    name: String,
    license: String,
    sk: SigningKey,
}

fn read_key(path: &Path) -> Result<Key> {
    let text = crate::integrity::files::read_text(path, MAX_KEY_BYTES, "the signing key")?;
    let bad = |why: String| Error::Usage(format!("{}: not a strainsheet signing key: {why}", path.display()));
    let fs = fields(&text, KEY_HEAD).map_err(bad)?;
    let hexs = field(&fs, "secret").map_err(bad)?;
    let bytes: [u8; 32] = hex::decode(hexs)
        .ok()
        .and_then(|b| b.try_into().ok())
        .ok_or_else(|| bad("the secret is not 64 hex digits".into()))?;
    Ok(Key {
        name: field(&fs, "name").map_err(bad)?.to_string(),
        license: field(&fs, "license").map_err(bad)?.to_string(),
        sk: SigningKey::from_bytes(&bytes),
    })
}

/// Today's date in UTC, from the clock (the date a signature is made).
fn today_utc() -> String {
    let secs = std::time::SystemTime::now().duration_since(std::time::UNIX_EPOCH).map(|d| d.as_secs()).unwrap_or(0);
    let days = (secs / 86_400) as i64;
    // civil date from days since 1970-01-01 (proleptic Gregorian)
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z - era * 146_097;
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let y = yoe + era * 400;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = doy - (153 * mp + 2) / 5 + 1;
    let m = if mp < 10 { mp + 3 } else { mp - 9 };
    format!("{:04}-{:02}-{:02}", if m <= 2 { y + 1 } else { y }, m, d)
}

/// The signed part of a signature file (every line before `signature:`).
fn message(f: &SigFields) -> String {
    let status = match &f.status {
        Some(s) => format!("status: {s}\n"),
        None => String::new(),
    };
    format!(
        "{SIG_HEAD}\nsigner: {}\nlicense: {}\ndate: {}\nfile: {}\nsha256: {}\n{status}public-key: {}\n",
        f.signer, f.license, f.date, f.file, f.sha256, f.public
    )
}

/// The fields of a signature file.
#[derive(Debug, Clone, PartialEq)]
struct SigFields {
    signer: String,
    license: String,
    date: String,
    file: String,
    sha256: String,
    /// `Some("draft")` for the signature of a draft.
    status: Option<String>,
    public: String,
    signature: String,
}

impl SigFields {
    fn text(&self) -> String {
        format!("{}signature: {}\n", message(self), self.signature)
    }
}

/// Reads a signature file that must be exactly in the form `sign` writes (see the
/// module documentation); says what is wrong otherwise.
fn parse_signature(text: &str) -> std::result::Result<SigFields, String> {
    if text.contains('\r') {
        return Err("it has carriage returns (Windows CR LF line ends?); sign writes LF line ends only, so the file \
                    was changed after it was written (a text-mode transfer converts them): use the original file"
            .into());
    }
    let Some(body) = text.strip_suffix('\n') else {
        return Err("it does not end with a line end after the signature line".into());
    };
    let mut lines = body.split('\n').enumerate().map(|(i, l)| (i + 1, l));
    if lines.next().map(|(_, l)| l) != Some(SIG_HEAD) {
        return Err(format!("its first line is not {SIG_HEAD:?}"));
    }
    let mut seen: Vec<(&str, usize, &str)> = Vec::new();
    for (n, line) in lines {
        if let Some((_, at, _)) = seen.iter().find(|(k, _, _)| *k == "signature") {
            return Err(format!(
                "it goes on after the signature line (line {at}) at line {n}: a signature file ends with its \
                 signature; appended text or a second signature is not accepted"
            ));
        }
        let Some((key, value)) = line.split_once(": ") else {
            return Err(format!("line {n} is not a `field: value` line: {:?}", short(line)));
        };
        let Some(pos) = SIG_FIELDS.iter().position(|f| *f == key) else {
            return Err(format!("line {n} is not a field of a signature file: {:?}", short(line)));
        };
        if let Some((_, first, _)) = seen.iter().find(|(k, _, _)| *k == key) {
            return Err(format!("the field {key:?} is given twice (lines {first} and {n})"));
        }
        if let Some((before, _, _)) = seen.last()
            && SIG_FIELDS.iter().position(|f| f == before).is_some_and(|b| b > pos)
        {
            return Err(format!("the field {key:?} (line {n}) comes after {before:?}, out of its order"));
        }
        if value.is_empty() || value.trim() != value || value.chars().any(char::is_control) {
            return Err(format!(
                "the value of {key:?} (line {n}) is empty or has spaces at an end or control characters"
            ));
        }
        seen.push((key, n, value));
    }
    let get = |k: &str| seen.iter().find(|(key, _, _)| *key == k).map(|(_, _, v)| v.to_string());
    let need = |k: &str| get(k).ok_or_else(|| format!("it has no {k:?} line"));
    let f = SigFields {
        signer: need("signer")?,
        license: need("license")?,
        date: need("date")?,
        file: need("file")?,
        sha256: need("sha256")?,
        status: get("status"),
        public: need("public-key")?,
        signature: need("signature")?,
    };
    if f.status.as_deref().is_some_and(|s| s != "draft") {
        return Err(format!(
            "its status is {:?}; the only status a signature records is \"draft\"",
            f.status.unwrap_or_default()
        ));
    }
    for (k, v, len) in [("sha256", &f.sha256, 64), ("public-key", &f.public, 64), ("signature", &f.signature, 128)] {
        if v.len() != len || !v.bytes().all(|b| b.is_ascii_digit() || (b'a'..=b'f').contains(&b)) {
            return Err(format!("its {k} is not {len} lowercase hex digits"));
        }
    }
    // the file holds nothing but these fields, as sign writes them
    if f.text() != text {
        return Err("it is not exactly in the form sign writes".into());
    }
    Ok(f)
}

fn short(line: &str) -> String {
    if line.chars().count() > 60 {
        format!("{}…", line.chars().take(59).collect::<String>())
    } else {
        line.to_string()
    }
}

/// A signature written by [`sign`].
#[derive(Debug)]
pub struct Signed {
    /// The signature file.
    pub path: PathBuf,
    /// Whether the signed package is a draft (the signature says `status: draft`).
    pub draft: bool,
}

/// Signs a package file: writes `FILE.sig` (never over an existing one unless asked).
/// Only a strainsheet package is signed, and a draft only with `draft_ok` (its
/// signature then records `status: draft`).
pub fn sign(file: &Path, key: &Path, date: Option<&str>, overwrite: bool, draft_ok: bool) -> Result<Signed> {
    let k = read_key(key)?;
    let opened = crate::integrity::attached::open(file).map_err(|e| match e {
        Error::Usage(m) => Error::Usage(format!("{m}; sign signs strainsheet packages only")),
        other => other,
    })?;
    // a payload this version cannot read is taken as a draft's
    let package = opened.stored.as_ref().ok().map(|s| &s.head.package);
    let draft = package.is_none_or(|p| p.draft);
    if draft && !draft_ok {
        let undated: Vec<String> = package
            .map(|p| {
                p.signoffs.iter().filter(|s| s.date.is_none()).map(|s| format!("{} ({})", s.role, s.name)).collect()
            })
            .unwrap_or_default();
        return Err(Error::Usage(format!(
            "{} is a DRAFT: {}; a draft is not signed unless --draft is given (the signature then records that it \
             is of a draft). Date every sign-off in the input and run report again to issue it",
            file.display(),
            if undated.is_empty() {
                "it lists no sign-off".to_string()
            } else {
                format!("not every sign-off is dated (undated: {})", undated.join(", "))
            }
        )));
    }
    let date = match date {
        Some(d) => clean(d, "--date")?,
        None => today_utc(),
    };
    let name = file.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let name = clean(&name, "the file's name")?;
    let mut f = SigFields {
        signer: k.name.clone(),
        license: k.license.clone(),
        date,
        file: name,
        sha256: sha256_hex(&opened.bytes),
        status: draft.then(|| "draft".to_string()),
        public: hex::encode(k.sk.verifying_key().to_bytes()),
        signature: String::new(),
    };
    f.signature = hex::encode(k.sk.sign(message(&f).as_bytes()).to_bytes());
    let mut out = file.as_os_str().to_os_string();
    out.push(".sig");
    let out = PathBuf::from(out);
    crate::output::write_all(&[(out.clone(), f.text().into_bytes())], overwrite)?;
    Ok(Signed { path: out, draft })
}

/// Checks a signature file against a public key file and the file's bytes. Returns
/// "name (license), date" of the signer, and ", of a DRAFT" for a draft's signature.
pub fn check(sig_path: &Path, pubkey: &Path, file: &[u8]) -> std::result::Result<String, String> {
    let sig_text = crate::integrity::files::read_text(sig_path, MAX_KEY_BYTES, "the signature file")
        .map_err(|e| plain(&e.to_string()))?;
    let pub_text = crate::integrity::files::read_text(pubkey, MAX_KEY_BYTES, "the public key file")
        .map_err(|e| plain(&e.to_string()))?;
    let sf =
        parse_signature(&sig_text).map_err(|e| format!("{}: not a valid signature file: {e}", sig_path.display()))?;
    let pf = fields(&pub_text, PUB_HEAD).map_err(|e| format!("{}: not a public key file: {e}", pubkey.display()))?;
    let public = field(&pf, "public").map(str::to_string).map_err(|e| format!("{}: {e}", pubkey.display()))?;
    if public != sf.public {
        return Err(format!("{} was made with another key than {}", sig_path.display(), pubkey.display()));
    }
    let pk_bytes: [u8; 32] =
        hex::decode(&public).ok().and_then(|b| b.try_into().ok()).ok_or("the public key is not 64 hex digits")?;
    let vk =
        VerifyingKey::from_bytes(&pk_bytes).map_err(|_| "the public key is not a valid Ed25519 key".to_string())?;
    let sig_bytes: [u8; 64] =
        hex::decode(&sf.signature).ok().and_then(|b| b.try_into().ok()).ok_or("the signature is not 128 hex digits")?;
    vk.verify(message(&sf).as_bytes(), &Signature::from_bytes(&sig_bytes)).map_err(|_| {
        format!("{}: the signature does not match its contents (the signature file was altered)", sig_path.display())
    })?;
    let have = sha256_hex(file);
    if have != sf.sha256 {
        return Err(format!(
            "the signature is for a file with the file hash (PDF) {}; this file hashes to {have}: the file changed after \
             it was signed",
            sf.sha256
        ));
    }
    let draft = if sf.status.is_some() { ", of a DRAFT" } else { "" };
    Ok(format!("{} ({}), signed {}{draft}", sf.signer, sf.license, sf.date))
}

/// An error's text without the "error: " its display begins with.
fn plain(s: &str) -> String {
    s.strip_prefix("error: ").unwrap_or(s).to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample(status: Option<&str>) -> SigFields {
        SigFields {
            signer: "A. Signer".into(),
            license: "PE 1".into(),
            date: "2026-12-01".into(),
            file: "p.pdf".into(),
            sha256: "a".repeat(64),
            status: status.map(str::to_string),
            public: "b".repeat(64),
            signature: "c".repeat(128),
        }
    }

    #[test]
    fn the_written_form_reads_back_and_nothing_else_does() {
        for f in [sample(None), sample(Some("draft"))] {
            let text = f.text();
            assert_eq!(parse_signature(&text).unwrap(), f);
            let bad = [
                (format!("{text}extra\n"), "goes on after"),
                (format!("{text}{text}"), "goes on after"),
                (format!("{text}\n"), "goes on after"),
                (text.replace('\n', "\r\n"), "carriage returns"),
                (text.trim_end().to_string(), "line end"),
                (text.replace("date: 2026-12-01\n", "date: 2026-12-01 \n"), "spaces"),
                (text.replace("date: 2026-12-01\n", "date: 2026-12-01\ndate: 2026-12-02\n"), "twice"),
                (text.replace("license: PE 1\n", ""), "no \"license\""),
                (text.replace("file: p.pdf\n", "file: p.pdf\nnote: hi\n"), "not a field"),
                (text.replace("file: p.pdf\n", "file: p.pdf\n\n"), "not a `field: value`"),
                (text.replace(&"a".repeat(64), &"A".repeat(64)), "lowercase"),
                (text.replace("signer: A. Signer\nlicense: PE 1\n", "license: PE 1\nsigner: A. Signer\n"), "order"),
                (text.replace("signer: A.", "signer:  A."), "spaces"),
            ];
            for (b, why) in bad {
                let e = parse_signature(&b).unwrap_err();
                assert!(e.contains(why), "{why}: {e}\n{b}");
            }
        }
        let e =
            parse_signature(&sample(None).text().replace("public-key:", "status: issued\npublic-key:")).unwrap_err();
        assert!(e.contains("only status"), "{e}");
    }
}
