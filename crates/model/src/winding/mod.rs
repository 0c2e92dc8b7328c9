//! The `Winding` model: a [`Design`] (what was asked for), the slot angles worked out from
//! it, and the coils (synthesized from the design or recorded). It is the single source of
//! truth; every analysis is a pure function of it and never looks back at the layout file.

mod feasible;
mod groups;
mod order;
pub mod pole_change;
pub mod schedule;
pub mod single_phase;
pub mod star;
mod synth;

use crate::units::Length;
use num_complex::Complex64;
use std::f64::consts::PI;
use thiserror::Error;

use crate::numbering::{CoilNo, SlotNo};

pub use crate::design::{Connection, Core, Design, Labels, Style, Supply, Topology};
pub use feasible::{double_layer_rotary_feasible, nearby_rotary_slot_counts, rotary_periodicity};
pub use groups::{CoilGroup, assign_paths, coil_groups, possible_path_counts};
pub use order::{Elec, Mech};
pub use synth::{
    build, build_lenient, single_layer_rotary_feasible, synthesize, synthesize_brief, with_span,
};

/// Why a spec could not become a winding, as typed facts. Their sentences, with the
/// numbers that say what would work, are the presenters' (`output::refusal_words`); the
/// `Display` here only names the kind of refusal, for logs and `std::error::Error`.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum PlanError {
    /// No balanced winding exists for the request: why, and what would work.
    #[error("no balanced winding exists for this request")]
    Infeasible(Refusal),
    /// A slot holds more coil sides than it has layers.
    #[error("a slot holds more coil sides than the winding has layers")]
    Overfilled(Overfill),
    /// The requested parallel path count would make circulating currents.
    #[error("the parallel path count would drive circulating currents")]
    Paths(PathChoice),
    /// A single-phase stator's windings cannot be laid out as asked.
    #[error("the single-phase windings cannot be laid out as asked")]
    SinglePhase(single_phase::SinglePhaseRefusal),
}

/// Why no balanced winding exists for a design, with the numbers that say what would work.
#[derive(Debug, Clone, PartialEq)]
pub enum Refusal {
    /// The slot count cannot carry a balanced winding of this kind for these poles.
    SlotCount {
        /// Slots Z.
        slots: usize,
        /// Poles 2p.
        poles: usize,
        /// Phases m.
        phases: usize,
        /// Layers asked for.
        layers: usize,
        /// How often a double-layer winding would repeat round the core, gcd(Z, p).
        periodicity: usize,
        /// The nearest slot counts below and above that can (searched only where the
        /// refusal is explained).
        nearby: (Option<usize>, Option<usize>),
        /// A single layer was asked for where a double layer fits.
        double_layer_fits: bool,
    },
    /// A single-layer flat primary needs an even pole count and 2p·m·q slots.
    LinearSingleLayer {
        /// Slots Z.
        slots: usize,
        /// Poles 2p.
        poles: usize,
        /// Phases m.
        phases: usize,
        /// Slots for q = 1 and q = 2 at the next even pole count.
        fitting_slots: (usize, usize),
    },
    /// A double-layer flat primary's coil positions do not make a balanced winding.
    LinearDoubleLayer {
        /// Slots Z.
        slots: usize,
        /// Poles 2p.
        poles: usize,
        /// Phases m.
        phases: usize,
        /// Span tried.
        span: usize,
        /// Two primaries that would work.
        options: Vec<LinearOption>,
    },
    /// The span links a whole number of pole pairs, so no working flux.
    SpanLinksNoFlux {
        /// Span in slot pitches.
        span: usize,
        /// Pole pitch in slot pitches.
        pole_pitch: f64,
    },
    /// The span is longer than half a closed core.
    SpanTooLong {
        /// Span in slot pitches.
        span: usize,
        /// Slots Z.
        slots: usize,
    },
    /// Single-layer tooth coils need an even slot count.
    ToothCoilsOddSlots {
        /// Slots Z.
        slots: usize,
    },
    /// Lap coils of this span cannot pair a phase's single-layer slots.
    LapPairing {
        /// Span in slot pitches.
        span: usize,
        /// Phase label.
        phase: String,
        /// The spans that can pair every phase (only where the refusal is explained).
        spans_that_can: Option<Vec<usize>>,
    },
}

