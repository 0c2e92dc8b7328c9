//! The audit's findings in shop words: the one place their facts become sentences, for the
//! text, JSON (`message`), CSV and HTML presenters alike.

use super::{Say, Words, worded};
use std::fmt;

use crate::audit::{CoilAt, Fact, Finding, PathMove};
use crate::numbering::{num, ranges};

impl Words for Finding {
    /// What is wrong and what to change, for the winder.
    fn message(&self) -> String {
        words(&self.detail)
    }
}

/// What the search does not try, for the finding that says where it stopped.
fn not_searched() -> String {
    format!(
        "three or more edits; parts of coil runs longer than {} coils (only their polarity \
         runs and the whole run); a coil laid in wrong slots when no slot is overfilled; turns \
         miscounted",
        crate::audit::search::MAX_RUN
    )
}

fn coil(c: &CoilAt) -> String {
    format!(
        "coil {} (phase {}, in at slot {}, out at slot {})",
        c.coil, c.phase, c.go, c.back
    )
}

fn path_move(m: &PathMove) -> String {
    match &m.coil {
        Some(c) => format!(
            "{} is in path {} but belongs in path {}",
            coil(c),
            m.from,
            m.to
        ),
        None => format!(
            "the coil group of coils {} (slots {}) is in path {} but belongs in path {}",
            ranges(&m.coils),
            ranges(&m.slots),
            m.from,
            m.to
        ),
    }
}

/// A finding's facts in words: each group of facts has its own function.
pub fn words(f: &Fact) -> String {
    match f {
        Fact::ReversedCoil { .. }
        | Fact::ReversedGroup { .. }
        | Fact::WrongPhase { .. }
        | Fact::ReversedPhase { .. }
        | Fact::LeadsSwapped { .. }
        | Fact::CoilsSwapped { .. }
        | Fact::GroupWrongPhase { .. }
        | Fact::CoilWrongSlots { .. } => connection_words(f),
        Fact::PathMoves { .. } | Fact::PathDiffers { .. } => path_words(f),
        Fact::EmptySlots { .. }
        | Fact::OverfilledSlots { .. }
        | Fact::OtherWindingsSlots { .. }
        | Fact::TurnsDiffer { .. }
        | Fact::SpanDiffers { .. } => slot_words(f),
        Fact::NoFundamental
        | Fact::Unbalanced { .. }
        | Fact::UnbalancedAtOtherSpeed { .. }
        | Fact::MeasuredResistance { .. }
        | Fact::SixLeadReadings { .. } => balance_words(f),
        Fact::CoresDiffer { .. }
        | Fact::DiffersFromDesign { .. }
        | Fact::MissingFromRecord { .. } => design_words(f),
    }
}

