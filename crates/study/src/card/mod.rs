//! The winding data card: what a rewind shop orders, winds and measures by. Wire and strands,
//! mean turn, resistances between the leads, copper mass, slot fill, lead markings and
//! connection tables, and the acceptance figures a finished winding is checked against.
//!
//! Mean turn (when not given as `core.mean_turn_mm`): per coil
//!   l_mt = 2·L + 2·k_e·W + l_a,
//! with L the stack, W the coil's span width (span × slot pitch at the gap), k_e = 1.2 and
//! l_a = 0.1 m by default (both adjustable). This is the rule for random-wound low-voltage
//! machines quoted by Pyrhönen, Jokinen and Hrabovcová, *Design of Rotating Electrical
//! Machines*, 2nd ed. 2014, in the chapter on resistance (l_av ≈ 2l + 2.4W + 0.1 m; from
//! memory), and common practice as a first estimate; shops that measure a turn of the old
//! winding give it instead.

pub mod leads;
pub mod measured;
pub mod two_speed;
pub use beltwright_model::wire;

use crate::units::Length;
use serde::Serialize;

use crate::design::Measured;
use crate::winding::{Topology, Winding, coil_groups};
use leads::{LeadScheme, SectionResistance};
use wire::{Wire, metal};

/// Usual upper limit of the slot fill by insulated wire area, for hand-inserted random
/// windings: 0.75 (common practice, from memory). Above it the last coils do not go in.
pub const FILL_LIMIT: f64 = 0.75;

/// Balance tolerance of line-to-line resistances: largest deviation from the mean ±2 % for
/// random-wound windings (ANSI/EASA AR100, recommended practice for the repair of
/// rotating electrical apparatus; from memory).
pub const BALANCE_TOLERANCE_PERCENT: f64 = 2.0;

/// Current density above which the card warns, A/mm²: 6 A/mm² for totally enclosed,
/// fan-cooled random-wound motors (common practice, from memory: design tables give about
/// 4–6.5 A/mm² for enclosed machines, more for open ones).
pub const CURRENT_DENSITY_LIMIT_A_MM2: f64 = 6.0;

/// Wire to order over the mass in the coils: 10 % for end connections, leads and waste
/// (common practice, from memory).
pub const WIRE_ALLOWANCE_PERCENT: f64 = 10.0;

/// Temperature at which expected resistances are quoted when nothing was measured, °C.
pub const SHOP_TEMPERATURE_C: f64 = 25.0;

/// Something on the card a shop should look at before winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum CardWarning {
    /// The wire does not fit the slot comfortably.
    FillAboveLimit {
        /// Fill by insulated wire area.
        fill: f64,
        /// The limit.
        limit: f64,
    },
    /// No stack length or slot pitch, so no mean turn, resistance or mass.
    NoMeanTurn,
    /// No wire data and no phase resistance key.
    NoWire,
    /// Lead schemes and line resistances are for three-phase windings only.
    NotThreePhase,
    /// A pole-changing winding: the single-speed lead scheme and line resistance do not
    /// apply; the six leads' readings are [`DataCard::six_leads`], each speed's connection
    /// the `speeds` report's.
    PoleChanging {
        /// Poles as laid out (the higher speed).
        poles: usize,
    },
    /// A path (or a whole phase) of the record holds no coils, so its resistance, and the
    /// resistances between leads that include it, cannot be worked out.
    PathWithoutCoils {
        /// Phase label.
        phase: String,
        /// Path from 1.
        path: usize,
        /// Parallel paths of the winding.
        paths: usize,
    },
    /// A dual-voltage winding planned with its sections in parallel (its lower voltage)
    /// whose supply is the nameplate's higher voltage.
    SupplyAtHigherVoltage {
        /// The supply's line voltage, volts.
        supply_v: f64,
        /// The nameplate's lower voltage, volts.
        lower_v: f64,
        /// The nameplate's higher voltage, volts.
        higher_v: f64,
    },
    /// The wire carries more than the limit at rated current.
    CurrentDensityAbove {
        /// Current density at rated current, A/mm².
        density_a_mm2: f64,
        /// The limit, A/mm².
        limit_a_mm2: f64,
    },
}

