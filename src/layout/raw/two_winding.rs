//! Two separate windings in one core: the `[second_winding]` table and the coils and
//! groups of a record marked `winding = 2`. Each winding is validated as a layout of its
//! own (the same core, supply and wire) so that every rule of a single winding holds for
//! both; a refusal names the key the user wrote, with its line.

use serde::Deserialize;

use super::{Checker, RawLayout, RawMeasured, RawWinding, locate};
use crate::design::{Connection, Style, Topology};
use crate::layout::LayoutError;
use beltwright_model::spec::{SecondWinding, Sharing, Spec, speed_numbers};

/// `[second_winding]`: the second winding's pole count and its `[winding]` choices, with
/// the readings and nameplate figures that are its own.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub(super) struct RawSecond {
    poles: i64,
    sharing: Option<RawSharing>,
    layers: i64,
    pitch: Option<i64>,
    style: Option<Style>,
    turns_per_coil: Option<i64>,
    parallel_paths: Option<i64>,
    connection: Option<Connection>,
    leads: Option<i64>,
    phase_resistance_ohm: Option<f64>,
    wire_diameter_mm: Option<f64>,
    line_resistance_ohm: Option<Vec<f64>>,
    current_a: Option<f64>,
    speed_rpm: Option<f64>,
    power_kw: Option<f64>,
    power_hp: Option<f64>,
}

#[derive(Debug, Clone, Copy, Deserialize)]
#[serde(rename_all = "kebab-case")]
enum RawSharing {
    Layers,
    Slots,
}

