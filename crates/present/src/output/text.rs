//! Text presenter: headings, lines and aligned tables.

use super::{Align, Exporter, Report, Section, Table};

/// Aligned text for a terminal.
pub struct Text;

impl Exporter for Text {
    /// Section by section into `out`: a line at a time, a table at a time.
    fn export<R: Report>(&self, report: &R, out: &mut dyn std::io::Write) -> std::io::Result<()> {
        for (i, s) in report.sections().iter().enumerate() {
            match s {
                Section::Heading(h) => {
                    if i > 0 {
                        out.write_all(b"\n")?;
                    }
                    // A long title makes a long heading: wrapped like a paragraph.
                    self::lines(std::slice::from_ref(h), 2, out)?;
                }
                Section::Lines(lines) | Section::Design(lines) | Section::Caution(lines) => {
                    self::lines(lines, 0, out)?;
                }
                Section::Items(items) => self::lines(items, super::ITEM_INDENT, out)?,
                Section::Table(t) => table(t, out)?,
            }
        }
        Ok(())
    }
}

/// Terminal columns a paragraph is wrapped to.
pub const COLUMNS: usize = 78;

/// Paragraphs for a terminal: each wrapped at [`COLUMNS`] on word boundaries (first fit,
/// no hyphenation, words longer than a line kept whole), its further lines indented by
/// `hang` columns, cleaned.
pub fn lines(
    paragraphs: &[String],
    hang: usize,
    out: &mut dyn std::io::Write,
) -> std::io::Result<()> {
    let indent = " ".repeat(hang);
    let options = textwrap::Options::new(COLUMNS)
        .subsequent_indent(&indent)
        .break_words(false)
        .word_splitter(textwrap::WordSplitter::NoHyphenation)
        .wrap_algorithm(textwrap::WrapAlgorithm::FirstFit);
    for p in paragraphs {
        let clean = crate::sanitize::clean(p);
        // textwrap gives an empty paragraph one empty line.
        for l in textwrap::wrap(&clean, &options) {
            writeln!(out, "{l}")?;
        }
    }
    Ok(())
}

/// Write a table with columns padded to their widest cell, two spaces apart, line by line
/// through one buffer; cells are cleaned for the terminal (no copy unless needed).
pub fn table(t: &Table, sink: &mut dyn std::io::Write) -> std::io::Result<()> {
    use crate::sanitize::clean;
    use std::borrow::Cow;
    let n = t.headers.len();
    let headers: Vec<Cow<str>> = t.headers.iter().map(|h| clean(h)).collect();
    let rows: Vec<Vec<Cow<str>>> = t
        .rows
        .iter()
        .map(|r| r.iter().map(|c| clean(c)).collect())
        .collect();
    let mut width: Vec<usize> = headers.iter().map(|h| h.chars().count()).collect();
    for row in &rows {
        for (w, cell) in width.iter_mut().zip(row) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let total: usize = width.iter().sum::<usize>() + 2 * n + 1;
    let mut out = String::with_capacity(total);
    let mut line = |cells: &mut dyn Iterator<Item = &str>| -> std::io::Result<()> {
        out.clear();
        for (j, cell) in cells.enumerate().take(n) {
            let pad = width[j].saturating_sub(cell.chars().count());
            if j > 0 {
                out.push_str("  ");
            }
            match t.align.get(j).copied().unwrap_or(Align::Left) {
                Align::Left => {
                    out.push_str(cell);
                    if j + 1 < n {
                        out.extend(std::iter::repeat_n(' ', pad));
                    }
                }
                Align::Right => {
                    out.extend(std::iter::repeat_n(' ', pad));
                    out.push_str(cell);
                }
            }
        }
        let trimmed = out.trim_end().len();
        out.truncate(trimmed);
        out.push('\n');
        sink.write_all(out.as_bytes())
    };
    line(&mut headers.iter().map(|h| h.as_ref()))?;
    let rule: Vec<String> = width.iter().map(|&w| "-".repeat(w)).collect();
    line(&mut rule.iter().map(String::as_str))?;
    for row in &rows {
        line(&mut row.iter().map(|c| c.as_ref()))?;
    }
    Ok(())
}
