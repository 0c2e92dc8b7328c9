//! Hostile input and failing output: closed pipes, full devices, devices as input, markup
//! and spreadsheet injection, file safety, deterministic PDF.

mod common;
use common::run;

use std::io::Read;
use std::process::Stdio;

fn layout(dir: &std::path::Path, name: &str, text: &str) -> std::path::PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, text).expect("write layout");
    p
}

const SMALL: &str =
    "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n[winding]\nlayers = 2\n";

#[test]
fn a_closed_pipe_ends_quietly() {
    let mut child = std::process::Command::new(assert_cmd::cargo::cargo_bin("beltwright"))
        .args(["survey", "--slots", "6..=240", "--poles", "2..=40"])
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("runs");
    // Read one line, then close the pipe as `head -1` does.
    let mut stdout = child.stdout.take().expect("stdout");
    let mut first = [0u8; 16];
    let _ = stdout.read(&mut first);
    drop(stdout);
    let mut err = String::new();
    child
        .stderr
        .take()
        .expect("stderr")
        .read_to_string(&mut err)
        .expect("stderr text");
    let status = child.wait().expect("exits");
    assert_eq!(status.code(), Some(0), "{err}");
    assert!(err.is_empty(), "no message for a closed pipe: {err}");
}

#[test]
fn a_full_device_is_a_failure_with_a_message() {
    // /dev/full exists on Linux, where CI runs; the test fails (never skips) without it.
    let full = std::fs::OpenOptions::new()
        .write(true)
        .open("/dev/full")
        .expect("/dev/full (Linux)");
    let out = std::process::Command::new(assert_cmd::cargo::cargo_bin("beltwright"))
        .args(["survey", "--slots", "6..=60", "--poles", "2..=12"])
        .stdout(full)
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(3));
    assert!(String::from_utf8_lossy(&out.stderr).contains("cannot write the output"));
}

