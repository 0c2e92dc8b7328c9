//! A winding for a bare core: span, connection, parallel paths, turns per coil and wire from
//! the core's sizes and the nameplate, so that the flux densities in gap, teeth and back iron
//! and the current density stay within their limits.
//!
//! The flux per pole is the most the core carries: the least of
//!   Φ_δ = (2/π)·B̂_δ,max·τ·L                     (gap),
//!   Φ_t = (2/π)·(B̂_t,max·k_Fe·t/τ_s)·τ·L        (teeth, [`crate::loading`]),
//!   Φ_y = 2·B̂_y,max·k_Fe·L·h_y                  (back iron).
//! Series turns follow from the EMF equation, N_ph = k_E·V_ph/(√2·π·f·k_w1·Φ) (Say 1983,
//! §4.3), turns per coil from N_ph = coils per phase × turns per coil / paths, rounded up to
//! a whole turn so no density passes its limit. Every connection (star, delta) and path
//! count the winding allows is tried; they are ranked by how much flux the rounding gives
//! away (least first), then by whether a standard wire of at most four strands carries the
//! current within the current-density and fill limits, then by fewer paths. The chosen
//! winding's loadings, resistance and copper mass come from [`crate::loading`] and the card:
//! the sizing owns none of those figures.

use serde::Serialize;
use std::f64::consts::{PI, SQRT_2};

use crate::design::{Connection, Design, Insulation, Material, WireSize, WireSpec};
use crate::loading::{self, Limits, Loading, Rated};
use crate::pitch::{self, PitchGoal};
use crate::spec::{MAX_TURNS, Spec};
use crate::thrust::Input;
use crate::winding::{self, Winding};
use crate::wire::{self as wires, circle_area};

/// Largest strand diameter offered for random-wound coils, mm: 1.6 (common practice, from
/// memory: thicker wire is hard to shape by hand and to insert through the slot opening).
pub const MAX_STRAND_MM: f64 = 1.6;

/// Most strands in hand offered.
pub const MAX_STRANDS: u32 = 4;

/// What the sizing is asked for besides the layout.
#[derive(Debug, Clone, PartialEq)]
pub struct Request {
    /// Limits to size to and check against.
    pub limits: Limits,
    /// EMF over phase voltage k_E (1: the no-load flux, the highest).
    pub emf_ratio: f64,
    /// Wire from the AWG series instead of IEC 60317 metric sizes.
    pub awg: bool,
}

impl Default for Request {
    fn default() -> Self {
        Request {
            limits: Limits::default(),
            emf_ratio: 1.0,
            awg: false,
        }
    }
}

/// Why a core cannot be sized.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SizingError {
    /// A figure the sizing needs is missing.
    #[error("missing {0:?}")]
    Missing(Input),
    /// No three-phase winding can be built on this core (the plan's refusal).
    #[error("no winding can be built on this core: {0}")]
    NoWinding(String),
    /// The voltage needs less than half a turn per coil, or more than a coil may have, in
    /// every connection and path count.
    #[error("no whole number of turns per coil fits the voltage")]
    NoWholeTurns {
        /// Exact turns per coil of the candidate nearest to a whole turn.
        exact: f64,
        /// Line voltages that give 1 and [`MAX_TURNS`] turns per coil in the best case, V.
        workable_v: (f64, f64),
    },
}

/// How the span was chosen.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum SpanChoice {
    /// `winding.pitch` was given in the layout.
    Given,
    /// `pitch`'s recommendation.
    Recommended,
    /// `pitch` recommends none: the nearest full pitch.
    FullPitch,
}

/// A wire for the conductor.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct WireChoice {
    /// Strands in hand.
    pub strands_in_hand: u32,
    /// Bare diameter, mm.
    pub diameter_mm: f64,
    /// AWG gauge, when from that series.
    pub awg: Option<i32>,
    /// Current density at rated current, A/mm².
    pub current_density_a_mm2: f64,
    /// Fill of the fullest slot by insulated wire (grade 2), when the slot area is known.
    pub slot_fill: Option<f64>,
}

