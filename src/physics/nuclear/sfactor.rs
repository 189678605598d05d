//! `sfactor`: thermonuclear rates from astrophysical S-factors at the Gamow peak, with
//! electron screening, equilibrium 3He branching and the energy per 4He of each chain.

use super::{EnergyGeneration, EnergyRate, He3Equilibrium};
use crate::constants::{E_ESU, HBAR_ERG_S, K_B_ERG_K, MEV_ERG, M_E_G, M_P_G, M_U_G};
use crate::error::PhysicsError;
use crate::numerics::cube_root::cbrt;
use crate::numerics::exponential::FastExp;
use crate::physics::composition::{Composition, METAL_MEAN_MASS_NUMBER};
use crate::physics::opacity::check_point;

/// 1 MeV barn in erg cm^2.
const MEV_BARN: f64 = MEV_ERG * 1e-24;

/// Atomic mass of 1H, u (AME 2016; memory).
const A_H1: f64 = 1.007_825_03;
/// Atomic mass of 3He, u (AME 2016; memory).
const A_HE3: f64 = 3.016_029_32;
/// Atomic mass of 4He, u (AME 2016; memory).
const A_HE4: f64 = 4.002_603_25;
/// Atomic mass of 14N, u (AME 2016; memory).
const A_N14: f64 = 14.003_074_00;

/// Energy per 4He released to the star by the ppI chain, MeV (Q = 26.731 MeV minus neutrino
/// losses; docs/references.md §4, computed).
pub const Q_PP1_MEV: f64 = 26.20;
/// Energy per 4He of the ppII chain, MeV (docs/references.md §4, computed).
pub const Q_PP2_MEV: f64 = 25.65;
/// Energy per 4He of the CN cycle, MeV (docs/references.md §4, computed).
pub const Q_CN_MEV: f64 = 25.03;

/// One non-resonant charged-particle reaction.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Reaction {
    /// Charge of the first nucleus.
    pub z1: f64,
    /// Charge of the second nucleus.
    pub z2: f64,
    /// Reduced mass m1 m2 / (m1 + m2) of the nuclei, g.
    pub reduced_mass_g: f64,
    /// S(0), erg cm^2.
    pub s0_erg_cm2: f64,
    /// S'(0) / S(0), erg^-1.
    pub s_slope_per_erg: f64,
}

fn nuclear_mass_g(atomic_mass_u: f64, electrons: f64) -> f64 {
    atomic_mass_u * M_U_G - electrons * M_E_G
}

fn reduced(m1: f64, m2: f64) -> f64 {
    m1 * m2 / (m1 + m2)
}

impl Reaction {
    /// p + p -> d + e+ + nu: S11(0) = 4.01e-25 MeV b, S'/S = 11.2 MeV^-1 (Adelberger et al.
    /// 2011, Rev. Mod. Phys. 83, 195; memory, magnitude confirmed).
    pub fn pp() -> Self {
        Self {
            z1: 1.0,
            z2: 1.0,
            reduced_mass_g: 0.5 * M_P_G,
            s0_erg_cm2: 4.01e-25 * MEV_BARN,
            s_slope_per_erg: 11.2 / MEV_ERG,
        }
    }

    /// 3He + 3He -> 4He + 2p: S33(0) = 5.21 MeV b (Adelberger et al. 2011; memory).
    pub fn he3_he3() -> Self {
        let m = nuclear_mass_g(A_HE3, 2.0);
        Self {
            z1: 2.0,
            z2: 2.0,
            reduced_mass_g: 0.5 * m,
            s0_erg_cm2: 5.21 * MEV_BARN,
            s_slope_per_erg: 0.0,
        }
    }

    /// 3He + 4He -> 7Be + gamma: S34(0) = 0.56 keV b (Adelberger et al. 2011; memory).
    pub fn he3_he4() -> Self {
        Self {
            z1: 2.0,
            z2: 2.0,
            reduced_mass_g: reduced(nuclear_mass_g(A_HE3, 2.0), nuclear_mass_g(A_HE4, 2.0)),
            s0_erg_cm2: 0.56e-3 * MEV_BARN,
            s_slope_per_erg: 0.0,
        }
    }

