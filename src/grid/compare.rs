//! Comparing solved models of one mass across physics variants: logarithmic differences
//! against a reference model, and logarithmic sensitivities to a scale factor.
//!
//! For a quantity Q, the difference is dlog Q = log10(Q_variant) - log10(Q_reference); for the
//! convective-core mass fraction q_cc, which may be zero, it is the plain difference
//! Delta q_cc = q_cc,variant - q_cc,reference. When the variant differs from the reference by
//! exactly one scale factor f (opacity or nuclear rates), the logarithmic sensitivity is the
//! finite-difference estimate S_Q = dlog Q / dlog f = (log10 Q_v - log10 Q_r) / (log10 f_v -
//! log10 f_r).

use crate::output::zams::ZamsSummary;
use crate::physics::PhysicsOptions;

/// A scale factor of the physics that a variant may change.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ScaleFactor {
    /// The factor multiplying the opacity (`opacity-factor`).
    Opacity,
    /// The factor multiplying the nuclear energy generation rate (`rates-factor`).
    Rates,
}

impl ScaleFactor {
    /// The key as a user writes it in a variant SPEC.
    pub fn key(self) -> &'static str {
        match self {
            ScaleFactor::Opacity => "opacity-factor",
            ScaleFactor::Rates => "rates-factor",
        }
    }
}

/// A change of exactly one scale factor between the reference and a variant.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FactorChange {
    /// Which factor.
    pub factor: ScaleFactor,
    /// Its value in the reference (1 unless the reference sets it).
    pub reference: f64,
    /// Its value in the variant.
    pub variant: f64,
}

impl FactorChange {
    /// log10(f_variant / f_reference).
    pub fn dlog_factor(&self) -> f64 {
        (self.variant / self.reference).log10()
    }
}

/// Whether the effective options `variant` differ from the effective options `reference`
/// (each the base set overridden by its variant, see [`PhysicsOptions::overridden_by`]) in
/// exactly one scale factor and in nothing else. An unset factor counts as 1, as in
/// [`PhysicsOptions::build`]. Every other option must be given identically (an option set in
/// one and left to its default in the other counts as a difference, so no sensitivity is
/// claimed for a change that is not certainly a pure factor change).
pub fn single_factor_change(
    reference: &PhysicsOptions,
    variant: &PhysicsOptions,
) -> Option<FactorChange> {
    let laws_equal = reference.physics == variant.physics
        && reference.eos == variant.eos
        && reference.opacity == variant.opacity
        && reference.rates == variant.rates
        && reference.convection == variant.convection
        && reference.alpha == variant.alpha
        && reference.atmosphere == variant.atmosphere;
    if !laws_equal {
        return None;
    }
    let opacity = (
        reference.opacity_factor.unwrap_or(1.0),
        variant.opacity_factor.unwrap_or(1.0),
    );
    let rates = (
        reference.rates_factor.unwrap_or(1.0),
        variant.rates_factor.unwrap_or(1.0),
    );
    match (opacity.0 != opacity.1, rates.0 != rates.1) {
        (true, false) => Some(FactorChange {
            factor: ScaleFactor::Opacity,
            reference: opacity.0,
            variant: opacity.1,
        }),
        (false, true) => Some(FactorChange {
            factor: ScaleFactor::Rates,
            reference: rates.0,
            variant: rates.1,
        }),
        _ => None,
    }
}

/// Differences of a variant's model against the reference model of the same mass. A field is
/// `None` when either model lacks the quantity or (for the logarithms) it is not positive.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Differences {
    /// log10(L_v / L_r), dex.
    pub dlog_luminosity: Option<f64>,
    /// log10(R_v / R_r), dex.
    pub dlog_radius: Option<f64>,
    /// log10(T_c,v / T_c,r), dex.
    pub dlog_central_temperature: Option<f64>,
    /// log10(rho_c,v / rho_c,r), dex.
    pub dlog_central_density: Option<f64>,
    /// q_cc,v - q_cc,r (convective-core mass fraction of M).
    pub delta_convective_core_mass_fraction: Option<f64>,
}

fn dlog(reference: Option<f64>, variant: Option<f64>) -> Option<f64> {
    match (reference, variant) {
        (Some(r), Some(v)) if r > 0.0 && v > 0.0 && r.is_finite() && v.is_finite() => {
            Some(v.log10() - r.log10())
        }
        _ => None,
    }
}

