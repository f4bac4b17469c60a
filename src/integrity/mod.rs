//! Integrity: proving that a package is what was issued.
//!
//! Two hashes, always named: the **content hash (payload)**, the SHA-256 of the
//! payload's canonical bytes ([`content_hash`]), on the cover and in every title block;
//! and the **file hash (PDF)**, the SHA-256 of the PDF file, in its sidecar
//! ([`sidecar`]). [`verify`] re-runs the pipeline to prove both, [`sign`] signs a
//! file, [`diff`] compares two packages or inputs, and [`files`] reads what these
//! commands are given (regular files only, to a limit).

pub mod attached;
pub mod content_hash;
pub mod diff;
pub mod files;
pub mod sidecar;
pub mod sign;
pub mod verify;

use sha2::{Digest, Sha256};

/// SHA-256 of bytes, lowercase hex.
pub fn sha256_hex(bytes: &[u8]) -> String {
    hex::encode(Sha256::digest(bytes))
}

#[cfg(test)]
mod tests {
    // FIPS 180-2 test vector: SHA-256("abc")
    #[test]
    fn sha256_of_abc() {
        assert_eq!(super::sha256_hex(b"abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    }
}
