//! The shared engine of the `saha`, `degenerate`, `refined` and `molecular` equations of state
//! (the last adds molecules, metals and a Coulomb term, see [`super::molecular`]): a mixture of
//! hydrogen, helium and metals with (optionally) Saha ionisation of H and He and electrons of
//! (optionally) arbitrary degeneracy, plus radiation. Each law is one switch setting of this
//! engine; see [`super::SahaGas`], [`super::DegenerateGas`] and [`super::RefinedEos`].
//!
//! # Model
//! Per atomic mass unit the mixture holds X hydrogen nuclei, Y/4 helium nuclei and Z/16 metal
//! nuclei (mean mass number 16, as in [`crate::physics::composition`]). The metals are always
//! fully ionised and give Z (1/2 - 1/16) electrons per m_u, so that ions plus electrons of a
//! fully ionised mixture number exactly 2X + 3Y/4 + Z/2 per m_u, as in
//! [`Composition::mu`](crate::physics::composition::Composition::mu).
//!
//! Electron chemical equilibrium for every ionisation stage (the Saha equation written with the
//! electron degeneracy parameter psi = mu_e / kT, valid at any degeneracy; e.g. Cox & Giuli 1968,
//! ch. 15):
//! n_(i+1) / n_i = (g_(i+1) w_(i+1) / (g_i w_i)) exp(-psi - chi_i / kT),
//! with ionisation energies chi = 13.598 eV (H I), 24.587 eV (He I), 54.418 eV (He II) (NIST
//! atomic spectra database values, rounded) and ground-state statistical weights only:
//! g(H I) = 2, g(H II) = 1, g(He I) = 1, g(He II) = 2, g(He III) = 1 (the partition function of
//! each bound species is truncated at its ground state). In the classical limit
//! exp(psi) = n_e lambda^3 / 2 and this is the textbook Saha equation.
//!
//! Pressure ionisation: each bound species i carries an occupation probability w_i with
//! ln w_i = -s_i exp(min(s_i, 15)), s_i = (4 pi / 3) n_nuc (2 r_i)^3, r_i = a_0 / Z_eff
//! (H I: Z_eff = 1; He I: 27/16, the variational value; He II: 2) and n_nuc the number density
//! of all nuclei. For s_i << 1 this is the hard-sphere term of Hummer & Mihalas (1988, ApJ 331,
//! 794); the exponential steepening (a choice of this project) makes the destruction of bound
//! states win over the electron Fermi energy in cold dense matter, so that degenerate matter is
//! fully ionised at any temperature. It is negligible (w > 0.999) below 1e-4 g/cm^3 and ionises
//! hydrogen above about 1 g/cm^3. Its free-energy term is not added to P, a small
//! inconsistency confined to the pressure-ionisation regime.
//!
//! Electrons: n_e = (4 / sqrt(pi)) (2 pi m_e k T / h^2)^(3/2) F_1/2(psi) and
//! P_e = (2/3) (4 / sqrt(pi)) (2 pi m_e k T / h^2)^(3/2) k T F_3/2(psi) (non-relativistic), or
//! their classical limits F_j -> Gamma(j+1) e^psi. Ions are an ideal gas, P_ion = n_nuc k T;
//! radiation P_rad = a T^4 / 3. Coulomb corrections are not included.
//!
//! psi solves charge neutrality n_e(psi) = (rho / m_u) N_e(psi), a monotone equation in psi
//! (the left side increases, the right side decreases with psi), by safeguarded Newton iteration
//! inside a bracket whose upper end is the fully ionised solution.
//!
//! Derivatives are analytic: d psi / d ln rho and d psi / d ln T by implicit differentiation of
//! the neutrality equation, then chi_rho, chi_T and c_V = (du/dT)_rho with the specific energy
//! u = (3/2)(P_ion + P_e)/rho + a T^4/rho + E_ion / m_u, and c_P = c_V + (P/(rho T)) chi_T^2 /
//! chi_rho, nabla_ad = P chi_T / (rho T c_P chi_rho), Gamma_1 = chi_rho c_P / c_V
//! (Kippenhahn & Weigert 1990, §13–14), evaluated in forms free of cancellation.

