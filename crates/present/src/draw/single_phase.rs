//! A single-phase stator's terminal board on the connection sheet: the lead tables in
//! words (both rotations, both voltages of a two-section main) and, for a one-section
//! main, the circuit of the first table: the main winding across the line, the auxiliary
//! with its capacitor beside it.

use svg::node::element::{Circle, Group, Line, Rectangle};

use super::text::{self, Anchor, label, r};
use crate::output::num;
use crate::output::single_phase_report::board_sentence;
use crate::single_phase::SinglePhaseReport;

const SIZE: f64 = 2.6;
const LINE: f64 = 3.3;

/// A circuit wire: the page's rule at the drawing's line width.
fn wire(x1: f64, y1: f64, x2: f64, y2: f64) -> Line {
    super::page::rule(x1, y1, x2, y2, 0.35)
}

/// One winding of the circuit between its two terminals at `top` and `bottom` on the
/// vertical `x`: its box, its leads' marks and its name.
fn part(x: f64, top: f64, bottom: f64, leads: [&str; 2], name: &str) -> Group {
    Group::new()
        .add(
            Rectangle::new()
                .set("x", r(x - 3.0))
                .set("y", r(top + 2.0))
                .set("width", 6.0)
                .set("height", r(bottom - top - 4.0))
                .set("fill", "none")
                .set("stroke", "#000000")
                .set("stroke-width", 0.35),
        )
        .add(wire(x, top, x, top + 2.0))
        .add(wire(x, bottom - 2.0, x, bottom))
        .add(terminal(x, top))
        .add(terminal(x, bottom))
        .add(label(x + 2.0, top - 0.6, SIZE, Anchor::Start, leads[0]))
        .add(label(x + 2.0, bottom + 3.0, SIZE, Anchor::Start, leads[1]))
        .add(label(
            x + 4.0,
            (top + bottom) / 2.0 + 1.0,
            SIZE,
            Anchor::Start,
            name,
        ))
}

fn terminal(x: f64, y: f64) -> Circle {
    super::board::stud(x, y, 1.2, "#000000", 0.35)
}

/// The board and its words, `width` wide; returns the group and its height (mm).
pub fn board(sp: &SinglePhaseReport, width: f64) -> (Group, f64) {
    let mut g = Group::new().set("class", "terminal-board");
    let mut y = 6.6;
    let mut say = |g: Group, words: &str, class: &str| -> Group {
        let mut g = g;
        for l in text::wrap(words, SIZE, width) {
            g = g.add(label(0.0, y, SIZE, Anchor::Start, &l).set("class", class.to_string()));
            y += LINE;
        }
        g
    };
    g = say(
        g,
        "Single phase: the main winding across the line, the auxiliary with its capacitor in \
         series beside it (drawn below for the first table).",
        "headline",
    );
    for b in &sp.boards {
        g = say(g, &board_sentence(b), "lead-table");
    }
    if sp.boards.iter().any(|b| b.through_capacitor.is_some()) {
        g = say(
            g,
            crate::output::single_phase_report::CAPACITOR_CAUTION,
            "caution-note",
        );
    }
    let mut h = y;
    // The circuit of the first table, when the main is one section.
    if let Some(b) = sp
        .boards
        .first()
        .filter(|b| b.l1.len() == 2 && b.l2.len() == 2)
    {
        let top = y + 4.0;
        let bottom = top + 34.0;
        let (xm, xa, x_end) = (14.0, 40.0, 54.0);
        let mut c = Group::new().set("class", "circuit");
        c = c
            .add(wire(6.0, top, x_end, top))
            .add(wire(6.0, bottom, x_end, bottom))
            .add(label(0.0, top + 1.0, SIZE, Anchor::Start, "L1"))
            .add(label(0.0, bottom + 1.0, SIZE, Anchor::Start, "N"));
        // Main: its two leads on the two lines.
        c = c
            .add(wire(xm, top, xm, top + 7.0))
            .add(wire(xm, bottom - 7.0, xm, bottom))
            .add(part(
                xm,
                top + 7.0,
                bottom - 7.0,
                [&b.l1[0], &b.l2[0]],
                "main",
            ));
        // Auxiliary: its winding, then the capacitor down to the line.
        let (a_top, a_bot) = (top + 7.0, top + 21.0);
        let cap_y = bottom - 6.0;
        c = c
            .add(wire(xa, top, xa, a_top))
            .add(part(xa, a_top, a_bot, [&b.l1[1], &b.l2[1]], "aux"))
            .add(wire(xa, a_bot, xa, cap_y - 0.8))
            .add(wire(xa - 3.0, cap_y - 0.8, xa + 3.0, cap_y - 0.8).set("stroke-width", 0.6))
            .add(wire(xa - 3.0, cap_y + 0.8, xa + 3.0, cap_y + 0.8).set("stroke-width", 0.6))
            .add(wire(xa, cap_y + 0.8, xa, bottom));
        let farads = sp
            .capacitor
            .as_ref()
            .and_then(|c| c.run.as_ref().or(c.start.as_ref()))
            .map(|c| format!("C {} \u{b5}F", num(c.microfarads, 1)))
            .unwrap_or_else(|| "C".to_string());
        c = c.add(label(xa + 4.0, cap_y + 1.0, SIZE, Anchor::Start, &farads));
        g = g.add(c);
        h = bottom + 4.0;
    }
    (g, h)
}
