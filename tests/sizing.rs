//! A bare core to a winding (`size`) and the loadings of a winding on its core (`loading`):
//! a published worked design reproduced to its printed digits, hand calculations by the
//! closed forms, the round trip through a written layout, and bad input refused.

mod common;

use std::f64::consts::PI;

use assert_cmd::Command;
use beltwright::loading::{self, Limits};
use beltwright::sizing::{self, Request};
use beltwright::winding::{self, Winding};
use beltwright::{card, layout};

fn spec(src: &str) -> layout::Spec {
    layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}"))
}

fn wind(src: &str) -> Winding {
    winding::build(&spec(src)).unwrap_or_else(|e| panic!("{e}"))
}

/// The stator of A. Nagarkar and S. Srinivas, "An Optimized Rotor Design of Synchronous
/// Reluctance Motor for Improved Torque Characteristics" (IIT Madras; IEEE conference
/// paper), Tables I–III: 36 slots, 4 poles, 415 V, 1500 rpm (50 Hz); bore 129.8 mm, stack
/// 153 mm, tooth 5.8 mm, back iron 17.8 mm, stacking factor 0.95; k_w 0.945, which is a
/// double-layer winding at span 8 of 9. Its N1 formula has the √3 of a star connection.
fn published_core(extra: &str) -> String {
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 8\nconnection = \"star\"\n{extra}\n\
         [core]\nbore_mm = 129.8\nstack_mm = 153.0\ntooth_width_mm = 5.8\n\
         yoke_depth_mm = 17.8\nstacking_factor = 0.95\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 415.0\n"
    )
}

/// The paper's design values (Table II): gap 0.78 T, teeth 1.6 T, back iron 1.5 T, K_E 0.97.
fn published_request() -> Request {
    Request {
        limits: Limits {
            gap_t: 0.78,
            tooth_t: 1.6,
            yoke_t: 1.5,
            ..Limits::default()
        },
        emf_ratio: 0.97,
        ..Request::default()
    }
}

#[test]
fn published_design_is_reproduced_to_its_printed_digits() {
    let s = spec(&published_core(""));
    let z = size_of(&s, &published_request()).expect("sizes");
    // Printed pole pitch τ = 101.94 mm (Table III).
    let w = wind(&published_core(""));
    assert_eq!(format!("{:.2}", w.pole_pitch().unwrap().mm()), "101.94");
    // k_w 0.945 (Table II): distribution × pitch of 36 slots, 4 poles, span 8.
    assert_eq!(format!("{:.3}", z.winding_factor), "0.945");
    // N1 = 144 turns per phase (Table III), from eq. 18 rounded to whole turns per coil.
    let best = &z.candidates[0];
    assert_eq!(best.connection, beltwright::design::Connection::Star);
    assert_eq!(best.parallel_paths, 1);
    assert_eq!(best.series_turns, 144.0);
    // The densities the printed turns (N1 = 144) give in the printed teeth (t = 5.8 mm) and
    // back iron (t_y = 17.8 mm): the paper's B_ts = 1.6 T and B_cs = 1.5 T (Table II), to the
    // digits printed (the paper found t and t_y from them with its unrounded N1).
    let m = &z.loading.magnetic;
    assert_eq!(format!("{:.1}", m.tooth.unwrap().peak_t), "1.6");
    assert_eq!(format!("{:.1}", m.yoke.unwrap().peak_t), "1.5");
    assert_eq!(m.series_turns, 144.0);
}

/// The stripped core of `layouts/stripped-core.toml` with its winding given.
fn stripped(winding: &str) -> String {
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
         [winding]\nlayers = 2\n{winding}\n\
         [core]\nbore_mm = 130.0\noutside_diameter_mm = 210.0\nstack_mm = 110.0\n\
         slot_depth_mm = 16.5\ntooth_width_mm = 5.4\nstacking_factor = 0.95\n\
         [wire]\ndiameter_mm = 1.25\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
         [nameplate]\npower_kw = 5.5\nvoltage_v = 400\nefficiency_percent = 88.0\n\
         power_factor = 0.83\ninsulation_class = \"F\"\n"
    )
}

