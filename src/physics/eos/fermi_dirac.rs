//! Non-relativistic Fermi–Dirac integrals F_j(psi) = integral_0^inf x^j / (exp(x - psi) + 1) dx
//! for j = -1/2, 1/2, 3/2, and the inverse of F_1/2.
//!
//! Method (written for this crate):
//! - psi <= -10: the convergent series F_j = Gamma(j+1) sum_k (-1)^(k+1) e^(k psi) / k^(j+1),
//!   five terms (relative truncation error below 1e-20).
//! - -10 < psi < 50: cubic Hermite interpolation in ln F_j on a uniform table (step 0.05) with
//!   the exact slopes d ln F_j / d psi = j F_(j-1) / F_j. The table comes from the trapezoid
//!   rule in t = sqrt(x) (an even, analytic integrand, for which the rule converges
//!   exponentially; step 0.02, error far below 1e-12), evaluated once at build time by
//!   `build.rs` (the quadrature is in `fermi_dirac/quadrature.rs`, shared with the build
//!   script), so a process pays nothing for it. Interpolation error is below about 1e-8
//!   relative (checked in `tests/fermi_dirac.rs`, which also checks every node against the
//!   quadrature).
//! - psi >= 50: the Sommerfeld expansion F_j = psi^(j+1)/(j+1) [1 + (pi^2/6) (j+1) j psi^-2 +
//!   (7 pi^4/360) (j+1) j (j-1) (j-2) psi^-4] (e.g. Cox & Giuli 1968, *Principles of Stellar
//!   Structure*, ch. 24), whose next term is below 1e-10 there.
//!
//! No allocation per call: the table is a `static` in the binary.

/// The exact quadrature behind the table, and the table's grid (shared with `build.rs`).
pub mod quadrature;

use crate::numerics::cube_root::cbrt;
use crate::numerics::exponential::FastExp;
pub use quadrature::fermi_dirac_by_quadrature;
use quadrature::{
    TABLE_NODES as NODES, TABLE_PSI_MAX as PSI_MAX, TABLE_PSI_MIN as PSI_MIN, TABLE_STEP as STEP,
};

/// sqrt(pi).
const SQRT_PI: f64 = 1.772_453_850_905_516;
/// Gamma(1/2), Gamma(3/2), Gamma(5/2): Gamma(j + 1) for j = -1/2, 1/2, 3/2.
pub const GAMMA_HALF: [f64; 3] = [SQRT_PI, 0.5 * SQRT_PI, 0.75 * SQRT_PI];
/// ln Gamma(1/2), ln Gamma(3/2), ln Gamma(5/2).
const LN_GAMMA_HALF: [f64; 3] = [
    0.572_364_942_924_700_1,
    -0.120_782_237_635_245_2,
    0.284_682_870_472_919_2,
];

/// F_-1/2, F_1/2 and F_3/2 at one psi.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FermiDirac {
    /// F_-1/2(psi).
    pub f_minus_half: f64,
    /// F_1/2(psi).
    pub f_half: f64,
    /// F_3/2(psi).
    pub f_three_halves: f64,
}

struct Table {
    /// ln F_j at the nodes, j = -1/2, 1/2, 3/2.
    ln_f: [[f64; NODES]; 3],
    /// d ln F_j / d psi at the nodes.
    slope: [[f64; NODES]; 3],
}

// `static TABLE: Table`, tabulated by build.rs with `quadrature::table_node` at every node.
include!(concat!(env!("OUT_DIR"), "/fermi_dirac_table.rs"));

/// (-1)^(k+1) / k^(j+1) for k = 1..5 and j + 1 = 1/2, 3/2, 5/2 (the k = 1 term is 1: the
/// series is e^psi (1 + x_j), [`series_corrections`]).
const SERIES: [[f64; 5]; 3] = [
    [
        1.0,
        -0.707_106_781_186_547_5,
        0.577_350_269_189_625_8,
        -0.5,
        0.447_213_595_499_957_9,
    ],
    [
        1.0,
        -0.353_553_390_593_273_7,
        0.192_450_089_729_875_26,
        -0.125,
        0.089_442_719_099_991_59,
    ],
    [
        1.0,
        -0.176_776_695_296_636_87,
        0.064_150_029_909_958_41,
        -0.031_25,
        0.017_888_543_819_998_32,
    ],
];

