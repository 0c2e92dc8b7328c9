//! Two separate windings in one core (a two-winding, two-speed motor): each winding is a
//! study of its own; this report holds what belongs to the pair: the slots they share, the
//! lead markings that tell them apart, and what the running winding induces in the idle
//! one (a closed idle delta whose three EMFs do not cancel carries a circulating current).

use std::sync::OnceLock;

use num_complex::Complex64;
use serde::Serialize;

use crate::card::FILL_LIMIT;
use crate::spec::Sharing;
use crate::study::Study;
use crate::winding::star::{phase_operator, slot_currents};
use crate::winding::{Connection, Winding};

/// Below this, an EMF ratio is rounding: the EMFs cancel.
pub const CANCELS: f64 = 1e-9;

/// The two windings' studies and the report on the pair, each worked out once.
pub struct TwoStudy<'w> {
    studies: [Study<'w>; 2],
    sharing: Sharing,
    report: OnceLock<TwoWindingReport>,
}

impl<'w> TwoStudy<'w> {
    /// The study of the first winding (at the bottom of the slots) and the second, each
    /// with its intended winding for an audit of a record.
    pub fn new(
        windings: [&'w Winding; 2],
        intended: [Option<&'w Winding>; 2],
        sharing: Sharing,
    ) -> Self {
        let t = TwoStudy {
            studies: [
                Study::new(windings[0], intended[0]),
                Study::new(windings[1], intended[1]),
            ],
            sharing,
            report: OnceLock::new(),
        };
        // Each winding's sheets say so when the pair has findings between the windings:
        // the report is worked out now, once, so that no sheet is drawn before it.
        if t.report().findings.iter().any(Finding::between) {
            t.studies.iter().for_each(Study::mark_pair_findings);
        }
        t
    }

    /// Each winding's own study, the first winding's first.
    pub fn studies(&self) -> &[Study<'w>; 2] {
        &self.studies
    }

    /// The report on the pair.
    pub fn report(&self) -> &TwoWindingReport {
        self.report.get_or_init(|| {
            crate::runs::count(crate::runs::Analysis::TwoWinding);
            report(&self.studies, self.sharing)
        })
    }
}

/// Which speed a winding serves: the one with more poles runs slower.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Speed {
    /// The winding with more poles.
    Low,
    /// The winding with fewer poles.
    High,
}

/// Where a winding lies in the slots it shares.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "kebab-case")]
pub enum Position {
    /// In the bottom of every slot, wound first.
    Bottom,
    /// Above the other, nearer the bore, wound second.
    Top,
    /// In slots 1, 3, 5, … (a core shared by slots).
    OddSlots,
    /// In slots 2, 4, 6, ….
    EvenSlots,
}

/// Where the first and the second winding lie, by how they share the slots.
pub fn positions(sharing: Sharing) -> [Position; 2] {
    match sharing {
        Sharing::Layers => [Position::Bottom, Position::Top],
        Sharing::Slots => [Position::OddSlots, Position::EvenSlots],
    }
}

/// One winding of the pair, as the pair's report needs it (its own reports are in its
/// study).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Part {
    /// Poles.
    pub poles: usize,
    /// Low or high speed.
    pub speed: Speed,
    /// Where it lies in the slots.
    pub position: Position,
    /// Synchronous speed at the supply frequency, rpm.
    pub synchronous_rpm: Option<f64>,
    /// Star or delta.
    pub connection: Connection,
    /// Coils.
    pub coils: usize,
    /// Fundamental winding factor.
    pub winding_factor: f64,
    /// Series turns per phase.
    pub series_turns_per_phase: f64,
    /// The phases' EMFs equal and evenly spaced (the model's balance test).
    pub balanced: bool,
    /// Every lead it brings out, marked with its speed (the card's lead scheme).
    pub leads: Vec<String>,
    /// Problems the audit of a record found in it (`None` when it was synthesized).
    pub audit_problems: Option<usize>,
}

