//! Helpers shared by the command-line tests: run the built binary as a user would.
#![allow(dead_code)] // each test file uses the helpers it needs

use assert_cmd::Command;
use serde_json::Value;

/// The `beltwright` binary of this build.
pub fn beltwright() -> Command {
    Command::cargo_bin("beltwright").expect("binary built")
}

/// Run with these arguments and return what it printed and its status.
pub fn run(args: &[&str]) -> std::process::Output {
    beltwright().args(args).output().expect("runs")
}

/// Run with these arguments, expect success, and parse stdout as one JSON object.
pub fn json(args: &[&str]) -> Value {
    let out = run(args);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).expect("one JSON object")
}

/// A layout written to a temporary `.toml` file, removed when dropped.
pub fn temp_layout(text: &str) -> tempfile::NamedTempFile {
    let f = tempfile::Builder::new()
        .suffix(".toml")
        .tempfile()
        .expect("temp file");
    std::fs::write(f.path(), text).expect("write");
    f
}

/// A 12-slot, 2-pole single-layer record (q = 2) with these coils: (phase, go, back).
pub fn small_record(coils: &[(&str, usize, usize)]) -> String {
    let mut s = String::from(
        "[machine]\ntopology = \"rotary\"\nslots = 12\npoles = 2\n\n[winding]\nlayers = 1\n",
    );
    for (p, g, b) in coils {
        s += &format!("\n[[coil]]\nphase = \"{p}\"\ngo = {g}\nback = {b}\n");
    }
    s
}

/// A balanced record for [`small_record`]. 12 slots, 2 poles, slot angle 30°: belts U+ 1-2,
/// W- 3-4, V+ 5-6, U- 7-8, W+ 9-10, V- 11-12, so U 1-7, 2-8; V 5-11, 6-12; W 9-3, 10-4
/// (built by hand from the 60° belts).
pub const SOUND_12: [(&str, usize, usize); 6] = [
    ("U", 1, 7),
    ("U", 2, 8),
    ("W", 9, 3),
    ("W", 10, 4),
    ("V", 5, 11),
    ("V", 6, 12),
];

/// A small validator for what schemars writes: $ref into $defs, type (one or several),
/// properties and required, items, anyOf/oneOf/allOf, enum and const. Extra properties are
/// allowed (the contract may grow).
pub fn schema_check(v: &Value, s: &Value, root: &Value, at: &str) -> Result<(), String> {
    if let Some(r) = s.get("$ref").and_then(Value::as_str) {
        let name = r.trim_start_matches("#/$defs/");
        return schema_check(v, &root["$defs"][name], root, at);
    }
    if let Some(alts) = s
        .get("anyOf")
        .or_else(|| s.get("oneOf"))
        .and_then(Value::as_array)
        && !alts.iter().any(|a| schema_check(v, a, root, at).is_ok())
    {
        return Err(format!("{at}: matches no alternative: {v}"));
    }
    if let Some(all) = s.get("allOf").and_then(Value::as_array) {
        for a in all {
            schema_check(v, a, root, at)?;
        }
    }
    if let Some(e) = s.get("enum").and_then(Value::as_array)
        && !e.contains(v)
    {
        return Err(format!("{at}: {v} not in {e:?}"));
    }
    if let Some(c) = s.get("const")
        && c != v
    {
        return Err(format!("{at}: {v} is not {c}"));
    }
    if let Some(t) = s.get("type") {
        let types: Vec<&str> = match t {
            Value::String(x) => vec![x.as_str()],
            Value::Array(a) => a.iter().filter_map(Value::as_str).collect(),
            _ => Vec::new(),
        };
        let ok = types.iter().any(|t| match *t {
            "null" => v.is_null(),
            "boolean" => v.is_boolean(),
            "integer" => v.as_i64().is_some() || v.as_u64().is_some(),
            "number" => v.is_number(),
            "string" => v.is_string(),
            "array" => v.is_array(),
            "object" => v.is_object(),
            _ => true,
        });
        if !ok {
            return Err(format!("{at}: {v} is not of type {types:?}"));
        }
    }
    if let (Some(obj), Some(props)) = (
        v.as_object(),
        s.get("properties").and_then(Value::as_object),
    ) {
        for (k, ps) in props {
            if let Some(x) = obj.get(k) {
                schema_check(x, ps, root, &format!("{at}.{k}"))?;
            }
        }
        for r in s
            .get("required")
            .and_then(Value::as_array)
            .into_iter()
            .flatten()
        {
            let k = r.as_str().unwrap_or_default();
            if !obj.contains_key(k) {
                return Err(format!("{at}: required {k} missing"));
            }
        }
    }
    if let (Some(arr), Some(items)) = (v.as_array(), s.get("items")) {
        for (i, x) in arr.iter().enumerate() {
            schema_check(x, items, root, &format!("{at}[{i}]"))?;
        }
    }
    Ok(())
}
