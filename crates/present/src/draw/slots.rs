//! The slot sheet: the core unrolled flat (developed winding diagram).
//!
//! Each slot is a strip with one column per layer (left: top layer at the gap, right: bottom
//! layer), tinted with the phase of the side it holds, marked with the phase letter and an
//! arrow for the current direction (down at the go side where current enters, up at the
//! back side). Each coil is one line from its go side over the far-end overhang to its back
//! side, in its phase's colour and dash pattern. Coil groups are bracketed above the slot
//! numbers. Large cores wrap onto several rows; the slot pitch on paper is capped so small
//! cores are not blown up.

use svg::node::element::path::Data;
use svg::node::element::{ClipPath, Definitions, Group, Line, Path, Polygon, Rectangle};

use super::page::{Canvas, Page, Rect};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::output::num;
use crate::winding::{Topology, Winding, coil_groups};

/// Largest slot pitch on paper, mm: a small core spreads over the page without its
/// slots turning into boxes.
const MAX_PITCH: f64 = 18.0;
/// Slot pitch on paper we try first to keep, mm.
const GOOD_PITCH: f64 = 6.0;
/// Smallest slot pitch on paper, mm: below it the letters and numbers no longer fit at
/// 2.5 mm, so a larger core goes on more pages instead of shrinking.
const MIN_PITCH: f64 = 4.0;
/// Smallest text on the sheet, mm (ISO 3098 lettering; common drafting practice).
const MIN_TEXT: f64 = 2.5;
const HEADER: f64 = 19.0;
const BRACKET: f64 = 5.2;
const ROW_GAP: f64 = 3.0;

/// Sizes of one layout choice.
#[derive(Debug, Clone, Copy)]
struct Grid {
    pitch: f64,
    per_row: usize,
    rows: usize,
    num_size: f64,
    stagger: bool,
    slot_h: f64,
    depth_max: f64,
    span_max: f64,
    coil_labels: bool,
    coil_size: f64,
    /// Height of the lead-end band (jumpers and leads above the slots), mm; 0 when the core
    /// takes more than one row.
    lead_band: f64,
}

/// Height of one jumper lane at the lead end, mm.
const LANE: f64 = 3.2;

impl Grid {
    /// The layout of the slots: a pitch no smaller than [`MIN_PITCH`], rows of it, and the
    /// rows a page holds (more pages for a large core; text never shrinks below 2.5 mm).
    fn choose(w: &Winding, area: Rect) -> (Grid, usize) {
        let z = w.geometry.slots;
        let span_max = w
            .coils
            .iter()
            .map(|c| w.span(c).unsigned_abs())
            .max()
            .unwrap_or(1) as f64;
        let avail_h = area.h - HEADER;
        let make = |rows: usize, p: f64| {
            let per_row = z.div_ceil(rows);
            let mut g = Grid::at(p, per_row, rows, z, span_max);
            if rows == 1 {
                let lanes = w.geometry.phases * w.parallel_paths.max(1);
                g.lead_band = lanes as f64 * LANE + 3.0 * MIN_TEXT + 5.0;
            }
            // Spend spare height on steeper overhangs and taller slots, within limits.
            let spare = avail_h / rows as f64 - g.row_h();
            if spare > 0.0 {
                // Use the page: deeper far-end overhangs (easier to trace) and taller slots.
                let want = (0.6 * span_max * p).clamp(3.0, 40.0);
                let extra = (want - g.depth_max).clamp(0.0, spare * 0.6);
                g.depth_max += extra;
                g.slot_h = (g.slot_h + (spare - extra) * 0.4).min(30.0);
            }
            g
        };
        // Fewest rows at a comfortable pitch.
        for rows in 1..=z {
            let p = (area.w / z.div_ceil(rows) as f64).min(MAX_PITCH);
            if p < GOOD_PITCH {
                continue;
            }
            let g = make(rows, p);
            if g.height() <= avail_h {
                return (g, rows);
            }
            if rows > 1 && p >= MAX_PITCH {
                break;
            }
        }
        // Otherwise the largest pitch that fits the height, down to the smallest pitch;
        // what still does not fit goes on further pages.
        let mut p = GOOD_PITCH;
        loop {
            let fit_row = ((area.w / p).floor() as usize).max(1);
            let rows = z.div_ceil(fit_row);
            // Balanced rows may leave width over: widen the pitch if the height allows.
            let wide = make(rows, (area.w / z.div_ceil(rows) as f64).min(GOOD_PITCH));
            if wide.height() <= avail_h {
                return (wide, rows);
            }
            let g = make(rows, p);
            if g.height() <= avail_h {
                return (g, rows);
            }
            if p <= MIN_PITCH {
                let per_page = ((avail_h / g.row_h()).floor() as usize).max(1);
                return (g, per_page);
            }
            p -= 0.25;
        }
    }

