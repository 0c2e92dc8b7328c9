//! Presenters: turn analysis reports into text tables, JSON or CSV. Analyses never print;
//! a new format never touches an analysis (one exporter per format behind [`Exporter`]).

mod audit_report;
pub mod audit_words;
mod card_report;
mod choose_report;
mod csv;
mod field_report;
pub mod html;
mod json;
mod refusal_words;
pub(crate) mod reports;
pub mod schema;
mod table;
mod text;
mod thrust_report;
pub mod warning_words;

pub use card_report::configuration_name;
pub use csv::Csv;
pub use json::Json;
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
    /// Free lines of text.
    Lines(Vec<String>),
    /// An aligned table.
    Table(Table),
}

/// Something every exporter can present.
pub trait Report: Serialize {
    /// The text view, in reading order.
    fn sections(&self) -> Vec<Section>;
    /// The table a spreadsheet gets.
    fn main_table(&self) -> Table;
}

/// One output format.
pub trait Exporter {
    /// Serialize a report to the bytes written on stdout.
    fn export<R: Report>(&self, report: &R) -> Result<String, serde_json::Error>;
}

/// Present `report` in `format`.
pub fn render<R: Report>(report: &R, format: Format) -> Result<String, serde_json::Error> {
    match format {
        Format::Text => Text.export(report),
        Format::Json => Json.export(report),
        Format::Csv => Csv.export(report),
    }
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
        .flat_map(|w| reports::wrap(&format!("WARNING: {}", w.message()), 78))
        .collect();
    let at = sections.len().min(1);
    sections.insert(at, Section::Lines(lines));
    sections
}

pub use crate::numbering::num;
pub use reports::{CONTINUES, paragraphs, wrap, wrap_plain};
