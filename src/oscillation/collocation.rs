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
//! # The stage system and its block solution
//!
//! For a linear system the stage values Z_i = z(x_0 + c_i h) solve
//! Z_i - h sum_j a_ij C_j Z_j = z_0 (i = 1..3), and z_1 = z_0 + h sum_j b_j C_j Z_j,
//! a system of 3 D unknowns per column. Multiplied by A^-1 (alpha = A^-1, beta = A^-1 1 =
//! (6, -3, 6); exact values derived for this module and checked by a test) it becomes
//!
//! (alpha_ii I - h C_i) Z_i + sum_(j != i) alpha_ij Z_j = beta_i z_0,
//!
//! whose off-diagonal blocks are multiples of the identity. The end value follows from the
//! stage values alone: h C_j Z_j = sum_k alpha_jk (Z_k - z_0), so
//! z_1 = z_0 + sum_k d_k (Z_k - z_0) = sum_k d_k Z_k - z_0 with d = A^-T b = (5/3, -4/3, 5/3)
//! (sum 2; the value at x_0 + h of the cubic through z_0 and the three stage values). Block elimination (Z_1 first, then
//! Z_3, the blocks with alpha_ii = 5; the last pivot is a Schur complement of the whole,
//! non-singular system) then needs only D x D factorisations (with partial pivoting) and
//! products: about 60 per cent of the operations of Gaussian elimination on the 3 D x 3 D
//! system, all on fixed-size arrays that the compiler unrolls. For a constant C with
//! eigenvalue mu/h the first two pivots vanish only at mu = 5 and mu = 5 +- 1.29 i (derived),
//! far from the mesh's steps (|mu| up to a few, module `mesh`); should a pivot still vanish or
//! the result not be finite, the step falls back to Gaussian elimination with partial pivoting
//! on the full system ([`solve`]). No allocation either way.

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

/// alpha = A^-1 (module documentation).
const A_INV: [[f64; 3]; 3] = [
    [5.0, -4.0 + 4.0 * SQRT15 / 3.0, 5.0 - 4.0 * SQRT15 / 3.0],
    [-2.5 - 5.0 * SQRT15 / 6.0, 2.0, -2.5 + 5.0 * SQRT15 / 6.0],
    [5.0 + 4.0 * SQRT15 / 3.0, -4.0 - 4.0 * SQRT15 / 3.0, 5.0],
];

/// beta = A^-1 (1, 1, 1).
const A_INV_ONE: [f64; 3] = [6.0, -3.0, 6.0];

/// d = A^-T b, the weights of the stage values in the end value (module documentation).
const END: [f64; 3] = [5.0 / 3.0, -4.0 / 3.0, 5.0 / 3.0];

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
/// `N` must equal 3 D (the size of the full stage system, for the fallback).
#[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
pub fn step<const D: usize, const K: usize, const N: usize>(
    h: f64,
    c: &[Matrix<D>; 3],
    z0: &Block<D, K>,
    stages: &mut [Block<D, K>; 3],
) -> Option<Block<D, K>> {
    if !block_stages(h, c, z0, stages) {
        dense_stages::<D, K, N>(h, c, z0, stages)?;
    }
    // z_1 = z_0 + h sum_j b_j C_j Z_j = sum_j d_j Z_j - z_0 (module documentation).
    let mut z1 = [[0.0; K]; D];
    for d in 0..D {
        for k in 0..K {
            z1[d][k] =
                END[0] * stages[0][d][k] + END[1] * stages[1][d][k] + END[2] * stages[2][d][k]
                    - z0[d][k];
        }
    }
    Some(z1)
}

