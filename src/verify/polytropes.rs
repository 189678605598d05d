//! Checks of the Lane–Emden solver (closed-form solutions and published tables) and of
//! Eddington's standard model.

use super::{Check, Tolerance};
use crate::error::{Error, Result};
use crate::polytrope::{
    eddington_beta, eddington_constant, first_zero, solve_lane_emden, FirstZero, LaneEmdenSettings,
    INDEX_ALLOWED,
};
use std::f64::consts::PI;

const GROUP: &str = "polytropes";

/// Closed-form solutions n = 0, 1, 5 (Chandrasekhar 1939, ch. IV; docs/references.md §1).
const EXACT: &str = "closed-form solution, Chandrasekhar 1939, Introduction to the Study of Stellar Structure, ch. IV (confirmed)";
/// The n = 1.5 ... 4 tables. Flags as in docs/references.md §1: the tables themselves from
/// memory, the ten-figure digits computed by an independent integration and stated to agree
/// with both tables where they overlap.
const TABLES: &str =
    "Chandrasekhar 1939 Table 4; Horedt 1986, Ap&SS 126, 357 (tables: memory; digits: computed)";
/// Eddington's quartic with CODATA 2018 constants and m_u (docs/references.md §1, computed);
/// the textbook 0.003 is Kippenhahn & Weigert 1990 (memory).
const EDDINGTON: &str = "Eddington standard model, C with CODATA 2018 and m_u (computed); Kippenhahn & Weigert 1990 give 0.003 (memory)";

/// Push the three table checks (xi_1, omega_n, rho_c/rho_mean) of the polytrope of index `$n`
/// (`$tenths` = 10 n), each an `(expected, half unit in the last place)` pair.
macro_rules! table_row {
    ($list:ident, $n:literal, $tenths:literal, $xi:expr, $omega:expr, $contrast:expr) => {
        $list.push(Check::new(
            concat!("lane-emden.n", $n, ".xi1"),
            GROUP,
            concat!("n = ", $n, ": first zero xi_1"),
            TABLES,
            $xi.0,
            Tolerance::Absolute($xi.1),
            xi1::<$tenths>,
        ));
        $list.push(Check::new(
            concat!("lane-emden.n", $n, ".omega"),
            GROUP,
            concat!("n = ", $n, ": mass constant omega_n = -xi_1^2 theta'(xi_1)"),
            TABLES,
            $omega.0,
            Tolerance::Absolute($omega.1),
            omega::<$tenths>,
        ));
        $list.push(Check::new(
            concat!("lane-emden.n", $n, ".density-contrast"),
            GROUP,
            concat!("n = ", $n, ": rho_c / rho_mean"),
            TABLES,
            $contrast.0,
            Tolerance::Absolute($contrast.1),
            density_contrast::<$tenths>,
        ));
    };
}

