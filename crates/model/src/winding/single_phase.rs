//! Single-phase stators: a main and an auxiliary winding of concentric coil groups, the
//! auxiliary's axes 90 electrical degrees from the main's, held as two phases of one coil
//! list (main first, so the rules of slots, spans and EMFs are the ones every winding uses).
//!
//! Method: every pole has one concentric group per winding, centred on that winding's pole
//! axis, groups alternating in polarity. The main axes lie at the middles of the poles
//! (slots 1..S of the first pole, S = Z/2p), the auxiliary's half a pole pitch on. A group
//! takes the largest spans that fit symmetrically about its axis; its turns are shared in
//! proportion to the sine of each coil's half span (a coil side at electrical angle β from
//! the axis carries conductors ∝ sin β, the distribution whose MMF is a sine: Veinott,
//! *Theory and Design of Small Induction Motors*, 1959, ch. on winding distribution, from
//! memory) or equally.

use super::{Coil, Design, Geometry, Labels, Winding};
use crate::design::{Grading, PartSpec, PartTurns};

/// Index of the main winding among the coil list's phases.
pub const MAIN: usize = 0;
/// Index of the auxiliary winding.
pub const AUX: usize = 1;

/// Why a single-phase layout cannot be built, as typed facts (words are the presenters').
#[derive(Debug, Clone, PartialEq)]
pub enum SinglePhaseRefusal {
    /// The slots do not divide among the poles.
    SlotsPerPole {
        /// Slots Z.
        slots: usize,
        /// Poles 2p.
        poles: usize,
    },
    /// More coils per group asked for than spans fit about the axis.
    TooManyCoils {
        /// Which winding (MAIN or AUX).
        part: usize,
        /// Asked for.
        asked: usize,
        /// The spans that fit, largest first.
        spans: Vec<usize>,
    },
    /// A per-coil turns list whose length is not the group's coil count.
    TurnsList {
        /// Which winding.
        part: usize,
        /// Entries given.
        given: usize,
        /// Coils in the group.
        coils: usize,
    },
    /// A group total too small to give every coil a turn.
    TooFewTurns {
        /// Which winding.
        part: usize,
        /// Turns given for the group.
        turns: u32,
        /// Coils in the group.
        coils: usize,
    },
    /// A slot would hold more sides than the layers allow.
    Layers {
        /// Sides the fullest slot would hold.
        needed: usize,
        /// Layers given.
        layers: usize,
    },
}

/// Slots per pole S = Z/2p, when whole.
pub fn slots_per_pole(slots: usize, poles: usize) -> Option<usize> {
    (poles > 0 && slots.is_multiple_of(poles)).then(|| slots / poles)
}

/// Position of winding `part`'s first axis in half slot pitches from the centre of slot 1:
/// the main at the middle of slots 1..S, S − 1; the auxiliary half a pole pitch on, 2S − 1.
fn first_axis_halves(s: usize, part: usize) -> usize {
    if part == MAIN { s - 1 } else { 2 * s - 1 }
}

/// The spans (slot pitches) a concentric group can have about winding `part`'s axis,
/// largest first: both sides must fall on slots (a span's parity is the axis position's)
/// and a side no further than half a pole pitch from the axis.
pub fn spans(s: usize, part: usize) -> Vec<usize> {
    let parity = first_axis_halves(s, part) % 2;
    (1..=s).rev().filter(|y| y % 2 == parity).collect()
}

/// A group's turns per coil, largest span first: the total shared by the grading (largest
/// remainders, so the total is kept), or the list as given.
pub fn graded_turns(
    spans: &[usize],
    s: usize,
    grading: Grading,
    turns: &PartTurns,
) -> Result<Vec<u32>, (usize, u32)> {
    let total = match turns {
        PartTurns::PerCoil(list) => return Ok(list.clone()),
        PartTurns::PerGroup(t) => *t,
    };
    let n = spans.len();
    if (total as usize) < n {
        return Err((n, total));
    }
    // Half span of a coil in electrical radians: (y/2)·(π/S).
    let weight = |y: usize| match grading {
        Grading::Sine => (y as f64 * std::f64::consts::PI / (2.0 * s as f64)).sin(),
        Grading::Equal => 1.0,
    };
    let sum: f64 = spans.iter().map(|&y| weight(y)).sum();
    let exact: Vec<f64> = spans
        .iter()
        .map(|&y| total as f64 * weight(y) / sum)
        .collect();
    // Every coil at least one turn, then the largest remainders.
    let mut out: Vec<u32> = exact.iter().map(|x| (x.floor() as u32).max(1)).collect();
    let mut left = total as i64 - out.iter().map(|&t| t as i64).sum::<i64>();
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&a, &b| {
        let ra = exact[a] - exact[a].floor();
        let rb = exact[b] - exact[b].floor();
        rb.total_cmp(&ra).then(a.cmp(&b))
    });
    let mut i = 0;
    while left > 0 {
        out[order[i % n]] += 1;
        left -= 1;
        i += 1;
    }
    // A coil raised to one turn is paid for by the largest.
    while left < 0 {
        let k = (0..n).max_by_key(|&k| (out[k], n - k)).unwrap_or(0);
        out[k] -= 1;
        left += 1;
    }
    Ok(out)
}

