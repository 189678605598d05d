"""starpoise.polytrope and starpoise.probe against `starpoise polytrope` and `starpoise
probe --format json`."""

from __future__ import annotations

import csv
import math

import numpy as np
import pytest
import starpoise
from conftest import cli_json, run_cli, same


@pytest.mark.parametrize("n", [0.0, 1.0, 1.5, 3.0, 4.5, 5.0])
def test_polytrope_equals_the_command_line(n):
    poly = starpoise.polytrope(n)
    expected = cli_json("polytrope", "--index", repr(n), "--format", "json")
    same(poly.to_dict(), expected, f"n={n}")
    assert poly.profile.columns == ["xi", "theta", "dtheta_dxi"]
    assert len(poly.profile) == 200


def test_closed_forms():
    # xi_1 = pi for n = 1 and sqrt(6) for n = 0 (Chandrasekhar 1939, ch. IV; closed forms).
    assert starpoise.polytrope(1.0).xi1 == pytest.approx(math.pi, rel=1e-10)
    assert starpoise.polytrope(0.0).xi1 == pytest.approx(math.sqrt(6.0), rel=1e-10)
    # n = 5 has no surface: xi_1 is infinite (None, as null in the JSON); omega_5 = sqrt 3.
    five = starpoise.polytrope(5.0)
    assert five.xi1 is None and five.omega_n == pytest.approx(math.sqrt(3.0), rel=1e-10)


def test_scaled_polytrope_and_profile_equal_the_command_line(tmp_path):
    poly = starpoise.polytrope(3.0, mass=1.0, radius=1.0, radiation=True, points=50)
    flags = ["polytrope", "--index", "3", "--mass", "1", "--radius", "1", "--radiation",
             "--points", "50"]
    same(poly.to_dict(), cli_json(*flags, "--format", "json"), "scaled")
    out = tmp_path / "poly.csv"
    assert run_cli(*flags, "--profile", str(out)).returncode == 0
    with open(out, newline="") as f:
        rows = list(csv.DictReader(line for line in f if not line.startswith("#")))
    assert poly.profile.columns == list(rows[0])
    for name in poly.profile.columns:
        np.testing.assert_allclose(poly.profile[name], [float(r[name]) for r in rows], rtol=1e-12)
    assert poly.units["central_temperature_k"] == "K" and poly.profile.units["xi"] == ""
    assert 0 < poly.beta < 1


@pytest.mark.parametrize(
    "kwargs,flags",
    [
        (dict(x=0.34), ["--x", "0.34"]),
        (dict(x=0.7, z=0.02, physics="analytic"), ["--physics", "analytic"]),
        (dict(x=0.7, eos="degenerate", opacity_factor=2.0), ["--eos", "degenerate", "--opacity-factor", "2"]),
    ],
)
def test_probe_equals_the_command_line(kwargs, flags):
    record = starpoise.probe(density_g_cm3=150, temperature_k=1.57e7, **kwargs)
    expected = cli_json("probe", "--density", "150", "--temperature", "1.57e7", *flags,
                        "--format", "json")
    same(record.to_dict(), expected, "probe")
    assert record.pressure_dyn_cm2 == record["pressure_dyn_cm2"]
    assert record.units["pressure_dyn_cm2"] == "dyn / cm2"
    assert record.units["cp_erg_g_k"] == "erg / (g K)"
    assert dict(record) == record.to_dict()


def test_probe_without_degeneracy_gives_none():
    record = starpoise.probe(1.0, 1e7, physics="analytic")
    assert record.degeneracy_psi is None
    assert all(set(law) == {"law", "opacity_cm2_g", "error"} for law in record.opacity_laws)
