//! The ionisation balance at one psi: the Saha stages of H and He with pressure ionisation
//! (occupation probabilities), or full ionisation, with the derivatives of the electron and
//! particle numbers and of the ionisation energy.

use super::{BOHR_RADIUS_CM, CHI_HE1_EV, CHI_HE2_EV, CHI_H_EV};
use crate::constants::EV_ERG;
use crate::numerics::exponential::FastExp;
use crate::physics::eos::molecular::MolecularInputs;

/// Derivatives of one quantity with respect to (psi, ln T, ln rho).
#[derive(Debug, Clone, Copy, Default)]
pub(in crate::physics::eos) struct Grad {
    pub(in crate::physics::eos) psi: f64,
    pub(in crate::physics::eos) ln_t: f64,
    pub(in crate::physics::eos) ln_rho: f64,
}

/// Ionisation stages at one (psi, T, rho) with the derivatives of N_e, N_p and E_ion.
#[derive(Debug, Clone, Copy)]
pub(in crate::physics::eos) struct Stages {
    /// Fraction of all hydrogen nuclei that is H II.
    pub(in crate::physics::eos) x_h: f64,
    /// Hydrogen nuclei per m_u in atoms and ions (X less those in H2).
    pub(in crate::physics::eos) h_atoms: f64,
    /// H II / (H I + H II).
    pub(in crate::physics::eos) h_sigma: f64,
    /// Fraction of the donor metals ionised ([`super::Ionisation::Molecular`] only; else 0).
    pub(in crate::physics::eos) donor_ionised: f64,
    pub(in crate::physics::eos) he1: f64,
    pub(in crate::physics::eos) he2: f64,
    /// Free electrons per m_u.
    pub(in crate::physics::eos) n_e: f64,
    pub(in crate::physics::eos) d_n_e: Grad,
    /// Heavy particles (atoms, ions, molecules) per m_u.
    pub(in crate::physics::eos) n_p: f64,
    pub(in crate::physics::eos) d_n_p: Grad,
    /// Ionisation and dissociation energy (plus molecular internal energy) per m_u, erg,
    /// counted from neutral atoms at rest.
    pub(in crate::physics::eos) e_ion: f64,
    pub(in crate::physics::eos) d_e_ion: Grad,
}

/// (4 pi / 3) (2 a_0 / Z_eff)^3, the hard-sphere volume of a bound species, cm^3.
pub(super) fn pressure_volume(z_eff: f64) -> f64 {
    let r = 2.0 * BOHR_RADIUS_CM / z_eff;
    4.0 / 3.0 * std::f64::consts::PI * r * r * r
}

/// ln w and d ln w / d ln rho for the pressure-ionisation parameter s (proportional to rho):
/// ln w = -s exp(min(s, 15)).
pub(super) fn occupation(s: f64) -> (f64, f64) {
    if s < 1e-5 {
        // e^s = 1 + s + s^2/2 to 2e-16 relative.
        let e = 1.0 + s * (1.0 + 0.5 * s);
        (-s * e, -s * (1.0 + s) * e)
    } else if s < 15.0 {
        let e = s.fast_exp();
        (-s * e, -s * (1.0 + s) * e)
    } else {
        let e = 15f64.fast_exp();
        (-s * e, -s * e)
    }
}

/// Everything the ionisation balance needs apart from psi.
#[derive(Debug, Clone, Copy)]
pub(in crate::physics::eos) struct StageInputs {
    pub(in crate::physics::eos) x: f64,
    pub(in crate::physics::eos) y4: f64,
    pub(in crate::physics::eos) z_e: f64,
    /// Nuclei per m_u.
    pub(in crate::physics::eos) n_ion: f64,
    pub(in crate::physics::eos) a_h: f64,
    pub(in crate::physics::eos) a_1: f64,
    pub(in crate::physics::eos) a_2: f64,
    /// (ln w, d ln w / d ln rho) of H I, He I, He II.
    pub(in crate::physics::eos) w_h: (f64, f64),
    pub(in crate::physics::eos) w_he1: (f64, f64),
    pub(in crate::physics::eos) w_he2: (f64, f64),
    /// Molecules and metals ([`super::Ionisation::Molecular`] only).
    pub(in crate::physics::eos) mol: MolecularInputs,
}

/// Helium stages at one psi: fractions He II and He III, electrons per m_u and ionisation
/// energy per m_u (erg) with their derivatives.
pub(in crate::physics::eos) struct HeliumStages {
    pub(in crate::physics::eos) he1: f64,
    pub(in crate::physics::eos) he2: f64,
    pub(in crate::physics::eos) n_e: f64,
    pub(in crate::physics::eos) d_n_e: Grad,
    pub(in crate::physics::eos) e_ion: f64,
    pub(in crate::physics::eos) d_e_ion: Grad,
}

impl StageInputs {
    /// Ionisation energy per m_u, erg, of the fully ionised mixture (every electron this law
    /// can bind, freed), counted like [`Stages::e_ion`] from neutral atoms: the zero of u.
    pub(in crate::physics::eos) fn ionised_energy(&self) -> f64 {
        (self.x * CHI_H_EV + self.y4 * (CHI_HE1_EV + CHI_HE2_EV)) * EV_ERG
            + self.mol.ionised_energy()
    }

