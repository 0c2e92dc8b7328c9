//! Physical quantities, held in SI units inside the program: lengths in metres, areas in
//! square metres. The trade writes and reads millimetres (layouts, cards, sheets, the JSON);
//! a value is taken from millimetres at the parser ([`Length::from_mm`]) and given in them at
//! the presenters ([`Length::mm`], or a field's `serialize_with` below), and nowhere between,
//! so no analysis converts a unit and no m → mm → m round trip exists.

use std::f64::consts::PI;
use std::ops::{Add, AddAssign, Div, Mul, Neg, Sub};

use serde::Serializer;

/// Millimetres in a metre (SI prefix milli). Both directions multiply or divide by this
/// exact integer, so a size given in millimetres (a nominal wire size, a bore) comes back
/// out as written.
const MM_PER_M: f64 = 1e3;
/// Square millimetres in a square metre.
const MM2_PER_M2: f64 = 1e6;
/// Square centimetres in a square metre.
const CM2_PER_M2: f64 = 1e4;
/// Siemens per metre in a megasiemens per metre.
const S_PER_MS: f64 = 1e6;
/// Microfarads in a farad.
const UF_PER_F: f64 = 1e6;
/// Watts in a kilowatt.
const W_PER_KW: f64 = 1e3;

/// Watts of `kw` kilowatts (a nameplate's rating as written).
pub const fn watts_of_kw(kw: f64) -> f64 {
    kw * W_PER_KW
}

/// A value in its SI unit written with the prefix kilo (W → kW, W/m² → kW/m²), for the
/// presenters and the record book's kW column.
pub const fn in_kilo(x: f64) -> f64 {
    x / W_PER_KW
}

/// A value in its SI unit written with the prefix milli (H → mH, Wb → mWb), for the
/// presenters.
pub const fn in_milli(x: f64) -> f64 {
    x * MM_PER_M
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

    /// The length in millimetres, for the presenters.
    pub const fn mm(self) -> f64 {
        self.0 * MM_PER_M
    }

    /// The larger of two lengths.
    pub fn max(self, other: Length) -> Length {
        Length(self.0.max(other.0))
    }

    /// The smaller of two lengths.
    pub fn min(self, other: Length) -> Length {
        Length(self.0.min(other.0))
    }

    /// True when the length is a finite number.
    pub fn is_finite(self) -> bool {
        self.0.is_finite()
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

    /// The area in square millimetres, for the presenters.
    pub const fn mm2(self) -> f64 {
        self.0 * MM2_PER_M2
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

    /// The conductivity in MS/m, for the presenters.
    pub const fn ms_m(self) -> f64 {
        self.0 / S_PER_MS
    }
}

macro_rules! linear {
    ($t:ident) => {
        impl Add for $t {
            type Output = $t;
            fn add(self, o: $t) -> $t {
                $t(self.0 + o.0)
            }
        }
        impl AddAssign for $t {
            fn add_assign(&mut self, o: $t) {
                self.0 += o.0;
            }
        }
        impl Sub for $t {
            type Output = $t;
            fn sub(self, o: $t) -> $t {
                $t(self.0 - o.0)
            }
        }
        impl Neg for $t {
            type Output = $t;
            fn neg(self) -> $t {
                $t(-self.0)
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
