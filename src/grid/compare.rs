//! Comparing solved models of one mass across physics variants: logarithmic differences
//! against a reference model, and logarithmic sensitivities to a scale factor.
//!
//! For a quantity Q, the difference is dlog Q = log10(Q_variant) - log10(Q_reference); for the
//! convective-core mass fraction q_cc, which may be zero, it is the plain difference
//! Delta q_cc = q_cc,variant - q_cc,reference. When the variant differs from the reference by
//! exactly one scale factor f (opacity or nuclear rates), the logarithmic sensitivity is the
//! finite-difference estimate S_Q = dlog Q / dlog f = (log10 Q_v - log10 Q_r) / (log10 f_v -
//! log10 f_r).

use crate::physics::PhysicsSpec;
use crate::structure::ModelSummary;

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

/// Whether the complete choice `variant` differs from the complete choice `reference` in
/// exactly one scale factor (opacity or rates) and in nothing else: every law and parameter
/// equal, one factor different.
pub fn single_factor_change(
    reference: &PhysicsSpec,
    variant: &PhysicsSpec,
) -> Option<FactorChange> {
    let laws_equal = reference.eos == variant.eos
        && reference.opacity == variant.opacity
        && reference.rates == variant.rates
        && reference.convection == variant.convection
        && reference.atmosphere == variant.atmosphere;
    if !laws_equal {
        return None;
    }
    let opacity = (reference.opacity_factor, variant.opacity_factor);
    let rates = (reference.rates_factor, variant.rates_factor);
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

fn dlog(reference: f64, variant: f64) -> Option<f64> {
    (reference > 0.0 && variant > 0.0 && reference.is_finite() && variant.is_finite())
        .then(|| variant.log10() - reference.log10())
}

/// The differences of `variant` against `reference` (see the module documentation).
pub fn differences(reference: &ModelSummary, variant: &ModelSummary) -> Differences {
    let (r, v) = (reference, variant);
    let delta = v.convective_core_mass_fraction - r.convective_core_mass_fraction;
    Differences {
        dlog_luminosity: dlog(r.luminosity_lsun, v.luminosity_lsun),
        dlog_radius: dlog(r.radius_rsun, v.radius_rsun),
        dlog_central_temperature: dlog(r.central_temperature_k, v.central_temperature_k),
        dlog_central_density: dlog(r.central_density_g_cm3, v.central_density_g_cm3),
        delta_convective_core_mass_fraction: delta.is_finite().then_some(delta),
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
    use approx::assert_relative_eq;

    /// A hand-made summary with the compared quantities set (the others NaN).
    fn summary(l: f64, r: f64, tc: f64, rho: f64, qcc: f64) -> ModelSummary {
        let mut s = ModelSummary::from_values(&vec![f64::NAN; ModelSummary::FIELDS.len()])
            .expect("one value per field");
        s.luminosity_lsun = l;
        s.radius_rsun = r;
        s.central_temperature_k = tc;
        s.central_density_g_cm3 = rho;
        s.convective_core_mass_fraction = qcc;
        s
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
        v.radius_rsun = f64::NAN;
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
        let with = |text: &str| -> PhysicsSpec {
            let mut o = crate::physics::PhysicsOverrides::default();
            for item in text.split(';').filter(|s| !s.is_empty()) {
                let (k, v) = item.split_once(':').unwrap_or((item, ""));
                o.set(k, v).unwrap_or_else(|e| panic!("{e}"));
            }
            o.resolve().unwrap_or_else(|e| panic!("{e}"))
        };
        let base = with("");
        let hot = with("opacity-factor:2");
        assert_eq!(
            single_factor_change(&base, &hot),
            Some(FactorChange {
                factor: ScaleFactor::Opacity,
                reference: 1.0,
                variant: 2.0
            })
        );
        // The reference's own factor is the starting point.
        let burn = with("opacity-factor:2;rates-factor:3");
        assert_eq!(
            single_factor_change(&hot, &burn),
            Some(FactorChange {
                factor: ScaleFactor::Rates,
                reference: 1.0,
                variant: 3.0
            })
        );
        // An explicit factor of 1 is the same as none.
        assert_eq!(single_factor_change(&base, &with("opacity-factor:1")), None);
        // Two factors, or a factor and a law, or a law alone: no single factor change.
        assert_eq!(single_factor_change(&base, &burn), None);
        let mixed = with("opacity-factor:2;alpha:1.5");
        assert_eq!(single_factor_change(&base, &mixed), None);
        assert_eq!(single_factor_change(&base, &with("opacity:kramers")), None);
        assert_eq!(single_factor_change(&base, &base), None);
        // A law named explicitly with its default parameters is the same law.
        let same = with("convection:mlt;opacity-factor:2");
        assert!(single_factor_change(&base, &same).is_some());
    }
}
