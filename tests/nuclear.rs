//! Nuclear energy generation: Gamow constants, screening, solar-centre values, the pp/CNO
//! crossover, temperature exponents, and the power-law and scaled laws.

use starpoise::physics::nuclear::sfactor::{screening, Reaction};
use starpoise::physics::nuclear::{AnalyticRates, EnergyGeneration, PowerLawRates, SFactorRates};
use starpoise::physics::{Composition, Scaled};
use std::sync::Arc;

/// tau T6^(1/3) = 33.80 for p + p and 152.28 for p + 14N (docs/references.md §4, computed from
/// CODATA with nuclear masses; Clayton 1968 ch. 4 gives 42.487 (Z1^2 Z2^2 A)^(1/3), memory).
/// Tolerance 0.01 and 0.02: the last printed digit.
#[test]
fn gamow_constants() {
    assert!(
        (Reaction::pp().tau_times_t6_cbrt() - 33.80).abs() < 0.01,
        "{}",
        Reaction::pp().tau_times_t6_cbrt()
    );
    assert!(
        (Reaction::p_n14().tau_times_t6_cbrt() - 152.28).abs() < 0.02,
        "{}",
        Reaction::p_n14().tau_times_t6_cbrt()
    );
}

/// Weak screening ln f = 0.188 Z1 Z2 zeta rho^(1/2) T6^(-3/2) (Salpeter 1954; coefficient
/// 0.18791 computed in docs/references.md §4), about 1.05 for p + p at the solar centre.
#[test]
fn weak_screening_coefficient() {
    let c = Composition::new(0.34, 0.02).unwrap();
    let (rho, t6) = (150.0, 15.7);
    let (ln_f, _) = screening(1.0, 1.0, rho, t6 * 1e6, &c);
    let zeta = (2.0 * 0.34 + 1.5 * 0.64 + 4.5 * 0.02f64).sqrt();
    let coeff = ln_f / (zeta * rho.sqrt() * t6.powf(-1.5));
    assert!((coeff / 0.18791 - 1.0).abs() < 1e-3, "{coeff}");
    assert!((ln_f.exp() - 1.05).abs() < 0.01, "f = {}", ln_f.exp());
}

fn kw_pp(rho: f64, t: f64, x: f64) -> f64 {
    // Kippenhahn & Weigert 1990 §18.5 (memory) with psi = f11 = g11 = 1.
    let t6 = t / 1e6;
    2.38e6 * rho * x * x * t6.powf(-2.0 / 3.0) * (-33.80 * t6.powf(-1.0 / 3.0)).exp()
}

fn kw_cno(rho: f64, t: f64, x: f64, x_cno: f64) -> f64 {
    let t6 = t / 1e6;
    8.67e27 * rho * x * x_cno * t6.powf(-2.0 / 3.0) * (-152.28 * t6.powf(-1.0 / 3.0)).exp()
}

/// Solar centre (rho 150, T 1.57e7, X 0.34; Bahcall, Serenelli & Basu 2005, ApJ 621, L85, via secondary sources): eps of order
/// 10–20 erg/g/s with pp dominating (docs/references.md §4: eps_pp about 11 with psi = f = 1;
/// ppII, screening and the S-factor slope raise it by tens of per cent). Against the textbook
/// formulas: pp within a factor 2; CNO between 0.35 and 1 of the textbook value (modern
/// S-factors halve its prefactor, docs/references.md §4).
#[test]
fn solar_centre() {
    let c = Composition::new(0.34, 0.02).unwrap();
    let (rho, t) = (150.0, 1.57e7);
    let r = SFactorRates::default().rate(rho, t, &c).unwrap();
    let total = r.total_erg_g_s();
    assert!(total > 8.0 && total < 25.0, "total {total}");
    assert!(r.eps_pp_erg_g_s > 2.0 * r.eps_cno_erg_g_s, "{r:?}");
    let pp_ratio = r.eps_pp_erg_g_s / kw_pp(rho, t, 0.34);
    assert!(pp_ratio > 0.5 && pp_ratio < 2.0, "pp ratio {pp_ratio}");
    let cno_ratio = r.eps_cno_erg_g_s / kw_cno(rho, t, 0.34, c.x_cno());
    assert!(cno_ratio > 0.35 && cno_ratio < 1.0, "cno ratio {cno_ratio}");
}

