//! How the two speeds of a pole-changing winding read.

use schemars::JsonSchema;
use serde::Serialize;

use super::json::Opening;
use super::reports::paragraph;
use super::{Align, Report, Section, Table, num};
use crate::speeds::{Duty, Joined, Speed, SpeedsReport};
use crate::winding::star::Sequence;

/// `speeds --format json`.
#[derive(Serialize, JsonSchema)]
pub struct SpeedsJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a SpeedsReport,
}

/// How the phases are joined at one speed, in words.
pub(crate) fn joined(j: Joined) -> &'static str {
    match j {
        Joined::SeriesDelta => "series delta",
        Joined::SeriesStar => "series star",
        Joined::DoubleStar => "double star",
    }
}

/// The standards' name of a connection, in words.
pub(crate) fn duty_words(d: Duty) -> &'static str {
    match d {
        Duty::ConstantTorque => "constant torque",
        Duty::VariableTorque => "variable torque",
    }
}

/// A pole-changing connection's name in words: "delta / double star", "star / double star".
pub(crate) fn connection_words(pc: crate::design::PoleChange) -> &'static str {
    match pc {
        crate::design::PoleChange::DeltaDoubleStar => "delta / double star",
        crate::design::PoleChange::StarDoubleStar => "star / double star",
    }
}

fn sequence(s: Option<Sequence>) -> &'static str {
    match s {
        Some(Sequence::Positive) => "positive",
        Some(Sequence::Negative) => "negative",
        None => "-",
    }
}

fn waves(s: &Speed, label: &str) -> Table {
    let mut t = Table::new(&[
        ("order", Align::Right),
        ("forward %", Align::Right),
        ("backward %", Align::Right),
    ]);
    for r in s.rows.iter().filter(|r| r.forward.max(r.backward) >= 0.005) {
        t.push(vec![
            num(r.order.get(), 3),
            num(100.0 * r.forward, 2),
            num(100.0 * r.backward, 2),
        ]);
    }
    t.headers[0] = format!("order at {label}");
    t
}

