//! JSON Schemas of every command's `--format json` output, made from the JSON forms of the
//! report types (`output::json`), so the documented format cannot drift from what the tool writes.
//! `docs/schemas/` holds them; `tests/json_schemas.rs` checks the files against these and
//! every example's actual output against the files.

use schemars::schema_for;
use serde_json::Value;

/// (command, schema of its JSON output) for every analysis command.
pub fn all() -> Vec<(&'static str, Value)> {
    let v = |s: schemars::Schema| sorted(s.to_value());
    use super::json::*;
    vec![
        ("plan", v(schema_for!(PlanJson))),
        ("factors", v(schema_for!(FactorsJson))),
        ("field", v(schema_for!(FieldJson))),
        ("pitch", v(schema_for!(PitchJson))),
        ("survey", v(schema_for!(SurveyJson))),
        ("audit", v(schema_for!(AuditJson))),
        ("rewind", v(schema_for!(RewindJson))),
        ("card", v(schema_for!(CardJson))),
        ("thrust", v(schema_for!(ThrustJson))),
        ("plates", v(schema_for!(PlatesJson))),
        ("inductance", v(schema_for!(InductanceJson))),
        ("loading", v(schema_for!(LoadingJson))),
        ("size", v(schema_for!(SizingJson))),
        ("speeds", v(schema_for!(super::speeds_report::SpeedsJson))),
        (
            "survey-two-speed",
            v(schema_for!(super::speeds_report::TwoSpeedSurveyJson)),
        ),
        // Every view (plan, factors, field, card, audit) of a single-phase stator.
        (
            "single-phase",
            v(schema_for!(super::single_phase_report::SinglePhaseJson)),
        ),
        // Every view (plan, factors, field, card, audit) of two windings in one core.
        (
            "two-winding",
            v(schema_for!(super::two_winding_report::TwoWindingJson)),
        ),
        ("book-find", v(schema_for!(super::book_report::FoundJson))),
        ("book-show", v(schema_for!(super::book_report::RecordJson))),
        // One line of `book dump`: the backup format `book load` reads.
        (
            "book-entry",
            v(schema_for!(beltwright_study::record::Entry)),
        ),
    ]
}

/// `v` with every object's keys in order, so a schema file reads the same whatever order
/// the generator kept them in (the JSON output itself keeps its fields' order).
fn sorted(v: Value) -> Value {
    match v {
        Value::Object(m) => {
            let mut pairs: Vec<(String, Value)> = m.into_iter().collect();
            pairs.sort_by(|a, b| a.0.cmp(&b.0));
            Value::Object(pairs.into_iter().map(|(k, x)| (k, sorted(x))).collect())
        }
        Value::Array(a) => Value::Array(a.into_iter().map(sorted).collect()),
        other => other,
    }
}
