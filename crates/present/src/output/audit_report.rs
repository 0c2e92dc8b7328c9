//! How the audit and rewind reports read as text and CSV.

use super::reports::{paragraph, ranges};
use super::{Align, Report, Section, Table, num};
use crate::audit::{AuditReport, Sequence};
use crate::card::measured::Taken;
use crate::numbering::sig;
use crate::output::Words;
use crate::rewind::{DesignSide, RewindReport};
use itertools::Itertools;

/// The measured resistances against the card, when readings were given.
fn resistance_sections(a: &AuditReport, s: &mut Vec<Section>) {
    if let Some(r) = &a.resistance {
        s.push(Section::Heading(format!(
            "Measured resistance at {} C against the data card",
            num(r.temperature_c, 1)
        )));
        if let Some(m) = r.measured_ohm {
            let mut t = Table::new(&[
                ("terminals", Align::Left),
                ("measured ohm", Align::Right),
                ("expected ohm", Align::Right),
                ("from mean %", Align::Right),
            ]);
            let mean = m.iter().sum::<f64>() / 3.0;
            for (k, pair) in ["1-2", "2-3", "3-1"].iter().enumerate() {
                t.push(vec![
                    pair.to_string(),
                    sig(m[k], 4),
                    r.expected_ohm.map_or("-".into(), |e| sig(e[k], 4)),
                    num((m[k] / mean - 1.0) * 100.0, 2),
                ]);
            }
            s.push(Section::Table(t));
        }
        s.push(Section::Lines(vec![format!(
            "{} at 20 C, each against the median of its kind (tolerance +/-{}%):",
            match r.taken {
                Taken::LineToLine => "Phase resistances worked back from the readings",
                Taken::Sections => "Section resistances as read across their leads",
            },
            num(r.tolerance_percent, 1)
        )]));
        let mut t = Table::new(&[
            ("phase", Align::Left),
            ("section", Align::Right),
            ("measured across", Align::Left),
            ("ohm at 20 C", Align::Right),
            ("card ohm", Align::Right),
            ("from median %", Align::Right),
            ("verdict", Align::Left),
        ]);
        for j in &r.judged {
            t.push(vec![
                j.phase.clone(),
                j.section.to_string(),
                j.between.clone(),
                sig(j.measured_20c_ohm, 4),
                j.expected_20c_ohm.map_or("-".into(), |e| sig(e, 4)),
                format!("{:+.2}", j.deviation_percent),
                if j.within_tolerance { "ok" } else { "OUTSIDE" }.into(),
            ]);
        }
        s.push(Section::Table(t));
        s.push(Section::Lines(vec![paragraph(&r.suggestion.message())]));
    }
}

/// The phases' EMFs and effective turns, and the parallel paths.
fn winding_sections(a: &AuditReport, s: &mut Vec<Section>) {
    s.push(Section::Heading(
        "Phase EMFs (effective turns N_ph*k_w; angle error from 360/m spacing)".into(),
    ));
    let orders: Vec<f64> = a
        .phases
        .first()
        .map(|p| p.harmonics.iter().map(|h| h.order.get()).collect())
        .unwrap_or_default();
    let mut cols: Vec<(String, Align)> = vec![
        ("phase".into(), Align::Left),
        ("coils".into(), Align::Right),
        ("N_ph".into(), Align::Right),
        ("magnitude".into(), Align::Right),
        ("angle deg".into(), Align::Right),
        ("error deg".into(), Align::Right),
    ];
    cols.extend(
        orders
            .iter()
            .map(|o| (format!("order {}", num(*o, 3)), Align::Right)),
    );
    let refs: Vec<(&str, Align)> = cols.iter().map(|(h, a)| (h.as_str(), *a)).collect();
    let mut t = Table::new(&refs);
    for p in &a.phases {
        let mut row = vec![
            p.phase.clone(),
            p.coils.to_string(),
            num(p.series_turns, 2),
            num(p.magnitude, 3),
            num(p.angle_deg, 2),
            num(p.angle_error_deg, 2),
        ];
        row.extend(p.harmonics.iter().map(|h| num(h.magnitude, 3)));
        t.push(row);
    }
    s.push(Section::Table(t));

    if !a.paths.is_empty() {
        s.push(Section::Heading(
            "Parallel paths (circulating EMF against the mean of the phase's paths)".into(),
        ));
        let mut t = Table::new(&[
            ("phase", Align::Left),
            ("path", Align::Right),
            ("turns", Align::Right),
            ("magnitude", Align::Right),
            ("angle deg", Align::Right),
            ("circulating", Align::Right),
            ("%", Align::Right),
            ("coils", Align::Left),
        ]);
        for p in &a.paths {
            t.push(vec![
                p.phase.clone(),
                p.path.to_string(),
                p.turns.to_string(),
                num(p.magnitude, 3),
                num(p.angle_deg, 2),
                num(p.circulating_emf, 3),
                num(p.circulating_percent, 2),
                ranges(&p.coils),
            ]);
        }
        s.push(Section::Table(t));
    }
}

