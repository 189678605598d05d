//! The free electrons: the Fermi–Dirac integrals (or their classical limits) at one psi, and the
//! first guess and upper bound of the psi of a given electron density.

use super::{Electrons, Plasma};
use crate::numerics::exponential::FastExp;
use crate::physics::eos::fermi_dirac::{
    inverse_guess, inverse_upper_bound, ln_fermi_dirac, ln_one_plus_small, series_corrections,
    GAMMA_HALF,
};

pub(super) const SQRT_PI: f64 = 1.772_453_850_905_516;
/// ln Gamma(3/2) = ln(sqrt(pi) / 2).
const LN_GAMMA_THREE_HALVES: f64 = -0.120_782_237_635_245_2;

/// Electron quantities at one psi: ln F_1/2, its psi-slope, F_3/2 and its psi-slope.
#[derive(Debug, Clone, Copy)]
pub(super) struct ElectronIntegrals {
    pub(super) ln_f_half: f64,
    pub(super) slope_half: f64,
    pub(super) f_three_halves: f64,
    pub(super) slope_three_halves: f64,
}

impl Plasma {
    pub(super) fn integrals(&self, psi: f64) -> ElectronIntegrals {
        match self.electrons {
            Electrons::Classical => ElectronIntegrals {
                ln_f_half: psi + LN_GAMMA_THREE_HALVES,
                slope_half: 1.0,
                f_three_halves: 0.75 * SQRT_PI * psi.fast_exp(),
                slope_three_halves: 1.0,
            },
            Electrons::FermiDirac => {
                if let Some((e, [x_m, x_h, x_3])) = series_corrections(psi) {
                    // Non-degenerate: the same quantities from F_j = Gamma(j+1) e^psi (1 + x_j)
                    // without the exponentials of differences of logarithms.
                    let [g_m, g_h, g_3] = GAMMA_HALF;
                    let (f_m, f_h) = (g_m * (1.0 + x_m), g_h * (1.0 + x_h));
                    let f_3 = g_3 * (1.0 + x_3);
                    return ElectronIntegrals {
                        ln_f_half: LN_GAMMA_THREE_HALVES + psi + ln_one_plus_small(x_h),
                        slope_half: 0.5 * f_m / f_h,
                        f_three_halves: e * f_3,
                        slope_three_halves: 1.5 * f_h / f_3,
                    };
                }
                let [ln_m, ln_h, ln_3] = ln_fermi_dirac(psi);
                ElectronIntegrals {
                    ln_f_half: ln_h,
                    slope_half: 0.5 * (ln_m - ln_h).fast_exp(),
                    f_three_halves: ln_3.fast_exp(),
                    slope_three_halves: 1.5 * (ln_h - ln_3).fast_exp(),
                }
            }
        }
    }

    /// (first guess, rigorous upper bound) of the psi at which F_1/2 (or its classical limit)
    /// equals `f_half`; `None` unless `f_half` is finite and positive.
    pub(super) fn psi_start(&self, f_half: f64) -> Option<(f64, f64)> {
        if !(f_half > 0.0 && f_half.is_finite()) {
            return None;
        }
        Some(match self.electrons {
            Electrons::Classical => {
                let exact = f_half.ln() - LN_GAMMA_THREE_HALVES;
                (exact, exact)
            }
            Electrons::FermiDirac if f_half < 0.4 => {
                // Non-degenerate: one logarithm for both (same bounds as the general case).
                let ln_u = f_half.ln() - LN_GAMMA_THREE_HALVES;
                let hi = ln_u + std::f64::consts::LN_2;
                (
                    (ln_u + f_half / (0.5 * SQRT_PI) * 0.353_553_390_593_273_7).min(hi),
                    hi,
                )
            }
            Electrons::FermiDirac => {
                let hi = inverse_upper_bound(f_half);
                (inverse_guess(f_half).min(hi), hi)
            }
        })
    }
}