/// The former (mould) a winder sets up for one coil shape, by the same mean-turn rule as
/// the card: each straight side is the stack plus a straight extension at each end (a
/// quarter of the per-turn allowance), each end a loop of k_e·W spanning W, drawn as two
/// straight halves, so it stands W/2·√(k_e² − 1) beyond the extension.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Former {
    /// Span in slots, as the shop writes it ("1-8").
    pub span: String,
    /// Coils of this shape.
    pub coils: usize,
    /// Span width W, centre to centre of the coil sides (at mid-slot when the slot depth
    /// is known), mm.
    #[serde(rename = "span_width_mm", serialize_with = "crate::units::in_mm")]
    pub span_width: Length,
    /// Straight length of each coil side, mm.
    #[serde(rename = "straight_mm", serialize_with = "crate::units::in_mm")]
    pub straight: Length,
    /// How far each end stands out beyond the core, mm.
    #[serde(rename = "end_extension_mm", serialize_with = "crate::units::in_mm")]
    pub end_extension: Length,
    /// Mean turn of this shape, mm.
    #[serde(rename = "mean_turn_mm", serialize_with = "crate::units::in_mm")]
    pub mean_turn: Length,
}

/// How the mean length of a turn was found (worded by the presenters, which write it into the JSON with its `message`).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum MeanTurnRule {
    /// Given in the layout (`core.mean_turn_mm`).
    Given,
    /// 2·stack + 2·end factor·span width + allowance.
    Rule {
        /// End-winding length per coil end over the span width.
        end_factor: f64,
        /// Allowance per turn, mm.
        #[serde(rename = "end_allowance_mm", serialize_with = "crate::units::in_mm")]
        end_allowance: Length,
    },
}

/// Resistances at one temperature.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, schemars::JsonSchema)]
pub struct AtTemperature {
    /// Winding temperature, °C.
    pub temperature_c: f64,
    /// Phase resistance, ohms.
    pub phase_ohm: f64,
    /// Between two line terminals in the planned connection, ohms.
    pub line_ohm: f64,
}

/// The figures a finished winding is checked against.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Acceptance {
    /// Expected line-to-line resistance at the measuring temperature (planned connection).
    pub line_resistance: Option<AtTemperature>,
    /// Largest deviation of the three readings from their mean, per cent (EASA AR100).
    pub balance_tolerance_percent: f64,
    /// High-potential test voltage of a new winding, r.m.s. volts for one minute:
    /// 1000 V + 2·U_N, at least 1500 V (IEC 60034-1, clause 9.2, machines below 10 MW).
    pub hipot_new_v: Option<f64>,
    /// A repeat test after acceptance, 80 % of the above (IEC 60034-1, clause 9.2).
    pub hipot_repeat_v: Option<f64>,
    /// The rated line voltage the test voltage is worked from, volts.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub hipot_rated_v: Option<f64>,
    /// Minimum insulation resistance at 40 °C, megohms: 5 MΩ for random-wound windings
    /// below 2 kV (IEEE 43-2013, Table 3).
    pub insulation_resistance_min_mohm: f64,
    /// Minimum polarization index for class B, F and H insulation (IEEE 43-2013, Table 4).
    pub polarization_index_min: f64,
}

