//! What an analysis assumed, because a layout left a value out or the model needs it, as
//! typed facts; `output::warning_words` puts them into words (text, JSON strings, sheets).

use crate::units::{Conductivity, Length};

/// One assumption an analysis made (worded by the presenters, which write it into the JSON with its `message`).
#[derive(Debug, Clone, PartialEq, serde::Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Assumption {
    /// The flat primary's model: thin plate, unsaturated iron, secondary leakage neglected,
    /// plate wider than the stack, sinusoidal fields.
    ThrustModel,
    /// No back iron behind the plate: a double-sided pair of equal primaries fed alike.
    NoBackIron,
    /// The field model's own assumptions (the layer method of `layers`).
    FieldModel,
    /// The working temperatures the resistance and the plate's conductivity are taken at.
    Temperatures {
        /// Winding, °C.
        winding_c: f64,
        /// Plate, °C.
        plate_c: f64,
    },
    /// The field model's wavenumbers were bounded: its window (how far the plate's field is
    /// followed) and its range (the shortest waves) are shorter than the inputs ask.
    FieldGridBounded {
        /// Window used, m.
        window_m: f64,
        /// Window the field's reach asked for, m.
        wanted_m: f64,
        /// Largest wavenumber used, 1/m.
        k_max: f64,
        /// Largest wavenumber the gap and slots asked for, 1/m.
        wanted_k_max: f64,
    },
    /// The steel backing is thin enough to saturate: its peak flux density (half the flux
    /// per pole through its section) above the limit.
    BackingSaturates {
        /// Peak flux density in the backing, T.
        tesla: f64,
        /// The limit, T.
        limit_tesla: f64,
        /// Backing thickness, mm.
        #[serde(rename = "thickness_mm", serialize_with = "crate::units::in_mm")]
        thickness: Length,
    },
    /// No slot opening given: Carter's coefficient 1.
    NoSlotOpening,
    /// No plate width given: as wide as the stack.
    NoPlateWidth,
    /// No wire and no phase resistance: primary resistance 0.
    NoPrimaryResistance,
    /// No slot width and depth: slot permeance 1.0.
    NoSlotSize,
    /// The magnetic gap the model used, millimetres.
    MagneticGap {
        /// Gap, mm.
        #[serde(rename = "mm", serialize_with = "crate::units::in_mm")]
        gap: Length,
    },
    /// No full `[supply]`: currents at 50 Hz and 400 V line voltage.
    SupplyDefaulted,
    /// One design gives no line voltage: the other's (or one common value) for both.
    LineVoltageShared {
        /// The line voltage taken, volts, when either design gives one.
        volts: Option<f64>,
    },
    /// One design gives no frequency: the other's (or one common value) for both.
    FrequencyShared {
        /// The frequency taken, hertz, when either design gives one.
        hertz: Option<f64>,
    },
    /// The goodness factor lies outside the range the circuit model stands for (about 1 to
    /// 50): its figures are an extrapolation.
    GoodnessOutOfRange {
        /// The goodness factor G.
        goodness: f64,
    },
    /// The magnetic gap is not small against the pole pitch (g_e/τ above 0.1): the
    /// one-dimensional gap of the circuit overstates thrust and normal force.
    GapLargeAgainstPitch {
        /// g_e/τ.
        ratio: f64,
    },
    /// The coil matrix is left out above this many coils (its size grows with the square).
    CoilMatrixOmitted {
        /// Coils of the winding.
        coils: usize,
        /// The largest count given a coil matrix.
        limit: usize,
    },
    /// The pole count changes in a rewind: the peak air-gap flux density is kept.
    PoleCountChanges {
        /// Poles before.
        from: usize,
        /// Poles after.
        to: usize,
    },
    /// No differential leakage could be worked out (no working wave): X1 leaves it out.
    NoDifferentialLeakage,
    /// The plate's conductivity the model used, at the plate's temperature.
    PlateConductivity {
        /// MS/m.
        #[serde(rename = "ms_m", serialize_with = "crate::units::in_ms_m")]
        conductivity: Conductivity,
    },
    /// The plate is narrower than the stack: the edge factor takes it as wide as the stack.
    PlateNarrowerThanStack {
        /// Plate width, mm.
        #[serde(rename = "plate_mm", serialize_with = "crate::units::in_mm")]
        plate: Length,
        /// Stack width, mm.
        #[serde(rename = "stack_mm", serialize_with = "crate::units::in_mm")]
        stack: Length,
    },
    /// The plate is thicker than its skin depth at the supply frequency, so the thin-plate
    /// model holds only at low slips.
    PlateThickerThanSkinDepth {
        /// Plate thickness, mm.
        #[serde(rename = "thickness_mm", serialize_with = "crate::units::in_mm")]
        thickness: Length,
        /// Skin depth at the supply frequency (standstill), mm.
        #[serde(rename = "skin_depth_mm", serialize_with = "crate::units::in_mm")]
        skin_depth: Length,
        /// The slip below which the plate is thinner than its skin depth.
        thin_below_slip: f64,
    },
    /// The primary's current density at the largest current of the sweep passes the
    /// card's limit.
    PrimaryCurrentDensity {
        /// A/mm².
        density_a_mm2: f64,
        /// The limit, A/mm².
        limit_a_mm2: f64,
        /// At this slip.
        slip: f64,
    },
    /// What the plate turns into heat at standstill (slip 1, all the gap power).
    PlateHeatingAtStandstill {
        /// W, by the circuit.
        watts: f64,
        /// W/cm² of plate under the primary, by the circuit.
        w_cm2: f64,
        /// W, by the field model (null before it has run).
        field_watts: Option<f64>,
        /// W/cm², by the field model.
        field_w_cm2: Option<f64>,
    },
}