#[test]
fn a_device_as_layout_is_read_within_the_cap() {
    let out = run(&["plan", "/dev/zero"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("too large"));
}

#[test]
fn outputs_never_replace_an_input_or_a_device() {
    let dir = tempfile::tempdir().expect("dir");
    let l = layout(dir.path(), "core.toml", SMALL);
    for args in [
        vec![
            "field",
            l.to_str().expect("utf-8"),
            "--svg",
            l.to_str().expect("utf-8"),
        ],
        vec![
            "pitch",
            l.to_str().expect("utf-8"),
            "--svg",
            l.to_str().expect("utf-8"),
        ],
        vec!["field", l.to_str().expect("utf-8"), "--svg", "/dev/null"],
    ] {
        let out = run(&args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
    }
    assert_eq!(std::fs::read_to_string(&l).expect("still there"), SMALL);
}

#[test]
fn output_files_honour_the_umask_and_leave_no_temporary_files() {
    let dir = tempfile::tempdir().expect("dir");
    let l = layout(dir.path(), "core.toml", SMALL);
    let svg = dir.path().join("s.svg");
    let script = format!(
        "umask 027; exec '{}' draw '{}' --sheet star -o '{}'",
        assert_cmd::cargo::cargo_bin("beltwright").display(),
        l.display(),
        svg.display()
    );
    let out = std::process::Command::new("sh")
        .args(["-c", &script])
        .output()
        .expect("runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        let mode = std::fs::metadata(&svg)
            .expect("written")
            .permissions()
            .mode()
            & 0o777;
        assert_eq!(mode, 0o640, "{mode:o}");
    }
    let names: Vec<String> = std::fs::read_dir(dir.path())
        .expect("list")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    assert!(names.iter().all(|n| !n.ends_with(".tmp")), "{names:?}");
}

#[test]
fn a_page_set_replaces_the_pages_of_an_earlier_longer_set() {
    let dir = tempfile::tempdir().expect("dir");
    let out_svg = dir.path().join("card.svg");
    // Pages 2 to 4 of an earlier, four-page set under the same name (page 1 is card.svg),
    // marked as this tool marks its sheets (a file without the mark is the user's and is
    // left alone: tests/sets_and_signals.rs).
    for k in [2, 3, 4] {
        std::fs::write(
            dir.path().join(format!("card-{k}.svg")),
            format!(
                "<svg data-made-by=\"{}\" {}>old</svg>",
                beltwright::draw::export::MARK,
                beltwright::draw::export::set_mark("card.svg")
            ),
        )
        .expect("write");
    }
    let r = run(&[
        "draw",
        "layouts/pump-rewind.toml",
        "--sheet",
        "card",
        "-o",
        out_svg.to_str().expect("utf-8"),
    ]);
    assert!(r.status.success());
    let written = String::from_utf8_lossy(&r.stdout).lines().count();
    assert!(written < 4, "the card is shorter than the earlier set here");
    // Every page beyond the new set's last is gone; the new set's own pages are new.
    for k in written + 1..=4 {
        assert!(
            !dir.path().join(format!("card-{k}.svg")).exists(),
            "card-{k}.svg"
        );
    }
    for k in 2..=written {
        let text = std::fs::read_to_string(dir.path().join(format!("card-{k}.svg")));
        assert!(
            text.is_ok_and(|t| t.starts_with("<svg") && !t.contains(">old<")),
            "card-{k}.svg"
        );
    }
}

// XML 1.0 §2.2 forbids U+FFFE and U+FFFF; bidirectional overrides could reorder what a
// winder reads. Every sheet stays well-formed, and the overrides are gone.
#[test]
fn hostile_characters_in_titles_never_break_a_sheet() {
    let dir = tempfile::tempdir().expect("dir");
    let l = layout(
        dir.path(),
        "t.toml",
        &format!("title = \"a\\uFFFEb\\uFFFF\\u202Ec\\u0007\"\n{SMALL}"),
    );
    for sheet in ["slots", "connections", "star", "field", "card"] {
        let svg = dir.path().join(format!("{sheet}.svg"));
        let out = run(&[
            "draw",
            l.to_str().expect("utf-8"),
            "--sheet",
            sheet,
            "-o",
            svg.to_str().expect("utf-8"),
        ]);
        assert!(out.status.success(), "{sheet}");
        let text = std::fs::read_to_string(&svg).expect("svg");
        roxmltree::Document::parse(&text).expect("well-formed XML");
        assert!(!text.contains('\u{202E}') && !text.contains('\u{FFFE}'));
    }
    for cmd in ["field", "pitch"] {
        let svg = dir.path().join(format!("{cmd}-chart.svg"));
        let out = run(&[
            cmd,
            l.to_str().expect("utf-8"),
            "--svg",
            svg.to_str().expect("utf-8"),
        ]);
        assert!(out.status.success(), "{cmd}");
        let text = std::fs::read_to_string(&svg).expect("svg");
        roxmltree::Document::parse(&text).expect("well-formed XML");
    }
    // Nor reach the terminal raw.
    let out = run(&["plan", l.to_str().expect("utf-8")]);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(!text.contains('\u{7}') && !text.contains('\u{202E}'));
    // A title over the stated maximum is refused, naming the key.
    let long = layout(
        dir.path(),
        "long.toml",
        &format!("title = \"{}\"\n{SMALL}", "x".repeat(201)),
    );
    let out = run(&["plan", long.to_str().expect("utf-8")]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("title"));
}

// OWASP, CSV injection: a cell a spreadsheet would run as a formula starts with '.
#[test]
fn csv_cells_never_run_as_formulas() {
    let dir = tempfile::tempdir().expect("dir");
    let l = layout(
        dir.path(),
        "f.toml",
        &SMALL.replace(
            "poles = 2\n",
            "poles = 2\nphase_labels = [\"=SUM(1)\", \"-U\", \"+V\"]\n",
        ),
    );
    let out = run(&["plan", l.to_str().expect("utf-8"), "--format", "csv"]);
    assert!(out.status.success());
    let csv = String::from_utf8_lossy(&out.stdout);
    assert!(csv.contains(",'=SUM(1),") && csv.contains(",'-U,"), "{csv}");
    // Numbers stay numbers, units stay in the header.
    let out = run(&[
        "rewind",
        "layouts/hoist-rewind-sound.toml",
        "layouts/hoist-rewind-new.toml",
        "--format",
        "csv",
    ]);
    let csv = String::from_utf8_lossy(&out.stdout);
    assert!(
        csv.contains("line voltage, V\",400,400") || csv.contains("\"line voltage, V\",400,400"),
        "{csv}"
    );
    let out = run(&["pitch", "layouts/pump-rewind.toml", "--format", "csv"]);
    let csv = String::from_utf8_lossy(&out.stdout);
    let header = csv.lines().next().expect("header");
    assert!(header.split(',').all(|h| !h.is_empty()), "{header}");
}

#[test]
fn refusals_after_parsing_name_the_key_and_line() {
    let dir = tempfile::tempdir().expect("dir");
    let l = layout(
        dir.path(),
        "r.toml",
        &SMALL
            .replace("slots = 12", "slots = 20")
            .replace("poles = 2", "poles = 4"),
    );
    let out = run(&["plan", l.to_str().expect("utf-8")]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("line 3") && err.contains("machine.slots"),
        "{err}"
    );
}

// The same sheets give the same PDF bytes, run after run.
#[test]
fn pdf_output_is_byte_for_byte_repeatable() {
    let dir = tempfile::tempdir().expect("dir");
    let mut seen = Vec::new();
    for k in 0..3 {
        let pdf = dir.path().join(format!("r{k}.pdf"));
        let out = run(&[
            "report",
            "layouts/pallet-shuttle.toml",
            "-o",
            pdf.to_str().expect("utf-8"),
        ]);
        assert!(out.status.success());
        seen.push(std::fs::read(&pdf).expect("pdf"));
    }
    assert!(seen.windows(2).all(|w| w[0] == w[1]));
}
