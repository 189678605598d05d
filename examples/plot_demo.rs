//! Draw the two kinds of figure into a directory.
//!
//! `cargo run --example plot_demo -- DIR` draws `DIR/demo-hr.svg` and `DIR/demo-profile.svg`
//! from invented demo data (power laws for the HR diagram, an n = 1 polytrope shape with a
//! made-up radiative gradient for the profile) — pictures of the layout, not of stars.
//!
//! `cargo run --release --example plot_demo -- DIR --solved` also solves ZAMS models with the
//! library (default physics set, X = 0.70 with Z = 0.02 and Z = 0.004) and draws
//! `DIR/zams-hr.png` and the profiles of 1 and 5 M_sun against each abscissa,
//! `DIR/zams-profile-M-ABSCISSA.png` (PNG, the format following the extension).

use starpoise::output::plot::{hr_diagram, profile_plot, Abscissa, HrPoint, HrSeries};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::ProfileRow;
use starpoise::structure::{solve, ZamsSettings};
use std::f64::consts::PI;
use std::path::Path;

/// Invented sequence: L = M^a, R = M^b (solar units), T_eff = 5772 K (L / R^2)^(1/4).
fn power_law_series(label: &str, a: f64, b: f64) -> HrSeries {
    let points = [
        0.3, 0.5, 0.7, 1.0, 1.5, 2.0, 3.0, 5.0, 7.0, 10.0, 15.0, 20.0, 40.0,
    ]
    .iter()
    .map(|&m: &f64| {
        let l = m.powf(a);
        let r = m.powf(b);
        HrPoint {
            mass_msun: m,
            teff_k: 5772.0 * (l / (r * r)).powf(0.25),
            luminosity_lsun: l,
        }
    })
    .collect();
    HrSeries {
        label: label.to_string(),
        points,
    }
}

/// Invented profile on the n = 1 polytrope theta = sin(xi)/xi (rho/rho_c = theta,
/// P/P_c = theta^2, T/T_c = theta, m/M = (sin xi - xi cos xi)/pi), with L from
/// eps proportional to rho T^4 and a made-up nabla_rad giving a convective core and envelope.
fn polytrope_profile(n: usize) -> Vec<ProfileRow> {
    let mut rows = Vec::with_capacity(n);
    let mut l = 0.0;
    let mut last: Option<(f64, f64)> = None;
    for i in 0..n {
        let x = i as f64 / (n - 1) as f64;
        let xi = PI * x;
        let theta = if xi == 0.0 { 1.0 } else { xi.sin() / xi };
        let theta = theta.max(0.0);
        let m = (xi.sin() - xi * xi.cos()) / PI;
        let eps = theta * theta.powi(4);
        if let Some((m0, e0)) = last {
            l += 0.5 * (eps + e0) * (m - m0);
        }
        last = Some((m, eps));
        let nabla_rad = 0.55 * (-(x / 0.15).powi(2)).exp() + 0.15 + 0.05 / (1.02 - x);
        let nabla_ad = 0.4;
        rows.push(ProfileRow {
            mass_g: m * 1.989e33,
            m_over_m: m,
            radius_cm: x * 6.957e10,
            r_over_r: x,
            pressure_dyn_cm2: 1e17 * theta * theta,
            temperature_k: 1.5e7 * theta,
            density_g_cm3: 100.0 * theta,
            luminosity_erg_s: l,
            eps_pp_erg_g_s: eps,
            eps_cno_erg_g_s: 0.0,
            opacity_cm2_g: 1.0,
            nabla_rad,
            nabla_ad,
            nabla: nabla_rad.min(nabla_ad),
            convective: u8::from(nabla_rad > nabla_ad),
            mu: 0.6,
            gamma1: 5.0 / 3.0,
            brunt_n2_rad2_s2: 0.0,
            lamb_l1_rad_s: 0.0,
            lamb_l2_rad_s: 0.0,
            ..ProfileRow::default()
        });
    }
    rows
}

fn solved(dir: &Path) -> Result<(), Box<dyn std::error::Error>> {
    let physics = PhysicsSet::refined();
    let masses = [
        0.3, 0.5, 0.7, 1.0, 1.5, 2.0, 3.0, 5.0, 7.0, 10.0, 15.0, 20.0, 30.0, 50.0,
    ];
    let mut series = Vec::new();
    for z in [0.02, 0.004] {
        let comp = Composition::new(0.70, z)?;
        let label = format!("X = 0.70, Z = {z}");
        let mut points = Vec::new();
        for &m in &masses {
            let settings = ZamsSettings::new(m, comp, physics.clone())?;
            let model = match solve(&settings) {
                Ok(model) => model,
                Err(e) => {
                    eprintln!("{label}: {e}");
                    continue;
                }
            };
            let s = &model.summary;
            points.push(HrPoint {
                mass_msun: m,
                teff_k: s.teff_k,
                luminosity_lsun: s.luminosity_lsun,
            });
            if z == 0.02 && (m == 1.0 || m == 5.0) {
                let rows = model.profile(400)?;
                for abscissa in Abscissa::ALL {
                    let file = dir.join(format!("zams-profile-{m}-{abscissa}.png"));
                    let title = format!("ZAMS {m} M_sun, {label}");
                    profile_plot(&file, &rows, &title, abscissa)?;
                    println!("{}", file.display());
                }
            }
        }
        series.push(HrSeries { label, points });
    }
    let file = dir.join("zams-hr.png");
    hr_diagram(&file, &series, "ZAMS, refined physics")?;
    println!("{}", file.display());
    Ok(())
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let mut args = std::env::args().skip(1);
    let Some(dir) = args.next() else {
        eprintln!("usage: plot_demo DIR [--solved]");
        std::process::exit(2);
    };
    let dir = Path::new(&dir);
    std::fs::create_dir_all(dir)?;
    let series = [
        power_law_series("demo: L = M^3.5, R = M^0.8", 3.5, 0.8),
        power_law_series("demo: L = M^3.0, R = M^0.6", 3.0, 0.6),
    ];
    let file = dir.join("demo-hr.svg");
    hr_diagram(&file, &series, "Demo HR diagram (invented data)")?;
    println!("{}", file.display());
    let file = dir.join("demo-profile.svg");
    profile_plot(
        &file,
        &polytrope_profile(301),
        "Demo profile (n = 1 polytrope shape)",
        Abscissa::Radius,
    )?;
    println!("{}", file.display());
    if args.next().as_deref() == Some("--solved") {
        solved(dir)?;
    }
    Ok(())
}
