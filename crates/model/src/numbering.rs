//! Slot and coil numbers as a person reads them. Inside the program slots and coils count
//! from 0; at every edge a person sees they count from 1, as a shop does. [`SlotNo`] and
//! [`CoilNo`] carry that conversion in their type: made from a 0-based index, shown,
//! serialized and compared (with a plain number) as the number a shop reads; so do
//! [`PathNo`] and [`GroupNo`].

use std::fmt;

macro_rules! number_type {
    ($(#[$doc:meta])* $name:ident, $schema:literal, $what:literal) => {
        $(#[$doc])*
        #[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
        pub struct $name(usize);

        impl $name {
            #[doc = concat!("The ", $what, " at a 0-based index inside the program.")]
            pub const fn at(index: usize) -> Self {
                Self(index)
            }

            /// The 0-based index inside the program.
            pub const fn index(self) -> usize {
                self.0
            }

            /// The number a person reads, from 1.
            pub const fn get(self) -> usize {
                self.0 + 1
            }
        }

        impl fmt::Display for $name {
            fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                write!(f, "{}", self.get())
            }
        }

        /// Compared with a plain number as a person reads it (from 1).
        impl PartialEq<usize> for $name {
            fn eq(&self, n: &usize) -> bool {
                self.get() == *n
            }
        }

        impl From<$name> for usize {
            /// The number a person reads, from 1.
            fn from(n: $name) -> usize {
                n.get()
            }
        }

        impl serde::Serialize for $name {
            fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                s.serialize_u64(self.get() as u64)
            }
        }

        impl schemars::JsonSchema for $name {
            fn inline_schema() -> bool {
                true
            }

            fn schema_name() -> std::borrow::Cow<'static, str> {
                $schema.into()
            }

            fn json_schema(_: &mut schemars::SchemaGenerator) -> schemars::Schema {
                schemars::json_schema!({
                    "type": "integer",
                    "minimum": 1,
                    "description": concat!("A ", $what, " number as the shop reads it, from 1.")
                })
            }
        }
    };
}

number_type!(
    /// A slot, shown from 1 (slot 1 is index 0).
    SlotNo,
    "SlotNumber",
    "slot"
);
number_type!(
    /// A coil of the coil list, shown from 1.
    CoilNo,
    "CoilNumber",
    "coil"
);
number_type!(
    /// A parallel path of a phase, shown from 1.
    PathNo,
    "PathNumber",
    "path"
);
number_type!(
    /// A coil group, shown from 1 in slot order.
    GroupNo,
    "GroupNumber",
    "group"
);

/// The number a person sees for a 0-based index.
pub fn shown(index: usize) -> usize {
    index + 1
}

/// A ratio n/d as a reduced fraction for people: "5/4", or "2" when whole (how q, slots per
/// pole per phase, is written everywhere).
pub fn fraction(n: u64, d: u64) -> String {
    let g = crate::winding::gcd(n, d).max(1);
    let (n, d) = (n / g, d / g);
    if d == 1 {
        n.to_string()
    } else {
        format!("{n}/{d}")
    }
}

/// "1-3, 7, 9-10" from sorted numbers as shown (plain numbers, [`SlotNo`] or [`CoilNo`]).
pub fn ranges<T: Copy + Into<usize>>(ns: &[T]) -> String {
    let ns: Vec<usize> = ns.iter().map(|&n| n.into()).collect();
    let mut parts: Vec<String> = Vec::new();
    let mut i = 0;
    while i < ns.len() {
        let mut j = i;
        while j + 1 < ns.len() && ns[j + 1] == ns[j] + 1 {
            j += 1;
        }
        parts.push(if j > i {
            format!("{}-{}", ns[i], ns[j])
        } else {
            ns[i].to_string()
        });
        i = j + 1;
    }
    parts.join(", ")
}

