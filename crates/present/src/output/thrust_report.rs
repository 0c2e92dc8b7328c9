//! How the thrust and inductance reports read as text and CSV.

use super::reports::paragraph;
use super::{Align, Report, Section, Table, num};
use crate::inductance::InductanceReport;
use crate::output::Words;
use crate::thrust::{Feed, ThrustReport};
use crate::units::Length;

impl Report for ThrustReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::ThrustJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        sections_every(self, 1)
    }

    /// The spreadsheet's table: the circuit's columns, then the field model's at the same
    /// slips (each heading says which model).
    fn main_table(&self) -> Table {
        let mut t = table_every(self, 1);
        t.extend_columns(
            &[
                ("field model thrust N", Align::Right),
                ("field model normal N (+ attracts)", Align::Right),
                ("field model largest phase current A", Align::Right),
                ("field model power factor", Align::Right),
                ("field model plate heat W", Align::Right),
            ],
            self.field_model
                .rows
                .iter()
                .map(|r| {
                    vec![
                        num(r.thrust_n, 2),
                        num(r.normal_force_n, 2),
                        num(r.phase_currents_a.iter().copied().fold(0.0, f64::max), 3),
                        num(r.power_factor, 3),
                        num(r.secondary_loss_w, 1),
                    ]
                })
                .collect(),
        );
        t
    }
}

/// The performance report with every `every`-th operating point in its table (the first and
/// the last always among them when the sweep divides evenly).
pub fn sections_every(report: &ThrustReport, every: usize) -> Vec<Section> {
    let this = report;
    {
        let mut s = Vec::from(super::opening("Flat primary performance", &this.design));
        let c = &this.circuit;
        let feed = match this.feed {
            Feed::Voltage { phase_voltage_v } => {
                format!("voltage-fed, {} V per phase", num(phase_voltage_v, 1))
            }
            Feed::Current { phase_current_a } => {
                format!("current-fed, {} A per phase", num(phase_current_a, 3))
            }
        };
        let lines = [
            format!(
                "{feed}; end effect {}",
                if this.end_effect {
                    "included (Duncan)"
                } else {
                    "left out"
                }
            ),
            format!(
                "pole pitch {} mm, synchronous speed {} m/s, active length {} mm, width {} mm",
                num(Length::from_m(c.pole_pitch_m).mm(), 2),
                num(this.synchronous_speed_m_s, 3),
                num(Length::from_m(c.length_m).mm(), 1),
                num(Length::from_m(c.width_m).mm(), 1)
            ),
            format!(
                "goodness factor G = {}, Carter k_C = {}, edge factor K = {}, effective gap \
                 {} mm",
                num(this.goodness_factor, 3),
                num(this.carter_coefficient, 4),
                num(this.edge_factor, 4),
                num(this.effective_gap.mm(), 3)
            ),
            format!(
                "per phase: R1 = {} ohm, X1 = {} ohm (slot {}, end {}, differential {}), X_m = \
                 {} ohm (L_m = {} mH), R2' = {} ohm",
                num(c.r1_ohm, 4),
                num(c.x1_ohm, 4),
                num(c.x_slot_ohm, 4),
                num(c.x_end_ohm, 4),
                num(c.x_diff_ohm, 4),
                num(c.xm_ohm, 4),
                num(crate::units::in_milli(this.magnetizing_inductance_h), 4),
                num(this.secondary_resistance_ohm, 4)
            ),
            format!(
                "largest thrust {} N at slip {} (circuit){}",
                num(this.max_thrust_n, 2),
                num(this.max_thrust_slip, 4),
                range_end(this, this.max_thrust_slip)
            ),
        ];
        s.push(Section::Lines(lines.iter().map(|l| paragraph(l)).collect()));
        s.push(Section::Heading(
            "Equivalent circuit (per phase, sinusoidal field)".into(),
        ));
        s.push(Section::Table(table_every(this, every)));
        s.extend(field_sections(this, every));
        let mut notes: Vec<String> =
            vec!["slip below 0: generating; above 1: plugging (braking against the field)".into()];
        if this.rows.iter().any(|r| r.power_factor < 0.0) {
            notes.push(
                "a negative power factor: the primary returns real power to the supply there \
                 (generating beyond its losses)"
                    .into(),
            );
        }
        notes.extend(
            this.assumptions
                .iter()
                .map(|a| format!("assumed: {}", a.message())),
        );
        s.push(Section::Lines(notes.iter().map(|l| paragraph(l)).collect()));
        s.push(super::caution());
        s
    }
}

