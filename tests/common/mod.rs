//! Helpers shared by the command-line tests: run the built binary as a user would.
#![allow(dead_code)] // each test file uses the helpers it needs

use assert_cmd::Command;
use serde_json::Value;

/// The `beltwright` binary of this build.
pub fn beltwright() -> Command {
    Command::cargo_bin("beltwright").expect("binary built")
}

/// Run with these arguments and return what it printed and its status.
pub fn run(args: &[&str]) -> std::process::Output {
    beltwright().args(args).output().expect("runs")
}

/// Run with these arguments, expect success, and parse stdout as one JSON object.
pub fn json(args: &[&str]) -> Value {
    let out = run(args);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).expect("one JSON object")
}

/// A layout written to a temporary `.toml` file, removed when dropped.
pub fn temp_layout(text: &str) -> tempfile::NamedTempFile {
    let f = tempfile::Builder::new()
        .suffix(".toml")
        .tempfile()
        .expect("temp file");
    std::fs::write(f.path(), text).expect("write");
    f
}

/// A 12-slot, 2-pole single-layer record (q = 2) with these coils: (phase, go, back).
pub fn small_record(coils: &[(&str, usize, usize)]) -> String {
    let mut s = String::from(
        "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n\n[winding]\nlayers = 1\n",
    );
    for (p, g, b) in coils {
        s += &format!("\n[[coil]]\nphase = \"{p}\"\ngo = {g}\nback = {b}\n");
    }
    s
}

/// A balanced record for [`small_record`]. 12 slots, 2 poles, slot angle 30°: belts U+ 1-2,
/// W- 3-4, V+ 5-6, U- 7-8, W+ 9-10, V- 11-12, so U 1-7, 2-8; V 5-11, 6-12; W 9-3, 10-4
/// (built by hand from the 60° belts).
pub const SOUND_12: [(&str, usize, usize); 6] = [
    ("U", 1, 7),
    ("U", 2, 8),
    ("W", 9, 3),
    ("W", 10, 4),
    ("V", 5, 11),
    ("V", 6, 12),
];

mod schema;
#[allow(unused_imports)] // each test file uses the helpers it needs
pub use schema::schema_check;
