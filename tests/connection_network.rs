//! Wiring a motor from its connection sheet alone: for every lead count (3, 6, 9, 12), both
//! markings (IEC 60034-8, NEMA MG 1), star and delta, and every board the sheet draws
//! (series and parallel), the test reads from the SVG only what a winder reads — each
//! path's start and finish lead (the lanes), each board's supply terminals, its joined
//! leads and the ends joined inside — builds the electrical network of the sections, puts a
//! balanced positive-sequence supply at the board's own stated line voltage on L1, L2, L3,
//! and solves it (nodal analysis, equal sections).
//!
//! Each section must then carry current and see exactly the voltage it was designed for,
//! with its phase's angle: U_ph = U_line/√3 in star and U_line in delta at the planned
//! voltage (the three-phase relations of any circuits text, e.g. Hughes, *Electrical and
//! Electronic Technology*, ch. on three-phase systems), the same voltage on every board, with
//! phase k at −120°·k from phase U. Nothing of the card's lead tables is used to check.

use std::collections::{BTreeMap, BTreeSet};

use beltwright::draw::{self, Page, Sheet};
use beltwright::layout;
use beltwright::winding;
use num_complex::Complex64 as C;

/// A section of winding between two leads, as the sheet's lanes draw it.
#[derive(Debug)]
struct Section {
    phase: usize,
    start: String,
    finish: String,
}

/// One board: its stated line voltage, supply terminals per line, joined groups.
#[derive(Debug)]
struct Board {
    /// Read from the words, whose voltage is printed to the volt.
    worded: bool,
    planned: bool,
    star: bool,
    voltage: f64,
    lines: [Vec<String>; 3],
    ties: Vec<Vec<String>>,
}

fn leads_of(n: roxmltree::Node) -> Vec<String> {
    n.attribute("data-leads")
        .unwrap_or("")
        .split_whitespace()
        .map(str::to_string)
        .collect()
}

fn has_class(n: &roxmltree::Node, class: &str) -> bool {
    n.attribute("class")
        .is_some_and(|c| c.split_whitespace().any(|x| x == class))
}

/// What the sheet says: sections, boards, ties inside the machine, the headline's text.
fn read_sheet(svg: &str) -> (Vec<Section>, Vec<Board>, Vec<Vec<String>>, String) {
    let doc = roxmltree::Document::parse(svg).expect("well-formed SVG");
    let mut sections = Vec::new();
    let mut boards = Vec::new();
    let mut inside = Vec::new();
    let mut headline = String::new();
    let mut words = String::new();
    for n in doc.descendants() {
        if has_class(&n, "lane") {
            sections.push(Section {
                phase: n.attribute("data-phase").unwrap().parse().unwrap(),
                start: n.attribute("data-start").unwrap().to_string(),
                finish: n.attribute("data-finish").unwrap().to_string(),
            });
        } else if has_class(&n, "board") {
            let mut lines: [Vec<String>; 3] = Default::default();
            let mut ties = Vec::new();
            for d in n.descendants() {
                if has_class(&d, "supply") {
                    let j: usize = d.attribute("data-line").unwrap().parse().unwrap();
                    lines[j - 1] = leads_of(d);
                } else if has_class(&d, "tie") {
                    ties.push(leads_of(d));
                }
            }
            boards.push(Board {
                worded: false,
                planned: n.attribute("data-planned") == Some("1"),
                star: n.attribute("data-connection") == Some("star"),
                voltage: n
                    .attribute("data-line-voltage")
                    .expect("a board states its line voltage when the supply is given")
                    .parse()
                    .unwrap(),
                lines,
                ties,
            });
        } else if has_class(&n, "inside-tie") {
            inside.push(leads_of(n));
        } else if has_class(&n, "headline") {
            headline.push_str(n.text().unwrap_or(""));
            headline.push(' ');
        } else if has_class(&n, "lead-table") {
            words.push_str(n.text().unwrap_or(""));
            words.push(' ');
        }
    }
    // Connections the sheet gives only in words (12 leads: the other connection's two),
    // read as a winder reads them: "Series star (higher voltage), 1386 V line: L1 to T1,
    // L2 to T2, L3 to T3; join T4-T7, T5-T8, T6-T9, T10-T11-T12 and insulate."
    let words = words.split_whitespace().collect::<Vec<_>>().join(" ");
    for sentence in words.split('.').map(str::trim).filter(|s| !s.is_empty()) {
        boards.push(board_from_words(sentence));
    }
    // The headline may wrap over several lines: read it as one.
    let headline = headline.split_whitespace().collect::<Vec<_>>().join(" ");
    (sections, boards, inside, headline)
}

