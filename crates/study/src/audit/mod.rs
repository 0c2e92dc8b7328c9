//! Audit of an as-found or as-wound coil list: balance, phase sequence, parallel paths, slot
//! fill, and findings that name the coils to fix in shop terms.
//!
//! Phase EMFs are phasor sums of the coil EMFs (star of slots); their symmetrical components
//! (C. L. Fortescue, "Method of symmetrical co-ordinates applied to the solution of polyphase
//! networks", Trans. AIEE 37, 1918) give the forward and backward (negative-sequence) fields.
//! The findings come from [`search()`]: the smallest change, of up to two edits, that restores
//! a balanced positive-sequence winding.

mod compare;
mod facts;
mod paths;
pub mod search;
mod slots;

use num_complex::Complex64;
use serde::Serialize;

use crate::numbering::{CoilNo, PathNo, SlotNo};
use crate::winding::{Elec, Mech, Topology, Winding, coil_groups};

pub use compare::{Comparison, SlotDifference, compare};
pub use facts::{CoilAt, Fact, PathMove};
use paths::paths;
pub use search::{BALANCE_TOL, Edit, Search, apply_fix, search};
pub use slots::{SlotCheck, check_slots};

pub use crate::winding::star::Sequence;

/// What a finding is about, in shop terms.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum FindingKind {
    /// One coil connected the wrong way round.
    ReversedCoil,
    /// A coil group (or part of one) connected the wrong way round.
    ReversedGroup,
    /// A coil connected into the wrong phase.
    WrongPhase,
    /// A whole phase wound or connected backwards (its two leads swapped).
    ReversedPhase,
    /// Two phases' leads exchanged: the phase sequence is reversed.
    LeadsSwapped,
    /// A parallel path whose EMF differs from its siblings'.
    PathMismatch,
    /// Slots with no coil side, or with a layer left empty.
    EmptySlots,
    /// Slots holding more coil sides than the winding has layers.
    OverfilledSlots,
    /// Coils whose turns differ from the rest.
    TurnsDiffer,
    /// The phases are unbalanced and no change of up to two edits restores them.
    Unbalanced,
    /// The record differs from the intended design.
    DiffersFromIntended,
    /// Measured line-to-line resistances unbalanced or far from the data card.
    MeasuredResistance,
    /// The phases have no fundamental EMF: the coil groups are not connected alternately.
    NoFundamental,
    /// A coil's span differs from the rest of its group.
    SpanDiffers,
    /// Two coils swapped between two phases (one fault).
    CoilsSwapped,
    /// A whole coil group (or part of one) connected into the wrong phase.
    GroupWrongPhase,
    /// A coil laid in (or recorded with) the wrong slots.
    CoilWrongSlots,
    /// A pole-changing winding balanced as laid out but not at its other pole count.
    UnbalancedAtOtherSpeed,
    /// A pole-changing winding's readings between its six leads off the card's (a half
    /// brought out on the wrong lead, or a half of the wrong resistance).
    SixLeadReadings,
}

/// One thing wrong with the winding, and what to do about it. Its words (`message()`, and
/// `message` in JSON) come from the presenters (`output::audit_words`).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Finding {
    /// What is wrong.
    pub kind: FindingKind,
    /// Coils involved: indices into the coil list, from 1.
    pub coils: Vec<CoilNo>,
    /// Slots involved, from 1.
    pub slots: Vec<SlotNo>,
    /// Phases involved (labels).
    pub phases: Vec<String>,
    /// What is wrong, with its numbers.
    pub detail: Fact,
}

/// Which way the field moves with supply lines 1, 2, 3... on the phase starts (worded in
/// `output/audit_words.rs`, which also writes it into the JSON with its `message`).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Travel {
    /// Phase labels in order (their starts, U1, V1, ..., take the lines).
    pub starts: Vec<String>,
    /// Rotating or travelling.
    pub topology: Topology,
    /// Towards rising (positive) or falling (negative) slot numbers.
    pub sequence: Sequence,
    /// Slots Z.
    pub slots: usize,
    /// The leads the lines go on when they are not the phase starts: a pole-changing
    /// winding's taps (2U, 2V, 2W or T4, T5, T6) at the poles it is laid out for.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub line_leads: Option<Vec<String>>,
}

/// A phasor at one harmonic order.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct HarmonicRow {
    /// Electrical order ν (fractional for a sub-harmonic).
    pub order: Elec,
    /// |E| / (4.44·f·Φ_ν) in effective series turns N_ph·k_wν.
    pub magnitude: f64,
    /// Angle in degrees.
    pub angle_deg: f64,
}

