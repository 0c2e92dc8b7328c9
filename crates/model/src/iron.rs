//! The core's iron: the sections the flux passes through (teeth at their narrowest, the back
//! iron) and the share of the stack that is steel. One rule for the parser, which refuses a
//! core that does not close, and for every analysis that works out flux densities.
//!
//! Slots and teeth are parallel-sided (the two shapes a shop can measure with calipers): a
//! parallel-sided slot of width b_s leaves teeth that widen away from the gap, narrowest at
//! the bore, t = π·D/Z − b_s; a parallel-sided tooth of width t leaves slots that widen
//! instead. On a flat primary both are parallel and t = τ_s − b_s. Tooth tips and the slot
//! opening are not counted: the tooth body is where the flux is densest (common practice).

use std::f64::consts::PI;

use crate::design::Topology;
use crate::units::{Area, Length};

/// Stacking factor (steel over stack length) when not given: 0.95 for 0.5 mm laminations
/// with a thin coating (common practice, from memory: 0.93–0.97 is usual).
pub const DEFAULT_STACKING_FACTOR: f64 = 0.95;

/// How far measured sizes may disagree with each other (tooth + slot against the slot
/// pitch at the bore; back-iron depth against the outside diameter) before the core is
/// refused: 2 % of the larger size, or 0.2 mm, whichever is more (calipers on a used core;
/// common practice).
pub const GEOMETRY_TOLERANCE: f64 = 0.02;

/// Absolute part of [`GEOMETRY_TOLERANCE`]: 0.2 mm.
pub const GEOMETRY_TOLERANCE_ABS: Length = Length::from_mm(0.2);

/// Slot liner thickness taken off each side and the bottom of a slot for its usable area:
/// 0.3 mm (common practice for low-voltage random windings, from memory).
pub const LINER: Length = Length::from_mm(0.3);

/// Depth at the slot's mouth taken by the tooth tips, the wedge or top stick: 2 mm (common
/// practice, from memory).
pub const WEDGE: Length = Length::from_mm(2.0);

/// The area a slot of mean width `b` and depth `h` leaves for the wire once the liner and
/// wedge are in: (b − 2·liner)·(h − liner − wedge); `None` when nothing is left.
pub fn usable_area(b: Length, h: Length) -> Option<Area> {
    let (w, d) = (b - 2.0 * LINER, h - LINER - WEDGE);
    (w > Length::ZERO && d > Length::ZERO).then_some(w * d)
}

/// The sizes of a core as measured; any may be missing.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Measured {
    /// Slot pitch at the gap (flat primary), or `None` to take it from the bore.
    pub slot_pitch: Option<Length>,
    /// Bore diameter (rotary).
    pub bore: Option<Length>,
    /// Outside diameter of the lamination (rotary).
    pub outside_diameter: Option<Length>,
    /// Back-iron (yoke) depth behind the slots.
    pub yoke_depth: Option<Length>,
    /// Width of a parallel-sided tooth.
    pub tooth_width: Option<Length>,
    /// Width of a parallel-sided slot.
    pub slot_width: Option<Length>,
    /// Slot depth from the gap to the slot bottom.
    pub slot_depth: Option<Length>,
}

/// A size of the core, for naming the keys of a core that does not close.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Size {
    /// Bore diameter.
    Bore,
    /// Slot pitch.
    SlotPitch,
    /// Outside diameter.
    OutsideDiameter,
    /// Back-iron depth.
    YokeDepth,
    /// Tooth width.
    ToothWidth,
    /// Slot width.
    SlotWidth,
    /// Slot depth.
    SlotDepth,
}

