//! Choosing laws by name: the options a user gives (flags or a model file) and how they become a
//! [`PhysicsSet`].
//!
//! Names (the same for flags and model-file keys):
//! - preset (`physics`): `analytic`, `refined` (default);
//! - `eos`: `ideal`, `saha`, `degenerate`, `refined`, `molecular`;
//! - `opacity`: `electron-scattering`, `kramers[:guillotine=T]`, `h-minus`, `bell-lin`, `conductive`,
//!   `analytic`, `refined[:guillotine=T0,exponent=Q]`, `table:PATH`, `table-clamped:PATH`;
//! - `rates`: `analytic`, `sfactor`, `power-law:eps0=E,t0=T,nu=N`;
//! - `convection`: `adiabatic`, `mlt` (with `alpha`, default 2.4);
//! - `opacity_factor`, `rates_factor`: positive multipliers (default 1);
//! - `atmosphere`: `photosphere`, `eddington` (or `grey`), `hopf`, `krishna-swamy`.

use super::convection::{Adiabatic, Convection, MixingLength};
use super::eos::{DegenerateGas, EquationOfState, IdealGas, MolecularEos, RefinedEos, SahaGas};
use super::nuclear::{power_law, AnalyticRates, EnergyGeneration, PowerLawRates, SFactorRates};
use super::opacity::{
    AnalyticOpacity, BellLin, Conductive, ElectronScattering, HMinus, Kramers, Opacity,
    RefinedOpacity, TableOpacity,
};
use super::scaled::Scaled;
use super::{Atmosphere, PhysicsSet};
use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};
use std::path::Path;
use std::sync::Arc;

/// Allowed preset names.
pub const PRESET_NAMES: &str = "allowed: analytic, refined";
/// Allowed equation-of-state names.
pub const EOS_NAMES: &str = "allowed: ideal, saha, degenerate, refined, molecular";
/// Allowed opacity names.
pub const OPACITY_NAMES: &str = "allowed: electron-scattering, kramers[:guillotine=T], h-minus, bell-lin, conductive, analytic, refined[:guillotine=T0,exponent=Q], table:PATH, table-clamped:PATH";
/// Allowed energy-generation names.
pub const RATES_NAMES: &str = "allowed: analytic, sfactor, power-law:eps0=E,t0=T,nu=N";
/// Allowed convection names.
pub const CONVECTION_NAMES: &str = "allowed: adiabatic, mlt";

/// Which laws to use, by name. Every field is optional: unset fields keep the preset's law.
/// The same names serve the command-line flags and the keys of a model file.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PhysicsOptions {
    /// Preset to start from: `analytic` or `refined` (default `refined`).
    pub physics: Option<String>,
    /// Equation of state law name.
    pub eos: Option<String>,
    /// Opacity law name (e.g. `kramers`, `table:models/demo-opacity.csv`).
    pub opacity: Option<String>,
    /// Energy generation law name (e.g. `sfactor`, `power-law:eps0=..,t0=..,nu=4`).
    pub rates: Option<String>,
    /// Convection law name: `adiabatic` or `mlt`.
    pub convection: Option<String>,
    /// Mixing-length parameter alpha for `mlt`.
    pub alpha: Option<f64>,
    /// Factor multiplying the opacity (default 1).
    pub opacity_factor: Option<f64>,
    /// Factor multiplying the energy generation rate (default 1).
    pub rates_factor: Option<f64>,
    /// Outer boundary: `photosphere`, `eddington` (or `grey`), `hopf`, `krishna-swamy`.
    pub atmosphere: Option<String>,
}

/// Split `name:params` into the name and the parameter text.
fn split_name(spec: &str) -> (&str, Option<&str>) {
    match spec.split_once(':') {
        Some((n, p)) => (n.trim(), Some(p)),
        None => (spec.trim(), None),
    }
}