/// One phase at the fundamental, with its main harmonics.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PhaseRow {
    /// Phase label.
    pub phase: String,
    /// Fundamental EMF magnitude, effective series turns N_ph·k_w1.
    pub magnitude: f64,
    /// Fundamental angle, degrees.
    pub angle_deg: f64,
    /// Deviation from the ideal position 360°/m from its neighbours in the sequence found.
    pub angle_error_deg: f64,
    /// Coils in the phase.
    pub coils: usize,
    /// Series turns N_ph (all coils over the parallel paths).
    pub series_turns: f64,
    /// Orders 5, 7 and (fractional-slot rotary cores) the main sub-harmonic.
    pub harmonics: Vec<HarmonicRow>,
}

/// One parallel path of one phase.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PathRow {
    /// Phase label.
    pub phase: String,
    /// Path number from 1.
    pub path: PathNo,
    /// Coils in the path.
    pub coils: Vec<CoilNo>,
    /// Turns in the path.
    pub turns: u64,
    /// EMF magnitude of the path in effective turns.
    pub magnitude: f64,
    /// EMF angle, degrees.
    pub angle_deg: f64,
    /// |E_path − mean of the phase's paths|: the EMF that drives a circulating current
    /// around the parallel loop, in effective turns.
    pub circulating_emf: f64,
    /// `circulating_emf` as a percentage of the mean path EMF.
    pub circulating_percent: f64,
}

/// The complete audit.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct AuditReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title of the record.
    pub title: Option<String>,
    /// Slot count.
    pub slots: usize,
    /// Pole count.
    pub poles: usize,
    /// Layers.
    pub layers: usize,
    /// Parallel paths.
    pub parallel_paths: usize,
    /// Phase EMFs equal and 360°/m apart at the fundamental, in either sequence (the
    /// sequence is `sequence`; a negative one with balanced EMFs is balanced).
    pub balanced: bool,
    /// No finding at all.
    pub sound: bool,
    /// Phase sequence at the fundamental.
    pub sequence: Sequence,
    /// Direction of travel of the field with the supply in order on the phase starts.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub travel: Travel,
    /// Forward (positive-sequence) component, effective turns.
    pub forward: f64,
    /// Backward (negative-sequence) component, effective turns.
    pub backward: f64,
    /// Backward component as a percentage of the larger of forward and backward (100 when
    /// the field runs backwards), so the figure stays meaningful when a wave vanishes.
    pub backward_percent: f64,
    /// Zero-sequence component as a percentage of the larger of forward and backward.
    pub zero_sequence_percent: f64,
    /// True when the phase EMFs have no fundamental at all (every coil group connected the
    /// same way round): no angles or ratios mean anything then.
    pub no_fundamental: bool,
    /// (max − min) / mean of the phase magnitudes, per cent.
    pub magnitude_spread_percent: f64,
    /// Largest angle error of a phase, degrees.
    pub max_angle_error_deg: f64,
    /// Every phase.
    pub phases: Vec<PhaseRow>,
    /// Every parallel path (empty for a single path).
    pub paths: Vec<PathRow>,
    /// Slot fill.
    pub slot_check: SlotCheck,
    /// Number of edits in the fix found (0 when balanced or none found).
    pub fix_edits: usize,
    /// Other fixes of the same size found (the best is reported).
    pub other_fixes: usize,
    /// Comparison with the intended design, when given.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub intended: Option<Comparison>,
    /// What is wrong.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub findings: Vec<Finding>,
    /// Measured resistances against the data card, when `[measured]` is given.
    pub resistance: Option<crate::card::measured::ResistanceCheck>,
    /// A pole-changing winding's other speed: the record at twice its poles, halves in
    /// series.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub other_speed: Option<OtherSpeed>,
}

/// Angle in (−180, 180] degrees, rounding dust removed.
pub fn tidy_deg(a: f64) -> f64 {
    let mut r = a % 360.0;
    if r > 180.0 {
        r -= 360.0;
    }
    if r <= -180.0 {
        r += 360.0;
    }
    let r = (r * 1e9).round() / 1e9;
    if r <= -180.0 { r + 360.0 } else { r + 0.0 }
}

/// Angle of a phasor in degrees; 0 for a phasor with no magnitude.
fn angle_of(e: Complex64) -> f64 {
    if e.norm() < 1e-9 {
        0.0
    } else {
        tidy_deg(e.arg().to_degrees())
    }
}

