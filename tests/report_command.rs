//! `beltwright report`: the whole design in one document or one text.

mod common;
use common::run;

#[test]
fn report_writes_every_sheet_into_one_pdf() {
    let dir = tempfile::tempdir().expect("dir");
    let pdf = dir.path().join("pack.pdf");
    let out = run(&[
        "report",
        "layouts/servo-tooth-coil.toml",
        "-o",
        pdf.to_str().expect("utf-8"),
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let bytes = std::fs::read(&pdf).expect("written");
    assert!(bytes.starts_with(b"%PDF"));
    // Every sheet (slots, connections, star, field, data card), each with the pages the
    // library draws for it, after the report's tables.
    let src = std::fs::read_to_string("layouts/servo-tooth-coil.toml").expect("layout");
    let spec = beltwright::layout::parse(&src, "servo").expect("valid");
    let w = beltwright::winding::build(&spec).expect("builds");
    let page = beltwright::draw::Page::default();
    let study = beltwright::study::Study::new(&w, None);
    let pages: usize = beltwright::draw::Sheet::ALL
        .iter()
        .filter(|s| s.applies(&study))
        .map(|s| beltwright::draw::draw(&study, *s, &page).len())
        .sum();
    assert!(pages >= 5);
    // The tables come first (tests/draw_command.rs counts them), then the sheets.
    let count: usize = String::from_utf8_lossy(&bytes)
        .split("/Count ")
        .nth(1)
        .and_then(|r| r.split_whitespace().next())
        .and_then(|n| n.parse().ok())
        .expect("a page count");
    assert!(count > pages, "{count} pages for {pages} sheet pages");
}

#[test]
fn report_without_a_file_prints_plan_factors_and_field() {
    let out = run(&["report", "layouts/pump-rewind.toml"]);
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    for part in [
        "Coils",
        "Winding factors of phase U",
        "Travelling field",
        "CAUTION",
    ] {
        assert!(text.contains(part), "{part}");
    }
}

#[test]
fn report_refuses_an_unknown_output_kind() {
    let dir = tempfile::tempdir().expect("dir");
    let txt = dir.path().join("pack.txt");
    let out = run(&[
        "report",
        "layouts/pump-rewind.toml",
        "-o",
        txt.to_str().expect("utf-8"),
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(!txt.exists());
}
