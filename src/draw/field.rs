//! The travelling-field sheet: the field analysis' own plot (MMF snapshots over one period,
//! the arrow and speed of travel, the spectrum with forward and backward bars hatched
//! apart) placed on the shared page with frame, title block and caution.

use svg::node::Blob;
use svg::node::element::{Group, Text};

use super::page::{Canvas, Page};
use super::text::clean;
use super::title::TitleBlock;
use crate::field::{self, FieldOptions};
use crate::winding::Winding;

/// Snapshots drawn across one period.
const SNAPSHOTS: usize = 6;

/// Draw the field sheet for balanced positive-sequence currents.
pub fn draw(w: &Winding, page: &Page) -> String {
    let mut canvas = Canvas::new(page, &TitleBlock::of(w, "Travelling field"));
    let a = canvas.area;
    let opts = FieldOptions::balanced(w);
    let plot = field::field(w, &opts)
        .and_then(|rep| field::snapshots(w, &opts, SNAPSHOTS).map(|s| (rep, s)));
    let group = match plot {
        Ok((mut rep, snaps)) => {
            // User text goes on the sheet without control characters.
            rep.title = rep.title.as_deref().map(clean);
            for c in &mut rep.currents {
                c.phase = clean(&c.phase);
            }
            let sheet = super::field_chart::field_sheet(&rep, &snaps);
            Group::new()
                .set("class", "field-plot")
                .add(Blob::new(nest(&sheet, a.x, a.y, a.w, a.h)))
        }
        Err(e) => Group::new().add(
            Text::new(format!("No travelling field to draw: {e}"))
                .set("x", a.x)
                .set("y", a.y + 10.0)
                .set("font-size", 4.0),
        ),
    };
    canvas.add(group);
    canvas.finish()
}

/// Turn a standalone SVG document into a nested `<svg>` placed in the given box (mm),
/// keeping its view box and aspect ratio.
fn nest(doc: &str, x: f64, y: f64, w: f64, h: f64) -> String {
    let body = doc.trim_start();
    let body = match body.strip_prefix("<?xml") {
        Some(rest) => rest
            .split_once("?>")
            .map(|(_, b)| b.trim_start())
            .unwrap_or(rest),
        None => body,
    };
    let Some((open, rest)) = body.split_once('>') else {
        return String::new();
    };
    let view_box = open
        .split("viewBox=\"")
        .nth(1)
        .and_then(|v| v.split('"').next())
        .unwrap_or("0 0 1000 1000");
    let inner = rest.trim_end().strip_suffix("</svg>").unwrap_or(rest);
    format!(
        "<svg x=\"{x:.2}\" y=\"{y:.2}\" width=\"{w:.2}\" height=\"{h:.2}\" \
         viewBox=\"{view_box}\" preserveAspectRatio=\"xMidYMid meet\">{inner}</svg>"
    )
}
