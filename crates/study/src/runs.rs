//! How often each analysis has run in this process: the check that a command works each
//! report out once (the study, [`crate::study::Study`]) and that no presenter runs an
//! analysis of its own. One relaxed atomic add per analysis run; nothing else reads them.

use std::sync::atomic::{AtomicUsize, Ordering};

/// The analyses that are counted: each report-making function of the study.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Analysis {
    /// `plan::plan`.
    Plan,
    /// `factors::factor_table`.
    Factors,
    /// `field::field`.
    Field,
    /// `field::snapshots`.
    FieldSnapshots,
    /// `pitch::compare`.
    Pitch,
    /// `audit::audit`.
    Audit,
    /// `card::card`.
    Card,
    /// `thrust::thrust`.
    Thrust,
    /// `inductance::inductance`.
    Inductance,
    /// `loading::of`.
    Loading,
    /// `sizing::size`.
    Sizing,
    /// `speeds::speeds`.
    Speeds,
    /// `single_phase::study`.
    SinglePhase,
    /// `two_winding::TwoStudy::report`.
    TwoWinding,
    /// `packing::slot_packing`.
    Packing,
}

impl Analysis {
    /// The analyses that report on one winding (a study's); the sizing makes a new winding
    /// and is not among them.
    pub const OF_A_WINDING: [Analysis; 11] = [
        Analysis::Plan,
        Analysis::Factors,
        Analysis::Field,
        Analysis::FieldSnapshots,
        Analysis::Pitch,
        Analysis::Audit,
        Analysis::Card,
        Analysis::Thrust,
        Analysis::Inductance,
        Analysis::Loading,
        Analysis::Packing,
    ];
}

/// One counter per [`Analysis`] variant.
static RUNS: [AtomicUsize; 15] = [const { AtomicUsize::new(0) }; 15];

/// Count one run of `a`.
pub fn count(a: Analysis) {
    RUNS[a as usize].fetch_add(1, Ordering::Relaxed);
}

/// Runs of `a` so far in this process.
pub fn runs(a: Analysis) -> usize {
    RUNS[a as usize].load(Ordering::Relaxed)
}
