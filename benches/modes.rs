//! All oscillation modes of degrees 0-3 up to order 25 (radial 1-25, g_25 to p_25) of the
//! n = 3 polytrope with Gamma_1 = 5/3, on the default 500-point model: 177 modes.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::oscillation::{find_modes, OscillationSettings, PolytropicModel};
use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};

fn modes(c: &mut Criterion) {
    let settings = LaneEmdenSettings::default().with_points(500).unwrap();
    let solution = solve_lane_emden(3.0, &settings).unwrap();
    let model = PolytropicModel::new(&solution, 5.0 / 3.0).unwrap();
    let oscillation = OscillationSettings::default();
    let mut group = c.benchmark_group("modes");
    group.sample_size(10);
    group.bench_function("n3_polytrope_l0-3_order25", |b| {
        b.iter(|| {
            (0..=3)
                .map(|l| {
                    find_modes(black_box(&model), l, 25, &oscillation)
                        .unwrap()
                        .len()
                })
                .sum::<usize>()
        })
    });
    group.finish();
}

criterion_group!(benches, modes);
criterion_main!(benches);