/// A double-layer flat primary that would work: q slots per pole per phase.
#[derive(Debug, Clone, PartialEq)]
pub struct LinearOption {
    /// Slots per pole per phase.
    pub q: usize,
    /// Slot count needed.
    pub slots: usize,
    /// Span that fits its pole pitch.
    pub span: usize,
    /// Full-pitch span, q·m.
    pub full_pitch: usize,
}

/// A slot holding more coil sides than it has layers.
#[derive(Debug, Clone, PartialEq)]
pub struct Overfill {
    /// The slot.
    pub slot: SlotNo,
    /// How many sides were found.
    pub sides: usize,
    /// Layers per slot.
    pub layers: usize,
    /// Coils involved.
    pub coils: Vec<CoilNo>,
}

/// A parallel path count that would drive circulating currents, and those that would not.
#[derive(Debug, Clone, PartialEq)]
pub struct PathChoice {
    /// What the layout asked for.
    pub requested: usize,
    /// Path counts that give every path the same EMF phasor.
    pub possible: Vec<usize>,
}

/// Geometry of the core and the electrical angle of every slot.
#[derive(Debug, Clone, PartialEq, serde::Serialize, schemars::JsonSchema)]
pub struct Geometry {
    /// Closed rotary core or open linear primary.
    pub topology: Topology,
    /// Slot count Z (end slots of a linear primary included).
    pub slots: usize,
    /// Pole count 2p.
    pub poles: usize,
    /// Phase count m.
    pub phases: usize,
    /// Layers per slot.
    pub layers: usize,
    /// Pole pitch τ in slot pitches.
    pub pole_pitch_slots: f64,
    /// Slot `k` (0-based) lies at electrical angle 2π·(k·angle_num mod angle_den)/angle_den.
    pub angle_num: u64,
    /// See `angle_num`.
    pub angle_den: u64,
}

impl Geometry {
    /// Rotary core: slot angle 2π·p/Z electrical (star of slots).
    pub fn rotary(slots: usize, poles: usize, phases: usize, layers: usize) -> Self {
        Geometry {
            topology: Topology::Rotary,
            slots,
            poles,
            phases,
            layers,
            pole_pitch_slots: slots as f64 / poles as f64,
            angle_num: (poles / 2) as u64,
            angle_den: slots as u64,
        }
    }

    /// Linear primary whose `active` slot positions span the poles: slot angle π·poles/active.
    pub fn linear(slots: usize, active: usize, poles: usize, phases: usize, layers: usize) -> Self {
        Geometry {
            topology: Topology::Linear,
            slots,
            poles,
            phases,
            layers,
            pole_pitch_slots: active as f64 / poles as f64,
            angle_num: poles as u64,
            angle_den: 2 * active as u64,
        }
    }

    /// Pole pairs p (for odd-pole linear primaries this is a half-integer, so we keep 2p).
    pub fn pole_pairs(&self) -> f64 {
        self.poles as f64 / 2.0
    }

    /// Electrical angle (radians) of slot `k` (0-based) at electrical order `order`.
    /// Exact integer reduction when `order · angle_num` is whole, so large slot numbers lose
    /// no precision.
    #[inline]
    pub fn slot_angle(&self, k: usize, order: Elec) -> f64 {
        let r = order.get() * self.angle_num as f64;
        let ri = r.round();
        if (r - ri).abs() < 1e-9 && ri.abs() < 1e15 {
            // Whole multiple of the slot angle: reduce exactly, in 64 bits where the
            // product fits (always, for cores and orders of any real size).
            let den = self.angle_den.max(1);
            let n = (ri.abs() as u64) % den;
            let red = match n.checked_mul(k as u64 % den) {
                Some(x) => x % den,
                None => ((n as u128 * (k as u64 % den) as u128) % den as u128) as u64,
            };
            let red = if ri < 0.0 && red != 0 { den - red } else { red };
            2.0 * PI * red as f64 / den as f64
        } else {
            2.0 * PI * r * k as f64 / self.angle_den as f64
        }
    }

    /// Slot angle in electrical radians at the fundamental (α = π/τ).
    pub fn slot_angle_elec(&self) -> f64 {
        PI / self.pole_pitch_slots
    }
}

