//! Choosing laws by name: the options a user gives (flags or a model file) and how they become a
//! [`PhysicsSet`].

use super::{Atmosphere, PhysicsSet};
use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

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
    /// Outer boundary: `photosphere` or `grey`.
    pub atmosphere: Option<String>,
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

    /// Build the physics set these options describe.
    pub fn build(&self) -> Result<PhysicsSet> {
        let preset = self.physics.as_deref().unwrap_or("analytic");
        let mut set = match preset {
            "analytic" => PhysicsSet::analytic(),
            other => {
                return Err(Error::invalid(
                    "--physics",
                    other,
                    "allowed: analytic, refined",
                ));
            }
        };
        for (flag, value, allowed) in [
            ("--eos", &self.eos, "ideal"),
            ("--opacity", &self.opacity, "analytic"),
            ("--rates", &self.rates, "analytic"),
            ("--convection", &self.convection, "adiabatic"),
        ] {
            if let Some(v) = value {
                if v != allowed {
                    return Err(Error::invalid(flag, v, &format!("allowed: {allowed}")));
                }
            }
        }
        if let Some(a) = &self.atmosphere {
            set.atmosphere = match a.as_str() {
                "photosphere" => Atmosphere::Photosphere,
                "grey" => Atmosphere::Grey,
                other => {
                    return Err(Error::invalid(
                        "--atmosphere",
                        other,
                        "allowed: photosphere, grey",
                    ))
                }
            };
        }
        Ok(set)
    }
}
