//! SVG chart of winding factor against span for the span comparison.
//!
//! Lines are told apart by dash pattern and marker shape as well as colour, so the chart
//! reads in black and white; colours are from the Okabe–Ito colour-blind-safe palette
//! (M. Okabe, K. Ito, "Color Universal Design", 2008).

use svg::Document;
use svg::node::element::{Circle, Line, Polyline, Rectangle, Text as SvgText};

use crate::output::num;
use crate::pitch::PitchReport;
use crate::plan::CAUTION;

const INK: [&str; 5] = ["#000000", "#D55E00", "#0072B2", "#009E73", "#CC79A7"];
const DASH: [&str; 5] = ["", "8 4", "2 3", "10 3 2 3", "4 4"];

fn text(x: f64, y: f64, size: f64, s: &str) -> SvgText {
    SvgText::new(crate::sanitize::short(s, 90))
        .set("x", x)
        .set("y", y)
        .set("font-family", "DejaVu Sans, Arial, sans-serif")
        .set("font-size", size)
}

/// Render the chart of k_w1 and the named harmonics against span.
pub fn pitch_chart(r: &PitchReport) -> String {
    let (w, h) = (900.0, 560.0);
    let (left, right, top, bottom) = (70.0, 190.0, 60.0, 110.0);
    let (pw, ph) = (w - left - right, h - top - bottom);
    let spans: Vec<usize> = r.rows.iter().map(|row| row.pitch).collect();
    let (lo, hi) = match (spans.first(), spans.last()) {
        (Some(&a), Some(&b)) if b > a => (a as f64, b as f64),
        (Some(&a), _) => (a as f64 - 1.0, a as f64 + 1.0),
        _ => (0.0, 1.0),
    };
    let px = |y: f64| left + (y - lo) / (hi - lo) * pw;
    let py = |k: f64| top + (1.0 - k.clamp(0.0, 1.0)) * ph;
    let title = match &r.title {
        Some(t) => format!("Winding factor against span: {t}"),
        None => "Winding factor against span".into(),
    };
    let mut doc = Document::new()
        .set("data-made-by", super::export::MARK)
        .set("viewBox", (0, 0, w, h))
        .set("width", w)
        .set("height", h)
        .add(
            Rectangle::new()
                .set("width", w)
                .set("height", h)
                .set("fill", "white"),
        )
        .add(text(left, 30.0, 18.0, &title))
        .add(text(
            left,
            48.0,
            12.0,
            &format!(
                "{} slots, {} poles, {}, pole pitch {} slots",
                r.slots,
                r.poles,
                crate::numbering::count(r.layers, "layer", "layers"),
                num(r.pole_pitch_slots, 3)
            ),
        ));
    // Axes and grid.
    for i in 0..=10 {
        let k = i as f64 / 10.0;
        doc = doc
            .add(
                Line::new()
                    .set("x1", left)
                    .set("x2", left + pw)
                    .set("y1", py(k))
                    .set("y2", py(k))
                    .set("stroke", "#cccccc")
                    .set("stroke-width", 0.5),
            )
            .add(text(left - 34.0, py(k) + 4.0, 11.0, &num(k, 1)));
    }
    for &y in &spans {
        doc = doc.add(text(
            px(y as f64) - 4.0,
            top + ph + 16.0,
            11.0,
            &y.to_string(),
        ));
    }
    doc = doc
        .add(text(
            left + pw / 2.0 - 60.0,
            top + ph + 36.0,
            12.0,
            "coil span (slot pitches)",
        ))
        // The axis title stands along the axis, clear of the subtitle above the plot.
        .add(
            text(0.0, 0.0, 12.0, "winding factor")
                .set("text-anchor", "middle")
                .set(
                    "transform",
                    format!("translate(24 {}) rotate(-90)", top + ph / 2.0),
                ),
        )
        .add(
            Rectangle::new()
                .set("x", left)
                .set("y", top)
                .set("width", pw)
                .set("height", ph)
                .set("fill", "none")
                .set("stroke", "black"),
        );
    // Floor and recommendation.
    doc = doc.add(
        Line::new()
            .set("x1", left)
            .set("x2", left + pw)
            .set("y1", py(r.min_fundamental))
            .set("y2", py(r.min_fundamental))
            .set("stroke", "black")
            .set("stroke-dasharray", "1 3"),
    );
    if let Some(rec) = r.recommended {
        doc = doc
            .add(
                Line::new()
                    .set("x1", px(rec as f64))
                    .set("x2", px(rec as f64))
                    .set("y1", top)
                    .set("y2", top + ph)
                    .set("stroke", "black")
                    .set("stroke-width", 1.5)
                    .set("stroke-dasharray", "6 2 1 2"),
            )
            .add(text(
                px(rec as f64) + 4.0,
                top + 14.0,
                12.0,
                &format!("recommended: {rec}"),
            ));
    }
    // Series: k_w1 then each named harmonic.
    let mut series: Vec<(String, Vec<f64>)> = vec![(
        "k_w1".into(),
        r.rows.iter().map(|row| row.winding).collect(),
    )];
    for (i, o) in r.suppress.iter().enumerate() {
        series.push((
            format!("k_w{}", num(*o, 2)),
            r.rows.iter().map(|row| row.harmonics[i].winding).collect(),
        ));
    }
    for (i, (name, ks)) in series.iter().enumerate() {
        let ink = INK[i % INK.len()];
        let points: Vec<String> = spans
            .iter()
            .zip(ks)
            .map(|(&y, &k)| format!("{:.2},{:.2}", px(y as f64), py(k)))
            .collect();
        let mut line = Polyline::new()
            .set("points", points.join(" "))
            .set("fill", "none")
            .set("stroke", ink)
            .set("stroke-width", if i == 0 { 2.5 } else { 1.5 });
        if !DASH[i % DASH.len()].is_empty() {
            line = line.set("stroke-dasharray", DASH[i % DASH.len()]);
        }
        doc = doc.add(line);
        for (&y, &k) in spans.iter().zip(ks) {
            doc = doc.add(marker(i, px(y as f64), py(k), ink));
        }
        let ly = top + 20.0 + 22.0 * i as f64;
        let mut key = Line::new()
            .set("x1", left + pw + 16.0)
            .set("x2", left + pw + 56.0)
            .set("y1", ly)
            .set("y2", ly)
            .set("stroke", ink)
            .set("stroke-width", if i == 0 { 2.5 } else { 1.5 });
        if !DASH[i % DASH.len()].is_empty() {
            key = key.set("stroke-dasharray", DASH[i % DASH.len()]);
        }
        doc = doc
            .add(key)
            .add(marker(i, left + pw + 36.0, ly, ink))
            .add(text(left + pw + 62.0, ly + 4.0, 12.0, name));
    }
    // Wrapped short enough that no line is cut.
    for (i, line) in crate::output::wrap_plain(CAUTION, 88).iter().enumerate() {
        doc = doc.add(text(left, h - 46.0 + 13.0 * i as f64, 10.0, line));
    }
    doc.to_string()
}

