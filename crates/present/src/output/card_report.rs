//! How the data card reads as text and CSV.

use super::reports::paragraph;
use super::{Align, Report, Section, Table, num};
use super::{Say, worded};
use crate::card::DataCard;
use crate::card::leads::{Configuration, LeadScheme, Sections};
use crate::output::Words;
use crate::units::Length;
use crate::winding::Connection;
use std::fmt;

fn opt(x: Option<f64>, digits: usize, unit: &str) -> String {
    x.map_or_else(|| "-".into(), |v| format!("{} {unit}", num(v, digits)))
}

/// "parallel star": the connection and how the sections are joined.
pub fn connection_words(c: &Configuration) -> String {
    let conn = match c.connection {
        Connection::Star => "star",
        Connection::Delta => "delta",
    };
    match c.sections {
        Sections::Single => conn.to_string(),
        Sections::Series => format!("series {conn}"),
        Sections::Parallel => format!("parallel {conn}"),
    }
}

/// "parallel star (lower voltage)" and the like.
pub fn configuration_name(c: &Configuration) -> String {
    let how = connection_words(c);
    match c.sections {
        Sections::Single => how,
        Sections::Series => format!("{how} (higher voltage)"),
        Sections::Parallel => format!("{how} (lower voltage)"),
    }
}

/// The rating's figures in words: power (in kW, with hp when `hp`) and voltages.
pub fn rating_words(n: &crate::design::Nameplate, hp: bool) -> Vec<String> {
    let mut rating = Vec::new();
    if let Some(p) = n.power_w {
        rating.push(if hp {
            format!(
                "{} kW ({} hp)",
                num(crate::units::in_kilo(p), 3),
                num(crate::units::hp_of_watts(p), 2)
            )
        } else {
            format!("{} kW", num(crate::units::in_kilo(p), 2))
        });
    }
    if !n.voltages_v.is_empty() {
        rating.push(format!(
            "{} V",
            n.voltages_v
                .iter()
                .map(|v| num(*v, 0))
                .collect::<Vec<_>>()
                .join("/")
        ));
    }
    rating
}

/// The nameplate in lines of words (card text, card sheet, HTML page).
pub fn nameplate_lines(n: &crate::design::Nameplate) -> Vec<String> {
    let mut out = Vec::new();
    let mut rating = rating_words(n, true);
    if !n.currents_a.is_empty() {
        rating.push(format!(
            "{} A",
            n.currents_a
                .iter()
                .map(|v| num(*v, 2))
                .collect::<Vec<_>>()
                .join("/")
        ));
    }
    if let Some(f) = n.frequency_hz {
        rating.push(format!("{} Hz", num(f, 1)));
    }
    if let Some(r) = n.speed_rpm {
        rating.push(format!("{} rpm", num(r, 0)));
    }
    if !rating.is_empty() {
        out.push(format!("rating: {}", rating.join(", ")));
    }
    let mut more = Vec::new();
    if let Some(c) = &n.connection {
        more.push(format!("connection {c}"));
    }
    if let Some(f) = &n.frame {
        more.push(format!("frame {f}"));
    }
    if let Some(c) = n.insulation_class {
        more.push(format!("insulation class {c:?}"));
    }
    if let Some(e) = n.efficiency {
        more.push(format!("efficiency {}%", num(e * 100.0, 1)));
    }
    if let Some(p) = n.power_factor {
        more.push(format!("power factor {}", num(p, 2)));
    }
    if let Some(sf) = n.service_factor {
        more.push(format!("service factor {}", num(sf, 2)));
    }
    if !more.is_empty() {
        out.push(more.join(", "));
    }
    out
}

/// The job data in lines of words.
pub fn job_lines(j: &crate::design::Job) -> Vec<String> {
    let mut parts = Vec::new();
    for (name, v) in [
        ("job", &j.number),
        ("customer", &j.customer),
        ("date", &j.date),
        ("by", &j.technician),
    ] {
        if let Some(v) = v {
            parts.push(format!("{name} {v}"));
        }
    }
    let mut out = Vec::new();
    if !parts.is_empty() {
        out.push(parts.join(", "));
    }
    if let Some(n) = &j.notes {
        out.push(format!("notes: {n}"));
    }
    out
}

/// Significant figures for resistances, which span micro-ohms to kilo-ohms.
fn ohms(r: f64) -> String {
    crate::numbering::sig(r, 4)
}