    fn at(pitch: f64, per_row: usize, rows: usize, z: usize, span_max: f64) -> Grid {
        let digits = z.to_string();
        let num_size = (0.5 * pitch).clamp(MIN_TEXT, 3.0);
        // Numbers too wide for one pitch alternate between two lines.
        let stagger = text::width(&digits, num_size) > 0.8 * pitch;
        let coil_digits = (2 * z).to_string();
        Grid {
            pitch,
            per_row,
            rows,
            num_size,
            stagger,
            slot_h: (2.4 * pitch).clamp(8.0, 14.0),
            depth_max: (0.3 * span_max * pitch).clamp(3.0, 8.0),
            span_max: span_max.max(1.0),
            coil_labels: text::width(&coil_digits, MIN_TEXT) < 0.8 * pitch,
            coil_size: MIN_TEXT,
            lead_band: 0.0,
        }
    }

    fn num_band(&self) -> f64 {
        self.num_size * if self.stagger { 2.1 } else { 1.0 } + 1.0
    }

    fn row_h(&self) -> f64 {
        self.lead_band
            + BRACKET
            + self.num_band()
            + self.slot_h
            + self.depth_max
            + if self.coil_labels {
                self.coil_size + 0.9
            } else {
                0.4
            }
            + ROW_GAP
    }

    fn height(&self) -> f64 {
        self.rows as f64 * self.row_h()
    }
}

/// Draw the slot sheet: one page, or as many as a large core needs at 2.5 mm text.
pub fn draw(s: &crate::study::Study, page: &Page) -> Vec<String> {
    let w = s.winding();
    let probe = Canvas::new(page, &TitleBlock::of(s, "Slot layout"));
    let area = probe.area;
    let pal = Palette::new(w.geometry.phases, w.labels.colours.as_deref());
    // A closed core keeps room at the right for the "→ 1" that says slot Z meets slot 1.
    let room = if w.geometry.topology == Topology::Rotary {
        6.0
    } else {
        0.0
    };
    let (grid, per_page) = Grid::choose(
        w,
        Rect {
            w: area.w - room,
            ..area
        },
    );
    let pages = grid.rows.div_ceil(per_page).max(1);
    (0..pages)
        .map(|k| {
            let mut block = TitleBlock::of(s, "Slot layout");
            block.page = (k + 1, pages);
            let mut canvas = Canvas::new(page, &block);
            canvas.add(header(w, s.single_phase(), s.plan(), &pal, area));
            let first = k * per_page;
            let body = Group::new()
                .set("class", "core")
                .set(
                    "transform",
                    format!("translate({} {})", r(area.x), r(area.y + HEADER)),
                )
                .add(rows(
                    w,
                    &pal,
                    &grid,
                    first..(first + per_page).min(grid.rows),
                ));
            canvas.add(body);
            canvas.finish()
        })
        .collect()
}

