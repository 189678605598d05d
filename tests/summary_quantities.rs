//! The derived numbers of a ZAMS summary against published solar values, scaled by the model's
//! own M, R and L.

use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::{solve, ZamsSettings};

fn summary(mass: f64) -> starpoise::structure::ModelSummary {
    let physics = PhysicsSet::refined();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    solve(&s).unwrap().summary
}

#[test]
fn timescales_gravity_and_eddington_ratio_scale_from_solar_values() {
    for mass in [0.5, 1.0, 8.0] {
        let s = summary(mass);
        let (r, l) = (s.radius_rsun, s.luminosity_lsun);
        // Surface gravity of the nominal Sun: GM_sun / R_sun^2 = 27420 cm/s^2, log g = 4.4381
        // (IAU 2015 B3 nominal values; computed).
        let log_g = 4.438_1 + mass.log10() - 2.0 * r.log10();
        assert!(
            (s.log_g_cgs - log_g).abs() < 1e-3,
            "log g {:?} vs {log_g}",
            s.log_g_cgs
        );
        // Kelvin–Helmholtz time G M^2 / (R L) of the nominal Sun: 3.140e7 yr (about 3e7 yr in
        // textbooks, e.g. Kippenhahn & Weigert 1990 ch. 3, memory; 3.140e7 computed from the
        // IAU 2015 nominal values and CODATA G); dynamical time sqrt(R^3 / (G M)) of the nominal
        // Sun: 1593 s (computed likewise). 1e-3 covers the four-figure rounding.
        let t_kh = 3.140e7 * mass * mass / (r * l);
        assert!((s.kelvin_helmholtz_time_yr / t_kh - 1.0).abs() < 1e-3);
        let t_dyn = 1593.0 * (r.powi(3) / mass).sqrt();
        assert!((s.dynamical_time_s / t_dyn - 1.0).abs() < 1e-3);
        // L_Edd = 4 pi G M c / (0.2 (1+X)) is 3.84e4 L_sun per M_sun for X = 0.7
        // (docs/references.md §7, computed; 3.8414e4 to five figures; the program uses the
        // Thomson value 0.20031 (1+X)).
        let eddington = l / (3.8414e4 * mass * 0.2 / 0.200_31);
        assert!((s.eddington_ratio / eddington - 1.0).abs() < 1e-3);
        // Main-sequence lifetime estimate 0.1 X M q / L with q = 26.731 MeV per 4 m(1H)
        // (docs/references.md §4): 7.372 Gyr for X = 0.7 at L_sun (computed).
        let t_nuc = 7.372e9 * mass / l;
        assert!((s.nuclear_time_yr / t_nuc - 1.0).abs() < 1e-3);
    }
}
