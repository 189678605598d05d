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
    let n = rows.len() + 1;
    let mut a: [Vec<f64>; 6] = std::array::from_fn(|_| Vec::with_capacity(n));
    if rows[0].radius_cm > 0.0 {
        let c = centre_row(&rows[0], &rows[1]);
        for (column, value) in a.iter_mut().zip(c) {
            column.push(value);
        }
    }
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

// ---- Centre handling: only while profiles start off the centre ------------------------------
// Today's profiles start at m = 1e-10 M (r of order 1e-4 R), not at r = 0, which the tabulated
// model needs. Drop `centre_row` (and its call above) once the profile has a row at r = 0.

/// The row at r = 0 (r, m, P, rho, Gamma_1, N^2) from the two rows nearest the centre, by the
/// regular expansion f(r) = f_c + f_2 r^2 + O(r^4) of P, rho and Gamma_1 (the structure is even
/// in r at a regular centre: P = P_c - (2 pi/3) G rho_c^2 r^2 + ..., e.g. Kippenhahn & Weigert
/// 1990, §11.3; fact of the trade), and N^2(0) = 0 (N^2 is proportional to g^2, and g to r).
/// Two rows at r ~ 1e-4 R leave an O(r^4) error of order 1e-16 relative.
fn centre_row(a: &ProfileRow, b: &ProfileRow) -> [f64; 6] {
    let (ra, rb) = (a.radius_cm * a.radius_cm, b.radius_cm * b.radius_cm);
    let at_zero = |fa: f64, fb: f64| (fa * rb - fb * ra) / (rb - ra);
    [
        0.0,
        0.0,
        at_zero(a.pressure_dyn_cm2, b.pressure_dyn_cm2),
        at_zero(a.density_g_cm3, b.density_g_cm3),
        at_zero(a.gamma1, b.gamma1),
        0.0,
    ]
}
// ---- End of centre handling -----------------------------------------------------------------
