//! Presenters: turn analysis reports into text tables, JSON or CSV. Analyses never print;
//! a new format never touches an analysis (one exporter per format behind [`Exporter`]).

mod audit_report;
pub mod audit_words;
pub mod book_report;
mod card_report;
mod choose_report;
mod csv;
mod field_report;
pub mod html;
pub mod json;
mod loading_report;
mod refusal_words;
pub(crate) mod reports;
pub mod schema;
pub mod single_phase_report;
mod span_words;
pub mod speeds_report;
mod table;
mod text;
mod thrust_report;
pub mod two_winding_report;
pub mod warning_words;

pub use card_report::{configuration_name, connection_words, rating_words};
pub use csv::Csv;
pub use json::Json;
pub use loading_report::{loading_notes, loading_table, rated_words};
pub use table::{Align, Table};
pub use text::Text;

use serde::Serialize;

/// Output formats of every analysis command.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Format {
    /// Aligned tables for a person (80 columns).
    Text,
    /// One JSON object (the contract of `../shared/design.md`).
    Json,
    /// The main table as comma-separated values.
    Csv,
}

/// One block of a text report.
#[derive(Debug, Clone, PartialEq)]
pub enum Section {
    /// A heading line.
    Heading(String),
    /// The design header ([`design_lines`]): printed by the terminal, shown once at the top
    /// of the HTML page and in the sheets' title block instead.
    Design(Vec<String>),
    /// The safety caution: printed by the terminal; the HTML page and the sheets show it
    /// in their own frame (page header and foot, every title block) instead.
    Caution(Vec<String>),
    /// Paragraphs of text, each whole (the text presenter wraps them).
    Lines(Vec<String>),
    /// Numbered items ("1. ..."), each a paragraph whose wrapped lines the terminal indents
    /// under the text (a hanging indent of [`ITEM_INDENT`] columns).
    Items(Vec<String>),
    /// An aligned table.
    Table(Table),
}

/// Columns by which the terminal indents the wrapped lines of a numbered item.
pub const ITEM_INDENT: usize = 3;

/// Something every exporter can present.
pub trait Report {
    /// The JSON form: the typed facts, with the format's version, the caution and each
    /// worded fact's `message` (see [`json`]).
    fn json(&self) -> impl Serialize + '_;
    /// The text view, in reading order.
    fn sections(&self) -> Vec<Section>;
    /// The table a spreadsheet gets.
    fn main_table(&self) -> Table;
}

/// A study fact seen by the presenters: `Say(&fact)` is its sentence as a `Display`, which
/// the presenters may implement for the study's types (the fact's own crate has no words).
pub struct Say<'a, T>(pub &'a T);

/// A typed fact the presenters put into words: the one sentence that the text, the JSON
/// (`message`), the sheets and the HTML page all show.
pub trait Words {
    /// The fact in words.
    fn message(&self) -> String;
}

/// `Words` for a fact whose sentence is written as `Display for Say<'_, T>`.
macro_rules! worded {
    ($ty:ty) => {
        impl $crate::output::Words for $ty {
            fn message(&self) -> String {
                $crate::output::Say(self).to_string()
            }
        }
    };
}
pub(crate) use worded;

/// One output format.
pub trait Exporter {
    /// Write a report straight into `out` (stdout, a file, a buffer): nothing is assembled
    /// in memory first beyond one line or one table.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()>;
}

/// Write `report` in `format` into `out`.
pub fn write<R: Report>(
    report: &R,
    format: Format,
    out: &mut dyn std::io::Write,
) -> std::io::Result<()> {
    match format {
        Format::Text => Text.export(report, out),
        Format::Json => Json.export(report, out),
        Format::Csv => Csv.export(report, out),
    }
}

/// Present `report` in `format` as one string (for pages, tests and files).
pub fn render<R: Report>(report: &R, format: Format) -> std::io::Result<String> {
    let mut buf = Vec::new();
    write(report, format, &mut buf)?;
    String::from_utf8(buf).map_err(std::io::Error::other)
}

