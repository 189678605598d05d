//! Checks of the microphysics laws in their textbook limits.

use super::{Check, Tolerance};
use crate::constants::{A_RAD_CGS, K_B_ERG_K, M_U_G};
use crate::error::Result;
use crate::physics::eos::fermi_dirac::fermi_dirac;
use crate::physics::eos::{DegenerateGas, EquationOfState, IdealGas};
use crate::physics::nuclear::sfactor::Reaction;
use crate::physics::opacity::{ElectronScattering, Opacity};
use crate::physics::Composition;

const GROUP: &str = "microphysics";

/// The checks of this group.
pub fn checks() -> Vec<Check> {
    vec![
        // At rho = 1, T = 1e5 K radiation carries 1e-8 of P: nabla_ad departs from 2/5 by
        // about that much, far inside 1e-6.
        Check::new(
            "eos.ideal.nabla-ad.gas",
            GROUP,
            "ideal gas nabla_ad at rho = 1 g/cm^3, T = 1e5 K (radiation negligible) -> 2/5",
            "fact of the trade (monatomic ideal gas; e.g. Kippenhahn & Weigert 1990, sec. 13.2, memory)",
            0.4,
            Tolerance::Absolute(1e-6),
            || ideal_nabla_ad(1.0, 1e5),
        ),
        // At rho = 1e-9, T = 1e8 K beta is about 1e-7: nabla_ad is 1/4 to about that.
        Check::new(
            "eos.ideal.nabla-ad.radiation",
            GROUP,
            "ideal gas + radiation nabla_ad at rho = 1e-9 g/cm^3, T = 1e8 K (radiation-dominated) -> 1/4",
            "fact of the trade (photon gas; e.g. Kippenhahn & Weigert 1990, sec. 13.2, memory)",
            0.25,
            Tolerance::Absolute(1e-5),
            || ideal_nabla_ad(1e-9, 1e8),
        ),
        // 0.20031 (1 + X) = 0.340527 at X = 0.7; five figures: half a unit in the fifth, relative.
        Check::new(
            "opacity.electron-scattering",
            GROUP,
            "electron-scattering opacity at X = 0.7: (sigma_T / m_u)(1 + X)/2 = 0.20031 (1 + X), cm^2/g",
            "CODATA 2018 sigma_T and m_u (confirmed); 0.20031 (1 + X) computed; 0.2 (1 + X) in the Kramers-law literature (confirmed)",
            0.340527,
            Tolerance::Relative(2.5e-5),
            electron_scattering_cm2_g,
        ),
        // Quoted to four figures; the last figure is allowed to differ by one.
        Check::new(
            "nuclear.gamow.pp",
            GROUP,
            "Gamow exponent tau T6^(1/3) for p + p",
            "Clayton 1968, Principles of Stellar Evolution and Nucleosynthesis, ch. 4 (memory); 33.80 computed from CODATA",
            33.80,
            Tolerance::Absolute(0.01),
            || Ok(Reaction::pp().tau_times_t6_cbrt()),
        ),
        Check::new(
            "nuclear.gamow.p-n14",
            GROUP,
            "Gamow exponent tau T6^(1/3) for p + 14N",
            "Clayton 1968, ch. 4 (memory); 152.28 computed from CODATA; Kippenhahn & Weigert 1990 sec. 18.5 (memory)",
            152.28,
            Tolerance::Absolute(0.02),
            || Ok(Reaction::p_n14().tau_times_t6_cbrt()),
        ),
        // Five figures given: half a unit in the fifth (5e-5 relative). The finite-temperature
        // correction at psi > 100 is below 1e-6 and relativity is not in the law.
        Check::new(
            "eos.degenerate.complete-degeneracy",
            GROUP,
            "degenerate law: K = P_e / (rho/mu_e)^(5/3) at rho = 1e5 g/cm^3, T = 1e4 K, X = 0.7, Z = 0",
            "K = (3/pi)^(2/3) h^2 / (20 m_e m_u^(5/3)), e.g. Kippenhahn & Weigert 1990, eq. 15.23 (memory); 1.0036e13 computed from CODATA 2018",
            1.0036e13,
            Tolerance::Relative(5e-5),
            complete_degeneracy_k,
        ),
        // The library's Fermi–Dirac integrals promise about 1e-8 relative.
        Check::new(
            "eos.fermi-dirac.f-half-at-zero",
            GROUP,
            "Fermi-Dirac integral F_1/2(0) = Gamma(3/2) (1 - 2^(-1/2)) zeta(3/2)",
            "closed form via the Dirichlet eta function (fact of the trade); zeta(3/2) = 2.6123753487 (memory); value computed",
            0.678_093_895,
            Tolerance::Relative(1e-8),
            || Ok(fermi_dirac(0.0).f_half),
        ),
    ]
}

fn ideal_nabla_ad(rho_g_cm3: f64, temperature_k: f64) -> Result<f64> {
    let comp = Composition::new(0.70, 0.02)?;
    Ok(IdealGas.state(rho_g_cm3, temperature_k, &comp)?.nabla_ad)
}

fn electron_scattering_cm2_g() -> Result<f64> {
    let comp = Composition::new(0.70, 0.0)?;
    Ok(ElectronScattering.kappa(1.0, 1e7, &comp)?)
}

/// Subtract the ion and radiation pressures from the law's total and divide by (rho/mu_e)^(5/3);
/// a metal-free mixture keeps mu_e = 2/(1 + X) exact.
fn complete_degeneracy_k() -> Result<f64> {
    let comp = Composition::new(0.70, 0.0)?;
    let (rho, t) = (1e5, 1e4);
    let s = DegenerateGas.state(rho, t, &comp)?;
    let n_ion = rho / M_U_G * (comp.x() + comp.y() / 4.0);
    let p_e = s.pressure_dyn_cm2 - n_ion * K_B_ERG_K * t - A_RAD_CGS * t.powi(4) / 3.0;
    Ok(p_e / (rho / comp.mu_e()).powf(5.0 / 3.0))
}