/// Legend, travelling-field arrow, counts and leads across the top of the sheet; a banner
/// when the winding is not sound.
fn header(
    w: &Winding,
    single: Option<&crate::single_phase::SinglePhaseReport>,
    plan: &crate::plan::PlanReport,
    pal: &Palette,
    area: Rect,
) -> Group {
    let mut g = Group::new().set("class", "legend");
    let mut x = area.x;
    let y = area.y + 3.0;
    for k in 0..w.geometry.phases {
        g = g.add(phase_line(pal, k, x, y - 0.8, x + 9.0, y - 0.8, 0.45));
        let name = w.label(k);
        g = g.add(label(x + 10.0, y, MIN_TEXT, Anchor::Start, name));
        x += 12.0 + text::width(name, MIN_TEXT);
    }
    // (A single-phase stator's empty layers are noted on the counts line below.)
    let empty = if single.is_some() || w.half_filled_slots().is_empty() {
        ""
    } else {
        "  Crossed column: empty layer (half-filled end slot)."
    };
    let notes = if tooth_coils(w) {
        "Tooth coils: each coil surrounds one tooth.  \u{2193} go side: current enters.  \
         \u{2191} back side.  Top: lead end; bottom: far end, each coil's number under its end."
    } else if w.geometry.layers == 2
        && w.design.leads.speed != 0
        && w.design.alternate_slots.is_none()
    {
        // One of two windings in the slots: its layers lie within its own share.
        "Left column: this winding's upper layer; right: its lower layer.  \u{2193} go side: \
         current enters.  \u{2191} back side.  Top: lead end; bottom: far end, each coil's number under its end."
    } else if w.geometry.layers == 2 {
        "Left column: top layer (at the gap); right: bottom layer.  \u{2193} go side: current \
         enters.  \u{2191} back side.  Top: lead end; bottom: far end, each coil's number under its end."
    } else {
        "\u{2193} go side: current enters.  \u{2191} back side.  Top: lead end; bottom: far end, each coil's number under its end."
    };
    let notes = format!("{notes}{empty}");
    g = g.add(label(
        x + 2.0,
        y,
        MIN_TEXT,
        Anchor::Start,
        &text::fit(&notes, MIN_TEXT, area.right() - x - 2.0),
    ));
    // Travelling field.
    let y2 = area.y + 8.5;
    // Towards higher slot numbers with the phases supplied in label order: the plan's
    // sequence (phase 2 lagging phase 1 lies further along, so the field moves forward).
    let dir = (w.geometry.phases >= 2)
        .then_some(plan.sequence)
        .flatten()
        .map(|q| q == crate::winding::star::Sequence::Positive);
    let figures = &plan.figures;
    let sequence: Vec<&str> = (0..w.geometry.phases).map(|k| w.label(k)).collect();
    let what = match w.geometry.topology {
        Topology::Linear => "Travelling field",
        Topology::Rotary => "Rotating field",
    };
    let speed = match (w.geometry.topology, figures.synchronous_speed_m_s) {
        (Topology::Linear, Some(v)) => format!(
            "v_s = 2\u{b7}f\u{b7}\u{3c4} = {} m/s (f = {} Hz, \u{3c4} = {} mm)",
            num(v, 3),
            num(w.design.supply.frequency_hz.unwrap_or(0.0), 2),
            num(
                crate::units::Length::from_m(figures.pole_pitch_m.unwrap_or(0.0)).mm(),
                2
            )
        ),
        (Topology::Rotary, _) if figures.synchronous_speed_rpm.is_some() => format!(
            "n_s = 120\u{b7}f/2p = {} rpm",
            num(figures.synchronous_speed_rpm.unwrap_or(0.0), 1)
        ),
        _ => "speed: give [core] sizes and [supply] frequency_hz".to_string(),
    };
    // A single-phase stator's field turns as its lead table says (the auxiliary's
    // current leading, through the capacitor), not by a supply sequence.
    let dir = single.map_or(dir, |sp| Some(sp.towards_rising_slots));
    let (text_dir, arrow) = match dir {
        Some(true) => ("towards higher slot numbers", Some(true)),
        Some(false) => ("towards lower slot numbers", Some(false)),
        None => ("direction unclear: the phases are not balanced", None),
    };
    let caption = match single {
        Some(_) => format!(
            "{what}, leads as the connection sheet's first table (the capacitor in the \
             auxiliary): {text_dir}; {speed}"
        ),
        None => format!(
            "{what}, supply sequence {}: {text_dir}; {speed}",
            sequence.join("-")
        ),
    };
    let ax = area.x;
    if let Some(forward) = arrow {
        let (x1, x2) = if forward {
            (ax, ax + 22.0)
        } else {
            (ax + 22.0, ax)
        };
        let tip = if forward { -1.0 } else { 1.0 };
        g = g.add(
            Group::new()
                .set("class", "field-arrow")
                .set(
                    "data-direction",
                    if forward { "forward" } else { "backward" },
                )
                .add(
                    Line::new()
                        .set("x1", r(x1))
                        .set("y1", r(y2 - 0.8))
                        .set("x2", r(x2 + tip * 2.0))
                        .set("y2", r(y2 - 0.8))
                        .set("stroke", "#000000")
                        .set("stroke-width", 0.6),
                )
                .add(Polygon::new().set("fill", "#000000").set(
                    "points",
                    format!(
                        "{},{} {},{} {},{}",
                        r(x2),
                        r(y2 - 0.8),
                        r(x2 + tip * 2.6),
                        r(y2 - 2.0),
                        r(x2 + tip * 2.6),
                        r(y2 + 0.4)
                    ),
                )),
        );
    }
    g = g.add(label(
        ax + 25.0,
        y2,
        MIN_TEXT,
        Anchor::Start,
        &text::fit(&caption, MIN_TEXT, area.w - 25.0),
    ));
    // Counts and where the leads leave the core (at the lead end, top of the drawing).
    let groups = coil_groups(w);
    let mut sizes: Vec<usize> = groups.iter().map(|g| g.coils.len()).collect();
    sizes.sort_unstable();
    sizes.dedup();
    let leads = super::connections::lead_slots(w)
        .iter()
        .map(|(name, slot, start)| {
            format!(
                "{name} {} slot {slot}",
                if *start { "in at" } else { "out at" }
            )
        })
        .collect::<Vec<_>>()
        .join(", ");
    let counts = format!(
        "{} in {} of {} {}. Leads: {leads}",
        crate::numbering::count(w.coils.len(), "coil", "coils"),
        crate::numbering::count(groups.len(), "group", "groups"),
        sizes
            .iter()
            .map(|s| s.to_string())
            .collect::<Vec<_>>()
            .join(" or "),
        crate::numbering::noun_for(&sizes, "coil", "coils")
    );
    // Concentric groups of two windings leave a layer empty here and there; a winding in
    // every other slot leaves the other winding's slots.
    let counts = if single.is_some() {
        format!("{counts}. Crossed column: empty layer.")
    } else if w.design.alternate_slots.is_some() {
        format!("{counts}. Crossed slots: the other winding's.")
    } else {
        counts
    };
    let y3 = area.y + 14.0;
    g = g.add(
        label(
            ax,
            y3,
            MIN_TEXT,
            Anchor::Start,
            &text::fit(&counts, MIN_TEXT, area.w),
        )
        .set("class", "counts"),
    );
    g
}

