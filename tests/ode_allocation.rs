//! The DOP853 integrator allocates nothing per step: after a first integration has sized its
//! event buffers, a second one with events, output points and dense output on every step makes
//! no heap allocation at all (counted by a global allocator, per thread).

use nalgebra::SVector;
use starpoise::numerics::ode::{AcceptedStep, Control, Dop853, Dop853Settings, FnSystem, Observer};
use std::alloc::{GlobalAlloc, Layout, System};
use std::cell::Cell;
use std::convert::Infallible;

/// Counts the allocations of the current thread (other test threads do not interfere).
struct Counting;

thread_local! {
    static ALLOCATIONS: Cell<usize> = const { Cell::new(0) };
}

// SAFETY: every call is forwarded unchanged to the system allocator; the counter is a
// thread-local `Cell` with a const initialiser, which does not allocate.
unsafe impl GlobalAlloc for Counting {
    unsafe fn alloc(&self, layout: Layout) -> *mut u8 {
        ALLOCATIONS.with(|c| c.set(c.get() + 1));
        // SAFETY: same contract as the caller's.
        unsafe { System.alloc(layout) }
    }
    unsafe fn dealloc(&self, ptr: *mut u8, layout: Layout) {
        // SAFETY: same contract as the caller's.
        unsafe { System.dealloc(ptr, layout) }
    }
}

#[global_allocator]
static GLOBAL: Counting = Counting;

fn allocations() -> usize {
    ALLOCATIONS.with(|c| c.get())
}

/// Two events, a preallocated list of output points, dense output on every step; records into
/// preallocated storage.
struct Busy {
    points: Vec<f64>,
    sum: f64,
    steps: usize,
}

impl Observer<2, Infallible> for Busy {
    fn event_count(&self) -> usize {
        2
    }
    fn event_value(&mut self, i: usize, _x: f64, y: &SVector<f64, 2>) -> Result<f64, Infallible> {
        Ok(y[i])
    }
    fn on_event(&mut self, _i: usize, x: f64, _y: &SVector<f64, 2>) -> Control {
        self.sum += x;
        Control::Continue
    }
    fn output_points(&self) -> &[f64] {
        &self.points
    }
    fn on_output(&mut self, _i: usize, _x: f64, y: &SVector<f64, 2>) {
        self.sum += y[0];
    }
    fn dense_every_step(&self) -> bool {
        true
    }
    fn on_step(&mut self, step: &AcceptedStep<'_, 2>) -> Control {
        self.steps += 1;
        self.sum += step.interpolate(step.x_old).map_or(0.0, |y| y[1]);
        Control::Continue
    }
}

#[test]
fn no_allocation_per_integration() {
    let mut system = FnSystem(|_x: f64, y: &SVector<f64, 2>, dy: &mut SVector<f64, 2>| {
        dy[0] = y[1];
        dy[1] = -y[0];
        Ok::<(), Infallible>(())
    });
    let mut solver = Dop853::new(Dop853Settings::with_tolerances(1e-10, 1e-12).unwrap()).unwrap();
    let mut observer = Busy {
        points: (0..500).map(|i| 0.1 * i as f64).collect(),
        sum: 0.0,
        steps: 0,
    };
    let y0 = SVector::from([1.0, 0.0]);
    let first = allocations();
    solver
        .integrate(&mut system, 0.0, &y0, 50.0, &mut observer)
        .unwrap();
    // The counter works: the first run sizes the event buffers.
    assert!(allocations() > first);
    let before = allocations();
    let out = solver
        .integrate(&mut system, 0.0, &y0, 50.0, &mut observer)
        .unwrap();
    let after = allocations();
    assert!(out.stats.accepted_steps > 50 && observer.steps > 100);
    assert_eq!(after - before, 0, "allocations during one integration");
}
