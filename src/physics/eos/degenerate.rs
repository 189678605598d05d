//! `degenerate`: fully ionised matter with electrons of arbitrary degeneracy.

use super::plasma::{plasma_law, Electrons, Ionisation, Plasma};

/// Fully ionised ideal ions, non-relativistic electrons of arbitrary degeneracy, radiation.
///
/// n_e = rho / (mu_e m_u) = (4/sqrt(pi)) (2 pi m_e k T / h^2)^(3/2) F_1/2(psi) fixes psi;
/// P_e = (2/3) (4/sqrt(pi)) (2 pi m_e k T / h^2)^(3/2) k T F_3/2(psi), P = P_ion + P_e + a T^4/3
/// (e.g. Cox & Giuli 1968, ch. 24; Kippenhahn & Weigert 1990, §15). Limits: P_e -> n_e k T for
/// psi -> -inf (ideal gas) and P_e -> K (rho / mu_e)^(5/3) with
/// K = (3/pi)^(2/3) h^2 / (20 m_e m_u^(5/3)) = 1.0036e13 cgs for psi -> +inf. Fermi–Dirac integrals
/// from [`super::fermi_dirac`]; derivatives analytic (see [`super::plasma`]).
///
/// Domain: 1e-15 <= rho <= 1e5 g/cm^3, 1e3 <= T <= 1e9 K. Relativistic corrections are not
/// included; they reach about 5 per cent of P_e at 1e5 g/cm^3 (p_F = 0.37 m_e c for mu_e = 2).
#[derive(Debug, Clone, Copy, Default)]
pub struct DegenerateGas;

const ENGINE: Plasma = Plasma {
    law: "degenerate",
    ionisation: Ionisation::Full,
    electrons: Electrons::FermiDirac,
    coulomb: false,
    rho_range_g_cm3: (1e-15, 1e5),
    temperature_range_k: (1e3, 1e9),
};

plasma_law!(DegenerateGas, ENGINE);
