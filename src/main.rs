//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; this file is the only one that touches the disk.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Args, Parser, Subcommand};

use beltwright::factors;
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
    }
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
