//! Equations of state: pressure and thermodynamic derivatives as functions of (rho, T, X, Z).
//!
//! Every law implements [`EquationOfState`]. The structure equations carry P and T, so the trait
//! also provides the inversion rho(P, T) ([`EquationOfState::state_at_pressure`]) by a Newton
//! iteration in ln rho that any law inherits and a law with a closed form may override.

use super::composition::Composition;
use crate::constants::{A_RAD_CGS, K_B_ERG_K, M_U_G};
use crate::error::PhysicsError;

pub mod coulomb;
pub mod coulomb_table;
pub mod degenerate;
mod entropy;
pub mod fermi_dirac;
pub mod h2;
pub mod ideal;
pub mod molecular;
pub mod plasma;
pub mod refined;
pub mod saha;

pub use degenerate::DegenerateGas;
pub use ideal::IdealGas;
pub use molecular::MolecularEos;
pub use refined::RefinedEos;
pub use saha::SahaGas;

/// The thermodynamic state at one (rho, T): everything the structure equations and the
/// convection laws need. A plain value, no allocation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EosState {
    /// Density rho, g cm^-3.
    pub density_g_cm3: f64,
    /// Temperature T, K.
    pub temperature_k: f64,
    /// Total pressure P = P_gas + P_rad, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Gas pressure (ions + electrons), dyn cm^-2.
    pub gas_pressure_dyn_cm2: f64,
    /// beta = P_gas / P.
    pub beta: f64,
    /// chi_rho = (dln P / dln rho)_T.
    pub chi_rho: f64,
    /// chi_T = (dln P / dln T)_rho.
    pub chi_t: f64,
    /// Adiabatic gradient nabla_ad = (dln T / dln P)_s.
    pub nabla_ad: f64,
    /// First adiabatic exponent Gamma_1 = (dln P / dln rho)_s.
    pub gamma1: f64,
    /// Specific heat at constant pressure c_P, erg g^-1 K^-1.
    pub cp_erg_g_k: f64,
    /// delta = -(dln rho / dln T)_P = chi_T / chi_rho.
    pub delta: f64,
    /// Mean molecular weight of the gas particles (ions and free electrons), P_gas = rho k T / (mu m_u).
    pub mu: f64,
    /// Electron degeneracy parameter psi = mu_chem,e / (k T) (large negative: non-degenerate).
    pub degeneracy_psi: f64,
    /// (d psi / d ln rho)_T: with [`EosState::dpsi_dln_t`], what a law that solves for psi
    /// uses to start its next inversion rho(P, T) near this state
    /// ([`EquationOfState::state_at_pressure_near`]). Zero in laws without psi.
    pub dpsi_dln_rho: f64,
    /// (d psi / d ln T)_rho (see [`EosState::dpsi_dln_rho`]). Zero in laws without psi.
    pub dpsi_dln_t: f64,
    /// Fraction of hydrogen ionised (H II / H), 0..1.
    pub hydrogen_ionised: f64,
    /// Fraction of helium singly ionised (He II / He).
    pub helium_single: f64,
    /// Fraction of helium doubly ionised (He III / He).
    pub helium_double: f64,
    /// Specific internal energy u, erg g^-1: the kinetic energy of the gas particles, the
    /// radiation a T^4 / rho, and, in the laws that have them, the energy of the electrons
    /// still bound (minus the ionisation energies), of H2 (minus its binding energy, plus its
    /// rotation and vibration) and the Coulomb term. Zero point (every law): the fully
    /// ionised plasma at rest, so that u = (3/2) P_gas / rho + a T^4 / rho wherever ionisation
    /// is complete and the gas is ideal (non-relativistic electrons of any degeneracy included),
    /// and u < 0 where enough electrons are bound (cool envelopes and atmospheres, by up to
    /// (X chi_H + (Y/4)(chi_HeI + chi_HeII)) / m_u = 1.5e13 erg g^-1 for X = 0.7, plus D0/2 per
    /// hydrogen nucleus in H2). (du/dT)_rho = c_V for every law (tests/eos_energy.rs).
    pub specific_energy_erg_g: f64,
}

/// An equation of state.
pub trait EquationOfState: Send + Sync + std::fmt::Debug {
    /// The law's name as a user selects it (e.g. `ideal`).
    fn name(&self) -> &str;

