//! Winding factors per harmonic order, by phasor sums over a phase's coil sides, with the
//! textbook closed forms as cross-checks.
//!
//! Orders are electrical: ν = 1 is the working wave; on a rotary core of p pole pairs the
//! mechanical order n gives ν = n/p, so sub- and inter-harmonics of fractional-slot windings
//! appear as fractional ν.

use num_complex::Complex64;
use serde::Serialize;

use crate::winding::{Elec, Mech, Topology, Winding};

/// Smallest factor still listed in a table; below this an order is absent.
pub const PRESENT: f64 = 1e-9;

/// Factors of one order.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FactorRow {
    /// Electrical order ν.
    pub order: Elec,
    /// Mechanical order n = ν·p on a rotary core (wave count around the gap).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mech_order: Option<Mech>,
    /// Distribution factor k_d.
    pub distribution: f64,
    /// Pitch (chording) factor k_p.
    pub pitch: f64,
    /// Skew factor k_s.
    pub skew: f64,
    /// Winding factor k_w = k_d·k_p·k_s.
    pub winding: f64,
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

/// The phasor sums a phase's factors are made from, at one order.
#[derive(Debug, Clone, Copy)]
struct Sums {
    /// Σ s·N·e^{−jνθ_left} over the coils (s = ±1 by direction): the belt sum.
    belt: Complex64,
    /// Σ of the coil EMF phasors N·(e^{−jνθ_go} − e^{−jνθ_back})/2.
    emf: Complex64,
    /// Σ of the coil EMF magnitudes.
    emf_abs: f64,
}

/// What the factors need of a phase besides the sums: its turns and spans.
struct PhaseCoils {
    turns: f64,
    /// Span and turns of each coil of the phase.
    spans: Vec<(i64, f64)>,
}

impl PhaseCoils {
    fn of(w: &Winding, phase: usize) -> Self {
        let spans: Vec<(i64, f64)> = w
            .coils
            .iter()
            .filter(|c| c.phase == phase)
            .map(|c| (w.span(c).abs(), c.turns as f64))
            .collect();
        PhaseCoils {
            turns: spans.iter().map(|s| s.1).sum(),
            spans,
        }
    }

    fn uniform(&self) -> bool {
        self.spans.windows(2).all(|s| s[0].0 == s[1].0)
    }
}

/// The sums at `order` by direct phasor sums over the coils of `phase`.
fn direct_sums(w: &Winding, phase: usize, order: Elec) -> Sums {
    let g = &w.geometry;
    let mut out = Sums {
        belt: Complex64::new(0.0, 0.0),
        emf: Complex64::new(0.0, 0.0),
        emf_abs: 0.0,
    };
    for c in w.coils.iter().filter(|c| c.phase == phase) {
        let s = if w.span(c) >= 0 { 1.0 } else { -1.0 };
        out.belt += Complex64::from_polar(s * c.turns as f64, -g.slot_angle(w.left_slot(c), order));
        let e = w.coil_emf(c, order);
        out.emf += e;
        out.emf_abs += e.norm();
    }
    out
}

/// Factors of `phase` at electrical order `order`, by phasor sums over its coils. Coils of
/// one span split exactly into belt sum (k_d) and chord (k_p); double-layer coils of
/// different spans use the mean span for k_p; single-layer windings report k_p = 1.
pub fn factors_at(w: &Winding, phase: usize, order: Elec) -> FactorRow {
    factors_from(
        w,
        &PhaseCoils::of(w, phase),
        order,
        direct_sums(w, phase, order),
    )
}