/// One coil: current enters at `go` and leaves at `back` (0-based slots inside the program).
#[derive(Debug, Clone, PartialEq, Eq, serde::Serialize, schemars::JsonSchema)]
pub struct Coil {
    /// Index into the phase labels.
    pub phase: usize,
    /// Slot where current enters, 0-based.
    pub go: usize,
    /// Slot where current leaves, 0-based.
    pub back: usize,
    /// Turns.
    pub turns: u32,
    /// Parallel path, 0-based.
    pub path: usize,
    /// Layer position of the go side: 0 top (nearest the gap, or left half of a tooth-coil
    /// slot), 1 bottom. Always 0 in a single-layer winding.
    pub go_layer: usize,
    /// Layer position of the back side.
    pub back_layer: usize,
}

/// A planned or recorded winding: its [`Design`] plus the coils.
#[derive(Debug, Clone, PartialEq)]
pub struct Winding {
    /// Title and colours, apart from the physics.
    pub labels: Labels,
    /// What was asked for: core, supply, the designer's choices and the shop's data.
    pub design: Design,
    /// The slot angles the coils are laid on, worked out from the design.
    pub geometry: Geometry,
    /// Coils, numbered from 1 at every edge a person sees.
    pub coils: Vec<Coil>,
    /// Span the coils were built with, in slot pitches (concentric: the mean span).
    pub pitch: usize,
    /// Parallel paths per phase the coils are connected in.
    pub parallel_paths: usize,
    /// True when the coils came from an explicit `[[coil]]` list rather than synthesis.
    pub from_coil_list: bool,
}

impl Winding {
    /// Signed span of a coil in slot pitches: positive when current enters at the left side
    /// (the side from which the coil reaches forward), negative for a coil reversed. A span
    /// of exactly half a closed core is forward when its go side is in the top layer.
    #[inline]
    pub fn span(&self, coil: &Coil) -> i64 {
        let z = self.geometry.slots as i64;
        let d = coil.back as i64 - coil.go as i64;
        match self.geometry.topology {
            Topology::Linear => d,
            Topology::Rotary => {
                let f = d.rem_euclid(z);
                match (2 * f).cmp(&z) {
                    std::cmp::Ordering::Less => f,
                    std::cmp::Ordering::Greater => f - z,
                    // Half the core either way: a lap coil's left side lies in the top layer.
                    std::cmp::Ordering::Equal
                        if self.geometry.layers == 2 && coil.go_layer == 1 =>
                    {
                        -f
                    }
                    std::cmp::Ordering::Equal => f,
                }
            }
        }
    }

    /// Left slot of a coil: the side from which its span reaches forward.
    pub fn left_slot(&self, coil: &Coil) -> usize {
        if self.span(coil) >= 0 {
            coil.go
        } else {
            coil.back
        }
    }

    /// EMF phasor of one coil at `order`, in turns: N·(e^{−jθ_go} − e^{−jθ_back})/2, so that a
    /// full-pitch coil of N turns gives magnitude N (EMF per 4.44·f·Φ).
    pub fn coil_emf(&self, coil: &Coil, order: Elec) -> Complex64 {
        let g = self.geometry.slot_angle(coil.go, order);
        let b = self.geometry.slot_angle(coil.back, order);
        let e = Complex64::from_polar(1.0, -g) - Complex64::from_polar(1.0, -b);
        e * (coil.turns as f64 / 2.0)
    }

    /// EMF phasor of a phase at `order`: the sum over its coils divided by the parallel path
    /// count, i.e. N_ph·k_w in magnitude (effective series turns).
    pub fn phase_emf(&self, phase: usize, order: Elec) -> Complex64 {
        let s: Complex64 = self
            .coils
            .iter()
            .filter(|c| c.phase == phase)
            .map(|c| self.coil_emf(c, order))
            .sum();
        s / self.parallel_paths as f64
    }

    /// EMF phasors of every phase at `order` in one pass over the coils (see `phase_emf`).
    pub fn phase_emfs(&self, order: Elec) -> Vec<Complex64> {
        let mut e = vec![Complex64::new(0.0, 0.0); self.geometry.phases];
        for c in &self.coils {
            e[c.phase] += self.coil_emf(c, order);
        }
        let a = self.parallel_paths as f64;
        e.iter_mut().for_each(|x| *x /= a);
        e
    }

