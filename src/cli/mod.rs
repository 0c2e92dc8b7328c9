//! The command line's parts: arguments, commands, files, and failures with their exit
//! status.

pub mod args;
pub mod book;
pub mod commands;
pub mod files;
pub mod flags;
pub mod single_phase;
pub mod two_winding;

use std::io::Write;

/// A line on stderr for the user, cleaned as stdout is (no control or bidirectional
/// characters from a file's name or contents reach the terminal); a closed stderr is not
/// worth failing over.
pub fn note(message: &str) {
    let clean: Vec<String> = message
        .split('\n')
        .map(|l| beltwright::sanitize::clean(l).into_owned())
        .collect();
    let _ = writeln!(std::io::stderr().lock(), "{}", clean.join("\n"));
}

/// Exit status for output that could not be made or written, or a failure inside the tool:
/// apart from 1 (an audit found faults) and 2 (bad input or usage).
pub const EXIT_FAILURE: u8 = 3;

/// What a command prints on stdout: written straight into it (JSON streamed as serde walks
/// the report, text and CSV a line or a table at a time) once the command has succeeded.
pub type Printed = Box<dyn FnOnce(&mut dyn Write) -> std::io::Result<()>>;

/// A failure at the edge: what to print, and the exit status.
pub struct Failure {
    /// What went wrong and what would be valid.
    pub message: String,
    /// 1 faults found, 2 bad input or usage, 3 output or internal failure.
    pub status: u8,
    /// A report still printed on stdout (an audit that found faults).
    pub report: Option<Printed>,
}

impl Failure {
    /// Bad input or usage: exit status 2.
    pub fn input(message: impl Into<String>) -> Self {
        Failure {
            message: message.into(),
            status: 2,
            report: None,
        }
    }

    /// Output that could not be made or written: exit status 3.
    pub fn output(message: impl Into<String>) -> Self {
        Failure {
            message: message.into(),
            status: EXIT_FAILURE,
            report: None,
        }
    }
}
