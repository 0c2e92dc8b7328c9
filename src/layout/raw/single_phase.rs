//! The single-phase tables of a layout: `[main]`, `[aux]`, `[capacitor]` and `[circuit]`.

use serde::Deserialize;

use super::{Checker, RawLayout};
use crate::design::{
    CapacitorDuty, Circuit, Design, Insulation, PartSpec, PartTurns, SinglePhase, WireSize,
};
use crate::layout::{LayoutError, MAX_TURNS};

/// `[main]` or `[aux]`: one winding of a single-phase stator.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub(super) struct RawPart {
    coils_per_group: Option<i64>,
    turns: RawTurns,
    /// Main only: 1, or 2 for a dual-voltage main in two equal sections.
    sections: Option<i64>,
    /// Aux only: its wire when it differs from `[wire]`.
    wire_diameter_mm: Option<f64>,
    /// Its resistance at 20 °C given directly, ohms.
    resistance_ohm: Option<f64>,
}

/// A group's turns: a total to be graded, or one count per coil.
#[derive(Debug, Clone, Deserialize)]
#[serde(untagged)]
enum RawTurns {
    Total(i64),
    Each(Vec<i64>),
}

/// `[capacitor]`: what is in series with the auxiliary winding.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub(super) struct RawCapacitor {
    duty: CapacitorDuty,
    slip: Option<f64>,
}

/// `[circuit]`: the motor's equivalent circuit referred to the main winding.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub(super) struct RawCircuit {
    magnetizing_reactance_ohm: f64,
    rotor_resistance_ohm: f64,
    rotor_reactance_ohm: f64,
    main_leakage_reactance_ohm: f64,
    aux_leakage_reactance_ohm: Option<f64>,
}

impl RawLayout {
    /// `[measured]` of a single-phase stator: the main's and the auxiliary's readings.
    pub(super) fn single_phase_readings(
        &self,
        c: &Checker,
        m: &super::RawMeasured,
    ) -> Result<crate::design::Measured, LayoutError> {
        if m.line_resistance_ohm.is_some() || m.section_resistance_ohm.is_some() {
            return Err(c.err(
                "measured",
                0,
                if m.line_resistance_ohm.is_some() {
                    "line_resistance_ohm"
                } else {
                    "section_resistance_ohm"
                },
                "a single-phase stator is read across each winding: give \
                 main_resistance_ohm and aux_resistance_ohm"
                    .into(),
            ));
        }
        if m.main_resistance_ohm.is_none() && m.aux_resistance_ohm.is_none() {
            return Err(c.err(
                "measured",
                0,
                "main_resistance_ohm",
                "give main_resistance_ohm, aux_resistance_ohm or both".into(),
            ));
        }
        Ok(crate::design::Measured {
            line_resistance_ohm: None,
            section_resistance_ohm: None,
            six_lead_ohm: None,
            main_resistance_ohm: c.within(
                "measured",
                "main_resistance_ohm",
                m.main_resistance_ohm,
                1e-6,
                1e6,
            )?,
            aux_resistance_ohm: c.within(
                "measured",
                "aux_resistance_ohm",
                m.aux_resistance_ohm,
                1e-6,
                1e6,
            )?,
            temperature_c: c
                .within("measured", "temperature_c", m.temperature_c, -60.0, 250.0)?
                .unwrap_or(20.0),
        })
    }