fn phase_line(pal: &Palette, k: usize, x1: f64, y1: f64, x2: f64, y2: f64, width: f64) -> Line {
    let l = Line::new()
        .set("x1", r(x1))
        .set("y1", r(y1))
        .set("x2", r(x2))
        .set("y2", r(y2))
        .set("stroke", pal.stroke(k))
        .set("stroke-width", width);
    match pal.dash(k) {
        "none" => l,
        d => l.set("stroke-dasharray", d),
    }
}

/// All rows of slots, coils and groups, in the body's own coordinates (origin top left).
fn rows(w: &Winding, pal: &Palette, g: &Grid, range: std::ops::Range<usize>) -> Group {
    let z = w.geometry.slots;
    let fill = w.slot_fill();
    let groups = coil_groups(w);
    let rotary = w.geometry.topology == Topology::Rotary;
    let p = g.pitch;
    let mut out = Group::new();
    let mut defs = Definitions::new();
    let cols = w.geometry.layers.clamp(1, 2);
    let col_w = if cols == 2 { 0.4 * p } else { 0.6 * p };
    let col_x = |layer: usize| layer_offset(w, layer, p);
    let first_row = range.start;
    for row in range {
        let first = row * g.per_row;
        if first >= z {
            break;
        }
        let n = g.per_row.min(z - first);
        let band_top = (row - first_row) as f64 * g.row_h();
        let top = band_top + g.lead_band;
        let num_y = top + BRACKET;
        let slot_top = num_y + g.num_band();
        let slot_bot = slot_top + g.slot_h;
        let x_of = |u: f64| (u - first as f64) * p + p / 2.0;
        let mut slots_g = Group::new().set("class", "slots");
        let mut sides = Group::new().set("class", "sides");
        for (k, slot_fill) in fill.iter().enumerate().skip(first).take(n) {
            let cx = x_of(k as f64);
            // Slot number, staggered on two lines when the pitch is narrow.
            let ny = num_y
                + g.num_size
                + if g.stagger && (k - first) % 2 == 1 {
                    g.num_size * 1.1
                } else {
                    0.0
                };
            slots_g = slots_g.add(
                label(cx, ny, g.num_size, Anchor::Middle, &(k + 1).to_string())
                    .set("class", "slot-no")
                    .set("data-slot", k + 1),
            );
            slots_g = slots_g.add(
                Rectangle::new()
                    .set("class", "slot")
                    .set("data-slot", k + 1)
                    .set("x", r(cx - 0.45 * p))
                    .set("y", r(slot_top))
                    .set("width", r(0.9 * p))
                    .set("height", r(g.slot_h))
                    .set("fill", "none")
                    .set("stroke", "#000000")
                    .set("stroke-width", 0.25),
            );
            for (layer, cell) in slot_fill.iter().enumerate().take(cols) {
                let lx = cx + col_x(layer);
                match cell {
                    Some(i) => {
                        let c = &w.coils[*i];
                        let go = c.go == k && c.go_layer.min(1) == layer;
                        sides = sides.add(side(w, pal, *i, k, layer, go, lx, col_w, slot_top, g));
                    }
                    None => {
                        sides = sides.add(empty_layer(k, layer, lx, col_w, slot_top, g.slot_h));
                    }
                }
            }
        }
        // Coils: every coil whose span reaches into this row, clipped to the row.
        let clip_id = format!("slots-row{}{}", row + 1, super::id_scope(w));
        defs = defs.add(
            ClipPath::new().set("id", clip_id.clone()).add(
                Rectangle::new()
                    .set("x", 0)
                    .set("y", r(top))
                    .set("width", r(n as f64 * p))
                    .set("height", r(g.row_h())),
            ),
        );
        let mut coils_g = Group::new()
            .set("class", "coils")
            .set("clip-path", format!("url(#{clip_id})"));
        let lo = first as f64 - 0.5;
        let hi = (first + n) as f64 - 0.5;
        let mut coil_nos = Group::new().set("class", "coil-nos");
        for (i, c) in w.coils.iter().enumerate() {
            let s = w.span(c);
            let left = w.left_slot(c) as f64;
            let right = left + s.unsigned_abs() as f64;
            let shifts: &[f64] = if rotary && right >= z as f64 {
                &[0.0, -(z as f64)]
            } else {
                &[0.0]
            };
            for &shift in shifts {
                let (a, b) = (left + shift, right + shift);
                if b < lo || a > hi {
                    continue;
                }
                let primary = shift == 0.0 && left >= lo && left <= hi;
                let (piece, number) = coil_path(
                    w,
                    pal,
                    i,
                    shift,
                    &x_of,
                    slot_top,
                    slot_bot,
                    g,
                    primary,
                    (lo + 0.5, hi - 0.5),
                );
                coils_g = coils_g.add(piece);
                if let Some(t) = number {
                    coil_nos = coil_nos.add(t);
                }
            }
        }
        // Coil groups, bracketed above the slot numbers.
        let mut brackets = Group::new().set("class", "groups");
        // Each bracket's span in this row (group, start, end, primary) first, so that a
        // label may use the room up to its neighbours' labels.
        let mut placed: Vec<(usize, f64, f64, f64, f64, bool)> = Vec::new();
        for (gi, grp) in groups.iter().enumerate() {
            let lefts: Vec<usize> = grp
                .coils
                .iter()
                .map(|&c| w.left_slot(&w.coils[c]))
                .collect();
            let start = lefts[0] as f64;
            let mut end = start;
            for &l in &lefts[1..] {
                let mut u = l as f64;
                while u < end {
                    u += z as f64;
                }
                end = u;
            }
            for shift in [0.0, -(z as f64)] {
                let (a, b) = (start + shift, end + shift);
                if b < lo || a > hi {
                    continue;
                }
                let (ca, cb) = (a.max(lo + 0.5), b.min(hi - 0.5));
                let primary = shift == 0.0 && start >= lo && start <= hi;
                placed.push((gi, a, b, ca, cb, primary));
            }
        }
        let centres: Vec<f64> = placed
            .iter()
            .filter(|q| q.5)
            .map(|q| (x_of(q.3) + x_of(q.4)) / 2.0)
            .collect();
        for &(gi, a, b, ca, cb, primary) in &placed {
            let grp = &groups[gi];
            let (xa, xb) = (x_of(ca), x_of(cb));
            let centre = (xa + xb) / 2.0;
            // Up to the nearest other label's centre on either side (two labels of that
            // width then just meet), and never less than the bracket itself.
            let gap = centres
                .iter()
                .map(|c| (c - centre).abs())
                .filter(|d| *d > 1e-6)
                .fold(f64::INFINITY, f64::min);
            let room = gap.min((xb - xa) + 1.4 * p).max(xb - xa + 0.8 * p) - 0.1 * p;
            brackets = brackets.add(bracket(
                w,
                pal,
                gi,
                grp.phase,
                grp.polarity,
                xa,
                xb,
                top,
                p,
                primary,
                ca > a,
                cb < b,
                room,
            ));
        }
        let jumpers = if g.lead_band > 0.0 {
            lead_end(w, pal, &x_of, band_top, top)
        } else {
            Group::new()
        };
        out = out.add(jumpers);
        out = out
            .add(slots_g)
            .add(coils_g)
            .add(coil_nos)
            .add(sides)
            .add(brackets);
        if rotary && first + n == z {
            out = out.add(
                label(
                    x_of((z - 1) as f64) + 0.6 * p,
                    slot_bot - 1.0,
                    MIN_TEXT,
                    Anchor::Start,
                    "\u{2192} 1",
                )
                .set("class", "wrap-note"),
            );
        }
    }
    Group::new().add(defs).add(out)
}