// Hand calculation by the closed forms (Say 1983 §4.3 EMF equation; tooth and back-iron
// sections as in `loading`), worked here independently of the library:
//   k_w1 = k_d·k_p, k_d = sin(q·α/2)/(q·sin(α/2)) with q = 3, α = 20°; k_p = sin(7/9·90°)
//   N_ph = 12 coils × 29 turns = 348; Φ = 400/(√2·π·50·348·k_w1)
//   B̂_δ = π·Φ/(2·τ·L), τ = π·0.130/4; B̂_t = B̂_δ·τ_s/(0.95·5.4 mm), τ_s = π·0.130/36
//   h_y = (210 − 130)/2 − 16.5 = 23.5 mm; B̂_y = Φ/(2·0.95·0.110·0.0235)
//   I_L = 5500/(√3·400·0.88·0.83) A; delta: I_ph = I_L/√3; J = I_ph/(π/4·1.25²)
#[test]
fn loadings_of_a_rotary_core_match_the_hand_calculation() {
    let w = wind(&stripped(
        "pitch = 7\nturns_per_coil = 29\nconnection = \"delta\"",
    ));
    let l = loading::of(&w, &Limits::default(), 1.0).unwrap();
    let alpha = 20f64.to_radians();
    let kd = (3.0 * alpha / 2.0).sin() / (3.0 * (alpha / 2.0).sin());
    let kp = (7.0 / 9.0 * PI / 2.0).sin();
    let phi = 400.0 / (2f64.sqrt() * PI * 50.0 * 348.0 * kd * kp);
    let tau = PI * 0.130 / 4.0;
    let gap = PI * phi / (2.0 * tau * 0.110);
    let tooth = gap * (PI * 0.130 / 36.0) / (0.95 * 5.4e-3);
    let yoke = phi / (2.0 * 0.95 * 0.110 * 0.0235);
    let line = 5500.0 / (3f64.sqrt() * 400.0 * 0.88 * 0.83);
    let j = line / 3f64.sqrt() / (PI / 4.0 * 1.25 * 1.25);
    let m = &l.magnetic;
    let close = |a: f64, b: f64| (a / b - 1.0).abs() < 1e-12;
    assert!(
        close(m.flux_per_pole_wb, phi),
        "{} {phi}",
        m.flux_per_pole_wb
    );
    assert!(close(m.gap.peak_t, gap));
    assert!(close(m.tooth.unwrap().peak_t, tooth));
    assert!(close(m.yoke.unwrap().peak_t, yoke));
    // Mean tooth density over a pole: Φ over the 9 teeth under a pole (36/4), each
    // 0.95·5.4 mm × 110 mm of steel; the peak is π/2 of it for a sinusoidal gap field.
    let mean = phi / (9.0 * 0.95 * 5.4e-3 * 0.110);
    assert!(close(m.tooth_mean_t.unwrap(), mean));
    assert!(close(m.tooth.unwrap().peak_t, mean * PI / 2.0));
    let e = l.electric.unwrap();
    assert!(close(e.rated.line_a(), line));
    assert!(close(e.current_density_a_mm2.unwrap().value, j));
    // Electric loading: 2 × 29 conductors in a full slot, I_ph per conductor, per slot pitch.
    assert!(close(
        e.electric_loading_a_m,
        58.0 * line / 3f64.sqrt() / (PI * 0.130 / 36.0)
    ));
}

