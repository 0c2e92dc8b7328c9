//! The core's loadings (`loading`) and the sizing of a bare core (`size`) as text, JSON and
//! CSV; [`loading_table`] is the one table of loadings that the card, the rewind and the
//! HTML page show too.

use super::{Align, Report, Section, Table, Words, caution, num, opening, paragraph, worded};
use crate::loading::{
    Checked, Density, Loading, LoadingError, LoadingReport, LoadingWarning, Part, Rated,
};
use crate::sizing::{Sizing, SizingError, SpanChoice};
use crate::thrust::Input;

/// The layout key a missing input is given under.
fn key_of(input: Input) -> &'static str {
    match input {
        Input::Secondary => "a [secondary] table",
        Input::Airgap => "core.airgap_mm",
        Input::Frequency => "supply.frequency_hz (or nameplate.frequency_hz)",
        Input::LineVoltage => "supply.line_voltage_v (or nameplate.voltage_v)",
        Input::SlotPitch => "core.slot_pitch_mm (or core.bore_mm on a rotary core)",
        Input::Stack => "core.stack_mm",
    }
}

impl Words for LoadingError {
    fn message(&self) -> String {
        match self {
            LoadingError::Missing(i) => format!("the loadings need {}", key_of(*i)),
            LoadingError::NoTurns => {
                "the winding has no turns or no fundamental EMF in its first phase".into()
            }
            LoadingError::TurnsAssumed => "the layout gives no turns (winding.turns_per_coil \
                 or a coil list), so there is nothing to check; size a bare core with \
                 `beltwright size`"
                .into(),
        }
    }
}

impl Words for SizingError {
    fn message(&self) -> String {
        match self {
            SizingError::Missing(i) => format!("sizing needs {}", key_of(*i)),
            SizingError::Loading(why) => why.message(),
            SizingError::NoWinding(why) => {
                format!("no winding can be built on this core: {}", why.message())
            }
            SizingError::NotThreePhase(m) => format!(
                "sizing is for three-phase windings; this core is laid out for {m} phases \
                 (machine.phases)"
            ),
            SizingError::SlipOutOfRange { slip, field_m_s } => format!(
                "a thrust is asked at slip {}{}: a primary drives the plate only below its \
                 field speed (slip above 0, at most 1 at standstill); give --at-slip from above \
                 0 to 1{}",
                num(*slip, 4),
                field_m_s
                    .map(|v| format!(" (field speed {} m/s)", num(v, 3)))
                    .unwrap_or_default(),
                field_m_s
                    .map(|v| format!(", or --at-speed from 0 to below {} m/s", num(v, 3)))
                    .unwrap_or_default()
            ),
            SizingError::ThrustNotLinear => {
                "--thrust-n sizes a flat primary (topology = \"linear\"); a rotary core is \
                 sized by its flux densities alone"
                    .into()
            }
            SizingError::Thrust(e) => format!("--thrust-n: {}", e.message()),
            SizingError::SpeedOutOfReach {
                speed_m_s,
                field_m_s,
            } => format!(
                "--at-speed {} m/s is a slip outside -10 to 10 for a field speed of {} m/s; \
                 give a speed between {} and {} m/s",
                num(*speed_m_s, 3),
                num(*field_m_s, 3),
                num(-9.0 * field_m_s, 3),
                num(11.0 * field_m_s, 3)
            ),
            SizingError::NoWholeTurns { exact, workable_v } => format!(
                "no whole number of turns per coil fits this voltage: the nearest connection \
                 needs {} turns per coil (at least 1 and at most {}); line voltages from {} V \
                 to {} V would work on this core with these limits",
                num(*exact, 3),
                crate::spec::MAX_TURNS,
                num(workable_v.0, 0),
                num(workable_v.1, 0)
            ),
        }
    }
}

impl std::fmt::Display for super::Say<'_, Part> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self.0 {
            Part::Gap => "air gap",
            Part::Teeth => "teeth",
            Part::Yoke => "back iron",
        })
    }
}

