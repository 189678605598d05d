//! Number formats shared by the text outputs.

use crate::physics::PhysicsSpec;

/// The laws of `spec` in one line: `eos E, opacity O, rates R, convection C, atmosphere A`, with
/// ` (factor F)` after a scaled law.
pub fn laws_text(spec: &PhysicsSpec) -> String {
    let factor = |f: f64| {
        if f == 1.0 {
            String::new()
        } else {
            format!(" (factor {f})")
        }
    };
    format!(
        "eos {}, opacity {}{}, rates {}{}, convection {}, atmosphere {}",
        spec.eos,
        spec.opacity,
        factor(spec.opacity_factor),
        spec.rates,
        factor(spec.rates_factor),
        spec.convection,
        spec.atmosphere
    )
}

/// A number with six significant figures: plain between 1e-3 and 1e6, else in exponent form;
/// `n/a` for a value that is not finite.
pub fn num(v: f64) -> String {
    let a = v.abs();
    if !v.is_finite() {
        "n/a".to_string()
    } else if a == 0.0 {
        "0".to_string()
    } else if (1e-3..1e6).contains(&a) {
        let decimals = (5 - a.log10().floor() as i32).clamp(0, 8) as usize;
        format!("{v:.decimals$}")
    } else {
        format!("{v:.5e}")
    }
}

#[cfg(test)]
mod tests {
    use super::num;

    #[test]
    fn six_significant_figures() {
        assert_eq!(num(0.694787123), "0.694787");
        assert_eq!(num(1.32267e7), "1.32267e7");
        assert_eq!(num(5568.9), "5568.90");
        assert_eq!(num(0.0), "0");
        assert_eq!(num(f64::NAN), "n/a");
    }
}
