//! The `refined` set below 0.6 M_sun against measured stars and published facts
//! (docs/references.md §8.5), each model from the built-in starting guess.

use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::ModelSummary;
use starpoise::structure::{solve, ZamsSettings};

fn model(mass: f64, x: f64, z: f64) -> ModelSummary {
    let physics = PhysicsSet::refined();
    let s = ZamsSettings::new(mass, Composition::new(x, z).unwrap(), physics).unwrap();
    solve(&s)
        .unwrap_or_else(|e| panic!("{mass} M_sun (X = {x}, Z = {z}): {e}"))
        .summary
}

/// Radius window for magnetically active eclipsing M dwarfs: the model 0–7 per cent smaller
/// than measured. Such stars are inflated by activity by about 5–10 per cent against models
/// (Morales et al. 2010, ApJ 718, 502, abstract; docs/references.md §8.5), so a ZAMS model
/// should come out smaller, but not by more than the inflation.
const INFLATED_RADIUS_WINDOW: (f64, f64) = (0.93, 1.0);

/// A 0.1 M_sun star at solar composition has about 0.12 R_sun, 2800–3000 K and 1e-3 L_sun
/// (models of Baraffe et al. 1998, A&A 337, 403, and Chabrier & Baraffe 2000, ARA&A 38, 337,
/// as quoted in the M-dwarf issue; docs/references.md §8.5, memory). Windows: T_eff as quoted,
/// L within 0.1 dex, R within 10 per cent of 0.12 (the quoted "about").
#[test]
fn a_tenth_of_a_solar_mass() {
    let s = model(0.1, 0.70, 0.02);
    let (r, t, l) = (s.radius_rsun, s.teff_k, s.luminosity_lsun);
    assert!((2800.0..3000.0).contains(&t), "T_eff {t}");
    assert!((l.log10() + 3.0).abs() < 0.1, "L {l}");
    assert!((r / 0.12 - 1.0).abs() < 0.10, "R {r}");
    // Fully convective and partly degenerate (Chabrier & Baraffe 2000: psi of order a few).
    assert!(s.convective_core_mass_fraction > 1.0 - 1e-6);
    assert!(s.central_degeneracy > 1.0);
}

/// Proxima Centauri, a quiet single M5.5 dwarf: M = 0.1221 +- 0.0022 M_sun, R = 0.1542 +-
/// 0.0045 R_sun and T_eff = 3042 +- 117 K (Boyajian et al. 2012, ApJ 757, 112, interferometry,
/// as quoted; L = 0.0017 L_sun, Ribas et al. 2017, as quoted; docs/references.md §8.5
/// [SECONDARY]). Solar composition (its [Fe/H] is near solar). Windows: R and T_eff within two
/// and one standard deviations, L within 0.1 dex.
#[test]
fn proxima_centauri() {
    let s = model(0.1221, 0.70, 0.02);
    let (r, t, l) = (s.radius_rsun, s.teff_k, s.luminosity_lsun);
    assert!((r - 0.1542).abs() < 2.0 * 0.0045, "R {r}");
    assert!((t - 3042.0).abs() < 117.0, "T_eff {t}");
    assert!((l / 0.0017).log10().abs() < 0.1, "L {l}");
}

/// CM Draconis A and B (Morales et al. 2009, ApJ 691, 1400; docs/references.md §8.5
/// [CONFIRMED]): M = 0.2310 and 0.2141 M_sun, R = 0.2534 and 0.2396 R_sun, metal-poor
/// ([Fe/H] = -0.30, as quoted): X = 0.72, Z = 0.01. The radius falls in the inflated-star window.
/// (T_eff and L do not meet the windows: see README, "Known limits".)
#[test]
fn cm_draconis_radii() {
    for (mass, radius) in [(0.2310, 0.2534), (0.2141, 0.2396)] {
        let r = model(mass, 0.72, 0.01).radius_rsun / radius;
        let (lo, hi) = INFLATED_RADIUS_WINDOW;
        assert!((lo..=hi).contains(&r), "{mass} M_sun: R / R_obs = {r}");
    }
}

