//! A validated layout as the model holds it: the design, its labels and, for a recorded
//! winding, its coil list; and the bounds every layout is held to. The TOML adapter (the
//! binary's `layout` module) produces one; synthesis and the record builder read it.

use crate::design::{Design, Labels};

/// Largest slot count accepted: far beyond any real core, small enough that nothing we
/// allocate per slot (or per slot pair) can exhaust memory.
pub const MAX_SLOTS: usize = 5_000;
/// Largest pole count accepted.
pub const MAX_POLES: usize = 2_000;
/// Largest phase count accepted.
pub const MAX_PHASES: usize = 15;
/// Largest number of turns per coil accepted.
pub const MAX_TURNS: u32 = 100_000;
/// Largest number of explicit `[[coil]]` entries accepted.
pub const MAX_COILS: usize = 2 * MAX_SLOTS;

/// One coil of an explicit coil list, slots already converted to 0-based indices.
#[derive(Debug, Clone, PartialEq)]
pub struct CoilEntry {
    /// Index into the phase labels.
    pub phase: usize,
    /// Slot where current enters, 0-based.
    pub go: usize,
    /// Slot where current leaves, 0-based.
    pub back: usize,
    /// Turns of this coil.
    pub turns: u32,
    /// Parallel path, 0-based.
    pub path: usize,
}

/// A validated layout: the design, its labels and, for a recorded winding, its coil list.
#[derive(Debug, Clone, PartialEq)]
pub struct Spec {
    /// Title and colours.
    pub labels: Labels,
    /// Core, supply, the designer's choices and the shop's data.
    pub design: Design,
    /// Explicit coil list (replaces synthesis) when non-empty.
    pub coils: Vec<CoilEntry>,
    /// A second, separate winding in the same slots (a two-winding motor), or `None`.
    pub second: Option<Box<SecondWinding>>,
}

/// A second winding of its own pole count and connection in the same core: a two-winding
/// (two-speed) motor. Each winding is planned, balanced and drawn apart.
#[derive(Debug, Clone, PartialEq)]
pub struct SecondWinding {
    /// The second winding as a layout of its own: the same core, supply and wire, its own
    /// poles, `[winding]` choices, readings and (for a record) coils.
    pub spec: Spec,
    /// How the two windings share the slots.
    pub sharing: Sharing,
}

/// The speed numbers of two windings of `poles` poles each: the one with more poles runs
/// slower and is speed 1, the other speed 2 (IEC 60034-8 numbers the speeds of a
/// multi-speed motor from the lowest; from memory).
pub fn speed_numbers(poles: [usize; 2]) -> [u8; 2] {
    if poles[0] > poles[1] { [1, 2] } else { [2, 1] }
}

/// How two separate windings share one core's slots.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Sharing {
    /// Each winding in its own layers of every slot: the first at the bottom of the
    /// slot, the second above it, nearer the bore.
    Layers,
    /// Each winding in its own slots: the first in slots 1, 3, 5, …, the second in slots
    /// 2, 4, 6, … (`Design::alternate_slots`).
    Slots,
}

impl Spec {
    /// A layout that asks for `design` to be synthesized, with no title or colours.
    pub fn of(design: Design) -> Spec {
        Spec {
            labels: Labels::default(),
            design,
            coils: Vec::new(),
            second: None,
        }
    }
}
