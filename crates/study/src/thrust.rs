//! A flat primary's performance against slip: thrust, normal force, current, power factor
//! and efficiency, from the winding and the secondary plate, with the transverse edge
//! effect and the longitudinal end effect.
//!
//! The model, per phase (three phases), every formula with its source:
//! - Magnetic gap g = clearance + plate thickness for a plate on back iron (a
//!   double-sided primary pair without back iron: g = 2·clearance + plate).
//! - Carter's coefficient k_C = τ_s/(τ_s − γ·g), γ = (4/π)·[x·atan x − ln √(1 + x²)],
//!   x = b0/(2g) (F. W. Carter 1900/1901; Pyrhönen et al. 2014, eq. 3.1); g_e = k_C·g.
//! - Edge factor (Russell and Norsworthy 1958), plate of width 2c over a stack of width 2a:
//!   K = 1 − tanh(πa/τ)/[(πa/τ)·(1 + tanh(πa/τ)·tanh(π(c − a)/τ))]; σ_e = K·σ.
//! - Goodness factor G = μ0·ω·τ²·σ_e·d/(π²·g_e) (E. R. Laithwaite 1965).
//! - Magnetising inductance L_m = 6·μ0·τ·W·(N·k_w1)²/(π²·p·g_e), N the series turns per
//!   phase, p = poles/2, W the stack width (I. Boldea, S. A. Nasar, *Linear Electric
//!   Motors*, 1987, ch. 2; the three-phase form of Pyrhönen et al. 2014, eq. 3.110).
//! - Secondary resistance referred to the primary R2' = X_m/G (from the definition of G).
//! - Primary leakage: slot L_u = (4m/Z)·μ0·W·N²·λ_u with λ_u = h/(3b) for a rectangular slot,
//!   end winding L_w = (4m/Z)·q·μ0·l_w·N²·λ_w with λ_w = 0.3, differential L_d = σ_d·L_m
//!   (Pyrhönen et al. 2014, §4.3 and §4.4; the permeance factors from memory).
//! - End effect (J. Duncan 1983): Q = D·R2'/(L_m·v), f(Q) = (1 − e^(−Q))/Q; the magnetising
//!   branch becomes R2'·f(Q) + jX_m·(1 − f(Q)). Thrust is taken from the slip-current power,
//!   F = 3·|I2|²·R2'/(s·v_s); the end eddy loss 3·|Im|²·R2'·f(Q) is counted as a loss.
//! - Normal force (one-dimensional current-sheet model, plate on back iron; Boldea and Nasar
//!   1987, ch. 2): attraction of the gap field minus repulsion of the plate currents,
//!   F_n = A·[μ0·J_m²/(4·(π·g_e/τ)²) − μ0·J_2²/4], J = m·√2·N·k_w1·I/(p·τ), A = 2p·τ·W.
//!
//! Assumptions: a thin plate (skin depth larger than the thickness), unsaturated iron,
//! secondary leakage neglected, the plate wider than the stack, sinusoidal fields. Valid
//! as a first estimate for G from about 1 to 50 and small gaps against the pole pitch.

use crate::units::{Area, Conductivity, Length};
use num_complex::Complex64;
use serde::Serialize;
use std::f64::consts::PI;
use thiserror::Error;

use crate::assumption::Assumption;
use crate::card::phase_resistances_20c;
use crate::factors;
use crate::winding::{Topology, Winding};

/// Permeability of free space, H/m (CODATA 2018, μ0 = 1.25663706212e-6).
pub const MU0: f64 = 1.256_637_062_12e-6;

/// Why the performance cannot be worked out, as typed facts. Their sentences are the
/// presenters' (`output::refusal_words`); the `Display` here only names the kind, for logs.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum ThrustError {
    /// Rotary cores have no thrust here.
    #[error("not a flat primary")]
    NotLinear,
    /// An input the model needs is missing (its layout key is the presenters' to name).
    #[error("an input is missing ({0:?})")]
    Missing(Input),
    /// The winding has no fundamental.
    #[error("no fundamental")]
    NoFundamental,
    /// The field model's phase equations have no single solution at this slip.
    #[error("no single solution at slip {slip}")]
    NoSolution {
        /// The slip (not a number when no slip was asked).
        slip: f64,
    },
}