impl Report for DataCard {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::CardJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::from(super::opening("Winding data card", &self.design));
        if let Some(n) = &self.nameplate {
            s.push(Section::Heading("Nameplate".into()));
            s.push(Section::Lines(
                nameplate_lines(n).iter().map(|l| paragraph(l)).collect(),
            ));
        }
        if let Some(j) = &self.job {
            s.push(Section::Heading("Job".into()));
            s.push(Section::Lines(
                job_lines(j).iter().map(|l| paragraph(l)).collect(),
            ));
        }
        if self.nameplate.is_some() || self.job.is_some() {
            s.push(Section::Heading("Winding".into()));
        }
        s.extend(winding_sections(self));

        s.extend(copper_sections(self));
        if let Some(l) = &self.loading {
            s.push(Section::Heading("Core loadings".into()));
            s.push(Section::Table(super::loading_table(l)));
            s.push(Section::Lines(super::loading_notes(l)));
            for w in &l.warnings {
                s.push(Section::Lines(vec![paragraph(&format!(
                    "WARNING: {}",
                    w.message()
                ))]));
            }
        }

        if let Some(l) = &self.leads {
            s.extend(lead_sections(l));
        }
        s.extend(section_readings(self));
        if let Some(six) = &self.six_leads {
            s.extend(six_lead_sections(six));
        }

        s.extend(acceptance_sections(self));
        if !self.warnings.is_empty() {
            s.push(Section::Heading("Warnings".into()));
            s.push(Section::Lines(
                self.warnings
                    .iter()
                    .map(|w| paragraph(&format!("- {}", w.message())))
                    .collect(),
            ));
        }
        s.push(super::caution());
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("figure", Align::Left),
            ("value", Align::Right),
            ("unit", Align::Left),
        ]);
        let mut row = |k: &str, v: Option<f64>, u: &str| {
            t.push(vec![
                k.into(),
                v.map_or(String::new(), |x| format!("{x}")),
                u.into(),
            ])
        };
        row("coils", Some(self.coils as f64), "");
        row("groups", Some(self.groups as f64), "");
        row(
            "series_turns_per_phase",
            Some(self.series_turns_per_phase),
            "",
        );
        row("mean_turn", self.mean_turn.map(Length::mm), "mm");
        row(
            "wire_diameter",
            self.wire.as_ref().map(|w| w.diameter.mm()),
            "mm",
        );
        row(
            "strands_in_hand",
            self.wire.as_ref().map(|w| w.strands_in_hand as f64),
            "",
        );
        row("phase_resistance_20c", self.phase_resistance_20c_ohm, "ohm");
        row("line_resistance_20c", self.line_resistance_20c_ohm, "ohm");
        row("copper_mass", self.copper_mass_kg, "kg");
        row("slot_fill", self.slot_fill, "");
        row("hipot_new", self.acceptance.hipot_new_v, "V");
        t
    }
}

impl fmt::Display for Say<'_, crate::card::leads::Rotation> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        if self.0.topology == crate::design::Topology::Linear {
            return write!(
                f,
                "L1, L2, L3 on {} in that time order: the field travels along the primary \
                 from the slot-1 end towards the slot-{} end and drags the plate that way \
                 (a primary running over a fixed plate moves the other way); exchange any \
                 two lines to reverse it",
                self.0.leads.join(", "),
                self.0.slots
            );
        }
        write!(
            f,
            "L1, L2, L3 on {} in that time order: the field moves towards rising slot numbers \
             (slot 1 towards slot {}) in this winding's numbering; exchange any two lines to \
             reverse it ({})",
            self.0.leads.join(", "),
            self.0.slots,
            match self.0.marking {
                crate::design::Marking::Iec => "IEC 60034-8: clockwise seen from the drive end",
                crate::design::Marking::Nema => {
                    "NEMA MG 1: counter-clockwise seen from the end opposite the drive"
                }
            }
        )
    }
}

worded!(crate::card::leads::Rotation);

impl fmt::Display for Say<'_, crate::card::MeanTurnRule> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.0 {
            crate::card::MeanTurnRule::Given => f.write_str("as given (core.mean_turn_mm)"),
            crate::card::MeanTurnRule::Rule {
                end_factor,
                end_allowance,
            } => write!(
                f,
                "2 x stack + 2 x {} x span width + {} mm (span width between the coil sides' \
                 centres: at mid-slot when the slot depth is given, else at the bore)",
                num(*end_factor, 3),
                num(end_allowance.mm(), 1)
            ),
        }
    }
}

worded!(crate::card::MeanTurnRule);