/// One connection and path count with its turns.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Candidate {
    /// Star or delta.
    pub connection: Connection,
    /// Parallel paths per phase.
    pub parallel_paths: usize,
    /// Phase voltage, V.
    pub phase_voltage_v: f64,
    /// Turns per coil for the flux asked, unrounded.
    pub turns_per_coil_exact: f64,
    /// Turns per coil, rounded up.
    pub turns_per_coil: u32,
    /// Series turns per phase with the rounded turns.
    pub series_turns: f64,
    /// Flux the rounding gives away, per cent of the flux asked.
    pub flux_shortfall_percent: f64,
    /// Conductor current at rated current, A, when a rating is known.
    pub conductor_current_a: Option<f64>,
    /// The wire, when one of at most [`MAX_STRANDS`] standard strands fits.
    pub wire: Option<WireChoice>,
}

/// The sized winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Sizing {
    /// The header of the sized winding.
    pub design: crate::header::DesignHeader,
    /// Span in slot pitches.
    pub span: usize,
    /// How the span was chosen.
    pub span_choice: SpanChoice,
    /// Fundamental winding factor at that span.
    pub winding_factor: f64,
    /// Line voltage sized for, V.
    pub line_voltage_v: f64,
    /// Frequency, Hz.
    pub frequency_hz: f64,
    /// EMF over phase voltage.
    pub emf_ratio: f64,
    /// Flux per pole the core carries at its limits, Wb.
    pub flux_limit_wb: f64,
    /// Which part of the core sets it.
    pub flux_set_by: loading::Part,
    /// The rated current and where it came from.
    pub rated: Option<Rated>,
    /// Every connection and path count, best first.
    pub candidates: Vec<Candidate>,
    /// The loadings of the chosen winding (the first candidate).
    pub loading: Loading,
    /// Phase resistance at 20 °C of the chosen winding (the card's), Ω.
    pub phase_resistance_20c_ohm: Option<f64>,
    /// Line-to-line resistance at 20 °C (the card's), Ω.
    pub line_resistance_20c_ohm: Option<f64>,
    /// Copper mass in the coils (the card's), kg.
    pub copper_mass_kg: Option<f64>,
    /// The chosen design, as it is written to a layout.
    #[serde(skip)]
    pub chosen: Design,
}

/// The line voltage and frequency to size for: the supply's, else the nameplate's.
fn supply(d: &Design) -> Result<(f64, f64), SizingError> {
    let plate = d.nameplate.as_ref();
    let v = d
        .supply
        .line_voltage_v
        .or_else(|| plate.and_then(|n| n.voltages_v.first().copied()))
        .ok_or(SizingError::Missing(Input::LineVoltage))?;
    let f = d
        .supply
        .frequency_hz
        .or_else(|| plate.and_then(|n| n.frequency_hz))
        .ok_or(SizingError::Missing(Input::Frequency))?;
    Ok((v, f))
}

/// The flux per pole the core carries within `limits`, and the part that sets it.
pub fn flux_limit(w: &Winding, limits: &Limits) -> Result<(f64, loading::Part), SizingError> {
    let d = &w.design;
    let tau = w
        .pole_pitch_m()
        .ok_or(SizingError::Missing(Input::SlotPitch))?;
    let ts = w
        .slot_pitch_m()
        .ok_or(SizingError::Missing(Input::SlotPitch))?;
    let l = d.core.stack_m.ok_or(SizingError::Missing(Input::Stack))?;
    let k = d.core.stacking();
    let of_gap = |b: f64| 2.0 / PI * b * tau * l;
    let mut best = (of_gap(limits.gap_t), loading::Part::Gap);
    if let Some(t) = d.core.tooth_width_m {
        let phi = of_gap(limits.tooth_t * k * t / ts);
        if phi < best.0 {
            best = (phi, loading::Part::Teeth);
        }
    }
    if let Some(h) = d.core.yoke_depth_m {
        let phi = 2.0 * limits.yoke_t * k * l * h;
        if phi < best.0 {
            best = (phi, loading::Part::Yoke);
        }
    }
    Ok(best)
}