/// What the running winding induces in the idle one, from the gap field of its balanced
/// currents (the stepped MMF of its slot currents over a smooth gap; the rotor's damping of
/// the field's harmonics is not counted, so the figures are upper estimates). Each ratio
/// is over the running winding's own phase EMF, which its rated phase voltage stands for.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Coupling {
    /// The running winding (0 the first).
    pub running: usize,
    /// The idle winding.
    pub idle: usize,
    /// The idle winding's largest phase EMF, across the phase's own ends.
    pub phase_ratio: f64,
    /// The largest EMF between two parallel paths of one idle phase: paths joined at
    /// their ends carry a current between them when it is not zero.
    pub path_ratio: f64,
    /// The sum of the idle winding's three phase EMFs taken round a delta (zero sequence);
    /// `None` for a star.
    pub loop_ratio: Option<f64>,
    /// Largest EMF between two of the idle winding's line leads: a star's phase EMFs less
    /// one another; a delta closed inside, each phase less the loop's share (the loop
    /// current takes up the rest); `None` for a delta brought out open, whose leads of
    /// different phases are not joined.
    pub line_ratio: Option<f64>,
    /// The idle winding's largest phase EMF at the running winding's rated voltage, V.
    pub idle_phase_v: Option<f64>,
    /// Between two parallel paths of one phase, V.
    pub path_v: Option<f64>,
    /// Largest EMF between two idle line leads, V.
    pub idle_line_v: Option<f64>,
    /// The EMF round the idle winding's delta, V.
    pub loop_v: Option<f64>,
    /// How the idle winding is connected.
    pub idle_connection: Connection,
    /// The idle winding's parallel paths per phase.
    pub idle_paths: usize,
    /// True when the idle winding is a delta closed inside the machine (three leads): a
    /// loop EMF then drives a current whatever the contactors do.
    pub closed_inside: bool,
}

/// What the pair's report finds.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Finding {
    /// The idle winding is a closed delta and the running winding's field leaves an EMF
    /// round it: a current circulates while the other speed runs.
    ClosedDeltaLoop {
        /// The running winding (0 the first).
        running: usize,
        /// The idle delta.
        idle: usize,
        /// Its loop EMF over the running phase EMF.
        loop_ratio: f64,
        /// Its loop EMF at rated voltage, V.
        loop_v: Option<f64>,
    },
    /// The idle winding's parallel paths of one phase have different EMFs: a current
    /// circulates between them while the other speed runs.
    PathsCirculate {
        /// The running winding (0 the first).
        running: usize,
        /// The idle winding.
        idle: usize,
        /// Largest EMF between two paths over the running phase EMF.
        path_ratio: f64,
        /// It at rated voltage, V.
        path_v: Option<f64>,
    },
    /// Both windings' wire does not go into the slots.
    SlotsOverfull {
        /// Fill of the fullest slot by both windings' insulated wire.
        fill: f64,
        /// The usual limit.
        limit: f64,
    },
    /// A winding's phases are not balanced.
    Unbalanced {
        /// The winding (0 the first).
        winding: usize,
    },
    /// A recorded winding's audit found problems.
    AuditFindings {
        /// The winding (0 the first).
        winding: usize,
        /// How many.
        problems: usize,
    },
}

impl Finding {
    /// True for a finding between the two windings (or the slots they share), rather than
    /// one winding's own.
    pub fn between(&self) -> bool {
        matches!(
            self,
            Finding::ClosedDeltaLoop { .. }
                | Finding::PathsCirculate { .. }
                | Finding::SlotsOverfull { .. }
        )
    }
}

/// The report on a two-winding core.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct TwoWindingReport {
    /// How the windings share the slots.
    pub sharing: Sharing,
    /// The first winding (bottom) and the second (top).
    pub windings: Vec<Part>,
    /// Each winding running with the other idle.
    pub couplings: Vec<Coupling>,
    /// Fill of the fullest slot by both windings' insulated wire, over the usable slot
    /// area (each winding's fill added: both lie in every slot).
    pub slot_fill: Option<f64>,
    /// The fill limit it is held against.
    pub slot_fill_limit: f64,
    /// Wires in the fullest slot, both windings.
    pub wires_per_slot: u64,
    /// Conductor mass of both windings, kg.
    pub copper_mass_kg: Option<f64>,
    /// Wire to order for both windings, kg.
    pub wire_to_order_kg: Option<f64>,
    /// What to act on; empty when the pair is sound.
    pub findings: Vec<Finding>,
}

