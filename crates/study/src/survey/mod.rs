//! Survey of slot/pole combinations: feasibility (and why not), q, the best span and its
//! k_w1, k_w5, k_w7, exact harmonic leakage, the span of least leakage, periodicity, cogging
//! indicator, radial pull, possible parallel paths and the lowest sub-harmonic, in parallel
//! over combinations.
//!
//! Double-layer rotary rows score every span 1..=Z/2 in the star-of-slots kernel
//! (`spans.rs`) without building a `Winding`. Tests hold every figure against the planner.
//! Single-layer and linear rows come from the planner itself.

use std::ops::RangeInclusive;

use rayon::prelude::*;
use serde::Serialize;

use crate::design::Design;
use crate::numbering::fraction;
mod spans;
pub mod two_speed;

use crate::winding::star::{order_amplitude, roots_of_unity};
use crate::winding::{
    Elec, Topology, double_layer_rotary_feasible, lcm, possible_path_counts, rotary_periodicity,
    synthesize_brief,
};
use spans::SpanScore;

/// What to survey.
#[derive(Debug, Clone, PartialEq)]
pub struct SurveyQuery {
    /// Slot counts Z.
    pub slots: RangeInclusive<usize>,
    /// Pole counts 2p (rotary: even ones only).
    pub poles: RangeInclusive<usize>,
    /// Layer counts to try.
    pub layers: Vec<usize>,
    /// Phase count m (odd, ≥ 3).
    pub phases: usize,
    /// Closed or open core.
    pub topology: Topology,
}

/// One slot/pole/layer combination.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SurveyRow {
    /// Slots Z.
    pub slots: usize,
    /// Poles 2p.
    pub poles: usize,
    /// Layers.
    pub layers: usize,
    /// A balanced winding exists.
    pub feasible: bool,
    /// Slots per pole per phase q.
    #[serde(rename = "slots_per_pole_phase")]
    pub q: f64,
    /// q as a reduced fraction.
    #[serde(rename = "slots_per_pole_phase_fraction")]
    pub q_fraction: String,
    /// Best span: highest k_w1 among spans up to ⌈τ⌉, ties to the shorter.
    pub pitch: Option<usize>,
    /// k_w1 at the best span.
    pub winding: Option<f64>,
    /// k_w5 at the best span.
    pub winding_5: Option<f64>,
    /// k_w7 at the best span.
    pub winding_7: Option<f64>,
    /// The span of highest k_w1 (often full pitch), and its k_w1.
    pub max_winding_pitch: Option<usize>,
    /// k_w1 at `max_winding_pitch`.
    pub max_winding: Option<f64>,
    /// Differential leakage σ_d at the best span (exact).
    pub differential_leakage: Option<f64>,
    /// The buildable span (0.5 to 1.5 pole pitches, or tooth coils) of lowest σ_d.
    pub min_leakage_pitch: Option<usize>,
    /// σ_d at `min_leakage_pitch`.
    pub min_leakage: Option<f64>,
    /// How many spans were scored (k_w1, k_w5, k_w7 and exact σ_d for each).
    pub spans_scored: usize,
    /// Machine periodicity gcd(Z, p) (rotary).
    pub periodicity: Option<usize>,
    /// lcm(Z, 2p): the higher, the smaller the cogging torque of a PM rotor.
    pub lcm: Option<usize>,
    /// No rotational symmetry (gcd(Z, p) = 1 with Z odd): unbalanced radial pull.
    pub unbalanced_pull: Option<bool>,
    /// Parallel path counts that keep every path's EMF equal.
    pub parallel_paths: Vec<usize>,
    /// Lowest sub-harmonic order ν < 1 in the MMF, if any.
    pub lowest_subharmonic: Option<f64>,
    /// Why not, when infeasible (the JSON's `reason` string is the presenters' words).
    #[serde(skip)]
    pub reason: Option<Infeasible>,
}

/// All rows, in slot, pole, layer order.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SurveyReport {
    /// Core kind surveyed.
    pub topology: Topology,
    /// Phases.
    #[serde(rename = "phase_count")]
    pub phases: usize,
    /// The combinations.
    pub rows: Vec<SurveyRow>,
}

/// Why a combination cannot be wound, as typed facts (worded, and written into the JSON as
/// the `reason` string, by `output::refusal_words`: only rows that are shown are worded).
#[derive(Debug, Clone, PartialEq)]
pub enum Infeasible {
    /// Z/(m·gcd(Z, p)) is not whole: no balanced double layer.
    NotWhole {
        /// Slots Z.
        slots: usize,
        /// Phases m.
        phases: usize,
        /// gcd(Z, p).
        periodicity: usize,
    },
    /// No span links the working flux.
    NoWorkingFlux,
    /// The planner's refusal.
    Refused(crate::winding::PlanError),
}

/// Sort keys for the survey.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SortKey {
    /// Slots, then poles (the natural order).
    Slots,
    /// Poles, then slots.
    Poles,
    /// Highest k_w1 first.
    Winding,
    /// Lowest harmonic leakage first.
    Leakage,
    /// Highest lcm(Z, 2p) first (least cogging).
    Cogging,
}

