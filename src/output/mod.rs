//! Writing results: atomic file writes and the documented output schemas.

pub mod atomic;

pub use atomic::write_atomically;
pub mod plot;
pub mod zams;