/// An input of the flat-primary models that a layout may leave out.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Input {
    /// The secondary plate: its material or conductivity, and thickness.
    Secondary,
    /// The mechanical clearance between primary and plate.
    Airgap,
    /// The supply frequency.
    Frequency,
    /// The supply's line voltage (or a current to feed the primary with).
    LineVoltage,
    /// The slot pitch (a flat primary's, or a rotary core's from its bore).
    SlotPitch,
    /// The stack: the primary's width across the travel.
    Stack,
}

/// The gap the flux crosses, one rule for `thrust`, `inductance` and the field model: the
/// clearance, plus the plate (with steel behind it), or the clearance and half the plate
/// (a plate between two equal primaries fed alike: each primary's gap reaches the plate's
/// mid-plane, where the field's symmetry acts as iron); without a plate the clearance. Carter's coefficient from the slot
/// opening (none given: 1) makes it the effective gap g_e = k_C·g.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Gap {
    /// Magnetic gap g before Carter's correction, m.
    pub magnetic_m: f64,
    /// Carter's coefficient k_C.
    pub carter: f64,
    /// Effective gap g_e = k_C·g, m.
    pub effective_m: f64,
}

/// The gap of `w` ([`Gap`]).
pub fn gap(w: &Winding) -> Result<Gap, ThrustError> {
    let d = &w.design;
    let clearance = d
        .airgap
        .map(Length::m)
        .ok_or(ThrustError::Missing(Input::Airgap))?;
    let ts = w
        .slot_pitch()
        .map(Length::m)
        .ok_or(ThrustError::Missing(Input::SlotPitch))?;
    // A pair's field is mirror-symmetric about the plate's mid-plane (no tangential
    // field there, as on iron): each primary's gap reaches to it.
    let g = match d.secondary {
        Some(s) if s.back_iron => clearance + s.thickness.m(),
        Some(s) => clearance + s.thickness.m() / 2.0,
        None => clearance,
    };
    let carter = match d.slot_opening.map(Length::m) {
        Some(b0) if b0 > 0.0 => carter_coefficient(ts, b0.min(0.99 * ts), g),
        _ => 1.0,
    };
    Ok(Gap {
        magnetic_m: g,
        carter,
        effective_m: carter * g,
    })
}

/// How the primary is fed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum Feed {
    /// From the supply's line voltage in the winding's connection.
    Voltage {
        /// Phase voltage, volts r.m.s.
        phase_voltage_v: f64,
    },
    /// With a fixed r.m.s. phase current.
    Current {
        /// Phase current, amperes r.m.s.
        phase_current_a: f64,
    },
}

/// What the user asked for.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ThrustQuery {
    /// Fixed phase current instead of the supply voltage.
    pub current_a: Option<f64>,
    /// Slips of the table: from, to, and the number of steps between.
    pub slip_from: f64,
    /// Last slip.
    pub slip_to: f64,
    /// Intervals between the first and last slip.
    pub steps: usize,
    /// Leave out Duncan's end effect.
    pub end_effect: bool,
}

/// The per-phase equivalent circuit and the figures behind it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Circuit {
    /// Pole pitch, m.
    pub pole_pitch_m: f64,
    /// Primary (stack) width, m.
    pub width_m: f64,
    /// Active primary length 2p·τ, m.
    pub length_m: f64,
    /// Magnetic gap before Carter's correction, m.
    pub magnetic_gap_m: f64,
    /// Supply angular frequency, rad/s.
    pub omega: f64,
    /// Effective series turns per phase N·k_w1.
    pub effective_turns: f64,
    /// Pole pairs p (half-integer for odd-pole primaries).
    pub pole_pairs: f64,
    /// Primary resistance per phase at the winding's temperature (`[winding] temperature_c`,
    /// 20 °C when not given), ohms.
    pub r1_ohm: f64,
    /// Primary leakage reactance per phase (slot + end + differential), ohms.
    pub x1_ohm: f64,
    /// Of which slot leakage, ohms.
    pub x_slot_ohm: f64,
    /// Of which end-winding leakage, ohms.
    pub x_end_ohm: f64,
    /// Of which differential leakage σ_d·X_m, ohms.
    pub x_diff_ohm: f64,
    /// Magnetising reactance, ohms.
    pub xm_ohm: f64,
    /// Secondary resistance referred to the primary, ohms.
    pub r2_ohm: f64,
}

