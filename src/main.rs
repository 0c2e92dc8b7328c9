//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; this file is the only one that touches the disk.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Args, Parser, Subcommand};

use beltwright::factors;
use beltwright::field::{self, FieldOptions, Sequence};
use beltwright::layout;
use beltwright::linear::Operating;
use beltwright::output::{Format, Report, render};
use beltwright::plan;
use beltwright::winding::{self, Winding};

const EXAMPLES: &str = "\
Examples:
  beltwright plan layouts/pallet-shuttle.toml
  beltwright plan layouts/pump-rewind.toml --format json
  beltwright plan layouts/pallet-shuttle.toml --slip 0.08 --airgap-power-w 1500
  beltwright factors layouts/fan-stator.toml --upto 31 --format csv
  beltwright field layouts/pump-rewind.toml --upto 49 --svg pump-field.svg
  beltwright field layouts/pallet-shuttle.toml --slip 0.1 --format json

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
    #[arg(long, value_enum, default_value_t = Sequence::Positive, conflicts_with = "currents")]
    sequence: Sequence,
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
    /// Slip of the secondary for its speed (0 to 1).
    #[arg(long, allow_negative_numbers = true)]
    slip: Option<f64>,
    /// Also write the field sheet (SVG) to this file.
    #[arg(long)]
    svg: Option<PathBuf>,
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
            present(&plan::plan(&w, op), a.common.format)
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
        Command::Field(a) => run_field(a),
    }
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
    if let Some(s) = a.slip
        && !(0.0..=1.0).contains(&s)
    {
        return Err(Failure::input(format!(
            "--slip {s} is not valid; give a slip from 0 to 1"
        )));
    }
    if let Some(out) = &a.svg
        && same_file(out, &a.common.file)
    {
        return Err(Failure::input(format!(
            "--svg {}: that is the layout file; give another file name for the sheet",
            out.display()
        )));
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
        None => field::balanced_currents(w.geometry.phases, a.sequence),
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
        write_atomically(out, field::svg::field_sheet(&report, &snaps).as_bytes())?;
    }
    present(&report, a.common.format)
}

/// True when two paths name the same existing file.
fn same_file(a: &Path, b: &Path) -> bool {
    match (std::fs::canonicalize(a), std::fs::canonicalize(b)) {
        (Ok(x), Ok(y)) => x == y,
        _ => false,
    }
}

/// Write `bytes` to `path` through a temporary file in the same directory and a rename, so
/// a reader never sees half a file.
fn write_atomically(path: &Path, bytes: &[u8]) -> Result<(), Failure> {
    use std::io::Write;
    let shown = path.display().to_string();
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let err = |e: std::io::Error| Failure {
        message: format!("{shown}: cannot write the file: {e}"),
        status: 2,
    };
    let mut tmp = tempfile::NamedTempFile::new_in(&dir).map_err(err)?;
    tmp.write_all(bytes).map_err(err)?;
    tmp.as_file().sync_all().map_err(err)?;
    tmp.persist(path).map_err(|e| err(e.error))?;
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
