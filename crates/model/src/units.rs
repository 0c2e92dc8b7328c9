//! Physical quantities, held in SI units inside the program: lengths in metres, areas in
//! square metres. The trade writes and reads millimetres (layouts, cards, sheets, the JSON);
//! a value is taken from millimetres at the parser ([`Length::from_mm`]) and given in them at
//! the presenters ([`Length::mm`], or a field's `serialize_with` below): no analysis scales a
//! unit by hand and no m → mm → m round trip exists. (Current densities stay in the trade's
//! A/mm², their limits' unit, worked through [`Area::mm2`].)

use std::f64::consts::PI;
use std::ops::{Add, Div, Mul, Sub};

use serde::Serializer;

/// Millimetres in a metre (SI prefix milli).
const MM_PER_M: f64 = 1e3;
/// Square millimetres in a square metre.
const MM2_PER_M2: f64 = 1e6;
/// Square centimetres in a square metre.
const CM2_PER_M2: f64 = 1e4;
/// Siemens per metre in a megasiemens per metre.
const S_PER_MS: f64 = 1e6;
/// Microfarads in a farad.
const UF_PER_F: f64 = 1e6;
/// Units in a kilo-unit (W in a kW).
const PER_KILO: f64 = 1e3;
/// A value in milli-units per unit (H → mH).
const MILLI_PER_UNIT: f64 = 1e3;
/// Watts in a mechanical horsepower: 745.7 (NEMA MG 1 ratings; 550 ft·lbf/s).
const W_PER_HP: f64 = 745.7;

/// Watts of `hp` mechanical horsepower (a nameplate's rating as written).
pub const fn watts_of_hp(hp: f64) -> f64 {
    hp * W_PER_HP
}

/// Mechanical horsepower of `w` watts, for the presenters.
pub const fn hp_of_watts(w: f64) -> f64 {
    w / W_PER_HP
}

/// A quantity per metre given per millimetre (an electric loading in A/m as A/mm).
pub const fn per_mm(per_m: f64) -> f64 {
    per_m / MM_PER_M
}

/// Watts of `kw` kilowatts (a nameplate's rating as written).
pub const fn watts_of_kw(kw: f64) -> f64 {
    kw * PER_KILO
}

/// A value in its SI unit written with the prefix kilo (W → kW, W/m² → kW/m²), for the
/// presenters and the record book's kW column.
pub const fn in_kilo(x: f64) -> f64 {
    x / PER_KILO
}

/// A value in its SI unit written with the prefix milli (H → mH, Wb → mWb), for the
/// presenters.
pub const fn in_milli(x: f64) -> f64 {
    x * MILLI_PER_UNIT
}

/// A length, metres inside.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
pub struct Length(f64);

impl Length {
    /// No length.
    pub const ZERO: Length = Length(0.0);

    /// A length of `m` metres.
    pub const fn from_m(m: f64) -> Length {
        Length(m)
    }

    /// A length of `mm` millimetres (the parser's and the command line's unit).
    pub const fn from_mm(mm: f64) -> Length {
        Length(mm / MM_PER_M)
    }

    /// The length in metres, for the formulas.
    pub const fn m(self) -> f64 {
        self.0
    }

    /// The length in millimetres, for the presenters: as it was given, when it was given in
    /// millimetres ([`as_given`]).
    pub fn mm(self) -> f64 {
        as_given(self.0 * MM_PER_M, self.0, |mm| Length::from_mm(mm).0)
    }

    /// The larger of two lengths.
    pub fn max(self, other: Length) -> Length {
        Length(self.0.max(other.0))
    }

    /// The smaller of two lengths.
    pub fn min(self, other: Length) -> Length {
        Length(self.0.min(other.0))
    }
}

/// An area, square metres inside.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
pub struct Area(f64);

impl Area {
    /// An area of `m2` square metres.
    pub const fn from_m2(m2: f64) -> Area {
        Area(m2)
    }

    /// An area of `mm2` square millimetres (the parser's and the command line's unit).
    pub const fn from_mm2(mm2: f64) -> Area {
        Area(mm2 / MM2_PER_M2)
    }

    /// The area of a circle of diameter `d`: π/4·d².
    pub const fn of_circle(d: Length) -> Area {
        Area(PI / 4.0 * d.0 * d.0)
    }

    /// The area in square metres, for the formulas.
    pub const fn m2(self) -> f64 {
        self.0
    }

    /// The area in square millimetres, for the presenters: as it was given, when it was
    /// given in square millimetres ([`as_given`]).
    pub fn mm2(self) -> f64 {
        as_given(self.0 * MM2_PER_M2, self.0, |mm2| Area::from_mm2(mm2).0)
    }

