//! beltwright: plan and check polyphase windings.
//!
//! Pipeline: layout file (TOML) → [`layout::Spec`] ([`design::Labels`], [`design::Design`],
//! coil list) → [`winding::Winding`] (the design plus its coils) → analyses
//! ([`factors`], [`field`], [`leakage`], [`audit`], [`rewind`], [`pitch`], [`survey`],
//! [`linear`], [`plan`]) → presenters ([`output`]). Analyses are pure functions of the
//! `Winding`; only the binary touches the file system.

pub mod assumption;
pub mod audit;
pub mod card;
pub mod design;
pub mod draw;
pub mod factors;
pub mod field;
pub mod header;
pub mod inductance;
pub mod layout;
pub mod leakage;
pub mod linear;
pub mod numbering;
pub mod output;
pub mod pitch;
pub mod plan;
pub mod rewind;
pub mod safety;
pub mod sanitize;
pub mod survey;
pub mod thrust;
pub mod warnings;
pub mod winding;
