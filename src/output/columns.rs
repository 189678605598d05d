//! The columns of the table outputs, one table per output: name, datatype and description, with
//! the unit read off the name by [`crate::units::unit_of`] (a string astropy's unit parser reads,
//! `""` for a pure number). The CSV `# units:` line, the ECSV header and the JSON `units` object
//! all come from these tables; tests check that every column an output writes has an entry.

use crate::structure::ModelSummary;

/// The type of a column's values (ECSV datatypes).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum DataType {
    /// A floating-point number.
    Float64,
    /// A whole number.
    Int64,
    /// A small whole number (0 or 1 for flags).
    UInt8,
    /// true or false.
    Bool,
    /// Text.
    String,
}

impl DataType {
    /// The ECSV name of the datatype.
    pub fn ecsv(self) -> &'static str {
        match self {
            DataType::Float64 => "float64",
            DataType::Int64 => "int64",
            DataType::UInt8 => "uint8",
            DataType::Bool => "bool",
            DataType::String => "string",
        }
    }

    /// The datatype of an ECSV name (those this program writes).
    pub fn from_ecsv(name: &str) -> Option<Self> {
        [
            DataType::Float64,
            DataType::Int64,
            DataType::UInt8,
            DataType::Bool,
            DataType::String,
        ]
        .into_iter()
        .find(|d| d.ecsv() == name)
    }
}

/// One column of a table output.
#[derive(Debug, Clone, PartialEq)]
pub struct Column {
    /// The name: CSV header, ECSV column name, JSON key.
    pub name: String,
    /// The unit, as astropy's unit parser reads it (`"g / cm3"`, `"erg / s"`, `"K"`); `""` for
    /// a pure number or text.
    pub unit: String,
    /// The type of the values.
    pub datatype: DataType,
    /// What it is.
    pub description: String,
}

impl Column {
    /// The column `name`, its unit read off the name ([`crate::units::unit_of`]).
    fn new(name: &str, datatype: DataType, description: &str) -> Self {
        Self {
            name: name.to_string(),
            unit: crate::units::unit_of(name).to_string(),
            datatype,
            description: description.to_string(),
        }
    }
}

/// The `units` object of a table: column name to unit.
pub fn units_json(columns: &[Column]) -> serde_json::Value {
    serde_json::Value::Object(
        columns
            .iter()
            .map(|c| (c.name.clone(), serde_json::Value::String(c.unit.clone())))
            .collect(),
    )
}

/// The columns of a ZAMS profile, in the order of [`crate::structure::PROFILE_COLUMNS`].
pub fn profile_columns() -> Vec<Column> {
    use DataType::{Float64, UInt8};
    let table: [(&str, DataType, &str); 34] = [
        ("mass_g", Float64, "mass inside the shell"),
        ("m_over_M", Float64, "m / M"),
        ("radius_cm", Float64, "radius"),
        ("r_over_R", Float64, "r / R"),
        ("pressure_dyn_cm2", Float64, "total pressure"),
        ("temperature_k", Float64, "temperature"),
        ("density_g_cm3", Float64, "density"),
        ("luminosity_erg_s", Float64, "luminosity through the shell"),
        ("eps_pp_erg_g_s", Float64, "pp-chain energy generation rate"),
        (
            "eps_cno_erg_g_s",
            Float64,
            "CNO-cycle energy generation rate",
        ),
        ("opacity_cm2_g", Float64, "Rosseland-mean opacity"),
        ("nabla_rad", Float64, "radiative gradient"),
        ("nabla_ad", Float64, "adiabatic gradient"),
        ("nabla", Float64, "actual gradient dln T / dln P"),
        (
            "convective",
            UInt8,
            "1 where nabla_rad > nabla_ad (Schwarzschild), else 0",
        ),
        ("mu", Float64, "mean molecular weight of the gas, in m_u"),
        ("gamma1", Float64, "first adiabatic exponent"),
        (
            "brunt_n2_rad2_s2",
            Float64,
            "Brunt-Vaisala frequency squared N^2 = g^2 rho delta (nabla_ad - nabla) / P",
        ),
        (
            "lamb_l1_rad_s",
            Float64,
            "Lamb frequency S_1 = sqrt(2) c_s / r",
        ),
        (
            "lamb_l2_rad_s",
            Float64,
            "Lamb frequency S_2 = sqrt(6) c_s / r",
        ),
        (
            "sound_speed_cm_s",
            Float64,
            "adiabatic sound speed sqrt(Gamma_1 P / rho)",
        ),
        ("chi_rho", Float64, "(dln P / dln rho)_T"),
        ("chi_t", Float64, "(dln P / dln T)_rho"),
        (
            "specific_energy_erg_g",
            Float64,
            "specific internal energy, counted from the fully ionised plasma at rest",
        ),
        (
            "specific_entropy_erg_g_k",
            Float64,
            "specific entropy, absolute (Sackur-Tetrode species plus radiation)",
        ),
        ("gravity_cm_s2", Float64, "local gravity G m / r^2"),
        (
            "potential_erg_g",
            Float64,
            "gravitational potential, zero at infinity",
        ),
        (
            "structure_v",
            Float64,
            "V = -dln P / dln r = G m rho / (r P)",
        ),
        (
            "structure_u",
            Float64,
            "U = dln m / dln r = 4 pi r^3 rho / m",
        ),
        ("structure_c1", Float64, "c1 = (r/R)^3 / (m/M)"),
        (
            "structure_a_star",
            Float64,
            "A* = (1/Gamma_1) dln P/dln r - dln rho/dln r = r N^2 / g",
        ),
        ("x", Float64, "hydrogen mass fraction X"),
        ("y", Float64, "helium mass fraction Y"),
        ("z", Float64, "metal mass fraction Z"),
    ];
    table
        .iter()
        .map(|&(n, d, t)| Column::new(n, d, t))
        .collect()
}

