//! The plan report: everything a winder needs to lay the coils, as one plain struct.

use serde::Serialize;

use crate::factors::{self, FactorRow};
use crate::linear::{self, Figures, Operating};
use crate::numbering::{CoilNo, GroupNo, PathNo, SlotNo};
use crate::winding::{
    Connection, Elec, Style, Topology, Winding, coil_groups, possible_path_counts,
};

/// One coil as the shop sees it (slots from 1).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct CoilRow {
    /// Coil number from 1.
    pub number: CoilNo,
    /// Phase label.
    pub phase: String,
    /// Slot where current enters.
    pub go: SlotNo,
    /// Slot where current leaves.
    pub back: SlotNo,
    /// Turns.
    pub turns: u32,
    /// Parallel path from 1.
    pub path: PathNo,
    /// Coil group number from 1.
    pub group: GroupNo,
    /// Signed span in slot pitches (negative: coil reversed).
    pub span: i64,
    /// Layer of the go side: "top", "bottom" or "single".
    pub go_layer: &'static str,
    /// Layer of the back side.
    pub back_layer: &'static str,
}

/// What lies in one slot.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SlotRow {
    /// Slot number from 1.
    pub slot: SlotNo,
    /// Side in the top layer (or the only layer): sign of current and phase, e.g. "+U".
    pub top: Option<String>,
    /// Side in the bottom layer.
    pub bottom: Option<String>,
}

/// One coil group in connection order.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct GroupRow {
    /// Group number from 1, in slot order.
    pub number: GroupNo,
    /// Phase label.
    pub phase: String,
    /// "+" forward, "-" reversed.
    pub polarity: &'static str,
    /// Coils from 1, in slot order.
    pub coils: Vec<CoilNo>,
    /// Parallel path from 1.
    pub path: PathNo,
}

/// One phase's phasor as reported: a phase EMF here (magnitude in effective series turns
/// N_ph·k_w, i.e. |E| / (4.44·f·Φ)), a phase current in the field report.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PhasorRow {
    /// Phase label.
    pub phase: String,
    /// Magnitude, in the unit of the report it belongs to.
    pub magnitude: f64,
    /// Angle of the phasor, degrees (V lags U by 120° in positive sequence).
    pub angle_deg: f64,
}

/// The complete plan of a winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PlanReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Free text title.
    pub title: Option<String>,
    /// Core kind.
    pub topology: Topology,
    /// Slots Z.
    pub slots: usize,
    /// Poles 2p.
    pub poles: usize,
    /// Phases m.
    #[serde(rename = "phase_count")]
    pub phases: usize,
    /// Layers.
    pub layers: usize,
    /// Design span.
    pub pitch: usize,
    /// Lap or concentric.
    pub style: Style,
    /// Turns per coil.
    pub turns_per_coil: u32,
    /// Parallel paths.
    pub parallel_paths: usize,
    /// Star or delta.
    pub connection: Connection,
    /// Pole pitch τ in slot pitches.
    pub pole_pitch_slots: f64,
    /// Slots per pole per phase q.
    pub slots_per_pole_phase: f64,
    /// q as a reduced fraction, e.g. "5/4".
    pub slots_per_pole_phase_fraction: String,
    /// How many times the winding repeats round a rotary core, from its coils.
    pub periodicity: Option<usize>,
    /// True when the winding has no half-turn symmetry: unbalanced magnetic pull.
    pub unbalanced_pull: Option<bool>,
    /// Phases equal and 2π/m apart at the fundamental, in either sequence.
    pub balanced: bool,
    /// The phase sequence of a balanced winding: positive (the field travels towards rising
    /// slot numbers with U, V, W on lines 1, 2, 3) or negative; null when unbalanced.
    pub sequence: Option<crate::winding::star::Sequence>,
    /// Fundamental winding factor k_w1.
    pub winding_factor: f64,
    /// Fundamental factors in full.
    pub fundamental: FactorRow,
    /// Every coil.
    pub coils: Vec<CoilRow>,
    /// Every slot.
    pub slot_table: Vec<SlotRow>,
    /// Coil groups in slot order.
    pub groups: Vec<GroupRow>,
    /// The winding schedule: every coil in connection order, phase by phase and path by
    /// path, with where its finish is joined (the connection sheet's table).
    pub schedule: Vec<crate::winding::schedule::ScheduleRow>,
    /// Phase EMF phasors at the fundamental.
    pub phases_emf: Vec<PhasorRow>,
    /// Half-filled end slots of a linear primary (slot numbers from 1).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub half_filled_slots: Option<Vec<SlotNo>>,
    /// Slots holding no coil side.
    pub empty_slots: Vec<SlotNo>,
    /// Parallel path counts that keep every path's EMF equal.
    pub possible_parallel_paths: Vec<usize>,
    /// Speeds, lengths, forces.
    pub figures: Figures,
    /// True when the layout gave no turns per coil and one turn is assumed.
    pub turns_assumed: bool,
    /// Designs a winder should not build (contract: a `warnings` array).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub warnings: Vec<crate::warnings::DesignWarning>,
}