pub use crate::winding::star::symmetrical_components;

/// Orders listed beside the fundamental: 5, 7, and for a fractional-slot rotary winding the
/// sub-harmonic (ν = n/p, n < p) with the largest EMF.
fn harmonic_orders(w: &Winding) -> Vec<Elec> {
    let mut orders = vec![Elec(5.0), Elec(7.0)];
    let g = &w.geometry;
    let (_, qd) = w.slots_per_pole_phase();
    if g.topology == Topology::Rotary && qd != 1 {
        let p = g.poles / 2;
        let best = (1..p)
            .map(|n| {
                let nu = Mech(n as u64).electrical(p as f64);
                (nu, w.phase_emf(0, nu).norm())
            })
            .filter(|(_, e)| *e > 1e-9 * w.coils.len().max(1) as f64)
            .max_by(|a, b| a.1.total_cmp(&b.1));
        if let Some((nu, _)) = best {
            orders.insert(0, nu);
        }
    }
    orders
}

fn slots_of(w: &Winding, coils: &[usize]) -> Vec<SlotNo> {
    let mut s: Vec<SlotNo> = coils
        .iter()
        .flat_map(|&i| [SlotNo::at(w.coils[i].go), SlotNo::at(w.coils[i].back)])
        .collect();
    s.sort_unstable();
    s.dedup();
    s
}

/// Coil `i` (0-based) as a finding names it.
fn coil_at(w: &Winding, i: usize) -> CoilAt {
    let c = &w.coils[i];
    CoilAt {
        coil: CoilNo::at(i),
        phase: w.label(c.phase).to_string(),
        go: SlotNo::at(c.go),
        back: SlotNo::at(c.back),
    }
}

/// A finding in shop terms for one edit of the fix.
fn finding_for(w: &Winding, e: &Edit) -> Finding {
    let label = |k: usize| w.label(k).to_string();
    let sorted_from_one = |coils: &[usize]| {
        let mut v: Vec<CoilNo> = coils.iter().map(|&c| CoilNo::at(c)).collect();
        v.sort_unstable();
        v
    };
    match e {
        Edit::ReverseCoil { coil } => Finding {
            kind: FindingKind::ReversedCoil,
            coils: vec![CoilNo::at(*coil)],
            slots: slots_of(w, &[*coil]),
            phases: vec![label(w.coils[*coil].phase)],
            detail: Fact::ReversedCoil {
                coil: coil_at(w, *coil),
            },
        },
        Edit::ReverseGroup { coils } => {
            let ph = label(w.coils[coils[0]].phase);
            let slots = slots_of(w, coils);
            Finding {
                kind: FindingKind::ReversedGroup,
                coils: sorted_from_one(coils),
                detail: Fact::ReversedGroup {
                    coils: sorted_from_one(coils),
                    phase: ph.clone(),
                    slots: slots.clone(),
                },
                slots,
                phases: vec![ph],
            }
        }
        Edit::MoveCoil {
            coil,
            from,
            to,
            reversed,
        } => Finding {
            kind: FindingKind::WrongPhase,
            coils: vec![CoilNo::at(*coil)],
            slots: slots_of(w, &[*coil]),
            phases: vec![label(*from), label(*to)],
            detail: Fact::WrongPhase {
                coil: coil_at(w, *coil),
                from: label(*from),
                to: label(*to),
                reversed: *reversed,
            },
        },
        Edit::SwapCoils {
            a,
            b,
            phase_a,
            phase_b,
        } => swapped_pair(w, *a, *b, *phase_a, *phase_b),
        Edit::MoveGroup {
            coils,
            from,
            to,
            reversed,
        } => {
            let slots = slots_of(w, coils);
            Finding {
                kind: FindingKind::GroupWrongPhase,
                coils: sorted_from_one(coils),
                detail: Fact::GroupWrongPhase {
                    coils: sorted_from_one(coils),
                    slots: slots.clone(),
                    from: label(*from),
                    to: label(*to),
                    reversed: *reversed,
                },
                slots,
                phases: vec![label(*from), label(*to)],
            }
        }
        Edit::RelayCoil { coil, go, back, .. } => {
            let c = &w.coils[*coil];
            let mut slots: Vec<SlotNo> = [c.go, c.back, *go, *back].map(SlotNo::at).to_vec();
            slots.sort_unstable();
            slots.dedup();
            let moved = [(c.go, *go), (c.back, *back)];
            let moved = moved.iter().filter(|(a, b)| a != b);
            let relaid = crate::winding::Coil {
                go: *go,
                back: *back,
                ..c.clone()
            };
            Finding {
                kind: FindingKind::CoilWrongSlots,
                coils: vec![CoilNo::at(*coil)],
                slots,
                phases: vec![label(c.phase)],
                detail: Fact::CoilWrongSlots {
                    coil: coil_at(w, *coil),
                    span: w.span(c).unsigned_abs(),
                    should_span: w.span(&relaid).unsigned_abs(),
                    overfilled: moved.clone().map(|&(a, _)| SlotNo::at(a)).collect(),
                    short: moved.map(|&(_, b)| SlotNo::at(b)).collect(),
                    go: SlotNo::at(*go),
                    back: SlotNo::at(*back),
                },
            }
        }
        Edit::ReversePhase { phase } => Finding {
            kind: FindingKind::ReversedPhase,
            coils: (0..w.coils.len())
                .filter(|&i| w.coils[i].phase == *phase)
                .map(CoilNo::at)
                .collect(),
            slots: Vec::new(),
            phases: vec![label(*phase)],
            detail: Fact::ReversedPhase {
                phase: label(*phase),
                leads: phase_leads(w, *phase),
            },
        },
        Edit::SwapPhases { a, b } => Finding {
            kind: FindingKind::LeadsSwapped,
            coils: (0..w.coils.len())
                .filter(|&i| w.coils[i].phase == *a || w.coils[i].phase == *b)
                .map(CoilNo::at)
                .collect(),
            slots: Vec::new(),
            phases: vec![label(*a), label(*b)],
            detail: Fact::LeadsSwapped {
                a: label(*a),
                b: label(*b),
                a_leads: phase_leads(w, *a),
                b_leads: phase_leads(w, *b),
            },
        },
    }
}

