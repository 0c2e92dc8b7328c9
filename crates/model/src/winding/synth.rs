//! Synthesis of balanced windings from a [`Design`] by the star of slots with 60° phase
//! belts, and the building of a [`Winding`] from an explicit coil list.
//!
//! Method: every slot takes the phase and polarity of its 60° belt in the star of slots
//! ([`super::star`], where the belt rule lives).

use super::star::belt_of_slot;
use super::{
    Coil, Design, Geometry, Labels, LinearOption, Overfill, PlanError, Refusal, Style, Topology,
    Winding, assign_paths, double_layer_rotary_feasible, nearby_rotary_slot_counts,
    rotary_periodicity,
};
use crate::numbering::{CoilNo, SlotNo};
use crate::spec::{CoilEntry, Spec};

/// Build the winding a spec describes: its explicit coil list, or the synthesized layout.
pub fn build(spec: &Spec) -> Result<Winding, PlanError> {
    if !spec.coils.is_empty() {
        return from_coil_list(spec, true);
    }
    if spec.design.single_phase.is_some() {
        return super::single_phase::synthesize(&spec.design, &spec.labels)
            .map_err(PlanError::SinglePhase);
    }
    let mut w = match spec.design.alternate_slots {
        Some(offset) => in_alternate_slots(&spec.design, offset)?,
        None => synthesize_explained(&spec.design, true)?,
    };
    w.labels = spec.labels.clone();
    Ok(w)
}

/// A winding in every other slot of the design's core, from slot `offset` (0 or 1): laid
/// out on a core of half the slots (each of its slots two of the core's apart, so every
/// slot angle is the half core's plus one constant, and balance and factors are the half
/// core's), then placed in its own slots with its spans doubled.
fn in_alternate_slots(design: &Design, offset: usize) -> Result<Winding, PlanError> {
    let half = Design {
        slots: design.slots / 2,
        pitch: design.pitch.map(|y| (y / 2).max(1)),
        alternate_slots: None,
        ..design.clone()
    };
    let w = synthesize_explained(&half, true)?;
    let place = |k: usize| 2 * k + offset.min(1);
    Ok(Winding {
        design: design.clone(),
        geometry: Geometry::rotary(design.slots, design.poles, design.phases, design.layers),
        coils: w
            .coils
            .iter()
            .map(|c| Coil {
                go: place(c.go),
                back: place(c.back),
                ..c.clone()
            })
            .collect(),
        pitch: 2 * w.pitch,
        ..w
    })
}

/// The balanced winding a design asks for, connected in its parallel paths, without title
/// or colours.
pub fn synthesize(design: &Design) -> Result<Winding, PlanError> {
    synthesize_explained(design, true)
}

/// [`synthesize`] whose refusals give the reason without searching nearby slot counts: for
/// surveys, which ask about every combination anyway.
pub fn synthesize_brief(design: &Design) -> Result<Winding, PlanError> {
    synthesize_explained(design, false)
}

/// [`synthesize`], with refusal texts worked out (`explain`) or left short: probes that try
/// many spans only need to know whether one works, and some texts search every span.
fn synthesize_explained(design: &Design, explain: bool) -> Result<Winding, PlanError> {
    let mut w = synthesize_one_path(design, explain)?;
    if design.parallel_paths > 1 {
        assign_paths(&mut w, design.parallel_paths)?;
    }
    Ok(w)
}

/// Build a recorded winding as found, for auditing: like [`build`], but a coil list whose
/// slots hold more sides than the winding has layers is accepted, so the audit can report
/// the overfilled slots as a finding instead of refusing the record.
pub fn build_lenient(spec: &Spec) -> Result<Winding, PlanError> {
    if spec.coils.is_empty() {
        build(spec)
    } else {
        from_coil_list(spec, false)
    }
}

/// Nearest whole span to a pole pitch, halves rounded down (the shorter coil).
fn nearest_full_pitch(tau: f64) -> usize {
    let f = tau.floor();
    let y = if tau - f > 0.5 { f + 1.0 } else { f };
    (y as usize).max(1)
}

