//! How a single-phase stator's study reads: the plan, factors, field, card and audit views
//! of the one [`SinglePhaseReport`].

use schemars::JsonSchema;
use serde::Serialize;

use super::json::{Opening, Worded};
use super::reports::paragraph;
use super::{Align, Report, Section, Table, caution, num};
use crate::design::CapacitorDuty;
use crate::single_phase::{
    Board, CapacitorMissing, CapacitorStudy, Feed, Finding, Part, SinglePhaseReport,
};
use crate::winding::Winding;

/// The views a single-phase stator's sheets set as pages, with their sheet names: the
/// `draw` command and the HTML page both draw these.
pub const SHEET_VIEWS: [(&str, View); 4] = [
    ("single-phase plan", View::Plan),
    ("single-phase card", View::Card),
    ("single-phase factors", View::Factors),
    ("single-phase field", View::Field),
];

/// Which command's view of the study.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum View {
    /// `plan`: the coils, both windings and the capacitor.
    Plan,
    /// `factors`: each winding's factors.
    Factors,
    /// `field`: forward and backward waves.
    Field,
    /// `card`: wire, resistances, copper, leads, capacitor.
    Card,
    /// `audit`: the findings.
    Audit,
}

/// A view of a single-phase study, with the winding for the coil list.
pub struct SinglePhaseView<'a> {
    /// The study.
    pub report: &'a SinglePhaseReport,
    /// The winding (coils, title).
    pub winding: &'a Winding,
    /// Which view.
    pub view: View,
}

/// One coil in the JSON, slots from 1.
#[derive(Serialize, JsonSchema)]
pub struct CoilJson {
    /// Winding label.
    pub phase: String,
    /// Slot where current enters.
    pub go: usize,
    /// Slot where it leaves.
    pub back: usize,
    /// Turns.
    pub turns: u32,
}

/// The JSON of every single-phase view: the whole study, with the plan contract's
/// `coils` and `winding_factor` (the main's), the factors contract's `rows` (the main's;
/// `aux_rows` the auxiliary's) or the field contract's `rows` (the spectrum).
#[derive(Serialize, JsonSchema)]
pub struct SinglePhaseJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    /// "single-phase".
    kind: &'static str,
    /// Title of the layout.
    title: Option<String>,
    /// Coils (plan view).
    #[serde(skip_serializing_if = "Option::is_none")]
    coils: Option<Vec<CoilJson>>,
    /// The main winding's k_w1.
    winding_factor: f64,
    /// Rows of the view: factors of the main (factors), waves (field).
    #[serde(skip_serializing_if = "Option::is_none")]
    rows: Option<serde_json::Value>,
    /// The auxiliary's factors (factors view).
    #[serde(skip_serializing_if = "Option::is_none")]
    aux_rows: Option<serde_json::Value>,
    /// True when the audit found nothing (audit view).
    #[serde(skip_serializing_if = "Option::is_none")]
    sound: Option<bool>,
    /// Findings in words (audit view).
    findings: Vec<Worded<'a, Finding>>,
    /// Why no capacitor could be worked out, in words.
    #[serde(skip_serializing_if = "Option::is_none")]
    capacitor_missing_message: Option<String>,
    /// The whole study.
    single_phase: &'a SinglePhaseReport,
}

/// A finding in words.
pub fn finding_words(f: &Finding) -> String {
    match f {
        Finding::CoilReversed {
            coil,
            winding,
            go,
            back,
        } => format!(
            "coil {coil} of the {winding} winding (in at slot {go}, out at slot {back}) is \
             reversed: its EMF opposes the rest of the winding; exchange its ends so that \
             current enters at slot {back}"
        ),
        Finding::NotInQuadrature { angle_deg } => format!(
            "the auxiliary's axis is {} electrical degrees from the main's, not 90: a group \
             is in the wrong slots or the groups are not evenly spaced",
            num(*angle_deg, 1)
        ),
        Finding::Resistance {
            winding,
            measured_ohm,
            expected_ohm,
            deviation_percent,
        } => format!(
            "the {winding} winding reads {} ohm where {} ohm is expected at the reading's \
             temperature ({}{} %): {}",
            num(*measured_ohm, 4),
            num(*expected_ohm, 4),
            if *deviation_percent > 0.0 { "+" } else { "" },
            num(*deviation_percent, 1),
            if *deviation_percent < 0.0 {
                "shorted turns or a shorted capacitor lead suspected; test turn to turn"
            } else {
                "a high joint, a broken strand or the wrong wire suspected"
            }
        ),
        Finding::SectionsOppose => "the main winding's two sections oppose each other: one \
                                    section's leads are exchanged (check U5/U6 or T3/T4)"
            .to_string(),
    }
}

