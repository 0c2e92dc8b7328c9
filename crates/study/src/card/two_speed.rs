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
    let poles = w.geometry.poles;
    Some(SixLeads {
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
