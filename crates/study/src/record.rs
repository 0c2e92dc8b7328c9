//! A winding as the shop's record book files it: the figures a record is found again by,
//! worked out once when it is added, and how near a filed record comes to what is asked for.
//! No storage here: the binary keeps the book (SQLite or PostgreSQL) and reads these types.

use crate::units::Length;
use serde::{Deserialize, Serialize};

use crate::card::DataCard;
use crate::header::DesignHeader;
use crate::loading::{self, Limits};
use crate::winding::{Topology, Winding};

/// Where in a motor's history an entry belongs.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Stage {
    /// A planned winding (a design, not yet wound).
    Design,
    /// The winding as it came in, counted from the old coils.
    AsFound,
    /// The winding as it went out, rewound.
    AsWound,
}

impl Stage {
    /// Every stage, in the order of a motor's history.
    pub const ALL: [Stage; 3] = [Stage::Design, Stage::AsFound, Stage::AsWound];

    /// The stage's name in the book and on the command line.
    pub fn name(self) -> &'static str {
        match self {
            Stage::Design => "design",
            Stage::AsFound => "as-found",
            Stage::AsWound => "as-wound",
        }
    }

    /// The stage named `s`, if it is one.
    pub fn parse(s: &str) -> Option<Stage> {
        Stage::ALL.into_iter().find(|t| t.name() == s)
    }
}

/// The figures one record is filed and found by, worked out from its layout when it is
/// added and kept with it (the book never works them out again, so a later version of the
/// tool cannot change what was filed). Lengths in mm, power in kW as the shop reads them.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, schemars::JsonSchema)]
pub struct Figures {
    /// Title of the layout.
    pub title: Option<String>,
    /// Closed core or flat primary.
    pub topology: Topology,
    /// Slots.
    pub slots: u32,
    /// Poles.
    pub poles: u32,
    /// Phases.
    pub phases: u32,
    /// Layers.
    pub layers: u32,
    /// Span in slot pitches (the header's `pitch`).
    pub pitch: u32,
    /// Turns per coil (the most common count).
    pub turns_per_coil: u32,
    /// Coils.
    pub coils: u32,
    /// Parallel paths per phase.
    pub parallel_paths: u32,
    /// "star" or "delta".
    pub connection: String,
    /// Fundamental winding factor k_w1.
    pub winding_factor: f64,
    /// Series turns per phase.
    pub series_turns_per_phase: f64,
    /// Bare strand diameter, mm.
    pub wire_mm: Option<f64>,
    /// Strands in hand.
    pub strands_in_hand: Option<u32>,
    /// AWG gauge, when the wire is one.
    pub awg: Option<i32>,
    /// Bore (closed core), mm.
    pub bore_mm: Option<f64>,
    /// Stack length, mm.
    pub stack_mm: Option<f64>,
    /// Phase resistance at 20 °C, ohms.
    pub phase_resistance_20c_ohm: Option<f64>,
    /// Line-to-line resistance at 20 °C, ohms.
    pub line_resistance_20c_ohm: Option<f64>,
    /// Conductor mass of the winding, kg.
    pub copper_mass_kg: Option<f64>,
    /// Peak gap flux density at no load, T (needs voltage, frequency and core).
    pub gap_t: Option<f64>,
    /// Peak tooth flux density, T.
    pub tooth_t: Option<f64>,
    /// Peak back-iron flux density, T.
    pub yoke_t: Option<f64>,
    /// Rated output, kW.
    pub power_kw: Option<f64>,
    /// Rated voltages, V (one, or two for a dual-voltage machine; the supply's line voltage
    /// when nothing is stamped).
    pub voltages_v: Vec<f64>,
    /// Rated current at the first voltage, A.
    pub current_a: Option<f64>,
    /// Rated frequency, Hz (nameplate, else supply).
    pub frequency_hz: Option<f64>,
    /// Rated speed, rpm.
    pub speed_rpm: Option<f64>,
    /// Frame as stamped.
    pub frame: Option<String>,
    /// Job number.
    pub job_number: Option<String>,
    /// Customer.
    pub customer: Option<String>,
    /// Technician.
    pub technician: Option<String>,
    /// Job date as written.
    pub job_date: Option<String>,
    /// The job's notes.
    pub notes: Option<String>,
}

