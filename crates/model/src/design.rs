//! The model's design: the core, the supply and the designer's intent (slots, poles,
//! phases, layers, span, coil shape, turns, paths, connection, skew), and what the shop and
//! the physics need besides the coils (wire, copper rule, slot area, air gap, secondary
//! plate, lead scheme, measured values). A [`Design`] plus coils is a
//! [`crate::winding::Winding`]; the layout parser produces one and nothing else knows the
//! file. A new layout key touches the parser and this file only. SI units inside.
//!
//! Title and drawing colours are [`Labels`]: they name and paint a winding, never change
//! its physics.

use std::fmt;

use serde::Serialize;

use crate::units::{Area, Length};

/// Closed rotary core or open, flat linear primary.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Topology {
    /// A closed core: slot Z is followed by slot 1 again.
    Rotary,
    /// A flat, open-ended primary: slot 1 and slot Z are the two ends.
    Linear,
}

impl fmt::Display for Topology {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Topology::Rotary => "rotary",
            Topology::Linear => "linear",
        })
    }
}

/// How the coils of a single-layer winding are shaped.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Style {
    /// Coils of one span, laid like roof tiles.
    Lap,
    /// Nested coils of different spans around one centre (single layer only).
    Concentric,
}

/// How the three phases are joined.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Connection {
    /// Phase ends U2, V2, W2 joined in a star point.
    Star,
    /// Phases joined end to start in a ring.
    Delta,
}

impl Connection {
    /// Phase (section) voltage for line voltage `line_v`: U/√3 in star, U in delta (the
    /// one star/delta rule; IEC 60050-141, the relations of a symmetrical three-phase
    /// system).
    pub fn phase_voltage(self, line_v: f64) -> f64 {
        match self {
            Connection::Star => line_v / SQRT_3,
            Connection::Delta => line_v,
        }
    }

    /// Phase current for line current `line_a`: I in star, I/√3 in delta.
    pub fn phase_current(self, line_a: f64) -> f64 {
        match self {
            Connection::Star => line_a,
            Connection::Delta => line_a / SQRT_3,
        }
    }

    /// Line current for phase current `phase_a`: the inverse of [`Connection::phase_current`].
    pub fn line_current(self, phase_a: f64) -> f64 {
        match self {
            Connection::Star => phase_a,
            Connection::Delta => phase_a * SQRT_3,
        }
    }
}

/// √3, the ratio of line to phase quantities of a symmetrical three-phase system.
pub const SQRT_3: f64 = 1.732_050_807_568_877_2;

impl fmt::Display for Connection {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Connection::Star => "star",
            Connection::Delta => "delta",
        })
    }
}

/// Core sizes, in SI units inside the program.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Core {
    /// Slot pitch along the gap.
    pub slot_pitch: Option<Length>,
    /// Bore diameter of a rotary core.
    pub bore: Option<Length>,
    /// Stack length (core depth across the gap's direction of travel).
    pub stack: Option<Length>,
    /// Outside diameter of a rotary core's lamination (given, or from the back-iron
    /// depth).
    pub outside_diameter: Option<Length>,
    /// Back-iron (yoke) depth behind the slots (given, or from the diameters).
    pub yoke_depth: Option<Length>,
    /// Narrowest tooth width ([`crate::iron`]: given, or the slot pitch at the bore
    /// less the slot width).
    pub tooth_width: Option<Length>,
    /// Slot depth from the gap to the slot bottom.
    pub slot_depth: Option<Length>,
    /// Slot width at the bore (given, or the slot pitch less the tooth).
    pub slot_width: Option<Length>,
    /// Slot width at the slot bottom (wider than at the bore behind parallel-sided teeth),
    pub slot_bottom_width: Option<Length>,
    /// Steel over stack length; [`crate::iron::DEFAULT_STACKING_FACTOR`] when not given.
    pub stacking_factor: Option<f64>,
}

impl Core {
    /// The stacking factor in use: as given, or the default.
    pub fn stacking(&self) -> f64 {
        self.stacking_factor
            .unwrap_or(crate::iron::DEFAULT_STACKING_FACTOR)
    }
}

/// Supply the winding is designed for.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, schemars::JsonSchema)]
pub struct Supply {
    /// Supply frequency, hertz.
    pub frequency_hz: Option<f64>,
    /// Line-to-line voltage, volts r.m.s.
    pub line_voltage_v: Option<f64>,
}

/// Conductor metal of the magnet wire.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize, Default,
)]
#[serde(rename_all = "lowercase")]
pub enum Material {
    /// Annealed copper (IEC 60028).
    #[default]
    Copper,
    /// Aluminium (IEC 60889 values).
    #[serde(alias = "aluminum")]
    Aluminium,
}