    /// 14N + p -> 15O + gamma: S114(0) = 1.66 keV b (Adelberger et al. 2011; memory,
    /// magnitude confirmed).
    pub fn p_n14() -> Self {
        Self {
            z1: 1.0,
            z2: 7.0,
            reduced_mass_g: reduced(M_P_G, nuclear_mass_g(A_N14, 7.0)),
            s0_erg_cm2: 1.66e-3 * MEV_BARN,
            s_slope_per_erg: 0.0,
        }
    }

    /// b = pi Z1 Z2 e^2 sqrt(2 m_red) / hbar, erg^(1/2): the Gamow penetration exp(-b/sqrt(E)).
    fn gamow_b(&self) -> f64 {
        std::f64::consts::PI
            * self.z1
            * self.z2
            * E_ESU
            * E_ESU
            * (2.0 * self.reduced_mass_g).sqrt()
            / HBAR_ERG_S
    }

    /// tau T6^(1/3), where tau = 3 E_0 / kT is the exponent of the non-resonant rate
    /// (Clayton 1968, ch. 4; 33.80 for p + p and 152.28 for p + 14N, docs/references.md §4).
    pub fn tau_times_t6_cbrt(&self) -> f64 {
        let kt = K_B_ERG_K * 1e6;
        3.0 * (self.gamow_b() * kt / 2.0).powf(2.0 / 3.0) / kt
    }

    /// `<sigma v>` in cm^3 s^-1 at temperature `t` and its logarithmic temperature derivative,
    /// without screening: the Gamow-peak formula
    /// `<sigma v>` = sqrt(2 / m_red) Delta (kT)^(-3/2) S_eff exp(-tau), E_0 = (b kT / 2)^(2/3),
    /// tau = 3 E_0 / kT, Delta = 4 sqrt(E_0 kT / 3), with
    /// S_eff = S(0) [1 + 5/(12 tau) + (S'/S)(E_0 + 35 kT / 36)] (Clayton 1968, eqs. 4-56 and
    /// 4-84; Fowler, Caughlan & Zimmerman 1967, ARA&A 5, 525).
    pub fn sigma_v(&self, t: f64) -> (f64, f64) {
        let kt = K_B_ERG_K * t;
        let e0 = (self.gamow_b() * kt / 2.0).powf(2.0 / 3.0);
        let tau = 3.0 * e0 / kt;
        let delta = 4.0 * (e0 * kt / 3.0).sqrt();
        let corr1 = 5.0 / (12.0 * tau);
        let corr2 = self.s_slope_per_erg * (e0 + 35.0 * kt / 36.0);
        let s_ratio = 1.0 + corr1 + corr2;
        let value = (2.0 / self.reduced_mass_g).sqrt()
            * delta
            * kt.powf(-1.5)
            * self.s0_erg_cm2
            * s_ratio
            * (-tau).fast_exp();
        // d ln S_eff / d ln T: tau ~ T^(-1/3), E_0 ~ T^(2/3).
        let ds =
            (corr1 / 3.0 + self.s_slope_per_erg * (2.0 / 3.0 * e0 + 35.0 * kt / 36.0)) / s_ratio;
        (value, (tau - 2.0) / 3.0 + ds)
    }
}

