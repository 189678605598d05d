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
//! How it enters the `molecular` law (a choice of this project), and what is left out:
//! - **Charges in proportion to the free electrons.** The Coulomb free energy is carried by the
//!   free electrons and the charge they leave on the ions: with N_e free electrons,
//!   F_C = N_e kT phi(Gamma_e), phi(G) = sum_j (nu_j / nu_e) f(Z_j^(5/3) G), where nu_j / nu_e
//!   are the ions of each species per electron of the fully ionised mixture (H+, He++, metals of
//!   charge 7) and Gamma_e is taken at the actual free-electron density. Fully ionised, this is
//!   the linear-mixing OCP above; in neutral gas it vanishes with N_e, so no switch in
//!   temperature is needed.
//! - **In the ionisation balance.** Minimising the free energy over the stages adds
//!   mu_C = dF_C / dN_e = kT (phi + u_phi / 3), u_phi = G dphi/dG, to the electron chemical
//!   potential in every Saha equation (the Coulomb lowering of the ionisation energies, which
//!   ionises dense gas). Because the balance minimises the total free energy, P, U and the
//!   entropy follow from F_C at fixed stages: P_C = n_e kT u_phi / 3, U_C = 3 P_C / rho per gram
//!   (the virial of a 1/r potential), S_C = (U_C - F_C) / T, thermodynamically consistent with
//!   each other and with the ideal part, with no terms from a switch.
//! - No electron screening (electron–ion polarisation) and no exchange–correlation of the
//!   electrons: exact for a rigid background (degenerate electrons); for non-degenerate
//!   electrons the Debye–Hückel free energy with the electrons' screening is 2.8 times the ions'
//!   alone for hydrogen (k_D^3 grows by 2^(3/2)), so the term is an underestimate there.
//! - The weights per free electron are those of the fully ionised mixture: in the hydrogen
//!   ionisation zone, where helium and the metals still hold their electrons, this overstates
//!   F_C per electron by a factor of about 1.5 in the Debye–Hückel limit and 1.1 at strong
//!   coupling; and every stage gets the same lowering, where a charge-dependent one would give
//!   He II -> He III twice that of hydrogen.
//! - Liquid at any Gamma (no crystallisation; the solid is stable above Gamma_j ~ 175, reached
//!   first by the metal ions at Gamma_e = 6.8; ZAMS stars reach Gamma_e = 4.5 at the
//!   free-electron density, in the hydrogen ionisation zone of the lowest masses).
//! - Cold dense gas at the pressure-ionisation transition ([`TRANSITION_BOXES`]): the
//!   equilibrium is multi-valued there.
//!
//! Pressure: P_C = n_e kT u_phi / 3, about -0.34 Gamma_e n_e kT at strong coupling (u_phi is
//! about -1.01 Gamma_e per electron at X = 0.7): larger in size than the pressure of
//! non-degenerate electrons only above Gamma_e of about 3.

use crate::constants::{E_ESU, K_B_ERG_K};
use crate::numerics::cube_root::cbrt;

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

/// The OCP free energy per ion f(Gamma) = F / (N kT) (Potekhin & Chabrier 2000 liquid fit).
/// Written as A1 A2 b(sqrt(G/A2)) + 2 A3 c(sqrt G) + ..., with b(y) = y sqrt(1 + y^2) - asinh y
/// and c(s) = s - arctan s evaluated without cancellation at small arguments.
pub fn ocp_free_energy(gamma: f64) -> f64 {
    let g = gamma;
    A1 * A2 * root_minus_asinh((g / A2).sqrt())
        + 2.0 * a3() * minus_arctan(g.sqrt())
        + B1 * (g - B2 * (g / B2).ln_1p())
        + 0.5 * B3 * (g * g / B4).ln_1p()
}

/// Below this argument the differences b(y) and c(s) are summed as series (terms falling by
/// y^2 <= 0.01, twelve of them: below 1e-16 relative); above, the closed forms lose at most
/// about 1e-14 to cancellation.
const SERIES_ARGUMENT: f64 = 0.1;

/// b(y) = y sqrt(1 + y^2) - asinh y = int_0^y 2 t^2 / sqrt(1 + t^2) dt
/// = 2 sum_n binom(-1/2, n) y^(2n+3) / (2n + 3).
fn root_minus_asinh(y: f64) -> f64 {
    if y > SERIES_ARGUMENT {
        return y * (1.0 + y * y).sqrt() - y.asinh();
    }
    let (y2, mut power, mut binomial, mut sum) = (y * y, y * y * y, 1.0, 0.0);
    for n in 0..12 {
        sum += binomial * power / (2 * n + 3) as f64;
        // binom(-1/2, n + 1) = binom(-1/2, n) (-1/2 - n) / (n + 1).
        binomial *= -(0.5 + n as f64) / (n + 1) as f64;
        power *= y2;
    }
    2.0 * sum
}

