//! Whole ZAMS models from the built-in starting guess: the cost a user waits for per model.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::physics::{Composition, PhysicsOptions};
use starpoise::structure::{solve, ZamsSettings};

fn settings(mass: f64, preset: &str) -> ZamsSettings {
    let physics = PhysicsOptions {
        physics: Some(preset.to_string()),
        ..Default::default()
    }
    .build()
    .expect("preset exists");
    ZamsSettings::new(
        mass,
        Composition::new(0.70, 0.02).expect("valid composition"),
        physics,
    )
    .expect("valid mass")
}

fn zams_models(c: &mut Criterion) {
    let mut group = c.benchmark_group("zams");
    group.sample_size(20);
    let cases = [
        ("analytic_10msun", 10.0, "analytic", false),
        ("refined_1msun", 1.0, "refined", false),
        ("refined_1msun_with_400_row_profile", 1.0, "refined", true),
    ];
    for (name, mass, preset, profile) in cases {
        let s = settings(mass, preset).with_profile(profile);
        group.bench_function(name, |b| {
            b.iter(|| solve(black_box(&s)).expect("converges"))
        });
    }
    group.finish();
}

criterion_group!(benches, zams_models);
criterion_main!(benches);
