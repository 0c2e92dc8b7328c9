//! A flat primary's performance: the model's pieces against their closed forms and limits.

mod common;

use beltwright::layout;
use beltwright::thrust::{
    self, MU0, ThrustQuery, carter_coefficient, carter_gamma, duncan_f, edge_factor,
};
use beltwright::winding::{self, Winding};
use std::f64::consts::PI;

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

/// A four-pole flat primary, 24 coils at span 5, 3 mm clearance over a 4 mm aluminium plate
/// on back iron.
fn shuttle(extra_core: &str) -> Winding {
    wind(&format!(
        "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
         [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 3.0\n{extra_core}\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"aluminium\"\nthickness_mm = 4.0\nwidth_mm = 120.0\n"
    ))
}

/// N·k_w1 of the shuttle primary, by hand: 24 coils of 40 turns in three phases, one path,
/// N = 8 × 40 = 320 series turns; q = 2 at a slot angle α = π/6 and span 5 of τ = 6:
/// k_d = sin(qα/2)/(q·sin(α/2)), k_p = sin((5/6)·π/2) (M. G. Say, *Alternating Current
/// Machines*, 5th ed. 1983, §4.4, from memory), so k_w1 = 0.933013.
fn shuttle_effective_turns() -> f64 {
    let alpha = PI / 6.0;
    let kd = (2.0 * alpha / 2.0).sin() / (2.0 * (alpha / 2.0).sin());
    let kp = (5.0 / 6.0 * PI / 2.0).sin();
    assert!((kd * kp - 0.933013).abs() < 5e-7);
    320.0 * kd * kp
}

fn query(current: Option<f64>, end: bool) -> ThrustQuery {
    ThrustQuery {
        current_a: current,
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 20,
        end_effect: end,
    }
}

// Current-fed, without the end effect, secondary leakage neglected: the textbook circuit
// F = 3·I²·X_m·sG/(v_s·(1 + s²G²)) has its maximum 3·I²·X_m/(2·v_s) at s = 1/G (E. R.
// Laithwaite 1965; Boldea and Nasar, *Linear Electric Motors*, 1987, ch. 2).
// X_m, G and v_s are worked out here from the layout's figures by the closed forms (not read
// from the report under test): Carter (1901), Russell and Norsworthy (1958), L_m and G as in
// Boldea and Nasar 1987, ch. 2.
#[test]
fn current_fed_thrust_peaks_at_one_over_g() {
    let w = shuttle("slot_opening_mm = 3.0");
    let r = thrust::thrust(&w, &query(Some(10.0), false)).expect("model");
    let tau = 0.012 * 6.0;
    // Carter: γ = (4/π)·[x·atan x − ln √(1 + x²)], x = b0/(2g); k_C = τ_s/(τ_s − γ·g).
    let (ts, b0, gap) = (0.012, 0.003, 0.007);
    let x: f64 = b0 / (2.0 * gap);
    let gamma = 4.0 / PI * (x * x.atan() - (1.0 + x * x).sqrt().ln());
    let ge = ts / (ts - gamma * gap) * gap;
    let nkw = shuttle_effective_turns();
    let lm = 6.0 * MU0 * tau * 0.080 * nkw * nkw / (PI * PI * 2.0 * ge);
    let xm = 2.0 * PI * 50.0 * lm;
    let sigma = 1.0 / 0.028264e-6 * russell_norsworthy(0.040, 0.060, tau);
    let g = MU0 * 2.0 * PI * 50.0 * tau * tau * sigma * 0.004 / (PI * PI * ge);
    let vs = 2.0 * 50.0 * tau;
    assert!((r.goodness_factor - g).abs() < 1e-9 * g);
    assert!((r.circuit.xm_ohm - xm).abs() < 1e-9 * xm);
    assert!(
        (r.max_thrust_slip - 1.0 / g).abs() < 1e-6,
        "{} vs {}",
        r.max_thrust_slip,
        1.0 / g
    );
    let peak = 3.0 * 100.0 * xm / (2.0 * vs);
    assert!((r.max_thrust_n - peak).abs() < 1e-9 * peak);
    for row in &r.rows {
        let sg = row.slip * g;
        let f = 3.0 * 100.0 * xm * sg / (vs * (1.0 + sg * sg));
        assert!((row.thrust_n - f).abs() < 1e-9 * peak, "{row:?}");
    }
}

/// The edge factor K = 1 − tanh(πa/τ)/[(πa/τ)·(1 + tanh(πa/τ)·tanh(π(c − a)/τ))] for a
/// stack of half-width a over a plate of half-width c (Russell and Norsworthy 1958), written
/// here from the formula.
fn russell_norsworthy(a: f64, c: f64, tau: f64) -> f64 {
    let t = (PI * a / tau).tanh();
    1.0 - t / ((PI * a / tau) * (1.0 + t * (PI * (c - a) / tau).tanh()))
}

// L_m = 6·μ0·τ·W·(N·k_w1)²/(π²·p·g_e) (Boldea and Nasar 1987, ch. 2), by hand from the
// layout's gap (no slot opening: Carter 1, g_e = clearance + plate = 7 mm) and the winding's
// factors; v_s = 2·f·τ.
#[test]
fn magnetising_inductance_follows_the_closed_form() {
    let w = shuttle("");
    let r = thrust::thrust(&w, &query(Some(1.0), false)).expect("model");
    let tau = 0.012 * 6.0;
    let nkw = shuttle_effective_turns();
    let ge = 0.007;
    let want = 6.0 * MU0 * tau * 0.080 * nkw * nkw / (PI * PI * 2.0 * ge);
    assert!((r.magnetizing_inductance_h - want).abs() < 1e-12 * want);
    assert!((r.synchronous_speed_m_s - 2.0 * 50.0 * tau).abs() < 1e-12);
    // No slot opening: Carter 1, g_e = clearance + plate = 7 mm.
    assert_eq!(r.carter_coefficient, 1.0);
    assert!((r.effective_gap.mm() - 7.0).abs() < 1e-12);
    // G = μ0·ω·τ²·σ_e·d/(π²·g_e) with σ_e = K·σ (Laithwaite 1965), σ = 1/0.028264 MS/m.
    let k = russell_norsworthy(0.040, 0.060, tau);
    assert!((r.edge_factor - k).abs() < 1e-12);
    let sigma = 1.0 / 0.028264e-6 * k;
    let g = MU0 * 2.0 * PI * 50.0 * tau * tau * sigma * 0.004 / (PI * PI * 0.007);
    assert!((r.goodness_factor - g).abs() < 1e-9 * g);
}

// Carter (1901) against the approximation γ ≈ (b0/g)²/(5 + b0/g) quoted with it (Pyrhönen
// et al. 2014, eq. 3.1-3.2): within 3 % for openings of two gaps and more, where the
// correction matters; below that the approximation runs high, but the coefficients differ
// by under 0.2 % at a slot pitch of ten gaps. And a hand value:
// τ_s = 12, b0 = 3, g = 7 gives x = 3/14, γ = 0.029013, γ·g = 0.203090,
// k_C = 12/11.796910 = 1.017216.
#[test]
fn carter_coefficient_matches_its_closed_form_and_approximation() {
    for ratio in [0.5f64, 1.0, 2.0, 5.0, 10.0, 20.0] {
        let exact = carter_gamma(ratio, 1.0);
        let approx = ratio * ratio / (5.0 + ratio);
        if ratio >= 2.0 {
            assert!(
                (exact / approx - 1.0).abs() < 0.03,
                "{ratio}: {exact} {approx}"
            );
        }
        let (kc, ka) = (10.0 / (10.0 - exact), 10.0 / (10.0 - approx));
        if ratio < 2.0 {
            assert!((kc / ka - 1.0).abs() < 0.002, "{ratio}: {kc} {ka}");
        }
    }
    assert!((carter_gamma(3.0, 7.0) - 0.029013).abs() < 1e-6);
    assert!((carter_coefficient(12.0, 3.0, 7.0) - 1.017216).abs() < 1e-6);
    // No opening: no correction.
    assert!((carter_coefficient(12.0, 0.0, 1.0) - 1.0).abs() < 1e-15);
}

// Russell and Norsworthy (1958): K → 1 for a stack wide against the pole pitch, K → 0 for a
// narrow one, 1 − tanh(x)/x with no overhang, more overhang raises K; and the formula's
// value for a = 40 mm, c = 60 mm, τ = 72 mm by hand: x = 1.74533, tanh x = 0.94110,
// tanh(π·20/72) = 0.70249, K = 1 − 0.94110/(1.74533·1.66112) = 0.67540.
#[test]
fn edge_factor_limits_and_value() {
    assert!((edge_factor(100.0, 150.0, 0.072) - 1.0).abs() < 1e-3);
    assert!(edge_factor(1e-6, 1e-6, 1.0) < 1e-6);
    let x = PI * 40.0 / 72.0;
    assert!((edge_factor(40.0, 40.0, 72.0) - (1.0 - x.tanh() / x)).abs() < 1e-15);
    assert!(edge_factor(40.0, 80.0, 72.0) > edge_factor(40.0, 50.0, 72.0));
    assert!((edge_factor(40.0, 60.0, 72.0) - 0.67540).abs() < 1e-4);
}

// Duncan (1983): f → 1 as Q → 0, f ≈ 1/Q for large Q; with the end effect the thrust lies
// below the thrust without it at low slip (high speed), where Q is small.
#[test]
fn end_effect_costs_thrust_at_high_speed() {
    assert!((duncan_f(1e-9) - 1.0).abs() < 1e-9);
    assert!((duncan_f(200.0) * 200.0 - 1.0).abs() < 1e-12);
    let w = shuttle("slot_opening_mm = 3.0");
    let with = thrust::thrust(&w, &query(Some(10.0), true)).expect("model");
    let without = thrust::thrust(&w, &query(Some(10.0), false)).expect("model");
    for (a, b) in with.rows.iter().zip(&without.rows) {
        if a.slip > 0.0 && a.slip <= 0.3 {
            assert!(a.thrust_n < b.thrust_n, "{a:?} {b:?}");
        }
    }
}

// Slip outside 0..1 is accepted and labelled: below 0 the thrust brakes (generating), above
// 1 the secondary runs against the field.
#[test]
fn thrust_cli_takes_negative_slip_and_gives_the_contract() {
    let v = common::json(&[
        "thrust",
        "layouts/pallet-shuttle.toml",
        "--slip",
        "-0.2..=1.2",
        "--steps",
        "7",
        "--format",
        "json",
    ]);
    for key in [
        "goodness_factor",
        "carter_coefficient",
        "edge_factor",
        "effective_gap_mm",
        "magnetizing_inductance_h",
        "secondary_resistance_ohm",
        "synchronous_speed_m_s",
    ] {
        assert!(v[key].as_f64().is_some_and(f64::is_finite), "{key}");
    }
    let rows = v["rows"].as_array().expect("rows");
    assert_eq!(rows.len(), 8);
    for key in [
        "slip",
        "speed_m_s",
        "thrust_n",
        "normal_force_n",
        "current_a",
        "power_factor",
        "efficiency",
    ] {
        assert!(rows[0].get(key).is_some(), "{key}");
    }
    assert!(rows[0]["thrust_n"].as_f64().expect("thrust") < 0.0);
    // A rotary core is refused with exit status 2.
    let out = common::run(&["thrust", "layouts/pump-rewind.toml"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("flat primaries"));
}

// A speed range is the same table as its slips: v = (1 − s)·v_s (the definition of slip).
#[test]
fn a_speed_range_gives_the_rows_of_its_slips() {
    let by_speed = common::json(&[
        "thrust",
        "layouts/pallet-shuttle.toml",
        "--speed",
        "0..=7.2",
        "--steps",
        "4",
        "--format",
        "json",
    ]);
    let by_slip = common::json(&[
        "thrust",
        "layouts/pallet-shuttle.toml",
        "--slip",
        "0..=1",
        "--steps",
        "4",
        "--format",
        "json",
    ]);
    assert_eq!(by_speed["rows"], by_slip["rows"]);
}

// Every assumption checked against the inputs. Skin depth δ = √(2/(ω·μ0·σ)) (e.g. J. D.
// Jackson, *Classical Electrodynamics*, 3rd ed., §8.1) for aluminium of IEC 60889,
// σ = 1/0.028264 MS/m, at 50 Hz: 11.97 mm; a 20 mm plate is thicker, thin only below
// slip (δ/20 mm)². A 100 mm plate under an 80 mm stack is not narrower; a 60 mm one is.
#[test]
fn the_models_assumptions_are_checked_against_the_inputs() {
    use beltwright::assumption::Assumption;
    let thick = wind(
        "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
          [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
          [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 3.0\n\
          [wire]\ndiameter_mm = 0.5\n\
          [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
          [secondary]\nmaterial = \"aluminium\"\nthickness_mm = 20.0\nwidth_mm = 60.0\n",
    );
    let r = thrust::thrust(&thick, &query(None, true)).unwrap();
    let sigma = 1.0 / 0.028264e-6;
    let delta = (2.0 / (2.0 * PI * 50.0 * MU0 * sigma)).sqrt();
    assert!((delta * 1e3 - 11.97).abs() < 0.005, "{delta}");
    let mut seen = 0;
    for a in &r.assumptions {
        match a {
            Assumption::PlateThickerThanSkinDepth {
                skin_depth,
                thin_below_slip,
                ..
            } => {
                assert!((skin_depth.m() / delta - 1.0).abs() < 1e-12);
                assert!((thin_below_slip / (delta / 0.020).powi(2) - 1.0).abs() < 1e-12);
                seen += 1;
            }
            Assumption::PlateNarrowerThanStack { plate, stack } => {
                assert_eq!((plate.mm(), stack.mm()), (60.0, 80.0));
                seen += 1;
            }
            Assumption::PlateConductivity { conductivity } => {
                assert!((conductivity.s_m() / sigma - 1.0).abs() < 1e-12);
                seen += 1;
            }
            Assumption::PrimaryCurrentDensity { density_a_mm2, .. } => {
                // The sweep's largest phase current over one 0.5 mm strand (one path).
                let i = r.rows.iter().map(|x| x.current_a).fold(0.0, f64::max);
                let j = i / (PI / 4.0 * 0.25);
                assert!((density_a_mm2 / j - 1.0).abs() < 1e-12);
                seen += 1;
            }
            Assumption::PlateHeatingAtStandstill { watts, w_cm2, .. } => {
                // All the gap power at slip 1, over 29 × 12 mm of primary × the 60 mm plate.
                let p = r.rows.last().unwrap();
                assert_eq!(p.slip, 1.0);
                assert!((watts / p.airgap_power_w - 1.0).abs() < 1e-12);
                assert!((w_cm2 / (watts / (34.8 * 6.0)) - 1.0).abs() < 1e-12);
                seen += 1;
            }
            _ => {}
        }
    }
    assert_eq!(seen, 5, "{:?}", r.assumptions);
    // A 4 mm plate wider than the stack raises neither of the plate's warnings.
    let r = thrust::thrust(&shuttle(""), &query(None, true)).unwrap();
    assert!(!r.assumptions.iter().any(|a| matches!(
        a,
        Assumption::PlateThickerThanSkinDepth { .. } | Assumption::PlateNarrowerThanStack { .. }
    )));
}

// At synchronism the thrust is zero and at standstill the speed is: the mechanical output
// F·v is zero at both ends (definition of the two points), so the efficiency reads 0 at
// both, in a sweep that crosses them as in one that starts on them.
#[test]
fn efficiency_reads_the_same_at_synchronism_and_standstill_in_every_range() {
    for (from, to, steps) in [(-0.2, 1.2, 7), (0.0, 1.0, 20), (-1.0, 2.0, 30)] {
        let q = ThrustQuery {
            current_a: None,
            slip_from: from,
            slip_to: to,
            steps,
            end_effect: true,
        };
        let r = thrust::thrust(&shuttle(""), &q).unwrap();
        for end in [0.0, 1.0] {
            let row = r
                .rows
                .iter()
                .find(|x| x.slip == end)
                .unwrap_or_else(|| panic!("{from}..{to}: no row at slip {end}"));
            assert_eq!(row.efficiency, Some(0.0), "{from}..{to} at slip {end}");
        }
    }
}

// With the end effect the gap field is what the reduced magnetising reactance
// X_m·(1 − f(Q)) carries (Duncan 1983; our reading of the circuit, docs/theory.md): the
// attraction at synchronism is that of the sheet |I_m|·(1 − f(Q)), and so below the long
// primary's, although the magnetising current is higher.
#[test]
fn the_end_effect_weakens_the_attraction() {
    let w = shuttle("slot_opening_mm = 3.0");
    let with = thrust::thrust(&w, &query(None, true)).expect("model");
    let without = thrust::thrust(&w, &query(None, false)).expect("model");
    let (a, b) = (&with.rows[0], &without.rows[0]);
    assert_eq!(a.slip, 0.0);
    assert!(a.current_a > b.current_a);
    assert!(
        a.normal_force_n < b.normal_force_n,
        "{} {}",
        a.normal_force_n,
        b.normal_force_n
    );
    // At s = 0 there is no secondary current: attraction ∝ (|I_m|·(1 − f(Q)))², I_m = I1.
    let q = a.end_effect_q.expect("Q at speed");
    let ratio = (a.current_a * (1.0 - thrust::duncan_f(q)) / b.current_a).powi(2);
    assert!((a.normal_force_n / b.normal_force_n / ratio - 1.0).abs() < 1e-9);
}