/// Why no capacitor, in words naming the layout key.
pub fn missing_words(m: CapacitorMissing) -> &'static str {
    match m {
        CapacitorMissing::Circuit => {
            "no capacitor is worked out: give the motor's [circuit] (magnetizing_reactance_ohm, \
             rotor_resistance_ohm, rotor_reactance_ohm, main_leakage_reactance_ohm, referred \
             to the main winding)"
        }
        CapacitorMissing::Supply => {
            "no capacitor is worked out: give supply.line_voltage_v and supply.frequency_hz"
        }
        CapacitorMissing::Resistance => {
            "no capacitor is worked out: give [wire] with core.bore_mm and core.stack_mm (or \
             main.resistance_ohm and aux.resistance_ohm)"
        }
        CapacitorMissing::Slip => {
            "no capacitor is worked out: give capacitor.slip or nameplate.speed_rpm"
        }
        CapacitorMissing::NameplateSpeed => {
            "no capacitor is worked out: nameplate.speed_rpm is not a running speed of this \
             core (at or above synchronous speed for machine.poles at the supply's \
             frequency, or below half of it); check the speed and the poles, or give \
             capacitor.slip"
        }
    }
}

fn duty_words(d: CapacitorDuty) -> &'static str {
    match d {
        CapacitorDuty::Run => "permanent run capacitor",
        CapacitorDuty::Start => "start capacitor, cut out near speed",
        CapacitorDuty::StartAndRun => "start and run capacitors",
        CapacitorDuty::None => "no capacitor (resistance split-phase start)",
    }
}

fn ohm(r: Option<f64>) -> String {
    r.map_or("-".into(), |r| num(r, 4))
}

fn parts_table(r: &SinglePhaseReport) -> Table {
    let mut t = Table::new(&[
        ("winding", Align::Left),
        ("coils", Align::Right),
        ("spans", Align::Left),
        ("turns/coil", Align::Left),
        ("series", Align::Right),
        ("k_w1", Align::Right),
        ("N·k_w1", Align::Right),
        ("R20 ohm", Align::Right),
    ]);
    for p in [&r.main, &r.aux] {
        let list = |v: &[String]| v.join(", ");
        t.push(vec![
            p.label.clone(),
            p.coils_per_group.to_string(),
            list(&p.spans.iter().map(|x| x.to_string()).collect::<Vec<_>>()),
            list(&p.turns.iter().map(|x| x.to_string()).collect::<Vec<_>>()),
            p.series_turns.to_string(),
            num(p.winding_factor, 4),
            num(p.effective_turns, 1),
            ohm(p.resistance_20c_ohm),
        ]);
    }
    t
}

fn factors_table(r: &SinglePhaseReport) -> Table {
    let mut t = Table::new(&[
        ("order", Align::Right),
        ("k_w main", Align::Right),
        ("k_w aux", Align::Right),
    ]);
    for (m, a) in r.main.factors.iter().zip(&r.aux.factors) {
        t.push(vec![
            m.order.to_string(),
            num(m.winding, 4),
            num(a.winding, 4),
        ]);
    }
    t
}

fn waves_table(r: &SinglePhaseReport) -> Table {
    let mut t = Table::new(&[
        ("order", Align::Right),
        ("forward %", Align::Right),
        ("backward %", Align::Right),
    ]);
    for w in &r.spectrum {
        t.push(vec![
            w.order.to_string(),
            num(100.0 * w.forward, 2),
            num(100.0 * w.backward, 2),
        ]);
    }
    t
}

fn way(rising: bool) -> &'static str {
    if rising { "rising" } else { "falling" }
}

