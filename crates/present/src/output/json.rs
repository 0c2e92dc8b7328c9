//! JSON presenter: the report struct as one pretty-printed object.
//!
//! Strings are escaped beyond what JSON requires: besides the C0 controls, DEL, the C1
//! controls, the bidirectional embeddings, overrides and isolates, the line and paragraph
//! separators and the noncharacters are written as `\uXXXX`, so no text from a layout
//! reaches a terminal or a log that shows the JSON raw and acts on it.

use std::io::{self, Write};

use serde_json::ser::{Formatter, PrettyFormatter};

use schemars::JsonSchema;
use serde::{Serialize, Serializer};

use super::{Exporter, Report, Words};
use crate::assumption::Assumption;
use crate::audit::{AuditReport, Finding, Travel};
use crate::card::DataCard;
use crate::card::leads::{LeadScheme, Rotation};
use crate::factors::FactorTable;
use crate::field::FieldReport;
use crate::inductance::InductanceReport;
use crate::pitch::{PitchReport, Recommendation};
use crate::plan::PlanReport;
use crate::rewind::RewindReport;
use crate::survey::{SurveyReport, SurveyRow};
use crate::thrust::ThrustReport;
use crate::warnings::DesignWarning;

/// Version of the JSON format every object carries as `schema_version`: 3 is the third
/// round's (one name and type per fact, facts with their `message`, the caution apart).
pub const SCHEMA_VERSION: u32 = 3;

/// One JSON object on stdout.
pub struct Json;

impl Exporter for Json {
    /// Streamed: serde writes the object into `out` as it walks the report.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        let mut ser = serde_json::Serializer::with_formatter(&mut *out, Escaping::default());
        report.json().serialize(&mut ser)?;
        out.write_all(b"\n")
    }
}

/// A worded fact in the JSON: its typed fields (kind and numbers), then its sentence.
#[derive(Serialize, JsonSchema)]
#[schemars(rename = "Worded{T}")]
pub struct Worded<'a, T: Serialize + JsonSchema> {
    /// The fact.
    #[serde(flatten)]
    pub fact: &'a T,
    /// The fact in words, as the text report gives it.
    pub message: String,
}

impl<'a, T: Serialize + JsonSchema + Words> Worded<'a, T> {
    /// `fact` with its words.
    pub fn of(fact: &'a T) -> Self {
        Worded {
            fact,
            message: fact.message(),
        }
    }

    /// Every fact of `facts` with its words.
    pub fn all(facts: &'a [T]) -> Vec<Self> {
        facts.iter().map(Worded::of).collect()
    }
}

/// What every JSON object opens with: the format's version and the safety caution.
#[derive(Serialize, JsonSchema)]
pub struct Opening {
    /// Version of this JSON format ([`SCHEMA_VERSION`]).
    pub schema_version: u32,
    /// The safety caution (windings run at mains voltage).
    pub caution: &'static str,
}

impl Default for Opening {
    fn default() -> Self {
        Opening {
            schema_version: SCHEMA_VERSION,
            caution: crate::safety::CAUTION,
        }
    }
}

/// `plan --format json`.
#[derive(Serialize, JsonSchema)]
pub struct PlanJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a PlanReport,
    /// Designs a winder should not build (contract: a `warnings` array).
    warnings: Vec<Worded<'a, DesignWarning>>,
}

impl<'a> PlanJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a PlanReport) -> Self {
        PlanJson {
            opening: Opening::default(),
            report,
            warnings: Worded::all(&report.warnings),
        }
    }
}

/// `factors --format json`.
#[derive(Serialize, JsonSchema)]
pub struct FactorsJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a FactorTable,
}

impl<'a> FactorsJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a FactorTable) -> Self {
        FactorsJson {
            opening: Opening::default(),
            report,
        }
    }
}

/// `field --format json`.
#[derive(Serialize, JsonSchema)]
pub struct FieldJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a FieldReport,
    /// Designs a winder should not build (contract: a `warnings` array).
    warnings: Vec<Worded<'a, DesignWarning>>,
}

impl<'a> FieldJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a FieldReport) -> Self {
        FieldJson {
            opening: Opening::default(),
            report,
            warnings: Worded::all(&report.warnings),
        }
    }
}

