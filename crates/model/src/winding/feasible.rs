//! Which slot/pole combinations can carry a balanced winding.
//!
//! Fractional-slot winding theory (e.g. J. Pyrhönen, T. Jokinen, V. Hrabovcová, *Design of
//! Rotating Electrical Machines*, 2nd ed., Wiley 2014, §2.4): with t = gcd(Z, p) the star of
//! slots has Z/t spokes, and a balanced m-phase double-layer winding exists iff Z/(m·t) is a
//! whole number.

use super::gcd;

/// Machine periodicity t = gcd(Z, p) of a rotary core: the winding repeats t times.
pub fn rotary_periodicity(slots: usize, poles: usize) -> usize {
    gcd(slots as u64, (poles / 2) as u64) as usize
}

/// Balanced m-phase double-layer winding on a rotary core: Z / (m·gcd(Z, p)) ∈ ℕ.
pub fn double_layer_rotary_feasible(slots: usize, poles: usize, phases: usize) -> bool {
    poles >= 2
        && poles.is_multiple_of(2)
        && slots >= phases
        && slots.is_multiple_of(phases * rotary_periodicity(slots, poles))
}

/// The nearest slot counts below and above `slots` that satisfy `ok`, searching at most
/// `reach` slots either way.
pub fn nearby_rotary_slot_counts(
    slots: usize,
    reach: usize,
    ok: impl Fn(usize) -> bool,
) -> (Option<usize>, Option<usize>) {
    let below = (1..=reach)
        .filter_map(|d| slots.checked_sub(d))
        .find(|&z| z >= 3 && ok(z));
    let above = (1..=reach)
        .map(|d| slots + d)
        .take_while(|&z| z <= crate::spec::MAX_SLOTS)
        .find(|&z| ok(z));
    (below, above)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Balance condition Z/(m·t) ∈ ℕ (Pyrhönen et al. 2014, §2.4); combinations from the
    // published tables of fractional-slot concentrated windings (Meier, "Theoretical design
    // of surface-mounted PM machines with concentrated windings", KTH 2008, table of k_w1).
    #[test]
    fn published_tooth_coil_combinations_are_feasible() {
        for (z, poles) in [
            (12, 10),
            (9, 8),
            (12, 14),
            (9, 10),
            (12, 8),
            (6, 4),
            (18, 16),
        ] {
            assert!(double_layer_rotary_feasible(z, poles, 3), "{z}/{poles}");
        }
    }

    #[test]
    fn twenty_slots_four_poles_is_not_three_phase() {
        // 20 / (3 · gcd(20, 2)) = 20/6 is not whole (same source).
        assert!(!double_layer_rotary_feasible(20, 4, 3));
        let (lo, hi) = nearby_rotary_slot_counts(20, 10, |z| double_layer_rotary_feasible(z, 4, 3));
        assert_eq!((lo, hi), (Some(18), Some(21)));
    }
}
