//! Mixing-length convection: the cubic, its two limits and the ordering of the gradients.

use starpoise::physics::convection::mlt::mlt_root;
use starpoise::physics::convection::{Convection, ConvectionPoint, MixingLength};

fn point(rho: f64, t: f64, p: f64, g: f64, kappa: f64, nabla_rad: f64) -> ConvectionPoint {
    ConvectionPoint {
        nabla_rad,
        nabla_ad: 0.4,
        pressure_dyn_cm2: p,
        temperature_k: t,
        density_g_cm3: rho,
        gravity_cm_s2: g,
        opacity_cm2_g: kappa,
        // Ideal monatomic gas: c_P = 5/2 k / (mu m_u), mu = 0.6.
        cp_erg_g_k: 3.46e8,
        delta: 1.0,
    }
}

/// The root solves the cubic of Böhm-Vitense (1958) in its original form
/// (xi - U)^3 + (8U/9)(xi^2 - U^2 - W) = 0 (docs/references.md §5), checked by an independent
/// bisection written here, over 16 decades of U. Tolerance 1e-9 relative on nabla - nabla_ad.
#[test]
fn root_solves_the_original_cubic() {
    for &u in &[1e-8, 1e-4, 1e-2, 1.0, 1e2, 1e4, 1e8] {
        for &w in &[1e-6, 1e-2, 0.5, 10.0, 1e4] {
            let y = mlt_root(u, w);
            // In xi the cancellation xi^2 - U^2 loses digits for large U; write xi = U + d and
            // expand (U + d)^2 - U^2 = d (d + 2U) exactly, then bisect in d.
            let f = |d: f64| d.powi(3) + 8.0 * u / 9.0 * (d * (d + 2.0 * u) - w);
            // f is increasing in d >= 0; f(0) < 0 and f(W^(1/2) + W^(1/3) + 1) > 0.
            let (mut lo, mut hi) = (0.0, w.sqrt() + w.cbrt() + 1.0);
            for _ in 0..400 {
                let mid = 0.5 * (lo + hi);
                if f(mid) > 0.0 {
                    hi = mid
                } else {
                    lo = mid
                }
            }
            let d = 0.5 * (lo + hi);
            let want = d * (d + 2.0 * u); // xi^2 - U^2
            let got = y * y + 2.0 * u * y;
            assert!(
                (got / want - 1.0).abs() < 1e-9 || (got - want).abs() < 1e-12 * w,
                "U {u} W {w}: {got} vs {want}"
            );
            assert!(got > 0.0 && got <= w * (1.0 + 1e-12));
        }
    }
}

/// Deep interior (solar-centre-like rho 100, T 1e7, g 1e5, P 1e17): convection is efficient
/// (U ~ 1e-9) and nabla -> nabla_ad to better than 1e-4 of W. Thin photosphere (rho 1e-9,
/// T 6e3, g 3e4, P 1e5, kappa 1e-3): inefficient, nabla -> nabla_rad within 1 per cent of W.
/// (The two limits of docs/references.md §5.)
#[test]
fn limits_of_efficient_and_inefficient_convection() {
    let law = MixingLength::default();
    let deep = point(100.0, 1e7, 1e17, 1e5, 1.0, 1.0);
    let n = law.nabla(&deep).unwrap();
    assert!(law.efficiency_u(&deep) < 1e-6);
    assert!((n - 0.4) / 0.6 < 1e-4 && n > 0.4, "{n}");
    let thin = point(1e-9, 6e3, 1e5, 3e4, 1e-3, 1.0);
    let n = law.nabla(&thin).unwrap();
    assert!(law.efficiency_u(&thin) > 10.0);
    assert!((1.0 - n) / 0.6 < 0.01 && n < 1.0, "{n}");
}

/// nabla_ad <= nabla <= nabla_rad always, nabla grows with nabla_rad, a larger alpha gives a
/// more nearly adiabatic gradient, and stable layers keep nabla_rad.
#[test]
fn ordering_and_monotonicity() {
    let a18 = MixingLength::default();
    let a10 = MixingLength::new(1.0).unwrap();
    let mut prev = 0.4;
    for k in 1..50 {
        let nr = 0.4 + 0.05 * k as f64;
        let p = point(1e-6, 2e4, 1e9, 1e4, 1e2, nr);
        let n = a18.nabla(&p).unwrap();
        assert!(n >= 0.4 && n <= nr && n > prev);
        prev = n;
        assert!(a10.nabla(&p).unwrap() >= n);
    }
    let stable = point(1.0, 1e7, 1e16, 1e5, 1.0, 0.2);
    assert_eq!(a18.nabla(&stable).unwrap(), 0.2);
    assert!(MixingLength::new(0.0).is_err());
    assert!(MixingLength::new(f64::NAN).is_err());
    assert_eq!(a18.name(), "mlt:alpha=2.4");
}

/// Bad inputs in a convective layer are an error, not NaN.
#[test]
fn bad_inputs_are_errors() {
    let law = MixingLength::default();
    let mut p = point(1e-6, 2e4, 1e9, 1e4, 1e2, 1.0);
    p.gravity_cm_s2 = 0.0;
    assert!(law.nabla(&p).is_err());
    p.gravity_cm_s2 = 1e4;
    p.opacity_cm2_g = f64::NAN;
    assert!(law.nabla(&p).is_err());
}
