//! beltwright: plan and check polyphase windings.
//!
//! The house is four crates, each a layer that sees only the ones below it:
//! `beltwright-model` (design, winding, star-of-slots kernel), `beltwright-study` (the
//! analyses, typed reports), `beltwright-present` (words, text/JSON/CSV, sheets, the HTML
//! page) and this one, the command line with its TOML adapter ([`layout`]). The modules of
//! the three below are re-exported here under their own names, so one path reaches each.

pub use beltwright_model::{design, iron, numbering, sanitize, spec, units, winding, wire};
pub use beltwright_present::{draw, output, safety};
pub use beltwright_study::{
    assumption, audit, card, factors, field, header, inductance, layers, leakage, linear, loading,
    packing, pitch, plan, plates, record, rewind, runs, single_phase, sizing, speeds, study,
    survey, thrust, two_winding, warnings,
};

pub mod book;
pub mod layout;
pub mod phasors;