/// Electron screening enhancement: ln f and d ln f / d ln T.
///
/// Weak screening (Salpeter 1954, Aust. J. Phys. 7, 373):
/// ln f = Z1 Z2 e^3 (4 pi rho zeta^2 / m_u)^(1/2) (kT)^(-3/2), zeta^2 = sum (Z_i^2 + Z_i) X_i / A_i
/// (= 0.188 Z1 Z2 zeta rho^(1/2) T6^(-3/2)). Strong screening (Salpeter 1954, ion-sphere):
/// ln f = 0.9 [(Z1+Z2)^(5/3) - Z1^(5/3) - Z2^(5/3)] e^2 / (a_e kT), a_e = (3 / (4 pi n_e))^(1/3).
/// A smooth minimum of the two (`bridge`) joins them across the intermediate regime (the fits
/// of Graboske et al. 1973 are not implemented), capped at [`MAX_LN_SCREENING`]. Electron
/// degeneracy is not allowed for in zeta.
pub fn screening(z1: f64, z2: f64, rho: f64, t: f64, comp: &Composition) -> (f64, f64) {
    let kt = K_B_ERG_K * t;
    let z_m = 0.5 * METAL_MEAN_MASS_NUMBER;
    let zeta2 = 2.0 * comp.x()
        + 6.0 * comp.y() / 4.0
        + (z_m * z_m + z_m) * comp.z() / METAL_MEAN_MASS_NUMBER;
    let weak = z1
        * z2
        * E_ESU.powi(3)
        * (4.0 * std::f64::consts::PI * rho * zeta2 / M_U_G).sqrt()
        * kt.powf(-1.5);
    let n_e = rho / M_U_G * 0.5 * (1.0 + comp.x());
    let a_e = cbrt(3.0 / (4.0 * std::f64::consts::PI * n_e));
    let p53 = |z: f64| z.powf(5.0 / 3.0);
    let strong = 0.9 * (p53(z1 + z2) - p53(z1) - p53(z2)) * E_ESU * E_ESU / (a_e * kt);
    bridge(weak, strong)
}

/// The ratio weak/strong below which weak screening is used unchanged, and (its inverse) above
/// which strong screening is.
pub const SCREENING_BLEND_START: f64 = 0.8;

/// ln f and d ln f / d ln T joining weak screening w ~ T^(-3/2) and strong screening s ~ T^(-1):
/// w where w < 0.8 s, s where w > 1.25 s, and between them the twice-differentiable blend
/// w (1 - h) + s h of [`crate::numerics::smooth::switch_weight`]. A plain min() puts a kink in
/// eps(T) at the crossing that the integrator's error estimate does not see, which left a
/// tolerance-dependent error of ~1e-6 in L of 0.3 M_sun models. Capped at [`MAX_LN_SCREENING`].
fn bridge(weak: f64, strong: f64) -> (f64, f64) {
    if !(weak > 0.0 && strong > 0.0) {
        return (0.0, 0.0);
    }
    let (h, dh) = crate::numerics::smooth::switch_weight(weak, strong, SCREENING_BLEND_START);
    // d ln(w/s) / d ln T = -3/2 + 1 = -1/2.
    let ln_f = weak * (1.0 - h) + strong * h;
    let dln_f = -1.5 * weak * (1.0 - h) - strong * h + (strong - weak) * dh * -0.5;
    if ln_f > MAX_LN_SCREENING {
        (MAX_LN_SCREENING, 0.0)
    } else {
        (ln_f, dln_f)
    }
}

/// Cap on ln f: beyond it (cold, dense, pycnonuclear conditions far from any ZAMS star) the
/// strong-screening formula is outside its validity; the enhancement is held at e^50.
pub const MAX_LN_SCREENING: f64 = 50.0;

/// pp-chain and CN-cycle energy generation from S-factors.
///
/// - pp: r_pp = n_p^2 `<sigma v>`_11 f_11 / 2 reactions cm^-3 s^-1. Each pp reaction makes one 3He
///   (deuterium burns at once). 3He is taken in equilibrium, r_pp = n_3^2 `<sigma v>`_33 +
///   n_3 n_4 `<sigma v>`_34 (screened), which fixes the fraction beta = n_3 n_4 `<sigma v>`_34 / r_pp
///   of 3He that goes through 3He + 4He (ppII; the ppIII branch, about 0.1 per cent in the Sun,
///   is neglected). Energy per pp reaction: (1 - beta)/2 Q_ppI + beta Q_ppII with Q after neutrino
///   losses ([`Q_PP1_MEV`], [`Q_PP2_MEV`]). eps_pp = r_pp ((1-beta)/2 Q_ppI + beta Q_ppII) / rho.
/// - CNO: the CN cycle in equilibrium with all CNO nuclei as 14N (common approximation):
///   n_14 = rho X_CNO / m(14N), eps_CNO = n_p n_14 `<sigma v>`_p14 f Q_CN / rho ([`Q_CN_MEV`]).
///
/// Rates from [`Reaction::sigma_v`], screening from [`screening`]. nu = dln eps / dln T is
/// analytic, including the temperature dependence of beta. Domain: rho > 0, 1e3 <= T <= 1e10 K
/// (rates underflow to zero at low T).
#[derive(Debug, Clone, Copy)]
pub struct SFactorRates {
    pp: Prepared,
    he33: Prepared,
    he34: Prepared,
    pn14: Prepared,
}

