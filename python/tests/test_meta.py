"""Version and metadata: what made each result, and laws that round-trip."""

from __future__ import annotations

import importlib.metadata
import importlib.resources

import starpoise
from conftest import run_cli

PROVENANCE_KEYS = {"program", "version", "command", "constants"}


def test_version_is_the_programs():
    done = run_cli("--version")
    assert done.stdout.strip() == f"starpoise {starpoise.__version__}"
    assert importlib.metadata.version("starpoise") == starpoise.__version__


def test_meta_of_a_star_and_its_profile(sun_like):
    meta = sun_like.meta
    assert PROVENANCE_KEYS <= set(meta)
    assert meta["program"] == "starpoise" and meta["version"] == starpoise.__version__
    assert meta["command"] == "starpoise.zams(1.0, x=0.7, z=0.02)"
    assert "CODATA 2018" in meta["constants"] and "IAU 2015" in meta["constants"]
    assert (meta["x"], meta["y"], meta["z"]) == (sun_like.x, sun_like.y, sun_like.z)
    assert meta["physics"] == sun_like.physics and meta["mass_msun"] == 1.0
    prof = sun_like.profile(points=30)
    assert prof.meta["command"] == "starpoise.zams(1.0, x=0.7, z=0.02).profile(points=30)"
    assert prof.meta["physics"] == meta["physics"]


def test_the_command_is_the_call_as_typed():
    star = starpoise.zams(1.5, x=0.71, z=0.0001, opacity="kramers", tolerance=1e-10,
                          max_iterations=70)
    assert star.meta["command"] == (
        f"starpoise.zams({1.5!r}, x={0.71!r}, z={0.0001!r}, opacity='kramers', "
        f"tolerance={1e-10!r}, max_iterations=70)"
    )
    grid = starpoise.sequence([1.0], variants={"hot": "opacity-factor:2"}, physics="analytic")
    assert grid.meta["command"] == (
        "starpoise.sequence([1.0], variants={'hot': 'opacity-factor:2'}, physics='analytic')"
    )
    assert PROVENANCE_KEYS <= set(grid.meta)
    poly = starpoise.polytrope(3.0, mass=1.0, radius=1.0)
    assert poly.meta["command"] == "starpoise.polytrope(3.0, mass=1.0, radius=1.0)"
    assert poly.profile.meta["command"] == poly.meta["command"]
    probe = starpoise.probe(150.0, 1.57e7, x=0.34)
    assert probe.meta["command"] == (
        "starpoise.probe(density_g_cm3=150.0, temperature_k=15700000.0, x=0.34, z=0.02)"
    )


def test_the_laws_in_the_metadata_rebuild_the_same_star():
    star = starpoise.zams(2.0, x=0.69, z=0.015, alpha=1.6, opacity_factor=1.1,
                          rates="power-law:nu=5")
    laws = dict(star.meta["physics"])
    laws["physics"] = laws.pop("preset")
    again = starpoise.zams(star.mass_msun, star.x, star.z, **laws)
    assert again.summary() == star.summary()


def test_the_package_is_typed():
    files = importlib.resources.files("starpoise")
    assert files.joinpath("py.typed").is_file()
    assert files.joinpath("_native.pyi").is_file()
