//! Phase (and coil) inductances, and the open primary's phase unbalance under balanced
//! line voltages.
//!
//! A flat primary's inductances are the layer method's of `layers::gap_inductances`, the
//! same matrix the thrust report's field model works with (the plate at rest): a
//! two-dimensional gap, the primary iron's potential floating so that its flux closes in
//! it. A closed core's are by winding functions, and they are the flat primary's
//! one-dimensional limit (a test holds the two together as g/τ → 0):
//!
//! With n_i(x) the turns function of phase i (the running sum of its slot conductors along
//! the gap, current entering at each coil's go side) and N_i = n_i − ⟨n_i⟩ its winding
//! function over the length Λ where the gap is, the air-gap inductance is
//!   L_ij = μ0·W/g_e · ∫_Λ N_i(x)·N_j(x) dx
//! (N. L. Schmitz and D. W. Novotny, *Introductory Electromechanics*, 1965; H. A. Toliyat
//! and T. A. Lipo's winding-function theory, 1990s). A flat primary's flux must close under
//! the primary itself, so its mean is taken over the primary's length; that makes the end
//! phases couple differently from the middle one. Slot and end-winding leakage (from the
//! thrust model's formulas) are added to the diagonal where the sizes allow.
//!
//! Balanced line voltages on a star without neutral: Z·I = V_ph − V_n·1 with ΣI = 0; on a
//! delta: Z·I = V_line. The sequence currents follow Fortescue (1918).

use crate::units::Length;
use num_complex::Complex64;
use serde::Serialize;
use std::f64::consts::PI;

use crate::thrust::{MU0, ThrustError};
use crate::winding::{self, Connection, Design, Style, Topology, Winding};

/// Largest coil count for which the coil matrix is given (its size grows with the square).
pub const MAX_COIL_MATRIX: usize = 200;

/// One layout of the same primary, ranked by unbalance.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LayoutRank {
    /// Poles.
    pub poles: usize,
    /// Layers (2: half-filled end slots).
    pub layers: usize,
    /// Coil span.
    pub pitch: usize,
    /// Fundamental winding factor k_w1 of the layout (what the span costs in EMF).
    pub winding_factor: f64,
    /// Negative-sequence current, per cent of positive, under balanced line voltages.
    pub negative_sequence_current_percent: f64,
    /// True for the layout of the file.
    pub this_layout: bool,
}

/// The inductance report.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct InductanceReport {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title.
    pub title: Option<String>,
    /// Closed core or flat primary.
    pub topology: Topology,
    /// Effective gap g_e = k_C·g, mm.
    #[serde(rename = "effective_gap_mm", serialize_with = "crate::units::in_mm")]
    pub effective_gap: Length,
    /// Phase labels.
    pub phases: Vec<String>,
    /// Phase self and mutual inductances of the gap (winding functions), H.
    pub matrix_h: Vec<Vec<f64>>,
    /// Leakage per phase added on the diagonal for the currents (slot + end winding), H.
    pub leakage_h: f64,
    /// Positive-sequence inductance of the gap matrix, H (mean of the eigen-pair for a
    /// flat primary).
    pub positive_sequence_h: f64,
    /// Phase currents under balanced line voltages, A r.m.s. (null without a supply).
    pub phase_currents_a: Option<Vec<f64>>,
    /// Negative-sequence current in per cent of the positive (0 for a balanced rotary).
    pub negative_sequence_current_percent: f64,
    /// Backward field in per cent of the forward from that current (the fundamental of a
    /// balanced winding driven by unbalanced currents).
    pub backward_field_percent: f64,
    /// Coil self and mutual inductances, H (windings up to `MAX_COIL_MATRIX` coils).
    pub coil_matrix_h: Option<Vec<Vec<f64>>>,
    /// Other layouts of the same primary, least unbalanced first (flat primaries).
    pub ranking: Vec<LayoutRank>,
    /// What was assumed.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub assumptions: Vec<crate::assumption::Assumption>,
}

/// Conductors of each of `sets` sets in every slot: `c[slot][set]`.
fn conductors(w: &Winding, set_of: impl Fn(usize) -> usize, sets: usize) -> Vec<Vec<f64>> {
    let mut c = vec![vec![0.0; sets]; w.geometry.slots];
    for (i, coil) in w.coils.iter().enumerate() {
        let s = set_of(i);
        c[coil.go][s] += coil.turns as f64;
        c[coil.back][s] -= coil.turns as f64;
    }
    c
}

