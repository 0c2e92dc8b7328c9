//! The loadings of a winding on its core: flux per pole and the flux densities in gap, teeth
//! and back iron, electric loading, current density, slot fill and an estimated temperature
//! rise, each against its limit. The one owner of these figures: `size`, `rewind`, the card
//! and the report read them from here.
//!
//! Flux per pole from the EMF equation at no load, where the flux is highest (E_ph = V_ph):
//!   Φ = E_ph / (√2·π·f·N_ph·k_w1)
//! (M. G. Say, *Alternating Current Machines*, 5th ed. 1983, §4.3, with √2·π = 4.443 for the
//! rounded 4.44). The gap field is a sinusoid of peak B̂_δ over a pole pitch τ and stack L:
//!   Φ = (2/π)·B̂_δ·τ·L, mean B_av = Φ/(τ·L).
//! Every slot pitch's flux passes through one tooth; at the tooth's narrowest width t with
//! stacking factor k_Fe the peak (apparent) tooth density is
//!   B̂_t = B̂_δ·τ_s / (k_Fe·t)
//! and half the pole's flux passes through the back iron of depth h_y:
//!   B̂_y = Φ / (2·k_Fe·L·h_y)
//! (Pyrhönen, Jokinen, Hrabovcová, *Design of Rotating Electrical Machines*, 2nd ed. 2014,
//! ch. 3, magnetic circuit; the same as the textbook "mean tooth flux density × π/2" when
//! the teeth under a pole are counted as Z/2p). Ducts are not counted.
//!
//! Electric loading A = z_Q·I_c/τ_s (conductors in a full slot times the conductor current,
//! per slot pitch); current density J = I_c/a_c. Temperature rise: see [`heating`].

use crate::units::{Area, Length};
use serde::Serialize;
use std::f64::consts::{PI, SQRT_2};

use crate::card;
use crate::design::{InsulationClass, Nameplate, SQRT_3};
use crate::factors;
use crate::thrust::Input;
use crate::winding::{Topology, Winding};
use crate::wire::{Wire, metal};

/// Limits the loadings are checked against (and sized to).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Limits {
    /// Peak gap flux density B̂_δ, T.
    pub gap_t: f64,
    /// Peak tooth flux density at the narrowest section, T.
    pub tooth_t: f64,
    /// Peak back-iron flux density, T.
    pub yoke_t: f64,
    /// Current density in the conductor, A/mm².
    pub current_density_a_mm2: f64,
    /// Fill of the slot by insulated wire.
    pub slot_fill: f64,
    /// Heat-transfer coefficient of the temperature-rise estimate, W/(m²·K) (not a limit:
    /// the one coefficient the estimate rests on, [`HEAT_TRANSFER_W_M2K`] by default).
    pub heat_transfer_w_m2k: f64,
}

/// Default peak gap flux density limit, T (see [`Limits::default`]).
pub const GAP_LIMIT_T: f64 = 0.85;
/// Default peak tooth flux density limit, T.
pub const TOOTH_LIMIT_T: f64 = 1.8;
/// Default peak back-iron flux density limit, T.
pub const YOKE_LIMIT_T: f64 = 1.6;

impl Default for Limits {
    /// Gap 0.85 T, teeth 1.8 T, back iron 1.6 T: within the ranges Pyrhönen et al. 2014,
    /// Table 6.2, give for induction machines (gap 0.7–0.9 T, teeth 1.4–2.1 T, stator yoke
    /// 1.4–1.7 T; from memory), at the level a rewind keeps for a motor of unknown steel
    /// (common practice). Current density and fill are the card's limits.
    fn default() -> Self {
        Limits {
            gap_t: GAP_LIMIT_T,
            tooth_t: TOOTH_LIMIT_T,
            yoke_t: YOKE_LIMIT_T,
            current_density_a_mm2: card::CURRENT_DENSITY_LIMIT_A_MM2,
            slot_fill: card::FILL_LIMIT,
            heat_transfer_w_m2k: HEAT_TRANSFER_W_M2K,
        }
    }
}

