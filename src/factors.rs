//! Winding factors per harmonic order, by phasor sums over a phase's coil sides, with the
//! textbook closed forms as cross-checks.
//!
//! Orders are electrical: ν = 1 is the working wave; on a rotary core of p pole pairs the
//! mechanical order n gives ν = n/p, so sub- and inter-harmonics of fractional-slot windings
//! appear as fractional ν.

use num_complex::Complex64;
use serde::Serialize;

use crate::winding::{Topology, Winding};

/// Smallest factor still listed in a table; below this an order is absent.
pub const PRESENT: f64 = 1e-9;

/// Factors of one order.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FactorRow {
    /// Electrical order ν.
    pub order: f64,
    /// Mechanical order n = ν·p on a rotary core (wave count around the gap).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mech_order: Option<u64>,
    /// Distribution factor k_d.
    pub distribution: f64,
    /// Pitch (chording) factor k_p.
    pub pitch: f64,
    /// Skew factor k_s.
    pub skew: f64,
    /// Winding factor k_w = k_d·k_p·k_s.
    pub winding: f64,
}

/// Factors of one phase at every present order up to a limit.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FactorTable {
    /// Phase the factors belong to (the first phase; all are equal when balanced).
    pub phase: String,
    /// Rows in increasing order.
    pub rows: Vec<FactorRow>,
    /// True for a single-layer winding (tooth coils aside), whose factors are reported as
    /// distribution with k_p = 1: its slot contents fix the field whatever the span.
    pub single_layer: bool,
}

/// Textbook closed forms, valid for integer-slot lap windings of uniform span.
pub mod closed {
    /// Distribution factor k_d = sin(qνα/2) / (q·sin(να/2)) for q slots per belt at slot angle
    /// α (electrical radians). Source: M. G. Say, *Alternating Current Machines*, 5th ed.
    /// 1983, §4.4; Pyrhönen et al. 2014, eq. 2.32.
    pub fn distribution(q: u32, order: f64, alpha: f64) -> f64 {
        let q = q as f64;
        let den = q * (order * alpha / 2.0).sin();
        if den.abs() < 1e-15 {
            1.0
        } else {
            ((q * order * alpha / 2.0).sin() / den).abs()
        }
    }

    /// Pitch factor k_p = sin(ν·(y/τ)·π/2). Source: Say 1983, §4.4; Pyrhönen et al. 2014,
    /// eq. 2.29.
    pub fn pitch(span_over_pole_pitch: f64, order: f64) -> f64 {
        (order * span_over_pole_pitch * std::f64::consts::FRAC_PI_2)
            .sin()
            .abs()
    }

    /// Skew factor k_s = sin(νσ/2)/(νσ/2) for a skew of σ electrical radians at the
    /// fundamental. Source: Pyrhönen et al. 2014, eq. 2.34.
    pub fn skew(order: f64, sigma: f64) -> f64 {
        let x = order * sigma / 2.0;
        if x.abs() < 1e-12 {
            1.0
        } else {
            (x.sin() / x).abs()
        }
    }
}

