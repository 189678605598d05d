//! Output schema of `starpoise modes`: the JSON report, its text rendering and the eigenfunction
//! CSV. Every key and column is documented with its unit. Frequencies are dimensionless:
//! sigma = omega sqrt(R^3/(G M)) (angular) and nu~ = sigma/(2 pi) = nu sqrt(R^3/(G M)) (cyclic);
//! for a ZAMS model they are also given in uHz (keys ending in `_uhz`), with the quasi-adiabatic
//! growth rates of the radial modes and the solar-scaled relations for comparison.

use super::polytrope::number;
use crate::error::Result;
use crate::oscillation::{Mode, RadialStability, SeismicSummary, StarModes};
use crate::output::meta::Provenance;
use crate::output::write_output;
use crate::physics::PhysicsSpec;
use crate::reference::{kjeldsen_bedding_large_separation_uhz, kjeldsen_bedding_nu_max_uhz};
use crate::structure::ZamsModel;
use serde::Serialize;
use std::fmt::Write as _;
use std::path::Path;

/// What was computed: the provenance (`program`, `version`, `command`, `constants`; module
/// `output::meta`) and the request, after validation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModesMeta {
    /// Program, version, command line and the sources of the constants.
    #[serde(flatten)]
    pub provenance: Provenance,
    /// The equilibrium model: "polytrope" or "zams".
    pub model: &'static str,
    /// Polytropic index n (polytropes only).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub polytropic_index: Option<f64>,
    /// Adiabatic exponent Gamma_1, constant through the model (polytropes only).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub gamma1: Option<f64>,
    /// The star (ZAMS models only).
    #[serde(flatten, skip_serializing_if = "Option::is_none")]
    pub star: Option<StarMeta>,
    /// Spherical degrees l computed.
    pub degrees: Vec<u32>,
    /// Highest |order| computed.
    pub max_order: u32,
    /// Whether the Cowling approximation was used for l >= 1 (radial modes always include the
    /// potential perturbation).
    pub cowling: bool,
    /// Profile points of the model: Lane–Emden points of a polytrope, profile rows of a ZAMS
    /// model (its resolution).
    pub profile_points: usize,
    /// Largest phase of the solutions across one collocation step, radians (the solver's
    /// resolution).
    pub phase_per_step: f64,
    /// Units of every frequency in the report.
    pub frequency_unit: &'static str,
}

/// The ZAMS star whose modes are reported.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StarMeta {
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Hydrogen mass fraction.
    pub x: f64,
    /// Metal mass fraction.
    pub z: f64,
    /// The laws (a model-file fragment).
    pub physics: PhysicsSpec,
    /// Photospheric radius, R_sun (the outer boundary of the oscillation model).
    pub radius_rsun: f64,
    /// Luminosity, L_sun.
    pub luminosity_lsun: f64,
    /// Effective temperature, K.
    pub teff_k: f64,
}

/// One mode in the report.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModeRow {
    /// Spherical degree l.
    pub degree: u32,
    /// Order n: radial fundamental 1, f modes 0, g modes negative (Eckart–Scuflaire–Osaki,
    /// dipole modes by the first integral of dipole motion).
    pub order: i32,
    /// "p", "f" or "g".
    pub kind: &'static str,
    /// sigma = omega sqrt(R^3/(G M)) (dimensionless).
    pub sigma: f64,
    /// sigma^2 (dimensionless).
    pub sigma_squared: f64,
    /// Cyclic frequency nu sqrt(R^3/(G M)) = sigma/(2 pi) (dimensionless).
    pub cyclic_frequency: f64,
    /// Cyclic frequency nu, uHz (ZAMS models only).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub frequency_uhz: Option<f64>,
    /// Normalised mode inertia E = int (xi_r^2 + l(l+1) xi_h^2) dm/(M xi_r(R)^2)
    /// (dimensionless).
    pub inertia: f64,
    /// Amplitude growth rate eta of the quasi-adiabatic work integral, s^-1, positive if the mode
    /// is vibrationally unstable (radial modes of ZAMS models only; `oscillation::stability`,
    /// with the convective flux frozen: not meaningful where a convective envelope dominates
    /// the damping, as in the Sun).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub growth_rate_per_s: Option<f64>,
    /// eta/omega, the growth per radian of oscillation (dimensionless; as `growth_rate_per_s`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub growth_per_radian: Option<f64>,
}

