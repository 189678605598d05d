//! Models say when they leave what their laws describe well (each law's caution) or the mass
//! range their set has been compared with measured stars on.

mod common;

use common::{json, scratch_dir, starpoise, stderr};
use starpoise::physics::eos::plasma::STRONG_COUPLING_GAMMA_E;
use starpoise::physics::{Composition, EquationOfState, PhysicsOverrides, PhysicsSet};
use starpoise::structure::{solve, ZamsSettings};

fn model(mass: f64, overrides: &str) -> Vec<String> {
    solved(mass, overrides).warnings
}

/// The Sun's model raises nothing; a 40 M_sun refined model is outside the compared range; the
/// analytic set's fully ionised gas meets its photosphere below 1e4 K (hydrogen recombines
/// there: fact of the trade); a clamped table used outside its range says so.
#[test]
fn warnings_name_the_law_and_where() {
    assert!(model(1.0, "").is_empty(), "{:?}", model(1.0, ""));
    let heavy = model(40.0, "");
    assert!(
        heavy.iter().any(|w| w.contains("outside 0.1-30 M_sun")),
        "{heavy:?}"
    );
    let analytic = model(1.0, "preset:analytic");
    assert!(
        analytic
            .iter()
            .any(|w| w.starts_with("eos ideal") && w.contains("full ionisation")),
        "{analytic:?}"
    );
    let table = concat!(env!("CARGO_MANIFEST_DIR"), "/models/demo-opacity.csv");
    let clamped = model(1.0, &format!("opacity:table-clamped:{table}"));
    assert!(
        clamped
            .iter()
            .any(|w| w.contains("outside the opacity table")),
        "{clamped:?}"
    );
}

/// The electron coupling Gamma_e = 2.2747e5 (rho Y_e)^(1/3) / T (docs/references.md §8.2,
/// computed): 0.067 at the solar centre (no caution), about 2.2 at rho = 1000 g/cm^3 and 1e6 K
/// (strongly coupled: `refined` neglects the Coulomb terms there; `molecular` has them, and its
/// electrons are degenerate and dense there, r_s = 0.19, so no caution). `molecular` cautions
/// where the free electrons are strongly coupled but not degenerate or dense (r_s > 1), in
/// partly ionised hydrogen at 0.2 g/cm^3
/// and 3e4 K (the ionisation zone of a 0.1 M_sun star), and not in the neutral photosphere of
/// such a star (1e-5 g/cm^3, 3000 K), where the fully ionised Gamma_e would be 4.5 but few
/// electrons are free.
#[test]
fn strong_coupling_is_flagged() {
    use starpoise::physics::eos::{MolecularEos, RefinedEos};
    let sun = Composition::new(0.34, 0.02).unwrap();
    assert!(RefinedEos.caution(150.0, 1.57e7, &sun).is_none());
    let c = Composition::new(0.70, 0.02).unwrap();
    let gamma = 2.2747e5 * (1000.0 * (1.0 + 0.70) / 2.0f64).cbrt() / 1e6;
    assert!(gamma > STRONG_COUPLING_GAMMA_E && (gamma - 2.15).abs() < 0.05);
    assert!(RefinedEos
        .caution(1000.0, 1e6, &c)
        .is_some_and(|w| w.contains("neglected")));
    assert!(MolecularEos.caution(1000.0, 1e6, &c).is_none());
    assert!(MolecularEos
        .caution(0.2, 3e4, &c)
        .is_some_and(|w| w.contains("screen the ions")));
    assert!(MolecularEos.caution(1e-5, 3000.0, &c).is_none());
    let low = model(0.1, "");
    assert!(
        low.iter().any(|w| w.contains("strongly coupled")),
        "{low:?}"
    );
}

