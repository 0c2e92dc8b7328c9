//! How the travelling-field report reads as text and CSV.

use super::reports::paragraph;
use super::{Align, Report, Section, Table, num};
use crate::field::{Direction, FieldReport};
use itertools::Itertools;

fn travels(forward: f64, backward: f64) -> &'static str {
    let (hi, lo) = (forward.max(backward), forward.min(backward));
    if lo > 1e-6 * hi.max(1e-300) && lo > 1e-9 {
        if forward >= backward {
            "both, mostly forward"
        } else {
            "both, mostly backward"
        }
    } else if forward >= backward {
        "forward"
    } else {
        "backward"
    }
}

impl Report for FieldReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::FieldJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::new();
        let currents = self
            .currents
            .iter()
            .map(|c| {
                format!(
                    "{} {}@{}",
                    c.phase,
                    num(c.magnitude, 4),
                    num(c.angle_deg, 2)
                )
            })
            .join(", ");
        let dir = match self.working_wave {
            Direction::Forward => "forward (toward higher slot numbers)",
            Direction::Backward => "backward (toward lower slot numbers)",
        };
        let mut head = vec![
            format!("phase currents (peak@deg): {currents}"),
            format!(
                "working wave: travels {dir}, amplitude {} ampere-turns",
                num(self.working_wave_amplitude, 4)
            ),
            format!(
                "differential leakage sigma_d = {} (exact, every other wave); MMF THD = {} %",
                num(self.differential_leakage, 6),
                num(100.0 * self.thd, 3)
            ),
        ];
        if self.slot_opening > 0.0 {
            head.push(format!(
                "slot opening {} slot pitch(es): current spread evenly across it",
                num(self.slot_opening, 4)
            ));
        }
        if let Some(l) = &self.linear {
            head.push(format!(
                "at the synchronous wavenumber pi/tau: forward {}, backward {}; pulsating \
                 (open ends) {}",
                num(l.forward_wave, 4),
                num(l.backward_wave, 4),
                num(l.pulsating, 4)
            ));
            if let Some(c) = &l.strongest_between_orders {
                head.push(paragraph(&format!(
                    "a primary of finite length spreads each wave over nearby wavenumbers: \
                     between whole orders its spectrum reaches forward {}, backward {} at order \
                     {} (JSON: continuous)",
                    num(c.forward, 4),
                    num(c.backward, 4),
                    num(c.order.get(), 3)
                )));
            }
            if let Some(e) = &l.ends {
                let text = if e.entry_slots.is_empty() && e.exit_slots.is_empty() {
                    "every slot carries the winding's periodic pattern: the ends only cut the \
                     waves off"
                        .to_string()
                } else {
                    let slots = |s: &[crate::numbering::SlotNo]| {
                        if s.is_empty() {
                            "none".to_string()
                        } else {
                            crate::numbering::ranges(s)
                        }
                    };
                    format!(
                        "the ends differ from the winding's periodic pattern in slots {} \
                         (entry) and {} (exit). At pi/tau the entry end alone gives forward {}, \
                         backward {}; the exit end forward {}, backward {} (every wavenumber: \
                         JSON continuous)",
                        slots(&e.entry_slots),
                        slots(&e.exit_slots),
                        num(e.entry_forward_at_1, 4),
                        num(e.entry_backward_at_1, 4),
                        num(e.exit_forward_at_1, 4),
                        num(e.exit_backward_at_1, 4),
                    )
                };
                head.push(paragraph(&text));
            }
            if let Some(v) = l.field_speed_m_s {
                let sec = l
                    .secondary_speed_m_s
                    .zip(self.figures.slip)
                    .map(|(u, s)| {
                        format!(
                            "; secondary at slip {}{}: {} m/s",
                            num(s, 4),
                            super::reports::slip_regime(s),
                            num(u, 4)
                        )
                    })
                    .unwrap_or_default();
                head.push(format!(
                    "field speed v_s = 2 f tau = {} m/s{sec}",
                    num(v, 4)
                ));
            }
        } else if let Some(n) = self.figures.synchronous_speed_rpm {
            let sec = self
                .figures
                .speed_rpm
                .zip(self.figures.slip)
                .map(|(u, s)| format!("; rotor at slip {}: {} rpm", num(s, 4), num(u, 2)))
                .unwrap_or_default();
            head.push(format!("field speed n_s = {} rpm{sec}", num(n, 2)));
        }
        s.extend(super::opening("Travelling field", &self.design));
        s.push(Section::Lines(head));
        s.push(super::caution());
        s.push(Section::Heading(format!(
            "Spectrum up to order {} (relative to the working wave)",
            num(self.upto, 3)
        )));
        s.push(Section::Table(self.main_table()));

        s.push(Section::Heading(format!(
            "MMF at wt = {} deg, ampere-turns, level after each slot",
            num(self.snapshot.at_deg, 2)
        )));
        // Corners come in pairs per slot; the second of each pair is the level after it.
        let levels: Vec<f64> = self
            .snapshot
            .points
            .iter()
            .skip(2)
            .step_by(2)
            .take(self.slots)
            .map(|p| p.mmf)
            .collect();
        let across = 4;
        let mut cols = Vec::new();
        for _ in 0..across {
            cols.extend([("slot", Align::Right), ("MMF", Align::Right)]);
        }
        let mut t = Table::new(&cols);
        let rows = levels.len().div_ceil(across);
        for r in 0..rows {
            let mut row = Vec::new();
            for c in 0..across {
                match levels.get(c * rows + r) {
                    Some(v) => {
                        row.push((c * rows + r + 1).to_string());
                        row.push(num(*v, 3));
                    }
                    None => row.extend([String::new(), String::new()]),
                }
            }
            t.push(row);
        }
        s.push(Section::Table(t));
        super::with_warnings(s, &self.warnings)
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("order", Align::Right),
            ("mech", Align::Right),
            ("forward", Align::Right),
            ("backward", Align::Right),
            ("travels", Align::Left),
        ]);
        for r in &self.rows {
            t.push(vec![
                num(r.order.get(), 4),
                r.mech_order.map(|n| n.to_string()).unwrap_or_default(),
                format!("{:.6}", r.forward),
                format!("{:.6}", r.backward),
                travels(r.forward, r.backward).into(),
            ]);
        }
        t
    }
}