/// The start and finish leads of phase `k`'s first section as this winding marks them:
/// IEC 60034-8 or NEMA MG 1 on a three-phase winding (a finish joined inside the machine
/// marked so), else the phase label with 1 and 2.
fn phase_leads(w: &Winding, k: usize) -> [String; 2] {
    if w.geometry.phases == 3 {
        let name = |finish: bool| {
            let (n, inside) = crate::card::leads::section_lead(w.design.leads, k, 0, finish);
            if inside { format!("{n} (inside)") } else { n }
        };
        [name(false), name(true)]
    } else {
        let l = w.label(k);
        [format!("{l}1"), format!("{l}2")]
    }
}

/// Phase rows, symmetrical components and the sequence of a winding.
struct Balance {
    phases: Vec<PhaseRow>,
    forward: f64,
    backward: f64,
    zero: f64,
    sequence: Sequence,
    spread: f64,
    max_err: f64,
}

fn balance(w: &Winding) -> Balance {
    let m = w.geometry.phases;
    let e: Vec<Complex64> = (0..m).map(|k| w.phase_emf(k, Elec::FUNDAMENTAL)).collect();
    let (f, b, z) = symmetrical_components(&e);
    let sequence = if f.norm() >= b.norm() {
        Sequence::Positive
    } else {
        Sequence::Negative
    };
    let s = if sequence == Sequence::Positive {
        1.0
    } else {
        -1.0
    };
    let orders = harmonic_orders(w);
    // One angle reference in every command: phase U's EMF at each order is 0° (as in plan).
    let a0 = if e[0].norm() > 0.0 {
        e[0].arg().to_degrees()
    } else {
        0.0
    };
    let reference: Vec<f64> = orders
        .iter()
        .map(|&nu| {
            let h = w.phase_emf(0, nu);
            if h.norm() < 1e-9 {
                0.0
            } else {
                h.arg().to_degrees()
            }
        })
        .collect();
    let phases: Vec<PhaseRow> = (0..m)
        .map(|k| {
            let ideal = a0 - s * 360.0 * k as f64 / m as f64;
            let ang = e[k].arg().to_degrees();
            let err = if e[k].norm() > 0.0 && e[0].norm() > 0.0 {
                tidy_deg(ang - ideal)
            } else {
                0.0
            };
            PhaseRow {
                phase: w.label(k).to_string(),
                magnitude: e[k].norm(),
                angle_deg: if e[k].norm() < 1e-9 {
                    0.0
                } else {
                    tidy_deg(ang - a0)
                },
                angle_error_deg: err,
                coils: w.coils.iter().filter(|c| c.phase == k).count(),
                series_turns: w.series_turns(k),
                harmonics: orders
                    .iter()
                    .zip(&reference)
                    .map(|(&nu, r)| {
                        let h = w.phase_emf(k, nu);
                        HarmonicRow {
                            order: nu,
                            magnitude: h.norm(),
                            angle_deg: if h.norm() < 1e-9 {
                                0.0
                            } else {
                                tidy_deg(angle_of(h) - r)
                            },
                        }
                    })
                    .collect(),
            }
        })
        .collect();
    let mags: Vec<f64> = phases.iter().map(|p| p.magnitude).collect();
    let mean = mags.iter().sum::<f64>() / m as f64;
    let hi = mags.iter().cloned().fold(f64::MIN, f64::max);
    let lo = mags.iter().cloned().fold(f64::MAX, f64::min);
    Balance {
        forward: f.norm(),
        backward: b.norm(),
        zero: z.norm(),
        sequence,
        spread: if mean > 0.0 {
            100.0 * (hi - lo) / mean
        } else {
            0.0
        },
        max_err: phases
            .iter()
            .map(|p| p.angle_error_deg.abs())
            .fold(0.0, f64::max),
        phases,
    }
}