/// Efficiency taken when the nameplate gives power but neither current nor efficiency:
/// 0.85, typical of four-pole motors of a few kilowatts (common practice, from memory).
pub const ASSUMED_EFFICIENCY: f64 = 0.85;

/// Power factor taken when the nameplate gives none: 0.82 (common practice, from memory,
/// for the same motors).
pub const ASSUMED_POWER_FACTOR: f64 = 0.82;

/// Density of electrical steel, kg/m³ (7650 for non-oriented silicon steel, the value
/// EN 10106 uses for its loss grades; from memory).
pub const STEEL_DENSITY_KG_M3: f64 = 7650.0;

/// Specific loss of the steel at 1.5 T and 50 Hz when no grade is known: 5.30 W/kg, the
/// most a sheet of grade M530-50A may lose (EN 10106 names its grades by that figure).
pub const STEEL_LOSS_W_KG: f64 = 5.30;

/// Where the rated current came from.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum Rated {
    /// Stamped on the nameplate beside the supply's voltage.
    Stamped {
        /// Line current, A.
        line_a: f64,
    },
    /// From the rated power: I = P/(√3·U·η·cos φ).
    FromPower {
        /// Line current, A.
        line_a: f64,
        /// Efficiency used.
        efficiency: f64,
        /// True when the efficiency is [`ASSUMED_EFFICIENCY`].
        efficiency_assumed: bool,
        /// Power factor used.
        power_factor: f64,
        /// True when the power factor is [`ASSUMED_POWER_FACTOR`].
        power_factor_assumed: bool,
    },
    /// A flat primary's current at the slip it is sized for, from the thrust model.
    ThrustModel {
        /// Line current, A.
        line_a: f64,
        /// The slip.
        slip: f64,
    },
}

impl Rated {
    /// The line current, A.
    pub fn line_a(&self) -> f64 {
        match *self {
            Rated::Stamped { line_a }
            | Rated::FromPower { line_a, .. }
            | Rated::ThrustModel { line_a, .. } => line_a,
        }
    }
}

/// The rated line current of a three-phase machine at line voltage `line_v`: as stamped,
/// else from power, efficiency and power factor (IEC 60050-141 three-phase power
/// P_in = √3·U·I·cos φ, with P_out = η·P_in).
pub fn rated_current(plate: Option<&Nameplate>, line_v: Option<f64>) -> Option<Rated> {
    let plate = plate?;
    if let Some(i) = plate.current_at(line_v) {
        return Some(Rated::Stamped { line_a: i });
    }
    let (p, u) = (
        plate.power_w?,
        line_v.or(plate.voltages_v.first().copied())?,
    );
    let efficiency = plate.efficiency.unwrap_or(ASSUMED_EFFICIENCY);
    let power_factor = plate.power_factor.unwrap_or(ASSUMED_POWER_FACTOR);
    Some(Rated::FromPower {
        line_a: p / (SQRT_3 * u * efficiency * power_factor),
        efficiency,
        efficiency_assumed: plate.efficiency.is_none(),
        power_factor,
        power_factor_assumed: plate.power_factor.is_none(),
    })
}

/// One flux density against its limit.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Density {
    /// Peak value, T.
    pub peak_t: f64,
    /// The limit, T.
    pub limit_t: f64,
}

impl Density {
    /// True when the value is above its limit.
    pub fn passed(&self) -> bool {
        self.peak_t > self.limit_t
    }
}

/// A figure against its limit (current density, fill, temperature rise).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Checked {
    /// The value.
    pub value: f64,
    /// The limit.
    pub limit: f64,
}

impl Checked {
    /// True when the value is above its limit.
    pub fn passed(&self) -> bool {
        self.value > self.limit
    }
}

