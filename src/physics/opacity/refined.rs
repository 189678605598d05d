//! `refined`: the default opacity, a smooth combination of the analytic laws and conduction.

use super::bell_lin::{molecular_kappa, BELL_LIN_Z};
use super::conductive::{combine, Conductive};
use super::electron_scattering::ElectronScattering;
use super::h_minus::HMinus;
use super::kramers::Kramers;
use super::{check_point, Opacity};
use crate::constants::{EV_ERG, H_ERG_S, K_B_ERG_K, M_E_G, M_U_G};
use crate::error::{Error, PhysicsError, Result};
use crate::numerics::exponential::FastExp;
use crate::numerics::smooth::switch_weight;
use crate::physics::composition::Composition;

/// Default guillotine factor of the `refined` opacity at rho = 1 g/cm^3, t_0 in
/// t = max(1, t_0 rho^q). A calibration, not a measured value (see [`DEFAULT_DENSITY_EXPONENT`]).
pub const DEFAULT_GUILLOTINE: f64 = 3.0;

/// Default density exponent q of the guillotine factor t = max(1, t_0 rho^q).
///
/// A calibration: (t_0, q) = (3, 0.5) was chosen from a scan of t_0 in 2–10 and q in 0.3–0.5 so
/// that `refined` ZAMS models at X = 0.70, Z = 0.02 (then: `refined` equation of state, grey
/// atmosphere, mlt with alpha = 1.8) follow the ZAMS fits of Tout, Pols, Eggleton & Han (1996,
/// MNRAS 281, 257) over 0.5–50 M_sun: luminosity within 0.12 dex and radius within 0.083 dex
/// (`cargo run --release --example tout_comparison`). Kept with the present `refined` set
/// (`molecular` equation of state, Krishna Swamy atmosphere, alpha = 2.4, itself calibrated on
/// the 1 M_sun radius of the same fits): within 0.082 and 0.083 dex over 0.5–50 M_sun. Kramers
/// bound–free absorption with a guillotine factor that grows with density mimics the lower
/// tabulated Rosseland means of the deep interior (t = 1 below rho = 0.11 g/cm^3, t ~ 37 at the
/// solar centre).
pub const DEFAULT_DENSITY_EXPONENT: f64 = 0.5;

/// Molecular and floor opacity coefficient: kappa_mol = 0.1 Z cm^2 g^-1, the order of magnitude
/// of molecular absorption near 2000–3000 K (common practice, no single source).
pub const MOLECULAR_COEFFICIENT: f64 = 0.1;

/// Metallicity floor of the H- term in the refined combination (hydrogen's own electrons).
pub const H_MINUS_Z_FLOOR: f64 = 1e-4;

/// The H- term is switched off below its fitted range (3000–6000 K, Hansen & Kawaler 1994):
/// fully on above the second temperature, off below the first, K (molecules take over there).
pub const H_MINUS_T_OFF_K: (f64, f64) = (2500.0, 3000.0);

/// The molecular term of Bell & Lin (1994) is on below the first temperature and off above
/// the second, K: it is the molecular regime of a fit whose next regime up is H-, which this
/// opacity takes from Hansen & Kawaler instead.
pub const MOLECULES_T_OFF_K: (f64, f64) = (4500.0, 5500.0);

/// The ends of the two switches in temperature, K: where kappa is only twice differentiable in T.
const SWITCH_ENDS_K: [f64; 4] = [
    H_MINUS_T_OFF_K.0,
    H_MINUS_T_OFF_K.1,
    MOLECULES_T_OFF_K.0,
    MOLECULES_T_OFF_K.1,
];

/// Smallest and largest temperature accepted, K.
pub const REFINED_T_RANGE_K: (f64, f64) = (1.0e3, 1.0e10);

