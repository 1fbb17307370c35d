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
//! The text reader (`parse`) and the deserializer over a parsed `Value` (`ValueReader`,
//! with this module's own `Error`) are ours too: serde_json's text deserializer, its float
//! parser and its error type (which formats floats with tables of its own) came to about
//! 70 KB of the wasm. `ValueReader` also reads a struct written as an array (serde's
//! positional form) through the object path, and the unit-only enums share one reader
//! (`unit_variants!`), so fewer derived visitor methods are compiled. All of it reads
//! exactly what serde_json and serde's derive read (tests/json_formats.rs).
//!
//! A new internally tagged or untagged enum that the engine reads should do the same
//! (a `#[serde(tag)]` derive of `Deserialize` brings the `Content` path back).

use serde::de::{DeserializeOwned, DeserializeSeed, Deserializer, EnumAccess, Error as _, IntoDeserializer, MapAccess, SeqAccess, Unexpected, VariantAccess, Visitor};
use serde::Deserialize;
use serde_json::Value;
use std::fmt;

/// Why JSON could not be read: a plain message naming what was expected.
/// (Boxed: one pointer keeps every `Result` of the derived deserializers small.)
#[derive(Clone, Debug, PartialEq)]
#[allow(clippy::box_collection)]
pub struct Error(Box<String>);

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

impl std::error::Error for Error {}

impl Error {
    #[cold]
    #[inline(never)]
    fn new(msg: fmt::Arguments<'_>) -> Error {
        Error(Box::new(msg.to_string()))
    }
}

// Each constructor once, out of line (as serde_json's are): the default methods would be
// inlined, with their formatting, into every field of every derived deserializer.
impl serde::de::Error for Error {
    #[cold]
    fn custom<T: fmt::Display>(msg: T) -> Self {
        Error::new(format_args!("{msg}"))
    }
    #[cold]
    #[inline(never)]
    fn invalid_type(unexp: Unexpected<'_>, exp: &dyn serde::de::Expected) -> Self {
        Error::new(format_args!("invalid type: {unexp}, expected {exp}"))
    }
    #[cold]
    #[inline(never)]
    fn invalid_value(unexp: Unexpected<'_>, exp: &dyn serde::de::Expected) -> Self {
        Error::new(format_args!("invalid value: {unexp}, expected {exp}"))
    }
    #[cold]
    #[inline(never)]
    fn invalid_length(len: usize, exp: &dyn serde::de::Expected) -> Self {
        Error::new(format_args!("invalid length {len}, expected {exp}"))
    }
    #[cold]
    #[inline(never)]
    fn unknown_variant(variant: &str, expected: &'static [&'static str]) -> Self {
        Error::new(format_args!("unknown variant `{variant}`, expected one of {}", OneOf(expected)))
    }
    #[cold]
    #[inline(never)]
    fn unknown_field(field: &str, expected: &'static [&'static str]) -> Self {
        Error::new(format_args!("unknown field `{field}`, expected one of {}", OneOf(expected)))
    }
    #[cold]
    #[inline(never)]
    fn missing_field(field: &'static str) -> Self {
        Error::new(format_args!("missing field `{field}`"))
    }
    #[cold]
    #[inline(never)]
    fn duplicate_field(field: &'static str) -> Self {
        Error::new(format_args!("duplicate field `{field}`"))
    }
}

/// "`a`, `b`, `c`" as serde writes a list of names.
struct OneOf(&'static [&'static str]);

impl fmt::Display for OneOf {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, name) in self.0.iter().enumerate() {
            if i > 0 {
                f.write_str(", ")?;
            }
            write!(f, "`{name}`")?;
        }
        Ok(())
    }
}

/// Parses JSON text into `T` (through a `Value`).
pub fn from_str<T: DeserializeOwned>(text: &str) -> Result<T, Error> {
    from_value(parse(text)?)
}

/// Parses JSON text (RFC 8259) into a `Value`, exactly as `serde_json::from_str::<Value>`
/// reads it: integers as u64 / i64 where they fit, other numbers correctly rounded to f64
/// (as serde_json's `float_roundtrip`; here by `str::parse::<f64>`, already in the wasm),
/// numbers beyond f64 refused, surrogate escapes paired, control characters in strings
/// refused, duplicate keys: the last wins, at most 127 nested arrays / objects. Our own
/// reader keeps serde_json's text deserializer and its float parser (about 45 KB) out of
/// the wasm; tests/json_formats.rs compares the two on generated and mutated texts.
pub fn parse(text: &str) -> Result<Value, Error> {
    let mut p = Reader { b: text.as_bytes(), i: 0, depth: 0 };
    p.ws();
    let v = p.value()?;
    p.ws();
    if p.i < p.b.len() {
        return Err(p.err("trailing characters"));
    }
    Ok(v)
}

