//! What a flag's value may be, checked once as clap parses it: every parser here turns the
//! text into the value the commands use or says what would be valid (clap names the flag
//! and exits with status 2).

use std::ops::RangeInclusive;

use beltwright::layout::{MAX_PHASES, MAX_POLES, MAX_SLOTS};
use beltwright::numbering::short;

fn number(s: &str) -> Result<f64, String> {
    s.trim()
        .parse::<f64>()
        .ok()
        .filter(|x| x.is_finite())
        .ok_or_else(|| "not a number".to_string())
}

fn whole(s: &str) -> Result<usize, String> {
    s.trim()
        .parse::<usize>()
        .map_err(|_| "not a whole number".to_string())
}

/// A number for which `ok` holds, else `valid` (what would be valid) as the message.
fn number_where(s: &str, ok: impl Fn(f64) -> bool, valid: &str) -> Result<f64, String> {
    number(s)
        .ok()
        .filter(|x| ok(*x))
        .ok_or_else(|| valid.to_string())
}

/// A whole number for which `ok` holds, else `valid` as the message.
fn whole_where(s: &str, ok: impl Fn(usize) -> bool, valid: &str) -> Result<usize, String> {
    whole(s)
        .ok()
        .filter(|x| ok(*x))
        .ok_or_else(|| valid.to_string())
}

/// A slip from -10 to 10: below 0 the secondary overtakes the field (generating), above 1
/// it runs against it (plugging).
pub fn slip(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |x| (-10.0..=10.0).contains(&x),
        "give a slip from -10 to 10 (below 0 generating, above 1 plugging)",
    )
}

/// A current from 0.001 to 100 000 A.
pub fn current(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |i| (1e-3..=1e5).contains(&i),
        "give a current from 0.001 to 100000 A",
    )
}

/// A power of 0 W or more.
pub fn power(s: &str) -> Result<f64, String> {
    number_where(s, |p| p >= 0.0, "give a power of 0 W or more")
}

/// `A..=B` of real numbers within ±`limit`, or one number.
fn range_f64(s: &str, limit: f64, example: &str) -> Result<(f64, f64), String> {
    let bad = || format!("not a range; write A..=B, e.g. {example}");
    let num = |t: &str| number(t).map_err(|_| bad());
    let (a, b) = match s.split_once("..=") {
        Some((a, b)) => (num(a)?, num(b)?),
        None => {
            let v = num(s)?;
            (v, v)
        }
    };
    if a.abs() > limit || b.abs() > limit || a > b {
        return Err(format!(
            "give A..=B with A no more than B, within ±{}",
            short(limit)
        ));
    }
    Ok((a, b))
}

/// A slip range within ±10, e.g. `0..=1`.
pub fn slip_range(s: &str) -> Result<(f64, f64), String> {
    range_f64(s, 10.0, "0..=1")
}

/// A speed range within ±10 000 m/s, e.g. `0..=6`.
pub fn speed_range(s: &str) -> Result<(f64, f64), String> {
    range_f64(s, 1e4, "0..=6")
}

/// Intervals of a table: 1 to 10 000.
pub fn steps(s: &str) -> Result<usize, String> {
    whole_where(s, |n| (1..=10_000).contains(&n), "give 1 to 10000")
}

/// A winding factor from 0 to 1.
pub fn winding_factor(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |k| (0.0..=1.0).contains(&k),
        "give a winding factor from 0 to 1",
    )
}

/// A harmonic order to suppress: above 0, at most 10 000, not the working wave.
pub fn harmonic(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |o| o > 0.0 && o <= 10_000.0 && o != 1.0,
        "give harmonic orders other than 1 (the working wave), e.g. 5,7",
    )
}

/// `A..=B`, `A..B` or a single number.
fn range(s: &str) -> Result<RangeInclusive<usize>, String> {
    let bad = || "not a range; write A..=B (e.g. 12..=48) or one number".to_string();
    let num = |t: &str| whole(t).map_err(|_| bad());
    let (a, b) = if let Some((a, b)) = s.split_once("..=") {
        (num(a)?, num(b)?)
    } else if let Some((a, b)) = s.split_once("..") {
        (num(a)?, num(b)?.checked_sub(1).ok_or_else(bad)?)
    } else {
        let n = num(s)?;
        (n, n)
    };
    if a > b {
        return Err("an empty range; the first number must not exceed the last".to_string());
    }
    Ok(a..=b)
}