/// The checks of this group.
pub fn checks() -> Vec<Check> {
    // The solver promises 1e-10 relative for every printed number (rtol = atol = 1e-13 inside).
    let exact = Tolerance::Relative(1e-10);
    let mut list = vec![
        Check::new(
            "lane-emden.n0.xi1",
            GROUP,
            "n = 0: first zero xi_1 = sqrt 6",
            EXACT,
            6f64.sqrt(),
            exact,
            xi1::<0>,
        ),
        Check::new(
            "lane-emden.n1.xi1",
            GROUP,
            "n = 1: first zero xi_1 = pi",
            EXACT,
            PI,
            exact,
            xi1::<10>,
        ),
        Check::new(
            "lane-emden.n1.density-contrast",
            GROUP,
            "n = 1: rho_c / rho_mean = pi^2 / 3",
            EXACT,
            PI * PI / 3.0,
            exact,
            density_contrast::<10>,
        ),
        // At xi = 1000 the exact solution gives -xi^2 theta' = sqrt 3 (1 + 3/xi^2)^(-3/2), 4.5e-6
        // below its limit sqrt 3 = omega_5; the integration must reproduce that value.
        Check::new(
            "lane-emden.n5.omega",
            GROUP,
            "n = 5: -xi^2 theta' integrated to xi = 1000 against the exact solution (limit sqrt 3)",
            EXACT,
            3f64.sqrt() * (1.0 + 3.0 / 1.0e6f64).powf(-1.5),
            Tolerance::Relative(1e-9),
            n5_mass_constant,
        ),
    ];
    // xi_1, omega_n and rho_c/rho_mean with the digits of docs/references.md §1, each checked
    // to half a unit in its last given place (the second number of each pair).
    table_row!(
        list,
        "1.5",
        15,
        (3.653753736, 5e-10),
        (2.714055120, 5e-10),
        (5.990704516, 5e-10)
    );
    table_row!(
        list,
        "2",
        20,
        (4.352874596, 5e-10),
        (2.411046012, 5e-10),
        (11.40254286, 5e-9)
    );
    table_row!(
        list,
        "3",
        30,
        (6.896848619, 5e-10),
        (2.018235951, 5e-10),
        (54.18248111, 5e-9)
    );
    table_row!(
        list,
        "4",
        40,
        (14.97154635, 5e-9),
        (1.797229914, 5e-10),
        (622.4078823, 5e-8)
    );
    list.extend([
        // Four figures given: half a unit in the fourth.
        Check::new(
            "eddington.constant",
            GROUP,
            "C of (1 - beta)/beta^4 = C mu^4 (M/M_sun)^2, n = 3",
            EDDINGTON,
            2.990e-3,
            Tolerance::Absolute(5e-7),
            || Ok(eddington_constant(omega_3()?)),
        ),
        Check::new(
            "eddington.radiation-fraction.1msun",
            GROUP,
            "1 - beta at 1 M_sun, mu = 0.61",
            EDDINGTON,
            0.00041,
            Tolerance::Absolute(5e-6),
            radiation_fraction::<1>,
        ),
        Check::new(
            "eddington.radiation-fraction.10msun",
            GROUP,
            "1 - beta at 10 M_sun, mu = 0.61",
            EDDINGTON,
            0.0358,
            Tolerance::Absolute(5e-5),
            radiation_fraction::<10>,
        ),
        Check::new(
            "eddington.radiation-fraction.100msun",
            GROUP,
            "1 - beta at 100 M_sun, mu = 0.61",
            EDDINGTON,
            0.432,
            Tolerance::Absolute(5e-4),
            radiation_fraction::<100>,
        ),
    ]);
    list
}

/// The first zero of the polytrope of index `TENTHS / 10`.
fn zero<const TENTHS: u32>() -> Result<FirstZero> {
    let n = f64::from(TENTHS) / 10.0;
    first_zero(n)?.ok_or_else(|| Error::invalid("index", n, INDEX_ALLOWED))
}

fn xi1<const TENTHS: u32>() -> Result<f64> {
    Ok(zero::<TENTHS>()?.xi1)
}

fn omega<const TENTHS: u32>() -> Result<f64> {
    let z = zero::<TENTHS>()?;
    Ok(-z.xi1 * z.xi1 * z.dtheta_dxi)
}

fn density_contrast<const TENTHS: u32>() -> Result<f64> {
    let z = zero::<TENTHS>()?;
    Ok(-z.xi1 / (3.0 * z.dtheta_dxi))
}

fn omega_3() -> Result<f64> {
    omega::<30>()
}

fn n5_mass_constant() -> Result<f64> {
    let settings = LaneEmdenSettings::default()
        .with_points(2)?
        .with_unbounded_xi_max(1000.0)?;
    let s = solve_lane_emden(5.0, &settings)?;
    let last = s.profile.last().ok_or_else(|| Error::Integration {
        what: "lane-emden",
        variable: "xi",
        at: 1000.0,
        reason: "empty profile".to_string(),
    })?;
    Ok(-last.xi * last.xi * last.dtheta_dxi)
}

fn radiation_fraction<const MASS_MSUN: u32>() -> Result<f64> {
    Ok(1.0 - eddington_beta(f64::from(MASS_MSUN), 0.61, omega_3()?)?)
}
