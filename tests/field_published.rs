//! Checks of the field analysis against published results, closed forms and an independent
//! FFT library. Sources are named beside each check:
//! - Say: M. G. Say, *Alternating Current Machines*, 5th ed., Pitman 1983, ch. 4 (MMF of
//!   windings, harmonic orders and their direction, slot harmonics).
//! - Pyrhönen: J. Pyrhönen, T. Jokinen, V. Hrabovcová, *Design of Rotating Electrical
//!   Machines*, 2nd ed., Wiley 2014, ch. 2 (windings, MMF harmonics ν = 1 + 2mg) and ch. 4
//!   (air-gap / differential leakage σ_δ).
//!
//! Chapter numbers are given from memory; the formulas themselves are also derived in
//! `docs/theory.md`.

use beltwright::factors;
use beltwright::field::*;
use beltwright::layout;
use beltwright::numbering::SlotNo;
use beltwright::phasors::{PhasorError, parse_currents};
use beltwright::winding::{self, Winding};
use beltwright::winding::{Elec, Mech};
use num_complex::Complex64;
use rustfft::FftPlanner;

/// σ_d of the field report under balanced positive-sequence currents, no slot opening.
fn differential_leakage(w: &Winding) -> f64 {
    field(w, &FieldOptions::balanced(w)).map_or(f64::NAN, |r| r.differential_leakage)
}

/// MMF THD √σ_d of the same report.
fn thd(w: &Winding) -> f64 {
    field(w, &FieldOptions::balanced(w)).map_or(f64::NAN, |r| r.thd)
}

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test").expect("test layout parses");
    winding::build(&spec).expect("test winding builds")
}

fn rotary(slots: usize, poles: usize, layers: usize, pitch: usize) -> Winding {
    wind(&format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = {layers}\npitch = {pitch}\nturns_per_coil = 5\n"
    ))
}

fn report(w: &Winding, upto: f64) -> FieldReport {
    let mut o = FieldOptions::balanced(w);
    o.upto = upto;
    field(w, &o).expect("field computes")
}

fn row(r: &FieldReport, order: f64) -> WaveRow {
    r.rows
        .iter()
        .copied()
        .find(|x| (x.order.get() - order).abs() < 1e-9)
        .unwrap_or(WaveRow {
            order: Elec(order),
            mech_order: None,
            forward: 0.0,
            backward: 0.0,
        })
}

/// Textbook series Σ_{ν=6k±1, ν≠1} (k_dν·k_pν/(ν·k_w1))² for an integer-slot three-phase
/// winding of q slots per pole and phase and span y of τ = 3q, summed to `top`, with the
/// closed-form factors (Say §4.4; Pyrhönen eqs. 2.29, 2.32).
fn series(q: u32, y: f64, top: u64) -> f64 {
    let alpha = std::f64::consts::PI / (3.0 * q as f64);
    let tau = 3.0 * q as f64;
    let kw =
        |nu: f64| factors::closed::distribution(q, nu, alpha) * factors::closed::pitch(y / tau, nu);
    let k1 = kw(1.0);
    let mut s = 0.0;
    let mut k = 1u64;
    loop {
        let mut done = true;
        for nu in [6 * k - 1, 6 * k + 1] {
            if nu <= top {
                done = false;
                let v = kw(nu as f64) / (nu as f64 * k1);
                s += v * v;
            }
        }
        if done {
            return s;
        }
        k += 1;
    }
}

/// Upper bound of the series tail beyond `top`: Σ_{ν>top, 6k±1} 1/(ν·k_w1)² ≤ 1/(3·top·k_w1²)
/// plus one term, since |k_wν| ≤ 1.
fn tail(top: u64, k1: f64) -> f64 {
    1.0 / (3.0 * (top as f64 - 1.0) * k1 * k1) + 1.0 / ((top as f64) * k1).powi(2)
}

// σ_d for q = 1, full pitch: Σ over ν = 6k±1 of 1/ν² = (8/9)·(π²/8) = π²/9, so
// σ_d = π²/9 − 1 = 0.0966 (series derivation; Pyrhönen ch. 4, table of σ_δ; Say ch. 4).
#[test]
fn q1_full_pitch_leakage_is_pi_squared_over_nine_minus_one() {
    let exact = std::f64::consts::PI.powi(2) / 9.0 - 1.0;
    for w in [rotary(12, 4, 1, 3), rotary(12, 4, 2, 3), rotary(6, 2, 2, 3)] {
        let s = differential_leakage(&w);
        assert!((s - exact).abs() < 1e-12, "σ_d = {s}, want {exact}");
        assert!((thd(&w) - exact.sqrt()).abs() < 1e-12);
    }
    assert!((exact - 0.0966).abs() < 5e-5);
}

