//! The plate-choice sheet: thrust against speed for each plate, clearance and current
//! compared (the field of the finite primary), numbered, with each choice's figures.

use svg::node::element::Group;

use super::chart::{Series, chart};
use super::page::{Canvas, Page, Rect};
use super::palette::{DASHES, OKABE_ITO};
use super::text::{self, Anchor, label};
use super::title::TitleBlock;
use crate::output::num;
use crate::plates::PlatesReport;

/// Curves drawn: the palette's colours less yellow (too pale on white), each with its dash.
const SHOWN: usize = 7;

/// Draw the sheet of `report` for the winding of `s`.
pub fn draw(s: &crate::study::Study, report: &PlatesReport, page: &Page) -> String {
    let mut c = Canvas::new(page, &TitleBlock::of(s, "Plate choice"));
    let a = c.area;
    // With more choices than curves, curves spread evenly over the list (first and last
    // among them), each keyed by its number in the table.
    let total = report.choices.len();
    let picked: Vec<usize> = if total <= SHOWN {
        (0..total).collect()
    } else {
        (0..SHOWN).map(|i| i * (total - 1) / (SHOWN - 1)).collect()
    };
    let shown = picked.len();
    let mut notes: Vec<String> = picked
        .iter()
        .map(|&i| {
            let ch = &report.choices[i];
            format!(
                "{}: plate {} mm at {} MS/m, clearance {} mm, {}; standstill {} N, peak {} N at {} \
                 m/s, plate heat at standstill {} W",
                i + 1,
                num(ch.thickness.mm(), 3),
                num(ch.conductivity.ms_m(), 3),
                num(ch.clearance.mm(), 3),
                ch.current_a
                    .map_or("fed from the supply".to_string(), |i| format!(
                        "{} A",
                        num(i, 3)
                    )),
                num(ch.standstill_thrust_n, 1),
                num(ch.peak_thrust_n, 1),
                num(ch.peak_speed_m_s, 3),
                num(ch.standstill_heat_w, 0)
            )
        })
        .collect();
    if report.choices.len() > shown {
        notes.push(format!(
            "curves of {shown} of the {} choices, spread over the list; every choice is in the \
             text, JSON and CSV table",
            report.choices.len()
        ));
    }
    notes.push(
        "Thrust by the field of the finite primary (layer method). A first estimate, not a test \
         result."
            .into(),
    );
    let mut lines = Vec::new();
    for n in &notes {
        lines.extend(text::wrap(n, 2.6, a.w));
    }
    let notes_h = 4.0 + lines.len() as f64 * 3.6;
    let names: Vec<String> = picked.iter().map(|i| (i + 1).to_string()).collect();
    let series: Vec<Series> = picked
        .iter()
        .enumerate()
        .map(|(k, &i)| Series {
            name: &names[k],
            points: report.choices[i].curve.clone(),
            colour: OKABE_ITO[k],
            dash: if k == 0 { "" } else { DASHES[k] },
        })
        .collect();
    let mut g = Group::new().set("class", "plates").add(chart(
        Rect {
            x: a.x,
            y: a.y,
            w: a.w,
            h: a.h - notes_h - 4.0,
        },
        "Thrust against speed for each choice",
        "secondary speed, m/s",
        "thrust, N",
        &series,
    ));
    let mut y = a.bottom() - notes_h + 3.0;
    for l in lines {
        g = g.add(label(a.x, y, 2.6, Anchor::Start, &l));
        y += 3.6;
    }
    c.add(g);
    c.finish()
}