/// The differences of `variant` against `reference` (see the module documentation).
pub fn differences(reference: &ZamsSummary, variant: &ZamsSummary) -> Differences {
    Differences {
        dlog_luminosity: dlog(reference.luminosity_lsun, variant.luminosity_lsun),
        dlog_radius: dlog(reference.radius_rsun, variant.radius_rsun),
        dlog_central_temperature: dlog(
            reference.central_temperature_k,
            variant.central_temperature_k,
        ),
        dlog_central_density: dlog(
            reference.central_density_g_cm3,
            variant.central_density_g_cm3,
        ),
        delta_convective_core_mass_fraction: match (
            reference.convective_core_mass_fraction,
            variant.convective_core_mass_fraction,
        ) {
            (Some(r), Some(v)) => Some(v - r),
            _ => None,
        },
    }
}

/// Logarithmic sensitivities S_Q = dlog Q / dlog f of a variant that changes one factor.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sensitivities {
    /// The factor changed.
    pub change: FactorChange,
    /// dlog L / dlog f.
    pub luminosity: Option<f64>,
    /// dlog R / dlog f.
    pub radius: Option<f64>,
    /// dlog T_c / dlog f.
    pub central_temperature: Option<f64>,
    /// dlog rho_c / dlog f.
    pub central_density: Option<f64>,
}