/// c(s) = s - arctan s = sum_(n >= 1) (-1)^(n+1) s^(2n+1) / (2n + 1).
fn minus_arctan(s: f64) -> f64 {
    if s > SERIES_ARGUMENT {
        return s - s.atan();
    }
    let (s2, mut power, mut sign, mut sum) = (s * s, s * s * s, 1.0, 0.0);
    for n in 1..13 {
        sum += sign * power / (2 * n + 1) as f64;
        sign = -sign;
        power *= s2;
    }
    sum
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

/// ln Gamma below which [`ocp_exact`] uses the fit's series ([`ocp_series`], exact to 1e-14
/// there), Gamma = 2.96e-4.
const SERIES_LN_GAMMA: f64 = -8.125;

/// The coefficients of G^(3/2), G^2, G^(5/2), ..., G^6 in [`ocp_series`]:
/// c3 = -1/sqrt(3), d2 = B1/(2 B2) + B3/(2 B4), c5 = -(A1/A2^(3/2) + 2 A3)/5, d3 = -B1/(3 B2^2),
/// c7 = (3/28) A1/A2^(5/2) + (2/7) A3, d4 = -B3/(4 B4^2), c9 = -(5/72) A1/A2^(7/2) - (2/9) A3,
/// then none at G^5 and G^(11/2) (below 1e-19 of f), d6 = B3/(6 B4^3)
/// (evaluated in 40-digit arithmetic; a test checks them against these expressions).
const SERIES_COEFFICIENTS: [f64; 10] = [
    -0.577_350_269_189_625_8,
    -0.011_338_116_057_233_704,
    0.252_814_618_096_275_6,
    -5.190_311_418_685_121e-8,
    -0.230_878_797_869_013_2,
    1.533_966_398_831_263_7,
    0.258_271_485_344_172_1,
    0.0,
    0.0,
    -276.390_342_131_759_2,
];

/// The fit's expansion at small Gamma, with its derivatives in ln Gamma:
/// f = -G^(3/2)/sqrt(3) + c5 G^(5/2) + c7 G^(7/2) + c9 G^(9/2) + d2 G^2 + d3 G^3 + d4 G^4 +
/// d6 G^6, from
/// y sqrt(1 + y^2) - asinh y = (2/3) y^3 - y^5/5 + (3/28) y^7 - (5/72) y^9 (y^2 = G/A2),
/// s - arctan s = s^3/3 - s^5/5 + s^7/7 - s^9/9 (s^2 = G) and the logarithms' series; the next
/// terms are below 1e-14 of f, u and Gamma du/dGamma for Gamma < 3e-4 (checked against
/// 40-digit arithmetic when written).
pub fn ocp_series(ln_gamma: f64) -> [f64; 3] {
    // Powers of sqrt(Gamma) by multiplication from one exponential.
    let r = (0.5 * ln_gamma).exp();
    let (mut power, mut k) = (r * r * r, 1.5);
    let mut out = [0.0; 3];
    for c in SERIES_COEFFICIENTS {
        let t = c * power;
        out[0] += t;
        out[1] += k * t;
        out[2] += k * k * t;
        power *= r;
        k += 0.5;
    }
    out
}

/// The OCP's (f, u, Gamma du/dGamma) at x = ln Gamma: the value and the first two derivatives
/// of f in ln Gamma, from the fit's series below Gamma = 2.96e-4 ([`ocp_series`]) and its
/// formula above ([`ocp_free_energy`], [`ocp_energy`]).
pub fn ocp_exact(ln_gamma: f64) -> [f64; 3] {
    if ln_gamma <= SERIES_LN_GAMMA {
        return ocp_series(ln_gamma);
    }
    let g = ln_gamma.exp();
    let (u, du) = ocp_energy(g);
    [ocp_free_energy(g), u, g * du]
}

/// Cold dense gas where the Coulomb lowering of the ionisation energies makes the equilibrium
/// multi-valued (several solutions of charge neutrality, P falling with rho at fixed T), as
/// boxes (T below, rho from, rho to; K and g/cm^3). Found by scanning X = 0–0.98, 1e3–1e7 K,
/// 1e-3–1e3 g/cm^3 for states refused or inversions rho(P, T) landing on another state:
/// hydrogen-rich gas from 0.19 g/cm^3 below 1.2e4 K and from 0.5 g/cm^3 up to 2e4 K,
/// helium-rich gas from 9 g/cm^3 up to 3.7e4 K, all below 310 g/cm^3; outside the boxes the scan
/// finds one equilibrium everywhere (tests/eos_molecular.rs repeats it). The same kind of
/// first-order transition (the plasma phase transition of dense hydrogen) was predicted by
/// Saumon & Chabrier (1992, PRA 46, 2084) below about 1.5e4 K near 0.35 g/cm^3 (numbers from
/// memory). This law cannot represent the two phases: inside the boxes it returns one of the
/// solutions, or refuses where c_V or chi_rho is not positive, and cautions. No ZAMS star comes
/// near: the envelope of the limiting 0.078 M_sun star passes 1e4 K at 0.04 g/cm^3, 2e4 K at
/// 0.23 and 6e4 K at 2.
pub const TRANSITION_BOXES: [(f64, f64, f64); 3] = [
    (1.2e4, 0.15, 400.0),
    (2.0e4, 0.4, 400.0),
    (1.0e5, 8.0, 400.0),
];

/// Whether (rho, T) lies in one of [`TRANSITION_BOXES`].
pub fn in_transition_region(rho: f64, t: f64) -> bool {
    TRANSITION_BOXES
        .iter()
        .any(|&(t_max, lo, hi)| t < t_max && (lo..=hi).contains(&rho))
}

/// Ion species for the mixture: (ions per m_u, Z^(5/3) of the charge Z).
pub type IonSpecies = [(f64, f64); 3];

/// 2^(5/3), for He++.
pub const Z53_HELIUM: f64 = 3.174_802_103_936_399;
/// 7^(5/3), for the metal ions of charge 7.
pub const Z53_METALS: f64 = 25.615_139_970_160_804;

/// ln[e^2 (4 pi / 3)^(1/3) / k], so that ln Gamma_e = this - ln T + (1/3) ln n_e (cgs).
pub fn ln_coupling_constant() -> f64 {
    (E_ESU * E_ESU / K_B_ERG_K).ln() + (4.0 / 3.0 * std::f64::consts::PI).ln() / 3.0
}

/// Gamma_e = e^2 / (a_e kT), a_e = (3 / (4 pi n_e))^(1/3), for `n_e_cm3` free electrons per cm^3
/// at temperature `t` (K).
pub fn electron_coupling(n_e_cm3: f64, t: f64) -> f64 {
    E_ESU * E_ESU / (K_B_ERG_K * t) * cbrt(4.0 / 3.0 * std::f64::consts::PI * n_e_cm3)
}

/// The mixture's Coulomb free energy per free electron, phi(Gamma_e) = F_C / (N_e kT) =
/// sum_j (nu_j / nu_e) f(Z_j^(5/3) Gamma_e), with nu_j / nu_e the ions of species j per electron
/// of the fully ionised mixture (see the module documentation).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CoulombMixture {
    /// (ions per fully ionised electron, Z^(5/3)) of each species with ions.
    species: IonSpecies,
    /// ln Z^(5/3) of each species.
    ln_z53: [f64; 3],
}