impl std::fmt::Display for super::Say<'_, LoadingWarning> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.0 {
            LoadingWarning::FluxDensityAbove {
                part,
                density,
                at_poles,
            } => write!(
                f,
                "peak flux density in the {}{} is {} T, above the limit of {} T",
                super::Say(part),
                at_poles
                    .map(|p| format!(" at {p} poles"))
                    .unwrap_or_default(),
                num(density.peak_t, 3),
                num(density.limit_t, 3)
            ),
            LoadingWarning::CurrentDensityAbove { density } => write!(
                f,
                "current density is {} A/mm², above the limit of {} A/mm²",
                num(density.value, 2),
                num(density.limit, 2)
            ),
            LoadingWarning::FillAbove { fill } => write!(
                f,
                "slot fill by insulated wire is {} %, above the limit of {} %",
                num(fill.value * 100.0, 1),
                num(fill.limit * 100.0, 1)
            ),
            LoadingWarning::RiseAbove { rise } => write!(
                f,
                "estimated temperature rise is {} K, above the {} K the insulation class allows",
                num(rise.value, 0),
                num(rise.limit, 0)
            ),
        }
    }
}
worded!(LoadingWarning);

/// "ok" or "ABOVE".
fn verdict(passed: bool) -> String {
    if passed { "ABOVE" } else { "ok" }.into()
}

fn density_row(t: &mut Table, what: &str, d: &Density) {
    t.push(vec![
        what.into(),
        format!("{} T", num(d.peak_t, 3)),
        format!("{} T", num(d.limit_t, 3)),
        verdict(d.passed()),
    ]);
}

fn checked_row(t: &mut Table, what: &str, c: &Checked, unit: &str, digits: usize) {
    t.push(vec![
        what.into(),
        format!("{} {unit}", num(c.value, digits)),
        format!("{} {unit}", num(c.limit, digits)),
        verdict(c.passed()),
    ]);
}

/// The rated current in words: stamped, or from the power with what was assumed.
pub fn rated_words(r: &Rated) -> String {
    match r {
        Rated::ThrustModel { line_a, slip } => format!(
            "{} A line current, the thrust model's at slip {}",
            num(*line_a, 2),
            num(*slip, 3)
        ),
        Rated::Stamped { line_a } => format!("{} A line current (nameplate)", num(*line_a, 2)),
        Rated::FromPower {
            line_a,
            efficiency,
            efficiency_assumed,
            power_factor,
            power_factor_assumed,
        } => {
            let mark = |a: bool| if a { " (assumed)" } else { "" };
            format!(
                "{} A line current from the rated power at efficiency {}{} and power factor \
                 {}{}",
                num(*line_a, 2),
                num(*efficiency, 3),
                mark(*efficiency_assumed),
                num(*power_factor, 3),
                mark(*power_factor_assumed)
            )
        }
    }
}

/// The table of loadings against their limits: the one table every presenter shows.
pub fn loading_table(l: &Loading) -> Table {
    let mut t = Table::new(&[
        ("loading", Align::Left),
        ("value", Align::Right),
        ("limit", Align::Right),
        ("", Align::Left),
    ]);
    let m = &l.magnetic;
    // A pole-changing winding's two speeds: each peak says at which pole count.
    let at_m = match (&l.other_speed, m.at_poles) {
        (Some(_), Some(p)) => format!(" at {p} poles"),
        _ => String::new(),
    };
    t.push(vec![
        "flux per pole".into(),
        format!("{} mWb", num(crate::units::in_milli(m.flux_per_pole_wb), 4)),
        String::new(),
        String::new(),
    ]);
    t.push(vec![
        "gap, mean over a pole".into(),
        format!("{} T", num(m.gap_mean_t, 3)),
        String::new(),
        String::new(),
    ]);
    density_row(&mut t, &format!("gap, peak{at_m}"), &m.gap);
    if let Some(d) = &m.tooth {
        density_row(&mut t, &format!("teeth, peak at narrowest{at_m}"), d);
    }
    if let Some(b) = m.tooth_mean_t {
        t.push(vec![
            "teeth, mean over a pole".into(),
            format!("{} T", num(b, 3)),
            String::new(),
            String::new(),
        ]);
    }
    if let Some(d) = &m.yoke {
        density_row(&mut t, &format!("back iron, peak{at_m}"), d);
    }
    // A pole-changing winding's other speed: its peaks too.
    if let Some(o) = &l.other_speed {
        let at = o
            .at_poles
            .map(|p| format!(" at {p} poles"))
            .unwrap_or_default();
        density_row(&mut t, &format!("gap, peak{at}"), &o.gap);
        if let Some(d) = &o.tooth {
            density_row(&mut t, &format!("teeth, peak{at}"), d);
        }
        if let Some(d) = &o.yoke {
            density_row(&mut t, &format!("back iron, peak{at}"), d);
        }
    }
    if let Some(e) = &l.electric {
        t.push(vec![
            "electric loading".into(),
            format!(
                "{} A/mm",
                num(crate::units::per_mm(e.electric_loading_a_m), 1)
            ),
            String::new(),
            String::new(),
        ]);
        if let Some(j) = &e.current_density_a_mm2 {
            checked_row(&mut t, "current density", j, "A/mm²", 2);
        }
        if let Some(h) = e.heat_load_a2_mm3 {
            t.push(vec![
                "heat load A·J".into(),
                format!("{} A²/mm³", num(h, 0)),
                String::new(),
                String::new(),
            ]);
        }
    }
    if let Some(f) = &l.slot_fill {
        let pct = Checked {
            value: f.value * 100.0,
            limit: f.limit * 100.0,
        };
        checked_row(&mut t, "slot fill (insulated wire)", &pct, "%", 1);
    }
    if let Some(h) = &l.heating {
        checked_row(&mut t, "temperature rise (estimate)", &h.rise_k, "K", 0);
    }
    t
}

