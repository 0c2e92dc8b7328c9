//! What each finding is about, as typed facts carrying their numbers: the analysis states
//! them, and the presenters (`output::audit_words`) put them into words.

use serde::Serialize;

use crate::card::measured::Suggestion;
use crate::numbering::{CoilNo, PathNo, SlotNo};

/// A coil as a finding names it (numbers from 1).
#[derive(Debug, Clone, PartialEq, Eq, Serialize, schemars::JsonSchema)]
pub struct CoilAt {
    /// Coil number.
    pub coil: CoilNo,
    /// Its phase label as recorded.
    pub phase: String,
    /// Slot where current enters as recorded.
    pub go: SlotNo,
    /// Slot where current leaves as recorded.
    pub back: SlotNo,
}

/// Coils moved from one parallel path to another (numbers from 1).
#[derive(Debug, Clone, PartialEq, Eq, Serialize, schemars::JsonSchema)]
pub struct PathMove {
    /// The coil, when one coil moves.
    pub coil: Option<CoilAt>,
    /// The coils that move (a group, or the one coil).
    pub coils: Vec<CoilNo>,
    /// Their slots.
    pub slots: Vec<SlotNo>,
    /// The path they are in.
    pub from: PathNo,
    /// The path they belong in.
    pub to: PathNo,
}

