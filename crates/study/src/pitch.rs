//! Choosing the coil span: every feasible span of a core compared on its fundamental, the
//! harmonics to suppress, harmonic leakage and end-winding length, with one recommended.
//!
//! Short-pitching by y/τ = 1 − 1/ν cancels the νth harmonic (k_p = sin(ν·(y/τ)·π/2) = 0;
//! Say 1983, ch. 4, from memory); the end winding grows with the span, so its length is
//! taken relative to a full-pitch coil, ∝ y/τ (common practice for a first estimate).

use rayon::prelude::*;
use serde::Serialize;

use crate::factors::factors_at;
use crate::winding::{Elec, Topology, Winding, with_span};

/// What the designer wants from the span.
#[derive(Debug, Clone, PartialEq)]
pub struct PitchGoal {
    /// Electrical orders to suppress (default 5, 7, 11, 13).
    pub suppress: Vec<f64>,
    /// Lowest acceptable fundamental winding factor.
    pub min_fundamental: f64,
}

impl Default for PitchGoal {
    fn default() -> Self {
        PitchGoal {
            suppress: vec![5.0, 7.0, 11.0, 13.0],
            min_fundamental: 0.9,
        }
    }
}

/// Winding factor of one named harmonic.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct HarmonicFactor {
    /// Electrical order ν.
    pub order: Elec,
    /// Its winding factor k_wν.
    pub winding: f64,
}

/// One span.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PitchRow {
    /// Coil span in slot pitches.
    pub pitch: usize,
    /// Span over pole pitch y/τ.
    pub span_over_pole_pitch: f64,
    /// Slots the core needs at this span (changes only on a double-layer flat primary).
    pub slots: usize,
    /// Fundamental winding factor k_w1.
    pub winding: f64,
    /// Winding factors of the harmonics named.
    pub harmonics: Vec<HarmonicFactor>,
    /// Differential leakage σ_d (exact), when defined.
    pub differential_leakage: Option<f64>,
    /// MMF THD = √σ_d.
    pub thd: Option<f64>,
    /// End-winding length relative to a full-pitch coil (∝ y/τ).
    pub end_winding_relative: f64,
    /// k_w1 at or above the floor.
    pub meets_floor: bool,
    /// Σ (k_wν / k_w1)² over the named harmonics: the objective minimised.
    pub harmonic_content: f64,
}

/// Every feasible span with the recommendation.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct PitchReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title of the design.
    pub title: Option<String>,
    /// Core kind.
    pub topology: Topology,
    /// Slots of the design as given.
    pub slots: usize,
    /// Poles.
    pub poles: usize,
    /// Layers.
    pub layers: usize,
    /// Pole pitch in slot pitches.
    pub pole_pitch_slots: f64,
    /// Harmonics named for suppression.
    pub suppress: Vec<f64>,
    /// k_w1 floor.
    pub min_fundamental: f64,
    /// Spans in increasing order.
    pub rows: Vec<PitchRow>,
    /// The recommended span.
    pub recommended: Option<usize>,
    /// Why that span (one sentence in text and JSON; words in `output::span_words`).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub reason: Recommendation,
    /// Warnings about the design as given (contract: a `warnings` array).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub warnings: Vec<crate::warnings::DesignWarning>,
}

/// Compare every feasible span of the winding's core against the goal.
pub fn compare(w: &Winding, goal: &PitchGoal) -> PitchReport {
    crate::runs::count(crate::runs::Analysis::Pitch);
    let g = &w.geometry;
    let tau = g.pole_pitch_slots;
    let top = match g.topology {
        Topology::Rotary => g.slots / 2,
        Topology::Linear => (2.0 * tau).ceil() as usize,
    };
    let rows: Vec<PitchRow> = (1..=top.max(1))
        .into_par_iter()
        .filter_map(|y| with_span(w, y).ok().map(|v| (y, v)))
        // A concentric winding has one shape whatever span is asked: keep it once, at its
        // mean span.
        .filter(|(y, v)| v.pitch == *y)
        .map(|(y, v)| row(&v, y, tau, goal))
        .collect();
    let (recommended, reason) = recommend(&rows, goal);
    PitchReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        topology: g.topology,
        slots: g.slots,
        poles: g.poles,
        layers: g.layers,
        pole_pitch_slots: tau,
        suppress: goal.suppress.clone(),
        min_fundamental: goal.min_fundamental,
        rows,
        recommended,
        reason,
        warnings: crate::warnings::design_warnings(w),
    }
}