impl ModeRow {
    fn new(m: &Mode, star: Option<&StarScales>, stability: Option<&RadialStability>) -> Self {
        Self {
            degree: m.degree,
            order: m.order,
            kind: m.kind.as_str(),
            sigma: m.sigma(),
            sigma_squared: m.sigma_squared,
            cyclic_frequency: m.cyclic_frequency(),
            frequency_uhz: star.map(|s| m.frequency_uhz(s.mass_msun, s.radius_rsun)),
            inertia: m.inertia,
            growth_rate_per_s: stability.map(|g| g.growth_rate_per_s),
            growth_per_radian: stability.map(|g| g.growth_per_radian),
        }
    }
}

/// The physical scales of a ZAMS model, and the stability of its radial modes, for the report.
#[derive(Debug, Clone, PartialEq)]
pub struct StarScales {
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Photospheric radius, R_sun.
    pub radius_rsun: f64,
    /// Effective temperature, K.
    pub teff_k: f64,
    /// For each mode of the report, in the same order: the stability of a radial mode, `None`
    /// for the others.
    pub stability: Vec<Option<RadialStability>>,
}

impl StarScales {
    /// 1 in the dimensionless cyclic unit, in uHz: sqrt(G M/R^3) 1e6.
    fn uhz(&self) -> f64 {
        crate::oscillation::dynamical_frequency_hz(self.mass_msun, self.radius_rsun) * 1e6
    }
}

/// The seismic quantities of a ZAMS model in physical units.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PhysicalSeismic {
    /// Large separation from the radial modes within 3 orders of the one nearest
    /// `separations_around_uhz` (least-squares slope of nu against order), uHz; `null` without
    /// two radial modes.
    pub large_separation_uhz: Option<f64>,
    /// Asymptotic large separation (2 int_0^R dr/c)^-1, uHz.
    pub large_separation_asymptotic_uhz: f64,
    /// d02 = nu(n, 0) - nu(n-1, 2) at the radial mode nearest `separations_around_uhz`, uHz;
    /// `null` without degrees 0 and 2.
    pub small_separation_d02_uhz: Option<f64>,
    /// Frequency around which the separations are measured, uHz: that of the radial mode
    /// nearest `nu_max_scaling_uhz` if nu_max lies within the radial modes computed, else that of
    /// order max_order - 3 (or the highest).
    pub separations_around_uhz: Option<f64>,
    /// Asymptotic g-mode period spacing Pi_0 = 2 pi^2/int N dr/r, s; `null` where N^2 <= 0
    /// everywhere.
    pub period_spacing_asymptotic_s: Option<f64>,
    /// Large separation from the solar-scaled relation of Kjeldsen & Bedding (1995, A&A 293,
    /// 87) at the model's M and R, 134.9 uHz (M/M_sun)^(1/2) (R/R_sun)^(-3/2), for comparison.
    pub large_separation_scaling_uhz: f64,
    /// Frequency of maximum power from the solar-scaled relation of Kjeldsen & Bedding (1995)
    /// at the model's M, R and T_eff, 3.05 mHz (M/M_sun)(R/R_sun)^-2 (T_eff/5777 K)^(-1/2), uHz.
    pub nu_max_scaling_uhz: f64,
}

/// The keys of one mode of the report ([`ModeRow`]), in order: the columns of a table of modes.
pub const MODE_COLUMNS: [&str; 10] = [
    "degree",
    "order",
    "kind",
    "sigma",
    "sigma_squared",
    "cyclic_frequency",
    "frequency_uhz",
    "inertia",
    "growth_rate_per_s",
    "growth_per_radian",
];

