//! Warnings, suggestions and assumptions in words: the analyses return them as typed facts
//! ([`DesignWarning`], [`CardWarning`], [`Suggestion`], [`Assumption`]); this is the one
//! place they become sentences, for every presenter (text, JSON, sheets, the HTML page).

use super::{Say, Words, worded};
use std::fmt;

use crate::assumption::Assumption;
use crate::card::CardWarning;
use crate::card::measured::Suggestion;
use crate::numbering::num;
use crate::warnings::DesignWarning;

impl Words for DesignWarning {
    /// The warning in words.
    fn message(&self) -> String {
        match self {
            DesignWarning::SpanFarFromPolePitch {
                span,
                pole_pitch,
                winding_factor,
            } => format!(
                "span {span} is far from the pole pitch of {} slots (k_w1 = {}): choose a span \
                 near the pole pitch",
                num(*pole_pitch, 3),
                num(*winding_factor, 3)
            ),
            DesignWarning::LowWindingFactor {
                winding_factor,
                floor,
                poles,
            } => format!(
                "k_w1 = {}{} is below {}: most of the copper does no useful work{}",
                num(*winding_factor, 3),
                poles.map_or(String::new(), |p| format!(" at {p} poles")),
                num(*floor, 2),
                if poles.is_some() {
                    " at that speed; `beltwright speeds` compares every span at both"
                } else {
                    ""
                }
            ),
            DesignWarning::PulsatingExceedsWorking { ratio } => format!(
                "the open ends' pulsating field is {} times the working wave: use a double \
                 layer (half-filled end slots) or more poles",
                num(*ratio, 3)
            ),
        }
    }
}

impl Words for CardWarning {
    /// The warning in words.
    fn message(&self) -> String {
        match self {
            CardWarning::FillAboveLimit { fill, limit } => format!(
                "slot fill {:.0}% by insulated wire is above the usual {:.0}% for hand \
                 insertion: choose a smaller wire with more strands, or check the slot area",
                fill * 100.0,
                limit * 100.0
            ),
            CardWarning::NoMeanTurn => "no mean turn: give core.stack_mm and the slot pitch (or \
                 bore), or core.mean_turn_mm, for resistance and copper mass"
                .into(),
            CardWarning::NoWire => "no wire: give [wire] diameter_mm or awg for resistance, \
                 copper mass and fill"
                .into(),
            CardWarning::NotThreePhase => {
                "lead markings and line resistances are given for three-phase windings only".into()
            }
            CardWarning::PoleChanging { poles } => format!(
                "a pole-changing winding ({} and {poles} poles): no single-speed lead table or \
                 line resistance here; the readings between the six leads are under 'Six \
                 leads' (when the wire and the core's sizes are given), and how to connect \
                 each speed is on the connection sheet and in `beltwright speeds`",
                2 * poles
            ),
            CardWarning::PathWithoutCoils { phase, path, paths } => {
                if *paths > 1 {
                    format!(
                        "path {path} of phase {phase} holds no coils, so no resistance is given \
                         for it or between leads that include it: give each coil its path \
                         (coil.path = 1 to {paths})"
                    )
                } else {
                    format!(
                        "phase {phase} holds no coils, so no resistance is given for it or \
                         between the line terminals: record its coils"
                    )
                }
            }
            CardWarning::SupplyAtHigherVoltage {
                supply_v,
                lower_v,
                higher_v,
            } => format!(
                "the supply is {} V, the nameplate's higher voltage, but a 9- or 12-lead \
                 winding is planned with its two sections in parallel, for its lower voltage \
                 ({} V): give supply.line_voltage_v = {} so the planned board, the figures and \
                 the current density are for the sections in parallel; the series board is \
                 then the {} V one",
                num(*supply_v, 0),
                num(*lower_v, 0),
                num(*lower_v, 0),
                num(*higher_v, 0)
            ),
            CardWarning::CurrentDensityAbove {
                density_a_mm2,
                limit_a_mm2,
            } => format!(
                "the wire carries {} A/mm2 at rated current, above the {} A/mm2 usual for an \
                 enclosed motor: choose a larger wire or more strands in hand, or check the \
                 nameplate current",
                num(*density_a_mm2, 2),
                num(*limit_a_mm2, 1)
            ),
        }
    }
}

