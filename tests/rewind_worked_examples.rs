//! Rewind worked examples: turns per coil for a changed span, connection, frequency or path
//! count on the same core, from the EMF equation E_ph = 4.44·f·N_ph·k_w1·Φ (M. G. Say,
//! *Alternating Current Machines*, 5th ed. 1983, §4.3; Pyrhönen, Jokinen, Hrabovcová, *Design
//! of Rotating Electrical Machines*, 2014, eq. 2.59).

use beltwright::design::{Connection, Design, Supply, Topology};
use beltwright::factors::closed;
use beltwright::layout::Spec;
use beltwright::rewind::{OldConductor, RewindError, rewind};
use beltwright::units::{Area, Length};
use beltwright::winding::{self, Winding};
use std::f64::consts::PI;

fn design(slots: usize, poles: usize, pitch: usize, connection: Connection, f_hz: f64) -> Spec {
    Spec::of(Design {
        pitch: Some(pitch),
        turns_per_coil: 20,
        connection,
        supply: Supply {
            frequency_hz: Some(f_hz),
            line_voltage_v: Some(400.0),
        },
        ..Design::basic(Topology::Rotary, slots, poles, 2)
    })
}

fn build(s: &Spec) -> Winding {
    winding::build(s).unwrap_or_else(|e| panic!("design refused: {e}"))
}

// 36 slots, 4 poles, q = 3, α = 20° electrical. Closed-form factors (Say 1983 §4.4;
// Pyrhönen et al. 2014 eqs. 2.29, 2.32): k_d = sin(30°)/(3·sin 10°) = 0.960,
// k_p(9/9) = 1, k_p(7/9) = sin 70° = 0.940, so k_w1 goes from 0.960 to 0.902 and the turns
// rise by 0.960/0.902.
#[test]
fn shortening_full_pitch_to_seven_ninths_raises_turns_by_the_winding_factor_ratio() {
    let old = build(&design(36, 4, 9, Connection::Star, 50.0));
    let new = build(&design(36, 4, 7, Connection::Star, 50.0));
    let r = rewind(&old, &new, None, 1, None).expect("same core");
    let kd = closed::distribution(3, 1.0, PI / 9.0);
    let kw_full = kd * closed::pitch(1.0, 1.0);
    let kw_short = kd * closed::pitch(7.0 / 9.0, 1.0);
    assert!((kw_full - 0.960).abs() < 5e-4 && (kw_short - 0.902).abs() < 5e-4);
    let want = 20.0 * kw_full / kw_short;
    assert!(
        (r.turns_per_coil_exact - want).abs() < 1e-9,
        "{}",
        r.turns_per_coil_exact
    );
    assert!((r.turns_per_coil_exact / 20.0 - 0.960 / 0.902).abs() < 2e-3);
    assert_eq!(r.turns_per_coil, 21);
    // Rounding 21.28 down to 21 turns raises the flux by 21.28/21 − 1.
    assert!((r.flux_change_percent - 100.0 * (want / 21.0 - 1.0)).abs() < 1e-9);
}

// Star to delta at the same line voltage: V_ph goes from V_L/√3 to V_L, so N_ph (and the
// turns per coil) rise by √3 (standard star/delta relation).
#[test]
fn star_to_delta_at_the_same_line_voltage_multiplies_turns_by_root_three() {
    let old = build(&design(36, 4, 7, Connection::Star, 50.0));
    let new = build(&design(36, 4, 7, Connection::Delta, 50.0));
    let r = rewind(
        &old,
        &new,
        Some(OldConductor::Diameter(Length::from_mm(1.0))),
        1,
        None,
    )
    .expect("same core");
    assert!((r.series_turns_exact / r.old.series_turns - 3f64.sqrt()).abs() < 1e-12);
    assert!((r.turns_per_coil_exact - 20.0 * 3f64.sqrt()).abs() < 1e-9);
    assert_eq!(r.turns_per_coil, 35);
    // Conductor: with the exact turns, the same copper per slot gives the area of the same
    // output in delta, where the phase current is the line current over √3 (standard), so
    // the conductor shrinks by √3.
    let c = r.conductor.expect("conductor asked for");
    let exact_area = c.new_conductor_area.mm2() * 35.0 / r.turns_per_coil_exact;
    // Area of a 1 mm wire is π/4 mm² (geometry).
    assert!((exact_area - PI / 4.0 / 3f64.sqrt()).abs() < 1e-12);
    assert!((c.old_area.mm2() - PI / 4.0).abs() < 1e-15);
    let two = c
        .options
        .iter()
        .find(|o| o.wires_in_hand == 2)
        .expect("two in hand");
    let d = two.diameter.mm();
    assert!((2.0 * PI / 4.0 * d * d - c.new_conductor_area.mm2()).abs() < 1e-12);
}