/// The report's sections with its design warnings placed right after the heading, so a
/// winder reads them first.
pub fn with_warnings(
    mut sections: Vec<Section>,
    warnings: &[crate::warnings::DesignWarning],
) -> Vec<Section> {
    if warnings.is_empty() {
        return sections;
    }
    let lines = warnings
        .iter()
        .map(|w| paragraph(&format!("WARNING: {}", w.message())))
        .collect();
    let at = sections.len().min(1);
    sections.insert(at, Section::Lines(lines));
    sections
}

pub use crate::numbering::num;

/// The safety caution as a report's section, wrapped for the terminal.
pub fn caution() -> Section {
    Section::Caution(vec![paragraph(crate::safety::CAUTION)])
}

/// How a report opens: its heading ("Kind: title", or the kind alone) and the shared
/// design header.
pub fn opening(kind: &str, h: &crate::header::DesignHeader) -> [Section; 2] {
    let heading = match &h.title {
        Some(t) => format!("{kind}: {t}"),
        None => kind.to_string(),
    };
    [Section::Heading(heading), Section::Design(design_lines(h))]
}

/// A piece of a worded line: plain words, or a fact a page may mark (its id and its words).
#[derive(Debug, Clone, PartialEq)]
pub enum Piece {
    /// Words.
    Text(String),
    /// A fact with the id a page gives it (`slots`, `kw1`).
    Fact(&'static str, String),
}

impl Piece {
    /// The piece's words.
    pub fn text(&self) -> &str {
        match self {
            Piece::Text(t) | Piece::Fact(_, t) => t,
        }
    }
}

/// The shared design header in words: the same lines open every report.
pub fn design_lines(h: &crate::header::DesignHeader) -> Vec<String> {
    design_pieces(h)
        .iter()
        .map(|line| line.iter().map(Piece::text).collect())
        .collect()
}

/// The shared design header as pieces: the slot count and k_w1 are facts a page marks.
pub fn design_pieces(h: &crate::header::DesignHeader) -> Vec<Vec<Piece>> {
    use crate::winding::{Style, Topology};
    let kind = match h.topology {
        Topology::Rotary => "rotary core",
        Topology::Linear => "linear primary",
    };
    let layers = if h.layers == 2 {
        "double layer"
    } else {
        "single layer"
    };
    let (style, mean) = match h.style {
        Style::Lap if h.pitch == 1 => ("tooth coils", ""),
        Style::Lap => ("lap", ""),
        Style::Concentric => ("concentric", " (mean)"),
    };
    let turns = if !h.mixed_turns.is_empty() {
        format!(
            "mixed turns per coil: {} (most often {}){}",
            itertools::Itertools::join(&mut h.mixed_turns.iter(), ", "),
            h.turns_per_coil,
            if h.turns_assumed {
                "; coils without turns taken as 1 (winding.turns_per_coil not given)"
            } else {
                ""
            }
        )
    } else if h.turns_assumed {
        "1 turn per coil (assumed: winding.turns_per_coil not given)".to_string()
    } else if h.turns_per_coil == 1 {
        "1 turn per coil".to_string()
    } else {
        format!("{} turns per coil", h.turns_per_coil)
    };
    vec![
        vec![
            Piece::Text(format!("{kind}: ")),
            Piece::Fact("slots", h.slots.to_string()),
            Piece::Text(format!(
                " slots, {} poles{}, {} phases{}",
                h.poles,
                match h.pole_change {
                    Some(_) => format!(" (and {} by pole changing)", 2 * h.poles),
                    None => String::new(),
                },
                h.phases,
                if h.recorded {
                    " (recorded coil list)"
                } else {
                    ""
                }
            )),
        ],
        vec![Piece::Text(format!(
            "{layers} {style}, span {}{mean}, pole pitch {} slots, q = {}",
            h.pitch,
            num(h.pole_pitch_slots, 3),
            h.slots_per_pole_phase_fraction
        ))],
        vec![
            Piece::Text(format!(
                "{turns}, {}, {} connection; k_w1 = ",
                crate::numbering::count(h.parallel_paths, "path", "paths"),
                match h.pole_change {
                    Some(pc) => speeds_report::connection_words(pc).to_string(),
                    None => h.connection.to_string(),
                },
            )),
            Piece::Fact("kw1", num(h.winding_factor, 4)),
        ],
    ]
}
pub use reports::paragraph;
