//! The H2 <-> 2H dissociation balance of the `molecular` equation of state.
//!
//! For ideal gases the balance is (Saha-type law for a dissociation; docs/references.md §8.1)
//! n_H^2 / n_H2 = K(T) = (pi m_H k T / h^2)^(3/2) (g_H^2 / Q_H2) exp(-D0 / kT),
//! with the reduced mass m_H / 2, D0 = 36118.0696 cm^-1 = 4.478070 eV (D0/k = 51965.8 K) counted
//! from the v = 0, J = 0 level (Liu et al. 2009, J. Chem. Phys. 130, 174306), and Q_H2 the
//! rotation–vibration partition function counted from the same level. Nuclear spin is left out
//! everywhere (g_H = 2, the electron spin; symmetry number 2 in Q_H2), which gives the same K as
//! counting it in both.
//!
//! Q_H2 is the rigid rotor and harmonic oscillator (e.g. Herzberg 1950, *Spectra of Diatomic
//! Molecules*; constants of Huber & Herzberg 1979): Q = Q_rot Q_vib with
//! Q_vib = 1 / (1 - exp(-theta_v / T)), theta_v = 5987.0 K (the first vibrational spacing,
//! 4161.17 cm^-1, consistent with D0 counted from v = 0), and the high-temperature (Mulholland)
//! expansion of the rotational sum Q_rot = (T / (2 theta_r)) (1 + r/3 + r^2/15 + 4 r^3/315),
//! r = theta_r / T, theta_r = 85.35 K (B_0 = 59.322 cm^-1). At T >= 1000 K (r <= 0.085) the
//! expansion differs from the ortho/para sum by less than 1e-6. Accuracy: a direct sum over the
//! bound levels with anharmonicity is larger by 3% at 1500 K and 27% at 6000 K (docs/references.md
//! §8.1, "Q sum"), which moves the atomic fraction y by under 4% near half dissociation.

use crate::constants::{H_ERG_S, K_B_ERG_K, M_U_G};

/// Dissociation energy D0(H2) from v = 0, J = 0 over k, K (36118.0696 cm^-1 times
/// hc/k = 1.4387769 cm K; docs/references.md §8.1).
pub const H2_DISSOCIATION_K: f64 = 51_965.8;
/// Rotational temperature theta_r = h c B_0 / k of H2, K (B_0 = 59.322 cm^-1, Huber & Herzberg
/// 1979; docs/references.md §8.1).
pub const H2_THETA_ROT_K: f64 = 85.35;
/// Vibrational temperature of H2 from the first spacing Delta G_1/2 = 4161.17 cm^-1, K
/// (Huber & Herzberg 1979; docs/references.md §8.1).
pub const H2_THETA_VIB_K: f64 = 5987.0;
/// Mass of the hydrogen atom, in m_u (1.00782503 u; AME, memory).
pub const H_ATOM_MASS_U: f64 = 1.007_825_03;

/// The partition function and dissociation constant of H2 at one temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Dissociation {
    /// ln K, K in cm^-3 (spin-free convention: g_H = 2).
    pub ln_k_cm3: f64,
    /// d ln K / d ln T.
    pub dln_k_dln_t: f64,
    /// ln Q_H2, spin-free (symmetry number 2), counted from v = 0, J = 0.
    pub ln_q: f64,
    /// Rotation–vibration energy per molecule above v = 0, J = 0 over kT: d ln Q / d ln T.
    pub internal_energy_kt: f64,
    /// d(E_rv / k) / dT = d ln Q / d ln T + d^2 ln Q / d ln T^2 (the molecule's internal heat
    /// capacity over k).
    pub internal_heat_capacity_k: f64,
}

/// Q_H2 and K(T) with their temperature derivatives at `t` K (t > 0).
pub fn dissociation(t: f64) -> Dissociation {
    dissociation_with_ln(t, t.ln())
}

/// [`dissociation`] with ln T given (an inversion at fixed T shares it).
pub fn dissociation_with_ln(t: f64, ln_t: f64) -> Dissociation {
    // Rotation: ln Q_rot = ln(T / 2 theta_r) + ln p(r), p = 1 + r/3 + r^2/15 + 4 r^3/315.
    let r = H2_THETA_ROT_K / t;
    let p = 1.0 + r * (1.0 / 3.0 + r * (1.0 / 15.0 + r * 4.0 / 315.0));
    let dp = 1.0 / 3.0 + r * (2.0 / 15.0 + r * 12.0 / 315.0);
    let d2p = 2.0 / 15.0 + r * 24.0 / 315.0;
    // d/dln T = -r d/dr.
    let rot_e = 1.0 - r * dp / p;
    // d(rot_e)/dln T = -r d(rot_e)/dr, d(rot_e)/dr = -(dp + r d2p)/p + r dp^2/p^2.
    let rot_c = rot_e + r * ((dp + r * d2p) / p - r * dp * dp / (p * p));
    // Vibration: ln Q_vib = -ln(1 - e^-x), x = theta_v / T; E/kT = x / (e^x - 1).
    let x = H2_THETA_VIB_K / t;
    let em1 = x.exp_m1();
    let vib_e = x / em1;
    // d(vib_e)/dln T = -x d(vib_e)/dx = x^2 e^x / (e^x - 1)^2 - vib_e.
    let vib_c = x * x * (em1 + 1.0) / (em1 * em1);
    // ln Q_vib = -ln(1 - e^-x), with 1 - e^-x = (e^x - 1) / e^x from the same expm1.
    let ln_q = ln_t - (2.0 * H2_THETA_ROT_K).ln() + p.ln() - (em1 / (em1 + 1.0)).ln();
    let thermal = std::f64::consts::PI * H_ATOM_MASS_U * M_U_G * K_B_ERG_K / (H_ERG_S * H_ERG_S);
    let internal = rot_e + vib_e;
    Dissociation {
        ln_k_cm3: 1.5 * (thermal.ln() + ln_t) + 4f64.ln() - ln_q - H2_DISSOCIATION_K / t,
        dln_k_dln_t: 1.5 - internal + H2_DISSOCIATION_K / t,
        ln_q,
        internal_energy_kt: internal,
        // E/k = T e(T): d(E/k)/dT = e + de/dln T = rot_c + vib_c (rot_c, vib_c include e).
        internal_heat_capacity_k: rot_c + vib_c,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// ln Q and its temperature derivatives agree with central differences.
    #[test]
    fn derivatives_match_finite_differences() {
        for t in [1000.0, 2500.0, 6000.0, 2e4, 1e6] {
            let d = dissociation(t);
            let e: f64 = 1e-5;
            let (lo, hi) = (dissociation(t * (-e).exp()), dissociation(t * e.exp()));
            let fd_q = (hi.ln_q - lo.ln_q) / (2.0 * e);
            assert!((fd_q - d.internal_energy_kt).abs() < 1e-7, "{t}: {fd_q}");
            let fd_k = (hi.ln_k_cm3 - lo.ln_k_cm3) / (2.0 * e);
            assert!((fd_k - d.dln_k_dln_t).abs() < 1e-6 * fd_k.abs().max(1.0));
            // d(T e)/dT = e + de/dlnT.
            let fd_c =
                d.internal_energy_kt + (hi.internal_energy_kt - lo.internal_energy_kt) / (2.0 * e);
            assert!(
                (fd_c - d.internal_heat_capacity_k).abs() < 1e-6,
                "{t}: {fd_c}"
            );
        }
    }
}
