//! File signatures: an Ed25519 key pair for the engineer of record, and a small text
//! file `FILE.pdf.sig` holding signer, license, date, the file's SHA-256 and the
//! signature over those lines.
//!
//! A signature proves who issued a file and that it has not changed since. It is not a
//! professional seal under a licensing board's digital-signature rules, and it
//! complements, never replaces, the sign-off block inside the package.

use crate::error::{Error, Result};
use crate::seal::sha256_hex;
use ed25519_dalek::{Signature, Signer, SigningKey, Verifier, VerifyingKey};
use std::io::Write;
use std::path::{Path, PathBuf};

const KEY_HEAD: &str = "strainsheet-signing-key 1";
const PUB_HEAD: &str = "strainsheet-public-key 1";
const SIG_HEAD: &str = "strainsheet-signature 1";

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
    let text = std::fs::read_to_string(path).map_err(|e| Error::io(path, e))?;
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
fn message(signer: &str, license: &str, date: &str, file: &str, sha: &str, public: &str) -> String {
    format!(
        "{SIG_HEAD}\nsigner: {signer}\nlicense: {license}\ndate: {date}\nfile: {file}\nsha256: {sha}\npublic-key: {public}\n"
    )
}

/// Signs a file: writes `FILE.sig` (never over an existing one unless asked).
pub fn sign(file: &Path, key: &Path, date: Option<&str>, overwrite: bool) -> Result<PathBuf> {
    let k = read_key(key)?;
    let bytes = std::fs::read(file).map_err(|e| Error::io(file, e))?;
    let date = match date {
        Some(d) => clean(d, "--date")?,
        None => today_utc(),
    };
    let name = file.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let msg =
        message(&k.name, &k.license, &date, &name, &sha256_hex(&bytes), &hex::encode(k.sk.verifying_key().to_bytes()));
    let sig = k.sk.sign(msg.as_bytes());
    let text = format!("{msg}signature: {}\n", hex::encode(sig.to_bytes()));
    let mut out = file.as_os_str().to_os_string();
    out.push(".sig");
    let out = PathBuf::from(out);
    crate::output::write_all(&[(out.clone(), text.into_bytes())], overwrite)?;
    Ok(out)
}

/// Checks a signature file against a public key file and the file's bytes. Returns
/// "name (license), date" of the signer.
pub fn check(sig_path: &Path, pubkey: &Path, file: &[u8]) -> std::result::Result<String, String> {
    let sig_text = std::fs::read_to_string(sig_path).map_err(|e| format!("{}: {e}", sig_path.display()))?;
    let pub_text = std::fs::read_to_string(pubkey).map_err(|e| format!("{}: {e}", pubkey.display()))?;
    let sf = fields(&sig_text, SIG_HEAD).map_err(|e| format!("{}: not a signature file: {e}", sig_path.display()))?;
    let pf = fields(&pub_text, PUB_HEAD).map_err(|e| format!("{}: not a public key file: {e}", pubkey.display()))?;
    let get = |fs: &[(String, String)], k: &str, p: &Path| {
        field(fs, k).map(str::to_string).map_err(|e| format!("{}: {e}", p.display()))
    };
    let public = get(&pf, "public", pubkey)?;
    let claimed = get(&sf, "public-key", sig_path)?;
    if public != claimed {
        return Err(format!("{} was made with another key than {}", sig_path.display(), pubkey.display()));
    }
    let pk_bytes: [u8; 32] =
        hex::decode(&public).ok().and_then(|b| b.try_into().ok()).ok_or("the public key is not 64 hex digits")?;
    let vk =
        VerifyingKey::from_bytes(&pk_bytes).map_err(|_| "the public key is not a valid Ed25519 key".to_string())?;
    let (signer, license, date, name, sha) = (
        get(&sf, "signer", sig_path)?,
        get(&sf, "license", sig_path)?,
        get(&sf, "date", sig_path)?,
        get(&sf, "file", sig_path)?,
        get(&sf, "sha256", sig_path)?,
    );
    let sig_hex = get(&sf, "signature", sig_path)?;
    let sig_bytes: [u8; 64] =
        hex::decode(&sig_hex).ok().and_then(|b| b.try_into().ok()).ok_or("the signature is not 128 hex digits")?;
    let msg = message(&signer, &license, &date, &name, &sha, &public);
    vk.verify(msg.as_bytes(), &Signature::from_bytes(&sig_bytes)).map_err(|_| {
        format!("{}: the signature does not match its contents (the signature file was altered)", sig_path.display())
    })?;
    let have = sha256_hex(file);
    if have != sha {
        return Err(format!(
            "the signature is for a file with SHA-256 {sha}; this file hashes to {have}: the file changed after it was signed"
        ));
    }
    Ok(format!("{signer} ({license}), signed {date}"))
}