/// The lead end above the slots: for every phase and path, a jumper from each group's finish
/// to the next group's start on a lane of its own, and the two leads rising to their
/// markings at the top.
fn lead_end(
    w: &Winding,
    pal: &Palette,
    x_of: &dyn Fn(f64) -> f64,
    band_top: f64,
    top: f64,
) -> Group {
    let groups = coil_groups(w);
    let mut out = Group::new().set("class", "lead-end");
    let label_y = band_top + MIN_TEXT + 0.5;
    let mut leads: Vec<(f64, usize, String)> = Vec::new();
    for (lane, this) in crate::winding::schedule::lanes(w, &groups)
        .into_iter()
        .enumerate()
    {
        let (k, gs) = (this.phase, &this.groups);
        let y = band_top + 3.0 * MIN_TEXT + 3.0 + lane as f64 * LANE + LANE / 2.0;
        let start_of = |gi: usize| super::connections::group_ends(w, &groups[gi]).0;
        let finish_of = |gi: usize| super::connections::group_ends(w, &groups[gi]).1;
        let drop = |x: f64| phase_line(pal, k, x, y, x, top + 0.6, 0.3);
        for pair in gs.windows(2) {
            let (a, b) = (
                x_of(finish_of(pair[0]) as f64),
                x_of(start_of(pair[1]) as f64),
            );
            out = out
                .add(phase_line(pal, k, a, y, b, y, 0.35).set("class", "jumper"))
                .add(drop(a))
                .add(drop(b));
        }
        if let (Some(&first), Some(&last)) = (gs.first(), gs.last()) {
            for (slot, end) in [(start_of(first), 1u8), (finish_of(last), 2u8)] {
                let x = x_of(slot as f64);
                let name = super::connections::lane_terminal(w, &this, end);
                leads.push((x, k, name));
            }
        }
    }
    // Lead names in slot order, on two lines where neighbours would touch.
    leads.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut last_end = [f64::MIN; 2];
    for (x, k, name) in leads {
        let half = text::width(&name, MIN_TEXT) / 2.0 + 0.6;
        let line = if x - half >= last_end[0] { 0 } else { 1 };
        last_end[line] = x + half;
        let y = label_y + line as f64 * (MIN_TEXT + 0.8);
        out = out
            .add(phase_line(pal, k, x, y + 0.8, x, top + 0.6, 0.45).set("class", "lead"))
            .add(label(x, y, MIN_TEXT, Anchor::Middle, &name).set("class", "lead-name"));
    }
    out
}