/// One operating point.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Row {
    /// Slip s (below 0 generating, above 1 braking by plugging).
    pub slip: f64,
    /// Secondary speed (1 − s)·v_s, m/s.
    pub speed_m_s: f64,
    /// Thrust, N (positive in the direction of the field's travel).
    pub thrust_n: f64,
    /// Normal force, N: attraction between primary and secondary positive.
    pub normal_force_n: f64,
    /// Phase current, A r.m.s.
    pub current_a: f64,
    /// Power factor at the phase terminals.
    pub power_factor: f64,
    /// Mechanical output over electrical input while motoring; null otherwise.
    pub efficiency: Option<f64>,
    /// Power crossing the gap 3·|I2|²·R2'/s, W.
    pub airgap_power_w: f64,
    /// Duncan's Q at this speed (null without the end effect).
    pub end_effect_q: Option<f64>,
}

/// The performance report.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ThrustReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title of the layout.
    pub title: Option<String>,
    /// How the primary was fed.
    pub feed: Feed,
    /// True when Duncan's end effect is included.
    pub end_effect: bool,
    /// Goodness factor G = X_m/R2'.
    pub goodness_factor: f64,
    /// Carter's coefficient.
    pub carter_coefficient: f64,
    /// Russell–Norsworthy edge factor K.
    pub edge_factor: f64,
    /// Effective gap g_e = k_C·g, mm.
    #[serde(rename = "effective_gap_mm", serialize_with = "crate::units::in_mm")]
    pub effective_gap: Length,
    /// Magnetising inductance L_m, H.
    pub magnetizing_inductance_h: f64,
    /// Secondary resistance referred to the primary, ohms.
    pub secondary_resistance_ohm: f64,
    /// Synchronous speed v_s = 2·f·τ, m/s.
    pub synchronous_speed_m_s: f64,
    /// The circuit.
    pub circuit: Circuit,
    /// Operating points.
    pub rows: Vec<Row>,
    /// The same slips without Duncan's end effect, as a long primary would run (empty when
    /// the end effect is left out: then `rows` are those).
    pub long_primary_rows: Vec<Row>,
    /// The finite primary's own field by the layer method, at the same slips.
    pub field_model: crate::layers::FieldModel,
    /// Largest thrust in the slip range and its slip.
    pub max_thrust_n: f64,
    /// Slip of the largest thrust.
    pub max_thrust_slip: f64,
    /// What the model assumes and what was assumed for missing data.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub assumptions: Vec<Assumption>,
}

/// Carter's γ for a slot opening `b0` over a gap `g` (both in the same unit).
pub fn carter_gamma(b0: f64, g: f64) -> f64 {
    let x = b0 / (2.0 * g);
    4.0 / PI * (x * x.atan() - (1.0 + x * x).sqrt().ln())
}

/// Carter's coefficient k_C = τ_s/(τ_s − γ·g).
pub fn carter_coefficient(slot_pitch: f64, b0: f64, g: f64) -> f64 {
    slot_pitch / (slot_pitch - carter_gamma(b0, g) * g)
}

/// Russell–Norsworthy edge factor for a stack of width `2a` under a plate of width `2c`
/// (c ≥ a) at pole pitch `tau`: the factor on the plate's conductivity.
pub fn edge_factor(a: f64, c: f64, tau: f64) -> f64 {
    let x = PI * a / tau;
    let t = x.tanh();
    let over = (PI * (c - a).max(0.0) / tau).tanh();
    1.0 - t / (x * (1.0 + t * over))
}

/// Duncan's end-effect function f(Q) = (1 − e^(−Q))/Q, 1 at Q = 0.
pub fn duncan_f(q: f64) -> f64 {
    if q.abs() < 1e-8 {
        1.0 - q / 2.0
    } else {
        -(-q).exp_m1() / q
    }
}

/// Everything fixed by the winding and the plate, before any slip.
pub(crate) struct Model {
    pub(crate) circuit: Circuit,
    g: f64,
    kc: f64,
    edge: f64,
    pub(crate) ge: f64,
    lm: f64,
    pub(crate) vs: f64,
    m: f64,
    /// 2 for a plate between two primaries (thrust and power of both), else 1.
    sides: f64,
    assumptions: Vec<Assumption>,
}

