//! Which slot and pole counts carry a pole-changing winding (one winding, 1:2, consequent
//! poles) and at what span: every combination of the query is judged by
//! [`pole_change::fits`]; each one that fits is synthesized at every span up to the higher
//! speed's pole pitch and judged at both pole counts ([`crate::speeds::spans_at_both`]), and
//! the best span is [`crate::speeds::best_span`]'s (the smaller k_w1 largest).

use rayon::prelude::*;
use serde::Serialize;

use super::SurveyQuery;
use crate::design::{Design, PoleChange};
use crate::winding::{Topology, pole_change};

/// One slot/pole/layer combination for a pole-changing winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct TwoSpeedRow {
    /// Slots Z.
    pub slots: usize,
    /// Poles at the higher speed (as laid out).
    pub poles: usize,
    /// Poles at the lower speed (twice as many).
    pub low_speed_poles: usize,
    /// Layers.
    pub layers: usize,
    /// Whole slots per pole and phase at the higher speed's poles, so both counts balance.
    pub fits: bool,
    /// The span whose smaller k_w1 is largest (the shorter of equals).
    pub best_span: Option<usize>,
    /// k_w1 at the lower speed, at that span.
    pub low_speed_winding_factor: Option<f64>,
    /// k_w1 at the higher speed, at that span.
    pub high_speed_winding_factor: Option<f64>,
}

/// The survey of pole-changing windings.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct TwoSpeedSurvey {
    /// Every combination, in slot, pole and layer order.
    pub rows: Vec<TwoSpeedRow>,
}

/// Largest [`work`] one pole-changing survey takes on (measured on the 2-core machine:
/// 600..=1200 slots at 2 and 4 poles is 5.3e7 and took 14.5 s in a debug build, so the
/// bound is about half a minute there; a release build was not timed).
pub const MAX_WORK: f64 = 1.0e8;

/// The survey's work: Σ over the combinations that fit of spans × slots (each span is a
/// winding synthesized and judged at two pole counts).
pub fn work(query: &SurveyQuery) -> f64 {
    super::combinations(query)
        .iter()
        .filter(|&&(z, p, _)| pole_change::fits(z, p, query.phases))
        .map(|&(z, p, _)| (z / p) as f64 * z as f64)
        .sum()
}

/// Survey `query` (a rotary three-phase core) for pole-changing windings. Rows that do not
/// fit carry no span.
pub fn two_speed(query: &SurveyQuery) -> TwoSpeedSurvey {
    let combos = super::combinations(query);
    let rows = combos
        .par_iter()
        .map(|&(z, poles, layers)| row(query, z, poles, layers))
        .collect();
    TwoSpeedSurvey { rows }
}

fn row(query: &SurveyQuery, z: usize, poles: usize, layers: usize) -> TwoSpeedRow {
    let fits = query.topology == Topology::Rotary && pole_change::fits(z, poles, query.phases);
    let mut r = TwoSpeedRow {
        slots: z,
        poles,
        low_speed_poles: 2 * poles,
        layers,
        fits,
        best_span: None,
        low_speed_winding_factor: None,
        high_speed_winding_factor: None,
    };
    if !fits {
        return r;
    }
    let design = Design {
        pole_change: Some(PoleChange::StarDoubleStar),
        ..Design::basic(Topology::Rotary, z, poles, layers)
    };
    let Ok(w) = crate::winding::build(&crate::spec::Spec::of(design)) else {
        return r;
    };
    let spans = crate::speeds::spans_at_both(&w);
    if let Some(best) = crate::speeds::best_span(&spans)
        && let Some(s) = spans.iter().find(|s| s.span == best)
    {
        r.best_span = Some(best);
        r.low_speed_winding_factor = Some(s.low_speed_winding_factor);
        r.high_speed_winding_factor = Some(s.high_speed_winding_factor);
    }
    r
}