impl CoulombMixture {
    /// For the fully ionised `ions` (per m_u) with `electrons_per_mu` electrons per m_u.
    pub fn new(ions: &IonSpecies, electrons_per_mu: f64) -> Self {
        let per_electron = |(nu, z53): (f64, f64)| {
            if nu > 0.0 && electrons_per_mu > 0.0 {
                (nu / electrons_per_mu, z53)
            } else {
                (0.0, z53)
            }
        };
        Self {
            species: ions.map(per_electron),
            ln_z53: ions.map(|(_, z53)| z53.ln()),
        }
    }

    /// The coupling functions at `gamma_e`.
    pub fn at(&self, gamma_e: f64) -> Coupling {
        self.at_ln(gamma_e.ln(), gamma_e)
    }

    /// The coupling functions at ln Gamma_e = `ln_gamma_e` (Gamma_e = `gamma_e`): from this
    /// mixture's table ([`super::coulomb_table`]) inside its range, else summed from
    /// [`ocp_exact`].
    pub fn at_ln(&self, ln_gamma_e: f64, gamma_e: f64) -> Coupling {
        let exact = |x: f64| self.exact_at_ln(x);
        let [phi, u, slope] = super::coulomb_table::mixture_at(self.key(), exact, ln_gamma_e)
            .unwrap_or_else(|| exact(ln_gamma_e));
        Coupling {
            gamma_e,
            free_energy: phi,
            energy: u,
            energy_slope: slope,
        }
    }

