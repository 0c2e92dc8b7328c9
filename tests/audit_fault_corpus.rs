//! Generated fault corpus: many synthesized windings (integer and fractional slot, rotary and
//! linear, single and double layer), each with one fault put in programmatically. The audit
//! must name the fault and its coils, and the sound windings must audit clean.
//!
//! The sound windings come from `winding::build` (star of slots with 60° belts, Pyrhönen,
//! Jokinen, Hrabovcová, *Design of Rotating Electrical Machines*, 2014, §2.4) and are checked
//! balanced before use. The faults are the classic rewind errors (common practice): a coil or
//! a coil group connected backwards, a coil in the wrong phase, two leads exchanged, a phase
//! connected backwards.

use beltwright::audit::{AuditReport, FindingKind, Sequence, audit};
use beltwright::design::{Design, Style, Topology};
use beltwright::layout::Spec;
use beltwright::winding::{self, Winding, coil_groups};

fn spec(topology: Topology, slots: usize, poles: usize, layers: usize, pitch: usize) -> Spec {
    Spec::of(Design {
        pitch: Some(pitch),
        turns_per_coil: 12,
        ..Design::basic(topology, slots, poles, layers)
    })
}

/// The corpus: (name, spec).
fn corpus() -> Vec<(String, Spec)> {
    use Topology::{Linear, Rotary};
    let mut out = Vec::new();
    let mut add = |s: Spec| {
        let name = format!(
            "{:?} Z={} 2p={} layers={} y={:?} {:?} a={}",
            s.design.topology,
            s.design.slots,
            s.design.poles,
            s.design.layers,
            s.design.pitch,
            s.design.style,
            s.design.parallel_paths
        );
        out.push((name, s));
    };
    add(spec(Rotary, 36, 4, 2, 9)); // q = 3, full pitch
    add(spec(Rotary, 36, 4, 2, 7)); // q = 3, 7/9 pitch
    add(spec(Rotary, 24, 4, 1, 6)); // single layer, q = 2
    let mut c = spec(Rotary, 24, 4, 1, 6);
    c.design.style = Style::Concentric;
    c.design.pitch = None;
    add(c);
    add(spec(Rotary, 12, 10, 2, 1)); // tooth coils, q = 2/5
    add(spec(Rotary, 9, 8, 2, 1)); // tooth coils, q = 3/8
    add(spec(Rotary, 27, 6, 2, 4)); // q = 3/2
    add(spec(Rotary, 30, 4, 2, 7)); // q = 5/2
    add(spec(Rotary, 12, 4, 2, 3)); // q = 1
    add(spec(Rotary, 48, 8, 2, 5)); // q = 2, short pitch
    add(spec(Rotary, 72, 8, 2, 7)); // q = 3, periodicity 4
    add(spec(Rotary, 24, 2, 2, 10)); // two-pole, q = 4
    add(spec(Rotary, 15, 4, 2, 3)); // q = 5/4
    add(spec(Rotary, 18, 16, 2, 1)); // tooth coils, q = 3/8, periodicity 2
    add(spec(Rotary, 36, 4, 1, 9)); // single layer, q = 3
    let mut p = spec(Rotary, 36, 4, 2, 8);
    p.design.parallel_paths = 2;
    add(p); // two parallel paths
    add(spec(Linear, 29, 4, 2, 5)); // flat primary, 24 coils, span 5
    add(spec(Linear, 24, 4, 1, 6)); // flat primary, single layer
    add(spec(Linear, 23, 3, 2, 5)); // flat primary, odd pole count
    out
}

fn sound(name: &str, s: &Spec) -> Winding {
    let w = winding::build(s).unwrap_or_else(|e| panic!("{name}: corpus winding refused: {e}"));
    assert!(w.is_balanced(), "{name}: corpus winding is not balanced");
    w
}

fn flip(w: &mut Winding, i: usize) {
    let c = &mut w.coils[i];
    std::mem::swap(&mut c.go, &mut c.back);
    std::mem::swap(&mut c.go_layer, &mut c.back_layer);
}

