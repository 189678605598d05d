//! Output schema of `starpoise modes`: the JSON report, its text rendering and the eigenfunction
//! CSV. Every key and column is documented with its unit; all frequencies are dimensionless:
//! sigma = omega sqrt(R^3/(G M)) (angular) and nu~ = sigma/(2 pi) = nu sqrt(R^3/(G M)) (cyclic).

use super::polytrope::number;
use crate::error::Result;
use crate::oscillation::{Mode, SeismicSummary};
use crate::output::meta::Provenance;
use crate::output::write_output;
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
    /// The equilibrium model: "polytrope".
    pub model: &'static str,
    /// Polytropic index n.
    pub polytropic_index: f64,
    /// Adiabatic exponent Gamma_1 (constant through the model).
    pub gamma1: f64,
    /// Spherical degrees l computed.
    pub degrees: Vec<u32>,
    /// Highest |order| computed.
    pub max_order: u32,
    /// Whether the Cowling approximation was used for l >= 1 (radial modes always include the
    /// potential perturbation).
    pub cowling: bool,
    /// Lane–Emden profile points of the model (its resolution).
    pub profile_points: usize,
    /// Largest phase of the solutions across one collocation step, radians (the solver's
    /// resolution).
    pub phase_per_step: f64,
    /// Units of every frequency in the report.
    pub frequency_unit: &'static str,
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
    /// Normalised mode inertia E = int (xi_r^2 + l(l+1) xi_h^2) dm/(M xi_r(R)^2)
    /// (dimensionless).
    pub inertia: f64,
}

impl ModeRow {
    fn new(m: &Mode) -> Self {
        Self {
            degree: m.degree,
            order: m.order,
            kind: m.kind.as_str(),
            sigma: m.sigma(),
            sigma_squared: m.sigma_squared,
            cyclic_frequency: m.cyclic_frequency(),
            inertia: m.inertia,
        }
    }
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
    /// Cyclic frequency nu~ around which the separations were measured: that of the radial mode
    /// of order max_order - 3 (or the highest); `null` without radial modes.
    pub separations_around: Option<f64>,
    /// Asymptotic g-mode period spacing Pi_0 sqrt(G M/R^3) = 2 pi^2/int N~ dx/x; modes of degree
    /// l are spaced by Pi_0/sqrt(l(l+1)) in period; `null` where N^2 <= 0 everywhere.
    pub period_spacing_asymptotic: Option<f64>,
}

impl ModesReport {
    /// Collect the report.
    pub fn new(meta: ModesMeta, modes: &[Mode], seismic: &SeismicSummary) -> Self {
        Self {
            meta,
            modes: modes.iter().map(ModeRow::new).collect(),
            large_separation_asymptotic: seismic.large_separation_asymptotic,
            large_separation_radial: seismic.large_separation_radial,
            small_separation_d02: seismic.small_separation_d02,
            separations_around: seismic.around,
            period_spacing_asymptotic: seismic.period_spacing_asymptotic,
        }
    }

    /// The report as text for people: the request, one line per mode, the separations.
    pub fn to_text(&self) -> String {
        let m = &self.meta;
        let mut text = String::new();
        let _ = writeln!(
            text,
            "polytrope n = {}, Gamma_1 = {}, {}, {} profile points",
            m.polytropic_index,
            number(m.gamma1),
            if m.cowling {
                "Cowling approximation"
            } else {
                "full problem (with the potential perturbation)"
            },
            m.profile_points
        );
        let _ = writeln!(text, "frequencies: {}", m.frequency_unit);
        let _ = writeln!(
            text,
            "{:>3} {:>5} {:>4} {:>16} {:>16} {:>16} {:>16}",
            "l", "n", "kind", "sigma", "sigma^2", "nu*sqrt(R^3/GM)", "inertia"
        );
        for r in &self.modes {
            let _ = writeln!(
                text,
                "{:>3} {:>5} {:>4} {:>16} {:>16} {:>16} {:>16}",
                r.degree,
                r.order,
                r.kind,
                number(r.sigma),
                number(r.sigma_squared),
                number(r.cyclic_frequency),
                number(r.inertia)
            );
        }
        let optional = |v: Option<f64>| v.map_or_else(|| "n/a".to_string(), number);
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