/// The data card.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct DataCard {
    /// The design the report is about (the same header on every report).
    pub design: crate::header::DesignHeader,
    /// Title of the layout.
    pub title: Option<String>,
    /// Closed core or flat primary.
    pub topology: Topology,
    /// Slots.
    pub slots: usize,
    /// Poles.
    pub poles: usize,
    /// Layers.
    pub layers: usize,
    /// Coils in the winding.
    pub coils: usize,
    /// Coil groups.
    pub groups: usize,
    /// Coils per group (each distinct count, smallest first).
    pub coils_per_group: Vec<usize>,
    /// Spans as the shop writes them: "1-8" for a coil from slot 1 to slot 8.
    pub spans: Vec<String>,
    /// Turns per coil (each distinct count; `distinct_turns_per_coil` in the JSON, since the
    /// header's `turns_per_coil` is the one count).
    #[serde(rename = "distinct_turns_per_coil")]
    pub turns_per_coil: Vec<u32>,
    /// Series turns per phase N_ph (all coils of a phase over the paths).
    pub series_turns_per_phase: f64,
    /// Star or delta, as planned.
    pub connection: crate::winding::Connection,
    /// Parallel paths per phase.
    pub parallel_paths: usize,
    /// Turn-weighted mean turn length, mm.
    #[serde(rename = "mean_turn_mm", serialize_with = "crate::units::in_mm_opt")]
    pub mean_turn: Option<Length>,
    /// How the mean turn was found.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub mean_turn_rule: MeanTurnRule,
    /// The wire, resolved.
    pub wire: Option<Wire>,
    /// Phase resistance at 20 °C (mean of the phases), ohms.
    pub phase_resistance_20c_ohm: Option<f64>,
    /// Between two line terminals at 20 °C in the planned connection, ohms.
    pub line_resistance_20c_ohm: Option<f64>,
    /// Phase resistances at 20 °C, one per phase, ohms.
    pub phase_resistances_20c_ohm: Vec<f64>,
    /// Conductor mass of the whole winding, kg (end connections and leads not included).
    pub copper_mass_kg: Option<f64>,
    /// Conductor mass per phase, kg.
    pub copper_mass_per_phase_kg: Option<f64>,
    /// Conductor mass of one coil of the design's turns, kg (mean over the coils).
    pub copper_mass_per_coil_kg: Option<f64>,
    /// Fill of the fullest slot by insulated wire area (π/4·d_ins² per wire) over the usable
    /// slot area; null without a slot area.
    pub slot_fill: Option<f64>,
    /// Bare conductor area over the slot area in the fullest slot.
    pub copper_fill: Option<f64>,
    /// Wires (strands) in the fullest slot.
    pub wires_per_slot: u64,
    /// Lead markings and connection tables (three-phase windings).
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub leads: Option<LeadScheme>,
    /// Each section's resistance between its own leads at 20 °C (6, 9 and 12 leads).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub sections: Vec<measured::SectionFigure>,
    /// A pole-changing winding's halves and the readings between its six leads, as
    /// delivered and on each speed's board, at 20 °C.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub six_leads: Option<two_speed::SixLeads>,
    /// The former of each coil shape (needs the stack and slot pitch).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub formers: Vec<Former>,
    /// The rating as stamped.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub nameplate: Option<crate::design::Nameplate>,
    /// The shop's job data.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub job: Option<crate::design::Job>,
    /// Rated line current used for the current density, A (from the nameplate, at the
    /// supply's line voltage, or from its rated power: `crate::loading::rated_current`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rated_current_a: Option<f64>,
    /// True when the rated current follows from the rated power, not a stamped current.
    pub rated_current_from_power: bool,
    /// The core's loadings (flux densities, electric loading, temperature rise), when the
    /// core's sizes and the supply are known.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub loading: Option<crate::loading::Loading>,
    /// Current density in the wire at rated current, A/mm².
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub current_density_a_mm2: Option<f64>,
    /// The limit it is held against, A/mm².
    pub current_density_limit_a_mm2: f64,
    /// Wire to order, kg: the copper mass plus the allowance.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub wire_to_order_kg: Option<f64>,
    /// Allowance on the copper mass for end connections, leads and waste, per cent.
    pub wire_allowance_percent: f64,
    /// The readings of `[measured]`, judged against this card.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub measured: Option<measured::ResistanceCheck>,
    /// Acceptance figures.
    /// (The presenters write this field into the JSON, with the note on whose procedures
    /// govern.)
    #[serde(skip)]
    pub acceptance: Acceptance,
    /// Things to look at.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub warnings: Vec<CardWarning>,
}

/// Mean length of one turn of a coil spanning `span_slots`, or `None` without the sizes.
pub fn mean_turn(w: &Winding, span_slots: f64) -> Option<Length> {
    let rule = &w.design.turn;
    if let Some(l) = rule.mean_turn {
        return Some(l);
    }
    let stack = w.design.core.stack?;
    let pitch = span_pitch(w)?;
    Some(2.0 * stack + 2.0 * rule.end_factor * span_slots * pitch + rule.end_allowance)
}

/// The slot pitch the span width W is measured with: between the coil sides' centres, at
/// mid-slot — on a rotary core with its bore and slot depth given, π·(D + h)/Z; otherwise
/// the slot pitch at the gap (a flat primary's sides lie on a straight line; without the
/// depth the bore's pitch is all there is).
pub fn span_pitch(w: &Winding) -> Option<Length> {
    let at_gap = w.slot_pitch()?;
    match (
        w.geometry.topology,
        w.design.core.bore,
        w.design.core.slot_pitch,
        w.design.slot_size,
    ) {
        (crate::winding::Topology::Rotary, Some(d), None, Some((_, h))) => {
            Some(std::f64::consts::PI * (d + h) / w.geometry.slots as f64)
        }
        _ => Some(at_gap),
    }
}