/// `pitch --format json`.
#[derive(Serialize, JsonSchema)]
pub struct PitchJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a PitchReport,
    /// Why the recommended span, in words (a sentence, as before schema version 3).
    reason: String,
    /// The same as a typed fact: its kind and numbers, with its `message`.
    reason_detail: Worded<'a, Recommendation>,
    /// Designs a winder should not build (contract: a `warnings` array).
    warnings: Vec<Worded<'a, DesignWarning>>,
}

impl<'a> PitchJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a PitchReport) -> Self {
        PitchJson {
            opening: Opening::default(),
            report,
            reason: report.reason.message(),
            reason_detail: Worded::of(&report.reason),
            warnings: Worded::all(&report.warnings),
        }
    }
}

/// `survey --format json`: the rows streamed, each infeasible one with its reason in words.
#[derive(Serialize, JsonSchema)]
pub struct SurveyJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    /// Core kind surveyed.
    topology: crate::winding::Topology,
    /// Phases.
    #[serde(rename = "phase_count")]
    phases: usize,
    /// The combinations, in slot, pole, layer order.
    rows: SurveyRows<'a>,
}

impl<'a> SurveyJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a SurveyReport) -> Self {
        SurveyJson {
            opening: Opening::default(),
            topology: report.topology,
            phases: report.phases,
            rows: SurveyRows(&report.rows),
        }
    }
}

/// The survey's rows, worded one at a time as they are written.
pub struct SurveyRows<'a>(&'a [SurveyRow]);

/// One survey row in the JSON.
#[derive(Serialize, JsonSchema)]
pub struct SurveyRowJson<'a> {
    #[serde(flatten)]
    row: &'a SurveyRow,
    /// Why not, when infeasible (contract: a sentence; null for a feasible row, as before).
    reason: Option<String>,
}

impl Serialize for SurveyRows<'_> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_seq(self.0.iter().map(|row| SurveyRowJson {
            row,
            reason: row.reason.as_ref().map(Words::message),
        }))
    }
}

impl JsonSchema for SurveyRows<'_> {
    fn schema_name() -> std::borrow::Cow<'static, str> {
        "SurveyRows".into()
    }

    fn json_schema(generator: &mut schemars::SchemaGenerator) -> schemars::Schema {
        Vec::<SurveyRowJson<'static>>::json_schema(generator)
    }
}

/// `audit --format json`.
#[derive(Serialize, JsonSchema)]
pub struct AuditJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a AuditReport,
    /// Direction of travel of the field with the supply in order on the phase starts, in
    /// words.
    travel: String,
    /// The same as a typed fact, with its `message`.
    travel_detail: Worded<'a, Travel>,
    /// What is wrong (contract: `kind`, `coils`, `message`).
    findings: Vec<Worded<'a, Finding>>,
}

impl<'a> AuditJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a AuditReport) -> Self {
        AuditJson {
            opening: Opening::default(),
            report,
            travel: report.travel.message(),
            travel_detail: Worded::of(&report.travel),
            findings: Worded::all(&report.findings),
        }
    }
}

/// `rewind --format json`.
#[derive(Serialize, JsonSchema)]
pub struct RewindJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a RewindReport,
    /// What the rewind assumed, in words.
    assumptions: Vec<String>,
    /// The same as typed facts, each with its `message`.
    assumption_details: Vec<Worded<'a, Assumption>>,
    /// Designs a winder should not build (contract: a `warnings` array).
    warnings: Vec<Worded<'a, DesignWarning>>,
}

impl<'a> RewindJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a RewindReport) -> Self {
        RewindJson {
            opening: Opening::default(),
            report,
            assumptions: report.assumptions.iter().map(Words::message).collect(),
            assumption_details: Worded::all(&report.assumptions),
            warnings: Worded::all(&report.warnings),
        }
    }
}

/// `card --format json`.
#[derive(Serialize, JsonSchema)]
pub struct CardJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a DataCard,
    /// How the mean turn was found, in words.
    mean_turn_rule: String,
    /// The same as a typed fact, with its `message`.
    mean_turn_rule_detail: Worded<'a, crate::card::MeanTurnRule>,
    /// The lead scheme and its connection tables.
    leads: Option<LeadsJson<'a>>,
    /// What the shop should look at before winding.
    warnings: Vec<Worded<'a, crate::card::CardWarning>>,
    /// The figures a finished winding is checked against.
    acceptance: AcceptanceJson<'a>,
}

