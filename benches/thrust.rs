//! A flat primary's performance at 200 speeds: the equivalent circuit and the field of the
//! finite primary by the layer method, side by side (issue 23's target: the field model
//! of a 60-slot primary at 200 speeds under 100 ms whole process on one core).

use beltwright::layers::Sheet;
use beltwright::layout;
use beltwright::thrust::{Feed, ThrustQuery, point_at, thrust};
use beltwright::winding;
use criterion::{Criterion, criterion_group, criterion_main};
use std::hint::black_box;

/// A 60-slot, 9-pole flat primary over a 4 mm aluminium plate (invented for the benchmark).
const PRIMARY: &str = "[machine]\ntopology = \"linear\"\nslots = 60\npoles = 9\n\
    [winding]\nlayers = 2\npitch = 6\nturns_per_coil = 40\n\
    [core]\nslot_pitch_mm = 12.0\nstack_mm = 80.0\nslot_width_mm = 6.0\nslot_depth_mm = 10.0\n\
    slot_opening_mm = 3.0\nairgap_mm = 3.0\n\
    [wire]\nawg = 21\n\
    [secondary]\nmaterial = \"aluminium\"\nthickness_mm = 4.0\nwidth_mm = 120.0\n\
    [supply]\nfrequency_hz = 50.0\nline_voltage_v = 400.0\n";

fn benches(c: &mut Criterion) {
    let spec = match layout::parse(PRIMARY, "bench.toml") {
        Ok(s) => s,
        Err(e) => panic!("benchmark layout refused: {e}"),
    };
    let w = match winding::build(&spec) {
        Ok(w) => w,
        Err(e) => panic!("benchmark layout not planned: {e}"),
    };
    let slips: Vec<f64> = (0..200).map(|i| i as f64 / 199.0).collect();
    let feed = Feed::Voltage {
        phase_voltage_v: 400.0 / 3f64.sqrt(),
    };
    c.bench_function("field model, 60 slots, 200 speeds", |b| {
        b.iter(|| {
            let sheet = Sheet::new(black_box(&w), feed, &slips).ok();
            sheet.map(|s| {
                slips
                    .iter()
                    .filter_map(|x| s.point(*x).ok())
                    .map(|r| r.thrust_n)
                    .sum::<f64>()
            })
        })
    });
    c.bench_function(
        "circuit, 60 slots, 200 speeds (model rebuilt per point)",
        |b| {
            b.iter(|| {
                slips
                    .iter()
                    .filter_map(|x| point_at(black_box(&w), *x).ok())
                    .map(|r| r.thrust_n)
                    .sum::<f64>()
            })
        },
    );
    let q = ThrustQuery {
        current_a: None,
        slip_from: 0.0,
        slip_to: 1.0,
        steps: 199,
        end_effect: true,
    };
    c.bench_function("thrust report (circuit and field model), 200 speeds", |b| {
        b.iter(|| thrust(black_box(&w), &q).map(|r| r.max_thrust_n).ok())
    });
}

criterion_group!(all, benches);
criterion_main!(all);
