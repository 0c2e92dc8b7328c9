//! The field sheet as SVG: MMF snapshots over one period laid over each other with the
//! working wave's crest and an arrow showing its travel and speed, a bar chart of the
//! spectrum (forward and backward told apart by hatching as well as colour), a title block
//! and the caution. Pure: takes the report, returns the SVG text.
//!
//! Colours are the Okabe–Ito colour-blind-safe palette (M. Okabe, K. Ito, *Color Universal
//! Design*, 2008); every colour distinction is doubled by a dash or fill pattern so the sheet
//! reads in black and white. Helpers are local to this file; the shared drawing helpers
//! (`src/draw/`) are built separately and the two will be reconciled.

use itertools::Itertools;
use svg::Document;
use svg::node::element::path::Data;
use svg::node::element::{
    Definitions, Group, Line, Marker, Path, Pattern, Polyline, Rectangle, Text,
};

use crate::field::{Direction, FieldReport, Snapshot};
use crate::output::num;
use crate::winding::Topology;

/// Okabe–Ito palette: black, orange, sky blue, bluish green, blue, vermillion, purple.
const PALETTE: [&str; 7] = [
    "#000000", "#E69F00", "#56B4E9", "#009E73", "#0072B2", "#D55E00", "#CC79A7",
];
/// Dash patterns paired with the palette so curves differ without colour.
const DASHES: [&str; 7] = ["none", "9 4", "3 3", "12 3 3 3", "6 2", "1 3", "14 5"];
const FORWARD: &str = "#0072B2";
const BACKWARD: &str = "#D55E00";

const WIDTH: f64 = 1000.0;
const HEIGHT: f64 = 820.0;
const LEFT: f64 = 80.0;
const RIGHT: f64 = 960.0;
/// Most spectrum orders drawn as bars (the lowest ones; the table has all).
const MAX_BARS: usize = 40;

fn text(x: f64, y: f64, size: f64, s: &str) -> Text {
    Text::new(crate::sanitize::short(s, 110))
        .set("x", r(x))
        .set("y", r(y))
        .set("font-family", "DejaVu Sans, Arial, Helvetica, sans-serif")
        .set("font-size", size)
}

fn line(x1: f64, y1: f64, x2: f64, y2: f64, stroke: &str, width: f64) -> Line {
    Line::new()
        .set("x1", r(x1))
        .set("y1", r(y1))
        .set("x2", r(x2))
        .set("y2", r(y2))
        .set("stroke", stroke)
        .set("stroke-width", width)
}

fn rect(x: f64, y: f64, w: f64, h: f64) -> Rectangle {
    Rectangle::new()
        .set("x", r(x))
        .set("y", r(y))
        .set("width", r(w.max(0.0)))
        .set("height", r(h.max(0.0)))
}

/// Round for compact output.
fn r(x: f64) -> f64 {
    (x * 100.0).round() / 100.0
}

/// Wrap text on word boundaries to at most `width` characters a line.
fn wrap(s: &str, width: usize) -> Vec<String> {
    let mut out = Vec::new();
    let mut cur = String::new();
    // Split on plain spaces only, so a no-break space keeps a value with its unit.
    for word in s.split(' ').filter(|w| !w.is_empty()) {
        if !cur.is_empty() && cur.chars().count() + 1 + word.chars().count() > width {
            out.push(std::mem::take(&mut cur));
        }
        if !cur.is_empty() {
            cur.push(' ');
        }
        cur.push_str(word);
    }
    if !cur.is_empty() {
        out.push(cur);
    }
    out
}

/// A hatch pattern: light tint of `colour` with lines at `angle` degrees (and a second set
/// at right angles when `cross`).
fn hatch(id: &str, colour: &str, angle: f64, cross: bool) -> Pattern {
    let mut p = Pattern::new()
        .set("id", id)
        .set("patternUnits", "userSpaceOnUse")
        .set("width", 6)
        .set("height", 6)
        .set("patternTransform", format!("rotate({angle})"))
        .add(
            rect(0.0, 0.0, 6.0, 6.0)
                .set("fill", colour)
                .set("fill-opacity", 0.35),
        )
        .add(line(0.0, 0.0, 0.0, 6.0, colour, 2.4));
    if cross {
        p = p.add(line(0.0, 3.0, 6.0, 3.0, colour, 1.2));
    }
    p
}

