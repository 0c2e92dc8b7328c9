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
//! count the winding allows is tried (two paths for a 9- or 12-lead winding, sized at its
//! lower voltage); they are ranked: a flat primary's thrust reached first, then a standard
//! wire of at most four strands that carries the current within the current-density and
//! fill limits, then turns within 5 % of the flux asked, then the nameplate's connection,
//! then fewer paths, then the least flux given away. The layout's own connection and paths
//! are not constraints. A flat primary sized for a thrust takes the most turns that still
//! give it (the least flux and current), with the largest wire that fits its slot. The chosen
//! winding's loadings, resistance and copper mass come from [`crate::loading`] and the card:
//! the sizing owns none of those figures.

use crate::units::{Area, Length};
use serde::Serialize;
use std::f64::consts::PI;

use crate::design::{Connection, Design, Insulation, Labels, Material, WireSize, WireSpec};
use crate::loading::{self, Limits, Loading, Rated};
use crate::pitch::{self, PitchGoal};
use crate::spec::{MAX_TURNS, Spec};
use crate::thrust::Input;
use crate::winding::{self, Winding};
use crate::wire as wires;

/// Largest strand diameter offered for random-wound coils: 1.6 mm (common practice, from
/// memory: thicker wire is hard to shape by hand and to insert through the slot opening).
pub const MAX_STRAND: Length = Length::from_mm(1.6);

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
    /// A flat primary's thrust wanted (N) at a slip or speed: the current the thrust model
    /// gives there sizes the wire, and the thrust is checked against it.
    pub thrust: Option<(f64, At)>,
}

/// Thrust wanted of a flat primary at a slip.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Target {
    /// Thrust wanted, N.
    pub thrust_n: f64,
    /// At this slip.
    pub slip: f64,
}

/// Where a flat primary's thrust is wanted: at a slip, or at a speed (m/s), which the field
/// speed v_s = 2·f·τ turns into a slip.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum At {
    /// A slip.
    Slip(f64),
    /// A speed of the secondary, m/s.
    Speed(f64),
}

impl Default for Request {
    fn default() -> Self {
        Request {
            limits: Limits::default(),
            emf_ratio: 1.0,
            awg: false,
            thrust: None,
        }
    }
}

/// The sized flat primary at the slip it is sized for, from the thrust model.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ThrustCheck {
    /// What was asked.
    pub wanted: Target,
    /// The model's operating point there (thrust, current, power factor, efficiency).
    pub point: crate::thrust::Row,
    /// Power the plate turns into heat, s × air-gap power, W.
    pub plate_loss_w: f64,
    /// The same per square metre of plate under the primary, W/m².
    pub plate_loss_w_m2: Option<f64>,
    /// True when the thrust reaches the wanted thrust.
    pub met: bool,
}

/// Why a core cannot be sized.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SizingError {
    /// A figure the sizing needs is missing.
    #[error("missing {0:?}")]
    Missing(Input),
    /// Sizing is for three-phase windings (the star/delta and power relations are).
    #[error("sizing is for three-phase windings")]
    NotThreePhase(usize),
    /// A thrust was asked of a rotary core.
    #[error("a thrust target is for flat primaries")]
    ThrustNotLinear,
    /// The thrust model cannot run on this primary (a missing plate, gap or supply).
    #[error("the thrust model cannot run: {0}")]
    Thrust(crate::thrust::ThrustError),
    /// The thrust is asked at or above the field speed (slip 0 or below: no motoring
    /// thrust) or against the field (slip above 1).
    #[error("a thrust is asked at slip {slip}")]
    SlipOutOfRange {
        /// The slip asked (from the speed, when a speed was given).
        slip: f64,
        /// The field speed v_s, m/s, when known.
        field_m_s: Option<f64>,
    },
    /// The speed asked gives a slip outside the model's range.
    #[error("the speed asked gives a slip outside -10 to 10")]
    SpeedOutOfReach {
        /// Speed asked, m/s.
        speed_m_s: f64,
        /// The field speed v_s, m/s.
        field_m_s: f64,
    },
    /// No three-phase winding can be built on this core (the plan's refusal, kept typed so
    /// it is worded as `plan` words it).
    #[error("no winding can be built on this core")]
    NoWinding(crate::winding::PlanError),
    /// The chosen winding's loadings could not be worked out (it has no working turns).
    #[error("the chosen winding's loadings cannot be worked out")]
    Loading(loading::LoadingError),
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
    #[serde(rename = "diameter_mm", serialize_with = "crate::units::in_mm")]
    pub diameter: Length,
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
    /// Conductor current at rated current (a flat primary's: the thrust model's at the
    /// slip asked), A, when known.
    pub conductor_current_a: Option<f64>,
    /// A flat primary's thrust at the slip asked.
    pub thrust_n: Option<f64>,
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
    /// A six-lead machine for two voltages √3 apart: (lower, higher), V. It is sized delta
    /// at the lower voltage, which is star at the higher.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub star_delta_pair_v: Option<(f64, f64)>,
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
    /// A flat primary's thrust at the slip asked, against the thrust wanted.
    pub thrust: Option<ThrustCheck>,
    /// When no wire meets the current-density limit: the largest standard wire (1 to 4
    /// strands) that fits the slot, which the written layout and the loadings then use.
    pub fallback_wire: Option<WireChoice>,
    /// When the largest wire that goes in carries the rated current above the current-density
    /// limit: the rated power at which it would not, W (the current scales with the power
    /// at the same voltage, efficiency and power factor).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_within_limit_w: Option<f64>,
    /// The chosen conductor from the other wire series (AWG when metric was asked, and the
    /// other way round), for shops that stock it.
    pub other_series_wire: Option<WireChoice>,
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

