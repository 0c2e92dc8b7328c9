//! The slot-section sheet: the fullest slot drawn to scale, with its liner, wedge, layer
//! separator and every wire at its diameter over the enamel, coloured by phase; beside it the
//! wire, the fill and the core's loadings. Drawn when the slot's width and depth are known.
//!
//! The slot is parallel-sided or widens behind parallel-sided teeth (`iron`); the wires lie
//! where the study's packing rule (`packing`, which the sizing holds a wire to) lays them.
//! It shows whether the count fits and how; the fill figure is the card's.

use svg::node::element::{Circle, Group, Line, Polygon};

use super::page::{Canvas, Page, Rect};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::iron::{LINER, WEDGE};
use crate::output::num;
use crate::units::Length;

/// Body text height, mm.
const BODY: f64 = 3.0;
/// Line pitch, mm.
const LINE: f64 = 4.6;

/// Whether the winding's slot can be drawn (its width and depth are known).
pub fn applies(s: &crate::study::Study) -> bool {
    s.slot_packing().is_some()
}

/// Draw the sheet; without a slot size it says what is missing.
pub fn draw(s: &crate::study::Study, page: &Page) -> String {
    let w = s.winding();
    let mut c = Canvas::new(page, &TitleBlock::of(s, "Slot section"));
    let a = c.area;
    let Some(sp) = s.slot_packing() else {
        c.add(Group::new().set("class", "not-available").add(label(
            a.x,
            a.y + 6.0,
            3.5,
            Anchor::Start,
            "No slot section: give core.slot_width_mm or core.tooth_width_mm, and \
             core.slot_depth_mm.",
        )));
        return c.finish();
    };
    let pal = Palette::new(w.geometry.phases, w.labels.colours.as_deref());
    let card = s.card();
    let (o, slot, sides) = (sp.outline, sp.slot, &sp.sides);
    let wire = card.wire.as_ref();
    let d_over = wire.map(|x| x.insulated_diameter.m());
    let (liner, wedge) = (LINER.m(), WEDGE.m());
    // The outline is in metres; the sheet writes millimetres.
    let mm = |m: f64| Length::from_m(m).mm();

    // Scale: the largest of 50, 20, 10, 5, 2, 1 : 1 that fits the slot in the left part.
    let left = Rect {
        w: a.w * 0.5,
        h: a.h - 14.0,
        ..a
    };
    let widest = mm(o.top.max(o.bottom));
    let depth_mm = mm(o.depth);
    let scale = [50.0, 20.0, 10.0, 5.0, 2.0, 1.0]
        .into_iter()
        .find(|k| depth_mm * k <= left.h * 0.85 && widest * k <= left.w * 0.6)
        .unwrap_or(1.0);
    let k = scale * mm(1.0); // paper mm per metre
    let cx = left.x + left.w / 2.0;
    let y0 = left.y + 10.0;
    let px = |x: f64| cx + x * k;
    let py = |y: f64| y0 + y * k;

    let mut g = Group::new().set("class", "slot-section");
    // Slot outline: tooth tips at the gap with the opening, then the sides to the bottom.
    let pts = [
        (-o.opening / 2.0, 0.0),
        (-o.top / 2.0, 0.0),
        (-o.bottom / 2.0, o.depth),
        (o.bottom / 2.0, o.depth),
        (o.top / 2.0, 0.0),
        (o.opening / 2.0, 0.0),
    ];
    let points = pts
        .iter()
        .map(|(x, y)| format!("{},{}", r(px(*x)), r(py(*y))))
        .collect::<Vec<_>>()
        .join(" ");
    g = g.add(
        svg::node::element::Polyline::new()
            .set("points", points)
            .set("fill", "none")
            .set("stroke", "#000")
            .set("stroke-width", 0.5),
    );
    // Liner (inside the sides and bottom) and the wedge line under the mouth.
    let width_at = |y: f64| o.width_at(y);
    let liner_outline = [
        (-width_at(wedge) / 2.0 + liner, wedge),
        (-o.bottom / 2.0 + liner, o.depth - liner),
        (o.bottom / 2.0 - liner, o.depth - liner),
        (width_at(wedge) / 2.0 - liner, wedge),
    ];
    g = g.add(
        Polygon::new()
            .set(
                "points",
                liner_outline
                    .iter()
                    .map(|(x, y)| format!("{},{}", r(px(*x)), r(py(*y))))
                    .collect::<Vec<_>>()
                    .join(" "),
            )
            .set("fill", "none")
            .set("stroke", "#000")
            .set("stroke-width", 0.25)
            .set("stroke-dasharray", "1.5 0.8"),
    );

    // Wires, bottom layer first, where the packing rule lays them.
    let total: u64 = sp.wires.iter().sum();
    let mut drawn = 0u64;
    if let (Some(dw), Some(p)) = (d_over, &sp.laid) {
        for y in &p.separators {
            g = g.add(
                Line::new()
                    .set("x1", r(px(-width_at(*y) / 2.0 + liner)))
                    .set("x2", r(px(width_at(*y) / 2.0 - liner)))
                    .set("y1", r(py(*y)))
                    .set("y2", r(py(*y)))
                    .set("stroke", "#000")
                    .set("stroke-width", 0.35)
                    .set("class", "separator"),
            );
        }
        for l in &p.laid {
            let phase = sides[l.side].0;
            g = g.add(
                Circle::new()
                    .set("cx", r(px(l.x)))
                    .set("cy", r(py(l.y)))
                    .set("r", r(dw / 2.0 * k * 0.96))
                    .set("fill", pal.tint(phase))
                    .set("stroke", pal.stroke(phase))
                    .set("stroke-width", 0.2)
                    .set("class", "wire")
                    .set("data-phase", w.label(phase)),
            );
        }
        drawn = p.laid.len() as u64;
    }

    // Dimensions under the slot.
    let mut lines = vec![
        format!(
            "slot {} (scale {}:1): width {} mm at the gap, {} mm at the bottom, depth {} mm, \
             opening {} mm",
            slot + 1,
            num(scale, 0),
            num(mm(o.top), 2),
            num(mm(o.bottom), 2),
            num(mm(o.depth), 2),
            num(mm(o.opening), 2)
        ),
        format!(
            "dashed: liner {} mm, {} mm at the mouth for tips and wedge",
            num(LINER.mm(), 1),
            num(WEDGE.mm(), 1)
        ),
    ];
    if let Some(t) = w.design.core.tooth_width {
        lines.push(format!("tooth {} mm at its narrowest", num(t.mm(), 2)));
    }
    let mut yl = py(o.depth) + 8.0;
    for l in &lines {
        for piece in text::wrap(l, BODY, left.w) {
            g = g.add(label(left.x, yl, BODY, Anchor::Start, &piece));
            yl += LINE;
        }
    }
    c.add(g);

    // The right part: wire, fill, coil sides and the core's loadings.
    let right = Rect {
        x: a.x + a.w * 0.52,
        w: a.w * 0.48,
        ..a
    };
    let laid = d_over.map(|_| drawn);
    c.add(notes(s, sides, total, laid, right));
    c.finish()
}

