//! Text and CSV views of the span comparison and the combination survey.

use super::reports::paragraph;
use super::{Align, Report, Section, Table, num};
use crate::output::Words;
use crate::pitch::PitchReport;
use crate::survey::SurveyReport;
use itertools::Itertools;

fn opt(x: Option<f64>, digits: usize) -> String {
    x.map(|v| format!("{v:.digits$}"))
        .unwrap_or_else(|| "-".into())
}

impl Report for PitchReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::PitchJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut head = vec![format!(
            "every span compared; floor k_w1 >= {}",
            num(self.min_fundamental, 3)
        )];
        head.push("* recommended   ! below the k_w1 floor".into());
        let mut s = Vec::from(super::opening("Span comparison", &self.design));
        s.extend([Section::Lines(head), Section::Table(self.main_table())]);
        s.push(Section::Lines(vec![paragraph(&self.reason.message())]));
        super::with_warnings(s, &self.warnings)
    }

    fn main_table(&self) -> Table {
        let mut cols: Vec<(String, Align)> = vec![
            ("mark".into(), Align::Left),
            ("span".into(), Align::Right),
            ("y/tau".into(), Align::Right),
            ("k_w1".into(), Align::Right),
        ];
        for o in &self.suppress {
            cols.push((format!("k_w{}", num(*o, 2)), Align::Right));
        }
        let moving = self.rows.iter().any(|r| r.slots != self.slots);
        if moving {
            cols.push(("slots".into(), Align::Right));
        }
        cols.extend([
            ("sigma_d".into(), Align::Right),
            ("THD".into(), Align::Right),
            ("end".into(), Align::Right),
        ]);
        let refs: Vec<(&str, Align)> = cols.iter().map(|(h, a)| (h.as_str(), *a)).collect();
        let mut t = Table::new(&refs);
        for r in &self.rows {
            let mark = if Some(r.pitch) == self.recommended {
                "*"
            } else if !r.meets_floor {
                "!"
            } else {
                ""
            };
            let mut row = vec![
                mark.to_string(),
                r.pitch.to_string(),
                format!("{:.3}", r.span_over_pole_pitch),
                format!("{:.4}", r.winding),
            ];
            row.extend(r.harmonics.iter().map(|h| format!("{:.4}", h.winding)));
            if moving {
                row.push(r.slots.to_string());
            }
            row.extend([
                opt(r.differential_leakage, 5),
                opt(r.thd, 4),
                format!("{:.2}", r.end_winding_relative),
            ]);
            t.push(row);
        }
        t
    }
}

impl Report for SurveyReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::SurveyJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let feasible = self.rows.iter().filter(|r| r.feasible).count();
        vec![
            Section::Heading(format!(
                "Slot/pole survey: {} combinations, {feasible} feasible ({} core, {} phases)",
                self.rows.len(),
                self.topology,
                self.phases
            )),
            Section::Lines(vec![
                "Z slots, 2p poles, L layers; ok: feasible; t = gcd(Z, p); lcm = lcm(Z, 2p),"
                    .into(),
                "higher means less cogging; pull: unbalanced radial pull; sub: lowest".into(),
                "sub-harmonic order; reasons for refusals are in the JSON and CSV.".into(),
            ]),
            Section::Table(text_table(self)),
        ]
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("slots", Align::Right),
            ("poles", Align::Right),
            ("layers", Align::Right),
            ("feasible", Align::Left),
            ("q", Align::Left),
            ("pitch", Align::Right),
            ("k_w1", Align::Right),
            ("kw1 max", Align::Right),
            ("at", Align::Right),
            ("sigma_d", Align::Right),
            ("t", Align::Right),
            ("lcm", Align::Right),
            ("pull", Align::Left),
            ("paths", Align::Left),
            ("sub", Align::Right),
            ("reason", Align::Left),
            ("k_w5", Align::Right),
            ("k_w7", Align::Right),
            ("min sigma_d at", Align::Right),
            ("min sigma_d", Align::Right),
        ]);
        for r in &self.rows {
            t.push(vec![
                r.slots.to_string(),
                r.poles.to_string(),
                r.layers.to_string(),
                if r.feasible { "yes" } else { "no" }.into(),
                r.q_fraction.clone(),
                r.pitch.map(|p| p.to_string()).unwrap_or_default(),
                r.winding.map(|w| format!("{w:.4}")).unwrap_or_default(),
                r.max_winding.map(|w| format!("{w:.4}")).unwrap_or_default(),
                r.max_winding_pitch
                    .map(|p| p.to_string())
                    .unwrap_or_default(),
                r.differential_leakage
                    .map(|w| format!("{w:.5}"))
                    .unwrap_or_default(),
                r.periodicity.map(|p| p.to_string()).unwrap_or_default(),
                r.lcm.map(|p| p.to_string()).unwrap_or_default(),
                match r.unbalanced_pull {
                    Some(true) => "yes".into(),
                    Some(false) => "no".into(),
                    None => String::new(),
                },
                r.parallel_paths.iter().join(" "),
                r.lowest_subharmonic.map(|s| num(s, 4)).unwrap_or_default(),
                r.reason.as_ref().map(Words::message).unwrap_or_default(),
                r.winding_5.map(|w| format!("{w:.4}")).unwrap_or_default(),
                r.winding_7.map(|w| format!("{w:.4}")).unwrap_or_default(),
                r.min_leakage_pitch
                    .map(|p| p.to_string())
                    .unwrap_or_default(),
                r.min_leakage.map(|w| format!("{w:.5}")).unwrap_or_default(),
            ]);
        }
        t
    }
}

/// The survey table for a terminal: the reason column is left to JSON/CSV so lines stay
/// within 80 columns.
fn text_table(report: &SurveyReport) -> Table {
    {
        let mut t = report.main_table();
        t.headers.pop();
        t.align.pop();
        for (h, short) in t
            .headers
            .iter_mut()
            .zip(["Z", "2p", "L", "ok", "q", "span"])
        {
            *h = short.to_string();
        }
        for r in &mut t.rows {
            r.pop();
        }
        t
    }
}