/// ", at the end of the slips asked" when the largest thrust lies on the range's end (the
/// peak may lie beyond it).
fn range_end(report: &ThrustReport, slip: f64) -> &'static str {
    let ends = [report.rows.first(), report.rows.last()];
    if ends
        .iter()
        .flatten()
        .any(|r| (r.slip - slip).abs() < 1e-6 && r.slip != 1.0)
    {
        ", at the end of the slips asked (the peak may lie beyond)"
    } else {
        ""
    }
}

/// What each choice of a plate comparison breaks, "choice N: ..." (N from 1).
pub fn plate_warnings(report: &crate::plates::PlatesReport) -> Vec<String> {
    report
        .choices
        .iter()
        .enumerate()
        .flat_map(|(i, c)| {
            c.warnings
                .iter()
                .map(move |a| format!("choice {}: {}", i + 1, a.message()))
        })
        .collect()
}

/// The field model's lines and table, beside the circuit's.
fn field_sections(report: &ThrustReport, every: usize) -> Vec<Section> {
    let fm = &report.field_model;
    let mut lines = vec![format!(
        "largest thrust {} N at slip {}{}{}",
        num(fm.max_thrust_n, 2),
        num(fm.max_thrust_slip, 4),
        range_end(report, fm.max_thrust_slip),
        fm.max_thrust_ratio.map_or(String::new(), |r| format!(
            ", {} of the circuit's",
            num(r, 3)
        ))
    )];
    if let Some(r) = fm.standstill_thrust_ratio {
        lines.push(format!(
            "at standstill the field model gives {} of the circuit's thrust",
            num(r, 3)
        ));
    }
    lines.push(format!(
        "per phase: R1 = {} ohm, slot and end leakage {} ohm; {} wavenumbers up to {} 1/m \
         over a {} m window",
        num(fm.r1_ohm, 4),
        num(fm.x_leakage_ohm, 4),
        fm.wavenumbers,
        num(fm.k_max_per_m, 0),
        num(fm.window_m, 3)
    ));
    if fm.double_sided {
        lines.push(
            "two primaries: thrust, power and heat of both; normal force is each primary's \
             pull toward the plate"
                .into(),
        );
    }
    let mut t = Table::new(&[
        ("slip", Align::Right),
        ("thrust N", Align::Right),
        ("normal N (+ attracts)", Align::Right),
        ("phase currents A", Align::Right),
        ("power factor", Align::Right),
        ("efficiency", Align::Right),
        ("plate heat W", Align::Right),
    ]);
    for r in fm.rows.iter().step_by(every.max(1)) {
        t.push(vec![
            num(r.slip, 4),
            num(r.thrust_n, 2),
            num(r.normal_force_n, 2),
            r.phase_currents_a
                .iter()
                .map(|i| num(*i, 2))
                .collect::<Vec<_>>()
                .join(" "),
            num(r.power_factor, 3),
            r.efficiency.map_or(String::new(), |e| num(e, 3)),
            num(r.secondary_loss_w, 1),
        ]);
    }
    vec![
        Section::Heading("Field of the finite primary (layer method)".into()),
        Section::Lines(lines.iter().map(|l| paragraph(l)).collect()),
        Section::Table(t),
    ]
}

/// The performance table with every `every`-th operating point.
fn table_every(report: &ThrustReport, every: usize) -> Table {
    {
        let mut t = Table::new(&[
            ("slip", Align::Right),
            ("speed m/s", Align::Right),
            ("thrust N", Align::Right),
            ("normal N (+ attracts)", Align::Right),
            ("current A", Align::Right),
            ("power factor", Align::Right),
            ("efficiency", Align::Right),
            ("airgap W", Align::Right),
        ]);
        for r in report.rows.iter().step_by(every.max(1)) {
            t.push(vec![
                num(r.slip, 4),
                num(r.speed_m_s, 3),
                num(r.thrust_n, 2),
                num(r.normal_force_n, 2),
                num(r.current_a, 3),
                num(r.power_factor, 3),
                r.efficiency.map_or(String::new(), |e| num(e, 3)),
                num(r.airgap_power_w, 1),
            ]);
        }
        t
    }
}

