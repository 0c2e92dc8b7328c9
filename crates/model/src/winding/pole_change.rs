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

/// Whether `slots` can carry a pole-changing winding for `poles` and twice as many: three
/// phases, an even pole count, and whole slots per pole and phase at `poles`, so each
/// phase's two halves (180° apart there) fall at the same electrical places at twice the
/// poles and both counts balance.
pub fn fits(slots: usize, poles: usize, phases: usize) -> bool {
    phases == 3 && poles >= 2 && poles.is_multiple_of(2) && slots.is_multiple_of(phases * poles)
}

/// Whether coil `c` of `w` is in its phase's reversed half: the coils reaching backwards
/// from their go sides (the reversed groups as laid out), whose current reverses between
/// the speeds.
pub fn in_reversed_half(w: &Winding, c: &super::Coil) -> bool {
    w.span(c) < 0
}

/// A pole-changing winding's lower speed as a winding of its own: at twice the poles
/// ([`at_double_poles`]), in the series connection of that speed, with no second speed of
/// its own; `None` for a winding that does not change poles.
pub fn lower_speed(w: &Winding) -> Option<Winding> {
    let pc = w.design.pole_change?;
    let mut d = at_double_poles(w);
    d.design.pole_change = None;
    d.design.connection = pc.lower_connection();
    Some(d)
}

/// `w` (a rotary winding at its own pole count) at twice the poles, with the coils of its
/// reversed groups turned back, as the series connection of a pole-changing winding
/// joins them.
pub fn at_double_poles(w: &Winding) -> Winding {
    let g = &w.geometry;
    let mut d = w.clone();
    d.geometry = Geometry::rotary(g.slots, 2 * g.poles, g.phases, g.layers);
    d.design.poles = 2 * g.poles;
    for (c, old) in d.coils.iter_mut().zip(&w.coils) {
        if in_reversed_half(w, old) {
            std::mem::swap(&mut c.go, &mut c.back);
            std::mem::swap(&mut c.go_layer, &mut c.back_layer);
        }
    }
    d
}

/// The six leads of a pole-changing winding, as network nodes: the three ends of the series
/// connection (`End`, marked 1U 1V 1W or T1 T2 T3: the lower speed's line leads) and the
/// three taps between each phase's halves (`Tap`, 2U 2W 2V or T4 T6 T5 for phases U, V,
/// W: see [`Lead::name`]). A star-connected winding has its star point inside as a seventh
/// node. Build them with [`Lead::end`] and [`Lead::tap`], which keep the phase in 0..3.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Lead {
    /// The end of phase `0..3`'s series connection.
    End(usize),
    /// The tap between phase `0..3`'s halves.
    Tap(usize),
}

impl Lead {
    /// The end of phase `p` (taken modulo 3).
    pub const fn end(p: usize) -> Lead {
        Lead::End(p % 3)
    }

    /// The tap of phase `p` (taken modulo 3).
    pub const fn tap(p: usize) -> Lead {
        Lead::Tap(p % 3)
    }

    /// The phase the lead belongs to.
    pub fn phase(self) -> usize {
        match self {
            Lead::End(p) | Lead::Tap(p) => p % 3,
        }
    }

    /// Node number in [`six_leads`]: ends 0..3, taps 3..6 (the star point is 6).
    pub fn node(self) -> usize {
        match self {
            Lead::End(p) => p % 3,
            Lead::Tap(p) => 3 + p % 3,
        }
    }