impl Default for SFactorRates {
    fn default() -> Self {
        Self {
            pp: Prepared::new(&Reaction::pp()),
            he33: Prepared::new(&Reaction::he3_he3()),
            he34: Prepared::new(&Reaction::he3_he4()),
            pn14: Prepared::new(&Reaction::p_n14()),
        }
    }
}

/// The per-reaction constants of [`Reaction::sigma_v`] and [`screening`], computed once.
#[derive(Debug, Clone, Copy)]
struct Prepared {
    /// (b / 2)^(2/3), so that E_0 = this (kT)^(2/3).
    e0_coefficient: f64,
    /// sqrt(2 / m_red) S(0).
    prefactor: f64,
    s_slope_per_erg: f64,
    z1z2: f64,
    /// 0.9 [(Z1+Z2)^(5/3) - Z1^(5/3) - Z2^(5/3)].
    strong: f64,
}

impl Prepared {
    fn new(r: &Reaction) -> Self {
        let p53 = |z: f64| z.powf(5.0 / 3.0);
        Self {
            e0_coefficient: (0.5 * r.gamow_b()).powf(2.0 / 3.0),
            prefactor: (2.0 / r.reduced_mass_g).sqrt() * r.s0_erg_cm2,
            s_slope_per_erg: r.s_slope_per_erg,
            z1z2: r.z1 * r.z2,
            strong: 0.9 * (p53(r.z1 + r.z2) - p53(r.z1) - p53(r.z2)),
        }
    }
}

/// The quantities every reaction shares at one (rho, T).
#[derive(Debug, Clone, Copy)]
struct Conditions {
    kt: f64,
    kt_cbrt: f64,
    kt_sqrt: f64,
    /// Weak-screening ln f for Z1 Z2 = 1.
    weak_unit: f64,
    /// e^2 / (a_e kT).
    strong_unit: f64,
}

impl Conditions {
    fn new(rho: f64, t: f64, comp: &Composition) -> Self {
        let kt = K_B_ERG_K * t;
        let kt_sqrt = kt.sqrt();
        let z_m = 0.5 * METAL_MEAN_MASS_NUMBER;
        let zeta2 = 2.0 * comp.x()
            + 6.0 * comp.y() / 4.0
            + (z_m * z_m + z_m) * comp.z() / METAL_MEAN_MASS_NUMBER;
        let weak_unit = E_ESU.powi(3) * (4.0 * std::f64::consts::PI * rho * zeta2 / M_U_G).sqrt()
            / (kt * kt_sqrt);
        let n_e = rho / M_U_G * 0.5 * (1.0 + comp.x());
        let a_e = cbrt(3.0 / (4.0 * std::f64::consts::PI * n_e));
        Self {
            kt,
            kt_cbrt: cbrt(kt),
            kt_sqrt,
            weak_unit,
            strong_unit: E_ESU * E_ESU / (a_e * kt),
        }
    }
}

/// Screened `<sigma v>` and its temperature exponent; the same formulas as [`Reaction::sigma_v`]
/// and [`screening`] with the shared factors computed once.
fn screened(r: &Prepared, c: &Conditions) -> (f64, f64) {
    let e0 = r.e0_coefficient * c.kt_cbrt * c.kt_cbrt;
    let tau = 3.0 * e0 / c.kt;
    let delta = 4.0 * (e0 * c.kt / 3.0).sqrt();
    let corr1 = 5.0 / (12.0 * tau);
    let corr2 = r.s_slope_per_erg * (e0 + 35.0 * c.kt / 36.0);
    let s_ratio = 1.0 + corr1 + corr2;
    let ds = (corr1 / 3.0 + r.s_slope_per_erg * (2.0 / 3.0 * e0 + 35.0 * c.kt / 36.0)) / s_ratio;
    let weak = r.z1z2 * c.weak_unit;
    let strong = r.strong * c.strong_unit;
    let (ln_f, dln_f) = bridge(weak, strong);
    let value = r.prefactor * delta / (c.kt * c.kt_sqrt) * s_ratio * (ln_f - tau).fast_exp();
    (value, (tau - 2.0) / 3.0 + ds + dln_f)
}

