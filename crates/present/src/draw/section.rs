//! The slot-section sheet: the fullest slot drawn to scale, with its liner, wedge, layer
//! separator and every wire at its diameter over the enamel, coloured by phase; beside it the
//! wire, the fill and the core's loadings. Drawn when the slot's width and depth are known.
//!
//! The slot is parallel-sided or widens behind parallel-sided teeth (`iron`); wires are laid
//! from the bottom in the densest (hexagonal) rows that fit between the liners, a way a
//! winder can reach with random-wound coils. It shows whether the count fits and how; the
//! fill figure is the card's.

use svg::node::element::{Circle, Group, Line, Polygon};

use super::page::{Canvas, Page, Rect};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::iron::{LINER_M, WEDGE_M};
use crate::output::num;
use crate::winding::Winding;

/// Body text height, mm.
const BODY: f64 = 3.0;
/// Line pitch, mm.
const LINE: f64 = 4.6;

/// The slot's outline, metres: width at the gap, at the bottom, depth, opening.
#[derive(Debug, Clone, Copy)]
struct Outline {
    top: f64,
    bottom: f64,
    depth: f64,
    opening: f64,
}

fn outline(w: &Winding) -> Option<Outline> {
    let c = &w.design.core;
    let top = c.slot_width_m?;
    Some(Outline {
        top,
        bottom: c.slot_bottom_width_m.unwrap_or(top),
        depth: c.slot_depth_m?,
        opening: w.design.slot_opening_m.unwrap_or(top).min(top),
    })
}

/// Whether the winding's slot can be drawn (its width and depth are known).
pub fn applies(s: &crate::study::Study) -> bool {
    outline(s.winding()).is_some()
}

/// The coil sides of the fullest slot, bottom layer first: (phase, turns) each.
fn fullest(w: &Winding) -> (usize, Vec<(usize, u32)>) {
    let mut sides: Vec<Vec<(usize, usize, u32)>> = vec![Vec::new(); w.geometry.slots];
    for c in &w.coils {
        sides[c.go].push((c.go_layer, c.phase, c.turns));
        sides[c.back].push((c.back_layer, c.phase, c.turns));
    }
    let (slot, list) = sides
        .into_iter()
        .enumerate()
        .max_by_key(|(k, l)| (l.iter().map(|x| x.2).sum::<u32>(), std::cmp::Reverse(*k)))
        .unwrap_or((0, Vec::new()));
    let mut list = list;
    // Layer 1 is the bottom (away from the gap): laid first.
    list.sort_by_key(|x| std::cmp::Reverse(x.0));
    (slot, list.into_iter().map(|x| (x.1, x.2)).collect())
}

