//! Text presenter: headings, lines and aligned tables.

use super::{Align, Exporter, Report, Section, Table};

/// Aligned text for a terminal.
pub struct Text;

impl Exporter for Text {
    fn export<R: Report>(&self, report: &R) -> Result<String, serde_json::Error> {
        let mut out = String::new();
        for (i, s) in report.sections().iter().enumerate() {
            match s {
                Section::Heading(h) => {
                    if i > 0 {
                        out.push('\n');
                    }
                    out.push_str(h);
                    out.push('\n');
                }
                Section::Lines(lines) => {
                    for l in lines {
                        out.push_str(l);
                        out.push('\n');
                    }
                }
                Section::Table(t) => out.push_str(&table(t)),
            }
        }
        Ok(out)
    }
}

/// Render a table with columns padded to their widest cell, two spaces apart.
pub fn table(t: &Table) -> String {
    let n = t.headers.len();
    let mut width: Vec<usize> = t.headers.iter().map(|h| h.chars().count()).collect();
    for row in &t.rows {
        for (w, cell) in width.iter_mut().zip(row) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let line = |cells: &[String]| {
        let mut s = String::new();
        for (j, cell) in cells.iter().enumerate().take(n) {
            let pad = width[j].saturating_sub(cell.chars().count());
            if j > 0 {
                s.push_str("  ");
            }
            match t.align.get(j).copied().unwrap_or(Align::Left) {
                Align::Left => {
                    s.push_str(cell);
                    if j + 1 < n {
                        s.push_str(&" ".repeat(pad));
                    }
                }
                Align::Right => {
                    s.push_str(&" ".repeat(pad));
                    s.push_str(cell);
                }
            }
        }
        s.trim_end().to_string() + "\n"
    };
    let mut out = line(&t.headers);
    let rule: Vec<String> = width.iter().map(|&w| "-".repeat(w)).collect();
    out.push_str(&line(&rule));
    for row in &t.rows {
        out.push_str(&line(row));
    }
    out
}