/// The line voltage and frequency to size for: [`loading::supply_of`], the loadings' rule.
fn supply(d: &Design) -> Result<(f64, f64), SizingError> {
    let (v, f) = loading::supply_of(d);
    Ok((
        v.ok_or(SizingError::Missing(Input::LineVoltage))?,
        f.ok_or(SizingError::Missing(Input::Frequency))?,
    ))
}

/// The flux per pole the core carries within `limits`, and the part that sets it.
pub fn flux_limit(w: &Winding, limits: &Limits) -> Result<(f64, loading::Part), SizingError> {
    let d = &w.design;
    let tau = w
        .pole_pitch()
        .map(Length::m)
        .ok_or(SizingError::Missing(Input::SlotPitch))?;
    let ts = w
        .slot_pitch()
        .map(Length::m)
        .ok_or(SizingError::Missing(Input::SlotPitch))?;
    let l = d
        .core
        .stack
        .map(Length::m)
        .ok_or(SizingError::Missing(Input::Stack))?;
    let k = d.core.stacking();
    let of_gap = |b: f64| 2.0 / PI * b * tau * l;
    let mut best = (of_gap(limits.gap_t), loading::Part::Gap);
    if let Some(t) = d.core.tooth_width.map(Length::m) {
        let phi = of_gap(limits.tooth_t * k * t / ts);
        if phi < best.0 {
            best = (phi, loading::Part::Teeth);
        }
    }
    if let Some(h) = d.core.yoke_depth.map(Length::m) {
        let phi = 2.0 * limits.yoke_t * k * l * h;
        if phi < best.0 {
            best = (phi, loading::Part::Yoke);
        }
    }
    Ok(best)
}

