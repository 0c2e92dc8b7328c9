//! A small JSON Schema validator for what schemars writes, shared by the tests and the
//! `pipeline` fuzz target (which includes this file by path).

use serde_json::Value;

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
