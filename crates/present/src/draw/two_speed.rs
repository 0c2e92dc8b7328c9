//! A pole-changing winding's connection, in place of a one-speed diagram: the halves of each
//! phase between the six leads inside the machine, and each speed's board (the supply lines
//! on their leads, the links, the leads left open), both drawn from the `speeds` report and
//! the model's six-lead rule, so the sheet, the card and `beltwright speeds` cannot disagree.
//!
//! Every half carries its leads and groups in `data-` attributes, and every board its lines,
//! links and open leads, so a test can rebuild the network from the sheet alone.

use svg::node::element::{Circle, Group, Rectangle};

use super::connections::lane_terminal;
use super::page::{Rect, rule};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use crate::design::PoleChange;
use crate::output::Words;
use crate::output::speeds_report;
use crate::speeds::{Duty, SpeedConnection, SpeedsError, SpeedsReport};
use crate::winding::pole_change::{self, Lead, six_leads_halves};
use crate::winding::schedule::{Lane, lanes};
use crate::winding::{CoilGroup, Winding};

/// Radius of the schematic (centre to an end lead), mm.
const RADIUS: f64 = 22.0;
/// Text size, mm.
const SIZE: f64 = 2.7;
/// Line pitch, mm.
const LINE: f64 = 4.2;
/// Board width and height, mm.
const BOARD_W: f64 = 62.0;
const BOARD_H: f64 = 46.0;
/// Narrowest width the drawing takes at printed size (the schematic and the boards one
/// above the other), mm.
pub const MIN_WIDTH: f64 = 2.0 * RADIUS + 22.0 + BOARD_W + 4.0;
/// Terminal pitch on a board, mm.
const PITCH: f64 = 16.0;

/// A lane's groups as the sheet numbers them, "G2 G4".
fn group_list(lane: &Lane) -> String {
    lane.groups
        .iter()
        .map(|i| format!("G{}", i + 1))
        .collect::<Vec<_>>()
        .join(" ")
}

/// A terminal circle with its marking.
fn terminal(x: f64, y: f64, name: &str, open: bool) -> Group {
    Group::new()
        .set("class", "speed-terminal")
        .set("data-lead", name)
        .add(
            super::board::stud(x, y, 1.8, "#000000", 0.5)
                .set("stroke-dasharray", if open { "0.8 0.6" } else { "none" }),
        )
        .add(label(x + 2.4, y - 1.4, SIZE, Anchor::Start, name))
}

/// One speed's board: the ends in the upper row, the taps in the lower, the lines fed from
/// above (ends) or below (taps), the links as a bar.
fn board(
    c: &SpeedConnection,
    heading: &[String],
    marking: crate::design::Marking,
    x: f64,
    y: f64,
) -> Group {
    let lines = c
        .lines
        .iter()
        .map(|l| format!("{}:{}", l.line, l.lead))
        .collect::<Vec<_>>()
        .join(" ");
    let mut g = Group::new()
        .set("class", "speed-board")
        .set("data-poles", c.poles)
        .set("data-lines", lines)
        .set("data-linked", c.joined.join(" "))
        .set("data-open", c.open.join(" "))
        .add(
            Rectangle::new()
                .set("x", r(x))
                .set("y", r(y))
                .set("width", BOARD_W)
                .set("height", BOARD_H)
                .set("fill", "none")
                .set("stroke", "#000000")
                .set("stroke-width", 0.7),
        );
    for (k, h) in heading.iter().enumerate() {
        g = g.add(label(
            x + 2.0,
            y + 4.0 + LINE * k as f64,
            SIZE,
            Anchor::Start,
            h,
        ));
    }
    let row_end = y + 22.0;
    let row_tap = y + 34.0;
    let col = |j: usize| x + 9.0 + PITCH * j as f64;
    // The block as the standards' tables read: the lower speed's line leads in the upper
    // row, the higher speed's in the lower, each in the order L1, L2, L3 take them.
    let rows = [
        (pole_change::LOW_SPEED.lines, row_end, true),
        (pole_change::HIGH_SPEED.lines, row_tap, false),
    ];
    let place = |name: &str| -> Option<(f64, f64, bool)> {
        rows.iter().find_map(|(leads, y, upper)| {
            (0..3)
                .find(|&j| leads[j].name(marking) == name)
                .map(|j| (col(j), *y, *upper))
        })
    };
    // Links first, under the terminals.
    let linked: Vec<(f64, f64, bool)> = c.joined.iter().filter_map(|n| place(n)).collect();
    if let (Some(a), Some(b)) = (linked.first(), linked.last()) {
        g = g.add(
            Rectangle::new()
                .set("class", "speed-link")
                .set("x", r(a.0.min(b.0) - 0.7))
                .set("y", r(a.1 - 0.7))
                .set("width", r((b.0 - a.0).abs() + 1.4))
                .set("height", 1.4)
                .set("fill", "#555555"),
        );
    }
    for (leads, ty, _) in &rows {
        for (j, lead) in leads.iter().enumerate() {
            let name = lead.name(marking);
            g = g.add(terminal(col(j), *ty, &name, c.open.contains(&name)));
        }
    }
    for l in &c.lines {
        if let Some((tx, ty, upper)) = place(&l.lead) {
            let (from, text_y) = if upper {
                (y + 13.0, y + 12.0)
            } else {
                (y + BOARD_H + 4.0, y + BOARD_H + 7.2)
            };
            g = g
                .add(rule(tx, from, tx, ty + if upper { -1.8 } else { 1.8 }, 0.6))
                .add(label(tx, text_y, SIZE, Anchor::Middle, &l.line));
        }
    }
    g
}

