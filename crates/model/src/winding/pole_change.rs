//! A pole-changing winding's second speed: the same coils at twice the pole count, joined
//! as the series connection joins them (consequent poles).
//!
//! The winding is laid out at the lower pole count 2p (the higher speed) with 60° phase
//! belts; each phase's groups alternate in polarity, the reversed ones being the half that
//! the double-star connection reverses. In series, for 4p poles, that half carries current
//! the other way: every coil of a phase then goes forward, and its groups make poles of one
//! polarity with the poles of the other between them. At 4p a slot pitch is twice the
//! electrical angle, so the two halves, 180° apart at 2p, lie at the same electrical place
//! and each phase spreads over 120°; phase V, 120° after U at 2p, is 240° after it at 4p,
//! so the sequence comes out negative (M. G. Say, *Alternating Current Machines*, 5th ed.,
//! ch. on speed control, pole-amplitude and consequent-pole windings, from memory; the
//! angles follow from the slot angle alone).

use super::{Geometry, Winding};

/// `w` (a rotary winding at its own pole count) at twice the poles, with the coils of its
/// reversed groups turned back, as the series connection of a pole-changing winding
/// joins them.
pub fn at_double_poles(w: &Winding) -> Winding {
    let g = &w.geometry;
    let mut d = w.clone();
    d.geometry = Geometry::rotary(g.slots, 2 * g.poles, g.phases, g.layers);
    d.design.poles = 2 * g.poles;
    for (c, old) in d.coils.iter_mut().zip(&w.coils) {
        if w.span(old) < 0 {
            std::mem::swap(&mut c.go, &mut c.back);
            std::mem::swap(&mut c.go_layer, &mut c.back_layer);
        }
    }
    d
}
