//! Coil groups and parallel paths.
//!
//! A coil group is a run of coils next to each other (in slot order) that belong to one
//! phase and have one polarity; groups are joined in slot order within their phase. Parallel
//! paths are allowed only when every path of a phase carries the same EMF phasor and the
//! same turns, so that no circulating current flows between them (common practice).

use num_complex::Complex64;

use super::star::BALANCE_TOL;
use super::{Elec, PathChoice, PlanError, Topology, Winding};

/// A run of adjacent coils of one phase and one polarity.
#[derive(Debug, Clone, PartialEq, Eq, serde::Serialize, schemars::JsonSchema)]
pub struct CoilGroup {
    /// Phase index.
    pub phase: usize,
    /// +1 when the coils reach forward from their go side, −1 when reversed.
    pub polarity: i8,
    /// Coil indices (0-based) in slot order.
    pub coils: Vec<usize>,
}

/// All coil groups of the winding, in slot order around (or along) the core.
pub fn coil_groups(w: &Winding) -> Vec<CoilGroup> {
    let mut order: Vec<usize> = (0..w.coils.len()).collect();
    order.sort_by_key(|&i| (w.left_slot(&w.coils[i]), i));
    let mut groups: Vec<CoilGroup> = Vec::new();
    for i in order {
        let c = &w.coils[i];
        let polarity = if w.span(c) >= 0 { 1 } else { -1 };
        match groups.last_mut() {
            Some(g) if g.phase == c.phase && g.polarity == polarity => g.coils.push(i),
            _ => groups.push(CoilGroup {
                phase: c.phase,
                polarity,
                coils: vec![i],
            }),
        }
    }
    // On a closed core the last run may continue into the first.
    if w.geometry.topology == Topology::Rotary && groups.len() > 1 {
        let (first, last) = (&groups[0], &groups[groups.len() - 1]);
        if first.phase == last.phase
            && first.polarity == last.polarity
            && let Some(tail) = groups.pop()
        {
            let mut merged = tail.coils;
            merged.extend_from_slice(&groups[0].coils);
            groups[0].coils = merged;
        }
    }
    groups
}

/// EMF phasor of a set of coils at the fundamental.
fn emf_of(w: &Winding, coils: &[usize]) -> Complex64 {
    coils
        .iter()
        .map(|&i| w.coil_emf(&w.coils[i], Elec::FUNDAMENTAL))
        .sum()
}

fn turns_of(w: &Winding, coils: &[usize]) -> u64 {
    coils.iter().map(|&i| w.coils[i].turns as u64).sum()
}

/// Split one phase's groups (in connection order) into `a` paths of equal EMF phasor and
/// equal turns: first as runs of consecutive groups, then round-robin. Returns the path of
/// each group, or `None` if neither split balances.
fn split_phase(w: &Winding, groups: &[&CoilGroup], a: usize) -> Option<Vec<usize>> {
    let emfs: Vec<Complex64> = groups.iter().map(|g| emf_of(w, &g.coils)).collect();
    let turns: Vec<u64> = groups.iter().map(|g| turns_of(w, &g.coils)).collect();
    split(&emfs, &turns, a)
}

/// [`split_phase`] on the groups' EMF phasors and turns, worked out once per phase.
fn split(emfs: &[Complex64], turns: &[u64], a: usize) -> Option<Vec<usize>> {
    if a == 1 {
        return Some(vec![0; emfs.len()]);
    }
    if emfs.len() < a {
        return None;
    }
    let total: Complex64 = emfs.iter().sum();
    let total_turns: u64 = turns.iter().sum();
    if !total_turns.is_multiple_of(a as u64) {
        return None;
    }
    let target = total / a as f64;
    let tol = BALANCE_TOL * (total.norm() / a as f64).max(1e-300);
    let balanced = |assign: &[usize]| {
        let mut e = vec![Complex64::new(0.0, 0.0); a];
        let mut n = vec![0u64; a];
        for (g, &p) in assign.iter().enumerate() {
            e[p] += emfs[g];
            n[p] += turns[g];
        }
        e.iter()
            .zip(&n)
            .all(|(e, &n)| (e - target).norm() <= tol && n * a as u64 == total_turns)
    };
    // Runs of consecutive groups: cut where the running sum reaches k·target.
    let mut assign = Vec::with_capacity(emfs.len());
    let mut run = Complex64::new(0.0, 0.0);
    let mut path = 0;
    for e in emfs {
        assign.push(path);
        run += e;
        if path + 1 < a && (run - target * (path + 1) as f64).norm() <= tol {
            path += 1;
        }
    }
    if balanced(&assign) {
        return Some(assign);
    }
    let robin: Vec<usize> = (0..emfs.len()).map(|g| g % a).collect();
    balanced(&robin).then_some(robin)
}

/// Parallel path counts for which every phase splits into equal paths.
pub fn possible_path_counts(w: &Winding) -> Vec<usize> {
    let groups = coil_groups(w);
    let per_phase: Vec<Vec<&CoilGroup>> = (0..w.geometry.phases)
        .map(|k| groups.iter().filter(|g| g.phase == k).collect())
        .collect();
    // Each group's EMF and turns once; every path count then costs O(groups).
    let sums: Vec<(Vec<Complex64>, Vec<u64>)> = per_phase
        .iter()
        .map(|gs| {
            (
                gs.iter().map(|g| emf_of(w, &g.coils)).collect(),
                gs.iter().map(|g| turns_of(w, &g.coils)).collect(),
            )
        })
        .collect();
    let most = per_phase.iter().map(|g| g.len()).min().unwrap_or(0);
    (1..=most.max(1))
        .filter(|&a| sums.iter().all(|(e, t)| split(e, t, a).is_some()))
        .collect()
}

/// Give every coil its parallel path for `a` paths per phase, or explain which counts work.
pub fn assign_paths(w: &mut Winding, a: usize) -> Result<(), PlanError> {
    let groups = coil_groups(w);
    let mut plan = Vec::new();
    for k in 0..w.geometry.phases {
        let mine: Vec<&CoilGroup> = groups.iter().filter(|g| g.phase == k).collect();
        match split_phase(w, &mine, a) {
            Some(paths) => plan.extend(mine.iter().zip(paths).map(|(g, p)| (g.coils.clone(), p))),
            None => {
                return Err(PlanError::Paths(PathChoice {
                    requested: a,
                    possible: possible_path_counts(w),
                }));
            }
        }
    }
    for (coils, p) in plan {
        for i in coils {
            w.coils[i].path = p;
        }
    }
    w.parallel_paths = a;
    Ok(())
}
