//! Parallel paths of a record: the EMF and turns of each, and the smallest reassignment of
//! coils between paths that makes them match (one coil moved, two exchanged, a coil group
//! moved, two groups exchanged).

use num_complex::Complex64;

use super::{
    BALANCE_TOL, Fact, Finding, FindingKind, PathMove, PathRow, angle_of, coil_at, slots_of,
};
use crate::numbering::{CoilNo, PathNo};
use crate::winding::{CoilGroup, Elec, Winding, coil_groups};

/// Most coil pairs of one phase tried as an exchange between paths.
const MAX_PATH_SWAPS: usize = 4_000_000;

/// Coils moved between paths: each entry is (coils, from path, to path).
type Moves = Vec<(Vec<usize>, usize, usize)>;

/// Paths of every phase, and findings for paths that do not match their siblings.
pub(super) fn paths(w: &Winding) -> (Vec<PathRow>, Vec<Finding>) {
    let a = w.parallel_paths;
    let mut rows = Vec::new();
    let mut findings = Vec::new();
    if a < 2 {
        return (rows, findings);
    }
    let groups = coil_groups(w);
    for k in 0..w.geometry.phases {
        let mut emf = vec![Complex64::new(0.0, 0.0); a];
        let mut turns = vec![0u64; a];
        let mut coils: Vec<Vec<usize>> = vec![Vec::new(); a];
        for (i, c) in w.coils.iter().enumerate().filter(|(_, c)| c.phase == k) {
            let p = c.path.min(a - 1);
            emf[p] += w.coil_emf(c, Elec::FUNDAMENTAL);
            turns[p] += c.turns as u64;
            coils[p].push(i);
        }
        let mean: Complex64 = emf.iter().sum::<Complex64>() / a as f64;
        let mean_mag = emf.iter().map(|e| e.norm()).sum::<f64>() / a as f64;
        let tol = BALANCE_TOL * mean_mag.max(1e-12);
        let mut bad = Vec::new();
        for p in 0..a {
            let circ = (emf[p] - mean).norm();
            if circ > tol || turns[p] * a as u64 != turns.iter().sum::<u64>() {
                bad.push(p);
            }
            rows.push(PathRow {
                phase: w.label(k).to_string(),
                path: PathNo::at(p),
                coils: coils[p].iter().map(|&c| CoilNo::at(c)).collect(),
                turns: turns[p],
                magnitude: emf[p].norm(),
                angle_deg: angle_of(emf[p]),
                circulating_emf: circ,
                circulating_percent: if mean_mag > 0.0 {
                    100.0 * circ / mean_mag
                } else {
                    0.0
                },
            });
        }
        if bad.is_empty() {
            continue;
        }
        let hint = path_fix(w, k, &coils, &emf, &turns, tol, &groups);
        let l = w.label(k).to_string();
        match hint {
            Some(moves) => {
                let mut all: Vec<usize> = moves.iter().flat_map(|m| m.0.clone()).collect();
                all.sort_unstable();
                let moved: Vec<PathMove> = moves
                    .iter()
                    .map(|(cs, p, q)| PathMove {
                        coil: match cs.as_slice() {
                            [i] => Some(coil_at(w, *i)),
                            _ => None,
                        },
                        coils: cs.iter().map(|&c| CoilNo::at(c)).collect(),
                        slots: slots_of(w, cs),
                        from: PathNo::at(*p),
                        to: PathNo::at(*q),
                    })
                    .collect();
                findings.push(Finding {
                    kind: FindingKind::PathMismatch,
                    coils: all.iter().map(|&c| CoilNo::at(c)).collect(),
                    slots: slots_of(w, &all),
                    phases: vec![l.clone()],
                    detail: Fact::PathMoves {
                        phase: l.clone(),
                        moves: moved,
                    },
                })
            }
            None => {
                for p in bad {
                    let row = &rows[rows.len() - a + p];
                    findings.push(Finding {
                        kind: FindingKind::PathMismatch,
                        coils: row.coils.clone(),
                        slots: slots_of(w, &coils[p]),
                        phases: vec![l.clone()],
                        detail: Fact::PathDiffers {
                            phase: l.clone(),
                            path: PathNo::at(p),
                            turns: row.turns,
                            magnitude: row.magnitude,
                            angle_deg: row.angle_deg,
                            circulating_percent: row.circulating_percent,
                        },
                    });
                }
            }
        }
    }
    (rows, findings)
}

