//! JSON output checked against the documented schemas by the `jsonschema` crate (the draft
//! schemars writes, detected from the schema), shared by the tests and the `pipeline` fuzz
//! target (which includes this file by path).

use serde_json::Value;

/// Every way `v` breaks `schema`, one line each, prefixed by `at` (the command); `Ok` when
/// it validates. Extra properties are allowed (the schemas do not forbid them: the contract
/// may grow).
pub fn schema_check(v: &Value, schema: &Value, at: &str) -> Result<(), String> {
    let validator = jsonschema::validator_for(schema)
        .map_err(|e| format!("{at}: the schema does not compile: {e}"))?;
    let errors: Vec<String> = validator
        .iter_errors(v)
        .map(|e| format!("{at}{}: {e}", e.instance_path()))
        .collect();
    if errors.is_empty() {
        Ok(())
    } else {
        Err(errors.join("\n"))
    }
}
