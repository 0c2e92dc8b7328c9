//! The performance sheet of a flat primary: thrust and normal force, then current and power
//! factor, against speed, with and without the end effect, and the model's assumptions.

use crate::output::Words;
use svg::node::element::Group;

use super::chart::{Series, chart};
use super::page::{Canvas, Page, Rect};
use super::text::{self, Anchor, label};
use super::title::TitleBlock;
use crate::output::num;
use crate::thrust::ThrustReport;

/// Okabe–Ito black, vermillion and blue (M. Okabe, K. Ito, "Color Universal Design", 2008).
const INK: [&str; 4] = ["#000000", "#D55E00", "#0072B2", "#009E73"];

/// Whether the winding carries what the performance model needs.
pub fn applies(s: &crate::study::Study) -> bool {
    s.thrust().is_ok()
}

/// Draw the performance sheet; without the data the model needs, the sheet says what is
/// missing instead.
pub fn draw(s: &crate::study::Study, page: &Page) -> String {
    let mut c = Canvas::new(page, &TitleBlock::of(s, "Performance"));
    let a = c.area;
    match s.thrust() {
        Ok(report) => {
            c.add(sheet(report, a));
        }
        Err(e) => {
            let mut g = Group::new().set("class", "not-available");
            for (i, l) in text::wrap(
                &format!("No performance sheet for this winding: {}.", e.message()),
                3.5,
                a.w,
            )
            .iter()
            .enumerate()
            {
                g = g.add(label(
                    a.x,
                    a.y + 6.0 + i as f64 * 5.0,
                    3.5,
                    Anchor::Start,
                    l,
                ));
            }
            c.add(g);
        }
    }
    c.finish()
}

fn sheet(with: &ThrustReport, a: Rect) -> Group {
    let notes = format!(
        "v_s = {} m/s; G = {}; k_C = {}; edge factor {}; g_e = {} mm; L_m = {} mH; R2' = {} \
         ohm. Largest thrust {} N at slip {} (circuit), {} N at slip {} (field model). Model: {}",
        num(with.synchronous_speed_m_s, 3),
        num(with.goodness_factor, 3),
        num(with.carter_coefficient, 4),
        num(with.edge_factor, 4),
        num(with.effective_gap.mm(), 3),
        num(crate::units::in_milli(with.magnetizing_inductance_h), 3),
        num(with.secondary_resistance_ohm, 4),
        num(with.max_thrust_n, 1),
        num(with.max_thrust_slip, 3),
        num(with.field_model.max_thrust_n, 1),
        num(with.field_model.max_thrust_slip, 3),
        with.assumptions
            .iter()
            .map(Words::message)
            .collect::<Vec<_>>()
            .join("; ")
    );
    // The notes take the lines they need (at least the 22 mm they always had); the charts
    // share the rest.
    let lines = text::wrap(&notes, 2.6, a.w);
    let notes_h = (4.0 + lines.len() as f64 * 3.6).max(22.0);
    let gap = 6.0;
    let chart_h = (a.h - notes_h - gap) / 2.0;
    let pts = |rows: &[crate::thrust::Row], f: &dyn Fn(&crate::thrust::Row) -> f64| {
        rows.iter()
            .map(|row| (row.speed_m_s, f(row)))
            .collect::<Vec<(f64, f64)>>()
    };
    // One quantity with and without the end effect: solid and dashed, in the first two inks.
    let both = |names: [&'static str; 2], f: &dyn Fn(&crate::thrust::Row) -> f64| {
        [
            Series {
                name: names[0],
                points: pts(&with.rows, f),
                colour: INK[0],
                dash: "",
            },
            Series {
                name: names[1],
                points: pts(&with.long_primary_rows, f),
                colour: INK[1],
                dash: "3 1.5",
            },
        ]
    };
    let [thrust_with, thrust_without] = both(["thrust, circuit", "circuit, no end effect"], &|r| {
        r.thrust_n
    });
    // The finite primary's own field (layer method): the fourth ink, long dashes.
    let field = |name: &'static str, f: &dyn Fn(&crate::layers::FieldRow) -> f64| Series {
        name,
        points: with
            .field_model
            .rows
            .iter()
            .map(|r| (r.speed_m_s, f(r)))
            .collect(),
        colour: INK[3],
        dash: "5 1.5",
    };
    let top = chart(
        Rect {
            x: a.x,
            y: a.y,
            w: a.w,
            h: chart_h,
        },
        "Thrust and normal force against speed",
        "secondary speed, m/s",
        "force, N",
        &[
            thrust_with,
            thrust_without,
            field("thrust, field model", &|r| r.thrust_n),
            Series {
                name: "normal force, circuit (+ attracts)",
                points: pts(&with.rows, &|r| r.normal_force_n),
                colour: INK[2],
                dash: "0.8 1.2",
            },
        ],
    );
    let bottom = chart(
        Rect {
            x: a.x,
            y: a.y + chart_h + gap,
            w: a.w,
            h: chart_h,
        },
        "Phase current against speed",
        "secondary speed, m/s",
        "current, A",
        &{
            let [a, b] = both(["current, circuit", "circuit, no end effect"], &|r| {
                r.current_a
            });
            [
                a,
                b,
                field("field model, largest phase", &|r| {
                    r.phase_currents_a.iter().copied().fold(0.0, f64::max)
                }),
            ]
        },
    );
    let mut g = Group::new()
        .set("class", "performance")
        .add(top)
        .add(bottom);
    let mut y = a.bottom() - notes_h + 3.0;
    for l in lines {
        g = g.add(label(a.x, y, 2.6, Anchor::Start, &l));
        y += 3.6;
    }
    g
}