/// Nice tick step for a range.
fn tick_step(span: f64, target: f64) -> f64 {
    let raw = (span / target).max(1e-12);
    let mag = 10f64.powf(raw.log10().floor());
    let f = raw / mag;
    let nice = if f < 1.5 {
        1.0
    } else if f < 3.5 {
        2.0
    } else if f < 7.5 {
        5.0
    } else {
        10.0
    };
    nice * mag
}

/// How fast the working wave travels, in words.
fn speed_text(rep: &FieldReport) -> String {
    let dir = match rep.working_wave {
        Direction::Forward => "forward (toward higher slot numbers)",
        Direction::Backward => "backward (toward lower slot numbers)",
    };
    let tau = rep.slots as f64 / rep.poles as f64;
    let speed = match rep.topology {
        Topology::Linear => rep
            .linear
            .as_ref()
            .and_then(|l| l.field_speed_m_s)
            .map(|v| {
                let sec = rep
                    .linear
                    .as_ref()
                    .and_then(|l| l.secondary_speed_m_s)
                    .zip(rep.figures.slip)
                    .map(|(s, slip)| {
                        format!(
                            "; secondary {}\u{a0}m/s at slip {}",
                            num(s, 3),
                            num(slip, 3)
                        )
                    })
                    .unwrap_or_default();
                format!("v_s = 2·f·τ = {}\u{a0}m/s{sec}", num(v, 3))
            }),
        Topology::Rotary => rep.figures.synchronous_speed_rpm.map(|n| {
            let v = rep
                .figures
                .synchronous_speed_m_s
                .map(|v| format!(", {}\u{a0}m/s at the bore", num(v, 2)))
                .unwrap_or_default();
            format!("n_s = {}\u{a0}rpm{v}", num(n, 1))
        }),
    };
    let pitch = match rep.topology {
        Topology::Linear => rep
            .linear
            .as_ref()
            .map(|l| std::f64::consts::PI / l.synchronous_wavenumber_rad_slot)
            .unwrap_or(tau),
        Topology::Rotary => tau,
    };
    format!(
        "working wave travels {dir}, two pole pitches ({} slot pitches) per supply period{}",
        num(2.0 * pitch, 2),
        speed.map(|s| format!("; {s}")).unwrap_or_default()
    )
}

/// Crest positions of the snapshots unwrapped along the direction of travel, shifted back
/// by whole wavelengths so they stay on the core where they can.
fn unwrapped_crests(rep: &FieldReport, snaps: &[Snapshot]) -> Vec<f64> {
    let z = rep.slots as f64;
    let period = 2.0 * z / rep.poles.max(1) as f64;
    let period = match &rep.linear {
        Some(l) => 2.0 * std::f64::consts::PI / l.synchronous_wavenumber_rad_slot,
        None => period,
    };
    let mut out: Vec<f64> = Vec::with_capacity(snaps.len());
    for s in snaps {
        let x = match out.last() {
            None => s.crest_x,
            Some(&prev) => match rep.working_wave {
                Direction::Forward => prev + (s.crest_x - prev).rem_euclid(period),
                Direction::Backward => prev - (prev - s.crest_x).rem_euclid(period),
            },
        };
        out.push(x);
    }
    let (lo, hi) = out
        .iter()
        .fold((f64::MAX, f64::MIN), |(a, b), &x| (a.min(x), b.max(x)));
    let mut shift = 0.0;
    while hi + shift > z && lo + shift - period >= 0.0 {
        shift -= period;
    }
    while lo + shift < 0.0 && hi + shift + period <= z {
        shift += period;
    }
    out.iter().map(|x| x + shift).collect()
}

/// Axis titles of a chart spanning `top..bottom`: the x title centred at `x_title_y`, the
/// y title turned upright along the left edge.
fn axis_titles(g: Group, (top, bottom, x_title_y): (f64, f64, f64), x: &str, y: &str) -> Group {
    let mid = (top + bottom) / 2.0;
    g.add(text((LEFT + RIGHT) / 2.0, x_title_y, 12.0, x).set("text-anchor", "middle"))
        .add(
            text(22.0, mid, 12.0, y)
                .set("text-anchor", "middle")
                .set("transform", format!("rotate(-90 22 {})", r(mid))),
        )
}

