//! Shooting from both ends to a fitting point: the discriminant whose zeros are the
//! eigenfrequencies, and the eigenfunction at a zero.
//!
//! The K = D/2 solutions that satisfy the centre conditions are carried outward, and the K that
//! satisfy the surface conditions inward, by Gauss–Legendre collocation steps
//! ([`super::collocation`]). After every step each set is re-orthonormalised (Gram–Schmidt with
//! positive diagonal), which keeps the span exact while preventing a dominant solution from
//! swamping the others in evanescent regions (Conte 1966, SIAM Review 8, 309). At the fitting
//! point the discriminant is
//!
//! D(w) = det [Q_centre | Q_surface],
//!
//! which vanishes exactly when a solution satisfies both sets of conditions. Since the bases
//! depend continuously (and without poles) on w and Gram–Schmidt only divides by positive
//! numbers, D is continuous and changes sign at every simple eigenvalue; unlike the mismatch of
//! one eigenfunction ratio, it has no poles to be mistaken for roots.

use super::collocation::{step, Block};
use super::equations::{BoundaryBasis, NodeMatrix};
use nalgebra::DMatrix;

/// The problem on one mesh: node matrices, boundary bases and the fitting point.
#[derive(Debug, Clone)]
pub struct Discretized<const D: usize, const K: usize> {
    /// Step boundaries.
    pub x: Vec<f64>,
    /// Node matrices of each step, in order of increasing x.
    pub nodes: Vec<[NodeMatrix<D>; 3]>,
    /// Regular solutions at the centre.
    pub centre: BoundaryBasis<D, K>,
    /// Solutions satisfying the surface conditions.
    pub surface: BoundaryBasis<D, K>,
    /// Index of the fitting boundary (0 < fit < steps).
    pub fit: usize,
}

/// What one step did to the orthonormal basis, kept to rebuild an eigenfunction.
#[derive(Debug, Clone, Copy)]
struct StepRecord<const D: usize, const K: usize> {
    /// Orthonormal basis at the start of the step.
    start: Block<D, K>,
    /// Stage values of the step from `start`.
    stages: [Block<D, K>; 3],
    /// R of the Gram–Schmidt factorisation after the step: end values = Q_next R.
    r: [[f64; K]; K],
}

/// One value of the solution on the mesh: at a step boundary (weight 0) or at a collocation
/// node (weight = h b_j, the Gauss quadrature weight of that node).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sample<const D: usize> {
    /// x = r/R.
    pub x: f64,
    /// The scaled variables.
    pub z: [f64; D],
    /// Quadrature weight (0 at boundaries).
    pub weight: f64,
    /// Step index: the step the node belongs to; at a boundary the step starting there (the
    /// last step for x = 1).
    pub step: usize,
    /// Node index 0..3 within the step, None at a boundary.
    pub node: Option<usize>,
}

/// Gram–Schmidt with positive diagonal: replaces `b` by Q and returns R. `None` if a column
/// vanishes or is not finite.
fn orthonormalise<const D: usize, const K: usize>(b: &mut Block<D, K>) -> Option<[[f64; K]; K]> {
    let mut r = [[0.0; K]; K];
    for j in 0..K {
        for i in 0..j {
            let dot: f64 = (0..D).map(|d| b[d][i] * b[d][j]).sum();
            r[i][j] = dot;
            for row in b.iter_mut() {
                row[j] -= dot * row[i];
            }
        }
        let norm = (0..D).map(|d| b[d][j] * b[d][j]).sum::<f64>().sqrt();
        if !(norm > 0.0 && norm.is_finite()) {
            return None;
        }
        r[j][j] = norm;
        for row in b.iter_mut() {
            row[j] /= norm;
        }
    }
    Some(r)
}

