//! Coulomb (non-ideal) correction of the ions for the `molecular` equation of state.
//!
//! One-component plasma (OCP) of classical ions in a rigid (uniform) electron background, the
//! liquid-phase fit of Potekhin & Chabrier (2000, PRE 62, 8554; docs/references.md §8.2):
//! f = F / (N kT) = A1 [sqrt(G (A2 + G)) - A2 ln(sqrt(G/A2) + sqrt(1 + G/A2))]
//!     + 2 A3 [sqrt(G) - arctan sqrt(G)] + B1 [G - B2 ln(1 + G/B2)] + (B3/2) ln(1 + G^2/B4),
//! u = U / (N kT) = G df/dG, with A1 = -0.907347, A2 = 0.62849, A3 = -sqrt(3)/2 - A1/sqrt(A2),
//! B1 = 0.0045, B2 = 170, B3 = -8.4e-5, B4 = 0.0037 (G = Gamma; the A3 term makes the
//! Debye–Hückel limit f = -G^(3/2)/sqrt(3) exact). Mixtures by the linear mixing rule,
//! F = kT sum_j N_j f(Gamma_j), Gamma_j = Z_j^(5/3) Gamma_e, Gamma_e = e^2 / (a_e kT),
//! a_e = (3 / (4 pi n_e))^(1/3) (Chabrier & Potekhin 1998, PRE 58, 4941).
//!
//! How it enters the `molecular` law, and what is left out:
//! - The ions are taken with their full charges (H+, He++, metals of charge 7) and n_e of the
//!   fully ionised mixture, so F_C is an explicit function of (rho, T), multiplied by a switch
//!   S(T) that rises from 0 at [`COULOMB_T_OFF_K`] to 1 at [`COULOMB_T_ON_K`]:
//!   F = S(T) F_OCP(rho, T). Since F is a function of (rho, T) alone, P, U and the entropy derived
//!   from it are thermodynamically consistent with each other and with the ideal part, and an
//!   adiabat maps the (ideal) photosphere onto the (fully coupled) interior correctly whatever
//!   happens in between. The switch is off where hydrogen recombines, where the fully ionised
//!   OCP does not describe the plasma, and fully on in the cores of all hydrogen-burning stars.
//!   Its temperature dependence adds -F_OCP dS/dln T to U and its derivative to c_V: an artefact
//!   of switching, which raises nabla_ad where Gamma_e ~ 1 in the switch (to about 0.45 in a
//!   0.1 M_sun star and 0.6 at 0.075 M_sun, near 1e6 K; below 0.42 from 0.2 M_sun up). S is
//!   infinitely differentiable (a switch whose higher derivatives jump leaves a kink in nabla_ad,
//!   which costs the integrator accuracy). A self-consistent treatment (the Coulomb term in the
//!   ionisation balance) would remove the artefact.
//! - No electron screening (electron–ion polarisation) and no exchange–correlation of the
//!   electrons: exact for a rigid background (degenerate electrons); for non-degenerate
//!   electrons the Debye–Hückel screening by electrons, left out, adds a comparable term.
//! - Liquid at any Gamma (no crystallisation; the solid is stable above Gamma_j ~ 175, reached
//!   only by metal ions at Gamma_e > 5.5, far above the Gamma_e < 1 of ZAMS stars).
//!
//! Pressure: P_C = n_ion kT u/3 >= -n_ion kT 0.3 Gamma: never negative in total wherever
//! electrons or ions carry the pressure, since Gamma_e ~ 1 needs rho above 1 g/cm^3 at 1e5 K, where
//! the electrons are degenerate (tested over the law's domain).

use crate::constants::{E_ESU, K_B_ERG_K, M_U_G};
use crate::numerics::cube_root::cbrt;
use crate::numerics::smooth::switch_weight_curved_ln;

const A1: f64 = -0.907_347;
const A2: f64 = 0.628_49;
const B1: f64 = 0.0045;
const B2: f64 = 170.0;
const B3: f64 = -8.4e-5;
const B4: f64 = 0.0037;

/// A3 = -sqrt(3)/2 - A1/sqrt(A2), which makes the Debye–Hückel limit exact.
fn a3() -> f64 {
    -0.75f64.sqrt() - A1 / A2.sqrt()
}

/// Temperature below which the Coulomb term is off, K (hydrogen recombines below it in ZAMS
/// envelopes).
pub const COULOMB_T_OFF_K: f64 = 1.0e5;
/// Temperature above which the Coulomb term is fully on, K: below the central temperature of
/// the lowest-mass stars (3e6 K at 0.075 M_sun), and far enough from [`COULOMB_T_OFF_K`] that the
/// switch's own terms stay small.
pub const COULOMB_T_ON_K: f64 = 2.5e6;

