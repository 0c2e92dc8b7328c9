//! Survey of slot/pole combinations: feasibility (and why not), q, the best span and its
//! k_w1, exact harmonic leakage, periodicity, cogging indicator, radial pull, possible
//! parallel paths and the lowest sub-harmonic, in parallel over combinations.
//!
//! The double-layer rotary kernel works on the star of slots directly, without building a
//! `Winding`: belt currents c_k from the 60° belts, slot currents c_k − c_(k−y), factors by
//! closed forms (distribution of a fractional-slot belt, sin(π/2m)/(b·sin(π/(2mb))) with
//! q = b/c; pitch by the Chebyshev recurrence sin((y+1)x) = 2cos x·sin(yx) − sin((y−1)x)),
//! and σ_d by Parseval ([`crate::leakage::staircase_leakage`]). Tests hold every figure
//! against the planner. Single-layer and linear rows come from the planner itself.

use std::f64::consts::PI;
use std::ops::RangeInclusive;

use rayon::prelude::*;
use serde::Serialize;

use crate::layout::Spec;
use crate::leakage::staircase_leakage;
use crate::winding::star::{belt_of_index, roots_of_unity};
use crate::winding::{
    Topology, build_brief, double_layer_rotary_feasible, gcd, possible_path_counts,
    rotary_periodicity,
};

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
    pub q: f64,
    /// q as a reduced fraction.
    pub q_fraction: String,
    /// Best span: highest k_w1 among spans up to ⌈τ⌉, ties to the shorter.
    pub pitch: Option<usize>,
    /// k_w1 at the best span.
    pub winding: Option<f64>,
    /// The span of highest k_w1 (often full pitch), and its k_w1.
    pub max_winding_pitch: Option<usize>,
    /// k_w1 at `max_winding_pitch`.
    pub max_winding: Option<f64>,
    /// Differential leakage σ_d at the best span (exact).
    pub differential_leakage: Option<f64>,
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
    /// Why not, when infeasible.
    pub reason: Option<String>,
}

/// All rows, in slot, pole, layer order.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SurveyReport {
    /// Core kind surveyed.
    pub topology: Topology,
    /// Phases.
    pub phases: usize,
    /// The combinations.
    pub rows: Vec<SurveyRow>,
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

fn fraction(n: u64, d: u64) -> (u64, u64, String) {
    let g = gcd(n, d).max(1);
    let (n, d) = (n / g, d / g);
    let s = if d == 1 {
        n.to_string()
    } else {
        format!("{n}/{d}")
    };
    (n, d, s)
}

fn lcm(a: usize, b: usize) -> usize {
    a / gcd(a as u64, b as u64) as usize * b
}

fn divisors(n: usize) -> Vec<usize> {
    (1..=n).filter(|d| n.is_multiple_of(*d)).collect()
}

/// Per-thread scratch space, reused from one combination to the next.
#[derive(Default)]
struct Buffers {
    /// Belt currents and slot currents, 2Z values.
    currents: Vec<f64>,
    /// The Z roots of unity.
    roots: Vec<(f64, f64)>,
}