/// The abscissa of the largest `f` between `lo` and `hi` by `steps` golden-section steps
/// (f unimodal there: the caller brackets its best grid point by its neighbours).
pub(crate) fn golden_max(f: &dyn Fn(f64) -> f64, lo: f64, hi: f64, steps: usize) -> f64 {
    let (mut lo, mut hi) = (lo.min(hi), lo.max(hi));
    let phi = (5f64.sqrt() - 1.0) / 2.0;
    for _ in 0..steps {
        let x1 = hi - phi * (hi - lo);
        let x2 = lo + phi * (hi - lo);
        if f(x1) >= f(x2) {
            hi = x2;
        } else {
            lo = x1;
        }
    }
    (lo + hi) / 2.0
}

/// Mechanical output over electrical input while motoring (0 ≤ s ≤ 1, both powers
/// positive, output within input); `None` otherwise. One rule for both models.
pub(crate) fn efficiency(s: f64, p_in: f64, p_out: f64) -> Option<f64> {
    ((0.0..=1.0).contains(&s) && p_in > 0.0 && p_out >= 0.0 && p_out <= p_in).then(|| p_out / p_in)
}

pub(crate) fn model(w: &Winding) -> Result<Model, ThrustError> {
    let geo = &w.geometry;
    if geo.topology != Topology::Linear {
        return Err(ThrustError::NotLinear);
    }
    let d = &w.design;
    let sec = d.secondary.ok_or(ThrustError::Missing(Input::Secondary))?;
    let Gap {
        magnetic_m: g,
        carter: kc,
        effective_m: ge,
    } = gap(w)?;
    let f = d
        .supply
        .frequency_hz
        .ok_or(ThrustError::Missing(Input::Frequency))?;
    let ts = w
        .slot_pitch()
        .map(Length::m)
        .ok_or(ThrustError::Missing(Input::SlotPitch))?;
    let width = w
        .design
        .core
        .stack
        .map(Length::m)
        .ok_or(ThrustError::Missing(Input::Stack))?;
    let tau = ts * geo.pole_pitch_slots;
    let mut assumptions = vec![Assumption::ThrustModel, Assumption::FieldModel];
    if !sec.back_iron {
        assumptions.push(Assumption::NoBackIron);
    }
    if d.slot_opening.map(Length::m).is_none() {
        assumptions.push(Assumption::NoSlotOpening);
    }
    let plate_w = sec.width.map(Length::m).unwrap_or_else(|| {
        assumptions.push(Assumption::NoPlateWidth);
        width
    });
    let edge = edge_factor(width / 2.0, plate_w.max(width) / 2.0, tau);
    let omega = 2.0 * PI * f;
    let fund = factors::fundamental(w);
    let n = w.series_turns(0);
    let nkw = n * fund.winding;
    if nkw <= 0.0 {
        return Err(ThrustError::NoFundamental);
    }
    let p = geo.poles as f64 / 2.0;
    let m = geo.phases as f64;
    // Three-phase form generalised to m phases: L_m = 2m·μ0·τ·W·(N·k_w1)²/(π²·p·g_e).
    let lm = 2.0 * m * MU0 * tau * width * nkw * nkw / (PI * PI * p * ge);
    let xm = omega * lm;
    let sides = if sec.back_iron { 1.0 } else { 2.0 };
    // Per primary: a pair's primary drives half the plate (see [`gap`]).
    let goodness = MU0 * omega * tau * tau * sec.conductivity_hot_s_m() * edge * sec.thickness.m()
        / sides
        / (PI * PI * ge);
    let r2 = xm / goodness;
    let hot = 1.0 + crate::wire::COPPER.alpha_per_k * (d.winding_temperature_c - 20.0);
    let r1 = match phase_resistances_20c(w) {
        Some(r) => r.iter().sum::<f64>() / r.len().max(1) as f64 * hot,
        None => {
            assumptions.push(Assumption::NoPrimaryResistance);
            0.0
        }
    };
    if d.slot_size.is_none() {
        assumptions.push(Assumption::NoSlotSize);
    }
    let (l_slot, l_end) = leakage_h(w).unwrap_or((0.0, 0.0));
    let sigma = crate::field::differential_leakage(w).unwrap_or_else(|| {
        assumptions.push(Assumption::NoDifferentialLeakage);
        0.0
    });
    let x_slot = omega * l_slot;
    let x_end = omega * l_end;
    let x_diff = sigma * xm;
    // The model's own range (see the module notes): say when the inputs leave it.
    if !(1.0..=50.0).contains(&goodness) {
        assumptions.push(Assumption::GoodnessOutOfRange { goodness });
    }
    if ge / tau > 0.1 {
        assumptions.push(Assumption::GapLargeAgainstPitch { ratio: ge / tau });
    }
    Ok(Model {
        circuit: Circuit {
            pole_pitch_m: tau,
            width_m: width,
            length_m: tau * geo.poles as f64,
            magnetic_gap_m: g,
            omega,
            effective_turns: nkw,
            pole_pairs: p,
            r1_ohm: r1,
            x1_ohm: x_slot + x_end + x_diff,
            x_slot_ohm: x_slot,
            x_end_ohm: x_end,
            x_diff_ohm: x_diff,
            xm_ohm: xm,
            r2_ohm: r2,
        },
        g,
        kc,
        edge,
        ge,
        lm,
        vs: 2.0 * f * tau,
        m,
        sides,
        assumptions,
    })
}