/// The facts of one finding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "fact", rename_all = "snake_case")]
pub enum Fact {
    /// One coil connected backwards.
    ReversedCoil {
        /// The coil.
        coil: CoilAt,
    },
    /// A run of coils of one phase connected backwards.
    ReversedGroup {
        /// Coils, from 1, sorted.
        coils: Vec<CoilNo>,
        /// Their phase.
        phase: String,
        /// Their slots.
        slots: Vec<SlotNo>,
    },
    /// A coil in the wrong phase.
    WrongPhase {
        /// The coil.
        coil: CoilAt,
        /// Phase it is in.
        from: String,
        /// Phase it belongs in.
        to: String,
        /// It also belongs the other way round.
        reversed: bool,
    },
    /// A whole phase connected backwards.
    ReversedPhase {
        /// The phase.
        phase: String,
        /// Its start and finish leads as marked on this winding (IEC or NEMA; a finish
        /// joined inside is marked "(inside)").
        leads: [String; 2],
    },
    /// Two phases' leads exchanged.
    LeadsSwapped {
        /// One phase.
        a: String,
        /// The other.
        b: String,
        /// The start and finish leads of `a` as marked on this winding.
        a_leads: [String; 2],
        /// The start and finish leads of `b`.
        b_leads: [String; 2],
    },
    /// Two coils laid into each other's phase.
    CoilsSwapped {
        /// One coil.
        a: CoilAt,
        /// The other.
        b: CoilAt,
        /// Phase of `a` as recorded.
        phase_a: String,
        /// Phase of `b` as recorded.
        phase_b: String,
    },
    /// A group connected into the wrong phase.
    GroupWrongPhase {
        /// Coils, from 1, sorted.
        coils: Vec<CoilNo>,
        /// Their slots.
        slots: Vec<SlotNo>,
        /// Phase they are in.
        from: String,
        /// Phase they belong in.
        to: String,
        /// They also belong the other way round.
        reversed: bool,
    },
    /// A coil in the wrong slots.
    CoilWrongSlots {
        /// The coil as recorded.
        coil: CoilAt,
        /// Its span as recorded.
        span: u64,
        /// Its span where it belongs.
        should_span: u64,
        /// Its slots that hold too many sides.
        overfilled: Vec<SlotNo>,
        /// The slots short of a side where it belongs.
        short: Vec<SlotNo>,
        /// Where current should enter.
        go: SlotNo,
        /// Where current should leave.
        back: SlotNo,
    },
    /// Coils or groups to move between the parallel paths of a phase.
    PathMoves {
        /// The phase.
        phase: String,
        /// What moves.
        moves: Vec<PathMove>,
    },
    /// A parallel path that differs from its siblings, no small move explaining it.
    PathDiffers {
        /// The phase.
        phase: String,
        /// The path, from 1.
        path: PathNo,
        /// Its turns.
        turns: u64,
        /// Its EMF magnitude, effective turns.
        magnitude: f64,
        /// Its EMF angle, degrees.
        angle_deg: f64,
        /// Circulating EMF as a percentage of the path EMF.
        circulating_percent: f64,
    },
    /// Slots empty or with a layer empty.
    EmptySlots {
        /// Slots with no side.
        empty: Vec<SlotNo>,
        /// Slots with a layer empty.
        partly_filled: Vec<SlotNo>,
    },
    /// Slots holding more sides than the layers.
    OverfilledSlots {
        /// The slots.
        slots: Vec<SlotNo>,
        /// The layer count.
        layers: usize,
        /// Coils with a side there.
        coils: Vec<CoilNo>,
    },
    /// Sides of this winding in the other winding's slots (a core shared by slots).
    OtherWindingsSlots {
        /// The slots.
        slots: Vec<SlotNo>,
        /// Coils with a side there.
        coils: Vec<CoilNo>,
    },
    /// Coils whose turns differ from the rest.
    TurnsDiffer {
        /// The coils.
        coils: Vec<CoilNo>,
        /// The turns of the rest.
        usual: u32,
        /// With these coils at the usual turns the phases balance: the miscount explains
        /// the unbalance, which is then not a finding of its own.
        explains_unbalance: bool,
    },
    /// A coil whose span differs from the rest of its group.
    SpanDiffers {
        /// The coil.
        coil: CoilNo,
        /// Its span.
        span: u64,
        /// The group's span.
        usual: u64,
        /// Where current enters.
        go: SlotNo,
        /// Where current leaves.
        back: SlotNo,
    },
    /// No fundamental EMF.
    NoFundamental,
    /// Unbalanced, and no fix of up to two edits.
    Unbalanced {
        /// Backward field, per cent of the larger wave.
        backward_percent: f64,
        /// Spread of the phase magnitudes, per cent.
        spread_percent: f64,
        /// Swapped pairs tried only this many slots apart.
        swap_reach: Option<usize>,
        /// The pair search hit its work limit.
        truncated: bool,
    },
    /// A pole-changing winding balanced as laid out but not at its other pole count.
    UnbalancedAtOtherSpeed {
        /// Poles at the other speed.
        poles: usize,
        /// Judged with the audit's fix made (the record as found is unbalanced as laid
        /// out).
        after_fix: bool,
        /// The smaller of the two rotating waves there, per cent of the larger.
        minor_wave_percent: f64,
        /// Spread of the phase magnitudes there, per cent.
        spread_percent: f64,
    },
    /// A pole-changing winding's readings between its six leads off the card's.
    SixLeadReadings {
        /// Temperature of the readings, °C.
        temperature_c: f64,
        /// Largest departure from the card's readings as marked, per cent.
        worst_percent: f64,
        /// The tolerance, per cent.
        tolerance_percent: f64,
        /// The exchanges of two leads' markings that explain the readings.
        exchanged: Vec<[String; 2]>,
    },
    /// Measured resistances unbalanced or off the card.
    MeasuredResistance {
        /// How the readings were taken.
        taken: crate::card::measured::Taken,
        /// Line-to-line readings, ohms (when taken that way).
        #[serde(default, skip_serializing_if = "Option::is_none")]
        measured_ohm: Option<[f64; 3]>,
        /// Winding temperature, °C.
        temperature_c: f64,
        /// Largest deviation of a reading from their mean, per cent.
        deviation_percent: f64,
        /// Tolerance, per cent.
        tolerance_percent: f64,
        /// Mean of the phases (or sections) over the card's figure.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        ratio_to_expected: Option<f64>,
        /// The phases or sections outside the tolerance, at 20 °C.
        outside: Vec<crate::card::measured::Judged>,
        /// What the readings suggest.
        suggestion: Suggestion,
    },
    /// The design and the record are not the same core.
    CoresDiffer {
        /// Slots of the design.
        design_slots: usize,
        /// Slots of the record.
        record_slots: usize,
    },
    /// A recorded coil that differs from the design in the same slots, or has none there.
    DiffersFromDesign {
        /// The coil as recorded.
        coil: CoilAt,
        /// Its path as recorded, from 1.
        path: PathNo,
        /// False when the design has no coil in these slots.
        matched: bool,
        /// The phase it belongs in, when that differs.
        phase: Option<String>,
        /// Where current should enter, when it is reversed.
        go: Option<SlotNo>,
        /// The path it belongs in, when that differs.
        belongs_in_path: Option<PathNo>,
    },
    /// A coil of the design the record lacks.
    MissingFromRecord {
        /// Its phase.
        phase: String,
        /// Where current enters.
        go: SlotNo,
        /// Where current leaves.
        back: SlotNo,
    },
}
