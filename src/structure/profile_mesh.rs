//! The fine solution a profile is read from, and where its rows go.
//!
//! The two legs of the converged model are integrated once more, keeping every accepted step's
//! dense output ([`LegSolution`]); with the centre series below the outward leg's start and the
//! photosphere on top, that is the whole star as a continuous function. A row is a
//! `Place` on it: the centre itself, a mass on the centre series, or an x on one of the legs.
//! The grids ([`ProfileGrid`]) choose the places; `FineSolution::structure_at` reads the
//! structure there, including the gravitational potential, which is integrated on the same
//! dense output.
//!
//! Potential (zero at infinity): Phi(m) = -G m / r - G int_m^M dm' / r(m'), whose derivative is
//! dPhi/dr = G m / r^2 and whose surface value is -G M / R (docs/references.md §10). The
//! integral is a quadrature of dm/r = (M e^x / r(x)) dx on each leg (dm/dx = M e^x outward;
//! on the inward leg, x = ln(1 - m/M), the integral from the photosphere inward has the same
//! integrand), five-point Gauss–Legendre on every step and on the part of a step up to a row:
//! exact for polynomials of degree 9, far below the integrator's tolerance on its steps. Below
//! the outward leg's start (m0 = 1e-10 M) the series r = (3 m / (4 pi rho_c))^(1/3) gives
//! int_m^m0 dm'/r = (3/2)(m0/r0 - m/r); above the photosphere the atmosphere's mass
//! M - m_ph (about 1e-11 M) sits at R.

use super::centre::{self, CentreStart};
use super::equations::{State, LN_P, LN_R, LN_T, LUM};
use super::legs::{Leg, LegContext, LegResult, LegRunner, LegSolution};
use super::shooting::Unknowns;
use super::surface::{self, SurfaceStart};
use crate::constants::G_CGS;
use crate::error::{Error, Result};
use crate::error::{LegCause, LegError};
use crate::numerics::scalar::illinois;
use std::f64::consts::PI;
use std::str::FromStr;

/// How the rows of a profile are spread over the star. Every grid has the centre (r = 0) first
/// and the photosphere last.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum ProfileGrid {
    /// Balanced: equal steps in s = (r/R + m/M + k/K) / 3, where k/K is the fraction of the
    /// integrator's accepted steps below the point. Each of the three shares a third of the
    /// rows, so the rows follow the integrator where the structure changes fast (the outer
    /// layers) without starving the interior: the layers of equal radius and of equal mass
    /// each keep at least a third of their uniform share.
    #[default]
    Auto,
    /// Uniform in radius: r = R i/(K - 1), for codes on a radial grid.
    Radius,
    /// Uniform in mass: m = M i/(K - 1) (the last row is the photosphere, 1e-11 M or so below
    /// M), for particle codes.
    Mass,
}

impl ProfileGrid {
    /// Every grid, in the order listed to users.
    pub const ALL: [ProfileGrid; 3] = [ProfileGrid::Auto, ProfileGrid::Radius, ProfileGrid::Mass];

    /// The grid's name as a user writes it.
    pub fn name(self) -> &'static str {
        match self {
            ProfileGrid::Auto => "auto",
            ProfileGrid::Radius => "radius",
            ProfileGrid::Mass => "mass",
        }
    }
}

impl std::fmt::Display for ProfileGrid {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for ProfileGrid {
    type Err = Error;

    fn from_str(s: &str) -> Result<Self> {
        ProfileGrid::ALL
            .into_iter()
            .find(|g| g.name() == s)
            .ok_or_else(|| {
                Error::invalid("grid", s, "the profile grid must be auto, radius or mass")
            })
    }
}

/// Where a row lies on the fine solution.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Place {
    /// r = 0.
    Centre,
    /// A mass on the centre series, below the outward leg's start, g.
    Series(f64),
    /// x = ln(m/M) on the outward leg.
    Outward(f64),
    /// x = ln(1 - m/M) on the inward leg.
    Inward(f64),
}

