//! Every figure right and every statement true at the edges: factors the span removes,
//! skew in the phase EMF, audit figures when a wave vanishes, one angle reference,
//! warnings, slips outside 0..1, small truths.

mod common;
use beltwright::output::Words;
use common::{SOUND_12, json, run, small_record, temp_layout};

use beltwright::output::{Format, render};
use beltwright::winding::{self, Winding};
use beltwright::{audit, factors, layout, plan};
use proptest::prelude::*;

fn wind(src: &str) -> Winding {
    let spec = layout::parse(src, "t.toml").unwrap_or_else(|e| panic!("{e}"));
    winding::build_lenient(&spec).unwrap_or_else(|e| panic!("{e}"))
}

const CORE_36_4: &str =
    "[machine]\ntopology = \"rotary\"\nslots = 36\npoles = 4\n[winding]\nlayers = 2\n";

// Span 6 of a pole pitch of 9: k_p(3) = sin(3·(6/9)·90°) = sin 180° = 0 (Say 1983, §4.4),
// while k_d(3) = sin(3·3·10°)/(3·sin(3·10°)) = 1/1.5 = 0.6667. The row stays, with 0.
#[test]
fn factors_keep_the_orders_the_span_removes() {
    let v = json(&[
        "factors",
        temp_layout(&format!("{CORE_36_4}pitch = 6\n"))
            .path()
            .to_str()
            .expect("utf-8"),
        "--format",
        "json",
        "--upto",
        "9",
    ]);
    let rows = v["rows"].as_array().expect("rows");
    let third = rows
        .iter()
        .find(|r| r["order"] == 3.0)
        .expect("order 3 listed");
    assert_eq!(third["pitch"].as_f64(), Some(0.0));
    assert_eq!(third["winding"].as_f64(), Some(0.0));
    assert!((third["distribution"].as_f64().expect("k_d") - 2.0 / 3.0).abs() < 1e-9);
}

// Skew of one slot pitch, σ = 20° electrical: k_s = sin 10°/(10° in rad) = 0.99493
// (Pyrhönen et al. 2014, eq. 2.34). The phase EMF, labelled N_ph·k_w1, includes it.
#[test]
fn phase_emf_includes_skew() {
    let w = wind(&format!(
        "{CORE_36_4}pitch = 7\nturns_per_coil = 10\nskew = 1.0\n"
    ));
    let p = plan::plan(&w, Default::default());
    let ks = (10f64.to_radians()).sin() / 10f64.to_radians();
    assert!((p.fundamental.skew - ks).abs() < 1e-12);
    let n_ph = w.series_turns(0);
    for e in &p.phases_emf {
        assert!(
            (e.magnitude - n_ph * p.winding_factor).abs() < 1e-9 * n_ph,
            "{e:?}"
        );
    }
}

// A pure negative-sequence set has no zero sequence, and the backward wave is the larger:
// the figures are per cent of it, never 10^17 per cent (Fortescue 1918).
#[test]
fn a_reversed_sequence_reads_as_a_backward_field() {
    let swapped: Vec<(&str, usize, usize)> = SOUND_12
        .iter()
        .map(|&(p, g, b)| {
            (
                if p == "V" {
                    "W"
                } else if p == "W" {
                    "V"
                } else {
                    p
                },
                g,
                b,
            )
        })
        .collect();
    assert!(audit::audit(&wind(&small_record(&SOUND_12)), None).sound);
    let w = wind(&small_record(&swapped));
    let r = audit::audit(&w, None);
    assert_eq!(r.sequence, audit::Sequence::Negative);
    assert!((r.backward_percent - 100.0).abs() < 1e-9);
    assert!(
        r.zero_sequence_percent < 1e-9,
        "{}",
        r.zero_sequence_percent
    );
    let text = render(&r, Format::Text).expect("text");
    assert!(text.contains("runs backwards"), "{text}");
    assert!(!text.contains("e+") && text.lines().all(|l| !l.contains("0000000%")));
}