/// The audit's findings, asserting there is exactly one.
fn only_finding(name: &str, what: &str, r: &AuditReport) -> (FindingKind, Vec<usize>, Vec<String>) {
    assert_eq!(
        r.findings.len(),
        1,
        "{name}, {what}: expected one finding, got {:#?}",
        r.findings
    );
    let f = &r.findings[0];
    (
        f.kind,
        f.coils.iter().map(|c| c.get()).collect(),
        f.phases.clone(),
    )
}

#[test]
fn sound_windings_audit_clean() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        let r = audit(&w, None);
        assert!(r.findings.is_empty(), "{name}: {:#?}", r.findings);
        assert!(r.balanced && r.sound, "{name}");
        assert_eq!(r.sequence, Sequence::Positive, "{name}");
        assert!(r.backward_percent < 1e-6, "{name}");
        assert!(r.max_angle_error_deg < 1e-6, "{name}");
    }
}

#[test]
fn audit_names_every_reversed_coil() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for i in 0..w.coils.len() {
            let mut f = w.clone();
            flip(&mut f, i);
            let r = audit(&f, None);
            let what = format!("coil {} reversed", i + 1);
            let (kind, coils, _) = only_finding(&name, &what, &r);
            assert_eq!(kind, FindingKind::ReversedCoil, "{name}, {what}");
            assert_eq!(coils, vec![i + 1], "{name}, {what}");
            assert!(!r.balanced, "{name}, {what}");
        }
    }
}

#[test]
fn audit_names_every_reversed_group() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for g in coil_groups(&w) {
            let mut f = w.clone();
            for &i in &g.coils {
                flip(&mut f, i);
            }
            let mut want: Vec<usize> = g.coils.iter().map(|c| c + 1).collect();
            want.sort_unstable();
            let what = format!("group {want:?} reversed");
            let (kind, coils, _) = only_finding(&name, &what, &audit(&f, None));
            let expected = if want.len() == 1 {
                FindingKind::ReversedCoil
            } else {
                FindingKind::ReversedGroup
            };
            assert_eq!(kind, expected, "{name}, {what}");
            assert_eq!(coils, want, "{name}, {what}");
        }
    }
}

#[test]
fn audit_names_every_coil_in_the_wrong_phase() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for i in 0..w.coils.len() {
            let home = w.coils[i].phase;
            for to in (0..3).filter(|&t| t != home) {
                let mut f = w.clone();
                f.coils[i].phase = to;
                let what = format!("coil {} moved to {}", i + 1, w.label(to));
                let (kind, coils, phases) = only_finding(&name, &what, &audit(&f, None));
                assert_eq!(kind, FindingKind::WrongPhase, "{name}, {what}");
                assert_eq!(coils, vec![i + 1], "{name}, {what}");
                assert_eq!(
                    phases,
                    vec![w.label(to).to_string(), w.label(home).to_string()],
                    "{name}, {what}"
                );
            }
        }
    }
}

#[test]
fn audit_names_two_swapped_leads() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for (a, b) in [(0, 1), (1, 2), (0, 2)] {
            let mut f = w.clone();
            for c in &mut f.coils {
                if c.phase == a {
                    c.phase = b;
                } else if c.phase == b {
                    c.phase = a;
                }
            }
            let r = audit(&f, None);
            assert_eq!(r.sequence, Sequence::Negative, "{name}");
            let what = format!("leads {a} and {b} swapped");
            let (kind, coils, phases) = only_finding(&name, &what, &r);
            assert_eq!(kind, FindingKind::LeadsSwapped, "{name}, {what}");
            assert_eq!(
                phases,
                vec![w.label(a).to_string(), w.label(b).to_string()],
                "{name}, {what}"
            );
            let want: Vec<usize> = (0..w.coils.len())
                .filter(|&i| w.coils[i].phase == a || w.coils[i].phase == b)
                .map(|i| i + 1)
                .collect();
            assert_eq!(coils, want, "{name}, {what}");
        }
    }
}