/// A grid carries each converged model's warnings in its `warnings` column (and its text table
/// points to them), and they read back from the CSV unchanged (as `merge` reads shards): the
/// 0.1 M_sun row has the strong-coupling warning of `strong_coupling_is_flagged`, the
/// grey-atmosphere caution (T_eff below 4000 K, `tests/lowmass_stars.rs`) and the 3He caution
/// of `he3_equilibrium_caution_for_low_masses`, the Sun's row none.
#[test]
fn sequence_rows_carry_the_warnings() {
    let dir = scratch_dir("warnings");
    let csv = dir.join("grid.csv");
    let out = starpoise(&[
        "sequence",
        "--masses",
        "0.1,1",
        "--out",
        csv.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("converged (3 warnings, below)"), "{text}");
    assert!(text.contains("strongly coupled"), "{text}");
    let table = starpoise::output::sequence::read_table(&csv).unwrap();
    assert!(table.rows[0]
        .warnings
        .iter()
        .any(|w| w.contains("strongly coupled")));
    assert!(table.rows[1].warnings.is_empty());
    assert_eq!(table.rows[0].warnings, model(0.1, ""));
    let out = starpoise(&[
        "compare",
        "--mass",
        "0.1",
        "--variant",
        "base=",
        "--variant",
        "hot=opacity-factor:2",
        "--format",
        "json",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v = json(&out);
    let record = &v["records"][0];
    assert!(
        record["warnings"]
            .as_str()
            .is_some_and(|w| w.contains("strongly coupled")),
        "{record}"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

fn solved(mass: f64, overrides: &str) -> starpoise::structure::ZamsModel {
    let mut o = PhysicsOverrides::default();
    for item in overrides.split(';').filter(|s| !s.is_empty()) {
        let (k, v) = item.split_once(':').unwrap();
        o.set(k, v).unwrap();
    }
    let physics = PhysicsSet::from_spec(&o.resolve().unwrap()).unwrap();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    solve(&s).unwrap()
}

/// The 3He caution (docs/references.md §4.1). The central 3He equilibrium time of the summary
/// falls with mass (hotter centres: fact of the trade, the rates' steep temperature
/// dependence), from tens of Gyr at 0.1 M_sun to under a Myr for the Sun's model (README; at
/// today's solar centre about 1e5 yr, §4.1, memory); at X = 0.70, Z = 0.02 it passes 1 Gyr at
/// 0.208 M_sun (between 0.2075 and 0.2085). A fully convective model is judged on the time of
/// its 3He mixed through the star, 20-30 times longer (`mixed_he3_time_agrees_with_the_model_profile`):
/// every fully convective model carries the caution, with both times in Gyr to the printed
/// two decimals (0.1, 0.2, 0.22, 0.3 M_sun; the refined set is fully convective up to 0.4019
/// M_sun at this composition, README), and 0.5 and 1 M_sun (radiative cores, central times
/// of 0.06 Gyr and less) do not. Rates laws without 3He reactions give none (null) and no
/// caution.
#[test]
fn he3_equilibrium_caution_for_low_masses() {
    let masses = [0.1, 0.2, 0.22, 0.3, 0.5, 1.0];
    let models: Vec<_> = masses.iter().map(|&m| solved(m, "")).collect();
    let times: Vec<f64> = models
        .iter()
        .map(|m| m.summary.he3_equilibrium_time_yr)
        .collect();
    assert!(times.windows(2).all(|w| w[0] > w[1]), "{times:?}");
    // "Tens of Gyr at 0.1 M_sun" (README): between 1e10 and 1e11 yr.
    assert!(times[0] > 1e10 && times[0] < 1e11, "{times:?}");
    assert!(times[5] < 1e6, "{times:?}");
    let edge = |m: f64| solved(m, "").summary.he3_equilibrium_time_yr;
    assert!(edge(0.2075) > 1e9 && edge(0.2085) < 1e9);
    let caution = |m: &starpoise::structure::ZamsModel| {
        m.warnings
            .iter()
            .find(|w| w.contains("3He is taken in equilibrium"))
            .cloned()
    };
    assert!(times[1] > 1e9 && times[2] < 1e9, "{times:?}");
    let comp = Composition::new(0.70, 0.02).unwrap();
    for (m, &central) in models[..4].iter().zip(&times) {
        let w = caution(m).expect("a fully convective model carries the 3He caution");
        let mixed = starpoise::structure::he3::mixed_relaxation_time_s(
            PhysicsSet::refined().rates(),
            &comp,
            m.summary.central_density_g_cm3,
            m.summary.central_temperature_k,
        )
        .unwrap()
            / starpoise::constants::YEAR_S;
        assert!(mixed > 1e9, "{mixed}");
        assert!(
            w.starts_with("rates sfactor: ")
                && w.contains(&format!(
                    "in {:.2} Gyr (e-folding time; {:.2} Gyr at the centre alone)",
                    mixed / 1e9,
                    central / 1e9
                ))
                && w.contains("L is 0.061 dex lower and R 6.4% smaller at 0.23 M_sun"),
            "{w}"
        );
    }
    for m in &models[4..] {
        assert!(caution(m).is_none(), "{:?}", m.warnings);
    }
    // At the edge of full convection the caution goes with it.
    assert!(caution(&solved(0.4019, "")).is_some());
    assert!(caution(&solved(0.4020, "")).is_none());
    // The rates factor scales the energy, not the 3He reactions: the caution stays.
    assert!(caution(&solved(0.1, "rates-factor:0.509")).is_some());
    for law in ["analytic", "power-law"] {
        let m = solved(0.2, &format!("rates:{law}"));
        assert!(m.summary.he3_equilibrium_time_yr.is_nan(), "{law}");
        assert!(caution(&m).is_none(), "{law}: {:?}", m.warnings);
    }
}

/// The sizes the caution quotes, measured again: at 0.23 M_sun, X = 0.70, Z = 0.02 (`refined`),
/// the pp chain stopped at 3He (`sfactor` times 0.509) against the default gives log L lower by
/// 0.061 dex and R smaller by 6.4 per cent (to the quoted digit: half a unit of the last).
/// The factor is the energy per pp reaction up to 3He over that of the whole ppI chain
/// (docs/references.md §4.1, computed): ((3 m(1H) - m(3He)) c^2 - <E_nu,pp>) / (Q_ppI / 2),
/// with atomic masses 1.00782503 and 3.01602932 u, m_u c^2 = 931.49410242 MeV (CODATA 2018),
/// <E_nu,pp> = 0.265 MeV (memory) and Q_ppI = 26.20 MeV (§4): 0.509 to its three digits.
#[test]
fn the_quoted_size_of_unburnt_3he() {
    use starpoise::physics::nuclear::sfactor::Q_PP1_MEV;
    use starpoise::structure::model::{HE3_UNBURNT_LUMINOSITY_DEX, HE3_UNBURNT_RADIUS_PERCENT};
    let to_he3 = (3.0 * 1.007_825_03 - 3.016_029_32) * 931.494_102_42 - 0.265;
    let factor = to_he3 / (Q_PP1_MEV / 2.0);
    assert!((factor - 0.509).abs() < 5e-4, "{factor}");
    let full = solved(0.23, "").summary;
    let stopped = solved(0.23, "rates-factor:0.509").summary;
    let dex = (full.luminosity_lsun / stopped.luminosity_lsun).log10();
    let percent = 100.0 * (1.0 - stopped.radius_rsun / full.radius_rsun);
    assert!((dex - HE3_UNBURNT_LUMINOSITY_DEX).abs() < 5e-4, "{dex}");
    assert!(
        (percent - HE3_UNBURNT_RADIUS_PERCENT).abs() < 0.05,
        "{percent}"
    );
}

/// The mixed-star 3He relaxation time of a fully convective model
/// (`structure::he3::mixed_relaxation_time_s`) takes its averages over an n = 1.5 polytrope
/// with the model's central density and temperature. The same averages over the model's own
/// 2 000-row profile (trapezoid rule in mass, the law's rates at each row) give a time within
/// 5 per cent of it at 0.15, 0.25 and 0.35 M_sun (measured: 1.4, 0.9 and 0.7 per cent; the
/// approximation's error, nothing fitted). The derivation (module documentation of `structure::he3`) reduces to the
/// local time at one point, which `he3_equilibrium` tests; the mixed time is 20-30 times the
/// central one here, as the mass averages of the steep rates over the polytrope imply.
#[test]
fn mixed_he3_time_agrees_with_the_model_profile() {
    use starpoise::structure::he3::mixed_relaxation_time_s;
    let comp = Composition::new(0.70, 0.02).unwrap();
    for mass in [0.15, 0.25, 0.35] {
        let model = solved(mass, "");
        assert!(model.summary.convective_core_mass_fraction > 1.0 - 1e-9);
        let rates = PhysicsSet::refined();
        let rates = rates.rates();
        let estimate = mixed_relaxation_time_s(
            rates,
            &comp,
            model.summary.central_density_g_cm3,
            model.summary.central_temperature_k,
        )
        .unwrap();
        let rows = model.profile(2000).unwrap();
        // The averages of `structure::he3` in y = X_3 / m_3 (3He nuclei per gram).
        let (mut p, mut a, mut b) = (0.0, 0.0, 0.0);
        for w in rows.windows(2) {
            let dm = w[1].mass_g - w[0].mass_g;
            for r in w {
                if let Ok(Some(e)) = rates.he3_equilibrium(r.density_g_cm3, r.temperature_k, &comp)
                {
                    p += 0.5 * dm * e.production_cm3_s / r.density_g_cm3;
                    a += 0.5 * dm * e.he3_he3_cm3_s * r.density_g_cm3;
                    b += 0.5 * dm * e.he3_he4_per_s;
                }
            }
        }
        let total = rows.last().unwrap().mass_g;
        let (p, a, b) = (p / total, a / total, b / total);
        let y = 2.0 * p / (b + (b * b + 4.0 * a * p).sqrt());
        let exact = 1.0 / (2.0 * a * y + b);
        let central = model.summary.he3_equilibrium_time_yr * starpoise::constants::YEAR_S;
        println!("{mass}: estimate {estimate:e} s, profile {exact:e} s, central {central:e} s");
        assert!(
            (estimate / exact - 1.0).abs() < 0.05,
            "{mass}: {estimate:e} vs {exact:e}"
        );
        assert!((15.0..40.0).contains(&(estimate / central)), "{mass}");
    }
}
