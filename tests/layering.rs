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

/// Units are typed inside (`units`: `Length`, `Area`, `Conductivity`, `Capacitance` and the
/// prefix helpers): the model and the analyses scale no quantity by a power of ten
/// themselves. A power of ten of 3, 4 or 6 either side of a `*` or `/` (or after `*=`,
/// `/=`) in their source is refused outside `crates/model/src/units.rs`, the one owner of
/// the conversions, however spaced, parenthesised or written (`1e3`, `1e+3`, `1_000.0`,
/// `0.001f64`). What a scan of the text cannot see (a power of ten behind a named constant
/// or `powi`) is left to review; a bound or a floor such as `.max(1e-6)` is no conversion.
#[test]
fn the_model_and_the_analyses_convert_no_units_themselves() {
    fn walk(dir: &std::path::Path, out: &mut Vec<std::path::PathBuf>) {
        for e in std::fs::read_dir(dir).expect("source folder").flatten() {
            let p = e.path();
            if p.is_dir() {
                walk(&p, out);
            } else if p.extension().is_some_and(|x| x == "rs") {
                out.push(p);
            }
        }
    }
    let mut files = Vec::new();
    walk(std::path::Path::new("crates/model/src"), &mut files);
    walk(std::path::Path::new("crates/study/src"), &mut files);
    assert!(files.len() > 40, "the sources were not found");
    let units = std::path::Path::new("crates/model/src/units.rs");
    assert!(files.iter().any(|f| f == units), "units.rs was not found");
    let is_power = |lit: &str| {
        let t: String = lit.chars().filter(|c| *c != '_').collect();
        let t = t.trim_end_matches("f64");
        matches!(
            t.parse::<f64>().ok(),
            Some(v) if [1e3, 1e-3, 1e4, 1e-4, 1e6, 1e-6].contains(&v)
        )
    };
    let number = |c: &char| c.is_ascii_alphanumeric() || matches!(c, '.' | '_');
    let mut found = Vec::new();
    for f in files.iter().filter(|f| *f != units) {
        let text = std::fs::read_to_string(f).expect("source");
        for (n, line) in text.lines().enumerate() {
            let code = line.split("//").next().unwrap_or("");
            let chars: Vec<char> = code.chars().collect();
            for (i, c) in chars.iter().enumerate() {
                if *c != '*' && *c != '/' {
                    continue;
                }
                // The operand after: past `=`, spaces and brackets; an exponent may carry a sign.
                let mut after = String::new();
                let mut k = i + 1;
                while k < chars.len() && (chars[k].is_whitespace() || "=(".contains(chars[k])) {
                    k += 1;
                }
                while k < chars.len()
                    && (number(&chars[k])
                        || ("+-".contains(chars[k]) && matches!(chars[k - 1], 'e' | 'E')))
                {
                    after.push(chars[k]);
                    k += 1;
                }
                // The operand before: back past spaces (not a bracket: `x.max(1e-6) * 2.0`
                // is a floor times two).
                let mut j = i;
                while j > 0 && chars[j - 1].is_whitespace() {
                    j -= 1;
                }
                let mut before: Vec<char> = Vec::new();
                while j > 0
                    && (number(&chars[j - 1])
                        || ("+-".contains(chars[j - 1])
                            && j > 1
                            && matches!(chars[j - 2], 'e' | 'E')))
                {
                    before.push(chars[j - 1]);
                    j -= 1;
                }
                let before: String = before.into_iter().rev().collect();
                let starts_as_number = |t: &str| t.starts_with(|c: char| c.is_ascii_digit());
                if (starts_as_number(&after) && is_power(&after))
                    || (starts_as_number(&before) && is_power(&before))
                {
                    found.push(format!("{}:{}: {}", f.display(), n + 1, line.trim()));
                }
            }
        }
    }
    assert!(
        found.is_empty(),
        "unit conversions outside crates/model/src/units.rs:\n{}",
        found.join("\n")
    );
}
