//! The smallest change that restores a balanced positive-sequence winding.
//!
//! The phase EMF phasors S_k are sums of coil phasors, so every coil-level edit (reverse a
//! coil, reverse a group, move a coil to another phase) changes at most two of them by a fixed
//! amount, and every phase-level edit (reverse a phase, swap two phase labels) is a signed
//! permutation of them. A winding is balanced in positive sequence when S is a multiple of the
//! forward pattern u_k = e^{−j2πk/m}, i.e. when its projection R = S − F·u onto the other
//! symmetrical components (Fortescue 1918) vanishes. R is linear in S, so a pair of additive
//! edits e1, e2 fixes the winding only if R(e1) + R(e2) = −R0: we sort the edits by one real
//! linear functional of R(e) and look up the partner of each edit by binary search, then check
//! the few candidates in full. Each check is O(m) on a stack array; nothing is allocated in the
//! inner loops.

use num_complex::Complex64 as C;

use crate::spec::MAX_PHASES;
use crate::winding::{Elec, Topology, Winding};

pub use crate::winding::star::BALANCE_TOL;

/// Longest run of same-phase coils whose every contiguous part is tried as a group.
pub const MAX_RUN: usize = 24;

/// Most candidate pairs checked in full: far above any real record (a 360-slot record needs
/// a few thousand), a bound on the time a pathological record can take.
const MAX_PAIR_CHECKS: usize = 20_000_000;

/// Most fixes of the smallest size kept for ranking.
const MAX_FIXES: usize = 256;

/// Most coil pairs tried as a swap between phases: every pair of a 360-slot double layer
/// (about 43,000); on larger records pairs up to MAX_SWAPS/n slots apart, which still spans
/// a pole pair (every electrical position) on any core of ordinary pole count.
const MAX_SWAPS: usize = 400_000;

/// Most slots with room left that a coil from an overfilled slot is tried in.
const MAX_SHORT_SLOTS: usize = 16;

/// One change to a coil list. Coil and phase indices are 0-based.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Edit {
    /// Swap the ends of one coil.
    ReverseCoil {
        /// The coil.
        coil: usize,
    },
    /// Swap the ends of a run of adjacent coils of one phase.
    ReverseGroup {
        /// The coils, in slot order.
        coils: Vec<usize>,
    },
    /// Connect a coil into another phase, optionally the other way round.
    MoveCoil {
        /// The coil.
        coil: usize,
        /// Phase it is in now.
        from: usize,
        /// Phase it belongs in.
        to: usize,
        /// Also swap its ends.
        reversed: bool,
    },
    /// Exchange the phases of two coils: a pair laid into each other's phase, one mistake.
    SwapCoils {
        /// One coil, in phase `phase_a` now.
        a: usize,
        /// The other, in phase `phase_b` now.
        b: usize,
        /// Phase of `a` now (it belongs in `phase_b`).
        phase_a: usize,
        /// Phase of `b` now (it belongs in `phase_a`).
        phase_b: usize,
    },
    /// Connect a run of adjacent coils (a group) into another phase, optionally reversed.
    MoveGroup {
        /// The coils, in slot order.
        coils: Vec<usize>,
        /// Phase they are in now.
        from: usize,
        /// Phase they belong in.
        to: usize,
        /// Also swap the group's ends.
        reversed: bool,
    },
    /// Lay a coil in other slots: it sits where slots are overfilled while others are short.
    RelayCoil {
        /// The coil.
        coil: usize,
        /// Slot where current should enter (0-based).
        go: usize,
        /// Slot where current should leave (0-based).
        back: usize,
        /// Layer of the go side there.
        go_layer: usize,
        /// Layer of the back side there.
        back_layer: usize,
    },
    /// Swap the two leads of a whole phase.
    ReversePhase {
        /// The phase.
        phase: usize,
    },
    /// Exchange the labels (leads) of two phases.
    SwapPhases {
        /// One phase.
        a: usize,
        /// The other.
        b: usize,
    },
}

impl Edit {
    /// The coils an edit touches (0-based); none for a whole-phase edit.
    pub fn coils(&self) -> Vec<usize> {
        match self {
            Edit::ReverseCoil { coil }
            | Edit::MoveCoil { coil, .. }
            | Edit::RelayCoil { coil, .. } => vec![*coil],
            Edit::SwapCoils { a, b, .. } => vec![*a, *b],
            Edit::ReverseGroup { coils } | Edit::MoveGroup { coils, .. } => coils.clone(),
            Edit::ReversePhase { .. } | Edit::SwapPhases { .. } => Vec::new(),
        }
    }

