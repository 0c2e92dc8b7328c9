//! Differential leakage against closed forms, series and textbook tables.

use beltwright::factors::closed;
use beltwright::field::differential_leakage;
use beltwright::layout::parse;
use beltwright::winding::{Winding, build};
use std::f64::consts::PI;

fn winding(slots: usize, poles: usize, layers: usize, pitch: usize) -> Winding {
    let src = format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = {layers}\npitch = {pitch}\n"
    );
    build(&parse(&src, "t").expect("layout")).expect("winding")
}

/// σ_d = Σ_(ν = 6k±1, ν≠1) (k_wν/(ν k_w1))² for an integer-slot three-phase winding, from the
/// closed-form factors, summed far enough that the tail (< 1/N) is below 1e-6.
fn series(q: u32, span_over_tau: f64) -> f64 {
    let alpha = PI / (3 * q) as f64;
    let kw = |nu: f64| closed::distribution(q, nu, alpha) * closed::pitch(span_over_tau, nu);
    let k1 = kw(1.0);
    (1..2_000_000u64)
        .flat_map(|k| [6 * k - 1, 6 * k + 1])
        .map(|nu| {
            let r = kw(nu as f64) / (nu as f64 * k1);
            r * r
        })
        .sum()
}

#[test]
fn q_one_full_pitch_is_pi_squared_over_nine_minus_one() {
    // Closed result of the series Σ 1/ν² over ν = 6k ± 1 (Vogt 1996; Pyrhönen et al. 2014,
    // §4.3, from memory): σ_d = π²/9 − 1 = 0.09662.
    let exact = PI * PI / 9.0 - 1.0;
    for (z, poles) in [(6, 2), (12, 4), (36, 12)] {
        let s = differential_leakage(&winding(z, poles, 2, 3)).expect("working wave");
        assert!((s - exact).abs() < 1e-12, "{z}/{poles}: {s}");
    }
}

#[test]
fn q_three_full_pitch_matches_the_series_and_the_table() {
    // The textbook table gives σ_d ≈ 0.0141 for q = 3, full pitch (from memory of the
    // tables in Vogt 1996 / Pyrhönen et al. 2014); the series of closed-form factors must
    // agree with the exact Parseval value to its truncation error.
    let s = differential_leakage(&winding(36, 4, 2, 9)).expect("working wave");
    assert!(
        (s - series(3, 1.0)).abs() < 2e-6,
        "{s} vs series {}",
        series(3, 1.0)
    );
    assert!((s - 0.0141).abs() < 5e-5, "{s}");
}

#[test]
fn short_pitch_matches_the_series() {
    // 24 slots, 4 poles, span 5/6 (q = 2): Parseval against the series of closed forms.
    let s = differential_leakage(&winding(24, 4, 2, 5)).expect("working wave");
    assert!((s - series(2, 5.0 / 6.0)).abs() < 2e-6, "{s}");
}

#[test]
fn single_layer_equals_full_pitch_double_layer() {
    // A single-layer winding puts the same currents in the slots as a full-pitch double
    // layer (common practice), so the two have the same harmonic leakage.
    let sl = differential_leakage(&winding(36, 4, 1, 9)).expect("working wave");
    let dl = differential_leakage(&winding(36, 4, 2, 9)).expect("working wave");
    assert!((sl - dl).abs() < 1e-12);
}

#[test]
fn the_fast_kernel_agrees_with_the_field_analysis() {
    // Two derivations of one quantity: real currents at ωt = 0 on the staircase (leakage)
    // and complex phasor sheets split by direction (field). They must agree everywhere.
    for (z, poles, layers, pitch) in [
        (36, 4, 2, 7),
        (24, 4, 2, 5),
        (12, 10, 2, 1),
        (12, 10, 1, 1),
        (9, 8, 2, 1),
        (27, 6, 2, 4),
        (48, 4, 1, 12),
    ] {
        let w = winding(z, poles, layers, pitch);
        let fast = differential_leakage(&w).expect("working wave");
        let general = beltwright::field::field(&w, &beltwright::field::FieldOptions::balanced(&w))
            .expect("field")
            .differential_leakage;
        assert!(
            (fast - general).abs() < 1e-9 * fast.max(1.0),
            "{z}/{poles}: {fast} vs {general}"
        );
    }
}