/// Where each lead of the schematic sits, mm from its centre: ends outside, taps between.
fn schematic_place(pc: PoleChange, lead: Lead, radius: f64) -> (f64, f64) {
    let corner = |p: usize| {
        // Ends at 90°, 330° and 210° (U at the top, going clockwise).
        let a = (90.0 - 120.0 * (p % 3) as f64).to_radians();
        (radius * a.cos(), -radius * a.sin())
    };
    match (pc, lead) {
        (_, Lead::End(p)) => corner(p),
        (PoleChange::DeltaDoubleStar, Lead::Tap(p)) => {
            let (a, b) = (corner(p), corner(p + 1));
            ((a.0 + b.0) / 2.0, (a.1 + b.1) / 2.0)
        }
        (PoleChange::StarDoubleStar, Lead::Tap(p)) => {
            let a = corner(p);
            (a.0 / 2.0, a.1 / 2.0)
        }
    }
}

/// The halves inside the machine between the six leads (and the star point in star): each
/// half's label beside its middle, the ends' markings outside, the taps' beside them.
fn schematic(
    w: &Winding,
    groups: &[CoilGroup],
    pc: PoleChange,
    pal: &Palette,
    cx: f64,
    cy: f64,
) -> Group {
    let marking = w.design.leads.marking;
    let mut g = Group::new().set("class", "speed-schematic");
    let at = |n: Option<Lead>| match n {
        Some(l) => schematic_place(pc, l, RADIUS),
        None => (0.0, 0.0),
    };
    let name = |n: Option<Lead>| n.map_or("star point".to_string(), |l| l.name(marking));
    // The side of a segment its half's label goes: away from the centre on a delta, one
    // turning sense on a star's arms (the taps' markings go on the other).
    let normal = |a: (f64, f64), b: (f64, f64)| {
        let (dx, dy) = (b.0 - a.0, b.1 - a.1);
        let len = dx.hypot(dy).max(1e-9);
        let n = (-dy / len, dx / len);
        let m = ((a.0 + b.0) / 2.0, (a.1 + b.1) / 2.0);
        match pc {
            PoleChange::DeltaDoubleStar if n.0 * m.0 + n.1 * m.1 < 0.0 => (-n.0, -n.1),
            _ => n,
        }
    };
    // The schedule's lanes are the same halves, in the same order.
    for ((p, reversed, from, to), lane) in six_leads_halves(pc).into_iter().zip(lanes(w, groups)) {
        let (a, b) = (at(from), at(to));
        let (mx, my) = ((a.0 + b.0) / 2.0, (a.1 + b.1) / 2.0);
        let n = normal(a, b);
        g = g.add(
            Group::new()
                .set("class", "half")
                .set("data-phase", w.label(p))
                .set("data-from", name(from))
                .set("data-to", name(to))
                .set("data-reversed", u8::from(reversed))
                .set("data-groups", group_list(&lane))
                .add(
                    rule(cx + a.0, cy + a.1, cx + b.0, cy + b.1, 1.1)
                        .set("stroke", pal.stroke(p))
                        .set("stroke-dasharray", pal.dash(p)),
                )
                .add(label(
                    cx + mx + 4.0 * n.0,
                    cy + my + 4.0 * n.1 + 1.0,
                    SIZE,
                    Anchor::Middle,
                    &format!("{}{}", w.label(p), if reversed { "-" } else { "+" }),
                )),
        );
    }
    for p in 0..3 {
        for lead in [Lead::end(p), Lead::tap(p)] {
            let (x, y) = at(Some(lead));
            g = g.add(
                Circle::new()
                    .set("cx", r(cx + x))
                    .set("cy", r(cy + y))
                    .set("r", 1.4)
                    .set("fill", "#FFFFFF")
                    .set("stroke", "#000000")
                    .set("stroke-width", 0.5),
            );
            let (dx, dy) = match (lead, pc) {
                // Ends, and a delta's taps: outward from the centre.
                (Lead::End(_), _) | (Lead::Tap(_), PoleChange::DeltaDoubleStar) => {
                    let len = x.hypot(y).max(1e-9);
                    (5.0 * x / len, 5.0 * y / len)
                }
                // A star's taps: on the side of the arm away from the halves' labels.
                (Lead::Tap(q), PoleChange::StarDoubleStar) => {
                    let n = normal(at(Some(Lead::end(q))), at(Some(Lead::tap(q))));
                    (-4.5 * n.0, -4.5 * n.1)
                }
            };
            g = g.add(label(
                cx + x + dx,
                cy + y + dy + 1.0,
                SIZE,
                Anchor::Middle,
                &lead.name(marking),
            ));
        }
    }
    if pc == PoleChange::StarDoubleStar {
        g = g.add(
            Circle::new()
                .set("cx", r(cx))
                .set("cy", r(cy))
                .set("r", 1.0)
                .set("fill", "#000000"),
        );
    }
    g
}

