//! Outputs written as sets: a shop pack or a multi-page sheet is renamed into place
//! whole, concurrent writers to one folder never mix their files, only pages this tool
//! wrote are removed as stale, and no temporary file survives SIGINT, SIGTERM or SIGHUP
//! sent at any moment of a write.

use std::path::{Path, PathBuf};
use std::process::Command;
use std::time::Duration;

fn bin() -> PathBuf {
    PathBuf::from(env!("CARGO_BIN_EXE_beltwright"))
}

fn layout(dir: &Path, name: &str, slots: usize, poles: usize, pitch: usize) -> PathBuf {
    let p = dir.join(format!("{name}.toml"));
    std::fs::write(
        &p,
        format!(
            "title = \"{name}\"\n[machine]\ntopology = \"rotary\"\nslots = {slots}\n\
             poles = {poles}\n[winding]\nlayers = 2\npitch = {pitch}\nturns_per_coil = 3\n"
        ),
    )
    .expect("layout written");
    p
}

fn temps(dir: &Path) -> Vec<String> {
    std::fs::read_dir(dir)
        .expect("folder")
        .filter_map(|e| e.ok())
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".tmp"))
        .collect()
}

// Two shop packs of different designs written at once into one folder: every file in the
// folder afterwards belongs to the same design (the plan JSON and each SVG name the same
// title), never a mixture.
#[test]
fn concurrent_packs_never_mix() {
    let dir = tempfile::tempdir().expect("dir");
    let a = layout(dir.path(), "alpha", 36, 4, 8);
    let b = layout(dir.path(), "beta", 48, 4, 10);
    // Both named "pack" so their files collide.
    let (a2, b2) = (
        dir.path().join("x/pack.toml"),
        dir.path().join("y/pack.toml"),
    );
    for (from, to) in [(&a, &a2), (&b, &b2)] {
        std::fs::create_dir_all(to.parent().expect("parent")).expect("dir");
        std::fs::copy(from, to).expect("copy");
    }
    for round in 0..8 {
        let out = dir.path().join(format!("out{round}"));
        let spawn = |l: &Path| {
            Command::new(bin())
                .arg("plan")
                .arg(l)
                .arg("--out")
                .arg(&out)
                .stdout(std::process::Stdio::null())
                .stderr(std::process::Stdio::null())
                .spawn()
                .expect("runs")
        };
        let (mut p, mut q) = (spawn(&a2), spawn(&b2));
        assert!(p.wait().expect("waits").success());
        assert!(q.wait().expect("waits").success());
        let json = std::fs::read_to_string(out.join("pack-plan.json")).expect("plan json");
        let title = if json.contains("\"alpha\"") {
            "alpha"
        } else {
            "beta"
        };
        for e in std::fs::read_dir(&out).expect("folder") {
            let path = e.expect("entry").path();
            if path.extension().is_some_and(|x| x == "svg") {
                let svg = std::fs::read_to_string(&path).expect("svg");
                assert!(
                    svg.contains(&format!("aria-label=\"{title} - ")),
                    "round {round}: {} is not of {title}",
                    path.display()
                );
            }
        }
        assert!(temps(&out).is_empty(), "round {round}: {:?}", temps(&out));
    }
}

// A file the user made that happens to be named like a later page is never removed; a page
// of an earlier, longer set this tool wrote is.
#[test]
fn only_our_own_stale_pages_are_removed() {
    let dir = tempfile::tempdir().expect("dir");
    let big = layout(dir.path(), "big", 600, 20, 28);
    let small = layout(dir.path(), "small", 24, 4, 5);
    let out = dir.path().join("sheet.svg");
    let run = |l: &Path| {
        let st = Command::new(bin())
            .args(["draw"])
            .arg(l)
            .args(["--sheet", "connections", "-o"])
            .arg(&out)
            .output()
            .expect("runs");
        assert!(
            st.status.success(),
            "{}",
            String::from_utf8_lossy(&st.stderr)
        );
    };
    run(&big);
    let page2 = dir.path().join("sheet-2.svg");
    let page3 = dir.path().join("sheet-3.svg");
    assert!(page3.exists(), "the big winding's schedule runs over pages");
    // The user's own file in place of page 2: the run of pages still reaches page 3.
    std::fs::write(&page2, "<svg xmlns=\"http://www.w3.org/2000/svg\"/>").expect("user file");
    run(&small);
    assert!(!page3.exists(), "our own stale page is removed");
    assert!(page2.exists(), "the user's file is left alone");
    // A single-page set drawn as other-2.svg is its own set, not page 2 of other.svg.
    let other = dir.path().join("other-2.svg");
    for target in [&other, &dir.path().join("other.svg")] {
        let st = Command::new(bin())
            .args(["draw"])
            .arg(&small)
            .args(["--sheet", "star", "-o"])
            .arg(target)
            .output()
            .expect("runs");
        assert!(st.status.success());
    }
    assert!(other.exists(), "a page of another set is left alone");
}

