//! All oscillation modes of degrees 0-3 up to order 25 (radial 1-25, g_25 to p_25): of the
//! n = 3 polytrope with Gamma_1 = 5/3 on the default 500-point model (177 modes, one degree after
//! the other, each degree's frequency bands in parallel), and of the 1 M_sun ZAMS model (refined
//! laws, X = 0.70, Z = 0.02) on the default 2000 profile rows of `modes --mass` (177 modes,
//! degrees and bands in parallel). The models are built outside the timing.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::oscillation::{
    find_modes, find_modes_of_degrees, tabulated_from_profile, OscillationSettings, PolytropicModel,
};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};
use starpoise::structure::{solve, ZamsSettings};

fn modes(c: &mut Criterion) {
    let settings = LaneEmdenSettings::default().with_points(500).unwrap();
    let solution = solve_lane_emden(3.0, &settings).unwrap();
    let model = PolytropicModel::new(&solution, 5.0 / 3.0).unwrap();
    let oscillation = OscillationSettings::default();
    let zams = solve(
        &ZamsSettings::new(
            1.0,
            Composition::new(0.70, 0.02).unwrap(),
            PhysicsSet::refined(),
        )
        .unwrap(),
    )
    .unwrap();
    let sun = tabulated_from_profile(&zams.profile(2000).unwrap()).unwrap();
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
    group.bench_function("zams_1msun_l0-3_order25", |b| {
        b.iter(|| {
            find_modes_of_degrees(black_box(&sun), &[0, 1, 2, 3], 25, &oscillation)
                .unwrap()
                .len()
        })
    });
    group.finish();
}

criterion_group!(benches, modes);
criterion_main!(benches);