    /// (phi, u_phi, Gamma_e du_phi/dGamma_e) at ln Gamma_e summed over the species from the
    /// fit itself (what the table of [`super::coulomb_table`] is built from).
    pub fn exact_at_ln(&self, ln_gamma_e: f64) -> [f64; 3] {
        let mut out = [0.0; 3];
        for (&(w, _), &ln_z53) in self.species.iter().zip(&self.ln_z53) {
            if w <= 0.0 {
                continue;
            }
            let v = ocp_exact(ln_gamma_e + ln_z53);
            for k in 0..3 {
                out[k] += w * v[k];
            }
        }
        out
    }

    /// The bits of the mixture's weights and charges: what identifies its table.
    pub fn key(&self) -> [u64; 6] {
        let [(w0, z0), (w1, z1), (w2, z2)] = self.species;
        [w0, z0, w1, z1, w2, z2].map(f64::to_bits)
    }
}

/// The Coulomb coupling per free electron at one Gamma_e.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Coupling {
    /// Gamma_e at the free-electron density.
    pub gamma_e: f64,
    /// phi = F_C / (N_e kT).
    pub free_energy: f64,
    /// u_phi = U_C / (N_e kT) = Gamma_e dphi/dGamma_e.
    pub energy: f64,
    /// Gamma_e du_phi/dGamma_e.
    pub energy_slope: f64,
}

impl Coupling {
    /// mu_C / kT = d(N_e phi) / dN_e = phi + u_phi / 3 (Gamma_e grows as N_e^(1/3)): the shift of
    /// the electron chemical potential in the ionisation balance.
    pub fn chemical_potential(&self) -> f64 {
        self.free_energy + self.energy / 3.0
    }

    /// Gamma_e d(mu_C / kT) / dGamma_e = u_phi + (Gamma_e du_phi/dGamma_e) / 3.
    pub fn chemical_potential_slope(&self) -> f64 {
        self.energy + self.energy_slope / 3.0
    }
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

    /// The mixture's phi, u_phi = Gamma dphi/dGamma, its slope, and the chemical potential
    /// mu_C / kT = d(N_e phi(Gamma(N_e))) / dN_e (Gamma proportional to N_e^(1/3) at fixed
    /// volume and T) against central differences.
    #[test]
    fn mixture_energy_and_chemical_potential_are_derivatives_of_the_free_energy() {
        let ions: IonSpecies = [(0.7, 1.0), (0.07, Z53_HELIUM), (0.00125, Z53_METALS)];
        let mix = CoulombMixture::new(&ions, 0.7 + 0.14 + 0.00875);
        for g in [1e-3, 0.05, 0.3, 1.0, 2.0, 5.0] {
            let c = mix.at(g);
            let e: f64 = 1e-5;
            let phi = |x: f64| mix.at(x).free_energy;
            let d_phi = (phi(g * e.exp()) - phi(g * (-e).exp())) / (2.0 * e);
            assert!(
                (d_phi - c.energy).abs() < 1e-7 * c.energy.abs() + 1e-12,
                "{g}"
            );
            let u = |x: f64| mix.at(x).energy;
            let d_u = (u(g * e.exp()) - u(g * (-e).exp())) / (2.0 * e);
            assert!((d_u - c.energy_slope).abs() < 1e-7 * c.energy_slope.abs() + 1e-12);
            // N_e phi with N_e = (Gamma / g)^3: d/dN_e at N_e = 1. phi is a difference of O(1)
            // terms at small Gamma: 1e-10 absolute resolution of the difference quotient.
            let total = |n: f64| n * phi(g * n.cbrt());
            let mu = (total(1.0 + e) - total(1.0 - e)) / (2.0 * e);
            assert!(
                (mu - c.chemical_potential()).abs() < 1e-7 * mu.abs() + 1e-10,
                "{g}: {mu} vs {}",
                c.chemical_potential()
            );
            let m = |x: f64| mix.at(x).chemical_potential();
            let d_m = (m(g * e.exp()) - m(g * (-e).exp())) / (2.0 * e);
            let slope = c.chemical_potential_slope();
            assert!((d_m - slope).abs() < 1e-7 * slope.abs() + 1e-12, "{g}");
        }
    }