/// The slots' fill, and the slots that differ from the intended design.
fn slot_sections(a: &AuditReport, s: &mut Vec<Section>) {
    let sc = &a.slot_check;
    let mut lines = Vec::new();
    for (what, v) in [
        ("empty slots", &sc.empty),
        ("slots with a layer empty", &sc.partly_filled),
        ("overfilled slots", &sc.overfilled),
        (
            "the other winding's slots holding a side",
            &sc.other_windings,
        ),
        (
            "half-filled end slots (by design)",
            &sc.half_filled_by_design,
        ),
    ] {
        if !v.is_empty() {
            lines.push(format!("{what}: {}", ranges(v)));
        }
    }
    if lines.is_empty() {
        lines.push("every slot holds its full number of coil sides".into());
    }
    s.push(Section::Heading("Slot fill".into()));
    s.push(Section::Lines(lines));

    if let Some(c) = &a.intended {
        s.push(Section::Heading(
            "Slots that differ from the intended design".into(),
        ));
        if c.slot_differences.is_empty() {
            s.push(Section::Lines(vec!["none".into()]));
        } else {
            let mut t = Table::new(&[
                ("slot", Align::Right),
                ("found", Align::Left),
                ("intended", Align::Left),
            ]);
            for d in &c.slot_differences {
                t.push(vec![
                    d.slot.to_string(),
                    d.found.join(" "),
                    d.intended.join(" "),
                ]);
            }
            s.push(Section::Table(t));
        }
    }
}

impl Report for AuditReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::AuditJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = Vec::new();
        s.push(Section::Heading(
            self.title.clone().unwrap_or_else(|| "Winding audit".into()),
        ));
        s.push(Section::Design(super::design_lines(&self.design)));
        let verdict = if self.sound {
            "SOUND: no findings".to_string()
        } else {
            format!(
                "NOT SOUND: {}",
                crate::numbering::count(self.findings.len(), "finding", "findings")
            )
        };
        let mut head = vec![
            verdict,
            format!(
                "phases balanced: {}; phase sequence {}",
                if self.balanced { "yes" } else { "NO" },
                match self.sequence {
                    Sequence::Positive => "positive",
                    Sequence::Negative => "NEGATIVE",
                },
            ),
        ];
        head.push(paragraph(&self.travel.message()));
        let waves = if self.no_fundamental {
            "no fundamental EMF: the phases make no working wave, so no ratio or angle \
             applies"
                .to_string()
        } else if self.sequence == Sequence::Negative {
            format!(
                "the field runs backwards (the phase sequence is reversed): the forward wave is \
                 {}% of the backward one, zero sequence {}% of it, magnitudes spread {}%",
                num(100.0 * self.forward / self.backward.max(1e-300), 2),
                num(self.zero_sequence_percent, 2),
                num(self.magnitude_spread_percent, 2)
            )
        } else {
            format!(
                "backward field {}% of forward, zero sequence {}%, magnitudes spread {}%, \
                 largest angle error {} deg",
                num(self.backward_percent, 2),
                num(self.zero_sequence_percent, 2),
                num(self.magnitude_spread_percent, 2),
                num(self.max_angle_error_deg, 2)
            )
        };
        head.push(paragraph(&waves));
        if let Some(o) = &self.other_speed {
            head.push(paragraph(&format!(
                "at {} poles, the other speed (halves in series{}): balanced {}; sequence {}; \
                 the other rotating wave {}% of the working one, magnitudes spread {}%",
                o.poles,
                if o.after_fix {
                    ", with the fix made"
                } else {
                    ""
                },
                if o.balanced { "yes" } else { "NO" },
                match o.sequence {
                    Sequence::Positive => "positive",
                    Sequence::Negative =>
                        "negative, as consequent poles give it (the standard boards allow for \
                         it)",
                },
                num(o.minor_wave_percent, 2),
                num(o.magnitude_spread_percent, 2),
            )));
        }
        if self.fix_edits > 0 {
            head.push(format!(
                "smallest fix: {}{}",
                crate::numbering::count(self.fix_edits, "edit", "edits"),
                if self.other_fixes > 0 {
                    format!(
                        " ({} other fix(es) of that size; the most regular is shown)",
                        self.other_fixes
                    )
                } else {
                    String::new()
                }
            ));
        }
        s.push(Section::Lines(head));
        s.push(super::caution());

        s.push(Section::Heading("Findings".into()));
        if self.findings.is_empty() {
            s.push(Section::Lines(vec!["none".into()]));
        } else {
            let mut lines = Vec::new();
            for (n, f) in self.findings.iter().enumerate() {
                let kind = serde_json::to_value(f.kind)
                    .ok()
                    .and_then(|v| v.as_str().map(|s| s.replace('_', " ")))
                    .unwrap_or_default();
                lines.push(paragraph(&format!("{}. [{kind}] {}", n + 1, f.message())));
            }
            s.push(Section::Items(lines));
        }

        resistance_sections(self, &mut s);
        winding_sections(self, &mut s);
        slot_sections(self, &mut s);
        s
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("finding", Align::Right),
            ("kind", Align::Left),
            ("coils", Align::Left),
            ("slots", Align::Left),
            ("phases", Align::Left),
            ("message", Align::Left),
        ]);
        for (n, f) in self.findings.iter().enumerate() {
            let kind = serde_json::to_value(f.kind)
                .ok()
                .and_then(|v| v.as_str().map(String::from))
                .unwrap_or_default();
            t.push(vec![
                (n + 1).to_string(),
                kind,
                f.coils.iter().join(" "),
                f.slots.iter().join(" "),
                f.phases.join(" "),
                f.message(),
            ]);
        }
        t
    }
}