    /// True when the layout has any single-phase table.
    pub(super) fn has_single_phase_tables(&self) -> Option<&'static str> {
        if self.main.is_some() {
            Some("main")
        } else if self.aux.is_some() {
            Some("aux")
        } else if self.capacitor.is_some() {
            Some("capacitor")
        } else if self.circuit.is_some() {
            Some("circuit")
        } else {
            None
        }
    }

    /// The single-phase tables, checked against the design they belong to.
    pub(super) fn single_phase(&self, c: &Checker, d: &mut Design) -> Result<(), LayoutError> {
        let w = &self.winding;
        let not_here = |key: &str, why: &str| {
            Err(c.err(
                "winding",
                0,
                key,
                format!("a single-phase stator {why}; remove winding.{key}"),
            ))
        };
        if w.pitch.is_some() {
            return not_here(
                "pitch",
                "takes its spans from the groups' coils ([main] and [aux] coils_per_group)",
            );
        }
        if w.connection.is_some() {
            return not_here("connection", "has no star or delta");
        }
        if w.parallel_paths.is_some_and(|a| a != 1) {
            return not_here(
                "parallel_paths",
                "is planned in one path (a dual-voltage main is [main] sections = 2)",
            );
        }
        if w.pole_change.is_some() {
            return not_here("pole_change", "is not a pole-changing winding");
        }
        if w.style.is_some() {
            return not_here("style", "is wound in concentric groups");
        }
        if w.leads.is_some() {
            return not_here(
                "leads",
                "brings out its main and auxiliary leads (four, six with a two-section main)",
            );
        }
        if d.topology != crate::design::Topology::Rotary {
            return Err(c.err(
                "machine",
                0,
                "topology",
                "a single-phase winding is planned on a rotary core; give topology = \
                 \"rotary\""
                    .into(),
            ));
        }
        let (Some(main), Some(aux)) = (&self.main, &self.aux) else {
            return Err(c.err(
                "machine",
                0,
                "phases",
                "a single-phase stator needs a [main] and an [aux] table, each with at least \
                 turns (per pole group, or one count per coil)"
                    .into(),
            ));
        };
        let part = |table: &str, p: &RawPart| -> Result<PartSpec, LayoutError> {
            let coils_per_group = match p.coils_per_group {
                None => None,
                Some(n) => Some(c.range(table, "coils_per_group", n, 1, 100, "coil count")?),
            };
            let turns = match &p.turns {
                RawTurns::Total(t) => PartTurns::PerGroup(c.range(
                    table,
                    "turns",
                    *t,
                    1,
                    MAX_TURNS as i64,
                    "number of turns",
                )? as u32),
                RawTurns::Each(list) => {
                    if list.is_empty() || list.len() > 100 {
                        return Err(c.err(
                            table,
                            0,
                            "turns",
                            "give from 1 to 100 turn counts, one per coil, largest span first"
                                .into(),
                        ));
                    }
                    let mut out = Vec::with_capacity(list.len());
                    for &t in list {
                        out.push(c.range(
                            table,
                            "turns",
                            t,
                            1,
                            MAX_TURNS as i64,
                            "number of turns",
                        )? as u32);
                    }
                    PartTurns::PerCoil(out)
                }
            };
            Ok(PartSpec {
                coils_per_group,
                turns,
            })
        };
        if main.wire_diameter_mm.is_some() {
            return Err(c.err(
                "main",
                0,
                "wire_diameter_mm",
                "the main winding's wire is the [wire] table; give it there".into(),
            ));
        }
        if aux.sections.is_some() {
            return Err(c.err(
                "aux",
                0,
                "sections",
                "the auxiliary winding is one section; remove aux.sections".into(),
            ));
        }
        let sections = c.range(
            "main",
            "sections",
            main.sections.unwrap_or(1),
            1,
            2,
            "sections",
        )?;
        if sections == 2 && d.poles < 2 {
            return Err(c.err(
                "main",
                0,
                "sections",
                "two sections need at least two pole groups".into(),
            ));
        }
        let aux_wire =
            match c.within("aux", "wire_diameter_mm", aux.wire_diameter_mm, 0.01, 20.0)? {
                None => None,
                Some(dia) => {
                    let Some(base) = d.wire else {
                        return Err(c.err(
                            "aux",
                            0,
                            "wire_diameter_mm",
                            "the auxiliary's wire takes the main's [wire] table for its metal and \
                         enamel; give [wire] too"
                                .into(),
                        ));
                    };
                    Some(crate::design::WireSpec {
                        size: WireSize::Diameter(crate::units::Length::from_mm(dia)),
                        strands_in_hand: 1,
                        insulation: match base.insulation {
                            Insulation::Grade(g) => Insulation::Grade(g),
                            // An overall diameter given for the main's wire says nothing of the
                            // auxiliary's: grade 2, the common enamel.
                            Insulation::Diameter(_) => Insulation::Grade(2),
                        },
                        material: base.material,
                    })
                }
            };
        if let Some(r) = c.within("main", "resistance_ohm", main.resistance_ohm, 1e-6, 1e6)? {
            d.phase_resistance_ohm = Some(r);
        }
        let (capacitor, slip) = match &self.capacitor {
            None => (CapacitorDuty::None, None),
            Some(k) => (k.duty, c.within("capacitor", "slip", k.slip, 1e-4, 0.5)?),
        };
        let circuit = match &self.circuit {
            None => None,
            Some(k) => {
                let x = |key: &str, v: f64| -> Result<f64, LayoutError> {
                    Ok(c.within("circuit", key, Some(v), 1e-6, 1e6)?.unwrap_or(v))
                };
                Some(Circuit {
                    magnetizing_reactance_ohm: x(
                        "magnetizing_reactance_ohm",
                        k.magnetizing_reactance_ohm,
                    )?,
                    rotor_resistance_ohm: x("rotor_resistance_ohm", k.rotor_resistance_ohm)?,
                    rotor_reactance_ohm: x("rotor_reactance_ohm", k.rotor_reactance_ohm)?,
                    main_leakage_reactance_ohm: x(
                        "main_leakage_reactance_ohm",
                        k.main_leakage_reactance_ohm,
                    )?,
                    aux_leakage_reactance_ohm: c.within(
                        "circuit",
                        "aux_leakage_reactance_ohm",
                        k.aux_leakage_reactance_ohm,
                        1e-6,
                        1e6,
                    )?,
                })
            }
        };
        d.single_phase = Some(SinglePhase {
            main: part("main", main)?,
            aux: part("aux", aux)?,
            grading: w.grading.unwrap_or(crate::design::Grading::Sine),
            capacitor,
            slip,
            circuit,
            main_sections: sections as u8,
            aux_wire,
            aux_resistance_ohm: c.within("aux", "resistance_ohm", aux.resistance_ohm, 1e-6, 1e6)?,
        });
        Ok(())
    }
}