fn blank_winding(design: &Design, geometry: Geometry, pitch: usize, coils: Vec<Coil>) -> Winding {
    Winding {
        labels: Labels::default(),
        design: design.clone(),
        geometry,
        coils,
        pitch,
        parallel_paths: 1,
        from_coil_list: false,
    }
}

fn synthesize_one_path(bp: &Design, explain: bool) -> Result<Winding, PlanError> {
    match (bp.topology, bp.layers) {
        (Topology::Rotary, 2) => rotary_double(bp),
        (Topology::Linear, 2) => linear_double(bp),
        (_, _) => single_layer(bp, explain),
    }
}

/// Double-layer lap coils at every position: coil i from slot i (top) to slot i + y
/// (bottom), phase by the belt of slot i.
fn double_layer_coils(geom: &Geometry, positions: usize, y: usize, turns: u32) -> Vec<Coil> {
    let z = geom.slots;
    (0..positions)
        .map(|i| {
            let right = (i + y) % z;
            let (phase, positive) = belt_of_slot(geom, i);
            let (go, back, go_layer, back_layer) = if positive {
                (i, right, 0, 1)
            } else {
                (right, i, 1, 0)
            };
            Coil {
                phase,
                go,
                back,
                turns,
                path: 0,
                go_layer,
                back_layer,
            }
        })
        .collect()
}

fn rotary_double(bp: &Design) -> Result<Winding, PlanError> {
    let (z, poles, m) = (bp.slots, bp.poles, bp.phases);
    if !double_layer_rotary_feasible(z, poles, m) {
        return Err(PlanError::Infeasible(rotary_refusal(z, poles, m, 2)));
    }
    let geom = Geometry::rotary(z, poles, m, 2);
    let y = match bp.pitch {
        Some(y) => check_rotary_span(z, y)?,
        None => nearest_full_pitch(geom.pole_pitch_slots),
    };
    if (y * poles / 2) % z == 0 {
        return Err(PlanError::Infeasible(Refusal::SpanLinksNoFlux {
            span: y,
            pole_pitch: geom.pole_pitch_slots,
        }));
    }
    let coils = double_layer_coils(&geom, z, y, bp.turns_per_coil);
    let w = blank_winding(bp, geom, y, coils);
    ensure_balanced(w, || rotary_refusal(z, poles, m, 2))
}

fn check_rotary_span(z: usize, y: usize) -> Result<usize, PlanError> {
    if 2 * y > z {
        return Err(PlanError::Infeasible(Refusal::SpanTooLong {
            span: y,
            slots: z,
        }));
    }
    Ok(y)
}

fn ensure_balanced(w: Winding, why: impl Fn() -> Refusal) -> Result<Winding, PlanError> {
    if w.is_positive_balanced() {
        Ok(w)
    } else {
        Err(PlanError::Infeasible(why()))
    }
}

/// Why a rotary core cannot carry the winding, with the nearest slot counts that can.
fn rotary_refusal(z: usize, poles: usize, m: usize, layers: usize) -> Refusal {
    let ok = |zz: usize| {
        if layers == 2 {
            double_layer_rotary_feasible(zz, poles, m)
        } else {
            single_layer_rotary_feasible(zz, poles, m)
        }
    };
    Refusal::SlotCount {
        slots: z,
        poles,
        phases: m,
        layers,
        periodicity: rotary_periodicity(z, poles),
        nearby: nearby_rotary_slot_counts(z, (4 * m * poles.max(2)).min(240), ok),
        double_layer_fits: layers == 1 && double_layer_rotary_feasible(z, poles, m),
    }
}

/// A single-layer winding exists on this rotary core (decided by synthesis itself).
pub fn single_layer_rotary_feasible(z: usize, poles: usize, m: usize) -> bool {
    let design = Design {
        phases: m,
        phase_labels: (0..m).map(|i| i.to_string()).collect(),
        ..Design::basic(Topology::Rotary, z, poles, 1)
    };
    single_layer(&design, false).is_ok()
}