/// serde_json's nesting limit: the 128th nested array or object is refused.
const MAX_DEPTH: u32 = 128;

struct Reader<'a> {
    b: &'a [u8],
    i: usize,
    depth: u32,
}

impl Reader<'_> {
    fn err(&self, what: &str) -> Error {
        let before = &self.b[..self.i.min(self.b.len())];
        let line = 1 + before.iter().filter(|&&c| c == b'\n').count();
        let column = before.len() - before.iter().rposition(|&c| c == b'\n').map_or(0, |p| p + 1);
        Error::custom(format_args!("{what} at line {line} column {column}"))
    }

    fn peek(&self) -> Option<u8> {
        self.b.get(self.i).copied()
    }

    fn ws(&mut self) {
        while let Some(b' ' | b'\n' | b'\t' | b'\r') = self.peek() {
            self.i += 1;
        }
    }

    fn literal(&mut self, word: &[u8], v: Value) -> Result<Value, Error> {
        if self.b[self.i..].starts_with(word) {
            self.i += word.len();
            Ok(v)
        } else {
            Err(self.err("expected value"))
        }
    }

    fn value(&mut self) -> Result<Value, Error> {
        match self.peek() {
            None => Err(self.err("EOF while parsing a value")),
            Some(b'n') => self.literal(b"null", Value::Null),
            Some(b't') => self.literal(b"true", Value::Bool(true)),
            Some(b'f') => self.literal(b"false", Value::Bool(false)),
            Some(b'"') => Ok(Value::String(self.string()?)),
            Some(b'-' | b'0'..=b'9') => self.number(),
            Some(open @ (b'[' | b'{')) => {
                self.depth += 1;
                if self.depth >= MAX_DEPTH {
                    return Err(self.err("recursion limit exceeded"));
                }
                self.i += 1;
                let v = if open == b'[' { self.array()? } else { self.object()? };
                self.depth -= 1;
                Ok(v)
            }
            Some(_) => Err(self.err("expected value")),
        }
    }

    /// After `[`.
    fn array(&mut self) -> Result<Value, Error> {
        let mut items = Vec::new();
        self.ws();
        if self.peek() == Some(b']') {
            self.i += 1;
            return Ok(Value::Array(items));
        }
        loop {
            self.ws();
            items.push(self.value()?);
            self.ws();
            match self.peek() {
                Some(b',') => self.i += 1,
                Some(b']') => {
                    self.i += 1;
                    return Ok(Value::Array(items));
                }
                None => return Err(self.err("EOF while parsing a list")),
                Some(_) => return Err(self.err("expected `,` or `]`")),
            }
        }
    }

    /// After `{`.
    fn object(&mut self) -> Result<Value, Error> {
        let mut map = serde_json::Map::new();
        self.ws();
        if self.peek() == Some(b'}') {
            self.i += 1;
            return Ok(Value::Object(map));
        }
        loop {
            self.ws();
            match self.peek() {
                Some(b'"') => {}
                None => return Err(self.err("EOF while parsing an object")),
                Some(_) => return Err(self.err("key must be a string")),
            }
            let key = self.string()?;
            self.ws();
            match self.peek() {
                Some(b':') => self.i += 1,
                None => return Err(self.err("EOF while parsing an object")),
                Some(_) => return Err(self.err("expected `:`")),
            }
            self.ws();
            let v = self.value()?;
            map.insert(key, v);
            self.ws();
            match self.peek() {
                Some(b',') => self.i += 1,
                Some(b'}') => {
                    self.i += 1;
                    return Ok(Value::Object(map));
                }
                None => return Err(self.err("EOF while parsing an object")),
                Some(_) => return Err(self.err("expected `,` or `}`")),
            }
        }
    }

    /// At `"`: the string's text, escapes decoded.
    fn string(&mut self) -> Result<String, Error> {
        self.i += 1;
        let mut out = String::new();
        let mut run = self.i; // start of the current run of plain characters
        loop {
            match self.peek() {
                None => return Err(self.err("EOF while parsing a string")),
                Some(b'"') => {
                    out.push_str(self.plain(run));
                    self.i += 1;
                    return Ok(out);
                }
                Some(b'\\') => {
                    out.push_str(self.plain(run));
                    self.i += 1;
                    let c = match self.peek() {
                        None => return Err(self.err("EOF while parsing a string")),
                        Some(b'"') => '"',
                        Some(b'\\') => '\\',
                        Some(b'/') => '/',
                        Some(b'b') => '\u{8}',
                        Some(b'f') => '\u{c}',
                        Some(b'n') => '\n',
                        Some(b'r') => '\r',
                        Some(b't') => '\t',
                        Some(b'u') => {
                            self.i += 1;
                            let c = self.unicode_escape()?;
                            out.push(c);
                            run = self.i;
                            continue;
                        }
                        Some(_) => return Err(self.err("invalid escape")),
                    };
                    out.push(c);
                    self.i += 1;
                    run = self.i;
                }
                Some(0..=0x1f) => return Err(self.err("control character (\\u0000-\\u001F) found while parsing a string")),
                Some(_) => self.i += 1,
            }
        }
    }

    /// The text from `from` to here (whole UTF-8 characters: both ends sit at ASCII bytes).
    fn plain(&self, from: usize) -> &str {
        core::str::from_utf8(&self.b[from..self.i]).unwrap_or_default()
    }

    /// After `\u`: one character, a surrogate pair taking two escapes.
    fn unicode_escape(&mut self) -> Result<char, Error> {
        let n = self.hex4()?;
        let code = match n {
            0xDC00..=0xDFFF => return Err(self.err("lone leading surrogate in hex escape")),
            0xD800..=0xDBFF => {
                if !self.b[self.i..].starts_with(b"\\u") {
                    return Err(self.err("unexpected end of hex escape"));
                }
                self.i += 2;
                let n2 = self.hex4()?;
                if !(0xDC00..=0xDFFF).contains(&n2) {
                    return Err(self.err("lone leading surrogate in hex escape"));
                }
                (((n - 0xD800) << 10) | (n2 - 0xDC00)) + 0x1_0000
            }
            _ => n,
        };
        char::from_u32(code).ok_or_else(|| self.err("invalid unicode code point"))
    }

    fn hex4(&mut self) -> Result<u32, Error> {
        let mut n = 0;
        for _ in 0..4 {
            let d = match self.peek() {
                None => return Err(self.err("EOF while parsing a string")),
                Some(c) => (c as char).to_digit(16).ok_or_else(|| self.err("invalid escape"))?,
            };
            n = n * 16 + d;
            self.i += 1;
        }
        Ok(n)
    }

    /// At `-` or a digit: JSON's number grammar; integers that fit as u64 / i64, else f64.
    fn number(&mut self) -> Result<Value, Error> {
        let start = self.i;
        let negative = self.peek() == Some(b'-');
        if negative {
            self.i += 1;
        }
        let int_start = self.i;
        match self.peek() {
            Some(b'0') => {
                self.i += 1;
                if let Some(b'0'..=b'9') = self.peek() {
                    return Err(self.err("invalid number"));
                }
            }
            Some(b'1'..=b'9') => self.digits(),
            _ => return Err(self.err("invalid number")),
        }
        let int_end = self.i;
        let mut integer = true;
        if self.peek() == Some(b'.') {
            integer = false;
            self.i += 1;
            if !matches!(self.peek(), Some(b'0'..=b'9')) {
                return Err(self.err(if self.peek().is_none() { "EOF while parsing a value" } else { "invalid number" }));
            }
            self.digits();
        }
        if let Some(b'e' | b'E') = self.peek() {
            integer = false;
            self.i += 1;
            if let Some(b'+' | b'-') = self.peek() {
                self.i += 1;
            }
            if !matches!(self.peek(), Some(b'0'..=b'9')) {
                return Err(self.err(if self.peek().is_none() { "EOF while parsing a value" } else { "invalid number" }));
            }
            self.digits();
        }
        let text = core::str::from_utf8(&self.b[start..self.i]).unwrap_or_default();
        if integer {
            // As serde_json: u64 for a non-negative integer, i64 for a negative one ("-0" is -0.0).
            let digits = core::str::from_utf8(&self.b[int_start..int_end]).unwrap_or_default();
            if let Ok(m) = digits.parse::<u64>() {
                return Ok(Value::Number(if !negative {
                    m.into()
                } else if m != 0 && m <= 1 << 63 {
                    (m as i64).wrapping_neg().into()
                } else {
                    float(-(m as f64))
                }));
            }
        }
        match text.parse::<f64>() {
            Ok(x) if x.is_finite() => Ok(Value::Number(float(x))),
            _ => Err(self.err("number out of range")),
        }
    }

    fn digits(&mut self) {
        while let Some(b'0'..=b'9') = self.peek() {
            self.i += 1;
        }
    }
}

