//! Lead markings and connection tables: IEC 60034-8 letters and NEMA MG 1 T-lead numbers
//! for 3, 6, 9 and 12 leads, with the single-voltage (star/delta) and dual-voltage
//! (series/parallel) connections a terminal box is wired to.
//!
//! Each phase has one section (3 and 6 leads) or two equal sections (9 and 12 leads, the two
//! parallel paths of the winding). Section ends are named by one function per marking:
//! - NEMA MG 1 (Part 2, terminal markings): first sections T1–T4, T2–T5, T3–T6, second
//!   sections T7–T10, T8–T11, T9–T12 (phases A, B, C).
//! - IEC 60034-8: first sections U1–U2, V1–V2, W1–W2, second sections U5–U6, V5–V6, W5–W6
//!   (the numbering of a phase winding in two sections; from memory).
//!
//! Nine-lead machines join three section ends inside: the second sections' finishes in a
//! star point (star machines), or each second section's finish to the next phase's first
//! start (delta machines).

use serde::Serialize;

use crate::design::{Leads, Marking};
use crate::winding::Connection;

/// Start or finish of a section.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum End {
    Start,
    Finish,
}

/// How the two sections of a phase are joined.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, schemars::JsonSchema)]
#[serde(rename_all = "lowercase")]
pub enum Sections {
    /// One section per phase (3 or 6 leads).
    Single,
    /// The two sections in series: the higher voltage.
    Series,
    /// The two sections in parallel: the lower voltage.
    Parallel,
}

/// One way to wire the terminal box.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Configuration {
    /// Star or delta.
    pub connection: Connection,
    /// Series, parallel or single sections.
    pub sections: Sections,
    /// Leads that go to supply lines L1, L2 and L3.
    pub lines: [Vec<String>; 3],
    /// Groups of leads joined together and insulated (not to a line).
    pub joined: Vec<Vec<String>>,
    /// True for the connection the winding is planned for.
    pub as_planned: bool,
    /// Rated line voltage in this connection, when the supply is given, volts.
    pub line_voltage_v: Option<f64>,
    /// Resistance between two line terminals at 20 °C in this connection, ohms.
    pub line_resistance_20c_ohm: Option<f64>,
}

/// The lead scheme of a winding.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct LeadScheme {
    /// Marking scheme.
    pub marking: Marking,
    /// Leads brought out.
    pub count: u8,
    /// Every lead brought out: (name, phase label, section from 1, "start" | "finish").
    pub terminals: Vec<Terminal>,
    /// Section ends joined inside the machine (3- and 9-lead machines).
    pub internal: Vec<Vec<String>>,
    /// Connections the terminal box can be wired to.
    pub configurations: Vec<Configuration>,
    /// Which way the field moves with L1-L2-L3 on the first three leads.
    /// (The presenters write this field into the JSON, each fact with its `message`.)
    #[serde(skip)]
    pub rotation: Rotation,
}

/// One lead.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Terminal {
    /// Marking on the lead.
    pub name: String,
    /// Phase label of the winding.
    pub phase: String,
    /// Section of the phase, from 1.
    pub section: usize,
    /// "start" or "finish".
    pub end: &'static str,
}

/// Marking of the lead at the start (`finish` false) or finish of section `s` (the parallel
/// path, 0-based) of phase `p` of a three-phase winding, and whether that end stays inside
/// the machine (the star point of a three-lead machine, the internal joints of nine leads).
pub fn section_lead(leads: Leads, p: usize, s: usize, finish: bool) -> (String, bool) {
    let e = if finish { End::Finish } else { End::Start };
    let s = if leads.count >= 9 { s.min(1) } else { 0 };
    let inside = matches!(
        (leads.count, s, e),
        (3, _, End::Finish) | (9, 1, End::Finish)
    );
    (name(leads, p % 3, s, e), inside)
}

/// Name of the end of section `s` (0 or 1) of phase `p` (0..3), with the speed a winding
/// of a two-winding motor serves: IEC 60034-8 writes the speed's number in front (1U1,
/// 2U1); NEMA MG 1 numbers the higher speed's leads from T11 (both from memory).
fn name(leads: Leads, p: usize, s: usize, e: End) -> String {
    let base = own_name(leads.marking, leads.count, p, s, e);
    match (leads.speed, leads.marking) {
        (0, _) => base,
        (n, Marking::Iec) => format!("{n}{base}"),
        (n, Marking::Nema) => match base.strip_prefix('T').and_then(|t| t.parse::<u32>().ok()) {
            Some(t) => format!("T{}", t + 10 * (u32::from(n) - 1)),
            None => base,
        },
    }
}