/// Most slot/pole/layer combinations one survey takes: 150 000. Every row is kept for
/// sorting and its text table set whole, about 1.8 kB a row at the peak, so this keeps a
/// survey below 300 MB in every format (measured: README, Bounds).
pub const MAX_COMBINATIONS: usize = 150_000;

/// Run the survey; `tick` is called once per finished combination (for a progress bar).
pub fn survey(query: &SurveyQuery, tick: &(dyn Fn() + Sync)) -> SurveyReport {
    let combos = combinations(query);
    let rows = combos
        .par_iter()
        .map_init(Buffers::default, |buf, &(z, poles, layers)| {
            let r = row(query, z, poles, layers, buf);
            tick();
            r
        })
        .collect();
    SurveyReport {
        topology: query.topology,
        phases: query.phases,
        rows,
    }
}

/// Every combination the query names, in order.
pub fn combinations(query: &SurveyQuery) -> Vec<(usize, usize, usize)> {
    let mut out = Vec::new();
    for z in query.slots.clone() {
        for poles in query.poles.clone() {
            if query.topology == Topology::Rotary && poles % 2 != 0 {
                continue;
            }
            for &layers in &query.layers {
                out.push((z, poles, layers));
            }
        }
    }
    out
}

/// Keep rows passing `min_kw` and sort them by `key` (stable, so ties keep slot order).
pub fn filter_and_sort(
    report: &mut SurveyReport,
    min_kw: Option<f64>,
    feasible_only: bool,
    key: SortKey,
) {
    report.rows.retain(|r| {
        (!feasible_only || r.feasible) && min_kw.is_none_or(|k| r.winding.is_some_and(|w| w >= k))
    });
    let desc = |x: Option<f64>| -x.unwrap_or(f64::NEG_INFINITY);
    match key {
        SortKey::Slots => {}
        SortKey::Poles => report.rows.sort_by_key(|r| (r.poles, r.slots, r.layers)),
        SortKey::Winding => report
            .rows
            .sort_by(|a, b| desc(a.winding).total_cmp(&desc(b.winding))),
        SortKey::Leakage => report.rows.sort_by(|a, b| {
            let k = |r: &SurveyRow| r.differential_leakage.unwrap_or(f64::INFINITY);
            k(a).total_cmp(&k(b))
        }),
        SortKey::Cogging => report
            .rows
            .sort_by_key(|r| std::cmp::Reverse(r.lcm.unwrap_or(0))),
    }
}

fn divisors(n: usize) -> Vec<usize> {
    (1..=n).filter(|d| n.is_multiple_of(*d)).collect()
}

/// Per-thread scratch space, reused from one combination to the next.
#[derive(Default)]
struct Buffers {
    /// The double-layer kernel's scratch space.
    spans: spans::Scratch,
    /// Slot currents of a planned winding.
    currents: Vec<f64>,
    /// The Z roots of unity.
    roots: Vec<(f64, f64)>,
}

fn row(query: &SurveyQuery, z: usize, poles: usize, layers: usize, buf: &mut Buffers) -> SurveyRow {
    let m = query.phases;
    // Flat primaries refine q from the planner's coil positions.
    let q_fraction = fraction(z as u64, (m * poles) as u64);
    let base = SurveyRow {
        slots: z,
        poles,
        layers,
        feasible: false,
        q: z as f64 / (m * poles) as f64,
        q_fraction,
        pitch: None,
        winding: None,
        winding_5: None,
        winding_7: None,
        max_winding_pitch: None,
        max_winding: None,
        differential_leakage: None,
        min_leakage_pitch: None,
        min_leakage: None,
        spans_scored: 0,
        periodicity: None,
        lcm: None,
        unbalanced_pull: None,
        parallel_paths: Vec::new(),
        lowest_subharmonic: None,
        reason: None,
    };
    match (query.topology, layers) {
        (Topology::Rotary, 2) => rotary_double_row(base, m, buf),
        _ => planner_row(base, query.topology, m, buf),
    }
}

