//! Temperature–optical-depth relations of the outer boundary:
//! T^4 = (3/4) T_eff^4 [tau + q(tau)], one type per law behind [`TauRelation`].
//!
//! - [`Eddington`]: q = 2/3 (the Eddington approximation of the grey atmosphere).
//! - [`Hopf`]: the exact grey atmosphere (Hopf 1934): q(0) = 1/sqrt 3, q(inf) = 0.7104460896.
//! - [`KrishnaSwamy`]: the empirical solar relation of Krishna Swamy (1966, ApJ 145, 174),
//!   q = 1.39 - 0.815 exp(-2.54 tau) - 0.025 exp(-30 tau) (docs/references.md §8.4, memory).
//!
//! T = T_eff where tau + q(tau) = 4/3 ([`TauRelation::photosphere_tau`]): 2/3 (Eddington),
//! 0.6455 (Hopf), 0.3122 (Krishna Swamy). The structure takes that point as the photosphere,
//! where the radius R is defined (L = 4 pi R^2 sigma T_eff^4).

use std::f64::consts::PI;
use std::sync::OnceLock;

/// One T(tau) relation.
pub trait TauRelation: Send + Sync + std::fmt::Debug {
    /// The law's name as a user selects it.
    fn name(&self) -> &'static str;

    /// The Hopf-like function q(tau) at optical depth `tau` >= 0.
    fn q(&self, tau: f64) -> f64;

    /// Temperature at optical depth `tau` for effective temperature `teff_k`, K.
    fn temperature_k(&self, teff_k: f64, tau: f64) -> f64 {
        teff_k * (0.75 * (tau + self.q(tau))).sqrt().sqrt()
    }

    /// The optical depth where T = T_eff: tau + q(tau) = 4/3, by bisection (q is increasing and
    /// bounded for every law here, so the root in [0, 4/3] is unique).
    fn photosphere_tau(&self) -> f64 {
        let (mut lo, mut hi) = (0.0, 4.0 / 3.0);
        for _ in 0..60 {
            let mid = 0.5 * (lo + hi);
            if mid + self.q(mid) < 4.0 / 3.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        0.5 * (lo + hi)
    }
}

/// Eddington grey atmosphere: q = 2/3.
#[derive(Debug, Clone, Copy, Default)]
pub struct Eddington;

impl TauRelation for Eddington {
    fn name(&self) -> &'static str {
        "eddington"
    }
    fn q(&self, _tau: f64) -> f64 {
        2.0 / 3.0
    }
}

/// Empirical solar T(tau) of Krishna Swamy (1966, ApJ 145, 174):
/// q = 1.39 - 0.815 exp(-2.54 tau) - 0.025 exp(-30 tau) (coefficients from memory,
/// docs/references.md §8.4). A fit to the solar photosphere, used here for other stars as is
/// common practice; meant for the photosphere (tau <~ 10), where it is used.
#[derive(Debug, Clone, Copy, Default)]
pub struct KrishnaSwamy;

impl TauRelation for KrishnaSwamy {
    fn name(&self) -> &'static str {
        "krishna-swamy"
    }
    fn q(&self, tau: f64) -> f64 {
        1.39 - 0.815 * (-2.54 * tau).exp() - 0.025 * (-30.0 * tau).exp()
    }
}

/// q(inf) of the exact grey atmosphere (docs/references.md §8.4: computed to 10 figures from
/// 6/pi^2 + (1/pi) int_0^(pi/2) [3/t^2 - 1/(1 - t cot t)] dt; Viik 1986 gives 59).
pub const HOPF_Q_INFINITY: f64 = 0.710_446_089_6;

/// The exact grey atmosphere: Hopf's function q(tau).
///
/// Exact representation (Chandrasekhar 1950, *Radiative Transfer*, §59; the solution of
/// Milne's problem, form from memory, checked against the solved table of docs/references.md
/// §8.4 to 1e-5 and against q(0) = 1/sqrt 3):
/// q(tau) = q(inf) - (1 / (2 sqrt 3)) int_0^1 exp(-tau/mu) dmu /
///          (H(mu) [(1 - (mu/2) ln((1 + mu)/(1 - mu)))^2 + (pi mu / 2)^2]),
/// with Chandrasekhar's H-function of conservative isotropic scattering
/// ln H(mu) = -(mu/pi) int_0^(pi/2) ln(1 - theta cot theta) / (cos^2 theta + mu^2 sin^2 theta) dtheta.
///
/// Both integrals are done once by Gauss–Legendre quadrature on graded panels ([`hopf_q_exact`]);
/// q is then tabulated with dq/dln tau at steps of 0.05 in ln tau over 1e-8 <= tau <= 60 and
/// interpolated by cubic Hermite polynomials (error below 1e-8, tested); q = q(inf) beyond
/// tau = 60 (the remainder is below e^-60) and the quadrature itself is used below 1e-8.
#[derive(Debug, Clone, Copy, Default)]
pub struct Hopf;