    /// Every distinct turn count among the coils, smallest first.
    pub fn distinct_turns(&self) -> Vec<u32> {
        let mut t: Vec<u32> = self.coils.iter().map(|c| c.turns).collect();
        t.sort_unstable();
        t.dedup();
        t
    }

    /// Turns per coil as the coils have them: their one count, or the most common count
    /// when they differ (the larger on a tie); the design's when there are no coils.
    pub fn turns_per_coil(&self) -> u32 {
        let mut counts: std::collections::BTreeMap<u32, usize> = Default::default();
        for c in &self.coils {
            *counts.entry(c.turns).or_default() += 1;
        }
        counts
            .iter()
            .max_by_key(|(t, n)| (**n, **t))
            .map_or(self.design.turns_per_coil, |(t, _)| *t)
    }

    /// Series turns per phase N_ph (all coils of the phase over the parallel paths).
    pub fn series_turns(&self, phase: usize) -> f64 {
        let n: u64 = self
            .coils
            .iter()
            .filter(|c| c.phase == phase)
            .map(|c| c.turns as u64)
            .sum();
        n as f64 / self.parallel_paths as f64
    }

    /// The phase sequence when every phase EMF at the fundamental has the same magnitude
    /// and the phases follow each other by 2π/m, in either order; `None` when they do not.
    /// Balance and sequence are two facts: a negative sequence is a balanced winding whose
    /// field travels the other way (a two-speed winding's higher pole count, or two phases'
    /// leads exchanged), put right by exchanging two supply leads.
    pub fn balance(&self) -> Option<star::Sequence> {
        star::sequence_of(&self.phase_emfs(Elec::FUNDAMENTAL))
    }

    /// True when the phase EMFs are balanced, in either sequence ([`Winding::balance`]).
    pub fn is_balanced(&self) -> bool {
        self.balance().is_some()
    }

    /// True when the phase EMFs are balanced in positive sequence (V lags U): what
    /// synthesis makes, and what the audit's smallest fix restores.
    pub fn is_positive_balanced(&self) -> bool {
        star::is_positive_sequence(&self.phase_emfs(Elec::FUNDAMENTAL))
    }

    /// Occupancy of every slot layer: `fill[slot][layer]` is the coil index (0-based) whose
    /// side lies there.
    pub fn slot_fill(&self) -> Vec<[Option<usize>; 2]> {
        let mut fill = vec![[None, None]; self.geometry.slots];
        for (i, c) in self.coils.iter().enumerate() {
            fill[c.go][c.go_layer.min(1)] = Some(i);
            fill[c.back][c.back_layer.min(1)] = Some(i);
        }
        fill
    }

    /// Coil sides in every slot (0-based index).
    pub fn slot_sides(&self) -> Vec<usize> {
        let mut sides = vec![0usize; self.geometry.slots];
        for c in &self.coils {
            sides[c.go] += 1;
            sides[c.back] += 1;
        }
        sides
    }

    /// Slots (0-based) with one layer empty: the end slots of a linear double-layer primary,
    /// or any gap left in a double-layer record.
    pub fn half_filled_slots(&self) -> Vec<usize> {
        if self.geometry.layers < 2 {
            return Vec::new();
        }
        self.slot_fill()
            .iter()
            .enumerate()
            .filter(|(_, f)| f.iter().filter(|x| x.is_some()).count() == 1)
            .map(|(k, _)| k)
            .collect()
    }

    /// Slots (0-based) holding no coil side at all.
    pub fn empty_slots(&self) -> Vec<usize> {
        self.slot_fill()
            .iter()
            .enumerate()
            .filter(|(k, f)| f.iter().all(|x| x.is_none()) && self.own_slot(*k))
            .map(|(k, _)| k)
            .collect()
    }

    /// Whether slot `k` is this winding's to fill: every slot, or every other one for a
    /// winding sharing its core by slots (`Design::alternate_slots`).
    pub fn own_slot(&self, k: usize) -> bool {
        self.design.alternate_slots.is_none_or(|o| k % 2 == o)
    }