/// The sheet's right part: the wire, the coil sides, the fill, whether every wire went in
/// (`laid`: how many did, when the wire is known) and the core's loadings.
fn notes(
    s: &crate::study::Study,
    sides: &[(usize, u32)],
    total: u64,
    laid: Option<u64>,
    right: Rect,
) -> Group {
    let (w, card) = (s.winding(), s.card());
    let wire = card.wire.as_ref();
    let mut t = Vec::new();
    match wire {
        Some(x) => t.push(format!(
            "wire: {} × {} mm bare, {} mm over the enamel ({})",
            x.strands_in_hand,
            num(x.diameter.mm(), 3),
            num(x.insulated_diameter.mm(), 3),
            x.insulation
        )),
        None => t.push("wire: not given, so no wires are drawn".into()),
    }
    let sides_words: Vec<String> = sides
        .iter()
        .map(|(p, n)| format!("{} turns of {}", n, w.label(*p)))
        .collect();
    t.push(format!(
        "coil sides, bottom to top: {} ({} wires)",
        sides_words.join(", "),
        total
    ));
    if let (Some(f), Some(area)) = (card.slot_fill, w.design.slot_area) {
        t.push(format!(
            "fill by insulated wire {} % of the usable {} mm² (limit {} %)",
            num(f * 100.0, 1),
            num(area.mm2(), 1),
            num(crate::card::FILL_LIMIT * 100.0, 0)
        ));
    }
    if let Some(drawn) = laid.filter(|d| *d < total) {
        t.push(format!(
            "only {drawn} of {total} wires fit as drawn in close rows: the coils will not go \
             in as planned"
        ));
    }
    let mut g = Group::new().set("class", "section-notes");
    let mut y = right.y + 6.0;
    for l in &t {
        for piece in text::wrap(l, BODY, right.w) {
            g = g.add(label(right.x, y, BODY, Anchor::Start, &piece));
            y += LINE;
        }
    }
    if let Some(l) = &card.loading {
        y += 2.0;
        g = g.add(label(right.x, y, 3.5, Anchor::Start, "Core loadings"));
        y += LINE + 0.5;
        let table = crate::output::loading_table(l);
        for row in &table.rows {
            let cells = [
                (row[0].as_str(), 0.0, Anchor::Start),
                (row[1].as_str(), 0.72, Anchor::End),
                (row[2].as_str(), 0.9, Anchor::End),
                (row[3].as_str(), 0.92, Anchor::Start),
            ];
            for (text, at, anchor) in cells {
                g = g.add(label(right.x + at * right.w, y, BODY, anchor, text));
            }
            y += LINE;
        }
    }
    g
}