    /// The series against the formula below 3e-4 (the series to 1e-13), and [`ocp_exact`]
    /// continuous where it changes from one to the other.
    #[test]
    fn series_matches_the_fit() {
        for g in [1e-8, 1e-6, 1e-4, 2e-4, 2.9e-4] {
            let [f, u, s] = ocp_series(f64::ln(g));
            let (u0, du0) = ocp_energy(g);
            assert!((f / ocp_free_energy(g) - 1.0).abs() < 1e-13, "{g}");
            assert!((u / u0 - 1.0).abs() < 1e-13 && (s / (g * du0) - 1.0).abs() < 1e-13);
        }
        let below = ocp_exact(SERIES_LN_GAMMA - 1e-12);
        let above = ocp_exact(SERIES_LN_GAMMA + 1e-12);
        for k in 0..3 {
            assert!((below[k] / above[k] - 1.0).abs() < 1e-10, "{k}");
        }
    }

    /// A mixture's table ([`super::super::coulomb_table`]) against the fit over its range,
    /// within the bounds of that module's documentation (1.5e-11, 1.9e-9 and 2e-7 of phi, u_phi
    /// and Gamma_e du_phi/dGamma_e), for a solar and a helium-only mixture.
    #[test]
    fn mixture_table_matches_the_fit() {
        use crate::physics::eos::coulomb_table::MIXTURE_LN_GAMMA;
        for (x, z) in [(0.70, 0.02), (0.0, 0.02)] {
            let y: f64 = 1.0 - x - z;
            let ions: IonSpecies = [(x, 1.0), (0.25 * y, Z53_HELIUM), (z / 16.0, Z53_METALS)];
            let m = CoulombMixture::new(&ions, x + 0.5 * y + z * (0.5 - 1.0 / 16.0));
            let (lo, hi) = MIXTURE_LN_GAMMA;
            for i in 1..20_000 {
                let x = lo + (hi - lo) * f64::from(i) / 20_000.0;
                let c = m.at_ln(x, x.exp());
                let (f, u, s) = (c.free_energy, c.energy, c.energy_slope);
                let [f0, u0, s0] = m.exact_at_ln(x);
                assert!((f - f0).abs() < 1.5e-11 * f0.abs(), "phi at {x}: {f} {f0}");
                assert!((u - u0).abs() < 1.9e-9 * u0.abs(), "u at {x}: {u} {u0}");
                assert!((s - s0).abs() < 2e-7 * s0.abs(), "slope at {x}: {s} {s0}");
            }
        }
    }

    /// The series' coefficients are the expressions of the fit's constants they stand for.
    #[test]
    fn series_coefficients_are_those_of_the_fit() {
        let a3 = a3();
        let expected = [
            -1.0 / 3f64.sqrt(),
            B1 / (2.0 * B2) + B3 / (2.0 * B4),
            -(A1 / A2.powf(1.5) + 2.0 * a3) / 5.0,
            -B1 / (3.0 * B2 * B2),
            3.0 / 28.0 * A1 / A2.powf(2.5) + 2.0 / 7.0 * a3,
            -B3 / (4.0 * B4 * B4),
            -5.0 / 72.0 * A1 / A2.powf(3.5) - 2.0 / 9.0 * a3,
            0.0,
            0.0,
            B3 / (6.0 * B4 * B4 * B4),
        ];
        for (c, e) in SERIES_COEFFICIENTS.iter().zip(expected) {
            assert!((c - e).abs() <= 1e-14 * e.abs(), "{c} vs {e}");
        }
    }

    /// Fully ionised hydrogen: phi is the OCP f of the protons, and Gamma_e = 2.2747e5
    /// (rho Y_e)^(1/3) / T (docs/references.md §8.2, computed from the constants).
    #[test]
    fn pure_hydrogen_is_the_one_component_plasma() {
        let mix = CoulombMixture::new(&[(1.0, 1.0), (0.0, Z53_HELIUM), (0.0, Z53_METALS)], 1.0);
        for g in [0.01, 1.0, 10.0] {
            assert!((mix.at(g).free_energy / ocp_free_energy(g) - 1.0).abs() < 2e-11);
        }
        let (rho, t) = (100.0, 1e7);
        let n_e = rho / crate::constants::M_U_G;
        let expected = 2.2747e5 * rho.cbrt() / t;
        assert!((electron_coupling(n_e, t) / expected - 1.0).abs() < 1e-4);
        // The logarithmic form the balance uses is the same coupling.
        let from_ln = (ln_coupling_constant() - t.ln() + n_e.ln() / 3.0).exp();
        assert!((from_ln / electron_coupling(n_e, t) - 1.0).abs() < 1e-14);
    }
}
