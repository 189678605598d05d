//! The summary quantities of a converged model, declared once.
//!
//! The `summary_quantities!` macro declares each quantity with its documentation; from that one
//! list come the struct [`ModelSummary`] (plain `f64` fields: a converged model has every
//! quantity), the table [`ModelSummary::FIELDS`] (key = JSON key = CSV column = Python
//! attribute, with the documentation line), and the flat values in that order. Output code serialises from these;
//! nothing else lists the quantities.

/// One summary quantity: its key (with its unit in the name) and its documentation.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct SummaryField {
    /// JSON key and CSV column.
    pub key: &'static str,
    /// What it is, with its unit and definition.
    pub doc: &'static str,
}

macro_rules! summary_quantities {
    ($( #[doc = $doc:literal] $name:ident ),* $(,)?) => {
        /// The summary quantities of a converged ZAMS model. Non-finite only where documented
        /// (`central_degeneracy` is NaN for a law without electron degeneracy,
        /// `he3_equilibrium_time_yr` for a rates law without 3He reactions, or where its rates
        /// underflow, below about 1e6 K, which no ZAMS centre reaches).
        #[derive(Debug, Clone, Copy, PartialEq)]
        pub struct ModelSummary {
            $( #[doc = $doc] pub $name: f64, )*
        }

        impl ModelSummary {
            /// Every quantity, in output order.
            pub const FIELDS: &'static [SummaryField] = &[
                $( SummaryField { key: stringify!($name), doc: $doc.trim_ascii() }, )*
            ];

            /// The values in the order of [`ModelSummary::FIELDS`].
            pub fn values(&self) -> Vec<f64> {
                vec![ $( self.$name ),* ]
            }

            /// The summary from values in the order of [`ModelSummary::FIELDS`]; `None` if the
            /// count differs.
            pub fn from_values(values: &[f64]) -> Option<Self> {
                let mut it = values.iter().copied();
                let s = Self { $( $name: it.next()?, )* };
                it.next().is_none().then_some(s)
            }
        }
    };
}

summary_quantities! {
    /// Photospheric radius, R_sun.
    radius_rsun,
    /// Surface luminosity, L_sun.
    luminosity_lsun,
    /// Effective temperature, K, from L = 4 pi R^2 sigma T_eff^4.
    teff_k,
    /// log10 of the surface gravity G M / R^2 in cm s^-2.
    log_g_cgs,
    /// Central temperature, K.
    central_temperature_k,
    /// Central density, g cm^-3.
    central_density_g_cm3,
    /// Central pressure, dyn cm^-2.
    central_pressure_dyn_cm2,
    /// Electron degeneracy parameter psi = mu_e,chem / (k T) at the centre (psi << 0: not degenerate; psi > 0: degenerate); null (NaN) for laws that assume non-degenerate electrons.
    central_degeneracy,
    /// Mass fraction of the convective region that contains the centre (0 if the centre is radiative).
    convective_core_mass_fraction,
    /// Mass fraction of the outermost convective region if it reaches within 1e-3 M of the surface (0 otherwise); a fully convective star has 1 for both core and envelope (the same region: do not add them).
    convective_envelope_mass_fraction,
    /// Fraction of L supplied by the CNO cycle.
    cno_luminosity_fraction,
    /// L / L_Edd with L_Edd = 4 pi G M c / kappa_es and kappa_es = sigma_T (1 + X) / (2 m_u).
    eddington_ratio,
    /// Kelvin–Helmholtz time G M^2 / (R L), years.
    kelvin_helmholtz_time_yr,
    /// Dynamical time sqrt(R^3 / (G M)), s.
    dynamical_time_s,
    /// Hydrogen-burning lifetime estimate 0.1 X M (Q / 4 m_H c^2) c^2 / L, years.
    nuclear_time_yr,
    /// Relaxation time of 3He to its equilibrium abundance at the centre, 1 / (2 lambda_33 n_3,eq + lambda_34) (3He made by pp, destroyed by 3He + 3He and 3He + 4He), years; null (NaN) for rates laws without 3He reactions (analytic, power-law). Above 1e9 the model carries a caution (a fully convective model is judged on its 3He mixed through the star, which takes longer).
    he3_equilibrium_time_yr,
    /// |integral of 3 P / rho dm / integral of G m / r dm - 1| (virial theorem, 0 when exact).
    virial_residual,
    /// |integral of eps dm / L - 1| (energy conservation, 0 when exact).
    luminosity_residual,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fields_values_and_back() {
        let n = ModelSummary::FIELDS.len();
        let values: Vec<f64> = (0..n).map(|i| i as f64 + 0.5).collect();
        let s = ModelSummary::from_values(&values).expect("count matches");
        assert_eq!(s.values(), values);
        assert_eq!(s.radius_rsun, 0.5);
        assert_eq!(ModelSummary::FIELDS[0].key, "radius_rsun");
        assert!(ModelSummary::from_values(&values[1..]).is_none());
        // Every key carries its unit or is a pure number by definition, and is unique.
        let mut keys: Vec<&str> = ModelSummary::FIELDS.iter().map(|f| f.key).collect();
        keys.sort_unstable();
        keys.dedup();
        assert_eq!(keys.len(), n);
    }
}