/// Resistances at 20 °C of every path of every phase: `r[phase][path]`, ohms. From the wire
/// (ρ·N·l_mt/A summed over the coils of the path) or from `winding.phase_resistance_ohm`
/// (every phase that value, shared equally by its paths in parallel).
pub fn path_resistances(w: &Winding) -> Option<Vec<Vec<f64>>> {
    let m = w.geometry.phases;
    let a = w.parallel_paths.max(1);
    if let Some(wire) = w.design.wire.as_ref().map(Wire::of) {
        let mut r = vec![vec![0.0; a]; m];
        for c in &w.coils {
            r[c.phase][c.path.min(a - 1)] += coil_resistance_20c(w, c, &wire)?;
        }
        return Some(r);
    }
    w.design
        .phase_resistance_ohm
        .map(|rp| vec![vec![rp * a as f64; a]; m])
}

/// Resistance at 20 °C of coil `c` wound with `wire`: ρ·N·l_mt/A, with the mean turn of
/// its span ([`mean_turn`]); `None` without the sizes a mean turn needs.
pub fn coil_resistance_20c(w: &Winding, c: &crate::winding::Coil, wire: &Wire) -> Option<f64> {
    let l = mean_turn(w, w.span(c).unsigned_abs() as f64)?.m();
    Some(metal(wire.material).resistivity_ohm_m * f64::from(c.turns) * l / wire.conductor_area.m2())
}

/// Phase resistances at 20 °C (each phase's paths in parallel), ohms; `None` when a phase
/// has no coils (its resistance cannot be worked out).
pub fn phase_resistances_20c(w: &Winding) -> Option<Vec<f64>> {
    path_resistances(w)?.iter().map(|p| parallel(p)).collect()
}

/// Parallel combination of a phase's paths; `None` when any path has no coils: a record
/// whose coils leave a path empty (often one written without `path` keys) has no
/// resistance worth printing, since leaving the path out would give a figure a times too
/// high and condemn a sound winding.
fn parallel(paths: &[f64]) -> Option<f64> {
    if paths.iter().any(|r| !(r.is_finite() && *r > 0.0)) {
        return None;
    }
    let g: f64 = paths.iter().map(|r| 1.0 / r).sum();
    (g > 0.0 && g.is_finite()).then(|| 1.0 / g)
}

/// The paths that hold no coils: (phase, path), both from 0. A recorded coil list that
/// leaves out the `path` keys puts every coil in path 1.
pub fn empty_paths(w: &Winding) -> Vec<(usize, usize)> {
    let a = w.parallel_paths.max(1);
    let mut used = vec![vec![false; a]; w.geometry.phases];
    for c in &w.coils {
        used[c.phase][c.path.min(a - 1)] = true;
    }
    let mut out = Vec::new();
    for (p, paths) in used.iter().enumerate() {
        for (k, u) in paths.iter().enumerate() {
            if !u {
                out.push((p, k));
            }
        }
    }
    out
}

/// Section resistances for the lead scheme: the two paths of a 9/12-lead winding, or each
/// whole phase.
pub fn sections(w: &Winding, r: &[Vec<f64>]) -> Option<SectionResistance> {
    if w.geometry.phases != 3 {
        return None;
    }
    let mut s = SectionResistance { r: [[0.0; 2]; 3] };
    for (p, paths) in r.iter().enumerate().take(3) {
        s.r[p] = if w.design.leads.count >= 9 && paths.len() == 2 {
            // Each section its own path: a section without coils has no resistance to give.
            if paths.iter().any(|x| !(x.is_finite() && *x > 0.0)) {
                return None;
            }
            [paths[0], paths[1]]
        } else {
            [parallel(paths)?, 0.0]
        };
    }
    Some(s)
}

/// Expected line-to-line resistance at 20 °C in the planned connection, between terminals
/// 1-2, 2-3 and 3-1.
pub fn planned_line_resistances(w: &Winding) -> Option<[f64; 3]> {
    let r = path_resistances(w)?;
    let s = sections(w, &r)?;
    let sec = if w.design.leads.count >= 9 {
        leads::Sections::Parallel
    } else {
        leads::Sections::Single
    };
    Some([0, 1, 2].map(|k| s.line_to_line(k, w.design.connection, sec)))
}

