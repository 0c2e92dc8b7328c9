//! The winding data card: wire sizes, copper, resistance between leads, mass, fill and the
//! measured-resistance check, against published values and hand calculations.

mod common;

use beltwright::card::{self, measured::Suggestion, wire};
use beltwright::winding::{self, Winding};
use beltwright::{audit, layout};

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "test.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build(&spec).unwrap_or_else(|e| panic!("{e}"))
}

/// A 36-slot, 4-pole rotary core, span 7, 14 turns, 0.85 mm wire, with extra keys.
fn pump(winding_extra: &str, rest: &str) -> String {
    format!(
        "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 7\nturns_per_coil = 14\n{winding_extra}\n\
         [core]\nbore_mm = 130.0\nstack_mm = 110.0\nslot_area_mm2 = 105.0\n\
         [wire]\ndiameter_mm = 0.85\nstrands_in_hand = 2\n\
         [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n{rest}"
    )
}

// ASTM B258 tabulated bare diameters (mm, rounded as published): AWG 0000 11.684,
// AWG 10 2.588, AWG 18 1.024, AWG 24 0.511, AWG 36 0.127 (the defining point).
#[test]
fn awg_diameters_follow_astm_b258() {
    for (n, d_mm) in [
        (-3, 11.684),
        (10, 2.588),
        (18, 1.024),
        (24, 0.511),
        (36, 0.127),
    ] {
        let got = wire::awg_diameter(n).mm();
        assert!(
            (got - d_mm).abs() < 0.0006,
            "AWG {n}: {got} mm, table {d_mm}"
        );
        // The table's own diameter is that gauge (within 1 %).
        assert_eq!(
            wire::nearest_awg(beltwright::units::Length::from_mm(d_mm)),
            (n, true)
        );
    }
}

// IEC 60028: annealed copper 1/58 Ω·mm²/m at 20 °C, so 1 km of 1 mm² is 17.241 Ω; with
// α_20 = 0.00393/K it is 20.968 Ω at 75 °C.
#[test]
fn copper_resistivity_and_temperature_coefficient_follow_iec_60028() {
    let r20 = wire::COPPER.resistivity_ohm_m * 1000.0 / 1e-6;
    assert!((r20 - 17.241).abs() < 0.001, "{r20}");
    let r75 = wire::COPPER.at_temperature(r20, 75.0);
    assert!((r75 - 20.968).abs() < 0.001, "{r75}");
    // Density 8.89 g/cm³ (IEC 60028).
    assert_eq!(wire::COPPER.density_kg_m3, 8890.0);
}

// Hand calculation with the mean-turn rule l = 2L + 2.4W + 0.1 m (Pyrhönen, Jokinen and
// Hrabovcová 2014, resistance chapter; from memory): bore 130 mm / 36 slots gives a slot
// pitch of 11.345 mm, span 7 a width W = 79.41 mm, stack 110 mm: l = 220 + 190.59 + 100 = 510.59 mm. Each of two
// paths has 6 coils × 14 turns = 84 turns of 42.89 m; two strands of 0.85 mm make
// 1.1349 mm², so R_path = 42.89/(58 × 1.1349) = 0.6516 Ω and R_ph = 0.3258 Ω.
#[test]
fn mean_turn_and_resistance_by_hand() {
    let c = card::card(&wind(&pump(
        "parallel_paths = 2\nconnection = \"delta\"",
        "",
    )));
    let l = c.mean_turn.expect("sizes given").mm();
    assert!((l - 510.59).abs() < 0.01, "{l}");
    let r = c.phase_resistance_20c_ohm.expect("wire given");
    assert!((r - 0.32579).abs() < 1e-4, "{r}");
    // Copper mass: 8890 kg/m³ × 36 coils × 14 turns × 0.5106 m × 1.1349e-6 m² = 2.596 kg.
    let m = c.copper_mass_kg.expect("wire given");
    assert!((m - 2.596).abs() < 0.001, "{m}");
    // Fill: 56 wires (2 × 14 turns × 2 layers) of 0.5675 mm² bare copper in 105 mm².
    let fill = c.slot_fill.expect("area given");
    let copper = c.copper_fill.expect("area given");
    assert!((copper - 56.0 * 0.567_45 / 105.0).abs() < 1e-3, "{copper}");
    assert!(fill > copper);
}