use super::coulomb::{
    coulomb_free_energy, CoulombAtTemperature, CoulombTerm, IonSpecies, Z53_HELIUM, Z53_METALS,
};
use super::fermi_dirac::{inverse_guess, inverse_upper_bound, ln_fermi_dirac};
use super::molecular::{MolecularAtTemperature, MolecularInputs};
use super::EosState;
use crate::constants::{A_RAD_CGS, EV_ERG, H_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use crate::error::PhysicsError;
use crate::physics::composition::{Composition, METAL_MEAN_MASS_NUMBER};

/// Ionisation energy of H I, eV (NIST, rounded).
pub const CHI_H_EV: f64 = 13.598;
/// First ionisation energy of He, eV (NIST, rounded).
pub const CHI_HE1_EV: f64 = 24.587;
/// Second ionisation energy of He, eV (NIST, rounded).
pub const CHI_HE2_EV: f64 = 54.418;
/// Bohr radius a_0, cm (CODATA 2018).
pub const BOHR_RADIUS_CM: f64 = 5.291_772_109e-9;

const SQRT_PI: f64 = 1.772_453_850_905_516;
/// ln Gamma(3/2) = ln(sqrt(pi) / 2).
const LN_GAMMA_THREE_HALVES: f64 = -0.120_782_237_635_245_2;

/// How the H and He ionisation stages are found.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Ionisation {
    /// Saha equilibrium with pressure ionisation (see the module documentation).
    Saha,
    /// Everything fully ionised.
    Full,
    /// Saha equilibrium as [`Ionisation::Saha`], plus H2 molecules and partly ionised metals
    /// (see [`super::molecular`]).
    Molecular,
}

/// How the free electrons are described.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Electrons {
    /// Maxwell–Boltzmann electrons (F_j replaced by Gamma(j+1) e^psi).
    Classical,
    /// Non-relativistic electrons of arbitrary degeneracy (Fermi–Dirac integrals).
    FermiDirac,
}

/// One configuration of the engine with its domain of validity.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Plasma {
    /// Law name for errors.
    pub law: &'static str,
    /// Ionisation treatment.
    pub ionisation: Ionisation,
    /// Electron treatment.
    pub electrons: Electrons,
    /// Whether the ions carry the Coulomb correction of [`super::coulomb`].
    pub coulomb: bool,
    /// Smallest and largest density accepted, g cm^-3.
    pub rho_range_g_cm3: (f64, f64),
    /// Smallest and largest temperature accepted, K.
    pub temperature_range_k: (f64, f64),
}

/// Electron coupling Gamma_e = e^2 / (a_e k T) above which the non-ideal terms matter: 1 (e.g.
/// Chabrier & Potekhin 1998, PRE 58, 4941: the plasma is strongly coupled from Gamma ~ 1;
/// docs/references.md §8.2). Gamma_e = 2.2747e5 (rho Y_e)^(1/3) / T (computed there).
pub const STRONG_COUPLING_GAMMA_E: f64 = 1.0;

impl Plasma {
    /// Where this engine's laws are used beyond what they describe well: strong electron
    /// coupling (Gamma_e > [`STRONG_COUPLING_GAMMA_E`]), which a law without the Coulomb term
    /// neglects, and which the Coulomb term meets only in its switch-on range
    /// ([`super::coulomb::COULOMB_T_OFF_K`] to [`super::coulomb::COULOMB_T_ON_K`]), where
    /// `molecular` is least certain.
    pub fn caution(&self, rho: f64, t: f64, comp: &Composition) -> Option<&'static str> {
        let gamma_e = 2.2747e5 * (rho / comp.mu_e()).cbrt() / t;
        if gamma_e <= STRONG_COUPLING_GAMMA_E {
            return None;
        }
        if !self.coulomb {
            Some("strongly coupled plasma (Gamma_e > 1): Coulomb (non-ideal) terms neglected")
        } else if t > super::coulomb::COULOMB_T_OFF_K && t < super::coulomb::COULOMB_T_ON_K {
            Some("strongly coupled plasma (Gamma_e > 1) where the Coulomb term is only partly switched on (1e5-2.5e6 K)")
        } else {
            None
        }
    }
}

/// A state together with d psi / d ln rho (used to warm-start the inversion) and, when asked
/// for, its specific entropy.
#[derive(Debug, Clone, Copy)]
pub struct Solved {
    /// The state.
    pub state: EosState,
    /// d psi / d ln rho at fixed T.
    pub dpsi_dlnrho: f64,
    /// Specific entropy, erg g^-1 K^-1 ([`Plasma::specific_entropy`]), if asked for.
    pub entropy_erg_g_k: Option<f64>,
}

/// Everything at one (rho, T) that does not depend on psi.
#[derive(Debug, Clone, Copy)]
struct Setup {
    rho: f64,
    t: f64,
    kt: f64,
    /// n_e = q F_1/2(psi).
    q: f64,
    ln_q_over_n: f64,
    psi_full: f64,
    psi_max: f64,
    inputs: StageInputs,
    /// The Coulomb term (zero unless the law has it; pressure terms only).
    coulomb: CoulombTerm,
    /// The parts that depend on T alone.
    per_t: PerTemperature,
}

/// The parts of a [`Setup`] that depend on T alone.
#[derive(Debug, Clone, Copy)]
struct PerTemperature {
    molecular: Option<MolecularAtTemperature>,
    coulomb: Option<CoulombAtTemperature>,
    /// ln q, n_e = q F_1/2(psi).
    ln_q: f64,
}

