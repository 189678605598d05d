//! The `probe` report: every local quantity of a physics set at one (rho, T, X, Z).
//!
//! JSON keys (one object, units in the names):
//! - `physics`: the laws by name (`preset`, `eos`, `opacity`, `rates`, `convection`, `atmosphere`);
//! - `x`, `y`, `z`: mass fractions of H, He and metals; `x_cno`: CNO mass fraction;
//! - `density_g_cm3`, `temperature_k`: the point;
//! - `pressure_dyn_cm2`, `gas_pressure_dyn_cm2`, `radiation_pressure_dyn_cm2`, `beta`;
//! - `mu`: mean mass per gas particle in m_u; `chi_rho`, `chi_t`, `nabla_ad`, `gamma1`,
//!   `cp_erg_g_k`, `delta`;
//! - `degeneracy_psi`: electron degeneracy parameter (null for the `ideal` law, which has none);
//! - `hydrogen_ionised`, `helium_single`, `helium_double`: ionisation fractions;
//! - `opacity_cm2_g`: the set's opacity; `opacity_laws`: each standard law with
//!   `law`, `opacity_cm2_g` (null outside its domain) and `error` (null inside);
//! - `eps_pp_erg_g_s`, `eps_cno_erg_g_s`, `eps_total_erg_g_s`, `nu_pp`, `nu_cno`.

use crate::constants::A_RAD_CGS;
use crate::error::Result;
use crate::physics::opacity::{
    AnalyticOpacity, BellLin, Conductive, ElectronScattering, HMinus, Kramers, Opacity,
    RefinedOpacity,
};
use crate::physics::{Composition, PhysicsDescription, PhysicsSet};
use serde::Serialize;
use std::fmt::Write as _;

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
    /// The laws of the set by name.
    pub physics: PhysicsDescription,
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
        let s = set.eos.state(rho_g_cm3, temperature_k, comp)?;
        let kappa = set.opacity.kappa(rho_g_cm3, temperature_k, comp)?;
        let rate = set.rates.rate(rho_g_cm3, temperature_k, comp)?;
        let laws: [&dyn Opacity; 7] = [
            &ElectronScattering,
            &Kramers::default(),
            &HMinus,
            &BellLin,
            &Conductive,
            &AnalyticOpacity::default(),
            &RefinedOpacity::default(),
        ];
        let opacity_laws = laws
            .iter()
            .map(|law| match law.kappa(rho_g_cm3, temperature_k, comp) {
                Ok(k) => OpacityValue {
                    law: law.name(),
                    opacity_cm2_g: Some(k),
                    error: None,
                },
                Err(e) => OpacityValue {
                    law: law.name(),
                    opacity_cm2_g: None,
                    error: Some(e.reason),
                },
            })
            .collect();
        Ok(Self {
            physics: set.describe(),
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

    /// Aligned text with units, one quantity per line.
    pub fn to_text(&self) -> String {
        let mut o = String::new();
        let p = &self.physics;
        let _ = writeln!(
            o,
            "point:       rho = {:.4e} g/cm^3, T = {:.4e} K, X = {}, Y = {:.4}, Z = {}",
            self.density_g_cm3, self.temperature_k, self.x, self.y, self.z
        );
        let _ = writeln!(
            o,
            "physics:     {} (eos {}, opacity {}, rates {}, convection {})",
            p.preset, p.eos, p.opacity, p.rates, p.convection
        );
        let row = |o: &mut String, name: &str, v: String, unit: &str| {
            let _ = writeln!(o, "{name:<30} {v:>12} {unit}");
        };
        row(
            &mut o,
            "P",
            format!("{:.4e}", self.pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(
            &mut o,
            "P_gas",
            format!("{:.4e}", self.gas_pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(
            &mut o,
            "P_rad",
            format!("{:.4e}", self.radiation_pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(&mut o, "beta", format!("{:.6}", self.beta), "");
        row(&mut o, "mu", format!("{:.6}", self.mu), "m_u per particle");
        row(&mut o, "chi_rho", format!("{:.6}", self.chi_rho), "");
        row(&mut o, "chi_T", format!("{:.6}", self.chi_t), "");
        row(&mut o, "nabla_ad", format!("{:.6}", self.nabla_ad), "");
        row(&mut o, "Gamma_1", format!("{:.6}", self.gamma1), "");
        row(
            &mut o,
            "c_P",
            format!("{:.4e}", self.cp_erg_g_k),
            "erg/(g K)",
        );
        row(&mut o, "delta", format!("{:.6}", self.delta), "");
        let psi = self
            .degeneracy_psi
            .map_or("none".to_string(), |v| format!("{v:.4}"));
        row(&mut o, "degeneracy psi", psi, "");
        row(
            &mut o,
            "H ionised (H II)",
            format!("{:.6}", self.hydrogen_ionised),
            "",
        );
        row(
            &mut o,
            "He singly (He II)",
            format!("{:.6}", self.helium_single),
            "",
        );
        row(
            &mut o,
            "He doubly (He III)",
            format!("{:.6}", self.helium_double),
            "",
        );
        row(
            &mut o,
            "kappa (set)",
            format!("{:.4e}", self.opacity_cm2_g),
            "cm^2/g",
        );
        for law in &self.opacity_laws {
            let v = match (law.opacity_cm2_g, &law.error) {
                (Some(k), _) => format!("{k:.4e}"),
                (None, _) => "n/a".to_string(),
            };
            let unit = match &law.error {
                Some(e) => format!("cm^2/g ({e})"),
                None => "cm^2/g".to_string(),
            };
            row(&mut o, &format!("  kappa {}", law.law), v, &unit);
        }
        row(
            &mut o,
            "eps_pp",
            format!("{:.4e}", self.eps_pp_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "eps_CNO",
            format!("{:.4e}", self.eps_cno_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "eps_total",
            format!("{:.4e}", self.eps_total_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "nu_pp",
            format!("{:.4}", self.nu_pp),
            "dln eps/dln T",
        );
        row(
            &mut o,
            "nu_CNO",
            format!("{:.4}", self.nu_cno),
            "dln eps/dln T",
        );
        o
    }
}