impl RawLayout {
    /// Validate a layout that may carry a second winding: the first winding from the file
    /// with the second's coils set aside, then the second from the file read again with
    /// its own poles and choices in place of the first's.
    pub fn validate_windings(mut self, source: &str, file: &str) -> Result<Spec, LayoutError> {
        let c = Checker { source, file };
        let second = self.second_winding.take();
        let (coils1, coils2) = split(self.coil.iter().map(|k| k.winding), &c, "coil", &second)?;
        let (groups1, groups2) = split(self.group.iter().map(|g| g.winding), &c, "group", &second)?;
        let Some(raw2) = second else {
            return self.validate(source, file);
        };
        self.refuse_with_second(&c)?;
        // The file as the second winding's own layout, before the first's coils are kept.
        let mut again = self.clone();
        keep(&mut self.coil, &coils1);
        keep(&mut self.group, &groups1);
        // Each winding brings out its three line leads unless six are asked for.
        self.winding.leads.get_or_insert(3);
        let first = self
            .validate(source, file)
            .map_err(|e| relocate(e, source, &coils1, &groups1, None))?;
        if raw2.leads.is_some_and(|n| n != 3 && n != 6) {
            return Err(c.err(
                "second_winding",
                0,
                "leads",
                "each winding of a two-winding motor brings out three leads, or six with its \
                 phase ends apart (an open delta); give leads = 3 or 6"
                    .into(),
            ));
        }
        if raw2.poles == first.design.poles as i64 {
            return Err(c.err(
                "second_winding",
                0,
                "poles",
                format!(
                    "the second winding has the same {} poles as the first; the windings of a \
                     two-winding motor have different pole counts (one for each speed)",
                    raw2.poles
                ),
            ));
        }
        keep(&mut again.coil, &coils2);
        keep(&mut again.group, &groups2);
        // Keys the second winding's refusals name as the user wrote them in
        // [second_winding].
        let mut renamed: Vec<(&'static str, &'static str)> = vec![
            ("machine.poles", "poles"),
            ("measured.line_resistance_ohm", "line_resistance_ohm"),
        ];
        for (given, from, to) in [
            (
                raw2.wire_diameter_mm.is_some(),
                "wire.diameter_mm",
                "wire_diameter_mm",
            ),
            (raw2.current_a.is_some(), "nameplate.current_a", "current_a"),
            (raw2.speed_rpm.is_some(), "nameplate.speed_rpm", "speed_rpm"),
            (raw2.power_kw.is_some(), "nameplate.power_kw", "power_kw"),
            (raw2.power_hp.is_some(), "nameplate.power_hp", "power_hp"),
        ] {
            if given {
                renamed.push((from, to));
            }
        }
        again.machine.poles = raw2.poles;
        again.winding = RawWinding {
            layers: raw2.layers,
            pitch: raw2.pitch,
            style: raw2.style,
            turns_per_coil: raw2.turns_per_coil,
            parallel_paths: raw2.parallel_paths,
            connection: raw2.connection,
            skew: again.winding.skew,
            leads: Some(raw2.leads.unwrap_or(3)),
            marking: again.winding.marking,
            phase_resistance_ohm: raw2.phase_resistance_ohm,
            temperature_c: again.winding.temperature_c,
            pole_change: None,
            grading: None,
        };
        if let Some(d) = raw2.wire_diameter_mm {
            // Its own wire: the first's gauge, insulated diameter and strands do not apply.
            let wire = again.wire.get_or_insert_with(Default::default);
            wire.diameter_mm = Some(d);
            wire.awg = None;
            wire.insulated_diameter_mm = None;
            wire.strands_in_hand = None;
        }
        again.measured = match (again.measured.take(), raw2.line_resistance_ohm) {
            (_, None) => None,
            (m, Some(r)) => Some(RawMeasured {
                line_resistance_ohm: Some(r),
                section_resistance_ohm: None,
                six_lead_ohm: None,
                main_resistance_ohm: None,
                aux_resistance_ohm: None,
                temperature_c: m.and_then(|m| m.temperature_c),
            }),
        };
        // Its rating: its own current, speed and power; the frame, voltage, frequency and
        // insulation are the motor's; the first winding's connection, efficiency, power
        // factor and service factor are not its.
        let rated = raw2.current_a.is_some()
            || raw2.speed_rpm.is_some()
            || raw2.power_kw.is_some()
            || raw2.power_hp.is_some();
        if rated && again.nameplate.is_none() {
            again.nameplate = Some(Default::default());
        }
        if let Some(n) = again.nameplate.as_mut() {
            n.current_a = raw2.current_a.map(super::OneOrMore::One);
            n.speed_rpm = raw2.speed_rpm;
            n.power_kw = raw2.power_kw;
            n.power_hp = raw2.power_hp;
            n.connection = None;
            n.efficiency_percent = None;
            n.power_factor = None;
            n.service_factor = None;
        }
        let mut second = again
            .validate(source, file)
            .map_err(|e| relocate(e, source, &coils2, &groups2, Some(&renamed)))?;
        let mut first = first;
        let [one, two] = speed_numbers([first.design.poles, second.design.poles]);
        first.design.leads.speed = one;
        second.design.leads.speed = two;
        let sharing = match raw2.sharing.unwrap_or(RawSharing::Layers) {
            RawSharing::Layers => Sharing::Layers,
            RawSharing::Slots => Sharing::Slots,
        };
        if sharing == Sharing::Slots {
            // Checked after both windings' own ranges, so the numbers here are valid ones.
            alternate_checks(&first, &second, &c)?;
            first.design.alternate_slots = Some(0);
            second.design.alternate_slots = Some(1);
        }
        Ok(Spec {
            second: Some(Box::new(SecondWinding {
                spec: second,
                sharing,
            })),
            ..first
        })
    }

    /// What a two-winding core cannot also be.
    fn refuse_with_second(&self, c: &Checker) -> Result<(), LayoutError> {
        let refuse =
            |table: &str, key: &str, message: &str| Err(c.err(table, 0, key, message.to_string()));
        if self.machine.topology != Topology::Rotary {
            return refuse(
                "machine",
                "topology",
                "two windings in one core are for rotary stators; a flat primary takes one \
                 winding (remove [second_winding])",
            );
        }
        if self.machine.phases.is_some_and(|p| p != 3) {
            return refuse(
                "machine",
                "phases",
                "a two-winding motor here is three-phase; give phases = 3, or remove \
                 [second_winding]",
            );
        }
        if self.winding.pole_change.is_some() {
            return refuse(
                "winding",
                "pole_change",
                "a pole-changing winding beside a second winding (a three-speed motor) is not \
                 built; remove pole_change or [second_winding]",
            );
        }
        if self.winding.leads.is_some_and(|n| n != 3 && n != 6) {
            return refuse(
                "winding",
                "leads",
                "each winding of a two-winding motor brings out three leads, or six with its \
                 phase ends apart (an open delta); give leads = 3 or 6",
            );
        }
        if let Some(t) = self.has_single_phase_tables() {
            return refuse(
                t,
                "turns",
                "a single-phase table does not belong with [second_winding]",
            );
        }
        Ok(())
    }
}

