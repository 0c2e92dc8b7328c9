//! The star of slots: the one place for the rules every analysis shares.
//!
//! - Slot k lies at electrical angle 2π·a_k/den with the exact angle index
//!   a_k = k·num mod den ([`Geometry::angle_num`], [`Geometry::angle_den`]).
//! - The 60° belt rule: the star is cut into 2m sectors of π/m; sector b belongs to phase
//!   b/2 (b even, positive) or to phase (b + m)/2 mod m (b odd, negative), giving the belt
//!   order +U −W +V −U +W −V for m = 3 (Pyrhönen, Jokinen, Hrabovcová, *Design of Rotating
//!   Electrical Machines*, 2nd ed. 2014, §2.4; K. Vogt, *Berechnung elektrischer Maschinen*,
//!   1996).
//! - Slot currents: go sides carry +N·I/a, back sides −N·I/a, real (balanced currents at
//!   ωt = 0) or complex (any phase-current phasors).
//! - Balance and sequence: symmetrical components (C. L. Fortescue, Trans. AIEE 37, 1918)
//!   and one tolerance, [`BALANCE_TOL`].

use num_complex::Complex64;
use std::f64::consts::PI;

use super::{Geometry, Winding};

/// Relative residual below which phasors count as equal or balanced, in every command.
/// Coil turns are whole numbers, so a real fault leaves an imbalance of a few per cent;
/// rounding in the phasor sums stays near 1e-13.
pub const BALANCE_TOL: f64 = 1e-7;

/// Order of a set of phase quantities (currents in time, or EMFs found on a winding).
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, schemars::JsonSchema)]
#[serde(rename_all = "lowercase")]
pub enum Sequence {
    /// Each phase lags the one before it by 2π/m (V lags U): on a winding in slot order,
    /// the field travels towards rising slot numbers.
    Positive,
    /// Each phase leads the one before it by 2π/m: the field travels the other way.
    Negative,
}

/// Phase and polarity (true: positive) of belt `b` of the 2m belts.
pub fn belt(b: usize, m: usize) -> (usize, bool) {
    if b.is_multiple_of(2) {
        (b / 2, true)
    } else {
        (((b + m) / 2) % m, false)
    }
}

/// Belt of angle index `a` (of `den` per electrical turn) for m phases.
pub fn belt_of_index(a: u64, den: u64, m: usize) -> (usize, bool) {
    let b = ((2 * m as u64 * a) / den.max(1)) as usize;
    belt(b.min(2 * m - 1), m)
}

/// Exact angle index of slot `k` (0-based): its electrical angle is 2π·index/den.
pub fn angle_index(g: &Geometry, k: usize) -> u64 {
    ((k as u128 * g.angle_num as u128) % g.angle_den.max(1) as u128) as u64
}

/// Phase and polarity of the belt slot `k` lies in.
pub fn belt_of_slot(g: &Geometry, k: usize) -> (usize, bool) {
    belt_of_index(angle_index(g, k), g.angle_den, g.phases)
}

/// The rays of the star: each distinct angle index with its slots (0-based), in order of
/// first appearance.
pub fn rays(g: &Geometry) -> Vec<(u64, Vec<usize>)> {
    let den = g.angle_den.max(1) as usize;
    let mut at: Vec<usize> = vec![usize::MAX; den.min(1 << 24)];
    let mut out: Vec<(u64, Vec<usize>)> = Vec::new();
    for k in 0..g.slots {
        let a = angle_index(g, k);
        match at.get(a as usize).copied() {
            Some(i) if i != usize::MAX => out[i].1.push(k),
            Some(_) => {
                at[a as usize] = out.len();
                out.push((a, vec![k]));
            }
            None => match out.iter_mut().find(|r| r.0 == a) {
                Some(r) => r.1.push(k),
                None => out.push((a, vec![k])),
            },
        }
    }
    out
}

/// cos and sin of 2πk/n for k in 0..n, into `out`: complex multiplication with a fresh exact
/// value every 64 steps, so rounding cannot build up on large cores.
pub fn roots_of_unity(n: usize, out: &mut Vec<(f64, f64)>) {
    let step = 2.0 * PI / n.max(1) as f64;
    let (ss, sc) = step.sin_cos();
    out.clear();
    let (mut c, mut s) = (1.0f64, 0.0f64);
    for k in 0..n {
        if k % 64 == 0 {
            (s, c) = (step * k as f64).sin_cos();
        }
        out.push((c, s));
        (c, s) = (c * sc - s * ss, s * sc + c * ss);
    }
}

