//! Connecting a pole-changing winding from its connection sheet alone: the test reads from
//! the SVG only what a winder reads (each half of each phase between its two leads with the
//! groups in it, and each speed's board: the lines on their leads, the links, the leads left
//! open), puts a balanced three-phase supply on the board, solves the network of equal
//! halves (nodal analysis), gives every coil its half's current and takes the MMF's waves
//! straight from the coil sides.
//!
//! The layout is the winding at its own (lower) pole count with its phase current entering
//! at the line lead: at that speed (double star, lines on the taps) current flowing away
//! from a tap runs through each coil of its half as the coil list writes it. That is the
//! only convention used; nothing of the library's two-speed model is. Each speed's board
//! must then make one rotating wave at its own pole pairs (the other direction's wave
//! vanishes, a balanced winding's property: any machines text, e.g. Say, *Alternating
//! Current Machines*, ch. on the rotating field), both speeds must turn the same way, and
//! no line may be linked to another. The winding schedule (the rows a winder joins coils
//! by) must end each half where the drawing puts its end.

use std::collections::BTreeMap;
use std::f64::consts::PI;

use beltwright::draw::{self, Page, Sheet};
use beltwright::layout;
use beltwright::winding::schedule::FinishTo;
use beltwright::winding::{self, Winding, coil_groups};
use num_complex::Complex64 as C;

/// One half as the sheet draws it.
#[derive(Debug)]
struct Half {
    phase: String,
    from: String,
    to: String,
    groups: Vec<usize>,
}

/// One speed's board as the sheet draws it.
#[derive(Debug)]
struct Board {
    poles: usize,
    lines: Vec<(String, String)>,
    linked: Vec<String>,
    open: Vec<String>,
}

fn has_class(n: &roxmltree::Node, class: &str) -> bool {
    n.attribute("class")
        .is_some_and(|c| c.split_whitespace().any(|x| x == class))
}

fn words(s: &str) -> Vec<String> {
    s.split_whitespace().map(str::to_string).collect()
}

fn read(svg: &str) -> (Vec<Half>, Vec<Board>) {
    let doc = roxmltree::Document::parse(svg).expect("svg parses");
    let mut halves = Vec::new();
    let mut boards = Vec::new();
    for n in doc.descendants() {
        if has_class(&n, "half") {
            halves.push(Half {
                phase: n.attribute("data-phase").expect("phase").to_string(),
                from: n.attribute("data-from").expect("from").to_string(),
                to: n.attribute("data-to").expect("to").to_string(),
                groups: n
                    .attribute("data-groups")
                    .expect("groups")
                    .split_whitespace()
                    .map(|g| g.trim_start_matches('G').parse().expect("group number"))
                    .collect(),
            });
        }
        if has_class(&n, "speed-board") {
            boards.push(Board {
                poles: n
                    .attribute("data-poles")
                    .expect("poles")
                    .parse()
                    .expect("n"),
                lines: words(n.attribute("data-lines").expect("lines"))
                    .iter()
                    .map(|x| {
                        let (l, lead) = x.split_once(':').expect("line:lead");
                        (l.to_string(), lead.to_string())
                    })
                    .collect(),
                linked: words(n.attribute("data-linked").expect("linked")),
                open: words(n.attribute("data-open").expect("open")),
            });
        }
    }
    (halves, boards)
}

