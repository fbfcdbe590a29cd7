//! Checks shared by the fuzz targets.
//!
//! [`non_finite_numbers`] walks any `Serialize` value (an `Evaluation`, a lamp
//! report, a plan) and lists the path of every `f32`/`f64` in it that is NaN or
//! infinite, so a target can assert that nothing reaching the screen or a
//! report is non-finite without naming every field (new fields are covered as
//! they are added).

use serde::ser::{self, Serialize};
use std::fmt;

/// Paths (`light.cct_k`, `zones[1].subjects[3].de2000`) of the non-finite
/// numbers in `value`.
#[must_use]
pub fn non_finite_numbers<T: Serialize + ?Sized>(value: &T) -> Vec<String> {
    let mut walker = Walker::default();
    // The walker itself never fails; a value whose `Serialize` fails has no
    // numbers to report.
    let _ = value.serialize(&mut walker);
    walker.found
}

/// Whether a message is fit to show as it is: non-empty and on one line.
#[must_use]
pub fn is_one_line(message: &str) -> bool {
    !message.trim().is_empty() && !message.contains(['\n', '\r'])
}

#[derive(Default)]
struct Walker {
    path: Vec<String>,
    found: Vec<String>,
}

impl Walker {
    fn float(&mut self, v: f64) {
        if !v.is_finite() {
            self.found.push(format!("{} = {v}", self.path.concat()));
        }
    }

    fn nested<T: Serialize + ?Sized>(&mut self, segment: String, value: &T) -> Result<(), Never> {
        self.path.push(segment);
        let r = value.serialize(&mut *self);
        self.path.pop();
        r
    }
}

/// The walker's error type; it is never produced.
#[derive(Debug)]
pub struct Never;

impl fmt::Display for Never {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str("never")
    }
}

impl std::error::Error for Never {}

impl ser::Error for Never {
    fn custom<T: fmt::Display>(_msg: T) -> Self {
        Never
    }
}

/// A sequence, tuple or map being walked; counts its elements for the path.
struct Compound<'a> {
    walker: &'a mut Walker,
    index: usize,
}

impl Compound<'_> {
    fn element<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Never> {
        let segment = format!("[{}]", self.index);
        self.index += 1;
        self.walker.nested(segment, value)
    }

    fn field<T: Serialize + ?Sized>(&mut self, key: &str, value: &T) -> Result<(), Never> {
        let segment = if self.walker.path.is_empty() {
            key.to_string()
        } else {
            format!(".{key}")
        };
        self.walker.nested(segment, value)
    }
}

macro_rules! ignore {
    ($($method:ident($ty:ty)),* $(,)?) => {
        $(fn $method(self, _v: $ty) -> Result<(), Never> { Ok(()) })*
    };
}

impl<'a> ser::Serializer for &'a mut Walker {
    type Ok = ();
    type Error = Never;
    type SerializeSeq = Compound<'a>;
    type SerializeTuple = Compound<'a>;
    type SerializeTupleStruct = Compound<'a>;
    type SerializeTupleVariant = Compound<'a>;
    type SerializeMap = Compound<'a>;
    type SerializeStruct = Compound<'a>;
    type SerializeStructVariant = Compound<'a>;

    ignore!(
        serialize_bool(bool),
        serialize_i8(i8),
        serialize_i16(i16),
        serialize_i32(i32),
        serialize_i64(i64),
        serialize_u8(u8),
        serialize_u16(u16),
        serialize_u32(u32),
        serialize_u64(u64),
        serialize_char(char),
        serialize_str(&str),
        serialize_bytes(&[u8]),
    );

    fn serialize_f32(self, v: f32) -> Result<(), Never> {
        self.float(f64::from(v));
        Ok(())
    }

    fn serialize_f64(self, v: f64) -> Result<(), Never> {
        self.float(v);
        Ok(())
    }

    fn serialize_none(self) -> Result<(), Never> {
        Ok(())
    }

    fn serialize_some<T: Serialize + ?Sized>(self, value: &T) -> Result<(), Never> {
        value.serialize(self)
    }

    fn serialize_unit(self) -> Result<(), Never> {
        Ok(())
    }

    fn serialize_unit_struct(self, _name: &'static str) -> Result<(), Never> {
        Ok(())
    }

