//! Sizing a bare core: a 72-slot, 4-pole rotary core from its nameplate, and a flat primary
//! sized against a thrust by its thrust model (issue 22's targets: under 50 ms and 200 ms
//! for the whole process; these measure the library's part).

use beltwright::layout;
use beltwright::sizing::{At, Request, size};
use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;

/// A 72-slot core of 300 mm bore (invented for the benchmark).
const ROTARY: &str = "[machine]\ntopology = \"rotary\"\nslots = 72\npoles = 4\n\
    [winding]\nlayers = 2\n\
    [core]\nbore_mm = 300.0\noutside_diameter_mm = 480.0\nstack_mm = 250.0\n\
    slot_depth_mm = 40.0\ntooth_width_mm = 6.5\n\
    [nameplate]\npower_kw = 110\nvoltage_v = 400\nfrequency_hz = 50\n";

fn benches(c: &mut Criterion) {
    let rotary = match layout::parse(ROTARY, "bench.toml") {
        Ok(s) => s,
        Err(e) => panic!("benchmark layout refused: {e}"),
    };
    let flat_text = match std::fs::read_to_string("layouts/pallet-shuttle.toml") {
        Ok(t) => t,
        Err(e) => panic!("layouts/pallet-shuttle.toml: {e}"),
    };
    let flat = match layout::parse(&flat_text, "pallet-shuttle.toml") {
        Ok(s) => s,
        Err(e) => panic!("benchmark layout refused: {e}"),
    };
    let thrust = Request {
        thrust: Some((100.0, At::Slip(0.2))),
        ..Request::default()
    };
    c.bench_function("size a 72-slot rotary core", |b| {
        b.iter(|| {
            size(
                &rotary.labels,
                black_box(&rotary.design),
                &Request::default(),
            )
        })
    });
    c.bench_function("size a flat primary for a thrust", |b| {
        b.iter(|| size(&flat.labels, black_box(&flat.design), &thrust))
    });
}

criterion_group!(group, benches);
criterion_main!(group);