// A double-layer record whose coils were all written with go at the left side: the groups
// under alternate poles (180° apart) are then not reversed, and each phase's EMF sums to
// zero (the coils of the U+ and U- belts cancel pairwise).
#[test]
fn no_fundamental_emf_is_a_finding() {
    let mut w = wind(
        "[machine]\ntopology = \"rotary\"\nslots = 24\npoles = 4\n[winding]\nlayers = 2\npitch = 6\n",
    );
    let spans: Vec<i64> = w.coils.iter().map(|c| w.span(c)).collect();
    for (c, s) in w.coils.iter_mut().zip(spans) {
        if s < 0 {
            std::mem::swap(&mut c.go, &mut c.back);
            std::mem::swap(&mut c.go_layer, &mut c.back_layer);
        }
    }
    w.from_coil_list = true;
    let r = audit::audit(&w, None);
    assert!(r.no_fundamental, "{:?}", r.phases);
    assert!(!r.sound);
    assert!(
        r.findings
            .iter()
            .any(|f| f.kind == audit::FindingKind::NoFundamental)
    );
    assert!(r.phases.iter().all(|p| p.angle_deg == 0.0));
    let text = render(&r, Format::Text).expect("text");
    assert!(text.contains("no fundamental EMF"), "{text}");
}

// One angle reference: phase U at 0° in plan and audit alike.
#[test]
fn plan_and_audit_share_the_angle_reference() {
    for (z, p2) in [(48usize, 4usize), (36, 4), (27, 6)] {
        let src = format!(
            "[machine]\ntopology = \"rotary\"\nslots = {z}\npoles = {p2}\n[winding]\nlayers = 2\n"
        );
        let w = wind(&src);
        let p = plan::plan(&w, Default::default());
        let a = audit::audit(&w, None);
        for (x, y) in p.phases_emf.iter().zip(&a.phases) {
            assert!(
                (x.angle_deg - y.angle_deg).abs() < 1e-6,
                "{z}/{p2}: {x:?} {y:?}"
            );
        }
        assert_eq!(a.phases[0].angle_deg, 0.0);
    }
}

// Span 17 on a pole pitch of 9: k_w1 = 0.167 (k_p = sin(17/9·90°) = 0.1736). Flagged in the
// JSON of plan, pitch, field and rewind.
#[test]
fn designs_not_to_build_carry_warnings() {
    let f = temp_layout(&format!(
        "{CORE_36_4}pitch = 17\nturns_per_coil = 10\n[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n"
    ));
    let path = f.path().to_str().expect("utf-8");
    for cmd in ["plan", "pitch", "field"] {
        let v = json(&[cmd, path, "--format", "json"]);
        let kinds: Vec<&str> = v["warnings"]
            .as_array()
            .expect("warnings")
            .iter()
            .filter_map(|w| w["kind"].as_str())
            .collect();
        assert!(
            kinds.contains(&"span_far_from_pole_pitch"),
            "{cmd}: {kinds:?}"
        );
        assert!(kinds.contains(&"low_winding_factor"), "{cmd}");
    }
    let v = json(&[
        "rewind",
        "layouts/hoist-rewind-sound.toml",
        path,
        "--format",
        "json",
    ]);
    assert!(!v["warnings"].as_array().expect("warnings").is_empty());
    // A sound design has none.
    let v = json(&["plan", "layouts/pump-rewind.toml", "--format", "json"]);
    assert_eq!(v["warnings"].as_array().map(Vec::len), Some(0));
}

// A suggestion's span fits its own pole pitch: q = 1 on 4 poles means τ = 3, so span 3.
#[test]
fn slot_suggestions_fit_the_span_they_name() {
    let f = temp_layout(
        "[machine]\ntopology = \"linear\"\nslots = 22\npoles = 4\n[winding]\nlayers = 2\npitch = 5\n",
    );
    let out = run(&["plan", f.path().to_str().expect("utf-8")]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("q = 1 needs 15 slots with span 3"), "{err}");
}

