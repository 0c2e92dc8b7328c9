//! The `draw` command and `plan --out`: what a user types to get sheets on disk.

mod common;
use common::beltwright;

use std::path::{Path, PathBuf};

fn layout(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("layouts")
        .join(name)
}

fn any_layout() -> PathBuf {
    let mut all: Vec<PathBuf> =
        std::fs::read_dir(PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("layouts"))
            .expect("layouts/")
            .filter_map(|e| e.ok().map(|e| e.path()))
            .filter(|p| p.extension().and_then(|e| e.to_str()) == Some("toml"))
            .collect();
    all.sort();
    all.remove(0)
}

#[test]
fn draw_writes_svg_pdf_and_png_by_extension() {
    let dir = tempfile::tempdir().expect("tempdir");
    for (sheet, ext, magic) in [
        ("slots", "svg", &b"<svg"[..]),
        ("connections", "pdf", &b"%PDF-"[..]),
        ("star", "png", &b"\x89PNG"[..]),
    ] {
        let out = dir.path().join(format!("sheet.{ext}"));
        beltwright()
            .args(["draw"])
            .arg(any_layout())
            .args(["--sheet", sheet, "--page", "a3", "--portrait", "-o"])
            .arg(&out)
            .assert()
            .success();
        let bytes = std::fs::read(&out).expect("written");
        assert!(bytes.starts_with(magic), "{sheet}.{ext}");
    }
}

#[test]
fn draw_refuses_an_unknown_extension_and_names_the_flag() {
    let dir = tempfile::tempdir().expect("tempdir");
    let out = beltwright()
        .arg("draw")
        .arg(any_layout())
        .args(["--sheet", "slots", "-o"])
        .arg(dir.path().join("sheet.jpg"))
        .assert()
        .code(2);
    let err = String::from_utf8_lossy(&out.get_output().stderr).to_string();
    assert!(err.contains("-o") && err.contains(".svg"), "{err}");
}

#[test]
fn draw_never_overwrites_the_layout_it_reads() {
    let dir = tempfile::tempdir().expect("tempdir");
    let copy = dir.path().join("design.svg");
    let source = std::fs::read_to_string(any_layout()).expect("layout");
    std::fs::write(&copy, &source).expect("copy");
    beltwright()
        .arg("draw")
        .arg(&copy)
        .args(["--sheet", "slots", "-o"])
        .arg(&copy)
        .assert()
        .code(2);
    assert_eq!(std::fs::read_to_string(&copy).expect("still there"), source);
}

#[test]
fn draw_continues_a_long_schedule_on_numbered_files() {
    let dir = tempfile::tempdir().expect("tempdir");
    let big = dir.path().join("mill.toml");
    std::fs::write(
        &big,
        "[machine]\ntopology = \"rotary\"\nslots = 360\npoles = 24\n[winding]\nlayers = 2\npitch = 13\n",
    )
    .expect("write");
    beltwright()
        .arg("draw")
        .arg(&big)
        .args(["--sheet", "connections", "-o"])
        .arg(dir.path().join("mill.svg"))
        .assert()
        .success();
    assert!(dir.path().join("mill.svg").exists());
    assert!(dir.path().join("mill-2.svg").exists());
}

fn files_in(dir: &Path) -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .expect("dir")
        .filter_map(|e| e.ok().map(|e| e.file_name().to_string_lossy().into_owned()))
        .collect();
    v.sort();
    v
}

#[test]
fn plan_out_writes_the_shop_pack_into_a_new_folder() {
    let dir = tempfile::tempdir().expect("tempdir");
    let pack = dir.path().join("pack").join("shuttle");
    let src = layout("pallet-shuttle.toml");
    let input = if src.exists() { src } else { any_layout() };
    let stem = input
        .file_stem()
        .and_then(|s| s.to_str())
        .unwrap_or("")
        .to_string();
    beltwright()
        .arg("plan")
        .arg(&input)
        .arg("--out")
        .arg(&pack)
        .assert()
        .success();
    let want: Vec<String> = [
        "card.pdf",
        "card.svg",
        "connections.pdf",
        "connections.svg",
        "plan.json",
        "slots.pdf",
        "slots.svg",
    ]
    .iter()
    .map(|s| format!("{stem}-{s}"))
    .collect();
    // The data card runs to more than one page on some windings: its further SVG pages
    // are card-2.svg, card-3.svg, ...; the PDF holds them all.
    let got: Vec<String> = files_in(&pack)
        .into_iter()
        .filter(|f| !(f.starts_with(&format!("{stem}-card-")) && f.ends_with(".svg")))
        .collect();
    assert_eq!(got, want);
    let json: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string(pack.join(format!("{stem}-plan.json"))).expect("json"),
    )
    .expect("valid JSON");
    assert!(json["coils"].as_array().is_some_and(|c| !c.is_empty()));
}

// `report -o x.pdf` carries every table of the HTML page (plan, card, performance,
// inductance, factors, field, spans; the audit for a record) as pages before the sheets:
// its page count is theirs plus the sheets', and the flat primary's inductance section is
// among the parts. What this compares, plainly: the PDF's page objects against the pages the
// library draws for the same study (not an outside count), and the sheets' share of them
// against the SVG set the command writes on its own.
#[test]
fn report_pdf_carries_every_table_and_every_sheet() {
    use beltwright::draw::{self, Page, Sheet};
    let src = layout("pallet-shuttle.toml");
    let dir = tempfile::tempdir().expect("dir");
    let out = dir.path().join("whole.pdf");
    beltwright()
        .args(["report"])
        .arg(&src)
        .arg("-o")
        .arg(&out)
        .assert()
        .success();
    let text = std::fs::read_to_string(&src).expect("layout");
    let spec = beltwright::layout::parse(&text, "pallet").expect("valid");
    let w = beltwright::winding::build(&spec).expect("builds");
    let study = beltwright::study::Study::new(&w, None);
    let parts = beltwright::output::html::parts(&study);
    let titles: Vec<&str> = parts.parts.iter().map(|p| p.title.as_str()).collect();
    assert!(titles.contains(&"Inductance and unbalance"), "{titles:?}");
    assert!(
        titles.contains(&"Performance of the flat primary"),
        "{titles:?}"
    );
    let page = Page::default();
    let table_pages: usize = parts
        .parts
        .iter()
        .filter(|p| p.title != "Data card")
        .map(|p| draw::tables::draw(&study, &p.title, &p.sections, &page).len())
        .sum();
    let sheet_pages: usize = Sheet::ALL
        .into_iter()
        .filter(|s| s.applies(&study))
        .map(|s| draw::draw(&study, s, &page).len())
        .sum();
    // The same report as an SVG set: one file per sheet page, NAME.svg, NAME-2.svg, ...
    let svg = dir.path().join("sheets.svg");
    beltwright()
        .args(["report"])
        .arg(&src)
        .arg("-o")
        .arg(&svg)
        .assert()
        .success();
    let svg_files = std::fs::read_dir(dir.path())
        .expect("dir")
        .filter_map(Result::ok)
        .filter(|e| e.file_name().to_string_lossy().starts_with("sheets"))
        .count();
    assert_eq!(svg_files, sheet_pages);
    let pdf = std::fs::read(&out).expect("pdf");
    // Each page object of pdf-writer's output carries "/Type /Page" on a line of its own.
    let pages = String::from_utf8_lossy(&pdf)
        .matches("/Type /Page\n")
        .count();
    assert!(table_pages >= 7, "{table_pages}");
    assert_eq!(pages, table_pages + sheet_pages);
}