/// The card's winding: coils and groups, spans, turns and the wire.
fn winding_sections(card: &DataCard) -> Vec<Section> {
    let mut s = Vec::new();
    let list = |v: &[usize]| {
        v.iter()
            .map(|x| x.to_string())
            .collect::<Vec<_>>()
            .join(", ")
    };
    let mut lines = vec![
        format!(
            "{} in {} of {} {}",
            crate::numbering::count(card.coils, "coil", "coils"),
            crate::numbering::count(card.groups, "group", "groups"),
            list(&card.coils_per_group),
            crate::numbering::noun_for(&card.coils_per_group, "coil", "coils")
        ),
        format!(
            "span {} (slot to slot); {} per coil{}; {} series turns per phase",
            card.spans.join(", "),
            card.turns_per_coil
                .iter()
                .map(|t| t.to_string())
                .collect::<Vec<_>>()
                .join(", ")
                + if card.turns_per_coil == [1] {
                    " turn"
                } else {
                    " turns"
                },
            if card.turns_per_coil.len() > 1 {
                " (mixed)"
            } else {
                ""
            },
            num(card.series_turns_per_phase, 2)
        ),
    ];
    match &card.wire {
        Some(w) => lines.push(format!(
            "wire: {} x {} mm bare {}{} ({} mm2 per strand, {} mm2 per conductor), \
             {} mm over enamel, {}",
            w.strands_in_hand,
            num(w.diameter.mm(), 4),
            w.material,
            w.awg.map(|n| format!(" (AWG {n})")).unwrap_or_default(),
            num(w.area.mm2(), 4),
            num(w.conductor_area.mm2(), 4),
            num(w.insulated_diameter.mm(), 3),
            w.insulation
        )),
        None => lines.push("wire: not given".into()),
    }
    s.push(Section::Lines(
        lines.into_iter().map(|l| paragraph(&l)).collect(),
    ));
    s
}

/// Copper: mean turn, resistances, masses, wire to order, current density and fill; the formers.
fn copper_sections(card: &DataCard) -> Vec<Section> {
    let mut s = Vec::new();
    s.push(Section::Heading("Copper".into()));
    let mut t = Table::new(&[("figure", Align::Left), ("value", Align::Right)]);
    t.push(vec![
        "mean turn".into(),
        opt(card.mean_turn.map(Length::mm), 1, "mm"),
    ]);
    t.push(vec![
        "phase resistance at 20 C".into(),
        card.phase_resistance_20c_ohm
            .map_or("-".into(), |r| format!("{} ohm", ohms(r))),
    ]);
    t.push(vec![
        "line-to-line resistance at 20 C".into(),
        card.line_resistance_20c_ohm
            .map_or("-".into(), |r| format!("{} ohm", ohms(r))),
    ]);
    t.push(vec![
        "conductor mass, whole winding".into(),
        opt(card.copper_mass_kg, 3, "kg"),
    ]);
    t.push(vec![
        "conductor mass per phase".into(),
        opt(card.copper_mass_per_phase_kg, 3, "kg"),
    ]);
    t.push(vec![
        "conductor mass per coil".into(),
        opt(card.copper_mass_per_coil_kg, 4, "kg"),
    ]);
    t.push(vec![
        format!(
            "wire to order (+{}% for ends, leads, waste)",
            num(card.wire_allowance_percent, 0)
        ),
        opt(card.wire_to_order_kg, 2, "kg"),
    ]);
    t.push(vec![
        if card.rated_current_from_power {
            "rated line current (from the rated power)".into()
        } else {
            "rated line current (nameplate)".into()
        },
        opt(card.rated_current_a, 2, "A"),
    ]);
    t.push(vec![
        format!(
            "current density at rated current (limit {})",
            num(card.current_density_limit_a_mm2, 1)
        ),
        opt(card.current_density_a_mm2, 2, "A/mm2"),
    ]);
    t.push(vec![
        "wires in the fullest slot".into(),
        card.wires_per_slot.to_string(),
    ]);
    t.push(vec![
        "slot fill (insulated wire)".into(),
        card.slot_fill.map_or("- (no slot area)".into(), |f| {
            format!("{}%", num(f * 100.0, 1))
        }),
    ]);
    t.push(vec![
        "copper fill (bare)".into(),
        card.copper_fill
            .map_or("-".into(), |f| format!("{}%", num(f * 100.0, 1))),
    ]);
    s.push(Section::Table(t));
    s.push(Section::Lines(vec![paragraph(&format!(
        "mean turn rule: {}",
        card.mean_turn_rule.message()
    ))]));
    if !card.formers.is_empty() {
        s.push(Section::Heading(
            "Formers (by the mean-turn rule; span width between the coil sides' centres)".into(),
        ));
        let mut t = Table::new(&[
            ("span", Align::Left),
            ("coils", Align::Right),
            ("span width mm", Align::Right),
            ("straight mm", Align::Right),
            ("end out mm", Align::Right),
            ("mean turn mm", Align::Right),
        ]);
        for f in &card.formers {
            t.push(vec![
                f.span.clone(),
                f.coils.to_string(),
                num(f.span_width.mm(), 1),
                num(f.straight.mm(), 1),
                num(f.end_extension.mm(), 1),
                num(f.mean_turn.mm(), 1),
            ]);
        }
        s.push(Section::Table(t));
    }
    s
}