/// Indices of the entries of each winding, in file order; a `winding` other than 1 or 2
/// (or 2 without `[second_winding]`) is refused.
fn split(
    marks: impl Iterator<Item = Option<i64>>,
    c: &Checker,
    table: &str,
    second: &Option<RawSecond>,
) -> Result<(Vec<usize>, Vec<usize>), LayoutError> {
    let (mut one, mut two) = (Vec::new(), Vec::new());
    for (i, m) in marks.enumerate() {
        match m {
            None | Some(1) => one.push(i),
            Some(2) if second.is_some() => two.push(i),
            Some(2) => {
                return Err(c.err(
                    table,
                    i,
                    "winding",
                    "winding 2 needs a [second_winding] table describing it; add one, or \
                     remove the key"
                        .into(),
                ));
            }
            Some(n) => {
                return Err(c.err(
                    table,
                    i,
                    "winding",
                    format!("{n} is not a winding of this core; give 1 or 2"),
                ));
            }
        }
    }
    Ok((one, two))
}

/// Keep the entries at `indices` (ascending), in order.
fn keep<T>(v: &mut Vec<T>, indices: &[usize]) {
    let mut i = 0;
    let mut next = indices.iter().peekable();
    v.retain(|_| {
        let kept = next.peek().is_some_and(|&&k| k == i);
        if kept {
            next.next();
        }
        i += 1;
        kept
    });
}

/// A refusal of one winding's layout, with its key and line as the user wrote them: the
/// n-th coil or group of the winding is the file's, and the second winding's choices are
/// keys of `[second_winding]`.
fn relocate(
    e: LayoutError,
    source: &str,
    coils: &[usize],
    groups: &[usize],
    second: Option<&[(&str, &str)]>,
) -> LayoutError {
    let LayoutError::Invalid {
        file,
        key,
        line,
        message,
    } = e
    else {
        return e;
    };
    let entry = |table: &str, map: &[usize], rest: &str| -> Option<(String, Option<usize>)> {
        let (n, field) = rest.split_once("].")?;
        let n: usize = n.parse().ok()?;
        let orig = *map.get(n.checked_sub(1)?)?;
        Some((
            format!("{table}[{}].{field}", orig + 1),
            locate(source, table, orig, field),
        ))
    };
    let moved = if let Some(rest) = key.strip_prefix("coil[") {
        entry("coil", coils, rest)
    } else if let Some(rest) = key.strip_prefix("group[") {
        entry("group", groups, rest)
    } else if let Some(renamed) = second {
        let own = renamed
            .iter()
            .find(|(from, _)| *from == key)
            .map(|(_, to)| *to)
            .or_else(|| key.strip_prefix("winding."));
        own.map(|k| {
            (
                format!("second_winding.{k}"),
                locate(source, "second_winding", 0, k),
            )
        })
    } else {
        None
    };
    match moved {
        Some((key, at)) => LayoutError::Invalid {
            file,
            key,
            line: at.or(line),
            message,
        },
        None => LayoutError::Invalid {
            file,
            key,
            line,
            message,
        },
    }
}

/// A core shared by slots: an even slot count, and spans that go from a winding's slot to
/// another of its own (an even number of slot pitches). Both windings are validated.
fn alternate_checks(first: &Spec, second: &Spec, c: &Checker) -> Result<(), LayoutError> {
    let slots = first.design.slots;
    if !slots.is_multiple_of(2) {
        return Err(c.err(
            "machine",
            0,
            "slots",
            format!(
                "{slots} slots cannot be shared by slots (every other slot each); give an even \
                 slot count, or sharing = \"layers\""
            ),
        ));
    }
    for (table, pitch) in [
        ("winding", first.design.pitch),
        ("second_winding", second.design.pitch),
    ] {
        if let Some(y) = pitch
            && !y.is_multiple_of(2)
        {
            let lower = if y > 2 { y - 1 } else { y + 1 };
            return Err(c.err(
                table,
                0,
                "pitch",
                format!(
                    "a winding in every other slot spans an even number of slot pitches, not \
                     {y}; give {lower} or {}",
                    y.saturating_add(1)
                ),
            ));
        }
    }
    Ok(())
}
