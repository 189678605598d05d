//! The entropy of ideal particles and of radiation, shared by the equations of state.
//!
//! Statistical mechanics of ideal gases (e.g. Landau & Lifshitz, *Statistical Physics*, §§42–45;
//! Kippenhahn & Weigert 1990, §14): N classical particles of mass m with internal weight g
//! (ground-state degeneracy times any occupation probability) at number density n have
//! S = N k [5/2 + ln(g n_Q / n)], n_Q = (2 pi m k T / h^2)^(3/2) (the Sackur–Tetrode entropy);
//! a set of sites shared among stages i with fractions f_i and weights g_i adds
//! S = -N k sum_i f_i ln(f_i / g_i); non-relativistic electrons of any degeneracy have
//! T S = (5/2) P_e V - N_e k T psi (U = 3/2 P V and the Euler relation, mu_e = k T psi); black-body
//! radiation has s = 4 a T^3 / (3 rho). The zero is the absolute one of k ln W, with the
//! statistical weights each law counts (nuclear spin left out).

use crate::constants::{A_RAD_CGS, H_ERG_S, K_B_ERG_K, M_U_G};

/// ln n_Q = ln[(2 pi m k T / h^2)^(3/2)] (n_Q in cm^-3) for particles of mass `mass_u` m_u at
/// temperature `t` K.
pub(super) fn ln_quantum_concentration(mass_u: f64, t: f64) -> f64 {
    1.5 * (2.0 * std::f64::consts::PI * mass_u * M_U_G * K_B_ERG_K * t / (H_ERG_S * H_ERG_S)).ln()
}

/// Sackur–Tetrode entropy in units of k per m_u of matter of `per_mu` particles per m_u of
/// mass `mass_u` m_u at ln(rho / m_u) = `ln_n_mu` and temperature `t`, internal weight 1:
/// N [5/2 + ln n_Q - ln(N rho / m_u)]; zero for N = 0.
pub(super) fn translational(per_mu: f64, mass_u: f64, ln_n_mu: f64, t: f64) -> f64 {
    if per_mu > 0.0 {
        per_mu * (2.5 + ln_quantum_concentration(mass_u, t) - per_mu.ln() - ln_n_mu)
    } else {
        0.0
    }
}

/// Mixing entropy of one site over its stages, in units of k: -sum_i f_i (ln f_i - ln g_i) for
/// (fraction f_i, ln g_i) pairs; a stage with f_i = 0 contributes nothing.
pub(super) fn stage_mixing(stages: &[(f64, f64)]) -> f64 {
    stages
        .iter()
        .filter(|(f, _)| *f > 0.0)
        .map(|&(f, ln_g)| -f * (f.ln() - ln_g))
        .sum()
}

/// Entropy of black-body radiation per unit mass, 4 a T^3 / (3 rho), erg g^-1 K^-1.
pub(super) fn radiation(rho: f64, t: f64) -> f64 {
    4.0 * A_RAD_CGS * t * t * t / (3.0 * rho)
}

/// k / m_u, erg g^-1 K^-1: converts an entropy in k per m_u into erg g^-1 K^-1.
pub(super) const K_PER_MU: f64 = K_B_ERG_K / M_U_G;

#[cfg(test)]
mod tests {
    use super::*;

    /// Sackur–Tetrode against its textbook value: one mole of argon-40-like particles (mass
    /// 39.948 u) at 298.15 K and 1 bar, S/R = 18.62 (CODATA key value 154.846 J/(K mol) over
    /// R = 8.314462618; docs/references.md §10).
    #[test]
    fn sackur_tetrode_for_argon() {
        let t = 298.15;
        let p = 1e6;
        let n = p / (K_B_ERG_K * t);
        // One particle per 39.948 m_u: N = 1/39.948 per m_u, rho / m_u = 39.948 n.
        let per_mu = 1.0 / 39.948;
        let s_per_particle = translational(per_mu, 39.948, (39.948 * n).ln(), t) / per_mu;
        assert!((s_per_particle - 154.846 / 8.314_462_618).abs() < 1e-3);
    }
}
