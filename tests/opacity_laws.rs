//! Opacity laws: electron scattering, Kramers, H-minus, conduction and the refined combination.

use starpoise::constants::{M_U_G, SIGMA_T_CM2};
use starpoise::physics::opacity::{
    AnalyticOpacity, Conductive, ElectronScattering, HMinus, Kramers, Opacity, RefinedOpacity,
};
use starpoise::physics::{Composition, Scaled};
use std::sync::Arc;

fn solar() -> Composition {
    Composition::new(0.70, 0.02).unwrap()
}

/// kappa_es = sigma_T / m_u (1 + X)/2 to 1e-4 (docs/references.md §3: 0.20031 (1+X), computed
/// from CODATA 2018 sigma_T and m_u; confirmed constants).
#[test]
fn electron_scattering_is_thomson() {
    for x in [0.0, 0.35, 0.7, 1.0] {
        let c = Composition::new(x, 0.0).unwrap();
        let k = ElectronScattering.kappa(1.0, 1e7, &c).unwrap();
        assert!((k / (SIGMA_T_CM2 / M_U_G * (1.0 + x) / 2.0) - 1.0).abs() < 1e-4);
        assert!((k / (0.20031 * (1.0 + x)) - 1.0).abs() < 1e-4);
    }
}

/// Kramers: ff 3.68e22 (1-Z)(1+X) rho T^-3.5 and bf 4.34e25 (Z/t)(1+X) rho T^-3.5
/// (docs/references.md §3, confirmed), evaluated by hand at rho = 1, T = 1e6.
#[test]
fn kramers_by_hand() {
    let c = solar();
    let k1 = Kramers::default().kappa(1.0, 1e6, &c).unwrap();
    let ff = 3.68e22 * 0.98 * 1.7 * 1e-21;
    let bf = 4.34e25 * 0.02 * 1.7 * 1e-21;
    assert!((k1 / (ff + bf) - 1.0).abs() < 1e-12);
    let k10 = Kramers::new(10.0).unwrap().kappa(1.0, 1e6, &c).unwrap();
    assert!((k10 / (ff + bf / 10.0) - 1.0).abs() < 1e-12);
    assert!(Kramers::new(0.0).is_err());
    assert!(Kramers::new(f64::NAN).is_err());
}

/// H-minus 2.5e-31 (Z/0.02) rho^(1/2) T^9 (docs/references.md §3, memory) by hand, and its
/// domain 2e3..1e4 K, rho <= 1e-2.
#[test]
fn h_minus_by_hand_and_domain() {
    let c = solar();
    let k = HMinus.kappa(1e-7, 5000.0, &c).unwrap();
    assert!((k / (2.5e-31 * 1e-7f64.sqrt() * 5000f64.powi(9)) - 1.0).abs() < 1e-12);
    assert!(HMinus.kappa(1e-7, 2e4, &c).is_err());
    assert!(HMinus.kappa(1.0, 5e3, &c).is_err());
}

/// Conduction is negligible at the solar centre (docs/references.md §3: negligible for ZAMS
/// stars above 0.1 M_sun): kappa_cd > 100 kappa_rad there. In degenerate matter it follows the
/// Lorentz-gas closed form kappa_cd = 16 a c T^2 e^4 Lambda m_e^2 <Z^2> / (3 pi^3 k^2 rho n_e hbar^3)
/// (derived here with v = v_F; proportional to T^2 / rho^2 at fixed Lambda), tested to 1 per cent at
/// T = 1e5 K where v_th / v_F ~ 3e-2 at 1e5 g/cm^3.
#[test]
fn conduction_limits() {
    let sun = Composition::new(0.34, 0.02).unwrap();
    let rad = RefinedOpacity::default().radiative(150.0, 1.57e7, &sun);
    let cd = Conductive.kappa(150.0, 1.57e7, &sun).unwrap();
    assert!(cd > 100.0 * rad, "cd {cd} rad {rad}");
    // Pure helium, degenerate.
    let he = Composition::new(0.0, 0.0).unwrap();
    let (rho, t) = (1e5, 1e5);
    let got = Conductive.kappa(rho, t, &he).unwrap();
    use starpoise::constants::*;
    let pi = std::f64::consts::PI;
    let n_e = rho / M_U_G * 0.5;
    let n_i = rho / M_U_G * 0.25;
    let p_f = HBAR_ERG_S * (3.0 * pi * pi * n_e).cbrt();
    let lambda_c = ((3.0 / (4.0 * pi * n_i)).cbrt() * 2.0 * p_f / HBAR_ERG_S).ln();
    // Z^2 n_i / n_e = 2 for helium.
    let closed = 16.0 * A_RAD_CGS * C_CM_S * t * t * E_ESU.powi(4) * lambda_c * M_E_G * M_E_G * 2.0
        / (3.0 * pi.powi(3) * K_B_ERG_K * K_B_ERG_K * rho * n_e * HBAR_ERG_S.powi(3));
    assert!((got / closed - 1.0).abs() < 0.01, "{got} vs {closed}");
}