/// What a request for a ZAMS model's modes asked, for the report's meta.
#[derive(Debug, Clone, PartialEq)]
pub struct ModesRequestMeta {
    /// Program, version, command line (or Python call) and the sources of the constants.
    pub provenance: Provenance,
    /// Spherical degrees l computed.
    pub degrees: Vec<u32>,
    /// Highest |order| computed.
    pub max_order: u32,
    /// Whether the Cowling approximation was used for l >= 1.
    pub cowling: bool,
    /// Profile rows of the model.
    pub profile_points: usize,
    /// Largest phase of the solutions across one collocation step, radians.
    pub phase_per_step: f64,
}

/// The unit of the frequencies of a ZAMS model's report.
pub const ZAMS_FREQUENCY_UNIT: &str = "sigma = omega sqrt(R^3/(G M)); cyclic nu sqrt(R^3/(G M)) = sigma/(2 pi); nu in uHz with the photospheric R";

/// The report of the spectrum `spectrum` of the ZAMS model `model` (`modes --mass`, and
/// `Star.modes` in Python).
pub fn zams_modes_report(
    model: &ZamsModel,
    spectrum: &StarModes,
    request: ModesRequestMeta,
) -> ModesReport {
    let s = &model.summary;
    let (mass_msun, radius_rsun) = (model.mass_msun(), s.radius_rsun);
    let star = StarScales {
        mass_msun,
        radius_rsun,
        teff_k: s.teff_k,
        stability: spectrum.stability.clone(),
    };
    let c = model.composition();
    let meta = ModesMeta {
        provenance: request.provenance,
        model: "zams",
        polytropic_index: None,
        gamma1: None,
        star: Some(StarMeta {
            mass_msun,
            x: c.x(),
            z: c.z(),
            physics: model.physics().clone(),
            radius_rsun,
            luminosity_lsun: s.luminosity_lsun,
            teff_k: s.teff_k,
        }),
        degrees: request.degrees,
        max_order: request.max_order,
        cowling: request.cowling,
        profile_points: request.profile_points,
        phase_per_step: request.phase_per_step,
        frequency_unit: ZAMS_FREQUENCY_UNIT,
    };
    ModesReport::new(meta, &spectrum.modes, &spectrum.seismic, Some(&star))
}

/// The JSON object printed by `starpoise modes --format json`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModesReport {
    /// The request.
    pub meta: ModesMeta,
    /// Every mode found, by degree, then by frequency.
    pub modes: Vec<ModeRow>,
    /// Asymptotic large separation Delta nu sqrt(R^3/(G M)) = (2 int_0^1 dx/c~)^-1.
    pub large_separation_asymptotic: f64,
    /// Large separation from a least-squares fit of nu~ against order over the radial modes
    /// within 3 orders of the one nearest `separations_around` (dimensionless cyclic); `null`
    /// without radial modes.
    pub large_separation_radial: Option<f64>,
    /// d02 = nu~(n, 0) - nu~(n-1, 2) at the radial mode nearest `separations_around`; `null`
    /// without degrees 0 and 2.
    pub small_separation_d02: Option<f64>,
    /// Cyclic frequency nu~ around which the separations were measured (see
    /// `separations_around_uhz` for ZAMS models; for polytropes that of the radial mode of
    /// order max_order - 3, or the highest); `null` without radial modes.
    pub separations_around: Option<f64>,
    /// Asymptotic g-mode period spacing Pi_0 sqrt(G M/R^3) = 2 pi^2/int N~ dx/x; modes of degree
    /// l are spaced by Pi_0/sqrt(l(l+1)) in period; `null` where N^2 <= 0 everywhere.
    pub period_spacing_asymptotic: Option<f64>,
    /// The same in physical units, with the solar-scaled relations (ZAMS models only; keys
    /// flattened into the report).
    #[serde(flatten, skip_serializing_if = "Option::is_none")]
    pub physical: Option<PhysicalSeismic>,
}