impl TauRelation for Hopf {
    fn name(&self) -> &'static str {
        "hopf"
    }
    fn q(&self, tau: f64) -> f64 {
        hopf_table().q(tau)
    }
}

/// Gauss–Legendre nodes and weights on [-1, 1] (Newton iteration on the Legendre polynomial).
fn gauss_legendre<const N: usize>() -> ([f64; N], [f64; N]) {
    let mut x = [0.0; N];
    let mut w = [0.0; N];
    let n = N as f64;
    for i in 0..N {
        let mut z = (PI * (i as f64 + 0.75) / (n + 0.5)).cos();
        let mut dp = 1.0;
        for _ in 0..100 {
            let (mut p0, mut p1) = (1.0, z);
            for k in 2..=N {
                let k = k as f64;
                let p2 = ((2.0 * k - 1.0) * z * p1 - (k - 1.0) * p0) / k;
                p0 = p1;
                p1 = p2;
            }
            dp = n * (z * p1 - p0) / (z * z - 1.0);
            let dz = p1 / dp;
            z -= dz;
            if dz.abs() < 1e-15 {
                break;
            }
        }
        x[i] = z;
        w[i] = 2.0 / ((1.0 - z * z) * dp * dp);
    }
    (x, w)
}

/// 1 - t cot t, by its series below t = 0.05 (where the difference cancels).
fn one_minus_t_cot_t(t: f64) -> f64 {
    if t < 0.05 {
        let t2 = t * t;
        t2 * (1.0 / 3.0 + t2 * (1.0 / 45.0 + t2 * (2.0 / 945.0 + t2 / 4725.0)))
    } else {
        1.0 - t / t.tan()
    }
}

/// Panels in theta for the H-function integral, graded toward theta = 0 where
/// ln(1 - theta cot theta) ~ ln(theta^2 / 3) is singular.
const H_PANELS: [f64; 14] = [
    0.0,
    1e-10,
    1e-8,
    1e-6,
    1e-4,
    1e-3,
    0.01,
    0.05,
    0.15,
    0.35,
    0.6,
    0.9,
    1.2,
    PI / 2.0,
];

/// Chandrasekhar's H(mu) for conservative isotropic scattering (16-point Gauss–Legendre on
/// graded panels of [0, pi/2]; H(1) = 2.9078, a check in the tests).
pub fn chandrasekhar_h(mu: f64) -> f64 {
    let (x, w) = gauss_legendre::<16>();
    let mut sum = 0.0;
    for pair in H_PANELS.windows(2) {
        let (lo, h) = (pair[0], pair[1] - pair[0]);
        for (xi, wi) in x.iter().zip(w.iter()) {
            let th = lo + 0.5 * h * (xi + 1.0);
            let (s, c) = th.sin_cos();
            sum += 0.5 * h * wi * one_minus_t_cot_t(th).ln() / (c * c + mu * mu * s * s);
        }
    }
    (-mu / PI * sum).exp()
}

/// Quadrature panels in mu for the Hopf integral: graded toward both ends, where the integrand
/// has logarithmic singularities in its derivatives.
const HOPF_PANELS: [f64; 20] = [
    0.0,
    0.002,
    0.01,
    0.03,
    0.07,
    0.15,
    0.3,
    0.5,
    0.7,
    0.85,
    0.95,
    0.99,
    1.0 - 1e-3,
    1.0 - 1e-4,
    1.0 - 1e-5,
    1.0 - 1e-6,
    1.0 - 1e-8,
    1.0 - 1e-10,
    1.0 - 1e-12,
    1.0,
];

