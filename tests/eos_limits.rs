//! Equation-of-state limits: ideal gas and radiation, the complete-degeneracy limit, and the
//! analytic derivatives of every law against finite differences.

use starpoise::constants::{A_RAD_CGS, H_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use starpoise::physics::eos::{DegenerateGas, EquationOfState, IdealGas, RefinedEos, SahaGas};
use starpoise::physics::Composition;

fn rel(a: f64, b: f64) -> f64 {
    (a / b - 1.0).abs()
}

fn solar() -> Composition {
    Composition::new(0.70, 0.02).unwrap()
}

/// Ideal gas: beta -> 1 and nabla_ad -> 2/5 when radiation is negligible; nabla_ad -> 1/4 when
/// radiation dominates (Kippenhahn & Weigert 1990, §13.2; textbook).
#[test]
fn ideal_gas_and_radiation_limits() {
    let c = solar();
    let gas = IdealGas.state(1.0, 1e5, &c).unwrap();
    assert!((gas.beta - 1.0).abs() < 1e-6);
    assert!((gas.nabla_ad - 0.4).abs() < 1e-6);
    assert!((gas.gamma1 - 5.0 / 3.0).abs() < 1e-5);
    let rad = IdealGas.state(1e-9, 1e8, &c).unwrap();
    assert!(rad.beta < 1e-6);
    assert!((rad.nabla_ad - 0.25).abs() < 1e-5);
    assert!((rad.gamma1 - 4.0 / 3.0).abs() < 1e-5);
}

/// Where matter is fully ionised and non-degenerate the three new laws reduce to the ideal
/// gas (P and nabla_ad to 2e-4: the residual is the degeneracy correction e^psi / 2^(5/2)).
#[test]
fn new_laws_reduce_to_the_ideal_gas() {
    let c = solar();
    for (rho, t) in [(1e-2, 1e7), (1e-4, 3e6), (1e-6, 1e6), (1e-9, 1e8)] {
        let ideal = IdealGas.state(rho, t, &c).unwrap();
        let laws: [&dyn EquationOfState; 3] = [&SahaGas, &DegenerateGas, &RefinedEos];
        for law in laws {
            let s = law.state(rho, t, &c).unwrap();
            assert!(
                rel(s.pressure_dyn_cm2, ideal.pressure_dyn_cm2) < 2e-4,
                "{} at {rho} {t}",
                law.name()
            );
            assert!(
                (s.nabla_ad - ideal.nabla_ad).abs() < 2e-4,
                "{} at {rho} {t}: {} vs {}",
                law.name(),
                s.nabla_ad,
                ideal.nabla_ad
            );
            assert!((s.gamma1 - ideal.gamma1).abs() < 5e-4, "{}", law.name());
            assert!(
                rel(s.cp_erg_g_k, ideal.cp_erg_g_k) < 1e-3,
                "{} cp {} vs {}",
                law.name(),
                s.cp_erg_g_k,
                ideal.cp_erg_g_k
            );
            assert!((s.mu - c.mu()).abs() < 1e-4);
        }
    }
}

/// Complete degeneracy: P_e -> K (rho/mu_e)^(5/3) with K = (3/pi)^(2/3) h^2 / (20 m_e m_u^(5/3))
/// = 1.0036e13 cgs (e.g. Kippenhahn & Weigert 1990, eq. 15.23, memory; the value computed here
/// from CODATA 2018 constants). Metal-free mixture so that mu_e = 2/(1+X) holds exactly.
#[test]
fn complete_degeneracy_limit() {
    let k = (3.0 / std::f64::consts::PI).powf(2.0 / 3.0) * H_ERG_S * H_ERG_S
        / (20.0 * M_E_G * M_U_G.powf(5.0 / 3.0));
    assert!(rel(k, 1.0036e13) < 1e-4, "K = {k}");
    let c = Composition::new(0.7, 0.0).unwrap();
    for law in [&DegenerateGas as &dyn EquationOfState, &RefinedEos] {
        for rho in [1e3, 1e4, 1e5] {
            let t = 1e4;
            let s = law.state(rho, t, &c).unwrap();
            let n_ion = rho / M_U_G * (c.x() + c.y() / 4.0);
            let p_e = s.pressure_dyn_cm2 - n_ion * K_B_ERG_K * t - A_RAD_CGS * t.powi(4) / 3.0;
            let limit = k * (rho / c.mu_e()).powf(5.0 / 3.0);
            // Finite-temperature correction ~ (pi^2 / psi^2) is below 1e-6 here.
            assert!(
                rel(p_e, limit) < 1e-5,
                "{}: rho {rho}: {p_e} vs {limit}",
                law.name()
            );
            assert!(s.degeneracy_psi > 100.0);
            // chi_rho -> 5/3 when the degenerate electrons dominate.
            assert!(
                (s.chi_rho - 5.0 / 3.0).abs() < 2e-3,
                "chi_rho {}",
                s.chi_rho
            );
        }
    }
}

/// chi_rho and chi_T of every law agree with centred finite differences of ln P (step 1e-5 in
/// ln rho, ln T: truncation ~1e-10, round-off ~1e-10; tolerance 1e-6), in the H and He
/// ionisation zones, at partial degeneracy, and in the radiation-dominated regime.
#[test]
fn derivatives_match_finite_differences() {
    let c = solar();
    let points = [
        (1e-8, 8e3),
        (1e-8, 1.2e4),
        (1e-6, 4e4),
        (1e-3, 1.5e5),
        (1e2, 1e6),
        (1e4, 3e6),
        (1e-10, 5e7),
        (0.3, 3e3),
    ];
    let laws: [&dyn EquationOfState; 4] = [&IdealGas, &SahaGas, &DegenerateGas, &RefinedEos];
    let h: f64 = 1e-5;
    for law in laws {
        for (rho, t) in points {
            let Ok(s) = law.state(rho, t, &c) else {
                // Only the `saha` law stops at 1e3 g/cm^3.
                assert!(law.name() == "saha" && rho > 1e3);
                continue;
            };
            let lp = |r: f64, tt: f64| law.state(r, tt, &c).unwrap().pressure_dyn_cm2.ln();
            let fd_rho = (lp(rho * h.exp(), t) - lp(rho * (-h).exp(), t)) / (2.0 * h);
            let fd_t = (lp(rho, t * h.exp()) - lp(rho, t * (-h).exp())) / (2.0 * h);
            assert!(
                (s.chi_rho - fd_rho).abs() < 1e-6,
                "{} chi_rho at {rho} {t}: {} vs {fd_rho}",
                law.name(),
                s.chi_rho
            );
            assert!(
                (s.chi_t - fd_t).abs() < 1e-6,
                "{} chi_T at {rho} {t}: {} vs {fd_t}",
                law.name(),
                s.chi_t
            );
        }
    }
}

/// state_at_pressure inverts state: rho(P(rho, T), T) = rho to 1e-10 for every law over the
/// (P, T) range a ZAMS model visits.
#[test]
fn inversion_round_trip() {
    let c = solar();
    let laws: [&dyn EquationOfState; 4] = [&IdealGas, &SahaGas, &DegenerateGas, &RefinedEos];
    for law in laws {
        for (rho, t) in [
            (1e-11, 3e3),
            (1e-9, 6e3),
            (1e-7, 1.1e4),
            (1e-5, 5e4),
            (0.1, 1e6),
            (150.0, 1.5e7),
            (500.0, 4e6),
            (1e-9, 5e7),
        ] {
            let s = law.state(rho, t, &c).unwrap();
            let back = law.state_at_pressure(s.pressure_dyn_cm2, t, &c).unwrap();
            // |d ln P| < 1e-12 at convergence gives |d ln rho| < 1e-12 / chi_rho (chi_rho ~ beta
            // when radiation dominates).
            let tol = 1e-10 / s.chi_rho.min(1.0);
            assert!(
                rel(back.density_g_cm3, rho) < tol,
                "{} at {rho} {t}: {}",
                law.name(),
                back.density_g_cm3
            );
        }
    }
}

/// Outside the domain every law returns an error, never NaN.
#[test]
fn outside_the_domain_is_an_error() {
    let c = solar();
    let laws: [&dyn EquationOfState; 3] = [&SahaGas, &DegenerateGas, &RefinedEos];
    for law in laws {
        assert!(law.state(-1.0, 1e6, &c).is_err());
        assert!(law.state(1.0, f64::NAN, &c).is_err());
        assert!(law.state(1e9, 1e6, &c).is_err());
        assert!(law.state(1.0, 10.0, &c).is_err());
        assert!(law.state_at_pressure(1.0, 1e8, &c).is_err()); // below radiation pressure
        assert!(law.state_at_pressure(-1.0, 1e6, &c).is_err());
    }
}