/// The sensitivities from the differences `d` of a variant that makes the factor change
/// `change`, or `None` if the factor did not change (dlog f = 0, or a factor not positive).
pub fn sensitivities(d: &Differences, change: FactorChange) -> Option<Sensitivities> {
    let dlog_f = change.dlog_factor();
    if !(dlog_f.is_finite() && dlog_f != 0.0) {
        return None;
    }
    let per = |x: Option<f64>| x.map(|x| x / dlog_f);
    Some(Sensitivities {
        change,
        luminosity: per(d.dlog_luminosity),
        radius: per(d.dlog_radius),
        central_temperature: per(d.dlog_central_temperature),
        central_density: per(d.dlog_central_density),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::PhysicsDescription;
    use approx::assert_relative_eq;

    /// A hand-made summary with the compared quantities set.
    fn summary(l: f64, r: f64, tc: f64, rho: f64, qcc: f64) -> ZamsSummary {
        ZamsSummary {
            mass_msun: 1.0,
            x: 0.7,
            z: 0.02,
            physics: PhysicsDescription {
                preset: "test".into(),
                eos: "test".into(),
                opacity: "test".into(),
                rates: "test".into(),
                convection: "test".into(),
                atmosphere: "test".into(),
            },
            converged: true,
            iterations: 1,
            fit_mismatch: 0.0,
            fit_mass_fraction: 0.4,
            radius_rsun: Some(r),
            luminosity_lsun: Some(l),
            teff_k: None,
            log_g_cgs: None,
            central_temperature_k: Some(tc),
            central_density_g_cm3: Some(rho),
            central_pressure_dyn_cm2: None,
            central_degeneracy: None,
            convective_core_mass_fraction: Some(qcc),
            convective_envelope_mass_fraction: None,
            cno_luminosity_fraction: None,
            eddington_ratio: None,
            kelvin_helmholtz_time_yr: None,
            dynamical_time_s: None,
            nuclear_time_yr: None,
            virial_residual: None,
            luminosity_residual: None,
            rhs_evaluations: 0,
        }
    }

    // Tolerances: a few ulps of the log10 values compared (exact arithmetic otherwise).
    const ULPS: f64 = 1e-14;

    #[test]
    fn doubled_luminosity_is_log10_two() {
        let r = summary(1.0, 1.0, 1.5e7, 100.0, 0.1);
        let v = summary(2.0, 0.5, 1.5e8, 100.0, 0.25);
        let d = differences(&r, &v);
        assert_relative_eq!(
            d.dlog_luminosity.unwrap(),
            2f64.log10(),
            max_relative = ULPS
        );
        assert_relative_eq!(d.dlog_radius.unwrap(), -(2f64.log10()), max_relative = ULPS);
        assert_relative_eq!(
            d.dlog_central_temperature.unwrap(),
            1.0,
            max_relative = ULPS
        );
        assert_eq!(d.dlog_central_density, Some(0.0));
        assert_relative_eq!(
            d.delta_convective_core_mass_fraction.unwrap(),
            0.15,
            max_relative = ULPS
        );
        // The reference against itself: every difference exactly zero.
        let z = differences(&r, &r);
        assert_eq!(z.dlog_luminosity, Some(0.0));
        assert_eq!(z.dlog_radius, Some(0.0));
        assert_eq!(z.dlog_central_temperature, Some(0.0));
        assert_eq!(z.dlog_central_density, Some(0.0));
        assert_eq!(z.delta_convective_core_mass_fraction, Some(0.0));
    }

    #[test]
    fn missing_or_non_positive_values_give_none() {
        let r = summary(1.0, 1.0, 1.5e7, 100.0, 0.0);
        let mut v = summary(0.0, 1.0, 1.5e7, 100.0, 0.0);
        v.radius_rsun = None;
        let d = differences(&r, &v);
        assert_eq!(d.dlog_luminosity, None);
        assert_eq!(d.dlog_radius, None);
        assert_eq!(d.delta_convective_core_mass_fraction, Some(0.0));
    }

    #[test]
    fn sensitivity_is_the_exponent_of_a_power_law() {
        // Q = f^s exactly: factor 2, L x 2^0.5 -> S_L = 0.5; R x 2^-1 -> S_R = -1;
        // T_c x 2^0.25, rho_c x 2^3.
        let r = summary(1.0, 1.0, 1.0e7, 10.0, 0.0);
        let v = summary(2f64.powf(0.5), 0.5, 1.0e7 * 2f64.powf(0.25), 80.0, 0.0);
        let change = FactorChange {
            factor: ScaleFactor::Opacity,
            reference: 1.0,
            variant: 2.0,
        };
        let s = sensitivities(&differences(&r, &v), change).unwrap();
        assert_relative_eq!(s.luminosity.unwrap(), 0.5, max_relative = ULPS);
        assert_relative_eq!(s.radius.unwrap(), -1.0, max_relative = ULPS);
        assert_relative_eq!(s.central_temperature.unwrap(), 0.25, max_relative = 1e-13);
        assert_relative_eq!(s.central_density.unwrap(), 3.0, max_relative = ULPS);
        // A reference that sets the factor itself: 0.5 -> 2 is a factor 4 = 2^2, so L x 2
        // is S_L = 0.5.
        let change = FactorChange {
            factor: ScaleFactor::Rates,
            reference: 0.5,
            variant: 2.0,
        };
        let v = summary(2.0, 1.0, 1.0e7, 10.0, 0.0);
        let s = sensitivities(&differences(&r, &v), change).unwrap();
        assert_relative_eq!(s.luminosity.unwrap(), 0.5, max_relative = ULPS);
        assert_eq!(s.radius, Some(0.0));
        // No change of the factor: no sensitivity.
        let same = FactorChange {
            factor: ScaleFactor::Rates,
            reference: 2.0,
            variant: 2.0,
        };
        assert!(sensitivities(&differences(&r, &v), same).is_none());
    }

    #[test]
    fn finds_exactly_one_factor_change() {
        let base = PhysicsOptions::default();
        let hot = PhysicsOptions {
            opacity_factor: Some(2.0),
            ..PhysicsOptions::default()
        };
        assert_eq!(
            single_factor_change(&base, &hot),
            Some(FactorChange {
                factor: ScaleFactor::Opacity,
                reference: 1.0,
                variant: 2.0
            })
        );
        // The reference's own factor is the starting point.
        let burn = PhysicsOptions {
            opacity_factor: Some(2.0),
            rates_factor: Some(3.0),
            ..PhysicsOptions::default()
        };
        assert_eq!(
            single_factor_change(&hot, &burn),
            Some(FactorChange {
                factor: ScaleFactor::Rates,
                reference: 1.0,
                variant: 3.0
            })
        );
        // An explicit factor of 1 is the same as none.
        let one = PhysicsOptions {
            opacity_factor: Some(1.0),
            ..PhysicsOptions::default()
        };
        assert_eq!(single_factor_change(&base, &one), None);
        // Two factors, or a factor and a law, or a law alone: no single factor change.
        assert_eq!(single_factor_change(&base, &burn), None);
        let mixed = PhysicsOptions {
            opacity_factor: Some(2.0),
            alpha: Some(1.5),
            ..PhysicsOptions::default()
        };
        assert_eq!(single_factor_change(&base, &mixed), None);
        let law = PhysicsOptions {
            opacity: Some("kramers".into()),
            ..PhysicsOptions::default()
        };
        assert_eq!(single_factor_change(&base, &law), None);
        assert_eq!(single_factor_change(&base, &base), None);
    }
}
