"""The Lantern survey fit example runs (a few steps; the full chain is run by hand)."""

from __future__ import annotations

import importlib.util
import math
import sys

import numpy as np
import pytest
import starpoise
from conftest import REPO

EXAMPLE = REPO / "python" / "examples" / "lantern_fit.py"


@pytest.fixture(scope="module")
def example():
    spec = importlib.util.spec_from_file_location("lantern_fit", EXAMPLE)
    assert spec is not None and spec.loader is not None
    module = importlib.util.module_from_spec(spec)
    # Registered first: its dataclass looks its module up by name.
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


def test_likelihood_is_the_chi_square_of_the_model(example):
    star = starpoise.zams(1.1, x=example.HYDROGEN_X, z=0.015)
    (l, dl), (t, dt) = example.OBSERVED_LUMINOSITY_LSUN, example.OBSERVED_TEFF_K
    expected = -0.5 * (((star.luminosity_lsun - l) / dl) ** 2 + ((star.teff_k - t) / dt) ** 2)
    assert example.log_likelihood(1.1, 0.015) == expected
    assert example.log_likelihood(5.0, 0.015) == -math.inf


def test_a_short_chain_runs_and_moves_toward_the_observation(example, capsys):
    chain = example.main(["--steps", "12", "--seed", "3"])
    assert chain.samples.shape == (13, 2)
    assert np.all(np.isfinite(chain.log_likelihoods))
    assert 0 < chain.accepted <= 12
    # Metropolis never accepts a step that loses more than it can: the best sample is at
    # least as likely as the start.
    assert chain.log_likelihoods.max() >= chain.log_likelihoods[0]
    out = capsys.readouterr().out
    assert "Lantern-E (invented)" in out and "M = " in out and "Z = " in out
