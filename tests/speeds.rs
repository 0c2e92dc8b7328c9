//! Both speeds of a pole-changing winding against closed forms: the distribution factor
//! k_d = sin(q·α/2)/(q·sin(α/2)) and the pitch factor k_p = sin(y·π/(2τ)) (M. G. Say,
//! *Alternating Current Machines*, 5th ed. 1983, §4.4, as `factors::closed` writes them).
//! At the lower pole count 2p the winding has q slots per 60° belt at slot angle α; at 4p
//! the slot angle is 2α and both halves of a phase, 180° apart at 2p, lie at the same
//! electrical place, so a phase is q slots at 2α (a 120° spread). Gap flux density ratio:
//! E = √2·π·f·N·k_w1·Φ and B ∝ Φ·poles (see `speeds.rs`).

mod common;

use beltwright::factors::closed;
use serde_json::Value;
use std::f64::consts::PI;

fn layout(slots: usize, poles: usize, pitch: usize, connection: &str) -> String {
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\n[winding]\n\
         layers = 2\npitch = {pitch}\nturns_per_coil = 10\npole_change = \"{connection}\"\n\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n"
    )
}

fn speeds(text: &str) -> Value {
    let f = common::temp_layout(text);
    common::json(&[
        "speeds",
        f.path().to_str().expect("path"),
        "--format",
        "json",
    ])
}

fn close(a: f64, b: f64, what: &str) {
    assert!((a - b).abs() < 1e-12, "{what}: {a} against {b}");
}

#[test]
fn both_speeds_match_the_closed_forms() {
    // (slots, poles as laid out, span): 36-slot 2/4 at full pitch of 4 poles, 48-slot 4/8
    // at full pitch of 8 poles, 72-slot 4/8 with a span one short of it.
    for (z, p, y) in [(36usize, 2usize, 9usize), (48, 4, 6), (72, 4, 8)] {
        for conn in ["delta-double-star", "star-double-star"] {
            let r = speeds(&layout(z, p, y, conn));
            let q = (z / (3 * p)) as u32;
            let alpha = PI * p as f64 / z as f64;
            let tau_hi = z as f64 / p as f64;
            let tau_lo = tau_hi / 2.0;
            let hi = &r["high_speed"];
            let lo = &r["low_speed"];
            assert_eq!(hi["poles"], p);
            assert_eq!(lo["poles"], 2 * p);
            let f = |s: &Value, k: &str| s["fundamental"][k].as_f64().expect(k).abs();
            let kd_hi = closed::distribution(q, 1.0, alpha);
            let kp_hi = (y as f64 * PI / (2.0 * tau_hi)).sin();
            let kd_lo = closed::distribution(q, 1.0, 2.0 * alpha);
            let kp_lo = (y as f64 * PI / (2.0 * tau_lo)).sin().abs();
            close(f(hi, "distribution"), kd_hi, "k_d at the higher speed");
            close(f(hi, "pitch"), kp_hi, "k_p at the higher speed");
            close(f(lo, "distribution"), kd_lo, "k_d at the lower speed");
            close(f(lo, "pitch"), kp_lo, "k_p at the lower speed");
            // Balanced at both; the lower speed's sequence reversed, its lines exchanged.
            assert_eq!(hi["balanced"], true);
            assert_eq!(lo["balanced"], true);
            assert_eq!(hi["sequence"], "positive");
            assert_eq!(lo["sequence"], "negative");
            assert_eq!(r["connections"][0]["lines_exchanged"], true);
            // Series turns: all of a phase at the lower speed, half at the higher.
            let turns = (z * 10 / 3) as f64;
            assert_eq!(lo["series_turns_per_phase"].as_f64(), Some(turns));
            assert_eq!(hi["series_turns_per_phase"].as_f64(), Some(turns / 2.0));
            let kw_ratio = (kd_hi * kp_hi) / (kd_lo * kp_lo);
            let want = if conn == "delta-double-star" {
                3f64.sqrt() * kw_ratio
            } else {
                kw_ratio
            };
            close(r["flux_ratio"].as_f64().expect("ratio"), want, "flux ratio");
            let rpm = |s: &Value| s["synchronous_rpm"].as_f64().expect("rpm");
            close(rpm(hi), 6000.0 / p as f64, "synchronous speed");
            close(rpm(lo), 3000.0 / p as f64, "synchronous speed");
        }
    }
}

