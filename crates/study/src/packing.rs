//! Round wires laid in a slot: the one packing rule that the slot-section sheet draws and
//! the sizing holds a wire to. Wires over the enamel are laid from the slot bottom in close
//! (hexagonal) rows between the liners; each coil side starts on a fresh row over a layer
//! separator; nothing goes above the wedge. A count that does not go in this way will not
//! go in by hand either (common practice: random-wound coils settle into rows at best).

use crate::iron::{LINER, WEDGE};
use crate::units::Length;
use crate::winding::Winding;

/// Thickness of the separator between two coil sides in one slot: 0.3 mm (common practice
/// for low-voltage random windings, from memory).
pub const SEPARATOR: Length = Length::from_mm(0.3);

/// A slot's outline, metres (the packing's and the slot-section sheet's working numbers).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Outline {
    /// Width at the gap.
    pub top: f64,
    /// Width at the bottom.
    pub bottom: f64,
    /// Depth from the gap to the bottom.
    pub depth: f64,
    /// Opening at the gap.
    pub opening: f64,
}

impl Outline {
    /// The slot of `w`'s core, when its width and depth are known.
    pub fn of(w: &Winding) -> Option<Outline> {
        let c = &w.design.core;
        let top = c.slot_width.map(Length::m)?;
        Some(Outline {
            top,
            bottom: c.slot_bottom_width.map(Length::m).unwrap_or(top),
            depth: c.slot_depth.map(Length::m)?,
            opening: w.design.slot_opening.map(Length::m).unwrap_or(top).min(top),
        })
    }

    /// Width at depth `y` from the gap, m.
    pub fn width_at(&self, y: f64) -> f64 {
        self.top + (self.bottom - self.top) * (y / self.depth)
    }
}

/// One wire laid: its centre (m from the slot's centre line and from the gap) and coil side.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Laid {
    /// Across the slot, m (0 at the centre line).
    pub x: f64,
    /// Depth from the gap, m.
    pub y: f64,
    /// Index of the coil side (0 the bottom one).
    pub side: usize,
}

/// Where the wires of a slot go.
#[derive(Debug, Clone, PartialEq)]
pub struct Packing {
    /// Every wire laid, bottom first.
    pub laid: Vec<Laid>,
    /// Depths of the separators between coil sides, m.
    pub separators: Vec<f64>,
    /// Wires asked for.
    pub wanted: u64,
}

impl Packing {
    /// True when every wire went in.
    pub fn fits(&self) -> bool {
        self.laid.len() as u64 == self.wanted
    }
}

/// Lay `sides` (wires per coil side, bottom side first) of overall diameter `d` (m) in `o`.
pub fn pack(o: &Outline, d: f64, sides: &[u64]) -> Packing {
    let (liner, wedge, separator) = (LINER.m(), WEDGE.m(), SEPARATOR.m());
    let wanted: u64 = sides.iter().sum();
    let mut laid = Vec::with_capacity(wanted.min(10_000) as usize);
    let mut separators = Vec::new();
    let pitch = d * 3f64.sqrt() / 2.0;
    let mut y = o.depth - liner - d / 2.0;
    'sides: for (side, &n) in sides.iter().enumerate() {
        if side > 0 && !laid.is_empty() {
            // A fresh row over the separator: the last row's top, the separator, then a
            // whole wire.
            separators.push(y - d / 2.0 - separator / 2.0);
            y -= d + separator;
        }
        let mut left = n;
        let mut row = 0usize;
        while left > 0 {
            if y - d / 2.0 < wedge {
                break 'sides;
            }
            let half = o.width_at(y) / 2.0 - liner - d / 2.0;
            let shift = if row % 2 == 1 { d / 2.0 } else { 0.0 };
            let mut x = -half + shift;
            let mut in_row = 0;
            while x <= half + 1e-12 && left > 0 {
                laid.push(Laid { x, y, side });
                left -= 1;
                in_row += 1;
                x += d;
            }
            if in_row == 0 {
                // Narrower than one wire here: no more rows fit.
                break 'sides;
            }
            if left > 0 {
                y -= pitch;
                row += 1;
            }
        }
    }
    Packing {
        laid,
        separators,
        wanted,
    }
}

