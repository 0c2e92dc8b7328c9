//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; this file is the only one that touches the disk.

use std::io::{IsTerminal, Write};
use std::ops::RangeInclusive;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Args, Parser, Subcommand};

mod cli;
use cli::args::{FormatArg, PaperArg, SequenceArg, SheetArg, SortArg};
use cli::files::{self, check_output, write_set};
use cli::{EXIT_FAILURE, Failure};
use indicatif::ProgressBar;

use beltwright::audit;
use beltwright::draw::span_chart::pitch_chart;
use beltwright::draw::{self, FileKind, Orientation, Page, Sheet};
use beltwright::factors;
use beltwright::field::{self, FieldOptions};
use beltwright::layout;
use beltwright::linear::Operating;
use beltwright::output::{Format, Report, render};
use beltwright::pitch::{self, PitchGoal};
use beltwright::plan;
use beltwright::rewind::{self, OldConductor};
use beltwright::survey::{self, SurveyQuery};
use beltwright::winding::{self, Topology, Winding};

const EXAMPLES: &str = "\
Examples (stator.toml, primary.toml and the others stand for your own layout files):
  beltwright plan stator.toml
  beltwright plan stator.toml --format json
  beltwright plan primary.toml --slip 0.08 --airgap-power-w 1500
  beltwright factors stator.toml --upto 31 --format csv
  beltwright field stator.toml --upto 49 --svg field.svg
  beltwright field primary.toml --slip -0.1 --format json
  beltwright pitch stator.toml --suppress 5,7 --svg span.svg
  beltwright survey --slots 6..=72 --poles 2..=16 --layers 1,2 --sort winding
  beltwright audit as-found.toml --intended design.toml
  beltwright rewind old.toml new.toml --wire-diameter-mm 1.12
  beltwright card stator.toml
  beltwright thrust primary.toml --slip 0..=1 --steps 10
  beltwright inductance primary.toml
  beltwright draw stator.toml --sheet connections --page a3 -o connections.pdf
  beltwright report stator.toml -o stator.html
  beltwright plan stator.toml --out shop-pack

Caution: windings run at mains voltage. Work on them de-energised, test insulation
before energising, and follow local electrical codes and qualified practice.";

/// Plan and check polyphase windings for rotary stators and linear primaries.
#[derive(Parser)]
#[command(name = "beltwright", version, about, after_help = EXAMPLES)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Lay out a winding: slot table, coil list, groups, phase EMFs and figures.
    #[command(after_help = EXAMPLES)]
    Plan(PlanArgs),
    /// Distribution, pitch, skew and winding factors per harmonic order.
    #[command(after_help = EXAMPLES)]
    Factors(FactorsArgs),
    /// Travelling field: MMF along the gap, forward/backward spectrum, leakage, field sheet.
    #[command(after_help = EXAMPLES)]
    Field(FieldArgs),
    /// Compare every feasible coil span and recommend one.
    #[command(after_help = EXAMPLES)]
    Pitch(PitchArgs),
    /// Survey slot/pole combinations: feasibility, best span, k_w1, leakage and more.
    #[command(after_help = EXAMPLES)]
    Survey(SurveyArgs),
    /// Check an as-found or as-wound coil list: balance, phase sequence, paths, slot fill,
    /// and the coils to fix (exit status 1 when anything is wrong).
    #[command(after_help = EXAMPLES)]
    Audit(AuditArgs),
    /// The winding data card: wire, mean turn, resistances, copper mass, slot fill, lead
    /// markings with connection tables, and acceptance figures.
    #[command(after_help = EXAMPLES)]
    Card(Common),
    /// A flat primary's thrust, normal force, current, power factor and efficiency against
    /// slip, from the winding and the secondary plate (edge and end effects included).
    #[command(after_help = EXAMPLES)]
    Thrust(ThrustArgs),
    /// Phase (and coil) inductances by winding functions; a flat primary's unbalance under
    /// balanced voltages, and its other layouts ranked by it.
    #[command(after_help = EXAMPLES)]
    Inductance(InductanceArgs),
    /// Print shell completions for bash, zsh, fish, elvish or PowerShell.
    Completions {
        /// The shell.
        #[arg(value_enum)]
        shell: clap_complete::Shell,
    },
    /// Print the manual page (roff), made from the same definitions as --help.
    #[command(hide = true)]
    Man,
    /// Turns per coil and wire size for a changed design on the same core.
    #[command(after_help = EXAMPLES)]
    Rewind(RewindArgs),
    /// Draw a shop-floor sheet as SVG, PDF or PNG (format from the output file's extension).
    #[command(after_help = EXAMPLES)]
    Draw(DrawArgs),
    /// The whole design in one go: every sheet in one PDF, or every report as text.
    #[command(after_help = EXAMPLES)]
    Report(ReportArgs),
}

