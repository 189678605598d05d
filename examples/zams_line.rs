//! Print a small ZAMS table (mass, L, R, T_eff, T_c, rho_c) with the chosen physics preset,
//! using the library API. Run: `cargo run --release --example zams_line -- analytic`.

use starpoise::physics::{Composition, PhysicsSet, Preset};
use starpoise::structure::{solve, ZamsSettings};
use starpoise::Error;

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let preset = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "refined".to_string());
    let preset: Preset = preset.parse()?;
    let physics = PhysicsSet::from_spec(&preset.spec())?;
    let comp = Composition::new(0.70, 0.02)?;
    println!(
        "{:>8} {:>12} {:>10} {:>9} {:>12} {:>10} {:>5}",
        "M/Msun", "L/Lsun", "R/Rsun", "Teff/K", "Tc/K", "rho_c", "iter"
    );
    for m in [
        0.1, 0.2, 0.3, 0.5, 0.7, 1.0, 1.5, 2.0, 3.0, 5.0, 10.0, 20.0, 40.0, 70.0, 100.0,
    ] {
        let settings = ZamsSettings::new(m, comp, physics.clone())?;
        match solve(&settings) {
            Ok(model) => {
                let s = &model.summary;
                println!(
                    "{m:>8} {:>12.5e} {:>10.5} {:>9.1} {:>12.5e} {:>10.4} {:>5}",
                    s.luminosity_lsun,
                    s.radius_rsun,
                    s.teff_k,
                    s.central_temperature_k,
                    s.central_density_g_cm3,
                    model.stats.iterations
                );
            }
            Err(Error::NoConvergence(failure)) => println!("{m:>8} {failure}"),
            Err(e) => return Err(e.into()),
        }
    }
    Ok(())
}