/// Double-layer rotary row from the star of slots, allocation-free but for the reused
/// current buffer and the short list of path counts.
fn rotary_double_row(mut r: SurveyRow, m: usize, bufs: &mut Buffers) -> SurveyRow {
    let (z, poles) = (r.slots, r.poles);
    let p = poles / 2;
    let t = rotary_periodicity(z, poles);
    r.periodicity = Some(t);
    r.lcm = Some(lcm(z, poles));
    r.unbalanced_pull = Some(t == 1 && z % 2 == 1);
    if !double_layer_rotary_feasible(z, poles, m) {
        r.reason = Some(Infeasible::NotWhole {
            slots: z,
            phases: m,
            periodicity: t,
        });
        return r;
    }
    // Every span 1..=Z/2 is scored by the star-of-slots kernel ([`spans`]); the choice is
    // among the spans `pitch` would recommend: within 0.5..1.5 pole pitches, or tooth coils.
    let tau = z as f64 / poles as f64;
    let (lo, hi) = crate::warnings::SPAN_BAND;
    let longest = (z / 2).max(1);
    let buildable =
        |y: usize| y == 1 || (y as f64 / tau >= lo - 1e-12 && y as f64 / tau <= hi + 1e-12);
    let scratch = &mut bufs.spans;
    spans::score(z, p, m, longest, scratch);
    // As `pitch` recommends: the least content Σ(k_wν/k_w1)² of orders 5, 7, 11, 13 among
    // spans keeping k_w1 ≥ 0.9; ties to the higher k_w1, then the shorter span; if none
    // keeps the floor, the highest k_w1.
    let floor = 0.9;
    let mut best: Option<SpanScore> = None;
    let mut highest: Option<SpanScore> = None;
    let mut calmest: Option<SpanScore> = None;
    for sc in scratch.spans.iter().filter(|sc| buildable(sc.span)) {
        if highest.is_none_or(|h| sc.kw1 > h.kw1 + 1e-12) {
            highest = Some(*sc);
        }
        if let Some(sd) = sc.sigma_d
            && calmest.is_none_or(|c| c.sigma_d.is_none_or(|cs| sd < cs - 1e-12))
        {
            calmest = Some(*sc);
        }
        if sc.kw1 >= floor - 1e-12 && sc.kw1 > 0.0 {
            let better = match best {
                None => true,
                Some(b) => {
                    if (sc.content - b.content).abs() > 1e-9 {
                        sc.content < b.content
                    } else {
                        sc.kw1 > b.kw1 + 1e-12
                    }
                }
            };
            if better {
                best = Some(*sc);
            }
        }
    }
    let Some(chosen) = best.or(highest) else {
        r.reason = Some(Infeasible::NoWorkingFlux);
        return r;
    };
    r.feasible = true;
    r.pitch = Some(chosen.span);
    r.winding = Some(chosen.kw1);
    r.winding_5 = Some(chosen.kw5);
    r.winding_7 = Some(chosen.kw7);
    r.max_winding_pitch = highest.map(|h| h.span);
    r.max_winding = highest.map(|h| h.kw1);
    r.differential_leakage = chosen.sigma_d;
    r.min_leakage_pitch = calmest.map(|c| c.span);
    r.min_leakage = calmest.and_then(|c| c.sigma_d);
    r.spans_scored = scratch.spans.len();
    let units = if (z / t).is_multiple_of(2) { 2 * t } else { t };
    r.parallel_paths = divisors(units);
    r.lowest_subharmonic =
        lowest_subharmonic(p, t, |n| spans::order_amplitude(scratch, n, chosen.span));
    r
}

/// The lowest sub-harmonic ν = n/p (n < p, a multiple of the periodicity t) whose MMF
/// amplitude `amplitude(n)` is not nil against the working wave's `amplitude(p)`.
fn lowest_subharmonic(p: usize, t: usize, amplitude: impl Fn(usize) -> f64) -> Option<f64> {
    let reference = amplitude(p);
    (1..p)
        .filter(|n| n % t.max(1) == 0)
        .find(|&n| amplitude(n) > 1e-9 * reference)
        .map(|n| n as f64 / p as f64)
}

/// Rows the planner decides: single layer, and every flat primary.
fn planner_row(mut r: SurveyRow, topology: Topology, m: usize, bufs: &mut Buffers) -> SurveyRow {
    let (z, poles) = (r.slots, r.poles);
    if topology == Topology::Rotary {
        r.lcm = Some(lcm(z, poles));
    }
    let design = Design {
        phases: m,
        phase_labels: (1..=m).map(|i| format!("P{i}")).collect(),
        ..Design::basic(topology, z, poles, r.layers)
    };
    match synthesize_brief(&design) {
        Err(e) => {
            r.reason = Some(Infeasible::Refused(e));
        }
        Ok(w) => {
            let (n, d) = w.slots_per_pole_phase();
            let qf = fraction(n, d);
            r.q = n as f64 / d as f64;
            r.q_fraction = qf;
            r.feasible = true;
            r.pitch = Some(w.pitch);
            r.winding = Some(crate::factors::fundamental(&w).winding);
            r.winding_5 = Some(crate::factors::factors_at(&w, 0, Elec(5.0)).winding);
            r.winding_7 = Some(crate::factors::factors_at(&w, 0, Elec(7.0)).winding);
            r.spans_scored = 1;
            r.max_winding_pitch = r.pitch;
            r.max_winding = r.winding;
            r.differential_leakage = crate::field::differential_leakage(&w);
            r.min_leakage_pitch = r.pitch;
            r.min_leakage = r.differential_leakage;
            r.parallel_paths = possible_path_counts(&w);
            if topology == Topology::Rotary {
                // Symmetry from the coils themselves, as plan reports it.
                let p = poles / 2;
                let t = w.periodicity();
                r.periodicity = Some(t);
                r.unbalanced_pull = Some(!w.balanced_pull());
                let cur = &mut bufs.currents;
                crate::winding::star::balanced_slot_currents(&w, cur);
                roots_of_unity(z, &mut bufs.roots);
                let roots = &bufs.roots;
                r.lowest_subharmonic = lowest_subharmonic(p, t, |n| order_amplitude(cur, roots, n));
            }
        }
    }
    r
}
