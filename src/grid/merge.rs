//! Joining the outputs of the shards of one grid into one table.

use super::row::GridRow;
use crate::error::{Error, Result};

/// Merge the rows of several shard files (`(file name, rows)`) into one table in grid order.
///
/// Refuses (exit code 2): no rows; files from different grids (grid fingerprint or size
/// differs); a grid point present twice; grid points missing (all of 0..grid_size must appear).
pub fn merge_shards(files: Vec<(String, Vec<GridRow>)>) -> Result<Vec<GridRow>> {
    let example = "merge the outputs of `sequence --shard K/N` for K = 1..N of one grid, e.g. starpoise merge part-1.csv part-2.csv part-3.csv --out all.csv";
    let Some((first_file, first_row)) = files
        .iter()
        .find_map(|(f, rows)| rows.first().map(|r| (f.clone(), r.clone())))
    else {
        return Err(Error::invalid(
            "files",
            "(no rows)",
            &format!("the files hold no rows; {example}"),
        ));
    };
    // Every point of the grid must appear once, so a grid larger than the rows given cannot be
    // complete: say so before allocating a slot per point (a grid size read from a file is
    // untrusted).
    let total_rows: usize = files.iter().map(|(_, rows)| rows.len()).sum();
    if first_row.grid_size > total_rows {
        return Err(Error::invalid(
            "files",
            format!("{} grid points missing", first_row.grid_size - total_rows),
            &format!(
                "the grid has {} points but the files hold {total_rows} rows: is a shard missing? {example}",
                first_row.grid_size
            ),
        ));
    }
    let mut slots: Vec<Option<(String, GridRow)>> = vec![None; first_row.grid_size];
    for (file, rows) in files {
        for row in rows {
            if row.grid_fingerprint != first_row.grid_fingerprint
                || row.grid_size != first_row.grid_size
            {
                return Err(Error::invalid(
                    "files",
                    &file,
                    &format!(
                        "this file is from a different grid (fingerprint {} of {} points) than {first_file} (fingerprint {} of {} points): mass lists, compositions, physics and fitting mass must all agree; {example}",
                        row.grid_fingerprint, row.grid_size, first_row.grid_fingerprint, first_row.grid_size
                    ),
                ));
            }
            let Some(slot) = slots.get_mut(row.grid_index) else {
                return Err(Error::invalid(
                    "files",
                    &file,
                    &format!(
                        "grid index {} is outside the grid of {} points",
                        row.grid_index, first_row.grid_size
                    ),
                ));
            };
            if let Some((other, _)) = slot {
                return Err(Error::invalid(
                    "files",
                    &file,
                    &format!("grid point {} (M = {} M_sun) is also in {other}: each shard must be given once", row.grid_index, row.mass_msun),
                ));
            }
            *slot = Some((file.clone(), row));
        }
    }
    let missing: Vec<usize> = slots
        .iter()
        .enumerate()
        .filter(|(_, s)| s.is_none())
        .map(|(i, _)| i)
        .collect();
    if !missing.is_empty() {
        let shown: Vec<String> = missing.iter().take(10).map(|i| i.to_string()).collect();
        return Err(Error::invalid(
            "files",
            format!("{} grid points missing", missing.len()),
            &format!(
                "grid indices {}{} are in none of the files: is a shard missing? {example}",
                shown.join(", "),
                if missing.len() > 10 { ", ..." } else { "" }
            ),
        ));
    }
    Ok(slots.into_iter().flatten().map(|(_, r)| r).collect())
}
