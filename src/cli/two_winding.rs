//! Two windings in one core: the commands that serve such a layout read one study of the
//! pair (each winding's own reports and the pair's); the rest say what to use instead.

use std::path::Path;

use beltwright::draw::{self, FileKind, Page, Sheet};
use beltwright::output::Words;
use beltwright::output::two_winding_report::{self as words, View};
use beltwright::spec::Spec;
use beltwright::two_winding::{TwoStudy, positions};
use beltwright::winding::{self, PlanError, Winding};

use super::args::{Cli, Command};
use super::commands::{
    is_html, page_of, plan_failure, read_spec_source, say, sheet_kind, write_page, write_sheet,
    wrote,
};
use super::files::check_output;
use super::single_phase::file_of;
use super::{Failure, Printed};

/// A two-winding layout's command, or `None` when the layout has one winding (or cannot be
/// read: the command's own path then says why).
pub fn route(cli: &Cli) -> Option<Result<Printed, Failure>> {
    let (path, name) = file_of(&cli.command)?;
    let (spec, file, source) = read_spec_source(path).ok()?;
    spec.second.as_ref()?;
    Some(run(cli, name, &spec, &file, &source))
}

/// Both windings of a two-winding layout, each titled with which it is.
fn windings(spec: &Spec, file: &str, source: &str) -> Result<[Winding; 2], Failure> {
    let Some(second) = &spec.second else {
        return Err(Failure::input(format!(
            "{file}: one winding only; a second goes in [second_winding]"
        )));
    };
    let title = spec.labels.title.as_deref();
    // A refusal of a winding in every other slot speaks of the slots it is laid out on.
    let halved = |mut f: Failure| {
        if second.sharing == beltwright::spec::Sharing::Slots {
            f.message.push_str(&format!(
                " (sharing by slots, each winding is laid out on its own {} slots, every \
                 other one of the core's {}: the counts above are of those)",
                spec.design.slots / 2,
                spec.design.slots
            ));
        }
        f
    };
    let first =
        winding::build_lenient(spec).map_err(|e| halved(plan_failure(file, source, spec, &e)))?;
    let other = winding::build_lenient(&second.spec)
        .map_err(|e| halved(second_failure(file, source, &second.spec, &e)))?;
    let mut out = [first, other];
    for (w, at) in out.iter_mut().zip(positions(second.sharing)) {
        w.labels.title = Some(words::sheet_title(title, w.geometry.poles, at));
    }
    Ok(out)
}

/// The second winding refused after parsing: the key is in `[second_winding]`.
fn second_failure(file: &str, source: &str, spec: &Spec, e: &PlanError) -> Failure {
    let key = match e {
        PlanError::Paths(_) => "parallel_paths",
        PlanError::Infeasible(_) if spec.design.pitch.is_some() && spec.coils.is_empty() => "pitch",
        PlanError::Overfilled(_) => {
            // A recorded coil's own key names it.
            return plan_failure(file, source, spec, e);
        }
        _ => "poles",
    };
    let line = beltwright::layout::locate(source, "second_winding", 0, key)
        .map(|l| format!(", line {l}"))
        .unwrap_or_default();
    Failure::input(format!(
        "{file}{line}: second_winding.{key}: {}",
        e.message()
    ))
}