/// The figures of `w`, from its header and card (each worked out once by its owner).
pub fn figures(w: &Winding, header: &DesignHeader, card: &DataCard) -> Figures {
    let d = &w.design;
    let plate = d.nameplate.as_ref();
    let job = d.job.as_ref();
    let magnetic = loading::magnetic(w, &Limits::default(), 1.0).ok();
    let (line, f) = loading::supply_of(d);
    // The book's row keeps sizes in the trade's millimetres, as stored and searched.
    let mm = |l: Option<Length>| l.map(Length::mm);
    let count = |n: usize| u32::try_from(n).unwrap_or(u32::MAX);
    Figures {
        title: header.title.clone(),
        topology: header.topology,
        slots: count(header.slots),
        poles: count(header.poles),
        phases: count(header.phases),
        layers: count(header.layers),
        pitch: count(header.pitch),
        turns_per_coil: header.turns_per_coil,
        coils: count(card.coils),
        parallel_paths: count(header.parallel_paths),
        connection: match header.connection {
            crate::winding::Connection::Star => "star".into(),
            crate::winding::Connection::Delta => "delta".into(),
        },
        winding_factor: header.winding_factor,
        series_turns_per_phase: card.series_turns_per_phase,
        wire_mm: mm(card.wire.as_ref().map(|x| x.diameter)),
        strands_in_hand: card.wire.as_ref().map(|x| x.strands_in_hand),
        awg: card.wire.as_ref().and_then(|x| x.awg),
        bore_mm: mm(d.core.bore),
        stack_mm: mm(d.core.stack),
        phase_resistance_20c_ohm: card.phase_resistance_20c_ohm,
        line_resistance_20c_ohm: card.line_resistance_20c_ohm,
        copper_mass_kg: card.copper_mass_kg,
        gap_t: magnetic.as_ref().map(|m| m.gap.peak_t),
        tooth_t: magnetic.as_ref().and_then(|m| m.tooth.map(|t| t.peak_t)),
        yoke_t: magnetic.as_ref().and_then(|m| m.yoke.map(|t| t.peak_t)),
        power_kw: plate.and_then(|p| p.power_w).map(crate::units::in_kilo),
        // The stamped voltages, else the supply's line voltage the winding is planned for.
        voltages_v: plate
            .map(|p| p.voltages_v.clone())
            .filter(|v| !v.is_empty())
            .unwrap_or_else(|| line.into_iter().collect()),
        current_a: plate.and_then(|p| p.currents_a.first().copied()),
        frequency_hz: f,
        speed_rpm: plate.and_then(|p| p.speed_rpm),
        frame: plate.and_then(|p| p.frame.clone()),
        job_number: job.and_then(|j| j.number.clone()),
        customer: job.and_then(|j| j.customer.clone()),
        technician: job.and_then(|j| j.technician.clone()),
        job_date: job.and_then(|j| j.date.clone()),
        notes: job.and_then(|j| j.notes.clone()),
    }
}

/// One entry of the book: a layout exactly as given, at one stage of one motor's history,
/// with what was worked out from it and who filed it when. Entries are never changed: a
/// correction is a new version that names the entry it supersedes.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, schemars::JsonSchema)]
pub struct Entry {
    /// The entry's own number in the book.
    pub id: i64,
    /// The record (the motor's file) it belongs to.
    pub record: i64,
    /// Where in the motor's history it belongs.
    pub stage: Stage,
    /// 1 for the first entry of its stage, one more for each correction.
    pub version: u32,
    /// The entry this one corrects.
    pub supersedes: Option<i64>,
    /// When it was filed, UTC (RFC 3339).
    pub added_at: String,
    /// Who filed it.
    pub added_by: String,
    /// Why it was filed or corrected (free text given when adding).
    pub remark: Option<String>,
    /// SHA-256 of the layout text, hex.
    pub content_hash: String,
    /// The layout file exactly as given.
    pub layout: String,
    /// The figures worked out from it when filed.
    pub figures: Figures,
    /// The readings at acceptance, as the layout's `[measured]` table gave them (JSON).
    pub readings: Option<serde_json::Value>,
}

