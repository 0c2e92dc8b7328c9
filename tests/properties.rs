//! Invariants over many feasible slot/pole/span combinations.

use beltwright::factors::{closed, factors_at};
use beltwright::layout::parse;
use beltwright::winding::{Elec, Winding, build, double_layer_rotary_feasible};
use proptest::prelude::*;
use std::f64::consts::PI;

fn layout(topology: &str, slots: usize, poles: usize, layers: usize, pitch: usize) -> String {
    format!(
        "[machine]\ntopology = \"{topology}\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = {layers}\npitch = {pitch}\n"
    )
}

/// Equal magnitudes, 2π/m apart in positive sequence: the definition of balance.
fn assert_balanced(w: &Winding) {
    let e: Vec<_> = (0..3).map(|k| w.phase_emf(k, Elec(1.0))).collect();
    for k in 1..3 {
        assert!((e[k].norm() - e[0].norm()).abs() < 1e-9 * e[0].norm());
        let lag = (e[0] / e[k]).arg().rem_euclid(2.0 * PI);
        assert!((lag - 2.0 * PI * k as f64 / 3.0).abs() < 1e-9, "lag {lag}");
    }
}

/// Count sides per (slot, layer); no position may hold two.
fn fill_counts(w: &Winding) -> Vec<[usize; 2]> {
    let mut n = vec![[0usize; 2]; w.geometry.slots];
    for c in &w.coils {
        n[c.go][c.go_layer] += 1;
        n[c.back][c.back_layer] += 1;
    }
    n
}

fn rotary_double() -> impl Strategy<Value = (usize, usize, usize)> {
    (6usize..=120, 1usize..=20)
        .prop_filter("feasible", |&(z, pp)| {
            double_layer_rotary_feasible(z, 2 * pp, 3)
        })
        .prop_flat_map(|(z, pp)| (Just(z), Just(2 * pp), 1..=z / 2))
        // A span of whole pole pairs links no working flux and is refused.
        .prop_filter("links flux", |&(z, poles, y)| (y * poles / 2) % z != 0)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn rotary_double_layer_is_balanced_and_full((z, poles, y) in rotary_double()) {
        let w = build(&parse(&layout("rotary", z, poles, 2, y), "p").unwrap()).unwrap();
        assert_balanced(&w);
        prop_assert_eq!(w.coils.len(), z);
        for counts in fill_counts(&w) {
            prop_assert_eq!(counts, [1, 1]);
        }
        for nu in [1.0, 5.0, 7.0, 11.0, 13.0] {
            let f = factors_at(&w, 0, Elec(nu));
            prop_assert!(f.winding <= 1.0 + 1e-12);
            prop_assert!((f.winding - f.distribution * f.pitch * f.skew).abs() < 1e-12);
        }
        // Closed forms where they apply: integer q (Say 1983, §4.4).
        if z % (3 * poles) == 0 {
            let q = (z / (3 * poles)) as u32;
            let alpha = PI * poles as f64 / z as f64;
            let tau = z as f64 / poles as f64;
            for nu in [1.0, 5.0, 7.0, 11.0, 13.0] {
                let f = factors_at(&w, 0, Elec(nu));
                prop_assert!((f.distribution - closed::distribution(q, nu, alpha)).abs() < 1e-9);
                prop_assert!((f.pitch - closed::pitch(y as f64 / tau, nu)).abs() < 1e-9);
            }
        }
    }

    #[test]
    fn linear_double_layer_has_y_half_filled_slots_at_each_end(
        poles in 1usize..=8, q in 1usize..=4, yfrac in 0.5f64..=1.0
    ) {
        let n = poles * 3 * q;
        let y = ((3 * q) as f64 * yfrac).round().max(1.0) as usize;
        let z = n + y;
        let w = build(&parse(&layout("linear", z, poles, 2, y), "p").unwrap()).unwrap();
        assert_balanced(&w);
        prop_assert_eq!(w.coils.len(), n);
        let counts = fill_counts(&w);
        for (k, c) in counts.iter().enumerate() {
            let expect = if k < y { [1, 0] } else if k >= n { [0, 1] } else { [1, 1] };
            prop_assert_eq!(*c, expect, "slot {}", k + 1);
        }
        let half: Vec<usize> = w.half_filled_slots();
        prop_assert_eq!(half.len(), 2 * y);
        let f = factors_at(&w, 0, Elec(1.0));
        let alpha = PI / (3 * q) as f64;
        prop_assert!((f.distribution - closed::distribution(q as u32, 1.0, alpha)).abs() < 1e-9);
        prop_assert!((f.pitch - closed::pitch(y as f64 / (3 * q) as f64, 1.0)).abs() < 1e-9);
    }

    #[test]
    fn single_layer_integer_slot_fills_each_slot_once(pp in 1usize..=6, q in 1usize..=4) {
        let (poles, z) = (2 * pp, 6 * pp * q);
        let tau = 3 * q;
        for style in ["lap", "concentric"] {
            let src = format!(
                "[machine]\ntopology = \"rotary\"\nslots = {z}\npoles = {poles}\n\
                 [winding]\nlayers = 1\nstyle = \"{style}\"\n"
            );
            let w = build(&parse(&src, "p").unwrap()).unwrap();
            assert_balanced(&w);
            prop_assert_eq!(w.coils.len(), z / 2);
            for c in fill_counts(&w) {
                prop_assert_eq!(c, [1, 0]);
            }
            // A single-layer winding's field is that of full-pitch coils on q slots per belt.
            let f = factors_at(&w, 0, Elec(1.0));
            let alpha = PI / tau as f64;
            prop_assert!((f.winding - closed::distribution(q as u32, 1.0, alpha)).abs() < 1e-9);
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// 60° belts reach the classical distribution factor of a fractional-slot winding,
    /// k_d1 = sin(π/6) / (b·sin(π/(6b))) with q = b/c in lowest terms: the b phasors of a
    /// phase sit 60°/b apart (fractional-slot theory; from memory of M. G. Say, Alternating
    /// Current Machines, chapter on armature windings; also Pyrhönen et al. 2014, §2.4).
    #[test]
    fn belts_reach_the_fractional_slot_distribution_factor((z, poles, _y) in rotary_double()) {
        let tau = z as f64 / poles as f64;
        let y = (tau.round() as usize).clamp(1, z / 2);
        prop_assume!(!(y * poles / 2).is_multiple_of(z));
        let w = build(&parse(&layout("rotary", z, poles, 2, y), "p").unwrap()).unwrap();
        let (b, _c) = w.slots_per_pole_phase();
        let b = b as f64;
        let expect = (PI / 6.0).sin() / (b * (PI / (6.0 * b)).sin());
        let f = factors_at(&w, 0, Elec(1.0));
        prop_assert!((f.distribution - expect).abs() < 1e-9, "{z}/{poles}: {} vs {expect}", f.distribution);
    }
}