/// Primary slot and end-winding leakage inductances per phase, H (Pyrhönen et al. 2014,
/// §4.3-4.4): L_u = (4m/Z)·μ0·W·N²·λ_u with λ_u = h/(3b) (1.0 when the slot's size is not
/// given), L_w = (4m/Z)·q·μ0·l_w·N²·λ_w with λ_w = 0.3 and l_w the end-winding length of
/// both ends (the card's end factor times the span width, twice). `None` without the stack
/// or slot pitch.
pub fn leakage_h(w: &Winding) -> Option<(f64, f64)> {
    let geo = &w.geometry;
    let width = w.design.core.stack.map(Length::m)?;
    let ts = w.slot_pitch().map(Length::m)?;
    let n = w.series_turns(0);
    let m = geo.phases as f64;
    let p = geo.poles as f64 / 2.0;
    let active = (geo.pole_pitch_slots * geo.poles as f64).round().max(1.0);
    let lambda_u = w.design.slot_size.map_or(1.0, |(b, h)| h / (3.0 * b));
    let l_slot = 4.0 * m / active * MU0 * width * n * n * lambda_u;
    let q = active / (2.0 * p * m);
    let l_w = 2.0 * w.design.turn.end_factor * w.pitch as f64 * ts;
    let l_end = 4.0 * m / active * q * MU0 * l_w * n * n * 0.3;
    Some((l_slot, l_end))
}