fn report(studies: &[Study; 2], sharing: Sharing) -> TwoWindingReport {
    let w = [studies[0].winding(), studies[1].winding()];
    let windings: Vec<Part> = (0..2)
        .map(|i| {
            let s = &studies[i];
            let wi = w[i];
            // Speed 1 is the lower (`spec::speed_numbers`, the one rule).
            let speed =
                match crate::spec::speed_numbers([w[0].geometry.poles, w[1].geometry.poles])[i] {
                    1 => Speed::Low,
                    _ => Speed::High,
                };
            Part {
                poles: wi.geometry.poles,
                speed,
                position: positions(sharing)[i],
                synchronous_rpm: crate::speeds::synchronous_rpm(wi, wi.geometry.poles),
                connection: wi.design.connection,
                coils: wi.coils.len(),
                winding_factor: s.plan().winding_factor,
                series_turns_per_phase: s.card().series_turns_per_phase,
                balanced: wi.is_balanced(),
                leads: s
                    .card()
                    .leads
                    .as_ref()
                    .map(|l| l.terminals.iter().map(|t| t.name.clone()).collect())
                    .unwrap_or_default(),
                audit_problems: s.audit().map(|a| a.findings.len()),
            }
        })
        .collect();
    let couplings: Vec<Coupling> = [(0, 1), (1, 0)]
        .into_iter()
        .map(|(r, i)| coupling(w[r], w[i], r, i))
        .collect();
    let cards = [studies[0].card(), studies[1].card()];
    // Sharing by layers, both windings lie in every slot; by slots, each slot holds one,
    // and the fuller winding's slot is the fullest (its fill and its wires together).
    let fuller = usize::from(cards[1].slot_fill.unwrap_or(0.0) > cards[0].slot_fill.unwrap_or(0.0));
    let slot_fill = match (cards[0].slot_fill, cards[1].slot_fill, sharing) {
        (Some(a), Some(b), Sharing::Layers) => Some(a + b),
        (Some(_), Some(_), Sharing::Slots) => cards[fuller].slot_fill,
        _ => None,
    };
    let both = |f: fn(&crate::card::DataCard) -> Option<f64>| match (f(cards[0]), f(cards[1])) {
        (Some(a), Some(b)) => Some(a + b),
        _ => None,
    };
    let mut findings = Vec::new();
    for c in &couplings {
        if let Some(l) = c.loop_ratio
            && c.closed_inside
            && l > CANCELS
        {
            findings.push(Finding::ClosedDeltaLoop {
                running: c.running,
                idle: c.idle,
                loop_ratio: l,
                loop_v: c.loop_v,
            });
        }
        if c.path_ratio > CANCELS {
            findings.push(Finding::PathsCirculate {
                running: c.running,
                idle: c.idle,
                path_ratio: c.path_ratio,
                path_v: c.path_v,
            });
        }
    }
    if let Some(f) = slot_fill
        && f > FILL_LIMIT
    {
        findings.push(Finding::SlotsOverfull {
            fill: f,
            limit: FILL_LIMIT,
        });
    }
    for (i, p) in windings.iter().enumerate() {
        if !p.balanced {
            findings.push(Finding::Unbalanced { winding: i });
        }
        if let Some(n) = p.audit_problems
            && n > 0
        {
            findings.push(Finding::AuditFindings {
                winding: i,
                problems: n,
            });
        }
    }
    TwoWindingReport {
        sharing,
        windings,
        couplings,
        slot_fill,
        slot_fill_limit: FILL_LIMIT,
        wires_per_slot: match sharing {
            Sharing::Layers => cards[0].wires_per_slot + cards[1].wires_per_slot,
            Sharing::Slots => cards[fuller].wires_per_slot,
        },
        copper_mass_kg: both(|c| c.copper_mass_kg),
        wire_to_order_kg: both(|c| c.wire_to_order_kg),
        findings,
    }
}

