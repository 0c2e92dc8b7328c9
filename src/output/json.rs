//! JSON presenter: the report struct as one pretty-printed object.

use super::{Exporter, Report};

/// One JSON object on stdout.
pub struct Json;

impl Exporter for Json {
    /// Streamed: serde writes the object into `out` as it walks the report.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        serde_json::to_writer_pretty(&mut *out, report)?;
        out.write_all(b"\n")
    }
}