/// Slot counts from 3 to the layout file's largest.
pub fn slot_range(s: &str) -> Result<RangeInclusive<usize>, String> {
    let r = range(s)?;
    if *r.start() < 3 || *r.end() > MAX_SLOTS {
        return Err(format!("slot counts run from 3 to {MAX_SLOTS}"));
    }
    Ok(r)
}

/// Pole counts from 1 to the layout file's largest.
pub fn pole_range(s: &str) -> Result<RangeInclusive<usize>, String> {
    let r = range(s)?;
    if *r.start() < 1 || *r.end() > MAX_POLES {
        return Err(format!("pole counts run from 1 to {MAX_POLES}"));
    }
    Ok(r)
}

/// Layers per slot: 1 or 2.
pub fn layers(s: &str) -> Result<usize, String> {
    whole_where(s, |l| (1..=2).contains(&l), "give 1, 2 or 1,2")
}

/// An odd phase count from 3 to the layout file's largest.
pub fn phases(s: &str) -> Result<usize, String> {
    whole(s)
        .ok()
        .filter(|m| *m >= 3 && !m.is_multiple_of(2) && *m <= MAX_PHASES)
        .ok_or_else(|| format!("give an odd phase count from 3 to {MAX_PHASES}"))
}

/// An electrical order to list up to: 1 to 10 000.
pub fn upto(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |o| (1.0..=10_000.0).contains(&o),
        "give an order from 1 to 10000",
    )
}

/// An angle in degrees (within ±1e6).
pub fn degrees(s: &str) -> Result<f64, String> {
    number_where(s, |a| a.abs() <= 1e6, "give an angle in degrees")
}

/// A slot-opening width in slot pitches: 0 up to (not including) the field's largest.
pub fn slot_opening(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |b| (0.0..beltwright::field::MAX_OPENING).contains(&b),
        "give a width from 0 up to (not including) 1 slot pitch",
    )
}

/// A sheet resolution: 10 to 1200 dots per inch.
pub fn dpi(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |d| (10.0..=1200.0).contains(&d),
        "give a resolution from 10 to 1200",
    )
}

/// A wire size (diameter, mm, or area, mm²): positive, below 1000.
pub fn wire_size(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |v| v > 0.0 && v < 1000.0,
        "give a positive size below 1000",
    )
}

/// Wires in hand: 1 to 100.
pub fn wires_in_hand(s: &str) -> Result<u32, String> {
    whole_where(s, |n| (1..=100).contains(&n), "give 1 to 100").map(|n| n as u32)
}

/// A real number in `lo..=hi` with its unit, for a loading limit.
fn limit(s: &str, lo: f64, hi: f64, unit: &str) -> Result<f64, String> {
    number_where(
        s,
        |x| (lo..=hi).contains(&x),
        &format!("give {lo} to {hi} {unit}"),
    )
}

/// A thrust wanted: 0.001 N to 10 MN.
pub fn thrust(s: &str) -> Result<f64, String> {
    limit(s, 0.001, 1e7, "N")
}

/// A speed of a flat primary's secondary: -1000 to 1000 m/s.
pub fn speed(s: &str) -> Result<f64, String> {
    limit(s, -1000.0, 1000.0, "m/s")
}

/// A heat-transfer coefficient: 1 to 10 000 W/(m²·K).
pub fn heat_transfer(s: &str) -> Result<f64, String> {
    limit(s, 1.0, 10_000.0, "W/(m²·K)")
}

/// Peak gap flux density: 0.1 to 1.5 T.
pub fn gap_t(s: &str) -> Result<f64, String> {
    limit(s, 0.1, 1.5, "T")
}

/// Peak tooth or back-iron flux density: 0.5 to 2.4 T (beyond 2.4 T no steel carries it).
pub fn iron_t(s: &str) -> Result<f64, String> {
    limit(s, 0.5, 2.4, "T")
}

/// Current density: 0.5 to 30 A/mm².
pub fn current_density(s: &str) -> Result<f64, String> {
    limit(s, 0.5, 30.0, "A/mm²")
}

/// Slot fill by insulated wire: 0.1 to 0.9.
pub fn fill(s: &str) -> Result<f64, String> {
    limit(s, 0.1, 0.9, "(a fraction of the slot area)")
}

/// EMF over phase voltage: 0.8 to 1.1.
pub fn emf_ratio(s: &str) -> Result<f64, String> {
    limit(s, 0.8, 1.1, "(EMF over phase voltage)")
}

