//! Every local quantity of a physics set at one (rho, T, X, Z): what `probe` reports.
//!
//! JSON keys (one object, units in the names):
//! - `physics`: the laws as chosen (the keys of [`crate::physics::PhysicsSpec`]);
//! - `x`, `y`, `z`: mass fractions of H, He and metals; `x_cno`: CNO mass fraction;
//! - `density_g_cm3`, `temperature_k`: the point;
//! - `pressure_dyn_cm2`, `gas_pressure_dyn_cm2`, `radiation_pressure_dyn_cm2`, `beta`;
//! - `mu`: mean mass per gas particle in m_u; `chi_rho`, `chi_t`, `nabla_ad`, `gamma1`,
//!   `cp_erg_g_k`, `delta`;
//! - `degeneracy_psi`: electron degeneracy parameter (null for the `ideal` law, which has none);
//! - `hydrogen_ionised`, `helium_single`, `helium_double`: ionisation fractions;
//! - `opacity_cm2_g`: the set's opacity; `opacity_laws`: every catalogued opacity law that
//!   needs no file, with its defaults, as `law`, `opacity_cm2_g` (null outside its domain) and
//!   `error` (null inside);
//! - `eps_pp_erg_g_s`, `eps_cno_erg_g_s`, `eps_total_erg_g_s`, `nu_pp`, `nu_cno`.

use super::spec::{grammar, OpacitySpec};
use super::{Composition, PhysicsSet, PhysicsSpec};
use crate::constants::A_RAD_CGS;
use crate::error::Result;
use serde::Serialize;

/// One opacity law evaluated at the probe point.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct OpacityValue {
    /// The law's name with its parameters.
    pub law: String,
    /// kappa, cm^2 g^-1; `None` outside the law's domain.
    pub opacity_cm2_g: Option<f64>,
    /// Why the law has no value here; `None` when it has one.
    pub error: Option<String>,
}

/// Every local quantity at one point (see the module documentation for the JSON keys).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ProbeReport {
    /// The laws of the set.
    pub physics: PhysicsSpec,
    /// Hydrogen mass fraction X.
    pub x: f64,
    /// Helium mass fraction Y.
    pub y: f64,
    /// Metal mass fraction Z.
    pub z: f64,
    /// CNO mass fraction.
    pub x_cno: f64,
    /// Density, g cm^-3.
    pub density_g_cm3: f64,
    /// Temperature, K.
    pub temperature_k: f64,
    /// Total pressure, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Gas pressure (ions and electrons), dyn cm^-2.
    pub gas_pressure_dyn_cm2: f64,
    /// Radiation pressure a T^4 / 3, dyn cm^-2.
    pub radiation_pressure_dyn_cm2: f64,
    /// beta = P_gas / P.
    pub beta: f64,
    /// Mean mass per gas particle (ions and free electrons), m_u.
    pub mu: f64,
    /// (dln P / dln rho)_T.
    pub chi_rho: f64,
    /// (dln P / dln T)_rho.
    pub chi_t: f64,
    /// Adiabatic gradient (dln T / dln P)_s.
    pub nabla_ad: f64,
    /// First adiabatic exponent (dln P / dln rho)_s.
    pub gamma1: f64,
    /// Specific heat at constant pressure, erg g^-1 K^-1.
    pub cp_erg_g_k: f64,
    /// -(dln rho / dln T)_P.
    pub delta: f64,
    /// Electron degeneracy parameter psi = mu_e / kT; `None` for a law without one.
    pub degeneracy_psi: Option<f64>,
    /// Fraction of hydrogen ionised.
    pub hydrogen_ionised: f64,
    /// Fraction of helium singly ionised.
    pub helium_single: f64,
    /// Fraction of helium doubly ionised.
    pub helium_double: f64,
    /// The set's opacity, cm^2 g^-1.
    pub opacity_cm2_g: f64,
    /// Each standard opacity law at this point.
    pub opacity_laws: Vec<OpacityValue>,
    /// pp-chain energy generation, erg g^-1 s^-1.
    pub eps_pp_erg_g_s: f64,
    /// CNO-cycle energy generation, erg g^-1 s^-1.
    pub eps_cno_erg_g_s: f64,
    /// Total energy generation, erg g^-1 s^-1.
    pub eps_total_erg_g_s: f64,
    /// dln eps_pp / dln T.
    pub nu_pp: f64,
    /// dln eps_CNO / dln T.
    pub nu_cno: f64,
}

impl ProbeReport {
    /// Evaluate `set` at density `rho_g_cm3`, temperature `temperature_k` and `comp`.
    /// Errors if the set's equation of state, opacity or rates fail there.
    pub fn evaluate(
        rho_g_cm3: f64,
        temperature_k: f64,
        comp: &Composition,
        set: &PhysicsSet,
    ) -> Result<Self> {
        let s = set.eos().state(rho_g_cm3, temperature_k, comp)?;
        let kappa = set.opacity().kappa(rho_g_cm3, temperature_k, comp)?;
        let rate = set.rates().rate(rho_g_cm3, temperature_k, comp)?;
        let mut opacity_laws = Vec::new();
        for entry in super::spec::opacity::CATALOGUE
            .iter()
            .filter(|e| !e.reads_file)
        {
            let spec: OpacitySpec = grammar::parse(entry.name)?;
            let Some(law) = spec.build()? else { continue };
            let (opacity_cm2_g, error) = match law.kappa(rho_g_cm3, temperature_k, comp) {
                Ok(k) => (Some(k), None),
                Err(e) => (None, Some(e.reason)),
            };
            opacity_laws.push(OpacityValue {
                law: spec.to_string(),
                opacity_cm2_g,
                error,
            });
        }
        Ok(Self {
            physics: set.spec().clone(),
            x: comp.x(),
            y: comp.y(),
            z: comp.z(),
            x_cno: comp.x_cno(),
            density_g_cm3: rho_g_cm3,
            temperature_k,
            pressure_dyn_cm2: s.pressure_dyn_cm2,
            gas_pressure_dyn_cm2: s.gas_pressure_dyn_cm2,
            radiation_pressure_dyn_cm2: A_RAD_CGS * temperature_k.powi(4) / 3.0,
            beta: s.beta,
            mu: s.mu,
            chi_rho: s.chi_rho,
            chi_t: s.chi_t,
            nabla_ad: s.nabla_ad,
            gamma1: s.gamma1,
            cp_erg_g_k: s.cp_erg_g_k,
            delta: s.delta,
            degeneracy_psi: s.degeneracy_psi.is_finite().then_some(s.degeneracy_psi),
            hydrogen_ionised: s.hydrogen_ionised,
            helium_single: s.helium_single,
            helium_double: s.helium_double,
            opacity_cm2_g: kappa,
            opacity_laws,
            eps_pp_erg_g_s: rate.eps_pp_erg_g_s,
            eps_cno_erg_g_s: rate.eps_cno_erg_g_s,
            eps_total_erg_g_s: rate.total_erg_g_s(),
            nu_pp: rate.nu_pp,
            nu_cno: rate.nu_cno,
        })
    }
}