/// One lead table in a sentence, as the connection sheet writes it.
pub fn board_sentence(b: &Board) -> String {
    let supply = match b.voltage.as_str() {
        "low" => "Lower voltage",
        "high" => "Higher voltage",
        _ => "Supply",
    };
    let joined = if b.joined.is_empty() {
        String::new()
    } else {
        format!("; join {} and insulate", b.joined.join(" + "))
    };
    format!(
        "{supply}, field toward {} slots: L1 to {}; N to {}{joined}.",
        way(b.towards_rising_slots),
        line_words(b, &b.l1),
        line_words(b, &b.l2)
    )
}

/// The leads on one line in words, the capacitor's named apart: "U2, and through the
/// capacitor to Z2".
fn line_words(b: &Board, leads: &[String]) -> String {
    let (through, direct): (Vec<&String>, Vec<&String>) = leads
        .iter()
        .partition(|l| b.through_capacitor.as_ref() == Some(*l));
    let direct = direct
        .iter()
        .map(|l| l.as_str())
        .collect::<Vec<_>>()
        .join(" + ");
    match through.first() {
        Some(c) if direct.is_empty() => format!("{c} through the capacitor"),
        Some(c) => format!("{direct}, and through the capacitor to {c}"),
        None => direct,
    }
}

/// What the capacitor asks of whoever touches the leads (common practice).
pub const CAPACITOR_CAUTION: &str = "The capacitor keeps its charge after the supply is \
    off: discharge it through a resistor before touching the leads, and disconnect it, with \
    the winding's leads joined, for the insulation tests.";

/// The leads on one line, the one that goes through the capacitor marked so.
fn leads_on(b: &Board, leads: &[String], marked: &str) -> String {
    leads
        .iter()
        .map(|l| match &b.through_capacitor {
            Some(c) if c == l => format!("{l} {marked}"),
            _ => l.clone(),
        })
        .collect::<Vec<_>>()
        .join(" + ")
}

/// The lead tables, with what "via C" means when a lead goes through the capacitor.
pub fn boards_sections(boards: &[Board]) -> Vec<Section> {
    let mut s = vec![Section::Table(boards_table(boards))];
    if boards.iter().any(|b| b.through_capacitor.is_some()) {
        s.push(Section::Lines(vec![paragraph(
            "via C: through the capacitor, in series with the auxiliary winding (a start \
             capacitor through its switch too)",
        )]));
    }
    s
}

/// The lead tables.
pub fn boards_table(boards: &[Board]) -> Table {
    let mut t = Table::new(&[
        ("supply", Align::Left),
        ("field toward", Align::Left),
        ("L1", Align::Left),
        ("L2 (N)", Align::Left),
        ("join together", Align::Left),
    ]);
    for b in boards {
        t.push(vec![
            b.voltage.clone(),
            format!("{} slots", way(b.towards_rising_slots)),
            leads_on(b, &b.l1, "via C"),
            leads_on(b, &b.l2, "via C"),
            if b.joined.is_empty() {
                "-".into()
            } else {
                b.joined.join(" + ")
            },
        ]);
    }
    t
}

