//! Every kind of bad input: exit status 2, a message naming the file and key (and line),
//! what would be valid, no panic, and nothing written.

use assert_cmd::Command;
use std::path::Path;

const GOOD: &str = "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
                    [winding]\nlayers = 2\npitch = 7\n";

/// Run `plan` on a layout with the given text; return stderr after checking the exit
/// status, that it did not panic, and that the folder holds nothing new.
fn refuse(text: &str) -> String {
    let dir = tempfile::tempdir().expect("temp dir");
    let file = dir.path().join("bad.toml");
    std::fs::write(&file, text).expect("write layout");
    let out = Command::cargo_bin("beltwright")
        .expect("binary")
        .current_dir(dir.path())
        .args(["plan", "bad.toml", "--format", "json"])
        .output()
        .expect("runs");
    let err = String::from_utf8_lossy(&out.stderr).to_string();
    assert_eq!(out.status.code(), Some(2), "stderr: {err}");
    assert!(out.stdout.is_empty(), "no report on stdout");
    assert!(!err.contains("panicked"), "{err}");
    assert!(err.contains("bad.toml"), "names the file: {err}");
    let entries: Vec<_> = std::fs::read_dir(dir.path()).expect("dir").collect();
    assert_eq!(entries.len(), 1, "nothing written beside the input");
    err
}

fn with(from: &str, to: &str) -> String {
    assert!(GOOD.contains(from), "{from}");
    GOOD.replace(from, to)
}

#[test]
fn malformed_toml_names_the_line() {
    let err = refuse("[machine\ntopology = \"rotary\"\n");
    assert!(err.contains("line 1"), "{err}");
}

#[test]
fn wrong_type_names_the_key_and_line() {
    let err = refuse(&with("slots = 36", "slots = \"thirty-six\""));
    assert!(err.contains("line 3") && err.contains("slots"), "{err}");
}

#[test]
fn unknown_key_is_named_with_what_is_valid() {
    let err = refuse(&with("pitch = 7", "pitch = 7\nturns_per_coi = 12"));
    assert!(
        err.contains("turns_per_coi") && err.contains("turns_per_coil"),
        "{err}"
    );
}

#[test]
fn zero_negative_and_huge_values_are_refused_with_the_valid_range() {
    for (from, to, key) in [
        ("slots = 36", "slots = 0", "machine.slots"),
        ("slots = 36", "slots = -12", "machine.slots"),
        ("slots = 36", "slots = 1000000000000", "machine.slots"),
        ("poles = 4", "poles = 0", "machine.poles"),
        ("poles = 4", "poles = 5", "machine.poles"),
        ("pitch = 7", "pitch = 0", "winding.pitch"),
        (
            "pitch = 7",
            "pitch = 7\nturns_per_coil = 0",
            "winding.turns_per_coil",
        ),
        (
            "pitch = 7",
            "pitch = 7\nparallel_paths = -1",
            "winding.parallel_paths",
        ),
        ("pitch = 7", "pitch = 7\nskew = -1.0", "winding.skew"),
    ] {
        let err = refuse(&with(from, to));
        assert!(err.contains(key), "{to}: {err}");
        assert!(err.contains("line"), "{to}: {err}");
    }
    // The message names the valid range (it said only "positive" before the ranges per
    // key; a denormal 5e-324 mm is positive but meaningless, and is refused too).
    for bad in ["-3.0", "5e-324", "1e300"] {
        let err = refuse(&format!("{GOOD}[core]\nslot_pitch_mm = {bad}\n"));
        assert!(
            err.contains("core.slot_pitch_mm") && err.contains("from 0.1 to 10000"),
            "{err}"
        );
        assert!(err.len() < 200, "short numbers in messages: {err}");
    }
    let err = refuse(&format!("{GOOD}[supply]\nfrequency_hz = 5e-324\n"));
    assert!(err.contains("supply.frequency_hz"), "{err}");
    let err = refuse(&format!("{GOOD}[supply]\nfrequency_hz = 0.0\n"));
    assert!(err.contains("supply.frequency_hz"), "{err}");
}