fn float(x: f64) -> serde_json::Number {
    serde_json::Number::from_f64(x).unwrap_or_else(|| 0.into()) // finite here: always Some
}

/// Reads `T` from a parsed value.
pub fn from_value<T: DeserializeOwned>(v: Value) -> Result<T, Error> {
    T::deserialize(ValueReader(v))
}

/// A parsed value as a serde `Deserializer`: what serde_json's `Value` deserializer
/// accepts (objects and arrays for structs, strings or one-key objects for enums, null
/// for `None` and unit), with this module's `Error`.
pub struct ValueReader(pub Value);

impl<'de> IntoDeserializer<'de, Error> for ValueReader {
    type Deserializer = Self;
    fn into_deserializer(self) -> Self {
        self
    }
}

fn unexpected(v: &Value) -> Unexpected<'_> {
    match v {
        Value::Null => Unexpected::Unit,
        Value::Bool(b) => Unexpected::Bool(*b),
        Value::Number(n) => match (n.as_u64(), n.as_i64()) {
            (Some(u), _) => Unexpected::Unsigned(u),
            (None, Some(i)) => Unexpected::Signed(i),
            _ => Unexpected::Float(n.as_f64().unwrap_or(f64::NAN)),
        },
        Value::String(s) => Unexpected::Str(s),
        Value::Array(_) => Unexpected::Seq,
        Value::Object(_) => Unexpected::Map,
    }
}