impl ModesReport {
    /// Collect the report; `star` gives the physical scales (ZAMS models).
    pub fn new(
        meta: ModesMeta,
        modes: &[Mode],
        seismic: &SeismicSummary,
        star: Option<&StarScales>,
    ) -> Self {
        let rows = modes
            .iter()
            .enumerate()
            .map(|(i, m)| {
                let stability = star.and_then(|s| s.stability.get(i).copied().flatten());
                ModeRow::new(m, star, stability.as_ref())
            })
            .collect();
        let physical = star.map(|s| {
            let uhz = s.uhz();
            PhysicalSeismic {
                large_separation_uhz: seismic.large_separation_radial.map(|v| v * uhz),
                large_separation_asymptotic_uhz: seismic.large_separation_asymptotic * uhz,
                small_separation_d02_uhz: seismic.small_separation_d02.map(|v| v * uhz),
                separations_around_uhz: seismic.around.map(|v| v * uhz),
                period_spacing_asymptotic_s: seismic
                    .period_spacing_asymptotic
                    .map(|v| v * 1e6 / uhz),
                large_separation_scaling_uhz: kjeldsen_bedding_large_separation_uhz(
                    s.mass_msun,
                    s.radius_rsun,
                ),
                nu_max_scaling_uhz: kjeldsen_bedding_nu_max_uhz(
                    s.mass_msun,
                    s.radius_rsun,
                    s.teff_k,
                ),
            }
        });
        Self {
            meta,
            modes: rows,
            large_separation_asymptotic: seismic.large_separation_asymptotic,
            large_separation_radial: seismic.large_separation_radial,
            small_separation_d02: seismic.small_separation_d02,
            separations_around: seismic.around,
            period_spacing_asymptotic: seismic.period_spacing_asymptotic,
            physical,
        }
    }

    /// The report as text for people: the request, one line per mode, the separations.
    pub fn to_text(&self) -> String {
        let m = &self.meta;
        let mut text = String::new();
        let problem = if m.cowling {
            "Cowling approximation"
        } else {
            "full problem (with the potential perturbation)"
        };
        match (&m.star, m.polytropic_index, m.gamma1) {
            (Some(star), _, _) => {
                let _ = writeln!(
                    text,
                    "ZAMS model, M = {} M_sun, X = {}, Z = {}, {} physics; R = {} R_sun, L = {} \
                     L_sun, T_eff = {} K; {problem}, {} profile rows",
                    number(star.mass_msun),
                    star.x,
                    star.z,
                    star.physics.preset,
                    number(star.radius_rsun),
                    number(star.luminosity_lsun),
                    number(star.teff_k),
                    m.profile_points
                );
            }
            (None, Some(n), Some(g)) => {
                let _ = writeln!(
                    text,
                    "polytrope n = {n}, Gamma_1 = {}, {problem}, {} profile points",
                    number(g),
                    m.profile_points
                );
            }
            _ => {}
        }
        let _ = writeln!(text, "frequencies: {}", m.frequency_unit);
        let physical = self.physical.is_some();
        if physical {
            let _ = writeln!(
                text,
                "{:>3} {:>5} {:>4} {:>16} {:>16} {:>16} {:>16}",
                "l", "n", "kind", "sigma", "nu (uHz)", "inertia", "growth (1/s)"
            );
        } else {
            let _ = writeln!(
                text,
                "{:>3} {:>5} {:>4} {:>16} {:>16} {:>16} {:>16}",
                "l", "n", "kind", "sigma", "sigma^2", "nu*sqrt(R^3/GM)", "inertia"
            );
        }
        for r in &self.modes {
            let columns = if physical {
                [
                    number(r.sigma),
                    r.frequency_uhz.map_or_else(String::new, number),
                    number(r.inertia),
                    r.growth_rate_per_s.map_or_else(String::new, number),
                ]
            } else {
                [
                    number(r.sigma),
                    number(r.sigma_squared),
                    number(r.cyclic_frequency),
                    number(r.inertia),
                ]
            };
            let _ = writeln!(
                text,
                "{:>3} {:>5} {:>4} {:>16} {:>16} {:>16} {:>16}",
                r.degree, r.order, r.kind, columns[0], columns[1], columns[2], columns[3]
            );
        }
        let optional = |v: Option<f64>| v.map_or_else(|| "n/a".to_string(), number);
        match &self.physical {
            Some(p) => {
                let _ = writeln!(
                    text,
                    "large separation, radial orders near nu = {} uHz: {} uHz",
                    optional(p.separations_around_uhz),
                    optional(p.large_separation_uhz)
                );
                let _ = writeln!(
                    text,
                    "large separation, asymptotic (2 int dr/c)^-1: {} uHz",
                    number(p.large_separation_asymptotic_uhz)
                );
                let _ = writeln!(
                    text,
                    "large separation, Kjeldsen & Bedding 1995 scaling at this M, R: {} uHz",
                    number(p.large_separation_scaling_uhz)
                );
                let _ = writeln!(
                    text,
                    "nu_max, Kjeldsen & Bedding 1995 scaling at this M, R, T_eff: {} uHz",
                    number(p.nu_max_scaling_uhz)
                );
                let _ = writeln!(
                    text,
                    "small separation d02 there: {} uHz",
                    optional(p.small_separation_d02_uhz)
                );
                let _ = writeln!(
                    text,
                    "g-mode period spacing Pi_0, asymptotic: {} s",
                    optional(p.period_spacing_asymptotic_s)
                );
                let _ = writeln!(
                    text,
                    "growth: quasi-adiabatic amplitude growth rate of the radial modes (positive: \
                     vibrationally unstable; frozen convection, so not meaningful where a \
                     convective envelope dominates the damping, as in the Sun)"
                );
            }
            None => {
                let _ = writeln!(
                    text,
                    "large separation, asymptotic (2 int dr/c)^-1: {}",
                    number(self.large_separation_asymptotic)
                );
                let _ = writeln!(
                    text,
                    "large separation, radial orders near nu = {}: {}",
                    optional(self.separations_around),
                    optional(self.large_separation_radial)
                );
                let _ = writeln!(
                    text,
                    "small separation d02 there: {}",
                    optional(self.small_separation_d02)
                );
                let _ = writeln!(
                    text,
                    "g-mode period spacing Pi_0, asymptotic: {}",
                    optional(self.period_spacing_asymptotic)
                );
            }
        }
        text
    }
}

