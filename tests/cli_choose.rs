//! The pitch and survey commands as a user runs them.

mod common;
use common::{json, run};

#[test]
fn pitch_json_has_rows_and_a_recommendation() {
    let v = json(&[
        "pitch",
        "layouts/pump-rewind.toml",
        "--suppress",
        "5,7",
        "--format",
        "json",
    ]);
    let rows = v["rows"].as_array().expect("rows");
    assert!(
        rows.iter()
            .all(|r| r["pitch"].is_u64() && r["winding"].is_f64())
    );
    // 36 slots, 4 poles, floor 0.9, suppress 5 and 7: span 7 (7/9) has the least 5th and
    // 7th content of the spans keeping k_w1 ≥ 0.9 (closed-form factors, Say 1983).
    assert_eq!(v["recommended"], 7);
}

#[test]
fn pitch_draws_an_svg_chart_atomically() {
    let dir = tempfile::tempdir().expect("dir");
    let svg = dir.path().join("span.svg");
    let out = run(&[
        "pitch",
        "layouts/pump-rewind.toml",
        "--svg",
        svg.to_str().expect("utf-8"),
    ]);
    assert!(out.status.success());
    let text = std::fs::read_to_string(&svg).expect("chart written");
    // On the shared page, as every sheet: labelled, with the title block and the caution.
    assert!(text.starts_with("<svg") && text.contains("recommended span 7"));
    assert!(text.contains("role=\"img\"") && text.contains("CAUTION"));
    assert!(text.contains("de-energised"), "chart carries the caution");
    let left: Vec<_> = std::fs::read_dir(dir.path()).expect("dir").collect();
    assert_eq!(left.len(), 1, "no temporary files left behind");
}

#[test]
fn pitch_refuses_to_overwrite_its_input() {
    let dir = tempfile::tempdir().expect("dir");
    let layout = dir.path().join("core.toml");
    std::fs::copy("layouts/pump-rewind.toml", &layout).expect("copy");
    let before = std::fs::read(&layout).expect("read");
    let out = run(&[
        "pitch",
        layout.to_str().expect("utf-8"),
        "--svg",
        layout.to_str().expect("utf-8"),
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert_eq!(std::fs::read(&layout).expect("read"), before);
}

#[test]
fn survey_json_rows_have_the_contract_fields() {
    let v = json(&[
        "survey", "--slots", "18..=24", "--poles", "4", "--format", "json",
    ]);
    let rows = v["rows"].as_array().expect("rows");
    assert_eq!(rows.len(), 7);
    for r in rows {
        for key in ["slots", "poles", "layers", "feasible"] {
            assert!(!r[key].is_null(), "{key}");
        }
        if r["feasible"] == true {
            assert!(r["pitch"].is_u64() && r["winding"].is_f64());
        } else {
            assert!(r["reason"].is_string());
        }
    }
    // 20 slots cannot carry 4 poles (Z/(3·gcd(20, 2)) not whole).
    let twenty = rows.iter().find(|r| r["slots"] == 20).expect("row");
    assert_eq!(twenty["feasible"], false);
}

#[test]
fn survey_filters_and_sorts() {
    let v = json(&[
        "survey", "--slots", "6..=48", "--poles", "2..=16", "--min-kw", "0.95", "--sort",
        "winding", "--format", "json",
    ]);
    let kws: Vec<f64> = v["rows"]
        .as_array()
        .expect("rows")
        .iter()
        .filter_map(|r| r["winding"].as_f64())
        .collect();
    assert!(!kws.is_empty());
    assert!(kws.iter().all(|&k| k >= 0.95));
    assert!(
        kws.windows(2).all(|w| w[0] >= w[1]),
        "sorted by k_w1, highest first"
    );
}

#[test]
fn survey_covers_flat_primaries_through_the_planner() {
    let v = json(&[
        "survey",
        "--slots",
        "29",
        "--poles",
        "4",
        "--topology",
        "linear",
        "--format",
        "json",
    ]);
    let r = &v["rows"][0];
    assert_eq!(r["feasible"], true);
    assert_eq!(r["pitch"], 5);
}

#[test]
fn survey_bad_ranges_exit_two() {
    for args in [
        vec!["survey", "--slots", "48..=12", "--poles", "4"],
        vec!["survey", "--slots", "2..=12", "--poles", "4"],
        vec!["survey", "--slots", "x", "--poles", "4"],
        vec!["survey", "--slots", "12", "--poles", "4", "--layers", "3"],
        vec!["survey", "--slots", "12", "--poles", "4", "--phases", "4"],
        vec![
            "pitch",
            "layouts/pump-rewind.toml",
            "--min-fundamental",
            "2",
        ],
        vec!["pitch", "layouts/pump-rewind.toml", "--suppress", "-5"],
    ] {
        let out = run(&args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        assert!(!out.stderr.is_empty());
    }
}