#[test]
fn small_truths() {
    let out = run(&["pitch", "layouts/pump-rewind.toml", "--suppress", "1,5"]);
    assert_eq!(out.status.code(), Some(2));
    let f = temp_layout(CORE_36_4);
    let out = run(&["plan", f.path().to_str().expect("utf-8")]);
    assert!(String::from_utf8_lossy(&out.stdout).contains("1 turn per coil (assumed"));
    let out = run(&["plan", "layouts/pallet-shuttle.toml", "--slip", "-0.1"]);
    assert!(out.status.success());
    assert!(String::from_utf8_lossy(&out.stdout).contains("(generating)"));
    let out = run(&["field", "layouts/pallet-shuttle.toml", "--slip", "1.2"]);
    assert!(String::from_utf8_lossy(&out.stdout).contains("plugging"));
}

fn all_finite(v: &serde_json::Value) -> bool {
    match v {
        serde_json::Value::Number(n) => n.as_f64().is_some_and(f64::is_finite),
        serde_json::Value::Array(a) => a.iter().all(all_finite),
        serde_json::Value::Object(o) => o.values().all(all_finite),
        _ => true,
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]
    // Every number in every report of a planned or recorded winding is finite.
    #[test]
    fn every_output_number_is_finite(
        z in 6usize..60, p2 in 1usize..12, layers in 1usize..=2, linear in any::<bool>(),
        reverse in 0usize..8,
    ) {
        let topo = if linear { "linear" } else { "rotary" };
        let p2 = if linear { p2 } else { 2 * p2.div_ceil(2) };
        let src = format!("[machine]\ntopology = \"{topo}\"\nslots = {z}\npoles = {p2}\n[winding]\nlayers = {layers}\nturns_per_coil = 5\n[core]\nslot_pitch_mm = 10.0\nstack_mm = 50.0\nairgap_mm = 1.0\n[supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n[wire]\ndiameter_mm = 0.5\n[secondary]\nthickness_mm = 3.0\n");
        let Ok(spec) = layout::parse(&src, "p.toml") else { return Ok(()); };
        let Ok(mut w) = winding::build(&spec) else { return Ok(()); };
        // A faulty record too: one coil reversed.
        if let Some(c) = w.coils.get_mut(reverse) { std::mem::swap(&mut c.go, &mut c.back); }
        let check = |v: serde_json::Value| all_finite(&v);
        let j = |s: String| serde_json::from_str::<serde_json::Value>(&s).expect("json");
        prop_assert!(check(j(render(&audit::audit(&w, None), Format::Json).expect("json"))));
        prop_assert!(check(j(render(&plan::plan(&w, Default::default()), Format::Json).expect("json"))));
        prop_assert!(check(j(render(&factors::factor_table(&w, 13.0), Format::Json).expect("json"))));
        prop_assert!(check(j(render(&beltwright::card::card(&w), Format::Json).expect("json"))));
        if let Ok(i) = beltwright::inductance::inductance(&w, false) {
            prop_assert!(check(j(render(&i, Format::Json).expect("json"))));
        }
        let q = beltwright::thrust::ThrustQuery { current_a: None, slip_from: -0.5, slip_to: 1.5, steps: 8, end_effect: true };
        if let Ok(t) = beltwright::thrust::thrust(&w, &q) {
            prop_assert!(check(j(render(&t, Format::Json).expect("json"))));
        }
        // The loadings of the winding, and a sizing of its bare core (with a flat primary's
        // thrust target), on a core with teeth, back iron and a nameplate.
        let cored = src.replace("stack_mm = 50.0", "stack_mm = 50.0\ntooth_width_mm = 5.0\nyoke_depth_mm = 12.0\nslot_depth_mm = 20.0")
            + "[nameplate]\npower_kw = 1.5\n";
        if let Ok(spec) = layout::parse(&cored, "c.toml") {
            if let Ok(w) = winding::build(&spec) {
                let l = beltwright::loading::report(&w, &Default::default(), 1.0);
                if let Ok(l) = l {
                    prop_assert!(check(j(render(&l, Format::Json).expect("json"))));
                }
            }
            let req = beltwright::sizing::Request {
                thrust: linear.then_some((20.0, beltwright::sizing::At::Slip(0.3))),
                ..Default::default()
            };
            if let Ok(z) = beltwright::sizing::size(&spec.labels, &spec.design, &req) {
                prop_assert!(check(j(render(&z, Format::Json).expect("json"))));
            }
        }
    }
}