/// A plate thickness, mm (the layout's range for `secondary.thickness_mm`).
pub fn plate_thickness(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |t| (0.05..=200.0).contains(&t),
        "give a plate thickness from 0.05 to 200 mm",
    )
}

/// A mechanical clearance, mm.
pub fn clearance(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |g| (0.01..=1000.0).contains(&g),
        "give a clearance from 0.01 to 1000 mm",
    )
}

/// A plate metal: aluminium, copper, or a conductivity in MS/m (the layout's range).
pub fn plate_metal(s: &str) -> Result<beltwright::plates::Metal, String> {
    match s.trim().to_ascii_lowercase().as_str() {
        "aluminium" | "aluminum" => Ok(beltwright::plates::Metal::Aluminium),
        "copper" => Ok(beltwright::plates::Metal::Copper),
        _ => number_where(
            s,
            |v| (0.1..=100.0).contains(&v),
            "give aluminium, copper, or a conductivity from 0.1 to 100 MS/m",
        )
        .map(|ms_m| beltwright::plates::Metal::Conductivity {
            conductivity: beltwright::units::Conductivity::from_ms_m(ms_m),
        }),
    }
}

/// Seconds to wait for a lock: 0 to 3600.
pub fn wait_seconds(s: &str) -> Result<f64, String> {
    number_where(
        s,
        |x| (0.0..=3600.0).contains(&x),
        "give a wait from 0 to 3600 seconds",
    )
}

/// A record number: 1 or more.
pub fn record_number(s: &str) -> Result<i64, String> {
    s.trim()
        .parse::<i64>()
        .ok()
        .filter(|x| *x >= 1)
        .ok_or_else(|| "give a record number (1 or more), as `book find` lists them".into())
}

/// How many records a search lists: 1 to 10 000.
pub fn listed(s: &str) -> Result<usize, String> {
    whole_where(
        s,
        |n| (1..=10_000).contains(&n),
        "give a count from 1 to 10000",
    )
}

/// A figure a search asks for: one value (`36`) or a closed range (`30..40`), each a
/// number of 0 or more.
pub fn figure_range(s: &str) -> Result<(f64, f64), String> {
    let valid = "give a number of 0 or more, or a range like 30..40";
    let one = |t: &str| number_where(t, |x| (0.0..=1e9).contains(&x), valid);
    match s.split_once("..") {
        Some((a, b)) => {
            let (lo, hi) = (one(a)?, one(b.trim_start_matches('='))?);
            if lo > hi {
                return Err(format!(
                    "{} is above {}: give the range low..high",
                    short(lo),
                    short(hi)
                ));
            }
            Ok((lo, hi))
        }
        None => one(s).map(|x| (x, x)),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn each_flag_takes_its_range_and_refuses_the_rest() {
        assert_eq!(slip("-0.1"), Ok(-0.1));
        assert!(slip("11").is_err() && slip("NaN").is_err() && slip("x").is_err());
        assert!(current("0").is_err() && current("5").is_ok());
        assert!(power("-1").is_err() && power("0").is_ok());
        assert_eq!(slip_range("-0.2..=1.2"), Ok((-0.2, 1.2)));
        assert_eq!(slip_range("0.5"), Ok((0.5, 0.5)));
        assert!(slip_range("1..=0").is_err() && slip_range("0..=11").is_err());
        assert!(steps("0").is_err() && steps("10001").is_err() && steps("20").is_ok());
        assert!(harmonic("1").is_err() && harmonic("5").is_ok());
        assert_eq!(slot_range("6..10"), Ok(6..=9));
        assert!(slot_range("2..=12").is_err() && pole_range("0..=4").is_err());
        assert!(layers("3").is_err() && phases("4").is_err() && phases("5").is_ok());
        assert!(upto("0").is_err() && upto("25").is_ok() && degrees("inf").is_err());
        assert!(slot_opening("1").is_err() && slot_opening("0.5").is_ok());
        assert!(dpi("5").is_err() && dpi("150").is_ok());
        assert!(wire_size("0").is_err() && wire_size("1.12").is_ok());
        assert!(wires_in_hand("0").is_err() && wires_in_hand("101").is_err());
        assert!(gap_t("1.6").is_err() && gap_t("0.8").is_ok() && iron_t("NaN").is_err());
        assert!(current_density("0").is_err() && fill("0.95").is_err());
        assert!(emf_ratio("1.2").is_err() && emf_ratio("0.97").is_ok());
    }
}