/// A closed range of one figure; a single value is a range of width zero.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Span {
    /// Lowest value accepted.
    pub low: f64,
    /// Highest value accepted.
    pub high: f64,
}

impl Span {
    /// True when `x` lies in the range.
    pub fn holds(&self, x: f64) -> bool {
        x >= self.low && x <= self.high
    }

    /// How far `x` lies outside the range, over the nearer end (0 inside).
    pub fn relative_miss(&self, x: f64) -> f64 {
        let near = if x < self.low {
            self.low
        } else if x > self.high {
            self.high
        } else {
            return 0.0;
        };
        (x - near).abs() / near.abs().max(1e-9)
    }
}

/// A figure a search can ask for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum Key {
    /// Slots.
    Slots,
    /// Poles.
    Poles,
    /// Layers.
    Layers,
    /// Span (`pitch`).
    Pitch,
    /// Turns per coil.
    Turns,
    /// Bare wire diameter, mm.
    WireMm,
    /// Bore, mm.
    BoreMm,
    /// Stack, mm.
    StackMm,
    /// Rated power, kW.
    PowerKw,
    /// Rated voltage, V (either of a dual-voltage pair).
    VoltageV,
    /// Frequency, Hz.
    FrequencyHz,
}

impl Key {
    /// Every numeric key, in the order a table lists them.
    pub const ALL: [Key; 11] = [
        Key::Slots,
        Key::Poles,
        Key::Layers,
        Key::Pitch,
        Key::Turns,
        Key::WireMm,
        Key::BoreMm,
        Key::StackMm,
        Key::PowerKw,
        Key::VoltageV,
        Key::FrequencyHz,
    ];

    /// How much a miss on this figure counts against a record's likeness: the core
    /// (slots, bore, stack) most, since a shop looks first for the same iron; the winding
    /// and the rating less, since those are what a rewind may change. These weights and
    /// the 20 % scale of a miss are this tool's own convention, from no published source.
    pub fn weight(self) -> f64 {
        match self {
            Key::Slots | Key::BoreMm => 4.0,
            Key::StackMm => 3.0,
            Key::Poles | Key::PowerKw => 2.0,
            Key::Layers
            | Key::Pitch
            | Key::Turns
            | Key::WireMm
            | Key::VoltageV
            | Key::FrequencyHz => 1.0,
        }
    }

    /// Whether the figure is a count (a miss by one is already a different winding).
    pub fn is_count(self) -> bool {
        matches!(
            self,
            Key::Slots | Key::Poles | Key::Layers | Key::Pitch | Key::Turns
        )
    }

    /// The figure's values in `f` (two for a dual-voltage rating).
    pub fn values(self, f: &Keys) -> [Option<f64>; 2] {
        let one = |x: Option<f64>| [x, None];
        match self {
            Key::Slots => one(f.slots),
            Key::Poles => one(f.poles),
            Key::Layers => one(f.layers),
            Key::Pitch => one(f.pitch),
            Key::Turns => one(f.turns),
            Key::WireMm => one(f.wire_mm),
            Key::BoreMm => one(f.bore_mm),
            Key::StackMm => one(f.stack_mm),
            Key::PowerKw => one(f.power_kw),
            Key::VoltageV => f.voltages_v,
            Key::FrequencyHz => one(f.frequency_hz),
        }
    }
}

