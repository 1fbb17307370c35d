//! JSON in: the one parse path for everything the engine reads (scenario, share link,
//! plan request, finder).
//!
//! Text is parsed once into a `serde_json::Value`, and every type is deserialized from
//! that value. The internally tagged and untagged enums read their tag here (`tagged`)
//! instead of through serde's buffered `Content`; so each type's deserializer is compiled
//! once, for `Value`, instead of once for the text parser and again for `Content` (that
//! duplication was about 100 KB of the wasm). The JSON formats are serde's, unchanged:
//! the tagged enums still derive `Serialize` with their `#[serde(tag = ...)]`, and their
//! hand-written `Deserialize` accepts what the derive accepted (tests/json_formats.rs).
//!
//! A new internally tagged or untagged enum that the engine reads should do the same
//! (a `#[serde(tag)]` derive of `Deserialize` brings the `Content` path back).

use serde::de::{DeserializeOwned, Deserializer, Error as _};
use serde::Deserialize;
use serde_json::Value;

pub use serde_json::Error;

/// Parses JSON text into `T` (through a `Value`).
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T, Error> {
    from_value(parse(text)?)
}

/// Parses JSON text into a `Value`.
pub fn parse(text: &str) -> Result<Value, Error> {
    serde_json::from_str(text)
}

/// Reads `T` from a parsed value.
pub fn from_value<T: DeserializeOwned>(v: Value) -> Result<T, Error> {
    T::deserialize(v)
}

/// Deserializes an internally tagged enum: reads the object, finds its `tag` field (a
/// variant name from `variants`, or its index, as serde accepts) and hands the name and
/// the whole object to `variant`, which reads the variant's fields from it (the tag field
/// is ignored there like any unknown field, as in serde's derive).
pub fn tagged<'de, D, T>(d: D, tag: &'static str, variants: &'static [&'static str], variant: fn(&str, Value) -> Result<T, Error>) -> Result<T, D::Error>
where
    D: Deserializer<'de>,
{
    let v = Value::deserialize(d)?;
    let name = tag_of(&v, tag, variants).map_err(D::Error::custom)?;
    variant(name, v).map_err(D::Error::custom)
}

fn tag_of(v: &Value, tag: &'static str, variants: &'static [&'static str]) -> Result<&'static str, Error> {
    let Value::Object(m) = v else {
        return Err(Error::custom(format_args!("invalid type: {}, expected an object with a `{tag}` field", kind_of(v))));
    };
    match m.get(tag) {
        Some(Value::String(s)) => variants.iter().find(|&&n| n == s).copied().ok_or_else(|| unknown_variant(s, variants)),
        Some(Value::Number(n)) => match n.as_u64() {
            Some(i) if (i as usize) < variants.len() => Ok(variants[i as usize]),
            Some(i) => Err(Error::custom(format_args!("invalid value: integer `{i}`, expected variant index 0 <= i < {}", variants.len()))),
            None => Err(Error::custom(format_args!("invalid type: number `{n}`, expected variant identifier"))),
        },
        Some(other) => Err(Error::custom(format_args!("invalid type: {}, expected variant identifier", kind_of(other)))),
        None => Err(Error::missing_field(tag)),
    }
}

/// The error serde's derive gives for an unknown variant name.
pub fn unknown_variant(name: &str, expected: &'static [&'static str]) -> Error {
    Error::unknown_variant(name, expected)
}

/// For a `tagged` variant function's fall-through arm (`tagged` passes listed names only).
pub fn unlisted(name: &str) -> Error {
    Error::custom(format_args!("unknown variant `{name}`"))
}

/// A plain name of a JSON value's type, for messages.
pub fn kind_of(v: &Value) -> &'static str {
    match v {
        Value::Null => "null",
        Value::Bool(_) => "boolean",
        Value::Number(_) => "number",
        Value::String(_) => "string",
        Value::Array(_) => "sequence",
        Value::Object(_) => "map",
    }
}
