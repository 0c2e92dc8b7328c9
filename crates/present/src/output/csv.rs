//! CSV presenter: the report's main table, written by the `csv` crate (RFC 4180 quoting
//! where needed), each cell first made safe for a spreadsheet (`sanitize::csv_cell`).

use super::{Exporter, Report};

/// Comma-separated values.
pub struct Csv;

impl Exporter for Csv {
    /// Row by row into `out`, through the csv writer's buffer.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        let t = report.main_table();
        let mut w = csv::WriterBuilder::new()
            .terminator(csv::Terminator::Any(b'\n'))
            .from_writer(out);
        for row in std::iter::once(&t.headers).chain(&t.rows) {
            w.write_record(
                row.iter()
                    .map(|c| crate::sanitize::csv_cell(c).into_owned()),
            )
            .map_err(std::io::Error::other)?;
        }
        w.flush()
    }
}

#[cfg(test)]
mod tests {
    use super::super::{Align, Report, Section, Table};

    struct One(Vec<&'static str>);

    impl Report for One {
        fn json(&self) -> impl serde::Serialize + '_ {}
        fn sections(&self) -> Vec<Section> {
            Vec::new()
        }
        fn main_table(&self) -> Table {
            let mut t = Table::new(&[("cell", Align::Left)]);
            for c in &self.0 {
                t.push(vec![c.to_string()]);
            }
            t
        }
    }

    // Quoting rule of RFC 4180 §2: fields holding a comma, a quote or a line break are
    // quoted, quotes doubled; others are written as they are.
    #[test]
    fn quotes_commas_and_quotes() {
        let report = One(vec!["a,b", "say \"hi\"", "plain"]);
        let text = super::super::render(&report, super::super::Format::Csv).expect("csv");
        assert_eq!(text, "cell\n\"a,b\"\n\"say \"\"hi\"\"\"\nplain\n");
    }
}