/// One operating point of the circuit.
fn point(md: &Model, feed: Feed, s: f64, end: bool) -> Row {
    let c = &md.circuit;
    let v = (1.0 - s) * md.vs;
    // Magnetising branch, with Duncan's modification at this speed.
    let (zm, q, fq) = if end {
        let q = if v.abs() > 0.0 {
            c.length_m * c.r2_ohm / (md.lm * v.abs())
        } else {
            f64::INFINITY
        };
        let fq = if q.is_finite() { duncan_f(q) } else { 0.0 };
        (
            Complex64::new(c.r2_ohm * fq, c.xm_ohm * (1.0 - fq)),
            Some(q).filter(|q| q.is_finite()),
            fq,
        )
    } else {
        (Complex64::new(0.0, c.xm_ohm), None, 0.0)
    };
    // Secondary branch R2'/s, worked in admittances so that no slip, however small,
    // overflows: y2 = s/R2' (zero at s = 0, where it carries no current), ym = 1/Zm.
    let ym = Complex64::new(1.0, 0.0) / zm;
    let y2 = Complex64::new(s / c.r2_ohm, 0.0);
    let ysum = ym + y2;
    let (i_ratio_2, i_ratio_m, zpar) = (y2 / ysum, ym / ysum, Complex64::new(1.0, 0.0) / ysum);
    let z = Complex64::new(c.r1_ohm, c.x1_ohm) + zpar;
    let i1 = match feed {
        Feed::Voltage { phase_voltage_v } => Complex64::new(phase_voltage_v, 0.0) / z,
        Feed::Current { phase_current_a } => Complex64::new(phase_current_a, 0.0),
    };
    let i2 = i1 * i_ratio_2;
    let im = i1 * i_ratio_m;
    // Air-gap power m·|I2|²·R2'/s = m·|I1|²·(s/R2')/|ym + y2|²: the same, without the
    // division by s.
    let p_gap = md.m * i1.norm_sqr() * (s / c.r2_ohm) / ysum.norm_sqr();
    // A pair: both primaries' thrust and power (each primary's circuit is the same).
    let p_gap = p_gap * md.sides;
    let thrust = p_gap / md.vs;
    let p_in = md.m * (z * i1.norm_sqr()).re * md.sides;
    let p_out = thrust * v;
    // Motoring from synchronism (0) to standstill (0 as well): output over input.
    let efficiency = efficiency(s, p_in, p_out);
    // Normal force from the current sheets (peak linear current densities).
    let sheet =
        |i: f64| md.m * 2f64.sqrt() * c.effective_turns * i / (c.pole_pairs * c.pole_pitch_m);
    // With the end effect the gap field is what the reduced magnetising reactance
    // X_m·(1 − f(Q)) carries (the R2'·f(Q) part is the end eddy loss): the magnetising
    // sheet that attracts is |I_m|·(1 − f(Q)).
    let (jm, j2) = (sheet(im.norm() * (1.0 - fq)), sheet(i2.norm()));
    let kg = PI * md.ge / c.pole_pitch_m;
    let area = c.length_m * c.width_m;
    let normal = area * (MU0 * jm * jm / (4.0 * kg * kg) - MU0 * j2 * j2 / 4.0);
    let pf = if z.norm() > 0.0 { z.re / z.norm() } else { 1.0 };
    Row {
        slip: s,
        speed_m_s: v,
        thrust_n: thrust,
        normal_force_n: normal,
        current_a: i1.norm(),
        power_factor: pf,
        efficiency,
        airgap_power_w: p_gap,
        end_effect_q: q,
    }
}

/// One operating point of the voltage-fed primary at slip `s`, end effect included: the
/// model built once and one point of it, for a caller that needs a single slip (the
/// sizing's search over turns), without the sweep and the largest-thrust search.
pub fn point_at(w: &Winding, s: f64) -> Result<Row, ThrustError> {
    let md = model(w)?;
    let v = w
        .design
        .supply
        .line_voltage_v
        .ok_or(ThrustError::Missing(Input::LineVoltage))?;
    let feed = Feed::Voltage {
        phase_voltage_v: w.design.connection.phase_voltage(v),
    };
    Ok(point(&md, feed, s, true))
}

/// The plate's area under the primary: the primary's length (slots × slot pitch) times
/// the narrower of plate and stack. The one rule for the plate's heat per area.
pub fn plate_area_under(w: &Winding) -> Option<Area> {
    let stack = w.design.core.stack?;
    let plate = w.design.secondary.and_then(|s| s.width).unwrap_or(stack);
    Some(w.slot_pitch()? * w.geometry.slots as f64 * plate.min(stack))
}

/// Slip `k` of `steps` from `a` to `b`; a step that lands on synchronism (0) or standstill
/// (1) is that slip exactly, not the rounding dust beside it (which would read as a tiny
/// generating or plugging slip).
fn grid_slip(a: f64, b: f64, steps: usize, k: usize) -> f64 {
    let s = a + (b - a) * k as f64 / steps as f64;
    for exact in [0.0, 1.0] {
        if (a - exact) * (b - exact) < 0.0 {
            let at = (exact - a) / (b - a) * steps as f64;
            if (k as f64 - at).abs() < 1e-9 {
                return exact;
            }
        }
    }
    s
}

