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
#[derive(Debug, Clone, PartialEq, Serialize)]
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
#[derive(Debug, Clone, PartialEq, Serialize)]
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
        .map_init(Vec::new, |buf, &(z, poles, layers)| {
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

fn row(
    query: &SurveyQuery,
    z: usize,
    poles: usize,
    layers: usize,
    buf: &mut Vec<f64>,
) -> SurveyRow {
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
fn rotary_double_row(mut r: SurveyRow, m: usize, buf: &mut Vec<f64>) -> SurveyRow {
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
    // Best span by the pitch factor |sin(y·x)|, x = π·p/Z, by recurrence, among spans up
    // to the next whole number above the pole pitch (longer coils only alias shorter ones).
    let x = PI * p as f64 / z as f64;
    let two_cos = 2.0 * x.cos();
    let (mut prev, mut cur) = (0.0f64, x.sin());
    let (mut best_y, mut best_kp) = (0, -1.0);
    let longest = (z / 2).min(z.div_ceil(poles)).max(1);
    for y in 1..=longest {
        let kp = cur.abs();
        if kp > best_kp + 1e-12 {
            (best_y, best_kp) = (y, kp);
        }
        (prev, cur) = (cur, two_cos * cur - prev);
    }
    // k_d1 of 60° belts on a fractional-slot star: b phasors 60°/b apart.
    let (b, _, _) = fraction(z as u64, (m * poles) as u64);
    let b = b as f64;
    let half_belt = PI / (2.0 * m as f64);
    let kd = half_belt.sin() / (b * (half_belt / b).sin());
    r.feasible = true;
    r.pitch = Some(best_y);
    r.winding = Some(kd * best_kp);
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
        let a = (k * p) % z;
        let belt = (2 * m * a / z).min(2 * m - 1);
        let (phase, sign) = if belt.is_multiple_of(2) {
            (belt / 2, 1.0)
        } else {
            (((belt + m) / 2) % m, -1.0)
        };
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
        let t = rotary_periodicity(z, poles);
        r.periodicity = Some(t);
        r.lcm = Some(lcm(z, poles));
        r.unbalanced_pull = Some(t == 1 && z % 2 == 1);
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
            r.differential_leakage = crate::leakage::differential_leakage(&w);
            r.parallel_paths = possible_path_counts(&w);
            if topology == Topology::Rotary {
                let p = poles / 2;
                let t = rotary_periodicity(z, poles);
                let mut cur = Vec::new();
                crate::leakage::slot_currents_into(&w, &mut cur);
                r.lowest_subharmonic = (1..p)
                    .filter(|n| n % t == 0)
                    .find(|&n| order_amplitude(&cur, n) > 1e-9 * order_amplitude(&cur, p))
                    .map(|n| n as f64 / p as f64);
            }
        }
    }
    r
}
