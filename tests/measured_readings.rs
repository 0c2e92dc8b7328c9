//! Measured resistances judged per phase and per section, as a shop reads them: a fault
//! inside a delta that the terminal readings hide, a phase low from shorted turns, one
//! strand open, an open circuit, and readings taken across each section of 6-, 9- and
//! 12-lead motors before linking.
//!
//! The readings are made in each test from the card's own phase or section resistance by
//! the series–parallel rules of resistor networks (star: R_k + R_{k+1} between terminals;
//! delta: R_k ‖ (R_{k+1} + R_{k+2}); any circuits text, e.g. Hughes, *Electrical and
//! Electronic Technology*), so what is checked is how the audit reads them, not the card.

use beltwright::card::{self, measured::Suggestion, measured::Taken};
use beltwright::winding::{self, Winding};
use beltwright::{audit, layout};

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}\n{src}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

/// An invented 36-slot, 4-pole stator with the given connection, leads and extra tables.
fn motor(connection: &str, leads: u8, strands: u8, rest: &str) -> String {
    let paths = if leads >= 9 { 2 } else { 1 };
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 8\nturns_per_coil = 18\nparallel_paths = {paths}\n\
         connection = \"{connection}\"\nleads = {leads}\nmarking = \"nema\"\n\
         [core]\nbore_mm = 120.0\nstack_mm = 100.0\nslot_area_mm2 = 100.0\n\
         [wire]\ndiameter_mm = 0.71\nstrands_in_hand = {strands}\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n{rest}"
    )
}

/// Line readings 1-2, 2-3, 3-1 of phases `r` in `connection`.
fn lines(r: [f64; 3], connection: &str) -> [f64; 3] {
    [0, 1, 2].map(|k| {
        let (a, b, c) = (r[k], r[(k + 1) % 3], r[(k + 2) % 3]);
        match connection {
            "star" => a + b,
            _ => a * (b + c) / (a + b + c),
        }
    })
}

fn with_lines(connection: &str, strands: u8, factors: [f64; 3]) -> Winding {
    let base = wind(&motor(connection, 6, strands, ""));
    let r = card::card(&base)
        .phase_resistance_20c_ohm
        .expect("wire given");
    let m = lines(factors.map(|f| f * r), connection);
    wind(&motor(
        connection,
        6,
        strands,
        &format!(
            "[measured]\nline_resistance_ohm = [{}, {}, {}]\ntemperature_c = 20.0\n",
            m[0], m[1], m[2]
        ),
    ))
}

// The case the issue names: phase U 3 % high inside a delta moves the terminal readings by
// only +0.98 / −0.49 / −0.49 % (within the ±2 % of AR100), yet it is named, high.
#[test]
fn a_phase_three_percent_high_in_delta_is_named_high() {
    let w = with_lines("delta", 1, [1.03, 1.0, 1.0]);
    let r = card::measured::check(&w).expect("readings");
    assert_eq!(r.taken, Taken::LineToLine);
    assert!(
        r.deviation_percent < 1.0,
        "terminal spread {}",
        r.deviation_percent
    );
    assert!(!r.sound);
    let out: Vec<&str> = r
        .judged
        .iter()
        .filter(|j| !j.within_tolerance)
        .map(|j| j.phase.as_str())
        .collect();
    assert_eq!(out, ["U"], "{:?}", r.judged);
    match &r.suggestion {
        Suggestion::High { phase, ratio } => {
            assert_eq!(phase, "U");
            assert!((ratio - 1.03).abs() < 1e-9, "{ratio}");
        }
        other => panic!("{other:?}"),
    }
    let rep = audit::audit(&w, None);
    assert!(!rep.sound);
    assert!(
        rep.findings
            .iter()
            .any(|f| f.kind == audit::FindingKind::MeasuredResistance && f.phases == ["U"])
    );
}

// Shorted turns lower a phase: 4 % low on V is named low, and only V is out.
#[test]
fn a_phase_four_percent_low_is_named_low_in_star_and_delta() {
    for connection in ["star", "delta"] {
        let w = with_lines(connection, 1, [1.0, 0.96, 1.0]);
        let r = card::measured::check(&w).expect("readings");
        let out: Vec<&str> = r
            .judged
            .iter()
            .filter(|j| !j.within_tolerance)
            .map(|j| j.phase.as_str())
            .collect();
        assert_eq!(out, ["V"], "{connection}: {:?}", r.judged);
        match &r.suggestion {
            Suggestion::Low { phase, ratio } => {
                assert_eq!(phase, "V");
                assert!((ratio - 0.96).abs() < 1e-9, "{connection}: {ratio}");
            }
            other => panic!("{connection}: {other:?}"),
        }
    }
}

