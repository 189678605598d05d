//! The Coulomb functions of one mixture, phi, u_phi and Gamma_e du_phi/dGamma_e of
//! [`super::coulomb::CoulombMixture`], tabulated in ln Gamma_e by quintic Hermite segments
//! ([`crate::numerics::quintic`]) and kept per thread for the last few mixtures met.
//!
//! Why: the equation of state needs them at every iteration of every inversion; summing the
//! fit over three ion species there cost 14 per cent of a solar model, one table lookup about
//! a third of that. Why per thread and per mixture: the weights depend on the composition, which
//! arrives with each call, and a model (or a grid at one composition) meets one mixture many
//! thousand times. The table is a pure function of the mixture, built the same way each time,
//! so results do not depend on which thread or in what order models are solved.
//!
//! Accuracy: spacing 1/16 in ln Gamma_e; the quintic Hermite remainder bounds the errors of phi,
//! u_phi and Gamma_e du_phi/dGamma_e by (h/2)^6/6!, (h/2)^5/5! and (h/2)^4/4! times max |phi^(6)|
//! in ln Gamma_e, about 11.4 |phi| where phi grows as Gamma^(3/2): 1.5e-11, 1.9e-9 and 2e-7 of
//! them (tested against the fit). The value and the two derivatives are those of one function,
//! so the thermodynamic quantities derived from them stay consistent to rounding.

use super::coulomb::CoulombMixture;
use crate::numerics::quintic::QuinticTable;
use std::cell::RefCell;

/// Range of ln Gamma_e of a mixture's table: below, every species (Z^(5/3) at most 25.6) lies in
/// the fit's series, cheap to sum; above (Gamma_e = 1.3e4, far beyond ZAMS stars), the formula.
pub const MIXTURE_LN_GAMMA: (f64, f64) = (-11.375, 9.5);
/// Intervals of a mixture's table (spacing 1/16 in ln Gamma_e).
const MIXTURE_INTERVALS: usize = 334;
/// Mixtures whose tables a thread keeps (a grid over compositions, or models alternating between
/// two compositions, stay within it; the oldest is replaced first).
const CACHED_MIXTURES: usize = 4;

struct Entry {
    key: [u64; 6],
    table: Option<QuinticTable>,
}

thread_local! {
    static TABLES: RefCell<Vec<Entry>> = const { RefCell::new(Vec::new()) };
}

/// The table of `mixture`, built from [`CoulombMixture::exact_at_ln`].
fn build(mixture: &CoulombMixture) -> Option<QuinticTable> {
    let (lo, hi) = MIXTURE_LN_GAMMA;
    QuinticTable::new(lo, hi, MIXTURE_INTERVALS, |x| mixture.exact_at_ln(x))
}

/// (phi, u_phi, Gamma_e du_phi/dGamma_e) of `mixture` at ln Gamma_e = `ln_gamma_e` from its
/// table (built on first use in this thread); `None` outside the table's range (or if the
/// thread's storage is gone, during its shutdown): the caller then sums the fit itself.
pub fn mixture_at(mixture: &CoulombMixture, ln_gamma_e: f64) -> Option<[f64; 3]> {
    let (lo, hi) = MIXTURE_LN_GAMMA;
    if !(ln_gamma_e > lo && ln_gamma_e < hi) {
        return None;
    }
    let key = mixture.key();
    TABLES
        .try_with(|tables| {
            let mut tables = tables.borrow_mut();
            let i = match tables.iter().position(|e| e.key == key) {
                Some(i) => i,
                None => {
                    if tables.len() == CACHED_MIXTURES {
                        tables.remove(0);
                    }
                    tables.push(Entry {
                        key,
                        table: build(mixture),
                    });
                    tables.len() - 1
                }
            };
            tables[i].table.as_ref().and_then(|t| t.at(ln_gamma_e))
        })
        .ok()
        .flatten()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::eos::coulomb::{IonSpecies, Z53_HELIUM, Z53_METALS};

    fn mixture(x: f64, z: f64) -> CoulombMixture {
        let y = 1.0 - x - z;
        let ions: IonSpecies = [(x, 1.0), (0.25 * y, Z53_HELIUM), (z / 16.0, Z53_METALS)];
        CoulombMixture::new(&ions, x + 0.5 * y + z * (0.5 - 1.0 / 16.0))
    }

    /// The table against the fit over its range, within the bounds of the module documentation,
    /// for a solar and a helium-rich mixture.
    #[test]
    fn table_matches_the_fit() {
        for m in [mixture(0.70, 0.02), mixture(0.0, 0.02)] {
            let (lo, hi) = MIXTURE_LN_GAMMA;
            for i in 1..20_000 {
                let x = lo + (hi - lo) * i as f64 / 20_000.0;
                let [f, u, s] = mixture_at(&m, x).unwrap();
                let [f0, u0, s0] = m.exact_at_ln(x);
                assert!((f - f0).abs() < 1.5e-11 * f0.abs(), "phi at {x}: {f} {f0}");
                assert!((u - u0).abs() < 1.9e-9 * u0.abs(), "u at {x}: {u} {u0}");
                assert!((s - s0).abs() < 2e-7 * s0.abs(), "slope at {x}: {s} {s0}");
            }
            assert!(mixture_at(&m, MIXTURE_LN_GAMMA.1 + 0.1).is_none());
            assert!(mixture_at(&m, MIXTURE_LN_GAMMA.0 - 0.1).is_none());
        }
    }

    /// More mixtures than the cache holds, met in turn: every value is the one a fresh table
    /// gives, bit for bit.
    #[test]
    fn cached_values_do_not_depend_on_the_order_of_mixtures() {
        let mixtures: Vec<CoulombMixture> = (0..CACHED_MIXTURES + 2)
            .map(|k| mixture(0.6 + 0.02 * k as f64, 0.02))
            .collect();
        let x = -0.7;
        let fresh: Vec<[f64; 3]> = mixtures
            .iter()
            .map(|m| build(m).unwrap().at(x).unwrap())
            .collect();
        for round in 0..3 {
            for (m, expected) in mixtures.iter().zip(&fresh).rev().skip(round % 2) {
                assert_eq!(mixture_at(m, x).unwrap(), *expected);
            }
        }
    }
}