impl std::fmt::Display for Material {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            Material::Copper => "copper",
            Material::Aluminium => "aluminium",
        })
    }
}

/// How the wire's bare size was given.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum WireSize {
    /// Bare diameter.
    Diameter(Length),
    /// American Wire Gauge number (0000 is −3).
    Awg(i32),
}

/// How the insulated diameter is found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Insulation {
    /// IEC 60317 enamel grade 1, 2 or 3.
    Grade(u8),
    /// Overall diameter over the enamel, as measured or from the maker's sheet.
    Diameter(Length),
}

/// The `[wire]` table.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WireSpec {
    /// Bare size of one strand.
    pub size: WireSize,
    /// Strands wound in hand as one conductor.
    pub strands_in_hand: u32,
    /// Enamel; grade 2 when not given.
    pub insulation: Insulation,
    /// Conductor metal.
    pub material: Material,
}

/// Rule for the mean length of one turn.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TurnRule {
    /// Mean turn as given (`core.mean_turn_mm`): overrides the rule.
    pub mean_turn: Option<Length>,
    /// Allowance per turn for both end windings beyond the span-proportional part.
    pub end_allowance: Length,
    /// End-winding length per coil end as a multiple of the coil's span width.
    pub end_factor: f64,
}

impl Default for TurnRule {
    /// l_mt = 2·L + 2·1.2·W + 0.1 m (the low-voltage rule quoted under `card::copper`).
    fn default() -> Self {
        TurnRule {
            mean_turn: None,
            end_allowance: Length::from_m(0.1),
            end_factor: 1.2,
        }
    }
}

/// The `[measured]` table: resistances as read, between line terminals or across each
/// section's own leads, and the winding temperature at the reading.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Measured {
    /// Between line terminals 1-2, 2-3 and 3-1, ohms.
    pub line_resistance_ohm: Option<[f64; 3]>,
    /// Across each section's own leads, ohms, in the card's section order: U, V, W (first
    /// sections), then U, V, W (second sections of a 9- or 12-lead winding). A nine-lead
    /// star machine's second sections meet inside, so their three values are the readings
    /// T7-T8, T8-T9, T9-T7 (U5-V5 ... in IEC marking) between their free ends.
    pub section_resistance_ohm: Option<Vec<f64>>,
    /// A single-phase stator's main winding across its own leads (both sections in
    /// series), ohms.
    pub main_resistance_ohm: Option<f64>,
    /// A single-phase stator's auxiliary winding across its own leads, ohms.
    pub aux_resistance_ohm: Option<f64>,
    /// A pole-changing winding's readings between its six leads as delivered (nothing
    /// linked), in the card's order: end to end (1U-1V, 1V-1W, 1W-1U), tap to tap (2U-2W,
    /// 2W-2V, 2V-2U), each end to its own tap (1U-2U, 1V-2W, 1W-2V), ohms.
    pub six_lead_ohm: Option<Vec<f64>>,
    /// Winding temperature at the measurement, °C.
    pub temperature_c: f64,
}

/// Insulation (thermal) class on a nameplate (IEC 60085).
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
pub enum InsulationClass {
    /// 105 °C.
    A,
    /// 120 °C.
    E,
    /// 130 °C.
    B,
    /// 155 °C.
    F,
    /// 180 °C.
    H,
}

/// The `[nameplate]` table: the machine's rating as stamped. Every field optional.
#[derive(Debug, Clone, PartialEq, Default, Serialize, schemars::JsonSchema)]
pub struct Nameplate {
    /// Rated output, watts (from `power_kw` or `power_hp`, 1 hp = 745.7 W).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_w: Option<f64>,
    /// Rated line voltages, volts: one, or two for a dual-voltage machine.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub voltages_v: Vec<f64>,
    /// Rated line currents, amperes, one per voltage.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub currents_a: Vec<f64>,
    /// Rated speed, revolutions per minute.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub speed_rpm: Option<f64>,
    /// Rated frequency, hertz.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub frequency_hz: Option<f64>,
    /// Frame designation as stamped.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub frame: Option<String>,
    /// Connection as stamped (e.g. "YY/Y", "D/Y").
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub connection: Option<String>,
    /// Insulation class.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub insulation_class: Option<InsulationClass>,
    /// Rated efficiency, a fraction.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub efficiency: Option<f64>,
    /// Rated power factor.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_factor: Option<f64>,
    /// Service factor (NEMA).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub service_factor: Option<f64>,
}