// Two strands in hand, one open in phase W: W reads 2/(2 − 1) = 2 times the others
// (conductance halves); only that phase shows it.
#[test]
fn one_strand_open_in_one_phase_is_recognised() {
    let w = with_lines("star", 2, [1.0, 1.0, 2.0]);
    let r = card::measured::check(&w).expect("readings");
    match &r.suggestion {
        Suggestion::StrandOpen {
            phase,
            ratio,
            strands,
        } => {
            assert_eq!((phase.as_str(), *strands), ("W", 2));
            assert!((ratio - 2.0).abs() < 1e-9);
        }
        other => panic!("{other:?}"),
    }
}

// A phase ten times the others is an open circuit, not a poor joint.
#[test]
fn a_phase_far_above_the_others_is_open() {
    let w = with_lines("delta", 1, [1.0, 10.0, 1.0]);
    let r = card::measured::check(&w).expect("readings");
    assert!(
        matches!(&r.suggestion, Suggestion::Open { phase, .. } if phase == "V"),
        "{:?}",
        r.suggestion
    );
}

// Sound readings pass, within tolerance each, exit status 0 from the audit.
#[test]
fn sound_readings_pass() {
    let w = with_lines("delta", 1, [1.0, 1.01, 0.995]);
    let r = card::measured::check(&w).expect("readings");
    assert!(r.sound, "{r:?}");
    assert!(audit::audit(&w, None).sound);
}

/// Section readings of a 6-, 9- or 12-lead motor, each section `factor` times the card.
fn with_sections(connection: &str, leads: u8, factors: &[f64]) -> Winding {
    let base = wind(&motor(connection, leads, 1, ""));
    let c = card::card(&base);
    assert_eq!(c.sections.len(), factors.len(), "sections on the card");
    let mut v: Vec<f64> = c
        .sections
        .iter()
        .zip(factors)
        .map(|(s, f)| s.resistance_20c_ohm * f)
        .collect();
    // A nine-lead star machine's second sections are read in pairs between their starts
    // (they meet in the star point inside): T7-T8 = R_U2 + R_V2, and so on.
    if leads == 9 && connection == "star" {
        let s = [v[3], v[4], v[5]];
        for k in 0..3 {
            v[3 + k] = s[k] + s[(k + 1) % 3];
        }
    }
    let list = v
        .iter()
        .map(|x| x.to_string())
        .collect::<Vec<_>>()
        .join(", ");
    wind(&motor(
        connection,
        leads,
        1,
        &format!("[measured]\nsection_resistance_ohm = [{list}]\ntemperature_c = 20.0\n"),
    ))
}

// Each section read across its own leads: a second section of phase V 5 % high is named by
// its leads on 9 and 12 leads, star and delta; a 6-lead motor's phase W 3 % low likewise.
#[test]
fn section_readings_name_the_section() {
    for (connection, leads) in [("star", 12), ("delta", 12), ("star", 9), ("delta", 9)] {
        let w = with_sections(connection, leads, &[1.0, 1.0, 1.0, 1.0, 1.05, 1.0]);
        let r = card::measured::check(&w).expect("readings");
        assert_eq!(r.taken, Taken::Sections);
        let out: Vec<(&str, usize)> = r
            .judged
            .iter()
            .filter(|j| !j.within_tolerance)
            .map(|j| (j.phase.as_str(), j.section))
            .collect();
        assert_eq!(out, [("V", 2)], "{connection} {leads}: {:?}", r.judged);
        match &r.suggestion {
            Suggestion::High { phase, ratio } => {
                assert!(phase.starts_with("T8"), "{connection} {leads}: {phase}");
                assert!((ratio - 1.05).abs() < 1e-9, "{ratio}");
            }
            other => panic!("{connection} {leads}: {other:?}"),
        }
    }
    let w = with_sections("delta", 6, &[1.0, 1.0, 0.97]);
    let r = card::measured::check(&w).expect("readings");
    assert!(
        matches!(&r.suggestion, Suggestion::Low { phase, .. } if phase == "T3-T6"),
        "{:?}",
        r.suggestion
    );
}