/// The lines under the loading table: the basis of each figure.
pub fn loading_notes(l: &Loading) -> Vec<String> {
    let m = &l.magnetic;
    let at = m
        .at_poles
        .map(|p| {
            format!(
                " at {p} poles (of a pole-changing winding's two speeds, the one whose gap \
                 density is higher)"
            )
        })
        .unwrap_or_default();
    let mut v = vec![paragraph(&format!(
        "flux{at} at EMF {} × the phase voltage ({} V), {} Hz, N_ph {}, k_w1 {}; stacking \
         factor {}",
        num(m.emf_ratio, 3),
        num(m.phase_emf_v, 1),
        num(m.frequency_hz, 2),
        num(m.series_turns, 2),
        num(m.winding_factor, 4),
        num(m.stacking_factor, 3)
    ))];
    if let Some(e) = &l.electric {
        v.push(paragraph(&format!(
            "at {}: phase current {} A, {} A per conductor, {} conductors in the fullest slot",
            rated_words(&e.rated),
            num(e.phase_current_a, 2),
            num(e.conductor_current_a, 2),
            e.conductors_per_slot
        )));
    }
    for u in &l.unchecked {
        v.push(paragraph(&format!(
            "not checked: {}",
            match u {
                crate::loading::Unchecked::Teeth => {
                    "the teeth (give core.tooth_width_mm or core.slot_width_mm)"
                }
                crate::loading::Unchecked::BackIron => {
                    "the back iron (give core.yoke_depth_mm, or core.outside_diameter_mm with \
                     core.slot_depth_mm)"
                }
                crate::loading::Unchecked::Current => {
                    "electric loading, current density and temperature rise (give \
                     nameplate.current_a, or nameplate.power_kw)"
                }
                crate::loading::Unchecked::Wire => "current density and fill (give a [wire] table)",
                crate::loading::Unchecked::SlotArea => {
                    "slot fill (give core.slot_area_mm2, or the slot's sizes)"
                }
                crate::loading::Unchecked::CoolingSurface => {
                    "temperature rise (give core.outside_diameter_mm)"
                }
            }
        )));
    }
    if let Some(h) = &l.heating {
        v.push(paragraph(&format!(
            "temperature rise: one-node estimate (losses over α·S): copper {} W at {} °C{}, \
             over {} m² at α = {} W/(m²·K); limit for class {:?}{}. An estimate to compare \
             designs by, not a heat run",
            num(h.copper_loss_w, 0),
            num(h.reference_c, 0),
            h.iron_loss_w
                .map(|i| format!(", iron {} W", num(i, 0)))
                .unwrap_or_else(
                    || ", iron loss not counted (teeth, slot depth or back iron \
                                    unknown)"
                        .into()
                ),
            num(h.surface_m2, 4),
            num(h.coefficient_w_m2k, 0),
            h.class,
            if h.class_assumed {
                " (assumed; stamp nameplate.insulation_class)"
            } else {
                ""
            }
        )));
    }
    v
}

