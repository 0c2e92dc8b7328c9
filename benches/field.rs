//! Travelling-field, factor and plan benchmarks on double-layer stators of 360 and 3600
//! slots (q = 10, span 25 of 30, 12 and 120 poles; invented test cores): each job should
//! grow about linearly with the slot count.

use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;

use beltwright::field::{self, FieldOptions};
use beltwright::linear::Operating;
use beltwright::winding::{self, Winding};
use beltwright::{factors, layout, plan};

fn stator(slots: usize, poles: usize) -> Winding {
    let src = format!(
        "[machine]\ntopology = \"rotary\"\nslots = {slots}\npoles = {poles}\n\
         [winding]\nlayers = 2\npitch = 25\nturns_per_coil = 3\n"
    );
    let spec = layout::parse(&src, "bench").expect("bench layout parses");
    winding::build(&spec).expect("bench winding builds")
}

fn bench(c: &mut Criterion) {
    for (slots, poles) in [(360, 12), (3600, 120)] {
        let w = stator(slots, poles);
        let mut opts = FieldOptions::balanced(&w);
        opts.upto = 1000.0;
        c.bench_function(
            &format!("field spectrum to order 1000, {slots} slots"),
            |b| b.iter(|| field::field(black_box(&w), black_box(&opts)).map(|r| r.rows.len())),
        );
        c.bench_function(&format!("differential leakage, {slots} slots"), |b| {
            b.iter(|| beltwright::field::differential_leakage(black_box(&w)))
        });
        c.bench_function(&format!("factor table to order 49, {slots} slots"), |b| {
            b.iter(|| factors::factor_table(black_box(&w), 49.0).rows.len())
        });
        c.bench_function(&format!("plan report, {slots} slots"), |b| {
            b.iter(|| plan::plan(black_box(&w), Operating::default()).coils.len())
        });
    }
}

criterion_group!(benches, bench);
criterion_main!(benches);
