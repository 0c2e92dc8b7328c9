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

fn wire(x1: f64, y1: f64, x2: f64, y2: f64) -> Line {
    Line::new()
        .set("x1", r(x1))
        .set("y1", r(y1))
        .set("x2", r(x2))
        .set("y2", r(y2))
        .set("stroke", "#000000")
        .set("stroke-width", 0.35)
}

fn terminal(x: f64, y: f64) -> Circle {
    Circle::new()
        .set("cx", r(x))
        .set("cy", r(y))
        .set("r", 1.2)
        .set("fill", "#FFFFFF")
        .set("stroke", "#000000")
        .set("stroke-width", 0.35)
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
        let (m_top, m_bot) = (top + 7.0, bottom - 7.0);
        c = c
            .add(wire(xm, top, xm, m_top))
            .add(wire(xm, m_bot, xm, bottom))
            .add(
                Rectangle::new()
                    .set("x", r(xm - 3.0))
                    .set("y", r(m_top + 2.0))
                    .set("width", 6.0)
                    .set("height", r(m_bot - m_top - 4.0))
                    .set("fill", "none")
                    .set("stroke", "#000000")
                    .set("stroke-width", 0.35),
            )
            .add(wire(xm, m_top, xm, m_top + 2.0))
            .add(wire(xm, m_bot - 2.0, xm, m_bot))
            .add(terminal(xm, m_top))
            .add(terminal(xm, m_bot))
            .add(label(xm + 2.0, m_top - 0.6, SIZE, Anchor::Start, &b.l1[0]))
            .add(label(xm + 2.0, m_bot + 3.0, SIZE, Anchor::Start, &b.l2[0]))
            .add(label(
                xm + 4.0,
                (m_top + m_bot) / 2.0 + 1.0,
                SIZE,
                Anchor::Start,
                "main",
            ));
        // Auxiliary: its winding, then the capacitor down to the line.
        let (a_top, a_bot) = (top + 7.0, top + 21.0);
        let cap_y = bottom - 6.0;
        c = c
            .add(wire(xa, top, xa, a_top))
            .add(
                Rectangle::new()
                    .set("x", r(xa - 3.0))
                    .set("y", r(a_top + 2.0))
                    .set("width", 6.0)
                    .set("height", r(a_bot - a_top - 4.0))
                    .set("fill", "none")
                    .set("stroke", "#000000")
                    .set("stroke-width", 0.35),
            )
            .add(wire(xa, a_top, xa, a_top + 2.0))
            .add(wire(xa, a_bot - 2.0, xa, a_bot))
            .add(terminal(xa, a_top))
            .add(terminal(xa, a_bot))
            .add(label(xa + 2.0, a_top - 0.6, SIZE, Anchor::Start, &b.l1[1]))
            .add(label(xa + 2.0, a_bot + 3.0, SIZE, Anchor::Start, &b.l2[1]))
            .add(label(
                xa + 4.0,
                (a_top + a_bot) / 2.0 + 1.0,
                SIZE,
                Anchor::Start,
                "aux",
            ))
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
