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

/// Stacking factor (steel over stack length) when not given: 0.95 for 0.5 mm laminations
/// with a thin coating (common practice, from memory: 0.93–0.97 is usual).
pub const DEFAULT_STACKING_FACTOR: f64 = 0.95;

/// How far measured sizes may disagree with each other (tooth + slot against the slot
/// pitch at the bore; back-iron depth against the outside diameter) before the core is
/// refused: 2 % of the larger size, or 0.2 mm, whichever is more (calipers on a used core;
/// common practice).
pub const GEOMETRY_TOLERANCE: f64 = 0.02;

/// Absolute part of [`GEOMETRY_TOLERANCE`], metres.
pub const GEOMETRY_TOLERANCE_M: f64 = 0.2e-3;

/// Slot liner thickness taken off each side and the bottom of a slot for its usable area,
/// metres: 0.3 mm (common practice for low-voltage random windings, from memory).
pub const LINER_M: f64 = 0.3e-3;

/// Depth at the slot's mouth taken by the tooth tips, the wedge or top stick, metres:
/// 2 mm (common practice, from memory).
pub const WEDGE_M: f64 = 2.0e-3;

/// The area a slot of mean width `b` and depth `h` (m) leaves for the wire once the liner
/// and wedge are in: (b − 2·liner)·(h − liner − wedge), m²; `None` when nothing is left.
pub fn usable_area(b: f64, h: f64) -> Option<f64> {
    let (w, d) = (b - 2.0 * LINER_M, h - LINER_M - WEDGE_M);
    (w > 0.0 && d > 0.0).then_some(w * d)
}

/// The sizes of a core as measured, metres; any may be missing.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Measured {
    /// Slot pitch at the gap (flat primary), or `None` to take it from the bore.
    pub slot_pitch: Option<f64>,
    /// Bore diameter (rotary).
    pub bore: Option<f64>,
    /// Outside diameter of the lamination (rotary).
    pub outside_diameter: Option<f64>,
    /// Back-iron (yoke) depth behind the slots.
    pub yoke_depth: Option<f64>,
    /// Width of a parallel-sided tooth.
    pub tooth_width: Option<f64>,
    /// Width of a parallel-sided slot.
    pub slot_width: Option<f64>,
    /// Slot depth from the gap to the slot bottom.
    pub slot_depth: Option<f64>,
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
    #[error("teeth of {tooth_m} m at the bore (slot pitch {slot_pitch_m} m)")]
    NoTooth {
        /// The sizes that give it.
        from: [Size; 2],
        /// The tooth width they leave, m.
        tooth_m: f64,
        /// The slot pitch at the bore, m.
        slot_pitch_m: f64,
    },
    /// A tooth as wide as the slot pitch or wider leaves no slot.
    #[error("tooth {tooth_m} m leaves no slot (slot pitch {slot_pitch_m} m)")]
    NoSlot {
        /// The tooth width given, m.
        tooth_m: f64,
        /// The slot pitch at the bore, m.
        slot_pitch_m: f64,
        /// The size the slot pitch comes from.
        pitch_from: Size,
    },
    /// Tooth and slot widths given together do not add up to the slot pitch.
    #[error("tooth {tooth_m} m + slot {slot_m} m is not the slot pitch {slot_pitch_m} m")]
    ToothAndSlot {
        /// Tooth width, m.
        tooth_m: f64,
        /// Slot width, m.
        slot_m: f64,
        /// Slot pitch at the bore, m.
        slot_pitch_m: f64,
    },
    /// The back iron comes out of zero or negative depth.
    #[error("back iron of {yoke_m} m")]
    NoYoke {
        /// The sizes that give it.
        from: [Size; 3],
        /// The depth they leave, m.
        yoke_m: f64,
    },
    /// Back-iron depth given beside the outside diameter and slot depth disagrees with them.
    #[error("back iron {given_m} m given, {derived_m} m from the diameters")]
    YokeAndDiameters {
        /// As given, m.
        given_m: f64,
        /// (D_o − D)/2 − h_s, m.
        derived_m: f64,
    },
}

/// The core's iron, every size resolved.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sections {
    /// Outside diameter (rotary, when it or the back-iron depth is known), m.
    pub outside_diameter: Option<f64>,
    /// Back-iron depth, m.
    pub yoke_depth: Option<f64>,
    /// Narrowest tooth width (at the bore for a parallel-sided slot), m.
    pub tooth_width: Option<f64>,
    /// Slot width at the bore, m.
    pub slot_width: Option<f64>,
    /// Slot width at the slot bottom (wider than at the bore for parallel-sided teeth), m.
    pub slot_width_bottom: Option<f64>,
    /// Slot depth, m.
    pub slot_depth: Option<f64>,
}

