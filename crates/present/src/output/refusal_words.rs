//! Refusals in words: why a design cannot be wound ([`Refusal`], [`Overfill`],
//! [`PathChoice`]) and why a rewind was refused ([`RewindError`]). Synthesis and the rewind
//! return typed facts; this is the one place they become sentences (their `Display`, which
//! the errors' messages use).

use super::{Say, Words, worded};
use std::fmt;

use itertools::Itertools;

use crate::numbering::{num, short};
use crate::rewind::{RewindError, Which};
use crate::survey::Infeasible;
use crate::winding::{Overfill, PathChoice, PlanError, Refusal};

impl fmt::Display for Say<'_, Refusal> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.0 {
            Refusal::SlotCount {
                slots: z,
                poles,
                phases: m,
                layers,
                periodicity,
                nearby,
                double_layer_fits,
            } => {
                let kind = if *layers == 2 {
                    "double-layer"
                } else {
                    "single-layer"
                };
                write!(
                    f,
                    "{z} slots cannot carry a balanced {m}-phase {kind} winding for {poles} poles"
                )?;
                if *layers == 2 {
                    write!(
                        f,
                        " ({z} is not a multiple of {m}·gcd({z}, {}) = {})",
                        poles / 2,
                        m * periodicity
                    )?;
                }
                match nearby {
                    (Some(lo), Some(hi)) => write!(f, "; {lo} or {hi} slots can")?,
                    (Some(s), None) | (None, Some(s)) => write!(f, "; {s} slots can")?,
                    (None, None) => {}
                }
                if *double_layer_fits {
                    f.write_str("; a double-layer winding (layers = 2) fits these slots")?;
                }
                Ok(())
            }
            Refusal::LinearSingleLayer {
                slots: z,
                poles,
                phases: m,
                fitting_slots: (q1, q2),
            } => write!(
                f,
                "{z} slots cannot carry a balanced {m}-phase single-layer winding for {poles} \
                 poles on a linear primary; it needs an even pole count and 2p·m·q slots, e.g. \
                 {q1} (q = 1) or {q2} (q = 2), or use layers = 2"
            ),
            Refusal::LinearDoubleLayer {
                slots: z,
                poles,
                phases: m,
                span: y,
                options,
            } => {
                write!(
                    f,
                    "a linear double-layer primary of {poles} poles with span {y} has {} coil \
                     positions ({z} slots − {y}), which do not make a balanced {m}-phase winding",
                    z.saturating_sub(*y)
                )?;
                let options = options
                    .iter()
                    .map(|o| {
                        format!(
                            "q = {q} needs {slots} slots with span {yq} ({poles}·{m}·{q} coil \
                             positions + {yq}; full pitch is span {tau})",
                            q = o.q,
                            slots = o.slots,
                            yq = o.span,
                            tau = o.full_pitch
                        )
                    })
                    .join(", ");
                write!(f, "; {options}")
            }
            Refusal::SpanLinksNoFlux { span, pole_pitch } => write!(
                f,
                "span {span} spans a whole number of pole pairs, so its coils link no working \
                 flux; choose a span near the pole pitch of {} slots",
                num(*pole_pitch, 3)
            ),
            Refusal::SpanTooLong { span, slots } => write!(
                f,
                "span {span} is longer than half of the {slots}-slot core; the longest span is {}",
                slots / 2
            ),
            Refusal::ToothCoilsOddSlots { slots } => write!(
                f,
                "single-layer tooth coils wind every other tooth and need an even slot count, \
                 not {slots}"
            ),
            Refusal::LapPairing {
                span,
                phase,
                spans_that_can,
            } => {
                write!(
                    f,
                    "span {span} cannot pair the single-layer slots of phase {phase} in lap coils"
                )?;
                match spans_that_can {
                    None => Ok(()),
                    Some(s) if s.is_empty() => {
                        f.write_str("; spans that can: none (try style = \"concentric\")")
                    }
                    Some(s) => write!(f, "; spans that can: {}", s.iter().join(", ")),
                }
            }
        }
    }
}

