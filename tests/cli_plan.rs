//! The plan and factors commands as a user runs them: contract JSON, CSV and text.

mod common;
use common::{beltwright, json};

/// `json` with `--format json` added, as the plan and factors calls here want.
fn json_of(args: &[&str]) -> Value {
    json(&[args, &["--format", "json"]].concat())
}

use serde_json::Value;

#[test]
fn plan_json_has_the_contract_fields() {
    let v = json_of(&["plan", "layouts/pump-rewind.toml"]);
    let coils = v["coils"].as_array().expect("coils array");
    assert_eq!(coils.len(), 36);
    let c = &coils[0];
    for key in ["phase", "go", "back", "turns"] {
        assert!(!c[key].is_null(), "coil field {key}");
    }
    assert_eq!(c["phase"], "U");
    assert_eq!(c["go"], 1);
    assert_eq!(c["back"], 8);
    assert_eq!(c["turns"], 58); // the layout's winding.turns_per_coil
    // k_w1 of 36 slots, 4 poles, span 7/9 = 0.902 (closed forms, Say 1983).
    let kw = v["winding_factor"].as_f64().expect("winding_factor");
    assert!((kw - 0.902).abs() < 5e-4);
    assert!(
        v.get("half_filled_slots").is_none(),
        "rotary cores have no end slots"
    );
}

#[test]
fn plan_flat_primary_has_half_filled_ends() {
    // 24 coils at span 5 in 29 slots: 5 half-filled slots at each end (design brief).
    let v = json_of(&["plan", "layouts/pallet-shuttle.toml"]);
    let half: Vec<u64> = v["half_filled_slots"]
        .as_array()
        .expect("half_filled_slots")
        .iter()
        .filter_map(Value::as_u64)
        .collect();
    assert_eq!(half, vec![1, 2, 3, 4, 5, 25, 26, 27, 28, 29]);
    assert_eq!(v["coils"].as_array().map(Vec::len), Some(24));
}

#[test]
fn plan_gives_the_field_speed_of_a_flat_primary() {
    // v_s = 2·f·τ with τ = 6 slots × 12 mm = 72 mm at 50 Hz: 7.2 m/s; at slip 0.1 the
    // secondary runs at 6.48 m/s; 1.5 kW across the gap pushes 1500/7.2 N (Boldea and
    // Nasar, Linear Electric Motors, 1987, ch. 2).
    let v = json_of(&[
        "plan",
        "layouts/pallet-shuttle.toml",
        "--slip",
        "0.1",
        "--airgap-power-w",
        "1500",
    ]);
    let f = &v["figures"];
    let get = |k: &str| f[k].as_f64().unwrap_or(f64::NAN);
    assert!((get("synchronous_speed_m_s") - 7.2).abs() < 1e-12);
    assert!((get("speed_m_s") - 6.48).abs() < 1e-12);
    assert!((get("thrust_n") - 1500.0 / 7.2).abs() < 1e-9);
}

#[test]
fn factors_json_rows_have_the_contract_fields() {
    let v = json_of(&["factors", "layouts/pump-rewind.toml", "--upto", "13"]);
    let rows = v["rows"].as_array().expect("rows");
    let orders: Vec<f64> = rows.iter().filter_map(|r| r["order"].as_f64()).collect();
    // A balanced integer-slot phase winding has odd orders only (Say 1983, §4.4).
    assert_eq!(orders, vec![1.0, 3.0, 5.0, 7.0, 9.0, 11.0, 13.0]);
    for r in rows {
        for key in ["distribution", "pitch", "skew", "winding"] {
            assert!(r[key].is_f64(), "{key}");
        }
    }
}

#[test]
fn factors_list_sub_harmonics_of_a_fractional_slot_winding() {
    // 27 slots, 6 poles (q = 3/2): orders ν = n/3; the even electrical orders 2 and 4 are
    // present because q has an even denominator (fractional-slot theory, common practice).
    let v = json_of(&["factors", "layouts/mill-fractional.toml", "--upto", "4"]);
    let orders: Vec<f64> = v["rows"]
        .as_array()
        .expect("rows")
        .iter()
        .filter_map(|r| r["order"].as_f64())
        .collect();
    assert!(orders.contains(&2.0) && orders.contains(&4.0), "{orders:?}");
}

#[test]
fn csv_has_a_header_and_one_line_per_coil() {
    let out = beltwright()
        .args(["plan", "layouts/servo-tooth-coil.toml", "--format", "csv"])
        .output()
        .expect("runs");
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    let lines: Vec<&str> = text.lines().collect();
    assert!(lines[0].starts_with("coil,phase,go,back"));
    assert_eq!(lines.len(), 1 + 12);
}

#[test]
fn text_reports_fit_an_eighty_column_terminal_and_carry_the_caution() {
    for f in std::fs::read_dir("layouts").expect("layouts/") {
        let path = f.expect("entry").path();
        if path.extension().and_then(|e| e.to_str()) != Some("toml") {
            continue;
        }
        let out = beltwright().arg("plan").arg(&path).output().expect("runs");
        let text = String::from_utf8_lossy(&out.stdout);
        if !out.status.success() {
            continue; // audit records with faults are checked by their own tests
        }
        assert!(text.contains("CAUTION"), "{}", path.display());
        for line in text.lines() {
            assert!(line.chars().count() <= 80, "{}: {line}", path.display());
        }
    }
}

#[test]
fn every_example_layout_plans_cleanly() {
    let mut n = 0;
    for f in std::fs::read_dir("layouts").expect("layouts/") {
        let path = f.expect("entry").path();
        if path.extension().and_then(|e| e.to_str()) != Some("toml") {
            continue;
        }
        let out = beltwright()
            .arg("plan")
            .arg(&path)
            .args(["--format", "json"])
            .output()
            .expect("runs");
        if out.status.success() {
            n += 1;
            let v: Value = serde_json::from_slice(&out.stdout).expect("json");
            assert!(v["coils"].as_array().is_some_and(|c| !c.is_empty()));
        } else {
            let err = String::from_utf8_lossy(&out.stderr);
            assert_eq!(out.status.code(), Some(2), "{}: {err}", path.display());
            assert!(
                err.contains(&*path.to_string_lossy()),
                "names the file: {err}"
            );
        }
    }
    assert!(n >= 5, "at least five example layouts plan");
}

#[test]
fn help_shows_examples_and_the_caution() {
    let out = beltwright().arg("--help").output().expect("runs");
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("Examples") && text.contains("de-energised"));
    // The examples name the user's own files, not files only this repository has.
    assert!(!text.contains("layouts/"), "{text}");
}
