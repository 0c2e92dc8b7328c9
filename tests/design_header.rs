//! Every report opens with the same design header: the same `design` object in every
//! command's JSON and the same lines under every text heading, with the facts the plan and
//! the factor table give on their own.

mod common;
use common::{json, run};

use serde_json::Value;

/// The commands that report on one winding, for a layout (thrust and inductance need a
/// flat primary with its secondary).
fn commands(layout: &str, flat: bool) -> Vec<Vec<&str>> {
    let mut c = vec![
        vec!["plan", layout],
        vec!["factors", layout],
        vec!["field", layout],
        vec!["pitch", layout],
        vec!["audit", layout],
        vec!["card", layout],
    ];
    if flat {
        c.push(vec!["thrust", layout]);
        c.push(vec!["inductance", layout]);
    }
    c
}

#[test]
fn every_report_carries_the_same_design_header() {
    for (layout, flat) in [
        ("layouts/pallet-shuttle.toml", true),
        ("layouts/pump-rewind.toml", false),
        ("layouts/fan-concentric.toml", false),
        ("layouts/hoist-rewind-sound.toml", false),
    ] {
        let plan = json(&["plan", layout, "--format", "json"]);
        let design = plan["design"].clone();
        // The header states what the plan states on its own.
        assert_eq!(design["slots"], plan["slots"], "{layout}");
        assert_eq!(design["poles"], plan["poles"], "{layout}");
        assert_eq!(design["pitch"], plan["pitch"], "{layout}");
        assert_eq!(design["connection"], plan["connection"], "{layout}");
        assert_eq!(design["winding_factor"], plan["winding_factor"], "{layout}");
        let factors = json(&["factors", layout, "--format", "json"]);
        let first = factors["rows"]
            .as_array()
            .and_then(|r| r.iter().find(|r| r["order"] == 1.0))
            .expect("order 1");
        let kw = design["winding_factor"].as_f64().expect("k_w1");
        assert!((kw - first["winding"].as_f64().expect("k_w")).abs() < 1e-12);

        let mut lines: Option<Vec<String>> = None;
        for args in commands(layout, flat) {
            // An audit of a sound winding exits 0; of a faulty one 1 (still a report).
            let mut j = args.clone();
            j.extend(["--format", "json"]);
            let out = run(&j);
            assert!(out.status.code().is_some_and(|c| c <= 1), "{j:?}");
            let v: Value = serde_json::from_slice(&out.stdout).expect("JSON");
            assert_eq!(v["design"], design, "{args:?}: design header differs");
            // One name and one type per fact: a fact the header and the report both carry
            // at the top level has the same value (so the same type) in both.
            for (key, value) in design.as_object().expect("header object") {
                if let Some(own) = v.get(key) {
                    assert_eq!(own, value, "{args:?}: `{key}` differs from the header's");
                }
            }
            assert_eq!(v["schema_version"], 3, "{args:?}");
            // Text: the three lines under the heading are the same for every command.
            let text = String::from_utf8(run(&args).stdout).expect("utf-8");
            let head: Vec<String> = text.lines().skip(1).take(3).map(String::from).collect();
            assert!(
                head[0].contains(&format!("{} slots", design["slots"])),
                "{args:?}"
            );
            match &lines {
                None => lines = Some(head),
                Some(l) => assert_eq!(&head, l, "{args:?}: text header differs"),
            }
        }
    }
}

/// A rewind opens with both designs' headers: the one as found as its plan gives it, the
/// one to wind as its plan gives it but for the turns per coil the rewind worked out.
#[test]
fn a_rewind_carries_both_design_headers() {
    let (from, to) = (
        "layouts/hoist-rewind-sound.toml",
        "layouts/hoist-rewind-new.toml",
    );
    let r = json(&["rewind", from, to, "--format", "json"]);
    let old = json(&["plan", from, "--format", "json"]);
    let new = json(&["plan", to, "--format", "json"]);
    assert_eq!(r["old_design"], old["design"]);
    let mut want = new["design"].clone();
    want["turns_per_coil"] = r["turns_per_coil"].clone();
    want["turns_assumed"] = Value::Bool(false);
    assert_eq!(r["new_design"], want);
}
