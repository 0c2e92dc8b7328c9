//! Harmonic orders, kept apart by type. An electrical order ν counts waves per pole pair
//! (the working wave is 1; sub- and inter-harmonics of fractional-slot windings are
//! fractions); a mechanical order n counts whole waves round a closed core. On a core of p
//! pole pairs n = ν·p; that conversion is written here once.

use serde::Serialize;

/// An electrical order ν: 1 is the working wave.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Serialize, schemars::JsonSchema)]
#[serde(transparent)]
pub struct Elec(pub f64);

impl Elec {
    /// The working wave, ν = 1.
    pub const FUNDAMENTAL: Elec = Elec(1.0);

    /// The order as a number.
    #[inline]
    pub const fn get(self) -> f64 {
        self.0
    }

    /// The mechanical order on a core of `pole_pairs` pole pairs, when it is whole.
    #[inline]
    pub fn mechanical(self, pole_pairs: f64) -> Option<Mech> {
        let n = self.0 * pole_pairs;
        let r = n.round();
        ((n - r).abs() < 1e-9 && r >= 0.0).then_some(Mech(r as u64))
    }
}

/// A mechanical order n: whole waves round a closed core.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, schemars::JsonSchema,
)]
#[serde(transparent)]
pub struct Mech(pub u64);

impl Mech {
    /// The order as a number.
    #[inline]
    pub const fn get(self) -> u64 {
        self.0
    }

    /// The electrical order on a core of `pole_pairs` pole pairs: ν = n / p.
    #[inline]
    pub fn electrical(self, pole_pairs: f64) -> Elec {
        Elec(self.0 as f64 / pole_pairs)
    }
}

impl std::fmt::Display for Elec {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}", self.0)
    }
}

impl std::fmt::Display for Mech {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}", self.0)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn orders_convert_through_the_pole_pairs() {
        // 36 slots, 4 poles (p = 2): the 5th electrical harmonic is mechanical order 10,
        // and mechanical order 1 is the sub-harmonic ν = 1/2 (common practice).
        assert_eq!(Elec(5.0).mechanical(2.0), Some(Mech(10)));
        assert_eq!(Mech(1).electrical(2.0), Elec(0.5));
        assert_eq!(Elec(0.25).mechanical(2.0), None);
    }
}