/// Series for psi <= PSI_MIN: F_j = Gamma(j+1) sum_k (-1)^(k+1) e^(k psi) / k^(j+1), that is
/// Gamma(j+1) e^psi (1 + x_j) from [`series_corrections`]'s e = e^psi and x_j.
fn series(e: f64, x: [f64; 3]) -> FermiDirac {
    let [m, h, t] = [0, 1, 2].map(|j| GAMMA_HALF[j] * (e * (1.0 + x[j])));
    FermiDirac {
        f_minus_half: m,
        f_half: h,
        f_three_halves: t,
    }
}

/// Sommerfeld expansion for psi >= PSI_MAX.
fn sommerfeld(psi: f64) -> FermiDirac {
    let pi2 = std::f64::consts::PI * std::f64::consts::PI;
    let f = |j: f64| {
        let a = (j + 1.0) * j;
        let b = a * (j - 1.0) * (j - 2.0);
        psi.powf(j + 1.0) / (j + 1.0)
            * (1.0 + pi2 / 6.0 * a / (psi * psi) + 7.0 * pi2 * pi2 / 360.0 * b / psi.powi(4))
    };
    FermiDirac {
        f_minus_half: f(-0.5),
        f_half: f(0.5),
        f_three_halves: f(1.5),
    }
}

/// F_-1/2, F_1/2 and F_3/2 at `psi` (any finite psi; accuracy about 1e-8 relative).
pub fn fermi_dirac(psi: f64) -> FermiDirac {
    if let Some((e, x)) = series_corrections(psi) {
        return series(e, x);
    }
    if psi >= PSI_MAX {
        return sommerfeld(psi);
    }
    let [m, h, t] = table_ln(psi);
    FermiDirac {
        f_minus_half: m.fast_exp(),
        f_half: h.fast_exp(),
        f_three_halves: t.fast_exp(),
    }
}

/// [ln F_-1/2, ln F_1/2, ln F_3/2] at `psi` (any finite psi), without the exponentials the
/// table interpolation would otherwise need. Below the table, ln F_j = ln Gamma(j+1) + psi +
/// ln(1 + x) with x = sum_(k>=2) c_k e^((k-1) psi), |x| < 4e-5, and ln(1 + x) by its series to
/// x^3 (error below 1e-18).
pub fn ln_fermi_dirac(psi: f64) -> [f64; 3] {
    if let Some((_, x)) = series_corrections(psi) {
        return [0, 1, 2].map(|j| LN_GAMMA_HALF[j] + psi + ln_one_plus_small(x[j]));
    }
    if psi >= PSI_MAX {
        let f = sommerfeld(psi);
        return [f.f_minus_half.ln(), f.f_half.ln(), f.f_three_halves.ln()];
    }
    table_ln(psi)
}

/// Below the table (psi <= -10): e^psi and the corrections x_j of F_j = Gamma(j+1) e^psi
/// (1 + x_j), x_j = sum_(k>=2) c_k e^((k-1) psi) (|x_j| < 4e-5), for j = -1/2, 1/2, 3/2; `None`
/// above. Ratios of the F_j then need no exponential.
pub fn series_corrections(psi: f64) -> Option<(f64, [f64; 3])> {
    (psi <= PSI_MIN).then(|| {
        let e = psi.fast_exp();
        (
            e,
            SERIES.map(|c| e * (c[1] + e * (c[2] + e * (c[3] + e * c[4])))),
        )
    })
}

/// ln(1 + x) for |x| < 4e-5 by its series to x^3 (error below 1e-18).
pub fn ln_one_plus_small(x: f64) -> f64 {
    x * (1.0 - x * (0.5 - x / 3.0))
}