/// The balance evaluated at one psi: what the state and the entropy are read from.
#[derive(Clone, Copy)]
struct AtPsi<'a> {
    setup: &'a Setup,
    psi: f64,
    stages: &'a Stages,
    el: &'a ElectronIntegrals,
}

impl<'a> AtPsi<'a> {
    fn new(setup: &'a Setup, psi: f64, stages: &'a Stages, el: &'a ElectronIntegrals) -> Self {
        Self {
            setup,
            psi,
            stages,
            el,
        }
    }
}

/// Derivatives of one quantity with respect to (psi, ln T, ln rho).
#[derive(Debug, Clone, Copy, Default)]
pub(super) struct Grad {
    pub(super) psi: f64,
    pub(super) ln_t: f64,
    pub(super) ln_rho: f64,
}

/// Ionisation stages at one (psi, T, rho) with the derivatives of N_e, N_p and E_ion.
#[derive(Debug, Clone, Copy)]
pub(super) struct Stages {
    /// Fraction of all hydrogen nuclei that is H II.
    pub(super) x_h: f64,
    /// Hydrogen nuclei per m_u in atoms and ions (X less those in H2).
    pub(super) h_atoms: f64,
    /// H II / (H I + H II).
    pub(super) h_sigma: f64,
    /// Fraction of the donor metals ionised ([`Ionisation::Molecular`] only; else 0).
    pub(super) donor_ionised: f64,
    pub(super) he1: f64,
    pub(super) he2: f64,
    /// Free electrons per m_u.
    pub(super) n_e: f64,
    pub(super) d_n_e: Grad,
    /// Heavy particles (atoms, ions, molecules) per m_u.
    pub(super) n_p: f64,
    pub(super) d_n_p: Grad,
    /// Ionisation and dissociation energy (plus molecular internal energy) per m_u, erg,
    /// counted from neutral atoms at rest.
    pub(super) e_ion: f64,
    pub(super) d_e_ion: Grad,
}

/// Electron quantities at one psi: ln F_1/2, its psi-slope, F_3/2 and its psi-slope.
#[derive(Debug, Clone, Copy)]
struct ElectronIntegrals {
    ln_f_half: f64,
    slope_half: f64,
    f_three_halves: f64,
    slope_three_halves: f64,
}

impl Plasma {
    fn integrals(&self, psi: f64) -> ElectronIntegrals {
        match self.electrons {
            Electrons::Classical => ElectronIntegrals {
                ln_f_half: psi + LN_GAMMA_THREE_HALVES,
                slope_half: 1.0,
                f_three_halves: 0.75 * SQRT_PI * psi.exp(),
                slope_three_halves: 1.0,
            },
            Electrons::FermiDirac => {
                let [ln_m, ln_h, ln_3] = ln_fermi_dirac(psi);
                ElectronIntegrals {
                    ln_f_half: ln_h,
                    slope_half: 0.5 * (ln_m - ln_h).exp(),
                    f_three_halves: ln_3.exp(),
                    slope_three_halves: 1.5 * (ln_h - ln_3).exp(),
                }
            }
        }
    }

    /// (first guess, rigorous upper bound) of the psi at which F_1/2 (or its classical limit)
    /// equals `f_half`; `None` unless `f_half` is finite and positive.
    fn psi_start(&self, f_half: f64) -> Option<(f64, f64)> {
        if !(f_half > 0.0 && f_half.is_finite()) {
            return None;
        }
        Some(match self.electrons {
            Electrons::Classical => {
                let exact = f_half.ln() - LN_GAMMA_THREE_HALVES;
                (exact, exact)
            }
            Electrons::FermiDirac if f_half < 0.4 => {
                // Non-degenerate: one logarithm for both (same bounds as the general case).
                let ln_u = f_half.ln() - LN_GAMMA_THREE_HALVES;
                let hi = ln_u + std::f64::consts::LN_2;
                (
                    (ln_u + f_half / (0.5 * SQRT_PI) * 0.353_553_390_593_273_7).min(hi),
                    hi,
                )
            }
            Electrons::FermiDirac => {
                let hi = inverse_upper_bound(f_half);
                (inverse_guess(f_half).min(hi), hi)
            }
        })
    }

    fn error(&self, reason: impl Into<String>, rho: f64, t: f64) -> PhysicsError {
        PhysicsError::new(self.law, reason, rho, t)
    }

    /// Check (rho, T) against the law's domain.
    pub fn check(&self, rho: f64, t: f64) -> Result<(), PhysicsError> {
        let (rlo, rhi) = self.rho_range_g_cm3;
        let (tlo, thi) = self.temperature_range_k;
        if !(rho.is_finite() && t.is_finite() && (rlo..=rhi).contains(&rho)) {
            return Err(self.error(
                format!("density outside the law's domain {rlo:e}..{rhi:e} g/cm^3"),
                rho,
                t,
            ));
        }
        if !(tlo..=thi).contains(&t) {
            return Err(self.error(
                format!("temperature outside the law's domain {tlo:e}..{thi:e} K"),
                rho,
                t,
            ));
        }
        Ok(())
    }

