//! A 40-mass refined ZAMS sequence from 0.1 to 100 M_sun, solved in parallel on every core (the
//! figure a user building a grid waits for).

use criterion::{criterion_group, criterion_main, Criterion};
use starpoise::grid::run::{solve_points, RunSettings};
use starpoise::grid::{parse_value_list, Grid, Variant};
use starpoise::physics::PhysicsOverrides;

fn sequence_40(c: &mut Criterion) {
    let masses = parse_value_list("--masses", "0.1:100:40").expect("valid range");
    let grid = Grid::product(
        &PhysicsOverrides::default(),
        vec![Variant::base()],
        &masses,
        &[0.70],
        &[0.02],
        0.4,
    )
    .expect("valid grid");
    let points = grid.select(None);
    let mut group = c.benchmark_group("sequence");
    group.sample_size(10);
    group.bench_function("refined_40_masses_0.1_to_100", |b| {
        b.iter(|| {
            let results =
                solve_points(&grid, &points, &RunSettings::default(), &|| {}).expect("runs");
            assert!(results.iter().all(|r| r.outcome.is_ok()));
            results
        })
    });
    group.finish();
}

criterion_group!(benches, sequence_40);
criterion_main!(benches);