/// The refined opacity is smooth and sensible from 2e3 to 1e9 K along a stellar-envelope-like
/// track: positive, finite, no jump above a factor 1.5 between neighbouring points 0.01 dex
/// apart (the steepest term, H- as T^9, changes by 1.23 over 0.01 dex), electron scattering
/// at 1e9 K, and the maximum between 1e4 and 1e5 K (the opacity bump of ionising hydrogen;
/// common practice, no source).
#[test]
fn refined_is_smooth_from_2e3_to_1e9_kelvin() {
    let c = solar();
    let law = RefinedOpacity::default();
    let mut prev: Option<f64> = None;
    let mut peak: f64 = 0.0;
    let mut t_peak = 0.0;
    let mut lt = 3.3;
    while lt <= 9.0 {
        let t = 10f64.powf(lt);
        // rho along R = rho / T6^3 = 1e-2, a stellar-envelope-like track.
        let rho = 1e-2 * (t / 1e6).powi(3);
        let k = law.kappa(rho, t, &c).unwrap();
        assert!(k.is_finite() && k > 0.0);
        if let Some(p) = prev {
            assert!((k / p).max(p / k) < 1.5, "jump at log T {lt}: {p} -> {k}");
        }
        if k > peak {
            peak = k;
            t_peak = t;
        }
        prev = Some(k);
        lt += 0.01;
    }
    assert!(t_peak > 1e4 && t_peak < 1e5, "peak {peak} at {t_peak}");
    let es = ElectronScattering.kappa(1.0, 1e9, &c).unwrap();
    assert!((law.kappa(1.0, 1e9, &c).unwrap() / es - 1.0).abs() < 0.02);
    // Cool neutral gas: scattering switched off, the molecular floor 0.1 Z remains.
    let cold = law.kappa(1e-10, 2e3, &c).unwrap();
    assert!(cold < 0.01, "cold {cold}");
}

/// With its default calibration the refined opacity lies within a factor 2 of tabulated
/// Rosseland means of OPAL-based solar models (values from memory, loose on purpose): about
/// 1.3 cm^2/g at the solar centre (rho 150, T 1.57e7, X 0.34), about 20 at the base of the
/// convective envelope (rho 0.2, T 2.2e6, X 0.7).
#[test]
fn refined_near_solar_interior_values() {
    let centre = Composition::new(0.34, 0.02).unwrap();
    let k = RefinedOpacity::default()
        .kappa(150.0, 1.57e7, &centre)
        .unwrap();
    assert!(k > 0.65 && k < 2.6, "centre kappa {k}");
    let k = RefinedOpacity::default()
        .kappa(0.2, 2.2e6, &solar())
        .unwrap();
    assert!(k > 10.0 && k < 40.0, "envelope kappa {k}");
    assert!(RefinedOpacity::new(2.0, 1.5).is_err());
    assert_eq!(
        RefinedOpacity::new(5.0, 0.0).unwrap().guillotine_at(1e3),
        5.0
    );
}

/// The scale factor multiplies, and its name records it; a bad factor is refused.
#[test]
fn scaled_opacity() {
    let c = solar();
    let base: Arc<dyn Opacity> = Arc::new(AnalyticOpacity::default());
    let twice = Scaled::new(base.clone(), 2.0, "--opacity-factor").unwrap();
    assert_eq!(
        twice.kappa(1.0, 1e6, &c).unwrap(),
        2.0 * base.kappa(1.0, 1e6, &c).unwrap()
    );
    assert_eq!(twice.name(), "analytic*2");
    assert!(Scaled::new(base.clone(), 0.0, "--opacity-factor").is_err());
    assert!(Scaled::new(base, f64::INFINITY, "--opacity-factor").is_err());
}

