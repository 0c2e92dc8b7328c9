//! How the record book's answers read: a search's hits, and one record's history with the
//! card of its latest entry.

use beltwright_study::card::DataCard;
use beltwright_study::record::{Entry, Found, History, Hit, key_name};
use schemars::JsonSchema;
use serde::Serialize;

use super::json::Opening;
use super::reports::paragraph;
use super::{Align, Report, Section, Table};
use crate::numbering::short;

/// Four significant figures without trailing zeros: 140, 95, 0.7229.
fn fig(v: f64) -> String {
    let s = crate::numbering::sig(v, 4);
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

fn opt(x: Option<f64>) -> String {
    x.map_or(String::new(), fig)
}

/// A title cut to 40 characters for the table (the JSON keeps it whole).
fn cut(t: &str) -> String {
    if t.chars().count() <= 40 {
        t.to_string()
    } else {
        let mut s: String = t.chars().take(39).collect();
        s.push('…');
        s
    }
}

fn volts(v: &[f64]) -> String {
    v.iter().map(|x| fig(*x)).collect::<Vec<_>>().join("/")
}

/// What the search asked for, in the command line's own terms.
fn asked(f: &Found) -> String {
    let c = &f.criteria;
    let mut parts: Vec<String> = c
        .ranges
        .iter()
        .map(|(k, s)| {
            if s.low == s.high {
                format!("{} {}", key_name(*k), short(s.low))
            } else {
                format!("{} {}..{}", key_name(*k), short(s.low), short(s.high))
            }
        })
        .collect();
    if let Some(fr) = &c.frame {
        parts.push(format!("frame {fr}"));
    }
    for w in &c.text {
        parts.push(format!("text \"{w}\""));
    }
    if parts.is_empty() {
        "everything".into()
    } else {
        parts.join(", ")
    }
}

fn differs(h: &Hit) -> String {
    if h.likeness.differs.is_empty() {
        return "matches".into();
    }
    h.likeness
        .differs
        .iter()
        .map(|d| format!("{} {} (asked {})", d.key, d.found, d.asked))
        .collect::<Vec<_>>()
        .join("; ")
}

/// `book find --format json`.
#[derive(Serialize, JsonSchema)]
pub struct FoundJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    found: &'a Found,
}

impl Report for Found {
    fn json(&self) -> impl Serialize + '_ {
        FoundJson {
            opening: Opening::default(),
            found: self,
        }
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = vec![Section::Heading("Record book: search".into())];
        let head = if self.hits.is_empty() {
            format!(
                "asked for {}: nothing in the book ({} current entries)",
                asked(self),
                self.searched
            )
        } else if self.exact {
            format!(
                "asked for {}: {} matching, newest first ({} current entries searched)",
                asked(self),
                self.hits.len(),
                self.searched
            )
        } else {
            format!(
                "asked for {}: no record matches every figure; the {} most similar, most \
                 similar first ({} current entries searched). The core (slots, bore, stack) \
                 weighs most, then poles and power, then the winding and the rest",
                asked(self),
                self.hits.len(),
                self.searched
            )
        };
        s.push(Section::Lines(vec![paragraph(&head)]));
        if !self.hits.is_empty() {
            // The terminal's table cuts long titles; the CSV and JSON keep them whole.
            let mut t = self.main_table();
            for row in &mut t.rows {
                row[3] = cut(&row[3]);
            }
            s.push(Section::Table(t));
        }
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("record", Align::Right),
            ("stage", Align::Left),
            ("v", Align::Right),
            ("title", Align::Left),
            ("slots", Align::Right),
            ("poles", Align::Right),
            ("layers", Align::Right),
            ("span", Align::Right),
            ("turns", Align::Right),
            ("wire mm", Align::Right),
            ("bore mm", Align::Right),
            ("stack mm", Align::Right),
            ("kW", Align::Right),
            ("V", Align::Right),
            ("Hz", Align::Right),
            ("frame", Align::Left),
            ("likeness", Align::Right),
            ("differs", Align::Left),
        ]);
        for h in &self.hits {
            let f = &h.figures;
            t.push(vec![
                h.record.to_string(),
                h.stage.name().into(),
                h.version.to_string(),
                f.title.clone().unwrap_or_default(),
                f.slots.to_string(),
                f.poles.to_string(),
                f.layers.to_string(),
                f.pitch.to_string(),
                f.turns_per_coil.to_string(),
                opt(f.wire_mm),
                opt(f.bore_mm),
                opt(f.stack_mm),
                opt(f.power_kw),
                volts(&f.voltages_v),
                opt(f.frequency_hz),
                f.frame.clone().unwrap_or_default(),
                format!("{:.2}", h.likeness.score),
                differs(h),
            ]);
        }
        t
    }
}

/// One record as `book show` presents it: its history and the card of its latest entry.
pub struct RecordView<'a> {
    /// Every entry of the record.
    pub history: &'a History,
    /// The card of the latest entry (as-wound, else as-found, else design), worked out
    /// from its stored layout.
    pub card: Option<&'a DataCard>,
}

/// `book show --format json`.
#[derive(Serialize, JsonSchema)]
pub struct RecordJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    /// The record's number.
    record: i64,
    /// Every entry, oldest first, without the layout text (`book export` gives that).
    entries: Vec<EntryJson<'a>>,
    /// The card of the latest entry, as `card --format json` gives it.
    card: Option<serde_json::Value>,
}

