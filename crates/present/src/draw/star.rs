//! The star-of-slots sheet: every slot's EMF phasor (numbered), the 2m phase sectors of
//! 180°/m that assign slots to phases, and the resulting phase EMF phasors.
//!
//! Method: slot k lies at electrical angle θ_k (`Geometry::slot_angle`); its EMF phasor is
//! e^{−jθ_k}, drawn counter-clockwise positive from the right, so slots further along lag
//! (Pyrhönen, Jokinen, Hrabovcová, *Design of Rotating Electrical Machines*, 2014, §2.4).

use itertools::Itertools;
use std::f64::consts::PI;

use svg::node::element::path::Data;
use svg::node::element::{Circle, Group, Line, Path, Polygon};

use super::page::{Canvas, Page, Rect};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::output::num;
use crate::plan::phasors;
use crate::winding::{Winding, star};

/// Draw the star sheet.
pub fn draw(s: &crate::study::Study, page: &Page) -> String {
    let w = s.winding();
    let mut canvas = Canvas::new(page, &TitleBlock::of(s, "Star of slots"));
    let a = canvas.area;
    let pal = Palette::new(w.geometry.phases, w.labels.colours.as_deref());
    let wide = a.w >= a.h * 1.25;
    let (star_box, phasor_box) = if wide {
        let s = a.h.min(a.w * 0.62);
        (
            Rect {
                x: a.x,
                y: a.y,
                w: s,
                h: a.h,
            },
            Rect {
                x: a.x + s + 6.0,
                y: a.y,
                w: a.w - s - 6.0,
                h: a.h,
            },
        )
    } else {
        let s = a.w.min(a.h * 0.6);
        (
            Rect {
                x: a.x,
                y: a.y,
                w: a.w,
                h: s,
            },
            Rect {
                x: a.x,
                y: a.y + s + 4.0,
                w: a.w,
                h: a.h - s - 4.0,
            },
        )
    };
    canvas.add(star(w, &pal, star_box));
    canvas.add(phase_phasors(w, &pal, phasor_box));
    canvas.finish()
}

/// Slots sharing one ray of the star (exact angle index, [`star::rays`]), and the ray's
/// drawing angle −θ.
fn rays(w: &Winding) -> Vec<(f64, Vec<usize>)> {
    let den = w.geometry.angle_den.max(1) as f64;
    star::rays(&w.geometry)
        .into_iter()
        .map(|(a, slots)| (-2.0 * PI * a as f64 / den, slots))
        .collect()
}

fn pt(cx: f64, cy: f64, rad: f64, phi: f64) -> (f64, f64) {
    (cx + rad * phi.cos(), cy - rad * phi.sin())
}

