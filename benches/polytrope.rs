//! One n = 3 Lane–Emden solve to the first zero, and the same with the default 200-point
//! profile.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::polytrope::{first_zero, solve_lane_emden, LaneEmdenSettings};

fn lane_emden(c: &mut Criterion) {
    c.bench_function("lane_emden_n3_first_zero", |b| {
        b.iter(|| first_zero(black_box(3.0)))
    });
    let settings = LaneEmdenSettings::default();
    c.bench_function("lane_emden_n3_profile_200", |b| {
        b.iter(|| solve_lane_emden(black_box(3.0), &settings))
    });
}

criterion_group!(benches, lane_emden);
criterion_main!(benches);
