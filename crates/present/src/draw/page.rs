//! Paper: sizes, orientation, the drawing frame and the free area inside it.
//!
//! Sheets are drawn in millimetres (one SVG user unit = 1 mm), so a sheet printed at 100 %
//! has the text heights we chose. Sizes: ISO 216 A4 210 × 297 mm and A3 297 × 420 mm;
//! US Letter 8.5 × 11 in = 215.9 × 279.4 mm (ANSI/ASME Y14.1).

use svg::node::element::{Group, Line, Rectangle};
use svg::{Document, Node};

use super::text::{FONT_FAMILY, r};
use super::title::TitleBlock;

/// Paper size.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum PaperSize {
    /// ISO 216 A4, 210 × 297 mm.
    #[default]
    A4,
    /// ISO 216 A3, 297 × 420 mm.
    A3,
    /// US Letter, 215.9 × 279.4 mm.
    Letter,
}

/// Which way up the paper lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Orientation {
    /// Long side horizontal (the default: a core unrolls sideways).
    #[default]
    Landscape,
    /// Long side vertical.
    Portrait,
}

/// A sheet of paper.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Page {
    /// Size.
    pub size: PaperSize,
    /// Orientation.
    pub orientation: Orientation,
}

/// Margin between paper edge and drawing frame, mm (ISO 5457 asks at least 10 mm).
pub const MARGIN: f64 = 10.0;
/// Gap between the frame and the drawing inside it, mm.
pub const PAD: f64 = 4.0;

impl Page {
    /// Width and height in mm as the sheet lies.
    pub fn size_mm(&self) -> (f64, f64) {
        let (short, long) = match self.size {
            PaperSize::A4 => (210.0, 297.0),
            PaperSize::A3 => (297.0, 420.0),
            PaperSize::Letter => (215.9, 279.4),
        };
        match self.orientation {
            Orientation::Landscape => (long, short),
            Orientation::Portrait => (short, long),
        }
    }
}

/// An axis-aligned rectangle in mm.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rect {
    /// Left.
    pub x: f64,
    /// Top.
    pub y: f64,
    /// Width.
    pub w: f64,
    /// Height.
    pub h: f64,
}

impl Rect {
    /// Right edge.
    pub fn right(&self) -> f64 {
        self.x + self.w
    }
    /// Bottom edge.
    pub fn bottom(&self) -> f64 {
        self.y + self.h
    }
}

/// One sheet being drawn: paper, frame, title block and caution already in place; the
/// sheet's own drawing goes into `area`.
pub struct Canvas {
    doc: Document,
    /// Free drawing area inside the frame, above the title block.
    pub area: Rect,
}

impl Canvas {
    /// A blank sheet with frame, title block and caution.
    pub fn new(page: &Page, block: &TitleBlock) -> Self {
        let (w, h) = page.size_mm();
        let frame = Rect {
            x: MARGIN,
            y: MARGIN,
            w: w - 2.0 * MARGIN,
            h: h - 2.0 * MARGIN,
        };
        let (band, band_h) = block.draw(frame);
        let doc = Document::new()
            .set("width", format!("{}mm", r(w)))
            .set("height", format!("{}mm", r(h)))
            .set("viewBox", (0, 0, r(w), r(h)))
            .set("font-family", FONT_FAMILY)
            // Labelled for readers wherever it is shown, on its own or inside a page.
            .set("role", "img")
            .set("aria-label", super::text::clean(&block.document_title()))
            // Marks the file as ours: only such pages are ever removed as stale.
            .set("data-made-by", super::export::MARK)
            .add(svg::node::element::Title::new(super::text::clean(
                &block.document_title(),
            )))
            .add(
                Rectangle::new()
                    .set("width", r(w))
                    .set("height", r(h))
                    .set("fill", "#FFFFFF"),
            )
            .add(
                Rectangle::new()
                    .set("class", "frame")
                    .set("x", frame.x)
                    .set("y", frame.y)
                    .set("width", r(frame.w))
                    .set("height", r(frame.h))
                    .set("fill", "none")
                    .set("stroke", "#000000")
                    .set("stroke-width", 0.5),
            )
            .add(band);
        let mut area = Rect {
            x: frame.x + PAD,
            y: frame.y + PAD,
            w: frame.w - 2.0 * PAD,
            h: frame.h - band_h - 2.0 * PAD,
        };
        let mut doc = doc;
        if let Some(why) = &block.unsound {
            // A banner across the top of every sheet drawn from an unsound winding.
            let size = 3.5;
            let lines = super::text::wrap(why, size, area.w - 6.0);
            let h = lines.len() as f64 * (size + 1.2) + 3.0;
            let mut g = svg::node::element::Group::new()
                .set("class", "unsound-banner")
                .add(
                    Rectangle::new()
                        .set("x", r(area.x))
                        .set("y", r(area.y))
                        .set("width", r(area.w))
                        .set("height", r(h))
                        .set("fill", "#FFFFFF")
                        .set("stroke", "#000000")
                        .set("stroke-width", 1.0),
                );
            for (i, l) in lines.iter().enumerate() {
                g = g.add(super::text::label(
                    area.x + 3.0,
                    area.y + 1.5 + size + i as f64 * (size + 1.2),
                    size,
                    super::text::Anchor::Start,
                    l,
                ));
            }
            doc = doc.add(g);
            area.y += h + 2.0;
            area.h -= h + 2.0;
        }
        Canvas { doc, area }
    }

    /// Add a drawing element.
    pub fn add(&mut self, node: Group) {
        self.doc.append(node);
    }

    /// The finished SVG text.
    pub fn finish(self) -> String {
        self.doc.to_string()
    }
}

/// A black straight line of the given width (mm): frames, rules and table lines.
pub(super) fn rule(x1: f64, y1: f64, x2: f64, y2: f64, width: f64) -> Line {
    Line::new()
        .set("x1", r(x1))
        .set("y1", r(y1))
        .set("x2", r(x2))
        .set("y2", r(y2))
        .set("stroke", "#000000")
        .set("stroke-width", width)
}