impl Report for SpeedsReport {
    fn json(&self) -> impl Serialize + '_ {
        SpeedsJson {
            opening: Opening::default(),
            report: self,
        }
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::from(super::opening("Two speeds from one winding", &self.design));
        let (lo, hi) = (&self.low_speed, &self.high_speed);
        let duty = duty_words(self.duty);
        let mut lines = vec![paragraph(&format!(
            "pole-changing by consequent poles: {} poles ({}) and {} poles ({}), the {} \
             connection by the standards' naming",
            lo.poles,
            joined(lo.joined),
            hi.poles,
            joined(hi.joined),
            duty
        ))];
        lines.push(paragraph(&format!(
            "mean gap flux density at {} poles is {} times that at {} poles, at the same line \
             voltage and frequency (from k_w1 and the connection); choose the turns for the \
             speed whose density is higher",
            lo.poles,
            num(self.flux_ratio, 3),
            hi.poles
        )));
        s.push(Section::Lines(lines));
        s.push(Section::Table(self.main_table()));
        s.push(Section::Heading("Connections".into()));
        let mut t = Table::new(&[
            ("poles", Align::Right),
            ("L1", Align::Left),
            ("L2", Align::Left),
            ("L3", Align::Left),
            ("join together", Align::Left),
            ("leave open, insulated", Align::Left),
        ]);
        for c in &self.connections {
            let mut row = vec![c.poles.to_string()];
            row.extend(c.lines.iter().map(|l| l.lead.clone()));
            row.push(c.joined.join(" + "));
            row.push(c.open.join(", "));
            t.push(row);
        }
        s.push(Section::Table(t));
        if let Some(c) = self.connections.iter().find(|c| c.lines_exchanged) {
            s.push(Section::Lines(vec![paragraph(&format!(
                "at {} poles two supply lines are exchanged, as above, for both speeds to turn \
                 the same way",
                c.poles
            ))]));
        } else if let Some(c) = self.connections.first() {
            s.push(Section::Lines(vec![paragraph(&format!(
                "with L1, L2, L3 in order as above, both speeds turn the field the same way \
                 (towards {} slot numbers): the lower speed's phase sequence is reversed by \
                 nature (every angle doubles) and the higher speed's table feeds the taps in \
                 the order that matches it; to reverse the motor, exchange the same two \
                 lines at both speeds",
                if c.towards_rising_slots {
                    "rising"
                } else {
                    "falling"
                }
            ))]));
        }
        if !self.spans.is_empty() {
            s.push(Section::Heading("Spans at both speeds".into()));
            let mut t = Table::new(&[
                ("span", Align::Right),
                ("k_w1 lower speed", Align::Right),
                ("k_w1 higher speed", Align::Right),
                ("smaller", Align::Right),
                ("order 2 % lower speed", Align::Right),
                ("flux ratio", Align::Right),
                ("note", Align::Left),
            ]);
            for sp in &self.spans {
                let mut marks = Vec::new();
                if self.best_span == Some(sp.span) {
                    marks.push("best");
                }
                if sp.span == self.design.pitch {
                    marks.push("this layout");
                }
                t.push(vec![
                    sp.span.to_string(),
                    num(sp.low_speed_winding_factor, 4),
                    num(sp.high_speed_winding_factor, 4),
                    num(sp.smaller, 4),
                    num(sp.low_speed_second_percent, 2),
                    sp.flux_ratio.map_or("-".into(), |r| num(r, 3)),
                    marks.join(", "),
                ]);
            }
            s.push(Section::Table(t));
            s.push(Section::Lines(vec![paragraph(
                "best: the span whose smaller k_w1 is largest, the shorter of equals (our \
                 criterion: the weaker speed sets the turns and the copper); order 2: the \
                 even wave a span off the lower speed's pole pitch leaves (noise and \
                 parasitic torque), weigh it beside k_w1; flux ratio: mean gap flux density \
                 at the lower speed over the higher's",
            )]));
        }
        s.push(Section::Heading("Waves at each speed".into()));
        s.push(Section::Table(waves(lo, &format!("{} poles", lo.poles))));
        s.push(Section::Table(waves(hi, &format!("{} poles", hi.poles))));
        s.push(super::caution());
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("speed", Align::Left),
            ("poles", Align::Right),
            ("joined", Align::Left),
            ("rpm", Align::Right),
            ("k_d", Align::Right),
            ("k_p", Align::Right),
            ("k_w1", Align::Right),
            ("sequence", Align::Left),
            ("series turns", Align::Right),
            ("THD %", Align::Right),
            ("sigma_d %", Align::Right),
        ]);
        for (name, sp) in [("lower", &self.low_speed), ("higher", &self.high_speed)] {
            t.push(vec![
                name.into(),
                sp.poles.to_string(),
                joined(sp.joined).into(),
                sp.synchronous_rpm.map_or(String::new(), |r| num(r, 0)),
                num(sp.fundamental.distribution.abs(), 4),
                num(sp.fundamental.pitch.abs(), 4),
                num(sp.fundamental.winding.abs(), 4),
                sequence(sp.sequence).into(),
                num(sp.series_turns_per_phase, 1),
                num(100.0 * sp.thd, 2),
                num(100.0 * sp.differential_leakage, 3),
            ]);
        }
        t
    }
}

/// `survey --pole-change --format json`.
#[derive(Serialize, JsonSchema)]
pub struct TwoSpeedSurveyJson<'a> {
    #[serde(flatten)]
    opening: Opening,
    #[serde(flatten)]
    report: &'a crate::survey::two_speed::TwoSpeedSurvey,
}

impl Report for crate::survey::two_speed::TwoSpeedSurvey {
    fn json(&self) -> impl Serialize + '_ {
        TwoSpeedSurveyJson {
            opening: Opening::default(),
            report: self,
        }
    }

    fn sections(&self) -> Vec<Section> {
        let fitting = self.rows.iter().filter(|r| r.fits).count();
        vec![
            Section::Heading(format!(
                "Pole-changing survey (one winding, 1:2, consequent poles): {} combinations, \
                 {fitting} fit",
                self.rows.len()
            )),
            Section::Lines(vec![paragraph(
                "poles: lower speed / higher speed; fits: whole slots per pole and phase \
                     at the higher speed's poles, so both counts balance; span: the span whose \
                     smaller k_w1 is largest (the shorter of equals, our criterion); \
                     `beltwright speeds` gives every span of one layout",
            )]),
            Section::Table(self.main_table()),
        ]
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("slots", Align::Right),
            ("poles", Align::Right),
            ("layers", Align::Right),
            ("fits", Align::Left),
            ("span", Align::Right),
            ("k_w1 lower speed", Align::Right),
            ("k_w1 higher speed", Align::Right),
        ]);
        let f = |x: Option<f64>| x.map_or("-".into(), |v| num(v, 4));
        for r in &self.rows {
            t.push(vec![
                r.slots.to_string(),
                format!("{}/{}", r.low_speed_poles, r.poles),
                r.layers.to_string(),
                if r.fits { "yes" } else { "no" }.into(),
                r.best_span.map_or("-".into(), |s| s.to_string()),
                f(r.low_speed_winding_factor),
                f(r.high_speed_winding_factor),
            ]);
        }
        t
    }
}