/// One coil side in one slot layer: tinted cell, phase letter, current arrow.
#[allow(clippy::too_many_arguments)]
fn side(
    w: &Winding,
    pal: &Palette,
    coil: usize,
    slot: usize,
    layer: usize,
    go: bool,
    x: f64,
    cw: f64,
    top: f64,
    g: &Grid,
) -> Group {
    let phase = w.coils[coil].phase;
    let name = w.label(phase);
    // The phase letter at 2.5 mm or more where it fits the column; where it does not (a
    // long label on a narrow slot) the cell's colour and the coil's dash pattern say it.
    let size = (0.8 * cw + 0.4).clamp(MIN_TEXT, 3.0);
    let show_letter = text::width(name, size) <= cw * 1.15;
    let mid = top + g.slot_h * 0.62;
    let a = (0.45 * cw).min(1.3);
    let (tip, base) = if go {
        (mid + a, mid - a)
    } else {
        (mid - a, mid + a)
    };
    let mut cell = Group::new()
        .set("class", "side")
        .set("data-slot", slot + 1)
        .set("data-layer", layer)
        .set("data-coil", coil + 1)
        .set("data-phase", phase)
        .set("data-dir", if go { "go" } else { "back" })
        .add(
            Rectangle::new()
                .set("x", r(x - cw / 2.0))
                .set("y", r(top + 0.3))
                .set("width", r(cw))
                .set("height", r(g.slot_h - 0.6))
                .set("fill", pal.tint(phase)),
        );
    if show_letter {
        cell =
            cell.add(label(x, top + 0.6 + size, size, Anchor::Middle, name).set("fill", "#000000"));
    }
    cell.add(Polygon::new().set("fill", "#000000").set(
        "points",
        format!(
            "{},{} {},{} {},{}",
            r(x),
            r(tip),
            r(x - a * 0.7),
            r(base),
            r(x + a * 0.7),
            r(base)
        ),
    ))
}