worded!(Refusal);

impl fmt::Display for Say<'_, Overfill> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "slot {} holds {} coil sides but the winding has {}: coils {}",
            self.0.slot,
            self.0.sides,
            crate::numbering::count(self.0.layers, "layer", "layers"),
            self.0.coils.iter().join(", ")
        )
    }
}

worded!(Overfill);

impl fmt::Display for Say<'_, PathChoice> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{} parallel paths would carry unequal EMFs and drive circulating currents; this \
             winding allows {}",
            self.0.requested,
            self.0.possible.iter().join(", ")
        )
    }
}

worded!(PathChoice);

impl fmt::Display for Say<'_, RewindError> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.0 {
            RewindError::DifferentCore {
                old: (to, zo),
                new: (tn, zn),
            } => write!(
                f,
                "a rewind keeps the core, but the old design is a {to} core of {zo} slots and \
                 the new one a {tn} core of {zn} slots"
            ),
            RewindError::NoTurns(Which::Old) => {
                f.write_str("the old design has no turns or no fundamental EMF in its first phase")
            }
            RewindError::NoTurns(Which::New) => {
                f.write_str("the new design has no coils or no fundamental EMF in its first phase")
            }
            RewindError::OldUnbalanced => f.write_str(
                "the old winding is not a balanced winding (a coil or group reversed, or coils \
                 in the wrong phase), so turns worked out from it would be wrong; run \
                 `beltwright audit` on it and rewind from the sound design",
            ),
            RewindError::TooManyTurns { turns, max } => write!(
                f,
                "the new design would need {} turns per coil, more than the {max} a coil may \
                 have; check the voltages, frequencies and connections of the two designs",
                short(*turns)
            ),
            RewindError::OldSupplyMissing(input) => write!(
                f,
                "the old design gives no [supply] {}; give the supply the old winding was \
                 built for (from its nameplate), so the turns are not worked out from a guess",
                match input {
                    crate::thrust::Input::Frequency => "frequency_hz",
                    _ => "line_voltage_v",
                }
            ),
        }
    }
}

worded!(RewindError);

impl fmt::Display for Say<'_, Infeasible> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.0 {
            Infeasible::NotWhole {
                slots: z,
                phases: m,
                periodicity: t,
            } => write!(
                f,
                "Z/(m·gcd(Z, p)) = {z}/({m}·{t}) is not whole: no balanced {m}-phase double layer"
            ),
            Infeasible::NoWorkingFlux => f.write_str("no span links the working flux"),
            Infeasible::Refused(e) => f.write_str(&e.message()),
        }
    }
}

worded!(Infeasible);

/// A planner's refusal in words: the sentence of the fact it carries.
impl Words for PlanError {
    fn message(&self) -> String {
        match self {
            PlanError::Infeasible(r) => r.message(),
            PlanError::Overfilled(o) => o.message(),
            PlanError::Paths(p) => p.message(),
            PlanError::SinglePhase(r) => single_phase_refusal(r),
        }
    }
}

/// A single-phase layout's refusal, with what would work.
fn single_phase_refusal(r: &crate::winding::single_phase::SinglePhaseRefusal) -> String {
    use crate::winding::single_phase::{MAIN, SinglePhaseRefusal as R};
    let part = |p: usize| if p == MAIN { "main" } else { "aux" };
    let list = |v: &[usize]| {
        v.iter()
            .map(usize::to_string)
            .collect::<Vec<_>>()
            .join(", ")
    };
    match r {
        R::SlotsPerPole { slots, poles } => format!(
            "{slots} slots do not divide into {poles} poles of two or more slots each; a \
             single-phase stator needs a slot count that is a multiple of the pole count"
        ),
        R::TooManyCoils {
            part: p,
            asked,
            spans,
        } => format!(
            "{asked} coils per group asked of the {} winding; about its axis the spans {} \
             fit, so give from 1 to {} coils",
            part(*p),
            list(spans),
            spans.len()
        ),
        R::TurnsList {
            part: p,
            given,
            coils,
        } => format!(
            "{given} turn counts given for the {} winding's {coils} coils per group; give \
             one per coil, largest span first",
            part(*p)
        ),
        R::TooFewTurns {
            part: p,
            turns,
            coils,
        } => format!(
            "{turns} turns cannot be shared among the {} winding's {coils} coils per \
             group; give at least {coils}",
            part(*p)
        ),
        R::Layers { needed, layers } => format!(
            "the main and auxiliary coils put {needed} sides in one slot but layers = \
             {layers}; set layers = {needed} or give fewer coils per group"
        ),
    }
}

