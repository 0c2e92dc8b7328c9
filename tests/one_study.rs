//! One study: the HTML report of a recorded flat primary (the case with the most reports:
//! plan, audit, card, performance, inductance, factors, field and its snapshots, spans) and
//! the PDF report's parts and sheets run each analysis exactly once, however many sheets,
//! title blocks and sections read them.
//!
//! The counts are the analyses' own (`beltwright::runs`, added to by each report-making
//! function itself), so a presenter that called an analysis directly would show here. This
//! file holds one test so that no other test in the same process adds to the counts.

use beltwright::draw::{self, Page, Sheet};
use beltwright::layout::parse;
use beltwright::output::html;
use beltwright::runs::{Analysis, runs};
use beltwright::spec::CoilEntry;
use beltwright::study::Study;
use beltwright::winding::{build, build_lenient};

#[test]
fn the_report_of_a_recorded_flat_primary_runs_each_analysis_once() {
    // The example flat primary, recorded coil by coil as a shop would write it down.
    let source = std::fs::read_to_string("layouts/pallet-shuttle.toml").expect("example");
    let mut spec = parse(&source, "pallet-shuttle.toml").expect("layout");
    let planned = build(&spec).expect("winding");
    spec.coils = planned
        .coils
        .iter()
        .map(|c| CoilEntry {
            phase: c.phase,
            go: c.go,
            back: c.back,
            turns: c.turns,
            path: c.path,
        })
        .collect();
    let recorded = build_lenient(&spec).expect("recorded winding");
    assert!(recorded.from_coil_list);
    let before: Vec<usize> = Analysis::OF_A_WINDING.iter().map(|&a| runs(a)).collect();

    let study = Study::new(&recorded, None);
    let page = html::document(&study);
    assert!(page.contains("Performance of the flat primary"));
    assert!(page.contains("Audit of the coil list"));
    // The PDF report reads the same study: its parts and every sheet again.
    let parts = html::parts(&study);
    let sheets: usize = Sheet::ALL
        .into_iter()
        .filter(|s| s.applies(&study))
        .map(|s| draw::draw(&study, s, &Page::default()).len())
        .sum();
    assert!(
        parts.parts.len() >= 8 && sheets >= 6,
        "{} parts, {sheets} pages",
        parts.parts.len()
    );

    for (a, was) in Analysis::OF_A_WINDING.iter().zip(before) {
        assert_eq!(runs(*a) - was, 1, "{a:?} ran {} times", runs(*a) - was);
    }

    // A pole-changing winding adds its two speeds (read by the connection sheet and the
    // page's "Two speeds" part): worked out once too, with the card beside it.
    let source = std::fs::read_to_string("layouts/fan-two-speed.toml").expect("example");
    let fan = build(&parse(&source, "fan-two-speed.toml").expect("layout")).expect("winding");
    let counted = [Analysis::Speeds, Analysis::Card, Analysis::Plan];
    let before: Vec<usize> = counted.iter().map(|&a| runs(a)).collect();
    let study = Study::new(&fan, None);
    let page = html::document(&study);
    assert!(page.contains("Two speeds"));
    let _ = html::parts(&study);
    for s in Sheet::ALL.into_iter().filter(|s| s.applies(&study)) {
        let _ = draw::draw(&study, s, &Page::default());
    }
    for (a, was) in counted.iter().zip(before) {
        assert_eq!(runs(*a) - was, 1, "{a:?} ran {} times", runs(*a) - was);
    }

    // Two windings in one core: the page reads each winding's study and the pair's report,
    // each worked out once (each winding's analyses once per winding).
    let source = std::fs::read_to_string("layouts/hoist-two-winding.toml").expect("example");
    let spec = parse(&source, "hoist-two-winding.toml").expect("layout");
    let second = spec.second.clone().expect("second winding");
    let (one, two) = (
        build(&spec).expect("first"),
        build(&second.spec).expect("second"),
    );
    let counted = [
        Analysis::TwoWinding,
        Analysis::Card,
        Analysis::Plan,
        Analysis::Factors,
        Analysis::Field,
        Analysis::Pitch,
    ];
    let before: Vec<usize> = counted.iter().map(|&a| runs(a)).collect();
    let pair = beltwright::two_winding::TwoStudy::new([&one, &two], [None, None], second.sharing);
    let page = html::document_two(&pair, Some("hoist"));
    assert!(page.contains("Two windings in one core"));
    for (a, was) in counted.iter().zip(before) {
        let want = if *a == Analysis::TwoWinding { 1 } else { 2 };
        assert_eq!(runs(*a) - was, want, "{a:?} ran {} times", runs(*a) - was);
    }
}