/// Cubic Hermite interpolation of ln F_j in the table, PSI_MIN < psi < PSI_MAX.
fn table_ln(psi: f64) -> [f64; 3] {
    let tab = &TABLE;
    let u = (psi - PSI_MIN) / STEP;
    let i = (u.floor() as usize).min(NODES - 2);
    let s = u - i as f64;
    let s2 = s * s;
    let s3 = s2 * s;
    let h00 = 2.0 * s3 - 3.0 * s2 + 1.0;
    let h10 = (s3 - 2.0 * s2 + s) * STEP;
    let h01 = -2.0 * s3 + 3.0 * s2;
    let h11 = (s3 - s2) * STEP;
    let mut out = [0.0; 3];
    for (j, o) in out.iter_mut().enumerate() {
        *o = h00 * tab.ln_f[j][i]
            + h10 * tab.slope[j][i]
            + h01 * tab.ln_f[j][i + 1]
            + h11 * tab.slope[j][i + 1];
    }
    out
}

/// A first guess for the psi with F_1/2(psi) = `f_half` (> 0), good to about 1e-2: the
/// first-order non-degenerate inversion psi = ln u + u / sqrt(8), u = F / Gamma(3/2) (Joyce &
/// Dixon 1977, Appl. Phys. Lett. 31, 354, first term) for u < 4, the Sommerfeld inversion
/// psi = p (1 - (pi^2/12) p^-2), p = (3F/2)^(2/3), above.
// Kept out of line (as is `inverse_upper_bound`): only degenerate points take the cube root,
// and inlined into the inversion's loop it cost the other points more than the call saves.
#[inline(never)]
pub fn inverse_guess(f_half: f64) -> f64 {
    let u = f_half / GAMMA_HALF[1];
    if u < 4.0 {
        u.ln() + u * 0.353_553_390_593_273_7
    } else {
        let p = cbrt(1.5 * f_half).powi(2);
        p * (1.0 - std::f64::consts::PI * std::f64::consts::PI / (12.0 * p * p))
    }
}

/// A rigorous upper bound on the psi with F_1/2(psi) = `f_half` (> 0): F_1/2(psi) >=
/// (2/3) psi^(3/2) for psi > 0 and F_1/2(psi) >= Gamma(3/2) e^psi / (1 + e^psi) (from
/// 1/(e^(x-psi)+1) >= e^(psi-x)/(1+e^psi) for x >= 0), so F_1/2 >= `f_half` at the returned psi.
#[inline(never)]
pub fn inverse_upper_bound(f_half: f64) -> f64 {
    if f_half < 0.5 * GAMMA_HALF[1] {
        // Negative, so below the (positive) degenerate bound.
        (2.0 * f_half / GAMMA_HALF[1]).ln()
    } else {
        cbrt(1.5 * f_half).powi(2)
    }
}

/// The psi with F_1/2(psi) = `f_half` (> 0), by Newton iteration on ln F_1/2 from
/// [`inverse_guess`].
/// Returns `None` if `f_half` is not finite and positive.
pub fn inverse_fermi_dirac_half(f_half: f64) -> Option<f64> {
    if !(f_half.is_finite() && f_half > 0.0) {
        return None;
    }
    let mut psi = inverse_guess(f_half);
    let target = f_half.ln();
    for _ in 0..50 {
        let f = fermi_dirac(psi);
        let g = f.f_half.ln() - target;
        let slope = 0.5 * f.f_minus_half / f.f_half;
        let step = (g / slope).clamp(-20.0, 20.0);
        psi -= step;
        if step.abs() < 1e-12 * psi.abs().max(1.0) {
            return Some(psi);
        }
    }
    Some(psi)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The build-time table is the library's own quadrature at every node, bit for bit (the
    /// build script includes the same source; a stale or differently computed table fails).
    #[test]
    fn build_time_table_is_the_quadrature() {
        for i in 0..NODES {
            let (ln_f, slope) = quadrature::table_node(i);
            for j in 0..3 {
                assert_eq!(
                    TABLE.ln_f[j][i].to_bits(),
                    ln_f[j].to_bits(),
                    "node {i} j {j}"
                );
                assert_eq!(
                    TABLE.slope[j][i].to_bits(),
                    slope[j].to_bits(),
                    "node {i} j {j}"
                );
            }
        }
    }
}
