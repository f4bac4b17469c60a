//! The content hash: the SHA-256 of the payload's canonical bytes.
//!
//! The payload is JSON written canonically: objects with their keys in byte order of
//! their UTF-8 text, no insignificant whitespace, strings as serde_json writes them
//! (UTF-8, minimal escapes), numbers as serde_json writes them (integers as integers,
//! floats in the shortest form that reads back to the same value, non-finite numbers as
//! null). The content hash is the SHA-256 of exactly those bytes, in lowercase hex.

use serde_json::Value;

/// Writes a JSON value canonically.
pub fn canonical(v: &Value) -> Vec<u8> {
    let mut out = Vec::with_capacity(1 << 16);
    write(v, &mut out);
    out
}

/// Arrays at least this long are written in parallel pieces (the members of a package).
const PARALLEL_FROM: usize = 8;

fn write(v: &Value, out: &mut Vec<u8>) {
    match v {
        Value::Object(map) => {
            let mut keys: Vec<&String> = map.keys().collect();
            keys.sort();
            out.push(b'{');
            for (i, k) in keys.into_iter().enumerate() {
                if i > 0 {
                    out.push(b',');
                }
                scalar(&Value::String(k.clone()), out);
                out.push(b':');
                write(&map[k], out);
            }
            out.push(b'}');
        }
        Value::Array(xs) if xs.len() >= PARALLEL_FROM && xs.iter().any(|x| x.is_object()) => {
            use rayon::prelude::*;
            let parts: Vec<Vec<u8>> = xs
                .par_iter()
                .map(|x| {
                    let mut b = Vec::new();
                    write(x, &mut b);
                    b
                })
                .collect();
            out.push(b'[');
            for (i, p) in parts.iter().enumerate() {
                if i > 0 {
                    out.push(b',');
                }
                out.extend_from_slice(p);
            }
            out.push(b']');
        }
        Value::Array(xs) => {
            out.push(b'[');
            for (i, x) in xs.iter().enumerate() {
                if i > 0 {
                    out.push(b',');
                }
                write(x, out);
            }
            out.push(b']');
        }
        other => scalar(other, out),
    }
}

/// A string, number, boolean or null as serde_json writes it (writing to memory cannot
/// fail for these).
fn scalar(v: &Value, out: &mut Vec<u8>) {
    let _ = serde_json::to_writer(&mut *out, v);
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    #[test]
    fn canonical_sorts_keys_and_drops_space() {
        let v = json!({"b": 1, "a": [1.5, "x", null], "c": {"z": true, "y": 0.1}});
        assert_eq!(String::from_utf8(canonical(&v)).unwrap(), r#"{"a":[1.5,"x",null],"b":1,"c":{"y":0.1,"z":true}}"#);
    }
}