// Star: 2·R_ph between two lines; delta: (2/3)·R_ph (series/parallel reduction, any circuits
// text); a paths with the same coils: R_ph ∝ 1/a² (each path has 1/a of the turns, and a of
// them are in parallel).
#[test]
fn line_resistance_for_star_delta_and_paths() {
    let star = card::card(&wind(&pump("connection = \"star\"", "")));
    let delta = card::card(&wind(&pump("connection = \"delta\"", "")));
    let two = card::card(&wind(&pump(
        "connection = \"star\"\nparallel_paths = 2",
        "",
    )));
    let r = star.phase_resistance_20c_ohm.unwrap();
    assert!((star.line_resistance_20c_ohm.unwrap() - 2.0 * r).abs() < 1e-12);
    assert!((delta.line_resistance_20c_ohm.unwrap() - 2.0 / 3.0 * r).abs() < 1e-12);
    assert!((two.phase_resistance_20c_ohm.unwrap() - r / 4.0).abs() < 1e-12);
}

// IEC 60034-1 clause 9.2: 1000 V + 2 × 400 V = 1800 V for a 400 V winding; at least 1500 V.
#[test]
fn hipot_voltage_follows_iec_60034_1() {
    assert_eq!(card::hipot_new_v(400.0), 1800.0);
    assert_eq!(card::hipot_new_v(230.0), 1500.0);
    let c = card::card(&wind(&pump("", "")));
    assert_eq!(c.acceptance.hipot_new_v, Some(1800.0));
}

fn check(measured: &str) -> beltwright::card::measured::ResistanceCheck {
    let w = wind(&pump(
        "connection = \"star\"",
        &format!("[measured]\nline_resistance_ohm = {measured}\ntemperature_c = 20.0\n"),
    ));
    card::measured::check(&w).expect("measured given")
}

#[test]
fn audit_accepts_readings_that_match_the_card() {
    let w = wind(&pump("connection = \"star\"", ""));
    let expect = card::card(&w).line_resistance_20c_ohm.unwrap();
    let r = check(&format!("[{expect}, {}, {expect}]", expect * 1.005));
    assert!(r.sound, "{r:?}");
    assert_eq!(r.suggestion, Suggestion::AsExpected);
}

// A star winding whose phase U reads 10 % high raises the pairs 1-2 and 3-1 (both contain
// U); the check pins it on U. This is a rule of circuits, not a tabulated value.
#[test]
fn audit_names_the_phase_of_a_high_pair() {
    let w = wind(&pump("connection = \"star\"", ""));
    let r_ph = card::card(&w).phase_resistance_20c_ohm.unwrap();
    let u = 1.10 * r_ph;
    let r = check(&format!("[{}, {}, {}]", u + r_ph, 2.0 * r_ph, r_ph + u));
    assert!(!r.sound);
    match &r.suggestion {
        Suggestion::High { phase, ratio } => {
            assert_eq!(phase, "U");
            assert!((ratio - 1.10).abs() < 1e-9);
        }
        other => panic!("{other:?}"),
    }
    // And the audit reports it as a finding, with exit status 1 from the command.
    let rec = wind(&pump(
        "connection = \"star\"",
        &format!(
            "[measured]\nline_resistance_ohm = [{}, {}, {}]\ntemperature_c = 20.0\n",
            u + r_ph,
            2.0 * r_ph,
            r_ph + u
        ),
    ));
    let rep = audit::audit(&rec, None);
    assert!(!rep.sound);
    assert!(
        rep.findings
            .iter()
            .any(|f| f.kind == audit::FindingKind::MeasuredResistance && f.phases == ["U"])
    );
}