impl Words for Suggestion {
    /// The suggestion in words.
    fn message(&self) -> String {
        let pct = |r: f64| format!("{:+.1}%", (r - 1.0) * 100.0);
        // A phase is named by its label, a section by its leads ("T1-T4").
        // A section is named by its leads ("T1-T4", or "T8, from the three pair readings");
        // a phase by its label, which holds neither a hyphen nor a comma.
        let is_section = |name: &str| name.contains('-') || name.contains(',');
        let what = |name: &str| {
            if is_section(name) { "section" } else { "phase" }
        };
        let who = |name: &str| {
            if is_section(name) {
                format!("section {name}")
            } else {
                format!("phase {name}")
            }
        };
        match self {
            Suggestion::AsExpected => "the readings agree with the card".into(),
            Suggestion::WireSizeStep { ratio, diameter } => format!(
                "all phases read {} against the card, as a wire of {} mm would: check the \
                 wire size on the spool",
                pct(*ratio),
                num(diameter.mm(), 3)
            ),
            Suggestion::StrandMissing { ratio, strands } => format!(
                "all phases read {}, as {} in hand instead of {strands} would: check the \
                 strands at the joints",
                pct(*ratio),
                crate::numbering::count(*strands as usize - 1, "strand", "strands")
            ),
            Suggestion::TurnsOrWire { ratio } => format!(
                "all phases read {} against the card: the turns per coil or the wire differ \
                 from the card, or the winding is not at the temperature given",
                pct(*ratio)
            ),
            Suggestion::PathOpen { phase, ratio } => format!(
                "phase {phase} reads {} against the others, as with one parallel path open: \
                 look for a joint not made in that phase",
                pct(*ratio)
            ),
            Suggestion::StrandOpen {
                phase,
                ratio,
                strands,
            } => format!(
                "{} reads {} against the others, as {} in hand instead of {strands} \
                 would: one strand is open or not joined in that {}",
                who(phase),
                pct(*ratio),
                crate::numbering::count(*strands as usize - 1, "strand", "strands"),
                what(phase)
            ),
            Suggestion::Open { phase, ratio } => format!(
                "{} reads {} times the others: an open circuit or a joint that barely \
                 touches in that {}; do not energise",
                who(phase),
                num(*ratio, 1),
                what(phase)
            ),
            Suggestion::High { phase, ratio } => format!(
                "{} reads {} against the others (high): look for a poor joint, a smaller \
                 wire or extra turns in that {}",
                who(phase),
                pct(*ratio),
                what(phase)
            ),
            Suggestion::Low { phase, ratio } => format!(
                "{} reads {} against the others (low): look for shorted turns, fewer \
                 turns or a larger wire in that {}",
                who(phase),
                pct(*ratio),
                what(phase)
            ),
            Suggestion::OpenInDelta { phase } => format!(
                "the readings are those of a delta with phase {phase} open (the two readings \
                 across the other phases add up to the third): find the break or the joint \
                 not made in phase {phase}; do not energise"
            ),
            Suggestion::Inconsistent => "no connection of windings gives these readings (one \
                 is larger than the other two together): re-measure with clean contacts"
                .into(),
            Suggestion::OtherConnection { ratio, as_if } => format!(
                "all phases read {} times the card, as the winding would linked in {as_if}: \
                 check how the leads were linked when measured",
                num(*ratio, 2)
            ),
            Suggestion::Scattered => {
                "the readings differ in no single-phase pattern: re-measure with clean \
                 contacts at a steady temperature"
                    .into()
            }
        }
    }
}

