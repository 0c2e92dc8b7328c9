//! The connection sheet: each phase's coil groups in connection order with the jumpers
//! between them, parallel paths, the terminal board with star or delta links and the IEC
//! 60034-8 lead markings (U1/U2, V1/V2, W1/W2), and beside it the winding schedule.
//!
//! Conventions (common practice): every group is wound the same way, start S at its left
//! slot and finish F at its right; a reversed group (coils reaching backwards from their go
//! sides) is connected finish first, so current enters at F and leaves at S. Groups of one
//! path are joined in slot order. The terminal board has the 2-ends in the upper row shifted
//! by one place (W2 U2 V2 over U1 V1 W1), so star links run across the upper row and delta
//! links straight down (IEC 60034-8 marking; board layout common practice).

use itertools::Itertools;
use svg::node::element::path::Data;
use svg::node::element::{Circle, Group, Path, Rectangle};

use super::page::{Canvas, Page, Rect, rule};
use super::palette::Palette;
use super::text::{self, Anchor, label, r};
use super::title::TitleBlock;
use crate::card::leads::LeadScheme;
use crate::design::Marking;
use crate::winding::schedule::{FinishTo, Lane, LaneEnd, ScheduleRow, lanes, schedule};
use crate::winding::{CoilGroup, Connection, Winding, coil_groups};

pub use crate::winding::schedule::group_ends;

const BOX_W: f64 = 20.0;
const BOX_H: f64 = 8.0;
const BOX_GAP: f64 = 6.0;
const LINE_H: f64 = 13.0;
const LEAD_W: f64 = 11.0;
const BOARD_H: f64 = 30.0;
const SCHED_SIZE: f64 = 2.5;
const SCHED_ROW: f64 = 3.4;
const SCHED_HEAD: f64 = 8.0;
const DIAGRAM_MIN_W: f64 = 120.0;

/// Terminal marking of phase `k` end `end` (1 or 2): the phase label and end number
/// (IEC 60034-8 letters U1, U2 ... by default), or NEMA MG 1 T-leads T1...T6 of the first
/// section when the layout asks for NEMA marking on a three-phase winding.
pub fn terminal(w: &Winding, k: usize, end: u8) -> String {
    path_terminal(w, k, 0, end)
}

/// Terminal marking of the start (1) or finish (2) of path `p` of phase `k`: on a three-phase
/// winding the lead scheme's name (the path is a section of a 9- or 12-lead winding), marked
/// "(inside)" where the end is joined inside the machine; otherwise the phase label and end.
pub fn path_terminal(w: &Winding, k: usize, p: usize, end: u8) -> String {
    match path_lead(w, k, p, end) {
        (name, true) => format!("{name} (inside)"),
        (name, false) => name,
    }
}

/// The marking of the start (1) or finish (2) of path `p` of phase `k`, and whether that end
/// is joined inside the machine (see [`path_terminal`]).
fn path_lead(w: &Winding, k: usize, p: usize, end: u8) -> (String, bool) {
    if w.geometry.phases == 3 {
        return crate::card::leads::section_lead(w.design.leads, k, p, end == 2);
    }
    if let Some(sp) = &w.design.single_phase {
        // Main start and end (a two-section main: the first's start, the second's end),
        // auxiliary start and end.
        let names =
            crate::winding::single_phase::lead_names(w.design.leads.marking, sp.main_sections);
        let n = names.len();
        let i = match (k, end) {
            (0, 1) => 0,
            (0, _) => n - 3,
            (_, 1) => n - 2,
            _ => n - 1,
        };
        return (names[i].to_string(), false);
    }
    (format!("{}{end}", w.label(k)), false)
}

/// Marking of a lane's start (1) or finish (2): its path's lead, or on a pole-changing
/// winding the lead or star point its half runs to.
pub fn lane_terminal(w: &Winding, lane: &Lane, end: u8) -> String {
    match if end == 1 { lane.start } else { lane.finish } {
        LaneEnd::Path => path_terminal(w, lane.phase, lane.path, end),
        LaneEnd::Six(l) => l.name(w.design.leads.marking),
        LaneEnd::StarPoint => "star point (inside)".into(),
    }
}

