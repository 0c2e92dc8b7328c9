//! Measured line-to-line resistances against the card: balance, and what a reading far from
//! the expected value suggests.
//!
//! The three readings are turned back into phase resistances: in star, R_k = (m_k + m_{k+2}
//! − m_{k+1})/2 from m_k = R_k + R_{k+1}; in delta, the readings give the equivalent star
//! (as above), and the delta from the star by the star–delta transformation (Kennelly 1899;
//! any circuits text). So a fault is pinned to a phase in either connection. A phase reversed
//! inside a delta does not change any DC resistance: that is the audit's EMF check's work.

use serde::Serialize;

use super::wire::{iec_60317_mm, metal};
use super::{BALANCE_TOLERANCE_PERCENT, Wire, planned_line_resistances};
use crate::winding::{Connection, Winding};

/// What the readings suggest, in shop terms.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Suggestion {
    /// All phases read alike and as expected.
    AsExpected,
    /// Every phase high or low by the ratio of neighbouring standard wire sizes.
    WireSizeStep {
        /// Measured over expected.
        ratio: f64,
        /// The bare diameter that would give the reading, mm.
        diameter_mm: f64,
    },
    /// Every phase high by s/(s − 1): one strand in hand fewer than the card.
    StrandMissing {
        /// Measured over expected.
        ratio: f64,
        /// Strands on the card.
        strands: u32,
    },
    /// Every phase off by a ratio no wire step explains.
    TurnsOrWire {
        /// Measured over expected.
        ratio: f64,
    },
    /// One phase reads a/(a − 1) times the others: one of its parallel paths is open.
    PathOpen {
        /// Phase label.
        phase: String,
        /// Its resistance over the others'.
        ratio: f64,
    },
    /// One phase differs from the other two.
    PhaseDiffers {
        /// Phase label.
        phase: String,
        /// Its resistance over the mean of the others.
        ratio: f64,
    },
    /// The readings are unbalanced in no single-phase pattern.
    Scattered,
}

/// The measured resistances set against the card.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ResistanceCheck {
    /// Readings between terminals 1-2, 2-3, 3-1, ohms.
    pub measured_ohm: [f64; 3],
    /// Winding temperature at the reading, °C.
    pub temperature_c: f64,
    /// Expected readings at that temperature, ohms (null without wire or resistance data).
    pub expected_ohm: Option<[f64; 3]>,
    /// Largest deviation of a reading from the mean of the three, per cent.
    pub deviation_percent: f64,
    /// The tolerance, per cent.
    pub tolerance_percent: f64,
    /// Mean reading over mean expected.
    pub ratio_to_expected: Option<f64>,
    /// Phase resistances worked back from the readings, ohms.
    pub phase_ohm: [f64; 3],
    /// True when balanced within tolerance and within 5 % of the card.
    pub sound: bool,
    /// What the readings suggest.
    pub suggestion: Suggestion,
}

/// How far from the card counts as "far": 5 % (common practice: beyond the usual spread of
/// wire tolerance and temperature reading).
pub const FAR_PERCENT: f64 = 5.0;

/// Phase resistances from three line-to-line readings.
pub fn phases_from_lines(m: [f64; 3], connection: Connection) -> [f64; 3] {
    let star = [0, 1, 2].map(|k| (m[k] + m[(k + 2) % 3] - m[(k + 1) % 3]) / 2.0);
    match connection {
        Connection::Star => star,
        Connection::Delta => {
            // Star resistance at terminal k+1 belongs to the delta phases k and k+1; the
            // delta phase k lies opposite terminal k+2.
            let at = |t: usize| star[t % 3];
            let sum = at(0) * at(1) + at(1) * at(2) + at(2) * at(0);
            [0, 1, 2].map(|k| sum / at(k + 2))
        }
    }
}

