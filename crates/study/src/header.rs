//! The design every report opens with: the same facts, from the same function, at the head
//! of the plan, factors, field, span, audit, card, thrust and inductance reports, in their
//! JSON (`design`; a rewind's `old_design` and `new_design`), on the HTML page and in the
//! sheets' title block.

use serde::Serialize;

use crate::factors;
use crate::winding::{Connection, Style, Topology, Winding};

/// The winding in a few facts: core, layout, span, turns, connection and k_w1.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct DesignHeader {
    /// Free text title.
    pub title: Option<String>,
    /// Closed rotary core or open flat primary.
    pub topology: Topology,
    /// Slots Z.
    pub slots: usize,
    /// Poles 2p.
    pub poles: usize,
    /// Phases m.
    #[serde(rename = "phase_count")]
    pub phases: usize,
    /// Layers per slot.
    pub layers: usize,
    /// Coil shape.
    pub style: Style,
    /// Span the coils were built with (concentric: the mean span), slot pitches: the
    /// layout's `winding.pitch`, and `pitch` wherever a report gives it.
    pub pitch: usize,
    /// Pole pitch τ in slot pitches.
    pub pole_pitch_slots: f64,
    /// Slots per pole per phase q.
    pub slots_per_pole_phase: f64,
    /// q as a reduced fraction, e.g. "5/4".
    pub slots_per_pole_phase_fraction: String,
    /// Turns per coil, from the coils themselves (the most common count when they differ).
    pub turns_per_coil: u32,
    /// Every distinct turn count among the coils, smallest first, when they differ.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub mixed_turns: Vec<u32>,
    /// True when the layout gave no turns per coil and one turn is assumed.
    pub turns_assumed: bool,
    /// Parallel paths per phase.
    pub parallel_paths: usize,
    /// Star or delta (a pole-changing winding's is in `pole_change`).
    pub connection: Connection,
    /// A pole-changing winding's connection: laid out at `poles`, it also serves twice as
    /// many (see the `speeds` report).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub pole_change: Option<crate::design::PoleChange>,
    /// Fundamental winding factor k_w1.
    pub winding_factor: f64,
    /// True when the coils come from a recorded coil list rather than synthesis.
    pub recorded: bool,
}

/// The header of a winding.
pub fn of(w: &Winding) -> DesignHeader {
    let g = &w.geometry;
    let (qn, qd) = w.slots_per_pole_phase();
    DesignHeader {
        title: w.labels.title.clone(),
        topology: g.topology,
        slots: g.slots,
        poles: g.poles,
        phases: g.phases,
        layers: g.layers,
        style: w.design.style,
        pitch: w.pitch,
        pole_pitch_slots: g.pole_pitch_slots,
        slots_per_pole_phase: qn as f64 / qd as f64,
        slots_per_pole_phase_fraction: crate::numbering::fraction(qn, qd),
        turns_per_coil: w.turns_per_coil(),
        mixed_turns: {
            let t = w.distinct_turns();
            if t.len() > 1 { t } else { Vec::new() }
        },
        turns_assumed: w.design.turns_assumed,
        parallel_paths: w.parallel_paths,
        connection: w.design.connection,
        pole_change: w.design.pole_change,
        winding_factor: factors::fundamental(w).winding,
        recorded: w.from_coil_list,
    }
}
