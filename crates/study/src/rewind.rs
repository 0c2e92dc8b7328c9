//! Turns and conductor size for a changed design on the same core.
//!
//! EMF equation E_ph = √2·π·f·N_ph·k_w1·Φ (4.44 rounded) (M. G. Say, *Alternating Current Machines*, 5th ed.
//! 1983, §4.3; Pyrhönen, Jokinen, Hrabovcová 2014, eq. 2.59), with N_ph = coils per phase ×
//! turns per coil / parallel paths and V_ph = V_L/√3 in star, V_L in delta. Keeping the peak
//! air-gap flux density (Φ = (2/π)·B̂·τ·L, so Φ per pole for an unchanged pole count) gives
//!
//!   N_ph,new = N_ph,old · (V_ph,new / V_ph,old) · (f_old / f_new) · (k_w1,old / k_w1,new)
//!              · (τ_old / τ_new).
//!
//! The conductor keeps the copper area of every slot (conductors per slot × cross-section),
//! so with the same ampere-conductors per slot (electric loading) the current density is the
//! same (common practice of rewind shops).

use crate::units::{Area, Length};
use serde::Serialize;
use std::f64::consts::PI;

use crate::assumption::Assumption;
use crate::card::wire::{self as wires, StandardWire};
use crate::factors;
use crate::loading;
use crate::winding::{Connection, Topology, Winding};

/// The old conductor as the rewinder measured it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum OldConductor {
    /// Bare copper cross-section of one wire.
    Area(Area),
    /// Bare copper diameter of one wire.
    Diameter(Length),
}

/// Why a rewind was refused, as typed facts. Their sentences are the presenters'
/// (`output::refusal_words`); the `Display` here only names the kind, for logs.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RewindError {
    /// The two designs are not on the same core.
    #[error("the two designs are not on the same core")]
    DifferentCore {
        /// The old design's core kind and slot count.
        old: (Topology, usize),
        /// The new design's.
        new: (Topology, usize),
    },
    /// A design has no turns, coils or fundamental EMF in its first phase.
    #[error("a design has no turns or no fundamental EMF in its first phase")]
    NoTurns(Which),
    /// The old winding is unbalanced: turns worked out from it would be wrong.
    #[error("the old winding is not balanced")]
    OldUnbalanced,
    /// The new design would need more turns per coil than any winding has.
    #[error("the new design would need more turns per coil than a coil may have")]
    TooManyTurns {
        /// Turns per coil the new design would need.
        turns: f64,
        /// The most a coil may have.
        max: u32,
    },
    /// The old design gives no supply: which figure is missing.
    #[error("the old design gives no supply figure ({0:?})")]
    OldSupplyMissing(crate::thrust::Input),
}

/// Which of the two designs a refusal is about.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Which {
    /// The winding as found.
    Old,
    /// The winding to be wound.
    New,
}

/// One design as the rewind sees it.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct DesignSide {
    /// Title of the layout.
    pub title: Option<String>,
    /// Poles.
    pub poles: usize,
    /// Layers.
    pub layers: usize,
    /// Coil span in slot pitches (`pitch` in the JSON, as everywhere).
    #[serde(rename = "pitch")]
    pub span: usize,
    /// Star or delta.
    pub connection: Connection,
    /// Parallel paths per phase.
    pub parallel_paths: usize,
    /// Coils in the first phase.
    pub coils_per_phase: usize,
    /// Turns per coil (mean over the first phase for a coil list).
    pub turns_per_coil: f64,
    /// Series turns per phase N_ph.
    pub series_turns: f64,
    /// Fundamental winding factor k_w1 (distribution × pitch × skew).
    pub winding_factor: f64,
    /// Line voltage used, volts.
    pub line_voltage_v: Option<f64>,
    /// Phase voltage used, volts.
    pub phase_voltage_v: Option<f64>,
    /// Frequency used, hertz.
    pub frequency_hz: Option<f64>,
    /// Conductors in a full slot (turns per coil × coil sides per slot).
    pub conductors_per_slot: f64,
}

