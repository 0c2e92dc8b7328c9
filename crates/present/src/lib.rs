//! beltwright's presenters: the study's reports in words, as text, JSON and CSV
//! ([`output`]), as the shop's sheets in SVG, PDF and PNG ([`draw`]) and as one HTML page.
//! Presenters read reports; they run no analysis of their own.

use beltwright_model::{design, iron, numbering, sanitize, spec, units, winding};
use beltwright_study::{
    assumption, audit, card, factors, field, header, inductance, layers, loading, pitch, plan,
    plates, rewind, single_phase, sizing, speeds, study, survey, thrust, two_winding, warnings,
};

pub mod draw;
pub mod output;
pub mod safety;