/// Thrust, normal force, current, power factor and efficiency over a slip range.
pub fn thrust(w: &Winding, query: &ThrustQuery) -> Result<ThrustReport, ThrustError> {
    let md = model(w)?;
    let feed = match query.current_a {
        Some(i) => Feed::Current { phase_current_a: i },
        None => Feed::Voltage {
            phase_voltage_v: w.design.connection.phase_voltage(
                w.design
                    .supply
                    .line_voltage_v
                    .ok_or(ThrustError::Missing(Input::LineVoltage))?,
            ),
        },
    };
    crate::runs::count(crate::runs::Analysis::Thrust);
    let steps = query.steps.max(1);
    let (a, b) = (query.slip_from, query.slip_to);
    let sweep = |end_effect: bool| -> Vec<Row> {
        (0..=steps)
            .map(|k| point(&md, feed, grid_slip(a, b, steps, k), end_effect))
            .collect()
    };
    let rows = sweep(query.end_effect);
    let long_primary_rows = if query.end_effect {
        sweep(false)
    } else {
        Vec::new()
    };
    // The largest thrust: a fine grid, then golden-section refinement around its best.
    let n = 2000;
    let at = |s: f64| point(&md, feed, s, query.end_effect).thrust_n;
    let grid = |k: usize| a + (b - a) * k as f64 / n as f64;
    let best = (0..=n)
        .max_by(|x, y| at(grid(*x)).total_cmp(&at(grid(*y))))
        .unwrap_or(0);
    let s_max = golden_max(
        &at,
        grid(best.saturating_sub(1)),
        grid((best + 1).min(n)),
        80,
    );
    let f_max = at(s_max);
    let checked = checks(w, &md, feed, &rows, query.end_effect);
    let slips: Vec<f64> = rows.iter().map(|r| r.slip).collect();
    let mut field_model = crate::layers::field_model(w, feed, &slips)?;
    field_model.standstill_thrust_ratio = rows
        .iter()
        .zip(&field_model.rows)
        .find(|(c, _)| c.slip == 1.0 && c.thrust_n != 0.0)
        .map(|(c, f)| f.thrust_n / c.thrust_n);
    field_model.max_thrust_ratio = (f_max != 0.0).then(|| field_model.max_thrust_n / f_max);
    let mut checked = checked;
    // The plate's heat at standstill by the field model beside the circuit's.
    if let Some(still) = field_model.rows.iter().find(|r| r.slip == 1.0) {
        let under = plate_area_under(w).filter(|a| a.m2() > 0.0);
        for a in checked.iter_mut() {
            if let Assumption::PlateHeatingAtStandstill {
                field_watts,
                field_w_cm2,
                ..
            } = a
            {
                *field_watts = Some(still.secondary_loss_w);
                *field_w_cm2 = under.map(|u| still.secondary_loss_w / u.cm2());
            }
        }
    }
    if field_model.window_wanted_m > field_model.window_m * (1.0 + 1e-9) {
        checked.push(Assumption::FieldGridBounded {
            window_m: field_model.window_m,
            wanted_m: field_model.window_wanted_m,
            k_max: field_model.k_max_per_m,
            wanted_k_max: field_model.k_max_wanted_per_m,
        });
    }
    Ok(ThrustReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        feed,
        end_effect: query.end_effect,
        goodness_factor: md.circuit.xm_ohm / md.circuit.r2_ohm,
        carter_coefficient: md.kc,
        edge_factor: md.edge,
        effective_gap: Length::from_m(md.ge),
        magnetizing_inductance_h: md.lm,
        secondary_resistance_ohm: md.circuit.r2_ohm,
        synchronous_speed_m_s: md.vs,
        circuit: md.circuit,
        rows,
        long_primary_rows,
        field_model,
        max_thrust_n: f_max,
        max_thrust_slip: s_max,
        assumptions: {
            let mut a = md.assumptions.clone();
            a.push(Assumption::MagneticGap {
                gap: Length::from_m(md.g),
            });
            a.extend(checked);
            a
        },
    })
}

/// A steel backing of given thickness carries half the flux per pole through its section
/// (the back-iron rule of `loading`), at the largest flux: synchronism on the long-primary
/// circuit, where no secondary current opposes the magnetising current. The warning when
/// that passes the back-iron limit.
pub(crate) fn backing_saturation(w: &Winding, md: &Model, feed: Feed) -> Option<Assumption> {
    let b = w.design.secondary?.backing?;
    let c = &md.circuit;
    let e = match feed {
        Feed::Voltage { phase_voltage_v } => {
            let z = Complex64::new(c.r1_ohm, c.x1_ohm + c.xm_ohm);
            phase_voltage_v * c.xm_ohm / z.norm()
        }
        Feed::Current { phase_current_a } => phase_current_a * c.xm_ohm,
    };
    let f = c.omega / (2.0 * PI);
    let phi = crate::loading::flux_per_pole(e, f, c.effective_turns);
    let tesla = phi / (2.0 * b.thickness.m() * c.width_m);
    let limit = crate::loading::YOKE_LIMIT_T;
    (tesla > limit).then_some(Assumption::BackingSaturates {
        tesla,
        limit_tesla: limit,
        thickness: b.thickness,
    })
}