/// CNO overtakes pp between 1.7e7 and 2.0e7 K for X = 0.7, Z = 0.02 (X_CNO = 0.014), rho = 100
/// (textbook fact, common practice; docs/references.md §4 computes 17.6–18.4 MK).
#[test]
fn cno_overtakes_pp_between_17_and_20_mk() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let law = SFactorRates::default();
    let at = |t: f64| law.rate(100.0, t, &c).unwrap();
    assert!(at(1.7e7).eps_pp_erg_g_s > at(1.7e7).eps_cno_erg_g_s);
    assert!(at(2.0e7).eps_pp_erg_g_s < at(2.0e7).eps_cno_erg_g_s);
}

/// Temperature exponents near 1.5e7 K: about 4 for pp and 15–20 for CNO (textbook values, e.g.
/// Kippenhahn & Weigert 1990 §18.5; common practice). nu = (tau - 2)/3 gives 19.9 for CNO at
/// 15 MK before screening lowers it slightly, hence the upper bound 20.5.
#[test]
fn temperature_exponents() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let r = SFactorRates::default().rate(80.0, 1.5e7, &c).unwrap();
    assert!(r.nu_pp > 3.5 && r.nu_pp < 5.0, "nu_pp {}", r.nu_pp);
    assert!(r.nu_cno > 15.0 && r.nu_cno < 20.5, "nu_cno {}", r.nu_cno);
    let a = AnalyticRates::default().rate(80.0, 1.5e7, &c).unwrap();
    assert!(a.nu_pp > 3.5 && a.nu_pp < 5.0);
}

/// The analytic nu of every law agrees with a centred finite difference of ln eps (step 1e-4 in
/// ln T: truncation ~1e-7 nu''; tolerance 1e-4), across the pp and CNO regimes.
#[test]
fn exponents_match_finite_differences() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let laws: [&dyn EnergyGeneration; 3] = [
        &SFactorRates::default(),
        &AnalyticRates::default(),
        &PowerLawRates::new(0.1, 1.5e7, 4.0).unwrap(),
    ];
    let h: f64 = 1e-4;
    for law in laws {
        for (rho, t) in [
            (1.0, 5e6),
            (80.0, 1.5e7),
            (30.0, 3e7),
            (500.0, 4e6),
            (5.0, 8e7),
        ] {
            let r = law.rate(rho, t, &c).unwrap();
            let up = law.rate(rho, t * h.exp(), &c).unwrap();
            let dn = law.rate(rho, t * (-h).exp(), &c).unwrap();
            let fd_pp = (up.eps_pp_erg_g_s.ln() - dn.eps_pp_erg_g_s.ln()) / (2.0 * h);
            assert!(
                (fd_pp - r.nu_pp).abs() < 1e-4,
                "{} pp at {rho} {t}: {} vs {fd_pp}",
                law.name(),
                r.nu_pp
            );
            if r.eps_cno_erg_g_s > 0.0 {
                let fd_cno = (up.eps_cno_erg_g_s.ln() - dn.eps_cno_erg_g_s.ln()) / (2.0 * h);
                assert!(
                    (fd_cno - r.nu_cno).abs() < 1e-4,
                    "{} cno at {rho} {t}: {} vs {fd_cno}",
                    law.name(),
                    r.nu_cno
                );
            }
        }
    }
}

/// The ppII fraction of 3He burning grows with temperature from near 0 to near 1 (textbook:
/// ppI dominates below about 1.4e7 K, ppII above; common practice, no source).
#[test]
fn pp2_fraction_grows_with_temperature() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let law = SFactorRates::default();
    let (cool, _) = law.pp2_fraction(50.0, 8e6, &c);
    let (hot, _) = law.pp2_fraction(50.0, 2.5e7, &c);
    assert!(cool < 0.2 && hot > 0.7, "{cool} {hot}");
}

