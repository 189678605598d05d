//! `molecular`: the default equation of state of the `refined` set, for stars from the
//! hydrogen-burning limit up: the `refined` plasma plus H2 molecules, partly ionised metals and
//! the Coulomb correction of the ions.

use super::h2::{dissociation_with_ln, Dissociation, H_ATOM_MASS_U};
use super::plasma::CHI_H_EV;
use super::plasma::{plasma_law, Electrons, Grad, Ionisation, Plasma, StageInputs, Stages};
use crate::constants::{EV_ERG, K_B_ERG_K};
use crate::error::PhysicsError;
use crate::numerics::exponential::FastExp;
use crate::physics::composition::Composition;

/// Ionisation energy of the representative electron-donor metal, eV: magnesium, 7.646 eV (NIST,
/// memory), standing for Mg, Si and Fe (7.6–8.2 eV), which hold nine tenths of the low-ionisation
/// metal nuclei of the solar mixture.
pub const DONOR_CHI_EV: f64 = 7.646;
/// Fraction of the metal nuclei that are low-ionisation donors (Na, Mg, Al, Si, K, Ca, Fe, Ni),
/// by number: 1.1e-4 of 1.0e-3 metal nuclei per H nucleus in the solar mixture of Asplund et al.
/// (2009, ARA&A 47, 481; abundances from memory).
pub const DONOR_FRACTION: f64 = 0.11;
/// ln(g(Mg II) / g(Mg I)) = ln 2: the ground-state weights of the donor's two stages.
const LN_DONOR_WEIGHT_RATIO: f64 = std::f64::consts::LN_2;

/// H2 dissociation, H/He ionisation, metals that keep their electrons in cool gas, electrons of
/// any degeneracy, the ions' Coulomb term and radiation, in one free-energy model.
///
/// Built on the engine of `refined` ([`super::plasma`]: Saha ionisation written with the
/// electron degeneracy parameter psi, Fermi–Dirac electrons, hard-sphere pressure ionisation),
/// with three additions:
/// - **H2**: hydrogen nuclei are shared between H2, H I and H II with
///   n_H^2 / n_H2 = K(T) w_H^2 / w_H2 ([`super::h2`]: D0 = 4.478 eV, rigid-rotor and harmonic
///   oscillator Q_H2 with the constants of Huber & Herzberg 1979) and
///   n_H II / n_H I = exp(-psi - 13.598 eV / kT) / (2 w_H). The molecule's rotation–vibration
///   energy and its binding energy -D0 enter the internal energy, so c_P, nabla_ad and Gamma_1
///   carry the dissociation zone. w_H2 is the hard-sphere occupation probability of a particle
///   of twice the volume of H I, so that pressure destroys molecules before atoms.
/// - **Metals**: of the Z/16 metal nuclei per m_u (mean mass number 16), a fraction
///   [`DONOR_FRACTION`] are donors with one electron at [`DONOR_CHI_EV`] (Saha, statistical
///   weights 2/1, like Mg); the other metal electrons (7 per metal nucleus in all, as in the other
///   laws) are bound like hydrogen's, with its ionisation energy and occupation probability. So
///   the metals keep their electrons at 2000–6000 K, where the other laws ionise them fully
///   (about 1 per cent in mu).
/// - **Coulomb**: the ions' one-component-plasma free energy of Potekhin & Chabrier (2000) by
///   linear mixing, carried by the free electrons and minimised with the ionisation balance
///   ([`super::coulomb`]): it adds mu_C = kT (phi + u/3) to the electron chemical potential of
///   every Saha equation (ionising dense gas), lowers P by 0.5 per cent at the solar centre,
///   0.85 at the centre of a 0.3 M_sun star and 2.4–3.2 per cent at 0.1–0.08 M_sun, and
///   vanishes in neutral gas.
///
/// Everything follows from one free energy (ideal gases, the Coulomb term, and the occupation
/// probabilities in the equilibria), so P, chi_rho, chi_T, c_P, nabla_ad and Gamma_1 are
/// consistent with each other and with the internal energy
/// ([`MolecularEos::specific_energy_erg_g`]; tested against finite differences, including the
/// Maxwell relation (du/dln rho)_T = (P/rho)(1 - chi_T)). The exception, as in `refined`: the
/// pressure of the occupation-probability term is left out (including it consistently makes
/// the hard-sphere model thermodynamically unstable near 1 g/cm^3 and 1e4 K), so the Maxwell
/// relation is off by up to 5e-5 of P/rho in ionisation zones at 1e-4 g/cm^3, by up to several
/// P/rho where pressure ionisation acts with bound H or He left (7 P/rho at 0.56 g/cm^3 and
/// 2e4 K), and more in the cold dense gas of [`super::coulomb::TRANSITION_BOXES`].
///
/// Domain: 1e-15 <= rho <= 1e5 g/cm^3, 1e3 <= T <= 1e9 K (non-relativistic electrons; liquid
/// ions, no electron screening or exchange; no H2+, H- or H3+ in the balance), except the cold
/// dense gas of [`super::coulomb::TRANSITION_BOXES`] (below 1e5 K and between 0.15 and 400
/// g/cm^3), where the equilibrium is multi-valued and the law returns one solution or refuses.
/// Where the free electrons are strongly coupled but not degenerate or not dense (r_s > 1:
/// partly ionised hydrogen near 1e4–2e5 K and 0.05–4 g/cm^3, met in stars below about
/// 0.25 M_sun) the missing electron screening and exchange are as large as the Coulomb term.
/// Both say so ([`super::Plasma::caution`]).
#[derive(Debug, Clone, Copy, Default)]
pub struct MolecularEos;