/// A marker shape per series: circle, square, triangle, diamond, cross.
fn marker(i: usize, x: f64, y: f64, ink: &str) -> Box<dyn svg::Node> {
    let s = 3.5;
    let poly = |pts: String| -> Box<dyn svg::Node> {
        Box::new(
            Polyline::new()
                .set("points", pts)
                .set("fill", "white")
                .set("stroke", ink)
                .set("stroke-width", 1.2),
        )
    };
    match i % 5 {
        0 => Box::new(
            Circle::new()
                .set("cx", x)
                .set("cy", y)
                .set("r", s)
                .set("fill", ink),
        ),
        1 => poly(format!(
            "{},{} {},{} {},{} {},{} {},{}",
            x - s,
            y - s,
            x + s,
            y - s,
            x + s,
            y + s,
            x - s,
            y + s,
            x - s,
            y - s
        )),
        2 => poly(format!(
            "{},{} {},{} {},{} {},{}",
            x,
            y - s - 1.0,
            x + s + 1.0,
            y + s,
            x - s - 1.0,
            y + s,
            x,
            y - s - 1.0
        )),
        3 => poly(format!(
            "{},{} {},{} {},{} {},{} {},{}",
            x,
            y - s - 1.0,
            x + s + 1.0,
            y,
            x,
            y + s + 1.0,
            x - s - 1.0,
            y,
            x,
            y - s - 1.0
        )),
        _ => poly(format!(
            "{},{} {},{} {},{} {},{}",
            x - s,
            y - s,
            x + s,
            y + s,
            x,
            y,
            x + s,
            y - s
        )),
    }
}