    pub(super) fn full(&self) -> Stages {
        Stages {
            x_h: 1.0,
            h_atoms: self.x,
            h_sigma: 1.0,
            donor_ionised: 0.0,
            he1: 0.0,
            he2: 1.0,
            n_e: self.x + 2.0 * self.y4 + self.z_e,
            d_n_e: Grad::default(),
            n_p: self.n_ion,
            d_n_p: Grad::default(),
            e_ion: self.ionised_energy(),
            d_e_ion: Grad::default(),
        }
    }

    /// ln(n_(H II) / n_(H I)) at `psi` and its gradient.
    pub(in crate::physics::eos) fn hydrogen_ratio(&self, psi: f64) -> (f64, Grad) {
        (
            -std::f64::consts::LN_2 - psi - self.a_h - self.w_h.0,
            Grad {
                psi: -1.0,
                ln_t: self.a_h,
                ln_rho: -self.w_h.1,
            },
        )
    }

    /// Helium stages at `psi` with derivatives; stable for any size of the ln ratios.
    pub(in crate::physics::eos) fn helium(&self, psi: f64) -> HeliumStages {
        use std::f64::consts::LN_2;
        // ln(n_upper / n_lower) for He I -> II, He II -> III.
        let l_1 = LN_2 - psi - self.a_1 - self.w_he1.0 + self.w_he2.0;
        let l_2 = -LN_2 - psi - self.a_2 - self.w_he2.0;
        // Derivatives of the ln ratios: d/dpsi = -1; d/dlnT = chi/kT; d/dln rho from the w terms.
        let dl_1 = Grad {
            psi: -1.0,
            ln_t: self.a_1,
            ln_rho: -self.w_he1.1 + self.w_he2.1,
        };
        let dl_2 = Grad {
            psi: -1.0,
            ln_t: self.a_2,
            ln_rho: -self.w_he2.1,
        };
        // Weights exp(L_k) with L_0 = 0, L_1 = l_1, L_2 = l_1 + l_2.
        let big_l2 = l_1 + l_2;
        let m = 0.0f64.max(l_1).max(big_l2);
        // The largest weight is exp(0) = 1: two exponentials instead of three.
        let weight = |l: f64| if l == m { 1.0 } else { (l - m).fast_exp() };
        let (w0, w1, w2) = (weight(0.0), weight(l_1), weight(big_l2));
        let sum = w0 + w1 + w2;
        let (f1, f2) = (w1 / sum, w2 / sum);
        let chi_1 = CHI_HE1_EV * EV_ERG;
        let chi_12 = (CHI_HE1_EV + CHI_HE2_EV) * EV_ERG;
        let grad = |sel: fn(&Grad) -> f64| {
            let d_l1 = sel(&dl_1);
            let d_l2 = d_l1 + sel(&dl_2);
            let mean = f1 * d_l1 + f2 * d_l2;
            let dn_he = f1 * (d_l1 - mean) + 2.0 * f2 * (d_l2 - mean);
            let de_he = f1 * chi_1 * (d_l1 - mean) + f2 * chi_12 * (d_l2 - mean);
            (self.y4 * dn_he, self.y4 * de_he)
        };
        let (n_psi, e_psi) = grad(|g| g.psi);
        let (n_t, e_t) = grad(|g| g.ln_t);
        let (n_rho, e_rho) = grad(|g| g.ln_rho);
        HeliumStages {
            he1: f1,
            he2: f2,
            n_e: self.y4 * (f1 + 2.0 * f2),
            d_n_e: Grad {
                psi: n_psi,
                ln_t: n_t,
                ln_rho: n_rho,
            },
            e_ion: self.y4 * (f1 * chi_1 + f2 * chi_12),
            d_e_ion: Grad {
                psi: e_psi,
                ln_t: e_t,
                ln_rho: e_rho,
            },
        }
    }

    /// Saha stages at `psi` with derivatives; stable for any size of the ln ratios.
    pub(super) fn saha(&self, psi: f64) -> Stages {
        let (l_h, dl_h) = self.hydrogen_ratio(psi);
        let x_h = 1.0 / (1.0 + (-l_h).fast_exp());
        let he = self.helium(psi);
        let chi_h = CHI_H_EV * EV_ERG;
        let dxh = |d: f64| x_h * (1.0 - x_h) * d;
        Stages {
            x_h,
            h_atoms: self.x,
            h_sigma: x_h,
            donor_ionised: 0.0,
            he1: he.he1,
            he2: he.he2,
            n_e: self.x * x_h + he.n_e + self.z_e,
            d_n_e: Grad {
                psi: self.x * dxh(dl_h.psi) + he.d_n_e.psi,
                ln_t: self.x * dxh(dl_h.ln_t) + he.d_n_e.ln_t,
                ln_rho: self.x * dxh(dl_h.ln_rho) + he.d_n_e.ln_rho,
            },
            n_p: self.n_ion,
            d_n_p: Grad::default(),
            e_ion: self.x * chi_h * x_h + he.e_ion,
            d_e_ion: Grad {
                psi: self.x * chi_h * dxh(dl_h.psi) + he.d_e_ion.psi,
                ln_t: self.x * chi_h * dxh(dl_h.ln_t) + he.d_e_ion.ln_t,
                ln_rho: self.x * chi_h * dxh(dl_h.ln_rho) + he.d_e_ion.ln_rho,
            },
        }
    }
}