/// Where each path's leads leave the core: (lead marking, slot from 1, start?) for the start
/// of the first group and the finish of the last, in connection order.
pub fn lead_slots(w: &Winding) -> Vec<(String, usize, bool)> {
    let groups = coil_groups(w);
    let mut out = Vec::new();
    for lane in lanes(w, &groups) {
        let (Some(&first), Some(&last)) = (lane.groups.first(), lane.groups.last()) else {
            continue;
        };
        out.push((
            lane_terminal(w, &lane, 1),
            group_ends(w, &groups[first]).0 + 1,
            true,
        ));
        out.push((
            lane_terminal(w, &lane, 2),
            group_ends(w, &groups[last]).1 + 1,
            false,
        ));
    }
    out
}

/// The schedule's "finish to" cell in shop words.
fn finish_words(w: &Winding, e: &ScheduleRow) -> String {
    match e.finish_to {
        FinishTo::Coil { coil } => format!("coil {coil}"),
        FinishTo::Group { group, coil } => format!("G{group} coil {coil}"),
        FinishTo::Lead => match path_lead(w, e.phase_index, e.path.index(), 2) {
            (name, true) => format!("{name} (inside)"),
            (name, false) => format!("lead {name}"),
        },
        FinishTo::SixLead { ref lead } => format!("lead {lead}"),
        FinishTo::StarPoint => "star point".into(),
    }
}

/// Schedule column headings and widths (mm).
fn columns(w: &Winding) -> Vec<(&'static str, f64)> {
    let mut c = vec![
        ("Coil", 8.5),
        ("Go", 7.5),
        ("Back", 8.0),
        ("Turns", 8.5),
        ("Phase", 8.5),
        ("Group", 8.5),
    ];
    if w.parallel_paths > 1 {
        c.push(("Path", 7.0));
    }
    c.push(("Finish to", 18.0));
    c
}

