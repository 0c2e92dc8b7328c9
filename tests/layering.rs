//! The layering of docs/ARCHITECTURE.md, as far as the compiler does not already hold it.
//!
//! The crate graph (model ← study ← present ← binary) is held by Cargo: a lower crate cannot
//! name a higher one, and a cycle does not build. What Cargo would allow, and this test
//! refuses, is a lower crate taking a dependency that belongs higher up: the model or the
//! analyses learning TOML, the command line or the terminal, or the presenters depending
//! on the binary's crates. The I/O rule (no files, printing, environment or exit in the
//! libraries) is clippy's, from each library crate's `clippy.toml`, checked here to be
//! present and the same in all three.

use std::collections::BTreeSet;

fn dependencies(krate: &str) -> BTreeSet<String> {
    let text = std::fs::read_to_string(format!("crates/{krate}/Cargo.toml")).expect("manifest");
    let manifest: toml::Table = toml::from_str(&text).expect("manifest parses");
    manifest
        .get("dependencies")
        .and_then(|d| d.as_table())
        .map(|d| d.keys().cloned().collect())
        .unwrap_or_default()
}

fn set(names: &[&str]) -> BTreeSet<String> {
    names.iter().map(|s| s.to_string()).collect()
}

#[test]
fn each_crate_depends_only_on_what_its_layer_may_use() {
    // The model: numbers, complex arithmetic, the FFT, serialisation of its facts, errors.
    let model = set(&[
        "num-complex",
        "num-integer",
        "rustfft",
        "schemars",
        "serde",
        "thiserror",
    ]);
    // The analyses: the model, and the same, with rayon for sweeps and serde_json for a
    // record's readings (a JSON value kept as given).
    let mut study = model.clone();
    study.extend(set(&["beltwright-model", "rayon", "serde_json"]));
    // The presenters: the two below, and the drawing and text crates.
    let mut present = study.clone();
    present.extend(set(&[
        "beltwright-study",
        "csv",
        "itertools",
        "pdf-writer",
        "resvg",
        "serde_json",
        "svg",
        "svg2pdf",
        "textwrap",
        "ttf-parser",
        "usvg",
    ]));
    present.remove("rayon");
    present.remove("rustfft");
    for (krate, allowed) in [("model", model), ("study", study), ("present", present)] {
        let got = dependencies(krate);
        let extra: Vec<&String> = got.difference(&allowed).collect();
        assert!(
            extra.is_empty(),
            "crates/{krate} depends on {extra:?}, which its layer may not use (see \
             docs/ARCHITECTURE.md; clap, toml, ctrlc, indicatif, tempfile and the record \
             book's rusqlite and postgres are the binary's)"
        );
    }
}

#[test]
fn every_library_crate_forbids_io_the_same_way() {
    let model = std::fs::read_to_string("crates/model/clippy.toml").expect("model clippy.toml");
    for krate in ["study", "present"] {
        let other =
            std::fs::read_to_string(format!("crates/{krate}/clippy.toml")).expect("clippy.toml");
        assert_eq!(
            other, model,
            "crates/{krate}/clippy.toml differs from the model's"
        );
    }
    for needle in [
        "std::println",
        "std::fs::File",
        "std::fs::write",
        "std::fs::read_to_string",
        "std::io::stdout",
        "std::env::var",
        "std::process::exit",
    ] {
        assert!(
            model.contains(needle),
            "clippy.toml does not forbid {needle}"
        );
    }
}
