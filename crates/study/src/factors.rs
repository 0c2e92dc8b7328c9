//! The factor table: the winding factors of the first phase at every present order, from
//! the model's star-of-slots sums ([`beltwright_model::factors`]), with the design header.

pub use beltwright_model::factors::*;
use serde::Serialize;

use crate::winding::Winding;

/// Factors of one phase at every present order up to a limit.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct FactorTable {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Phase the factors belong to (the first phase; all are equal when balanced).
    pub phase: String,
    /// Rows in increasing order.
    pub rows: Vec<FactorRow>,
    /// True for a single-layer winding (tooth coils aside), whose factors are reported as
    /// distribution with k_p = 1: its slot contents fix the field whatever the span.
    pub single_layer: bool,
}

/// The factor table of `w` up to electrical order `upto` ([`factor_rows`]).
pub fn factor_table(w: &Winding, upto: f64) -> FactorTable {
    crate::runs::count(crate::runs::Analysis::Factors);
    FactorTable {
        design: crate::header::of(w),
        phase: w.design.phase_labels[0].clone(),
        rows: factor_rows(w, upto),
        single_layer: reported_as_single_layer(w),
    }
}