// q = 3, full pitch: σ_d ≈ 0.0141 (textbook table of σ_δ against q, value from memory;
// Pyrhönen ch. 4), verified here by the series of closed-form winding factors with a
// bounded tail.
#[test]
fn q3_full_pitch_leakage_matches_table_and_series() {
    let w = rotary(36, 4, 2, 9);
    let s = differential_leakage(&w);
    assert!((s - 0.0141).abs() < 5e-5, "σ_d = {s}");
    let top = 1_000_001;
    let k1 = factors::fundamental(&w).winding;
    let ser = series(3, 9.0, top);
    assert!(
        (s - ser).abs() <= tail(top, k1),
        "Parseval {s} vs series {ser}"
    );
}

// Parseval equals the textbook series Σ_{ν≠1}(k_wν/(ν·k_w1))² for short-pitched
// integer-slot windings too (Pyrhönen ch. 4, definition of σ_δ; factors from Say §4.4).
#[test]
fn parseval_equals_series_for_short_pitched_windings() {
    for (z, poles, y, q) in [(36, 4, 7, 3), (24, 4, 5, 2), (48, 4, 10, 4), (54, 6, 8, 3)] {
        let w = rotary(z, poles, 2, y);
        let s = differential_leakage(&w);
        let top = 600_001;
        let k1 = factors::fundamental(&w).winding;
        let ser = series(q, y as f64, top);
        assert!(
            (s - ser).abs() <= tail(top, k1),
            "{z}/{poles}/y{y}: Parseval {s} vs series {ser}"
        );
    }
}

/// Forward and backward amplitudes of mechanical orders 1..=top by sampling the MMF phasor
/// at `per_slot` points a slot pitch and a complex FFT (rustfft). F̃(x) = Σ c_n e^{j2πnx/Z}:
/// the forward wave of order n is c_{−n}, the backward c_n.
fn fft_waves(sheet: &CurrentSheet, per_slot: usize, top: usize) -> Vec<(f64, f64)> {
    let z = sheet.slots();
    let m = z * per_slot;
    let mut buf: Vec<rustfft::num_complex::Complex<f64>> = (0..m)
        .map(|i| {
            let x = (i as f64 + 0.5) * z as f64 / m as f64;
            let f = sheet.mmf_phasor(x);
            rustfft::num_complex::Complex::new(f.re, f.im)
        })
        .collect();
    FftPlanner::new().plan_fft_forward(m).process(&mut buf);
    (1..=top)
        .map(|n| (buf[m - n].norm() / m as f64, buf[n].norm() / m as f64))
        .collect()
}

// Independent reference: the sampled MMF's FFT (rustfft) agrees with the closed-form slot
// sums. Midpoint sampling of a staircase aliases the coefficient c_n into
// c_n·(πn/M)·cot(πn/M) (sum of 1/(n + ℓM) over ℓ), so the relative error is below
// (πn/M)²/3 (+ the same for slot-opening ramps, which only shrink the aliases).
#[test]
fn closed_form_spectrum_agrees_with_fft_of_sampled_mmf() {
    let cases = [
        (rotary(36, 4, 2, 7), 0.0),
        (rotary(12, 10, 2, 1), 0.0),
        (rotary(27, 6, 2, 4), 0.0),
        (rotary(36, 4, 2, 7), 0.4),
    ];
    for (w, b) in &cases {
        let mut o = FieldOptions::balanced(w);
        o.opening = *b;
        o.currents = vec![
            Complex64::from_polar(1.0, 0.0),
            Complex64::from_polar(0.8, -110f64.to_radians()),
            Complex64::from_polar(1.1, 125f64.to_radians()),
        ];
        let sheet = CurrentSheet::new(w, &o.currents, o.opening).unwrap();
        let p = w.geometry.poles / 2;
        let top = 25 * p;
        let per_slot = 512;
        let m = (w.geometry.slots * per_slot) as f64;
        let fft = fft_waves(&sheet, per_slot, top);
        let closed = rotary_spectrum(&sheet, top as u64);
        let a1 = sheet.wave(Elec::FUNDAMENTAL).0;
        for ((n, f, bk), (ff, fb)) in closed.iter().zip(&fft) {
            let x = std::f64::consts::PI * n.get() as f64 / m;
            let tol = |v: f64| v * x * x / 3.0 * 1.01 + 1e-9 * a1;
            assert!(
                (f - ff).abs() <= tol(*f),
                "order {n} forward {f} vs fft {ff}"
            );
            assert!(
                (bk - fb).abs() <= tol(*bk),
                "order {n} backward {bk} vs fft {fb}"
            );
        }
    }
}