    /// Everything at (rho, T) that does not depend on psi.
    fn setup(&self, rho: f64, t: f64, comp: &Composition) -> Result<Setup, PhysicsError> {
        self.setup_with(rho, t, comp, &self.per_temperature(t, comp))
    }

    /// What this law computes from T alone (an inversion at fixed T does it once).
    fn per_temperature(&self, t: f64, comp: &Composition) -> PerTemperature {
        PerTemperature {
            molecular: (self.ionisation == Ionisation::Molecular)
                .then(|| MolecularAtTemperature::new(t)),
            ln_q: (Self::electron_density_coefficient() * t * t.sqrt()).ln(),
            coulomb: if self.coulomb {
                CoulombAtTemperature::new(t, Self::electrons_fully_ionised(comp))
            } else {
                None
            },
        }
    }

    /// c_n in n_e = c_n T^(3/2) F_1/2(psi): (4 / sqrt(pi)) (2 pi m_e k / h^2)^(3/2), cgs.
    fn electron_density_coefficient() -> f64 {
        let thermal = 2.0 * std::f64::consts::PI * M_E_G * K_B_ERG_K / (H_ERG_S * H_ERG_S);
        4.0 / SQRT_PI * thermal * thermal.sqrt()
    }

    /// Electrons per m_u of the fully ionised mixture, X + Y/2 + Z (1/2 - 1/16).
    fn electrons_fully_ionised(comp: &Composition) -> f64 {
        comp.x() + 0.5 * comp.y() + comp.z() * (0.5 - 1.0 / METAL_MEAN_MASS_NUMBER)
    }

    /// The Coulomb term at `rho` from its temperature parts `at_t` (zero if the law has none or
    /// the switch is off); `energy` as in [`CoulombAtTemperature::term`].
    fn coulomb_at(
        rho: f64,
        comp: &Composition,
        at_t: Option<&CoulombAtTemperature>,
        energy: bool,
    ) -> CoulombTerm {
        at_t.map_or_else(CoulombTerm::default, |c| {
            c.term(rho, &Self::coulomb_ions(comp), energy)
        })
    }

    /// The ions of the Coulomb term: H+, He++ and metals of charge 7, per m_u, with Z^(5/3).
    fn coulomb_ions(comp: &Composition) -> IonSpecies {
        [
            (comp.x(), 1.0),
            (0.25 * comp.y(), Z53_HELIUM),
            (comp.z() / METAL_MEAN_MASS_NUMBER, Z53_METALS),
        ]
    }

    /// As [`Plasma::setup`], with the parts that depend on T alone given.
    fn setup_with(
        &self,
        rho: f64,
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
        let ln_n = (rho / M_U_G).ln();
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
        let coulomb = Self::coulomb_at(rho, comp, per_t.coulomb.as_ref(), false);
        Ok(Setup {
            rho,
            t,
            kt,
            q,
            ln_q_over_n,
            psi_full,
            psi_max,
            inputs,
            coulomb,
            per_t: *per_t,
        })
    }

    fn stages(&self, inputs: &StageInputs, psi: f64) -> Stages {
        match self.ionisation {
            Ionisation::Saha => inputs.saha(psi),
            Ionisation::Full => inputs.full(),
            Ionisation::Molecular => inputs.molecular(psi),
        }
    }

    /// The state at (rho, T); `psi_guess` may warm-start the neutrality solve.
    pub fn solve(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
        psi_guess: Option<f64>,
    ) -> Result<Solved, PhysicsError> {
        self.check(rho, t)?;
        let setup = self.setup(rho, t, comp)?;
        let guess = psi_guess
            .filter(|g| g.is_finite())
            .unwrap_or(setup.psi_full);
        let (psi, stages, el) = self.solve_neutrality(&setup, guess)?;
        self.finish(&AtPsi::new(&setup, psi, &stages, &el), comp, false)
    }

    /// Specific internal energy at (rho, T), erg g^-1, counted from the fully ionised plasma at
    /// rest (see [`EosState::specific_energy_erg_g`]):
    /// u = (3/2)(P_ion + P_e)/rho + a T^4/rho + (E_ion - E_ionised)/m_u + U_C.
    pub fn specific_energy(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<f64, PhysicsError> {
        Ok(self.solve(rho, t, comp, None)?.state.specific_energy_erg_g)
    }

    /// Specific entropy, erg g^-1 K^-1, of `state` (its rho, T and psi), with the zero of
    /// [`super::EquationOfState::specific_entropy_erg_g_k`]: every species of this model as an
    /// ideal gas ([`super::entropy`]), hydrogen atoms and ions (H I weight 2 w_H, H II 1), H2
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
        let stages = self.stages(&setup.inputs, psi);
        let el = self.integrals(psi);
        let u_c = Self::coulomb_at(rho, comp, setup.per_t.coulomb.as_ref(), true).energy;
        self.entropy_at(&AtPsi::new(&setup, psi, &stages, &el), comp, u_c)
    }