/// The warning when phase current `amps` (at slip `slip`) passes the card's current
/// density in the layout's wire.
pub(crate) fn current_density(w: &Winding, amps: f64, slip: f64) -> Option<Assumption> {
    // A/mm², the unit the trade's limits are given in.
    let area = crate::wire::Wire::of(w.design.wire.as_ref()?)
        .conductor_area
        .mm2();
    let limit = crate::card::CURRENT_DENSITY_LIMIT_A_MM2;
    let j = amps / w.parallel_paths.max(1) as f64 / area;
    (j > limit).then_some(Assumption::PrimaryCurrentDensity {
        density_a_mm2: j,
        limit_a_mm2: limit,
        slip,
    })
}

/// The model's assumptions checked against the inputs: the plate's conductivity as used, a
/// plate narrower than the stack, thicker than its skin depth, the primary's current
/// density at the sweep's largest current, and the plate's heat at standstill.
fn checks(w: &Winding, md: &Model, feed: Feed, rows: &[Row], end: bool) -> Vec<Assumption> {
    let mut a = Vec::new();
    let d = &w.design;
    let Some(sec) = d.secondary else {
        return a;
    };
    a.push(Assumption::PlateConductivity {
        conductivity: Conductivity::from_s_m(sec.conductivity_hot_s_m()),
    });
    a.push(Assumption::Temperatures {
        winding_c: d.winding_temperature_c,
        plate_c: sec.temperature_c,
    });
    a.extend(backing_saturation(w, md, feed));
    let stack = d.core.stack.unwrap_or(Length::ZERO);
    let plate = sec.width.unwrap_or(stack);
    if plate < stack {
        a.push(Assumption::PlateNarrowerThanStack { plate, stack });
    }
    // Skin depth δ = √(2/(ω·μ0·σ)) at the supply frequency; at slip s the plate sees s·f,
    // so it is thinner than δ/√s below s = (δ/t)² (the classical skin depth, e.g.
    // Jackson, Classical Electrodynamics, §8.1).
    let omega = 2.0 * PI * d.supply.frequency_hz.unwrap_or(0.0);
    let delta = (2.0 / (omega * MU0 * sec.conductivity_hot_s_m())).sqrt();
    if omega > 0.0 && sec.thickness.m() > delta {
        a.push(Assumption::PlateThickerThanSkinDepth {
            thickness: sec.thickness,
            skin_depth: Length::from_m(delta),
            thin_below_slip: (delta / sec.thickness.m()).powi(2),
        });
    }
    if let Some(r) = rows
        .iter()
        .max_by(|x, y| x.current_a.total_cmp(&y.current_a))
    {
        a.extend(current_density(w, r.current_a, r.slip));
    }
    // At standstill all the gap power heats the plate: the sweep's row there, if it has one.
    let standstill = rows
        .iter()
        .find(|r| r.slip == 1.0)
        .copied()
        .unwrap_or_else(|| point(md, feed, 1.0, end));
    if let Some(under) = plate_area_under(w).filter(|a| a.m2() > 0.0)
        && standstill.airgap_power_w.is_finite()
    {
        a.push(Assumption::PlateHeatingAtStandstill {
            watts: standstill.airgap_power_w,
            w_cm2: standstill.airgap_power_w / under.cm2(),
            field_watts: None,
            field_w_cm2: None,
        });
    }
    a
}

#[cfg(test)]
mod tests {
    use super::*;

    // Duncan 1983: f(Q) → 1 as Q → 0 and f(Q) ≈ 1/Q for large Q.
    #[test]
    fn duncan_function_limits() {
        assert!((duncan_f(0.0) - 1.0).abs() < 1e-15);
        assert!((duncan_f(1e-6) - (1.0 - 0.5e-6)).abs() < 1e-12);
        assert!((duncan_f(50.0) * 50.0 - 1.0).abs() < 1e-12);
        // At Q = 1: 1 − 1/e (closed form).
        assert!((duncan_f(1.0) - (1.0 - (-1f64).exp())).abs() < 1e-15);
    }
}
