//! What a rewinder does at the command line: audit a record, read the JSON, rely on the exit
//! status (0 sound, 1 faults found, 2 bad input; contract in the design brief).

mod common;
use common::{SOUND_12, beltwright, small_record, temp_layout};

use serde_json::Value;

fn json(args: &[&str]) -> (Value, i32) {
    let out = beltwright().args(args).output().expect("runs");
    let v: Value = serde_json::from_slice(&out.stdout).expect("stdout is one JSON object");
    (v, out.status.code().unwrap_or(-1))
}

#[test]
fn audit_of_a_sound_record_exits_zero() {
    let (v, code) = json(&[
        "audit",
        "layouts/hoist-rewind-sound.toml",
        "--format",
        "json",
    ]);
    assert_eq!(code, 0);
    assert_eq!(v["balanced"], true);
    assert_eq!(v["sequence"], "positive");
    assert_eq!(v["findings"].as_array().map(|a| a.len()), Some(0));
    let phases = v["phases"].as_array().expect("phases");
    assert_eq!(phases.len(), 3);
    assert_eq!(phases[1]["phase"], "V");
    // V lags U by 120° in positive sequence (phasor convention of the design brief).
    let (u, w) = (
        phases[0]["angle_deg"].as_f64().unwrap_or(f64::NAN),
        phases[1]["angle_deg"].as_f64().unwrap_or(f64::NAN),
    );
    assert!(((u - w) - 120.0).abs() < 1e-9, "U {u}, V {w}");
}

#[test]
fn audit_names_a_reversed_group_and_a_coil_in_the_wrong_phase() {
    let (v, code) = json(&[
        "audit",
        "layouts/hoist-rewind-faulty.toml",
        "--format",
        "json",
    ]);
    assert_eq!(code, 1);
    assert_eq!(v["balanced"], false);
    let findings = v["findings"].as_array().expect("findings");
    let has = |kind: &str, coils: &[u64]| {
        findings.iter().any(|f| {
            f["kind"] == kind
                && f["coils"]
                    .as_array()
                    .map(|c| c.iter().filter_map(Value::as_u64).collect::<Vec<_>>() == coils)
                    .unwrap_or(false)
        })
    };
    assert!(has("reversed_group", &[13, 14, 15]), "{findings:#?}");
    assert!(has("wrong_phase", &[29]), "{findings:#?}");
    assert_eq!(findings.len(), 2, "{findings:#?}");
}

#[test]
fn audit_against_the_intended_design_lists_the_slots_that_differ() {
    let (v, code) = json(&[
        "audit",
        "layouts/hoist-rewind-faulty.toml",
        "--intended",
        "layouts/hoist-rewind-sound.toml",
        "--format",
        "json",
    ]);
    assert_eq!(code, 1);
    let slots: Vec<u64> = v["intended"]["slot_differences"]
        .as_array()
        .expect("slot differences")
        .iter()
        .filter_map(|d| d["slot"].as_u64())
        .collect();
    // Coils 13-15 lie in slots 13-15 and 21-23; coil 29 in slots 29 and 1.
    assert_eq!(slots, vec![1, 13, 14, 15, 21, 22, 23, 29]);
    // One finding per fault: the reversed group and the coil in the wrong phase explain
    // every difference, so no coil-by-coil "differs" finding repeats them (it gave four
    // before, on top of the two).
    let findings = v["findings"].as_array().expect("findings");
    let diffs = findings
        .iter()
        .filter(|f| f["kind"] == "differs_from_intended")
        .count();
    assert_eq!(diffs, 0);
    assert_eq!(findings.len(), 2, "{findings:#?}");
}

#[test]
fn audit_reports_swapped_leads_as_negative_sequence() {
    let mut coils = SOUND_12;
    for c in &mut coils {
        c.0 = match c.0 {
            "V" => "W",
            "W" => "V",
            p => p,
        };
    }
    let f = temp_layout(&small_record(&coils));
    let path = f.path().to_str().expect("utf-8 path");
    let (v, code) = json(&["audit", path, "--format", "json"]);
    assert_eq!(code, 1);
    assert_eq!(v["sequence"], "negative");
    assert!(v["backward_percent"].as_f64().unwrap_or(0.0) > 99.0);
    let f0 = &v["findings"][0];
    assert_eq!(f0["kind"], "leads_swapped");
    assert_eq!(f0["phases"], serde_json::json!(["V", "W"]));
    assert_eq!(v["findings"].as_array().map(|a| a.len()), Some(1));
}

#[test]
fn audit_of_the_small_sound_record_is_clean_and_text_says_so() {
    let f = temp_layout(&small_record(&SOUND_12));
    let out = beltwright()
        .args(["audit", f.path().to_str().expect("utf-8")])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("SOUND"), "{text}");
    assert!(text.contains("CAUTION"), "{text}");
}

#[test]
fn audit_accepts_an_overfilled_record_that_plan_refuses() {
    let mut coils = SOUND_12.to_vec();
    coils[1] = ("U", 1, 8); // laid in slot 1 again: slot 2 empty, slot 1 doubled
    let f = temp_layout(&small_record(&coils));
    let path = f.path().to_str().expect("utf-8");
    let out = beltwright().args(["plan", path]).output().expect("runs");
    assert_eq!(
        out.status.code(),
        Some(2),
        "plan keeps refusing overfilled slots"
    );
    let (v, code) = json(&["audit", path, "--format", "json"]);
    assert_eq!(code, 1);
    let kinds: Vec<&str> = v["findings"]
        .as_array()
        .expect("findings")
        .iter()
        .filter_map(|f| f["kind"].as_str())
        .collect();
    // One fault, one finding: the coil laid in the wrong slot explains both the doubled
    // slot and the empty one, so the slot-fill findings are not repeated beside it.
    assert_eq!(kinds, vec!["coil_wrong_slots"], "{kinds:?}");
    assert_eq!(v["findings"][0]["coils"], serde_json::json!([2]));
    let message = v["findings"][0]["message"].as_str().unwrap_or_default();
    assert!(message.contains("in at slot 2, out at slot 8"), "{message}");
    assert_eq!(v["fix_edits"], 1);
    assert_eq!(v["slot_check"]["overfilled"], serde_json::json!([1]));
    assert_eq!(v["slot_check"]["empty"], serde_json::json!([2]));
}

#[test]
fn audit_csv_lists_the_findings() {
    let out = beltwright()
        .args([
            "audit",
            "layouts/hoist-rewind-faulty.toml",
            "--format",
            "csv",
        ])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(1));
    let text = String::from_utf8_lossy(&out.stdout);
    let mut lines = text.lines();
    assert_eq!(
        lines.next(),
        Some("finding,kind,coils,slots,phases,message")
    );
    assert_eq!(lines.count(), 2);
}

#[test]
fn bad_input_exits_two_and_names_the_problem() {
    let out = beltwright()
        .args(["audit", "layouts/no-such-file.toml"])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("no-such-file.toml"));

    let f = temp_layout(&small_record(&SOUND_12).replace("layers = 1", "layers = 1\nlayres = 2"));
    let out = beltwright()
        .args(["audit", f.path().to_str().expect("utf-8")])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("layres"));

    let f = temp_layout(&small_record(&SOUND_12));
    let out = beltwright()
        .args([
            "audit",
            f.path().to_str().expect("utf-8"),
            "--intended",
            "layouts/hoist-rewind-sound.toml",
        ])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--intended"));
}
