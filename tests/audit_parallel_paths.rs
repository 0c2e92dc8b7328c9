//! Parallel paths: each path's EMF phasor and the circulating EMF between the paths of one
//! phase; a coil put in the wrong path is named.

use beltwright::audit::{FindingKind, audit};
use beltwright::design::{Design, Topology};
use beltwright::layout::Spec;
use beltwright::output::Words;
use beltwright::winding::{self, Winding};

/// 36 slots, 4 poles, span 8, two paths: each path holds one pole pair's groups.
fn two_paths() -> Winding {
    let s = Spec::of(Design {
        pitch: Some(8),
        turns_per_coil: 20,
        parallel_paths: 2,
        ..Design::basic(Topology::Rotary, 36, 4, 2)
    });
    winding::build(&s).unwrap_or_else(|e| panic!("design refused: {e}"))
}

#[test]
fn matched_paths_carry_no_circulating_emf() {
    let w = two_paths();
    let r = audit(&w, None);
    assert!(r.sound, "{:#?}", r.findings);
    assert_eq!(r.paths.len(), 6);
    assert!(
        r.paths
            .iter()
            .all(|p| p.circulating_emf < 1e-9 && p.turns == 120)
    );
}

// A coil moved from path 1 to path 2 shifts its EMF from one path to the other: each path then
// differs from the mean by exactly that coil's EMF, N·k_p = 20·sin(8/9·90°) (pitch factor,
// M. G. Say, *Alternating Current Machines*, 1983, §4.4).
#[test]
fn a_coil_in_the_wrong_path_is_named_with_its_circulating_emf() {
    let w = two_paths();
    for i in [0, 5, 17, 30] {
        let mut f = w.clone();
        let home = f.coils[i].path;
        f.coils[i].path = 1 - home;
        let r = audit(&f, None);
        assert!(
            r.balanced,
            "moving a coil between paths keeps the phase EMF"
        );
        assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
        let finding = &r.findings[0];
        assert_eq!(finding.kind, FindingKind::PathMismatch);
        assert_eq!(finding.coils, vec![i + 1]);
        assert!(
            finding
                .message()
                .contains(&format!("belongs in path {}", home + 1))
        );
        let phase = w.label(w.coils[i].phase);
        let kp = (8.0 / 9.0 * std::f64::consts::FRAC_PI_2).sin();
        for p in r.paths.iter().filter(|p| p.phase == phase) {
            assert!(
                (p.circulating_emf - 20.0 * kp).abs() < 1e-9,
                "{}",
                p.circulating_emf
            );
        }
    }
}

#[test]
fn a_reversed_coil_in_a_two_path_winding_is_reported_once() {
    let w = two_paths();
    let mut f = w.clone();
    let c = &mut f.coils[3];
    std::mem::swap(&mut c.go, &mut c.back);
    let r = audit(&f, None);
    assert_eq!(r.findings.len(), 1, "{:#?}", r.findings);
    assert_eq!(r.findings[0].kind, FindingKind::ReversedCoil);
    // The path table still shows the as-found mismatch.
    assert!(r.paths.iter().any(|p| p.circulating_emf > 1.0));
}