/// The magnetic loading at no load.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Magnetic {
    /// EMF over phase voltage k_E (1: no load).
    pub emf_ratio: f64,
    /// Phase EMF taken, V (k_E × the phase voltage).
    pub phase_emf_v: f64,
    /// Frequency, Hz.
    pub frequency_hz: f64,
    /// Series turns per phase N_ph.
    pub series_turns: f64,
    /// Fundamental winding factor k_w1.
    pub winding_factor: f64,
    /// Flux per pole Φ, Wb.
    pub flux_per_pole_wb: f64,
    /// Mean gap flux density over a pole B_av = Φ/(τ·L), T (the "specific magnetic loading").
    pub gap_mean_t: f64,
    /// Peak gap flux density.
    pub gap: Density,
    /// Peak tooth flux density at the narrowest section, when the tooth width is known.
    pub tooth: Option<Density>,
    /// Mean tooth flux density over a pole at the narrowest section, Φ/((Z/2p)·k_Fe·t·L),
    /// T: the textbooks' "mean tooth density" (the peak is π/2 of it).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tooth_mean_t: Option<f64>,
    /// Peak back-iron flux density, when its depth is known.
    pub yoke: Option<Density>,
    /// Stacking factor used.
    pub stacking_factor: f64,
    /// For a pole-changing winding, the pole count of the speed these figures are worked
    /// at: the one whose gap density is higher (`None` for a winding of one speed).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub at_poles: Option<usize>,
}

/// The electric loading at rated current.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Electric {
    /// The rated current and where it came from.
    pub rated: Rated,
    /// Phase current, A.
    pub phase_current_a: f64,
    /// Current in one conductor (a path), A.
    pub conductor_current_a: f64,
    /// Conductors in the fullest slot z_Q.
    pub conductors_per_slot: u64,
    /// Electric loading A, A/m.
    pub electric_loading_a_m: f64,
    /// Current density, when the wire is known.
    pub current_density_a_mm2: Option<Checked>,
    /// Heat load A·J in (A/mm)·(A/mm²) = A²/mm³ (the electric loading in A/mm times the
    /// current density), the product a winding's heating follows.
    pub heat_load_a2_mm3: Option<f64>,
}

/// The temperature-rise estimate ([`heating`]).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Heating {
    /// Winding temperature the copper loss is taken at, °C (IEC 60034-2-1 reference).
    pub reference_c: f64,
    /// Stator copper loss at rated current, W.
    pub copper_loss_w: f64,
    /// Iron loss of teeth and back iron, W, when both are known.
    pub iron_loss_w: Option<f64>,
    /// Surface the heat leaves by, m².
    pub surface_m2: f64,
    /// Heat-transfer coefficient used, W/(m²·K).
    pub coefficient_w_m2k: f64,
    /// Estimated winding temperature rise against the class's limit, K.
    pub rise_k: Checked,
    /// Insulation class the limit is taken for.
    pub class: InsulationClass,
    /// True when the class was not stamped and F is taken.
    pub class_assumed: bool,
}

/// Why loadings cannot be worked out.
#[derive(Debug, Clone, Copy, PartialEq, Eq, thiserror::Error)]
pub enum LoadingError {
    /// An input the flux per pole needs is missing.
    #[error("missing {0:?}")]
    Missing(Input),
    /// The winding has no turns or no fundamental EMF in its first phase.
    #[error("no turns or no fundamental EMF")]
    NoTurns,
    /// The layout gives no turns (one per coil is only assumed): a bare core is sized, not
    /// checked.
    #[error("no turns given")]
    TurnsAssumed,
}

/// A loading that could not be checked, and what it needs.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum Unchecked {
    /// The teeth: a tooth or slot width.
    Teeth,
    /// The back iron: its depth, or the outside diameter with the slot depth.
    BackIron,
    /// Electric loading, current density and temperature rise: a rated current (stamped,
    /// or the rated power).
    Current,
    /// Current density and fill: the wire.
    Wire,
    /// Fill: the slot's area or sizes.
    SlotArea,
    /// Temperature rise: the outside diameter (rotary) and the stack.
    CoolingSurface,
}

