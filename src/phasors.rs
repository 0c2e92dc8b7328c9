//! What a command-line flag carries beyond a plain number: a list of phase-current phasors
//! (`--currents 1@0,1@-120,1@120`). Read here, at the edge, so the analyses take phasors
//! and never text.

use num_complex::Complex64;
use thiserror::Error;

/// Why a `--currents` list was refused, in the command line's words.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum PhasorError {
    /// The list does not give one phasor per phase.
    #[error(
        "{} given for {phases} phases; give one `magnitude@angle_deg` per phase",
        crate::numbering::count(*.given, "current", "currents")
    )]
    Count {
        /// How many were given.
        given: usize,
        /// How many phases the winding has.
        phases: usize,
    },
    /// One item of the list could not be read.
    #[error("`{item}` is not a current phasor: {why}; write magnitude@angle_deg, e.g. 1@-120")]
    Bad {
        /// The item as written.
        item: String,
        /// What is wrong with it.
        why: &'static str,
    },
}

/// Read a list of phase-current phasors written `magnitude@angle_deg`, comma separated, one
/// per phase in phase order (e.g. `1@0,1@-120,1@120`).
pub fn parse_currents(text: &str, phases: usize) -> Result<Vec<Complex64>, PhasorError> {
    let items: Vec<&str> = text.split(',').map(str::trim).collect();
    if items.len() != phases {
        return Err(PhasorError::Count {
            given: items.len(),
            phases,
        });
    }
    items
        .iter()
        .map(|item| {
            let bad = |why: &'static str| PhasorError::Bad {
                item: item.to_string(),
                why,
            };
            let (m, a) = item.split_once('@').ok_or_else(|| bad("no `@`"))?;
            let m: f64 = m
                .trim()
                .parse()
                .map_err(|_| bad("the magnitude is not a number"))?;
            let a: f64 = a
                .trim()
                .parse()
                .map_err(|_| bad("the angle is not a number"))?;
            if !(0.0..=1e9).contains(&m) {
                return Err(bad("the magnitude must be from 0 to 1e9"));
            }
            if !(a.is_finite() && a.abs() <= 1e6) {
                return Err(bad("the angle must be a finite number of degrees"));
            }
            Ok(Complex64::from_polar(m, a.to_radians()))
        })
        .collect()
}