// SIGINT, SIGTERM and SIGHUP, 100 each, at moments spread over a 29-page write: afterwards no
// temporary file is left in the folder, whatever the moment (the handler and the writer
// share one lock).
#[test]
fn no_temporary_file_survives_a_signal() {
    let dir = tempfile::tempdir().expect("dir");
    let big = layout(dir.path(), "big", 3600, 40, 80);
    // How long one whole run takes here, to spread the signals over it.
    std::fs::create_dir_all(dir.path().join("probe")).expect("dir");
    let start = std::time::Instant::now();
    let st = Command::new(bin())
        .args(["draw"])
        .arg(&big)
        .args(["--sheet", "connections", "-o"])
        .arg(dir.path().join("probe/c.svg"))
        .output()
        .expect("runs");
    assert!(st.status.success(), "the probe run writes its set");
    let whole = start.elapsed().as_micros().max(1000) as u64;
    let mut interrupted = 0;
    let mut seed = 0x9E37_79B9_7F4A_7C15u64;
    for signal in ["INT", "TERM", "HUP"] {
        for run in 0..100 {
            let out = dir.path().join(format!("{signal}-{run}"));
            std::fs::create_dir_all(&out).expect("dir");
            let mut child = Command::new(bin())
                .args(["draw"])
                .arg(&big)
                .args(["--sheet", "connections", "-o"])
                .arg(out.join("c.svg"))
                .stdout(std::process::Stdio::null())
                .stderr(std::process::Stdio::null())
                .spawn()
                .expect("runs");
            // xorshift: a repeatable spread of moments over the whole run.
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            std::thread::sleep(Duration::from_micros(seed % (whole + whole / 4)));
            // The shell's own `kill` (a builtin), so no separate package is needed.
            let _ = Command::new("sh")
                .arg("-c")
                .arg(format!("kill -{signal} {}", child.id()))
                .status();
            if let Ok(st) = child.wait()
                && !st.success()
            {
                interrupted += 1;
            }
            assert!(
                temps(&out).is_empty(),
                "SIG{signal} run {run}: left {:?}",
                temps(&out)
            );
        }
    }
    // The signals did land while the tool was working, not only after it had finished.
    assert!(
        interrupted >= 60,
        "only {interrupted} of 300 runs were interrupted"
    );
}

// `report --intended` is checked as `audit --intended` is: never written over, and only
// the same core (topology and slots) is compared.
#[test]
fn report_intended_is_checked_like_audit_intended() {
    let dir = tempfile::tempdir().expect("dir");
    let rec =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/hoist-rewind-faulty.toml");
    let design =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/hoist-rewind-sound.toml");
    let copy = dir.path().join("design.html");
    std::fs::copy(&design, &copy).expect("copy");
    let before = std::fs::read(&copy).expect("read");
    let out = Command::new(bin())
        .arg("report")
        .arg(&rec)
        .arg("--intended")
        .arg(&copy)
        .arg("-o")
        .arg(&copy)
        .output()
        .expect("runs");
    assert_eq!(
        out.status.code(),
        Some(2),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(
        std::fs::read(&copy).expect("read"),
        before,
        "the intended file is untouched"
    );
    let gate = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("layouts/sliding-gate.toml");
    for cmd in ["audit", "report"] {
        let mut c = Command::new(bin());
        c.arg(cmd).arg(&rec).arg("--intended").arg(&gate);
        if cmd == "report" {
            c.arg("-o").arg(dir.path().join("r.html"));
        }
        let out = c.output().expect("runs");
        assert_eq!(out.status.code(), Some(2), "{cmd}");
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains("same core"), "{cmd}: {err}");
    }
}