// A flat primary: 24 slots of 15 mm pitch, 4 poles, 100 mm wide, teeth 8 mm, yoke 20 mm.
// Hand calculation: q = 2, α = 30°, single layer (k_p = 1), k_w1 = sin(30°)/(2·sin(15°));
// 12 coils, 4 per phase of 60 turns: N_ph = 240; τ = 6 × 15 mm; Φ from the EMF equation,
// B̂_t = B̂_δ·15/(0.95·8), B̂_y = Φ/(2·0.95·0.100·0.020).
#[test]
fn loadings_of_a_flat_primary_match_the_hand_calculation() {
    let src = "[machine]\ntopology = \"linear\"\nslots = 24\npoles = 4\n\
               [winding]\nlayers = 1\nturns_per_coil = 60\n\
               [core]\nslot_pitch_mm = 15.0\nstack_mm = 100.0\ntooth_width_mm = 8.0\n\
               yoke_depth_mm = 20.0\nstacking_factor = 0.95\n\
               [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n";
    let w = wind(src);
    let l = loading::of(&w, &Limits::default(), 1.0).unwrap();
    // Single layer, 24 slots: 12 coils, 4 per phase, 240 series turns.
    assert_eq!(w.series_turns(0), 240.0);
    let kw = 0.5 / (2.0 * 15f64.to_radians().sin());
    let phi = 400.0 / 3f64.sqrt() / (2f64.sqrt() * PI * 50.0 * 240.0 * kw);
    let gap = PI * phi / (2.0 * 0.090 * 0.100);
    let m = &l.magnetic;
    assert!((m.winding_factor / kw - 1.0).abs() < 1e-12);
    assert!((m.gap.peak_t / gap - 1.0).abs() < 1e-12);
    assert!((m.tooth.unwrap().peak_t / (gap * 15.0 / (0.95 * 8.0)) - 1.0).abs() < 1e-12);
    assert!((m.yoke.unwrap().peak_t / (phi / (2.0 * 0.95 * 0.100 * 0.020)) - 1.0).abs() < 1e-12);
}

#[test]
fn sized_turns_keep_every_density_within_its_limit_and_one_turn_less_would_not() {
    let s = spec(&stripped(""));
    let z = size_of(&s, &Request::default()).unwrap();
    let best = &z.candidates[0];
    assert!(z.loading.magnetic.gap.peak_t <= 0.85 + 1e-12);
    assert!(z.loading.magnetic.tooth.unwrap().peak_t <= 1.8 + 1e-12);
    assert!(z.loading.magnetic.yoke.unwrap().peak_t <= 1.6 + 1e-12);
    // One turn fewer per coil passes the limit that set the flux.
    let fewer = format!(
        "pitch = {}\nturns_per_coil = {}\nparallel_paths = {}\nconnection = \"{}\"",
        z.span,
        best.turns_per_coil - 1,
        best.parallel_paths,
        best.connection
    );
    let l = loading::of(&wind(&stripped(&fewer)), &Limits::default(), 1.0).unwrap();
    assert!(
        l.warnings.iter().any(|w| matches!(
            w,
            loading::LoadingWarning::FluxDensityAbove { part, .. } if *part == z.flux_set_by
        )),
        "one turn fewer should pass the limit of the {:?}",
        z.flux_set_by
    );
}

#[test]
fn a_sized_layout_reads_back_as_the_same_winding() {
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("core.toml");
    std::fs::write(&input, stripped("")).unwrap();
    let out = dir.path().join("wound.toml");
    let json = Command::cargo_bin("beltwright")
        .unwrap()
        .args(["size", "--format", "json", "-o"])
        .arg(&out)
        .arg(&input)
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    let z: serde_json::Value = serde_json::from_slice(&json).unwrap();
    let text = std::fs::read_to_string(&out).unwrap();
    let w = wind(&text);
    let best = &z["candidates"][0];
    assert_eq!(
        w.coils[0].turns as u64,
        best["turns_per_coil"].as_u64().unwrap()
    );
    // The card and the loadings of the written layout give the sizing's figures.
    let c = card::card(&w);
    let r = z["phase_resistance_20c_ohm"].as_f64().unwrap();
    assert!((c.phase_resistance_20c_ohm.unwrap() / r - 1.0).abs() < 1e-12);
    let l = loading::of(&w, &Limits::default(), 1.0).unwrap();
    let t = z["loading"]["magnetic"]["tooth"]["peak_t"]
        .as_f64()
        .unwrap();
    assert!((l.magnetic.tooth.unwrap().peak_t / t - 1.0).abs() < 1e-12);
    // The plan takes it as it is.
    Command::cargo_bin("beltwright")
        .unwrap()
        .arg("plan")
        .arg(&out)
        .assert()
        .success();
}

