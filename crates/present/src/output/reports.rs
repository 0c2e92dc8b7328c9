//! How each analysis report reads as text and CSV.

use super::{Align, Report, Section, Table, num};
use crate::factors::FactorTable;
use crate::plan::PlanReport;
use crate::units::Length;
use itertools::Itertools;

/// One paragraph of a report, kept whole (its white space folded to single spaces): the
/// text presenter wraps it at 78 columns, the HTML page and the sheets set it to their own
/// measure, so no presenter undoes another's line breaks.
pub fn paragraph(text: &str) -> String {
    text.split_whitespace().collect::<Vec<_>>().join(" ")
}

pub use crate::numbering::ranges;

/// What a slip outside 0..1 means, for labels: " (generating)" below 0, " (plugging:
/// braking against the field)" above 1, nothing in between.
pub fn slip_regime(s: f64) -> &'static str {
    if s < 0.0 {
        " (generating)"
    } else if s > 1.0 {
        " (plugging: braking against the field)"
    } else {
        ""
    }
}

fn opt(x: Option<f64>, digits: usize, unit: &str) -> Option<String> {
    x.map(|v| format!("{} {unit}", num(v, digits)))
}

impl Report for PlanReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::PlanJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::new();
        let mut head = vec![format!(
            "k_d {}, k_p {}, k_s {};  balanced: {}{}",
            num(self.fundamental.distribution, 4),
            num(self.fundamental.pitch, 4),
            num(self.fundamental.skew, 4),
            match (self.balanced, self.sequence) {
                (true, Some(crate::winding::star::Sequence::Negative)) =>
                    "yes, in NEGATIVE sequence (the field travels the other way: exchange two \
                     supply leads to reverse it)",
                (true, _) => "yes",
                (false, _) => "NO",
            },
            self.periodicity
                .map(|t| format!(
                    "; periodicity {t}{}",
                    if self.unbalanced_pull == Some(true) {
                        ", unbalanced pull"
                    } else {
                        ""
                    }
                ))
                .unwrap_or_default()
        )];
        if let Some(h) = &self.half_filled_slots
            && !h.is_empty()
        {
            head.push(format!("half-filled end slots: {}", ranges(h)));
        }
        if !self.empty_slots.is_empty() {
            head.push(format!("empty slots: {}", ranges(&self.empty_slots)));
        }
        s.push(Section::Heading(
            self.title.clone().unwrap_or_else(|| "Winding plan".into()),
        ));
        s.push(Section::Design(super::design_lines(&self.design)));
        s.push(Section::Lines(head));
        s.push(super::caution());

        s.push(Section::Heading(
            "Slots (sign: current in at +, out at -)".into(),
        ));
        let across = if self.layers == 2 { 3 } else { 4 };
        let mut cols: Vec<(&str, Align)> = Vec::new();
        for _ in 0..across {
            cols.extend([("slot", Align::Right), ("top", Align::Left)]);
            if self.layers == 2 {
                cols.push(("bottom", Align::Left));
            }
            cols.push(("|", Align::Left));
        }
        cols.pop();
        let mut t = Table::new(&cols);
        let rows = self.slot_table.len().div_ceil(across);
        for r in 0..rows {
            let mut row = Vec::new();
            for c in 0..across {
                match self.slot_table.get(c * rows + r) {
                    Some(sr) => {
                        row.push(sr.slot.to_string());
                        row.push(sr.top.clone().unwrap_or_else(|| ".".into()));
                        if self.layers == 2 {
                            row.push(sr.bottom.clone().unwrap_or_else(|| ".".into()));
                        }
                    }
                    None => row.extend(std::iter::repeat_n(String::new(), self.layers + 1)),
                }
                row.push("|".into());
            }
            row.pop();
            t.push(row);
        }
        s.push(Section::Table(t));

        s.push(Section::Heading("Coils".into()));
        s.push(Section::Table(self.main_table()));

        s.push(Section::Heading(
            "Coil groups in connection order (- : connect reversed)".into(),
        ));
        let mut g = Table::new(&[
            ("group", Align::Right),
            ("phase", Align::Left),
            ("polarity", Align::Left),
            ("path", Align::Right),
            ("coils", Align::Left),
        ]);
        let mut order: Vec<&crate::plan::GroupRow> = self.groups.iter().collect();
        order.sort_by_key(|r| {
            (
                self.phases_emf.iter().position(|p| p.phase == r.phase),
                r.path,
            )
        });
        for r in order {
            g.push(vec![
                r.number.to_string(),
                r.phase.clone(),
                r.polarity.to_string(),
                r.path.to_string(),
                ranges(&r.coils),
            ]);
        }
        s.push(Section::Table(g));

        s.push(Section::Heading(
            "Phase EMF at the fundamental (N_ph*k_w1)".into(),
        ));
        let mut p = Table::new(&[
            ("phase", Align::Left),
            ("magnitude", Align::Right),
            ("angle deg", Align::Right),
        ]);
        for r in &self.phases_emf {
            p.push(vec![
                r.phase.clone(),
                num(r.magnitude, 4),
                num(r.angle_deg, 2),
            ]);
        }
        s.push(Section::Table(p));
        s.push(Section::Lines(vec![format!(
            "parallel path counts with equal EMFs: {}",
            self.possible_parallel_paths.iter().join(", ")
        )]));

        let f = &self.figures;
        let figs: Vec<String> = [
            opt(f.pole_pitch_m.map(|t| Length::from_m(t).mm()), 2, "mm")
                .map(|v| format!("pole pitch: {v}")),
            opt(f.synchronous_speed_m_s, 3, "m/s").map(|v| format!("synchronous speed: {v}")),
            opt(f.synchronous_speed_rpm, 1, "rpm").map(|v| format!("synchronous speed: {v}")),
            f.slip.and(f.speed_m_s.or(f.speed_rpm)).map(|_| {
                let s = f.slip.unwrap_or(0.0);
                format!("at slip {}{}:", num(s, 4), slip_regime(s))
            }),
            opt(f.speed_m_s, 3, "m/s").map(|v| format!("  secondary speed: {v}")),
            opt(f.speed_rpm, 1, "rpm").map(|v| format!("  rotor speed: {v}")),
            opt(f.thrust_n, 1, "N").map(|v| format!("thrust from air-gap power: {v}")),
            opt(f.torque_nm, 2, "N m").map(|v| format!("torque from air-gap power: {v}")),
            opt(f.active_length_m.map(|x| Length::from_m(x).mm()), 1, "mm")
                .map(|v| format!("active length (2p*tau): {v}")),
            opt(f.total_length_m.map(|x| Length::from_m(x).mm()), 1, "mm")
                .map(|v| format!("primary length (Z*slot pitch): {v}")),
        ]
        .into_iter()
        .flatten()
        .collect();
        if !figs.is_empty() {
            s.push(Section::Heading("Speeds and sizes".into()));
            s.push(Section::Lines(figs));
        }
        super::with_warnings(s, &self.warnings)
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("coil", Align::Right),
            ("phase", Align::Left),
            ("go", Align::Right),
            ("back", Align::Right),
            ("span", Align::Right),
            ("turns", Align::Right),
            ("group", Align::Right),
            ("path", Align::Right),
            ("go layer", Align::Left),
            ("back layer", Align::Left),
        ]);
        for c in &self.coils {
            t.push(vec![
                c.number.to_string(),
                c.phase.clone(),
                c.go.to_string(),
                c.back.to_string(),
                c.span.to_string(),
                c.turns.to_string(),
                c.group.to_string(),
                c.path.to_string(),
                c.go_layer.into(),
                c.back_layer.into(),
            ]);
        }
        t
    }
}