/// Name of the end of section `s` (0 or 1) of phase `p` (0..3) of a one-winding machine.
fn own_name(marking: Marking, count: u8, p: usize, s: usize, e: End) -> String {
    match marking {
        Marking::Nema => {
            if count == 3 {
                // Three leads: T1, T2, T3 out; the finishes stay inside (named T4, T5, T6
                // as on a six-lead machine, so a sheet can say where they go).
                return match e {
                    End::Start => format!("T{}", p + 1),
                    End::Finish => format!("T{}", p + 4),
                };
            }
            let base = 1 + 6 * s + p;
            match e {
                End::Start => format!("T{base}"),
                End::Finish => format!("T{}", base + 3),
            }
        }
        Marking::Iec => {
            let letter = ["U", "V", "W"][p];
            if count == 3 {
                // Three leads: U, V, W out (IEC 60034-8); the finishes stay inside.
                return match e {
                    End::Start => letter.to_string(),
                    End::Finish => format!("{letter}2"),
                };
            }
            let n = 1 + 4 * s + usize::from(e == End::Finish);
            format!("{letter}{n}")
        }
    }
}

/// Per-phase resistances of each section at 20 °C, for the line-to-line figures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SectionResistance {
    /// `r[phase][section]`, ohms; for single-section leads only `r[p][0]` is used and holds
    /// the whole phase's resistance (its paths in parallel).
    pub r: [[f64; 2]; 3],
}

impl SectionResistance {
    fn phase(&self, p: usize, sections: Sections) -> f64 {
        let [a, b] = self.r[p];
        match sections {
            Sections::Single => a,
            Sections::Series => a + b,
            Sections::Parallel => a * b / (a + b),
        }
    }

    /// Resistance between line terminals L(k) and L(k+1), k = 0 for 1-2, 1 for 2-3, 2 for
    /// 3-1. Star: R_k + R_{k+1}. Delta (phase k lies between L(k) and L(k+1)):
    /// R_k ‖ (R_{k+1} + R_{k+2}). With equal phases these are 2R and (2/3)R (series and
    /// parallel resistances; any circuits text, e.g. Hughes, *Electrical and Electronic
    /// Technology*).
    pub fn line_to_line(&self, k: usize, connection: Connection, sections: Sections) -> f64 {
        let r = |p: usize| self.phase(p % 3, sections);
        match connection {
            Connection::Star => r(k) + r(k + 1),
            Connection::Delta => {
                let other = r(k + 1) + r(k + 2);
                r(k) * other / (r(k) + other)
            }
        }
    }
}

/// Which way the field moves with supply lines L1, L2, L3 on the first three leads: towards
/// rising slot numbers (positive sequence, this winding's numbering); worded by the
/// presenters, which write it into the JSON with its `message`.
#[derive(Debug, Clone, PartialEq, Serialize, schemars::JsonSchema)]
pub struct Rotation {
    /// The three leads L1, L2, L3 go on.
    pub leads: Vec<String>,
    /// Slots Z (slot 1 towards slot Z).
    pub slots: usize,
    /// Whose convention names the direction of rotation.
    pub marking: Marking,
    /// A closed core turns; a flat primary's field travels along it.
    pub topology: crate::design::Topology,
}