/// A limit passed (or a figure that could not be checked), as a typed fact.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum LoadingWarning {
    /// A flux density above its limit.
    FluxDensityAbove {
        /// Which part of the core.
        part: Part,
        /// The value and its limit.
        density: Density,
        /// A pole-changing winding's speed where it is passed, by its pole count.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        at_poles: Option<usize>,
    },
    /// Current density above its limit.
    CurrentDensityAbove {
        /// A/mm² against the limit.
        density: Checked,
    },
    /// Slot fill above its limit.
    FillAbove {
        /// Fill against the limit.
        fill: Checked,
    },
    /// Estimated temperature rise above the class's limit.
    RiseAbove {
        /// K against the limit.
        rise: Checked,
    },
}

/// A part of the magnetic circuit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum Part {
    /// The air gap.
    Gap,
    /// The teeth at their narrowest.
    Teeth,
    /// The back iron.
    Yoke,
}

/// Everything this module works out for one winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Loading {
    /// Magnetic loading at no load (a pole-changing winding's: at the speed whose gap
    /// density is higher).
    pub magnetic: Magnetic,
    /// A pole-changing winding's other speed: its densities are held to the limits too
    /// (the back iron carries the larger flux per pole at the higher speed).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub other_speed: Option<Magnetic>,
    /// Electric loading, when a rated current is stamped or follows from the power.
    pub electric: Option<Electric>,
    /// Slot fill by insulated wire (the card's), against its limit.
    pub slot_fill: Option<Checked>,
    /// Temperature-rise estimate, when copper loss and the cooling surface are known.
    pub heating: Option<Heating>,
    /// The limits checked against.
    pub limits: Limits,
    /// What could not be checked, for want of a size or rating.
    pub unchecked: Vec<Unchecked>,
    /// Every limit passed, as typed facts (`limits_passed` in the JSON; the commands'
    /// `warnings` carry them with their words).
    #[serde(rename = "limits_passed")]
    pub warnings: Vec<LoadingWarning>,
}

/// The line voltage and frequency a winding's loadings are taken at: the supply's, else the
/// nameplate's. A dual-voltage winding (9 or 12 leads, two voltages stamped) is planned with
/// its sections in parallel, so at the lower voltage whatever the supply says (the card's
/// convention; it warns when the supply is the higher one).
pub fn supply_of(d: &crate::design::Design) -> (Option<f64>, Option<f64>) {
    let plate = d.nameplate.as_ref();
    let dual = plate
        .filter(|n| d.leads.count >= 9 && n.voltages_v.len() == 2)
        .and_then(|n| n.voltages_v.iter().copied().reduce(f64::min));
    let line = dual
        .or(d.supply.line_voltage_v)
        .or_else(|| plate.and_then(|n| n.voltages_v.first().copied()));
    let f = d
        .supply
        .frequency_hz
        .or_else(|| plate.and_then(|n| n.frequency_hz));
    (line, f)
}

/// The phase with the fewest effective series turns N_ph·k_w1 (the highest flux per pole;
/// every phase of a balanced winding alike), with its N_ph and k_w1.
pub fn weakest_phase(w: &Winding) -> (f64, f64) {
    (0..w.geometry.phases)
        .map(|p| {
            let kw = factors::factors_at(w, p, crate::winding::Elec::FUNDAMENTAL).winding;
            (w.series_turns(p), kw)
        })
        .min_by(|a, b| (a.0 * a.1).total_cmp(&(b.0 * b.1)))
        .unwrap_or((0.0, 0.0))
}