impl ValueReader {
    fn number<'de, V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Number(n) => match (n.as_u64(), n.as_i64()) {
                (Some(u), _) => visitor.visit_u64(u),
                (None, Some(i)) => visitor.visit_i64(i),
                _ => visitor.visit_f64(n.as_f64().unwrap_or(f64::NAN)),
            },
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }
}

fn visit_array<'de, V: Visitor<'de>>(a: Vec<Value>, visitor: V) -> Result<V::Value, Error> {
    let len = a.len();
    let mut seq = SeqReader(a.into_iter());
    let v = visitor.visit_seq(&mut seq)?;
    if seq.0.len() != 0 {
        return Err(Error::invalid_length(len, &"fewer elements in array"));
    }
    Ok(v)
}

fn visit_object<'de, V: Visitor<'de>>(m: serde_json::Map<String, Value>, visitor: V) -> Result<V::Value, Error> {
    let len = m.len();
    let mut map = MapReader { entries: m.into_iter(), value: None };
    let v = visitor.visit_map(&mut map)?;
    if map.entries.len() != 0 {
        return Err(Error::invalid_length(len, &"fewer elements in map"));
    }
    Ok(v)
}

/// A struct written as an array (serde reads its fields in order): the same fields as an
/// object, so that the derived visitors' sequence path is never compiled. The elements
/// missing at the end are missing fields (defaults, or an error), as in serde's derive.
fn positional(a: Vec<Value>, fields: &'static [&'static str]) -> Result<serde_json::Map<String, Value>, Error> {
    if a.len() > fields.len() {
        return Err(Error::invalid_length(a.len(), &"fewer elements in array"));
    }
    let mut m = serde_json::Map::new();
    for (f, v) in fields.iter().zip(a) {
        m.insert(f.to_string(), v); // one by one: `collect` would sort (another sort instantiation)
    }
    Ok(m)
}

struct SeqReader(std::vec::IntoIter<Value>);

impl<'de> SeqAccess<'de> for SeqReader {
    type Error = Error;
    fn next_element_seed<T: DeserializeSeed<'de>>(&mut self, seed: T) -> Result<Option<T::Value>, Error> {
        match self.0.next() {
            Some(v) => seed.deserialize(ValueReader(v)).map(Some),
            None => Ok(None),
        }
    }
    fn size_hint(&self) -> Option<usize> {
        Some(self.0.len())
    }
}

/// An object's key (always a string).
struct KeyReader(String);

impl<'de> Deserializer<'de> for KeyReader {
    type Error = Error;
    fn deserialize_any<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        visitor.visit_string(self.0)
    }
    serde::forward_to_deserialize_any! {
        bool i8 i16 i32 i64 i128 u8 u16 u32 u64 u128 f32 f64 char str string
        bytes byte_buf option unit unit_struct newtype_struct seq tuple
        tuple_struct map struct enum identifier ignored_any
    }
}

