//! Text on sheets: the bundled font, width measurement for layout, and text nodes with user
//! text cleaned so the SVG stays well-formed XML.
//!
//! Layout measures text with the metrics of the bundled DejaVu Sans (the family every sheet
//! asks for), so boxes and columns are sized to what the PDF and PNG exporters draw.

use std::sync::OnceLock;

use svg::node::element::Text;

/// DejaVu Sans (Bitstream Vera licence, see `assets/fonts/DejaVuSans-LICENSE.txt`): the one
/// font file we ship, so sheets render the same on every machine.
pub const BUNDLED_FONT: &[u8] = include_bytes!("../../assets/fonts/DejaVuSans.ttf");

/// Family name every sheet asks for, with generic fallback for SVG viewers.
pub const FONT_FAMILY: &str = "DejaVu Sans, sans-serif";

fn face() -> Option<&'static ttf_parser::Face<'static>> {
    static FACE: OnceLock<Option<ttf_parser::Face<'static>>> = OnceLock::new();
    FACE.get_or_init(|| ttf_parser::Face::parse(BUNDLED_FONT, 0).ok())
        .as_ref()
}

/// Advance width of `s` set at `size` (mm), in mm.
pub fn width(s: &str, size: f64) -> f64 {
    let Some(f) = face() else {
        return s.chars().count() as f64 * 0.62 * size;
    };
    let upem = f64::from(f.units_per_em());
    let units: f64 = s
        .chars()
        .map(|c| {
            f.glyph_index(c)
                .and_then(|g| f.glyph_hor_advance(g))
                .map_or(0.62 * upem, f64::from)
        })
        .sum();
    units / upem * size
}

/// User text made safe for XML ([`crate::sanitize::clean`]); `<`, `>` and `&` are escaped
/// by the `svg` crate when the text node is written.
pub fn clean(s: &str) -> String {
    crate::sanitize::clean(s).into_owned()
}

/// Horizontal anchoring of a text node.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// `x` is the left end.
    Start,
    /// `x` is the centre.
    Middle,
    /// `x` is the right end.
    End,
}

/// A text node at baseline (`x`, `y`), `size` mm high, content cleaned.
pub fn label(x: f64, y: f64, size: f64, anchor: Anchor, content: &str) -> Text {
    let a = match anchor {
        Anchor::Start => "start",
        Anchor::Middle => "middle",
        Anchor::End => "end",
    };
    Text::new(clean(content))
        .set("x", r(x))
        .set("y", r(y))
        .set("font-size", r(size))
        .set("text-anchor", a)
}

/// Break `s` into lines no wider than `max` mm at `size` mm, on spaces.
pub fn wrap(s: &str, size: f64, max: f64) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in s.split_whitespace() {
        let trial = if line.is_empty() {
            word.to_string()
        } else {
            format!("{line} {word}")
        };
        if width(&trial, size) <= max || line.is_empty() {
            line = trial;
        } else {
            lines.push(std::mem::take(&mut line));
            line = word.to_string();
        }
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

/// Cut `s` to at most `max` mm at `size` mm, ending in "…" when shortened.
pub fn fit(s: &str, size: f64, max: f64) -> String {
    if width(s, size) <= max {
        return s.to_string();
    }
    let mut out = String::new();
    for c in s.chars() {
        let trial = format!("{out}{c}…");
        if width(&trial, size) > max {
            break;
        }
        out.push(c);
    }
    format!("{out}…")
}

/// Round to 0.01 mm so files stay small and snapshots stable.
pub fn r(x: f64) -> f64 {
    let v = (x * 100.0).round() / 100.0;
    if v == 0.0 { 0.0 } else { v }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bundled_font_parses_and_measures() {
        assert!(face().is_some());
        // DejaVu Sans advances (units per em 2048): "M" 1767, "i" 569 — read from the font
        // file itself with ttf-parser, so this checks the measuring path, not the font.
        let f = face().unwrap();
        let m = f.glyph_hor_advance(f.glyph_index('M').unwrap()).unwrap();
        assert!((width("M", 10.0) - f64::from(m) / 2048.0 * 10.0).abs() < 1e-9);
        assert!(width("MMMM", 3.0) > width("iiii", 3.0));
    }

    #[test]
    fn wrap_keeps_lines_inside_the_width() {
        let s = "work on windings only de-energised and isolated and test insulation";
        for line in wrap(s, 2.0, 40.0) {
            assert!(width(&line, 2.0) <= 40.0, "{line}");
        }
        assert_eq!(wrap(s, 2.0, 40.0).join(" "), s);
    }

    #[test]
    fn clean_removes_control_characters() {
        assert_eq!(clean("a\u{1}b\nc"), "a b c");
    }
}
