//! Slot fill of a record: slots left empty, layers left empty, slots overfilled.

use serde::Serialize;

use super::{Fact, Finding, FindingKind};
use crate::numbering::{CoilNo, SlotNo};
use crate::winding::{Topology, Winding};

/// How the slots of a record are filled (slot numbers from 1).
#[derive(Debug, Clone, PartialEq, Default, Serialize, schemars::JsonSchema)]
pub struct SlotCheck {
    /// Slots with no coil side at all.
    pub empty: Vec<SlotNo>,
    /// Slots with fewer coil sides than they should hold (but at least one).
    pub partly_filled: Vec<SlotNo>,
    /// Slots holding more coil sides than the winding has layers.
    pub overfilled: Vec<SlotNo>,
    /// End slots of a double-layer linear primary, which hold one side by design.
    pub half_filled_by_design: Vec<SlotNo>,
    /// Coils (from 1) with a side in an overfilled slot.
    pub overfilled_coils: Vec<CoilNo>,
    /// Slots of the other winding (a core shared by slots) holding a side of this one.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub other_windings: Vec<SlotNo>,
    /// Coils (from 1) with a side there.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub other_windings_coils: Vec<CoilNo>,
}

/// Sides each slot should hold: the layer count, one at the ends of a double-layer linear
/// primary (its span's worth of slots at each end).
pub(super) fn expected(w: &Winding, k: usize) -> usize {
    let g = &w.geometry;
    // One of two windings sharing the core by slots: the other's slots hold none of it.
    if !w.own_slot(k) {
        return 0;
    }
    if g.topology == Topology::Linear && g.layers == 2 {
        let y = w.pitch.min(g.slots / 2);
        if k < y || k + y >= g.slots {
            return 1;
        }
    }
    g.layers
}

/// Whether slot `k`, holding `n` sides, holds more than it may: more than the layers, or
/// anything at all in the other winding's slot of a core shared by slots.
pub(super) fn over(w: &Winding, k: usize, n: usize) -> bool {
    if expected(w, k) == 0 {
        n > 0
    } else {
        n > w.geometry.layers
    }
}

/// Count the coil sides in every slot.
pub fn check_slots(w: &Winding) -> SlotCheck {
    let sides = w.slot_sides();
    let mut out = SlotCheck::default();
    for (k, &n) in sides.iter().enumerate() {
        let want = expected(w, k);
        if want < w.geometry.layers && want > 0 {
            out.half_filled_by_design.push(SlotNo::at(k));
        }
        if want == 0 {
            // The other winding's slot: nothing of this one belongs there.
            if n > 0 {
                out.other_windings.push(SlotNo::at(k));
            }
            continue;
        }
        if n == 0 {
            out.empty.push(SlotNo::at(k));
        } else if n < want {
            out.partly_filled.push(SlotNo::at(k));
        } else if n > w.geometry.layers {
            out.overfilled.push(SlotNo::at(k));
        }
    }
    let with_side_in = |slot: &dyn Fn(usize) -> bool| -> Vec<CoilNo> {
        (0..w.coils.len())
            .filter(|&i| slot(w.coils[i].go) || slot(w.coils[i].back))
            .map(CoilNo::at)
            .collect()
    };
    out.overfilled_coils = with_side_in(&|k| expected(w, k) > 0 && sides[k] > w.geometry.layers);
    out.other_windings_coils = with_side_in(&|k| expected(w, k) == 0 && sides[k] > 0);
    out
}

impl SlotCheck {
    /// Findings for empty and overfilled slots.
    pub fn findings(&self, w: &Winding) -> Vec<Finding> {
        let mut f = Vec::new();
        if !self.empty.is_empty() || !self.partly_filled.is_empty() {
            let mut slots: Vec<SlotNo> = self
                .empty
                .iter()
                .chain(&self.partly_filled)
                .cloned()
                .collect();
            slots.sort_unstable();
            f.push(Finding {
                kind: FindingKind::EmptySlots,
                coils: Vec::new(),
                slots,
                phases: Vec::new(),
                detail: Fact::EmptySlots {
                    empty: self.empty.clone(),
                    partly_filled: self.partly_filled.clone(),
                },
            });
        }
        if !self.other_windings.is_empty() {
            f.push(Finding {
                kind: FindingKind::OverfilledSlots,
                coils: self.other_windings_coils.clone(),
                slots: self.other_windings.clone(),
                phases: Vec::new(),
                detail: Fact::OtherWindingsSlots {
                    slots: self.other_windings.clone(),
                    coils: self.other_windings_coils.clone(),
                },
            });
        }
        if !self.overfilled.is_empty() {
            f.push(Finding {
                kind: FindingKind::OverfilledSlots,
                coils: self.overfilled_coils.clone(),
                slots: self.overfilled.clone(),
                phases: Vec::new(),
                detail: Fact::OverfilledSlots {
                    slots: self.overfilled.clone(),
                    layers: w.geometry.layers,
                    coils: self.overfilled_coils.clone(),
                },
            });
        }
        f
    }
}