    /// The area in square centimetres (a heat flux is quoted per cm²).
    pub const fn cm2(self) -> f64 {
        self.0 * CM2_PER_M2
    }
}

/// An electrical conductivity, siemens per metre inside (plates are quoted in MS/m).
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
pub struct Conductivity(f64);

impl Conductivity {
    /// A conductivity of `s_m` S/m.
    pub const fn from_s_m(s_m: f64) -> Conductivity {
        Conductivity(s_m)
    }

    /// A conductivity of `ms_m` MS/m (the parser's and the command line's unit).
    pub const fn from_ms_m(ms_m: f64) -> Conductivity {
        Conductivity(ms_m * S_PER_MS)
    }

    /// The conductivity in S/m, for the formulas.
    pub const fn s_m(self) -> f64 {
        self.0
    }

    /// The conductivity in MS/m, for the presenters: as it was given, when it was given in
    /// MS/m ([`as_given`]).
    pub fn ms_m(self) -> f64 {
        as_given(self.0 / S_PER_MS, self.0, |ms_m| {
            Conductivity::from_ms_m(ms_m).0
        })
    }
}

/// `v` (a quantity in the presenters' unit, worked out from `si`), or the shortest decimal
/// of at most 12 significant digits that `back` turns into the very same `si`. A size typed
/// as 3.97 mm is stored as the nearest double to 0.00397 m; multiplied back it may read
/// 3.9700000000000006, which is the same length: it is shown as typed. A length worked out
/// by a formula is shown as it is unless a 12-digit decimal is that same double.
fn as_given(v: f64, si: f64, back: impl Fn(f64) -> f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    // Scale so that 12 significant digits sit left of the point; powers of ten up to 1e22
    // are exact, so the rounded integer divided back is the decimal's nearest double.
    let k = 11 - v.abs().log10().floor() as i32;
    if !(-22..=22).contains(&k) {
        return v;
    }
    let p = 10f64.powi(k.abs());
    let r = if k >= 0 {
        (v * p).round() / p
    } else {
        (v / p).round() * p
    };
    if back(r) == si { r } else { v }
}

macro_rules! linear {
    ($t:ident) => {
        impl Add for $t {
            type Output = $t;
            fn add(self, o: $t) -> $t {
                $t(self.0 + o.0)
            }
        }
        impl Sub for $t {
            type Output = $t;
            fn sub(self, o: $t) -> $t {
                $t(self.0 - o.0)
            }
        }
        impl Mul<f64> for $t {
            type Output = $t;
            fn mul(self, k: f64) -> $t {
                $t(self.0 * k)
            }
        }
        impl Mul<$t> for f64 {
            type Output = $t;
            fn mul(self, x: $t) -> $t {
                $t(self * x.0)
            }
        }
        impl Div<f64> for $t {
            type Output = $t;
            fn div(self, k: f64) -> $t {
                $t(self.0 / k)
            }
        }
        /// A ratio of two like quantities is a number.
        impl Div for $t {
            type Output = f64;
            fn div(self, o: $t) -> f64 {
                self.0 / o.0
            }
        }
        impl std::iter::Sum for $t {
            fn sum<I: Iterator<Item = $t>>(it: I) -> $t {
                $t(it.map(|x| x.0).sum())
            }
        }
    };
}
linear!(Length);
linear!(Area);

impl Mul for Length {
    type Output = Area;
    fn mul(self, o: Length) -> Area {
        Area(self.0 * o.0)
    }
}

impl Div<Length> for Area {
    type Output = Length;
    fn div(self, l: Length) -> Length {
        Length(self.0 / l.0)
    }
}

/// A capacitance, farads inside (capacitors are rated and sold in µF).
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
pub struct Capacitance(f64);

impl Capacitance {
    /// A capacitance of `f` farads.
    pub const fn from_f(f: f64) -> Capacitance {
        Capacitance(f)
    }

    /// A capacitance of `uf` microfarads.
    pub const fn from_uf(uf: f64) -> Capacitance {
        Capacitance(uf / UF_PER_F)
    }

    /// The capacitance in farads, for the formulas.
    pub const fn f(self) -> f64 {
        self.0
    }

    /// The capacitance in microfarads, for the presenters.
    pub const fn uf(self) -> f64 {
        self.0 * UF_PER_F
    }
}

/// In a JSON schema a quantity is the plain number its field's name gives the unit of
/// (`…_mm`, `…_ms_m`), as it was before the quantity had a type.
macro_rules! number_schema {
    ($t:ident) => {
        impl schemars::JsonSchema for $t {
            fn inline_schema() -> bool {
                true
            }
            fn schema_name() -> std::borrow::Cow<'static, str> {
                f64::schema_name()
            }
            fn json_schema(g: &mut schemars::SchemaGenerator) -> schemars::Schema {
                f64::json_schema(g)
            }
        }
    };
}
number_schema!(Length);
number_schema!(Area);
number_schema!(Conductivity);

