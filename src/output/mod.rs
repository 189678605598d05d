//! Writing results: atomic file writes and the documented output schemas.

pub mod atomic;
pub mod probe;

pub use atomic::write_atomically;
pub use probe::ProbeReport;