fn warning_lines(l: &Loading) -> Option<Section> {
    (!l.warnings.is_empty()).then(|| {
        Section::Lines(
            l.warnings
                .iter()
                .map(|w| paragraph(&format!("WARNING: {}", w.message())))
                .collect(),
        )
    })
}

impl Report for LoadingReport {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::LoadingJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = opening("Loadings", &self.design).to_vec();
        if let Some(w) = warning_lines(&self.loading) {
            s.push(w);
        }
        s.push(caution());
        s.push(Section::Table(loading_table(&self.loading)));
        s.push(Section::Lines(loading_notes(&self.loading)));
        s
    }

    fn main_table(&self) -> Table {
        loading_table(&self.loading)
    }
}

fn candidates_table(z: &Sizing) -> Table {
    let thrust = z.candidates.iter().any(|c| c.thrust_n.is_some());
    let mut columns = vec![
        ("connection", Align::Left),
        ("paths", Align::Right),
        ("V phase", Align::Right),
        ("turns exact", Align::Right),
        ("wind", Align::Right),
        ("N_ph", Align::Right),
        ("flux given away %", Align::Right),
        ("A per conductor", Align::Right),
        ("thrust N", Align::Right),
        ("wire", Align::Left),
    ];
    if !thrust {
        columns.remove(8);
    }
    let mut t = Table::new(&columns);
    for c in &z.candidates {
        let mut row = vec![
            c.connection.to_string(),
            c.parallel_paths.to_string(),
            num(c.phase_voltage_v, 1),
            num(c.turns_per_coil_exact, 3),
            c.turns_per_coil.to_string(),
            num(c.series_turns, 1),
            num(c.flux_shortfall_percent, 2),
            c.conductor_current_a.map(|i| num(i, 2)).unwrap_or_default(),
            c.thrust_n.map(|f| num(f, 1)).unwrap_or_default(),
            c.wire.map(|w| wire_words(&w)).unwrap_or_else(|| {
                if c.conductor_current_a.is_some() {
                    "none fits".into()
                } else {
                    String::new()
                }
            }),
        ];
        if !thrust {
            row.remove(8);
        }
        t.push(row);
    }
    t
}

/// "2 × 0.85 mm (IEC 60317), 4.12 A/mm², fill 61 %".
fn wire_words(w: &crate::sizing::WireChoice) -> String {
    let size = match w.awg {
        Some(n) => format!("AWG {n}"),
        None => format!("{} mm", num(w.diameter.mm(), 3)),
    };
    format!(
        "{} × {size}, {} A/mm²{}",
        w.strands_in_hand,
        num(w.current_density_a_mm2, 2),
        w.slot_fill
            .map(|f| format!(", fill {} %", num(f * 100.0, 0)))
            .unwrap_or_default()
    )
}