/// Wire size for the new winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ConductorResult {
    /// Old copper area of one wire, mm².
    #[serde(rename = "old_area_mm2", serialize_with = "crate::units::in_mm2")]
    pub old_area: Area,
    /// Old wire diameter, when given as a diameter, mm.
    #[serde(rename = "old_diameter_mm", serialize_with = "crate::units::in_mm_opt")]
    pub old_diameter: Option<Length>,
    /// Wires in hand (in parallel per conductor) of the old winding.
    pub wires_in_hand: u32,
    /// Copper area per conductor (all wires in hand) of the new winding, mm², for the
    /// rounded turns.
    #[serde(
        rename = "new_conductor_area_mm2",
        serialize_with = "crate::units::in_mm2"
    )]
    pub new_conductor_area: Area,
    /// Choices of wires in hand and the bare diameter each wire then needs.
    pub options: Vec<WireOption>,
    /// Current per conductor, new over old (same current density).
    pub conductor_current_ratio: f64,
    /// Phase current, new over old.
    pub phase_current_ratio: f64,
    /// Output (phase voltage × phase current × phases), new over old.
    pub power_ratio: Option<f64>,
    /// Standard wires nearest the new conductor: IEC 60317 metric sizes, 1 to 4 in hand.
    pub standard_metric: Vec<StandardOption>,
    /// The same from the AWG series.
    pub standard_awg: Vec<StandardOption>,
    /// Rated line current of the new winding for the same current density, amperes, when
    /// the old one is given (`--line-current-a`).
    pub new_line_current_a: Option<f64>,
}

/// A standard wire for the new conductor, with its slot fill when the slot area is known.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct StandardOption {
    /// Strands, size and how near the wanted copper.
    #[serde(flatten)]
    pub wire: StandardWire,
    /// Fill of a full slot by insulated wire (grade 2) over the usable slot area.
    pub slot_fill: Option<f64>,
    /// True when the fill is within the usual limit (or unknown).
    pub fits: bool,
}

/// A way to make up the new conductor.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct WireOption {
    /// Wires in hand.
    pub wires_in_hand: u32,
    /// Bare diameter of each wire, mm.
    #[serde(rename = "diameter_mm", serialize_with = "crate::units::in_mm")]
    pub diameter: Length,
}

/// The recalculated turns and conductor.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct RewindReport {
    /// The design header of the winding as found (the same header every report opens with).
    pub old_design: crate::header::DesignHeader,
    /// The design header of the winding to wind, with the turns per coil worked out here.
    pub new_design: crate::header::DesignHeader,
    /// The old design.
    pub old: DesignSide,
    /// The new design, with the rounded turns.
    pub new: DesignSide,
    /// Turns per coil that keep the flux density exactly.
    pub turns_per_coil_exact: f64,
    /// Turns per coil rounded to the nearest whole turn (at least 1).
    pub turns_per_coil: u32,
    /// Series turns per phase with the exact turns.
    pub series_turns_exact: f64,
    /// Flux (and flux density) change the rounding causes, per cent (+: more flux).
    pub flux_change_percent: f64,
    /// Phase voltage ratio new/old.
    pub voltage_ratio: f64,
    /// Frequency ratio new/old.
    pub frequency_ratio: f64,
    /// Winding factor ratio new/old.
    pub winding_factor_ratio: f64,
    /// Pole pitch ratio new/old (same core: old poles over new).
    pub pole_pitch_ratio: f64,
    /// Flux per pole of the old winding, webers, when its supply is known.
    pub flux_per_pole_wb: Option<f64>,
    /// Peak air-gap flux density of the old winding, teslas, when the core sizes are known.
    pub peak_flux_density_t: Option<f64>,
    /// The old winding's loadings on its core, when the core's sizes and supply are known.
    pub old_loading: Option<crate::loading::Loading>,
    /// The new winding's, with the rounded turns.
    pub new_loading: Option<crate::loading::Loading>,
    /// The conductor, when the old one was given.
    pub conductor: Option<ConductorResult>,
    /// Values assumed because a layout left them out.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub assumptions: Vec<Assumption>,
    /// Warnings about the new design (contract: a `warnings` array).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub warnings: Vec<crate::warnings::DesignWarning>,
}

