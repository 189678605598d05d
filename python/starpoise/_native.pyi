"""Type stubs of the compiled part of starpoise (``starpoise._native``).

python/tests/test_stubs.py checks these against the module: every function's parameters and
defaults, and every summary key of ``Star``.
"""

from collections.abc import Sequence
from typing import Any, final

from ._table import ModesTable, Polytrope, Record, SequenceTable, Table

__version__: str
#: (key, documentation, unit) of every summary quantity, in output order.
SUMMARY_FIELDS: list[tuple[str, str, str]]
#: The profile CSV's column names, in order.
PROFILE_COLUMNS: list[str]
#: The sequence CSV's column names, in order.
SEQUENCE_COLUMNS: list[str]

_Values = float | Sequence[float] | str
_Variants = dict[str, str] | Sequence[str]

@final
class Star:
    """A converged zero-age main-sequence model (made by ``starpoise.zams``)."""

    # The keys of `starpoise zams --format json`.
    mass_msun: float
    """Mass, M_sun."""
    x: float
    """Hydrogen mass fraction X."""
    y: float
    """Helium mass fraction Y = 1 - X - Z."""
    z: float
    """Metal mass fraction Z."""
    physics: dict[str, Any]
    """The laws (a model-file fragment: preset, eos, opacity, opacity_factor, rates,
    rates_factor, convection, atmosphere)."""
    converged: bool
    """Always True (a model that does not converge raises ConvergenceError)."""
    iterations: int
    """Newton iterations."""
    fit_mismatch: float
    """Final max-norm of the relative mismatch of (r, P, T, L) at the fitting mass."""
    fit_mass_fraction: float
    """Fitting mass as a fraction of M."""
    radius_rsun: float
    """Photospheric radius, R_sun."""
    luminosity_lsun: float
    """Surface luminosity, L_sun."""
    teff_k: float
    """Effective temperature, K, from L = 4 pi R^2 sigma T_eff^4."""
    log_g_cgs: float
    """log10 of the surface gravity G M / R^2 in cm s^-2."""
    central_temperature_k: float
    """Central temperature, K."""
    central_density_g_cm3: float
    """Central density, g cm^-3."""
    central_pressure_dyn_cm2: float
    """Central pressure, dyn cm^-2."""
    central_degeneracy: float
    """Electron degeneracy parameter psi at the centre; NaN for laws without degeneracy."""
    convective_core_mass_fraction: float
    """Mass fraction of the convective region that contains the centre."""
    convective_envelope_mass_fraction: float
    """Mass fraction of the outermost convective region if it reaches the surface."""
    cno_luminosity_fraction: float
    """Fraction of L supplied by the CNO cycle."""
    eddington_ratio: float
    """L / L_Edd (electron scattering)."""
    kelvin_helmholtz_time_yr: float
    """Kelvin-Helmholtz time G M^2 / (R L), years."""
    dynamical_time_s: float
    """Dynamical time sqrt(R^3 / (G M)), s."""
    nuclear_time_yr: float
    """Hydrogen-burning lifetime estimate, years."""
    he3_equilibrium_time_yr: float
    """Relaxation time of 3He to equilibrium at the centre, years; NaN for rates laws without 3He reactions."""
    virial_residual: float
    """Virial theorem residual (0 when exact)."""
    luminosity_residual: float
    """Energy conservation residual |integral of eps dm / L - 1|."""
    rhs_evaluations: int
    """Right-hand-side evaluations spent on the solve."""
    warnings: list[str]
    """Where the model leaves what its laws describe well (empty when nowhere)."""

    @property
    def meta(self) -> dict[str, Any]:
        """What made this model: program, version, command (the Python call), constants,
        mass_msun, x, y, z, physics."""
    @property
    def units(self) -> dict[str, str]:
        """The unit of every attribute (astropy's grammar; "" for a pure number)."""
    @property
    def history(self) -> list[dict[str, float]]:
        """The Newton iterations: {iteration, mismatch, step_length} dicts."""
    def summary(self) -> dict[str, Any]:
        """Every key of `starpoise zams --format json` with the same value."""
    def profile(self, points: int = 400) -> Table:
        """The profile on `points` rows (10 to 100000): the centre (r = 0) first, the
        photosphere last, on the balanced grid (see README, `--grid auto`)."""
    def modes(
        self,
        degrees: Sequence[int] = (0, 1, 2, 3),
        max_order: int = 25,
        points: int = 2000,
        cowling: bool = False,
    ) -> ModesTable:
        """The oscillation modes (as `starpoise modes --mass`): one row per mode, columns
        degree, order, kind, sigma, sigma_squared, cyclic_frequency, frequency_uhz, inertia,
        growth_rate_per_s, growth_per_radian; `.seismic` the separations and scaling
        relations."""
    def __getattr__(self, name: str) -> Any: ...