/// The OCP free energy per ion f(Gamma) = F / (N kT) (Potekhin & Chabrier 2000 liquid fit).
pub fn ocp_free_energy(gamma: f64) -> f64 {
    let g = gamma;
    let s = g.sqrt();
    A1 * ((g * (A2 + g)).sqrt() - A2 * ((g / A2).sqrt() + (1.0 + g / A2).sqrt()).ln())
        + 2.0 * a3() * (s - s.atan())
        + B1 * (g - B2 * (g / B2).ln_1p())
        + 0.5 * B3 * (g * g / B4).ln_1p()
}

/// The OCP internal energy per ion u(Gamma) = U / (N kT) = Gamma df/dGamma, and du/dGamma.
pub fn ocp_energy(gamma: f64) -> (f64, f64) {
    let g = gamma;
    let s = g.sqrt();
    let a3 = a3();
    let root = (A2 + g).sqrt();
    let u =
        g * s * (A1 / root + a3 / (1.0 + g)) + B1 * g * g / (B2 + g) + B3 * g * g / (B4 + g * g);
    let du = A1 * (1.5 * s / root - 0.5 * g * s / (root * root * root))
        + a3 * (1.5 * s / (1.0 + g) - g * s / ((1.0 + g) * (1.0 + g)))
        + B1 * (2.0 * g / (B2 + g) - g * g / ((B2 + g) * (B2 + g)))
        + B3 * 2.0 * g * B4 / ((B4 + g * g) * (B4 + g * g));
    (u, du)
}

/// The Coulomb contribution at one (rho, T), per unit mass, with the derivatives the
/// equation of state needs.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct CoulombTerm {
    /// Pressure P_C, dyn cm^-2.
    pub pressure: f64,
    /// (dP_C / dln rho)_T, dyn cm^-2.
    pub dp_dln_rho: f64,
    /// (dP_C / dln T)_rho, dyn cm^-2.
    pub dp_dln_t: f64,
    /// Specific internal energy U_C, erg g^-1.
    pub energy: f64,
    /// (dU_C / dln T)_rho, erg g^-1.
    pub de_dln_t: f64,
    /// Electron coupling parameter Gamma_e of the fully ionised mixture.
    pub gamma_e: f64,
    /// Phi_1 = sum_j nu_j u(Gamma_j), per m_u (nu_j ions per m_u).
    pub ion_energy_sum: f64,
    /// Phi_2 = sum_j nu_j Gamma_j du/dGamma(Gamma_j), per m_u.
    pub ion_energy_slope_sum: f64,
}

/// Ion species for the mixture: (ions per m_u, Z^(5/3) of the charge Z).
pub type IonSpecies = [(f64, f64); 3];

/// 2^(5/3), for He++.
pub const Z53_HELIUM: f64 = 3.174_802_103_936_399;
/// 7^(5/3), for the metal ions of charge 7.
pub const Z53_METALS: f64 = 25.615_139_970_160_804;

/// The switch S(T) with dS/dln T and d^2S/dln T^2: 0 below [`COULOMB_T_OFF_K`], 1 above
/// [`COULOMB_T_ON_K`], infinitely differentiable in between
/// ([`crate::numerics::smooth::switch_weight_curved`]), so that c_V and nabla_ad, which contain
/// the second derivative of S, stay smooth (a switch whose higher derivatives jump leaves a kink
/// in nabla_ad, which costs the integrator accuracy).
fn switch(t: f64) -> (f64, f64, f64) {
    switch_ln(t.ln())
}

/// [`switch`] at ln T.
fn switch_ln(ln_t: f64) -> (f64, f64, f64) {
    switch_weight_curved_ln(
        ln_t - (COULOMB_T_OFF_K * COULOMB_T_ON_K).sqrt().ln(),
        (COULOMB_T_OFF_K / COULOMB_T_ON_K).sqrt(),
    )
}

/// Gamma_e = e^2 / (a_e kT) for `electrons_per_mu` electrons per m_u at (rho, T).
fn electron_coupling(rho: f64, t: f64, electrons_per_mu: f64) -> f64 {
    let n_e = rho / M_U_G * electrons_per_mu;
    let a_e = (3.0 / (4.0 * std::f64::consts::PI * n_e)).cbrt();
    E_ESU * E_ESU / (a_e * K_B_ERG_K * t)
}

