//! What a user does with `beltwright field`: read the spectrum as JSON/CSV, draw the field
//! sheet, and get exit status 2 with a clear message for bad flags.

mod common;
use common::{beltwright, json};

#[test]
fn field_json_lists_rows_leakage_and_thd() {
    let v = json(&[
        "field",
        "layouts/pump-rewind.toml",
        "--format",
        "json",
        "--upto",
        "49",
    ]);
    let rows = v["rows"].as_array().unwrap();
    assert_eq!(rows[0]["order"], 1.0);
    assert_eq!(rows[0]["forward"], 1.0);
    assert!(rows[0]["backward"].as_f64().unwrap() < 1e-12);
    // 36 slots, 4 poles, span 7: slot harmonics 17 (backward) and 19 (forward) at 1/ν
    // (Say 1983, ch. 4).
    let at = |nu: f64| rows.iter().find(|r| r["order"] == nu).unwrap().clone();
    assert!((at(17.0)["backward"].as_f64().unwrap() - 1.0 / 17.0).abs() < 1e-12);
    assert!((at(19.0)["forward"].as_f64().unwrap() - 1.0 / 19.0).abs() < 1e-12);
    let s = v["differential_leakage"].as_f64().unwrap();
    let thd = v["thd"].as_f64().unwrap();
    assert!(s > 0.0 && (thd - s.sqrt()).abs() < 1e-15);
    assert_eq!(v["working_wave"], "forward");
    assert!(v["caution"].as_str().unwrap().contains("de-energised"));
    assert!(v["snapshot"]["points"].as_array().unwrap().len() > 36);
}

#[test]
fn field_on_a_flat_primary_gives_speeds_and_end_figures() {
    let v = json(&[
        "field",
        "layouts/pallet-shuttle.toml",
        "--format",
        "json",
        "--slip",
        "0.1",
    ]);
    let l = &v["linear"];
    // v_s = 2·f·τ with τ = 6 × 12 mm at 50 Hz; v = (1 − s)·v_s (Nasar & Boldea 1987, ch. 2).
    assert!((l["field_speed_m_s"].as_f64().unwrap() - 7.2).abs() < 1e-12);
    assert!((l["secondary_speed_m_s"].as_f64().unwrap() - 6.48).abs() < 1e-12);
    assert_eq!(l["forward_wave"], 1.0);
    assert!(l["backward_wave"].as_f64().is_some() && l["pulsating"].as_f64().is_some());
}

#[test]
fn field_negative_sequence_turns_the_field_round() {
    let v = json(&[
        "field",
        "layouts/pump-rewind.toml",
        "--format",
        "json",
        "--sequence",
        "negative",
    ]);
    assert_eq!(v["working_wave"], "backward");
    assert_eq!(v["rows"][0]["backward"], 1.0);
    let v = json(&[
        "field",
        "layouts/pump-rewind.toml",
        "--format",
        "json",
        "--currents",
        "1@0,1@120,1@-120",
    ]);
    assert_eq!(v["working_wave"], "backward");
}

#[test]
fn field_csv_is_the_spectrum_table() {
    let out = beltwright()
        .args(["field", "layouts/pump-rewind.toml", "--format", "csv"])
        .output()
        .unwrap();
    assert!(out.status.success());
    let text = String::from_utf8(out.stdout).unwrap();
    assert!(text.starts_with("order,mech,forward,backward,travels\n"));
    assert!(text.contains("\n1,2,1.000000,0.000000,forward\n"));
}

#[test]
fn field_writes_the_sheet_and_never_over_the_layout() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("pump-field.svg");
    beltwright()
        .args(["field", "layouts/pump-rewind.toml", "--svg"])
        .arg(&out)
        .assert()
        .success();
    let s = std::fs::read_to_string(&out).unwrap();
    // The shared page, as the field sheet of `draw`: labelled, title block, caution.
    assert!(s.starts_with("<svg") && s.contains("CAUTION") && s.contains("role=\"img\""));
    assert!(s.contains("Travelling field"));

    let layout = dir.path().join("copy.toml");
    std::fs::copy("layouts/pump-rewind.toml", &layout).unwrap();
    let before = std::fs::read(&layout).unwrap();
    let o = beltwright()
        .arg("field")
        .arg(&layout)
        .arg("--svg")
        .arg(&layout)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("--svg"));
    assert_eq!(std::fs::read(&layout).unwrap(), before);
}

#[test]
fn field_bad_flags_exit_2_naming_the_flag() {
    for (args, word) in [
        (vec!["--upto", "0"], "--upto"),
        (vec!["--slot-opening", "1.5"], "--slot-opening"),
        (vec!["--slot-opening", "-0.1"], "--slot-opening"),
        // Slips outside 0..1 are generating or plugging and accepted; beyond ±10 refused.
        (vec!["--slip", "12"], "--slip"),
        (vec!["--slip", "-10.5"], "--slip"),
        (vec!["--at-deg", "inf"], "--at-deg"),
        (vec!["--currents", "1@0,1@-120"], "--currents"),
        (vec!["--currents", "1@0,one@-120,1@120"], "--currents"),
        (vec!["--currents", "0@0,0@0,0@0"], "working wave"),
        (vec!["--sequence", "sideways"], "--sequence"),
        (
            vec!["--sequence", "negative", "--currents", "1@0,1@1,1@2"],
            "--currents",
        ),
    ] {
        let o = beltwright()
            .args(["field", "layouts/pump-rewind.toml"])
            .args(&args)
            .output()
            .unwrap();
        assert_eq!(o.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8_lossy(&o.stderr);
        assert!(err.contains(word), "{args:?}: {err}");
    }
    let o = beltwright()
        .args(["field", "no-such-file.toml"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("no-such-file.toml"));
}
