//! CSV presenter: the report's main table, quoted where needed (RFC 4180).

use super::{Exporter, Report};

/// Comma-separated values.
pub struct Csv;

fn field(s: &str) -> String {
    let s = crate::sanitize::csv_cell(s);
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

impl Exporter for Csv {
    fn export<R: Report>(&self, report: &R) -> Result<String, serde_json::Error> {
        let t = report.main_table();
        let mut out = String::new();
        for row in std::iter::once(&t.headers).chain(&t.rows) {
            let cells: Vec<String> = row.iter().map(|c| field(c)).collect();
            out.push_str(&cells.join(","));
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