/// The words of the connection faults: coils, groups, phases and leads reversed, swapped or in the wrong phase or slots.
fn connection_words(f: &Fact) -> String {
    match f {
        Fact::ReversedCoil { coil: c } => format!(
            "{} is connected backwards: reconnect it so that current enters at slot {} and \
             leaves at slot {}",
            coil(c),
            c.back,
            c.go
        ),
        Fact::ReversedGroup {
            coils,
            phase,
            slots,
        } => format!(
            "the coil group of coils {} (phase {phase}, slots {}) is connected backwards: swap \
             the two jumpers at the ends of the group",
            ranges(coils),
            ranges(slots)
        ),
        Fact::WrongPhase {
            coil: c,
            from,
            to,
            reversed,
        } => format!(
            "{} is connected into phase {from} but belongs in phase {to}{}",
            coil(c),
            if *reversed {
                format!(", the other way round (current in at slot {})", c.back)
            } else {
                String::new()
            }
        ),
        Fact::ReversedPhase { phase: l, leads } => format!(
            "phase {l} is wound or connected backwards (its EMF is 180° from where it \
             belongs): swap its leads {} and {}",
            leads[0], leads[1]
        ),
        Fact::LeadsSwapped {
            a,
            b,
            a_leads,
            b_leads,
        } => format!(
            "the leads of phases {a} and {b} are exchanged, so the phase sequence is reversed \
             and the field runs the other way: exchanging any two supply leads reverses it \
             again, and exchanging {} with {} and {} with {} restores the recorded phase \
             order as well",
            a_leads[0], b_leads[0], a_leads[1], b_leads[1]
        ),
        Fact::CoilsSwapped {
            a,
            b,
            phase_a,
            phase_b,
        } => format!(
            "{} and {} are swapped between phases {phase_a} and {phase_b}: exchange their \
             connections",
            coil(a),
            coil(b)
        ),
        Fact::GroupWrongPhase {
            coils,
            slots,
            from,
            to,
            reversed,
        } => format!(
            "the coil group of coils {} (slots {}) is connected into phase {from} but belongs \
             in phase {to}{}: move its two jumpers to phase {to}",
            ranges(coils),
            ranges(slots),
            if *reversed {
                ", the other way round"
            } else {
                ""
            },
        ),
        Fact::CoilWrongSlots {
            coil: c,
            span,
            should_span,
            overfilled,
            short,
            go,
            back,
        } => format!(
            "{}{} lies in the wrong slots: slots {} hold too many coil sides while slots {} \
             are short. It belongs in at slot {go}, out at slot {back}{}; check the record, \
             then the coil",
            coil(c),
            if span != should_span {
                format!(" spans {span} where it should span {should_span}, so it")
            } else {
                String::new()
            },
            ranges(overfilled),
            ranges(short),
            if span != should_span {
                " (a slot number was probably recorded wrong)"
            } else {
                ""
            },
        ),
        // `words` sends only this group's facts here.
        _ => String::new(),
    }
}

/// The words of the parallel paths.
fn path_words(f: &Fact) -> String {
    match f {
        Fact::PathMoves { phase, moves } => format!(
            "the parallel paths of phase {phase} do not match, so a current circulates between \
             them: {}",
            moves.iter().map(path_move).collect::<Vec<_>>().join("; ")
        ),
        Fact::PathDiffers {
            phase,
            path,
            turns,
            magnitude,
            angle_deg,
            circulating_percent,
        } => format!(
            "path {path} of phase {phase} does not match its siblings ({turns} turns, EMF {} at \
             {}°): a circulating EMF of {}% of the path EMF drives a current around the \
             parallel loop; check the coils of this path",
            num(*magnitude, 3),
            num(*angle_deg, 1),
            num(*circulating_percent, 2)
        ),
        // `words` sends only this group's facts here.
        _ => String::new(),
    }
}

/// The words of the slots' contents: empty or overfilled slots, turns and spans.
fn slot_words(f: &Fact) -> String {
    match f {
        Fact::EmptySlots {
            empty,
            partly_filled,
        } => {
            let mut parts = Vec::new();
            if !empty.is_empty() {
                parts.push(format!("slots {} hold no coil side", ranges(empty)));
            }
            if !partly_filled.is_empty() {
                parts.push(format!(
                    "slots {} have a layer left empty",
                    ranges(partly_filled)
                ));
            }
            format!(
                "{}: a coil is missing from the record or was laid in another slot",
                parts.join("; ")
            )
        }
        Fact::OverfilledSlots {
            slots,
            layers,
            coils,
        } => format!(
            "slots {} hold more coil sides than the {} of the winding; coils {} \
             have a side there: check their slot numbers",
            ranges(slots),
            crate::numbering::count(*layers, "layer", "layers"),
            ranges(coils)
        ),
        Fact::OtherWindingsSlots { slots, coils } => format!(
            "slots {} are the other winding's (the two share the core by slots, each in every \
             other slot); {} {} a side there: check {} slot numbers, or whether the two \
             windings' tables are the other way round",
            ranges(slots),
            if coils.len() == 1 { "coil" } else { "coils" },
            if coils.len() == 1 {
                format!("{} has", ranges(coils))
            } else {
                format!("{} have", ranges(coils))
            },
            if coils.len() == 1 { "its" } else { "their" }
        ),
        Fact::TurnsDiffer {
            coils,
            usual,
            explains_unbalance,
        } => format!(
            "{} {} a turn count other than the {usual} turns of the rest{}; check the record, \
             or rewind {} to {usual} turns",
            if coils.len() == 1 { "coil" } else { "coils" },
            if coils.len() == 1 {
                format!("{} has", ranges(coils))
            } else {
                format!("{} have", ranges(coils))
            },
            if *explains_unbalance {
                ": that alone unbalances the phases, and at the usual turns they balance"
            } else {
                ""
            },
            if coils.len() == 1 { "it" } else { "them" }
        ),
        Fact::SpanDiffers {
            coil,
            span,
            usual,
            go,
            back,
        } => format!(
            "coil {coil} spans {span} where the others of its group span {usual}: a slot \
             number was probably recorded wrong (in at slot {go}, out at slot {back})"
        ),
        // `words` sends only this group's facts here.
        _ => String::new(),
    }
}