/// Check `[measured]` against the card; `None` when nothing was measured or the winding is
/// not three-phase.
pub fn check(w: &Winding) -> Option<ResistanceCheck> {
    let meas = w.design.measured?;
    if w.geometry.phases != 3 {
        return None;
    }
    let m = meas.line_resistance_ohm;
    let mean = (m[0] + m[1] + m[2]) / 3.0;
    let deviation = m.iter().map(|x| (x / mean - 1.0).abs()).fold(0.0, f64::max) * 100.0;
    let wire = w.design.wire.as_ref().map(Wire::of);
    let material = wire
        .as_ref()
        .map_or(crate::design::Material::Copper, |x| x.material);
    let expected = planned_line_resistances(w)
        .map(|e| e.map(|r| metal(material).at_temperature(r, meas.temperature_c)));
    let ratio = expected.map(|e| mean / ((e[0] + e[1] + e[2]) / 3.0));
    let ph = phases_from_lines(m, w.design.connection);
    let ph_mean = (ph[0] + ph[1] + ph[2]) / 3.0;
    let balanced = deviation <= BALANCE_TOLERANCE_PERCENT;
    let near = ratio.is_none_or(|r| (r - 1.0).abs() * 100.0 <= FAR_PERCENT);
    let suggestion = if balanced && near {
        Suggestion::AsExpected
    } else if balanced {
        let r = ratio.unwrap_or(1.0);
        uniform(r, wire.as_ref())
    } else {
        // One phase apart from the other two?
        let (p, rp) = (0..3)
            .map(|p| {
                let others = (ph[(p + 1) % 3] + ph[(p + 2) % 3]) / 2.0;
                (p, ph[p] / others)
            })
            .max_by(|a, b| (a.1 - 1.0).abs().total_cmp(&(b.1 - 1.0).abs()))
            .unwrap_or((0, 1.0));
        let others_agree = {
            let (a, b) = (ph[(p + 1) % 3], ph[(p + 2) % 3]);
            ((a - b) / ph_mean).abs() * 100.0 <= BALANCE_TOLERANCE_PERCENT
        };
        let label = w.design.phase_labels.get(p).cloned().unwrap_or_default();
        let a = w.parallel_paths as f64;
        if !others_agree {
            Suggestion::Scattered
        } else if a >= 2.0 && (rp / (a / (a - 1.0)) - 1.0).abs() < 0.03 {
            Suggestion::PathOpen {
                phase: label,
                ratio: rp,
            }
        } else {
            Suggestion::PhaseDiffers {
                phase: label,
                ratio: rp,
            }
        }
    };
    Some(ResistanceCheck {
        measured_ohm: m,
        temperature_c: meas.temperature_c,
        expected_ohm: expected,
        deviation_percent: deviation,
        tolerance_percent: BALANCE_TOLERANCE_PERCENT,
        ratio_to_expected: ratio,
        phase_ohm: ph,
        sound: balanced && near,
        suggestion,
    })
}

/// What a uniform ratio of measured to expected suggests.
fn uniform(r: f64, wire: Option<&Wire>) -> Suggestion {
    if let Some(wr) = wire {
        let s = wr.strands_in_hand;
        if s >= 2 && (r / (s as f64 / (s as f64 - 1.0)) - 1.0).abs() < 0.02 {
            return Suggestion::StrandMissing {
                ratio: r,
                strands: s,
            };
        }
        // The diameter that gives this reading, and whether it is a neighbouring standard
        // size (IEC 60317 series, or one AWG gauge: area ratio 92^(2/39) ≈ 1.261).
        let d = wr.diameter_mm / r.sqrt();
        let iec_step = iec_60317_mm()
            .any(|x| (x / d - 1.0).abs() < 0.01 && (x / wr.diameter_mm - 1.0).abs() > 0.01);
        let awg_step = wr.awg.is_some() && {
            let step = 92f64.powf(2.0 / 39.0);
            (r / step - 1.0).abs() < 0.02 || (r * step - 1.0).abs() < 0.02
        };
        if iec_step || awg_step {
            return Suggestion::WireSizeStep {
                ratio: r,
                diameter_mm: d,
            };
        }
    }
    Suggestion::TurnsOrWire { ratio: r }
}

#[cfg(test)]
mod tests {
    use super::super::leads::Sections;
    use super::*;

    // Round trip of the star and delta reductions: phases → readings → phases.
    #[test]
    fn phases_come_back_from_readings() {
        use super::super::leads::SectionResistance;
        let r = SectionResistance {
            r: [[1.0, 0.0], [1.3, 0.0], [0.8, 0.0]],
        };
        for c in [Connection::Star, Connection::Delta] {
            let m = [0, 1, 2].map(|k| r.line_to_line(k, c, Sections::Single));
            let back = phases_from_lines(m, c);
            for (b, want) in back.iter().zip([1.0, 1.3, 0.8]) {
                assert!((b - want).abs() < 1e-12, "{c:?}: {back:?}");
            }
        }
    }
}
