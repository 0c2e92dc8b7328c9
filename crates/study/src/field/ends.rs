//! A flat primary's end components: the slot currents by which its two ends differ from
//! the winding's own periodic pattern (the body), and their wavenumber spectra.
//!
//! The slot currents of a regular winding repeat every n slots, n being the shortest whole
//! number of slot pitches that holds whole wavelengths 2τ (the star of slots repeats there).
//! The body current of a slot is that of the most interior slot of its class k mod n; the
//! rest, C_k − C_body(k), is what the ends put there (for a double layer the coil sides the
//! end slots lack, common practice). By linearity the sheet's transform is the body's (the
//! working waves cut off at the ends: sinc-like lobes) plus one term per end.

use num_complex::Complex64;

use super::{CurrentSheet, Direction};
use crate::winding::Elec;

/// Slot currents by which the ends differ from the body: `(slot, residual)` pairs, 0-based,
/// for the entry end and the exit end.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct EndCurrents {
    /// Residuals in the half of the primary where the secondary enters (under a field
    /// travelling towards rising slot numbers, the slot-1 half).
    pub entry: Vec<(usize, Complex64)>,
    /// Residuals in the other half, where it leaves.
    pub exit: Vec<(usize, Complex64)>,
}

impl CurrentSheet {
    /// The ends' residual slot currents. `full[k]` says slot k holds all its coil sides; the
    /// body current of a class is that of its most interior full slot. `None` on a rotary
    /// core, or when some class k mod n has no full slot (no body to compare with).
    pub fn end_currents(&self, full: &[bool], working: Direction) -> Option<EndCurrents> {
        if self.topology != crate::winding::Topology::Linear {
            return None;
        }
        let g = &self.geometry;
        let k = crate::winding::gcd(g.angle_num, g.angle_den).max(1);
        let n = (g.angle_den / k).max(1) as usize;
        let z = self.slots();
        if z < n || full.len() != z {
            return None;
        }
        let depth = |k: usize| k.min(z - 1 - k);
        let mut body = vec![usize::MAX; n];
        for k in (0..z).filter(|&k| full[k]) {
            let r = k % n;
            if body[r] == usize::MAX || depth(k) > depth(body[r]) {
                body[r] = k;
            }
        }
        if body.contains(&usize::MAX) {
            return None;
        }
        let scale: f64 = self
            .slot_current
            .iter()
            .map(|c| c.norm())
            .fold(0.0, f64::max);
        let mut out = EndCurrents::default();
        for (k, c) in self.slot_current.iter().enumerate() {
            let d = c - self.slot_current[body[k % n]];
            if d.norm() <= 1e-12 * scale.max(1.0) {
                continue;
            }
            let low_half = 2 * k < z;
            let entry = low_half == (working == Direction::Forward);
            if entry {
                out.entry.push((k, d));
            } else {
                out.exit.push((k, d));
            }
        }
        Some(out)
    }

    /// Forward and backward amplitudes at electrical order ν of a sparse set of slot
    /// currents, on the same scale as [`CurrentSheet::wave`].
    pub fn wave_of(&self, currents: &[(usize, Complex64)], order: Elec) -> (f64, f64) {
        let mut plus = Complex64::new(0.0, 0.0);
        let mut minus = Complex64::new(0.0, 0.0);
        for &(k, ck) in currents {
            let e = Complex64::from_polar(1.0, self.angle(k, order));
            plus += ck * e;
            minus += ck * e.conj();
        }
        let scale = self.opening_factor(order).abs()
            / (std::f64::consts::PI * order.get() * self.poles as f64);
        (plus.norm() * scale, minus.norm() * scale)
    }
}