    /// Slots per pole per phase q = Z_active / (2p·m), as a reduced fraction (num, den);
    /// of its own slots for a winding in every other slot.
    pub fn slots_per_pole_phase(&self) -> (u64, u64) {
        let active = (self.geometry.pole_pitch_slots * self.geometry.poles as f64).round() as u64;
        let active = if self.design.alternate_slots.is_some() {
            active / 2
        } else {
            active
        };
        let den = (self.geometry.poles * self.geometry.phases) as u64;
        let g = gcd(active, den).max(1);
        (active / g, den / g)
    }

    /// What each slot holds, as a canonical list of (phase, current sign, layer, turns),
    /// for symmetry tests.
    fn contents(&self) -> Vec<Vec<(usize, i8, usize, u32)>> {
        let mut c = vec![Vec::new(); self.geometry.slots];
        for coil in &self.coils {
            c[coil.go].push((coil.phase, 1, coil.go_layer, coil.turns));
            c[coil.back].push((coil.phase, -1, coil.back_layer, coil.turns));
        }
        for v in &mut c {
            v.sort_unstable();
        }
        c
    }

    /// True when shifting every coil by `k` slots gives the same winding (with every
    /// current reversed when `flip`).
    fn shifted_equal(contents: &[Vec<(usize, i8, usize, u32)>], k: usize, flip: bool) -> bool {
        let z = contents.len();
        let mut flipped = Vec::new();
        (0..z).all(|s| {
            let a = &contents[s];
            let b = &contents[(s + k) % z];
            if !flip {
                return a == b;
            }
            // Compare as multisets: reversing the currents changes the sorted order.
            flipped.clear();
            flipped.extend(
                b.iter()
                    .map(|&(ph, sign, layer, turns)| (ph, -sign, layer, turns)),
            );
            flipped.sort_unstable();
            *a == flipped
        })
    }

    /// Periodicity of a closed core from its coils: how many times the winding repeats
    /// round the core (shifts by whole electrical periods that map every coil onto a coil of
    /// the same phase, polarity, layer and turns). A double-layer lap winding repeats
    /// gcd(Z, p) times; single-layer tooth coils only gcd(Z/2, p). 1 for a flat primary.
    pub fn periodicity(&self) -> usize {
        let g = &self.geometry;
        if g.topology != Topology::Rotary || g.slots == 0 {
            return 1;
        }
        let z = g.slots;
        let p = g.poles / 2;
        let contents = self.contents();
        // Shifts by whole electrical periods are the multiples of Z/T, T = gcd(Z, p). The
        // shifts that map the winding onto itself form a subgroup of that cyclic group of
        // order T, generated by the smallest of them, (Z/T)·j with j dividing T: trying the
        // divisors in increasing order costs O(Z) per divisor, not O(Z) per shift.
        let t = gcd(z as u64, p as u64).max(1) as usize;
        let step = z / t;
        (1..=t)
            .filter(|j| t.is_multiple_of(*j))
            .find(|&j| Self::shifted_equal(&contents, (step * j) % z, false))
            .map_or(1, |j| t / j)
    }

    /// True when the winding's MMF has a half-turn symmetry (the winding repeats at least
    /// twice round the core, or half a turn maps it onto itself with every current
    /// reversed): then the radial forces balance and there is no unbalanced magnetic pull.
    pub fn balanced_pull(&self) -> bool {
        let z = self.geometry.slots;
        if self.geometry.topology != Topology::Rotary {
            return true;
        }
        if self.periodicity() >= 2 {
            return true;
        }
        z.is_multiple_of(2) && Self::shifted_equal(&self.contents(), z / 2, true)
    }

    /// Label of a phase.
    pub fn label(&self, phase: usize) -> &str {
        &self.design.phase_labels[phase]
    }

    /// Slot pitch along the gap, when the design gives it.
    pub fn slot_pitch(&self) -> Option<Length> {
        self.design.slot_pitch()
    }

    /// Pole pitch τ, when the slot pitch is known.
    pub fn pole_pitch(&self) -> Option<Length> {
        self.slot_pitch()
            .map(|s| s * self.geometry.pole_pitch_slots)
    }
}

/// Greatest common divisor (the `num-integer` crate's; gcd(a, 0) = a).
pub fn gcd(a: u64, b: u64) -> u64 {
    num_integer::gcd(a, b)
}

/// Least common multiple (the `num-integer` crate's).
pub fn lcm(a: usize, b: usize) -> usize {
    num_integer::lcm(a, b)
}