impl Report for FactorTable {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::FactorsJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = vec![
            Section::Heading(format!("Winding factors of phase {}", self.phase)),
            Section::Design(super::design_lines(&self.design)),
        ];
        if self.single_layer {
            s.push(Section::Lines(vec![paragraph(
                "Single layer: each slot holds one coil side, so the slot contents fix the \
                 field whatever the coil span or shape; a shorter span changes only the end \
                 connections and suppresses nothing. The whole factor is shown as k_d, with \
                 k_p = 1.",
            )]));
        }
        s.push(Section::Table(self.main_table()));
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("order", Align::Right),
            ("mech", Align::Right),
            ("k_d", Align::Right),
            ("k_p", Align::Right),
            ("k_s", Align::Right),
            ("k_w", Align::Right),
        ]);
        for r in &self.rows {
            t.push(vec![
                num(r.order.get(), 4),
                r.mech_order.map(|n| n.to_string()).unwrap_or_default(),
                format!("{:.4}", r.distribution),
                format!("{:.4}", r.pitch),
                format!("{:.4}", r.skew),
                format!("{:.4}", r.winding),
            ]);
        }
        t
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // A paragraph is one line whatever its length; the terminal's 78 columns are the text
    // presenter's (`output::text`), which wraps it on word boundaries.
    #[test]
    fn a_paragraph_stays_whole_and_the_terminal_wraps_it() {
        let p = paragraph(crate::safety::CAUTION);
        assert!(!p.contains('\n') && p.chars().count() > 78);
        let mut out = Vec::new();
        super::super::text::lines(std::slice::from_ref(&p), 0, &mut out).expect("written");
        let text = String::from_utf8(out).expect("utf-8");
        assert!(text.lines().count() > 1);
        assert!(text.lines().all(|l| l.chars().count() <= 78));
        assert_eq!(
            text.split_whitespace().collect::<Vec<_>>(),
            p.split_whitespace().collect::<Vec<_>>()
        );
    }

    // An empty paragraph is one empty line, as a line of its own always was.
    #[test]
    fn an_empty_paragraph_is_one_empty_line() {
        let mut out = Vec::new();
        super::super::text::lines(&["".to_string(), "x".to_string()], 0, &mut out)
            .expect("written");
        assert_eq!(String::from_utf8(out).expect("utf-8"), "\nx\n");
    }
}
