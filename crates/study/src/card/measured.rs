//! Measured resistances against the card, judged per phase (or per section) at 20 °C, and
//! what a reading far from the others suggests, by its sign and size.
//!
//! Readings come in two ways (`[measured]`):
//! - between the line terminals: turned back into phase resistances. In star,
//!   R_k = (m_k + m_{k+2} − m_{k+1})/2 from m_k = R_k + R_{k+1}; in delta, the readings give
//!   the equivalent star (as above) and the delta from the star by the star–delta
//!   transformation (Kennelly 1899; any circuits text). So a fault is pinned to a phase in
//!   either connection, although in delta it moves the terminal readings by only a third
//!   of its size (a phase 3 % high: +0.98 / −0.49 / −0.49 %).
//! - across each section's own leads (6, 9 and 12 leads, before the links are made): each
//!   section directly; a nine-lead star machine's second sections meet inside, so their
//!   three readings between free ends are reduced like line readings of a star.
//!
//! Each phase or section, corrected to 20 °C and divided by the card's value for it, is
//! set against the median of its kind; more than the tolerance from it is a finding. This
//! criterion is ours; its 2 % is ANSI/EASA AR100's figure for random-wound windings (from
//! memory), and AR100 states its unbalance
//! as the largest deviation from the mean of all three, by which one phase 3 % high reads
//! only +1.98 % and the two sound ones −0.99 %: against the median, the one phase out of
//! line reads its own +3 % and the sound ones 0.
//! A phase reversed inside a delta does not change any DC resistance: that is the audit's
//! EMF check's work.

use crate::units::Length;
use serde::Serialize;

use super::leads::section_lead;
use super::wire::{iec_60317, metal};
use super::{BALANCE_TOLERANCE_PERCENT, Wire, path_resistances, planned_line_resistances};
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
        #[serde(rename = "diameter_mm", serialize_with = "crate::units::in_mm")]
        diameter: Length,
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
    /// One phase or section reads s/(s − 1) times the others: one strand in hand open.
    StrandOpen {
        /// Phase label, or the section's leads.
        phase: String,
        /// Its resistance over the others'.
        ratio: f64,
        /// Strands in hand on the card.
        strands: u32,
    },
    /// One phase or section reads many times the others: an open circuit or a joint that
    /// barely touches.
    Open {
        /// Phase label, or the section's leads.
        phase: String,
        /// Its resistance over the others'.
        ratio: f64,
    },
    /// One phase or section reads high: a poor joint, a smaller wire, extra turns.
    High {
        /// Phase label, or the section's leads.
        phase: String,
        /// Its resistance over the others'.
        ratio: f64,
    },
    /// One phase or section reads low: shorted turns, fewer turns, a larger wire.
    Low {
        /// Phase label, or the section's leads.
        phase: String,
        /// Its resistance over the others'.
        ratio: f64,
    },
    /// The readings are unbalanced in no single-phase pattern.
    Scattered,
    /// Line readings that a delta gives only with one phase open: the two readings across
    /// the other phases add up to the third.
    OpenInDelta {
        /// Phase label.
        phase: String,
    },
    /// Line readings no connection of resistors can give (one larger than the other two
    /// together, or a phase worked back to zero or less): a bad contact or a misread.
    Inconsistent,
    /// Every phase off by the ratio between two connections the leads allow: the winding
    /// was measured linked another way than the card assumes.
    OtherConnection {
        /// Measured over expected.
        ratio: f64,
        /// The connection that gives this ratio, in words ("series", "star").
        as_if: String,
    },
}

/// How the readings were taken.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "snake_case")]
pub enum Taken {
    /// Between the line terminals of the connected winding.
    LineToLine,
    /// Across each section's own leads.
    Sections,
}

/// One phase or section as the readings give it, at 20 °C.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Judged {
    /// Phase label.
    pub phase: String,
    /// Section of the phase from 1 (1 for a whole phase).
    pub section: usize,
    /// Where it is measured: the section's leads ("T1-T4"), or the phase label.
    pub between: String,
    /// As worked out from the readings, corrected to 20 °C, ohms.
    pub measured_20c_ohm: f64,
    /// The card's value, ohms (absent without wire or resistance data).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub expected_20c_ohm: Option<f64>,
    /// Against the median of its kind (each over its card value), per cent.
    pub deviation_percent: f64,
    /// Within the tolerance.
    pub within_tolerance: bool,
}

