//! Layout → winding → every analysis → every presenter and sheet. Asserts that JSON parses
//! back with every number finite, that every SVG is well-formed XML, and that nothing
//! panics. Cores above 240 slots are skipped to keep each run short (their code paths are
//! the same).
#![no_main]

use beltwright::draw::{self, Page, Sheet};
use beltwright::output::{Format, Report, render};
use beltwright::{audit, card, factors, field, inductance, pitch, plan, thrust};
use libfuzzer_sys::fuzz_target;

fn finite(v: &serde_json::Value) -> bool {
    match v {
        serde_json::Value::Number(n) => n.as_f64().is_some_and(f64::is_finite),
        serde_json::Value::Array(a) => a.iter().all(finite),
        serde_json::Value::Object(o) => o.values().all(finite),
        _ => true,
    }
}

fn check<R: Report>(r: &R) {
    for f in [Format::Text, Format::Csv] {
        render(r, f).expect("presents");
    }
    let json = render(r, Format::Json).expect("presents");
    let v: serde_json::Value = serde_json::from_str(&json).expect("JSON parses back");
    assert!(finite(&v), "a number is not finite: {json}");
}

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
    check(&audit::audit(&w, None));
    check(&card::card(&w));
    if let Ok(i) = inductance::inductance(&w, false) {
        check(&i);
    }
    if beltwright::winding::build(&spec).is_err() {
        return;
    }
    check(&plan::plan(&w, Default::default()));
    check(&factors::factor_table(&w, 25.0));
    if let Ok(f) = field::field(&w, &field::FieldOptions::balanced(&w)) {
        check(&f);
    }
    check(&pitch::compare(
        &w,
        &pitch::PitchGoal {
            suppress: vec![5.0, 7.0],
            min_fundamental: 0.9,
        },
    ));
    let q = thrust::ThrustQuery {
        current_a: Some(5.0),
        slip_from: -0.2,
        slip_to: 1.2,
        steps: 7,
        end_effect: true,
    };
    if let Ok(t) = thrust::thrust(&w, &q) {
        check(&t);
    }
    for sheet in Sheet::ALL {
        for svg in draw::draw(&w, sheet, &Page::default()) {
            roxmltree::Document::parse(&svg).expect("well-formed SVG");
        }
    }
});