/// |Σ I_k e^(−j·n·2πk/Z)| / n over slot currents `currents`, with `roots` the table of the Z
/// roots of unity ([`roots_of_unity`]) stepped by integer index: the MMF amplitude of
/// mechanical order n on a closed core, up to a constant (0 for n = 0).
pub fn order_amplitude(currents: &[f64], roots: &[(f64, f64)], n: usize) -> f64 {
    let z = currents.len();
    if z == 0 || n == 0 {
        return 0.0;
    }
    let (mut re, mut im) = (0.0, 0.0);
    let step = n % z;
    let mut a = 0usize;
    for &i in currents {
        let (c, s) = roots[a];
        re += i * c;
        im -= i * s;
        a += step;
        if a >= z {
            a -= z;
        }
    }
    (re * re + im * im).sqrt() / n as f64
}

/// Slot currents at ωt = 0 under balanced positive-sequence phase currents
/// i_k = cos(2πk/m), per unit path current: `out[slot]` (go sides +N·i, back −N·i).
pub fn balanced_slot_currents(w: &Winding, out: &mut Vec<f64>) {
    let m = w.geometry.phases;
    let cos: Vec<f64> = (0..m)
        .map(|k| (2.0 * PI * k as f64 / m as f64).cos())
        .collect();
    out.clear();
    out.resize(w.geometry.slots, 0.0);
    for c in &w.coils {
        let i = c.turns as f64 * cos[c.phase.min(m - 1)];
        out[c.go] += i;
        out[c.back] -= i;
    }
}

/// Ampere-turn phasor of every slot for phase-current phasors `currents` (one per phase),
/// each path carrying 1/a of its phase current.
pub fn slot_currents(w: &Winding, currents: &[Complex64]) -> Vec<Complex64> {
    let a = w.parallel_paths.max(1) as f64;
    let mut c = vec![Complex64::new(0.0, 0.0); w.geometry.slots];
    for coil in &w.coils {
        let i = currents[coil.phase] * (coil.turns as f64 / a);
        c[coil.go] += i;
        c[coil.back] -= i;
    }
    c
}

/// The phase operator of an m-phase system: the unit phasor of phase `k` in positive
/// sequence, e^(−j2πk/m) (each phase lags the one before by 2π/m; Fortescue 1918). Its
/// conjugate is phase `k`'s in negative sequence. Every phase rotation in the tool is this.
pub fn phase_operator(k: usize, m: usize) -> Complex64 {
    Complex64::from_polar(1.0, -2.0 * PI * k as f64 / m.max(1) as f64)
}

/// The sequence of a set of phasors: `Some(Positive)` for a balanced positive-sequence set
/// ([`is_positive_sequence`]), `Some(Negative)` for a balanced set in the other order (its
/// conjugate is positive), `None` when the set is not balanced.
pub fn sequence_of(e: &[Complex64]) -> Option<Sequence> {
    if is_positive_sequence(e) {
        return Some(Sequence::Positive);
    }
    let conj: Vec<Complex64> = e.iter().map(|x| x.conj()).collect();
    is_positive_sequence(&conj).then_some(Sequence::Negative)
}

/// Symmetrical components (forward, backward, zero) of m phasors in sequence order, with the
/// forward (positive-sequence) set lagging by 2π/m per phase (Fortescue 1918).
pub fn symmetrical_components(e: &[Complex64]) -> (Complex64, Complex64, Complex64) {
    let m = e.len().max(1) as f64;
    let mut f = Complex64::new(0.0, 0.0);
    let mut b = f;
    let mut z = f;
    for (k, x) in e.iter().enumerate() {
        let w = phase_operator(k, e.len()).conj();
        f += x * w;
        b += x * w.conj();
        z += x;
    }
    (f / m, b / m, z / m)
}

/// Smallest forward component, relative to the phasors' mean magnitude, that counts as a
/// working EMF: below it a set is "no EMF", not balanced (rounding in the phasor sums stays
/// near 1e-13, a real winding's forward wave is of the order of its phasors).
pub const WORKING_FLOOR: f64 = 1e-9;