/// Draw the sheet; without a slot size it says what is missing.
pub fn draw(s: &crate::study::Study, page: &Page) -> String {
    let w = s.winding();
    let mut c = Canvas::new(page, &TitleBlock::of(s, "Slot section"));
    let a = c.area;
    let Some(o) = outline(w) else {
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
    let (slot, sides) = fullest(w);
    let wire = card.wire.as_ref();
    let strands = wire.map_or(1, |x| x.strands_in_hand);
    let d_over = wire.map(|x| x.insulated_diameter_mm * 1e-3);

    // Scale: the largest of 50, 20, 10, 5, 2, 1 : 1 that fits the slot in the left part.
    let left = Rect {
        w: a.w * 0.5,
        h: a.h - 14.0,
        ..a
    };
    let widest = o.top.max(o.bottom) * 1e3;
    let depth_mm = o.depth * 1e3;
    let scale = [50.0, 20.0, 10.0, 5.0, 2.0, 1.0]
        .into_iter()
        .find(|k| depth_mm * k <= left.h * 0.85 && widest * k <= left.w * 0.6)
        .unwrap_or(1.0);
    let k = scale * 1e3; // paper mm per metre
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
    let width_at = |y: f64| o.top + (o.bottom - o.top) * (y / o.depth);
    let liner = [
        (-width_at(WEDGE_M) / 2.0 + LINER_M, WEDGE_M),
        (-o.bottom / 2.0 + LINER_M, o.depth - LINER_M),
        (o.bottom / 2.0 - LINER_M, o.depth - LINER_M),
        (width_at(WEDGE_M) / 2.0 - LINER_M, WEDGE_M),
    ];
    g = g.add(
        Polygon::new()
            .set(
                "points",
                liner
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

    // Wires, bottom layer first, in hexagonal rows between the liners.
    let needed: Vec<(usize, u64)> = sides
        .iter()
        .map(|(p, t)| (*p, *t as u64 * strands as u64))
        .collect();
    let total: u64 = needed.iter().map(|x| x.1).sum();
    let mut drawn = 0u64;
    if let Some(dw) = d_over {
        let mut y = o.depth - LINER_M - dw / 2.0;
        let mut row = 0usize;
        // Wires as (coil side, phase), side by side from the bottom.
        let mut queue = needed
            .iter()
            .enumerate()
            .flat_map(|(i, (p, n))| (0..*n).map(move |_| (i, *p)));
        let mut current = None;
        let mut last_side = None;
        'rows: while y - dw / 2.0 >= WEDGE_M {
            let half = width_at(y) / 2.0 - LINER_M - dw / 2.0;
            let shift = if row % 2 == 1 { dw / 2.0 } else { 0.0 };
            let mut x = -half + shift;
            while x <= half + 1e-12 {
                let Some((side, p)) = current.take().or_else(|| queue.next()) else {
                    break 'rows;
                };
                // The next coil side starts on a fresh row, over a separator.
                if last_side.is_some_and(|q| q != side) && x > -half + shift + 1e-12 {
                    current = Some((side, p));
                    break;
                }
                if last_side.is_some_and(|q| q != side) {
                    g = g.add(
                        Line::new()
                            .set("x1", r(px(-width_at(y) / 2.0 + LINER_M)))
                            .set("x2", r(px(width_at(y) / 2.0 - LINER_M)))
                            .set("y1", r(py(y + dw * 0.55)))
                            .set("y2", r(py(y + dw * 0.55)))
                            .set("stroke", "#000")
                            .set("stroke-width", 0.35)
                            .set("class", "separator"),
                    );
                }
                last_side = Some(side);
                g = g.add(
                    Circle::new()
                        .set("cx", r(px(x)))
                        .set("cy", r(py(y)))
                        .set("r", r(dw / 2.0 * k * 0.96))
                        .set("fill", pal.tint(p))
                        .set("stroke", pal.stroke(p))
                        .set("stroke-width", 0.2)
                        .set("class", "wire")
                        .set("data-phase", w.label(p)),
                );
                drawn += 1;
                x += dw;
            }
            y -= dw * 3f64.sqrt() / 2.0;
            row += 1;
        }
    }

    // Dimensions under the slot.
    let mut lines = vec![
        format!(
            "slot {} (scale {}:1): width {} mm at the gap, {} mm at the bottom, depth {} mm, \
             opening {} mm",
            slot + 1,
            num(scale, 0),
            num(o.top * 1e3, 2),
            num(o.bottom * 1e3, 2),
            num(o.depth * 1e3, 2),
            num(o.opening * 1e3, 2)
        ),
        format!(
            "dashed: liner {} mm, {} mm at the mouth for tips and wedge",
            num(LINER_M * 1e3, 1),
            num(WEDGE_M * 1e3, 1)
        ),
    ];
    if let Some(t) = w.design.core.tooth_width_m {
        lines.push(format!("tooth {} mm at its narrowest", num(t * 1e3, 2)));
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
    let mut t = Vec::new();
    match wire {
        Some(x) => t.push(format!(
            "wire: {} × {} mm bare, {} mm over the enamel ({})",
            x.strands_in_hand,
            num(x.diameter_mm, 3),
            num(x.insulated_diameter_mm, 3),
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
    if let (Some(f), Some(area)) = (card.slot_fill, w.design.slot_area_m2) {
        t.push(format!(
            "fill by insulated wire {} % of the usable {} mm² (limit {} %)",
            num(f * 100.0, 1),
            num(area * 1e6, 1),
            num(crate::card::FILL_LIMIT * 100.0, 0)
        ));
    }
    if d_over.is_some() && drawn < total {
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
    c.add(g);
    c.finish()
}
