//! Terminal boards of a three-phase winding, drawn from its lead scheme: one board per
//! connection the leads can be wired to (both voltages of a dual-voltage machine side by
//! side, the planned one marked), each showing every lead that goes to a supply line and
//! every group of leads joined together, with the ends joined inside the machine noted.
//!
//! The board is a picture of the scheme's own lists ([`crate::card::leads::Configuration`]),
//! so the sheet, the card and the text tables cannot disagree. Every tie carries its leads
//! in `data-leads` so a test can rebuild the network from the sheet alone.

use itertools::Itertools;
use svg::node::element::{Circle, Group, Rectangle};

use super::page::rule;
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use crate::card::leads::{Configuration, LeadScheme, Sections, Terminal};
use crate::winding::Connection;

/// Column pitch of the supply lines on a board, mm.
const COL: f64 = 14.0;
/// Row pitch of stacked terminals, mm.
const ROW: f64 = 5.5;
/// Pitch of terminals along a row of joined leads, mm.
const JOIN: f64 = 10.0;
/// Text size on the boards, mm.
const SIZE: f64 = 2.6;
/// Line pitch of text, mm.
const LINE: f64 = 3.4;
/// Gap between boards set side by side, mm.
const GAP: f64 = 6.0;

/// The configurations a sheet draws as boards: every one for 3, 6 and 9 leads; for 12 leads
/// the two (series and parallel) of the planned connection, which give the machine's two
/// voltages (the other two are listed in words).
pub fn drawn(scheme: &LeadScheme, planned: Connection) -> Vec<&Configuration> {
    scheme
        .configurations
        .iter()
        .filter(|c| scheme.count != 12 || c.connection == planned)
        .collect()
}

/// Words naming a configuration above the boards: "Parallel star (lower voltage), 230 V
/// line".
pub fn heading(c: &Configuration) -> String {
    let name = crate::output::configuration_name(c);
    let mut chars = name.chars();
    let how = chars
        .next()
        .map_or_else(String::new, |f| f.to_uppercase().chain(chars).collect());
    match c.line_voltage_v {
        Some(v) => format!("{how}, {} V line", crate::output::num(v, 0)),
        None => how,
    }
}

/// One sentence of what to do for a configuration: lines and joins.
pub fn sentence(c: &Configuration) -> String {
    let lines = (0..3)
        .map(|j| format!("L{} to {}", j + 1, c.lines[j].join("+")))
        .join(", ");
    if c.joined.is_empty() {
        format!("{lines}.")
    } else {
        format!(
            "{lines}; join {} and insulate.",
            c.joined.iter().map(|j| j.join("-")).join(", ")
        )
    }
}

/// Width of one board, mm.
fn board_width(c: &Configuration) -> f64 {
    let join = c.joined.iter().map(Vec::len).max().unwrap_or(0) as f64 * JOIN;
    (3.0 * COL).max(join) + 8.0
}

/// Height of one board's body (under its heading), mm.
fn body_height(c: &Configuration) -> f64 {
    let stack = c.lines.iter().map(Vec::len).max().unwrap_or(1) as f64;
    let joins = c.joined.len() as f64;
    let join_h = if joins > 0.0 {
        LINE + joins * ROW + 1.0
    } else {
        0.0
    };
    7.5 + stack * ROW + join_h + 2.0
}

/// Phase index (0..3) of a lead, for its colour.
fn phase_of(terminals: &[Terminal], labels: &[String], lead: &str) -> Option<usize> {
    let t = terminals.iter().find(|t| t.name == lead)?;
    labels.iter().position(|l| *l == t.phase)
}

/// A terminal stud or lead end as every sheet draws it: a white circle of `radius` outlined
/// in `stroke`, `width` wide (mm).
pub(crate) fn stud(x: f64, y: f64, radius: f64, stroke: &str, width: f64) -> Circle {
    Circle::new()
        .set("cx", r(x))
        .set("cy", r(y))
        .set("r", radius)
        .set("fill", "#FFFFFF")
        .set("stroke", stroke)
        .set("stroke-width", width)
}

/// A terminal: a circle with its marking to the right, above the centre line.
fn terminal(x: f64, y: f64, name: &str, stroke: &str) -> Group {
    Group::new()
        .set("class", "board-terminal")
        .set("data-lead", name)
        .add(stud(x, y, 1.6, stroke, 0.5))
        .add(label(x + 2.2, y - 1.3, SIZE, Anchor::Start, name))
}

/// A tie (bar) between terminal centres.
fn bar(x1: f64, y1: f64, x2: f64, y2: f64) -> Rectangle {
    let (x, y) = (x1.min(x2), y1.min(y2));
    let (w, h) = ((x2 - x1).abs(), (y2 - y1).abs());
    Rectangle::new()
        .set("class", "tie-bar")
        .set("x", r(x - 0.6))
        .set("y", r(y - 0.6))
        .set("width", r(w + 1.2))
        .set("height", r(h + 1.2))
        .set("fill", "#555555")
}