#[derive(Args)]
struct Common {
    /// Layout file (TOML).
    file: PathBuf,
    /// Output format.
    #[arg(long, value_enum, default_value_t = FormatArg::Text)]
    format: FormatArg,
}

#[derive(Args)]
struct PlanArgs {
    #[command(flatten)]
    common: Common,
    /// Slip of the secondary for the speed figures (below 0 generating, above 1 plugging).
    #[arg(long, allow_negative_numbers = true)]
    slip: Option<f64>,
    /// Air-gap power in watts, for thrust (linear) or torque (rotary).
    #[arg(long = "airgap-power-w")]
    airgap_power_w: Option<f64>,
    /// Also write the shop pack into this folder: slot and connection sheets (SVG and PDF)
    /// and the plan as JSON. The folder is made if absent.
    #[arg(long)]
    out: Option<PathBuf>,
}

#[derive(Args)]
struct DrawArgs {
    /// Layout file (TOML).
    file: PathBuf,
    /// Which sheet to draw.
    #[arg(long, value_enum)]
    sheet: SheetArg,
    /// Paper size.
    #[arg(long, value_enum, default_value_t = PaperArg::A4)]
    page: PaperArg,
    /// Portrait instead of landscape.
    #[arg(long)]
    portrait: bool,
    /// Output file: .svg, .pdf or .png. Sheets of several pages write NAME-2.svg... (PDF: one file).
    #[arg(short = 'o', long = "output")]
    output: PathBuf,
    /// Resolution of PNG output, dots per inch.
    #[arg(long, default_value_t = 150.0)]
    dpi: f64,
}

#[derive(Args)]
struct ReportArgs {
    /// Layout file (TOML).
    file: PathBuf,
    /// Write the whole design to this file: .html gives one self-contained page with every
    /// table and sheet; .pdf every sheet in one document; .svg or .png give NAME.svg,
    /// NAME-2.svg, ... Without it, the plan, factors and field reports are printed as text.
    #[arg(short = 'o', long = "output")]
    output: Option<PathBuf>,
    /// For a coil list: the intended design to audit it against (HTML report).
    #[arg(long)]
    intended: Option<PathBuf>,
    /// Paper size.
    #[arg(long, value_enum, default_value_t = PaperArg::A4)]
    page: PaperArg,
    /// Portrait instead of landscape.
    #[arg(long)]
    portrait: bool,
    /// Resolution of PNG output, dots per inch.
    #[arg(long, default_value_t = 150.0)]
    dpi: f64,
}

#[derive(Args)]
struct ThrustArgs {
    #[command(flatten)]
    common: Common,
    /// Feed a fixed r.m.s. phase current, amperes, instead of the supply voltage.
    #[arg(long)]
    current: Option<f64>,
    /// Slip range, e.g. 0..=1 or -0.2..=1.2 (below 0 generating, above 1 plugging).
    #[arg(long, default_value = "0..=1", allow_hyphen_values = true)]
    slip: String,
    /// Speed range of the secondary instead, m/s, e.g. 0..=6 (turned into slips).
    #[arg(long, allow_hyphen_values = true, conflicts_with = "slip")]
    speed: Option<String>,
    /// Intervals between the first and last slip of the table.
    #[arg(long, default_value_t = 20)]
    steps: usize,
    /// Leave out the longitudinal end effect, to see what the ends cost.
    #[arg(long = "no-end-effect")]
    no_end_effect: bool,
}

#[derive(Args)]
struct InductanceArgs {
    #[command(flatten)]
    common: Common,
    /// Also give the coil-by-coil matrix (windings of up to 200 coils).
    #[arg(long)]
    coils: bool,
}

#[derive(Args)]
struct FactorsArgs {
    #[command(flatten)]
    common: Common,
    /// Highest electrical order listed.
    #[arg(long, default_value_t = 25.0)]
    upto: f64,
}

