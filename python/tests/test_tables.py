"""Units, and the pandas and astropy round trips of the tables."""

from __future__ import annotations

import json

import numpy as np
import pytest
import starpoise
from conftest import run_cli


@pytest.fixture(scope="module")
def profile(sun_like):
    return sun_like.profile(points=120)


@pytest.fixture(scope="module")
def grid():
    return starpoise.sequence([0.8, 1.2], variants={"base": "", "hot": "opacity-factor:2"})


def test_every_column_and_attribute_has_a_unit_astropy_reads(sun_like, profile, grid):
    u = pytest.importorskip("astropy.units", reason="astropy is not installed: pip install astropy")
    for units in (sun_like.units, profile.units, grid.units):
        for name, unit in units.items():
            parsed = u.Unit(unit)
            # log_g_cgs has a logarithmic (function) unit, dex(cm / s2).
            assert isinstance(parsed, (u.UnitBase, u.FunctionUnitBase)), (name, unit)
            assert not isinstance(parsed, u.UnrecognizedUnit), (name, unit)
    assert profile.units["density_g_cm3"] == "g / cm3"
    assert profile.units["m_over_M"] == ""
    assert sun_like.units["luminosity_lsun"] == "solLum"
    assert set(profile.units) == set(profile.columns)
    assert set(sun_like.units) == set(sun_like.summary())


def test_solar_units_are_the_iau_nominal_values(sun_like, profile):
    # astropy's solMass, solRad and solLum are the IAU 2015 Resolution B3 nominal values
    # (docs/references.md); the model's cgs profile converted with them must give back its
    # solar-unit summary. M = m / (m/M) and R = r / (r/R) on every row but the centre (r = m = 0).
    u = pytest.importorskip("astropy.units", reason="astropy is not installed: pip install astropy")
    assert profile.mass_g[0] == profile.radius_cm[0] == 0.0
    rows = slice(1, None)
    mass = (profile.mass_g[rows] / profile.m_over_M[rows] * u.Unit(profile.units["mass_g"])).to(u.Unit(sun_like.units["mass_msun"]))
    radius = (profile.radius_cm[rows] / profile.r_over_R[rows] * u.cm).to(u.Unit(sun_like.units["radius_rsun"]))
    np.testing.assert_allclose(mass.value, sun_like.mass_msun, rtol=1e-12)
    np.testing.assert_allclose(radius.value, sun_like.radius_rsun, rtol=1e-12)
    # The photospheric luminosity (last row) is the model's L.
    top = (profile.luminosity_erg_s[-1] * u.erg / u.s).to(u.Unit(sun_like.units["luminosity_lsun"]))
    assert top.value == pytest.approx(sun_like.luminosity_lsun, rel=1e-9)
    # The Julian year of the time scales.
    assert (1 * u.Unit(sun_like.units["nuclear_time_yr"])).to(u.s).value == 365.25 * 86400


def test_pandas_round_trip(tmp_path, profile, grid):
    pd = pytest.importorskip("pandas", reason="pandas is not installed: pip install pandas")
    frame = profile.to_pandas()
    assert list(frame.columns) == profile.columns and len(frame) == len(profile)
    for name in profile:
        np.testing.assert_array_equal(frame[name].to_numpy(), profile[name])
    assert frame.attrs["units"] == profile.units and frame.attrs["meta"] == profile.meta
    # Through a CSV file and back, every number unchanged (shortest round-trip text).
    path = tmp_path / "profile.csv"
    frame.to_csv(path, index=False)
    back = pd.read_csv(path)
    for name in profile:
        np.testing.assert_array_equal(back[name].to_numpy(), profile[name])
    # The grid as the command line writes it, read with pandas as its docs say, equals the
    # table's own frame.
    out = tmp_path / "grid.csv"
    done = run_cli("sequence", "--masses", "0.8,1.2", "--variant", "base=", "--variant",
                   "hot=opacity-factor:2", "--quiet", "--out", str(out))
    assert done.returncode == 0, done.stderr
    read = pd.read_csv(out, comment="#", keep_default_na=False, na_values=[""])
    mine = grid.to_pandas()
    assert list(read.columns) == list(mine.columns)
    for name in mine.columns:
        if mine[name].dtype.kind == "f":
            np.testing.assert_allclose(read[name].to_numpy(float), mine[name].to_numpy(), rtol=1e-12)
        elif name in ("reason", "warnings"):
            assert ["" if isinstance(v, float) else v for v in read[name]] == list(mine[name])
        else:
            assert list(read[name]) == list(mine[name]), name


def test_astropy_round_trip(tmp_path, profile, grid):
    pytest.importorskip("astropy", reason="astropy is not installed: pip install astropy")
    import astropy.units as u
    from astropy.table import QTable

    table = profile.to_astropy()
    assert isinstance(table, QTable)
    assert table.colnames == profile.columns
    assert table["density_g_cm3"].unit == u.g / u.cm**3
    assert table["temperature_k"].unit == u.K
    np.testing.assert_array_equal(table["temperature_k"].value, profile.temperature_k)
    np.testing.assert_array_equal(np.asarray(table["nabla"]), profile.nabla)
    assert getattr(table["nabla"], "unit", None) is None
    assert table.meta["command"] == profile.meta["command"]
    # ECSV, astropy's text format with units and metadata, and back.
    path = tmp_path / "profile.ecsv"
    table.write(path)
    back = QTable.read(path)
    for name in profile:
        assert getattr(back[name], "unit", None) == getattr(table[name], "unit", None), name
        np.testing.assert_array_equal(np.asarray(getattr(back[name], "value", back[name])), profile[name])
    assert back.meta["physics"] == profile.meta["physics"]
    # Text and flag columns stay plain columns; a logarithmic unit is kept.
    g = grid.to_astropy()
    assert list(g["variant"]) == list(grid.variant)
    assert g["luminosity_lsun"].unit == u.solLum
    assert g["log_g_cgs"].unit == u.dex(u.cm / u.s**2)
    np.testing.assert_array_equal(g["log_g_cgs"].value, grid.log_g_cgs)


def test_tables_without_pandas_or_astropy_say_what_to_install(monkeypatch, profile):
    import builtins

    real_import = builtins.__import__

    def refuse(name, *args, **kwargs):
        if name.split(".")[0] in ("pandas", "astropy"):
            raise ImportError(name)
        return real_import(name, *args, **kwargs)

    monkeypatch.setattr(builtins, "__import__", refuse)
    with pytest.raises(ImportError, match="pip install pandas"):
        profile.to_pandas()
    with pytest.raises(ImportError, match="pip install astropy"):
        profile.to_astropy()


def test_table_access(profile):
    assert profile["mu"] is profile.mu
    assert "nabla_ad" in profile and "nope" not in profile
    assert list(profile) == profile.columns == list(starpoise.PROFILE_COLUMNS)
    row = profile.row(0)
    assert set(row) == set(profile.columns) and isinstance(row["mass_g"], float)
    with pytest.raises(AttributeError):
        _ = profile.nope
    with pytest.raises(KeyError):
        _ = profile["nope"]
    assert "120 rows" in repr(profile) and "temperature_k [K]" in repr(profile)
    json.dumps(profile.meta)
