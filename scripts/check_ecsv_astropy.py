#!/usr/bin/env python3
"""Read starpoise's ECSV outputs with astropy (an outside ECSV reader) and check units, metadata
and values against the same run's CSV.

Not part of CI (the Rust tests check the format without Python). Run it in an environment
with astropy and pandas, e.g.:

    python3 -m venv /tmp/venv && /tmp/venv/bin/pip install astropy pandas
    cargo build --release && /tmp/venv/bin/python scripts/check_ecsv_astropy.py
"""

import pathlib
import subprocess
import sys
import tempfile

import astropy.units as u
import pandas as pd
from astropy.table import QTable

ROOT = pathlib.Path(__file__).resolve().parent.parent
BIN = ROOT / "target" / "release" / "starpoise"


def run(*args):
    subprocess.run([str(BIN), *args], check=True, stdout=subprocess.DEVNULL)


def main():
    failures = 0
    with tempfile.TemporaryDirectory() as tmp:
        tmp = pathlib.Path(tmp)
        run("zams", "--mass", "1", "--profile", str(tmp / "p.ecsv"))
        run("zams", "--mass", "1", "--profile", str(tmp / "p.csv"))
        run("sequence", "--quiet", "--physics", "analytic", "--masses", "1,2,4",
            "--out", str(tmp / "s.ecsv"))
        run("sequence", "--quiet", "--physics", "analytic", "--masses", "1,2,4",
            "--out", str(tmp / "s.csv"))
        checks = []
        p = QTable.read(tmp / "p.ecsv")
        pc = pd.read_csv(tmp / "p.csv", comment="#")
        checks.append(("profile density unit", p["density_g_cm3"].unit == u.g / u.cm**3))
        checks.append(("profile luminosity unit", p["luminosity_erg_s"].unit == u.erg / u.s))
        checks.append(("profile meta program", p.meta["program"] == "starpoise"))
        checks.append(("profile meta physics", p.meta["physics"]["eos"] == "refined"))
        checks.append(("profile values equal the CSV",
                       (p["temperature_k"].value == pc["temperature_k"].to_numpy()).all()))
        s = QTable.read(tmp / "s.ecsv")
        sc = pd.read_csv(tmp / "s.csv", comment="#")
        checks.append(("sequence radius unit", s["radius_rsun"].unit == u.R_sun))
        checks.append(("sequence converged is boolean", s["converged"].dtype == bool))
        checks.append(("sequence values equal the CSV",
                       (s["luminosity_lsun"].value == sc["luminosity_lsun"].to_numpy()).all()))
        checks.append(("sequence grid fingerprint",
                       s.meta["grid_fingerprint"] == sc["grid_fingerprint"][0]))
        for name, ok in checks:
            print(f"{'pass' if ok else 'FAIL'}  {name}")
            failures += not ok
    print(f"{len(checks) - failures} passed, {failures} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