/// The columns of a sequence table, in the order of [`crate::grid::GridRow::columns`].
pub fn sequence_columns() -> Vec<Column> {
    use DataType::{Bool, Float64, Int64, String};
    let own: [(&str, DataType, &str); 21] = [
        ("grid_fingerprint", String,
            "fingerprint of the whole grid's definition (the same in every shard of one grid)",
        ),
        ("grid_index", Int64, "position in the whole grid (0-based: variant, Z, X, mass)"),
        ("grid_size", Int64, "number of points in the whole grid"),
        ("variant", String, "physics variant name"),
        ("converged", Bool, "whether the model converged (status converged or continued)"),
        ("status", String,
            "converged, continued (from a neighbour's solution), failed, or why the iteration stopped",
        ),
        ("reason", String, "why the model did not converge (empty when it did)"),
        ("warnings", String,
            "a converged model's warnings (laws used outside their validity, and cautions: a grey atmosphere below 4000 K, 3He slow to reach equilibrium), separated by ' | ' (empty: none)",
        ),
        ("mass_msun", Float64, "stellar mass"),
        ("x", Float64, "hydrogen mass fraction X"),
        ("y", Float64, "helium mass fraction Y = 1 - X - Z"),
        ("z", Float64, "metal mass fraction Z"),
        ("preset", String, "physics preset the variant started from"),
        ("eos", String, "equation of state, with its parameters"),
        ("opacity", String, "opacity law, with its parameters"),
        ("opacity_factor", Float64, "factor multiplying the opacity"),
        ("rates", String, "energy-generation law, with its parameters"),
        ("rates_factor", Float64, "factor multiplying the energy-generation rate"),
        ("convection", String, "convection law, with its parameters"),
        ("atmosphere", String, "outer boundary"),
        ("iterations", Int64,
            "Newton iterations (also for a model that did not converge; empty if none ran)",
        ),
    ];
    let mut columns: Vec<Column> = own.iter().map(|&(n, d, t)| Column::new(n, d, t)).collect();
    columns.extend(
        ModelSummary::FIELDS
            .iter()
            .map(|f| Column::new(f.key, Float64, f.doc.trim_end_matches('.'))),
    );
    columns
}