    /// How many shop edits this counts as.
    pub fn cost(&self) -> usize {
        match self {
            Edit::MoveCoil { reversed: true, .. } | Edit::MoveGroup { reversed: true, .. } => 2,
            _ => 1,
        }
    }
}

/// Result of the search.
#[derive(Debug, Clone, PartialEq)]
pub struct Search {
    /// The winding is balanced in positive sequence as it is.
    pub balanced: bool,
    /// The best fix of the smallest size found (up to two edits), if any.
    pub fix: Option<Vec<Edit>>,
    /// How many other fixes of the same size were found (ties broken by regularity).
    pub alternatives: usize,
    /// The pair stage hit its work limit (a pathological record): the search is incomplete.
    pub truncated: bool,
    /// Coils swapped between phases were only tried this many slots apart or closer (a very
    /// large record); `None` when every pair was tried.
    pub swap_reach: Option<usize>,
}
/// The candidate edits of a search, with their deltas on the phase sums and the coils each
/// touches (`members[lo..hi]`).
struct Candidates<'a> {
    bal: &'a Balance,
    edits: Vec<Edit>,
    deltas: Vec<Delta>,
    members: Vec<usize>,
}

impl<'a> Candidates<'a> {
    fn new(bal: &'a Balance) -> Self {
        Candidates {
            bal,
            edits: Vec::new(),
            deltas: Vec::new(),
            members: Vec::new(),
        }
    }

    /// Add `edit`, which changes phase `a`'s EMF by `da` and phase `b`'s by `db` and moves
    /// `turns` turns, touching `coils`.
    #[allow(clippy::too_many_arguments)]
    fn push(&mut self, edit: Edit, a: usize, da: C, b: usize, db: C, turns: f64, coils: &[usize]) {
        let lo = self.members.len() as u32;
        self.members.extend_from_slice(coils);
        self.deltas.push(Delta {
            a,
            da,
            b,
            db,
            turns,
            key: self.bal.key(a, da, b, db),
            cost: edit.cost() as u8,
            lo,
            hi: self.members.len() as u32,
            edit: self.edits.len() as u32,
        });
        self.edits.push(edit);
    }
}

/// Every single coil reversed, or moved to another phase either way round.
fn coil_edits(w: &Winding, m: usize, emf: &[C], cands: &mut Candidates) {
    let zero = C::new(0.0, 0.0);
    for (i, c) in w.coils.iter().enumerate() {
        let p = c.phase.min(m - 1);
        cands.push(
            Edit::ReverseCoil { coil: i },
            p,
            -2.0 * emf[i],
            p,
            zero,
            0.0,
            &[i],
        );
        for to in (0..m).filter(|&t| t != p) {
            for reversed in [false, true] {
                let moved = if reversed { -emf[i] } else { emf[i] };
                cands.push(
                    Edit::MoveCoil {
                        coil: i,
                        from: p,
                        to,
                        reversed,
                    },
                    p,
                    -emf[i],
                    to,
                    moved,
                    c.turns as f64,
                    &[i],
                );
            }
        }
    }
}

/// Every coil group reversed, or moved to another phase either way round (a whole phase is
/// left to the phase-level edits).
fn group_edits(w: &Winding, m: usize, emf: &[C], cands: &mut Candidates) {
    let zero = C::new(0.0, 0.0);
    let mut per_phase = [0usize; MAX_PHASES];
    for c in &w.coils {
        per_phase[c.phase.min(m - 1)] += 1;
    }
    for g in group_candidates(w) {
        let p = w.coils[g[0]].phase.min(m - 1);
        if g.len() == per_phase[p] {
            // The whole phase: reported as the phase connected backwards.
            continue;
        }
        let sum: C = g.iter().map(|&i| emf[i]).sum();
        let turns: f64 = g.iter().map(|&i| w.coils[i].turns as f64).sum();
        cands.push(
            Edit::ReverseGroup { coils: g.clone() },
            p,
            -2.0 * sum,
            p,
            zero,
            0.0,
            &g,
        );
        for to in (0..m).filter(|&t| t != p) {
            for reversed in [false, true] {
                cands.push(
                    Edit::MoveGroup {
                        coils: g.clone(),
                        from: p,
                        to,
                        reversed,
                    },
                    p,
                    -sum,
                    to,
                    if reversed { -sum } else { sum },
                    turns,
                    &g,
                );
            }
        }
    }
}

