//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; this file is the only one that touches the disk.

use std::io::{IsTerminal, Write};
use std::ops::RangeInclusive;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Args, Parser, Subcommand};
use indicatif::ProgressBar;

use beltwright::draw::{self, FileKind, Orientation, Page, PaperSize, Sheet};
use beltwright::factors;
use beltwright::layout;
use beltwright::linear::Operating;
use beltwright::output::{Format, Report, pitch_chart, render};
use beltwright::pitch::{self, PitchGoal};
use beltwright::plan;
use beltwright::survey::{self, SortKey, SurveyQuery};
use beltwright::winding::{self, Topology, Winding};

const EXAMPLES: &str = "\
Examples:
  beltwright plan layouts/pallet-shuttle.toml
  beltwright plan layouts/pump-rewind.toml --format json
  beltwright plan layouts/pallet-shuttle.toml --slip 0.08 --airgap-power-w 1500
  beltwright factors layouts/fan-concentric.toml --upto 31 --format csv
  beltwright pitch layouts/pump-rewind.toml --suppress 5,7 --svg span.svg
  beltwright survey --slots 6..=72 --poles 2..=16 --layers 1,2 --sort winding
  beltwright draw layouts/pallet-shuttle.toml --sheet slots -o shuttle-slots.pdf
  beltwright draw layouts/pump-rewind.toml --sheet connections --page a3 -o pump.svg
  beltwright plan layouts/pump-rewind.toml --out pump-pack

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
    /// Compare every feasible coil span and recommend one.
    #[command(after_help = EXAMPLES)]
    Pitch(PitchArgs),
    /// Survey slot/pole combinations: feasibility, best span, k_w1, leakage and more.
    #[command(after_help = EXAMPLES)]
    Survey(SurveyArgs),
    /// Draw a shop-floor sheet as SVG, PDF or PNG (format from the output file's extension).
    #[command(after_help = EXAMPLES)]
    Draw(DrawArgs),
}

#[derive(Args)]
struct Common {
    /// Layout file (TOML).
    file: PathBuf,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
}

