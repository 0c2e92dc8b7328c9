//! beltwright command line: parse arguments, read files, call the library, write output.
//! Everything else lives in the library; the binary (this file and `src/cli/`) is the only
//! part that touches the disk.

use std::io::Write;
use std::process::ExitCode;

use clap::Parser;

mod cli;
use cli::args::Cli;
use cli::commands::run;
use cli::files;
use cli::{EXIT_FAILURE, Printed, note};

/// Write what the command printed straight onto stdout. A closed pipe (`beltwright survey
/// ... | head -1`) ends quietly as Unix tools do; any other write error (a full device) is
/// a failure.
fn emit(printed: Printed) -> Result<(), std::io::Error> {
    let mut stdout = std::io::BufWriter::new(std::io::stdout().lock());
    match printed(&mut stdout).and_then(|()| stdout.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => other,
    }
}

fn main() -> ExitCode {
    // Usage errors are printed through `note`, cleaned like every other message, so an
    // argument holding control characters never reaches the terminal raw; help and version
    // are printed as clap prints them.
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) if !e.use_stderr() => {
            let _ = e.print();
            return ExitCode::SUCCESS;
        }
        Err(e) => {
            note(e.render().to_string().trim_end());
            return ExitCode::from(2);
        }
    };
    files::clean_up_on_signals();
    let (out, failure) = match run(cli) {
        Ok(out) => (Some(out), None),
        Err(mut f) => (f.report.take(), Some(f)),
    };
    if let Some(out) = out
        && let Err(e) = emit(out)
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