/// Within the geometry tolerance.
fn agrees(a: f64, b: f64) -> bool {
    (a - b).abs() <= (GEOMETRY_TOLERANCE * a.abs().max(b.abs())).max(GEOMETRY_TOLERANCE_M)
}

/// Resolve a core's measured sizes: derive what follows from the rest and refuse a core
/// that does not close. `slots` is Z.
pub fn resolve(topology: Topology, slots: usize, m: &Measured) -> Result<Sections, GeometryError> {
    let rotary = topology == Topology::Rotary;
    let z = slots.max(1) as f64;
    let pitch_at = |diameter: f64| PI * diameter / z;
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
                    tooth_m: t,
                    slot_m: b,
                    slot_pitch_m: p,
                });
            }
            (Some(t), Some(b))
        }
        (Some(t), None, Some(p)) => (Some(t), Some(p - t)),
        (None, Some(b), Some(p)) => (Some(p - b), Some(b)),
        (t, b, _) => (t, b),
    };
    if let (Some(t), Some(p)) = (tooth, slot_pitch)
        && t <= 0.0
    {
        let other = if m.tooth_width.is_some() {
            Size::ToothWidth
        } else {
            Size::SlotWidth
        };
        return Err(GeometryError::NoTooth {
            from: [other, pitch_key],
            tooth_m: t,
            slot_pitch_m: p,
        });
    }
    if let (Some(b), Some(p), Some(t)) = (slot, slot_pitch, m.tooth_width)
        && b <= 0.0
    {
        return Err(GeometryError::NoSlot {
            tooth_m: t,
            slot_pitch_m: p,
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
                if derived <= 0.0 {
                    return Err(GeometryError::NoYoke {
                        from: [Size::OutsideDiameter, Size::Bore, Size::SlotDepth],
                        yoke_m: derived,
                    });
                }
                if let Some(y) = given
                    && !agrees(y, derived)
                {
                    return Err(GeometryError::YokeAndDiameters {
                        given_m: y,
                        derived_m: derived,
                    });
                }
                (Some(od), Some(given.unwrap_or(derived)))
            }
            (Some(d), Some(h), None, Some(y)) => (Some(d + 2.0 * (h + y)), Some(y)),
            (Some(d), None, Some(od), _) if od <= d => {
                return Err(GeometryError::NoYoke {
                    from: [Size::OutsideDiameter, Size::Bore, Size::SlotDepth],
                    yoke_m: (od - d) / 2.0,
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
            bore: Some(0.130),
            outside_diameter: Some(0.210),
            slot_depth: Some(0.016),
            slot_width: Some(0.0065),
            ..Measured::default()
        }
    }

    #[test]
    fn tooth_and_yoke_follow_from_the_diameters() {
        let s = resolve(Topology::Rotary, 36, &core()).unwrap();
        // t = π·130/36 − 6.5 = 4.8446 mm; y = (210 − 130)/2 − 16 = 24 mm (closed forms).
        assert!((s.tooth_width.unwrap() - (PI * 0.130 / 36.0 - 0.0065)).abs() < 1e-15);
        assert!((s.yoke_depth.unwrap() - 0.024).abs() < 1e-15);
    }

    #[test]
    fn a_core_that_does_not_close_is_refused() {
        let wide = Measured {
            slot_width: Some(0.012),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &wide),
            Err(GeometryError::NoTooth { .. })
        ));
        let deep = Measured {
            slot_depth: Some(0.040),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &deep),
            Err(GeometryError::NoYoke { .. })
        ));
        let both = Measured {
            tooth_width: Some(0.006),
            ..core()
        };
        assert!(matches!(
            resolve(Topology::Rotary, 36, &both),
            Err(GeometryError::ToothAndSlot { .. })
        ));
        let yoke = Measured {
            yoke_depth: Some(0.030),
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
            bore: Some(0.130),
            slot_depth: Some(0.016),
            tooth_width: Some(0.005),
            yoke_depth: Some(0.024),
            ..Measured::default()
        };
        let s = resolve(Topology::Rotary, 36, &m).unwrap();
        // Bottom width π·(130 + 32)/36 − 5 mm; outside diameter 130 + 2·(16 + 24) = 210 mm.
        let bottom = PI * 0.162 / 36.0 - 0.005;
        assert!((s.slot_width_bottom.unwrap() - bottom).abs() < 1e-15);
        assert!((s.outside_diameter.unwrap() - 0.210).abs() < 1e-15);
    }
}
