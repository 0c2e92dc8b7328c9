//! The commands: check the flags, read the layout files, call the library, present the
//! reports and write the files asked for.

use beltwright::output::Words;
use beltwright::study::Study;
use beltwright::units::{Area, Length};
use std::io::{IsTerminal, Write};
use std::path::{Path, PathBuf};

use super::files::{self, check_output, write_set};
use super::{Failure, Printed, note};
use indicatif::ProgressBar;

use beltwright::audit;
use beltwright::draw::{self, FileKind, Orientation, Page, Sheet};
use beltwright::factors;
use beltwright::field::{self, FieldOptions};
use beltwright::layout;
use beltwright::linear::Operating;
use beltwright::output::{self, Format, Report, render};
use beltwright::pitch::{self, PitchGoal};
use beltwright::plan;
use beltwright::rewind::{self, OldConductor};
use beltwright::survey::{self, SurveyQuery};
use beltwright::winding::{self, Topology, Winding};

use super::args::*;

/// Largest Σ(slots) × poles × planned layers a survey plans row by row.
const SURVEY_PLANNED_WORK: f64 = 2.5e7;

pub fn run(cli: Cli) -> Result<Printed, Failure> {
    if let Some(done) = super::single_phase::route(&cli) {
        return done;
    }
    if let Some(done) = super::two_winding::route(&cli) {
        return done;
    }
    match cli.command {
        Command::Plan(a) => {
            let w = load(&a.common.file)?;
            let op = Operating {
                slip: a.slip,
                airgap_power_w: a.airgap_power_w,
            };
            let report = plan::plan(&w, op);
            match &a.out {
                // The pack's sheets read the same plan: planned once.
                Some(dir) => {
                    let study = Study::with_plan(&w, report);
                    write_pack(&study, &a.common.file, dir)?;
                    Ok(present(study.plan().clone(), a.common.format))
                }
                None => Ok(present(report, a.common.format)),
            }
        }
        Command::Draw(a) => {
            let kind = sheet_kind(&a.output)?;
            let w = load(&a.file)?;
            let study = Study::new(&w, None);
            let pages = draw::draw(&study, a.sheet.into(), &page_of(a.page, a.portrait));
            let written = write_sheet(&pages, kind, &a.output, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        Command::Report(a) => {
            let Some(out) = &a.output else {
                let w = load(&a.file)?;
                let plan = plan::plan(&w, Operating::default());
                let factors = factors::factor_table(&w, 25.0);
                let field = field::field(&w, &FieldOptions::balanced(&w)).ok();
                return Ok(Box::new(move |out: &mut dyn Write| {
                    output::write(&plan, Format::Text, out)?;
                    out.write_all(b"\n")?;
                    output::write(&factors, Format::Text, out)?;
                    if let Some(f) = &field {
                        out.write_all(b"\n")?;
                        output::write(f, Format::Text, out)?;
                    }
                    Ok(())
                }));
            };
            if is_html(out) {
                let (spec, name, source) = read_spec_source(&a.file)?;
                let w = winding::build_lenient(&spec)
                    .map_err(|e| plan_failure(&name, &source, &spec, &e))?;
                let intended = intended(a.intended.as_deref(), &w, &name)?;
                let study = Study::new(&w, intended.as_ref());
                let html = beltwright::output::html::document(&study);
                let inputs: Vec<&Path> = std::iter::once(a.file.as_path())
                    .chain(a.intended.as_deref())
                    .collect();
                return write_page(out, html, &inputs);
            }
            let kind = sheet_kind(out)?;
            let w = load(&a.file)?;
            let page = page_of(a.page, a.portrait);
            // A PDF carries every table the HTML page has, set as pages (the card as its
            // own sheet), then every sheet; SVG and PNG sets carry the sheets.
            let mut pages: Vec<String> = Vec::new();
            if let Some(p) = &a.intended {
                check_output(out, &[p.as_path()], "-o")?;
            }
            let intended = intended(a.intended.as_deref(), &w, &a.file.display().to_string())?;
            let study = Study::new(&w, intended.as_ref());
            if kind == FileKind::Pdf {
                pages.extend(beltwright::output::html::part_pages(&study, &page));
            }
            pages.extend(
                Sheet::ALL
                    .into_iter()
                    .filter(|s| s.applies(&study))
                    .flat_map(|sheet| draw::draw(&study, sheet, &page)),
            );
            let written = write_sheet(&pages, kind, out, &a.file, a.dpi)?;
            Ok(say(wrote(&written)))
        }
        Command::Factors(a) => {
            let w = at_speed(load(&a.common.file)?, a.speed, &a.common.file)?;
            let orders = factors::orders_for(&w, a.upto);
            if orders > factors::MAX_ORDERS {
                return Err(Failure::input(format!(
                    "{}: --upto {} would walk {orders} orders on this {}-pole core; the factor \
                     table lists at most {} (give --upto {} or less)",
                    a.common.file.display(),
                    a.upto,
                    w.geometry.poles,
                    factors::MAX_ORDERS,
                    (a.upto * factors::MAX_ORDERS as f64 / orders as f64).floor()
                )));
            }
            Ok(present(factors::factor_table(&w, a.upto), a.common.format))
        }
        Command::Card(a) => {
            let w = load(&a.file)?;
            Ok(present(beltwright::card::card(&w), a.format))
        }
        Command::Completions { shell } => {
            let mut cmd = <Cli as clap::CommandFactory>::command();
            let mut buf = Vec::new();
            clap_complete::generate(shell, &mut cmd, "beltwright", &mut buf);
            Ok(Box::new(move |out: &mut dyn Write| out.write_all(&buf)))
        }
        Command::Man { command } => {
            let top = <Cli as clap::CommandFactory>::command();
            let cmd = match command {
                None => top,
                Some(name) => {
                    let sub = top
                        .get_subcommands()
                        .find(|c| c.get_name() == name && !c.is_hide_set())
                        .cloned()
                        .ok_or_else(|| {
                            Failure::input(format!(
                                "man: no command {name:?}; give one of {}",
                                top.get_subcommands()
                                    .filter(|c| !c.is_hide_set())
                                    .map(|c| c.get_name().to_string())
                                    .collect::<Vec<_>>()
                                    .join(", ")
                            ))
                        })?;
                    sub.display_name(format!("beltwright-{name}"))
                        .bin_name(format!("beltwright {name}"))
                }
            };
            let title = cmd.get_display_name().unwrap_or("beltwright").to_string();
            let mut buf = Vec::new();
            clap_mangen::Man::new(cmd)
                .title(title)
                .render(&mut buf)
                .map_err(|e| Failure::output(e.to_string()))?;
            Ok(Box::new(move |out: &mut dyn Write| out.write_all(&buf)))
        }
        Command::Thrust(a) => run_thrust(a),
        Command::Plates(a) => run_plates(a),
        Command::Inductance(a) => {
            let w = load(&a.common.file)?;
            let r = beltwright::inductance::inductance(&w, a.coils).map_err(|e| {
                Failure::input(format!("{}: {}", a.common.file.display(), e.message()))
            })?;
            Ok(present(r, a.common.format))
        }
        Command::Field(a) => run_field(a),
        Command::Pitch(a) => pitch(a),
        Command::Survey(a) => survey(a),
        Command::Audit(a) => run_audit(a),
        Command::Rewind(a) => run_rewind(a),
        Command::Size(a) => run_size(a),
        Command::Book(a) => super::book::run(a),
        Command::Speeds(a) => {
            let w = load(&a.common.file)?;
            let name = a.common.file.display();
            let report = beltwright::speeds::speeds(&w)
                .map_err(|e| Failure::input(format!("{name}: {}", e.message())))?;
            Ok(present(report, a.common.format))
        }
        Command::Template(a) => {
            let text = match a.kind {
                TemplateKind::Rotary => layout::templates::ROTARY,
                TemplateKind::Flat => layout::templates::FLAT,
                TemplateKind::Record => layout::templates::RECORD,
            };
            match &a.output {
                None => Ok(say(text.to_string())),
                Some(out) => {
                    if out.exists() {
                        return Err(Failure::input(format!(
                            "-o {}: the file exists; give a new name (a template never \
                             overwrites a layout)",
                            out.display()
                        )));
                    }
                    write_set(
                        &[(out.clone(), text.as_bytes().to_vec())],
                        &Vec::new,
                        &[],
                        "-o",
                    )?;
                    Ok(say(format!("wrote {}\n", out.display())))
                }
            }
        }
        Command::Loading(a) => {
            let w = load(&a.common.file)?;
            let r = beltwright::loading::report(&w, &a.limits.limits(), a.limits.emf_ratio)
                .map_err(|e| {
                    Failure::input(format!("{}: {}", a.common.file.display(), e.message()))
                })?;
            Ok(present(r, a.common.format))
        }
    }
}

impl LimitArgs {
    /// The limits as the library takes them.
    fn limits(&self) -> beltwright::loading::Limits {
        beltwright::loading::Limits {
            gap_t: self.gap_t,
            tooth_t: self.tooth_t,
            yoke_t: self.yoke_t,
            current_density_a_mm2: self.current_density,
            slot_fill: self.fill,
            heat_transfer_w_m2k: self.heat_transfer,
        }
    }
}

/// The same wire to a nanometre (a size written in millimetres reads back within rounding).
fn same_wire(
    a: Option<&beltwright::design::WireSpec>,
    b: Option<&beltwright::design::WireSpec>,
) -> bool {
    use beltwright::design::WireSize;
    match (a, b) {
        (None, None) => true,
        (Some(a), Some(b)) => {
            let size = match (a.size, b.size) {
                (WireSize::Diameter(x), WireSize::Diameter(y)) => (x - y).m().abs() <= 1e-9,
                (x, y) => x == y,
            };
            size && a.strands_in_hand == b.strands_in_hand && a.material == b.material
        }
        _ => false,
    }
}

/// `beltwright size`: size the bare core, present the sizing, and write the sized layout
/// (the input's text with the winding's keys set) when asked, after checking that it reads
/// back as the same winding.
fn run_size(a: SizeArgs) -> Result<Printed, Failure> {
    if let Some(out) = &a.output {
        check_output(out, &[&a.common.file], "-o")?;
    }
    let (spec, name, source) = read_spec_source(&a.common.file)?;
    let req = beltwright::sizing::Request {
        limits: a.limits.limits(),
        emf_ratio: a.limits.emf_ratio,
        awg: a.awg,
        thrust: a.thrust_n.zip(
            a.at_slip
                .map(beltwright::sizing::At::Slip)
                .or(a.at_speed.map(beltwright::sizing::At::Speed)),
        ),
    };
    let sizing = beltwright::sizing::size(&spec.labels, &spec.design, &req)
        .map_err(|e| Failure::input(format!("{name}: {}", e.message())))?;
    if let Some(out) = &a.output {
        let text = layout::amend(&source, &sizing.chosen)
            .map_err(|e| Failure::input(format!("{name}: {e}")))?;
        let back = layout::parse(&text, &out.display().to_string())
            .map_err(|e| Failure::output(format!("the sized layout does not read back: {e}")))?;
        if back.design.turns_per_coil != sizing.chosen.turns_per_coil
            || back.design.parallel_paths != sizing.chosen.parallel_paths
            || back.design.connection != sizing.chosen.connection
            || back.design.pitch != sizing.chosen.pitch
            || !same_wire(back.design.wire.as_ref(), sizing.chosen.wire.as_ref())
        {
            return Err(Failure::output(
                "the sized layout reads back as a different winding; nothing was written"
                    .to_string(),
            ));
        }
        write_atomic(out, &a.common.file, text.as_bytes(), "-o")?;
        note(&format!("wrote {}", out.display()));
    }
    Ok(present(sizing, a.common.format))
}

fn run_thrust(a: ThrustArgs) -> Result<Printed, Failure> {
    let slips = a.slip;
    let w = load(&a.common.file)?;
    // A speed range becomes the slips s = 1 − v/v_s, fastest first.
    let (from, to) = match a.speed {
        None => slips,
        Some((v0, v1)) => {
            let vs = beltwright::linear::figures(&w, Default::default())
                .synchronous_speed_m_s
                .filter(|v| *v > 0.0)
                .ok_or_else(|| {
                    Failure::input(format!(
                        "{}: --speed needs the synchronous speed: give core.slot_pitch_mm and \
                         supply.frequency_hz",
                        a.common.file.display()
                    ))
                })?;
            // Rounding dust at synchronism and standstill would read as a tiny slip.
            let snap = |s: f64| {
                if s.abs() < 1e-12 {
                    0.0
                } else if (s - 1.0).abs() < 1e-12 {
                    1.0
                } else {
                    s
                }
            };
            (snap(1.0 - v1 / vs), snap(1.0 - v0 / vs))
        }
    };
    let q = beltwright::thrust::ThrustQuery {
        current_a: a.current,
        slip_from: from,
        slip_to: to,
        steps: if from == to { 1 } else { a.steps },
        end_effect: !a.no_end_effect,
    };
    let r = beltwright::thrust::thrust(&w, &q)
        .map_err(|e| Failure::input(format!("{}: {}", a.common.file.display(), e.message())))?;
    Ok(present(r, a.common.format))
}

fn run_plates(a: PlatesArgs) -> Result<Printed, Failure> {
    let w = load(&a.common.file)?;
    let q = beltwright::plates::PlateQuery {
        thickness: a
            .thickness_mm
            .iter()
            .copied()
            .map(Length::from_mm)
            .collect(),
        metal: a.metal,
        clearance: a
            .clearance_mm
            .iter()
            .copied()
            .map(Length::from_mm)
            .collect(),
        current_a: a.current,
    };
    let r = beltwright::plates::plates(&w, &q)
        .map_err(|e| Failure::input(format!("{}: {}", a.common.file.display(), e.message())))?;
    if let Some(out) = &a.chart {
        let kind = FileKind::of_path(out).ok_or_else(|| {
            Failure::input(format!(
                "--chart {}: give a file name ending in .svg, .pdf or .png",
                out.display()
            ))
        })?;
        let study = beltwright::study::Study::new(&w, None);
        let page = page_of(PaperArg::A4, false);
        let svg = draw::plates::draw(&study, &r, &page);
        let paths = write_sheet(&[svg], kind, out, &a.common.file, 150.0)?;
        note(&wrote(&paths));
    }
    Ok(present(r, a.common.format))
}

fn run_audit(a: AuditArgs) -> Result<Printed, Failure> {
    let (spec, name, source) = read_spec_source(&a.common.file)?;
    let w = winding::build_lenient(&spec).map_err(|e| plan_failure(&name, &source, &spec, &e))?;
    let design = intended(a.intended.as_deref(), &w, &name)?;
    let report = audit::audit(&w, design.as_ref());
    let (sound, found) = (report.sound, report.findings.len());
    let out = present(report, a.common.format);
    if sound {
        Ok(out)
    } else {
        Err(Failure {
            message: format!(
                "{name}: the audit found {}; see the findings",
                beltwright::numbering::count(found, "problem", "problems")
            ),
            status: 1,
            report: Some(out),
        })
    }
}

/// The intended design of `--intended`, for `audit` and `report` alike: loaded, and
/// refused unless it is the record's core (same topology and slot count).
fn intended(path: Option<&Path>, w: &Winding, name: &str) -> Result<Option<Winding>, Failure> {
    let Some(p) = path else { return Ok(None) };
    let d = load(p)?;
    if d.geometry.slots != w.geometry.slots || d.geometry.topology != w.geometry.topology {
        return Err(Failure::input(format!(
            "--intended {}: the design is a {} core of {} slots but the record {} is a {} core \
             of {}; compare designs of the same core",
            p.display(),
            d.geometry.topology,
            d.geometry.slots,
            name,
            w.geometry.topology,
            w.geometry.slots
        )));
    }
    Ok(Some(d))
}

fn run_rewind(a: RewindArgs) -> Result<Printed, Failure> {
    let conductor = match (a.wire_diameter_mm, a.conductor_mm2) {
        (Some(d), _) => Some(OldConductor::Diameter(Length::from_mm(d))),
        (None, Some(x)) => Some(OldConductor::Area(Area::from_mm2(x))),
        (None, None) => None,
    };
    let old = load(&a.from)?;
    let new = load(&a.to)?;
    let report =
        rewind::rewind(&old, &new, conductor, a.wires_in_hand, a.line_current_a).map_err(|e| {
            Failure::input(format!(
                "{} -> {}: {}",
                a.from.display(),
                a.to.display(),
                e.message()
            ))
        })?;
    Ok(present(report, a.format))
}

/// `beltwright field`: check the flags, compute, present, and write the sheet if asked.
fn run_field(a: FieldArgs) -> Result<Printed, Failure> {
    if let Some(out) = &a.svg {
        check_output(out, &[&a.common.file], "--svg")?;
    }
    let w = at_speed(load(&a.common.file)?, a.speed, &a.common.file)?;
    let orders = (a.upto * w.geometry.poles as f64 / 2.0).floor();
    if orders > field::MAX_ORDERS as f64 {
        return Err(Failure::input(format!(
            "--upto {} would list {orders} mechanical orders on this {}-pole core; give at most {}",
            a.upto,
            w.geometry.poles,
            field::MAX_ORDERS as f64 / (w.geometry.poles as f64 / 2.0)
        )));
    }
    let currents = match &a.currents {
        Some(text) => beltwright::phasors::parse_currents(text, w.geometry.phases)
            .map_err(|e| Failure::input(format!("--currents: {e}")))?,
        // A pole-changing winding's higher speed fed as its board feeds it: L1, L2, L3 on
        // the taps in the standard's order, which is not the phases' (so its field turns
        // as `speeds` says). The lower speed's board feeds 1U, 1V, 1W: the phases in order.
        None if a.speed == Some(SpeedArg::High)
            && !winding::pole_change::feeds_in_order(&winding::pole_change::HIGH_SPEED) =>
        {
            field::balanced_currents(w.geometry.phases, winding::star::Sequence::Negative)
        }
        None => field::balanced_currents(w.geometry.phases, a.sequence.into()),
    };
    let opts = FieldOptions {
        currents,
        opening: a.slot_opening,
        upto: a.upto,
        at_deg: a.at_deg,
        slip: a.slip,
    };
    let name = a.common.file.display().to_string();
    let fail = |e: field::FieldError| Failure::input(format!("{name}: {}", e.message()));
    let report = field::field(&w, &opts).map_err(fail)?;
    if let Some(out) = &a.svg {
        let snaps = field::snapshots(&w, &opts, beltwright::study::FIELD_INSTANTS).map_err(fail)?;
        let study = Study::new(&w, None);
        let sheet = draw::field::draw_report(&study, &report, &snaps, &Page::default());
        write_atomic(out, &a.common.file, sheet.as_bytes(), "--svg")?;
    }
    Ok(present(report, a.common.format))
}

fn pitch(a: PitchArgs) -> Result<Printed, Failure> {
    if let Some(path) = &a.svg {
        check_output(path, &[&a.common.file], "--svg")?;
    }
    let w = load(&a.common.file)?;
    let goal = PitchGoal {
        suppress: a.suppress,
        min_fundamental: a.min_fundamental,
    };
    let report = pitch::compare(&w, &goal);
    if let Some(path) = &a.svg {
        write_atomic(
            path,
            &a.common.file,
            draw::span::draw(&Study::new(&w, None), &report, &Page::default()).as_bytes(),
            "--svg",
        )?;
    }
    Ok(present(report, a.common.format))
}

fn survey(a: SurveyArgs) -> Result<Printed, Failure> {
    let (lo, hi) = (*a.slots.start(), *a.slots.end());
    let (plo, phi) = (*a.poles.start(), *a.poles.end());
    let combos = (hi - lo + 1) * (phi - plo + 1) * a.layers.len();
    if combos > survey::MAX_COMBINATIONS {
        return Err(Failure::input(format!(
            "{combos} combinations is too many for one survey (at most {}, which keeps it \
             below 300 MB); narrow --slots or --poles, or survey the range in parts",
            survey::MAX_COMBINATIONS
        )));
    }
    // Rows the star-of-slots kernel cannot score (single layer, flat primaries) are planned
    // one by one at a cost that grows with the slot count: bound their total so a survey
    // finishes in seconds (about 11 s at the bound on a 2-core machine).
    let planned_layers = a
        .layers
        .iter()
        .filter(|&&l| l == 1 || matches!(a.topology, TopologyArg::Linear))
        .count();
    let slot_sum: usize = (lo..=hi).sum();
    let work = slot_sum as f64 * (phi - plo + 1) as f64 * planned_layers as f64;
    if work > SURVEY_PLANNED_WORK {
        return Err(Failure::input(format!(
            "this survey would plan {} slot-rows one by one (single-layer or flat-primary \
             rows); at most {} are planned in one survey; narrow --slots or --poles",
            beltwright::numbering::short(work),
            beltwright::numbering::short(SURVEY_PLANNED_WORK)
        )));
    }
    let query = SurveyQuery {
        slots: a.slots,
        poles: a.poles,
        layers: a.layers,
        phases: a.phases,
        topology: match a.topology {
            TopologyArg::Rotary => Topology::Rotary,
            TopologyArg::Linear => Topology::Linear,
        },
    };
    if a.pole_change {
        if query.phases != 3 || query.topology != Topology::Rotary {
            return Err(Failure::input(
                "--pole-change surveys three-phase rotary cores (a flat primary changes speed \
                 by its supply frequency); drop --phases and --topology linear"
                    .to_string(),
            ));
        }
        let work = survey::two_speed::work(&query);
        if work > survey::two_speed::MAX_WORK {
            return Err(Failure::input(format!(
                "this survey would synthesize {} span-slots (every span of every fitting \
                 combination); at most {} in one survey; narrow --slots or --poles",
                beltwright::numbering::short(work),
                beltwright::numbering::short(survey::two_speed::MAX_WORK)
            )));
        }
        let mut report = survey::two_speed::two_speed(&query);
        if a.feasible {
            report.rows.retain(|r| r.fits);
        }
        if let Some(k) = a.min_kw {
            report.rows.retain(|r| {
                r.low_speed_winding_factor
                    .zip(r.high_speed_winding_factor)
                    .is_some_and(|(l, h)| l.min(h) >= k)
            });
        }
        return Ok(present(report, a.format));
    }
    let n = survey::combinations(&query).len() as u64;
    // On a terminal any survey that may take a second shows its progress.
    // Off a terminal nothing is shown and nothing is counted: a hidden bar's inc() still
    // takes its lock, once per combination.
    let mut report = if std::io::stderr().is_terminal() && n > 200 {
        let bar = ProgressBar::new(n);
        let report = survey::survey(&query, &|| bar.inc(1));
        bar.finish_and_clear();
        report
    } else {
        survey::survey(&query, &|| {})
    };
    survey::filter_and_sort(&mut report, a.min_kw, a.feasible, a.sort.into());
    Ok(present(report, a.format))
}

/// Write one output file (as a set of one), never over an input.
fn write_atomic(path: &Path, input: &Path, bytes: &[u8], flag: &str) -> Result<(), Failure> {
    write_set(
        &[(path.to_path_buf(), bytes.to_vec())],
        &Vec::new,
        &[input],
        flag,
    )
}

/// The report, to be written straight onto stdout in `format` once the command is done.
fn present<R: Report + 'static>(report: R, format: impl Into<Format>) -> Printed {
    let format = format.into();
    Box::new(move |out: &mut dyn Write| output::write(&report, format, out))
}

/// Whether `out` names an HTML page (`report -o x.html`).
pub(super) fn is_html(out: &Path) -> bool {
    out.extension()
        .is_some_and(|e| e.eq_ignore_ascii_case("html") || e.eq_ignore_ascii_case("htm"))
}

/// Write the HTML page `html` to `out` whole, never over one of `inputs`.
pub(super) fn write_page(out: &Path, html: String, inputs: &[&Path]) -> Result<Printed, Failure> {
    write_set(
        &[(out.to_path_buf(), html.into_bytes())],
        &Vec::new,
        inputs,
        "-o",
    )?;
    Ok(say(wrote(std::slice::from_ref(&out.to_path_buf()))))
}

/// Lines of text for stdout.
pub(super) fn say(text: String) -> Printed {
    Box::new(move |out: &mut dyn Write| out.write_all(text.as_bytes()))
}

/// A pole-changing winding at the speed asked for: as laid out (high), or at twice the
/// poles (low); any other winding only as laid out.
fn at_speed(w: Winding, speed: Option<SpeedArg>, file: &Path) -> Result<Winding, Failure> {
    match speed {
        None | Some(SpeedArg::High) if w.design.pole_change.is_some() || speed.is_none() => Ok(w),
        Some(SpeedArg::Low) if w.design.pole_change.is_some() => {
            let mut low = winding::pole_change::lower_speed(&w).unwrap_or(w);
            let title = low.labels.title.take().unwrap_or_default();
            low.labels.title = Some(format!(
                "{title} (lower speed, {} poles)",
                low.geometry.poles
            ));
            Ok(low)
        }
        _ => Err(Failure::input(format!(
            "{}: --speed is for a pole-changing winding (winding.pole_change); this one has \
             one speed, so leave --speed out",
            file.display()
        ))),
    }
}

/// Read and validate a layout file and build its winding.
fn load(path: &Path) -> Result<Winding, Failure> {
    let (spec, name, source) = read_spec_source(path)?;
    if spec.second.is_some() {
        return Err(Failure::input(format!(
            "{name}: two windings in one core ([second_winding]); this command works on one \
             winding. Plan, factors, field, card, audit, draw and report serve the pair"
        )));
    }
    winding::build(&spec).map_err(|e| plan_failure(&name, &source, &spec, &e))
}

/// A winding refused after parsing, with the key (and its line) the refusal is about.
pub(super) fn plan_failure(
    name: &str,
    source: &str,
    spec: &layout::Spec,
    e: &winding::PlanError,
) -> Failure {
    use winding::PlanError;
    let (table, index, key) = match e {
        PlanError::Paths(_) => ("winding", 0, "parallel_paths"),
        PlanError::SinglePhase(r) => single_phase_key(r),
        PlanError::Overfilled(o) => ("coil", o.coils.first().map_or(0, |c| c.index()), "go"),
        PlanError::Infeasible(_) if spec.design.pitch.is_some() && spec.coils.is_empty() => {
            ("winding", 0, "pitch")
        }
        PlanError::Infeasible(_) => ("machine", 0, "slots"),
    };
    let dotted = if table == "coil" {
        format!("coil[{}].{key}", index + 1)
    } else {
        format!("{table}.{key}")
    };
    let line = layout::locate(source, table, index, key)
        .map(|l| format!(", line {l}"))
        .unwrap_or_default();
    Failure::input(format!("{name}{line}: {dotted}: {}", e.message()))
}

/// The layout key a single-phase refusal is about.
fn single_phase_key(
    r: &winding::single_phase::SinglePhaseRefusal,
) -> (&'static str, usize, &'static str) {
    use winding::single_phase::{MAIN, SinglePhaseRefusal as R};
    let table = |p: usize| if p == MAIN { "main" } else { "aux" };
    match r {
        R::SlotsPerPole { .. } => ("machine", 0, "slots"),
        R::TooManyCoils { part, .. } => (table(*part), 0, "coils_per_group"),
        R::TurnsList { part, .. } | R::TooFewTurns { part, .. } => (table(*part), 0, "turns"),
        R::Layers { .. } => ("winding", 0, "layers"),
    }
}

/// Read and validate a layout file, keeping its text for line numbers. Each file is read
/// once in a run: the routing of a single-phase or two-winding stator and the command that
/// serves it see the same text, even if the file changes in between.
pub(super) fn read_spec_source(path: &Path) -> Result<(layout::Spec, String, String), Failure> {
    type Read = (PathBuf, layout::Spec, String, String);
    static READ: std::sync::Mutex<Vec<Read>> = std::sync::Mutex::new(Vec::new());
    let mut read = READ.lock().unwrap_or_else(|poisoned| poisoned.into_inner());
    if let Some((_, spec, name, source)) = read.iter().find(|r| r.0 == path) {
        return Ok((spec.clone(), name.clone(), source.clone()));
    }
    let name = path.display().to_string();
    let source = files::read_layout(path)?;
    let spec = layout::parse(&source, &name).map_err(|e| Failure::input(e.to_string()))?;
    read.push((
        path.to_path_buf(),
        spec.clone(),
        name.clone(),
        source.clone(),
    ));
    Ok((spec, name, source))
}

/// Write one sheet's pages in `kind` to `path` (and `NAME-2.ext`... for SVG/PNG pages).
pub(super) fn write_sheet(
    pages: &[String],
    kind: FileKind,
    path: &Path,
    input: &Path,
    dpi: f64,
) -> Result<Vec<PathBuf>, Failure> {
    let files = sheet_files(pages, kind, path, dpi)?;
    let n = files.len();
    let stale = || stale_pages(path, kind, n);
    write_set(&files, &stale, &[input], "-o")?;
    Ok(files.into_iter().map(|(n, _)| n).collect())
}

/// Pages of an earlier, longer set under this name (NAME-k.ext beyond this set's last `n`),
/// each with the set it must name to be removed (the file name of page 1).
fn stale_pages(path: &Path, kind: FileKind, n: usize) -> Vec<(PathBuf, String)> {
    let set = set_name(path);
    match kind {
        FileKind::Pdf => Vec::new(),
        _ => draw::export::page_names(path, n..n + 4096)
            .into_iter()
            .take_while(|p| p.exists())
            .map(|p| (p, set.clone()))
            .collect(),
    }
}

/// The name a set of pages is marked with: the file name of its first page.
fn set_name(path: &Path) -> String {
    path.file_name()
        .map_or_else(String::new, |n| n.to_string_lossy().into_owned())
}

/// The files of one sheet: a PDF of every page, or an SVG or PNG per page.
fn sheet_files(
    pages: &[String],
    kind: FileKind,
    path: &Path,
    dpi: f64,
) -> Result<Vec<(PathBuf, Vec<u8>)>, Failure> {
    let export = |e: draw::ExportError| match e {
        draw::ExportError::Bound(_) => Failure::input(format!("-o {}: {e}", path.display())),
        _ => Failure::output(format!("{}: {e}", path.display())),
    };
    if kind == FileKind::Png {
        draw::export::check_png_work(pages).map_err(export)?;
    }
    let files: Vec<(PathBuf, Vec<u8>)> = match kind {
        FileKind::Pdf => vec![(
            path.to_path_buf(),
            draw::export::to_pdf(pages).map_err(export)?,
        )],
        FileKind::Svg | FileKind::Png => {
            let names = draw::export::page_paths(path, pages.len());
            let set = set_name(path);
            let mut v = Vec::with_capacity(pages.len());
            for (name, svg) in names.into_iter().zip(pages) {
                // Every page names its set, so only this set's own pages are ever stale.
                let svg = draw::export::with_set(svg, &set);
                let bytes = match kind {
                    FileKind::Png => draw::export::to_png(&svg, dpi).map_err(export)?,
                    _ => svg.into_bytes(),
                };
                v.push((name, bytes));
            }
            v
        }
    };
    Ok(files)
}

/// The output kind named by a sheet file's extension.
pub(super) fn sheet_kind(output: &Path) -> Result<FileKind, Failure> {
    FileKind::of_path(output).ok_or_else(|| {
        Failure::input(format!(
            "-o {}: give a file name ending in .svg, .pdf or .png (report also takes .html)",
            output.display()
        ))
    })
}

pub(super) fn page_of(size: PaperArg, portrait: bool) -> Page {
    Page {
        size: size.into(),
        orientation: if portrait {
            Orientation::Portrait
        } else {
            Orientation::Landscape
        },
    }
}

pub(super) fn wrote(paths: &[PathBuf]) -> String {
    paths
        .iter()
        .map(|p| format!("wrote {}\n", p.display()))
        .collect()
}

/// `plan --out DIR`: slot, connection and data-card sheets (SVG and PDF) and the plan JSON.
fn write_pack(study: &Study, input: &Path, dir: &Path) -> Result<(), Failure> {
    let report = study.plan();
    std::fs::create_dir_all(dir).map_err(|e| {
        Failure::output(format!(
            "--out {}: cannot make the folder: {e}",
            dir.display()
        ))
    })?;
    let stem = input
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "winding".into());
    let page = Page::default();
    // The whole pack is one set: written under one lock and renamed into place together,
    // or not at all (a full disk leaves the folder as it was).
    let mut files: Vec<(PathBuf, Vec<u8>)> = Vec::new();
    let mut svg_sets: Vec<(PathBuf, usize)> = Vec::new();
    for sheet in [Sheet::Slots, Sheet::Connections, Sheet::Card] {
        let pages = draw::draw(study, sheet, &page);
        for kind in [FileKind::Svg, FileKind::Pdf] {
            let ext = if kind == FileKind::Svg { "svg" } else { "pdf" };
            let path = dir.join(format!("{stem}-{}.{ext}", sheet.name()));
            let set = sheet_files(&pages, kind, &path, 150.0)?;
            if kind == FileKind::Svg {
                svg_sets.push((path, set.len()));
            }
            files.extend(set);
        }
    }
    let json = render(report, Format::Json)
        .map_err(|e| Failure::output(format!("could not write the plan JSON: {e}")))?;
    files.push((dir.join(format!("{stem}-plan.json")), json.into_bytes()));
    let stale = || {
        svg_sets
            .iter()
            .flat_map(|(p, n)| stale_pages(p, FileKind::Svg, *n))
            .collect()
    };
    write_set(&files, &stale, &[input], "--out")?;
    for (p, _) in &files {
        note(&format!("wrote {}", p.display()));
    }
    Ok(())
}