/// Linear double layer: N = Z − y coils, y half-filled slots at each end.
fn linear_double(bp: &Design) -> Result<Winding, PlanError> {
    let (z, poles, m) = (bp.slots, bp.poles, bp.phases);
    let attempt = |y: usize| -> Option<Winding> {
        let n = z.checked_sub(y).filter(|&n| n >= m)?;
        let geom = Geometry::linear(z, n, poles, m, 2);
        let coils = double_layer_coils(&geom, n, y, bp.turns_per_coil);
        let w = blank_winding(bp, geom, y, coils);
        w.is_positive_balanced().then_some(w)
    };
    match bp.pitch {
        Some(y) => attempt(y).ok_or_else(|| PlanError::Infeasible(linear_refusal(bp, y))),
        None => {
            // The balanced span closest to the pole pitch it produces, τ = (Z − y)/2p; a span
            // more than a third of a pole pitch away from full pitch is no default.
            let tau = |y: usize| (z - y) as f64 / poles as f64;
            let mut spans: Vec<usize> = (1..z).filter(|&y| z - y >= m).collect();
            spans.sort_by(|&a, &b| {
                let da = (a as f64 - tau(a)).abs() / tau(a);
                let db = (b as f64 - tau(b)).abs() / tau(b);
                da.total_cmp(&db).then(a.cmp(&b))
            });
            let nearest = spans.first().copied().unwrap_or(1);
            spans
                .into_iter()
                .take_while(|&y| (y as f64 - tau(y)).abs() <= tau(y) / 3.0)
                .find_map(attempt)
                .ok_or_else(|| PlanError::Infeasible(linear_refusal(bp, nearest)))
        }
    }
}

/// Why a double-layer flat primary's coil positions make no balanced winding, and the two
/// slot counts (q and q + 1) that would, each with a span that fits its own pole pitch: the
/// span asked for where it is within the pole pitch τ = q·m, else full pitch.
fn linear_refusal(bp: &Design, y: usize) -> Refusal {
    let (z, poles, m) = (bp.slots, bp.poles, bp.phases);
    let unit = poles * m;
    let q_lo = (z.saturating_sub(y) / unit).max(1);
    let options = [q_lo, q_lo + 1]
        .iter()
        .map(|&q| {
            let tau = q * m;
            let yq = if y <= tau { y } else { tau };
            LinearOption {
                q,
                slots: unit * q + yq,
                span: yq,
                full_pitch: tau,
            }
        })
        .collect();
    Refusal::LinearDoubleLayer {
        slots: z,
        poles,
        phases: m,
        span: y,
        options,
    }
}