/// Whether the boards stand side by side (else one above the other) at `width`.
fn boards_beside(width: f64) -> bool {
    width >= 2.0 * RADIUS + 22.0 + 2.0 * BOARD_W + 8.0
}

/// Height of the boards' band, mm.
fn boards_height(width: f64) -> f64 {
    if boards_beside(width) {
        BOARD_H + 14.0
    } else {
        2.0 * (BOARD_H + 12.0) + 2.0
    }
}

/// The note on the direction of rotation the drawing carries.
#[derive(Clone, Copy)]
enum Rotation {
    /// Two lines are exchanged on the board of this many poles.
    Exchanged(usize),
    /// Both boards turn the field alike with L1, L2, L3 in order.
    InOrder,
}

/// The notes under the drawing, wrapped to `width`: each half from its tap, the rotation,
/// and the cautions of a two-speed board.
fn notes(w: &Winding, groups: &[CoilGroup], rotation: Rotation, width: f64) -> Vec<String> {
    let marking = w.design.leads.marking;
    let mut notes = Vec::new();
    for lane in lanes(w, groups) {
        let reversed = lane.reversed_half.unwrap_or(false);
        let through = if lane.groups.is_empty() {
            "no groups".to_string()
        } else {
            group_list(&lane)
        };
        notes.push(format!(
            "Half {}{}: from {} through {} to {}{}.",
            w.label(lane.phase),
            if reversed { "-" } else { "+" },
            lane_terminal(w, &lane, 1),
            through,
            lane_terminal(w, &lane, 2),
            if reversed {
                " (its current reverses between the speeds)"
            } else {
                ""
            },
        ));
    }
    notes.push(match rotation {
        Rotation::Exchanged(poles) => format!(
            "At {poles} poles two lines are exchanged on the board (as drawn) so that both \
             speeds turn the same way."
        ),
        Rotation::InOrder => "With L1, L2, L3 in order both boards turn the field the same \
                              way; to reverse it, exchange the same two lines at both speeds."
            .into(),
    });
    let ends: Vec<String> = (0..3).map(|p| Lead::end(p).name(marking)).collect();
    notes.push(format!(
        "Never link {} while the lines are on them: that shorts the supply. The speed switch \
         must break one board before it makes the other.",
        ends.join(", ")
    ));
    notes.push(
        "Leads left open are live while the motor runs: insulate each one apart from the \
         others and from earth."
            .into(),
    );
    notes
        .iter()
        .flat_map(|n| text::wrap(n, SIZE, width - 2.0))
        .collect()
}

