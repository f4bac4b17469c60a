//! The quick reading of a package that is valid TOML. toml-spanner parses about ten times
//! faster than the toml crate (5 ms against 52 ms for a 3,000-member package, measured
//! here), and [`ItemDe`] hands its tree to the same serde schema. It decides only input
//! that reads cleanly: on any error, or any value it does not hand over exactly as the
//! toml crate does (an integer beyond 64 bits), it gives up and [`read`] asks the toml
//! crate, whose error message names the place (deeply nested input too: toml-spanner
//! has a depth limit). Tests compare both readings (`quick_agrees` in `tests/common`):
//! the examples, the starters, forms of TOML (dates, strings, numbers, line ends) and
//! every hostile input in `tests/hostile.rs`, random number literals in
//! `tests/properties.rs`.

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