fn star(w: &Winding, pal: &Palette, b: Rect) -> Group {
    let m = w.geometry.phases;
    let cx = b.x + b.w / 2.0;
    let top_note = 8.0;
    let cy = b.y + top_note + (b.h - top_note) / 2.0;
    let rays = rays(w);
    let half = b.w.min(b.h - top_note) / 2.0;
    // Ray numbers as large as their spacing round the circle allows (at most 3 mm), and
    // the circle as large as leaves room for the longest of them outside it.
    let size_at = |rad: f64| (2.0 * PI * rad / rays.len() as f64 * 0.55).clamp(2.5, 3.0);
    let longest = |size: f64| {
        rays.iter()
            .map(|(_, s)| text::width(&ray_label(s), size))
            .fold(0.0, f64::max)
    };
    let mut rad = (half - 9.0).max(15.0);
    // Long labels (many slots per ray) are kept to a quarter of the star's half-width.
    let mut ray_size = size_at(rad).min((0.25 * half / longest(1.0).max(1e-9)).max(2.5));
    for _ in 0..4 {
        rad = (half - longest(ray_size) - 9.0).max(15.0);
        ray_size = size_at(rad).min(ray_size);
    }
    let fill = w.slot_fill();
    let mut g = Group::new().set("class", "star");
    g = g.add(label(
        b.x,
        b.y + 3.0,
        2.6,
        Anchor::Start,
        "Star of slots (slot EMF phasors, electrical angle)",
    ));
    g = g.add(label(
        b.x,
        b.y + 6.2,
        2.5,
        Anchor::Start,
        &text::fit(
            "Angles counter-clockwise from the right; slot k has EMF e^(\u{2212}j\u{3b8}k), so slots further along lag. Rays carry the top-layer phase.",
            2.5,
            b.w,
        ),
    ));
    let mut names = Group::new().set("class", "sector-names");
    // Phase sectors: sector s covers slot angles s·π/m .. (s+1)·π/m (the synthesis belts),
    // a ray on a boundary belonging to the sector it starts. The drawn edges sit half a ray
    // spacing back, between two rays, so no ray ever lies on an edge.
    let spacing = 2.0 * PI / rays.len().max(1) as f64;
    let edge = if rays.len() > 1 { spacing / 2.0 } else { 0.0 };
    for s in 0..2 * m {
        let (phase, positive) = star::belt(s, m);
        let a0 = -(s as f64) * PI / m as f64 + edge;
        let a1 = -((s + 1) as f64) * PI / m as f64 + edge;
        let rr = rad + 4.0;
        let (x0, y0) = pt(cx, cy, rr, a0);
        let (x1, y1) = pt(cx, cy, rr, a1);
        let d = Data::new()
            .move_to((r(cx), r(cy)))
            .line_to((r(x0), r(y0)))
            .elliptical_arc_to((r(rr), r(rr), 0, 0, 1, r(x1), r(y1)))
            .close();
        let sign = if positive { "+" } else { "\u{2212}" };
        let (lx, ly) = pt(cx, cy, rad * 0.55, (a0 + a1) / 2.0);
        g = g.add(
            Group::new()
                .set("class", "sector")
                .set("data-phase", phase)
                .add(
                    Path::new()
                        .set("d", d)
                        .set("fill", pal.tint(phase))
                        .set("stroke", "#999999")
                        .set("stroke-width", 0.2),
                ),
        );
        // Sector names go on top of the rays, with a white halo so a ray never hides them.
        names = names.add(
            label(
                lx,
                ly + 1.2,
                3.4,
                Anchor::Middle,
                &format!("{sign}{}", w.label(phase)),
            )
            .set("stroke", "#FFFFFF")
            .set("stroke-width", 0.9)
            .set("paint-order", "stroke"),
        );
    }
    g = g.add(
        Circle::new()
            .set("cx", r(cx))
            .set("cy", r(cy))
            .set("r", r(rad))
            .set("fill", "none")
            .set("stroke", "#BBBBBB")
            .set("stroke-width", 0.2),
    );
    // Rays, coloured by the phase of the top-layer side of their first slot.
    for (phi, slots) in &rays {
        let phase = slots
            .iter()
            .find_map(|&k| fill[k][0].or(fill[k][1]))
            .map(|i| w.coils[i].phase);
        let (x, y) = pt(cx, cy, rad, *phi);
        let colour = phase.map_or("#000000", |p| pal.stroke(p));
        let mut line = Line::new()
            .set("x1", r(cx))
            .set("y1", r(cy))
            .set("x2", r(x))
            .set("y2", r(y))
            .set("stroke", colour)
            .set("stroke-width", 0.3);
        if let Some(p) = phase
            && pal.dash(p) != "none"
        {
            line = line.set("stroke-dasharray", pal.dash(p));
        }
        let (tx, ty) = pt(cx, cy, rad + 5.0, *phi);
        let deg = -phi.to_degrees();
        // Keep text upright: on the left half it reads inwards-out from the far end.
        let left = phi.cos() < -1e-9;
        let (rot, anchor) = if left {
            (deg + 180.0, "end")
        } else {
            (deg, "start")
        };
        let txt = ray_label(slots);
        g = g.add(
            Group::new()
                .set("class", "ray")
                .set(
                    "data-slots",
                    slots.iter().map(|k| (k + 1).to_string()).join(" "),
                )
                .add(line)
                .add(
                    label(0.0, ray_size * 0.35, ray_size, Anchor::Start, &txt)
                        .set("text-anchor", anchor)
                        .set(
                            "transform",
                            format!("translate({} {}) rotate({})", r(tx), r(ty), r(rot)),
                        ),
                ),
        );
    }
    g.add(names)
}