#[test]
fn audit_names_a_phase_connected_backwards() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for k in 0..3 {
            let mut f = w.clone();
            for i in 0..f.coils.len() {
                if f.coils[i].phase == k {
                    flip(&mut f, i);
                }
            }
            let what = format!("phase {} reversed", w.label(k));
            let (kind, coils, phases) = only_finding(&name, &what, &audit(&f, None));
            assert_eq!(kind, FindingKind::ReversedPhase, "{name}, {what}");
            assert_eq!(phases, vec![w.label(k).to_string()], "{name}, {what}");
            let want: Vec<usize> = (0..w.coils.len())
                .filter(|&i| w.coils[i].phase == k)
                .map(|i| i + 1)
                .collect();
            assert_eq!(coils, want, "{name}, {what}");
        }
    }
}

/// Two faults at once need the two-edit search.
#[test]
fn audit_names_two_faults_at_once() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        let n = w.coils.len();
        for (i, j) in [(0, n / 2 + 1), (1, n - 1), (n / 3, 2 * n / 3)] {
            if i == j {
                continue;
            }
            let mut f = w.clone();
            flip(&mut f, i);
            let to = (w.coils[j].phase + 1) % 3;
            f.coils[j].phase = to;
            let r = audit(&f, None);
            let what = format!("coil {} reversed and coil {} moved", i + 1, j + 1);
            assert_eq!(r.findings.len(), 2, "{name}, {what}: {:#?}", r.findings);
            assert_eq!(r.fix_edits, 2, "{name}, {what}");
            let mut got: Vec<(FindingKind, Vec<usize>)> = r
                .findings
                .iter()
                .map(|f| (f.kind, f.coils.iter().map(|c| c.get()).collect()))
                .collect();
            got.sort_by_key(|g| g.1.clone());
            let mut want = vec![
                (FindingKind::ReversedCoil, vec![i + 1]),
                (FindingKind::WrongPhase, vec![j + 1]),
            ];
            want.sort_by_key(|g| g.1.clone());
            assert_eq!(got, want, "{name}, {what}");
        }
    }
}

/// A coil with the wrong turn count cannot be balanced by reconnecting: the audit names the
/// coil, and as that coil alone unbalances the phases, that is its one finding.
#[test]
fn audit_names_a_coil_with_other_turns() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        let mut f = w.clone();
        f.coils[2].turns += 1;
        let r = audit(&f, None);
        let mut kinds: Vec<FindingKind> = r.findings.iter().map(|f| f.kind).collect();
        if s.design.parallel_paths > 1 {
            // The path holding the odd coil no longer matches its sibling either.
            assert!(kinds.contains(&FindingKind::PathMismatch), "{name}");
            kinds.retain(|k| *k != FindingKind::PathMismatch);
        }
        assert_eq!(kinds, vec![FindingKind::TurnsDiffer], "{name}");
        assert_eq!(r.findings[0].coils, vec![3], "{name}");
        assert!(
            matches!(
                r.findings[0].detail,
                beltwright::audit::Fact::TurnsDiffer {
                    explains_unbalance: true,
                    ..
                }
            ),
            "{name}"
        );
        assert!(!r.balanced && !r.sound, "{name}");
    }
}

/// A reversed coil together with two leads exchanged: an additive edit and a phase-level one.
#[test]
fn audit_names_a_reversed_coil_behind_swapped_leads() {
    for (name, s) in corpus() {
        let w = sound(&name, &s);
        for i in [0, w.coils.len() / 2] {
            let mut f = w.clone();
            flip(&mut f, i);
            for c in &mut f.coils {
                c.phase = [0, 2, 1][c.phase];
            }
            let r = audit(&f, None);
            let what = format!("coil {} reversed, V and W exchanged", i + 1);
            assert_eq!(r.sequence, Sequence::Negative, "{name}, {what}");
            let got: Vec<(FindingKind, Vec<String>)> = r
                .findings
                .iter()
                .map(|f| (f.kind, f.phases.clone()))
                .collect();
            let coil_phase = f.label(f.coils[i].phase).to_string();
            assert_eq!(
                got,
                vec![
                    (FindingKind::ReversedCoil, vec![coil_phase]),
                    (FindingKind::LeadsSwapped, vec!["V".into(), "W".into()]),
                ],
                "{name}, {what}"
            );
            assert_eq!(r.findings[0].coils, vec![i + 1], "{name}, {what}");
        }
    }
}
