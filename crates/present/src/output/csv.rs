//! CSV presenter: the report's main table, quoted where needed (RFC 4180).

use super::{Exporter, Report};

/// Comma-separated values.
pub struct Csv;

/// One cell, quoted where needed, appended to `out`.
fn push_field(out: &mut String, s: &str) {
    let s = crate::sanitize::csv_cell(s);
    if s.contains([',', '"', '\n', '\r']) {
        out.push('"');
        for part in s.split('"').enumerate() {
            if part.0 > 0 {
                out.push_str("\"\"");
            }
            out.push_str(part.1);
        }
        out.push('"');
    } else {
        out.push_str(&s);
    }
}

#[cfg(test)]
fn field(s: &str) -> String {
    let mut out = String::new();
    push_field(&mut out, s);
    out
}

impl Exporter for Csv {
    /// Row by row into `out`, through one line buffer.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        let t = report.main_table();
        let mut line = String::new();
        for row in std::iter::once(&t.headers).chain(&t.rows) {
            line.clear();
            for (i, c) in row.iter().enumerate() {
                if i > 0 {
                    line.push(',');
                }
                push_field(&mut line, c);
            }
            line.push('\n');
            out.write_all(line.as_bytes())?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    // Quoting rule of RFC 4180 §2.
    #[test]
    fn quotes_commas_and_quotes() {
        assert_eq!(super::field("a,b"), "\"a,b\"");
        assert_eq!(super::field("say \"hi\""), "\"say \"\"hi\"\"\"");
        assert_eq!(super::field("plain"), "plain");
    }
}
