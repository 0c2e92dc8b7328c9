//! JSON presenter: the report struct as one pretty-printed object.
//!
//! Strings are escaped beyond what JSON requires: besides the C0 controls, DEL, the C1
//! controls, the bidirectional embeddings, overrides and isolates, the line and paragraph
//! separators and the noncharacters are written as `\uXXXX`, so no text from a layout
//! reaches a terminal or a log that shows the JSON raw and acts on it.

use std::io::{self, Write};

use serde_json::ser::{Formatter, PrettyFormatter};

use super::{Exporter, Report};

/// One JSON object on stdout.
pub struct Json;

impl Exporter for Json {
    /// Streamed: serde writes the object into `out` as it walks the report.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        let mut ser = serde_json::Serializer::with_formatter(&mut *out, Escaping::default());
        report.serialize(&mut ser)?;
        out.write_all(b"\n")
    }
}

/// Characters written escaped in JSON strings although JSON allows them raw.
fn escaped(c: char) -> bool {
    let u = c as u32;
    u == 0x7F
        || (0x80..=0x9F).contains(&u)
        || (0x202A..=0x202E).contains(&u)
        || (0x2066..=0x2069).contains(&u)
        || u == 0x2028
        || u == 0x2029
        || (0xFDD0..=0xFDEF).contains(&u)
        || (u & 0xFFFE) == 0xFFFE
}

/// serde_json's pretty printer, with the extra escapes of [`escaped`].
#[derive(Default)]
struct Escaping {
    pretty: PrettyFormatter<'static>,
}

impl Formatter for Escaping {
    fn write_string_fragment<W: ?Sized + Write>(&mut self, w: &mut W, s: &str) -> io::Result<()> {
        let mut start = 0;
        for (i, c) in s.char_indices() {
            if escaped(c) {
                w.write_all(&s.as_bytes()[start..i])?;
                let mut buf = [0u16; 2];
                for unit in c.encode_utf16(&mut buf) {
                    write!(w, "\\u{unit:04x}")?;
                }
                start = i + c.len_utf8();
            }
        }
        w.write_all(&s.as_bytes()[start..])
    }

    fn begin_array<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.begin_array(w)
    }
    fn end_array<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.end_array(w)
    }
    fn begin_array_value<W: ?Sized + Write>(&mut self, w: &mut W, first: bool) -> io::Result<()> {
        self.pretty.begin_array_value(w, first)
    }
    fn end_array_value<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.end_array_value(w)
    }
    fn begin_object<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.begin_object(w)
    }
    fn end_object<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.end_object(w)
    }
    fn begin_object_key<W: ?Sized + Write>(&mut self, w: &mut W, first: bool) -> io::Result<()> {
        self.pretty.begin_object_key(w, first)
    }
    fn begin_object_value<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.begin_object_value(w)
    }
    fn end_object_value<W: ?Sized + Write>(&mut self, w: &mut W) -> io::Result<()> {
        self.pretty.end_object_value(w)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // RFC 8259 allows U+0080–U+009F and U+202E raw in strings; we escape them as \uXXXX,
    // which any JSON parser reads back to the same text.
    #[test]
    fn controls_and_bidi_are_escaped_and_read_back() {
        let text = "U\u{85}\u{202e}V\u{7f}W\u{fdd0}\u{10ffff}";
        let mut out = Vec::new();
        let mut ser = serde_json::Serializer::with_formatter(&mut out, Escaping::default());
        serde::Serialize::serialize(&text, &mut ser).expect("serializes");
        let raw = String::from_utf8(out).expect("utf-8");
        assert_eq!(raw, "\"U\\u0085\\u202eV\\u007fW\\ufdd0\\udbff\\udfff\"");
        let back: String = serde_json::from_str(&raw).expect("parses");
        assert_eq!(back, text);
    }
}
