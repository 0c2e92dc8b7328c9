//! Designs a winder should not build, as typed facts: a span far from the pole pitch, a low
//! fundamental winding factor, an open primary whose pulsating end component outweighs the
//! working wave. Analyses return these; presenters put them into words.

use serde::Serialize;

use crate::factors;
use crate::winding::{Style, Winding};

/// Lowest fundamental winding factor worth winding: 0.7 (common practice, from memory:
/// below it most of the copper does no useful work).
pub const KW1_FLOOR: f64 = 0.7;

/// Span over pole pitch outside this band is far from the pole pitch.
pub const SPAN_BAND: (f64, f64) = (0.5, 1.5);

/// A reason not to build a design.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum DesignWarning {
    /// Coil span far from the pole pitch.
    SpanFarFromPolePitch {
        /// Span in slot pitches.
        span: usize,
        /// Pole pitch in slot pitches.
        pole_pitch: f64,
        /// Resulting k_w1.
        winding_factor: f64,
    },
    /// Fundamental winding factor below [`KW1_FLOOR`].
    LowWindingFactor {
        /// k_w1.
        winding_factor: f64,
        /// The floor.
        floor: f64,
        /// A pole-changing winding's pole count at which k_w1 is this low.
        #[serde(default, skip_serializing_if = "Option::is_none")]
        poles: Option<usize>,
    },
    /// An open single-layer primary whose uniform pulsating component exceeds the working
    /// wave.
    PulsatingExceedsWorking {
        /// Pulsating over working amplitude.
        ratio: f64,
    },
}

/// The warnings that follow from the winding alone (the field analysis adds the pulsating
/// one).
pub fn design_warnings(w: &Winding) -> Vec<DesignWarning> {
    let mut out = Vec::new();
    let kw = factors::fundamental(w).winding;
    let tau = w.geometry.pole_pitch_slots;
    let ratio = w.pitch as f64 / tau;
    let tooth = w.pitch == 1 && w.design.style == Style::Lap;
    if w.design.pole_change.is_some() {
        // A pole-changing winding's span is chosen for both pole counts (`speeds` compares
        // them): no pole pitch of one count judges it; k_w1 is judged at each.
        let low = crate::winding::pole_change::at_double_poles(w);
        for (x, kw) in [(w, kw), (&low, factors::fundamental(&low).winding)] {
            if kw.abs() < KW1_FLOOR {
                out.push(DesignWarning::LowWindingFactor {
                    winding_factor: kw.abs(),
                    floor: KW1_FLOOR,
                    poles: Some(x.geometry.poles),
                });
            }
        }
        return out;
    }
    if !tooth && !(SPAN_BAND.0..=SPAN_BAND.1).contains(&ratio) {
        out.push(DesignWarning::SpanFarFromPolePitch {
            span: w.pitch,
            pole_pitch: tau,
            winding_factor: kw,
        });
    }
    if kw < KW1_FLOOR {
        out.push(DesignWarning::LowWindingFactor {
            winding_factor: kw,
            floor: KW1_FLOOR,
            poles: None,
        });
    }
    out
}