/// Height the drawing needs at `width`, mm: the heading, the boards and the notes (with
/// whichever rotation note takes more lines).
pub fn height(w: &Winding, groups: &[CoilGroup], width: f64) -> f64 {
    let head = text::wrap(&heading(w), 3.1, width - 2.0).len() as f64 * LINE;
    let lines = [Rotation::Exchanged(2 * w.geometry.poles), Rotation::InOrder]
        .into_iter()
        .map(|r| notes(w, groups, r, width).len())
        .max()
        .unwrap_or(0);
    4.0 + head + boards_height(width) + lines as f64 * LINE
}

/// The drawing's first line.
fn heading(w: &Winding) -> String {
    let poles = w.geometry.poles;
    let kind = w.design.pole_change.map_or(String::new(), |pc| {
        format!(
            " ({}, {})",
            speeds_report::connection_words(pc),
            speeds_report::duty_words(Duty::of(pc))
        )
    });
    format!(
        "POLE-CHANGING WINDING, {} and {poles} poles{kind}: connect each speed only as drawn.",
        2 * poles
    )
}

/// The two-speed connection drawn in `at`.
pub fn connection(
    w: &Winding,
    groups: &[CoilGroup],
    report: Result<&SpeedsReport, &SpeedsError>,
    pal: &Palette,
    at: Rect,
) -> Group {
    let mut g = Group::new().set("class", "two-speed");
    let Some(pc) = w.design.pole_change else {
        return g;
    };
    let mut y = at.y + 4.0;
    for l in text::wrap(&heading(w), 3.1, at.w - 2.0) {
        g = g.add(label(at.x, y, 3.1, Anchor::Start, &l));
        y += LINE;
    }
    let report = match report {
        Ok(r) => r,
        Err(e) => {
            let why = format!("{}; neither speed's board is drawn", e.message());
            for l in text::wrap(&why, SIZE, at.w - 2.0) {
                g = g.add(label(at.x, y, SIZE, Anchor::Start, &l));
                y += LINE;
            }
            return g;
        }
    };
    let radius = RADIUS;
    let (cx, cy) = (at.x + radius + 8.0, y + radius + 6.0);
    g = g.add(schematic(w, groups, pc, pal, cx, cy));
    let marking = w.design.leads.marking;
    let speeds = [&report.low_speed, &report.high_speed];
    let beside = boards_beside(at.w);
    for (k, (c, s)) in report.connections.iter().zip(speeds).enumerate() {
        let name = if k == 0 {
            "LOWER SPEED"
        } else {
            "HIGHER SPEED"
        };
        let rpm = s.synchronous_rpm.map_or(String::new(), |n| {
            format!(", {} rpm sync.", crate::output::num(n, 0))
        });
        let heading = vec![
            format!("{name}: {} poles{rpm}", c.poles),
            speeds_report::joined(s.joined).to_string(),
        ];
        let (bx, by) = if beside {
            (
                at.x + 2.0 * radius + 22.0 + k as f64 * (BOARD_W + 8.0),
                y + 2.0,
            )
        } else {
            (
                at.x + 2.0 * radius + 22.0,
                y + 2.0 + k as f64 * (BOARD_H + 12.0),
            )
        };
        g = g.add(board(c, &heading, marking, bx, by));
    }
    y += boards_height(at.w);
    let rotation = match report.connections.iter().find(|c| c.lines_exchanged) {
        Some(c) => Rotation::Exchanged(c.poles),
        None => Rotation::InOrder,
    };
    for l in notes(w, groups, rotation, at.w) {
        g = g.add(label(at.x, y, SIZE, Anchor::Start, &l));
        y += LINE;
    }
    g
}