fn capacitor_sections(c: &CapacitorStudy) -> Vec<Section> {
    let mut s = vec![Section::Heading("Capacitor".into())];
    let mut lines = vec![paragraph(&format!(
        "{}; by the double revolving field with the [circuit] given (main {} ohm, auxiliary \
         {} ohm at the winding temperature); core loss and friction left out",
        duty_words(c.duty),
        num(c.resistances_ohm[0], 3),
        num(c.resistances_ohm[1], 3)
    ))];
    if let Some(run) = &c.run {
        lines.push(paragraph(&format!(
            "run capacitor {} µF (the least backward field at slip {}): backward field {} % \
             of the forward, capacitor at {} V; choose the next standard value with a rated \
             voltage above it",
            num(run.microfarads, 3),
            num(c.run_slip, 3),
            num(run.at.backward_percent, 2),
            num(run.at.capacitor_v, 1)
        )));
    }
    if let Some(st) = &c.start {
        lines.push(paragraph(&format!(
            "start capacitor {} µF (the auxiliary current 90° ahead of the main's at \
             standstill): starting torque {} N·m, line current {} A, capacitor at {} V",
            num(st.microfarads, 3),
            num(st.at.torque_nm, 3),
            num(st.at.line_current_a, 2),
            num(st.at.capacitor_v, 1)
        )));
    }
    lines.push(paragraph(&format!(
        "for a field balanced exactly at slip {}, an auxiliary of the main's copper scaled by \
         a² would need a = {} and {} µF at {} V",
        num(c.run_slip, 3),
        num(c.balancing_ratio, 3),
        num(c.balancing_microfarads, 3),
        num(c.balancing_capacitor_v, 1)
    )));
    s.push(Section::Lines(lines));
    let mut t = Table::new(&[
        ("slip", Align::Right),
        ("rpm", Align::Right),
        ("torque N·m", Align::Right),
        ("line A", Align::Right),
        ("main A", Align::Right),
        ("aux A", Align::Right),
        ("pf", Align::Right),
        ("backward %", Align::Right),
        ("capacitor V", Align::Right),
    ]);
    for r in &c.slips {
        t.push(vec![
            num(r.slip, 3),
            num(r.speed_rpm, 0),
            num(r.torque_nm, 3),
            num(r.line_current_a, 3),
            num(r.main_current_a, 3),
            num(r.aux_current_a, 3),
            num(r.power_factor, 3),
            num(r.backward_percent, 1),
            num(r.capacitor_v, 1),
        ]);
    }
    s.push(Section::Table(t));
    s
}

fn part_card(p: &Part) -> String {
    let wire = p.wire.as_ref().map_or("wire not given".to_string(), |w| {
        format!(
            "wire {} mm ({} mm over enamel)",
            num(w.diameter.mm(), 3),
            num(w.insulated_diameter.mm(), 3)
        )
    });
    let sections = if p.sections_20c_ohm.is_empty() {
        String::new()
    } else {
        format!(
            ", sections {} ohm",
            p.sections_20c_ohm
                .iter()
                .map(|r| num(*r, 4))
                .collect::<Vec<_>>()
                .join(" and ")
        )
    };
    paragraph(&format!(
        "{}: {wire}; {} turns in series; {} ohm at 20 °C{sections}; {} kg of conductor in the \
         coils",
        p.label,
        p.series_turns,
        ohm(p.resistance_20c_ohm),
        p.copper_kg.map_or("-".into(), |m| num(m, 3))
    ))
}

impl SinglePhaseView<'_> {
    fn title(&self) -> String {
        let kind = match self.view {
            View::Plan => "Single-phase plan",
            View::Factors => "Single-phase winding factors",
            View::Field => "Single-phase field",
            View::Card => "Single-phase data card",
            View::Audit => "Single-phase audit",
        };
        match &self.winding.labels.title {
            Some(t) => format!("{kind}: {t}"),
            None => kind.to_string(),
        }
    }

    fn summary(&self) -> Vec<String> {
        summary(self.report)
    }
}

/// The study's opening lines: core, the two windings' placing and the turns ratio.
pub fn summary(r: &SinglePhaseReport) -> Vec<String> {
    {
        vec![paragraph(&format!(
            "rotary core: {} slots, {} poles, {} slots per pole; a main and an auxiliary \
             winding of concentric groups, the auxiliary's axis {} electrical degrees from \
             the main's; effective turns ratio a = {}",
            r.slots,
            r.poles,
            num(r.slots_per_pole, 3),
            num(r.axis_shift_deg.abs(), 2),
            num(r.turns_ratio, 4)
        ))]
    }
}