fn refused(src: &str, args: &[&str]) -> String {
    let dir = tempfile::tempdir().unwrap();
    let input = dir.path().join("core.toml");
    std::fs::write(&input, src).unwrap();
    let out = Command::cargo_bin("beltwright")
        .unwrap()
        .args(args)
        .arg(&input)
        .assert()
        .code(2)
        .get_output()
        .clone();
    String::from_utf8(out.stderr).unwrap()
}

#[test]
fn a_core_that_does_not_close_is_refused_naming_its_keys() {
    let wide = stripped("").replace("tooth_width_mm = 5.4", "tooth_width_mm = 12.0");
    let e = refused(&wide, &["size"]);
    assert!(
        e.contains("core.tooth_width_mm") && e.contains("bore_mm"),
        "{e}"
    );
    let deep = stripped("").replace("slot_depth_mm = 16.5", "slot_depth_mm = 45.0");
    let e = refused(&deep, &["size"]);
    assert!(
        e.contains("core.outside_diameter_mm") && e.contains("slot_depth_mm"),
        "{e}"
    );
    let both = stripped("").replace(
        "tooth_width_mm = 5.4",
        "tooth_width_mm = 5.4\nslot_width_mm = 8.0",
    );
    let e = refused(&both, &["size"]);
    assert!(
        e.contains("core.tooth_width_mm") && e.contains("slot pitch"),
        "{e}"
    );
}

#[test]
fn limits_outside_physical_ranges_and_unworkable_voltages_are_refused() {
    let e = refused(&stripped(""), &["size", "--tooth-t", "3"]);
    assert!(e.contains("--tooth-t") && e.contains("0.5 to 2.4"), "{e}");
    // 1 V on this core needs a small fraction of a turn per coil.
    let low = stripped("").replace("line_voltage_v = 400.0", "line_voltage_v = 1.0");
    let e = refused(&low, &["size"]);
    assert!(
        e.contains("no whole number of turns") && e.contains("would work"),
        "{e}"
    );
    assert!(!e.contains("NaN") && !e.contains("inf"), "{e}");
}

#[test]
fn a_flat_primary_is_sized_like_a_rotary_core() {
    let src = "[machine]\ntopology = \"linear\"\nslots = 27\npoles = 4\n\
               [winding]\nlayers = 2\n\
               [core]\nslot_pitch_mm = 15.0\nstack_mm = 100.0\ntooth_width_mm = 8.0\n\
               yoke_depth_mm = 20.0\nslot_depth_mm = 40.0\n\
               [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\
               [nameplate]\ncurrent_a = 8.0\n";
    let z = size_of(&spec(src), &Request::default()).unwrap();
    // Hand calculation of the flux each part carries at its default limit (0.85, 1.8, 1.6
    // T), with the plan's pole pitch τ: gap Φ = (2/π)·0.85·τ·L; teeth
    // Φ = (2/π)·(1.8·0.95·8/15)·τ·L; back iron Φ = 2·1.6·0.95·0.100·0.020. The least sets it.
    let tau = wind(&src.replace("layers = 2", "layers = 2\nturns_per_coil = 1"))
        .pole_pitch()
        .unwrap()
        .m();
    let gap = 2.0 / PI * 0.85 * tau * 0.100;
    let teeth = 2.0 / PI * (1.8 * 0.95 * 8.0 / 15.0) * tau * 0.100;
    let yoke = 2.0 * 1.6 * 0.95 * 0.100 * 0.020;
    let least = gap.min(teeth).min(yoke);
    assert!((z.flux_limit_wb / least - 1.0).abs() < 1e-12);
    let part = if least == gap {
        loading::Part::Gap
    } else if least == teeth {
        loading::Part::Teeth
    } else {
        loading::Part::Yoke
    };
    assert_eq!(z.flux_set_by, part, "{gap} {teeth} {yoke}");
    assert!(z.loading.magnetic.tooth.unwrap().peak_t <= 1.8 + 1e-12);
    let j = z.loading.electric.unwrap().current_density_a_mm2.unwrap();
    assert!(j.value <= j.limit);
}