/// Serde writers that present a quantity in the unit its JSON field is named for
/// (`#[serde(rename = "gap_mm", serialize_with = "units::in_mm")]` on a `Length`). They are
/// the presenters' side of the boundary, kept here so each report's field says its unit
/// where it is declared.
pub fn in_mm<S: Serializer>(l: &Length, s: S) -> Result<S::Ok, S::Error> {
    s.serialize_f64(l.mm())
}

/// [`in_mm`] for an optional length: millimetres, or null.
pub fn in_mm_opt<S: Serializer>(l: &Option<Length>, s: S) -> Result<S::Ok, S::Error> {
    match l {
        Some(l) => s.serialize_some(&l.mm()),
        None => s.serialize_none(),
    }
}

/// Writes an area in square millimetres (a field named `…_mm2`).
pub fn in_mm2<S: Serializer>(a: &Area, s: S) -> Result<S::Ok, S::Error> {
    s.serialize_f64(a.mm2())
}

/// Writes a conductivity in MS/m (a field named `…_ms_m`).
pub fn in_ms_m<S: Serializer>(c: &Conductivity, s: S) -> Result<S::Ok, S::Error> {
    s.serialize_f64(c.ms_m())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn millimetres_are_thousandths_of_a_metre() {
        // SI prefix milli = 10⁻³ (BIPM SI Brochure, 9th edition, table 7).
        assert_eq!(Length::from_mm(1.0).m(), 0.001);
        assert_eq!(Length::from_m(0.25).mm(), 250.0);
        assert_eq!(Area::from_mm2(1.0).m2(), 1e-6);
        // Every nominal diameter of the R40 series (ISO 3) from 0.1 to 9.5 mm comes back as
        // written: a wire given in millimetres is shown in the same millimetres.
        for d in crate::wire::iec_60317() {
            assert_eq!(Length::from_mm(d.mm()).mm(), d.mm());
        }
    }

    #[test]
    fn what_is_given_in_millimetres_is_shown_as_given() {
        // Every size of up to three decimals from 0.001 to 2000 mm, area and MS/m value
        // comes back as typed (3.97 mm is not shown as 3.9700000000000006).
        for i in 1..2_000_000u32 {
            let x = f64::from(i) / 1000.0;
            assert_eq!(Length::from_mm(x).mm(), x, "{x} mm");
            assert_eq!(Area::from_mm2(x).mm2(), x, "{x} mm²");
            assert_eq!(Conductivity::from_ms_m(x).ms_m(), x, "{x} MS/m");
        }
        for x in [0.489, 3.97, 3.99, 1.06, 12.5e-6, 1234.5678, 150.0] {
            assert_eq!(Length::from_mm(x).mm(), x, "{x} mm");
        }
        // A length worked out is shown as it is: one ulp off 0.4953 m stays one ulp off.
        let worked = Length::from_m(0.4953f64.next_up());
        assert_eq!(worked.mm(), 0.4953f64.next_up() * 1000.0);
        assert_eq!((Length::from_mm(2.0) * Length::from_mm(3.0)).mm2(), 6.0);
    }

    #[test]
    fn a_circles_area_is_a_quarter_pi_d_squared() {
        // Closed form: a 2 m circle has area π m².
        assert!((Area::of_circle(Length::from_m(2.0)).m2() - PI).abs() < 1e-15);
    }

    #[test]
    fn presenters_write_the_unit_the_field_is_named_for() {
        #[derive(serde::Serialize)]
        struct Row {
            #[serde(rename = "gap_mm", serialize_with = "in_mm")]
            gap: Length,
            #[serde(rename = "opening_mm", serialize_with = "in_mm_opt")]
            opening: Option<Length>,
            #[serde(rename = "area_mm2", serialize_with = "in_mm2")]
            area: Area,
            #[serde(rename = "plate_ms_m", serialize_with = "in_ms_m")]
            plate: Conductivity,
        }
        let row = Row {
            gap: Length::from_m(0.004),
            opening: None,
            area: Area::from_m2(2e-6),
            plate: Conductivity::from_s_m(35e6),
        };
        let text = serde_json::to_string(&row).expect("a row of numbers serialises");
        assert_eq!(
            text,
            r#"{"gap_mm":4.0,"opening_mm":null,"area_mm2":2.0,"plate_ms_m":35.0}"#
        );
    }
}