/// The leads out, the joints inside and every connection the leads allow.
fn lead_sections(l: &LeadScheme) -> Vec<Section> {
    let mut s = Vec::new();
    s.push(Section::Heading(format!(
        "Leads: {} leads, {} marking",
        l.count,
        match l.marking {
            crate::design::Marking::Iec => "IEC 60034-8",
            crate::design::Marking::Nema => "NEMA MG 1",
        }
    )));
    let mut lines: Vec<String> = vec![format!(
        "leads out: {}",
        l.terminals
            .iter()
            .map(|t| format!("{} ({} {} {})", t.name, t.phase, t.section, t.end))
            .collect::<Vec<_>>()
            .join(", ")
    )];
    for j in &l.internal {
        lines.push(format!("joined inside: {}", j.join("-")));
    }
    s.push(Section::Lines(lines.iter().map(|x| paragraph(x)).collect()));
    let mut t = Table::new(&[
        ("connection", Align::Left),
        ("L1", Align::Left),
        ("L2", Align::Left),
        ("L3", Align::Left),
        ("join", Align::Left),
        ("line V", Align::Right),
        ("R line 20C", Align::Right),
    ]);
    for c in &l.configurations {
        t.push(vec![
            format!(
                "{}{}",
                configuration_name(c),
                if c.as_planned { " *" } else { "" }
            ),
            c.lines[0].join("+"),
            c.lines[1].join("+"),
            c.lines[2].join("+"),
            if c.joined.is_empty() {
                "-".into()
            } else {
                c.joined
                    .iter()
                    .map(|j| j.join("-"))
                    .collect::<Vec<_>>()
                    .join(", ")
            },
            c.line_voltage_v.map_or("-".into(), |v| num(v, 0)),
            c.line_resistance_20c_ohm.map_or("-".into(), ohms),
        ]);
    }
    s.push(Section::Table(t));
    let mut lines = vec!["* as planned".to_string()];
    lines.push(paragraph(&l.rotation.message()));
    s.push(Section::Lines(lines));
    s
}

/// Each section as measured across its own leads before linking.
fn section_readings(card: &DataCard) -> Vec<Section> {
    let mut s = Vec::new();
    if !card.sections.is_empty() {
        s.push(Section::Heading(
            "Sections, measured across their own leads before linking".into(),
        ));
        let mut t = Table::new(&[
            ("phase", Align::Left),
            ("section", Align::Right),
            ("measure across", Align::Left),
            ("reads at 20 C", Align::Right),
            ("section ohm 20 C", Align::Right),
            ("reads at", Align::Right),
        ]);
        for f in &card.sections {
            t.push(vec![
                f.phase.clone(),
                f.section.to_string(),
                f.between.clone(),
                ohms(f.reading_20c_ohm),
                ohms(f.resistance_20c_ohm),
                format!("{} at {} C", ohms(f.reading_ohm), num(f.temperature_c, 0)),
            ]);
        }
        s.push(Section::Table(t));
    }
    s
}

