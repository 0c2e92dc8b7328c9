//! Single-phase layouts: the commands that serve them read the one single-phase study;
//! the polyphase ones say what to use instead.

use std::path::Path;

use beltwright::draw;
use beltwright::output::Report;
use beltwright::output::single_phase_report::{SinglePhaseView, View};
use beltwright::study::Study;
use beltwright::winding::Winding;

use super::args::{Cli, Command};
use super::commands::{
    is_html, page_of, read_spec_source, say, sheet_kind, write_page, write_sheet, wrote,
};
use super::{Failure, Printed};

/// The file a command reads, when it reads one layout.
pub(super) fn file_of(c: &Command) -> Option<(&Path, &'static str)> {
    Some(match c {
        Command::Plan(a) => (&a.common.file, "plan"),
        Command::Factors(a) => (&a.common.file, "factors"),
        Command::Field(a) => (&a.common.file, "field"),
        Command::Card(a) => (&a.file, "card"),
        Command::Audit(a) => (&a.common.file, "audit"),
        Command::Draw(a) => (&a.file, "draw"),
        Command::Report(a) => (&a.file, "report"),
        Command::Pitch(a) => (&a.common.file, "pitch"),
        Command::Thrust(a) => (&a.common.file, "thrust"),
        Command::Plates(a) => (&a.common.file, "plates"),
        Command::Inductance(a) => (&a.common.file, "inductance"),
        Command::Speeds(a) => (&a.common.file, "speeds"),
        Command::Loading(a) => (&a.common.file, "loading"),
        _ => return None,
    })
}

/// A single-phase layout's command, or `None` when the layout is not single-phase (or
/// cannot be read: the command's own path then says why).
pub fn route(cli: &Cli) -> Option<Result<Printed, Failure>> {
    let (path, name) = file_of(&cli.command)?;
    let (spec, file, source) = read_spec_source(path).ok()?;
    spec.design.single_phase.as_ref()?;
    Some(run(cli, name, &spec, &file, &source))
}

fn run(
    cli: &Cli,
    name: &str,
    spec: &beltwright::spec::Spec,
    file: &str,
    source: &str,
) -> Result<Printed, Failure> {
    let w = beltwright::winding::build_lenient(spec)
        .map_err(|e| super::commands::plan_failure(file, source, spec, &e))?;
    let study = Study::new(&w, None);
    let Some(report) = study.single_phase() else {
        return Err(Failure::input(format!("{file}: not a single-phase layout")));
    };
    let view = |v: View, format| -> Printed {
        let r = report.clone();
        let w2: Winding = w.clone();
        Box::new(move |out: &mut dyn std::io::Write| {
            let v = SinglePhaseView {
                report: &r,
                winding: &w2,
                view: v,
            };
            beltwright::output::write(&v, format, out)
        })
    };
    match &cli.command {
        Command::Factors(a) if a.speed.is_some() => Err(no_speeds(file)),
        Command::Field(a) if a.speed.is_some() => Err(no_speeds(file)),
        Command::Plan(a) if a.out.is_none() => Ok(view(View::Plan, a.common.format.into())),
        Command::Factors(a) => Ok(view(View::Factors, a.common.format.into())),
        Command::Field(a) if a.svg.is_none() => Ok(view(View::Field, a.common.format.into())),
        Command::Card(a) => Ok(view(View::Card, a.format.into())),
        Command::Audit(a) if a.intended.is_some() => Err(Failure::input(format!(
            "{file}: a single-phase record is audited against its own [main] and [aux] \
             design, which it carries; leave out --intended"
        ))),
        Command::Audit(a) => {
            let printed = view(View::Audit, a.common.format.into());
            if report.findings.is_empty() {
                Ok(printed)
            } else {
                Err(Failure {
                    message: format!(
                        "{file}: the audit found {}; see the findings",
                        beltwright::numbering::count(report.findings.len(), "problem", "problems")
                    ),
                    status: 1,
                    report: Some(printed),
                })
            }
        }
        Command::Draw(a) => {
            let kind = sheet_kind(&a.output)?;
            let page = page_of(a.page, a.portrait);
            let sheet: draw::Sheet = a.sheet.into();
            let pages = match sheet {
                draw::Sheet::Slots | draw::Sheet::Connections => draw::draw(&study, sheet, &page),
                draw::Sheet::Card | draw::Sheet::Field => {
                    let view = if sheet == draw::Sheet::Card {
                        View::Card
                    } else {
                        View::Field
                    };
                    let (title, _) = beltwright::output::single_phase_report::SHEET_VIEWS
                        .into_iter()
                        .find(|(_, v)| *v == view)
                        .unwrap_or(("single-phase sheet", view));
                    let v = SinglePhaseView {
                        report: report_of(&study)?,
                        winding: &w,
                        view,
                    };
                    draw::tables::draw(&study, title, &v.sections(), &page)
                }
                other => {
                    return Err(Failure::input(format!(
                        "{file}: --sheet {} is for polyphase windings; a single-phase stator \
                         has the slots, connections, card and field sheets (report -o draws \
                         them all)",
                        other.name()
                    )));
                }
            };
            let written = write_sheet(&pages, kind, &a.output, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        Command::Report(a) if a.intended.is_none() => {
            let Some(out) = &a.output else {
                return Ok(view(View::Plan, beltwright::output::Format::Text));
            };
            if is_html(out) {
                let html = beltwright::output::html::document(&study);
                return write_page(out, html, &[a.file.as_path()]);
            }
            let kind = sheet_kind(out)?;
            let pages = sheets(&study, &w, &page_of(a.page, a.portrait));
            let written = write_sheet(&pages, kind, out, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        _ => Err(Failure::input(format!(
            "{file}: a single-phase stator (machine.phases = 1); `{name}` with these options is \
             for polyphase windings. Use plan, factors, field, card, audit, draw or report on \
             it"
        ))),
    }
}

/// `--speed` asked of a stator that does not change poles.
pub(super) fn no_speeds(file: &str) -> Failure {
    Failure::input(format!(
        "{file}: --speed is for a pole-changing winding (winding.pole_change); leave it out"
    ))
}

/// The study's single-phase report.
fn report_of<'a>(
    study: &'a Study,
) -> Result<&'a beltwright::single_phase::SinglePhaseReport, Failure> {
    study
        .single_phase()
        .ok_or_else(|| Failure::input("not a single-phase layout".to_string()))
}

/// A single-phase stator's sheets: its plan (windings, coils, capacitor, lead tables),
/// card, factors and field set as pages with the title block and caution, then its slot
/// and connection sheets.
pub fn sheets(study: &Study, w: &Winding, page: &draw::Page) -> Vec<String> {
    let Some(r) = study.single_phase() else {
        return Vec::new();
    };
    let mut pages = Vec::new();
    for (title, v) in beltwright::output::single_phase_report::SHEET_VIEWS {
        let view = SinglePhaseView {
            report: r,
            winding: w,
            view: v,
        };
        pages.extend(draw::tables::draw(study, title, &view.sections(), page));
    }
    pages.extend(
        draw::Sheet::ALL
            .into_iter()
            .filter(|s| s.applies(study))
            .flat_map(|s| draw::draw(study, s, page)),
    );
    pages
}
