//! Whole ZAMS models from the built-in starting guess: the cost a user waits for per model.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::{solve, ZamsSettings};

fn settings(mass: f64, physics: PhysicsSet) -> ZamsSettings {
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
        ("analytic_1msun", 1.0, PhysicsSet::analytic(), None),
        ("analytic_3msun", 3.0, PhysicsSet::analytic(), None),
        ("analytic_10msun", 10.0, PhysicsSet::analytic(), None),
        ("refined_1msun", 1.0, PhysicsSet::refined(), None),
        (
            "refined_1msun_with_400_row_profile",
            1.0,
            PhysicsSet::refined(),
            Some(400),
        ),
    ];
    for (name, mass, physics, profile) in cases {
        let s = settings(mass, physics);
        group.bench_function(name, |b| {
            b.iter(|| {
                let m = solve(black_box(&s)).expect("converges");
                profile.map(|n| m.profile(n).expect("profile"))
            })
        });
    }
    group.finish();
}

criterion_group!(benches, zams_models);
criterion_main!(benches);
