//! Regenerate the built-in table of starting guesses (`structure::guess::REFERENCE_MODELS`):
//! refined ZAMS models at X = 0.70, Z = 0.02, solved by continuation along the mass axis, printed
//! as Rust source. Run: `cargo run --release --example guess_table`.

use starpoise::physics::{Composition, PhysicsOptions};
use starpoise::structure::{guess, solve, ZamsSettings};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let physics = PhysicsOptions::default().build()?;
    let comp = Composition::new(0.70, 0.02)?;
    let masses = [
        0.075, 0.08, 0.085, 0.09, 0.1, 0.12, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.5, 0.7, 1.0, 1.2,
        1.35, 1.5, 1.7, 2.0, 3.0, 5.0, 7.0, 10.0, 15.0, 20.0, 30.0, 50.0, 70.0, 100.0, 150.0,
    ];
    // Continue downward and upward from 1 M_sun, each model starting from its neighbour.
    let start = masses
        .iter()
        .position(|&m| m == 1.0)
        .ok_or("1 M_sun missing")?;
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
    println!(
        "pub const REFERENCE_MODELS: [(f64, GuessRow); {}] = [",
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
