//! Layout files: the TOML contract of `../shared/design.md`, parsed into a validated [`Spec`].
//!
//! Parsing is strict (`deny_unknown_fields`) so that a typo never silently changes a design,
//! and every error names the file, the key (and line where known) and what would be valid.

mod raw;

use std::fmt;

use thiserror::Error;

pub use raw::RawLayout;

/// Largest slot count accepted: far beyond any real core, small enough that nothing we
/// allocate per slot (or per slot pair) can exhaust memory.
pub const MAX_SLOTS: usize = 5_000;
/// Largest pole count accepted.
pub const MAX_POLES: usize = 2_000;
/// Largest phase count accepted.
pub const MAX_PHASES: usize = 15;
/// Largest number of turns per coil accepted.
pub const MAX_TURNS: u32 = 100_000;
/// Largest number of explicit `[[coil]]` entries accepted.
pub const MAX_COILS: usize = 2 * MAX_SLOTS;

/// Closed rotary core or open, flat linear primary.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Topology {
    /// A closed core: slot Z is followed by slot 1 again.
    Rotary,
    /// A flat, open-ended primary: slot 1 and slot Z are the two ends.
    Linear,
}

impl fmt::Display for Topology {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Topology::Rotary => "rotary",
            Topology::Linear => "linear",
        })
    }
}

/// How the coils of a single-layer winding are shaped.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Style {
    /// Coils of one span, laid like roof tiles.
    Lap,
    /// Nested coils of different spans around one centre (single layer only).
    Concentric,
}

/// How the three phases are joined.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Connection {
    /// Phase ends U2, V2, W2 joined in a star point.
    Star,
    /// Phases joined end to start in a ring.
    Delta,
}

impl fmt::Display for Connection {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Connection::Star => "star",
            Connection::Delta => "delta",
        })
    }
}

/// Core sizes, in SI units inside the program.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, schemars::JsonSchema)]
pub struct Core {
    /// Slot pitch along the gap, metres.
    pub slot_pitch_m: Option<f64>,
    /// Bore diameter of a rotary core, metres.
    pub bore_m: Option<f64>,
    /// Stack length (core depth across the gap's direction of travel), metres.
    pub stack_m: Option<f64>,
}

/// Supply the winding is designed for.
#[derive(Debug, Clone, Copy, PartialEq, Default, serde::Serialize, schemars::JsonSchema)]
pub struct Supply {
    /// Supply frequency, hertz.
    pub frequency_hz: Option<f64>,
    /// Line-to-line voltage, volts r.m.s.
    pub line_voltage_v: Option<f64>,
}

/// One coil of an explicit coil list, slots already converted to 0-based indices.
#[derive(Debug, Clone, PartialEq)]
pub struct CoilEntry {
    /// Index into the phase labels.
    pub phase: usize,
    /// Slot where current enters, 0-based.
    pub go: usize,
    /// Slot where current leaves, 0-based.
    pub back: usize,
    /// Turns of this coil.
    pub turns: u32,
    /// Parallel path, 0-based.
    pub path: usize,
}

/// A validated design: everything needed to build a [`crate::winding::Winding`].
#[derive(Debug, Clone, PartialEq)]
pub struct Spec {
    /// Free text for drawings and reports.
    pub title: Option<String>,
    /// Closed or open core.
    pub topology: Topology,
    /// Slot count Z, end slots of a linear primary included.
    pub slots: usize,
    /// Pole count 2p.
    pub poles: usize,
    /// Phase count m.
    pub phases: usize,
    /// Labels of the phases, in sequence order.
    pub phase_labels: Vec<String>,
    /// Layers per slot, 1 or 2.
    pub layers: usize,
    /// Coil span in slot pitches; `None` means "nearest full pitch".
    pub pitch: Option<usize>,
    /// Coil shape of single-layer windings.
    pub style: Style,
    /// Turns per coil.
    pub turns_per_coil: u32,
    /// Parallel paths per phase.
    pub parallel_paths: usize,
    /// Star or delta.
    pub connection: Connection,
    /// Skew of slots against the field, in slot pitches.
    pub skew_slots: f64,
    /// Core sizes.
    pub core: Core,
    /// Supply.
    pub supply: Supply,
    /// Explicit coil list (replaces synthesis) when non-empty.
    pub coils: Vec<CoilEntry>,
    /// Optional drawing colours, one per phase, as given.
    pub colours: Option<Vec<String>>,
    /// Wire, copper rule, gap, secondary, leads and measured values.
    pub design: crate::design::Design,
}

impl Spec {
    /// A three-phase design of the given core with every optional key at its default (U, V,
    /// W; lap; one turn per coil; one path; star; no skew; nearest full pitch): the start
    /// for feasibility probes, surveys and tests, changed with struct-update syntax.
    pub fn basic(topology: Topology, slots: usize, poles: usize, layers: usize) -> Spec {
        Spec {
            title: None,
            topology,
            slots,
            poles,
            phases: 3,
            phase_labels: vec!["U".into(), "V".into(), "W".into()],
            layers,
            pitch: None,
            style: Style::Lap,
            turns_per_coil: 1,
            parallel_paths: 1,
            connection: Connection::Star,
            skew_slots: 0.0,
            core: Core::default(),
            supply: Supply::default(),
            coils: Vec::new(),
            colours: None,
            design: crate::design::Design::default(),
        }
    }
}

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
    raw.validate(source, file)
}

/// The parser's message, reduced to one readable line with the line and key in front.
fn syntax_message(source: &str, e: &toml::de::Error) -> String {
    let what = e
        .message()
        .trim()
        .replace("expected i64", "expected a whole number")
        .replace("expected f64", "expected a number");
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
    }
}
