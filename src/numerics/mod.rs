//! General numerical tools that know nothing about stars.

pub mod brent;
pub mod newton;
pub mod scalar;
pub mod smooth;