/// True when the forward component `forward` (its magnitude) of phasors `e` is a working
/// wave: above [`WORKING_FLOOR`] of their mean magnitude. The one "no EMF" rule of the
/// balance test and the audit's search.
pub fn has_working_wave(forward: f64, e: &[Complex64]) -> bool {
    let scale: f64 = e.iter().map(|x| x.norm()).sum::<f64>().max(1e-300);
    forward > WORKING_FLOOR * scale / e.len().max(1) as f64
}

/// True when `e` is a non-zero positive-sequence set: every phasor the forward component
/// turned by −2πk/m, within [`BALANCE_TOL`] of the forward magnitude (r.m.s. over phases).
pub fn is_positive_sequence(e: &[Complex64]) -> bool {
    let m = e.len();
    if m == 0 {
        return false;
    }
    let (f, _, _) = symmetrical_components(e);
    matches_forward(e, f, (0..m).map(|k| phase_operator(k, m)))
}

/// The balance rule itself, given the forward component `f` of `e` and the phase operators
/// `u` (u_k = [`phase_operator`]`(k, m)`): a working wave, and every phasor within
/// [`BALANCE_TOL`] of f·u_k, r.m.s. over the phases. [`is_positive_sequence`] and the
/// audit's search (which keeps its operators in a table for its hot loop) both read it.
pub fn matches_forward(e: &[Complex64], f: Complex64, u: impl Iterator<Item = Complex64>) -> bool {
    let fm = f.norm();
    if !has_working_wave(fm, e) {
        return false;
    }
    let r2: f64 = e.iter().zip(u).map(|(x, uk)| (x - f * uk).norm_sqr()).sum();
    r2.sqrt() <= BALANCE_TOL * fm * (e.len() as f64).sqrt()
}

/// True when phasors `e` are all equal to their mean within [`BALANCE_TOL`] of its magnitude
/// (the parallel paths of one phase).
pub fn all_equal(e: &[Complex64]) -> bool {
    if e.is_empty() {
        return true;
    }
    let mean = e.iter().sum::<Complex64>() / e.len() as f64;
    let scale = e.iter().map(|x| x.norm()).sum::<f64>() / e.len() as f64;
    e.iter()
        .all(|x| (x - mean).norm() <= BALANCE_TOL * scale.max(1e-300))
}

#[cfg(test)]
mod tests {
    use super::*;

    // Belt order +U −W +V −U +W −V for three phases (Pyrhönen et al. 2014, §2.4).
    #[test]
    fn three_phase_belts_run_plus_u_minus_w_plus_v() {
        let got: Vec<(usize, bool)> = (0..6).map(|b| belt(b, 3)).collect();
        assert_eq!(
            got,
            vec![
                (0, true),
                (2, false),
                (1, true),
                (0, false),
                (2, true),
                (1, false)
            ]
        );
    }

    // Roots of unity against the library's own sin/cos (closed form).
    #[test]
    fn roots_table_matches_closed_form() {
        let mut r = Vec::new();
        let n = 1000;
        roots_of_unity(n, &mut r);
        for (k, (c, s)) in r.iter().enumerate() {
            let a = 2.0 * PI * k as f64 / n as f64;
            assert!((c - a.cos()).abs() < 1e-14 && (s - a.sin()).abs() < 1e-14);
        }
    }

    // A pure negative-sequence set has no positive sequence and no zero sequence
    // (Fortescue 1918).
    #[test]
    fn sequence_test_tells_the_two_directions() {
        let pos: Vec<Complex64> = (0..3)
            .map(|k| Complex64::from_polar(2.0, -2.0 * PI * k as f64 / 3.0))
            .collect();
        let neg: Vec<Complex64> = (0..3)
            .map(|k| Complex64::from_polar(2.0, 2.0 * PI * k as f64 / 3.0))
            .collect();
        assert!(is_positive_sequence(&pos));
        assert!(!is_positive_sequence(&neg));
        let (f, b, z) = symmetrical_components(&neg);
        assert!(f.norm() < 1e-12 && (b.norm() - 2.0).abs() < 1e-12 && z.norm() < 1e-12);
    }
}