/// The measured resistances set against the card.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct ResistanceCheck {
    /// How the readings were taken.
    pub taken: Taken,
    /// Readings between terminals 1-2, 2-3, 3-1, ohms (when taken that way).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub measured_ohm: Option<[f64; 3]>,
    /// Readings across the sections, ohms, as given (when taken that way).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub section_readings_ohm: Option<Vec<f64>>,
    /// Winding temperature at the reading, °C.
    pub temperature_c: f64,
    /// Expected line readings at that temperature, ohms (absent without wire or resistance
    /// data, or when the readings are per section).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub expected_ohm: Option<[f64; 3]>,
    /// Largest deviation of a reading from the mean of the readings, per cent (AR100's
    /// unbalance of what was read).
    pub deviation_percent: f64,
    /// The tolerance, per cent.
    pub tolerance_percent: f64,
    /// Mean of the phases (or sections) over the card's, at 20 °C.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub ratio_to_expected: Option<f64>,
    /// Phase resistances worked back from line readings at the measuring temperature, ohms
    /// (line readings only).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub phase_ohm: Option<[f64; 3]>,
    /// Every phase (line readings) or section (section readings), judged.
    pub judged: Vec<Judged>,
    /// True when every phase or section is within tolerance and their mean within 5 % of
    /// the card.
    pub sound: bool,
    /// What the readings suggest.
    pub suggestion: Suggestion,
}

/// How far from the card counts as "far": 5 % (common practice: beyond the usual spread of
/// wire tolerance and temperature reading).
pub const FAR_PERCENT: f64 = 5.0;

/// A phase or section this many times the others is taken as open (common practice: far
/// beyond any strand, path or turns fault).
pub const OPEN_RATIO: f64 = 3.0;

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

/// One section of the card: which phase and section, the leads it is measured across, and
/// its resistance at 20 °C.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SectionFigure {
    /// Phase label.
    pub phase: String,
    /// Section of the phase, from 1.
    pub section: usize,
    /// The leads to measure across, e.g. "T1-T4"; for an end joined inside, the lead it is
    /// joined to ("T7-T2 (T10 inside)").
    pub between: String,
    /// The section's own resistance at 20 °C, ohms.
    pub resistance_20c_ohm: f64,
    /// What the reading across `between` gives at 20 °C, ohms: the section's own, or with
    /// the next section in series where the two meet inside (nine-lead star).
    pub reading_20c_ohm: f64,
    /// The temperature `reading_ohm` is quoted at: the measuring temperature of
    /// `[measured]`, else the shop's 25 °C (as the card's line figures), °C.
    pub temperature_c: f64,
    /// What the reading across `between` gives at `temperature_c`, ohms.
    pub reading_ohm: f64,
}

/// The sections a shop measures before linking: per phase for 6 leads, two per phase for 9
/// and 12 (none for 3 leads, whose ends are inside). `None` without resistance data or
/// when a section has no coils.
pub fn section_figures(w: &Winding) -> Option<Vec<SectionFigure>> {
    // A pole-changing winding's six leads are its ends and taps, not each phase's own
    // start and finish: its readings between them are the card's `six_leads`.
    if w.geometry.phases != 3 || w.design.leads.count == 3 || w.design.pole_change.is_some() {
        return None;
    }
    let r = path_resistances(w)?;
    let s = super::sections(w, &r)?;
    let n = if w.design.leads.count >= 9 { 2 } else { 1 };
    let mut out = Vec::new();
    for sec in 0..n {
        for p in 0..3 {
            let v = s.r[p][sec];
            if !(v.is_finite() && v > 0.0) {
                return None;
            }
            let star_inside =
                w.design.leads.count == 9 && sec == 1 && w.design.connection == Connection::Star;
            out.push(SectionFigure {
                phase: w.label(p).to_string(),
                section: sec + 1,
                between: between(w, p, sec),
                resistance_20c_ohm: v,
                reading_20c_ohm: if star_inside {
                    v + s.r[(p + 1) % 3][sec]
                } else {
                    v
                },
                temperature_c: 20.0,
                reading_ohm: 0.0,
            });
        }
    }
    for f in &mut out {
        f.reading_ohm = f.reading_20c_ohm;
    }
    Some(out)
}

