//! Specific internal energy and entropy of every built-in equation of state: consistent with
//! the law's own thermodynamic derivatives (c_V from Gamma_1, chi_rho and chi_T), with the
//! Gibbs relation T ds = du - (P / rho^2) d rho, with the ideal-gas limit of the ionised
//! plasma, and, for the entropy's zero point, with the standard entropies of thermochemistry
//! (CODATA key values, docs/references.md §10).

use starpoise::constants::{A_RAD_CGS, K_B_ERG_K, M_U_G};
use starpoise::physics::eos::{
    DegenerateGas, EosState, EquationOfState, IdealGas, MolecularEos, RefinedEos, SahaGas,
};
use starpoise::physics::Composition;

/// The molar gas constant R = N_A k, J K^-1 mol^-1 (CODATA 2018, exact).
const R_J_MOL_K: f64 = 8.314_462_618;

fn laws() -> Vec<Box<dyn EquationOfState>> {
    vec![
        Box::new(IdealGas),
        Box::new(SahaGas),
        Box::new(DegenerateGas),
        Box::new(RefinedEos),
        Box::new(MolecularEos),
    ]
}

fn solar() -> Composition {
    Composition::new(0.70, 0.02).unwrap()
}

/// c_V from the law's Gamma_1, chi_rho and chi_T: Gamma_1 = chi_rho + P chi_T^2 / (rho T c_V)
/// (Kippenhahn & Weigert 1990, §13).
fn cv(s: &EosState) -> f64 {
    let (p, rho, t) = (s.pressure_dyn_cm2, s.density_g_cm3, s.temperature_k);
    p * s.chi_t * s.chi_t / (rho * t * (s.gamma1 - s.chi_rho))
}

fn entropy(law: &dyn EquationOfState, rho: f64, t: f64, c: &Composition) -> f64 {
    let s = law.state(rho, t, c).unwrap();
    law.specific_entropy_erg_g_k(&s, c)
        .unwrap_or_else(|| panic!("{} gives no entropy", law.name()))
}

fn energy(law: &dyn EquationOfState, rho: f64, t: f64, c: &Composition) -> f64 {
    law.state(rho, t, c).unwrap().specific_energy_erg_g
}

/// Points (rho g/cm^3, T K) across the laws' common domain: the H2 zone (molecular), the H and
/// He ionisation zones, envelopes and cores of ZAMS stars from 0.1 to 10 M_sun. Radiation-dominated
/// points (beta < 1e-4) are left out: there c_V = c_P - P chi_T^2/(rho T chi_rho) cancels to
/// more digits than a difference resolves.
const POINTS: [(f64, f64); 10] = [
    (1e-9, 3.0e3),
    (1e-8, 6.0e3),
    (1e-7, 1.2e4),
    (1e-6, 4.0e4),
    (1e-5, 1.5e5),
    (1e-4, 5.0e5),
    (0.1, 2.0e6),
    (1.0, 5.0e6),
    (80.0, 1.4e7),
    (500.0, 4.0e6),
];

/// Where the laws' occupation probabilities (pressure ionisation) are 1 to better than 1e-3,
/// g/cm^3: their pressure term, left out of P in the plasma laws (see `physics::eos::plasma`),
/// then spoils the Gibbs relation by less than 1e-6 of P/rho.
const NO_PRESSURE_IONISATION_G_CM3: f64 = 1e-6;

/// Relative step of the central differences in ln rho and ln T: truncation error ~1e-10
/// relative, the laws' inversions and neutrality solves converge to 1e-12.
const STEP: f64 = 1e-5;
/// Agreement of a central difference with the analytic value, relative: 1e-6 leaves a wide
/// margin over ~1e-9 of truncation and convergence noise, yet a missing term (an ionisation
/// energy, a weight, the H2 rotation) shows at 1e-3 or more.
const DERIVATIVE_REL: f64 = 1e-6;

