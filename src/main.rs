//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; this file is the only one that touches the disk.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use clap::{Args, Parser, Subcommand};

use beltwright::audit;
use beltwright::factors;
use beltwright::layout;
use beltwright::linear::Operating;
use beltwright::output::{Format, Report, render};
use beltwright::plan;
use beltwright::rewind::{self, OldConductor};
use beltwright::winding::{self, Winding};

const EXAMPLES: &str = "\
Examples:
  beltwright plan layouts/pallet-shuttle.toml
  beltwright plan layouts/pump-rewind.toml --format json
  beltwright plan layouts/pallet-shuttle.toml --slip 0.08 --airgap-power-w 1500
  beltwright factors layouts/fan-stator.toml --upto 31 --format csv
  beltwright audit layouts/hoist-rewind-faulty.toml --intended layouts/hoist-rewind-sound.toml
  beltwright rewind layouts/hoist-rewind-sound.toml layouts/hoist-rewind-new.toml --wire-diameter-mm 1.12

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
    /// Check an as-found or as-wound coil list: balance, phase sequence, paths, slot fill,
    /// and the coils to fix (exit status 1 when anything is wrong).
    #[command(after_help = EXAMPLES)]
    Audit(AuditArgs),
    /// Turns per coil and wire size for a changed design on the same core.
    #[command(after_help = EXAMPLES)]
    Rewind(RewindArgs),
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
    #[arg(long, value_enum, default_value_t = Format::Text)]
    format: Format,
    /// Bare copper diameter of one old wire, in mm (as measured with a micrometer).
    #[arg(long = "wire-diameter-mm", conflicts_with = "conductor_mm2")]
    wire_diameter_mm: Option<f64>,
    /// Bare copper cross-section of one old wire, in mm².
    #[arg(long = "conductor-mm2")]
    conductor_mm2: Option<f64>,
    /// Wires in hand (wound in parallel as one conductor) in the old winding.
    #[arg(long = "wires-in-hand", default_value_t = 1)]
    wires_in_hand: u32,
}

/// A failure at the edge: what to print, and the exit status.
struct Failure {
    message: String,
    status: u8,
    /// A report still printed on stdout (an audit that found faults).
    report: Option<String>,
}

impl Failure {
    fn input(message: impl Into<String>) -> Self {
        Failure {
            message: message.into(),
            status: 2,
            report: None,
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
            if let Some(out) = &f.report {
                print!("{out}");
            }
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
        Command::Audit(a) => run_audit(a),
        Command::Rewind(a) => run_rewind(a),
    }
}

fn run_audit(a: AuditArgs) -> Result<String, Failure> {
    let (spec, name) = read_spec(&a.common.file)?;
    let w = winding::build_lenient(&spec).map_err(|e| Failure::input(format!("{name}: {e}")))?;
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
    let old = load(&a.from)?;
    let new = load(&a.to)?;
    let report = rewind::rewind(&old, &new, conductor, a.wires_in_hand)
        .map_err(|e| Failure::input(format!("{} -> {}: {e}", a.from.display(), a.to.display())))?;
    present(&report, a.format)
}

fn present<R: Report>(report: &R, format: Format) -> Result<String, Failure> {
    render(report, format).map_err(|e| Failure {
        message: format!("could not write the report: {e}"),
        status: 1,
        report: None,
    })
}

/// Read and validate a layout file and build its winding.
fn load(path: &Path) -> Result<Winding, Failure> {
    let (spec, name) = read_spec(path)?;
    winding::build(&spec).map_err(|e| Failure::input(format!("{name}: {e}")))
}

/// Read and validate a layout file.
fn read_spec(path: &Path) -> Result<(layout::Spec, String), Failure> {
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
    Ok((spec, name))
}
