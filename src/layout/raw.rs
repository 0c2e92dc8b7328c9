//! The layout file exactly as written, before validation.

use serde::Deserialize;

use crate::units::{Area, Conductivity, Length};

mod single_phase;
mod two_winding;

use crate::design::{
    BACKING_STEEL_MS_M, BACKING_STEEL_PERMEABILITY, Backing, Design, Insulation, Leads, Marking,
    Material, Measured, Secondary, TurnRule, WireSize, WireSpec,
};

use super::{
    CoilEntry, Connection, Core, LayoutError, MAX_COILS, MAX_PHASES, MAX_POLES, MAX_SLOTS,
    MAX_TURNS, Spec, Style, Supply, Topology, locate,
};

/// Top level of a layout file (contract: `../shared/design.md`).
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawLayout {
    title: Option<String>,
    machine: RawMachine,
    winding: RawWinding,
    core: Option<RawCore>,
    supply: Option<RawSupply>,
    wire: Option<RawWire>,
    measured: Option<RawMeasured>,
    secondary: Option<RawSecondary>,
    drawing: Option<RawDrawing>,
    nameplate: Option<RawNameplate>,
    job: Option<RawJob>,
    #[serde(default)]
    coil: Vec<RawCoil>,
    #[serde(default)]
    group: Vec<RawGroup>,
    main: Option<single_phase::RawPart>,
    aux: Option<single_phase::RawPart>,
    capacitor: Option<single_phase::RawCapacitor>,
    circuit: Option<single_phase::RawCircuit>,
    second_winding: Option<two_winding::RawSecond>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawMachine {
    topology: Topology,
    slots: i64,
    poles: i64,
    phases: Option<i64>,
    phase_labels: Option<Vec<String>>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawWinding {
    layers: i64,
    pitch: Option<i64>,
    style: Option<Style>,
    turns_per_coil: Option<i64>,
    parallel_paths: Option<i64>,
    connection: Option<Connection>,
    skew: Option<f64>,
    leads: Option<i64>,
    marking: Option<Marking>,
    phase_resistance_ohm: Option<f64>,
    temperature_c: Option<f64>,
    pole_change: Option<crate::design::PoleChange>,
    grading: Option<crate::design::Grading>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawCore {
    slot_pitch_mm: Option<f64>,
    bore_mm: Option<f64>,
    stack_mm: Option<f64>,
    airgap_mm: Option<f64>,
    slot_opening_mm: Option<f64>,
    slot_area_mm2: Option<f64>,
    slot_width_mm: Option<f64>,
    slot_depth_mm: Option<f64>,
    tooth_width_mm: Option<f64>,
    yoke_depth_mm: Option<f64>,
    outside_diameter_mm: Option<f64>,
    stacking_factor: Option<f64>,
    mean_turn_mm: Option<f64>,
    end_allowance_mm: Option<f64>,
    end_factor: Option<f64>,
}

#[derive(Debug, Clone, Default, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawWire {
    diameter_mm: Option<f64>,
    awg: Option<i64>,
    strands_in_hand: Option<i64>,
    grade: Option<i64>,
    insulated_diameter_mm: Option<f64>,
    material: Option<Material>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawMeasured {
    line_resistance_ohm: Option<Vec<f64>>,
    section_resistance_ohm: Option<Vec<f64>>,
    six_lead_ohm: Option<Vec<f64>>,
    main_resistance_ohm: Option<f64>,
    aux_resistance_ohm: Option<f64>,
    temperature_c: Option<f64>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawSecondary {
    material: Option<PlateMaterial>,
    conductivity_ms_m: Option<f64>,
    thickness_mm: f64,
    width_mm: Option<f64>,
    back_iron: Option<bool>,
    temperature_c: Option<f64>,
    backing_thickness_mm: Option<f64>,
    backing_conductivity_ms_m: Option<f64>,
    backing_permeability: Option<f64>,
}

/// Plate metals with a tabulated conductivity.
#[derive(Debug, Clone, Copy, Deserialize)]
#[serde(rename_all = "lowercase")]
enum PlateMaterial {
    #[serde(alias = "aluminum")]
    Aluminium,
    Copper,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawSupply {
    frequency_hz: Option<f64>,
    line_voltage_v: Option<f64>,
}

/// A number, or a list of numbers (one per rated voltage).
#[derive(Debug, Clone, Deserialize)]
#[serde(untagged)]
enum OneOrMore {
    One(f64),
    More(Vec<f64>),
}

impl OneOrMore {
    fn values(&self) -> Vec<f64> {
        match self {
            OneOrMore::One(v) => vec![*v],
            OneOrMore::More(v) => v.clone(),
        }
    }
}

/// Text, or a TOML date written bare (`date = 2026-12-03`).
#[derive(Debug, Clone, Deserialize)]
#[serde(untagged)]
enum TextOrDate {
    Text(String),
    Number(i64),
    Date(toml::value::Datetime),
}

#[derive(Debug, Clone, Default, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawNameplate {
    power_kw: Option<f64>,
    power_hp: Option<f64>,
    voltage_v: Option<OneOrMore>,
    current_a: Option<OneOrMore>,
    speed_rpm: Option<f64>,
    frequency_hz: Option<f64>,
    frame: Option<String>,
    connection: Option<String>,
    insulation_class: Option<crate::design::InsulationClass>,
    efficiency_percent: Option<f64>,
    power_factor: Option<f64>,
    service_factor: Option<f64>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawJob {
    number: Option<TextOrDate>,
    customer: Option<String>,
    date: Option<TextOrDate>,
    technician: Option<String>,
    notes: Option<String>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawDrawing {
    colours: Option<Vec<String>>,
}

/// A coil group written at once: `coils` coils of one phase from slot `first`, each `step`
/// slots on from the last, of span `span` (lap), or nested around one centre with spans
/// `span`, `span − 2`, ... (concentric).
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawGroup {
    phase: String,
    first: i64,
    coils: i64,
    span: i64,
    step: Option<i64>,
    shape: Option<Style>,
    polarity: Option<String>,
    turns: Option<i64>,
    path: Option<i64>,
    winding: Option<i64>,
}

#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
struct RawCoil {
    phase: String,
    go: i64,
    back: i64,
    turns: Option<i64>,
    path: Option<i64>,
    winding: Option<i64>,
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
            "coil" | "group" => format!("{table}[{}].{key}", index + 1),
            t => format!("{t}.{key}"),
        };
        LayoutError::Invalid {
            file: self.file.to_string(),
            key: dotted,
            line: locate(self.source, table, index, key),
            message,
        }
    }

    /// A coil's (or group's) phase by its label, entry `i` of `table`.
    fn phase_of(
        &self,
        table: &str,
        i: usize,
        label: &str,
        labels: &[String],
    ) -> Result<usize, LayoutError> {
        labels.iter().position(|l| l == label).ok_or_else(|| {
            self.err(
                table,
                i,
                "phase",
                format!(
                    "{label:?} is not a phase of this machine; use one of {}",
                    labels.join(", ")
                ),
            )
        })
    }

    /// A coil's (or group's) turns: as given, within 1..=MAX_TURNS, or `default`.
    fn turns_of(
        &self,
        table: &str,
        i: usize,
        turns: Option<i64>,
        default: u32,
    ) -> Result<u32, LayoutError> {
        match turns {
            None => Ok(default),
            Some(t) if (1..=MAX_TURNS as i64).contains(&t) => Ok(t as u32),
            Some(t) => Err(self.err(
                table,
                i,
                "turns",
                format!("{t} is not valid; give a whole number from 1 to {MAX_TURNS}"),
            )),
        }
    }

    /// A coil's (or group's) parallel path, 0-based: as given (from 1), or the first.
    fn path_of(
        &self,
        table: &str,
        i: usize,
        path: Option<i64>,
        paths: usize,
    ) -> Result<usize, LayoutError> {
        match path {
            None => Ok(0),
            Some(p) if p >= 1 && p <= paths as i64 => Ok(p as usize - 1),
            Some(p) => Err(self.err(
                table,
                i,
                "path",
                format!(
                    "path {p} does not exist; winding.parallel_paths = {paths}, so give 1 to \
                     {paths}"
                ),
            )),
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

    /// A finite number in `lo..=hi` (a physically meaningful size or supply figure), else
    /// an error that names the valid range.
    fn within(
        &self,
        table: &str,
        key: &str,
        value: Option<f64>,
        lo: f64,
        hi: f64,
    ) -> Result<Option<f64>, LayoutError> {
        match value {
            None => Ok(None),
            Some(v) if v.is_finite() && v >= lo && v <= hi => Ok(Some(v)),
            Some(v) => Err(self.err(
                table,
                0,
                key,
                format!(
                    "{} is not valid; give a number from {lo} to {hi}",
                    crate::numbering::short(v)
                ),
            )),
        }
    }
}

impl RawLayout {
    /// Check every value and produce a [`Spec`].
    pub fn validate(self, source: &str, file: &str) -> Result<Spec, LayoutError> {
        let c = Checker { source, file };
        if let Some(t) = &self.title
            && t.chars().count() > crate::sanitize::MAX_TITLE_CHARS
        {
            return Err(c.err(
                "",
                0,
                "title",
                format!(
                    "{} characters is too long for a title; give at most {}",
                    t.chars().count(),
                    crate::sanitize::MAX_TITLE_CHARS
                ),
            ));
        }
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
            let try_ = if poles == 1 {
                "try 2".to_string()
            } else {
                format!("try {} or {}", poles - 1, poles + 1)
            };
            return Err(c.err(
                "machine",
                0,
                "poles",
                format!(
                    "a closed rotary core needs an even pole count, not {poles}; {try_} (odd \
                     pole counts are for linear primaries)"
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
        let single = phases == 1;
        if !single && (phases < 3 || phases % 2 == 0) {
            return Err(c.err(
                "machine",
                0,
                "phases",
                format!(
                    "{phases} phases are not supported; give an odd phase count of 3 or more \
                     (3 for a three-phase winding), or 1 for a single-phase stator with \
                     [main] and [aux] tables"
                ),
            ));
        }
        if !single && let Some(table) = self.has_single_phase_tables() {
            return Err(c.err(
                "machine",
                0,
                "phases",
                format!(
                    "[{table}] belongs to a single-phase stator; give phases = 1, or remove \
                     [{table}]"
                ),
            ));
        }
        if !single && self.winding.grading.is_some() {
            return Err(c.err(
                "winding",
                0,
                "grading",
                "grading shares a single-phase group's turns; remove it, or give phases = 1".into(),
            ));
        }
        // A single-phase stator's coil list holds its main and auxiliary windings.
        let coil_phases = if single { 2 } else { phases };
        let phase_labels = if single && m.phase_labels.is_none() {
            vec!["main".to_string(), "aux".to_string()]
        } else {
            phase_labels(&c, m.phase_labels.as_deref(), coil_phases)?
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

        let core = self.core_sizes(&c)?;
        let supply = self.supply_figures(&c)?;
        let design = self.shop_data(
            &c,
            Design {
                topology: m.topology,
                slots,
                poles,
                phases,
                phase_labels: phase_labels.clone(),
                layers,
                pitch,
                style,
                turns_per_coil,
                parallel_paths,
                connection: w.connection.unwrap_or(Connection::Star),
                skew_slots,
                core,
                supply,
                ..Design::basic(m.topology, slots, poles, layers)
            },
        )?;

        let mut design = design;
        if single {
            self.single_phase(&c, &mut design)?;
        }
        let coils = self.coil_list(&c, &phase_labels, slots, turns_per_coil, parallel_paths)?;

        let colours = self.colours(&c, coil_phases)?;

        Ok(Spec {
            labels: crate::design::Labels {
                title: self.title,
                colours,
            },
            design,
            coils,
            second: None,
        })
    }

    /// The `[core]` sizes, each within its range (given in millimetres).
    fn core_sizes(&self, c: &Checker) -> Result<Core, LayoutError> {
        Ok(match &self.core {
            None => Core::default(),
            Some(k) => Core {
                slot_pitch: c
                    .within("core", "slot_pitch_mm", k.slot_pitch_mm, 0.1, 10_000.0)?
                    .map(Length::from_mm),
                bore: c
                    .within("core", "bore_mm", k.bore_mm, 1.0, 100_000.0)?
                    .map(Length::from_mm),
                stack: c
                    .within("core", "stack_mm", k.stack_mm, 1.0, 100_000.0)?
                    .map(Length::from_mm),
                ..Core::default()
            },
        })
    }

    /// The `[supply]` figures, each within its range.
    fn supply_figures(&self, c: &Checker) -> Result<Supply, LayoutError> {
        Ok(match &self.supply {
            None => Supply::default(),
            Some(s) => Supply {
                frequency_hz: c.within("supply", "frequency_hz", s.frequency_hz, 0.01, 1e6)?,
                line_voltage_v: c.within("supply", "line_voltage_v", s.line_voltage_v, 1.0, 1e6)?,
            },
        })
    }

    /// The `[[coil]]` list as coil entries (0-based slots and paths), each checked against
    /// the machine: a phase it has, slots on the core, turns and a path that exist.
    fn coil_list(
        &self,
        c: &Checker,
        phase_labels: &[String],
        slots: usize,
        turns_per_coil: u32,
        parallel_paths: usize,
    ) -> Result<Vec<CoilEntry>, LayoutError> {
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
            let phase = c.phase_of("coil", i, &rc.phase, phase_labels)?;
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
            let turns = c.turns_of("coil", i, rc.turns, turns_per_coil)?;
            let path = c.path_of("coil", i, rc.path, parallel_paths)?;
            coils.push(CoilEntry {
                phase,
                go,
                back,
                turns,
                path,
            });
        }
        for (i, g) in self.group.iter().enumerate() {
            self.expand(
                c,
                i,
                g,
                phase_labels,
                slots,
                turns_per_coil,
                parallel_paths,
                &mut coils,
            )?;
        }
        Ok(coils)
    }

    /// One `[[group]]` as its coils, appended to `coils` after the `[[coil]]` entries, each
    /// checked as a listed coil is: exactly the coils a coil-by-coil record of it gives.
    #[allow(clippy::too_many_arguments)]
    fn expand(
        &self,
        c: &Checker,
        i: usize,
        g: &RawGroup,
        phase_labels: &[String],
        slots: usize,
        turns_per_coil: u32,
        parallel_paths: usize,
        coils: &mut Vec<CoilEntry>,
    ) -> Result<(), LayoutError> {
        let err = |key: &str, message: String| Err(c.err("group", i, key, message));
        let phase = c.phase_of("group", i, &g.phase, phase_labels)?;
        let z = slots as i64;
        if !(1..=z).contains(&g.first) {
            return err(
                "first",
                format!(
                    "slot {} is outside the core; slots are numbered 1 to {slots}",
                    g.first
                ),
            );
        }
        let room = MAX_COILS.saturating_sub(coils.len()) as i64;
        if !(1..=room.min(z)).contains(&g.coils) {
            return err(
                "coils",
                format!(
                    "{} is not valid; give 1 to {} coils in a group",
                    g.coils,
                    room.min(z)
                ),
            );
        }
        if !(1..z).contains(&g.span) {
            return err(
                "span",
                format!(
                    "{} is not valid; a coil spans 1 to {} slot pitches",
                    g.span,
                    z - 1
                ),
            );
        }
        let step = g.step.unwrap_or(1);
        if !(1..z).contains(&step) {
            return err(
                "step",
                format!("{step} is not valid; give 1 to {} slot pitches", z - 1),
            );
        }
        let concentric = g.shape == Some(Style::Concentric);
        if concentric && g.span - 2 * (g.coils - 1) < 1 {
            return err(
                "span",
                format!(
                    "{} concentric coils need an outer span of at least {}",
                    g.coils,
                    2 * g.coils - 1
                ),
            );
        }
        let reversed = match g.polarity.as_deref() {
            None | Some("+") => false,
            Some("-") => true,
            Some(other) => {
                return err(
                    "polarity",
                    format!("{other:?} is not a polarity; write \"+\" or \"-\" (wound backwards)"),
                );
            }
        };
        let turns = c.turns_of("group", i, g.turns, turns_per_coil)?;
        let path = c.path_of("group", i, g.path, parallel_paths)?;
        let linear = self.machine.topology == Topology::Linear;
        // A slot number from 1; on a closed core it wraps past slot Z to slot 1.
        let slot = |n: i64, key: &str| -> Result<usize, LayoutError> {
            if linear && n > z {
                return Err(c.err(
                    "group",
                    i,
                    key,
                    format!(
                        "the group reaches slot {n}, beyond slot {slots} of this flat primary; \
                         give a smaller first slot, span or coil count"
                    ),
                ));
            }
            Ok(((n - 1).rem_euclid(z)) as usize)
        };
        for k in 0..g.coils {
            let (go, back) = if concentric {
                (g.first + k, g.first + g.span - k)
            } else {
                let go = g.first + k * step;
                (go, go + g.span)
            };
            let (go, back) = (slot(go, "coils")?, slot(back, "span")?);
            let (go, back) = if reversed { (back, go) } else { (go, back) };
            coils.push(CoilEntry {
                phase,
                go,
                back,
                turns,
                path,
            });
        }
        Ok(())
    }

    /// `[drawing] colours`: one "#rrggbb" per phase.
    fn colours(&self, c: &Checker, phases: usize) -> Result<Option<Vec<String>>, LayoutError> {
        Ok(
            match self.drawing.as_ref().and_then(|d| d.colours.clone()) {
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
            },
        )
    }

    /// The core's iron ([`crate::iron`]): tooth, slot and back-iron sizes in their ranges,
    /// derived from each other, and refused, naming the keys, when they do not close.
    fn iron(&self, c: &Checker, d: &Design) -> Result<Core, LayoutError> {
        let mut core = d.core;
        let Some(k) = &self.core else {
            return Ok(core);
        };
        let mm = |v: Option<f64>| v.map(Length::from_mm);
        let outside = c.within(
            "core",
            "outside_diameter_mm",
            k.outside_diameter_mm,
            1.0,
            100_000.0,
        )?;
        if outside.is_some() && d.topology == Topology::Linear {
            return Err(c.err(
                "core",
                0,
                "outside_diameter_mm",
                "a flat primary has no outside diameter; give yoke_depth_mm, the depth of \
                 iron behind the slots"
                    .into(),
            ));
        }
        let measured = crate::iron::Measured {
            slot_pitch: core.slot_pitch,
            bore: core.bore,
            outside_diameter: mm(outside),
            yoke_depth: mm(c.within("core", "yoke_depth_mm", k.yoke_depth_mm, 0.1, 10_000.0)?),
            tooth_width: mm(c.within("core", "tooth_width_mm", k.tooth_width_mm, 0.1, 1000.0)?),
            slot_width: mm(c.within("core", "slot_width_mm", k.slot_width_mm, 0.1, 1000.0)?),
            slot_depth: mm(c.within("core", "slot_depth_mm", k.slot_depth_mm, 0.1, 1000.0)?),
        };
        let sections =
            crate::iron::resolve(d.topology, d.slots, &measured).map_err(|e| iron_error(c, &e))?;
        core.outside_diameter = sections.outside_diameter;
        core.yoke_depth = sections.yoke_depth;
        core.tooth_width = sections.tooth_width;
        core.slot_depth = sections.slot_depth;
        core.slot_width = sections.slot_width;
        core.slot_bottom_width = sections.slot_width_bottom;
        core.stacking_factor = c.within("core", "stacking_factor", k.stacking_factor, 0.5, 1.0)?;
        Ok(core)
    }

    /// The optional design tables, added to the core design `d`: wire, copper rule, slot
    /// area, gap, secondary, leads and measured values, each checked against its physical
    /// range.
    /// A pole-changing winding (`winding.pole_change`) needs a rotary core, three phases, an
    /// integral-slot layout at `machine.poles` (so both halves of each phase lie at the same
    /// electrical places at twice the poles) and the connection left to the pole change.
    fn pole_change_fits(&self, c: &Checker, d: &Design) -> Result<(), LayoutError> {
        let t = "winding";
        if d.topology != Topology::Rotary {
            return Err(c.err(
                t,
                0,
                "pole_change",
                "a pole-changing winding is for a rotary core; a flat primary changes speed \
                 by its supply frequency"
                    .into(),
            ));
        }
        if self.winding.connection.is_some() {
            return Err(c.err(
                t,
                0,
                "connection",
                "the pole change sets the connection at each speed (series delta or star at \
                 the lower speed, double star at the higher); remove winding.connection"
                    .into(),
            ));
        }
        if self.winding.parallel_paths.is_some_and(|p| p != 1) {
            return Err(c.err(
                t,
                0,
                "parallel_paths",
                "a pole-changing winding's halves are its paths (in series at the lower \
                 speed, in parallel at the higher); remove winding.parallel_paths"
                    .into(),
            ));
        }
        if !crate::winding::pole_change::fits(d.slots, d.poles, d.phases) || 2 * d.poles > MAX_POLES
        {
            let near: Vec<String> = (1..=4).map(|k| (k * 3 * d.poles).to_string()).collect();
            return Err(c.err(
                "machine",
                0,
                "slots",
                format!(
                    "a pole-changing winding for {} and {} poles needs three phases and a \
                     slot count that is a multiple of 3 × {} (whole slots per pole and phase \
                     at {} poles), e.g. {}",
                    d.poles,
                    2 * d.poles,
                    d.poles,
                    d.poles,
                    near.join(", ")
                ),
            ));
        }
        Ok(())
    }

    fn shop_data(&self, c: &Checker, mut d: Design) -> Result<Design, LayoutError> {
        if let Some(k) = &self.core {
            d = self.core_data(c, k, d)?;
        }
        if let Some(wr) = &self.wire {
            d.wire = Some(self.wire_spec(c, wr)?);
        }
        d = self.winding_data(c, d)?;
        if let Some(m) = &self.measured {
            d.measured = Some(self.measured(c, m, &d)?);
        }
        if let Some(n) = &self.nameplate {
            d.nameplate = Some(nameplate(c, n)?);
        }
        if let Some(j) = &self.job {
            d.job = Some(job(c, j)?);
        }
        if let Some(s) = &self.secondary {
            d.secondary = Some(self.secondary(c, s)?);
        }
        Ok(d)
    }

    /// The `[core]` table's shop data: gap, slot opening, the iron, the slot's size and usable
    /// area, and the mean-turn rule.
    fn core_data(&self, c: &Checker, k: &RawCore, mut d: Design) -> Result<Design, LayoutError> {
        let mm = |v: Option<f64>| v.map(Length::from_mm);
        d.airgap = mm(c.within("core", "airgap_mm", k.airgap_mm, 0.01, 1000.0)?);
        d.slot_opening = mm(c.within("core", "slot_opening_mm", k.slot_opening_mm, 0.0, 1000.0)?);
        let area = c.within("core", "slot_area_mm2", k.slot_area_mm2, 0.01, 1e6)?;
        d.core = self.iron(c, &d)?;
        let core = d.core;
        let (bore_w, bottom_w) = (core.slot_width, core.slot_bottom_width);
        // The slot's size: a rectangle, or for parallel-sided teeth a trapezoid taken
        // at its mean width. The usable area for the wire is `slot_area_mm2` when given,
        // else the slot's own area.
        let size = match (bore_w, bottom_w, core.slot_depth) {
            (Some(a), Some(b), Some(h)) => Some(((a + b) / 2.0, h)),
            _ => None,
        };
        d.slot_size = size;
        // A slot given by its width and depth is the usable rectangle, as it always was;
        // a slot left by parallel-sided teeth is the iron's, less liner and wedge.
        let usable = match k.slot_width_mm {
            Some(_) => size.map(|(b, h)| b * h),
            None => size.and_then(|(b, h)| crate::iron::usable_area(b, h)),
        };
        d.slot_area = area.map(Area::from_mm2).or(usable);
        let rule = TurnRule::default();
        d.turn = TurnRule {
            mean_turn: mm(c.within("core", "mean_turn_mm", k.mean_turn_mm, 1.0, 1e6)?),
            end_allowance: mm(c.within(
                "core",
                "end_allowance_mm",
                k.end_allowance_mm,
                0.0,
                10_000.0,
            )?)
            .unwrap_or(rule.end_allowance),
            end_factor: c
                .within("core", "end_factor", k.end_factor, 0.0, 10.0)?
                .unwrap_or(rule.end_factor),
        };
        Ok(d)
    }

    /// The `[wire]` table: bare size, strands in hand, enamel and metal.
    fn wire_spec(&self, c: &Checker, wr: &RawWire) -> Result<WireSpec, LayoutError> {
        let size = match (wr.diameter_mm, wr.awg) {
            (Some(_), Some(_)) => {
                return Err(c.err(
                    "wire",
                    0,
                    "awg",
                    "give the bare size once: diameter_mm or awg, not both".into(),
                ));
            }
            (Some(dm), None) => WireSize::Diameter(Length::from_mm(
                c.within("wire", "diameter_mm", Some(dm), 0.01, 20.0)?
                    .unwrap_or(dm),
            )),
            (None, Some(n)) if (-3..=56).contains(&n) => WireSize::Awg(n as i32),
            (None, Some(n)) => {
                return Err(c.err(
                    "wire",
                    0,
                    "awg",
                    format!(
                        "{n} is not a gauge; give a whole number from -3 (0000) to 56, \
                         e.g. 18"
                    ),
                ));
            }
            (None, None) => {
                return Err(c.err(
                    "wire",
                    0,
                    "diameter_mm",
                    "give the bare wire size as diameter_mm (e.g. 0.85) or awg (e.g. 18)".into(),
                ));
            }
        };
        let strands = c.range(
            "wire",
            "strands_in_hand",
            wr.strands_in_hand.unwrap_or(1),
            1,
            100,
            "number of strands in hand",
        )? as u32;
        let insulation = match (wr.grade, wr.insulated_diameter_mm) {
            (Some(_), Some(_)) => {
                return Err(c.err(
                    "wire",
                    0,
                    "insulated_diameter_mm",
                    "give the enamel once: grade or insulated_diameter_mm, not both".into(),
                ));
            }
            (Some(g), None) => {
                Insulation::Grade(c.range("wire", "grade", g, 1, 3, "IEC 60317 grade")? as u8)
            }
            (None, Some(o)) => Insulation::Diameter(Length::from_mm(
                c.within("wire", "insulated_diameter_mm", Some(o), 0.01, 25.0)?
                    .unwrap_or(o),
            )),
            (None, None) => Insulation::Grade(2),
        };
        Ok(WireSpec {
            size,
            strands_in_hand: strands,
            insulation,
            material: wr.material.unwrap_or_default(),
        })
    }

    /// The `[winding]` table's shop data: whether one turn is assumed, a given phase
    /// resistance, the working temperature, a pole change and the leads.
    fn winding_data(&self, c: &Checker, mut d: Design) -> Result<Design, LayoutError> {
        let parallel_paths = d.parallel_paths;
        let w = &self.winding;
        // One turn is assumed where neither the winding nor every listed coil gives turns.
        d.turns_assumed = w.turns_per_coil.is_none()
            && ((self.coil.is_empty() && self.group.is_empty())
                || self.coil.iter().any(|c| c.turns.is_none())
                || self.group.iter().any(|g| g.turns.is_none()));
        if w.phase_resistance_ohm.is_some() && self.wire.is_some() {
            return Err(c.err(
                "winding",
                0,
                "phase_resistance_ohm",
                "give the resistance once: winding.phase_resistance_ohm (when the wire is not \
                 known) or the [wire] table it is worked out from, not both"
                    .into(),
            ));
        }
        d.phase_resistance_ohm = c.within(
            "winding",
            "phase_resistance_ohm",
            w.phase_resistance_ohm,
            1e-6,
            1e6,
        )?;
        d.winding_temperature_c = c
            .within("winding", "temperature_c", w.temperature_c, -50.0, 250.0)?
            .unwrap_or(20.0);
        if let Some(pc) = w.pole_change {
            self.pole_change_fits(c, &d)?;
            d.pole_change = Some(pc);
        }
        let count = c.range(
            "winding",
            "leads",
            w.leads.unwrap_or(6),
            3,
            12,
            "lead count",
        )?;
        if ![3, 6, 9, 12].contains(&count) {
            return Err(c.err(
                "winding",
                0,
                "leads",
                format!("{count} leads is not a scheme; give 3, 6, 9 or 12"),
            ));
        }
        if count >= 9 && parallel_paths != 2 {
            return Err(c.err(
                "winding",
                0,
                "leads",
                format!(
                    "{count} leads bring out two sections per phase for a dual-voltage \
                     connection, so the winding needs parallel_paths = 2 (it has \
                     {parallel_paths}); give leads = 3 or 6, or parallel_paths = 2"
                ),
            ));
        }
        d.leads = Leads {
            count: count as u8,
            marking: w.marking.unwrap_or_default(),
            speed: 0,
        };
        Ok(d)
    }

    /// The `[secondary]` table: a flat primary's plate and its backing.
    fn secondary(&self, c: &Checker, s: &RawSecondary) -> Result<Secondary, LayoutError> {
        let mm = |v: Option<f64>| v.map(Length::from_mm);
        let conductivity = match (s.material, s.conductivity_ms_m) {
            (Some(_), Some(_)) => {
                return Err(c.err(
                    "secondary",
                    0,
                    "conductivity_ms_m",
                    "give material or conductivity_ms_m, not both".into(),
                ));
            }
            (None, Some(v)) => Conductivity::from_ms_m(
                c.within("secondary", "conductivity_ms_m", Some(v), 0.1, 100.0)?
                    .unwrap_or(v),
            )
            .s_m(),
            (Some(PlateMaterial::Copper), None) => crate::card::wire::COPPER.conductivity_s_m(),
            (Some(PlateMaterial::Aluminium), None) | (None, None) => {
                crate::card::wire::PLATE_ALUMINIUM_S_M
            }
        };
        let alpha = match s.material {
            Some(PlateMaterial::Copper) => crate::card::wire::COPPER.alpha_per_k,
            // Aluminium's coefficient also for a plate given by its conductivity alone
            // (copper's, 0.00393, differs by 3 %).
            _ => crate::card::wire::ALUMINIUM.alpha_per_k,
        };
        let backing_keys =
            s.backing_conductivity_ms_m.is_some() || s.backing_permeability.is_some();
        if (backing_keys || s.backing_thickness_mm.is_some()) && s.back_iron == Some(false) {
            return Err(c.err(
                "secondary",
                0,
                if s.backing_thickness_mm.is_some() {
                    "backing_thickness_mm"
                } else if s.backing_conductivity_ms_m.is_some() {
                    "backing_conductivity_ms_m"
                } else {
                    "backing_permeability"
                },
                "a plate between two primaries (back_iron = false) has no backing; remove \
                 the backing_ keys or set back_iron = true"
                    .into(),
            ));
        }
        if backing_keys && s.backing_thickness_mm.is_none() {
            return Err(c.err(
                "secondary",
                0,
                "backing_thickness_mm",
                "the backing's conductivity and permeability need its thickness; give \
                 backing_thickness_mm, or leave all three out for ideal back iron"
                    .into(),
            ));
        }
        let backing = match c.within(
            "secondary",
            "backing_thickness_mm",
            s.backing_thickness_mm,
            0.1,
            500.0,
        )? {
            Some(t) => Some(Backing {
                thickness: Length::from_mm(t),
                conductivity_s_m: Conductivity::from_ms_m(
                    c.within(
                        "secondary",
                        "backing_conductivity_ms_m",
                        s.backing_conductivity_ms_m,
                        0.0,
                        60.0,
                    )?
                    .unwrap_or(BACKING_STEEL_MS_M),
                )
                .s_m(),
                relative_permeability: c
                    .within(
                        "secondary",
                        "backing_permeability",
                        s.backing_permeability,
                        1.0,
                        100_000.0,
                    )?
                    .unwrap_or(BACKING_STEEL_PERMEABILITY),
            }),
            None => None,
        };
        Ok(Secondary {
            temperature_c: c
                .within("secondary", "temperature_c", s.temperature_c, -50.0, 400.0)?
                .unwrap_or(20.0),
            alpha_per_k: alpha,
            backing,
            conductivity_s_m: conductivity,
            thickness: Length::from_mm(
                c.within(
                    "secondary",
                    "thickness_mm",
                    Some(s.thickness_mm),
                    0.05,
                    200.0,
                )?
                .unwrap_or(s.thickness_mm),
            ),
            width: mm(c.within("secondary", "width_mm", s.width_mm, 1.0, 100_000.0)?),
            back_iron: s.back_iron.unwrap_or(true),
        })
    }
}

impl RawLayout {
    /// The `[measured]` table: line readings (three) or section readings (three for six
    /// leads, six for nine or twelve), each in its range, and the temperature.
    fn measured(&self, c: &Checker, m: &RawMeasured, d: &Design) -> Result<Measured, LayoutError> {
        let each = |key: &str, v: &[f64]| -> Result<(), LayoutError> {
            for x in v {
                c.within("measured", key, Some(*x), 1e-6, 1e6)?;
            }
            Ok(())
        };
        if self.machine.phases == Some(1) {
            return self.single_phase_readings(c, m);
        }
        if m.main_resistance_ohm.is_some() || m.aux_resistance_ohm.is_some() {
            return Err(c.err(
                "measured",
                0,
                if m.main_resistance_ohm.is_some() {
                    "main_resistance_ohm"
                } else {
                    "aux_resistance_ohm"
                },
                "main and auxiliary readings belong to a single-phase stator; give \
                 line_resistance_ohm or section_resistance_ohm"
                    .into(),
            ));
        }
        let temperature_c = c
            .within("measured", "temperature_c", m.temperature_c, -60.0, 250.0)?
            .unwrap_or(20.0);
        if d.pole_change.is_some() {
            // Its leads are not a star or delta's: line readings worked back as one would
            // condemn a sound winding. It is read between its six leads as delivered.
            let key = "six_lead_ohm";
            let Some(v) = &m.six_lead_ohm else {
                return Err(c.err(
                    "measured",
                    0,
                    if m.section_resistance_ohm.is_some() {
                        "section_resistance_ohm"
                    } else {
                        "line_resistance_ohm"
                    },
                    "a pole-changing winding is read between its six leads as delivered, \
                     nothing linked: give six_lead_ohm = [1U-1V, 1V-1W, 1W-1U, 2U-2W, 2W-2V, \
                     2V-2U, 1U-2U, 1V-2W, 1W-2V] (the card's table) instead"
                        .into(),
                ));
            };
            if m.line_resistance_ohm.is_some() || m.section_resistance_ohm.is_some() {
                return Err(c.err(
                    "measured",
                    0,
                    key,
                    "give the six leads' readings alone: remove line_resistance_ohm and \
                     section_resistance_ohm"
                        .into(),
                ));
            }
            if v.len() != 9 {
                return Err(c.err(
                    "measured",
                    0,
                    key,
                    format!(
                        "{} values given; give nine, in the card's order: 1U-1V, 1V-1W, \
                         1W-1U, 2U-2W, 2W-2V, 2V-2U, 1U-2U, 1V-2W, 1W-2V",
                        v.len()
                    ),
                ));
            }
            each(key, v)?;
            return Ok(Measured {
                line_resistance_ohm: None,
                section_resistance_ohm: None,
                main_resistance_ohm: None,
                aux_resistance_ohm: None,
                six_lead_ohm: Some(v.clone()),
                temperature_c,
            });
        }
        if m.six_lead_ohm.is_some() {
            return Err(c.err(
                "measured",
                0,
                "six_lead_ohm",
                "six-lead readings belong to a pole-changing winding (winding.pole_change); \
                 give line_resistance_ohm or section_resistance_ohm"
                    .into(),
            ));
        }
        if m.line_resistance_ohm.is_some() && m.section_resistance_ohm.is_some() {
            return Err(c.err(
                "measured",
                0,
                "section_resistance_ohm",
                "give one set of readings: line_resistance_ohm (between line terminals) or \
                 section_resistance_ohm (across each section), not both"
                    .into(),
            ));
        }
        if m.line_resistance_ohm.is_none() && m.section_resistance_ohm.is_none() {
            return Err(c.err(
                "measured",
                0,
                "line_resistance_ohm",
                "give the readings: line_resistance_ohm = [r12, r23, r31] between the line \
                 terminals, or section_resistance_ohm = [...] across each section's own leads"
                    .into(),
            ));
        }
        let line = match &m.line_resistance_ohm {
            None => None,
            Some(v) if v.len() == 3 => {
                each("line_resistance_ohm", v)?;
                Some([v[0], v[1], v[2]])
            }
            Some(v) => {
                return Err(c.err(
                    "measured",
                    0,
                    "line_resistance_ohm",
                    format!(
                        "{} values given; give three, between terminals 1-2, 2-3 and 3-1",
                        v.len()
                    ),
                ));
            }
        };
        let sections = match &m.section_resistance_ohm {
            None => None,
            Some(v) => {
                let want = match (d.phases, d.leads.count) {
                    (3, 6) => 3,
                    (3, 9) | (3, 12) => 6,
                    _ => 0,
                };
                if want == 0 {
                    return Err(c.err(
                        "measured",
                        0,
                        "section_resistance_ohm",
                        format!(
                            "a {}-lead machine brings out no section ends to measure across; \
                             give line_resistance_ohm = [r12, r23, r31] instead",
                            d.leads.count
                        ),
                    ));
                }
                if v.len() != want {
                    return Err(c.err(
                        "measured",
                        0,
                        "section_resistance_ohm",
                        format!(
                            "{} values given; a {}-lead machine has {want} sections: give U, V, \
                             W{}",
                            v.len(),
                            d.leads.count,
                            if want == 6 {
                                " of the first sections, then U, V, W of the second"
                            } else {
                                ""
                            }
                        ),
                    ));
                }
                each("section_resistance_ohm", v)?;
                Some(v.clone())
            }
        };
        Ok(Measured {
            line_resistance_ohm: line,
            section_resistance_ohm: sections,
            main_resistance_ohm: None,
            aux_resistance_ohm: None,
            six_lead_ohm: None,
            temperature_c,
        })
    }
}

/// The phase labels: as given under `machine.phase_labels` (one per phase, each printing as
/// itself, 1 to 8 characters, all different), else U, V, W for three phases and P1, P2, ...
fn phase_labels(
    c: &Checker,
    given: Option<&[String]>,
    phases: usize,
) -> Result<Vec<String>, LayoutError> {
    let labels = match given {
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
                // A label is printed on every sheet and lead: refuse what would print
                // as something else or as nothing (spaces, controls, invisible
                // formatting and bidirectional marks), so two labels that differ
                // differ where a reader can see it.
                if let Some(ch) = l.chars().find(|x| crate::sanitize::invisible(*x)) {
                    return Err(c.err(
                        "machine",
                        0,
                        "phase_labels",
                        format!(
                            "label {} has the character U+{:04X}, which does not print as \
                             itself; use letters, digits and visible signs only (U, V, W)",
                            i + 1,
                            ch as u32
                        ),
                    ));
                }
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
            labels.to_vec()
        }
        None if phases == 3 => vec!["U".into(), "V".into(), "W".into()],
        None => (1..=phases).map(|i| format!("P{i}")).collect(),
    };
    Ok(labels)
}

/// Free text of a shop table: at most 200 characters, control characters refused.
fn text(
    c: &Checker,
    table: &str,
    key: &str,
    v: &Option<String>,
) -> Result<Option<String>, LayoutError> {
    let Some(s) = v else { return Ok(None) };
    let n = s.chars().count();
    if n > crate::sanitize::MAX_TITLE_CHARS {
        return Err(c.err(
            table,
            0,
            key,
            format!(
                "{n} characters is too long; give at most {}",
                crate::sanitize::MAX_TITLE_CHARS
            ),
        ));
    }
    if s.trim().is_empty() {
        return Ok(None);
    }
    Ok(Some(crate::sanitize::clean(s.trim()).into_owned()))
}

/// The `[nameplate]` table, each figure in its range.
fn nameplate(c: &Checker, n: &RawNameplate) -> Result<crate::design::Nameplate, LayoutError> {
    let t = "nameplate";
    let power_w = match (n.power_kw, n.power_hp) {
        (Some(_), Some(_)) => {
            return Err(c.err(
                t,
                0,
                "power_hp",
                "give the rating once: power_kw or power_hp, not both".into(),
            ));
        }
        (Some(kw), None) => c
            .within(t, "power_kw", Some(kw), 0.001, 1e5)?
            .map(crate::units::watts_of_kw),
        // 1 hp = 745.7 W (mechanical horsepower, NEMA MG 1 ratings).
        (None, Some(hp)) => c
            .within(t, "power_hp", Some(hp), 0.001, 1e5)?
            .map(crate::units::watts_of_hp),
        (None, None) => None,
    };
    let list =
        |key: &str, v: &Option<OneOrMore>, lo: f64, hi: f64| -> Result<Vec<f64>, LayoutError> {
            let values = v.as_ref().map(OneOrMore::values).unwrap_or_default();
            if values.len() > 2 {
                return Err(c.err(
                    t,
                    0,
                    key,
                    format!(
                        "{} values given; give one, or two for a dual-voltage machine",
                        values.len()
                    ),
                ));
            }
            for x in &values {
                c.within(t, key, Some(*x), lo, hi)?;
            }
            Ok(values)
        };
    let voltages_v = list("voltage_v", &n.voltage_v, 1.0, 1e6)?;
    let currents_a = list("current_a", &n.current_a, 1e-3, 1e6)?;
    if currents_a.len() > 1 && currents_a.len() != voltages_v.len() {
        return Err(c.err(
            t,
            0,
            "current_a",
            format!(
                "{} currents for {} voltages; give one current per voltage, in the same order",
                currents_a.len(),
                voltages_v.len()
            ),
        ));
    }
    Ok(crate::design::Nameplate {
        power_w,
        voltages_v,
        currents_a,
        speed_rpm: c.within(t, "speed_rpm", n.speed_rpm, 1.0, 1e6)?,
        frequency_hz: c.within(t, "frequency_hz", n.frequency_hz, 0.01, 1e6)?,
        frame: text(c, t, "frame", &n.frame)?,
        connection: text(c, t, "connection", &n.connection)?,
        insulation_class: n.insulation_class,
        efficiency: c
            .within(t, "efficiency_percent", n.efficiency_percent, 1.0, 100.0)?
            .map(|e| e / 100.0),
        power_factor: c.within(t, "power_factor", n.power_factor, 0.01, 1.0)?,
        service_factor: c.within(t, "service_factor", n.service_factor, 1.0, 2.0)?,
    })
}

/// The `[job]` table.
fn job(c: &Checker, j: &RawJob) -> Result<crate::design::Job, LayoutError> {
    let t = "job";
    let as_text = |v: &Option<TextOrDate>| -> Option<String> {
        v.as_ref().map(|x| match x {
            TextOrDate::Text(s) => s.clone(),
            TextOrDate::Number(n) => n.to_string(),
            TextOrDate::Date(d) => d.to_string(),
        })
    };
    Ok(crate::design::Job {
        number: text(c, t, "number", &as_text(&j.number))?,
        customer: text(c, t, "customer", &j.customer)?,
        date: text(c, t, "date", &as_text(&j.date))?,
        technician: text(c, t, "technician", &j.technician)?,
        notes: text(c, t, "notes", &j.notes)?,
    })
}

fn is_hex_colour(s: &str) -> bool {
    s.len() == 7 && s.starts_with('#') && s[1..].chars().all(|c| c.is_ascii_hexdigit())
}

/// A core that does not close, in words naming its keys and what would close it.
fn iron_error(c: &Checker, e: &crate::iron::GeometryError) -> LayoutError {
    use crate::iron::{GeometryError, Size};
    let key = |s: Size| match s {
        Size::Bore => "bore_mm",
        Size::SlotPitch => "slot_pitch_mm",
        Size::OutsideDiameter => "outside_diameter_mm",
        Size::YokeDepth => "yoke_depth_mm",
        Size::ToothWidth => "tooth_width_mm",
        Size::SlotWidth => "slot_width_mm",
        Size::SlotDepth => "slot_depth_mm",
    };
    let n = |l: Length| crate::numbering::short(l.mm());
    match e {
        GeometryError::NoTooth {
            from,
            tooth,
            slot_pitch,
        } => c.err(
            "core",
            0,
            key(from[0]),
            format!(
                "with core.{} this leaves teeth of {} mm at the bore: the slot pitch there \
                 is {} mm, so tooth and slot must each be narrower than that",
                key(from[1]),
                n(*tooth),
                n(*slot_pitch)
            ),
        ),
        GeometryError::NoSlot {
            tooth,
            slot_pitch,
            pitch_from,
        } => c.err(
            "core",
            0,
            "tooth_width_mm",
            format!(
                "{} mm leaves no slot: with core.{} the slot pitch at the bore is {} mm, so the \
                 tooth must be narrower than that",
                n(*tooth),
                key(*pitch_from),
                n(*slot_pitch)
            ),
        ),
        GeometryError::ToothAndSlot {
            tooth,
            slot,
            slot_pitch,
        } => c.err(
            "core",
            0,
            "tooth_width_mm",
            format!(
                "tooth {} mm + slot_width_mm {} mm = {} mm, but the slot pitch at the bore is \
                 {} mm (within {} % or {} mm); give one of the two and the other follows",
                n(*tooth),
                n(*slot),
                n(*tooth + *slot),
                n(*slot_pitch),
                crate::iron::GEOMETRY_TOLERANCE * 100.0,
                crate::iron::GEOMETRY_TOLERANCE_ABS.mm()
            ),
        ),
        GeometryError::NoYoke { from, yoke } => c.err(
            "core",
            0,
            key(from[0]),
            format!(
                "with core.{} and core.{} this leaves back iron {} mm deep behind the slots; \
                 the outside diameter must exceed the bore by more than twice the slot depth",
                key(from[1]),
                key(from[2]),
                n(*yoke)
            ),
        ),
        GeometryError::YokeAndDiameters { given, derived } => c.err(
            "core",
            0,
            "yoke_depth_mm",
            format!(
                "{} mm given, but (outside_diameter_mm − bore_mm)/2 − slot_depth_mm = {} mm; \
                 give the back-iron depth or the outside diameter, and the other follows",
                n(*given),
                n(*derived)
            ),
        ),
    }
}