impl Nameplate {
    /// The rated line current that goes with line voltage `v`: the current stamped beside
    /// the voltage nearest to it, or the only current.
    pub fn current_at(&self, v: Option<f64>) -> Option<f64> {
        match (self.currents_a.len(), v) {
            (0, _) => None,
            (1, _) => self.currents_a.first().copied(),
            (_, None) => None,
            (_, Some(v)) => self
                .voltages_v
                .iter()
                .zip(&self.currents_a)
                .min_by(|a, b| (a.0 - v).abs().total_cmp(&(b.0 - v).abs()))
                .map(|(_, i)| *i),
        }
    }
}

/// The `[job]` table: the shop's job data, printed on the card and the title block.
#[derive(Debug, Clone, PartialEq, Default, Serialize, schemars::JsonSchema)]
pub struct Job {
    /// Job or work-order number.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub number: Option<String>,
    /// Customer.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub customer: Option<String>,
    /// Date, as written.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub date: Option<String>,
    /// Who did the work.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub technician: Option<String>,
    /// Free notes.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub notes: Option<String>,
}

/// Conductor of a flat primary's secondary plate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Secondary {
    /// Electrical conductivity, S/m.
    pub conductivity_s_m: f64,
    /// Plate thickness.
    pub thickness: Length,
    /// Plate width across the direction of travel (the stack width when not given).
    pub width: Option<Length>,
    /// True when the plate lies on back iron (single-sided machine); false for a plate
    /// between two primaries facing each other, both excited (a double-sided pair).
    pub back_iron: bool,
    /// The plate's working temperature, °C (20 when not given).
    pub temperature_c: f64,
    /// The plate metal's temperature coefficient of resistance at 20 °C, 1/K.
    pub alpha_per_k: f64,
    /// The steel behind the plate when its thickness is given; `None` with back iron is
    /// ideal iron (infinitely permeable, not conducting).
    pub backing: Option<Backing>,
}

impl Secondary {
    /// The plate's conductivity at its working temperature, S/m: σ_20/(1 + α·(T − 20))
    /// (the linear law of IEC 60028 and IEC 60889 for the tabulated metals).
    pub fn conductivity_hot_s_m(&self) -> f64 {
        self.conductivity_s_m / (1.0 + self.alpha_per_k * (self.temperature_c - 20.0))
    }
}

/// A mild-steel backing's conductivity when only its thickness is given, MS/m (from
/// memory: low-carbon steels lie about 5 to 7 MS/m at 20 °C; the lower end).
pub const BACKING_STEEL_MS_M: f64 = 5.0;

/// A mild-steel backing's relative permeability when only its thickness is given (from
/// memory: a moderate-flux figure for mild steel; the model takes the steel as linear).
pub const BACKING_STEEL_PERMEABILITY: f64 = 500.0;

/// A steel backing of given thickness behind the plate (a single-sided machine's
/// secondary iron, when it is not taken as ideal).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Backing {
    /// Thickness.
    pub thickness: Length,
    /// Electrical conductivity, S/m.
    pub conductivity_s_m: f64,
    /// Relative permeability (a constant: the steel is taken as unsaturated).
    pub relative_permeability: f64,
}

/// Lead-marking scheme on the terminal box.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize, Default,
)]
#[serde(rename_all = "lowercase")]
pub enum Marking {
    /// IEC 60034-8 letters: U1, U2, V1, ...
    #[default]
    Iec,
    /// NEMA MG 1 T-lead numbers: T1, T2, ...
    Nema,
}

/// Leads brought out and how they are marked.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
pub struct Leads {
    /// Leads brought out: 3, 6, 9 or 12.
    pub count: u8,
    /// Marking scheme.
    pub marking: Marking,
    /// In a two-winding motor, the speed this winding serves numbered from the lowest (1
    /// or 2), which its markings carry; 0 for a machine of one winding.
    pub speed: u8,
}

impl Default for Leads {
    fn default() -> Self {
        Leads {
            count: 6,
            marking: Marking::Iec,
            speed: 0,
        }
    }
}