/// The group of winding `part` at pole `j`: its coils (go, back, turns), 0-based slots,
/// polarity alternating pole by pole.
fn group(z: usize, s: usize, part: usize, j: usize, spans: &[usize], turns: &[u32]) -> Vec<Coil> {
    let axis = (first_axis_halves(s, part) + 2 * s * j) as i64;
    spans
        .iter()
        .zip(turns)
        .map(|(&y, &t)| {
            let left = ((axis - y as i64) / 2).rem_euclid(z as i64) as usize;
            let right = ((axis + y as i64) / 2).rem_euclid(z as i64) as usize;
            let (go, back) = if j.is_multiple_of(2) {
                (left, right)
            } else {
                (right, left)
            };
            Coil {
                phase: part,
                go,
                back,
                turns: t,
                path: 0,
                go_layer: 0,
                back_layer: 0,
            }
        })
        .collect()
}

/// The coils a part asks for: spans and turns of one group.
pub fn part_group(
    s: usize,
    part: usize,
    grading: Grading,
    spec: &PartSpec,
) -> Result<(Vec<usize>, Vec<u32>), SinglePhaseRefusal> {
    let fit = spans(s, part);
    let n = spec.coils_per_group.unwrap_or(match &spec.turns {
        PartTurns::PerCoil(l) => l.len(),
        PartTurns::PerGroup(_) => fit.len(),
    });
    if n == 0 || n > fit.len() {
        return Err(SinglePhaseRefusal::TooManyCoils {
            part,
            asked: n,
            spans: fit,
        });
    }
    let ys = fit[..n].to_vec();
    if let PartTurns::PerCoil(l) = &spec.turns
        && l.len() != n
    {
        return Err(SinglePhaseRefusal::TurnsList {
            part,
            given: l.len(),
            coils: n,
        });
    }
    let turns = graded_turns(&ys, s, grading, &spec.turns)
        .map_err(|(coils, turns)| SinglePhaseRefusal::TooFewTurns { part, turns, coils })?;
    Ok((ys, turns))
}

/// Synthesize a single-phase design's two windings; layers as the design gives them, which
/// must hold the fullest slot.
pub fn synthesize(design: &Design, labels: &Labels) -> Result<Winding, SinglePhaseRefusal> {
    let (z, poles) = (design.slots, design.poles);
    let Some(sp) = &design.single_phase else {
        return Err(SinglePhaseRefusal::SlotsPerPole { slots: z, poles });
    };
    let s = slots_per_pole(z, poles)
        .filter(|&s| s >= 2)
        .ok_or(SinglePhaseRefusal::SlotsPerPole { slots: z, poles })?;
    let mut coils = Vec::new();
    for (part, spec) in [(MAIN, &sp.main), (AUX, &sp.aux)] {
        let (ys, turns) = part_group(s, part, sp.grading, spec)?;
        for j in 0..poles {
            coils.extend(group(z, s, part, j, &ys, &turns));
        }
    }
    let mut sides = vec![0usize; z];
    for c in &coils {
        sides[c.go] += 1;
        sides[c.back] += 1;
    }
    let needed = sides.iter().copied().max().unwrap_or(0);
    if needed > design.layers {
        return Err(SinglePhaseRefusal::Layers {
            needed,
            layers: design.layers,
        });
    }
    let geometry = Geometry::rotary(z, poles, 2, design.layers);
    let mut w = Winding {
        labels: labels.clone(),
        design: design.clone(),
        geometry,
        pitch: s,
        coils: Vec::with_capacity(coils.len()),
        parallel_paths: 1,
        from_coil_list: false,
    };
    // Layers: the first side placed in a slot lies at the top.
    let mut used = vec![0usize; z];
    for mut c in coils {
        c.go_layer = used[c.go].min(1);
        used[c.go] += 1;
        c.back_layer = used[c.back].min(1);
        used[c.back] += 1;
        w.coils.push(c);
    }
    Ok(w)
}

/// Middle of a coil in slot pitches from slot 1's centre, across the core's end where the
/// coil wraps: the axis of the group it belongs to.
pub fn coil_middle(w: &Winding, coil: &Coil) -> f64 {
    let z = w.geometry.slots as f64;
    let mid = (coil.go + coil.back) as f64 / 2.0;
    if coil.go.abs_diff(coil.back) > w.geometry.slots / 2 {
        (mid + z / 2.0) % z
    } else {
        mid
    }
}

/// Which section (0 or 1) of a two-section main winding a main coil belongs to: the first
/// half of the poles' groups, then the second.
pub fn main_section(w: &Winding, coil: &Coil) -> usize {
    let s = w.geometry.slots / w.geometry.poles.max(1);
    let pole = (coil_middle(w, coil) / s as f64).floor() as usize;
    usize::from(pole >= w.geometry.poles / 2)
}

/// The lead names of a single-phase stator: main start and end (a two-section main: the
/// first section's start and end, then the second's), auxiliary start and end. IEC
/// 60034-8: main U1-U2 (second section U5-U6, by analogy; from memory), auxiliary Z1-Z2;
/// NEMA MG 1: main T1-T4 (sections T1-T2, T3-T4), auxiliary T5-T8 (from memory).
pub fn lead_names(marking: crate::design::Marking, sections: u8) -> &'static [&'static str] {
    use crate::design::Marking;
    match (marking, sections) {
        (Marking::Iec, 1) => &["U1", "U2", "Z1", "Z2"],
        (Marking::Iec, _) => &["U1", "U2", "U5", "U6", "Z1", "Z2"],
        (Marking::Nema, 1) => &["T1", "T4", "T5", "T8"],
        (Marking::Nema, _) => &["T1", "T2", "T3", "T4", "T5", "T8"],
    }
}
