//! JSON Schemas of every command's `--format json` output, made from the report types
//! themselves, so the documented format cannot drift from what the tool writes.
//! `docs/schemas/` holds them; `tests/json_schemas.rs` checks the files against these and
//! every example's actual output against the files.

use schemars::schema_for;
use serde_json::Value;

/// (command, schema of its JSON output) for every analysis command.
pub fn all() -> Vec<(&'static str, Value)> {
    let v = |s: schemars::Schema| s.to_value();
    vec![
        ("plan", v(schema_for!(crate::plan::PlanReport))),
        ("factors", v(schema_for!(crate::factors::FactorTable))),
        ("field", v(schema_for!(crate::field::FieldReport))),
        ("pitch", v(schema_for!(crate::pitch::PitchReport))),
        ("survey", v(schema_for!(crate::survey::SurveyReport))),
        ("audit", v(schema_for!(crate::audit::AuditReport))),
        ("rewind", v(schema_for!(crate::rewind::RewindReport))),
        ("card", v(schema_for!(crate::card::DataCard))),
        ("thrust", v(schema_for!(crate::thrust::ThrustReport))),
        (
            "inductance",
            v(schema_for!(crate::inductance::InductanceReport)),
        ),
    ]
}