fn gcd(a: usize, b: usize) -> usize {
    if b == 0 { a } else { gcd(b, a % b) }
}

// Fractional-slot winding theory (e.g. Pyrhönen et al. 2014, §2.4; from memory): a balanced
// three-phase single-layer winding exists when Z is even and Z/(3·gcd(Z, p)) is whole, a
// double-layer one when Z/(3·gcd(Z, p)) is whole. The planner builds exactly those, the
// survey agrees row by row, and the audit rates every planned coil list sound with the
// same k_w1.
#[test]
fn plan_survey_and_audit_agree_on_what_exists() {
    use beltwright::survey::{self, SurveyQuery};
    let query = SurveyQuery {
        slots: 6..=72,
        poles: 2..=24,
        layers: vec![1, 2],
        phases: 3,
        topology: beltwright::winding::Topology::Rotary,
    };
    let report = survey::survey(&query, &|| {});
    // Every combination the query names is a row, in slot, pole, layer order (counted here
    // from the ranges, not from the report).
    let asked: Vec<(usize, usize, usize)> = (6..=72usize)
        .flat_map(|z| (2..=24usize).step_by(2).map(move |p2| (z, p2)))
        .flat_map(|(z, p2)| [1usize, 2].map(|l| (z, p2, l)))
        .collect();
    let rows: Vec<(usize, usize, usize)> = report
        .rows
        .iter()
        .map(|r| (r.slots, r.poles, r.layers))
        .collect();
    assert_eq!(
        rows, asked,
        "the survey reports every combination asked for"
    );
    let mut expected = 0usize;
    let mut checked = 0;
    for row in &report.rows {
        let (z, p2, layers) = (row.slots, row.poles, row.layers);
        if p2 % 2 == 1 {
            continue;
        }
        let p = p2 / 2;
        let whole = z % (3 * gcd(z, p)) == 0;
        let theory = if layers == 1 {
            whole && z % 2 == 0
        } else {
            whole
        };
        let src = format!(
            "[machine]\ntopology = \"rotary\"\nslots = {z}\npoles = {p2}\n[winding]\nlayers = {layers}\n"
        );
        let spec = layout::parse(&src, "t.toml").expect("valid");
        let built = winding::build(&spec);
        // A span that links no flux (2p = Z) is no winding, whatever the belts say.
        if p2 == z || (layers == 1 && p2 * 2 == z && z % 3 != 0) {
            continue;
        }
        assert_eq!(
            built.is_ok(),
            theory,
            "{z}/{p2} layers {layers}: {:?}",
            built.err()
        );
        assert_eq!(row.feasible, theory, "{z}/{p2} layers {layers}: survey");
        expected += usize::from(theory);
        if let Ok(w) = built {
            let a = audit::audit(&w, None);
            assert!(a.balanced && a.sound, "{z}/{p2}/{layers}: {:?}", a.findings);
            // The survey's span, built by the planner, has the survey's k_w1, and every
            // coil of it spans what the row says.
            let y = row.pitch.expect("a feasible row names its span");
            let at = winding::build(&layout::Spec::of(spec.design.with_span(y)))
                .unwrap_or_else(|e| panic!("{z}/{p2}/{layers} at span {y}: {e}"));
            assert_eq!(
                at.pitch, y,
                "{z}/{p2}/{layers}: span reported is span built"
            );
            let kw = factors::fundamental(&at).winding;
            let k = row.winding.expect("k_w1");
            assert!((kw - k).abs() < 1e-9, "{z}/{p2}/{layers}: {kw} vs {k}");
            // Symmetry from the coils: the survey's periodicity and pull are the plan's.
            let pl = plan::plan(&at, Default::default());
            assert_eq!(
                row.periodicity, pl.periodicity,
                "{z}/{p2}/{layers}: periodicity"
            );
            assert_eq!(
                row.unbalanced_pull, pl.unbalanced_pull,
                "{z}/{p2}/{layers}: pull"
            );
            checked += 1;
        }
    }
    // Every combination the feasibility rule (Z/(m·gcd(Z, p)) whole, worked out above from
    // the counts alone) calls windable was built and checked row by row, and there were some;
    // a survey that silently drops rows fails the row list above.
    assert!(expected > 0);
    assert_eq!(checked, expected);
}

