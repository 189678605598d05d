//! Print xi_1, omega_n and rho_c/rho_mean of the Lane–Emden polytropes n = 0, 0.5, ..., 5
//! through the library API.
//!
//! Run with `cargo run --release --example polytrope_table`.

use starpoise::polytrope::{solve_lane_emden, LaneEmdenSettings};

fn main() -> starpoise::Result<()> {
    // Two profile points are enough: only the constants are printed.
    let settings = LaneEmdenSettings::default().with_points(2)?;
    println!(
        "{:>4}  {:>18}  {:>18}  {:>20}",
        "n", "xi_1", "omega_n", "rho_c/rho_mean"
    );
    for step in 0..=10 {
        let n = 0.5 * f64::from(step);
        let s = solve_lane_emden(n, &settings)?;
        let show = |v: Option<f64>| v.map_or("infinite".to_string(), |x| format!("{x:.12}"));
        println!(
            "{n:>4.1}  {:>18}  {:>18.12}  {:>20}",
            show(s.xi1),
            s.omega_n,
            show(s.rho_c_over_rho_mean)
        );
    }
    Ok(())
}