/// Factors of `phase` at electrical order `order`, by phasor sums over its coils. Coils of
/// one span split exactly into belt sum (k_d) and chord (k_p); double-layer coils of
/// different spans use the mean span for k_p; single-layer windings report k_p = 1.
pub fn factors_at(w: &Winding, phase: usize, order: f64) -> FactorRow {
    let g = &w.geometry;
    let coils: Vec<_> = w.coils.iter().filter(|c| c.phase == phase).collect();
    let turns: f64 = coils.iter().map(|c| c.turns as f64).sum();
    let mech_order = (g.topology == Topology::Rotary).then(|| {
        let n = order * g.pole_pairs();
        n.round().max(0.0) as u64
    });
    let skew = closed::skew(order, w.skew_slots * g.slot_angle_elec());
    if turns == 0.0 {
        return FactorRow {
            order,
            mech_order,
            distribution: 0.0,
            pitch: 0.0,
            skew,
            winding: 0.0,
        };
    }
    let spans: Vec<i64> = coils.iter().map(|c| w.span(c).abs()).collect();
    // One convention for single-layer windings (tooth coils aside): each slot holds one
    // side, so the slot contents alone fix the EMF and the MMF whatever the coil span or
    // shape (lap, concentric, short-pitched): the whole factor is reported as distribution,
    // with k_p = 1. A shortened single-layer span changes the end connections, not the field.
    if g.layers == 1 && spans.iter().any(|&y| y != 1) {
        let sum: Complex64 = coils.iter().map(|c| w.coil_emf(c, order)).sum();
        let kd = sum.norm() / turns;
        return FactorRow {
            order,
            mech_order,
            distribution: kd,
            pitch: 1.0,
            skew,
            winding: kd * skew,
        };
    }
    let uniform = spans.windows(2).all(|s| s[0] == s[1]);
    let (distribution, pitch) = if uniform {
        // Coil EMF = s·N·e^{−jνθ_left}·(1 − e^{−jνθ_y})/2: the belt sum and the chord split
        // exactly, even where the chord factor vanishes.
        let belt: Complex64 = coils
            .iter()
            .map(|c| {
                let s = if w.span(c) >= 0 { 1.0 } else { -1.0 };
                Complex64::from_polar(s * c.turns as f64, -g.slot_angle(w.left_slot(c), order))
            })
            .sum();
        let chord = span_angle(w, spans[0] as usize, order);
        (belt.norm() / turns, (chord / 2.0).sin().abs())
    } else {
        let sum: Complex64 = coils.iter().map(|c| w.coil_emf(c, order)).sum();
        let kw = sum.norm() / turns;
        let mean = spans
            .iter()
            .zip(&coils)
            .map(|(&s, c)| s as f64 * c.turns as f64)
            .sum::<f64>()
            / turns;
        let kp = closed::pitch(mean / g.pole_pitch_slots, order);
        if kp > 1e-9 && kw / kp <= 1.0 + 1e-9 {
            (kw / kp, kp)
        } else {
            let abs: f64 = coils.iter().map(|c| w.coil_emf(c, order).norm()).sum();
            let kp = abs / turns;
            (if abs > 1e-12 { sum.norm() / abs } else { 0.0 }, kp)
        }
    };
    FactorRow {
        order,
        mech_order,
        distribution,
        pitch,
        skew,
        winding: distribution * pitch * skew,
    }
}

/// Electrical angle spanned by `y` slot pitches at `order`.
fn span_angle(w: &Winding, y: usize, order: f64) -> f64 {
    match w.geometry.topology {
        Topology::Rotary => w.geometry.slot_angle(y, order),
        Topology::Linear => order * y as f64 * w.geometry.slot_angle_elec(),
    }
}

/// Factors of the first phase at every order up to `upto` that the distribution lets
/// through (k_d present), including the orders the span or the skew removes, which are the
/// ones a designer chose them to kill: those rows carry k_p or k_s (and k_w) of 0
/// (rotary: every mechanical order n ≤ upto·p; linear: whole orders 1..=upto).
pub fn factor_table(w: &Winding, upto: f64) -> FactorTable {
    let g = &w.geometry;
    let orders: Vec<f64> = match g.topology {
        Topology::Rotary => {
            let p = g.pole_pairs();
            let top = (upto * p + 1e-9).floor() as u64;
            (1..=top).map(|n| n as f64 / p).collect()
        }
        Topology::Linear => (1..=(upto + 1e-9).floor() as u64)
            .map(|n| n as f64)
            .collect(),
    };
    let rows = orders
        .into_iter()
        .map(|nu| factors_at(w, 0, nu))
        .filter(|r| r.distribution > PRESENT)
        .collect();
    FactorTable {
        phase: w.phase_labels[0].clone(),
        rows,
        single_layer: g.layers == 1 && w.coils.iter().any(|c| w.span(c).abs() != 1),
    }
}

/// The fundamental factors of the first phase.
pub fn fundamental(w: &Winding) -> FactorRow {
    factors_at(w, 0, 1.0)
}