/// A connection given in words on the sheet, as a board.
fn board_from_words(s: &str) -> Board {
    let (head, rest) = s.split_once(": ").expect("heading: wiring");
    let star = head.to_lowercase().contains("star");
    let voltage: f64 = head
        .split(", ")
        .nth(1)
        .and_then(|v| v.split(' ').next())
        .and_then(|v| v.parse().ok())
        .expect("a line voltage in the heading");
    let (feed, join) = match rest.split_once("; join ") {
        Some((f, j)) => (f, Some(j.trim_end_matches(" and insulate"))),
        None => (rest, None),
    };
    let mut lines: [Vec<String>; 3] = Default::default();
    for part in feed.split(", ") {
        let (line, leads) = part.split_once(" to ").expect("Lk to leads");
        let j: usize = line.trim_start_matches('L').parse().expect("line number");
        lines[j - 1] = leads.split('+').map(str::to_string).collect();
    }
    let ties = join
        .map(|j| {
            j.split(", ")
                .map(|g| g.split('-').map(str::to_string).collect())
                .collect()
        })
        .unwrap_or_default();
    Board {
        worded: true,
        planned: false,
        star,
        voltage,
        lines,
        ties,
    }
}

/// Union-find over lead names.
struct Nodes {
    parent: BTreeMap<String, String>,
}

impl Nodes {
    fn find(&mut self, a: &str) -> String {
        let p = self
            .parent
            .entry(a.to_string())
            .or_insert_with(|| a.to_string())
            .clone();
        if p == a {
            return p;
        }
        let root = self.find(&p);
        self.parent.insert(a.to_string(), root.clone());
        root
    }
    fn join(&mut self, group: &[String]) {
        for w in group.windows(2) {
            let (a, b) = (self.find(&w[0]), self.find(&w[1]));
            if a != b {
                self.parent.insert(a, b);
            }
        }
    }
}

/// Solve the network of `board` and return each section's voltage start − finish, or the
/// index of a section that carries no current (not connected to the supply).
fn solve(sections: &[Section], board: &Board, inside: &[Vec<String>]) -> Result<Vec<C>, String> {
    let mut nodes = Nodes {
        parent: BTreeMap::new(),
    };
    for s in sections {
        nodes.find(&s.start);
        nodes.find(&s.finish);
    }
    for g in board.ties.iter().chain(inside).chain(board.lines.iter()) {
        nodes.join(g);
    }
    // Supply potentials: line-to-neutral phasors of a balanced positive sequence.
    let a = C::from_polar(1.0, -2.0 * std::f64::consts::PI / 3.0);
    let mut fixed: BTreeMap<String, C> = BTreeMap::new();
    for (j, leads) in board.lines.iter().enumerate() {
        assert!(!leads.is_empty(), "line L{} has no lead", j + 1);
        let n = nodes.find(&leads[0]);
        let v = board.voltage / 3f64.sqrt() * a.powu(j as u32);
        if let Some(old) = fixed.insert(n.clone(), v) {
            return Err(format!("lines share a node: {old} and {v} on {n}"));
        }
    }
    let ends: Vec<(String, String)> = sections
        .iter()
        .map(|s| (nodes.find(&s.start), nodes.find(&s.finish)))
        .collect();
    let free: Vec<String> = ends
        .iter()
        .flat_map(|(a, b)| [a.clone(), b.clone()])
        .filter(|n| !fixed.contains_key(n))
        .collect::<BTreeSet<_>>()
        .into_iter()
        .collect();
    // Which nodes reach a supply node through sections?
    let mut reached: BTreeSet<String> = fixed.keys().cloned().collect();
    loop {
        let before = reached.len();
        for (a, b) in &ends {
            if reached.contains(a) || reached.contains(b) {
                reached.insert(a.clone());
                reached.insert(b.clone());
            }
        }
        if reached.len() == before {
            break;
        }
    }
    for (i, (a, b)) in ends.iter().enumerate() {
        if !reached.contains(a) || !reached.contains(b) {
            return Err(format!("section {i} ({:?}) is not connected", sections[i]));
        }
    }
    let idx: BTreeMap<&String, usize> = free.iter().enumerate().map(|(i, n)| (n, i)).collect();
    let n = free.len();
    let mut m = vec![vec![C::new(0.0, 0.0); n + 1]; n];
    for (a, b) in &ends {
        for (p, q) in [(a, b), (b, a)] {
            if let Some(&i) = idx.get(p) {
                m[i][i] += 1.0;
                match idx.get(q) {
                    Some(&j) => m[i][j] -= 1.0,
                    None => m[i][n] += fixed[q],
                }
            }
        }
    }
    // Gaussian elimination with partial pivoting.
    for col in 0..n {
        let piv = (col..n)
            .max_by(|&x, &y| m[x][col].norm().total_cmp(&m[y][col].norm()))
            .unwrap();
        if m[piv][col].norm() < 1e-12 {
            return Err("the network is singular: a node floats".into());
        }
        m.swap(col, piv);
        let pivot = m[col].clone();
        for (row, r) in m.iter_mut().enumerate() {
            if row != col {
                let f = r[col] / pivot[col];
                for (x, p) in r.iter_mut().zip(&pivot).skip(col) {
                    *x -= p * f;
                }
            }
        }
    }
    let potential = |node: &String| -> C {
        match idx.get(node) {
            Some(&i) => m[i][n] / m[i][i],
            None => fixed[node],
        }
    };
    Ok(ends
        .iter()
        .map(|(a, b)| potential(a) - potential(b))
        .collect())
}