/// Flux per pole Φ = E/(√2·π·f·N·k_w1), Wb, for phase EMF `e` (V), frequency `f` (Hz) and
/// effective series turns `n_kw` = N_ph·k_w1: the EMF equation, the one place it is written.
pub fn flux_per_pole(e: f64, f: f64, n_kw: f64) -> f64 {
    e / (SQRT_2 * PI * f * n_kw)
}

/// Peak of a sinusoidal gap field carrying `phi` (Wb) per pole of pitch `tau` over stack
/// `l` (m): B̂ = π·Φ/(2·τ·L).
pub fn gap_peak(phi: f64, tau: f64, l: f64) -> f64 {
    PI * phi / (2.0 * tau * l)
}

/// The flux per pole and flux densities of `w` on its core at its supply, with the EMF
/// `emf_ratio` times the phase voltage (1 at no load, where the flux is highest).
pub fn magnetic(w: &Winding, limits: &Limits, emf_ratio: f64) -> Result<Magnetic, LoadingError> {
    Ok(magnetic_speeds(w, limits, emf_ratio)?.0)
}

/// [`magnetic`], and for a pole-changing winding its other speed beside it.
pub fn magnetic_speeds(
    w: &Winding,
    limits: &Limits,
    emf_ratio: f64,
) -> Result<(Magnetic, Option<Magnetic>), LoadingError> {
    let Some(low) = crate::winding::pole_change::lower_speed(w) else {
        return Ok((
            magnetic_at(w, limits, emf_ratio, 1.0, w.design.connection)?,
            None,
        ));
    };
    // A pole-changing winding: at the higher speed (as laid out) its halves are in
    // parallel in double star, so half its series turns at the star's phase voltage; at
    // the lower, all in series in that speed's connection. The speed of the higher gap
    // density is the one the core must carry.
    let mut high = magnetic_at(w, limits, emf_ratio, 0.5, crate::winding::Connection::Star)?;
    let mut lower = magnetic_at(&low, limits, emf_ratio, 1.0, low.design.connection)?;
    high.at_poles = Some(w.geometry.poles);
    lower.at_poles = Some(low.geometry.poles);
    Ok(if lower.gap.peak_t > high.gap.peak_t {
        (lower, Some(high))
    } else {
        (high, Some(lower))
    })
}

/// [`magnetic`] of `w` as one winding of `turns_share` of its series turns per phase,
/// connected `connection`.
fn magnetic_at(
    w: &Winding,
    limits: &Limits,
    emf_ratio: f64,
    turns_share: f64,
    connection: crate::winding::Connection,
) -> Result<Magnetic, LoadingError> {
    let d = &w.design;
    let (line, f) = supply_of(d);
    let line = line.ok_or(LoadingError::Missing(Input::LineVoltage))?;
    let f = f.ok_or(LoadingError::Missing(Input::Frequency))?;
    let tau = w
        .pole_pitch()
        .map(Length::m)
        .ok_or(LoadingError::Missing(Input::SlotPitch))?;
    let ts = w
        .slot_pitch()
        .map(Length::m)
        .ok_or(LoadingError::Missing(Input::SlotPitch))?;
    let l = d
        .core
        .stack
        .map(Length::m)
        .ok_or(LoadingError::Missing(Input::Stack))?;
    let (n, kw) = weakest_phase(w);
    let n = n * turns_share;
    if n <= 0.0 || kw <= 1e-9 {
        return Err(LoadingError::NoTurns);
    }
    let e = emf_ratio * connection.phase_voltage(line);
    let phi = flux_per_pole(e, f, n * kw);
    let gap_peak = gap_peak(phi, tau, l);
    let k_fe = d.core.stacking();
    let tooth = d.core.tooth_width.map(Length::m).map(|t| Density {
        peak_t: gap_peak * ts / (k_fe * t),
        limit_t: limits.tooth_t,
    });
    let yoke = d.core.yoke_depth.map(Length::m).map(|h| Density {
        peak_t: phi / (2.0 * k_fe * l * h),
        limit_t: limits.yoke_t,
    });
    let tooth_mean_t = d
        .core
        .tooth_width
        .map(Length::m)
        .map(|t| phi / (w.geometry.pole_pitch_slots * k_fe * t * l));
    Ok(Magnetic {
        emf_ratio,
        tooth_mean_t,
        phase_emf_v: e,
        frequency_hz: f,
        series_turns: n,
        winding_factor: kw,
        at_poles: None,
        flux_per_pole_wb: phi,
        gap_mean_t: phi / (tau * l),
        gap: Density {
            peak_t: gap_peak,
            limit_t: limits.gap_t,
        },
        tooth,
        yoke,
        stacking_factor: k_fe,
    })
}

