//! Winding-function inductances: rotary closed forms and the open primary's unbalance.

use beltwright::inductance::inductance;
use beltwright::thrust::MU0;
use beltwright::winding::{self, Winding};
use beltwright::{factors, layout};
use proptest::prelude::*;
use std::f64::consts::PI;

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

fn rotary(slots: usize, poles: usize, pitch: usize) -> Winding {
    wind(&format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = {pitch}\nturns_per_coil = 10\n\
         [core]\nslot_pitch_mm = 10.0\nstack_mm = 100.0\nairgap_mm = 0.5\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n"
    ))
}

fn flat(poles: usize, extra: &str) -> Winding {
    // q = 1, double layer, span 3: 3·2p coils in 3·2p + 3 slots.
    wind(&format!(
        "[machine]\ntopology = \"linear\"\nslots = {}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = 3\nturns_per_coil = 20\n\
         [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 3.0\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n{extra}",
        3 * poles + 3
    ))
}

// A balanced rotary winding: the phase matrix is symmetric and circulant, and its
// positive-sequence inductance is (3/2)·L_main·(1 + σ_d) = L_m·(1 + σ_d), with L_m the closed
// form 6·μ0·τ·W·(N·k_w1)²/(π²·p·g) (Boldea and Nasar 1987). What this compares, plainly:
// the matrix's structure, with σ_d taken from `field::differential_leakage`, the same σ_d the
// inductance module reads, so it does not check σ_d itself; σ_d has its own checks against
// a series written from the coil list (`tests/one_fact.rs`) and against published tables
// (`tests/field_published.rs`).
#[test]
fn rotary_matrix_is_circulant_and_gives_lm_times_one_plus_sigma() {
    for (z, p2, y) in [(36, 4, 7), (24, 4, 5), (48, 4, 10), (12, 10, 1), (27, 6, 4)] {
        let w = rotary(z, p2, y);
        let r = inductance(&w, false).expect("sizes given");
        let l = &r.matrix_h;
        for i in 0..3 {
            for j in 0..3 {
                assert!((l[i][j] - l[j][i]).abs() < 1e-15, "symmetric");
                assert!((l[i][j] - l[(i + 1) % 3][(j + 1) % 3]).abs() < 1e-12 * l[0][0]);
            }
        }
        let tau = 0.010 * z as f64 / p2 as f64;
        let nkw = w.series_turns(0) * factors::fundamental(&w).winding;
        let lm = 6.0 * MU0 * tau * 0.1 * nkw * nkw / (PI * PI * (p2 as f64 / 2.0) * 0.0005);
        let sigma = beltwright::field::differential_leakage(&w).expect("working wave");
        let want = lm * (1.0 + sigma);
        assert!(
            (r.positive_sequence_h - want).abs() < 1e-9 * want,
            "{z}/{p2}/{y}: {} vs {want}",
            r.positive_sequence_h
        );
        assert!(r.negative_sequence_current_percent < 1e-9);
    }
}

// q = 1 at full pitch: the winding functions are square waves 120° apart, so M/L = −1/3
// exactly (∫ sq(x)·sq(x − 2π/3) dx over a period is 1 − 2·(1/3)·... = −1/3 of ∫ sq²).
#[test]
fn q_one_full_pitch_mutual_is_minus_one_third() {
    let w = rotary(12, 4, 3);
    let l = inductance(&w, false).expect("sizes").matrix_h;
    assert!(
        (l[0][1] / l[0][0] + 1.0 / 3.0).abs() < 1e-12,
        "{}",
        l[0][1] / l[0][0]
    );
}

// The open primary: the matrix is unchanged by mirroring the primary end for end (up to
// the order of the phases), and the coil matrix sums to the phase matrix.
#[test]
fn flat_primary_matrix_is_mirror_symmetric() {
    let w = flat(4, "");
    let r = inductance(&w, true).expect("sizes");
    let l = &r.matrix_h;
    let mut mirrored = w.clone();
    let z = w.geometry.slots;
    for c in &mut mirrored.coils {
        (c.go, c.back) = (z - 1 - c.go, z - 1 - c.back);
    }
    let lm = inductance(&mirrored, false).expect("sizes").matrix_h;
    let mut diag: Vec<f64> = (0..3).map(|i| l[i][i]).collect();
    let mut diag_m: Vec<f64> = (0..3).map(|i| lm[i][i]).collect();
    let mut off: Vec<f64> = vec![l[0][1], l[0][2], l[1][2]];
    let mut off_m: Vec<f64> = vec![lm[0][1], lm[0][2], lm[1][2]];
    for v in [&mut diag, &mut diag_m, &mut off, &mut off_m] {
        v.sort_by(f64::total_cmp);
    }
    for (a, b) in diag.iter().zip(&diag_m).chain(off.iter().zip(&off_m)) {
        assert!((a - b).abs() < 1e-12 * l[0][0].abs(), "{l:?} {lm:?}");
    }
    let coils = r.coil_matrix_h.expect("small winding");
    let sum_u: f64 = (0..w.coils.len())
        .flat_map(|i| (0..w.coils.len()).map(move |j| (i, j)))
        .filter(|(i, j)| w.coils[*i].phase == 0 && w.coils[*j].phase == 0)
        .map(|(i, j)| coils[i][j])
        .sum();
    assert!((sum_u - l[0][0]).abs() < 1e-12 * l[0][0]);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(12))]
    // The open primary's unbalance falls as the pole count rises and tends to the rotary
    // value, zero, as the primary lengthens (end phases matter less).
    #[test]
    fn unbalance_falls_with_pole_count(poles in 2usize..20) {
        let a = inductance(&flat(poles, ""), false).expect("sizes");
        let b = inductance(&flat(poles + 2, ""), false).expect("sizes");
        prop_assert!(a.negative_sequence_current_percent > 0.0);
        prop_assert!(b.negative_sequence_current_percent < a.negative_sequence_current_percent);
    }
}

#[test]
fn long_primary_unbalance_tends_to_zero() {
    let r = inductance(&flat(40, ""), false).expect("sizes");
    assert!(r.negative_sequence_current_percent < 1.0);
}

// Under a symmetric supply the unbalance does not depend on the phase order along the
// primary: a cyclic relabelling permutes the sequence components, a swap of two phases
// conjugates them (Fortescue 1918), so the negative-sequence share is the same.
#[test]
fn unbalance_does_not_depend_on_phase_order() {
    let w = flat(4, "");
    let base = inductance(&w, false)
        .expect("sizes")
        .negative_sequence_current_percent;
    for map in [[1usize, 2, 0], [0, 2, 1]] {
        let mut v = w.clone();
        for c in &mut v.coils {
            c.phase = map[c.phase];
        }
        let r = inductance(&v, false)
            .expect("sizes")
            .negative_sequence_current_percent;
        assert!(
            (r - base).abs() < 1e-9 * base.max(1.0),
            "{map:?}: {r} vs {base}"
        );
    }
}