/// The EMFs `running`'s balanced currents induce in `idle`'s phases, over its own.
fn coupling(running: &Winding, idle: &Winding, r: usize, i: usize) -> Coupling {
    let own = phase_linkages(running, running);
    let paths = path_linkages(running, idle);
    let induced: Vec<Complex64> = paths.iter().map(|p| mean(p)).collect();
    let reference = own.iter().map(|e| e.norm()).sum::<f64>() / own.len().max(1) as f64;
    let ratio = |x: f64| if reference > 0.0 { x / reference } else { 0.0 };
    let phase_ratio = ratio(induced.iter().map(|e| e.norm()).fold(0.0, f64::max));
    let path_ratio = ratio(
        paths
            .iter()
            .flat_map(|p| {
                p.iter()
                    .flat_map(move |a| p.iter().map(move |b| (a - b).norm()))
            })
            .fold(0.0, f64::max),
    );
    let zero = induced.iter().sum::<Complex64>();
    let m = induced.len();
    let closed_inside = idle.design.connection == Connection::Delta && idle.design.leads.count == 3;
    let loop_ratio = (idle.design.connection == Connection::Delta).then(|| ratio(zero.norm()));
    let line_ratio = match idle.design.connection {
        // Between two leads of a star: two phases in series, each from its end.
        Connection::Star => Some(
            (0..m)
                .map(|k| (induced[k] - induced[(k + 1) % m]).norm())
                .fold(0.0, f64::max),
        ),
        // A closed delta: the loop current takes up the zero-sequence EMF, leaving each
        // phase's share across the leads its ends are joined to.
        Connection::Delta if closed_inside => Some(
            induced
                .iter()
                .map(|e| (e - zero / m as f64).norm())
                .fold(0.0, f64::max),
        ),
        Connection::Delta => None,
    }
    .map(ratio);
    let phase_v = running
        .design
        .supply
        .line_voltage_v
        .map(|u| running.design.connection.phase_voltage(u));
    let volts = |x: Option<f64>| phase_v.zip(x).map(|(v, x)| v * x);
    Coupling {
        running: r,
        idle: i,
        phase_ratio,
        path_ratio,
        loop_ratio,
        line_ratio,
        idle_phase_v: volts(Some(phase_ratio)),
        path_v: volts(Some(path_ratio)),
        idle_line_v: volts(line_ratio),
        loop_v: volts(loop_ratio),
        idle_connection: idle.design.connection,
        idle_paths: idle.parallel_paths,
        closed_inside,
    }
}

fn mean(v: &[Complex64]) -> Complex64 {
    v.iter().sum::<Complex64>() / v.len().max(1) as f64
}

/// Flux linkage of each of `idle`'s phases (per unit phase current, per unit of
/// μ0·r·l/g) in the gap field of `running`'s balanced positive-sequence currents: the mean
/// of its paths' ([`path_linkages`]), which is the phase's EMF when the paths agree.
pub fn phase_linkages(running: &Winding, idle: &Winding) -> Vec<Complex64> {
    path_linkages(running, idle)
        .iter()
        .map(|p| mean(p))
        .collect()
}

/// Flux linkage of each parallel path of each of `idle`'s phases, `[phase][path]`, in the
/// gap field of `running`'s balanced positive-sequence currents: the stepped MMF of its
/// slot currents, held at zero mean round the closed core (Gauss: the flux leaving the
/// rotor is zero), integrated between each coil's sides. Both windings are on one core:
/// `idle`'s slots are `running`'s (a coil outside them links nothing).
pub fn path_linkages(running: &Winding, idle: &Winding) -> Vec<Vec<Complex64>> {
    let m = running.geometry.phases;
    let currents: Vec<Complex64> = (0..m).map(|k| phase_operator(k, m)).collect();
    let slot = slot_currents(running, &currents);
    let s = slot.len();
    // MMF of the segment after each slot, then its mean taken off.
    let mut mmf = Vec::with_capacity(s);
    let mut sum = Complex64::new(0.0, 0.0);
    for c in &slot {
        sum += c;
        mmf.push(sum);
    }
    let mean_mmf = mmf.iter().sum::<Complex64>() / s.max(1) as f64;
    // ∫ F dθ from slot 0 to each slot, in slot pitches.
    let mut at = Vec::with_capacity(s);
    let mut acc = Complex64::new(0.0, 0.0);
    for f in &mmf {
        at.push(acc);
        acc += f - mean_mmf;
    }
    let mut out =
        vec![vec![Complex64::new(0.0, 0.0); idle.parallel_paths.max(1)]; idle.geometry.phases];
    for c in &idle.coils {
        if let (Some(b), Some(g), Some(path)) = (
            at.get(c.back),
            at.get(c.go),
            out.get_mut(c.phase).and_then(|p| p.get_mut(c.path)),
        ) {
            *path += (b - g) * c.turns as f64;
        }
    }
    out
}
