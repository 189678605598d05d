//! The `molecular` equation of state: H2 dissociation against the check table of
//! docs/references.md §8.1, the Coulomb fit against the values of §8.2, and thermodynamic
//! consistency of every derivative against finite differences of P and of the internal energy.

use proptest::prelude::*;
use starpoise::constants::K_B_ERG_K;
use starpoise::physics::eos::coulomb::{ocp_energy, ocp_free_energy};
use starpoise::physics::eos::h2::dissociation;
use starpoise::physics::eos::{EquationOfState, MolecularEos};
use starpoise::physics::Composition;

/// Fraction of hydrogen nuclei in atoms (H I + H II), from mu and the ionised fraction of pure
/// hydrogen: 1/mu = (1 + y)/2 + x_H II.
fn atomic_fraction(p: f64, t: f64) -> f64 {
    let h = Composition::new(1.0, 0.0).unwrap();
    let s = MolecularEos.state_at_pressure(p, t, &h).unwrap();
    2.0 * (1.0 / s.mu - s.hydrogen_ionised) - 1.0
}

/// docs/references.md §8.1 check table, rigid rotor + harmonic oscillator columns (theta_r
/// 85.35 K, theta_v 5987.0 K; [COMPUTED] there): Q with nuclear spin counted (= 4 Q spin-free),
/// log10 Kp at 1 bar, and y at P = 1e6 dyn/cm^2 for pure hydrogen. The table gives Q to 4–5
/// figures (tolerance 3e-4 relative), log Kp to 3 decimals (2e-3: last digit and the rounding of
/// D0/k), y to 3 figures (5e-3 relative; our y also counts the 1e-5..1e-4 ionised fraction as
/// atoms, as the table's H + H2-only gas would).
#[test]
fn dissociation_matches_the_rrho_check_table() {
    const Q_REL: f64 = 3e-4;
    const LOG_KP_ABS: f64 = 2e-3;
    const Y_REL: f64 = 5e-3;
    let table = [
        (1500.0, 36.50, -9.496, 8.9e-6),
        (2000.0, 50.05, -5.559, 8.30e-4),
        (2500.0, 65.20, -3.175, 0.0129),
        (3000.0, 82.13, -1.573, 0.0815),
        (3500.0, 100.93, -0.420, 0.295),
        (4000.0, 121.63, 0.450, 0.643),
        (5000.0, 168.81, 1.678, 0.960),
        (6000.0, 223.76, 2.506, 0.994),
    ];
    for (t, q, log_kp, y) in table {
        let d = dissociation(t);
        let q_spin = 4.0 * d.ln_q.exp();
        assert!((q_spin / q - 1.0).abs() < Q_REL, "{t} K: Q {q_spin} vs {q}");
        let kp_bar = d.ln_k_cm3.exp() * K_B_ERG_K * t / 1e6;
        assert!(
            (kp_bar.log10() - log_kp).abs() < LOG_KP_ABS,
            "{t} K: log Kp {} vs {log_kp}",
            kp_bar.log10()
        );
        // 1500 K: the table's y has two figures.
        let tol = if t == 1500.0 { 2e-2 } else { Y_REL };
        let got = atomic_fraction(1e6, t);
        assert!((got / y - 1.0).abs() < tol, "{t} K: y {got} vs {y}");
    }
}

/// Half dissociation at P = 1e6 dyn/cm^2 is at 3798 K with the RRHO partition function
/// (docs/references.md §8.1 [COMPUTED]); y changes by 0.0045 per K there, so 0.5 +- 0.01 pins
/// the temperature to about 2 K.
#[test]
fn half_dissociation_temperature() {
    let y = atomic_fraction(1e6, 3798.0);
    assert!((y - 0.5).abs() < 0.01, "y(3798 K) = {y}");
}

/// Fully molecular neutral gas (1500 K, 1e-3 g/cm^3: y ~ 1e-4, metals keep their electrons):
/// mu = 1 / (X/2 + Y/4 + Z/16) (particle counting, fact of the trade; metals of mean mass number
/// 16 as in `Composition::mu`). A law that ionised the metals fully would give 2 per cent less.
#[test]
fn cool_gas_is_molecular_and_metals_keep_their_electrons() {
    const MU_REL: f64 = 5e-4;
    let c = Composition::new(0.70, 0.02).unwrap();
    let s = MolecularEos.state(1e-3, 1500.0, &c).unwrap();
    let expected = 1.0 / (0.35 + 0.28 / 4.0 + 0.02 / 16.0);
    assert!((s.mu / expected - 1.0).abs() < MU_REL, "mu {}", s.mu);
}