/// Coils whose turns differ from the most common turn count.
fn odd_turns(w: &Winding) -> Option<Finding> {
    let common = w.turns_per_coil();
    let odd: Vec<usize> = (0..w.coils.len())
        .filter(|&i| w.coils[i].turns != common)
        .collect();
    if odd.is_empty() {
        return None;
    }
    Some(Finding {
        kind: FindingKind::TurnsDiffer,
        coils: odd.iter().map(|&i| CoilNo::at(i)).collect(),
        slots: slots_of(w, &odd),
        phases: Vec::new(),
        detail: Fact::TurnsDiffer {
            coils: odd.iter().map(|&i| CoilNo::at(i)).collect(),
            usual: common,
            explains_unbalance: !w.is_balanced() && {
                let mut even = w.clone();
                for c in &mut even.coils {
                    c.turns = common;
                }
                even.is_balanced()
            },
        },
    })
}

/// The findings of a fix, one per fault: two coils each moved into the other's phase are
/// one fault, a pair swapped between phases (as a winder would lay them, one mistake).
fn fix_findings(w: &Winding, fix: &[Edit]) -> Vec<Finding> {
    if let [
        Edit::MoveCoil {
            coil: i,
            from: a,
            to: b,
            reversed: false,
        },
        Edit::MoveCoil {
            coil: j,
            from: c,
            to: d,
            reversed: false,
        },
    ] = fix
        && a == d
        && b == c
    {
        return vec![swapped_pair(w, *i, *j, *a, *b)];
    }
    fix.iter().map(|e| finding_for(w, e)).collect()
}

/// Coils `i` (now in phase `a`) and `j` (now in `b`) laid into each other's phase.
fn swapped_pair(w: &Winding, i: usize, j: usize, a: usize, b: usize) -> Finding {
    let mut coils = vec![CoilNo::at(i), CoilNo::at(j)];
    coils.sort_unstable();
    Finding {
        kind: FindingKind::CoilsSwapped,
        coils,
        slots: slots_of(w, &[i, j]),
        phases: vec![w.label(a).to_string(), w.label(b).to_string()],
        detail: Fact::CoilsSwapped {
            a: coil_at(w, i),
            b: coil_at(w, j),
            phase_a: w.label(a).to_string(),
            phase_b: w.label(b).to_string(),
        },
    }
}

/// Shop edits of a fix: a pair of coils each moved into the other's phase is one.
fn fix_cost(fix: &[Edit]) -> usize {
    match fix {
        [
            Edit::MoveCoil {
                from: a,
                to: b,
                reversed: false,
                ..
            },
            Edit::MoveCoil {
                from: c,
                to: d,
                reversed: false,
                ..
            },
        ] if a == d && b == c => 1,
        _ => fix.iter().map(Edit::cost).sum(),
    }
}