// Single-layer tooth coils wind every other tooth, so they repeat gcd(Z/2, p) times, not
// gcd(Z, p): 12 slots, 8 poles gives 2 against the double layer's gcd(12, 4) = 4 (counted
// from the coil list, as the symmetry of the winding itself).
#[test]
fn periodicity_comes_from_the_coils() {
    let src = |layers: usize| {
        format!(
            "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 8\n[winding]\nlayers = {layers}\npitch = 1\n"
        )
    };
    let single = plan::plan(&wind(&src(1)), Default::default());
    let double = plan::plan(&wind(&src(2)), Default::default());
    assert_eq!(single.periodicity, Some(2));
    assert_eq!(double.periodicity, Some(4));
    // 9 slots, 8 poles: no symmetry at all, so unbalanced pull (common practice for odd
    // slot counts with t = 1).
    let nine = plan::plan(
        &wind(
            "[machine]\ntopology = \"rotary\"\nslots = 9\npoles = 8\n[winding]\nlayers = 2\npitch = 1\n",
        ),
        Default::default(),
    );
    assert_eq!(nine.periodicity, Some(1));
    assert_eq!(nine.unbalanced_pull, Some(true));
}

// A single-layer lap winding shortened from full pitch keeps every slot's contents, so its
// EMF and MMF are those of full pitch (the coil EMFs sum over the same slot sides): no
// pitch factor below 1 is shown, and the factors table says why. 24 slots, 4 poles, q = 2:
// k_w1 = k_d1 = sin(30°)/(2·sin 15°) = 0.9659 (Say 1983, §4.4).
#[test]
fn a_short_single_layer_span_suppresses_nothing_and_says_so() {
    let at = |y: usize| {
        wind(&format!(
            "[machine]\ntopology = \"rotary\"\nslots = 24\npoles = 4\n[winding]\nlayers = 1\npitch = {y}\n"
        ))
    };
    for y in [5, 6] {
        let w = at(y);
        let t = factors::factor_table(&w, 13.0);
        let first = t.rows[0];
        assert_eq!(first.pitch, 1.0);
        let kd = 30f64.to_radians().sin() / (2.0 * 15f64.to_radians().sin());
        assert!(
            (first.winding - kd).abs() < 1e-12,
            "span {y}: {}",
            first.winding
        );
        assert!(t.single_layer);
        let text = render(&t, Format::Text).expect("text");
        assert!(text.contains("suppresses nothing"));
    }
}

fn hoist(name: &str) -> Winding {
    let src = std::fs::read_to_string(format!("layouts/{name}.toml")).expect("layout");
    wind(&src)
}

// Audit against the intended design gives one finding per fault: one reversed coil is one
// finding; leads swapped plus a reversed coil are two (they gave 2 and 27 before).
#[test]
fn audit_with_the_design_gives_one_finding_per_fault() {
    let design = hoist("hoist-rewind-sound");
    let mut one = design.clone();
    one.from_coil_list = true;
    let c = &mut one.coils[4];
    (c.go, c.back, c.go_layer, c.back_layer) = (c.back, c.go, c.back_layer, c.go_layer);
    let r = audit::audit(&one, Some(&design));
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    assert_eq!(r.findings[0].coils, vec![5]);

    let mut two = one.clone();
    for c in &mut two.coils {
        c.phase = match c.phase {
            1 => 2,
            2 => 1,
            p => p,
        };
    }
    let r = audit::audit(&two, Some(&design));
    assert_eq!(r.findings.len(), 2, "{:#?}", r.findings);
}