/// Why a core's sizes do not make a core.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum GeometryError {
    /// The teeth come out of zero or negative width at their narrowest.
    #[error("teeth of {} m at the bore (slot pitch {} m)", .tooth.m(), .slot_pitch.m())]
    NoTooth {
        /// The sizes that give it.
        from: [Size; 2],
        /// The tooth width they leave.
        tooth: Length,
        /// The slot pitch at the bore.
        slot_pitch: Length,
    },
    /// A tooth as wide as the slot pitch or wider leaves no slot.
    #[error("tooth {} m leaves no slot (slot pitch {} m)", .tooth.m(), .slot_pitch.m())]
    NoSlot {
        /// The tooth width given.
        tooth: Length,
        /// The slot pitch at the bore.
        slot_pitch: Length,
        /// The size the slot pitch comes from.
        pitch_from: Size,
    },
    /// Tooth and slot widths given together do not add up to the slot pitch.
    #[error("tooth {} m + slot {} m is not the slot pitch {} m", .tooth.m(), .slot.m(), .slot_pitch.m())]
    ToothAndSlot {
        /// Tooth width.
        tooth: Length,
        /// Slot width.
        slot: Length,
        /// Slot pitch at the bore.
        slot_pitch: Length,
    },
    /// The back iron comes out of zero or negative depth.
    #[error("back iron of {} m", .yoke.m())]
    NoYoke {
        /// The sizes that give it.
        from: [Size; 3],
        /// The depth they leave.
        yoke: Length,
    },
    /// Back-iron depth given beside the outside diameter and slot depth disagrees with them.
    #[error("back iron {} m given, {} m from the diameters", .given.m(), .derived.m())]
    YokeAndDiameters {
        /// As given.
        given: Length,
        /// (D_o − D)/2 − h_s.
        derived: Length,
    },
}

/// The core's iron, every size resolved.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sections {
    /// Outside diameter (rotary, when it or the back-iron depth is known).
    pub outside_diameter: Option<Length>,
    /// Back-iron depth.
    pub yoke_depth: Option<Length>,
    /// Narrowest tooth width (at the bore for a parallel-sided slot).
    pub tooth_width: Option<Length>,
    /// Slot width at the bore.
    pub slot_width: Option<Length>,
    /// Slot width at the slot bottom (wider than at the bore for parallel-sided teeth).
    pub slot_width_bottom: Option<Length>,
    /// Slot depth.
    pub slot_depth: Option<Length>,
}

/// Within the geometry tolerance.
fn agrees(a: Length, b: Length) -> bool {
    let (a, b) = (a.m(), b.m());
    (a - b).abs() <= (GEOMETRY_TOLERANCE * a.abs().max(b.abs())).max(GEOMETRY_TOLERANCE_ABS.m())
}