/// Single-layer windings: tooth coils on every other tooth (span 1), or lap/concentric coils
/// pairing the positive and negative belt slots of each phase. `explain` builds refusal
/// texts (which search nearby slot counts); feasibility probes pass `false`.
fn single_layer(bp: &Design, explain: bool) -> Result<Winding, PlanError> {
    let (z, poles, m) = (bp.slots, bp.poles, bp.phases);
    let geom = match bp.topology {
        Topology::Rotary => Geometry::rotary(z, poles, m, 1),
        Topology::Linear => Geometry::linear(z, z, poles, m, 1),
    };
    let refuse = || match bp.topology {
        // Probes and surveys get the reason without the search for nearby slot counts.
        _ if !explain => Refusal::SlotCount {
            slots: z,
            poles,
            phases: m,
            layers: 1,
            periodicity: 0,
            nearby: (None, None),
            double_layer_fits: false,
        },
        Topology::Rotary => rotary_refusal(z, poles, m, 1),
        Topology::Linear => Refusal::LinearSingleLayer {
            slots: z,
            poles,
            phases: m,
            fitting_slots: (2 * poles.div_ceil(2) * m, 4 * poles.div_ceil(2) * m),
        },
    };
    let y_default = nearest_full_pitch(geom.pole_pitch_slots);
    let y = match bp.pitch {
        Some(y) if bp.topology == Topology::Rotary => check_rotary_span(z, y)?,
        Some(y) => y,
        None => y_default,
    };
    if y == 1 && bp.style == Style::Lap {
        let coils = tooth_coils(&geom, bp.turns_per_coil).ok_or(PlanError::Infeasible(
            Refusal::ToothCoilsOddSlots { slots: z },
        ))?;
        let w = blank_winding(bp, geom, 1, coils);
        return ensure_balanced(w, refuse);
    }
    // Each slot takes one coil side, its belt from the star of slots.
    let mut plus: Vec<Vec<usize>> = vec![Vec::new(); m];
    let mut minus: Vec<Vec<usize>> = vec![Vec::new(); m];
    for k in 0..z {
        let (phase, positive) = belt_of_slot(&geom, k);
        if positive {
            plus[phase].push(k)
        } else {
            minus[phase].push(k)
        }
    }
    if (0..m).any(|p| plus[p].len() != minus[p].len() || plus[p].is_empty()) {
        return alternate_coils(bp, &geom, y).ok_or_else(|| PlanError::Infeasible(refuse()));
    }
    let mut coils = Vec::with_capacity(z / 2);
    // The span the pairs were found at (a default span may move to the nearest that pairs).
    let mut built_span: Option<usize> = None;
    for p in 0..m {
        let pairs = match bp.style {
            Style::Concentric => nest(&geom, &plus[p], &minus[p]),
            Style::Lap => {
                match pair_at_span(&geom, &plus[p], &minus[p], built_span.unwrap_or(y)) {
                    Some(pairs) => {
                        built_span.get_or_insert(y);
                        Some(pairs)
                    }
                    None if bp.pitch.is_none() && built_span.is_none() => {
                        // Default span: the nearest span that pairs every slot.
                        (1..z)
                            .flat_map(|d| [y.checked_sub(d), Some(y + d)])
                            .flatten()
                            .filter(|&s| s >= 1 && s < z)
                            .find_map(|s| {
                                pair_at_span(&geom, &plus[p], &minus[p], s)
                                    .inspect(|_| built_span = Some(s))
                            })
                    }
                    None => None,
                }
            }
        };
        let pairs = pairs.ok_or_else(|| {
            PlanError::Infeasible(Refusal::LapPairing {
                span: y,
                phase: bp.phase_labels[p].clone(),
                spans_that_can: explain.then(|| single_layer_spans(&geom, &plus, &minus)),
            })
        })?;
        coils.extend(pairs.into_iter().map(|(go, back)| Coil {
            phase: p,
            go,
            back,
            turns: bp.turns_per_coil,
            path: 0,
            go_layer: 0,
            back_layer: 0,
        }));
    }
    let mut w = blank_winding(bp, geom, built_span.unwrap_or(y), coils);
    let mut coils = std::mem::take(&mut w.coils);
    coils.sort_by_key(|c| (w.left_slot(c), c.go));
    w.coils = coils;
    // The span reported is the span built: the most common coil span.
    if bp.style == Style::Lap && !w.coils.is_empty() {
        let mut spans: Vec<usize> = w
            .coils
            .iter()
            .map(|c| w.span(c).unsigned_abs() as usize)
            .collect();
        spans.sort_unstable();
        w.pitch = spans[spans.len() / 2];
    }
    if bp.style == Style::Concentric {
        let total: i64 = w.coils.iter().map(|c| w.span(c).abs()).sum();
        w.pitch = (total as f64 / w.coils.len() as f64).round() as usize;
    }
    ensure_balanced(w, refuse)
}