impl Report for Sizing {
    fn json(&self) -> impl serde::Serialize + '_ {
        super::json::SizingJson::of(self)
    }

    fn sections(&self) -> Vec<Section> {
        let mut s = opening("Sizing for the bare core", &self.design).to_vec();
        if let Some(w) = warning_lines(&self.loading) {
            s.push(w);
        }
        let best = &self.candidates[0];
        let span = match self.span_choice {
            SpanChoice::Given => "as given",
            SpanChoice::Recommended => "the span comparison's recommendation",
            SpanChoice::FullPitch => "full pitch; no span met the comparison's goal",
        };
        let mut head = vec![
            paragraph(&format!(
                "wind {} turns per coil, {}, {} path{}, span 1-{} ({span}), k_w1 {}",
                best.turns_per_coil,
                best.connection,
                best.parallel_paths,
                if best.parallel_paths == 1 { "" } else { "s" },
                self.span + 1,
                num(self.winding_factor, 4)
            )),
            paragraph(&format!(
                "sized for {} V line, {} Hz: the core carries {} mWb per pole at its limits, \
                 set by the {}",
                num(self.line_voltage_v, 1),
                num(self.frequency_hz, 2),
                num(crate::units::in_milli(self.flux_limit_wb), 4),
                super::Say(&self.flux_set_by)
            )),
        ];
        match (&best.wire, &self.fallback_wire) {
            (Some(w), _) => head.push(format!("wire: {}", wire_words(w))),
            (None, Some(w)) => head.push(paragraph(&format!(
                "wire: no standard wire of at most 4 strands carries the current within the \
                 current-density and fill limits; the largest that fits the slot is {} (a \
                 larger slot, a lower current or more cooling would be needed)",
                wire_words(w)
            ))),
            (None, None) if best.conductor_current_a.is_some() => head.push(paragraph(
                "wire: no standard wire of at most 4 strands fits the slot at this current",
            )),
            (None, None) => head.push(paragraph(
                "wire: no rated current (nameplate current_a, or power_kw; a flat primary's \
                 --thrust-n), so no wire is sized",
            )),
        }
        if let Some(p) = self.power_within_limit_w {
            head.push(paragraph(&format!(
                "within {} A/mm² this core carries about {} kW at this voltage with the largest \
                 wire that goes in (the nameplate asks for more)",
                num(self.loading.limits.current_density_a_mm2, 1),
                num(crate::units::in_kilo(p), 2)
            )));
        }
        if let Some(w) = &self.other_series_wire {
            head.push(format!("or from the other wire series: {}", wire_words(w)));
        }
        let mut r = Vec::new();
        if let Some(x) = self.phase_resistance_20c_ohm {
            r.push(format!("phase {} Ω", num(x, 4)));
        }
        if let Some(x) = self.line_resistance_20c_ohm {
            r.push(format!("line to line {} Ω", num(x, 4)));
        }
        if !r.is_empty() {
            head.push(format!("resistance at 20 °C: {}", r.join(", ")));
        }
        if let Some(m) = self.copper_mass_kg {
            head.push(format!("copper in the coils {} kg", num(m, 2)));
        }
        if let Some((lo, hi)) = self.star_delta_pair_v {
            head.push(paragraph(&format!(
                "stamped {} V / {} V on six leads: wound delta for {} V, which is star for {} V \
                 (the phases see {} V either way)",
                num(lo, 0),
                num(hi, 0),
                num(lo, 0),
                num(hi, 0),
                num(lo, 0)
            )));
        }
        s.push(Section::Lines(head));
        if let Some(t) = &self.thrust {
            let p = &t.point;
            let mut lines = vec![paragraph(&format!(
                "thrust model at slip {} ({} m/s): {} N against {} N wanted; phase current {} A, \
                 power factor {}{}; the plate turns {} W into heat{}",
                num(p.slip, 4),
                num(p.speed_m_s, 3),
                num(p.thrust_n, 1),
                num(t.wanted.thrust_n, 1),
                num(p.current_a, 2),
                num(p.power_factor, 3),
                p.efficiency
                    .map(|e| format!(", efficiency {}", num(e, 3)))
                    .unwrap_or_default(),
                num(t.plate_loss_w, 0),
                t.plate_loss_w_m2
                    .map(|q| format!(
                        " ({} kW/m² of plate under the primary)",
                        num(crate::units::in_kilo(q), 2)
                    ))
                    .unwrap_or_default()
            ))];
            if !t.met {
                lines.insert(
                    0,
                    paragraph(&format!(
                        "WARNING: the thrust model gives {} N at slip {}, short of the {} N \
                         wanted: within its flux limits this core cannot give it at this \
                         voltage and slip (a longer or wider primary, a better plate or a \
                         smaller gap would)",
                        num(p.thrust_n, 1),
                        num(p.slip, 4),
                        num(t.wanted.thrust_n, 1)
                    )),
                );
            }
            s.push(Section::Lines(lines));
        }
        s.push(caution());
        s.push(Section::Heading("Loadings of the chosen winding".into()));
        s.push(Section::Table(loading_table(&self.loading)));
        s.push(Section::Lines(loading_notes(&self.loading)));
        s.push(Section::Heading("Connections and paths, best first".into()));
        s.push(Section::Table(candidates_table(self)));
        s
    }

    fn main_table(&self) -> Table {
        candidates_table(self)
    }
}