/// Pairs of coils of different phases swapped, nearest first when a huge record needs a
/// bound: the reach in slots, when bounded.
fn swap_edits(
    w: &Winding,
    m: usize,
    emf: &[C],
    scale: f64,
    cands: &mut Candidates,
) -> Option<usize> {
    // Pairs swapped between phases, nearest first when a huge record needs a bound.
    let z = w.geometry.slots;
    let n = w.coils.len();
    let reach = (MAX_SWAPS / n.max(1)).max(1);
    let swap_reach = (reach < z).then_some(reach);
    let left: Vec<usize> = w.coils.iter().map(|c| w.left_slot(c)).collect();
    let rotary = w.geometry.topology == Topology::Rotary;
    for a in 0..n {
        for b in a + 1..n {
            let (pa, pb) = (w.coils[a].phase.min(m - 1), w.coils[b].phase.min(m - 1));
            if pa == pb {
                continue;
            }
            let d = left[a].abs_diff(left[b]);
            let d = if rotary { d.min(z - d) } else { d };
            if d > reach {
                continue;
            }
            let de = emf[b] - emf[a];
            let dt = w.coils[a].turns as f64 - w.coils[b].turns as f64;
            if de.norm() <= 1e-12 * scale.max(1.0) && dt == 0.0 {
                continue;
            }
            cands.push(
                Edit::SwapCoils {
                    a,
                    b,
                    phase_a: pa,
                    phase_b: pb,
                },
                pa,
                de,
                pb,
                -de,
                dt,
                &[a, b],
            );
        }
    }
    swap_reach
}

/// A coil laid in the wrong slots: a side in an overfilled slot moved to a slot with room.
fn relay_edits(w: &Winding, m: usize, emf: &[C], cands: &mut Candidates) {
    let zero = C::new(0.0, 0.0);
    for (i, moved) in relay_candidates(w) {
        let p = moved.phase.min(m - 1);
        cands.push(
            Edit::RelayCoil {
                coil: i,
                go: moved.go,
                back: moved.back,
                go_layer: moved.go_layer,
                back_layer: moved.back_layer,
            },
            p,
            w.coil_emf(&moved, Elec::FUNDAMENTAL) - emf[i],
            p,
            zero,
            0.0,
            &[i],
        );
    }
}

/// An additive edit: phasor deltas on at most two phases.
#[derive(Debug, Clone, Copy)]
struct Delta {
    a: usize,
    da: C,
    b: usize,
    db: C,
    /// Turns moved from phase a to phase b.
    turns: f64,
    key: f64,
    cost: u8,
    /// Coil members: `members[lo..hi]`.
    lo: u32,
    hi: u32,
    edit: u32,
}

/// A signed permutation of the phase phasors: S'_k = sign_k · S_{perm_k}.
#[derive(Debug, Clone, Copy)]
struct Map {
    perm: [usize; MAX_PHASES],
    sign: [f64; MAX_PHASES],
    edit: u32,
}

/// Phase phasors and series turns of a candidate winding (a stack value, copied freely).
#[derive(Debug, Clone, Copy)]
struct State {
    e: [C; MAX_PHASES],
    t: [f64; MAX_PHASES],
}

/// Precomputed constants of the balance test.
struct Balance {
    m: usize,
    /// Forward (positive-sequence) pattern u_k = e^{−j2πk/m}.
    u: [C; MAX_PHASES],
    /// Weights of the sorting functional.
    beta: [C; MAX_PHASES],
    /// γ = Σ β_k u_k.
    gamma: C,
}

impl Balance {
    fn new(m: usize) -> Self {
        let mut u = [C::new(0.0, 0.0); MAX_PHASES];
        let mut beta = [C::new(0.0, 0.0); MAX_PHASES];
        let mut gamma = C::new(0.0, 0.0);
        for k in 0..m {
            u[k] = crate::winding::star::phase_operator(k, m);
            // Generic weights, so that unrelated defects rarely share a key.
            beta[k] = C::from_polar(1.0 + 0.37 * k as f64, 0.61 + 1.13 * k as f64);
            gamma += beta[k] * u[k];
        }
        Balance { m, u, beta, gamma }
    }

    /// Forward component F = (1/m) Σ S_k conj(u_k).
    fn forward(&self, s: &[C]) -> C {
        let f: C = s
            .iter()
            .zip(&self.u)
            .take(self.m)
            .map(|(x, u)| x * u.conj())
            .sum();
        f / self.m as f64
    }