/// Potekhin & Chabrier (2000) liquid OCP fit against the values of docs/references.md §8.2
/// ([COMPUTED] there from the same fit; 5-6 figures, tolerance 2e-5 relative), and the exact
/// Debye–Hückel limit f = -Gamma^(3/2)/sqrt(3) at Gamma = 1e-6 (relative 1e-2: the next term is
/// of order Gamma^(3/2) sqrt(Gamma/A2) relative).
#[test]
fn coulomb_fit_values() {
    const REL: f64 = 2e-5;
    for (g, u) in [
        (1.0, -0.57183),
        (10.0, -7.99808),
        (100.0, -87.5269),
        (175.0, -154.439),
    ] {
        assert!((ocp_energy(g).0 / u - 1.0).abs() < REL, "u({g})");
    }
    for (g, f) in [(1.0, -0.43713), (10.0, -7.10338), (100.0, -84.3317)] {
        assert!((ocp_free_energy(g) / f - 1.0).abs() < REL, "f({g})");
    }
    let g: f64 = 1e-6;
    let dh = -g.powf(1.5) / 3f64.sqrt();
    assert!((ocp_free_energy(g) / dh - 1.0).abs() < 1e-2);
}

fn log_uniform(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    (lo.log10()..hi.log10()).prop_map(|e| 10f64.powf(e))
}

/// Relative agreement required between analytic derivatives and central differences with
/// step 1e-5 in ln rho or ln T: the truncation error is ~1e-10 and the neutrality solve is
/// converged to 1e-12, so 1e-6 leaves a wide margin yet catches any missing term (the
/// occupation-probability pressure, left out, shows up at 1e-3 to 1e-1 where it acts).
const DERIVATIVE_REL: f64 = 1e-6;

fn check_consistency(
    rho: f64,
    t: f64,
    c: &Composition,
    maxwell_check: bool,
) -> Result<(), TestCaseError> {
    let e = MolecularEos;
    let s = e
        .state(rho, t, c)
        .map_err(|er| TestCaseError::fail(er.to_string()))?;
    let h: f64 = 1e-5;
    let ln_p = |r: f64, tt: f64| e.state(r, tt, c).map(|s| s.pressure_dyn_cm2.ln());
    let u = |r: f64, tt: f64| e.specific_energy_erg_g(r, tt, c);
    let fail = |er: starpoise::error::PhysicsError| TestCaseError::fail(er.to_string());
    let (up, dn) = (h.exp(), (-h).exp());
    let chi_rho = (ln_p(rho * up, t).map_err(fail)? - ln_p(rho * dn, t).map_err(fail)?) / (2.0 * h);
    let chi_t = (ln_p(rho, t * up).map_err(fail)? - ln_p(rho, t * dn).map_err(fail)?) / (2.0 * h);
    let du_dlnt = (u(rho, t * up).map_err(fail)? - u(rho, t * dn).map_err(fail)?) / (2.0 * h);
    let du_dlnrho = (u(rho * up, t).map_err(fail)? - u(rho * dn, t).map_err(fail)?) / (2.0 * h);
    let p = s.pressure_dyn_cm2;
    let cv = s.cp_erg_g_k - p * s.chi_t * s.chi_t / (rho * t * s.chi_rho);
    // chi_rho -> 0 in radiation-dominated gas, where a difference of ln P resolves it to ~1e-11
    // absolute only.
    prop_assert!(
        (chi_rho - s.chi_rho).abs() < DERIVATIVE_REL * s.chi_rho + 1e-9,
        "chi_rho {chi_rho} {s:?}"
    );
    prop_assert!(
        (chi_t / s.chi_t - 1.0).abs() < DERIVATIVE_REL,
        "chi_T {chi_t} {s:?}"
    );
    // Where radiation dominates (beta < 1e-4) c_V = c_P - P chi_T^2/(rho T chi_rho) cancels to
    // more digits than a test can resolve; chi_rho and chi_T are checked there all the same.
    if s.beta < 1e-4 {
        return Ok(());
    }
    prop_assert!(
        (du_dlnt / (cv * t) - 1.0).abs() < DERIVATIVE_REL,
        "c_V {s:?}"
    );
    // Maxwell relation of a free energy: (du/dln rho)_T = (P/rho)(1 - chi_T).
    let maxwell = p / rho * (1.0 - s.chi_t);
    prop_assert!(
        !maxwell_check || (du_dlnrho - maxwell).abs() < DERIVATIVE_REL * p / rho,
        "Maxwell {du_dlnrho} vs {maxwell} {s:?}"
    );
    // The adiabatic quantities follow from c_V, chi_rho, chi_T (Kippenhahn & Weigert §13).
    let gamma1 = s.chi_rho + p * s.chi_t * s.chi_t / (rho * t * cv);
    // 1e-9: the two forms cancel differently when radiation dominates (beta ~ 1e-5).
    prop_assert!((gamma1 / s.gamma1 - 1.0).abs() < 1e-9, "{gamma1} {s:?}");
    prop_assert!((s.nabla_ad - p * s.chi_t / (s.gamma1 * rho * t * cv)).abs() < 1e-9);
    Ok(())
}