/// Turns in the fullest slot (every coil side in it): the slot `packing::fullest` finds.
pub fn conductors_per_slot(w: &Winding) -> u64 {
    let (_, sides) = crate::packing::fullest(w);
    sides.iter().map(|(_, t)| *t as u64).sum()
}

/// Phase and conductor current for a rated line current: the one rule the card and the
/// loadings share.
pub fn conductor_current(w: &Winding, line_a: f64) -> (f64, f64) {
    let phase = w.design.connection.phase_current(line_a);
    (phase, phase / w.parallel_paths.max(1) as f64)
}

/// The electric loading of `w` at `rated`, or when `None` at its rated current, when one
/// is stamped or follows from the power.
pub fn electric(w: &Winding, limits: &Limits, rated: Option<Rated>) -> Option<Electric> {
    if w.geometry.phases != 3 {
        return None;
    }
    let d = &w.design;
    let rated = rated.or_else(|| rated_current(d.nameplate.as_ref(), d.supply.line_voltage_v))?;
    let (phase, cond) = conductor_current(w, rated.line_a());
    let z = conductors_per_slot(w);
    let ts = w.slot_pitch().map(Length::m)?;
    // A = z·I/τ_s, every slot filled; a winding in every other slot fills half of them.
    let filled = if w.design.alternate_slots.is_some() {
        0.5
    } else {
        1.0
    };
    let a = filled * z as f64 * cond / ts;
    let j = d.wire.as_ref().map(|spec| Checked {
        // A/mm², the unit the trade's limits are given in.
        value: cond / Wire::of(spec).conductor_area.mm2(),
        limit: limits.current_density_a_mm2,
    });
    Some(Electric {
        rated,
        phase_current_a: phase,
        conductor_current_a: cond,
        conductors_per_slot: z,
        electric_loading_a_m: a,
        current_density_a_mm2: j,
        // A in A/mm, so that A·J is in A²/mm³.
        heat_load_a2_mm3: j.map(|j| crate::units::per_mm(a) * j.value),
    })
}

/// Winding reference temperature for losses by insulation class, °C: 75 for A and E, 95
/// for B, 115 for F, 135 for H (IEC 60034-2-1, reference temperature; from memory).
pub fn reference_temperature_c(class: InsulationClass) -> f64 {
    match class {
        InsulationClass::A | InsulationClass::E => 75.0,
        InsulationClass::B => 95.0,
        InsulationClass::F => 115.0,
        InsulationClass::H => 135.0,
    }
}

/// Permitted winding temperature rise by resistance, K, for indirectly cooled windings of
/// machines from 200 W to 5000 kW: A 60, E 75, B 80, F 105, H 125 (IEC 60034-1, table of
/// temperature-rise limits; from memory).
pub fn rise_limit_k(class: InsulationClass) -> f64 {
    match class {
        InsulationClass::A => 60.0,
        InsulationClass::E => 75.0,
        InsulationClass::B => 80.0,
        InsulationClass::F => 105.0,
        InsulationClass::H => 125.0,
    }
}