fn row(v: &Winding, y: usize, tau: f64, goal: &PitchGoal) -> PitchRow {
    let k1 = factors_at(v, 0, Elec::FUNDAMENTAL).winding;
    let harmonics: Vec<HarmonicFactor> = goal
        .suppress
        .iter()
        .map(|&nu| HarmonicFactor {
            order: Elec(nu),
            winding: factors_at(v, 0, Elec(nu)).winding,
        })
        .collect();
    let content = if k1 > 0.0 {
        harmonics.iter().map(|h| (h.winding / k1).powi(2)).sum()
    } else {
        f64::INFINITY
    };
    let sigma = crate::field::differential_leakage(v);
    PitchRow {
        pitch: y,
        span_over_pole_pitch: y as f64 / tau,
        slots: v.geometry.slots,
        winding: k1,
        harmonics,
        differential_leakage: sigma,
        thd: sigma.map(f64::sqrt),
        end_winding_relative: y as f64 / tau,
        meets_floor: k1 >= goal.min_fundamental - 1e-12,
        harmonic_content: content,
    }
}

/// Least harmonic content among spans keeping the floor; ties go to the higher k_w1, then
/// to the shorter (cheaper) coil.
/// Why a span is recommended, as typed facts (worded by the presenters, which write it into the JSON with its `message`).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Recommendation {
    /// The least harmonic content among the spans that keep the k_w1 floor.
    LeastContent {
        /// The span.
        span: usize,
        /// Its ratio to the pole pitch.
        span_over_pole_pitch: f64,
        /// Its k_w1.
        winding: f64,
        /// The floor.
        floor: f64,
        /// Its factors at the orders weighed.
        harmonics: Vec<HarmonicFactor>,
        /// The orders weighed.
        orders: Vec<f64>,
        /// How many spans keep the floor.
        candidates: usize,
    },
    /// No span keeps the floor: the highest k_w1.
    HighestFundamental {
        /// The floor.
        floor: f64,
        /// The span.
        span: usize,
        /// Its k_w1.
        winding: f64,
    },
    /// No span gives a balanced winding.
    NoneBalanced,
}

fn recommend(rows: &[PitchRow], goal: &PitchGoal) -> (Option<usize>, Recommendation) {
    let better = |a: &&PitchRow, b: &&PitchRow| {
        let d = a.harmonic_content - b.harmonic_content;
        if d.abs() > 1e-9 {
            return d.total_cmp(&0.0);
        }
        let d = b.winding - a.winding;
        if d.abs() > 1e-12 {
            return d.total_cmp(&0.0);
        }
        a.pitch.cmp(&b.pitch)
    };
    // Only spans a winder would build are recommended: within the band around the pole
    // pitch that `warnings` accepts, or tooth coils (span 1). Every span is still listed.
    let buildable = |r: &&PitchRow| {
        r.pitch == 1
            || (crate::warnings::SPAN_BAND.0..=crate::warnings::SPAN_BAND.1)
                .contains(&r.span_over_pole_pitch)
    };
    let rows: Vec<PitchRow> = rows.iter().filter(buildable).cloned().collect();
    let rows = &rows[..];
    let keep: Vec<&PitchRow> = rows.iter().filter(|r| r.meets_floor).collect();
    if let Some(best) = keep.iter().copied().min_by(|a, b| better(a, b)) {
        let reason = Recommendation::LeastContent {
            span: best.pitch,
            span_over_pole_pitch: best.span_over_pole_pitch,
            winding: best.winding,
            floor: goal.min_fundamental,
            harmonics: best.harmonics.clone(),
            orders: goal.suppress.clone(),
            candidates: keep.len(),
        };
        return (Some(best.pitch), reason);
    }
    // The highest k_w1; on a tie (within rounding) the shorter span, as above.
    let highest = rows.iter().fold(None::<&PitchRow>, |best, r| match best {
        Some(b) if r.winding <= b.winding + 1e-12 => Some(b),
        _ => Some(r),
    });
    match highest {
        Some(best) => (
            Some(best.pitch),
            Recommendation::HighestFundamental {
                floor: goal.min_fundamental,
                span: best.pitch,
                winding: best.winding,
            },
        ),
        None => (None, Recommendation::NoneBalanced),
    }
}