    /// The entropy ([`Plasma::specific_entropy`]) at a solved psi, with the Coulomb energy
    /// `u_c` (erg g^-1) there.
    fn entropy_at(&self, at: &AtPsi, comp: &Composition, u_c: f64) -> Result<f64, PhysicsError> {
        let (setup, psi, stages, el) = (at.setup, at.psi, at.stages, at.el);
        use super::entropy::{radiation, stage_mixing, translational, K_PER_MU};
        use super::h2::H_ATOM_MASS_U;
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
        let coulomb = if setup.per_t.coulomb.is_some() {
            let f_c = coulomb_free_energy(
                rho,
                t,
                &Self::coulomb_ions(comp),
                Self::electrons_fully_ionised(comp),
            );
            (u_c - f_c) / t
        } else {
            0.0
        };
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
    fn finish(
        &self,
        at: &AtPsi,
        comp: &Composition,
        with_entropy: bool,
    ) -> Result<Solved, PhysicsError> {
        let (setup, psi, stages, el) = (at.setup, at.psi, at.stages, at.el);
        let Setup { rho, t, kt, q, .. } = *setup;
        // The inversion carried the Coulomb pressure only; the energy terms are added here.
        let coul = &Self::coulomb_at(rho, comp, setup.per_t.coulomb.as_ref(), true);
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
        let dpe_t = 2.5 + el.slope_three_halves * psi_t;
        let dpe_rho = el.slope_three_halves * psi_rho;
        // d ln N_p along (ln T, ln rho) with psi following: 0 unless molecules form.
        let dpi_t = 1.0 + (stages.d_n_p.ln_t + psi_t * stages.d_n_p.psi) / stages.n_p;
        let dpi_rho = 1.0 + (stages.d_n_p.ln_rho + psi_rho * stages.d_n_p.psi) / stages.n_p;
        let chi_rho = (p_ion * dpi_rho + p_e * dpe_rho + coul.dp_dln_rho) / p;
        let chi_t = (p_ion * dpi_t + p_e * dpe_t + 4.0 * p_rad + coul.dp_dln_t) / p;
        let de_ion_t = stages.d_e_ion.ln_t + psi_t * stages.d_e_ion.psi;
        let cv = (1.5 * (p_ion * dpi_t + p_e * dpe_t) / rho
            + 4.0 * A_RAD_CGS * t.powi(4) / rho
            + de_ion_t / M_U_G
            + coul.de_dln_t)
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
            + coul.energy;
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
            self.entropy_at(at, comp, coul.energy).ok()
        } else {
            None
        };
        Ok(Solved {
            state,
            dpsi_dlnrho: psi_rho,
            entropy_erg_g_k,
        })
    }

    /// psi from charge neutrality G(psi) = ln F_1/2(psi) + ln q - ln(rho/m_u) - ln N_e(psi) = 0,
    /// G increasing: Newton steps kept inside the bracket (lo, hi], bisection or a downward
    /// search when a step would leave it. `psi_max` is a rigorous upper bound (G >= 0 there).
    fn solve_neutrality(
        &self,
        setup: &Setup,
        guess: f64,
    ) -> Result<(f64, Stages, ElectronIntegrals), PhysicsError> {
        let (inputs, ln_q_over_n, psi_max) = (&setup.inputs, setup.ln_q_over_n, setup.psi_max);
        let (rho, t) = (setup.rho, setup.t);
        let mut lo = f64::NEG_INFINITY;
        let mut hi = psi_max;
        let mut psi = guess.min(psi_max);
        for _ in 0..300 {
            let stages = self.stages(inputs, psi);
            let el = self.integrals(psi);
            let g = el.ln_f_half + ln_q_over_n - stages.n_e.ln();
            if g.abs() < 1e-12 {
                return Ok((psi, stages, el));
            }
            if g > 0.0 {
                hi = psi;
            } else {
                lo = psi;
            }
            let slope = el.slope_half - stages.d_n_e.psi / stages.n_e;
            let step = g / slope;
            if step.abs() < 1e-13 * (1.0 + psi.abs()) {
                return Ok((psi, stages, el));
            }
            let newton = psi - step;
            psi = if newton.is_finite() && newton > lo && newton < hi {
                newton
            } else if lo.is_finite() {
                0.5 * (lo + hi)
            } else {
                // No lower end yet: step down geometrically.
                psi - (2.0 * (hi - psi)).max(10.0)
            };
            if hi - lo < 1e-13 * (1.0 + psi.abs()) {
                return Ok((psi, self.stages(inputs, psi), self.integrals(psi)));
            }
        }
        Err(self.error("charge neutrality not solved in 300 iterations", rho, t))
    }