/// Determinant by Gaussian elimination with partial pivoting.
#[allow(clippy::needless_range_loop)] // row updates read the pivot row of the same matrix
fn determinant<const D: usize>(mut m: [[f64; D]; D]) -> f64 {
    let mut det = 1.0;
    for col in 0..D {
        let pivot = (col..D)
            .max_by(|&a, &b| m[a][col].abs().total_cmp(&m[b][col].abs()))
            .unwrap_or(col);
        if m[pivot][col] == 0.0 {
            return 0.0;
        }
        if pivot != col {
            m.swap(pivot, col);
            det = -det;
        }
        det *= m[col][col];
        for row in col + 1..D {
            let factor = m[row][col] / m[col][col];
            for k in col + 1..D {
                m[row][k] -= factor * m[col][k];
            }
        }
    }
    det
}

impl<const D: usize, const K: usize> Discretized<D, K> {
    fn matrices(&self, step_index: usize, w: f64, inward: bool) -> [[[f64; D]; D]; 3] {
        let n = &self.nodes[step_index];
        if inward {
            [n[2].at(w), n[1].at(w), n[0].at(w)]
        } else {
            [n[0].at(w), n[1].at(w), n[2].at(w)]
        }
    }

    /// Carry the centre basis to the fitting point. With `record`, keep each step.
    fn outward<const N: usize>(
        &self,
        w: f64,
        mut record: Option<&mut Vec<StepRecord<D, K>>>,
    ) -> Option<Block<D, K>> {
        let mut q = self.centre.at(w);
        orthonormalise(&mut q)?;
        let mut stages = [[[0.0; K]; D]; 3];
        for s in 0..self.fit {
            let h = self.x[s + 1] - self.x[s];
            let start = q;
            q = step::<D, K, N>(h, &self.matrices(s, w, false), &q, &mut stages)?;
            let r = orthonormalise(&mut q)?;
            if let Some(rec) = record.as_deref_mut() {
                rec.push(StepRecord { start, stages, r });
            }
        }
        Some(q)
    }

    /// Carry the surface basis inward to the fitting point. With `record`, keep each step
    /// (in the order taken, from the surface inward).
    fn inward<const N: usize>(
        &self,
        w: f64,
        mut record: Option<&mut Vec<StepRecord<D, K>>>,
    ) -> Option<Block<D, K>> {
        let mut q = self.surface.at(w);
        orthonormalise(&mut q)?;
        let mut stages = [[[0.0; K]; D]; 3];
        for s in (self.fit..self.nodes.len()).rev() {
            let h = self.x[s] - self.x[s + 1];
            let start = q;
            q = step::<D, K, N>(h, &self.matrices(s, w, true), &q, &mut stages)?;
            let r = orthonormalise(&mut q)?;
            if let Some(rec) = record.as_deref_mut() {
                rec.push(StepRecord { start, stages, r });
            }
        }
        Some(q)
    }

    /// The discriminant D(w) (module documentation); `None` if a step fails (infinite or
    /// singular coefficients).
    pub fn discriminant<const N: usize>(&self, w: f64) -> Option<f64> {
        let qc = self.outward::<N>(w, None)?;
        let qs = self.inward::<N>(w, None)?;
        let mut m = [[0.0; D]; D];
        for d in 0..D {
            for k in 0..K {
                m[d][k] = qc[d][k];
                m[d][K + k] = qs[d][k];
            }
        }
        let det = determinant(m);
        det.is_finite().then_some(det)
    }