#[test]
fn three_layers_are_refused() {
    let err = refuse(&with("layers = 2", "layers = 3"));
    assert!(
        err.contains("winding.layers") && err.contains("1 to 2"),
        "{err}"
    );
}

#[test]
fn a_span_longer_than_the_core_is_refused() {
    let err = refuse(&with("pitch = 7", "pitch = 40"));
    assert!(
        err.contains("winding.pitch") && err.contains("1 to 35"),
        "{err}"
    );
    let err = refuse(&with("pitch = 7", "pitch = 20"));
    assert!(err.contains("longest span is 18"), "{err}");
}

#[test]
fn an_unbalanced_request_says_what_would_work() {
    // 20 slots, 4 poles: 20/(3·gcd(20, 2)) is not whole (fractional-slot theory).
    let err = refuse(&with("slots = 36", "slots = 20"));
    assert!(err.contains("18 or 21 slots can"), "{err}");
    // A flat primary whose slot count does not fit q and span.
    let err = refuse(
        "[machine]\ntopology = \"linear\"\nslots = 30\npoles = 4\n[winding]\nlayers = 2\npitch = 5\n",
    );
    assert!(err.contains("29 slots"), "{err}");
}

#[test]
fn a_coil_outside_the_core_is_named() {
    let err = refuse(&format!(
        "{GOOD}[[coil]]\nphase = \"U\"\ngo = 1\nback = 8\n[[coil]]\nphase = \"U\"\ngo = 2\nback = 37\n"
    ));
    assert!(
        err.contains("coil[2].back") && err.contains("1 to 36"),
        "{err}"
    );
    assert!(err.contains("line 15"), "{err}");
}

#[test]
fn an_unknown_phase_lists_the_phases() {
    let err = refuse(&format!(
        "{GOOD}[[coil]]\nphase = \"X\"\ngo = 1\nback = 8\n"
    ));
    assert!(err.contains("U, V, W"), "{err}");
}

#[test]
fn an_overfilled_slot_names_its_coils() {
    let coil = |go: u32, back: u32| format!("[[coil]]\nphase = \"U\"\ngo = {go}\nback = {back}\n");
    let err = refuse(&format!(
        "{GOOD}{}{}{}",
        coil(1, 8),
        coil(1, 9),
        coil(1, 10)
    ));
    assert!(
        err.contains("slot 1") && err.contains("coils 1, 2, 3"),
        "{err}"
    );
}

#[test]
fn parallel_paths_that_would_circulate_current_are_refused() {
    let err = refuse(&with("pitch = 7", "pitch = 7\nparallel_paths = 3"));
    assert!(err.contains("1, 2, 4"), "{err}");
}

#[test]
fn a_missing_file_is_named() {
    let out = Command::cargo_bin("beltwright")
        .expect("binary")
        .args(["plan", "no/such/layout.toml"])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("no/such/layout.toml"), "{err}");
    assert!(!Path::new("no/such/layout.toml").exists());
}

#[test]
fn bad_flags_exit_two() {
    for args in [
        // Slips outside 0..1 are generating or plugging (accepted); beyond ±10 is refused.
        vec!["plan", "layouts/pump-rewind.toml", "--slip", "11"],
        vec!["plan", "layouts/pump-rewind.toml", "--slip", "-1e300"],
        vec!["plan", "layouts/pump-rewind.toml", "--format", "xml"],
        vec!["factors", "layouts/pump-rewind.toml", "--upto", "0"],
        vec!["frobnicate"],
    ] {
        let out = Command::cargo_bin("beltwright")
            .expect("binary")
            .args(&args)
            .output()
            .expect("runs");
        assert_eq!(out.status.code(), Some(2), "{args:?}");
    }
}