/// The structure at one place.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Structure {
    /// Mass inside, g.
    pub mass_g: f64,
    /// Radius, cm.
    pub radius_cm: f64,
    /// Pressure, dyn cm^-2.
    pub pressure_dyn_cm2: f64,
    /// Temperature, K.
    pub temperature_k: f64,
    /// Luminosity, erg s^-1.
    pub luminosity_erg_s: f64,
    /// L/m at this place (eps_c at the centre and on the series), erg g^-1 s^-1.
    pub l_over_m: f64,
    /// Gravitational potential, erg g^-1.
    pub potential_erg_g: f64,
    /// The leg to name in an error at this place.
    pub leg: Leg,
    /// The leg's variable x to name in an error at this place.
    pub x: f64,
}

/// Five-point Gauss–Legendre nodes on [-1, 1] and weights (Abramowitz & Stegun 1964, Table
/// 25.4).
const GAUSS: [(f64, f64); 5] = [
    (-0.906_179_845_938_664, 0.236_926_885_056_189_1),
    (-0.538_469_310_105_683_1, 0.478_628_670_499_366_5),
    (0.0, 0.568_888_888_888_888_9),
    (0.538_469_310_105_683_1, 0.478_628_670_499_366_5),
    (0.906_179_845_938_664, 0.236_926_885_056_189_1),
];

/// One leg's dense solution with the running integral of dm/r at its steps' starts.
struct LegTrack {
    solution: LegSolution,
    /// int (M e^x / r) dx from the leg's start to the start of each step, then to its end.
    cumulative: Vec<f64>,
    /// (x, ln r) at the start of each step, then at the leg's end.
    nodes: Vec<(f64, f64)>,
}

impl LegTrack {
    fn new(solution: LegSolution, total_mass_g: f64) -> Self {
        let n = solution.step_count();
        let mut cumulative = Vec::with_capacity(n + 1);
        let mut nodes = Vec::with_capacity(n + 1);
        let mut sum = 0.0;
        for i in 0..n {
            if let Some((a, b)) = solution.step_interval(i) {
                cumulative.push(sum);
                nodes.push((
                    a,
                    solution.component_at_step(i, a, LN_R).unwrap_or(f64::NAN),
                ));
                sum += Self::gauss(&solution, i, a, b, total_mass_g);
                if i + 1 == n {
                    cumulative.push(sum);
                    nodes.push((
                        b,
                        solution.component_at_step(i, b, LN_R).unwrap_or(f64::NAN),
                    ));
                }
            }
        }
        Self {
            solution,
            cumulative,
            nodes,
        }
    }

    /// int_a^b M e^x / r(x) dx on step `i`.
    fn gauss(solution: &LegSolution, i: usize, a: f64, b: f64, total_mass_g: f64) -> f64 {
        let (mid, half) = (0.5 * (a + b), 0.5 * (b - a));
        let sum: f64 = GAUSS
            .iter()
            .map(|&(t, w)| {
                let x = mid + half * t;
                w * solution
                    .component_at_step(i, x, LN_R)
                    .map_or(f64::NAN, |ln_r| (x - ln_r).exp())
            })
            .sum();
        total_mass_g * half * sum
    }

    /// int (M e^x / r) dx from the leg's start to `x`.
    fn integral_to(&self, x: f64, total_mass_g: f64) -> f64 {
        let i = self.solution.step_of(x);
        let start = self.solution.step_interval(i).map_or(x, |(a, _)| a);
        self.cumulative.get(i).copied().unwrap_or(0.0)
            + Self::gauss(&self.solution, i, start, x, total_mass_g)
    }

    /// The whole leg's integral.
    fn total(&self) -> f64 {
        self.cumulative.last().copied().unwrap_or(0.0)
    }

