//! Everything the balance needs at one (rho, T) apart from psi ([`Setup`]), the parts of it that
//! depend on T alone ([`PerTemperature`]), and the balance evaluated at one psi ([`AtPsi`]).

use super::coupling::{CouplingAtPsi, CouplingAtTemperature};
use super::electrons::ElectronIntegrals;
use super::electrons::SQRT_PI;
use super::ionisation::{occupation, pressure_volume, StageInputs, Stages};
use super::{Ionisation, Plasma, CHI_HE1_EV, CHI_HE2_EV, CHI_H_EV};
use crate::constants::{EV_ERG, H_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use crate::error::PhysicsError;
use crate::physics::composition::{Composition, METAL_MEAN_MASS_NUMBER};
use crate::physics::eos::coulomb::{IonSpecies, Z53_HELIUM, Z53_METALS};
use crate::physics::eos::molecular::{MolecularAtTemperature, MolecularInputs};

/// ln(m_u / 1 g), so that ln(rho / m_u) costs no logarithm when ln rho is known.
const LN_M_U_G: f64 = -54.754_899_943_289_25;

/// Everything at one (rho, T) that does not depend on psi.
#[derive(Debug, Clone, Copy)]
pub(super) struct Setup {
    pub(super) rho: f64,
    pub(super) t: f64,
    pub(super) kt: f64,
    /// n_e = q F_1/2(psi).
    pub(super) q: f64,
    pub(super) ln_q_over_n: f64,
    pub(super) psi_full: f64,
    pub(super) psi_max: f64,
    pub(super) inputs: StageInputs,
    /// The Coulomb term's parts that depend on T alone (`None` unless the law has it).
    pub(super) coulomb: Option<CouplingAtTemperature>,
}

/// The parts of a [`Setup`] that depend on T alone.
#[derive(Debug, Clone, Copy)]
pub(super) struct PerTemperature {
    pub(super) molecular: Option<MolecularAtTemperature>,
    pub(super) coulomb: Option<CouplingAtTemperature>,
    /// ln q, n_e = q F_1/2(psi).
    pub(super) ln_q: f64,
}

/// The balance at one psi: the stages (their derivatives at fixed psi, the Coulomb shift
/// included), the electron integrals and the Coulomb term.
#[derive(Debug, Clone, Copy)]
pub(super) struct Balance {
    pub(super) stages: Stages,
    pub(super) el: ElectronIntegrals,
    pub(super) coulomb: CouplingAtPsi,
}

/// The balance evaluated at one psi: what the state and the entropy are read from.
#[derive(Clone, Copy)]
pub(super) struct AtPsi<'a> {
    pub(super) setup: &'a Setup,
    pub(super) psi: f64,
    pub(super) stages: &'a Stages,
    pub(super) el: &'a ElectronIntegrals,
    pub(super) coulomb: &'a CouplingAtPsi,
}

impl<'a> AtPsi<'a> {
    pub(super) fn new(setup: &'a Setup, psi: f64, balance: &'a Balance) -> Self {
        Self {
            setup,
            psi,
            stages: &balance.stages,
            el: &balance.el,
            coulomb: &balance.coulomb,
        }
    }
}