/// Power law by hand; bad parameters are refused; the scale factor multiplies both parts and
/// keeps the exponents.
#[test]
fn power_law_and_scaling() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let law = PowerLawRates::new(0.1, 1.5e7, 4.0).unwrap();
    let r = law.rate(50.0, 3e7, &c).unwrap();
    assert!((r.eps_pp_erg_g_s / (0.1 * 50.0 * 0.49 * 16.0) - 1.0).abs() < 1e-12);
    assert_eq!(r.eps_cno_erg_g_s, 0.0);
    assert!(PowerLawRates::new(-1.0, 1.5e7, 4.0).is_err());
    assert!(PowerLawRates::new(1.0, 0.0, 4.0).is_err());
    assert!(PowerLawRates::new(1.0, 1e7, f64::NAN).is_err());
    let base: Arc<dyn EnergyGeneration> = Arc::new(SFactorRates::default());
    let scaled = Scaled::new(base.clone(), 3.0, "--rates-factor").unwrap();
    let (a, b) = (
        base.rate(80.0, 1.5e7, &c).unwrap(),
        scaled.rate(80.0, 1.5e7, &c).unwrap(),
    );
    assert!((b.eps_pp_erg_g_s / a.eps_pp_erg_g_s - 3.0).abs() < 1e-12);
    assert!((b.eps_cno_erg_g_s / a.eps_cno_erg_g_s - 3.0).abs() < 1e-12);
    assert_eq!(a.nu_pp, b.nu_pp);
    assert_eq!(scaled.name(), "sfactor*3");
}

/// Outside the domain: an error, never NaN.
#[test]
fn rates_outside_the_domain() {
    let c = Composition::new(0.70, 0.02).unwrap();
    let law = SFactorRates::default();
    assert!(law.rate(-1.0, 1e7, &c).is_err());
    assert!(law.rate(1.0, f64::NAN, &c).is_err());
    assert!(law.rate(1.0, 1e11, &c).is_err());
    // Cool envelope: zero, not an error.
    let cool = law.rate(1e-6, 5e3, &c).unwrap();
    assert_eq!(cool.eps_cno_erg_g_s, 0.0);
}

/// The fast evaluation inside the law equals the documented formulas: eps_CNO =
/// n_p n_14 <sigma v> f Q_CN / rho with <sigma v> from Reaction::sigma_v and f from screening
/// (same equations, factors shared; agreement to 1e-12 relative, rounding only).
#[test]
fn law_matches_its_formulas() {
    use starpoise::constants::{MEV_ERG, M_U_G};
    use starpoise::physics::nuclear::sfactor::Q_CN_MEV;
    let c = Composition::new(0.70, 0.02).unwrap();
    for (rho, t) in [(80.0, 1.5e7), (1.0, 3e7), (1e3, 5e6)] {
        let r = SFactorRates::default().rate(rho, t, &c).unwrap();
        let (sv, nu) = Reaction::p_n14().sigma_v(t);
        let (ln_f, dln_f) = screening(1.0, 7.0, rho, t, &c);
        let n_p = rho * 0.70 / (1.007_825_03 * M_U_G);
        let n_14 = rho * c.x_cno() / (14.003_074 * M_U_G);
        let want = n_p * n_14 * sv * ln_f.exp() * Q_CN_MEV * MEV_ERG / rho;
        assert!(
            (r.eps_cno_erg_g_s / want - 1.0).abs() < 1e-12,
            "{} vs {want}",
            r.eps_cno_erg_g_s
        );
        assert!((r.nu_cno - (nu + dln_f)).abs() < 1e-10);
    }
}

/// The unscreened CN-cycle rate from the S-factor of 14N(p,gamma)15O (Adelberger et al. 2011)
/// against its closed form with the modern prefactor, eps_CNO = 4.34e27 rho X X_14N
/// T6^(-2/3) exp(-152.28 T6^(-1/3)) erg/g/s (docs/references.md §4, computed). The closed form
/// leaves out the S_eff corrections (5/(12 tau) and the S' term, a few per cent here), so the
/// two agree to 3 per cent across the CNO-burning range.
#[test]
fn cno_rate_matches_the_modern_closed_form() {
    use starpoise::constants::{MEV_ERG, M_U_G};
    use starpoise::physics::nuclear::sfactor::{Reaction, Q_CN_MEV};
    let (x, x14, rho) = (0.7, 0.014, 100.0);
    for t6 in [15.0, 20.0, 25.0, 30.0] {
        let t: f64 = t6 * 1e6;
        let (sv, _) = Reaction::p_n14().sigma_v(t);
        let n_p = rho * x / (1.007_825 * M_U_G);
        let n_14 = rho * x14 / (14.003_074 * M_U_G);
        let eps = n_p * n_14 * sv * Q_CN_MEV * MEV_ERG / rho;
        let closed =
            4.34e27 * rho * x * x14 * t6.powf(-2.0 / 3.0) * (-152.28 * t6.powf(-1.0 / 3.0)).exp();
        let ratio = eps / closed;
        assert!((ratio - 1.0).abs() < 0.03, "T6 = {t6}: ratio {ratio}");
    }
}