/// A pole-changing winding's halves and the readings between its six leads.
fn six_lead_sections(six: &crate::card::two_speed::SixLeads) -> Vec<Section> {
    let mut s = vec![Section::Heading(
        "Six leads (pole-changing), readings at 20 C".into(),
    )];
    let mut halves = Table::new(&[
        ("phase", Align::Left),
        ("half - (tap to end) ohm", Align::Right),
        ("half + (tap onward) ohm", Align::Right),
    ]);
    for h in &six.halves {
        halves.push(vec![
            h.phase.clone(),
            ohms(h.reversed_ohm),
            ohms(h.forward_ohm),
        ]);
    }
    s.push(Section::Table(halves));
    let measured = six.measured.as_ref();
    let mut columns = vec![
        ("board", Align::Left),
        ("between", Align::Left),
        ("ohm", Align::Right),
    ];
    if measured.is_some() {
        columns.push(("read, at 20 C", Align::Right));
    }
    let mut t = Table::new(&columns);
    for (i, r) in six.delivered.iter().enumerate() {
        let mut row = vec![
            "as delivered, nothing linked".into(),
            format!("{}-{}", r.between[0], r.between[1]),
            ohms(r.ohm),
        ];
        if let Some(m) = measured {
            row.push(m.readings_20c_ohm.get(i).map_or("-".into(), |v| ohms(*v)));
        }
        t.push(row);
    }
    for sp in &six.speeds {
        let board = if sp.linked.is_empty() {
            format!("{} poles, others open", sp.poles)
        } else {
            format!("{} poles, {} linked", sp.poles, sp.linked.join("+"))
        };
        for r in &sp.lines {
            let mut row = vec![
                board.clone(),
                format!("{}-{}", r.between[0], r.between[1]),
                ohms(r.ohm),
            ];
            if measured.is_some() {
                row.push(String::new());
            }
            t.push(row);
        }
    }
    s.push(Section::Table(t));
    if let Some(m) = measured {
        let verdict = if m.as_marked {
            format!(
                "the readings taken at {} C agree with the card as marked (within {} %)",
                num(m.temperature_c, 1),
                num(crate::card::measured::FAR_PERCENT, 0)
            )
        } else if m.exchanged.is_empty() {
            format!(
                "the readings taken at {} C are up to {} % from the card's, and no exchange of \
                 two leads' markings explains them: see beltwright audit",
                num(m.temperature_c, 1),
                num(m.worst_percent, 1)
            )
        } else {
            format!(
                "the readings taken at {} C agree with the card only with the markings of {} \
                 exchanged: see beltwright audit",
                num(m.temperature_c, 1),
                m.exchanged
                    .iter()
                    .map(|[a, b]| format!("{a} and {b}"))
                    .collect::<Vec<_>>()
                    .join(", or ")
            )
        };
        s.push(Section::Lines(vec![paragraph(&verdict)]));
    }
    s
}

/// The high-potential and insulation tests of the acceptance figures, and whose
/// procedures govern: every card's, three-phase or single-phase.
pub fn insulation_tests(a: &crate::card::Acceptance) -> Vec<String> {
    let mut lines = Vec::new();
    match (a.hipot_new_v, a.hipot_repeat_v) {
        (Some(n), Some(r)) => lines.push(format!(
            "high-potential test, windings to frame, 1 min: {} V for a new winding, {} V \
             for a repeat test (IEC 60034-1: 1000 V + 2 x {} V rated, at least 1500 V)",
            num(n, 0),
            num(r, 0),
            a.hipot_rated_v.map_or("-".into(), |v| num(v, 0))
        )),
        _ => lines
            .push("high-potential test: give [supply] line_voltage_v for the test voltage".into()),
    }
    lines.push(format!(
        "insulation resistance at 40 C at least {} megohm, polarization index at least {} \
         (IEEE 43)",
        num(a.insulation_resistance_min_mohm, 0),
        num(a.polarization_index_min, 1)
    ));
    lines.push(crate::safety::ACCEPTANCE_NOTE.to_string());
    lines
}

/// Acceptance: resistance balance, high-potential test, insulation; the readings against the card.
fn acceptance_sections(card: &DataCard) -> Vec<Section> {
    let mut s = Vec::new();
    s.push(Section::Heading("Acceptance".into()));
    let a = &card.acceptance;
    let mut lines = Vec::new();
    if let Some(r) = &a.line_resistance {
        lines.push(format!(
            "line-to-line resistance at {} C: {} ohm on each pair, largest deviation \
             from the mean of the three within +/-{}% (EASA AR100)",
            num(r.temperature_c, 1),
            ohms(r.line_ohm),
            num(a.balance_tolerance_percent, 1)
        ));
    }
    lines.extend(insulation_tests(a));
    s.push(Section::Lines(lines.iter().map(|x| paragraph(x)).collect()));

    if let Some(m) = &card.measured {
        s.push(Section::Heading(format!(
            "Readings at {} C against this card: {}",
            num(m.temperature_c, 1),
            if m.sound {
                "within tolerance"
            } else {
                "OUT OF TOLERANCE"
            }
        )));
        let mut t = Table::new(&[
            ("phase", Align::Left),
            ("section", Align::Right),
            ("across", Align::Left),
            ("ohm at 20 C", Align::Right),
            ("card ohm", Align::Right),
            ("from median %", Align::Right),
        ]);
        for j in &m.judged {
            t.push(vec![
                j.phase.clone(),
                j.section.to_string(),
                j.between.clone(),
                ohms(j.measured_20c_ohm),
                j.expected_20c_ohm.map_or("-".into(), ohms),
                format!("{:+.2}", j.deviation_percent),
            ]);
        }
        s.push(Section::Table(t));
        s.push(Section::Lines(vec![paragraph(&m.suggestion.message())]));
    }
    s
}