    /// x on this leg where ln r = `ln_r` (inside the leg's range of ln r), by the Illinois
    /// method on the dense output of the step that holds it.
    fn x_at_ln_r(&self, ln_r: f64) -> f64 {
        let increasing = self.nodes.last().map(|n| n.1) > self.nodes.first().map(|n| n.1);
        let k = self
            .nodes
            .partition_point(|n| (n.1 < ln_r) == increasing)
            .clamp(1, self.nodes.len().max(2) - 1);
        let i = k - 1;
        let (a, b) = (self.nodes[i].0, self.nodes[k].0);
        let g = |x: f64| -> std::result::Result<f64, ()> {
            Ok(self
                .solution
                .component_at_step(i, x, LN_R)
                .unwrap_or(f64::NAN)
                - ln_r)
        };
        let (ga, gb) = (g(a).unwrap_or(f64::NAN), g(b).unwrap_or(f64::NAN));
        if ga * gb > 0.0 || ga.is_nan() || gb.is_nan() {
            // Rounding at a step's end: the nearer end is the answer.
            return if ga.abs() < gb.abs() { a } else { b };
        }
        illinois(g, a, ga, b, gb, ROOT_TOLERANCE * (1.0 + b.abs())).unwrap_or(b)
    }
}

/// Tolerance of the root in x on a leg, relative to 1 + |x|: near the rounding of x.
const ROOT_TOLERANCE: f64 = 1e-14;

/// The converged model as a continuous function of the place: the centre series, both legs'
/// dense output, the photosphere, and the potential's integrals.
pub(crate) struct FineSolution<'a> {
    ctx: &'a LegContext<'a>,
    /// The outward leg's start and the centre's local physics.
    pub start: CentreStart,
    /// The photosphere.
    pub top: SurfaceStart,
    outward: LegTrack,
    inward: LegTrack,
    /// R, cm.
    pub radius_cm: f64,
    /// The fitting mass fraction, where the legs meet.
    fit_fraction: f64,
    /// int_{m0}^{M} dm / r, cm^-1 g: the potential's integral from the outward leg's start.
    integral_from_start: f64,
}

impl<'a> FineSolution<'a> {
    /// Integrate both legs of the model with unknowns `u` fitted at mass fraction `q` once
    /// more, keeping every step's dense output; from the photosphere `top` if it is known (it
    /// must be the one at `u` and `ctx.tolerance`), else from one computed here.
    pub fn new(
        ctx: &'a LegContext<'a>,
        u: &Unknowns,
        q: f64,
        top: Option<&SurfaceStart>,
    ) -> LegResult<Self> {
        let mut runner = LegRunner::new(*ctx)?;
        let start = centre::start(ctx, u[0], u[1])?;
        let top = match top {
            Some(top) => top.clone(),
            None => surface::start(ctx, u[2], u[3])?,
        };
        let mut out_steps = Vec::new();
        let mut in_steps = Vec::new();
        runner.integrate(
            Leg::Outward,
            start.x0,
            q.ln(),
            start.y0,
            Some(&mut out_steps),
        )?;
        runner.integrate(
            Leg::Inward,
            top.x0,
            (1.0 - q).ln(),
            top.y0,
            Some(&mut in_steps),
        )?;
        let m = ctx.total_mass_g;
        let outward = LegTrack::new(LegSolution::new(out_steps), m);
        let inward = LegTrack::new(LegSolution::new(in_steps), m);
        let radius_cm = u[2].exp();
        let atmosphere = m * top.x0.exp() / radius_cm;
        let integral_from_start = outward.total() + inward.total() + atmosphere;
        Ok(Self {
            ctx,
            start,
            top,
            outward,
            inward,
            radius_cm,
            fit_fraction: q,
            integral_from_start,
        })
    }

    fn total_mass_g(&self) -> f64 {
        self.ctx.total_mass_g
    }

    /// The outward leg's start mass m0 and radius r0.
    fn start_mass_radius(&self) -> (f64, f64) {
        (
            self.total_mass_g() * self.start.x0.exp(),
            self.start.y0[LN_R].exp(),
        )
    }

