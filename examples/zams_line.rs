//! Print a small ZAMS table (mass, L, R, T_eff, T_c, rho_c) with the chosen physics preset,
//! using the library API. Run: `cargo run --release --example zams_line -- analytic`.

use starpoise::physics::{Composition, PhysicsOptions};
use starpoise::structure::{solve_detailed, ZamsOutcome, ZamsSettings};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let preset = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "refined".to_string());
    let physics = PhysicsOptions {
        physics: Some(preset),
        ..Default::default()
    }
    .build()?;
    let comp = Composition::new(0.70, 0.02)?;
    println!(
        "{:>8} {:>12} {:>10} {:>9} {:>12} {:>10} {:>5}",
        "M/Msun", "L/Lsun", "R/Rsun", "Teff/K", "Tc/K", "rho_c", "iter"
    );
    for m in [
        0.1, 0.2, 0.3, 0.5, 0.7, 1.0, 1.5, 2.0, 3.0, 5.0, 10.0, 20.0, 40.0, 70.0, 100.0,
    ] {
        let settings = ZamsSettings::new(m, comp, physics.clone())?;
        match solve_detailed(&settings)? {
            ZamsOutcome::Converged(model) => {
                let s = &model.summary;
                println!(
                    "{m:>8} {:>12.5e} {:>10.5} {:>9.1} {:>12.5e} {:>10.4} {:>5}",
                    s.luminosity_lsun.unwrap_or(f64::NAN),
                    s.radius_rsun.unwrap_or(f64::NAN),
                    s.teff_k.unwrap_or(f64::NAN),
                    s.central_temperature_k.unwrap_or(f64::NAN),
                    s.central_density_g_cm3.unwrap_or(f64::NAN),
                    s.iterations
                );
            }
            ZamsOutcome::NotConverged { report, .. } => {
                println!(
                    "{m:>8} did not converge: {:?} after {} iterations",
                    report.failure, report.iterations
                );
            }
        }
    }
    Ok(())
}
