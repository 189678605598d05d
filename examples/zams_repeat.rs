//! Solve one model N times through the library, doing what `starpoise.zams(MASS)` does
//! in Python apart from Python itself: parse the preset, build the laws, check the settings,
//! solve, write the JSON summary. The Rust side of the Python module's overhead measurement
//! (python/bench/overhead.sh counts the instructions of both under callgrind).
//!
//! Run: `cargo run --release --example zams_repeat -- 1.0 4 refined` (mass in M_sun, count,
//! preset).

use starpoise::output::zams::summary_json;
use starpoise::physics::{Composition, PhysicsOverrides, PhysicsSet, Preset};
use starpoise::structure::{solve, ZamsSettings};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let mut args = std::env::args().skip(1);
    let mass: f64 = args.next().unwrap_or_else(|| "1.0".into()).parse()?;
    let count: usize = args.next().unwrap_or_else(|| "1".into()).parse()?;
    let preset = args.next().unwrap_or_else(|| "refined".into());
    let mut keys = 0;
    for _ in 0..count {
        let overrides = PhysicsOverrides {
            preset: Some(preset.parse::<Preset>()?),
            ..PhysicsOverrides::default()
        };
        let physics = PhysicsSet::from_spec(&overrides.resolve()?)?;
        let settings = ZamsSettings::new(mass, Composition::new(0.70, 0.02)?, physics)?;
        let model = solve(&settings)?;
        keys += summary_json(&model).as_object().map_or(0, |m| m.len());
    }
    println!("{count} models of {mass} M_sun ({keys} summary keys written)");
    Ok(())
}