    /// True when the state is a non-zero positive-sequence set with equal turns per phase.
    fn fixed(&self, st: &State) -> bool {
        st.t[..self.m].iter().all(|&t| t == st.t[0]) && self.ok(&st.e[..self.m])
    }

    /// True when `s` is a non-zero positive-sequence set (the one balance rule,
    /// `star::matches_forward`, with this search's table of operators).
    fn ok(&self, s: &[C]) -> bool {
        let f = self.forward(s);
        crate::winding::star::matches_forward(&s[..self.m], f, self.u[..self.m].iter().copied())
    }

    /// ℓ(R(Δ)) for a delta on phases a and b: Re Σ β_k R_k with R = Δ − F(Δ)·u.
    fn key(&self, a: usize, da: C, b: usize, db: C) -> f64 {
        let f = (da * self.u[a].conj() + db * self.u[b].conj()) / self.m as f64;
        (self.beta[a] * da + self.beta[b] * db - self.gamma * f).re
    }

    /// ℓ(R(S)) for a full vector.
    fn key_of(&self, s: &[C]) -> f64 {
        let f = self.forward(s);
        let k: C = s
            .iter()
            .zip(self.u.iter().zip(&self.beta))
            .take(self.m)
            .map(|(x, (u, b))| b * (x - f * u))
            .sum();
        k.re
    }
}

/// Runs of adjacent coils (in slot order) of one phase, polarity ignored.
pub fn phase_runs(w: &Winding) -> Vec<Vec<usize>> {
    let mut order: Vec<usize> = (0..w.coils.len()).collect();
    order.sort_by_key(|&i| (w.left_slot(&w.coils[i]), i));
    let mut runs: Vec<Vec<usize>> = Vec::new();
    for i in order {
        match runs.last_mut() {
            Some(r) if w.coils[r[0]].phase == w.coils[i].phase => r.push(i),
            _ => runs.push(vec![i]),
        }
    }
    if w.geometry.topology == Topology::Rotary
        && runs.len() > 1
        && w.coils[runs[0][0]].phase == w.coils[runs[runs.len() - 1][0]].phase
        && let Some(mut tail) = runs.pop()
    {
        tail.extend_from_slice(&runs[0]);
        runs[0] = tail;
    }
    runs
}

/// Candidate groups: every contiguous part (two coils or more) of each phase run; for very
/// long runs only their polarity runs and the whole run.
fn group_candidates(w: &Winding) -> Vec<Vec<usize>> {
    let mut out = Vec::new();
    for run in phase_runs(w) {
        let n = run.len();
        if n < 2 {
            continue;
        }
        if n <= MAX_RUN {
            for i in 0..n {
                for j in i + 2..=n {
                    out.push(run[i..j].to_vec());
                }
            }
        } else {
            let pol = |i: usize| w.span(&w.coils[run[i]]) >= 0;
            let mut start = 0;
            for i in 1..=n {
                if i == n || pol(i) != pol(start) {
                    if i - start >= 2 {
                        out.push(run[start..i].to_vec());
                    }
                    start = i;
                }
            }
            out.push(run.clone());
        }
    }
    out
}

