//! The `probe` report as text (the report itself is computed in [`crate::physics::probe`]).

use crate::physics::probe::ProbeReport;
use std::fmt::Write as _;

impl ProbeReport {
    /// The name of the first reported quantity that is not a finite number, if any (a law
    /// pushed past what floating point holds); the command line refuses such a point.
    pub fn non_finite(&self) -> Option<&'static str> {
        let values = [
            ("P", self.pressure_dyn_cm2),
            ("P_gas", self.gas_pressure_dyn_cm2),
            ("P_rad", self.radiation_pressure_dyn_cm2),
            ("beta", self.beta),
            ("mu", self.mu),
            ("chi_rho", self.chi_rho),
            ("chi_T", self.chi_t),
            ("nabla_ad", self.nabla_ad),
            ("Gamma_1", self.gamma1),
            ("c_P", self.cp_erg_g_k),
            ("delta", self.delta),
            ("degeneracy psi", self.degeneracy_psi.unwrap_or(0.0)),
            ("H ionised", self.hydrogen_ionised),
            ("He singly", self.helium_single),
            ("He doubly", self.helium_double),
            ("kappa", self.opacity_cm2_g),
            ("eps_pp", self.eps_pp_erg_g_s),
            ("eps_CNO", self.eps_cno_erg_g_s),
            ("eps_total", self.eps_total_erg_g_s),
            ("nu_pp", self.nu_pp),
            ("nu_CNO", self.nu_cno),
        ];
        let own = values.into_iter().find(|(_, v)| !v.is_finite());
        let law = self
            .opacity_laws
            .iter()
            .any(|l| l.opacity_cm2_g.is_some_and(|k| !k.is_finite()));
        own.map(|(name, _)| name)
            .or(law.then_some("the kappa of an opacity law"))
    }

    /// Aligned text with units, one quantity per line.
    pub fn to_text(&self) -> String {
        let mut o = String::new();
        let p = &self.physics;
        let _ = writeln!(
            o,
            "point:       rho = {:.4e} g/cm^3, T = {:.4e} K, X = {}, Y = {:.4}, Z = {}",
            self.density_g_cm3, self.temperature_k, self.x, self.y, self.z
        );
        let _ = writeln!(
            o,
            "physics:     {} ({})",
            p.preset,
            super::format::laws_text(p)
        );
        let row = |o: &mut String, name: &str, v: String, unit: &str| {
            let _ = writeln!(o, "{name:<30} {v:>12} {unit}");
        };
        row(
            &mut o,
            "P",
            format!("{:.4e}", self.pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(
            &mut o,
            "P_gas",
            format!("{:.4e}", self.gas_pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(
            &mut o,
            "P_rad",
            format!("{:.4e}", self.radiation_pressure_dyn_cm2),
            "dyn/cm^2",
        );
        row(&mut o, "beta", format!("{:.6}", self.beta), "");
        row(&mut o, "mu", format!("{:.6}", self.mu), "m_u per particle");
        row(&mut o, "chi_rho", format!("{:.6}", self.chi_rho), "");
        row(&mut o, "chi_T", format!("{:.6}", self.chi_t), "");
        row(&mut o, "nabla_ad", format!("{:.6}", self.nabla_ad), "");
        row(&mut o, "Gamma_1", format!("{:.6}", self.gamma1), "");
        row(
            &mut o,
            "c_P",
            format!("{:.4e}", self.cp_erg_g_k),
            "erg/(g K)",
        );
        row(&mut o, "delta", format!("{:.6}", self.delta), "");
        let psi = self
            .degeneracy_psi
            .map_or("none".to_string(), |v| format!("{v:.4}"));
        row(&mut o, "degeneracy psi", psi, "");
        row(
            &mut o,
            "H ionised (H II)",
            format!("{:.6}", self.hydrogen_ionised),
            "",
        );
        row(
            &mut o,
            "He singly (He II)",
            format!("{:.6}", self.helium_single),
            "",
        );
        row(
            &mut o,
            "He doubly (He III)",
            format!("{:.6}", self.helium_double),
            "",
        );
        row(
            &mut o,
            "kappa (set)",
            format!("{:.4e}", self.opacity_cm2_g),
            "cm^2/g",
        );
        for law in &self.opacity_laws {
            let v = match (law.opacity_cm2_g, &law.error) {
                (Some(k), _) => format!("{k:.4e}"),
                (None, _) => "n/a".to_string(),
            };
            let unit = match &law.error {
                Some(e) => format!("cm^2/g ({e})"),
                None => "cm^2/g".to_string(),
            };
            row(&mut o, &format!("  kappa {}", law.law), v, &unit);
        }
        row(
            &mut o,
            "eps_pp",
            format!("{:.4e}", self.eps_pp_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "eps_CNO",
            format!("{:.4e}", self.eps_cno_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "eps_total",
            format!("{:.4e}", self.eps_total_erg_g_s),
            "erg/(g s)",
        );
        row(
            &mut o,
            "nu_pp",
            format!("{:.4}", self.nu_pp),
            "dln eps/dln T",
        );
        row(
            &mut o,
            "nu_CNO",
            format!("{:.4}", self.nu_cno),
            "dln eps/dln T",
        );
        o
    }
}
