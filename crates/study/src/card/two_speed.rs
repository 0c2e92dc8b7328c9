//! A pole-changing winding's six leads on the card: each phase's halves, and the resistance
//! a meter reads between leads as the motor is delivered (nothing linked) and at each
//! speed's connection, by nodal analysis of the halves as
//! [`pole_change::six_leads`](crate::winding::pole_change::six_leads) joins them.
//!
//! With equal halves R/2 (R a whole phase), the readings have closed forms a shop can check
//! by hand (series and parallel resistors, any circuits text):
//! - series delta: end to end R ∥ 2R = 2R/3; tap to tap also 2R/3 (R one way round the
//!   delta, 2R the other); the double star, ends linked, tap to tap 2·(R/2 ∥ R/2) = R/2;
//! - series star: end to end 2R; tap to tap R; the double star tap to tap R/2.

use serde::Serialize;

use crate::design::PoleChange;
use crate::winding::Winding;
use crate::winding::pole_change::{self, Board, Lead};

/// One phase's two halves at 20 °C.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Halves {
    /// Phase label.
    pub phase: String,
    /// The half from the phase's end to its tap (the reversed groups as laid out, whose
    /// current reverses between the speeds), ohms.
    pub reversed_ohm: f64,
    /// The half from the tap on (to the next phase's end in delta, to the star point in
    /// star), ohms.
    pub forward_ohm: f64,
}

/// One reading between two leads at 20 °C.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LeadReading {
    /// The two leads, as marked.
    pub between: [String; 2],
    /// Ohms at 20 °C.
    pub ohm: f64,
}

/// Line-to-line readings on one speed's board, links made, lines off.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SpeedReadings {
    /// Poles at this speed.
    pub poles: usize,
    /// The leads linked on this board.
    pub linked: Vec<String>,
    /// Between the leads the board puts L1 and L2, L2 and L3, L3 and L1 on (the standards'
    /// table, before any exchange of lines).
    pub lines: Vec<LeadReading>,
}

/// The six leads' resistances of a pole-changing winding at 20 °C.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct SixLeads {
    /// The connection.
    pub pole_change: PoleChange,
    /// Each phase's halves.
    pub halves: Vec<Halves>,
    /// As delivered, nothing linked: end to end, tap to tap, and each phase's end to its
    /// own tap.
    pub delivered: Vec<LeadReading>,
    /// On each speed's board: the lower speed (twice the poles) first.
    pub speeds: Vec<SpeedReadings>,
    /// The readings of `[measured] six_lead_ohm`, judged against `delivered`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub measured: Option<LeadCheck>,
}

/// A pole-changing winding's readings between its six leads, against the card: as marked,
/// or with two leads' markings exchanged (an end and a tap, two ends, two taps: a half
/// brought out on the wrong lead).
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LeadCheck {
    /// Temperature of the readings, °C.
    pub temperature_c: f64,
    /// The readings at 20 °C, in `delivered`'s order.
    pub readings_20c_ohm: Vec<f64>,
    /// Largest departure of a reading from the card's, as marked, per cent.
    pub worst_percent: f64,
    /// True when every reading is within [`FAR_PERCENT`](super::measured::FAR_PERCENT) of
    /// the card's.
    pub as_marked: bool,
    /// The exchanges of two leads' markings under which every reading agrees instead (empty
    /// when the readings agree as marked, or no single exchange explains them).
    pub exchanged: Vec<[String; 2]>,
}