/// Search for the smallest set of edits (at most two) that makes `w` a balanced
/// positive-sequence winding at the fundamental.
pub fn search(w: &Winding) -> Search {
    let m = w.geometry.phases.min(MAX_PHASES);
    let emf: Vec<C> = w
        .coils
        .iter()
        .map(|c| w.coil_emf(c, Elec::FUNDAMENTAL))
        .collect();
    let scale: f64 = emf.iter().map(|e| e.norm()).sum();
    let bal = Balance::new(m);
    let mut s0 = State {
        e: [C::new(0.0, 0.0); MAX_PHASES],
        t: [0.0; MAX_PHASES],
    };
    for (c, e) in w.coils.iter().zip(&emf) {
        s0.e[c.phase.min(m - 1)] += e;
        s0.t[c.phase.min(m - 1)] += c.turns as f64;
    }
    if bal.ok(&s0.e[..m]) {
        return Search {
            balanced: true,
            fix: None,
            alternatives: 0,
            truncated: false,
            swap_reach: None,
        };
    }

    // Every candidate edit, additive ones with their deltas: single coils, coil groups,
    // pairs swapped between phases, coils laid in the wrong slots.
    let mut cands = Candidates::new(&bal);
    coil_edits(w, m, &emf, &mut cands);
    group_edits(w, m, &emf, &mut cands);
    let swap_reach = swap_edits(w, m, &emf, scale, &mut cands);
    relay_edits(w, m, &emf, &mut cands);
    let Candidates {
        mut edits,
        deltas,
        members,
        ..
    } = cands;
    let maps = phase_maps(m, &mut edits);

    let apply = |s: &mut State, d: &Delta| {
        s.e[d.a] += d.da;
        s.e[d.b] += d.db;
        s.t[d.a] -= d.turns;
        s.t[d.b] += d.turns;
    };
    let map = |s: &State, q: &Map| {
        let mut out = *s;
        for k in 0..m {
            out.e[k] = s.e[q.perm[k]] * q.sign[k];
            out.t[k] = s.t[q.perm[k]];
        }
        out
    };

    let mut found: Vec<Vec<u32>> = Vec::new();
    let mut truncated = false;
    let mut total = 0usize;
    let mut keep = |f: Vec<u32>, found: &mut Vec<Vec<u32>>| {
        total += 1;
        if found.len() < MAX_FIXES {
            found.push(f);
        }
    };

    // One edit.
    for d in deltas.iter().filter(|d| d.cost == 1) {
        let mut s = s0;
        apply(&mut s, d);
        if bal.fixed(&s) {
            keep(vec![d.edit], &mut found);
        }
    }
    for q in &maps {
        if bal.fixed(&map(&s0, q)) {
            keep(vec![q.edit], &mut found);
        }
    }

    // Two edits.
    if found.is_empty() {
        for d in deltas.iter().filter(|d| d.cost == 2) {
            let mut s = s0;
            apply(&mut s, d);
            if bal.fixed(&s) {
                keep(vec![d.edit], &mut found);
            }
        }
        // Pairs of additive edits on different coils: partner keys by binary search.
        let ones: Vec<&Delta> = deltas.iter().filter(|d| d.cost == 1).collect();
        let mut sorted: Vec<&Delta> = ones.clone();
        sorted.sort_by(|x, y| x.key.total_cmp(&y.key));
        let keys: Vec<f64> = sorted.iter().map(|d| d.key).collect();
        let k0 = bal.key_of(&s0.e[..m]);
        let beta_sum: f64 = bal.beta[..m].iter().map(|b| b.norm()).sum();
        let tol = BALANCE_TOL * scale.max(1.0) * beta_sum;
        let disjoint = |x: &Delta, y: &Delta| {
            let xs = &members[x.lo as usize..x.hi as usize];
            let ys = &members[y.lo as usize..y.hi as usize];
            xs.iter().all(|c| !ys.contains(c))
        };
        let mut checks = 0usize;
        for d1 in &ones {
            let want = -k0 - d1.key;
            let from = keys.partition_point(|&k| k < want - tol);
            let to = keys.partition_point(|&k| k <= want + tol);
            if checks > MAX_PAIR_CHECKS {
                truncated = true;
                break;
            }
            checks += to - from;
            for d2 in &sorted[from..to] {
                if d2.edit <= d1.edit || !disjoint(d1, d2) {
                    continue;
                }
                let mut s = s0;
                apply(&mut s, d1);
                apply(&mut s, d2);
                if bal.fixed(&s) {
                    keep(vec![d1.edit, d2.edit], &mut found);
                }
            }
        }
        // An additive edit followed by a phase-level one.
        for q in &maps {
            for d in &ones {
                let mut s = s0;
                apply(&mut s, d);
                if bal.fixed(&map(&s, q)) {
                    keep(vec![d.edit, q.edit], &mut found);
                }
            }
        }
        // Two phase-level edits, in either order (they need not commute).
        for (i, q1) in maps.iter().enumerate() {
            for (j, q2) in maps.iter().enumerate() {
                if i != j && bal.fixed(&map(&map(&s0, q1), q2)) {
                    keep(vec![q1.edit, q2.edit], &mut found);
                }
            }
        }
    }

    if found.is_empty() {
        return Search {
            balanced: false,
            fix: None,
            alternatives: 0,
            truncated,
            swap_reach,
        };
    }
    let best = best_fix(w, found, &edits);
    Search {
        balanced: false,
        fix: best,
        alternatives: total - 1,
        truncated,
        swap_reach,
    }
}