#[derive(Args)]
struct AuditArgs {
    #[command(flatten)]
    common: Common,
    /// The intended design (layout file) to compare with slot by slot.
    #[arg(long)]
    intended: Option<PathBuf>,
}

#[derive(Args)]
struct RewindArgs {
    /// Old design (layout file with its turns per coil and supply).
    from: PathBuf,
    /// New design (layout file: changed span, layers, connection, paths, voltage or frequency).
    to: PathBuf,
    /// Output format.
    #[arg(long, value_enum, default_value_t = FormatArg::Text)]
    format: FormatArg,
    /// Bare copper diameter of one old wire, in mm (as measured with a micrometer).
    #[arg(long = "wire-diameter-mm", conflicts_with = "conductor_mm2")]
    wire_diameter_mm: Option<f64>,
    /// Bare copper cross-section of one old wire, in mm².
    #[arg(long = "conductor-mm2")]
    conductor_mm2: Option<f64>,
    /// Wires in hand (wound in parallel as one conductor) in the old winding.
    #[arg(long = "wires-in-hand", default_value_t = 1)]
    wires_in_hand: u32,
    /// Rated line current of the old winding, amperes (nameplate), for the new rating.
    #[arg(long = "line-current-a")]
    line_current_a: Option<f64>,
}

#[derive(Args)]
struct FieldArgs {
    #[command(flatten)]
    common: Common,
    /// Highest electrical order listed.
    #[arg(long, default_value_t = 25.0)]
    upto: f64,
    /// Instant of the MMF snapshot, electrical degrees (omega*t).
    #[arg(long = "at-deg", default_value_t = 0.0, allow_negative_numbers = true)]
    at_deg: f64,
    /// Balanced phase currents in this sequence.
    #[arg(long, value_enum, default_value_t = SequenceArg::Positive, conflicts_with = "currents")]
    sequence: SequenceArg,
    /// Phase-current phasors, one per phase: "magnitude@angle_deg,..." e.g. "1@0,1@-120,1@120".
    #[arg(long)]
    currents: Option<String>,
    /// Slot-opening width in slot pitches (0 to below 1); current spread evenly across it.
    #[arg(
        long = "slot-opening",
        default_value_t = 0.0,
        allow_negative_numbers = true
    )]
    slot_opening: f64,
    /// Slip of the secondary for its speed (below 0 generating, above 1 plugging).
    #[arg(long, allow_negative_numbers = true)]
    slip: Option<f64>,
    /// Also write the field sheet (SVG) to this file.
    #[arg(long)]
    svg: Option<PathBuf>,
}

#[derive(Args)]
struct PitchArgs {
    #[command(flatten)]
    common: Common,
    /// Harmonic orders to suppress, comma-separated.
    #[arg(long, value_delimiter = ',', default_values_t = [5.0, 7.0, 11.0, 13.0])]
    suppress: Vec<f64>,
    /// Lowest acceptable fundamental winding factor k_w1.
    #[arg(long = "min-fundamental", default_value_t = 0.9)]
    min_fundamental: f64,
    /// Also draw factor against span as an SVG chart to this file.
    #[arg(long)]
    svg: Option<PathBuf>,
}

#[derive(Args)]
struct SurveyArgs {
    /// Slot counts, e.g. 12..=48 (or a single count).
    #[arg(long, value_parser = parse_range)]
    slots: RangeInclusive<usize>,
    /// Pole counts, e.g. 2..=16 (rotary: odd counts are skipped).
    #[arg(long, value_parser = parse_range)]
    poles: RangeInclusive<usize>,
    /// Layer counts to try, comma-separated.
    #[arg(long, value_delimiter = ',', default_values_t = [2usize])]
    layers: Vec<usize>,
    /// Phase count (odd, 3 or more).
    #[arg(long, default_value_t = 3)]
    phases: usize,
    /// Closed rotary core or flat linear primary.
    #[arg(long, value_enum, default_value_t = TopologyArg::Rotary)]
    topology: TopologyArg,
    /// Keep only combinations with k_w1 at least this.
    #[arg(long = "min-kw")]
    min_kw: Option<f64>,
    /// Keep only feasible combinations.
    #[arg(long)]
    feasible: bool,
    /// Sort order.
    #[arg(long, value_enum, default_value_t = SortArg::Slots)]
    sort: SortArg,
    /// Output format.
    #[arg(long, value_enum, default_value_t = FormatArg::Text)]
    format: FormatArg,
}

