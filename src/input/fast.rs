//! The quick reading of a package that is valid TOML. toml-spanner parses about ten times
//! faster than the toml crate (5 ms against 52 ms for a 3,000-member package, measured
//! here), and [`ItemDe`] hands its tree to the same serde schema. It decides only input
//! that reads cleanly: on any error, or any value it does not hand over exactly as the
//! toml crate does (an integer beyond 64 bits), it gives up and [`read`] asks the toml
//! crate, whose error message names the place (deeply nested input too: toml-spanner
//! has a depth limit). Tests compare both readings: the examples, the starters,
//! forms of TOML (dates, strings, numbers, line ends), every hostile input
//! (`tests/hostile.rs`) and random number literals (`tests/properties.rs`).

use serde::de::value::{Error, MapDeserializer, SeqDeserializer};
use serde::de::{self, DeserializeOwned, Deserializer, IntoDeserializer, Visitor};
use toml_spanner::{Item, Value};

/// Reads `text` into `T`: quickly when it is well formed, else through the toml crate
/// (the same value, or the error with its place).
pub fn read<T: DeserializeOwned>(text: &str) -> Result<T, toml::de::Error> {
    match quick(text) {
        Some(t) => Ok(t),
        None => toml::from_str(text),
    }
}

/// The quick reading alone: `None` wherever it does not decide.
pub fn quick<T: DeserializeOwned>(text: &str) -> Option<T> {
    let arena = toml_spanner::Arena::new();
    let doc = toml_spanner::parse(text, &arena).ok()?;
    T::deserialize(TableDe(doc.table(), text)).ok()
}

/// A table of the parsed tree as a serde map (with the text it was parsed from).
struct TableDe<'a, 'i>(&'a toml_spanner::Table<'i>, &'a str);

impl<'de> Deserializer<'de> for TableDe<'_, '_> {
    type Error = Error;

    fn deserialize_any<V: Visitor<'de>>(self, v: V) -> Result<V::Value, Error> {
        let text = self.1;
        v.visit_map(MapDeserializer::new(self.0.iter().map(|(k, item)| (k.name, ItemDe(item, text)))))
    }

    serde::forward_to_deserialize_any! {
        bool i8 i16 i32 i64 i128 u8 u16 u32 u64 u128 f32 f64 char str string bytes byte_buf
        option unit unit_struct newtype_struct seq tuple tuple_struct map struct enum
        identifier ignored_any
    }
}