fn row(query: &SurveyQuery, z: usize, poles: usize, layers: usize, buf: &mut Buffers) -> SurveyRow {
    let m = query.phases;
    // Flat primaries refine q from the planner's coil positions.
    let (_, _, q_fraction) = fraction(z as u64, (m * poles) as u64);
    let base = SurveyRow {
        slots: z,
        poles,
        layers,
        feasible: false,
        q: z as f64 / (m * poles) as f64,
        q_fraction,
        pitch: None,
        winding: None,
        max_winding_pitch: None,
        max_winding: None,
        differential_leakage: None,
        periodicity: None,
        lcm: None,
        unbalanced_pull: None,
        parallel_paths: Vec::new(),
        lowest_subharmonic: None,
        reason: None,
    };
    match (query.topology, layers) {
        (Topology::Rotary, 2) => rotary_double_row(base, m, buf),
        _ => planner_row(base, query.topology, m),
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
        r.reason = Some(format!(
            "Z/(m·gcd(Z, p)) = {z}/({m}·{t}) is not whole: no balanced {m}-phase double layer"
        ));
        return r;
    }
    // k_d of the 60° belts at the fundamental and at the orders the span comparison names,
    // exactly, from the belt sum over phase 1's coil left sides (a uniform span splits the
    // coil EMF into belt sum and chord): one table of the Z roots of unity, stepped by
    // integer index, no trigonometry per slot.
    roots_of_unity(z, &mut bufs.roots);
    let roots = &bufs.roots;
    let coils_per_phase = (z / m) as f64;
    let kd_at = |nu: usize| {
        let (mut re, mut im) = (0.0, 0.0);
        for k in 0..z {
            let a = (k * p) % z;
            let sign = match belt_of_index(a as u64, z as u64, m) {
                (0, true) => 1.0,
                (0, false) => -1.0,
                _ => continue,
            };
            let (c, s) = roots[(nu * a) % z];
            re += sign * c;
            im -= sign * s;
        }
        (re * re + im * im).sqrt() / coils_per_phase
    };
    let orders = [5usize, 7, 11, 13];
    let kd1 = kd_at(1);
    let kds = orders.map(kd_at);
    // Every span up to the next whole number above the pole pitch (longer coils only alias
    // shorter ones), scored as `pitch` recommends: the least content Σ(k_wν/k_w1)² of orders
    // 5, 7, 11, 13 among spans keeping k_w1 ≥ 0.9; ties to the higher k_w1, then the shorter
    // span; if none keeps the floor, the highest k_w1. Pitch factors |sin(ν·y·x)| by
    // recurrence in y, x = π·p/Z.
    let x = PI * p as f64 / z as f64;
    let mut rec: Vec<(f64, f64, f64)> = std::iter::once(1usize)
        .chain(orders)
        .map(|nu| {
            let a = nu as f64 * x;
            (2.0 * a.cos(), 0.0, a.sin())
        })
        .collect();
    // The spans `pitch` would recommend: within 0.5..1.5 pole pitches, or tooth coils.
    let tau = z as f64 / poles as f64;
    let (lo, hi) = crate::warnings::SPAN_BAND;
    let longest = (z / 2).min((hi * tau + 1e-9).floor() as usize).max(1);
    let buildable = |y: usize| y == 1 || y as f64 / tau >= lo - 1e-12;
    let floor = 0.9;
    let mut best: Option<(usize, f64, f64)> = None; // (span, content, k_w1)
    let mut highest = (0usize, -1.0f64);
    for y in 1..=longest {
        let kw1 = kd1 * rec[0].2.abs();
        if !buildable(y) {
            for r in &mut rec {
                (r.1, r.2) = (r.2, r.0 * r.2 - r.1);
            }
            continue;
        }
        if kw1 > highest.1 + 1e-12 {
            highest = (y, kw1);
        }
        if kw1 >= floor - 1e-12 && kw1 > 0.0 {
            let content: f64 = kds
                .iter()
                .zip(&rec[1..])
                .map(|(kd, r)| (kd * r.2.abs() / kw1).powi(2))
                .sum();
            let better = match best {
                None => true,
                Some((_, c, k)) => {
                    if (content - c).abs() > 1e-9 {
                        content < c
                    } else {
                        kw1 > k + 1e-12
                    }
                }
            };
            if better {
                best = Some((y, content, kw1));
            }
        }
        for r in &mut rec {
            (r.1, r.2) = (r.2, r.0 * r.2 - r.1);
        }
    }
    let (best_y, best_kw) = match best {
        Some((y, _, k)) => (y, k),
        None => highest,
    };
    r.feasible = true;
    r.pitch = Some(best_y);
    r.winding = Some(best_kw);
    r.max_winding_pitch = Some(highest.0);
    r.max_winding = Some(highest.1);
    let buf = &mut bufs.currents;
    belt_currents(z, p, m, buf);
    slot_currents(buf, best_y);
    r.differential_leakage = staircase_leakage(&buf[z..], p as u64);
    let units = if (z / t).is_multiple_of(2) { 2 * t } else { t };
    r.parallel_paths = divisors(units);
    r.lowest_subharmonic = (1..p)
        .filter(|n| n % t == 0)
        .find(|&n| order_amplitude(&buf[z..], n) > 1e-9 * order_amplitude(&buf[z..], p))
        .map(|n| n as f64 / p as f64);
    r
}