    /// The solution at an eigenvalue w: values at every step boundary and collocation node,
    /// in increasing x, with an arbitrary normalisation. `None` if a step fails.
    pub fn eigenfunction<const N: usize>(&self, w: f64) -> Option<Vec<Sample<D>>> {
        let mut inner = Vec::with_capacity(self.fit);
        let mut outer = Vec::with_capacity(self.nodes.len() - self.fit);
        let qc = self.outward::<N>(w, Some(&mut inner))?;
        let qs = self.inward::<N>(w, Some(&mut outer))?;
        // Null vector of [qc | qs]: the right singular vector of the smallest singular value.
        let m = DMatrix::<f64>::from_fn(D, D, |i, j| if j < K { qc[i][j] } else { qs[i][j - K] });
        let svd = m.svd(false, true);
        let v_t = svd.v_t?;
        let smallest = svd.singular_values.imin();
        let mut a = [0.0; K];
        let mut b = [0.0; K];
        for k in 0..K {
            a[k] = v_t[(smallest, k)];
            // qc a + qs b = 0: the outer solution equal to the inner one has coefficients -b.
            b[k] = -v_t[(smallest, K + k)];
        }
        let mut samples = Vec::with_capacity(4 * (self.nodes.len() + 1));
        // Inner side, from the fitting point back to the centre.
        let mut coef = a;
        for (s, rec) in inner.iter().enumerate().rev() {
            coef = back_substitute(&rec.r, coef)?;
            let h = self.x[s + 1] - self.x[s];
            samples.push(boundary_sample(self.x[s], &rec.start, &coef, s));
            for (j, stage) in rec.stages.iter().enumerate() {
                let x = self.x[s] + super::collocation::NODES[j] * h;
                samples.push(node_sample(
                    x,
                    stage,
                    &coef,
                    h * super::collocation::WEIGHTS[j],
                    s,
                    j,
                ));
            }
        }
        samples.push(boundary_sample(self.x[self.fit], &qc, &a, self.fit));
        // Outer side, from the fitting point out to the surface.
        let mut coef = b;
        let steps = self.nodes.len();
        for (t, rec) in outer.iter().enumerate().rev() {
            // Record t is the step from boundary s + 1 to s, s = steps - 1 - t.
            let s = steps - 1 - t;
            coef = back_substitute(&rec.r, coef)?;
            let h = self.x[s + 1] - self.x[s];
            for (j, stage) in rec.stages.iter().enumerate() {
                // Inward stage j sits at node 2 - j of the step.
                let node = 2 - j;
                let x = self.x[s] + super::collocation::NODES[node] * h;
                samples.push(node_sample(
                    x,
                    stage,
                    &coef,
                    h * super::collocation::WEIGHTS[node],
                    s,
                    node,
                ));
            }
            samples.push(boundary_sample(
                self.x[s + 1],
                &rec.start,
                &coef,
                (s + 1).min(steps - 1),
            ));
        }
        samples.sort_by(|p, q| p.x.total_cmp(&q.x));
        Some(samples)
    }
}

/// Solve R c = coef for upper-triangular R.
fn back_substitute<const K: usize>(r: &[[f64; K]; K], coef: [f64; K]) -> Option<[f64; K]> {
    let mut c = coef;
    for i in (0..K).rev() {
        let mut sum = c[i];
        for j in i + 1..K {
            sum -= r[i][j] * c[j];
        }
        c[i] = sum / r[i][i];
        if !c[i].is_finite() {
            return None;
        }
    }
    Some(c)
}

fn combine<const D: usize, const K: usize>(basis: &Block<D, K>, coef: &[f64; K]) -> [f64; D] {
    let mut z = [0.0; D];
    for d in 0..D {
        z[d] = (0..K).map(|k| basis[d][k] * coef[k]).sum();
    }
    z
}

fn boundary_sample<const D: usize, const K: usize>(
    x: f64,
    basis: &Block<D, K>,
    coef: &[f64; K],
    step: usize,
) -> Sample<D> {
    Sample {
        x,
        z: combine(basis, coef),
        weight: 0.0,
        step,
        node: None,
    }
}

fn node_sample<const D: usize, const K: usize>(
    x: f64,
    stage: &Block<D, K>,
    coef: &[f64; K],
    weight: f64,
    step: usize,
    node: usize,
) -> Sample<D> {
    Sample {
        x,
        z: combine(stage, coef),
        weight,
        step,
        node: Some(node),
    }
}