/// The switched specific free energy F_C = S(T) (kT / m_u) sum_j nu_j f(Z_j^(5/3) Gamma_e),
/// erg g^-1 (what [`coulomb_term`] differentiates).
pub fn coulomb_free_energy(rho: f64, t: f64, ions: &IonSpecies, electrons_per_mu: f64) -> f64 {
    let gamma_e = electron_coupling(rho, t, electrons_per_mu);
    let phi: f64 = ions
        .iter()
        .filter(|(nu, _)| *nu > 0.0)
        .map(|&(nu, z53)| nu * ocp_free_energy(z53 * gamma_e))
        .sum();
    switch(t).0 * K_B_ERG_K * t / M_U_G * phi
}

/// The parts of the switched OCP term that depend on T alone: an inversion rho(P, T) computes
/// them once.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CoulombAtTemperature {
    /// S, dS/dln T, d^2S/dln T^2.
    switch: (f64, f64, f64),
    /// kT / m_u, erg g^-1.
    per_mass: f64,
    /// Gamma_e / rho^(1/3).
    gamma_coefficient: f64,
}

impl CoulombAtTemperature {
    /// At temperature `t` for `electrons_per_mu` electrons per m_u; `None` where the switch is
    /// off.
    pub fn new(t: f64, electrons_per_mu: f64) -> Option<Self> {
        Self::with_ln(t, t.ln(), electrons_per_mu)
    }

    /// [`CoulombAtTemperature::new`] with ln T given.
    pub fn with_ln(t: f64, ln_t: f64, electrons_per_mu: f64) -> Option<Self> {
        let switch = switch_ln(ln_t);
        (switch.0 > 0.0).then(|| Self {
            switch,
            per_mass: K_B_ERG_K * t / M_U_G,
            gamma_coefficient: electron_coupling(1.0, t, electrons_per_mu),
        })
    }

    /// The term at density `rho` for the fully ionised `ions`. With `energy` false only the
    /// pressure and its derivatives are complete (U and dU/dln T are left at 0), which skips the
    /// logarithms of f: enough for the inversion rho(P, T) ([`CoulombAtTemperature::pressure_term`]
    /// then [`CoulombAtTemperature::with_energy`]).
    ///
    /// With Phi = sum nu_j f, Phi_1 = sum nu_j u, Phi_2 = sum nu_j Gamma du/dGamma (nu_j ions
    /// per m_u) and S' = dS/dln T: P = S (rho kT / m_u) Phi_1 / 3, U = (kT / m_u)(S Phi_1 -
    /// S' Phi) per gram, and their derivatives follow (dGamma/dln rho = Gamma/3,
    /// dGamma/dln T = -Gamma).
    pub fn term(&self, rho: f64, ions: &IonSpecies, energy: bool) -> CoulombTerm {
        let term = self.pressure_term(rho, ions);
        if energy {
            self.with_energy(&term, ions)
        } else {
            term
        }
    }

    /// The pressure terms at density `rho` (U and dU/dln T left at 0; Phi_1 and Phi_2 kept for
    /// [`CoulombAtTemperature::with_energy`]). Gamma_e from the cube root of
    /// [`crate::numerics::cube_root`] (2 ulp).
    pub fn pressure_term(&self, rho: f64, ions: &IonSpecies) -> CoulombTerm {
        let (s, s1, _) = self.switch;
        let gamma_e = self.gamma_coefficient * cbrt(rho);
        let (mut phi1, mut phi2) = (0.0, 0.0);
        for &(nu, z53) in ions {
            if nu <= 0.0 {
                continue;
            }
            let g = z53 * gamma_e;
            let (u, du) = ocp_energy(g);
            phi1 += nu * u;
            phi2 += nu * g * du;
        }
        let per_mass = self.per_mass;
        CoulombTerm {
            pressure: rho * per_mass * s * phi1 / 3.0,
            dp_dln_rho: rho * per_mass * s * (phi1 / 3.0 + phi2 / 9.0),
            dp_dln_t: rho * per_mass * ((s + s1) * phi1 - s * phi2) / 3.0,
            energy: 0.0,
            de_dln_t: 0.0,
            gamma_e,
            ion_energy_sum: phi1,
            ion_energy_slope_sum: phi2,
        }
    }

