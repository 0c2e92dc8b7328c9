//! Layout → winding → every analysis → every presenter, sheet and the HTML page. Asserts
//! that text and CSV never show NaN or infinity, that JSON parses back and validates
//! against the command's schema (so `null`, which is how serde_json writes a NaN, fails
//! wherever the schema says number), that every SVG is well-formed XML, and that nothing
//! panics. Cores above 240 slots are skipped to keep each run short (their code paths are
//! the same).
#![no_main]

use beltwright::draw::{self, Page, Sheet};
use beltwright::output::{Format, Report, render};
use beltwright::{audit, card, factors, field, inductance, pitch, plan, thrust};
use libfuzzer_sys::fuzz_target;

use serde_json::Value;

fn finite(v: &Value) -> bool {
    match v {
        Value::Number(n) => n.as_f64().is_some_and(f64::is_finite),
        Value::Array(a) => a.iter().all(finite),
        Value::Object(o) => o.values().all(finite),
        _ => true,
    }
}

/// Whether the layout's own text (title, labels, shop data) could spell "NaN" or "inf", in
/// which case the words are not searched for them (the JSON check still holds).
static USER_SPELLS: std::sync::atomic::AtomicBool = std::sync::atomic::AtomicBool::new(false);

fn check<R: Report>(cmd: &str, r: &R) {
    for f in [Format::Text, Format::Csv] {
        let s = render(r, f).expect("presents");
        if !USER_SPELLS.load(std::sync::atomic::Ordering::Relaxed) {
            for bad in ["NaN", " inf", "-inf"] {
                assert!(!s.contains(bad), "{cmd}: {bad} in {s}");
            }
        }
    }
    let json = render(r, Format::Json).expect("presents");
    let v: Value = serde_json::from_str(&json).expect("JSON parses back");
    assert!(finite(&v), "a number is not finite: {json}");
    let schema = beltwright::output::schema::all()
        .into_iter()
        .find(|(c, _)| *c == cmd)
        .map(|(_, s)| s)
        .expect("schema");
    if let Err(e) = schema_check(&v, &schema, cmd) {
        panic!("{e}");
    }
}

#[path = "../../tests/common/schema.rs"]
mod schema;
use schema::schema_check;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    let Ok(spec) = beltwright::layout::parse(text, "fuzz.toml") else {
        return;
    };
    if spec.design.slots > 240 || spec.coils.len() > 480 {
        return;
    }
    let Ok(w) = beltwright::winding::build_lenient(&spec) else {
        return;
    };
    let user = format!(
        "{:?}{:?}{:?}{:?}",
        w.labels.title, w.design.phase_labels, w.design.nameplate, w.design.job
    )
    .to_lowercase();
    USER_SPELLS.store(
        user.contains("nan") || user.contains("inf"),
        std::sync::atomic::Ordering::Relaxed,
    );
    // A single-phase stator's five views and a two-winding core's, each under its schema.
    {
        let study = beltwright::study::Study::new(&w, None);
        if let Some(sp) = study.single_phase() {
            use beltwright::output::single_phase_report::{SinglePhaseView, View};
            for view in [
                View::Plan,
                View::Factors,
                View::Field,
                View::Card,
                View::Audit,
            ] {
                check(
                    "single-phase",
                    &SinglePhaseView {
                        report: sp,
                        winding: &w,
                        view,
                    },
                );
            }
        }
    }
    if let Some(second) = &spec.second
        && second.spec.design.slots <= 240
        && let Ok(w2) = beltwright::winding::build_lenient(&second.spec)
    {
        use beltwright::output::two_winding_report::{TwoWindingView, View};
        let pair = beltwright::two_winding::TwoStudy::new([&w, &w2], [None, None], second.sharing);
        for view in [
            View::Plan,
            View::Factors,
            View::Field,
            View::Card,
            View::Audit,
        ] {
            check("two-winding", &TwoWindingView { study: &pair, view });
        }
        let html = beltwright::output::html::document_two(&pair, None);
        if !USER_SPELLS.load(std::sync::atomic::Ordering::Relaxed) {
            assert!(!html.contains("NaN"), "NaN on the two-winding page");
        }
    }
    check("audit", &audit::audit(&w, None));
    check("card", &card::card(&w));
    if let Ok(l) = beltwright::loading::report(&w, &Default::default(), 1.0) {
        check("loading", &l);
    }
    if w.coils.len() <= 120
        && let Ok(z) = beltwright::sizing::size(&spec.labels, &spec.design, &Default::default())
    {
        check("size", &z);
    }
    if let Ok(i) = inductance::inductance(&w, w.coils.len() <= 60) {
        check("inductance", &i);
    }
    if let Ok(s) = beltwright::speeds::speeds(&w) {
        check("speeds", &s);
    }
    let html = beltwright::output::html::document(&beltwright::study::Study::new(&w, None));
    if !USER_SPELLS.load(std::sync::atomic::Ordering::Relaxed) {
        assert!(!html.contains("NaN"), "NaN on the HTML page");
    }
    if beltwright::winding::build(&spec).is_err() {
        return;
    }
    check("plan", &plan::plan(&w, Default::default()));
    check("factors", &factors::factor_table(&w, 25.0));
    if let Ok(f) = field::field(&w, &field::FieldOptions::balanced(&w)) {
        check("field", &f);
    }
    check(
        "pitch",
        &pitch::compare(
            &w,
            &pitch::PitchGoal {
                suppress: vec![5.0, 7.0],
                min_fundamental: 0.9,
            },
        ),
    );
    // Current-fed and voltage-fed, over the working range and at slips far too small for
    // R2'/s to be formed directly.
    for (from, to) in [(-0.2, 1.2), (1e-300, 1e-150)] {
        for current_a in [Some(5.0), None] {
            let q = thrust::ThrustQuery {
                current_a,
                slip_from: from,
                slip_to: to,
                steps: 7,
                end_effect: true,
            };
            if let Ok(t) = thrust::thrust(&w, &q) {
                check("thrust", &t);
            }
        }
    }
    for sheet in Sheet::ALL {
        for svg in draw::draw(
            &beltwright::study::Study::new(&w, None),
            sheet,
            &Page::default(),
        ) {
            roxmltree::Document::parse(&svg).expect("well-formed SVG");
        }
    }
});