/// A bare number (its unit is in the row's label, so spreadsheets get numbers), or "-".
fn opt(x: Option<f64>, digits: usize) -> String {
    x.map(|v| num(v, digits)).unwrap_or_else(|| "-".into())
}

fn design_rows(t: &mut Table, o: &DesignSide, n: &DesignSide) {
    let row = |t: &mut Table, what: &str, a: String, b: String| t.push(vec![what.into(), a, b]);
    row(t, "poles", o.poles.to_string(), n.poles.to_string());
    row(t, "layers", o.layers.to_string(), n.layers.to_string());
    row(
        t,
        "span (slot pitches)",
        o.span.to_string(),
        n.span.to_string(),
    );
    row(
        t,
        "connection",
        o.connection.to_string(),
        n.connection.to_string(),
    );
    row(
        t,
        "parallel paths",
        o.parallel_paths.to_string(),
        n.parallel_paths.to_string(),
    );
    row(
        t,
        "coils per phase",
        o.coils_per_phase.to_string(),
        n.coils_per_phase.to_string(),
    );
    row(
        t,
        "turns per coil",
        num(o.turns_per_coil, 3),
        num(n.turns_per_coil, 3),
    );
    row(
        t,
        "series turns per phase",
        num(o.series_turns, 3),
        num(n.series_turns, 3),
    );
    row(
        t,
        "conductors per slot",
        num(o.conductors_per_slot, 3),
        num(n.conductors_per_slot, 3),
    );
    row(
        t,
        "winding factor k_w1",
        num(o.winding_factor, 4),
        num(n.winding_factor, 4),
    );
    row(
        t,
        "line voltage, V",
        opt(o.line_voltage_v, 1),
        opt(n.line_voltage_v, 1),
    );
    row(
        t,
        "phase voltage, V",
        opt(o.phase_voltage_v, 1),
        opt(n.phase_voltage_v, 1),
    );
    row(
        t,
        "frequency, Hz",
        opt(o.frequency_hz, 2),
        opt(n.frequency_hz, 2),
    );
}