// Balanced integer-slot three-phase windings carry only orders ν = 6k ± 1; ν = 6k − 1
// (5, 11, ...) travel against the fundamental and ν = 6k + 1 (7, 13, ...) with it
// (Say ch. 4; Pyrhönen ch. 2: ν = 1 + 2mg, negative g backward).
#[test]
fn integer_slot_orders_are_six_k_plus_minus_one() {
    for w in [
        rotary(36, 4, 2, 7),
        rotary(24, 4, 1, 6),
        rotary(48, 4, 2, 10),
        rotary(36, 4, 2, 9),
    ] {
        let r = report(&w, 61.0);
        for x in &r.rows {
            let nu = x.order.get().round() as u64;
            assert!(
                (x.order.get() - nu as f64).abs() < 1e-12,
                "fractional order {}",
                x.order
            );
            match nu % 6 {
                1 => assert!(x.backward < 1e-12, "order {nu} has a backward part"),
                5 => assert!(x.forward < 1e-12, "order {nu} has a forward part"),
                _ => panic!("order {nu} should be absent"),
            }
        }
        let (f5, f7) = (row(&r, 5.0), row(&r, 7.0));
        assert!(f5.backward > 1e-6 && f5.forward < 1e-12);
        assert!(f7.forward > 1e-6 && f7.backward < 1e-12);
    }
}

// Slot harmonics ν = 2mq·g ± 1 have the winding factor of the fundamental, so their MMF
// relative to it is exactly 1/ν (Say ch. 4, "slot harmonics"; Pyrhönen ch. 2).
#[test]
fn slot_harmonics_have_the_fundamental_winding_factor() {
    for (z, poles, y, q) in [(36, 4, 7, 3usize), (24, 4, 5, 2), (48, 4, 12, 4)] {
        let r = report(&rotary(z, poles, 2, y), 200.0);
        for g in 1..=3 {
            for (nu, backward) in [(6 * q * g - 1, true), (6 * q * g + 1, false)] {
                let x = row(&r, nu as f64);
                let a = if backward { x.backward } else { x.forward };
                assert!(
                    (a - 1.0 / nu as f64).abs() < 1e-12,
                    "{z}/{poles}: slot harmonic {nu} is {a}"
                );
            }
        }
    }
}

// F_ν/F_1 = k_wν/(ν·k_w1) for balanced windings, fractional-slot ones included (Say ch. 4;
// Pyrhönen ch. 2), with k_w from the phasor sums of `factors`; each order travels one way.
#[test]
fn amplitudes_follow_winding_factors_including_fractional_slot() {
    for w in [
        rotary(12, 10, 2, 1),
        rotary(27, 6, 2, 4),
        rotary(36, 4, 2, 7),
        rotary(9, 8, 2, 1),
    ] {
        let r = report(&w, 30.0);
        let k1 = factors::fundamental(&w).winding;
        for x in &r.rows {
            let kw = factors::factors_at(&w, 0, x.order);
            let want = kw.distribution * kw.pitch / (x.order.get() * k1);
            let (big, small) = (x.forward.max(x.backward), x.forward.min(x.backward));
            assert!(
                (big - want).abs() < 1e-10,
                "order {}: {big} vs {want}",
                x.order
            );
            assert!(small < 1e-10, "order {} travels both ways", x.order);
        }
    }
}

// 12 slots, 10 poles, tooth coils: the mechanical orders present are 1, 5, 7, 11, ...
// (ν = 0.2 sub-harmonic, working wave at n = 5, strong n = 7 with k_w = 0.933); Pyrhönen
// ch. 2 on fractional-slot windings, k_w values from memory.
#[test]
fn tooth_coil_winding_has_sub_harmonic() {
    let r = report(&rotary(12, 10, 2, 1), 4.0);
    let n: Vec<u64> = r
        .rows
        .iter()
        .filter_map(|x| x.mech_order.map(Mech::get))
        .collect();
    assert_eq!(&n[..6], &[1, 5, 7, 11, 13, 17]);
    let sub = row(&r, 0.2);
    assert!(sub.forward.max(sub.backward) > 0.05);
    let n7 = row(&r, 1.4);
    assert!((n7.forward.max(n7.backward) - 5.0 / 7.0).abs() < 1e-9);
}

