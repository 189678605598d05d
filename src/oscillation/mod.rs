//! Linear adiabatic oscillations of a spherical star: radial modes and non-radial p, f and g
//! modes of any degree, with the perturbation of the gravitational potential (or in the Cowling
//! approximation), their classification by order, inertia, eigenfunctions and the asymptotic
//! seismic quantities.
//!
//! # Layout
//!
//! - [`equilibrium`]: the dimensionless structure coefficients (V, U, c1, A*, Gamma_1) a model
//!   must supply, as the [`Equilibrium`] trait; three models implement it:
//!   [`HomogeneousSphere`] (analytic), [`PolytropicModel`] (a Lane–Emden solution of
//!   [`crate::polytrope`] at any resolution) and [`TabulatedModel`] (arrays on a mesh, e.g. a
//!   ZAMS model, with a point at r = 0);
//! - [`equations`]: the oscillation equations in Dziembowski's variables and their boundary
//!   conditions (Unno et al. 1989, *Nonradial Oscillations of Stars*; Cox 1980, *Theory of
//!   Stellar Pulsation*);
//! - [`collocation`], [`mesh`], [`shooting`]: sixth-order Gauss–Legendre collocation on a mesh
//!   built from the model's breakpoints, shooting from the centre and the surface with
//!   re-orthonormalisation, and a pole-free discriminant;
//! - [`search`]: scanning, bracketing and Brent convergence of the roots, completeness of the
//!   orders;
//! - [`eigenfunction`]: mode order (Eckart–Scuflaire–Osaki, Takata for dipole modes), inertia,
//!   eigenfunctions;
//! - [`spectrum`], [`asymptotic`]: modes, frequencies in muHz, large and small separations,
//!   the asymptotic large separation and g-mode period spacing;
//! - [`zams`]: a ZAMS model's profile as a [`TabulatedModel`];
//! - [`stability`]: the quasi-adiabatic growth rate of radial modes (the epsilon mechanism
//!   against radiative damping).
//!
//! Every frequency here is dimensionless: sigma^2 = omega^2 R^3/(G M).
//!
//! # Example
//!
//! ```
//! use starpoise::oscillation::{find_modes, HomogeneousSphere, OscillationSettings};
//! // The homogeneous sphere with Gamma_1 = 5/3: radial fundamental sigma^2 = 3 Gamma_1 - 4 = 1.
//! let sphere = HomogeneousSphere::new(5.0 / 3.0, 200)?;
//! let modes = find_modes(&sphere, 0, 3, &OscillationSettings::default())?;
//! assert_eq!(modes[0].order, 1);
//! assert!((modes[0].sigma_squared - 1.0).abs() < 1e-9);
//! # Ok::<(), starpoise::Error>(())
//! ```

pub mod asymptotic;
pub mod collocation;
pub mod eigenfunction;
pub mod equations;
pub mod equilibrium;
pub mod homogeneous;
pub mod mesh;
pub mod polytropic;
pub mod search;
pub mod shooting;
pub mod spectrum;
pub mod stability;
pub mod star_modes;
pub mod tabulated;
pub mod zams;

pub use asymptotic::{asymptotic_values, AsymptoticValues};
pub use eigenfunction::Eigenfunction;
pub use equations::Formulation;
pub use equilibrium::{CentreValues, Equilibrium, StructurePoint};
pub use homogeneous::HomogeneousSphere;
pub use polytropic::PolytropicModel;
pub use search::{find_eigenvalues, find_modes, find_modes_of_degrees, OscillationSettings};
pub use spectrum::{
    dynamical_frequency_hz, large_separation_near, small_separation_near, Mode, ModeKind,
    SeismicSummary,
};
pub use stability::{
    fundamental_stability, pulsational_instability_mass, radial_stability, PulsationalLimit,
    RadialStability,
};
pub use star_modes::{
    checked_degrees, separation_frequency, star_modes, StarModes, DEFAULT_PROFILE_ROWS,
};
pub use tabulated::{DimensionlessArrays, PhysicalArrays, TabulatedModel};
pub use zams::tabulated_from_profile;
