//! Conductor metals and magnet-wire sizes: AWG by its defining formula, the metric nominal
//! diameters of IEC 60317, enamel grades, and the resolved wire of a design.

use serde::Serialize;

use crate::design::{Insulation, Material, WireSize, WireSpec};
use crate::units::{Area, Length};

/// Electrical and mass constants of a conductor metal at 20 °C.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Metal {
    /// Resistivity at 20 °C, Ω·m.
    pub resistivity_ohm_m: f64,
    /// Temperature coefficient of resistance at 20 °C, 1/K.
    pub alpha_per_k: f64,
    /// Density, kg/m³.
    pub density_kg_m3: f64,
}

impl Metal {
    /// Conductivity at 20 °C, S/m.
    pub fn conductivity_s_m(&self) -> f64 {
        1.0 / self.resistivity_ohm_m
    }

    /// Resistance at `t_c` from the value at 20 °C: R_t = R_20·(1 + α_20·(t − 20))
    /// (IEC 60028, linear temperature law).
    pub fn at_temperature(&self, r20: f64, t_c: f64) -> f64 {
        r20 * (1.0 + self.alpha_per_k * (t_c - 20.0))
    }
}

/// Annealed copper: IEC 60028 (International Annealed Copper Standard) resistivity
/// 1/58 Ω·mm²/m at 20 °C, α_20 = 0.00393/K, density 8.89 g/cm³.
pub const COPPER: Metal = Metal {
    // Ω·mm²/m to Ω·m: the square millimetres are an area.
    resistivity_ohm_m: Area::from_mm2(1.0 / 58.0).m2(),
    alpha_per_k: 0.00393,
    density_kg_m3: 8890.0,
};

/// Aluminium: IEC 60889 (hard-drawn aluminium for conductors) resistivity 0.028264 Ω·mm²/m
/// at 20 °C, α_20 = 0.00403/K, density 2.703 g/cm³.
pub const ALUMINIUM: Metal = Metal {
    resistivity_ohm_m: Area::from_mm2(0.028264).m2(),
    alpha_per_k: 0.00403,
    density_kg_m3: 2703.0,
};

/// Conductivity of an aluminium secondary plate when only "aluminium" is given: the
/// IEC 60889 value, 35.4 MS/m (a commercially pure grade; alloys are lower, give
/// `conductivity_ms_m` for them).
pub const PLATE_ALUMINIUM_S_M: f64 = 1.0 / ALUMINIUM.resistivity_ohm_m;

/// The metal's constants.
pub fn metal(m: Material) -> Metal {
    match m {
        Material::Copper => COPPER,
        Material::Aluminium => ALUMINIUM,
    }
}

/// Diameter of AWG gauge 36, the defining formula's base (ASTM B258).
const AWG_36: f64 = 0.127;

/// Bare diameter of AWG gauge `n` (0000 = −3): d = 0.127 mm × 92^((36 − n)/39)
/// (ASTM B258, the defining formula).
pub fn awg_diameter(n: i32) -> Length {
    Length::from_mm(AWG_36 * 92f64.powf((36.0 - n as f64) / 39.0))
}

/// The gauge whose diameter is nearest to `d` on the logarithmic scale, and whether it is
/// within 1 % (a wire that *is* that gauge rather than merely near it).
pub fn nearest_awg(d: Length) -> (i32, bool) {
    let n = (36.0 - 39.0 * (d.mm() / AWG_36).ln() / 92f64.ln()).round() as i32;
    let n = n.clamp(-3, 56);
    let close = (awg_diameter(n) / d - 1.0).abs() <= 0.01;
    (n, close)
}

/// The R40 preferred numbers of one decade (ISO 3).
const R40: [f64; 40] = [
    1.00, 1.06, 1.12, 1.18, 1.25, 1.32, 1.40, 1.50, 1.60, 1.70, 1.80, 1.90, 2.00, 2.12, 2.24, 2.36,
    2.50, 2.65, 2.80, 3.00, 3.15, 3.35, 3.55, 3.75, 4.00, 4.25, 4.50, 4.75, 5.00, 5.30, 5.60, 6.00,
    6.30, 6.70, 7.10, 7.50, 8.00, 8.50, 9.00, 9.50,
];

/// Nominal bare diameters of round enamelled winding wire from 0.100 to 5.00 mm: the R20
/// series with its R40 intermediate sizes (ISO 3 preferred numbers), on which the nominal
/// diameters of IEC 60317-0-1 are based (from memory).
pub fn iec_60317() -> impl Iterator<Item = Length> {
    R40.iter()
        .map(|x| x / 10.0)
        .chain(R40.iter().copied().filter(|x| *x <= 5.0))
        .map(Length::from_mm)
}

