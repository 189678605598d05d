//! General numerical tools that know nothing about stars.

pub mod brent;
pub mod continuation;
pub mod cube_root;
pub mod exponential;
pub mod interpolation;
pub mod invalid;
pub mod newton;
pub mod ode;
pub mod quintic;
pub mod scalar;
pub mod smooth;