fn layer_name(layers: usize, l: usize) -> &'static str {
    match (layers, l) {
        (1, _) => "single",
        (_, 0) => "top",
        _ => "bottom",
    }
}

/// Phase EMF phasors at electrical order `order`: magnitudes in effective series turns
/// N_ph·k_w with the skew factor included (k_w = k_d·k_p·k_s, as `winding_factor`), angles
/// relative to the first phase at that order (the one reference of every command).
pub fn phasors(w: &Winding, order: Elec) -> Vec<PhasorRow> {
    let e: Vec<_> = (0..w.geometry.phases)
        .map(|k| w.phase_emf(k, order))
        .collect();
    let ks = factors::closed::skew(
        order.get(),
        w.design.skew_slots * w.geometry.slot_angle_elec(),
    );
    let reference = e
        .first()
        .filter(|r| r.norm() > 1e-9)
        .map(|r| r.arg())
        .unwrap_or(0.0);
    e.iter()
        .enumerate()
        .map(|(k, e)| PhasorRow {
            phase: w.label(k).to_string(),
            magnitude: e.norm() * ks,
            angle_deg: if e.norm() > 1e-9 {
                tidy_angle((e.arg() - reference).to_degrees())
            } else {
                0.0
            },
        })
        .collect()
}

/// Angle in (−180, 180], with −0 and rounding dust removed.
fn tidy_angle(a: f64) -> f64 {
    let r = ((a * 1e9).round() / 1e9).rem_euclid(360.0);
    if r > 180.0 { r - 360.0 } else { r + 0.0 }
}

/// Build the plan report of a winding at an operating point.
pub fn plan(w: &Winding, op: Operating) -> PlanReport {
    crate::runs::count(crate::runs::Analysis::Plan);
    let g = &w.geometry;
    let groups = coil_groups(w);
    let mut group_of = vec![GroupNo::at(0); w.coils.len()];
    for (n, grp) in groups.iter().enumerate() {
        for &c in &grp.coils {
            group_of[c] = GroupNo::at(n);
        }
    }
    let coils = w
        .coils
        .iter()
        .enumerate()
        .map(|(i, c)| CoilRow {
            number: CoilNo::at(i),
            phase: w.label(c.phase).to_string(),
            go: SlotNo::at(c.go),
            back: SlotNo::at(c.back),
            turns: c.turns,
            path: PathNo::at(c.path),
            group: group_of[i],
            span: w.span(c),
            go_layer: layer_name(g.layers, c.go_layer),
            back_layer: layer_name(g.layers, c.back_layer),
        })
        .collect();
    let mut slot_table: Vec<SlotRow> = (0..g.slots)
        .map(|k| SlotRow {
            slot: SlotNo::at(k),
            top: None,
            bottom: None,
        })
        .collect();
    for c in &w.coils {
        let label = w.label(c.phase);
        for (slot, layer, sign) in [(c.go, c.go_layer, '+'), (c.back, c.back_layer, '-')] {
            let cell = if layer == 0 {
                &mut slot_table[slot].top
            } else {
                &mut slot_table[slot].bottom
            };
            *cell = Some(format!("{sign}{label}"));
        }
    }
    let group_rows = groups
        .iter()
        .enumerate()
        .map(|(n, grp)| GroupRow {
            number: GroupNo::at(n),
            phase: w.label(grp.phase).to_string(),
            polarity: if grp.polarity > 0 { "+" } else { "-" },
            coils: grp.coils.iter().map(|&c| CoilNo::at(c)).collect(),
            path: PathNo::at(w.coils[grp.coils[0]].path),
        })
        .collect();
    let (qn, qd) = w.slots_per_pole_phase();
    let fundamental = factors::fundamental(w);
    PlanReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        topology: g.topology,
        slots: g.slots,
        poles: g.poles,
        phases: g.phases,
        layers: g.layers,
        pitch: w.pitch,
        style: w.design.style,
        turns_per_coil: w.turns_per_coil(),
        parallel_paths: w.parallel_paths,
        connection: w.design.connection,
        pole_pitch_slots: g.pole_pitch_slots,
        slots_per_pole_phase: qn as f64 / qd as f64,
        slots_per_pole_phase_fraction: crate::numbering::fraction(qn, qd),
        periodicity: (g.topology == Topology::Rotary).then(|| w.periodicity()),
        unbalanced_pull: (g.topology == Topology::Rotary).then(|| !w.balanced_pull()),
        balanced: w.is_balanced(),
        sequence: w.balance(),
        winding_factor: fundamental.winding,
        fundamental,
        coils,
        slot_table,
        groups: group_rows,
        schedule: crate::winding::schedule::schedule(w, &groups),
        phases_emf: phasors(w, Elec::FUNDAMENTAL),
        half_filled_slots: (g.topology == Topology::Linear)
            .then(|| w.half_filled_slots().into_iter().map(SlotNo::at).collect()),
        empty_slots: w.empty_slots().into_iter().map(SlotNo::at).collect(),
        possible_parallel_paths: possible_path_counts(w),
        figures: linear::figures(w, op),
        turns_assumed: w.design.turns_assumed,
        warnings: crate::warnings::design_warnings(w),
    }
}
