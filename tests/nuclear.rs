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

/// Unscreened `<sigma v>` of p + p and 3He + 3He, cm^3 s^-1, from the analytic fits of
/// Caughlan & Fowler 1988 (At. Data Nucl. Data Tables 40, 283; memory, docs/references.md
/// §4.1): N_A `<sigma v>`_11 = 4.01e-15 T9^(-2/3) exp(-3.380 T9^(-1/3)) (1 + 0.123 T9^(1/3) +
/// 1.09 T9^(2/3) + 0.938 T9) and N_A `<sigma v>`_33 = 6.04e10 T9^(-2/3) exp(-12.276 T9^(-1/3))
/// (1 + 0.034 T9^(1/3) - 0.522 T9^(2/3) - 0.124 T9 + 0.353 T9^(4/3) + 0.213 T9^(5/3)).
fn cf88_pp_and_33(t: f64) -> (f64, f64) {
    const N_A: f64 = 6.022_140_76e23;
    let t9 = t * 1e-9;
    let c = t9.cbrt();
    let pp =
        4.01e-15 / (c * c) * (-3.380 / c).exp() * (1.0 + 0.123 * c + 1.09 * c * c + 0.938 * t9);
    let he33 = 6.04e10 / (c * c)
        * (-12.276 / c).exp()
        * (1.0 + 0.034 * c - 0.522 * c * c - 0.124 * t9 + 0.353 * t9 * c + 0.213 * t9 * c * c);
    (pp / N_A, he33 / N_A)
}

const YEAR_S: f64 = 365.25 * 86400.0;

/// 3He at equilibrium at the solar-centre conditions of docs/references.md §4 (T6 = 15.7,
/// rho = 150, X = 0.35, Z = 0.02).
/// - Textbook magnitudes (docs/references.md §4.1, memory, window a factor 3 each way as befits
///   memory): the equilibrium number ratio 3He/H is about 1e-5 near T6 = 15 (Clayton 1968,
///   ch. 5, figure of the equilibrium ratio against T6), and 3He reaches it in about 1e5 yr at
///   the solar centre (same figure; its "time to reach equilibrium" may be the lifetime
///   1 / (lambda_33 n_3), which is 2 tau_eq without 3He + 4He: inside the window).
/// - Against the Caughlan & Fowler 1988 fits (memory): without 3He + 4He (Y = 0, so pure ppI)
///   and with the law's screening divided out, n_3/n_p = sqrt(<sigma v>_11 / (2 <sigma v>_33))
///   and tau_eq = 1 / (2 sqrt(<sigma v>_33 r_pp)) agree within 10 per cent: the S-factors of
///   1988 and of Adelberger et al. 2011 differ by a few per cent, and enter as square roots.
#[test]
fn he3_equilibrium_at_the_solar_centre() {
    use starpoise::constants::M_U_G;
    let (rho, t) = (150.0, 1.57e7);
    let law = SFactorRates::default();
    let sun = Composition::new(0.35, 0.02).unwrap();
    let e = law.he3_equilibrium_at(rho, t, &sun).unwrap();
    let n_p = rho * 0.35 / (1.007_825_03 * M_U_G);
    let ratio = e.number_density_cm3 / n_p;
    assert!(ratio > 1e-5 / 3.0 && ratio < 3e-5, "3He/H {ratio}");
    let tau_yr = e.relaxation_time_s / YEAR_S;
    assert!(tau_yr > 1e5 / 3.0 && tau_yr < 3e5, "tau {tau_yr} yr");
    let lifetime_yr = 1.0 / (e.he3_he3_cm3_s * e.number_density_cm3) / YEAR_S;
    assert!(
        lifetime_yr > 1e5 / 3.0 && lifetime_yr < 3e5,
        "{lifetime_yr} yr"
    );
    // The mass fraction is n_3 m(3He) / rho (3.016029 u less two electrons).
    let m3 = 3.016_029_32 * M_U_G - 2.0 * 9.109_383_7e-28;
    assert!((e.mass_fraction / (e.number_density_cm3 * m3 / rho) - 1.0).abs() < 1e-12);

    let pure = Composition::new(0.98, 0.02).unwrap();
    let e = law.he3_equilibrium_at(rho, t, &pure).unwrap();
    // Y = 1 - 0.98 - 0.02 is zero to rounding: 3He + 4He is negligible.
    assert!(e.he3_he4_per_s < 1e-12 * e.he3_he3_cm3_s * e.number_density_cm3);
    let (f11, _) = screening(1.0, 1.0, rho, t, &pure);
    let (f33, _) = screening(2.0, 2.0, rho, t, &pure);
    let (sv11, sv33) = cf88_pp_and_33(t);
    let (sv11, sv33) = (sv11 * f11.exp(), sv33 * f33.exp());
    let n_p = rho * 0.98 / (1.007_825_03 * M_U_G);
    let r = 0.5 * n_p * n_p * sv11;
    let want_ratio = (sv11 / (2.0 * sv33)).sqrt();
    let want_tau = 1.0 / (2.0 * (sv33 * r).sqrt());
    let got_ratio = e.number_density_cm3 / n_p;
    assert!(
        (got_ratio / want_ratio - 1.0).abs() < 0.1,
        "{got_ratio} vs {want_ratio}"
    );
    assert!(
        (e.relaxation_time_s / want_tau - 1.0).abs() < 0.1,
        "{} vs {want_tau}",
        e.relaxation_time_s
    );
}