    /// A caution when (rho, T) lies where the law still returns a value but is used beyond what
    /// it describes well (an assumption that fails, a fit used outside its range); `None`
    /// inside. A model that visits such points carries the caution as a warning.
    fn caution(
        &self,
        _rho_g_cm3: f64,
        _temperature_k: f64,
        _comp: &Composition,
    ) -> Option<&'static str> {
        None
    }

    /// Specific entropy s, erg g^-1 K^-1, of the state `state` that this law returned (at its
    /// density, temperature and, where the law has one, degeneracy), or `None` for a law that
    /// gives no entropy (the default; every built-in law gives one).
    ///
    /// Zero point: the statistical (absolute, Sackur–Tetrode) entropy S = k ln W of ideal
    /// particles counted with the statistical weights the law uses (electron spin and the
    /// ground states of atoms and ions; nuclear spin left out, as in the tables of
    /// thermochemistry), particles of mass A m_u (A = 1.00782503 for hydrogen, 4 for helium,
    /// 16 for the metals, as in the laws), plus radiation 4 a T^3 / (3 rho). Consistent with
    /// u: (ds/dT)_rho = c_V / T (tests/eos_energy.rs); the ideal monatomic gas agrees with the
    /// standard entropies of thermochemistry (docs/references.md §10).
    fn specific_entropy_erg_g_k(&self, state: &EosState, comp: &Composition) -> Option<f64> {
        let _ = (state, comp);
        None
    }

    /// The state at density `rho_g_cm3` and temperature `temperature_k`.
    ///
    /// Errors (never NaN) outside the law's domain.
    fn state(
        &self,
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<EosState, PhysicsError>;

    /// The state at total pressure `pressure_dyn_cm2` and temperature `temperature_k`.
    ///
    /// Newton iteration on ln P(ln rho) - ln P_target = 0 using chi_rho, started from the
    /// fully ionised ideal gas. Errors if P does not exceed the radiation pressure a T^4 / 3
    /// (no gas pressure left) or the iteration fails.
    fn state_at_pressure(
        &self,
        pressure_dyn_cm2: f64,
        temperature_k: f64,
        comp: &Composition,
    ) -> Result<EosState, PhysicsError> {
        invert_by_newton(self, pressure_dyn_cm2, temperature_k, comp, None)
    }

    /// The state at total pressure `pressure_dyn_cm2` and temperature `temperature_k`
    /// ([`EquationOfState::state_at_pressure_near`] with `near`, else
    /// [`EquationOfState::state_at_pressure`]) together with its specific entropy
    /// ([`EquationOfState::specific_entropy_erg_g_k`]), which a law may compute on the
    /// inversion's last evaluation (the plasma laws do: a profile row costs one evaluation less).
    fn state_and_entropy_at_pressure(
        &self,
        pressure_dyn_cm2: f64,
        temperature_k: f64,
        comp: &Composition,
        near: Option<&EosState>,
    ) -> Result<(EosState, Option<f64>), PhysicsError> {
        let state = match near {
            Some(n) => self.state_at_pressure_near(pressure_dyn_cm2, temperature_k, comp, n)?,
            None => self.state_at_pressure(pressure_dyn_cm2, temperature_k, comp)?,
        };
        let entropy = self.specific_entropy_erg_g_k(&state, comp);
        Ok((state, entropy))
    }

    /// As [`EquationOfState::state_at_pressure`], knowing the state `near` of a nearby point
    /// (the previous evaluation along an integration), which a law may use to start its
    /// inversion. The result must agree with `state_at_pressure` to the inversion's tolerance.
    fn state_at_pressure_near(
        &self,
        pressure_dyn_cm2: f64,
        temperature_k: f64,
        comp: &Composition,
        near: &EosState,
    ) -> Result<EosState, PhysicsError> {
        let _ = near;
        self.state_at_pressure(pressure_dyn_cm2, temperature_k, comp)
    }

    /// As [`EquationOfState::state_at_pressure_near`], knowing also the state `before` of the
    /// point before `near` along the same path (an integration's previous evaluation), which a
    /// law may use to start its inversion to second order. The result must agree with
    /// `state_at_pressure` to the inversion's tolerance.
    fn state_at_pressure_along(
        &self,
        pressure_dyn_cm2: f64,
        temperature_k: f64,
        comp: &Composition,
        near: &EosState,
        before: &EosState,
    ) -> Result<EosState, PhysicsError> {
        let _ = before;
        self.state_at_pressure_near(pressure_dyn_cm2, temperature_k, comp, near)
    }
}

/// The shared inversion rho(P, T) by Newton iteration in ln rho.
///
/// `rho_guess_g_cm3`, where given, starts the iteration; otherwise the fully ionised ideal gas
/// rho = (P - a T^4/3) mu m_u / (k T) does.
pub fn invert_by_newton<E: EquationOfState + ?Sized>(
    eos: &E,
    pressure_dyn_cm2: f64,
    temperature_k: f64,
    comp: &Composition,
    rho_guess_g_cm3: Option<f64>,
) -> Result<EosState, PhysicsError> {
    let p_rad = A_RAD_CGS * temperature_k.powi(4) / 3.0;
    let bad = |reason: String| PhysicsError::new(eos.name(), reason, f64::NAN, temperature_k);
    if !(pressure_dyn_cm2.is_finite() && temperature_k.is_finite())
        || pressure_dyn_cm2 <= 0.0
        || temperature_k <= 0.0
    {
        return Err(bad(format!(
            "pressure {pressure_dyn_cm2:e} dyn/cm^2 and temperature must be finite and positive"
        )));
    }
    if pressure_dyn_cm2 <= p_rad {
        return Err(bad(format!(
            "pressure {pressure_dyn_cm2:.4e} dyn/cm^2 does not exceed the radiation pressure {p_rad:.4e}"
        )));
    }
    let mut ln_rho = match rho_guess_g_cm3 {
        Some(r) if r > 0.0 && r.is_finite() => r.ln(),
        _ => ((pressure_dyn_cm2 - p_rad) * comp.mu() * M_U_G / (K_B_ERG_K * temperature_k)).ln(),
    };
    let ln_p_target = pressure_dyn_cm2.ln();
    for _ in 0..60 {
        let s = eos.state(ln_rho.exp(), temperature_k, comp)?;
        let f = s.pressure_dyn_cm2.ln() - ln_p_target;
        if f.abs() < 1e-13 {
            return Ok(s);
        }
        // chi_rho tends to zero where radiation dominates; keep the step bounded.
        let step = (f / s.chi_rho.max(1e-3)).clamp(-2.0, 2.0);
        ln_rho -= step;
    }
    Err(bad(format!(
        "density for pressure {pressure_dyn_cm2:.4e} dyn/cm^2 not found in 60 Newton steps"
    )))
}