/// Coils whose span differs from the rest of their group (and that the fix does not
/// explain): most often a slot number written down wrong.
fn odd_spans(w: &Winding, fix: &[Edit]) -> Vec<Finding> {
    let mut out = Vec::new();
    // Concentric groups nest coils of different spans by design.
    if w.design.style == crate::winding::Style::Concentric {
        return out;
    }
    let explained: Vec<usize> = fix.iter().flat_map(|e| e.coils()).collect();
    for g in coil_groups(w) {
        if g.coils.len() < 3 {
            continue;
        }
        let spans: Vec<u64> = g
            .coils
            .iter()
            .map(|&c| w.span(&w.coils[c]).unsigned_abs())
            .collect();
        let mut sorted = spans.clone();
        sorted.sort_unstable();
        let usual = sorted[sorted.len() / 2];
        let odd: Vec<usize> = g
            .coils
            .iter()
            .zip(&spans)
            .filter(|(c, s)| **s != usual && !explained.contains(c))
            .map(|(c, _)| *c)
            .collect();
        if odd.len() == 1 {
            let c = odd[0];
            let coil = &w.coils[c];
            out.push(Finding {
                kind: FindingKind::SpanDiffers,
                coils: vec![CoilNo::at(c)],
                slots: vec![SlotNo::at(coil.go), SlotNo::at(coil.back)],
                phases: vec![w.label(coil.phase).to_string()],
                detail: Fact::SpanDiffers {
                    coil: CoilNo::at(c),
                    span: w.span(coil).unsigned_abs(),
                    usual,
                    go: SlotNo::at(coil.go),
                    back: SlotNo::at(coil.back),
                },
            });
        }
    }
    out
}

