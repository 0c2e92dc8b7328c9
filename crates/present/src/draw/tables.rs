//! A report's text sections set on sheets: headings, wrapped lines and ruled tables, over as
//! many pages as they need. Sheets made of figures and tables (the data card) are drawn from
//! the same sections the text presenter prints, so the two never say different things.

use svg::node::element::Group;

use super::page::{Canvas, Page, Rect, rule};
use super::text::{self, Anchor, label};
use super::title::TitleBlock;
use crate::output::{Align, Section, Table};

/// Body text height, mm: above the 2.5 mm of ISO 3098 lettering for drawings.
const BODY: f64 = 3.0;
/// Heading text height, mm.
const HEAD: f64 = 4.0;
/// Line pitch of body text, mm.
const LINE: f64 = 4.6;
/// Smallest text a table may shrink to, mm (ISO 3098 minimum on a drawing).
const MIN_TEXT: f64 = 2.5;

/// One laid-out item with its height.
enum Item {
    Heading(String),
    Line(String),
    Table(Table, f64),
}

/// An item laid out: is it a heading, its height, and its pieces (a page may break
/// between pieces) with their heights.
type Block = (bool, f64, Vec<(f64, Group)>);

/// Set `sections` on pages of `page` size with the winding's title block named `sheet`.
pub fn draw(
    s: &crate::study::Study,
    sheet: &str,
    sections: &[Section],
    page: &Page,
) -> Vec<String> {
    draw_under(&TitleBlock::of(s, sheet), sections, page)
}

/// Set `sections` on pages of `page` size under the title block `block` (its page numbers
/// set page by page).
pub fn draw_under(block: &TitleBlock, sections: &[Section], page: &Page) -> Vec<String> {
    let probe = Canvas::new(page, block);
    let area = probe.area;
    let items = layout(sections, area.w);
    // Fill pages top to bottom; a table too tall for a page is split between rows.
    let mut pages: Vec<Vec<(f64, Group)>> = vec![Vec::new()];
    let mut y = 0.0;
    let blocks: Vec<Block> = items
        .into_iter()
        .map(|item| match item {
            Item::Heading(s) => (true, HEAD + 3.0, vec![(HEAD + 3.0, heading(&s, area.w))]),
            Item::Line(s) => (false, LINE, vec![(LINE, line(&s))]),
            Item::Table(t, size) => {
                let rows = table_rows(&t, size, area.w);
                (false, rows.iter().map(|r| r.0).sum(), rows)
            }
        })
        .collect();
    // A heading stays on the page of what follows it: the whole table when it fits a page
    // (it moves whole), else its header and first row.
    let lead: Vec<f64> = (0..blocks.len())
        .map(|i| match blocks.get(i + 1) {
            Some((false, h, _)) if *h <= area.h => *h,
            Some((false, _, parts)) => parts.iter().take(2).map(|p| p.0).sum(),
            _ => 0.0,
        })
        .collect();
    for (i, (is_heading, h, mut parts)) in blocks.into_iter().enumerate() {
        let keep = if is_heading { h + lead[i] } else { h };
        if y + keep > area.h && keep <= area.h && y > 0.0 {
            pages.push(Vec::new());
            y = 0.0;
        }
        for (ph, g) in parts.drain(..) {
            if y + ph > area.h && y > 0.0 {
                pages.push(Vec::new());
                y = 0.0;
            }
            if let Some(p) = pages.last_mut() {
                p.push((y, g));
            }
            y += ph;
        }
    }
    let n = pages.len();
    pages
        .into_iter()
        .enumerate()
        .map(|(i, items)| {
            let mut block = block.clone();
            block.page = (i + 1, n);
            let mut c = Canvas::new(page, &block);
            let a: Rect = c.area;
            for (y, g) in items {
                c.add(
                    Group::new()
                        .set(
                            "transform",
                            format!("translate({} {})", text::r(a.x), text::r(a.y + y)),
                        )
                        .add(g),
                );
            }
            c.finish()
        })
        .collect()
}

fn layout(sections: &[Section], width: f64) -> Vec<Item> {
    let mut items = Vec::new();
    for s in sections {
        match s {
            Section::Heading(h) => items.push(Item::Heading(h.clone())),
            // The title block carries the design and the caution on every page.
            Section::Design(_) | Section::Caution(_) => {}
            Section::Lines(lines) | Section::Items(lines) => {
                for l in lines {
                    for part in text::wrap(l, BODY, width) {
                        items.push(Item::Line(part));
                    }
                }
            }
            Section::Table(t) => {
                let mut size = BODY;
                while natural_width(t, size) > width && size > MIN_TEXT {
                    size = (size - 0.1).max(MIN_TEXT);
                }
                items.push(Item::Table(t.clone(), size));
            }
        }
    }
    items
}

fn heading(s: &str, width: f64) -> Group {
    Group::new()
        .set("class", "heading")
        .add(label(
            0.0,
            HEAD + 0.8,
            HEAD,
            Anchor::Start,
            &text::fit(s, HEAD, width),
        ))
        .add(rule(0.0, HEAD + 2.0, width, HEAD + 2.0, 0.3))
}

fn line(s: &str) -> Group {
    Group::new()
        .set("class", "text-line")
        .add(label(0.0, BODY + 0.4, BODY, Anchor::Start, s))
}

const GAP: f64 = 4.0;

fn column_widths(t: &Table, size: f64) -> Vec<f64> {
    let mut widths: Vec<f64> = t.headers.iter().map(|h| text::width(h, size)).collect();
    for row in &t.rows {
        for (w, c) in widths.iter_mut().zip(row) {
            *w = w.max(text::width(c, size));
        }
    }
    widths
}

fn natural_width(t: &Table, size: f64) -> f64 {
    let w = column_widths(t, size);
    w.iter().sum::<f64>() + GAP * w.len().saturating_sub(1) as f64
}

/// The header row and each body row as separate pieces, so a page break falls between rows.
fn table_rows(t: &Table, size: f64, width: f64) -> Vec<(f64, Group)> {
    let mut widths = column_widths(t, size);
    // Still too wide at the smallest size: narrow the widest columns and cut their cells.
    let total = natural_width(t, size);
    if total > width {
        let excess = total - width;
        let wide: f64 = widths.iter().filter(|w| **w > 30.0).sum();
        if wide > 0.0 {
            for w in widths.iter_mut().filter(|w| **w > 30.0) {
                *w -= excess * *w / wide;
            }
        }
    }
    let pitch = size * 1.55;
    // One typeface throughout (no bold): a second face would make the PDF's font
    // resources come out in a different order from run to run.
    let row = |cells: &[String], class: &str| {
        let mut g = Group::new().set("class", class.to_string());
        let mut x = 0.0;
        for (j, (c, cw)) in cells.iter().zip(&widths).enumerate() {
            let right = t.align.get(j).copied() == Some(Align::Right);
            let s = text::fit(c, size, *cw);
            let node = if right {
                label(x + cw, size + 0.3, size, Anchor::End, &s)
            } else {
                label(x, size + 0.3, size, Anchor::Start, &s)
            };
            g = g.add(node);
            x += cw + GAP;
        }
        g
    };
    let span = natural_width(t, size).min(width);
    let mut out = vec![(
        pitch + 0.8,
        row(&t.headers, "table-head").add(rule(0.0, pitch, span, pitch, 0.3)),
    )];
    for r in &t.rows {
        out.push((pitch, row(r, "table-row")));
    }
    if let Some(last) = out.last_mut() {
        last.0 += 2.0;
    }
    out
}
