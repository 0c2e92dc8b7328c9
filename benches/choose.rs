//! Benchmarks of the span comparison and the combination survey (README, "Performance").
//! Run with `cargo bench --bench choose`.

use std::hint::black_box;

use beltwright::layout::parse;
use beltwright::pitch::{PitchGoal, compare};
use beltwright::survey::{SurveyQuery, survey};
use beltwright::winding::{Topology, build};
use criterion::{Criterion, criterion_group, criterion_main};

fn full_survey(c: &mut Criterion) {
    // Every slot count 6..=360 with every even pole count 2..=96, double layer.
    let q = SurveyQuery {
        slots: 6..=360,
        poles: 2..=96,
        layers: vec![2],
        phases: 3,
        topology: Topology::Rotary,
    };
    let mut g = c.benchmark_group("survey");
    g.sample_size(10);
    g.bench_function("rotary 6..=360 x 2..=96, double layer", |b| {
        b.iter(|| survey(black_box(&q), &|| {}))
    });
    g.finish();
}

fn pitch_360(c: &mut Criterion) {
    let src = "[machine]\ntopology = \"rotary\"\nslots = 360\npoles = 4\n[winding]\nlayers = 2\n";
    let w = build(&parse(src, "bench").expect("layout")).expect("winding");
    let goal = PitchGoal::default();
    c.bench_function("pitch, 360 slots, 4 poles, every span", |b| {
        b.iter(|| compare(black_box(&w), &goal))
    });
}

criterion_group!(benches, full_survey, pitch_360);
criterion_main!(benches);
