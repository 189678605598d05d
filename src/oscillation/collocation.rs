//! One step of three-stage Gauss–Legendre collocation for a linear system dz/dx = C(x) z.
//!
//! The method (Butcher 1964, Math. Comp. 18, 50; Hairer, Nørsett & Wanner 1993, *Solving
//! Ordinary Differential Equations I*, §II.7, Table 7.4) has order 6 at the step ends, is
//! A-stable and symmetric: a step of -h from the end of a step of +h returns to its start,
//! so the inward propagation from the surface uses the same nodes. Its stages are
//! evaluated only strictly inside a step, never at the singular points x = 0 (the regular
//! centre) or x = 1 (where V is infinite if the surface pressure vanishes); there the
//! collocation polynomial picks the regular solution selected by the boundary values.
//!
//! For a linear system the stage values Z_i = z(x_0 + c_i h) solve
//! Z_i - h sum_j a_ij C_j Z_j = z_0 (i = 1..3), and z_1 = z_0 + h sum_j b_j C_j Z_j,
//! a dense system of 3 D unknowns per column, solved here by Gaussian elimination with partial
//! pivoting on fixed-size arrays (no allocation).

/// The Gauss–Legendre nodes c_i on [0, 1]: 1/2 -+ sqrt(15)/10 and 1/2.
pub const NODES: [f64; 3] = [
    0.5 - 0.387_298_334_620_741_7,
    0.5,
    0.5 + 0.387_298_334_620_741_7,
];
/// The weights b_i: 5/18, 4/9, 5/18.
pub const WEIGHTS: [f64; 3] = [5.0 / 18.0, 4.0 / 9.0, 5.0 / 18.0];

/// sqrt(15).
const SQRT15: f64 = 3.872_983_346_207_417;

/// The Runge–Kutta matrix a_ij of the method.
const A: [[f64; 3]; 3] = [
    [
        5.0 / 36.0,
        2.0 / 9.0 - SQRT15 / 15.0,
        5.0 / 36.0 - SQRT15 / 30.0,
    ],
    [
        5.0 / 36.0 + SQRT15 / 24.0,
        2.0 / 9.0,
        5.0 / 36.0 - SQRT15 / 24.0,
    ],
    [
        5.0 / 36.0 + SQRT15 / 30.0,
        2.0 / 9.0 + SQRT15 / 15.0,
        5.0 / 36.0,
    ],
];

/// A D x K block of column vectors (K solutions of a D-dimensional system).
pub type Block<const D: usize, const K: usize> = [[f64; K]; D];

/// The coefficient matrix C at one node.
pub type Matrix<const D: usize> = [[f64; D]; D];

/// Advance the K columns `z0` by one step of length `h` (negative for an inward step) with the
/// coefficient matrices `c` at the three stages, taken in the order of the step (for an inward
/// step, the node nearest the start first). Writes the stage values into `stages` and returns
/// the end values; `None` if the stage system is singular (it is not for any step with
/// |h| ||C|| < 1, and the scheme is A-stable, but a model with infinite coefficients could make
/// it so).
///
/// `N` must equal 3 D.
#[allow(clippy::needless_range_loop)] // stage, row and column indices address three arrays
pub fn step<const D: usize, const K: usize, const N: usize>(
    h: f64,
    c: &[Matrix<D>; 3],
    z0: &Block<D, K>,
    stages: &mut [Block<D, K>; 3],
) -> Option<Block<D, K>> {
    debug_assert_eq!(N, 3 * D);
    let mut m = [[0.0; N]; N];
    let mut rhs = [[0.0; K]; N];
    for i in 0..3 {
        for r in 0..D {
            let row = i * D + r;
            for j in 0..3 {
                let f = -h * A[i][j];
                for s in 0..D {
                    m[row][j * D + s] = f * c[j][r][s];
                }
            }
            m[row][row] += 1.0;
            rhs[row] = z0[r];
        }
    }
    solve(&mut m, &mut rhs)?;
    let mut z1 = *z0;
    for (j, stage) in stages.iter_mut().enumerate() {
        for r in 0..D {
            stage[r] = rhs[j * D + r];
        }
        let f = h * WEIGHTS[j];
        for r in 0..D {
            for s in 0..D {
                let coef = f * c[j][r][s];
                if coef != 0.0 {
                    for k in 0..K {
                        z1[r][k] += coef * stage[s][k];
                    }
                }
            }
        }
    }
    Some(z1)
}

