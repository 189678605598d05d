//! Regenerate the built-in table of hydrogen-burning minimum masses of the `refined` preset
//! (`structure::limits::REFINED_LIMITS`): `starpoise limits` at each (X, Z) of the grid,
//! printed as Rust source. Run: `cargo run --release --example limit_table`.

use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::limits::{hydrogen_burning_limit, LIMIT_TABLE_X, LIMIT_TABLE_Z};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let physics = PhysicsSet::refined();
    println!(
        "pub const REFINED_LIMITS: [[f64; {}]; {}] = [",
        LIMIT_TABLE_Z.len(),
        LIMIT_TABLE_X.len()
    );
    for x in LIMIT_TABLE_X {
        let mut row = Vec::new();
        for z in LIMIT_TABLE_Z {
            // A composition whose limit cannot be found (the laws fail on the way) is NaN: the
            // table then says nothing there.
            match hydrogen_burning_limit(&Composition::new(x, z)?, &physics) {
                Ok(limit) => {
                    eprintln!("X = {x}, Z = {z}: {:.6}", limit.mass_msun);
                    row.push(format!("{:.6}", limit.mass_msun));
                }
                Err(e) => {
                    eprintln!("X = {x}, Z = {z}: {e}");
                    row.push("f64::NAN".to_string());
                }
            }
        }
        println!("    [{}],", row.join(", "));
    }
    println!("];");
    Ok(())
}