/// (mu_k, c_k): q(tau) = q(inf) - sum_k c_k exp(-tau / mu_k).
fn hopf_nodes() -> Vec<(f64, f64)> {
    let (x, w) = gauss_legendre::<24>();
    let mut nodes = Vec::with_capacity(24 * (HOPF_PANELS.len() - 1));
    for pair in HOPF_PANELS.windows(2) {
        let (lo, hi) = (pair[0], pair[1]);
        for (xi, wi) in x.iter().zip(w.iter()) {
            let mu = lo + 0.5 * (hi - lo) * (xi + 1.0);
            let l = 1.0 - 0.5 * mu * ((1.0 + mu) / (1.0 - mu)).ln();
            let d = l * l + (0.5 * PI * mu).powi(2);
            let g = 1.0 / (chandrasekhar_h(mu) * d);
            nodes.push((mu, 0.5 * (hi - lo) * wi * g / (2.0 * 3f64.sqrt())));
        }
    }
    nodes
}

/// Hopf's q(tau) and dq/dln tau straight from the exact representation (a few hundred
/// exponentials; [`Hopf`] interpolates a table of it).
pub fn hopf_q_exact(tau: f64) -> (f64, f64) {
    hopf_table().exact(tau)
}

struct HopfTable {
    nodes: Vec<(f64, f64)>,
    /// (q, dq/dln tau) at ln tau = LN_TAU_MIN + i * STEP.
    rows: Vec<(f64, f64)>,
}

const LN_TAU_MIN: f64 = -18.420_680_743_952_367; // ln 1e-8
const LN_TAU_STEP: f64 = 0.05;
const TAU_MAX: f64 = 60.0;

impl HopfTable {
    fn build() -> Self {
        let nodes = hopf_nodes();
        let mut table = Self {
            nodes,
            rows: Vec::new(),
        };
        let n = ((TAU_MAX.ln() - LN_TAU_MIN) / LN_TAU_STEP).ceil() as usize + 2;
        table.rows = (0..n)
            .map(|i| table.exact((LN_TAU_MIN + i as f64 * LN_TAU_STEP).exp()))
            .collect();
        table
    }

    fn exact(&self, tau: f64) -> (f64, f64) {
        let (mut q, mut dq) = (HOPF_Q_INFINITY, 0.0);
        for &(mu, c) in &self.nodes {
            let e = c * (-tau / mu).exp();
            q -= e;
            dq += e * tau / mu;
        }
        (q, dq)
    }

    fn q(&self, tau: f64) -> f64 {
        if tau >= TAU_MAX {
            return HOPF_Q_INFINITY;
        }
        if tau <= LN_TAU_MIN.exp() {
            return self.exact(tau.max(0.0)).0;
        }
        let s = (tau.ln() - LN_TAU_MIN) / LN_TAU_STEP;
        let i = (s.floor() as usize).min(self.rows.len() - 2);
        let t = s - i as f64;
        let ((q0, d0), (q1, d1)) = (self.rows[i], self.rows[i + 1]);
        let (d0, d1) = (d0 * LN_TAU_STEP, d1 * LN_TAU_STEP);
        // Cubic Hermite basis.
        let t2 = t * t;
        let t3 = t2 * t;
        (2.0 * t3 - 3.0 * t2 + 1.0) * q0
            + (t3 - 2.0 * t2 + t) * d0
            + (-2.0 * t3 + 3.0 * t2) * q1
            + (t3 - t2) * d1
    }
}

fn hopf_table() -> &'static HopfTable {
    static TABLE: OnceLock<HopfTable> = OnceLock::new();
    TABLE.get_or_init(HopfTable::build)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The table interpolation agrees with the exact representation between its nodes.
    #[test]
    fn interpolation_error_is_below_1e_8() {
        for i in 0..2000 {
            let tau = 10f64.powf(-8.0 + 9.7 * (i as f64 + 0.37) / 2000.0);
            let d = (Hopf.q(tau) - hopf_q_exact(tau).0).abs();
            assert!(d < 1e-8, "{tau}: {d:e}");
        }
    }

    /// Quadrature accuracy target of the exact representation: 1e-6, ten times tighter than
    /// the 1e-5 of the solved table it is tested against in tests/atmosphere.rs.
    const Q_ABS: f64 = 1e-6;

    /// H(1) = 2.9078 for conservative isotropic scattering (Chandrasekhar 1950, table of H;
    /// memory) and the ends q(0) = 1/sqrt 3 (exact) and q(60) = q(inf).
    #[test]
    fn ends_and_h_function() {
        assert!(
            (chandrasekhar_h(1.0) - 2.9078).abs() < 1e-4,
            "{}",
            chandrasekhar_h(1.0)
        );
        assert!((hopf_q_exact(0.0).0 - 1.0 / 3f64.sqrt()).abs() < Q_ABS);
        assert!((hopf_q_exact(60.0).0 - HOPF_Q_INFINITY).abs() < 1e-12);
    }
}