/// The field sheet of `rep`, with `snaps` the MMF at several instants of one period.
pub fn field_sheet(rep: &FieldReport, snaps: &[Snapshot]) -> String {
    let z = rep.slots as f64;
    let mut doc = Document::new()
        .set("data-made-by", super::export::MARK)
        .set("viewBox", (0, 0, WIDTH as i64, HEIGHT as i64))
        .set("width", WIDTH)
        .set("height", HEIGHT)
        .add(rect(0.0, 0.0, WIDTH, HEIGHT).set("fill", "white"));

    let defs = Definitions::new()
        .add(hatch("field-fwd-hatch", FORWARD, 45.0, false))
        .add(hatch("field-bwd-hatch", BACKWARD, -45.0, true))
        .add(
            Marker::new()
                .set("id", "field-arrow-head")
                .set("viewBox", "0 0 10 10")
                .set("refX", 9)
                .set("refY", 5)
                .set("markerWidth", 8)
                .set("markerHeight", 8)
                .set("orient", "auto")
                .add(
                    Path::new()
                        .set("d", "M0,0 L10,5 L0,10 z")
                        .set("fill", "#000000"),
                ),
        );
    doc = doc.add(defs);

    let heading = rep
        .title
        .clone()
        .unwrap_or_else(|| "Travelling field".to_string());
    let banner = match &rep.title {
        Some(t) => format!("Travelling field: {t}"),
        None => heading.clone(),
    };
    doc = doc.add(text(LEFT, 32.0, 20.0, &banner));

    // Panel 1: MMF snapshots.
    let (top, bottom) = (90.0, 330.0);
    let peak = snaps
        .iter()
        .flat_map(|s| s.points.iter().map(|p| p.mmf.abs()))
        .fold(0.0f64, f64::max)
        .max(1e-12);
    let xs = |x: f64| LEFT + (RIGHT - LEFT) * x / z.max(1.0);
    let ys = |v: f64| (top + bottom) / 2.0 - (bottom - top) / 2.0 * v / (peak * 1.1);
    let mut panel = Group::new();
    panel = panel.add(
        rect(LEFT, top, RIGHT - LEFT, bottom - top)
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", 1),
    );
    panel = panel.add(line(LEFT, ys(0.0), RIGHT, ys(0.0), "#777777", 0.8));
    let step = tick_step(peak * 1.1, 3.0);
    let mut v = -(peak * 1.1 / step).floor() * step;
    while v <= peak * 1.1 + 1e-9 {
        panel = panel
            .add(line(LEFT - 5.0, ys(v), LEFT, ys(v), "#000000", 1.0))
            .add(text(LEFT - 8.0, ys(v) + 4.0, 11.0, &num(v, 1)).set("text-anchor", "end"));
        v += step;
    }
    let every = (tick_step(z, 24.0).round() as usize).max(1);
    for s in 1..=rep.slots {
        if (s == 1 && every != 2) || s % every == 0 {
            let x = xs(s as f64 - 0.5);
            panel = panel
                .add(line(x, bottom, x, bottom + 5.0, "#000000", 1.0))
                .add(text(x, bottom + 18.0, 11.0, &s.to_string()).set("text-anchor", "middle"));
        }
    }
    panel = axis_titles(
        panel,
        (top, bottom, bottom + 34.0),
        "slot number along the gap",
        "MMF, ampere-turns",
    );
    let crests = unwrapped_crests(rep, snaps);
    for (i, s) in snaps.iter().enumerate() {
        let colour = PALETTE[i % PALETTE.len()];
        let dash = DASHES[i % DASHES.len()];
        let pts: Vec<String> = s
            .points
            .iter()
            .map(|p| format!("{},{}", r(xs(p.x)), r(ys(p.mmf))))
            .collect();
        let mut pl = Polyline::new()
            .set("points", pts.join(" "))
            .set("fill", "none")
            .set("stroke", colour)
            .set("stroke-width", 1.6);
        if dash != "none" {
            pl = pl.set("stroke-dasharray", dash);
        }
        panel = panel.add(pl);
        // Crest marker of the working wave, above the plot.
        let cx = xs(crests[i]);
        let tri = Data::new()
            .move_to((r(cx - 5.0), r(top - 14.0)))
            .line_to((r(cx + 5.0), r(top - 14.0)))
            .line_to((r(cx), r(top - 4.0)))
            .close();
        panel = panel.add(
            Path::new()
                .set("d", tri)
                .set("fill", colour)
                .set("stroke", "#000000")
                .set("stroke-width", 0.6),
        );
        // Legend entry.
        let lx = LEFT + 10.0 + (i % 6) as f64 * 140.0;
        let ly = 52.0 + (i / 6) as f64 * 14.0;
        let mut ll = line(lx, ly, lx + 30.0, ly, colour, 2.0);
        if dash != "none" {
            ll = ll.set("stroke-dasharray", dash);
        }
        panel = panel.add(ll).add(text(
            lx + 36.0,
            ly + 4.0,
            11.0,
            &format!("ωt = {}°", num(s.at_deg, 1)),
        ));
    }
    doc = doc.add(panel);

    // Arrow from the first crest to the last: the way and the distance the working wave
    // travels in the instants drawn; the speed in words below the plot.
    if let (Some(&first), Some(&last)) = (crests.first(), crests.last())
        && (last - first).abs() > 1e-9
    {
        doc = doc.add(
            line(xs(first), top - 20.0, xs(last), top - 20.0, "#000000", 1.6)
                .set("marker-end", "url(#field-arrow-head)"),
        );
    }
    for (i, l) in wrap(&speed_text(rep), 130).iter().enumerate() {
        doc = doc.add(text(LEFT, bottom + 52.0 + 15.0 * i as f64, 12.0, l));
    }

    // Panel 2: spectrum bars on a log scale from 1e-4 to 1.
    let (stop, sbot) = (440.0, 635.0);
    let floor = -4.0f64;
    let yl = |a: f64| {
        let l = a.max(1e-300).log10().clamp(floor, 0.0);
        sbot - (sbot - stop) * (l - floor) / (-floor)
    };
    let rows: Vec<_> = rep.rows.iter().take(MAX_BARS).collect();
    let mut chart = Group::new().add(
        rect(LEFT, stop, RIGHT - LEFT, sbot - stop)
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", 1),
    );
    for e in 0..=4 {
        let a = 10f64.powi(-e);
        chart = chart
            .add(line(LEFT, yl(a), RIGHT, yl(a), "#CCCCCC", 0.6))
            .add(text(LEFT - 8.0, yl(a) + 4.0, 11.0, &num(a, 4)).set("text-anchor", "end"));
    }
    let slot_w = (RIGHT - LEFT) / rows.len().max(1) as f64;
    let bar_w = (slot_w * 0.38).min(14.0);
    let label_every = (rows.len() / 20).max(1);
    for (i, row) in rows.iter().enumerate() {
        let cx = LEFT + slot_w * (i as f64 + 0.5);
        for (val, fill, stroke, dx) in [
            (row.forward, "url(#field-fwd-hatch)", FORWARD, -bar_w),
            (row.backward, "url(#field-bwd-hatch)", BACKWARD, 0.0),
        ] {
            if val > 10f64.powf(floor) {
                let y = yl(val);
                chart = chart.add(
                    rect(cx + dx, y, bar_w, sbot - y)
                        .set("fill", fill)
                        .set("stroke", stroke)
                        .set("stroke-width", 1),
                );
            }
        }
        if i % label_every == 0 {
            chart = chart.add(
                text(cx, sbot + 16.0, 10.0, &num(row.order.get(), 3)).set("text-anchor", "middle"),
            );
        }
    }
    chart = axis_titles(
        chart,
        (stop, sbot, sbot + 32.0),
        "electrical order ν (working wave = 1)",
        "amplitude / working wave",
    );
    // Legend.
    let lg = stop - 22.0;
    chart = chart
        .add(
            rect(LEFT, lg - 10.0, 22.0, 12.0)
                .set("fill", "url(#field-fwd-hatch)")
                .set("stroke", FORWARD),
        )
        .add(text(LEFT + 28.0, lg, 12.0, "forward wave (hatched /)"))
        .add(
            rect(LEFT + 240.0, lg - 10.0, 22.0, 12.0)
                .set("fill", "url(#field-bwd-hatch)")
                .set("stroke", BACKWARD),
        )
        .add(text(
            LEFT + 268.0,
            lg,
            12.0,
            "backward wave (cross-hatched)",
        ))
        .add(text(
            LEFT + 520.0,
            lg,
            12.0,
            &format!(
                "σ_d = {}   THD = {} %",
                num(rep.differential_leakage, 5),
                num(100.0 * rep.thd, 2)
            ),
        ));
    if rep.rows.len() > rows.len() {
        // Under the legend, right-aligned, so it never runs into the σ_d figure.
        chart = chart.add(
            text(
                RIGHT,
                lg + 16.0,
                11.0,
                &format!("lowest {} of {} orders shown", rows.len(), rep.rows.len()),
            )
            .set("text-anchor", "end"),
        );
    }
    doc = doc.add(chart);

    // Title block and caution.
    let (ty, th) = (690.0, 110.0);
    let mut block = Group::new().add(
        rect(LEFT, ty, RIGHT - LEFT, th)
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", 1.2),
    );
    let split = LEFT + 430.0;
    block = block.add(line(split, ty, split, ty + th, "#000000", 1.0));
    let kind = match rep.topology {
        Topology::Rotary => "rotary core",
        Topology::Linear => "linear primary",
    };
    // The block's left cell is 430 px wide: a long title is shortened there (it is given
    // in full above the plot).
    let short = if heading.chars().count() > 52 {
        format!("{}…", heading.chars().take(51).collect::<String>())
    } else {
        heading.clone()
    };
    let mut cells = vec![
        short,
        format!(
            "{kind}: {} slots, {} poles, {} phases",
            rep.slots, rep.poles, rep.phases
        ),
        format!(
            "span {}, {}, k_w1 = {}",
            rep.pitch,
            crate::numbering::count(rep.layers, "layer", "layers"),
            num(rep.winding_factor, 4)
        ),
        format!(
            "currents: {}",
            rep.currents
                .iter()
                .map(|c| format!(
                    "{} {}@{}°",
                    c.phase,
                    num(c.magnitude, 3),
                    num(c.angle_deg, 1)
                ))
                .join(", ")
        ),
    ];
    if let Some(l) = &rep.linear {
        cells.push(format!(
            "at π/τ: backward {}, pulsating {} (of forward)",
            num(l.backward_wave, 4),
            num(l.pulsating, 4)
        ));
    }
    for (i, c) in cells.iter().enumerate() {
        let size = if i == 0 { 13.0 } else { 11.5 };
        block = block.add(text(LEFT + 10.0, ty + 20.0 + i as f64 * 18.0, size, c));
    }
    for (i, l) in wrap(rep.caution, 68).iter().enumerate() {
        block = block.add(text(split + 10.0, ty + 20.0 + i as f64 * 16.0, 11.5, l));
    }
    doc = doc.add(block);
    let mut s = doc.to_string();
    s.push('\n');
    s
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::field::{FieldOptions, field, snapshots};

    fn wind(src: &str) -> crate::winding::Winding {
        let spec = crate::layout::parse(src, "test").expect("test layout parses");
        crate::winding::build(&spec).expect("test winding builds")
    }

    #[test]
    fn sheet_draws_with_patterns_and_caution() {
        let w = wind(include_str!("../../layouts/pallet-shuttle.toml"));
        let mut o = FieldOptions::balanced(&w);
        o.slip = Some(0.1);
        let r = field(&w, &o).unwrap();
        let s = field_sheet(&r, &snapshots(&w, &o, 6).unwrap());
        assert!(s.starts_with("<svg"));
        assert!(s.contains("fwd-hatch") && s.contains("bwd-hatch"));
        assert!(s.contains("CAUTION"));
        assert!(s.contains("7.2\u{a0}m/s; secondary 6.48\u{a0}m/s at slip 0.1"));
        assert_eq!(s.matches("<polyline").count(), 6);
    }
}