pub(super) const ENGINE: Plasma = Plasma {
    law: "molecular",
    ionisation: Ionisation::Molecular,
    electrons: Electrons::FermiDirac,
    coulomb: true,
    rho_range_g_cm3: (1e-15, 1e5),
    temperature_range_k: (1e3, 1e9),
};

plasma_law!(MolecularEos, ENGINE);

impl MolecularEos {
    /// Specific internal energy u, erg g^-1, counted from the fully ionised plasma at rest (as
    /// [`super::EosState::specific_energy_erg_g`]): kinetic energy of ions and electrons,
    /// radiation, the energy of the bound electrons (minus their ionisation energies), of H2
    /// (minus D0, plus rotation and vibration), and the Coulomb term. With P it fixes every
    /// thermodynamic derivative; used to check them.
    pub fn specific_energy_erg_g(
        &self,
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<f64, PhysicsError> {
        ENGINE.specific_energy(rho_g_cm3, temperature_k, comp)
    }
}

/// The parts of [`StageInputs`] that only the molecular balance uses.
#[derive(Debug, Clone, Copy, Default)]
pub(super) struct MolecularInputs {
    /// ln kappa = ln(K w_H^2 / (w_H2 rho / m_u)): x_H^2 / x_H2 = kappa (per m_u).
    ln_kappa: f64,
    /// d ln kappa / d ln T and d ln kappa / d ln rho.
    dln_kappa: (f64, f64),
    /// Rotation–vibration energy minus D0 per molecule, erg, and its d/dln T.
    molecule_energy: (f64, f64),
    /// Donor nuclei per m_u, the donor's chi / kT, and exp(-shift) for the shift
    /// l_donor - l_H = ln 2 + ln(g ratio) + (chi_H - chi_d) / kT of the ln ratios.
    donors: f64,
    a_d: f64,
    donor_factor: f64,
    /// Metal electrons per m_u bound like hydrogen's.
    hydrogenic_sites: f64,
    /// Metal nuclei per m_u.
    z_ion: f64,
    /// ln w_H2, the occupation probability of H2.
    ln_w_h2: f64,
    /// ln Q_H2 and d ln Q_H2 / d ln T (for the entropy).
    ln_q: f64,
    dln_q: f64,
}

impl MolecularInputs {
    /// Inputs at (rho, T) from the parts at T alone `at_t`, for (metal nuclei, metal electrons)
    /// per m_u `metals`, ln(rho / m_u) `ln_n`, and the occupation probabilities (ln w,
    /// d ln w / d ln rho) of H I and H2.
    pub(super) fn new(
        at_t: &MolecularAtTemperature,
        metals: (f64, f64),
        ln_n: f64,
        w_h: (f64, f64),
        w_h2: (f64, f64),
    ) -> Self {
        let (z_ion, z_e) = metals;
        let d = &at_t.dissociation;
        let donors = DONOR_FRACTION * z_ion;
        Self {
            ln_kappa: d.ln_k_cm3 - ln_n + 2.0 * w_h.0 - w_h2.0,
            dln_kappa: (d.dln_k_dln_t, -1.0 + 2.0 * w_h.1 - w_h2.1),
            molecule_energy: at_t.molecule_energy,
            donors,
            a_d: at_t.a_d,
            donor_factor: at_t.donor_factor,
            hydrogenic_sites: (z_e - donors).max(0.0),
            z_ion,
            ln_w_h2: w_h2.0,
            ln_q: d.ln_q,
            dln_q: d.internal_energy_kt,
        }
    }

