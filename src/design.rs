//! What the shop and the physics need besides the coils: wire, copper rule, slot area, air
//! gap, secondary plate, lead scheme and measured values. Parsed from the layout file once,
//! carried by every [`crate::winding::Winding`], read by the data card and the thrust model;
//! a new layout key touches the parser and this file only. SI units inside.

use serde::Serialize;

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
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum WireSize {
    /// Bare diameter, metres.
    Diameter(f64),
    /// American Wire Gauge number (0000 is −3).
    Awg(i32),
}

/// How the insulated diameter is found.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum Insulation {
    /// IEC 60317 enamel grade 1, 2 or 3.
    Grade(u8),
    /// Overall diameter over the enamel, metres, as measured or from the maker's sheet.
    Diameter(f64),
}

/// The `[wire]` table.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
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
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct TurnRule {
    /// Mean turn as given (`core.mean_turn_mm`), metres: overrides the rule.
    pub mean_turn_m: Option<f64>,
    /// Allowance per turn for both end windings beyond the span-proportional part, metres.
    pub end_allowance_m: f64,
    /// End-winding length per coil end as a multiple of the coil's span width.
    pub end_factor: f64,
}

impl Default for TurnRule {
    /// l_mt = 2·L + 2·1.2·W + 0.1 m (the low-voltage rule quoted under `card::copper`).
    fn default() -> Self {
        TurnRule {
            mean_turn_m: None,
            end_allowance_m: 0.1,
            end_factor: 1.2,
        }
    }
}

/// The `[measured]` table: line-to-line resistances as measured at the terminals.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Measured {
    /// Between line terminals 1-2, 2-3 and 3-1, ohms.
    pub line_resistance_ohm: [f64; 3],
    /// Winding temperature at the measurement, °C.
    pub temperature_c: f64,
}

/// Conductor of a flat primary's secondary plate.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Secondary {
    /// Electrical conductivity, S/m.
    pub conductivity_s_m: f64,
    /// Plate thickness, metres.
    pub thickness_m: f64,
    /// Plate width across the direction of travel, metres (the stack width when not given).
    pub width_m: Option<f64>,
    /// True when the plate lies on back iron (single-sided machine).
    pub back_iron: bool,
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
}

impl Default for Leads {
    fn default() -> Self {
        Leads {
            count: 6,
            marking: Marking::Iec,
        }
    }
}

/// Design data besides the coils. Every field is optional in the layout file.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema, Default)]
pub struct Design {
    /// Magnet wire.
    pub wire: Option<WireSpec>,
    /// Mean-turn rule.
    pub turn: TurnRule,
    /// Usable slot area for the wire, m².
    pub slot_area_m2: Option<f64>,
    /// Slot width and depth of a rectangular slot, m, when given as dimensions.
    pub slot_size_m: Option<(f64, f64)>,
    /// Mechanical clearance between primary and secondary, metres.
    pub airgap_m: Option<f64>,
    /// Slot opening width at the gap, metres.
    pub slot_opening_m: Option<f64>,
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
}
