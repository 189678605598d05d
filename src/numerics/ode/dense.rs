//! The continuous extension of DOP853 (Hairer, Nørsett & Wanner 1993, §II.10): a polynomial of
//! degree 7 in s = (x - x_old)/h over one accepted step, of order 7, built from the step's
//! stages and three more right-hand-side evaluations.

use nalgebra::SVector;

/// The solution between the two ends of one accepted step, as
/// u(s) = c0 + s (c1 + s1 (c2 + s (c3 + s1 (c4 + s (c5 + s1 (c6 + s c7)))))), s1 = 1 - s,
/// the nested form of Hairer's `CONTD8`. u(0) = y_old and u(1) = y_new (to rounding).
#[derive(Debug, Clone, PartialEq)]
pub struct DenseOutput<const N: usize> {
    pub(crate) x_old: f64,
    pub(crate) h: f64,
    pub(crate) coefficients: [SVector<f64, N>; 8],
}

impl<const N: usize> DenseOutput<N> {
    pub(crate) fn empty() -> Self {
        Self {
            x_old: 0.0,
            h: 0.0,
            coefficients: [SVector::zeros(); 8],
        }
    }

    /// The step's ends (x_old, x_old + h), in the direction of integration.
    pub fn interval(&self) -> (f64, f64) {
        (self.x_old, self.x_old + self.h)
    }

    /// The interpolated solution at `x`. Meant for x inside the step; outside it the polynomial
    /// is extrapolated (and quickly worthless).
    pub fn evaluate(&self, x: f64) -> SVector<f64, N> {
        let s = (x - self.x_old) / self.h;
        let s1 = 1.0 - s;
        let c = &self.coefficients;
        let inner = c[4] + (c[5] + (c[6] + c[7] * s) * s1) * s;
        c[0] + (c[1] + (c[2] + (c[3] + inner * s1) * s) * s1) * s
    }

    /// Component `k` (< N) of [`DenseOutput::evaluate`] alone, by the same operations in the
    /// same order (so the same bits), at an eighth of the cost for N = 8: for quadratures and
    /// root finding on one component.
    pub fn evaluate_component(&self, x: f64, k: usize) -> f64 {
        let s = (x - self.x_old) / self.h;
        let s1 = 1.0 - s;
        let c = |j: usize| self.coefficients[j][k];
        let inner = c(4) + (c(5) + (c(6) + c(7) * s) * s1) * s;
        c(0) + (c(1) + (c(2) + (c(3) + inner * s1) * s) * s1) * s
    }
}

/// One accepted step, as handed to [`super::Observer::on_step`]: its ends and, when it was
/// prepared, its dense output.
#[derive(Debug, Clone, Copy)]
pub struct AcceptedStep<'a, const N: usize> {
    /// Start of the step.
    pub x_old: f64,
    /// State at `x_old`.
    pub y_old: &'a SVector<f64, N>,
    /// End of the step (the event's x if the integration stops at an event inside it).
    pub x: f64,
    /// State at `x`.
    pub y: &'a SVector<f64, N>,
    pub(crate) dense: Option<&'a DenseOutput<N>>,
}

impl<const N: usize> AcceptedStep<'_, N> {
    /// The dense output of the step, if it was prepared (always, when the observer's
    /// [`super::Observer::dense_every_step`] is true; otherwise only on steps with an event or
    /// an output point).
    pub fn dense(&self) -> Option<&DenseOutput<N>> {
        self.dense
    }

    /// The solution at `x` between `x_old` and `x` by the dense output; `None` if `x` is outside
    /// the step or the dense output was not prepared.
    pub fn interpolate(&self, x: f64) -> Option<SVector<f64, N>> {
        let (lo, hi) = if self.x >= self.x_old {
            (self.x_old, self.x)
        } else {
            (self.x, self.x_old)
        };
        if !(lo..=hi).contains(&x) {
            return None;
        }
        self.dense.map(|d| d.evaluate(x))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// One component is the same bits as that component of the whole state, inside the step
    /// and extrapolated beyond it.
    #[test]
    fn a_component_is_the_states_component() {
        let mut dense = DenseOutput::<3> {
            x_old: -2.5,
            h: 0.37,
            coefficients: [SVector::zeros(); 8],
        };
        for (j, c) in dense.coefficients.iter_mut().enumerate() {
            *c = SVector::from([1.0 + j as f64, -0.3 * j as f64, 1e-3 / (1.0 + j as f64)]);
        }
        for x in [-2.5, -2.4, -2.3141, -2.13, -2.0] {
            let y = dense.evaluate(x);
            for k in 0..3 {
                assert_eq!(dense.evaluate_component(x, k).to_bits(), y[k].to_bits());
            }
        }
    }
}