#[derive(Clone, Copy, clap::ValueEnum)]
enum TopologyArg {
    Rotary,
    Linear,
}

/// Largest Σ(slots) × poles × planned layers a survey plans row by row.
const SURVEY_PLANNED_WORK: f64 = 2.5e7;

/// `A..=B`, `A..B` or a single number.
fn parse_range(s: &str) -> Result<RangeInclusive<usize>, String> {
    let bad = || format!("{s:?} is not a range; write A..=B (e.g. 12..=48) or one number");
    let num = |t: &str| t.trim().parse::<usize>().map_err(|_| bad());
    let (a, b) = if let Some((a, b)) = s.split_once("..=") {
        (num(a)?, num(b)?)
    } else if let Some((a, b)) = s.split_once("..") {
        (num(a)?, num(b)?.checked_sub(1).ok_or_else(bad)?)
    } else {
        let n = num(s)?;
        (n, n)
    };
    if a > b {
        return Err(format!(
            "{s:?} is empty; the first number must not exceed the last"
        ));
    }
    Ok(a..=b)
}

/// Write the report to stdout. A closed pipe (`beltwright survey ... | head -1`) ends
/// quietly as Unix tools do; any other write error (a full device) is a failure.
fn emit(out: &str) -> Result<(), std::io::Error> {
    let mut stdout = std::io::stdout().lock();
    match stdout
        .write_all(out.as_bytes())
        .and_then(|()| stdout.flush())
    {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => other,
    }
}

/// A line on stderr for the user; a closed stderr is not worth failing over.
fn note(message: &str) {
    let _ = writeln!(std::io::stderr().lock(), "{message}");
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    files::clean_up_on_signals();
    let (out, failure) = match run(cli) {
        Ok(out) => (Some(out), None),
        Err(mut f) => (f.report.take(), Some(f)),
    };
    if let Some(out) = out
        && let Err(e) = emit(&out)
    {
        note(&format!("beltwright: cannot write the output: {e}"));
        return ExitCode::from(EXIT_FAILURE);
    }
    match failure {
        None => ExitCode::SUCCESS,
        Some(f) => {
            note(&format!("beltwright: {}", f.message));
            ExitCode::from(f.status)
        }
    }
}

