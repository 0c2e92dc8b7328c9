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
    fn export<R: Report>(&self, report: &R) -> Result<String, serde_json::Error> {
        let t = report.main_table();
        // One buffer for the whole file (about eight bytes a cell to start with).
        let mut out = String::with_capacity(8 * t.headers.len() * (t.rows.len() + 1));
        for row in std::iter::once(&t.headers).chain(&t.rows) {
            for (i, c) in row.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                push_field(&mut out, c);
            }
            out.push('\n');
        }
        Ok(out)
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