/// kappa = 1 / (1/kappa_rad + 1/kappa_cd) with
/// kappa_rad = f_e kappa_es + 1 / (1/kappa_H- + 1/(kappa_ff + kappa_bf / t)) + 0.1 Z,
/// t = max(1, t_0 (rho / 1 g cm^-3)^q), cm^2 g^-1:
/// - kappa_es: Thomson scattering ([`ElectronScattering`]) times f_e, the ionised fraction of
///   hydrogen from the one-species Saha equation x^2/(1-x) = (2 pi m_e k T/h^2)^(3/2)
///   exp(-13.598 eV/kT) / n_H, so that cool neutral gas does not scatter;
/// - kappa_H-: [`HMinus::formula`] with Z floored at [`H_MINUS_Z_FLOOR`], which rises as T^9 and so hands over smoothly to
///   Kramers absorption ([`Kramers`] with the density-dependent guillotine t, defaults
///   [`DEFAULT_GUILLOTINE`] and [`DEFAULT_DENSITY_EXPONENT`]) through
///   the harmonic sum, capping the Kramers law where hydrogen is neutral;
/// - 0.1 Z: [`MOLECULAR_COEFFICIENT`], a floor for cool molecular gas;
/// - kappa_cd: [`Conductive`].
///
/// A documented smooth interpolation of this project, not a tabulated opacity: within a factor
/// of a few of tabulated Rosseland means from 1e4 to 1e8 K for solar-like mixtures with the
/// default t. Domain: any rho > 0, 1e3 <= T <= 1e10 K.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RefinedOpacity {
    guillotine: f64,
    density_exponent: f64,
}

impl Default for RefinedOpacity {
    fn default() -> Self {
        Self {
            guillotine: DEFAULT_GUILLOTINE,
            density_exponent: DEFAULT_DENSITY_EXPONENT,
        }
    }
}

impl RefinedOpacity {
    /// The refined opacity with t = max(1, `guillotine` rho^`density_exponent`);
    /// `guillotine` finite and > 0, `density_exponent` finite and in [0, 1].
    pub fn new(guillotine: f64, density_exponent: f64) -> Result<Self> {
        Kramers::new(guillotine)?;
        if !(density_exponent.is_finite() && (0.0..=1.0).contains(&density_exponent)) {
            return Err(Error::invalid(
                "exponent",
                density_exponent,
                "the density exponent of the guillotine factor must be in [0, 1], e.g. refined:guillotine=2,exponent=0.4",
            ));
        }
        Ok(Self {
            guillotine,
            density_exponent,
        })
    }

    /// The guillotine factor t_0 at 1 g/cm^3.
    pub fn guillotine(&self) -> f64 {
        self.guillotine
    }

    /// The density exponent q of the guillotine factor.
    pub fn density_exponent(&self) -> f64 {
        self.density_exponent
    }

    /// The guillotine factor t = max(1, t_0 rho^q) at density `rho`, with the corner rounded
    /// (exact outside 0.8 < t_0 rho^q < 1.25; [`crate::numerics::smooth::smooth_max`]) so that
    /// kappa stays twice differentiable in rho.
    pub fn guillotine_at(&self, rho: f64) -> f64 {
        // The default exponent 1/2 as a square root (a tenth of the cost of a power).
        let rho_q = if self.density_exponent == 0.5 {
            rho.sqrt()
        } else {
            rho.powf(self.density_exponent)
        };
        crate::numerics::smooth::smooth_max(self.guillotine * rho_q, 1.0, 0.8)
    }

