//! A result struct embedded in a payload object as it is, less some of its fields:
//! `#[serde(flatten)]` over [`Omit`] writes every field of the struct but those named,
//! so a field the analysis adds to its results reaches the payload and the view without
//! an edit here.

use serde::ser::{self, Impossible, Serialize, SerializeStruct, Serializer};

/// `value`'s fields less those named in `omitted` (for `#[serde(flatten)]`).
pub struct Omit<'a, T> {
    pub value: &'a T,
    pub omitted: &'static [&'static str],
}

impl<T: Serialize> Serialize for Omit<'_, T> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        self.value.serialize(Fields { inner: s, omitted: self.omitted })
    }
}

/// The serializer a struct is written through: its fields pass to `inner`, but those
/// omitted. Anything but a struct is refused.
struct Fields<S> {
    inner: S,
    omitted: &'static [&'static str],
}

impl<S: SerializeStruct> SerializeStruct for Fields<S> {
    type Ok = S::Ok;
    type Error = S::Error;

    fn serialize_field<T: ?Sized + Serialize>(&mut self, key: &'static str, value: &T) -> Result<(), S::Error> {
        if self.omitted.contains(&key) { self.inner.skip_field(key) } else { self.inner.serialize_field(key, value) }
    }

    fn end(self) -> Result<S::Ok, S::Error> {
        self.inner.end()
    }
}

fn not_a_struct<E: ser::Error>() -> E {
    E::custom("only the fields of a struct can be omitted")
}

/// Serializer methods that refuse their value: only a struct has fields to omit.
macro_rules! refuse {
    ($($method:ident($($arg:ty),*) -> $out:ty;)*) => {
        $(fn $method(self, $(_: $arg),*) -> Result<$out, S::Error> {
            Err(not_a_struct())
        })*
    };
}

impl<S: Serializer> Serializer for Fields<S> {
    type Ok = S::Ok;
    type Error = S::Error;
    type SerializeSeq = Impossible<S::Ok, S::Error>;
    type SerializeTuple = Impossible<S::Ok, S::Error>;
    type SerializeTupleStruct = Impossible<S::Ok, S::Error>;
    type SerializeTupleVariant = Impossible<S::Ok, S::Error>;
    type SerializeMap = Impossible<S::Ok, S::Error>;
    type SerializeStruct = Fields<S::SerializeStruct>;
    type SerializeStructVariant = Impossible<S::Ok, S::Error>;

    fn serialize_struct(self, name: &'static str, len: usize) -> Result<Self::SerializeStruct, S::Error> {
        Ok(Fields { inner: self.inner.serialize_struct(name, len)?, omitted: self.omitted })
    }

    fn is_human_readable(&self) -> bool {
        self.inner.is_human_readable()
    }

    refuse! {
        serialize_bool(bool) -> S::Ok;
        serialize_i8(i8) -> S::Ok;
        serialize_i16(i16) -> S::Ok;
        serialize_i32(i32) -> S::Ok;
        serialize_i64(i64) -> S::Ok;
        serialize_u8(u8) -> S::Ok;
        serialize_u16(u16) -> S::Ok;
        serialize_u32(u32) -> S::Ok;
        serialize_u64(u64) -> S::Ok;
        serialize_f32(f32) -> S::Ok;
        serialize_f64(f64) -> S::Ok;
        serialize_char(char) -> S::Ok;
        serialize_str(&str) -> S::Ok;
        serialize_bytes(&[u8]) -> S::Ok;
        serialize_none() -> S::Ok;
        serialize_unit() -> S::Ok;
        serialize_unit_struct(&'static str) -> S::Ok;
        serialize_unit_variant(&'static str, u32, &'static str) -> S::Ok;
        serialize_seq(Option<usize>) -> Self::SerializeSeq;
        serialize_tuple(usize) -> Self::SerializeTuple;
        serialize_tuple_struct(&'static str, usize) -> Self::SerializeTupleStruct;
        serialize_tuple_variant(&'static str, u32, &'static str, usize) -> Self::SerializeTupleVariant;
        serialize_map(Option<usize>) -> Self::SerializeMap;
        serialize_struct_variant(&'static str, u32, &'static str, usize) -> Self::SerializeStructVariant;
    }

    fn serialize_some<T: ?Sized + Serialize>(self, _: &T) -> Result<S::Ok, S::Error> {
        Err(not_a_struct())
    }

    fn serialize_newtype_struct<T: ?Sized + Serialize>(self, _: &'static str, _: &T) -> Result<S::Ok, S::Error> {
        Err(not_a_struct())
    }

    fn serialize_newtype_variant<T: ?Sized + Serialize>(
        self,
        _: &'static str,
        _: u32,
        _: &'static str,
        _: &T,
    ) -> Result<S::Ok, S::Error> {
        Err(not_a_struct())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde::Serialize;

    #[derive(Serialize)]
    struct Result3 {
        a: f64,
        trace: Vec<u8>,
        b: Option<bool>,
    }

    #[derive(Serialize)]
    struct Shown<'a> {
        #[serde(flatten)]
        result: Omit<'a, Result3>,
        steps: usize,
    }

    #[test]
    fn every_field_but_those_omitted_is_written() {
        let r = Result3 { a: 1.5, trace: vec![1, 2], b: None };
        let v = serde_json::to_value(Shown { result: Omit { value: &r, omitted: &["trace"] }, steps: 2 }).unwrap();
        assert_eq!(v, serde_json::json!({"a": 1.5, "b": null, "steps": 2}));
        assert!(serde_json::to_value(Omit { value: &3, omitted: &[] }).is_err());
    }
}