fn run(cli: &Cli, name: &str, spec: &Spec, file: &str, source: &str) -> Result<Printed, Failure> {
    let sharing = spec
        .second
        .as_ref()
        .map(|s| s.sharing)
        .ok_or_else(|| Failure::input(format!("{file}: one winding only")))?;
    let ws = windings(spec, file, source)?;
    let intended_path = match &cli.command {
        Command::Audit(a) => a.intended.as_deref(),
        Command::Report(a) => a.intended.as_deref(),
        _ => None,
    };
    let intended = match intended_path {
        Some(p) => Some(intended(p, &ws, file)?),
        None => None,
    };
    let intended_refs: [Option<&Winding>; 2] = match &intended {
        Some([a, b]) => [Some(a), Some(b)],
        None => [None, None],
    };
    let study = TwoStudy::new([&ws[0], &ws[1]], intended_refs, sharing);
    let view = |v: View, format: beltwright::output::Format| -> Result<Printed, Failure> {
        let mut buf = Vec::new();
        words::write(&study, v, format, &mut buf).map_err(|e| Failure::output(e.to_string()))?;
        Ok(Box::new(move |out: &mut dyn std::io::Write| {
            out.write_all(&buf)
        }))
    };
    match &cli.command {
        Command::Factors(a) if a.speed.is_some() => Err(super::single_phase::no_speeds(file)),
        Command::Field(a) if a.speed.is_some() => Err(super::single_phase::no_speeds(file)),
        Command::Plan(a) if a.out.is_none() => view(View::Plan, a.common.format.into()),
        Command::Factors(a) => view(View::Factors, a.common.format.into()),
        Command::Field(a) if a.svg.is_none() => view(View::Field, a.common.format.into()),
        Command::Card(a) => view(View::Card, a.format.into()),
        Command::Audit(a) => {
            let printed = view(View::Audit, a.common.format.into())?;
            if study.report().findings.is_empty() {
                Ok(printed)
            } else {
                let n = words::problems(&study).max(1);
                Err(Failure {
                    message: format!(
                        "{file}: the audit found {}; see the findings",
                        beltwright::numbering::count(n, "problem", "problems")
                    ),
                    status: 1,
                    report: Some(printed),
                })
            }
        }
        Command::Draw(a) => {
            let kind = sheet_kind(&a.output)?;
            let page = page_of(a.page, a.portrait);
            let sheet: Sheet = a.sheet.into();
            let pages: Vec<String> = study
                .studies()
                .iter()
                .flat_map(|s| draw::draw(s, sheet, &page))
                .collect();
            let written = write_sheet(&pages, kind, &a.output, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        Command::Report(a) => {
            let Some(out) = &a.output else {
                return view(View::Plan, beltwright::output::Format::Text);
            };
            let inputs: Vec<&Path> = std::iter::once(a.file.as_path())
                .chain(a.intended.as_deref())
                .collect();
            if is_html(out) {
                let html =
                    beltwright::output::html::document_two(&study, spec.labels.title.as_deref());
                return write_page(out, html, &inputs);
            }
            let kind = sheet_kind(out)?;
            for p in &inputs {
                check_output(out, &[p], "-o")?;
            }
            let pages = sheets(
                &study,
                spec.labels.title.as_deref(),
                &page_of(a.page, a.portrait),
                kind,
            );
            let written = write_sheet(&pages, kind, out, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        _ => Err(Failure::input(format!(
            "{file}: two windings in one core ([second_winding]); `{name}` with these options \
             works on one winding. Use plan, factors, field, card, audit, draw or report on \
             the pair"
        ))),
    }
}

/// The pair's pages: its own tables, then each winding's sheets (a PDF also carries each
/// winding's tables, as for one winding).
fn sheets(study: &TwoStudy, title: Option<&str>, page: &Page, kind: FileKind) -> Vec<String> {
    let block = draw::title::TitleBlock::of_pair(study, title, "two windings");
    let mut pages = draw::tables::draw_under(&block, &words::pair_sections(study.report()), page);
    for s in study.studies() {
        if kind == FileKind::Pdf {
            pages.extend(beltwright::output::html::part_pages(s, page));
        }
        pages.extend(
            Sheet::ALL
                .into_iter()
                .filter(|sheet| sheet.applies(s))
                .flat_map(|sheet| draw::draw(s, sheet, page)),
        );
    }
    pages
}

/// The intended design of `--intended`: a two-winding layout of the same core, its
/// windings in the same order.
fn intended(path: &Path, record: &[Winding; 2], name: &str) -> Result<[Winding; 2], Failure> {
    let (spec, file, source) = read_spec_source(path)?;
    if spec.second.is_none() {
        return Err(Failure::input(format!(
            "--intended {}: one winding, but the record {name} has two; give the two-winding \
             design",
            path.display()
        )));
    }
    let d = windings(&spec, &file, &source)?;
    for (i, (a, b)) in d.iter().zip(record).enumerate() {
        if a.geometry.slots != b.geometry.slots || a.geometry.poles != b.geometry.poles {
            return Err(Failure::input(format!(
                "--intended {}: its winding {} is {} poles in {} slots but the record's is {} \
                 poles in {}; compare designs of the same core",
                path.display(),
                i + 1,
                a.geometry.poles,
                a.geometry.slots,
                b.geometry.poles,
                b.geometry.slots
            )));
        }
    }
    Ok(d)
}