/// tau_eq falls steeply with temperature. Without 3He + 4He (Y = 0) tau_eq =
/// 1 / (2 sqrt(<sigma v>_33 r_pp)), and each rate goes as T^(-2/3) exp(-tau) with tau =
/// 3 E_0 / kT = B T6^(-1/3) (Clayton 1968, ch. 4), so, calculus only,
/// d ln tau_eq / d ln T = -((tau_11 - 2)/3 + (tau_33 - 2)/3) / 2, and from T1 to T2
/// ln(tau_eq(T2)/tau_eq(T1)) = (2/3) ln(T2/T1) + (B_11 + B_33)/2 (T2^(-1/3) - T1^(-1/3)), with
/// B from the Gamow energies ([`Reaction::tau_times_t6_cbrt`]). At 1e-2 g/cm^3 screening is
/// below 1e-2 in ln f; what the Gamow form leaves out is the S-factor terms of S_eff
/// ((S'/S) E_0 for p + p, 5/(12 tau)), below 0.05 in the slope of about -12 here (computed):
/// tolerance 0.5 per cent in the slope, 0.1 in the logarithm over the octave. Over 8 -> 16 MK
/// tau_eq falls by more than three orders of magnitude, also at a stellar density with 4He.
#[test]
fn he3_equilibrium_time_falls_steeply_with_temperature() {
    let law = SFactorRates::default();
    let pure = Composition::new(0.98, 0.02).unwrap();
    let rho = 1e-2;
    let ln_tau = |t: f64| {
        law.he3_equilibrium_at(rho, t, &pure)
            .unwrap()
            .relaxation_time_s
            .ln()
    };
    let b11 = Reaction::pp().tau_times_t6_cbrt();
    let b33 = Reaction::he3_he3().tau_times_t6_cbrt();
    // Clayton's 42.487 (Z1^2 Z2^2 A)^(1/3) (memory) with A = 1.5075, the reduced mass in u of
    // two 3He nuclei: 122.75 (docs/references.md §4.1); tolerance the last digit of 42.487.
    assert!((b33 - 122.75).abs() < 0.01, "B_33 {b33}");
    let h = 1e-4;
    for t6 in [8.0, 12.0, 16.0] {
        let t = t6 * 1e6;
        let slope = (ln_tau(t * f64::exp(h)) - ln_tau(t * f64::exp(-h))) / (2.0 * h);
        let tau11 = b11 / f64::cbrt(t6);
        let tau33 = b33 / f64::cbrt(t6);
        let want = -((tau11 - 2.0) / 3.0 + (tau33 - 2.0) / 3.0) / 2.0;
        assert!(
            (slope / want - 1.0).abs() < 5e-3,
            "T6 {t6}: slope {slope} vs {want}"
        );
    }
    let (t1, t2): (f64, f64) = (8.0, 16.0);
    let drop = ln_tau(t2 * 1e6) - ln_tau(t1 * 1e6);
    let want =
        2.0 / 3.0 * (t2 / t1).ln() + 0.5 * (b11 + b33) * (t2.cbrt().recip() - t1.cbrt().recip());
    assert!((drop - want).abs() < 0.1, "{drop} vs {want}");
    let star = Composition::new(0.70, 0.02).unwrap();
    let at = |t: f64| {
        law.he3_equilibrium_at(100.0, t, &star)
            .unwrap()
            .relaxation_time_s
    };
    assert!(at(8e6) / at(16e6) > 1e3, "{}", at(8e6) / at(16e6));
}

