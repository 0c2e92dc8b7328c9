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
            // Balanced at both; the lower speed's sequence reversed by nature.
            assert_eq!(hi["balanced"], true);
            assert_eq!(lo["balanced"], true);
            assert_eq!(hi["sequence"], "positive");
            assert_eq!(lo["sequence"], "negative");
            // The standards' tables turn both speeds the same way: nothing exchanged (which
            // way each turns is held against the sheet's own field in two_speed_sheet.rs).
            assert_eq!(r["connections"][0]["lines_exchanged"], false);
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

#[test]
fn every_span_at_both_speeds_matches_the_closed_forms_and_the_best_is_the_fairest() {
    // The span table against k_d·k_p at each count (as above) for every span up to the
    // higher speed's pole pitch; the best span, worked out here from the closed forms, is
    // the one whose smaller k_w1 is largest (the report's stated criterion, ours).
    for (z, p) in [(36usize, 2usize), (48, 4), (72, 4)] {
        let r = speeds(&layout(z, p, z / (2 * p), "star-double-star"));
        let q = (z / (3 * p)) as u32;
        let alpha = PI * p as f64 / z as f64;
        let tau_hi = z as f64 / p as f64;
        let kd_hi = closed::distribution(q, 1.0, alpha);
        let kd_lo = closed::distribution(q, 1.0, 2.0 * alpha);
        let rows = r["spans"].as_array().expect("spans");
        assert_eq!(rows.len(), z / p, "every span 1..=tau");
        let mut best = (0usize, -1.0f64);
        for row in rows {
            let y = row["span"].as_u64().expect("span") as usize;
            let hi = kd_hi * (y as f64 * PI / (2.0 * tau_hi)).sin();
            let lo = kd_lo * (y as f64 * PI / tau_hi).sin().abs();
            let got = |k: &str| row[k].as_f64().expect(k);
            close(got("high_speed_winding_factor"), hi, "k_w1 higher speed");
            close(got("low_speed_winding_factor"), lo, "k_w1 lower speed");
            if hi.min(lo) > best.1 + 1e-12 {
                best = (y, hi.min(lo));
            }
        }
        assert_eq!(r["best_span"].as_u64(), Some(best.0 as u64), "{z}/{p}");
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
fn the_span_tables_second_order_is_the_fields() {
    // The span table's order 2 (from the winding factor, 100·k_w2/(2·k_w1)) against the
    // field's own spectrum at the lower speed (the MMF staircase's Fourier series, worked
    // out apart from the factors), for every span of two cores.
    for (z, p) in [(36usize, 2usize), (48, 4)] {
        let table = speeds(&layout(z, p, z / (2 * p), "star-double-star"));
        for row in table["spans"].as_array().expect("spans") {
            let y = row["span"].as_u64().expect("span") as usize;
            if row["low_speed_winding_factor"].as_f64().expect("k") < 1e-6 {
                continue;
            }
            let field = 100.0 * second(&speeds(&layout(z, p, y, "star-double-star")));
            let got = row["low_speed_second_percent"].as_f64().expect("order 2");
            assert!(
                (got - field).abs() < 1e-9,
                "{z}/{p} span {y}: {got} against {field}"
            );
        }
    }
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
        "both speeds turn the field the same way",
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
        (
            format!(
                "{}\n[measured]\nline_resistance_ohm = [1.0, 1.0, 1.0]\n",
                layout(36, 2, 9, "delta-double-star")
            ),
            "measured.line_resistance_ohm",
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
fn the_card_gives_the_six_leads_readings_of_both_connections() {
    // No single-speed star/delta lead table (it would wire a two-speed winding wrongly);
    // instead the readings between the six leads. With equal halves R/2 of a phase R
    // (series and parallel resistors, any circuits text): series delta end to end
    // R ∥ 2R = 2R/3, tap to tap 2R/3, end to own tap R/2 ∥ 5R/2 = 5R/12, double star (ends
    // linked) tap to tap 2·(R/2 ∥ R/2) = R/2; series star end to end 2R, tap to tap R, end
    // to own tap R/2, double star R/2.
    for (connection, end_end, tap_tap, end_tap, double_star) in [
        ("delta-double-star", 2.0 / 3.0, 2.0 / 3.0, 5.0 / 12.0, 0.5),
        ("star-double-star", 2.0, 1.0, 0.5, 0.5),
    ] {
        let text = layout(36, 2, 9, connection).replace(
            "[supply]",
            "[core]\nbore_mm = 110.0\nstack_mm = 90.0\n\n[wire]\ndiameter_mm = 0.9\n\n[supply]",
        );
        let f = common::temp_layout(&text);
        let card = common::json(&["card", f.path().to_str().expect("path"), "--format", "json"]);
        assert!(card["leads"].is_null(), "{}", card["leads"]);
        assert!(card["line_resistance_20c_ohm"].is_null());
        assert!(card["warnings"].to_string().contains("pole-changing"));
        let r = card["phase_resistance_20c_ohm"].as_f64().expect("phase R");
        let six = &card["six_leads"];
        let ohm = |v: &Value| v["ohm"].as_f64().expect("ohm");
        let d = six["delivered"].as_array().expect("delivered");
        assert_eq!(d.len(), 9);
        for (k, want) in [(0, end_end), (3, tap_tap), (6, end_tap)] {
            for j in 0..3 {
                let got = ohm(&d[k + j]);
                assert!(
                    (got / (want * r) - 1.0).abs() < 1e-12,
                    "{connection} {}: {got}",
                    d[k + j]
                );
            }
        }
        assert_eq!(d[0]["between"], serde_json::json!(["1U", "1V"]));
        assert_eq!(d[3]["between"], serde_json::json!(["2U", "2W"]));
        let speeds = six["speeds"].as_array().expect("speeds");
        assert_eq!(speeds[0]["poles"], 4);
        assert_eq!(speeds[1]["poles"], 2);
        assert_eq!(speeds[1]["linked"], serde_json::json!(["1U", "1V", "1W"]));
        let lines = |k: usize| speeds[k]["lines"].as_array().expect("lines").clone();
        assert_eq!((lines(0).len(), lines(1).len()), (3, 3));
        for (l, h) in lines(0).iter().zip(&lines(1)) {
            let (low, high) = (ohm(l), ohm(h));
            assert!(
                (low / (end_end * r) - 1.0).abs() < 1e-12,
                "{connection} low {low}"
            );
            assert!(
                (high / (double_star * r) - 1.0).abs() < 1e-12,
                "{connection} high {high}"
            );
        }
    }
}

/// The two-speed fan as an as-found coil list (its header, then every coil as planned),
/// with `edit` applied to the coils (phase, go, back) and `extra` coils added.
fn fan_record(edit: impl Fn(&mut Vec<(String, u64, u64)>)) -> String {
    let plan = common::json(&["plan", "layouts/fan-two-speed.toml", "--format", "json"]);
    let mut coils: Vec<(String, u64, u64)> = plan["coils"]
        .as_array()
        .expect("coils")
        .iter()
        .map(|c| {
            (
                c["phase"].as_str().expect("phase").to_string(),
                c["go"].as_u64().expect("go"),
                c["back"].as_u64().expect("back"),
            )
        })
        .collect();
    edit(&mut coils);
    let mut s = std::fs::read_to_string("layouts/fan-two-speed.toml").expect("example");
    // A coil list takes no span: drop the design's `pitch` line.
    s = s
        .lines()
        .filter(|l| !l.trim_start().starts_with("pitch"))
        .map(|l| format!("{l}\n"))
        .collect();
    for (phase, go, back) in coils {
        s.push_str(&format!(
            "\n[[coil]]\nphase = \"{phase}\"\ngo = {go}\nback = {back}\nturns = 28\n"
        ));
    }
    s
}

fn audit(text: &str) -> (Option<i32>, Value) {
    let f = common::temp_layout(text);
    let out = common::run(&[
        "audit",
        f.path().to_str().expect("path"),
        "--format",
        "json",
    ]);
    let v = serde_json::from_slice(&out.stdout).expect("audit JSON");
    (out.status.code(), v)
}

fn kinds(a: &Value) -> Vec<String> {
    a["findings"]
        .as_array()
        .expect("findings")
        .iter()
        .map(|f| f["kind"].as_str().expect("kind").to_string())
        .collect()
}

#[test]
fn an_as_found_two_speed_record_is_judged_at_both_speeds() {
    // As planned: sound, balanced at both speeds, the other speed in negative sequence as
    // consequent poles give it (the slot angle doubles: see the module's note).
    let (code, a) = audit(&fan_record(|_| {}));
    assert_eq!(code, Some(0), "{:#}", a["findings"]);
    let o = &a["other_speed"];
    assert_eq!(o["after_fix"], false);
    assert_eq!(o["poles"], 4);
    assert_eq!(o["balanced"], true);
    assert_eq!(o["sequence"], "negative");

    // One group of phase U connected backwards: found as laid out; the other speed is
    // judged with the fix made (a coil list tells a half only by its direction, so a
    // record unbalanced as laid out says nothing sure of its halves).
    let (code, a) = audit(&fan_record(|c| {
        for coil in c.iter_mut().filter(|x| x.0 == "U" && x.1 <= 6) {
            std::mem::swap(&mut coil.1, &mut coil.2);
        }
    }));
    assert_eq!(code, Some(1));
    assert!(
        kinds(&a).contains(&"reversed_group".to_string()),
        "{:?}",
        kinds(&a)
    );
    assert_eq!(a["other_speed"]["after_fix"], true);
    assert_eq!(a["other_speed"]["balanced"], true);

    // Two extra coils in phase U half a revolution apart, both forward: their EMFs cancel
    // at 2 poles (180° apart) and add at 4 poles (360°), so only the other speed shows it.
    let (code, a) = audit(&fan_record(|c| {
        c.push(("U".into(), 1, 12));
        c.push(("U".into(), 19, 30));
    }));
    assert_eq!(code, Some(1));
    assert_eq!(a["balanced"], true, "{:#}", a["findings"]);
    assert!(
        kinds(&a).contains(&"unbalanced_at_other_speed".to_string()),
        "{:?}",
        kinds(&a)
    );
    assert_eq!(a["other_speed"]["balanced"], false);
}

#[test]
fn the_pole_change_survey_finds_what_fits_and_the_fairest_span() {
    // Whole slots per pole and phase at the higher speed's poles (Z a multiple of 3·2p) is
    // what fits; each fitting row's span and factors against the closed forms, the best
    // worked out here as in the span table's test.
    let v = common::json(&[
        "survey",
        "--slots",
        "24..=48",
        "--poles",
        "2..=8",
        "--pole-change",
        "--format",
        "json",
    ]);
    let schema: Value = serde_json::from_str(
        &std::fs::read_to_string("docs/schemas/survey-two-speed.schema.json").expect("schema file"),
    )
    .expect("json");
    common::schema_check(&v, &schema, "survey-two-speed").expect("valid");
    let rows = v["rows"].as_array().expect("rows");
    assert_eq!(rows.len(), 25 * 4, "every slot count, poles 2, 4, 6, 8");
    let mut fitting = 0;
    for r in rows {
        let z = r["slots"].as_u64().expect("slots") as usize;
        let p = r["poles"].as_u64().expect("poles") as usize;
        let fits = z.is_multiple_of(3 * p);
        assert_eq!(r["fits"], fits, "{z}/{p}");
        assert_eq!(r["low_speed_poles"].as_u64(), Some(2 * p as u64));
        if !fits {
            assert!(r["best_span"].is_null());
            continue;
        }
        fitting += 1;
        let q = (z / (3 * p)) as u32;
        let alpha = PI * p as f64 / z as f64;
        let tau = z as f64 / p as f64;
        let kd_hi = closed::distribution(q, 1.0, alpha);
        let kd_lo = closed::distribution(q, 1.0, 2.0 * alpha);
        let both = |y: usize| {
            (
                kd_lo * (y as f64 * PI / tau).sin().abs(),
                kd_hi * (y as f64 * PI / (2.0 * tau)).sin(),
            )
        };
        let mut best = (0, -1.0);
        for y in 1..=z / p {
            let (lo, hi) = both(y);
            if lo.min(hi) > best.1 + 1e-12 {
                best = (y, lo.min(hi));
            }
        }
        assert_eq!(r["best_span"].as_u64(), Some(best.0 as u64), "{z}/{p}");
        let (lo, hi) = both(best.0);
        close(
            r["low_speed_winding_factor"].as_f64().expect("lo"),
            lo,
            "k_w1 lower",
        );
        close(
            r["high_speed_winding_factor"].as_f64().expect("hi"),
            hi,
            "k_w1 higher",
        );
    }
    // 24..=48 holds multiples of 6 (2 poles): 5, of 12: 3, of 18: 1, of 24: 2.
    assert_eq!(fitting, 11);
    // A survey past its work bound is refused with what would do, not left to run for
    // minutes (600..=1200 slots at 2 and 4 poles is 5.3e7 of the 1e8 allowed).
    let out = common::run(&[
        "survey",
        "--slots",
        "12..=5000",
        "--poles",
        "2",
        "--pole-change",
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("narrow --slots or --poles"));
    // A flat primary or another phase count is refused with the reason.
    let out = common::run(&[
        "survey",
        "--slots",
        "24",
        "--poles",
        "2",
        "--pole-change",
        "--topology",
        "linear",
    ]);
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn the_winding_factor_warning_judges_both_speeds_and_not_one_pole_pitch() {
    // k_w1 at 2 poles with span 9 of 18: k_d·sin(45°) = 0.9561·0.7071 = 0.676 < 0.7 (the
    // closed forms above); at span 11 both counts are above 0.78 and nothing is said, and a
    // span half the 2-pole pitch is not "far from the pole pitch" for a two-speed winding.
    let plan = |y: usize| {
        let f = common::temp_layout(&layout(36, 2, y, "star-double-star"));
        common::json(&["plan", f.path().to_str().expect("path"), "--format", "json"])
    };
    let w = plan(9)["warnings"].clone();
    let list = w.as_array().expect("warnings");
    assert_eq!(list.len(), 1, "{w:#}");
    assert_eq!(list[0]["kind"], "low_winding_factor");
    assert_eq!(list[0]["poles"], 2);
    assert!(
        list[0]["message"]
            .as_str()
            .expect("message")
            .contains("at 2 poles")
    );
    assert_eq!(plan(11)["warnings"], serde_json::json!([]));
}

#[test]
fn the_held_back_fan_record_has_its_one_reversed_half_found() {
    // Phase U's first group (a half of the phase: its two groups are the halves the
    // bridge joins) written backwards: its EMF cancels the other half's at two poles.
    let out = common::run(&[
        "audit",
        "layouts/fan-two-speed-as-found.toml",
        "--format",
        "json",
    ]);
    assert_eq!(out.status.code(), Some(1));
    let a: Value = serde_json::from_slice(&out.stdout).expect("json");
    assert_eq!(kinds(&a), ["reversed_group"], "{:#}", a["findings"]);
    assert_eq!(
        a["findings"][0]["coils"],
        serde_json::json!([1, 2, 3, 4, 5, 6])
    );
    // With the group turned round, the other speed is sound too.
    assert_eq!(a["other_speed"]["after_fix"], true);
    assert_eq!(a["other_speed"]["balanced"], true);
}

#[test]
fn factors_and_field_at_the_lower_speed_agree_with_both_speeds_report() {
    // `factors --speed low` and `field --speed low` give the winding at twice the poles;
    // `speeds` (whose figures are checked against the closed forms above) gives the same
    // k_w1, THD and σ_d there, and fed as the lower speed's board feeds it (L1, L2, L3 on
    // 1U, 1V, 1W) the field turns the way `speeds` says it does at 4 poles.
    let f = "layouts/fan-two-speed.toml";
    let speeds = common::json(&["speeds", f, "--format", "json"]);
    let low = &speeds["low_speed"];
    let factors = common::json(&["factors", f, "--speed", "low", "--format", "json"]);
    assert_eq!(factors["design"]["poles"], 4);
    let kw1 = factors["rows"][0]["winding"].as_f64().expect("kw1");
    let want = low["fundamental"]["winding"]
        .as_f64()
        .expect("kw1 at 4 poles");
    assert!((kw1 - want).abs() < 1e-12, "{kw1} against {want}");
    let field = common::json(&["field", f, "--speed", "low", "--format", "json"]);
    let board = speeds["connections"]
        .as_array()
        .expect("connections")
        .iter()
        .find(|c| c["poles"] == 4)
        .expect("the lower speed's board");
    let forward = board["towards_rising_slots"] == true;
    assert_eq!(
        field["working_wave"],
        if forward { "forward" } else { "backward" }
    );
    for (a, b) in [
        ("differential_leakage", "differential_leakage"),
        ("thd", "thd"),
    ] {
        let (x, y) = (
            field[a].as_f64().expect("field"),
            low[b].as_f64().expect("speeds"),
        );
        assert!((x - y).abs() < 1e-12, "{a}: {x} against {y}");
    }
    // As laid out (--speed high) are the factors of the plain command; its field, fed on
    // the taps as the higher speed's board feeds them, turns as `speeds` says too.
    let high = common::json(&["factors", f, "--speed", "high", "--format", "json"]);
    assert_eq!(high["design"]["poles"], 2);
    let board2 = speeds["connections"]
        .as_array()
        .expect("connections")
        .iter()
        .find(|c| c["poles"] == 2)
        .expect("the higher speed's board");
    let field2 = common::json(&["field", f, "--speed", "high", "--format", "json"]);
    assert_eq!(
        field2["working_wave"],
        if board2["towards_rising_slots"] == true {
            "forward"
        } else {
            "backward"
        }
    );
    // A one-speed winding refuses --speed.
    let out = common::run(&["factors", "layouts/pump-rewind.toml", "--speed", "low"]);
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn the_cards_flux_density_is_the_pole_changing_windings_worse_speed() {
    // At each speed B̂ = π·Φ/(2·τ·L) with Φ = E/(√2·π·f·N·k_w1) (the EMF equation, any
    // machines text): at the lower speed (4 poles, series star) N is the phase's whole
    // series turns at U/√3; at the higher (2 poles, double star) the halves are in
    // parallel, so half of them, at U/√3 too. The card checks the higher of the two.
    let f = "layouts/fan-two-speed.toml";
    let speeds = common::json(&["speeds", f, "--format", "json"]);
    let card = common::json(&["card", f, "--format", "json"]);
    let (u, hz, bore, stack) = (400.0 / 3f64.sqrt(), 50.0, 0.110, 0.090);
    let peak = |poles: f64, n: f64, kw: f64| {
        let phi = u / (2f64.sqrt() * PI * hz * n * kw);
        let tau = PI * bore / poles;
        PI * phi / (2.0 * tau * stack)
    };
    let n = card["series_turns_per_phase"].as_f64().expect("N");
    let kw = |s: &str| speeds[s]["fundamental"]["winding"].as_f64().expect("kw1");
    let low = peak(4.0, n, kw("low_speed"));
    let high = peak(2.0, n / 2.0, kw("high_speed"));
    let m = &card["loading"]["magnetic"];
    let want = low.max(high);
    let got = m["gap"]["peak_t"].as_f64().expect("peak");
    assert!((got - want).abs() < 1e-9 * want, "{got} against {want}");
    assert_eq!(m["at_poles"], if low > high { 4 } else { 2 });
    // With the back iron's depth given, each speed's back iron carries half its own flux
    // per pole, B̂_y = Φ/(2·k_Fe·L·h_y) (the theory's relation): the higher speed's flux
    // per pole is about twice the lower's, and its density is judged too.
    let text = std::fs::read_to_string(f).expect("example").replace(
        "stack_mm = 90.0",
        "stack_mm = 90.0
yoke_depth_mm = 18.0",
    );
    let card = common::json(&[
        "card",
        common::temp_layout(&text).path().to_str().expect("path"),
        "--format",
        "json",
    ]);
    let yoke = |poles: f64, n: f64, kw: f64| {
        let phi = u / (2f64.sqrt() * PI * hz * n * kw);
        let _ = poles;
        phi / (2.0 * 0.95 * stack * 0.018)
    };
    let l = &card["loading"];
    for (m, poles, n_ph, k) in [
        (&l["magnetic"], 4.0, n, kw("low_speed")),
        (&l["other_speed"], 2.0, n / 2.0, kw("high_speed")),
    ] {
        assert_eq!(m["at_poles"], poles as u64);
        let got = m["yoke"]["peak_t"].as_f64().expect("yoke");
        let want = yoke(poles, n_ph, k);
        assert!(
            (got - want).abs() < 1e-9 * want,
            "{poles} poles: {got} against {want}"
        );
    }
    let passed: Vec<&Value> = l["limits_passed"]
        .as_array()
        .expect("limits")
        .iter()
        .filter(|w| w["part"] == "yoke")
        .collect();
    assert_eq!(passed.len(), 1, "{passed:?}");
    assert_eq!(passed[0]["at_poles"], 2);
}

#[test]
fn the_audit_and_speeds_turn_the_field_the_same_way_on_the_same_leads() {
    // The higher speed's lines go on the taps in the standard's order (2W, 2U, 2V: the
    // taps of phases V, U, W), so the field turns against the phases' own sequence there;
    // the audit of a sound record says what `speeds` says for the same leads.
    let speeds = common::json(&["speeds", "layouts/fan-two-speed.toml", "--format", "json"]);
    let high = speeds["connections"]
        .as_array()
        .expect("connections")
        .iter()
        .find(|c| c["poles"] == 2)
        .expect("the higher speed's board");
    let (_, a) = audit(&fan_record(|_| {}));
    let d = &a["travel_detail"];
    assert_eq!(d["line_leads"], serde_json::json!(["2W", "2U", "2V"]));
    let rising = d["sequence"] == "positive";
    assert_eq!(serde_json::json!(rising), high["towards_rising_slots"]);
}

#[test]
fn readings_between_the_six_leads_find_a_half_on_the_wrong_lead() {
    // As delivered, nothing linked, a series-star pole-changing winding of halves h reads
    // (series resistors, any circuits text): end to end 1U-A-2U-B-star-B-2W-A-1V, 4h; tap
    // to tap 2h; an end to its own tap h. With the markings of 1U and 2U exchanged, every
    // reading that touches phase U's two leads changes: "1U-1V" is 2U to 1V, 3h, and so on.
    let f = "layouts/fan-two-speed.toml";
    let card = common::json(&["card", f, "--format", "json"]);
    let h = card["six_leads"]["halves"][0]["reversed_ohm"]
        .as_f64()
        .expect("half");
    let base = std::fs::read_to_string(f).expect("example");
    let audit_with = |r: [f64; 9]| {
        let list = r.map(|x| format!("{x:.6}")).join(", ");
        let text = format!("{base}\n[measured]\nsix_lead_ohm = [{list}]\ntemperature_c = 20.0\n");
        let file = common::temp_layout(&text);
        let out = common::run(&[
            "audit",
            file.path().to_str().expect("path"),
            "--format",
            "json",
        ]);
        let v: Value = serde_json::from_slice(&out.stdout).expect("json");
        (out.status.code(), v)
    };
    let marked = [4.0, 4.0, 4.0, 2.0, 2.0, 2.0, 1.0, 1.0, 1.0].map(|k| k * h);
    let (code, v) = audit_with(marked);
    assert_eq!(code, Some(0), "{:#}", v["findings"]);
    let swapped = [3.0, 4.0, 3.0, 3.0, 2.0, 3.0, 1.0, 1.0, 1.0].map(|k| k * h);
    let (code, v) = audit_with(swapped);
    assert_eq!(code, Some(1));
    let f6: Vec<&Value> = v["findings"]
        .as_array()
        .expect("findings")
        .iter()
        .filter(|f| f["kind"] == "six_lead_readings")
        .collect();
    assert_eq!(f6.len(), 1, "{:#}", v["findings"]);
    assert_eq!(
        f6[0]["detail"]["exchanged"],
        serde_json::json!([["1U", "2U"]])
    );
    // A half of phase U short of turns (four fifths of its resistance): no exchange
    // explains the readings.
    let short = [3.8, 4.0, 3.8, 2.0, 2.0, 2.0, 0.8, 1.0, 1.0].map(|k| k * h);
    let (code, v) = audit_with(short);
    assert_eq!(code, Some(1));
    let f6 = v["findings"]
        .as_array()
        .expect("findings")
        .iter()
        .find(|f| f["kind"] == "six_lead_readings")
        .expect("a six-lead finding");
    assert_eq!(f6["detail"]["exchanged"], serde_json::json!([]));
}

#[test]
fn the_held_back_lead_readings_find_the_exchanged_markings() {
    let out = common::run(&[
        "audit",
        "layouts/fan-two-speed-leads-as-found.toml",
        "--format",
        "json",
    ]);
    assert_eq!(out.status.code(), Some(1));
    let v: Value = serde_json::from_slice(&out.stdout).expect("json");
    assert_eq!(kinds(&v), ["six_lead_readings"], "{:#}", v["findings"]);
    assert_eq!(
        v["findings"][0]["detail"]["exchanged"],
        serde_json::json!([["1U", "2U"]])
    );
}