/// The pallet-shuttle primary of `layouts/` with a back-iron depth: a demo scenario, used
/// here only for properties that hold whatever its numbers.
fn shuttle() -> String {
    std::fs::read_to_string("layouts/pallet-shuttle.toml")
        .unwrap()
        .replace(
            "slot_depth_mm = 10.0",
            "slot_depth_mm = 10.0\nyoke_depth_mm = 15.0",
        )
}

#[test]
fn a_flat_primary_sized_for_a_thrust_takes_the_most_turns_that_still_give_it() {
    let req = Request {
        thrust: Some((100.0, sizing::At::Slip(0.2))),
        ..Request::default()
    };
    let z = size_of(&spec(&shuttle()), &req).unwrap();
    let t = z.thrust.expect("thrust checked");
    assert!(t.met && t.point.thrust_n >= 100.0, "{}", t.point.thrust_n);
    // The written winding gives the same operating point as the sizing reported.
    let best = &z.candidates[0];
    assert_eq!(best.thrust_n, Some(t.point.thrust_n));
    // One turn more per coil falls short: the bisection's bound. The wire for it is the
    // sizing's own rule for a thrust (the largest standard wire that fits the slot,
    // `sizing::wire_for` with no current-density limit); the thrust model (checked against
    // published closed forms in tests/thrust*.rs) runs on that layout.
    let layout_with = |turns: u32, wire_mm: Option<f64>| {
        let text = shuttle()
            .replace("turns_per_coil = 40", &format!("turns_per_coil = {turns}"))
            .replace(
                "connection = \"star\"",
                &format!("connection = \"{}\"", best.connection),
            );
        match wire_mm {
            Some(d) => text.replace("awg = 21", &format!("diameter_mm = {d}")),
            None => text,
        }
    };
    let n = best.turns_per_coil + 1;
    let loose = Limits {
        current_density_a_mm2: f64::INFINITY,
        ..Limits::default()
    };
    let fit = sizing::wire_for(&wind(&layout_with(n, None)), 1e-9, &loose, false).unwrap();
    let w = wind(&layout_with(n, Some(fit.diameter.mm())));
    let q = beltwright::thrust::ThrustQuery {
        current_a: None,
        slip_from: 0.2,
        slip_to: 0.2,
        steps: 1,
        end_effect: true,
    };
    let r = beltwright::thrust::thrust(&w, &q).unwrap();
    assert!(r.rows[0].thrust_n < 100.0, "{}", r.rows[0].thrust_n);
    // The plate's heat is the slip power: s × air-gap power.
    assert!((t.plate_loss_w - 0.2 * t.point.airgap_power_w).abs() < 1e-9);
}

#[test]
fn a_thrust_target_is_refused_where_the_model_cannot_run() {
    let e = refused(
        &stripped(""),
        &["size", "--thrust-n", "100", "--at-slip", "0.1"],
    );
    assert!(e.contains("flat primar"), "{e}");
    // The shuttle without its plate (the file's [secondary] comes just before [supply]).
    let bare: String = shuttle().split("[secondary]").next().unwrap().to_string()
        + "[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n";
    let e = refused(&bare, &["size", "--thrust-n", "100", "--at-speed", "3"]);
    assert!(e.contains("[secondary]"), "{e}");
}