/// Slot numbers on one ray: all of them when few, else the first and the repeat step.
fn ray_label(slots: &[usize]) -> String {
    let nums: Vec<String> = slots.iter().map(|k| (k + 1).to_string()).collect();
    if nums.len() <= 4 {
        nums.join(", ")
    } else {
        let step = slots[1] - slots[0];
        format!(
            "{}, {} \u{2026} {} (every {step})",
            nums[0],
            nums[1],
            nums[nums.len() - 1]
        )
    }
}

fn phase_phasors(w: &Winding, pal: &Palette, b: Rect) -> Group {
    let rows = phasors(w, crate::winding::Elec::FUNDAMENTAL);
    let big = rows
        .iter()
        .map(|p| p.magnitude)
        .fold(0.0, f64::max)
        .max(1e-12);
    let mut g = Group::new().set("class", "phase-phasors");
    g = g.add(label(
        b.x,
        b.y + 3.0,
        2.6,
        Anchor::Start,
        "Phase EMF phasors (fundamental)",
    ));
    let table_h = 8.0 + 3.4 * rows.len() as f64;
    let size = (b.w.min(b.h - table_h - 12.0)).max(20.0);
    let rad = size / 2.0 - 8.0;
    let cx = b.x + b.w / 2.0;
    let cy = b.y + 8.0 + size / 2.0;
    g = g.add(
        Circle::new()
            .set("cx", r(cx))
            .set("cy", r(cy))
            .set("r", r(rad))
            .set("fill", "none")
            .set("stroke", "#CCCCCC")
            .set("stroke-width", 0.2),
    );
    for (k, p) in rows.iter().enumerate() {
        if p.magnitude <= 1e-9 * big {
            // A phase with no EMF (e.g. a partial rewind record) has no arrow; the table
            // below says 0.
            g = g.add(Group::new().set("class", "phasor").set("data-phase", k));
            continue;
        }
        let phi = p.angle_deg.to_radians();
        let len = rad * p.magnitude / big;
        let (x, y) = pt(cx, cy, len, phi);
        let (hx1, hy1) = pt(x, y, 2.6, phi + PI - 0.35);
        let (hx2, hy2) = pt(x, y, 2.6, phi + PI + 0.35);
        let mut line = Line::new()
            .set("x1", r(cx))
            .set("y1", r(cy))
            .set("x2", r(x))
            .set("y2", r(y))
            .set("stroke", pal.stroke(k))
            .set("stroke-width", 0.7);
        if pal.dash(k) != "none" {
            line = line.set("stroke-dasharray", pal.dash(k));
        }
        let (lx, ly) = pt(cx, cy, len + 4.0, phi);
        g = g.add(
            Group::new()
                .set("class", "phasor")
                .set("data-phase", k)
                .add(line)
                .add(Polygon::new().set("fill", pal.stroke(k)).set(
                    "points",
                    format!(
                        "{},{} {},{} {},{}",
                        r(x),
                        r(y),
                        r(hx1),
                        r(hy1),
                        r(hx2),
                        r(hy2)
                    ),
                ))
                .add(label(lx, ly + 1.2, 3.0, Anchor::Middle, &p.phase)),
        );
    }
    // Table of magnitudes and angles.
    let mut y = cy + size / 2.0 + 4.0;
    let cols = [b.x, b.x + 22.0, b.x + 52.0];
    for (i, h) in ["Phase", "N_ph\u{b7}k_w1", "Angle"].iter().enumerate() {
        g = g.add(label(cols[i], y, 2.5, Anchor::Start, h).set("fill", "#444444"));
    }
    y += 3.4;
    for p in &rows {
        g = g.add(label(cols[0], y, 2.6, Anchor::Start, &p.phase));
        g = g.add(label(cols[1], y, 2.6, Anchor::Start, &num(p.magnitude, 3)));
        g = g.add(label(
            cols[2],
            y,
            2.6,
            Anchor::Start,
            &format!("{}\u{b0}", num(p.angle_deg, 2)),
        ));
        y += 3.6;
    }
    let verdict = if w.is_positive_balanced() {
        "Phases equal and evenly spaced: balanced."
    } else if w.is_balanced() {
        "Balanced, in negative sequence: the field travels the other way (exchange two supply leads)."
    } else {
        "Phases NOT balanced: check the coil list before winding."
    };
    g.add(label(b.x, y + 1.0, 2.5, Anchor::Start, verdict))
}
