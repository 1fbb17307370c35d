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
