//! The profile columns satisfy the equations they come from, checked by finite differences
//! between rows: hydrostatic equilibrium dP/dr = -G m rho / r^2, mass continuity
//! dm/dr = 4 pi r^2 rho, dln T / dln P = nabla, dL/dm = eps (Kippenhahn & Weigert 1990,
//! eqs. 10.1–10.4); the Brunt–Väisälä frequency N^2 = g (dln P/dr / Gamma_1 - dln rho/dr) and
//! the Lamb frequency S_l = sqrt(l(l+1)) c_s / r (e.g. Unno et al. 1989, *Nonradial Oscillations
//! of Stars*, §13; memory). Finite differences on 2000 rows are accurate to about 1e-4 except
//! near the centre and where a gradient jumps, hence median tolerances.

use starpoise::constants::{G_CGS, SIGMA_SB_CGS};
use starpoise::physics::{Composition, PhysicsSet};
use starpoise::structure::ProfileRow;
use starpoise::structure::{solve, ZamsModel, ZamsSettings};
use std::f64::consts::PI;

fn model(mass: f64) -> (ZamsModel, Vec<ProfileRow>) {
    let physics = PhysicsSet::refined();
    let s = ZamsSettings::new(mass, Composition::new(0.70, 0.02).unwrap(), physics).unwrap();
    let m = solve(&s).unwrap();
    let rows = m.profile(2000).unwrap();
    (m, rows)
}

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

/// Relative residual of a finite-difference derivative against its equation at each midpoint.
fn residuals(
    rows: &[ProfileRow],
    f: impl Fn(&ProfileRow, &ProfileRow) -> Option<(f64, f64)>,
) -> Vec<f64> {
    rows.windows(2)
        .filter_map(|w| f(&w[0], &w[1]))
        .map(|(fd, exact)| (fd / exact - 1.0).abs())
        .collect()
}

#[test]
fn profiles_satisfy_their_equations() {
    for mass in [1.0, 5.0] {
        let (m, rows) = model(mass);
        let rows = &rows;
        assert_eq!(rows.len(), 2000);
        let mid = |a: f64, b: f64| 0.5 * (a + b);
        let hydro = residuals(rows, |a, b| {
            let r = mid(a.radius_cm, b.radius_cm);
            let exact =
                -G_CGS * mid(a.mass_g, b.mass_g) * mid(a.density_g_cm3, b.density_g_cm3) / (r * r);
            Some((
                (b.pressure_dyn_cm2 - a.pressure_dyn_cm2) / (b.radius_cm - a.radius_cm),
                exact,
            ))
        });
        let continuity = residuals(rows, |a, b| {
            let r = mid(a.radius_cm, b.radius_cm);
            Some((
                (b.mass_g - a.mass_g) / (b.radius_cm - a.radius_cm),
                4.0 * PI * r * r * mid(a.density_g_cm3, b.density_g_cm3),
            ))
        });
        let gradient = residuals(rows, |a, b| {
            let fd = (b.temperature_k / a.temperature_k).ln()
                / (b.pressure_dyn_cm2 / a.pressure_dyn_cm2).ln();
            (a.convective == b.convective).then_some((fd, mid(a.nabla, b.nabla)))
        });
        let energy = residuals(rows, |a, b| {
            let eps = mid(
                a.eps_pp_erg_g_s + a.eps_cno_erg_g_s,
                b.eps_pp_erg_g_s + b.eps_cno_erg_g_s,
            );
            let fd = (b.luminosity_erg_s - a.luminosity_erg_s) / (b.mass_g - a.mass_g);
            // Only where L still grows appreciably (the burning core).
            (eps > 1e-3 * (a.luminosity_erg_s / a.mass_g)).then_some((fd, eps))
        });
        for (name, v) in [
            ("hydrostatic", hydro),
            ("continuity", continuity),
            ("nabla", gradient),
            ("dL/dm", energy),
        ] {
            let med = median(v);
            assert!(med < 1e-3, "{mass} M_sun {name}: median residual {med:e}");
        }
        for r in rows {
            // The convective flag is the Schwarzschild criterion; Lamb frequencies are exact
            // (infinite at the centre row, r = 0, which writes them NaN).
            assert_eq!(r.convective == 1, r.nabla_rad > r.nabla_ad);
            let cs = (r.gamma1 * r.pressure_dyn_cm2 / r.density_g_cm3).sqrt();
            if r.radius_cm == 0.0 {
                assert!(r.lamb_l1_rad_s.is_nan() && r.lamb_l2_rad_s.is_nan());
                continue;
            }
            assert!((r.lamb_l1_rad_s / (2f64.sqrt() * cs / r.radius_cm) - 1.0).abs() < 1e-12);
            assert!((r.lamb_l2_rad_s / (6f64.sqrt() * cs / r.radius_cm) - 1.0).abs() < 1e-12);
            // Convection keeps N^2 at or below about zero (superadiabatic layers are negative).
            if r.convective == 1 {
                let g = G_CGS * r.mass_g / (r.radius_cm * r.radius_cm);
                assert!(
                    r.brunt_n2_rad2_s2 <= 1e-6 * g / r.radius_cm,
                    "N^2 = {} in a convective row",
                    r.brunt_n2_rad2_s2
                );
            }
        }
        // N^2 from finite differences in the radiative zone.
        let brunt = residuals(rows, |a, b| {
            if a.convective == 1 || b.convective == 1 || a.m_over_m < 1e-4 {
                return None;
            }
            let r = mid(a.radius_cm, b.radius_cm);
            let g = G_CGS * mid(a.mass_g, b.mass_g) / (r * r);
            let dr = b.radius_cm - a.radius_cm;
            let dlnp = (b.pressure_dyn_cm2 / a.pressure_dyn_cm2).ln() / dr;
            let dlnrho = (b.density_g_cm3 / a.density_g_cm3).ln() / dr;
            let fd = g * (dlnp / mid(a.gamma1, b.gamma1) - dlnrho);
            Some((fd, mid(a.brunt_n2_rad2_s2, b.brunt_n2_rad2_s2)))
        });
        let med = median(brunt);
        assert!(med < 1e-2, "{mass} M_sun N^2: median residual {med:e}");
        // Centre first, photosphere last: r/R = 1 there, T = T_eff from L = 4 pi R^2 sigma T^4.
        let (first, last) = (rows[0], rows[rows.len() - 1]);
        assert!(
            first.m_over_m < 1e-9
                && (last.r_over_r - 1.0).abs() < 1e-12
                && last.m_over_m > 1.0 - 1e-6
        );
        let teff =
            (last.luminosity_erg_s / (4.0 * PI * last.radius_cm.powi(2) * SIGMA_SB_CGS)).powf(0.25);
        assert!((last.temperature_k / teff - 1.0).abs() < 1e-9);
        assert!((m.summary.teff_k / teff - 1.0).abs() < 1e-9);
    }
}