/// An enum as JSON writes it: `"variant"`, or `{"variant": value}`.
struct EnumReader {
    variant: String,
    value: Option<Value>,
}

impl<'de> EnumAccess<'de> for EnumReader {
    type Error = Error;
    type Variant = VariantReader;
    fn variant_seed<V: DeserializeSeed<'de>>(self, seed: V) -> Result<(V::Value, VariantReader), Error> {
        Ok((seed.deserialize(KeyReader(self.variant))?, VariantReader(self.value)))
    }
}

/// The variant's value, if written as `{"variant": value}`.
struct VariantReader(Option<Value>);

impl<'de> VariantAccess<'de> for VariantReader {
    type Error = Error;
    fn unit_variant(self) -> Result<(), Error> {
        match self.0 {
            None | Some(Value::Null) => Ok(()),
            Some(other) => Err(Error::invalid_type(unexpected(&other), &"unit variant")),
        }
    }
    fn newtype_variant_seed<T: DeserializeSeed<'de>>(self, seed: T) -> Result<T::Value, Error> {
        match self.0 {
            Some(v) => seed.deserialize(ValueReader(v)),
            None => Err(Error::invalid_type(Unexpected::UnitVariant, &"newtype variant")),
        }
    }
    fn tuple_variant<V: Visitor<'de>>(self, _len: usize, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Some(Value::Array(a)) => visit_array(a, visitor),
            Some(other) => Err(Error::invalid_type(unexpected(&other), &"tuple variant")),
            None => Err(Error::invalid_type(Unexpected::UnitVariant, &"tuple variant")),
        }
    }
    fn struct_variant<V: Visitor<'de>>(self, fields: &'static [&'static str], visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Some(Value::Object(m)) => visit_object(m, visitor),
            Some(Value::Array(a)) => visit_object(positional(a, fields)?, visitor),
            Some(other) => Err(Error::invalid_type(unexpected(&other), &"struct variant")),
            None => Err(Error::invalid_type(Unexpected::UnitVariant, &"struct variant")),
        }
    }
}

struct MapReader {
    entries: serde_json::map::IntoIter,
    value: Option<Value>,
}

impl<'de> MapAccess<'de> for MapReader {
    type Error = Error;
    fn next_key_seed<K: DeserializeSeed<'de>>(&mut self, seed: K) -> Result<Option<K::Value>, Error> {
        match self.entries.next() {
            Some((k, v)) => {
                self.value = Some(v);
                seed.deserialize(KeyReader(k)).map(Some)
            }
            None => Ok(None),
        }
    }
    fn next_value_seed<T: DeserializeSeed<'de>>(&mut self, seed: T) -> Result<T::Value, Error> {
        seed.deserialize(ValueReader(self.value.take().unwrap_or(Value::Null)))
    }
    fn size_hint(&self) -> Option<usize> {
        Some(self.entries.len())
    }
}

macro_rules! numbers {
    ($($method:ident)*) => {
        $(fn $method<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
            self.number(visitor)
        })*
    };
}

// Type by type as serde_json's `Value` deserializer (each method visits only what its
// type can be), so the derive's visitors are not compiled for every kind of value.
impl<'de> Deserializer<'de> for ValueReader {
    type Error = Error;

