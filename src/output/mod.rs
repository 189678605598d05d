//! Writing results: output destinations (standard output, special files, atomic file writes)
//! and the documented output schemas.

pub mod columns;
pub mod compare;
pub mod destination;
pub mod format;
pub mod limits;
pub mod meta;
pub mod modes;
pub mod number_text;
pub mod pending;
pub mod plot;
pub mod polytrope;
pub mod probe;
pub mod sequence;
pub mod tabular;
pub mod zams;

pub use crate::physics::probe::ProbeReport;
pub use destination::{
    check_output_path, check_outputs, is_stdout_path, print_stdout, write_output, Destination,
    OutputKind,
};
pub use tabular::TableFormat;