/// A single-layer winding from alternate coils of the double-layer winding at an odd span:
/// coils whose left side lies in an even slot. Their left sides fill the even slots and, the
/// span being odd, their right sides the odd ones, one side per slot. This builds the
/// balanced single-layer windings whose belts do not split into equal positive and negative
/// halves (e.g. 18 slots, 4 poles; fractional-slot winding theory: Z even and
/// Z/(m·gcd(Z, p)) whole). Spans are tried nearest the pole pitch first, the one asked for
/// only when given; `None` when no odd span gives a balanced winding.
fn alternate_coils(bp: &Design, geom: &Geometry, y: usize) -> Option<Winding> {
    let z = geom.slots;
    if geom.topology != Topology::Rotary || !z.is_multiple_of(2) || bp.style != Style::Lap {
        return None;
    }
    // The double layer must exist first (Z/(m·gcd(Z, p)) whole): otherwise no span can work.
    if !double_layer_rotary_feasible(z, geom.poles, geom.phases) {
        return None;
    }
    let double = Geometry::rotary(z, geom.poles, geom.phases, 2);
    // The four odd spans nearest the pole pitch: k_w1 falls away from it, so the best lies
    // among them, and the work stays linear in the slot count.
    let candidates: Vec<usize> = match bp.pitch {
        Some(y) => vec![y],
        None => (0..z)
            .flat_map(|d| [y.checked_sub(d), Some(y + d)])
            .flatten()
            .filter(|&s| s >= 1 && 2 * s <= z && s % 2 == 1)
            .take(4)
            .collect(),
    };
    let build = |s: usize| {
        let coils: Vec<Coil> = double_layer_coils(&double, z, s, bp.turns_per_coil)
            .into_iter()
            .filter(|c| {
                let left = if c.go_layer == 0 { c.go } else { c.back };
                left.is_multiple_of(2)
            })
            .map(|c| Coil {
                go_layer: 0,
                back_layer: 0,
                ..c
            })
            .collect();
        let w = blank_winding(bp, geom.clone(), s, coils);
        (w.is_positive_balanced() && w.empty_slots().is_empty()).then_some(w)
    };
    // Of the odd spans that work, the one of highest k_w1 (the nearer the pole pitch on a
    // tie, as the candidates come in that order).
    let mut best: Option<(f64, Winding)> = None;
    for s in candidates.into_iter().filter(|s| s % 2 == 1) {
        if let Some(w) = build(s) {
            let kw = crate::factors::fundamental(&w).winding;
            if best.as_ref().is_none_or(|(k, _)| kw > k + 1e-12) {
                best = Some((kw, w));
            }
        }
    }
    best.map(|(_, w)| w)
}

/// Tooth coils on teeth 0, 2, 4, …: coil i from slot 2i to slot 2i + 1, phase by the belt
/// of its coil phasor. `None` if the slot count is odd.
fn tooth_coils(geom: &Geometry, turns: u32) -> Option<Vec<Coil>> {
    let z = geom.slots;
    if !z.is_multiple_of(2) {
        return None;
    }
    Some(
        (0..z / 2)
            .map(|i| {
                let (l, r) = (2 * i, (2 * i + 1) % z);
                let (phase, positive) = belt_of_slot(geom, l);
                let (go, back) = if positive { (l, r) } else { (r, l) };
                Coil {
                    phase,
                    go,
                    back,
                    turns,
                    path: 0,
                    go_layer: 0,
                    back_layer: 0,
                }
            })
            .collect(),
    )
}