impl Report for RewindReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::RewindJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let labelled = |label: &str, h: &crate::header::DesignHeader| {
            super::design_lines(h)
                .into_iter()
                .enumerate()
                .map(|(i, l)| {
                    if i == 0 {
                        format!("{label} {l}")
                    } else {
                        format!("{:w$} {l}", "", w = label.chars().count())
                    }
                })
                .collect::<Vec<_>>()
        };
        let mut s = vec![
            Section::Heading("Rewind: turns for the same flux density".into()),
            Section::Design(labelled("old:", &self.old_design)),
            Section::Design(labelled("new:", &self.new_design)),
        ];
        let mut head = vec![
            format!(
                "turns per coil: {} exact, wind {} (flux {}{}% from rounding)",
                num(self.turns_per_coil_exact, 3),
                self.turns_per_coil,
                if self.flux_change_percent >= 0.0 {
                    "+"
                } else {
                    ""
                },
                num(self.flux_change_percent, 2)
            ),
            format!(
                "ratios new/old: phase voltage {}, frequency {}, k_w1 {}, pole pitch {}",
                num(self.voltage_ratio, 4),
                num(self.frequency_ratio, 4),
                num(self.winding_factor_ratio, 4),
                num(self.pole_pitch_ratio, 4)
            ),
        ];
        if let Some(phi) = self.flux_per_pole_wb {
            head.push(format!(
                "old flux per pole {} mWb{}",
                num(crate::units::in_milli(phi), 3),
                self.peak_flux_density_t
                    .map(|b| format!(", peak air-gap flux density {} T", num(b, 3)))
                    .unwrap_or_default()
            ));
        }
        for a in &self.assumptions {
            head.push(format!("assumed: {}", a.message()));
        }
        s.push(Section::Lines(head));
        s.push(super::caution());
        s.push(Section::Heading("Old and new design".into()));
        s.push(Section::Table(self.main_table()));
        for (label, l) in [
            ("Old winding on the core", &self.old_loading),
            ("New winding on the core", &self.new_loading),
        ] {
            if let Some(l) = l {
                s.push(Section::Heading(format!("{label}: loadings")));
                s.push(Section::Table(super::loading_table(l)));
                for w in &l.warnings {
                    s.push(Section::Lines(vec![paragraph(&format!(
                        "WARNING: {}",
                        w.message()
                    ))]));
                }
            }
        }
        if let Some(c) = &self.conductor {
            s.push(Section::Heading(
                "Conductor (same copper per slot, so the same current density)".into(),
            ));
            let mut lines = vec![
                format!(
                    "old: {} x {} mm2{}",
                    c.wires_in_hand,
                    num(c.old_area.mm2(), 4),
                    c.old_diameter
                        .map(|d| format!(" ({} mm bare diameter)", num(d.mm(), 3)))
                        .unwrap_or_default()
                ),
                format!(
                    "new: {} mm2 copper per conductor; current per conductor x{}, phase \
                     current x{}{}",
                    num(c.new_conductor_area.mm2(), 4),
                    num(c.conductor_current_ratio, 4),
                    num(c.phase_current_ratio, 4),
                    c.power_ratio
                        .map(|p| format!(", rating x{}", num(p, 4)))
                        .unwrap_or_default()
                ),
            ];
            lines.push(
                c.options
                    .iter()
                    .map(|o| {
                        format!(
                            "{} in hand: {} mm",
                            o.wires_in_hand,
                            num(o.diameter.mm(), 3)
                        )
                    })
                    .join("; "),
            );
            if let Some(i) = c.new_line_current_a {
                lines.push(format!("new rated line current: {} A", num(i, 2)));
            }
            s.push(Section::Lines(lines.iter().map(|l| paragraph(l)).collect()));
            let mut t = Table::new(&[
                ("series", Align::Left),
                ("in hand", Align::Right),
                ("bare mm", Align::Right),
                ("AWG", Align::Right),
                ("copper vs wanted %", Align::Right),
                ("slot fill %", Align::Right),
                ("fits", Align::Left),
            ]);
            for (series, list) in [("IEC 60317", &c.standard_metric), ("AWG", &c.standard_awg)] {
                for o in list.iter() {
                    t.push(vec![
                        series.into(),
                        o.wire.strands_in_hand.to_string(),
                        num(o.wire.diameter.mm(), 4),
                        o.wire.awg.map_or("-".into(), |n| n.to_string()),
                        num((o.wire.area_ratio - 1.0) * 100.0, 1),
                        o.slot_fill.map_or("-".into(), |f| num(f * 100.0, 1)),
                        if o.fits { "yes".into() } else { "NO".into() },
                    ]);
                }
            }
            s.push(Section::Heading(
                "Standard wire for the new conductor".into(),
            ));
            s.push(Section::Table(t));
        }
        super::with_warnings(s, &self.warnings)
    }

    fn main_table(&self) -> Table {
        let mut t = Table::new(&[
            ("quantity", Align::Left),
            ("old", Align::Right),
            ("new", Align::Right),
        ]);
        design_rows(&mut t, &self.old, &self.new);
        t
    }
}