// 50 Hz to 60 Hz at the same voltage: N_ph ∝ 1/f at constant flux (EMF equation).
#[test]
fn fifty_to_sixty_hertz_scales_turns_by_five_sixths() {
    let old = build(&design(36, 4, 7, Connection::Star, 50.0));
    let new = build(&design(36, 4, 7, Connection::Star, 60.0));
    let r = rewind(&old, &new, None, 1, None).expect("same core");
    assert!((r.turns_per_coil_exact - 20.0 * 50.0 / 60.0).abs() < 1e-9);
    assert_eq!(r.turns_per_coil, 17);
    assert!((r.frequency_ratio - 1.2).abs() < 1e-15);
}

// Two parallel paths: N_ph = coils per phase × turns / paths, so the turns per coil double
// for the same series turns (definition of N_ph; Say 1983 §4.3).
#[test]
fn two_parallel_paths_double_the_turns_per_coil_and_halve_the_wire() {
    let old = build(&design(36, 4, 7, Connection::Star, 50.0));
    let mut s = design(36, 4, 7, Connection::Star, 50.0);
    s.design.parallel_paths = 2;
    let new = build(&s);
    let r = rewind(
        &old,
        &new,
        Some(OldConductor::Area(Area::from_mm2(1.2))),
        1,
        None,
    )
    .expect("same core");
    assert!((r.turns_per_coil_exact - 40.0).abs() < 1e-9);
    assert!((r.series_turns_exact - r.old.series_turns).abs() < 1e-9);
    let c = r.conductor.expect("conductor");
    assert!((c.new_conductor_area.mm2() - 0.6).abs() < 1e-12);
    assert!((c.phase_current_ratio - 1.0).abs() < 1e-12);
}

// Flux per pole from the EMF equation Φ = V_ph / (√2·π·f·N_ph·k_w1) (Say 1983 §4.3, whose
// 4.44 is √2·π = 4.4429 rounded; the sinusoid's exact constant is used).
#[test]
fn old_flux_per_pole_follows_the_emf_equation() {
    let old = build(&design(36, 4, 9, Connection::Star, 50.0));
    let r = rewind(&old, &old, None, 1, None).expect("same core");
    let kd = closed::distribution(3, 1.0, PI / 9.0);
    let phi = (400.0 / 3f64.sqrt()) / (2f64.sqrt() * PI * 50.0 * 240.0 * kd);
    assert!((r.flux_per_pole_wb.expect("supply given") - phi).abs() < 1e-12);
    assert!((r.turns_per_coil_exact - 20.0).abs() < 1e-9);
    assert!(r.flux_change_percent.abs() < 1e-9);
}

#[test]
fn a_different_core_is_refused() {
    let old = build(&design(36, 4, 9, Connection::Star, 50.0));
    let new = build(&design(48, 4, 11, Connection::Star, 50.0));
    assert!(matches!(
        rewind(&old, &new, None, 1, None),
        Err(RewindError::DifferentCore { .. })
    ));
}