/// One entry without its layout text.
#[derive(Serialize, JsonSchema)]
pub struct EntryJson<'a> {
    /// The entry's number.
    id: i64,
    /// design, as-found or as-wound.
    stage: &'static str,
    /// 1, then one more per correction.
    version: u32,
    /// The entry this one corrects.
    supersedes: Option<i64>,
    /// When it was filed, UTC (RFC 3339).
    added_at: &'a str,
    /// Who filed it.
    added_by: &'a str,
    /// Why it was filed or corrected.
    remark: Option<&'a str>,
    /// SHA-256 of the layout text, hex.
    content_hash: &'a str,
    /// The figures worked out when it was filed.
    figures: &'a beltwright_study::record::Figures,
    /// The readings at acceptance (the layout's `[measured]` table).
    readings: Option<&'a serde_json::Value>,
}

fn entry_json(e: &Entry) -> EntryJson<'_> {
    EntryJson {
        id: e.id,
        stage: e.stage.name(),
        version: e.version,
        supersedes: e.supersedes,
        added_at: &e.added_at,
        added_by: &e.added_by,
        remark: e.remark.as_deref(),
        content_hash: &e.content_hash,
        figures: &e.figures,
        readings: e.readings.as_ref(),
    }
}

/// The readings at acceptance in words, from the layout's `[measured]` table.
fn readings_words(r: &serde_json::Value) -> String {
    let list = |key: &str| -> Option<String> {
        r.get(key)?.as_array().map(|a| {
            a.iter()
                .filter_map(serde_json::Value::as_f64)
                .map(|x| crate::numbering::sig(x, 4))
                .collect::<Vec<_>>()
                .join(", ")
        })
    };
    let mut parts = Vec::new();
    if let Some(l) = list("line_resistance_ohm") {
        parts.push(format!("line resistances {l} Ω"));
    }
    if let Some(l) = list("section_resistance_ohm") {
        parts.push(format!("section resistances {l} Ω"));
    }
    if let Some(t) = r.get("temperature_c").and_then(serde_json::Value::as_f64) {
        parts.push(format!("at {} °C", short(t)));
    }
    parts.join(" ")
}

impl Report for RecordView<'_> {
    fn json(&self) -> impl Serialize + '_ {
        RecordJson {
            opening: Opening::default(),
            record: self.history.record,
            entries: self.history.entries.iter().map(entry_json).collect(),
            card: self.card.and_then(|c| serde_json::to_value(c.json()).ok()),
        }
    }

    fn sections(&self) -> Vec<Section> {
        let h = self.history;
        let mut s = vec![Section::Heading(format!("Record {}", h.record))];
        if let Some(e) = beltwright_study::record::headline(h) {
            let f = &e.figures;
            let mut lines = Vec::new();
            if let Some(t) = &f.title {
                lines.push(paragraph(t));
            }
            let mut rating = Vec::new();
            if let Some(p) = f.power_kw {
                rating.push(format!("{} kW", short(p)));
            }
            if !f.voltages_v.is_empty() {
                rating.push(format!("{} V", volts(&f.voltages_v)));
            }
            if let Some(hz) = f.frequency_hz {
                rating.push(format!("{} Hz", short(hz)));
            }
            if let Some(fr) = &f.frame {
                rating.push(format!("frame {fr}"));
            }
            if !rating.is_empty() {
                lines.push(rating.join(", "));
            }
            let job: Vec<String> = [
                f.job_number.as_ref().map(|j| format!("job {j}")),
                f.customer.as_ref().map(|c| format!("customer {c}")),
                f.job_date.as_ref().map(|d| format!("dated {d}")),
            ]
            .into_iter()
            .flatten()
            .collect();
            if !job.is_empty() {
                lines.push(job.join(", "));
            }
            if let Some(n) = &f.notes {
                lines.push(paragraph(&format!("notes: {n}")));
            }
            s.push(Section::Lines(lines));
        }
        s.push(Section::Heading("History".into()));
        s.push(Section::Table(self.main_table()));
        let readings: Vec<String> = h
            .entries
            .iter()
            .filter_map(|e| {
                e.readings.as_ref().map(|r| {
                    paragraph(&format!(
                        "{} v{} readings: {}",
                        e.stage.name(),
                        e.version,
                        readings_words(r)
                    ))
                })
            })
            .collect();
        if !readings.is_empty() {
            s.push(Section::Heading("Readings".into()));
            s.push(Section::Lines(readings));
        }
        if let Some(c) = self.card {
            s.extend(c.sections());
        } else {
            s.push(super::caution());
        }
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("entry", Align::Right),
            ("stage", Align::Left),
            ("v", Align::Right),
            ("corrects", Align::Right),
            ("filed (UTC)", Align::Left),
            ("by", Align::Left),
            ("slots", Align::Right),
            ("poles", Align::Right),
            ("turns", Align::Right),
            ("wire mm", Align::Right),
            ("k_w1", Align::Right),
            ("R20 phase Ω", Align::Right),
            ("hash", Align::Left),
            ("remark", Align::Left),
        ]);
        for e in &self.history.entries {
            let f = &e.figures;
            t.push(vec![
                e.id.to_string(),
                e.stage.name().into(),
                e.version.to_string(),
                e.supersedes.map_or(String::new(), |x| x.to_string()),
                e.added_at.clone(),
                e.added_by.clone(),
                f.slots.to_string(),
                f.poles.to_string(),
                f.turns_per_coil.to_string(),
                opt(f.wire_mm),
                format!("{:.4}", f.winding_factor),
                f.phase_resistance_20c_ohm
                    .map_or(String::new(), |r| crate::numbering::sig(r, 4)),
                e.content_hash.chars().take(12).collect(),
                e.remark.clone().unwrap_or_default(),
            ]);
        }
        t
    }
}