impl Plasma {
    /// Everything at (rho, T) that does not depend on psi.
    pub(super) fn setup(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<Setup, PhysicsError> {
        self.setup_with(rho, rho.ln(), t, comp, &self.per_temperature(t, comp))
    }

    /// What this law computes from T alone (an inversion at fixed T does it once).
    pub(super) fn per_temperature(&self, t: f64, comp: &Composition) -> PerTemperature {
        // One logarithm of T serves the molecules, the electrons and the Coulomb term.
        let ln_t = t.ln();
        let ln_q = Self::electron_density_coefficient().ln() + 1.5 * ln_t;
        PerTemperature {
            molecular: (self.ionisation == Ionisation::Molecular)
                .then(|| MolecularAtTemperature::new(t, ln_t)),
            ln_q,
            coulomb: self.coulomb.then(|| {
                CouplingAtTemperature::new(
                    ln_t,
                    ln_q,
                    &Self::coulomb_ions(comp),
                    Self::electrons_fully_ionised(comp),
                )
            }),
        }
    }

    /// c_n in n_e = c_n T^(3/2) F_1/2(psi): (4 / sqrt(pi)) (2 pi m_e k / h^2)^(3/2), cgs.
    pub(super) fn electron_density_coefficient() -> f64 {
        let thermal = 2.0 * std::f64::consts::PI * M_E_G * K_B_ERG_K / (H_ERG_S * H_ERG_S);
        4.0 / SQRT_PI * thermal * thermal.sqrt()
    }

    /// Electrons per m_u of the fully ionised mixture, X + Y/2 + Z (1/2 - 1/16).
    pub(super) fn electrons_fully_ionised(comp: &Composition) -> f64 {
        comp.x() + 0.5 * comp.y() + comp.z() * (0.5 - 1.0 / METAL_MEAN_MASS_NUMBER)
    }

    /// The ions of the Coulomb term: H+, He++ and metals of charge 7, per m_u, with Z^(5/3).
    pub(super) fn coulomb_ions(comp: &Composition) -> IonSpecies {
        [
            (comp.x(), 1.0),
            (0.25 * comp.y(), Z53_HELIUM),
            (comp.z() / METAL_MEAN_MASS_NUMBER, Z53_METALS),
        ]
    }

    /// As [`Plasma::setup`], with ln rho and the parts that depend on T alone given. Inlined:
    /// the inversion calls it once per iteration and would otherwise copy the setup out.
    #[inline(always)]
    pub(super) fn setup_with(
        &self,
        rho: f64,
        ln_rho: f64,
        t: f64,
        comp: &Composition,
        per_t: &PerTemperature,
    ) -> Result<Setup, PhysicsError> {
        let kt = K_B_ERG_K * t;
        let x = comp.x();
        let y4 = 0.25 * comp.y();
        let z_ion = comp.z() / METAL_MEAN_MASS_NUMBER;
        let z_e = comp.z() * (0.5 - 1.0 / METAL_MEAN_MASS_NUMBER);
        let n_ion = x + y4 + z_ion;
        let n_e_max = x + 2.0 * y4 + z_e;
        let n_nuc = rho / M_U_G * n_ion;
        let q = Self::electron_density_coefficient() * t * t.sqrt();
        let ln_n = ln_rho - LN_M_U_G;
        let ln_q_over_n = per_t.ln_q - ln_n;
        // Fully ionised electron density: bounds the psi bracket from above.
        let (psi_full, psi_max) = self
            .psi_start((rho / M_U_G * n_e_max / q).max(f64::MIN_POSITIVE))
            .ok_or_else(|| self.error("electron density not representable", rho, t))?;
        let s_h = pressure_volume(1.0) * n_nuc;
        let w_h = occupation(s_h);
        let inputs = StageInputs {
            x,
            y4,
            z_e,
            n_ion,
            a_h: CHI_H_EV * EV_ERG / kt,
            a_1: CHI_HE1_EV * EV_ERG / kt,
            a_2: CHI_HE2_EV * EV_ERG / kt,
            w_h,
            w_he1: occupation(pressure_volume(27.0 / 16.0) * n_nuc),
            w_he2: occupation(pressure_volume(2.0) * n_nuc),
            mol: match &per_t.molecular {
                Some(at_t) => {
                    MolecularInputs::new(at_t, (z_ion, z_e), ln_n, w_h, occupation(2.0 * s_h))
                }
                None => MolecularInputs::default(),
            },
        };
        Ok(Setup {
            rho,
            t,
            kt,
            q,
            ln_q_over_n,
            psi_full,
            psi_max,
            inputs,
            coulomb: per_t.coulomb,
        })
    }

    /// The balance at `psi`: the electrons, then (in a law with the Coulomb term) the shift
    /// mu_C / kT of the electron chemical potential at their density, then the stages at
    /// psi + shift ([`CouplingAtPsi::chain`]).
    pub(super) fn balance(&self, setup: &Setup, psi: f64) -> Balance {
        let el = self.integrals(psi);
        match &setup.coulomb {
            Some(at_t) => {
                let coulomb = at_t.at(&el, setup.kt);
                let mut stages = self.stages(&setup.inputs, psi + coulomb.shift);
                coulomb.chain(&mut stages);
                Balance {
                    stages,
                    el,
                    coulomb,
                }
            }
            None => Balance {
                stages: self.stages(&setup.inputs, psi),
                el,
                coulomb: CouplingAtPsi::default(),
            },
        }
    }

    fn stages(&self, inputs: &StageInputs, psi: f64) -> Stages {
        match self.ionisation {
            Ionisation::Saha => inputs.saha(psi),
            Ionisation::Full => inputs.full(),
            Ionisation::Molecular => inputs.molecular(psi),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ln_atomic_mass_unit_is_the_logarithm_of_the_constant() {
        assert!((LN_M_U_G - M_U_G.ln()).abs() <= 1e-15 * M_U_G.ln().abs());
    }
}
