//! How the data card reads as text and CSV.

use super::reports::wrap;
use super::{Align, Report, Section, Table, num};
use crate::card::DataCard;
use crate::card::leads::{Configuration, Sections};
use crate::winding::Connection;

fn opt(x: Option<f64>, digits: usize, unit: &str) -> String {
    x.map_or_else(|| "-".into(), |v| format!("{} {unit}", num(v, digits)))
}

/// "parallel star (low voltage)" and the like.
pub fn configuration_name(c: &Configuration) -> String {
    let conn = match c.connection {
        Connection::Star => "star",
        Connection::Delta => "delta",
    };
    match c.sections {
        Sections::Single => conn.to_string(),
        Sections::Series => format!("series {conn} (higher voltage)"),
        Sections::Parallel => format!("parallel {conn} (lower voltage)"),
    }
}

/// Significant figures for resistances, which span micro-ohms to kilo-ohms.
fn ohms(r: f64) -> String {
    if r >= 100.0 {
        num(r, 1)
    } else if r >= 1.0 {
        num(r, 3)
    } else {
        num(r, 5)
    }
}

impl Report for DataCard {
    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::from(super::opening("Winding data card", &self.design));
        let list = |v: &[usize]| {
            v.iter()
                .map(|x| x.to_string())
                .collect::<Vec<_>>()
                .join(", ")
        };
        let mut lines = vec![
            format!(
                "{} coils in {} groups of {} coil(s)",
                self.coils,
                self.groups,
                list(&self.coils_per_group)
            ),
            format!(
                "span {} (slot to slot); {} turn(s) per coil; {} series turns per phase",
                self.spans.join(", "),
                self.turns_per_coil
                    .iter()
                    .map(|t| t.to_string())
                    .collect::<Vec<_>>()
                    .join(", "),
                num(self.series_turns_per_phase, 2)
            ),
        ];
        match &self.wire {
            Some(w) => lines.push(format!(
                "wire: {} x {} mm bare {}{} ({} mm2 per strand, {} mm2 per conductor), \
                 {} mm over enamel, {}",
                w.strands_in_hand,
                num(w.diameter_mm, 4),
                w.material,
                w.awg.map(|n| format!(" (AWG {n})")).unwrap_or_default(),
                num(w.area_mm2, 4),
                num(w.conductor_area_mm2, 4),
                num(w.insulated_diameter_mm, 3),
                w.insulation
            )),
            None => lines.push("wire: not given".into()),
        }
        s.push(Section::Lines(
            lines.into_iter().flat_map(|l| wrap(&l, 78)).collect(),
        ));

        s.push(Section::Heading("Copper".into()));
        let mut t = Table::new(&[("figure", Align::Left), ("value", Align::Right)]);
        t.push(vec!["mean turn".into(), opt(self.mean_turn_mm, 1, "mm")]);
        t.push(vec![
            "mean turn rule".into(),
            self.mean_turn_rule.to_string(),
        ]);
        t.push(vec![
            "phase resistance at 20 C".into(),
            self.phase_resistance_20c_ohm
                .map_or("-".into(), |r| format!("{} ohm", ohms(r))),
        ]);
        t.push(vec![
            "line-to-line resistance at 20 C".into(),
            self.line_resistance_20c_ohm
                .map_or("-".into(), |r| format!("{} ohm", ohms(r))),
        ]);
        t.push(vec![
            "conductor mass, whole winding".into(),
            opt(self.copper_mass_kg, 3, "kg"),
        ]);
        t.push(vec![
            "conductor mass per phase".into(),
            opt(self.copper_mass_per_phase_kg, 3, "kg"),
        ]);
        t.push(vec![
            "conductor mass per coil".into(),
            opt(self.copper_mass_per_coil_kg, 4, "kg"),
        ]);
        t.push(vec![
            "wires in the fullest slot".into(),
            self.wires_per_slot.to_string(),
        ]);
        t.push(vec![
            "slot fill (insulated wire)".into(),
            self.slot_fill.map_or("- (no slot area)".into(), |f| {
                format!("{}%", num(f * 100.0, 1))
            }),
        ]);
        t.push(vec![
            "copper fill (bare)".into(),
            self.copper_fill
                .map_or("-".into(), |f| format!("{}%", num(f * 100.0, 1))),
        ]);
        s.push(Section::Table(t));

        if let Some(l) = &self.leads {
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
            s.push(Section::Lines(
                lines.iter().flat_map(|x| wrap(x, 78)).collect(),
            ));
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
            lines.extend(wrap(&l.rotation.to_string(), 78));
            s.push(Section::Lines(lines));
        }

        s.push(Section::Heading("Acceptance".into()));
        let a = &self.acceptance;
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
        match (a.hipot_new_v, a.hipot_repeat_v) {
            (Some(n), Some(r)) => lines.push(format!(
                "high-potential test, windings to frame, 1 min: {} V for a new winding, {} V \
                 for a repeat test (IEC 60034-1)",
                num(n, 0),
                num(r, 0)
            )),
            _ => lines.push(
                "high-potential test: give [supply] line_voltage_v for the test voltage".into(),
            ),
        }
        lines.push(format!(
            "insulation resistance at 40 C at least {} megohm, polarization index at least {} \
             (IEEE 43)",
            num(a.insulation_resistance_min_mohm, 0),
            num(a.polarization_index_min, 1)
        ));
        lines.push(a.note.to_string());
        s.push(Section::Lines(
            lines.iter().flat_map(|x| wrap(x, 78)).collect(),
        ));

        if !self.warnings.is_empty() {
            s.push(Section::Heading("Warnings".into()));
            s.push(Section::Lines(
                self.warnings
                    .iter()
                    .flat_map(|w| wrap(&format!("- {}", w.message()), 78))
                    .collect(),
            ));
        }
        s.push(super::caution(self.caution));
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
        row("mean_turn", self.mean_turn_mm, "mm");
        row(
            "wire_diameter",
            self.wire.as_ref().map(|w| w.diameter_mm),
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

impl std::fmt::Display for crate::card::leads::Rotation {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "L1, L2, L3 on {} in that time order: the field moves towards rising slot numbers \
             (slot 1 towards slot {}) in this winding's numbering; exchange any two lines to \
             reverse it ({})",
            self.leads.join(", "),
            self.slots,
            match self.marking {
                crate::design::Marking::Iec => "IEC 60034-8: clockwise seen from the drive end",
                crate::design::Marking::Nema => {
                    "NEMA MG 1: counter-clockwise seen from the end opposite the drive"
                }
            }
        )
    }
}

super::as_sentence!(
    crate::card::leads::Rotation,
    "Rotation",
    "Which way the field moves with L1, L2, L3 on the first three leads."
);

impl std::fmt::Display for crate::card::MeanTurnRule {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            crate::card::MeanTurnRule::Given => f.write_str("as given (core.mean_turn_mm)"),
            crate::card::MeanTurnRule::Rule {
                end_factor,
                end_allowance_mm,
            } => write!(
                f,
                "2 x stack + 2 x {} x span width + {} mm",
                num(*end_factor, 3),
                num(*end_allowance_mm, 1)
            ),
        }
    }
}

super::as_sentence!(
    crate::card::MeanTurnRule,
    "MeanTurnRule",
    "How the mean turn was found."
);