/// The figures the grey-atmosphere caution quotes (`structure::model::grey_atmosphere_caution`),
/// measured again: against CM Dra A and B (as in `cm_draconis_radii`; T_eff 3130 and 3120 K,
/// Morales et al. 2009 as quoted, docs/references.md §8.5 [SECONDARY]; L from R and T_eff with
/// the IAU 2015 nominal T_eff,sun = 5772 K) the models are 0.05 dex too hot (each within 0.005
/// of it) and 0.19 dex too bright (within 0.01); against Proxima Cen (3042 K) and YY Gem (0.5992
/// M_sun, 3820 K, Torres & Ribas 2002 [CONFIRMED], solar composition) within 0.015 dex in T_eff.
/// A change of physics that moves these fails here, and the caution's text must follow.
#[test]
fn the_grey_atmosphere_caution_quotes_measured_misses() {
    use starpoise::structure::model::{
        grey_atmosphere_caution, CM_DRA_LUMINOSITY_EXCESS_DEX, CM_DRA_TEFF_EXCESS_DEX,
        GREY_ATMOSPHERE_MIN_TEFF_K, QUIET_M_DWARF_TEFF_DEX,
    };
    const T_SUN_K: f64 = 5772.0;
    for (mass, radius, teff) in [(0.2310, 0.2534, 3130.0), (0.2141, 0.2396, 3120.0)] {
        let s = model(mass, 0.72, 0.01);
        let dt = (s.teff_k / teff).log10();
        let dl = (s.luminosity_lsun / (radius * radius * (teff / T_SUN_K).powi(4))).log10();
        assert!(
            (dt - CM_DRA_TEFF_EXCESS_DEX).abs() <= 0.005,
            "{mass}: dT {dt}"
        );
        assert!(
            (dl - CM_DRA_LUMINOSITY_EXCESS_DEX).abs() <= 0.01,
            "{mass}: dL {dl}"
        );
        assert!(s.teff_k < GREY_ATMOSPHERE_MIN_TEFF_K);
    }
    for (mass, teff) in [(0.1221, 3042.0), (0.5992, 3820.0)] {
        let dt = (model(mass, 0.70, 0.02).teff_k / teff).log10();
        assert!(dt.abs() < QUIET_M_DWARF_TEFF_DEX, "{mass}: dT {dt}");
    }
    // The caution is given below the threshold only, and quotes the figures for `refined` only.
    assert!(grey_atmosphere_caution("krishna-swamy", 4100.0, true).is_none());
    let w = grey_atmosphere_caution("krishna-swamy", 3500.0, true).unwrap();
    assert!(
        w.contains("0.05 dex too hot") && w.contains("0.19 dex too bright"),
        "{w}"
    );
    let other = grey_atmosphere_caution("eddington", 3500.0, false).unwrap();
    assert!(!other.contains("CM Dra"), "{other}");
}

/// Fully convective below about 0.35 M_sun, a radiative core above (Chabrier & Baraffe 1997,
/// A&A 327, 1039; docs/references.md §8.5 [MEMORY]): fully convective at 0.25 M_sun, a
/// radiative core at 0.45 and 0.5 M_sun (tested away from the boundary, where models are
/// sensitive).
#[test]
fn fully_convective_boundary() {
    let full = model(0.25, 0.70, 0.02);
    assert!(full.convective_core_mass_fraction > 1.0 - 1e-6);
    for mass in [0.45, 0.5] {
        let s = model(mass, 0.70, 0.02);
        let envelope = s.convective_envelope_mass_fraction;
        let core = s.convective_core_mass_fraction;
        assert!(
            envelope < 0.9 && core < 0.05,
            "{mass} M_sun: {core} {envelope}"
        );
    }
}

/// Every mass from just above the hydrogen-burning limit to 0.1 M_sun converges from the built-in
/// guess at solar and twice solar metallicity, and from 0.095 M_sun at Z = 0.001, whose limit is
/// higher (about 0.083 M_sun for [M/H] = -1.5 in Chabrier & Baraffe 1997, memory; these laws put
/// it at 0.092 for X = 0.75); and the lowest masses are degenerate (psi_c > 4 at 0.08 M_sun: a
/// star near the hydrogen-burning limit has psi of about 5–8, Chabrier & Baraffe 2000 as quoted
/// in the issue; docs/references.md §8.5 [MEMORY]).
#[test]
fn lowest_masses_converge_from_the_built_in_guess() {
    for (x, z, lowest) in [
        (0.70, 0.02, 0.08),
        (0.66, 0.04, 0.075),
        (0.75, 0.001, 0.095),
    ] {
        for mass in [0.075, 0.08, 0.085, 0.09, 0.095, 0.1] {
            if mass < lowest {
                continue;
            }
            let s = model(mass, x, z);
            assert!(s.luminosity_residual < 1e-6, "{mass} {x} {z}");
        }
    }
    let s = model(0.08, 0.70, 0.02);
    assert!(
        s.central_degeneracy > 4.0,
        "psi_c {:?}",
        s.central_degeneracy
    );
}
