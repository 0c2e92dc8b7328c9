//! Two separate windings in one core (a two-winding, two-speed motor), against closed forms:
//! - the flux a winding links in another's gap field is computed by the study from the
//!   stepped MMF of the slot currents (`two_winding::phase_linkages`); here the same linkage
//!   is summed as a Fourier series of the slot currents, each order's MMF c_n/(jn) and
//!   linkage (e^{jnθ_b} − e^{jnθ_g})/(jn), folded onto the S discrete orders with
//!   Σ_k 1/(r + kS)² = (π/S)²/sin²(πr/S) (Abramowitz and Stegun 4.3.92, from memory);
//! - a winding of p pole pairs on a core whose windings are integral-slot links only the
//!   mechanical orders p·μ, μ odd, and a balanced three-phase winding's MMF has no triplen
//!   orders (any machines text, e.g. Say, *Alternating Current Machines*, ch. 4): so 4 and 6
//!   poles on 36 slots (orders 2ν against 3μ, never equal with ν, μ odd) do not couple at
//!   all, while a 12-pole field reaches a 4-pole winding only at its triplen orders, whose
//!   EMFs are in phase in all three phases (zero sequence): round a delta they add to three
//!   times one phase's;
//! - with the 12-pole winding full pitch at q = 1 (k_w = 1 at every odd order) and the
//!   4-pole winding at span 7 of 9, q = 3 (|k_w| = 1/3 at orders 3, 15, 21, 33, ... by Say's
//!   k_p = sin(ν·y·π/(2τ)) and k_d = sin(ν·q·α/2)/(q·sin(ν·α/2))), the idle 4-pole phase
//!   links N_4·(1/3)/N_12 of what the running 12-pole phase links: in the example
//!   (36 coils of 23 turns, 18 of 72) 276/3/432 = 23/108.

mod common;

use beltwright::layout;
use beltwright::two_winding::{Finding, TwoStudy, phase_linkages};
use beltwright::winding::{self, Winding, star};
use num_complex::Complex64;
use serde_json::Value;
use std::f64::consts::PI;

const HOIST: &str = "layouts/hoist-two-winding.toml";
const RECORD: &str = "layouts/hoist-two-winding-as-found.toml";

fn pair(text: &str) -> (Winding, Winding, beltwright::spec::Sharing) {
    let spec = layout::parse(text, "test.toml").unwrap_or_else(|e| panic!("{e}"));
    let second = spec.second.clone().expect("a second winding");
    (
        winding::build(&spec).unwrap_or_else(|e| panic!("{e}")),
        winding::build(&second.spec).unwrap_or_else(|e| panic!("{e}")),
        second.sharing,
    )
}

fn two(
    slots: usize,
    first: (usize, usize, usize, &str),
    second: (usize, usize, usize, &str),
) -> String {
    let (p1, l1, y1, c1) = first;
    let (p2, l2, y2, c2) = second;
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {p1}\n\n\
         [winding]\nlayers = {l1}\npitch = {y1}\nturns_per_coil = 10\nconnection = \"{c1}\"\n\n\
         [second_winding]\npoles = {p2}\nlayers = {l2}\npitch = {y2}\nturns_per_coil = 30\n\
         connection = \"{c2}\"\n\n[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n"
    )
}

/// The same linkage as `phase_linkages`, by the folded Fourier series.
fn by_series(running: &Winding, idle: &Winding) -> Vec<Complex64> {
    let m = running.geometry.phases;
    let ops: Vec<Complex64> = (0..m).map(|k| star::phase_operator(k, m)).collect();
    let slot = star::slot_currents(running, &ops);
    let s = slot.len();
    let e =
        |n: usize, k: usize| Complex64::from_polar(1.0, 2.0 * PI * (n * k % s) as f64 / s as f64);
    let c: Vec<Complex64> = (0..s)
        .map(|r| {
            slot.iter()
                .enumerate()
                .map(|(k, i)| i * e(r, k).conj())
                .sum()
        })
        .collect();
    let a = idle.parallel_paths as f64;
    let mut out = vec![Complex64::new(0.0, 0.0); idle.geometry.phases];
    for coil in &idle.coils {
        let mut l = Complex64::new(0.0, 0.0);
        for (r, cr) in c.iter().enumerate().skip(1) {
            let fold = 1.0 / (PI * r as f64 / s as f64).sin().powi(2);
            l += cr * (e(r, coil.back) - e(r, coil.go)) * fold;
        }
        // −(S/4π²)·Σ c_r·(…)·(π/S)²/sin² in slot pitches.
        out[coil.phase] += -l / (4.0 * s as f64) * (coil.turns as f64 / a);
    }
    out
}