/// The standard wire for conductor current `i` (A) in `w`: the fewest strands of at most
/// [`MAX_STRAND_MM`] that keep the current density within its limit. When the slot area is
/// known, the largest size of that strand count that keeps the fill within its limit (the
/// slot filled as a winder fills it, for the least copper loss); otherwise the smallest
/// size within the current-density limit.
pub fn wire_for(w: &Winding, i: f64, limits: &Limits, awg: bool) -> Option<WireChoice> {
    let z = loading::conductors_per_slot(w) as f64;
    let need_mm2 = i / limits.current_density_a_mm2;
    let sizes: Vec<(f64, Option<i32>)> = if awg {
        (4..=40)
            .rev()
            .map(|n| (wires::awg_diameter_m(n) * 1e3, Some(n)))
            .collect()
    } else {
        wires::iec_60317_mm().map(|d| (d, None)).collect()
    };
    let fill_of = |s: u32, d: f64| {
        let over = wires::grade_overall_diameter_m(d * 1e-3, 2);
        w.design
            .slot_area_m2
            .map(|a| z * s as f64 * circle_area(over) / a)
    };
    (1..=MAX_STRANDS).find_map(|s| {
        let carries = |d: f64| s as f64 * circle_area(d) >= need_mm2 * (1.0 - 1e-12);
        let fits = |d: f64| fill_of(s, d).is_none_or(|f| f <= limits.slot_fill);
        let usable = sizes
            .iter()
            .copied()
            .filter(|(d, _)| *d <= MAX_STRAND_MM && carries(*d) && fits(*d));
        let (d, n) = if w.design.slot_area_m2.is_some() {
            usable.max_by(|a, b| a.0.total_cmp(&b.0))?
        } else {
            usable.min_by(|a, b| a.0.total_cmp(&b.0))?
        };
        Some(WireChoice {
            strands_in_hand: s,
            diameter_mm: d,
            awg: n,
            current_density_a_mm2: i / (s as f64 * circle_area(d)),
            slot_fill: fill_of(s, d),
        })
    })
}

/// Flux the rounding of turns may give away and still count as on target, per cent: 5
/// (common practice, from memory: a rewind within 5 % of the design's turns is accepted).
pub const SHORTFALL_TOLERANCE_PERCENT: f64 = 5.0;

/// The connection stamped on a plate, when it names one: "D", "delta", "Δ" or "Y", "star".
fn stamped_connection(d: &Design) -> Option<Connection> {
    let text = d
        .nameplate
        .as_ref()?
        .connection
        .as_ref()?
        .trim()
        .to_lowercase();
    match text.as_str() {
        "d" | "delta" | "δ" | "dd" => Some(Connection::Delta),
        "y" | "star" | "wye" | "yy" => Some(Connection::Star),
        _ => None,
    }
}