/// The strongest wave of order 2 at the lower speed, relative to its working wave.
fn second(r: &Value) -> f64 {
    r["low_speed"]["rows"]
        .as_array()
        .expect("rows")
        .iter()
        .filter(|w| (w["order"].as_f64().expect("order") - 2.0).abs() < 1e-9)
        .map(|w| {
            w["forward"]
                .as_f64()
                .expect("f")
                .max(w["backward"].as_f64().expect("b"))
        })
        .fold(0.0, f64::max)
}

#[test]
fn a_span_off_the_higher_counts_pole_pitch_leaves_even_orders() {
    // At full pitch of the higher count every coil's MMF is half-wave symmetric and no even
    // order is left; a span one off that pitch breaks the symmetry (the consequent poles
    // are then unequal).
    assert!(second(&speeds(&layout(48, 4, 6, "star-double-star"))) < 1e-9);
    let off = second(&speeds(&layout(48, 4, 5, "star-double-star")));
    assert!(off > 0.01, "order 2 at span 5: {off}");
}

#[test]
fn the_example_reads_as_a_shop_would_want_it() {
    let out = common::run(&["speeds", "layouts/fan-two-speed.toml"]);
    assert!(out.status.success());
    // Paragraphs are wrapped at 78 columns: compare with the white space folded.
    let text = String::from_utf8_lossy(&out.stdout)
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ");
    for want in [
        "4 poles (series star) and 2 poles (double star)",
        "variable torque",
        "two supply lines are exchanged",
        "1U + 1V + 1W",
        "CAUTION",
    ] {
        assert!(text.contains(want), "missing {want:?} in\n{text}");
    }
}

#[test]
fn what_cannot_change_poles_is_refused_with_what_would() {
    let cases = [
        (
            layout(36, 2, 9, "delta-double-star").replace("rotary", "linear"),
            "winding.pole_change",
        ),
        (layout(30, 4, 4, "delta-double-star"), "multiple of 3 × 4"),
        (
            layout(36, 2, 9, "delta-double-star")
                .replace("pole_change", "connection = \"delta\"\npole_change"),
            "remove winding.connection",
        ),
    ];
    for (text, says) in cases {
        let f = common::temp_layout(&text);
        let out = common::run(&["speeds", f.path().to_str().expect("path")]);
        assert_eq!(out.status.code(), Some(2));
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains(says), "{says:?} not in {err}");
    }
    let out = common::run(&["speeds", "layouts/pump-rewind.toml"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("not a pole-changing winding"));
}

#[test]
fn the_json_validates_against_its_schema() {
    let schema: Value = serde_json::from_str(
        &std::fs::read_to_string("docs/schemas/speeds.schema.json").expect("schema file"),
    )
    .expect("json");
    for text in [
        layout(36, 2, 9, "delta-double-star"),
        layout(48, 4, 5, "star-double-star"),
    ] {
        common::schema_check(&speeds(&text), &schema, "speeds").expect("valid");
    }
}

#[test]
fn the_card_and_connection_sheet_do_not_give_one_speeds_leads() {
    // A single-speed star/delta lead table or diagram would wire a two-speed winding
    // wrongly: the card says where both speeds' connections are, and the sheet says so in
    // place of the diagram.
    let card = common::json(&["card", "layouts/fan-two-speed.toml", "--format", "json"]);
    assert!(card["leads"].is_null(), "{}", card["leads"]);
    assert!(card["line_resistance_20c_ohm"].is_null());
    let words = card["warnings"].to_string();
    assert!(words.contains("pole-changing"), "{words}");
    let dir = tempfile::tempdir().expect("temp dir");
    let svg = dir.path().join("c.svg");
    let out = common::run(&[
        "draw",
        "layouts/fan-two-speed.toml",
        "--sheet",
        "connections",
        "-o",
        svg.to_str().expect("path"),
    ]);
    assert!(out.status.success());
    let text = std::fs::read_to_string(&svg).expect("sheet");
    assert!(text.contains("POLE-CHANGING WINDING"));
    assert!(!text.contains("linked to make the star point"));
}
