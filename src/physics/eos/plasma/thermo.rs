//! The thermodynamic state at a solved psi: pressure, chi_rho, chi_T, c_P, nabla_ad, Gamma_1
//! and u by implicit differentiation of charge neutrality, and the specific entropy.

use super::ionisation::Grad;
use super::point::{AtPsi, Setup};
use super::{Plasma, Solved};
use crate::constants::{A_RAD_CGS, M_U_G};
use crate::error::PhysicsError;
use crate::physics::composition::{Composition, METAL_MEAN_MASS_NUMBER};
use crate::physics::eos::EosState;

impl Plasma {
    /// Specific entropy, erg g^-1 K^-1, of `state` (its rho, T and psi), with the zero of
    /// [`crate::physics::eos::EquationOfState::specific_entropy_erg_g_k`]: every species of this model as an
    /// ideal gas (`crate::physics::eos::entropy`), hydrogen atoms and ions (H I weight 2 w_H, H II 1), H2
    /// (weight Q_H2 w_H2, plus its rotation–vibration term d ln Q / d ln T), helium (He I w_He I,
    /// He II 2 w_He II, He III 1), the metal nuclei (with, in `molecular`, their donor and
    /// hydrogen-like electrons as two-stage sites), the electrons, radiation, and the Coulomb
    /// term (U_C - F_C)/T. These are the weights of the Saha and dissociation balances, so the
    /// balances minimise the free energy this entropy belongs to and (ds/dT)_rho = c_V / T.
    pub fn specific_entropy(
        &self,
        state: &EosState,
        comp: &Composition,
    ) -> Result<f64, PhysicsError> {
        let (rho, t, psi) = (
            state.density_g_cm3,
            state.temperature_k,
            state.degeneracy_psi,
        );
        self.check(rho, t)?;
        let setup = self.setup(rho, t, comp)?;
        let balance = self.balance(&setup, psi);
        self.entropy_at(&AtPsi::new(&setup, psi, &balance), comp)
    }

    /// The entropy ([`Plasma::specific_entropy`]) at a solved psi.
    pub(super) fn entropy_at(&self, at: &AtPsi, comp: &Composition) -> Result<f64, PhysicsError> {
        let (setup, psi, stages, el) = (at.setup, at.psi, at.stages, at.el);
        use crate::physics::eos::entropy::{radiation, stage_mixing, translational, K_PER_MU};
        use crate::physics::eos::h2::H_ATOM_MASS_U;
        use std::f64::consts::LN_2;
        let (rho, t, inputs) = (setup.rho, setup.t, &setup.inputs);
        let ln_n_mu = (rho / M_U_G).ln();
        let z_ion = comp.z() / METAL_MEAN_MASS_NUMBER;
        let (sigma, he_0) = (stages.h_sigma, (1.0 - stages.he1 - stages.he2).max(0.0));
        let hydrogen = translational(stages.h_atoms, H_ATOM_MASS_U, ln_n_mu, t)
            + stages.h_atoms * stage_mixing(&[(1.0 - sigma, LN_2 + inputs.w_h.0), (sigma, 0.0)]);
        let helium = translational(inputs.y4, 4.0, ln_n_mu, t)
            + inputs.y4
                * stage_mixing(&[
                    (he_0, inputs.w_he1.0),
                    (stages.he1, LN_2 + inputs.w_he2.0),
                    (stages.he2, 0.0),
                ]);
        let metals = translational(z_ion, METAL_MEAN_MASS_NUMBER, ln_n_mu, t);
        let molecules = inputs.molecular_entropy_k(stages, ln_n_mu, t);
        // T S_e = (5/2) P_e V - N_e k T psi, per m_u: P_e m_u / (rho k T) = (2/3) q F_3/2 m_u / rho.
        let electrons =
            2.5 * (2.0 / 3.0) * setup.q * el.f_three_halves * M_U_G / rho - stages.n_e * psi;
        // (U_C - F_C) / T per gram, U_C = 3 P_C / rho.
        let coulomb = (3.0 * at.coulomb.pressure - at.coulomb.free_energy_density) / (rho * t);
        let s = K_PER_MU * (hydrogen + helium + metals + molecules + electrons)
            + radiation(rho, t)
            + coulomb;
        if s.is_finite() {
            Ok(s)
        } else {
            Err(self.error("entropy not finite", rho, t))
        }
    }