#[test]
fn linkages_agree_with_the_fourier_series() {
    for text in [
        two(36, (4, 2, 7, "delta"), (12, 1, 3, "star")),
        two(36, (4, 2, 8, "star"), (6, 2, 5, "delta")),
        two(48, (4, 2, 10, "star"), (16, 2, 2, "star")),
        two(54, (6, 2, 8, "delta"), (10, 2, 5, "star")),
        two(24, (2, 2, 9, "star"), (8, 1, 3, "delta")),
    ] {
        let (w1, w2, _) = pair(&text);
        for (r, i) in [(&w1, &w2), (&w2, &w1), (&w1, &w1), (&w2, &w2)] {
            let stepped = phase_linkages(r, i);
            let series = by_series(r, i);
            let scale = phase_linkages(r, r)
                .iter()
                .map(|x| x.norm())
                .fold(0.0, f64::max);
            for (a, b) in stepped.iter().zip(&series) {
                assert!(
                    (a - b).norm() < 1e-9 * scale,
                    "{text}: stepped {a} against series {b}"
                );
            }
        }
    }
}

#[test]
fn windings_of_four_and_six_poles_do_not_couple() {
    let (w1, w2, sharing) = pair(&two(36, (4, 2, 8, "delta"), (6, 2, 5, "delta")));
    let t = TwoStudy::new([&w1, &w2], [None, None], sharing);
    for c in &t.report().couplings {
        assert!(c.phase_ratio < 1e-12, "{c:?}");
        assert!(c.loop_ratio.expect("deltas") < 1e-12, "{c:?}");
    }
    assert!(t.report().findings.is_empty(), "{:?}", t.report().findings);
}

#[test]
fn parallel_paths_half_a_core_apart_circulate_under_an_odd_order_field() {
    // The 4-pole winding in two paths, one pole pair each, half the core apart; the
    // 6-pole field's mechanical order 3 turns through 3·180° between them, so the two
    // paths' EMFs are equal and opposite (closed form): the phase as a whole links
    // nothing, yet a current circulates between its paths.
    let text = two(36, (4, 2, 8, "star"), (6, 2, 5, "star")).replacen(
        "connection = \"star\"",
        "connection = \"star\"\nparallel_paths = 2",
        1,
    );
    let (w1, w2, sharing) = pair(&text);
    assert_eq!(w1.parallel_paths, 2);
    let paths = beltwright::two_winding::path_linkages(&w2, &w1);
    let scale = phase_linkages(&w2, &w2)[0].norm();
    for p in &paths {
        assert!((p[0] + p[1]).norm() < 1e-9 * scale, "{p:?}");
        assert!(p[0].norm() > 1e-3 * scale, "{p:?}");
    }
    let t = TwoStudy::new([&w1, &w2], [None, None], sharing);
    let r = t.report();
    assert!(r.couplings[1].phase_ratio < 1e-12);
    assert!(matches!(
        r.findings.as_slice(),
        [Finding::PathsCirculate {
            running: 1,
            idle: 0,
            ..
        }]
    ));
    // Each winding's own sheets then say it is not sound to wind from.
    assert!(
        t.studies()
            .iter()
            .all(|s| s.sound() == beltwright::study::Soundness::Pair)
    );
}