/// Audit a recorded winding, optionally against the intended design.
pub fn audit(w: &Winding, intended: Option<&Winding>) -> AuditReport {
    crate::runs::count(crate::runs::Analysis::Audit);
    let bal = balance(w);
    let found = search(w);
    let mut findings = Vec::new();
    let slot_check = check_slots(w);
    let fix = found.fix.clone().unwrap_or_default();
    // Paths are judged once the fix is applied, so one reversed coil is not reported twice.
    let fixed = apply_fix(w, &fix);
    // A coil the fix lays in other slots explains the slot fill: one finding, not two.
    let relaid = fix.iter().any(|e| matches!(e, Edit::RelayCoil { .. }));
    if relaid {
        findings.extend(check_slots(&fixed).findings(&fixed));
    } else {
        findings.extend(slot_check.findings(w));
    }
    let turns = odd_turns(w);
    // A miscounted coil that alone unbalances the phases is one finding, not two.
    let explained = matches!(
        &turns,
        Some(Finding {
            detail: Fact::TurnsDiffer {
                explains_unbalance: true,
                ..
            },
            ..
        })
    );
    findings.extend(turns);
    findings.extend(fix_findings(w, &fix));
    let total_turns: f64 = w.coils.iter().map(|c| c.turns as f64).sum();
    let no_fundamental = bal.forward.max(bal.backward).max(bal.zero) <= 1e-9 * total_turns.max(1.0);
    if no_fundamental && found.fix.is_none() {
        findings.push(Finding {
            kind: FindingKind::NoFundamental,
            coils: Vec::new(),
            slots: Vec::new(),
            phases: Vec::new(),
            detail: Fact::NoFundamental,
        });
    } else if !found.balanced && found.fix.is_none() && !explained {
        findings.push(Finding {
            kind: FindingKind::Unbalanced,
            coils: Vec::new(),
            slots: Vec::new(),
            phases: Vec::new(),
            detail: Fact::Unbalanced {
                backward_percent: pct(bal.backward, bal.forward.max(bal.backward)),
                spread_percent: bal.spread,
                swap_reach: found.swap_reach,
                truncated: found.truncated,
            },
        });
    }
    let (_, path_findings) = paths(&fixed);
    let (path_rows, _) = paths(w);
    findings.extend(path_findings);
    let resistance = crate::card::measured::check(w);
    if let Some(r) = resistance.as_ref().filter(|r| !r.sound) {
        findings.push(Finding {
            kind: FindingKind::MeasuredResistance,
            coils: Vec::new(),
            slots: Vec::new(),
            phases: {
                let mut p: Vec<String> = r
                    .judged
                    .iter()
                    .filter(|j| !j.within_tolerance)
                    .map(|j| j.phase.clone())
                    .collect();
                p.sort();
                p.dedup();
                p
            },
            detail: Fact::MeasuredResistance {
                taken: r.taken,
                measured_ohm: r.measured_ohm,
                temperature_c: r.temperature_c,
                deviation_percent: r.deviation_percent,
                tolerance_percent: r.tolerance_percent,
                ratio_to_expected: r.ratio_to_expected,
                outside: r
                    .judged
                    .iter()
                    .filter(|j| !j.within_tolerance)
                    .cloned()
                    .collect(),
                suggestion: r.suggestion.clone(),
            },
        });
    }
    // A pole-changing winding read between its six leads: as marked, or with two leads'
    // markings exchanged.
    if let Some(c) = crate::card::two_speed::six_leads(w)
        .and_then(|s| s.measured)
        .filter(|c| !c.as_marked)
    {
        findings.push(Finding {
            kind: FindingKind::SixLeadReadings,
            coils: Vec::new(),
            slots: Vec::new(),
            phases: Vec::new(),
            detail: Fact::SixLeadReadings {
                temperature_c: c.temperature_c,
                worst_percent: c.worst_percent,
                tolerance_percent: crate::card::measured::FAR_PERCENT,
                exchanged: c.exchanged,
            },
        });
    }
    // One finding per fault: the slot table compares the record as found, but the coil
    // findings only what the smallest fix leaves different from the design.
    let intended = intended.map(|d| {
        let mut c = compare(w, d);
        c.findings = compare(&fixed, d).findings;
        c
    });
    if let Some(c) = &intended {
        findings.extend(c.findings.iter().cloned());
    }
    findings.extend(odd_spans(w, &fix));
    let other = other_speed(w, &fixed).map(|(o, f)| {
        findings.extend(f);
        o
    });
    let g = &w.geometry;
    // A pole-changing winding's lines go on its taps in the standard's order, which feeds
    // the phases out of order (`pole_change::feeds_in_order`): the field then turns the
    // other way from the phases' own sequence, as `speeds` says.
    let sequence = match w.design.pole_change {
        Some(_)
            if !crate::winding::pole_change::feeds_in_order(
                &crate::winding::pole_change::HIGH_SPEED,
            ) =>
        {
            match bal.sequence {
                Sequence::Positive => Sequence::Negative,
                Sequence::Negative => Sequence::Positive,
            }
        }
        _ => bal.sequence,
    };
    let travel = Travel {
        starts: w.design.phase_labels.clone(),
        topology: g.topology,
        sequence,
        slots: g.slots,
        line_leads: match (w.design.pole_change, w.design.leads.speed) {
            (Some(_), _) => Some(
                crate::winding::pole_change::HIGH_SPEED
                    .lines
                    .iter()
                    .map(|l| l.name(w.design.leads.marking))
                    .collect(),
            ),
            // A winding of a two-winding motor: its leads carry its speed's number.
            (None, 1..) => Some(
                (0..3)
                    .map(|p| crate::card::leads::section_lead(w.design.leads, p, 0, false).0)
                    .collect(),
            ),
            (None, 0) => None,
        },
    };
    AuditReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        slots: g.slots,
        poles: g.poles,
        layers: g.layers,
        parallel_paths: w.parallel_paths,
        balanced: w.is_balanced(),
        sound: findings.is_empty(),
        sequence: bal.sequence,
        travel,
        forward: bal.forward,
        backward: bal.backward,
        backward_percent: pct(bal.backward, bal.forward.max(bal.backward)),
        zero_sequence_percent: pct(bal.zero, bal.forward.max(bal.backward)),
        no_fundamental,
        magnitude_spread_percent: bal.spread,
        max_angle_error_deg: bal.max_err,
        phases: bal.phases,
        paths: path_rows,
        slot_check,
        fix_edits: fix_cost(&fix),
        other_fixes: found.alternatives,
        intended,
        findings,
        resistance,
        other_speed: other,
    }
}

/// A pole-changing record judged at its other pole count (twice the poles, halves in
/// series: [`crate::winding::pole_change::at_double_poles`]). A coil list says which half
/// a coil is in only by its direction (the reversed groups are one half), so a record is
/// judged there once it is balanced as laid out: as found, or with the audit's fix made.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct OtherSpeed {
    /// Poles at that speed.
    pub poles: usize,
    /// True when judged with the audit's fix made (the record as found is unbalanced as
    /// laid out).
    pub after_fix: bool,
    /// Phase EMFs equal and 120° apart there, in either sequence.
    pub balanced: bool,
    /// Their sequence (negative is what consequent poles give a record laid out in positive
    /// sequence; the standard boards allow for it).
    pub sequence: Sequence,
    /// The smaller of the forward and backward waves there, per cent of the larger (the
    /// working wave is whichever is larger).
    pub minor_wave_percent: f64,
    /// Spread of the phase magnitudes there, per cent.
    pub magnitude_spread_percent: f64,
}