    /// The full state at a solved psi, with the analytic derivatives, and the entropy if
    /// `with_entropy`.
    pub(super) fn finish(
        &self,
        at: &AtPsi,
        comp: &Composition,
        with_entropy: bool,
    ) -> Result<Solved, PhysicsError> {
        let (setup, psi, stages, el) = (at.setup, at.psi, at.stages, at.el);
        let Setup { rho, t, kt, q, .. } = *setup;
        let coul = at.coulomb;
        // Implicit derivatives of psi from G = ln F_1/2 + ln q(T) - ln(rho/m_u) - ln N_e = 0.
        let dln_ne = Grad {
            psi: stages.d_n_e.psi / stages.n_e,
            ln_t: stages.d_n_e.ln_t / stages.n_e,
            ln_rho: stages.d_n_e.ln_rho / stages.n_e,
        };
        let g_psi = el.slope_half - dln_ne.psi;
        let psi_t = -(1.5 - dln_ne.ln_t) / g_psi;
        let psi_rho = -(-1.0 - dln_ne.ln_rho) / g_psi;

        let p_e = q * kt * (2.0 / 3.0) * el.f_three_halves;
        let p_ion = rho / M_U_G * stages.n_p * kt;
        let p_rad = A_RAD_CGS * t.powi(4) / 3.0;
        let p_gas = p_e + p_ion + coul.pressure;
        let p = p_e + p_ion + p_rad + coul.pressure;
        // The Coulomb pressure is a function of (psi, T): its derivatives at fixed T and rho.
        let dpc_rho = coul.dp.0 * psi_rho;
        let dpc_t = coul.dp.1 + coul.dp.0 * psi_t;
        let dpe_t = 2.5 + el.slope_three_halves * psi_t;
        let dpe_rho = el.slope_three_halves * psi_rho;
        // d ln N_p along (ln T, ln rho) with psi following: 0 unless molecules form.
        let dpi_t = 1.0 + (stages.d_n_p.ln_t + psi_t * stages.d_n_p.psi) / stages.n_p;
        let dpi_rho = 1.0 + (stages.d_n_p.ln_rho + psi_rho * stages.d_n_p.psi) / stages.n_p;
        let chi_rho = (p_ion * dpi_rho + p_e * dpe_rho + dpc_rho) / p;
        let chi_t = (p_ion * dpi_t + p_e * dpe_t + 4.0 * p_rad + dpc_t) / p;
        let de_ion_t = stages.d_e_ion.ln_t + psi_t * stages.d_e_ion.psi;
        let cv = (1.5 * (p_ion * dpi_t + p_e * dpe_t) / rho
            + 4.0 * A_RAD_CGS * t.powi(4) / rho
            + de_ion_t / M_U_G
            + 3.0 * dpc_t / rho)
            / t;
        // Forms without cancellation when chi_rho -> 0 (radiation-dominated gas):
        // c_P - c_V = P chi_T^2 / (rho T chi_rho), Gamma_1 = chi_rho + P chi_T^2 / (rho T c_V),
        // nabla_ad = P chi_T / (rho T c_V chi_rho + P chi_T^2).
        let pt2 = p * chi_t * chi_t;
        let cp = cv + pt2 / (rho * t * chi_rho);
        let nabla_ad = p * chi_t / (rho * t * cv * chi_rho + pt2);
        let gamma1 = chi_rho + pt2 / (rho * t * cv);
        // u counted from the fully ionised plasma at rest (see EosState).
        let u = 1.5 * (p_ion + p_e) / rho
            + A_RAD_CGS * t.powi(4) / rho
            + (stages.e_ion - setup.inputs.ionised_energy()) / M_U_G
            + 3.0 * coul.pressure / rho;
        let state = EosState {
            density_g_cm3: rho,
            temperature_k: t,
            pressure_dyn_cm2: p,
            gas_pressure_dyn_cm2: p_gas,
            beta: p_gas / p,
            chi_rho,
            chi_t,
            nabla_ad,
            gamma1,
            cp_erg_g_k: cp,
            delta: chi_t / chi_rho,
            mu: 1.0 / (stages.n_p + stages.n_e),
            degeneracy_psi: psi,
            dpsi_dln_rho: psi_rho,
            dpsi_dln_t: psi_t,
            hydrogen_ionised: stages.x_h,
            helium_single: stages.he1,
            helium_double: stages.he2,
            specific_energy_erg_g: u,
        };
        let finite = [p, chi_rho, chi_t, cp, nabla_ad, gamma1]
            .iter()
            .all(|v| v.is_finite() && *v > 0.0);
        if !finite {
            return Err(self.error(
                "thermodynamic derivatives not finite and positive (unstable state)",
                rho,
                t,
            ));
        }
        let entropy_erg_g_k = if with_entropy {
            self.entropy_at(at, comp).ok()
        } else {
            None
        };
        Ok(Solved {
            state,
            dpsi_dlnrho: psi_rho,
            entropy_erg_g_k,
        })
    }
}