// A coil recorded with one slot number wrong spans one more than its group: named.
#[test]
fn audit_pinpoints_a_coil_whose_span_differs_from_its_group() {
    let mut w = hoist("hoist-rewind-sound");
    w.from_coil_list = true;
    let z = w.geometry.slots;
    let c = &mut w.coils[7];
    // Move the back side one slot further along (its layer stays): span + 1 or − 1.
    c.back = if c.back > c.go {
        (c.back + 1) % z
    } else {
        (c.back + z - 1) % z
    };
    let r = audit::audit(&w, None);
    // The moved side overfills one slot and leaves another short, so the finding also says
    // where the coil belongs: one finding for the one fault.
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    let f = &r.findings[0];
    assert_eq!(f.kind, audit::FindingKind::CoilWrongSlots);
    assert_eq!(f.coils, vec![8]);
    let sound = hoist("hoist-rewind-sound");
    let (go, back) = (sound.coils[7].go + 1, sound.coils[7].back + 1);
    assert!(
        f.message().contains(&format!(
            "spans {} where it should span {}",
            sound.pitch + 1,
            sound.pitch
        )) && f
            .message()
            .contains(&format!("in at slot {go}, out at slot {back}")),
        "{}",
        f.message()
    );
}

// A flat primary's current sheet has finite length, so its wavenumber transform is
// continuous (a finite sinusoid's transform is a sinc; Fourier theory): the field report
// samples it finely, agrees with the whole-order rows where they meet, and shows the
// components between whole orders that sampling at whole orders missed.
#[test]
fn a_flat_primary_has_a_continuous_spectrum() {
    let v = json(&[
        "field",
        "layouts/pallet-shuttle.toml",
        "--format",
        "json",
        "--upto",
        "13",
    ]);
    let lin = &v["linear"];
    let cont = lin["continuous"].as_array().expect("continuous spectrum");
    assert!(cont.len() > 100);
    for row in v["rows"].as_array().expect("rows") {
        let nu = row["order"].as_f64().expect("order");
        if let Some(p) = cont
            .iter()
            .find(|p| (p["order"].as_f64().unwrap_or(-1.0) - nu).abs() < 1e-9)
        {
            let (f, b) = (
                p["forward"].as_f64().unwrap_or(-1.0),
                p["backward"].as_f64().unwrap_or(-1.0),
            );
            assert!(
                (f - row["forward"].as_f64().unwrap_or(-2.0)).abs() < 1e-9,
                "order {nu}"
            );
            assert!(
                (b - row["backward"].as_f64().unwrap_or(-2.0)).abs() < 1e-9,
                "order {nu}"
            );
        }
    }
    let between = &lin["strongest_between_orders"];
    let amp = between["forward"]
        .as_f64()
        .unwrap_or(0.0)
        .max(between["backward"].as_f64().unwrap_or(0.0));
    assert!(amp > 1e-3, "{between}");
}

// Two coils laid into each other's phase are one fault, named once with both coils.
#[test]
fn two_coils_swapped_between_phases_are_one_finding() {
    let mut w = hoist("hoist-rewind-sound");
    w.from_coil_list = true;
    let (i, j) = (
        w.coils.iter().position(|c| c.phase == 1).expect("a V coil"),
        w.coils.iter().position(|c| c.phase == 2).expect("a W coil"),
    );
    w.coils[i].phase = 2;
    w.coils[j].phase = 1;
    let r = audit::audit(&w, None);
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    assert_eq!(r.findings[0].kind, audit::FindingKind::CoilsSwapped);
    let mut both = vec![i + 1, j + 1];
    both.sort_unstable();
    assert_eq!(r.findings[0].coils, both);
    assert_eq!(r.fix_edits, 1);
}