/// The standard wire for conductor current `i` (A) in `w`: the fewest strands of at most
/// [`MAX_STRAND`] that keep the current density within its limit. When the slot area is
/// known, the largest size of that strand count that keeps the fill within its limit (the
/// slot filled as a winder fills it, for the least copper loss); otherwise the smallest
/// size within the current-density limit.
pub fn wire_for(w: &Winding, i: f64, limits: &Limits, awg: bool) -> Option<WireChoice> {
    let z = loading::conductors_per_slot(w) as f64;
    // The limit is in the trade's A/mm², so the area wanted is in mm².
    let need_mm2 = i / limits.current_density_a_mm2;
    let sizes: Vec<(Length, Option<i32>)> = if awg {
        (4..=40)
            .rev()
            .map(|n| (wires::awg_diameter(n), Some(n)))
            .collect()
    } else {
        wires::iec_60317().map(|d| (d, None)).collect()
    };
    let fill_of = |s: u32, d: Length| {
        let over = wires::grade_overall_diameter(d, 2);
        w.design
            .slot_area
            .map(|a| wires::slot_fill(z * s as f64, over, a))
    };
    (1..=MAX_STRANDS).find_map(|s| {
        let carries = |d: Length| s as f64 * Area::of_circle(d).mm2() >= need_mm2 * (1.0 - 1e-12);
        // Within the fill limit, and laid in rows it goes in (the section sheet's rule).
        let fits = |d: Length| {
            fill_of(s, d).is_none_or(|f| f <= limits.slot_fill)
                && crate::packing::of(w, wires::grade_overall_diameter(d, 2).m(), s)
                    .is_none_or(|p| p.fits())
        };
        let usable = sizes
            .iter()
            .copied()
            .filter(|(d, _)| *d <= MAX_STRAND && carries(*d) && fits(*d));
        let (d, n) = if w.design.slot_area.is_some() {
            usable.max_by(|a, b| a.0.m().total_cmp(&b.0.m()))?
        } else {
            usable.min_by(|a, b| a.0.m().total_cmp(&b.0.m()))?
        };
        Some(WireChoice {
            strands_in_hand: s,
            diameter: d,
            awg: n,
            current_density_a_mm2: i / (s as f64 * Area::of_circle(d).mm2()),
            slot_fill: fill_of(s, d),
        })
    })
}

/// The largest standard wire (fewest strands first) that fits the slot within the fill
/// limit whatever the current density, when the slot area is known.
fn largest_fitting(w: &Winding, limits: &Limits, awg: bool) -> Option<WireChoice> {
    w.design.slot_area?;
    let loose = Limits {
        current_density_a_mm2: f64::INFINITY,
        ..*limits
    };
    wire_for(w, 1e-9, &loose, awg)
}

/// The layout's wire table for a chosen wire (grade 2 enamel, in `material`).
fn spec_of(c: &WireChoice, material: Material) -> WireSpec {
    WireSpec {
        size: match c.awg {
            Some(n) => WireSize::Awg(n),
            None => WireSize::Diameter(c.diameter),
        },
        strands_in_hand: c.strands_in_hand,
        insulation: Insulation::Grade(2),
        material,
    }
}

/// Flux the rounding of turns may give away and still count as on target, per cent: 5
/// (common practice, from memory: a rewind within 5 % of the design's turns is accepted).
pub const SHORTFALL_TOLERANCE_PERCENT: f64 = 5.0;

/// The two voltages of a six-lead machine stamped for delta on the lower and star on the
/// higher (their ratio within 3 % of √3), lower first.
pub fn star_delta_pair(d: &Design) -> Option<(f64, f64)> {
    let n = d.nameplate.as_ref()?;
    if d.leads.count >= 9 || n.voltages_v.len() != 2 {
        return None;
    }
    let lo = n.voltages_v.iter().copied().reduce(f64::min)?;
    let hi = n.voltages_v.iter().copied().reduce(f64::max)?;
    ((hi / lo / crate::design::SQRT_3 - 1.0).abs() <= 0.03).then_some((lo, hi))
}

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

/// The most turns per coil from `fewest` up whose winding (`with_turns`) still gives the
/// wanted thrust at its slip, with that operating point: thrust at a fixed voltage falls
/// as the turns rise (about as 1/N²), so a bisection finds it. When even `fewest` falls
/// short, `fewest`.
fn most_turns_for(
    with_turns: &dyn Fn(u32) -> Winding,
    fewest: u32,
    t: Target,
) -> (u32, Option<crate::thrust::Row>) {
    let at = |n: u32| operating_point(&with_turns(n), t.slip);
    let first = at(fewest);
    if first.is_none_or(|p| p.thrust_n < t.thrust_n) {
        return (fewest, first);
    }
    // Invariant: `lo` gives the thrust; `hi` does not (or is beyond the bound).
    let (mut lo, mut lo_point) = (fewest, first);
    let mut hi = fewest.saturating_mul(2).max(fewest + 1);
    loop {
        match at(hi) {
            Some(p) if p.thrust_n >= t.thrust_n && hi < MAX_TURNS => {
                (lo, lo_point) = (hi, Some(p));
                hi = hi.saturating_mul(2).min(MAX_TURNS);
            }
            _ => break,
        }
    }
    while hi - lo > 1 {
        let mid = lo + (hi - lo) / 2;
        match at(mid) {
            Some(p) if p.thrust_n >= t.thrust_n => (lo, lo_point) = (mid, Some(p)),
            _ => hi = mid,
        }
    }
    (lo, lo_point)
}

