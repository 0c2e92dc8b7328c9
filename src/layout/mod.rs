//! Layout files: the TOML contract of `../shared/design.md`, parsed into a validated [`Spec`].
//!
//! Parsing is strict (`deny_unknown_fields`) so that a typo never silently changes a design,
//! and every error names the file, the key (and line where known) and what would be valid.

mod amend;
mod raw;

/// Starting layouts with every key commented, for `beltwright template`.
pub mod templates {
    /// A rotary stator to plan or size.
    pub const ROTARY: &str = include_str!("templates/rotary.toml");
    /// A flat primary over its plate.
    pub const FLAT: &str = include_str!("templates/flat.toml");
    /// An as-found record written by coil groups.
    pub const RECORD: &str = include_str!("templates/record.toml");
}

pub use amend::amend;

use thiserror::Error;

use crate::design::{Connection, Core, Style, Supply, Topology};

pub use raw::RawLayout;

pub use beltwright_model::spec::{
    CoilEntry, MAX_COILS, MAX_PHASES, MAX_POLES, MAX_SLOTS, MAX_TURNS, SecondWinding, Sharing, Spec,
};

/// Why a layout file was refused.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum LayoutError {
    /// The TOML itself or its types were wrong; `message` is the parser's, with line.
    #[error("{file}: {message}")]
    Syntax {
        /// File name as the user gave it.
        file: String,
        /// Parser message (names the key and line).
        message: String,
    },
    /// A value parsed but is impossible.
    #[error("{file}{}: {key}: {message}", line.map(|l| format!(", line {l}")).unwrap_or_default())]
    Invalid {
        /// File name as the user gave it.
        file: String,
        /// Dotted key, e.g. `machine.slots` or `coil[3].go`.
        key: String,
        /// Line number, 1-based, where the key was found.
        line: Option<usize>,
        /// What is wrong and what would be valid.
        message: String,
    },
}

/// Parse and validate a layout file's text. `file` is used in messages only.
pub fn parse(source: &str, file: &str) -> Result<Spec, LayoutError> {
    let raw: RawLayout = toml::from_str(source).map_err(|e| LayoutError::Syntax {
        file: file.to_string(),
        message: syntax_message(source, &e),
    })?;
    raw.validate_windings(source, file)
}

/// The parser's message, reduced to one readable line with the line and key in front.
fn syntax_message(source: &str, e: &toml::de::Error) -> String {
    let what = e
        .message()
        .trim()
        .replace("expected i64", "expected a whole number")
        .replace("expected f64", "expected a number");
    // A bare TOML date or time where a number or text belongs reads "invalid type: map"
    // from the parser; say what it is.
    let what = if what.starts_with("invalid type: map") {
        what.replacen(
            "invalid type: map",
            "a table, or a date or time written bare",
            1,
        )
    } else {
        what
    };
    // A table or key left out altogether has no line of its own: say which and where.
    if let Some(field) = what
        .strip_prefix("missing field `")
        .and_then(|r| r.strip_suffix('`'))
    {
        return match field {
            "machine" => {
                "the [machine] table is missing: add it with topology, slots and poles".to_string()
            }
            "winding" => {
                "the [winding] table is missing: add it with at least layers = 1 or 2".to_string()
            }
            other => {
                let table = e
                    .span()
                    .and_then(|s| {
                        // Up to the end of the line the span starts on (the table's header).
                        let start = s.start.min(source.len());
                        let end = source[start..]
                            .find('\n')
                            .map_or(source.len(), |n| start + n);
                        source[..end]
                            .lines()
                            .rev()
                            .find(|l| l.trim_start().starts_with('['))
                            .map(|l| l.trim().to_string())
                    })
                    .unwrap_or_default();
                if table.is_empty() {
                    format!("key `{other}` is missing")
                } else {
                    format!("key `{other}` is missing from {table}")
                }
            }
        };
    }
    match e.span() {
        Some(span) => {
            let line = line_of_offset(source, span.start);
            let key = source
                .lines()
                .nth(line - 1)
                .and_then(|l| l.split_once('='))
                .map(|(k, _)| k.trim())
                .filter(|k| !k.is_empty() && !k.starts_with('['));
            match key {
                Some(k) => format!("line {line}, key `{k}`: {what}"),
                None => format!("line {line}: {what}"),
            }
        }
        None => what,
    }
}

fn line_of_offset(source: &str, offset: usize) -> usize {
    source[..offset.min(source.len())].matches('\n').count() + 1
}

/// Find the 1-based line on which `key` is set inside `[table]` (or `[[table]]` number
/// `index`, counting from 0). Used to put a line number on validation errors.
pub fn locate(source: &str, table: &str, index: usize, key: &str) -> Option<usize> {
    let mut array_seen: usize = 0;
    let mut in_wanted = table.is_empty();
    for (n, line) in source.lines().enumerate() {
        let t = line.trim();
        // A table header may carry a comment after it: `[[coil]]   # found backwards`.
        let t = if t.starts_with('[') {
            t.split('#').next().unwrap_or(t).trim()
        } else {
            t
        };
        if let Some(rest) = t.strip_prefix("[[") {
            let current = rest.trim_end_matches("]]").trim();
            if current == table {
                in_wanted = array_seen == index;
                array_seen += 1;
            } else {
                in_wanted = false;
            }
            continue;
        }
        if let Some(rest) = t.strip_prefix('[') {
            in_wanted = rest.trim_end_matches(']').trim() == table;
            continue;
        }
        if in_wanted
            && let Some((k, _)) = t.split_once('=')
            && k.trim() == key
        {
            return Some(n + 1);
        }
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn locate_finds_keys_in_tables_and_arrays() {
        let src = "title = \"x\"\n[machine]\nslots = 3\n[[coil]]\ngo = 1\n[[coil]]\ngo = 2\n";
        assert_eq!(locate(src, "", 0, "title"), Some(1));
        assert_eq!(locate(src, "machine", 0, "slots"), Some(3));
        assert_eq!(locate(src, "coil", 1, "go"), Some(7));
        assert_eq!(locate(src, "coil", 2, "go"), None);
        let commented =
            "[second_winding]   # above the first\npoles = 12\n[[coil]] # odd\ngo = 3\n";
        assert_eq!(locate(commented, "second_winding", 0, "poles"), Some(2));
        assert_eq!(locate(commented, "coil", 0, "go"), Some(4));
    }
}
