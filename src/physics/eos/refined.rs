//! `refined`: the default equation of state, Saha ionisation with degenerate electrons.

use super::plasma::{plasma_law, Electrons, Ionisation, Plasma};

/// Saha ionisation of H and He and electrons of arbitrary degeneracy in one consistent model.
///
/// The ionisation balance is written with the electron degeneracy parameter psi,
/// n_(i+1)/n_i = (g_(i+1) w_(i+1) / (g_i w_i)) exp(-psi - chi_i/kT), which is the Saha equation
/// for classical electrons and stays valid when they are degenerate; the electron density and
/// pressure come from the Fermi–Dirac integrals F_1/2(psi), F_3/2(psi) (Cox & Giuli 1968,
/// ch. 15 and 24). Hard-sphere pressure ionisation (Hummer & Mihalas 1988) ionises dense matter.
/// So it is the `saha` law in the envelope and the `degenerate` law in dense cores, without a
/// blend. Derivatives are analytic, including the ionisation terms. Details in [`super::plasma`].
///
/// Domain: 1e-15 <= rho <= 1e5 g/cm^3, 1e3 <= T <= 1e9 K (non-relativistic electrons; no
/// Coulomb corrections).
#[derive(Debug, Clone, Copy, Default)]
pub struct RefinedEos;

const ENGINE: Plasma = Plasma {
    law: "refined",
    ionisation: Ionisation::Saha,
    electrons: Electrons::FermiDirac,
    coulomb: false,
    rho_range_g_cm3: (1e-15, 1e5),
    temperature_range_k: (1e3, 1e9),
};

plasma_law!(RefinedEos, ENGINE);
