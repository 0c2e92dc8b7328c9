//! beltwright: plan and check polyphase windings.
//!
//! Pipeline: layout file (TOML) → [`layout::Spec`] → [`winding::Winding`] → analyses
//! ([`factors`], [`linear`]) → presenters ([`output`]). Analyses are pure functions of the
//! `Winding`; only the binary touches the file system.

pub mod draw;
pub mod factors;
pub mod layout;
pub mod leakage;
pub mod linear;
pub mod output;
pub mod pitch;
pub mod plan;
pub mod survey;
pub mod winding;
