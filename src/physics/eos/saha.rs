//! `saha`: partial ionisation of H and He with classical (Maxwell–Boltzmann) electrons.

use super::plasma::{plasma_law, Electrons, Ionisation, Plasma};

/// H I/II and He I/II/III in Saha equilibrium, classical electrons, ideal ions, radiation.
///
/// P = n_nuc k T + n_e k T + a T^4 / 3 with n_e from charge neutrality and the Saha equations
/// n_(i+1) n_e / n_i = 2 (g_(i+1) / g_i) (2 pi m_e k T / h^2)^(3/2) exp(-chi_i / kT)
/// (Saha 1920; e.g. Kippenhahn & Weigert 1990, §14.1), ionisation energies 13.598, 24.587 and
/// 54.418 eV, ground-state statistical weights only, a hard-sphere pressure-ionisation factor,
/// metals fully ionised. Derivatives (chi_rho, chi_T, c_P, nabla_ad, Gamma_1) include the
/// ionisation terms analytically. Details in [`super::plasma`].
///
/// Domain: 1e-15 <= rho <= 1e3 g/cm^3, 1e3 <= T <= 1e9 K (outside it returns an error). The
/// electrons are never degenerate in this law; use `refined` where they are.
#[derive(Debug, Clone, Copy, Default)]
pub struct SahaGas;

const ENGINE: Plasma = Plasma {
    law: "saha",
    ionisation: Ionisation::Saha,
    electrons: Electrons::Classical,
    coulomb: false,
    rho_range_g_cm3: (1e-15, 1e3),
    temperature_range_k: (1e3, 1e9),
};

plasma_law!(SahaGas, ENGINE);
