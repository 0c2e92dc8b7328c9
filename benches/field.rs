//! Travelling-field benchmarks: the full spectrum to electrical order 1000 and σ_d of a
//! 360-slot, 12-pole double-layer stator (q = 10, span 25 of 30; an invented test core).

use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;

use beltwright::field::{self, FieldOptions};
use beltwright::layout;
use beltwright::winding::{self, Winding};

fn big_stator() -> Winding {
    let src = "[machine]\ntopology = \"rotary\"\nslots = 360\npoles = 12\n\
               [winding]\nlayers = 2\npitch = 25\nturns_per_coil = 3\n";
    let spec = layout::parse(src, "bench").expect("bench layout parses");
    winding::build(&spec).expect("bench winding builds")
}

fn bench(c: &mut Criterion) {
    let w = big_stator();
    let mut opts = FieldOptions::balanced(&w);
    opts.upto = 1000.0;
    c.bench_function("field spectrum to order 1000, 360 slots", |b| {
        b.iter(|| field::field(black_box(&w), black_box(&opts)).map(|r| r.rows.len()))
    });
    c.bench_function("differential leakage, 360 slots", |b| {
        b.iter(|| field::differential_leakage(black_box(&w)))
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
