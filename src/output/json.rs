//! JSON presenter: the report struct as one pretty-printed object.

use super::{Exporter, Report};

/// One JSON object on stdout.
pub struct Json;

impl Exporter for Json {
    fn export<R: Report>(&self, report: &R) -> Result<String, serde_json::Error> {
        let mut s = serde_json::to_string_pretty(report)?;
        s.push('\n');
        Ok(s)
    }
}