#[test]
fn rewind_cli_gives_the_json_contract_and_refuses_bad_flags() {
    use assert_cmd::Command;
    let out = Command::cargo_bin("beltwright")
        .expect("binary")
        .args([
            "rewind",
            "layouts/hoist-rewind-sound.toml",
            "layouts/hoist-rewind-new.toml",
            "--wire-diameter-mm",
            "1.12",
            "--format",
            "json",
        ])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(0));
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).expect("json");
    let exact = v["turns_per_coil_exact"].as_f64().expect("exact turns");
    assert_eq!(v["turns_per_coil"].as_f64(), Some(exact.round()));
    assert!(v["conductor"]["new_conductor_area_mm2"].as_f64().is_some());

    for bad in [
        vec!["--wire-diameter-mm", "-1"],
        vec!["--wire-diameter-mm", "1", "--conductor-mm2", "1"],
        vec!["--wires-in-hand", "0"],
    ] {
        let mut args = vec![
            "rewind",
            "layouts/hoist-rewind-sound.toml",
            "layouts/hoist-rewind-new.toml",
        ];
        args.extend(bad.iter().copied());
        let out = Command::cargo_bin("beltwright")
            .expect("binary")
            .args(&args)
            .output()
            .expect("runs");
        assert_eq!(out.status.code(), Some(2), "{args:?}");
    }
    let out = Command::cargo_bin("beltwright")
        .expect("binary")
        .args([
            "rewind",
            "layouts/hoist-rewind-sound.toml",
            "layouts/pallet-shuttle.toml",
        ])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("keeps the core"));
}

// A record with one coil reversed is unbalanced: turns worked out from it would be wrong
// (the old k_w1 is too low), so the rewind refuses and points to the audit.
#[test]
fn rewind_refuses_a_faulty_record_and_points_to_audit() {
    let out = assert_cmd::Command::cargo_bin("beltwright")
        .expect("binary")
        .args([
            "rewind",
            "layouts/hoist-rewind-faulty.toml",
            "layouts/hoist-rewind-new.toml",
        ])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("beltwright audit"));
}

// Without the old supply the turns would rest on a guess: refused, naming the key.
#[test]
fn rewind_refuses_an_old_design_without_its_supply() {
    let mut old = design(36, 4, 9, Connection::Star, 50.0);
    old.design.supply = Supply::default();
    let old = build(&old);
    let new = build(&design(36, 4, 7, Connection::Star, 50.0));
    let e = rewind(&old, &new, None, 1, None).expect_err("no old supply");
    assert!(
        matches!(
            e,
            RewindError::OldSupplyMissing(beltwright::thrust::Input::LineVoltage)
        ),
        "{e}"
    );
}

// Star to delta with the old wire 1.0 mm: the new conductor is π/4/√3·(20√3/35) mm²
// (see above) = 0.4488 mm², nearest R40 size 0.75 mm (0.4418 mm², −1.6 %) for one strand.
// The new line current for the same current density: the phase current scales by the
// conductor area ratio (one path each), star line = phase, delta line = √3·phase, so a
// 10 A star winding becomes 10·(0.4488/0.7854)·√3 = 9.897 A (hand calculation).
#[test]
fn rewind_proposes_standard_wire_and_the_new_line_current() {
    let old = build(&design(36, 4, 7, Connection::Star, 50.0));
    let new = build(&design(36, 4, 7, Connection::Delta, 50.0));
    let r = rewind(
        &old,
        &new,
        Some(OldConductor::Diameter(Length::from_mm(1.0))),
        1,
        Some(10.0),
    )
    .expect("same core");
    let c = r.conductor.expect("conductor");
    let want_area = PI / 4.0 / 3f64.sqrt() * (20.0 * 3f64.sqrt() / 35.0);
    assert!((c.new_conductor_area.mm2() - want_area).abs() < 1e-12);
    let one = &c.standard_metric[0];
    assert_eq!(one.wire.strands_in_hand, 1);
    assert_eq!(one.wire.diameter.mm(), 0.75);
    let i = c.new_line_current_a.expect("old current given");
    assert!(
        (i - 10.0 * want_area / (PI / 4.0) * 3f64.sqrt()).abs() < 1e-9,
        "{i}"
    );
    // AWG: 0.4488 mm² lies nearest AWG 21 (0.7229 mm, 0.4105 mm²) or 20 (0.8128 mm,
    // 0.5189 mm²) on the ratio scale: 21 (−8.5 %) against 20 (+15.6 %).
    assert_eq!(c.standard_awg[0].wire.awg, Some(21));
}