/// The fullest slot as the slot-section sheet draws it: which slot (0-based), its coil
/// sides (phase, turns; bottom first), its outline, the wires each side needs (turns ×
/// strands) and, when the wire is known, where the packing rule lays them.
#[derive(Debug, Clone, PartialEq)]
pub struct SlotPacking {
    /// The fullest slot, 0-based.
    pub slot: usize,
    /// Its coil sides, bottom layer first, as (phase, turns).
    pub sides: Vec<(usize, u32)>,
    /// The slot's outline.
    pub outline: Outline,
    /// Wires each side needs: turns × strands in hand.
    pub wires: Vec<u64>,
    /// The wires laid, when the wire (its diameter over the enamel) is known.
    pub laid: Option<Packing>,
}

/// The fullest slot of `w` packed by the rule of [`pack`], when the slot's width and depth
/// are known: the section sheet's one report.
pub fn slot_packing(w: &Winding) -> Option<SlotPacking> {
    crate::runs::count(crate::runs::Analysis::Packing);
    let outline = Outline::of(w)?;
    let (slot, sides) = fullest(w);
    let wire = w.design.wire.as_ref().map(crate::wire::Wire::of);
    let strands = wire.as_ref().map_or(1, |x| x.strands_in_hand);
    let wires: Vec<u64> = sides
        .iter()
        .map(|(_, t)| *t as u64 * strands as u64)
        .collect();
    let laid = wire.map(|x| pack(&outline, x.insulated_diameter.m(), &wires));
    Some(SlotPacking {
        slot,
        sides,
        outline,
        wires,
        laid,
    })
}

/// The fullest slot of `w` (0-based) and its coil sides, bottom layer first, as (phase,
/// turns).
pub fn fullest(w: &Winding) -> (usize, Vec<(usize, u32)>) {
    let mut sides: Vec<Vec<(usize, usize, u32)>> = vec![Vec::new(); w.geometry.slots];
    for c in &w.coils {
        sides[c.go].push((c.go_layer, c.phase, c.turns));
        sides[c.back].push((c.back_layer, c.phase, c.turns));
    }
    let (slot, mut list) = sides
        .into_iter()
        .enumerate()
        .max_by_key(|(k, l)| (l.iter().map(|x| x.2).sum::<u32>(), std::cmp::Reverse(*k)))
        .unwrap_or((0, Vec::new()));
    // Layer 1 is the bottom (away from the gap): laid first.
    list.sort_by_key(|x| std::cmp::Reverse(x.0));
    (slot, list.into_iter().map(|x| (x.1, x.2)).collect())
}

/// The fullest slot of `w` packed with wire of overall diameter `d` and `strands` in hand,
/// when the slot's outline is known.
pub fn of(w: &Winding, d: f64, strands: u32) -> Option<Packing> {
    let o = Outline::of(w)?;
    let (_, sides) = fullest(w);
    let wires: Vec<u64> = sides
        .iter()
        .map(|(_, t)| *t as u64 * strands as u64)
        .collect();
    Some(pack(&o, d, &wires))
}

#[cfg(test)]
mod tests {
    use super::*;

    // A rectangular slot 10 mm wide, 20 mm deep, wire 1 mm over the enamel: between the
    // 0.3 mm liners 9.4 mm leave 9 wires in an even row and 8 in a shifted one (geometry).
    #[test]
    fn rows_alternate_between_the_liners() {
        let o = Outline {
            top: 0.010,
            bottom: 0.010,
            depth: 0.020,
            opening: 0.003,
        };
        let p = pack(&o, 1e-3, &[17]);
        assert!(p.fits());
        let first: Vec<_> = p.laid.iter().filter(|l| l.y == p.laid[0].y).collect();
        assert_eq!(first.len(), 9);
        assert_eq!(p.laid.len() - first.len(), 8);
    }

    #[test]
    fn a_second_side_starts_over_a_separator_and_too_many_do_not_fit() {
        let o = Outline {
            top: 0.010,
            bottom: 0.010,
            depth: 0.020,
            opening: 0.003,
        };
        let p = pack(&o, 1e-3, &[5, 5]);
        assert!(p.fits());
        assert_eq!(p.separators.len(), 1);
        // The second side's row lies a wire and a separator above the first's.
        let y0 = p.laid[0].y;
        let y1 = p.laid[5].y;
        assert!((y0 - y1 - (1e-3 + SEPARATOR.m())).abs() < 1e-15);
        // Depth 20 mm less liner and wedge holds at most 20 close rows of about 9 wires.
        assert!(!pack(&o, 1e-3, &[400]).fits());
    }
}
