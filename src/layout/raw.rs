//! The layout file exactly as written, before validation.

use serde::Deserialize;

use super::{
    CoilEntry, Connection, Core, LayoutError, MAX_COILS, MAX_PHASES, MAX_POLES, MAX_SLOTS,
    MAX_TURNS, Spec, Style, Supply, Topology, locate,
};

/// Top level of a layout file (contract: `../shared/design.md`).
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawLayout {
    title: Option<String>,
    machine: RawMachine,
    winding: RawWinding,
    core: Option<RawCore>,
    supply: Option<RawSupply>,
    drawing: Option<RawDrawing>,
    #[serde(default)]
    coil: Vec<RawCoil>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawMachine {
    topology: Topology,
    slots: i64,
    poles: i64,
    phases: Option<i64>,
    phase_labels: Option<Vec<String>>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawWinding {
    layers: i64,
    pitch: Option<i64>,
    style: Option<Style>,
    turns_per_coil: Option<i64>,
    parallel_paths: Option<i64>,
    connection: Option<Connection>,
    skew: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawCore {
    slot_pitch_mm: Option<f64>,
    bore_mm: Option<f64>,
    stack_mm: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawSupply {
    frequency_hz: Option<f64>,
    line_voltage_v: Option<f64>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawDrawing {
    colours: Option<Vec<String>>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawCoil {
    phase: String,
    go: i64,
    back: i64,
    turns: Option<i64>,
    path: Option<i64>,
}

/// Builds [`LayoutError::Invalid`] with the line looked up in the source.
struct Checker<'a> {
    source: &'a str,
    file: &'a str,
}

impl Checker<'_> {
    fn err(&self, table: &str, index: usize, key: &str, message: String) -> LayoutError {
        let dotted = match table {
            "" => key.to_string(),
            "coil" => format!("coil[{}].{key}", index + 1),
            t => format!("{t}.{key}"),
        };
        LayoutError::Invalid {
            file: self.file.to_string(),
            key: dotted,
            line: locate(self.source, table, index, key),
            message,
        }
    }

    /// An integer in `lo..=hi`, else an error that says so.
    fn range(
        &self,
        table: &str,
        key: &str,
        value: i64,
        lo: i64,
        hi: i64,
        what: &str,
    ) -> Result<usize, LayoutError> {
        if value < lo || value > hi {
            return Err(self.err(
                table,
                0,
                key,
                format!("{value} is not a valid {what}; give a whole number from {lo} to {hi}"),
            ));
        }
        Ok(value as usize)
    }

    /// A finite positive size in millimetres or a supply figure.
    fn positive(
        &self,
        table: &str,
        key: &str,
        value: Option<f64>,
        hi: f64,
    ) -> Result<Option<f64>, LayoutError> {
        match value {
            None => Ok(None),
            Some(v) if v.is_finite() && v > 0.0 && v <= hi => Ok(Some(v)),
            Some(v) => Err(self.err(
                table,
                0,
                key,
                format!("{v} is not valid; give a positive number up to {hi}"),
            )),
        }
    }
}

impl RawLayout {
    /// Check every value and produce a [`Spec`].
    pub fn validate(self, source: &str, file: &str) -> Result<Spec, LayoutError> {
        let c = Checker { source, file };
        let m = &self.machine;
        let slots = c.range(
            "machine",
            "slots",
            m.slots,
            3,
            MAX_SLOTS as i64,
            "slot count",
        )?;
        let poles = c.range(
            "machine",
            "poles",
            m.poles,
            1,
            MAX_POLES as i64,
            "pole count",
        )?;
        if m.topology == Topology::Rotary && poles % 2 != 0 {
            return Err(c.err(
                "machine",
                0,
                "poles",
                format!(
                    "a closed rotary core needs an even pole count, not {poles}; \
                     try {} or {} (odd pole counts are for linear primaries)",
                    poles.saturating_sub(1).max(2),
                    poles + 1
                ),
            ));
        }
        let phases = c.range(
            "machine",
            "phases",
            m.phases.unwrap_or(3),
            1,
            MAX_PHASES as i64,
            "phase count",
        )?;
        if phases < 3 || phases % 2 == 0 {
            return Err(c.err(
                "machine",
                0,
                "phases",
                format!(
                    "{phases} phases are not supported; give an odd phase count of 3 or more \
                     (3 for a three-phase winding)"
                ),
            ));
        }
        let phase_labels = match &m.phase_labels {
            Some(labels) => {
                if labels.len() != phases {
                    return Err(c.err(
                        "machine",
                        0,
                        "phase_labels",
                        format!(
                            "{} labels given for {phases} phases; give one label per phase",
                            labels.len()
                        ),
                    ));
                }
                for (i, l) in labels.iter().enumerate() {
                    if l.trim().is_empty() || l.chars().count() > 8 {
                        return Err(c.err(
                            "machine",
                            0,
                            "phase_labels",
                            format!("label {} ({l:?}) must be 1 to 8 characters", i + 1),
                        ));
                    }
                    if labels[..i].contains(l) {
                        return Err(c.err(
                            "machine",
                            0,
                            "phase_labels",
                            format!("label {l:?} is given twice; labels must differ"),
                        ));
                    }
                }
                labels.clone()
            }
            None if phases == 3 => vec!["U".into(), "V".into(), "W".into()],
            None => (1..=phases).map(|i| format!("P{i}")).collect(),
        };

        let w = &self.winding;
        let layers = c.range("winding", "layers", w.layers, 1, 2, "layer count")?;
        let pitch = match w.pitch {
            None => None,
            Some(y) => Some(c.range(
                "winding",
                "pitch",
                y,
                1,
                slots as i64 - 1,
                &format!("coil span for a {slots}-slot core"),
            )?),
        };
        let style = w.style.unwrap_or(Style::Lap);
        if style == Style::Concentric && layers != 1 {
            return Err(c.err(
                "winding",
                0,
                "style",
                "a concentric winding is single layer; set layers = 1 or style = \"lap\"".into(),
            ));
        }
        let turns_per_coil = c.range(
            "winding",
            "turns_per_coil",
            w.turns_per_coil.unwrap_or(1),
            1,
            MAX_TURNS as i64,
            "number of turns",
        )? as u32;
        let parallel_paths = c.range(
            "winding",
            "parallel_paths",
            w.parallel_paths.unwrap_or(1),
            1,
            poles.max(1) as i64 * 2,
            "parallel path count",
        )?;
        let skew_slots = match w.skew {
            None => 0.0,
            Some(s) if s.is_finite() && (0.0..=slots as f64).contains(&s) => s,
            Some(s) => {
                return Err(c.err(
                    "winding",
                    0,
                    "skew",
                    format!("{s} is not valid; give a skew from 0 to {slots} slot pitches"),
                ));
            }
        };

        let core = match &self.core {
            None => Core::default(),
            Some(k) => Core {
                slot_pitch_m: c
                    .positive("core", "slot_pitch_mm", k.slot_pitch_mm, 10_000.0)?
                    .map(|v| v * 1e-3),
                bore_m: c
                    .positive("core", "bore_mm", k.bore_mm, 100_000.0)?
                    .map(|v| v * 1e-3),
                stack_m: c
                    .positive("core", "stack_mm", k.stack_mm, 100_000.0)?
                    .map(|v| v * 1e-3),
            },
        };
        let supply = match &self.supply {
            None => Supply::default(),
            Some(s) => Supply {
                frequency_hz: c.positive("supply", "frequency_hz", s.frequency_hz, 1e6)?,
                line_voltage_v: c.positive("supply", "line_voltage_v", s.line_voltage_v, 1e6)?,
            },
        };

        if self.coil.len() > MAX_COILS {
            return Err(c.err(
                "coil",
                MAX_COILS,
                "phase",
                format!(
                    "{} coils listed; at most {MAX_COILS} are accepted",
                    self.coil.len()
                ),
            ));
        }
        let mut coils = Vec::with_capacity(self.coil.len());
        for (i, rc) in self.coil.iter().enumerate() {
            let phase = phase_labels
                .iter()
                .position(|l| *l == rc.phase)
                .ok_or_else(|| {
                    c.err(
                        "coil",
                        i,
                        "phase",
                        format!(
                            "{:?} is not a phase of this machine; use one of {}",
                            rc.phase,
                            phase_labels.join(", ")
                        ),
                    )
                })?;
            let slot = |key: &str, v: i64| {
                if v < 1 || v > slots as i64 {
                    Err(c.err(
                        "coil",
                        i,
                        key,
                        format!("slot {v} is outside the core; slots are numbered 1 to {slots}"),
                    ))
                } else {
                    Ok(v as usize - 1)
                }
            };
            let go = slot("go", rc.go)?;
            let back = slot("back", rc.back)?;
            if go == back {
                return Err(c.err(
                    "coil",
                    i,
                    "back",
                    format!(
                        "a coil cannot go and come back in the same slot ({})",
                        rc.go
                    ),
                ));
            }
            let turns = match rc.turns {
                None => turns_per_coil,
                Some(t) if (1..=MAX_TURNS as i64).contains(&t) => t as u32,
                Some(t) => {
                    return Err(c.err(
                        "coil",
                        i,
                        "turns",
                        format!("{t} is not valid; give a whole number from 1 to {MAX_TURNS}"),
                    ));
                }
            };
            let path = match rc.path {
                None => 0,
                Some(p) if p >= 1 && p <= parallel_paths as i64 => p as usize - 1,
                Some(p) => {
                    return Err(c.err(
                        "coil",
                        i,
                        "path",
                        format!(
                            "path {p} does not exist; winding.parallel_paths = {parallel_paths}, \
                             so give 1 to {parallel_paths}"
                        ),
                    ));
                }
            };
            coils.push(CoilEntry {
                phase,
                go,
                back,
                turns,
                path,
            });
        }

        let colours = match self.drawing.and_then(|d| d.colours) {
            None => None,
            Some(cs) => {
                if cs.len() != phases {
                    return Err(c.err(
                        "drawing",
                        0,
                        "colours",
                        format!("{} colours given for {phases} phases", cs.len()),
                    ));
                }
                for col in &cs {
                    if !is_hex_colour(col) {
                        return Err(c.err(
                            "drawing",
                            0,
                            "colours",
                            format!("{col:?} is not a colour; write it as \"#rrggbb\""),
                        ));
                    }
                }
                Some(cs)
            }
        };

        Ok(Spec {
            title: self.title,
            topology: m.topology,
            slots,
            poles,
            phases,
            phase_labels,
            layers,
            pitch,
            style,
            turns_per_coil,
            parallel_paths,
            connection: w.connection.unwrap_or(Connection::Star),
            skew_slots,
            core,
            supply,
            coils,
            colours,
        })
    }
}

fn is_hex_colour(s: &str) -> bool {
    s.len() == 7 && s.starts_with('#') && s[1..].chars().all(|c| c.is_ascii_hexdigit())
}
