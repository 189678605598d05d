//! Writing results: atomic file writes and the documented output schemas.

pub mod atomic;
pub mod compare;
pub mod format;
pub mod limits;
pub mod meta;
pub mod modes;
pub mod plot;
pub mod polytrope;
pub mod probe;
pub mod sequence;
pub mod zams;

pub use crate::physics::probe::ProbeReport;
pub use atomic::{check_output_path, write_atomically};
