"""Star.modes and starpoise.limits: every value equals the command line's (`modes --mass`,
`limits`) to SAME_NUMBER_REL, with units and metadata; bad arguments are InputErrors."""

from __future__ import annotations

import math

import numpy as np
import pytest
import starpoise

from conftest import cli_json, same


@pytest.fixture(scope="module")
def modes(sun_like):
    return sun_like.modes(degrees=[2, 0], max_order=6)


def test_modes_equal_the_command_line(modes):
    expected = cli_json("modes", "--mass", "1", "--degrees", "0,2", "--max-order", "6",
                        "--format", "json")
    rows = expected.pop("modes")
    assert len(modes) == len(rows)
    for name in modes.columns:
        for i, row in enumerate(rows):
            value = modes[name][i]
            same(value.item() if hasattr(value, "item") else value, row.get(name),
                 f"modes[{i}].{name}")
    same(modes.seismic, expected, "seismic")


def test_modes_units_meta_and_order(modes):
    assert modes.units["frequency_uhz"] == "uHz"
    assert modes.units["growth_rate_per_s"] == "1 / s"
    assert modes.units["sigma"] == ""
    assert modes.meta["model"] == "zams" and modes.meta["degrees"] == [0, 2]
    assert modes.meta["command"].endswith(".modes(degrees=[2, 0], max_order=6, points=2000, "
                                          "cowling=False)")
    # Radial modes first (order 1..6), their growth rates defined; l = 2 without them.
    radial = modes.degree == 0
    assert list(modes.order[radial]) == [1, 2, 3, 4, 5, 6]
    assert np.all(np.isfinite(modes.growth_rate_per_s[radial]))
    assert np.all(np.isnan(modes.growth_rate_per_s[~radial]))
    # Eckart-Scuflaire-Osaki orders of l = 2: g6..g1, f, p1..p6 (fact of the trade: one mode
    # per order, f mode order 0).
    assert list(modes.order[~radial]) == list(range(-6, 7))
    assert list(modes.kind[~radial]) == ["g"] * 6 + ["f"] + ["p"] * 6


@pytest.mark.parametrize(
    "kwargs, name",
    [({"degrees": [-1]}, "degrees"), ({"degrees": [1001]}, "degrees"),
     ({"max_order": 0}, "max_order"), ({"points": 5}, "points"), ({"degrees": []}, "degrees")],
)
def test_modes_bad_arguments(sun_like, kwargs, name):
    with pytest.raises(starpoise.InputError) as info:
        sun_like.modes(**kwargs)
    assert f"invalid {name} =" in str(info.value)


def test_limits_equal_the_command_line():
    got = starpoise.limits()
    expected = cli_json("limits", "--format", "json")
    same(dict(got), expected, "limits")
    assert got.units["hydrogen_burning_minimum_mass_msun"] == "solMass"
    assert got.meta["command"] == "starpoise.limits(x=0.7, z=0.02)"
    assert math.isfinite(got.pulsational_instability_mass_msun)


def test_limits_refuse_the_analytic_set():
    with pytest.raises(starpoise.InputError, match="preset|physics"):
        starpoise.limits(physics="analytic")