    /// Radiative part kappa_rad alone (no conduction), without checks.
    pub fn radiative(&self, rho: f64, t: f64, comp: &Composition) -> f64 {
        // T^-3.5 = 1 / (T^3 sqrt(T)).
        let common = (1.0 + comp.x()) * rho / (t * t * t * t.sqrt());
        let ff = 3.68e22 * (1.0 - comp.z()) * common;
        let bf = 4.34e25 * comp.z() / self.guillotine_at(rho) * common;
        let kramers = ff + bf;
        // Floor Z in the H- term: hydrogen's own electrons keep some H- in metal-free gas.
        let h_minus = HMinus::formula_with_z(rho, t, comp.z().max(H_MINUS_Z_FLOOR))
            * temperature_switch(t, H_MINUS_T_OFF_K);
        let molecular_weight = 1.0 - temperature_switch(t, MOLECULES_T_OFF_K);
        let molecules = if molecular_weight > 0.0 {
            molecular_kappa(rho, t) * (comp.z() / BELL_LIN_Z) * molecular_weight
        } else {
            0.0
        };
        let absorption = combine(h_minus + molecules, kramers);
        hydrogen_ionised_fraction(rho, t, comp) * ElectronScattering::kappa_cm2_g(comp)
            + absorption
            + MOLECULAR_COEFFICIENT * comp.z()
    }
}

/// Weight rising smoothly from 0 at `range.0` to 1 at `range.1` (K), twice differentiable
/// ([`switch_weight`]).
fn temperature_switch(t: f64, range: (f64, f64)) -> f64 {
    if t >= range.1 {
        1.0
    } else if t <= range.0 {
        0.0
    } else {
        switch_weight(t, (range.0 * range.1).sqrt(), (range.0 / range.1).sqrt()).0
    }
}

/// Ionised fraction of hydrogen from the one-species Saha equation (Saha 1920), with
/// n_H = rho X / m_u (rho / m_u when X = 0), solved as x = 2 / (1 + sqrt(1 + 4/s)).
pub fn hydrogen_ionised_fraction(rho: f64, t: f64, comp: &Composition) -> f64 {
    let n_h = rho / M_U_G * comp.x().max(1e-6);
    let kt = K_B_ERG_K * t;
    let thermal = 2.0 * std::f64::consts::PI * M_E_G * kt / (H_ERG_S * H_ERG_S);
    let s = thermal * thermal.sqrt() * (-13.598 * EV_ERG / kt).fast_exp() / n_h;
    if s <= 0.0 {
        return 0.0;
    }
    2.0 / (1.0 + (1.0 + 4.0 / s).sqrt())
}

/// The evaporation temperature of metal grains in the fit of Bell & Lin (1994),
/// 2029.76 rho^(1/81) K (docs/references.md §8.3, computed): below it grains dominate the
/// opacity, which this law does not include.
pub fn grain_evaporation_k(rho: f64) -> f64 {
    2029.76 * rho.powf(1.0 / 81.0)
}

impl Opacity for RefinedOpacity {
    fn caution(&self, rho: f64, t: f64, _comp: &Composition) -> Option<&'static str> {
        (t < grain_evaporation_k(rho)).then_some(
            "below the evaporation temperature of metal grains (about 2000 K, Bell & Lin 1994): grain opacity not included",
        )
    }

    fn temperature_breaks_k(&self) -> &'static [f64] {
        &SWITCH_ENDS_K
    }

    fn name(&self) -> String {
        if *self == Self::default() {
            "refined".to_string()
        } else {
            format!(
                "refined:guillotine={},exponent={}",
                self.guillotine, self.density_exponent
            )
        }
    }

    fn kappa(&self, rho: f64, t: f64, comp: &Composition) -> Result<f64, PhysicsError> {
        check_point("refined", rho, t)?;
        let (tlo, thi) = REFINED_T_RANGE_K;
        if !(tlo..=thi).contains(&t) {
            return Err(PhysicsError::new(
                "refined",
                format!("temperature outside the law's domain {tlo:e}..{thi:e} K"),
                rho,
                t,
            ));
        }
        let kappa = combine(
            self.radiative(rho, t, comp),
            Conductive::formula(rho, t, comp),
        );
        if kappa.is_finite() && kappa > 0.0 {
            Ok(kappa)
        } else {
            Err(PhysicsError::new("refined", "opacity not finite", rho, t))
        }
    }
}