/// Where a connection sheet's terminal boards come from.
#[derive(Clone, Copy)]
enum Boards<'a> {
    /// A three-phase winding's lead scheme (the card's).
    Three(&'a LeadScheme),
    /// A single-phase stator's lead tables (its study's).
    Single(&'a crate::single_phase::SinglePhaseReport),
    /// Neither: one board of the phase ends.
    Ends,
}

/// Draw the connection sheet; the schedule continues on further pages when needed.
pub fn draw(s: &crate::study::Study, page: &Page) -> Vec<String> {
    let w = s.winding();
    // The boards are drawn from the card's own lead scheme (three-phase windings), or a
    // single-phase stator's lead tables.
    let scheme = match s.single_phase() {
        Some(sp) => Boards::Single(sp),
        None => s.card().leads.as_ref().map_or(Boards::Ends, Boards::Three),
    };
    let groups = coil_groups(w);
    let entries = schedule(w, &groups);
    let cols = columns(w);
    let col_w: f64 = cols.iter().map(|c| c.1).sum::<f64>() + 4.0;
    let probe = Canvas::new(page, &TitleBlock::of(s, "Connections")).area;
    let rows_per_col = (((probe.h - SCHED_HEAD - SCHED_ROW) / SCHED_ROW).floor() as usize).max(1);
    let needed = entries.len().div_ceil(rows_per_col).max(1);
    let most = (((probe.w - DIAGRAM_MIN_W) / col_w).floor() as usize).min(needed);
    // The diagram comes first: give page 1 only as many schedule columns as leave the
    // diagram near full size (none at all when even one would shrink it much).
    let dscale = |c: usize| {
        diagram_scale(
            w,
            scheme,
            &groups,
            probe.w - c as f64 * col_w - 4.0,
            probe.h,
        )
    };
    let first_cols = (0..=most)
        .rev()
        .find(|&c| dscale(c) >= 0.85)
        .unwrap_or_else(|| {
            (0..=most)
                .max_by(|&a, &b| dscale(a).total_cmp(&dscale(b)))
                .unwrap_or(0)
        });
    let more_cols = ((probe.w / col_w).floor() as usize).max(1);
    // On a narrow sheet the diagram takes the full width; the schedule then starts below
    // it when there is room for a useful number of rows.
    let diagram_h = diagram_height(w, scheme, &groups, probe.w);
    let below_rows = ((probe.h - diagram_h - 6.0 - SCHED_HEAD - SCHED_ROW) / SCHED_ROW).floor();
    let stacked = first_cols == 0 && diagram_h <= probe.h && below_rows >= 8.0;
    let (first_n, first_rows) = if stacked {
        let rows = below_rows as usize;
        ((more_cols * rows).min(entries.len()), rows)
    } else {
        ((first_cols * rows_per_col).min(entries.len()), rows_per_col)
    };
    let rest = entries.len() - first_n;
    let pages = 1 + rest.div_ceil(more_cols * rows_per_col);
    let mut out = Vec::with_capacity(pages);
    let pal = Palette::new(w.geometry.phases, w.labels.colours.as_deref());
    let mut block = TitleBlock::of(s, "Connections");
    block.page = (1, pages);
    let mut canvas = Canvas::new(page, &block);
    let a = canvas.area;
    let sched_w = first_cols as f64 * col_w;
    let diagram = Rect {
        x: a.x,
        y: a.y,
        w: if first_cols == 0 {
            a.w
        } else {
            a.w - sched_w - 4.0
        },
        h: if stacked { diagram_h } else { a.h },
    };
    // A pole-changing winding's halves are joined differently at each speed: a
    // single-speed diagram here would wire it wrongly, so the sheet draws the halves
    // between the six leads and each speed's board instead.
    match s.speeds() {
        Some(report) => canvas.add(super::two_speed::connection(
            w, &groups, report, &pal, diagram,
        )),
        None => canvas.add(connection_diagram(w, scheme, &pal, &groups, diagram)),
    }
    let sched_box = if stacked {
        Rect {
            x: a.x,
            y: a.y + diagram_h + 6.0,
            w: a.w,
            h: a.h - diagram_h - 6.0,
        }
    } else {
        Rect {
            x: a.right() - sched_w,
            y: a.y,
            w: sched_w,
            h: a.h,
        }
    };
    if first_n > 0 {
        canvas.add(schedule_table(
            w,
            &cols,
            &entries[..first_n],
            sched_box,
            first_rows,
            pages > 1,
        ));
    } else {
        canvas.add(Group::new().add(label(
            a.right(),
            a.bottom() - 0.5,
            2.6,
            Anchor::End,
            "Winding schedule on the next sheet.",
        )));
    }
    out.push(canvas.finish());
    let mut done = first_n;
    for n in 2..=pages {
        let mut block = TitleBlock::of(s, "Connections");
        block.page = (n, pages);
        let mut canvas = Canvas::new(page, &block);
        let a = canvas.area;
        let take = (more_cols * rows_per_col).min(entries.len() - done);
        canvas.add(schedule_table(
            w,
            &cols,
            &entries[done..done + take],
            a,
            rows_per_col,
            n < pages,
        ));
        done += take;
        out.push(canvas.finish());
    }
    out
}

fn schedule_table(
    w: &Winding,
    cols: &[(&'static str, f64)],
    entries: &[ScheduleRow],
    b: Rect,
    rows_per_col: usize,
    continues: bool,
) -> Group {
    let col_w: f64 = cols.iter().map(|c| c.1).sum::<f64>() + 4.0;
    let mut g = Group::new().set("class", "schedule");
    for (ci, chunk) in entries.chunks(rows_per_col).enumerate() {
        let x0 = b.x + ci as f64 * col_w;
        let mut x = x0;
        let y_head = b.y + 3.2;
        if ci == 0 {
            g = g.add(label(
                x0,
                b.y + 2.8,
                2.6,
                Anchor::Start,
                "Winding schedule (connection order)",
            ));
        }
        for (name, cw) in cols {
            g = g.add(label(x, y_head + 3.0, 2.6, Anchor::Start, name).set("fill", "#333333"));
            x += cw;
        }
        g = g.add(rule(x0, y_head + 4.0, x0 + col_w - 4.0, y_head + 4.0, 0.3));
        let mut y = b.y + SCHED_HEAD + SCHED_ROW;
        for (ri, e) in chunk.iter().enumerate() {
            if ri % 2 == 1 {
                g = g.add(
                    Rectangle::new()
                        .set("x", r(x0))
                        .set("y", r(y - SCHED_ROW + 0.7))
                        .set("width", r(col_w - 4.0))
                        .set("height", r(SCHED_ROW))
                        .set("fill", "#F0F0F0"),
                );
            }
            let cells = [
                e.coil.to_string(),
                e.go.to_string(),
                e.back.to_string(),
                e.turns.to_string(),
                e.phase.clone(),
                e.group.to_string(),
            ];
            let mut row = Group::new()
                .set("class", "schedule-row")
                .set("data-coil", e.coil.get());
            let mut x = x0;
            for (i, c) in cells.iter().enumerate() {
                row = row.add(label(
                    x,
                    y,
                    SCHED_SIZE,
                    Anchor::Start,
                    &text::fit(c, SCHED_SIZE, cols[i].1 - 0.8),
                ));
                x += cols[i].1;
            }
            if w.parallel_paths > 1 {
                row = row.add(label(x, y, SCHED_SIZE, Anchor::Start, &e.path.to_string()));
                x += cols[6].1;
            }
            let last = cols.last().map_or(15.0, |c| c.1);
            row = row.add(label(
                x,
                y,
                SCHED_SIZE,
                Anchor::Start,
                &text::fit(&finish_words(w, e), SCHED_SIZE, last),
            ));
            g = g.add(row);
            y += SCHED_ROW;
        }
    }
    if continues {
        g = g.add(label(
            b.right(),
            b.bottom() - 0.5,
            2.6,
            Anchor::End,
            "Schedule continues on the next sheet.",
        ));
    }
    g
}

fn wire(pal: &Palette, k: usize, d: Data) -> Path {
    let p = Path::new()
        .set("d", d)
        .set("fill", "none")
        .set("stroke", pal.stroke(k))
        .set("stroke-width", 0.45);
    match pal.dash(k) {
        "none" => p,
        dash => p.set("stroke-dasharray", dash),
    }
}

fn coil_list(g: &CoilGroup) -> String {
    let mut n: Vec<usize> = g.coils.iter().map(|c| c + 1).collect();
    n.sort_unstable();
    let consecutive = n.windows(2).all(|p| p[1] == p[0] + 1);
    match (n.first(), n.last()) {
        (Some(a), Some(b)) if a == b => format!("coil {a}"),
        (Some(a), Some(b)) if consecutive => format!("coils {a}\u{2013}{b}"),
        _ => format!("coils {}", n.iter().join(",")),
    }
}

/// The coil list as it fits a group box: "coils 10–12", else without the word ("10–12"),
/// else cut with an ellipsis (only lists of scattered coils are that long).
fn box_coils(list: &str, size: f64, room: f64) -> String {
    if text::width(list, size) <= room {
        return list.to_string();
    }
    let bare = list
        .trim_start_matches("coils ")
        .trim_start_matches("coil ");
    text::fit(bare, size, room)
}

/// Groups per line of a lane in a diagram `width` wide.
fn per_line(width: f64) -> usize {
    (((width - 2.0 * LEAD_W - 8.0 + BOX_GAP) / (BOX_W + BOX_GAP)).floor() as usize).max(1)
}

/// Height of the lanes drawn `width` wide at full size, in drawing units.
fn lanes_height(w: &Winding, groups: &[CoilGroup], width: f64) -> f64 {
    let lanes = lanes(w, groups);
    let n = per_line(width);
    let lines: usize = lanes
        .iter()
        .map(|l| l.groups.len().div_ceil(n).max(1))
        .sum();
    let note = if w.parallel_paths > 1 { 10.0 } else { 0.0 };
    lines as f64 * LINE_H + lanes.len() as f64 * 5.0 + 4.0 + note
}

/// Height of the heading and terminal boards, drawn at printed size `width` wide, mm.
fn boards_height(w: &Winding, scheme: Boards<'_>, width: f64) -> f64 {
    let pal = Palette::new(w.geometry.phases, w.labels.colours.as_deref());
    board(w, scheme, &pal, width).1 + 4.0
}

/// Width the boards take set beside the lanes (their natural width, or a column for the
/// single board of another phase count), mm.
fn boards_width(w: &Winding, scheme: Boards<'_>) -> f64 {
    let Boards::Three(scheme) = scheme else {
        return 0.0;
    };
    super::board::natural_width(scheme, w.design.connection).max(70.0)
}

/// Where the boards go: above the lanes, or beside them on the right.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Arrangement {
    /// Boards beside the lanes (width of their column), else above.
    beside: Option<f64>,
    /// Scale of the lanes (1 at full size; 0 when they do not fit at all).
    scale: f64,
}

/// Height of the whole diagram drawn `width` wide at full size, boards above, mm.
fn diagram_height(w: &Winding, scheme: Boards<'_>, groups: &[CoilGroup], width: f64) -> f64 {
    if w.design.pole_change.is_some() {
        return super::two_speed::height(w, groups, width);
    }
    boards_height(w, scheme, width) + lanes_height(w, groups, width)
}

/// The better of the two arrangements in `width` × `height`: the one whose lanes keep the
/// larger scale (boards above when both draw at full size).
fn arrangement(
    w: &Winding,
    scheme: Boards<'_>,
    groups: &[CoilGroup],
    width: f64,
    height: f64,
) -> Arrangement {
    if width < 40.0 {
        return Arrangement {
            beside: None,
            scale: 0.0,
        };
    }
    let fit = |lanes_w: f64, room: f64| {
        if room <= 0.0 || lanes_w < 40.0 {
            0.0
        } else {
            (room / lanes_height(w, groups, lanes_w)).min(1.0)
        }
    };
    let above = Arrangement {
        beside: None,
        scale: fit(width, height - boards_height(w, scheme, width)),
    };
    let col = boards_width(w, scheme);
    if above.scale >= 1.0 || col <= 0.0 {
        return above;
    }
    let lanes_w = width - col - 6.0;
    let beside_ok = boards_height(w, scheme, col) <= height;
    let beside = Arrangement {
        beside: Some(col),
        scale: if beside_ok {
            fit(lanes_w, height - 4.0)
        } else {
            0.0
        },
    };
    if beside.scale > above.scale {
        beside
    } else {
        above
    }
}

/// Scale at which the lanes fit beside or under the boards in `width` × `height` (1 when
/// they fit at full size; the boards and their words are always drawn at printed size).
fn diagram_scale(
    w: &Winding,
    scheme: Boards<'_>,
    groups: &[CoilGroup],
    width: f64,
    height: f64,
) -> f64 {
    if w.design.pole_change.is_some() {
        // Drawn at printed size only: 1 where it fits; otherwise how nearly, held below the
        // page's 0.85 "near full size", so a width where it does not fit is never taken
        // and the best of the others is ranked by it.
        let need_h = super::two_speed::height(w, groups, width);
        let ratio = (width / super::two_speed::MIN_WIDTH).min(height / need_h);
        return if ratio >= 1.0 {
            1.0
        } else {
            ratio.clamp(0.0, 0.84)
        };
    }
    arrangement(w, scheme, groups, width, height).scale
}

/// Terminal board, then one lane per phase and path with the groups in connection order.
fn connection_diagram(
    w: &Winding,
    scheme: Boards<'_>,
    pal: &Palette,
    groups: &[CoilGroup],
    b: Rect,
) -> Group {
    let arr = arrangement(w, scheme, groups, b.w, b.h);
    let scale = arr.scale;
    // Text keeps its printed size (2.6 mm) however much the diagram is scaled to fit.
    let ts = if scale > 0.0 {
        (1.0 / scale).max(1.0)
    } else {
        1.0
    };
    let lanes = lanes(w, groups);
    // Heading and boards at printed size, above the lanes or in a column beside them; the
    // lanes scaled to fit what is left.
    let (board_x, board_w, lanes_w) = match arr.beside {
        Some(col) => (b.right() - col, col, b.w - col - 6.0),
        None => (b.x, b.w, b.w),
    };
    let per_line = per_line(lanes_w);
    let (board_g, board_h) = board(w, scheme, pal, board_w);
    let top = Group::new()
        .set("transform", format!("translate({} {})", r(board_x), r(b.y)))
        .add(board_g);
    let lanes_y = match arr.beside {
        Some(_) => b.y + 4.0,
        None => b.y + board_h + 4.0,
    };
    let heading = label(b.x, b.y + 2.8, 2.6, Anchor::Start, "Connection diagram");
    let mut inner = Group::new();
    let mut y = 4.0;
    for Lane {
        phase: k,
        path: p,
        groups: gs,
        ..
    } in &lanes
    {
        let bare = |end: u8| path_lead(w, *k, *p, end).0;
        let mut lane = Group::new()
            .set("class", "lane")
            .set("data-phase", *k)
            .set("data-path", p + 1)
            .set("data-start", bare(1))
            .set("data-finish", bare(2));
        let name = if w.design.single_phase.is_some() {
            // A single-phase stator's two windings are not phases.
            format!("{} winding", w.label(*k))
        } else if w.parallel_paths > 1 {
            format!("Phase {}, path {}", w.label(*k), p + 1)
        } else {
            format!("Phase {}", w.label(*k))
        };
        lane = lane.add(label(0.0, y, 2.6 * ts, Anchor::Start, &name).set("fill", "#333333"));
        let chunks: Vec<&[usize]> = if gs.is_empty() {
            vec![&[][..]]
        } else {
            gs.chunks(per_line).collect()
        };
        let nlines = chunks.len();
        for (li, chunk) in chunks.iter().enumerate() {
            let yc = y + 4.5 + BOX_H / 2.0 + li as f64 * LINE_H;
            let mut x = LEAD_W;
            // Lead in.
            if li == 0 {
                lane = lane.add(lead(&path_terminal(w, *k, *p, 1), 0.0, yc, ts, true));
            } else {
                lane = lane.add(label(
                    LEAD_W - 1.0,
                    yc + 0.7,
                    2.6 * ts,
                    Anchor::End,
                    "\u{2192}",
                ));
            }
            let mut prev_x = if li == 0 { 2.2 } else { LEAD_W - 1.0 };
            for &gi in chunk.iter() {
                let grp = &groups[gi];
                lane = lane.add(wire(
                    pal,
                    *k,
                    Data::new()
                        .move_to((r(prev_x), r(yc)))
                        .line_to((r(x), r(yc))),
                ));
                lane = lane.add(group_box(w, pal, gi, grp, x, yc, ts));
                prev_x = x + BOX_W;
                x += BOX_W + BOX_GAP;
            }
            let end_x = prev_x + 3.0;
            lane = lane.add(wire(
                pal,
                *k,
                Data::new()
                    .move_to((r(prev_x), r(yc)))
                    .line_to((r(end_x), r(yc))),
            ));
            if li + 1 == nlines {
                lane = lane.add(lead(&path_terminal(w, *k, *p, 2), end_x, yc, ts, false));
            } else {
                lane = lane.add(label(
                    end_x + 0.5,
                    yc + 0.7,
                    2.6 * ts,
                    Anchor::Start,
                    "\u{2192}",
                ));
            }
        }
        inner = inner.add(lane);
        y += nlines as f64 * LINE_H + 5.0;
    }
    if w.parallel_paths > 1 {
        let words = if w.geometry.phases == 3 && w.design.leads.count >= 9 {
            "The two paths of each phase are its two sections, brought out on their own leads: \
             connect them on the terminal board for the voltage wanted."
                .to_string()
        } else {
            format!(
                "{} parallel paths per phase: join the path starts at the 1-lead and the path \
                 ends at the 2-lead.",
                w.parallel_paths
            )
        };
        for l in text::wrap(&words, 2.6 * ts, lanes_w / scale) {
            inner = inner.add(label(0.0, y + 1.0, 2.6 * ts, Anchor::Start, &l));
            y += 3.3 * ts;
        }
    }
    Group::new()
        .set("class", "connection-diagram")
        .add(heading)
        .add(top)
        .add(
            Group::new()
                .set(
                    "transform",
                    format!(
                        "translate({} {}) scale({})",
                        r(b.x),
                        r(lanes_y),
                        r(scale * 1000.0) / 1000.0
                    ),
                )
                .add(inner),
        )
}

/// A lead end: open terminal circle with its marking above right.
/// A lead in at the start of a lane has its marking raised clear of the first group's
/// S/F letter; a lead out sits level with the line.
fn lead(name: &str, x: f64, y: f64, ts: f64, raised: bool) -> Group {
    let (cx, tx, anchor) = (x + 1.2, x + 2.8, Anchor::Start);
    let ty = if raised {
        y - 1.5 - 2.6 * ts * 0.8
    } else {
        y - 1.6
    };
    Group::new()
        .set("class", "lead")
        .add(super::board::stud(cx, y, 1.0, "#000000", 0.35))
        .add(label(tx, ty, 2.6 * ts, anchor, name))
}

fn group_box(
    w: &Winding,
    pal: &Palette,
    gi: usize,
    g: &CoilGroup,
    x: f64,
    yc: f64,
    ts: f64,
) -> Group {
    let reversed = g.polarity < 0;
    let (entry, exit) = if reversed { ("F", "S") } else { ("S", "F") };
    let mut out = Group::new()
        .set("class", "coil-group")
        .set("data-group", gi + 1)
        .set("data-phase", g.phase)
        .set("data-reversed", if reversed { 1 } else { 0 })
        .add(
            Rectangle::new()
                .set("x", r(x))
                .set("y", r(yc - BOX_H / 2.0))
                .set("width", BOX_W)
                .set("height", BOX_H)
                .set("rx", 0.8)
                .set("fill", pal.tint(g.phase))
                .set("stroke", pal.stroke(g.phase))
                .set("stroke-width", 0.4),
        )
        .add(label(
            x + BOX_W / 2.0,
            yc - 0.6,
            2.6 * ts,
            Anchor::Middle,
            &format!(
                "G{} {}{}",
                gi + 1,
                w.label(g.phase),
                if reversed { "\u{2212}" } else { "+" }
            ),
        ))
        .add(label(
            x + BOX_W / 2.0,
            yc + 2.7,
            2.6 * ts,
            Anchor::Middle,
            &box_coils(&coil_list(g), 2.6 * ts, BOX_W - 1.0),
        ))
        .add(label(x - 0.4, yc - 1.2, 2.6 * ts, Anchor::End, entry))
        .add(label(
            x + BOX_W + 0.4,
            yc - 1.2,
            2.6 * ts,
            Anchor::Start,
            exit,
        ));
    if reversed {
        out = out.add(label(
            x + BOX_W / 2.0,
            yc - BOX_H / 2.0 - 0.6,
            2.6 * ts,
            Anchor::Middle,
            "reversed",
        ));
    }
    out
}

/// The legend under the boards: how a group box reads and whose lead marking is used.
fn groups_note(w: &Winding) -> String {
    // A winding of a two-winding motor: what its own board cannot show.
    let pair = if w.design.leads.speed == 0 {
        ""
    } else if w.design.connection == Connection::Delta && w.design.leads.count == 6 {
        " One of two windings in this core: its delta is closed only by its own speed's \
         contactor and must stay open while the other runs; its leads are then live: never \
         join them to the other winding's."
    } else {
        " One of two windings in this core: while the other runs its leads are live; never \
         join them to the other winding's."
    };
    format!(
        "Groups: S start, F finish as wound; a reversed group is connected F in, S out; under \
         each group its coils. Leads marked to {}.{pair}",
        match w.design.leads.marking {
            Marking::Iec => "IEC 60034-8",
            Marking::Nema => "NEMA MG 1",
        }
    )
}

/// The terminal boards and the words above them, and the height they take (mm). A
/// three-phase winding's boards come from its lead scheme ([`super::board`]); other phase
/// counts get one board of their own phase ends.
fn board(w: &Winding, scheme: Boards<'_>, pal: &Palette, width: f64) -> (Group, f64) {
    let scheme = match scheme {
        Boards::Three(s) if w.geometry.phases == 3 => s,
        Boards::Single(sp) => return super::single_phase::board(sp, width),
        _ => return phase_board(w, pal, width),
    };
    let mut g = Group::new().set("class", "terminal-board");
    let mut y = 6.6;
    let say = |g: Group, words: &str, y: &mut f64, class: &str| -> Group {
        let mut g = g;
        for l in text::wrap(words, 2.6, width) {
            g = g.add(label(0.0, *y, 2.6, Anchor::Start, &l).set("class", class.to_string()));
            *y += 3.3;
        }
        g
    };
    let drawn = super::board::drawn(scheme, w.design.connection);
    // The planned connection first, as the headline; the boards are drawn below.
    if let Some(c) = scheme.configurations.iter().find(|c| c.as_planned) {
        let words = format!(
            "As planned: {}: {}",
            super::board::heading(c),
            super::board::sentence(c)
        );
        g = say(g, &words, &mut y, "headline");
    }
    // The other connections the leads allow: those without a board of their own in words.
    for c in scheme
        .configurations
        .iter()
        .filter(|c| !c.as_planned && !drawn.iter().any(|d| std::ptr::eq(*d, *c)))
    {
        let words = format!(
            "{}: {}",
            super::board::heading(c),
            super::board::sentence(c)
        );
        g = say(g, &words, &mut y, "lead-table");
    }
    y += 1.0;
    let (boards, h) = super::board::boards(
        scheme,
        w.design.connection,
        &w.design.phase_labels,
        pal,
        width,
    );
    g = g.add(boards.set("transform", format!("translate(0 {})", r(y))));
    y += h + 3.0 + 1.0;
    for line in text::wrap(&groups_note(w), 2.6, width) {
        g = g.add(label(0.0, y, 2.6, Anchor::Start, &line).set("fill", "#333333"));
        y += 3.3;
    }
    (g, y)
}

/// The terminal board of a winding that is not three-phase: 2-ends above (shifted one
/// place), 1-ends below, with star or delta links and the supply lines; its words beside.
fn phase_board(w: &Winding, pal: &Palette, width: f64) -> (Group, f64) {
    let m = w.geometry.phases;
    let pitch = 16.0;
    let x0 = 6.0;
    let y_top = 9.0;
    let y_bot = 21.0;
    let mut g = Group::new().set("class", "terminal-board");
    let bw = (m as f64) * pitch + 4.0;
    g = g.add(
        Rectangle::new()
            .set("x", r(x0 - 6.0))
            .set("y", r(y_top - 5.0))
            .set("width", r(bw))
            .set("height", r(y_bot - y_top + 9.0))
            .set("fill", "none")
            .set("stroke", "#000000")
            .set("stroke-width", 0.35),
    );
    let tx = |j: usize| x0 + j as f64 * pitch;
    // Links first, so the terminals sit on top.
    match w.design.connection {
        Connection::Star => {
            g = g.add(
                Rectangle::new()
                    .set("class", "link")
                    .set("x", r(tx(0) - 1.0))
                    .set("y", r(y_top - 0.7))
                    .set("width", r(tx(m - 1) - tx(0) + 2.0))
                    .set("height", 1.4)
                    .set("fill", "#555555"),
            );
        }
        Connection::Delta => {
            for j in 0..m {
                g = g.add(
                    Rectangle::new()
                        .set("class", "link")
                        .set("x", r(tx(j) - 0.7))
                        .set("y", r(y_top))
                        .set("width", 1.4)
                        .set("height", r(y_bot - y_top))
                        .set("fill", "#555555"),
                );
            }
        }
    }
    for j in 0..m {
        let upper = (j + m - 1) % m;
        for (k, end, y) in [(upper, 2u8, y_top), (j, 1u8, y_bot)] {
            let name = terminal(w, k, end);
            g = g.add(
                Group::new()
                    .set("class", "terminal")
                    .set("data-phase", k)
                    .set("data-end", end)
                    .add(
                        Circle::new()
                            .set("cx", r(tx(j)))
                            .set("cy", r(y))
                            .set("r", 1.6)
                            .set("fill", "#FFFFFF")
                            .set("stroke", pal.stroke(k))
                            .set("stroke-width", 0.5),
                    )
                    .add(label(tx(j) + 2.2, y - 1.6, 2.6, Anchor::Start, &name)),
            );
        }
        // Supply line to the 1-end.
        g = g.add(rule(tx(j), y_bot + 1.6, tx(j), y_bot + 5.5, 0.35));
        g = g.add(label(
            tx(j) + 1.0,
            y_bot + 6.5,
            2.6,
            Anchor::Start,
            &format!("L{}", j + 1),
        ));
    }
    let how = match w.design.connection {
        Connection::Star => format!(
            "Star: {} linked to make the star point; supply to {}.",
            (0..m).map(|k| terminal(w, k, 2)).join(", "),
            (0..m).map(|k| terminal(w, k, 1)).join(", ")
        ),
        Connection::Delta => format!(
            "Delta: {} linked; supply to {}.",
            (0..m)
                .map(|j| format!(
                    "{}\u{2013}{}",
                    terminal(w, (j + m - 1) % m, 2),
                    terminal(w, j, 1)
                ))
                .join(", "),
            (0..m).map(|k| terminal(w, k, 1)).join(", ")
        ),
    };
    let tx0 = bw + 2.0;
    let room = (width - tx0).max(30.0);
    let mut y = y_top - 2.0;
    for line in text::wrap(&how, 2.6, room) {
        g = g.add(label(tx0, y, 2.6, Anchor::Start, &line));
        y += 3.3;
    }
    for line in text::wrap(&groups_note(w), 2.6, room) {
        g = g.add(label(tx0, y + 0.6, 2.6, Anchor::Start, &line).set("fill", "#333333"));
        y += 3.3;
    }
    (g, (y + 2.0).max(BOARD_H))
}