/// The searchable figures of one filed entry, as the book's columns hold them.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Keys {
    /// Slots.
    pub slots: Option<f64>,
    /// Poles.
    pub poles: Option<f64>,
    /// Layers.
    pub layers: Option<f64>,
    /// Span.
    pub pitch: Option<f64>,
    /// Turns per coil.
    pub turns: Option<f64>,
    /// Bare wire diameter, mm.
    pub wire_mm: Option<f64>,
    /// Bore, mm.
    pub bore_mm: Option<f64>,
    /// Stack, mm.
    pub stack_mm: Option<f64>,
    /// Rated power, kW.
    pub power_kw: Option<f64>,
    /// Rated voltages, V.
    pub voltages_v: [Option<f64>; 2],
    /// Frequency, Hz.
    pub frequency_hz: Option<f64>,
    /// Frame.
    pub frame: Option<String>,
    /// What the free text is looked for in ([`search_text`]).
    pub text: Option<String>,
}

/// What a free-text search looks in: the title, the notes, the job number, the customer
/// and the technician, lowered, one per line.
pub fn search_text(f: &Figures) -> String {
    [
        &f.title,
        &f.notes,
        &f.job_number,
        &f.customer,
        &f.technician,
    ]
    .into_iter()
    .map(|t| t.as_deref().unwrap_or_default().to_lowercase())
    .collect::<Vec<_>>()
    .join("\n")
}

impl Keys {
    /// The searchable figures of `f`.
    pub fn of(f: &Figures) -> Keys {
        Keys {
            slots: Some(f.slots.into()),
            poles: Some(f.poles.into()),
            layers: Some(f.layers.into()),
            pitch: Some(f.pitch.into()),
            turns: Some(f.turns_per_coil.into()),
            wire_mm: f.wire_mm,
            bore_mm: f.bore_mm,
            stack_mm: f.stack_mm,
            power_kw: f.power_kw,
            voltages_v: [f.voltages_v.first().copied(), f.voltages_v.get(1).copied()],
            frequency_hz: f.frequency_hz,
            frame: f.frame.clone(),
            text: Some(search_text(f)),
        }
    }
}

/// What a search asks for: ranges of figures, a frame, and words of free text.
#[derive(Debug, Clone, Default, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Criteria {
    /// Ranges asked for, one per key.
    pub ranges: Vec<(Key, Span)>,
    /// Frame, compared without case or spaces.
    pub frame: Option<String>,
    /// Words that must all appear in the title, notes, job number, customer or technician
    /// (without case).
    pub text: Vec<String>,
}

impl Criteria {
    /// True when nothing is asked for (every record matches).
    pub fn is_empty(&self) -> bool {
        self.ranges.is_empty() && self.frame.is_none() && self.text.is_empty()
    }
}

/// A frame designation as compared: without case, spaces or dashes ("132 M" = "132m").
pub fn frame_key(s: &str) -> String {
    s.chars()
        .filter(|c| !c.is_whitespace() && *c != '-')
        .flat_map(char::to_lowercase)
        .collect()
}

/// One figure where a record differs from what was asked.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Difference {
    /// The figure.
    pub key: String,
    /// What was asked, as written ("400", "120..130").
    pub asked: String,
    /// What the record has ("230", "unknown").
    pub found: String,
}

/// How near a record comes to what was asked.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Likeness {
    /// 1 for a record that matches every criterion, falling to 0 as misses add up
    /// (each weighted by [`Key::weight`]).
    pub score: f64,
    /// The figures that differ.
    pub differs: Vec<Difference>,
}

fn show_range(s: &Span) -> String {
    let n = crate::numbering::short;
    if s.low == s.high {
        n(s.low)
    } else {
        format!("{}..{}", n(s.low), n(s.high))
    }
}

