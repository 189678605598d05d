//! One evaluation of each full physics set at representative points of a solar-like ZAMS star:
//! EOS inverted at (P, T), opacity, energy generation and the convective gradient, as the
//! structure equations call them.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use starpoise::physics::convection::nabla_rad;
use starpoise::physics::{Composition, ConvectionPoint, PhysicsSet};

/// (name, P dyn/cm^2, T K, m g, r cm, L erg/s): centre, mid radiative zone, base of the
/// convective envelope, hydrogen ionisation zone, near the photosphere.
const POINTS: [(&str, f64, f64, f64, f64, f64); 5] = [
    ("core", 1.5e17, 1.35e7, 1e32, 7e9, 1e32),
    ("radiative", 5e15, 5e6, 1.2e33, 2.5e10, 2.6e33),
    ("envelope-base", 5e13, 2e6, 1.95e33, 4.5e10, 2.7e33),
    ("ionisation-zone", 1e8, 1.5e4, 1.99e33, 6.1e10, 2.7e33),
    ("photosphere", 1e5, 6e3, 1.99e33, 6.15e10, 2.7e33),
];

fn one_point(set: &PhysicsSet, comp: &Composition, p: f64, t: f64, m: f64, r: f64, l: f64) -> f64 {
    let s = set.eos().state_at_pressure(p, t, comp).unwrap();
    let rho = s.density_g_cm3;
    let kappa = set.opacity().kappa(rho, t, comp).unwrap();
    let eps = set.rates().rate(rho, t, comp).unwrap().total_erg_g_s();
    let point = ConvectionPoint {
        nabla_rad: nabla_rad(kappa, l, p, m, t),
        nabla_ad: s.nabla_ad,
        pressure_dyn_cm2: p,
        temperature_k: t,
        density_g_cm3: rho,
        gravity_cm_s2: starpoise::constants::G_CGS * m / (r * r),
        opacity_cm2_g: kappa,
        cp_erg_g_k: s.cp_erg_g_k,
        delta: s.delta,
    };
    set.convection().nabla(&point).unwrap() + eps
}

fn bench(c: &mut Criterion) {
    let comp = Composition::new(0.70, 0.02).unwrap();
    for (label, set) in [
        ("analytic", PhysicsSet::analytic()),
        ("refined", PhysicsSet::refined()),
    ] {
        for (name, p, t, m, r, l) in POINTS {
            c.bench_function(&format!("{label}/{name}"), |b| {
                b.iter(|| one_point(&set, &comp, black_box(p), black_box(t), m, r, l))
            });
        }
    }
}

criterion_group!(benches, bench);
criterion_main!(benches);
