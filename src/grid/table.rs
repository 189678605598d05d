//! A whole run's table: the rows of a grid with its fingerprint, shard and power-law fits.

use super::fits::FitGroup;
use super::row::GridRow;

/// A whole run: the grid fingerprint, the shard, the fits, and the rows in grid order.
#[derive(Debug, Clone, PartialEq)]
pub struct GridTable {
    /// Fingerprint of the grid.
    pub grid_fingerprint: String,
    /// `K/N` when this is one shard, `None` for a whole grid.
    pub shard: Option<String>,
    /// The mass ranges of the power-law fits (carried by shards so that `merge` uses them).
    pub fit_ranges: Vec<(f64, f64)>,
    /// Piecewise power-law fits of L(M) and R(M), per variant and composition (empty for a
    /// shard).
    pub fits: Vec<FitGroup>,
    /// The rows, in grid order.
    pub rows: Vec<GridRow>,
}
