//! The oscillation spectrum of a ZAMS model, as one call: the model's profile as an oscillation
//! model ([`super::zams::tabulated_from_profile`]), the modes of the degrees asked
//! ([`super::find_modes`]), the quasi-adiabatic growth rates of the radial modes
//! ([`super::radial_stability`]) and the seismic summary ([`super::SeismicSummary`]) measured
//! near nu_max of the solar-scaled relation (Kjeldsen & Bedding 1995, A&A 293, 87). The
//! command line (`modes --mass`) and the Python module both call it.

use super::search::{
    find_modes, find_modes_of_degrees, OscillationSettings, MAX_DEGREE, MAX_ORDER,
};
use super::spectrum::{dynamical_frequency_hz, Mode, SeismicSummary};
use super::stability::{radial_stability, RadialStability};
use super::zams::tabulated_from_profile;
use crate::error::{Error, Result};
use crate::reference::kjeldsen_bedding_nu_max_uhz;
use crate::structure::ZamsModel;

/// Orders of the radial window below the highest computed where the separations are measured
/// when nu_max lies outside the radial modes found.
pub const SEPARATION_OFFSET: i32 = 3;

/// Profile rows of a ZAMS model read for its modes unless asked otherwise: the frequencies of a
/// 1 M_sun model agree with those on 16000 rows at half the phase per step to 8e-9
/// (tests/oscillation_zams.rs).
pub const DEFAULT_PROFILE_ROWS: usize = 2000;

/// The degrees asked, sorted and without repeats, each from 0 to [`MAX_DEGREE`], and
/// `max_order` from 1 to [`MAX_ORDER`], as the types the search takes (the command line and the
/// Python module pass what they were given). Errors ([`Error::InvalidInput`]) name the keys
/// `degrees` and `max_order`.
pub fn checked_degrees(degrees: &[i64], max_order: i64) -> Result<(Vec<u32>, u32)> {
    let mut sorted = degrees.to_vec();
    sorted.sort_unstable();
    sorted.dedup();
    let degree = |l: i64| u32::try_from(l).ok().filter(|&l| l <= MAX_DEGREE);
    if let Some(&l) = sorted.iter().find(|&&l| degree(l).is_none()) {
        return Err(Error::invalid(
            "degrees",
            l,
            &format!("degrees are integers from 0 to {MAX_DEGREE}, e.g. 0,1,2,3"),
        ));
    }
    if sorted.is_empty() {
        return Err(Error::invalid(
            "degrees",
            "(none)",
            "give at least one degree, e.g. 0,1,2,3",
        ));
    }
    let Some(max_order) = u32::try_from(max_order)
        .ok()
        .filter(|n| (1..=MAX_ORDER).contains(n))
    else {
        return Err(Error::invalid(
            "max_order",
            max_order,
            &format!("the highest order must be an integer from 1 to {MAX_ORDER}, e.g. 25"),
        ));
    };
    Ok((sorted.into_iter().filter_map(degree).collect(), max_order))
}

/// The spectrum of a ZAMS model.
#[derive(Debug, Clone)]
pub struct StarModes {
    /// The modes, radial first, then by degree and order.
    pub modes: Vec<Mode>,
    /// The quasi-adiabatic stability of each mode, in the order of `modes` (`None` for l > 0).
    pub stability: Vec<Option<RadialStability>>,
    /// Separations and asymptotic quantities.
    pub seismic: SeismicSummary,
    /// nu_max of the solar-scaled relation at the model's M, R and T_eff, uHz.
    pub nu_max_scaling_uhz: f64,
}

/// The modes of `degrees` up to order `max_order` of `model`, read from its profile on
/// `points` rows, with `settings` (a radial mode's eigenfunction is kept only if `settings`
/// asks for eigenfunctions; the growth rates are computed either way).
pub fn star_modes(
    model: &ZamsModel,
    points: usize,
    degrees: &[u32],
    max_order: u32,
    settings: &OscillationSettings,
) -> Result<StarModes> {
    let rows = model.profile(points)?;
    let oscillation_model = tabulated_from_profile(&rows)?;
    // Radial modes carry their eigenfunctions for the work integral.
    let radial_settings = settings.with_eigenfunctions(true);
    let others: Vec<u32> = degrees.iter().copied().filter(|&l| l > 0).collect();
    let (radial, rest) = rayon::join(
        || -> Result<Vec<Mode>> {
            if degrees.contains(&0) {
                find_modes(&oscillation_model, 0, max_order, &radial_settings)
            } else {
                Ok(Vec::new())
            }
        },
        || find_modes_of_degrees(&oscillation_model, &others, max_order, settings),
    );
    let mut modes = radial?;
    let physics = model.settings().physics();
    let mut stability: Vec<Option<RadialStability>> = modes
        .iter()
        .map(|m| {
            radial_stability(&rows, &oscillation_model, m, physics, model.composition()).map(Some)
        })
        .collect::<Result<_>>()?;
    if !settings.eigenfunctions() {
        for m in &mut modes {
            m.eigenfunction = None;
        }
    }
    let rest = rest?;
    stability.extend(rest.iter().map(|_| None));
    modes.extend(rest);
    let s = &model.summary;
    let (mass_msun, radius_rsun) = (model.mass_msun(), s.radius_rsun);
    let nu_max_scaling_uhz = kjeldsen_bedding_nu_max_uhz(mass_msun, radius_rsun, s.teff_k);
    let uhz = dynamical_frequency_hz(mass_msun, radius_rsun) * 1e6;
    let around = separation_frequency(&modes, max_order, Some(nu_max_scaling_uhz / uhz));
    let seismic = SeismicSummary::new(&oscillation_model, &modes, around);
    Ok(StarModes {
        modes,
        stability,
        seismic,
        nu_max_scaling_uhz,
    })
}

/// The cyclic frequency (dimensionless) around which the separations are measured: that of the
/// radial mode nearest `nu_max` (dimensionless) if it lies within the radial modes found, else
/// that of order `max_order` - [`SEPARATION_OFFSET`] (the highest radial mode if fewer). `None`
/// without radial modes.
pub fn separation_frequency(modes: &[Mode], max_order: u32, nu_max: Option<f64>) -> Option<f64> {
    let radial: Vec<&Mode> = modes.iter().filter(|m| m.degree == 0).collect();
    let (lowest, highest) = (radial.first()?, radial.last()?);
    if let Some(nu) = nu_max {
        if nu >= lowest.cyclic_frequency() && nu <= highest.cyclic_frequency() {
            return radial
                .iter()
                .min_by(|a, b| {
                    (a.cyclic_frequency() - nu)
                        .abs()
                        .total_cmp(&(b.cyclic_frequency() - nu).abs())
                })
                .map(|m| m.cyclic_frequency());
        }
    }
    let target = (max_order as i32 - SEPARATION_OFFSET).max(1);
    radial
        .iter()
        .find(|m| m.order == target)
        .or_else(|| radial.iter().max_by_key(|m| m.order))
        .map(|m| m.cyclic_frequency())
}
