//! The JSON output of every command is documented by a JSON Schema in `docs/schemas/`, made
//! from the report types (schemars); the files must match the types, and the tool's actual
//! output on the examples must validate against them.
//! Set BELTWRIGHT_WRITE_SCHEMAS=1 to write the files anew after a deliberate change.

mod common;
use common::json;

use serde_json::Value;

fn path(cmd: &str) -> String {
    format!("docs/schemas/{cmd}.schema.json")
}

#[test]
fn schema_files_match_the_report_types() {
    let write = std::env::var_os("BELTWRIGHT_WRITE_SCHEMAS").is_some();
    for (cmd, schema) in beltwright::output::schema::all() {
        let text = serde_json::to_string_pretty(&schema).expect("schema") + "\n";
        if write {
            std::fs::create_dir_all("docs/schemas").expect("folder");
            std::fs::write(path(cmd), &text).expect("write");
        }
        let on_disk = std::fs::read_to_string(path(cmd)).unwrap_or_else(|_| {
            panic!("{} missing: run with BELTWRIGHT_WRITE_SCHEMAS=1", path(cmd))
        });
        assert_eq!(on_disk, text, "{cmd}: docs/schemas is out of date");
    }
}

use common::schema_check as check;

fn schema(cmd: &str) -> Value {
    serde_json::from_str(&std::fs::read_to_string(path(cmd)).expect("schema file")).expect("json")
}

fn validates(cmd: &str, args: &[&str]) {
    let mut all = vec![cmd];
    all.extend_from_slice(args);
    all.extend_from_slice(&["--format", "json"]);
    let out = common::run(&all);
    let v: Value = serde_json::from_slice(&out.stdout).unwrap_or_else(|e| panic!("{all:?}: {e}"));
    let s = schema(cmd);
    if let Err(e) = check(&v, &s, cmd) {
        panic!("{all:?}: {e}");
    }
}

#[test]
fn single_phase_views_validate_against_their_schema() {
    let s = schema("single-phase");
    for cmd in ["plan", "factors", "field", "card", "audit"] {
        let out = common::run(&[cmd, "layouts/pump-capacitor.toml", "--format", "json"]);
        let v: Value = serde_json::from_slice(&out.stdout).expect("json");
        if let Err(e) = check(&v, &s, "single-phase") {
            panic!("{cmd}: {e}");
        }
    }
}

#[test]
fn two_winding_views_validate_against_their_schemas() {
    let pair = schema("two-winding");
    for (layout, ok) in [
        ("layouts/hoist-two-winding.toml", true),
        ("layouts/hoist-two-winding-as-found.toml", false),
    ] {
        for cmd in ["plan", "factors", "field", "card", "audit"] {
            let out = common::run(&[cmd, layout, "--format", "json"]);
            let v: Value = serde_json::from_slice(&out.stdout).expect("json");
            if let Err(e) = check(&v, &pair, "two-winding") {
                panic!("{cmd} {layout}: {e}");
            }
            // Each winding's part is that view's JSON for one winding (a synthesized
            // winding has no audit of its own).
            if cmd == "audit" && ok {
                continue;
            }
            let own = schema(cmd);
            let mut first = v.clone();
            if let Some(o) = first.as_object_mut() {
                for k in [
                    "kind",
                    "second_winding",
                    "pair",
                    "pair_findings",
                    "all_sound",
                ] {
                    o.remove(k);
                }
            }
            for (which, part) in [("first", &first), ("second", &v["second_winding"])] {
                if let Err(e) = check(part, &own, cmd) {
                    panic!("{cmd} {layout}, {which} winding: {e}");
                }
            }
        }
    }
}

#[test]
fn actual_output_validates_against_the_schemas() {
    let _ = json;
    for l in [
        "layouts/pump-rewind.toml",
        "layouts/pallet-shuttle.toml",
        "layouts/fan-concentric.toml",
        "layouts/servo-tooth-coil.toml",
    ] {
        for cmd in ["plan", "factors", "field", "pitch", "card"] {
            validates(cmd, &[l]);
        }
    }
    validates("audit", &["layouts/hoist-rewind-faulty.toml"]);
    validates("audit", &["layouts/pump-rewind.toml"]);
    validates(
        "rewind",
        &[
            "layouts/hoist-rewind-sound.toml",
            "layouts/hoist-rewind-new.toml",
            "--wire-diameter-mm",
            "1.12",
        ],
    );
    validates(
        "survey",
        &["--slots", "6..=30", "--poles", "2..=8", "--layers", "1,2"],
    );
    validates(
        "thrust",
        &["layouts/pallet-shuttle.toml", "--slip", "-0.2..=1.2"],
    );
    validates("inductance", &["layouts/pallet-shuttle.toml", "--coils"]);
    validates(
        "plates",
        &[
            "layouts/pallet-shuttle.toml",
            "--metal",
            "aluminium,copper,20",
        ],
    );
    validates("loading", &["layouts/pump-rewind.toml"]);
    validates("loading", &["layouts/pallet-shuttle.toml"]);
    validates("size", &["layouts/stripped-core.toml"]);
    validates(
        "size",
        &[
            "layouts/pallet-shuttle.toml",
            "--thrust-n",
            "100",
            "--at-slip",
            "0.2",
        ],
    );
    validates(
        "rewind",
        &["layouts/pump-rewind.toml", "layouts/pump-rewind.toml"],
    );
}

// The validator itself rejects what it should (a negative control).
#[test]
fn the_validator_rejects_a_wrong_output() {
    let s = schema("plan");
    let mut v: Value = json(&["plan", "layouts/pump-rewind.toml", "--format", "json"]);
    assert!(check(&v, &s, "plan").is_ok());
    v["winding_factor"] = Value::String("high".into());
    assert!(check(&v, &s, "plan").is_err());
    let mut v: Value = json(&["plan", "layouts/pump-rewind.toml", "--format", "json"]);
    v.as_object_mut().expect("object").remove("coils");
    assert!(check(&v, &s, "plan").is_err());
    let mut v: Value = json(&["plan", "layouts/pump-rewind.toml", "--format", "json"]);
    v["schema_version"] = Value::String("3".into());
    assert!(check(&v, &s, "plan").is_err());
}