/// The leads a section is measured across.
fn between(w: &Winding, p: usize, sec: usize) -> String {
    let (a, _) = section_lead(w.design.leads, p, sec, false);
    let (b, inside) = section_lead(w.design.leads, p, sec, true);
    if !inside {
        return format!("{a}-{b}");
    }
    match w.design.connection {
        // Nine-lead star: the second sections meet in the star point inside.
        Connection::Star => {
            let (next, _) = section_lead(w.design.leads, (p + 1) % 3, sec, false);
            format!("{a}-{next} ({b} in the star point)")
        }
        // Nine-lead delta: the finish is joined inside to the next phase's first start.
        Connection::Delta => {
            let (next, _) = section_lead(w.design.leads, (p + 1) % 3, 0, false);
            format!("{a}-{next} ({b} inside)")
        }
    }
}

/// Each of `values` over its expected value, against the median of all of them, per cent:
/// the typical value of its kind, which one phase or section out of line does not pull.
fn deviations(values: &[f64], expected: Option<&[f64]>) -> Vec<f64> {
    let ratios: Vec<f64> = values
        .iter()
        .enumerate()
        .map(|(i, v)| v / expected.map_or(1.0, |e| e[i]))
        .collect();
    let m = median(&ratios);
    ratios.iter().map(|r| (r / m - 1.0) * 100.0).collect()
}

/// Median of a short list (mean of the middle two for an even count).
fn median(v: &[f64]) -> f64 {
    let mut s = v.to_vec();
    s.sort_by(f64::total_cmp);
    let n = s.len();
    if n == 0 {
        return f64::NAN;
    }
    if n % 2 == 1 {
        s[n / 2]
    } else {
        (s[n / 2 - 1] + s[n / 2]) / 2.0
    }
}