// A three-lead motor has no section ends to measure: refused, naming the key.
#[test]
fn section_readings_on_three_leads_are_refused() {
    let src = motor(
        "star",
        3,
        1,
        "[measured]\nsection_resistance_ohm = [1.0, 1.0, 1.0]\n",
    );
    let e = layout::parse(&src, "three.toml").expect_err("refused");
    let msg = e.to_string();
    assert!(msg.contains("section_resistance_ohm"), "{msg}");
    assert!(msg.contains("line_resistance_ohm"), "{msg}");
}

// Phase U open inside a delta: the readings are R_V + R_W across U (2R) and R across
// each of the others (the open phase carries nothing), so the star arm opposite is zero
// and no phase can be worked back; the audit names the open phase and says not to
// energise, with meter noise either way (series-parallel rules as above).
#[test]
fn an_open_phase_in_delta_is_named_open_not_low() {
    let base = wind(&motor("delta", 6, 1, ""));
    let r = card::card(&base).phase_resistance_20c_ohm.expect("wire");
    for noise in [1.0, 1.004, 0.996] {
        let m = [2.0 * r * noise, r, r];
        let w = wind(&motor(
            "delta",
            6,
            1,
            &format!(
                "[measured]\nline_resistance_ohm = [{}, {}, {}]\ntemperature_c = 20.0\n",
                m[0], m[1], m[2]
            ),
        ));
        let c = card::measured::check(&w).expect("readings");
        assert!(!c.sound);
        assert!(
            matches!(&c.suggestion, Suggestion::OpenInDelta { phase } if phase == "U"),
            "noise {noise}: {:?}",
            c.suggestion
        );
        assert!(!audit::audit(&w, None).sound);
    }
}

// One reading larger than the other two together: no network of resistors gives it
// (triangle rule), so the readings are called into question, not a phase.
#[test]
fn impossible_readings_ask_for_a_new_measurement() {
    let w = wind(&motor(
        "star",
        6,
        1,
        "[measured]\nline_resistance_ohm = [1.0, 1.0, 2.5]\ntemperature_c = 20.0\n",
    ));
    let c = card::measured::check(&w).expect("readings");
    assert_eq!(c.suggestion, Suggestion::Inconsistent);
}

// A 12-lead winding planned in parallel but measured linked in series reads 4 times the
// card on every pair (each path twice the phase, two in series instead of in parallel).
#[test]
fn readings_taken_in_the_other_connection_are_recognised() {
    let base = wind(&motor("star", 12, 1, ""));
    let l = card::card(&base).line_resistance_20c_ohm.expect("wire");
    let m = 4.0 * l;
    let w = wind(&motor(
        "star",
        12,
        1,
        &format!("[measured]\nline_resistance_ohm = [{m}, {m}, {m}]\ntemperature_c = 20.0\n"),
    ));
    let c = card::measured::check(&w).expect("readings");
    assert!(
        matches!(&c.suggestion, Suggestion::OtherConnection { ratio, .. } if (ratio - 4.0).abs() < 1e-9),
        "{:?}",
        c.suggestion
    );
}

// A six-lead winding of two parallel paths, read across U1-U2 with one of U's paths open:
// the section reads a/(a - 1) = 2 times the others.
#[test]
fn an_open_path_is_recognised_in_section_readings() {
    let src =
        |rest: &str| motor("delta", 6, 1, rest).replace("parallel_paths = 1", "parallel_paths = 2");
    let base = wind(&src(""));
    let s = card::card(&base).sections;
    assert_eq!(s.len(), 3);
    let v = [
        2.0 * s[0].resistance_20c_ohm,
        s[1].resistance_20c_ohm,
        s[2].resistance_20c_ohm,
    ];
    let w = wind(&src(&format!(
        "[measured]\nsection_resistance_ohm = [{}, {}, {}]\ntemperature_c = 20.0\n",
        v[0], v[1], v[2]
    )));
    let c = card::measured::check(&w).expect("readings");
    assert!(
        matches!(&c.suggestion, Suggestion::PathOpen { .. }),
        "{:?}",
        c.suggestion
    );
}
