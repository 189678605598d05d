//! The profile figure's abscissa: radius, mass or pressure, each read left to right from the
//! centre to the surface, and the convective regions along it.

use crate::error::{Error, Result};
use crate::structure::ProfileRow;
use std::fmt;
use std::str::FromStr;

/// What the profile figure's x axis shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Abscissa {
    /// r/R on [0, 1] (the default): the core is spread out, the outer layers are squeezed
    /// against the right edge.
    #[default]
    Radius,
    /// m/M on [0, 1]: what fraction of the mass lies inside; the outer layers, which hold
    /// little mass, are squeezed further.
    Mass,
    /// log10 P (P in dyn/cm^2), decreasing to the right from the centre to the photosphere:
    /// every decade of pressure gets the same width, so the outer layers, convective envelope
    /// and ionisation zones included, are spread out.
    Pressure,
}

impl Abscissa {
    /// Every choice, in the order the help lists them.
    pub const ALL: [Abscissa; 3] = [Abscissa::Radius, Abscissa::Mass, Abscissa::Pressure];

    /// The name a user gives.
    pub fn name(self) -> &'static str {
        match self {
            Abscissa::Radius => "radius",
            Abscissa::Mass => "mass",
            Abscissa::Pressure => "pressure",
        }
    }

    /// The axis label.
    pub fn axis_label(self) -> &'static str {
        match self {
            Abscissa::Radius => "r / R",
            Abscissa::Mass => "m / M",
            Abscissa::Pressure => "log10 P / (dyn cm^-2)",
        }
    }

    /// The abscissa of one row: r/R, m/M or log10 P.
    pub fn value(self, row: &ProfileRow) -> f64 {
        match self {
            Abscissa::Radius => row.r_over_r,
            Abscissa::Mass => row.m_over_m,
            Abscissa::Pressure => row.pressure_dyn_cm2.log10(),
        }
    }

    /// +1 if the abscissa grows from the centre outwards, -1 if it falls (pressure). The chart
    /// coordinate is the value times this sign, so that it always grows to the right.
    pub(crate) fn sign(self) -> f64 {
        match self {
            Abscissa::Pressure => -1.0,
            Abscissa::Radius | Abscissa::Mass => 1.0,
        }
    }
}

impl fmt::Display for Abscissa {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for Abscissa {
    type Err = Error;

    fn from_str(s: &str) -> Result<Self> {
        Abscissa::ALL
            .into_iter()
            .find(|a| a.name() == s)
            .ok_or_else(|| Error::invalid("abscissa", s, "radius, mass or pressure"))
    }
}

/// The chart coordinate of every row (abscissa times [`Abscissa::sign`]), which grows from the
/// centre to the surface in a profile written centre first.
///
/// Errors: [`Error::InvalidInput`] naming the row for a value that is not finite (on the
/// pressure axis: a pressure that is not positive).
pub(crate) fn coordinates(rows: &[ProfileRow], abscissa: Abscissa) -> Result<Vec<f64>> {
    rows.iter()
        .enumerate()
        .map(|(i, r)| {
            let v = abscissa.value(r);
            if v.is_finite() {
                Ok(abscissa.sign() * v)
            } else {
                Err(Error::invalid(
                    &format!("profile row {i} on the {abscissa} axis"),
                    v,
                    "a finite value (on the pressure axis: a positive pressure)",
                ))
            }
        })
        .collect()
}

/// Convective regions as (start, end) in the chart coordinate `u` of the rows: runs of rows
/// with `convective == 1`, each widened to halfway to the neighbouring radiative rows (to the
/// first or last row at the ends), so that a region resolved by one row still shows.
pub(crate) fn convective_bands(rows: &[ProfileRow], u: &[f64]) -> Vec<(f64, f64)> {
    let n = rows.len().min(u.len());
    let mut bands = Vec::new();
    let mut i = 0;
    while i < n {
        if rows[i].convective != 1 {
            i += 1;
            continue;
        }
        let mut j = i;
        while j + 1 < n && rows[j + 1].convective == 1 {
            j += 1;
        }
        let start = if i == 0 {
            u[0]
        } else {
            0.5 * (u[i - 1] + u[i])
        };
        let end = if j + 1 == n {
            u[j]
        } else {
            0.5 * (u[j] + u[j + 1])
        };
        bands.push((start, end));
        i = j + 1;
    }
    bands
}

#[cfg(test)]
mod tests {
    use super::*;

    fn row(r: f64, convective: u8) -> ProfileRow {
        ProfileRow {
            mass_g: 0.0,
            m_over_m: r * r,
            radius_cm: 0.0,
            r_over_r: r,
            pressure_dyn_cm2: 10f64.powf(17.0 - 12.0 * r),
            temperature_k: 1.0,
            density_g_cm3: 1.0,
            luminosity_erg_s: 1.0,
            eps_pp_erg_g_s: 0.0,
            eps_cno_erg_g_s: 0.0,
            opacity_cm2_g: 0.0,
            nabla_rad: 0.0,
            nabla_ad: 0.4,
            nabla: 0.0,
            convective,
            mu: 0.6,
            gamma1: 5.0 / 3.0,
            brunt_n2_rad2_s2: 0.0,
            lamb_l1_rad_s: 0.0,
            lamb_l2_rad_s: 0.0,
            ..ProfileRow::default()
        }
    }

    #[test]
    fn names_round_trip() {
        for a in Abscissa::ALL {
            assert_eq!(a.to_string().parse::<Abscissa>().unwrap(), a);
        }
        let err = "log-p".parse::<Abscissa>().unwrap_err();
        assert_eq!(err.exit_code(), crate::error::ExitCode::BadInput);
        assert!(
            err.to_string().contains("radius, mass or pressure"),
            "{err}"
        );
    }

    #[test]
    fn bands_span_runs_of_convective_rows() {
        let rows = [
            row(0.0, 1),
            row(0.1, 1),
            row(0.2, 0),
            row(0.5, 0),
            row(0.6, 1),
            row(0.8, 0),
            row(0.9, 1),
            row(1.0, 1),
        ];
        let u = coordinates(&rows, Abscissa::Radius).unwrap();
        let bands = convective_bands(&rows, &u);
        assert_eq!(bands.len(), 3);
        // Edges halfway between neighbouring rows; tolerance for the midpoint rounding.
        let expected = [(0.0, 0.15), (0.55, 0.7), (0.85, 1.0)];
        for (b, e) in bands.iter().zip(expected) {
            assert!(
                (b.0 - e.0).abs() < 1e-12 && (b.1 - e.1).abs() < 1e-12,
                "{b:?} vs {e:?}"
            );
        }
        // On the pressure axis the same rows give u = -log10 P = 12 r - 17.
        let u = coordinates(&rows, Abscissa::Pressure).unwrap();
        let bands = convective_bands(&rows, &u);
        assert!(
            (bands[1].0 - (12.0 * 0.55 - 17.0)).abs() < 1e-9,
            "{bands:?}"
        );
    }

    #[test]
    fn pressure_axis_needs_positive_pressures() {
        let mut rows = [row(0.0, 0), row(0.5, 0)];
        rows[1].pressure_dyn_cm2 = 0.0;
        let err = coordinates(&rows, Abscissa::Pressure).unwrap_err();
        assert!(err.to_string().contains("row 1"), "{err}");
        assert!(coordinates(&rows, Abscissa::Mass).is_ok());
    }
}