def zams(
    mass: float,
    x: float = 0.70,
    z: float = 0.02,
    *,
    physics: str = "refined",
    eos: str | None = None,
    opacity: str | None = None,
    rates: str | None = None,
    convection: str | None = None,
    atmosphere: str | None = None,
    alpha: float | None = None,
    opacity_factor: float | None = None,
    rates_factor: float | None = None,
    fit_mass: float | None = None,
    tolerance: float | None = None,
    max_iterations: int | None = None,
    guess: Sequence[float] | None = None,
) -> Star:
    """Build a zero-age main-sequence model of `mass` (M_sun)."""

def sequence(
    masses: _Values,
    x: _Values | None = None,
    z: _Values | None = None,
    *,
    variants: _Variants | None = None,
    physics: str = "refined",
    eos: str | None = None,
    opacity: str | None = None,
    rates: str | None = None,
    convection: str | None = None,
    atmosphere: str | None = None,
    alpha: float | None = None,
    opacity_factor: float | None = None,
    rates_factor: float | None = None,
    fit_mass: float | None = None,
    tolerance: float | None = None,
    threads: int = 0,
    fit_ranges: str | None = None,
) -> SequenceTable:
    """Solve a grid of models (masses x compositions x variants) in parallel."""

def compare(
    masses: _Values,
    variants: _Variants,
    x: float = 0.70,
    z: float = 0.02,
    *,
    physics: str = "refined",
    eos: str | None = None,
    opacity: str | None = None,
    rates: str | None = None,
    convection: str | None = None,
    atmosphere: str | None = None,
    alpha: float | None = None,
    opacity_factor: float | None = None,
    rates_factor: float | None = None,
    threads: int = 0,
) -> Table:
    """Solve the same masses under several variants and compare each with the first."""

def polytrope(
    n: float,
    *,
    mass: float | None = None,
    radius: float | None = None,
    mu: float | None = None,
    radiation: bool = False,
    points: int = 200,
) -> Polytrope:
    """Solve the Lane-Emden equation of index n, optionally scaled to a star."""

def probe(
    density_g_cm3: float,
    temperature_k: float,
    x: float = 0.70,
    z: float = 0.02,
    *,
    physics: str = "refined",
    eos: str | None = None,
    opacity: str | None = None,
    rates: str | None = None,
    convection: str | None = None,
    atmosphere: str | None = None,
    alpha: float | None = None,
    opacity_factor: float | None = None,
    rates_factor: float | None = None,
) -> Record:
    """Evaluate every law of a physics set at one density and temperature."""

def limits(
    x: float = 0.70,
    z: float = 0.02,
    *,
    physics: str = "refined",
    eos: str | None = None,
    opacity: str | None = None,
    rates: str | None = None,
    convection: str | None = None,
    atmosphere: str | None = None,
    alpha: float | None = None,
    opacity_factor: float | None = None,
    rates_factor: float | None = None,
) -> Record:
    """The hydrogen-burning minimum mass and the pulsational instability mass (as
    `starpoise limits`)."""
