//! Balance and phase sequence are two facts. Exchanging the labels of two phases of a
//! balanced positive-sequence set gives a balanced negative-sequence set (Fortescue 1918,
//! symmetrical components: the exchange maps the positive-sequence operator onto the
//! negative one and leaves every magnitude and the 2π/m spacing as it was), so `plan` and
//! `audit` must say "balanced" and "negative" for it; a reversed coil, which changes a
//! magnitude, is what makes a winding unbalanced.

mod common;

use serde_json::Value;

/// The coil list of `layout`'s plan as a recorded layout, with phase labels mapped by
/// `relabel` and coil `reverse` (0-based) reversed.
fn record_of(layout: &str, relabel: &dyn Fn(&str) -> String, reverse: Option<usize>) -> String {
    let plan = common::json(&["plan", layout, "--format", "json"]);
    let d = &plan["design"];
    let mut s = format!(
        "[machine]\ntopology = \"{}\"\nslots = {}\npoles = {}\n\n[winding]\nlayers = {}\n\
         turns_per_coil = {}\n",
        d["topology"].as_str().expect("topology"),
        d["slots"],
        d["poles"],
        d["layers"],
        d["turns_per_coil"],
    );
    for (i, c) in plan["coils"].as_array().expect("coils").iter().enumerate() {
        let (mut go, mut back) = (
            c["go"].as_u64().expect("go"),
            c["back"].as_u64().expect("back"),
        );
        if reverse == Some(i) {
            std::mem::swap(&mut go, &mut back);
        }
        s += &format!(
            "\n[[coil]]\nphase = \"{}\"\ngo = {go}\nback = {back}\n",
            relabel(c["phase"].as_str().expect("phase"))
        );
    }
    s
}

fn swap_v_w(p: &str) -> String {
    match p {
        "V" => "W".into(),
        "W" => "V".into(),
        other => other.into(),
    }
}

fn facts(file: &std::path::Path) -> (Value, Value) {
    let f = file.to_str().expect("path");
    let plan = common::json(&["plan", f, "--format", "json"]);
    let out = common::run(&["audit", f, "--format", "json"]);
    let audit: Value = serde_json::from_slice(&out.stdout).expect("audit JSON");
    (plan, audit)
}

#[test]
fn two_phases_exchanged_are_balanced_in_negative_sequence() {
    for layout in [
        "layouts/pump-rewind.toml",
        "layouts/fan-concentric.toml",
        "layouts/mill-fractional.toml",
        "layouts/servo-tooth-coil.toml",
        "layouts/pallet-shuttle.toml",
    ] {
        let same = common::temp_layout(&record_of(layout, &|p| p.to_string(), None));
        let (plan, audit) = facts(same.path());
        assert_eq!(plan["balanced"], true, "{layout}");
        assert_eq!(plan["sequence"], "positive", "{layout}");
        assert_eq!(audit["balanced"], true, "{layout}");
        assert_eq!(audit["sequence"], "positive", "{layout}");

        let swapped = common::temp_layout(&record_of(layout, &swap_v_w, None));
        let (plan, audit) = facts(swapped.path());
        assert_eq!(
            plan["balanced"], true,
            "{layout}: balance does not depend on the order"
        );
        assert_eq!(plan["sequence"], "negative", "{layout}");
        assert_eq!(audit["balanced"], true, "{layout}");
        assert_eq!(audit["sequence"], "negative", "{layout}");
        // For a one-speed winding the exchange is still worth a finding: the leads.
        let kinds: Vec<&str> = audit["findings"]
            .as_array()
            .expect("findings")
            .iter()
            .filter_map(|f| f["kind"].as_str())
            .collect();
        assert!(!kinds.is_empty(), "{layout}: {kinds:?}");
        let text = common::run(&["plan", swapped.path().to_str().expect("path")]);
        assert!(
            String::from_utf8_lossy(&text.stdout).contains("balanced: yes, in NEGATIVE sequence"),
            "{layout}"
        );
    }
}

#[test]
fn a_reversed_coil_unbalances_and_has_no_sequence() {
    let layout = "layouts/pump-rewind.toml";
    let rec = common::temp_layout(&record_of(layout, &|p| p.to_string(), Some(0)));
    let (plan, audit) = facts(rec.path());
    assert_eq!(plan["balanced"], false);
    assert_eq!(plan["sequence"], Value::Null);
    assert_eq!(audit["balanced"], false);
}