/// The phase-level edits as maps of the phase sums: each phase reversed, each pair of
/// phases swapped (their edits appended to `edits`).
fn phase_maps(m: usize, edits: &mut Vec<Edit>) -> Vec<Map> {
    let mut maps: Vec<Map> = Vec::new();
    let identity = || {
        let mut perm = [0; MAX_PHASES];
        for (k, p) in perm.iter_mut().enumerate() {
            *p = k;
        }
        perm
    };
    for k in 0..m {
        let mut sign = [1.0; MAX_PHASES];
        sign[k] = -1.0;
        maps.push(Map {
            perm: identity(),
            sign,
            edit: edits.len() as u32,
        });
        edits.push(Edit::ReversePhase { phase: k });
    }
    for a in 0..m {
        for b in a + 1..m {
            let mut perm = identity();
            perm.swap(a, b);
            maps.push(Map {
                perm,
                sign: [1.0; MAX_PHASES],
                edit: edits.len() as u32,
            });
            edits.push(Edit::SwapPhases { a, b });
        }
    }
    maps
}

/// The fix to report among those `found` (each a list of indices into `edits`): fewest
/// shop edits, then most coils agreeing with the standard belt layout, most
/// coils whose span is the record's usual span, then fewest coils touched, then the
/// earliest edits.
fn best_fix(w: &Winding, found: Vec<Vec<u32>>, edits: &[Edit]) -> Option<Vec<Edit>> {
    // Rank: fewest shop edits, then most coils agreeing with the standard belt layout, most
    // coils whose span is the record's usual span, then fewest coils touched, then the
    // earliest edits.
    let usual = usual_span(w);
    found
        .into_iter()
        .map(|f| {
            let fix: Vec<Edit> = f.iter().map(|&e| edits[e as usize].clone()).collect();
            let cost: usize = fix.iter().map(Edit::cost).sum();
            let touched: usize = fix.iter().map(|e| touched(w, e)).sum();
            let fixed = apply_fix(w, &fix);
            // Coils that, after the fix, have the phase and polarity of the standard belt
            // layout, and coils with the record's usual span.
            let agree = fixed
                .coils
                .iter()
                .filter(|c| {
                    (c.phase, fixed.span(c) >= 0)
                        == crate::winding::star::belt_of_slot(&fixed.geometry, fixed.left_slot(c))
                })
                .count();
            let regular = fixed
                .coils
                .iter()
                .filter(|c| Some(fixed.span(c).unsigned_abs()) == usual)
                .count();
            (cost, (agree, regular), touched, f, fix)
        })
        .min_by(|x, y| {
            (x.0, std::cmp::Reverse(x.1), x.2, &x.3).cmp(&(y.0, std::cmp::Reverse(y.1), y.2, &y.3))
        })
        .map(|r| r.4)
}

/// Where a coil with a side in an overfilled slot could lie instead: each such side moved
/// to a slot with room, alone or with the other side, as (coil index, the coil relaid).
fn relay_candidates(w: &Winding) -> Vec<(usize, crate::winding::Coil)> {
    let layers = w.geometry.layers;
    let z = w.geometry.slots;
    let sides = w.slot_sides();
    let fill = w.slot_fill();
    let short: Vec<usize> = (0..z)
        .filter(|&k| sides[k] < super::slots::expected(w, k))
        .take(MAX_SHORT_SLOTS)
        .collect();
    if short.is_empty() {
        return Vec::new();
    }
    // The layer a side would take in slot k: its own if free there, else the other.
    let layer_in = |k: usize, own: usize| -> usize {
        if layers < 2 || fill[k][own.min(1)].is_none() {
            own.min(layers - 1)
        } else {
            1 - own.min(1)
        }
    };
    let mut out = Vec::new();
    for (i, c) in w.coils.iter().enumerate() {
        let go_over = super::slots::over(w, c.go, sides[c.go]);
        let back_over = super::slots::over(w, c.back, sides[c.back]);
        if !go_over && !back_over {
            continue;
        }
        let gos: Vec<usize> = std::iter::once(c.go)
            .chain(short.iter().copied().filter(|_| go_over))
            .collect();
        let backs: Vec<usize> = std::iter::once(c.back)
            .chain(short.iter().copied().filter(|_| back_over))
            .collect();
        for &g in &gos {
            for &b in &backs {
                if (g, b) == (c.go, c.back) || g == b {
                    continue;
                }
                let gl = if g == c.go {
                    c.go_layer
                } else {
                    layer_in(g, c.go_layer)
                };
                let bl = if b == c.back {
                    c.back_layer
                } else {
                    layer_in(b, c.back_layer)
                };
                out.push((
                    i,
                    crate::winding::Coil {
                        go: g,
                        back: b,
                        go_layer: gl,
                        back_layer: bl,
                        ..c.clone()
                    },
                ));
            }
        }
    }
    out
}