/// The lead scheme and its connection tables. `planned` is the winding's connection;
/// `line_voltage_v` the supply's line voltage for it; `r` the section resistances.
pub fn scheme(
    leads: Leads,
    planned: Connection,
    line_voltage_v: Option<f64>,
    r: Option<&SectionResistance>,
    labels: &[String],
    slots: usize,
    topology: crate::design::Topology,
) -> LeadScheme {
    let (m, n) = (leads.marking, leads.count);
    let nm = |p: usize, s: usize, e: End| name(leads, p, s, e);
    let sections = if n >= 9 { 2 } else { 1 };
    let mut terminals = Vec::new();
    let mut internal: Vec<Vec<String>> = Vec::new();
    for s in 0..sections {
        for p in 0..3 {
            for e in [End::Start, End::Finish] {
                let inside = section_lead(leads, p, s, e == End::Finish).1;
                if !inside {
                    terminals.push(Terminal {
                        name: nm(p, s, e),
                        phase: labels.get(p).cloned().unwrap_or_default(),
                        section: s + 1,
                        end: if e == End::Start { "start" } else { "finish" },
                    });
                }
            }
        }
    }
    terminals.sort_by_key(|t| (t.section, t.end == "finish", t.phase.clone()));
    // Ends joined inside the machine: the finishes of a three-lead machine, the second
    // sections' finishes of a nine-lead machine (star point, or each to the next phase's
    // first start in delta).
    if n == 3 || n == 9 {
        let s = if n == 9 { 1 } else { 0 };
        match planned {
            Connection::Star => internal.push((0..3).map(|p| nm(p, s, End::Finish)).collect()),
            Connection::Delta => {
                for p in 0..3 {
                    internal.push(vec![nm(p, s, End::Finish), nm((p + 1) % 3, 0, End::Start)]);
                }
            }
        }
    }
    let three = |f: &dyn Fn(usize) -> Vec<String>| [f(0), f(1), f(2)];
    let mut configs: Vec<Configuration> = Vec::new();
    let mut push = |connection, sections, lines, joined| {
        configs.push(Configuration {
            connection,
            sections,
            lines,
            joined,
            as_planned: false,
            line_voltage_v: None,
            line_resistance_20c_ohm: None,
        })
    };
    let series_joins = || -> Vec<Vec<String>> {
        (0..3)
            .map(|p| vec![nm(p, 0, End::Finish), nm(p, 1, End::Start)])
            .collect()
    };
    match n {
        3 => push(
            planned,
            Sections::Single,
            three(&|p| vec![nm(p, 0, End::Start)]),
            vec![],
        ),
        6 => {
            push(
                Connection::Star,
                Sections::Single,
                three(&|p| vec![nm(p, 0, End::Start)]),
                vec![(0..3).map(|p| nm(p, 0, End::Finish)).collect()],
            );
            push(
                Connection::Delta,
                Sections::Single,
                three(&|p| vec![nm(p, 0, End::Start), nm((p + 2) % 3, 0, End::Finish)]),
                vec![],
            );
        }
        9 => match planned {
            Connection::Star => {
                push(
                    Connection::Star,
                    Sections::Series,
                    three(&|p| vec![nm(p, 0, End::Start)]),
                    series_joins(),
                );
                push(
                    Connection::Star,
                    Sections::Parallel,
                    three(&|p| vec![nm(p, 0, End::Start), nm(p, 1, End::Start)]),
                    vec![(0..3).map(|p| nm(p, 0, End::Finish)).collect()],
                );
            }
            Connection::Delta => {
                push(
                    Connection::Delta,
                    Sections::Series,
                    three(&|p| vec![nm(p, 0, End::Start)]),
                    series_joins(),
                );
                push(
                    Connection::Delta,
                    Sections::Parallel,
                    three(&|p| {
                        vec![
                            nm(p, 0, End::Start),
                            nm((p + 2) % 3, 0, End::Finish),
                            nm(p, 1, End::Start),
                        ]
                    }),
                    vec![],
                );
            }
        },
        _ => {
            let mut star_series = series_joins();
            star_series.push((0..3).map(|p| nm(p, 1, End::Finish)).collect());
            push(
                Connection::Star,
                Sections::Series,
                three(&|p| vec![nm(p, 0, End::Start)]),
                star_series,
            );
            push(
                Connection::Star,
                Sections::Parallel,
                three(&|p| vec![nm(p, 0, End::Start), nm(p, 1, End::Start)]),
                vec![
                    (0..3)
                        .map(|p| nm(p, 0, End::Finish))
                        .chain((0..3).map(|p| nm(p, 1, End::Finish)))
                        .collect(),
                ],
            );
            push(
                Connection::Delta,
                Sections::Series,
                three(&|p| vec![nm(p, 0, End::Start), nm((p + 2) % 3, 1, End::Finish)]),
                series_joins(),
            );
            push(
                Connection::Delta,
                Sections::Parallel,
                three(&|p| {
                    vec![
                        nm(p, 0, End::Start),
                        nm((p + 2) % 3, 0, End::Finish),
                        nm(p, 1, End::Start),
                        nm((p + 2) % 3, 1, End::Finish),
                    ]
                }),
                vec![],
            );
        }
    }
    // The winding is planned with its paths in parallel: that is the low-voltage connection
    // of a dual-voltage machine.
    let planned_sections = if n >= 9 {
        Sections::Parallel
    } else {
        Sections::Single
    };
    for c in &mut configs {
        c.as_planned = c.connection == planned && c.sections == planned_sections;
    }
    // A winding of a two-winding motor is wired only as planned, by its own speed's
    // contactor: the other connections of its leads are not a choice on that machine.
    if leads.speed != 0 {
        configs.retain(|c| c.as_planned);
    }
    for c in &mut configs {
        c.line_voltage_v = line_voltage_v.map(|v| {
            let by_sections = match (planned_sections, c.sections) {
                (Sections::Parallel, Sections::Series) => 2.0,
                _ => 1.0,
            };
            // The same phase voltage in the other connection (the one star/delta rule).
            let by_connection = planned.phase_voltage(1.0) / c.connection.phase_voltage(1.0);
            v * by_sections * by_connection
        });
        c.line_resistance_20c_ohm = r.map(|r| r.line_to_line(0, c.connection, c.sections));
    }
    let first: Vec<String> = (0..3).map(|p| nm(p, 0, End::Start)).collect();
    let rotation = Rotation {
        leads: first,
        slots,
        marking: m,
        topology,
    };
    LeadScheme {
        marking: m,
        count: n,
        terminals,
        internal,
        configurations: configs,
        rotation,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn names(v: &[String]) -> Vec<&str> {
        v.iter().map(String::as_str).collect()
    }

    fn table(n: u8, m: Marking, c: Connection) -> LeadScheme {
        let labels: Vec<String> = ["U", "V", "W"].iter().map(|s| s.to_string()).collect();
        scheme(
            Leads {
                count: n,
                marking: m,
                speed: 0,
            },
            c,
            None,
            None,
            &labels,
            24,
            crate::design::Topology::Rotary,
        )
    }

    // NEMA MG 1 Part 2 connection tables for six-lead single-voltage machines (from memory;
    // the same tables are printed on the nameplates of NEMA motors): star joins T4-T5-T6,
    // delta puts T1-T6, T2-T4, T3-T5 on L1, L2, L3.
    #[test]
    fn nema_six_lead_star_and_delta() {
        let s = table(6, Marking::Nema, Connection::Star);
        let star = &s.configurations[0];
        assert_eq!(names(&star.lines[0]), ["T1"]);
        assert_eq!(names(&star.joined[0]), ["T4", "T5", "T6"]);
        let delta = &s.configurations[1];
        assert_eq!(names(&delta.lines[0]), ["T1", "T6"]);
        assert_eq!(names(&delta.lines[1]), ["T2", "T4"]);
        assert_eq!(names(&delta.lines[2]), ["T3", "T5"]);
    }

    // NEMA nine-lead star (wye) machine: low voltage L1 = T1-T7, L2 = T2-T8, L3 = T3-T9 with
    // T4-T5-T6 joined; high voltage T1, T2, T3 on the lines with T4-T7, T5-T8, T6-T9 joined
    // (NEMA MG 1 Part 2; from memory, as on dual-voltage nameplates).
    #[test]
    fn nema_nine_lead_star() {
        let s = table(9, Marking::Nema, Connection::Star);
        assert_eq!(s.terminals.len(), 9);
        assert_eq!(names(&s.internal[0]), ["T10", "T11", "T12"]);
        let high = &s.configurations[0];
        assert_eq!(high.sections, Sections::Series);
        assert_eq!(names(&high.lines[0]), ["T1"]);
        assert_eq!(names(&high.joined[0]), ["T4", "T7"]);
        assert_eq!(names(&high.joined[2]), ["T6", "T9"]);
        let low = &s.configurations[1];
        assert_eq!(names(&low.lines[1]), ["T2", "T8"]);
        assert_eq!(names(&low.joined[0]), ["T4", "T5", "T6"]);
        assert!(low.as_planned && !high.as_planned);
    }

    // NEMA nine-lead delta machine: low voltage L1 = T1-T6-T7, L2 = T2-T4-T8,
    // L3 = T3-T5-T9; high voltage joins T4-T7, T5-T8, T6-T9 (from memory, as above).
    #[test]
    fn nema_nine_lead_delta() {
        let s = table(9, Marking::Nema, Connection::Delta);
        let low = &s.configurations[1];
        assert_eq!(names(&low.lines[0]), ["T1", "T6", "T7"]);
        assert_eq!(names(&low.lines[1]), ["T2", "T4", "T8"]);
        assert_eq!(names(&low.lines[2]), ["T3", "T5", "T9"]);
        assert_eq!(names(&s.configurations[0].joined[1]), ["T5", "T8"]);
    }

    // NEMA twelve-lead machine, all four connections (from memory, as above): series star
    // joins T10-T11-T12; parallel star joins T4-T5-T6-T10-T11-T12 with L1 = T1-T7; series
    // delta L1 = T1-T12, L2 = T2-T10, L3 = T3-T11; parallel delta L1 = T1-T6-T7-T12.
    #[test]
    fn nema_twelve_lead_tables() {
        let s = table(12, Marking::Nema, Connection::Delta);
        assert_eq!(s.terminals.len(), 12);
        let c = &s.configurations;
        assert_eq!(names(&c[0].joined[3]), ["T10", "T11", "T12"]);
        assert_eq!(names(&c[1].lines[0]), ["T1", "T7"]);
        assert_eq!(
            names(&c[1].joined[0]),
            ["T4", "T5", "T6", "T10", "T11", "T12"]
        );
        assert_eq!(names(&c[2].lines[0]), ["T1", "T12"]);
        assert_eq!(names(&c[2].lines[1]), ["T2", "T10"]);
        assert_eq!(names(&c[2].lines[2]), ["T3", "T11"]);
        assert_eq!(names(&c[3].lines[0]), ["T1", "T6", "T7", "T12"]);
        assert!(c[3].as_planned);
    }

    // IEC 60034-8 terminal board of a six-lead machine: delta links U1-W2, V1-U2, W1-V2;
    // star joins U2-V2-W2 (common practice, the standard terminal-board links).
    #[test]
    fn iec_six_lead_links() {
        let s = table(6, Marking::Iec, Connection::Delta);
        assert_eq!(names(&s.configurations[0].joined[0]), ["U2", "V2", "W2"]);
        let d = &s.configurations[1];
        assert_eq!(names(&d.lines[0]), ["U1", "W2"]);
        assert_eq!(names(&d.lines[1]), ["V1", "U2"]);
        assert_eq!(names(&d.lines[2]), ["W1", "V2"]);
        assert!(d.as_planned);
    }

    // IEC 60034-8 marking of a winding in two sections per phase: U1-U2 and U5-U6 (V, W
    // alike; from memory). Parallel star joins U2-V2-W2-U6-V6-W6 with L1 on U1+U5.
    #[test]
    fn iec_twelve_lead_sections() {
        let s = table(12, Marking::Iec, Connection::Star);
        let names: Vec<&str> = s.terminals.iter().map(|t| t.name.as_str()).collect();
        for n in ["U1", "U2", "U5", "U6", "V5", "W6"] {
            assert!(names.contains(&n), "{names:?}");
        }
        let parallel = &s.configurations[1];
        assert_eq!(parallel.sections, Sections::Parallel);
        assert_eq!(super::tests::names(&parallel.lines[0]), ["U1", "U5"]);
        assert_eq!(
            super::tests::names(&parallel.joined[0]),
            ["U2", "V2", "W2", "U6", "V6", "W6"]
        );
    }

    // Star: 2R between lines; delta: (2/3)R (series-parallel reduction of equal resistors).
    #[test]
    fn line_to_line_of_equal_phases() {
        let r = SectionResistance { r: [[3.0, 3.0]; 3] };
        assert!((r.line_to_line(0, Connection::Star, Sections::Single) - 6.0).abs() < 1e-12);
        assert!((r.line_to_line(1, Connection::Delta, Sections::Single) - 2.0).abs() < 1e-12);
        // Two equal sections: series doubles, parallel halves the phase resistance.
        assert!((r.line_to_line(2, Connection::Star, Sections::Series) - 12.0).abs() < 1e-12);
        assert!((r.line_to_line(0, Connection::Star, Sections::Parallel) - 3.0).abs() < 1e-12);
    }
}