/// The other speed of a pole-changing record (`w` as found, or `fixed` when only the fix
/// balances it as laid out), and a finding when it is unbalanced there although balanced
/// as laid out (a fault the layout's own count does not show). `None` for a one-speed
/// winding, or a record no fix balances.
fn other_speed(w: &Winding, fixed: &Winding) -> Option<(OtherSpeed, Option<Finding>)> {
    w.design.pole_change?;
    let (judged, after_fix) = if w.is_balanced() {
        (w, false)
    } else if fixed.is_balanced() {
        (fixed, true)
    } else {
        return None;
    };
    let d = crate::winding::pole_change::at_double_poles(judged);
    let b = balance(&d);
    let other = OtherSpeed {
        poles: d.geometry.poles,
        after_fix,
        balanced: d.is_balanced(),
        sequence: b.sequence,
        minor_wave_percent: pct(b.backward.min(b.forward), b.forward.max(b.backward)),
        magnitude_spread_percent: b.spread,
    };
    let finding = (!other.balanced).then(|| Finding {
        kind: FindingKind::UnbalancedAtOtherSpeed,
        coils: Vec::new(),
        slots: Vec::new(),
        phases: Vec::new(),
        detail: Fact::UnbalancedAtOtherSpeed {
            poles: other.poles,
            after_fix,
            minor_wave_percent: other.minor_wave_percent,
            spread_percent: other.magnitude_spread_percent,
        },
    });
    Some((other, finding))
}

fn pct(x: f64, of: f64) -> f64 {
    if of > 0.0 { 100.0 * x / of } else { 0.0 }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    // Symmetrical components of a single-phase set (1, 0, 0): each component is 1/3
    // (Fortescue 1918; J. J. Grainger, W. D. Stevenson, *Power System Analysis*, 1994, §11.1).
    #[test]
    fn single_phase_set_splits_into_thirds() {
        let one = Complex64::new(1.0, 0.0);
        let zero = Complex64::new(0.0, 0.0);
        let (f, b, z) = symmetrical_components(&[one, zero, zero]);
        for x in [f, b, z] {
            assert!((x - one / 3.0).norm() < 1e-15);
        }
    }

    // A positive-sequence set (V lagging U by 120°) has no backward or zero component, and a
    // negative-sequence set no forward one (definition of the sequences, Fortescue 1918).
    #[test]
    fn pure_sequences_are_recognised() {
        let pos: Vec<Complex64> = (0..3)
            .map(|k| Complex64::from_polar(2.0, 0.3 - 2.0 * PI * k as f64 / 3.0))
            .collect();
        let (f, b, z) = symmetrical_components(&pos);
        assert!((f.norm() - 2.0).abs() < 1e-12 && b.norm() < 1e-12 && z.norm() < 1e-12);
        let neg: Vec<Complex64> = pos.iter().rev().cloned().collect();
        let (f, b, _) = symmetrical_components(&neg);
        assert!(f.norm() < 1e-12 && (b.norm() - 2.0).abs() < 1e-12);
    }

    // Cross-check against a general-purpose FFT (rustfft): the forward component is the
    // inverse DFT bin 1 divided by m, the backward one the forward DFT bin 1 divided by m.
    #[test]
    fn components_match_an_fft_for_five_phases() {
        use rustfft::FftPlanner;
        let e: Vec<Complex64> = (0..5)
            .map(|k| Complex64::new(1.0 + k as f64 * 0.7, (k * k) as f64 * 0.3 - 1.0))
            .collect();
        let (f, b, z) = symmetrical_components(&e);
        let mut planner = FftPlanner::<f64>::new();
        let mut fwd = e.clone();
        planner.plan_fft_forward(5).process(&mut fwd);
        let mut inv = e.clone();
        planner.plan_fft_inverse(5).process(&mut inv);
        assert!((b - fwd[1] / 5.0).norm() < 1e-12);
        assert!((f - inv[1] / 5.0).norm() < 1e-12);
        assert!((z - fwd[0] / 5.0).norm() < 1e-12);
    }

    #[test]
    fn angles_are_tidied_into_half_open_range() {
        assert_eq!(tidy_deg(-180.0), 180.0);
        assert_eq!(tidy_deg(540.0), 180.0);
        assert_eq!(tidy_deg(-190.0), 170.0);
        assert_eq!(tidy_deg(-0.0), 0.0);
    }
}