/// The stage values by block elimination (module documentation), written into `stages`;
/// false if a pivot vanishes or a value is not finite.
#[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
fn block_stages<const D: usize, const K: usize>(
    h: f64,
    c: &[Matrix<D>; 3],
    z0: &Block<D, K>,
    stages: &mut [Block<D, K>; 3],
) -> bool {
    let a = &A_INV;
    let b = &A_INV_ONE;
    // alpha_ii I - h C_i.
    let diagonal = |i: usize| {
        let mut m = [[0.0; D]; D];
        for r in 0..D {
            for s in 0..D {
                m[r][s] = -h * c[i][r][s];
            }
            m[r][r] += a[i][i];
        }
        m
    };
    // Z_1 = B_1^-1 (beta_1 z0 - alpha_12 Z_2 - alpha_13 Z_3), with G = B_1^-1.
    let mut lu = Lu::default();
    if !lu.factor(diagonal(0)) {
        return false;
    }
    let g = lu.solve(&scaled_identity::<D>(1.0));
    let gz = mul(&g, z0);
    // Rows 2 and 3 without Z_1: S_ij Z_j summed = r_i, with
    // S_ij = (B_i if i = j else alpha_ij I) - alpha_i1 alpha_1j G,
    // r_i = beta_i z0 - alpha_i1 beta_1 G z0.
    let s = |i: usize, j: usize| {
        let f = a[i][0] * a[0][j];
        let mut m = [[0.0; D]; D];
        for r in 0..D {
            for q in 0..D {
                let own = if i == j { -h * c[i][r][q] } else { 0.0 };
                m[r][q] = own - f * g[r][q];
            }
            m[r][r] += a[i][j];
        }
        m
    };
    let r = |i: usize| {
        let f = a[i][0] * b[0];
        let mut v = [[0.0; K]; D];
        for d in 0..D {
            for k in 0..K {
                v[d][k] = b[i] * z0[d][k] - f * gz[d][k];
            }
        }
        v
    };
    // Z_3 = S_33^-1 (r_3 - S_32 Z_2) = t - H Z_2.
    if !lu.factor(s(2, 2)) {
        return false;
    }
    let hm = lu.solve(&s(2, 1));
    let t = lu.solve(&r(2));
    // (S_22 - S_23 H) Z_2 = r_2 - S_23 t.
    let s23 = s(1, 2);
    let mut pivot = s(1, 1);
    subtract(&mut pivot, &mul(&s23, &hm));
    let mut right = r(1);
    subtract(&mut right, &mul(&s23, &t));
    if !lu.factor(pivot) {
        return false;
    }
    let z2 = lu.solve(&right);
    let mut z3 = t;
    subtract(&mut z3, &mul(&hm, &z2));
    let mut coupled = [[0.0; K]; D];
    for d in 0..D {
        for k in 0..K {
            coupled[d][k] = a[0][1] * z2[d][k] + a[0][2] * z3[d][k];
        }
    }
    let gc = mul(&g, &coupled);
    let mut z1 = [[0.0; K]; D];
    let mut finite = true;
    for d in 0..D {
        for k in 0..K {
            z1[d][k] = b[0] * gz[d][k] - gc[d][k];
            finite &= z1[d][k].is_finite() && z2[d][k].is_finite() && z3[d][k].is_finite();
        }
    }
    *stages = [z1, z2, z3];
    finite
}

/// The stage values by Gaussian elimination on the full 3 D x 3 D system (the fallback of
/// [`step`]).
#[allow(clippy::needless_range_loop)] // stage, row and column indices address three arrays
fn dense_stages<const D: usize, const K: usize, const N: usize>(
    h: f64,
    c: &[Matrix<D>; 3],
    z0: &Block<D, K>,
    stages: &mut [Block<D, K>; 3],
) -> Option<()> {
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
    for (j, stage) in stages.iter_mut().enumerate() {
        for r in 0..D {
            stage[r] = rhs[j * D + r];
        }
    }
    Some(())
}

/// x I.
fn scaled_identity<const D: usize>(x: f64) -> Matrix<D> {
    let mut m = [[0.0; D]; D];
    for (d, row) in m.iter_mut().enumerate() {
        row[d] = x;
    }
    m
}

/// The product of a D x D matrix and a D x K block.
#[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
fn mul<const D: usize, const K: usize>(m: &Matrix<D>, x: &Block<D, K>) -> Block<D, K> {
    let mut out = [[0.0; K]; D];
    for i in 0..D {
        for j in 0..D {
            let f = m[i][j];
            for k in 0..K {
                out[i][k] += f * x[j][k];
            }
        }
    }
    out
}

/// a -= b.
#[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
fn subtract<const D: usize, const K: usize>(a: &mut Block<D, K>, b: &Block<D, K>) {
    for d in 0..D {
        for k in 0..K {
            a[d][k] -= b[d][k];
        }
    }
}

/// LU factors of a small square matrix, with partial pivoting.
struct Lu<const D: usize> {
    /// Unit lower (below the diagonal) and upper factors of the permuted matrix.
    lu: Matrix<D>,
    /// Row i of the factored matrix is row perm[i] of the original.
    perm: [usize; D],
}