/// Pair every positive slot with a negative slot at distance exactly `y` either way
/// (bipartite matching by augmenting paths; each slot has at most two partners).
fn pair_at_span(
    geom: &Geometry,
    plus: &[usize],
    minus: &[usize],
    y: usize,
) -> Option<Vec<(usize, usize)>> {
    // Index of every negative slot, so each positive slot finds its partners at once.
    let mut at: Vec<Option<usize>> = vec![None; geom.slots];
    for (j, &t) in minus.iter().enumerate() {
        at[t] = Some(j);
    }
    let z = geom.slots;
    let partners: Vec<Vec<usize>> = plus
        .iter()
        .map(|&s| {
            let ahead = match geom.topology {
                Topology::Rotary => Some((s + y) % z),
                Topology::Linear => Some(s + y).filter(|&t| t < z),
            };
            let behind = match geom.topology {
                Topology::Rotary => Some((s + z - y % z) % z),
                Topology::Linear => s.checked_sub(y),
            };
            let mut p: Vec<usize> = [ahead, behind]
                .into_iter()
                .flatten()
                .filter_map(|t| at[t])
                .collect();
            p.dedup();
            p
        })
        .collect();
    // Every slot has at most two partners, so the graph is a union of paths and cycles and
    // degree-one forcing (Karp and Sipser 1981) finds a perfect matching in linear time
    // whenever one exists: a slot with one free partner must take it; when none is left,
    // only cycles remain, and on a cycle any one edge starts a matching (we take the
    // lowest free positive slot's first partner, the one ahead of it).
    let mut back_partners: Vec<Vec<usize>> = vec![Vec::new(); minus.len()];
    for (i, ps) in partners.iter().enumerate() {
        for &j in ps {
            back_partners[j].push(i);
        }
    }
    let mut owner: Vec<Option<usize>> = vec![None; minus.len()];
    let mut mate: Vec<Option<usize>> = vec![None; plus.len()];
    let free_of =
        |ps: &[usize], taken: &dyn Fn(usize) -> bool| ps.iter().filter(|&&x| !taken(x)).count();
    // A queue of vertices to look at: (side, index), side false = positive slot.
    let mut queue: std::collections::VecDeque<(bool, usize)> = (0..plus.len())
        .map(|i| (false, i))
        .chain((0..minus.len()).map(|j| (true, j)))
        .collect();
    let mut next_cycle = 0usize;
    let mut matched = 0usize;
    loop {
        while let Some((side, v)) = queue.pop_front() {
            let (pick_i, pick_j) = if side {
                if owner[v].is_some() {
                    continue;
                }
                match free_of(&back_partners[v], &|i| mate[i].is_some()) {
                    0 => return None,
                    1 => {
                        let i = back_partners[v]
                            .iter()
                            .copied()
                            .find(|&i| mate[i].is_none())?;
                        (i, v)
                    }
                    _ => continue,
                }
            } else {
                if mate[v].is_some() {
                    continue;
                }
                match free_of(&partners[v], &|j| owner[j].is_some()) {
                    0 => return None,
                    1 => {
                        let j = partners[v].iter().copied().find(|&j| owner[j].is_none())?;
                        (v, j)
                    }
                    _ => continue,
                }
            };
            mate[pick_i] = Some(pick_j);
            owner[pick_j] = Some(pick_i);
            matched += 1;
            // Their other partners may now be forced.
            for &j in &partners[pick_i] {
                if owner[j].is_none() {
                    queue.push_back((true, j));
                }
            }
            for &i in &back_partners[pick_j] {
                if mate[i].is_none() {
                    queue.push_back((false, i));
                }
            }
        }
        if matched == plus.len() {
            break;
        }
        // Only cycles are left: break the lowest one open.
        while next_cycle < plus.len() && mate[next_cycle].is_some() {
            next_cycle += 1;
        }
        let i = next_cycle;
        let j = *partners.get(i)?.iter().find(|&&j| owner[j].is_none())?;
        mate[i] = Some(j);
        owner[j] = Some(i);
        matched += 1;
        for &k in &back_partners[j] {
            if mate[k].is_none() {
                queue.push_back((false, k));
            }
        }
        for &k in &partners[i] {
            if owner[k].is_none() {
                queue.push_back((true, k));
            }
        }
    }
    (matched == minus.len()).then(|| {
        owner
            .iter()
            .enumerate()
            .filter_map(|(j, o)| o.map(|i| (plus[i], minus[j])))
            .collect()
    })
}

/// Concentric coils: each negative slot closes the nearest open positive slot before it
/// (bracket matching in slot order), so coils of one group nest around one centre.
fn nest(geom: &Geometry, plus: &[usize], minus: &[usize]) -> Option<Vec<(usize, usize)>> {
    let mut sides: Vec<(usize, bool)> = plus
        .iter()
        .map(|&s| (s, true))
        .chain(minus.iter().map(|&s| (s, false)))
        .collect();
    sides.sort_unstable();
    // On a closed core start where the running balance is lowest (cyclic lemma).
    if geom.topology == Topology::Rotary {
        let mut bal = 0i64;
        let mut low = (0i64, 0usize);
        for (i, &(_, p)) in sides.iter().enumerate() {
            bal += if p { 1 } else { -1 };
            if bal < low.0 {
                low = (bal, i + 1);
            }
        }
        let n = sides.len().max(1);
        sides.rotate_left(low.1 % n);
    }
    let mut open = Vec::new();
    let mut pairs = Vec::with_capacity(plus.len());
    for (s, positive) in sides {
        if positive {
            open.push(s);
        } else {
            let g = open.pop()?;
            pairs.push((g, s));
        }
    }
    open.is_empty().then_some(pairs)
}