/// The card's acceptance figures, with whose procedures govern.
#[derive(Serialize, JsonSchema)]
pub struct AcceptanceJson<'a> {
    #[serde(flatten)]
    figures: &'a crate::card::Acceptance,
    /// Whose procedures govern.
    note: &'static str,
}

/// The card's lead scheme, with the direction of rotation in words.
#[derive(Serialize, JsonSchema)]
pub struct LeadsJson<'a> {
    #[serde(flatten)]
    scheme: &'a LeadScheme,
    /// Which way the field moves with L1-L2-L3 on the first three leads, in words.
    rotation: String,
    /// The same as a typed fact, with its `message`.
    rotation_detail: Worded<'a, Rotation>,
}

impl<'a> CardJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a DataCard) -> Self {
        CardJson {
            opening: Opening::default(),
            report,
            mean_turn_rule: report.mean_turn_rule.message(),
            mean_turn_rule_detail: Worded::of(&report.mean_turn_rule),
            leads: report.leads.as_ref().map(|scheme| LeadsJson {
                scheme,
                rotation: scheme.rotation.message(),
                rotation_detail: Worded::of(&scheme.rotation),
            }),
            warnings: Worded::all(&report.warnings),
            acceptance: AcceptanceJson {
                figures: &report.acceptance,
                note: crate::safety::ACCEPTANCE_NOTE,
            },
        }
    }
}

/// `thrust --format json`.
#[derive(Serialize, JsonSchema)]
pub struct ThrustJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a ThrustReport,
    /// What the model assumed, in words.
    assumptions: Vec<String>,
    /// The same as typed facts, each with its `message`.
    assumption_details: Vec<Worded<'a, Assumption>>,
}

impl<'a> ThrustJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a ThrustReport) -> Self {
        ThrustJson {
            opening: Opening::default(),
            report,
            assumptions: report.assumptions.iter().map(Words::message).collect(),
            assumption_details: Worded::all(&report.assumptions),
        }
    }
}

/// `plates --format json`.
#[derive(Serialize, JsonSchema)]
pub struct PlatesJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a crate::plates::PlatesReport,
    /// What a choice breaks, in words, each "choice N: ..." (N counting from 1 in the
    /// order of `choices`).
    warnings: Vec<String>,
}

impl<'a> PlatesJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a crate::plates::PlatesReport) -> Self {
        PlatesJson {
            opening: Opening::default(),
            report,
            warnings: super::thrust_report::plate_warnings(report),
        }
    }
}

/// `inductance --format json`.
#[derive(Serialize, JsonSchema)]
pub struct InductanceJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a InductanceReport,
    /// What the model assumed, in words.
    assumptions: Vec<String>,
    /// The same as typed facts, each with its `message`.
    assumption_details: Vec<Worded<'a, Assumption>>,
}

impl<'a> InductanceJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a InductanceReport) -> Self {
        InductanceJson {
            opening: Opening::default(),
            report,
            assumptions: report.assumptions.iter().map(Words::message).collect(),
            assumption_details: Worded::all(&report.assumptions),
        }
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

/// `loading --format json`.
#[derive(Serialize, JsonSchema)]
pub struct LoadingJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a crate::loading::LoadingReport,
    /// Every limit passed, each with its `message`.
    warnings: Vec<Worded<'a, crate::loading::LoadingWarning>>,
}

impl<'a> LoadingJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a crate::loading::LoadingReport) -> Self {
        LoadingJson {
            opening: Opening::default(),
            report,
            warnings: Worded::all(&report.loading.warnings),
        }
    }
}

/// `size --format json`.
#[derive(Serialize, JsonSchema)]
pub struct SizingJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a crate::sizing::Sizing,
    /// Every limit the chosen winding passes, each with its `message`.
    warnings: Vec<Worded<'a, crate::loading::LoadingWarning>>,
}

impl<'a> SizingJson<'a> {
    /// The JSON form of `report`.
    pub fn of(report: &'a crate::sizing::Sizing) -> Self {
        SizingJson {
            opening: Opening::default(),
            report,
            warnings: Worded::all(&report.loading.warnings),
        }
    }
}