/// Size a winding for the core and nameplate of `spec` (its coil list and turns, if any,
/// are ignored: the core is bare).
pub fn size(spec: &Spec, req: &Request) -> Result<Sizing, SizingError> {
    crate::runs::count(crate::runs::Analysis::Sizing);
    let base = &spec.design;
    let (line_v, f) = supply(base)?;
    let build = |d: Design| {
        winding::build(&Spec {
            labels: spec.labels.clone(),
            design: d,
            coils: Vec::new(),
        })
    };
    let probe = Design {
        turns_per_coil: 1,
        turns_assumed: false,
        parallel_paths: 1,
        supply: crate::design::Supply {
            line_voltage_v: Some(line_v),
            frequency_hz: Some(f),
        },
        ..base.clone()
    };
    let w0 = build(probe.clone()).map_err(|e| SizingError::NoWinding(e.to_string()))?;
    let (span, span_choice) = match base.pitch {
        Some(y) => (y, SpanChoice::Given),
        None => match pitch::compare(&w0, &PitchGoal::default()).recommended {
            Some(y) => (y, SpanChoice::Recommended),
            None => (w0.pitch, SpanChoice::FullPitch),
        },
    };
    let probe = Design {
        pitch: Some(span),
        ..probe
    };
    let w1 = build(probe.clone()).map_err(|e| SizingError::NoWinding(e.to_string()))?;
    let (phi, set_by) = flux_limit(&w1, &req.limits)?;
    let kw = crate::factors::fundamental(&w1).winding;
    let rated = loading::rated_current(base.nameplate.as_ref(), Some(line_v));

    let mut candidates = Vec::new();
    let mut nearest: Option<(f64, f64)> = None;
    for connection in [Connection::Star, Connection::Delta] {
        for paths in 1..=w1.geometry.poles.max(1) {
            let Ok(w) = build(Design {
                connection,
                parallel_paths: paths,
                ..probe.clone()
            }) else {
                continue;
            };
            // A 9- or 12-lead winding brings out two sections per phase: two paths.
            if w.parallel_paths != paths || (base.leads.count >= 9 && paths != 2) {
                continue;
            }
            let per_turn = w.series_turns(0);
            if per_turn <= 0.0 || kw <= 1e-9 {
                continue;
            }
            let v_ph = connection.phase_voltage(line_v);
            let n_exact = req.emf_ratio * v_ph / (SQRT_2 * PI * f * kw * phi);
            let exact = n_exact / per_turn;
            // Distance from a usable whole number, kept for the refusal.
            let off = if exact < 0.5 {
                0.5 / exact
            } else {
                exact / MAX_TURNS as f64
            };
            if nearest.is_none_or(|(o, _)| off < o) {
                nearest = Some((off, exact));
            }
            if exact < 0.5 || exact > MAX_TURNS as f64 {
                continue;
            }
            let turns = (exact - 1e-9).ceil().max(1.0) as u32;
            let current = rated.map(|r| loading::conductor_current(&w, r.line_a()).1);
            let sized = Winding {
                coils: w
                    .coils
                    .iter()
                    .map(|c| winding::Coil { turns, ..c.clone() })
                    .collect(),
                ..w.clone()
            };
            let wire = current.and_then(|i| wire_for(&sized, i, &req.limits, req.awg));
            candidates.push(Candidate {
                connection,
                parallel_paths: paths,
                phase_voltage_v: v_ph,
                turns_per_coil_exact: exact,
                turns_per_coil: turns,
                series_turns: per_turn * turns as f64,
                flux_shortfall_percent: 100.0 * (1.0 - exact / turns as f64),
                conductor_current_a: current,
                wire,
            });
        }
    }
    if candidates.is_empty() {
        let exact = nearest.map_or(0.0, |n| n.1);
        // Voltage scales the turns linearly: the voltages giving 1 and MAX_TURNS turns.
        let per_volt = if line_v > 0.0 { exact / line_v } else { 0.0 };
        let workable_v = if per_volt > 0.0 {
            (0.5 / per_volt, MAX_TURNS as f64 / per_volt)
        } else {
            (0.0, 0.0)
        };
        return Err(SizingError::NoWholeTurns { exact, workable_v });
    }
    // A wire that fits first; then turns on target (within the tolerance); then the
    // stamped connection; then fewer paths; then the least flux given away.
    let wire_known = rated.is_some();
    let stamped = stamped_connection(base);
    candidates.sort_by(|a, b| {
        let fits = |c: &Candidate| !wire_known || c.wire.is_some();
        let near = |c: &Candidate| c.flux_shortfall_percent <= SHORTFALL_TOLERANCE_PERCENT;
        let as_stamped = |c: &Candidate| stamped.is_none_or(|s| s == c.connection);
        fits(b)
            .cmp(&fits(a))
            .then(near(b).cmp(&near(a)))
            .then(as_stamped(b).cmp(&as_stamped(a)))
            .then(a.parallel_paths.cmp(&b.parallel_paths))
            .then(
                a.flux_shortfall_percent
                    .total_cmp(&b.flux_shortfall_percent),
            )
    });
    let best = &candidates[0];
    let wire = best.wire.map(|c| WireSpec {
        size: match c.awg {
            Some(n) => WireSize::Awg(n),
            None => WireSize::Diameter(c.diameter_mm * 1e-3),
        },
        strands_in_hand: c.strands_in_hand,
        insulation: Insulation::Grade(2),
        material: Material::Copper,
    });
    let chosen = Design {
        connection: best.connection,
        parallel_paths: best.parallel_paths,
        turns_per_coil: best.turns_per_coil,
        wire: wire.or(base.wire),
        ..probe
    };
    let w = build(chosen.clone()).map_err(|e| SizingError::NoWinding(e.to_string()))?;
    let loading = loading::of(&w, &req.limits, req.emf_ratio).map_err(|e| match e {
        loading::LoadingError::Missing(i) => SizingError::Missing(i),
        loading::LoadingError::NoTurns => SizingError::NoWinding(e.to_string()),
    })?;
    let card = crate::card::card(&w);
    Ok(Sizing {
        design: crate::header::of(&w),
        span,
        span_choice,
        winding_factor: kw,
        line_voltage_v: line_v,
        frequency_hz: f,
        emf_ratio: req.emf_ratio,
        flux_limit_wb: phi,
        flux_set_by: set_by,
        rated,
        candidates,
        loading,
        phase_resistance_20c_ohm: card.phase_resistance_20c_ohm,
        line_resistance_20c_ohm: card.line_resistance_20c_ohm,
        copper_mass_kg: card.copper_mass_kg,
        chosen,
    })
}