/// An empty layer (half-filled end slot of a linear primary): blank with a cross.
fn empty_layer(slot: usize, layer: usize, x: f64, cw: f64, top: f64, h: f64) -> Group {
    let (x0, x1, y0, y1) = (x - cw / 2.0, x + cw / 2.0, top + 0.3, top + h - 0.3);
    let line = |a: f64, b: f64, c: f64, d: f64| {
        Line::new()
            .set("x1", r(a))
            .set("y1", r(b))
            .set("x2", r(c))
            .set("y2", r(d))
            .set("stroke", "#777777")
            .set("stroke-width", 0.2)
    };
    Group::new()
        .set("class", "empty-layer")
        .set("data-slot", slot + 1)
        .set("data-layer", layer)
        .add(
            Rectangle::new()
                .set("x", r(x0))
                .set("y", r(y0))
                .set("width", r(cw))
                .set("height", r(y1 - y0))
                .set("fill", "#FFFFFF")
                .set("stroke", "#777777")
                .set("stroke-width", 0.2)
                .set("stroke-dasharray", "0.6 0.4"),
        )
        .add(line(x0, y0, x1, y1))
        .add(line(x1, y0, x0, y1))
}

/// A coil from its go side over the far-end overhang to its back side.
#[allow(clippy::too_many_arguments)]
fn coil_path(
    w: &Winding,
    pal: &Palette,
    i: usize,
    shift: f64,
    x_of: &dyn Fn(f64) -> f64,
    top: f64,
    bot: f64,
    g: &Grid,
    primary: bool,
    (lo_u, hi_u): (f64, f64),
) -> (Group, Option<svg::node::element::Text>) {
    let c = &w.coils[i];
    let p = g.pitch;
    let s = w.span(c);
    let off = |layer: usize| layer_offset(w, layer, p);
    // Unwrapped positions: the go side sits at the left or the right end of the span.
    let left = w.left_slot(c) as f64 + shift;
    let right = left + s.unsigned_abs() as f64;
    let (ug, ub) = if s >= 0 { (left, right) } else { (right, left) };
    let xg = x_of(ug) + off(c.go_layer.min(1));
    let xb = x_of(ub) + off(c.back_layer.min(1));
    // Overhang depth grows with the span, so nested (concentric) coils stay apart.
    let depth = (g.depth_max * s.unsigned_abs() as f64 / g.span_max).clamp(1.5, g.depth_max);
    let xm = (xg + xb) / 2.0;
    let data = Data::new()
        .move_to((r(xg), r(top + 0.3)))
        .line_to((r(xg), r(bot)))
        .line_to((r(xm), r(bot + depth)))
        .line_to((r(xb), r(bot)))
        .line_to((r(xb), r(top + 0.3)));
    let mut path = Path::new()
        .set("d", data)
        .set("fill", "none")
        .set("stroke", pal.stroke(c.phase))
        .set("stroke-width", 0.32)
        .set("stroke-linejoin", "round");
    if pal.dash(c.phase) != "none" {
        path = path.set("stroke-dasharray", pal.dash(c.phase));
    }
    let grp = Group::new()
        .set("class", if primary { "span" } else { "span-cont" })
        .set("data-coil", i + 1)
        .set("data-phase", c.phase)
        .add(path);
    let (lo, hi) = (x_of(lo_u) - g.pitch / 2.0, x_of(hi_u) + g.pitch / 2.0);
    let name = (i + 1).to_string();
    let half = text::width(&name, g.coil_size) / 2.0;
    let number = (g.coil_labels && xm >= lo && xm < hi).then(|| {
        label(
            xm.clamp(lo + half, hi - half),
            bot + depth + g.coil_size + 0.4,
            g.coil_size,
            Anchor::Middle,
            &name,
        )
        .set("class", "coil-no")
        .set("data-coil", i + 1)
        .set("fill", "#333333")
    });
    (grp, number)
}