/// The words of the balance and the measured resistances.
fn balance_words(f: &Fact) -> String {
    match f {
        Fact::SixLeadReadings {
            temperature_c,
            worst_percent,
            tolerance_percent,
            exchanged,
        } => {
            let head = format!(
                "the readings between the six leads at {} C are up to {} % from the card's \
                 (tolerance {} %)",
                num(*temperature_c, 1),
                num(*worst_percent, 1),
                num(*tolerance_percent, 0)
            );
            let pairs: Vec<String> = exchanged
                .iter()
                .map(|[a, b]| format!("{a} and {b}"))
                .collect();
            match pairs.as_slice() {
                [] => format!(
                    "{head}, and no exchange of two leads' markings explains them: check \
                     each half for an open circuit, shorted turns or wrong turns"
                ),
                [one] => format!(
                    "{head}; they agree with the markings of {one} exchanged: a half is \
                     brought out on the wrong lead. Trace the two leads to their halves and \
                     mark them again before connecting either speed"
                ),
                more => format!(
                    "{head}; they agree with any one of these markings exchanged: {}. Trace \
                     the leads to their halves and mark them again before connecting",
                    more.join("; ")
                ),
            }
        }
        Fact::NoFundamental => "no fundamental EMF: the coil groups are not connected \
                                alternately (every other group must be reversed), or the \
                                coils were recorded in one direction; check the group \
                                connections against the connection sheet"
            .into(),
        Fact::UnbalancedAtOtherSpeed {
            poles,
            after_fix,
            minor_wave_percent,
            spread_percent,
        } => format!(
            "{} not at {poles} poles, the other speed (the other rotating wave {}% of the \
             working one, magnitudes spread {}%): a coil or group sits where the halves in \
             series do not repeat at the higher pole count; compare the record with the \
             design slot by slot (audit --intended)",
            if *after_fix {
                "with the fix above made, balanced as laid out but"
            } else {
                "balanced as laid out but"
            },
            num(*minor_wave_percent, 2),
            num(*spread_percent, 2),
        ),
        Fact::Unbalanced {
            backward_percent,
            spread_percent,
            swap_reach,
            truncated,
        } => format!(
            "the phases are unbalanced (backward field {}% of forward, magnitudes spread {}%) \
             and no change of up to two edits balances them. Searched: reversing a coil, a \
             group or a phase; moving a coil or a group to another phase; two coils swapped \
             between phases{}; a coil from an overfilled slot laid in a slot with room; two \
             leads exchanged{}. Not searched: {}. Compare the record with the design slot by \
             slot (audit --intended)",
            num(*backward_percent, 2),
            num(*spread_percent, 2),
            swap_reach
                .map(|r| format!(" (up to {r} slots apart)"))
                .unwrap_or_default(),
            if *truncated {
                " (the search of pairs of edits was cut short on this record)"
            } else {
                ""
            },
            not_searched()
        ),
        Fact::MeasuredResistance {
            taken,
            measured_ohm,
            temperature_c,
            deviation_percent,
            tolerance_percent,
            ratio_to_expected,
            outside,
            suggestion,
        } => {
            let read = match (taken, measured_ohm) {
                (crate::card::measured::Taken::LineToLine, Some(m)) => format!(
                    "line-to-line readings {} ohm at {} C (up to {}% from their mean)",
                    m.map(|x| num(x, 4)).join(", "),
                    num(*temperature_c, 1),
                    num(*deviation_percent, 2)
                ),
                _ => format!(
                    "section readings at {} C (up to {}% from their mean)",
                    num(*temperature_c, 1),
                    num(*deviation_percent, 2)
                ),
            };
            let apart = outside
                .iter()
                .map(|j| {
                    format!(
                        "{} {} ohm at 20 C, {:+.1}% against the median of its kind",
                        if j.between == j.phase {
                            format!("phase {}", j.phase)
                        } else {
                            j.between.clone()
                        },
                        num(j.measured_20c_ohm, 4),
                        j.deviation_percent
                    )
                })
                .collect::<Vec<_>>()
                .join("; ");
            format!(
                "{read}{}{}; {}",
                if apart.is_empty() {
                    String::new()
                } else {
                    format!(": {apart} (tolerance {}% each)", num(*tolerance_percent, 1))
                },
                ratio_to_expected
                    .map(|q| format!(", their mean is {}% of the card's", num(q * 100.0, 1)))
                    .unwrap_or_default(),
                suggestion.message()
            )
        }
        // `words` sends only this group's facts here.
        _ => String::new(),
    }
}