/// Work out the data card of a winding.
pub fn card(w: &Winding) -> DataCard {
    crate::runs::count(crate::runs::Analysis::Card);
    let g = &w.geometry;
    let mut warnings = Vec::new();
    let groups = coil_groups(w);
    let mut per_group: Vec<usize> = groups.iter().map(|g| g.coils.len()).collect();
    per_group.sort_unstable();
    per_group.dedup();
    let mut spans: Vec<u64> = w.coils.iter().map(|c| w.span(c).unsigned_abs()).collect();
    spans.sort_unstable();
    spans.dedup();
    let mut turns: Vec<u32> = w.coils.iter().map(|c| c.turns).collect();
    turns.sort_unstable();
    turns.dedup();

    let wire = w.design.wire.as_ref().map(Wire::of);
    let lengths: Option<Vec<Length>> = w
        .coils
        .iter()
        .map(|c| mean_turn(w, w.span(c).unsigned_abs() as f64))
        .collect();
    let total_turns: f64 = w.coils.iter().map(|c| c.turns as f64).sum();
    let mean_turn = lengths.as_ref().filter(|_| total_turns > 0.0).map(|ls| {
        ls.iter()
            .zip(&w.coils)
            .map(|(l, c)| *l * c.turns as f64)
            .sum::<Length>()
            / total_turns
    });
    if mean_turn.is_none() {
        warnings.push(CardWarning::NoMeanTurn);
    }
    if wire.is_none() && w.design.phase_resistance_ohm.is_none() {
        warnings.push(CardWarning::NoWire);
    }
    let rule = &w.design.turn;
    let mean_turn_rule = match rule.mean_turn {
        Some(_) => MeanTurnRule::Given,
        None => MeanTurnRule::Rule {
            end_factor: rule.end_factor,
            end_allowance: rule.end_allowance,
        },
    };

    for (p, k) in empty_paths(w) {
        warnings.push(CardWarning::PathWithoutCoils {
            phase: w.label(p).to_string(),
            path: k + 1,
            paths: w.parallel_paths,
        });
    }
    let paths = path_resistances(w);
    let phase_r: Vec<f64> = phase_resistances_20c(w).unwrap_or_default();
    let phase_mean =
        (!phase_r.is_empty()).then(|| phase_r.iter().sum::<f64>() / phase_r.len() as f64);
    let three = g.phases == 3;
    if !three {
        warnings.push(CardWarning::NotThreePhase);
    }
    let pole_changing = w.design.pole_change.is_some();
    if pole_changing {
        warnings.push(CardWarning::PoleChanging { poles: g.poles });
    }
    let line = planned_line_resistances(w)
        .filter(|_| !pole_changing)
        .map(|l| (l[0] + l[1] + l[2]) / 3.0);

    let (mass, mass_phase, mass_coil) = copper_mass(w, wire.as_ref(), lengths.as_deref());

    // Wires in the fullest slot: turns × strands of every coil side in it.
    let strands = wire.as_ref().map_or(1, |x| x.strands_in_hand) as u64;
    let wires_per_slot = crate::loading::conductors_per_slot(w) * strands;
    // The fill by insulated wire is the loadings' (one rule); the copper's beside it.
    let fill = crate::loading::slot_fill(w, &crate::loading::Limits::default()).map(|c| c.value);
    let copper_fill = match (&wire, w.design.slot_area) {
        (Some(wr), Some(area)) => Some(wires_per_slot as f64 * wr.area / area),
        _ => None,
    };
    if let Some(f) = fill
        && f > FILL_LIMIT
    {
        warnings.push(CardWarning::FillAboveLimit {
            fill: f,
            limit: FILL_LIMIT,
        });
    }

    let lead_scheme = (three && !pole_changing).then(|| {
        let sec = paths.as_ref().and_then(|r| sections(w, r));
        leads::scheme(
            w.design.leads,
            w.design.connection,
            w.design.supply.line_voltage_v,
            sec.as_ref(),
            &w.design.phase_labels,
            w.geometry.slots,
            w.geometry.topology,
        )
    });

    let t_meas = w
        .design
        .measured
        .as_ref()
        .map_or(SHOP_TEMPERATURE_C, |m: &Measured| m.temperature_c);
    let material = wire
        .as_ref()
        .map_or(crate::design::Material::Copper, |x| x.material);
    let at = match (phase_mean, line) {
        (Some(p), Some(l)) => Some(AtTemperature {
            temperature_c: t_meas,
            phase_ohm: metal(material).at_temperature(p, t_meas),
            line_ohm: metal(material).at_temperature(l, t_meas),
        }),
        _ => None,
    };
    // Rated voltage: the supply's, or for a dual-voltage winding the series (higher) voltage
    // of the planned connection.
    let rated = lead_scheme
        .as_ref()
        .and_then(|s| {
            s.configurations
                .iter()
                .filter(|c| c.connection == w.design.connection)
                .filter_map(|c| c.line_voltage_v)
                .reduce(f64::max)
        })
        .or(w.design.supply.line_voltage_v);
    let rated = test_voltage(w, rated);
    warnings.extend(supply_at_higher_voltage(w));

    // Current density at rated current (the loadings' rule): the phase current shared by
    // the paths, over the conductor area. The rated current is stamped, or follows from the
    // rated power.
    let rating =
        crate::loading::rated_current(w.design.nameplate.as_ref(), w.design.supply.line_voltage_v);
    let rated_current = rating.map(|r| r.line_a());
    let density = match (rated_current, &wire) {
        (Some(i), Some(wr)) if three => {
            let (_, per_path) = crate::loading::conductor_current(w, i);
            // A/mm², the unit the trade's limits are given in.
            Some(per_path / wr.conductor_area.mm2())
        }
        _ => None,
    };
    if let Some(j) = density.filter(|j| *j > CURRENT_DENSITY_LIMIT_A_MM2) {
        warnings.push(CardWarning::CurrentDensityAbove {
            density_a_mm2: j,
            limit_a_mm2: CURRENT_DENSITY_LIMIT_A_MM2,
        });
    }
    let formers = formers(w);

    DataCard {
        design: crate::header::of(w),
        title: w.labels.title.clone(),
        topology: g.topology,
        slots: g.slots,
        poles: g.poles,
        layers: g.layers,
        coils: w.coils.len(),
        groups: groups.len(),
        coils_per_group: per_group,
        spans: spans.iter().map(|y| format!("1-{}", y + 1)).collect(),
        turns_per_coil: turns,
        series_turns_per_phase: w.series_turns(0),
        connection: w.design.connection,
        parallel_paths: w.parallel_paths,
        mean_turn,
        mean_turn_rule,
        wire,
        phase_resistance_20c_ohm: phase_mean,
        line_resistance_20c_ohm: line,
        phase_resistances_20c_ohm: phase_r,
        copper_mass_kg: mass,
        copper_mass_per_phase_kg: mass_phase,
        copper_mass_per_coil_kg: mass_coil,
        slot_fill: fill,
        copper_fill,
        wires_per_slot,
        leads: lead_scheme,
        sections: measured::section_figures(w)
            .unwrap_or_default()
            .into_iter()
            .map(|f| measured::SectionFigure {
                temperature_c: t_meas,
                reading_ohm: metal(material).at_temperature(f.reading_20c_ohm, t_meas),
                ..f
            })
            .collect(),
        six_leads: two_speed::six_leads(w),
        formers,
        nameplate: w.design.nameplate.clone(),
        job: w.design.job.clone(),
        rated_current_a: rated_current,
        rated_current_from_power: matches!(rating, Some(crate::loading::Rated::FromPower { .. })),
        loading: crate::loading::of(w, &crate::loading::Limits::default(), 1.0).ok(),
        current_density_a_mm2: density,
        current_density_limit_a_mm2: CURRENT_DENSITY_LIMIT_A_MM2,
        wire_to_order_kg: mass.map(|m| m * (1.0 + WIRE_ALLOWANCE_PERCENT / 100.0)),
        wire_allowance_percent: WIRE_ALLOWANCE_PERCENT,
        measured: measured::check(w),
        acceptance: acceptance(rated, at),
        warnings,
    }
}

