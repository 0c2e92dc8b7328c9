//! User text made safe for every place it is shown: SVG and HTML markup, the terminal and
//! spreadsheets. One function per destination, all built on [`clean`].

use std::borrow::Cow;

/// Longest title accepted in a layout file, characters.
pub const MAX_TITLE_CHARS: usize = 200;

/// True for characters that never reach output: controls (C0 and C1; XML 1.0 forbids the
/// C0 ones, terminals act on both), the noncharacters U+FDD0–U+FDEF and U+xFFFE, U+xFFFF of
/// every plane (not to be interchanged; HTML parsers flag them), and the
/// bidirectional embeddings, overrides and isolates U+202A–U+202E, U+2066–U+2069, which
/// could make text read in another order than it is stored.
fn unsafe_char(c: char) -> bool {
    c.is_control()
        || matches!(c, '\u{FFFE}' | '\u{FFFF}')
        || ('\u{FDD0}'..='\u{FDEF}').contains(&c)
        || (c as u32 & 0xFFFE) == 0xFFFE
        || ('\u{202A}'..='\u{202E}').contains(&c)
        || ('\u{2066}'..='\u{2069}').contains(&c)
}

/// True for characters that do not print as themselves: whitespace, the unsafe characters
/// above, and invisible formatting characters (soft hyphen, zero-width spaces and joiners,
/// word joiner, invisible operators, bidirectional marks, byte-order mark, variation
/// selectors, interlinear annotation, tags). Used where two names must differ visibly.
pub fn invisible(c: char) -> bool {
    let u = c as u32;
    c.is_whitespace()
        || unsafe_char(c)
        || matches!(u, 0x00AD | 0x034F | 0x061C | 0x180E | 0xFEFF)
        || (0x200B..=0x200F).contains(&u)
        || (0x2060..=0x206F).contains(&u)
        || (0xFE00..=0xFE0F).contains(&u)
        || (0xFFF9..=0xFFFB).contains(&u)
        || (0xE0000..=0xE0FFF).contains(&u)
        // Combining marks (a label "U" + U+0308 prints as "Ü", like U+00DC) and the
        // blank fillers (Hangul fillers, braille blank, Mongolian variation selectors).
        || (0x0300..=0x036F).contains(&u)
        || (0x1AB0..=0x1AFF).contains(&u)
        || (0x1DC0..=0x1DFF).contains(&u)
        || (0x20D0..=0x20FF).contains(&u)
        || (0xFE20..=0xFE2F).contains(&u)
        || matches!(u, 0x115F | 0x1160 | 0x3164 | 0xFFA0 | 0x2800)
        || (0x180B..=0x180D).contains(&u)
}

/// `s` with every unsafe character replaced by a space (bidirectional controls removed),
/// borrowed when nothing needed changing. Escaping `<`, `>`, `&` and quotes is left to the
/// markup writer (the `svg` crate, or the HTML report's escaper).
pub fn clean(s: &str) -> Cow<'_, str> {
    if !s.chars().any(unsafe_char) {
        return Cow::Borrowed(s);
    }
    Cow::Owned(
        s.chars()
            .filter_map(|c| {
                if ('\u{202A}'..='\u{202E}').contains(&c) || ('\u{2066}'..='\u{2069}').contains(&c)
                {
                    None
                } else if unsafe_char(c) {
                    Some(' ')
                } else {
                    Some(c)
                }
            })
            .collect(),
    )
}

/// [`clean`] text cut to at most `max` characters, ending in "…" when cut: for titles on
/// charts that have no room to wrap.
pub fn short(s: &str, max: usize) -> String {
    let c = clean(s);
    if c.chars().count() <= max {
        return c.into_owned();
    }
    let mut out: String = c.chars().take(max.saturating_sub(1)).collect();
    out.push('…');
    out
}

/// `s` as an identifier for markup: ASCII letters and digits in lower case, everything else
/// a hyphen ("Slots Z" → "slots-z").
pub fn slug(s: &str) -> String {
    s.chars()
        .map(|c| {
            if c.is_ascii_alphanumeric() {
                c.to_ascii_lowercase()
            } else {
                '-'
            }
        })
        .collect()
}

/// A spreadsheet cell: numbers stay numbers; text that a spreadsheet would run as a
/// formula (starting with `=`, `+`, `-`, `@`, tab or carriage return) gets a leading `'`
/// (the OWASP recommendation for CSV injection).
pub fn csv_cell(s: &str) -> Cow<'_, str> {
    let s = clean(s);
    let risky = s.starts_with(['=', '+', '-', '@', '\t', '\r']);
    if risky && s.trim().parse::<f64>().is_err() {
        Cow::Owned(format!("'{s}"))
    } else {
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // XML 1.0 §2.2 Char production: #x9 | #xA | #xD | [#x20-#xD7FF] | [#xE000-#xFFFD] | ...
    #[test]
    fn forbidden_and_bidi_characters_go() {
        assert_eq!(clean("a\u{1}b\u{FFFE}c\u{FFFF}d"), "a b c d");
        assert_eq!(clean("x\u{202E}y\u{2066}z"), "xyz");
        assert_eq!(clean("\u{9B}31m"), " 31m");
        assert!(matches!(clean("plain U1"), Cow::Borrowed(_)));
    }

    #[test]
    fn formulas_are_neutralised_and_numbers_kept() {
        assert_eq!(csv_cell("=1+1"), "'=1+1");
        assert_eq!(csv_cell("-U"), "'-U");
        assert_eq!(csv_cell("+U"), "'+U");
        assert_eq!(csv_cell("@SUM(A1)"), "'@SUM(A1)");
        assert_eq!(csv_cell("-0.25"), "-0.25");
        assert_eq!(csv_cell("1e-3"), "1e-3");
        assert_eq!(csv_cell("U1"), "U1");
    }
}