/// Heat-transfer coefficient from the core's outside surface (rotary) or its back (flat
/// primary) to the air, W/(m²·K), referred to the bare core: 80 for a finned, fan-cooled
/// enclosed frame, whose finned surface is larger than the core's (an engineering
/// estimate, from memory; not a published figure). The rise scales inversely with it.
pub const HEAT_TRANSFER_W_M2K: f64 = 80.0;

/// Temperature-rise estimate by a one-node thermal network (Newton's law of cooling):
/// the stator's losses leave through the core's outside surface S at a heat-transfer
/// coefficient α, Δθ = (P_Cu + P_Fe)/(α·S). P_Cu = m·I_ph²·R_ph at the class's reference
/// temperature (the card's resistance); P_Fe = p_1.5·(B̂/1.5 T)²·(f/50 Hz)^1.5 per kilogram
/// of teeth and back iron (a Steinmetz-type scaling of the grade's loss, from memory; no
/// allowance for punching). S = π·D_o·L for a rotary core, the back of the yoke (stack ×
/// primary length) for a flat primary. It assumes the whole winding at one temperature and
/// no heat through the shaft or the secondary.
pub fn heating(w: &Winding, m: &Magnetic, e: &Electric, coefficient: f64) -> Option<Heating> {
    let d = &w.design;
    let stamped = d.nameplate.as_ref().and_then(|n| n.insulation_class);
    let class = stamped.unwrap_or(InsulationClass::F);
    let reference = reference_temperature_c(class);
    let phase_r: Vec<f64> = card::phase_resistances_20c(w)?;
    if phase_r.is_empty() {
        return None;
    }
    let material = d
        .wire
        .as_ref()
        .map_or(crate::design::Material::Copper, |s| s.material);
    let r_hot = metal(material).at_temperature(
        phase_r.iter().sum::<f64>() / phase_r.len() as f64,
        reference,
    );
    let copper = w.geometry.phases as f64 * e.phase_current_a.powi(2) * r_hot;
    let l = d.core.stack.map(Length::m)?;
    let k_fe = m.stacking_factor;
    let ts = w.slot_pitch().map(Length::m)?;
    let length = ts * w.geometry.slots as f64;
    let surface = match w.geometry.topology {
        Topology::Rotary => PI * d.core.outside_diameter.map(Length::m)? * l,
        Topology::Linear => length * l,
    };
    let scale = |b: f64| STEEL_LOSS_W_KG * (b / 1.5).powi(2) * (m.frequency_hz / 50.0).powf(1.5);
    let iron = match (
        d.core.tooth_width.map(Length::m),
        d.core.slot_depth.map(Length::m),
        d.core.yoke_depth.map(Length::m),
    ) {
        (Some(t), Some(h), Some(y)) => {
            let teeth_kg = w.geometry.slots as f64 * t * h * l * k_fe * STEEL_DENSITY_KG_M3;
            let yoke_len = match w.geometry.topology {
                Topology::Rotary => PI * (d.core.outside_diameter.map(Length::m)? - y),
                Topology::Linear => length,
            };
            let yoke_kg = yoke_len * y * l * k_fe * STEEL_DENSITY_KG_M3;
            let bt = m.tooth.map_or(0.0, |x| x.peak_t);
            let by = m.yoke.map_or(0.0, |x| x.peak_t);
            Some(teeth_kg * scale(bt) + yoke_kg * scale(by))
        }
        _ => None,
    };
    let rise = (copper + iron.unwrap_or(0.0)) / (coefficient * surface);
    Some(Heating {
        reference_c: reference,
        copper_loss_w: copper,
        iron_loss_w: iron,
        surface_m2: surface,
        coefficient_w_m2k: coefficient,
        rise_k: Checked {
            value: rise,
            limit: rise_limit_k(class),
        },
        class,
        class_assumed: stamped.is_none(),
    })
}