    /// The structure at `place`.
    pub fn structure_at(&self, place: Place) -> Structure {
        let m_total = self.total_mass_g();
        let (m0, r0) = self.start_mass_radius();
        let series = |m: f64, r: f64, leg_x: f64| {
            let p = self.start.series(m);
            // int_m^m0 dm'/r' = (3/2)(m0/r0 - m/r) on the series.
            let inner = if m > 0.0 { m / r } else { 0.0 };
            let integral = self.integral_from_start + 1.5 * (m0 / r0 - inner);
            Structure {
                mass_g: m,
                radius_cm: p.radius_cm,
                pressure_dyn_cm2: p.pressure_dyn_cm2,
                temperature_k: p.temperature_k,
                luminosity_erg_s: p.luminosity_erg_s,
                l_over_m: self.start.centre.rate.total_erg_g_s(),
                potential_erg_g: -G_CGS * (inner + integral),
                leg: Leg::Outward,
                x: leg_x,
            }
        };
        match place {
            Place::Centre => series(0.0, 0.0, self.start.x0),
            Place::Series(m) => series(m, self.start.series(m).radius_cm, self.start.x0),
            Place::Outward(x) => {
                let y = if x == self.start.x0 {
                    self.start.y0
                } else {
                    self.outward.solution.at(x).unwrap_or(self.start.y0)
                };
                let integral = self.integral_from_start - self.outward.integral_to(x, m_total);
                self.on_leg(Leg::Outward, x, &y, integral)
            }
            Place::Inward(x) => {
                let y = if x == self.top.x0 {
                    self.top.y0
                } else {
                    self.inward.solution.at(x).unwrap_or(self.top.y0)
                };
                let atmosphere = m_total * self.top.x0.exp() / self.radius_cm;
                let integral = self.inward.integral_to(x, m_total) + atmosphere;
                self.on_leg(Leg::Inward, x, &y, integral)
            }
        }
    }

    /// The structure at `x` on `leg` with state `y` and int_m^M dm/r = `integral`.
    fn on_leg(&self, leg: Leg, x: f64, y: &State, integral: f64) -> Structure {
        let (m, _) = leg.mass_and_jacobian(x, self.total_mass_g());
        let r = y[LN_R].exp();
        let l = leg.luminosity_form(self.ctx).luminosity_erg_s(y[LUM]);
        Structure {
            mass_g: m,
            radius_cm: r,
            pressure_dyn_cm2: y[LN_P].exp(),
            temperature_k: y[LN_T].exp(),
            luminosity_erg_s: l,
            l_over_m: l / m,
            potential_erg_g: -G_CGS * (m / r + integral),
            leg,
            x,
        }
    }

    /// An error of a law at `s`.
    pub fn error(&self, s: &Structure, e: crate::error::PhysicsError) -> LegError {
        s.leg.error(s.x, self.total_mass_g(), LegCause::Physics(e))
    }

    /// The places of `total` rows (at least 2) on `grid`, centre first, photosphere last.
    pub fn places(&self, grid: ProfileGrid, total: usize) -> Vec<Place> {
        let last = (total.max(2) - 1) as f64;
        let mut places: Vec<Place> = match grid {
            ProfileGrid::Auto => self.balanced(total.max(2)),
            ProfileGrid::Radius => (0..total.max(2))
                .map(|j| self.at_radius(self.radius_cm * j as f64 / last))
                .collect(),
            ProfileGrid::Mass => (0..total.max(2))
                .map(|j| self.at_mass_fraction(j as f64 / last))
                .collect(),
        };
        // Every grid ends exactly at the photosphere and starts at the centre.
        if let Some(p) = places.first_mut() {
            *p = Place::Centre;
        }
        if let Some(p) = places.last_mut() {
            *p = Place::Inward(self.top.x0);
        }
        places
    }

    /// The place at radius `r` (0 <= r <= R).
    fn at_radius(&self, r: f64) -> Place {
        let (m0, r0) = self.start_mass_radius();
        if r <= 0.0 {
            return Place::Centre;
        }
        if r < r0 {
            // Inverse of the series: m = (4 pi / 3) rho_c r^3.
            let rho_c = self.start.centre.eos.density_g_cm3;
            return Place::Series((4.0 * PI / 3.0 * rho_c * r * r * r).min(m0));
        }
        let ln_r = r.ln();
        let fit_out = self.outward.nodes.last().map_or(f64::INFINITY, |n| n.1);
        if ln_r <= fit_out {
            Place::Outward(self.outward.x_at_ln_r(ln_r))
        } else if r >= self.radius_cm {
            Place::Inward(self.top.x0)
        } else {
            Place::Inward(self.inward.x_at_ln_r(ln_r))
        }
    }