    /// `term` (from [`CoulombAtTemperature::pressure_term`] at this temperature for the same
    /// `ions`) with U and dU/dln T. f itself (logarithms, arctangent) enters only through the
    /// switch's derivatives, so it is evaluated only inside the switch.
    pub fn with_energy(&self, term: &CoulombTerm, ions: &IonSpecies) -> CoulombTerm {
        let (s, s1, s2) = self.switch;
        let (phi1, phi2) = (term.ion_energy_sum, term.ion_energy_slope_sum);
        let phi: f64 = if s1 > 1e-300 {
            ions.iter()
                .filter(|(nu, _)| *nu > 0.0)
                .map(|&(nu, z53)| nu * ocp_free_energy(z53 * term.gamma_e))
                .sum()
        } else {
            0.0
        };
        let per_mass = self.per_mass;
        CoulombTerm {
            energy: per_mass * (s * phi1 - s1 * phi),
            de_dln_t: per_mass * (s * phi1 - s1 * phi + 2.0 * s1 * phi1 - s * phi2 - s2 * phi),
            ..*term
        }
    }
}

/// The switched OCP term at density `rho` and temperature `t` for the fully ionised `ions`
/// with `electrons_per_mu` electrons per m_u: F = S(T) kT sum_j N_j f(Z_j^(5/3) Gamma_e)
/// ([`CoulombAtTemperature::term`]; zero where the switch is off).
pub fn coulomb_term(
    rho: f64,
    t: f64,
    ions: &IonSpecies,
    electrons_per_mu: f64,
    energy: bool,
) -> CoulombTerm {
    CoulombAtTemperature::new(t, electrons_per_mu)
        .map_or_else(CoulombTerm::default, |c| c.term(rho, ions, energy))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// u = Gamma df/dGamma and du/dGamma against central differences.
    #[test]
    fn energy_is_the_derivative_of_the_free_energy() {
        for g in [1e-4, 0.01, 0.3, 1.0, 10.0, 100.0, 175.0] {
            let e: f64 = 1e-5;
            let fd = (ocp_free_energy(g * e.exp()) - ocp_free_energy(g * (-e).exp())) / (2.0 * e);
            let (u, du) = ocp_energy(g);
            // f is a difference of O(1) terms at small Gamma: 1e-10 absolute resolution.
            assert!((fd - u).abs() < 1e-6 * u.abs() + 1e-10, "{g}: {fd} vs {u}");
            let fd2 = (ocp_energy(g * (1.0 + e)).0 - ocp_energy(g * (1.0 - e)).0) / (2.0 * e * g);
            assert!(
                (fd2 - du).abs() < 1e-6 * du.abs().max(1e-6),
                "{g}: {fd2} vs {du}"
            );
        }
    }

    /// The term's pressure and energy derivatives against central differences in (rho, T),
    /// including the switch.
    #[test]
    fn term_derivatives_match_finite_differences() {
        let ions: IonSpecies = [(0.7, 1.0), (0.07, Z53_HELIUM), (0.00125, Z53_METALS)];
        let ne = 0.7 + 0.14 + 0.00875;
        for (rho, t) in [(100.0, 1e7), (10.0, 8e5), (1.0, 4e5), (1e3, 3e6)] {
            let c = coulomb_term(rho, t, &ions, ne, true);
            let e: f64 = 1e-6;
            let at = |r: f64, tt: f64| coulomb_term(r, tt, &ions, ne, true);
            let dr = (at(rho * e.exp(), t).pressure - at(rho * (-e).exp(), t).pressure) / (2.0 * e);
            let dt = (at(rho, t * e.exp()).pressure - at(rho, t * (-e).exp()).pressure) / (2.0 * e);
            let de = (at(rho, t * e.exp()).energy - at(rho, t * (-e).exp()).energy) / (2.0 * e);
            let scale = c.pressure.abs().max(1e-300);
            assert!((dr - c.dp_dln_rho).abs() < 1e-5 * scale, "{rho} {t}");
            assert!((dt - c.dp_dln_t).abs() < 1e-5 * scale, "{rho} {t}");
            assert!((de - c.de_dln_t).abs() < 1e-5 * c.energy.abs().max(1e-300));
            // P = rho^2 dF/drho and U = F - T dF/dT.
            let f = |r: f64, tt: f64| coulomb_free_energy(r, tt, &ions, ne);
            let df_r = (f(rho * e.exp(), t) - f(rho * (-e).exp(), t)) / (2.0 * e);
            let df_t = (f(rho, t * e.exp()) - f(rho, t * (-e).exp())) / (2.0 * e);
            assert!((rho * df_r - c.pressure).abs() < 1e-5 * scale);
            assert!((f(rho, t) - df_t - c.energy).abs() < 1e-5 * c.energy.abs());
        }
    }
}
