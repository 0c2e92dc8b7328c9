//! The record book at 100 000 invented records, whole process as a shop uses it: `book
//! load` makes the book, then each command is run again and again and its median wall time
//! printed (add one record; find by slots, poles and power; a similar-core search that
//! matches nothing exactly). SQLite always; PostgreSQL too when BELTWRIGHT_TEST_POSTGRES
//! names a server. Run: `cargo bench --bench book` (BOOK_RECORDS changes the count,
//! BOOK_DIR keeps the backup and the SQLite book there).
//! Figures go in the README; no test asserts a time.

#[path = "../tests/common/invented.rs"]
mod invented;

use std::path::Path;
use std::process::Command;
use std::time::{Duration, Instant};

const RUNS: usize = 15;

fn bin() -> String {
    // The release binary of this build (cargo bench builds it).
    let exe = std::env::current_exe().expect("bench path");
    let target = exe.ancestors().nth(3).expect("target folder").to_path_buf();
    target.join("release/beltwright").display().to_string()
}

fn run(db: &str, args: &[&str]) -> Duration {
    let started = Instant::now();
    let out = Command::new(bin())
        .args(["book", "--db", db])
        .args(args)
        .output()
        .expect("runs");
    let took = started.elapsed();
    assert!(
        out.status.success(),
        "{args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    took
}

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn measure(label: &str, db: &str, backup: &Path, dir: &Path) {
    let started = Instant::now();
    run(db, &["load", backup.to_str().expect("path")]);
    println!(
        "{label}: load of the backup {:.1} s",
        started.elapsed().as_secs_f64()
    );
    let mut adds = Vec::new();
    for n in 0..RUNS as u64 {
        let p = dir.join(format!("{label}-new-{n}.toml"));
        std::fs::write(&p, invented::layout(10_000_000 + n)).expect("write");
        adds.push(run(db, &["add", p.to_str().expect("path")]));
    }
    let exact: Vec<Duration> = (0..RUNS)
        .map(|_| {
            run(
                db,
                &[
                    "find",
                    "--slots",
                    "36",
                    "--poles",
                    "4",
                    "--power-kw",
                    "5..8",
                ],
            )
        })
        .collect();
    let similar: Vec<Duration> = (0..RUNS)
        .map(|_| {
            run(
                db,
                &[
                    "find",
                    "--slots",
                    "36",
                    "--poles",
                    "4",
                    "--bore-mm",
                    "125",
                    "--stack-mm",
                    "97",
                    "--voltage",
                    "415",
                ],
            )
        })
        .collect();
    let ms = |d: Duration| d.as_secs_f64() * 1e3;
    println!(
        "{label}: add one {:.1} ms, find by slots/poles/power {:.1} ms, similar-core search {:.1} ms (medians of {RUNS}, whole process)",
        ms(median(adds)),
        ms(median(exact)),
        ms(median(similar))
    );
}

fn main() {
    // `cargo bench` passes --bench; any other argument (a filter) is ignored.
    let records: u64 = std::env::var("BOOK_RECORDS")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(100_000);
    // BOOK_DIR keeps the backup and the book for a closer look; a temporary folder else.
    let temp = tempfile::tempdir().expect("temp dir");
    let kept = std::env::var_os("BOOK_DIR").map(std::path::PathBuf::from);
    let dir = kept.as_deref().unwrap_or(temp.path());
    let backup = dir.join("book.jsonl");
    let started = Instant::now();
    std::fs::write(&backup, invented::backup(1, records + 1)).expect("write backup");
    println!(
        "{records} invented records made in {:.1} s",
        started.elapsed().as_secs_f64()
    );
    let file = dir.join("book.sqlite");
    let _ = std::fs::remove_file(&file);
    measure("SQLite", file.to_str().expect("path"), &backup, dir);
    if let Ok(admin) = std::env::var("BELTWRIGHT_TEST_POSTGRES") {
        let mut c = postgres::Client::connect(&admin, postgres::NoTls).expect("server");
        c.batch_execute("DROP DATABASE IF EXISTS bw_bench WITH (FORCE)")
            .expect("old bench database dropped");
        c.batch_execute("CREATE DATABASE bw_bench")
            .expect("bench database");
        let base = admin.rsplit_once('/').map_or(admin.as_str(), |(b, _)| b);
        measure("PostgreSQL", &format!("{base}/bw_bench"), &backup, dir);
        let _ = c.batch_execute("DROP DATABASE IF EXISTS bw_bench WITH (FORCE)");
    }
}