/// The smallest reassignment of coils of phase `k` between its paths that makes every path
/// match: one coil moved, two coils exchanged, one coil group moved, two groups exchanged,
/// tried in that order. Of several single-coil moves, the one whose group neighbours lie in
/// the path it moves to.
fn path_fix(
    w: &Winding,
    k: usize,
    coils: &[Vec<usize>],
    emf: &[Complex64],
    turns: &[u64],
    tol: f64,
    groups: &[CoilGroup],
) -> Option<Moves> {
    let a = emf.len();
    let total: u64 = turns.iter().sum();
    let mean: Complex64 = emf.iter().sum::<Complex64>() / a as f64;
    let coil_emf = |i: usize| w.coil_emf(&w.coils[i], Elec::FUNDAMENTAL);
    let unit = |cs: &[usize]| -> (Complex64, u64) {
        (
            cs.iter().map(|&i| coil_emf(i)).sum(),
            cs.iter().map(|&i| w.coils[i].turns as u64).sum(),
        )
    };
    // True when moving each (emf, turns) from path p to path q leaves every path matching.
    let fixes = |moves: &[(Complex64, u64, usize, usize)]| {
        (0..a).all(|r| {
            let mut e = emf[r];
            let mut n = turns[r] as i128;
            for &(ce, t, p, q) in moves {
                if r == p {
                    e -= ce;
                    n -= t as i128;
                }
                if r == q {
                    e += ce;
                    n += t as i128;
                }
            }
            (e - mean).norm() <= tol && n * a as i128 == total as i128
        })
    };
    // Of several reassignments that match the EMFs (coils a whole number of pole pairs
    // apart are alike), the one that puts coils beside their group neighbours.
    let mut group_of = vec![usize::MAX; w.coils.len()];
    for (x, g) in groups.iter().enumerate() {
        for &i in &g.coils {
            group_of[i] = x;
        }
    }
    let neighbours_in = |i: usize, q: usize| {
        groups.get(group_of[i]).map_or(0, |g| {
            g.coils
                .iter()
                .filter(|&&j| j != i && w.coils[j].path == q)
                .count()
        })
    };

    // One coil moved.
    let mut best: Option<(usize, Moves)> = None;
    for (p, cs) in coils.iter().enumerate() {
        for &i in cs {
            let (ce, t) = unit(&[i]);
            for q in (0..a).filter(|&q| q != p) {
                let score = neighbours_in(i, q) + 1;
                if fixes(&[(ce, t, p, q)]) && best.as_ref().is_none_or(|b| score > b.0) {
                    best = Some((score, vec![(vec![i], p, q)]));
                }
            }
        }
    }
    if let Some((_, m)) = best {
        return Some(m);
    }

    // Two coils exchanged between paths.
    let mut tried = 0usize;
    for p in 0..a {
        for q in p + 1..a {
            for &i in &coils[p] {
                let (ei, ti) = unit(&[i]);
                for &j in &coils[q] {
                    tried += 1;
                    if tried > MAX_PATH_SWAPS {
                        break;
                    }
                    let (ej, tj) = unit(&[j]);
                    let score = neighbours_in(i, q) + neighbours_in(j, p) + 1;
                    if best.as_ref().is_none_or(|b| score > b.0)
                        && fixes(&[(ei, ti, p, q), (ej, tj, q, p)])
                    {
                        best = Some((score, vec![(vec![i], p, q), (vec![j], q, p)]));
                    }
                }
            }
        }
    }
    if let Some((_, m)) = best {
        return Some(m);
    }

    // Coil groups of this phase lying wholly in one path.
    let whole: Vec<(&[usize], usize)> = groups
        .iter()
        .filter(|g| g.phase == k && g.coils.len() > 1)
        .filter_map(|g| {
            let p = w.coils[g.coils[0]].path.min(a - 1);
            g.coils
                .iter()
                .all(|&i| w.coils[i].path.min(a - 1) == p)
                .then_some((g.coils.as_slice(), p))
        })
        .collect();
    for &(cs, p) in &whole {
        let (e, t) = unit(cs);
        for q in (0..a).filter(|&q| q != p) {
            if fixes(&[(e, t, p, q)]) {
                return Some(vec![(sorted(cs), p, q)]);
            }
        }
    }
    for (x, &(c1, p)) in whole.iter().enumerate() {
        let (e1, t1) = unit(c1);
        for &(c2, q) in &whole[x + 1..] {
            if p == q {
                continue;
            }
            let (e2, t2) = unit(c2);
            if fixes(&[(e1, t1, p, q), (e2, t2, q, p)]) {
                return Some(vec![(sorted(c1), p, q), (sorted(c2), q, p)]);
            }
        }
    }
    None
}

fn sorted(cs: &[usize]) -> Vec<usize> {
    let mut v = cs.to_vec();
    v.sort_unstable();
    v
}