/// Resolve a core's measured sizes: derive what follows from the rest and refuse a core
/// that does not close. `slots` is Z.
pub fn resolve(topology: Topology, slots: usize, m: &Measured) -> Result<Sections, GeometryError> {
    let rotary = topology == Topology::Rotary;
    let z = slots.max(1) as f64;
    let pitch_at = |diameter: Length| PI * diameter / z;
    let slot_pitch = m
        .slot_pitch
        .or_else(|| m.bore.filter(|_| rotary).map(pitch_at));
    let pitch_key = if m.slot_pitch.is_some() {
        Size::SlotPitch
    } else {
        Size::Bore
    };

    let (tooth, slot) = match (m.tooth_width, m.slot_width, slot_pitch) {
        (Some(t), Some(b), Some(p)) => {
            if !agrees(t + b, p) {
                return Err(GeometryError::ToothAndSlot {
                    tooth: t,
                    slot: b,
                    slot_pitch: p,
                });
            }
            (Some(t), Some(b))
        }
        (Some(t), None, Some(p)) => (Some(t), Some(p - t)),
        (None, Some(b), Some(p)) => (Some(p - b), Some(b)),
        (t, b, _) => (t, b),
    };
    if let (Some(t), Some(p)) = (tooth, slot_pitch)
        && t <= Length::ZERO
    {
        let other = if m.tooth_width.is_some() {
            Size::ToothWidth
        } else {
            Size::SlotWidth
        };
        return Err(GeometryError::NoTooth {
            from: [other, pitch_key],
            tooth: t,
            slot_pitch: p,
        });
    }
    if let (Some(b), Some(p), Some(t)) = (slot, slot_pitch, m.tooth_width)
        && b <= Length::ZERO
    {
        return Err(GeometryError::NoSlot {
            tooth: t,
            slot_pitch: p,
            pitch_from: pitch_key,
        });
    }

    // A parallel-sided tooth on a rotary core leaves slots that widen toward the bottom.
    let slot_bottom = match (rotary, m.tooth_width, m.bore, m.slot_depth, slot) {
        (true, Some(t), Some(d), Some(h), _) if m.slot_width.is_none() => {
            Some(pitch_at(d + 2.0 * h) - t)
        }
        (_, _, _, _, b) => b,
    };

    let (outside, yoke) = if rotary {
        match (m.bore, m.slot_depth, m.outside_diameter, m.yoke_depth) {
            (Some(d), Some(h), Some(od), given) => {
                let derived = (od - d) / 2.0 - h;
                if derived <= Length::ZERO {
                    return Err(GeometryError::NoYoke {
                        from: [Size::OutsideDiameter, Size::Bore, Size::SlotDepth],
                        yoke: derived,
                    });
                }
                if let Some(y) = given
                    && !agrees(y, derived)
                {
                    return Err(GeometryError::YokeAndDiameters { given: y, derived });
                }
                (Some(od), Some(given.unwrap_or(derived)))
            }
            (Some(d), Some(h), None, Some(y)) => (Some(d + 2.0 * (h + y)), Some(y)),
            (Some(d), None, Some(od), _) if od <= d => {
                return Err(GeometryError::NoYoke {
                    from: [Size::OutsideDiameter, Size::Bore, Size::SlotDepth],
                    yoke: (od - d) / 2.0,
                });
            }
            (_, _, od, y) => (od, y),
        }
    } else {
        (None, m.yoke_depth)
    };

    Ok(Sections {
        outside_diameter: outside,
        yoke_depth: yoke,
        tooth_width: tooth,
        slot_width: slot,
        slot_width_bottom: slot_bottom,
        slot_depth: m.slot_depth,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A 36-slot core of 130 mm bore: slot pitch π·130/36 = 11.345 mm (closed form).
    fn core() -> Measured {
        Measured {
            bore: Some(Length::from_m(0.130)),
            outside_diameter: Some(Length::from_m(0.210)),
            slot_depth: Some(Length::from_m(0.016)),
            slot_width: Some(Length::from_m(0.0065)),
            ..Measured::default()
        }
    }

    #[test]
    fn tooth_and_yoke_follow_from_the_diameters() {
        let s = resolve(Topology::Rotary, 36, &core()).unwrap();
        // t = π·130/36 − 6.5 = 4.8446 mm; y = (210 − 130)/2 − 16 = 24 mm (closed forms).
        assert!((s.tooth_width.unwrap().m() - (PI * 0.130 / 36.0 - 0.0065)).abs() < 1e-15);
        assert!((s.yoke_depth.unwrap().m() - 0.024).abs() < 1e-15);
    }

    #[test]
    fn a_core_that_does_not_close_is_refused() {
        let wide = Measured {
            slot_width: Some(Length::from_m(0.012)),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &wide),
            Err(GeometryError::NoTooth { .. })
        ));
        let deep = Measured {
            slot_depth: Some(Length::from_m(0.040)),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &deep),
            Err(GeometryError::NoYoke { .. })
        ));
        let both = Measured {
            tooth_width: Some(Length::from_m(0.006)),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &both),
            Err(GeometryError::ToothAndSlot { .. })
        ));
        let yoke = Measured {
            yoke_depth: Some(Length::from_m(0.030)),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &yoke),
            Err(GeometryError::YokeAndDiameters { .. })
        ));
    }

    #[test]
    fn a_parallel_tooth_leaves_a_widening_slot() {
        let m = Measured {
            bore: Some(Length::from_m(0.130)),
            slot_depth: Some(Length::from_m(0.016)),
            tooth_width: Some(Length::from_m(0.005)),
            yoke_depth: Some(Length::from_m(0.024)),
            ..Measured::default()
        };
        let s = resolve(Topology::Rotary, 36, &m).unwrap();
        // Bottom width π·(130 + 32)/36 − 5 mm; outside diameter 130 + 2·(16 + 24) = 210 mm.
        let bottom = PI * 0.162 / 36.0 - 0.005;
        assert!((s.slot_width_bottom.unwrap().m() - bottom).abs() < 1e-15);
        assert!((s.outside_diameter.unwrap().m() - 0.210).abs() < 1e-15);
    }
}