fn composition() -> impl Strategy<Value = Composition> {
    (0.0f64..0.04, 0.3f64..0.8).prop_map(|(z, x)| Composition::new(x, z).unwrap())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// Envelopes and atmospheres (rho <= 1e-4 g/cm^3), through the H2, H and He zones (up to
    /// 3e6 K: hotter and this thin, radiation so dominates that
    /// c_P - P chi_T^2 / (rho T chi_rho) cancels). The Maxwell relation is checked in the H2 zone
    /// (T < 8000 K, where the occupation terms of H and H2 nearly cancel) and below 3e-8 g/cm^3;
    /// in the H and He ionisation zones the left-out occupation pressure grows with density, to
    /// 2e-6 of P/rho at 1e-6 g/cm^3 and 5e-5 at 1e-4.
    #[test]
    fn consistent_in_the_envelope(c in composition(), rho in log_uniform(1e-12, 1e-4), t in log_uniform(1.2e3, 3e6)) {
        check_consistency(rho, t, &c, t < 8e3 || rho < 3e-8)?;
    }

    /// Ionised interiors with Coulomb coupling and degenerate electrons, ZAMS cores from
    /// 0.07 M_sun up; and (`_warm`) the dense warm matter of the lowest-mass stars between 1e5
    /// and 2.5e6 K, Gamma_e up to 4, where a Coulomb term switched on in temperature (an earlier
    /// version of this law) made the state unstable (c_V or chi_rho not positive). The Maxwell relation is checked only where the pressure-ionisation
    /// occupation probability of He II is 0 (rho > 30 g/cm^3); at lower density the
    /// 1e-4..1e-2 of helium left in He II (ground-state Saha) misses the pressure of its
    /// occupation term (left out, as in `refined`), up to 3e-4 of P/rho at 1 g/cm^3 and 1e7 K
    /// and a few 1e-3 at 2.5e6 K.
    #[test]
    fn consistent_in_the_interior_warm(c in composition(), rho in log_uniform(1.0, 3e3), t in log_uniform(1e5, 2.5e6)) {
        check_consistency(rho, t, &c, rho > 30.0)?;
    }

    #[test]
    fn consistent_in_the_interior(c in composition(), rho in log_uniform(1e-3, 1e3), t in log_uniform(2.5e6, 1e8)) {
        check_consistency(rho, t, &c, rho > 30.0)?;
    }
}

/// Around the cold dense region where the equilibrium is multi-valued (docs:
/// `coulomb::TRANSITION_BOXES`; the kind of first-order transition Saumon & Chabrier 1992
/// predicted for dense hydrogen below about 1.5e4 K near 0.35 g/cm^3, memory): everywhere else
/// on a grid over X = 0–0.98, rho 1e-3–1e3 g/cm^3 and T 1e3–1e7 K the law has a state, and the
/// inversion rho(P, T) returns that same state (one branch, no van der Waals loop), to 1e-6 in
/// rho; inside, the law cautions.
#[test]
fn one_equilibrium_outside_the_cold_dense_transition() {
    use starpoise::physics::eos::coulomb::in_transition_region;
    let e = MolecularEos;
    for x in [0.0, 0.15, 0.3, 0.5, 0.7, 0.98] {
        let c = Composition::new(x, 0.02).unwrap();
        for i in 0..=150 {
            let rho = 10f64.powf(-3.0 + 6.0 * f64::from(i) / 150.0);
            for j in 0..=60 {
                let t = 10f64.powf(3.0 + 4.0 * f64::from(j) / 60.0);
                if in_transition_region(rho, t) {
                    assert!(e.caution(rho, t, &c).is_some());
                    continue;
                }
                let s = e
                    .state(rho, t, &c)
                    .unwrap_or_else(|er| panic!("X {x} rho {rho:e} T {t:e}: {er}"));
                let back = e
                    .state_at_pressure(s.pressure_dyn_cm2, t, &c)
                    .unwrap_or_else(|er| panic!("X {x} rho {rho:e} T {t:e}: {er}"));
                assert!(
                    (back.density_g_cm3 / rho - 1.0).abs() < 1e-6,
                    "X {x} rho {rho:e} T {t:e}: inversion gives {:e}",
                    back.density_g_cm3
                );
            }
        }
    }
}