/// Check `[measured]` against the card; `None` when nothing was measured or the winding is
/// not three-phase.
pub fn check(w: &Winding) -> Option<ResistanceCheck> {
    let meas = w.design.measured.as_ref()?;
    if w.geometry.phases != 3 {
        return None;
    }
    let wire = w.design.wire.as_ref().map(Wire::of);
    let material = wire
        .as_ref()
        .map_or(crate::design::Material::Copper, |x| x.material);
    let t = meas.temperature_c;
    let to_20 = |r: f64| r / metal(material).at_temperature(1.0, t);
    let labels = |p: usize| w.label(p).to_string();
    let tol = BALANCE_TOLERANCE_PERCENT;
    let spread = |m: &[f64]| {
        let mean = m.iter().sum::<f64>() / m.len() as f64;
        m.iter().map(|x| (x / mean - 1.0).abs()).fold(0.0, f64::max) * 100.0
    };
    // Phases (or sections) at 20 °C, what each is called, and their card values.
    let (taken, values, names, expected_each, line, phase_ohm, deviation) =
        match (&meas.section_resistance_ohm, meas.line_resistance_ohm) {
            (Some(v), _) => {
                let figures = section_figures(w);
                let mut vals: Vec<f64> = v.clone();
                if w.design.leads.count == 9 && w.design.connection == Connection::Star {
                    // The second sections' readings are between their free ends: a star.
                    let s = phases_from_lines([v[3], v[4], v[5]], Connection::Star);
                    vals[3..6].copy_from_slice(&s);
                }
                let star9 = w.design.leads.count == 9 && w.design.connection == Connection::Star;
                let names: Vec<(String, usize, String)> = (0..vals.len())
                    .map(|i| {
                        let (p, sec) = (i % 3, i / 3);
                        let between = figures
                            .as_ref()
                            .and_then(|f| f.get(i))
                            .map_or_else(|| labels(p), |f| f.between.clone());
                        // A nine-lead star's second section is worked out from the three
                        // pair readings, not read across one pair: say so.
                        let between = if star9 && sec == 1 {
                            let (a, _) = section_lead(w.design.leads, p, 1, false);
                            format!("{a}, from the three pair readings")
                        } else {
                            between
                        };
                        (labels(p), sec + 1, between)
                    })
                    .collect();
                let exp = figures.map(|f| f.iter().map(|x| x.resistance_20c_ohm).collect());
                (
                    Taken::Sections,
                    vals.iter().map(|r| to_20(*r)).collect::<Vec<f64>>(),
                    names,
                    exp,
                    None,
                    None,
                    // Each three alike (first sections; second sections or, on a nine-lead
                    // star, their pair readings) against their own mean.
                    v.chunks(3).map(&spread).fold(0.0, f64::max),
                )
            }
            (None, Some(m)) => {
                // Readings no network gives, or a delta with one phase open (its star arm
                // opposite at zero): no phase can be worked back; say so.
                if let Some(s) = impossible(w, m) {
                    return Some(ResistanceCheck {
                        taken: Taken::LineToLine,
                        measured_ohm: Some(m),
                        section_readings_ohm: None,
                        temperature_c: t,
                        expected_ohm: None,
                        deviation_percent: spread(&m),
                        tolerance_percent: tol,
                        ratio_to_expected: None,
                        phase_ohm: None,
                        judged: Vec::new(),
                        sound: false,
                        suggestion: s,
                    });
                }
                let ph = phases_from_lines(m, w.design.connection);
                let exp: Option<Vec<f64>> = super::phase_resistances_20c(w)
                    .filter(|r| r.len() == 3 && r.iter().all(|x| x.is_finite() && *x > 0.0));
                (
                    Taken::LineToLine,
                    ph.iter().map(|r| to_20(*r)).collect(),
                    (0..3).map(|p| (labels(p), 1, labels(p))).collect(),
                    exp,
                    Some(m),
                    Some(ph),
                    spread(&m),
                )
            }
            (None, None) => return None,
        };
    let devs = deviations(&values, expected_each.as_deref());
    let judged: Vec<Judged> = values
        .iter()
        .zip(&devs)
        .zip(&names)
        .enumerate()
        .map(|(i, ((v, d), (phase, section, between)))| Judged {
            phase: phase.clone(),
            section: *section,
            between: between.clone(),
            measured_20c_ohm: *v,
            expected_20c_ohm: expected_each.as_ref().map(|e| e[i]),
            deviation_percent: *d,
            within_tolerance: d.is_finite() && d.abs() <= tol,
        })
        .collect();
    let ratio = expected_each
        .as_ref()
        .map(|e| values.iter().sum::<f64>() / e.iter().sum::<f64>());
    let expected_lines = match taken {
        Taken::LineToLine => planned_line_resistances(w)
            .filter(|e| e.iter().all(|x| x.is_finite() && *x > 0.0))
            .map(|e| e.map(|r| metal(material).at_temperature(r, t))),
        Taken::Sections => None,
    };
    let balanced = judged.iter().all(|j| j.within_tolerance);
    let near = ratio.is_none_or(|r| (r - 1.0).abs() * 100.0 <= FAR_PERCENT);
    let suggestion = if balanced && near {
        Suggestion::AsExpected
    } else if balanced {
        uniform(w, ratio.unwrap_or(1.0), wire.as_ref())
    } else {
        one_apart(w, &judged, wire.as_ref(), taken)
    };
    Some(ResistanceCheck {
        taken,
        measured_ohm: line,
        section_readings_ohm: meas.section_resistance_ohm.clone(),
        temperature_c: t,
        expected_ohm: expected_lines,
        deviation_percent: deviation,
        tolerance_percent: tol,
        ratio_to_expected: ratio,
        phase_ohm,
        judged,
        sound: balanced && near,
        suggestion,
    })
}

/// Line readings that cannot be worked back into phases: a delta with one phase open (the
/// other two phases' readings add up to the third, so the star arm opposite is zero), or
/// readings that break the triangle rule of resistor networks (an arm below zero).
fn impossible(w: &Winding, m: [f64; 3]) -> Option<Suggestion> {
    // Measured against the smallest reading: an open phase's overload reading must not
    // make a real arm look like zero.
    let least = m.iter().copied().fold(f64::INFINITY, f64::min);
    let arms = [0, 1, 2].map(|k| (m[k] + m[(k + 2) % 3] - m[(k + 1) % 3]) / 2.0);
    let (k, arm) = arms
        .iter()
        .copied()
        .enumerate()
        .min_by(|a, b| a.1.total_cmp(&b.1))?;
    // Within 1 % of the smallest reading counts as zero (meter and contact spread).
    if arm > 0.01 * least {
        return None;
    }
    if arm < -0.01 * least {
        return Some(Suggestion::Inconsistent);
    }
    if w.design.connection == Connection::Star {
        // A star arm at zero is a phase of no resistance (shorted through): judged below.
        return None;
    }
    // Delta phase j lies opposite star terminal j + 2: the arm at terminal k belongs to
    // phase k + 1 (mod 3).
    Some(Suggestion::OpenInDelta {
        phase: w.label((k + 1) % 3).to_string(),
    })
}