/// The 3He balance r = a n_3^2 + b n_3 at one (rho, T): production r = n_p^2 `<sigma v>`_11 / 2,
/// a = `<sigma v>`_33, b = n_4 `<sigma v>`_34 (all screened), and its root n_3.
#[derive(Debug, Clone, Copy)]
struct Balance {
    r: f64,
    a: f64,
    b: f64,
    n_3: f64,
}

impl SFactorRates {
    /// The 3He balance with `l11` the screened pp `<sigma v>`, and the temperature exponents of
    /// a and of `<sigma v>`_34. The root is written 2 r / (b + sqrt(b^2 + 4 a r)), which loses
    /// no digits when b^2 >> 4 a r; it is zero, and not computed, where r or a vanishes (the
    /// cool layers, where the rates underflow: most of the structure's evaluations).
    fn balance(
        &self,
        rho: f64,
        comp: &Composition,
        c: &Conditions,
        l11: f64,
    ) -> (Balance, f64, f64) {
        let n_p = rho * comp.x() / (A_H1 * M_U_G);
        let n_4 = rho * comp.y() / (A_HE4 * M_U_G);
        let (l33, nu33) = screened(&self.he33, c);
        let (l34, nu34) = screened(&self.he34, c);
        let r = 0.5 * n_p * n_p * l11;
        let a = l33;
        let b = n_4 * l34;
        let n_3 = if r > 0.0 && a > 0.0 {
            2.0 * r / (b + (b * b + 4.0 * a * r).sqrt())
        } else {
            0.0
        };
        (Balance { r, a, b, n_3 }, nu33, nu34)
    }