/// The slot fill by insulated wire of the fullest slot (the card's rule), when wire and
/// slot area are known.
pub fn slot_fill(w: &Winding, limits: &Limits) -> Option<Checked> {
    let wire = Wire::of(w.design.wire.as_ref()?);
    let area = w.design.slot_area?;
    let wires = conductors_per_slot(w) as f64 * wire.strands_in_hand as f64;
    Some(Checked {
        value: crate::wire::slot_fill(wires, wire.insulated_diameter, area),
        limit: limits.slot_fill,
    })
}

/// All the loadings of `w` against `limits`, the EMF `emf_ratio` times the phase voltage,
/// at its rated current.
pub fn of(w: &Winding, limits: &Limits, emf_ratio: f64) -> Result<Loading, LoadingError> {
    of_rated(w, limits, emf_ratio, None)
}

/// [`of`] at the current `rated` (a flat primary's from its thrust model), or the rated
/// current when `None`.
pub fn of_rated(
    w: &Winding,
    limits: &Limits,
    emf_ratio: f64,
    rated: Option<Rated>,
) -> Result<Loading, LoadingError> {
    crate::runs::count(crate::runs::Analysis::Loading);
    if w.design.turns_assumed && !w.from_coil_list {
        return Err(LoadingError::TurnsAssumed);
    }
    let (magnetic, other_speed) = magnetic_speeds(w, limits, emf_ratio)?;
    let electric = electric(w, limits, rated);
    let heating = electric
        .as_ref()
        .and_then(|e| heating(w, &magnetic, e, limits.heat_transfer_w_m2k));
    let slot_fill = slot_fill(w, limits);
    let mut warnings = Vec::new();
    for m in std::iter::once(&magnetic).chain(other_speed.as_ref()) {
        for (part, density) in [
            (Part::Gap, Some(m.gap)),
            (Part::Teeth, m.tooth),
            (Part::Yoke, m.yoke),
        ] {
            if let Some(density) = density.filter(Density::passed) {
                warnings.push(LoadingWarning::FluxDensityAbove {
                    part,
                    density,
                    at_poles: m.at_poles,
                });
            }
        }
    }
    if let Some(density) = electric
        .and_then(|e| e.current_density_a_mm2)
        .filter(Checked::passed)
    {
        warnings.push(LoadingWarning::CurrentDensityAbove { density });
    }
    if let Some(fill) = slot_fill.filter(Checked::passed) {
        warnings.push(LoadingWarning::FillAbove { fill });
    }
    if let Some(rise) = heating.map(|h| h.rise_k).filter(Checked::passed) {
        warnings.push(LoadingWarning::RiseAbove { rise });
    }
    let d = &w.design;
    let mut unchecked = Vec::new();
    if magnetic.tooth.is_none() {
        unchecked.push(Unchecked::Teeth);
    }
    if magnetic.yoke.is_none() {
        unchecked.push(Unchecked::BackIron);
    }
    if electric.is_none() {
        unchecked.push(Unchecked::Current);
    }
    if d.wire.is_none() {
        unchecked.push(Unchecked::Wire);
    }
    if d.slot_area.map(Area::m2).is_none() {
        unchecked.push(Unchecked::SlotArea);
    }
    if electric.is_some()
        && heating.is_none()
        && w.geometry.topology == Topology::Rotary
        && d.core.outside_diameter.map(Length::m).is_none()
    {
        unchecked.push(Unchecked::CoolingSurface);
    }
    Ok(Loading {
        magnetic,
        other_speed,
        electric,
        slot_fill,
        heating,
        limits: *limits,
        unchecked,
        warnings,
    })
}

/// `loading`'s report: the winding's header and its loadings.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LoadingReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// The loadings.
    #[serde(flatten)]
    pub loading: Loading,
}

/// The loadings of `w` with its header.
pub fn report(w: &Winding, limits: &Limits, emf_ratio: f64) -> Result<LoadingReport, LoadingError> {
    Ok(LoadingReport {
        design: crate::header::of(w),
        loading: of(w, limits, emf_ratio)?,
    })
}