// The temperature-rise estimate by its formula (theory.md, "Electric loading, current and
// heat"), worked here from the card's resistance (tests/card.rs checks it against IEC 60028)
// and the core's sizes: Δθ = (3·I_ph²·R_115 + P_Fe)/(α·π·D_o·L), R_115 = R_20·(1 + 0.00393·95)
// (IEC 60028 copper), P_Fe = 5.30·(B/1.5)²·(f/50)^1.5 W/kg over teeth and back iron at
// 7650 kg/m³ (the grade M530-50A's loss by its EN 10106 name).
#[test]
fn temperature_rise_follows_its_stated_formula() {
    let w = wind(&stripped(
        "pitch = 7\nturns_per_coil = 29\nconnection = \"delta\"",
    ));
    let l = loading::of(&w, &Limits::default(), 1.0).unwrap();
    let h = l.heating.unwrap();
    let e = l.electric.unwrap();
    let c = card::card(&w);
    let r_hot = c.phase_resistance_20c_ohm.unwrap() * (1.0 + 0.00393 * 95.0);
    let copper = 3.0 * e.phase_current_a.powi(2) * r_hot;
    assert!((h.copper_loss_w / copper - 1.0).abs() < 1e-12);
    let m = &l.magnetic;
    let (t, hs, y, l_m, od) = (5.4e-3, 16.5e-3, 23.5e-3, 0.110, 0.210);
    let teeth_kg = 36.0 * t * hs * l_m * 0.95 * 7650.0;
    let yoke_kg = PI * (od - y) * y * l_m * 0.95 * 7650.0;
    let p = |b: f64| 5.30 * (b / 1.5).powi(2);
    let iron = teeth_kg * p(m.tooth.unwrap().peak_t) + yoke_kg * p(m.yoke.unwrap().peak_t);
    assert!((h.iron_loss_w.unwrap() / iron - 1.0).abs() < 1e-12);
    let rise = (copper + iron) / (80.0 * PI * od * l_m);
    assert!((h.rise_k.value / rise - 1.0).abs() < 1e-12);
    assert_eq!(h.rise_k.limit, 105.0); // class F, IEC 60034-1 (from memory)
    // Heat load A·J in (A/mm)·(A/mm²).
    let j = e.current_density_a_mm2.unwrap().value;
    assert!(
        (e.heat_load_a2_mm3.unwrap() / (e.electric_loading_a_m * 1e-3 * j) - 1.0).abs() < 1e-12
    );
}

#[test]
fn aluminium_wire_stays_aluminium_and_a_dual_voltage_winding_is_sized_at_its_lower_voltage() {
    let al = stripped("").replace(
        "diameter_mm = 1.25",
        "diameter_mm = 1.25\nmaterial = \"aluminium\"",
    );
    let z = size_of(&spec(&al), &Request::default()).unwrap();
    assert_eq!(
        z.chosen.wire.unwrap().material,
        beltwright::design::Material::Aluminium
    );
    // 12 leads, 230/460 V stamped, the supply at 460 V: the sections run in parallel at
    // 230 V (the card's convention), so the turns are sized for 230 V on two paths.
    let dual = stripped("leads = 12\nparallel_paths = 2")
        .replace("line_voltage_v = 400.0", "line_voltage_v = 460.0")
        .replace("\nvoltage_v = 400\n", "\nvoltage_v = [230, 460]\n");
    let z = size_of(&spec(&dual), &Request::default()).unwrap();
    assert_eq!(z.line_voltage_v, 230.0);
    assert!(z.candidates.iter().all(|c| c.parallel_paths == 2));
}

#[test]
fn a_sized_record_loses_its_old_coils_readings_and_phase_resistance() {
    let record = format!(
        "{}[measured]\nline_resistance_ohm = [1.0, 1.0, 1.0]\ntemperature_c = 20.0\n\
         [[coil]]\nphase = \"U\"\ngo = 1\nback = 8\n",
        stripped("phase_resistance_ohm = 2.0")
    )
    .replace("[wire]\ndiameter_mm = 1.25\n", "");
    let text = beltwright::layout::amend(
        &record,
        &size_of(&spec(&record), &Request::default()).unwrap().chosen,
    )
    .unwrap();
    let table = |t: &str| text.lines().any(|l| l.trim_start().starts_with(t));
    assert!(!table("[[coil]]") && !table("[measured]"), "{text}");
    assert!(!text.contains("phase_resistance_ohm"), "{text}");
    let back = wind(&text);
    assert!(back.design.wire.is_some());
}

#[test]
fn a_six_lead_machine_for_two_voltages_root_three_apart_is_wound_delta_for_the_lower() {
    // 230/400 V on six leads (IEC 60034-8 marking; delta on 230 V, star on 400 V: the
    // phase voltage is 230 V either way, IEC 60050-141's √3 between line and phase).
    let src = stripped("").replace("\nvoltage_v = 400\n", "\nvoltage_v = [230, 400]\n");
    let z = size_of(&spec(&src), &Request::default()).unwrap();
    assert_eq!(z.star_delta_pair_v, Some((230.0, 400.0)));
    assert!(
        z.candidates
            .iter()
            .all(|c| c.connection == beltwright::design::Connection::Delta)
    );
    assert!(z.candidates.iter().all(|c| c.phase_voltage_v == 230.0));
}