// Wound with 0.80 mm instead of 0.85 mm (the IEC 60317 size below): every reading is
// (0.85/0.80)² = 1.129 times the card's, and the check names the smaller wire.
#[test]
fn audit_recognises_a_wrong_wire_size() {
    let w = wind(&pump("connection = \"star\"", ""));
    let e = card::card(&w).line_resistance_20c_ohm.unwrap() * (0.85f64 / 0.80).powi(2);
    let r = check(&format!("[{e}, {e}, {e}]"));
    assert!(!r.sound);
    match r.suggestion {
        Suggestion::WireSizeStep { diameter, .. } => {
            assert!((diameter.mm() - 0.80).abs() < 1e-9, "{diameter:?}")
        }
        other => panic!("{other:?}"),
    }
}

// One strand of two missing: every reading doubles.
#[test]
fn audit_recognises_a_missing_strand() {
    let w = wind(&pump("connection = \"star\"", ""));
    let e = card::card(&w).line_resistance_20c_ohm.unwrap() * 2.0;
    let r = check(&format!("[{e}, {e}, {e}]"));
    assert!(matches!(
        r.suggestion,
        Suggestion::StrandMissing { strands: 2, .. }
    ));
}

#[test]
fn card_json_carries_the_contract_fields() {
    let v = common::json(&["card", "layouts/pump-rewind.toml", "--format", "json"]);
    for key in [
        "mean_turn_mm",
        "series_turns_per_phase",
        "wire",
        "phase_resistance_20c_ohm",
        "line_resistance_20c_ohm",
        "copper_mass_kg",
        "slot_fill",
        "leads",
        "acceptance",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    for key in ["diameter_mm", "area_mm2", "strands_in_hand", "awg"] {
        assert!(v["wire"].get(key).is_some(), "missing wire.{key}");
    }
    // No slot area: slot_fill is null, not absent.
    let v = common::json(&["card", "layouts/fan-concentric.toml", "--format", "json"]);
    assert!(v["slot_fill"].is_null());
}

#[test]
fn dual_voltage_leads_need_two_paths() {
    let src = pump("leads = 12", "");
    let e = layout::parse(&src, "t.toml").unwrap_err().to_string();
    assert!(
        e.contains("winding.leads") && e.contains("parallel_paths = 2"),
        "{e}"
    );
}

// Formers by the mean-turn rule with the span width between the coil sides' centres at
// mid-slot (hand calculation): 36 slots, bore 120 mm, slots 8 mm wide and 20 mm deep, so
// the mid-slot pitch is π·140/36 = 12.2173 mm and span 8 gives W = 97.738 mm; stack 100 mm,
// k_e = 1.2, l_a = 100 mm: mean turn 2·100 + 2·1.2·97.738 + 100 = 534.572 mm; each straight
// side 100 + 2·25 = 150 mm; each end W/2·√(1.2² − 1) = 32.416 mm beyond a 25 mm extension,
// 57.416 mm out from the core.
#[test]
fn formers_follow_the_mean_turn_rule_at_mid_slot() {
    let w = wind(
        "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n\
         [winding]\nlayers = 2\npitch = 8\nturns_per_coil = 10\n\
         [core]\nbore_mm = 120.0\nstack_mm = 100.0\nslot_width_mm = 8.0\nslot_depth_mm = 20.0\n",
    );
    let c = card::card(&w);
    assert_eq!(c.formers.len(), 1);
    let f = &c.formers[0];
    let pitch = std::f64::consts::PI * 140.0 / 36.0;
    assert!((f.span_width.mm() - 8.0 * pitch).abs() < 1e-9);
    assert!(
        (f.mean_turn.mm() - 534.572).abs() < 1e-3,
        "{}",
        f.mean_turn.mm()
    );
    assert!((f.straight.mm() - 150.0).abs() < 1e-9);
    assert!(
        (f.end_extension.mm() - 57.416).abs() < 1e-3,
        "{}",
        f.end_extension.mm()
    );
    assert!((c.mean_turn.expect("mean turn").mm() - f.mean_turn.mm()).abs() < 1e-9);
}