/// Copper mass of the winding, of a phase and of a coil, kg: ρ·N·l_mt·A of every coil (the
/// wire's metal; each coil's own mean turn), when wire and mean turns are known.
fn copper_mass(
    w: &Winding,
    wire: Option<&Wire>,
    lengths: Option<&[Length]>,
) -> (Option<f64>, Option<f64>, Option<f64>) {
    let (Some(wr), Some(ls)) = (wire, lengths) else {
        return (None, None, None);
    };
    let rho_m = metal(wr.material).density_kg_m3;
    let per: Vec<f64> = ls
        .iter()
        .zip(&w.coils)
        .map(|(l, c)| rho_m * c.turns as f64 * l.m() * wr.conductor_area.m2())
        .collect();
    let total: f64 = per.iter().sum();
    (
        Some(total),
        Some(total / w.geometry.phases as f64),
        (!per.is_empty()).then(|| total / per.len() as f64),
    )
}

/// A dual-voltage winding (9, 12 leads) is planned with its sections in parallel, its
/// lower voltage: a supply at the nameplate's higher voltage says otherwise.
fn supply_at_higher_voltage(w: &Winding) -> Option<CardWarning> {
    let (Some(n), Some(v)) = (&w.design.nameplate, w.design.supply.line_voltage_v) else {
        return None;
    };
    if w.design.leads.count < 9 || n.voltages_v.len() != 2 {
        return None;
    }
    let hi = n.voltages_v.iter().copied().fold(f64::MIN, f64::max);
    let lo = n.voltages_v.iter().copied().fold(f64::MAX, f64::min);
    (hi > lo * 1.2 && (v - hi).abs() < (v - lo).abs()).then_some(
        CardWarning::SupplyAtHigherVoltage {
            supply_v: v,
            lower_v: lo,
            higher_v: hi,
        },
    )
}