impl Report for InductanceReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::InductanceJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::from(super::opening(
            match self.topology {
                crate::winding::Topology::Linear => "Inductances by the layer method",
                crate::winding::Topology::Rotary => "Inductances by winding functions",
            },
            &self.design,
        ));
        s.push(Section::Lines(vec![
            format!(
                "effective gap {} mm; gap inductances in mH, leakage {} mH per phase not \
                 included in the matrix",
                num(self.effective_gap.mm(), 3),
                num(crate::units::in_milli(self.leakage_h), 4)
            ),
            format!(
                "positive-sequence inductance {} mH",
                num(crate::units::in_milli(self.positive_sequence_h), 4)
            ),
        ]));
        s.push(Section::Table(self.main_table()));
        let mut lines = Vec::new();
        if let Some(i) = &self.phase_currents_a {
            lines.push(format!(
                "under balanced line voltages: phase currents {} A",
                i.iter().map(|x| num(*x, 3)).collect::<Vec<_>>().join(", ")
            ));
        }
        lines.push(format!(
            "negative-sequence current {}% of positive; backward field about {}% of forward",
            num(self.negative_sequence_current_percent, 3),
            num(self.backward_field_percent, 3)
        ));
        lines.extend(
            self.assumptions
                .iter()
                .map(|a| format!("assumed: {}", a.message())),
        );
        s.push(Section::Lines(lines.iter().map(|l| paragraph(l)).collect()));
        if !self.ranking.is_empty() {
            s.push(Section::Heading(
                "Layouts of the same primary by unbalance (least first)".into(),
            ));
            let mut t = Table::new(&[
                ("poles", Align::Right),
                ("layers", Align::Right),
                ("span", Align::Right),
                ("k_w1", Align::Right),
                ("negative sequence %", Align::Right),
                ("layout", Align::Left),
            ]);
            for r in &self.ranking {
                t.push(vec![
                    r.poles.to_string(),
                    r.layers.to_string(),
                    r.pitch.to_string(),
                    num(r.winding_factor, 4),
                    num(r.negative_sequence_current_percent, 3),
                    if r.this_layout {
                        "this layout".into()
                    } else {
                        "other".into()
                    },
                ]);
            }
            s.push(Section::Table(t));
        }
        s
    }

    fn main_table(&self) -> Table {
        let mut cols: Vec<(String, Align)> = vec![("phase".into(), Align::Left)];
        cols.extend(
            self.phases
                .iter()
                .map(|p| (format!("{p} mH"), Align::Right)),
        );
        let refs: Vec<(&str, Align)> = cols.iter().map(|(h, a)| (h.as_str(), *a)).collect();
        let mut t = Table::new(&refs);
        for (p, row) in self.phases.iter().zip(&self.matrix_h) {
            let mut r = vec![p.clone()];
            r.extend(row.iter().map(|x| num(crate::units::in_milli(*x), 5)));
            t.push(r);
        }
        t
    }
}

impl Report for crate::plates::PlatesReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::PlatesJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::from(super::opening("Plate, clearance and current", &self.design));
        s.push(Section::Lines(
            [format!(
                "each choice by the field of the finite primary (layer method), synchronous \
                 speed {} m/s; heat at standstill is all the power the plate takes",
                num(self.synchronous_speed_m_s, 3)
            )]
            .iter()
            .map(|l| paragraph(l))
            .collect(),
        ));
        s.push(Section::Table(self.main_table()));
        let mut notes = Vec::new();
        if self.double_sided {
            notes.push(
                "two primaries: thrust and heat are of both, the current each primary's"
                    .to_string(),
            );
        }
        notes.extend(plate_warnings(self));
        if !notes.is_empty() {
            s.push(Section::Lines(notes.iter().map(|l| paragraph(l)).collect()));
        }
        if self.choices.iter().any(|c| c.grid_bounded) {
            s.push(Section::Lines(vec![paragraph(
                "* the field model's wavenumbers were bounded for this choice: its end effect at \
                 low slip and its slot-harmonic drag are understated (see `thrust` on that \
                 layout for the figures)",
            )]));
        }
        s.push(super::caution());
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("plate mm", Align::Right),
            ("MS/m", Align::Right),
            ("clearance mm", Align::Right),
            ("feed", Align::Left),
            ("standstill N", Align::Right),
            ("peak N", Align::Right),
            ("at m/s", Align::Right),
            ("heat W", Align::Right),
            ("W/cm²", Align::Right),
            ("current A", Align::Right),
        ]);
        for c in &self.choices {
            t.push(vec![
                format!(
                    "{}{}",
                    if c.grid_bounded { "*" } else { "" },
                    num(c.thickness.mm(), 3)
                ),
                num(c.conductivity.ms_m(), 3),
                num(c.clearance.mm(), 3),
                c.current_a
                    .map_or("supply".to_string(), |i| format!("{} A", num(i, 3))),
                num(c.standstill_thrust_n, 1),
                num(c.peak_thrust_n, 1),
                num(c.peak_speed_m_s, 3),
                num(c.standstill_heat_w, 0),
                c.standstill_heat_w_cm2.map_or(String::new(), |h| num(h, 2)),
                num(c.standstill_current_a, 2),
            ]);
        }
        t
    }
}
