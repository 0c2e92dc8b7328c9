//! One study of one winding: every report a sheet, a title block, the HTML page or the PDF
//! report needs, each worked out at most once, when first asked for, and read from here by
//! every presenter. A command that prints one report calls its analysis directly; a command
//! that presents several (`draw`, `report`) makes one `Study` and hands it round.

use std::sync::OnceLock;

use crate::audit::{self, AuditReport};
use crate::card::{self, DataCard};
use crate::factors::{self, FactorTable};
use crate::field::{self, FieldError, FieldOptions, FieldReport, Snapshot};
use crate::header::{self, DesignHeader};
use crate::inductance::{self, InductanceReport};
use crate::pitch::{self, PitchGoal, PitchReport};
use crate::plan::{self, PlanReport};
use crate::single_phase::{self, SinglePhaseReport};
use crate::speeds::{self, SpeedsError, SpeedsReport};
use crate::thrust::{self, ThrustError, ThrustQuery, ThrustReport};
use crate::winding::{Topology, Winding};

/// Highest electrical order the study's factor table lists.
pub const FACTOR_ORDERS: f64 = 25.0;

/// Instants of the travelling field whose crests the field sheet marks.
pub const FIELD_INSTANTS: usize = 6;

/// The slips of the study's performance sweep: standstill to synchronism in steps of 0.01.
pub const THRUST_SWEEP: ThrustQuery = ThrustQuery {
    current_a: None,
    slip_from: 0.0,
    slip_to: 1.0,
    steps: 100,
    end_effect: true,
};

/// The reports of one winding, each computed once on first use.
pub struct Study<'w> {
    winding: &'w Winding,
    intended: Option<&'w Winding>,
    header: OnceLock<DesignHeader>,
    plan: OnceLock<PlanReport>,
    audit: OnceLock<Option<AuditReport>>,
    card: OnceLock<DataCard>,
    slot_packing: OnceLock<Option<crate::packing::SlotPacking>>,
    thrust: OnceLock<Result<ThrustReport, ThrustError>>,
    inductance: OnceLock<Option<Result<InductanceReport, ThrustError>>>,
    factors: OnceLock<FactorTable>,
    field: OnceLock<Result<FieldReport, FieldError>>,
    snapshots: OnceLock<Result<Vec<Snapshot>, FieldError>>,
    pitch: OnceLock<PitchReport>,
    speeds: OnceLock<Option<Result<SpeedsReport, SpeedsError>>>,
    single_phase: OnceLock<Option<SinglePhaseReport>>,
    /// Set when this winding shares its core with another and the pair's report found
    /// something between the two (`two_winding::TwoStudy`).
    pair_findings: OnceLock<()>,
}

impl<'w> Study<'w> {
    /// The study of `winding`; a recorded coil list is audited against `intended` when
    /// one is given.
    pub fn new(winding: &'w Winding, intended: Option<&'w Winding>) -> Self {
        Study {
            winding,
            intended,
            header: OnceLock::new(),
            plan: OnceLock::new(),
            audit: OnceLock::new(),
            card: OnceLock::new(),
            slot_packing: OnceLock::new(),
            thrust: OnceLock::new(),
            inductance: OnceLock::new(),
            factors: OnceLock::new(),
            field: OnceLock::new(),
            snapshots: OnceLock::new(),
            pitch: OnceLock::new(),
            speeds: OnceLock::new(),
            single_phase: OnceLock::new(),
            pair_findings: OnceLock::new(),
        }
    }

    /// Mark this winding's core as having findings between its two windings: its sheets
    /// then say it is not sound to wind from.
    pub fn mark_pair_findings(&self) {
        let _ = self.pair_findings.set(());
    }