/// One criterion as a record meets it: which, its weight, and the share of the weight it
/// costs (0 when met).
enum Miss<'c> {
    /// A figure's range.
    Range(Key, &'c Span),
    /// The frame.
    Frame(&'c str),
    /// A word of the free text.
    Text(&'c str),
}

/// Walk the criteria of `c` against `k`, calling `each` with every criterion, its weight
/// and its cost share: the one rule of likeness, read by [`score`] (no allocation, for
/// scanning a whole book) and by [`likeness`] (with the differences in words).
///
/// Each criterion missed costs its weight times a share in 0..1: a count missed by any
/// amount at least half (0.5 + 0.5·min(1, miss/20 %)); a measure its relative miss over
/// 20 %, capped at 1; an unknown figure, a different frame or a word not found all of it.
fn walk<'c>(c: &'c Criteria, k: &Keys, each: &mut dyn FnMut(Miss<'c>, f64, f64)) {
    for (key, span) in &c.ranges {
        let mut best = f64::INFINITY;
        let mut known = false;
        for x in key.values(k).into_iter().flatten() {
            known = true;
            best = best.min(span.relative_miss(x));
        }
        let share = if !known {
            1.0
        } else if best <= 0.0 {
            0.0
        } else if key.is_count() {
            0.5 + 0.5 * (best / 0.2).min(1.0)
        } else {
            (best / 0.2).min(1.0)
        };
        each(Miss::Range(*key, span), key.weight(), share);
    }
    if let Some(frame) = &c.frame {
        let same = k
            .frame
            .as_deref()
            .is_some_and(|f| frame_key(f) == frame_key(frame));
        each(
            Miss::Frame(frame),
            FRAME_WEIGHT,
            if same { 0.0 } else { 1.0 },
        );
    }
    for word in &c.text {
        let found = text_holds(k, word);
        each(Miss::Text(word), TEXT_WEIGHT, if found { 0.0 } else { 1.0 });
    }
}

/// Weight of the frame in a likeness: as much as the stack (the frame fixes the core's
/// outside, not its bore or length).
const FRAME_WEIGHT: f64 = 3.0;
/// Weight of each word of the free text.
const TEXT_WEIGHT: f64 = 1.0;

/// The likeness score of `k` against `c` alone (see [`likeness`]), without allocating.
pub fn score(c: &Criteria, k: &Keys) -> f64 {
    let (mut cost, mut total) = (0.0, 0.0);
    walk(c, k, &mut |_, w, share| {
        total += w;
        cost += w * share;
    });
    if total > 0.0 { 1.0 - cost / total } else { 1.0 }
}

/// How near `k` comes to `c`: the score (one less the weighted cost of the criteria
/// missed over the weights asked for; see [`walk`] for the costs) and every criterion
/// missed, with what was asked and what the record has.
pub fn likeness(c: &Criteria, k: &Keys) -> Likeness {
    let n = crate::numbering::short;
    let mut differs = Vec::new();
    walk(c, k, &mut |m, _, share| {
        if share <= 0.0 {
            return;
        }
        differs.push(match m {
            Miss::Range(key, span) => {
                let values: Vec<String> = key.values(k).into_iter().flatten().map(n).collect();
                Difference {
                    key: key_name(key).into(),
                    asked: show_range(span),
                    found: if values.is_empty() {
                        "unknown".into()
                    } else {
                        values.join("/")
                    },
                }
            }
            Miss::Frame(f) => Difference {
                key: "frame".into(),
                asked: f.to_string(),
                found: k.frame.clone().unwrap_or_else(|| "unknown".into()),
            },
            Miss::Text(w) => Difference {
                key: "text".into(),
                asked: w.to_string(),
                found: "not in title, notes, job, customer or technician".into(),
            },
        });
    });
    Likeness {
        score: score(c, k),
        differs,
    }
}

/// True when `word` appears, without regard to case, in the text `k` is searched by.
pub fn text_holds(k: &Keys, word: &str) -> bool {
    k.text
        .as_deref()
        .is_some_and(|t| t.contains(&word.to_lowercase()))
}

/// The command line's and the JSON's name of a key.
pub fn key_name(k: Key) -> &'static str {
    match k {
        Key::Slots => "slots",
        Key::Poles => "poles",
        Key::Layers => "layers",
        Key::Pitch => "pitch",
        Key::Turns => "turns",
        Key::WireMm => "wire_mm",
        Key::BoreMm => "bore_mm",
        Key::StackMm => "stack_mm",
        Key::PowerKw => "power_kw",
        Key::VoltageV => "voltage_v",
        Key::FrequencyHz => "frequency_hz",
    }
}

/// One current entry found (each stage's latest version, so a record with a design, an
/// as-found and an as-wound entry can come up to three times): its figures and how near
/// it came.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Hit {
    /// The entry's number.
    pub entry: i64,
    /// The record's number.
    pub record: i64,
    /// Its stage.
    pub stage: Stage,
    /// Its version.
    pub version: u32,
    /// When it was filed.
    pub added_at: String,
    /// Its figures.
    pub figures: Figures,
    /// How near it came (score 1 and no differences for an exact match).
    pub likeness: Likeness,
}

