//! The Coulomb functions of one mixture, phi, u_phi and Gamma_e du_phi/dGamma_e of
//! `coulomb::CoulombMixture`, tabulated in ln Gamma_e by quintic Hermite segments
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

/// A table of `exact` (value and two derivatives in ln Gamma_e) over [`MIXTURE_LN_GAMMA`].
fn build(exact: impl Fn(f64) -> [f64; 3]) -> Option<QuinticTable> {
    let (lo, hi) = MIXTURE_LN_GAMMA;
    QuinticTable::new(lo, hi, MIXTURE_INTERVALS, exact)
}

/// The mixture's (phi, u_phi, Gamma_e du_phi/dGamma_e) at ln Gamma_e = `ln_gamma_e` from its
/// table, which is built from `exact` on first use in this thread and found again by `key`
/// (the bits of the mixture's weights and charges); `None` outside the table's range (or if
/// the thread's storage is gone, during its shutdown): the caller then uses `exact` itself.
pub fn mixture_at(
    key: [u64; 6],
    exact: impl Fn(f64) -> [f64; 3],
    ln_gamma_e: f64,
) -> Option<[f64; 3]> {
    let (lo, hi) = MIXTURE_LN_GAMMA;
    if !(ln_gamma_e > lo && ln_gamma_e < hi) {
        return None;
    }
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
                        table: build(exact),
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

    /// A stand-in mixture k: f = k G^(3/2), with its derivatives in ln G.
    fn stand_in(k: f64) -> impl Fn(f64) -> [f64; 3] {
        move |x: f64| {
            let f = k * (1.5 * x).exp();
            [f, 1.5 * f, 2.25 * f]
        }
    }

    /// More mixtures than the cache holds, met in turn: every value is the one a fresh table
    /// gives, bit for bit, and belongs to its own mixture.
    #[test]
    fn cached_values_do_not_depend_on_the_order_of_mixtures() {
        let count = CACHED_MIXTURES + 2;
        let key = |k: usize| [k as u64, 0, 0, 0, 0, 0];
        let x = -0.7;
        let fresh: Vec<[f64; 3]> = (0..count)
            .map(|k| build(stand_in(k as f64 + 1.0)).unwrap().at(x).unwrap())
            .collect();
        for round in 0..3 {
            for k in (0..count).rev().skip(round % 2) {
                let v = mixture_at(key(k), stand_in(k as f64 + 1.0), x).unwrap();
                assert_eq!(v, fresh[k]);
            }
        }
        assert!(mixture_at(key(0), stand_in(1.0), MIXTURE_LN_GAMMA.1 + 0.1).is_none());
        assert!(mixture_at(key(0), stand_in(1.0), MIXTURE_LN_GAMMA.0 - 0.1).is_none());
    }
}