    /// The place at mass fraction `q` (0 <= q <= 1; beyond the photosphere, the photosphere).
    fn at_mass_fraction(&self, q: f64) -> Place {
        let (m0, _) = self.start_mass_radius();
        let m = q * self.total_mass_g();
        if m <= 0.0 {
            Place::Centre
        } else if m < m0 {
            Place::Series(m)
        } else if q <= self.fit_fraction {
            Place::Outward(q.ln())
        } else {
            Place::Inward((1.0 - q).ln().max(self.top.x0))
        }
    }

    /// The balanced grid of `total` rows ([`ProfileGrid::Auto`]).
    fn balanced(&self, total: usize) -> Vec<Place> {
        // The nodes: the centre, the outward leg's step points, the inward leg's from the
        // fitting point (which the outward leg has) to the photosphere.
        let mut nodes: Vec<(Place, f64, f64)> = vec![(Place::Centre, 0.0, 0.0)];
        for &(x, ln_r) in &self.outward.nodes {
            nodes.push((Place::Outward(x), ln_r.exp() / self.radius_cm, x.exp()));
        }
        for &(x, ln_r) in self.inward.nodes.iter().rev().skip(1) {
            nodes.push((Place::Inward(x), ln_r.exp() / self.radius_cm, 1.0 - x.exp()));
        }
        let k_last = (nodes.len() - 1).max(1) as f64;
        let s: Vec<f64> = nodes
            .iter()
            .enumerate()
            .map(|(k, (_, r, q))| (r + q + k as f64 / k_last) / 3.0)
            .collect();
        let s_total = s.last().copied().unwrap_or(1.0);
        let mut k = 0;
        (0..total)
            .map(|j| {
                let target = s_total * j as f64 / (total - 1) as f64;
                while k + 2 < nodes.len() && s[k + 1] <= target {
                    k += 1;
                }
                let f = ((target - s[k]) / (s[k + 1] - s[k])).clamp(0.0, 1.0);
                self.between(nodes[k].0, nodes[k + 1].0, f)
            })
            .collect()
    }

    /// The place a fraction `f` of the way from node `a` to the next node `b`.
    fn between(&self, a: Place, b: Place, f: f64) -> Place {
        let lerp = |u: f64, v: f64| u + f * (v - u);
        match (a, b) {
            _ if f <= 0.0 => a,
            _ if f >= 1.0 => b,
            // Below the outward leg's start: linear in r, m = m0 f^3.
            (Place::Centre, _) => {
                let (m0, _) = self.start_mass_radius();
                Place::Series(m0 * f * f * f)
            }
            (Place::Outward(u), Place::Outward(v)) => Place::Outward(lerp(u, v)),
            (Place::Outward(_), Place::Inward(v)) => {
                Place::Inward(lerp((1.0 - self.fit_fraction).ln(), v))
            }
            (Place::Inward(u), Place::Inward(v)) => Place::Inward(lerp(u, v)),
            _ => a,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn grid_names_round_trip() {
        for g in ProfileGrid::ALL {
            assert_eq!(g.name().parse::<ProfileGrid>().unwrap(), g);
            assert_eq!(g.to_string(), g.name());
        }
        assert_eq!(ProfileGrid::default(), ProfileGrid::Auto);
        let err = "uniform".parse::<ProfileGrid>().unwrap_err().to_string();
        assert!(err.contains("auto, radius or mass"), "{err}");
    }

    /// Five-point Gauss–Legendre integrates polynomials to degree 9 exactly: the weights sum to
    /// 2 and x^8 integrates to 2/9 on [-1, 1].
    #[test]
    fn gauss_rule_is_exact_to_degree_nine() {
        let sum = |f: &dyn Fn(f64) -> f64| GAUSS.iter().map(|&(t, w)| w * f(t)).sum::<f64>();
        assert!((sum(&|_| 1.0) - 2.0).abs() < 1e-15);
        assert!((sum(&|t| t.powi(8)) - 2.0 / 9.0).abs() < 1e-15);
        assert!(sum(&|t| t.powi(9)).abs() < 1e-15);
    }
}
