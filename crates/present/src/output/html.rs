//! The whole design as one self-contained HTML file: inline CSS and SVG, no script, nothing
//! fetched. Every table is a real table with headers, every sheet a figure with a caption,
//! all user text escaped; a print stylesheet puts one sheet on a page and never splits a
//! table row. The reports' own sections are rendered, so the page says what the text does.

use std::fmt::Write;

use super::{Report, Section};
use crate::draw::{self, Page, Sheet};
use crate::safety::CAUTION;
use crate::study::{Soundness, Study};

/// `s` with `&`, `<`, `>`, `"` and `'` escaped, after [`crate::sanitize::clean`].
pub fn escape(s: &str) -> String {
    let s = crate::sanitize::clean(s);
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

const STYLE: &str = r#"
:root { color-scheme: light; }
body { font-family: "DejaVu Sans", Verdana, sans-serif; color: #111; background: #fff;
  max-width: 72rem; margin: 1.5rem auto; padding: 0 1rem; line-height: 1.45; }
h1 { font-size: 1.6rem; margin-bottom: 0.3rem; }
h2 { font-size: 1.3rem; border-bottom: 2px solid #111; margin-top: 2.2rem; }
h3 { font-size: 1.05rem; margin-top: 1.4rem; }
p.line { margin: 0.15rem 0; }
p.caution { border: 3px solid #111; padding: 0.6rem 0.9rem; font-weight: bold;
  background: #fff8d6; margin: 1rem 0; }
p.warning { border-left: 6px solid #8a1c00; padding-left: 0.6rem; color: #5a1200; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-size: 0.9rem; }
th, td { border: 1px solid #777; padding: 0.15rem 0.45rem; text-align: right; }
th { background: #e8e8e8; }
td.text, th.text { text-align: left; }
figure { margin: 1.2rem 0; }
figure svg { width: 100%; height: auto; border: 1px solid #999; }
/* The page's rules stop at the sheets: a sheet's own classes (caution, title) are its own. */
figcaption { font-size: 0.95rem; margin-top: 0.3rem; }
nav ul { columns: 2; }
a { color: #0b3d91; }
@page { margin: 10mm; }
@page sheet { size: 297mm 210mm; margin: 0; }
@media print {
  body { max-width: none; margin: 0; padding: 0; }
  nav { display: none; }
  figure.sheet { page: sheet; break-before: page; break-after: page; break-inside: avoid;
    margin: 0; width: 297mm; height: 210mm; overflow: hidden; }
  figure.sheet svg { border: none; display: block; width: 297mm; height: 210mm; }
  figure.sheet figcaption { display: none; }
  tr, p.caution { break-inside: avoid; }
  thead { display: table-header-group; }
  h2, h3 { break-after: avoid; }
  p.caution { background: #fff; }
}
"#;

fn id_of(title: &str) -> String {
    crate::sanitize::slug(title)
}

/// A report's sections as HTML: headings (h3), lines (paragraphs; warnings marked) and
/// tables with a header row.
fn sections(out: &mut String, secs: &[Section]) {
    for s in secs {
        match s {
            Section::Heading(h) => {
                let _ = writeln!(out, "<h3>{}</h3>", escape(h));
            }
            // The page's header shows the design once, and the caution at top and foot.
            Section::Design(_) | Section::Caution(_) => {}
            Section::Lines(lines) | Section::Items(lines) => {
                // Each paragraph whole: the page sets it to its own measure.
                for l in lines {
                    let class = if l.starts_with("WARNING") {
                        "line warning"
                    } else {
                        "line"
                    };
                    let _ = writeln!(out, "<p class=\"{class}\">{}</p>", escape(l));
                }
            }
            Section::Table(t) => {
                out.push_str("<table>\n<thead><tr>");
                for (j, h) in t.headers.iter().enumerate() {
                    let class = align_class(t, j);
                    let _ = write!(out, "<th scope=\"col\"{class}>{}</th>", escape(h));
                }
                out.push_str("</tr></thead>\n<tbody>\n");
                for row in &t.rows {
                    out.push_str("<tr>");
                    for (j, c) in row.iter().enumerate() {
                        let _ = write!(out, "<td{}>{}</td>", align_class(t, j), escape(c));
                    }
                    out.push_str("</tr>\n");
                }
                out.push_str("</tbody>\n</table>\n");
            }
        }
    }
}

fn align_class(t: &super::Table, j: usize) -> &'static str {
    match t.align.get(j) {
        Some(super::Align::Right) => "",
        _ => " class=\"text\"",
    }
}

/// One report as a titled section of the page.
/// One titled part of the whole report: a report's sections.
pub struct Part {
    /// Its heading ("Plan", "Data card", ...).
    pub title: String,
    /// What the report says, as the text presenter would.
    pub sections: Vec<Section>,
}

/// Every report of a winding's study, in the order the HTML page and the PDF report both
/// print them.
pub struct Parts {
    /// Plan, audit (recorded windings), card, both speeds (pole-changing windings),
    /// performance and inductance (flat primaries), factors, field, spans.
    pub parts: Vec<Part>,
}

/// The parts of the study `s`: every report is the study's own, worked out once.
pub fn parts(s: &Study) -> Parts {
    let mut out = Vec::new();
    let mut add = |title: &str, sections: Vec<Section>| {
        out.push(Part {
            title: title.to_string(),
            sections,
        })
    };
    if let Some(sp) = s.single_phase() {
        use super::single_phase_report::{SinglePhaseView, View};
        let w = s.winding();
        let mut views = vec![("Plan", View::Plan)];
        if w.from_coil_list || !sp.findings.is_empty() {
            views.push(("Audit of the coil list", View::Audit));
        }
        views.extend([
            ("Data card", View::Card),
            ("Winding factors", View::Factors),
            ("Travelling field", View::Field),
        ]);
        for (title, view) in views {
            let v = SinglePhaseView {
                report: sp,
                winding: w,
                view,
            };
            add(title, v.sections());
        }
        return Parts { parts: out };
    }
    add("Plan", s.plan().sections());
    if let Some(a) = s.audit() {
        add("Audit of the coil list", a.sections());
    }
    add("Data card", s.card().sections());
    if let Some(Ok(sp)) = s.speeds() {
        add("Two speeds", sp.sections());
    }
    if let Ok(t) = s.thrust() {
        add(
            "Performance of the flat primary",
            super::thrust_report::sections_every(t, PERFORMANCE_ROWS_EVERY),
        );
    }
    if let Some(Ok(l)) = s.inductance() {
        add("Inductance and unbalance", l.sections());
    }
    add("Winding factors", s.factors().sections());
    if let Ok(f) = s.field() {
        add("Travelling field", f.sections());
    }
    add("Span comparison", s.pitch().sections());
    Parts { parts: out }
}

/// The PDF report's table pages: every part of `s` but the data card (which is a sheet
/// of its own) set as pages under the winding's title block.
pub fn part_pages(s: &Study, page: &Page) -> Vec<String> {
    parts(s)
        .parts
        .iter()
        .filter(|p| p.title != "Data card")
        .flat_map(|p| draw::tables::draw(s, &p.title, &p.sections, page))
        .collect()
}

/// The report's performance table lists every fifth slip of the study's sweep (steps of
/// 0.05 from standstill to synchronism); the sheet draws them all.
const PERFORMANCE_ROWS_EVERY: usize = 5;

/// What each sheet shows, for its caption.
fn caption(sheet: Sheet) -> &'static str {
    match sheet {
        Sheet::Slots => {
            "Slot layout: the core unrolled flat, every coil side with its phase letter and \
             current direction, spans, groups and phase belts."
        }
        Sheet::Connections => {
            "Connection diagram: coil groups in connection order with jumpers and leads, the \
             terminal board and the winding schedule."
        }
        Sheet::Star => "Star of slots: slot EMF phasors, the phase sectors and phase EMFs.",
        Sheet::Field => {
            "Travelling field: the MMF along the gap and its spectrum split into forward and \
             backward waves."
        }
        Sheet::Card => "Data card: wire, copper, resistances, leads and acceptance figures.",
        Sheet::Section => {
            "Slot section: the fullest slot to scale with its liner, wedge and every wire, \
             the fill and the core's loadings."
        }
        Sheet::Thrust => {
            "Performance: thrust, normal force and phase current against speed, with and \
             without the end effect."
        }
    }
}

/// The HTML report of a winding (and, for a coil list, its audit against `intended`).
pub fn document(s: &Study) -> String {
    let w = s.winding();
    let title = w.labels.title.clone().unwrap_or_else(|| {
        format!(
            "{} core, {} slots, {} poles",
            w.geometry.topology, w.geometry.slots, w.geometry.poles
        )
    });
    let report = parts(s);
    let page = Page::default();
    let mut figures: Vec<(String, String)> = Vec::new();
    // A single-phase stator's sheets: its plan and card set as pages.
    if let Some(sp) = s.single_phase() {
        use super::single_phase_report::{SHEET_VIEWS, SinglePhaseView};
        for (title, view) in SHEET_VIEWS {
            let v = SinglePhaseView {
                report: sp,
                winding: w,
                view,
            };
            for svg in draw::tables::draw(s, title, &v.sections(), &page) {
                figures.push((svg, format!("The {title}, as a sheet.")));
            }
        }
    }
    figures.extend(sheet_figures(s, &page, ""));
    // The shared design header, with the slot count and k_w1 marked for readers and tests.
    // A single-phase stator's summary is its own study's (the polyphase header speaks of
    // phases, belts and a connection it does not have).
    let lines = match s.single_phase() {
        Some(sp) => {
            let mut l: Vec<Vec<super::Piece>> = super::single_phase_report::summary(sp)
                .into_iter()
                .map(|l| vec![super::Piece::Text(l)])
                .collect();
            l.push(vec![
                super::Piece::Text("slots ".into()),
                super::Piece::Fact("slots", sp.slots.to_string()),
                super::Piece::Text("; main winding k_w1 = ".into()),
                super::Piece::Fact("kw1", crate::numbering::num(sp.main.winding_factor, 4)),
            ]);
            l
        }
        None => super::design_pieces(s.header()),
    };
    assemble(
        &title,
        &lines,
        s.sound() == Soundness::Sound,
        &report.parts,
        &figures,
    )
}

/// Every sheet that applies to the study `s`, with its caption (after `prefix`).
fn sheet_figures(s: &Study, page: &Page, prefix: &str) -> Vec<(String, String)> {
    let mut figures = Vec::new();
    for sheet in Sheet::ALL.into_iter().filter(|sheet| sheet.applies(s)) {
        let pages = draw::draw(s, sheet, page);
        let count = pages.len();
        let what = match (s.single_phase(), sheet) {
            (Some(_), Sheet::Slots) => {
                "Slot layout: the core unrolled flat, every coil side of the main and \
                 auxiliary windings with its current direction, spans and groups."
            }
            (Some(_), Sheet::Connections) => {
                "Connection diagram: the main and auxiliary groups in connection order with \
                 jumpers and leads, the lead tables with the capacitor, and the winding \
                 schedule."
            }
            _ => caption(sheet),
        };
        for (k, svg) in pages.into_iter().enumerate() {
            let label = if count > 1 {
                format!("{prefix}{what} (page {} of {count})", k + 1)
            } else {
                format!("{prefix}{what}")
            };
            figures.push((svg, label));
        }
    }
    figures
}

/// The HTML report of two windings in one core: the pair's report, then each winding's
/// parts and sheets under its name.
pub fn document_two(t: &crate::two_winding::TwoStudy, title: Option<&str>) -> String {
    use super::two_winding_report::{pair_sections, part_line};
    let r = t.report();
    let first = t.studies()[0].winding();
    let given = title;
    let title = given.map(str::to_string).unwrap_or_else(|| {
        format!(
            "{} core, {} slots, two windings",
            first.geometry.topology, first.geometry.slots
        )
    });
    let page = Page::default();
    let mut all = vec![Part {
        title: "Two windings in one core".into(),
        sections: pair_sections(r),
    }];
    let mut figures = Vec::new();
    for (i, s) in t.studies().iter().enumerate() {
        let name = format!("{}-pole winding", r.windings[i].poles);
        let mut own = parts(s).parts;
        if let Some(p) = own.first_mut() {
            p.sections
                .insert(0, Section::Lines(vec![part_line(i, &r.windings[i])]));
        }
        all.extend(own.into_iter().map(|p| Part {
            title: format!("{name}: {}", p.title),
            sections: p.sections,
        }));
        figures.extend(sheet_figures(s, &page, &format!("{name}. ")));
    }
    let block = draw::title::TitleBlock::of_pair(t, given, "two windings");
    let pair_svgs = draw::tables::draw_under(&block, &all[0].sections, &page);
    let mut with_pair: Vec<(String, String)> = pair_svgs
        .into_iter()
        .map(|svg| (svg, "The two windings, as a sheet.".to_string()))
        .collect();
    with_pair.extend(figures);
    // Which winding is which; the rest of the pair's summary is its part's.
    let mut lines: Vec<Vec<super::Piece>> = r
        .windings
        .iter()
        .enumerate()
        .map(|(i, p)| vec![super::Piece::Text(part_line(i, p))])
        .collect();
    lines.push(vec![
        super::Piece::Text("slots ".into()),
        super::Piece::Fact("slots", first.geometry.slots.to_string()),
        super::Piece::Text("; first winding k_w1 = ".into()),
        super::Piece::Fact(
            "kw1",
            crate::numbering::num(r.windings[0].winding_factor, 4),
        ),
    ]);
    let sound = r.findings.is_empty() && t.studies().iter().all(|s| s.sound() == Soundness::Sound);
    assemble(&title, &lines, sound, &all, &with_pair)
}

/// One self-contained page: the header with the caution and summary, the contents, each
/// part, every figure, the foot.
fn assemble(
    title: &str,
    lines: &[Vec<super::Piece>],
    sound: bool,
    parts: &[Part],
    figures: &[(String, String)],
) -> String {
    let mut body = String::new();
    let mut toc: Vec<(String, String)> = Vec::new();
    for part in parts {
        let id = id_of(&part.title);
        toc.push((id.clone(), part.title.clone()));
        let _ = writeln!(
            body,
            "<section id=\"{id}\">\n<h2>{}</h2>",
            escape(&part.title)
        );
        sections(&mut body, &part.sections);
        body.push_str("</section>\n");
    }
    // Every sheet, one figure per page.
    toc.push(("sheets".into(), "Sheets".into()));
    body.push_str("<section id=\"sheets\">\n<h2>Sheets</h2>\n");
    for (k, (svg, label)) in figures.iter().enumerate() {
        let n = k + 1;
        let _ = writeln!(
            body,
            "<figure class=\"sheet\" id=\"sheet-{n}\">\n{}\n<figcaption>Figure {n}. {}</figcaption>\n</figure>",
            svg.trim_start(),
            escape(label)
        );
    }
    body.push_str("</section>\n");

    let mut out = String::with_capacity(body.len() + 4096);
    out.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    out.push_str("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
    let _ = writeln!(out, "<title>{}</title>", escape(title));
    let _ = writeln!(out, "<style>{STYLE}</style>\n</head>\n<body>");
    let _ = writeln!(out, "<header>\n<h1>{}</h1>", escape(title));
    let _ = writeln!(
        out,
        "<p class=\"caution\" role=\"note\">{}</p>",
        escape(CAUTION)
    );
    if !sound {
        out.push_str(
            "<p class=\"caution\" role=\"alert\" id=\"unsound\">NOT A SOUND WINDING: the \
             audit below has findings. Do not wind or connect from this report until they are \
             cleared.</p>\n",
        );
    }
    out.push_str("<div id=\"summary\">\n");
    for line in lines {
        let mut l = String::new();
        for piece in line {
            match piece {
                super::Piece::Text(t) => l.push_str(&escape(t)),
                super::Piece::Fact(id, t) => {
                    let _ = write!(l, "<span id=\"{id}\">{}</span>", escape(t));
                }
            }
        }
        let _ = writeln!(out, "<p class=\"line\">{l}</p>");
    }
    out.push_str("</div>\n</header>\n");
    out.push_str("<nav aria-label=\"Contents\">\n<ul>\n");
    for (id, t) in &toc {
        let _ = writeln!(out, "<li><a href=\"#{id}\">{}</a></li>", escape(t));
    }
    out.push_str("</ul>\n</nav>\n<main>\n");
    out.push_str(&body);
    out.push_str("</main>\n<footer>\n");
    let _ = writeln!(
        out,
        "<p class=\"caution\" role=\"note\">{}</p>\n<p class=\"line\">Made by beltwright {}.</p>",
        escape(CAUTION),
        env!("CARGO_PKG_VERSION")
    );
    out.push_str("</footer>\n</body>\n</html>\n");
    out
}
