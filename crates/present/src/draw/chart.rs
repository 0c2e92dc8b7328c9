//! Line charts on a sheet (mm units): axes with round ticks, lines told apart by dash
//! pattern and colour, a legend, axis titles. Used by the performance sheet.

use svg::node::element::{Group, Polyline};

use super::page::{Rect, rule};
use super::text::{self, Anchor, label, r};
use crate::output::num;

/// Axis text height, mm (ISO 3098: at least 2.5 mm).
const TICK: f64 = 2.6;
/// Title text height, mm.
const TITLE: f64 = 3.2;

/// One line of a chart.
pub struct Series<'a> {
    /// Legend text.
    pub name: &'a str,
    /// Points (x, y).
    pub points: Vec<(f64, f64)>,
    /// Stroke colour.
    pub colour: &'a str,
    /// Dash pattern ("" for solid).
    pub dash: &'a str,
}

/// Round tick step for a span: 1, 2 or 5 times a power of ten, about `n` ticks.
fn step(span: f64, n: f64) -> f64 {
    let raw = (span / n).max(1e-300);
    let p = 10f64.powf(raw.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * p)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * p)
}

/// Draw a chart of `series` inside `b`, with axis titles.
pub fn chart(b: Rect, title: &str, x_title: &str, y_title: &str, series: &[Series]) -> Group {
    let pts = series.iter().flat_map(|s| s.points.iter());
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, 0.0f64, f64::MIN);
    for &(x, y) in pts {
        if x.is_finite() && y.is_finite() {
            x0 = x0.min(x);
            x1 = x1.max(x);
            y0 = y0.min(y);
            y1 = y1.max(y);
        }
    }
    if x0 >= x1 {
        (x0, x1) = (x0.min(0.0), x0.max(0.0) + 1.0);
    }
    if y0 >= y1 {
        y1 = y0 + 1.0;
    }
    let ys = step(y1 - y0, 5.0);
    let (y0, y1) = ((y0 / ys).floor() * ys, (y1 / ys).ceil() * ys);
    let xs = step(x1 - x0, 6.0);
    // Plot area: room for the y ticks on the left, the x ticks and title below, the chart
    // title above.
    let left = b.x + 16.0;
    let right = b.right() - 2.0;
    let top = b.y + TITLE + 4.0;
    let bottom = b.bottom() - 2.0 * TICK - 5.0;
    let px = |x: f64| left + (x - x0) / (x1 - x0) * (right - left);
    let py = |y: f64| bottom - (y - y0) / (y1 - y0) * (bottom - top);
    let mut g = Group::new().set("class", "chart");
    g = g.add(label(b.x, b.y + TITLE, TITLE, Anchor::Start, title));
    // Grid and y ticks.
    let mut y = y0;
    while y <= y1 + ys * 1e-9 {
        g = g.add(rule(left, py(y), right, py(y), 0.1).set("stroke", "#BBBBBB"));
        g = g.add(label(
            left - 1.5,
            py(y) + TICK * 0.35,
            TICK,
            Anchor::End,
            &num(y, 3),
        ));
        y += ys;
    }
    let mut x = (x0 / xs).ceil() * xs;
    while x <= x1 + xs * 1e-9 {
        g = g.add(rule(px(x), top, px(x), bottom, 0.1).set("stroke", "#BBBBBB"));
        g = g.add(label(
            px(x),
            bottom + TICK + 1.0,
            TICK,
            Anchor::Middle,
            &num(x, 3),
        ));
        x += xs;
    }
    g = g.add(rule(left, bottom, right, bottom, 0.35));
    g = g.add(rule(left, top, left, bottom, 0.35));
    if y0 < 0.0 && y1 > 0.0 {
        g = g.add(rule(left, py(0.0), right, py(0.0), 0.3));
    }
    g = g.add(label(
        (left + right) / 2.0,
        bottom + 2.0 * TICK + 3.5,
        TICK,
        Anchor::Middle,
        x_title,
    ));
    g = g.add(label(left, top - 1.2, TICK, Anchor::Start, y_title));
    // Lines, and their keys in one row above the plot.
    for (i, s) in series.iter().enumerate() {
        let path: Vec<String> = s
            .points
            .iter()
            .filter(|p| p.0.is_finite() && p.1.is_finite())
            .map(|&(x, y)| format!("{},{}", r(px(x)), r(py(y))))
            .collect();
        let mut line = Polyline::new()
            .set("points", path.join(" "))
            .set("fill", "none")
            .set("stroke", s.colour)
            .set("stroke-width", 0.5)
            .set("class", "series");
        if !s.dash.is_empty() {
            line = line.set("stroke-dasharray", s.dash);
        }
        g = g.add(line);
        // One line needs no key: the chart's title names it. The keys stand in one row
        // above the plot, right-aligned on the line of the axis title, clear of every curve.
        if series.len() == 1 {
            continue;
        }
        // The last keys that fit right of the axis title; those before them in a second
        // row above, right of the chart's title (on a narrow page).
        let widths: Vec<f64> = series
            .iter()
            .map(|s| 10.0 + text::width(s.name, TICK) + 6.0)
            .collect();
        let room = right - (left + text::width(y_title, TICK) + 4.0);
        let mut first_low = series.len();
        while first_low > 0 && widths[first_low - 1..].iter().sum::<f64>() - 6.0 <= room {
            first_low -= 1;
        }
        let (lx, ly) = if i >= first_low {
            (
                right - widths[i..].iter().sum::<f64>() + 6.0,
                top - 1.2 - TICK * 0.35,
            )
        } else {
            (
                right - widths[i..first_low].iter().sum::<f64>() + 6.0,
                top - 1.2 - TICK * 0.35 - (TICK + 1.2),
            )
        };
        let mut key = rule(lx, ly, lx + 8.0, ly, 0.6).set("stroke", s.colour);
        if !s.dash.is_empty() {
            key = key.set("stroke-dasharray", s.dash);
        }
        g = g.add(key);
        g = g.add(label(
            lx + 10.0,
            ly + TICK * 0.35,
            TICK,
            Anchor::Start,
            s.name,
        ));
    }
    g
}