/// Parse `key=value,key=value` with keys from `keys` into values in the same order.
fn parse_params<const N: usize>(
    flag: &str,
    spec: &str,
    params: Option<&str>,
    keys: [&str; N],
    allowed: &str,
) -> Result<[Option<f64>; N]> {
    let mut out = [None; N];
    let Some(text) = params else {
        return Ok(out);
    };
    for item in text.split(',') {
        let Some((key, value)) = item.split_once('=') else {
            return Err(Error::invalid(flag, spec, allowed));
        };
        let Some(slot) = keys.iter().position(|k| *k == key.trim()) else {
            return Err(Error::invalid(flag, spec, allowed));
        };
        let v: f64 = value
            .trim()
            .parse()
            .map_err(|_| Error::invalid(flag, spec, allowed))?;
        if !v.is_finite() || out[slot].is_some() {
            return Err(Error::invalid(flag, spec, allowed));
        }
        out[slot] = Some(v);
    }
    Ok(out)
}

fn no_params(flag: &str, spec: &str, params: Option<&str>, allowed: &str) -> Result<()> {
    match params {
        None => Ok(()),
        Some(_) => Err(Error::invalid(flag, spec, allowed)),
    }
}

/// The equation of state called `spec`.
pub fn eos_by_name(spec: &str) -> Result<Arc<dyn EquationOfState>> {
    let (name, params) = split_name(spec);
    no_params("--eos", spec, params, EOS_NAMES)?;
    Ok(match name {
        "ideal" => Arc::new(IdealGas),
        "saha" => Arc::new(SahaGas),
        "degenerate" => Arc::new(DegenerateGas),
        "refined" => Arc::new(RefinedEos),
        "molecular" => Arc::new(MolecularEos),
        _ => return Err(Error::invalid("--eos", spec, EOS_NAMES)),
    })
}

/// The opacity law called `spec` (a table is read from its file here).
pub fn opacity_by_name(spec: &str) -> Result<Arc<dyn Opacity>> {
    let (name, params) = split_name(spec);
    let flag = "--opacity";
    Ok(match name {
        "electron-scattering" => {
            no_params(flag, spec, params, OPACITY_NAMES)?;
            Arc::new(ElectronScattering)
        }
        "h-minus" => {
            no_params(flag, spec, params, OPACITY_NAMES)?;
            Arc::new(HMinus)
        }
        "bell-lin" => {
            no_params(flag, spec, params, OPACITY_NAMES)?;
            Arc::new(BellLin)
        }
        "conductive" => {
            no_params(flag, spec, params, OPACITY_NAMES)?;
            Arc::new(Conductive)
        }
        "analytic" => {
            no_params(flag, spec, params, OPACITY_NAMES)?;
            Arc::new(AnalyticOpacity::default())
        }
        "kramers" => {
            let [t] = parse_params(flag, spec, params, ["guillotine"], OPACITY_NAMES)?;
            Arc::new(Kramers::new(t.unwrap_or(1.0))?)
        }
        "refined" => {
            let [t, q] = parse_params(
                flag,
                spec,
                params,
                ["guillotine", "exponent"],
                OPACITY_NAMES,
            )?;
            let d = RefinedOpacity::default();
            Arc::new(RefinedOpacity::new(
                t.unwrap_or(d.guillotine()),
                q.unwrap_or(d.density_exponent()),
            )?)
        }
        "table" | "table-clamped" => match params {
            Some(path) if !path.trim().is_empty() => Arc::new(TableOpacity::from_file(
                Path::new(path.trim()),
                name == "table-clamped",
            )?),
            _ => {
                return Err(Error::invalid(
                    flag,
                    spec,
                    "give the table file, e.g. table:models/demo-opacity.csv",
                ))
            }
        },
        _ => return Err(Error::invalid(flag, spec, OPACITY_NAMES)),
    })
}

/// The energy-generation law called `spec`.
pub fn rates_by_name(spec: &str) -> Result<Arc<dyn EnergyGeneration>> {
    let (name, params) = split_name(spec);
    let flag = "--rates";
    Ok(match name {
        "analytic" => {
            no_params(flag, spec, params, RATES_NAMES)?;
            Arc::new(AnalyticRates::default())
        }
        "sfactor" => {
            no_params(flag, spec, params, RATES_NAMES)?;
            Arc::new(SFactorRates::default())
        }
        "power-law" => {
            let allowed = "power-law takes eps0 (default 0.437, the analytic pp rate at t0), t0 (default 1.5e7 K) and nu (default 4), e.g. power-law:nu=4 or power-law:eps0=0.1,t0=1.5e7,nu=4";
            let [e, t, n] = parse_params(flag, spec, params, ["eps0", "t0", "nu"], allowed)?;
            Arc::new(PowerLawRates::new(
                e.unwrap_or_else(power_law::default_eps0),
                t.unwrap_or(power_law::DEFAULT_T0_K),
                n.unwrap_or(power_law::DEFAULT_NU),
            )?)
        }
        _ => return Err(Error::invalid(flag, spec, RATES_NAMES)),
    })
}