    /// Ionisation energy per m_u, erg, of the metal electrons this law binds (donors and
    /// hydrogen-like sites), all freed: their part of the zero of u.
    pub(super) fn ionised_energy(&self) -> f64 {
        (CHI_H_EV * self.hydrogenic_sites + DONOR_CHI_EV * self.donors) * EV_ERG
    }
}

/// The parts of [`MolecularInputs`] that depend on T alone (an inversion at fixed T computes
/// them once).
#[derive(Debug, Clone, Copy)]
pub(super) struct MolecularAtTemperature {
    dissociation: Dissociation,
    molecule_energy: (f64, f64),
    a_d: f64,
    donor_factor: f64,
}

impl MolecularAtTemperature {
    /// At temperature `t` with `ln_t` = ln T.
    pub(super) fn new(t: f64, ln_t: f64) -> Self {
        let d = dissociation_with_ln(t, ln_t);
        let kt = K_B_ERG_K * t;
        let d0 = super::h2::H2_DISSOCIATION_K * K_B_ERG_K;
        Self {
            dissociation: d,
            molecule_energy: (
                kt * d.internal_energy_kt - d0,
                kt * d.internal_heat_capacity_k,
            ),
            a_d: DONOR_CHI_EV * EV_ERG / kt,
            donor_factor: (-(LN_DONOR_WEIGHT_RATIO
                + std::f64::consts::LN_2
                + (CHI_H_EV - DONOR_CHI_EV) * EV_ERG / kt))
                .fast_exp(),
        }
    }
}

impl StageInputs {
    /// The entropy, in k per m_u, of what the molecular law adds to the plasma at `stages`:
    /// H2 molecules (mass 2 m_H, internal weight Q_H2 w_H2 and the term d ln Q / d ln T), the
    /// metals' donor sites (neutral weight w_H, ion 2) and hydrogen-like sites (bound 2 w_H,
    /// free 1); `ln_n_mu` = ln(rho / m_u). Zero in the other laws (no molecules, metals fully
    /// ionised).
    pub(super) fn molecular_entropy_k(&self, stages: &Stages, ln_n_mu: f64, t: f64) -> f64 {
        use super::entropy::{stage_mixing, translational};
        use std::f64::consts::LN_2;
        let m = &self.mol;
        let ln_w_h = self.w_h.0;
        let x_2 = 0.5 * (self.x - stages.h_atoms);
        let molecules = if x_2 > 0.0 {
            translational(x_2, 2.0 * H_ATOM_MASS_U, ln_n_mu, t)
                + x_2 * (m.ln_q + m.ln_w_h2 + m.dln_q)
        } else {
            0.0
        };
        let (s_d, sigma) = (stages.donor_ionised, stages.h_sigma);
        molecules
            + m.donors * stage_mixing(&[(1.0 - s_d, ln_w_h), (s_d, LN_2)])
            + m.hydrogenic_sites * stage_mixing(&[(1.0 - sigma, LN_2 + ln_w_h), (sigma, 0.0)])
    }

