//! The Coulomb term of [`super::super::coulomb`] inside the balance: at one psi, the free-electron
//! density n_e = q F_1/2(psi) fixes Gamma_e, the shift mu_C / kT of the electron chemical
//! potential in the Saha ratios, and the Coulomb pressure, all with their derivatives.

use super::electrons::ElectronIntegrals;
use super::ionisation::{Grad, Stages};
use crate::physics::eos::coulomb::{ln_coupling_constant, CoulombMixture, Coupling, IonSpecies};

/// The parts of the Coulomb term that depend on T alone.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct CouplingAtTemperature {
    mixture: CoulombMixture,
    /// ln Gamma_e - (1/3) ln F_1/2(psi) = ln[e^2 (4 pi/3)^(1/3) / (kT)] + (1/3) ln q.
    ln_gamma_base: f64,
    /// n_e / Gamma_e^3 = (3 / (4 pi)) (kT / e^2)^3, cm^-3.
    density_per_gamma_cubed: f64,
}

/// The Coulomb term at one psi.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub(super) struct CouplingAtPsi {
    /// phi, u_phi and Gamma_e at the free-electron density.
    pub(super) coupling: Coupling,
    /// mu_C / kT: the Saha ratios are taken at psi + shift.
    pub(super) shift: f64,
    /// d shift / d psi and d shift / d ln T (at fixed psi).
    pub(super) d_shift: (f64, f64),
    /// P_C = n_e kT u_phi / 3, dyn cm^-2.
    pub(super) pressure: f64,
    /// dP_C / d psi and dP_C / d ln T at fixed psi (P_C does not depend on rho at fixed psi).
    pub(super) dp: (f64, f64),
    /// F_C / V = n_e kT phi, erg cm^-3.
    pub(super) free_energy_density: f64,
}

impl CouplingAtTemperature {
    /// At temperature T (`ln_t` = ln T) with `ln_q` = ln q (n_e = q F_1/2), for the fully ionised
    /// `ions` with `electrons_per_mu` electrons per m_u.
    pub(super) fn new(ln_t: f64, ln_q: f64, ions: &IonSpecies, electrons_per_mu: f64) -> Self {
        let ln_gamma_base = ln_coupling_constant() - ln_t + ln_q / 3.0;
        Self {
            mixture: CoulombMixture::new(ions, electrons_per_mu),
            ln_gamma_base,
            // Gamma_e = exp(ln_gamma_base) F_1/2^(1/3) and n_e = q F_1/2.
            density_per_gamma_cubed: (ln_q - 3.0 * ln_gamma_base).exp(),
        }
    }

    /// The term at one psi with electron integrals `el` and `kt` = kT (erg).
    ///
    /// With n = q F_1/2: d ln n / d psi = s (the slope of ln F_1/2), d ln n / d ln T = 3/2 at
    /// fixed psi, so d ln Gamma_e / d psi = s/3 and d ln Gamma_e / d ln T = -1/2. Then
    /// dP_C/dpsi = (n kT s / 3)(u + G u'/3) and dP_C/dln T = (n kT / 3)(5u/2 - G u'/2).
    pub(super) fn at(&self, el: &ElectronIntegrals, kt: f64) -> CouplingAtPsi {
        use crate::numerics::exponential::FastExp;
        let ln_gamma_e = self.ln_gamma_base + el.ln_f_half / 3.0;
        let gamma_e = ln_gamma_e.fast_exp();
        let n_e = self.density_per_gamma_cubed * gamma_e * gamma_e * gamma_e;
        let coupling = self.mixture.at_ln(ln_gamma_e, gamma_e);
        let (u, slope) = (coupling.energy, coupling.energy_slope);
        let s = el.slope_half;
        let m_slope = coupling.chemical_potential_slope();
        let nkt3 = n_e * kt / 3.0;
        CouplingAtPsi {
            coupling,
            shift: coupling.chemical_potential(),
            d_shift: (m_slope * s / 3.0, -0.5 * m_slope),
            pressure: nkt3 * u,
            dp: (nkt3 * s * (u + slope / 3.0), nkt3 * (2.5 * u - 0.5 * slope)),
            free_energy_density: n_e * kt * coupling.free_energy,
        }
    }
}

impl CouplingAtPsi {
    /// The stages found at psi + shift, with their derivatives turned into derivatives at fixed
    /// psi: d/dpsi = (1 + dshift/dpsi) d/dpsi', d/dln T = d/dln T|psi' + (dshift/dln T) d/dpsi'.
    pub(super) fn chain(&self, stages: &mut Stages) {
        let (dp, dt) = self.d_shift;
        let turn = |g: &mut Grad| {
            g.ln_t += g.psi * dt;
            g.psi *= 1.0 + dp;
        };
        turn(&mut stages.d_n_e);
        turn(&mut stages.d_n_p);
        turn(&mut stages.d_e_ion);
    }
}