/// A number with at most `digits` decimals, trailing zeros trimmed ("1", "0.933"): how
/// every report and message writes a figure.
pub fn num(x: f64, digits: usize) -> String {
    let s = format!("{x:.digits$}");
    let s = if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    };
    if s == "-0" { "0".into() } else { s }
}

/// `x` to `figures` significant figures, trailing zeros kept, so a column of one kind of
/// figure reads alike (0.2996, 0.1997, 1.031, 12.34).
pub fn sig(x: f64, figures: usize) -> String {
    if x == 0.0 || !x.is_finite() {
        return num(x, 0);
    }
    let mut magnitude = x.abs().log10().floor() as i64;
    let decimals_for = |m: i64| (figures as i64 - 1 - m).max(0) as usize;
    // Rounding may carry into a new digit (9.99996 to 4 figures is 10.00): count again.
    let d = decimals_for(magnitude);
    let rounded: f64 = format!("{x:.d$}").parse().unwrap_or(x);
    if rounded != 0.0 && rounded.abs().log10().floor() as i64 > magnitude {
        magnitude += 1;
    }
    let decimals = decimals_for(magnitude);
    let s = format!("{x:.decimals$}");
    if s.starts_with("-0") && s.trim_start_matches(['-', '0', '.']).is_empty() {
        s.trim_start_matches('-').to_string()
    } else {
        s
    }
}

/// A number as a message shows it: plain when it is of ordinary size, in short scientific
/// form (`1.8e308`, `5e-324`) when it would need many digits, so no message prints a
/// 309-digit number.
pub fn short(x: f64) -> String {
    let a = x.abs();
    if x == 0.0 || (1e-4..1e9).contains(&a) {
        let s = format!("{x:.6}");
        let s = s.trim_end_matches('0').trim_end_matches('.');
        if s == "-0" { "0".into() } else { s.to_string() }
    } else {
        format!("{x:.3e}")
            .replace(".000e", "e")
            .replace("00e", "e")
            .replace("0e", "e")
    }
}

/// "1 coil", "3 coils": a count with its noun in the right number.
pub fn count(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

/// The noun for a list of counts: singular only when every count is 1.
pub fn noun_for(counts: &[usize], one: &'static str, many: &'static str) -> &'static str {
    if !counts.is_empty() && counts.iter().all(|&c| c == 1) {
        one
    } else {
        many
    }
}

#[cfg(test)]
mod sig_tests {
    use super::sig;

    // Four significant figures, zeros kept (arithmetic).
    #[test]
    fn significant_figures_keep_their_zeros() {
        assert_eq!(sig(0.19970, 4), "0.1997");
        assert_eq!(sig(0.2, 4), "0.2000");
        assert_eq!(sig(8.25, 4), "8.250");
        assert_eq!(sig(1234.5, 4), "1234");
        assert_eq!(sig(0.000123456, 4), "0.0001235");
        assert_eq!(sig(9.99996, 4), "10.00");
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // q = Z/(2p·m): 36 slots, 4 poles, 3 phases give 3; 45 slots give 15/4 (common practice).
    #[test]
    fn q_is_written_as_a_reduced_fraction() {
        assert_eq!(fraction(36, 12), "3");
        assert_eq!(fraction(45, 12), "15/4");
        assert_eq!(fraction(29 - 5, 12), "2");
    }

    #[test]
    fn ranges_compress_runs() {
        assert_eq!(ranges(&[1usize, 2, 3, 7, 9, 10]), "1-3, 7, 9-10");
        assert_eq!(ranges::<usize>(&[]), "");
        assert_eq!(shown(0), 1);
    }

    #[test]
    fn short_keeps_messages_short() {
        assert_eq!(short(400.0), "400");
        assert_eq!(short(0.85), "0.85");
        assert_eq!(short(5e-324), "4.941e-324");
        assert_eq!(short(f64::MAX), "1.798e308");
        assert_eq!(short(2e12), "2e12");
        assert!(short(-1e300).len() < 12);
    }
}