    /// H2 / H I / H II, He, donor metals and hydrogen-like metal electrons at `psi`.
    ///
    /// With sigma = n_H II / (n_H I + n_H II) and x_at = x_H I + x_H II (per m_u), hydrogen
    /// conservation x_at + 2 x_at^2 (1 - sigma)^2 / kappa = X gives
    /// x_at = 2X / (1 + sqrt(1 + 8 beta X)), beta = (1 - sigma)^2 / kappa, and
    /// dx_at = -(2 beta x_at^2 / (1 + 4 beta x_at)) d ln beta.
    pub(super) fn molecular(&self, psi: f64) -> Stages {
        let m = &self.mol;
        let x = self.x;
        let (l_h, dl_h) = self.hydrogen_ratio(psi);
        // One exponential for hydrogen and the donors: e = exp(-l) (inf or 0 at the extremes,
        // where the forms below take their limits), sigma = 1/(1 + e),
        // ln(1 - sigma) = -ln(1 + 1/e).
        let e = (-l_h).fast_exp();
        let sigma = 1.0 / (1.0 + e);
        // Below beta = 1e-18, sqrt(1 + 8 beta X) rounds to 1: no molecules to this precision.
        // ln(1 - sigma) <= -max(l, 0) bounds ln beta without a logarithm.
        let negligible = |ln_beta: f64| ln_beta < -41.5;
        let (x_at, slope) = if negligible(-2.0 * l_h.max(0.0) - m.ln_kappa) {
            (x, 0.0)
        } else {
            let ln_beta = -2.0 * (1.0 / e).ln_1p() - m.ln_kappa;
            if negligible(ln_beta) {
                (x, 0.0)
            } else {
                let beta = ln_beta.fast_exp();
                let x_at = 2.0 * x / (1.0 + (1.0 + 8.0 * beta * x).sqrt());
                (x_at, 2.0 * beta * x_at * x_at / (1.0 + 4.0 * beta * x_at))
            }
        };
        // d ln beta = -2 sigma dl - d ln kappa; dx_at = -slope d ln beta.
        let dxat = |dl: f64, dlnk: f64| -slope * (-2.0 * sigma * dl - dlnk);
        let d_x_at = Grad {
            psi: dxat(dl_h.psi, 0.0),
            ln_t: dxat(dl_h.ln_t, m.dln_kappa.0),
            ln_rho: dxat(dl_h.ln_rho, m.dln_kappa.1),
        };
        let ds = sigma * (1.0 - sigma);
        let x_p = x_at * sigma;
        let d_x_p = |dxa: f64, dl: f64| sigma * dxa + x_at * ds * dl;
        let x_2 = 0.5 * (x - x_at);
        // Donors: ln(n+ / n0) = ln 2 - psi - chi_d / kT - ln w_H = l_h + shift.
        let s_d = 1.0 / (1.0 + e * m.donor_factor);
        let ds_d = s_d * (1.0 - s_d);
        let he = self.helium(psi);
        let chi_h = CHI_H_EV * EV_ERG;
        let chi_d = DONOR_CHI_EV * EV_ERG;
        let (e_mol, de_mol) = m.molecule_energy;
        let grad = |dxa: f64, dl: f64, dld: f64| {
            let dxp = d_x_p(dxa, dl);
            let ds_h = ds * dl;
            let n_e = dxp + m.donors * ds_d * dld + m.hydrogenic_sites * ds_h;
            let e = chi_h * (dxp + m.hydrogenic_sites * ds_h) + chi_d * m.donors * ds_d * dld
                - 0.5 * e_mol * dxa;
            (n_e, 0.5 * dxa, e)
        };
        let (ne_psi, np_psi, e_psi) = grad(d_x_at.psi, dl_h.psi, -1.0);
        let (ne_t, np_t, e_t) = grad(d_x_at.ln_t, dl_h.ln_t, m.a_d);
        let (ne_rho, np_rho, e_rho) = grad(d_x_at.ln_rho, dl_h.ln_rho, -self.w_h.1);
        Stages {
            x_h: if x > 0.0 { x_p / x } else { sigma },
            h_atoms: x_at,
            h_sigma: sigma,
            donor_ionised: s_d,
            he1: he.he1,
            he2: he.he2,
            n_e: x_p + he.n_e + m.donors * s_d + m.hydrogenic_sites * sigma,
            d_n_e: Grad {
                psi: ne_psi + he.d_n_e.psi,
                ln_t: ne_t + he.d_n_e.ln_t,
                ln_rho: ne_rho + he.d_n_e.ln_rho,
            },
            n_p: x - x_2 + self.y4 + m.z_ion,
            d_n_p: Grad {
                psi: np_psi,
                ln_t: np_t,
                ln_rho: np_rho,
            },
            e_ion: chi_h * (x_p + m.hydrogenic_sites * sigma)
                + chi_d * m.donors * s_d
                + x_2 * e_mol
                + he.e_ion,
            d_e_ion: Grad {
                psi: e_psi + he.d_e_ion.psi,
                ln_t: e_t + x_2 * de_mol + he.d_e_ion.ln_t,
                ln_rho: e_rho + he.d_e_ion.ln_rho,
            },
        }
    }
}