/// A flat primary's operating point at slip `s` by the thrust model (voltage-fed, end effect
/// included), when the model has what it needs.
fn operating_point(w: &Winding, s: f64) -> Option<crate::thrust::Row> {
    crate::thrust::point_at(w, s).ok()
}

/// Size a winding for the core and nameplate of `spec` (its coil list and turns, if any,
/// are ignored: the core is bare).
pub fn size(labels: &Labels, base: &Design, req: &Request) -> Result<Sizing, SizingError> {
    crate::runs::count(crate::runs::Analysis::Sizing);
    if base.phases != 3 {
        return Err(SizingError::NotThreePhase(base.phases));
    }
    let (line_v, f) = supply(base)?;
    // A six-lead machine stamped with two voltages √3 apart (230/400 V) runs delta on the
    // lower and star on the higher: either way its phases see the lower voltage, so it is
    // sized delta at the lower voltage, never star at it.
    let star_delta = star_delta_pair(base);
    let line_v = star_delta.map_or(line_v, |(lo, _)| lo);
    let build = |d: Design| {
        winding::build(&Spec {
            labels: labels.clone(),
            design: d,
            coils: Vec::new(),
            second: None,
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
    let w0 = build(probe.clone()).map_err(SizingError::NoWinding)?;
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
    let w1 = build(probe.clone()).map_err(SizingError::NoWinding)?;
    let (phi, set_by) = flux_limit(&w1, &req.limits)?;
    let target = thrust_target(&w1, req)?;
    let kw = crate::factors::fundamental(&w1).winding;
    let rated = loading::rated_current(base.nameplate.as_ref(), Some(line_v));
    // The layout's conductor metal, copper when it gives none.
    let material = base.wire.map_or(Material::Copper, |w| w.material);

    let ask = Ask {
        req,
        probe: &probe,
        leads: base.leads.count,
        line_v,
        f,
        phi,
        kw,
        target,
        rated,
        material,
    };
    let (mut candidates, nearest) = candidates(&ask, &w1, star_delta.is_some(), build);
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
    let wire_known = candidates.iter().any(|c| c.conductor_current_a.is_some());
    let stamped = stamped_connection(base);
    let wanted = target.map_or(0.0, |t| t.thrust_n);
    candidates.sort_by(|a, b| {
        let fits = |c: &Candidate| !wire_known || c.wire.is_some();
        let pulls = |c: &Candidate| c.thrust_n.is_none_or(|f| f >= wanted);
        // Sized for a thrust, the flux is lowered on purpose: only the thrust counts.
        let near = |c: &Candidate| {
            target.is_some() || c.flux_shortfall_percent <= SHORTFALL_TOLERANCE_PERCENT
        };
        let as_stamped = |c: &Candidate| stamped.is_none_or(|s| s == c.connection);
        pulls(b)
            .cmp(&pulls(a))
            .then(fits(b).cmp(&fits(a)))
            .then(near(b).cmp(&near(a)))
            .then(as_stamped(b).cmp(&as_stamped(a)))
            .then(a.parallel_paths.cmp(&b.parallel_paths))
            .then(
                a.flux_shortfall_percent
                    .total_cmp(&b.flux_shortfall_percent),
            )
    });
    let best = &candidates[0];
    // No wire meets the current-density limit: the largest that fits the slot, with the
    // current density it then carries (the warnings say so).
    let fallback_wire = match (best.wire, best.conductor_current_a) {
        (None, Some(i)) => {
            let probe = build(Design {
                connection: best.connection,
                parallel_paths: best.parallel_paths,
                turns_per_coil: best.turns_per_coil,
                ..probe.clone()
            })
            .map_err(SizingError::NoWinding)?;
            largest_fitting(&probe, &req.limits, req.awg).map(|c| WireChoice {
                current_density_a_mm2: i
                    / (c.strands_in_hand as f64 * Area::of_circle(c.diameter).mm2()),
                ..c
            })
        }
        _ => None,
    };
    let wire = best.wire.or(fallback_wire).map(|c| spec_of(&c, material));
    // A flat primary sized for a thrust is rated at the thrust model's current there: the
    // written layout carries it as its nameplate current, so the card and the loadings
    // check the same current.
    let rated_plate = target.and_then(|_| {
        let phase = best.conductor_current_a? * best.parallel_paths as f64;
        let mut n = base.nameplate.clone().unwrap_or_default();
        n.currents_a = vec![best.connection.line_current(phase)];
        n.voltages_v = vec![line_v];
        Some(n)
    });
    let chosen = Design {
        connection: best.connection,
        parallel_paths: best.parallel_paths,
        turns_per_coil: best.turns_per_coil,
        wire: wire.or(base.wire),
        nameplate: rated_plate.or(probe.nameplate.clone()),
        ..probe
    };
    let w = build(chosen.clone()).map_err(SizingError::NoWinding)?;
    let point = target.and_then(|t| operating_point(&w, t.slip));
    let at = point.zip(target).map(|(p, t)| Rated::ThrustModel {
        line_a: best.connection.line_current(p.current_a),
        slip: t.slip,
    });
    let thrust = point.zip(target).map(|(p, t)| {
        let plate_loss_w = (t.slip * p.airgap_power_w).max(0.0);
        let under = crate::thrust::plate_area_under(&w);
        ThrustCheck {
            wanted: t,
            point: p,
            plate_loss_w,
            plate_loss_w_m2: under.map(|a| plate_loss_w / a.m2()),
            met: p.thrust_n >= t.thrust_n,
        }
    });
    let other_series_wire = best
        .conductor_current_a
        .and_then(|i| wire_for(&w, i, &req.limits, !req.awg));
    let loading = loading::of_rated(&w, &req.limits, req.emf_ratio, at).map_err(|e| match e {
        loading::LoadingError::Missing(i) => SizingError::Missing(i),
        loading::LoadingError::NoTurns | loading::LoadingError::TurnsAssumed => {
            SizingError::Loading(e)
        }
    })?;
    let card = crate::card::card(&w);
    Ok(Sizing {
        design: crate::header::of(&w),
        span,
        span_choice,
        star_delta_pair_v: star_delta,
        winding_factor: kw,
        line_voltage_v: line_v,
        frequency_hz: f,
        emf_ratio: req.emf_ratio,
        flux_limit_wb: phi,
        flux_set_by: set_by,
        rated,
        candidates,
        loading,
        thrust,
        fallback_wire,
        power_within_limit_w: fallback_wire
            .zip(base.nameplate.as_ref().and_then(|n| n.power_w))
            .map(|(c, p)| p * req.limits.current_density_a_mm2 / c.current_density_a_mm2),
        other_series_wire,
        phase_resistance_20c_ohm: card.phase_resistance_20c_ohm,
        line_resistance_20c_ohm: card.line_resistance_20c_ohm,
        copper_mass_kg: card.copper_mass_kg,
        chosen,
    })
}

/// The thrust a flat primary is sized for, its speed turned into a slip; `None` when no
/// thrust is asked. Refused on a rotary core, beyond the field's reach, or where the thrust
/// model cannot run.
fn thrust_target(w1: &Winding, req: &Request) -> Result<Option<Target>, SizingError> {
    Ok(match req.thrust {
        None => None,
        Some(_) if w1.geometry.topology != crate::winding::Topology::Linear => {
            return Err(SizingError::ThrustNotLinear);
        }
        Some((thrust_n, at)) => {
            let slip = match at {
                At::Slip(s) => s,
                At::Speed(v) => {
                    let vs = crate::linear::figures(w1, Default::default())
                        .synchronous_speed_m_s
                        .ok_or(SizingError::Missing(Input::SlotPitch))?;
                    let s = 1.0 - v / vs;
                    if !(-10.0..=10.0).contains(&s) {
                        return Err(SizingError::SpeedOutOfReach {
                            speed_m_s: v,
                            field_m_s: vs,
                        });
                    }
                    s
                }
            };
            if !(slip > 0.0 && slip <= 1.0) {
                return Err(SizingError::SlipOutOfRange {
                    slip,
                    field_m_s: crate::linear::figures(w1, Default::default()).synchronous_speed_m_s,
                });
            }
            // The model's own refusal (no plate, gap or supply) before any sizing.
            crate::thrust::point_at(w1, slip).map_err(SizingError::Thrust)?;
            Some(Target { thrust_n, slip })
        }
    })
}

/// What every connection and path count is sized against: the request, the probe design
/// at the chosen span, the supply, the flux per pole allowed and the winding factor.
struct Ask<'a> {
    req: &'a Request,
    probe: &'a Design,
    leads: u8,
    line_v: f64,
    f: f64,
    phi: f64,
    kw: f64,
    target: Option<Target>,
    rated: Option<Rated>,
    material: Material,
}

/// The winding `w` at `turns` per coil; sized for a thrust, with the largest standard wire
/// that fits the slot (the primary's resistance, and so its thrust, depends on it), as the
/// written layout will have it.
fn wound_with(w: &Winding, turns: u32, ask: &Ask) -> Winding {
    let bare = Winding {
        coils: w
            .coils
            .iter()
            .map(|c| winding::Coil { turns, ..c.clone() })
            .collect(),
        design: Design {
            turns_per_coil: turns,
            ..w.design.clone()
        },
        ..w.clone()
    };
    match ask.target {
        Some(_) => match largest_fitting(&bare, &ask.req.limits, ask.req.awg) {
            Some(c) => Winding {
                design: Design {
                    wire: Some(spec_of(&c, ask.material)),
                    ..bare.design.clone()
                },
                ..bare
            },
            None => bare,
        },
        None => bare,
    }
}

/// Every connection (delta only for a star/delta pair) and path count that makes a
/// winding, with its turns for the flux allowed and its wire; and the nearest miss (how far
/// from a usable turn count, and the exact count) for the refusal when none does.
fn candidates(
    ask: &Ask,
    w1: &Winding,
    star_delta: bool,
    build: impl Fn(Design) -> Result<Winding, crate::winding::PlanError>,
) -> (Vec<Candidate>, Option<(f64, f64)>) {
    let mut candidates = Vec::new();
    let mut nearest: Option<(f64, f64)> = None;
    let connections: &[Connection] = if star_delta {
        &[Connection::Delta]
    } else {
        &[Connection::Star, Connection::Delta]
    };
    for &connection in connections {
        for paths in 1..=w1.geometry.poles.max(1) {
            let Ok(w) = build(Design {
                connection,
                parallel_paths: paths,
                ..ask.probe.clone()
            }) else {
                continue;
            };
            // A 9- or 12-lead winding brings out two sections per phase: two paths.
            if w.parallel_paths != paths || (ask.leads >= 9 && paths != 2) {
                continue;
            }
            let per_turn = w.series_turns(0);
            if per_turn <= 0.0 || ask.kw <= 1e-9 {
                continue;
            }
            let v_ph = connection.phase_voltage(ask.line_v);
            // N_ph·k_w1 = E/(√2·π·f·Φ): the EMF equation solved for the turns.
            let n_exact = loading::flux_per_pole(ask.req.emf_ratio * v_ph, ask.f, ask.phi) / ask.kw;
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
            let fewest = (exact - 1e-9).ceil().max(1.0) as u32;
            let with_turns = |turns: u32| wound_with(&w, turns, ask);
            // A flat primary sized for a thrust takes the most turns (the least flux and
            // current) that still give it; otherwise the fewest within the flux limits.
            let (turns, point) = match ask.target {
                Some(t) => most_turns_for(&with_turns, fewest, t),
                None => (fewest, None),
            };
            let sized = with_turns(turns);
            let line = point
                .map(|p| connection.line_current(p.current_a))
                .or(ask.rated.map(|r| r.line_a()));
            let current = line.map(|i| loading::conductor_current(&w, i).1);
            let wire = current.and_then(|i| wire_for(&sized, i, &ask.req.limits, ask.req.awg));
            candidates.push(Candidate {
                connection,
                parallel_paths: paths,
                phase_voltage_v: v_ph,
                turns_per_coil_exact: exact,
                turns_per_coil: turns,
                series_turns: per_turn * turns as f64,
                flux_shortfall_percent: 100.0 * (1.0 - exact / turns as f64),
                conductor_current_a: current,
                thrust_n: point.map(|p| p.thrust_n),
                wire,
            });
        }
    }
    (candidates, nearest)
}