    /// The lead's marking. The standards' connection tables for one-winding two-speed
    /// motors put L1, L2, L3 on 1U, 1V, 1W (NEMA T1, T2, T3) at the lower speed and on 2W,
    /// 2U, 2V (T6, T4, T5) at the higher (NEMA MG 1 and IEC 60034-8 usage, from memory; a
    /// reviewer found the same tables printed in EASA's *Electrical Engineering Handbook*,
    /// three-phase two-speed single-winding motors; IEC diagrams also print the higher
    /// speed as 2U, 2V, 2W on L1, L2, L3, a cyclic shift that turns the same way).
    ///
    /// The lower speed's sequence is negative (every angle doubles: V, 120° after U, is
    /// 240° after it), so for both tables to turn the field the same way the higher one
    /// must feed the phases in odd order: the taps are named so, phase U's tap 2U (T4),
    /// phase V's 2W (T6), phase W's 2V (T5). `tests/two_speed_sheet.rs` checks the
    /// rotation from the sheet alone.
    pub fn name(self, marking: crate::design::Marking) -> String {
        let (speed, letter) = match self {
            Lead::End(p) => (1, p % 3),
            Lead::Tap(p) => (2, [0, 2, 1][p % 3]),
        };
        match marking {
            crate::design::Marking::Iec => format!("{speed}{}", ["U", "V", "W"][letter]),
            crate::design::Marking::Nema => format!("T{}", 3 * (speed - 1) + letter + 1),
        }
    }
}

/// The leads the supply lines L1, L2, L3 go on at one speed, and the leads linked together
/// there (the rest are left open, each insulated apart).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Board {
    /// The leads of L1, L2, L3 (the standards' table; `speeds` exchanges two only if the
    /// computed rotations differ, which these tables never give).
    pub lines: [Lead; 3],
    /// The leads linked together (the higher speed's ends: its second star point in star /
    /// double star, its only one in delta / double star).
    pub linked: &'static [Lead],
}

/// The lower speed (twice the poles): L1, L2, L3 on 1U, 1V, 1W, the halves of each phase in
/// series, the taps open.
pub const LOW_SPEED: Board = Board {
    lines: [Lead::end(0), Lead::end(1), Lead::end(2)],
    linked: &[],
};

/// The higher speed (the poles as laid out): L1, L2, L3 on 2W, 2U, 2V (the taps of phases
/// V, U, W), the ends linked, so each phase's halves run in parallel from its tap, one of
/// them backwards: a double star.
pub const HIGH_SPEED: Board = Board {
    lines: [Lead::tap(1), Lead::tap(0), Lead::tap(2)],
    linked: &[Lead::end(0), Lead::end(1), Lead::end(2)],
};

/// True when L1, L2, L3 in positive sequence on `board` feed the phases in positive order
/// (U, V, W or a cyclic shift of it).
pub fn feeds_in_order(board: &Board) -> bool {
    let p = board.lines.map(Lead::phase);
    (p[1] + 3 - p[0]) % 3 == 1 && (p[2] + 3 - p[1]) % 3 == 1
}

/// Each phase's halves between the leads: (phase, reversed, from, to), `None` being the
/// star point. The reversed half (the groups [`at_double_poles`] turns back) runs from the
/// phase's end to its tap, the forward half from the tap on to the next phase's end (series
/// delta) or to the star point (series star).
pub fn six_leads_halves(
    connection: crate::design::PoleChange,
) -> [(usize, bool, Option<Lead>, Option<Lead>); 6] {
    use crate::design::PoleChange;
    let on = |p: usize| match connection {
        PoleChange::DeltaDoubleStar => Some(Lead::end(p + 1)),
        PoleChange::StarDoubleStar => None,
    };
    let half = |k: usize| {
        let p = k / 2;
        if k.is_multiple_of(2) {
            (p, true, Some(Lead::end(p)), Some(Lead::tap(p)))
        } else {
            (p, false, Some(Lead::tap(p)), on(p))
        }
    };
    [half(0), half(1), half(2), half(3), half(4), half(5)]
}

/// The winding between its six leads as a resistor network (nodes [`Lead::node`], the
/// star point 6), from each phase's reversed and forward halves at one temperature (ohms).
pub fn six_leads(
    connection: crate::design::PoleChange,
    reversed_ohm: [f64; 3],
    forward_ohm: [f64; 3],
) -> crate::network::Network {
    let node = |l: Option<Lead>| l.map_or(6, Lead::node);
    let mut n = crate::network::Network::new(7);
    for (p, reversed, from, to) in six_leads_halves(connection) {
        let ohm = if reversed {
            reversed_ohm[p]
        } else {
            forward_ohm[p]
        };
        n.add(node(from), node(to), ohm);
    }
    n
}
