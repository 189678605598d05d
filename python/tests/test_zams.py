"""starpoise.zams and Star against `starpoise zams --format json` and `--profile FILE.csv`:
every value the same to 1e-12, every key present, the arrays under the CSV column names."""

from __future__ import annotations

import csv
import math

import numpy as np
import pytest
import starpoise
from conftest import REPO, cli_json, run_cli, same

TABLE = str(REPO / "models" / "demo-opacity.csv")

# (Python arguments, the same model's command-line flags)
CASES = [
    (dict(mass=1.0), ["--mass", "1"]),
    (dict(mass=10.0, physics="analytic"), ["--mass", "10", "--physics", "analytic"]),
    (
        dict(mass=0.8, x=0.72, z=0.01, alpha=1.5, opacity_factor=1.3, fit_mass=0.5, tolerance=1e-10),
        ["--mass", "0.8", "--x", "0.72", "--z", "0.01", "--alpha", "1.5",
         "--opacity-factor", "1.3", "--fit-mass", "0.5", "--tolerance", "1e-10"],
    ),
    (
        dict(mass=3.0, rates="power-law:nu=4", rates_factor=2.0, eos="saha", max_iterations=80),
        ["--mass", "3", "--rates", "power-law:nu=4", "--rates-factor", "2", "--eos", "saha",
         "--max-iterations", "80"],
    ),
    (
        dict(mass=2.0, physics="analytic", opacity=f"table:{TABLE}", atmosphere="eddington"),
        ["--mass", "2", "--physics", "analytic", "--opacity", f"table:{TABLE}",
         "--atmosphere", "eddington"],
    ),
    (
        dict(mass=1.02, x=0.68, z=0.03, guess=(1.6e17, 1.35e7, 0.95, 0.8)),
        ["--mass", "1.02", "--x", "0.68", "--z", "0.03", "--guess", "1.6e17", "1.35e7",
         "0.95", "0.8"],
    ),
]


@pytest.mark.parametrize("kwargs,flags", CASES, ids=[str(c[1][1:4]) for c in CASES])
def test_summary_equals_the_command_line(kwargs, flags):
    star = starpoise.zams(**kwargs)
    expected = cli_json("zams", *flags, "--format", "json")
    # `meta` records the call, which differs by design (a Python call, a command line).
    expected.pop("meta", None)
    got = star.summary()
    got.pop("meta", None)
    same(got, expected, "summary")
    # Every key is an attribute with the same value (summary quantities as floats: NaN where
    # the JSON has null).
    for key, value in expected.items():
        same(getattr(star, key), value, key)
    for key, _doc, _unit in starpoise.SUMMARY_FIELDS:
        assert isinstance(getattr(star, key), float), key


def test_summary_fields_are_the_library_quantities(sun_like):
    keys = [k for k, _, _ in starpoise.SUMMARY_FIELDS]
    summary = sun_like.summary()
    # The summary quantities appear in the summary in the library's order, after the
    # identification keys.
    assert [k for k in summary if k in keys] == keys
    assert len(keys) == len(set(keys)) >= 17
    assert set(keys) <= set(dir(sun_like))
    # A summary quantity that is not finite is NaN as an attribute, None in the summary.
    star = starpoise.zams(10.0, physics="analytic")
    assert math.isnan(star.central_degeneracy)
    assert star.summary()["central_degeneracy"] is None
    # The analytic rates have no 3He reactions: no 3He equilibrium time.
    assert math.isnan(star.he3_equilibrium_time_yr)
    assert star.summary()["he3_equilibrium_time_yr"] is None


def test_unknown_attribute_is_an_attribute_error(sun_like):
    with pytest.raises(AttributeError, match="no attribute 'luminosity'"):
        _ = sun_like.luminosity
    assert not hasattr(sun_like, "radius")


def test_summary_is_a_copy(sun_like):
    s = sun_like.summary()
    s["luminosity_lsun"] = -1.0
    assert sun_like.summary()["luminosity_lsun"] > 0


def _read_profile_csv(path):
    with open(path, newline="") as f:
        lines = [line for line in f if not line.startswith("#")]
    reader = csv.reader(lines)
    header = next(reader)
    # An empty field (the centre row's Lamb frequencies, infinite at r = 0) is NaN.
    rows = [[float(v) if v else np.nan for v in r] for r in reader]
    return header, np.array(rows)


@pytest.mark.parametrize("points", [10, 57, 400])
def test_profile_equals_the_command_lines_csv(tmp_path, sun_like, points):
    out = tmp_path / "profile.csv"
    done = run_cli("zams", "--mass", "1", "--profile", str(out), "--points", str(points))
    assert done.returncode == 0, done.stderr
    header, values = _read_profile_csv(out)
    prof = sun_like.profile(points=points)
    assert header == list(starpoise.PROFILE_COLUMNS) == prof.columns
    assert len(prof) == points == values.shape[0]
    for j, name in enumerate(header):
        column = prof[name]
        assert column.dtype == np.float64, name
        np.testing.assert_allclose(
            column, values[:, j], rtol=1e-12, atol=0, equal_nan=True, err_msg=name
        )
    # Centre first (r = 0, m = 0), photosphere last: m/M rises from 0 to 1.
    assert prof.m_over_M[0] == 0 and prof.m_over_M[-1] > 1 - 1e-6


def test_profile_default_points(sun_like):
    assert len(sun_like.profile()) == 400


def test_history_and_repr(sun_like):
    h = sun_like.history
    assert len(h) == sun_like.iterations
    assert all(set(r) == {"iteration", "mismatch", "step_length"} for r in h)
    assert [r["iteration"] for r in h] == list(range(1, len(h) + 1))
    text = repr(sun_like)
    assert "1 M_sun" in text and "L_sun" in text
