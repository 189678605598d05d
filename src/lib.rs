//! starpoise: zero-age main-sequence stellar interiors by fitting-point shooting, with
//! swappable equation of state, opacity, nuclear-rate and convection laws.
//!
//! cgs units inside; solar units at the interface. The library never prints and never
//! panics on user input: every fallible function returns [`error::Result`].
#![deny(missing_docs)]

pub mod constants;
pub mod error;
pub mod grid;
pub mod numerics;
pub mod oscillation;
pub mod output;
pub mod physics;
pub mod polytrope;
pub mod reference;
pub mod structure;
pub mod units;
pub mod verify;

pub use error::{Error, Result};