/// ∫ N_i N_j dx in slot pitches for every pair: the Gram matrix of the winding functions.
/// Turns functions step at slot centres; a flat primary adds half a slot pitch of zero at
/// each end, a closed core wraps round.
fn gram(w: &Winding, c: &[Vec<f64>]) -> Vec<Vec<f64>> {
    let z = w.geometry.slots;
    let sets = c.first().map_or(0, Vec::len);
    // Segment lengths and turns functions, segment by segment (between slot k and k + 1).
    let mut run = vec![0.0; sets];
    let mut sum = vec![0.0; sets];
    let mut prod = vec![vec![0.0; sets]; sets];
    let linear = w.geometry.topology == Topology::Linear;
    for (k, slot) in c.iter().enumerate() {
        for (r, x) in run.iter_mut().zip(slot) {
            *r += x;
        }
        // After the last slot of a flat primary every turns function is back to its start
        // (each coil goes and returns), and half a pitch of zero remains.
        let len = if linear && k + 1 == z { 0.0 } else { 1.0 };
        for i in 0..sets {
            sum[i] += len * run[i];
            for j in 0..=i {
                prod[i][j] += len * run[i] * run[j];
            }
        }
    }
    let lambda = z as f64;
    let mut g = vec![vec![0.0; sets]; sets];
    for i in 0..sets {
        for j in 0..=i {
            let v = prod[i][j] - sum[i] * sum[j] / lambda;
            g[i][j] = v;
            g[j][i] = v;
        }
    }
    g
}

/// Effective gap g_e (m): the one rule, [`crate::thrust::gap`].
pub fn effective_gap_m(w: &Winding) -> Result<f64, ThrustError> {
    crate::thrust::gap(w).map(|g| g.effective_m)
}

/// Solve A·x = b (complex, small, partial pivoting); `None` when singular.
fn solve(mut a: Vec<Vec<Complex64>>, mut b: Vec<Complex64>) -> Option<Vec<Complex64>> {
    let n = b.len();
    for col in 0..n {
        let piv = (col..n).max_by(|x, y| a[*x][col].norm().total_cmp(&a[*y][col].norm()))?;
        if a[piv][col].norm() < 1e-300 {
            return None;
        }
        a.swap(col, piv);
        b.swap(col, piv);
        for r in col + 1..n {
            let f = a[r][col] / a[col][col];
            let pivot_row = a[col].clone();
            for (x, v) in a[r][col..].iter_mut().zip(&pivot_row[col..]) {
                *x -= f * v;
            }
            let v = b[col];
            b[r] -= f * v;
        }
    }
    let mut x = vec![Complex64::new(0.0, 0.0); n];
    for r in (0..n).rev() {
        let s: Complex64 = (r + 1..n).map(|k| a[r][k] * x[k]).sum();
        x[r] = (b[r] - s) / a[r][r];
    }
    Some(x)
}

/// Phase currents of a three-phase winding with impedance matrix `z` under balanced
/// positive-sequence line voltages of phase voltage `v` (star without neutral or delta).
pub fn balanced_voltage_currents(
    z: &[Vec<Complex64>],
    v: f64,
    connection: Connection,
) -> Option<Vec<Complex64>> {
    let m = z.len();
    let a = |k: usize| crate::winding::star::phase_operator(k, m);
    match connection {
        Connection::Star => {
            // Unknowns: m currents and the star-point voltage.
            let mut mat = vec![vec![Complex64::new(0.0, 0.0); m + 1]; m + 1];
            let mut rhs = vec![Complex64::new(0.0, 0.0); m + 1];
            for i in 0..m {
                mat[i][..m].copy_from_slice(&z[i][..m]);
                mat[i][m] = Complex64::new(1.0, 0.0);
                rhs[i] = a(i) * v;
                mat[m][i] = Complex64::new(1.0, 0.0);
            }
            solve(mat, rhs).map(|x| x[..m].to_vec())
        }
        Connection::Delta => {
            // Each phase across a line voltage √3·V_ph (phase voltage of a delta = line).
            let rhs = (0..m).map(|i| a(i) * v).collect();
            solve(z.to_vec(), rhs)
        }
    }
}

/// Negative over positive sequence of a phase set, per cent (Fortescue 1918).
fn negative_percent(i: &[Complex64]) -> f64 {
    let (pos, neg, _) = crate::audit::symmetrical_components(i);
    if pos.norm() > 0.0 {
        100.0 * neg.norm() / pos.norm()
    } else {
        0.0
    }
}