/// The one rule that turns a phase's sums into factors (see [`factors_at`]).
fn factors_from(w: &Winding, ph: &PhaseCoils, order: Elec, sums: Sums) -> FactorRow {
    let g = &w.geometry;
    let turns = ph.turns;
    let mech_order = (g.topology == Topology::Rotary).then(|| {
        let n = order.get() * g.pole_pairs();
        Mech(n.round().max(0.0) as u64)
    });
    let skew = closed::skew(order.get(), w.design.skew_slots * g.slot_angle_elec());
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
    // One convention for single-layer windings (tooth coils aside): each slot holds one
    // side, so the slot contents alone fix the EMF and the MMF whatever the coil span or
    // shape (lap, concentric, short-pitched): the whole factor is reported as distribution,
    // with k_p = 1. A shortened single-layer span changes the end connections, not the field.
    if g.layers == 1 && ph.spans.iter().any(|&(y, _)| y != 1) {
        let kd = sums.emf.norm() / turns;
        return FactorRow {
            order,
            mech_order,
            distribution: kd,
            pitch: 1.0,
            skew,
            winding: kd * skew,
        };
    }
    let (distribution, pitch) = if ph.uniform() {
        // Coil EMF = s·N·e^{−jνθ_left}·(1 − e^{−jνθ_y})/2: the belt sum and the chord split
        // exactly, even where the chord factor vanishes.
        let chord = span_angle(w, ph.spans.first().map_or(0, |s| s.0) as usize, order);
        (sums.belt.norm() / turns, (chord / 2.0).sin().abs())
    } else {
        let kw = sums.emf.norm() / turns;
        let mean = ph.spans.iter().map(|&(s, n)| s as f64 * n).sum::<f64>() / turns;
        let kp = closed::pitch(mean / g.pole_pitch_slots, order.get());
        if kp > 1e-9 && kw / kp <= 1.0 + 1e-9 {
            (kw / kp, kp)
        } else {
            let kp = sums.emf_abs / turns;
            (
                if sums.emf_abs > 1e-12 {
                    sums.emf.norm() / sums.emf_abs
                } else {
                    0.0
                },
                kp,
            )
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

/// The sums of `phase` at every mechanical order n of a rotary core, from two DFTs of
/// per-slot arrays (belt and coil sides) by FFT: O(Z log Z) for all orders, then O(spans)
/// per order for the magnitudes. Bin n mod Z holds order n.
struct RotarySums {
    belt: Vec<Complex64>,
    emf: Vec<Complex64>,
    /// Turns per distinct span.
    by_span: Vec<(i64, f64)>,
    slots: usize,
}

impl RotarySums {
    fn of(w: &Winding, phase: usize) -> Self {
        let z = w.geometry.slots;
        let mut belt = vec![rustfft::num_complex::Complex::new(0.0, 0.0); z];
        let mut emf = belt.clone();
        let mut by_span: Vec<(i64, f64)> = Vec::new();
        for c in w.coils.iter().filter(|c| c.phase == phase) {
            let y = w.span(c);
            let n = c.turns as f64;
            belt[w.left_slot(c)].re += if y >= 0 { n } else { -n };
            emf[c.go].re += n / 2.0;
            emf[c.back].re -= n / 2.0;
            match by_span.iter_mut().find(|s| s.0 == y.abs()) {
                Some(s) => s.1 += n,
                None => by_span.push((y.abs(), n)),
            }
        }
        let fft = rustfft::FftPlanner::new().plan_fft_forward(z);
        fft.process(&mut belt);
        fft.process(&mut emf);
        let back = |v: Vec<rustfft::num_complex::Complex<f64>>| {
            v.iter().map(|c| Complex64::new(c.re, c.im)).collect()
        };
        RotarySums {
            belt: back(belt),
            emf: back(emf),
            by_span,
            slots: z,
        }
    }

    /// The sums at mechanical order n.
    fn at(&self, n: Mech) -> Sums {
        let n = n.get();
        let z = self.slots as u64;
        let bin = (n % z) as usize;
        let emf_abs = self
            .by_span
            .iter()
            .map(|&(y, turns)| {
                let r = ((n % (2 * z)) * (y as u64 % (2 * z))) % (2 * z);
                turns * (std::f64::consts::PI * r as f64 / z as f64).sin().abs()
            })
            .sum();
        Sums {
            belt: self.belt[bin],
            emf: self.emf[bin],
            emf_abs,
        }
    }
}

/// Electrical angle spanned by `y` slot pitches at `order`.
fn span_angle(w: &Winding, y: usize, order: Elec) -> f64 {
    match w.geometry.topology {
        Topology::Rotary => w.geometry.slot_angle(y, order),
        Topology::Linear => order.get() * y as f64 * w.geometry.slot_angle_elec(),
    }
}

/// Most orders a factor table lists: 200 000 (its text and CSV are made a table at a time;
/// this keeps a run within seconds and 300 MB).
pub const MAX_ORDERS: u64 = 200_000;

/// Orders [`factor_rows`] would walk for `upto` (mechanical orders on a rotary core).
pub fn orders_for(w: &Winding, upto: f64) -> u64 {
    match w.geometry.topology {
        Topology::Rotary => (upto * w.geometry.pole_pairs() + 1e-9).floor().max(0.0) as u64,
        _ => (upto + 1e-9).floor().max(0.0) as u64,
    }
}

/// Factors of the first phase at every order up to `upto` that the distribution lets
/// through (k_d present), including the orders the span or the skew removes, which are the
/// ones a designer chose them to kill: those rows carry k_p or k_s (and k_w) of 0
/// (rotary: every mechanical order n ≤ upto·p; linear: whole orders 1..=upto; at most
/// [`MAX_ORDERS`] orders walked).
pub fn factor_rows(w: &Winding, upto: f64) -> Vec<FactorRow> {
    let g = &w.geometry;
    let ph = PhaseCoils::of(w, 0);
    let p = g.pole_pairs();
    match g.topology {
        Topology::Rotary if g.slots > 0 => {
            let sums = RotarySums::of(w, 0);
            let top = ((upto * p + 1e-9).floor() as u64).min(MAX_ORDERS);
            (1..=top)
                .map(Mech)
                .map(|n| factors_from(w, &ph, n.electrical(p), sums.at(n)))
                .filter(|r| r.distribution > PRESENT)
                .collect()
        }
        _ => (1..=((upto + 1e-9).floor() as u64).min(MAX_ORDERS))
            .map(|n| factors_at(w, 0, Elec(n as f64)))
            .filter(|r| r.distribution > PRESENT)
            .collect(),
    }
}

/// True for a single-layer winding (tooth coils aside), whose factors are reported as
/// distribution with k_p = 1: its slot contents fix the field whatever the span.
pub fn reported_as_single_layer(w: &Winding) -> bool {
    w.geometry.layers == 1 && w.coils.iter().any(|c| w.span(c).abs() != 1)
}

/// The fundamental factors of the first phase.
pub fn fundamental(w: &Winding) -> FactorRow {
    factors_at(w, 0, Elec::FUNDAMENTAL)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::{Design, Style};
    use crate::spec::Spec;

    // The table's FFT sums and the direct phasor sums feed the same rule: every order of
    // lap, concentric, single-layer, fractional-slot and tooth-coil windings agrees to
    // rounding (1e-12), including a record with one coil reversed and one span odd.
    #[test]
    fn table_by_fft_matches_direct_sums_at_every_order() {
        let mut cases: Vec<Winding> = [
            (36, 4, 2, Some(7), Style::Lap),
            (24, 4, 1, None, Style::Lap),
            (24, 4, 1, None, Style::Concentric),
            (27, 6, 2, Some(4), Style::Lap),
            (12, 10, 2, Some(1), Style::Lap),
            (30, 4, 1, None, Style::Lap),
        ]
        .into_iter()
        .map(|(z, poles, layers, pitch, style)| {
            let spec = Spec::of(Design {
                pitch,
                style,
                ..Design::basic(Topology::Rotary, z, poles, layers)
            });
            crate::winding::build(&spec).expect("builds")
        })
        .collect();
        let mut odd = cases[0].clone();
        let c = &mut odd.coils[3];
        std::mem::swap(&mut c.go, &mut c.back);
        odd.coils[5].back = (odd.coils[5].back + 1) % 36;
        cases.push(odd);
        for w in &cases {
            let rows = factor_rows(w, 40.0);
            assert!(!rows.is_empty());
            let p = w.geometry.pole_pairs();
            let kept = (1..=(40.0 * p) as u64)
                .filter(|&n| factors_at(w, 0, Mech(n).electrical(p)).distribution > PRESENT)
                .count();
            assert_eq!(rows.len(), kept, "Z={}", w.geometry.slots);
            for row in &rows {
                let direct = factors_at(w, 0, row.order);
                for (a, b) in [
                    (row.distribution, direct.distribution),
                    (row.pitch, direct.pitch),
                    (row.winding, direct.winding),
                ] {
                    assert!(
                        (a - b).abs() < 1e-12,
                        "Z={} ν={}: {a} vs {b}",
                        w.geometry.slots,
                        row.order
                    );
                }
            }
        }
    }
}