/// One CSV row of an eigenfunction.
#[derive(Debug, Serialize)]
struct EigenfunctionRow {
    /// Degree l.
    degree: u32,
    /// Order n.
    order: i32,
    /// x = r/R.
    x: f64,
    /// Radial displacement xi_r/R, normalised to xi_r(R) = R.
    xi_r: f64,
    /// Horizontal displacement amplitude xi_h/R (same normalisation).
    xi_h: f64,
    /// Eulerian pressure perturbation p', units of G M^2/R^4.
    p_prime: f64,
    /// Eulerian potential perturbation Phi', units of G M/R (0 in the Cowling approximation).
    phi_prime: f64,
}

/// Write the eigenfunctions of `modes` (those that carry them) to `path` as one CSV table with
/// the columns degree, order, x, xi_r, xi_h, p_prime, phi_prime (units above), after the
/// provenance as leading `# key: value` lines, atomically.
pub fn write_eigenfunctions_csv(
    path: &Path,
    modes: &[Mode],
    provenance: &Provenance,
) -> Result<()> {
    write_output(path, |w| {
        for line in provenance.comment_lines() {
            writeln!(w, "{line}")?;
        }
        let mut csv = csv::Writer::from_writer(w);
        for m in modes {
            let Some(e) = &m.eigenfunction else { continue };
            for i in 0..e.x.len() {
                csv.serialize(EigenfunctionRow {
                    degree: m.degree,
                    order: m.order,
                    x: e.x[i],
                    xi_r: e.xi_r[i],
                    xi_h: e.xi_h[i],
                    p_prime: e.p_prime[i],
                    phi_prime: e.phi_prime[i],
                })
                .map_err(std::io::Error::other)?;
            }
        }
        csv.flush()
    })
}