// Working-wave amplitude F_1 = (m/2)·(4/π)·(N_ph·k_w1/2p)·Î (Pyrhönen ch. 2, MMF of an
// m-phase winding; Say ch. 4).
#[test]
fn working_wave_amplitude_matches_textbook_formula() {
    for src in [
        include_str!("../layouts/pump-rewind.toml"),
        "[machine]\ntopology=\"rotary\"\nslots=24\npoles=4\n[winding]\nlayers=2\npitch=5\nturns_per_coil=7\n",
    ] {
        let w = wind(src);
        let r = report(&w, 1.0);
        let (m, poles) = (w.geometry.phases as f64, w.geometry.poles as f64);
        let want = m / 2.0 * 4.0 / std::f64::consts::PI
            * w.series_turns(0)
            * factors::fundamental(&w).winding
            / poles;
        assert!((r.working_wave_amplitude - want).abs() < 1e-9 * want);
    }
}

// A reversed phase sequence swaps forward and backward in every order (Say ch. 4: the
// direction of rotation follows the phase sequence).
#[test]
fn reversed_sequence_swaps_forward_and_backward() {
    for w in [
        rotary(36, 4, 2, 7),
        rotary(12, 10, 2, 1),
        wind(include_str!("../layouts/pallet-shuttle.toml")),
    ] {
        let pos = report(&w, 40.0);
        let mut o = FieldOptions::balanced(&w);
        o.upto = 40.0;
        o.currents = balanced_currents(3, Sequence::Negative);
        let neg = field(&w, &o).unwrap();
        assert_eq!(pos.working_wave, Direction::Forward);
        assert_eq!(neg.working_wave, Direction::Backward);
        assert_eq!(pos.rows.len(), neg.rows.len());
        for (a, b) in pos.rows.iter().zip(&neg.rows) {
            assert_eq!(a.order, b.order);
            assert!((a.forward - b.backward).abs() < 1e-12);
            assert!((a.backward - b.forward).abs() < 1e-12);
        }
        assert!((pos.differential_leakage - neg.differential_leakage).abs() < 1e-12);
    }
}

// One coil connected backwards makes a backward fundamental. With the EMF phasors E_ph
// (Σ s·N·e^{−jθ}) the slot sums are S+ = 2·Σ conj(E_ph)·I_ph and S− = 2·Σ E_ph·I_ph
// (derivation in docs/theory.md), checked here through `Winding::phase_emf`.
#[test]
fn a_reversed_coil_makes_a_backward_fundamental() {
    let mut w = rotary(36, 4, 2, 7);
    let c = &mut w.coils[4];
    std::mem::swap(&mut c.go, &mut c.back);
    let r = report(&w, 1.0);
    let i = balanced_currents(3, Sequence::Positive);
    let plus: Complex64 = (0..3)
        .map(|k| w.phase_emf(k, Elec::FUNDAMENTAL).conj() * i[k])
        .sum();
    let minus: Complex64 = (0..3)
        .map(|k| w.phase_emf(k, Elec::FUNDAMENTAL) * i[k])
        .sum();
    let b = row(&r, 1.0).backward;
    assert!(b > 0.01);
    assert!((b - minus.norm() / plus.norm()).abs() < 1e-12);

    // Hand-derived: 6 slots, 2 poles, one coil per phase; U reversed gives E_U → −E_U, so
    // S+ ∝ |−1 + 1 + 1| = 1 and S− ∝ |−1 + e^{−j4π/3} + e^{−j8π/3}| = 2: the backward
    // fundamental becomes the working wave and the forward one is half of it.
    let w = wind(
        "[machine]\ntopology=\"rotary\"\nslots=6\npoles=2\n[winding]\nlayers=1\n\
         [[coil]]\nphase=\"U\"\ngo=4\nback=1\n[[coil]]\nphase=\"V\"\ngo=3\nback=6\n\
         [[coil]]\nphase=\"W\"\ngo=5\nback=2\n",
    );
    let r = report(&w, 1.0);
    assert_eq!(r.working_wave, Direction::Backward);
    let x = row(&r, 1.0);
    assert!((x.backward - 1.0).abs() < 1e-12 && (x.forward - 0.5).abs() < 1e-12);
}

