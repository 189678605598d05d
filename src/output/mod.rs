//! Writing results: atomic file writes and the documented output schemas.

pub mod atomic;
pub mod polytrope;

pub use atomic::write_atomically;
pub mod sequence;
pub mod zams;
