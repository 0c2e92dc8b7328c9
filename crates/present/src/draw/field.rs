//! The travelling-field sheet, drawn directly on the shared page: the MMF along the gap at
//! one instant (one emphasised staircase), the crest of the working wave at later instants
//! marked along it to show the travel, and the spectrum as stems, forward solid and
//! backward dashed. The figures (speed, σ_d, THD) in a line below.

use crate::output::Words;
use svg::node::element::{Group, Polygon};

use super::chart::{Series, chart};
use super::page::{Canvas, Page, Rect};
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::field::{Direction, FieldReport, Snapshot};
use crate::numbering::num;

/// Draw the field sheet for balanced positive-sequence currents (the study's field).
pub fn draw(s: &crate::study::Study, page: &Page) -> String {
    let plot = s
        .field()
        .and_then(|rep| s.field_snapshots().map(|snaps| (rep, snaps)));
    match plot {
        Ok((rep, snaps)) => draw_report(s, rep, snaps, page),
        Err(e) => {
            let mut canvas = Canvas::new(page, &TitleBlock::of(s, "Travelling field"));
            let a = canvas.area;
            canvas.add(Group::new().set("class", "not-available").add(label(
                a.x,
                a.y + 8.0,
                3.5,
                Anchor::Start,
                &text::fit(
                    &format!("No travelling field to draw: {}", e.message()),
                    3.5,
                    a.w,
                ),
            )));
            canvas.finish()
        }
    }
}

/// Draw the field sheet of a given field report and its snapshots (`field --svg`, for the
/// currents, slot opening and orders the user asked for), on the shared page of `s`.
pub fn draw_report(
    s: &crate::study::Study,
    rep: &FieldReport,
    snaps: &[Snapshot],
    page: &Page,
) -> String {
    let mut canvas = Canvas::new(page, &TitleBlock::of(s, "Travelling field"));
    let a = canvas.area;
    canvas.add(sheet(rep, snaps, a));
    canvas.finish()
}

fn sheet(rep: &FieldReport, snaps: &[Snapshot], a: Rect) -> Group {
    let notes_h = 16.0;
    let gap = 5.0;
    let mmf_h = (a.h - notes_h - gap) * 0.55;
    let spec_h = a.h - notes_h - gap - mmf_h;
    let first = snaps.first();
    let staircase: Vec<(f64, f64)> = first
        .map(|s| s.points.iter().map(|p| (p.x, p.mmf)).collect())
        .unwrap_or_default();
    let travel = match rep.working_wave {
        Direction::Forward => "towards higher slot numbers",
        Direction::Backward => "towards lower slot numbers",
    };
    let mmf_box = Rect {
        x: a.x,
        y: a.y,
        w: a.w,
        h: mmf_h,
    };
    let mut g = Group::new().set("class", "field-sheet").add(chart(
        mmf_box,
        &format!(
            "MMF along the gap at \u{3c9}t = 0 (balanced currents); the field travels {travel}"
        ),
        "position along the gap, slot pitches (slot n centred at n \u{2212} 0.5)",
        "MMF, ampere-turns",
        &[Series {
            name: "MMF at \u{3c9}t = 0",
            points: staircase.clone(),
            colour: "#000000",
            dash: "",
        }],
    ));
    // Crest markers: where the working wave's crest stands at each instant, numbered in
    // time order, so the travel reads off the sheet.
    let (x0, x1) = staircase.iter().fold((f64::MAX, f64::MIN), |(lo, hi), p| {
        (lo.min(p.0), hi.max(p.0))
    });
    if x1 > x0 {
        let left = mmf_box.x + 16.0;
        let right = mmf_box.right() - 2.0;
        let px = |x: f64| left + (x - x0) / (x1 - x0) * (right - left);
        let y = mmf_box.y + 3.2 + 4.0 + 3.5;
        let mut marks = Group::new().set("class", "crests");
        for (i, s) in snaps.iter().enumerate() {
            let x = px(s.crest_x.clamp(x0, x1));
            marks = marks
                .add(Polygon::new().set("fill", "#D55E00").set(
                    "points",
                    format!(
                        "{},{} {},{} {},{}",
                        r(x - 1.2),
                        r(y),
                        r(x + 1.2),
                        r(y),
                        r(x),
                        r(y + 2.0)
                    ),
                ))
                .add(label(x, y - 0.5, 2.5, Anchor::Middle, &(i + 1).to_string()));
        }
        g = g.add(marks);
    }
    // The axis starts at order 0 so the working wave's stem at 1 stands clear of it.
    let forward: Vec<(f64, f64)> = std::iter::once((0.0, 0.0))
        .chain(rep.rows.iter().flat_map(|row| {
            let x = row.order.get();
            [(x, 0.0), (x, row.forward), (x, 0.0)]
        }))
        .collect();
    let backward: Vec<(f64, f64)> = rep
        .rows
        .iter()
        .flat_map(|row| {
            let x = row.order.get() + 0.15;
            [(x, 0.0), (x, row.backward), (x, 0.0)]
        })
        .collect();
    g = g.add(chart(
        Rect {
            x: a.x,
            y: a.y + mmf_h + gap,
            w: a.w,
            h: spec_h,
        },
        "Spectrum: amplitude of each wave over the working wave",
        "electrical order \u{3bd}",
        "relative amplitude",
        &[
            Series {
                name: "forward waves",
                points: forward,
                colour: "#000000",
                dash: "",
            },
            Series {
                name: "backward waves",
                points: backward,
                colour: "#0072B2",
                dash: "1.5 1",
            },
        ],
    ));
    let speed = rep
        .figures
        .synchronous_speed_m_s
        .map(|v| format!("field speed {} m/s; ", num(v, 3)))
        .unwrap_or_default();
    let notes = format!(
        "Crest markers 1\u{2013}{}: the working wave's crest at \u{3c9}t = 0, 60, \
         120 ... degrees. {speed}differential leakage \u{3c3}_d = {}, THD = {}%, k_w1 = {}.{}",
        snaps.len(),
        num(rep.differential_leakage, 5),
        num(rep.thd * 100.0, 2),
        num(rep.winding_factor, 4),
        rep.linear
            .as_ref()
            .map(|l| format!(
                " Open primary: backward fundamental {} and pulsating part {} of the working wave.",
                num(l.backward_wave, 4),
                num(l.pulsating, 4)
            ))
            .unwrap_or_default()
    );
    let mut y = a.bottom() - notes_h + 3.5;
    for l in text::wrap(&notes, 2.6, a.w) {
        g = g.add(label(a.x, y, 2.6, Anchor::Start, &l));
        y += 3.6;
    }
    g
}
