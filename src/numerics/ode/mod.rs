//! Our explicit Runge–Kutta integrator: DOP853 (Dormand & Prince's 8th-order method with
//! Hairer's 5th/3rd-order error estimate and 7th-order dense output; Hairer, Nørsett & Wanner
//! 1993, *Solving Ordinary Differential Equations I*, 2nd ed., §II.5 and §II.10) for states of
//! fixed size N.
//!
//! - The right-hand side is fallible ([`OdeSystem::rhs`] returns `Result`): an error stops the
//!   integration and comes out typed, with the x where it happened ([`OdeError::Rhs`]), or, with
//!   [`RhsFailure::RejectStep`], rejects the trial step and retries it shorter.
//! - Adaptive steps (error per step below atol + rtol |y| in Hairer's norm) with a PI controller;
//!   x may increase or decrease; optional fixed steps and stiffness detection; a step limit.
//! - Dense output: the solution anywhere inside the last accepted step, without restarting
//!   ([`DenseOutput`]); its three extra stages are computed only on steps that need them.
//! - Events: sign changes of observer functions g_i(x, y), located on the dense output by the
//!   Illinois method to [`Dop853Settings::event_tolerance`]; the integration stops there (the
//!   state at the event is returned) or continues, as the observer decides.
//! - Output at requested points by the dense output, without shortening steps, and a callback
//!   per accepted step ([`Observer`]).
//! - Counts of right-hand-side evaluations, accepted and rejected steps ([`Stats`]). No
//!   allocation per step: stages live in the integrator.
//!
//! ```
//! use nalgebra::SVector;
//! use starpoise::numerics::ode::{Dop853, Dop853Settings, FnSystem, NoObserver, Stop};
//!
//! // y' = -y from 0 to 1.
//! let mut system = FnSystem(|_x: f64, y: &SVector<f64, 1>, dy: &mut SVector<f64, 1>| {
//!     *dy = -y;
//!     Ok::<(), std::convert::Infallible>(())
//! });
//! let mut solver = Dop853::new(Dop853Settings::with_tolerances(1e-10, 1e-12)?)?;
//! let end = solver
//!     .integrate(&mut system, 0.0, &SVector::from([1.0]), 1.0, &mut NoObserver)
//!     .map_err(|e| starpoise::Error::invalid("integration", e, "no error"))?;
//! assert_eq!(end.stop, Stop::End);
//! assert!((end.y[0] - (-1.0f64).exp()).abs() < 1e-10);
//! # Ok::<(), starpoise::Error>(())
//! ```

mod dense;
mod dop853;
mod error;
mod settings;
mod tableau;

pub use dense::{AcceptedStep, DenseOutput};
pub use dop853::{Dop853, Outcome, Stats, Stop};
pub use error::OdeError;
pub use settings::{Dop853Settings, RhsFailure};

use nalgebra::SVector;

/// A system of N first-order equations dy/dx = f(x, y).
pub trait OdeSystem<const N: usize> {
    /// What a failed evaluation reports (a law outside its domain, say).
    type Error;
    /// Write f(x, y) into `dy`. `x` is the true abscissa of every stage (unlike ode_solvers
    /// 0.6.2, whose stage 12 gets the wrong one), so f may depend on x explicitly. Must not
    /// allocate if the integration is to be allocation-free.
    fn rhs(
        &mut self,
        x: f64,
        y: &SVector<f64, N>,
        dy: &mut SVector<f64, N>,
    ) -> Result<(), Self::Error>;
}

/// A closure `FnMut(x, &y, &mut dy) -> Result<(), E>` as an [`OdeSystem`].
pub struct FnSystem<F>(pub F);

impl<F, E, const N: usize> OdeSystem<N> for FnSystem<F>
where
    F: FnMut(f64, &SVector<f64, N>, &mut SVector<f64, N>) -> Result<(), E>,
{
    type Error = E;
    fn rhs(&mut self, x: f64, y: &SVector<f64, N>, dy: &mut SVector<f64, N>) -> Result<(), E> {
        (self.0)(x, y, dy)
    }
}

/// Whether an integration goes on after a callback.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Control {
    /// Go on.
    Continue,
    /// Stop here.
    Stop,
}

/// Which sign changes of an event function count.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Crossing {
    /// From negative to positive (or zero).
    Rising,
    /// From positive to negative (or zero).
    Falling,
    /// Both.
    Either,
}

/// What watches an integration: event functions, output points and a per-step callback. Every
/// method has a default that does nothing, so an observer implements only what it uses.
///
/// Events: g_i(x, y) is evaluated at the start and at the end of every accepted step; when its
/// sign changes (a value of exactly 0 at the start of a step does not count, so a restart at an
/// event does not find it again) the crossing is located on the dense output and
/// [`Observer::on_event`] decides whether the integration stops there. The located x is the end
/// of the final bracket on the far side of the root (g has its new sign or is 0 there), within
/// the event tolerance of the root. Several events in one step are reported in order of x.
/// They are also evaluated at the end of a rejected trial step: a sign change there marks a
/// kink of the solution that made the step fail (a switch in the right-hand side that the
/// event watches), and the next steps are aimed just past it (see the integrator's `Kink`), so
/// an event function must accept a state from a trial that is about to be thrown away.
///
/// Output points: [`Observer::output_points`] must be sorted along the direction of
/// integration. Points before x0 are skipped, points equal to x0 get y0, points inside a step
/// the dense output, and points beyond where the integration stops are left for a later call
/// ([`Outcome::outputs_done`] says how many were used up, skipped ones included).
pub trait Observer<const N: usize, E> {
    /// Number of event functions (fixed during one integration).
    fn event_count(&self) -> usize {
        0
    }
    /// g_index(x, y).
    fn event_value(&mut self, _index: usize, _x: f64, _y: &SVector<f64, N>) -> Result<f64, E> {
        Ok(0.0)
    }
    /// Which sign changes of g_index count.
    fn event_direction(&self, _index: usize) -> Crossing {
        Crossing::Either
    }
    /// Called at each located event; [`Control::Stop`] ends the integration there.
    fn on_event(&mut self, _index: usize, _x: f64, _y: &SVector<f64, N>) -> Control {
        Control::Stop
    }
    /// Points where the solution is wanted, sorted along the direction of integration.
    fn output_points(&self) -> &[f64] {
        &[]
    }
    /// Called at each output point reached, with its index in [`Observer::output_points`].
    fn on_output(&mut self, _index: usize, _x: f64, _y: &SVector<f64, N>) {}
    /// Prepare the dense output on every accepted step (three more right-hand-side evaluations
    /// per step), for an [`Observer::on_step`] that interpolates.
    fn dense_every_step(&self) -> bool {
        false
    }
    /// Called after every accepted step (after its events and output points);
    /// [`Control::Stop`] ends the integration at the end of the step.
    fn on_step(&mut self, _step: &AcceptedStep<'_, N>) -> Control {
        Control::Continue
    }
}

/// An observer that watches nothing.
#[derive(Debug, Clone, Copy, Default)]
pub struct NoObserver;

impl<const N: usize, E> Observer<N, E> for NoObserver {}