/// Gap matrix (H) of conductor sets `c[slot][set]` by winding functions over the effective
/// gap: a closed core's inductances, and a flat primary's one-dimensional limit.
pub fn winding_function_matrix(w: &Winding, c: &[Vec<f64>]) -> Result<Vec<Vec<f64>>, ThrustError> {
    let ge = effective_gap_m(w)?;
    let width = w
        .design
        .core
        .stack
        .map(Length::m)
        .ok_or(ThrustError::Missing(crate::thrust::Input::Stack))?;
    let ts = w
        .slot_pitch()
        .map(Length::m)
        .ok_or(ThrustError::Missing(crate::thrust::Input::SlotPitch))?;
    let k = MU0 * width * ts / ge;
    Ok(gram(w, c)
        .iter()
        .map(|r| r.iter().map(|x| x * k).collect())
        .collect())
}

/// The gap matrix (H) of conductor sets `c[slot][set]`: the layer method's on a flat
/// primary, winding functions on a closed core.
fn set_matrix(w: &Winding, c: &[Vec<f64>]) -> Result<Matrix, ThrustError> {
    match w.geometry.topology {
        Topology::Linear => {
            let sets = c.first().map_or(0, Vec::len);
            let by_set: Vec<Vec<f64>> = (0..sets)
                .map(|s| c.iter().map(|slot| slot[s]).collect())
                .collect();
            crate::layers::gap_inductances(w, &by_set)
        }
        Topology::Rotary => winding_function_matrix(w, c).map(|m| (m, None)),
    }
}

/// Conductors of each phase in every slot per ampere of phase current (each path carrying
/// 1/a of it): `c[slot][phase]`.
pub fn phase_conductors(w: &Winding) -> Vec<Vec<f64>> {
    let sets = crate::layers::phase_sets(w);
    (0..w.geometry.slots)
        .map(|j| sets.iter().map(|u| u[j]).collect())
        .collect()
}

/// Gap matrix (H) of the phases, effective gap (m) and stack (m).
/// A gap matrix, H, and where its grid was cut short (flat primaries).
type Matrix = (Vec<Vec<f64>>, Option<crate::layers::GridCut>);

fn phase_matrix(w: &Winding) -> Result<(Matrix, f64), ThrustError> {
    Ok((set_matrix(w, &phase_conductors(w))?, effective_gap_m(w)?))
}

/// Negative-sequence current (% of positive) of a three-phase winding under balanced
/// line voltages, or 0 when it cannot be worked out.
fn unbalance(w: &Winding, r1: f64, leak: f64) -> Option<(Vec<Complex64>, f64)> {
    if w.geometry.phases != 3 {
        return None;
    }
    let ((l, _), _) = phase_matrix(w).ok()?;
    let f = w.design.supply.frequency_hz.unwrap_or(50.0);
    let omega = 2.0 * PI * f;
    let z: Vec<Vec<Complex64>> = (0..3)
        .map(|i| {
            (0..3)
                .map(|j| {
                    let diag = if i == j { r1 } else { 0.0 };
                    let x = omega * (l[i][j] + if i == j { leak } else { 0.0 });
                    Complex64::new(diag, x)
                })
                .collect()
        })
        .collect();
    let v = w
        .design
        .connection
        .phase_voltage(w.design.supply.line_voltage_v.unwrap_or(400.0));
    let i = balanced_voltage_currents(&z, v, w.design.connection)?;
    let pct = negative_percent(&i);
    Some((i, pct))
}