/// c_k = s_k·cos(2πφ_k/m) for the 60° belt (φ_k, s_k) of slot k, into `buf[..z]`.
fn belt_currents(z: usize, p: usize, m: usize, buf: &mut Vec<f64>) {
    buf.clear();
    buf.resize(2 * z, 0.0);
    for (k, c) in buf[..z].iter_mut().enumerate() {
        let (phase, positive) = belt_of_index(((k * p) % z) as u64, z as u64, m);
        let sign = if positive { 1.0 } else { -1.0 };
        *c = sign * (2.0 * PI * phase as f64 / m as f64).cos();
    }
}

/// Slot currents I_k = c_k − c_(k−y) of double-layer coils of span y, into `buf[z..]`.
fn slot_currents(buf: &mut [f64], y: usize) {
    let z = buf.len() / 2;
    for k in 0..z {
        buf[z + k] = buf[k] - buf[(k + z - y % z) % z];
    }
}

/// |Σ I_k e^(−j·n·2πk/Z)| / n: the MMF amplitude of mechanical order n, up to a constant.
fn order_amplitude(currents: &[f64], n: usize) -> f64 {
    let z = currents.len();
    let (mut re, mut im) = (0.0, 0.0);
    for (k, &i) in currents.iter().enumerate() {
        let a = 2.0 * PI * ((n * k) % z) as f64 / z as f64;
        re += i * a.cos();
        im -= i * a.sin();
    }
    (re * re + im * im).sqrt() / n as f64
}

/// Rows the planner decides: single layer, and every flat primary.
fn planner_row(mut r: SurveyRow, topology: Topology, m: usize) -> SurveyRow {
    let (z, poles) = (r.slots, r.poles);
    if topology == Topology::Rotary {
        r.lcm = Some(lcm(z, poles));
    }
    let spec = Spec {
        phases: m,
        phase_labels: (1..=m).map(|i| format!("P{i}")).collect(),
        ..Spec::basic(topology, z, poles, r.layers)
    };
    match build_brief(&spec) {
        Err(e) => {
            r.reason = Some(e.to_string());
        }
        Ok(w) => {
            let (n, d) = w.slots_per_pole_phase();
            let (_, _, qf) = fraction(n, d);
            r.q = n as f64 / d as f64;
            r.q_fraction = qf;
            r.feasible = true;
            r.pitch = Some(w.pitch);
            r.winding = Some(crate::factors::fundamental(&w).winding);
            r.max_winding_pitch = r.pitch;
            r.max_winding = r.winding;
            r.differential_leakage = crate::leakage::differential_leakage(&w);
            r.parallel_paths = possible_path_counts(&w);
            if topology == Topology::Rotary {
                // Symmetry from the coils themselves, as plan reports it.
                let p = poles / 2;
                let t = w.periodicity();
                r.periodicity = Some(t);
                r.unbalanced_pull = Some(!w.balanced_pull());
                let mut cur = Vec::new();
                crate::winding::star::balanced_slot_currents(&w, &mut cur);
                r.lowest_subharmonic = (1..p)
                    .filter(|n| n % t == 0)
                    .find(|&n| order_amplitude(&cur, n) > 1e-9 * order_amplitude(&cur, p))
                    .map(|n| n as f64 / p as f64);
            }
        }
    }
    r
}