impl Report for SinglePhaseView<'_> {
    fn json(&self) -> impl Serialize + '_ {
        let r = self.report;
        let coils = (self.view == View::Plan).then(|| {
            self.winding
                .coils
                .iter()
                .map(|c| CoilJson {
                    phase: self.winding.label(c.phase).to_string(),
                    go: c.go + 1,
                    back: c.back + 1,
                    turns: c.turns,
                })
                .collect()
        });
        let rows = match self.view {
            View::Factors => serde_json::to_value(&r.main.factors).ok(),
            View::Field => serde_json::to_value(&r.spectrum).ok(),
            _ => None,
        };
        SinglePhaseJson {
            opening: Opening::default(),
            kind: "single-phase",
            title: self.winding.labels.title.clone(),
            coils,
            winding_factor: r.main.winding_factor,
            rows,
            aux_rows: (self.view == View::Factors)
                .then(|| serde_json::to_value(&r.aux.factors).ok())
                .flatten(),
            sound: (self.view == View::Audit).then_some(r.findings.is_empty()),
            findings: r
                .findings
                .iter()
                .map(|f| Worded {
                    fact: f,
                    message: finding_words(f),
                })
                .collect(),
            capacitor_missing_message: r.capacitor_missing.map(|m| missing_words(m).to_string()),
            single_phase: r,
        }
    }

    fn sections(&self) -> Vec<Section> {
        let r = self.report;
        let mut s = vec![
            Section::Heading(self.title()),
            Section::Lines(self.summary()),
        ];
        s.push(caution());
        match self.view {
            View::Plan => {
                s.push(Section::Table(parts_table(r)));
                s.push(Section::Heading("Coils".into()));
                s.push(Section::Table(self.main_table()));
                s.extend(self.capacitor_or_missing());
                s.push(Section::Heading("Connections".into()));
                s.extend(boards_sections(&r.boards));
            }
            View::Factors => {
                s.push(Section::Table(parts_table(r)));
                s.push(Section::Table(factors_table(r)));
            }
            View::Field => {
                s.push(Section::Lines(vec![paragraph(&match r.feed {
                    Feed::RunCapacitor => format!(
                        "with the currents of the run capacitor at its slip; the working wave \
                         travels toward {} slot numbers (auxiliary start lead on the main's \
                         start lead's line)",
                        way(r.towards_rising_slots)
                    ),
                    Feed::Quadrature => format!(
                        "with the auxiliary's ampere-turns equal and 90° ahead (a circular \
                         field: the windings' own harmonics); the working wave travels toward \
                         {} slot numbers",
                        way(r.towards_rising_slots)
                    ),
                })]));
                s.push(Section::Table(waves_table(r)));
            }
            View::Card => {
                s.push(Section::Lines(vec![part_card(&r.main), part_card(&r.aux)]));
                s.push(Section::Heading("Leads".into()));
                s.extend(boards_sections(&r.boards));
                s.extend(self.capacitor_or_missing());
                s.push(Section::Heading("Acceptance".into()));
                let mut lines = super::card_report::insulation_tests(&r.acceptance);
                if r.boards.iter().any(|b| b.through_capacitor.is_some()) {
                    lines.insert(0, CAPACITOR_CAUTION.to_string());
                }
                s.push(Section::Lines(lines.iter().map(|l| paragraph(l)).collect()));
            }
            View::Audit => {
                if r.findings.is_empty() {
                    s.push(Section::Lines(vec![paragraph(
                        "sound: every coil agrees with its winding, the axes are in \
                         quadrature, and the readings given are within 5 % of the card",
                    )]));
                } else {
                    s.push(Section::Items(
                        r.findings.iter().map(finding_words).collect(),
                    ));
                }
            }
        }
        s
    }

    fn main_table(&self) -> Table {
        match self.view {
            View::Factors => factors_table(self.report),
            View::Field => waves_table(self.report),
            View::Card | View::Audit => parts_table(self.report),
            View::Plan => {
                let mut t = Table::new(&[
                    ("coil", Align::Right),
                    ("winding", Align::Left),
                    ("go", Align::Right),
                    ("back", Align::Right),
                    ("span", Align::Right),
                    ("turns", Align::Right),
                ]);
                for (i, c) in self.winding.coils.iter().enumerate() {
                    t.push(vec![
                        (i + 1).to_string(),
                        self.winding.label(c.phase).to_string(),
                        (c.go + 1).to_string(),
                        (c.back + 1).to_string(),
                        self.winding.span(c).unsigned_abs().to_string(),
                        c.turns.to_string(),
                    ]);
                }
                t
            }
        }
    }
}

impl SinglePhaseView<'_> {
    fn capacitor_or_missing(&self) -> Vec<Section> {
        match (&self.report.capacitor, self.report.capacitor_missing) {
            (Some(c), _) => capacitor_sections(c),
            (None, Some(m)) => vec![Section::Lines(vec![paragraph(missing_words(m))])],
            (None, None) => Vec::new(),
        }
    }
}