/// The inductance report of a winding.
pub fn inductance(w: &Winding, coil_matrix: bool) -> Result<InductanceReport, ThrustError> {
    crate::runs::count(crate::runs::Analysis::Inductance);
    let ((matrix, cut), ge) = phase_matrix(w)?;
    let m = w.geometry.phases;
    let mut assumptions = Vec::new();
    // Positive-sequence inductance: the eigenvalue Σ_j L_0j·a^j of a circulant matrix; for
    // a flat primary the mean over the phases of the same projection.
    // a^k = e^(+j2πk/m): the conjugate of the phase operator, k taken modulo m.
    let a =
        |k: i64| crate::winding::star::phase_operator(k.rem_euclid(m as i64) as usize, m).conj();
    let pos: f64 = (0..m)
        .map(|i| {
            (0..m)
                .map(|j| a(j as i64 - i as i64) * matrix[i][j])
                .sum::<Complex64>()
                .re
        })
        .sum::<f64>()
        / m as f64;
    let r1 = match crate::card::phase_resistances_20c(w) {
        Some(r) => r.iter().sum::<f64>() / r.len().max(1) as f64,
        None => {
            assumptions.push(crate::assumption::Assumption::NoPrimaryResistance);
            0.0
        }
    };
    let leak = crate::thrust::leakage_h(w)
        .map(|(s, e)| s + e)
        .unwrap_or(0.0);
    if w.design.supply.frequency_hz.is_none() || w.design.supply.line_voltage_v.is_none() {
        assumptions.push(crate::assumption::Assumption::SupplyDefaulted);
    }
    let (currents, neg) = match unbalance(w, r1, leak) {
        Some((i, p)) => (Some(i.iter().map(|x| x.norm()).collect()), p),
        None => (None, 0.0),
    };
    if coil_matrix && w.coils.len() > MAX_COIL_MATRIX {
        assumptions.push(crate::assumption::Assumption::CoilMatrixOmitted {
            coils: w.coils.len(),
            limit: MAX_COIL_MATRIX,
        });
    }
    let (coil, coil_cut) = if coil_matrix && w.coils.len() <= MAX_COIL_MATRIX {
        let (m, c) = set_matrix(w, &conductors(w, |i| i, w.coils.len()))?;
        (Some(m), c)
    } else {
        (None, None)
    };
    if let Some(c) = cut.or(coil_cut) {
        assumptions.push(crate::assumption::Assumption::FieldGridBounded {
            window_m: c.window_m,
            wanted_m: c.wanted_m,
            k_max: c.k_max,
            wanted_k_max: c.wanted_k_max,
        });
    }
    let ranking = if w.geometry.topology == Topology::Linear {
        rank_layouts(w, r1, leak)
    } else {
        Vec::new()
    };
    Ok(InductanceReport {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        topology: w.geometry.topology,
        effective_gap: Length::from_m(ge),
        phases: w.design.phase_labels.clone(),
        matrix_h: matrix,
        leakage_h: leak,
        positive_sequence_h: pos,
        phase_currents_a: currents,
        negative_sequence_current_percent: neg,
        backward_field_percent: neg,
        coil_matrix_h: coil,
        ranking,
        assumptions,
    })
}

/// The layouts a builder can choose on the same flat primary (its slot count, pole count
/// and pole pitch kept): single layer, and double layer at every span up to the pole
/// pitch, ranked by unbalance, with the user's own layout among them (marked).
fn rank_layouts(w: &Winding, r1: f64, leak: f64) -> Vec<LayoutRank> {
    let g = &w.geometry;
    let mut out = Vec::new();
    if let Some((_, pct)) = unbalance(w, r1, leak) {
        out.push(LayoutRank {
            poles: g.poles,
            layers: g.layers,
            pitch: w.pitch,
            winding_factor: crate::factors::fundamental(w).winding,
            negative_sequence_current_percent: pct,
            this_layout: true,
        });
    }
    let longest = g.pole_pitch_slots.ceil().max(1.0) as usize;
    let choices = std::iter::once((1usize, None)).chain((1..=longest).map(|y| (2usize, Some(y))));
    for (layers, pitch) in choices {
        let design = Design {
            topology: Topology::Linear,
            slots: g.slots,
            poles: g.poles,
            layers,
            pitch,
            style: Style::Lap,
            parallel_paths: 1,
            skew_slots: 0.0,
            ..w.design.clone()
        };
        let Ok(cand) = winding::synthesize(&design) else {
            continue;
        };
        if !cand.is_balanced() && layers == 2 {
            continue;
        }
        let same = !w.from_coil_list && layers == g.layers && cand.pitch == w.pitch;
        if same
            || out
                .iter()
                .any(|r| r.layers == layers && r.pitch == cand.pitch)
        {
            continue;
        }
        if let Some((_, pct)) = unbalance(&cand, r1, leak) {
            out.push(LayoutRank {
                poles: g.poles,
                layers,
                pitch: cand.pitch,
                winding_factor: crate::factors::fundamental(&cand).winding,
                negative_sequence_current_percent: pct,
                this_layout: false,
            });
        }
    }
    out.sort_by(|a, b| {
        a.negative_sequence_current_percent
            .total_cmp(&b.negative_sequence_current_percent)
    });
    out
}
