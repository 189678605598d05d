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
//! radiation P_rad = a T^4 / 3. Coulomb corrections only in `molecular` (see [`super::coulomb`] and
//! `coupling.rs`: the ions' term in the balance).
//!
//! psi solves charge neutrality n_e(psi) = (rho / m_u) N_e(psi), a monotone equation in psi
//! (the left side increases, the right side decreases with psi; with the Coulomb shift of
//! `molecular` the right side decreases as long as d(psi + mu_C/kT)/dpsi > 0, which fails only
//! for non-degenerate electrons at Gamma_e above about 2.5, inside that law's caution), by
//! safeguarded Newton iteration inside a bracket whose upper end is the fully ionised solution.
//!
//! Derivatives are analytic: d psi / d ln rho and d psi / d ln T by implicit differentiation of
//! the neutrality equation, then chi_rho, chi_T and c_V = (du/dT)_rho with the specific energy
//! u = (3/2)(P_ion + P_e)/rho + a T^4/rho + E_ion / m_u, and c_P = c_V + (P/(rho T)) chi_T^2 /
//! chi_rho, nabla_ad = P chi_T / (rho T c_P chi_rho), Gamma_1 = chi_rho c_P / c_V
//! (Kippenhahn & Weigert 1990, §13–14), evaluated in forms free of cancellation.

mod coupling;
mod electrons;
mod inversion;
mod ionisation;
mod point;
mod thermo;

pub(in crate::physics::eos) use ionisation::{Grad, StageInputs, Stages};

use super::EosState;
use crate::constants::{E_ESU, K_B_ERG_K};
use crate::error::PhysicsError;
use crate::physics::composition::Composition;
use point::AtPsi;

/// Ionisation energy of H I, eV (NIST, rounded).
pub const CHI_H_EV: f64 = 13.598;
/// First ionisation energy of He, eV (NIST, rounded).
pub const CHI_HE1_EV: f64 = 24.587;
/// Second ionisation energy of He, eV (NIST, rounded).
pub const CHI_HE2_EV: f64 = 54.418;
/// Bohr radius a_0, cm (CODATA 2018).
pub const BOHR_RADIUS_CM: f64 = 5.291_772_109e-9;

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
    /// coupling (Gamma_e > [`STRONG_COUPLING_GAMMA_E`], with Gamma_e of the fully ionised
    /// mixture), which a law without the Coulomb term neglects; and, in a law with it, strong
    /// coupling at the actual free-electron density where the electrons are not degenerate
    /// (psi < 0) or not dense (r_s = a_e / a_0 > 1, below about 2.7 mu_e g/cm^3): there electron
    /// screening and exchange, left out of the ions' term, are comparable with the term itself,
    /// and the gas is partly ionised, where the free-electron share of the Coulomb energy is this
    /// project's approximation (the hydrogen ionisation zones of M dwarfs). Only
    /// where the fully ionised Gamma_e exceeds 1 is the balance solved to find out. And the cold
    /// dense gas of [`super::coulomb::TRANSITION_BOXES`], where the equilibrium is multi-valued.
    pub fn caution(&self, rho: f64, t: f64, comp: &Composition) -> Option<&'static str> {
        if self.coulomb && super::coulomb::in_transition_region(rho, t) {
            return Some(
                "cold dense gas at the pressure-ionisation transition: the Coulomb lowering makes the equilibrium multi-valued there, and the law returns one of its solutions",
            );
        }
        let n_full_cm3 = rho / (comp.mu_e() * crate::constants::M_U_G);
        if super::coulomb::electron_coupling(n_full_cm3, t) <= STRONG_COUPLING_GAMMA_E {
            return None;
        }
        if !self.coulomb {
            return Some(
                "strongly coupled plasma (Gamma_e > 1): Coulomb (non-ideal) terms neglected",
            );
        }
        let setup = self.setup(rho, t, comp).ok()?;
        let (psi, balance) = self.solve_neutrality(&setup, setup.psi_full).ok()?;
        let coupling = balance.coulomb.coupling;
        // r_s = a_e / a_0 from Gamma_e = e^2 / (a_e k T).
        let r_s = E_ESU * E_ESU / (coupling.gamma_e * K_B_ERG_K * t * BOHR_RADIUS_CM);
        (coupling.gamma_e > STRONG_COUPLING_GAMMA_E && (psi < 0.0 || r_s > 1.0)).then_some(
            "strongly coupled plasma (Gamma_e > 1) whose electrons screen the ions (not degenerate, or r_s > 1): electron screening and exchange, and the partly ionised gas's Coulomb energy, only approximated",
        )
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

impl Plasma {
    pub(super) fn error(&self, reason: impl Into<String>, rho: f64, t: f64) -> PhysicsError {
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
        let (psi, balance) = self.solve_neutrality(&setup, guess)?;
        self.finish(&AtPsi::new(&setup, psi, &balance), comp, false)
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

    /// As [`Plasma::at_pressure_near`], started to second order from the states `near` and
    /// `before` of the last two points along a path ([`Plasma::start_along`]).
    pub fn at_pressure_along(
        &self,
        p: f64,
        t: f64,
        comp: &Composition,
        near: &EosState,
        before: &EosState,
    ) -> Result<EosState, PhysicsError> {
        Ok(self
            .at_pressure_from(p, t, comp, Self::start_along(p, t, near, before), false)?
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

            fn state_at_pressure_along(
                &self,
                p: f64,
                t: f64,
                comp: &$crate::physics::composition::Composition,
                near: &$crate::physics::eos::EosState,
                before: &$crate::physics::eos::EosState,
            ) -> Result<$crate::physics::eos::EosState, $crate::error::PhysicsError> {
                $engine.at_pressure_along(p, t, comp, near, before)
            }
        }
    };
}
pub(crate) use plasma_law;