/// The most common coil span of the record (the larger on a tie), if it has coils.
fn usual_span(w: &Winding) -> Option<u64> {
    let mut spans: Vec<u64> = w.coils.iter().map(|c| w.span(c).unsigned_abs()).collect();
    spans.sort_unstable();
    spans
        .chunk_by(|a, b| a == b)
        .max_by_key(|run| (run.len(), run[0]))
        .map(|run| run[0])
}

/// Coils an edit touches.
fn touched(w: &Winding, e: &Edit) -> usize {
    match e {
        Edit::ReverseCoil { .. } | Edit::MoveCoil { .. } | Edit::RelayCoil { .. } => 1,
        Edit::SwapCoils { .. } => 2,
        Edit::ReverseGroup { coils } | Edit::MoveGroup { coils, .. } => coils.len(),
        Edit::ReversePhase { phase } => w.coils.iter().filter(|c| c.phase == *phase).count(),
        Edit::SwapPhases { a, b } => w
            .coils
            .iter()
            .filter(|c| c.phase == *a || c.phase == *b)
            .count(),
    }
}

/// The winding with `fix` applied (coil ends swapped, phases relabelled).
pub fn apply_fix(w: &Winding, fix: &[Edit]) -> Winding {
    let mut out = w.clone();
    let flip = |c: &mut crate::winding::Coil| {
        std::mem::swap(&mut c.go, &mut c.back);
        std::mem::swap(&mut c.go_layer, &mut c.back_layer);
    };
    for e in fix {
        match e {
            Edit::ReverseCoil { coil } => flip(&mut out.coils[*coil]),
            Edit::ReverseGroup { coils } => {
                for &c in coils {
                    flip(&mut out.coils[c]);
                }
            }
            Edit::MoveCoil {
                coil, to, reversed, ..
            } => {
                out.coils[*coil].phase = *to;
                if *reversed {
                    flip(&mut out.coils[*coil]);
                }
            }
            Edit::MoveGroup {
                coils,
                to,
                reversed,
                ..
            } => {
                for &c in coils {
                    out.coils[c].phase = *to;
                    if *reversed {
                        flip(&mut out.coils[c]);
                    }
                }
            }
            Edit::SwapCoils {
                a,
                b,
                phase_a,
                phase_b,
            } => {
                out.coils[*a].phase = *phase_b;
                out.coils[*b].phase = *phase_a;
            }
            Edit::RelayCoil {
                coil,
                go,
                back,
                go_layer,
                back_layer,
            } => {
                let c = &mut out.coils[*coil];
                (c.go, c.back, c.go_layer, c.back_layer) = (*go, *back, *go_layer, *back_layer);
            }
            Edit::ReversePhase { phase } => {
                for c in out.coils.iter_mut().filter(|c| c.phase == *phase) {
                    flip(c);
                }
            }
            Edit::SwapPhases { a, b } => {
                for c in out.coils.iter_mut() {
                    if c.phase == *a {
                        c.phase = *b;
                    } else if c.phase == *b {
                        c.phase = *a;
                    }
                }
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::Design;
    use crate::spec::Spec;
    use crate::winding;

    fn spec(slots: usize, poles: usize, layers: usize, pitch: usize) -> Spec {
        Spec::of(Design {
            pitch: Some(pitch),
            turns_per_coil: 5,
            ..Design::basic(Topology::Rotary, slots, poles, layers)
        })
    }

    /// Every candidate edit, as the search builds them.
    fn candidates(w: &Winding) -> Vec<Edit> {
        let m = w.geometry.phases;
        let mut out = Vec::new();
        for (i, c) in w.coils.iter().enumerate() {
            out.push(Edit::ReverseCoil { coil: i });
            for to in (0..m).filter(|&t| t != c.phase) {
                for reversed in [false, true] {
                    out.push(Edit::MoveCoil {
                        coil: i,
                        from: c.phase,
                        to,
                        reversed,
                    });
                }
            }
        }
        for g in group_candidates(w) {
            let from = w.coils[g[0]].phase;
            let n = w.coils.iter().filter(|c| c.phase == from).count();
            if g.len() < n {
                out.push(Edit::ReverseGroup { coils: g.clone() });
                for to in (0..m).filter(|&t| t != from) {
                    for reversed in [false, true] {
                        out.push(Edit::MoveGroup {
                            coils: g.clone(),
                            from,
                            to,
                            reversed,
                        });
                    }
                }
            }
        }
        // Every pair in different phases that changes something (these records are small
        // enough for the search to try them all).
        let scale: f64 = w
            .coils
            .iter()
            .map(|c| w.coil_emf(c, Elec::FUNDAMENTAL).norm())
            .sum();
        for a in 0..w.coils.len() {
            for b in a + 1..w.coils.len() {
                let (ca, cb) = (&w.coils[a], &w.coils[b]);
                let same = (w.coil_emf(ca, Elec::FUNDAMENTAL) - w.coil_emf(cb, Elec::FUNDAMENTAL))
                    .norm()
                    <= 1e-12 * scale
                    && ca.turns == cb.turns;
                if ca.phase != cb.phase && !same {
                    out.push(Edit::SwapCoils {
                        a,
                        b,
                        phase_a: ca.phase,
                        phase_b: cb.phase,
                    });
                }
            }
        }
        for k in 0..m {
            out.push(Edit::ReversePhase { phase: k });
        }
        for a in 0..m {
            for b in a + 1..m {
                out.push(Edit::SwapPhases { a, b });
            }
        }
        out
    }

    fn coils_of(e: &Edit) -> Vec<usize> {
        e.coils()
    }

    fn additive(e: &Edit) -> bool {
        !matches!(e, Edit::ReversePhase { .. } | Edit::SwapPhases { .. })
    }

    /// Independent judge: apply the edits to the coil list and test the winding itself.
    fn is_fix(w: &Winding, fix: &[Edit]) -> bool {
        let f = apply_fix(w, fix);
        let t: Vec<f64> = (0..3).map(|k| f.series_turns(k)).collect();
        f.is_positive_balanced() && t.iter().all(|&x| x == t[0])
    }

    /// Brute force over every pair (additive pairs on different coils, additive then
    /// phase-level, phase-level pairs in either order) must find exactly the fixes the
    /// pruned search counts.
    #[test]
    fn pruned_pair_search_finds_what_brute_force_finds() {
        for (s, faults) in [
            (spec(36, 4, 2, 7), [(2usize, 20usize)]),
            (spec(24, 4, 1, 6), [(0, 9)]),
            (spec(12, 10, 2, 1), [(1, 4)]),
            (spec(27, 6, 2, 4), [(3, 17)]),
        ] {
            let w = winding::build(&s).expect("balanced design");
            for (i, j) in faults {
                let mut f = w.clone();
                let c = &mut f.coils[i];
                std::mem::swap(&mut c.go, &mut c.back);
                f.coils[j].phase = (f.coils[j].phase + 1) % 3;
                let got = search(&f);
                let edits = candidates(&f);
                let singles = edits
                    .iter()
                    .filter(|e| e.cost() == 1 && is_fix(&f, std::slice::from_ref(e)))
                    .count();
                assert_eq!(singles, 0, "the faults need two edits");
                let mut pairs = edits
                    .iter()
                    .filter(|e| e.cost() == 2 && is_fix(&f, std::slice::from_ref(e)))
                    .count();
                let ones: Vec<&Edit> = edits.iter().filter(|e| e.cost() == 1).collect();
                for (x, e1) in ones.iter().enumerate() {
                    for (y, e2) in ones.iter().enumerate() {
                        let ok_pair = match (additive(e1), additive(e2)) {
                            (true, true) => {
                                x < y && coils_of(e1).iter().all(|c| !coils_of(e2).contains(c))
                            }
                            (true, false) => true,
                            (false, true) => false,
                            (false, false) => x != y,
                        };
                        if ok_pair && is_fix(&f, &[(*e1).clone(), (*e2).clone()]) {
                            pairs += 1;
                        }
                    }
                }
                assert!(pairs >= 1);
                assert_eq!(
                    got.alternatives + 1,
                    pairs,
                    "Z={} faults {i},{j}",
                    s.design.slots
                );
                let fix = got.fix.expect("a fix");
                assert!(is_fix(&f, &fix));
                let mut touched: Vec<usize> = fix.iter().flat_map(coils_of).collect();
                touched.sort_unstable();
                assert_eq!(touched, vec![i.min(j), i.max(j)]);
            }
        }
    }
}