/// The former of each distinct span, by the mean-turn rule (empty when the turn is given
/// as a length, or the stack or slot pitch is missing).
pub fn formers(w: &Winding) -> Vec<Former> {
    let rule = &w.design.turn;
    let (None, Some(stack), Some(pitch)) = (rule.mean_turn, w.design.core.stack, span_pitch(w))
    else {
        return Vec::new();
    };
    let mut spans: std::collections::BTreeMap<u64, usize> = Default::default();
    for c in &w.coils {
        *spans.entry(w.span(c).unsigned_abs()).or_default() += 1;
    }
    let k = rule.end_factor;
    spans
        .into_iter()
        .filter_map(|(y, n)| {
            let width = y as f64 * pitch;
            let ext = rule.end_allowance / 4.0;
            let rise = width / 2.0 * (k * k - 1.0).max(0.0).sqrt();
            Some(Former {
                span: format!("1-{}", y + 1),
                coils: n,
                span_width: width,
                straight: stack + 2.0 * ext,
                end_extension: ext + rise,
                // The card's one mean-turn rule at this span.
                mean_turn: mean_turn(w, y as f64)?,
            })
        })
        .collect()
}

/// High-potential test voltage of a new winding for rated line voltage `u` (volts):
/// 1000 V + 2·U_N, at least 1500 V (IEC 60034-1, clause 9.2, Table 16 item for machines
/// below 10 MW; from memory).
/// The voltage a winding's high-potential test is worked from: `given` (the supply's, or
/// a dual-voltage winding's higher) or the nameplate's highest, whichever is higher (a
/// 400/690 V machine is tested for 690 V).
pub fn test_voltage(w: &Winding, given: Option<f64>) -> Option<f64> {
    let stamped = w
        .design
        .nameplate
        .as_ref()
        .and_then(|n| n.voltages_v.iter().copied().reduce(f64::max));
    match (given, stamped) {
        (Some(a), Some(b)) => Some(a.max(b)),
        (a, b) => a.or(b),
    }
}

/// The acceptance figures of a winding rated `rated_v` (line volts) whose line-to-line
/// resistance is expected to read `line_resistance`: the high-potential test (IEC 60034-1),
/// insulation resistance and polarization index (IEEE 43-2013), the readings' balance
/// (EASA AR100).
pub fn acceptance(rated_v: Option<f64>, line_resistance: Option<AtTemperature>) -> Acceptance {
    let hipot = rated_v.map(hipot_new_v);
    Acceptance {
        line_resistance,
        balance_tolerance_percent: BALANCE_TOLERANCE_PERCENT,
        hipot_new_v: hipot,
        hipot_repeat_v: hipot.map(|v| 0.8 * v),
        hipot_rated_v: rated_v,
        insulation_resistance_min_mohm: 5.0,
        polarization_index_min: 2.0,
    }
}

pub fn hipot_new_v(u: f64) -> f64 {
    (1000.0 + 2.0 * u).max(1500.0)
}