#[derive(Args)]
struct PlanArgs {
    #[command(flatten)]
    common: Common,
    /// Slip of the secondary for the speed figures (0 to 1).
    #[arg(long)]
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
    sheet: Sheet,
    /// Paper size.
    #[arg(long, value_enum, default_value_t = PaperSize::A4)]
    page: PaperSize,
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
struct FactorsArgs {
    #[command(flatten)]
    common: Common,
    /// Highest electrical order listed.
    #[arg(long, default_value_t = 25.0)]
    upto: f64,
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
    #[arg(long, value_enum, default_value_t = SortKey::Slots)]
    sort: SortKey,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
}

#[derive(Clone, Copy, clap::ValueEnum)]
enum TopologyArg {
    Rotary,
    Linear,
}

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

/// A failure at the edge: what to print, and the exit status.
struct Failure {
    message: String,
    status: u8,
}

impl Failure {
    fn input(message: impl Into<String>) -> Self {
        Failure {
            message: message.into(),
            status: 2,
        }
    }
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match run(cli) {
        Ok(out) => {
            print!("{out}");
            ExitCode::SUCCESS
        }
        Err(f) => {
            eprintln!("beltwright: {}", f.message);
            ExitCode::from(f.status)
        }
    }
}

fn run(cli: Cli) -> Result<String, Failure> {
    match cli.command {
        Command::Plan(a) => {
            if let Some(s) = a.slip
                && !(0.0..=1.0).contains(&s)
            {
                return Err(Failure::input(format!(
                    "--slip {s} is not valid; give a slip from 0 to 1"
                )));
            }
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
            let kind = FileKind::of_path(&a.output).ok_or_else(|| {
                Failure::input(format!(
                    "-o {}: give a file name ending in .svg, .pdf or .png",
                    a.output.display()
                ))
            })?;
            if !(a.dpi.is_finite() && (10.0..=1200.0).contains(&a.dpi)) {
                return Err(Failure::input(format!(
                    "--dpi {} is not valid; give a resolution from 10 to 1200",
                    a.dpi
                )));
            }
            let w = load(&a.file)?;
            let page = Page {
                size: a.page,
                orientation: if a.portrait {
                    Orientation::Portrait
                } else {
                    Orientation::Landscape
                },
            };
            let pages = draw::draw(&w, a.sheet, &page);
            let written = write_sheet(&pages, kind, &a.output, &a.file, a.dpi)?;
            Ok(written
                .iter()
                .map(|p| format!("wrote {}\n", p.display()))
                .collect())
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
        Command::Pitch(a) => pitch(a),
        Command::Survey(a) => survey(a),
    }
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
        .find(|o| !(o.is_finite() && **o > 0.0 && **o <= 10_000.0))
    {
        return Err(Failure::input(format!(
            "--suppress {o} is not valid; give harmonic orders above 0, e.g. 5,7"
        )));
    }
    let w = load(&a.common.file)?;
    let goal = PitchGoal {
        suppress: a.suppress,
        min_fundamental: a.min_fundamental,
    };
    let report = pitch::compare(&w, &goal);
    if let Some(path) = &a.svg {
        write_atomic(path, &a.common.file, pitch_chart(&report).as_bytes())?;
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
    let bar = if std::io::stderr().is_terminal() && n > 2_000 {
        ProgressBar::new(n)
    } else {
        ProgressBar::hidden()
    };
    let mut report = survey::survey(&query, &|| bar.inc(1));
    bar.finish_and_clear();
    survey::filter_and_sort(&mut report, a.min_kw, a.feasible, a.sort);
    present(&report, a.format)
}

/// Write `bytes` to `path` through a temporary file in the same folder and a rename, so a
/// reader never sees half a file; refuse to write over the layout being read.
fn write_atomic(path: &Path, input: &Path, bytes: &[u8]) -> Result<(), Failure> {
    let name = path.display().to_string();
    if let (Ok(a), Ok(b)) = (path.canonicalize(), input.canonicalize())
        && a == b
    {
        return Err(Failure::input(format!(
            "{name}: refusing to write over the layout file being read"
        )));
    }
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let fail = |e: std::io::Error| Failure::input(format!("{name}: cannot write: {e}"));
    let mut tmp = tempfile::NamedTempFile::new_in(&dir).map_err(fail)?;
    tmp.write_all(bytes).map_err(fail)?;
    // Temporary files are private (0600); an output file is an ordinary one.
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        tmp.as_file()
            .set_permissions(std::fs::Permissions::from_mode(0o644))
            .map_err(fail)?;
    }
    tmp.persist(path).map_err(|e| fail(e.error))?;
    Ok(())
}

fn present<R: Report>(report: &R, format: Format) -> Result<String, Failure> {
    render(report, format).map_err(|e| Failure {
        message: format!("could not write the report: {e}"),
        status: 1,
    })
}

/// Read and validate a layout file and build its winding.
fn load(path: &Path) -> Result<Winding, Failure> {
    let name = path.display().to_string();
    let meta = std::fs::metadata(path)
        .map_err(|e| Failure::input(format!("{name}: cannot read the layout file: {e}")))?;
    if meta.len() > 16 * 1024 * 1024 {
        return Err(Failure::input(format!(
            "{name}: {} bytes is too large for a layout file (at most 16 MiB)",
            meta.len()
        )));
    }
    let source = std::fs::read_to_string(path)
        .map_err(|e| Failure::input(format!("{name}: cannot read the layout file: {e}")))?;
    let spec = layout::parse(&source, &name).map_err(|e| Failure::input(e.to_string()))?;
    winding::build(&spec).map_err(|e| Failure::input(format!("{name}: {e}")))
}

/// Write one sheet's pages in `kind` to `path` (and `NAME-2.ext`... for SVG/PNG pages).
fn write_sheet(
    pages: &[String],
    kind: FileKind,
    path: &Path,
    input: &Path,
    dpi: f64,
) -> Result<Vec<PathBuf>, Failure> {
    let export = |e: draw::ExportError| Failure {
        message: format!("{}: {e}", path.display()),
        status: 1,
    };
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
    for (name, bytes) in &files {
        write_atomic(name, input, bytes)?;
    }
    Ok(files.into_iter().map(|(n, _)| n).collect())
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
                eprintln!("wrote {}", p.display());
            }
        }
    }
    let json = render(report, Format::Json).map_err(|e| Failure {
        message: format!("could not write the plan JSON: {e}"),
        status: 1,
    })?;
    let path = dir.join(format!("{stem}-plan.json"));
    write_atomic(&path, input, json.as_bytes())?;
    eprintln!("wrote {}", path.display());
    Ok(())
}
