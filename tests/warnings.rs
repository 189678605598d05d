//! Models say when they leave what their laws describe well (each law's caution) or the mass
//! range their set has been compared with measured stars on.

mod common;

use common::{json, scratch_dir, starpoise, stderr};
use starpoise::physics::eos::plasma::STRONG_COUPLING_GAMMA_E;
use starpoise::physics::{Composition, EquationOfState, PhysicsOverrides, PhysicsSet};
use starpoise::structure::{solve, ZamsSettings};

fn model(mass: f64, overrides: &str) -> Vec<String> {
    let mut o = PhysicsOverrides::default();
    for item in overrides.split(';').filter(|s| !s.is_empty()) {
        let (k, v) = item.split_once(':').unwrap();
        o.set(k, v).unwrap();
    }
    let physics = PhysicsSet::from_spec(&o.resolve().unwrap()).unwrap();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    solve(&s).unwrap().warnings
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
/// 0.1 M_sun row has the strong-coupling warning of `strong_coupling_is_flagged`, the Sun's
/// row none.
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
    assert!(text.contains("converged (1 warning, below)"), "{text}");
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
