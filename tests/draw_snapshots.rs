//! Snapshots of a small winding's sheets, so that any change to a drawing shows up in
//! review as a diff of the SVG text. Accept a deliberate change by running the tests with
//! `INSTA_UPDATE=always` and committing the updated `tests/snapshots/*.snap`.

use beltwright::draw::{self, Page, Sheet};
use beltwright::{layout, winding};

/// An invented bench-grinder stator: 12 slots, 2 poles, double layer, short-pitched, in
/// delta, small enough for a readable snapshot.
const GRINDER: &str = r#"
title = "Bench grinder stator"
[machine]
topology = "rotary"
slots = 12
poles = 2
[winding]
layers = 2
pitch = 5
turns_per_coil = 60
connection = "delta"
[supply]
frequency_hz = 50.0
"#;

/// An invented sliding-gate primary: 2 poles, open ends with half-filled slots.
const GATE: &str = r#"
title = "Sliding gate primary"
[machine]
topology = "linear"
slots = 14
poles = 2
[winding]
layers = 2
pitch = 2
turns_per_coil = 25
[core]
slot_pitch_mm = 10.0
[supply]
frequency_hz = 50.0
"#;

fn sheet(src: &str, sheet: Sheet) -> String {
    let spec = layout::parse(src, "snapshot").expect("valid layout");
    let w = winding::build(&spec).expect("buildable");
    let pages = draw::draw(
        &beltwright::study::Study::new(&w, None),
        sheet,
        &Page::default(),
    );
    assert_eq!(pages.len(), 1);
    pages.into_iter().next().unwrap_or_default()
}

#[test]
fn grinder_slot_sheet() {
    insta::assert_snapshot!(sheet(GRINDER, Sheet::Slots));
}

#[test]
fn grinder_connection_sheet() {
    insta::assert_snapshot!(sheet(GRINDER, Sheet::Connections));
}

#[test]
fn grinder_star_sheet() {
    insta::assert_snapshot!(sheet(GRINDER, Sheet::Star));
}

#[test]
fn gate_slot_sheet() {
    insta::assert_snapshot!(sheet(GATE, Sheet::Slots));
}