/// One value of the parsed tree, handed to serde as the toml crate hands it: integers as
/// i64, floats as f64, present values of optional fields as `Some`, dates as the toml
/// crate's own datetime read from the same characters of the text.
struct ItemDe<'a, 'i>(&'a Item<'i>, &'a str);

impl<'de> IntoDeserializer<'de, Error> for ItemDe<'_, '_> {
    type Deserializer = Self;
    fn into_deserializer(self) -> Self {
        self
    }
}

impl ItemDe<'_, '_> {
    /// The datetime as the toml crate reads it: from the characters that wrote it (a
    /// datetime printed back would not keep its form: `08:00` would become `08:00:00`).
    fn datetime(&self) -> Result<toml::Value, Error> {
        let span = self.0.span();
        let written = self.1.get(span.start as usize..span.end as usize).ok_or_else(|| de::Error::custom("no text"))?;
        written.parse::<toml::value::Datetime>().map(toml::Value::Datetime).map_err(de::Error::custom)
    }
}

impl<'de> Deserializer<'de> for ItemDe<'_, '_> {
    type Error = Error;

    fn deserialize_any<V: Visitor<'de>>(self, v: V) -> Result<V::Value, Error> {
        match self.0.value() {
            Value::String(s) => v.visit_str(s),
            Value::Integer(i) => match i.as_i64() {
                Some(n) => v.visit_i64(n),
                None => Err(de::Error::custom("integer beyond 64 bits")),
            },
            Value::Float(f) => v.visit_f64(*f),
            Value::Boolean(b) => v.visit_bool(*b),
            Value::Array(a) => v.visit_seq(SeqDeserializer::new(a.iter().map(|item| ItemDe(item, self.1)))),
            Value::Table(t) => TableDe(t, self.1).deserialize_any(v),
            Value::DateTime(_) => self.datetime()?.deserialize_any(v).map_err(de::Error::custom),
        }
    }

    fn deserialize_option<V: Visitor<'de>>(self, v: V) -> Result<V::Value, Error> {
        v.visit_some(self)
    }

    fn deserialize_struct<V: Visitor<'de>>(
        self,
        name: &'static str,
        fields: &'static [&'static str],
        v: V,
    ) -> Result<V::Value, Error> {
        match self.0.value() {
            Value::DateTime(_) => self.datetime()?.deserialize_struct(name, fields, v).map_err(de::Error::custom),
            _ => self.deserialize_any(v),
        }
    }

    serde::forward_to_deserialize_any! {
        bool i8 i16 i32 i64 i128 u8 u16 u32 u64 u128 f32 f64 char str string bytes byte_buf
        unit unit_struct newtype_struct seq tuple tuple_struct map enum identifier ignored_any
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::input::schema::File;

    /// Both readings of a text: equal where the quick one decides, and the quick one
    /// never accepts what the toml crate refuses.
    fn agree(name: &str, text: &str) -> bool {
        let slow: Result<File, _> = toml::from_str(text);
        match (quick::<File>(text), slow) {
            (Some(q), Ok(s)) => {
                assert_eq!(format!("{q:?}"), format!("{s:?}"), "{name}: the readings differ");
                true
            }
            (Some(_), Err(e)) => panic!("{name}: read quickly, but the toml crate refuses it: {e}"),
            (None, _) => false,
        }
    }

    #[test]
    fn quick_reading_equals_the_toml_crate() {
        let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
        let mut decided = 0;
        let mut texts: Vec<(String, String)> = Vec::new();
        for dir in ["examples", "tests/hostile"] {
            let Ok(entries) = std::fs::read_dir(root.join(dir)) else { continue };
            for e in entries.flatten() {
                let p = e.path();
                if p.extension().is_some_and(|x| x == "toml")
                    && let Ok(t) = std::fs::read_to_string(&p)
                {
                    texts.push((p.display().to_string(), t));
                }
            }
        }
        assert!(texts.len() >= 3, "the examples were not found");
        texts.push(("starter us".into(), crate::starter::US.to_string()));
        texts.push(("starter si".into(), crate::starter::SI.to_string()));
        // the forms of TOML a hand-written package may use
        let head = "format = 1\n[package]\ntitle = \"T\"\nproject = \"P\"\nrevision = \"A\"\nunits = \"us\"\n";
        for (name, extra) in [
            ("local date", "date = 2026-11-30\n"),
            ("offset datetime", "date = 2026-11-30T08:00:00Z\n"),
            ("local datetime", "date = 2026-11-30T08:00:00\n"),
            ("local time", "date = 08:00:00\n"),
            ("fractional seconds", "date = 2026-11-30T08:00:00.123456789+01:30\n"),
            ("time without seconds", "date = 2026-11-30T08:00\n"),
            ("space for T", "date = 2026-11-30 08:00:00.5Z\n"),
            ("literal and multi-line strings", "title2 = 'x'\n"),
            ("integer forms", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 1_200\nmu = 0x10\n"),
            ("floats", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 1.5e2\nmu = -0.0\n"),
            ("special floats", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = inf\nmu = nan\n"),
            ("huge integer", "date = 2026-11-30\n[[member]]\nid = 'a'\nlength = 99999999999999999999\n"),
            ("inline tables", "date = 2026-11-30\n[[member]]\nid = 'a'\nconcrete = { fc = 5.0 }\n"),
            ("dotted keys", "date = 2026-11-30\n[[member]]\nid = 'a'\nconcrete.fc = 5.0\n"),
            ("unit strings", "date = 2026-11-30\n[[member]]\nid = \"a\"\nlength = \"30 ft\"\n"),
            ("duplicate key", "date = 2026-11-30\ndate = 2026-11-30\n"),
            ("unknown key", "date = 2026-11-30\ncolour = 'red'\n"),
            ("wrong type", "date = 'yesterday'\n"),
            (
                "outline",
                "date = 2026-11-30\n[[member]]\nid = 'a'\n[member.section]\nshape = 'polygon'\noutline = [[0, 0], [1.5, 0], [1, 2]]\n",
            ),
            ("table redefined", "date = 2026-11-30\n[package]\n"),
            ("escapes", "date = 2026-11-30\nclient = \"\\u00e9\\t\\\"x\\\"\"\n"),
            (
                "multi-line strings",
                "date = 2026-11-30\nnotes = \"\"\"\n  first \\\n  second\n\"\"\"\nclient = \'\'\'\nraw \\n\'\'\'\n",
            ),
            ("windows line ends", "date = 2026-11-30\r\nnotes = \"\"\"\r\na\r\nb\"\"\"\r\n"),
            ("comments and blank lines", "date = 2026-11-30 # the day\n\n# end\n"),
        ] {
            texts.push((name.to_string(), format!("{head}{extra}")));
        }
        for (name, text) in &texts {
            decided += usize::from(agree(name, text));
        }
        // valid packages are decided by the quick reading
        assert!(decided >= 5, "only {decided} of {} decided quickly", texts.len());
    }
}
