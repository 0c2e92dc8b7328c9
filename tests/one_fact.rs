//! One fact, one value: σ_d of a winding is the same in `field`, `pitch`, `survey` and
//! `thrust`, for flat primaries with odd and even pole counts and for rotary cores; and the
//! value itself agrees with an independent series sum written here from the coil list.
//!
//! The independent value: the primary's slot currents (balanced positive-sequence phasors,
//! from the coils' go and back slots and turns) are folded onto the shortest whole number
//! of wavelengths, n slots holding d wavelengths; the staircase MMF of that closed sheet has
//! travelling waves of mechanical order k with amplitudes |S±(k)|/k, S±(k) = Σ_j C_j·e^(∓j2πkj/n)
//! (the Fourier series of a staircase, e.g. Pyrhönen et al. 2014, ch. 2, from memory), and
//! σ_d = Σ_(waves ≠ working) A² / A_w² (the definition of differential leakage, same source,
//! ch. 4). What is independent is the method (a series over the fold's orders, from the coil
//! list, against the library's Parseval sum); the fold of a flat primary onto 2τ is the
//! model's own convention, taken over here, so the test checks the arithmetic and the
//! agreement between commands, not the convention. The series is summed to 2·10⁶ orders and its tail added as mean·1/K (Σ_(k>K) 1/k² ≈ 1/K).

use beltwright::field::{FieldOptions, field};
use beltwright::layout::parse;
use beltwright::pitch::{PitchGoal, compare};
use beltwright::survey::{SurveyQuery, survey};
use beltwright::thrust::{ThrustQuery, thrust};
use beltwright::winding::{Topology, Winding, build};
use num_complex::Complex64;
use proptest::prelude::*;

fn primary(poles: usize, q: usize, span: usize) -> Winding {
    let tau = 3 * q;
    let slots = poles * tau + span;
    let src = format!(
        "[machine]\ntopology = \"linear\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = {span}\nturns_per_coil = 20\n\
         [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 2.0\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"aluminium\"\nthickness_mm = 4.0\n"
    );
    build(&parse(&src, "t").expect("layout")).expect("winding")
}

fn rotary(slots: usize, poles: usize, span: usize) -> Winding {
    let src = format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = {span}\nturns_per_coil = 20\n"
    );
    build(&parse(&src, "t").expect("layout")).expect("winding")
}

/// σ_d by the series, from the coil list alone (see the module notes).
fn series_sigma(w: &Winding) -> f64 {
    let g = &w.geometry;
    let m = g.phases as f64;
    // Shortest fold: n slots holding d whole wavelengths 2τ (τ a whole number of slots here,
    // or a rotary core's own slots and pole pairs).
    let (n, d) = match g.topology {
        Topology::Rotary => (g.slots, g.poles / 2),
        Topology::Linear => {
            let tau = g.pole_pitch_slots.round() as usize;
            (2 * tau, 1)
        }
    };
    let mut c = vec![Complex64::new(0.0, 0.0); n];
    for coil in &w.coils {
        let i = Complex64::from_polar(
            f64::from(coil.turns),
            -2.0 * std::f64::consts::PI * coil.phase as f64 / m,
        );
        c[coil.go % n] += i;
        c[coil.back % n] -= i;
    }
    // S±(k) depends on k only modulo n.
    let s = |k: usize, sign: f64| -> f64 {
        c.iter()
            .enumerate()
            .map(|(j, cj)| {
                cj * Complex64::from_polar(
                    1.0,
                    sign * 2.0 * std::f64::consts::PI * (k * j % n) as f64 / n as f64,
                )
            })
            .sum::<Complex64>()
            .norm_sqr()
    };
    let plus: Vec<f64> = (0..n).map(|r| s(r, -1.0)).collect();
    let minus: Vec<f64> = (0..n).map(|r| s(r, 1.0)).collect();
    let working = plus[d % n].max(minus[d % n]) / (d * d) as f64;
    let mut total = 0.0;
    let top = 2_000_000usize;
    for k in 1..=top {
        total += (plus[k % n] + minus[k % n]) / (k * k) as f64;
    }
    // The tail beyond `top`: Σ_(k>K) 1/k² = 1/K − 1/(2K²) + …, each residue equally often.
    let mean = (plus.iter().sum::<f64>() + minus.iter().sum::<f64>()) / n as f64;
    total += mean / top as f64;
    total / working - 1.0
}