/// Spans at which lap coils pair every phase's single-layer slots.
fn single_layer_spans(geom: &Geometry, plus: &[Vec<usize>], minus: &[Vec<usize>]) -> Vec<usize> {
    let top = match geom.topology {
        Topology::Rotary => geom.slots / 2,
        Topology::Linear => geom.slots - 1,
    };
    (2..=top)
        .filter(|&y| (0..plus.len()).all(|p| pair_at_span(geom, &plus[p], &minus[p], y).is_some()))
        .collect()
}

/// A winding from an explicit coil list, taken as given: only range and (when `strict`)
/// fill are checked.
fn from_coil_list(spec: &Spec, strict: bool) -> Result<Winding, PlanError> {
    let d = &spec.design;
    let (z, poles, layers) = (d.slots, d.poles, d.layers);
    // A single-phase stator's coil list holds its two windings as two phases.
    let m = if d.single_phase.is_some() {
        2
    } else {
        d.phases
    };
    let rough = |e: &CoilEntry| -> usize {
        let d = e.back.abs_diff(e.go);
        match spec.design.topology {
            Topology::Rotary => d.min(z - d),
            Topology::Linear => d,
        }
    };
    let pitch = d.pitch.unwrap_or_else(|| {
        let mut spans: Vec<usize> = spec.coils.iter().map(rough).collect();
        spans.sort_unstable();
        spans[spans.len() / 2]
    });
    let geom = match d.topology {
        Topology::Rotary => Geometry::rotary(z, poles, m, layers),
        Topology::Linear => {
            let active = if layers == 2 {
                z.saturating_sub(pitch)
            } else {
                z
            };
            Geometry::linear(z, active.max(1), poles, m, layers)
        }
    };
    // Count sides per slot before placing them, so overfilled slots name every coil.
    let mut in_slot: Vec<Vec<usize>> = vec![Vec::new(); z];
    for (i, e) in spec.coils.iter().enumerate() {
        in_slot[e.go].push(i);
        in_slot[e.back].push(i);
    }
    if let Some((k, cs)) = in_slot
        .iter()
        .enumerate()
        .find(|(_, cs)| strict && cs.len() > layers)
    {
        let mut coils: Vec<CoilNo> = cs.iter().map(|&i| CoilNo::at(i)).collect();
        coils.dedup();
        return Err(PlanError::Overfilled(Overfill {
            slot: SlotNo::at(k),
            sides: cs.len(),
            layers,
            coils,
        }));
    }
    let mut w = blank_winding(
        &spec.design,
        geom,
        pitch,
        Vec::with_capacity(spec.coils.len()),
    );
    w.from_coil_list = true;
    w.labels = spec.labels.clone();
    w.parallel_paths = spec.design.parallel_paths;
    let mut used = vec![[false; 2]; z];
    for e in &spec.coils {
        let mut c = Coil {
            phase: e.phase,
            go: e.go,
            back: e.back,
            turns: e.turns,
            path: e.path,
            go_layer: 0,
            back_layer: 0,
        };
        if layers == 2 {
            // Left side in the top layer, right side in the bottom, as a lap coil lies.
            let forward = w.span(&c) >= 0;
            let (want_go, want_back) = if forward { (0, 1) } else { (1, 0) };
            c.go_layer = take(&mut used[c.go], want_go);
            c.back_layer = take(&mut used[c.back], want_back);
        }
        w.coils.push(c);
    }
    Ok(w)
}

/// Take layer `want` of a slot if free, else the other one.
fn take(slot: &mut [bool; 2], want: usize) -> usize {
    let l = if slot[want] { 1 - want } else { want };
    slot[l] = true;
    l
}

/// The synthesized winding of the same core and design at span `pitch` (the coils of an
/// explicit list are replaced). A double-layer flat primary keeps its coil positions and
/// pole pitch, so its slot count becomes N + `pitch`. Used by the span tool.
pub fn with_span(w: &Winding, pitch: usize) -> Result<Winding, PlanError> {
    let g = &w.geometry;
    let mut design = w.design.with_span(pitch);
    if (g.topology, g.layers) == (Topology::Linear, 2) {
        design.slots = (g.pole_pitch_slots * g.poles as f64).round() as usize + pitch;
    }
    let mut s = synthesize_one_path(&design, false)?;
    s.labels = w.labels.clone();
    Ok(s)
}
