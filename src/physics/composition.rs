//! Chemical composition of a homogeneous (zero-age) star.

use crate::error::{Error, Result};
use serde::{Deserialize, Serialize};

/// Default fraction of the metals Z that are C, N and O nuclei (by mass).
///
/// 0.7 is a common approximation for a solar-like mixture (common practice, no single source).
pub const DEFAULT_CNO_FRACTION_OF_Z: f64 = 0.7;

/// Mean mass number assumed for the metals when counting ions (an oxygen-to-iron mix is close
/// to 16 for the abundant species; the value only matters at the 1e-3 level for mu).
pub const METAL_MEAN_MASS_NUMBER: f64 = 16.0;

/// Mass fractions of hydrogen X, helium Y and metals Z, with Y = 1 - X - Z.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Composition {
    x: f64,
    z: f64,
    cno_fraction_of_z: f64,
}

impl Composition {
    /// Composition with hydrogen mass fraction `x` and metal mass fraction `z`.
    ///
    /// Errors unless 0 <= X, 0 <= Z and X + Z <= 1 (all finite).
    pub fn new(x: f64, z: f64) -> Result<Self> {
        if !(0.0..=1.0).contains(&x) {
            return Err(Error::invalid(
                "x",
                x,
                "hydrogen mass fraction X must be in [0, 1], e.g. 0.70",
            ));
        }
        if !(0.0..=1.0).contains(&z) {
            return Err(Error::invalid(
                "z",
                z,
                "metal mass fraction Z must be in [0, 1], e.g. 0.02",
            ));
        }
        if x + z > 1.0 + 1e-12 {
            return Err(Error::invalid(
                "x + z",
                x + z,
                "X + Z must not exceed 1 (Y = 1 - X - Z >= 0), e.g. X = 0.70 with Z = 0.02",
            ));
        }
        Ok(Self {
            x,
            z,
            cno_fraction_of_z: DEFAULT_CNO_FRACTION_OF_Z,
        })
    }

    /// Set the fraction of Z that is CNO nuclei (default [`DEFAULT_CNO_FRACTION_OF_Z`]).
    pub fn with_cno_fraction(mut self, fraction: f64) -> Result<Self> {
        if !fraction.is_finite() || !(0.0..=1.0).contains(&fraction) {
            return Err(Error::invalid(
                "cno_fraction",
                fraction,
                "the CNO fraction of Z must be in [0, 1], e.g. 0.7",
            ));
        }
        self.cno_fraction_of_z = fraction;
        Ok(self)
    }

    /// Hydrogen mass fraction X.
    pub fn x(&self) -> f64 {
        self.x
    }
    /// Helium mass fraction Y = 1 - X - Z.
    pub fn y(&self) -> f64 {
        (1.0 - self.x - self.z).max(0.0)
    }
    /// Metal mass fraction Z.
    pub fn z(&self) -> f64 {
        self.z
    }
    /// Fraction of Z in CNO nuclei.
    pub fn cno_fraction_of_z(&self) -> f64 {
        self.cno_fraction_of_z
    }
    /// CNO mass fraction X_CNO = f_CNO Z.
    pub fn x_cno(&self) -> f64 {
        self.cno_fraction_of_z * self.z
    }

    /// Mean molecular weight of fully ionised matter, mu = 1 / (2X + 3Y/4 + Z/2)
    /// (e.g. Kippenhahn & Weigert 1990, §13.1; the metals contribute about A/2 particles per A).
    pub fn mu(&self) -> f64 {
        1.0 / (2.0 * self.x + 0.75 * self.y() + 0.5 * self.z)
    }

    /// Mean molecular weight per free electron when fully ionised, mu_e = 2 / (1 + X).
    pub fn mu_e(&self) -> f64 {
        2.0 / (1.0 + self.x)
    }

    /// Mean molecular weight of the ions alone, 1/mu_ion = X + Y/4 + Z/A_Z with A_Z =
    /// [`METAL_MEAN_MASS_NUMBER`].
    pub fn mu_ion(&self) -> f64 {
        1.0 / (self.x + 0.25 * self.y() + self.z / METAL_MEAN_MASS_NUMBER)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Fully ionised solar-like mixture X = 0.70, Z = 0.02: mu = 1/(1.4 + 0.21 + 0.01) = 0.617
    /// (arithmetic on the textbook formula).
    #[test]
    fn mu_of_solar_like_mix() {
        let c = Composition::new(0.70, 0.02).unwrap();
        assert!((c.mu() - 1.0 / 1.62).abs() < 1e-12);
        assert!((c.mu_e() - 2.0 / 1.7).abs() < 1e-12);
        assert!((c.y() - 0.28).abs() < 1e-12);
        assert!((c.x_cno() - 0.014).abs() < 1e-12);
    }

    #[test]
    fn refuses_bad_fractions() {
        assert!(Composition::new(-0.1, 0.02).is_err());
        assert!(Composition::new(0.7, -0.01).is_err());
        assert!(Composition::new(0.9, 0.2).is_err());
        assert!(Composition::new(f64::NAN, 0.02).is_err());
        assert!(Composition::new(0.7, 0.02)
            .unwrap()
            .with_cno_fraction(1.5)
            .is_err());
    }
}