// A single-phase winding carries a pulsating MMF: two counter-travelling waves of equal
// amplitude (Say ch. 4, double-revolving-field theory).
#[test]
fn one_phase_alone_pulsates() {
    let w = rotary(36, 4, 2, 7);
    let mut o = FieldOptions::balanced(&w);
    o.currents = parse_currents("1@0,0@0,0@0", 3).unwrap();
    let r = field(&w, &o).unwrap();
    let x = row(&r, 1.0);
    assert!((x.forward - 1.0).abs() < 1e-12 && (x.backward - 1.0).abs() < 1e-12);
}

// A linear primary whose active length holds whole pole pairs folds onto the closed
// winding at integer orders: e^{jνκ(x + 2pτ)} = e^{jνκx}, so the 24-coil, span-5 shuttle
// primary has exactly the spectrum of the 24-slot rotary winding of span 5 (derivation in
// docs/theory.md). Balanced even-pole primary: no backward wave at π/τ and no
// pulsating part (Σ_ph I_ph = 0).
#[test]
fn linear_primary_folds_onto_the_closed_winding() {
    let lin = report(&wind(include_str!("../layouts/pallet-shuttle.toml")), 49.0);
    let rot = report(&rotary(24, 4, 2, 5), 49.0);
    for nu in 1..=49 {
        let (a, b) = (row(&lin, nu as f64), row(&rot, nu as f64));
        assert!((a.forward - b.forward).abs() < 1e-12, "order {nu}");
        assert!((a.backward - b.backward).abs() < 1e-12, "order {nu}");
    }
    // σ_d of the open primary is that of its folded periodic part: here the closed winding's.
    assert!((lin.differential_leakage - rot.differential_leakage).abs() < 1e-12);
    let l = lin.linear.unwrap();
    assert!(l.backward_wave < 1e-12 && l.pulsating < 1e-12);
    // v_s = 2·f·τ (Nasar & Boldea 1987, ch. 2): τ = 6 × 12 mm, 50 Hz.
    assert!((l.field_speed_m_s.unwrap() - 7.2).abs() < 1e-12);
}

// Hand-derived: one full-pitch coil of N turns on a 2-pole primary is a rectangle of height
// N·I over τ. Over the active length 2τ its uniform part is N·I/2; the forward wave at π/τ
// has |S+|/(π·2) = 2N·I/(2π) = N·I/π; so pulsating/forward = π/2 and backward = forward.
#[test]
fn one_coil_on_a_flat_primary_pulsates() {
    let w = wind(
        "[machine]\ntopology=\"linear\"\nslots=6\npoles=2\n[winding]\nlayers=1\n\
         turns_per_coil=10\n[[coil]]\nphase=\"U\"\ngo=1\nback=4\n",
    );
    let r = report(&w, 3.0);
    let l = r.linear.unwrap();
    assert!((r.working_wave_amplitude - 10.0 / std::f64::consts::PI).abs() < 1e-12);
    assert!((l.pulsating - std::f64::consts::FRAC_PI_2).abs() < 1e-12);
    assert!((l.backward_wave.max(l.forward_wave) - 1.0).abs() < 1e-12);
    assert!((l.backward_wave.min(l.forward_wave) - 1.0).abs() < 1e-12);
}

// An odd pole count on a flat primary leaves one phase belt unpaired, so Σ I·(n⁺ − n⁻) ≠ 0
// and a pulsating part appears (common practice; Nasar & Boldea 1987, ch. 2). Hand-derived
// for 3 poles, q = 1, span 3, N = 1: belts +U −W +V −U +W −V +U −W +V give
// |Σ I·(n⁺ − n⁻)| = |I_U + I_V − I_W| = 2, so the uniform part is y·2/L_a = 6/9; the working
// wave is (2m·N_ph·k_w1)/(π·2p) = 18/(3π) = 6/π; the ratio is π/9.
#[test]
fn odd_pole_primary_has_a_pulsating_part() {
    let w =
        wind("[machine]\ntopology=\"linear\"\nslots=12\npoles=3\n[winding]\nlayers=2\npitch=3\n");
    let r = report(&w, 5.0);
    assert!((r.working_wave_amplitude - 6.0 / std::f64::consts::PI).abs() < 1e-12);
    assert!((r.linear.unwrap().pulsating - std::f64::consts::PI / 9.0).abs() < 1e-12);
}