#[test]
fn a_twelve_pole_field_drives_a_zero_sequence_emf_round_the_four_pole_delta() {
    // The example with its 4-pole delta closed inside (three leads).
    let text = std::fs::read_to_string(HOIST)
        .expect("example")
        .replace("leads = 6 ", "leads = 3 ");
    let (w1, w2, sharing) = pair(&text);
    let t = TwoStudy::new([&w1, &w2], [None, None], sharing);
    let r = t.report();
    let c = &r.couplings[1];
    assert_eq!((c.running, c.idle), (1, 0));
    assert!(
        (c.phase_ratio - 23.0 / 108.0).abs() < 1e-12,
        "{}",
        c.phase_ratio
    );
    let loop_ratio = c.loop_ratio.expect("a delta");
    assert!((loop_ratio - 3.0 * c.phase_ratio).abs() < 1e-12);
    // All of it zero sequence: the loop current takes it up, nothing is left between the
    // closed delta's leads.
    assert!(c.line_ratio.expect("closed delta") < 1e-12);
    // At 400 V in star, each 12-pole phase is at 400/√3 V.
    let loop_v = 400.0 / 3f64.sqrt() * 3.0 * 23.0 / 108.0;
    assert!((c.loop_v.expect("volts") - loop_v).abs() < 1e-9);
    // The other way the orders never meet: the 12-pole winding sees nothing.
    assert!(r.couplings[0].phase_ratio < 1e-12);
    assert!(matches!(
        r.findings.as_slice(),
        [Finding::ClosedDeltaLoop {
            running: 1,
            idle: 0,
            ..
        }]
    ));
    // Brought out open (six leads), the delta is the contactor's to keep open: no finding.
    let (w1, w2, sharing) = pair(&std::fs::read_to_string(HOIST).expect("example"));
    let t = TwoStudy::new([&w1, &w2], [None, None], sharing);
    assert!(t.report().findings.is_empty(), "{:?}", t.report().findings);
    // The command says so and exits 1.
    let f = common::temp_layout(&text);
    let out = common::run(&["audit", f.path().to_str().expect("path")]);
    assert_eq!(out.status.code(), Some(1));
    let said = String::from_utf8_lossy(&out.stdout);
    assert!(said.contains("round its delta"), "{said}");
}

#[test]
fn the_example_plans_both_windings_balanced_with_their_speeds_leads() {
    let v = common::json(&["plan", HOIST, "--format", "json"]);
    assert_eq!(v["kind"], "two-winding");
    // The contract's plan fields are the first winding's, the second's are its own.
    assert_eq!(v["balanced"], true);
    assert_eq!(v["second_winding"]["balanced"], true);
    assert_eq!(v["coils"].as_array().map(Vec::len), Some(36));
    assert_eq!(
        v["second_winding"]["coils"].as_array().map(Vec::len),
        Some(18)
    );
    let parts = v["pair"]["windings"].as_array().expect("windings");
    // IEC 60034-8 numbers the speeds from the lowest in front of the marks; the 4-pole
    // winding is the high speed (from memory).
    assert_eq!(parts[0]["poles"], 4);
    assert_eq!(parts[0]["speed"], "high");
    assert_eq!(parts[1]["speed"], "low");
    let leads = |i: usize| -> Vec<String> {
        parts[i]["leads"]
            .as_array()
            .expect("leads")
            .iter()
            .map(|x| x.as_str().expect("name").to_string())
            .collect()
    };
    assert_eq!(leads(0), ["2U1", "2V1", "2W1", "2U2", "2V2", "2W2"]);
    assert_eq!(leads(1), ["1U", "1V", "1W"]);
    // Both windings' wire in every slot: the pair's fill is the sum of each card's.
    let fill = |w: &Value| w["slot_fill"].as_f64().expect("fill");
    let card = common::json(&["card", HOIST, "--format", "json"]);
    let sum = fill(&card) + fill(&card["second_winding"]);
    assert!((card["pair"]["slot_fill"].as_f64().expect("pair fill") - sum).abs() < 1e-12);
    assert!(common::run(&["audit", HOIST]).status.success());
}

#[test]
fn nema_marks_the_high_speed_winding_from_t11() {
    // NEMA MG 1's two-winding scheme: T1–T3 the low speed, T11–T13 the high (from memory).
    let text = std::fs::read_to_string(HOIST)
        .expect("example")
        .replace("leads = 6 ", "leads = 3 ")
        .replace(
            "connection = \"delta\"",
            "connection = \"star\"\nmarking = \"nema\"",
        );
    let f = common::temp_layout(&text);
    let v = common::json(&["plan", f.path().to_str().expect("path"), "--format", "json"]);
    let parts = v["pair"]["windings"].as_array().expect("windings");
    assert_eq!(parts[0]["leads"], serde_json::json!(["T11", "T12", "T13"]));
    assert_eq!(parts[1]["leads"], serde_json::json!(["T1", "T2", "T3"]));
}