// The faults a shop makes (common practice): a coil reversed, two coils laid into each
// other's phase, a whole coil group connected into another phase, coils of one phase
// exchanged between its parallel paths. Each planted fault is one finding naming exactly
// the planted coils, and the edits counted are the shop's mistakes.
#[test]
fn audit_names_the_faults_shops_make_one_finding_each() {
    let sound = hoist("hoist-rewind-sound");
    let groups = winding::coil_groups(&sound);
    let in_phase = |k: usize| groups.iter().filter(move |g| g.phase == k);
    let u = in_phase(0).next().expect("a U group").coils.clone();
    let v = in_phase(1).next().expect("a V group").coils.clone();

    // A reversed coil plus a pair swapped between phases: two mistakes, two findings.
    let mut w = sound.clone();
    w.from_coil_list = true;
    let c = &mut w.coils[v[1]];
    (c.go, c.back, c.go_layer, c.back_layer) = (c.back, c.go, c.back_layer, c.go_layer);
    let (a, b) = (u[0], v[0]);
    (w.coils[a].phase, w.coils[b].phase) = (w.coils[b].phase, w.coils[a].phase);
    let r = audit::audit(&w, None);
    let mut kinds: Vec<_> = r.findings.iter().map(|f| f.kind).collect();
    kinds.sort_by_key(|k| format!("{k:?}"));
    assert_eq!(
        kinds,
        vec![
            audit::FindingKind::CoilsSwapped,
            audit::FindingKind::ReversedCoil
        ],
        "{:#?}",
        r.findings
    );
    assert_eq!(r.fix_edits, 2);
    let swap = r
        .findings
        .iter()
        .find(|f| f.kind == audit::FindingKind::CoilsSwapped)
        .expect("swap");
    let mut pair = vec![a + 1, b + 1];
    pair.sort_unstable();
    assert_eq!(swap.coils, pair);

    // A whole group connected into the next phase: one finding naming the group.
    let mut w = sound.clone();
    w.from_coil_list = true;
    for &i in &u {
        w.coils[i].phase = 1;
    }
    let r = audit::audit(&w, None);
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    assert_eq!(r.findings[0].kind, audit::FindingKind::GroupWrongPhase);
    let mut named: Vec<usize> = u.iter().map(|i| i + 1).collect();
    named.sort_unstable();
    assert_eq!(r.findings[0].coils, named);
    assert_eq!(r.fix_edits, 1);
    let fix = audit::search(&w).fix.expect("a fix");
    assert!(audit::apply_fix(&w, &fix).is_balanced());
}

// Parallel paths (common practice: each path of a phase must carry the same EMF, or a
// current circulates): two coils exchanged between the paths, and a whole coil group in
// the wrong path, are each one finding naming exactly those coils.
#[test]
fn audit_finds_coils_and_groups_in_the_wrong_parallel_path() {
    let sound = hoist("hoist-rewind-sound");
    assert_eq!(sound.parallel_paths, 2);
    let groups = winding::coil_groups(&sound);
    let u: Vec<_> = groups.iter().filter(|g| g.phase == 0).collect();
    // Two U coils in different paths and at different positions under their poles.
    let a = u[0].coils[0];
    let b = u
        .iter()
        .find(|g| sound.coils[g.coils[0]].path != sound.coils[a].path)
        .map(|g| g.coils[1])
        .expect("a U group in the other path");
    let mut w = sound.clone();
    w.from_coil_list = true;
    (w.coils[a].path, w.coils[b].path) = (w.coils[b].path, w.coils[a].path);
    let r = audit::audit(&w, None);
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    assert_eq!(r.findings[0].kind, audit::FindingKind::PathMismatch);
    let mut pair = vec![a + 1, b + 1];
    pair.sort_unstable();
    assert_eq!(r.findings[0].coils, pair, "{}", r.findings[0].message());

    // A whole group in the other path: the paths differ in turns; one finding, the group.
    let g = u[0];
    let to = 1 - sound.coils[g.coils[0]].path;
    let mut w = sound.clone();
    w.from_coil_list = true;
    for &i in &g.coils {
        w.coils[i].path = to;
    }
    let r = audit::audit(&w, None);
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    let mut named: Vec<usize> = g.coils.iter().map(|i| i + 1).collect();
    named.sort_unstable();
    assert_eq!(r.findings[0].coils, named, "{}", r.findings[0].message());
    assert!(r.findings[0].message().contains("coil group"));
}