/// The convection law called `spec`, with mixing-length parameter `alpha` for `mlt`.
pub fn convection_by_name(spec: &str, alpha: Option<f64>) -> Result<Arc<dyn Convection>> {
    let (name, params) = split_name(spec);
    no_params("--convection", spec, params, CONVECTION_NAMES)?;
    Ok(match name {
        "adiabatic" => {
            if let Some(a) = alpha {
                return Err(Error::invalid(
                    "--alpha",
                    a,
                    "the mixing-length parameter applies only to --convection mlt",
                ));
            }
            Arc::new(Adiabatic)
        }
        "mlt" => Arc::new(match alpha {
            Some(a) => MixingLength::new(a)?,
            None => MixingLength::default(),
        }),
        _ => return Err(Error::invalid("--convection", spec, CONVECTION_NAMES)),
    })
}

impl PhysicsOptions {
    /// These options with every field that `over` sets taken from `over`.
    pub fn overridden_by(&self, over: &PhysicsOptions) -> PhysicsOptions {
        PhysicsOptions {
            physics: over.physics.clone().or_else(|| self.physics.clone()),
            eos: over.eos.clone().or_else(|| self.eos.clone()),
            opacity: over.opacity.clone().or_else(|| self.opacity.clone()),
            rates: over.rates.clone().or_else(|| self.rates.clone()),
            convection: over.convection.clone().or_else(|| self.convection.clone()),
            alpha: over.alpha.or(self.alpha),
            opacity_factor: over.opacity_factor.or(self.opacity_factor),
            rates_factor: over.rates_factor.or(self.rates_factor),
            atmosphere: over.atmosphere.clone().or_else(|| self.atmosphere.clone()),
        }
    }

    /// Build the physics set these options describe: the preset (default `refined`), then
    /// every law that is named replaced, then the scale factors (a factor of 1 leaves the law
    /// unwrapped), then the atmosphere. Unknown names and bad parameters are
    /// [`Error::InvalidInput`] listing what is allowed; an unreadable table is [`Error::BadFile`].
    pub fn build(&self) -> Result<PhysicsSet> {
        let preset = self.physics.as_deref().unwrap_or("refined");
        let mut set = match preset {
            "analytic" => PhysicsSet::analytic(),
            "refined" => PhysicsSet::refined(),
            other => return Err(Error::invalid("--physics", other, PRESET_NAMES)),
        };
        if let Some(name) = &self.eos {
            set.eos = eos_by_name(name)?;
        }
        if let Some(name) = &self.opacity {
            set.opacity = opacity_by_name(name)?;
        }
        if let Some(name) = &self.rates {
            set.rates = rates_by_name(name)?;
        }
        match (&self.convection, self.alpha) {
            (Some(name), alpha) => set.convection = convection_by_name(name, alpha)?,
            (None, Some(alpha)) => {
                // Keep the preset's law; only mlt takes alpha.
                let name = if set.convection.name().starts_with("mlt") {
                    "mlt"
                } else {
                    "adiabatic"
                };
                set.convection = convection_by_name(name, Some(alpha))?;
            }
            (None, None) => {}
        }
        if let Some(f) = self.opacity_factor {
            let scaled = Scaled::new(set.opacity.clone(), f, "--opacity-factor")?;
            if f != 1.0 {
                set.opacity = Arc::new(scaled);
            }
        }
        if let Some(f) = self.rates_factor {
            let scaled = Scaled::new(set.rates.clone(), f, "--rates-factor")?;
            if f != 1.0 {
                set.rates = Arc::new(scaled);
            }
        }
        if let Some(a) = &self.atmosphere {
            set.atmosphere = Atmosphere::from_name(a.trim())
                .ok_or_else(|| Error::invalid("--atmosphere", a, super::ATMOSPHERE_NAMES))?;
        }
        Ok(set)
    }
}