/// One board at (x, y): heading, supply columns, joined rows. Returns the group and height.
fn board(
    scheme: &LeadScheme,
    c: &Configuration,
    labels: &[String],
    pal: &Palette,
    x: f64,
    y: f64,
    width: f64,
) -> (Group, f64) {
    let how = crate::output::connection_words(c);
    let mut heading_lines = text::wrap(
        &c.line_voltage_v.map_or(how.clone(), |v| {
            format!("{} V line: {how}", crate::output::num(v, 0))
        }),
        SIZE,
        width - 3.0,
    );
    if c.as_planned {
        heading_lines.push("AS PLANNED".to_string());
    }
    let head_h = heading_lines.len() as f64 * LINE + 1.5;
    let body = body_height(c);
    let h = head_h + body;
    let mut g = Group::new()
        .set("class", "board")
        .set("data-planned", u8::from(c.as_planned))
        .set("data-connection", c.connection.to_string())
        .set(
            "data-sections",
            match c.sections {
                Sections::Single => "single",
                Sections::Series => "series",
                Sections::Parallel => "parallel",
            },
        );
    if let Some(v) = c.line_voltage_v {
        g = g.set("data-line-voltage", v);
    }
    g = g.add(
        Rectangle::new()
            .set("x", r(x))
            .set("y", r(y))
            .set("width", r(width))
            .set("height", r(h))
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", if c.as_planned { 0.9 } else { 0.3 })
            .set(
                "stroke-dasharray",
                if c.as_planned { "none" } else { "1.5 1" },
            ),
    );
    let mut ty = y + LINE;
    for l in &heading_lines {
        g = g.add(label(x + 1.5, ty, SIZE, Anchor::Start, l));
        ty += LINE;
    }
    let top = y + head_h;
    let colour = |lead: &str| {
        phase_of(&scheme.terminals, labels, lead)
            .map_or("#000000".to_string(), |k| pal.stroke(k).to_string())
    };
    // Supply columns: the line name, a feed down to the first terminal, a bar through all.
    for (j, leads) in c.lines.iter().enumerate() {
        let cx = x + 5.0 + j as f64 * COL;
        let y0 = top + 7.5;
        let mut col = Group::new()
            .set("class", "supply")
            .set("data-line", j + 1)
            .set("data-leads", leads.join(" "));
        col = col.add(label(
            cx,
            top + 1.6,
            SIZE,
            Anchor::Middle,
            &format!("L{}", j + 1),
        ));
        col = col.add(rule(cx, top + 2.4, cx, y0, 0.45));
        if leads.len() > 1 {
            col = col.add(bar(cx, y0, cx, y0 + (leads.len() - 1) as f64 * ROW));
        }
        for (i, lead) in leads.iter().enumerate() {
            col = col.add(terminal(cx, y0 + i as f64 * ROW, lead, &colour(lead)));
        }
        g = g.add(col);
    }
    let stack = c.lines.iter().map(Vec::len).max().unwrap_or(1) as f64;
    let mut jy = top + 7.5 + stack * ROW;
    if !c.joined.is_empty() {
        g = g.add(
            label(x + 1.5, jy + 0.4, SIZE, Anchor::Start, "Join and insulate:")
                .set("fill", "#333333"),
        );
        jy += LINE + 2.0;
        for leads in &c.joined {
            let mut row = Group::new()
                .set("class", "tie")
                .set("data-leads", leads.join(" "));
            let x0 = x + 5.0;
            if leads.len() > 1 {
                row = row.add(bar(x0, jy, x0 + (leads.len() - 1) as f64 * JOIN, jy));
            }
            for (i, lead) in leads.iter().enumerate() {
                row = row.add(terminal(x0 + i as f64 * JOIN, jy, lead, &colour(lead)));
            }
            g = g.add(row);
            jy += ROW;
        }
    }
    (g, h)
}

/// Width of the scheme's boards set side by side, mm.
pub fn natural_width(scheme: &LeadScheme, planned: Connection) -> f64 {
    let list = drawn(scheme, planned);
    list.iter().map(|c| board_width(c)).sum::<f64>() + GAP * (list.len().saturating_sub(1)) as f64
}

/// Every board of a scheme, side by side when `width` allows, else one under the other;
/// then the ends joined inside the machine. Returns the group and its height, mm.
pub fn boards(
    scheme: &LeadScheme,
    planned: Connection,
    labels: &[String],
    pal: &Palette,
    width: f64,
) -> (Group, f64) {
    let list = drawn(scheme, planned);
    let widths: Vec<f64> = list.iter().map(|c| board_width(c)).collect();
    let total: f64 = widths.iter().sum::<f64>() + GAP * (list.len().saturating_sub(1)) as f64;
    let side_by_side = total <= width;
    let mut g = Group::new().set("class", "terminal-boards");
    let (mut x, mut y, mut row_h) = (0.0, 0.0, 0.0f64);
    for (c, bw) in list.iter().zip(&widths) {
        let (b, h) = board(scheme, c, labels, pal, x, y, *bw);
        g = g.add(b);
        if side_by_side {
            x += bw + GAP;
            row_h = row_h.max(h);
        } else {
            y += h + 3.0;
        }
    }
    let mut height = if side_by_side { row_h } else { y - 3.0 };
    if !scheme.internal.is_empty() {
        let what = match planned {
            Connection::Star => "the star point, not brought out",
            Connection::Delta => "each phase's finish to the next phase's start",
        };
        let words = format!(
            "Joined inside the machine ({what}): {}.",
            scheme.internal.iter().map(|j| j.join("-")).join(", ")
        );
        let mut inside = Group::new().set("class", "inside");
        for (i, j) in scheme.internal.iter().enumerate() {
            inside = inside.add(
                Group::new()
                    .set("class", "inside-tie")
                    .set("data-index", i)
                    .set("data-leads", j.join(" ")),
            );
        }
        height += 2.0;
        for l in text::wrap(&words, SIZE, width) {
            height += LINE;
            inside = inside.add(label(0.0, height, SIZE, Anchor::Start, &l));
        }
        g = g.add(inside);
    }
    (g, height)
}
