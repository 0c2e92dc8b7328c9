//! The span comparison as a sheet on the shared page (`pitch --svg`): k_w1 and the
//! harmonics weighed against the coil span, the k_w1 floor and the recommended span, with
//! the recommendation in words below. Lines are told apart by dash pattern as well as
//! colour (the shared palette's Okabe–Ito colours and dashes), so the sheet reads in black
//! and white.

use svg::node::element::Group;

use super::chart::{Series, chart};
use super::page::{Page, Rect};
use super::palette::{DASHES, OKABE_ITO};
use super::text::{self, Anchor, label};
use super::title::TitleBlock;
use crate::output::{Words, num};
use crate::pitch::PitchReport;

/// Black, for k_w1 and the floor and recommendation lines.
const BLACK: &str = "#000000";

/// Draw the span comparison `r` of the study `s`'s winding.
pub fn draw(s: &crate::study::Study, r: &PitchReport, page: &Page) -> String {
    let mut canvas = super::page::Canvas::new(page, &TitleBlock::of(s, "Span comparison"));
    let a = canvas.area;
    let notes_h = 18.0;
    let pts = |f: &dyn Fn(&crate::pitch::PitchRow) -> Option<f64>| -> Vec<(f64, f64)> {
        r.rows
            .iter()
            .filter_map(|row| f(row).map(|k| (row.pitch as f64, k)))
            .collect()
    };
    let orders: Vec<f64> = r
        .rows
        .first()
        .map(|row| row.harmonics.iter().map(|h| h.order.get()).collect())
        .unwrap_or_default();
    let names: Vec<String> = std::iter::once("k_w1".to_string())
        .chain(orders.iter().map(|o| format!("|k_w{}|", num(*o, 3))))
        .collect();
    let mut series: Vec<Series> = Vec::new();
    series.push(Series {
        name: &names[0],
        points: pts(&|row| Some(row.winding)),
        colour: BLACK,
        dash: "",
    });
    for (i, o) in orders.iter().enumerate() {
        let k = i % OKABE_ITO.len();
        series.push(Series {
            name: &names[i + 1],
            points: pts(&|row| {
                row.harmonics
                    .iter()
                    .find(|h| h.order.get() == *o)
                    .map(|h| h.winding.abs())
            }),
            colour: OKABE_ITO[k],
            dash: DASHES[(k + 1) % DASHES.len()],
        });
    }
    let (lo, hi) = (
        r.rows.first().map_or(0.0, |row| row.pitch as f64),
        r.rows.last().map_or(1.0, |row| row.pitch as f64),
    );
    let floor = format!("k_w1 floor {}", num(r.min_fundamental, 2));
    series.push(Series {
        name: &floor,
        points: vec![(lo, r.min_fundamental), (hi, r.min_fundamental)],
        colour: BLACK,
        dash: "0.4 1.2",
    });
    let recommended = r.recommended.map(|y| format!("recommended span {y}"));
    if let (Some(y), Some(name)) = (r.recommended, &recommended) {
        series.push(Series {
            name,
            points: vec![(y as f64, 0.0), (y as f64, 1.0)],
            colour: BLACK,
            dash: "5 1.5 1 1.5",
        });
    }
    let plot = chart(
        Rect {
            x: a.x,
            y: a.y,
            w: a.w,
            h: a.h - notes_h,
        },
        &format!(
            "Winding factor against span: {} slots, {} poles, pole pitch {} slots",
            r.slots,
            r.poles,
            num(r.pole_pitch_slots, 3)
        ),
        "coil span, slot pitches",
        "winding factor",
        &series,
    );
    let mut g = Group::new().set("class", "span-sheet").add(plot);
    let mut y = a.bottom() - notes_h + 5.0;
    for l in text::wrap(&r.reason.message(), 2.8, a.w) {
        g = g.add(label(a.x, y, 2.8, Anchor::Start, &l));
        y += 3.8;
    }
    canvas.add(g);
    canvas.finish()
}