fn run(cli: Cli) -> Result<String, Failure> {
    match cli.command {
        Command::Plan(a) => {
            check_slip(a.slip)?;
            if let Some(p) = a.airgap_power_w
                && !(p.is_finite() && p >= 0.0)
            {
                return Err(Failure::input(format!(
                    "--airgap-power-w {p} is not valid; give a power of 0 W or more"
                )));
            }
            let w = load(&a.common.file)?;
            let op = Operating {
                slip: a.slip,
                airgap_power_w: a.airgap_power_w,
            };
            let report = plan::plan(&w, op);
            if let Some(dir) = &a.out {
                write_pack(&w, &a.common.file, dir, &report)?;
            }
            present(&report, a.common.format)
        }
        Command::Draw(a) => {
            let kind = sheet_kind(&a.output, a.dpi)?;
            let w = load(&a.file)?;
            let pages = draw::draw(&w, a.sheet.into(), &page_of(a.page, a.portrait));
            let written = write_sheet(&pages, kind, &a.output, &a.file, a.dpi)?;
            Ok(wrote(&written))
        }
        Command::Report(a) => {
            let Some(out) = &a.output else {
                let w = load(&a.file)?;
                let mut text = present(&plan::plan(&w, Operating::default()), Format::Text)?;
                text += "\n";
                text += &present(&factors::factor_table(&w, 25.0), Format::Text)?;
                if let Ok(f) = field::field(&w, &FieldOptions::balanced(&w)) {
                    text += "\n";
                    text += &present(&f, Format::Text)?;
                }
                return Ok(text);
            };
            if out
                .extension()
                .is_some_and(|e| e.eq_ignore_ascii_case("html") || e.eq_ignore_ascii_case("htm"))
            {
                let (spec, name, source) = read_spec_source(&a.file)?;
                let w = winding::build_lenient(&spec)
                    .map_err(|e| plan_failure(&name, &source, &spec, &e))?;
                let intended = match &a.intended {
                    Some(p) => Some(load(p)?),
                    None => None,
                };
                let html = beltwright::output::html::document(&w, intended.as_ref());
                write_atomic(out, &a.file, html.as_bytes(), "-o")?;
                return Ok(wrote(std::slice::from_ref(out)));
            }
            let kind = sheet_kind(out, a.dpi)?;
            let w = load(&a.file)?;
            let page = page_of(a.page, a.portrait);
            let pages: Vec<String> = Sheet::ALL
                .into_iter()
                .filter(|s| s.applies(&w))
                .flat_map(|sheet| draw::draw(&w, sheet, &page))
                .collect();
            let written = write_sheet(&pages, kind, out, &a.file, a.dpi)?;
            Ok(wrote(&written))
        }
        Command::Factors(a) => {
            if !(a.upto.is_finite() && (1.0..=10_000.0).contains(&a.upto)) {
                return Err(Failure::input(format!(
                    "--upto {} is not valid; give an order from 1 to 10000",
                    a.upto
                )));
            }
            let w = load(&a.common.file)?;
            present(&factors::factor_table(&w, a.upto), a.common.format)
        }
        Command::Card(a) => {
            let w = load(&a.file)?;
            present(&beltwright::card::card(&w), a.format)
        }
        Command::Completions { shell } => {
            let mut cmd = <Cli as clap::CommandFactory>::command();
            let mut buf = Vec::new();
            clap_complete::generate(shell, &mut cmd, "beltwright", &mut buf);
            String::from_utf8(buf).map_err(|e| Failure::output(e.to_string()))
        }
        Command::Man => {
            let cmd = <Cli as clap::CommandFactory>::command();
            let mut buf = Vec::new();
            clap_mangen::Man::new(cmd)
                .render(&mut buf)
                .map_err(|e| Failure::output(e.to_string()))?;
            String::from_utf8(buf).map_err(|e| Failure::output(e.to_string()))
        }
        Command::Thrust(a) => run_thrust(a),
        Command::Inductance(a) => {
            let w = load(&a.common.file)?;
            let r = beltwright::inductance::inductance(&w, a.coils)
                .map_err(|e| Failure::input(format!("{}: {e}", a.common.file.display())))?;
            present(&r, a.common.format)
        }
        Command::Field(a) => run_field(a),
        Command::Pitch(a) => pitch(a),
        Command::Survey(a) => survey(a),
        Command::Audit(a) => run_audit(a),
        Command::Rewind(a) => run_rewind(a),
    }
}

/// A current flag, when given: 0.001 to 100 000 A.
fn check_current(flag: &str, current: Option<f64>) -> Result<(), Failure> {
    match current {
        Some(i) if !(i.is_finite() && (1e-3..=1e5).contains(&i)) => Err(Failure::input(format!(
            "{flag} {} is not valid; give a current from 0.001 to 100000 A",
            beltwright::numbering::short(i)
        ))),
        _ => Ok(()),
    }
}

/// `A..=B` of real numbers within ±`limit`, or one number, for the flag `flag`.
fn parse_range_f64(s: &str, flag: &str, limit: f64) -> Result<(f64, f64), Failure> {
    let bad = || {
        Failure::input(format!(
            "{flag} {s:?} is not a range; write A..=B, e.g. 0..=6"
        ))
    };
    let num = |t: &str| t.trim().parse::<f64>().map_err(|_| bad());
    let (a, b) = match s.split_once("..=") {
        Some((a, b)) => (num(a)?, num(b)?),
        None => {
            let v = num(s)?;
            (v, v)
        }
    };
    if !(a.is_finite() && b.is_finite() && a.abs() <= limit && b.abs() <= limit) || a > b {
        return Err(Failure::input(format!(
            "{flag} {s:?}: give A..=B with A no more than B, within ±{limit}"
        )));
    }
    Ok((a, b))
}

/// A slip from -10 to 10: below 0 the secondary overtakes the field (generating), above 1
/// it runs against it (plugging).
fn check_slip(slip: Option<f64>) -> Result<(), Failure> {
    match slip {
        Some(s) if !(s.is_finite() && (-10.0..=10.0).contains(&s)) => Err(Failure::input(format!(
            "--slip {} is not valid; give a slip from -10 to 10 (below 0 generating, above 1 \
             plugging)",
            beltwright::numbering::short(s)
        ))),
        _ => Ok(()),
    }
}