/// The returned n_3,eq is the balance the law takes: r_pp = lambda_33 n_3^2 + lambda_34 n_3
/// to 1e-12 (rounding only), tau_eq = 1 / D'(n_3,eq) against a centred difference of D (step
/// 1e-5 relative: D is quadratic, so only rounding, tolerance 1e-8), and the ppII fraction of
/// the law's energy, beta = lambda_34 n_3 / r_pp, is the one from these numbers. Outside the
/// domain: an error; the Scaled wrapper passes the inner law's through, and the laws without
/// 3He reactions give none.
#[test]
fn he3_equilibrium_balances_the_law() {
    let law = SFactorRates::default();
    for (x, rho, t6) in [
        (0.70, 100.0, 8.0),
        (0.70, 150.0, 15.7),
        (0.35, 150.0, 15.7),
        (0.70, 1.0, 30.0),
        (0.75, 500.0, 4.0),
        (0.98, 10.0, 12.0),
    ] {
        let c = Composition::new(x, 0.02).unwrap();
        let t = t6 * 1e6;
        let e = law.he3_equilibrium_at(rho, t, &c).unwrap();
        let n_3 = e.number_density_cm3;
        let balance = e.destruction_cm3_s(n_3) / e.production_cm3_s - 1.0;
        assert!(balance.abs() < 1e-12, "{x} {rho} {t6}: {balance}");
        let h = 1e-5 * n_3;
        let slope = (e.destruction_cm3_s(n_3 + h) - e.destruction_cm3_s(n_3 - h)) / (2.0 * h);
        assert!(
            (e.relaxation_time_s * slope - 1.0).abs() < 1e-8,
            "{x} {rho} {t6}"
        );
        let (beta, _) = law.pp2_fraction(rho, t, &c);
        let want = e.he3_he4_per_s * n_3 / e.production_cm3_s;
        assert!((beta - want).abs() < 1e-12 * (1.0 + want), "{beta} {want}");
    }
    let c = Composition::new(0.70, 0.02).unwrap();
    assert!(law.he3_equilibrium_at(-1.0, 1e7, &c).is_err());
    assert!(law.he3_equilibrium_at(1.0, f64::NAN, &c).is_err());
    let base: Arc<dyn EnergyGeneration> = Arc::new(law);
    let scaled = Scaled::new(base.clone(), 0.509, "--rates-factor").unwrap();
    assert_eq!(
        scaled.he3_equilibrium(100.0, 1e7, &c).unwrap(),
        base.he3_equilibrium(100.0, 1e7, &c).unwrap()
    );
    assert!(base.he3_equilibrium(100.0, 1e7, &c).unwrap().is_some());
    assert_eq!(
        AnalyticRates::default().he3_equilibrium(100.0, 1e7, &c),
        Ok(None)
    );
    let power = PowerLawRates::new(0.1, 1.5e7, 4.0).unwrap();
    assert_eq!(power.he3_equilibrium(100.0, 1e7, &c), Ok(None));
}
