//! Audit of a 360-slot record, sound and with two faults (which needs the two-edit search).

use beltwright::audit::{audit, search};
use beltwright::design::{Design, Topology};
use beltwright::layout::Spec;
use beltwright::winding::{self, Winding};
use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;

/// 360 slots, 12 poles, q = 10, double layer, span 25 of 30: a large traction-motor stator.
fn record() -> Winding {
    let s = Spec::of(Design {
        pitch: Some(25),
        turns_per_coil: 4,
        ..Design::basic(Topology::Rotary, 360, 12, 2)
    });
    match winding::build(&s) {
        Ok(w) => w,
        Err(e) => panic!("benchmark winding refused: {e}"),
    }
}

fn benches(c: &mut Criterion) {
    let sound = record();
    let mut faulty = sound.clone();
    let k = &mut faulty.coils[101];
    std::mem::swap(&mut k.go, &mut k.back);
    faulty.coils[250].phase = (faulty.coils[250].phase + 1) % 3;
    let r = audit(&faulty, None);
    assert_eq!(
        r.fix_edits, 2,
        "the faulty record needs the two-edit search"
    );

    c.bench_function("audit 360-slot record, sound", |b| {
        b.iter(|| audit(black_box(&sound), None))
    });
    c.bench_function("audit 360-slot record, two faults", |b| {
        b.iter(|| audit(black_box(&faulty), None))
    });
    c.bench_function("two-edit search alone, 360 slots", |b| {
        b.iter(|| search(black_box(&faulty)))
    });
}

criterion_group!(audit_benches, benches);
criterion_main!(audit_benches);