#[test]
fn the_held_back_record_has_one_reversed_coil_in_the_twelve_pole_winding() {
    let out = common::run(&["audit", RECORD, "--format", "json"]);
    assert_eq!(out.status.code(), Some(1));
    let v: Value = serde_json::from_slice(&out.stdout).expect("json");
    // The 4-pole winding as found has no findings; the 12-pole exactly the reversed coil.
    assert_eq!(v["findings"].as_array().map(Vec::len), Some(0));
    let found = v["second_winding"]["findings"]
        .as_array()
        .expect("findings");
    assert_eq!(found.len(), 1, "{found:?}");
    assert_eq!(found[0]["kind"], "reversed_coil");
    let message = found[0]["message"].as_str().expect("message");
    assert!(message.contains("slot 22"), "{message}");
    // The top level's verdict is the whole core's.
    assert_eq!(v["sound"], false);
    // Against the design, the same coil and nothing else.
    let out = common::run(&["audit", RECORD, "--intended", HOIST, "--format", "json"]);
    let v: Value = serde_json::from_slice(&out.stdout).expect("json");
    assert_eq!(v["findings"].as_array().map(Vec::len), Some(0));
    assert_eq!(v["second_winding"]["sound"], false);
}

#[test]
fn bad_two_winding_layouts_exit_2_naming_the_key() {
    let base = std::fs::read_to_string(HOIST).expect("example");
    for (from, to, key) in [
        ("poles = 12", "poles = 4", "second_winding.poles"),
        ("poles = 12", "poles = 11", "second_winding.poles"),
        ("pitch = 3 ", "pitch = 40 ", "second_winding.pitch"),
        ("leads = 6 ", "leads = 9 ", "winding.leads"),
        ("sharing = \"layers\"", "sharing = \"alternate\"", "sharing"),
        (
            "turns_per_coil = 72",
            "turns_per_coil = 72\nbogus = 1",
            "bogus",
        ),
        (
            "[winding]",
            "[winding]\npole_change = \"star-double-star\"",
            "winding.pole_change",
        ),
    ] {
        assert!(base.contains(from), "{from}");
        let f = common::temp_layout(&base.replacen(from, to, 1));
        let out = common::run(&["plan", f.path().to_str().expect("path")]);
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{to}: {err}");
        assert!(err.contains(key), "{to}: {err}");
    }
    // A coil of a second winding the layout does not have.
    let f = common::temp_layout(&format!(
        "{}\n[[coil]]\nwinding = 3\nphase = \"U\"\ngo = 1\nback = 4\n",
        base
    ));
    let out = common::run(&["plan", f.path().to_str().expect("path")]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("coil[1].winding"));
    // Commands for one winding say what serves the pair.
    let out = common::run(&["pitch", HOIST]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("two windings"));
}

