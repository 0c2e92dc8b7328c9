//! The title block and the safety caution along the foot of every sheet.
//!
//! Placed bottom right as ISO 7200 places title blocks; the caution (`plan::CAUTION`) sits
//! to its left on wide sheets and above it on narrow ones.

use svg::node::element::{Group, Rectangle};

use super::page::{Rect, rule};
use super::text::{self, Anchor, label, r};
use crate::output::num;
use crate::safety::CAUTION;
use crate::study::Soundness;
use crate::winding::{Style, Winding};

/// Everything the title block shows.
#[derive(Debug, Clone, PartialEq)]
pub struct TitleBlock {
    /// Free text title of the layout (user text).
    pub title: String,
    /// Sheet name, e.g. "Slot layout".
    pub sheet: String,
    /// Page number and page count of this sheet, from 1.
    pub page: (usize, usize),
    /// Labelled values: slots, poles, span, layers, turns, paths, connection, k_w1, tool.
    pub fields: Vec<(&'static str, String)>,
    /// Why the winding is not sound, for a banner across the sheet; `None` when it is.
    pub unsound: Option<String>,
    /// Job and nameplate cells (job, customer, date, rating, frame), a row of their own
    /// above the title when the layout gives any.
    pub shop: Vec<(&'static str, String)>,
    /// What the caption ids carry besides the sheet and page (`draw::id_scope`).
    pub scope: String,
}

const LABEL: f64 = 1.8;
const VALUE: f64 = 2.8;
const ROW: f64 = 9.0;
const BLOCK_W: f64 = 180.0;
const CAUTION_SIZE: f64 = 2.5;
const CAUTION_LINE: f64 = 3.1;

impl TitleBlock {
    /// The block of a winding's sheet.
    pub fn of(s: &crate::study::Study, sheet: &str) -> Self {
        let w = s.winding();
        // The shared design header (the same facts every report opens with).
        let h = s.header();
        let span = match h.style {
            Style::Concentric => format!("{} (mean)", h.pitch),
            Style::Lap => format!("{}", h.pitch),
        };
        let unsound = match s.sound() {
            Soundness::Unbalanced => Some(
                "NOT A SOUND WINDING: the phases are unbalanced. Do not wind or connect from this \
                 sheet; run beltwright audit on the record first."
                    .to_string(),
            ),
            Soundness::Findings => Some(
                "NOT A SOUND WINDING: the audit of this coil list has findings. Do not wind or \
                 connect from this sheet; see beltwright audit."
                    .to_string(),
            ),
            Soundness::Pair => Some(
                "NOT A SOUND WINDING: the two windings of this core have findings between \
                 them. Do not wind or connect from this sheet; see the two windings' sheet."
                    .to_string(),
            ),
            Soundness::Sound => None,
        };
        TitleBlock {
            unsound,
            shop: shop_cells(w),
            title: h.title.clone().unwrap_or_else(|| {
                format!("{} core, {} slots, {} poles", h.topology, h.slots, h.poles)
            }),
            sheet: sheet.to_string(),
            page: (1, 1),
            scope: super::id_scope(w),
            fields: vec![
                ("Slots Z", h.slots.to_string()),
                (
                    "Poles 2p",
                    match h.pole_change {
                        Some(_) => format!("{}/{}", 2 * h.poles, h.poles),
                        None => h.poles.to_string(),
                    },
                ),
                (
                    "Span y",
                    // A single-phase stator's concentric groups: their spans, outermost first.
                    match s.single_phase() {
                        Some(sp) => sp
                            .main
                            .spans
                            .iter()
                            .map(|y| y.to_string())
                            .collect::<Vec<_>>()
                            .join("/"),
                        None => span,
                    },
                ),
                ("Layers", h.layers.to_string()),
                (
                    "Turns/coil",
                    if s.single_phase().is_some() {
                        "graded".into()
                    } else if h.mixed_turns.is_empty() {
                        h.turns_per_coil.to_string()
                    } else {
                        format!(
                            "{}-{} mixed",
                            h.mixed_turns.first().copied().unwrap_or(0),
                            h.mixed_turns.last().copied().unwrap_or(0)
                        )
                    },
                ),
                (
                    "Paths a",
                    // A pole-changing winding: one path at the lower speed, its halves in
                    // parallel (double star) at the higher.
                    match h.pole_change {
                        Some(_) => "1/2".into(),
                        None => h.parallel_paths.to_string(),
                    },
                ),
                (
                    "Connection",
                    match h.pole_change {
                        Some(crate::design::PoleChange::DeltaDoubleStar) => "delta/YY".into(),
                        Some(crate::design::PoleChange::StarDoubleStar) => "star/YY".into(),
                        None if s.single_phase().is_some() => "1-phase".into(),
                        None => h.connection.to_string(),
                    },
                ),
                ("k_w1", num(h.winding_factor, 4)),
                ("Tool", format!("beltwright {}", env!("CARGO_PKG_VERSION"))),
            ],
        }
    }

    /// The block of a two-winding core's own sheet: each field gives both windings'
    /// values, the first's first ("4/12" poles), and the shop's cells are the first's.
    pub fn of_pair(t: &crate::two_winding::TwoStudy, title: Option<&str>, sheet: &str) -> Self {
        let [a, b] = t.studies().each_ref().map(|s| TitleBlock::of(s, sheet));
        let both = |name: &str| -> String {
            let get = |blk: &TitleBlock| {
                blk.fields
                    .iter()
                    .find(|f| f.0 == name)
                    .map(|f| f.1.clone())
                    .unwrap_or_default()
            };
            let (x, y) = (get(&a), get(&b));
            if x == y { x } else { format!("{x}/{y}") }
        };
        let fields = a
            .fields
            .iter()
            .map(|(name, _)| (*name, both(name)))
            .collect();
        let unsound = (!t.report().findings.is_empty()).then(|| {
            "NOT A SOUND PAIR OF WINDINGS: see what to act on. Do not wind or connect from \
             these sheets until it is cleared."
                .to_string()
        });
        // Each winding's rating where the two differ.
        let shop = a
            .shop
            .iter()
            .zip(&b.shop)
            .map(|((name, x), (_, y))| match *name {
                "Rating" if x != y && y != "-" => (*name, format!("{x} / {y}")),
                _ => (*name, x.clone()),
            })
            .collect();
        TitleBlock {
            title: title
                .map(str::to_string)
                .unwrap_or_else(|| format!("rotary core, {} slots, two windings", both("Slots Z"))),
            sheet: sheet.to_string(),
            page: (1, 1),
            fields,
            unsound,
            shop,
            scope: String::new(),
        }
    }

    /// The SVG document title: layout title and sheet.
    pub fn document_title(&self) -> String {
        format!("{} - {}", self.title, self.sheet)
    }

    /// Draw the block and caution inside `frame`, along its foot. Returns the group and the
    /// height taken from the frame.
    pub fn draw(&self, frame: Rect) -> (Group, f64) {
        let scope = format!(
            "{}-{}{}",
            crate::sanitize::slug(&self.sheet),
            self.page.0,
            self.scope
        );
        let bw = BLOCK_W.min(frame.w);
        let bx = frame.right() - bw;
        let rows = if self.shop.is_empty() { 2.0 } else { 3.0 };
        let block_h = rows * ROW;
        let beside = frame.w - bw >= 80.0;
        let caution_w = if beside { frame.w - bw } else { frame.w };
        let lines = text::wrap(CAUTION, CAUTION_SIZE, caution_w - 4.0);
        let caution_h = if beside {
            block_h
        } else {
            lines.len() as f64 * CAUTION_LINE + 2.4
        };
        let total = if beside { block_h } else { block_h + caution_h };
        let top = frame.bottom() - total;
        let mut g = Group::new().set("class", "title-block");
        g = g.add(rule(frame.x, top, frame.right(), top, 0.5));
        // Row 0: the shop's job and the nameplate, when given.
        let shop_y = frame.bottom() - block_h;
        if !self.shop.is_empty() {
            let bx = frame.right() - bw;
            // Widths: job, customer, date, rating (widest), frame.
            let weights = [1.0, 1.4, 1.0, 2.0, 0.8];
            let total_w: f64 = weights.iter().take(self.shop.len()).sum();
            let unit = bw / total_w;
            g = g.add(rule(bx, shop_y, bx, shop_y + ROW, 0.5));
            g = g.add(rule(bx, shop_y + ROW, frame.right(), shop_y + ROW, 0.25));
            if !beside {
                g = g.add(rule(frame.x, shop_y, frame.right(), shop_y, 0.5));
            }
            let mut x = bx;
            for (i, (name, value)) in self.shop.iter().enumerate() {
                let cw = unit * weights.get(i).copied().unwrap_or(1.0);
                if i > 0 {
                    g = g.add(rule(x, shop_y, x, shop_y + ROW, 0.25));
                }
                g = g.add(cell(x, shop_y, cw, name, value, "shop", &scope));
                x += cw;
            }
        }
        let by = frame.bottom() - 2.0 * ROW;
        // Row 1: title and sheet.
        let sheet_w = bw * 0.3;
        let title_w = bw - sheet_w;
        g = g.add(rule(bx, by, bx, frame.bottom(), 0.5));
        g = g.add(rule(bx, by + ROW, frame.right(), by + ROW, 0.25));
        g = g.add(rule(bx + title_w, by, bx + title_w, by + ROW, 0.25));
        if !beside && self.shop.is_empty() {
            g = g.add(rule(frame.x, by, frame.right(), by, 0.5));
        }
        if !self.shop.is_empty() {
            g = g.add(rule(bx, by, frame.right(), by, 0.25));
        }
        g = g.add(cell(bx, by, title_w, "Title", &self.title, "title", &scope));
        let sheet = if self.page.1 > 1 {
            format!("{} ({} of {})", self.sheet, self.page.0, self.page.1)
        } else {
            self.sheet.clone()
        };
        g = g.add(cell(
            bx + title_w,
            by,
            sheet_w,
            "Sheet",
            &sheet,
            "sheet",
            &scope,
        ));
        // Row 2: the figures, the tool cell twice as wide.
        let n = self.fields.len() as f64 + 1.0;
        let unit = bw / n;
        let mut x = bx;
        for (i, (name, value)) in self.fields.iter().enumerate() {
            let cw = if i + 1 == self.fields.len() {
                2.0 * unit
            } else {
                unit
            };
            if i > 0 {
                g = g.add(rule(x, by + ROW, x, frame.bottom(), 0.25));
            }
            g = g.add(cell(x, by + ROW, cw, name, value, "field", &scope));
            x += cw;
        }
        // Caution.
        let (cx, cy) = if beside {
            (frame.x, frame.bottom() - block_h)
        } else {
            (frame.x, top)
        };
        let mut c = Group::new().set("class", "caution").add(
            Rectangle::new()
                .set("x", r(cx + 0.8))
                .set("y", r(cy + 0.8))
                .set("width", r(caution_w - 1.6))
                .set("height", r(caution_h - 1.6))
                .set("fill", "none")
                .set("stroke", "#000000")
                .set("stroke-width", 0.6),
        );
        let text_h = lines.len() as f64 * CAUTION_LINE;
        let mut y = cy + (caution_h - text_h) / 2.0 + CAUTION_SIZE;
        for line in &lines {
            c = c.add(label(cx + 2.0, y, CAUTION_SIZE, Anchor::Start, line));
            y += CAUTION_LINE;
        }
        (g.add(c), total)
    }
}

/// The job and nameplate cells of the title block (empty without `[job]` and
/// `[nameplate]`).
fn shop_cells(w: &Winding) -> Vec<(&'static str, String)> {
    let (job, plate) = (w.design.job.as_ref(), w.design.nameplate.as_ref());
    if job.is_none() && plate.is_none() {
        return Vec::new();
    }
    let dash = || "-".to_string();
    let rating = plate.map_or_else(dash, |n| {
        let mut parts = crate::output::rating_words(n, false);
        if let Some(r) = n.speed_rpm {
            parts.push(format!("{} rpm", num(r, 0)));
        }
        if parts.is_empty() {
            dash()
        } else {
            parts.join(", ")
        }
    });
    vec![
        (
            "Job",
            job.and_then(|j| j.number.clone()).unwrap_or_else(dash),
        ),
        (
            "Customer",
            job.and_then(|j| j.customer.clone()).unwrap_or_else(dash),
        ),
        (
            "Date",
            job.and_then(|j| j.date.clone()).unwrap_or_else(dash),
        ),
        ("Rating", rating),
        (
            "Frame",
            plate.and_then(|n| n.frame.clone()).unwrap_or_else(dash),
        ),
    ]
}

/// Id of a caption text (the one kind of text allowed under 2.5 mm, at 1.8 mm), unique to
/// its sheet and page (`scope`) so that sheets set side by side (the HTML page) never share
/// an id.
fn caption_id(scope: &str, name: &str) -> String {
    let slug = crate::sanitize::slug(name);
    format!("caption-{scope}-{slug}")
}

/// A labelled cell: small caption on top, value below, both cut to the cell width.
fn cell(x: f64, y: f64, w: f64, name: &str, value: &str, class: &str, scope: &str) -> Group {
    let inner = w - 2.0;
    let mut size = VALUE;
    // Values shrink to fit, but never below the 2.5 mm a drawing's text needs (ISO 3098);
    // beyond that they are cut with an ellipsis.
    while text::width(value, size) > inner && size > 2.5 {
        size -= 0.2;
    }
    Group::new()
        .set("class", class)
        .add(
            label(x + 1.0, y + 2.4, LABEL, Anchor::Start, name)
                .set("fill", "#444444")
                .set("id", caption_id(scope, name)),
        )
        .add(label(
            x + 1.0,
            y + 7.4,
            size,
            Anchor::Start,
            &text::fit(value, size, inner),
        ))
}