/// The columns of a polytrope profile: the dimensionless ones, and with `scaled` those of the
/// star.
pub fn polytrope_columns(scaled: bool) -> Vec<Column> {
    use DataType::Float64;
    let dimensionless = [
        ("xi", "dimensionless radius xi"),
        ("theta", "theta(xi), rho = rho_c theta^n"),
        ("dtheta_dxi", "dtheta / dxi"),
    ];
    let star = [
        ("radius_cm", "radius"),
        ("r_over_R", "r / R"),
        ("mass_g", "mass inside r"),
        ("m_over_M", "m / M"),
        ("density_g_cm3", "density"),
        ("pressure_dyn_cm2", "total pressure"),
        ("temperature_k", "temperature"),
    ];
    let n = if scaled { star.len() } else { 0 };
    dimensionless
        .iter()
        .chain(&star[..n])
        .map(|&(name, text)| Column::new(name, Float64, text))
        .collect()
}

/// The columns of a `compare` record, in the order of its fields.
pub fn compare_columns() -> Vec<Column> {
    use DataType::{Bool, Float64, String};
    let table: [(&str, DataType, &str); 28] = [
        ("mass_msun", Float64, "stellar mass"),
        ("x", Float64, "hydrogen mass fraction X"),
        ("y", Float64, "helium mass fraction Y = 1 - X - Z"),
        ("z", Float64, "metal mass fraction Z"),
        ("variant", String, "variant name"),
        (
            "spec",
            String,
            "the variant's SPEC as given (empty: the base set)",
        ),
        (
            "reference",
            Bool,
            "whether this is the reference variant (the first)",
        ),
        ("status", String, "status code, as in the sequence table"),
        (
            "reason",
            String,
            "why the model did not converge (empty when it did)",
        ),
        (
            "warnings",
            String,
            "a converged model's warnings (laws used outside their validity, and cautions: a grey atmosphere below 4000 K, 3He slow to reach equilibrium), separated by ' | ' (empty: none)",
        ),
        ("luminosity_lsun", Float64, "luminosity"),
        ("radius_rsun", Float64, "radius"),
        ("teff_k", Float64, "effective temperature"),
        ("central_temperature_k", Float64, "central temperature"),
        ("central_density_g_cm3", Float64, "central density"),
        (
            "convective_core_mass_fraction",
            Float64,
            "convective-core mass fraction of M",
        ),
        ("dlog_luminosity_dex", Float64, "log10(L / L_reference)"),
        ("dlog_radius_dex", Float64, "log10(R / R_reference)"),
        (
            "dlog_central_temperature_dex",
            Float64,
            "log10(T_c / T_c,reference)",
        ),
        (
            "dlog_central_density_dex",
            Float64,
            "log10(rho_c / rho_c,reference)",
        ),
        (
            "delta_convective_core_mass_fraction",
            Float64,
            "convective-core mass fraction minus the reference's",
        ),
        (
            "varied_factor",
            String,
            "the one scale factor changed against the reference, if exactly one is",
        ),
        ("factor_reference", Float64, "that factor in the reference"),
        ("factor_variant", Float64, "that factor in this variant"),
        (
            "sensitivity_luminosity",
            Float64,
            "dlog10 L / dlog10 factor",
        ),
        ("sensitivity_radius", Float64, "dlog10 R / dlog10 factor"),
        (
            "sensitivity_central_temperature",
            Float64,
            "dlog10 T_c / dlog10 factor",
        ),
        (
            "sensitivity_central_density",
            Float64,
            "dlog10 rho_c / dlog10 factor",
        ),
    ];
    table
        .iter()
        .map(|&(n, d, t)| Column::new(n, d, t))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::grid::GridRow;
    use crate::structure::PROFILE_COLUMNS;

    #[test]
    fn every_column_of_every_table_has_a_unit_entry() {
        assert!(profile_columns()
            .iter()
            .map(|c| c.name.as_str())
            .eq(PROFILE_COLUMNS));
        assert!(sequence_columns()
            .iter()
            .map(|c| c.name.as_str())
            .eq(GridRow::columns()));
        let unit = |cs: Vec<Column>, name: &str| {
            cs.into_iter()
                .find(|c| c.name == name)
                .map(|c| c.unit)
                .unwrap_or_default()
        };
        assert_eq!(unit(profile_columns(), "density_g_cm3"), "g / cm3");
        assert_eq!(unit(sequence_columns(), "luminosity_lsun"), "solLum");
        assert_eq!(unit(compare_columns(), "dlog_radius_dex"), "dex");
        assert_eq!(unit(polytrope_columns(true), "temperature_k"), "K");
    }
}
