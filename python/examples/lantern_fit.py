"""Fit the mass and metallicity of a Lantern survey host star with a small Metropolis sampler.

The Lantern survey is this project's invented exoplanet-host survey (models/README.md).
Lantern-E is an invented star, not a measurement of a real one: its "observed" luminosity and
effective temperature below are made up for this demonstration. Each step of the chain builds
a zero-age main-sequence model with ``starpoise.zams`` (X fixed at 0.70) and compares its
L and T_eff with the observation (Gaussian errors); a model that does not converge counts as
impossible. No sampler library is needed: the chain is a plain random-walk Metropolis
algorithm in (M, Z) with flat priors.

    python python/examples/lantern_fit.py                # 2000 steps, about a minute
    python python/examples/lantern_fit.py --steps 200    # a quick look

The test suite runs a few steps (python/tests/test_example.py).
"""

from __future__ import annotations

import argparse
import math
from dataclasses import dataclass

import numpy as np
import starpoise

# Lantern-E (invented): luminosity in L_sun and effective temperature in K, with 1-sigma
# errors.
OBSERVED_LUMINOSITY_LSUN = (1.30, 0.06)
OBSERVED_TEFF_K = (6100.0, 80.0)
# Flat priors: the masses and metallicities a main-sequence host of this kind could have.
MASS_PRIOR_MSUN = (0.8, 1.5)
Z_PRIOR = (0.004, 0.04)
HYDROGEN_X = 0.70


def log_likelihood(mass_msun: float, z: float) -> float:
    """log of the probability of the observation given a ZAMS star of this mass and Z (up to a
    constant): -chi^2 / 2 over L and T_eff; -inf outside the priors or if the model does not
    converge."""
    if not (MASS_PRIOR_MSUN[0] <= mass_msun <= MASS_PRIOR_MSUN[1] and Z_PRIOR[0] <= z <= Z_PRIOR[1]):
        return -math.inf
    try:
        star = starpoise.zams(mass_msun, x=HYDROGEN_X, z=z)
    except starpoise.ConvergenceError:
        return -math.inf
    (l_obs, l_err), (t_obs, t_err) = OBSERVED_LUMINOSITY_LSUN, OBSERVED_TEFF_K
    chi2 = ((star.luminosity_lsun - l_obs) / l_err) ** 2 + ((star.teff_k - t_obs) / t_err) ** 2
    return -0.5 * chi2


@dataclass
class Chain:
    """The samples of (M / M_sun, Z), their log-likelihoods, and how many proposals were
    accepted."""

    samples: np.ndarray
    log_likelihoods: np.ndarray
    accepted: int

    @property
    def acceptance(self) -> float:
        return self.accepted / max(len(self.samples) - 1, 1)


def metropolis(
    steps: int,
    start: tuple[float, float] = (1.1, 0.015),
    step_sizes: tuple[float, float] = (0.02, 0.0015),
    seed: int = 7,
) -> Chain:
    """Random-walk Metropolis in (M, Z): Gaussian proposals of the given widths, accepted with
    probability min(1, L_new / L_old)."""
    rng = np.random.default_rng(seed)
    current = np.array(start, dtype=float)
    current_ll = log_likelihood(*current)
    samples = [current.copy()]
    lls = [current_ll]
    accepted = 0
    for _ in range(steps):
        proposal = current + rng.normal(0.0, step_sizes)
        ll = log_likelihood(*proposal)
        if math.log(rng.uniform()) < ll - current_ll:
            current, current_ll = proposal, ll
            accepted += 1
        samples.append(current.copy())
        lls.append(current_ll)
    return Chain(np.array(samples), np.array(lls), accepted)


def main(argv: list[str] | None = None) -> Chain:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--steps", type=int, default=2000, help="chain length (default 2000)")
    parser.add_argument("--seed", type=int, default=7)
    args = parser.parse_args(argv)
    chain = metropolis(args.steps, seed=args.seed)
    burn = len(chain.samples) // 4
    kept = chain.samples[burn:]
    mass, z = kept[:, 0], kept[:, 1]
    best = chain.samples[int(np.argmax(chain.log_likelihoods))]
    star = starpoise.zams(best[0], x=HYDROGEN_X, z=best[1])
    print(f"Lantern-E (invented): L = {OBSERVED_LUMINOSITY_LSUN[0]} +- {OBSERVED_LUMINOSITY_LSUN[1]} L_sun, "
          f"Teff = {OBSERVED_TEFF_K[0]:.0f} +- {OBSERVED_TEFF_K[1]:.0f} K, X = {HYDROGEN_X}")
    print(f"{args.steps} steps, acceptance {chain.acceptance:.2f}, first {burn} samples dropped")
    print(f"M = {mass.mean():.3f} +- {mass.std():.3f} M_sun")
    print(f"Z = {z.mean():.4f} +- {z.std():.4f}")
    print(f"best model: M = {best[0]:.3f} M_sun, Z = {best[1]:.4f}: "
          f"L = {star.luminosity_lsun:.3f} L_sun, Teff = {star.teff_k:.0f} K")
    return chain


if __name__ == "__main__":
    main()