/// (du/dT)_rho = c_V and (ds/dT)_rho = c_V / T for every law at every point of its domain:
/// u and s belong to the free energy whose derivatives the law reports.
#[test]
fn energy_and_entropy_give_the_heat_capacity() {
    let c = solar();
    for law in laws() {
        let law = law.as_ref();
        for (rho, t) in POINTS {
            // The ideal gas assumes full ionisation: compare it where that holds.
            if law.name() == "ideal" && t < 1e6 {
                continue;
            }
            let s = law.state(rho, t, &c).unwrap();
            if s.beta < 1e-4 {
                continue;
            }
            let (up, dn) = (STEP.exp(), (-STEP).exp());
            let du = (energy(law, rho, t * up, &c) - energy(law, rho, t * dn, &c)) / (2.0 * STEP);
            let ds = (entropy(law, rho, t * up, &c) - entropy(law, rho, t * dn, &c)) / (2.0 * STEP);
            let cv = cv(&s);
            assert!(
                (du / (cv * t) - 1.0).abs() < DERIVATIVE_REL,
                "{} at ({rho}, {t}): du/dlnT {du:e} vs c_V T {:e}",
                law.name(),
                cv * t
            );
            assert!(
                (ds / cv - 1.0).abs() < DERIVATIVE_REL,
                "{} at ({rho}, {t}): ds/dlnT {ds:e} vs c_V {cv:e}",
                law.name()
            );
        }
    }
}

/// The Gibbs relation at fixed T, T (ds/dln rho) = (du/dln rho) - P/rho, and the Maxwell
/// relation (du/dln rho)_T = (P/rho)(1 - chi_T), wherever pressure ionisation is negligible
/// (everywhere for the fully ionised laws).
#[test]
fn energy_and_entropy_obey_the_gibbs_and_maxwell_relations() {
    let c = solar();
    for law in laws() {
        let law = law.as_ref();
        let fully_ionised = matches!(law.name(), "ideal" | "degenerate");
        for (rho, t) in POINTS {
            if law.name() == "ideal" && t < 1e6 {
                continue;
            }
            if !fully_ionised && rho > NO_PRESSURE_IONISATION_G_CM3 {
                continue;
            }
            let s = law.state(rho, t, &c).unwrap();
            let (up, dn) = (STEP.exp(), (-STEP).exp());
            let du = (energy(law, rho * up, t, &c) - energy(law, rho * dn, t, &c)) / (2.0 * STEP);
            let ds = (entropy(law, rho * up, t, &c) - entropy(law, rho * dn, t, &c)) / (2.0 * STEP);
            let p_rho = s.pressure_dyn_cm2 / rho;
            assert!(
                (t * ds - (du - p_rho)).abs() < DERIVATIVE_REL * p_rho,
                "{} at ({rho}, {t}): T ds/dln rho {:e} vs du/dln rho - P/rho {:e}",
                law.name(),
                t * ds,
                du - p_rho
            );
            assert!(
                (du - p_rho * (1.0 - s.chi_t)).abs() < DERIVATIVE_REL * p_rho,
                "{} at ({rho}, {t}): Maxwell {du:e} vs {:e}",
                law.name(),
                p_rho * (1.0 - s.chi_t)
            );
        }
    }
}

/// Where ionisation is complete the energy is that of the ideal gas of ions and electrons and
/// radiation, u = (3/2) P_gas/rho + a T^4/rho (the zero of u is the ionised plasma at rest),
/// for non-degenerate and degenerate (non-relativistic) electrons alike: at the solar centre
/// and in a dense cool 0.1 M_sun core, where pressure ionisation leaves no bound state
/// (occupation probability e^-(s e^15) with s > 10). Agreement to 1e-12: rounding only.
#[test]
fn ionised_energy_is_the_ideal_gas_energy() {
    const ROUNDING: f64 = 1e-12;
    let c = solar();
    let laws: [&dyn EquationOfState; 4] = [&IdealGas, &SahaGas, &DegenerateGas, &RefinedEos];
    for law in laws {
        for (rho, t) in [(150.0, 1.57e7), (500.0, 4.0e6)] {
            let s = law.state(rho, t, &c).unwrap();
            let ideal = 1.5 * s.gas_pressure_dyn_cm2 / rho + A_RAD_CGS * t.powi(4) / rho;
            assert!(
                (s.specific_energy_erg_g / ideal - 1.0).abs() < ROUNDING,
                "{} at ({rho}, {t}): u {:e} vs {ideal:e}",
                law.name(),
                s.specific_energy_erg_g
            );
        }
    }
}