/// What a search found.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Found {
    /// What was asked.
    pub criteria: Criteria,
    /// True when the hits match every criterion; false when none did and the hits are the
    /// most similar records instead.
    pub exact: bool,
    /// Current entries in the book (each stage's latest version of each record).
    pub searched: u64,
    /// The hits, best first.
    pub hits: Vec<Hit>,
}

/// One record's whole history: every entry, oldest first.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct History {
    /// The record's number.
    pub record: i64,
    /// Every entry, oldest first (corrections included; an entry superseded by a later
    /// one is kept).
    pub entries: Vec<Entry>,
}

impl History {
    /// The latest version of each stage, in the order of a motor's history.
    pub fn current(&self) -> Vec<&Entry> {
        Stage::ALL
            .into_iter()
            .filter_map(|s| {
                self.entries
                    .iter()
                    .filter(|e| e.stage == s)
                    .max_by_key(|e| e.version)
            })
            .collect()
    }
}

/// The entry whose card `show` presents: the latest as-wound, else as-found, else design.
pub fn headline(h: &History) -> Option<&Entry> {
    h.current().into_iter().last()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn keys() -> Keys {
        Keys {
            slots: Some(36.0),
            poles: Some(4.0),
            bore_mm: Some(125.0),
            voltages_v: [Some(230.0), Some(400.0)],
            frame: Some("132 M".into()),
            text: Some("pump motor".into()),
            ..Keys::default()
        }
    }

    #[test]
    fn an_exact_match_scores_one_and_differs_in_nothing() {
        let c = Criteria {
            ranges: vec![
                (
                    Key::Slots,
                    Span {
                        low: 36.0,
                        high: 36.0,
                    },
                ),
                (
                    Key::BoreMm,
                    Span {
                        low: 120.0,
                        high: 130.0,
                    },
                ),
                (
                    Key::VoltageV,
                    Span {
                        low: 400.0,
                        high: 400.0,
                    },
                ),
            ],
            frame: Some("132m".into()),
            text: vec!["PUMP".into()],
        };
        let l = likeness(&c, &keys());
        assert_eq!(l.score, 1.0);
        assert!(l.differs.is_empty());
    }

    #[test]
    fn another_voltage_on_the_same_core_ranks_above_another_core() {
        let same_core = Criteria {
            ranges: vec![
                (
                    Key::Slots,
                    Span {
                        low: 36.0,
                        high: 36.0,
                    },
                ),
                (
                    Key::BoreMm,
                    Span {
                        low: 125.0,
                        high: 125.0,
                    },
                ),
                (
                    Key::VoltageV,
                    Span {
                        low: 460.0,
                        high: 460.0,
                    },
                ),
            ],
            ..Criteria::default()
        };
        let l = likeness(&same_core, &keys());
        assert_eq!(l.differs.len(), 1);
        assert_eq!(l.differs[0].key, "voltage_v");
        assert_eq!(l.differs[0].found, "230/400");
        let other_core = Criteria {
            ranges: vec![
                (
                    Key::Slots,
                    Span {
                        low: 48.0,
                        high: 48.0,
                    },
                ),
                (
                    Key::BoreMm,
                    Span {
                        low: 125.0,
                        high: 125.0,
                    },
                ),
                (
                    Key::VoltageV,
                    Span {
                        low: 400.0,
                        high: 400.0,
                    },
                ),
            ],
            ..Criteria::default()
        };
        assert!(l.score > likeness(&other_core, &keys()).score);
    }
}