    /// 3He in equilibrium at (rho, T) from the law's screened rates ([`He3Equilibrium`]: n_3,eq
    /// solves r_pp = lambda_33 n_3^2 + lambda_34 n_3, the balance this law takes for its pp
    /// branching, and tau_eq = 1 / (2 lambda_33 n_3,eq + lambda_34)). Errors outside the
    /// law's domain, and where the pp or 3He + 3He rate underflows to zero (below about
    /// 1e6 K: no 3He is made, and no equilibrium time is defined).
    pub fn he3_equilibrium_at(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<He3Equilibrium, PhysicsError> {
        check_domain(rho, t)?;
        let c = Conditions::new(rho, t, comp);
        let (l11, _) = screened(&self.pp, &c);
        let (Balance { r, a, b, n_3 }, _, _) = self.balance(rho, comp, &c, l11);
        if !(r > 0.0 && a > 0.0 && n_3 > 0.0) {
            return Err(PhysicsError::new(
                "sfactor",
                "pp or 3He + 3He rate underflows: no 3He equilibrium",
                rho,
                t,
            ));
        }
        let out = He3Equilibrium {
            number_density_cm3: n_3,
            mass_fraction: n_3 * nuclear_mass_g(A_HE3, 2.0) / rho,
            relaxation_time_s: 1.0 / (2.0 * a * n_3 + b),
            production_cm3_s: r,
            he3_he3_cm3_s: a,
            he3_he4_per_s: b,
        };
        if out.relaxation_time_s.is_finite() && out.mass_fraction.is_finite() {
            Ok(out)
        } else {
            Err(PhysicsError::new(
                "sfactor",
                "3He equilibrium not finite",
                rho,
                t,
            ))
        }
    }

    /// The fraction beta of 3He destroyed by 3He + 4He (ppII) at equilibrium, and d beta / d ln T.
    pub fn pp2_fraction(&self, rho: f64, t: f64, comp: &Composition) -> (f64, f64) {
        let c = Conditions::new(rho, t, comp);
        self.pp2_with(rho, comp, &c, screened(&self.pp, &c))
    }

    fn pp2_with(
        &self,
        rho: f64,
        comp: &Composition,
        c: &Conditions,
        (l11, nu11): (f64, f64),
    ) -> (f64, f64) {
        let (Balance { r, a, b, n_3 }, nu33, nu34) = self.balance(rho, comp, c, l11);
        if !(r > 0.0 && b > 0.0 && a > 0.0) {
            return (0.0, 0.0);
        }
        let beta = n_3 * b / r;
        // (2 a n3 + b) dn3 = r nu_r - a n3^2 nu_a - b n3 nu_b   (per d ln T)
        let dln_n3 =
            (r * nu11 - a * n_3 * n_3 * nu33 - b * n_3 * nu34) / (n_3 * (2.0 * a * n_3 + b));
        let dln_beta = dln_n3 + nu34 - nu11;
        (beta, beta * dln_beta)
    }
}

/// The law's domain: rho > 0 and 1e3 <= T <= 1e10 K.
fn check_domain(rho: f64, t: f64) -> Result<(), PhysicsError> {
    check_point("sfactor", rho, t)?;
    if !(1e3..=1e10).contains(&t) {
        return Err(PhysicsError::new(
            "sfactor",
            "temperature outside the law's domain 1e3..1e10 K",
            rho,
            t,
        ));
    }
    Ok(())
}

/// Below this temperature and [`NEGLIGIBLE_BELOW_G_CM3`] the law's energy generation is
/// negligible in every star ([`EnergyGeneration::negligible_at`]): the pp chain's Gamow factor
/// exp(-3 E_0 / kT) is e^-98.5 = 2e-43 at 4e4 K, against e^-24.3 at the centre of the coolest
/// hydrogen-burning star (T_c = 2.66e6 K, rho_c = 986 g/cm^3: the limiting model of `starpoise
/// limits`), and every other reaction's barrier is higher. The density bound keeps strong
/// screening out of it (at 4e4 K and 986 g/cm^3 the screened pp rate is 1.6e-10 of that
/// central one; no star has such layers). `negligible_tests` checks the ratio of the rates. In
/// a ZAMS star these are the layers above the hydrogen ionisation zone, where about half the
/// structure's evaluations of a solar-mass model fall.
pub const NEGLIGIBLE_BELOW_K: f64 = 4e4;
/// The density bound of [`NEGLIGIBLE_BELOW_K`], g/cm^3.
pub const NEGLIGIBLE_BELOW_G_CM3: f64 = 1.0;

impl EnergyGeneration for SFactorRates {
    fn negligible_at(&self, rho: f64, t: f64) -> bool {
        t < NEGLIGIBLE_BELOW_K && rho < NEGLIGIBLE_BELOW_G_CM3
    }

    fn he3_equilibrium(
        &self,
        rho: f64,
        t: f64,
        comp: &Composition,
    ) -> Result<Option<He3Equilibrium>, PhysicsError> {
        self.he3_equilibrium_at(rho, t, comp).map(Some)
    }

    fn name(&self) -> String {
        "sfactor".to_string()
    }