    /// The state at total pressure `p` and temperature `t`: first a joint Newton iteration on
    /// (ln rho, psi) from the fully ionised ideal gas; if that fails, Newton iteration in ln rho
    /// with the analytic chi_rho, kept inside a bracket and the law's density domain,
    /// warm-starting each neutrality solve from the previous psi.
    pub fn at_pressure(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<EosState, PhysicsError> {
        Ok(self.at_pressure_from(p, t, comp, None, false)?.state)
    }

    /// As [`Plasma::at_pressure`], with the joint iteration started from the state `near` of a
    /// nearby point: ln rho extrapolated with its chi_rho and chi_T, and its psi. Along an
    /// integration consecutive points are close, and the warm start saves most iterations; the
    /// converged state is the same to the iteration's tolerance (1e-12 in ln P and neutrality).
    pub fn at_pressure_near(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
        near: &EosState,
    ) -> Result<EosState, PhysicsError> {
        Ok(self
            .at_pressure_from(p, t, comp, Self::start_near(p, t, near), false)?
            .state)
    }

    /// As [`Plasma::at_pressure_near`] (from the fully ionised ideal gas without `near`),
    /// together with the state's specific entropy ([`Plasma::specific_entropy`]; `None` if it
    /// is not finite), computed on the inversion's last evaluation.
    pub fn at_pressure_with_entropy(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
        near: Option<&EosState>,
    ) -> Result<(EosState, Option<f64>), PhysicsError> {
        let start = near.and_then(|n| Self::start_near(p, t, n));
        let solved = self.at_pressure_from(p, t, comp, start, true)?;
        let entropy = solved
            .entropy_erg_g_k
            .or_else(|| self.specific_entropy(&solved.state, comp).ok());
        Ok((solved.state, entropy))
    }

    /// The joint iteration's start from the state `near` of a nearby point: ln rho extrapolated
    /// to (`p`, `t`) with its chi_rho and chi_T, and its psi.
    fn start_near(p: f64, t: f64, near: &EosState) -> Option<(f64, f64)> {
        (near.density_g_cm3 > 0.0 && near.chi_rho > 0.0 && near.degeneracy_psi.is_finite())
            .then(|| {
                let ln_rho = near.density_g_cm3.ln()
                    + ((p / near.pressure_dyn_cm2).ln()
                        - near.chi_t * (t / near.temperature_k).ln())
                        / near.chi_rho;
                (ln_rho, near.degeneracy_psi)
            })
            .filter(|(r, _)| r.is_finite())
    }

    /// The inversion, started at (ln rho, psi) = `start` if given, else from the fully ionised
    /// ideal gas; the entropy too if `with_entropy` (on the fast path; the caller computes it
    /// after the bracketed fallback). Inlined: its callers keep only the parts of the result
    /// they return, without copying the whole.
    #[inline]
    fn at_pressure_from(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
        start: Option<(f64, f64)>,
        with_entropy: bool,
    ) -> Result<Solved, PhysicsError> {
        if !(p.is_finite() && p > 0.0) {
            return Err(self.error(
                format!("pressure {p:e} dyn/cm^2 must be finite and positive"),
                f64::NAN,
                t,
            ));
        }
        self.check(self.rho_range_g_cm3.0, t)?;
        let p_rad = A_RAD_CGS * t.powi(4) / 3.0;
        if p <= p_rad {
            return Err(self.error(
                format!(
                    "pressure {p:.4e} dyn/cm^2 does not exceed the radiation pressure {p_rad:.4e}"
                ),
                f64::NAN,
                t,
            ));
        }
        let (rlo, rhi) = self.rho_range_g_cm3;
        let (mut lo, mut hi) = (rlo.ln(), rhi.ln());
        // Fully ionised ideal-gas start.
        let n_full = 2.0 * comp.x() + 0.75 * comp.y() + 0.5 * comp.z();
        let ideal = ((p - p_rad) * M_U_G / (K_B_ERG_K * t * n_full))
            .ln()
            .clamp(lo, hi);
        let ln_p = p.ln();
        if let Some((warm_rho, warm_psi)) = start {
            let warm = (warm_rho.clamp(lo, hi), Some(warm_psi));
            if let Some(solved) = self.joint_newton(ln_p, p_rad, t, comp, warm, with_entropy) {
                return Ok(solved);
            }
        }
        let mut ln_rho = ideal;
        if let Some(solved) = self.joint_newton(ln_p, p_rad, t, comp, (ln_rho, None), with_entropy)
        {
            return Ok(solved);
        }
        // Fallback: nested iteration, slower but bracketed.
        let mut psi_guess = None;
        for _ in 0..100 {
            let solved = self.solve(ln_rho.exp().clamp(rlo, rhi), t, comp, psi_guess)?;
            let s = solved.state;
            let f = s.pressure_dyn_cm2.ln() - ln_p;
            if f.abs() < 1e-12 {
                return Ok(solved);
            }
            if f > 0.0 {
                hi = ln_rho;
            } else {
                lo = ln_rho;
            }
            let newton = ln_rho - f / s.chi_rho.max(1e-6);
            let next = if newton > lo && newton < hi && (newton - ln_rho).abs() < 3.0 {
                newton
            } else if (hi - lo) < 6.0 {
                0.5 * (lo + hi)
            } else if f > 0.0 {
                (ln_rho - 3.0).max(lo + 0.5 * (ln_rho - lo).min(3.0))
            } else {
                (ln_rho + 3.0).min(hi - 0.5 * (hi - ln_rho).min(3.0))
            };
            if hi - lo < 1e-14 {
                break;
            }
            psi_guess = Some(s.degeneracy_psi + solved.dpsi_dlnrho * (next - ln_rho));
            ln_rho = next;
        }
        Err(self.error(
            format!(
                "no density in {rlo:e}..{rhi:e} g/cm^3 gives pressure {p:.4e} dyn/cm^2 at this temperature"
            ),
            f64::NAN,
            t,
        ))
    }
}

impl Plasma {
    /// Fast path of the inversion: Newton iteration on (ln rho, psi) together, solving
    /// ln P(rho, psi) = ln P_target and charge neutrality at once with the analytic 2x2 Jacobian
    /// (its determinant is positive: P and the neutrality residual both increase with psi and
    /// the residual falls with rho). Steps are limited to 2 in ln rho and 10 in psi. Returns
    /// `None` (and the caller falls back to the bracketed nested iteration) if it does not
    /// converge in 40 steps or leaves the density domain.
    fn joint_newton(
        &self,
        ln_p: f64,
        p_rad: f64,
        t: f64,
        comp: &Composition,
        (ln_rho_start, psi_start): (f64, Option<f64>),
        with_entropy: bool,
    ) -> Option<Solved> {
        let (rlo, rhi) = self.rho_range_g_cm3;
        let (llo, lhi) = (rlo.ln(), rhi.ln());
        let mut ln_rho = ln_rho_start;
        let mut psi: Option<f64> = psi_start;
        let mut at_edge = 0;
        let per_t = self.per_temperature(t, comp);
        for _ in 0..40 {
            let setup = self
                .setup_with(ln_rho.exp().clamp(rlo, rhi), t, comp, &per_t)
                .ok()?;
            let ps = psi.unwrap_or(setup.psi_full).min(setup.psi_max);
            let stages = self.stages(&setup.inputs, ps);
            let el = self.integrals(ps);
            let r2 = el.ln_f_half + setup.ln_q_over_n - stages.n_e.ln();
            let p_e = setup.q * setup.kt * (2.0 / 3.0) * el.f_three_halves;
            let p_ion = setup.rho / M_U_G * stages.n_p * setup.kt;
            let p_tot = p_e + p_ion + p_rad + setup.coulomb.pressure;
            let r1 = p_tot.ln() - ln_p;
            if r1.abs() < 1e-12 && r2.abs() < 1e-12 {
                return self
                    .finish(&AtPsi::new(&setup, ps, &stages, &el), comp, with_entropy)
                    .ok();
            }
            let a11 = (p_ion * (1.0 + stages.d_n_p.ln_rho / stages.n_p) + setup.coulomb.dp_dln_rho)
                / p_tot;
            let a12 = (p_e * el.slope_three_halves + p_ion * stages.d_n_p.psi / stages.n_p) / p_tot;
            let a21 = -1.0 - stages.d_n_e.ln_rho / stages.n_e;
            let a22 = el.slope_half - stages.d_n_e.psi / stages.n_e;
            let det = a11 * a22 - a12 * a21;
            if !(det.is_finite() && det > 0.0 && r1.is_finite() && r2.is_finite()) {
                return None;
            }
            let d_ln_rho = (r1 * a22 - a12 * r2) / det;
            let d_psi = (a11 * r2 - a21 * r1) / det;
            let scale = 1.0f64
                .min(2.0 / d_ln_rho.abs().max(1e-300))
                .min(10.0 / d_psi.abs().max(1e-300));
            ln_rho -= scale * d_ln_rho;
            psi = Some(ps - scale * d_psi);
            if ln_rho < llo || ln_rho > lhi {
                at_edge += 1;
                if at_edge > 2 {
                    return None;
                }
                ln_rho = ln_rho.clamp(llo, lhi);
            }
        }
        None
    }
}

/// (4 pi / 3) (2 a_0 / Z_eff)^3, the hard-sphere volume of a bound species, cm^3.
fn pressure_volume(z_eff: f64) -> f64 {
    let r = 2.0 * BOHR_RADIUS_CM / z_eff;
    4.0 / 3.0 * std::f64::consts::PI * r * r * r
}

/// ln w and d ln w / d ln rho for the pressure-ionisation parameter s (proportional to rho):
/// ln w = -s exp(min(s, 15)).
fn occupation(s: f64) -> (f64, f64) {
    if s < 1e-5 {
        // e^s = 1 + s + s^2/2 to 2e-16 relative.
        let e = 1.0 + s * (1.0 + 0.5 * s);
        (-s * e, -s * (1.0 + s) * e)
    } else if s < 15.0 {
        let e = s.exp();
        (-s * e, -s * (1.0 + s) * e)
    } else {
        let e = 15f64.exp();
        (-s * e, -s * e)
    }
}

/// Everything the ionisation balance needs apart from psi.
#[derive(Debug, Clone, Copy)]
pub(super) struct StageInputs {
    pub(super) x: f64,
    pub(super) y4: f64,
    pub(super) z_e: f64,
    /// Nuclei per m_u.
    pub(super) n_ion: f64,
    pub(super) a_h: f64,
    pub(super) a_1: f64,
    pub(super) a_2: f64,
    /// (ln w, d ln w / d ln rho) of H I, He I, He II.
    pub(super) w_h: (f64, f64),
    pub(super) w_he1: (f64, f64),
    pub(super) w_he2: (f64, f64),
    /// Molecules and metals ([`Ionisation::Molecular`] only).
    pub(super) mol: MolecularInputs,
}

/// Helium stages at one psi: fractions He II and He III, electrons per m_u and ionisation
/// energy per m_u (erg) with their derivatives.
pub(super) struct HeliumStages {
    pub(super) he1: f64,
    pub(super) he2: f64,
    pub(super) n_e: f64,
    pub(super) d_n_e: Grad,
    pub(super) e_ion: f64,
    pub(super) d_e_ion: Grad,
}

impl StageInputs {
    /// Ionisation energy per m_u, erg, of the fully ionised mixture (every electron this law
    /// can bind, freed), counted like [`Stages::e_ion`] from neutral atoms: the zero of u.
    pub(super) fn ionised_energy(&self) -> f64 {
        (self.x * CHI_H_EV + self.y4 * (CHI_HE1_EV + CHI_HE2_EV)) * EV_ERG
            + self.mol.ionised_energy()
    }

