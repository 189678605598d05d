//! The power series of the Lane–Emden function about the centre.
//!
//! With z = xi^2 and theta = sum_k a_k z^k, the equation (1/xi^2) d/dxi (xi^2 dtheta/dxi) = -theta^n
//! gives, term by term, 2k (2k+1) a_k = -b_(k-1), where b_m are the coefficients of theta^n. These
//! follow from the J. C. P. Miller recurrence for a power of a series (from b' a = n a' b):
//! m a_0 b_m = sum_(j=1..m) ((n+1) j - m) a_j b_(m-j). The first terms are
//! theta = 1 - xi^2/6 + n xi^4/120 - n (8n - 5) xi^6/15120 + ... (Chandrasekhar 1939, *An
//! Introduction to the Study of Stellar Structure*, ch. IV, eq. 73).

use super::validate_index;
use crate::error::Result;

/// Number of series terms a_0 .. a_(N-1) kept (powers xi^0 .. xi^(2N-2)).
pub const SERIES_TERMS: usize = 10;

/// The centre expansion of theta_n(xi) for one index n.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LaneEmdenSeries {
    index: f64,
    coefficients: [f64; SERIES_TERMS],
}

impl LaneEmdenSeries {
    /// Coefficients a_k of theta = sum a_k xi^(2k) for index `n` in [0, 5]; an index outside
    /// that range (or NaN) is refused with an error naming `--index`.
    pub fn new(n: f64) -> Result<Self> {
        let n = validate_index(n)?;
        let mut a = [0.0; SERIES_TERMS];
        // b[m]: coefficients of theta^n, needed up to m = SERIES_TERMS - 2.
        let mut b = [0.0; SERIES_TERMS];
        a[0] = 1.0;
        b[0] = 1.0;
        for k in 1..SERIES_TERMS {
            let kf = k as f64;
            a[k] = -b[k - 1] / (2.0 * kf * (2.0 * kf + 1.0));
            // b[k] needs a[1..=k], all known now.
            let mut sum = 0.0;
            for j in 1..=k {
                sum += ((n + 1.0) * j as f64 - kf) * a[j] * b[k - j];
            }
            b[k] = sum / kf;
        }
        Ok(Self {
            index: n,
            coefficients: a,
        })
    }

    /// The polytropic index n.
    pub fn index(&self) -> f64 {
        self.index
    }

    /// The coefficients a_k of theta = sum_k a_k xi^(2k), k = 0 .. [`SERIES_TERMS`] - 1.
    pub fn coefficients(&self) -> &[f64; SERIES_TERMS] {
        &self.coefficients
    }

    /// (theta, dtheta/dxi) at `xi` from the truncated series. Exact to rounding at the
    /// solver's start [`super::solver::SERIES_START_XI`] = 0.1, where the last kept term
    /// a_9 xi^18 is below 1e-16 for every n in [0, 5] (tested); the truncation error grows like
    /// xi^20 beyond it (about 3e-12 at xi = 0.5 for n = 5).
    pub fn evaluate(&self, xi: f64) -> (f64, f64) {
        let z = xi * xi;
        let mut theta = 0.0;
        let mut dtheta_dz = 0.0;
        // Horner in z, highest power first.
        for k in (0..SERIES_TERMS).rev() {
            theta = theta * z + self.coefficients[k];
            if k > 0 {
                dtheta_dz = dtheta_dz * z + k as f64 * self.coefficients[k];
            }
        }
        (theta, 2.0 * xi * dtheta_dz)
    }
}