    fn deserialize_any<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Null => visitor.visit_unit(),
            Value::Bool(b) => visitor.visit_bool(b),
            n @ Value::Number(_) => ValueReader(n).number(visitor),
            Value::String(s) => visitor.visit_string(s),
            Value::Array(a) => visit_array(a, visitor),
            Value::Object(m) => visit_object(m, visitor),
        }
    }

    numbers! { deserialize_i8 deserialize_i16 deserialize_i32 deserialize_i64 deserialize_i128
    deserialize_u8 deserialize_u16 deserialize_u32 deserialize_u64 deserialize_u128 deserialize_f32 deserialize_f64 }

    fn deserialize_bool<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Bool(b) => visitor.visit_bool(b),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_string<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::String(s) => visitor.visit_string(s),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_str<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_string(visitor)
    }

    fn deserialize_char<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_string(visitor)
    }

    fn deserialize_identifier<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_string(visitor)
    }

    fn deserialize_unit<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Null => visitor.visit_unit(),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_unit_struct<V: Visitor<'de>>(self, _name: &'static str, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_unit(visitor)
    }

    fn deserialize_seq<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Array(a) => visit_array(a, visitor),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_tuple<V: Visitor<'de>>(self, _len: usize, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_seq(visitor)
    }

    fn deserialize_tuple_struct<V: Visitor<'de>>(self, _name: &'static str, _len: usize, visitor: V) -> Result<V::Value, Error> {
        self.deserialize_seq(visitor)
    }

    fn deserialize_map<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Object(m) => visit_object(m, visitor),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_struct<V: Visitor<'de>>(self, _name: &'static str, fields: &'static [&'static str], visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Array(a) => visit_object(positional(a, fields)?, visitor),
            Value::Object(m) => visit_object(m, visitor),
            ref other => Err(Error::invalid_type(unexpected(other), &visitor)),
        }
    }

    fn deserialize_option<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::Null => visitor.visit_none(),
            _ => visitor.visit_some(self),
        }
    }

    fn deserialize_enum<V: Visitor<'de>>(self, _name: &'static str, _variants: &'static [&'static str], visitor: V) -> Result<V::Value, Error> {
        match self.0 {
            Value::String(s) => visitor.visit_enum(EnumReader { variant: s, value: None }),
            Value::Object(m) if m.len() == 1 => match m.into_iter().next() {
                Some((variant, value)) => visitor.visit_enum(EnumReader { variant, value: Some(value) }),
                None => Err(Error::invalid_value(Unexpected::Map, &"map with a single key")),
            },
            Value::Object(_) => Err(Error::invalid_value(Unexpected::Map, &"map with a single key")),
            ref other => Err(Error::invalid_type(unexpected(other), &"string or map")),
        }
    }

    fn deserialize_newtype_struct<V: Visitor<'de>>(self, _name: &'static str, visitor: V) -> Result<V::Value, Error> {
        visitor.visit_newtype_struct(self)
    }

    fn deserialize_ignored_any<V: Visitor<'de>>(self, visitor: V) -> Result<V::Value, Error> {
        visitor.visit_unit()
    }

    serde::forward_to_deserialize_any! { bytes byte_buf }
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
            None => Err(Error::invalid_type(unexpected(&m[tag]), &"variant identifier")),
        },
        Some(other) => Err(Error::custom(format_args!("invalid type: {}, expected variant identifier", kind_of(other)))),
        None => Err(Error::missing_field(tag)),
    }
}

/// Deserializes a unit-only enum written as a variant name (serde's externally tagged
/// form: `"name"`, or `{"name": null}`); gives the name's index in `variants`. One
/// function for every such enum instead of a derived visitor each (`unit_variants!`).
pub fn unit_variant<'de, D: Deserializer<'de>>(d: D, variants: &'static [&'static str]) -> Result<usize, D::Error> {
    variant_index(Value::deserialize(d)?, variants).map_err(D::Error::custom)
}

fn variant_index(v: Value, variants: &'static [&'static str]) -> Result<usize, Error> {
    let name = match v {
        Value::String(s) => s,
        Value::Object(m) if m.len() == 1 => {
            let Some((name, value)) = m.into_iter().next() else { return Err(Error::invalid_value(Unexpected::Map, &"map with a single key")) };
            if !variants.contains(&name.as_str()) {
                return Err(Error::unknown_variant(&name, variants));
            }
            if !value.is_null() {
                return Err(Error::invalid_type(unexpected(&value), &"unit variant"));
            }
            name
        }
        Value::Object(_) => return Err(Error::invalid_value(Unexpected::Map, &"map with a single key")),
        other => return Err(Error::invalid_type(unexpected(&other), &"string or map")),
    };
    variants.iter().position(|n| *n == name).ok_or_else(|| Error::unknown_variant(&name, variants))
}

/// `Deserialize` for a unit-only enum through `unit_variant`: `unit_variants!(Port { Left = "left", Right = "right" });`
/// with the names its `Serialize` derive writes (tests/json_formats.rs checks both ways).
macro_rules! unit_variants {
    ($ty:ident { $($variant:ident = $name:literal),* $(,)? }) => {
        impl<'de> serde::Deserialize<'de> for $ty {
            fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
                const ALL: &[$ty] = &[$($ty::$variant),*];
                let i = $crate::json::unit_variant(d, &[$($name),*])?;
                ALL.get(i).copied().ok_or_else(|| <D::Error as serde::de::Error>::custom("variant list mismatch"))
            }
        }
    };
}
pub(crate) use unit_variants;

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