    fn full(&self) -> Stages {
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
    pub(super) fn hydrogen_ratio(&self, psi: f64) -> (f64, Grad) {
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
    pub(super) fn helium(&self, psi: f64) -> HeliumStages {
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
        let w0 = (-m).exp();
        let w1 = (l_1 - m).exp();
        let w2 = (big_l2 - m).exp();
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
    fn saha(&self, psi: f64) -> Stages {
        let (l_h, dl_h) = self.hydrogen_ratio(psi);
        let x_h = 1.0 / (1.0 + (-l_h).exp());
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

/// `impl EquationOfState` for a law that is a [`Plasma`] engine constant: `state` solves charge
/// neutrality at (rho, T); the inversions are [`Plasma::at_pressure`] and
/// [`Plasma::at_pressure_near`].
macro_rules! plasma_law {
    ($law:ty, $engine:expr) => {
        impl $crate::physics::eos::EquationOfState for $law {
            fn name(&self) -> &str {
                $engine.law
            }

            fn caution(
                &self,
                rho: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
            ) -> Option<&'static str> {
                $engine.caution(rho, t, comp)
            }

            fn state(
                &self,
                rho: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
            ) -> Result<$crate::physics::eos::EosState, $crate::error::PhysicsError> {
                Ok($engine.solve(rho, t, comp, None)?.state)
            }

            fn specific_entropy_erg_g_k(
                &self,
                state: &$crate::physics::eos::EosState,
                comp: &$crate::physics::composition::Composition,
            ) -> Option<f64> {
                $engine.specific_entropy(state, comp).ok()
            }

            fn state_and_entropy_at_pressure(
                &self,
                p: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
                near: Option<&$crate::physics::eos::EosState>,
            ) -> Result<($crate::physics::eos::EosState, Option<f64>), $crate::error::PhysicsError>
            {
                $engine.at_pressure_with_entropy(p, t, comp, near)
            }

            fn state_at_pressure(
                &self,
                p: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
            ) -> Result<$crate::physics::eos::EosState, $crate::error::PhysicsError> {
                $engine.at_pressure(p, t, comp)
            }

            fn state_at_pressure_near(
                &self,
                p: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
                near: &$crate::physics::eos::EosState,
            ) -> Result<$crate::physics::eos::EosState, $crate::error::PhysicsError> {
                $engine.at_pressure_near(p, t, comp, near)
            }
        }
    };
}
pub(crate) use plasma_law;