/// The words of the comparison with the intended design.
fn design_words(f: &Fact) -> String {
    match f {
        Fact::CoresDiffer {
            design_slots,
            record_slots,
        } => format!(
            "the intended design has {design_slots} slots and the record {record_slots}: they \
             are not the same core"
        ),
        Fact::DiffersFromDesign {
            coil: c,
            path,
            matched,
            phase,
            go,
            belongs_in_path,
        } => {
            let here = format!(
                "coil {} (phase {}, in at slot {}, out at slot {}, path {path})",
                c.coil, c.phase, c.go, c.back
            );
            if !matched {
                return format!("{here} has no coil in the same slots in the intended design");
            }
            let mut what = Vec::new();
            if let Some(p) = phase {
                what.push(format!("it belongs in phase {p}"));
            }
            if let Some(g) = go {
                what.push(format!("it is reversed: current should enter at slot {g}"));
            }
            if let Some(p) = belongs_in_path {
                what.push(format!("it belongs in path {p}"));
            }
            format!(
                "{here} differs from the intended design: {}",
                what.join("; ")
            )
        }
        Fact::MissingFromRecord { phase, go, back } => format!(
            "the intended design has a coil of phase {phase} in at slot {go} and out at slot \
             {back} that the record lacks"
        ),
        // `words` sends only this group's facts here.
        _ => String::new(),
    }
}

impl fmt::Display for Say<'_, crate::audit::Travel> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let starts: Vec<String> = match &self.0.line_leads {
            Some(leads) => leads.clone(),
            None => self.0.starts.iter().map(|l| format!("{l}1")).collect(),
        };
        let kind = match self.0.topology {
            crate::winding::Topology::Rotary => "the field rotates",
            crate::winding::Topology::Linear => "the field travels",
        };
        write!(
            f,
            "with supply lines 1, 2, 3... on {}, {kind} ",
            starts.join(", ")
        )?;
        match self.0.sequence {
            crate::winding::star::Sequence::Positive => write!(
                f,
                "towards rising slot numbers (slot 1 towards slot {})",
                self.0.slots
            ),
            crate::winding::star::Sequence::Negative => write!(
                f,
                "towards falling slot numbers (slot {} towards slot 1)",
                self.0.slots
            ),
        }
    }
}

worded!(crate::audit::Travel);