    fn serialize_unit_variant(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
    ) -> Result<(), Never> {
        Ok(())
    }

    fn serialize_newtype_struct<T: Serialize + ?Sized>(
        self,
        _name: &'static str,
        value: &T,
    ) -> Result<(), Never> {
        value.serialize(self)
    }

    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _name: &'static str,
        _index: u32,
        variant: &'static str,
        value: &T,
    ) -> Result<(), Never> {
        self.nested(format!("::{variant}"), value)
    }

    fn serialize_seq(self, _len: Option<usize>) -> Result<Compound<'a>, Never> {
        Ok(Compound {
            walker: self,
            index: 0,
        })
    }

    fn serialize_tuple(self, len: usize) -> Result<Compound<'a>, Never> {
        self.serialize_seq(Some(len))
    }

    fn serialize_tuple_struct(
        self,
        _name: &'static str,
        len: usize,
    ) -> Result<Compound<'a>, Never> {
        self.serialize_seq(Some(len))
    }

    fn serialize_tuple_variant(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
        len: usize,
    ) -> Result<Compound<'a>, Never> {
        self.serialize_seq(Some(len))
    }

    fn serialize_map(self, len: Option<usize>) -> Result<Compound<'a>, Never> {
        self.serialize_seq(len)
    }

    fn serialize_struct(self, _name: &'static str, len: usize) -> Result<Compound<'a>, Never> {
        self.serialize_seq(Some(len))
    }

    fn serialize_struct_variant(
        self,
        _name: &'static str,
        _index: u32,
        _variant: &'static str,
        len: usize,
    ) -> Result<Compound<'a>, Never> {
        self.serialize_seq(Some(len))
    }
}

macro_rules! sequence {
    ($($trait:ident :: $method:ident),* $(,)?) => {
        $(impl ser::$trait for Compound<'_> {
            type Ok = ();
            type Error = Never;

            fn $method<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Never> {
                self.element(value)
            }

            fn end(self) -> Result<(), Never> {
                Ok(())
            }
        })*
    };
}

sequence!(
    SerializeSeq::serialize_element,
    SerializeTuple::serialize_element,
    SerializeTupleStruct::serialize_field,
    SerializeTupleVariant::serialize_field,
);

macro_rules! structure {
    ($($trait:ident),* $(,)?) => {
        $(impl ser::$trait for Compound<'_> {
            type Ok = ();
            type Error = Never;

            fn serialize_field<T: Serialize + ?Sized>(
                &mut self,
                key: &'static str,
                value: &T,
            ) -> Result<(), Never> {
                self.field(key, value)
            }

            fn end(self) -> Result<(), Never> {
                Ok(())
            }
        })*
    };
}

structure!(SerializeStruct, SerializeStructVariant);

impl ser::SerializeMap for Compound<'_> {
    type Ok = ();
    type Error = Never;

    fn serialize_key<T: Serialize + ?Sized>(&mut self, _key: &T) -> Result<(), Never> {
        Ok(())
    }

    fn serialize_value<T: Serialize + ?Sized>(&mut self, value: &T) -> Result<(), Never> {
        self.element(value)
    }

    fn end(self) -> Result<(), Never> {
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Serialize)]
    struct Inner {
        ok: f64,
        bad: Option<f64>,
    }

    #[derive(serde::Serialize)]
    struct Outer {
        name: String,
        items: Vec<Inner>,
        pair: [f32; 2],
    }

    #[test]
    fn finds_every_non_finite_number_with_its_path() {
        let value = Outer {
            name: "NaN".into(),
            items: vec![
                Inner { ok: 1.0, bad: None },
                Inner {
                    ok: 2.0,
                    bad: Some(f64::NAN),
                },
            ],
            pair: [0.5, f32::INFINITY],
        };
        assert_eq!(
            non_finite_numbers(&value),
            vec!["items[1].bad = NaN", "pair[1] = inf"]
        );
        assert!(
            non_finite_numbers(&Inner {
                ok: 0.0,
                bad: Some(3.0)
            })
            .is_empty()
        );
    }

    #[test]
    fn one_line_messages() {
        assert!(is_one_line("a.ron: line 1, column 1: the file is empty"));
        assert!(!is_one_line(""));
        assert!(!is_one_line("two\nlines"));
    }
}