// Slot-opening factor k_o = sin(νπb/2τ)/(νπb/2τ) (Lipo 2017; derived in
// docs/theory.md), and Parseval on the trapezoidal MMF equals the sum of squared
// amplitudes (which fall as 1/ν² · k_o²).
#[test]
fn slot_opening_factor_and_parseval_with_ramps() {
    let w = rotary(36, 4, 2, 7);
    let b = 0.5;
    let cur = balanced_currents(3, Sequence::Positive);
    let sheet = CurrentSheet::new(&w, &cur, b).unwrap();
    let nu = 5.0;
    let x = nu * std::f64::consts::PI * b / (2.0 * 9.0);
    assert!((sheet.opening_factor(Elec(nu)) - x.sin() / x).abs() < 1e-15);
    let top = 400_000u64;
    let sum: f64 = rotary_spectrum(&sheet, top)
        .iter()
        .map(|(_, f, bk)| f * f + bk * bk)
        .sum();
    let ms = sheet.mean_square();
    // Tail beyond n: amplitudes ≤ |S|max·|k_o|/(2πn) with |k_o| ≤ 2τ/(νπb); bound by ∫.
    let smax: f64 = sheet.slot_current.iter().map(|c| c.norm()).sum();
    let tail_bound = 2.0
        * (smax * (w.geometry.slots as f64) / (2.0 * std::f64::consts::PI.powi(2) * b)).powi(2)
        / (3.0 * (top as f64).powi(3));
    assert!((ms - sum).abs() <= tail_bound + 1e-12 * ms, "{ms} vs {sum}");
    // With openings the harmonics shrink, so σ_d does too.
    let plain = differential_leakage(&w);
    let opened = FieldOptions {
        opening: b,
        ..FieldOptions::balanced(&w)
    };
    let with_openings = field(&w, &opened).expect("field").differential_leakage;
    assert!(with_openings < plain);
}

// The working wave's crest moves two pole pitches per period: 60° of ωt moves it τ/3
// forward (Say ch. 4, travelling MMF of a polyphase winding).
#[test]
fn crest_travels_two_pole_pitches_a_period() {
    let w = rotary(12, 4, 1, 3);
    let s = snapshots(&w, &FieldOptions::balanced(&w), 6).unwrap();
    let tau = 3.0;
    for pair in s.windows(2) {
        let d = (pair[1].crest_x - pair[0].crest_x).rem_euclid(2.0 * tau);
        assert!((d - tau / 3.0).abs() < 1e-9, "step {d}");
    }
    // The crest sits where the staircase is highest (q = 1: a flat top one slot wide).
    let top = s[0].points.iter().fold(f64::MIN, |m, p| m.max(p.mmf));
    let at = |x: f64| {
        let sheet = CurrentSheet::new(&w, &balanced_currents(3, Sequence::Positive), 0.0).unwrap();
        sheet.mmf(x, 0.0)
    };
    assert!((at(s[0].crest_x) - top).abs() < 1e-9);
}

#[test]
fn currents_parse_and_refuse_clearly() {
    let c = parse_currents("1@0, 2@-90 ,0.5@180", 3).unwrap();
    assert!((c[1] - Complex64::new(0.0, -2.0)).norm() < 1e-12);
    assert!(matches!(
        parse_currents("1@0,1@-120", 3),
        Err(PhasorError::Count {
            given: 2,
            phases: 3
        })
    ));
    assert!(matches!(
        parse_currents("1@0,x@1,1@2", 3),
        Err(PhasorError::Bad { .. })
    ));
    assert!(matches!(
        parse_currents("1,1@1,1@2", 3),
        Err(PhasorError::Bad { .. })
    ));
    assert!(matches!(
        parse_currents("-1@0,1@1,1@2", 3),
        Err(PhasorError::Bad { .. })
    ));
    let w = rotary(36, 4, 2, 7);
    let zero = parse_currents("0@0,0@0,0@0", 3).unwrap();
    let mut o = FieldOptions::balanced(&w);
    o.currents = zero;
    assert_eq!(field(&w, &o), Err(FieldError::NoWorkingWave));
    o = FieldOptions::balanced(&w);
    o.opening = 1.0;
    assert_eq!(field(&w, &o), Err(FieldError::SlotOpening(1.0)));
}

