//! Recording a winding by coil groups (`[[group]]`): it expands to exactly the coil list a
//! coil-by-coil record of the same winding gives, and bad groups are refused by key.

mod common;

use beltwright::layout;
use beltwright::winding::{self, Winding};

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "groups.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build_lenient(&spec).unwrap_or_else(|e| panic!("{e}"))
}

/// The header of `layouts/hoist-rewind-sound.toml` (everything before its first coil).
fn header() -> String {
    let text = std::fs::read_to_string("layouts/hoist-rewind-sound.toml").unwrap();
    text.split("[[coil]]").next().unwrap().to_string()
}

/// The same record by groups: twelve groups of three coils at span 8, every second group
/// wound backwards, the first six in path 1 and the rest in path 2.
fn by_groups() -> String {
    let mut s = header();
    let phases = ["U", "W", "V"];
    for g in 0..12 {
        s.push_str(&format!(
            "[[group]]\nphase = \"{}\"\nfirst = {}\ncoils = 3\nspan = 8\npolarity = \"{}\"\npath = {}\n\n",
            phases[g % 3],
            3 * g + 1,
            if g % 2 == 0 { "+" } else { "-" },
            if g < 6 { 1 } else { 2 }
        ));
    }
    s
}

#[test]
fn a_record_by_groups_is_the_record_coil_by_coil() {
    let listed = wind(&std::fs::read_to_string("layouts/hoist-rewind-sound.toml").unwrap());
    let grouped = wind(&by_groups());
    assert_eq!(listed.coils.len(), 36);
    let key = |w: &Winding| -> Vec<(usize, usize, usize, u32, usize)> {
        w.coils
            .iter()
            .map(|c| (c.phase, c.go, c.back, c.turns, c.path))
            .collect()
    };
    assert_eq!(key(&listed), key(&grouped));
    // And so every report of it: the audit's JSON is the same byte for byte.
    let a = beltwright::output::render(
        &beltwright::audit::audit(&listed, None),
        beltwright::output::Format::Json,
    )
    .unwrap();
    let b = beltwright::output::render(
        &beltwright::audit::audit(&grouped, None),
        beltwright::output::Format::Json,
    )
    .unwrap();
    assert_eq!(a, b);
}

#[test]
fn a_concentric_group_nests_around_one_centre_and_wraps_on_a_closed_core() {
    // Three concentric coils of outer span 11 from slot 35 of 36: 35-46→10, 36-9, 37→1-8.
    let src = format!(
        "{}[[group]]\nphase = \"U\"\nfirst = 35\ncoils = 3\nspan = 11\nshape = \"concentric\"\nturns = 12\n",
        header()
    );
    let w = wind(&src);
    let got: Vec<(usize, usize, u32)> = w.coils.iter().map(|c| (c.go, c.back, c.turns)).collect();
    // 0-based slots: go 34, 35, 0; back 9, 8, 7 (slot 46 is slot 10, and so on).
    assert_eq!(got, vec![(34, 9, 12), (35, 8, 12), (0, 7, 12)]);
}

#[test]
fn bad_groups_are_refused_naming_the_key() {
    for (bad, key) in [
        (
            "phase = \"X\"\nfirst = 1\ncoils = 3\nspan = 8\n",
            "group[1].phase",
        ),
        (
            "phase = \"U\"\nfirst = 0\ncoils = 3\nspan = 8\n",
            "group[1].first",
        ),
        (
            "phase = \"U\"\nfirst = 1\ncoils = 0\nspan = 8\n",
            "group[1].coils",
        ),
        (
            "phase = \"U\"\nfirst = 1\ncoils = 3\nspan = 36\n",
            "group[1].span",
        ),
        (
            "phase = \"U\"\nfirst = 1\ncoils = 3\nspan = 8\npolarity = \"x\"\n",
            "group[1].polarity",
        ),
        (
            "phase = \"U\"\nfirst = 1\ncoils = 3\nspan = 4\nshape = \"concentric\"\n",
            "group[1].span",
        ),
        (
            "phase = \"U\"\nfirst = 1\ncoils = 3\nspan = 8\npath = 3\n",
            "group[1].path",
        ),
    ] {
        let src = format!("{}[[group]]\n{bad}", header());
        let e = layout::parse(&src, "g.toml").expect_err(bad).to_string();
        assert!(e.contains(key), "{bad}: {e}");
    }
    // A flat primary's group may not run past its last slot.
    let flat = "[machine]\ntopology = \"linear\"\nslots = 12\npoles = 2\n[winding]\nlayers = 1\n\
                [[group]]\nphase = \"U\"\nfirst = 10\ncoils = 2\nspan = 3\n";
    let e = layout::parse(flat, "f.toml")
        .expect_err("beyond the end")
        .to_string();
    assert!(
        e.contains("group[1]") && e.contains("beyond slot 12"),
        "{e}"
    );
}

#[test]
fn every_template_reads_plans_and_the_record_is_sound() {
    for (name, text) in [
        ("rotary", layout::templates::ROTARY),
        ("flat", layout::templates::FLAT),
        ("record", layout::templates::RECORD),
    ] {
        let spec = layout::parse(text, name).unwrap_or_else(|e| panic!("{name}: {e}"));
        let w = winding::build(&spec).unwrap_or_else(|e| panic!("{name}: {e}"));
        assert!(w.is_balanced(), "{name}");
        assert!(text.contains("CAUTION"), "{name}: no caution");
    }
    // The record by groups is the same winding the planner lays out for its design:
    // 24 slots, 4 poles, double layer, span 5 (every coil as planned, in the same order).
    let rec = wind(layout::templates::RECORD);
    assert!(rec.from_coil_list);
    let planned = wind(
        "[machine]\ntopology = \"rotary\"\nslots = 24\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 5\nturns_per_coil = 30\n",
    );
    let key = |w: &Winding| -> Vec<(usize, usize, usize)> {
        let mut v: Vec<_> = w.coils.iter().map(|c| (c.phase, c.go, c.back)).collect();
        v.sort_unstable();
        v
    };
    assert_eq!(key(&rec), key(&planned));
    let audit = beltwright::audit::audit(&rec, None);
    assert!(audit.sound, "the template's record should be sound");
}

#[test]
fn template_writes_a_new_file_and_never_over_one() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("start.toml");
    assert_cmd::Command::cargo_bin("beltwright")
        .unwrap()
        .args(["template", "rotary", "-o"])
        .arg(&out)
        .assert()
        .success();
    assert_eq!(
        std::fs::read_to_string(&out).unwrap(),
        layout::templates::ROTARY
    );
    assert_cmd::Command::cargo_bin("beltwright")
        .unwrap()
        .args(["template", "flat", "-o"])
        .arg(&out)
        .assert()
        .code(2);
    assert_eq!(
        std::fs::read_to_string(&out).unwrap(),
        layout::templates::ROTARY
    );
}