/// What a winding is asked to be: core, supply, the designer's choices for the coils, and
/// the shop's data. Synthesis reads it and nothing else; a [`crate::winding::Winding`] keeps
/// it beside the coils it was built with (or recorded as). Every shop field is optional in
/// the layout file.
#[derive(Debug, Clone, PartialEq)]
pub struct Design {
    /// Closed or open core.
    pub topology: Topology,
    /// Slot count Z, end slots of a linear primary included.
    pub slots: usize,
    /// Pole count 2p.
    pub poles: usize,
    /// Phase count m.
    pub phases: usize,
    /// Labels of the phases, in sequence order.
    pub phase_labels: Vec<String>,
    /// Layers per slot, 1 or 2.
    pub layers: usize,
    /// Coil span asked for, in slot pitches; `None` means "nearest full pitch" (the span a
    /// winding was built with is [`crate::winding::Winding::pitch`]).
    pub pitch: Option<usize>,
    /// Coil shape of single-layer windings.
    pub style: Style,
    /// Turns per coil.
    pub turns_per_coil: u32,
    /// Parallel paths per phase asked for.
    pub parallel_paths: usize,
    /// Star or delta.
    pub connection: Connection,
    /// Skew of slots against the field, in slot pitches.
    pub skew_slots: f64,
    /// Core sizes.
    pub core: Core,
    /// Supply.
    pub supply: Supply,
    /// Magnet wire.
    pub wire: Option<WireSpec>,
    /// Mean-turn rule.
    pub turn: TurnRule,
    /// Usable slot area for the wire.
    pub slot_area: Option<Area>,
    /// Slot width and depth of a rectangular slot, when given as dimensions.
    pub slot_size: Option<(Length, Length)>,
    /// Mechanical clearance between primary and secondary.
    pub airgap: Option<Length>,
    /// Slot opening width at the gap.
    pub slot_opening: Option<Length>,
    /// Phase resistance at 20 °C given directly (when no wire data), ohms.
    pub phase_resistance_ohm: Option<f64>,
    /// Leads and marking.
    pub leads: Leads,
    /// Measured values for the audit.
    pub measured: Option<Measured>,
    /// Secondary plate of a flat primary.
    pub secondary: Option<Secondary>,
    /// True when `winding.turns_per_coil` was not given and one turn is assumed.
    pub turns_assumed: bool,
    /// The rating as stamped.
    pub nameplate: Option<Nameplate>,
    /// The shop's job data.
    pub job: Option<Job>,
    /// The winding's working temperature, °C, for the flat primary's resistance (20 when
    /// not given).
    pub winding_temperature_c: f64,
    /// A one-winding two-speed connection: the coils laid out at `poles` also serve twice
    /// as many poles (consequent poles), each phase's halves in series for the higher
    /// count and in parallel, one half reversed, for the lower.
    pub pole_change: Option<PoleChange>,
    /// A single-phase winding (`machine.phases = 1`): a main and an auxiliary winding 90
    /// electrical degrees apart, held as two phases of the coil list (main first).
    pub single_phase: Option<SinglePhase>,
    /// The winding lies in every other slot only, from slot 1 (`Some(0)`) or slot 2
    /// (`Some(1)`): one of two windings sharing a core by slots. Synthesis lays it out on
    /// half the slots and places it in its own; its span is in the core's slot pitches.
    pub alternate_slots: Option<usize>,
}

/// A single-phase stator's two windings and how the auxiliary is fed.
#[derive(Debug, Clone, PartialEq)]
pub struct SinglePhase {
    /// The main winding.
    pub main: PartSpec,
    /// The auxiliary (starting or capacitor) winding.
    pub aux: PartSpec,
    /// How a group's turns are shared among its concentric coils.
    pub grading: Grading,
    /// What is in series with the auxiliary winding.
    pub capacitor: CapacitorDuty,
    /// Slip at which a run capacitor is to balance the field; from the nameplate's speed
    /// when not given.
    pub slip: Option<f64>,
    /// The motor's equivalent circuit referred to the main winding, for the capacitor.
    pub circuit: Option<Circuit>,
    /// Main winding in two equal sections (dual voltage) or one.
    pub main_sections: u8,
    /// The auxiliary winding's wire, when it differs from the main's (`[wire]`).
    pub aux_wire: Option<WireSpec>,
    /// The auxiliary winding's resistance at 20 °C given directly, ohms.
    pub aux_resistance_ohm: Option<f64>,
}

/// One winding of a single-phase stator: how many concentric coils each pole's group has
/// (the largest spans that fit about its axis; all of them when not given) and its turns.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PartSpec {
    /// Coils in each pole's group, largest span first.
    pub coils_per_group: Option<usize>,
    /// Turns of the group, shared by the grading, or of each coil, largest span first.
    pub turns: PartTurns,
}

/// A group's turns: a total shared among its coils by the grading, or given coil by coil.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum PartTurns {
    /// Turns of one pole's group, all its coils together.
    PerGroup(u32),
    /// Turns of each coil of a group, largest span first.
    PerCoil(Vec<u32>),
}