/// Solve m X = rhs in place (rhs becomes X) by Gaussian elimination with partial pivoting.
/// `None` if a pivot is zero or not finite.
#[allow(clippy::needless_range_loop)] // index loops over two rows at once vectorise best here
pub fn solve<const N: usize, const K: usize>(
    m: &mut [[f64; N]; N],
    rhs: &mut [[f64; K]; N],
) -> Option<()> {
    for col in 0..N {
        let mut pivot = col;
        let mut largest = m[col][col].abs();
        for (row, line) in m.iter().enumerate().skip(col + 1) {
            if line[col].abs() > largest {
                largest = line[col].abs();
                pivot = row;
            }
        }
        if !(largest > 0.0 && largest.is_finite()) {
            return None;
        }
        m.swap(col, pivot);
        rhs.swap(col, pivot);
        // Copies of the pivot row let the updates below run without aliasing.
        let pivot_row = m[col];
        let pivot_rhs = rhs[col];
        let inverse = 1.0 / pivot_row[col];
        for row in col + 1..N {
            let factor = m[row][col] * inverse;
            if factor != 0.0 {
                let line = &mut m[row];
                for k in col + 1..N {
                    line[k] -= factor * pivot_row[k];
                }
                let right = &mut rhs[row];
                for k in 0..K {
                    right[k] -= factor * pivot_rhs[k];
                }
            }
        }
    }
    for col in (0..N).rev() {
        let mut sum = rhs[col];
        let line = &m[col];
        for j in col + 1..N {
            for k in 0..K {
                sum[k] -= line[j] * rhs[j][k];
            }
        }
        let inverse = 1.0 / line[col];
        for v in sum.iter_mut() {
            *v *= inverse;
        }
        rhs[col] = sum;
    }
    Some(())
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The harmonic oscillator z'' = -z over one period: the error of a method of order 6 falls
    /// by 2^6 = 64 when the step is halved (measured 62-66 allows for rounding), and the
    /// phase error per step, h^7/100800 (the error constant of the (3,3) Pade approximant of
    /// exp; Hairer, Norsett & Wanner 1993, §II.7), bounds it: 6.0e-8 for 20 steps.
    #[test]
    fn harmonic_oscillator_to_sixth_order() {
        let c = [[0.0, 1.0], [-1.0, 0.0]];
        let cs = [c, c, c];
        let error = |steps: usize| {
            let h = 2.0 * std::f64::consts::PI / steps as f64;
            let mut z: Block<2, 1> = [[1.0], [0.0]];
            let mut stages = [[[0.0; 1]; 2]; 3];
            for _ in 0..steps {
                z = step::<2, 1, 6>(h, &cs, &z, &mut stages).unwrap();
            }
            ((z[0][0] - 1.0).powi(2) + z[1][0].powi(2)).sqrt()
        };
        let (coarse, fine) = (error(20), error(40));
        let bound = 20.0 * (2.0 * std::f64::consts::PI / 20.0_f64).powi(7) / 100_800.0;
        assert!(coarse < 1.01 * bound, "{coarse} vs {bound}");
        let ratio = coarse / fine;
        assert!((62.0..66.0).contains(&ratio), "{ratio}");
    }

    /// Symmetry: a step of -h with the nodes reversed undoes a step of +h (to rounding), for a
    /// coefficient matrix that varies from node to node.
    #[test]
    fn inward_step_inverts_outward_step() {
        let cs = [
            [[0.3, 1.2], [-2.0, 0.1]],
            [[0.5, 1.0], [-1.5, -0.2]],
            [[0.8, 0.7], [-1.1, -0.4]],
        ];
        let reversed = [cs[2], cs[1], cs[0]];
        let z0: Block<2, 1> = [[0.7], [-0.4]];
        let mut stages = [[[0.0; 1]; 2]; 3];
        let z1 = step::<2, 1, 6>(0.3, &cs, &z0, &mut stages).unwrap();
        let back = step::<2, 1, 6>(-0.3, &reversed, &z1, &mut stages).unwrap();
        assert!((back[0][0] - z0[0][0]).abs() < 1e-14);
        assert!((back[1][0] - z0[1][0]).abs() < 1e-14);
    }

    #[test]
    fn solve_with_pivoting() {
        let mut m = [[0.0, 2.0, 1.0], [1.0, 1.0, 0.0], [3.0, 0.0, 1.0]];
        let mut rhs = [[3.0], [2.0], [4.0]];
        solve(&mut m, &mut rhs).unwrap();
        for (got, want) in rhs.iter().zip([1.0, 1.0, 1.0]) {
            assert!((got[0] - want).abs() < 1e-14);
        }
        let mut singular = [[1.0, 2.0], [2.0, 4.0]];
        let mut r = [[1.0], [1.0]];
        assert!(solve(&mut singular, &mut r).is_none());
    }
}
