//! The unit of every output key and column, read off its name.
//!
//! Every dimensional key carries its unit as the end of its name (`radius_cm`,
//! `density_g_cm3`, `teff_k`, `luminosity_lsun`); [`unit_of`] turns that ending into a unit
//! string in the generic unit grammar that `astropy.units.Unit` and ECSV readers understand
//! (`g / cm3`, `solLum`). A key without a unit ending is a pure number (`x`, `mu`, `nabla_ad`,
//! `eddington_ratio`) and gets the empty string.
//!
//! The solar units are the IAU 2015 Resolution B3 nominal values, as in [`crate::constants`]:
//! `solMass` = GM_sun / G, `solRad` = 6.957e10 cm, `solLum` = 3.828e33 erg s^-1; `yr` is the
//! Julian year of 365.25 days ([`crate::constants::YEAR_S`]).

/// Name endings and their units. A key ends in at most one of these; the longest match wins
/// (`_erg_g_s` before `_s`).
pub const UNIT_SUFFIXES: [(&str, &str); 24] = [
    ("_msun", "solMass"),
    ("_rsun", "solRad"),
    ("_lsun", "solLum"),
    ("_g", "g"),
    ("_cm", "cm"),
    ("_k", "K"),
    ("_s", "s"),
    ("_per_s", "1 / s"),
    ("_uhz", "uHz"),
    ("_yr", "yr"),
    ("_erg", "erg"),
    ("_erg_s", "erg / s"),
    ("_g_cm3", "g / cm3"),
    ("_dyn_cm2", "dyn / cm2"),
    ("_cm2_g", "cm2 / g"),
    ("_erg_g_s", "erg / (g s)"),
    ("_erg_g_k", "erg / (g K)"),
    ("_erg_g", "erg / g"),
    ("_cm_s", "cm / s"),
    ("_cm_s2", "cm / s2"),
    ("_rad_s", "rad / s"),
    ("_rad2_s2", "rad2 / s2"),
    // log10 of a quantity in cm s^-2 (`log_g_cgs`): astropy's logarithmic unit.
    ("_cgs", "dex(cm / s2)"),
    // A difference of log10 values.
    ("_dex", "dex"),
];

/// The unit of the output key or column `key`, from the ending of its name (see
/// [`UNIT_SUFFIXES`]); `""` for a pure number.
pub fn unit_of(key: &str) -> &'static str {
    UNIT_SUFFIXES
        .iter()
        .filter(|(suffix, _)| key.ends_with(suffix))
        .max_by_key(|(suffix, _)| suffix.len())
        .map_or("", |(_, unit)| unit)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::grid::GridRow;
    use crate::output::modes::MODE_COLUMNS;
    use crate::structure::{ModelSummary, PROFILE_COLUMNS};

    /// Every key of the profile, the summary and the sequence table that is a pure number or
    /// text by definition. A new key with a unit ending that [`UNIT_SUFFIXES`] lacks would get
    /// no unit silently; this list makes such a key fail the test instead.
    const UNITLESS: [&str; 53] = [
        // profile
        "m_over_M",
        "r_over_R",
        "nabla_rad",
        "nabla_ad",
        "nabla",
        "convective",
        "mu",
        "gamma1",
        "chi_rho",
        "chi_t",
        "structure_v",
        "structure_u",
        "structure_c1",
        "structure_a_star",
        // summary
        "central_degeneracy",
        "convective_core_mass_fraction",
        "convective_envelope_mass_fraction",
        "cno_luminosity_fraction",
        "eddington_ratio",
        "virial_residual",
        "luminosity_residual",
        // sequence identification and physics columns
        "grid_fingerprint",
        "grid_index",
        "grid_size",
        "variant",
        "converged",
        "status",
        "reason",
        "warnings",
        "x",
        "y",
        "z",
        "preset",
        "eos",
        "opacity",
        "opacity_factor",
        "rates",
        "rates_factor",
        "convection",
        "atmosphere",
        "iterations",
        // JSON summary keys outside the summary quantities
        "physics",
        "fit_mismatch",
        "fit_mass_fraction",
        "rhs_evaluations",
        // modes
        "degree",
        "order",
        "kind",
        "sigma",
        "sigma_squared",
        "cyclic_frequency",
        "inertia",
        "growth_per_radian",
    ];

    #[test]
    fn every_output_key_has_its_unit_or_is_declared_unitless() {
        let keys = PROFILE_COLUMNS
            .iter()
            .copied()
            .chain(ModelSummary::FIELDS.iter().map(|f| f.key))
            .chain(GridRow::columns())
            .chain(MODE_COLUMNS);
        for key in keys {
            let unit = unit_of(key);
            assert_eq!(
                unit.is_empty(),
                UNITLESS.contains(&key),
                "{key}: unit '{unit}' (a unitless key must be listed in UNITLESS)"
            );
        }
    }

    #[test]
    fn longest_ending_wins() {
        assert_eq!(unit_of("eps_pp_erg_g_s"), "erg / (g s)");
        assert_eq!(unit_of("luminosity_erg_s"), "erg / s");
        assert_eq!(unit_of("dynamical_time_s"), "s");
        assert_eq!(unit_of("growth_rate_per_s"), "1 / s");
        assert_eq!(unit_of("frequency_uhz"), "uHz");
        assert_eq!(unit_of("density_g_cm3"), "g / cm3");
        assert_eq!(unit_of("mass_g"), "g");
        assert_eq!(unit_of("brunt_n2_rad2_s2"), "rad2 / s2");
        assert_eq!(unit_of("lamb_l1_rad_s"), "rad / s");
        assert_eq!(unit_of("teff_k"), "K");
        assert_eq!(unit_of("cp_erg_g_k"), "erg / (g K)");
        assert_eq!(unit_of("log_g_cgs"), "dex(cm / s2)");
        assert_eq!(unit_of("dlog_radius_dex"), "dex");
        assert_eq!(unit_of("nabla_ad"), "");
        assert_eq!(unit_of("sound_speed_cm_s"), "cm / s");
        assert_eq!(unit_of("gravity_cm_s2"), "cm / s2");
        assert_eq!(unit_of("potential_erg_g"), "erg / g");
        assert_eq!(unit_of("specific_entropy_erg_g_k"), "erg / (g K)");
    }
}