/// The suggestion when one phase or section stands apart from the others (which agree
/// among themselves): by its sign and size.
fn one_apart(w: &Winding, judged: &[Judged], wire: Option<&Wire>, taken: Taken) -> Suggestion {
    let Some((i, worst)) = judged.iter().enumerate().max_by(|a, b| {
        a.1.deviation_percent
            .abs()
            .total_cmp(&b.1.deviation_percent.abs())
    }) else {
        return Suggestion::Scattered;
    };
    // The others must be within tolerance: one apart, not a scatter.
    let agree = judged
        .iter()
        .enumerate()
        .all(|(j, x)| j == i || x.within_tolerance);
    if !agree {
        return Suggestion::Scattered;
    }
    // Its ratio to the mean of the others.
    let rel = |x: &Judged| x.measured_20c_ohm / x.expected_20c_ohm.unwrap_or(1.0);
    let others: Vec<f64> = judged
        .iter()
        .enumerate()
        .filter(|(j, _)| *j != i)
        .map(|(_, x)| rel(x))
        .collect();
    let r = rel(worst) / (others.iter().sum::<f64>() / others.len() as f64);
    let phase = match taken {
        Taken::LineToLine => worst.phase.clone(),
        Taken::Sections => worst.between.clone(),
    };
    let near = |x: f64| (r / x - 1.0).abs() < 0.03;
    let a = w.parallel_paths as f64;
    let s = wire.map_or(1, |x| x.strands_in_hand);
    if r >= OPEN_RATIO {
        Suggestion::Open { phase, ratio: r }
    } else if (taken == Taken::LineToLine || w.design.leads.count == 6)
        && a >= 2.0
        && near(a / (a - 1.0))
    {
        Suggestion::PathOpen { phase, ratio: r }
    } else if s >= 2 && near(s as f64 / (s as f64 - 1.0)) {
        Suggestion::StrandOpen {
            phase,
            ratio: r,
            strands: s,
        }
    } else if r > 1.0 {
        Suggestion::High { phase, ratio: r }
    } else {
        Suggestion::Low { phase, ratio: r }
    }
}

/// What a uniform ratio of measured to expected suggests.
fn uniform(w: &Winding, r: f64, wire: Option<&Wire>) -> Suggestion {
    // Linked another way than planned: series sections read 4 times parallel ones (twice
    // the path, each path twice the phase's), and a line reading in star is 3 times the
    // same phases' in delta (2R against 2R/3).
    let near = |x: f64| (r / x - 1.0).abs() < 0.03;
    let other = match (w.design.leads.count >= 9, w.design.connection) {
        (true, _) if near(4.0) => Some("series (the higher voltage)"),
        (_, Connection::Delta) if near(3.0) => Some("star"),
        (_, Connection::Star) if near(1.0 / 3.0) => Some("delta"),
        _ => None,
    };
    if let Some(as_if) = other {
        return Suggestion::OtherConnection {
            ratio: r,
            as_if: as_if.to_string(),
        };
    }
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
        let d = wr.diameter / r.sqrt();
        let iec_step =
            iec_60317().any(|x| (x / d - 1.0).abs() < 0.01 && (x / wr.diameter - 1.0).abs() > 0.01);
        let awg_step = wr.awg.is_some() && {
            let step = 92f64.powf(2.0 / 39.0);
            (r / step - 1.0).abs() < 0.02 || (r * step - 1.0).abs() < 0.02
        };
        if iec_step || awg_step {
            return Suggestion::WireSizeStep {
                ratio: r,
                diameter: d,
            };
        }
    }
    Suggestion::TurnsOrWire { ratio: r }
}

#[cfg(test)]
mod tests {
    use super::super::leads::{SectionResistance, Sections};
    use super::*;

    // Round trip of the star and delta reductions: phases → readings → phases.
    #[test]
    fn phases_come_back_from_readings() {
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

    // One value 3 % above two equal others is 3 % from their median, though only +1.98 %
    // from the mean of all three; the two others stay at 0 (arithmetic).
    #[test]
    fn each_is_judged_against_the_median() {
        let d = deviations(&[1.03, 1.0, 1.0], None);
        assert!((d[0] - 3.0).abs() < 1e-9);
        assert!(d[1].abs() < 1e-12 && d[2].abs() < 1e-12);
        let d = deviations(&[0.96, 1.0, 1.0, 1.0, 1.0, 1.0], None);
        assert!((d[0] + 4.0).abs() < 1e-9 && d[5].abs() < 1e-12);
    }
}