    /// The winding studied.
    pub fn winding(&self) -> &'w Winding {
        self.winding
    }

    /// The design header every report opens with.
    pub fn header(&self) -> &DesignHeader {
        self.header.get_or_init(|| header::of(self.winding))
    }

    /// A study whose plan is `plan`, already worked out (by `plan` for its own report, at
    /// the user's slip): the shop pack's sheets read it instead of planning again.
    pub fn with_plan(winding: &'w Winding, plan: PlanReport) -> Self {
        let s = Study::new(winding, None);
        // A fresh study's plan is empty, so the set cannot fail.
        let _ = s.plan.set(plan);
        s
    }

    /// The plan (no operating point, unless the study was made [`Study::with_plan`]).
    pub fn plan(&self) -> &PlanReport {
        self.plan
            .get_or_init(|| plan::plan(self.winding, Default::default()))
    }

    /// The audit of a recorded coil list; `None` for a synthesized winding.
    pub fn audit(&self) -> Option<&AuditReport> {
        self.audit
            .get_or_init(|| {
                self.winding
                    .from_coil_list
                    .then(|| audit::audit(self.winding, self.intended))
            })
            .as_ref()
    }

    /// Whether the winding may be wound and connected from its sheets: balanced (the
    /// model's own test, no report needed), and, for a recorded coil list, without audit
    /// findings.
    pub fn sound(&self) -> Soundness {
        // A single-phase stator's two windings are not phases of one balanced set: its
        // own audit judges it.
        if let Some(sp) = self.single_phase() {
            return if sp.findings.is_empty() {
                Soundness::Sound
            } else {
                Soundness::Findings
            };
        }
        if !self.winding.is_balanced() {
            Soundness::Unbalanced
        } else if self.audit().is_some_and(|a| !a.sound) {
            Soundness::Findings
        } else if self.pair_findings.get().is_some() {
            Soundness::Pair
        } else {
            Soundness::Sound
        }
    }

    /// The winding data card.
    pub fn card(&self) -> &DataCard {
        self.card.get_or_init(|| card::card(self.winding))
    }

    /// The fullest slot packed as the section sheet draws it, when the slot's size is known.
    pub fn slot_packing(&self) -> Option<&crate::packing::SlotPacking> {
        self.slot_packing
            .get_or_init(|| crate::packing::slot_packing(self.winding))
            .as_ref()
    }

    /// A flat primary's performance over [`THRUST_SWEEP`], or why there is none.
    pub fn thrust(&self) -> Result<&ThrustReport, &ThrustError> {
        self.thrust
            .get_or_init(|| thrust::thrust(self.winding, &THRUST_SWEEP))
            .as_ref()
    }

    /// A flat primary's inductances and unbalance (phase matrix only); `None` for a
    /// rotary core.
    pub fn inductance(&self) -> Option<Result<&InductanceReport, &ThrustError>> {
        self.inductance
            .get_or_init(|| {
                (self.winding.geometry.topology == Topology::Linear)
                    .then(|| inductance::inductance(self.winding, false))
            })
            .as_ref()
            .map(Result::as_ref)
    }

    /// The factor table up to [`FACTOR_ORDERS`].
    pub fn factors(&self) -> &FactorTable {
        self.factors
            .get_or_init(|| factors::factor_table(self.winding, FACTOR_ORDERS))
    }

    /// The travelling field under balanced positive-sequence currents.
    pub fn field(&self) -> Result<&FieldReport, &FieldError> {
        self.field
            .get_or_init(|| field::field(self.winding, &FieldOptions::balanced(self.winding)))
            .as_ref()
    }

    /// [`FIELD_INSTANTS`] snapshots of that field, a sixth of a period apart.
    pub fn field_snapshots(&self) -> Result<&[Snapshot], &FieldError> {
        self.snapshots
            .get_or_init(|| {
                field::snapshots(
                    self.winding,
                    &FieldOptions::balanced(self.winding),
                    FIELD_INSTANTS,
                )
            })
            .as_ref()
            .map(Vec::as_slice)
    }

    /// Both speeds of a pole-changing winding, or why there are none; `None` for a
    /// one-speed winding.
    pub fn speeds(&self) -> Option<Result<&SpeedsReport, &SpeedsError>> {
        self.speeds
            .get_or_init(|| {
                self.winding
                    .design
                    .pole_change
                    .is_some()
                    .then(|| speeds::speeds(self.winding))
            })
            .as_ref()
            .map(Result::as_ref)
    }

    /// A single-phase stator's study; `None` for a polyphase winding.
    pub fn single_phase(&self) -> Option<&SinglePhaseReport> {
        self.single_phase
            .get_or_init(|| single_phase::study(self.winding))
            .as_ref()
    }

    /// Every span compared, for the usual goal: orders 5, 7, 11 and 13 suppressed with
    /// k_w1 kept at 0.9 or more.
    pub fn pitch(&self) -> &PitchReport {
        self.pitch.get_or_init(|| {
            let goal = PitchGoal {
                suppress: vec![5.0, 7.0, 11.0, 13.0],
                min_fundamental: 0.9,
            };
            pitch::compare(self.winding, &goal)
        })
    }
}

/// Whether a winding's sheets may be wound and connected from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Soundness {
    /// Balanced, and a recorded list without findings.
    Sound,
    /// The phases are unbalanced.
    Unbalanced,
    /// A recorded coil list whose audit has findings.
    Findings,
    /// One of two windings in a core whose pair's report has findings (between the
    /// windings, or the slots they share).
    Pair,
}
