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