impl<const D: usize> Default for Lu<D> {
    fn default() -> Self {
        Self {
            lu: [[0.0; D]; D],
            perm: [0; D],
        }
    }
}

impl<const D: usize> Lu<D> {
    /// Factor `m` in place of the previous factors; false if a pivot is zero or NaN.
    #[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
    fn factor(&mut self, m: Matrix<D>) -> bool {
        self.lu = m;
        let (m, perm) = (&mut self.lu, &mut self.perm);
        for (i, p) in perm.iter_mut().enumerate() {
            *p = i;
        }
        for col in 0..D {
            let mut pivot = col;
            let mut largest = m[col][col].abs();
            for row in col + 1..D {
                if m[row][col].abs() > largest {
                    largest = m[row][col].abs();
                    pivot = row;
                }
            }
            // A NaN fails this test; an infinity passes and makes the stages non-finite,
            // which `block_stages` checks at the end.
            if largest.is_nan() || largest <= 0.0 {
                return false;
            }
            if pivot != col {
                m.swap(col, pivot);
                perm.swap(col, pivot);
            }
            let pivot_row = m[col];
            let inverse = 1.0 / pivot_row[col];
            for row in col + 1..D {
                let f = m[row][col] * inverse;
                m[row][col] = f;
                for k in col + 1..D {
                    m[row][k] -= f * pivot_row[k];
                }
            }
        }
        true
    }

    /// X with m X = rhs.
    #[allow(clippy::needless_range_loop)] // fixed-size index loops unroll best
    fn solve<const K: usize>(&self, rhs: &Block<D, K>) -> Block<D, K> {
        let mut x = [[0.0; K]; D];
        for i in 0..D {
            x[i] = rhs[self.perm[i]];
            for j in 0..i {
                let f = self.lu[i][j];
                for k in 0..K {
                    x[i][k] -= f * x[j][k];
                }
            }
        }
        for i in (0..D).rev() {
            for j in i + 1..D {
                let f = self.lu[i][j];
                for k in 0..K {
                    x[i][k] -= f * x[j][k];
                }
            }
            let inverse = 1.0 / self.lu[i][i];
            for v in x[i].iter_mut() {
                *v *= inverse;
            }
        }
        x
    }
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

    /// alpha = A^-1, beta = A^-1 (1, 1, 1) and d = A^-T b (module documentation), to rounding.
    #[test]
    #[allow(clippy::needless_range_loop)] // i and j index three tables
    fn inverse_tableau() {
        for i in 0..3 {
            for j in 0..3 {
                let product: f64 = (0..3).map(|k| A[i][k] * A_INV[k][j]).sum();
                let identity = if i == j { 1.0 } else { 0.0 };
                assert!((product - identity).abs() < 1e-14, "{i} {j}: {product}");
            }
            let row: f64 = A_INV[i].iter().sum();
            assert!((row - A_INV_ONE[i]).abs() < 1e-14);
            let d: f64 = (0..3).map(|k| A_INV[k][i] * WEIGHTS[k]).sum();
            assert!((d - END[i]).abs() < 1e-14);
        }
    }

    /// The block elimination and Gaussian elimination on the full system give the same stages
    /// (to rounding) for a fourth-order system with unequal node matrices, stepping both ways.
    #[test]
    fn block_and_dense_stages_agree() {
        let mut c = [[[0.0; 4]; 4]; 3];
        let mut v = 0.37_f64;
        for m in c.iter_mut() {
            for row in m.iter_mut() {
                for x in row.iter_mut() {
                    v = (v * 7.3 + 0.11).fract();
                    *x = 4.0 * v - 2.0;
                }
            }
        }
        let z0: Block<4, 2> = [[1.0, 0.0], [0.3, 1.0], [-0.2, 0.5], [0.7, -0.4]];
        for h in [0.4, -0.25] {
            let mut block = [[[0.0; 2]; 4]; 3];
            let mut dense = [[[0.0; 2]; 4]; 3];
            assert!(block_stages(h, &c, &z0, &mut block));
            dense_stages::<4, 2, 12>(h, &c, &z0, &mut dense).unwrap();
            for (a, b) in block
                .iter()
                .flatten()
                .flatten()
                .zip(dense.iter().flatten().flatten())
            {
                assert!((a - b).abs() < 1e-13 * (1.0 + b.abs()), "{a} vs {b}");
            }
        }
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
