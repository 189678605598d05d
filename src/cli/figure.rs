//! Flags shared by the commands that draw figures.

use clap::ValueEnum;
use starpoise::output::plot::Abscissa;

/// The profile figure's x axis, as a flag value (the library's [`Abscissa`], by name).
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum AbscissaArg {
    /// r/R, 0 to 1.
    Radius,
    /// m/M, 0 to 1.
    Mass,
    /// log10 P, from the centre to the photosphere (spreads out the outer layers).
    Pressure,
}

impl From<AbscissaArg> for Abscissa {
    fn from(a: AbscissaArg) -> Self {
        match a {
            AbscissaArg::Radius => Abscissa::Radius,
            AbscissaArg::Mass => Abscissa::Mass,
            AbscissaArg::Pressure => Abscissa::Pressure,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn flag_values_are_the_library_names() {
        for a in AbscissaArg::value_variants() {
            let name = a.to_possible_value().map(|v| v.get_name().to_string());
            assert_eq!(name, Some(Abscissa::from(*a).to_string()));
        }
        assert_eq!(AbscissaArg::value_variants().len(), Abscissa::ALL.len());
    }
}
