//! beltwright's analyses: pure functions of a [`winding::Winding`] returning typed reports
//! (serde-serialisable, no words, no TOML, no files). Factors, field, span comparison,
//! survey, audit, data card, rewind, flat-primary thrust and inductance.
//!
//! The presenters (`beltwright-present`) put these reports into words, tables and sheets;
//! this crate cannot see them.

use beltwright_model::{design, iron, network, numbering, spec, units, winding, wire};

pub mod assumption;
pub mod audit;
pub mod card;
pub mod factors;
pub mod field;
pub mod header;
pub mod inductance;
pub mod layers;
pub mod leakage;
pub mod linear;
pub mod loading;
pub mod packing;
pub mod pitch;
pub mod plan;
pub mod plates;
pub mod record;
pub mod rewind;
pub mod runs;
pub mod single_phase;
pub mod sizing;
pub mod speeds;
pub mod study;
pub mod survey;
pub mod thrust;
pub mod two_winding;
pub mod warnings;