/// The six leads' figures of `w` at 20 °C; `None` when `w` is not pole-changing or a half
/// has no resistance to give (no wire and no phase resistance, no mean turn, or no coils).
pub fn six_leads(w: &Winding) -> Option<SixLeads> {
    let pc = w.design.pole_change?;
    if w.geometry.phases != 3 {
        return None;
    }
    let (mut rev, mut fwd) = ([0.0; 3], [0.0; 3]);
    if let Some(wire) = w.design.wire.as_ref().map(crate::wire::Wire::of) {
        for c in &w.coils {
            let r = super::coil_resistance_20c(w, c, &wire)?;
            let half = if pole_change::in_reversed_half(w, c) {
                &mut rev
            } else {
                &mut fwd
            };
            half[c.phase % 3] += r;
        }
    } else {
        // A phase resistance given without wire: each half is half of it.
        let r = w.design.phase_resistance_ohm? / 2.0;
        (rev, fwd) = ([r; 3], [r; 3]);
    }
    if rev.iter().chain(&fwd).any(|r| !(r.is_finite() && *r > 0.0)) {
        return None;
    }
    let net = pole_change::six_leads(pc, rev, fwd);
    let marking = w.design.leads.marking;
    let reading = |n: &crate::network::Network, a: Lead, b: Lead| -> Option<LeadReading> {
        Some(LeadReading {
            between: [a.name(marking), b.name(marking)],
            ohm: n.between(a.node(), b.node())?,
        })
    };
    let mut delivered = Vec::new();
    for p in 0..3 {
        delivered.push(reading(&net, Lead::end(p), Lead::end(p + 1))?);
    }
    for p in 0..3 {
        delivered.push(reading(&net, Lead::tap(p), Lead::tap(p + 1))?);
    }
    for p in 0..3 {
        delivered.push(reading(&net, Lead::end(p), Lead::tap(p))?);
    }
    let on = |board: &Board, poles: usize| -> Option<SpeedReadings> {
        let nodes: Vec<usize> = board.linked.iter().map(|l| l.node()).collect();
        let linked = net.linked(&nodes);
        let lines = (0..3)
            .map(|k| reading(&linked, board.lines[k], board.lines[(k + 1) % 3]))
            .collect::<Option<Vec<_>>>()?;
        Some(SpeedReadings {
            poles,
            linked: board.linked.iter().map(|l| l.name(marking)).collect(),
            lines,
        })
    };
    let measured = w
        .design
        .measured
        .as_ref()
        .and_then(|m| Some((m.six_lead_ohm.as_ref()?, m.temperature_c)))
        .and_then(|(v, t)| lead_check(w, &net, &delivered, v, t));
    let poles = w.geometry.poles;
    Some(SixLeads {
        measured,
        pole_change: pc,
        halves: (0..3)
            .map(|p| Halves {
                phase: w.label(p).to_string(),
                reversed_ohm: rev[p],
                forward_ohm: fwd[p],
            })
            .collect(),
        delivered,
        speeds: vec![
            on(&pole_change::LOW_SPEED, 2 * poles)?,
            on(&pole_change::HIGH_SPEED, poles)?,
        ],
    })
}

/// The six leads, in the order `delivered` pairs them: ends, then taps.
const LEADS: [Lead; 6] = [
    Lead::end(0),
    Lead::end(1),
    Lead::end(2),
    Lead::tap(0),
    Lead::tap(1),
    Lead::tap(2),
];

/// The pairs `delivered` reads, as indices into [`LEADS`].
const PAIRS: [(usize, usize); 9] = [
    (0, 1),
    (1, 2),
    (2, 0),
    (3, 4),
    (4, 5),
    (5, 3),
    (0, 3),
    (1, 4),
    (2, 5),
];

/// Readings `v` at `t` °C between the six leads (`delivered`'s order) judged against the
/// network of halves `net`: as marked, and under every exchange of two leads' markings.
fn lead_check(
    w: &Winding,
    net: &crate::network::Network,
    delivered: &[LeadReading],
    v: &[f64],
    t: f64,
) -> Option<LeadCheck> {
    if v.len() != PAIRS.len() || delivered.len() != PAIRS.len() {
        return None;
    }
    let material = w
        .design
        .wire
        .as_ref()
        .map(|x| x.material)
        .unwrap_or_default();
    let to_20 = |r: f64| r / crate::wire::metal(material).at_temperature(1.0, t);
    let readings: Vec<f64> = v.iter().map(|r| to_20(*r)).collect();
    // The largest departure, per cent, of the readings from what the network gives with
    // the markings of leads `a` and `b` exchanged (none when a == b).
    let worst = |a: usize, b: usize| -> Option<f64> {
        let at = |i: usize| {
            let j = if i == a {
                b
            } else if i == b {
                a
            } else {
                i
            };
            LEADS[j].node()
        };
        PAIRS
            .iter()
            .zip(&readings)
            .map(|(&(x, y), r)| {
                let want = net.between(at(x), at(y))?;
                Some(100.0 * (r - want).abs() / want)
            })
            .try_fold(0.0f64, |m, d| d.map(|d| m.max(d)))
    };
    let far = super::measured::FAR_PERCENT;
    let as_marked_worst = worst(0, 0)?;
    let marking = w.design.leads.marking;
    let exchanged = if as_marked_worst <= far {
        Vec::new()
    } else {
        (0..6)
            .flat_map(|a| (a + 1..6).map(move |b| (a, b)))
            .filter(|&(a, b)| worst(a, b).is_some_and(|d| d <= far))
            .map(|(a, b)| [LEADS[a].name(marking), LEADS[b].name(marking)])
            .collect()
    };
    Some(LeadCheck {
        temperature_c: t,
        readings_20c_ohm: readings,
        worst_percent: as_marked_worst,
        as_marked: as_marked_worst <= far,
        exchanged,
    })
}