/// Each half's current, from its `from` to its `to`, with equal halves of 1 Ω and lines
/// L1, L2, L3 at 1∠0°, 1∠−120°, 1∠120° to a common reference.
fn currents(halves: &[Half], board: &Board) -> Vec<C> {
    let mut name: BTreeMap<String, usize> = BTreeMap::new();
    let id = |s: &str, name: &mut BTreeMap<String, usize>| {
        let n = name.len();
        *name.entry(s.to_string()).or_insert(n)
    };
    let ends: Vec<(usize, usize)> = halves
        .iter()
        .map(|h| (id(&h.from, &mut name), id(&h.to, &mut name)))
        .collect();
    let n = name.len();
    // Links make one node.
    let mut rep: Vec<usize> = (0..n).collect();
    if let Some(first) = board.linked.first() {
        let to = name[first];
        for l in &board.linked {
            let from = rep[name[l]];
            for r in rep.iter_mut() {
                if *r == from {
                    *r = to;
                }
            }
        }
    }
    let a = C::from_polar(1.0, -2.0 * PI / 3.0);
    let mut fixed: BTreeMap<usize, C> = BTreeMap::new();
    for (l, lead) in &board.lines {
        let k: u32 = l.trim_start_matches('L').parse().expect("line number");
        let node = rep[*name
            .get(lead)
            .unwrap_or_else(|| panic!("{lead} not a lead"))];
        assert!(
            fixed.insert(node, a.powu(k - 1)).is_none(),
            "two lines on one node at {} poles: a short circuit",
            board.poles
        );
    }
    let free: Vec<usize> = (0..n)
        .map(|x| rep[x])
        .filter(|x| !fixed.contains_key(x))
        .collect::<std::collections::BTreeSet<_>>()
        .into_iter()
        .collect();
    let idx = |x: usize| free.iter().position(|&y| y == x);
    let k = free.len();
    let mut m = vec![vec![C::new(0.0, 0.0); k + 1]; k];
    for &(p, q) in &ends {
        let (p, q) = (rep[p], rep[q]);
        for (x, y) in [(p, q), (q, p)] {
            if let Some(i) = idx(x) {
                m[i][i] += 1.0;
                match idx(y) {
                    Some(j) => m[i][j] -= 1.0,
                    None => m[i][k] += fixed[&y],
                }
            }
        }
    }
    for col in 0..k {
        let piv = (col..k)
            .max_by(|&x, &y| m[x][col].norm().total_cmp(&m[y][col].norm()))
            .expect("rows");
        assert!(m[piv][col].norm() > 1e-12, "a node floats");
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
    let v = |x: usize| match idx(x) {
        Some(i) => m[i][k] / m[i][i],
        None => fixed[&x],
    };
    ends.iter().map(|&(p, q)| v(rep[p]) - v(rep[q])).collect()
}

/// Forward and backward waves of mechanical order `nu` (pole pairs) made by coil currents
/// `i` (phasors, per coil): the conductor distribution's Fourier coefficients.
fn waves(w: &Winding, i: &[C], nu: f64) -> (f64, f64) {
    let z = w.geometry.slots as f64;
    let (mut fwd, mut bwd) = (C::new(0.0, 0.0), C::new(0.0, 0.0));
    for (c, ic) in w.coils.iter().zip(i) {
        let t = |s: usize| 2.0 * PI * s as f64 / z;
        let n = f64::from(c.turns);
        fwd += ic * n * (C::from_polar(1.0, nu * t(c.go)) - C::from_polar(1.0, nu * t(c.back)));
        bwd += ic * n * (C::from_polar(1.0, -nu * t(c.go)) - C::from_polar(1.0, -nu * t(c.back)));
    }
    (fwd.norm(), bwd.norm())
}

/// The winding of layout `src` and the first page of its connection sheet.
fn sheet(src: &str, name: &str) -> (Winding, String) {
    let spec = layout::parse(src, name).unwrap_or_else(|e| panic!("{name}: {e}"));
    let w = winding::build(&spec).unwrap_or_else(|e| panic!("{name}: {e}"));
    let mut pages = draw::draw(
        &beltwright::study::Study::new(&w, None),
        Sheet::Connections,
        &Page::default(),
    );
    assert!(!pages.is_empty(), "{name}: no connection sheet");
    (w, pages.swap_remove(0))
}

fn check(src: &str, name: &str) {
    let (w, svg) = sheet(src, name);
    let (halves, boards) = read(&svg);
    assert_eq!(halves.len(), 6, "{name}: two halves per phase");
    assert_eq!(boards.len(), 2, "{name}: a board per speed");
    // Every group is in exactly one half.
    let groups = coil_groups(&w);
    let mut seen: Vec<usize> = halves.iter().flat_map(|h| h.groups.clone()).collect();
    seen.sort_unstable();
    assert_eq!(seen, (1..=groups.len()).collect::<Vec<_>>(), "{name}");
    let taps: Vec<&str> = boards
        .iter()
        .find(|b| b.poles == w.geometry.poles)
        .expect("a board at the layout's poles")
        .lines
        .iter()
        .map(|(_, l)| l.as_str())
        .collect();
    // The schedule the winder follows ends each half where the drawing says: the last coil
    // of a half's last group goes to the half's end lead (or the star point), every other
    // group of the half to the next one.
    let rows = winding::schedule::schedule(&w, &groups);
    for h in &halves {
        let end = if taps.iter().any(|t| *t == h.from) {
            &h.to
        } else {
            &h.from
        };
        for (k, g) in h.groups.iter().enumerate() {
            let last = rows
                .iter()
                .rfind(|r| r.group.get() == *g)
                .unwrap_or_else(|| panic!("{name}: group {g} not in the schedule"));
            match (&last.finish_to, h.groups.get(k + 1)) {
                (FinishTo::Group { group, .. }, Some(next)) => {
                    assert_eq!(group.get(), *next, "{name}: G{g} joins the wrong group")
                }
                (FinishTo::SixLead { lead }, None) => assert_eq!(lead, end, "{name}: G{g}"),
                (FinishTo::StarPoint, None) => assert_eq!(end, "star point", "{name}: G{g}"),
                (other, next) => panic!("{name}: G{g} finishes to {other:?}, next {next:?}"),
            }
        }
    }
    let mut turning = Vec::new();
    for b in &boards {
        // Every lead is on a line, linked or open, and only one of these.
        let mut leads: Vec<&String> = b
            .lines
            .iter()
            .map(|(_, l)| l)
            .chain(&b.linked)
            .chain(&b.open)
            .collect();
        leads.sort();
        let n = leads.len();
        leads.dedup();
        assert_eq!((n, leads.len()), (6, 6), "{name} at {} poles", b.poles);
        let i = currents(&halves, b);
        let mut coil_i = vec![C::new(0.0, 0.0); w.coils.len()];
        for (h, ih) in halves.iter().zip(&i) {
            assert!(ih.norm() > 1e-6, "{name}: a half idle at {} poles", b.poles);
            // Current away from the tap runs through the coils as listed.
            let away = if taps.contains(&h.from.as_str()) {
                *ih
            } else {
                assert!(taps.contains(&h.to.as_str()), "{name}: a half not on a tap");
                -ih
            };
            for &g in &h.groups {
                for &c in &groups[g - 1].coils {
                    coil_i[c] = away;
                }
            }
        }
        // A balanced supply on equal halves: every half carries the same current, and the
        // two halves of one phase carry it alike through their coils (in series at the
        // lower speed, against each other's coil order across the tap; in parallel from
        // the tap at the higher speed, both in coil order).
        let first = i[0].norm();
        for (h, ih) in halves.iter().zip(&i) {
            assert!(
                (ih.norm() / first - 1.0).abs() < 1e-9,
                "{name} at {} poles: half {h:?} carries {} against {first}",
                b.poles,
                ih.norm()
            );
        }
        for p in ["U", "V", "W"] {
            let mine: Vec<C> = halves
                .iter()
                .zip(&i)
                .filter(|(h, _)| h.phase == p)
                .map(|(h, ih)| {
                    if taps.contains(&h.from.as_str()) {
                        *ih
                    } else {
                        -ih
                    }
                })
                .collect();
            assert_eq!(mine.len(), 2, "{name}: phase {p} has two halves");
            let series = b.poles == 2 * w.geometry.poles;
            // Away from the tap: opposite in series (one comes in, one goes out), equal in
            // the double star.
            let want = if series { -mine[0] } else { mine[0] };
            assert!(
                (mine[1] - want).norm() < 1e-9 * first,
                "{name} at {} poles: phase {p}'s halves carry {} and {}",
                b.poles,
                mine[0],
                mine[1]
            );
        }
        let nu = b.poles as f64 / 2.0;
        let (f, bk) = waves(&w, &coil_i, nu);
        let (big, small) = (f.max(bk), f.min(bk));
        assert!(
            big > 1e-3 && small < 1e-9 * big,
            "{name} at {} poles: forward {f}, backward {bk}",
            b.poles
        );
        turning.push(f > bk);
    }
    assert_eq!(
        turning[0], turning[1],
        "{name}: the speeds turn opposite ways"
    );
    // The report says which way each board turns the field: the sheet's own field agrees.
    let report = beltwright::speeds::speeds(&w).unwrap_or_else(|e| panic!("{name}: {e}"));
    for (k, c) in report.connections.iter().enumerate() {
        assert_eq!(c.poles, boards[k].poles, "{name}");
        assert_eq!(
            c.towards_rising_slots, turning[k],
            "{name} at {} poles: the report's direction is not the field's",
            c.poles
        );
    }
}

fn fan(slots: usize, poles: usize, pitch: usize, connection: &str, marking: &str) -> String {
    format!(
        r#"title = "Invented two-speed test motor"
[machine]
topology = "rotary"
slots = {slots}
poles = {poles}
[winding]
layers = 2
pitch = {pitch}
turns_per_coil = 12
pole_change = "{connection}"
marking = "{marking}"
[supply]
frequency_hz = 50.0
line_voltage_v = 400.0
"#
    )
}

#[test]
fn each_speed_board_makes_one_rotating_wave_and_both_turn_alike() {
    for (slots, poles, pitch) in [(36, 2, 9), (36, 4, 5), (48, 4, 6), (24, 2, 6), (72, 4, 9)] {
        for connection in ["delta-double-star", "star-double-star"] {
            for marking in ["iec", "nema"] {
                let name = format!("{slots}/{poles} span {pitch} {connection} {marking}");
                check(&fan(slots, poles, pitch, connection, marking), &name);
            }
        }
    }
    let example = std::fs::read_to_string("layouts/fan-two-speed.toml").expect("example");
    check(&example, "fan-two-speed.toml");
}

#[test]
fn the_boards_are_the_standards_tables() {
    // One-winding two-speed motors: lower speed L1 1U, L2 1V, L3 1W (NEMA T1, T2, T3), taps
    // open; higher speed L1 2W, L2 2U, L3 2V (T6, T4, T5) with 1U, 1V, 1W (T1, T2, T3)
    // joined (NEMA MG 1 and IEC 60034-8 usage, from memory; a reviewer found the same tables
    // in EASA's Electrical Engineering Handbook, two-speed single-winding motors).
    // With these tables `each_speed_board_makes_one_rotating_wave_and_both_turn_alike`
    // shows both speeds turn the same way, so a starter wired to them needs no exchange.
    for (marking, low, high, ends, taps) in [
        (
            "iec",
            "L1:1U L2:1V L3:1W",
            "L1:2W L2:2U L3:2V",
            "1U 1V 1W",
            ["2U", "2W", "2V"],
        ),
        (
            "nema",
            "L1:T1 L2:T2 L3:T3",
            "L1:T6 L2:T4 L3:T5",
            "T1 T2 T3",
            ["T4", "T6", "T5"],
        ),
    ] {
        for connection in ["delta-double-star", "star-double-star"] {
            let name = format!("{connection} {marking}");
            let (_, svg) = sheet(&fan(36, 2, 11, connection, marking), &name);
            let (_, boards) = read(&svg);
            let lines = |b: &Board| {
                b.lines
                    .iter()
                    .map(|(l, lead)| format!("{l}:{lead}"))
                    .collect::<Vec<_>>()
                    .join(" ")
            };
            assert_eq!(lines(&boards[0]), low, "{name}");
            assert_eq!(boards[0].linked, Vec::<String>::new(), "{name}");
            let mut open = boards[0].open.clone();
            open.sort();
            let mut want: Vec<String> = taps.iter().map(|t| t.to_string()).collect();
            want.sort();
            assert_eq!(open, want, "{name}");
            assert_eq!(lines(&boards[1]), high, "{name}");
            assert_eq!(boards[1].linked.join(" "), ends, "{name}");
        }
    }
}