/// Horizontal offset of a layer column from the slot centre. Two-layer slots show the top
/// layer left and the bottom layer right; in a tooth-coil winding (span 1) the two sides
/// lie side by side and each coil's sides face the tooth it surrounds, so its left-slot
/// side (layer 0) is drawn in the right half.
fn layer_offset(w: &Winding, layer: usize, p: f64) -> f64 {
    if w.geometry.layers < 2 {
        return 0.0;
    }
    let left = if tooth_coils(w) {
        layer != 0
    } else {
        layer == 0
    };
    if left { -0.21 * p } else { 0.21 * p }
}

/// Double-layer winding of span 1: every coil surrounds one tooth.
fn tooth_coils(w: &Winding) -> bool {
    w.geometry.layers == 2 && w.coils.iter().all(|c| w.span(c).unsigned_abs() == 1)
}

/// A coil-group bracket over the left sides of its coils, numbered, with phase and sign.
#[allow(clippy::too_many_arguments)]
fn bracket(
    w: &Winding,
    pal: &Palette,
    number: usize,
    phase: usize,
    polarity: i8,
    xa: f64,
    xb: f64,
    top: f64,
    p: f64,
    primary: bool,
    open_left: bool,
    open_right: bool,
    room: f64,
) -> Group {
    let (x0, x1) = (xa - 0.4 * p, xb + 0.4 * p);
    let y = top + BRACKET - 1.0;
    let mut d = Data::new();
    d = if open_left {
        d.move_to((r(x0), r(y - 1.2)))
    } else {
        d.move_to((r(x0), r(y))).line_to((r(x0), r(y - 1.2)))
    };
    d = d.line_to((r(x1), r(y - 1.2)));
    if !open_right {
        d = d.line_to((r(x1), r(y)));
    }
    let sign = if polarity > 0 { "+" } else { "\u{2212}" };
    let full = format!("{} {}{}", number + 1, w.label(phase), sign);
    let size = MIN_TEXT;
    let text_s = if text::width(&full, size) <= room {
        full
    } else {
        (number + 1).to_string()
    };
    let mut grp = Group::new()
        .set("class", if primary { "group" } else { "group-cont" })
        .set("data-group", number + 1)
        .set("data-phase", phase)
        .set("data-polarity", polarity)
        .add(
            Path::new()
                .set("d", d)
                .set("fill", "none")
                .set("stroke", pal.stroke(phase))
                .set("stroke-width", 0.35),
        );
    if primary {
        grp = grp.add(label(
            (x0 + x1) / 2.0,
            y - 1.7,
            size,
            Anchor::Middle,
            &text_s,
        ));
    }
    grp
}