/// Why a pole-changing winding's two speeds could not be worked out.
impl Words for crate::speeds::SpeedsError {
    fn message(&self) -> String {
        use crate::speeds::SpeedsError;
        match self {
            SpeedsError::NotPoleChanging => "not a pole-changing winding; give \
                 winding.pole_change = \"delta-double-star\" (constant torque) or \
                 \"star-double-star\" (variable torque)"
                .into(),
            SpeedsError::Unbalanced { poles } => format!(
                "the phases are not balanced at {poles} poles; a pole-changing winding needs \
                 whole slots per pole and phase at the lower pole count (machine.slots a \
                 multiple of 3 × machine.poles) and its groups' polarities as laid out"
            ),
        }
    }
}

/// Why a plates comparison could not be made.
impl Words for crate::plates::PlatesError {
    fn message(&self) -> String {
        use crate::plates::{MAX_CHOICES, PlatesError};
        match self {
            PlatesError::Thrust(t) => t.message(),
            PlatesError::TooMany(n) => {
                format!("{n} combinations asked; give at most {MAX_CHOICES}")
            }
        }
    }
}

/// Why a field could not be worked out.
impl Words for crate::field::FieldError {
    fn message(&self) -> String {
        use crate::field::{FieldError, MAX_OPENING};
        match self {
            FieldError::CurrentCount { given, phases } => format!(
                "{} given for {phases} phases; give one `magnitude@angle_deg` per phase",
                crate::numbering::count(*given, "current", "currents")
            ),
            FieldError::SlotOpening(b) => format!(
                "slot opening {b} is not valid; give a width from 0 up to (not including) \
                 {MAX_OPENING} slot pitch"
            ),
            FieldError::NoWorkingWave => "the winding and the phase currents set up no working \
                 wave (order 1 is absent), so no spectrum relative to it exists; check the \
                 coil list and the currents"
                .into(),
        }
    }
}

/// Why the flat-primary models could not run, naming the layout key a missing input is
/// given under (the layout file's words, `../shared/design.md`).
impl Words for crate::thrust::ThrustError {
    fn message(&self) -> String {
        use crate::thrust::{Input, ThrustError};
        match self {
            ThrustError::NotLinear => {
                "thrust is worked out for flat primaries (topology = \"linear\") only".into()
            }
            ThrustError::NoFundamental => {
                "the winding has no fundamental EMF, so no working wave to drive the plate".into()
            }
            ThrustError::NoSolution { slip } if slip.is_finite() => format!(
                "the field model's phase equations have no single solution at slip {} (the \
                 winding's phases are not independent there)",
                crate::output::num(*slip, 4)
            ),
            ThrustError::NoSolution { .. } => {
                "the field model needs at least one slip to work at".into()
            }
            ThrustError::Missing(input) => format!(
                "the model needs {}",
                match input {
                    Input::Secondary => {
                        "a [secondary] table (material or conductivity_ms_m, thickness_mm)"
                    }
                    Input::Airgap => "core.airgap_mm",
                    Input::Frequency => "supply.frequency_hz",
                    Input::LineVoltage => {
                        "supply.line_voltage_v (or --current for a current-fed primary)"
                    }
                    Input::SlotPitch => "core.slot_pitch_mm (or core.bore_mm on a rotary core)",
                    Input::Stack => "core.stack_mm (the primary's width across the travel)",
                }
            ),
        }
    }
}