/// How a group's turns are shared among its concentric coils.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "lowercase")]
pub enum Grading {
    /// Turns in proportion to the sine of each coil's half span, so the conductors of a
    /// pole approach a sinusoidal distribution.
    Sine,
    /// Equal turns in every coil.
    Equal,
}

/// What is in series with the auxiliary winding.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "kebab-case")]
pub enum CapacitorDuty {
    /// A permanent run capacitor: the auxiliary stays in circuit.
    Run,
    /// A start capacitor, cut out by a switch near running speed.
    Start,
    /// A start capacitor for starting and a run capacitor that stays in circuit.
    StartAndRun,
    /// No capacitor: a resistance split-phase start.
    None,
}

/// The equivalent circuit of the motor referred to the main winding (the per-phase circuit
/// of the balanced two-phase machine: the single-phase circuit's halves doubled), ohms.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Circuit {
    /// Magnetizing reactance X_m.
    pub magnetizing_reactance_ohm: f64,
    /// Rotor resistance R_2' at working temperature.
    pub rotor_resistance_ohm: f64,
    /// Rotor leakage reactance X_2'.
    pub rotor_reactance_ohm: f64,
    /// Main winding's leakage reactance X_1m.
    pub main_leakage_reactance_ohm: f64,
    /// Auxiliary winding's leakage reactance X_1a; a²·X_1m when not given (same slots,
    /// leakage in proportion to turns squared).
    pub aux_leakage_reactance_ohm: Option<f64>,
}

/// How a pole-changing winding (two speeds in the ratio 1:2 from one winding, consequent
/// poles) is connected at its two speeds. Each phase is in two halves: in series for the
/// higher pole count (the lower speed), in parallel with one half reversed, as a double
/// star, for the lower pole count (the higher speed).
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema, serde::Deserialize,
)]
#[serde(rename_all = "kebab-case")]
pub enum PoleChange {
    /// Series delta at the lower speed, double star at the higher: the constant-torque
    /// connection by the standards' naming.
    DeltaDoubleStar,
    /// Series star at the lower speed, double star at the higher: the variable-torque
    /// connection (fans, pumps).
    StarDoubleStar,
}

impl PoleChange {
    /// How the halves' phases are joined at the lower speed (each phase's halves in series).
    pub fn lower_connection(self) -> Connection {
        match self {
            PoleChange::DeltaDoubleStar => Connection::Delta,
            PoleChange::StarDoubleStar => Connection::Star,
        }
    }
}

impl Design {
    /// A three-phase design of the given core with every optional key at its default (U, V,
    /// W; lap; one turn per coil; one path; star; no skew; nearest full pitch; no shop
    /// data): the start for feasibility probes, surveys and tests, changed with
    /// struct-update syntax.
    pub fn basic(topology: Topology, slots: usize, poles: usize, layers: usize) -> Design {
        Design {
            topology,
            slots,
            poles,
            phases: 3,
            phase_labels: vec!["U".into(), "V".into(), "W".into()],
            layers,
            pitch: None,
            style: Style::Lap,
            turns_per_coil: 1,
            parallel_paths: 1,
            connection: Connection::Star,
            skew_slots: 0.0,
            core: Core::default(),
            supply: Supply::default(),
            wire: None,
            turn: TurnRule::default(),
            slot_area: None,
            slot_size: None,
            airgap: None,
            slot_opening: None,
            phase_resistance_ohm: None,
            leads: Leads::default(),
            measured: None,
            secondary: None,
            turns_assumed: false,
            nameplate: None,
            job: None,
            winding_temperature_c: 20.0,
            pole_change: None,
            single_phase: None,
            alternate_slots: None,
        }
    }

    /// The same design asked for at span `y` (everything else whole).
    pub fn with_span(&self, y: usize) -> Design {
        Design {
            pitch: Some(y),
            ..self.clone()
        }
    }

    /// Slot pitch along the gap: given directly, or from the bore of a rotary core.
    pub fn slot_pitch(&self) -> Option<Length> {
        self.core.slot_pitch.or_else(|| {
            self.core
                .bore
                .filter(|_| self.topology == Topology::Rotary)
                .map(|d| std::f64::consts::PI * d / self.slots as f64)
        })
    }
}

/// What names and paints a winding on sheets and reports, apart from its physics.
#[derive(Debug, Clone, PartialEq, Default, Serialize, schemars::JsonSchema)]
pub struct Labels {
    /// Free text for drawings and reports.
    pub title: Option<String>,
    /// Drawing colours per phase, when the layout overrides the defaults.
    pub colours: Option<Vec<String>>,
}
