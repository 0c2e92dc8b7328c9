//! The flat primary's field by the layer method against closed forms, an independent
//! transfer-matrix solution, the energy balance and its own convergence.

#![allow(clippy::needless_range_loop)] // matrices indexed by phase, as the formulas are written

use beltwright::layers::{Far, Sheet, face_ratio};
use beltwright::layout;
use beltwright::thrust::{self, Feed, MU0, ThrustQuery};
use beltwright::winding::{self, Winding};
use num_complex::Complex64 as C;
use std::f64::consts::PI;

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

/// A flat primary of `poles` poles, q = 2, span 5 of 6, 12 mm slot pitch, 3 mm clearance
/// over a plate `plate` mm thick, with `secondary_extra` keys in `[secondary]`.
fn primary(poles: usize, plate: f64, secondary_extra: &str) -> Winding {
    let slots = poles * 6 + 5;
    wind(&format!(
        "[machine]\ntopology = \"linear\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
         [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 3.0\n\
         slot_opening_mm = 3.0\nslot_width_mm = 6.0\nslot_depth_mm = 10.0\n\
         [wire]\nawg = 21\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"aluminium\"\nthickness_mm = {plate}\nwidth_mm = 120.0\n\
         {secondary_extra}\n"
    ))
}

const SIGMA: f64 = 35.4e6;
const OMEGA: f64 = 2.0 * PI * 50.0;

// One wave over a thin plate on ideal iron, the gap small against the wavelength: the
// layers give R(0) = −(k²·g/μ0)·(1 + j·s·G) with G = μ0·σ·d·ω·s⁰/(k²·g), g = air + plate,
// Laithwaite's goodness factor (E. R. Laithwaite, "The goodness of a machine", Proc. IEE
// 1965; the one-dimensional sheet the equivalent circuit stands for). The corrections are
// of order (1 + s·G)²·(k·g)², so at k·g = 1e-4 and G = 14 the two agree to about 2e-6.
#[test]
fn one_wave_over_a_thin_plate_is_the_goodness_factor_sheet() {
    let k = 10.0; // 1/m: τ = π/k = 314 mm
    let (air, d) = (0.9e-5, 0.1e-5);
    let g = air + d;
    for s in [0.05, 0.3, 1.0] {
        let r = face_ratio(k, s * OMEGA, SIGMA, d, (k * air).tanh(), Far::Iron);
        let gf = MU0 * SIGMA * d * OMEGA / (k * k * g);
        let want = C::new(1.0, s * gf) * (-(k * k) * g / MU0);
        assert!(
            ((r - want) / want).norm() < 1e-5 && ((r.re - want.re) / want.re).abs() < 1e-5,
            "s = {s}: {r} against {want} (G = {gf})"
        );
    }
}

// Without a conductor the gap is two iron surfaces with the current sheet on one: Laplace's
// equation gives A(0) = μ0·K̂·coth(k·g)/k, so R(0) = −k·tanh(k·g)/μ0 exactly; it tends to
// the one-dimensional −k²g/μ0 as k·g → 0 (the circuit's gap).
#[test]
fn the_gap_alone_is_the_closed_form_between_two_irons() {
    for (k, g) in [(5.0, 0.01), (40.0, 0.01), (300.0, 0.004)] {
        let r = face_ratio(k, OMEGA, 0.0, 0.002, (k * (g - 0.002)).tanh(), Far::Iron);
        let want = -k * (k * g).tanh() / MU0;
        assert!((r.re / want - 1.0).abs() < 1e-12 && r.im.abs() < 1e-9 * want.abs());
    }
    let (k, g) = (1.0, 1e-4);
    let r = face_ratio(k, OMEGA, 0.0, 0.0, (k * g).tanh(), Far::Iron);
    assert!((r.re / (-k * k * g / MU0) - 1.0).abs() < 1e-8);
}

// A plate many skin depths thick right on the primary face is a conducting half-space:
// R(0) = −γ/μ0 with γ = √(k² + jωμ0σ·s), the surface impedance of a half-space in a
// travelling field (R. L. Stoll, *The Analysis of Eddy Currents*, 1974, ch. 2, from memory).
#[test]
fn a_thick_plate_is_a_conducting_half_space() {
    for (k, s) in [(10.0, 1.0), (100.0, 0.2), (3.0, 0.02)] {
        let gamma = C::new(k * k, OMEGA * MU0 * SIGMA * s).sqrt();
        let d = 60.0 / gamma.re;
        let r = face_ratio(k, s * OMEGA, SIGMA, d, (k * 1e-12).tanh(), Far::Iron);
        let want = -gamma / MU0;
        assert!(((r - want) / want).norm() < 1e-9, "{r} against {want}");
    }
}

/// The same layers by an independent route: 2×2 transfer matrices of (A, H_x) through each
/// layer, [cosh γt, (μ/γ)·sinh γt; (γ/μ)·sinh γt, cosh γt] (the multilayer travelling-wave
/// formulation of J. Greig and E. M. Freeman, Proc. IEE 1967, and E. M. Freeman, Proc. IEE
/// 1968, from memory), from the primary face to air reaching infinity.
/// The 2×2 transfer matrix of (A, H_x) through `layers` (thickness, σ, μ), first to last.
fn transfer(k: f64, sw: f64, layers: &[(f64, f64, f64)]) -> [[C; 2]; 2] {
    let mut m = [
        [C::new(1.0, 0.0), C::new(0.0, 0.0)],
        [C::new(0.0, 0.0), C::new(1.0, 0.0)],
    ];
    for &(t, sigma, mu) in layers {
        let g = C::new(k * k, mu * sigma * sw).sqrt();
        let (ch, sh) = ((g * t).cosh(), (g * t).sinh());
        let l = [[ch, sh * mu / g], [sh * g / mu, ch]];
        let mut n = [[C::new(0.0, 0.0); 2]; 2];
        for i in 0..2 {
            for j in 0..2 {
                n[i][j] = l[i][0] * m[0][j] + l[i][1] * m[1][j];
            }
        }
        m = n;
    }
    m
}

fn transfer_matrix_ratio(k: f64, sw: f64, layers: &[(f64, f64, f64)]) -> C {
    // Unknown (A0, H0) at the face; carry the two columns of the identity and ask that the
    // field above the last layer decays: H = −(|k|/μ0)·A there.
    let m = transfer(k, sw, layers);
    // H_top + (|k|/μ0)·A_top = 0 with (A_top, H_top) = M·(1, R): solve for R = H0/A0.
    let c = k.abs() / MU0;
    -(m[1][0] + c * m[0][0]) / (m[1][1] + c * m[0][1])
}

// The recursion of the ratio R and the transfer matrices agree for an air gap, a plate,
// a conducting permeable steel backing and air beyond, at several waves and slips.
#[test]
fn the_layers_agree_with_transfer_matrices_through_a_steel_backing() {
    let (air, d) = (0.003, 0.004);
    let (tb, sb, mur) = (0.006, 5e6, 300.0);
    for (k, s) in [(20.0, 1.0), (43.6, 0.1), (200.0, -0.3), (-43.6, 1.9)] {
        let sw = s * OMEGA;
        let ours = face_ratio(
            k,
            sw,
            SIGMA,
            d,
            (k.abs() * air).tanh(),
            Far::Steel {
                t: tb,
                sigma: sb,
                mu: mur * MU0,
            },
        );
        let theirs = transfer_matrix_ratio(
            k,
            sw,
            &[(air, 0.0, MU0), (d, SIGMA, MU0), (tb, sb, mur * MU0)],
        );
        assert!(
            ((ours - theirs) / theirs).norm() < 1e-10,
            "k = {k}, s = {s}: {ours} against {theirs}"
        );
    }
}

fn slips() -> Vec<f64> {
    (0..=10).map(|i| -0.2 + 1.6 * i as f64 / 10.0).collect()
}

// Energy: at every slip, electrical input = copper loss + mechanical power F·v + the heat
// in plate and backing. The heat is integrated as σ·|s_k·ω·A|² through each layer, a route
// independent of the gap power and the Maxwell-stress thrust (Poynting's theorem).
#[test]
fn input_is_copper_plus_output_plus_secondary_heat_at_every_slip() {
    let w = primary(
        4,
        4.0,
        "backing_thickness_mm = 5.0\nbacking_conductivity_ms_m = 5.0\nbacking_permeability = 300",
    );
    let phase_v = 400.0 / 3f64.sqrt();
    for feed in [
        Feed::Voltage {
            phase_voltage_v: phase_v,
        },
        Feed::Current {
            phase_current_a: 10.0,
        },
    ] {
        let sl = slips();
        let sheet = Sheet::new(&w, feed, &sl).expect("model");
        for s in sl {
            let row = sheet.point(s).expect("point");
            let amps = sheet.currents_at(s).expect("currents");
            let (plate, backing) = sheet.layer_losses(s, &amps);
            assert!(backing > 0.0 && plate > 0.0);
            let balance = row.copper_loss_w + row.thrust_n * row.speed_m_s + plate + backing;
            assert!(
                (row.input_w - balance).abs() < 1e-6 * row.input_w.abs().max(1.0),
                "s = {s}: input {} against {balance}",
                row.input_w
            );
            assert!((row.secondary_loss_w - plate - backing).abs() < 1e-6 * row.input_w.abs());
        }
    }
}

// The integrals over the wavenumber are converged: twice the window and twice the
// wavenumber range change thrust, normal force and current by less than 0.1 % (thrust
// against the larger of itself and 2 % of the normal force, where it passes through zero).
#[test]
fn the_wavenumber_grid_is_converged() {
    let bare = wind(
        "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
         [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 1.0\n\
         [supply]\nfrequency_hz = 60.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"copper\"\nthickness_mm = 3.0\n",
    );
    // A small clearance over a copper plate: the slot harmonics still reach the plate and
    // drag it at speed (the range follows the gap, e^(−2|k|·g_air)).
    let close = wind(
        "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
         [core]\nslot_pitch_mm = 20.0\nstack_mm = 80.0\nairgap_mm = 0.5\nslot_opening_mm = 3.0\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"copper\"\nthickness_mm = 6.0\n",
    );
    for w in [
        primary(2, 4.0, ""),
        primary(4, 6.0, "back_iron = false"),
        bare,
        close,
    ] {
        let feed = Feed::Voltage {
            phase_voltage_v: 230.0,
        };
        let sl = [0.0, 0.05, 0.3, 1.0];
        let a = Sheet::new(&w, feed, &sl).expect("model");
        let b = Sheet::with_grid(&w, feed, &sl, 2.0).expect("model");
        for s in sl {
            let (x, y) = (a.point(s).expect("point"), b.point(s).expect("point"));
            // The finer grid is twice as long and twice as wide (not bounded).
            let (ga, gb) = (a.grid(), b.grid());
            assert!(
                (gb.1 / ga.1 - 2.0).abs() < 1e-9 && (gb.3 / ga.3 - 2.0).abs() < 1e-9,
                "{ga:?} {gb:?}"
            );
            let scale = y.thrust_n.abs().max(0.02 * y.normal_force_n.abs());
            assert!(
                (x.thrust_n - y.thrust_n).abs() < 1e-3 * scale,
                "s = {s}: {} {} {}",
                x.thrust_n,
                y.thrust_n,
                y.normal_force_n
            );
            assert!((x.normal_force_n - y.normal_force_n).abs() < 1e-3 * y.normal_force_n.abs());
            assert!((x.phase_currents_a[0] / y.phase_currents_a[0] - 1.0).abs() < 1e-3);
        }
    }
}

// A long primary tends to the periodic machine: at standstill the field model's thrust
// over the circuit's long-primary figure (current-fed, no end effect: the goodness-factor
// sheet) approaches 1 as 1 − c/p with the pole pairs p, the ends' share of the primary.
// With a gap small against the pole pitch (k·g_e ≈ 0.02, so the two-dimensional gap is
// the one-dimensional one to 1e-4), extrapolating 24 and 48 poles to infinitely many
// (Richardson, in 1/p) leaves the space harmonics' own thrust, well under 0.5 %. The slot
// opening is narrow (0.3 mm) so that the spread of each slot's current over it, which the
// circuit does not see, takes under 1e-4 off the fundamental.
#[test]
fn a_long_primary_tends_to_the_goodness_factor_sheet() {
    let q = ThrustQuery {
        current_a: Some(10.0),
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 4,
        end_effect: false,
    };
    let ratio = |poles: usize| -> f64 {
        let slots = poles * 6 + 5;
        let w = wind(&format!(
            "[machine]\ntopology = \"linear\"\nslots = {slots}\npoles = {poles}\n\
             [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
             [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 0.3\n\
             slot_opening_mm = 0.3\n\
             [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
             [secondary]\nmaterial = \"aluminium\"\nthickness_mm = 0.2\nwidth_mm = 400.0\n"
        ));
        let r = thrust::thrust(&w, &q).expect("model");
        let (c, f) = (&r.rows[4], &r.field_model.rows[4]);
        assert_eq!(c.slip, 1.0);
        f.thrust_n / c.thrust_n
    };
    let (r8, r24, r48) = (ratio(8), ratio(24), ratio(48));
    assert!(r8 < r24 && r24 < r48 && r48 < 1.0, "{r8} {r24} {r48}");
    let limit = 2.0 * r48 - r24;
    assert!((limit - 1.0).abs() < 0.005, "{r24} {r48} → {limit}");
}

// A plate between two equal primaries fed alike, one wave solved whole: the two current
// sheets on two irons (H_x = −K at the lower face, +K at the upper: their B_y add through the
// plate) across air, the whole plate and air, by transfer matrices. The lower face's Â/K̂
// equals what the layer rule gives one primary over half the plate on ideal iron (the
// mirror-plane model the report uses for a pair).
#[test]
fn a_pair_solved_whole_is_the_mirror_plane_model() {
    let (air, d) = (0.002, 0.006);
    for (k, s) in [(20.0, 1.0), (43.6, 0.1), (150.0, -0.4), (-43.6, 1.7)] {
        let sw = s * OMEGA;
        // Transfer matrix of (A, H_x) through air, plate, air.
        let m = transfer(k, sw, &[(air, 0.0, MU0), (d, SIGMA, MU0), (air, 0.0, MU0)]);
        // (A_H, H_H) = M·(A0, −K) with H_H = +K: A0/K = (1 + M11)/M10.
        let whole = (1.0 + m[1][1]) / m[1][0];
        let mirror = -1.0 / face_ratio(k, sw, SIGMA, d / 2.0, (k.abs() * air).tanh(), Far::Iron);
        assert!(
            ((whole - mirror) / mirror).norm() < 1e-10,
            "k = {k}, s = {s}: {whole} against {mirror}"
        );
    }
}

// The report's pair: twice the thrust of one primary over half the plate on ideal iron at
// the same clearance, and the normal force each primary's own pull (the mirror-plane model
// checked above).
#[test]
fn a_pair_pushes_with_both_primaries() {
    let q = ThrustQuery {
        current_a: None,
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 4,
        end_effect: true,
    };
    let pair = thrust::thrust(&primary(4, 6.0, "back_iron = false"), &q).expect("pair");
    let half = thrust::thrust(&primary(4, 3.0, ""), &q).expect("one side");
    for (p, h) in pair.field_model.rows.iter().zip(&half.field_model.rows) {
        assert!((p.thrust_n - 2.0 * h.thrust_n).abs() < 1e-9 * h.thrust_n.abs().max(1.0));
        assert!((p.normal_force_n - h.normal_force_n).abs() < 1e-9 * h.normal_force_n.abs());
    }
    for (p, h) in pair.rows.iter().zip(&half.rows) {
        assert!((p.thrust_n - 2.0 * h.thrust_n).abs() < 1e-9 * h.thrust_n.abs().max(1.0));
    }
}

// The working temperatures: the plate's conductivity falls as 1/(1 + α·ΔT) with α = 0.00403
// for aluminium (IEC 60889), the winding's resistance rises as 1 + 0.00393·ΔT (IEC 60028).
#[test]
fn temperatures_set_the_resistance_and_the_plate_conductivity() {
    let q = ThrustQuery {
        current_a: Some(10.0),
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 2,
        end_effect: true,
    };
    let cold = thrust::thrust(&primary(4, 4.0, ""), &q).expect("cold");
    let w = {
        let mut w = primary(4, 4.0, "temperature_c = 100.0");
        w.design.winding_temperature_c = 75.0;
        w
    };
    let hot = thrust::thrust(&w, &q).expect("hot");
    let r = hot.circuit.r1_ohm / cold.circuit.r1_ohm;
    assert!((r - (1.0 + 0.00393 * 55.0)).abs() < 1e-12, "{r}");
    let g = hot.goodness_factor / cold.goodness_factor;
    assert!((g - 1.0 / (1.0 + 0.00403 * 80.0)).abs() < 1e-12, "{g}");
    let said = serde_json::to_string(&hot.assumptions).expect("json");
    assert!(said.contains("\"winding_c\":75.0") && said.contains("\"plate_c\":100.0"));
}

// A thin steel backing saturates: half the flux per pole through a 0.5 mm section passes
// the back-iron limit, and the report says so with its figure; 20 mm does not.
#[test]
fn a_thin_backing_is_reported_as_saturating() {
    let q = ThrustQuery {
        current_a: None,
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 2,
        end_effect: true,
    };
    let says = |t: f64| -> bool {
        let w = primary(4, 4.0, &format!("backing_thickness_mm = {t}"));
        let r = thrust::thrust(&w, &q).expect("model");
        r.assumptions.iter().any(|a| {
            matches!(a, beltwright::assumption::Assumption::BackingSaturates { tesla, .. } if *tesla > 1.6)
        })
    };
    assert!(says(0.5));
    assert!(!says(20.0));
}

// The backing's conductivity or permeability without its thickness is refused, naming the
// key that is missing.
#[test]
fn a_backing_without_its_thickness_is_refused() {
    let src = "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
               [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
               [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = 3.0\n\
               [secondary]\nthickness_mm = 4.0\nbacking_permeability = 300\n";
    let e = layout::parse(src, "t.toml")
        .expect_err("refused")
        .to_string();
    assert!(e.contains("backing_thickness_mm"), "{e}");
}

// One inductance: the field model's phase impedance with the plate not conducting is
// R1 + jX_σ on the diagonal plus jω times the very matrix `inductance` reports. Both are on
// the same grid (one rule); what this checks is the two routes through it: the field
// model's complex matrices with the floating potential eliminated at the terminals
// (`impedance_at`), and `gap_inductances`' real integral with its own elimination.
#[test]
fn the_field_model_and_inductance_share_one_matrix() {
    let mut w = primary(3, 4.0, "");
    if let Some(sec) = w.design.secondary.as_mut() {
        sec.conductivity_s_m = 0.0;
    }
    let report = beltwright::inductance::inductance(&w, false).expect("inductance");
    let sheet = Sheet::new(
        &w,
        Feed::Current {
            phase_current_a: 1.0,
        },
        &[1.0],
    )
    .expect("model");
    let z = sheet.impedance_at(1.0);
    let (r1, x_leak) = sheet.r1_x_leak();
    for q in 0..3 {
        for p in 0..3 {
            let own = if p == q {
                C::new(r1, x_leak)
            } else {
                C::new(0.0, 0.0)
            };
            let gap = (z[q][p] - own) / C::new(0.0, OMEGA);
            let l = report.matrix_h[q][p];
            assert!(
                (gap.re - l).abs() < 1e-6 * report.matrix_h[q][q] && gap.im.abs() < 1e-9,
                "{q}{p}: {gap} against {l}"
            );
        }
    }
}

// The flat primary's layer matrix tends to the winding-function matrix of a gap
// one-dimensional across (Schmitz and Novotny 1965; the mean of each turns function taken
// over the primary, the same closure of the flux in the primary core the floating
// potential gives). The two-dimensional gap adds (k·g)²/3 to each harmonic's permeance,
// summed over harmonics up to k ≈ 1/g: a difference of order g/τ_s. At a 0.1 mm gap every
// entry agrees within 0.1 % (what is left is the spread of each slot's current over its
// 0.2 mm opening); at 1 mm the fringing adds more than 0.5 %.
#[test]
fn flat_inductances_tend_to_winding_functions_as_the_gap_closes() {
    let both = |gap: f64| {
        let w = wind(&format!(
            "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
             [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
             [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nairgap_mm = {gap}\n\
             slot_opening_mm = 0.2\n"
        ));
        let c = beltwright::inductance::phase_conductors(&w);
        let wf = beltwright::inductance::winding_function_matrix(&w, &c).expect("1-D");
        let sets: Vec<Vec<f64>> = (0..3).map(|s| c.iter().map(|r| r[s]).collect()).collect();
        let (layers, _) = beltwright::layers::gap_inductances(&w, &sets).expect("layers");
        (wf, layers)
    };
    let (wf, layers) = both(0.1);
    for q in 0..3 {
        for p in 0..3 {
            assert!(
                (layers[q][p] / wf[q][p] - 1.0).abs() < 0.001,
                "{q}{p}: {} against {}",
                layers[q][p],
                wf[q][p]
            );
        }
    }
    let (wf, layers) = both(1.0);
    assert!(layers[0][0] > wf[0][0] * 1.005);
}

// A long pole pitch over a good plate at a small clearance asks for millions of
// wavenumbers (a field trailing kilometres, waves shorter than the gap): the grid is
// bounded at MAX_WAVENUMBERS, the figures stay finite, and the report says what was cut.
#[test]
fn a_huge_grid_is_bounded_and_said() {
    let w = wind(
        "[machine]\ntopology = \"linear\"\nslots = 29\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 40\n\
         [core]\nslot_pitch_mm = 200.0\nstack_mm = 400.0\nairgap_mm = 1.0\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [secondary]\nmaterial = \"copper\"\nthickness_mm = 10.0\nwidth_mm = 600.0\n",
    );
    let q = ThrustQuery {
        current_a: Some(10.0),
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 1,
        end_effect: true,
    };
    let r = thrust::thrust(&w, &q).expect("model");
    assert!(r.field_model.wavenumbers <= beltwright::layers::MAX_WAVENUMBERS);
    assert!(r.field_model.window_m < r.field_model.window_wanted_m);
    assert!(r.field_model.rows.iter().all(|x| x.thrust_n.is_finite()));
    assert!(r.assumptions.iter().any(|a| matches!(
        a,
        beltwright::assumption::Assumption::FieldGridBounded { .. }
    )));
}