/// Overall diameter over the enamel of a grade 1, 2 or 3 wire of bare diameter `d`:
/// d + 0.031 mm·(grade + 1)·√(d/mm), a rule in millimetres. An approximation to the maximum overall diameters
/// of IEC 60317-0-1 (within a few µm of the tabulated values at 0.2, 0.5 and 1.0 mm, from
/// memory); give `insulated_diameter_mm` from the maker's sheet where it matters.
pub fn grade_overall_diameter(d: Length, grade: u8) -> Length {
    let dm = d.mm();
    Length::from_mm(dm + 0.031 * (grade as f64 + 1.0) * dm.sqrt())
}

/// A design's wire with every size resolved.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Wire {
    /// Bare diameter of one strand, mm.
    #[serde(rename = "diameter_mm", serialize_with = "crate::units::in_mm")]
    pub diameter: Length,
    /// Bare cross-section of one strand, mm².
    #[serde(rename = "area_mm2", serialize_with = "crate::units::in_mm2")]
    pub area: Area,
    /// Strands wound in hand as one conductor.
    pub strands_in_hand: u32,
    /// Copper (or aluminium) cross-section of the whole conductor, mm².
    #[serde(rename = "conductor_area_mm2", serialize_with = "crate::units::in_mm2")]
    pub conductor_area: Area,
    /// AWG gauge: as given, or the gauge this diameter is (within 1 %); null otherwise.
    pub awg: Option<i32>,
    /// Overall diameter over the enamel, mm.
    #[serde(
        rename = "insulated_diameter_mm",
        serialize_with = "crate::units::in_mm"
    )]
    pub insulated_diameter: Length,
    /// How the overall diameter was found: "grade 2 (IEC 60317)" or "as given".
    pub insulation: String,
    /// Conductor metal.
    pub material: Material,
}

impl Wire {
    /// Resolve the layout's wire table.
    pub fn of(spec: &WireSpec) -> Wire {
        let (d, awg) = match spec.size {
            WireSize::Diameter(d) => {
                let (n, close) = nearest_awg(d);
                (d, close.then_some(n))
            }
            WireSize::Awg(n) => (awg_diameter(n), Some(n)),
        };
        let (over, insulation) = match spec.insulation {
            Insulation::Grade(g) => (
                grade_overall_diameter(d, g),
                format!("grade {g} (IEC 60317, approximate)"),
            ),
            Insulation::Diameter(o) => (o.max(d), "as given".to_string()),
        };
        let area = Area::of_circle(d);
        Wire {
            diameter: d,
            area,
            strands_in_hand: spec.strands_in_hand,
            conductor_area: area * spec.strands_in_hand as f64,
            awg,
            insulated_diameter: over,
            insulation,
            material: spec.material,
        }
    }
}

/// One way to make up a conductor of a wanted area from standard wire.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct StandardWire {
    /// Strands in hand.
    pub strands_in_hand: u32,
    /// Bare diameter of each strand, mm (an IEC 60317 nominal size, or an AWG gauge's).
    #[serde(rename = "diameter_mm", serialize_with = "crate::units::in_mm")]
    pub diameter: Length,
    /// AWG gauge when the size is taken from the AWG series.
    pub awg: Option<i32>,
    /// Conductor area over the wanted area (1 = exact).
    pub area_ratio: f64,
}

/// The standard wire nearest to a wanted conductor area for 1 to `max_strands` strands
/// in hand, one per strand count, from the IEC 60317 metric series or the AWG series:
/// the size whose area is nearest on the ratio scale, so neither more nor less copper is
/// favoured. Sizes under 0.1 mm or over 5 mm are not offered.
pub fn standard_choices(wanted: Area, max_strands: u32, awg: bool) -> Vec<StandardWire> {
    let sizes: Vec<(Length, Option<i32>)> = if awg {
        (4..=38).map(|n| (awg_diameter(n), Some(n))).collect()
    } else {
        iec_60317().map(|d| (d, None)).collect()
    };
    (1..=max_strands)
        .filter_map(|s| {
            let per = wanted / s as f64;
            sizes
                .iter()
                .map(|&(d, n)| {
                    let a = Area::of_circle(d);
                    (d, n, a * s as f64 / wanted, (a / per).ln().abs())
                })
                .min_by(|x, y| x.3.total_cmp(&y.3))
                .filter(|x| x.3 < 0.12)
                .map(|(d, n, ratio, _)| StandardWire {
                    strands_in_hand: s,
                    diameter: d,
                    awg: n,
                    area_ratio: ratio,
                })
        })
        .collect()
}

/// Fill of a slot of usable area `area` by `wires` round wires of overall diameter `d`: the
/// wires' circle areas ([`Area::of_circle`], the one rule for every wire, strand and option
/// the tool sizes) over the area (the one fill rule of the card, the loadings and the
/// sizing; common practice of random-wound shops).
pub fn slot_fill(wires: f64, d: Length, area: Area) -> f64 {
    wires * Area::of_circle(d) / area
}