fn side(w: &Winding, line: Option<f64>, freq: Option<f64>, turns: Option<f64>) -> DesignSide {
    let coils: Vec<_> = w.coils.iter().filter(|c| c.phase == 0).collect();
    let a = w.parallel_paths as f64;
    // The coils' own series turns (Winding::series_turns); their mean per coil when the
    // counts differ, which is what scales with the voltage.
    let n = coils.len().max(1) as f64;
    let t = turns.unwrap_or(w.series_turns(0) * a / n);
    DesignSide {
        title: w.labels.title.clone(),
        poles: w.geometry.poles,
        layers: w.geometry.layers,
        span: w.pitch,
        connection: w.design.connection,
        parallel_paths: w.parallel_paths,
        coils_per_phase: coils.len(),
        turns_per_coil: t,
        series_turns: coils.len() as f64 * t / a,
        winding_factor: factors::fundamental(w).winding,
        line_voltage_v: line,
        phase_voltage_v: line.map(|v| w.design.connection.phase_voltage(v)),
        frequency_hz: freq,
        conductors_per_slot: t * w.geometry.layers as f64,
    }
}

/// Recalculate turns (and conductor) for moving from design `old` to design `new`.
pub fn rewind(
    old: &Winding,
    new: &Winding,
    conductor: Option<OldConductor>,
    wires_in_hand: u32,
    old_line_current_a: Option<f64>,
) -> Result<RewindReport, RewindError> {
    let (go, gn) = (&old.geometry, &new.geometry);
    if go.slots != gn.slots || go.topology != gn.topology {
        return Err(RewindError::DifferentCore {
            old: (go.topology, go.slots),
            new: (gn.topology, gn.slots),
        });
    }
    if !old.is_balanced() {
        return Err(RewindError::OldUnbalanced);
    }
    let mut assumptions = Vec::new();
    let (so, sn) = (old.design.supply, new.design.supply);
    if so.line_voltage_v.is_none() && sn.line_voltage_v.is_some() {
        return Err(RewindError::OldSupplyMissing(
            crate::thrust::Input::LineVoltage,
        ));
    }
    if so.frequency_hz.is_none() && sn.frequency_hz.is_some() {
        return Err(RewindError::OldSupplyMissing(
            crate::thrust::Input::Frequency,
        ));
    }
    let line_old = so.line_voltage_v.or(sn.line_voltage_v);
    let line_new = sn.line_voltage_v.or(so.line_voltage_v);
    if so.line_voltage_v.is_none() || sn.line_voltage_v.is_none() {
        assumptions.push(Assumption::LineVoltageShared { volts: line_old });
    }
    let f_old = so.frequency_hz.or(sn.frequency_hz);
    let f_new = sn.frequency_hz.or(so.frequency_hz);
    if so.frequency_hz.is_none() || sn.frequency_hz.is_none() {
        assumptions.push(Assumption::FrequencyShared { hertz: f_old });
    }
    let o = side(old, line_old, f_old, None);
    if o.series_turns <= 0.0 || o.winding_factor <= 0.0 {
        return Err(RewindError::NoTurns(Which::Old));
    }
    let n_probe = side(new, line_new, f_new, Some(1.0));
    if n_probe.coils_per_phase == 0 || n_probe.winding_factor <= 0.0 {
        return Err(RewindError::NoTurns(Which::New));
    }
    // Same line voltage when none is given: the phase voltage then changes with the connection.
    let v_old = old.design.connection.phase_voltage(line_old.unwrap_or(1.0));
    let v_new = new.design.connection.phase_voltage(line_new.unwrap_or(1.0));
    let voltage_ratio = v_new / v_old;
    let frequency_ratio = f_new.zip(f_old).map(|(n, o)| n / o).unwrap_or(1.0);
    let winding_factor_ratio = n_probe.winding_factor / o.winding_factor;
    let pole_pitch_ratio = gn.pole_pitch_slots / go.pole_pitch_slots;
    if go.poles != gn.poles {
        assumptions.push(Assumption::PoleCountChanges {
            from: go.poles,
            to: gn.poles,
        });
    }
    let series_exact = o.series_turns * voltage_ratio
        / (frequency_ratio * winding_factor_ratio * pole_pitch_ratio);
    let a_new = new.parallel_paths as f64;
    let exact = series_exact * a_new / n_probe.coils_per_phase as f64;
    let rounded = exact.round().max(1.0);
    if !rounded.is_finite() || rounded > crate::spec::MAX_TURNS as f64 {
        return Err(RewindError::TooManyTurns {
            turns: exact,
            max: crate::spec::MAX_TURNS,
        });
    }
    let turns = rounded as u32;
    let n = side(new, line_new, f_new, Some(rounded));
    let flux_change_percent = 100.0 * (exact / rounded - 1.0);
    let flux_per_pole_wb = f_old
        .zip(line_old)
        .map(|(f, _)| loading::flux_per_pole(v_old, f, o.series_turns * o.winding_factor));
    let peak_flux_density_t = flux_per_pole_wb
        .zip(old.pole_pitch().map(Length::m))
        .zip(old.design.core.stack.map(Length::m))
        .map(|((phi, tau), l)| loading::gap_peak(phi, tau, l));
    // Both designs' loadings on the core, when its sizes and each supply are known.
    let limits = loading::Limits::default();
    let old_loading = loading::of(old, &limits, 1.0).ok();
    let wound = Winding {
        coils: new
            .coils
            .iter()
            .map(|c| crate::winding::Coil { turns, ..c.clone() })
            .collect(),
        ..new.clone()
    };
    let new_loading = loading::of(&wound, &limits, 1.0).ok();
    // The old wire from the flag, or from the old layout's [wire] table.
    let from_layout = old.design.wire.as_ref().map(wires::Wire::of);
    let (conductor, wires_in_hand) = match (conductor, &from_layout) {
        (Some(c), _) => (Some(c), wires_in_hand),
        (None, Some(wr)) => (
            Some(OldConductor::Diameter(wr.diameter)),
            wr.strands_in_hand,
        ),
        (None, None) => (None, wires_in_hand),
    };
    let slot_area = new.design.slot_area.or(old.design.slot_area);
    let conductor = conductor.map(|c| {
        let (wire, diameter) = match c {
            OldConductor::Area(a) => (a, None),
            OldConductor::Diameter(d) => (Area::of_circle(d), Some(d)),
        };
        let old_area = wire * wires_in_hand as f64;
        let new_area = old_area * o.conductors_per_slot / n.conductors_per_slot;
        let current: f64 = new_area / old_area;
        let phase_current = current * a_new / old.parallel_paths as f64;
        ConductorResult {
            old_area: wire,
            old_diameter: diameter,
            wires_in_hand,
            new_conductor_area: new_area,
            options: (1..=4)
                .map(|k| WireOption {
                    wires_in_hand: k,
                    diameter: Length::from_m((4.0 * new_area.m2() / (PI * k as f64)).sqrt()),
                })
                .collect(),
            conductor_current_ratio: current,
            phase_current_ratio: phase_current,
            power_ratio: Some(voltage_ratio * phase_current),
            standard_metric: standard(new_area, n.conductors_per_slot, slot_area, false),
            standard_awg: standard(new_area, n.conductors_per_slot, slot_area, true),
            new_line_current_a: old_line_current_a.map(|i| {
                new.design
                    .connection
                    .line_current(old.design.connection.phase_current(i) * phase_current)
            }),
        }
    });
    Ok(RewindReport {
        old_design: crate::header::of(old),
        new_design: crate::header::DesignHeader {
            turns_per_coil: turns,
            turns_assumed: false,
            ..crate::header::of(new)
        },
        old: o,
        new: n,
        turns_per_coil_exact: exact,
        turns_per_coil: turns,
        series_turns_exact: series_exact,
        flux_change_percent,
        voltage_ratio,
        frequency_ratio,
        winding_factor_ratio,
        pole_pitch_ratio,
        flux_per_pole_wb,
        peak_flux_density_t,
        old_loading,
        new_loading,
        conductor,
        assumptions,
        warnings: crate::warnings::design_warnings(new),
    })
}

/// Standard wires for a conductor of `area`, with the fill of a slot of
/// `conductors_per_slot` conductors (grade 2 enamel) when the slot area is known.
fn standard(
    area: Area,
    conductors_per_slot: f64,
    slot_area: Option<Area>,
    awg: bool,
) -> Vec<StandardOption> {
    wires::standard_choices(area, 4, awg)
        .into_iter()
        .map(|wire| {
            let d = wires::grade_overall_diameter(wire.diameter, 2);
            let fill = slot_area
                .map(|a| wires::slot_fill(conductors_per_slot * wire.strands_in_hand as f64, d, a));
            StandardOption {
                wire,
                slot_fill: fill,
                fits: fill.is_none_or(|f| f <= crate::card::FILL_LIMIT),
            }
        })
        .collect()
}