// Closed form for full-pitch three-phase integer-slot windings,
// σ_d = π²·(5q² + 1)/(54·q²·k_d1²) − 1 (from memory; it reproduces the textbook table values
// 0.0966, 0.0284, 0.0141, 0.0089 for q = 1…4, also from memory), against Parseval.
#[test]
fn full_pitch_leakage_closed_form_for_q_one_to_six() {
    for q in 1..=6usize {
        let w = rotary(12 * q, 4, 2, 3 * q);
        let alpha = std::f64::consts::PI / (3.0 * q as f64);
        let kd = factors::closed::distribution(q as u32, 1.0, alpha);
        let qf = q as f64;
        let want =
            std::f64::consts::PI.powi(2) * (5.0 * qf * qf + 1.0) / (54.0 * qf * qf * kd * kd) - 1.0;
        let got = differential_leakage(&w);
        assert!((got - want).abs() < 1e-12, "q = {q}: {got} vs {want}");
    }
}

// Folding an open primary onto whole wavelengths keeps every slot sum at the harmonic
// wavenumbers (e^{jνπx/τ} repeats every 2τ), so the folded sheet's Parseval sum equals the
// sum of the open primary's own amplitudes at ν = 1, 2, 3, ... (3 poles: fold onto 6 slots).
#[test]
fn folded_primary_parseval_equals_its_integer_order_amplitudes() {
    let w =
        wind("[machine]\ntopology=\"linear\"\nslots=12\npoles=3\n[winding]\nlayers=2\npitch=3\n");
    let cur = parse_currents("1@0,0.9@-115,1.2@118", 3).unwrap();
    let sheet = CurrentSheet::new(&w, &cur, 0.0).unwrap();
    let f = sheet.folded();
    assert_eq!((f.slots(), f.poles), (6, 2));
    let top = 200_000u64;
    let mut sum = 0.0;
    for nu in 1..=top {
        let (a, b) = sheet.wave(Elec(nu as f64));
        // Refer to the folded core: same slot sums, amplitude scale 2p_open/2p_folded.
        let k = sheet.poles as f64 / f.poles as f64;
        sum += (a * k).powi(2) + (b * k).powi(2);
    }
    // Tail: amplitudes ≤ Σ|C|/(2πν) on the folded core.
    let c: f64 = f.slot_current.iter().map(|c| c.norm()).sum();
    let tail = 2.0 * (c / (2.0 * std::f64::consts::PI)).powi(2) / (top as f64 - 1.0);
    let ms = f.mean_square();
    assert!((ms - sum).abs() <= tail, "{ms} vs {sum} (tail {tail})");
}

// Independent reference for the open primary's continuous transform: embed the primary in a
// zero-padded window of W = K·2τ slot pitches, sample F̃ (zero beyond the ends) and FFT it
// with rustfft. Bin m of the window is κ = 2πm/W, so ν·π/τ falls on m = ν·K, and
// F̂(κ_m) = W·c_m; A±(ν) = W·|c_∓m|/L_a and the uniform part is W·|c_0|/L_a. The aliasing
// bound is that of the rotary check; c_0 has no aliases (Σ C_k = 0).
#[test]
fn linear_transform_agrees_with_fft_of_padded_primary() {
    let cases = [
        (
            include_str!("../layouts/pallet-shuttle.toml").to_string(),
            3usize,
        ),
        (
            "[machine]\ntopology=\"linear\"\nslots=12\npoles=3\n[winding]\nlayers=2\npitch=3\n"
                .to_string(),
            3,
        ),
    ];
    for (src, k) in &cases {
        let w = wind(src);
        let cur = parse_currents("1@0,0.9@-115,1.2@118", 3).unwrap();
        let sheet = CurrentSheet::new(&w, &cur, 0.25).unwrap();
        let tau = sheet.pole_pitch_slots;
        let win = (2.0 * tau * *k as f64).round() as usize;
        assert!(win >= sheet.slots());
        let per_slot = 512;
        let m = win * per_slot;
        let mut buf: Vec<rustfft::num_complex::Complex<f64>> = (0..m)
            .map(|i| {
                let f = sheet.mmf_phasor((i as f64 + 0.5) / per_slot as f64);
                rustfft::num_complex::Complex::new(f.re, f.im)
            })
            .collect();
        FftPlanner::new().plan_fft_forward(m).process(&mut buf);
        let la = sheet.reference_length();
        let scale = win as f64 / (m as f64 * la);
        let a1 = sheet.wave(Elec::FUNDAMENTAL).0;
        for nu in 1..=20usize {
            let bin = nu * k;
            let (f, b) = sheet.wave(Elec(nu as f64));
            let (ff, fb) = (buf[m - bin].norm() * scale, buf[bin].norm() * scale);
            let x = std::f64::consts::PI * bin as f64 / m as f64;
            let tol = |v: f64| v * x * x / 3.0 * 1.01 + 1e-9 * a1;
            assert!((f - ff).abs() <= tol(f), "ν {nu}: forward {f} vs fft {ff}");
            assert!((b - fb).abs() <= tol(b), "ν {nu}: backward {b} vs fft {fb}");
        }
        let p0 = buf[0].norm() * scale;
        assert!(
            (sheet.pulsating() - p0).abs() <= 1e-9 * a1,
            "{} vs {p0}",
            sheet.pulsating()
        );
    }
}