/// σ_d as each command reports it for `w`'s own span.
fn reported(w: &Winding) -> [f64; 3] {
    let from_field = field(w, &FieldOptions::balanced(w))
        .expect("field")
        .differential_leakage;
    let from_pitch = compare(w, &PitchGoal::default())
        .rows
        .iter()
        .find(|r| r.pitch == w.pitch)
        .and_then(|r| r.differential_leakage)
        .expect("pitch row with σ_d");
    let from_thrust = match w.geometry.topology {
        Topology::Linear => {
            let q = ThrustQuery {
                current_a: Some(5.0),
                slip_from: 0.1,
                slip_to: 0.1,
                steps: 0,
                end_effect: true,
            };
            let r = thrust(w, &q).expect("thrust");
            r.circuit.x_diff_ohm / r.circuit.xm_ohm
        }
        Topology::Rotary => from_field,
    };
    [from_field, from_pitch, from_thrust]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]
    #[test]
    fn flat_primary_sigma_d_is_one_value(poles in 2usize..=7, q in 1usize..=2, span_less in 0usize..=2) {
        let span = 3 * q - span_less.min(3 * q - 1);
        let w = primary(poles, q, span);
        let independent = series_sigma(&w);
        for (what, v) in ["field", "pitch", "thrust"].iter().zip(reported(&w)) {
            prop_assert!((v - independent).abs() <= 1e-5 * independent.max(1e-3),
                "{poles} poles, q {q}, span {span}: {what} gives {v}, the series {independent}");
        }
    }
}

#[test]
fn survey_gives_the_same_sigma_d_as_field() {
    // Flat primaries, odd and even pole counts: the survey's row σ_d is field's for the
    // winding the survey chose.
    for poles in [2usize, 3, 4, 5] {
        let slots = poles * 6 + 5;
        let query = SurveyQuery {
            slots: slots..=slots,
            poles: poles..=poles,
            layers: vec![2],
            phases: 3,
            topology: Topology::Linear,
        };
        let r = survey(&query, &|| ());
        let row = &r.rows[0];
        let span = row.pitch.expect("feasible");
        let sd = row
            .differential_leakage
            .expect("σ_d given for every pole count");
        let w = primary(poles, 2, span);
        assert_eq!(
            w.geometry.slots, slots,
            "the survey's primary is the one rebuilt here"
        );
        let f = field(&w, &FieldOptions::balanced(&w))
            .expect("field")
            .differential_leakage;
        assert!(
            (sd - f).abs() <= 1e-12,
            "{poles} poles: survey {sd}, field {f}"
        );
    }
    // Rotary cores: the survey's autocorrelation route against field's staircase.
    for (z, poles) in [(36usize, 4usize), (27, 6), (24, 4)] {
        let query = SurveyQuery {
            slots: z..=z,
            poles: poles..=poles,
            layers: vec![2],
            phases: 3,
            topology: Topology::Rotary,
        };
        let r = survey(&query, &|| ());
        let row = &r.rows[0];
        let span = row.pitch.expect("feasible");
        let w = rotary(z, poles, span);
        let f = field(&w, &FieldOptions::balanced(&w))
            .expect("field")
            .differential_leakage;
        let sd = row.differential_leakage.expect("σ_d");
        // The synthesized winding's fast path (one real instant) against the complex sheet.
        let fast = beltwright::field::differential_leakage(&w).expect("σ_d");
        assert!(
            (fast - f).abs() <= 1e-9 * f,
            "{z}/{poles}: fast path {fast}, field {f}"
        );
        assert!(
            (sd - f).abs() <= 1e-9 * f,
            "{z}/{poles}: survey {sd}, field {f}"
        );
        let s = series_sigma(&w);
        assert!(
            (f - s).abs() <= 1e-5 * f,
            "{z}/{poles}: field {f}, series {s}"
        );
    }
}

#[test]
fn recorded_turns_are_the_coils_turns_in_plan_and_header() {
    // A coil list whose coils carry 40 turns and no winding.turns_per_coil: every report
    // says 40, as the coils do (the fact read from the layout itself).
    let src = "[machine]\ntopology = \"rotary\"\nslots = 6\npoles = 2\n[winding]\nlayers = 1\n\
               [[coil]]\nphase = \"U\"\ngo = 1\nback = 4\nturns = 40\n\
               [[coil]]\nphase = \"V\"\ngo = 3\nback = 6\nturns = 40\n\
               [[coil]]\nphase = \"W\"\ngo = 5\nback = 2\nturns = 40\n";
    let w = build(&parse(src, "t").expect("layout")).expect("winding");
    let plan = beltwright::plan::plan(&w, beltwright::linear::Operating::default());
    assert_eq!(plan.turns_per_coil, 40);
    assert_eq!(plan.design.turns_per_coil, 40);
    assert!(!plan.design.turns_assumed);
}