#[test]
fn sheets_and_the_page_carry_both_windings() {
    let dir = tempfile::tempdir().expect("dir");
    let html = dir.path().join("hoist.html");
    let out = common::run(&["report", HOIST, "-o", html.to_str().expect("path")]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let page = std::fs::read_to_string(&html).expect("page");
    for want in [
        "Two windings in one core",
        "4-pole winding: Plan",
        "12-pole winding: Plan",
        "4-pole winding, bottom",
        "12-pole winding, top",
        "2U1",
        "1U",
    ] {
        assert!(page.contains(want), "{want}");
    }
    assert!(!page.contains("id=\"unsound\""));
    let svg = dir.path().join("c.svg");
    let out = common::run(&[
        "draw",
        HOIST,
        "--sheet",
        "connections",
        "-o",
        svg.to_str().expect("path"),
    ]);
    assert!(out.status.success());
    // One connection sheet per winding: the second written as c-2.svg.
    let second = std::fs::read_to_string(dir.path().join("c-2.svg")).expect("second sheet");
    assert!(
        second.contains("1U"),
        "the 12-pole sheet marks its leads 1U"
    );
}

#[test]
fn the_second_winding_keeps_its_own_wire_and_rating_and_refusals_name_its_lines() {
    let base = std::fs::read_to_string(HOIST).expect("example");
    // The first winding's insulated diameter and strands are not the second's wire.
    let text = base.replacen(
        "diameter_mm = 1.12",
        "diameter_mm = 1.12\ninsulated_diameter_mm = 1.25\nstrands_in_hand = 2",
        1,
    );
    let f = common::temp_layout(&text);
    let card = common::json(&["card", f.path().to_str().expect("path"), "--format", "json"]);
    assert_eq!(card["wire"]["strands_in_hand"], 2);
    let second = &card["second_winding"]["wire"];
    assert_eq!(second["strands_in_hand"], 1);
    assert!((second["diameter_mm"].as_f64().expect("d") - 1.06).abs() < 1e-9);
    assert!(second["insulated_diameter_mm"].as_f64().expect("ins") < 1.2);
    // Its rating is its own, not the first winding's connection or efficiency.
    let plate = &card["second_winding"]["nameplate"];
    assert_eq!(plate["power_w"], 1100.0);
    assert!(
        plate.get("connection").is_none_or(Value::is_null),
        "{plate}"
    );
    // A bad value written in [second_winding] is named there, with its own line.
    let bad = base.replacen("current_a = 4.8", "current_a = -3.0", 1);
    let line = bad
        .lines()
        .position(|l| l.starts_with("current_a = -3.0"))
        .expect("line")
        + 1;
    let f = common::temp_layout(&bad);
    let out = common::run(&["plan", f.path().to_str().expect("path")]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        err.contains(&format!("line {line}: second_winding.current_a")),
        "{err}"
    );
}

const BY_SLOTS: &str = "[machine]\ntopology = \"rotary\"\nslots = 48\npoles = 4\n\n\
    [winding]\nlayers = 2\npitch = 10\nturns_per_coil = 20\n\n\
    [second_winding]\npoles = 8\nsharing = \"slots\"\nlayers = 2\npitch = 6\n\
    turns_per_coil = 30\n\n[core]\nbore_mm = 140.0\nstack_mm = 100.0\n\
    slot_area_mm2 = 90.0\n\n[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n\n\
    [wire]\ndiameter_mm = 0.9\n";

#[test]
fn windings_sharing_by_slots_lie_in_their_own_slots_with_the_half_cores_factors() {
    let (w1, w2, sharing) = pair(BY_SLOTS);
    assert_eq!(sharing, beltwright::spec::Sharing::Slots);
    // Each in every other slot: the first in slots 1, 3, 5, … (0-based even), the second
    // in 2, 4, 6, ….
    for (w, parity) in [(&w1, 0), (&w2, 1)] {
        assert_eq!(w.geometry.slots, 48);
        assert!(
            w.coils
                .iter()
                .all(|c| c.go % 2 == parity && c.back % 2 == parity)
        );
        assert!(w.is_balanced());
    }
    // On its 24 slots the 4-pole winding has q = 2 and span 5 of 6: k_d = sin(q·α/2) /
    // (q·sin(α/2)) with α = 30°, k_p = sin(5/6·90°) (Say's factors): both cos 15°. The
    // 8-pole one is full pitch at q = 1: k_w1 = 1.
    let kw = |w: &beltwright::winding::Winding| {
        let e = w
            .phase_emf(0, beltwright::winding::Elec::FUNDAMENTAL)
            .norm();
        let n: f64 = w
            .coils
            .iter()
            .filter(|c| c.phase == 0)
            .map(|c| c.turns as f64)
            .sum();
        e / n
    };
    let c15 = (15f64).to_radians().cos();
    assert!((kw(&w1) - c15 * c15).abs() < 1e-12, "{}", kw(&w1));
    assert!((kw(&w2) - 1.0).abs() < 1e-12, "{}", kw(&w2));
    // Each slot holds one winding: the pair's fill is the fuller winding's, not the sum;
    // 4 and 8 poles never couple (orders 2ν against 4μ, ν and μ odd).
    let t = TwoStudy::new([&w1, &w2], [None, None], sharing);
    let r = t.report();
    let fills = [
        t.studies()[0].card().slot_fill,
        t.studies()[1].card().slot_fill,
    ]
    .map(|f| f.expect("fill"));
    assert_eq!(r.slot_fill, Some(fills[0].max(fills[1])));
    assert!(r.couplings.iter().all(|c| c.phase_ratio < 1e-12));
    // An odd slot count or an odd span cannot be shared so.
    for (from, to, key) in [
        ("slots = 48", "slots = 47", "machine.slots"),
        ("pitch = 6", "pitch = 5", "second_winding.pitch"),
    ] {
        let f = common::temp_layout(&BY_SLOTS.replacen(from, to, 1));
        let out = common::run(&["plan", f.path().to_str().expect("path")]);
        assert_eq!(out.status.code(), Some(2));
        assert!(String::from_utf8_lossy(&out.stderr).contains(key), "{to}");
    }
}

#[test]
fn a_record_sharing_by_slots_finds_a_coil_laid_in_the_other_windings_slots() {
    // The by-slots core as planned, written coil by coil, with one 8-pole coil laid a slot
    // along: into slots of the 4-pole winding. The audit must say where it belongs (one
    // edit), not that a slot holds more than its layers.
    let plan = common::json(&[
        "plan",
        common::temp_layout(BY_SLOTS).path().to_str().expect("path"),
        "--format",
        "json",
    ]);
    let mut text = BY_SLOTS
        .replace("pitch = 10\n", "")
        .replace("pitch = 6\n", "");
    let coil = |c: &Value, winding: u8, shift: u64| {
        format!(
            "\n[[coil]]\nwinding = {winding}\nphase = \"{}\"\ngo = {}\nback = {}\n",
            c["phase"].as_str().expect("phase"),
            c["go"].as_u64().expect("go") + shift,
            c["back"].as_u64().expect("back") + shift
        )
    };
    for c in plan["coils"].as_array().expect("coils") {
        text.push_str(&coil(c, 1, 0));
    }
    let second = plan["second_winding"]["coils"].as_array().expect("coils");
    for (i, c) in second.iter().enumerate() {
        text.push_str(&coil(c, 2, u64::from(i == 4)));
    }
    let moved = &second[4];
    let f = common::temp_layout(&text);
    let out = common::run(&[
        "audit",
        f.path().to_str().expect("path"),
        "--format",
        "json",
    ]);
    assert_eq!(out.status.code(), Some(1));
    let v: Value = serde_json::from_slice(&out.stdout).expect("json");
    assert_eq!(
        v["findings"].as_array().map(Vec::len),
        Some(0),
        "{}",
        v["findings"]
    );
    let found = v["second_winding"]["findings"]
        .as_array()
        .expect("findings");
    assert_eq!(found.len(), 1, "{found:?}");
    assert_eq!(found[0]["kind"], "coil_wrong_slots");
    let message = found[0]["message"].as_str().expect("message");
    let home = format!(
        "in at slot {}, out at slot {}",
        moved["go"].as_u64().expect("go"),
        moved["back"].as_u64().expect("back")
    );
    assert!(message.contains(&home), "{message}");
}

/// Every JSON a pair gives opens as every JSON does: `schema_version`, then the caution
/// (the contract of `shared/design.md`), in every view, for a planned pair (whose audit has
/// no record of its own) and a recorded one; and the audit's top-level verdict is there.
#[test]
fn every_view_of_a_pair_opens_with_the_version_and_the_caution() {
    for file in [HOIST, "layouts/hoist-two-winding-as-found.toml"] {
        for view in ["plan", "factors", "field", "card", "audit"] {
            let o = common::run(&[view, file, "--format", "json"]);
            let text = String::from_utf8_lossy(&o.stdout);
            assert!(
                text.starts_with("{\n  \"schema_version\": 3,\n  \"caution\": \"CAUTION:"),
                "{view} {file}: {}",
                &text[..text.len().min(120)]
            );
            let v: Value = serde_json::from_str(&text).expect("JSON");
            assert_eq!(v["kind"], "two-winding", "{view} {file}");
            if view == "audit" {
                assert!(v["sound"].is_boolean(), "{file}");
            }
        }
    }
}