// The end slots of a double-layer flat primary hold one coil side each, span-many at each
// end (common practice): so the ends differ from the winding's pattern in exactly those
// slots, each by one coil side's ampere-turns N·I. A single-layer primary of whole
// wavelengths has full slots throughout: its ends only cut the waves off.
#[test]
fn a_flat_primary_s_ends_are_the_coil_sides_its_end_slots_lack() {
    for (slots, poles, pitch, turns) in [
        (29usize, 4usize, 5usize, 7u32),
        (23, 3, 5, 3),
        (41, 6, 5, 4),
    ] {
        let w = wind(&format!(
            "[machine]\ntopology=\"linear\"\nslots={slots}\npoles={poles}\n[winding]\n\
             layers=2\npitch={pitch}\nturns_per_coil={turns}\n"
        ));
        let sheet = CurrentSheet::new(&w, &FieldOptions::balanced(&w).currents, 0.0).unwrap();
        let full: Vec<bool> = w.slot_sides().iter().map(|&n| n == 2).collect();
        let ends = sheet
            .end_currents(&full, Direction::Forward)
            .expect("a body to compare with");
        let entry: Vec<usize> = ends.entry.iter().map(|e| e.0).collect();
        let exit: Vec<usize> = ends.exit.iter().map(|e| e.0).collect();
        assert_eq!(entry, (0..pitch).collect::<Vec<_>>(), "Z={slots}");
        assert_eq!(
            exit,
            (slots - pitch..slots).collect::<Vec<_>>(),
            "Z={slots}"
        );
        for (k, r) in ends.entry.iter().chain(&ends.exit) {
            assert!((r.norm() - turns as f64).abs() < 1e-9, "slot {k}: {r}");
        }
        // Reversing the travel swaps which end the secondary enters at.
        let back = sheet
            .end_currents(&full, Direction::Backward)
            .expect("body");
        assert_eq!(back.entry, ends.exit);
        // The report names the same slots (from 1) and gives finite samples.
        let report = report(&w, 3.0);
        let l = report.linear.as_ref().expect("linear");
        let e = l.ends.as_ref().expect("ends");
        assert_eq!(
            e.entry_slots,
            entry.iter().map(|&k| SlotNo::at(k)).collect::<Vec<_>>()
        );
        assert!(l.continuous.iter().all(|p| p.entry_forward.is_finite()));
    }
    let w = wind("[machine]\ntopology=\"linear\"\nslots=24\npoles=4\n[winding]\nlayers=1\n");
    let sheet = CurrentSheet::new(&w, &FieldOptions::balanced(&w).currents, 0.0).unwrap();
    let ends = sheet
        .end_currents(&[true; 24], Direction::Forward)
        .expect("body");
    assert!(ends.entry.is_empty() && ends.exit.is_empty());
    // 17 slots, 2 poles, q = 2, span 5: the 7 full slots do not hold a whole period of 12,
    // so there is no body to compare the ends with.
    let w =
        wind("[machine]\ntopology=\"linear\"\nslots=17\npoles=2\n[winding]\nlayers=2\npitch=5\n");
    let sheet = CurrentSheet::new(&w, &FieldOptions::balanced(&w).currents, 0.0).unwrap();
    let full: Vec<bool> = w.slot_sides().iter().map(|&n| n == 2).collect();
    assert_eq!(sheet.end_currents(&full, Direction::Forward), None);
}
