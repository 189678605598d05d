//! Compare ZAMS models with the analytic fits of Tout, Pols, Eggleton & Han (1996, MNRAS 281,
//! 257) at Z = 0.02, X = 0.70: prints log10 of the ratios of L and R. Optional arguments:
//! an opacity law name and an alpha, e.g.
//! `cargo run --release --example tout_comparison -- refined:guillotine=2,exponent=0.4 1.8`.

use starpoise::physics::{Composition, PhysicsOverrides, PhysicsSet};
use starpoise::reference::{tout1996_luminosity_lsun, tout1996_radius_rsun};
use starpoise::structure::{solve, ZamsSettings};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let mut args = std::env::args().skip(1);
    let opacity = args.next();
    let alpha = args.next().map(|a| a.parse::<f64>()).transpose()?;
    let physics = PhysicsSet::from_spec(
        &PhysicsOverrides {
            opacity: opacity.map(|o| o.parse()).transpose()?,
            alpha,
            ..Default::default()
        }
        .resolve()?,
    )?;
    let comp = Composition::new(0.70, 0.02)?;
    println!(
        "{:>8} {:>11} {:>9} {:>9} {:>9}",
        "M/Msun", "L/Lsun", "R/Rsun", "dlogL", "dlogR"
    );
    let (mut worst_l, mut worst_r) = (0.0f64, 0.0f64);
    for m in [
        0.08, 0.1, 0.2, 0.3, 0.5, 0.7, 1.0, 1.5, 2.0, 3.0, 5.0, 10.0, 20.0, 50.0, 100.0,
    ] {
        match solve(&ZamsSettings::new(m, comp, physics.clone())?) {
            Ok(model) => {
                let l = model.summary.luminosity_lsun;
                let r = model.summary.radius_rsun;
                let dl = (l / tout1996_luminosity_lsun(m)).log10();
                let dr = (r / tout1996_radius_rsun(m)).log10();
                if (0.5..=50.0).contains(&m) {
                    worst_l = worst_l.max(dl.abs());
                    worst_r = worst_r.max(dr.abs());
                }
                println!("{m:>8} {l:>11.4e} {r:>9.4} {dl:>+9.3} {dr:>+9.3}");
            }
            Err(e) => println!("{m:>8} {e}"),
        }
    }
    println!("worst over 0.5-50 M_sun: {worst_l:.3} dex in L, {worst_r:.3} dex in R");
    Ok(())
}