    fn rate(&self, rho: f64, t: f64, comp: &Composition) -> Result<EnergyRate, PhysicsError> {
        check_domain(rho, t)?;
        let n_p = rho * comp.x() / (A_H1 * M_U_G);
        let n_14 = rho * comp.x_cno() / (A_N14 * M_U_G);
        let c = Conditions::new(rho, t, comp);
        let (l11, nu11) = screened(&self.pp, &c);
        let (beta, dbeta) = self.pp2_with(rho, comp, &c, (l11, nu11));
        let q_per_pp = (0.5 * (1.0 - beta) * Q_PP1_MEV + beta * Q_PP2_MEV) * MEV_ERG;
        let dq = dbeta * (Q_PP2_MEV - 0.5 * Q_PP1_MEV) * MEV_ERG;
        let eps_pp = 0.5 * n_p * n_p * l11 * q_per_pp / rho;
        let (l14, nu14) = screened(&self.pn14, &c);
        let eps_cno = n_p * n_14 * l14 * Q_CN_MEV * MEV_ERG / rho;
        let out = EnergyRate {
            eps_pp_erg_g_s: eps_pp,
            eps_cno_erg_g_s: eps_cno,
            nu_pp: nu11 + dq / q_per_pp,
            nu_cno: nu14,
        };
        let ok = [
            out.eps_pp_erg_g_s,
            out.eps_cno_erg_g_s,
            out.nu_pp,
            out.nu_cno,
        ]
        .iter()
        .all(|v| v.is_finite());
        if ok {
            Ok(out)
        } else {
            Err(PhysicsError::new("sfactor", "rate not finite", rho, t))
        }
    }
}

#[cfg(test)]
mod bridge_tests {
    use super::*;

    /// The screening bridge is weak screening below 0.8 of strong, strong above 1.25 of it,
    /// continuous with a continuous derivative, and its d ln f / d ln T matches a finite
    /// difference along w ~ T^(-3/2), s ~ T^(-1).
    #[test]
    fn bridge_is_smooth_and_exact_outside_the_blend() {
        assert_eq!(bridge(0.5, 1.0).0, 0.5);
        assert_eq!(bridge(2.0, 1.0).0, 1.0);
        let at = |ln_t: f64| bridge(0.3 * (-1.5 * ln_t).exp(), 0.3 * (-ln_t).exp());
        let mut previous = at(-1.0).0;
        for i in 1..4000 {
            let x = -1.0 + i as f64 * 5e-4;
            let (f, df) = at(x);
            assert!((f - previous).abs() < 1e-3, "jump at {x}");
            let h = 1e-6;
            let fd = (at(x + h).0 - at(x - h).0) / (2.0 * h);
            assert!(
                (fd - df).abs() < 1e-6 * (1.0 + df.abs()),
                "d ln f at {x}: {fd} vs {df}"
            );
            previous = f;
        }
    }
}

#[cfg(test)]
mod negligible_tests {
    use super::*;

    /// Where the law says its rates are negligible, both are below 1e-30 of the pp rate at the
    /// centre of the coolest hydrogen-burning star (its limiting model, T_c = 2.66e6 K,
    /// rho_c = 986 g/cm^3, README's `starpoise limits`) for X from 0 to 1 and Z up to 0.04 (at
    /// the bounds, where they are largest: 9.5e-33 for X = 0.7, Z = 0.02); just outside the
    /// density bound strong screening lifts them well above it, which is why it is there.
    #[test]
    fn negligible_rates_are_negligible() {
        let law = SFactorRates::default();
        let coolest = Composition::new(0.70, 0.02).unwrap();
        let centre = law.rate(986.0, 2.66e6, &coolest).unwrap().eps_pp_erg_g_s;
        for (x, z) in [
            (0.70, 0.02),
            (0.75, 0.001),
            (0.65, 0.04),
            (0.999, 0.0),
            (0.01, 0.04),
        ] {
            let comp = Composition::new(x, z).unwrap();
            let (t, rho) = (NEGLIGIBLE_BELOW_K, NEGLIGIBLE_BELOW_G_CM3);
            for rho in [1e-12, 1e-6, 1e-3, 0.1, rho * (1.0 - 1e-12)] {
                assert!(law.negligible_at(rho, t * (1.0 - 1e-12)));
                let r = law.rate(rho, t, &comp).unwrap();
                let worst = r.eps_pp_erg_g_s.max(r.eps_cno_erg_g_s) / centre;
                assert!(worst < 1e-30, "X = {x}, Z = {z}, rho = {rho:e}: {worst:e}");
            }
            assert!(!law.negligible_at(rho, t * 0.5));
            assert!(!law.negligible_at(rho * 0.5, t));
            let dense = law.rate(100.0 * rho, t, &comp).unwrap().eps_pp_erg_g_s / centre;
            assert!(x < 0.05 || dense > 1e-25, "X = {x}: {dense:e}");
        }
    }
}
