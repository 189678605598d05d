//! A zero-age main-sequence model as an oscillation model.
//!
//! [`tabulated_from_profile`] turns the rows of a ZAMS profile ([`crate::structure::ProfileRow`],
//! from [`crate::structure::ZamsModel::profile`]: r, m, P, rho, Gamma_1 and N^2 in cgs, the
//! photosphere last) into a [`TabulatedModel`], whose outer boundary conditions are then applied
//! at the photosphere (P > 0 there; module `equations`). Frequencies in uHz follow with the
//! model's mass and photospheric radius ([`super::Mode::frequency_uhz`]).
//!
//! The profile's N^2 is that of a chemically homogeneous star, g^2 rho delta (nabla_ad -
//! nabla)/P: slightly negative in convective zones (nabla a little above nabla_ad), positive in
//! radiative ones. The rows are exact evaluations of the local physics on the integrated
//! solution; between them the tabulated model interpolates (module `tabulated`), so the
//! frequencies converge as the number of rows grows (tests/oscillation_zams.rs measures it).

use super::tabulated::{PhysicalArrays, TabulatedModel};
use crate::error::{Error, Result};
use crate::structure::ProfileRow;

/// Fewest profile rows accepted.
pub const MIN_ROWS: usize = 10;

/// The tabulated oscillation model of a ZAMS profile (module documentation). Errors
/// ([`Error::InvalidInput`]) for fewer than [`MIN_ROWS`] rows, radii that do not increase
/// strictly, or rows that [`TabulatedModel::from_physical`] refuses.
pub fn tabulated_from_profile(rows: &[ProfileRow]) -> Result<TabulatedModel> {
    if rows.len() < MIN_ROWS {
        return Err(Error::invalid(
            "profile",
            format!("{} rows", rows.len()),
            "an oscillation model needs at least 10 profile rows from the centre to the surface",
        ));
    }
    if let Some(i) = (1..rows.len()).find(|&i| rows[i].radius_cm <= rows[i - 1].radius_cm) {
        return Err(Error::invalid(
            "profile",
            format!("row {i} at r = {:e} cm", rows[i].radius_cm),
            "the rows must have strictly increasing radius",
        ));
    }
    let n = rows.len();
    let mut a: [Vec<f64>; 6] = std::array::from_fn(|_| Vec::with_capacity(n));
    for row in rows {
        let values = [
            row.radius_cm,
            row.mass_g,
            row.pressure_dyn_cm2,
            row.density_g_cm3,
            row.gamma1,
            row.brunt_n2_rad2_s2,
        ];
        for (column, value) in a.iter_mut().zip(values) {
            column.push(value);
        }
    }
    let [radius_cm, mass_g, pressure_dyn_cm2, density_g_cm3, gamma1, brunt_n2_s2] = &a;
    TabulatedModel::from_physical(PhysicalArrays {
        radius_cm,
        mass_g,
        pressure_dyn_cm2,
        density_g_cm3,
        gamma1,
        brunt_n2_s2,
    })
}