fn run_thrust(a: ThrustArgs) -> Result<String, Failure> {
    let slips = parse_range_f64(&a.slip, "--slip", 10.0)?;
    if !(1..=10_000).contains(&a.steps) {
        return Err(Failure::input(format!(
            "--steps {} is not valid; give 1 to 10000",
            a.steps
        )));
    }
    check_current("--current", a.current)?;
    let w = load(&a.common.file)?;
    // A speed range becomes the slips s = 1 − v/v_s, fastest first.
    let (from, to) = match &a.speed {
        None => slips,
        Some(text) => {
            let (v0, v1) = parse_range_f64(text, "--speed", 1e4)?;
            let vs = beltwright::linear::figures(&w, Default::default())
                .synchronous_speed_m_s
                .filter(|v| *v > 0.0)
                .ok_or_else(|| {
                    Failure::input(
                        "--speed needs the synchronous speed: give core.slot_pitch_mm and \
                         supply.frequency_hz",
                    )
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
        .map_err(|e| Failure::input(format!("{}: {e}", a.common.file.display())))?;
    present(&r, a.common.format)
}

fn run_audit(a: AuditArgs) -> Result<String, Failure> {
    let (spec, name, source) = read_spec_source(&a.common.file)?;
    let w = winding::build_lenient(&spec).map_err(|e| plan_failure(&name, &source, &spec, &e))?;
    let design = match &a.intended {
        Some(p) => {
            let d = load(p)?;
            if d.geometry.slots != w.geometry.slots {
                return Err(Failure::input(format!(
                    "--intended {}: the design has {} slots but the record {} has {}; compare \
                     designs of the same core",
                    p.display(),
                    d.geometry.slots,
                    name,
                    w.geometry.slots
                )));
            }
            Some(d)
        }
        None => None,
    };
    let report = audit::audit(&w, design.as_ref());
    let out = present(&report, a.common.format)?;
    if report.sound {
        Ok(out)
    } else {
        Err(Failure {
            message: format!(
                "{name}: the audit found {} problem(s); see the findings",
                report.findings.len()
            ),
            status: 1,
            report: Some(out),
        })
    }
}

fn run_rewind(a: RewindArgs) -> Result<String, Failure> {
    let check = |flag: &str, v: f64| {
        if v.is_finite() && v > 0.0 && v < 1000.0 {
            Ok(v)
        } else {
            Err(Failure::input(format!(
                "{flag} {v} is not valid; give a positive size below 1000"
            )))
        }
    };
    let conductor = match (a.wire_diameter_mm, a.conductor_mm2) {
        (Some(d), _) => Some(OldConductor::DiameterMm(check("--wire-diameter-mm", d)?)),
        (None, Some(x)) => Some(OldConductor::AreaMm2(check("--conductor-mm2", x)?)),
        (None, None) => None,
    };
    if !(1..=100).contains(&a.wires_in_hand) {
        return Err(Failure::input(format!(
            "--wires-in-hand {} is not valid; give 1 to 100",
            a.wires_in_hand
        )));
    }
    check_current("--line-current-a", a.line_current_a)?;
    let old = load(&a.from)?;
    let new = load(&a.to)?;
    let report = rewind::rewind(&old, &new, conductor, a.wires_in_hand, a.line_current_a)
        .map_err(|e| Failure::input(format!("{} -> {}: {e}", a.from.display(), a.to.display())))?;
    present(&report, a.format)
}

/// `beltwright field`: check the flags, compute, present, and write the sheet if asked.
fn run_field(a: FieldArgs) -> Result<String, Failure> {
    if !(a.upto.is_finite() && (1.0..=10_000.0).contains(&a.upto)) {
        return Err(Failure::input(format!(
            "--upto {} is not valid; give an order from 1 to 10000",
            a.upto
        )));
    }
    if !(a.at_deg.is_finite() && a.at_deg.abs() <= 1e6) {
        return Err(Failure::input(format!(
            "--at-deg {} is not valid; give an angle in degrees",
            a.at_deg
        )));
    }
    if !(a.slot_opening.is_finite() && (0.0..field::MAX_OPENING).contains(&a.slot_opening)) {
        return Err(Failure::input(format!(
            "--slot-opening {} is not valid; give a width from 0 up to (not including) 1 slot pitch",
            a.slot_opening
        )));
    }
    check_slip(a.slip)?;
    if let Some(out) = &a.svg {
        check_output(out, &[&a.common.file], "--svg")?;
    }
    let w = load(&a.common.file)?;
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
        Some(text) => field::parse_currents(text, w.geometry.phases)
            .map_err(|e| Failure::input(format!("--currents: {e}")))?,
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
    let fail = |e: field::FieldError| Failure::input(format!("{name}: {e}"));
    let report = field::field(&w, &opts).map_err(fail)?;
    if let Some(out) = &a.svg {
        let snaps = field::snapshots(&w, &opts, 6).map_err(fail)?;
        write_atomic(
            out,
            &a.common.file,
            draw::field_chart::field_sheet(&report, &snaps).as_bytes(),
            "--svg",
        )?;
    }
    present(&report, a.common.format)
}

fn pitch(a: PitchArgs) -> Result<String, Failure> {
    if !(0.0..=1.0).contains(&a.min_fundamental) {
        return Err(Failure::input(format!(
            "--min-fundamental {} is not valid; give a winding factor from 0 to 1",
            a.min_fundamental
        )));
    }
    if let Some(o) = a
        .suppress
        .iter()
        .find(|o| !(o.is_finite() && **o > 0.0 && **o <= 10_000.0) || **o == 1.0)
    {
        return Err(Failure::input(format!(
            "--suppress {} is not valid; give harmonic orders other than 1 (the working wave), \
             e.g. 5,7",
            beltwright::numbering::short(*o)
        )));
    }
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
            pitch_chart(&report).as_bytes(),
            "--svg",
        )?;
    }
    present(&report, a.common.format)
}

fn survey(a: SurveyArgs) -> Result<String, Failure> {
    let (lo, hi) = (*a.slots.start(), *a.slots.end());
    if lo < 3 || hi > layout::MAX_SLOTS {
        return Err(Failure::input(format!(
            "--slots {lo}..={hi} is not valid; slot counts run from 3 to {}",
            layout::MAX_SLOTS
        )));
    }
    let (plo, phi) = (*a.poles.start(), *a.poles.end());
    if plo < 1 || phi > layout::MAX_POLES {
        return Err(Failure::input(format!(
            "--poles {plo}..={phi} is not valid; pole counts run from 1 to {}",
            layout::MAX_POLES
        )));
    }
    if let Some(l) = a.layers.iter().find(|l| !(1..=2).contains(*l)) {
        return Err(Failure::input(format!(
            "--layers {l} is not valid; give 1, 2 or 1,2"
        )));
    }
    if a.phases < 3 || a.phases.is_multiple_of(2) || a.phases > layout::MAX_PHASES {
        return Err(Failure::input(format!(
            "--phases {} is not valid; give an odd phase count from 3 to {}",
            a.phases,
            layout::MAX_PHASES
        )));
    }
    let combos = (hi - lo + 1) * (phi - plo + 1) * a.layers.len();
    if combos > 2_000_000 {
        return Err(Failure::input(format!(
            "{combos} combinations is too many for one survey; narrow --slots or --poles"
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
    present(&report, a.format)
}

/// Write one output file (as a set of one), never over an input.
fn write_atomic(path: &Path, input: &Path, bytes: &[u8], flag: &str) -> Result<(), Failure> {
    write_set(&[(path.to_path_buf(), bytes.to_vec())], &[], &[input], flag)
}

fn present<R: Report>(report: &R, format: impl Into<Format>) -> Result<String, Failure> {
    render(report, format.into())
        .map_err(|e| Failure::output(format!("could not write the report: {e}")))
}

/// Read and validate a layout file and build its winding.
fn load(path: &Path) -> Result<Winding, Failure> {
    let (spec, name, source) = read_spec_source(path)?;
    winding::build(&spec).map_err(|e| plan_failure(&name, &source, &spec, &e))
}

/// A winding refused after parsing, with the key (and its line) the refusal is about.
fn plan_failure(name: &str, source: &str, spec: &layout::Spec, e: &winding::PlanError) -> Failure {
    use winding::PlanError;
    let (table, index, key) = match e {
        PlanError::Paths { .. } => ("winding", 0, "parallel_paths"),
        PlanError::Overfilled { coils, .. } => ("coil", coils.first().map_or(0, |c| c - 1), "go"),
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
    Failure::input(format!("{name}{line}: {dotted}: {e}"))
}

/// Read and validate a layout file, keeping its text for line numbers.
fn read_spec_source(path: &Path) -> Result<(layout::Spec, String, String), Failure> {
    let name = path.display().to_string();
    let source = files::read_layout(path)?;
    let spec = layout::parse(&source, &name).map_err(|e| Failure::input(e.to_string()))?;
    Ok((spec, name, source))
}

/// Write one sheet's pages in `kind` to `path` (and `NAME-2.ext`... for SVG/PNG pages).
fn write_sheet(
    pages: &[String],
    kind: FileKind,
    path: &Path,
    input: &Path,
    dpi: f64,
) -> Result<Vec<PathBuf>, Failure> {
    let export = |e: draw::ExportError| Failure::output(format!("{}: {e}", path.display()));
    let files: Vec<(PathBuf, Vec<u8>)> = match kind {
        FileKind::Pdf => vec![(
            path.to_path_buf(),
            draw::export::to_pdf(pages).map_err(export)?,
        )],
        FileKind::Svg | FileKind::Png => {
            let names = draw::export::page_paths(path, pages.len());
            let mut v = Vec::with_capacity(pages.len());
            for (name, svg) in names.into_iter().zip(pages) {
                let bytes = match kind {
                    FileKind::Png => draw::export::to_png(svg, dpi).map_err(export)?,
                    _ => svg.clone().into_bytes(),
                };
                v.push((name, bytes));
            }
            v
        }
    };
    // Pages of an earlier, longer set under this name (NAME-k.ext beyond this set's last).
    let stale = match kind {
        FileKind::Pdf => Vec::new(),
        _ => draw::export::page_names(path, files.len()..files.len() + 4096)
            .into_iter()
            .take_while(|p| p.exists())
            .collect(),
    };
    write_set(&files, &stale, &[input], "-o")?;
    Ok(files.into_iter().map(|(n, _)| n).collect())
}

/// The output kind named by a sheet file's extension, with the PNG resolution checked.
fn sheet_kind(output: &Path, dpi: f64) -> Result<FileKind, Failure> {
    let kind = FileKind::of_path(output).ok_or_else(|| {
        Failure::input(format!(
            "-o {}: give a file name ending in .svg, .pdf or .png (report also takes .html)",
            output.display()
        ))
    })?;
    if !(dpi.is_finite() && (10.0..=1200.0).contains(&dpi)) {
        return Err(Failure::input(format!(
            "--dpi {dpi} is not valid; give a resolution from 10 to 1200"
        )));
    }
    Ok(kind)
}

fn page_of(size: PaperArg, portrait: bool) -> Page {
    Page {
        size: size.into(),
        orientation: if portrait {
            Orientation::Portrait
        } else {
            Orientation::Landscape
        },
    }
}

fn wrote(paths: &[PathBuf]) -> String {
    paths
        .iter()
        .map(|p| format!("wrote {}\n", p.display()))
        .collect()
}

/// `plan --out DIR`: slot and connection sheets (SVG and PDF) and the plan JSON.
fn write_pack(
    w: &Winding,
    input: &Path,
    dir: &Path,
    report: &plan::PlanReport,
) -> Result<(), Failure> {
    std::fs::create_dir_all(dir).map_err(|e| {
        Failure::input(format!(
            "--out {}: cannot make the folder: {e}",
            dir.display()
        ))
    })?;
    let stem = input
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "winding".into());
    let page = Page::default();
    for sheet in [Sheet::Slots, Sheet::Connections] {
        let pages = draw::draw(w, sheet, &page);
        for kind in [FileKind::Svg, FileKind::Pdf] {
            let ext = if kind == FileKind::Svg { "svg" } else { "pdf" };
            let path = dir.join(format!("{stem}-{}.{ext}", sheet.name()));
            for p in write_sheet(&pages, kind, &path, input, 150.0)? {
                note(&format!("wrote {}", p.display()));
            }
        }
    }
    let json = render(report, Format::Json)
        .map_err(|e| Failure::output(format!("could not write the plan JSON: {e}")))?;
    let path = dir.join(format!("{stem}-plan.json"));
    write_atomic(&path, input, json.as_bytes(), "--out")?;
    note(&format!("wrote {}", path.display()));
    Ok(())
}