impl fmt::Display for Say<'_, Assumption> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.0 {
            Assumption::ThrustModel => f.write_str(
                "circuit: thin plate, unsaturated iron, secondary leakage neglected, plate at least as wide \
                 as the stack, sinusoidal fields (a first estimate, not a test result; each is \
                 checked against the inputs below)",
            ),
            Assumption::NoBackIron => f.write_str(
                "no back iron: a plate between two equal primaries fed alike; each primary's \
                 gap reaches the plate's mid-plane, thrust and power are of both, the normal \
                 force is each primary's pull (zero net on a centred plate)",
            ),
            Assumption::FieldModel => f.write_str(
                "field model: the finite primary's slot currents as a current sheet, Fourier \
                 transformed, over a two-dimensional gap and plate (skin effect included); \
                 primary iron ideal (no magnetic drop in it), its potential floating so that \
                 its flux closes in it, and the face beyond its ends taken as unexcited iron; \
                 slots smoothed by Carter's coefficient; edge effect by the \
                 Russell-Norsworthy factor of each wavelength; backing steel linear",
            ),
            Assumption::Temperatures { winding_c, plate_c } => write!(
                f,
                "winding at {} °C, plate at {} °C ([winding] temperature_c, [secondary] \
                 temperature_c; 20 °C when not given)",
                num(*winding_c, 1),
                num(*plate_c, 1)
            ),
            Assumption::FieldGridBounded {
                window_m,
                wanted_m,
                k_max,
                wanted_k_max,
            } => write!(
                f,
                "the field model's wavenumbers are bounded: it follows the plate's field over {} \
                 m of the {} m asked, and waves up to {} of the {} 1/m asked; its end effect at \
                 low slip and its slot-harmonic drag are understated",
                num(*window_m, 3),
                num(*wanted_m, 3),
                num(*k_max, 0),
                num(*wanted_k_max, 0)
            ),
            Assumption::BackingSaturates {
                tesla,
                limit_tesla,
                thickness,
            } => write!(
                f,
                "the {} mm backing carries about {} T at the largest flux, above the {} T \
                 back-iron limit: it saturates, while the models take it as linear, so thrust \
                 and normal force are overstated",
                num(thickness.mm(), 2),
                num(*tesla, 2),
                num(*limit_tesla, 2)
            ),
            Assumption::NoSlotOpening => {
                f.write_str("no slot opening given: Carter's coefficient 1")
            }
            Assumption::NoPlateWidth => {
                f.write_str("no plate width given: the plate as wide as the stack")
            }
            Assumption::NoPrimaryResistance => f.write_str(
                "no wire and no winding.phase_resistance_ohm: primary resistance 0 (copper loss \
                 left out)",
            ),
            Assumption::NoSlotSize => f.write_str(
                "no slot width and depth: slot permeance 1.0 (a slot three times as deep as wide)",
            ),
            Assumption::MagneticGap { gap } => write!(f, "magnetic gap {} mm", num(gap.mm(), 3)),
            Assumption::SupplyDefaulted => {
                f.write_str("no full [supply]: currents worked out at 50 Hz and 400 V line voltage")
            }
            Assumption::LineVoltageShared { volts: Some(v) } => {
                write!(f, "line voltage {v} V taken for both designs")
            }
            Assumption::LineVoltageShared { volts: None } => {
                f.write_str("no line voltage given: the same line voltage assumed for both")
            }
            Assumption::FrequencyShared { hertz: Some(h) } => {
                write!(f, "frequency {h} Hz taken for both designs")
            }
            Assumption::FrequencyShared { hertz: None } => {
                f.write_str("no frequency given: the same frequency assumed for both")
            }
            Assumption::GoodnessOutOfRange { goodness } => write!(
                f,
                "goodness factor {} is outside the range of about 1 to 50 the circuit model \
                 stands for: its thrust and speed figures are an extrapolation",
                num(*goodness, 3)
            ),
            Assumption::PlateConductivity { conductivity } => write!(
                f,
                "the plate's conductivity is taken as {} MS/m at its temperature (a warm plate \
                 conducts less and gives less thrust at a given slip)",
                num(conductivity.ms_m(), 3)
            ),
            Assumption::PlateNarrowerThanStack { plate, stack } => write!(
                f,
                "the plate ({} mm) is narrower than the stack ({} mm); the edge factor takes \
                 it as wide as the stack, so thrust is overstated",
                num(plate.mm(), 1),
                num(stack.mm(), 1)
            ),
            Assumption::PlateThickerThanSkinDepth {
                thickness,
                skin_depth,
                thin_below_slip,
            } => write!(
                f,
                "the plate ({} mm) is thicker than its skin depth at the supply frequency ({} \
                 mm): the circuit's thin-plate model holds only below slip {} (the field model \
                 takes the skin effect)",
                num(thickness.mm(), 2),
                num(skin_depth.mm(), 2),
                num(*thin_below_slip, 3)
            ),
            Assumption::PrimaryCurrentDensity {
                density_a_mm2,
                limit_a_mm2,
                slip,
            } => write!(
                f,
                "the primary's current density reaches {} A/mm² at slip {}, above the {} A/mm² \
                 a winding carries continuously: run there only briefly",
                num(*density_a_mm2, 2),
                num(*slip, 3),
                num(*limit_a_mm2, 1)
            ),
            Assumption::PlateHeatingAtStandstill {
                watts,
                w_cm2,
                field_watts,
                field_w_cm2,
            } => {
                write!(
                    f,
                    "at standstill the plate turns {} W into heat by the circuit, {} W/cm² of \
                     plate under the primary",
                    num(*watts, 0),
                    num(*w_cm2, 2)
                )?;
                if let Some(fw) = field_watts {
                    write!(f, "; {} W by the field model", num(*fw, 0))?;
                    if let Some(fc) = field_w_cm2 {
                        write!(f, ", {} W/cm²", num(*fc, 2))?;
                    }
                }
                Ok(())
            }

            Assumption::GapLargeAgainstPitch { ratio } => write!(
                f,
                "the magnetic gap is {} of the pole pitch, not small against it (above 0.1): \
                 the circuit's one-dimensional gap overstates thrust and normal force (the \
                 field model takes the gap in two dimensions)",
                num(*ratio, 3)
            ),
            Assumption::CoilMatrixOmitted { coils, limit } => write!(
                f,
                "the coil matrix is given up to {limit} coils; this winding has {coils}, so \
                 only the phase matrix is given"
            ),
            Assumption::PoleCountChanges { from, to } => write!(
                f,
                "pole count changes from {from} to {to}: the peak air-gap flux density is kept, \
                 so the flux per pole scales with the pole pitch"
            ),
            Assumption::NoDifferentialLeakage => f.write_str(
                "no differential leakage could be worked out (no working wave): the primary \
                 leakage reactance leaves it out",
            ),
        }
    }
}

worded!(Assumption);