fn layout(
    leads: u8,
    marking: &str,
    connection: &str,
    volts: f64,
    (slots, poles, pitch, paths): (usize, usize, usize, usize),
) -> String {
    format!(
        r#"
title = "Invented test motor, {leads} leads"
[machine]
topology = "rotary"
slots = {slots}
poles = {poles}
[winding]
layers = 2
pitch = {pitch}
turns_per_coil = 10
parallel_paths = {paths}
connection = "{connection}"
leads = {leads}
marking = "{marking}"
[supply]
frequency_hz = 50.0
line_voltage_v = {volts}
"#
    )
}

#[test]
fn every_board_of_every_scheme_powers_every_section_at_its_design_voltage() {
    let a = C::from_polar(1.0, -2.0 * std::f64::consts::PI / 3.0);
    let mut boards_checked = 0;
    // Two invented cores; 3 and 6 leads also with their paths in parallel inside.
    let cores = [(36, 4, 8), (24, 2, 10)];
    let mut cases = Vec::new();
    for core in cores {
        for leads in [3u8, 6, 9, 12] {
            let paths: &[usize] = if leads >= 9 { &[2] } else { &[1, 2] };
            for &a in paths {
                cases.push((leads, (core.0, core.1, core.2, a)));
            }
        }
    }
    let mut want_boards = 0;
    for (leads, core) in cases {
        for marking in ["iec", "nema"] {
            for connection in ["star", "delta"] {
                let volts = 230.0;
                let name = format!("{leads}-{marking}-{connection} {core:?}");
                want_boards += match leads {
                    3 => 1,
                    12 => 4,
                    _ => 2,
                };
                let spec = layout::parse(&layout(leads, marking, connection, volts, core), &name)
                    .unwrap_or_else(|e| panic!("{name}: {e}"));
                let w = winding::build(&spec).unwrap_or_else(|e| panic!("{name}: {e}"));
                let svg = &draw::draw(
                    &beltwright::study::Study::new(&w, None),
                    Sheet::Connections,
                    &Page::default(),
                )[0];
                let (sections, boards, inside, headline) = read_sheet(svg);
                assert_eq!(
                    sections.len(),
                    3 * w.parallel_paths,
                    "{name}: a lane per path"
                );
                assert!(!boards.is_empty(), "{name}: no board drawn");
                assert_eq!(
                    boards.iter().filter(|b| b.planned).count(),
                    1,
                    "{name}: exactly one board is marked as planned"
                );
                // Boards drawn, and for 12 leads the two connections given in words.
                let expected_boards = match leads {
                    3 => 1,
                    12 => 4,
                    _ => 2,
                };
                assert_eq!(
                    boards.len(),
                    expected_boards,
                    "{name}: boards drawn or worded"
                );
                // The designed section voltage: a phase sees U_line/√3 in star, U_line in
                // delta, at the planned voltage; each path of a 9/12-lead winding is a
                // whole phase's worth of turns in parallel with the other.
                let u_sec = match connection {
                    "star" => volts / 3f64.sqrt(),
                    _ => volts,
                };
                for b in &boards {
                    let v = solve(&sections, b, &inside)
                        .unwrap_or_else(|e| panic!("{name} board {b:?}: {e}"));
                    // The board's stated connection decides the angle: star phases sit at
                    // the line-to-neutral phasors, delta phases (line to line) 30° ahead.
                    let board_shift = if b.star {
                        0.0
                    } else {
                        std::f64::consts::PI / 6.0
                    };
                    for (s, vs) in sections.iter().zip(&v) {
                        let want = C::from_polar(u_sec, board_shift) * a.powu(s.phase as u32);
                        // A worded board's voltage is printed to the volt: allow that.
                        let tol = if b.worded { 0.6 / b.voltage } else { 1e-6 };
                        assert!(
                            (vs - want).norm() < tol * u_sec,
                            "{name}: board at {} V (planned {}): section {s:?} sees {vs} V, \
                             designed for {want} V",
                            b.voltage,
                            b.planned
                        );
                    }
                    boards_checked += 1;
                    if b.planned {
                        // The headline names the planned board's supply terminals.
                        for (j, l) in b.lines.iter().enumerate() {
                            let words = format!("L{} to {}", j + 1, l.join("+"));
                            assert!(
                                headline.contains(&words),
                                "{name}: headline {headline:?} lacks {words:?}"
                            );
                        }
                        assert!(
                            (b.voltage - volts).abs() < 1e-6,
                            "{name}: the planned board is labelled {} V, planned {volts} V",
                            b.voltage
                        );
                    }
                }
            }
        }
    }
    assert_eq!(boards_checked, want_boards);
    assert!(boards_checked >= 96, "{boards_checked}");
}