/// In cool gas the bound electrons' energy is below the zero: pure hydrogen at 6000 K and
/// 1e-7 g/cm^3 is almost all atomic, so u = (3/2) kT minus the ionisation energy 13.598 eV
/// (NIST, as in the laws) per atom, one atom per m_u of matter (the laws' mass bookkeeping, as in
/// the composition), to the ionised fraction (< 1e-3 here).
#[test]
fn bound_electrons_lower_the_energy() {
    use starpoise::physics::eos::plasma::CHI_H_EV;
    let h = Composition::new(1.0, 0.0).unwrap();
    let (rho, t) = (1e-7, 6000.0);
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos] {
        let s = law.state(rho, t, &h).unwrap();
        assert!(s.hydrogen_ionised < 1e-3, "{s:?}");
        let m_h = M_U_G;
        let atoms = (1.5 * K_B_ERG_K * t - CHI_H_EV * starpoise::constants::EV_ERG) / m_h;
        // The ionised fraction x adds x (13.598 eV + 3 kT/2 per electron) / m_H.
        assert!(
            (s.specific_energy_erg_g - atoms).abs() < 1e-3 * atoms.abs(),
            "{} u {:e} vs {atoms:e}",
            law.name(),
            s.specific_energy_erg_g
        );
    }
}

/// Molar entropy, J K^-1 mol^-1, of `law` for composition `c` at temperature `t` and pressure
/// 1 bar, per mole of particles of molar mass `molar_mass_g`.
fn molar_entropy(law: &dyn EquationOfState, c: &Composition, t: f64, molar_mass_g: f64) -> f64 {
    let s = law.state_at_pressure(1e6, t, c).unwrap();
    let erg_g_k = law.specific_entropy_erg_g_k(&s, c).unwrap();
    erg_g_k * molar_mass_g * 1e-7
}

/// The entropy's zero point: monatomic helium and atomic hydrogen at 1000 K and 1 bar against
/// the CODATA key values at 298.15 K (docs/references.md §10: He 126.153, H 114.717
/// J K^-1 mol^-1) carried to 1000 K by the ideal monatomic gas's (5/2) R ln(T/298.15). The laws
/// take helium's mass as 4 m_u (4.002602 u in the table), which lowers S by
/// (3/2) R ln(4.002602/4) = 0.0081; hydrogen's mass is the atom's, 1.00782503 u (the table's
/// 1.00794 u, the terrestrial mean, adds 0.0014); both shifts are applied. The laws count one
/// nucleus per A m_u of matter (A = 1 for hydrogen, 4 for helium), so a mole of particles is A
/// grams. Tolerance 2e-3 J/(K mol): the table's stated uncertainty.
#[test]
fn entropy_zero_matches_the_standard_entropies() {
    const TABLE_ABS: f64 = 2e-3;
    let heat = 2.5 * R_J_MOL_K * (1000.0 / 298.15f64).ln();
    let helium = Composition::new(0.0, 0.0).unwrap();
    let hydrogen = Composition::new(1.0, 0.0).unwrap();
    let he_mass_shift = 1.5 * R_J_MOL_K * (4.002_602f64 / 4.0).ln();
    let h_mass_shift = 1.5 * R_J_MOL_K * (1.007_94f64 / 1.007_825_03).ln();
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos, &MolecularEos] {
        let he = molar_entropy(law, &helium, 1000.0, 4.0);
        assert!(
            (he - (126.153 + heat - he_mass_shift)).abs() < TABLE_ABS,
            "{} helium {he}",
            law.name()
        );
    }
    // Atomic hydrogen: the laws without molecules (at 1000 K and 1 bar H2 would dominate).
    for law in [&SahaGas as &dyn EquationOfState, &RefinedEos] {
        let h = molar_entropy(law, &hydrogen, 1000.0, 1.0);
        assert!(
            (h - (114.717 + heat - h_mass_shift)).abs() < TABLE_ABS,
            "{} hydrogen {h}",
            law.name()
        );
    }
}

/// The electrons' entropy is the same whether they are written classically (ideal, saha) or
/// with the Fermi–Dirac integrals (degenerate, refined) where they are not degenerate: at
/// (1e-4 g/cm^3, 1e7 K) e^psi ~ 1e-4, so the two differ by ~e^psi/2^(5/2) ~ 2e-5 per electron,
/// below 1e-5 of s (tolerance 1e-5); and every law agrees there (everything ionised).
#[test]
fn entropy_agrees_between_the_laws_where_they_coincide() {
    const NONDEGENERATE_REL: f64 = 1e-5;
    let c = solar();
    let (rho, t) = (1e-4, 1e7);
    let reference = entropy(&IdealGas, rho, t, &c);
    for law in laws() {
        let s = entropy(law.as_ref(), rho, t, &c);
        assert!(
            (s / reference - 1.0).abs() < NONDEGENERATE_REL,
            "{}: {s:e} vs ideal {reference:e}",
            law.name()
        );
    }
}