/// Bell & Lin (1994) piecewise law (docs/references.md §8.3; coefficients memory, regime bounds
/// computed): inside each regime, away from the rounded corners (a factor 1.5 from every
/// bound), it is the regime's power law exactly; at the computed bounds neighbouring regimes
/// agree to the 5-6 digits of the recorded bounds.
#[test]
fn bell_lin_regimes_and_bounds() {
    use starpoise::physics::opacity::BellLin;
    let rho: f64 = 1e-9;
    // Molecules -> H- bound 1e4 rho^(1/21) K; H- -> bound-free 31195.2 rho^(4/75) K.
    let t_mol = 1e4 * rho.powf(1.0 / 21.0);
    let t_hm = 31195.2 * rho.powf(4.0 / 75.0);
    let molecules = |t: f64| 1e-8 * rho.powf(2.0 / 3.0) * t.powi(3);
    let h_minus = |t: f64| 1e-36 * rho.powf(1.0 / 3.0) * t.powi(10);
    let bound_free = |t: f64| 1.5e20 * rho * t.powf(-2.5);
    assert!((molecules(t_mol) / h_minus(t_mol) - 1.0).abs() < 1e-4);
    assert!((h_minus(t_hm) / bound_free(t_hm) - 1.0).abs() < 1e-4);
    let c = solar();
    let law = |t: f64| BellLin.kappa(rho, t, &c).unwrap();
    let mid = (t_mol * t_hm).sqrt();
    for (t, expected) in [
        (t_mol / 1.5, molecules(t_mol / 1.5)),
        (mid, h_minus(mid)),
        (t_hm * 1.5, bound_free(t_hm * 1.5)),
    ] {
        assert!((law(t) / expected - 1.0).abs() < 1e-12, "{t} K");
    }
    // Electron scattering 0.348 at 1e6 K and 1e-9 g/cm^3 (bound-free is 1e-4 of it there).
    assert!((BellLin.kappa(1e-9, 1e6, &c).unwrap() - 0.348).abs() < 1e-9);
    // Outside the published range: an error, not an extrapolation.
    assert!(BellLin.kappa(1e-2, 3000.0, &c).is_err());
    assert!(BellLin.kappa(1e-9, 100.0, &c).is_err());
}

/// The refined opacity below 4000 K: the Bell & Lin molecular term (scaled by Z/0.02) takes
/// over from H-, which is switched off below 2500 K (outside the 3000–6000 K range it was
/// fitted on); at 2000 K the radiative opacity is the molecular term plus the 0.1 Z floor, and
/// above 4500 K the molecular term is gone (docs/references.md §3, §8.3).
#[test]
fn refined_opacity_below_4000_k() {
    use starpoise::physics::opacity::bell_lin::molecular_kappa;
    let c = solar();
    let refined = RefinedOpacity::default();
    let (rho, t) = (1e-6, 2000.0);
    let expected = molecular_kappa(rho, t) + 0.1 * 0.02;
    // Electron scattering by the 1e-20 ionised hydrogen and Kramers (~5e6 cm^2/g here) through
    // the harmonic sum change it by 2e-9: tolerance 1e-8.
    let got = refined.radiative(rho, t, &c);
    assert!((got / expected - 1.0).abs() < 1e-8, "{got} vs {expected}");
    // Scales with Z.
    let poor = Composition::new(0.70, 0.002).unwrap();
    let poor_expected = molecular_kappa(rho, t) * 0.1 + 0.1 * 0.002;
    assert!((refined.radiative(rho, t, &poor) / poor_expected - 1.0).abs() < 1e-8);
    // Above 4500 K only H- and the rest: the molecular term would be 0.07 at 5000 K, 1e-7.
    let hot = refined.radiative(1e-7, 5000.0, &c);
    let h_minus = HMinus::formula(1e-7, 5000.0, &c);
    assert!(hot < 1.1 * h_minus + 0.01, "{hot} vs H- {h_minus}");
}

/// The refined law reports the ends of its two switches in temperature (H- off below
/// 2500-3000 K, molecules off above 4500-5500 K) as its temperature breaks, in increasing order
/// (what `structure::surface` needs to restart the atmosphere there); the smooth laws report none.
#[test]
fn temperature_breaks_are_the_switch_ends_in_increasing_order() {
    use starpoise::physics::opacity::{ElectronScattering, Kramers, Opacity, RefinedOpacity};
    let breaks = RefinedOpacity::default().temperature_breaks_k();
    assert_eq!(breaks, &[2500.0, 3000.0, 4500.0, 5500.0]);
    assert!(breaks.windows(2).all(|w| w[0] < w[1]));
    assert!(ElectronScattering.temperature_breaks_k().is_empty());
    assert!(Kramers::new(1.0).unwrap().temperature_breaks_k().is_empty());
}