#[test]
fn a_thrust_at_or_above_field_speed_and_a_bare_core_to_check_are_refused() {
    let e = refused(&shuttle(), &["size", "--thrust-n", "60", "--at-speed", "8"]);
    assert!(e.contains("field speed") && e.contains("below"), "{e}");
    let e = refused(&shuttle(), &["size", "--thrust-n", "60", "--at-slip", "0"]);
    assert!(e.contains("slip"), "{e}");
    let e = refused(&stripped(""), &["loading"]);
    assert!(e.contains("no turns") && e.contains("size"), "{e}");
}

#[test]
fn the_sized_wire_goes_in_and_a_thrust_sized_primary_keeps_its_current() {
    let z = size_of(&spec(&stripped("")), &Request::default()).unwrap();
    let best = &z.candidates[0];
    let text = beltwright::layout::amend(&stripped(""), &z.chosen).unwrap();
    let w = wind(&text);
    let wire = beltwright::wire::Wire::of(w.design.wire.as_ref().unwrap());
    let p = beltwright::packing::of(&w, wire.insulated_diameter.m(), wire.strands_in_hand).unwrap();
    assert!(p.fits(), "{} of {}", p.laid.len(), p.wanted);
    assert_eq!(w.coils[0].turns, best.turns_per_coil);
    // A flat primary sized for a thrust: the written layout's nameplate carries the model's
    // current, so its loadings check the current density the sizing reported.
    let req = Request {
        thrust: Some((100.0, sizing::At::Slip(0.2))),
        ..Request::default()
    };
    let z = size_of(&spec(&shuttle()), &req).unwrap();
    let text = beltwright::layout::amend(&shuttle(), &z.chosen).unwrap();
    let l = loading::of(&wind(&text), &Limits::default(), 1.0).unwrap();
    let j = l.electric.unwrap().current_density_a_mm2.unwrap().value;
    let j0 = z
        .loading
        .electric
        .unwrap()
        .current_density_a_mm2
        .unwrap()
        .value;
    assert!((j / j0 - 1.0).abs() < 1e-3, "{j} {j0}");
}

#[test]
fn a_rating_the_core_cannot_carry_says_what_it_can() {
    // 55 kW on the 5.5 kW core: no wire meets the current-density limit; the largest that
    // goes in carries J, so the power within the limit is 55 kW × J_limit / J (current
    // scales with power at the same voltage, efficiency and power factor).
    let big = stripped("").replace("power_kw = 5.5", "power_kw = 55");
    let z = size_of(&spec(&big), &Request::default()).unwrap();
    let j = z
        .fallback_wire
        .expect("the largest wire that goes in")
        .current_density_a_mm2;
    let p = z.power_within_limit_w.expect("a power within the limit");
    assert!((p / (55_000.0 * 6.0 / j) - 1.0).abs() < 1e-12);
    assert!(p < 55_000.0);
}

/// A core no balanced winding fits is refused with the plan's own reason and the slot
/// counts that would do (the rule Z = multiple of m·gcd(Z, p) for a double layer; common
/// practice), not a bare "no winding".
#[test]
fn a_core_no_winding_fits_is_refused_with_the_plans_reason() {
    let file = common::temp_layout(&stripped("").replace("slots = 36", "slots = 35"));
    let o = common::run(&["size", file.path().to_str().expect("path")]);
    assert_eq!(o.status.code(), Some(2));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains("35 slots cannot carry"), "{err}");
    assert!(err.contains("33 or 36 slots can"), "{err}");
}

/// The sizing of a parsed layout (its labels and design).
fn size_of(
    s: &beltwright::spec::Spec,
    req: &Request,
) -> Result<sizing::Sizing, sizing::SizingError> {
    sizing::size(&s.labels, &s.design, req)
}
