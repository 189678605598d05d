//! Saha ionisation checks for the `saha` and `refined` equations of state.

use starpoise::constants::{EV_ERG, H_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use starpoise::physics::eos::{EquationOfState, RefinedEos, SahaGas};
use starpoise::physics::Composition;

/// Independent one-species Saha solution for pure hydrogen (Saha 1920; e.g. Kippenhahn &
/// Weigert 1990, eq. 14.7): x^2 / (1 - x) = (1/n_H) (2 pi m_e k T / h^2)^(3/2) exp(-chi/kT)
/// (statistical-weight factor 2 g(H II)/g(H I) = 1), solved as a quadratic.
fn hydrogen_fraction(rho: f64, t: f64) -> f64 {
    let n_h = rho / M_U_G;
    let s = (2.0 * std::f64::consts::PI * M_E_G * K_B_ERG_K * t / (H_ERG_S * H_ERG_S)).powf(1.5)
        * (-13.598 * EV_ERG / (K_B_ERG_K * t)).exp()
        / n_h;
    0.5 * (-s + (s * s + 4.0 * s).sqrt())
}

/// The law's hydrogen ionisation agrees with the one-species solution across the ionisation
/// zone of pure hydrogen at low density, including the half-ionisation point. Tolerance 1e-5
/// absolute: pressure ionisation (w = 1 - 3e-9) and degeneracy (e^psi ~ 1e-7) are negligible
/// at 1e-9 g/cm^3.
#[test]
fn hydrogen_matches_one_species_saha() {
    let c = Composition::new(1.0, 0.0).unwrap();
    let rho = 1e-9;
    // Half-ionisation temperature of the independent solution, by bisection.
    let (mut lo, mut hi) = (3e3, 3e4);
    for _ in 0..100 {
        let mid = 0.5 * (lo + hi);
        if hydrogen_fraction(rho, mid) < 0.5 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let t_half = 0.5 * (lo + hi);
    assert!(t_half > 5e3 && t_half < 1e4, "T_half = {t_half}");
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos] {
        let s = law.state(rho, t_half, &c).unwrap();
        assert!(
            (s.hydrogen_ionised - 0.5).abs() < 1e-5,
            "{}: {}",
            law.name(),
            s.hydrogen_ionised
        );
        for t in [5e3, 7e3, 9e3, 1.2e4, 2e4] {
            let s = law.state(rho, t, &c).unwrap();
            let want = hydrogen_fraction(rho, t);
            assert!(
                (s.hydrogen_ionised - want).abs() < 1e-5,
                "{} at {t}: {} vs {want}",
                law.name(),
                s.hydrogen_ionised
            );
        }
    }
}

/// At 1e7 K hydrogen and helium are fully ionised at stellar-interior densities (textbook fact,
/// common practice, no source): H II and He III fractions above 0.9999. (Near 1 g/cm^3 the Saha
/// equation alone still leaves He II at the 1e-2 level; pressure ionisation takes over above
/// about 10 g/cm^3, so the checks are at low density and at the solar-centre density.)
#[test]
fn full_ionisation_at_ten_million_kelvin() {
    let c = Composition::new(0.7, 0.02).unwrap();
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos] {
        for rho in [1e-6, 1e-4, 150.0] {
            let s = law.state(rho, 1e7, &c).unwrap();
            assert!(s.hydrogen_ionised > 0.9999, "{} {rho}", law.name());
            assert!(
                s.helium_double > 0.9999,
                "{} {rho}: {}",
                law.name(),
                s.helium_double
            );
        }
    }
}

/// nabla_ad dips well below the ideal 0.4 in the hydrogen ionisation zone (textbook, e.g.
/// Kippenhahn & Weigert 1990, fig. 14.2 shows minima near 0.1): minimum below 0.15 at 1e-8 g/cm^3.
#[test]
fn nabla_ad_dips_in_the_hydrogen_ionisation_zone() {
    let c = Composition::new(0.7, 0.02).unwrap();
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos] {
        let mut min = f64::INFINITY;
        let mut t = 4e3;
        while t < 3e4 {
            min = min.min(law.state(1e-8, t, &c).unwrap().nabla_ad);
            t *= 1.02;
        }
        assert!(min < 0.15, "{}: min nabla_ad {min}", law.name());
        assert!(min > 0.0);
        // Below the zone, neutral gas: back to 0.4.
        let cold = law.state(1e-8, 2.5e3, &c).unwrap();
        assert!((cold.nabla_ad - 0.4).abs() < 0.01, "{}", cold.nabla_ad);
    }
}

/// Dense matter is pressure-ionised (Hummer & Mihalas 1988 hard-sphere term): at 10 g/cm^3 and
/// 1e4 K hydrogen is ionised although the Saha equation alone would keep it neutral.
#[test]
fn pressure_ionisation_in_dense_matter() {
    let c = Composition::new(0.7, 0.02).unwrap();
    let s = RefinedEos.state(10.0, 1e4, &c).unwrap();
    assert!(s.hydrogen_ionised > 0.99, "{}", s.hydrogen_ionised);
}
