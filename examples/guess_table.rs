//! Regenerate a built-in table of starting guesses (`structure::guess::REFINED_MODELS` or
//! `ANALYTIC_MODELS`): ZAMS models of a preset at X = 0.70, Z = 0.02, solved by continuation
//! along the mass axis, printed as Rust source.
//! Run: `cargo run --release --example guess_table -- refined` (or `analytic`); with a second
//! argument Z the refined table at that metallicity (`-- refined 0.002`: `REFINED_MODELS_LOW_Z`;
//! `-- refined 0.04`: `REFINED_MODELS_HIGH_Z`), and with a third X (`-- refined 0.02 0.65`:
//! `REFINED_MODELS_LOW_X`; `0.75`: `REFINED_MODELS_HIGH_X`; both away from 0.02 and 0.70 for
//! the corner tables, e.g. `-- refined 0.002 0.75`: `REFINED_MODELS_HIGH_X_LOW_Z`), leaving out
//! the masses below the hydrogen-burning limit there.

use starpoise::physics::{Composition, PhysicsSet, Preset};
use starpoise::structure::{guess, solve, ZamsSettings};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let preset: Preset = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "refined".into())
        .parse()?;
    let physics = PhysicsSet::from_spec(&preset.spec())?;
    let z: f64 = std::env::args().nth(2).map_or(Ok(0.02), |a| a.parse())?;
    let x: f64 = std::env::args().nth(3).map_or(Ok(0.70), |a| a.parse())?;
    let comp = Composition::new(x, z)?;
    let limit = starpoise::structure::limits::tabulated_refined_limit_msun(x, z).unwrap_or(0.0);
    let all = [
        0.075, 0.08, 0.085, 0.09, 0.1, 0.12, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5, 0.6, 0.7,
        0.8, 0.9, 1.0, 1.1, 1.2, 1.35, 1.5, 1.7, 2.0, 2.5, 3.0, 4.0, 5.0, 7.0, 10.0, 15.0, 20.0,
        30.0, 50.0, 70.0, 100.0, 150.0,
    ];
    let lowest = preset.minimum_mass_msun().unwrap_or(0.0);
    let masses: Vec<f64> = all
        .into_iter()
        .filter(|&m| m >= lowest && m >= 1.01 * limit)
        .collect();
    // Continue downward and upward from the first mass that converges from the built-in guess
    // (tried from 2 M_sun outward), each model starting from its neighbour.
    let order: Vec<usize> = {
        let mut o: Vec<usize> = (0..masses.len()).collect();
        o.sort_by(|&a, &b| {
            (masses[a] / 2.0)
                .ln()
                .abs()
                .total_cmp(&(masses[b] / 2.0).ln().abs())
        });
        o
    };
    let start = order
        .into_iter()
        .find(|&i| {
            ZamsSettings::new(masses[i], comp, physics.clone()).is_ok_and(|s| solve(&s).is_ok())
        })
        .ok_or("no mass converges from the built-in guess")?;
    let mut rows = vec![None; masses.len()];
    for order in [
        (start..masses.len()).collect::<Vec<_>>(),
        (0..start).rev().collect(),
    ] {
        let mut previous: Option<(f64, guess::GuessRow)> = None;
        if order.first() != Some(&start) {
            previous = rows[start].map(|r| (masses[start], r));
        }
        for i in order {
            let m = masses[i];
            let mut s = ZamsSettings::new(m, comp, physics.clone())?;
            if let Some((pm, p)) = previous {
                s = s.with_unknowns_guess(guess::shifted(&p, pm, m, &comp));
            }
            eprintln!("solving {m} M_sun");
            let model = solve(&s)?;
            let row = guess::as_row(&model.unknowns);
            rows[i] = Some(row);
            previous = Some((m, row));
        }
    }
    let x_part = if x < 0.70 {
        "_LOW_X"
    } else if x > 0.70 {
        "_HIGH_X"
    } else {
        ""
    };
    let z_part = if z == 0.02 {
        ""
    } else if z < 0.02 {
        "_LOW_Z"
    } else {
        "_HIGH_Z"
    };
    let suffix = format!("{x_part}{z_part}");
    println!(
        "pub const {}_MODELS{suffix}: [(f64, GuessRow); {}] = [",
        preset.to_string().to_uppercase(),
        masses.len()
    );
    for (m, r) in masses.iter().zip(rows) {
        let r = r.ok_or("missing row")?;
        println!(
            "    ({m:?}, [{:.6}, {:.6}, {:.6}, {:.6}]),",
            r[0], r[1], r[2], r[3]
        );
    }
    println!("];");
    Ok(())
}
